// Package render draws a grid.Result: the lattice figure as SVG or PNG and
// the symbol table as CSV. It writes to an io.Writer and returns one error.
//
// The figure's cost follows what is drawn, not the size of the lattice:
// each partition is one group with one path per line kind, and a path has
// one segment per line that is at least a few pixels from its neighbours.
// Finer lines give way to coarser ones (PRB rows every few PRBs, slot
// lines instead of symbol lines, 0.5 ms marks alone) and the legend says
// which were drawn. TDD directions are drawn per run of like symbols,
// SS/PBCH blocks as one path and the synchronization raster as one path
// per kind of tick.
//
// The figure is built once as a display list that both the SVG writer and
// the PNG rasteriser consume, so the two share one layout. Options choose
// the width, a theme (light, or print for documents), the layers shown and
// a caption; the SVG can carry the plan file in its <metadata>, which
// PlanFromSVG reads back.
//
// The plot area is published for scripts that map the pointer to time and
// frequency: the group with id "gl-plot" (and class "gl-plot") carries
// data-x, data-y, data-w and data-h (px), data-span-tc (time 0 at x, span
// at x+w) and data-low-hz and data-high-hz (frequency from point A at y+h
// and at y), data-time-unit (the time axis's unit, "us" or "ms", for a
// readout to keep) and, when the channel has an absolute frequency,
// data-point-a-hz. Partition i of Result.Partitions is drawn inside
// <g class="gl-part" data-index="i">, and its legend row inside
// <g class="gl-legend-part" data-index="i">; every other mark has a class
// of its own (gl-guard, gl-edges, gl-carriers, gl-align, gl-ssb, gl-note-…),
// so a page can highlight parts of an inline figure with its stylesheet.
// The synchronization raster's comb is <g class="gl-raster"> with the
// band's points for a readout: data-band, data-scs-khz, data-gscn and
// data-ss-ref-hz (space-separated, SS_REF from point A), data-fits (one
// '1' or '0' per point) and, when the block is on the raster,
// data-block-gscn. CORESET#0 is <g class="gl-coreset0"> with data-low-hz,
// data-high-hz, data-start-crb, data-nrb, data-symbols and data-scs-khz,
// and its Type0-PDCCH occasions in the span, in time order, as
// data-occ-ssb, data-occ-start-tc and data-occ-end-tc (space-separated);
// the initial BWPs' brackets beside the rail are <g class="gl-initial-dl">
// and <g class="gl-initial-ul"> with data-low-hz, data-high-hz,
// data-start-crb, data-size-prb and data-scs-khz. The PRACH occasions
// are <g class="gl-prach"> with data-index, data-format, data-table,
// data-scs-hz and data-nrb-ra, and the occasions in the span, in time then
// frequency order, as data-occ-start-tc, data-occ-end-tc, data-occ-low-hz,
// data-occ-high-hz (Hz from point A), data-occ-valid ('1' or '0') and
// data-occ-ssb (each occasion's SS/PBCH indices, comma-separated, "-" for
// none), all space-separated; its paths are gl-prach-edge (valid) and
// gl-prach-bad (not valid). The bands of Result.Overlaps are outlined in
// <g class="gl-overlaps"> with data-pairs (each pair's partition indexes,
// "a-b", space-separated): gl-overlap (errors) and gl-overlap-warn (a
// downlink and an uplink partition). A comparison's cross-link conflicts
// (Options.CrossLink) are <g class="gl-xl-marks"> with data-start-tc and
// data-end-tc, one path gl-xl-mark over the plot, drawn over all else.
//
// Options.Window fixes the axes, so that figures of two plans share their
// scales (FitWindow and Window.Union make one that holds both), and
// Options.IDPrefix keeps the ids of several inline figures apart.
//
// Security: plan and partition names and the caption are untrusted. They
// reach the SVG only as element text through svgo's escaping functions
// (Text, Textspan, Span), never inside an attribute; every style value is
// one of the package's own constants. The stored plan is base64 text, and
// PlanFromSVG reads a bounded input with encoding/xml. The CSV neutralises
// cells a spreadsheet would read as a formula.
package render

import (
	"bytes"
	"cmp"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gridloom/grid"
)

// Layout of the figure, in px.
const (
	marginLeft    = 92  // frequency tick labels and axis title
	marginTop     = 48  // alignment-mark heading and carrier rail labels
	plotHeight    = 460 // frequency axis
	minPlotHeight = 160 // a preset's least and greatest plot height
	maxPlotHeight = 2000
	axisBand      = 58  // time tick labels and axis title below the plot
	railGap       = 10  // plot to carrier rail
	railStep      = 20  // one rail column per carrier
	railBar       = 8   // rail bar width
	notesGap      = 12  // rail to notes
	notesWidth    = 170 // channel-edge, guard and unused notes
	noteSpacing   = 12  // least distance between two notes
	legendLeft    = 24
	partRow       = 32  // one legend row per partition
	keyRow        = 17  // one key row per mark
	keyLine       = 12  // each further line of a key text wrapped beside the plot
	besideWidth   = 380 // the key's column beside the plot, at most
	minKeyWidth   = 300
	maxKeyWidth   = 460
	legendGap     = 24 // partition rows to key, when side by side
	captionSize   = 12
	captionLine   = 16
	maxShownTitle = 120
	baseFontSize  = 11
)

