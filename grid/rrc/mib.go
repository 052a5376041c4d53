package rrc

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/coreset0"
)

// MIB holds the values of the MIB (TS 38.331 6.2.2) for one SS/PBCH
// block, decoded: what an engineer chooses, not bits.
type MIB struct {
	// SFN is the system frame number, 0 to 1023. systemFrameNumber carries
	// its 6 most significant bits; the PBCH payload outside the MIB its 4
	// least significant (TS 38.212 7.1.1).
	SFN                     int
	SubCarrierSpacingCommon coreset0.SubCarrierSpacingCommon
	// KSSB is k_SSB: 0 to 31 in FR1, 0 to 15 in FR2. ssb-SubcarrierOffset
	// carries its 4 least significant bits; in FR1 the fifth is PBCH payload
	// bit ā(A+5).
	KSSB                   int
	DMRSTypeAPosition      coreset0.DMRSTypeAPosition
	ControlResourceSetZero int // pdcch-ConfigSIB1, 0 to 15
	SearchSpaceZero        int // pdcch-ConfigSIB1, 0 to 15
	CellBarred             bool
	// IntraFreqReselectionNotAllowed is intraFreqReselection notAllowed.
	IntraFreqReselectionNotAllowed bool
}

// PBCHTiming is what the PBCH payload adds to the MIB for one block:
// TS 38.212 7.1.1's ā(A) … ā(A+7).
type PBCHTiming struct {
	FR coreset0.FR
	// LMax is the number of candidate SS/PBCH blocks in a half frame
	// (TS 38.213 4.1): 4, 8, 10, 20 or 64.
	LMax int
	// SSBIndex is the candidate SS/PBCH block index, 0 to LMax−1.
	SSBIndex int
	// HalfFrame is 1 for a block in the second half of the frame.
	HalfFrame int
}

// BitField is one labelled field of an encoding: Len bits from bit First
// (0 is the first bit sent, the most significant), their values as '0' and
// '1', and the value they say.
type BitField struct {
	Name  string
	First int
	Len   int
	Bits  string
	Value string
}

// MIBBits is the MIB encoded: the 24 bits of BCCH-BCH-Message and the 8
// PBCH payload bits the physical layer adds.
type MIBBits struct {
	Message []BitField // BCCH-BCH-Message, 24 bits
	Payload []BitField // ā(A) … ā(A+7), outside the MIB
}

// Binary returns the 24 bits of BCCH-BCH-Message.
func (m MIBBits) Binary() string {
	var b strings.Builder
	for _, f := range m.Message {
		b.WriteString(f.Bits)
	}
	return b.String()
}

// Hex returns the 24 bits as 6 hexadecimal digits, most significant first.
func (m MIBBits) Hex() string {
	n, _ := strconv.ParseUint(m.Binary(), 2, 32)
	return fmt.Sprintf("%06X", n)
}

// String lays the fields out one per line with their bit positions.
func (m MIBBits) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "BCCH-BCH-Message, X.691 unaligned PER, 24 bits: %s (hex %s)\n", m.Binary(), m.Hex())
	write := func(fields []BitField, prefix string) {
		for _, f := range fields {
			pos := fmt.Sprintf("%s%d", prefix, f.First)
			if f.Len > 1 {
				pos += fmt.Sprintf("-%d", f.First+f.Len-1)
			}
			line := fmt.Sprintf("  %-7s %-40s %-9s %s", pos, f.Name, f.Bits, f.Value)
			b.WriteString(strings.TrimRight(line, " ") + "\n")
		}
	}
	write(m.Message, "")
	b.WriteString("PBCH payload bits outside the MIB (TS 38.212 7.1.1), after the 24:\n")
	write(m.Payload, "A+")
	return b.String()
}

func bitString(v uint, n int) string {
	s := strconv.FormatUint(uint64(v), 2)
	return strings.Repeat("0", n-len(s)) + s
}

func bit(b bool) string {
	if b {
		return "1"
	}
	return "0"
}

