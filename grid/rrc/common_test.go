package rrc_test

import (
	"os"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/coreset0"
	"gridloom/grid/rrc"
)

// commonPlans are an FR2-2 plan (480 kHz blocks on GSCN 24318) and a plan
// on n46, an FR1 band operated with shared spectrum channel access (30 kHz
// blocks on GSCN 9024, which Compute places at offsetToPointA 8, k_SSB 4).
// Invented scenarios.
func commonPlans() map[string]grid.Plan {
	return map[string]grid.Plan{
		"fr2-2": {Name: "FR2-2 480 kHz", Carrier: grid.CarrierPlan{Range: "FR2-2", BandwidthMHz: 400, CenterMHz: ptr(60000.0)},
			SSB:        &grid.SSBPlan{SCSKHz: 480, GSCN: ptr(24318)},
			Partitions: []grid.PartitionPlan{{Name: "all", SCSKHz: 480, StartCRB: ptr(0), SizePRB: 66}}},
		"n46": {Name: "n46 20 MHz", Carrier: grid.CarrierPlan{Band: "n46", BandwidthMHz: 20, CenterMHz: ptr(5190.0)},
			SSB:        &grid.SSBPlan{SCSKHz: 30, GSCN: ptr(9024)},
			Partitions: []grid.PartitionPlan{{Name: "all", SCSKHz: 30, StartCRB: ptr(0), SizePRB: 51}}},
	}
}

// TestSubCarrierSpacingCommonWhereItGivesNoSpacing follows the MIB field
// description of TS 38.331 (testdata/reference/rrc/ts38331-mib-fields.txt):
// "For operation with shared spectrum channel access in FR1 (see 37.213
// [48]) and for operation in FR2-2, the subcarrier spacing for SIB1,
// Msg.2/4 and MsgB for initial access, paging and broadcast SI-messages is
// same as that for the corresponding SSB. For operation with shared
// spectrum channel access, this field instead is used for deriving the QCL
// relation between SS/PBCH blocks". So the writer leaves the field out
// there, saying why, and the reader takes the block's spacing whatever
// the field says, noting that the bit was not a spacing; and with shared
// spectrum in FR1 ssb-SubcarrierOffset is k̄_SSB, whose least significant
// bit does not change k_SSB below 24 (k_SSB = 2⌊k̄_SSB/2⌋, TS 38.211
// 7.4.3.1).
func TestSubCarrierSpacingCommonWhereItGivesNoSpacing(t *testing.T) {
	ref, err := os.ReadFile("../../testdata/reference/rrc/ts38331-mib-fields.txt")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(strings.Fields(string(ref)), " "), "and for operation in FR2-2, the subcarrier spacing for SIB1, Msg.2/4 and MsgB for initial access, paging and broadcast SI-messages is same as that for the corresponding SSB") {
		t.Fatal("the reference no longer holds the sentence this test follows")
	}
	for name, p := range commonPlans() {
		if res := grid.Compute(p); res.HasErrors() {
			t.Fatalf("%s has errors: %v", name, res.Findings)
		}
		roundTrip(t, name, p)
		text, err := rrc.Encode(p)
		if err != nil {
			t.Fatal(err)
		}
		s := string(text)
		mib := s[strings.Index(s, "mib MIB"):strings.Index(s, "sib1-ServingCellConfigCommon")]
		if strings.Contains(mib, "subCarrierSpacingCommon scs") {
			t.Errorf("%s: the MIB writes subCarrierSpacingCommon as a spacing:\n%s", name, mib)
		}
		if !strings.Contains(mib, "subCarrierSpacingCommon is left out") || !strings.Contains(mib, "QCL relation") {
			t.Errorf("%s: the MIB does not say why subCarrierSpacingCommon is left out:\n%s", name, mib)
		}
		// Either value of the bit reads back as the block's spacing: the
		// plan is unchanged, and the reader says the bit gave no spacing.
		for _, v := range []string{"scs15or60", "scs30or120"} {
			edited := strings.Replace(s, "mib MIB ::= {", "mib MIB ::= {\n  subCarrierSpacingCommon "+v+",", 1)
			d, err := rrc.Decode([]byte(edited))
			if err != nil {
				t.Fatalf("%s with %s: %v", name, v, err)
			}
			if d.Plan.SSB.ScsCommonKHz != 0 || grid.Compute(d.Plan).SSB.ScsCommonKHz != p.SSB.SCSKHz {
				t.Errorf("%s with %s: common spacing read as %d kHz, want the block's %d", name, v, grid.Compute(d.Plan).SSB.ScsCommonKHz, p.SSB.SCSKHz)
			}
			if !strings.Contains(strings.Join(d.Assumed, " "), "subCarrierSpacingCommon "+v) {
				t.Errorf("%s with %s: the reader does not say the bit gave no spacing: %v", name, v, d.Assumed)
			}
		}
		// The MIB panel's starting MIB leaves the bit to the caller (0).
		m, _, err := rrc.MIBForPlan(grid.Compute(p))
		if err != nil || m.SubCarrierSpacingCommon != coreset0.SCS15or60 {
			t.Errorf("%s: MIBForPlan gave subCarrierSpacingCommon %v, %v", name, m.SubCarrierSpacingCommon, err)
		}
	}

	// n46: k_SSB 4 is written as ssb-SubcarrierOffset 4; 5 (the QCL bit
	// set) is the same k_SSB, and the plan reads back unchanged.
	p := commonPlans()["n46"]
	if k := grid.Compute(p).SSB.KSSB; k != 4 {
		t.Fatalf("n46: Compute placed k_SSB %d, the test expects 4", k)
	}
	text, _ := rrc.Encode(p)
	if !strings.Contains(string(text), "ssb-SubcarrierOffset 4") || !strings.Contains(string(text), "k̄_SSB") {
		t.Fatalf("n46: the MIB does not write ssb-SubcarrierOffset 4 as k̄_SSB:\n%s", text)
	}
	qcl := strings.Replace(string(text), "ssb-SubcarrierOffset 4", "ssb-SubcarrierOffset 5", 1)
	d, err := rrc.Decode([]byte(qcl))
	if err != nil {
		t.Fatalf("n46 with k̄_SSB 5: %v", err)
	}
	if r := grid.Compute(d.Plan); r.SSB.KSSB != 4 {
		t.Errorf("n46: k̄_SSB 5 read as k_SSB %d, want 2⌊5/2⌋ = 4", r.SSB.KSSB)
	}
	if !strings.Contains(strings.Join(d.Assumed, " "), "k̄_SSB") {
		t.Errorf("n46: the reader does not say ssb-SubcarrierOffset was k̄_SSB: %v", d.Assumed)
	}
}
