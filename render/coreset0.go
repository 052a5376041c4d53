package render

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
)

// CORESET#0 and its Type0-PDCCH monitoring occasions (grid.Result's
// InitialAccess, TS 38.213 13) are drawn as dashed outlines over a white
// underlay, one rectangle per group of occasions that touch once widened
// to minStrip: the occasions in time by CORESET#0's CRBs in frequency. The
// outlines are one path (and its underlay one more), so an SS/PBCH burst of
// 64 blocks costs two elements, not 64. The initial downlink BWP is a
// bracket beside its carrier on the rail, the initial uplink BWP a dashed
// one beside it. All of it is the coreset0 layer, apart from the block it
// follows, so a figure can show the block without the initial access.

// coresetDash is the outline's dash pattern, in px: unlike the SS/PBCH
// block's solid outline, so the two read apart in greyscale.
var coresetDash = []float64{4, 2}

// ulDash is the initial uplink BWP's bracket's dash pattern, in px.
var ulDash = []float64{2, 1.5}

// coresetDrawing is what is drawn of CORESET#0.
type coresetDrawing struct {
	rects       []ssbRect
	groups      []ssbGroup // runs of occasions that share a label
	top, bottom float64
	shown       []int // SS/PBCH indices whose occasions are in the span
	count       int   // occasions in the span
	data        []attr
}

// planCoreset0 places the occasions that start within the span: one
// rectangle per group of occasions that share their symbols
// (InitialAccess.OccasionGroups), groups that touch once widened to
// minStrip drawn as one.
func planCoreset0(ia grid.InitialAccess, f frame) *coresetDrawing {
	c := ia.CORESET0
	d := &coresetDrawing{top: f.Y(c.High), bottom: f.Y(c.Low)}
	seen := map[int]bool{}
	for _, og := range ia.OccasionGroups() {
		if og.Start >= f.span {
			continue
		}
		d.count += len(og.SSBIndexes)
		for _, k := range og.SSBIndexes {
			if !seen[k] {
				seen[k] = true
				d.shown = append(d.shown, k)
			}
		}
		x0, x1 := f.X(og.Start), f.X(min(og.End, f.span))
		if x1-x0 < minStrip {
			mid := (x0 + x1) / 2
			x0, x1 = mid-minStrip/2, mid+minStrip/2
		}
		if n := len(d.rects); n > 0 && x0 <= d.rects[n-1].x1+0.05 {
			d.rects[n-1].x1 = max(d.rects[n-1].x1, x1)
		} else {
			d.rects = append(d.rects, ssbRect{x0, x1})
		}
		if n := len(d.groups); n > 0 && x0-d.groups[n-1].x1 < ssbGroupGap {
			g := &d.groups[n-1]
			g.x1 = max(g.x1, x1)
			g.indices = append(g.indices, og.SSBIndexes...)
		} else {
			d.groups = append(d.groups, ssbGroup{x0: x0, x1: x1, indices: slices.Clone(og.SSBIndexes)})
		}
	}
	slices.Sort(d.shown)
	var ssbs, starts, ends strings.Builder
	for _, o := range ia.Occasions {
		if o.Start >= f.span {
			continue
		}
		if ssbs.Len() > 0 {
			ssbs.WriteByte(' ')
			starts.WriteByte(' ')
			ends.WriteByte(' ')
		}
		ssbs.WriteString(strconv.Itoa(o.SSBIndex))
		starts.WriteString(strconv.FormatInt(int64(o.Start), 10))
		ends.WriteString(strconv.FormatInt(int64(o.End), 10))
	}
	// For a page's readout: CORESET#0's place, and each occasion drawn, in
	// time order: its SS/PBCH index and its start and end in Tc.
	d.data = []attr{
		{"data-low-hz", strconv.FormatInt(int64(c.Low), 10)}, {"data-high-hz", strconv.FormatInt(int64(c.High), 10)},
		{"data-start-crb", strconv.Itoa(c.StartCRB)}, {"data-nrb", strconv.Itoa(c.NRB)},
		{"data-symbols", strconv.Itoa(c.Symbols)}, {"data-scs-khz", strconv.Itoa(c.SCSKHz)},
		{"data-occ-ssb", ssbs.String()}, {"data-occ-start-tc", starts.String()}, {"data-occ-end-tc", ends.String()},
	}
	return d
}

// drawCoreset0 draws the occasions' outlines over a white underlay that
// keeps the dashes readable on any partition.
func drawCoreset0(b *builder, d *coresetDrawing) {
	var p pathData
	for _, r := range d.rects {
		p.rect(r.x0, d.top, r.x1, d.bottom)
	}
	b.open(group{class: "gl-coreset0", data: d.data})
	b.add(line("gl-coreset0-under", p, white, 0.9, b.lk.coresetW+2))
	edge := line("gl-coreset0-edge", p, black, 1, b.lk.coresetW)
	edge.dash = coresetDash
	b.add(edge)
	b.end()
}

