package rrc_test

import (
	"errors"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
	"gridloom/grid/rrc"
)

// A configuration as a log might show it: no gridloom notes, values and
// fields in an order of their own, SIB1 around ServingCellConfigCommonSIB,
// the MIB inside BCCH-BCH-Message, fields gridloom has no use for and an
// IE it does not read.
const logged = `-- cell 1, from a base-station log
bwp2 BWP-Downlink ::= { bwp-Common { genericParameters { subcarrierSpacing kHz30, locationAndBandwidth 13750 } }, bwp-Id 2 }
sib1 SIB1 ::= {
  cellSelectionInfo { q-RxLevMin -70 },
  servingCellConfigCommon {
    ss-PBCH-BlockPower -16,
    ssb-PeriodicityServingCell ms20,
    downlinkConfigCommon {
      frequencyInfoDL {
        frequencyBandList { { freqBandIndicatorNR 78 } },
        scs-SpecificCarrierList { { subcarrierSpacing kHz30, offsetToCarrier 0, carrierBandwidth 106 } },
        offsetToPointA 24 -- 15 kHz RBs in FR1
      },
      initialDownlinkBWP { genericParameters { locationAndBandwidth 28875, subcarrierSpacing kHz30 } }
    },
    /* one block */ ssb-PositionsInBurst { inOneGroup '1000 0000'B },
    tdd-UL-DL-ConfigurationCommon { referenceSubcarrierSpacing kHz30,
      pattern1 { nrofDownlinkSlots 7, dl-UL-TransmissionPeriodicity ms5, nrofDownlinkSymbols 6, nrofUplinkSlots 2, nrofUplinkSymbols 4 } }
  }
}
bch BCCH-BCH-Message ::= { message mib : { systemFrameNumber '000000'B, subCarrierSpacingCommon scs30or120,
  ssb-SubcarrierOffset 0, dmrs-TypeA-Position pos2, pdcch-ConfigSIB1 { controlResourceSetZero 2, searchSpaceZero 0 },
  cellBarred notBarred, intraFreqReselection allowed, spare '0'B } }
sib2 SIB2 ::= { cellReselectionInfoCommon { q-Hyst dB0 } }
scc ServingCellConfigCommon ::= { physCellId 1, ssbSubcarrierSpacing kHz30,
  downlinkConfigCommon { frequencyInfoDL { absoluteFrequencyPointA 640000,
    scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } } } }
`

