package render

import (
	"bytes"
	"encoding/binary"
	"hash/crc32"
	"math"
	"strconv"
	"strings"
	"testing"
)

// TestPresetArithmetic works the points of each preset by hand. A point is
// 1/72 in and an inch 25.4 mm (PostScript points, as word processors use).
func TestPresetArithmetic(t *testing.T) {
	tests := []struct {
		name      string
		printedPt float64 // PrintedMM / 25.4 × 72
		layout    int     // ⌊8 × printedPt / MinPt⌋
		letterPt  float64 // 8 × printedPt / layout
		keyPt     float64 // the key's 10 px
	}{
		// 160 mm / 25.4 × 72 = 453.543 pt; 8 × 453.543 / 6 = 604.72.
		{"a4", 453.543, 604, 6.007, 7.509},
		// 13.333 in × 72 = 960 pt; 8 × 960 / 12 = 640 exactly.
		{"slide", 960, 640, 12, 15},
		// 800 mm / 25.4 × 72 = 2267.717 pt; 8 × 2267.717 / 24 = 755.9.
		{"poster", 2267.717, 755, 24.029, 30.036},
	}
	for _, tc := range tests {
		p, err := ParsePreset(tc.name)
		if err != nil || p == nil {
			t.Fatalf("ParsePreset(%q) = %v, %v", tc.name, p, err)
		}
		if got := p.PrintedPt(); math.Abs(got-tc.printedPt) > 0.001 {
			t.Errorf("%s: printed width %.3f pt, want %.3f", tc.name, got, tc.printedPt)
		}
		if got := p.LayoutWidth(); got != tc.layout {
			t.Errorf("%s: layout %d px, want %d", tc.name, got, tc.layout)
		}
		if got := p.TextPt(MinTextPx); math.Abs(got-tc.letterPt) > 0.001 || got < p.MinPt {
			t.Errorf("%s: D/F/U letters at %.3f pt, want %.3f (at least %g)", tc.name, got, tc.letterPt, p.MinPt)
		}
		if got := p.TextPt(10); math.Abs(got-tc.keyPt) > 0.001 {
			t.Errorf("%s: key text at %.3f pt, want %.3f", tc.name, got, tc.keyPt)
		}
	}
	// Without a preset, the default 1200 px across the A4 column:
	// 453.543/1200 = 0.378 pt a px, so the 8 px letters print at 3.024 pt
	// and the key's 10 px at 3.780 pt (the README's 3.0 and 3.8 pt).
	perPx := 160 / 25.4 * 72 / float64(DefaultWidth)
	if got := MinTextPx * perPx; math.Abs(got-3.024) > 0.001 {
		t.Errorf("the %d px letters at %d px across 160 mm: %.3f pt, want 3.024", MinTextPx, DefaultWidth, got)
	}
	if _, err := ParsePreset("a5"); err == nil || !strings.Contains(err.Error(), "a4, slide, poster") {
		t.Errorf("ParsePreset(a5): %v, want an error listing the presets", err)
	}
	if p, err := ParsePreset(" None "); p != nil || err != nil {
		t.Errorf("ParsePreset(none) = %v, %v, want no preset", p, err)
	}
}

// TestPresetMinimumType draws every plan the tests know with every preset
// and checks the printed size of each text of the figure, as a document
// shows it: font-size × written width / viewBox width, in px, times the
// printed width in pt over the written width.
func TestPresetMinimumType(t *testing.T) {
	plans := append(demoPlans(t), stressPlan, initialCampus, "../testdata/prach/dddsu.yaml")
	for _, p := range Presets() {
		for _, path := range plans {
			r := compute(t, loadPlan(t, path))
			for _, theme := range []Theme{ThemeLight, ThemePrint} {
				opt := Options{Preset: p, Theme: theme, Caption: "Fig. 2"}
				d, err := build(r, opt)
				if err != nil {
					t.Fatalf("%s %s: %v", p.Name, planName(path), err)
				}
				if d.w != p.LayoutWidth() || d.outW != p.Width {
					t.Errorf("%s: laid out %d px and written %d, want %d and %d", p.Name, d.w, d.outW, p.LayoutWidth(), p.Width)
				}
				smallest, n := math.Inf(1), 0
				for _, it := range d.items {
					l, ok := it.(*label)
					if !ok || len(l.runs) == 0 {
						continue
					}
					n++
					pt := l.size * float64(d.outW) / float64(d.w) * p.PrintedPt() / float64(d.outW)
					smallest = min(smallest, pt)
					if l.rotate {
						continue
					}
					// The legend, key, notes and caption stay inside the figure.
					x, _ := l.pos()
					x0 := float64(x) + l.anchor.shift(measure(l))
					if x0 < -1 || x0+measure(l)/widthMargin > float64(d.w)+1 {
						t.Errorf("%s %s: %q runs from %.0f to %.0f, outside the %d px layout", p.Name, planName(path), l.runs[0].text, x0, x0+measure(l)/widthMargin, d.w)
					}
				}
				if n == 0 || smallest < p.MinPt-1e-9 {
					t.Errorf("%s %s %s: the smallest of %d texts prints at %.2f pt, want at least %g", p.Name, planName(path), theme, n, smallest, p.MinPt)
				}
			}
		}
	}
}

