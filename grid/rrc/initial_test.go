package rrc_test

import (
	"os"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// initialPlans are plans with initial access and the timing keys, each
// form of the initial BWPs once: the defaults (CORESET#0's extent, the
// uplink following it under TDD), a place by CRBs, by RIV, and a
// partition named; pos2 and pos3; every nTaOffset.
func initialPlans(t *testing.T) map[string]grid.Plan {
	t.Helper()
	out := map[string]grid.Plan{}
	for _, f := range []string{"campus"} {
		data, err := os.ReadFile("../../testdata/initial/" + f + ".yaml")
		if err != nil {
			t.Fatal(err)
		}
		p, err := planfile.Decode(data)
		if err != nil {
			t.Fatal(err)
		}
		out[f] = p
	}
	campus := out["campus"]

	p := campus.Clone()
	p.InitialAccess.DMRSTypeAPosition = "pos3"
	p.Carrier.NTAOffset = "n39936"
	p.Partitions[1].UECapability = 2
	p.Partitions[1].DMRSAdditionalPosition = "pos1"
	p.Environment = &grid.EnvironmentPlan{CellRadiusKm: 2.5, LatencyTargetMs: 4}
	p.InitialAccess.InitialDownlinkBWP = &grid.InitialBWPPlan{Partition: "video"}
	out["campus-partition-pos3"] = p

	p = campus.Clone()
	p.InitialAccess.DMRSTypeAPosition = ""
	p.Carrier.NTAOffset = "n25600"
	p.InitialAccess.InitialDownlinkBWP = &grid.InitialBWPPlan{StartCRB: ptr(26), SizePRB: 48}
	out["campus-crbs"] = p

	p = campus.Clone()
	p.InitialAccess.DMRSTypeAPosition = ""
	p.InitialAccess.InitialDownlinkBWP = &grid.InitialBWPPlan{LocationAndBandwidth: ptr(275*47 + 26 - 13), SubcarrierSpacingKHz: 30}
	p.InitialAccess.InitialUplinkBWP = &grid.InitialBWPPlan{LocationAndBandwidth: ptr(275*47 + 26 - 13), SubcarrierSpacingKHz: 30}
	out["campus-riv"] = p
	return out
}

func TestRoundTripInitialAccess(t *testing.T) {
	for name, p := range initialPlans(t) {
		t.Run(name, func(t *testing.T) {
			r := grid.Compute(p)
			if r.HasErrors() || r.InitialAccess == nil {
				t.Fatalf("%s: the test plan has errors or no initial access: %v", name, r.Findings)
			}
			roundTrip(t, name, p)
		})
	}
}
