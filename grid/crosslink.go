package grid

import (
	"cmp"
	"fmt"
	"math"
	"slices"
)

// MaxFrameOffsetUs bounds the frame offset between two compared plans: a
// common cycle of two TDD patterns is at most 20 ms (TS 38.213 11.1).
const MaxFrameOffsetUs = 20000

// CrossLinkConflict is an interval in which one plan transmits downlink
// while the other receives uplink: [Start, End) on plan A's time, within
// one cycle of both patterns.
type CrossLinkConflict struct {
	Start, End Tc
	A, B       SymbolDir // Downlink and Uplink, or Uplink and Downlink
}

// CrossLink is what two TDD cells, plan A's and plan B's, do to each other
// when they share an area: B's frame starts Offset after A's (both on
// absolute time), and every interval where one sends downlink while the
// other receives uplink is a cross-link conflict (gNB-to-gNB and
// UE-to-UE interference). Flexible symbols carry neither direction and
// conflict with nothing. An empty Conflicts means the two are aligned.
type CrossLink struct {
	Cycle     Tc // the least common multiple of the two periods, at most 20 ms
	Offset    Tc // B's frame offset, reduced to [0, Cycle)
	Conflicts []CrossLinkConflict
	Total     Tc // the conflicts' length over one cycle
	// PerTenMs is Total scaled to 10 ms (one frame), in Tc; not whole when
	// the cycle does not divide 10 ms.
	PerTenMs float64
}

type dirSeg struct {
	start, end Tc
	dir        SymbolDir
}

// segments lists the directions of one TDD pattern over [0, cycle) as
// runs of one direction, with the exact symbol lengths of its reference
// numerology (the first symbol of each half subframe 16κ longer).
func (t TDD) segments(cycle Tc) []dirSeg {
	var out []dirSeg
	w := walkSymbols(t.Reference)
	for r := 0; w.sym.Start < cycle; r++ {
		d := t.RefDirs[r%len(t.RefDirs)]
		if n := len(out); n > 0 && out[n-1].dir == d {
			out[n-1].end = w.sym.End()
		} else {
			out = append(out, dirSeg{w.sym.Start, w.sym.End(), d})
		}
		w.next()
	}
	return out
}

func gcdTc(a, b Tc) Tc {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// CrossLinkConflicts puts the TDD patterns of two plans on absolute time,
// B's frame offsetUs microseconds after A's (negative: before), and lists
// where their directions clash. The offset is rounded to the nearest Tc
// (1 µs = 1966.08 Tc).
func CrossLinkConflicts(a, b TDD, offsetUs float64) (CrossLink, error) {
	if math.IsNaN(offsetUs) || math.Abs(offsetUs) > MaxFrameOffsetUs {
		return CrossLink{}, fmt.Errorf("b.frameOffsetUs must be from −%d to %d µs; got %g.", MaxFrameOffsetUs, MaxFrameOffsetUs, offsetUs)
	}
	if a.Period <= 0 || b.Period <= 0 || len(a.RefDirs) == 0 || len(b.RefDirs) == 0 {
		return CrossLink{}, fmt.Errorf("Both plans need a valid TDD pattern to compare their directions.")
	}
	cycle := a.Period / gcdTc(a.Period, b.Period) * b.Period
	off := Tc(math.Round(offsetUs * float64(TcPerSecond) / 1e6))
	off = ((off % cycle) + cycle) % cycle
	out := CrossLink{Cycle: cycle, Offset: off}

	as := a.segments(cycle)
	var bs []dirSeg
	for _, s := range b.segments(cycle) {
		s.start, s.end = s.start+off, s.end+off
		switch {
		case s.start >= cycle:
			s.start, s.end = s.start-cycle, s.end-cycle
			bs = append(bs, s)
		case s.end > cycle:
			bs = append(bs, dirSeg{s.start, cycle, s.dir}, dirSeg{0, s.end - cycle, s.dir})
		default:
			bs = append(bs, s)
		}
	}
	slices.SortFunc(bs, func(x, y dirSeg) int { return cmp.Compare(x.start, y.start) })

	// Sweep both lists of runs, which each tile [0, cycle).
	i, j := 0, 0
	for i < len(as) && j < len(bs) {
		x, y := as[i], bs[j]
		lo, hi := max(x.start, y.start), min(x.end, y.end)
		if lo < hi && (x.dir == Downlink && y.dir == Uplink || x.dir == Uplink && y.dir == Downlink) {
			if n := len(out.Conflicts); n > 0 && out.Conflicts[n-1].End == lo && out.Conflicts[n-1].A == x.dir {
				out.Conflicts[n-1].End = hi
			} else {
				out.Conflicts = append(out.Conflicts, CrossLinkConflict{Start: lo, End: hi, A: x.dir, B: y.dir})
			}
			out.Total += hi - lo
		}
		if x.end <= y.end {
			i++
		} else {
			j++
		}
	}
	out.PerTenMs = float64(out.Total) * float64(10*TcPerSubframe) / float64(cycle)
	return out, nil
}
