package render

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"gridloom/grid"
)

// The two plans of a comparison: one numerology against two, over spans of
// 1 and 2 ms, with one and two SCS-specific carriers.
const (
	comparePlanA = "../testdata/compare/one-numerology.yaml"
	comparePlanB = "../testdata/compare/two-numerologies.yaml"
)

// plotOf returns the gl-plot group of a figure.
func plotOf(t *testing.T, root *node) *node {
	t.Helper()
	plots := root.all(func(n *node) bool { return strings.HasSuffix(n.attr["id"], "gl-plot") })
	if len(plots) != 1 {
		t.Fatalf("%d plot groups, want 1", len(plots))
	}
	return plots[0]
}

// TestFitWindowIsTheDefault: the zero Window and the fitted one draw the
// same figure, for every demo plan.
func TestFitWindowIsTheDefault(t *testing.T) {
	for _, path := range append(demoPlans(t), comparePlanA, comparePlanB) {
		r := compute(t, loadPlan(t, path))
		if got, want := figure(t, r, Options{Window: FitWindow(r)}), figure(t, r, Options{}); !bytes.Equal(got, want) {
			t.Errorf("%s: the figure in FitWindow differs from the default figure:\n%s", planName(path), lineDiff(got, want, 3))
		}
	}
}

// TestSharedWindow draws both plans of a comparison in the union of their
// windows: the plots publish one geometry, so they share their scales.
func TestSharedWindow(t *testing.T) {
	ra, rb := compute(t, loadPlan(t, comparePlanA)), compute(t, loadPlan(t, comparePlanB))
	win := FitWindow(ra).Union(FitWindow(rb))
	if win.Span != 2*grid.TcPerSubframe || win.Rails != 2 {
		t.Fatalf("union window %+v, want 2 ms and 2 rails", win)
	}
	pa := plotOf(t, parseSVG(t, figure(t, ra, Options{Window: win})))
	pb := plotOf(t, parseSVG(t, figure(t, rb, Options{Window: win})))
	for _, key := range []string{"data-x", "data-y", "data-w", "data-h", "data-span-tc", "data-low-hz", "data-high-hz"} {
		if pa.attr[key] != pb.attr[key] {
			t.Errorf("%s: %q in A, %q in B; want one window", key, pa.attr[key], pb.attr[key])
		}
	}
	// Fitted alone, the plots differ: the test sees a difference when there is one.
	fa := plotOf(t, parseSVG(t, figure(t, ra, Options{})))
	if fa.attr["data-w"] == pb.attr["data-w"] || fa.attr["data-span-tc"] == pb.attr["data-span-tc"] {
		t.Errorf("plan A fitted alone has the shared geometry %v; the plans do not test the window", fa.attr)
	}
}

// TestPastTheSpan: plan A's 1 ms in a 2 ms window ends at the middle of the
// plot; the rest is marked as past its span, and the key says so.
func TestPastTheSpan(t *testing.T) {
	ra, rb := compute(t, loadPlan(t, comparePlanA)), compute(t, loadPlan(t, comparePlanB))
	win := FitWindow(ra).Union(FitWindow(rb))
	root := parseSVG(t, figure(t, ra, Options{Window: win}))
	plot := plotOf(t, root)
	x, w := float64(attrInt(t, plot, "data-x")), float64(attrInt(t, plot, "data-w"))
	mid := x + w/2
	past := root.all(byClass("gl-past"))
	if len(past) != 1 {
		t.Fatalf("%d gl-past shapes, want 1", len(past))
	}
	if x1, _, x2, _ := rectOf(t, past[0].attr["d"]); !near(x1, mid, 0.1) || !near(x2, x+w, 0.1) {
		t.Errorf("the past-span area runs from %g to %g, want %g to %g", x1, x2, mid, x+w)
	}
	for _, body := range root.all(byClass("gl-body")) {
		if _, _, x2, _ := rectOf(t, body.attr["d"]); !near(x2, mid, 0.1) {
			t.Errorf("a partition body ends at %g, want the end of the plan's span at %g", x2, mid)
		}
	}
	for _, align := range root.all(byClass("gl-align")) {
		for _, s := range segments(t, align.attr["d"]) {
			if s.x > mid+0.1 {
				t.Errorf("a 0.5 ms mark at %g, past the plan's span at %g", s.x, mid)
			}
		}
	}
	if !strings.Contains(root.allText(), "end of this plan's 1 ms span") || !strings.Contains(root.allText(), "past the plan's span") {
		t.Error("the figure does not say where the plan's span ends")
	}
	// Plan B fills the window: nothing is past its span.
	if n := len(parseSVG(t, figure(t, rb, Options{Window: win})).all(byClass("gl-past"))); n != 0 {
		t.Errorf("plan B has %d gl-past shapes in its own span", n)
	}
}

