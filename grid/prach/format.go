package prach

import "fmt"

// Time units of TS 38.211 clause 4.1, repeated here because this package
// imports nothing of the project.
const (
	Kappa             = 64                 // κ = Ts/Tc
	TcPerSecond       = 480000 * 4096      // 1 966 080 000
	TcPerSubframe     = TcPerSecond / 1000 // 1 966 080
	TcPerHalfSubframe = TcPerSubframe / 2
)

// Format is a PRACH preamble format of TS 38.211 Tables 6.3.3.1-1 and
// 6.3.3.1-2, or one of the paired formats A1/B1, A2/B2, A3/B3 that the
// configuration tables name.
type Format uint8

// The preamble formats. The zero value is Format0 because the tables use it most.
const (
	Format0 Format = iota
	Format1
	Format2
	Format3
	FormatA1
	FormatA2
	FormatA3
	FormatB1
	FormatB2
	FormatB3
	FormatB4
	FormatC0
	FormatC2
	FormatA1B1
	FormatA2B2
	FormatA3B3
	numFormats
)

var formatNames = [numFormats]string{"0", "1", "2", "3", "A1", "A2", "A3", "B1", "B2", "B3", "B4", "C0", "C2", "A1/B1", "A2/B2", "A3/B3"}

// String returns the format as the spec prints it: "0", "A1", "A1/B1".
func (f Format) String() string {
	if f < numFormats {
		return formatNames[f]
	}
	return fmt.Sprintf("Format(%d)", uint8(f))
}

// ParseFormat reads a format as the spec prints it.
func ParseFormat(s string) (Format, error) {
	for i, n := range formatNames {
		if n == s {
			return Format(i), nil
		}
	}
	return 0, fmt.Errorf("the preamble format %q is not one of 0, 1, 2, 3, A1, A2, A3, B1, B2, B3, B4, C0, C2, A1/B1, A2/B2, A3/B3", s)
}

// Long reports whether f is one of the L_RA = 839 formats 0–3, whose
// subcarrier spacing the format fixes (1.25 or 5 kHz).
func (f Format) Long() bool { return f <= Format3 }

// Pair splits a paired format A1/B1, A2/B2 or A3/B3 into its A and B halves;
// for any other format both halves are f.
func (f Format) Pair() (a, b Format) {
	switch f {
	case FormatA1B1:
		return FormatA1, FormatB1
	case FormatA2B2:
		return FormatA2, FormatB2
	case FormatA3B3:
		return FormatA3, FormatB3
	}
	return f, f
}

// Preamble is one row of TS 38.211 Table 6.3.3.1-1 (long formats) or
// Table 6.3.3.1-2 (short formats).
//
// For the long formats NuKappa and NCPKappa count κ; for the short formats
// they count κ·2^−μ, where Δf^RA = 15·2^μ kHz, exactly as the tables print
// them. Use UsefulTc and CPTc for time.
type Preamble struct {
	Format Format
	LRA    int // sequence length L_RA
	// SCSHz is Δf^RA for the long formats; 0 for the short ones, whose
	// spacing 15·2^μ kHz comes from msg1-SubcarrierSpacing.
	SCSHz    int
	NuKappa  int  // N_u: the sequence part, all repetitions
	NCPKappa int  // N_CP^RA
	Repeats  int  // how many times the sequence of 1/Δf^RA repeats in N_u
	TypeA    bool // restricted set type A supported
	TypeB    bool // restricted set type B supported
}

// preambles is TS 38.211 Table 6.3.3.1-1 (rows 0–3) and Table 6.3.3.1-2
// (L_RA = 139 only), one row per format in the order of the Format
// constants. Rows 0–3 are read from the text of V18.7.0; the short formats'
// N_u and N_CP^RA are pictures in that text, so they are written from memory
// and checked against the srsRAN copy (TestPreamblesAgainstCopy). The text
// marks every short format "-" for restricted sets.
var preambles = [FormatC2 + 1]Preamble{
	// Table 6.3.3.1-1: L_RA = 839, Δf^RA, N_u, N_CP^RA in κ.
	{Format0, 839, 1250, 24576, 3168, 1, true, true},
	{Format1, 839, 1250, 2 * 24576, 21024, 2, true, true},
	{Format2, 839, 1250, 4 * 24576, 4688, 4, true, true},
	{Format3, 839, 5000, 4 * 6144, 3168, 4, true, true},
	// Table 6.3.3.1-2: L_RA = 139, Δf^RA = 15·2^μ kHz, N_u, N_CP^RA in κ·2^−μ.
	{FormatA1, 139, 0, 2 * 2048, 288, 2, false, false},
	{FormatA2, 139, 0, 4 * 2048, 576, 4, false, false},
	{FormatA3, 139, 0, 6 * 2048, 864, 6, false, false},
	{FormatB1, 139, 0, 2 * 2048, 216, 2, false, false},
	{FormatB2, 139, 0, 4 * 2048, 360, 4, false, false},
	{FormatB3, 139, 0, 6 * 2048, 504, 6, false, false},
	{FormatB4, 139, 0, 12 * 2048, 936, 12, false, false},
	{FormatC0, 139, 0, 2048, 1240, 1, false, false},
	{FormatC2, 139, 0, 4 * 2048, 2048, 4, false, false},
}

