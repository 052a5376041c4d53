package coreset0

import (
	"strings"
	"testing"
)

// Pattern 1 occasions worked by hand with TS 38.213 13:
// n0 = (O·2^μ + ⌊i·M⌋) mod N_slot^frame,μ, SFN_C mod 2 = ⌊(O·2^μ + ⌊i·M⌋) /
// N_slot^frame,μ⌋ mod 2, N_slot^frame,μ = 10·2^μ (TS 38.211 Table 4.3.2-1).
func TestPattern1HandWorked(t *testing.T) {
	cases := []struct {
		name                            string
		fr                              FR
		ss0, mu, nSymb, i               int
		wantParity, wantSlot, wantFirst int
	}{
		// Table 13-11 index 4: O = 5, M = 1, first symbol 0. μ = 1, i = 3:
		// 5·2 + 3 = 13; 13 mod 20 = 13; ⌊13/20⌋ = 0, even frames.
		{"FR1 O=5 i=3", FR1, 4, 1, 2, 3, 0, 13, 0},
		// Table 13-11 index 6: O = 7, M = 1. μ = 1, i = 7: 14 + 7 = 21; 21 mod 20 = 1;
		// ⌊21/20⌋ = 1, odd frames.
		{"FR1 O=7 wraps to odd frame", FR1, 6, 1, 3, 7, 1, 1, 0},
		// Table 13-11 index 1: O = 0, two sets per slot, M = 1/2, first symbol 0 for even
		// i and N_symb^CORESET for odd. μ = 0, i = 5: 0 + ⌊2.5⌋ = 2; slot 2, even frames;
		// i odd, so symbol N_symb^CORESET = 2.
		{"FR1 M=1/2 odd i", FR1, 1, 0, 2, 5, 0, 2, 2},
		// Same row, i = 4: ⌊4 × 1/2⌋ = 2, the same slot; i even, symbol 0.
		{"FR1 M=1/2 even i", FR1, 1, 0, 2, 4, 0, 2, 0},
		// Table 13-11 index 9: O = 5, M = 2. μ = 0, i = 6: 5 + 12 = 17; 17 mod 10 = 7;
		// ⌊17/10⌋ = 1, odd frames.
		{"FR1 M=2", FR1, 9, 0, 1, 6, 1, 7, 0},
		// Table 13-11 index 11: O = 0, M = 1, first symbol 2. μ = 0, i = 0: slot 0, symbol 2.
		{"FR1 first symbol 2", FR1, 11, 0, 1, 0, 0, 0, 2},
		// Table 13-12 index 2: O = 2.5, M = 1. μ = 3, i = 63: 2.5·8 + 63 = 83;
		// 83 mod 80 = 3; ⌊83/80⌋ = 1, odd frames.
		{"FR2 O=2.5", FR2, 2, 3, 1, 63, 1, 3, 0},
		// Table 13-12 index 10: O = 7.5, M = 1/2, symbols {0, 7}. μ = 3, i = 39:
		// 60 + ⌊19.5⌋ = 79, the frame's last slot (n0 + 1 = 80 is slot 0 of the next
		// frame); even frames; i odd, symbol 7.
		{"FR2 last slot, symbol 7", FR2, 10, 3, 1, 39, 0, 79, 7},
		// Table 13-12 index 7: O = 2.5, M = 1/2, symbols {0, N_symb^CORESET}. μ = 2, i = 5:
		// 2.5·4 + ⌊2.5⌋ = 12; N_slot = 40; slot 12, even frames; symbol N_symb = 1.
		{"FR2 60 kHz", FR2, 7, 2, 1, 5, 0, 12, 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			o, err := Pattern1Occasion(c.fr, c.ss0, c.mu, c.nSymb, c.i)
			if err != nil {
				t.Fatal(err)
			}
			want := Occasion{SSBIndex: c.i, FrameParity: c.wantParity, Slot: c.wantSlot, NumSlots: 2, FirstSymbol: c.wantFirst, NumSymbols: c.nSymb}
			if o != want {
				t.Errorf("Pattern1Occasion(%v, %d, μ=%d, %d, i=%d) = %+v; want %+v", c.fr, c.ss0, c.mu, c.nSymb, c.i, o, want)
			}
		})
	}
}

