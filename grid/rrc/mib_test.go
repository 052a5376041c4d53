package rrc

import (
	"strings"
	"testing"

	"gridloom/grid/coreset0"
)

// A MIB worked by hand from TS 38.331 6.2.2 (field order and sizes) and the
// unaligned PER of X.691, with every bit position written out. The same bit
// positions (0 message, 1-6 systemFrameNumber … 23 spare, then ā(A) …
// ā(A+7)) appear in an independent published layout of the PBCH payload
// (liuyonggang1.github.io/resgrid/nr/pbch_payload).
//
//	SFN 612 = 10 0110 0100 (binary, 10 bits)
//	bit  0      message CHOICE index: mib is alternative 0 of 2  → 0
//	bits 1-6    systemFrameNumber = 612 >> 4 = 38                 → 100110
//	bit  7      subCarrierSpacingCommon scs30or120 (index 1)      → 1
//	bits 8-11   ssb-SubcarrierOffset = k_SSB 21 & 15 = 5          → 0101
//	bit  12     dmrs-TypeA-Position pos2 (index 0)                → 0
//	bits 13-16  controlResourceSetZero 12                         → 1100
//	bits 17-20  searchSpaceZero 0                                 → 0000
//	bit  21     cellBarred notBarred (index 1)                    → 1
//	bit  22     intraFreqReselection allowed (index 0)            → 0
//	bit  23     spare                                             → 0
//
//	0100 1101 | 0101 0110 | 0000 0100 = 4D 56 04 (hex): bits 0-7 are
//	0 100110 1, bits 8-15 are 0101 0 110, bits 16-23 are 0 0000 1 0 0
//
// and the PBCH payload bits (TS 38.212 7.1.1), FR1 with L_max = 8:
//
//	A..A+3  4th, 3rd, 2nd, 1st LSB of SFN 612 (…0100)  → 0 1 0 0
//	A+4     half frame 0                               → 0
//	A+5     MSB of k_SSB 21 = 10101                    → 1
//	A+6,7   reserved                                   → 0 0
func TestEncodeMIBByHand(t *testing.T) {
	m := MIB{SFN: 612, SubCarrierSpacingCommon: coreset0.SCS30or120, KSSB: 21, DMRSTypeAPosition: coreset0.Pos2,
		ControlResourceSetZero: 12, SearchSpaceZero: 0}
	got, err := EncodeMIB(m, PBCHTiming{FR: coreset0.FR1, LMax: 8, SSBIndex: 3})
	if err != nil {
		t.Fatal(err)
	}
	if b := got.Binary(); b != "010011010101011000000100" {
		t.Errorf("bits %s, want 010011010101011000000100", b)
	}
	if h := got.Hex(); h != "4D5604" {
		t.Errorf("hex %s, want 4D5604", h)
	}
	want := []struct {
		name        string
		first, size int
		bits        string
	}{
		{"message (CHOICE)", 0, 1, "0"},
		{"systemFrameNumber", 1, 6, "100110"},
		{"subCarrierSpacingCommon", 7, 1, "1"},
		{"ssb-SubcarrierOffset", 8, 4, "0101"},
		{"dmrs-TypeA-Position", 12, 1, "0"},
		{"pdcch-ConfigSIB1.controlResourceSetZero", 13, 4, "1100"},
		{"pdcch-ConfigSIB1.searchSpaceZero", 17, 4, "0000"},
		{"cellBarred", 21, 1, "1"},
		{"intraFreqReselection", 22, 1, "0"},
		{"spare", 23, 1, "0"},
	}
	if len(got.Message) != len(want) {
		t.Fatalf("%d fields, want %d", len(got.Message), len(want))
	}
	for i, w := range want {
		f := got.Message[i]
		if f.Name != w.name || f.First != w.first || f.Len != w.size || f.Bits != w.bits {
			t.Errorf("field %d = %+v, want %+v", i, f, w)
		}
	}
	var payload strings.Builder
	for _, f := range got.Payload {
		payload.WriteString(f.Bits)
	}
	if payload.String() != "01000100" {
		t.Errorf("PBCH payload bits %s, want 01000100", payload.String())
	}
}

// The same MIB in FR2 with L_max = 64, barred, reselection not allowed,
// pos3 and SS/PBCH block 37 = 100101:
//
//	bit 7   scs15or60 → 0;  bits 8-11  k_SSB 5 → 0101;  bit 12  pos3 → 1
//	bit 21  barred → 0;     bit 22     notAllowed → 1
//	0 100110 0 | 0101 1 110 | 0 0000 0 1 0 = 0100 1100 | 0101 1110 | 0000 0010 = 4C 5E 02
//	A+5..A+7: 6th, 5th, 4th bits of 37 = 1 0 0, so the payload is 0100 0100.
func TestEncodeMIBFR2(t *testing.T) {
	m := MIB{SFN: 612, SubCarrierSpacingCommon: coreset0.SCS15or60, KSSB: 5, DMRSTypeAPosition: coreset0.Pos3,
		ControlResourceSetZero: 12, CellBarred: true, IntraFreqReselectionNotAllowed: true}
	got, err := EncodeMIB(m, PBCHTiming{FR: coreset0.FR2, LMax: 64, SSBIndex: 37})
	if err != nil {
		t.Fatal(err)
	}
	if h := got.Hex(); h != "4C5E02" {
		t.Errorf("hex %s (%s), want 4C5E02", h, got.Binary())
	}
	var payload strings.Builder
	for _, f := range got.Payload {
		payload.WriteString(f.Bits)
	}
	if payload.String() != "01000100" {
		t.Errorf("PBCH payload bits %s, want 01000100", payload.String())
	}
	if !strings.Contains(got.String(), "13-16   pdcch-ConfigSIB1.controlResourceSetZero  1100") {
		t.Errorf("the layout does not label bits 13-16:\n%s", got)
	}
}

func TestEncodeMIBRefuses(t *testing.T) {
	cases := []struct {
		m    MIB
		t    PBCHTiming
		want string
	}{
		{MIB{SFN: 1024}, PBCHTiming{FR: coreset0.FR1, LMax: 8}, "SFN"},
		{MIB{KSSB: 16}, PBCHTiming{FR: coreset0.FR2, LMax: 64}, "k_SSB"},
		{MIB{ControlResourceSetZero: 16}, PBCHTiming{FR: coreset0.FR1, LMax: 8}, "controlResourceSetZero"},
		{MIB{}, PBCHTiming{FR: coreset0.FR1, LMax: 8, SSBIndex: 8}, "index"},
		{MIB{}, PBCHTiming{FR: coreset0.FR1, LMax: 7}, "L_max"},
		{MIB{}, PBCHTiming{FR: coreset0.FR2, LMax: 8}, "L_max is 64"},
	}
	for _, c := range cases {
		if _, err := EncodeMIB(c.m, c.t); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("EncodeMIB(%+v, %+v) = %v, want an error about %s", c.m, c.t, err, c.want)
		}
	}
}
