package render

import (
	"fmt"

	svg "github.com/ajstarks/svgo"
)

// partColours is the Okabe–Ito colour-blind-safe palette (Okabe and Ito,
// "Color Universal Design", 2008) without its black, which the figure keeps
// for lines and text. Blue comes first because it prints darkest.
var partColours = []string{
	"#0072B2", // blue
	"#E69F00", // orange
	"#009E73", // bluish green
	"#D55E00", // vermillion
	"#56B4E9", // sky blue
	"#CC79A7", // reddish purple
	"#F0E442", // yellow
}

// Neutral inks. Everything that is not a partition is drawn in greys, so
// the colours belong to the partitions alone.
const (
	inkText      = "#1a1a1a"
	inkSoft      = "#555555"
	inkLattice   = "#202020"
	inkGuard     = "#e3e3e3"
	inkOutside   = "#f4f4f4"
	inkOutLines  = "#b8b8b8"
	inkUnusedDot = "#9a9a9a"
)

// fillKinds is the number of pattern shapes. A partition's pattern is
// shape i mod fillKinds, drawn fine for the first fillKinds partitions and
// coarse for the next, so every one of the MaxPartitions (16) partitions
// has a pattern of its own and the figure still reads in greyscale.
const fillKinds = 8

func partColour(i int) string { return partColours[i%len(partColours)] }

func fillID(i int) string { return fmt.Sprintf("gl-fill-%d", i) }

// defineFills writes one <pattern> per partition and the patterns of the
// spectrum that no partition occupies.
func defineFills(s *svg.SVG, n int) {
	for i := range n {
		definePartFill(s, i)
	}
	// Outside the channel: thin grey diagonals on an off-white ground.
	s.Pattern("gl-outside", 0, 0, 6, 6, "user")
	s.Rect(0, 0, 6, 6, `fill="`+inkOutside+`"`)
	s.Path("M0 6L6 0M-1 1L1 -1M5 7L7 5", `stroke="`+inkOutLines+`"`, `stroke-width="0.7"`, `fill="none"`)
	s.PatternEnd()
	// Unused spectrum inside the channel: sparse grey dots on white.
	s.Pattern("gl-unused", 0, 0, 8, 8, "user")
	s.Rect(0, 0, 8, 8, `fill="#ffffff"`)
	s.Circle(4, 4, 1, `fill="`+inkUnusedDot+`"`)
	s.PatternEnd()
}

// definePartFill writes pattern i: a light tint of the partition's colour
// with marks of one of fillKinds shapes in that colour.
func definePartFill(s *svg.SVG, i int) {
	colour := partColour(i)
	t, sw := 8, "0.8" // fine: tile and stroke width
	if (i/fillKinds)%2 == 1 {
		t, sw = 12, "1.4" // coarse
	}
	h := t / 2
	s.Pattern(fillID(i), 0, 0, t, t, "user")
	s.Rect(0, 0, t, t, `fill="`+colour+`"`, `fill-opacity="0.14"`)
	stroke := []string{`fill="none"`, `stroke="` + colour + `"`, `stroke-opacity="0.5"`, `stroke-width="` + sw + `"`}
	mark := []string{`fill="` + colour + `"`, `fill-opacity="0.4"`}
	switch i % fillKinds {
	case 0: // rising hatch
		s.Path(fmt.Sprintf("M0 %[1]dL%[1]d 0M-2 2L2 -2M%[2]d %[3]dL%[3]d %[2]d", t, t-2, t+2), stroke...)
	case 1: // dots
		s.Circle(h, h, max(1, t/6), mark...)
	case 2: // falling hatch
		s.Path(fmt.Sprintf("M0 0L%[1]d %[1]dM%[2]d -2L%[3]d 2M-2 %[2]dL2 %[3]d", t, t-2, t+2), stroke...)
	case 3: // diagonal cross-hatch
		s.Path(fmt.Sprintf("M0 0L%[1]d %[1]dM0 %[1]dL%[1]d 0", t), stroke...)
	case 4: // rings
		s.Circle(h, h, max(2, t/4), stroke...)
	case 5: // chevrons
		s.Path(fmt.Sprintf("M0 %dL%d %dL%d %d", t*3/4, h, t/4, t, t*3/4), stroke...)
	case 6: // checks, lighter than the dots: they cover a quarter of the tile
		light := []string{`fill="` + colour + `"`, `fill-opacity="0.25"`}
		s.Rect(0, 0, h, h, light...)
		s.Rect(h, h, h, h, light...)
	case 7: // small crosses
		s.Path(fmt.Sprintf("M%[1]d 1V%[2]dM1 %[1]dH%[2]d", h, t-1), stroke...)
	}
	s.PatternEnd()
}