// Figure draws r as a self-contained SVG document: no scripts, external
// fonts, styles or images.
func Figure(w io.Writer, r grid.Result, opt Options) error {
	d, err := build(r, opt)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	writeSVG(&buf, d)
	_, err = w.Write(buf.Bytes())
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
	if r.SSB != nil && !r.SSB.Numerology.Valid() {
		return fmt.Errorf("render: the SS/PBCH blocks have numerology μ=%d, which TS 38.211 Table 4.2-1 does not define", r.SSB.Numerology.Mu)
	}
	return nil
}

// builder appends to a doc in paint order.
type builder struct {
	d      *doc
	lk     *look
	layers Layers
	pats   map[string]int
	fromA  bool // Options.FromPointA
}

func (b *builder) shows(l Layer) bool { return b.layers.Shows(l) }

func (b *builder) open(g group) { b.d.items = append(b.d.items, &g) }
func (b *builder) end()         { b.d.items = append(b.d.items, groupEnd{}) }

// add appends a shape unless it has nothing to draw.
func (b *builder) add(s shape) {
	if s.d.segs == 0 && s.circle == nil {
		return
	}
	b.d.items = append(b.d.items, &s)
}

// text appends a label, in the base font size and the theme's text colour
// unless it sets its own.
func (b *builder) text(l label) {
	if l.size == 0 {
		l.size = baseFontSize
	}
	if l.fill == (rgb{}) {
		l.fill = b.lk.text
	}
	if l.halo && b.lk.labelBack && !l.rotate {
		b.add(shape{class: "gl-label-back", d: labelBackBox(&l), fill: solid(white)})
	}
	b.d.items = append(b.d.items, &l)
}

// labelBackBox is the box a label's glyphs take, with a pixel and a half
// around them: the text's measured width placed by its anchor, from the
// ascent (0.8 of the size above the baseline) to the descent (0.25 below).
func labelBackBox(l *label) pathData {
	x, y := l.pos()
	w := measure(l)
	x0 := float64(x) + l.anchor.shift(w)
	const pad = 1.5
	return pathOf(func(p *pathData) {
		p.rect(x0-pad, float64(y)-0.8*l.size-pad, x0+w+pad, float64(y)+0.25*l.size+pad)
	})
}

// pattern returns the paint of the pattern named id, defining it with
// define on first use.
func (b *builder) pattern(id string, define func() pattern) paint {
	i, ok := b.pats[id]
	if !ok {
		i = len(b.d.patterns)
		b.d.patterns = append(b.d.patterns, define())
		b.pats[id] = i
	}
	return paint{kind: paintPattern, pattern: i, alpha: 1}
}

func (b *builder) partFill(i int) paint {
	return b.pattern(fillID(i), func() pattern { return b.lk.partFill(i) })
}

// line is a stroke-only shape.
func line(class string, d pathData, c rgb, alpha, w float64) shape {
	return shape{class: class, d: d, stroke: solid(c).withAlpha(alpha), strokeW: w}
}

