package grid

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid/gscn"
)

// SSBPlan places the SS/PBCH blocks of the cell (TS 38.213 4.1,
// TS 38.211 7.4.3).
type SSBPlan struct {
	SCSKHz int    `json:"scsKHz" yaml:"scsKHz"`
	Case   string `json:"case,omitempty" yaml:"case,omitempty"` // "A"…"G"; "" derives it from the spacing
	// Bitmap says which candidate blocks are sent, '1' or '0' per candidate
	// in index order (ssb-PositionsInBurst); "" sends them all.
	Bitmap string `json:"bitmap,omitempty" yaml:"bitmap,omitempty"`
	// OffsetToPointA is N_CRB^SSB in RBs of 15 kHz (FR1) or 60 kHz (FR2),
	// and KSSB the subcarrier offset k_SSB in subcarriers of 15 kHz (FR1)
	// or of ScsCommonKHz (FR2), TS 38.211 4.4.4.2 and 7.4.3.1.
	OffsetToPointA int `json:"offsetToPointA" yaml:"offsetToPointA"`
	KSSB           int `json:"kSsb,omitempty" yaml:"kSsb,omitempty"`
	// ScsCommonKHz is subCarrierSpacingCommon, the spacing of the common RBs
	// that offsetToPointA and k_SSB count from: 15 or 30 kHz in FR1, 60 or
	// 120 kHz in FR2-1. 0 means the block's spacing (FR1, FR2-2) or 120 kHz
	// (FR2-1).
	ScsCommonKHz int `json:"scsCommonKHz,omitempty" yaml:"scsCommonKHz,omitempty"`
	PeriodMs     int `json:"periodMs,omitempty" yaml:"periodMs,omitempty"` // 5, 10, 20, 40, 80 or 160; 0 means 20
	// GSCN places the block by its synchronization raster point (TS 38.101-1
	// 5.4.3.1) instead of offsetToPointA and kSsb, which Compute then derives;
	// given with them, they must agree. It needs the carrier's frequency.
	GSCN *int `json:"gscn,omitempty" yaml:"gscn,omitempty"`
}

// SSBPeriodsMs are the values of ssb-periodicityServingCell (TS 38.331).
var SSBPeriodsMs = []int{5, 10, 20, 40, 80, 160}

// ssbCase is one case of TS 38.213 4.1: the first symbols of the candidate
// blocks in a half frame are base + step·n for each listed n.
type ssbCase struct {
	name   string
	scsKHz int
	base   []int
	step   int
}

var ssbCases = []ssbCase{
	{"A", 15, []int{2, 8}, 14},
	{"B", 30, []int{4, 8, 16, 20}, 28},
	{"C", 30, []int{2, 8}, 14},
	{"D", 120, []int{4, 8, 16, 20}, 28},
	{"E", 240, []int{8, 12, 16, 20, 32, 36, 40, 44}, 56},
	{"F", 480, []int{2, 9}, 14},
	{"G", 960, []int{2, 9}, 14},
}

// SSBSCS lists the SS/PBCH block spacings (kHz) of the range (TS 38.101-1/-2
// and TS 38.104 band tables: 15 or 30 kHz in FR1; 120 or 240 kHz in FR2-1;
// 120, 480 or 960 kHz in FR2-2).
func (r Range) SSBSCS() []int {
	switch r {
	case FR2_1:
		return []int{120, 240}
	case FR2_2:
		return []int{120, 480, 960}
	}
	return []int{15, 30}
}

