package prach

import "fmt"

// Direction is how the TDD pattern (tdd-UL-DL-ConfigurationCommon) uses a symbol.
type Direction uint8

// The three symbol directions of TS 38.213 clause 11.1.
const (
	Downlink Direction = iota
	Flexible
	Uplink
)

// Layout describes one radio frame of the carrier for the validity rule of
// TS 38.213 clause 8.1: the direction of every symbol at numerology Mu and
// the symbols that carry an SS/PBCH block, both indexed by the symbol of the
// frame, 0 to 10·14·2^Mu − 1. The frame repeats: every radio frame is taken
// to look the same.
type Layout struct {
	Mu int
	// Dir is nil when the cell provides no tdd-UL-DL-ConfigurationCommon.
	Dir []Direction
	SSB []bool
	// Paired marks paired spectrum or a supplementary uplink, where every
	// PRACH occasion is valid (TS 38.213 8.1).
	Paired bool
}

func (l Layout) symbols() int { return 10 * 14 << l.Mu }

func (l Layout) check() error {
	n := l.symbols()
	if l.Mu < 0 || l.Mu > 3 {
		return fmt.Errorf("the layout's numerology μ is %d; it must be 0 to 3", l.Mu)
	}
	if l.Dir != nil && len(l.Dir) != n {
		return fmt.Errorf("the layout gives %d symbol directions; a frame at μ = %d has %d symbols", len(l.Dir), l.Mu, n)
	}
	if len(l.SSB) != n {
		return fmt.Errorf("the layout marks %d SS/PBCH symbols; a frame at μ = %d has %d symbols", len(l.SSB), l.Mu, n)
	}
	return nil
}

// NGap is N_gap of TS 38.213 Table 8.1-2 (read in the Release 18 text of
// github.com/CrzyNxtG/mdspc, commit dec6ce3; the same rows since Release 17) in symbols of the
// preamble's spacing: 0 at 1.25 and 5 kHz, 2 at 15, 30, 60 and 120 kHz
// (8 at 480 kHz and 16 at 960 kHz, not used here), and 0 for format B4
// whatever the spacing (TS 38.213 8.1).
func NGap(o Occasion) int {
	if o.Format.Long() || o.Format == FormatB4 {
		return 0
	}
	return 2
}

// Validity is the verdict of TS 38.213 8.1 on one occasion, with the reason
// in words for the user.
type Validity struct {
	Valid  bool
	Reason string
}

// Valid applies TS 38.213 clause 8.1 to occasion o, the Release 17 rules
// (the later SBFD, LTM and shared-spectrum branches are left out):
//   - paired spectrum or SUL: every occasion is valid;
//   - unpaired without tdd-UL-DL-ConfigurationCommon: valid if it does not
//     precede an SS/PBCH block in the PRACH slot and starts at least N_gap
//     symbols after the last SS/PBCH block symbol;
//   - unpaired with it: valid if it lies within uplink symbols, or if it
//     does not precede an SS/PBCH block in the PRACH slot and starts at
//     least N_gap symbols after the last downlink symbol and after the last
//     SS/PBCH block symbol.
//
// Readings this package makes: an occasion is the time from StartTc to
// EndTc; "the last downlink symbol" is the last one starting before the
// occasion ends, so an occasion overlapping a downlink symbol is invalid; the
// PRACH slot is the slot at Δf^RA holding the start (for the long formats,
// the occasion itself); N_gap symbols last
// N_gap·(2048+144)·κ·2^−μ Tc at the preamble's μ.
func Valid(o Occasion, l Layout) (Validity, error) {
	if err := l.check(); err != nil {
		return Validity{}, err
	}
	if l.Paired {
		return Validity{true, "paired spectrum or supplementary uplink: every PRACH occasion is valid"}, nil
	}
	n := l.symbols()
	frameTc := int64(10 * TcPerSubframe)
	// at folds symbol k, counted on (or back) from frame 0, into the layout;
	// span gives its start and end in Tc from the start of frame 0.
	at := func(k int) int { return ((k % n) + n) % n }
	span := func(k int) (int64, int64) {
		base := int64((k-at(k))/n) * frameTc
		return base + SymbolStartTc(l.Mu, at(k)), base + SymbolStartTc(l.Mu, at(k)+1)
	}
	start, end := o.StartTc, o.EndTc
	// Symbols that overlap the occasion, and whether they are all uplink.
	first := 0
	for {
		_, e := span(first)
		if e > start {
			break
		}
		first++
	}
	allUL := l.Dir != nil
	for k := first; ; k++ {
		s, _ := span(k)
		if s >= end {
			break
		}
		if l.Dir != nil && l.Dir[at(k)] != Uplink {
			allUL = false
		}
	}
	if allUL {
		return Validity{true, "the occasion lies within uplink symbols"}, nil
	}
	// The end of the PRACH slot: the slot at Δf^RA, or for the long formats
	// the end of the occasion.
	slotEnd := end
	if !o.Format.Long() {
		slotEnd = SymbolStartTc(o.Mu, o.Slot*14+14)
	}
	gap := int64(NGap(o)) * int64((2048+144)*Kappa>>o.Mu)
	// Look back one frame and forward to the end of the PRACH slot.
	var lastDLEnd, lastSSBEnd int64 = -frameTc, -frameTc
	for k := -n; ; k++ {
		s, e := span(k)
		if s >= end && s >= slotEnd {
			break
		}
		i := at(k)
		if l.SSB[i] {
			if s >= start && s < slotEnd {
				return Validity{false, fmt.Sprintf("the occasion precedes an SS/PBCH block symbol (symbol %d of the frame at μ = %d) in its PRACH slot", i, l.Mu)}, nil
			}
			if s < start {
				lastSSBEnd = max(lastSSBEnd, e)
			}
		}
		if l.Dir != nil && l.Dir[i] == Downlink && s < end {
			lastDLEnd = max(lastDLEnd, e)
		}
	}
	if l.Dir != nil && start < lastDLEnd+gap {
		if lastDLEnd > start {
			return Validity{false, "the occasion overlaps a downlink symbol"}, nil
		}
		return Validity{false, fmt.Sprintf("the occasion starts %d Tc after the last downlink symbol, less than N_gap = %d symbols (%d Tc)", start-lastDLEnd, NGap(o), gap)}, nil
	}
	if lastSSBEnd > start {
		return Validity{false, "the occasion overlaps an SS/PBCH block symbol"}, nil
	}
	if start < lastSSBEnd+gap {
		return Validity{false, fmt.Sprintf("the occasion starts %d Tc after the last SS/PBCH block symbol, less than N_gap = %d symbols (%d Tc)", start-lastSSBEnd, NGap(o), gap)}, nil
	}
	if l.Dir == nil {
		return Validity{true, "no SS/PBCH block follows in the PRACH slot and the occasion starts at least N_gap symbols after the last one"}, nil
	}
	return Validity{true, "no SS/PBCH block follows in the PRACH slot and the occasion starts at least N_gap symbols after the last downlink and SS/PBCH block symbols"}, nil
}
