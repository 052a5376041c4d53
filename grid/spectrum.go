package grid

import (
	"cmp"
	"math"
	"slices"
)

// The facts about how a plan spends its channel live here, once, so that the
// figure, the page and the comparison of two plans cannot tell three stories.

// Span is a half-open frequency interval [Low, High) on the point A axis.
type Span struct{ Low, High Hz }

// Width is High − Low, or 0 for an empty or inverted span.
func (s Span) Width() Hz { return max(s.High-s.Low, 0) }

// Spectrum divides the channel: the guardbands from each channel edge to the
// outermost carrier or partition, the stretches between them that no
// partition covers, and what the partitions cover. Within a channel of
// positive width LowGuard + HighGuard + the Unused spans + Used is the
// channel bandwidth.
type Spectrum struct {
	// Inner runs from the lowest to the highest edge of any carrier or
	// partition, clipped to the channel; empty when there is none.
	Inner Span
	// LowGuard and HighGuard run from the channel edges to Inner; zero
	// width when a carrier or partition reaches the edge (or beyond it).
	LowGuard, HighGuard Span
	// Unused lists the stretches of Inner that no partition covers,
	// ascending; with no carrier and no partition it is the whole channel.
	Unused []Span
	// Used is the width of the union of the partitions within the channel.
	Used Hz
}

// Guards lists the guardbands of positive width, lower first.
func (s Spectrum) Guards() []Span {
	var out []Span
	for _, g := range []Span{s.LowGuard, s.HighGuard} {
		if g.Width() > 0 {
			out = append(out, g)
		}
	}
	return out
}

// UnusedWidth is the total width of the Unused spans.
func (s Spectrum) UnusedWidth() Hz {
	var w Hz
	for _, u := range s.Unused {
		w += u.Width()
	}
	return w
}

// spectrumOf measures the channel's spectrum for the placed carriers and
// partitions.
func spectrumOf(ch Channel, cs []Carrier, ls []Lattice) Spectrum {
	var s Spectrum
	if ch.High <= ch.Low {
		return s
	}
	inner := Span{ch.High, ch.Low}
	for _, c := range cs {
		inner = Span{min(inner.Low, c.Low), max(inner.High, c.High)}
	}
	for _, l := range ls {
		inner = Span{min(inner.Low, l.Low), max(inner.High, l.High)}
	}
	inner = Span{max(inner.Low, ch.Low), min(inner.High, ch.High)}
	if inner.High <= inner.Low {
		// No carrier or partition, or none reaching into the channel: the
		// whole channel is unused and nothing bounds a guardband.
		s.Unused = []Span{{ch.Low, ch.High}}
		return s
	}
	s.Inner = inner
	s.LowGuard = Span{ch.Low, inner.Low}
	s.HighGuard = Span{inner.High, ch.High}
	parts := make([]Span, 0, len(ls))
	for _, l := range ls {
		parts = append(parts, Span{l.Low, l.High})
	}
	slices.SortFunc(parts, func(a, b Span) int { return cmp.Compare(a.Low, b.Low) })
	reach := inner.Low
	for _, p := range parts {
		if p.Low > reach && reach < inner.High {
			s.Unused = append(s.Unused, Span{reach, min(p.Low, inner.High)})
		}
		if lo, hi := max(p.Low, reach), min(p.High, inner.High); hi > lo {
			s.Used += hi - lo
		}
		reach = max(reach, p.High)
	}
	if reach < inner.High {
		s.Unused = append(s.Unused, Span{reach, inner.High})
	}
	return s
}

// usePercent is the share of the channel that the partitions cover, in
// percent rounded to two decimals.
func usePercent(ch Channel, s Spectrum) float64 {
	if ch.High <= ch.Low {
		return 0
	}
	return math.Round(float64(s.Used)/float64(ch.High-ch.Low)*1e4) / 100
}

// FreeRun proposes where a new partition of a spacing goes: the longest run
// of CRBs of that spacing's carrier that no partition covers, kept one PRB
// of the wider spacing away from partitions of other spacings (the
// numerology gap, common practice). With no free CRB it is one CRB just
// above the highest partition, so that the findings can say why it does not
// fit. ok is false when the result has no carrier of the spacing.
func (r Result) FreeRun(scsKHz int) (start, size int, ok bool) {
	c, ok := r.Carrier(scsKHz)
	if !ok {
		return 0, 0, false
	}
	free := func(n int) bool {
		lo, hi := CRBEdge(scsKHz, n), CRBEdge(scsKHz, n+1)
		for _, l := range r.Partitions {
			guard := Hz(0)
			if other := l.Numerology.SCSKHz(); other != scsKHz {
				guard = Hz(max(other, scsKHz)) * 12 * 1000
			}
			if lo < l.High+guard && hi > l.Low-guard {
				return false
			}
		}
		return true
	}
	run := 0
	end := c.OffsetToCarrier + c.CarrierBandwidth
	for n := c.OffsetToCarrier; n < end; n++ {
		if !free(n) {
			run = 0
			continue
		}
		run++
		if run > size {
			start, size = n-run+1, run
		}
	}
	if size > 0 {
		return start, size, true
	}
	if len(r.Partitions) == 0 { // an empty carrier: nothing to go above
		return c.OffsetToCarrier, 1, true
	}
	top := slices.MaxFunc(r.Partitions, func(a, b Lattice) int { return cmp.Compare(a.High, b.High) })
	return firstCRBAbove(scsKHz, top.High), 1, true
}

// firstCRBAbove is the lowest CRB of a spacing whose lower edge is at or above f.
func firstCRBAbove(scsKHz int, f Hz) int {
	step := Hz(scsKHz) * 12 * 1000
	// CRBEdge(n) = n·step − scs/2 ≥ f  ⇔  n ≥ (f + scs/2)/step
	x := f + Hz(scsKHz)*500
	n := x / step
	if x%step != 0 && x > 0 {
		n++
	}
	return int(n)
}

// LookupRange reads a frequency range name in any letter case; "" is the
// default range. It is the reading Compute applies to carrier.range.
func LookupRange(s string) (Range, bool) {
	if s == "" {
		s = DefaultRange
	}
	return parseFold(s, RangeNames(), ParseRange)
}

// SCSInUse lists the subcarrier spacings of the plan's partitions that are
// data spacings of its range (FR1 when the range is not one), ascending and
// each once: the spacings whose tables bound the channel bandwidth.
func (p Plan) SCSInUse() []int {
	rng, ok := LookupRange(p.Carrier.Range)
	if !ok {
		rng = FR1
	}
	data := rng.table().scsKHz
	var out []int
	for _, pp := range p.Partitions {
		if slices.Contains(data, pp.SCSKHz) && !slices.Contains(out, pp.SCSKHz) {
			out = append(out, pp.SCSKHz)
		}
	}
	slices.Sort(out)
	return out
}

// CommonBandwidths lists the channel bandwidths (MHz, ascending) that every
// given spacing allows in the range, TS 38.101-1/-2 Table 5.3.5-1; with no
// spacing, all of the range's. It is empty when the spacings share none.
func (r Range) CommonBandwidths(scsKHz []int) []int {
	if len(scsKHz) == 0 {
		return r.AllBandwidths()
	}
	allowed := r.Bandwidths(scsKHz[0])
	for _, scs := range scsKHz[1:] {
		other := r.Bandwidths(scs)
		allowed = slices.DeleteFunc(allowed, func(bw int) bool { return !slices.Contains(other, bw) })
	}
	return allowed
}
