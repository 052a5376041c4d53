package render

import "math"

// outline is a set of closed contours for the rasteriser, in px, with
// their bounding box. Contours are filled by the non-zero rule, which is
// what golang.org/x/image/vector computes (it clamps |winding| to 1) and
// SVG's default.
//
// The rasteriser adds up coverage, so where two contours both cover part
// of one pixel it counts that pixel twice. That is right for contours that
// only touch (two rectangles side by side) but wrong for contours that lie
// on each other, as the strokes of two rectangles sharing an edge do.
// Strokes therefore split into groups, one per subpath, which are
// rasterised apart and combined by the larger coverage.
type outline struct {
	segs     []oseg
	min, max pt
	groups   []int // index in segs where each group starts; empty: one group
}

// group starts a new group of contours.
func (o *outline) group() { o.groups = append(o.groups, len(o.segs)) }

type oseg struct {
	op byte // 'M', 'L', 'Q' (p[0] control, p[1] end), 'Z'
	p  [2]pt
}

func (o *outline) grow(p pt) {
	if len(o.segs) == 0 {
		o.min, o.max = p, p
		return
	}
	o.min = pt{min(o.min.x, p.x), min(o.min.y, p.y)}
	o.max = pt{max(o.max.x, p.x), max(o.max.y, p.y)}
}

func (o *outline) moveTo(p pt) { o.grow(p); o.segs = append(o.segs, oseg{op: 'M', p: [2]pt{p}}) }
func (o *outline) lineTo(p pt) { o.grow(p); o.segs = append(o.segs, oseg{op: 'L', p: [2]pt{p}}) }
func (o *outline) quadTo(c, p pt) {
	o.grow(c)
	o.grow(p)
	o.segs = append(o.segs, oseg{op: 'Q', p: [2]pt{c, p}})
}
func (o *outline) close() { o.segs = append(o.segs, oseg{op: 'Z'}) }

// polygon adds a closed contour, turned so that every contour added this
// way winds the same way: overlapping pieces of one stroke then add up
// instead of cancelling.
func (o *outline) polygon(pts ...pt) {
	area := 0.0
	for i, p := range pts {
		q := pts[(i+1)%len(pts)]
		area += p.x*q.y - q.x*p.y
	}
	if area == 0 {
		return
	}
	if area < 0 {
		for i, j := 0, len(pts)-1; i < j; i, j = i+1, j-1 {
			pts[i], pts[j] = pts[j], pts[i]
		}
	}
	o.moveTo(pts[0])
	for _, p := range pts[1:] {
		o.lineTo(p)
	}
	o.close()
}

// fillOf is the outline of p's subpaths for filling: each one closed.
func fillOf(p *pathData) *outline {
	o := &outline{}
	p.subpaths(func(pts []pt, _ bool) {
		if len(pts) < 3 {
			return
		}
		o.moveTo(pts[0])
		for _, q := range pts[1:] {
			o.lineTo(q)
		}
		o.close()
	})
	return o
}

// miterLimit is SVG's default stroke-miterlimit.
const miterLimit = 4

// strokeOf is the outline of p stroked w px wide with SVG's defaults, butt
// caps and miter joins, and the dash pattern if any.
func strokeOf(p *pathData, w float64, dash []float64) *outline {
	o := &outline{}
	hw := w / 2
	p.subpaths(func(pts []pt, closed bool) {
		o.group()
		pts = dedupe(pts)
		if closed && len(pts) > 1 && pts[0] == pts[len(pts)-1] {
			pts = pts[:len(pts)-1]
		}
		if len(dash) == 0 && closed && isRect(pts) {
			// Exact: the outer rectangle less the inner one, which is
			// what miter joins make of a rectangle.
			x0, y0 := min(pts[0].x, pts[2].x), min(pts[0].y, pts[2].y)
			x1, y1 := max(pts[0].x, pts[2].x), max(pts[0].y, pts[2].y)
			o.polygon(pt{x0 - hw, y0 - hw}, pt{x1 + hw, y0 - hw}, pt{x1 + hw, y1 + hw}, pt{x0 - hw, y1 + hw})
			if x1-x0 > w && y1-y0 > w {
				inner := []pt{{x0 + hw, y0 + hw}, {x1 - hw, y0 + hw}, {x1 - hw, y1 - hw}, {x0 + hw, y1 - hw}}
				o.polygon(inner...)
				reverseLast(o, len(inner))
			}
			return
		}
		if len(dash) == 0 {
			strokePolyline(o, pts, closed, hw)
			return
		}
		if closed && len(pts) > 1 {
			pts = append(pts, pts[0])
		}
		for _, piece := range dashes(pts, dash) {
			// A dash that ends exactly on a corner repeats the corner; a
			// zero-length segment has no direction, and its NaN normal
			// once filled the whole image.
			if piece = dedupe(piece); len(piece) > 1 {
				strokePolyline(o, piece, false, hw)
			}
		}
	})
	return o
}

// isRect reports whether pts are the corners of an axis-parallel rectangle
// in order.
func isRect(pts []pt) bool {
	if len(pts) != 4 {
		return false
	}
	for i := range 4 {
		a, b := pts[i], pts[(i+1)%4]
		if (a.x == b.x) == (a.y == b.y) {
			return false
		}
		if c := pts[(i+2)%4]; (a.x == b.x) == (b.x == c.x) {
			return false
		}
	}
	return true
}

