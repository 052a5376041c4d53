package render

import (
	"cmp"
	"fmt"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
)

var rectsRE = regexp.MustCompile(`M(-?[0-9.]+) (-?[0-9.]+)H(-?[0-9.]+)V(-?[0-9.]+)H(-?[0-9.]+)Z`)

// box is a rectangle read back from a path.
type box struct{ x0, y0, x1, y1 float64 }

// rectsOf reads a path made only of pathData.rect subpaths.
func rectsOf(t testing.TB, d string) []box {
	t.Helper()
	var out []box
	for _, m := range rectsRE.FindAllStringSubmatch(d, -1) {
		v := make([]float64, 4)
		for i := range v {
			v[i], _ = strconv.ParseFloat(m[i+1], 64)
		}
		out = append(out, box{v[0], v[1], v[2], v[3]})
	}
	if n := strings.Count(d, "M"); n != len(out) {
		t.Fatalf("path %.80q: %d subpaths, %d parsed as rectangles", d, n, len(out))
	}
	return out
}

// pathRects is every rectangle of the paths of class in n.
func pathRects(t testing.TB, n *node, class string) []box {
	t.Helper()
	var out []box
	for _, p := range n.all(byClass(class)) {
		out = append(out, rectsOf(t, p.attr["d"])...)
	}
	return out
}

var bandClasses = map[string]grid.SymbolDir{"gl-tdd-d": grid.Downlink, "gl-tdd-f": grid.Flexible, "gl-tdd-u": grid.Uplink}

// TestTDDCampus checks the band and the wash of the campus plan against
// its pattern, worked out here from the plan file: a 5 ms period of 15 kHz
// slots opens with 3 downlink slots and 10 downlink symbols and closes with
// 2 uplink symbols and 1 uplink slot (TS 38.213 11.1, TDD-UL-DL-Pattern
// of TS 38.331). Of the 5 × 14 = 70 reference symbols, 0–51 are downlink,
// 52–53 flexible and 54–69 uplink, at every partition's spacing.
func TestTDDCampus(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	if r.TDD == nil || r.TDD.SlotString() != "DDDSU" {
		t.Fatalf("campus TDD = %+v, want DDDSU", r.TDD)
	}
	ref := grid.Numerology{Mu: 0}
	dlEnd, ulStart := ref.SymbolAt(52).Start, ref.SymbolAt(54).Start
	root := parseSVG(t, figure(t, r, Options{}))
	f := plotFrame(r, DefaultWidth)
	spanEnd := f.span
	want := map[grid.SymbolDir][2]grid.Tc{
		grid.Downlink: {0, dlEnd}, grid.Flexible: {dlEnd, ulStart}, grid.Uplink: {ulStart, spanEnd},
	}
	for i, g := range root.all(byClass("gl-part")) {
		l := r.Partitions[i]
		top, bottom := f.Y(l.High), f.Y(l.Low)
		bandTop := bottom - bandHeight(bottom-top)
		for class, dir := range bandClasses {
			rs := pathRects(t, g, class)
			span := want[dir]
			if len(rs) != 1 {
				t.Errorf("%s: %d %s runs, want 1 (%d kHz)", l.Name, len(rs), class, l.Numerology.SCSKHz())
				continue
			}
			b := rs[0]
			if !near(b.x0, f.X(span[0]), 0.06) || !near(b.x1, f.X(span[1]), 0.06) || !near(b.y0, bandTop, 0.06) || !near(b.y1, bottom, 0.06) {
				t.Errorf("%s: %s run at x %v–%v, y %v–%v; want x %.2f–%.2f (Tc %d–%d), y %.2f–%.2f",
					l.Name, class, b.x0, b.x1, b.y0, b.y1, f.X(span[0]), f.X(span[1]), span[0], span[1], bandTop, bottom)
			}
		}
		// The wash covers what the partition cannot use: from the end of
		// downlink for a DL partition, up to the start of uplink for an UL one.
		wash := pathRects(t, g, "gl-tdd-off")
		from, to := dlEnd, spanEnd
		if l.Direction == grid.UL {
			from, to = 0, ulStart
		}
		if len(wash) != 1 || !near(wash[0].x0, f.X(from), 0.06) || !near(wash[0].x1, f.X(to), 0.06) || !near(wash[0].y0, top, 0.06) || !near(wash[0].y1, bottom, 0.06) {
			t.Errorf("%s (%s): wash %v, want one rectangle x %.2f–%.2f, y %.2f–%.2f", l.Name, l.Direction, wash, f.X(from), f.X(to), top, bottom)
		}
		var letters []string
		for _, n := range g.all(byClass("gl-tdd-letter")) {
			letters = append(letters, n.allText())
		}
		if strings.Join(letters, "") != "DFU" {
			t.Errorf("%s: letters %q, want D, F and U once each", l.Name, letters)
		}
	}
	key := root.all(byClass("gl-key"))[0].allText()
	if !strings.Contains(key, "TDD DDDSU per 5 ms (15 kHz slots)") {
		t.Errorf("the key does not name the pattern: %q", key)
	}
}

