package render

import (
	"strings"
	"testing"

	"gridloom/grid"
)

const initialCampus = "../testdata/initial/campus.yaml"

// TestCoreset0Campus checks CORESET#0 and its occasions where TS 38.213
// puts them for the campus plan with initial access. The block is at
// offsetToPointA 56 (RBs of 15 kHz), so the 30 kHz CRB that overlaps its
// first RB is 28; controlResourceSetZero 2 of Table 13-4 is 24 RBs, 2
// symbols, offset 2: CRBs 26 to 49, from 26·360 − 15 kHz to 50·360 − 15 kHz
// above point A (outer subcarrier edges). searchSpaceZero 0 of Table 13-11
// is O = 0, M = 1, first symbol 0: block i is monitored in slots n0 = i and
// n0 + 1 of an even frame (TS 38.213 13), so blocks 0–3 use slots 0 to 4 of
// the 5 ms span, symbols 0 and 1 of each: five outlines, eight occasions.
func TestCoreset0Campus(t *testing.T) {
	r := compute(t, loadPlan(t, initialCampus))
	if r.InitialAccess == nil {
		t.Fatalf("no initial access; findings %v", r.Findings)
	}
	f := plotFrame(r, DefaultWidth)
	root := parseSVG(t, figure(t, r, Options{}))
	gs := root.all(byClass("gl-coreset0"))
	if len(gs) != 1 {
		t.Fatalf("%d gl-coreset0 groups, want 1", len(gs))
	}
	edges := gs[0].all(byClass("gl-coreset0-edge"))
	if len(edges) != 1 {
		t.Fatalf("%d outline paths, want 1", len(edges))
	}
	rs := rectsOf(t, edges[0].attr["d"])
	low, high := grid.Hz(26*360e3-15e3), grid.Hz(50*360e3-15e3)
	n := grid.Numerology{Mu: 1}
	if len(rs) != 5 {
		t.Fatalf("%d outlines, want 5 (slots 0 to 4)", len(rs))
	}
	for k, b := range rs {
		start, end := n.SymbolAt(14*k).Start, n.SymbolAt(14*k+1).End()
		if !near(b.x0, f.X(start), 0.06) || !near(b.x1, f.X(end), 0.06) || !near(b.y0, f.Y(high), 0.06) || !near(b.y1, f.Y(low), 0.06) {
			t.Errorf("outline %d at x %v–%v, y %v–%v; want x %.2f–%.2f (slot %d, symbols 0–1), y %.2f–%.2f",
				k, b.x0, b.x1, b.y0, b.y1, f.X(start), f.X(end), k, f.Y(high), f.Y(low))
		}
	}
	a := gs[0].attr
	if a["data-occ-ssb"] != "0 0 1 1 2 2 3 3" || a["data-start-crb"] != "26" || a["data-nrb"] != "24" || a["data-symbols"] != "2" ||
		len(strings.Fields(a["data-occ-start-tc"])) != 8 || len(strings.Fields(a["data-occ-end-tc"])) != 8 {
		t.Errorf("readout attributes %v", a)
	}
	dl := root.all(byClass("gl-initial-dl"))
	if len(dl) != 1 || dl[0].attr["data-start-crb"] != "26" || dl[0].attr["data-size-prb"] != "24" {
		t.Errorf("initial DL BWP bracket %v; want CRB 26, 24 PRBs (CORESET#0's extent, TS 38.213 12)", dl)
	}
	key := root.all(byClass("gl-key"))[0].allText()
	for _, want := range []string{"CORESET#0, 24 RBs × 2 symbols at 30 kHz: Type0-PDCCH occasions, SSB 0–3", "initial DL BWP, CRB 26–49 at 30 kHz"} {
		if !strings.Contains(key, want) {
			t.Errorf("the key does not say %q: %q", want, key)
		}
	}
	// No label runs into the blocks' labels or a partition's name.
	var placed []labelBox
	for _, class := range []string{"gl-ssb-label", "gl-coreset0-label", "gl-name"} {
		for _, l := range root.all(byClass(class)) {
			x, y := float64(attrInt(t, l, "x")), float64(attrInt(t, l, "y"))
			tl := label{runs: []run{{text: l.allText(), bold: class != "gl-coreset0-label"}}, size: 10}
			b := labelBox{x, y - 9, x + measure(&tl), y + 2}
			if b.hitsAny(placed) {
				t.Errorf("label %q (%s) at (%v, %v) overlaps another", l.allText(), class, x, y)
			}
			placed = append(placed, b)
		}
	}
	if len(root.all(byClass("gl-coreset0-label"))) == 0 {
		t.Error("no occasion is labelled")
	}
}

// TestCoreset0Layer: CORESET#0, its labels and the initial BWPs come and go
// with the coreset0 layer; a plan without initial access draws none of them.
func TestCoreset0Layer(t *testing.T) {
	r := compute(t, loadPlan(t, initialCampus))
	classes := []string{"gl-coreset0", "gl-coreset0-edge", "gl-coreset0-label", "gl-initial-dl", "gl-initial-ul"}
	for _, show := range []bool{true, false} {
		opt := Options{}
		if !show {
			opt.Layers = opt.Layers.Hide(LayerCoreset0)
		}
		root := parseSVG(t, figure(t, r, opt))
		for _, c := range classes {
			if got := len(root.all(byClass(c))) > 0; got != show {
				t.Errorf("coreset0 layer shown %v: %s drawn %v", show, c, got)
			}
		}
	}
	plain := parseSVG(t, figure(t, compute(t, loadPlan(t, "../grid/demo/campus.yaml")), Options{}))
	for _, c := range classes {
		if len(plain.all(byClass(c))) > 0 {
			t.Errorf("a plan without initial access draws %s", c)
		}
	}
}

// TestCoreset0Heaviest: the most occasions a plan can ask for (1024 in 20
// ms, testdata/stress) cost one group of two paths and a label per group
// of occasions, and the figure stays small.
func TestCoreset0Heaviest(t *testing.T) {
	r := compute(t, loadPlan(t, "../testdata/stress/fr2-1-initial-access.yaml"))
	if r.InitialAccess == nil {
		t.Fatalf("no initial access; findings %v", r.Findings)
	}
	for _, width := range []int{DefaultWidth, MaxWidth} {
		data := figure(t, r, Options{Width: width})
		root := parseSVG(t, data)
		g := root.all(byClass("gl-coreset0"))
		if len(g) != 1 || g[0].count() != 3 {
			t.Fatalf("width %d: %d groups; want one group of two paths", width, len(g))
		}
		off := parseSVG(t, figure(t, r, Options{Width: width, Layers: Layers{}.Hide(LayerCoreset0)}))
		t.Logf("width %d: %d bytes, %d elements (%d with the coreset0 layer off), %d occasions in the span",
			width, len(data), root.count(), off.count(), len(strings.Fields(g[0].attr["data-occ-ssb"])))
		if len(data) > 300_000 {
			t.Errorf("width %d: %d bytes, want at most 300000", width, len(data))
		}
		if labels := len(root.all(byClass("gl-coreset0-label"))); labels > 64 {
			t.Errorf("width %d: %d occasion labels", width, labels)
		}
	}
}
