package render

import (
	"fmt"
	"regexp"

	"gridloom/grid"
)

// Window is the stretch of time and frequency a figure's plot shows: time
// from 0 to Span, frequency from Low up to High, counted from point A. Two
// figures drawn at one width in windows of one Span, one High−Low and one
// Rails have the same scales and their plots in the same place, so that set
// side by side their lattices can be read against each other.
//
// The zero Window fits the plot to the plan, as FitWindow does. A window
// may be larger than the plan in either direction, never smaller: time past
// the plan's span is drawn as such, and spectrum outside the channel as
// outside it.
type Window struct {
	Span      grid.Tc // length of the time axis; 0 is the plan's own span
	Low, High grid.Hz // the frequency axis, from point A; Low == High fits it to the plan
	// Rails is the number of carrier rails to leave room for beside the
	// plot; fewer than the plan's carriers means the plan's. The plot's
	// width depends on it.
	Rails int
}

// maxRails bounds Window.Rails: more rails than any range has data
// spacings is a mistake, not a layout.
const maxRails = 8

// FitWindow returns the window Figure draws r in when Options.Window is
// zero: r's span, and the channel with every carrier, partition and SS/PBCH
// block, padded by 3 % so the channel edges stand clear of the frame.
func FitWindow(r grid.Result) Window {
	lo, hi := spectrumExtent(r)
	pad := max((hi-lo)*3/100, 1)
	return Window{Span: planSpan(r), Low: lo - pad, High: hi + pad, Rails: len(r.Carriers)}
}

// Union returns the smallest window that holds both w and v. A field that
// means "fit the plan" in one (a zero Span, an empty frequency range)
// takes the other's value.
func (w Window) Union(v Window) Window {
	u := Window{Span: max(w.Span, v.Span), Rails: max(w.Rails, v.Rails)}
	switch {
	case w.Low == w.High:
		u.Low, u.High = v.Low, v.High
	case v.Low == v.High:
		u.Low, u.High = w.Low, w.High
	default:
		u.Low, u.High = min(w.Low, v.Low), max(w.High, v.High)
	}
	return u
}

// Shift returns w with its frequency range moved up by d: from one plan's
// point A to another's, or to absolute frequency and back.
func (w Window) Shift(d grid.Hz) Window {
	if w.Low != w.High {
		w.Low, w.High = w.Low+d, w.High+d
	}
	return w
}

// planSpan is the span the plan's lattice covers: the plan's span, or its
// longest partition's, at least 1 ms and at most grid.MaxSpanMs.
func planSpan(r grid.Result) grid.Tc {
	spanMs := max(1, r.Plan.SpanMs)
	for _, l := range r.Partitions {
		spanMs = max(spanMs, l.SpanMs)
	}
	return grid.Tc(min(spanMs, grid.MaxSpanMs)) * grid.TcPerSubframe
}

// spectrumExtent is the frequency range the plan draws: the channel with
// every carrier, partition and SS/PBCH block, or 1 MHz about the centre
// when there is none of them.
func spectrumExtent(r grid.Result) (lo, hi grid.Hz) {
	have := false
	widen := func(a, b grid.Hz) {
		if b <= a {
			return
		}
		if !have {
			lo, hi, have = a, b, true
			return
		}
		lo, hi = min(lo, a), max(hi, b)
	}
	widen(r.Channel.Low, r.Channel.High)
	for _, c := range r.Carriers {
		widen(c.Low, c.High)
	}
	for _, l := range r.Partitions {
		widen(l.Low, l.High)
	}
	if r.SSB != nil {
		widen(r.SSB.Low, r.SSB.High)
	}
	if !have {
		lo, hi = r.Channel.Center-500_000, r.Channel.Center+500_000
	}
	return lo, hi
}

// window resolves opt.Window for r: the fitted window with the fields
// opt.Window sets, or an error when it cannot hold the plan.
func (opt Options) window(r grid.Result) (Window, error) {
	w, fit := opt.Window, FitWindow(r)
	if w.Span < 0 || w.Span > grid.MaxSpanMs*grid.TcPerSubframe {
		return Window{}, fmt.Errorf("render: the window spans %d Tc; it must be 0 (the plan's span) or up to %d ms", w.Span, grid.MaxSpanMs)
	}
	if w.Span == 0 {
		w.Span = fit.Span
	}
	if w.Span < fit.Span {
		return Window{}, fmt.Errorf("render: the window spans %s, shorter than the plan's %s; a window may only extend the plan", fmtMs(w.Span), fmtMs(fit.Span))
	}
	switch {
	case w.Low > w.High:
		return Window{}, fmt.Errorf("render: the window's frequencies run from %s down to %s; Low must be below High", fmtMHz(w.Low), fmtMHz(w.High))
	case w.Low == w.High:
		w.Low, w.High = fit.Low, fit.High
	default:
		if lo, hi := spectrumExtent(r); w.Low > lo || w.High < hi {
			return Window{}, fmt.Errorf("render: the window's frequencies, %s to %s from point A, do not hold the plan's %s to %s; widen it (FitWindow and Union give a window that does)",
				fmtMHz(w.Low), fmtMHz(w.High), fmtMHz(lo), fmtMHz(hi))
		}
	}
	if w.Rails < 0 || w.Rails > maxRails {
		return Window{}, fmt.Errorf("render: the window has room for %d carrier rails; give 0 to %d", w.Rails, maxRails)
	}
	w.Rails = max(w.Rails, fit.Rails)
	return w, nil
}

func fmtMs(t grid.Tc) string {
	return fmt.Sprintf("%g ms", float64(t)/float64(grid.TcPerSubframe))
}

// MaxIDPrefix is the longest Options.IDPrefix, in bytes.
const MaxIDPrefix = 32

var idPrefix = regexp.MustCompile(`^[a-z][a-z0-9-]*$`)

// checkIDPrefix accepts "" or a lower-case letter followed by lower-case
// letters, digits and hyphens: a prefix that keeps every id a valid XML and
// CSS name without escaping.
func checkIDPrefix(p string) error {
	if p == "" || (len(p) <= MaxIDPrefix && idPrefix.MatchString(p)) {
		return nil
	}
	return fmt.Errorf("render: the id prefix %q must be a lower-case letter followed by up to %d lower-case letters, digits and hyphens", shownN(p, 40), MaxIDPrefix-1)
}
