package grid

import (
	"slices"
	"testing"

	"gridloom/grid/prach"
)

// prachTestPlans are testdata/prach/dddsu.yaml and fdd-long.yaml without
// their prach blocks, built field by field: planfile imports grid.
func prachTestPlans(t *testing.T) map[string]Plan {
	t.Helper()
	i := func(v int) *int { return &v }
	f := func(v float64) *float64 { return &v }
	dddsu := Plan{Name: "dddsu", Carrier: CarrierPlan{Range: "FR1", Band: "n78", BandwidthMHz: 40, CenterMHz: f(3750)},
		TDD:        &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 2.5, DownlinkSlots: 3, DownlinkSymbols: 10, UplinkSlots: 1, UplinkSymbols: 2}},
		SSB:        &SSBPlan{SCSKHz: 30, GSCN: i(8016), Bitmap: "11110000", PeriodMs: 20},
		Partitions: []PartitionPlan{{Name: "cell", SCSKHz: 30, StartCRB: i(0), SizePRB: 106}}}
	fdd := Plan{Name: "fdd", Carrier: CarrierPlan{Range: "FR1", Band: "n3", BandwidthMHz: 20, CenterMHz: f(1842.5)},
		SSB: &SSBPlan{SCSKHz: 15, GSCN: i(4589), Bitmap: "1111", PeriodMs: 20},
		Partitions: []PartitionPlan{{Name: "down", SCSKHz: 15, StartCRB: i(0), SizePRB: 52},
			{Name: "up", SCSKHz: 15, StartCRB: i(54), SizePRB: 52, Direction: "UL"}}}
	return map[string]Plan{"dddsu": dddsu, "fdd": fdd}
}

// The block mapping of buildPRACH, which reuses its verdicts, agrees with
// prach.Associate, which judges every occasion itself, for every index of
// the table on two plans and several ssb-perRACH-Occasion and msg1-FDM.
func TestPRACHMappingAgreesWithAssociate(t *testing.T) {
	compared, differ := 0, 0
	for name, p := range prachTestPlans(t) {
		res := Compute(p)
		if res.HasErrors() {
			t.Fatalf("%s: %v", name, res.Findings)
		}
		spec, err := prachSpectrum(&res)
		if err != nil {
			t.Fatal(err)
		}
		unpaired := spec != prach.FR1Paired
		bwp, source, _ := defaultPRACHBWP(&res, unpaired)
		layout := prachLayout(&res, unpaired)
		var sent []int
		for k, s := range res.SSB.sent {
			if s {
				sent = append(sent, k)
			}
		}
		for _, n := range []string{"1/2", "1", "4"} {
			for _, fdm := range []int{1, 2} {
				for index := range spec.Len() {
					pp := PRACHPlan{ConfigurationIndex: index, Msg1FDM: fdm, SSBPerRachOccasion: n, Msg1SubcarrierSpacing: 30}
					if spec == prach.FR1Paired {
						pp.Msg1SubcarrierSpacing = 0
					}
					var fs findings
					pr, ok := readPRACH(&fs, res.Channel.Range, spec, &pp, bwp.SCSKHz)
					if !ok {
						continue
					}
					got := buildPRACH(&fs, pr, &res, bwp, source, layout, nil)
					a, aerr := prach.Associate(spec, index, pr.mu, fdm, sent, pr.n, layout)
					if got == nil {
						continue
					}
					if aerr != nil {
						if got.AssociationPeriodFrames != 0 {
							t.Errorf("%s index %d: Associate refuses (%v), buildPRACH gives %d frames", name, index, aerr, got.AssociationPeriodFrames)
						}
						continue
					}
					compared++
					var want [][]int
					for _, r := range a.ROs {
						want = append(want, r.SSBs)
					}
					var have [][]int
					for _, o := range got.Occasions {
						if o.Valid {
							have = append(have, o.SSBIndexes)
						}
					}
					if got.AssociationPeriodFrames != a.Periods*a.ConfigPeriodFrames || !slices.EqualFunc(have, want, slices.Equal) {
						differ++
						if differ < 5 {
							t.Errorf("%s index %d N %s FDM %d: %d frames %v; Associate %d frames %v", name, index, n, fdm,
								got.AssociationPeriodFrames, have, a.Periods*a.ConfigPeriodFrames, want)
						}
					}
				}
			}
		}
	}
	t.Logf("%d configurations compared, %d differ", compared, differ)
	if compared == 0 {
		t.Fatal("nothing compared")
	}
}