// What the log says, worked by hand:
//
//	carrier: one 30 kHz carrier of 106 RBs from CRB 0: N_RB 106 at 30 kHz is
//	  40 MHz in TS 38.101-1 Table 5.3.2-1, so a 40 MHz FR1 channel
//	band: frequencyBandList { { freqBandIndicatorNR 78 } }, so n78
//	point A: NR-ARFCN 640000 = 3000 MHz + 15 kHz·(640000 − 600000) = 3600 MHz
//	centre: point A + 106·12·30 kHz / 2 = 3600 + 19.08 = 3619.08 MHz
//	bwp2: RIV 13750 = 275·(51 − 1) + 0, so CRBs 0 to 50 (51 RBs) of 30 kHz
//	TDD: 5 ms on 30 kHz, 7 DL slots + 6 symbols, 2 UL slots + 4 symbols
//	SS/PBCH: 30 kHz blocks, offsetToPointA 24, k_SSB 0, block 0 only, 20 ms,
//	  subCarrierSpacingCommon scs30or120, which is 30 kHz in FR1
//	initial access: pdcch-ConfigSIB1 row 2 of TS 38.213 Table 13-4 (24 RBs,
//	  2 symbols, offset 2 RBs) and row 0 of Table 13-11; the block's first
//	  RB is CRB 24·15/30 = 12 (k_SSB 0), so CORESET#0 is CRBs 10 to 33;
//	  dmrs-TypeA-Position pos2, which a plan leaves out; the initial
//	  downlink BWP RIV 28875 = 275·(106 − 1) + 0, the whole carrier
//
// The log's block is off the synchronization raster, and the reader keeps
// it as the log says: reading does not judge, Compute does. Its SS_REF is
// point A + 24·12·15 kHz + 0 + 120·30 kHz = 3600 + 4.32 + 3.6 =
// 3607.92 MHz, and (3607.92 − 3000) / 1.44 = 422.17 is not a whole number
// of 1.44 MHz steps (TS 38.101-1 5.4.3.1), so a UE would not find this
// cell's block: the nearest GSCNs are 7499 + 422 = 7921 (3607.68 MHz) and
// 7922 (3609.12 MHz). That error, and no other, is what Compute must find.
func TestDecodeLog(t *testing.T) {
	d, err := rrc.Decode([]byte(logged))
	if err != nil {
		t.Fatal(err)
	}
	p := d.Plan
	if p.Carrier.Range != "FR1" || p.Carrier.Band != "n78" || p.Carrier.BandwidthMHz != 40 || p.Carrier.CenterMHz == nil || *p.Carrier.CenterMHz != 3619.08 {
		t.Errorf("carrier %+v (centre %v), want FR1, n78, 40 MHz, 3619.08 MHz", p.Carrier, p.Carrier.CenterMHz)
	}
	if len(p.Partitions) != 1 {
		t.Fatalf("partitions %+v", p.Partitions)
	}
	pp := p.Partitions[0]
	if pp.Name != "bwp2" || pp.SCSKHz != 30 || pp.StartCRB == nil || *pp.StartCRB != 0 || pp.SizePRB != 51 || pp.Direction != "DL" {
		t.Errorf("partition %+v, want bwp2 at 30 kHz, CRB 0, 51 PRBs, DL", pp)
	}
	want := grid.TDDPattern{PeriodMs: 5, DownlinkSlots: 7, DownlinkSymbols: 6, UplinkSlots: 2, UplinkSymbols: 4}
	if p.TDD == nil || p.TDD.ReferenceSCSKHz != 30 || p.TDD.Pattern1 != want || p.TDD.Pattern2 != nil {
		t.Errorf("tdd %+v, want 30 kHz and %+v", p.TDD, want)
	}
	if s := p.SSB; s == nil || *s != (grid.SSBPlan{SCSKHz: 30, OffsetToPointA: 24, ScsCommonKHz: 30, Bitmap: "10000000", PeriodMs: 20}) {
		t.Errorf("ssb %+v", s)
	}
	for _, skipped := range []string{"sib2 SIB2 (line 24)", "SIB1.cellSelectionInfo (line 4)", "ServingCellConfigCommonSIB.ss-PBCH-BlockPower (line 6)",
		"MIB.systemFrameNumber (line 21)", "ServingCellConfigCommon.physCellId (line 25)"} {
		if !strings.Contains(strings.Join(d.Skipped, "; "), skipped) {
			t.Errorf("Skipped %q does not list %s", d.Skipped, skipped)
		}
	}
	if ia := p.InitialAccess; ia == nil || ia.ControlResourceSetZero != 2 || ia.SearchSpaceZero != 0 || ia.DMRSTypeAPosition != "" ||
		ia.InitialDownlinkBWP == nil || *ia.InitialDownlinkBWP != (grid.InitialBWPPlan{LocationAndBandwidth: ia.InitialDownlinkBWP.LocationAndBandwidth, SubcarrierSpacingKHz: 30}) ||
		*ia.InitialDownlinkBWP.LocationAndBandwidth != 28875 || ia.InitialUplinkBWP != nil {
		t.Errorf("initialAccess %+v, want controlResourceSetZero 2, searchSpaceZero 0, pos2 and the initial downlink BWP at RIV 28875, 30 kHz", ia)
	}
	if r := grid.Compute(p); r.InitialAccess == nil || r.InitialAccess.CORESET0.StartCRB != 10 || r.InitialAccess.CORESET0.NRB != 24 {
		t.Errorf("CORESET#0 of the logged cell is not CRBs 10 to 33: %+v", r.InitialAccess)
	}
	var errs []grid.Finding
	for _, f := range grid.Compute(p).Findings {
		if f.Severity == grid.Error {
			errs = append(errs, f)
		}
	}
	if len(errs) != 1 || errs[0].Code != grid.CodeSyncRaster || errs[0].Field != "ssb.offsetToPointA" ||
		!strings.Contains(errs[0].Message, "3607.920 MHz") || !strings.Contains(errs[0].Message, "7921 (3607.680 MHz) and 7922 (3609.120 MHz)") {
		t.Errorf("the logged cell's errors are %v, want one: SS_REF 3607.920 MHz off the synchronization raster, between GSCNs 7921 and 7922", errs)
	}
}