// ssbN returns the values of n for a case and carrier frequency
// (TS 38.213 4.1). unpaired selects the thresholds of unpaired (TDD)
// spectrum for case C.
func ssbN(c ssbCase, f Hz, unpaired bool) []int {
	upTo := func(k int) []int {
		n := make([]int, k)
		for i := range n {
			n[i] = i
		}
		return n
	}
	switch c.name {
	case "A":
		if f <= 3e9 {
			return upTo(2)
		}
		return upTo(4)
	case "B":
		if f <= 3e9 {
			return upTo(1)
		}
		return upTo(2)
	case "C":
		limit := Hz(3e9)
		if unpaired {
			limit = 1.88e9
		}
		if f <= limit {
			return upTo(2)
		}
		return upTo(4)
	case "D":
		return []int{0, 1, 2, 3, 5, 6, 7, 8, 10, 11, 12, 13, 15, 16, 17, 18}
	case "E":
		return []int{0, 1, 2, 3, 5, 6, 7, 8}
	}
	return upTo(32) // F and G
}

// SSBBlock is one SS/PBCH block sent within the span: four symbols of the
// block's numerology by 240 subcarriers. Slot and Symbol count in the
// block's own numerology over the span.
type SSBBlock struct {
	Index      int // candidate index ī_SSB
	Slot       int
	Symbol     int
	Start, End Tc
	Low, High  Hz
}

// SSB is the checked SS/PBCH configuration with its blocks in the span.
type SSB struct {
	Case       string
	Numerology Numerology
	Candidates int // L_max
	// BitmapForm is the ssb-PositionsInBurst choice that L_max calls for
	// (TS 38.331 ServingCellConfigCommon): shortBitmap (4 bits),
	// mediumBitmap (8) or longBitmap (64).
	BitmapForm     string
	PeriodMs       int
	OffsetToPointA int // N_CRB^SSB, as given or derived from ssb.gscn
	KSSB           int
	ScsCommonKHz   int // subCarrierSpacingCommon, the default filled in
	Low, High      Hz  // the blocks' subcarrier edges
	// SSRef is SS_REF relative to point A: the centre of subcarrier 0 of RB
	// 10 of the block (TS 38.101-1 5.4.3.1), 120 subcarriers above its first.
	SSRef Hz
	// With the carrier's frequency known (Absolute): SS_REF in absolute
	// terms, its NR-ARFCN (absoluteFrequencySSB, TS 38.331), and its GSCN
	// when it is on the synchronization raster (OnSyncRaster).
	Absolute             bool
	SSRefHz              Hz
	AbsoluteFrequencySSB int
	OnARFCNRaster        bool
	GSCN                 int
	OnSyncRaster         bool
	Blocks               []SSBBlock

	first []int  // first symbol of each candidate in the half frame
	sent  []bool // which candidates ssb-PositionsInBurst sends
}

// bitmapForms names the ssb-PositionsInBurst choice for each L_max
// (TS 38.331 ServingCellConfigCommon).
var bitmapForms = map[int]string{4: "shortBitmap", 8: "mediumBitmap", 64: "longBitmap"}

// ssbGuard240 is TS 38.101-2 Table 5.3.3-2, the minimum guardband of a
// 240 kHz SS/PBCH block by channel bandwidth (MHz), Release 17.
var ssbGuard240 = map[int]Hz{100: 3800e3, 200: 7720e3, 400: 15560e3}

// ssbUnits returns what offsetToPointA and k_SSB count in (TS 38.211 4.4.4.2
// and 7.4.3.1): offsetToPointA in RBs of 15 kHz (FR1) or 60 kHz (FR2);
// k_SSB in subcarriers of 15 kHz (FR1) or of subCarrierSpacingCommon (FR2);
// and the largest k_SSB, which stays inside one common RB. N_CRB^SSB is a
// common RB of subCarrierSpacingCommon, so offsetToPointA must be a
// multiple of common/RB-unit: even with 30 kHz in FR1 or 120 kHz in FR2-1.
// FR2-2 keeps 60 kHz RBs without the multiple rule: Release 17 counts its
// offsetToPointA differently (in RBs of subCarrierSpacingCommon, as
// remembered, unchecked), which this model does not follow yet.
func ssbUnits(rng Range, commonKHz int) (rbUnit, kUnit Hz, kMax, multiple int) {
	switch rng {
	case FR2_1:
		return 60e3, Hz(commonKHz) * 1000, 11, max(1, commonKHz/60)
	case FR2_2:
		return 60e3, Hz(commonKHz) * 1000, 11, 1
	}
	return 15e3, 15e3, 12*commonKHz/15 - 1, max(1, commonKHz/15)
}

