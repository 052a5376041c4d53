// Package render draws a grid.Result: the lattice figure as SVG and the
// symbol table as CSV. It writes to an io.Writer and returns one error.
//
// The figure's cost follows what is drawn, not the size of the lattice:
// each partition is one group with one path per line kind, and a path has
// one segment per line that is at least a few pixels from its neighbours.
// Finer lines give way to coarser ones (PRB rows every few PRBs, slot
// lines instead of symbol lines, 0.5 ms marks alone) and the legend says
// which were drawn.
//
// The plot area is published for scripts that map the pointer to time and
// frequency: the group with id "gl-plot" carries data-x, data-y, data-w and
// data-h (px), data-span-tc (time 0 at x, span at x+w) and data-low-hz and
// data-high-hz (frequency from point A at y+h and at y). Partition i of
// Result.Partitions is drawn inside <g class="gl-part" data-index="i">.
//
// Security: plan and partition names are untrusted. They reach the SVG only
// as element text through svgo's escaping functions (Text, Textspan, Span),
// never inside an attribute, and the CSV neutralises cells a spreadsheet
// would read as a formula.
package render

import (
	"bytes"
	"cmp"
	"fmt"
	"io"
	"slices"
	"strings"

	svg "github.com/ajstarks/svgo"

	"gridloom/grid"
)

// Options shape the figure. The zero value draws the default figure.
type Options struct {
	Width int // figure width in px, MinWidth to MaxWidth; 0 means DefaultWidth
}

// Figure widths, in px.
const (
	DefaultWidth = 1200
	MinWidth     = 640
	MaxWidth     = 4800
)

// Layout of the figure, in px.
const (
	marginLeft    = 92  // frequency tick labels and axis title
	marginTop     = 48  // alignment-mark heading and carrier rail labels
	plotHeight    = 460 // frequency axis
	axisBand      = 58  // time tick labels and axis title below the plot
	railGap       = 10  // plot to carrier rail
	railStep      = 20  // one rail column per carrier
	railBar       = 8   // rail bar width
	notesGap      = 12  // rail to notes
	notesWidth    = 170 // channel-edge, guard and unused notes
	noteSpacing   = 12  // least distance between two notes
	legendLeft    = 24
	partRow       = 32 // one legend row per partition
	keyRow        = 17 // one key row per mark
	keyWidth      = 340
	sideBySide    = 1000 // from this width the key stands beside the partition rows
	maxShownTitle = 120
)

// Figure draws r as a self-contained SVG document: no scripts, external
// fonts, styles or images.
func Figure(w io.Writer, r grid.Result, opt Options) error {
	width := opt.Width
	if width == 0 {
		width = DefaultWidth
	}
	if width < MinWidth || width > MaxWidth {
		return fmt.Errorf("render: the figure width is %d px; it must be 0 (the default, %d px) or from %d to %d px", opt.Width, DefaultWidth, MinWidth, MaxWidth)
	}
	if err := checkNumerologies(r); err != nil {
		return err
	}

	f := plotFrame(r, width)
	details := make([]detail, len(r.Partitions))
	for i, l := range r.Partitions {
		details[i] = chooseDetail(l, f)
	}
	keyBelow := width < sideBySide
	partsH := max(1, len(r.Partitions)) * partRow
	legendH := max(partsH, keyEntries*keyRow)
	if keyBelow {
		legendH = partsH + 12 + keyEntries*keyRow
	}
	legendTop := f.y + f.h + axisBand + 6
	height := legendTop + legendH + 12

	var buf bytes.Buffer
	s := svg.New(&buf)
	s.Start(width, height, fmt.Sprintf(`viewBox="0 0 %d %d"`, width, height), `role="img"`,
		`aria-labelledby="gl-title"`, `aria-describedby="gl-desc"`)
	title := r.Plan.Name
	if strings.TrimSpace(title) == "" {
		title = "gridloom plan"
	}
	textElement(&buf, s, "title", "gl-title", shownN(title, maxShownTitle))
	textElement(&buf, s, "desc", "gl-desc", summary(r))

	s.Def()
	defineFills(s, len(r.Partitions))
	s.DefEnd()

	s.Group(`font-family="sans-serif"`, `font-size="11"`, `fill="`+inkText+`"`)
	s.Rect(0, 0, width, height, `fill="#ffffff"`)
	drawPlot(s, f, r, details)
	drawAxes(s, f, r.Channel)
	drawRail(s, f, r)
	drawLegend(s, r, details, width, legendTop, keyBelow)
	s.Gend()
	s.End()

	_, err := w.Write(buf.Bytes())
	return err
}

