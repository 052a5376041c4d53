package timing

import (
	"fmt"
	"math"
)

// Capability is the UE processing capability of TS 38.214 5.3 and 6.4
// (processingType2Enabled selects capability 2 where the UE supports it).
type Capability uint8

// Processing capabilities.
const (
	Cap1 Capability = iota + 1
	Cap2
)

func (c Capability) String() string {
	switch c {
	case Cap1:
		return "capability 1"
	case Cap2:
		return "capability 2"
	}
	return fmt.Sprintf("capability %d", uint8(c))
}

// DMRS is the PDSCH DM-RS case that selects the column of Table 5.3-1.
type DMRS uint8

// DM-RS cases of TS 38.214 Table 5.3-1.
const (
	// DMRSPos0: dmrs-AdditionalPosition = pos0 in every configured
	// DMRS-DownlinkConfig (front-loaded DM-RS only).
	DMRSPos0 DMRS = iota
	// DMRSAdditional: an additional DM-RS is configured, or the parameter
	// is not configured at all (its default is pos2).
	DMRSAdditional
	// DMRSAdditionalL1At12: as DMRSAdditional with the additional DM-RS at
	// l1 = 12 (TS 38.211 Table 7.4.1.1.2-3); only μ = 0 differs: N1,0 = 14.
	DMRSAdditionalL1At12
)

// notDefined marks a cell that the Release does not define.
const notDefined = -1

// Table5_3_1 is TS 38.214 Table 5.3-1 (Release 17), PDSCH
// processing time N1 in symbols for capability 1, indexed by μ. Columns:
// pos0 (front-loaded DM-RS only), and additional DM-RS (≠ pos0 or not
// configured), whose μ = 0 cell is N1,0 = 13, or 14 when l1 = 12.
// The rows μ = 5 and 6 (480 and 960 kHz, FR2-2) were added by the Rel-17
// extension to 52.6–71 GHz; μ = 4 (240 kHz) carries no data and has no row.
var Table5_3_1 = [MaxMu + 1][2]float64{
	0: {8, 13}, // N1,0 = 13; 14 if l1 = 12
	1: {10, 13},
	2: {17, 20},
	3: {20, 24},
	4: {notDefined, notDefined},
	5: {80, 96},
	6: {160, 192},
}

// Table5_3_2 is TS 38.214 Table 5.3-2 (Release 17), PDSCH
// processing time N1 in symbols for capability 2, pos0 only; μ = 2 is
// "9 for frequency range 1". No row for μ ≥ 3: capability 2 is FR1 only.
var Table5_3_2 = [MaxMu + 1]float64{
	0: 3, 1: 4.5, 2: 9, 3: notDefined, 4: notDefined, 5: notDefined, 6: notDefined,
}

// Table6_4_1 is TS 38.214 Table 6.4-1 (Release 17), PUSCH
// preparation time N2 in symbols for capability 1; μ = 5 and 6 from the
// Rel-17 FR2-2 extension, no row for μ = 4.
var Table6_4_1 = [MaxMu + 1]float64{
	0: 10, 1: 12, 2: 23, 3: 36, 4: notDefined, 5: 144, 6: 288,
}

// Table6_4_2 is TS 38.214 Table 6.4-2 (Release 17), PUSCH
// preparation time N2 in symbols for capability 2; μ = 2 is "11 for
// frequency range 1"; no row for μ ≥ 3.
var Table6_4_2 = [MaxMu + 1]float64{
	0: 5, 1: 5.5, 2: 11, 3: notDefined, 4: notDefined, 5: notDefined, 6: notDefined,
}

// HalfSymbols counts half symbols, so that N1 = 4.5 and N2 = 5.5 of
// capability 2 stay exact integers.
type HalfSymbols int

// Tc returns h half symbols of (2048 + 144)·κ·2^−μ Tc each, the unit of
// T_proc (TS 38.214 5.3, 6.4). Exact for every μ ≤ 6.
func (h HalfSymbols) Tc(mu int) Tc { return Tc(h) * Tc((2048+144)*Kappa) >> (mu + 1) }

func half(v float64) HalfSymbols { return HalfSymbols(math.Round(2 * v)) }

