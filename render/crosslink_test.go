package render

import (
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
)

// TestCrossLinkMarked: Options.CrossLink marks each conflict of the list it
// is given over the plot's whole height, repeated every cycle across the
// span, on A's time or, for side B, shifted back by the frame offset; one
// path for all, its times published, nothing without a list.
func TestCrossLinkMarked(t *testing.T) {
	start := 0
	r := compute(t, grid.Plan{Name: "marks", SpanMs: 10, Carrier: grid.CarrierPlan{BandwidthMHz: 20},
		Partitions: []grid.PartitionPlan{{Name: "a", SCSKHz: 30, StartCRB: &start, SizePRB: 51}}})
	ms := grid.TcPerSubframe // 1 ms = 1 966 080 Tc (TS 38.211 4.1)
	// A list written by hand, as grid.CrossLinkConflicts makes them: a 5 ms
	// cycle, B's frame 1 ms after A's, A downlink against B uplink on
	// [0, 1) ms and A uplink against B downlink on [3, 3.5) ms.
	x := &grid.CrossLink{Cycle: 5 * ms, Offset: ms, Conflicts: []grid.CrossLinkConflict{
		{Start: 0, End: ms, A: grid.Downlink, B: grid.Uplink},
		{Start: 3 * ms, End: 7 * ms / 2, A: grid.Uplink, B: grid.Downlink}}}
	f := plotFrame(r, DefaultWidth)
	for _, c := range []struct {
		side  bool
		bands [][2]grid.Tc // in the order of the conflicts, then of the cycles
	}{
		// On A's time each conflict as listed and again 5 ms later.
		{false, [][2]grid.Tc{{0, ms}, {5 * ms, 6 * ms}, {3 * ms, 7 * ms / 2}, {8 * ms, 17 * ms / 2}}},
		// On B's time 1 ms earlier: [0, 1) ms falls on [−1, 0), which is
		// off the plot, then [4, 5) and [9, 10); [3, 3.5) falls on [2, 2.5)
		// and [7, 7.5).
		{true, [][2]grid.Tc{{4 * ms, 5 * ms}, {9 * ms, 10 * ms}, {2 * ms, 5 * ms / 2}, {7 * ms, 15 * ms / 2}}},
	} {
		root := parseSVG(t, figure(t, r, Options{CrossLink: CrossLinkMarks{Link: x, SideB: c.side}}))
		gs := root.all(byClass("gl-xl-marks"))
		paths := root.all(byClass("gl-xl-mark"))
		if len(gs) != 1 || len(paths) != 1 {
			t.Fatalf("side B %v: %d groups and %d paths of marks, want 1 and 1", c.side, len(gs), len(paths))
		}
		var starts, ends []string
		for _, b := range c.bands {
			starts, ends = append(starts, itoa(b[0])), append(ends, itoa(b[1]))
		}
		if got, want := gs[0].attr["data-start-tc"], strings.Join(starts, " "); got != want {
			t.Errorf("side B %v: data-start-tc %q, want %q", c.side, got, want)
		}
		if got, want := gs[0].attr["data-end-tc"], strings.Join(ends, " "); got != want {
			t.Errorf("side B %v: data-end-tc %q, want %q", c.side, got, want)
		}
		rs := rectsOf(t, paths[0].attr["d"])
		if len(rs) != len(c.bands) {
			t.Fatalf("side B %v: %d bands, want %d", c.side, len(rs), len(c.bands))
		}
		for i, b := range c.bands {
			got := rs[i]
			if !near(got.x0, f.X(b[0]), 0.06) || !near(got.x1, f.X(b[1]), 0.06) || got.y0 != float64(f.y) || got.y1 != f.bottom() {
				t.Errorf("side B %v band %d: x %v–%v, y %v–%v; want x %.1f–%.1f, y %d–%.0f", c.side, i, got.x0, got.x1, got.y0, got.y1, f.X(b[0]), f.X(b[1]), f.y, f.bottom())
			}
		}
		if p := paths[0].attr; p["fill"] != "#b02a20" || p["fill-opacity"] != "0.16" {
			t.Errorf("side B %v: fill %q at %q, want the comparison's tint #b02a20 at 0.16", c.side, p["fill"], p["fill-opacity"])
		}
		if gs[0].attr["pointer-events"] != "none" {
			t.Errorf("side B %v: the marks catch the pointer, which the readout needs", c.side)
		}
	}

	// No list, or an empty one (aligned patterns): no marks.
	for _, m := range []CrossLinkMarks{{}, {Link: &grid.CrossLink{Cycle: 5 * ms}}} {
		if n := len(parseSVG(t, figure(t, r, Options{CrossLink: m})).all(byClass("gl-xl-marks"))); n != 0 {
			t.Errorf("%+v: %d groups of marks, want none", m, n)
		}
	}
	// A list the engine cannot make is refused, not drawn.
	for _, bad := range []grid.CrossLink{
		{Cycle: 1, Conflicts: x.Conflicts},
		{Cycle: 5 * ms, Offset: 5 * ms, Conflicts: x.Conflicts},
		{Cycle: 5 * ms, Conflicts: []grid.CrossLinkConflict{{Start: 4 * ms, End: 6 * ms}}},
	} {
		if err := Figure(&strings.Builder{}, r, Options{CrossLink: CrossLinkMarks{Link: &bad}}); err == nil || !strings.Contains(err.Error(), "cross-link") {
			t.Errorf("cycle %d, offset %d, %+v: error %v, want one naming the cross-link list", bad.Cycle, bad.Offset, bad.Conflicts, err)
		}
	}
}

func itoa(t grid.Tc) string { return strconv.FormatInt(int64(t), 10) }
