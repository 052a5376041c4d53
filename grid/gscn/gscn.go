// Package gscn is the synchronization raster of NR: the global
// synchronization channel numbers (GSCN) that name the frequencies where an
// SS/PBCH block may sit (TS 38.101-1 and TS 38.101-2 clause 5.4.3.1), and
// the raster entries each operating band allows (clause 5.4.3.3).
//
// A UE searching for a cell looks only at these frequencies, so a
// cell-defining SS/PBCH block off the raster is never found. Frequencies are
// exact integers of Hz: every raster point is a whole number of Hz (the
// finest step, M·50 kHz, already is).
//
// The package imports nothing of the project, so that the engine (package
// grid) can import it.
package gscn

import "fmt"

// Hz is a frequency in hertz; the raster is exact in it.
type Hz = int64

// A rasterRange is one row of TS 38.101-1 Table 5.4.3.1-1 (the same rows are
// in TS 38.101-2 Table 5.4.3.1-1 and TS 38.104 Table 5.4.3.1-1), Release 17.
type rasterRange struct {
	lowHz, highHz Hz // the row's frequency range, [low, high)
	firstGSCN     int
	lastGSCN      int
}

// The three rows of Table 5.4.3.1-1:
//
//	0 – 3000 MHz:        SS_REF = N·1200 kHz + M·50 kHz, N = 1:2499, M ∈ {1,3,5}, GSCN = 3N + (M−3)/2, 2 – 7498
//	3000 – 24250 MHz:    SS_REF = 3000 MHz + N·1.44 MHz, N = 0:14756,            GSCN = 7499 + N,       7499 – 22255
//	24250 – 100000 MHz:  SS_REF = 24250.08 MHz + N·17.28 MHz, N = 0:4383,        GSCN = 22256 + N,      22256 – 26639
var rasterRanges = [3]rasterRange{
	{lowHz: 0, highHz: 3000e6, firstGSCN: 2, lastGSCN: 7498},
	{lowHz: 3000e6, highHz: 24250e6, firstGSCN: 7499, lastGSCN: 22255},
	{lowHz: 24250e6, highHz: 100000e6, firstGSCN: 22256, lastGSCN: 26639},
}

// Steps and offsets of the three rows.
const (
	step1Hz   Hz = 1200e3 // N step below 3000 MHz
	mStepHz   Hz = 50e3   // M unit below 3000 MHz
	step2Hz   Hz = 1440e3
	offset2Hz Hz = 3000e6
	step3Hz   Hz = 17280e3
	offset3Hz Hz = 24250080e3
)

// MinGSCN and MaxGSCN bound the global synchronization raster (TS 38.101-1
// Table 5.4.3.1-1, TS 38.101-2 Table 5.4.3.1-1).
const (
	MinGSCN = 2
	MaxGSCN = 26639
)

// Rule describes the global synchronization raster, for messages.
const Rule = "SS_REF = N·1200 kHz + M·50 kHz (M = 1, 3 or 5) below 3000 MHz, 3000 MHz + N·1.44 MHz up to 24250 MHz, 24250.08 MHz + N·17.28 MHz above"

// Frequency returns SS_REF of a GSCN, and false when g is not a GSCN
// (outside 2 … 26639).
func Frequency(g int) (Hz, bool) {
	switch {
	case g < MinGSCN || g > MaxGSCN:
		return 0, false
	case g <= rasterRanges[0].lastGSCN:
		// GSCN = 3N + (M−3)/2: g mod 3 picks M (0 → M=3, 1 → M=5, 2 → M=1).
		n, r := g/3, g%3
		m := map[int]Hz{0: 3, 1: 5, 2: 1}[r]
		if r == 2 {
			n++ // 3N − 1 = g
		}
		return Hz(n)*step1Hz + m*mStepHz, true
	case g <= rasterRanges[1].lastGSCN:
		return offset2Hz + Hz(g-rasterRanges[1].firstGSCN)*step2Hz, true
	}
	return offset3Hz + Hz(g-rasterRanges[2].firstGSCN)*step3Hz, true
}

// FromFrequency returns the GSCN of f and whether f lies exactly on the
// global synchronization raster.
func FromFrequency(f Hz) (int, bool) {
	below, above, ok := Nearest(f)
	if !ok || below != above {
		return 0, false
	}
	return below, true
}

// Nearest returns the raster points at or just below and just above f, to
// suggest in a message; both are f's GSCN when f is on the raster. ok is
// false when f is below the first or above the last raster point.
func Nearest(f Hz) (below, above int, ok bool) {
	lo, _ := Frequency(MinGSCN)
	hi, _ := Frequency(MaxGSCN)
	if f < lo || f > hi {
		return 0, 0, false
	}
	// The raster is increasing in g, so a binary search over g finds the
	// last point at or below f whatever row it is in.
	a, b := MinGSCN, MaxGSCN // Frequency(a) <= f, and f <= Frequency(b)
	for b-a > 1 {
		mid := (a + b) / 2
		if fm, _ := Frequency(mid); fm <= f {
			a = mid
		} else {
			b = mid
		}
	}
	if fb, _ := Frequency(b); fb == f {
		return b, b, true
	}
	if fa, _ := Frequency(a); fa == f {
		return a, a, true
	}
	return a, b, true
}

// Params returns the N and M of Table 5.4.3.1-1 for a GSCN, as the table
// writes them: M is 0 above 3000 MHz, where the formula has no M.
func Params(g int) (n, m int, ok bool) {
	f, ok := Frequency(g)
	if !ok {
		return 0, 0, false
	}
	switch {
	case g <= rasterRanges[0].lastGSCN:
		for _, m := range []int{1, 3, 5} {
			if (f-Hz(m)*mStepHz)%step1Hz == 0 {
				return int((f - Hz(m)*mStepHz) / step1Hz), m, true
			}
		}
		panic(fmt.Sprintf("gscn: no M for GSCN %d", g)) // unreachable: Frequency builds f from one
	case g <= rasterRanges[1].lastGSCN:
		return g - rasterRanges[1].firstGSCN, 0, true
	}
	return g - rasterRanges[2].firstGSCN, 0, true
}
