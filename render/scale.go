package render

import (
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"gridloom/grid"
)

// frame maps the plot area: time [0, span) across [x, x+w), frequency
// [low, high) up from y+h to y. It is what the gl-plot group publishes in
// its data attributes.
type frame struct {
	x, y, w, h int // px
	span       grid.Tc
	low, high  grid.Hz // relative to point A
	planSpan   grid.Tc // the plan's span, at most span; the rest is past it
	rails      int     // carrier rails beside the plot
	timeUnit   TimeUnit
}

// pastPlan reports whether the plot runs on past the plan's span.
func (f frame) pastPlan() bool { return f.planSpan < f.span }

// planRight is the position of the end of the plan's span.
func (f frame) planRight() float64 { return min(f.right(), f.X(f.planSpan)) }

// X is the position of instant t.
func (f frame) X(t grid.Tc) float64 {
	return float64(f.x) + float64(t)*float64(f.w)/float64(f.span)
}

// Y is the position of frequency hz.
func (f frame) Y(hz grid.Hz) float64 {
	return float64(f.y+f.h) - float64(hz-f.low)*float64(f.h)/float64(f.high-f.low)
}

// pxPerTc and pxPerHz are the scales of the two axes.
func (f frame) pxPerTc() float64 { return float64(f.w) / float64(f.span) }
func (f frame) pxPerHz() float64 { return float64(f.h) / float64(f.high-f.low) }

func (f frame) right() float64  { return float64(f.x + f.w) }
func (f frame) bottom() float64 { return float64(f.y + f.h) }

// niceStep is the smallest 1, 2 or 5 × 10^k that is at least least.
func niceStep(least float64) float64 {
	if !(least > 0) || math.IsInf(least, 0) {
		return 1
	}
	e := math.Pow(10, math.Floor(math.Log10(least)))
	for _, m := range []float64{1, 2, 5} {
		if m*e >= least*(1-1e-12) {
			return m * e
		}
	}
	return 10 * e
}

// ticks lists the multiples of step in [lo, hi], computed from integers so
// no error accumulates.
func ticks(lo, hi, step float64) []float64 {
	var out []float64
	for i := math.Ceil(lo/step - 1e-9); i*step <= hi+step*1e-9; i++ {
		out = append(out, i*step)
	}
	return out
}

// decimals is how many decimals a tick label needs at step.
func decimals(step float64) int {
	return max(0, int(math.Ceil(-math.Log10(step)-1e-9)))
}

func fmtTick(v float64, step float64) string {
	s := strconv.FormatFloat(v, 'f', decimals(step), 64)
	if strings.Trim(s, "-0.") == "" {
		return "0"
	}
	return minus(s)
}

// minus sets a typographic minus sign.
func minus(s string) string {
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

// fmtSpan formats a bandwidth: kHz below 1 MHz, MHz above, exact.
func fmtSpan(f grid.Hz) string {
	if f < 1_000_000 && f > -1_000_000 {
		return minus(strconv.FormatFloat(f.KHz(), 'f', -1, 64)) + " kHz"
	}
	return minus(strconv.FormatFloat(f.MHz(), 'f', -1, 64)) + " MHz"
}

// fmtMHz formats a frequency in MHz to the Hz.
func fmtMHz(f grid.Hz) string {
	return minus(strconv.FormatFloat(f.MHz(), 'f', -1, 64)) + " MHz"
}

// maxShownName bounds a name in the figure; Compute flags longer names but
// still places the partition, and the CSV keeps the whole name.
const maxShownName = 40

// shown shortens untrusted text for the figure. The result still goes only
// through svgo's escaping text functions.
func shown(s string) string { return shownN(s, maxShownName) }

// shownN keeps the first n runes of s, ending in "…" when it cut.
func shownN(s string, n int) string {
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	k := 0
	for i := range s {
		if k == n-1 {
			return s[:i] + "…"
		}
		k++
	}
	return s
}
