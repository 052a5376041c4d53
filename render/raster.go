package render

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"hash/crc32"
	"image"
	"image/draw"
	"image/png"
	"io"
	"math"

	"golang.org/x/image/font"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
	"golang.org/x/image/vector"

	"gridloom/grid"
)

// FigurePNG draws r as a PNG image of the same layout as Figure's SVG, as
// many pixels as the SVG's width and height (one per SVG unit without a
// Preset) times Options.PNGScale. It rasterises the display list in pure
// Go with golang.org/x/image/vector and sets text in the Go fonts.
// Patterns are drawn exactly as tiles; text halos are approximated by
// growing the glyphs' coverage. With Options.DPI the PNG's pHYs chunk
// gives that resolution. The PNG carries no plan.
func FigurePNG(w io.Writer, r grid.Result, opt Options) error {
	d, err := build(r, opt)
	if err != nil {
		return err
	}
	k := float64(d.outW) / float64(d.w) * float64(max(1, opt.PNGScale))
	pw, ph := int(math.Round(float64(d.w)*k)), int(math.Round(float64(d.h)*k))
	if pw*ph > MaxPNGPixels {
		return &PNGSizeError{Width: pw, Height: ph}
	}
	halo := 1
	if k != 1 {
		d = scaleDoc(d, k)
		halo = max(1, int(math.Round(k)))
	}
	img, err := paintDoc(d, halo)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := (&png.Encoder{CompressionLevel: png.BestSpeed}).Encode(&buf, img); err != nil {
		return fmt.Errorf("render: encoding the PNG: %w", err)
	}
	out := buf.Bytes()
	if opt.DPI != 0 {
		out = withPHYs(out, opt.DPI)
	}
	_, err = w.Write(out)
	return err
}

// ErrPNGTooLarge is what a *PNGSizeError is (errors.Is): the options ask
// for a PNG of more than MaxPNGPixels, a request to refuse, not a failure
// of the renderer.
var ErrPNGTooLarge = errors.New("render: the PNG is too large")

// PNGSizeError is returned when the options ask for a PNG of more than
// MaxPNGPixels; its callers name their own knobs (flags or query keys)
// beside Size.
type PNGSizeError struct{ Width, Height int }

// Size says how large the PNG would be, against the limit.
func (e *PNGSizeError) Size() string {
	return fmt.Sprintf("it would be %d × %d px, more than %d pixels", e.Width, e.Height, MaxPNGPixels)
}

func (e *PNGSizeError) Error() string {
	return ErrPNGTooLarge.Error() + ": " + e.Size() + "; give a smaller width, scale or dpi"
}

func (e *PNGSizeError) Is(target error) bool { return target == ErrPNGTooLarge }

// pixelsPerMetre is the pHYs chunk's resolution for dpi dots per inch,
// rounded: 300 dpi is 300/0.0254 = 11811.02, so 11811 (PNG specification,
// 11.3.5.3 pHYs, whose unit is the metre).
func pixelsPerMetre(dpi int) uint32 { return uint32(math.Round(float64(dpi) / 0.0254)) }

// withPHYs puts a pHYs chunk saying dpi right after the IHDR chunk of the
// PNG p, where the PNG specification (5.6, chunk ordering) wants it before
// the IDAT chunks: 8 bytes of signature, then IHDR's length, type, 13
// bytes of data and CRC.
func withPHYs(p []byte, dpi int) []byte {
	const afterIHDR = 8 + 4 + 4 + 13 + 4
	ppm := pixelsPerMetre(dpi)
	var chunk [4 + 4 + 9 + 4]byte
	binary.BigEndian.PutUint32(chunk[0:], 9)
	copy(chunk[4:], "pHYs")
	binary.BigEndian.PutUint32(chunk[8:], ppm)
	binary.BigEndian.PutUint32(chunk[12:], ppm)
	chunk[16] = 1 // the unit is the metre
	binary.BigEndian.PutUint32(chunk[17:], crc32.ChecksumIEEE(chunk[4:17]))
	out := make([]byte, 0, len(p)+len(chunk))
	out = append(out, p[:afterIHDR]...)
	out = append(out, chunk[:]...)
	return append(out, p[afterIHDR:]...)
}

