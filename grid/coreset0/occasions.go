package coreset0

import "fmt"

// NSymbCORESET stands in a first-symbol column for N_symb^CORESET, the
// CORESET's own number of symbols, which the tables write for odd i in some
// rows so that the second CORESET of a slot follows the first.
const NSymbCORESET = -1

// OccasionRow is one row of Table 13-11 or 13-12: the Type0-PDCCH monitoring
// parameters of multiplexing pattern 1, in the spec's column order. O and M
// are kept doubled so that O = 2.5 and M = 1/2 stay integers. A row with
// SetsPerSlot 0 is a reserved index.
type OccasionRow struct {
	// O2 is 2·O; O is an offset in ms (2^μ slots each): 0, 2, 5, 7 (FR1)
	// or 0, 2.5, 5, 7.5 (FR2).
	O2 int
	// SetsPerSlot is the number of search space sets per slot, 1 or 2.
	SetsPerSlot int
	// M2 is 2·M; M is 1/2, 1 or 2.
	M2 int
	// FirstSymbolEven and FirstSymbolOdd are the first symbol of the CORESET
	// for even and odd SS/PBCH block index i; NSymbCORESET means
	// N_symb^CORESET. Rows with one value repeat it.
	FirstSymbolEven, FirstSymbolOdd int
}

// Reserved reports whether the row is a reserved index.
func (r OccasionRow) Reserved() bool { return r.SetsPerSlot == 0 }

func occ(o2, sets, m2, first int) OccasionRow { return OccasionRow{o2, sets, m2, first, first} }

func occEO(o2, sets, m2, even, odd int) OccasionRow { return OccasionRow{o2, sets, m2, even, odd} }

// table13_11 is TS 38.213 Table 13-11 (Release 17): parameters for PDCCH
// monitoring occasions for Type0-PDCCH CSS set, SS/PBCH block and CORESET
// multiplexing pattern 1 and FR1. Columns: O, number of search space sets per
// slot, M, first symbol index (O and M doubled).
var table13_11 = [16]OccasionRow{
	occ(0, 1, 2, 0),
	occEO(0, 2, 1, 0, NSymbCORESET),
	occ(4, 1, 2, 0),
	occEO(4, 2, 1, 0, NSymbCORESET),
	occ(10, 1, 2, 0),
	occEO(10, 2, 1, 0, NSymbCORESET),
	occ(14, 1, 2, 0),
	occEO(14, 2, 1, 0, NSymbCORESET),
	occ(0, 1, 4, 0),
	occ(10, 1, 4, 0),
	occ(0, 1, 2, 1),
	occ(0, 1, 2, 2),
	occ(4, 1, 2, 1),
	occ(4, 1, 2, 2),
	occ(10, 1, 2, 1),
	occ(10, 1, 2, 2),
}

// table13_12 is TS 38.213 Table 13-12 (Release 17): the same for pattern 1 and
// FR2 (FR2-1, and {120, 120} kHz in FR2-2). Indexes 14 and 15 are reserved.
var table13_12 = [16]OccasionRow{
	occ(0, 1, 2, 0),
	occEO(0, 2, 1, 0, 7),
	occ(5, 1, 2, 0),
	occEO(5, 2, 1, 0, 7),
	occ(10, 1, 2, 0),
	occEO(10, 2, 1, 0, 7),
	occEO(0, 2, 1, 0, NSymbCORESET),
	occEO(5, 2, 1, 0, NSymbCORESET),
	occEO(10, 2, 1, 0, NSymbCORESET),
	occ(15, 1, 2, 0),
	occEO(15, 2, 1, 0, 7),
	occEO(15, 2, 1, 0, NSymbCORESET),
	occ(0, 1, 4, 0),
	occ(10, 1, 4, 0),
	{}, {},
}

// OccasionRows returns a copy of Table 13-11 (FR1) or 13-12 (FR2), indexed by
// searchSpaceZero.
func OccasionRows(fr FR) [16]OccasionRow {
	if fr == FR2 {
		return table13_12
	}
	return table13_11
}

