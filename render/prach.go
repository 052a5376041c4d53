package render

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
)

// PRACH occasions (grid.Result's PRACH, TS 38.211 6.3.3.2 and TS 38.213
// 8.1) are outlines over a white underlay, like CORESET#0, each occasion
// its start to end in time by its N_RB^RA resource blocks in frequency.
// The valid occasions are one path in a dash-dot outline; the invalid ones
// one more path, dotted and crossed, so that they read as wrong in
// greyscale too. Occasions that land on the same pixels are drawn once,
// and occasions that touch in time at the same frequencies once widened to
// minStrip become one rectangle, so a plan with hundreds of occasions in
// the span costs four elements.

// prachDash is the valid occasions' outline: dash-dot, unlike the SS/PBCH
// block's solid and CORESET#0's dashed outlines.
var prachDash = []float64{6, 2, 1.5, 2}

// prachBadDash is the invalid occasions' dotted outline.
var prachBadDash = []float64{1.5, 1.5}

// prachRect is one drawn rectangle of occasions.
type prachRect struct{ x0, x1, y0, y1 float64 }

// prachDrawing is what is drawn of the PRACH occasions.
type prachDrawing struct {
	valid, invalid []prachRect
	nValid, nBad   int // occasions in the span
	data           []attr
}

// planPRACH places the occasions that start within the span.
func planPRACH(p grid.PRACH, f frame) *prachDrawing {
	d := &prachDrawing{}
	var starts, ends, lows, highs, valid, ssbs strings.Builder
	sep := func() {
		if starts.Len() > 0 {
			for _, s := range []*strings.Builder{&starts, &ends, &lows, &highs, &valid, &ssbs} {
				s.WriteByte(' ')
			}
		}
	}
	for _, o := range p.Occasions {
		if o.Start >= f.span {
			continue
		}
		x0, x1 := f.X(o.Start), f.X(min(o.End, f.span))
		if x1-x0 < minStrip {
			mid := (x0 + x1) / 2
			x0, x1 = mid-minStrip/2, mid+minStrip/2
		}
		y0, y1 := f.Y(o.High), f.Y(o.Low)
		if y1-y0 < minStrip {
			mid := (y0 + y1) / 2
			y0, y1 = mid-minStrip/2, mid+minStrip/2
		}
		rs := &d.valid
		if o.Valid {
			d.nValid++
		} else {
			rs = &d.invalid
			d.nBad++
		}
		*rs = mergePRACH(*rs, prachRect{x0, x1, y0, y1})
		sep()
		starts.WriteString(strconv.FormatInt(int64(o.Start), 10))
		ends.WriteString(strconv.FormatInt(int64(o.End), 10))
		lows.WriteString(strconv.FormatInt(int64(o.Low), 10))
		highs.WriteString(strconv.FormatInt(int64(o.High), 10))
		if o.Valid {
			valid.WriteByte('1')
		} else {
			valid.WriteByte('0')
		}
		if len(o.SSBIndexes) == 0 {
			ssbs.WriteByte('-')
		}
		for i, k := range o.SSBIndexes {
			if i > 0 {
				ssbs.WriteByte(',')
			}
			ssbs.WriteString(strconv.Itoa(k))
		}
	}
	// For a page's readout: the configuration, and each occasion drawn, in
	// time then frequency order: its start and end in Tc, its low and high
	// edge in Hz from point A, 1 when valid, and its SS/PBCH indices
	// (comma-separated, "-" for none).
	d.data = []attr{
		{"data-index", strconv.Itoa(p.ConfigurationIndex)}, {"data-format", p.Format},
		{"data-table", p.Table}, {"data-scs-hz", strconv.Itoa(p.SCSHz)}, {"data-nrb-ra", strconv.Itoa(p.NRBRA)},
		{"data-occ-start-tc", starts.String()}, {"data-occ-end-tc", ends.String()},
		{"data-occ-low-hz", lows.String()}, {"data-occ-high-hz", highs.String()},
		{"data-occ-valid", valid.String()}, {"data-occ-ssb", ssbs.String()},
	}
	return d
}

