package timing

import "fmt"

// Pattern is the direction of every symbol of one period at numerology Mu,
// repeated for ever: 'D' downlink, 'U' uplink, 'F' flexible. A nil Dir is
// FDD (or a paired spectrum seen from one carrier): every symbol is both a
// downlink symbol on the DL carrier and an uplink symbol on the UL carrier.
//
// Flexible symbols count as neither direction: in a semi-static TDD pattern
// the flexible symbols of the special slot hold the guard period (common
// practice). Symbol k of the pattern starts at SymbolStart(Mu, k), so a
// pattern starts at a half-subframe boundary; its length must be a whole
// number of slots. Slots are not all alike: the first symbol of every half
// subframe is 16κ longer, so at 60 kHz and above the first slot of each half
// subframe is 16κ longer than the others.
//
// ULAdvance is how much earlier the UE's uplink symbols start than the
// downlink lattice: (N_TA + N_TA,offset)·Tc (TS 38.211 4.3.1). The zero value
// ignores the timing advance, which makes every uplink deadline easier by that
// much; set it to the round trip and offset for the cell edge.
type Pattern struct {
	Mu        int
	Dir       []byte
	ULAdvance Tc
	// toUL[i] is the number of symbols from symbol i of the period to the
	// next uplink symbol (0 when i is one), −1 without any: an index the
	// walks over a whole cycle build once (indexed), so that the search for
	// the next uplink symbol does not step through long downlink runs.
	toUL []int32
}

// indexed returns p with toUL built; FDD needs none.
func (p Pattern) indexed() Pattern {
	if p.Dir == nil || p.toUL != nil {
		return p
	}
	n := len(p.Dir)
	p.toUL = make([]int32, n)
	next := -1 // distance from the symbol after the current one, walking backwards twice round
	for pass := 0; pass < 2; pass++ {
		for i := n - 1; i >= 0; i-- {
			switch {
			case p.Dir[i] == 'U':
				next = 0
			case next >= 0:
				next++
			}
			p.toUL[i] = int32(next)
		}
	}
	return p
}

// firstAtOrAfter is the first symbol k of the lattice of μ whose start is
// at or after t (t ≥ 0), the inverse of SymbolStart.
func firstAtOrAfter(mu int, t Tc) int {
	if t <= 0 {
		return 0
	}
	per := SymbolsPerHalfSub(mu)
	h, rem := int(t/TcPerHalfSub), t%TcPerHalfSub
	if rem == 0 {
		return h * per
	}
	// Symbol l ≥ 1 of a half subframe starts 16κ + l·nominal in.
	nom := NominalSymbolTc(mu)
	l := 1
	if rem > 16*Kappa {
		l = max(1, int((rem-16*Kappa+nom-1)/nom))
	}
	if l >= per {
		return (h + 1) * per
	}
	return h*per + l
}

// Check reports whether p is a pattern this package can walk.
func (p Pattern) Check() error {
	if err := checkMu("The pattern's numerology", p.Mu); err != nil {
		return err
	}
	if p.ULAdvance < 0 {
		return fmt.Errorf("The uplink advance must be zero or more Tc; got %d.", p.ULAdvance)
	}
	if p.Dir == nil {
		return nil
	}
	if len(p.Dir) == 0 || len(p.Dir)%SymbolsPerSlot != 0 {
		return fmt.Errorf("The pattern must give one direction per symbol for a whole number of %d-symbol slots; got %d symbols.", SymbolsPerSlot, len(p.Dir))
	}
	for i, d := range p.Dir {
		if d != 'D' && d != 'U' && d != 'F' {
			return fmt.Errorf("The pattern's symbol %d is %q; each symbol must be 'D', 'U' or 'F'.", i, d)
		}
	}
	return nil
}

// FDD reports whether p is a paired-spectrum lattice.
func (p Pattern) FDD() bool { return p.Dir == nil }

// PeriodSymbols is the number of symbols before the pattern repeats (one
// slot for FDD).
func (p Pattern) PeriodSymbols() int {
	if p.Dir == nil {
		return SymbolsPerSlot
	}
	return len(p.Dir)
}

// CycleSymbols is the number of symbols after which both the directions
// and the symbol lengths repeat: the least common multiple of the pattern's
// period and a half subframe (7·2^μ symbols, the span that starts with the
// longer cyclic prefix). At 120 kHz a 0.625 ms pattern (70 symbols) repeats
// its lattice only every 280 symbols, 2.5 ms; FDD repeats every slot at 15
// and 30 kHz and every half subframe above.
func (p Pattern) CycleSymbols() int {
	a, b := p.PeriodSymbols(), SymbolsPerHalfSub(p.Mu)
	x, y := a, b
	for y != 0 {
		x, y = y, x%y
	}
	return a / x * b
}

// CycleSlots is CycleSymbols in slots.
func (p Pattern) CycleSlots() int { return p.CycleSymbols() / SymbolsPerSlot }

// CycleTc is the length of one cycle, exact.
func (p Pattern) CycleTc() Tc {
	s, _ := SymbolStart(p.Mu, p.CycleSymbols())
	return s
}

// IsDL reports whether symbol k (any k ≥ 0) is a downlink symbol.
func (p Pattern) IsDL(k int) bool { return p.Dir == nil || p.Dir[k%len(p.Dir)] == 'D' }

// IsUL reports whether symbol k is an uplink symbol.
func (p Pattern) IsUL(k int) bool { return p.Dir == nil || p.Dir[k%len(p.Dir)] == 'U' }

// dlStart and dlEnd are the edges of symbol k on the downlink lattice.
func (p Pattern) dlStart(k int) Tc { s, _ := SymbolStart(p.Mu, k); return s }
func (p Pattern) dlEnd(k int) Tc   { s, l := SymbolStart(p.Mu, k); return s + l }

// ulStart is the start of symbol k as the UE transmits it.
func (p Pattern) ulStart(k int) Tc { return p.dlStart(k) - p.ULAdvance }

// ExpandSlots turns a direction per slot into a direction per symbol:
// 'D', 'U' and 'F' fill a slot's 14 symbols, 'S' takes special, which gives
// the 14 symbols of the special slot (e.g. "DDDDDDDDDDFFUU"). ExpandSlots("DDDSU",
// "DDDDDDDDDDFFUU") is the 2.5 ms pattern at 30 kHz.
func ExpandSlots(slots, special string) ([]byte, error) {
	var out []byte
	for i := 0; i < len(slots); i++ {
		switch c := slots[i]; c {
		case 'D', 'U', 'F':
			for range SymbolsPerSlot {
				out = append(out, c)
			}
		case 'S':
			if len(special) != SymbolsPerSlot {
				return nil, fmt.Errorf("The special slot must give %d symbol directions ('D', 'U' or 'F'); got %d.", SymbolsPerSlot, len(special))
			}
			out = append(out, special...)
		default:
			return nil, fmt.Errorf("Slot %d of the pattern is %q; each slot must be 'D', 'U', 'F' or 'S'.", i, c)
		}
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("The slot pattern is empty; give at least one slot.")
	}
	return out, nil
}