// DefaultSCSCommon is the subCarrierSpacingCommon gridloom assumes when
// ssb.scsCommonKHz is empty: 120 kHz in FR2-1, else the block's spacing.
func DefaultSCSCommon(rng Range, ssbKHz int) int {
	if rng == FR2_1 {
		return 120
	}
	return ssbKHz
}

// SCSCommonChoices lists the subCarrierSpacingCommon values of a range
// in kHz (TS 38.331 MIB: scs15or60 and scs30or120; in FR2-2 the common
// spacing is the block's, so its data spacings), for a form's choice.
func SCSCommonChoices(rng Range) []int {
	switch rng {
	case FR1:
		return []int{15, 30}
	case FR2_1:
		return []int{60, 120}
	}
	return rng.DataSCS()
}

// placeBySSRef returns the offsetToPointA and k_SSB that put SS_REF at
// ssRef (relative to point A), or a reason why none do.
func placeBySSRef(rng Range, ssbKHz, commonKHz int, ssRef Hz) (offset, k int, why string) {
	rbUnit, kUnit, kMax, multiple := ssbUnits(rng, commonKHz)
	scs := Hz(ssbKHz) * 1000
	d := ssRef - 120*scs // subcarrier 0 of the block
	if d < 0 {
		return 0, 0, fmt.Sprintf("the block would start %s below point A", fmtKHz(-d))
	}
	crb := 12 * rbUnit * Hz(multiple) // one step of offsetToPointA that names a common RB
	// The highest RB at or below the block first; where k_SSB's unit does
	// not divide the RB (FR2-2, where offsetToPointA still counts 60 kHz
	// RBs here), lower RBs with a larger k_SSB may reach it.
	for n := d / crb; n >= 0 && d-n*crb <= Hz(kMax)*kUnit; n-- {
		if rest := d - n*crb; rest%kUnit == 0 {
			offset = int(n) * multiple
			if offset > MaxOffset {
				return 0, 0, fmt.Sprintf("offsetToPointA would be %d, above %d", offset, MaxOffset)
			}
			return offset, int(rest / kUnit), ""
		}
	}
	return 0, 0, fmt.Sprintf("its subcarrier 0 lies %s from point A, not a whole number of %s k_SSB steps (at most %d) from a common RB of %d kHz", fmtKHz(d), fmtKHz(kUnit), kMax, commonKHz)
}