// checkNumerologies refuses a result that Compute cannot have made: one
// with a numerology outside TS 38.211 Table 4.2-1, whose symbols are undefined.
func checkNumerologies(r grid.Result) error {
	for i, l := range r.Partitions {
		if !l.Numerology.Valid() {
			return fmt.Errorf("render: partition %d has numerology μ=%d with %s CP, which TS 38.211 Table 4.2-1 does not define", i, l.Numerology.Mu, l.Numerology.CP)
		}
	}
	return nil
}

// textElement writes <tag id="id">text</tag>, the text escaped by svgo.
func textElement(buf *bytes.Buffer, s *svg.SVG, tag, id, text string) {
	fmt.Fprintf(buf, `<%s id="%s">`, tag, id)
	s.Span(text)
	fmt.Fprintf(buf, "</%s>\n", tag)
}

// plotFrame places the plot area and its axes' ranges: the span, and the
// channel with every carrier and partition, padded by 3 % so the channel
// edges stand clear of the frame.
func plotFrame(r grid.Result, width int) frame {
	spanMs := max(1, r.Plan.SpanMs)
	for _, l := range r.Partitions {
		spanMs = max(spanMs, l.SpanMs)
	}
	spanMs = min(spanMs, grid.MaxSpanMs)

	lo, hi, have := grid.Hz(0), grid.Hz(0), false
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
	if !have {
		lo, hi = r.Channel.Center-500_000, r.Channel.Center+500_000
	}
	pad := max((hi-lo)*3/100, 1)
	right := railGap + len(r.Carriers)*railStep + notesGap + notesWidth
	return frame{x: marginLeft, y: marginTop, w: width - marginLeft - right, h: plotHeight,
		span: grid.Tc(spanMs) * grid.TcPerSubframe, low: lo - pad, high: hi + pad}
}

// span is a half-open frequency interval.
type span struct{ lo, hi grid.Hz }

// spectrum splits the channel into the guardbands at its edges (from each
// edge to the outermost carrier or partition) and the unused stretches
// between them that no partition covers.
func spectrum(r grid.Result) (guards, unused []span) {
	ch := r.Channel
	if ch.High <= ch.Low {
		return nil, nil
	}
	inner := span{ch.High, ch.Low} // the outermost carrier and partition edges
	for _, c := range r.Carriers {
		inner = span{min(inner.lo, c.Low), max(inner.hi, c.High)}
	}
	for _, l := range r.Partitions {
		inner = span{min(inner.lo, l.Low), max(inner.hi, l.High)}
	}
	if inner.hi <= inner.lo {
		return nil, []span{{ch.Low, ch.High}}
	}
	inner = span{max(inner.lo, ch.Low), min(inner.hi, ch.High)}
	if inner.lo > ch.Low {
		guards = append(guards, span{ch.Low, inner.lo})
	}
	if inner.hi < ch.High {
		guards = append(guards, span{inner.hi, ch.High})
	}
	parts := make([]span, 0, len(r.Partitions))
	for _, l := range r.Partitions {
		parts = append(parts, span{l.Low, l.High})
	}
	slices.SortFunc(parts, func(a, b span) int { return cmp.Compare(a.lo, b.lo) })
	reach := inner.lo
	for _, p := range parts {
		if p.lo > reach && reach < inner.hi {
			unused = append(unused, span{reach, min(p.lo, inner.hi)})
		}
		reach = max(reach, p.hi)
	}
	if reach < inner.hi {
		unused = append(unused, span{reach, inner.hi})
	}
	return guards, unused
}

