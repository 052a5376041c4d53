package rrc_test

import (
	"math/rand"
	"os"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
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

// With initialAccess the MIB bits carry pdcch-ConfigSIB1 and
// dmrs-TypeA-Position from the plan. The campus plan with pos3 has
// subCarrierSpacingCommon scs30or120 (FR1, 30 kHz), k_SSB 16 (GSCN 8016,
// TestMIBForPlan), controlResourceSetZero 2 and searchSpaceZero 0; with
// SFN 0 the 24 bits of BCCH-BCH-Message are, by X.691 unaligned PER field
// by field (EncodeMIB's layout): message mib 0, systemFrameNumber 000000,
// subCarrierSpacingCommon 1, ssb-SubcarrierOffset 16 mod 16 = 0000,
// dmrs-TypeA-Position pos3 = 1, controlResourceSetZero 0010,
// searchSpaceZero 0000, cellBarred notBarred = 1 (second of {barred,
// notBarred}), intraFreqReselection allowed = 0, spare 0.
func TestMIBForPlanInitialAccess(t *testing.T) {
	p := initialPlans(t)["campus-partition-pos3"]
	m, timing, err := rrc.MIBForPlan(grid.Compute(p))
	if err != nil {
		t.Fatal(err)
	}
	bits, err := rrc.EncodeMIB(m, timing)
	if err != nil {
		t.Fatal(err)
	}
	want := "0" + "000000" + "1" + "0000" + "1" + "0010" + "0000" + "1" + "0" + "0"
	if bits.Binary() != want || bits.Hex() != "010904" {
		t.Errorf("MIB bits %s (%s), want %s (010904)", bits.Binary(), bits.Hex(), want)
	}
	// The value notation says the same MIB.
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range []string{"dmrs-TypeA-Position pos3", "controlResourceSetZero 2", "searchSpaceZero 0"} {
		if !strings.Contains(string(text), f) {
			t.Errorf("the value notation lacks %q:\n%s", f, text)
		}
	}
	// The fields carry them, not notes: a reader without gridloom gets
	// them.
	for _, key := range []string{"initialAccess.controlResourceSetZero", "initialAccess.searchSpaceZero", "initialAccess.dmrsTypeAPosition", "carrier.nTaOffset"} {
		if strings.Contains(string(text), "gridloom "+key+":") {
			t.Errorf("%s travels as a note, not as its 38.331 field:\n%s", key, text)
		}
	}
	// Without initialAccess the MIB leaves them to the caller: zero.
	p.InitialAccess = nil
	m, _, err = rrc.MIBForPlan(grid.Compute(p))
	if err != nil || m.ControlResourceSetZero != 0 || m.SearchSpaceZero != 0 || m.DMRSTypeAPosition != 0 {
		t.Errorf("MIB without initialAccess %+v, %v", m, err)
	}
}

// The reader refuses initial-access fields that contradict each other or
// leave their ASN.1 range, naming the field, and skips initial BWPs it
// cannot tie to a CORESET#0.
func TestDecodeInitialAccessRefuses(t *testing.T) {
	const base = "f FrequencyInfoDL ::= { scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }\n"
	const mib = "m MIB ::= { ssb-SubcarrierOffset 0, dmrs-TypeA-Position pos2, pdcch-ConfigSIB1 { controlResourceSetZero 2, searchSpaceZero 0 } }\n"
	for _, c := range []struct{ name, text, want string }{
		{"n-TimingAdvanceOffset value", base + "s ServingCellConfigCommon ::= { n-TimingAdvanceOffset n13792 }", "n-TimingAdvanceOffset n13792 is not a value; use n0, n25600 or n39936"},
		{"dmrs copies differ", base + mib + "s ServingCellConfigCommon ::= { dmrs-TypeA-Position pos3 }", "ServingCellConfigCommon.dmrs-TypeA-Position is pos3, but MIB.dmrs-TypeA-Position at line 2"},
		{"dmrs value", base + "m MIB ::= { dmrs-TypeA-Position pos4 }", "MIB.dmrs-TypeA-Position pos4 is not a value; use pos2 or pos3"},
		{"CORESET#0 copies differ", base + mib + "s ServingCellConfigCommonSIB ::= { downlinkConfigCommon { initialDownlinkBWP { genericParameters { locationAndBandwidth 28875, subcarrierSpacing kHz30 }, pdcch-ConfigCommon { controlResourceSetZero 3, searchSpaceZero 0 } } } }",
			"says controlResourceSetZero 3 and searchSpaceZero 0, but MIB.pdcch-ConfigSIB1 at line 2"},
		{"searchSpaceZero range", base + "m MIB ::= { pdcch-ConfigSIB1 { controlResourceSetZero 2, searchSpaceZero 16 } }", "searchSpaceZero is 16"},
		{"pdcch-ConfigSIB1 half", base + "m MIB ::= { pdcch-ConfigSIB1 { controlResourceSetZero 2 } }", "MIB.pdcch-ConfigSIB1 needs controlResourceSetZero and searchSpaceZero"},
		{"generic missing", base + mib + "s ServingCellConfigCommonSIB ::= { downlinkConfigCommon { initialDownlinkBWP { pdcch-ConfigCommon { controlResourceSetZero 2, searchSpaceZero 0 } } } }", "initialDownlinkBWP needs genericParameters"},
	} {
		if _, err := rrc.Decode([]byte(c.text)); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Decode = %v, want an error saying %q", c.name, err, c.want)
		}
	}

	// An initial BWP without controlResourceSetZero and searchSpaceZero
	// anywhere is skipped and listed; the plan gets no initialAccess.
	d, err := rrc.Decode([]byte(base + "s ServingCellConfigCommonSIB ::= { downlinkConfigCommon { initialDownlinkBWP { genericParameters { locationAndBandwidth 28875, subcarrierSpacing kHz30 } } } }"))
	if err != nil {
		t.Fatal(err)
	}
	if d.Plan.InitialAccess != nil || !strings.Contains(strings.Join(d.Skipped, "; "), "initialDownlinkBWP (no controlResourceSetZero and searchSpaceZero) (line 2)") {
		t.Errorf("initialAccess %+v, skipped %q", d.Plan.InitialAccess, d.Skipped)
	}
	// pdcch-ConfigCommon alone, with no MIB, is enough; n25600 reads as
	// given.
	d, err = rrc.Decode([]byte(base + "s ServingCellConfigCommonSIB ::= { downlinkConfigCommon { initialDownlinkBWP { genericParameters { locationAndBandwidth 28875, subcarrierSpacing kHz30, cyclicPrefix extended }, pdcch-ConfigCommon { controlResourceSetZero 4, searchSpaceZero 1 } } } }\nc ServingCellConfigCommon ::= { n-TimingAdvanceOffset n25600, dmrs-TypeA-Position pos3 }"))
	if err != nil {
		t.Fatal(err)
	}
	ia := d.Plan.InitialAccess
	if d.Plan.Carrier.NTAOffset != "n25600" || ia == nil || ia.ControlResourceSetZero != 4 || ia.SearchSpaceZero != 1 || ia.DMRSTypeAPosition != "pos3" ||
		ia.InitialDownlinkBWP == nil || ia.InitialDownlinkBWP.CyclicPrefix != "extended" || *ia.InitialDownlinkBWP.LocationAndBandwidth != 28875 {
		t.Errorf("nTaOffset %q, initialAccess %+v", d.Plan.Carrier.NTAOffset, ia)
	}
}

