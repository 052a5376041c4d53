package render

import (
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
)

// TestSSBCampus checks the blocks of the campus plan where the standard
// puts them. Case C at 30 kHz on unpaired spectrum above 1.88 GHz (the
// carrier is at 3750 MHz) has candidates starting at symbols {2, 8} + 14n,
// n = 0…3 (TS 38.213 4.1); the bitmap 11110000 sends the first four, at
// symbols 2, 8, 16 and 22 of the first half frame, 4 symbols each
// (TS 38.211 7.4.3.1). In frequency the plan gives GSCN 8016, SS_REF
// 3000 + 517·1.44 = 3744.48 MHz, which is 13.92 MHz above point A
// (3730.56 MHz); the block's subcarrier 0 sits 120 subcarriers of 30 kHz
// lower, 10.32 MHz above point A: offsetToPointA = 56 RBs of 15 kHz with
// k_SSB = 16 (TS 38.211 7.4.3.1, FR1 units), and it spans 240 subcarriers of 30 kHz;
// the edges are drawn at the outer subcarrier edges, half a subcarrier
// beyond the centres.
func TestSSBCampus(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	f := plotFrame(r, DefaultWidth)
	root := parseSVG(t, figure(t, r, Options{}))
	rs := pathRects(t, root, "gl-ssb")
	n := grid.Numerology{Mu: 1}
	first := []int{2, 8, 16, 22}
	if len(rs) != len(first) {
		t.Fatalf("%d blocks drawn, want %d", len(rs), len(first))
	}
	scs := grid.Hz(30_000)
	low := grid.Hz(56*12*15_000+16*15_000) - scs/2
	high := low + 240*scs
	for k, sym := range first {
		start, end := n.SymbolAt(sym).Start, n.SymbolAt(sym+3).End()
		b := rs[k]
		if !near(b.x0, f.X(start), 0.06) || !near(b.x1, f.X(end), 0.06) || !near(b.y0, f.Y(high), 0.06) || !near(b.y1, f.Y(low), 0.06) {
			t.Errorf("block %d at x %v–%v, y %v–%v; want x %.2f–%.2f (symbols %d–%d), y %.2f–%.2f (%d–%d Hz from point A)",
				k, b.x0, b.x1, b.y0, b.y1, f.X(start), f.X(end), sym, sym+3, f.Y(high), f.Y(low), low, high)
		}
	}
	labels := root.all(byClass("gl-ssb-label"))
	if len(labels) != 1 || labels[0].allText() != "SSB 0–3" {
		t.Errorf("labels %v, want one reading SSB 0–3", labels)
	}
	key := root.all(byClass("gl-key"))[0].allText()
	if !strings.Contains(key, "SS/PBCH block, case C at 30 kHz: candidates 0–3 of 8 shown, every 20 ms") {
		t.Errorf("the key does not describe the blocks: %q", key)
	}
}

// TestSSBStadium: case D at 120 kHz has candidates at symbols
// {4, 8, 16, 20} + 28n for n = 0–3, 5–8, 10–13, 15–18 (TS 38.213 4.1),
// 64 in all. The 2 ms span holds 224 symbols, so n = 0–3 and 5–7 start
// in it: 28 blocks, candidates 0–27, drawn as 28 rectangles (blocks 4–7
// and 8–11 of each pair touch but stay apart) under two labels.
func TestSSBStadium(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/stadium.yaml"))
	root := parseSVG(t, figure(t, r, Options{}))
	if rs := pathRects(t, root, "gl-ssb"); len(rs) != 28 {
		t.Errorf("%d blocks drawn, want 28", len(rs))
	}
	var labels []string
	for _, n := range root.all(byClass("gl-ssb-label")) {
		labels = append(labels, n.allText())
	}
	if !slices.Equal(labels, []string{"SSB 0–15", "SSB 16–27"}) {
		t.Errorf("labels %q, want SSB 0–15 and SSB 16–27", labels)
	}
	if key := root.all(byClass("gl-key"))[0].allText(); !strings.Contains(key, "case D at 120 kHz: candidates 0–27 of 64 shown") {
		t.Errorf("the key does not describe the blocks: %q", key)
	}
}

// TestSSBAbovePartitions: the blocks come after every partition in paint
// order, so no partition fill hides them.
func TestSSBAbovePartitions(t *testing.T) {
	for _, path := range demoPlans(t) {
		r := compute(t, loadPlan(t, path))
		if r.SSB == nil {
			continue
		}
		root := parseSVG(t, figure(t, r, Options{}))
		order := root.all(func(n *node) bool { return n.attr["class"] == "gl-part" || n.attr["class"] == "gl-ssb" })
		if len(order) == 0 || order[len(order)-1].attr["class"] != "gl-ssb" {
			t.Errorf("%s: the SS/PBCH path is not painted after the partitions", planName(path))
		}
		if n := len(root.all(byClass("gl-ssb"))); n != 1 {
			t.Errorf("%s: %d SS/PBCH paths, want one for all blocks", planName(path), n)
		}
	}
}

// TestSSBNarrow: 960 kHz blocks (case G, 64 candidates in 32 slots of
// 15.6 µs, TS 38.213 4.1) are 4.5 µs wide, under 1 px in a 10 ms figure;
// they are widened, the overlapping ones drawn as one, and the key says so.
// At the widest figure they are 2 px wide and drawn one by one.
func TestSSBNarrow(t *testing.T) {
	p := tddStress(t)
	p.TDD = nil
	p.SSB = &grid.SSBPlan{SCSKHz: 960, OffsetToPointA: 100, PeriodMs: 5}
	r := compute(t, p)
	if r.SSB == nil || r.SSB.Case != "G" || len(r.SSB.Blocks) != 128 {
		t.Fatalf("want 2 bursts of 64 case G blocks in 10 ms, got %+v", r.SSB)
	}
	for _, width := range []int{MinWidth, DefaultWidth} {
		root := parseSVG(t, figure(t, r, Options{Width: width}))
		rs := pathRects(t, root, "gl-ssb")
		for _, b := range rs {
			if b.x1-b.x0 < minStrip-0.11 {
				t.Errorf("width %d: a block %.2f px wide", width, b.x1-b.x0)
			}
		}
		if len(rs) >= len(r.SSB.Blocks) {
			t.Errorf("width %d: %d rectangles for %d blocks under 1 px apart", width, len(rs), len(r.SSB.Blocks))
		}
		key := root.all(byClass("gl-key"))[0].allText()
		if !strings.Contains(key, "blocks under 1 px apart drawn as one") {
			t.Errorf("width %d: the key does not say the blocks were merged: %q", width, key)
		}
		t.Logf("width %d: %d blocks in %d rectangles", width, len(r.SSB.Blocks), len(rs))
	}
	root := parseSVG(t, figure(t, r, Options{Width: MaxWidth}))
	if rs := pathRects(t, root, "gl-ssb"); len(rs) != len(r.SSB.Blocks) {
		t.Errorf("width %d: %d rectangles for %d blocks 2 px wide", MaxWidth, len(rs), len(r.SSB.Blocks))
	}
	if key := root.all(byClass("gl-key"))[0].allText(); strings.Contains(key, "drawn as one") || strings.Contains(key, "≥ 1 px") {
		t.Errorf("width %d: the key says blocks were simplified: %q", MaxWidth, key)
	}
}