// drawPlot draws the plot area inside the gl-plot group.
func drawPlot(s *svg.SVG, f frame, r grid.Result, details []detail) {
	s.Group(`id="gl-plot"`, fmt.Sprintf(`data-x="%d"`, f.x), fmt.Sprintf(`data-y="%d"`, f.y),
		fmt.Sprintf(`data-w="%d"`, f.w), fmt.Sprintf(`data-h="%d"`, f.h),
		fmt.Sprintf(`data-span-tc="%d"`, f.span), fmt.Sprintf(`data-low-hz="%d"`, f.low),
		fmt.Sprintf(`data-high-hz="%d"`, f.high))
	left, right := float64(f.x), f.right()

	var whole pathData
	whole.rect(left, float64(f.y), right, f.bottom())
	s.Path(whole.String(), `class="gl-outside"`, `fill="url(#gl-outside)"`)

	ch := r.Channel
	guards, unused := spectrum(r)
	if ch.High > ch.Low {
		var inside pathData
		inside.rect(left, f.Y(ch.High), right, f.Y(ch.Low))
		s.Path(inside.String(), `class="gl-channel"`, `fill="#ffffff"`)
	}
	var g, u pathData
	for _, sp := range guards {
		g.rect(left, f.Y(sp.hi), right, f.Y(sp.lo))
	}
	for _, sp := range unused {
		u.rect(left, f.Y(sp.hi), right, f.Y(sp.lo))
	}
	if g.segs > 0 {
		s.Path(g.String(), `class="gl-guard"`, `fill="`+inkGuard+`"`)
	}
	if u.segs > 0 {
		s.Path(u.String(), `class="gl-unused"`, `fill="url(#gl-unused)"`)
	}

	for i, l := range r.Partitions {
		drawPartition(s, f, i, l, details[i])
	}

	// Every numerology starts a symbol at every 0.5 ms (TS 38.211 5.3.1).
	var marks, heads pathData
	for t := grid.TcPerHalfFrame; t < f.span; t += grid.TcPerHalfFrame {
		x := f.X(t)
		marks.vline(x, float64(f.y), f.bottom())
		heads.b = fmt.Appendf(heads.b, "M%s %dH%sL%s %dZ", num(x-4), f.y-8, num(x+4), num(x), f.y-1)
	}
	if marks.segs > 0 {
		s.Path(marks.String(), `class="gl-align"`, `fill="none"`, `stroke="#000000"`,
			`stroke-width="1.3"`, `stroke-dasharray="6 3"`)
		s.Path(heads.String(), `class="gl-align-heads"`, `fill="#000000"`)
	}

	if ch.High > ch.Low {
		var edges pathData
		edges.hline(f.Y(ch.High), left, right)
		edges.hline(f.Y(ch.Low), left, right)
		s.Path(edges.String(), `class="gl-edges"`, `fill="none"`, `stroke="#000000"`, `stroke-width="2"`)
	}
	s.Path(whole.String(), `class="gl-frame"`, `fill="none"`, `stroke="`+inkSoft+`"`, `stroke-width="1"`)
	s.Gend()
}

