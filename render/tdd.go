package render

import (
	"fmt"
	"strconv"

	"gridloom/grid"
)

// TDD directions are drawn per run of like symbols, never per symbol: a
// band along the foot of each partition (downlink dark, flexible mid-grey,
// uplink hatched on white, with the letter D, F or U where a run of the
// first period is wide enough), and a pale wash over the runs a partition
// cannot use because they go the other way or are flexible.

// minRun is the narrowest run drawn, in px. A lone narrower run is widened
// to it; neighbouring narrower runs are merged first and shown as F.
const minRun = 1.0

// Band sizes, in px.
const (
	maxBand       = 10 // band height on a tall partition
	minBand       = 3
	letterBand    = 9  // least band height that holds a letter
	letterRun     = 12 // least run width that holds a letter
	letterSize    = 8
	letterBaseOff = 3 // baseline below the band's middle
)

// tddRun is a run of symbols of one direction, [x0, x1) in px.
type tddRun struct {
	x0, x1 float64
	start  grid.Tc
	dir    grid.SymbolDir
}

func (r tddRun) w() float64 { return r.x1 - r.x0 }

// tddDrawing is what is drawn of one partition's directions.
type tddDrawing struct {
	runs    []tddRun
	want    grid.SymbolDir // the partition's own direction
	widened int            // runs widened to minRun
	merged  int            // runs merged into mixed runs shown as F
}

// planTDD merges the partition's symbol directions into runs and
// simplifies the runs narrower than minRun at the figure's scale. A
// partition without directions has no runs.
func planTDD(l grid.Lattice, f frame) tddDrawing {
	t := tddDrawing{want: grid.Downlink}
	if l.Direction == grid.UL {
		t.want = grid.Uplink
	}
	if len(l.Dirs) == 0 {
		return t
	}
	n := l.Numerology
	var raw []tddRun
	for k, d := range l.Dirs {
		sym := n.SymbolAt(k)
		if sym.Start >= f.span {
			break
		}
		end := min(sym.End(), f.span)
		if len(raw) > 0 && raw[len(raw)-1].dir == d {
			raw[len(raw)-1].x1 = f.X(end)
			continue
		}
		raw = append(raw, tddRun{x0: f.X(sym.Start), x1: f.X(end), start: sym.Start, dir: d})
	}

	// Neighbouring runs too narrow to see become one run shown as F: the
	// direction changes inside it, so none of its symbols is dependably one
	// way at this scale.
	var runs []tddRun
	for i := 0; i < len(raw); {
		if raw[i].w() >= minRun {
			runs = append(runs, raw[i])
			i++
			continue
		}
		j := i
		for j < len(raw) && raw[j].w() < minRun {
			j++
		}
		if j-i == 1 {
			runs = append(runs, raw[i])
		} else {
			runs = append(runs, tddRun{x0: raw[i].x0, x1: raw[j-1].x1, start: raw[i].start, dir: grid.Flexible})
			t.merged += j - i
		}
		i = j
	}
	runs = mergeRuns(runs)

	// A run still too narrow takes the missing width from its wider
	// neighbour, which is at least minRun wide.
	for i := range runs {
		need := minRun - runs[i].w()
		if need <= 0 {
			continue
		}
		leftW, rightW := -1.0, -1.0
		if i > 0 {
			leftW = runs[i-1].w()
		}
		if i+1 < len(runs) {
			rightW = runs[i+1].w()
		}
		switch {
		case rightW >= leftW && rightW > need:
			runs[i].x1 += need
			runs[i+1].x0 += need
		case leftW > need:
			runs[i].x0 -= need
			runs[i-1].x1 -= need
		default:
			continue
		}
		t.widened++
	}
	t.runs = runs
	return t
}

// mergeRuns joins neighbouring runs of one direction.
func mergeRuns(runs []tddRun) []tddRun {
	out := runs[:0]
	for _, r := range runs {
		if len(out) > 0 && out[len(out)-1].dir == r.dir {
			out[len(out)-1].x1 = r.x1
			continue
		}
		out = append(out, r)
	}
	return out
}

// parts says how the runs were simplified, for the legend; nothing when
// they are drawn as they are.
func (t *tddDrawing) parts() []string {
	var parts []string
	if t.merged > 0 {
		parts = append(parts, "TDD runs under 1 px merged and shown as F")
	}
	if t.widened > 0 {
		parts = append(parts, "TDD runs under 1 px drawn 1 px wide")
	}
	return parts
}

// bandHeight is the height of the TDD band of a partition h px tall.
func bandHeight(h float64) float64 { return min(h, max(minBand, min(maxBand, h/4))) }

// drawTDDWash pales the runs outside the partition's own direction.
func drawTDDWash(b *builder, t *tddDrawing, top, bottom float64) {
	var off pathData
	for i := 0; i < len(t.runs); i++ {
		if t.runs[i].dir == t.want {
			continue
		}
		x0 := t.runs[i].x0
		for i+1 < len(t.runs) && t.runs[i+1].dir != t.want {
			i++
		}
		off.rect(x0, top, t.runs[i].x1, bottom)
	}
	b.add(shape{class: "gl-tdd-off", d: off, fill: solid(white).withAlpha(b.lk.washA)})
}