// Pattern23Rule is one of Tables 13-13 to 13-15, whose only row (index 0)
// puts the monitoring occasion in the SS/PBCH block's own frame, SFN_C =
// SFN_SSB,i, and in slot n_C = n_SSB,i + SlotDelta, with a first symbol that
// cycles with the SS/PBCH block index i.
type Pattern23Rule struct {
	// FirstSymbol[i mod len] is the first symbol for SS/PBCH block index i.
	FirstSymbol []int
	// SlotDelta[i mod len] is n_C − n_SSB,i: 0, or −1 in Table 13-14 for
	// i = 8k+4 and 8k+5.
	SlotDelta []int
}

// table13_13 is TS 38.213 Table 13-13 (Release 17): pattern 2, {SS/PBCH
// block, PDCCH} SCS {120, 60} kHz: n_C = n_SSB,i; first symbol 0, 1, 6, 7 for
// i = 4k, 4k+1, 4k+2, 4k+3.
var table13_13 = Pattern23Rule{
	FirstSymbol: []int{0, 1, 6, 7},
	SlotDelta:   []int{0, 0, 0, 0},
}

// table13_14 is TS 38.213 Table 13-14 (Release 17): pattern 2, {240, 120}
// kHz: first symbol 0, 1, 2, 3, 0, 1 in i = 8k, 8k+1, 8k+2, 8k+3, 8k+6,
// 8k+7 with n_C = n_SSB,i; 12, 13 in i = 8k+4, 8k+5 with n_C = n_SSB,i − 1.
var table13_14 = Pattern23Rule{
	FirstSymbol: []int{0, 1, 2, 3, 12, 13, 0, 1},
	SlotDelta:   []int{0, 0, 0, 0, -1, -1, 0, 0},
}

// table13_15 is TS 38.213 Table 13-15 (Release 17): pattern 3, {120, 120}
// kHz: n_C = n_SSB,i; first symbol 4, 8, 2, 6 in i = 4k, 4k+1, 4k+2, 4k+3.
var table13_15 = Pattern23Rule{
	FirstSymbol: []int{4, 8, 2, 6},
	SlotDelta:   []int{0, 0, 0, 0},
}

// Pattern23Table returns the rule of Table 13-13, 13-14 or 13-15 that goes
// with a CORESET#0 table whose rows use pattern 2 or 3, and the rule's table
// number.
func Pattern23Table(t Table) (Pattern23Rule, string, error) {
	copyRule := func(r Pattern23Rule) Pattern23Rule {
		return Pattern23Rule{append([]int(nil), r.FirstSymbol...), append([]int(nil), r.SlotDelta...)}
	}
	switch t {
	case Table13_7:
		return copyRule(table13_13), "Table 13-13", nil
	case Table13_10:
		return copyRule(table13_14), "Table 13-14", nil
	case Table13_8:
		return copyRule(table13_15), "Table 13-15", nil
	}
	return Pattern23Rule{}, "", fmt.Errorf("%v has no rows of multiplexing pattern 2 or 3; only Tables 13-7, 13-8 and 13-10 do.", t)
}

// Occasion is when a UE monitors the Type0-PDCCH CSS set for one SS/PBCH
// block index.
type Occasion struct {
	// SSBIndex is the SS/PBCH block index i.
	SSBIndex int
	// SameFrameAsSSB is true for patterns 2 and 3 (SFN_C = SFN_SSB,i);
	// FrameParity is then unused.
	SameFrameAsSSB bool
	// FrameParity is SFN_C mod 2 for pattern 1: the occasion recurs every
	// other frame, in even (0) or odd (1) frames.
	FrameParity int
	// Slot is n0 (pattern 1) or n_C (patterns 2 and 3), a slot of the
	// CORESET's numerology within the frame.
	Slot int
	// NumSlots is 2 for pattern 1 (slots n0 and n0+1; n0+1 may be the
	// frame's slot count, which is slot 0 of the next frame) and 1 otherwise.
	NumSlots int
	// FirstSymbol is the CORESET's first symbol in each slot, and NumSymbols
	// its N_symb^CORESET.
	FirstSymbol, NumSymbols int
}

