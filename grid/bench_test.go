package grid_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// benchPlans are the demo plans and the heaviest plan a user can ask for:
// FR2-2, 2000 MHz at 960 kHz, 148 PRBs, 10 ms (8960 symbols × 148 PRBs).
func benchPlans(b *testing.B) map[string]grid.Plan {
	b.Helper()
	files, _ := filepath.Glob("demo/*.yaml")
	files = append(files, "../testdata/stress/fr2-2-2000mhz.yaml")
	out := map[string]grid.Plan{}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		p, err := planfile.Decode(data)
		if err != nil {
			b.Fatal(err)
		}
		out[strings.TrimSuffix(filepath.Base(f), ".yaml")] = p
	}
	return out
}

// BenchmarkCompute places and checks a plan; symbols are not listed.
func BenchmarkCompute(b *testing.B) {
	for name, p := range benchPlans(b) {
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				_ = grid.Compute(p)
			}
		})
	}
}

// BenchmarkLattice also lists every symbol of every partition, as the JSON
// document and the CSV do.
func BenchmarkLattice(b *testing.B) {
	for name, p := range benchPlans(b) {
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			symbols := 0
			for b.Loop() {
				r := grid.Compute(p)
				symbols = 0
				for _, l := range r.Partitions {
					symbols += len(l.Symbols())
				}
			}
			b.ReportMetric(float64(symbols), "symbols/op")
		})
	}
}
