package prach

import (
	"slices"
	"strings"
	"testing"
)

// tdd30 is a 30 kHz frame (μ = 1, 20 slots of 14 symbols) with the 2.5 ms
// pattern D D D S U repeated four times, S = 6 downlink, 4 flexible, 4
// uplink symbols; SS/PBCH blocks in symbols 2–5 and 8–11 of slots 0 and 1
// (the 30 kHz case C positions {2, 8} + 14n of TS 38.213 4.1). With
// withTDD false the cell gives no tdd-UL-DL-ConfigurationCommon.
func tdd30(withTDD bool) Layout {
	l := Layout{Mu: 1, SSB: make([]bool, 280)}
	if withTDD {
		l.Dir = make([]Direction, 280)
	}
	for slot := range 20 {
		for sym := range 14 {
			k := slot*14 + sym
			if l.Dir != nil {
				switch slot % 5 {
				case 0, 1, 2:
					l.Dir[k] = Downlink
				case 3:
					l.Dir[k] = []Direction{Downlink, Flexible, Uplink}[min(sym/6, 1)+btoi(sym >= 10)]
				case 4:
					l.Dir[k] = Uplink
				}
			}
			if slot < 2 && (sym >= 2 && sym <= 5 || sym >= 8 && sym <= 11) {
				l.SSB[k] = true
			}
		}
	}
	return l
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// handOccasion places a short-format occasion at symbol sym of slot slot at μ
// on the grid of TS 38.211 5.3.1, for rules that do not depend on the table row.
func handOccasion(f Format, mu, slot, sym, dur int) Occasion {
	k := slot*14 + sym
	return Occasion{Format: f, Mu: mu, Slot: slot, Symbol: sym, Duration: dur, Subframe: slot >> mu, Slot60: -1,
		StartTc: SymbolStartTc(mu, k), EndTc: SymbolStartTc(mu, k+dur)}
}

func checkValid(t *testing.T, name string, o Occasion, l Layout, want bool, reason string) {
	t.Helper()
	v, err := Valid(o, l)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if v.Valid != want || !strings.Contains(v.Reason, reason) {
		t.Errorf("%s: valid %v (%s); want %v with a reason containing %q", name, v.Valid, v.Reason, want, reason)
	}
}

func TestTDDLayoutShape(t *testing.T) {
	l := tdd30(true)
	got := ""
	for _, d := range l.Dir[3*14 : 4*14] {
		got += "DFU"[d : d+1]
	}
	if got != "DDDDDDFFFFUUUU" {
		t.Fatalf("special slot = %s, want DDDDDDFFFFUUUU", got)
	}
}

// TestValidity applies TS 38.213 8.1 to occasions of the tables and to
// occasions placed by hand in the special slot.
func TestValidity(t *testing.T) {
	l := tdd30(true)
	// Table 6.3.3.2-3 index 160 (B4) at 30 kHz: slot 19 = pattern slot 4, all uplink.
	occ := mustOccasions(t, FR1Unpaired, 160, 0, 1)
	checkValid(t, "index 160", occ[0], l, true, "within uplink symbols")
	// Index 158 (B4, subframe 7): slot 15 = pattern slot 0, downlink.
	occ = mustOccasions(t, FR1Unpaired, 158, 0, 1)
	checkValid(t, "index 158", occ[0], l, false, "overlaps a downlink symbol")

	// Special slot 3: downlink symbols 0–5, flexible 6–9, uplink 10–13.
	// A1 (N_gap = 2, TS 38.213 Table 8.1-2) from symbol 8: two symbols (6, 7)
	// after the last downlink symbol: valid. From symbol 7: one symbol: invalid.
	checkValid(t, "A1 at symbol 8", handOccasion(FormatA1, 1, 3, 8, 2), l, true, "at least N_gap")
	checkValid(t, "A1 at symbol 7", handOccasion(FormatA1, 1, 3, 7, 2), l, false, "less than N_gap = 2")
	// A1 at symbols 10–11: within uplink symbols.
	checkValid(t, "A1 at symbol 10", handOccasion(FormatA1, 1, 3, 10, 2), l, true, "within uplink")
	// B4 has N_gap = 0 (TS 38.213 8.1): right after the last downlink symbol is valid.
	checkValid(t, "B4 at symbol 6", handOccasion(FormatB4, 1, 3, 6, 12), l, true, "at least N_gap")
	if g := NGap(handOccasion(FormatB4, 1, 3, 6, 12)); g != 0 {
		t.Errorf("N_gap of B4 = %d, want 0", g)
	}
	checkValid(t, "C0 at symbol 6", handOccasion(FormatC0, 1, 3, 6, 2), l, false, "less than N_gap = 2")
	// A long format 0 occasion (μ = 0) in subframe 0 meets the SS/PBCH blocks
	// of the 30 kHz layout from its start (symbol 2 of slot 0 at 30 kHz).
	checkValid(t, "format 0 over the blocks", Occasion{Format: Format0, Slot60: -1, StartTc: 0, EndTc: TcPerSubframe},
		tdd30(false), false, "precedes an SS/PBCH block")
	// Blocks on a 15 kHz layout (symbols 2–5 and 8–11 of subframe 0) and a
	// 30 kHz C0 occasion at symbol 11 of slot 0: it starts at 11·70 144 + 1024
	// = 772 608 Tc, inside 15 kHz symbol 5 (702 464 to 842 752 Tc); the next
	// block symbol (8, from 1 124 352 Tc) lies past the 30 kHz slot's end at
	// 983 040 Tc.
	l15 := Layout{Mu: 0, SSB: make([]bool, 140)}
	for _, k := range []int{2, 3, 4, 5, 8, 9, 10, 11} {
		l15.SSB[k] = true
	}
	checkValid(t, "C0 inside a block", handOccasion(FormatC0, 1, 0, 11, 1), l15, false, "overlaps an SS/PBCH block")

	// Without tdd-UL-DL-ConfigurationCommon only the SS/PBCH blocks count.
	n := tdd30(false)
	// Slot 0, symbol 0: an SS/PBCH block follows in the same slot.
	checkValid(t, "before SSB", handOccasion(FormatA1, 1, 0, 0, 2), n, false, "precedes an SS/PBCH block")
	// Slot 1 symbol 13: one symbol after the block ending at symbol 11.
	checkValid(t, "one symbol after SSB", handOccasion(FormatC0, 1, 1, 13, 1), n, false, "less than N_gap")
	// Slot 2 symbol 0: two symbols (12, 13 of slot 1) after it: valid.
	checkValid(t, "two symbols after SSB", handOccasion(FormatA1, 1, 2, 0, 2), n, true, "at least N_gap")

	p := Layout{Mu: 0, SSB: make([]bool, 140), Paired: true}
	checkValid(t, "paired", handOccasion(FormatA1, 0, 0, 0, 2), p, true, "paired")
	if _, err := Valid(occ[0], Layout{Mu: 1, SSB: make([]bool, 10)}); err == nil {
		t.Error("a layout of 10 symbols gave no error")
	}
}

// TestAssociation works TS 38.213 8.1 and Table 8.1-1 on FDD (every
// occasion valid) and on the TDD frame above.
func TestAssociation(t *testing.T) {
	fdd := Layout{Mu: 0, SSB: make([]bool, 140), Paired: true}
	eight := []int{0, 1, 2, 3, 4, 5, 6, 7}
	// Table 6.3.3.2-2 index 16: x = 1, one occasion per frame. Eight blocks at
	// N = 1 need 8 occasions: association period 8 frames (Table 8.1-1, 10 ms:
	// {1, 2, 4, 8, 16}); block k in frame k.
	a, err := Associate(FR1Paired, 16, 0, 1, eight, SSBPerRO{1, 1}, fdd)
	if err != nil {
		t.Fatal(err)
	}
	if a.Periods != 8 || a.Cycles != 1 || len(a.ROs) != 8 {
		t.Fatalf("index 16, 8 blocks, N = 1: %d periods, %d cycles, %d ROs; want 8, 1, 8", a.Periods, a.Cycles, len(a.ROs))
	}
	for k, r := range a.ROs {
		if r.SFN != k || !slices.Equal(r.SSBs, []int{k}) || r.StartTc != int64(k)*19660800+1966080 {
			t.Errorf("RO %d: SFN %d, blocks %v, start %d; want SFN %d, [%d], %d", k, r.SFN, r.SSBs, r.StartTc, k, k, int64(k)*19660800+1966080)
		}
	}
	// N = 1/2: each block on 2 occasions, 16 needed: 16 frames.
	a, _ = Associate(FR1Paired, 16, 0, 1, eight, SSBPerRO{1, 2}, fdd)
	if a.Periods != 16 {
		t.Errorf("N = 1/2: %d periods, want 16", a.Periods)
	}
	// msg1-FDM = 2: two occasions per frame, 4 frames; frequency first.
	a, _ = Associate(FR1Paired, 16, 0, 2, eight, SSBPerRO{1, 1}, fdd)
	if a.Periods != 4 || a.ROs[1].FDM != 1 || a.ROs[1].SFN != 0 || a.ROs[1].SSBs[0] != 1 || a.ROs[2].SFN != 1 || a.ROs[2].SSBs[0] != 2 {
		t.Errorf("msg1-FDM 2: %d periods, ROs %+v", a.Periods, a.ROs[:3])
	}
	// Index 0: x = 16, a 160 ms period allows only 1: 8 blocks do not fit one occasion.
	if _, err := Associate(FR1Paired, 0, 0, 1, eight, SSBPerRO{1, 1}, fdd); err == nil || !strings.Contains(err.Error(), "Table 8.1-1") {
		t.Errorf("index 0 with 8 blocks: error %v, want one naming Table 8.1-1", err)
	}
	// Index 27: ten occasions per frame. Four blocks at N = 1/2 need 8: one
	// period, one cycle; occasions 8 and 9 get no block.
	a, _ = Associate(FR1Paired, 27, 0, 1, []int{0, 1, 2, 3}, SSBPerRO{1, 2}, fdd)
	want := [][]int{{0}, {0}, {1}, {1}, {2}, {2}, {3}, {3}, nil, nil}
	if a.Periods != 1 || a.Cycles != 1 || len(a.ROs) != 10 {
		t.Fatalf("index 27, N = 1/2: %d periods, %d cycles, %d ROs; want 1, 1, 10", a.Periods, a.Cycles, len(a.ROs))
	}
	for i, r := range a.ROs {
		if !slices.Equal(r.SSBs, want[i]) {
			t.Errorf("index 27, N = 1/2, RO %d: blocks %v, want %v", i, r.SSBs, want[i])
		}
	}
	// N = 2: two blocks per occasion, five whole cycles.
	a, _ = Associate(FR1Paired, 27, 0, 1, []int{0, 1, 2, 3}, SSBPerRO{2, 1}, fdd)
	if a.Cycles != 5 || !slices.Equal(a.ROs[0].SSBs, []int{0, 1}) || !slices.Equal(a.ROs[3].SSBs, []int{2, 3}) {
		t.Errorf("index 27, N = 2: %d cycles, RO 0 %v, RO 3 %v; want 5, [0 1], [2 3]", a.Cycles, a.ROs[0].SSBs, a.ROs[3].SSBs)
	}
	// TDD: Table 6.3.3.2-3 index 158 (subframe 7) is invalid on the frame
	// above; index 160 (subframe 9) is valid once a frame: four blocks need
	// four frames.
	if _, err := Associate(FR1Unpaired, 158, 1, 1, []int{0}, SSBPerRO{1, 1}, tdd30(true)); err == nil {
		t.Error("index 158 on the TDD frame: no error, but it has no valid occasion")
	}
	a, err = Associate(FR1Unpaired, 160, 1, 1, []int{0, 1, 2, 3}, SSBPerRO{1, 1}, tdd30(true))
	if err != nil || a.Periods != 4 || len(a.ROs) != 4 || a.ROs[3].SFN != 3 {
		t.Errorf("index 160 on the TDD frame: %+v, %v; want 4 periods, 4 ROs", a, err)
	}
	for _, bad := range []SSBPerRO{{3, 1}, {1, 16}, {2, 2}} {
		if _, err := Associate(FR1Paired, 27, 0, 1, eight, bad, fdd); err == nil {
			t.Errorf("ssb-perRACH-Occasion %v gave no error", bad)
		}
	}
	if _, err := Associate(FR1Paired, 27, 0, 3, eight, SSBPerRO{1, 1}, fdd); err == nil {
		t.Error("msg1-FDM 3 gave no error")
	}
}