// EncodeMIB encodes the MIB as BCCH-BCH-Message by the unaligned PER of
// X.691 and adds the PBCH payload bits of one block. The layout is fixed,
// so every field has a fixed place: BCCH-BCH-Message is a SEQUENCE without
// extension marker or optional components, so it adds no bits; its message
// is a CHOICE of two alternatives without extension marker, one bit (0 for
// mib, X.691 23.6); the MIB's BIT STRING (SIZE (6)) and (SIZE (1)) are their
// bits with no length (X.691 16.9); each ENUMERATED of two values is one bit
// in ASN.1 order (X.691 14); each INTEGER (0..15) is 4 bits, the value less
// the lower bound (X.691 12.2.2). 1 + 6 + 1 + 4 + 1 + 8 + 1 + 1 + 1 = 24.
//
// In FR2, and in FR1 with shared spectrum, bits of the SS/PBCH block index
// go into ā(A+5) … ā(A+7), outside the MIB; the 3 least significant bits
// of the index are carried by the PBCH DM-RS (TS 38.211 7.4.1.4), not by
// bits at all.
func EncodeMIB(m MIB, t PBCHTiming) (MIBBits, error) {
	if m.SFN < 0 || m.SFN > 1023 {
		return MIBBits{}, fmt.Errorf("The SFN is %d; it must be 0 to 1023.", m.SFN)
	}
	if m.SubCarrierSpacingCommon > coreset0.SCS30or120 {
		return MIBBits{}, fmt.Errorf("subCarrierSpacingCommon must be scs15or60 or scs30or120.")
	}
	if m.DMRSTypeAPosition > coreset0.Pos3 {
		return MIBBits{}, fmt.Errorf("dmrs-TypeA-Position must be pos2 or pos3.")
	}
	pdcch, err := coreset0.PDCCHConfigSIB1(m.ControlResourceSetZero, m.SearchSpaceZero)
	if err != nil {
		return MIBBits{}, err
	}
	offset, kMSB, err := coreset0.SubcarrierOffsetBits(t.FR, m.KSSB)
	if err != nil {
		return MIBBits{}, err
	}
	switch t.LMax {
	case 4, 8, 10, 20, 64:
	default:
		return MIBBits{}, fmt.Errorf("L_max is %d; it must be 4, 8, 10, 20 or 64 (TS 38.213 4.1).", t.LMax)
	}
	if t.SSBIndex < 0 || t.SSBIndex >= t.LMax {
		return MIBBits{}, fmt.Errorf("The SS/PBCH block index is %d; with L_max = %d it must be 0 to %d.", t.SSBIndex, t.LMax, t.LMax-1)
	}
	if t.HalfFrame != 0 && t.HalfFrame != 1 {
		return MIBBits{}, fmt.Errorf("The half frame bit is %d; it must be 0 or 1.", t.HalfFrame)
	}
	if t.FR == coreset0.FR2 && t.LMax != 64 {
		return MIBBits{}, fmt.Errorf("In FR2 L_max is 64 (TS 38.213 4.1), not %d.", t.LMax)
	}
	if t.FR == coreset0.FR2 && kMSB {
		return MIBBits{}, fmt.Errorf("k_SSB %d does not fit FR2's 4 bits.", m.KSSB)
	}
	if t.LMax == 64 && m.KSSB > 15 {
		return MIBBits{}, fmt.Errorf("With L_max = 64, ā(A+5) carries an SS/PBCH index bit, so k_SSB must be 0 to 15, not %d.", m.KSSB)
	}

	barred, intra := "notBarred", "allowed"
	if m.CellBarred {
		barred = "barred"
	}
	if m.IntraFreqReselectionNotAllowed {
		intra = "notAllowed"
	}
	sfn := uint(m.SFN)
	fields := []BitField{
		{Name: "message (CHOICE)", Len: 1, Bits: "0", Value: "mib, alternative 0 of 2"},
		{Name: "systemFrameNumber", Len: 6, Bits: bitString(sfn>>4, 6), Value: fmt.Sprintf("SFN %d: its 6 MSBs (%d)", m.SFN, sfn>>4)},
		{Name: "subCarrierSpacingCommon", Len: 1, Bits: bitString(uint(m.SubCarrierSpacingCommon), 1), Value: m.SubCarrierSpacingCommon.String()},
		{Name: "ssb-SubcarrierOffset", Len: 4, Bits: bitString(uint(offset), 4), Value: fmt.Sprintf("%d (k_SSB %d)", offset, m.KSSB)},
		{Name: "dmrs-TypeA-Position", Len: 1, Bits: bitString(uint(m.DMRSTypeAPosition), 1), Value: m.DMRSTypeAPosition.String()},
		{Name: "pdcch-ConfigSIB1.controlResourceSetZero", Len: 4, Bits: bitString(uint(pdcch>>4), 4), Value: strconv.Itoa(m.ControlResourceSetZero)},
		{Name: "pdcch-ConfigSIB1.searchSpaceZero", Len: 4, Bits: bitString(uint(pdcch&15), 4), Value: strconv.Itoa(m.SearchSpaceZero)},
		{Name: "cellBarred", Len: 1, Bits: bit(!m.CellBarred), Value: barred},
		{Name: "intraFreqReselection", Len: 1, Bits: bit(m.IntraFreqReselectionNotAllowed), Value: intra},
		{Name: "spare", Len: 1, Bits: "0", Value: "0"},
	}
	at := 0
	for i := range fields {
		fields[i].First = at
		at += fields[i].Len
	}

	// TS 38.212 7.1.1: ā(A) … ā(A+3) are the 4th, 3rd, 2nd and 1st LSB of
	// the SFN, ā(A+4) the half frame bit, then by L_max.
	idx := uint(t.SSBIndex)
	sfnBit := func(k uint, name string) BitField {
		return BitField{Name: name + " LSB of SFN", Len: 1, Bits: bit(sfn>>(k-1)&1 == 1)}
	}
	payload := []BitField{sfnBit(4, "4th"), sfnBit(3, "3rd"), sfnBit(2, "2nd"), sfnBit(1, "1st"),
		{Name: "half frame bit", Len: 1, Bits: strconv.Itoa(t.HalfFrame)}}
	kBit := BitField{Name: "MSB of k_SSB", Len: 1, Bits: bit(kMSB)}
	reserved := BitField{Name: "reserved", Len: 1, Bits: "0"}
	indexBit := func(k uint, name string) BitField {
		return BitField{Name: name + " bit of the SS/PBCH block index", Len: 1, Bits: bit(idx>>(k-1)&1 == 1)}
	}
	switch t.LMax {
	case 10:
		payload = append(payload, kBit, reserved, BitField{Name: "MSB of the SS/PBCH block index", Len: 1, Bits: bit(idx>>3&1 == 1)})
	case 20:
		payload = append(payload, kBit, indexBit(5, "5th"), indexBit(4, "4th"))
	case 64:
		payload = append(payload, indexBit(6, "6th"), indexBit(5, "5th"), indexBit(4, "4th"))
	default:
		payload = append(payload, kBit, reserved, reserved)
	}
	for i := range payload {
		payload[i].First = i
	}
	return MIBBits{Message: fields, Payload: payload}, nil
}

