package render

import (
	"fmt"
	"strings"

	"gridloom/grid"
)

// The overlap layer outlines each band two partitions share, from the
// engine's grid.Result.Overlaps (never from what else is drawn): in the
// error ink where the overlap is an error finding, dashed in the warning
// ink where a downlink and an uplink partition share spectrum.

// overlapDash is the warning outline's dash pattern, in px.
var overlapDash = []float64{7, 4}

// drawOverlaps outlines every overlap across the plan's span: one path for
// the errors and one for the warnings, whatever their number. A band
// thinner than the outline's width is drawn that wide, so that even 7.5
// kHz of overlap between two grids is seen.
func drawOverlaps(b *builder, f frame, os []grid.Overlap) {
	if len(os) == 0 {
		return
	}
	var errs, warns pathData
	var pairs []string
	left, right := float64(f.x), f.planRight()
	for _, o := range os {
		top, bottom := f.Y(o.High), f.Y(o.Low)
		if bottom-top < b.lk.overlapW {
			mid := (top + bottom) / 2
			top, bottom = mid-b.lk.overlapW/2, mid+b.lk.overlapW/2
		}
		if o.Error {
			errs.rect(left, top, right, bottom)
		} else {
			warns.rect(left, top, right, bottom)
		}
		pairs = append(pairs, fmt.Sprintf("%d-%d", o.A, o.B))
	}
	b.open(group{class: "gl-overlaps", data: []attr{{"data-pairs", strings.Join(pairs, " ")}}})
	if len(errs.cmds) > 0 {
		b.add(shape{class: "gl-overlap", d: errs, stroke: solid(b.lk.errorInk), strokeW: b.lk.overlapW})
	}
	if len(warns.cmds) > 0 {
		w := shape{class: "gl-overlap-warn", d: warns, stroke: solid(b.lk.warnInk), strokeW: b.lk.overlapW}
		w.dash = overlapDash
		b.add(w)
	}
	b.end()
}

// overlapKeys explains the outlines the plot has.
func overlapKeys(os []grid.Overlap, b *builder) []keyEntry {
	var hasErr, hasWarn bool
	for _, o := range os {
		hasErr = hasErr || o.Error
		hasWarn = hasWarn || !o.Error
	}
	outline := func(c rgb, dash []float64) func(b *builder, x0, y0, x1, y1 float64) {
		return func(b *builder, x0, y0, x1, y1 float64) {
			s := shape{d: pathOf(func(p *pathData) { p.rect(x0+2, y0, x1-2, y1) }), stroke: solid(c), strokeW: b.lk.overlapW}
			s.dash = dash
			b.add(s)
		}
	}
	var keys []keyEntry
	if hasErr {
		keys = append(keys, keyEntry{"overlap: partitions of one direction share this band (error)", outline(b.lk.errorInk, nil)})
	}
	if hasWarn {
		keys = append(keys, keyEntry{"shared by a downlink and an uplink partition (TDD only)", outline(b.lk.warnInk, overlapDash)})
	}
	return keys
}
