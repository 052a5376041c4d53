package render

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
)

// The synchronization raster (grid.Result.SyncRaster) belongs to the ssb
// layer, since it says where the block may go. It is drawn as a comb
// in a strip between the frequency axis and the plot: one horizontal tick
// per GSCN of the band inside the channel, hanging from the plot's left
// edge, long where a block centred there fits the channel and the carrier,
// short where it would not, and a solid wedge pointing into the plot at the
// GSCN of the plan's own block. Kept out of the plot, the ticks cannot be
// taken for PRB rows. Ticks are one path per kind and a tick is a single
// segment, so the cost follows the raster's points (at most a few hundred),
// not the lattice.

// The raster strip and its marks, in px.
const (
	rasterStrip  = 12 // the frequency axis moves this far left of the plot
	rasterFitLen = 9
	rasterOffLen = 4
	rasterWedgeW = 9
	rasterWedgeH = 4.5 // half the wedge's height
	rasterTickW  = 1.2
)

// syncDrawing is what is drawn of the synchronization raster.
type syncDrawing struct {
	fit, off pathData
	wedge    pathData
	block    int    // the block's GSCN when drawn, else 0
	blockRef string // its SS_REF, written for the key
	shown    int    // raster points inside the window
	data     []attr
}

// planSyncRaster places the ticks of the raster points inside the plot's
// frequency window, and the wedge of the block's GSCN.
func planSyncRaster(r grid.Result, f frame, fromA bool) *syncDrawing {
	s := r.SyncRaster
	d := &syncDrawing{}
	x := float64(f.x) - 1 // the ticks end at the plot's frame
	var gscns, refs, fits strings.Builder
	for _, p := range s.Points {
		if p.SSRef < f.low || p.SSRef > f.high {
			continue
		}
		d.shown++
		y := f.Y(p.SSRef)
		if p.Fits {
			d.fit.hline(y, x-rasterFitLen, x)
		} else {
			d.off.hline(y, x-rasterOffLen, x)
		}
		if gscns.Len() > 0 {
			gscns.WriteByte(' ')
			refs.WriteByte(' ')
		}
		gscns.WriteString(strconv.Itoa(p.GSCN))
		refs.WriteString(strconv.FormatInt(int64(p.SSRef), 10))
		fits.WriteByte("01"[b2i(p.Fits)])
	}
	if b := r.SSB; b != nil && b.Absolute && b.OnSyncRaster && b.SSRef >= f.low && b.SSRef <= f.high {
		y := f.Y(b.SSRef)
		d.wedge.moveTo(x-rasterWedgeW, y-rasterWedgeH)
		d.wedge.lineTo(x+1, y)
		d.wedge.lineTo(x-rasterWedgeW, y+rasterWedgeH)
		d.wedge.close()
		d.block = b.GSCN
		d.blockRef = fmtMHz(b.SSRef) + " from point A"
		if !fromA {
			d.blockRef = fmtMHz(b.SSRefHz)
		}
	}
	// For a page's readout: the points in frequency order, SS_REF from
	// point A like the plot's data-low-hz, and which fit ('1') or not ('0').
	d.data = []attr{{"data-scs-khz", strconv.Itoa(s.SCSKHz)}, {"data-gscn", gscns.String()},
		{"data-ss-ref-hz", refs.String()}, {"data-fits", fits.String()}}
	if bandName(s.Band) {
		d.data = append([]attr{{"data-band", s.Band}}, d.data...)
	}
	if d.block != 0 {
		d.data = append(d.data, attr{"data-block-gscn", strconv.Itoa(d.block)})
	}
	return d
}

func b2i(v bool) int {
	if v {
		return 1
	}
	return 0
}

// bandName reports whether s is written as the band tables write a band,
// "n" and digits, so that it may stand in an attribute.
func bandName(s string) bool {
	if len(s) < 2 || len(s) > 5 || s[0] != 'n' {
		return false
	}
	for _, c := range s[1:] {
		if c < '0' || c > '9' {
			return false
		}
	}
	return true
}

// drawSyncRaster draws the comb in its own group, which carries the
// raster's points as data attributes.
func drawSyncRaster(b *builder, f frame, d *syncDrawing) {
	b.open(group{class: "gl-raster", data: d.data})
	b.add(line("gl-raster-fit", d.fit, b.lk.text, 1, rasterTickW))
	b.add(line("gl-raster-off", d.off, b.lk.text, 1, rasterTickW))
	b.add(shape{class: "gl-raster-block", d: d.wedge, fill: solid(b.lk.text)})
	b.end()
}

// syncKeys are the key rows of the raster: the comb, and the block's GSCN
// when it is drawn.
func syncKeys(s *grid.SyncRaster, d *syncDrawing) []keyEntry {
	text := fmt.Sprintf("sync raster of %s at %d kHz: ", shownN(s.Band, 8), s.SCSKHz)
	switch n := len(s.Points); {
	case d.shown == 0:
		text += "no GSCN inside the channel"
	case n == 1:
		text += fmt.Sprintf("GSCN %d; long tick: a block fits", s.Points[0].GSCN)
	default:
		text += fmt.Sprintf("GSCN %d–%d (%d); long tick: a block fits", s.Points[0].GSCN, s.Points[n-1].GSCN, n)
	}
	keys := []keyEntry{{text, func(b *builder, x0, y0, x1, y1 float64) {
		// As beside the plot: the axis spine, the ticks, the plot's edge.
		var long, short, edges pathData
		xe := x0 + 8 + rasterStrip
		for i, y := range []float64{y0, (y0 + y1) / 2, y1} {
			if i == 1 {
				short.hline(y, xe-1-rasterOffLen, xe-1)
			} else {
				long.hline(y, xe-1-rasterFitLen, xe-1)
			}
		}
		edges.vline(x0+8, y0-2, y1+2)
		edges.vline(xe, y0-2, y1+2)
		b.add(line("", edges, b.lk.soft, 1, 1))
		b.add(line("", long, b.lk.text, 1, rasterTickW))
		b.add(line("", short, b.lk.text, 1, rasterTickW))
	}}}
	if d.block != 0 {
		keys = append(keys, keyEntry{fmt.Sprintf("the SS/PBCH block's GSCN %d: SS_REF %s", d.block, d.blockRef),
			func(b *builder, x0, y0, x1, y1 float64) {
				y := (y0 + y1) / 2
				xe := x0 + 8 + rasterStrip
				var edges, w pathData
				edges.vline(x0+8, y0-2, y1+2)
				edges.vline(xe, y0-2, y1+2)
				w.moveTo(xe-1-rasterWedgeW, y-rasterWedgeH)
				w.lineTo(xe, y)
				w.lineTo(xe-1-rasterWedgeW, y+rasterWedgeH)
				w.close()
				b.add(line("", edges, b.lk.soft, 1, 1))
				b.add(shape{d: w, fill: solid(b.lk.text)})
			}})
	}
	return keys
}