// scaleDoc is d drawn k times larger, for the PNG: every coordinate, width,
// dash and font size times k. Labels keep the whole-pixel positions of the
// layout, times k. At a whole k a pattern's tile is k times its own; at
// another k the pattern repeats every tile × k px, which is not a whole
// number, so its tile is drawn patternSuper times finer still and the
// painter averages it over each pixel's footprint (see painter.tile).
func scaleDoc(d *doc, k float64) *doc {
	out := *d
	out.w, out.h = int(math.Round(float64(d.w)*k)), int(math.Round(float64(d.h)*k))
	scalePath := func(p pathData, k float64) pathData {
		q := pathData{cmds: make([]pathCmd, len(p.cmds)), segs: p.segs}
		for i, c := range p.cmds {
			q.cmds[i] = pathCmd{c.op, pt{c.p.x * k, c.p.y * k}}
		}
		return q
	}
	scaleShape := func(s shape, k float64) shape {
		s.d = scalePath(s.d, k)
		s.strokeW *= k
		if s.dash != nil {
			dash := make([]float64, len(s.dash))
			for i, v := range s.dash {
				dash[i] = v * k
			}
			s.dash = dash
		}
		if s.circle != nil {
			s.circle = &circle{s.circle.cx * k, s.circle.cy * k, s.circle.r * k}
		}
		return s
	}
	out.patterns = make([]pattern, len(d.patterns))
	for i, p := range d.patterns {
		q := pattern{id: p.id, tile: int(math.Round(float64(p.tile) * k)), shapes: make([]shape, len(p.shapes))}
		if k != math.Trunc(k) {
			q.period = float64(p.tile) * k
			q.tile = max(1, int(math.Round(q.period*patternSuper)))
		}
		kt := float64(q.tile) / float64(p.tile)
		for j, s := range p.shapes {
			q.shapes[j] = scaleShape(s, kt)
		}
		out.patterns[i] = q
	}
	out.items = make([]item, len(d.items))
	for i, it := range d.items {
		switch it := it.(type) {
		case *shape:
			s := scaleShape(*it, k)
			out.items[i] = &s
		case *label:
			l := *it
			x, y := it.pos()
			l.x, l.y, l.size = float64(x)*k, float64(y)*k, it.size*k
			if len(it.runs) > 0 {
				l.runs = make([]run, len(it.runs))
				for j, r := range it.runs {
					r.dx *= k
					l.runs[j] = r
				}
			}
			out.items[i] = &l
		default:
			out.items[i] = it
		}
	}
	return &out
}

// painter rasterises a doc; it is used by one goroutine.
type painter struct {
	d      *doc
	fs     *faces
	buf    sfnt.Buffer
	z      vector.Rasterizer
	mask   []byte
	part   []byte        // one group's coverage, for rasterMax
	tiles  []*image.RGBA // per pattern, made on first use
	glyphs map[glyphKey]*glyph
	halo   int   // growMask passes for a halo
	cols   []int // a pattern's texel offset for each column composited
}

type glyphKey struct {
	bold bool
	size fixed.Int26_6
	r    rune
}

// glyph is a glyph's outline at one size, origin on the baseline, and its
// index for kerning.
type glyph struct {
	index   sfnt.GlyphIndex
	advance float64
	segs    []oseg
}

// paintDoc rasterises d onto white; halo is how many times a halo grows
// the glyphs' coverage by haloGrow px (the scale of a scaled doc).
func paintDoc(d *doc, halo int) (*image.RGBA, error) {
	fs, err := loadFaces()
	if err != nil {
		return nil, fmt.Errorf("render: loading the Go fonts: %w", err)
	}
	pa := &painter{d: d, fs: fs, tiles: make([]*image.RGBA, len(d.patterns)), glyphs: map[glyphKey]*glyph{}, halo: halo}
	img := image.NewRGBA(image.Rect(0, 0, d.w, d.h))
	draw.Draw(img, img.Bounds(), image.White, image.Point{}, draw.Src)
	for _, it := range d.items {
		switch it := it.(type) {
		case *shape:
			pa.shape(img, it)
		case *label:
			pa.label(img, it)
		}
	}
	return img, nil
}

