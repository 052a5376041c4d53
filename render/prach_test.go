package render

import (
	"fmt"
	"strings"
	"testing"

	"gridloom/grid"
)

const prachDDDSU = "../testdata/prach/dddsu.yaml"

// prachPlan loads the DDDSU plan with a 10 ms span, so that subframe 9,
// where its occasions are, is in the figure.
func prachPlan(t testing.TB) grid.Plan {
	p := loadPlan(t, prachDDDSU)
	p.SpanMs = 10
	return p
}

// TestFigureGoldenPRACH keeps the golden figure of a plan with PRACH
// occasions; it does not hang on the demo plans.
func TestFigureGoldenPRACH(t *testing.T) {
	r := compute(t, prachPlan(t))
	checkGolden(t, "prach-dddsu.svg", figure(t, r, Options{}))
}

// TestPRACHDDDSU checks the occasions where TS 38.211 puts them. Index 160
// of Table 6.3.3.2-3 (FR1, unpaired) is format B4, x = 1, y = 0, subframe
// 9, starting symbol 2, one PRACH slot in the subframe (the row as
// testdata/reference/prach/oai_prach_config.tsv has it): at 30 kHz that is the
// second slot of subframe 9 (TS 38.211 5.3.2), slot 19, symbol 2, which
// starts 9.5 ms plus two 30 kHz symbols (the first with the 16κ longer
// prefix, TS 38.211 5.3.1) after the frame: 18677760 + 71168 + 70144 =
// 18819072 Tc. msg1-FDM 2 puts two occasions side by side.
func TestPRACHDDDSU(t *testing.T) {
	r := compute(t, prachPlan(t))
	if r.PRACH == nil {
		t.Fatalf("no PRACH; findings %v", r.Findings)
	}
	root := parseSVG(t, figure(t, r, Options{}))
	gs := root.all(byClass("gl-prach"))
	if len(gs) != 1 {
		t.Fatalf("%d gl-prach groups, want 1", len(gs))
	}
	a := gs[0].attr
	if a["data-index"] != "160" || a["data-format"] != "B4" {
		t.Errorf("index %q format %q, want 160 and B4", a["data-index"], a["data-format"])
	}
	starts := strings.Fields(a["data-occ-start-tc"])
	if len(starts) < 2 || starts[0] != "18819072" || starts[1] != "18819072" {
		t.Fatalf("occasion starts %v; want two at 18819072 Tc (slot 19 symbol 2 at 30 kHz, msg1-FDM 2)", starts)
	}
	valid := strings.Fields(a["data-occ-valid"])
	if len(valid) != len(starts) || len(strings.Fields(a["data-occ-ssb"])) != len(starts) ||
		len(strings.Fields(a["data-occ-low-hz"])) != len(starts) {
		t.Errorf("readout lists of different lengths: %v", a)
	}
	// Each drawn rectangle holds occasions; each occasion in the span lies
	// in a rectangle of its validity.
	f := plotFrame(r, DefaultWidth)
	var ok, bad []box
	if e := gs[0].all(byClass("gl-prach-edge")); len(e) == 1 {
		ok = rectsOf(t, e[0].attr["d"])
	}
	if e := gs[0].all(byClass("gl-prach-bad")); len(e) == 1 {
		bad = rectsOf(t, e[0].attr["d"])
	}
	n := 0
	for _, o := range r.PRACH.Occasions {
		if o.Start >= f.span {
			continue
		}
		n++
		rs := ok
		if !o.Valid {
			rs = bad
		}
		found := false
		for _, b := range rs {
			if b.x0 <= f.X(o.Start)+0.06 && f.X(o.End)-0.06 <= b.x1 && near(b.y0, f.Y(o.High), 0.06) && near(b.y1, f.Y(o.Low), 0.06) {
				found = true
			}
		}
		if !found {
			t.Errorf("occasion at %d–%d Tc, %d–%d Hz (valid %v) is not drawn", o.Start, o.End, o.Low, o.High, o.Valid)
		}
	}
	if n != len(starts) {
		t.Errorf("%d occasions in the span, the readout lists %d", n, len(starts))
	}
	if !strings.Contains(root.all(byClass("gl-key"))[0].allText(), "PRACH index 160, format B4 at 30 kHz") {
		t.Error("the key does not name the PRACH configuration")
	}
}

