package render

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
)

// lineKinds are the per-partition paths whose segments are lattice lines.
var lineKinds = []string{"gl-rows", "gl-symbols", "gl-slots", "gl-cp", "gl-longcp"}

// TestDetailIsFinestThatFits checks chooseDetail on every plan at three
// widths: the PRB step is the finest whose rows are minLineGap apart, and
// symbol lines, slot lines and CP strips are drawn exactly when they are at
// least minLineGap apart or minStrip wide.
func TestDetailIsFinestThatFits(t *testing.T) {
	for _, path := range append(demoPlans(t), stressPlan) {
		r := compute(t, loadPlan(t, path))
		for _, width := range []int{MinWidth, DefaultWidth, MaxWidth} {
			f := plotFrame(r, width)
			for i, l := range r.Partitions {
				d := chooseDetail(l, f)
				n := l.Numerology
				where := fmt.Sprintf("%s width %d partition %d (%d kHz)", planName(path), width, i, n.SCSKHz())
				prbPx := float64(12*n.SCS()) * f.pxPerHz()
				j := slices.Index(rowSteps, d.rowStep)
				if j < 0 || float64(d.rowStep)*prbPx < minLineGap || (j > 0 && float64(rowSteps[j-1])*prbPx >= minLineGap) {
					t.Errorf("%s: rows every %d PRBs at %.2f px per PRB; want the finest of %v at least %v px apart", where, d.rowStep, prbPx, rowSteps, minLineGap)
				}
				// The shortest symbol has the normal CP (TS 38.211 5.3.1).
				symPx := float64(n.UsefulTc()+n.CPTc(1)) * f.pxPerTc()
				if d.symbols != (symPx >= minLineGap) || d.slots != (symPx*float64(n.SymbolsPerSlot()) >= minLineGap) {
					t.Errorf("%s: symbols %v, slots %v at %.2f px per symbol", where, d.symbols, d.slots, symPx)
				}
				if cpPx := float64(n.CPTc(1)) * f.pxPerTc(); d.cp != (cpPx >= minStrip) {
					t.Errorf("%s: CP strips %v at %.2f px", where, d.cp, cpPx)
				}
			}
		}
	}
}

// TestDrawnLinesAreVisible checks the figure itself: within a partition no
// two drawn lines of a direction are closer than minLineGap (after the
// 0.1 px rounding), every CP strip is at least minStrip wide, and the
// legend says what the paths hold.
func TestDrawnLinesAreVisible(t *testing.T) {
	for _, path := range append(demoPlans(t), stressPlan) {
		r := compute(t, loadPlan(t, path))
		for _, width := range []int{MinWidth, DefaultWidth, MaxWidth} {
			root := parseSVG(t, figure(t, r, Options{Width: width}))
			var marks []float64
			for _, m := range root.all(byClass("gl-align")) {
				for _, s := range segments(t, m.attr["d"]) {
					marks = append(marks, s.x)
				}
			}
			legend := root.all(byClass("gl-legend"))[0].allText()
			for i, g := range root.all(byClass("gl-part")) {
				where := fmt.Sprintf("%s width %d partition %d", planName(path), width, i)
				xs, ys := slices.Clone(marks), []float64{}
				body := g.all(byClass("gl-body"))[0]
				x1, y1, x2, y2 := rectOf(t, body.attr["d"])
				xs = append(xs, x1, x2)
				ys = append(ys, y1, y2)
				for _, kind := range []string{"gl-rows", "gl-symbols", "gl-slots"} {
					for _, p := range g.all(byClass(kind)) {
						for _, s := range segments(t, p.attr["d"]) {
							if s.vertical {
								xs = append(xs, s.x)
							} else {
								ys = append(ys, s.y)
							}
						}
					}
				}
				for axis, vs := range map[string][]float64{"x": xs, "y": ys} {
					slices.Sort(vs)
					for k := 1; k < len(vs); k++ {
						if gap := vs[k] - vs[k-1]; gap < minLineGap-0.2 && gap > 1e-9 {
							t.Errorf("%s: lines at %s = %v and %v are %.2f px apart, under %v", where, axis, vs[k-1], vs[k], gap, minLineGap)
						}
					}
				}
				for _, kind := range []string{"gl-cp", "gl-longcp"} {
					for _, p := range g.all(byClass(kind)) {
						if w, _ := strconv.ParseFloat(p.attr["stroke-width"], 64); w < minStrip {
							t.Errorf("%s: %s strips %v px wide, under %v", where, kind, w, minStrip)
						}
					}
				}
				d := chooseDetail(r.Partitions[i], plotFrame(r, width))
				for _, part := range d.parts(r.Partitions[i].SizePRB) {
					if !strings.Contains(legend, part) {
						t.Errorf("%s: legend does not say %q", where, part)
					}
				}
				has := func(kind string) bool { return len(g.all(byClass(kind))) > 0 }
				if has("gl-symbols") != d.symbols {
					t.Errorf("%s: symbol path drawn %v, detail says %v", where, has("gl-symbols"), d.symbols)
				}
				if has("gl-cp") != d.cp || has("gl-longcp") != d.longCP {
					t.Errorf("%s: CP paths %v/%v, detail says %v/%v", where, has("gl-cp"), has("gl-longcp"), d.cp, d.longCP)
				}
			}
		}
	}
}