// build validates the options and lays the figure out.
func build(r grid.Result, opt Options) (*doc, error) {
	width, err := opt.check()
	if err != nil {
		return nil, err
	}
	if err := checkNumerologies(r); err != nil {
		return nil, err
	}
	win, err := opt.window(r)
	if err != nil {
		return nil, err
	}
	lk := opt.Theme.look()
	written := width
	plotH := plotHeight
	if p := opt.Preset; p.Name != "" {
		width, plotH = p.LayoutWidth(), p.PlotHeight
	}
	b := &builder{d: &doc{w: width, outW: written, plan: opt.Plan, idPrefix: opt.IDPrefix}, lk: lk, layers: opt.Layers, pats: map[string]int{}, fromA: opt.FromPointA}

	f := plotFrameIn(r, width, plotH, win)
	f.timeUnit = opt.TimeUnit
	details := make([]detail, len(r.Partitions))
	for i, l := range r.Partitions {
		details[i] = chooseDetail(l, f)
	}
	var tdds []tddDrawing
	if r.TDD != nil && b.shows(LayerTDD) {
		tdds = make([]tddDrawing, len(r.Partitions))
		for i, l := range r.Partitions {
			tdds[i] = planTDD(l, f)
		}
	}
	var blocks *ssbDrawing
	if r.SSB != nil && b.shows(LayerSSB) {
		blocks = planSSB(*r.SSB, f)
	}
	var coreset *coresetDrawing
	if r.InitialAccess != nil && b.shows(LayerCoreset0) {
		coreset = planCoreset0(*r.InitialAccess, f)
	}
	var raster *syncDrawing
	if r.SyncRaster != nil && b.shows(LayerRaster) {
		raster = planSyncRaster(r, f, b.fromA)
	}

	var occasions *prachDrawing
	if r.PRACH != nil && b.shows(LayerPRACH) {
		occasions = planPRACH(*r.PRACH, f)
	}

	rows := partRows(r, details, tdds)
	keys := keyRows(r, b, blocks, coreset, raster, f)
	if occasions != nil {
		keys = append(keys, prachKeys(*r.PRACH, occasions)...)
	}
	keyW := minKeyWidth
	for _, k := range keys {
		keyW = max(keyW, int(textWidth(k.text, 10, false))+40+1)
	}
	keyW = min(keyW, maxKeyWidth)
	rowsW := 0
	for _, row := range rows {
		rowsW = max(rowsW, int(max(measure(&row.head), textWidth(row.drawnText(), drawnSize, false)))+40+1)
	}
	keyBelow := legendLeft+rowsW+legendGap > width-legendLeft-keyW
	plotW := width // the layout width the plot and its notes take
	keyWrap := 0.0 // the key's texts wrap at this width beside the plot
	beside := opt.Preset.Name != "" && opt.Preset.KeyBeside
	if beside {
		// The key in a column right of the notes, its texts wrapped to
		// the column; the partition rows below the plot across the whole
		// figure.
		keyBelow, keyWrap = false, float64(besideWidth-40)
		keyW = min(keyW, besideWidth)
		width += legendGap + keyW + legendLeft
	}
	avail := float64(width - 2*legendLeft - 40)
	if !keyBelow && !beside {
		avail -= float64(keyW + legendGap)
	}
	partsH := partRow
	if len(rows) > 0 {
		partsH = 0
	}
	for i := range rows {
		rows[i].wrap(avail)
		partsH += rows[i].height()
	}
	keyH := keysHeight(keys, keyWrap)
	legendH := max(partsH, keyH)
	if keyBelow {
		legendH = partsH + 12 + keyH
	}
	legendTop := f.y + f.h + axisBand + 6
	captionTop := legendTop + legendH + 12
	kx, ky := width-legendLeft-keyW, legendTop
	if keyBelow {
		kx, ky = legendLeft, legendTop+partsH+12
	}
	if beside {
		kx, ky = plotW+legendGap, f.y
		captionTop = max(legendTop+partsH, ky+keyH) + 12
	}
	caption := wrap(clean(opt.Caption), float64(width-2*legendLeft), captionSize)
	height := captionTop
	if len(caption) > 0 {
		height += 6 + len(caption)*captionLine
	}
	if beside {
		// The written width grows with the column, so the plot keeps the
		// zoom the preset chose.
		written = int(math.Round(float64(written) * float64(width) / float64(plotW)))
		b.d.w, b.d.outW = width, written
	}

	d := b.d
	d.h = height
	d.outH = int(math.Round(float64(height) * float64(written) / float64(width)))
	d.ink = lk.text
	title := r.Plan.Name
	if strings.TrimSpace(title) == "" {
		title = "gridloom plan"
	}
	d.title = clean(shownN(title, maxShownTitle))
	d.desc = clean(summary(r))

	b.add(shape{d: pathOf(func(p *pathData) { p.rect(0, 0, float64(width), float64(height)) }), fill: solid(white)})
	drawPlot(b, f, r, details, tdds, blocks, coreset, occasions)
	drawAxes(b, f, r.Channel, raster != nil)
	if raster != nil {
		drawSyncRaster(b, f, raster)
	}
	drawRail(b, f, r)
	drawLegend(b, r, rows, keys, legendTop, kx, ky, keyWrap)
	drawCrossLink(b, f, opt.CrossLink) // over everything, as a comparison's marks
	if len(caption) > 0 {
		b.open(group{class: "gl-caption", fontSize: captionSize})
		for i, text := range caption {
			b.text(label{x: legendLeft, y: float64(captionTop + 6 + (i+1)*captionLine - 4), runs: []run{{text: text}}, size: captionSize})
		}
		b.end()
	}
	return d, nil
}

// plotFrame places the plot area of the default figure: the window fitted
// to the plan.
func plotFrame(r grid.Result, width int) frame {
	return plotFrameIn(r, width, plotHeight, FitWindow(r))
}

// plotFrameIn places the plot area, room for win.Rails carrier rails beside
// it, and its axes' ranges: the window resolved by Options.window.
func plotFrameIn(r grid.Result, width, plotH int, win Window) frame {
	right := railGap + win.Rails*railStep + notesGap + notesWidth
	return frame{x: marginLeft, y: marginTop, w: width - marginLeft - right, h: plotH,
		span: win.Span, low: win.Low, high: win.High, planSpan: planSpan(r), rails: win.Rails}
}