// mergePRACH adds r to rs: dropped when it repeats one already there (the
// same time and frequency once in pixels), joined to one at the same
// frequencies that it touches in time, appended otherwise. Occasions come
// time first, so looking back over the last few rectangles (one per
// occasion side by side in frequency, at most eight) finds both.
func mergePRACH(rs []prachRect, r prachRect) []prachRect {
	const eps = 0.05
	for i := len(rs) - 1; i >= 0 && i >= len(rs)-8; i-- {
		q := &rs[i]
		if abs(q.y0-r.y0) > eps || abs(q.y1-r.y1) > eps {
			continue
		}
		if r.x0 <= q.x1+eps && q.x0 <= r.x1+eps {
			q.x0, q.x1 = min(q.x0, r.x0), max(q.x1, r.x1)
			return rs
		}
	}
	return append(rs, r)
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}

// drawPRACH draws the occasions: an underlay that keeps the outlines
// readable on any partition, the valid occasions' outline, and the invalid
// ones' outline with a cross through each.
func drawPRACH(b *builder, d *prachDrawing) {
	var under, ok, bad pathData
	for _, r := range d.valid {
		ok.rect(r.x0, r.y0, r.x1, r.y1)
		under.rect(r.x0, r.y0, r.x1, r.y1)
	}
	for _, r := range d.invalid {
		bad.rect(r.x0, r.y0, r.x1, r.y1)
		bad.moveTo(r.x0, r.y0)
		bad.lineTo(r.x1, r.y1)
		bad.moveTo(r.x0, r.y1)
		bad.lineTo(r.x1, r.y0)
		under.rect(r.x0, r.y0, r.x1, r.y1)
	}
	b.open(group{class: "gl-prach", data: d.data})
	b.add(line("gl-prach-under", under, white, 0.9, b.lk.coresetW+2))
	if len(d.valid) > 0 {
		s := line("gl-prach-edge", ok, black, 1, b.lk.coresetW)
		s.dash = prachDash
		b.add(s)
	}
	if len(d.invalid) > 0 {
		s := line("gl-prach-bad", bad, black, 1, b.lk.coresetW)
		s.dash = prachBadDash
		b.add(s)
	}
	b.end()
}

// prachKeys are the key rows of the PRACH occasions: the valid ones, and
// the invalid ones when the span has any.
func prachKeys(p grid.PRACH, d *prachDrawing) []keyEntry {
	head := fmt.Sprintf("PRACH index %d, format %s at %s", p.ConfigurationIndex, p.Format, scsText(p.SCSHz))
	text := head + ": "
	switch {
	case d.nValid+d.nBad == 0 && len(p.Occasions) > 0:
		// The span is shorter than the frame: say where to look.
		text += "no occasion in the span; the first starts at " + fmtMs(p.Occasions[0].Start)
	case d.nValid == 0:
		text += "no valid occasion in the span"
	case d.nValid == 1:
		text += "1 valid occasion"
	default:
		text += fmt.Sprintf("%d valid occasions", d.nValid)
	}
	keys := []keyEntry{{text, func(b *builder, x0, y0, x1, y1 float64) {
		p := pathOf(func(p *pathData) { p.rect(x0+8, y0-1, x1-8, y1+1) })
		b.add(line("", p, white, 0.9, b.lk.coresetW+2))
		s := line("", p, black, 1, b.lk.coresetW)
		s.dash = prachDash
		b.add(s)
	}}}
	if d.nBad > 0 {
		keys = append(keys, keyEntry{fmt.Sprintf("PRACH occasions not valid (TS 38.213 8.1): %d", d.nBad), func(b *builder, x0, y0, x1, y1 float64) {
			p := pathOf(func(p *pathData) {
				p.rect(x0+8, y0-1, x1-8, y1+1)
				p.moveTo(x0+8, y0-1)
				p.lineTo(x1-8, y1+1)
				p.moveTo(x0+8, y1+1)
				p.lineTo(x1-8, y0-1)
			})
			b.add(line("", p, white, 0.9, b.lk.coresetW+2))
			s := line("", p, black, 1, b.lk.coresetW)
			s.dash = prachBadDash
			b.add(s)
		}})
	}
	return keys
}

// scsText writes a PRACH subcarrier spacing: 1.25 kHz, 5 kHz, 30 kHz.
func scsText(hz int) string {
	return strconv.FormatFloat(float64(hz)/1000, 'f', -1, 64) + " kHz"
}
