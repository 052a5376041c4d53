package planform

import (
	"fmt"
	"math"
	"net/url"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/render"
)

// The comparison holds two plans in one link: plan A's keys after "a.",
// plan B's after "b." (a.name, b.p0.scs, a.op …), and the figure options,
// which both figures share, under their own "fig." keys.

// KeyFrameOffset is the comparison's frame offset: plan B's frame starts
// this many µs after plan A's on absolute time (negative: before), for the
// cross-link conflicts of synchronised TDD (issue 17). The key is a contract.
const KeyFrameOffset = "b.frameOffsetUs"

// Sides are the key prefixes of the comparison's two plans, A then B.
var Sides = [2]string{"a", "b"}

// prefixQuery puts prefix before every key of a query that Form.Query
// wrote; its keys are plain and its values escaped, so "&" and "=" split
// it exactly.
func prefixQuery(q, prefix string) string {
	if q == "" {
		return ""
	}
	parts := strings.Split(q, "&")
	for i, p := range parts {
		parts[i] = prefix + p
	}
	return strings.Join(parts, "&")
}

// CompareQuery is the link of a comparison of a and b.
func CompareQuery(a, b Form, ff FigureForm) string {
	return JoinQuery(prefixQuery(a.Query(), "a."), prefixQuery(b.Query(), "b."), ff.Query())
}

// CopyOf is f renamed as its copy: the B that "compare with…" opens.
func CopyOf(f Form) Form {
	g := f.Clone()
	const suffix = " (copy)"
	name := strings.TrimSpace(f.Name)
	if name == "" {
		name = "Untitled plan"
	}
	g.Name = Truncate(name, grid.MaxNameLen-len(suffix)) + suffix
	return g
}

// sideValues are the keys of one side, without its prefix.
func sideValues(q url.Values, side string) url.Values {
	out := url.Values{}
	for k, v := range q {
		if rest, ok := strings.CutPrefix(k, side+"."); ok {
			out[rest] = v
		}
	}
	return out
}

// Compare is both plans of a comparison, computed, with the figure options
// they share.
type Compare struct {
	Sides   [2]State
	Fig     FigureForm
	Focus   string // the control to focus after an edit, with its side's prefix
	LinkErr string // a sentence about a link that does not parse as a whole, or ""
	// FrameOffset is b.frameOffsetUs as typed ("" for 0), FrameOffsetUs
	// its value once read, and FrameOffsetErr the sentence when it does not
	// read (then FrameOffsetUs is 0).
	FrameOffset    string
	FrameOffsetUs  float64
	FrameOffsetErr string
}

// Query is the canonical link of c.
func (c Compare) Query() string {
	return JoinQuery(CompareQuery(c.Sides[0].Form, c.Sides[1].Form, c.Fig), frameOffsetQuery(c.FrameOffset))
}

// SwapQuery is the link of the comparison with A and B swapped: B's frame
// offset against A becomes A's against B, its negative.
func (c Compare) SwapQuery() string {
	off := c.FrameOffset
	if c.FrameOffsetErr == "" && c.FrameOffsetUs != 0 {
		off = strconv.FormatFloat(-c.FrameOffsetUs, 'f', -1, 64)
	}
	return JoinQuery(CompareQuery(c.Sides[1].Form, c.Sides[0].Form, c.Fig), frameOffsetQuery(off))
}

func frameOffsetQuery(v string) string {
	if v == "" {
		return ""
	}
	return url.Values{KeyFrameOffset: {v}}.Encode()
}

// Invalid reports whether the page of c answers 422: the link, the frame
// offset or either side has a problem.
func (c Compare) Invalid() bool {
	return c.LinkErr != "" || c.FrameOffsetErr != "" || c.Sides[0].Invalid() || c.Sides[1].Invalid()
}

// readFrameOffset reads b.frameOffsetUs: a number of µs within
// ±grid.MaxFrameOffsetUs (a common cycle of two TDD patterns is at most 20 ms).
func readFrameOffset(v string) (float64, string) {
	if v == "" {
		return 0, ""
	}
	x, err := strconv.ParseFloat(strings.TrimSpace(v), 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) || math.Abs(x) > grid.MaxFrameOffsetUs {
		return 0, fmt.Sprintf("The frame offset (%s) must be a number of µs from −%d to %d; got %q.", KeyFrameOffset, grid.MaxFrameOffsetUs, grid.MaxFrameOffsetUs, Truncate(v, 40))
	}
	return x, ""
}

// CrossLink puts both plans' TDD patterns on absolute time, B's frame
// FrameOffsetUs after A's, and lists their cross-link conflicts. ok is
// false, with the sentence why, when the two cannot be set against each
// other: a side without a TDD pattern, or an offset that does not read.
func (c Compare) CrossLink() (x grid.CrossLink, why string, ok bool) {
	if c.FrameOffsetErr != "" {
		return x, c.FrameOffsetErr, false
	}
	ta, tb := c.Sides[0].Result.TDD, c.Sides[1].Result.TDD
	switch {
	case ta == nil && tb == nil:
		return x, "Neither plan has a TDD pattern, so neither switches direction and there is no cross-link conflict to find.", false
	case ta == nil:
		return x, "Plan A has no TDD pattern; give it one (tdd.*) to set its directions against plan B's.", false
	case tb == nil:
		return x, "Plan B has no TDD pattern; give it one (tdd.*) to set its directions against plan A's.", false
	}
	x, err := grid.CrossLinkConflicts(*ta, *tb, c.FrameOffsetUs)
	if err != nil {
		return x, err.Error(), false
	}
	return x, "", true
}

// ReadCompare reads a comparison's raw query and applies each side's op.
// opErr is the last op that failed.
func ReadCompare(raw string) (c Compare, opErr error) {
	q, err := url.ParseQuery(raw)
	if err != nil {
		c.LinkErr = fmt.Sprintf("Part of the link could not be read (%s), so a value it holds may be missing from the forms; check them against the plans you meant.", err)
	}
	c.Fig = ParseFigureForm(q)
	c.FrameOffset = q.Get(KeyFrameOffset)
	c.FrameOffsetUs, c.FrameOffsetErr = readFrameOffset(c.FrameOffset)
	for i, side := range Sides {
		sv := sideValues(q, side)
		f, msgs := ParseQuery(sv)
		st, focus, err := WithOp(f, msgs, sv.Get(KeyOp), c.Fig)
		if err != nil {
			opErr = err
		}
		if focus != "" {
			c.Focus = side + "-" + focus
		}
		c.Sides[i] = st
	}
	return c, opErr
}

// SharedWindows are the windows of the two plans' figures on one pair of
// scales: the union of both fitted windows, in absolute frequency when
// both channels have one, otherwise from each plan's point A.
func SharedWindows(ra, rb grid.Result) (wa, wb render.Window, absolute bool) {
	fa, fb := render.FitWindow(ra), render.FitWindow(rb)
	if ra.Channel.Absolute && rb.Channel.Absolute {
		pa, pb := ra.Channel.PointAHz, rb.Channel.PointAHz
		u := fa.Shift(pa).Union(fb.Shift(pb))
		return u.Shift(-pa), u.Shift(-pb), true
	}
	u := fa.Union(fb)
	return u, u, false
}

// SideOptions are the figure options of side i on the shared scales.
func (c Compare) SideOptions(i int) render.Options {
	wa, wb, absolute := SharedWindows(c.Sides[0].Result, c.Sides[1].Result)
	opt := c.Sides[i].Fig.Opt
	opt.Window = [2]render.Window{wa, wb}[i]
	opt.FromPointA = !absolute
	return opt
}