func (pa *painter) shape(dst *image.RGBA, s *shape) {
	if c := s.circle; c != nil {
		if s.fill.kind != paintNone {
			o := &outline{}
			circleOf(o, c.cx, c.cy, c.r, false)
			pa.fill(dst, o, s.fill, false)
		}
		if s.stroke.kind != paintNone && s.strokeW > 0 {
			o := &outline{}
			circleOf(o, c.cx, c.cy, c.r+s.strokeW/2, false)
			circleOf(o, c.cx, c.cy, c.r-s.strokeW/2, true)
			pa.fill(dst, o, s.stroke, false)
		}
		return
	}
	if s.fill.kind != paintNone {
		pa.fill(dst, fillOf(&s.d), s.fill, false)
	}
	if s.stroke.kind != paintNone && s.strokeW > 0 {
		pa.fill(dst, strokeOf(&s.d, s.strokeW, s.dash), s.stroke, false)
	}
}

// haloGrow is how far a halo reaches beyond the glyphs: half the SVG's
// stroke-width of 3.
const haloGrow = 1.5

// fill paints the non-zero interior of o with p; grow widens the coverage
// by haloGrow first.
func (pa *painter) fill(dst *image.RGBA, o *outline, p paint, grow bool) {
	if len(o.segs) == 0 {
		return
	}
	pad := 1
	if grow {
		pad = 1 + 2*pa.halo
	}
	r := image.Rect(int(math.Floor(o.min.x))-pad, int(math.Floor(o.min.y))-pad,
		int(math.Ceil(o.max.x))+pad, int(math.Ceil(o.max.y))+pad).Intersect(dst.Bounds())
	if r.Empty() {
		return
	}
	w, h := r.Dx(), r.Dy()
	mask := scratchAlpha(&pa.mask, w, h)
	if len(o.groups) <= 1 {
		pa.raster(mask, o.segs, r.Min)
	} else {
		clear(mask.Pix)
		for g, start := range o.groups {
			end := len(o.segs)
			if g+1 < len(o.groups) {
				end = o.groups[g+1]
			}
			pa.rasterMax(mask, o.segs[start:end], r)
		}
	}
	if grow {
		for range pa.halo {
			mask = growMask(mask)
		}
	}
	pa.composite(dst, r.Min, mask, p)
}

// raster writes the coverage of segs into m, whose pixel (0, 0) is at.
func (pa *painter) raster(m *image.Alpha, segs []oseg, at image.Point) {
	w, h := m.Rect.Dx(), m.Rect.Dy()
	pa.z.Reset(w, h)
	ox, oy := float64(at.X), float64(at.Y)
	f := func(p pt) (float32, float32) { return float32(p.x - ox), float32(p.y - oy) }
	open := false
	for _, s := range segs {
		switch s.op {
		case 'M':
			if open {
				pa.z.ClosePath()
			}
			pa.z.MoveTo(f(s.p[0]))
			open = true
		case 'L':
			pa.z.LineTo(f(s.p[0]))
		case 'Q':
			bx, by := f(s.p[0])
			cx, cy := f(s.p[1])
			pa.z.QuadTo(bx, by, cx, cy)
		case 'Z':
			pa.z.ClosePath()
			open = false
		}
	}
	if open {
		pa.z.ClosePath()
	}
	pa.z.DrawOp = draw.Src
	pa.z.Draw(m, m.Bounds(), image.Opaque, image.Point{})
}