// TestLongCPStrips checks that the longer CP of the first symbol of each
// half subframe has its own strips, wider and darker, at 15 kHz:
// N_CP = 144κ + 16κ = 10240 Tc there against 9216 Tc (TS 38.211 5.3.1).
func TestLongCPStrips(t *testing.T) {
	p := loadPlan(t, "../grid/demo/campus.yaml")
	p.SpanMs = 1 // wide enough symbols for CP strips at the default width
	r := compute(t, p)
	i := slices.IndexFunc(r.Partitions, func(l grid.Lattice) bool { return l.Numerology.SCSKHz() == 15 })
	if i < 0 {
		t.Fatal("campus plan has no 15 kHz partition")
	}
	root := parseSVG(t, figure(t, r, Options{}))
	f := plotFrame(r, DefaultWidth)
	g := root.all(byClass("gl-part"))[i]
	normal, long := g.all(byClass("gl-cp")), g.all(byClass("gl-longcp"))
	if len(normal) != 1 || len(long) != 1 {
		t.Fatalf("want one normal and one long CP path, got %d and %d", len(normal), len(long))
	}
	nw, _ := strconv.ParseFloat(normal[0].attr["stroke-width"], 64)
	lw, _ := strconv.ParseFloat(long[0].attr["stroke-width"], 64)
	if !near(nw, 9216*f.pxPerTc(), 0.01) || !near(lw, 10240*f.pxPerTc(), 0.01) {
		t.Errorf("CP strips %v and %v px wide, want %.3f and %.3f", nw, lw, 9216*f.pxPerTc(), 10240*f.pxPerTc())
	}
	if normal[0].attr["stroke-opacity"] == long[0].attr["stroke-opacity"] {
		t.Error("long and normal CP strips are drawn alike")
	}
	segs := segments(t, long[0].attr["d"])
	if len(segs) != 2*r.Plan.SpanMs {
		t.Fatalf("%d long CP strips, want one per half subframe: %d", len(segs), 2*r.Plan.SpanMs)
	}
	for k, s := range segs {
		want := f.X(grid.Tc(k)*grid.TcPerHalfFrame) + lw/2
		if !near(s.x, want, 0.06) {
			t.Errorf("long CP strip %d centred at %v, want %.2f", k, s.x, want)
		}
	}
	// 14 symbols in the 1 ms span at 15 kHz, 2 of them with the longer CP.
	if got := len(segments(t, normal[0].attr["d"])); got != 14-2 {
		t.Errorf("%d normal CP strips, want 12", got)
	}
}