// drawAxes draws the time axis below the plot and the frequency axis to its
// left, each with a title naming its unit.
func drawAxes(s *svg.SVG, f frame, ch grid.Channel) {
	var tickMarks pathData
	s.Group(`class="gl-axes"`, `font-size="10"`)

	// Time: µs up to 2 ms, ms beyond; ticks at least 70 px apart.
	unit, unitTc := "ms", float64(grid.TcPerSubframe)
	if f.span <= 2*grid.TcPerSubframe {
		unit, unitTc = "µs", float64(grid.TcPerSubframe)/1000
	}
	spanU := float64(f.span) / unitTc
	step := niceStep(70 / (float64(f.w) / spanU))
	for _, v := range ticks(0, spanU, step) {
		x := float64(f.x) + v/spanU*float64(f.w)
		tickMarks.vline(x, f.bottom(), f.bottom()+5)
		s.Text(int(x+0.5), f.y+f.h+18, fmtTick(v, step), `text-anchor="middle"`)
	}
	s.Text(f.x+f.w/2, f.y+f.h+40, "time ("+unit+")", `text-anchor="middle"`, `font-size="12"`)

	// Frequency: MHz, absolute when the plan fixes the channel centre,
	// otherwise from point A; ticks at least 36 px apart.
	toV := func(hz grid.Hz) float64 { return hz.MHz() }
	fromV := func(v float64) grid.Hz { return grid.Hz(v * 1e6) }
	title := "frequency from point A (MHz)"
	if ch.Absolute {
		toV = func(hz grid.Hz) float64 { return ch.Abs(hz).MHz() }
		fromV = func(v float64) grid.Hz { return grid.Hz(v*1e6) - ch.PointAHz }
		title = "frequency (MHz)"
	}
	lo, hi := toV(f.low), toV(f.high)
	fstep := niceStep(36 / (float64(f.h) / (hi - lo)))
	for _, v := range ticks(lo, hi, fstep) {
		y := f.Y(fromV(v))
		tickMarks.hline(y, float64(f.x)-5, float64(f.x))
		s.Text(f.x-8, int(y+3.5), fmtTick(v, fstep), `text-anchor="end"`)
	}
	mid := f.y + f.h/2
	s.Text(18, mid, title, `text-anchor="middle"`, `font-size="12"`, fmt.Sprintf(`transform="rotate(-90 18 %d)"`, mid))
	s.Path(tickMarks.String(), `fill="none"`, `stroke="`+inkText+`"`, `stroke-width="1"`)

	// Heading of the 0.5 ms marks, above the plot.
	if f.span > grid.TcPerHalfFrame {
		s.Path(fmt.Sprintf("M%d %dH%dL%d %dZ", f.x, f.y-30, f.x+8, f.x+4, f.y-23), `fill="#000000"`)
		s.Text(f.x+13, f.y-23, "0.5 ms alignment marks (dashed): every numerology starts a symbol together here", `font-size="11"`)
	}
	s.Gend()
}

// note is one line of text beside the rail, pointing at a frequency.
type note struct {
	y    float64 // the frequency's position
	text string
}

// drawRail draws one bar per SCS-specific carrier with its minimum
// guardbands at both channel edges, and the notes on the channel edges,
// guardbands and unused spectrum, spread so they never overlap.
func drawRail(s *svg.SVG, f frame, r grid.Result) {
	ch := r.Channel
	railX := f.x + f.w + railGap
	notesX := railX + len(r.Carriers)*railStep + notesGap

	var notes []note
	where := func(hz grid.Hz) string {
		if ch.Absolute {
			return fmtMHz(ch.Abs(hz))
		}
		return fmtMHz(hz) + " from A"
	}
	if ch.High > ch.Low {
		notes = append(notes, note{f.Y(ch.High), "channel edge " + where(ch.High)},
			note{f.Y(ch.Low), "channel edge " + where(ch.Low)})
	}
	if 0 >= f.low && 0 < f.high {
		text := "point A"
		if ch.Absolute {
			text += " " + fmtMHz(ch.PointAHz)
		}
		notes = append(notes, note{f.Y(0), text})
	}
	guards, unused := spectrum(r)
	for _, g := range guards {
		notes = append(notes, note{(f.Y(g.lo) + f.Y(g.hi)) / 2, "guard " + fmtSpan(g.hi-g.lo)})
	}
	for _, u := range unused {
		notes = append(notes, note{(f.Y(u.lo) + f.Y(u.hi)) / 2, "unused " + fmtSpan(u.hi-u.lo)})
	}
	placed := spread(notes, float64(f.y-12), f.bottom()+float64(axisBand)-8)

	s.Group(`class="gl-rail"`, `font-size="10"`)
	var leaders pathData
	for i, n := range notes {
		leaders.b = fmt.Appendf(leaders.b, "M%s %sH%dL%d %s", num(f.right()), num(n.y), notesX-14, notesX-3, num(placed[i]))
	}
	if len(notes) > 0 {
		s.Path(string(leaders.b), `fill="none"`, `stroke="`+inkSoft+`"`, `stroke-width="0.6"`)
	}
	for i, n := range notes {
		s.Text(notesX, int(placed[i]+3.5), n.text)
	}

	var bars, keep pathData
	for j, c := range r.Carriers {
		x := float64(railX + j*railStep)
		bars.rect(x, f.Y(c.High), x+railBar, f.Y(c.Low))
		if ch.High > ch.Low && c.MinGuard > 0 {
			keep.rect(x, f.Y(ch.Low+c.MinGuard), x+railBar, f.Y(ch.Low))
			keep.rect(x, f.Y(ch.High), x+railBar, f.Y(ch.High-c.MinGuard))
		}
		s.Text(int(x)+railBar/2, f.y-6, fmt.Sprint(c.SCSKHz), `text-anchor="middle"`, `font-size="9"`)
	}
	if bars.segs > 0 {
		s.Path(bars.String(), `class="gl-carriers"`, `fill="#ffffff"`, `stroke="`+inkText+`"`, `stroke-width="1"`)
	}
	if keep.segs > 0 {
		s.Path(keep.String(), `class="gl-minguard"`, `fill="`+inkText+`"`, `fill-opacity="0.8"`)
	}
	s.Gend()
}