// PreambleOf returns the row of Table 6.3.3.1-1 or 6.3.3.1-2 for a single
// format. A paired format (A1/B1...) has no row of its own: split it with Pair.
func PreambleOf(f Format) (Preamble, error) {
	if f > FormatC2 {
		return Preamble{}, fmt.Errorf("the preamble format %v has no row of its own in TS 38.211 Tables 6.3.3.1-1/6.3.3.1-2; use the A or the B format of the pair", f)
	}
	return preambles[f], nil
}

// ScsHz returns Δf^RA in Hz for mu (Δf^RA = 15·2^μ kHz); mu is ignored for
// the long formats, whose spacing is fixed.
func (p Preamble) ScsHz(mu int) int {
	if p.Format.Long() {
		return p.SCSHz
	}
	return 15000 << mu
}

// unitTc is the Tc length of the unit the table counts in: κ for the long
// formats, κ·2^−μ for the short ones.
func (p Preamble) unitTc(mu int) (num, den int64) {
	if p.Format.Long() {
		return Kappa, 1
	}
	return Kappa, 1 << mu
}

// UsefulTc is N_u·unit in Tc: the sequence part of the preamble, all repetitions.
func (p Preamble) UsefulTc(mu int) int64 {
	n, d := p.unitTc(mu)
	return int64(p.NuKappa) * n / d
}

// CPTc is N_CP^RA in Tc, before the 16κ that TS 38.211 5.3.2 adds to a
// short preamble crossing 0 or 0.5 ms of a subframe (see Occasion.CPTc).
func (p Preamble) CPTc(mu int) int64 {
	n, d := p.unitTc(mu)
	return int64(p.NCPKappa) * n / d
}

// SequenceTc is one sequence period T_seq = 1/Δf^RA in Tc, the time the
// cyclic-shift (N_CS) range formula needs.
func (p Preamble) SequenceTc(mu int) int64 {
	return p.UsefulTc(mu) / int64(p.Repeats)
}

// RestrictedSet names the restricted-set configuration of RACH-ConfigCommon
// (TS 38.331 restrictedSetConfig).
type RestrictedSet uint8

// The restricted sets of TS 38.211 6.3.3.1.
const (
	Unrestricted RestrictedSet = iota
	RestrictedTypeA
	RestrictedTypeB
)

// String names the set for messages.
func (s RestrictedSet) String() string {
	switch s {
	case Unrestricted:
		return "unrestricted"
	case RestrictedTypeA:
		return "restricted set type A"
	case RestrictedTypeB:
		return "restricted set type B"
	}
	return fmt.Sprintf("RestrictedSet(%d)", uint8(s))
}

const noNCS = -1 // a cell the spec leaves empty

// ncs1250 is TS 38.211 Table 6.3.3.1-5 (N_CS for Δf^RA = 1.25 kHz), read from
// the text of V18.7.0: columns unrestricted, type A, type B; rows
// zeroCorrelationZoneConfig 0–15.
var ncs1250 = [3][16]int{
	{0, 13, 15, 18, 22, 26, 32, 38, 46, 59, 76, 93, 119, 167, 279, 419},
	{15, 18, 22, 26, 32, 38, 46, 55, 68, 82, 100, 128, 158, 202, 237, noNCS},
	{15, 18, 22, 26, 32, 38, 46, 55, 68, 82, 100, 118, 137, noNCS, noNCS, noNCS},
}

// ncs5000 is TS 38.211 Table 6.3.3.1-6 (N_CS for Δf^RA = 5 kHz), V18.7.0.
var ncs5000 = [3][16]int{
	{0, 13, 26, 33, 38, 41, 49, 55, 64, 76, 93, 119, 139, 209, 279, 419},
	{36, 57, 72, 81, 89, 94, 103, 112, 121, 132, 137, 152, 173, 195, 216, 237},
	{36, 57, 60, 63, 65, 68, 71, 77, 81, 85, 97, 109, 122, 137, noNCS, noNCS},
}