func TestDecodeRefuses(t *testing.T) {
	const base = `f FrequencyInfoDL ::= { scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }
`
	cases := []struct {
		name, text, want string
		line, col        int
	}{
		{"syntax", base + "t TDD-UL-DL-ConfigCommon ::= { referenceSubcarrierSpacing kHz30 pattern1 {} }", "expected ',' or '}'", 2, 65},
		{"symbols out of range", base + "t TDD-UL-DL-ConfigCommon ::= { referenceSubcarrierSpacing kHz30,\n pattern1 { dl-UL-TransmissionPeriodicity ms5, nrofDownlinkSlots 7, nrofDownlinkSymbols 14, nrofUplinkSlots 2, nrofUplinkSymbols 4 } }",
			"pattern1.nrofDownlinkSymbols is 14; pattern1.nrofDownlinkSymbols must be an INTEGER from 0 to 13", 3, 89},
		{"unknown enumeration", base + "t TDD-UL-DL-ConfigCommon ::= { referenceSubcarrierSpacing kHz45, pattern1 {} }", "kHz45 is not a SubcarrierSpacing", 2, 59},
		{"period", "s ServingCellConfigCommonSIB ::= { ssb-PeriodicityServingCell ms7 }\n" + base, "ms7 is not a value; use ms5, ms10, ms20, ms40, ms80, ms160", 1, 63},
		{"carrier size", "f FrequencyInfoDL ::= { scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 276 } } }", "carrierBandwidth is 276", 1, 114},
		{"bwp-Id", base + "b BWP-Uplink ::= { bwp-Id 5, bwp-Common { genericParameters { locationAndBandwidth 0, subcarrierSpacing kHz30 } } }", "BWP-Uplink.bwp-Id is 5", 2, 27},
		{"bwp-Id twice", base + "a BWP-Uplink ::= { bwp-Id 1, bwp-Common { genericParameters { locationAndBandwidth 0, subcarrierSpacing kHz30 } } }\nb BWP-Uplink ::= { bwp-Id 1, bwp-Common { genericParameters { locationAndBandwidth 30, subcarrierSpacing kHz30 } } }", "bwp-Id 1 of b is also the bwp-Id of a", 3, 27},
		{"TDD copies differ", base + "t TDD-UL-DL-ConfigCommon ::= { referenceSubcarrierSpacing kHz30, pattern1 { dl-UL-TransmissionPeriodicity ms5, nrofDownlinkSlots 7, nrofDownlinkSymbols 6, nrofUplinkSlots 2, nrofUplinkSymbols 4 } }\ns ServingCellConfigCommonSIB ::= { tdd-UL-DL-ConfigurationCommon { referenceSubcarrierSpacing kHz15, pattern1 {} } }", "differs from", 2, 30},
		{"no carriers", "m MIB ::= { ssb-SubcarrierOffset 3 }", "no scs-SpecificCarrierList", 0, 0},
		{"misplaced note", base + "b BWP-Uplink ::= { bwp-Id 1, bwp-Common { genericParameters {\n -- gridloom name: \"x\"\n locationAndBandwidth 0, subcarrierSpacing kHz30 } } }", "A gridloom note stands at the top", 3, 2},
		{"unknown note", "-- gridloom colour: \"red\"\n" + base, `"colour" is not a gridloom note key`, 1, 1},
		{"band out of range", "f FrequencyInfoDL ::= { frequencyBandList { 1025 }, scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }",
			"freqBandIndicatorNR is 1025; freqBandIndicatorNR must be an INTEGER from 1 to 1024", 1, 45},
		{"band list form", "f FrequencyInfoDL ::= { frequencyBandList 78, scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }",
			"FrequencyInfoDL.frequencyBandList must be a SEQUENCE OF 1 to 8 bands", 1, 43},
		{"bands differ", "s ServingCellConfigCommonSIB ::= { downlinkConfigCommon { frequencyInfoDL { frequencyBandList { { freqBandIndicatorNR 77 } } } } }\n" +
			"f FrequencyInfoDL ::= { frequencyBandList { 78 }, scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }",
			"FrequencyInfoDL.frequencyBandList starts with band n78, but the frequencyBandList at line 1", 2, 43},
	}
	for _, c := range cases {
		_, err := rrc.Decode([]byte(c.text))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Decode = %v, want an error saying %q", c.name, err, c.want)
			continue
		}
		if c.line == 0 {
			continue
		}
		var e *rrc.Error
		if errors.As(err, &e) {
			if e.Pos.Line != c.line || e.Pos.Col != c.col {
				t.Errorf("%s: error at %v, want line %d, column %d", c.name, e.Pos, c.line, c.col)
			}
		} else if !strings.Contains(err.Error(), "line ") {
			t.Errorf("%s: %v has no line and column", c.name, err)
		}
	}
}

// A note that contradicts the field it overrides is refused, not obeyed
// silently: the plan leaves offsetToCarrier to gridloom (the note
// "carrier.offsetToCarrier: null"), but the text was edited to say 2.
func TestNotesContradictingFields(t *testing.T) {
	start := 26
	p := grid.Plan{Carrier: grid.CarrierPlan{BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{{Name: "v", SCSKHz: 30, StartCRB: &start, SizePRB: 50}}}
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(text), "-- gridloom carrier.offsetToCarrier: null") {
		t.Fatalf("no note for the chosen offsets in\n%s", text)
	}
	edited := strings.ReplaceAll(string(text), "offsetToCarrier 0,", "offsetToCarrier 2,")
	_, err = rrc.Decode([]byte(edited))
	if err == nil || !strings.Contains(err.Error(), "The gridloom notes contradict scs-SpecificCarrierList (offsetToCarrier)") {
		t.Errorf("Decode of a contradicted note = %v, want a refusal", err)
	}
	// Without the note the edit is the plan.
	d, err := rrc.Decode([]byte(strings.ReplaceAll(edited, "-- gridloom carrier.offsetToCarrier: null\n", "")))
	if err != nil || d.Plan.Carrier.OffsetToCarrier[30] != 2 {
		t.Errorf("Decode without the note = %+v, %v; want offsetToCarrier 2", d.Plan.Carrier, err)
	}
}