// drawCoreset0Labels names each group of occasions above it, leaving out
// a label that would run into the one before or into one already placed
// (the SS/PBCH blocks' labels and the partitions' names, in taken).
func drawCoreset0Labels(b *builder, d *coresetDrawing, taken []labelBox) {
	reach := -1e9
	y := float64(int(d.top - 4))
	for _, g := range d.groups {
		l := label{class: "gl-coreset0-label", x: float64(int(g.x0 + 0.5)), y: y,
			runs: []run{{text: "CORESET#0 for SSB " + indexList(g.indices)}}, size: 10, halo: true}
		w := measure(&l)
		if l.x < reach+8 || (labelBox{l.x, y - 10, l.x + w, y + 3}).hitsAny(taken) {
			continue
		}
		reach = l.x + w
		b.text(l)
	}
}

// labelBox is a label's extent, for keeping labels apart.
type labelBox struct{ x0, y0, x1, y1 float64 }

func (a labelBox) hitsAny(bs []labelBox) bool {
	for _, b := range bs {
		if a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1 {
			return true
		}
	}
	return false
}

// drawInitialBWPs draws the initial downlink BWP as a bracket beside the
// rail bar of its spacing, and the initial uplink BWP, when it has one, as
// a dashed bracket beside that. railX is the first bar's left edge.
func drawInitialBWPs(b *builder, f frame, r grid.Result, railX int) {
	ia := r.InitialAccess
	bracket := func(class string, bwp grid.InitialBWP, dx float64, dash []float64) {
		j := -1
		for k, c := range r.Carriers {
			if c.SCSKHz == bwp.SCSKHz {
				j = k
			}
		}
		if j < 0 {
			return // no carrier of its spacing: the key says where it is
		}
		x := float64(railX+j*railStep+railBar) + dx
		top, bottom := f.Y(bwp.High), f.Y(bwp.Low)
		var p pathData
		p.moveTo(x-3, top)
		p.lineTo(x, top)
		p.lineTo(x, bottom)
		p.lineTo(x-3, bottom)
		s := line("gl-bracket", p, b.lk.text, 1, 1.4)
		s.dash = dash
		b.open(group{class: class, data: []attr{
			{"data-low-hz", strconv.FormatInt(int64(bwp.Low), 10)}, {"data-high-hz", strconv.FormatInt(int64(bwp.High), 10)},
			{"data-start-crb", strconv.Itoa(bwp.StartCRB)}, {"data-size-prb", strconv.Itoa(bwp.SizePRB)},
			{"data-scs-khz", strconv.Itoa(bwp.SCSKHz)}}})
		b.add(s)
		b.end()
	}
	bracket("gl-initial-dl", ia.InitialDL, 4, nil)
	if ul := ia.InitialUL; ul != nil {
		bracket("gl-initial-ul", *ul, 8, ulDash)
	}
}

// coresetKeys are the key rows of CORESET#0, its occasions and the
// initial BWPs.
func coresetKeys(ia grid.InitialAccess, d *coresetDrawing, b *builder) []keyEntry {
	c := ia.CORESET0
	text := fmt.Sprintf("CORESET#0, %d RBs × %d symbols at %d kHz: ", c.NRB, c.Symbols, c.SCSKHz)
	if d.count == 0 {
		text += "no Type0-PDCCH occasion in the span"
	} else {
		text += fmt.Sprintf("Type0-PDCCH occasions, SSB %s", indexList(d.shown))
	}
	keys := []keyEntry{{text, func(b *builder, x0, y0, x1, y1 float64) {
		p := pathOf(func(p *pathData) { p.rect(x0+8, y0-1, x1-8, y1+1) })
		b.add(line("", p, white, 0.9, b.lk.coresetW+2))
		s := line("", p, black, 1, b.lk.coresetW)
		s.dash = coresetDash
		b.add(s)
	}}}
	dl, ul := ia.InitialDL, ia.InitialUL
	crbs := func(w grid.InitialBWP) string {
		return fmt.Sprintf("CRB %d–%d at %d kHz", w.StartCRB, w.StartCRB+w.SizePRB-1, w.SCSKHz)
	}
	switch {
	case ul == nil:
		text = "initial DL BWP, " + crbs(dl) + " (beside the rail)"
	case ul.StartCRB == dl.StartCRB && ul.SizePRB == dl.SizePRB && ul.SCSKHz == dl.SCSKHz:
		text = "initial DL BWP, " + crbs(dl) + "; UL (dashed) the same"
	default:
		text = "initial DL BWP, " + crbs(dl) + "; UL (dashed) " + crbs(*ul)
	}
	keys = append(keys, keyEntry{text, func(b *builder, x0, y0, x1, y1 float64) {
		bracket := func(x float64, dash []float64) {
			var p pathData
			p.moveTo(x-3, y0-1)
			p.lineTo(x, y0-1)
			p.lineTo(x, y1+1)
			p.lineTo(x-3, y1+1)
			s := line("", p, b.lk.text, 1, 1.4)
			s.dash = dash
			b.add(s)
		}
		bracket(x0+13, nil)
		if ul != nil {
			bracket(x0+17, ulDash)
		}
	}})
	return keys
}
