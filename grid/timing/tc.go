package timing

import "fmt"

// Tc counts the basic time unit of NR, Tc = 1/(Δf_max·N_f) with
// Δf_max = 480 kHz and N_f = 4096 (TS 38.211 4.1). It is the same unit as
// package grid's Tc, kept separate so that this package stays a leaf.
type Tc int64

// Time constants of TS 38.211 4.1 and 4.3.1.
const (
	Kappa           = 64            // κ = Ts/Tc
	TcPerSecond  Tc = 480000 * 4096 // 1 966 080 000
	TcPerMilli   Tc = TcPerSecond / 1000
	TcPerHalfSub Tc = TcPerMilli / 2 // 0.5 ms, where a symbol with the longer CP starts
)

// MaxMu is the largest numerology of TS 38.211 Table 4.2-1 (960 kHz).
const MaxMu = 6

// SymbolsPerSlot is the number of symbols of a normal-CP slot (TS 38.211
// Table 4.3.2-1).
const SymbolsPerSlot = 14

// Micros returns d in microseconds. One microsecond is 1966.08 Tc, so the
// result is for display; keep Tc for arithmetic.
func (d Tc) Micros() float64 { return float64(d) * 1e6 / float64(TcPerSecond) }

// Seconds returns d in seconds, for the range formulas that multiply by c.
func (d Tc) Seconds() float64 { return float64(d) / float64(TcPerSecond) }

// String prints d with its value in microseconds, e.g. "140288 Tc (71.354 µs)".
func (d Tc) String() string { return fmt.Sprintf("%d Tc (%.3f µs)", int64(d), d.Micros()) }

// FromMicros converts a whole number of microseconds to Tc; exact because
// 1 µs = 1966.08 Tc and every multiple of 25 µs is whole, otherwise rounded
// to the nearest Tc.
func FromMicros(us int64) Tc { return Tc((us*int64(TcPerSecond) + 500000) / 1000000) }

// checkMu refuses a numerology outside TS 38.211 Table 4.2-1.
func checkMu(field string, mu int) error {
	if mu < 0 || mu > MaxMu {
		return fmt.Errorf("%s must be a numerology μ from 0 to %d (15 to 960 kHz); got %d.", field, MaxMu, mu)
	}
	return nil
}

// SlotTc is the nominal length of one slot at μ, 1 ms / 2^μ (TS 38.211
// 4.3.2), the slot length column of TS 38.133 Table 8.6.2-1. At μ ≥ 2 the
// slots of a half subframe differ by 16κ (its first symbol is longer); the
// lattice functions use SymbolStart for exact edges.
func SlotTc(mu int) Tc { return TcPerMilli >> mu }

// NominalSymbolTc is (2048 + 144)·κ·2^−μ Tc, the symbol length TS 38.214
// uses for N1 and N2: a normal-CP symbol without the extra 16κ that the
// first symbol of every half subframe carries.
func NominalSymbolTc(mu int) Tc { return Tc((2048+144)*Kappa) >> mu }

// SymbolsPerHalfSub is the number of symbols in 0.5 ms at μ (7·2^μ).
func SymbolsPerHalfSub(mu int) int { return 7 << mu }

// SymbolStart returns the start of symbol k (counted from 0 at a
// half-subframe boundary, any k ≥ 0) and its length, both in Tc. Every
// symbol is (2048 + 144)·κ·2^−μ long, and the first of each half subframe
// 16κ longer (TS 38.211 5.3.1, normal CP).
func SymbolStart(mu, k int) (start, length Tc) {
	per := SymbolsPerHalfSub(mu)
	h, l := k/per, k%per
	start = Tc(h) * TcPerHalfSub
	if l > 0 {
		start += 16*Kappa + Tc(l)*NominalSymbolTc(mu)
	}
	length = NominalSymbolTc(mu)
	if l == 0 {
		length += 16 * Kappa
	}
	return start, length
}