// ncs139 is TS 38.211 Table 6.3.3.1-7 (N_CS for Δf^RA = 15·2^μ kHz), V18.7.0,
// the L_RA = 139 column (unrestricted sets only).
var ncs139 = [16]int{0, 2, 4, 6, 8, 10, 12, 13, 15, 17, 19, 23, 27, 34, 46, 69}

// NCS returns the cyclic shift N_CS for a format, zeroCorrelationZoneConfig
// (0–15) and restricted set, from TS 38.211 Tables 6.3.3.1-5 to 6.3.3.1-7.
// N_CS = 0 means one preamble per root sequence (no cyclic shift).
func NCS(f Format, zeroCorrelationZoneConfig int, set RestrictedSet) (int, error) {
	if zeroCorrelationZoneConfig < 0 || zeroCorrelationZoneConfig > 15 {
		return 0, fmt.Errorf("zeroCorrelationZoneConfig is %d; it must be 0 to 15", zeroCorrelationZoneConfig)
	}
	if set > RestrictedTypeB {
		return 0, fmt.Errorf("the restricted set %v is not one of unrestricted, type A, type B", set)
	}
	a, _ := f.Pair()
	p, err := PreambleOf(a)
	if err != nil {
		return 0, err
	}
	var v int
	switch {
	case p.SCSHz == 1250:
		v = ncs1250[set][zeroCorrelationZoneConfig]
	case p.SCSHz == 5000:
		v = ncs5000[set][zeroCorrelationZoneConfig]
	default:
		if set != Unrestricted {
			return 0, fmt.Errorf("preamble format %v supports no %v (TS 38.211 Table 6.3.3.1-2); use the unrestricted set", f, set)
		}
		v = ncs139[zeroCorrelationZoneConfig]
	}
	if v == noNCS {
		return 0, fmt.Errorf("zeroCorrelationZoneConfig %d has no N_CS for %v with preamble format %v (an empty cell of TS 38.211 Table 6.3.3.1-%d)",
			zeroCorrelationZoneConfig, set, f, map[int]int{1250: 5, 5000: 6}[p.SCSHz])
	}
	return v, nil
}

// Allocation is one row of TS 38.211 Table 6.3.3.2-1: for a
// PRACH and a PUSCH subcarrier spacing, how many PUSCH resource blocks one
// PRACH occasion spans (N_RB^RA) and the offset k̄ in PRACH subcarriers.
type Allocation struct {
	LRA        int
	PRACHScsHz int
	PUSCHScsHz int
	NRB        int // N_RB^RA, in PUSCH resource blocks
	KBar       int // k̄
}

// allocations is TS 38.211 Table 6.3.3.2-1 as the text of V18.7.0 gives it,
// the rows with L_RA = 839, and L_RA = 139 with both spacings up to 120 kHz
// (the rows with 480/960 kHz or L_RA = 571/1151 are not carried).
var allocations = []Allocation{
	{839, 1250, 15000, 6, 7},
	{839, 1250, 30000, 3, 1},
	{839, 1250, 60000, 2, 133},
	{839, 5000, 15000, 24, 12},
	{839, 5000, 30000, 12, 10},
	{839, 5000, 60000, 6, 7},
	{139, 15000, 15000, 12, 2},
	{139, 15000, 30000, 6, 2},
	{139, 15000, 60000, 3, 2},
	{139, 30000, 15000, 24, 2},
	{139, 30000, 30000, 12, 2},
	{139, 30000, 60000, 6, 2},
	{139, 60000, 60000, 12, 2},
	{139, 60000, 120000, 6, 2},
	{139, 120000, 60000, 24, 2},
	{139, 120000, 120000, 12, 2},
}

// AllocationFor looks up Table 6.3.3.2-1 for a PRACH and a PUSCH spacing.
func AllocationFor(lra, prachScsHz, puschScsHz int) (Allocation, error) {
	for _, a := range allocations {
		if a.LRA == lra && a.PRACHScsHz == prachScsHz && a.PUSCHScsHz == puschScsHz {
			return a, nil
		}
	}
	return Allocation{}, fmt.Errorf("TS 38.211 Table 6.3.3.2-1 has no row for L_RA = %d with a PRACH spacing of %d Hz and a PUSCH spacing of %d Hz; "+
		"L_RA = 839 pairs 1250 or 5000 Hz with PUSCH 15, 30 or 60 kHz, L_RA = 139 pairs 15/30 kHz with 15–60 kHz and 60/120 kHz with 60–120 kHz",
		lra, prachScsHz, puschScsHz)
}
