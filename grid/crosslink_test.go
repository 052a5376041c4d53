package grid

import (
	"math"
	"testing"
)

func tddOf(t *testing.T, p Plan) TDD {
	t.Helper()
	r := Compute(p)
	if r.TDD == nil {
		t.Fatalf("no TDD: %v", r.Findings)
	}
	return *r.TDD
}

// Two cells on the same DDDSU pattern (30 kHz, 2.5 ms, special slot
// 10:2:2): aligned, nothing clashes; B one slot (500 µs) late, by hand:
//
//	A: D D D S U      (S = 10 D, 2 F, 2 U)
//	B: U D D D S      (B's slot 4 falls in A's slot 0)
//
//	A slot 0 D against B's U slot: the whole slot, 0.5 ms = 983040 Tc;
//	A slot 3 symbols 12–13 U against B's D slot: 2·70144 = 140288 Tc;
//	A slot 4 symbols 0–9 U against B's special slot's D symbols: symbol 0
//	  starts a half subframe (1024 Tc longer), so 10·70144 + 1024 = 702464 Tc.
//
// Total per 2.5 ms: 1825792 Tc; per 10 ms four times that, 7303168 Tc
// (3714.6 µs).
func TestCrossLinkConflicts(t *testing.T) {
	tdd := tddOf(t, dddsu30())
	cl, err := CrossLinkConflicts(tdd, tdd, 0)
	if err != nil || len(cl.Conflicts) != 0 || cl.Total != 0 || cl.Cycle != 2500*ms/1000 {
		t.Errorf("aligned: %+v, %v", cl, err)
	}
	cl, err = CrossLinkConflicts(tdd, tdd, 500)
	if err != nil {
		t.Fatal(err)
	}
	const slot Tc = 983040 // 0.5 ms
	// The clashes in slots 3 and 4 touch at 4·slot with the same
	// directions, so they are one run.
	want := []CrossLinkConflict{
		{0, slot, Downlink, Uplink},
		{3*slot + 1024 + 12*sym30, 4*slot + 1024 + 10*sym30, Uplink, Downlink},
	}
	if len(cl.Conflicts) != len(want) {
		t.Fatalf("conflicts %+v, want %+v", cl.Conflicts, want)
	}
	for i := range want {
		if cl.Conflicts[i] != want[i] {
			t.Errorf("conflict %d: %+v, want %+v", i, cl.Conflicts[i], want[i])
		}
	}
	if cl.Total != 1825792 || cl.PerTenMs != 7303168 {
		t.Errorf("total %d Tc, per 10 ms %g; want 1825792 and 7303168", cl.Total, cl.PerTenMs)
	}
	// Looking from B, with A 500 µs early, is the same clash.
	back, _ := CrossLinkConflicts(tdd, tdd, -500)
	if back.Total != cl.Total {
		t.Errorf("B's view: %d Tc, A's %d", back.Total, cl.Total)
	}
	// A whole period of offset is no offset.
	if p, _ := CrossLinkConflicts(tdd, tdd, 2500); p.Total != 0 {
		t.Errorf("offset of one period: %d Tc of conflict", p.Total)
	}
	if _, err := CrossLinkConflicts(tdd, tdd, math.NaN()); err == nil {
		t.Error("NaN offset accepted")
	}
}

// A 5 ms pattern on 15 kHz against a 2.5 ms one on 30 kHz: the common
// cycle is 5 ms, and per 10 ms the total is twice the cycle's. The
// conflict time is the measure of {A says D and B says U, or the reverse},
// counted here symbol by symbol of 30 kHz (every 15 kHz symbol holds two
// 30 kHz symbols exactly, TS 38.213 11.1).
func TestCrossLinkMixedPeriods(t *testing.T) {
	a := plan(40, part("a", 15, 0, 50))
	a.TDD = &TDDPlan{ReferenceSCSKHz: 15, Pattern1: TDDPattern{PeriodMs: 5, DownlinkSlots: 3, DownlinkSymbols: 10, UplinkSlots: 1, UplinkSymbols: 2}}
	ta, tb := tddOf(t, a), tddOf(t, dddsu30())
	cl, err := CrossLinkConflicts(ta, tb, 0)
	if err != nil || cl.Cycle != 5*ms {
		t.Fatalf("%+v %v", cl, err)
	}
	n := Numerology{Mu: 1}
	var want Tc
	for k := 0; k < 140; k++ { // 5 ms of 30 kHz symbols
		da, db := ta.RefDirs[(k/2)%len(ta.RefDirs)], tb.RefDirs[k%len(tb.RefDirs)]
		if da == Downlink && db == Uplink || da == Uplink && db == Downlink {
			want += n.SymbolAt(k).Length
		}
	}
	if cl.Total != want || cl.PerTenMs != 2*float64(want) {
		t.Errorf("total %d, per 10 ms %g; want %d and %d", cl.Total, cl.PerTenMs, want, 2*want)
	}
}