// reverseLast turns the last contour of o, n points closed, the other way,
// so that it cuts a hole in the contours before it.
func reverseLast(o *outline, n int) {
	seg := o.segs[len(o.segs)-n-1 : len(o.segs)-1]
	pts := make([]pt, n)
	for i, s := range seg {
		pts[i] = s.p[0]
	}
	for i, j := 0, n-1; i < j; i, j = i+1, j-1 {
		pts[i], pts[j] = pts[j], pts[i]
	}
	seg[0] = oseg{op: 'M', p: [2]pt{pts[0]}}
	for i := 1; i < n; i++ {
		seg[i] = oseg{op: 'L', p: [2]pt{pts[i]}}
	}
}

func dedupe(pts []pt) []pt {
	out := make([]pt, 0, len(pts))
	for _, p := range pts {
		if len(out) == 0 || out[len(out)-1] != p {
			out = append(out, p)
		}
	}
	return out
}

func sub(a, b pt) pt           { return pt{a.x - b.x, a.y - b.y} }
func addp(a, b pt) pt          { return pt{a.x + b.x, a.y + b.y} }
func scale(a pt, k float64) pt { return pt{a.x * k, a.y * k} }
func length(a pt) float64      { return math.Hypot(a.x, a.y) }
func unit(a pt) pt             { return scale(a, 1/length(a)) }

// strokePolyline adds one quadrilateral per segment and a join at each
// inner vertex (every vertex of a closed line).
func strokePolyline(o *outline, pts []pt, closed bool, hw float64) {
	n := len(pts)
	if n < 2 {
		return
	}
	segs := n - 1
	if closed {
		segs = n
	}
	for i := range segs {
		a, b := pts[i], pts[(i+1)%n]
		nrm := scale(normal(unit(sub(b, a))), hw)
		o.polygon(addp(a, nrm), addp(b, nrm), sub(b, nrm), sub(a, nrm))
	}
	for i := range n {
		if !closed && (i == 0 || i == n-1) {
			continue
		}
		prev, next := pts[(i+n-1)%n], pts[(i+1)%n]
		join(o, pts[i], unit(sub(pts[i], prev)), unit(sub(next, pts[i])), hw)
	}
}

func normal(d pt) pt { return pt{-d.y, d.x} }

// join fills the wedge on the outer side of the corner at p between a
// segment in direction d1 and the next in direction d2: a miter, or a
// bevel where the miter would pass miterLimit.
func join(o *outline, p, d1, d2 pt, hw float64) {
	cross := d1.x*d2.y - d1.y*d2.x
	if math.Abs(cross) < 1e-9 {
		return // straight on, or a reversal, which SVG bevels to nothing
	}
	side := 1.0
	if cross > 0 {
		side = -1
	}
	n1, n2 := scale(normal(d1), side*hw), scale(normal(d2), side*hw)
	a, b := addp(p, n1), addp(p, n2)
	sum := addp(n1, n2)
	cosHalf := length(sum) / (2 * hw)
	if cosHalf > 0 && 1/cosHalf <= miterLimit {
		tip := addp(p, scale(sum, 2*hw*hw/(length(sum)*length(sum))))
		o.polygon(p, a, tip, b)
		return
	}
	o.polygon(p, a, b)
}

// dashes cuts an open polyline into its dashes, the pattern starting
// afresh at its first point as SVG does with a zero dash offset.
func dashes(pts []pt, pattern []float64) [][]pt {
	total := 0.0
	for _, v := range pattern {
		total += v
	}
	if total <= 0 {
		return [][]pt{pts}
	}
	var out [][]pt
	k, left, on := 0, pattern[0], true
	var cur []pt
	if on {
		cur = []pt{pts[0]}
	}
	for i := 1; i < len(pts); i++ {
		a, b := pts[i-1], pts[i]
		segLen := length(sub(b, a))
		pos := 0.0
		for segLen-pos > left {
			pos += left
			q := addp(a, scale(sub(b, a), pos/segLen))
			if on {
				cur = append(cur, q)
				out = append(out, cur)
				cur = nil
			} else {
				cur = []pt{q}
			}
			on = !on
			k = (k + 1) % len(pattern)
			left = pattern[k]
		}
		left -= segLen - pos
		if on {
			cur = append(cur, b)
		}
	}
	if on && len(cur) > 1 {
		out = append(out, cur)
	}
	return out
}

// circleOf adds a circle of radius r as a polygon fine enough that no edge
// strays a tenth of a pixel from the arc, its corners pushed out so that
// it covers the circle's area; reverse winds it the other way, to cut a
// hole.
func circleOf(o *outline, cx, cy, r float64, reverse bool) {
	if r <= 0 {
		return
	}
	n := max(12, int(math.Ceil(math.Pi/math.Acos(1-0.1/max(r, 0.1)))))
	step := 2 * math.Pi / float64(n)
	rr := r * math.Sqrt(step/math.Sin(step)) // n/2·rr²·sin(step) = π·r²
	o.moveTo(pt{cx + rr, cy})
	for i := 1; i < n; i++ {
		a := step * float64(i)
		if reverse {
			a = -a
		}
		o.lineTo(pt{cx + rr*math.Cos(a), cy + rr*math.Sin(a)})
	}
	o.close()
}