// TestRoundTripInitialVariants varies the initial-access and timing keys of
// the campus plan over every controlResourceSetZero and searchSpaceZero,
// both DM-RS positions, each form of the initial BWPs and every
// nTaOffset; each variant without errors must read back exactly.
func TestRoundTripInitialVariants(t *testing.T) {
	base := initialPlans(t)["campus"]
	r := rand.New(rand.NewSource(38331))
	exported, withPartition, withUL := 0, 0, 0
	for range 4000 {
		p := base.Clone()
		ia := p.InitialAccess
		ia.ControlResourceSetZero, ia.SearchSpaceZero = r.Intn(16), r.Intn(16)
		ia.DMRSTypeAPosition = []string{"", "pos2", "pos3", "POS3"}[r.Intn(4)]
		bwp := func() *grid.InitialBWPPlan {
			start, size := 1+r.Intn(40), 24+r.Intn(60)
			switch r.Intn(5) {
			case 1:
				return &grid.InitialBWPPlan{Partition: p.Partitions[r.Intn(len(p.Partitions))].Name}
			case 2:
				return &grid.InitialBWPPlan{StartCRB: &start, SizePRB: size, SubcarrierSpacingKHz: []int{0, 30}[r.Intn(2)]}
			case 3:
				riv, _ := grid.EncodeRIV(start-1, size)
				return &grid.InitialBWPPlan{LocationAndBandwidth: &riv, CyclicPrefix: []string{"", "normal"}[r.Intn(2)]}
			case 4:
				riv, _ := grid.EncodeRIV(start, size)
				return &grid.InitialBWPPlan{LocationAndBandwidth: &riv, SubcarrierSpacingKHz: 15}
			}
			return nil
		}
		ia.InitialDownlinkBWP, ia.InitialUplinkBWP = bwp(), bwp()
		p.Carrier.NTAOffset = []string{"", "n0", "n25600", "n39936"}[r.Intn(4)]
		for i := range p.Partitions {
			p.Partitions[i].UECapability = r.Intn(3)
			p.Partitions[i].DMRSAdditionalPosition = []string{"", "pos0", "pos1", "pos2", "pos3"}[r.Intn(5)]
		}
		if r.Intn(2) == 1 {
			p.Environment = &grid.EnvironmentPlan{CellRadiusKm: float64(r.Intn(40)) / 4, LatencyTargetMs: float64(r.Intn(8))}
		}
		if grid.Compute(p).HasErrors() {
			continue
		}
		exported++
		if ia.InitialDownlinkBWP != nil && ia.InitialDownlinkBWP.Partition != "" {
			withPartition++
		}
		if ia.InitialUplinkBWP != nil {
			withUL++
		}
		roundTrip(t, "variant", p)
	}
	t.Logf("%d variants read back (%d with a partition as initial downlink BWP, %d with an initial uplink BWP given)", exported, withPartition, withUL)
	if exported < 150 || withPartition < 10 || withUL < 10 {
		t.Errorf("only %d variants (%d by partition, %d with an uplink BWP) reached the round trip", exported, withPartition, withUL)
	}
}