// tddStress is the heaviest lattice under a 0.5 ms pattern of 120 kHz
// slots (the shortest period, TS 38.331): 2 downlink slots and 12 symbols,
// then 1 uplink symbol and 1 uplink slot, so one flexible symbol of
// 8.9 µs per period.
func tddStress(t testing.TB) grid.Plan {
	p := loadPlan(t, stressPlan)
	p.TDD = &grid.TDDPlan{ReferenceSCSKHz: 120, Pattern1: grid.TDDPattern{PeriodMs: 0.5, DownlinkSlots: 2, DownlinkSymbols: 12, UplinkSlots: 1, UplinkSymbols: 1}}
	return p
}

// TestTDDRunsTile: at every width, each partition's band is a row of runs
// from the left of the plot to its right, without gap or overlap, none
// narrower than minRun, and the legend says when runs were simplified.
func TestTDDRunsTile(t *testing.T) {
	merged := tddStress(t)
	merged.Name = "adjacent narrow runs"
	merged.TDD.Pattern1 = grid.TDDPattern{PeriodMs: 0.5, DownlinkSlots: 3, DownlinkSymbols: 12, UplinkSymbols: 1}
	plans := map[string]grid.Plan{"tdd stress": tddStress(t), "merged": merged}
	for _, path := range demoPlans(t) {
		if p := loadPlan(t, path); p.TDD != nil {
			plans[planName(path)] = p
		}
	}
	for name, p := range plans {
		r := compute(t, p)
		for _, width := range []int{MinWidth, DefaultWidth, MaxWidth} {
			f := plotFrame(r, width)
			root := parseSVG(t, figure(t, r, Options{Width: width}))
			legend := root.all(byClass("gl-legend"))[0].allText()
			for i, g := range root.all(byClass("gl-part")) {
				where := fmt.Sprintf("%s width %d partition %d", name, width, i)
				var runs []box
				for class := range bandClasses {
					runs = append(runs, pathRects(t, g, class)...)
				}
				slices.SortFunc(runs, func(a, b box) int { return cmp.Compare(a.x0, b.x0) })
				if len(runs) == 0 {
					t.Fatalf("%s: no TDD band", where)
				}
				if !near(runs[0].x0, float64(f.x), 0.06) || !near(runs[len(runs)-1].x1, f.right(), 0.06) {
					t.Errorf("%s: band runs from %v to %v, want %d to %v", where, runs[0].x0, runs[len(runs)-1].x1, f.x, f.right())
				}
				for k, b := range runs {
					if b.x1-b.x0 < minRun-0.11 {
						t.Errorf("%s: run %d is %.2f px wide, under %v", where, k, b.x1-b.x0, minRun)
					}
					if k > 0 && !near(b.x0, runs[k-1].x1, 0.11) {
						t.Errorf("%s: run %d starts at %v, the one before ends at %v", where, k, b.x0, runs[k-1].x1)
					}
				}
				td := planTDD(r.Partitions[i], f)
				for _, part := range td.parts() {
					if !strings.Contains(legend, part) {
						t.Errorf("%s: legend does not say %q", where, part)
					}
				}
				if len(runs) != len(td.runs) {
					t.Errorf("%s: %d runs drawn, %d planned", where, len(runs), len(td.runs))
				}
			}
		}
	}
	// The simplifications happen where they should: at the narrowest
	// figure the flexible symbol (8.9 µs, 0.3 px) is widened; at the widest
	// (4 px) nothing is; adjacent F and U symbols merge.
	for _, tc := range []struct {
		p         grid.Plan
		width     int
		widened   bool
		mergedAny bool
	}{
		{tddStress(t), MinWidth, true, false},
		{tddStress(t), MaxWidth, false, false},
		{merged, MinWidth, true, true},
	} {
		r := compute(t, tc.p)
		td := planTDD(r.Partitions[0], plotFrame(r, tc.width))
		if (td.widened > 0) != tc.widened || (td.merged > 0) != tc.mergedAny {
			t.Errorf("%s at width %d: %d runs widened, %d merged; want widened %v, merged %v", tc.p.Name, tc.width, td.widened, td.merged, tc.widened, tc.mergedAny)
		}
	}
}

