package grid

import "testing"

// allNumerologies lists every numerology of TS 38.211 Table 4.2-1.
func allNumerologies() []Numerology {
	var out []Numerology
	for mu := 0; mu <= MaxMu; mu++ {
		out = append(out, Numerology{Mu: mu})
	}
	return append(out, Numerology{Mu: 2, CP: ExtendedCP})
}

// TS 38.211 5.3.1: t_start,l = t_start,l−1 + (N_u + N_CP,l−1)·Tc, with
// N_u = 2048κ·2^−μ; N_CP,l = 512κ·2^−μ (extended), 144κ·2^−μ + 16κ for
// l = 0 or 7·2^μ, 144κ·2^−μ otherwise (normal). The closed form of
// SymbolAt must match the recurrence symbol by symbol over 10 ms.
func TestSymbolAtFollowsRecurrence(t *testing.T) {
	for _, n := range allNumerologies() {
		perSubframe := n.SymbolsPerSubframe()
		var start Tc
		for k := 0; k < 10*perSubframe; k++ {
			l := k % perSubframe
			cp := Tc(144*64) >> n.Mu
			switch {
			case n.CP == ExtendedCP:
				cp = Tc(512*64) >> n.Mu
			case l == 0 || l == 7<<n.Mu:
				cp += 16 * 64
			}
			want := Symbol{Slot: k / n.SymbolsPerSlot(), Symbol: k % n.SymbolsPerSlot(),
				Start: start, CP: cp, Length: Tc(2048*64)>>n.Mu + cp}
			if got := n.SymbolAt(k); got != want {
				t.Fatalf("%v symbol %d: got %+v, want %+v", n, k, got, want)
			}
			start += want.Length
		}
		if start != 10*TcPerSubframe {
			t.Errorf("%v: 10 subframes of symbols last %d Tc, want %d", n, start, 10*TcPerSubframe)
		}
	}
}

// Every numerology starts a symbol on each 0.5 ms boundary: the alignment
// that lets numerologies share a carrier (TS 38.211 5.3.1, the 16κ extension
// of the first CP of each half subframe).
func TestHalfSubframeAlignment(t *testing.T) {
	for _, n := range allNumerologies() {
		perHalf := n.SymbolsPerSubframe() / 2
		for h := 0; h < 20; h++ {
			if got, want := n.SymbolAt(h*perHalf).Start, Tc(h)*TcPerHalfFrame; got != want {
				t.Errorf("%v: symbol %d starts at %d Tc, want the half-subframe boundary %d", n, h*perHalf, got, want)
			}
		}
	}
}

// 38.211 5.3.1 worked by hand for 15 kHz: the first symbol has CP
// 144·64 + 16·64 = 10240 Tc (5.21 µs) and lasts 141312 Tc; the second
// starts there with CP 9216 Tc (4.69 µs).
func TestFirstSymbolsAt15kHz(t *testing.T) {
	n := Numerology{}
	s0, s1, s7 := n.SymbolAt(0), n.SymbolAt(1), n.SymbolAt(7)
	if s0.CP != 10240 || s0.Length != 141312 || s0.Start != 0 {
		t.Errorf("symbol 0 = %+v, want start 0, CP 10240, length 141312", s0)
	}
	if s1.Start != 141312 || s1.CP != 9216 {
		t.Errorf("symbol 1 = %+v, want start 141312, CP 9216", s1)
	}
	if s7.Start != TcPerHalfFrame || s7.CP != 10240 {
		t.Errorf("symbol 7 = %+v, want start %d (0.5 ms) with the long CP 10240", s7, TcPerHalfFrame)
	}
}

func TestSlotBounds(t *testing.T) {
	for _, n := range allNumerologies() {
		var prevEnd Tc
		for s := 0; s < 2*n.SlotsPerSubframe(); s++ {
			start, end := n.Slot(s)
			if start != prevEnd {
				t.Errorf("%v slot %d starts at %d, want %d (end of the slot before)", n, s, start, prevEnd)
			}
			prevEnd = end
		}
		if prevEnd != 2*TcPerSubframe {
			t.Errorf("%v: slots of 2 ms end at %d, want %d", n, prevEnd, 2*TcPerSubframe)
		}
	}
	// At 60 kHz normal CP the first slot of each half subframe carries the
	// 16κ extension: 0.25 ms + 8κ and 0.25 ms − 8κ.
	n := Numerology{Mu: 2}
	if s, e := n.Slot(0); e-s != TcPerSubframe/4+8*64 {
		t.Errorf("60 kHz slot 0 lasts %d Tc, want %d", e-s, TcPerSubframe/4+8*64)
	}
}
