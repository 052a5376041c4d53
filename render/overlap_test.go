package render

import (
	"strings"
	"testing"

	"gridloom/grid"
)

// overlapPlan has two downlink partitions sharing CRBs 20–29 of 15 kHz
// (an error) and an uplink one sharing 40–44 with the second (a warning).
func overlapPlan() grid.Plan {
	start := func(v int) *int { return &v }
	return grid.Plan{Name: "overlaps", Carrier: grid.CarrierPlan{BandwidthMHz: 40}, Partitions: []grid.PartitionPlan{
		{Name: "a", SCSKHz: 15, StartCRB: start(0), SizePRB: 30},
		{Name: "b", SCSKHz: 15, StartCRB: start(20), SizePRB: 25},
		{Name: "c", SCSKHz: 15, StartCRB: start(40), SizePRB: 20, Direction: "UL"},
	}}
}

// TestOverlapOutlined: each band of grid.Result.Overlaps is outlined across
// the plan's span where the frame puts it — the error in the error ink,
// the downlink/uplink share dashed in the warning ink — the key explains
// both, and the overlap layer hides them; a plan without overlaps draws none.
func TestOverlapOutlined(t *testing.T) {
	r := compute(t, overlapPlan())
	if len(r.Overlaps) != 2 {
		t.Fatalf("overlaps %+v, want two", r.Overlaps)
	}
	f := plotFrame(r, DefaultWidth)
	root := parseSVG(t, figure(t, r, Options{}))
	for _, c := range []struct {
		class  string
		o      grid.Overlap
		stroke string
		dashed bool
	}{{"gl-overlap", r.Overlaps[0], "#b02a20", false}, {"gl-overlap-warn", r.Overlaps[1], "#9a5b00", true}} {
		paths := root.all(byClass(c.class))
		if len(paths) != 1 {
			t.Fatalf("%d %s paths, want 1", len(paths), c.class)
		}
		rs := rectsOf(t, paths[0].attr["d"])
		if len(rs) != 1 {
			t.Fatalf("%s: %d rectangles, want 1", c.class, len(rs))
		}
		b := rs[0]
		if !near(b.x0, float64(f.x), 0.06) || !near(b.x1, f.planRight(), 0.06) || !near(b.y0, f.Y(c.o.High), 0.06) || !near(b.y1, f.Y(c.o.Low), 0.06) {
			t.Errorf("%s at x %v–%v, y %v–%v; want x %d–%.1f, y %.1f–%.1f", c.class, b.x0, b.x1, b.y0, b.y1, f.x, f.planRight(), f.Y(c.o.High), f.Y(c.o.Low))
		}
		if got := paths[0].attr["stroke"]; !strings.EqualFold(got, c.stroke) {
			t.Errorf("%s stroke %q, want %s", c.class, got, c.stroke)
		}
		if got := paths[0].attr["stroke-dasharray"] != ""; got != c.dashed {
			t.Errorf("%s dashed %v, want %v", c.class, got, c.dashed)
		}
		if fill := paths[0].attr["fill"]; fill != "none" {
			t.Errorf("%s fill %q, want none: the outline must leave the hatching visible", c.class, fill)
		}
	}
	if g := root.all(byClass("gl-overlaps")); len(g) != 1 || g[0].attr["data-pairs"] != "0-1 1-2" {
		t.Errorf("overlap group %v, want data-pairs 0-1 1-2", g)
	}
	key := root.all(byClass("gl-key"))[0].allText()
	for _, want := range []string{"overlap: partitions of one direction share this band (error)", "shared by a downlink and an uplink partition"} {
		if !strings.Contains(key, want) {
			t.Errorf("the key does not say %q", want)
		}
	}
	hidden := parseSVG(t, figure(t, r, Options{Layers: Layers{}.Hide(LayerOverlap)}))
	if n := len(hidden.all(byClass("gl-overlaps"))); n != 0 || strings.Contains(hidden.all(byClass("gl-key"))[0].allText(), "overlap:") {
		t.Error("the overlap layer hidden still draws or explains the outlines")
	}
	printed := parseSVG(t, figure(t, r, Options{Theme: ThemePrint}))
	for _, p := range printed.all(byClass("gl-overlap")) {
		if s := p.attr["stroke"]; !strings.EqualFold(s, "#000000") && s != "#000" && s != "black" {
			t.Errorf("print theme outline stroke %q, want black", s)
		}
	}
	clean := parseSVG(t, figure(t, compute(t, loadPlan(t, "../grid/demo/campus.yaml")), Options{}))
	if n := len(clean.all(byClass("gl-overlaps"))); n != 0 {
		t.Errorf("the campus plan (no overlap) draws %d overlap groups", n)
	}
}

// TestOverlapPNGMatchesSVG: the PNG paints the outlines (solid and dashed,
// stroke only) as rsvg-convert paints the SVG, in both themes.
func TestOverlapPNGMatchesSVG(t *testing.T) {
	r := compute(t, overlapPlan())
	for _, theme := range []Theme{ThemeLight, ThemePrint} {
		t.Run(theme.String(), func(t *testing.T) {
			if v := comparePNGWithSVG(t, r, Options{Theme: theme}); !v.ok() {
				t.Errorf("FigurePNG and rsvg-convert differ: %v", v)
			}
		})
	}
}
