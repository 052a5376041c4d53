package render

import (
	"fmt"
	"math"
	"strings"
	"unicode/utf8"
)

// Options shape the figure. The zero value draws the default figure: light
// theme, every layer, no caption, no plan in the metadata, the plot fitted
// to the plan.
type Options struct {
	Width  int    // figure width in px, MinWidth to MaxWidth; 0 means DefaultWidth
	Theme  Theme  // ThemeLight (the zero value) or ThemePrint
	Layers Layers // the layers hidden; the zero value hides none
	// Caption is a line of text under the figure, at most MaxCaption
	// characters; it wraps to the figure's width. Untrusted: it reaches the
	// SVG only as escaped element text.
	Caption string
	// Plan is the plan file the figure was drawn from, stored verbatim in
	// the SVG's <metadata> so that PlanFromSVG can give it back; at most
	// MaxPlanBytes. Nil stores nothing. The PNG does not carry it.
	Plan []byte
	// Window fixes the plot's time and frequency axes, so that figures of
	// two plans share their scales; the zero Window fits them to the plan.
	Window Window
	// FromPointA labels the frequency axis and the notes beside the rail
	// from point A even when the channel has an absolute frequency, for a
	// figure set beside one of a plan that has none.
	FromPointA bool
	// IDPrefix is put before every id in the SVG ("gl-plot" becomes
	// IDPrefix+"gl-plot"), so that several figures can be inlined in one
	// HTML page; "" or a lower-case letter followed by lower-case letters,
	// digits and hyphens, at most MaxIDPrefix bytes.
	IDPrefix string
	// Preset lays the figure out for a printed or projected width with a
	// least type size (see Preset); the zero Preset lays it out at Width.
	Preset Preset
	// TimeUnit is the time axis's unit, one for every tick; TimeAuto
	// (the zero value) chooses it from the span.
	TimeUnit TimeUnit
	// PNGScale multiplies the PNG's pixels, 1 to MaxPNGScale; 0 is 1. The
	// SVG does not use it.
	PNGScale int
	// DPI, when not 0, is written in the PNG's pHYs chunk (MinDPI to
	// MaxDPI dots per inch), so that a document sets the image at that
	// resolution; with a Preset and no Width, the figure is written as many
	// px wide as the preset's printed width holds at DPI.
	DPI int
	// CrossLink marks a comparison's cross-link conflicts over the plot
	// (crosslink.go); the zero value marks none.
	CrossLink CrossLinkMarks
}

// PNG resolution bounds.
const (
	MaxPNGScale = 4
	MinDPI      = 72
	MaxDPI      = 1200
	// MaxPNGPixels bounds the PNG's width × height after PNGScale: 4 bytes
	// a pixel while it is painted.
	MaxPNGPixels = 40_000_000
)

// TimeUnit is the unit of the time axis.
type TimeUnit uint8

// Time units. TimeAuto takes µs for spans up to 2 ms and ms beyond, so a
// slot-long view reads in µs and a frame in ms; either is kept for every
// tick of the figure.
const (
	TimeAuto TimeUnit = iota
	TimeUs
	TimeMs
	timeUnitCount
)

var timeUnitNames = [timeUnitCount]string{"auto", "us", "ms"}

// String returns the unit's name as ParseTimeUnit reads it.
func (u TimeUnit) String() string {
	if u < timeUnitCount {
		return timeUnitNames[u]
	}
	return fmt.Sprintf("TimeUnit(%d)", uint8(u))
}

// ParseTimeUnit reads auto, us (or µs) or ms; "" is auto.
func ParseTimeUnit(s string) (TimeUnit, error) {
	s = strings.TrimSpace(s)
	switch {
	case s == "":
		return TimeAuto, nil
	case s == "µs" || s == "μs":
		return TimeUs, nil
	}
	for i, name := range timeUnitNames {
		if strings.EqualFold(s, name) {
			return TimeUnit(i), nil
		}
	}
	return 0, fmt.Errorf("time unit %q is not a unit of the time axis; use auto, us or ms.", shownN(s, 40))
}

// Figure widths, in px.
const (
	DefaultWidth = 1200
	MinWidth     = 640
	MaxWidth     = 4800
)

