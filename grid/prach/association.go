package prach

import (
	"fmt"
	"slices"
)

// SSBPerRO is N, the number of SS/PBCH block indexes per PRACH occasion
// (ssb-perRACH-Occasion: 1/8, 1/4, 1/2, 1, 2, 4, 8 or 16), as Num/Den with
// one of them 1.
type SSBPerRO struct{ Num, Den int }

func (n SSBPerRO) valid() bool {
	return (n.Den == 1 && slices.Contains([]int{1, 2, 4, 8, 16}, n.Num)) ||
		(n.Num == 1 && slices.Contains([]int{2, 4, 8}, n.Den))
}

// String writes N as the RRC field spells it: "1/8" ... "16".
func (n SSBPerRO) String() string {
	if n.Den == 1 {
		return fmt.Sprint(n.Num)
	}
	return fmt.Sprintf("%d/%d", n.Num, n.Den)
}

// occasionsPerCycle is how many PRACH occasions one mapping cycle of nSSB
// block indexes takes: 1/N per index when N < 1, ⌈nSSB/N⌉ when N ≥ 1.
func (n SSBPerRO) occasionsPerCycle(nSSB int) int {
	if n.Den > 1 {
		return nSSB * n.Den
	}
	return (nSSB + n.Num - 1) / n.Num
}

// associationPeriods is TS 38.213 Table 8.1-1 (unchanged from Release 15 to
// the Release 18 text read in github.com/CrzyNxtG/mdspc): for each PRACH
// configuration period in ms, the allowed association periods in numbers of
// configuration periods.
var associationPeriods = map[int][]int{
	10:  {1, 2, 4, 8, 16},
	20:  {1, 2, 4, 8},
	40:  {1, 2, 4},
	80:  {1, 2},
	160: {1},
}

// RO is one PRACH occasion in time and frequency, with the SS/PBCH block
// indexes mapped to it (none when it falls outside a whole mapping cycle).
// Unlike Occasions, its StartTc and EndTc count from the start of frame 0,
// where the association period begins.
type RO struct {
	Occasion
	FDM  int   // n_RA, the frequency index 0 to msg1-FDM − 1
	SSBs []int // the SS/PBCH block indexes mapped here, in increasing order
}

// Association is the outcome of TS 38.213 8.1 for one configuration: the
// association period and every valid PRACH occasion in it with its blocks.
type Association struct {
	// ConfigPeriodFrames is x of the configuration table: the PRACH
	// configuration period is 10·x ms.
	ConfigPeriodFrames int
	// Periods is the association period in configuration periods (Table 8.1-1).
	Periods int
	// PerCycle is how many occasions one mapping cycle of all blocks takes.
	PerCycle int
	// Cycles is how many whole mapping cycles fit in the association period.
	Cycles int
	// ROs lists the valid occasions of the association period, from frame
	// 0, in mapping order: frequency first, then time.
	ROs []RO
}

