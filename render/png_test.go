package render

import (
	"bytes"
	"fmt"
	"image"
	"image/png"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
)

// How FigurePNG is judged against rsvg-convert drawing Figure's SVG at the
// same size. Text cannot match pixel for pixel: the SVG names sans-serif,
// which rsvg sets in the system's face (DejaVu Sans here), and the PNG is
// set in Go Regular. So the comparison has two parts.
//
// Geometry, every pixel outside the text boxes (over 80 % of the image):
// the mean luminance difference at most maxGeomMean levels of 255, and at
// most maxGeomFar of the pixels off by more than farLevels. Measured when
// the limits were set, on the demo plans and the heaviest plan in both
// themes with rsvg-convert 2.54: means of 0.07 to 0.17 levels and at most
// 1 ppm of far pixels, where the two anti-alias slightly differently.
// Leaving out one small kind of mark moves the far share past the limit:
// without the three flexible TDD runs of the campus plan (3 of 25 × 10 px)
// 330 ppm, without its four SS/PBCH blocks 4400 ppm.
// comparePNGWithSVG draws r with FigurePNG and with rsvg-convert from
// Figure's SVG, stops the test if their sizes differ, and compares them,
// the text boxes taken from the layout at the PNG's scale.
func comparePNGWithSVG(t *testing.T, r grid.Result, opt Options) pngVerdict {
	t.Helper()
	ref := rsvgPNG(t, figure(t, r, opt))
	got := figurePNG(t, r, opt)
	if got.Bounds() != ref.Bounds() {
		t.Fatalf("%s %s: FigurePNG is %v, rsvg-convert %v", opt.Preset.Name, opt.Theme, got.Bounds(), ref.Bounds())
	}
	d, err := build(r, opt)
	if err != nil {
		t.Fatal(err)
	}
	if k := float64(d.outW) / float64(d.w); k != 1 {
		d = scaleDoc(d, k)
	}
	return comparePNG(toGrey(got), toGrey(ref), d)
}

// TestFigurePNGSensitivity keeps the first of these true.
//
// Text, each label's box: the mean ink (255 − luminance) of the two
// images within maxInkRatio of each other, so that every label is there
// in both. Measured: 15 % at worst; a missing rail note differs by 98 %.
// This finds missing or misplaced text, not wrong glyphs.
const (
	farLevels   = 32
	maxGeomMean = 0.5
	maxGeomFar  = 100e-6
	maxInkRatio = 0.3
)

// rsvgPNG renders an SVG with rsvg-convert at its own size. It skips the
// test when the tool is missing, unless GRIDLOOM_REQUIRE_TOOLS=1.
func rsvgPNG(t *testing.T, svgData []byte) image.Image {
	t.Helper()
	rsvg, err := exec.LookPath("rsvg-convert")
	if err != nil {
		if os.Getenv("GRIDLOOM_REQUIRE_TOOLS") == "1" {
			t.Fatalf("rsvg-convert is not on PATH and GRIDLOOM_REQUIRE_TOOLS=1: %v", err)
		}
		t.Skip("rsvg-convert is not on PATH (apt-get install librsvg2-bin); the PNG is not compared")
	}
	dir := t.TempDir()
	in, out := filepath.Join(dir, "figure.svg"), filepath.Join(dir, "figure.png")
	if err := os.WriteFile(in, svgData, 0o644); err != nil {
		t.Fatal(err)
	}
	var stderr bytes.Buffer
	cmd := exec.Command(rsvg, "-o", out, in)
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil || stderr.Len() > 0 {
		t.Fatalf("rsvg-convert: %v; stderr: %s", err, stderr.String())
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("rsvg-convert wrote no readable PNG: %v", err)
	}
	return img
}

// decodePNG reads a PNG that FigurePNG wrote.
func decodePNG(t testing.TB, data []byte) image.Image {
	t.Helper()
	if !bytes.HasPrefix(data, []byte("\x89PNG\r\n\x1a\n")) {
		t.Fatalf("FigurePNG wrote %d bytes that are not a PNG", len(data))
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("FigurePNG wrote no readable PNG: %v", err)
	}
	return img
}

func figurePNG(t testing.TB, r grid.Result, opt Options) image.Image {
	t.Helper()
	var b bytes.Buffer
	if err := FigurePNG(&b, r, opt); err != nil {
		t.Fatalf("FigurePNG(%q, %+v): %v", r.Plan.Name, opt, err)
	}
	return decodePNG(t, b.Bytes())
}

// grey is an image's Rec. 601 luminance, 0 to 255, row by row.
type grey struct {
	w, h int
	v    []float64
}

func toGrey(img image.Image) grey {
	b := img.Bounds()
	g := grey{w: b.Dx(), h: b.Dy(), v: make([]float64, b.Dx()*b.Dy())}
	for y := range g.h {
		for x := range g.w {
			r, gr, bl, _ := img.At(b.Min.X+x, b.Min.Y+y).RGBA()
			g.v[y*g.w+x] = (0.299*float64(r) + 0.587*float64(gr) + 0.114*float64(bl)) / 257
		}
	}
	return g
}