// spread moves the notes' positions apart by at least noteSpacing, keeping
// their order and staying within [top, bottom] while there is room.
func spread(notes []note, top, bottom float64) []float64 {
	order := make([]int, len(notes))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(notes[a].y, notes[b].y) })
	ys := make([]float64, len(notes))
	prev := top - noteSpacing
	for _, i := range order {
		ys[i] = max(notes[i].y, prev+noteSpacing)
		prev = ys[i]
	}
	next := bottom + noteSpacing
	for k := len(order) - 1; k >= 0; k-- {
		i := order[k]
		ys[i] = min(ys[i], next-noteSpacing)
		next = ys[i]
	}
	return ys
}

// summary is the one-line description of the figure.
func summary(r grid.Result) string {
	var b strings.Builder
	span := max(1, r.Plan.SpanMs)
	fmt.Fprintf(&b, "%d partition%s over %d ms in a %d MHz %s channel", len(r.Partitions), plural(len(r.Partitions)), span, r.Channel.BandwidthMHz, r.Channel.Range)
	if r.Channel.Absolute {
		fmt.Fprintf(&b, " centred on %s", fmtMHz(r.Channel.CenterHz))
	}
	for i, l := range r.Partitions {
		sep := "; "
		if i == 0 {
			sep = ": "
		}
		fmt.Fprintf(&b, "%s%s (%d kHz, %d PRBs)", sep, shown(l.Name), l.Numerology.SCSKHz(), l.SizePRB)
	}
	b.WriteString(".")
	return b.String()
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// keyEntries is the number of rows in the key of marks.
const keyEntries = 10

// drawLegend draws one row per partition (swatch, name, numerology, size,
// and the detail drawn) and the key of the figure's other marks.
func drawLegend(s *svg.SVG, r grid.Result, details []detail, width, top int, keyBelow bool) {
	s.Group(`class="gl-legend"`)
	x := legendLeft
	if len(r.Partitions) == 0 {
		s.Text(x, top+12, "No partition could be placed; the plan's findings say why.")
	}
	for i, l := range r.Partitions {
		y := top + i*partRow
		var sw pathData
		sw.rect(float64(x), float64(y), float64(x+30), float64(y+18))
		s.Path(sw.String(), `fill="url(#`+fillID(i)+`)"`, `stroke="`+partColour(i)+`"`, `stroke-width="1.2"`)
		n := l.Numerology
		s.Textspan(x+40, y+11, shown(l.Name), `font-weight="bold"`)
		s.Span(fmt.Sprintf("%d kHz · μ %d · %s CP · %d PRB%s at CRB %d–%d · %s",
			n.SCSKHz(), n.Mu, n.CP, l.SizePRB, plural(l.SizePRB), l.StartCRB, l.StartCRB+l.SizePRB-1, l.Direction), `dx="8"`, `font-weight="normal"`)
		s.TextEnd()
		s.Text(x+40, y+24, "drawn: "+details[i].describe(l.SizePRB), `font-size="10"`, `fill="`+inkSoft+`"`)
	}

	kx, ky := width-legendLeft-keyWidth, top
	if keyBelow {
		kx, ky = legendLeft, top+max(1, len(r.Partitions))*partRow+12
	}
	drawKey(s, kx, ky)
	s.Gend()
}

// drawKey explains the marks that are not partitions, each beside a small
// sample drawn as in the plot.
func drawKey(s *svg.SVG, x, y int) {
	rows := [keyEntries]string{
		"slot boundary",
		"symbol boundary",
		"cyclic prefix, at the start of each symbol",
		"longer CP: first symbol of each 0.5 ms (+16κ Tc)",
		"0.5 ms alignment of all numerologies",
		"channel edge",
		"guardband: channel edge to outermost carrier or partition",
		"unused spectrum inside the channel",
		"outside the channel",
		"carrier rail (SCS in kHz above); dark: min. guardband",
	}
	s.Group(`class="gl-key"`, `font-size="10"`)
	for i, text := range rows {
		s.Text(x+40, y+i*keyRow+10, text)
	}
	row := func(i int) (float64, float64) { return float64(y + i*keyRow), float64(y + i*keyRow + 12) }
	x0, x1, xm := float64(x), float64(x+30), float64(x+15)
	line := func(d pathData, attrs ...string) { s.Path(d.String(), append([]string{`fill="none"`}, attrs...)...) }
	box := func(i int, attrs ...string) {
		var d pathData
		t, b := row(i)
		d.rect(x0, t, x1, b)
		s.Path(d.String(), attrs...)
	}
	var d pathData
	t, b := row(0)
	d.vline(xm, t, b)
	line(d, `stroke="`+inkLattice+`"`, `stroke-opacity="0.85"`, `stroke-width="1.2"`)
	d = pathData{}
	t, b = row(1)
	d.vline(xm, t, b)
	line(d, `stroke="`+inkLattice+`"`, `stroke-opacity="0.55"`, `stroke-width="0.6"`)
	d = pathData{}
	t, b = row(2)
	d.vline(x0+10, t, b)
	line(d, `stroke="`+inkLattice+`"`, `stroke-opacity="0.2"`, `stroke-width="5"`)
	d = pathData{}
	t, b = row(3)
	d.vline(x0+10, t, b)
	line(d, `stroke="`+inkLattice+`"`, `stroke-opacity="0.55"`, `stroke-width="5.5"`)
	d = pathData{}
	t, b = row(4)
	d.vline(xm, t-2, b+2)
	line(d, `stroke="#000000"`, `stroke-width="1.3"`, `stroke-dasharray="6 3"`)
	d = pathData{}
	t, b = row(5)
	d.hline((t+b)/2, x0, x1)
	line(d, `stroke="#000000"`, `stroke-width="2"`)
	box(6, `fill="`+inkGuard+`"`)
	box(7, `fill="url(#gl-unused)"`, `stroke="`+inkOutLines+`"`, `stroke-width="0.6"`)
	box(8, `fill="url(#gl-outside)"`)
	t, b = row(9)
	var bar, ends pathData
	bar.rect(x0, t+2, x1, b-2)
	ends.rect(x0, t+2, x0+6, b-2)
	ends.rect(x1-6, t+2, x1, b-2)
	s.Path(bar.String(), `fill="#ffffff"`, `stroke="`+inkText+`"`, `stroke-width="1"`)
	s.Path(ends.String(), `fill="`+inkText+`"`, `fill-opacity="0.8"`)
	s.Gend()
}
