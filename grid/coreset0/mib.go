package coreset0

import "fmt"

// PDCCHConfigSIB1 packs the MIB's pdcch-ConfigSIB1 into its 8 bits:
// controlResourceSetZero in the 4 most significant bits, searchSpaceZero in
// the 4 least (TS 38.213 13: "the four most significant bits … the four least
// significant bits"; TS 38.331 MIB and PDCCH-ConfigSIB1).
func PDCCHConfigSIB1(controlResourceSetZero, searchSpaceZero int) (uint8, error) {
	if controlResourceSetZero < 0 || controlResourceSetZero > 15 {
		return 0, fmt.Errorf("controlResourceSetZero %d is out of range; it is 4 bits, 0 to 15.", controlResourceSetZero)
	}
	if searchSpaceZero < 0 || searchSpaceZero > 15 {
		return 0, fmt.Errorf("searchSpaceZero %d is out of range; it is 4 bits, 0 to 15.", searchSpaceZero)
	}
	return uint8(controlResourceSetZero<<4 | searchSpaceZero), nil
}

// SplitPDCCHConfigSIB1 reads controlResourceSetZero and searchSpaceZero back
// from the 8 bits of pdcch-ConfigSIB1.
func SplitPDCCHConfigSIB1(b uint8) (controlResourceSetZero, searchSpaceZero int) {
	return int(b >> 4), int(b & 0x0f)
}

// SubcarrierOffsetBits splits k_SSB into the MIB's 4-bit
// ssb-SubcarrierOffset (its 4 least significant bits) and, in FR1, the PBCH
// payload bit ā_{A+5} that carries its fifth bit (TS 38.212 7.1.1: for
// L_max = 4 or 8, ā_{A+5} is the MSB of k_SSB; TS 38.213 4.1). In FR2 k_SSB
// has 4 bits and ā_{A+5} carries an SS/PBCH index bit instead, so msb is
// always false. k_SSB may be 0 to 31 in FR1 and 0 to 15 in FR2, the values
// above 23 and 11 saying there is no CORESET#0.
func SubcarrierOffsetBits(fr FR, kSSB int) (ssbSubcarrierOffset uint8, msb bool, err error) {
	limit := 31
	if fr == FR2 {
		limit = 15
	} else if fr != FR1 {
		return 0, false, fmt.Errorf("The frequency range %d is not one this package knows; it must be FR1 or FR2.", fr)
	}
	if kSSB < 0 || kSSB > limit {
		return 0, false, fmt.Errorf("k_SSB %d is out of range for %v; it must be 0 to %d.", kSSB, fr, limit)
	}
	return uint8(kSSB & 0x0f), kSSB&0x10 != 0, nil
}

// KSSB rebuilds k_SSB from ssb-SubcarrierOffset and, in FR1, the PBCH bit
// ā_{A+5}: k_SSB = 16·ā_{A+5} + ssb-SubcarrierOffset (FR1), or
// ssb-SubcarrierOffset alone (FR2, where msb is ignored).
func KSSB(fr FR, ssbSubcarrierOffset uint8, msb bool) (int, error) {
	if ssbSubcarrierOffset > 15 {
		return 0, fmt.Errorf("ssb-SubcarrierOffset %d is out of range; it is 4 bits, 0 to 15.", ssbSubcarrierOffset)
	}
	k := int(ssbSubcarrierOffset)
	if fr == FR1 && msb {
		k += 16
	}
	return k, nil
}

// SubCarrierSpacingCommon is the MIB's subCarrierSpacingCommon (TS 38.331):
// two values whose meaning depends on the frequency range.
type SubCarrierSpacingCommon uint8

// The two values of subCarrierSpacingCommon, in ASN.1 order.
const (
	SCS15or60  SubCarrierSpacingCommon = 0 // 15 kHz in FR1, 60 kHz in FR2
	SCS30or120 SubCarrierSpacingCommon = 1 // 30 kHz in FR1, 120 kHz in FR2
)

// KHz returns the spacing the value names in a frequency range.
func (s SubCarrierSpacingCommon) KHz(fr FR) int {
	base := 15
	if fr == FR2 {
		base = 60
	}
	return base << s
}

// String returns the ASN.1 name, "scs15or60" or "scs30or120".
func (s SubCarrierSpacingCommon) String() string {
	if s == SCS30or120 {
		return "scs30or120"
	}
	return "scs15or60"
}

// SubCarrierSpacingCommonFor returns the MIB value for a common spacing, or an
// error naming the two spacings the frequency range allows.
func SubCarrierSpacingCommonFor(fr FR, scsKHz int) (SubCarrierSpacingCommon, error) {
	for _, s := range []SubCarrierSpacingCommon{SCS15or60, SCS30or120} {
		if s.KHz(fr) == scsKHz {
			return s, nil
		}
	}
	return 0, fmt.Errorf("subCarrierSpacingCommon cannot carry %d kHz in %v; it allows %d or %d kHz.", scsKHz, fr, SCS15or60.KHz(fr), SCS30or120.KHz(fr))
}

// DMRSTypeAPosition is the MIB's dmrs-TypeA-Position (TS 38.331): the symbol
// of the first DM-RS of PDSCH mapping type A, which decides how late
// CORESET#0 may end for SIB1's PDSCH to start after it.
type DMRSTypeAPosition uint8

// The two values of dmrs-TypeA-Position, in ASN.1 order.
const (
	Pos2 DMRSTypeAPosition = 0 // l0 = 2
	Pos3 DMRSTypeAPosition = 1 // l0 = 3
)

// Symbol returns l0, the symbol index the value names.
func (d DMRSTypeAPosition) Symbol() int { return 2 + int(d) }

// String returns the ASN.1 name, "pos2" or "pos3".
func (d DMRSTypeAPosition) String() string {
	if d == Pos3 {
		return "pos3"
	}
	return "pos2"
}

// MIB holds the MIB fields initial access reads, decoded (TS 38.331 MIB,
// TS 38.212 7.1.1).
type MIB struct {
	SubCarrierSpacingCommon SubCarrierSpacingCommon
	// KSSB is k_SSB, ssb-SubcarrierOffset with ā_{A+5} in FR1.
	KSSB int
	// DMRSTypeAPosition is dmrs-TypeA-Position.
	DMRSTypeAPosition DMRSTypeAPosition
	// ControlResourceSetZero and SearchSpaceZero are pdcch-ConfigSIB1's two
	// halves.
	ControlResourceSetZero, SearchSpaceZero int
}

// CORESET0 resolves the MIB's CORESET#0 for an SS/PBCH spacing and a band:
// the table SelectTable chooses, read at controlResourceSetZero and k_SSB.
func (m MIB) CORESET0(ssbSCSkHz int, band Band) (Config, error) {
	t, err := SelectTable(ssbSCSkHz, m.SubCarrierSpacingCommon.KHz(band.FR), band)
	if err != nil {
		return Config{}, err
	}
	return Lookup(t, m.ControlResourceSetZero, m.KSSB)
}