func TestPattern1Refuses(t *testing.T) {
	cases := []struct {
		fr                FR
		ss0, mu, nSymb, i int
		err               string
	}{
		{FR2, 14, 3, 1, 0, "reserved in Table 13-12"}, // TS 38.213 Table 13-12 index 14
		{FR1, 0, 2, 1, 0, "must be 0 (15 kHz) or 1 (30 kHz)"},
		{FR2, 0, 1, 1, 0, "must be 2 (60 kHz) or 3 (120 kHz)"},
		{FR1, 0, 0, 1, 8, "must be 0 to 7"},
		{FR1, 16, 0, 1, 0, "0 to 15"},
		{FR1, 0, 0, 4, 0, "1 to 3 symbols"},
	}
	for _, c := range cases {
		if _, err := Pattern1Occasion(c.fr, c.ss0, c.mu, c.nSymb, c.i); err == nil || !strings.Contains(err.Error(), c.err) {
			t.Errorf("Pattern1Occasion(%v, %d, %d, %d, %d) error %v; want one with %q", c.fr, c.ss0, c.mu, c.nSymb, c.i, err, c.err)
		}
	}
}

// Every occasion of every pattern-1 row fits its slot and lands in the frame.
func TestPattern1AllRows(t *testing.T) {
	for _, fr := range []FR{FR1, FR2} {
		mus, maxI := []int{0, 1}, 7
		if fr == FR2 {
			mus, maxI = []int{2, 3}, 63
		}
		for ss0, r := range OccasionRows(fr) {
			for _, mu := range mus {
				for nSymb := 1; nSymb <= 3; nSymb++ {
					for i := 0; i <= maxI; i++ {
						o, err := Pattern1Occasion(fr, ss0, mu, nSymb, i)
						if r.Reserved() {
							if err == nil {
								t.Fatalf("%v searchSpaceZero %d is reserved but accepted", fr, ss0)
							}
							continue
						}
						if err != nil {
							t.Fatalf("%v ss0 %d μ %d N_symb %d i %d: %v", fr, ss0, mu, nSymb, i, err)
						}
						if o.Slot < 0 || o.Slot >= SlotsPerFrame(mu) || o.FirstSymbol+o.NumSymbols > 14 {
							t.Fatalf("%v ss0 %d μ %d i %d: %+v", fr, ss0, mu, i, o)
						}
					}
				}
			}
		}
	}
}

// Patterns 2 and 3, worked by hand: the SS/PBCH block's first symbol from
// TS 38.213 4.1 (case D, 120 kHz: {4, 8, 16, 20} + 28·n, n = 0–3, 5–8, 10–13,
// 15–18; case E, 240 kHz: {8, 12, 16, 20, 32, 36, 40, 44} + 56·n, n = 0–3,
// 5–8), the CORESET-SCS slot it overlaps, then Tables 13-13 to 13-15.
func TestPattern23HandWorked(t *testing.T) {
	cases := []struct {
		name                 string
		table                Table
		index, kSSB, half, i int
		wantSlot, wantFirst  int
		wantSymbols          int
	}{
		// Table 13-13 (120/60 kHz, Table 13-7 index 8: 1 symbol). i = 2: n = 0, first
		// symbol 16 at 120 kHz; a 60 kHz slot is 28 of them, ⌊16/28⌋ = 0; i = 4k+2:
		// symbol 6.
		{"13-13 i=2", Table13_7, 8, 0, 0, 2, 0, 6, 1},
		// i = 9: n = 2 (9 = 4·2 + 1), 8 + 56 = 64; ⌊64/28⌋ = 2; i = 4k+1: symbol 1.
		{"13-13 i=9", Table13_7, 9, 0, 0, 9, 2, 1, 1},
		// The same block in the second half frame: 20 slots of 60 kHz later, slot 22.
		{"13-13 i=9 second half frame", Table13_7, 9, 0, 1, 9, 22, 1, 1},
		// Table 13-14 (240/120 kHz, Table 13-10 index 4: 1 symbol). i = 4: first symbol
		// 32 at 240 kHz; a 120 kHz slot is 28 of them, n_SSB = 1; i = 8k+4: symbols 12
		// in slot n_SSB − 1 = 0.
		{"13-14 i=4", Table13_10, 4, 0, 0, 4, 0, 12, 1},
		// i = 13 = 8·1 + 5: n = 1, 36 + 56 = 92; ⌊92/28⌋ = 3; symbol 13 in slot 2.
		{"13-14 i=13", Table13_10, 6, 2, 0, 13, 2, 13, 1},
		// i = 6: 40; ⌊40/28⌋ = 1; i = 8k+6: symbol 0 in slot 1.
		{"13-14 i=6", Table13_10, 6, 0, 0, 6, 1, 0, 1},
		// Table 13-15 (120/120 kHz, Table 13-8 index 6: 2 symbols). i = 1: symbol 8,
		// slot 0; the CORESET shares the block's symbols (pattern 3): symbol 8.
		{"13-15 i=1", Table13_8, 6, 0, 0, 1, 0, 8, 2},
		// i = 2: 16 → slot 1, symbol 2 of it; table: symbol 2.
		{"13-15 i=2", Table13_8, 6, 0, 0, 2, 1, 2, 2},
		// i = 63 = 4·15 + 3: n = 15 + 3 = 18, 20 + 28·18 = 524; ⌊524/14⌋ = 37; symbol 6
		// (524 − 37·14 = 6, the block's own first symbol).
		{"13-15 i=63", Table13_8, 4, 5, 0, 63, 37, 6, 2},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			o, err := Pattern23Occasion(c.table, c.index, c.kSSB, 0, c.half, c.i)
			if err != nil {
				t.Fatal(err)
			}
			want := Occasion{SSBIndex: c.i, SameFrameAsSSB: true, Slot: c.wantSlot, NumSlots: 1, FirstSymbol: c.wantFirst, NumSymbols: c.wantSymbols}
			if o != want {
				t.Errorf("Pattern23Occasion(%v, %d, k_SSB %d, half %d, i=%d) = %+v; want %+v", c.table, c.index, c.kSSB, c.half, c.i, o, want)
			}
		})
	}
}

