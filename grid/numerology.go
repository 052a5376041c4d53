package grid

import "fmt"

// Tc counts the basic time unit of NR, Tc = 1/(Δf_max·N_f) with
// Δf_max = 480 kHz and N_f = 4096 (TS 38.211 4.1). A Tc value is either an
// instant measured from the start of the span or a duration.
type Tc int64

// Time constants of TS 38.211 4.1 and 4.3.1.
const (
	Kappa             = 64            // κ = Ts/Tc
	TcPerSecond    Tc = 480000 * 4096 // 1 966 080 000
	TcPerSubframe  Tc = TcPerSecond / 1000
	TcPerHalfFrame Tc = TcPerSubframe / 2 // half a subframe: 0.5 ms, where every numerology aligns
)

// Micros returns d in microseconds. One microsecond is 1966.08 Tc, so the
// result is for display; keep Tc for arithmetic.
func (d Tc) Micros() float64 { return float64(d) * 1e6 / float64(TcPerSecond) }

// CP is the cyclic prefix type of a numerology (TS 38.211 Table 4.2-1).
type CP uint8

// Cyclic prefix types.
const (
	NormalCP CP = iota
	ExtendedCP
)

func (c CP) String() string {
	if c == ExtendedCP {
		return "extended"
	}
	return "normal"
}

// ParseCP reads "normal" or "extended".
func ParseCP(s string) (CP, bool) {
	switch s {
	case "normal":
		return NormalCP, true
	case "extended":
		return ExtendedCP, true
	}
	return NormalCP, false
}

// MaxMu is the largest numerology of TS 38.211 Table 4.2-1 (960 kHz).
const MaxMu = 6

// Numerology is a subcarrier spacing configuration μ with its cyclic prefix
// (TS 38.211 Table 4.2-1). The zero value is μ = 0, normal CP: 15 kHz.
// Methods assume a valid numerology: 0 ≤ Mu ≤ MaxMu, and ExtendedCP only at
// μ = 2; see Valid.
type Numerology struct {
	Mu int
	CP CP
}

// MuForSCS returns μ for a subcarrier spacing of 15·2^μ kHz.
func MuForSCS(scsKHz int) (int, bool) {
	for mu := 0; mu <= MaxMu; mu++ {
		if 15<<mu == scsKHz {
			return mu, true
		}
	}
	return 0, false
}

// Valid reports whether n is a numerology of TS 38.211 Table 4.2-1.
func (n Numerology) Valid() bool {
	if n.Mu < 0 || n.Mu > MaxMu {
		return false
	}
	return n.CP == NormalCP || n.Mu == 2
}

func (n Numerology) String() string {
	return fmt.Sprintf("μ=%d (%d kHz, %s CP)", n.Mu, n.SCSKHz(), n.CP)
}

// SCSKHz is the subcarrier spacing Δf = 2^μ·15 kHz.
func (n Numerology) SCSKHz() int { return 15 << n.Mu }

// SCS is the subcarrier spacing in Hz.
func (n Numerology) SCS() Hz { return Hz(15000 << n.Mu) }

// SlotsPerSubframe is N_slot^subframe,μ = 2^μ (TS 38.211 Tables 4.3.2-1, 4.3.2-2).
func (n Numerology) SlotsPerSubframe() int { return 1 << n.Mu }

// SymbolsPerSlot is N_symb^slot: 14 with normal CP, 12 with extended CP.
func (n Numerology) SymbolsPerSlot() int {
	if n.CP == ExtendedCP {
		return 12
	}
	return 14
}

// SymbolsPerSubframe is N_symb^slot · N_slot^subframe,μ.
func (n Numerology) SymbolsPerSubframe() int { return n.SymbolsPerSlot() << n.Mu }

// SlotTc is the nominal slot length, 1 ms/2^μ. It is exact for μ ≤ 1 and
// for extended CP; for μ ≥ 2 with normal CP the first slot of each half
// subframe is 16·κ Tc longer than the others and they are shorter by a
// share of that. Use Slot for exact slot boundaries.
func (n Numerology) SlotTc() Tc { return TcPerSubframe >> n.Mu }

// UsefulTc is N_u^μ = 2048·κ·2^−μ, the useful part of every symbol (TS 38.211 5.3.1).
func (n Numerology) UsefulTc() Tc { return Tc(2048*Kappa) >> n.Mu }

