package grid_test

import (
	"os"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// initialPlans are a plan with initial access and the one with the most
// Type0-PDCCH occasions (1024: 64 blocks, 160 ms).
func initialPlans(b *testing.B) map[string]grid.Plan {
	b.Helper()
	out := map[string]grid.Plan{}
	for name, f := range map[string]string{
		"campus": "../testdata/initial/campus.yaml",
		"fr2-64": "../testdata/stress/fr2-1-initial-access.yaml",
	} {
		data, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		p, err := planfile.Decode(data)
		if err != nil {
			b.Fatal(err)
		}
		out[name] = p
	}
	return out
}

// BenchmarkComputeInitialAccess is Compute with initialAccess; set it
// against the same plan without (the "without" runs).
func BenchmarkComputeInitialAccess(b *testing.B) {
	for name, p := range initialPlans(b) {
		without := p.Clone()
		without.InitialAccess = nil
		for _, c := range []struct {
			run  string
			plan grid.Plan
		}{{"with", p}, {"without", without}} {
			b.Run(name+"/"+c.run, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					_ = grid.Compute(c.plan)
				}
			})
		}
	}
}

// BenchmarkFindInitialAccess tries all 256 pdcch-ConfigSIB1 values.
func BenchmarkFindInitialAccess(b *testing.B) {
	for name, p := range initialPlans(b) {
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := grid.FindInitialAccess(p, ""); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
