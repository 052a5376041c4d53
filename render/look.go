package render

import "fmt"

// look is everything a theme decides: inks, line widths and opacities,
// and the patterns. Themes are fixed values of the package; nothing a user
// types reaches a style.
type look struct {
	parts []rgb // partition colours, used in turn

	text, soft, lattice rgb
	outsideGround       rgb
	outsideLines        rgb
	unusedDot           rgb
	guard               rgb // guardband fill, when not hatched
	guardHatch          bool
	// labelBack sets the labels in the plot (those with a halo) on an
	// opaque white box, so that hatching and lines never run through them
	// on paper.
	labelBack bool

	// Line widths in px and opacities of the lattice lines.
	bodyW, slotW, symW, rowW float64
	slotA, symA, rowA        float64
	cpA, longA               float64
	edgeW, alignW, frameW    float64

	// Partition patterns: tint of the partition colour under marks of it.
	tintA, markA, strokeA float64
	fineW, coarseW        float64

	// TDD band inks and the wash over symbols of the other direction.
	tddD, tddF, tddUHatch rgb
	tddLetterOnD          rgb
	washA                 float64

	// SS/PBCH blocks.
	ssbFill  rgb
	ssbFillA float64
	ssbLine  rgb
	ssbW     float64

	// CORESET#0's dashed outline.
	coresetW float64

	// The outline of a band two partitions share: errorInk where both send
	// in the same direction (an error), warnInk dashed where a downlink
	// and an uplink partition share it (legal on TDD if never at once).
	errorInk, warnInk rgb
	overlapW          float64
}

// partColours is the Okabe–Ito colour-blind-safe palette (Okabe and Ito,
// "Color Universal Design", 2008) without its black, which the figure keeps
// for lines and text. Blue comes first because it prints darkest.
var partColours = []rgb{
	{0x00, 0x72, 0xB2}, // blue
	{0xE6, 0x9F, 0x00}, // orange
	{0x00, 0x9E, 0x73}, // bluish green
	{0xD5, 0x5E, 0x00}, // vermillion
	{0x56, 0xB4, 0xE9}, // sky blue
	{0xCC, 0x79, 0xA7}, // reddish purple
	{0xF0, 0xE4, 0x42}, // yellow
}

// lightLook is the screen figure. Everything that is not a partition is
// drawn in greys, so the colours belong to the partitions alone.
var lightLook = look{
	parts:         partColours,
	text:          rgb{0x1a, 0x1a, 0x1a},
	soft:          rgb{0x55, 0x55, 0x55},
	lattice:       rgb{0x20, 0x20, 0x20},
	outsideGround: rgb{0xf4, 0xf4, 0xf4},
	outsideLines:  rgb{0xb8, 0xb8, 0xb8},
	unusedDot:     rgb{0x9a, 0x9a, 0x9a},
	guard:         rgb{0xe3, 0xe3, 0xe3},

	bodyW: 1.2, slotW: 1.2, symW: 0.6, rowW: 0.6,
	slotA: 0.85, symA: 0.55, rowA: 0.5,
	cpA: 0.2, longA: 0.55,
	edgeW: 2, alignW: 1.3, frameW: 1,

	tintA: 0.14, markA: 0.4, strokeA: 0.5,
	fineW: 0.8, coarseW: 1.4,

	tddD: rgb{0x3a, 0x3a, 0x3a}, tddF: rgb{0xa8, 0xa8, 0xa8}, tddUHatch: rgb{0x3a, 0x3a, 0x3a},
	tddLetterOnD: white,
	washA:        0.55,

	ssbFill: white, ssbFillA: 0.8, ssbLine: black, ssbW: 1.6,
	coresetW: 1.4,
	// The page's --error and --warning inks (static/app.css), so the
	// outline reads like the finding it belongs to.
	errorInk: rgb{0xb0, 0x2a, 0x20}, warnInk: rgb{0x9a, 0x5b, 0x00},
	overlapW: 2.5,
}

// printLook is for documents: black and white patterns without tints,
// greys no lighter than a laser printer keeps, and heavier lines.
var printLook = look{
	parts:         []rgb{black},
	text:          black,
	soft:          rgb{0x40, 0x40, 0x40},
	lattice:       black,
	outsideGround: white,
	outsideLines:  rgb{0x70, 0x70, 0x70},
	unusedDot:     rgb{0x80, 0x80, 0x80},
	guardHatch:    true,
	labelBack:     true,

	bodyW: 1.6, slotW: 1.6, symW: 0.9, rowW: 0.9,
	slotA: 1, symA: 0.8, rowA: 0.7,
	cpA: 0.3, longA: 0.65,
	edgeW: 2.6, alignW: 1.8, frameW: 1.4,

	tintA: 0, markA: 1, strokeA: 1,
	fineW: 0.9, coarseW: 1.5,

	tddD: black, tddF: rgb{0x80, 0x80, 0x80}, tddUHatch: black,
	tddLetterOnD: white,
	washA:        0.6,

	ssbFill: white, ssbFillA: 0.85, ssbLine: black, ssbW: 2.2,
	coresetW: 1.8,
	errorInk: black, warnInk: black,
	overlapW: 3,
}

func (lk *look) part(i int) rgb { return lk.parts[i%len(lk.parts)] }

// fillKinds is the number of pattern shapes. A partition's pattern is
// shape i mod fillKinds, drawn fine for the first fillKinds partitions and
// coarse for the next, so every one of the MaxPartitions (16) partitions
// has a pattern of its own and the figure still reads in greyscale.
const fillKinds = 8