// In pattern 3 the CORESET shares the SS/PBCH block's symbols: for every
// index of case D, Table 13-15's first symbol is the block's own first
// symbol in its slot (TS 38.213 4.1 case D against Table 13-15).
func TestPattern3SharesSSBSymbols(t *testing.T) {
	for i := 0; i < 64; i++ {
		o, err := Pattern23Occasion(Table13_8, 4, 0, 0, 0, i)
		if err != nil {
			t.Fatal(err)
		}
		sym, _ := SSBFirstSymbol(120, i)
		if o.Slot != sym/14 || o.FirstSymbol != sym%14 {
			t.Errorf("i=%d: CORESET slot %d symbol %d, SS/PBCH block slot %d symbol %d", i, o.Slot, o.FirstSymbol, sym/14, sym%14)
		}
	}
}

func TestPattern23Refuses(t *testing.T) {
	cases := []struct {
		table               Table
		index, ss0, half, i int
		err                 string
	}{
		{Table13_7, 8, 1, 0, 0, "reserved in Table 13-13"},
		{Table13_7, 0, 0, 0, 0, "multiplexing pattern 1"},
		{Table13_4, 0, 0, 0, 0, "no rows of multiplexing pattern 2 or 3"},
		{Table13_8, 4, 0, 2, 0, "must be 0 or 1"},
		{Table13_8, 4, 0, 0, 64, "0 to 63"},
	}
	for _, c := range cases {
		if _, err := Pattern23Occasion(c.table, c.index, 0, c.ss0, c.half, c.i); err == nil || !strings.Contains(err.Error(), c.err) {
			t.Errorf("Pattern23Occasion(%v, %d, ss0 %d, half %d, i %d) error %v; want one with %q", c.table, c.index, c.ss0, c.half, c.i, err, c.err)
		}
	}
}

// TS 38.213 4.1: the first symbols of the first blocks of cases D and E.
func TestSSBFirstSymbol(t *testing.T) {
	cases := []struct{ scs, i, want int }{
		{120, 0, 4}, {120, 3, 20}, {120, 4, 32}, {120, 15, 84 + 20}, // n = 0, 1, 3
		{120, 16, 28*5 + 4}, // n = 5 after the gap at n = 4
		{240, 0, 8}, {240, 7, 44}, {240, 8, 64}, {240, 32, 56*5 + 8}, {240, 63, 56*8 + 44},
	}
	for _, c := range cases {
		if got, err := SSBFirstSymbol(c.scs, c.i); err != nil || got != c.want {
			t.Errorf("SSBFirstSymbol(%d, %d) = %d, %v; want %d", c.scs, c.i, got, err, c.want)
		}
	}
}