// Associate maps the transmitted SS/PBCH block indexes ssb (from
// ssb-PositionsInBurst, increasing) onto the valid PRACH occasions of row
// index of table s, following TS 38.213 clause 8.1: blocks go to occasions
// first by preamble (N per occasion), then by frequency (msg1-FDM), then by
// time within a PRACH slot, then by PRACH slot; the association period,
// from frame 0, is the smallest value of Table 8.1-1 for the configuration
// period in which every block is mapped at least once; occasions past the
// last whole mapping cycle get no block. Validity follows Valid with layout.
// mu is as for Occasions.
func Associate(s Spectrum, index, mu, fdm int, ssb []int, n SSBPerRO, layout Layout) (Association, error) {
	if !slices.Contains([]int{1, 2, 4, 8}, fdm) {
		return Association{}, fmt.Errorf("msg1-FDM is %d; it must be 1, 2, 4 or 8", fdm)
	}
	if !n.valid() {
		return Association{}, fmt.Errorf("ssb-perRACH-Occasion is %v; it must be 1/8, 1/4, 1/2, 1, 2, 4, 8 or 16", n)
	}
	if len(ssb) == 0 || len(ssb) > 64 || !slices.IsSorted(ssb) || ssb[0] < 0 || ssb[len(ssb)-1] > 63 {
		return Association{}, fmt.Errorf("the transmitted SS/PBCH block indexes %v must be 1 to 64 increasing indexes from 0 to 63", ssb)
	}
	c, err := Lookup(s, index)
	if err != nil {
		return Association{}, err
	}
	allowed := associationPeriods[10*c.X]
	// The valid occasions of one configuration period, frames 0 to x−1.
	var period []Occasion
	for sfn := range c.X {
		occ, err := Occasions(s, index, sfn, mu)
		if err != nil {
			return Association{}, err
		}
		for _, o := range occ {
			v, err := Valid(o, layout)
			if err != nil {
				return Association{}, err
			}
			if v.Valid {
				period = append(period, o)
			}
		}
	}
	a := Association{ConfigPeriodFrames: c.X, PerCycle: n.occasionsPerCycle(len(ssb))}
	perPeriod := len(period) * fdm
	for _, p := range allowed {
		if p*perPeriod >= a.PerCycle {
			a.Periods = p
			break
		}
	}
	if a.Periods == 0 {
		return Association{}, fmt.Errorf("the %d valid PRACH occasions of a %d ms configuration period (msg1-FDM %d) cannot map %d SS/PBCH blocks at %v per occasion within the longest association period of TS 38.213 Table 8.1-1 (%d periods); %d occasions are needed",
			len(period), 10*c.X, fdm, len(ssb), n, allowed[len(allowed)-1], a.PerCycle)
	}
	total := a.Periods * perPeriod
	a.Cycles = total / a.PerCycle
	mapped := a.Cycles * a.PerCycle
	for p := range a.Periods {
		for _, o := range period {
			o.SFN += p * c.X
			shift := int64(o.SFN) * 10 * TcPerSubframe
			o.StartTc += shift
			o.EndTc += shift
			for f := range fdm {
				r := RO{Occasion: o, FDM: f}
				if i := len(a.ROs); i < mapped {
					k := i % a.PerCycle
					if n.Den > 1 {
						r.SSBs = []int{ssb[k/n.Den]}
					} else {
						r.SSBs = slices.Clone(ssb[k*n.Num : min((k+1)*n.Num, len(ssb))])
					}
				}
				a.ROs = append(a.ROs, r)
			}
		}
	}
	return a, nil
}

// maxPatternFrames is the longest association pattern period, 160 ms
// (TS 38.213 clause 8.1), in radio frames.
const maxPatternFrames = 16

// AssociationPatternPeriod returns the association pattern period of
// TS 38.213 clause 8.1 in radio frames: "an association pattern period
// includes one or more association periods and is determined so that a
// pattern between PRACH occasions and SS/PBCH block indexes repeats at most
// every 160 msec". associationFrames is the association period in frames;
// repeatFrames is how many frames the carrier takes to look the same again
// for the validity of the occasions (1 when every frame is alike; the
// SS/PBCH period when frames without blocks validate other occasions; 2 for
// a TDD pattern of 20 ms). Since the mapping starts again with each
// association period, the pattern repeats once both start together: the
// least common multiple of the two, which must stay within 160 ms. Every
// period of NR is 10 ms times a power of two, so the pattern period holds
// a whole number of association periods and no occasion is left after the
// last of them ("PRACH occasions not associated ... after an integer number
// of association periods ... are not used" then selects none).
func AssociationPatternPeriod(associationFrames, repeatFrames int) (int, error) {
	if associationFrames < 1 || associationFrames > maxPatternFrames {
		return 0, fmt.Errorf("the association period is %d frames; TS 38.213 Table 8.1-1 allows 1 to %d", associationFrames, maxPatternFrames)
	}
	if repeatFrames < 1 {
		return 0, fmt.Errorf("the frames repeat every %d frames; it must be at least 1", repeatFrames)
	}
	a, b := associationFrames, repeatFrames
	for b != 0 {
		a, b = b, a%b
	}
	p := associationFrames / a * repeatFrames
	if p > maxPatternFrames {
		return 0, fmt.Errorf("an association period of %d frames and frames that repeat every %d repeat together only every %d ms, beyond the 160 ms of TS 38.213 8.1",
			associationFrames, repeatFrames, 10*p)
	}
	return p, nil
}