// rasterMax raises m, which covers r of the image, to the coverage of
// segs wherever that is larger.
func (pa *painter) rasterMax(m *image.Alpha, segs []oseg, r image.Rectangle) {
	var lo, hi pt
	first := true
	for _, s := range segs {
		for _, p := range s.p[:opPoints(s.op)] {
			if first {
				lo, hi, first = p, p, false
			}
			lo = pt{min(lo.x, p.x), min(lo.y, p.y)}
			hi = pt{max(hi.x, p.x), max(hi.y, p.y)}
		}
	}
	if first {
		return
	}
	gr := image.Rect(int(math.Floor(lo.x))-1, int(math.Floor(lo.y))-1, int(math.Ceil(hi.x))+1, int(math.Ceil(hi.y))+1).Intersect(r)
	if gr.Empty() {
		return
	}
	w, h := gr.Dx(), gr.Dy()
	part := scratchAlpha(&pa.part, w, h)
	pa.raster(part, segs, gr.Min)
	for y := range h {
		row := m.Pix[(gr.Min.Y-r.Min.Y+y)*m.Stride+(gr.Min.X-r.Min.X):]
		for x, v := range part.Pix[y*w : y*w+w] {
			if v > row[x] {
				row[x] = v
			}
		}
	}
}

func opPoints(op byte) int {
	switch op {
	case 'M', 'L':
		return 1
	case 'Q':
		return 2
	}
	return 0
}

// growKernel weighs each neighbour within reach of a halo: fully up to
// haloGrow px away, fading over the next pixel.
var growKernel = func() (k [5][5]float64) {
	for dy := -2; dy <= 2; dy++ {
		for dx := -2; dx <= 2; dx++ {
			k[dy+2][dx+2] = min(1, max(0, haloGrow+1-math.Hypot(float64(dx), float64(dy))))
		}
	}
	return k
}()

// growMask is the coverage of the glyphs' outline stroked haloGrow px
// wide, approximated by a weighted maximum over neighbours.
func growMask(m *image.Alpha) *image.Alpha {
	w, h := m.Rect.Dx(), m.Rect.Dy()
	out := image.NewAlpha(m.Rect)
	for y := range h {
		for x := range w {
			best := 0.0
			for dy := -2; dy <= 2; dy++ {
				yy := y + dy
				if yy < 0 || yy >= h {
					continue
				}
				for dx := -2; dx <= 2; dx++ {
					xx := x + dx
					if xx < 0 || xx >= w {
						continue
					}
					if v := float64(m.Pix[yy*m.Stride+xx]) * growKernel[dy+2][dx+2]; v > best {
						best = v
					}
				}
			}
			out.Pix[y*out.Stride+x] = uint8(best + 0.5)
		}
	}
	return out
}

// composite paints p through mask m, whose origin is at on dst, with
// source-over in 8-bit premultiplied arithmetic, as SVG renderers do.
func (pa *painter) composite(dst *image.RGBA, at image.Point, m *image.Alpha, p paint) {
	w, h := m.Rect.Dx(), m.Rect.Dy()
	alpha := uint32(math.Round(p.alpha * 255))
	switch p.kind {
	case paintSolid:
		src := [4]uint32{uint32(p.rgb.r), uint32(p.rgb.g), uint32(p.rgb.b), 255}
		full := [4]uint8{p.rgb.r, p.rgb.g, p.rgb.b, 255}
		for y := range h {
			row := dst.PixOffset(at.X, at.Y+y)
			for x, mv := range m.Pix[y*m.Stride : y*m.Stride+w] {
				if mv == 0 {
					continue
				}
				i := row + 4*x
				px := dst.Pix[i : i+4 : i+4]
				c := div255(uint32(mv) * alpha)
				if c == 255 {
					copy(px, full[:])
					continue
				}
				inv := 255 - c
				for k := range 4 {
					px[k] = uint8(div255(src[k]*c + uint32(px[k])*inv))
				}
			}
		}
	case paintPattern:
		tile := pa.tile(p.pattern)
		t := tile.Rect.Dx()
		// A pattern that repeats every period px, not a whole number, has
		// a tile averaged over pixel footprints (painter.tile): pixel v
		// takes the footprint that starts at its place in the period.
		// The texel columns are the same for every row: found once.
		period := pa.d.patterns[p.pattern].period
		wrap := func(v int) int {
			if period == 0 {
				return v % t
			}
			return min(t-1, int(math.Mod(float64(v), period)*float64(t)/period))
		}
		cols := pa.cols[:0]
		for x := range w {
			cols = append(cols, 4*wrap(at.X+x))
		}
		pa.cols = cols
		for y := range h {
			row := dst.PixOffset(at.X, at.Y+y)
			trow := wrap(at.Y+y) * tile.Stride
			for x, mv := range m.Pix[y*m.Stride : y*m.Stride+w] {
				if mv == 0 {
					continue
				}
				ti := trow + cols[x]
				src := tile.Pix[ti : ti+4 : ti+4]
				if src[3] == 0 {
					continue
				}
				i := row + 4*x
				px := dst.Pix[i : i+4 : i+4]
				c := div255(uint32(mv) * alpha)
				if c == 255 && src[3] == 255 {
					copy(px, src)
					continue
				}
				inv := 255 - div255(uint32(src[3])*c)
				for k := range 4 {
					px[k] = uint8(div255(uint32(src[k])*c + uint32(px[k])*inv))
				}
			}
		}
	}
}

