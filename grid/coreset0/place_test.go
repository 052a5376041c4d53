package coreset0

import (
	"strings"
	"testing"
)

// CORESET#0 positions worked by hand from TS 38.211 4.4.4.2 and 7.4.3.1
// (offsetToPointA and k_SSB place the SS/PBCH block) and TS 38.213 13 (the
// first RB of CORESET#0 is the common RB overlapping the block's first RB,
// minus the table's offset).
func TestPlaceHandWorked(t *testing.T) {
	cases := []struct {
		name                  string
		table                 Table
		index                 int
		pos                   SSBPosition
		wantRef, wantFirst    int
		wantLowHz, wantHighHz int64
	}{
		{
			// FR1, 30 kHz SS/PBCH and CORESET, Table 13-4 index 2 (24 RBs, offset 2).
			// SS/PBCH subcarrier 0: 20 × 12 × 15 kHz + 6 × 15 kHz = 3 600 + 90 = 3 690 kHz.
			// A 30 kHz CRB is 360 kHz: ⌊3 690 / 360⌋ = 10. First CRB 10 − 2 = 8.
			// Low edge 8 × 360 kHz − 15 kHz = 2 865 kHz; width 24 × 360 kHz = 8 640 kHz.
			name: "FR1 30/30", table: Table13_4, index: 2,
			pos:     SSBPosition{FR: FR1, CommonSCSkHz: 30, OffsetToPointA: 20, KSSB: 6},
			wantRef: 10, wantFirst: 8, wantLowHz: 2_865_000, wantHighHz: 11_505_000,
		},
		{
			// The largest FR1 k_SSB keeps the block's subcarrier 0 in the same 30 kHz CRB:
			// 20 × 180 + 23 × 15 = 3 945 kHz; ⌊3 945 / 360⌋ = 10. Table 13-4 index 0 (offset 0):
			// first CRB 10, low edge 3 600 − 15 = 3 585 kHz, high edge 3 585 + 8 640 kHz.
			name: "FR1 30/30 k_SSB 23", table: Table13_4, index: 0,
			pos:     SSBPosition{FR: FR1, CommonSCSkHz: 30, OffsetToPointA: 20, KSSB: 23},
			wantRef: 10, wantFirst: 10, wantLowHz: 3_585_000, wantHighHz: 12_225_000,
		},
		{
			// FR1, 15/15, Table 13-1 index 12 (96 RBs, offset 38). offsetToPointA 40 is
			// CRB 40 at 15 kHz; first CRB 40 − 38 = 2; low edge 2 × 180 − 7.5 = 352.5 kHz;
			// width 96 × 180 kHz = 17 280 kHz.
			name: "FR1 15/15 96 RBs", table: Table13_1, index: 12,
			pos:     SSBPosition{FR: FR1, CommonSCSkHz: 15, OffsetToPointA: 40, KSSB: 0},
			wantRef: 40, wantFirst: 2, wantLowHz: 352_500, wantHighHz: 17_632_500,
		},
		{
			// FR1, 15 kHz SS/PBCH with a 30 kHz CORESET, Table 13-2 index 0 (24 RBs, offset 5).
			// SS/PBCH subcarrier 0: 10 × 180 + 4 × 15 = 1 860 kHz; ⌊1 860 / 360⌋ = 5; 5 − 5 = 0.
			name: "FR1 15/30", table: Table13_2, index: 0,
			pos:     SSBPosition{FR: FR1, CommonSCSkHz: 30, OffsetToPointA: 10, KSSB: 4},
			wantRef: 5, wantFirst: 0, wantLowHz: -15_000, wantHighHz: 8_625_000,
		},
		{
			// FR2 pattern 2, Table 13-7 index 8 (120 kHz SS/PBCH, 60 kHz CORESET, 48 RBs,
			// offset −41 for k_SSB = 0). offsetToPointA 10 RBs of 60 kHz = 7 200 kHz = CRB 10
			// at 60 kHz. First CRB 10 + 41 = 51: the block covers 240 × 120 kHz = 28.8 MHz =
			// 40 CRBs (10 to 49), CRB 50 stays free, CORESET#0 starts above it.
			name: "FR2 pattern 2, k_SSB = 0", table: Table13_7, index: 8,
			pos:     SSBPosition{FR: FR2, CommonSCSkHz: 60, OffsetToPointA: 10, KSSB: 0},
			wantRef: 10, wantFirst: 51, wantLowHz: 51*720_000 - 30_000, wantHighHz: 51*720_000 - 30_000 + 48*720_000,
		},
		{
			// The same with k_SSB = 3 (3 × 60 kHz = 180 kHz): the block now reaches into
			// CRB 50, the offset becomes −42 and CORESET#0 starts at CRB 52, one free CRB
			// (51) above the block again.
			name: "FR2 pattern 2, k_SSB > 0", table: Table13_7, index: 8,
			pos:     SSBPosition{FR: FR2, CommonSCSkHz: 60, OffsetToPointA: 10, KSSB: 3},
			wantRef: 10, wantFirst: 52, wantLowHz: 52*720_000 - 30_000, wantHighHz: 52*720_000 - 30_000 + 48*720_000,
		},
		{
			// FR2 pattern 3, Table 13-8 index 4 (120/120 kHz, 24 RBs, offset −20 for
			// k_SSB = 0). offsetToPointA 20 × 720 kHz = 14 400 kHz = CRB 10 at 120 kHz
			// (1 440 kHz). The block is 20 CRBs (10 to 29); CORESET#0 starts right above,
			// at 10 + 20 = 30.
			name: "FR2 pattern 3, k_SSB = 0", table: Table13_8, index: 4,
			pos:     SSBPosition{FR: FR2, CommonSCSkHz: 120, OffsetToPointA: 20, KSSB: 0},
			wantRef: 10, wantFirst: 30, wantLowHz: 30*1_440_000 - 60_000, wantHighHz: 30*1_440_000 - 60_000 + 24*1_440_000,
		},
		{
			// With k_SSB = 5 the block overlaps CRB 30; the offset −21 puts CORESET#0 at 31.
			name: "FR2 pattern 3, k_SSB > 0", table: Table13_8, index: 4,
			pos:     SSBPosition{FR: FR2, CommonSCSkHz: 120, OffsetToPointA: 20, KSSB: 5},
			wantRef: 10, wantFirst: 31, wantLowHz: 31*1_440_000 - 60_000, wantHighHz: 31*1_440_000 - 60_000 + 24*1_440_000,
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Place(c.table, c.index, c.pos)
			if err != nil {
				t.Fatal(err)
			}
			if p.ReferenceCRB != c.wantRef || p.FirstCRB != c.wantFirst || p.LowHz != c.wantLowHz || p.HighHz != c.wantHighHz {
				t.Errorf("Place(%v, %d, %+v) = %+v; want reference CRB %d, first CRB %d, [%d, %d) Hz",
					c.table, c.index, c.pos, p, c.wantRef, c.wantFirst, c.wantLowHz, c.wantHighHz)
			}
		})
	}
}

