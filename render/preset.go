package render

import (
	"fmt"
	"math"
	"strings"
)

// Preset fits the figure to a printed or projected width so that its
// smallest text is at least MinPt points there.
//
// The figure is laid out in layout px and written MinWidth to MaxWidth px
// wide: the SVG's viewBox holds the layout and its width and height
// attributes the written size, so every length, text included, grows by
// the zoom written/layout. Printed across PrintedMM millimetres, one
// written px is PrintedMM/25.4×72/written pt, so a text of s layout px
// prints at
//
//	s × (written/layout) × (PrintedMM/25.4×72/written) = s × printedPt/layout pt,
//
// whatever the written width: the written width sets only the resolution,
// the layout width sets the type. The smallest text of the figure is
// MinTextPx (the TDD band's D/F/U letters), so the layout width is the
// largest whole number with MinTextPx × printedPt/layout ≥ MinPt:
//
//	layout = ⌊MinTextPx × printedPt / MinPt⌋.
//
// Worked for the A4 column: 160 mm is 160/25.4×72 = 453.54 pt; ⌊8 ×
// 453.54/6⌋ = 604 layout px, so the letters print at 8 × 453.54/604 =
// 6.01 pt, the key's 10 px text at 7.51 pt and the axis titles' 12 px at
// 9.01 pt. Without a preset, 1200 px across the same 160 mm print the
// letters at 8 × 453.54/1200 = 3.02 pt and the key at 3.78 pt.
type Preset struct {
	Name      string  // as ParsePreset reads it
	Title     string  // a few words for a form
	PrintedMM float64 // the figure's printed (or projected) width, in mm
	MinPt     float64 // the least text size there, in points
	// Width is the written width in px unless Options.Width or DPI say: a
	// whole multiple of the layout, so that the PNG's patterns repeat on
	// whole pixels as a viewer draws them from the SVG (at other zooms the
	// PNG stretches each pattern's tile to its period, which keeps its
	// phase but not every hatch pixel).
	Width int
	// PlotHeight is the frequency axis's height in layout px, chosen for
	// the page's shape.
	PlotHeight int
	// KeyBeside sets the key in a column right of the plot's notes, its
	// texts wrapped to at most 340 px, and the partition rows below the
	// plot across the whole figure, for a screen whose height is short:
	// the figure is the layout width plus that column wide. The same
	// shapes are drawn, only placed apart.
	KeyBeside bool
}

// MinTextPx is the smallest text the figure sets, in layout px: the D/F/U
// letters of the TDD band. Every other text is 9 px or larger.
const MinTextPx = letterSize

// ptPerMM converts millimetres to PostScript points (72 per inch).
const ptPerMM = 72 / 25.4

// Presets. The printed widths and least sizes are common practice, from
// memory, not a publisher's or venue's rule; the written widths are 2, 3
// and 5 times the layout:
//
//	a4      the text width of an A4 page with 25 mm margins, 210 − 2×25 =
//	        160 mm; 6 pt, the least size journals commonly accept for
//	        figure text. A plot 260 layout px high keeps the figure
//	        about as high as wide.
//	slide   the full width of a 16:9 slide of 13.333 × 7.5 in (338.67 mm),
//	        shown on a 1920 × 1080 projector; 12 pt. The plot (254 layout
//	        px) and its axes fill the 640 × 360 layout px of one 16:9
//	        screen; the legend follows below it.
//	poster  across an A0 portrait poster, 841 − 2×20.5 = 800 mm; 24 pt,
//	        common for poster text read from two metres.
var presets = []Preset{
	{Name: "a4", Title: "A4 column (160 mm, 6 pt)", PrintedMM: 160, MinPt: 6, Width: 2 * 604, PlotHeight: 260},
	{Name: "slide", Title: "slide 16:9 (338.67 mm, 12 pt)", PrintedMM: 13.333333333333334 * 25.4, MinPt: 12, Width: 1920, PlotHeight: 360 - marginTop - axisBand},
	{Name: "poster", Title: "poster, A0 across (800 mm, 24 pt)", PrintedMM: 800, MinPt: 24, Width: 5 * 755, PlotHeight: plotHeight},
}

// Presets returns the presets ParsePreset reads, in order.
func Presets() []Preset { return append([]Preset(nil), presets...) }

// PresetNames lists the presets' names, in order.
func PresetNames() []string {
	names := make([]string, len(presets))
	for i, p := range presets {
		names[i] = p.Name
	}
	return names
}

// ParsePreset reads a preset name, case-insensitive; "" or "none" is no
// preset (nil).
func ParsePreset(s string) (*Preset, error) {
	s = strings.TrimSpace(s)
	if s == "" || strings.EqualFold(s, "none") {
		return nil, nil
	}
	for i := range presets {
		if strings.EqualFold(s, presets[i].Name) {
			p := presets[i]
			return &p, nil
		}
	}
	return nil, fmt.Errorf("preset %q is not a figure preset; use %s, or none.", shownN(s, 40), strings.Join(PresetNames(), ", "))
}

// PrintedPt is the printed width in points.
func (p Preset) PrintedPt() float64 { return p.PrintedMM * ptPerMM }

// LayoutWidth is the width the figure is laid out in, in layout px: the
// largest with MinTextPx at least MinPt printed, as Preset's comment works
// out.
func (p Preset) LayoutWidth() int {
	return int(math.Floor(MinTextPx*p.PrintedPt()/p.MinPt + 1e-9))
}

// TextPt is the printed size, in points, of text set at px layout px.
func (p Preset) TextPt(px float64) float64 { return px * p.PrintedPt() / float64(p.LayoutWidth()) }

// minLayoutWidth is the narrowest layout a preset may ask for: below it the
// notes and axis labels leave the plot too little room.
const minLayoutWidth = 560