func checkSSB(fs *findings, rng Range, s *SSBPlan, ch Channel, freq Hz, freqKnown, unpaired bool, span int) (SSB, bool) {
	allowed := rng.SSBSCS()
	mu, _ := MuForSCS(s.SCSKHz)
	if !slices.Contains(allowed, s.SCSKHz) {
		fs.add(Error, CodeSSB, "", "ssb.scsKHz", "ssb.scsKHz %s is not an SS/PBCH block spacing of %s; use %s kHz.", given(s.SCSKHz), rng, JoinInts(allowed))
		return SSB{}, false
	}
	var cases []string
	for _, c := range ssbCases {
		if c.scsKHz == s.SCSKHz {
			cases = append(cases, c.name)
		}
	}
	name := strings.ToUpper(s.Case)
	if name == "" {
		name = cases[len(cases)-1] // 30 kHz: case C, the case of most TDD bands
	}
	i := slices.IndexFunc(ssbCases, func(c ssbCase) bool { return c.name == name })
	if !slices.Contains(cases, name) {
		fs.add(Error, CodeSSB, "", "ssb.case", "ssb.case %q does not exist at %d kHz; use %s (TS 38.213 4.1).", s.Case, s.SCSKHz, JoinOr(cases))
		return SSB{}, false
	}
	c := ssbCases[i]
	if !freqKnown && (name == "A" || name == "B" || name == "C") {
		fs.add(Info, CodeSSB, "", "carrier.centerMHz", "The carrier frequency is not given, so the SS/PBCH candidates of case %s assume a carrier above 3 GHz (TS 38.213 4.1); give carrier.centerMHz or carrier.arfcn to fix them.", name)
		freq = 3.5e9
	}
	var first []int
	for _, n := range ssbN(c, freq, unpaired) {
		for _, b := range c.base {
			first = append(first, b+c.step*n)
		}
	}
	slices.Sort(first)
	lmax := len(first)

	ok := true
	fail := func(field, format string, args ...any) {
		fs.add(Error, CodeSSB, "", field, format, args...)
		ok = false
	}
	form := bitmapForms[lmax]
	sent := make([]bool, lmax)
	switch {
	case s.Bitmap == "":
		for k := range sent {
			sent[k] = true
		}
	case len(s.Bitmap) != lmax || strings.Trim(s.Bitmap, "01") != "":
		fail("ssb.bitmap", "ssb.bitmap must be %d characters of 0 and 1, one per candidate block of case %s at this frequency (L_max = %d, so ssb-PositionsInBurst is a %s, TS 38.331).", lmax, name, lmax, form)
	default:
		for k := range sent {
			sent[k] = s.Bitmap[k] == '1'
		}
	}
	period := s.PeriodMs
	if period == 0 {
		period = 20
	}
	if !slices.Contains(SSBPeriodsMs, period) {
		fail("ssb.periodMs", "ssb.periodMs %d is not an SS/PBCH period; use %s ms (TS 38.331 ssb-periodicityServingCell).", period, JoinInts(SSBPeriodsMs))
	}
	common := s.ScsCommonKHz
	if common == 0 {
		common = DefaultSCSCommon(rng, s.SCSKHz)
	}
	if !slices.Contains(SCSCommonChoices(rng), common) {
		fail("ssb.scsCommonKHz", "ssb.scsCommonKHz %d is not a subCarrierSpacingCommon of %s; use %s kHz.", common, rng, JoinInts(SCSCommonChoices(rng)))
		common = DefaultSCSCommon(rng, s.SCSKHz)
	}
	if s.ScsCommonKHz != 0 && common != s.SCSKHz && !CommonIsSpacing(rng, ch.Band) {
		// TS 38.331 MIB, subCarrierSpacingCommon: in FR2-2 and with shared
		// spectrum channel access the common spacing is the block's own.
		fs.add(Warning, CodeSSB, "", "ssb.scsCommonKHz", "ssb.scsCommonKHz is %d kHz, but %s; use %d kHz, the block's spacing.", common, CommonNoSpacing(rng, ch.Band, s.SCSKHz), s.SCSKHz)
	}
	rbUnit, kUnit, kMax, multiple := ssbUnits(rng, common)
	if g := s.GSCN; g != nil {
		f, valid := gscn.Frequency(*g)
		switch {
		case !valid:
			fail("ssb.gscn", "ssb.gscn %d is not a GSCN; it must be %d to %d (TS 38.101-1 and TS 38.101-2 Table 5.4.3.1-1).", *g, gscn.MinGSCN, gscn.MaxGSCN)
		case !ch.Absolute:
			fail("ssb.gscn", "ssb.gscn places the block at an absolute frequency, so the carrier needs one too; give carrier.centerMHz or carrier.arfcn.")
		default:
			o, k, why := placeBySSRef(rng, s.SCSKHz, common, Hz(f)-ch.PointAHz)
			switch {
			case why != "":
				fail("ssb.gscn", "ssb.gscn %d (SS_REF %s) cannot be reached from point A at %s: %s.", *g, fmtMHz(Hz(f)), fmtMHz(ch.PointAHz), why)
			case (s.OffsetToPointA != 0 || s.KSSB != 0) && (s.OffsetToPointA != o || s.KSSB != k):
				fail("ssb.gscn", "ssb.gscn %d means offsetToPointA %d and kSsb %d with subCarrierSpacingCommon %d kHz, but offsetToPointA %d and kSsb %d are given; give one or make them agree.", *g, o, k, common, s.OffsetToPointA, s.KSSB)
			default:
				s.OffsetToPointA, s.KSSB = o, k
			}
		}
	}
	if s.KSSB < 0 || s.KSSB > kMax {
		fail("ssb.kSsb", "ssb.kSsb is %d; with subCarrierSpacingCommon %d kHz it must be 0 to %d, within one common RB (TS 38.211 7.4.3.1).", s.KSSB, common, kMax)
	}
	if s.OffsetToPointA < 0 || s.OffsetToPointA > MaxOffset {
		fail("ssb.offsetToPointA", "ssb.offsetToPointA is %d; it must be 0 to %d RBs.", s.OffsetToPointA, MaxOffset)
	} else if s.OffsetToPointA%multiple != 0 {
		fail("ssb.offsetToPointA", "ssb.offsetToPointA is %d RBs of %d kHz, but with subCarrierSpacingCommon %d kHz it must be a multiple of %d: it names a common RB of that spacing (TS 38.211 4.4.4.2, 7.4.3.1).", s.OffsetToPointA, rbUnit/1000, common, multiple)
	}
	if !ok {
		return SSB{}, false
	}

	num := Numerology{Mu: mu}
	scs := num.SCS()
	centre0 := Hz(s.OffsetToPointA)*12*rbUnit + Hz(s.KSSB)*kUnit // subcarrier 0 of the block
	low := centre0 - scs/2
	out := SSB{Case: name, Numerology: num, Candidates: lmax, BitmapForm: form, PeriodMs: period,
		OffsetToPointA: s.OffsetToPointA, KSSB: s.KSSB, ScsCommonKHz: common,
		Low: low, High: low + 240*scs, SSRef: centre0 + 120*scs, first: first, sent: sent}
	if ch.Absolute {
		out.Absolute = true
		out.SSRefHz = ch.PointAHz + out.SSRef
		out.AbsoluteFrequencySSB, out.OnARFCNRaster = FrequencyARFCN(out.SSRefHz)
		g, on := gscn.FromFrequency(int64(out.SSRefHz))
		out.GSCN, out.OnSyncRaster = g, on
		if !on {
			field := "ssb.offsetToPointA"
			msg := fmt.Sprintf("SS_REF, subcarrier 0 of RB 10 of the SS/PBCH block, is at %s, off the global synchronization raster (TS 38.101-1/-2 5.4.3.1: %s), where a UE searches for a cell-defining block", fmtMHz(out.SSRefHz), gscn.Rule)
			if b, a, in := gscn.Nearest(int64(out.SSRefHz)); in {
				fb, _ := gscn.Frequency(b)
				fa, _ := gscn.Frequency(a)
				msg += fmt.Sprintf("; the nearest GSCNs are %d (%s) and %d (%s): give ssb.gscn or move ssb.offsetToPointA and ssb.kSsb", b, fmtMHz(Hz(fb)), a, fmtMHz(Hz(fa)))
			}
			fs.add(Error, CodeSyncRaster, "", field, "%s.", msg)
		}
	}
	if out.Low < ch.Low || out.High > ch.High {
		fs.add(Error, CodeSSB, "", "ssb.offsetToPointA", "The SS/PBCH blocks span %s to %s, beyond the channel (%s to %s); move ssb.offsetToPointA.", fmtKHz(out.Low), fmtKHz(out.High), fmtKHz(ch.Low), fmtKHz(ch.High))
	} else if s.SCSKHz == 240 {
		// TS 38.101-2 Table 5.3.3-2: a 240 kHz block keeps its own minimum
		// guardband from each channel edge.
		g, known := ssbGuard240[ch.BandwidthMHz]
		lowGuard, highGuard := out.Low-ch.Low, ch.High-out.High
		switch {
		case !known:
			fs.add(Warning, CodeSSB, "", "carrier.bandwidthMHz", "TS 38.101-2 Table 5.3.3-2 gives the minimum guardband of a 240 kHz SS/PBCH block for channels of 100, 200 and 400 MHz only, not %d MHz.", ch.BandwidthMHz)
		case min(lowGuard, highGuard) < g:
			fs.add(Error, CodeSSB, "", "ssb.offsetToPointA", "The 240 kHz SS/PBCH blocks leave %s at the channel's lower edge and %s at its upper edge; in %d MHz each must be at least %s (TS 38.101-2 Table 5.3.3-2).", fmtKHz(lowGuard), fmtKHz(highGuard), ch.BandwidthMHz, fmtKHz(g))
		}
	}
	// Blocks are sent in the first half frame of each period.
	perHalf := num.SymbolsPerSubframe() * 5
	for start := 0; start < span; start += period {
		base := start * num.SymbolsPerSubframe()
		for k, sym := range first {
			if !sent[k] || sym+3 >= perHalf {
				continue
			}
			a, b := num.SymbolAt(base+sym), num.SymbolAt(base+sym+3)
			if a.Start >= Tc(span)*TcPerSubframe {
				continue
			}
			out.Blocks = append(out.Blocks, SSBBlock{Index: k, Slot: a.Slot, Symbol: a.Symbol, Start: a.Start, End: b.End(), Low: out.Low, High: out.High})
		}
	}
	return out, true
}

