package render

import (
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
)

// TestSyncRasterCampus checks the comb of the campus plan where the tables
// put it. Its 40 MHz channel centred on 3750 MHz runs from 3730 to 3770 MHz;
// the FR1 raster above 3000 MHz is SS_REF = 3000 MHz + N·1.44 MHz, GSCN =
// 7499 + N (TS 38.101-1 Table 5.4.3.1-1), so GSCN 8006 (3730.08 MHz) to
// 8033 (3768.96 MHz), all within n78's 30 kHz entries 7711 – <1> – 8051
// (Table 5.4.3.3-1): 28 ticks, each at its SS_REF from point A
// (3730.56 MHz). The block's GSCN 8016 (3744.48 MHz) gets the wedge.
func TestSyncRasterCampus(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	f := plotFrame(r, DefaultWidth)
	root := parseSVG(t, figure(t, r, Options{}))
	gs := root.all(byClass("gl-raster"))
	if len(gs) != 1 {
		t.Fatalf("%d gl-raster groups, want 1", len(gs))
	}
	g := gs[0]
	var ys []float64
	for _, class := range []string{"gl-raster-fit", "gl-raster-off"} {
		for _, p := range g.all(byClass(class)) {
			for _, s := range segments(t, p.attr["d"]) {
				if s.vertical || s.to != float64(f.x)-1 || float64(f.x)-1-s.x > rasterFitLen {
					t.Errorf("%s tick %+v does not hang from the plot's left edge at x %d", class, s, f.x)
				}
				ys = append(ys, s.y)
			}
		}
	}
	if len(ys) != 28 {
		t.Fatalf("%d raster ticks, want 28 (GSCN 8006 to 8033)", len(ys))
	}
	pointA := grid.Hz(3730560e3)
	for n := 507; n <= 534; n++ {
		want := f.Y(grid.Hz(3000e6) + grid.Hz(n)*1440e3 - pointA)
		found := false
		for _, y := range ys {
			found = found || near(y, want, 0.06)
		}
		if !found {
			t.Errorf("no tick for GSCN %d at y %.2f", 7499+n, want)
		}
	}
	attrs := g.attr
	if !strings.HasPrefix(attrs["data-gscn"], "8006 8007 ") || !strings.HasSuffix(attrs["data-gscn"], " 8033") ||
		attrs["data-band"] != "n78" || attrs["data-scs-khz"] != "30" || attrs["data-block-gscn"] != "8016" ||
		len(attrs["data-fits"]) != 28 || len(strings.Fields(attrs["data-ss-ref-hz"])) != 28 {
		t.Errorf("readout attributes %v", attrs)
	}
	// The wedge's tip: SS_REF 3744.48 MHz, 13.92 MHz above point A.
	wedge := g.all(byClass("gl-raster-block"))
	if len(wedge) != 1 {
		t.Fatalf("%d wedges, want 1", len(wedge))
	}
	m := tipRE.FindStringSubmatch(wedge[0].attr["d"])
	if m == nil {
		t.Fatalf("the wedge %q has no tip", wedge[0].attr["d"])
	}
	x, _ := strconv.ParseFloat(m[1], 64)
	y, _ := strconv.ParseFloat(m[2], 64)
	if x != float64(f.x) || !near(y, f.Y(13920e3), 0.06) {
		t.Errorf("the block's wedge points at (%v, %v); want (%d, %.2f)", x, y, f.x, f.Y(13920e3))
	}
	key := root.all(byClass("gl-key"))[0].allText()
	for _, want := range []string{"sync raster of n78 at 30 kHz: GSCN 8006–8033 (28)", "GSCN 8016: SS_REF 3744.48 MHz"} {
		if !strings.Contains(key, want) {
			t.Errorf("the key does not say %q: %q", want, key)
		}
	}
	desc := root.all(func(n *node) bool { return n.name == "desc" })[0].allText()
	if !strings.Contains(desc, "in band n78") || !strings.Contains(desc, "on GSCN 8016") {
		t.Errorf("the description names neither band nor GSCN: %q", desc)
	}
}

// tipRE reads the wedge's tip, the first point it draws a line to.
var tipRE = regexp.MustCompile(`L(-?[0-9.]+) (-?[0-9.]+)`)

// TestSyncRasterLayer: the comb and the axis spine that makes room for it
// come and go with the raster layer; without it the axis ticks touch the plot
// again.
func TestSyncRasterLayer(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	f := plotFrame(r, DefaultWidth)
	for _, show := range []bool{true, false} {
		opt := Options{}
		if !show {
			opt.Layers = opt.Layers.Hide(LayerRaster)
		}
		root := parseSVG(t, figure(t, r, opt))
		if got := len(root.all(byClass("gl-raster"))) == 1; got != show {
			t.Errorf("raster shown %v: gl-raster drawn %v", show, got)
		}
		axes := root.all(byClass("gl-axes"))[0]
		spine := false
		for _, p := range axes.all(func(n *node) bool { return n.name == "path" }) {
			for _, s := range segments(t, p.attr["d"]) {
				spine = spine || (s.vertical && s.x == float64(f.x-rasterStrip))
			}
		}
		if spine != show {
			t.Errorf("raster shown %v: axis spine drawn %v", show, spine)
		}
	}
	// A plan without a band has no raster to draw.
	p := loadPlan(t, "../grid/demo/campus.yaml")
	p.Carrier.CenterMHz, p.Carrier.Band, p.SSB = nil, "", nil
	if n := len(parseSVG(t, figure(t, compute(t, p), Options{})).all(byClass("gl-raster"))); n != 0 {
		t.Errorf("a channel without a frequency draws %d raster groups", n)
	}
}

// TestSyncRasterHeaviest: the heaviest plan's 2000 MHz channel holds the
// most raster points of any FR2 channel (17.28 MHz apart, TS 38.101-2 Table
// 5.4.3.1-1: at most 116); the comb adds one group of at most three paths
// whatever their count.
func TestSyncRasterHeaviest(t *testing.T) {
	r := compute(t, loadPlan(t, stressPlan))
	if r.SyncRaster == nil {
		t.Fatalf("the heaviest plan's channel (band %q) has no raster to draw; the plan must keep a band and a centre for this test to check anything", r.Channel.Band)
	}
	n := len(r.SyncRaster.Points)
	if n == 0 || n > 116 {
		t.Errorf("%d raster points in 2000 MHz; want 1 to 116", n)
	}
	on := parseSVG(t, figure(t, r, Options{}))
	off := parseSVG(t, figure(t, r, Options{Layers: Layers{}.Hide(LayerRaster)}))
	g := on.all(byClass("gl-raster"))
	if len(g) != 1 || g[0].count() > 4 {
		t.Fatalf("raster groups %d, elements %d; want one group of at most 3 paths", len(g), g[0].count())
	}
	ticks := 0
	for _, p := range g[0].all(func(n *node) bool { return n.name == "path" && n.attr["class"] != "gl-raster-block" }) {
		ticks += len(segments(t, p.attr["d"]))
	}
	if ticks != n {
		t.Errorf("%d ticks for %d raster points", ticks, n)
	}
	t.Logf("%d raster points in %s; %d elements with the raster, %d without", n, r.Channel.Band, on.count(), off.count())
	if d := on.count() - off.count(); d > 8 {
		t.Errorf("the raster adds %d elements to the heaviest figure; want at most 8 (a group, 3 paths, a key row)", d)
	}
}