// drawPlot draws the plot area inside the gl-plot group.
func drawPlot(b *builder, f frame, r grid.Result, details []detail, tdds []tddDrawing, blocks *ssbDrawing, coreset *coresetDrawing, occasions *prachDrawing) {
	lk := b.lk
	data := []attr{
		{"data-x", fmt.Sprint(f.x)}, {"data-y", fmt.Sprint(f.y)},
		{"data-w", fmt.Sprint(f.w)}, {"data-h", fmt.Sprint(f.h)},
		{"data-span-tc", fmt.Sprint(f.span)}, {"data-low-hz", fmt.Sprint(f.low)},
		{"data-high-hz", fmt.Sprint(f.high)},
		{"data-time-unit", timeUnitAttr(f)},
	}
	if r.Channel.Absolute {
		data = append(data, attr{"data-point-a-hz", fmt.Sprint(r.Channel.PointAHz)})
	}
	b.open(group{id: "gl-plot", class: "gl-plot", data: data})
	left, right := float64(f.x), f.right()

	whole := pathOf(func(p *pathData) { p.rect(left, float64(f.y), right, f.bottom()) })
	b.add(shape{class: "gl-outside", d: whole, fill: b.pattern("gl-outside", lk.outsideFill)})

	ch := r.Channel
	if ch.High > ch.Low {
		b.add(shape{class: "gl-channel", d: pathOf(func(p *pathData) { p.rect(left, f.Y(ch.High), right, f.Y(ch.Low)) }), fill: solid(white)})
	}
	if b.shows(LayerGuards) {
		var g, u pathData
		for _, sp := range r.Spectrum.Guards() {
			g.rect(left, f.Y(sp.High), right, f.Y(sp.Low))
		}
		for _, sp := range r.Spectrum.Unused {
			u.rect(left, f.Y(sp.High), right, f.Y(sp.Low))
		}
		guardPaint := solid(lk.guard)
		if lk.guardHatch {
			guardPaint = b.pattern("gl-guard", lk.guardFill)
		}
		b.add(shape{class: "gl-guard", d: g, fill: guardPaint})
		b.add(shape{class: "gl-unused", d: u, fill: b.pattern("gl-unused", lk.unusedFill)})
	}

	for i, l := range r.Partitions {
		var t *tddDrawing
		if tdds != nil {
			t = &tdds[i]
		}
		drawPartition(b, f, i, l, details[i], t, r.TDD)
	}
	if coreset != nil {
		drawCoreset0(b, coreset)
	}
	if occasions != nil {
		drawPRACH(b, occasions)
	}
	if blocks != nil {
		drawSSB(b, blocks)
	}
	if b.shows(LayerOverlap) {
		drawOverlaps(b, f, r.Overlaps)
	}
	if f.pastPlan() {
		// The window runs on past the plan's span: nothing of the plan is there.
		x := f.planRight()
		b.add(shape{class: "gl-past", d: pathOf(func(p *pathData) { p.rect(x, float64(f.y), right, f.bottom()) }),
			fill: b.pattern("gl-outside", lk.outsideFill)})
		var edge pathData
		edge.vline(x, float64(f.y), f.bottom())
		b.add(line("gl-past-edge", edge, lk.text, 1, lk.edgeW))
		if b.shows(LayerLabels) && right-x > 60 {
			b.text(label{class: "gl-past-label", x: x + 6, y: float64(f.y + 14),
				runs: []run{{text: "end of this plan's " + fmtMs(f.planSpan) + " span"}}, size: 10, halo: true})
		}
	}

	if b.shows(LayerLattice) {
		// Every numerology starts a symbol at every 0.5 ms (TS 38.211 5.3.1).
		var marks, heads pathData
		for t := grid.TcPerHalfFrame; t < f.planSpan; t += grid.TcPerHalfFrame {
			x := f.X(t)
			marks.vline(x, float64(f.y), f.bottom())
			heads.moveTo(x-4, float64(f.y-8))
			heads.lineTo(x+4, float64(f.y-8))
			heads.lineTo(x, float64(f.y-1))
			heads.close()
		}
		align := line("gl-align", marks, black, 1, lk.alignW)
		align.dash = []float64{6, 3}
		b.add(align)
		b.add(shape{class: "gl-align-heads", d: heads, fill: solid(black)})
	}

	if ch.High > ch.Low {
		var edges pathData
		edges.hline(f.Y(ch.High), left, right)
		edges.hline(f.Y(ch.Low), left, right)
		b.add(line("gl-edges", edges, black, 1, lk.edgeW))
	}
	b.add(line("gl-frame", whole, lk.soft, 1, lk.frameW))
	if b.shows(LayerLabels) {
		// The partitions' names are drawn; the labels drawn after them
		// keep clear of them and of each other.
		var taken []labelBox
		for _, l := range r.Partitions {
			if name, ok := nameLabel(f, l); ok {
				taken = append(taken, labelBox{name.x, name.y - 11, name.x + measure(&name), name.y + 3})
			}
		}
		if blocks != nil {
			taken = append(taken, drawSSBLabels(b, blocks, taken)...)
		}
		if coreset != nil {
			drawCoreset0Labels(b, coreset, taken)
		}
	}
	b.end()
}

