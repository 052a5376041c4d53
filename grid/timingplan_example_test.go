package grid_test

import (
	"fmt"

	"gridloom/grid"
)

func dddsu(ref int, periodMs float64) *grid.TDDPlan {
	return &grid.TDDPlan{ReferenceSCSKHz: ref,
		Pattern1: grid.TDDPattern{PeriodMs: periodMs, DownlinkSlots: 3, DownlinkSymbols: 10, UplinkSlots: 1, UplinkSymbols: 2}}
}

// The trade a numerology makes on one TDD pattern: what 30 and 60 kHz buy
// in processing and latency, and the range the pattern's guard leaves. K1
// counts slots, which are half as long at 60 kHz. On this downlink-heavy
// pattern the uplink sets the worst case: at 30 kHz it waits up to 2.5 ms
// for its one uplink slot and misses a 3 ms target; 60 kHz meets it.
func ExampleCompute_timing() {
	start := 0
	res := grid.Compute(grid.Plan{
		Carrier:     grid.CarrierPlan{BandwidthMHz: 100},
		TDD:         dddsu(30, 2.5),
		Environment: &grid.EnvironmentPlan{CellRadiusKm: 5, LatencyTargetMs: 3},
		Partitions: []grid.PartitionPlan{
			{Name: "embb", SCSKHz: 30, StartCRB: &start, SizePRB: 100},
			{Name: "urllc", SCSKHz: 60, StartCRB: &start, SizePRB: 30, Direction: "UL"},
		},
	})
	ms := func(t float64) float64 { return t / float64(grid.TcPerSubframe) }
	for _, l := range res.Partitions {
		t := l.Timing
		fmt.Printf("%s %d kHz: T_proc,1 %.3f ms, K1 ≥ %d, DL %.3f ms mean, 2-symbol DL %.3f ms\n", l.Name, l.Numerology.SCSKHz(),
			ms(float64(t.TProc1)), t.K1Min, ms(t.Slot.DL.Mean), ms(t.MiniSlot[2].DL.Mean))
	}
	fmt.Printf("guard %d symbols at 30 kHz, cell radius up to %.2f km\n", res.Timing.GuardSymbols[30], res.Timing.MaxCellRadiusM/1000)
	fmt.Println(res.Advice.Reason)
	// Output:
	// embb 30 kHz: T_proc,1 0.464 ms, K1 ≥ 1, DL 1.407 ms mean, 2-symbol DL 0.545 ms
	// urllc 60 kHz: T_proc,1 0.357 ms, K1 ≥ 2, DL 0.828 ms mean, 2-symbol DL 0.439 ms
	// guard 2 symbols at 30 kHz, cell radius up to 6.79 km
	// 60 kHz normal CP suits every criterion with the widest margin.
}

// Two cells on the same DDDSU pattern, the second one slot (500 µs) late:
// its uplink slot falls on the first one's downlink, and back.
func ExampleCrossLinkConflicts() {
	plan := grid.Plan{Carrier: grid.CarrierPlan{BandwidthMHz: 100}, TDD: dddsu(30, 2.5),
		Partitions: []grid.PartitionPlan{{Name: "all", SCSKHz: 30, SizePRB: 273}}}
	t := *grid.Compute(plan).TDD
	cl, _ := grid.CrossLinkConflicts(t, t, 500)
	for _, c := range cl.Conflicts {
		fmt.Printf("%8.3f to %8.3f µs: A %v, B %v\n", c.Start.Micros(), c.End.Micros(), c.A, c.B)
	}
	fmt.Printf("%.1f µs of conflict per 10 ms\n", cl.PerTenMs*1e6/float64(grid.TcPerSecond))
	// Output:
	//    0.000 to  500.000 µs: A D, B U
	// 1928.646 to 2357.292 µs: A U, B D
	// 3714.6 µs of conflict per 10 ms
}