// A note that gives an initial BWP's form (here startCrb and sizePrb)
// must place it where the field says: a text whose initialDownlinkBWP was
// edited afterwards is refused, not read with the note's place.
func TestInitialBWPNoteContradictsField(t *testing.T) {
	p := initialPlans(t)["campus-crbs"]
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(text), "-- gridloom initialAccess.initialDownlinkBWP: {\"startCrb\":26,\"sizePrb\":48}") {
		t.Fatalf("no note for the initial BWP's form:\n%s", text)
	}
	// CRBs 26 to 73 of 30 kHz from offsetToCarrier 1: RIV 275·47 + 25.
	field := "locationAndBandwidth 12950"
	// The uplink one follows it under TDD: the same field, second.
	if strings.Count(string(text), field) != 2 {
		t.Fatalf("want the initial downlink and uplink BWPs as %q:\n%s", field, text)
	}
	edited := strings.Replace(string(text), field, "locationAndBandwidth 12951", 1)
	_, err = rrc.Decode([]byte(edited))
	if err == nil || !strings.Contains(err.Error(), "The gridloom notes contradict pdcch-ConfigSIB1, dmrs-TypeA-Position and the initial BWPs") {
		t.Errorf("Decode of the edited text = %v, want the notes refused", err)
	}
}
