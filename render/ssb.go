package render

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
)

// SS/PBCH blocks are drawn as one path of rectangles at their exact time
// and frequency (TS 38.211 7.4.3: 4 symbols by 240 subcarriers), above the
// partitions, white with a heavy outline so they read on any partition
// fill and in print. Blocks narrower than minStrip are widened to it, and
// blocks that then overlap are drawn as one rectangle.

// ssbGroupGap is the widest gap, in px, between blocks that share a label.
const ssbGroupGap = 40

// maxShownIndices bounds the list of candidate indices in a label.
const maxShownIndices = 28

// ssbDrawing is what is drawn of the SS/PBCH blocks.
type ssbDrawing struct {
	rects       []ssbRect
	top, bottom float64
	groups      []ssbGroup
	shown       []int // candidate indices in the span, ascending, once each
	count       int   // blocks in the span
	widened     bool  // some block was narrower than minStrip
	merged      bool  // some blocks overlap once widened
}

type ssbRect struct{ x0, x1 float64 }

// ssbGroup is a run of blocks close enough to share one label.
type ssbGroup struct {
	x0, x1  float64
	indices []int
}

// planSSB places the blocks that start within the span.
func planSSB(s grid.SSB, f frame) *ssbDrawing {
	d := &ssbDrawing{top: f.Y(s.High), bottom: f.Y(s.Low)}
	seen := map[int]bool{}
	for _, blk := range s.Blocks {
		if blk.Start >= f.span {
			continue
		}
		d.count++
		if !seen[blk.Index] {
			seen[blk.Index] = true
			d.shown = append(d.shown, blk.Index)
		}
		x0, x1 := f.X(blk.Start), f.X(min(blk.End, f.span))
		if x1-x0 < minStrip {
			mid := (x0 + x1) / 2
			x0, x1 = mid-minStrip/2, mid+minStrip/2
			d.widened = true
		}
		if n := len(d.rects); n > 0 && x0 < d.rects[n-1].x1-0.05 {
			d.rects[n-1].x1 = max(d.rects[n-1].x1, x1)
			d.merged = true
		} else {
			d.rects = append(d.rects, ssbRect{x0, x1})
		}
		if n := len(d.groups); n > 0 && x0-d.groups[n-1].x1 < ssbGroupGap {
			g := &d.groups[n-1]
			g.x1 = max(g.x1, x1)
			g.indices = append(g.indices, blk.Index)
		} else {
			d.groups = append(d.groups, ssbGroup{x0: x0, x1: x1, indices: []int{blk.Index}})
		}
	}
	slices.Sort(d.shown)
	return d
}

// drawSSB draws every block in one path.
func drawSSB(b *builder, d *ssbDrawing) {
	var p pathData
	for _, r := range d.rects {
		p.rect(r.x0, d.top, r.x1, d.bottom)
	}
	b.add(shape{class: "gl-ssb", d: p, fill: solid(b.lk.ssbFill).withAlpha(b.lk.ssbFillA),
		stroke: solid(b.lk.ssbLine), strokeW: b.lk.ssbW})
}

// drawSSBLabels names the candidate indices of each group of blocks above
// it — or below it where a label of taken (the partitions' names) is in
// the way — leaving out a label that would run into the one before or that
// has no free place. It returns the labels' extents, for other labels to
// keep clear of.
func drawSSBLabels(b *builder, d *ssbDrawing, taken []labelBox) []labelBox {
	reach := -1e9
	above, below := float64(int(d.top-4)), float64(int(d.bottom+13))
	var placed []labelBox
	for _, g := range d.groups {
		l := label{class: "gl-ssb-label", x: float64(int(g.x0 + 0.5)),
			runs: []run{{text: "SSB " + indexList(g.indices), bold: true}}, size: 10, halo: true}
		if l.x < reach+8 {
			continue
		}
		w := measure(&l)
		box := func(y float64) labelBox { return labelBox{l.x, y - 10, l.x + w, y + 3} }
		switch {
		case !box(above).hitsAny(taken):
			l.y = above
		case !box(below).hitsAny(taken):
			l.y = below
		default:
			continue // the key still lists every candidate shown
		}
		reach = l.x + w
		placed = append(placed, box(l.y))
		b.text(l)
	}
	return placed
}

// indexList writes indices as ranges, "0–3, 8", shortened to
// maxShownIndices characters.
func indexList(indices []int) string {
	v := slices.Clone(indices)
	slices.Sort(v)
	v = slices.Compact(v)
	var parts []string
	for i := 0; i < len(v); {
		j := i
		for j+1 < len(v) && v[j+1] == v[j]+1 {
			j++
		}
		if j == i {
			parts = append(parts, strconv.Itoa(v[i]))
		} else {
			parts = append(parts, fmt.Sprintf("%d–%d", v[i], v[j]))
		}
		i = j + 1
	}
	return shownN(strings.Join(parts, ", "), maxShownIndices)
}

// ssbKey is the key row of the blocks: case, spacing, the candidates in
// the span and the period.
func ssbKey(s grid.SSB, d *ssbDrawing, b *builder) keyEntry {
	text := fmt.Sprintf("SS/PBCH block, case %s at %d kHz: ", s.Case, s.Numerology.SCSKHz())
	if d.count == 0 {
		text += fmt.Sprintf("none in the span (of %d candidates, every %d ms)", s.Candidates, s.PeriodMs)
	} else {
		text += fmt.Sprintf("candidates %s of %d shown, every %d ms", indexList(d.shown), s.Candidates, s.PeriodMs)
	}
	switch {
	case d.merged:
		text += "; blocks under 1 px apart drawn as one"
	case d.widened:
		text += "; drawn ≥ 1 px wide"
	}
	return keyEntry{text, func(b *builder, x0, y0, x1, y1 float64) {
		b.add(shape{d: pathOf(func(p *pathData) { p.rect(x0+8, y0-1, x1-8, y1+1) }),
			fill: solid(b.lk.ssbFill).withAlpha(b.lk.ssbFillA), stroke: solid(b.lk.ssbLine), strokeW: b.lk.ssbW})
	}}
}
