package render

import (
	"bytes"
	"testing"
)

// BenchmarkFigure draws each demo plan and the heaviest plan. The speed
// and size are reported, not asserted: SetBytes gives MB/s of SVG written
// and svg-bytes the size of one figure.
func BenchmarkFigure(b *testing.B) {
	for _, path := range append(demoPlans(b), stressPlan) {
		r := compute(b, loadPlan(b, path))
		b.Run(planName(path), func(b *testing.B) {
			var buf bytes.Buffer
			for b.Loop() {
				buf.Reset()
				if err := Figure(&buf, r, Options{}); err != nil {
					b.Fatal(err)
				}
			}
			b.SetBytes(int64(buf.Len()))
			b.ReportMetric(float64(buf.Len()), "svg-bytes")
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