// checkSSBOverlaps reports partitions of another spacing that share
// spectrum with the blocks, and blocks that fall on uplink symbols.
func checkSSBOverlaps(fs *findings, s SSB, ls []Lattice, tdd *TDD) {
	if len(s.Blocks) > 0 {
		for _, l := range ls {
			over := min(l.High, s.High) - max(l.Low, s.Low)
			if over > 0 && l.Numerology.SCSKHz() != s.Numerology.SCSKHz() {
				fs.add(Warning, CodeSSBOverlap, l.Name, fmt.Sprintf("partitions[%d].startCrb", l.Index),
					"The %d kHz SS/PBCH blocks overlap partition %q (%d kHz) by %s; its symbols there must be left out around the blocks, and different spacings side by side interfere.",
					s.Numerology.SCSKHz(), l.Name, l.Numerology.SCSKHz(), fmtKHz(over))
			}
		}
	}
	if tdd == nil {
		return
	}
	for _, i := range s.uplinkCandidates(*tdd) {
		a := s.Numerology.SymbolAt(s.first[i])
		fs.add(Warning, CodeSSB, "", "ssb.bitmap", "SS/PBCH block %d (slot %d, symbol %d of the half frame at %d kHz) falls on uplink symbols of the TDD pattern in at least one SS/PBCH period; leave it out of ssb.bitmap or move the pattern.", i, a.Slot, a.Symbol, s.Numerology.SCSKHz())
	}
}

