package grid

import (
	"fmt"
	"slices"
	"strings"
)

// Hz is a frequency, or a frequency offset, in hertz. Every subcarrier edge
// and centre of NR is a whole number of Hz.
type Hz int64

// KHz returns f in kHz; exact in a float64 for any frequency NR uses.
func (f Hz) KHz() float64 { return float64(f) / 1e3 }

// MHz returns f in MHz.
func (f Hz) MHz() float64 { return float64(f) / 1e6 }

// Range is a frequency range of TS 38.101-1 and TS 38.101-2.
type Range uint8

// Frequency ranges. The zero value is FR1.
const (
	FR1 Range = iota
	FR2_1
	FR2_2
)

var rangeNames = [...]string{FR1: "FR1", FR2_1: "FR2-1", FR2_2: "FR2-2"}

func (r Range) String() string {
	if int(r) < len(rangeNames) {
		return rangeNames[r]
	}
	return fmt.Sprintf("Range(%d)", r)
}

// RangeNames lists the accepted spellings of a Range, for messages and forms.
func RangeNames() []string { return rangeNames[:] }

// ParseRange reads "FR1", "FR2-1" or "FR2-2".
func ParseRange(s string) (Range, bool) {
	i := slices.Index(rangeNames[:], s)
	if i < 0 {
		return FR1, false
	}
	return Range(i), true
}

// Limits returns the frequency limits of the range (TS 38.101-1 Table 5.1-1:
// FR1 410–7125 MHz; TS 38.101-2 Table 5.1-1: FR2-1 24250–52600 MHz,
// FR2-2 52600–71000 MHz).
func (r Range) Limits() (low, high Hz) {
	switch r {
	case FR2_1:
		return 24250e6, 52600e6
	case FR2_2:
		return 52600e6, 71000e6
	}
	return 410e6, 7125e6
}

// FR2 reports whether r is one of the FR2 ranges, which share the FR2
// overhead of the TS 38.306 rate formula.
func (r Range) FR2() bool { return r == FR2_1 || r == FR2_2 }

// bandwidthTable holds the maximum transmission bandwidth configuration N_RB
// for each subcarrier spacing and channel bandwidth of one frequency range.
type bandwidthTable struct {
	scsKHz []int               // data subcarrier spacings, ascending
	nrb    map[int]map[int]int // scsKHz → bandwidthMHz → N_RB
}

// Maximum transmission bandwidth configuration N_RB:
// TS 38.101-1 Table 5.3.2-1 (FR1), TS 38.101-2 Table 5.3.2-1 (FR2-1 and FR2-2).
// 240 kHz is a subcarrier spacing of SS/PBCH blocks only and carries no data.
var bandwidthTables = [...]bandwidthTable{
	FR1: {
		scsKHz: []int{15, 30, 60},
		nrb: map[int]map[int]int{
			15: {3: 15, 5: 25, 10: 52, 15: 79, 20: 106, 25: 133, 30: 160, 35: 188, 40: 216, 45: 242, 50: 270},
			30: {5: 11, 10: 24, 15: 38, 20: 51, 25: 65, 30: 78, 35: 92, 40: 106, 45: 119, 50: 133,
				60: 162, 70: 189, 80: 217, 90: 245, 100: 273},
			60: {10: 11, 15: 18, 20: 24, 25: 31, 30: 38, 35: 44, 40: 51, 45: 58, 50: 65,
				60: 79, 70: 93, 80: 107, 90: 121, 100: 135},
		},
	},
	FR2_1: {
		scsKHz: []int{60, 120},
		nrb: map[int]map[int]int{
			60:  {50: 66, 100: 132, 200: 264},
			120: {50: 32, 100: 66, 200: 132, 400: 264},
		},
	},
	FR2_2: {
		scsKHz: []int{120, 480, 960},
		nrb: map[int]map[int]int{
			120: {100: 66, 400: 264},
			480: {400: 66, 800: 124, 1600: 248},
			960: {400: 33, 800: 62, 1600: 124, 2000: 148},
		},
	},
}

func (r Range) table() bandwidthTable {
	if int(r) < len(bandwidthTables) {
		return bandwidthTables[r]
	}
	return bandwidthTable{}
}

// DataSCS lists the subcarrier spacings (kHz) that may carry data in the range.
func (r Range) DataSCS() []int { return slices.Clone(r.table().scsKHz) }

// Bandwidths lists, ascending, the channel bandwidths (MHz) that the range
// defines for a subcarrier spacing; nil if the spacing carries no data there.
func (r Range) Bandwidths(scsKHz int) []int {
	var out []int
	for bw := range r.table().nrb[scsKHz] {
		out = append(out, bw)
	}
	slices.Sort(out)
	return out
}

// AllBandwidths lists, ascending, every channel bandwidth (MHz) of the range
// for any subcarrier spacing.
func (r Range) AllBandwidths() []int {
	var out []int
	for _, scs := range r.table().scsKHz {
		for _, bw := range r.Bandwidths(scs) {
			if !slices.Contains(out, bw) {
				out = append(out, bw)
			}
		}
	}
	slices.Sort(out)
	return out
}

// NRB returns the maximum transmission bandwidth configuration N_RB for a
// subcarrier spacing and channel bandwidth, and whether the pair exists.
func (r Range) NRB(scsKHz, bandwidthMHz int) (int, bool) {
	n, ok := r.table().nrb[scsKHz][bandwidthMHz]
	return n, ok
}

// MinGuard returns the minimum guardband of TS 38.101-1 / 38.101-2
// Table 5.3.3-1 for a subcarrier spacing and channel bandwidth. The tables'
// own note gives the equation (BW·1000 − N_RB·SCS·12)/2 − SCS/2 kHz, and
// every entry of the tables follows it.
func (r Range) MinGuard(scsKHz, bandwidthMHz int) (Hz, bool) {
	n, ok := r.NRB(scsKHz, bandwidthMHz)
	if !ok {
		return 0, false
	}
	scs := Hz(scsKHz) * 1000
	return (Hz(bandwidthMHz)*1e6-Hz(n)*12*scs)/2 - scs/2, true
}

// JoinInts formats a list of numbers for a message: "15, 30 or 60".
func JoinInts(v []int) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = fmt.Sprint(x)
	}
	return JoinOr(s)
}

// JoinOr joins the choices of a message: "a, b or c"; "none" for none.
func JoinOr(s []string) string {
	switch len(s) {
	case 0:
		return "none"
	case 1:
		return s[0]
	}
	return strings.Join(s[:len(s)-1], ", ") + " or " + s[len(s)-1]
}
