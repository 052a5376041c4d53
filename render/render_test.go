package render

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gridloom/grid"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden/render")

const goldenDir = "../testdata/golden/render"

// TestFigureGolden compares each demo plan's figure, in the light theme
// and in the print theme, with its golden file. Run
// "go test ./render -update" after a deliberate change and review the diff.
func TestFigureGolden(t *testing.T) {
	for _, path := range demoPlans(t) {
		r := compute(t, loadPlan(t, path))
		for _, theme := range []Theme{ThemeLight, ThemePrint} {
			name := planName(path)
			if theme != ThemeLight {
				name = theme.String() + "-" + name
			}
			t.Run(name, func(t *testing.T) {
				checkGolden(t, name+".svg", figure(t, r, Options{Theme: theme}))
			})
		}
	}
}

// TestFigureGoldenInitial keeps the golden figure of the campus plan with
// initial access: CORESET#0, its occasions and the initial BWPs.
func TestFigureGoldenInitial(t *testing.T) {
	r := compute(t, loadPlan(t, initialCampus))
	checkGolden(t, "initial-campus.svg", figure(t, r, Options{}))
}

// checkGolden compares a figure with the golden file name in goldenDir,
// or with -update writes it there.
func checkGolden(t *testing.T, name string, got []byte) {
	t.Helper()
	golden := filepath.Join(goldenDir, name)
	if *update {
		if err := os.MkdirAll(goldenDir, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run go test ./render -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("the figure differs from %s (go test ./render -update rewrites it):\n%s", golden, lineDiff(got, want, 5))
	}
}

// lineDiff shows the first n lines that differ between got and want.
func lineDiff(got, want []byte, n int) string {
	g, w := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
	var b strings.Builder
	shown := 0
	for i := 0; i < max(len(g), len(w)) && shown < n; i++ {
		var gl, wl string
		if i < len(g) {
			gl = g[i]
		}
		if i < len(w) {
			wl = w[i]
		}
		if gl == wl {
			continue
		}
		fmt.Fprintf(&b, "line %d:\n  got:  %.200s\n  want: %.200s\n", i+1, gl, wl)
		shown++
	}
	fmt.Fprintf(&b, "(%d lines got, %d lines want)", len(g), len(w))
	return b.String()
}

// TestFigureWellFormed checks every demo plan and the heaviest plan: the
// document is well-formed XML with the root attributes the web page needs,
// and rsvg-convert renders it without a word on stderr.
func TestFigureWellFormed(t *testing.T) {
	for _, path := range append(demoPlans(t), stressPlan) {
		t.Run(planName(path), func(t *testing.T) {
			r := compute(t, loadPlan(t, path))
			data := figure(t, r, Options{})
			root := parseSVG(t, data)
			for _, key := range []string{"viewBox", "width", "height", "role", "aria-labelledby", "aria-describedby"} {
				if root.attr[key] == "" {
					t.Errorf("<svg> has no %s", key)
				}
			}
			if got := root.attr["xmlns"]; got != "http://www.w3.org/2000/svg" {
				t.Errorf("<svg xmlns=%q>, want the SVG namespace", got)
			}
			if root.attr["role"] != "img" {
				t.Errorf(`<svg role=%q>, want "img"`, root.attr["role"])
			}
			ids := map[string]*node{}
			root.walk(func(n *node) {
				if id := n.attr["id"]; id != "" {
					ids[id] = n
				}
			})
			if n := ids[root.attr["aria-labelledby"]]; n == nil || n.name != "title" || n.allText() != r.Plan.Name {
				t.Errorf("aria-labelledby=%q does not name a <title> holding the plan name %q", root.attr["aria-labelledby"], r.Plan.Name)
			}
			if n := ids[root.attr["aria-describedby"]]; n == nil || n.name != "desc" || strings.Contains(n.allText(), "\n") || n.allText() == "" {
				t.Errorf("aria-describedby=%q does not name a one-line <desc>", root.attr["aria-describedby"])
			}
			selfContained(t, root, data)

			if img := rsvgPNG(t, data); img.Bounds().Empty() {
				t.Error("rsvg-convert drew an empty image")
			}
		})
	}
}

// selfContained fails on anything that would fetch or run something: a
// script, a style sheet, an image, a foreign object or any URL reference
// other than to the document's own patterns.
func selfContained(t *testing.T, root *node, data []byte) {
	t.Helper()
	root.walk(func(n *node) {
		switch n.name {
		case "script", "style", "image", "foreignObject", "a", "use", "link":
			t.Errorf("figure contains <%s>", n.name)
		}
		for k, v := range n.attr {
			if strings.HasPrefix(strings.ToLower(k), "on") {
				t.Errorf("<%s> has event attribute %s", n.name, k)
			}
			if strings.Contains(v, "url(") && !strings.HasPrefix(v, "url(#") {
				t.Errorf("<%s %s=%q> refers outside the document", n.name, k, v)
			}
			if strings.HasSuffix(k, "href") {
				t.Errorf("<%s> has %s=%q", n.name, k, v)
			}
		}
		if ff := n.attr["font-family"]; ff != "" && ff != "sans-serif" {
			t.Errorf("font-family %q is not a generic family", ff)
		}
	})
	root.walk(func(n *node) {
		for k, v := range n.attr {
			if strings.Contains(v, "://") && k != "xmlns" && k != "xmlns:xlink" {
				t.Errorf("<%s %s=%q> refers outside the document", n.name, k, v)
			}
		}
	})
	if bytes.Contains(bytes.ToLower(data), []byte("@import")) {
		t.Errorf("figure imports a style sheet")
	}
}

// TestHoverContract reads the plot's published mapping back and checks it
// against what was drawn: each partition's body sits where its frequency
// edges map to, and each 0.5 ms mark where its instant maps to.
func TestHoverContract(t *testing.T) {
	for _, path := range append(demoPlans(t), stressPlan) {
		t.Run(planName(path), func(t *testing.T) {
			r := compute(t, loadPlan(t, path))
			root := parseSVG(t, figure(t, r, Options{}))
			plots := root.all(func(n *node) bool { return n.attr["id"] == "gl-plot" })
			if len(plots) != 1 || plots[0].name != "g" {
				t.Fatalf("want one <g id=gl-plot>, found %d", len(plots))
			}
			p := plots[0]
			x, y := float64(attrInt(t, p, "data-x")), float64(attrInt(t, p, "data-y"))
			w, h := float64(attrInt(t, p, "data-w")), float64(attrInt(t, p, "data-h"))
			span := attrInt(t, p, "data-span-tc")
			lo, hi := attrInt(t, p, "data-low-hz"), attrInt(t, p, "data-high-hz")
			if want := int64(r.Plan.SpanMs) * int64(grid.TcPerSubframe); span != want {
				t.Errorf("data-span-tc = %d, want %d (spanMs %d)", span, want, r.Plan.SpanMs)
			}
			if lo > int64(r.Channel.Low) || hi < int64(r.Channel.High) {
				t.Errorf("data-low-hz..data-high-hz = %d..%d does not hold the channel %d..%d", lo, hi, r.Channel.Low, r.Channel.High)
			}
			toX := func(tc grid.Tc) float64 { return x + float64(tc)*w/float64(span) }
			toY := func(hz grid.Hz) float64 { return y + h - float64(int64(hz)-lo)*h/float64(hi-lo) }

			parts := p.all(byClass("gl-part"))
			if len(parts) != len(r.Partitions) {
				t.Fatalf("%d gl-part groups, want %d", len(parts), len(r.Partitions))
			}
			for i, g := range parts {
				if got := attrInt(t, g, "data-index"); got != int64(i) {
					t.Errorf("gl-part %d has data-index %d", i, got)
				}
				bodies := g.all(byClass("gl-body"))
				if len(bodies) != 1 {
					t.Fatalf("gl-part %d has %d bodies", i, len(bodies))
				}
				x1, y1, x2, y2 := rectOf(t, bodies[0].attr["d"])
				l := r.Partitions[i]
				if !near(x1, toX(0), 0.06) || !near(x2, toX(grid.Tc(span)), 0.06) ||
					!near(y1, toY(l.High), 0.06) || !near(y2, toY(l.Low), 0.06) {
					t.Errorf("partition %d (%s, %d..%d Hz) drawn at x %v..%v, y %v..%v; the contract maps it to x %.2f..%.2f, y %.2f..%.2f",
						i, l.Name, l.Low, l.High, x1, x2, y1, y2, toX(0), toX(grid.Tc(span)), toY(l.High), toY(l.Low))
				}
			}

			// Every numerology aligns every 0.5 ms (TS 38.211 5.3.1: each half
			// subframe is 0.5 ms long at every μ), so there is one mark at each
			// interior multiple of 0.5 ms.
			var marks []segment
			for _, m := range p.all(byClass("gl-align")) {
				marks = append(marks, segments(t, m.attr["d"])...)
			}
			if want := 2*r.Plan.SpanMs - 1; len(marks) != want {
				t.Fatalf("%d 0.5 ms marks, want %d", len(marks), want)
			}
			for k, m := range marks {
				at := grid.Tc(k+1) * grid.TcPerHalfFrame
				if !m.vertical || !near(m.x, toX(at), 0.06) || !near(m.y, y, 0.06) || !near(m.to, y+h, 0.06) {
					t.Errorf("mark %d at x %v from y %v to %v; want x %.2f across %v..%v", k, m.x, m.y, m.to, toX(at), y, y+h)
				}
			}
		})
	}
}

// TestFigureWidth checks the width option: the default, the bounds, and
// an error sentence that names the allowed range.
func TestFigureWidth(t *testing.T) {
	r := compute(t, loadPlan(t, demoPlans(t)[0]))
	for _, tc := range []struct {
		width, want int
	}{{0, DefaultWidth}, {MinWidth, MinWidth}, {1500, 1500}, {MaxWidth, MaxWidth}} {
		root := parseSVG(t, figure(t, r, Options{Width: tc.width}))
		if got := root.attr["width"]; got != fmt.Sprint(tc.want) {
			t.Errorf("Options{Width: %d}: width %q, want %d", tc.width, got, tc.want)
		}
		if vb, want := root.attr["viewBox"], fmt.Sprintf("0 0 %d %s", tc.want, root.attr["height"]); vb != want {
			t.Errorf("Options{Width: %d}: viewBox %q, want %q", tc.width, vb, want)
		}
	}
	for _, width := range []int{-1, 1, MinWidth - 1, MaxWidth + 1} {
		var b bytes.Buffer
		err := Figure(&b, r, Options{Width: width})
		if err == nil || !strings.Contains(err.Error(), fmt.Sprint(MinWidth)) || !strings.Contains(err.Error(), fmt.Sprint(MaxWidth)) {
			t.Errorf("Options{Width: %d}: error %v, want one naming %d to %d", width, err, MinWidth, MaxWidth)
		}
		if b.Len() != 0 {
			t.Errorf("Options{Width: %d}: wrote %d bytes despite the error", width, b.Len())
		}
	}
}

// TestFigureWriteError checks that a failing writer's error comes back.
func TestFigureWriteError(t *testing.T) {
	r := compute(t, loadPlan(t, demoPlans(t)[0]))
	want := errors.New("disk full")
	if err := Figure(failWriter{want}, r, Options{}); !errors.Is(err, want) {
		t.Errorf("Figure to a failing writer: %v, want %v", err, want)
	}
	if err := SymbolCSV(failWriter{want}, r); !errors.Is(err, want) {
		t.Errorf("SymbolCSV to a failing writer: %v, want %v", err, want)
	}
}

type failWriter struct{ err error }

func (f failWriter) Write([]byte) (int, error) { return 0, f.err }

// TestInvalidNumerology: a result Compute cannot make is refused, not drawn.
func TestInvalidNumerology(t *testing.T) {
	r := compute(t, loadPlan(t, demoPlans(t)[0]))
	r.Partitions[0].Numerology = grid.Numerology{Mu: -1}
	if err := Figure(&bytes.Buffer{}, r, Options{}); err == nil {
		t.Error("Figure drew a partition with μ = −1")
	}
	if err := SymbolCSV(&bytes.Buffer{}, r); err == nil {
		t.Error("SymbolCSV listed a partition with μ = −1")
	}
}

// TestEmptyResult: a result with nothing placed still draws a valid figure.
func TestEmptyResult(t *testing.T) {
	r := grid.Compute(grid.Plan{Name: "empty", Carrier: grid.CarrierPlan{BandwidthMHz: 20}})
	if len(r.Partitions) != 0 {
		t.Fatalf("want no partitions, got %d", len(r.Partitions))
	}
	root := parseSVG(t, figure(t, r, Options{}))
	if !strings.Contains(root.allText(), "No partition could be placed") {
		t.Error("the figure of an empty plan does not say that nothing was placed")
	}
	parseSVG(t, figure(t, grid.Result{}, Options{}))
}
