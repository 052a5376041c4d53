package rrc_test

import (
	"testing"

	"gridloom/grid"
	"gridloom/grid/asn1v"
	"gridloom/grid/demo"
	"gridloom/grid/rrc"
)

// written holds the values of one plan's document by type.
func written(t *testing.T, p grid.Plan) map[string]*asn1v.Value {
	t.Helper()
	doc, err := rrc.Document(p)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]*asn1v.Value{}
	for _, a := range doc.Assignments {
		out[a.Type] = a.Value
	}
	return out
}

// path follows field names from v; nil when one is missing.
func path(v *asn1v.Value, names ...string) *asn1v.Value {
	for _, n := range names {
		if v == nil {
			return nil
		}
		v = v.Get(n)
	}
	return v
}

func wantInt(t *testing.T, plan, field string, v *asn1v.Value, want int64) {
	t.Helper()
	if v == nil || v.Kind != asn1v.Integer || v.Int != want {
		t.Errorf("%s: %s = %+v, want %d", plan, field, v, want)
	}
}

// absoluteFrequencyPointA and absoluteFrequencySSB worked by hand, with
// NR-ARFCN = f / 5 kHz below 3 GHz, 600000 + (f − 3000 MHz) / 15 kHz up to
// 24.25 GHz and 2016667 + (f − 24250.08 MHz) / 60 kHz above (TS 38.104
// 5.4.2.1), SS_REF = subcarrier 0 of RB 10 of the block (TS 38.331
// FrequencyInfoDL) and the synchronization raster of TS 38.101-1/-2
// 5.4.3.1.
//
// tdd-3ms-low-band (names_test.go): 20 MHz at 2600 MHz, one 30 kHz carrier
// of 51 RBs, 15 kHz blocks with offsetToPointA 3 and k_SSB 6 (15 kHz
// common RBs, so k_SSB is at most 11, TS 38.211 7.4.3.1):
//
//	point A = 2600 MHz − 51·12·30 kHz / 2 = 2600 − 9.18 = 2590.82 MHz → 518164
//	block subcarrier 0 = point A + 3·12·15 kHz + 6·15 kHz = + 630 kHz
//	SS_REF = + 630 kHz + 120·15 kHz = point A + 2.43 MHz = 2593.25 MHz → 518650
//	on the raster: 2593.25 MHz = 2161·1200 kHz + 1·50 kHz (GSCN 3·2161 − 1 = 6482)
//
// fr2-common-60: FR2-1, 100 MHz at NR-ARFCN 2079167, 60 kHz carrier of
// 132 RBs, 240 kHz blocks, offsetToPointA 49 and k_SSB 8 (60 kHz common):
//
//	centre = 24250.08 MHz + 60 kHz·(2079167 − 2016667) = 28000.08 MHz
//	point A = 28000.08 − 132·12·60 kHz / 2 = 28000.08 − 47.52 = 27952.56 MHz → 2078375
//	block subcarrier 0 = point A + 49·12·60 kHz + 8·60 kHz = + 35.76 MHz
//	SS_REF = + 35.76 MHz + 120·240 kHz = point A + 64.56 MHz = 28017.12 MHz → 2079451
//	on the raster: 24250.08 MHz + 218·17.28 MHz, GSCN 22256 + 218 = 22474,
//	even as n257 at 240 kHz wants (TS 38.101-2 Table 5.4.3.3-1)
func TestAbsoluteFrequenciesByHand(t *testing.T) {
	for name, want := range map[string]struct{ pointA, ssb int64 }{
		"tdd-3ms-low-band": {518164, 518650},
		"fr2-common-60":    {2078375, 2079451},
	} {
		v := written(t, extraPlans()[name])
		freq := path(v["ServingCellConfigCommon"], "downlinkConfigCommon", "frequencyInfoDL")
		if freq == nil {
			t.Fatalf("%s: no ServingCellConfigCommon.downlinkConfigCommon.frequencyInfoDL written", name)
		}
		wantInt(t, name, "absoluteFrequencyPointA", freq.Get("absoluteFrequencyPointA"), want.pointA)
		wantInt(t, name, "absoluteFrequencySSB", freq.Get("absoluteFrequencySSB"), want.ssb)
		// Neither plan names a band: frequencyBandList is left out, not
		// guessed from the bands the channel lies in.
		if freq.Get("frequencyBandList") != nil {
			t.Errorf("%s: frequencyBandList written for a plan without carrier.band", name)
		}
	}
}

