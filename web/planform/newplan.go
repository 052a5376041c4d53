package planform

import "gridloom/grid"

// NewPlan is the plan "New plan" opens (GET /new): an empty carrier to
// start from. It is one FR1 channel of 20 MHz with no band or centre, and
// one downlink partition of 30 kHz that fills its carrier.
//
// Why one partition and not none: a plan without partitions is the
// "empty" error, and a carrier without a bandwidth part carries nothing
// (TS 38.331 always configures an initial BWP). An engineer's first BWP is
// the whole carrier; the plan is then narrowed or split from there.
// Why 30 kHz and 20 MHz: 30 kHz is the spacing of most FR1 TDD carriers
// (common practice), and 20 MHz has an N_RB at 15, 30 and 60 kHz alike
// (TS 38.101-1 Table 5.3.2-1), so a partition of another spacing added
// next does not at once make the bandwidth wrong. Size: N_RB of TS 38.101-1 Table 5.3.2-1 (51 at 30 kHz, 20 MHz);
// startCrb is left out, so the partition begins at its carrier's first CRB.
func NewPlan() grid.Plan {
	const scs, bw = 30, 20
	nrb, _ := grid.FR1.NRB(scs, bw)
	return grid.Plan{
		Name:    "New plan",
		Carrier: grid.CarrierPlan{Range: grid.DefaultRange, BandwidthMHz: bw},
		Partitions: []grid.PartitionPlan{{
			Name: "bwp0", SCSKHz: scs, SizePRB: nrb, Direction: grid.DefaultDirection,
		}},
	}
}