// drawAxes draws the time axis below the plot and the frequency axis to its
// left, each with a title naming its unit. With room for the sync raster's
// comb, the frequency axis stands rasterStrip px off the plot on a spine
// of its own.
func drawAxes(b *builder, f frame, ch grid.Channel, rasterRoom bool) {
	var tickMarks pathData
	b.open(group{class: "gl-axes", fontSize: 10})
	tick := func(x, y float64, text string, a anchor) {
		b.text(label{x: x, y: y, runs: []run{{text: text}}, size: 10, anchor: a})
	}

	// Time: one unit for every tick (timeUnit); ticks at least 70 px apart.
	unit, unitTc := timeUnit(f.timeUnit, f.span)
	spanU := float64(f.span) / unitTc
	step := niceStep(70 / (float64(f.w) / spanU))
	for _, v := range ticks(0, spanU, step) {
		x := float64(f.x) + v/spanU*float64(f.w)
		tickMarks.vline(x, f.bottom(), f.bottom()+5)
		tick(float64(int(x+0.5)), float64(f.y+f.h+18), fmtTick(v, step), anchorMiddle)
	}
	b.text(label{x: float64(f.x + f.w/2), y: float64(f.y + f.h + 40), runs: []run{{text: "time (" + unit + ")"}}, size: 12, anchor: anchorMiddle})

	// Frequency: MHz, absolute when the plan fixes the channel centre,
	// otherwise from point A; ticks at least 36 px apart.
	toV := func(hz grid.Hz) float64 { return hz.MHz() }
	fromV := func(v float64) grid.Hz { return grid.Hz(v * 1e6) }
	title := "frequency from point A (MHz)"
	if ch.Absolute && !b.fromA {
		toV = func(hz grid.Hz) float64 { return ch.Abs(hz).MHz() }
		fromV = func(v float64) grid.Hz { return grid.Hz(v*1e6) - ch.PointAHz }
		title = "frequency (MHz)"
	}
	lo, hi := toV(f.low), toV(f.high)
	fstep := niceStep(36 / (float64(f.h) / (hi - lo)))
	axisX := float64(f.x)
	if rasterRoom {
		axisX -= rasterStrip
		tickMarks.vline(axisX, float64(f.y), f.bottom())
	}
	for _, v := range ticks(lo, hi, fstep) {
		y := f.Y(fromV(v))
		tickMarks.hline(y, axisX-5, axisX)
		tick(axisX-8, float64(int(y+3.5)), fmtTick(v, fstep), anchorEnd)
	}
	mid := float64(f.y + f.h/2)
	b.text(label{x: 18, y: mid, runs: []run{{text: title}}, size: 12, anchor: anchorMiddle, rotate: true})
	b.add(line("", tickMarks, b.lk.text, 1, 1))

	// Heading of the 0.5 ms marks, above the plot.
	if f.span > grid.TcPerHalfFrame && b.shows(LayerLattice) {
		var head pathData
		head.moveTo(float64(f.x), float64(f.y-30))
		head.lineTo(float64(f.x+8), float64(f.y-30))
		head.lineTo(float64(f.x+4), float64(f.y-23))
		head.close()
		b.add(shape{d: head, fill: solid(black)})
		b.text(label{x: float64(f.x + 13), y: float64(f.y - 23), runs: []run{{text: "0.5 ms alignment marks (dashed): every numerology starts a symbol together here"}}})
	}
	b.end()
}

// timeUnit resolves the time axis's unit for a span: its name and how many
// Tc it holds. TimeAuto takes µs up to 2 ms and ms beyond, as TimeUnit's
// comment says.
func timeUnit(tu TimeUnit, span grid.Tc) (string, float64) {
	if tu == TimeUs || tu == TimeAuto && span <= 2*grid.TcPerSubframe {
		return "µs", float64(grid.TcPerSubframe) / 1000
	}
	return "ms", float64(grid.TcPerSubframe)
}

// timeUnitAttr is the time axis's unit as gl-plot's data-time-unit
// publishes it for a readout: "us" or "ms".
func timeUnitAttr(f frame) string {
	if u, _ := timeUnit(f.timeUnit, f.span); u == "ms" {
		return "ms"
	}
	return "us"
}

// note is one line of text beside the rail, pointing at a frequency.
type note struct {
	y     float64 // the frequency's position
	text  string
	class string // what it names: gl-note-edge, gl-note-pointa, gl-note-guard or gl-note-unused
}

