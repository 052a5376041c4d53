package grid_test

import (
	"testing"

	"gridloom/grid"
)

// BenchmarkComputeTDDStress is the heaviest plan under a TDD pattern:
// 8960 symbols of 960 kHz mapped onto a 120 kHz pattern, with 64 SS/PBCH
// candidates checked against its uplink symbols. It measures the
// direction walk, which is linear in the symbols of the span.
func BenchmarkComputeTDDStress(b *testing.B) {
	ssbGSCN := 24314
	p := benchPlans(b)["fr2-2-2000mhz"]
	p.TDD = &grid.TDDPlan{ReferenceSCSKHz: 120, Pattern1: grid.TDDPattern{PeriodMs: 5, DownlinkSlots: 28, DownlinkSymbols: 6, UplinkSlots: 10, UplinkSymbols: 4}}
	p.SSB = &grid.SSBPlan{SCSKHz: 960, GSCN: &ssbGSCN, PeriodMs: 5} // SS_REF 59812.32 MHz, on the synchronization raster
	r := grid.Compute(p)
	if r.TDD == nil || r.SSB == nil || len(r.Partitions) != 1 || r.HasErrors() {
		b.Fatalf("the TDD stress plan does not compute cleanly: %v", r.Findings)
	}
	b.ReportMetric(float64(r.Partitions[0].SymbolCount()), "symbols/op")
	b.ReportAllocs()
	for b.Loop() {
		_ = grid.Compute(p)
	}
}