// textBoxes are the boxes of d's labels: where the viewer's sans-serif
// and the Go fonts set different glyphs. A box reaches a quarter of the
// label's width beyond it each side, for faces of other widths, and
// covers the halo.
func textBoxes(d *doc) []image.Rectangle {
	var boxes []image.Rectangle
	for _, it := range d.items {
		l, ok := it.(*label)
		if !ok {
			continue
		}
		x, y := l.pos()
		w := measure(l) / widthMargin
		x0 := float64(x) + l.anchor.shift(w)
		pad := w/4 + 3
		r := image.Rect(int(x0-pad), y-int(l.size)-3, int(x0+w+pad)+1, y+int(l.size*0.35)+3)
		if l.rotate { // turned −90° about (x, y): the text runs up from y
			lo, hi := x0-float64(x)-pad, x0-float64(x)+w+pad
			r = image.Rect(x-int(l.size)-3, y-int(hi)-1, x+int(l.size*0.35)+3, y-int(lo)+1)
		}
		boxes = append(boxes, r)
	}
	return boxes
}

// pngVerdict is how two renderings of one figure compare.
type pngVerdict struct {
	geomMean, geomFar float64 // outside the text boxes
	geomPx            int
	worstInk          float64 // the largest ink ratio of a text box
	worstBox          image.Rectangle
}

func (v pngVerdict) ok() bool {
	return v.geomMean <= maxGeomMean && v.geomFar <= maxGeomFar && v.worstInk <= maxInkRatio
}

func (v pngVerdict) String() string {
	return fmt.Sprintf("geometry (%d px): mean difference %.3f levels (limit %v), %.0f ppm off by more than %d (limit %.0f); text: worst ink ratio %.2f in box %v (limit %v)",
		v.geomPx, v.geomMean, maxGeomMean, v.geomFar*1e6, farLevels, maxGeomFar*1e6, v.worstInk, v.worstBox, maxInkRatio)
}

// comparePNG judges a against b for the figure d.
func comparePNG(a, b grey, d *doc) pngVerdict {
	var v pngVerdict
	boxes := textBoxes(d)
	masked := make([]bool, a.w*a.h)
	for _, r := range boxes {
		r = r.Intersect(image.Rect(0, 0, a.w, a.h))
		for y := r.Min.Y; y < r.Max.Y; y++ {
			for x := r.Min.X; x < r.Max.X; x++ {
				masked[y*a.w+x] = true
			}
		}
	}
	far := 0
	for i := range a.v {
		if masked[i] {
			continue
		}
		diff := math.Abs(a.v[i] - b.v[i])
		v.geomMean += diff
		if diff > farLevels {
			far++
		}
		v.geomPx++
	}
	v.geomMean /= float64(v.geomPx)
	v.geomFar = float64(far) / float64(v.geomPx)
	for _, r := range boxes {
		ia, ib := a.ink(r), b.ink(r)
		if ratio := math.Abs(ia-ib) / max(ia, ib, 1); ratio > v.worstInk {
			v.worstInk, v.worstBox = ratio, r
		}
	}
	return v
}

// ink is the mean darkness, 255 − luminance, inside r.
func (g grey) ink(r image.Rectangle) float64 {
	r = r.Intersect(image.Rect(0, 0, g.w, g.h))
	s, k := 0.0, 0
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			s += 255 - g.v[y*g.w+x]
			k++
		}
	}
	if k == 0 {
		return 0
	}
	return s / float64(k)
}

// TestFigurePNGMatchesSVG draws each demo plan and the heaviest plan in
// both themes with FigurePNG and with rsvg-convert from Figure's SVG.
func TestFigurePNGMatchesSVG(t *testing.T) {
	// The initial-access plan draws CORESET#0, whose key entry is a dashed
	// rectangle: a dash ending on its corner once blacked out the PNG.
	for _, path := range append(demoPlans(t), stressPlan, initialCampus) {
		r := compute(t, loadPlan(t, path))
		for _, theme := range []Theme{ThemeLight, ThemePrint} {
			t.Run(planName(path)+"-"+theme.String(), func(t *testing.T) {
				v := comparePNGWithSVG(t, r, Options{Theme: theme})
				t.Log(v)
				if !v.ok() {
					t.Errorf("FigurePNG and rsvg-convert differ: %v", v)
				}
			})
		}
	}
}

// TestFigurePNGSensitivity shows that the comparison can fail: the campus
// figure painted without its flexible TDD runs, or without the notes
// beside the rail, does not pass against the full SVG.
func TestFigurePNGSensitivity(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	ref := toGrey(rsvgPNG(t, figure(t, r, Options{})))
	d, err := build(r, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, class := range []string{"gl-tdd-f", "gl-note"} {
		less := *d
		less.items = nil
		for _, it := range d.items {
			if s, ok := it.(*shape); ok && slices.Contains(strings.Fields(s.class), class) {
				continue
			}
			if l, ok := it.(*label); ok && slices.Contains(strings.Fields(l.class), class) {
				continue
			}
			less.items = append(less.items, it)
		}
		img, err := paintDoc(&less, 1)
		if err != nil {
			t.Fatal(err)
		}
		v := comparePNG(toGrey(img), ref, d)
		t.Logf("without %s: %v", class, v)
		if v.ok() {
			t.Errorf("the figure without %s passes the comparison: %v", class, v)
		}
	}
}

// TestFigurePNGSize: one pixel per SVG unit, at every width.
func TestFigurePNGSize(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/stadium.yaml"))
	for _, width := range []int{0, MinWidth, MaxWidth} {
		opt := Options{Width: width, Caption: "Fig. 1"}
		root := parseSVG(t, figure(t, r, opt))
		img := figurePNG(t, r, opt)
		if w, h := attrInt(t, root, "width"), attrInt(t, root, "height"); int64(img.Bounds().Dx()) != w || int64(img.Bounds().Dy()) != h {
			t.Errorf("width %d: PNG %v, SVG %d × %d", width, img.Bounds(), w, h)
		}
	}
}