// TestPresetSVG: the SVG is written at the preset's width with its layout
// in the viewBox, the height in proportion; a width given with the preset
// changes the resolution, not the layout.
func TestPresetSVG(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	a4, _ := ParsePreset("a4")
	for _, width := range []int{0, 2400} {
		root := parseSVG(t, figure(t, r, Options{Preset: *a4, Width: width}))
		vb := strings.Fields(root.attr["viewBox"])
		if len(vb) != 4 || vb[2] != "604" {
			t.Fatalf("width %d: viewBox %q, want the 604 px layout", width, root.attr["viewBox"])
		}
		layoutH, _ := strconv.Atoi(vb[3])
		w, h := attrInt(t, root, "width"), attrInt(t, root, "height")
		want := int64(max(width, 1208))
		if w != want || math.Abs(float64(h)-float64(layoutH)*float64(w)/604) > 0.5 {
			t.Errorf("width %d: written %d × %d, want %d × %.1f", width, w, h, want, float64(layoutH)*float64(w)/604)
		}
	}
	// The slide's plot and axes fill one 16:9 screen of the layout: the
	// plot's foot plus the axis band is 360 = 640 × 9/16.
	slide, _ := ParsePreset("slide")
	d, err := build(r, Options{Preset: *slide})
	if err != nil {
		t.Fatal(err)
	}
	if f := plotFrameIn(r, d.w, slide.PlotHeight, FitWindow(r)); f.y+f.h+axisBand != 360 || d.w != 640 {
		t.Errorf("slide: plot and axes end at %d px of a %d px layout, want 360 of 640", f.y+f.h+axisBand, d.w)
	}
}

// TestTimeUnit: one unit on every tick and in the axis title, chosen from
// the span or by the option, and published for the readout.
func TestTimeUnit(t *testing.T) {
	short := compute(t, loadPlan(t, "../grid/demo/stadium.yaml")) // 2 ms
	long := compute(t, loadPlan(t, initialCampus))                // 5 ms
	tests := []struct {
		name  string
		unit  TimeUnit
		title string
		attr  string
		last  string // the last tick
	}{
		// 2 ms = 2000 µs; ticks every 200 µs at 876 px (70 px least: 160 µs → 200).
		{"2 ms auto", TimeAuto, "time (µs)", "us", "2000"},
		{"2 ms in ms", TimeMs, "time (ms)", "ms", "2.0"},
		{"5 ms auto", TimeAuto, "time (ms)", "ms", "5.0"},
		{"5 ms in µs", TimeUs, "time (µs)", "us", "5000"},
	}
	for i, tc := range tests {
		r := short
		if i >= 2 {
			r = long
		}
		root := parseSVG(t, figure(t, r, Options{TimeUnit: tc.unit}))
		axes := root.all(byClass("gl-axes"))[0]
		var texts []string
		for _, n := range axes.all(func(n *node) bool { return n.name == "text" }) {
			texts = append(texts, n.text.String())
		}
		if !strings.Contains(strings.Join(texts, "|"), tc.title) {
			t.Errorf("%s: axis texts %q lack %q", tc.name, texts, tc.title)
		}
		if other := map[string]string{"time (µs)": "time (ms)", "time (ms)": "time (µs)"}[tc.title]; strings.Contains(strings.Join(texts, "|"), other) {
			t.Errorf("%s: the axis also says %q", tc.name, other)
		}
		plot := root.all(byClass("gl-plot"))[0]
		if got := plot.attr["data-time-unit"]; got != tc.attr {
			t.Errorf("%s: data-time-unit %q, want %q", tc.name, got, tc.attr)
		}
		found := false
		for _, s := range texts {
			found = found || s == tc.last
		}
		if !found {
			t.Errorf("%s: no tick %q at the end of the span in %q", tc.name, tc.last, texts)
		}
	}
	for _, s := range []string{"", "auto", "US", "µs", "ms"} {
		if _, err := ParseTimeUnit(s); err != nil {
			t.Errorf("ParseTimeUnit(%q): %v", s, err)
		}
	}
	if _, err := ParseTimeUnit("s"); err == nil || !strings.Contains(err.Error(), "auto, us or ms") {
		t.Errorf("ParseTimeUnit(s): %v", err)
	}
}

