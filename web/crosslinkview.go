package web

import (
	"strconv"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The comparison's synchronised TDD (issue 17): both plans on absolute
// time with B's frame offset, the cross-link conflicts between them, their
// total per 10 ms, and a strip that marks them along one cycle. Built from
// planform.Compare.CrossLink, computed once per page: compare.go calls
// crossLinkOf, hands its list to render (render.CrossLinkMarks), which
// marks it on both figures, and its view to buildCompare.

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

	// x is the computed list, which render marks on the figures; nil when
	// there is none.
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