// The campus demo places its block by ssb.gscn and leaves offsetToPointA
// and kSsb 0; the text must carry the block where Compute puts it. By
// hand: 40 MHz at 3750 MHz, a 15 kHz carrier of 216 RBs from point A and
// 30 kHz blocks, so subCarrierSpacingCommon is 30 kHz (the block's
// spacing, the default) and offsetToPointA counts 15 kHz RBs in pairs:
//
//	point A = 3750 − 216·12·15 kHz / 2 = 3750 − 19.44 = 3730.56 MHz → 648704
//	GSCN 8016: SS_REF = 3000 MHz + (8016 − 7499)·1.44 MHz = 3744.48 MHz → 649632
//	block subcarrier 0 = 3744.48 − 120·30 kHz − 3730.56 = 10.32 MHz above point A
//	offsetToPointA = 2·⌊10.32 / 0.36⌋ = 56 (10.08 MHz); k_SSB = 0.24 MHz / 15 kHz = 16
//	MIB: ssb-SubcarrierOffset = 16 mod 16 = 0, subCarrierSpacingCommon scs30or120
//	band n78: freqBandIndicatorNR 78
func TestGSCNBlockByHand(t *testing.T) {
	p, err := demo.Load("campus")
	if err != nil {
		t.Fatal(err)
	}
	if p.SSB == nil || p.SSB.GSCN == nil || p.SSB.OffsetToPointA != 0 || p.SSB.KSSB != 0 {
		t.Fatalf("campus no longer places its block by GSCN alone: %+v", p.SSB)
	}
	v := written(t, p)
	wantInt(t, "campus", "MIB.ssb-SubcarrierOffset", path(v["MIB"], "ssb-SubcarrierOffset"), 0)
	if c := path(v["MIB"], "subCarrierSpacingCommon"); c == nil || c.Text != "scs30or120" {
		t.Errorf("campus: subCarrierSpacingCommon = %+v, want scs30or120", c)
	}
	sib := path(v["ServingCellConfigCommonSIB"], "downlinkConfigCommon", "frequencyInfoDL")
	wantInt(t, "campus", "offsetToPointA", path(sib, "offsetToPointA"), 56)
	if l := path(sib, "frequencyBandList"); l == nil || len(l.Elems) != 1 {
		t.Errorf("campus: FrequencyInfoDL-SIB.frequencyBandList = %+v, want one NR-MultiBandInfo", l)
	} else {
		wantInt(t, "campus", "FrequencyInfoDL-SIB freqBandIndicatorNR", l.Elems[0].Get("freqBandIndicatorNR"), 78)
	}
	freq := path(v["ServingCellConfigCommon"], "downlinkConfigCommon", "frequencyInfoDL")
	wantInt(t, "campus", "absoluteFrequencyPointA", path(freq, "absoluteFrequencyPointA"), 648704)
	wantInt(t, "campus", "absoluteFrequencySSB", path(freq, "absoluteFrequencySSB"), 649632)
	if l := path(freq, "frequencyBandList"); l == nil || len(l.Elems) != 1 {
		t.Errorf("campus: FrequencyInfoDL.frequencyBandList = %+v, want one band", l)
	} else {
		wantInt(t, "campus", "FrequencyInfoDL frequencyBandList", l.Elems[0], 78)
	}
}
