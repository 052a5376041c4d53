package web

import (
	"strings"
	"testing"
)

// TestTimingViewFDD: the port plan has no TDD pattern, so no guard and no
// lattice K1/K2 beside the pattern's, and its switching matrix pairs 60 kHz
// extended CP with 30 kHz: TS 38.133 Table 8.6.2-1 gives μ2 3 / 9 slots of
// 0.25 ms (750 / 2250 µs) and μ1 2 / 5 slots of 0.5 ms (1000 / 2500 µs);
// the larger of the two is 1000 µs for type 1 and 2500 µs for type 2.
func TestTimingViewFDD(t *testing.T) {
	tv := timingOf(computeFile(t, "../grid/demo/port.yaml"))
	if tv == nil {
		t.Fatal("no timing section for the port plan")
	}
	var guard string
	for _, f := range tv.Facts {
		if f.TestID == "guard" {
			guard = f.Value
		}
	}
	if !strings.HasPrefix(guard, "none") {
		t.Errorf("guard fact %q, want none without TDD", guard)
	}
	for _, p := range tv.Parts {
		if strings.Contains(p.K1+p.K2, "lattice") || p.Guard != "—" {
			t.Errorf("%s: K1 %q, K2 %q, guard %q; FDD has no pattern to set the lattice beside", p.Name, p.K1, p.K2, p.Guard)
		}
	}
	m := tv.Switch
	if m == nil || strings.Join(m.Names, " ") != "cranes yard-cams office" {
		t.Fatalf("switch matrix %+v", m)
	}
	for _, c := range []struct {
		i, j         int
		type1, type2 string
	}{{0, 1, "1000.000", "2500.000"}, {1, 0, "1000.000", "2500.000"}, {0, 2, "1000.000", "2500.000"},
		// yard-cams to office stays at 30 kHz: μ1's own 2 / 5 slots.
		{1, 2, "1000.000", "2500.000"}} {
		if got := m.Cells[c.i][c.j]; got.Type1 != c.type1 || got.Type2 != c.type2 || got.Self || got.None {
			t.Errorf("%s → %s: %+v, want %s / %s", m.Names[c.i], m.Names[c.j], got, c.type1, c.type2)
		}
	}
	for i := range m.Names {
		if !m.Cells[i][i].Self {
			t.Errorf("%s → itself is not marked", m.Names[i])
		}
	}
	// 10 ms of RRC processing + 6 ms (TS 38.133 8.6.3).
	if m.RRC != "16000.000" {
		t.Errorf("RRC switch %s µs, want 16000.000", m.RRC)
	}
	// Every latency row of a partition comes with its slot first, then the
	// mini-slots of 7, 4 and 2 symbols.
	if n := len(tv.Latency); n != 12 || !tv.Latency[0].First || tv.Latency[0].Span != 4 || tv.Latency[0].Unit != "slot (14 symbols)" {
		t.Errorf("%d latency rows, first %+v", n, tv.Latency[0])
	}
}
