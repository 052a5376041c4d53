package grid

import "slices"

// Direction is the link direction of a partition, used by the rate estimate.
type Direction string

// Directions.
const (
	DL Direction = "DL"
	UL Direction = "UL"
)

// MaxLayers returns the largest number of MIMO layers for a direction
// (TS 38.306 4.1.2 counts up to 8 downlink and 4 uplink layers).
func (d Direction) MaxLayers() int {
	if d == UL {
		return 4
	}
	return 8
}

type modulation struct {
	name string
	bits int // Q_m
}

var modulations = []modulation{{"QPSK", 2}, {"16QAM", 4}, {"64QAM", 6}, {"256QAM", 8}, {"1024QAM", 10}}

// ModulationNames lists the accepted modulations, lowest order first.
func ModulationNames() []string {
	out := make([]string, len(modulations))
	for i, m := range modulations {
		out[i] = m.name
	}
	return out
}

// ModulationBits returns Q_m, the bits per symbol of a modulation name.
func ModulationBits(name string) (int, bool) {
	i := slices.IndexFunc(modulations, func(m modulation) bool { return m.name == name })
	if i < 0 {
		return 0, false
	}
	return modulations[i].bits, true
}

// Overhead returns OH^(j) of TS 38.306 4.1.2: 0.14 for FR1 downlink,
// 0.18 for FR2 downlink, 0.08 for FR1 uplink, 0.10 for FR2 uplink.
func Overhead(r Range, d Direction) float64 {
	switch {
	case d == UL && r.FR2():
		return 0.10
	case d == UL:
		return 0.08
	case r.FR2():
		return 0.18
	}
	return 0.14
}

// RMax is the largest LDPC code rate, 948/1024 (TS 38.306 4.1.2).
const RMax = 948.0 / 1024

// PeakMbps is the approximate maximum data rate of TS 38.306 4.1.2 for one
// carrier with scaling factor f = 1:
//
//	10^−6 · v_layers · Q_m · f · R_max · (N_PRB · 12 / T_s^μ) · (1 − OH)
//
// with T_s^μ = 10^−3/(14·2^μ) s, the average symbol length. The standard
// writes the formula for normal CP; for extended CP gridloom uses 12 symbols
// per slot in T_s^μ, so the estimate keeps counting symbols actually sent.
func PeakMbps(r Range, d Direction, n Numerology, prbs, layers, bitsPerSymbol int) float64 {
	symbolsPerSecond := float64(n.SymbolsPerSlot()<<n.Mu) * 1e3 // 1/T_s^μ
	re := float64(prbs*12) * symbolsPerSecond
	return 1e-6 * float64(layers*bitsPerSymbol) * RMax * re * (1 - Overhead(r, d))
}
