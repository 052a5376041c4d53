package render

import (
	"image"
	"image/draw"
	"math"
	"slices"
	"testing"
)

// TestDashes cuts a 20 px line with SVG's "6 3": dashes at 0–6, 9–15 and
// 18–20, the pattern starting at the line's first point.
func TestDashes(t *testing.T) {
	got := dashes([]pt{{0, 0}, {0, 20}}, []float64{6, 3})
	want := [][]pt{{{0, 0}, {0, 6}}, {{0, 9}, {0, 15}}, {{0, 18}, {0, 20}}}
	if len(got) != len(want) {
		t.Fatalf("dashes = %v, want %v", got, want)
	}
	for i := range want {
		if !slices.Equal(got[i], want[i]) {
			t.Errorf("dash %d = %v, want %v", i, got[i], want[i])
		}
	}
	// Across a corner the dash carries on round it.
	got = dashes([]pt{{0, 0}, {4, 0}, {4, 10}}, []float64{6, 3})
	if len(got) != 2 || !slices.Equal(got[0], []pt{{0, 0}, {4, 0}, {4, 2}}) || !slices.Equal(got[1], []pt{{4, 5}, {4, 10}}) {
		t.Errorf("dashes round a corner = %v", got)
	}
}

// coverage is the painted area, in px², of filling o.
func coverage(t *testing.T, o *outline) float64 {
	t.Helper()
	img := image.NewRGBA(image.Rect(0, 0, 64, 64))
	draw.Draw(img, img.Bounds(), image.White, image.Point{}, draw.Src)
	pa := &painter{d: &doc{}}
	pa.fill(img, o, solid(black), false)
	area := 0.0
	for i := 0; i < len(img.Pix); i += 4 {
		area += float64(255-img.Pix[i]) / 255
	}
	return area
}

// TestStrokeArea rasterises stroked outlines whose area is known: with
// miter joins a rectangle's stroke is the outer rectangle less the inner
// one, and two rectangles sharing an edge paint that edge once, as SVG's
// stroke does.
func TestStrokeArea(t *testing.T) {
	for _, tc := range []struct {
		name string
		d    pathData
		w    float64
		want float64
	}{
		{"10 × 10 square, 2 px", pathOf(func(p *pathData) { p.rect(5.3, 5.7, 15.3, 15.7) }), 2, 12*12 - 8*8},
		{"two squares sharing an edge", pathOf(func(p *pathData) {
			p.rect(5, 5, 15, 15)
			p.rect(15, 5, 25, 15)
		}), 2, 22*12 - 2*8*8},
		{"vertical line, 0.6 px", pathOf(func(p *pathData) { p.vline(10.25, 3, 43) }), 0.6, 0.6 * 40},
		{"dashed line", func() pathData { return pathOf(func(p *pathData) { p.vline(20, 0, 20) }) }(), 1, 6 + 6 + 2},
	} {
		var dash []float64
		if tc.name == "dashed line" {
			dash = []float64{6, 3}
		}
		got := coverage(t, strokeOf(&tc.d, tc.w, dash))
		if math.Abs(got-tc.want) > 0.1 {
			t.Errorf("%s: %.2f px² painted, want %v", tc.name, got, tc.want)
		}
	}
	// A filled ring: a circle of radius 5 stroked 2 px covers π(6² − 4²).
	o := &outline{}
	circleOf(o, 30, 30, 6, false)
	circleOf(o, 30, 30, 4, true)
	if got, want := coverage(t, o), math.Pi*(36-16); math.Abs(got-want) > 0.1 {
		t.Errorf("ring: %.2f px², want %.2f", got, want)
	}
}

// A dash that ends exactly on a corner (a 10 px square, dashes of 10 on and
// 5 off: the first dash runs along the whole first side) once gave a piece
// that repeated the corner; its zero-length segment had a NaN normal, and the
// PNG of a plan with CORESET#0 in its key came out almost wholly black.
func TestStrokeDashEndingOnACorner(t *testing.T) {
	p := pathOf(func(p *pathData) { p.rect(0, 0, 10, 10) })
	o := strokeOf(&p, 1.5, []float64{10, 5})
	if len(o.segs) == 0 {
		t.Fatal("no outline")
	}
	for _, s := range o.segs {
		for _, v := range []float64{s.p[0].x, s.p[0].y, s.p[1].x, s.p[1].y} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("outline segment %+v is not finite", s)
			}
		}
	}
	if math.IsNaN(o.min.x) || math.IsNaN(o.max.y) || o.min.x < -1 || o.max.x > 11 {
		t.Errorf("outline bounds %v–%v; want within the square and half the width around it", o.min, o.max)
	}
}
