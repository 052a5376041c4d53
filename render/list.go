package render

import (
	"math"
	"strconv"
)

// The figure is built once as a display list, a doc, which two backends
// consume: writeSVG (svgo) and paintDoc (golang.org/x/image/vector). Both
// read the same rounded coordinates, so the two figures share one layout.

// doc is one figure: its size, its text alternatives, the patterns its
// shapes refer to and the items in paint order.
type doc struct {
	w, h        int // the layout, in px: the SVG's viewBox
	outW, outH  int // the written size, in px: the SVG's width and height
	ink         rgb // the text colour the labels inherit
	title, desc string
	plan        []byte // Options.Plan, stored in <metadata>
	idPrefix    string // Options.IDPrefix, put before every id
	patterns    []pattern
	items       []item
}

// item is a group boundary, a shape or a label.
type item interface{ isItem() }

// attr is an attribute that the SVG carries for scripts and tests. Keys
// and values are the package's own: never user text.
type attr struct{ key, value string }

// group opens a <g>; groupEnd closes it. fontSize, when set, is inherited
// by the labels inside and saves repeating it on each.
type group struct {
	class, id string
	data      []attr
	fontSize  float64
}

type groupEnd struct{}

// shape is a path (or a circle) with a fill and a stroke.
type shape struct {
	class   string
	d       pathData
	circle  *circle // drawn instead of d when set
	fill    paint
	stroke  paint
	strokeW float64
	dash    []float64 // on, off, … in px
}

type circle struct{ cx, cy, r float64 }

// label is one line of text: runs laid end to end along the baseline at y,
// anchored at x. Labels hold user text; the SVG writer escapes it.
type label struct {
	class  string
	x, y   float64 // whole pixels
	runs   []run
	size   float64 // font size in px; 0 is the base size
	anchor anchor
	fill   rgb  // 0 (black) is the theme's text colour
	halo   bool // a white outline under the glyphs, to read over lines
	rotate bool // turned −90° about (x, y)
}

// run is a stretch of a label in one weight, dx px after the previous one.
type run struct {
	text string
	bold bool
	dx   float64
}

type anchor uint8

const (
	anchorStart anchor = iota
	anchorMiddle
	anchorEnd
)

// id is the document's id for name: the prefix and the name.
func (d *doc) id(name string) string { return d.idPrefix + name }

func (*group) isItem()   {}
func (groupEnd) isItem() {}
func (*shape) isItem()   {}
func (*label) isItem()   {}
func (a anchor) String() string {
	switch a {
	case anchorMiddle:
		return "middle"
	case anchorEnd:
		return "end"
	}
	return "start"
}

// shift is where a text w px wide starts, relative to its anchor point.
func (a anchor) shift(w float64) float64 {
	switch a {
	case anchorMiddle:
		return -w / 2
	case anchorEnd:
		return -w
	}
	return 0
}

// pattern is a tile of tile × tile px repeated from the origin of the
// figure (patternUnits="userSpaceOnUse"); its shapes are clipped to the tile.
type pattern struct {
	id     string
	tile   int
	period float64 // px between repeats in a scaled doc when not whole (painter.tile); 0 is tile
	shapes []shape
}

// rgb is an opaque colour.
type rgb struct{ r, g, b uint8 }

func (c rgb) String() string {
	const hex = "0123456789abcdef"
	return string([]byte{'#', hex[c.r>>4], hex[c.r&15], hex[c.g>>4], hex[c.g&15], hex[c.b>>4], hex[c.b&15]})
}

// paint is how a shape is filled or stroked: not at all, with a colour, or
// with a pattern; alpha is the opacity, 0 < alpha ≤ 1.
type paint struct {
	kind    paintKind
	rgb     rgb
	pattern int // index in doc.patterns
	alpha   float64
}

type paintKind uint8

const (
	paintNone paintKind = iota
	paintSolid
	paintPattern
)

func solid(c rgb) paint { return paint{kind: paintSolid, rgb: c, alpha: 1} }

// withAlpha returns p at opacity a.
func (p paint) withAlpha(a float64) paint {
	p.alpha = a
	return p
}

var (
	white = rgb{0xff, 0xff, 0xff}
	black = rgb{0, 0, 0}
)

// pt is a point in px.
type pt struct{ x, y float64 }

