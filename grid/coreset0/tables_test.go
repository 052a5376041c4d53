package coreset0

import (
	"strings"
	"testing"
)

// Spot rows read from the clause 13 text, one or two per table, and a
// reserved index where the table has one.
func TestSpotRows(t *testing.T) {
	cases := []struct {
		table          Table
		index          int
		want           Row // zero Row: reserved
		ssbKHz, pdcKHz int
	}{
		{Table13_1, 12, Row{1, 96, 1, 38, 38}, 15, 15},     // TS 38.213 Table 13-1 index 12
		{Table13_1, 15, Row{}, 15, 15},                     // TS 38.213 Table 13-1 index 15: reserved
		{Table13_1A, 7, Row{1, 96, 2, 16, 16}, 15, 15},     // TS 38.213 Table 13-1A index 7
		{Table13_1A, 8, Row{}, 15, 15},                     // TS 38.213 Table 13-1A index 8: reserved
		{Table13_2, 9, Row{1, 48, 1, 20, 20}, 15, 30},      // TS 38.213 Table 13-2 index 9
		{Table13_2, 14, Row{}, 15, 30},                     // TS 38.213 Table 13-2 index 14: reserved
		{Table13_3, 6, Row{1, 96, 1, 28, 28}, 30, 15},      // TS 38.213 Table 13-3 index 6
		{Table13_3, 9, Row{}, 30, 15},                      // TS 38.213 Table 13-3 index 9: reserved
		{Table13_4, 0, Row{1, 24, 2, 0, 0}, 30, 30},        // TS 38.213 Table 13-4 index 0
		{Table13_4, 15, Row{1, 48, 2, 16, 16}, 30, 30},     // TS 38.213 Table 13-4 index 15 (no reserved row)
		{Table13_4A, 3, Row{1, 48, 1, 3, 3}, 30, 30},       // TS 38.213 Table 13-4A index 3
		{Table13_4A, 8, Row{}, 30, 30},                     // TS 38.213 Table 13-4A index 8: reserved
		{Table13_5, 4, Row{1, 96, 1, 56, 56}, 30, 15},      // TS 38.213 Table 13-5 index 4
		{Table13_6, 5, Row{1, 48, 1, 28, 28}, 30, 30},      // TS 38.213 Table 13-6 index 5
		{Table13_6, 10, Row{}, 30, 30},                     // TS 38.213 Table 13-6 index 10: reserved
		{Table13_7, 8, Row{2, 48, 1, -41, -42}, 120, 60},   // TS 38.213 Table 13-7 index 8: −41 if k_SSB = 0, −42 if k_SSB > 0
		{Table13_7, 11, Row{2, 96, 1, 97, 97}, 120, 60},    // TS 38.213 Table 13-7 index 11
		{Table13_8, 4, Row{3, 24, 2, -20, -21}, 120, 120},  // TS 38.213 Table 13-8 index 4: −20 if k_SSB = 0, −21 if k_SSB > 0
		{Table13_8, 7, Row{3, 48, 2, 48, 48}, 120, 120},    // TS 38.213 Table 13-8 index 7
		{Table13_9, 3, Row{1, 96, 2, 16, 16}, 240, 60},     // TS 38.213 Table 13-9 index 3
		{Table13_9, 4, Row{}, 240, 60},                     // TS 38.213 Table 13-9 index 4: reserved
		{Table13_10, 5, Row{2, 24, 1, 25, 25}, 240, 120},   // TS 38.213 Table 13-10 index 5
		{Table13_10, 6, Row{2, 48, 1, -41, -42}, 240, 120}, // TS 38.213 Table 13-10 index 6
	}
	for _, c := range cases {
		if got := c.table.Rows()[c.index]; got != c.want {
			t.Errorf("%v index %d = %+v, want %+v", c.table, c.index, got, c.want)
		}
		if c.table.SSBSCSkHz() != c.ssbKHz || c.table.PDCCHSCSkHz() != c.pdcKHz {
			t.Errorf("%v is for {%d, %d} kHz, want {%d, %d}", c.table, c.table.SSBSCSkHz(), c.table.PDCCHSCSkHz(), c.ssbKHz, c.pdcKHz)
		}
	}
}

// Invariants the clause states for every row: CORESET#0 is 24, 48 or 96 RBs
// (Rel-17; 12 RBs only in Rel-18's Table 13-0), 1 to 3 symbols, patterns 2
// and 3 only in FR2, and the k_SSB-dependent offset only in patterns 2 and 3.
func TestRowInvariants(t *testing.T) {
	for _, tb := range Tables() {
		rows := 0
		for i, r := range tb.Rows() {
			if r.Reserved() {
				if r != (Row{}) {
					t.Errorf("%v index %d reserved but not empty: %+v", tb, i, r)
				}
				continue
			}
			rows++
			if r.NumRBs != 24 && r.NumRBs != 48 && r.NumRBs != 96 {
				t.Errorf("%v index %d: N_RB %d", tb, i, r.NumRBs)
			}
			if r.NumSymbols < 1 || r.NumSymbols > 3 {
				t.Errorf("%v index %d: N_symb %d", tb, i, r.NumSymbols)
			}
			if r.Pattern != 1 && tb.FR() != FR2 {
				t.Errorf("%v index %d: pattern %d in FR1", tb, i, r.Pattern)
			}
			if r.Offset != r.OffsetKSSBPositive && (r.Pattern == 1 || r.OffsetKSSBPositive != r.Offset-1) {
				t.Errorf("%v index %d: offsets %d / %d", tb, i, r.Offset, r.OffsetKSSBPositive)
			}
		}
		if rows == 0 {
			t.Errorf("%v has no rows", tb)
		}
	}
}