// drawTDDBand draws the band along the partition's foot: one path per
// direction with one rectangle per run, and the letters of the first
// period's runs.
func drawTDDBand(b *builder, t *tddDrawing, tdd *grid.TDD, top, bottom float64) {
	if len(t.runs) == 0 {
		return
	}
	lk := b.lk
	bandH := bandHeight(bottom - top)
	y0 := bottom - bandH
	var dl, ul, fl pathData
	for _, r := range t.runs {
		switch r.dir {
		case grid.Downlink:
			dl.rect(r.x0, y0, r.x1, bottom)
		case grid.Uplink:
			ul.rect(r.x0, y0, r.x1, bottom)
		default:
			fl.rect(r.x0, y0, r.x1, bottom)
		}
	}
	b.add(shape{class: "gl-tdd-d", d: dl, fill: solid(lk.tddD)})
	b.add(shape{class: "gl-tdd-f", d: fl, fill: solid(lk.tddF)})
	b.add(shape{class: "gl-tdd-u", d: ul, fill: b.pattern("gl-tdd-hatch", lk.uplinkFill)})
	var edge pathData
	edge.hline(y0, t.runs[0].x0, t.runs[len(t.runs)-1].x1)
	b.add(line("gl-tdd-edge", edge, lk.tddD, 1, 0.6))

	if bandH < letterBand || !b.shows(LayerLabels) || tdd == nil {
		return
	}
	// The pattern repeats, so the letters mark its first period only.
	for _, r := range t.runs {
		if r.start >= tdd.Period {
			break
		}
		if r.w() < letterRun {
			continue
		}
		b.text(dirLetter(lk, r.dir, (r.x0+r.x1)/2, y0+bandH/2))
	}
}

// dirLetter is the letter of direction d centred at (x, yMid).
func dirLetter(lk *look, d grid.SymbolDir, x, yMid float64) label {
	l := label{class: "gl-tdd-letter", x: float64(int(x + 0.5)), y: float64(int(yMid + letterBaseOff + 0.5)),
		runs: []run{{text: d.String(), bold: true}}, size: letterSize, anchor: anchorMiddle, fill: lk.text}
	switch d {
	case grid.Downlink:
		l.fill = lk.tddLetterOnD
	case grid.Uplink:
		l.halo = true // over the hatch
	}
	return l
}

// tddName is the pattern as engineers write it, its period and reference.
func tddName(t *grid.TDD) string {
	ms := strconv.FormatFloat(float64(t.Period)/float64(grid.TcPerSubframe), 'f', -1, 64)
	return fmt.Sprintf("%s per %s ms (%d kHz slots)", t.SlotString(), ms, t.Reference.SCSKHz())
}

// tddKeys are the key rows of the TDD band and the wash.
func tddKeys(t *grid.TDD, b *builder) []keyEntry {
	lk := b.lk
	band := func(b *builder, x0, y0, x1, y1 float64) {
		third := (x1 - x0) / 3
		dirs := []grid.SymbolDir{grid.Downlink, grid.Flexible, grid.Uplink}
		var dl, fl, ul pathData
		for i, d := range dirs {
			a, z := x0+float64(i)*third, x0+float64(i+1)*third
			switch d {
			case grid.Downlink:
				dl.rect(a, y0, z, y1)
			case grid.Flexible:
				fl.rect(a, y0, z, y1)
			default:
				ul.rect(a, y0, z, y1)
			}
		}
		b.add(shape{d: dl, fill: solid(lk.tddD)})
		b.add(shape{d: fl, fill: solid(lk.tddF)})
		b.add(shape{d: ul, fill: b.pattern("gl-tdd-hatch", lk.uplinkFill)})
		for i, d := range dirs {
			l := dirLetter(lk, d, x0+(float64(i)+0.5)*third, (y0+y1)/2)
			l.class = "" // the key's own, drawn with every layer set
			b.text(l)
		}
	}
	wash := func(b *builder, x0, y0, x1, y1 float64) {
		b.add(shape{d: pathOf(func(p *pathData) { p.rect(x0, y0, x1, y1) }), fill: b.partFill(0)})
		b.add(shape{d: pathOf(func(p *pathData) { p.rect((x0+x1)/2, y0, x1, y1) }), fill: solid(white).withAlpha(lk.washA)})
		b.add(shape{d: pathOf(func(p *pathData) { p.rect(x0, y0, x1, y1) }), stroke: solid(lk.part(0)), strokeW: 1})
	}
	return []keyEntry{
		{"TDD " + tddName(t) + ": D downlink, F flexible, U uplink", band},
		{"paler: symbols outside the partition's direction (F, and U for DL or D for UL)", wash},
	}
}