// TestHeaviestPlanSize: the largest lattice a plan can hold, 8960 symbols ×
// 148 PRBs, draws in well under 300 KB.
func TestHeaviestPlanSize(t *testing.T) {
	r := compute(t, loadPlan(t, stressPlan))
	cells := r.Partitions[0].SymbolCount() * r.Partitions[0].SizePRB
	for _, width := range []int{DefaultWidth, MaxWidth} {
		data := figure(t, r, Options{Width: width})
		t.Logf("width %d: %d bytes for %d symbol-PRB cells", width, len(data), cells)
		if len(data) >= 300_000 {
			t.Errorf("width %d: heaviest plan draws in %d bytes, want under 300000", width, len(data))
		}
	}
}

// TestCostFollowsDrawing: ten times the symbols, or 148 times the PRBs,
// change the figure little, while each added partition adds its own group.
func TestCostFollowsDrawing(t *testing.T) {
	base := loadPlan(t, stressPlan)
	measure := func(p grid.Plan) (elements, size int) {
		data := figure(t, compute(t, p), Options{})
		return parseSVG(t, data).count(), len(data)
	}
	within := func(what string, e1, b1, e2, b2 int) {
		t.Helper()
		t.Logf("%s: %d→%d elements, %d→%d bytes", what, e1, e2, b1, b2)
		if float64(e2) > 1.5*float64(e1) || float64(e1) > 1.5*float64(e2) {
			t.Errorf("%s: elements %d and %d differ by more than 1.5×", what, e1, e2)
		}
		if float64(b2) > 2*float64(b1) || float64(b1) > 2*float64(b2) {
			t.Errorf("%s: bytes %d and %d differ by more than 2×", what, b1, b2)
		}
	}

	short := base.Clone()
	short.SpanMs = 1
	e1, b1 := measure(short)
	e10, b10 := measure(base)
	within("960 kHz, 148 PRBs, 1 ms vs 10 ms (896 vs 8960 symbols)", e1, b1, e10, b10)

	one := base.Clone()
	one.Partitions[0].SizePRB = 1
	eOne, bOne := measure(one)
	within("960 kHz, 10 ms, 1 PRB vs 148 PRBs", eOne, bOne, e10, b10)

	campus := loadPlan(t, "../grid/demo/campus.yaml")
	prev := 0
	for n := 1; n <= len(campus.Partitions); n++ {
		p := campus.Clone()
		p.Partitions = p.Partitions[:n]
		e, _ := measure(p)
		if e <= prev+3 {
			t.Errorf("campus with %d partitions: %d elements, not clearly more than %d with %d", n, e, prev, n-1)
		}
		prev = e
	}
}

// TestManyPartitionsBounded draws the most partitions a plan may hold at
// the widest figure: the bytes stay bounded by what fits in the pixels.
func TestManyPartitionsBounded(t *testing.T) {
	p := grid.Plan{Name: "sixteen", SpanMs: grid.MaxSpanMs, Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 100}}
	for i := range grid.MaxPartitions {
		start := i * 17
		p.Partitions = append(p.Partitions, grid.PartitionPlan{Name: fmt.Sprintf("p%d", i), SCSKHz: 30, StartCRB: &start, SizePRB: 16})
	}
	r := compute(t, p)
	data := figure(t, r, Options{Width: MaxWidth})
	root := parseSVG(t, data)
	t.Logf("16 partitions, 10 ms, width %d: %d bytes, %d elements", MaxWidth, len(data), root.count())
	f := plotFrame(r, MaxWidth)
	for i, g := range root.all(byClass("gl-part")) {
		for _, kind := range lineKinds {
			for _, path := range g.all(byClass(kind)) {
				n := len(segments(t, path.attr["d"]))
				limit := int(float64(f.w)/minLineGap) + 2
				if kind == "gl-rows" {
					limit = int(float64(f.h)/minLineGap) + 2
				}
				if n > limit {
					t.Errorf("partition %d: %s has %d segments, more than the %d that fit", i, kind, n, limit)
				}
			}
		}
	}
	if len(data) > 400_000 {
		t.Errorf("16 partitions at width %d: %d bytes", MaxWidth, len(data))
	}
}