func TestSelectTable(t *testing.T) {
	fr1 := func(minMHz int) Band { return Band{FR: FR1, MinChannelBandwidthMHz: minMHz} }
	cases := []struct {
		ssb, common int
		band        Band
		want        Table
		err         string // a part of the error, "" for none
	}{
		{15, 15, fr1(5), Table13_1, ""},  // TS 38.213 13: {15, 15} kHz, minimum channel bandwidth 5 or 10 MHz
		{15, 15, fr1(10), Table13_1, ""}, //
		{15, 30, fr1(5), Table13_2, ""},  // {15, 30} kHz
		{30, 15, fr1(10), Table13_3, ""}, // {30, 15} kHz
		{30, 30, fr1(10), Table13_4, ""}, // {30, 30} kHz
		{30, 15, fr1(40), Table13_5, ""}, // {30, 15} kHz, minimum channel bandwidth 40 MHz
		{30, 30, fr1(40), Table13_6, ""}, // {30, 30} kHz, minimum channel bandwidth 40 MHz
		{30, 30, Band{FR: FR1, MinChannelBandwidthMHz: 10, Uses40MHzTables: true}, Table13_6, ""},
		{15, 15, Band{FR: FR1, SharedSpectrum: true}, Table13_1A, ""},
		{30, 30, Band{FR: FR1, SharedSpectrum: true}, Table13_4A, ""},
		{120, 60, Band{FR: FR2}, Table13_7, ""},
		{120, 120, Band{FR: FR2}, Table13_8, ""},
		{240, 60, Band{FR: FR2}, Table13_9, ""},
		{240, 120, Band{FR: FR2}, Table13_10, ""},
		{15, 30, Band{FR: FR1, SharedSpectrum: true}, 0, "only for {SS/PBCH, PDCCH} subcarrier spacings {15, 15} kHz"},
		{15, 15, fr1(40), 0, "only for a 30 kHz SS/PBCH block"},
		{15, 15, fr1(3), 0, "3 MHz has no CORESET#0 table in Release 17"},
		{30, 30, fr1(20), 0, "20 MHz has no CORESET#0 table"},
		{60, 60, fr1(10), 0, "FR1 allows 15 or 30 kHz"},
		{30, 60, fr1(10), 0, "must be 15 or 30 kHz"},
		{480, 480, Band{FR: FR2}, 0, "FR2-1 allows 120 or 240 kHz"},
		{120, 30, Band{FR: FR2}, 0, "must be 60 or 120 kHz"},
		{15, 15, Band{}, 0, "must be FR1 or FR2"},
	}
	for _, c := range cases {
		got, err := SelectTable(c.ssb, c.common, c.band)
		switch {
		case c.err == "" && (err != nil || got != c.want):
			t.Errorf("SelectTable(%d, %d, %+v) = %v, %v; want %v", c.ssb, c.common, c.band, got, err, c.want)
		case c.err != "" && (err == nil || !strings.Contains(err.Error(), c.err)):
			t.Errorf("SelectTable(%d, %d, %+v) = %v, %v; want an error with %q", c.ssb, c.common, c.band, got, err, c.err)
		}
	}
}