// TestTDDCostFollowsRuns: ten times the span under a TDD pattern, at 960
// kHz (8960 symbols), adds runs to three paths and no elements.
func TestTDDCostFollowsRuns(t *testing.T) {
	measure := func(p grid.Plan) (elements, size, runs int) {
		data := figure(t, compute(t, p), Options{})
		root := parseSVG(t, data)
		for class := range bandClasses {
			runs += len(pathRects(t, root, class))
		}
		return root.count(), len(data), runs
	}
	short := tddStress(t)
	short.SpanMs = 1
	e1, b1, r1 := measure(short)
	e10, b10, r10 := measure(tddStress(t))
	t.Logf("960 kHz with TDD, 1 ms vs 10 ms: %d→%d elements, %d→%d bytes, %d→%d runs", e1, e10, b1, b10, r1, r10)
	if e10 > e1+10 {
		t.Errorf("10 ms draws %d elements, 1 ms %d: elements grow with the span", e10, e1)
	}
	if float64(b10) > 2*float64(b1) {
		t.Errorf("10 ms draws %d bytes, 1 ms %d", b10, b1)
	}
	// Three runs per 0.5 ms period, far fewer than the 896 or 8960 symbols.
	if r1 != 3*2 || r10 != 3*20 {
		t.Errorf("%d and %d runs, want 6 and 60 (3 per period)", r1, r10)
	}
	if b10 >= 300_000 {
		t.Errorf("heaviest plan with TDD: %d bytes", b10)
	}
}

// TestTDDBelowReference: a partition below the reference spacing has no
// directions (grid reports the error); it is drawn without a band and
// the legend says why.
func TestTDDBelowReference(t *testing.T) {
	p := loadPlan(t, "../grid/demo/campus.yaml")
	p.TDD.ReferenceSCSKHz = 30
	p.TDD.Pattern1.PeriodMs = 5
	r := compute(t, p)
	root := parseSVG(t, figure(t, r, Options{}))
	legend := root.all(byClass("gl-legend"))[0].allText()
	for i, g := range root.all(byClass("gl-part")) {
		l := r.Partitions[i]
		has := len(g.all(byClass("gl-tdd-d"))) > 0
		if has != (l.Dirs != nil) {
			t.Errorf("%s (%d kHz): band drawn %v, directions known %v", l.Name, l.Numerology.SCSKHz(), has, l.Dirs != nil)
		}
	}
	if !strings.Contains(legend, "no TDD directions (below the reference SCS)") {
		t.Error("the legend does not say why a partition has no band")
	}
}
