package render

import (
	"fmt"
	"strings"

	"gridloom/grid"
)

// The cross-link layer marks, on one side of a comparison, where the two
// plans' TDD patterns clash (grid.CrossLinkConflicts): a translucent band
// over the plot's whole height for every conflict, repeated every cycle
// across the time axis. It is drawn only when Options.CrossLink names the
// engine's list, and from that list alone, never from what else is drawn.

// CrossLinkMarks is the comparison's cross-link layer for one figure.
type CrossLinkMarks struct {
	// Link is the engine's list of conflicts on plan A's time; nil draws
	// nothing.
	Link *grid.CrossLink
	// SideB draws them on plan B's time: B's frame starts Link.Offset
	// after A's, so every conflict comes that much earlier on B's axis.
	SideB bool
}

// crossLinkFill is the bands' tint; the marks belong to the comparison page
// only (its downloads are drawn without them), so both themes keep the
// on-screen colour.
var crossLinkFill = paint{kind: paintSolid, rgb: rgb{0xb0, 0x2a, 0x20}, alpha: 0.16}

// check refuses a list the engine cannot have made: one whose cycle is
// shorter than the shortest TDD period (0.5 ms, TS 38.331
// dl-UL-TransmissionPeriodicity), whose offset is outside the cycle, or
// whose conflicts do not lie in it, so that the marks stay few.
func (m CrossLinkMarks) check() error {
	x := m.Link
	if x == nil {
		return nil
	}
	if x.Cycle < grid.TcPerHalfFrame || x.Offset < 0 || x.Offset >= x.Cycle {
		return fmt.Errorf("render: the cross-link cycle is %d Tc with offset %d Tc; the cycle must be at least 0.5 ms (%d Tc) and the offset within it", x.Cycle, x.Offset, grid.TcPerHalfFrame)
	}
	for i, k := range x.Conflicts {
		if k.Start < 0 || k.End <= k.Start || k.End > x.Cycle {
			return fmt.Errorf("render: cross-link conflict %d runs from %d to %d Tc, outside the cycle of %d Tc", i, k.Start, k.End, x.Cycle)
		}
	}
	return nil
}

// drawCrossLink marks the conflicts of m over the plot, one path for all of
// them: <g class="gl-xl-marks"> with data-start-tc and data-end-tc (each
// band's times on this figure's axis, space-separated, in the order of the
// conflicts and then of the cycles), which the pointer passes through.
func drawCrossLink(b *builder, f frame, m CrossLinkMarks) {
	x := m.Link
	if x == nil || len(x.Conflicts) == 0 {
		return
	}
	shift := grid.Tc(0)
	if m.SideB {
		shift = x.Offset
	}
	var d pathData
	var starts, ends []string
	top, bottom := float64(f.y), f.bottom()
	for _, k := range x.Conflicts {
		// The conflict repeats every cycle; its first start on this axis.
		s := ((k.Start-shift)%x.Cycle + x.Cycle) % x.Cycle
		for t := s - x.Cycle; t < f.span; t += x.Cycle {
			lo, hi := max(t, 0), min(t+(k.End-k.Start), f.span)
			if lo >= hi {
				continue
			}
			d.rect(f.X(lo), top, f.X(hi), bottom)
			starts, ends = append(starts, fmt.Sprint(int64(lo))), append(ends, fmt.Sprint(int64(hi)))
		}
	}
	b.open(group{class: "gl-xl-marks", data: []attr{{"pointer-events", "none"}, {"data-testid", "crosslink-marks"},
		{"data-start-tc", strings.Join(starts, " ")}, {"data-end-tc", strings.Join(ends, " ")}}})
	b.add(shape{class: "gl-xl-mark", d: d, fill: crossLinkFill})
	b.end()
}