// drawRail draws one bar per SCS-specific carrier with its minimum
// guardbands at both channel edges, and the notes on the channel edges,
// guardbands and unused spectrum, spread so they never overlap.
func drawRail(b *builder, f frame, r grid.Result) {
	lk := b.lk
	ch := r.Channel
	railX := f.x + f.w + railGap
	notesX := railX + f.rails*railStep + notesGap

	var notes []note
	absolute := ch.Absolute && !b.fromA
	where := func(hz grid.Hz) string {
		if absolute {
			return fmtMHz(ch.Abs(hz))
		}
		return fmtMHz(hz) + " from A"
	}
	if ch.High > ch.Low {
		notes = append(notes, note{f.Y(ch.High), "channel edge " + where(ch.High), "gl-note-edge"},
			note{f.Y(ch.Low), "channel edge " + where(ch.Low), "gl-note-edge"})
	}
	if 0 >= f.low && 0 < f.high {
		text := "point A"
		if absolute {
			text += " " + fmtMHz(ch.PointAHz)
		}
		notes = append(notes, note{f.Y(0), text, "gl-note-pointa"})
	}
	if b.shows(LayerGuards) {
		for _, g := range r.Spectrum.Guards() {
			notes = append(notes, note{(f.Y(g.Low) + f.Y(g.High)) / 2, "guard " + fmtSpan(g.High-g.Low), "gl-note-guard"})
		}
		for _, u := range r.Spectrum.Unused {
			notes = append(notes, note{(f.Y(u.Low) + f.Y(u.High)) / 2, "unused " + fmtSpan(u.High-u.Low), "gl-note-unused"})
		}
	}
	if !b.shows(LayerLabels) {
		notes = nil
	}
	for i := range notes {
		// A channel edge counted from point A can run past the figure's
		// edge; "edge" alone still says it beside the rail.
		if textWidth(notes[i].text, 10, false) > notesWidth-2 {
			notes[i].text = strings.Replace(notes[i].text, "channel edge ", "edge ", 1)
		}
	}
	placed := spread(notes, float64(f.y-12), f.bottom()+float64(axisBand)-8)

	b.open(group{class: "gl-rail", fontSize: 10})
	var leaders pathData
	for i, n := range notes {
		leaders.moveTo(f.right(), n.y)
		leaders.lineTo(float64(notesX-14), n.y)
		leaders.lineTo(float64(notesX-3), placed[i])
	}
	b.add(line("gl-leaders", leaders, lk.soft, 1, 0.6))
	for i, n := range notes {
		b.text(label{class: "gl-note " + n.class, x: float64(notesX), y: float64(int(placed[i] + 3.5)), runs: []run{{text: n.text}}, size: 10})
	}

	var bars, keep pathData
	for j, c := range r.Carriers {
		x := float64(railX + j*railStep)
		bars.rect(x, f.Y(c.High), x+railBar, f.Y(c.Low))
		if ch.High > ch.Low && c.MinGuard > 0 {
			keep.rect(x, f.Y(ch.Low+c.MinGuard), x+railBar, f.Y(ch.Low))
			keep.rect(x, f.Y(ch.High), x+railBar, f.Y(ch.High-c.MinGuard))
		}
		b.text(label{class: "gl-rail-scs", x: x + railBar/2, y: float64(f.y - 6), runs: []run{{text: fmt.Sprint(c.SCSKHz)}}, size: 9, anchor: anchorMiddle})
	}
	b.add(shape{class: "gl-carriers", d: bars, fill: solid(white), stroke: solid(lk.text), strokeW: 1})
	if r.InitialAccess != nil && b.shows(LayerCoreset0) {
		drawInitialBWPs(b, f, r, railX)
	}
	if b.shows(LayerGuards) {
		b.add(shape{class: "gl-minguard", d: keep, fill: solid(lk.text).withAlpha(0.8)})
	}
	b.end()
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
	if r.Channel.Band != "" {
		fmt.Fprintf(&b, " in band %s", shownN(r.Channel.Band, 8))
	}
	if r.TDD != nil {
		fmt.Fprintf(&b, ", TDD %s", tddName(r.TDD))
	}
	for i, l := range r.Partitions {
		sep := "; "
		if i == 0 {
			sep = ": "
		}
		fmt.Fprintf(&b, "%s%s (%d kHz, %d PRBs)", sep, shown(l.Name), l.Numerology.SCSKHz(), l.SizePRB)
	}
	if r.SSB != nil {
		fmt.Fprintf(&b, "; %d SS/PBCH block%s of case %s at %d kHz", len(r.SSB.Blocks), plural(len(r.SSB.Blocks)), r.SSB.Case, r.SSB.Numerology.SCSKHz())
		if r.SSB.Absolute && r.SSB.OnSyncRaster {
			fmt.Fprintf(&b, " on GSCN %d", r.SSB.GSCN)
		}
	}
	if ia := r.InitialAccess; ia != nil {
		c := ia.CORESET0
		fmt.Fprintf(&b, "; CORESET#0 of %d RBs × %d symbols at %d kHz (TS 38.213 Table %s row %d)", c.NRB, c.Symbols, c.SCSKHz, c.Table, c.Index)
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

// partRowText is the legend's text for one partition: a heading line and
// what was drawn, in parts that wrap to lines of their own.
type partRowText struct {
	head  label
	drawn []string
	lines []string // drawn, wrapped by wrap
}

// Legend rows, in px.
const (
	drawnSize = 10
	drawnLine = 13 // each further line of a wrapped drawn text
)

func (p *partRowText) drawnText() string { return "drawn: " + strings.Join(p.drawn, " · ") }

// wrap breaks the drawn text between its parts into lines of at most maxW px.
func (p *partRowText) wrap(maxW float64) {
	p.lines = p.lines[:0]
	cur := "drawn:"
	for i, part := range p.drawn {
		sep := " "
		if i > 0 {
			sep = " · "
		}
		if i > 0 && textWidth(cur+sep+part, drawnSize, false) > maxW {
			p.lines = append(p.lines, cur+" ·")
			cur, sep = "", ""
		}
		cur += sep + part
	}
	p.lines = append(p.lines, cur)
}

func (p *partRowText) height() int { return partRow + drawnLine*max(0, len(p.lines)-1) }

// partRows writes the legend text of every partition.
func partRows(r grid.Result, details []detail, tdds []tddDrawing) []partRowText {
	rows := make([]partRowText, len(r.Partitions))
	for i, l := range r.Partitions {
		n := l.Numerology
		spec := fmt.Sprintf("%d kHz · μ %d · %s CP · %d PRB%s at CRB %d–%d · %s",
			n.SCSKHz(), n.Mu, n.CP, l.SizePRB, plural(l.SizePRB), l.StartCRB, l.StartCRB+l.SizePRB-1, l.Direction)
		drawn := details[i].parts(l.SizePRB)
		if tdds != nil {
			if l.Dirs == nil {
				spec += " · no TDD directions (below the reference SCS)"
			} else {
				spec += fmt.Sprintf(" on %s of symbols", percent(l.Share))
			}
			drawn = append(drawn, tdds[i].parts()...)
		}
		rows[i] = partRowText{
			head:  label{runs: []run{{text: clean(shown(l.Name)), bold: true}, {text: spec, dx: 8}}, size: baseFontSize},
			drawn: drawn,
		}
	}
	return rows
}

// percent formats a share as a whole percentage, or to a tenth below 10 %.
func percent(v float64) string {
	p := v * 100
	if p > 0 && p < 10 {
		return fmt.Sprintf("%.1f %%", p)
	}
	return fmt.Sprintf("%.0f %%", p)
}

// drawLegend draws one row per partition (swatch, name, numerology, size,
// and the detail drawn) and the key of the figure's other marks.
func drawLegend(b *builder, r grid.Result, rows []partRowText, keys []keyEntry, top, kx, ky int, keyWrap float64) {
	b.open(group{class: "gl-legend"})
	x := float64(legendLeft)
	if len(r.Partitions) == 0 {
		b.text(label{x: x, y: float64(top + 12), runs: []run{{text: "No partition could be placed; the plan's findings say why."}}})
	}
	y := float64(top)
	for i, row := range rows {
		b.open(group{class: "gl-legend-part", data: []attr{{"data-index", fmt.Sprint(i)}}})
		b.add(shape{d: pathOf(func(p *pathData) { p.rect(x, y, x+30, y+18) }), fill: b.partFill(i),
			stroke: solid(b.lk.part(i)), strokeW: b.lk.bodyW})
		head := row.head
		head.x, head.y = x+40, y+11
		b.text(head)
		for k, text := range row.lines {
			b.text(label{x: x + 40, y: y + 24 + float64(k*drawnLine), runs: []run{{text: text}}, size: drawnSize, fill: b.lk.soft})
		}
		b.end()
		y += float64(row.height())
	}
	drawKey(b, keys, kx, ky, keyWrap)
	b.end()
}

// keyEntry is one row of the key: a sample drawn as in the plot, in the
// box (x0, y0)–(x1, y1), and its text.
type keyEntry struct {
	text   string
	sample func(b *builder, x0, y0, x1, y1 float64)
}

// keyRows lists the key's rows for what the figure shows.
func keyRows(r grid.Result, b *builder, blocks *ssbDrawing, coreset *coresetDrawing, raster *syncDrawing, f frame) []keyEntry {
	lk := b.lk
	vline := func(dx float64, c rgb, a, w float64, pad float64) func(b *builder, x0, y0, x1, y1 float64) {
		return func(b *builder, x0, y0, x1, y1 float64) {
			var d pathData
			d.vline(x0+dx, y0-pad, y1+pad)
			b.add(line("", d, c, a, w))
		}
	}
	box := func(fill func() paint, edge bool) func(b *builder, x0, y0, x1, y1 float64) {
		return func(b *builder, x0, y0, x1, y1 float64) {
			s := shape{d: pathOf(func(p *pathData) { p.rect(x0, y0, x1, y1) }), fill: fill()}
			if edge {
				s.stroke, s.strokeW = solid(lk.outsideLines), 0.6
			}
			b.add(s)
		}
	}
	var keys []keyEntry
	if b.shows(LayerLattice) {
		keys = append(keys,
			keyEntry{"slot boundary", vline(15, lk.lattice, lk.slotA, lk.slotW, 0)},
			keyEntry{"symbol boundary", vline(15, lk.lattice, lk.symA, lk.symW, 0)})
	}
	if b.shows(LayerCP) {
		keys = append(keys,
			keyEntry{"cyclic prefix, at the start of each symbol", vline(10, lk.lattice, lk.cpA, 5, 0)},
			keyEntry{"longer CP: first symbol of each 0.5 ms (+16κ Tc)", vline(10, lk.lattice, lk.longA, 5.5, 0)})
	}
	if b.shows(LayerLattice) {
		keys = append(keys, keyEntry{"0.5 ms alignment of all numerologies", func(b *builder, x0, y0, x1, y1 float64) {
			var d pathData
			d.vline(x0+15, y0-2, y1+2)
			s := line("", d, black, 1, lk.alignW)
			s.dash = []float64{6, 3}
			b.add(s)
		}})
	}
	keys = append(keys, keyEntry{"channel edge", func(b *builder, x0, y0, x1, y1 float64) {
		var d pathData
		d.hline((y0+y1)/2, x0, x1)
		b.add(line("", d, black, 1, lk.edgeW))
	}})
	if b.shows(LayerGuards) {
		guard := func() paint {
			if lk.guardHatch {
				return b.pattern("gl-guard", lk.guardFill)
			}
			return solid(lk.guard)
		}
		keys = append(keys,
			keyEntry{"guardband: channel edge to outermost carrier or partition", box(guard, false)},
			keyEntry{"unused spectrum inside the channel", box(func() paint { return b.pattern("gl-unused", lk.unusedFill) }, true)})
	}
	outside := "outside the channel"
	if f.pastPlan() {
		outside += ", or past the plan's span"
	}
	keys = append(keys, keyEntry{outside, box(func() paint { return b.pattern("gl-outside", lk.outsideFill) }, false)})
	rail := "carrier rail (SCS in kHz above)"
	if b.shows(LayerGuards) {
		rail += "; dark: min. guardband"
	}
	keys = append(keys, keyEntry{rail, func(b *builder, x0, y0, x1, y1 float64) {
		b.add(shape{d: pathOf(func(p *pathData) { p.rect(x0, y0+2, x1, y1-2) }), fill: solid(white), stroke: solid(lk.text), strokeW: 1})
		if b.shows(LayerGuards) {
			b.add(shape{d: pathOf(func(p *pathData) {
				p.rect(x0, y0+2, x0+6, y1-2)
				p.rect(x1-6, y0+2, x1, y1-2)
			}), fill: solid(lk.text).withAlpha(0.8)})
		}
	}})
	if r.TDD != nil && b.shows(LayerTDD) {
		keys = append(keys, tddKeys(r.TDD, b)...)
	}
	if r.SSB != nil && blocks != nil {
		keys = append(keys, ssbKey(*r.SSB, blocks, b))
	}
	if coreset != nil {
		keys = append(keys, coresetKeys(*r.InitialAccess, coreset, b)...)
	}
	if raster != nil {
		keys = append(keys, syncKeys(r.SyncRaster, raster)...)
	}
	if b.shows(LayerOverlap) {
		keys = append(keys, overlapKeys(r.Overlaps, b)...)
	}
	return keys
}

// keyLines is a key text's lines: one, or wrapped at maxW px when maxW is
// not 0.
func keyLines(text string, maxW float64) []string {
	if maxW == 0 || textWidth(text, 10, false) <= maxW {
		return []string{text}
	}
	return wrap(text, maxW, 10)
}

// keysHeight is the key's height with its texts wrapped at maxW.
func keysHeight(keys []keyEntry, maxW float64) int {
	h := 0
	for _, k := range keys {
		h += keyRow + keyLine*(len(keyLines(k.text, maxW))-1)
	}
	return h
}

// drawKey explains the marks that are not partitions, each beside a small
// sample drawn as in the plot; its texts wrap at maxW px unless it is 0.
func drawKey(b *builder, keys []keyEntry, x, y int, maxW float64) {
	b.open(group{class: "gl-key", fontSize: 10})
	tops := make([]int, len(keys))
	t := y
	for i, k := range keys {
		tops[i] = t
		lines := keyLines(k.text, maxW)
		for j, text := range lines {
			b.text(label{x: float64(x + 40), y: float64(t + j*keyLine + 10), runs: []run{{text: text}}, size: 10})
		}
		t += keyRow + keyLine*(len(lines)-1)
	}
	for i, k := range keys {
		t := float64(tops[i])
		k.sample(b, float64(x), t, float64(x+30), t+12)
	}
	b.end()
}

// wrap breaks text into lines that fit maxW px at size, at spaces where it
// can and inside a word that is longer than a line.
func wrap(text string, maxW, size float64) []string {
	text = strings.TrimSpace(text)
	if text == "" {
		return nil
	}
	var lines []string
	cur := ""
	for _, word := range strings.Fields(text) {
		try := word
		if cur != "" {
			try = cur + " " + word
		}
		if textWidth(try, size, false) <= maxW {
			cur = try
			continue
		}
		if cur != "" {
			lines = append(lines, cur)
		}
		// A word too long for a line is cut by runes.
		for textWidth(word, size, false) > maxW {
			rs := []rune(word)
			k := len(rs) - 1
			for k > 1 && textWidth(string(rs[:k]), size, false) > maxW {
				k--
			}
			lines = append(lines, string(rs[:k]))
			word = string(rs[k:])
		}
		cur = word
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// clean replaces the characters an XML document cannot carry with U+FFFD,
// as svgo's escaping does, and turns line breaks and tabs into spaces, so
// that the SVG and the PNG show the same text.
func clean(s string) string {
	return strings.Map(func(r rune) rune {
		switch {
		case r == '\t' || r == '\n' || r == '\r':
			return ' '
		case r >= 0x20 && r <= 0xD7FF || r >= 0xE000 && r <= 0xFFFD || r >= 0x10000 && r <= 0x10FFFF:
			return r
		}
		return '\uFFFD'
	}, s)
}