// TestAbsoluteWindow aligns two absolute plans on absolute frequency: each
// window is the union shifted to the plan's own point A, and the plots
// publish point A so a script can check the alignment.
func TestAbsoluteWindow(t *testing.T) {
	campus := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	moved := loadPlan(t, "../grid/demo/campus.yaml")
	c := 3760.0
	moved.Carrier.CenterMHz = &c
	rm := compute(t, moved)
	pa, pb := campus.Channel.PointAHz, rm.Channel.PointAHz
	abs := FitWindow(campus).Shift(pa).Union(FitWindow(rm).Shift(pb))
	ga := plotOf(t, parseSVG(t, figure(t, campus, Options{Window: abs.Shift(-pa)})))
	gb := plotOf(t, parseSVG(t, figure(t, rm, Options{Window: abs.Shift(-pb)})))
	for _, g := range []*node{ga, gb} {
		if lo := attrInt(t, g, "data-low-hz") + attrInt(t, g, "data-point-a-hz"); lo != int64(abs.Low) {
			t.Errorf("plot starts at %d Hz absolute, want %d", lo, abs.Low)
		}
		if hi := attrInt(t, g, "data-high-hz") + attrInt(t, g, "data-point-a-hz"); hi != int64(abs.High) {
			t.Errorf("plot ends at %d Hz absolute, want %d", hi, abs.High)
		}
	}
	if ga.attr["data-low-hz"] == gb.attr["data-low-hz"] {
		t.Error("the two plans' windows from point A agree; the test cannot tell absolute alignment from relative")
	}
}

// TestFromPointA labels an absolute channel from point A on request.
func TestFromPointA(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	abs := parseSVG(t, figure(t, r, Options{})).allText()
	rel := parseSVG(t, figure(t, r, Options{FromPointA: true})).allText()
	if !strings.Contains(abs, "frequency (MHz)") || !strings.Contains(abs, "channel edge 3770 MHz") {
		t.Errorf("the absolute figure is not labelled in absolute frequency")
	}
	if !strings.Contains(rel, "frequency from point A (MHz)") || !strings.Contains(rel, "MHz from A") || strings.Contains(rel, "3770") {
		t.Errorf("with FromPointA the figure still names absolute frequencies")
	}
}

func TestWindowRefused(t *testing.T) {
	r := compute(t, loadPlan(t, comparePlanB))
	fit := FitWindow(r)
	for _, c := range []struct {
		what string
		win  Window
		want string
	}{
		{"too short", Window{Span: grid.TcPerSubframe}, "shorter than the plan's 2 ms"},
		{"too long", Window{Span: 11 * grid.TcPerSubframe}, "up to 10 ms"},
		{"negative", Window{Span: -1}, "up to 10 ms"},
		{"upside down", Window{Low: fit.High, High: fit.Low}, "Low must be below High"},
		{"too narrow", Window{Low: fit.Low + 5_000_000, High: fit.High}, "do not hold the plan's"},
		{"too many rails", Window{Rails: 9}, "0 to 8"},
	} {
		err := Figure(&bytes.Buffer{}, r, Options{Window: c.win})
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %v, want an error saying %q", c.what, err, c.want)
		}
	}
}

// TestIDPrefix: every id carries the prefix, and every reference names an
// id of the document, so two figures inlined in one page do not clash.
func TestIDPrefix(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	plain := figure(t, r, Options{Plan: []byte("name: x\n")})
	data := figure(t, r, Options{IDPrefix: "s2-", Plan: []byte("name: x\n")})
	root := parseSVG(t, data)
	ids := map[string]bool{}
	root.walk(func(n *node) {
		if id := n.attr["id"]; id != "" {
			if !strings.HasPrefix(id, "s2-gl-") {
				t.Errorf("<%s id=%q> has no prefix", n.name, id)
			}
			ids[id] = true
		}
	})
	if len(ids) < 5 || !ids["s2-gl-plot"] || !ids["s2-gl-meta"] || !ids["s2-gl-fill-0"] {
		t.Errorf("ids %v, want the plot, the metadata and the patterns prefixed", ids)
	}
	refs := regexp.MustCompile(`url\(#([^)]+)\)`).FindAllSubmatch(data, -1)
	if len(refs) == 0 {
		t.Fatal("no pattern references")
	}
	for _, m := range refs {
		if !ids[string(m[1])] {
			t.Errorf("url(#%s) names no id of the figure", m[1])
		}
	}
	for _, key := range []string{"aria-labelledby", "aria-describedby"} {
		if !ids[root.attr[key]] {
			t.Errorf("%s=%q names no id", key, root.attr[key])
		}
	}
	// Only the ids change, and the plan still reads back.
	if got := strings.ReplaceAll(string(data), "s2-gl-", "gl-"); got != string(plain) {
		t.Errorf("the prefixed figure differs from the plain one beyond its ids:\n%s", lineDiff([]byte(got), plain, 3))
	}
	if p, err := PlanFromSVG(data); err != nil || string(p) != "name: x\n" {
		t.Errorf("PlanFromSVG of the prefixed figure: %q, %v", p, err)
	}
	for _, bad := range []string{"2a", "A-", "a b", `a"`, "a_b", strings.Repeat("a", MaxIDPrefix+1)} {
		if err := Figure(&bytes.Buffer{}, r, Options{IDPrefix: bad}); err == nil || !strings.Contains(err.Error(), "id prefix") {
			t.Errorf("IDPrefix %q: %v, want an error naming the id prefix", bad, err)
		}
	}
}

// TestCompareGolden fixes the figure of a plan set beside another for a
// document: plan A in the window it shares with plan B, in the print
// theme, with a caption. It shows the reserved rail and the stretch past
// A's span. Run "go test ./render -update" after a deliberate change.
func TestCompareGolden(t *testing.T) {
	ra, rb := compute(t, loadPlan(t, comparePlanA)), compute(t, loadPlan(t, comparePlanB))
	got := figure(t, ra, Options{Theme: ThemePrint, Window: FitWindow(ra).Union(FitWindow(rb)),
		Caption: "Figure 2a. One 30 kHz partition, on the scales of the 15 + 60 kHz split beside it."})
	checkGolden(t, "print-compare-a.svg", got)
}
