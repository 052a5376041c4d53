package coreset0

import (
	"strings"
	"testing"
)

func TestPDCCHConfigSIB1(t *testing.T) {
	// TS 38.213 13: controlResourceSetZero is the 4 MSBs, searchSpaceZero the
	// 4 LSBs of pdcch-ConfigSIB1. controlResourceSetZero 12 = 0b1100 and
	// searchSpaceZero 3 = 0b0011 make 0b1100_0011 = 195.
	b, err := PDCCHConfigSIB1(12, 3)
	if err != nil || b != 0b1100_0011 {
		t.Errorf("PDCCHConfigSIB1(12, 3) = %d, %v; want 195", b, err)
	}
	for v := 0; v < 256; v++ {
		c, s := SplitPDCCHConfigSIB1(uint8(v))
		back, err := PDCCHConfigSIB1(c, s)
		if err != nil || int(back) != v || c != v/16 || s != v%16 {
			t.Fatalf("%d splits to %d, %d and packs back to %d, %v", v, c, s, back, err)
		}
	}
	if _, err := PDCCHConfigSIB1(16, 0); err == nil || !strings.Contains(err.Error(), "controlResourceSetZero 16") {
		t.Errorf("PDCCHConfigSIB1(16, 0) error %v", err)
	}
	if _, err := PDCCHConfigSIB1(0, -1); err == nil || !strings.Contains(err.Error(), "searchSpaceZero -1") {
		t.Errorf("PDCCHConfigSIB1(0, -1) error %v", err)
	}
}

func TestSubcarrierOffsetBits(t *testing.T) {
	cases := []struct {
		fr      FR
		kSSB    int
		field   uint8
		msb     bool
		comment string
	}{
		// TS 38.212 7.1.1 (L_max 4 or 8): ā_{A+5} is the MSB of k_SSB;
		// TS 38.331: ssb-SubcarrierOffset holds its 4 LSBs.
		{FR1, 6, 6, false, "FR1 k_SSB 6 = 0b00110"},
		{FR1, 23, 7, true, "FR1 k_SSB 23 = 0b10111: field 0b0111, ā_{A+5} = 1"},
		{FR1, 16, 0, true, "FR1 k_SSB 16 = 0b10000"},
		{FR1, 31, 15, true, "FR1 k_SSB 31: no CORESET#0, still signalled"},
		{FR2, 11, 11, false, "FR2 k_SSB has 4 bits"},
		{FR2, 15, 15, false, "FR2 k_SSB 15: no CORESET#0"},
	}
	for _, c := range cases {
		field, msb, err := SubcarrierOffsetBits(c.fr, c.kSSB)
		if err != nil || field != c.field || msb != c.msb {
			t.Errorf("%s: SubcarrierOffsetBits = %d, %v, %v; want %d, %v", c.comment, field, msb, err, c.field, c.msb)
		}
		if k, err := KSSB(c.fr, field, msb); err != nil || k != c.kSSB {
			t.Errorf("%s: KSSB(%d, %v) = %d, %v", c.comment, field, msb, k, err)
		}
	}
	if _, _, err := SubcarrierOffsetBits(FR2, 16); err == nil || !strings.Contains(err.Error(), "0 to 15") {
		t.Errorf("FR2 k_SSB 16 accepted: %v", err)
	}
	if _, _, err := SubcarrierOffsetBits(FR1, 32); err == nil || !strings.Contains(err.Error(), "0 to 31") {
		t.Errorf("FR1 k_SSB 32 accepted: %v", err)
	}
	// In FR2 ā_{A+5} is an SS/PBCH index bit and does not touch k_SSB.
	if k, _ := KSSB(FR2, 3, true); k != 3 {
		t.Errorf("KSSB(FR2, 3, true) = %d, want 3", k)
	}
	if _, err := KSSB(FR1, 16, false); err == nil {
		t.Error("KSSB accepted a 5-bit ssb-SubcarrierOffset")
	}
}

func TestSubCarrierSpacingCommon(t *testing.T) {
	// TS 38.331 MIB: subCarrierSpacingCommon ENUMERATED {scs15or60, scs30or120}.
	cases := []struct {
		v    SubCarrierSpacingCommon
		fr   FR
		kHz  int
		name string
	}{
		{SCS15or60, FR1, 15, "scs15or60"},
		{SCS30or120, FR1, 30, "scs30or120"},
		{SCS15or60, FR2, 60, "scs15or60"},
		{SCS30or120, FR2, 120, "scs30or120"},
	}
	for _, c := range cases {
		if c.v.KHz(c.fr) != c.kHz || c.v.String() != c.name {
			t.Errorf("%v in %v = %d kHz, want %d", c.v, c.fr, c.v.KHz(c.fr), c.kHz)
		}
		if back, err := SubCarrierSpacingCommonFor(c.fr, c.kHz); err != nil || back != c.v {
			t.Errorf("SubCarrierSpacingCommonFor(%v, %d) = %v, %v", c.fr, c.kHz, back, err)
		}
	}
	if _, err := SubCarrierSpacingCommonFor(FR1, 60); err == nil || !strings.Contains(err.Error(), "15 or 30 kHz") {
		t.Errorf("60 kHz in FR1 accepted: %v", err)
	}
	// TS 38.331 MIB: dmrs-TypeA-Position ENUMERATED {pos2, pos3}.
	if Pos2.Symbol() != 2 || Pos3.Symbol() != 3 || Pos2.String() != "pos2" || Pos3.String() != "pos3" {
		t.Error("dmrs-TypeA-Position values")
	}
}

func TestMIBCORESET0(t *testing.T) {
	// 30 kHz SS/PBCH, scs30or120, controlResourceSetZero 2, a band with a
	// 10 MHz minimum channel bandwidth: TS 38.213 Table 13-4 index 2 —
	// pattern 1, 24 RBs, 2 symbols, offset 2.
	m := MIB{SubCarrierSpacingCommon: SCS30or120, KSSB: 4, ControlResourceSetZero: 2, SearchSpaceZero: 0}
	cfg, err := m.CORESET0(30, Band{FR: FR1, MinChannelBandwidthMHz: 10})
	want := Config{Table: Table13_4, Index: 2, Pattern: 1, NumRBs: 24, NumSymbols: 2, OffsetRBs: 2}
	if err != nil || cfg != want {
		t.Errorf("CORESET0 = %+v, %v; want %+v", cfg, err, want)
	}
	// The same MIB in FR2 with a 120 kHz block reads Table 13-8 index 2.
	cfg, err = m.CORESET0(120, Band{FR: FR2})
	want = Config{Table: Table13_8, Index: 2, Pattern: 1, NumRBs: 48, NumSymbols: 1, OffsetRBs: 14}
	if err != nil || cfg != want {
		t.Errorf("CORESET0 in FR2 = %+v, %v; want %+v", cfg, err, want)
	}
}