// TestPNGScaleAndDPI: PNGScale multiplies the pixels; DPI writes a pHYs
// chunk that reads back as that many pixels a metre.
func TestPNGScaleAndDPI(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	root := parseSVG(t, figure(t, r, Options{}))
	w, h := attrInt(t, root, "width"), attrInt(t, root, "height")
	img := figurePNG(t, r, Options{PNGScale: 2})
	if int64(img.Bounds().Dx()) != 2*w || int64(img.Bounds().Dy()) != 2*h {
		t.Errorf("scale 2: %v, want %d × %d", img.Bounds(), 2*w, 2*h)
	}

	// 300 dpi: 300 / 0.0254 = 11811.02 px/m (PNG specification 11.3.5.3).
	if got := pixelsPerMetre(300); got != 11811 {
		t.Errorf("pixelsPerMetre(300) = %d, want 11811", got)
	}
	a4, _ := ParsePreset("a4")
	var b bytes.Buffer
	if err := FigurePNG(&b, r, Options{Preset: *a4, DPI: 300}); err != nil {
		t.Fatal(err)
	}
	x, y, unit, ok := readPHYs(t, b.Bytes())
	if !ok || x != 11811 || y != 11811 || unit != 1 {
		t.Errorf("pHYs %d × %d unit %d (found %v), want 11811 × 11811 per metre", x, y, unit, ok)
	}
	// At 300 dpi the 160 mm of the A4 column are 160/25.4 × 300 = 1889.76,
	// so 1890 px.
	if img := decodePNG(t, b.Bytes()); img.Bounds().Dx() != 1890 {
		t.Errorf("A4 at 300 dpi: %d px wide, want 1890", img.Bounds().Dx())
	}
	b.Reset()
	if err := FigurePNG(&b, r, Options{}); err != nil {
		t.Fatal(err)
	}
	if _, _, _, ok := readPHYs(t, b.Bytes()); ok {
		t.Error("a PNG without DPI carries a pHYs chunk")
	}
	// The poster at 300 dpi would be 9449 px wide.
	poster, _ := ParsePreset("poster")
	if err := FigurePNG(&b, r, Options{Preset: *poster, DPI: 300}); err == nil || !strings.Contains(err.Error(), "152 dpi") {
		t.Errorf("poster at 300 dpi: %v, want the most dpi it takes", err)
	}
	if err := FigurePNG(&b, r, Options{Width: MaxWidth, PNGScale: MaxPNGScale}); err == nil || !strings.Contains(err.Error(), "pixels") {
		t.Errorf("4800 px at scale 4: %v, want the pixel bound", err)
	}
}

// readPHYs walks the PNG's chunks, checking each CRC, and returns pHYs.
func readPHYs(t *testing.T, p []byte) (x, y uint32, unit byte, ok bool) {
	t.Helper()
	if len(p) < 8 || string(p[1:4]) != "PNG" {
		t.Fatal("not a PNG")
	}
	for i := 8; i+12 <= len(p); {
		n := int(binary.BigEndian.Uint32(p[i:]))
		typ, data := string(p[i+4:i+8]), p[i+8:i+8+n]
		if crc := binary.BigEndian.Uint32(p[i+8+n:]); crc != crc32.ChecksumIEEE(p[i+4:i+8+n]) {
			t.Fatalf("chunk %s: bad CRC", typ)
		}
		if typ == "pHYs" {
			if n != 9 {
				t.Fatalf("pHYs of %d bytes", n)
			}
			return binary.BigEndian.Uint32(data), binary.BigEndian.Uint32(data[4:]), data[8], true
		}
		i += 12 + n
	}
	return 0, 0, 0, false
}

