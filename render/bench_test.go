package render

import (
	"bytes"
	"fmt"
	"io"
	"testing"

	"gridloom/grid"
)

// drawLoop runs draw(r, opt) for the benchmark's loop into one reused
// buffer and returns the last drawing, for its size and contents.
func drawLoop(b *testing.B, draw func(io.Writer, grid.Result, Options) error, r grid.Result, opt Options) []byte {
	b.Helper()
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := draw(&buf, r, opt); err != nil {
			b.Fatal(err)
		}
	}
	return buf.Bytes()
}

// initialStress is the plan with the most Type0-PDCCH occasions.
const initialStress = "../testdata/stress/fr2-1-initial-access.yaml"

// BenchmarkFigure draws each demo plan, the heaviest plan and the plan
// with the most Type0-PDCCH occasions. The speed
// and size are reported, not asserted: SetBytes gives MB/s of SVG written
// and svg-bytes the size of one figure.
func BenchmarkFigure(b *testing.B) {
	for _, path := range append(demoPlans(b), stressPlan, initialStress) {
		r := compute(b, loadPlan(b, path))
		b.Run(planName(path), func(b *testing.B) {
			svg := drawLoop(b, Figure, r, Options{})
			b.SetBytes(int64(len(svg)))
			b.ReportMetric(float64(len(svg)), "svg-bytes")
		})
	}
}

// BenchmarkSymbolCSV writes the heaviest plan's 8960 symbol rows.
func BenchmarkSymbolCSV(b *testing.B) {
	r := compute(b, loadPlan(b, stressPlan))
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := SymbolCSV(&buf, r); err != nil {
			b.Fatal(err)
		}
	}
	b.SetBytes(int64(buf.Len()))
}

// BenchmarkFigurePNG rasterises each demo plan and the heaviest plan at the
// default width and the widest; png-bytes is the size of one image.
func BenchmarkFigurePNG(b *testing.B) {
	for _, path := range append(demoPlans(b), stressPlan) {
		r := compute(b, loadPlan(b, path))
		for _, width := range []int{DefaultWidth, MaxWidth} {
			b.Run(fmt.Sprintf("%s-%d", planName(path), width), func(b *testing.B) {
				img := drawLoop(b, FigurePNG, r, Options{Width: width})
				b.ReportMetric(float64(len(img)), "png-bytes")
			})
		}
	}
}

// BenchmarkFigurePNGPaper rasterises the heaviest plan for paper: the A4
// column at 300 dpi (1890 px, a zoom of 1890/604 that averages its
// patterns per pixel) and at twice the default width (PNGScale 2, a whole
// zoom). The cost follows the pixels, not the lattice.
func BenchmarkFigurePNGPaper(b *testing.B) {
	r := compute(b, loadPlan(b, stressPlan))
	a4, _ := ParsePreset("a4")
	for name, opt := range map[string]Options{"a4-300dpi": {Preset: *a4, DPI: 300}, "scale2": {PNGScale: 2}} {
		b.Run(name, func(b *testing.B) {
			img := drawLoop(b, FigurePNG, r, opt)
			b.ReportMetric(float64(len(img)), "png-bytes")
		})
	}
}