// pathCmd is one command of a path: 'M' moves to p, 'L' draws a line to p
// and 'Z' closes the subpath.
type pathCmd struct {
	op byte
	p  pt
}

// pathData is the geometry of one <path>, one subpath per line or
// rectangle. Coordinates are rounded to a tenth of a pixel as they are
// added, which is finer than any screen or printer resolves at the figure's
// sizes, keeps the SVG short, and gives the PNG the very same numbers.
type pathData struct {
	cmds []pathCmd
	segs int // subpaths
}

func round10(v float64) float64 {
	v = math.Round(v*10) / 10
	if v == 0 {
		return 0 // no "-0"
	}
	return v
}

func (p *pathData) moveTo(x, y float64) {
	p.cmds = append(p.cmds, pathCmd{'M', pt{round10(x), round10(y)}})
	p.segs++
}

func (p *pathData) lineTo(x, y float64) {
	p.cmds = append(p.cmds, pathCmd{'L', pt{round10(x), round10(y)}})
}

func (p *pathData) close() { p.cmds = append(p.cmds, pathCmd{op: 'Z'}) }

// vline adds a vertical segment at x from y1 to y2.
func (p *pathData) vline(x, y1, y2 float64) {
	p.moveTo(x, y1)
	p.lineTo(x, y2)
}

// hline adds a horizontal segment at y from x1 to x2.
func (p *pathData) hline(y, x1, x2 float64) {
	p.moveTo(x1, y)
	p.lineTo(x2, y)
}

// rect adds a closed rectangle with corners (x1, y1) and (x2, y2).
func (p *pathData) rect(x1, y1, x2, y2 float64) {
	p.moveTo(x1, y1)
	p.lineTo(x2, y1)
	p.lineTo(x2, y2)
	p.lineTo(x1, y2)
	p.close()
}

// String writes the d attribute, with H and V for axis-parallel lines.
func (p *pathData) String() string {
	b := make([]byte, 0, len(p.cmds)*7)
	var cur, start pt
	for _, c := range p.cmds {
		switch c.op {
		case 'M':
			b = append(b, 'M')
			b = appendNum(b, c.p.x)
			b = append(b, ' ')
			b = appendNum(b, c.p.y)
			cur, start = c.p, c.p
		case 'L':
			switch {
			case c.p.y == cur.y:
				b = append(b, 'H')
				b = appendNum(b, c.p.x)
			case c.p.x == cur.x:
				b = append(b, 'V')
				b = appendNum(b, c.p.y)
			default:
				b = append(b, 'L')
				b = appendNum(b, c.p.x)
				b = append(b, ' ')
				b = appendNum(b, c.p.y)
			}
			cur = c.p
		case 'Z':
			b = append(b, 'Z')
			cur = start
		}
	}
	return string(b)
}

// appendNum writes a coordinate already rounded by round10 as strconv's
// shortest decimal would, which for a whole number of tenths is its whole
// part and at most one digit after the point, without strconv's general
// (and, for the figure's thousands of numbers, costly) float formatting.
func appendNum(b []byte, v float64) []byte {
	t := math.Round(v * 10)
	if t/10 != v || math.Abs(t) >= 1<<52 {
		return strconv.AppendFloat(b, v, 'f', -1, 64)
	}
	n := int64(t)
	if n < 0 {
		b = append(b, '-')
		n = -n
	}
	b = strconv.AppendInt(b, n/10, 10)
	if d := n % 10; d != 0 {
		b = append(b, '.', byte('0'+d))
	}
	return b
}

// width formats a stroke width to a hundredth of a pixel.
func width(v float64) string {
	return strconv.FormatFloat(math.Round(v*100)/100, 'f', -1, 64)
}

// subpaths calls fn with the points of each subpath and whether it is
// closed. The package always starts a subpath with a move.
func (p *pathData) subpaths(fn func(pts []pt, closed bool)) {
	var pts []pt
	for _, c := range p.cmds {
		switch c.op {
		case 'M':
			if len(pts) > 0 {
				fn(pts, false)
			}
			pts = append(pts[:0], c.p)
		case 'L':
			pts = append(pts, c.p)
		case 'Z':
			if len(pts) > 0 {
				fn(pts, true)
			}
			pts = pts[:0]
		}
	}
	if len(pts) > 0 {
		fn(pts, false)
	}
}