// SlotsPerFrame returns N_slot^frame,μ = 10·2^μ (TS 38.211 4.3.2).
func SlotsPerFrame(mu int) int { return 10 << mu }

// Pattern1Occasion computes the Type0-PDCCH monitoring occasion of pattern 1
// for SS/PBCH block index i (TS 38.213 13): n0 = (O·2^μ + ⌊i·M⌋) mod
// N_slot^frame,μ, in frames with SFN_C mod 2 = ⌊(O·2^μ + ⌊i·M⌋) /
// N_slot^frame,μ⌋ mod 2, over slots n0 and n0+1, first symbol from Table
// 13-11 (FR1) or 13-12 (FR2). mu is the PDCCH numerology: 0 or 1 in FR1, 2
// or 3 in FR2. nSymbCORESET is N_symb^CORESET of the CORESET#0 row.
func Pattern1Occasion(fr FR, searchSpaceZero, mu, nSymbCORESET, ssbIndex int) (Occasion, error) {
	var maxI int
	switch fr {
	case FR1:
		if mu != 0 && mu != 1 {
			return Occasion{}, fmt.Errorf("The PDCCH numerology μ = %d is not one of FR1's CORESET#0 spacings; it must be 0 (15 kHz) or 1 (30 kHz).", mu)
		}
		maxI = 7
	case FR2:
		if mu != 2 && mu != 3 {
			return Occasion{}, fmt.Errorf("The PDCCH numerology μ = %d is not one of FR2-1's CORESET#0 spacings; it must be 2 (60 kHz) or 3 (120 kHz).", mu)
		}
		maxI = 63
	default:
		return Occasion{}, fmt.Errorf("The frequency range %d is not one this package knows; it must be FR1 or FR2.", fr)
	}
	if searchSpaceZero < 0 || searchSpaceZero > 15 {
		return Occasion{}, fmt.Errorf("searchSpaceZero %d is out of range; it is 4 bits, 0 to 15 (TS 38.331 MIB).", searchSpaceZero)
	}
	if nSymbCORESET < 1 || nSymbCORESET > 3 {
		return Occasion{}, fmt.Errorf("N_symb^CORESET %d is out of range; CORESET#0 has 1 to 3 symbols.", nSymbCORESET)
	}
	if ssbIndex < 0 || ssbIndex > maxI {
		return Occasion{}, fmt.Errorf("The SS/PBCH block index %d is out of range for %v; it must be 0 to %d.", ssbIndex, fr, maxI)
	}
	r := OccasionRows(fr)[searchSpaceZero]
	if r.Reserved() {
		return Occasion{}, fmt.Errorf("searchSpaceZero %d is reserved in Table 13-12; FR2 allows 0 to 13.", searchSpaceZero)
	}
	// O·2^μ = O2·2^μ / 2 must be a whole number of slots; it is for every
	// row with the numerologies allowed above (FR2's O = 2.5 and 7.5 meet
	// μ ≥ 2).
	o2mu := r.O2 << mu
	if o2mu%2 != 0 {
		return Occasion{}, fmt.Errorf("O·2^μ is not a whole slot for searchSpaceZero %d at μ = %d.", searchSpaceZero, mu)
	}
	n := o2mu/2 + ssbIndex*r.M2/2 // ⌊i·M⌋ = ⌊i·M2/2⌋, all terms non-negative
	perFrame := SlotsPerFrame(mu)
	first := r.FirstSymbolEven
	if ssbIndex%2 == 1 {
		first = r.FirstSymbolOdd
	}
	if first == NSymbCORESET {
		first = nSymbCORESET
	}
	if first+nSymbCORESET > 14 {
		return Occasion{}, fmt.Errorf("A %d-symbol CORESET from symbol %d does not fit a 14-symbol slot.", nSymbCORESET, first)
	}
	return Occasion{
		SSBIndex:    ssbIndex,
		FrameParity: (n / perFrame) % 2,
		Slot:        n % perFrame,
		NumSlots:    2,
		FirstSymbol: first,
		NumSymbols:  nSymbCORESET,
	}, nil
}