// The k_SSB rule of patterns 2 and 3: the rows written "−41 if k_SSB = 0,
// −42 if k_SSB > 0" (Tables 13-7, 13-10) and "−20 if k_SSB = 0, −21 if
// k_SSB > 0" (Table 13-8) move CORESET#0 one RB further up when the SS/PBCH
// block is shifted by any k_SSB > 0; every other row ignores k_SSB.
func TestKSSBRule(t *testing.T) {
	cases := []struct {
		table       Table
		index, kSSB int
		want        int
	}{
		{Table13_7, 8, 0, -41},   // TS 38.213 Table 13-7 index 8, k_SSB = 0
		{Table13_7, 8, 1, -42},   // k_SSB > 0
		{Table13_7, 10, 11, -42}, // index 10, the largest FR2 k_SSB
		{Table13_7, 9, 5, 49},    // index 9: one value for every k_SSB
		{Table13_8, 4, 0, -20},   // TS 38.213 Table 13-8 index 4
		{Table13_8, 6, 3, -21},   // index 6, k_SSB > 0
		{Table13_8, 5, 3, 24},    // index 5: one value
		{Table13_10, 4, 0, -41},  // TS 38.213 Table 13-10 index 4
		{Table13_10, 6, 7, -42},  // index 6, k_SSB > 0
		{Table13_1, 1, 23, 2},    // FR1 pattern 1 ignores k_SSB, up to 23
	}
	for _, c := range cases {
		cfg, err := Lookup(c.table, c.index, c.kSSB)
		if err != nil || cfg.OffsetRBs != c.want {
			t.Errorf("Lookup(%v, %d, k_SSB %d) = %+v, %v; want offset %d", c.table, c.index, c.kSSB, cfg, err, c.want)
		}
	}
	refused := []struct {
		table       Table
		index, kSSB int
		err         string
	}{
		{Table13_7, 8, 12, "must be 0 to 11"}, // TS 38.213 13: k_SSB 12–15 in FR2 say no CORESET#0
		{Table13_1, 0, 24, "must be 0 to 23"}, // k_SSB 24–31 in FR1 say no CORESET#0
		{Table13_1, 15, 0, "reserved in Table 13-1; it allows 0 to 14"},
		{Table13_9, 4, 0, "reserved in Table 13-9; it allows 0 to 3"},
		{Table13_4, 16, 0, "0 to 15"},
		{Table(0), 0, 0, "not one of TS 38.213 Tables"},
	}
	for _, c := range refused {
		if _, err := Lookup(c.table, c.index, c.kSSB); err == nil || !strings.Contains(err.Error(), c.err) {
			t.Errorf("Lookup(%v, %d, %d) error %v; want one with %q", c.table, c.index, c.kSSB, err, c.err)
		}
	}
}

// A 5 MHz channel at a 30 kHz common SCS admits no CORESET#0: every row of
// every FR1 table with a 30 kHz CORESET has at least 24 RBs, 24 × 12 × 30 kHz =
// 8.64 MHz, wider than the 5 MHz channel and than its 11 RBs at 30 kHz
// (TS 38.101-1 Table 5.3.2-1, 5 MHz at 30 kHz: N_RB = 11; from memory).
func TestNoCORESET0In5MHzAt30kHz(t *testing.T) {
	const channelHz, nRB5MHz30kHz = 5_000_000, 11
	checked := 0
	for _, tb := range Tables() {
		if tb.FR() != FR1 || tb.PDCCHSCSkHz() != 30 {
			continue
		}
		for i, r := range tb.Rows() {
			if r.Reserved() {
				continue
			}
			cfg, err := Lookup(tb, i, 0)
			if err != nil {
				t.Fatal(err)
			}
			checked++
			if cfg.WidthHz() < 8_640_000 || cfg.WidthHz() <= channelHz || cfg.NumRBs <= nRB5MHz30kHz {
				t.Errorf("%v index %d: %d RBs, %d Hz would fit a 5 MHz channel at 30 kHz", tb, i, cfg.NumRBs, cfg.WidthHz())
			}
		}
	}
	// Tables 13-2 (14 rows), 13-4 (16), 13-4A (8), 13-6 (10).
	if checked != 48 {
		t.Errorf("checked %d rows, want 48", checked)
	}
	// The narrowest is 8.64 MHz exactly.
	if cfg, _ := Lookup(Table13_4, 0, 0); cfg.WidthHz() != 24*12*30_000 || cfg.WidthHz() != 8_640_000 {
		t.Errorf("Table 13-4 index 0 is %d Hz wide, want 8 640 000", cfg.WidthHz())
	}
}

// Spot rows of the occasion tables, read from the clause 13 text (O and M
// doubled).
func TestOccasionSpotRows(t *testing.T) {
	cases := []struct {
		fr    FR
		index int
		want  OccasionRow
	}{
		{FR1, 0, OccasionRow{0, 1, 2, 0, 0}},              // TS 38.213 Table 13-11 index 0: O 0, 1 set, M 1, symbol 0
		{FR1, 7, OccasionRow{14, 2, 1, 0, NSymbCORESET}},  // Table 13-11 index 7: O 7, 2 sets, M 1/2, {0 if i even, N_symb^CORESET if odd}
		{FR1, 9, OccasionRow{10, 1, 4, 0, 0}},             // Table 13-11 index 9: O 5, 1 set, M 2, symbol 0
		{FR1, 15, OccasionRow{10, 1, 2, 2, 2}},            // Table 13-11 index 15: O 5, 1 set, M 1, symbol 2
		{FR2, 3, OccasionRow{5, 2, 1, 0, 7}},              // TS 38.213 Table 13-12 index 3: O 2.5, 2 sets, M 1/2, {0 if even, 7 if odd}
		{FR2, 11, OccasionRow{15, 2, 1, 0, NSymbCORESET}}, // Table 13-12 index 11: O 7.5, 2 sets, M 1/2, {0, N_symb^CORESET}
		{FR2, 13, OccasionRow{10, 1, 4, 0, 0}},            // Table 13-12 index 13: O 5, 1 set, M 2, symbol 0
		{FR2, 14, OccasionRow{}},                          // Table 13-12 index 14: reserved
	}
	for _, c := range cases {
		if got := OccasionRows(c.fr)[c.index]; got != c.want {
			t.Errorf("%v searchSpaceZero %d = %+v, want %+v", c.fr, c.index, got, c.want)
		}
	}
}