// CPTc is N_CP,l^μ for symbol l of a subframe (TS 38.211 5.3.1): 512·κ·2^−μ
// with extended CP; with normal CP 144·κ·2^−μ + 16·κ when l is 0 or 7·2^μ,
// that is for the first symbol of each half subframe, and 144·κ·2^−μ otherwise.
func (n Numerology) CPTc(l int) Tc {
	if n.CP == ExtendedCP {
		return Tc(512*Kappa) >> n.Mu
	}
	cp := Tc(144*Kappa) >> n.Mu
	if l == 0 || l == 7<<n.Mu {
		cp += 16 * Kappa
	}
	return cp
}

// Symbol is one OFDM symbol of a numerology. Start is measured from the
// start of the span, which begins on a subframe boundary. Length is the
// whole symbol, cyclic prefix included: the symbol occupies [Start, Start+Length).
type Symbol struct {
	Slot   int `json:"slot"`   // slot counted over the whole span
	Symbol int `json:"symbol"` // symbol within the slot
	Start  Tc  `json:"startTc"`
	CP     Tc  `json:"cpTc"`
	Length Tc  `json:"lengthTc"`
}

// End is the instant just after the symbol.
func (s Symbol) End() Tc { return s.Start + s.Length }

// SymbolAt returns the k-th symbol counted from the start of the span
// (k ≥ 0). It is closed-form: the start of TS 38.211 5.3.1,
// t_start,l = t_start,l−1 + (N_u + N_CP,l−1)·Tc, summed over whole half
// subframes, each of which is exactly 0.5 ms long in every numerology.
func (n Numerology) SymbolAt(k int) Symbol {
	perSubframe := n.SymbolsPerSubframe()
	subframe, l := k/perSubframe, k%perSubframe
	nu := n.UsefulTc()
	cp := n.CPTc(l)
	start := Tc(subframe) * TcPerSubframe
	if n.CP == ExtendedCP {
		start += Tc(l) * (nu + cp)
	} else {
		half := 7 << n.Mu
		h, j := l/half, l%half
		start += Tc(h) * TcPerHalfFrame
		if j > 0 {
			start += 16*Kappa + Tc(j)*(nu+n.CPTc(1))
		}
	}
	perSlot := n.SymbolsPerSlot()
	return Symbol{Slot: k / perSlot, Symbol: k % perSlot, Start: start, CP: cp, Length: nu + cp}
}

// Slot returns the instants [start, end) of slot s counted from the start of
// the span. Slots that hold the first symbol of a half subframe are 16·κ Tc
// longer than the others.
func (n Numerology) Slot(s int) (start, end Tc) {
	perSlot := n.SymbolsPerSlot()
	first := n.SymbolAt(s * perSlot)
	last := n.SymbolAt(s*perSlot + perSlot - 1)
	return first.Start, last.End()
}

// symbolWalk steps through the symbols of a numerology in time order,
// without the divisions of SymbolAt: each symbol starts where the one
// before it ends (TS 38.211 5.3.1) and every half subframe holds whole
// symbols, so the sum is exact. After k calls of next, sym is SymbolAt(k).
type symbolWalk struct {
	sym          Symbol
	k            int
	l            int // index of sym in its subframe
	perSubframe  int
	perSlot      int
	half         int // l of the second half subframe's first symbol; 0 with extended CP
	nu, cp, long Tc  // useful part, CP, and the longer CP of l = 0 and l = half
}

func walkSymbols(n Numerology) symbolWalk {
	w := symbolWalk{sym: n.SymbolAt(0), perSubframe: n.SymbolsPerSubframe(), perSlot: n.SymbolsPerSlot(),
		nu: n.UsefulTc(), cp: n.CPTc(1), long: n.CPTc(0)}
	if n.CP == NormalCP {
		w.half = 7 << n.Mu
	}
	return w
}

// next moves to the following symbol.
func (w *symbolWalk) next() {
	start := w.sym.End()
	w.k++
	w.l++
	if w.l == w.perSubframe {
		w.l = 0
	}
	w.sym.Symbol++
	if w.sym.Symbol == w.perSlot {
		w.sym.Symbol = 0
		w.sym.Slot++
	}
	cp := w.cpAt(w.l)
	w.sym.Start, w.sym.CP, w.sym.Length = start, cp, w.nu+cp
}

// cpAt is the cyclic prefix of symbol l of a subframe.
func (w *symbolWalk) cpAt(l int) Tc {
	if l == 0 || l == w.half {
		return w.long
	}
	return w.cp
}

// lengthAt is the length of symbol l of a subframe, CP included.
func (w *symbolWalk) lengthAt(l int) Tc { return w.nu + w.cpAt(l) }