// TestPrintLabelBack: in the print theme each label set over the plot
// stands on an opaque white box that holds its baseline; the light theme
// keeps its halos alone.
func TestPrintLabelBack(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	for _, theme := range []Theme{ThemeLight, ThemePrint} {
		d, err := build(r, Options{Theme: theme})
		if err != nil {
			t.Fatal(err)
		}
		halos, backs := 0, 0
		for i, it := range d.items {
			l, ok := it.(*label)
			if !ok || !l.halo {
				continue
			}
			halos++
			if i == 0 {
				continue
			}
			s, ok := d.items[i-1].(*shape)
			if !ok || s.class != "gl-label-back" {
				continue
			}
			backs++
			x, y := l.pos()
			if s.fill != solid(white) {
				t.Errorf("%s: the box under %q is %v, want opaque white", theme, l.runs[0].text, s.fill)
			}
			pts := s.d.cmds
			if len(pts) < 3 || float64(y) < pts[0].p.y || float64(y) > pts[2].p.y || (l.anchor == anchorStart && float64(x) < pts[0].p.x) {
				t.Errorf("%s: the box %v does not hold %q at (%d, %d)", theme, s.d.String(), l.runs[0].text, x, y)
			}
		}
		switch {
		case halos == 0:
			t.Fatalf("%s: no label over the plot", theme)
		case theme == ThemePrint && backs != halos:
			t.Errorf("print: %d of %d labels over the plot have a box", backs, halos)
		case theme == ThemeLight && backs != 0:
			t.Errorf("light: %d labels have a box", backs)
		}
	}
}

// TestFigurePNGMatchesSVGScaled holds the PNG of a preset (the slide laid
// out 640 px wide and written 1920, the A4 column 604 and 1208) against
// rsvg-convert drawing the SVG at the same size, with the limits
// TestFigurePNGMatchesSVG keeps at one to one. At a zoom that is not whole
// (the A4 column at 300 dpi: 1890/604) a pattern repeats every 18.77 px;
// the PNG draws its tile four times finer and averages it over each
// pixel, rsvg-convert draws it its own way, and the hatching of the two
// differs by under a pixel in phase: measured on the campus plan, a mean
// of 1.1 levels (light) and 1.7 (print) with 0.7 % and 2.6 % of pixels far
// off, all on hatch edges. There only the text and a looser mean are held.
func TestFigurePNGMatchesSVGScaled(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	for _, c := range []struct {
		preset string
		dpi    int
		whole  bool
	}{{"slide", 0, true}, {"a4", 0, true}, {"a4", 300, false}} {
		p, _ := ParsePreset(c.preset)
		for _, theme := range []Theme{ThemeLight, ThemePrint} {
			v := comparePNGWithSVG(t, r, Options{Preset: *p, Theme: theme, DPI: c.dpi})
			t.Logf("%s %d dpi %s: %v", c.preset, c.dpi, theme, v)
			switch {
			case c.whole && !v.ok():
				t.Errorf("%s %s: FigurePNG and rsvg-convert differ: %v", c.preset, theme, v)
			case !c.whole && (v.geomMean > 2.5 || v.worstInk > maxInkRatio):
				t.Errorf("%s at %d dpi %s: FigurePNG and rsvg-convert differ past the looser limits: %v", c.preset, c.dpi, theme, v)
			}
		}
	}
}

// TestPresetKeyBeside: with KeyBeside the key moves into a column right of
// the plot's notes, its texts wrapped to the column, and the partition
// rows stay below the plot; the same shapes are drawn (the drawing cost
// follows what is drawn, not where), and the figure is wider by the
// column and lower by the key's rows it no longer stacks below the plot.
func TestPresetKeyBeside(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	slide, _ := ParsePreset("slide")
	below, err := build(r, Options{Preset: *slide})
	if err != nil {
		t.Fatal(err)
	}
	side := *slide
	side.KeyBeside = true
	beside, err := build(r, Options{Preset: side})
	if err != nil {
		t.Fatal(err)
	}
	count := func(d *doc) (shapes, labels int) {
		for _, it := range d.items {
			switch it.(type) {
			case *shape:
				shapes++
			case *label:
				labels++
			}
		}
		return shapes, labels
	}
	s0, l0 := count(below)
	s1, l1 := count(beside)
	if s0 != s1 || l1 < l0 {
		t.Errorf("shapes %d beside, %d below; labels %d and %d: want the same shapes and no label lost", s1, s0, l1, l0)
	}
	if beside.w <= below.w || beside.w > below.w+legendGap+besideWidth+legendLeft || beside.h >= below.h {
		t.Errorf("beside: %d × %d layout px, below: %d × %d; want wider by at most the column, and lower", beside.w, beside.h, below.w, below.h)
	}
	// Every key text starts right of the plot's layout and fits the figure.
	inKey, keyTexts := false, 0
	for _, it := range beside.items {
		switch v := it.(type) {
		case *group:
			inKey = v.class == "gl-key"
		case *label:
			if inKey {
				keyTexts++
			}
			if inKey && (v.x < float64(below.w) || v.x+measure(v) > float64(beside.w)) {
				t.Errorf("key text %q at x %g–%g, want within %d–%d", v.runs[0].text, v.x, v.x+measure(v), below.w, beside.w)
			}
		}
	}
	if keyTexts < 10 {
		t.Errorf("%d key texts found, want the campus plan's key", keyTexts)
	}
}