// div255 is v/255 rounded to the nearest integer, for v ≤ 255·255·2.
func div255(v uint32) uint32 {
	v += 128
	return (v + v>>8) >> 8
}

// patternSuper is how much finer than the output a pattern whose period is
// not a whole number of pixels is drawn: its phase is then kept to a
// quarter pixel.
const patternSuper = 4

// tile rasterises pattern i once, clipped to its tile. A pattern with a
// period (scaleDoc) is drawn patternSuper times finer than the output, and
// each texel then replaced by the mean of the patternSuper × patternSuper
// texels from it on, wrapping: one output pixel's footprint, so that
// compositing reads one texel a pixel, anti-aliased as the SVG's viewer
// draws the pattern. Averaging premultiplied RGBA is exact for coverage.
func (pa *painter) tile(i int) *image.RGBA {
	if pa.tiles[i] == nil {
		p := pa.d.patterns[i]
		img := image.NewRGBA(image.Rect(0, 0, p.tile, p.tile))
		for k := range p.shapes {
			pa.shape(img, &p.shapes[k])
		}
		if p.period != 0 {
			img = footprints(img, int(math.Round(float64(p.tile)/p.period)))
		}
		pa.tiles[i] = img
	}
	return pa.tiles[i]
}

// footprints is the mean of every n × n block of the wrapping tile img,
// stored at the block's first texel.
func footprints(img *image.RGBA, n int) *image.RGBA {
	t := img.Rect.Dx()
	n = max(1, n)
	out := image.NewRGBA(img.Rect)
	for y := range t {
		for x := range t {
			var sum [4]int
			for dy := range n {
				row := ((y + dy) % t) * img.Stride
				for dx := range n {
					px := img.Pix[row+4*((x+dx)%t):]
					for c := range 4 {
						sum[c] += int(px[c])
					}
				}
			}
			o := out.PixOffset(x, y)
			for c := range 4 {
				out.Pix[o+c] = uint8((sum[c] + n*n/2) / (n * n))
			}
		}
	}
	return out
}