// MaxCaption is the longest caption, in characters.
const MaxCaption = 300

// Theme is the look of the figure.
type Theme uint8

// Themes. ThemePrint is for documents: black-and-white patterns, no tints
// that a printer drops, and heavier lines; it reads the same in greyscale.
const (
	ThemeLight Theme = iota
	ThemePrint
	themeCount
)

var themeNames = [themeCount]string{"light", "print"}

// String returns the theme's name as ParseTheme reads it.
func (t Theme) String() string {
	if t < themeCount {
		return themeNames[t]
	}
	return fmt.Sprintf("Theme(%d)", uint8(t))
}

func (t Theme) look() *look {
	if t == ThemePrint {
		return &printLook
	}
	return &lightLook
}

// ParseTheme reads a theme name; "" is the default, light.
func ParseTheme(s string) (Theme, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return ThemeLight, nil
	}
	for i, name := range themeNames {
		if strings.EqualFold(s, name) {
			return Theme(i), nil
		}
	}
	return 0, fmt.Errorf("theme %q is not a figure theme; use light or print.", shownN(s, 40))
}

// Layer is one part of the figure that can be hidden. Sixteen bits leave
// room for the layers of initial access and random access to come.
type Layer uint16

// Layers of the figure. The partition bodies, the axes, the carrier rail
// and the legend are always drawn.
const (
	LayerLattice  Layer = 1 << iota // PRB rows, symbol and slot lines, 0.5 ms marks
	LayerCP                         // cyclic-prefix strips
	LayerGuards                     // guardbands, unused spectrum, minimum guardbands on the rail
	LayerLabels                     // names in the plot, TDD letters, SS/PBCH labels, notes beside the rail
	LayerTDD                        // TDD direction bands and the wash over the other direction
	LayerSSB                        // SS/PBCH blocks and their labels
	LayerRaster                     // the band's synchronization raster: GSCN ticks on the frequency axis
	LayerCoreset0                   // CORESET#0 and its Type0-PDCCH occasions, the initial BWPs on the rail
	LayerPRACH                      // PRACH occasions, valid and not
	LayerOverlap                    // the band two partitions share, outlined (grid.Result.Overlaps)
	allLayers     Layer = 1<<iota - 1
)

// layerNames lists the layers in the order of their bits.
var layerNames = []string{"lattice", "cp", "guards", "labels", "tdd", "ssb", "raster", "coreset0", "prach", "overlap"}

// layerTitles says what each layer draws, in words for a form's
// checkboxes, in the order of layerNames.
var layerTitles = []string{"lattice lines", "cyclic prefixes", "guardbands", "labels", "TDD directions", "SS/PBCH blocks", "synchronization raster", "CORESET#0 and initial BWPs", "random access occasions", "overlapping partitions"}

// LayerTitles returns a few words for each layer, in the order of
// LayerNames, so that a page lists every layer render has without keeping
// a list of its own that falls behind.
func LayerTitles() []string { return append([]string(nil), layerTitles...) }

// layerList names the layers for messages: "lattice, cp, … and ssb".
var layerList = strings.Join(layerNames[:len(layerNames)-1], ", ") + " and " + layerNames[len(layerNames)-1]

// LayerNames returns the names ParseLayers reads, in drawing order.
func LayerNames() []string { return append([]string(nil), layerNames...) }

// Layers is the set of hidden layers, so that the zero value shows all.
type Layers struct{ hidden Layer }

// Shows reports whether layer l is drawn.
func (ls Layers) Shows(l Layer) bool { return ls.hidden&l == 0 }

// Hide returns ls with the given layers hidden as well.
func (ls Layers) Hide(l ...Layer) Layers {
	for _, x := range l {
		ls.hidden |= x
	}
	return ls
}

// String lists the layers shown, comma-separated, as ParseLayers reads
// them; "none" when every layer is hidden.
func (ls Layers) String() string {
	var shown []string
	for i, name := range layerNames {
		if ls.Shows(Layer(1 << i)) {
			shown = append(shown, name)
		}
	}
	if len(shown) == 0 {
		return "none"
	}
	return strings.Join(shown, ",")
}

func (ls Layers) valid() bool { return ls.hidden&^allLayers == 0 }