// N1 returns the PDSCH processing time of TS 38.214 Table 5.3-1 or 5.3-2,
// or an error naming the rows the Release defines.
func N1(mu int, c Capability, d DMRS) (HalfSymbols, error) {
	if err := checkMu("The numerology for N1", mu); err != nil {
		return 0, err
	}
	var v float64
	switch c {
	case Cap1:
		col := 0
		if d != DMRSPos0 {
			col = 1
		}
		v = Table5_3_1[mu][col]
		if mu == 0 && d == DMRSAdditionalL1At12 {
			v = 14
		}
	case Cap2:
		if d != DMRSPos0 {
			return 0, fmt.Errorf("N1 for capability 2 is defined only with dmrs-AdditionalPosition = pos0 (TS 38.214 Table 5.3-2); an additional DM-RS was given.")
		}
		v = Table5_3_2[mu]
	default:
		return 0, fmt.Errorf("The processing capability must be 1 or 2; got %d.", uint8(c))
	}
	if v == notDefined {
		return 0, fmt.Errorf("TS 38.214 Release 17 defines no N1 for %v at μ = %d: capability 1 has μ 0–3, 5 and 6, capability 2 μ 0–2 (μ 2 in FR1 only).", c, mu)
	}
	return half(v), nil
}

// N2 returns the PUSCH preparation time of TS 38.214 Table 6.4-1 or 6.4-2.
func N2(mu int, c Capability) (HalfSymbols, error) {
	if err := checkMu("The numerology for N2", mu); err != nil {
		return 0, err
	}
	var v float64
	switch c {
	case Cap1:
		v = Table6_4_1[mu]
	case Cap2:
		v = Table6_4_2[mu]
	default:
		return 0, fmt.Errorf("The processing capability must be 1 or 2; got %d.", uint8(c))
	}
	if v == notDefined {
		return 0, fmt.Errorf("TS 38.214 Release 17 defines no N2 for %v at μ = %d: capability 1 has μ 0–3, 5 and 6, capability 2 μ 0–2 (μ 2 in FR1 only).", c, mu)
	}
	return half(v), nil
}

// Adders are the terms of T_proc that a carrier plan does not determine.
// The zero value is the assumption this package makes unless told: d1,1 = 0
// (PDSCH mapping type A ending at symbol 7 or later, or type B of 7 or more
// symbols), d2 = 0 (no priority overlap), T_ext = 0 (no shared-spectrum
// access), T_switch = 0 (no uplink switching gap), d2,2 = 0 (the DCI does
// not switch the BWP). D21 is d2,1 plus one: the zero value means d2,1 = 1,
// the first PUSCH symbol carries data as well as DM-RS, the more
// conservative case; set FirstPUSCHSymbolDMRSOnly for d2,1 = 0.
type Adders struct {
	D11                      int // d1,1 in symbols (TS 38.214 5.3)
	D2                       int // d2 in symbols, as reported by the UE
	FirstPUSCHSymbolDMRSOnly bool
	Ext                      Tc // T_ext
	Switch                   Tc // T_switch (TS 38.214 6.1.6)
	D22                      Tc // d2,2: the BWP switch time of TS 38.133 when the DCI switches BWP
}

// TProc1 is the PDSCH processing time of TS 38.214 5.3,
// T_proc,1 = (N1 + d1,1 + d2)(2048 + 144)·κ·2^−μ·Tc + T_ext: the least time
// from the end of a PDSCH to the start of the uplink symbol that carries its
// HARQ-ACK. μ is the one of (μ_PDCCH, μ_PDSCH, μ_UL) giving the largest value.
func TProc1(mu int, c Capability, d DMRS, a Adders) (Tc, error) {
	n1, err := N1(mu, c, d)
	if err != nil {
		return 0, err
	}
	return (n1 + HalfSymbols(2*(a.D11+a.D2))).Tc(mu) + a.Ext, nil
}

// TProc2 is the PUSCH preparation time of TS 38.214 6.4,
// T_proc,2 = max((N2 + d2,1 + d2)(2048 + 144)·κ·2^−μ·Tc + T_ext + T_switch, d2,2):
// the least time from the end of the PDCCH with the uplink grant to the
// start of the PUSCH.
func TProc2(mu int, c Capability, a Adders) (Tc, error) {
	n2, err := N2(mu, c)
	if err != nil {
		return 0, err
	}
	d21 := 1
	if a.FirstPUSCHSymbolDMRSOnly {
		d21 = 0
	}
	t := (n2 + HalfSymbols(2*(d21+a.D2))).Tc(mu) + a.Ext + a.Switch
	return max(t, a.D22), nil
}