func TestPlaceRefuses(t *testing.T) {
	cases := []struct {
		table Table
		index int
		pos   SSBPosition
		err   string
	}{
		// 30 − 38 = −8: CORESET#0 would start below point A.
		{Table13_1, 12, SSBPosition{FR: FR1, CommonSCSkHz: 15, OffsetToPointA: 30}, "common RB -8, below point A"},
		// offsetToPointA counts 15 kHz RBs; a 30 kHz CRB is two of them.
		{Table13_4, 0, SSBPosition{FR: FR1, CommonSCSkHz: 30, OffsetToPointA: 21}, "must be a multiple of 2"},
		{Table13_4, 0, SSBPosition{FR: FR1, CommonSCSkHz: 15, OffsetToPointA: 20}, "does not match Table 13-4"},
		{Table13_4, 0, SSBPosition{FR: FR1, CommonSCSkHz: 30, OffsetToPointA: 20, KSSB: 24}, "must be 0 to 23"},
		{Table13_8, 0, SSBPosition{FR: FR2, CommonSCSkHz: 120, OffsetToPointA: 2200}, "0 to 2199"},
	}
	for _, c := range cases {
		if _, err := Place(c.table, c.index, c.pos); err == nil || !strings.Contains(err.Error(), c.err) {
			t.Errorf("Place(%v, %d, %+v) error %v; want one with %q", c.table, c.index, c.pos, err, c.err)
		}
	}
}