// ParseLayers reads a comma-separated list of the layers to show, such as
// "lattice,tdd,ssb". "" or "all" shows every layer and "none" hides them
// all; names are case-insensitive.
func ParseLayers(s string) (Layers, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "all":
		return Layers{}, nil
	case "none":
		return Layers{hidden: allLayers}, nil
	}
	shown := Layer(0)
	for item := range strings.SplitSeq(s, ",") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		found := false
		for i, name := range layerNames {
			if strings.EqualFold(item, name) {
				shown |= 1 << i
				found = true
			}
		}
		if !found {
			return Layers{}, fmt.Errorf("layers: %q is not a figure layer; list the layers to show from %s, separated by commas, or give all or none.", shownN(item, 40), layerList)
		}
	}
	return Layers{hidden: allLayers &^ shown}, nil
}

// check validates the options and returns the figure's written width.
func (opt Options) check() (int, error) {
	width := opt.Width
	p := opt.Preset
	if width == 0 && p.Name != "" {
		width = p.Width
		if opt.DPI != 0 {
			width = int(math.Round(p.PrintedMM / 25.4 * float64(opt.DPI)))
		}
	}
	if width == 0 {
		width = DefaultWidth
	}
	if width < MinWidth || width > MaxWidth {
		if opt.Width == 0 && opt.DPI != 0 {
			return 0, fmt.Errorf("render: at %d dpi the %s preset's %g mm are %d px, outside %d to %d px; give at most %d dpi, or a width", opt.DPI, p.Name, p.PrintedMM, width, MinWidth, MaxWidth, int(float64(MaxWidth)/(p.PrintedMM/25.4)))
		}
		return 0, fmt.Errorf("render: the figure width is %d px; it must be 0 (the default, %d px) or from %d to %d px", opt.Width, DefaultWidth, MinWidth, MaxWidth)
	}
	if p.Name != "" {
		if !(p.PrintedMM > 0 && p.MinPt > 0) || p.LayoutWidth() < minLayoutWidth || p.LayoutWidth() > MaxWidth {
			return 0, fmt.Errorf("render: preset %q lays the figure out %d px wide; a printed width and least type size must give %d to %d layout px", p.Name, p.LayoutWidth(), minLayoutWidth, MaxWidth)
		}
		if p.PlotHeight < minPlotHeight || p.PlotHeight > maxPlotHeight {
			return 0, fmt.Errorf("render: preset %q has a plot %d px high; it must be %d to %d px", p.Name, p.PlotHeight, minPlotHeight, maxPlotHeight)
		}
	}
	if opt.TimeUnit >= timeUnitCount {
		return 0, fmt.Errorf("render: time unit %s is not defined; use TimeAuto, TimeUs or TimeMs", opt.TimeUnit)
	}
	if opt.PNGScale < 0 || opt.PNGScale > MaxPNGScale {
		return 0, fmt.Errorf("render: the PNG scale is %d; it must be 0 or 1 (none) to %d", opt.PNGScale, MaxPNGScale)
	}
	if opt.DPI != 0 && (opt.DPI < MinDPI || opt.DPI > MaxDPI) {
		return 0, fmt.Errorf("render: %d dpi is outside %d to %d; give a resolution in that range, or 0 for none", opt.DPI, MinDPI, MaxDPI)
	}
	if err := opt.CrossLink.check(); err != nil {
		return 0, err
	}
	if opt.Theme >= themeCount {
		return 0, fmt.Errorf("render: theme %s is not defined; use ThemeLight or ThemePrint", opt.Theme)
	}
	if !opt.Layers.valid() {
		return 0, fmt.Errorf("render: the layer set %#x holds layers that do not exist; build it with ParseLayers or Hide", opt.Layers.hidden)
	}
	if n := utf8.RuneCountInString(opt.Caption); n > MaxCaption {
		return 0, fmt.Errorf("render: the caption has %d characters; it may have at most %d", n, MaxCaption)
	}
	if len(opt.Plan) > MaxPlanBytes {
		return 0, fmt.Errorf("render: the plan is %d bytes; at most %d can be stored in the figure", len(opt.Plan), MaxPlanBytes)
	}
	if err := checkIDPrefix(opt.IDPrefix); err != nil {
		return 0, err
	}
	return width, nil
}