// glyph returns the outline of rune r at size, loading it on first use.
func (pa *painter) glyph(r rune, size float64, bold bool) *glyph {
	key := glyphKey{bold, ppem(size), r}
	if g, ok := pa.glyphs[key]; ok {
		return g
	}
	f := pa.fs.face(bold)
	g := &glyph{}
	if idx, err := f.GlyphIndex(&pa.buf, r); err == nil {
		g.index = idx
	}
	if a, err := f.GlyphAdvance(&pa.buf, g.index, key.size, font.HintingNone); err == nil {
		g.advance = float64(a) / 64
	}
	if segs, err := f.LoadGlyph(&pa.buf, g.index, key.size, nil); err == nil {
		cvt := func(p fixed.Point26_6) pt { return pt{float64(p.X) / 64, float64(p.Y) / 64} }
		for _, s := range segs {
			switch s.Op {
			case sfnt.SegmentOpMoveTo:
				g.segs = append(g.segs, oseg{op: 'M', p: [2]pt{cvt(s.Args[0])}})
			case sfnt.SegmentOpLineTo:
				g.segs = append(g.segs, oseg{op: 'L', p: [2]pt{cvt(s.Args[0])}})
			case sfnt.SegmentOpQuadTo:
				g.segs = append(g.segs, oseg{op: 'Q', p: [2]pt{cvt(s.Args[0]), cvt(s.Args[1])}})
			case sfnt.SegmentOpCubeTo:
				// The Go fonts are TrueType, all quadratic; a cubic is
				// flattened to lines should one appear.
				p0 := pt{}
				if n := len(g.segs); n > 0 {
					p0 = g.segs[n-1].p[0]
					if g.segs[n-1].op == 'Q' {
						p0 = g.segs[n-1].p[1]
					}
				}
				c1, c2, p3 := cvt(s.Args[0]), cvt(s.Args[1]), cvt(s.Args[2])
				for k := 1; k <= 8; k++ {
					t := float64(k) / 8
					u := 1 - t
					g.segs = append(g.segs, oseg{op: 'L', p: [2]pt{{
						u*u*u*p0.x + 3*u*u*t*c1.x + 3*u*t*t*c2.x + t*t*t*p3.x,
						u*u*u*p0.y + 3*u*u*t*c1.y + 3*u*t*t*c2.y + t*t*t*p3.y}}})
				}
			}
		}
	}
	pa.glyphs[key] = g
	return g
}

// label sets l's runs along its baseline, anchored as in the SVG, turned
// if l is rotated, over a white halo if it has one.
func (pa *painter) label(dst *image.RGBA, l *label) {
	type placed struct {
		g *glyph
		x float64
	}
	var glyphs []placed
	pen := 0.0
	for _, r := range l.runs {
		pen += r.dx
		var prev *glyph
		for _, ch := range r.text {
			g := pa.glyph(ch, l.size, r.bold)
			if prev != nil {
				if k, err := pa.fs.face(r.bold).Kern(&pa.buf, prev.index, g.index, ppem(l.size), font.HintingNone); err == nil {
					pen += float64(k) / 64
				}
			}
			glyphs = append(glyphs, placed{g, pen})
			pen += g.advance
			prev = g
		}
	}
	shift := l.anchor.shift(pen)
	xi, yi := l.pos()
	x0, y0 := float64(xi), float64(yi)
	place := func(p pt, gx float64) pt {
		dx, dy := p.x+gx+shift, p.y
		if l.rotate {
			return pt{x0 + dy, y0 - dx}
		}
		return pt{x0 + dx, y0 + dy}
	}
	o := &outline{}
	for _, pg := range glyphs {
		for _, s := range pg.g.segs {
			switch s.op {
			case 'M':
				o.moveTo(place(s.p[0], pg.x))
			case 'L':
				o.lineTo(place(s.p[0], pg.x))
			case 'Q':
				o.quadTo(place(s.p[0], pg.x), place(s.p[1], pg.x))
			}
		}
	}
	if l.halo {
		pa.fill(dst, o, solid(white), true)
	}
	pa.fill(dst, o, solid(l.fill), false)
}

// scratchAlpha is a w×h alpha image over *buf, which grows when it is too
// small and is otherwise reused as it is: the caller clears or overwrites
// what it reads.
func scratchAlpha(buf *[]byte, w, h int) *image.Alpha {
	if cap(*buf) < w*h {
		*buf = make([]byte, w*h)
	}
	return &image.Alpha{Pix: (*buf)[:w*h], Stride: w, Rect: image.Rect(0, 0, w, h)}
}