// MIBForPlan starts a MIB from what a computed plan sets — k_SSB, in FR1
// (without shared spectrum) and FR2-1 subCarrierSpacingCommon from
// ssb.scsCommonKHz, and with
// initialAccess pdcch-ConfigSIB1 and dmrs-TypeA-Position — and returns the
// PBCH timing of its blocks (frequency range and L_max) for block 0, with
// the values as Compute resolved them (a block placed by ssb.gscn, the
// default common spacing, pos2 for an unset dmrsTypeAPosition). The rest
// of the MIB (SFN, cellBarred, intraFreqReselection, subCarrierSpacingCommon
// in FR2-2 and on a shared spectrum FR1 band, where it gives no spacing but
// the QCL relation between SS/PBCH blocks (TS 38.331 MIB, grid.CommonIsSpacing),
// and pdcch-ConfigSIB1 and dmrs-TypeA-Position for a plan
// without initialAccess) is the caller's to choose: the plan does not hold
// it.
func MIBForPlan(r grid.Result) (MIB, PBCHTiming, error) {
	if r.SSB == nil {
		return MIB{}, PBCHTiming{}, fmt.Errorf("The plan places no SS/PBCH blocks, so it has no MIB; give ssb.")
	}
	m := MIB{KSSB: r.SSB.KSSB}
	t := PBCHTiming{FR: coreset0.FR1, LMax: r.SSB.Candidates}
	if r.Channel.Range.FR2() {
		t.FR = coreset0.FR2
	}
	if r.CommonIsSpacing() {
		s, err := coreset0.SubCarrierSpacingCommonFor(t.FR, r.SSB.ScsCommonKHz)
		if err != nil {
			return MIB{}, PBCHTiming{}, err
		}
		m.SubCarrierSpacingCommon = s
	}
	if ia := r.InitialAccess; ia != nil {
		m.ControlResourceSetZero, m.SearchSpaceZero = coreset0.SplitPDCCHConfigSIB1(uint8(ia.MIB.PDCCHConfigSIB1))
		if ia.MIB.DMRSTypeAPosition == coreset0.Pos3.String() {
			m.DMRSTypeAPosition = coreset0.Pos3
		}
	}
	return m, t, nil
}