// absoluteFrequencyPointA edited against a carrier.arfcn note is refused.
func TestPointAAgainstNote(t *testing.T) {
	// port: NR-ARFCN 660000 = 3000 MHz + 15 kHz·60000 = 3900 MHz; 273 RBs of
	// 30 kHz from offset 0 centred on it put point A 273·12·30 kHz / 2 =
	// 49.14 MHz lower, at 3850.86 MHz = NR-ARFCN 600000 + 850.86 MHz / 15 kHz
	// = 656724.
	p, err := demo.Load("port")
	if err != nil {
		t.Fatal(err)
	}
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	edited := strings.Replace(string(text), "absoluteFrequencyPointA 656724", "absoluteFrequencyPointA 656730", 1)
	if edited == string(text) {
		t.Fatalf("absoluteFrequencyPointA 656724 not in\n%s", text)
	}
	if _, err := rrc.Decode([]byte(edited)); err == nil || !strings.Contains(err.Error(), "absoluteFrequencyPointA 656730 does not match") {
		t.Errorf("Decode = %v, want a refusal of absoluteFrequencyPointA", err)
	}
}

// frequencyBandList may list several bands (maxNrofMultiBands, TS 38.331);
// the plan takes the first and says so.
func TestDecodeFirstBand(t *testing.T) {
	const text = `f FrequencyInfoDL ::= { frequencyBandList { 77, 78 }, absoluteFrequencyPointA 640000,
  scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }
b BWP-Downlink ::= { bwp-Id 1, bwp-Common { genericParameters { locationAndBandwidth 13750, subcarrierSpacing kHz30 } } }`
	d, err := rrc.Decode([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	if d.Plan.Carrier.Band != "n77" || !strings.Contains(strings.Join(d.Assumed, " "), "lists 2 bands; the plan takes the first, n77") {
		t.Errorf("band %q, assumed %q; want n77 and a sentence saying so", d.Plan.Carrier.Band, d.Assumed)
	}
}

// In FR1 with subCarrierSpacingCommon 30 kHz, k_SSB runs to 23 and the
// MIB's ssb-SubcarrierOffset holds its 4 low bits only. campus has k_SSB
// 16 (TestGSCNBlockByHand): without gridloom's notes its text says
// ssb-SubcarrierOffset 0, and absoluteFrequencySSB 649632 (SS_REF
// 3744.48 MHz) is what restores the fifth bit: with k_SSB 0 SS_REF would be
// 16·15 kHz = 240 kHz lower, NR-ARFCN 649632 − 16 = 649616.
func TestFifthBitOfKSSB(t *testing.T) {
	p, err := demo.Load("campus")
	if err != nil {
		t.Fatal(err)
	}
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	var bare []string
	for _, l := range strings.Split(string(text), "\n") {
		if !strings.HasPrefix(strings.TrimSpace(l), "-- gridloom ") {
			bare = append(bare, l)
		}
	}
	d, err := rrc.Decode([]byte(strings.Join(bare, "\n")))
	if err != nil {
		t.Fatal(err)
	}
	if s := d.Plan.SSB; s == nil || s.KSSB != 16 || s.OffsetToPointA != 56 || s.ScsCommonKHz != 30 || s.GSCN != nil {
		t.Errorf("campus without notes read back the block as %+v, want offsetToPointA 56, k_SSB 16, 30 kHz common", s)
	}
	if r := grid.Compute(d.Plan); r.SSB == nil || r.SSB.GSCN != 8016 || !r.SSB.OnSyncRaster {
		t.Errorf("the block read back is not on GSCN 8016: %+v", r.SSB)
	}
	// absoluteFrequencySSB of the block with k_SSB 0 keeps k_SSB 0.
	low := strings.Replace(strings.Join(bare, "\n"), "absoluteFrequencySSB 649632", "absoluteFrequencySSB 649616", 1)
	if d, err := rrc.Decode([]byte(low)); err != nil || d.Plan.SSB == nil || d.Plan.SSB.KSSB != 0 {
		t.Errorf("with absoluteFrequencySSB 649616: %+v, %v; want k_SSB 0", d.Plan.SSB, err)
	}
}