// SSBFirstSymbol returns the first symbol of candidate SS/PBCH block index i
// within its half frame, in symbols of the SS/PBCH spacing, for the FR2-1
// cases of TS 38.213 4.1: case D (120 kHz), {4, 8, 16, 20} + 28·n for n = 0–3,
// 5–8, 10–13, 15–18; case E (240 kHz), {8, 12, 16, 20, 32, 36, 40, 44} + 56·n
// for n = 0–3, 5–8. Patterns 2 and 3 need it for n_SSB,i.
func SSBFirstSymbol(ssbSCSkHz, i int) (int, error) {
	if i < 0 || i > 63 {
		return 0, fmt.Errorf("The SS/PBCH block index %d is out of range; FR2 allows 0 to 63.", i)
	}
	switch ssbSCSkHz {
	case 120: // case D: 4 blocks per n, n skips every fifth value
		n := i / 4
		n += n / 4
		return []int{4, 8, 16, 20}[i%4] + 28*n, nil
	case 240: // case E: 8 blocks per n
		n := i / 8
		n += n / 4
		return []int{8, 12, 16, 20, 32, 36, 40, 44}[i%8] + 56*n, nil
	}
	return 0, fmt.Errorf("The SS/PBCH subcarrier spacing %d kHz has no pattern 2 or 3; it must be 120 or 240 kHz.", ssbSCSkHz)
}

// Pattern23Occasion computes the Type0-PDCCH monitoring occasion of patterns
// 2 and 3 for SS/PBCH block index i (TS 38.213 13, Tables 13-13 to 13-15):
// the SS/PBCH block's own frame and slot n_SSB,i (or the slot before it), in
// slots of the CORESET's spacing. halfFrame (0 or 1) is the half frame the
// SS/PBCH burst is sent in; searchSpaceZero must be 0, the tables' only row.
func Pattern23Occasion(t Table, controlResourceSetZero, kSSB, searchSpaceZero, halfFrame, ssbIndex int) (Occasion, error) {
	cfg, err := Lookup(t, controlResourceSetZero, kSSB)
	if err != nil {
		return Occasion{}, err
	}
	rule, name, err := Pattern23Table(t)
	if err != nil {
		return Occasion{}, err
	}
	if cfg.Pattern == 1 {
		return Occasion{}, fmt.Errorf("controlResourceSetZero %d of %v is multiplexing pattern 1; use Pattern1Occasion.", controlResourceSetZero, t)
	}
	if searchSpaceZero != 0 {
		return Occasion{}, fmt.Errorf("searchSpaceZero %d is reserved in %s; only 0 is defined.", searchSpaceZero, name)
	}
	if halfFrame != 0 && halfFrame != 1 {
		return Occasion{}, fmt.Errorf("The half frame %d is out of range; it must be 0 or 1.", halfFrame)
	}
	sym, err := SSBFirstSymbol(t.SSBSCSkHz(), ssbIndex)
	if err != nil {
		return Occasion{}, err
	}
	// One slot of the CORESET's spacing holds 14·(SSB SCS / PDCCH SCS)
	// symbols of the SS/PBCH spacing; slots of both start on those symbol
	// boundaries, so the division finds the slot the block overlaps.
	ssbPerSlot := 14 * t.SSBSCSkHz() / t.PDCCHSCSkHz()
	perFrame := 10 * t.PDCCHSCSkHz() / 15
	nSSB := halfFrame*perFrame/2 + sym/ssbPerSlot
	k := ssbIndex % len(rule.FirstSymbol)
	return Occasion{
		SSBIndex:       ssbIndex,
		SameFrameAsSSB: true,
		Slot:           nSSB + rule.SlotDelta[k],
		NumSlots:       1,
		FirstSymbol:    rule.FirstSymbol[k],
		NumSymbols:     cfg.NumSymbols,
	}, nil
}
