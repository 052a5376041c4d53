package coreset0

import "testing"

// ssbEdgesHz returns the SS/PBCH block's 240 subcarriers (TS 38.211 7.4.3.1)
// as subcarrier edges [low, high) above point A.
func ssbEdgesHz(t *testing.T, tb Table, pos SSBPosition) (low, high int64) {
	t.Helper()
	f0, err := pos.FirstSubcarrierHz()
	if err != nil {
		t.Fatal(err)
	}
	scs := int64(tb.SSBSCSkHz()) * 1000
	return f0 - scs/2, f0 - scs/2 + 240*scs
}

// In patterns 2 and 3 CORESET#0 and the SS/PBCH block share no subcarrier
// (they are multiplexed in frequency, TS 38.213 13), and the tables keep
// them close: for every k_SSB the gap is under two CORESET RBs. This holds
// only with the k_SSB rule: with −41 (or −20) kept for k_SSB > 0 the block's
// shifted top RB would overlap CORESET#0 in pattern 3.
func TestPatterns23AreBesideTheBlock(t *testing.T) {
	checked := 0
	for _, tb := range []Table{Table13_7, Table13_8, Table13_10} {
		for i, r := range tb.Rows() {
			if r.Reserved() || r.Pattern == 1 {
				continue
			}
			for k := 0; k <= MaxKSSB(FR2); k++ {
				pos := SSBPosition{FR: FR2, CommonSCSkHz: tb.PDCCHSCSkHz(), OffsetToPointA: 400, KSSB: k}
				p, err := Place(tb, i, pos)
				if err != nil {
					t.Fatal(err)
				}
				lo, hi := ssbEdgesHz(t, tb, pos)
				rbHz := 12 * int64(tb.PDCCHSCSkHz()) * 1000
				var gap int64
				switch {
				case p.LowHz >= hi:
					gap = p.LowHz - hi
				case p.HighHz <= lo:
					gap = lo - p.HighHz
				default:
					t.Errorf("%v index %d k_SSB %d: CORESET#0 [%d, %d) overlaps the block [%d, %d)", tb, i, k, p.LowHz, p.HighHz, lo, hi)
					continue
				}
				if gap >= 2*rbHz {
					t.Errorf("%v index %d k_SSB %d: gap %d Hz, two RBs or more", tb, i, k, gap)
				}
				checked++
			}
		}
	}
	// Table 13-7: 4 rows, 13-8: 4, 13-10: 4; 12 values of k_SSB each.
	if checked != 12*12 {
		t.Errorf("checked %d placements, want 144", checked)
	}
}

// In pattern 1 (block and CORESET#0 multiplexed in time) every row of every
// table lays CORESET#0 over all the block's subcarriers at k_SSB = 0. This is
// an observation checked on each row, not a sentence of the spec; it catches
// a mistyped offset or width.
func TestPattern1CoversTheBlock(t *testing.T) {
	checked := 0
	for _, tb := range Tables() {
		for i, r := range tb.Rows() {
			if r.Reserved() || r.Pattern != 1 {
				continue
			}
			pos := SSBPosition{FR: tb.FR(), CommonSCSkHz: tb.PDCCHSCSkHz(), OffsetToPointA: 400, KSSB: 0}
			p, err := Place(tb, i, pos)
			if err != nil {
				t.Fatal(err)
			}
			lo, hi := ssbEdgesHz(t, tb, pos)
			// Edges at the CORESET's half subcarrier and the block's may differ by
			// half a subcarrier of the wider spacing; compare subcarrier centres' span.
			half := int64(max(tb.SSBSCSkHz(), tb.PDCCHSCSkHz())) * 500
			if p.LowHz > lo+half || p.HighHz < hi-half {
				t.Errorf("%v index %d: CORESET#0 [%d, %d) does not cover the block [%d, %d)", tb, i, p.LowHz, p.HighHz, lo, hi)
			}
			checked++
		}
	}
	if checked < 100 {
		t.Errorf("checked %d rows", checked)
	}
}
