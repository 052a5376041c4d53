package timing

import "fmt"

// SpeedOfLight is c in m/s, for the range formulas.
const SpeedOfLight = 299792458.0

// Coexistence selects a row of TS 38.133 Table 7.1.2-2.
type Coexistence uint8

// Rows of TS 38.133 Table 7.1.2-2 (Release 17), in the table's order.
const (
	// FR1NoCoexistence: an FR1 FDD or TDD band without LTE-NR
	// coexistence; also the default when n-TimingAdvanceOffset is absent.
	FR1NoCoexistence Coexistence = iota
	// FR1FDDWithLTE: an FR1 FDD band with LTE-NR coexistence.
	FR1FDDWithLTE
	// FR1TDDWithLTE: an FR1 TDD band with LTE-NR coexistence.
	FR1TDDWithLTE
	// FR2: FR2 (FR2-1 and FR2-2 alike).
	FR2
)

func (c Coexistence) String() string {
	switch c {
	case FR1NoCoexistence:
		return "FR1 FDD or TDD band without LTE-NR coexistence"
	case FR1FDDWithLTE:
		return "FR1 FDD band with LTE-NR coexistence"
	case FR1TDDWithLTE:
		return "FR1 TDD band with LTE-NR coexistence"
	case FR2:
		return "FR2"
	}
	return fmt.Sprintf("case %d", uint8(c))
}

// Table7_1_2_2 is TS 38.133 Table 7.1.2-2 (Release 17), "The value of
// N_TA,offset", in Tc, indexed by Coexistence. Note 1 of the table: the UE
// takes N_TA,offset from n-TimingAdvanceOffset, and without it uses 25600
// in FR1. The values are from memory and agree with srsRAN_Project's copy
// (testdata/reference/timing/srsran-n-ta-offset.tsv); Table 7.1.2-3 was not at hand and is
// not carried.
var Table7_1_2_2 = [...]Tc{
	FR1NoCoexistence: 25600,
	FR1FDDWithLTE:    0,
	FR1TDDWithLTE:    39936,
	FR2:              13792,
}

// NTAOffset returns N_TA,offset for a row of Table 7.1.2-2.
func NTAOffset(c Coexistence) (Tc, error) {
	if int(c) >= len(Table7_1_2_2) {
		return 0, fmt.Errorf("The coexistence case must be one of the four rows of TS 38.133 Table 7.1.2-2 (0–3); got %d.", uint8(c))
	}
	return Table7_1_2_2[c], nil
}

// GuardTc is the length of n guard symbols at μ that do not include the
// first symbol of a half subframe: n·(2048 + 144)·κ·2^−μ Tc. A guard that
// holds a half subframe's first symbol is 16κ longer; use GuardOfPattern to
// measure the guard a pattern really has.
func GuardTc(mu, n int) Tc { return Tc(n) * NominalSymbolTc(mu) }

// GuardOfPattern returns the longest run of flexible symbols between a
// downlink and an uplink symbol in p (cyclically), with the exact symbol
// lengths of the lattice, and its number of symbols.
func GuardOfPattern(p Pattern) (Tc, int, error) {
	if err := p.Check(); err != nil {
		return 0, 0, err
	}
	if p.FDD() {
		return 0, 0, fmt.Errorf("An FDD lattice has no guard period.")
	}
	n := len(p.Dir)
	var best Tc
	bestN := 0
	for k := 0; k < n; k++ {
		if p.Dir[k] != 'D' || p.Dir[(k+1)%n] != 'F' {
			continue
		}
		j := k + 1
		var t Tc
		for p.Dir[j%n] == 'F' && j < k+n {
			_, l := SymbolStart(p.Mu, j)
			t += l
			j++
		}
		if p.Dir[j%n] == 'U' && t > best {
			best, bestN = t, j-k-1
		}
	}
	if bestN == 0 {
		return 0, 0, fmt.Errorf("The pattern has no flexible symbols between a downlink and an uplink symbol.")
	}
	return best, bestN, nil
}

// Table4_3_2_3 is TS 38.211 Table 4.3.2-3 (Release 17), the transition
// times N_Tx-Rx and N_Rx-Tx in Tc, the same both ways: index 0 is FR1,
// index 1 FR2. A UE that is not full duplex does not transmit earlier than
// N_Rx-Tx·Tc after the end of the last downlink symbol it received (4.3.2),
// so N_Rx-Tx is the switching time MaxCellRadius must leave for it.
var Table4_3_2_3 = [2]Tc{25600, 13792}

// RxTxTransition returns N_Rx-Tx·Tc of Table 4.3.2-3 for FR1 or FR2.
func RxTxTransition(fr2 bool) Tc {
	if fr2 {
		return Table4_3_2_3[1]
	}
	return Table4_3_2_3[0]
}

// MaxCellRadius is the largest distance from the gNB at which a UE can still
// finish receiving the last downlink symbol before it must start sending the
// first uplink symbol:
//
//	r = c·(T_GP − N_TA,offset·Tc − T_switch) / 2
//
// Derivation: the UE starts uplink frame i (N_TA + N_TA,offset)·Tc before
// it receives downlink frame i (TS 38.211 4.3.1), with N_TA the round trip
// 2r/c (TS 38.213 4.2). The last downlink symbol reaches it r/c late; its
// first uplink symbol must leave 2r/c + N_TA,offset·Tc early; both within
// the guard, with the switching time T_switch between them: for a UE that
// is not full duplex, N_Rx-Tx·Tc of TS 38.211 Table 4.3.2-3
// (RxTxTransition); pass 0 to see the guard's bound from propagation
// alone, as range estimates often do (common practice). The result is in
// metres, zero when the guard is too short.
func MaxCellRadius(guard, ntaOffset, switching Tc) float64 {
	t := guard - ntaOffset - switching
	if t <= 0 {
		return 0
	}
	return SpeedOfLight * t.Seconds() / 2
}

// TA limits of TS 38.213 4.2 and TS 38.321 6.1.3.4.
const (
	MaxRARTimingAdvance = 3846 // T_A in the random access response, 0…3846 (12 bits)
	MaxMACTimingAdvance = 63   // T_A in the MAC CE, 0…63, applied as T_A − 31
)

// NTAFromRAR is N_TA = T_A·16·64/2^μ Tc for a T_A of the random access
// response (TS 38.213 4.2), μ being the subcarrier spacing of the first
// uplink transmission after it.
func NTAFromRAR(mu, ta int) (Tc, error) {
	if err := checkMu("The numerology for the timing advance", mu); err != nil {
		return 0, err
	}
	if ta < 0 || ta > MaxRARTimingAdvance {
		return 0, fmt.Errorf("The random access response's timing advance T_A must be 0 to %d; got %d.", MaxRARTimingAdvance, ta)
	}
	return Tc(ta*16*Kappa) >> mu, nil
}

// TimingAdvanceRange returns the largest N_TA the random access response can
// set at μ and the cell radius that round trip covers, c·N_TA·Tc/2 in
// metres. Later MAC CE commands move N_TA by (T_A − 31)·16·64/2^μ and are
// not bounded here.
func TimingAdvanceRange(mu int) (Tc, float64, error) {
	n, err := NTAFromRAR(mu, MaxRARTimingAdvance)
	if err != nil {
		return 0, 0, err
	}
	return n, SpeedOfLight * n.Seconds() / 2, nil
}