func fillID(i int) string { return fmt.Sprintf("gl-fill-%d", i) }

// pathOf builds a pathData with fn.
func pathOf(fn func(p *pathData)) pathData {
	var p pathData
	fn(&p)
	return p
}

func tileRect(t float64) pathData {
	return pathOf(func(p *pathData) { p.rect(0, 0, t, t) })
}

// risingHatch draws the rising diagonal of a tile t wide and the stubs of
// its neighbours' diagonals in two corners, o past the tile's edge, so
// that the tiles join into unbroken lines.
func risingHatch(p *pathData, t, o float64) {
	p.moveTo(0, t)
	p.lineTo(t, 0)
	p.moveTo(-o, o)
	p.lineTo(o, -o)
	p.moveTo(t-o, t+o)
	p.lineTo(t+o, t-o)
}

// partFill is pattern i: a tint of the partition's colour (none in print)
// under marks of one of fillKinds shapes in that colour.
func (lk *look) partFill(i int) pattern {
	c := lk.part(i)
	t, sw := 8.0, lk.fineW
	if (i/fillKinds)%2 == 1 {
		t, sw = 12, lk.coarseW
	}
	h := t / 2
	var shapes []shape
	if lk.tintA > 0 {
		shapes = append(shapes, shape{d: tileRect(t), fill: solid(c).withAlpha(lk.tintA)})
	} else {
		shapes = append(shapes, shape{d: tileRect(t), fill: solid(white)})
	}
	line := func(fn func(p *pathData)) {
		shapes = append(shapes, shape{d: pathOf(fn), stroke: solid(c).withAlpha(lk.strokeA), strokeW: sw})
	}
	mark := solid(c).withAlpha(lk.markA)
	switch i % fillKinds {
	case 0: // rising hatch
		line(func(p *pathData) { risingHatch(p, t, 2) })
	case 1: // dots; in print larger, to stand apart from the unused spectrum's
		r := max(1, int(t)/6)
		if lk.tintA == 0 {
			r = int(t) / 4
		}
		shapes = append(shapes, shape{circle: &circle{h, h, float64(r)}, fill: mark})
	case 2: // falling hatch
		line(func(p *pathData) {
			p.moveTo(0, 0)
			p.lineTo(t, t)
			p.moveTo(t-2, -2)
			p.lineTo(t+2, 2)
			p.moveTo(-2, t-2)
			p.lineTo(2, t+2)
		})
	case 3: // diagonal cross-hatch
		line(func(p *pathData) {
			p.moveTo(0, 0)
			p.lineTo(t, t)
			p.moveTo(0, t)
			p.lineTo(t, 0)
		})
	case 4: // rings
		shapes = append(shapes, shape{circle: &circle{h, h, float64(max(2, int(t)/4))}, stroke: solid(c).withAlpha(lk.strokeA), strokeW: sw})
	case 5: // chevrons
		line(func(p *pathData) {
			p.moveTo(0, t*3/4)
			p.lineTo(h, t/4)
			p.lineTo(t, t*3/4)
		})
	case 6: // checks, lighter than the dots: they cover a quarter of the tile
		a := 0.25
		if lk.tintA == 0 {
			a = 0.45 // print: a grey that survives, still lighter than the dots
		}
		shapes = append(shapes, shape{d: pathOf(func(p *pathData) {
			p.rect(0, 0, h, h)
			p.rect(h, h, t, t)
		}), fill: solid(c).withAlpha(a)})
	case 7: // small crosses
		line(func(p *pathData) {
			p.moveTo(h, 1)
			p.lineTo(h, t-1)
			p.moveTo(1, h)
			p.lineTo(t-1, h)
		})
	}
	return pattern{id: fillID(i), tile: int(t), shapes: shapes}
}

// outsideFill: thin diagonals on an off-white ground (white in print).
func (lk *look) outsideFill() pattern {
	return pattern{id: "gl-outside", tile: 6, shapes: []shape{
		{d: tileRect(6), fill: solid(lk.outsideGround)},
		{d: pathOf(func(p *pathData) { risingHatch(p, 6, 1) }), stroke: solid(lk.outsideLines), strokeW: 0.7},
	}}
}

// unusedFill: sparse dots on white, for spectrum inside the channel that
// no partition occupies.
func (lk *look) unusedFill() pattern {
	return pattern{id: "gl-unused", tile: 8, shapes: []shape{
		{d: tileRect(8), fill: solid(white)},
		{circle: &circle{4, 4, 1}, fill: solid(lk.unusedDot)},
	}}
}

// guardFill, in print only: close horizontal lines, which a printer keeps
// where a light grey would vanish.
func (lk *look) guardFill() pattern {
	return pattern{id: "gl-guard", tile: 4, shapes: []shape{
		{d: tileRect(4), fill: solid(white)},
		{d: pathOf(func(p *pathData) { p.hline(2, 0, 4) }), stroke: solid(black), strokeW: 0.7},
	}}
}

// uplinkFill is the hatch of uplink runs in the TDD band: dark diagonals
// on white, lighter overall than flexible and much lighter than downlink.
func (lk *look) uplinkFill() pattern {
	return pattern{id: "gl-tdd-hatch", tile: 4, shapes: []shape{
		{d: tileRect(4), fill: solid(white)},
		{d: pathOf(func(p *pathData) { risingHatch(p, 4, 1) }), stroke: solid(lk.tddUHatch), strokeW: 0.8},
	}}
}
