package timing

import (
	"strings"
	"testing"
)

// TS 38.211 5.3.1: the lattice of 120 kHz repeats every half subframe (56
// symbols), so a 0.625 ms pattern (5 slots, 70 symbols) repeats its symbol
// lengths only after lcm(70, 56) = 280 symbols = 2.5 ms = 4 915 200 Tc.
func TestCycle(t *testing.T) {
	p := Pattern{Mu: 3, Dir: []byte(strings.Repeat("D", 14*3) + "DDDDDDDDDDFFUU" + strings.Repeat("U", 14))}
	if got := p.CycleSymbols(); got != 280 {
		t.Errorf("cycle %d symbols, want 280", got)
	}
	if got := p.CycleTc(); got != 5*TcPerMilli/2 {
		t.Errorf("cycle %v, want 2.5 ms", got)
	}
	// FDD: 15 kHz repeats every slot (two half subframes), 60 kHz every
	// half subframe (2 slots).
	if got := (Pattern{Mu: 0}).CycleSymbols(); got != 14 {
		t.Errorf("FDD 15 kHz cycle %d, want 14", got)
	}
	if got := (Pattern{Mu: 2}).CycleSymbols(); got != 28 {
		t.Errorf("FDD 60 kHz cycle %d, want 28", got)
	}
	// The two slots of a 60 kHz half subframe: 14·35 072 + 1024 and 14·35 072.
	s0, _ := SymbolStart(2, 14)
	s1, _ := SymbolStart(2, 28)
	if s0 != 14*35072+1024 || s1-s0 != 14*35072 {
		t.Errorf("60 kHz slots %d and %d Tc, want %d and %d", s0, s1-s0, 14*35072+1024, 14*35072)
	}
}

// Errors a user sees are whole sentences naming the field and the allowed
// values.
func TestErrorsAreSentences(t *testing.T) {
	_, err1 := N1(7, Cap1, DMRSPos0)
	_, err2 := N1(4, Cap1, DMRSPos0)
	_, err3 := N1(1, Cap2, DMRSAdditional)
	_, err4 := EarliestK1(Pattern{Mu: 1, Dir: []byte("DDDX")}, 0, 0, 0)
	_, err5 := EarliestK1(Pattern{Mu: 1, Dir: []byte(strings.Repeat("D", 14))}, 0, 13, 0)
	_, err6 := UserPlaneLatency(LatencyConfig{Pattern: Pattern{Mu: 1}, Length: 15})
	_, err7 := UserPlaneLatency(LatencyConfig{Pattern: Pattern{Mu: 1}, Length: 14, RetxProb: 1})
	_, err8 := NTAOffset(9)
	_, err9 := BWPSwitchDelay(1, 2, 3)
	_, err10 := EarliestK1(Pattern{Mu: 1, Dir: []byte(strings.Repeat("D", 13) + "X")}, 0, 0, 0)
	for i, err := range []error{err1, err2, err3, err4, err5, err6, err7, err8, err9, err10} {
		if err == nil {
			t.Errorf("case %d: no error", i+1)
			continue
		}
		m := err.Error()
		if m[0] < 'A' || m[0] > 'Z' || !strings.HasSuffix(m, ".") {
			t.Errorf("case %d: %q is not a sentence", i+1, m)
		}
	}
}

func TestExpandSlots(t *testing.T) {
	got, err := ExpandSlots("DDDSU", "DDDDDDDDDDFFUU")
	if err != nil || string(got) != string(dddsu.Dir) {
		t.Errorf("ExpandSlots = %q, %v; want the DDDSU pattern", got, err)
	}
	for _, c := range []struct{ slots, special string }{{"DDSU", "DDD"}, {"DXU", ""}, {"", ""}} {
		if _, err := ExpandSlots(c.slots, c.special); err == nil {
			t.Errorf("ExpandSlots(%q, %q): no error", c.slots, c.special)
		}
	}
}

// firstAtOrAfter inverts SymbolStart: for every instant of two half
// subframes (at symbol edges and one Tc either side), the symbol it names
// is the first that starts at or after it.
func TestFirstAtOrAfter(t *testing.T) {
	for mu := 0; mu <= MaxMu; mu++ {
		n := 2 * SymbolsPerHalfSub(mu)
		for k := 0; k <= n; k++ {
			s, _ := SymbolStart(mu, k)
			for _, at := range []Tc{s - 1, s, s + 1} {
				want := k
				if at > s {
					want = k + 1
				}
				if at < 0 {
					continue
				}
				if got := firstAtOrAfter(mu, at); got != want {
					t.Fatalf("μ %d: first symbol at or after %d Tc is %d, want %d", mu, at, got, want)
				}
			}
		}
	}
}

// The index of the next uplink symbol wraps round the period.
func TestIndexedToUL(t *testing.T) {
	p := Pattern{Mu: 1, Dir: []byte("UDDF" + strings.Repeat("D", 10))}.indexed()
	if p.toUL[0] != 0 || p.toUL[1] != 13 || p.toUL[13] != 1 {
		t.Errorf("toUL %v", p.toUL)
	}
	if q := (Pattern{Mu: 1, Dir: []byte(strings.Repeat("D", 14))}).indexed(); q.toUL[5] != -1 {
		t.Errorf("no uplink: toUL %v", q.toUL)
	}
}
