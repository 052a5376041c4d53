package web

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The comparison's synchronised TDD (issue 17): both plans on absolute
// time with B's frame offset, the cross-link conflicts between them, their
// total per 10 ms, and a strip that marks them along one cycle. Built from
// planform.Compare.CrossLink, computed once per page: compareview.go calls
// crossLinkOf and hands its view to markConflicts for both figures.

// stripWidth is the width of the conflict strip's viewBox.
const stripWidth = 1000

type crossLinkView struct {
	Key, ID, Value string // the frame offset's control: query key, id, value as typed
	Err            string // the offset's message, beside the control
	Why            string // why there is no list (no TDD on a side), or ""
	Offset, Cycle  string // µs
	Conflicts      []conflictRow
	Total          string // µs per cycle
	PerTenMs       string // µs per 10 ms
	Ticks          []stripTick

	// x is the computed list, which markConflicts draws on the figures;
	// nil when there is none.
	x *grid.CrossLink
}

type conflictRow struct {
	StartUs, EndUs, LengthUs string
	What                     string // "A downlink, B uplink"
	X, W                     string // the interval on the strip
}

type stripTick struct{ X, Label string }

func usOf(t float64) string {
	return strconv.FormatFloat(t*1e6/float64(grid.TcPerSecond), 'f', 3, 64)
}

func dirWord(d grid.SymbolDir) string {
	if d == grid.Downlink {
		return "downlink"
	}
	return "uplink"
}

// crossLinkOf is the cross-link view of a comparison.
func crossLinkOf(c planform.Compare) crossLinkView {
	v := crossLinkView{Key: planform.KeyFrameOffset, ID: "b-f-frameOffsetUs", Value: c.FrameOffset, Err: c.FrameOffsetErr}
	x, why, ok := c.CrossLink()
	if !ok {
		v.Why = why
		return v
	}
	v.x = &x
	v.Offset, v.Cycle = usOf(float64(x.Offset)), usOf(float64(x.Cycle))
	v.Total, v.PerTenMs = usOf(float64(x.Total)), usOf(x.PerTenMs)
	pos := func(t grid.Tc) float64 { return float64(t) * stripWidth / float64(x.Cycle) }
	num := func(f float64) string { return strconv.FormatFloat(f, 'f', 2, 64) }
	for _, k := range x.Conflicts {
		v.Conflicts = append(v.Conflicts, conflictRow{
			StartUs: usOf(float64(k.Start)), EndUs: usOf(float64(k.End)), LengthUs: usOf(float64(k.End - k.Start)),
			What: "A " + dirWord(k.A) + ", B " + dirWord(k.B),
			X:    num(pos(k.Start)), W: num(pos(k.End) - pos(k.Start)),
		})
	}
	for ms := grid.Tc(0); ms <= x.Cycle; ms += grid.TcPerSubframe {
		v.Ticks = append(v.Ticks, stripTick{X: num(pos(ms)), Label: strconv.Itoa(int(ms / grid.TcPerSubframe))})
	}
	return v
}

var plotGroupAttrs = regexp.MustCompile(`<g id="[ab]-gl-plot"[^>]* data-x="([0-9.]+)" data-y="([0-9.]+)" data-w="([0-9.]+)" data-h="([0-9.]+)" data-span-tc="([0-9]+)"`)

// markConflicts draws the cross-link conflicts of v on side i's figure (0 for
// A, 1 for B) as translucent bands over its plot, across its whole time
// span: on A's time as listed, on B's shifted back by the frame offset.
// The figure is returned unchanged when it has no plot geometry or there
// is nothing to mark. The downloads keep the plain figure.
func markConflicts(svg string, v crossLinkView, side int) string {
	x := v.x
	if x == nil || len(x.Conflicts) == 0 {
		return svg
	}
	end := strings.LastIndex(svg, "</svg>")
	m := plotGroupAttrs.FindStringSubmatch(svg)
	if end < 0 || m == nil {
		return svg
	}
	var g [4]float64
	for k := range g {
		g[k], _ = strconv.ParseFloat(m[k+1], 64)
	}
	span, _ := strconv.ParseInt(m[5], 10, 64)
	if span <= 0 || x.Cycle <= 0 {
		return svg
	}
	shift := grid.Tc(0)
	if side == 1 {
		shift = x.Offset
	}
	num := func(f float64) string { return strconv.FormatFloat(f, 'f', 2, 64) }
	var b strings.Builder
	b.WriteString(`<g class="gl-xl-marks" pointer-events="none" data-testid="crosslink-marks">`)
	for _, k := range x.Conflicts {
		// The conflict repeats every cycle; on B's time it starts shift earlier.
		s := ((k.Start-shift)%x.Cycle + x.Cycle) % x.Cycle
		for t := s - x.Cycle; t < grid.Tc(span); t += x.Cycle {
			lo, hi := max(t, 0), min(t+(k.End-k.Start), grid.Tc(span))
			if lo >= hi {
				continue
			}
			fmt.Fprintf(&b, `<rect x="%s" y="%s" width="%s" height="%s" fill="#b02a20" fill-opacity="0.16"><title>cross-link conflict: A %s, B %s</title></rect>`,
				num(g[0]+g[2]*float64(lo)/float64(span)), num(g[1]), num(g[2]*float64(hi-lo)/float64(span)), num(g[3]), dirWord(k.A), dirWord(k.B))
		}
	}
	b.WriteString(`</g>`)
	return svg[:end] + b.String() + svg[end:]
}