// TestPRACHLayer: the occasions come and go with the prach layer, and a
// plan without PRACH draws none.
func TestPRACHLayer(t *testing.T) {
	r := compute(t, prachPlan(t))
	for _, show := range []bool{true, false} {
		opt := Options{}
		if !show {
			opt.Layers = opt.Layers.Hide(LayerPRACH)
		}
		root := parseSVG(t, figure(t, r, opt))
		if got := len(root.all(byClass("gl-prach"))) > 0; got != show {
			t.Errorf("prach layer shown %v: occasions drawn %v", show, got)
		}
		if got := strings.Contains(root.all(byClass("gl-key"))[0].allText(), "PRACH index"); got != show {
			t.Errorf("prach layer shown %v: key row %v", show, got)
		}
	}
	// The plan's own span, the 2.5 ms TDD period, ends before subframe 9:
	// the key says where the first occasion is (18819072 Tc, see
	// TestPRACHDDDSU), 18819072 / 1966080 = 9.571875 ms.
	short := parseSVG(t, figure(t, compute(t, loadPlan(t, prachDDDSU)), Options{}))
	if key := short.all(byClass("gl-key"))[0].allText(); !strings.Contains(key, "no occasion in the span; the first starts at 9.571875 ms") {
		t.Errorf("the key of the 2.5 ms span says %q", key)
	}
	plain := parseSVG(t, figure(t, compute(t, loadPlan(t, "../grid/demo/campus.yaml")), Options{}))
	if len(plain.all(byClass("gl-prach"))) > 0 {
		t.Error("a plan without PRACH draws occasions")
	}
	if ls, err := ParseLayers("prach"); err != nil || !ls.Shows(LayerPRACH) || ls.Shows(LayerSSB) {
		t.Errorf(`ParseLayers("prach") = %v, %v`, ls, err)
	}
}

// TestPRACHHeaviest: the heaviest stress plan (FR2-1, 64 blocks, the
// TDD pattern with 2 uplink slots in 40, so most occasions are not valid)
// over the longest span, 10 ms, with the densest PRACH configuration for
// it — index 171 of Table 6.3.3.2-4 with msg1-FDM 8, 1120 occasions in
// 10 ms, found by trying all 256 rows — costs one group of at most three
// paths.
func TestPRACHHeaviest(t *testing.T) {
	p := loadPlan(t, "../testdata/stress/fr2-1-initial-access.yaml")
	p.SpanMs = grid.MaxSpanMs
	p.PRACH = &grid.PRACHPlan{ConfigurationIndex: 171, Msg1SubcarrierSpacing: 120, Msg1FDM: 8}
	r := compute(t, p)
	if r.PRACH == nil {
		t.Fatalf("no PRACH; findings %v", r.Findings)
	}
	for _, width := range []int{DefaultWidth, MaxWidth} {
		data := figure(t, r, Options{Width: width})
		root := parseSVG(t, data)
		g := root.all(byClass("gl-prach"))
		if len(g) != 1 || g[0].count() > 4 {
			t.Fatalf("width %d: %d groups of %d elements; want one group of at most three paths", width, len(g), g[0].count())
		}
		occ := len(strings.Fields(g[0].attr["data-occ-start-tc"]))
		off := parseSVG(t, figure(t, r, Options{Width: width, Layers: Layers{}.Hide(LayerPRACH)}))
		t.Logf("width %d: %d bytes, %d elements (%d with the prach layer off), %d occasions in the span",
			width, len(data), root.count(), off.count(), occ)
		if occ < 1000 {
			t.Errorf("width %d: only %d occasions in the span; the test wants a heavy plan", width, occ)
		}
		if len(data) > 600_000 {
			t.Errorf("width %d: %d bytes, want at most 600000", width, len(data))
		}
	}
}

// BenchmarkFigurePRACH measures what the prach layer costs in time and
// size: the DDDSU plan (4 occasions, 2 in its 10 ms span) and the heaviest
// PRACH plan of TestPRACHHeaviest (1120 occasions in 10 ms), each with the
// layer drawn and hidden, at the default and the widest figure. svg-bytes
// and elements are one figure's; the difference between "on" and "off" is
// the layer's cost. Reported, not asserted; TestPRACHHeaviest holds the
// budget (one group of at most three paths, 600 000 bytes).
func BenchmarkFigurePRACH(b *testing.B) {
	heavy := loadPlan(b, "../testdata/stress/fr2-1-initial-access.yaml")
	heavy.SpanMs = grid.MaxSpanMs
	heavy.PRACH = &grid.PRACHPlan{ConfigurationIndex: 171, Msg1SubcarrierSpacing: 120, Msg1FDM: 8}
	for _, c := range []struct {
		name string
		plan grid.Plan
	}{{"dddsu", prachPlan(b)}, {"heaviest", heavy}} {
		r := compute(b, c.plan)
		if r.PRACH == nil {
			b.Fatalf("%s: no PRACH; findings %v", c.name, r.Findings)
		}
		for _, width := range []int{DefaultWidth, MaxWidth} {
			for _, layer := range []string{"on", "off"} {
				opt := Options{Width: width}
				if layer == "off" {
					opt.Layers = Layers{}.Hide(LayerPRACH)
				}
				b.Run(fmt.Sprintf("%s/width=%d/prach=%s", c.name, width, layer), func(b *testing.B) {
					b.ReportAllocs()
					svg := drawLoop(b, Figure, r, opt)
					b.SetBytes(int64(len(svg)))
					b.ReportMetric(float64(len(svg)), "svg-bytes")
					b.ReportMetric(float64(parseSVG(b, svg).count()), "elements")
				})
			}
		}
	}
}