// uplinkCandidates returns the sent candidates that touch an uplink symbol
// of the TDD pattern in any SS/PBCH period, whatever span is drawn. The
// pattern and the block period together repeat after lcm(period, P+P2), so
// the periods within that window decide for every later one.
func (s SSB) uplinkCandidates(t TDD) []int {
	period := Tc(s.PeriodMs) * TcPerSubframe
	if period <= 0 || t.Period <= 0 || len(t.RefDirs) == 0 {
		return nil
	}
	repeats := int(lcmTc(period, t.Period) / period)
	repeats = min(repeats, 64) // P+P2 divides 20 ms (TS 38.213 11.1), so this is at most 4
	var out []int
	for i, sym := range s.first {
		if !s.sent[i] {
			continue
		}
		a, b := s.Numerology.SymbolAt(sym), s.Numerology.SymbolAt(sym+3)
		for k := range repeats {
			off := Tc(k) * period
			if t.uplinkBetween(off+a.Start, off+b.End()) {
				out = append(out, i)
				break
			}
		}
	}
	return out
}

// uplinkBetween reports whether any reference symbol that overlaps
// [start, end) is an uplink symbol. Reference symbol j, counted from the
// start of the span, has direction RefDirs[j mod len(RefDirs)].
func (t TDD) uplinkBetween(start, end Tc) bool {
	n := t.Reference
	// Symbols of a subframe are equal but for 16κ Tc more at the start of
	// each half subframe, so the proportional guess lands on the symbol
	// that holds start or the one after it; one step back is enough.
	per := n.SymbolsPerSubframe()
	sf := start / TcPerSubframe
	k := int(sf)*per + max(0, int((start-sf*TcPerSubframe)*Tc(per)/TcPerSubframe)-1)
	for n.SymbolAt(k).End() <= start {
		k++
	}
	for ; n.SymbolAt(k).Start < end; k++ {
		if t.RefDirs[k%len(t.RefDirs)] == Uplink {
			return true
		}
	}
	return false
}

func lcmTc(a, b Tc) Tc {
	x, y := a, b
	for y != 0 {
		x, y = y, x%y
	}
	return a / x * b
}

// CheckBand holds the block against the SS raster entries of an operating
// band (TS 38.101-1 Table 5.4.3.3-1, TS 38.101-2 Table 5.4.3.3-1): the band
// must list the block's spacing with its pattern, and SS_REF must be one of
// the band's GSCNs, inside its range and on its step. It returns sync-raster
// errors, none when the block fits the band. The band is named as the
// tables do ("n78"); Compute calls it with the channel's band, the plan's
// carrier.band or else the first candidate band the channel passes.
func (s SSB) CheckBand(band string) []Finding {
	var fs findings
	name := gscn.Normalize(band)
	entries, ok := gscn.Entries(name)
	if !ok {
		fs.add(Error, CodeSyncRaster, "", "carrier.band", "Band %s has no SS raster entries (TS 38.101-1 and TS 38.101-2 Table 5.4.3.3-1): it is not a band, or a supplementary uplink band, which carries no SS/PBCH block.", name)
		return fs
	}
	scs := s.Numerology.SCSKHz()
	i := slices.IndexFunc(entries, func(e gscn.Entry) bool { return e.SCSKHz == scs })
	if i < 0 {
		var allowed []string
		for _, e := range entries {
			allowed = append(allowed, fmt.Sprintf("%d kHz (case %s)", e.SCSKHz, e.Case))
		}
		fs.add(Error, CodeSyncRaster, "", "ssb.scsKHz", "Band %s has no %d kHz SS/PBCH blocks; it allows %s (%s Table 5.4.3.3-1).", name, scs, JoinOr(allowed), bandSpec(name))
		return fs
	}
	e := entries[i]
	if s.Case != e.Case {
		fs.add(Error, CodeSyncRaster, "", "ssb.case", "Band %s sends %d kHz SS/PBCH blocks in case %s, not case %s (%s Table 5.4.3.3-1).", name, scs, e.Case, s.Case, bandSpec(name))
	}
	if !s.Absolute || !s.OnSyncRaster {
		return fs // off the raster is reported by Compute already
	}
	if !e.Contains(s.GSCN) {
		gs := e.GSCNs()
		j, _ := slices.BinarySearch(gs, s.GSCN)
		var near []string
		for _, k := range []int{j - 1, j} {
			if k >= 0 && k < len(gs) {
				f, _ := gscn.Frequency(gs[k])
				near = append(near, fmt.Sprintf("%d (%s)", gs[k], fmtMHz(Hz(f))))
			}
		}
		fs.add(Error, CodeSyncRaster, "", "ssb.gscn", "GSCN %d is not an SS raster entry of %s at %d kHz, which allows %s (%s Table 5.4.3.3-1); the nearest are %s.", s.GSCN, name, scs, e.Range(), bandSpec(name), strings.Join(near, " and "))
	}
	return fs
}

// bandSpec names the specification whose table lists a band.
func bandSpec(band string) string {
	if n, err := strconv.Atoi(strings.TrimPrefix(band, "n")); err == nil && n >= 257 {
		return "TS 38.101-2"
	}
	return "TS 38.101-1"
}
