package grid

import (
	"fmt"
	"math"
	"slices"
	"strconv"
)

// TDDPlan is a cell's semi-static TDD pattern, TDD-UL-DL-ConfigCommon of
// TS 38.331: a reference subcarrier spacing and one or two patterns that
// follow each other and repeat (TS 38.213 11.1).
type TDDPlan struct {
	ReferenceSCSKHz int         `json:"referenceScsKHz" yaml:"referenceScsKHz"`
	Pattern1        TDDPattern  `json:"pattern1" yaml:"pattern1"`
	Pattern2        *TDDPattern `json:"pattern2,omitempty" yaml:"pattern2,omitempty"`
}

// TDDPattern is one TDD-UL-DL-Pattern: a period of S slots of the reference
// spacing that opens with DownlinkSlots full downlink slots and
// DownlinkSymbols downlink symbols of the next slot, and closes with
// UplinkSymbols uplink symbols and UplinkSlots full uplink slots; the
// symbols between are flexible.
type TDDPattern struct {
	PeriodMs        float64 `json:"periodMs" yaml:"periodMs"` // dl-UL-TransmissionPeriodicity
	DownlinkSlots   int     `json:"downlinkSlots" yaml:"downlinkSlots"`
	DownlinkSymbols int     `json:"downlinkSymbols" yaml:"downlinkSymbols"`
	UplinkSlots     int     `json:"uplinkSlots" yaml:"uplinkSlots"`
	UplinkSymbols   int     `json:"uplinkSymbols" yaml:"uplinkSymbols"`
}

// TDDPeriodsMs lists dl-UL-TransmissionPeriodicity (and its -v1530
// extension) of TS 38.331 in ms.
var TDDPeriodsMs = []float64{0.5, 0.625, 1, 1.25, 2, 2.5, 3, 4, 5, 10}

// SymbolDir is the direction of a symbol under a TDD pattern.
type SymbolDir byte

// Symbol directions; NoDir means the plan has no TDD pattern.
const (
	NoDir    SymbolDir = 0
	Downlink SymbolDir = 'D'
	Uplink   SymbolDir = 'U'
	Flexible SymbolDir = 'F'
)

func (d SymbolDir) String() string {
	if d == NoDir {
		return ""
	}
	return string(rune(d))
}

// TDD is a checked TDD pattern on the reference numerology: the direction
// of every reference symbol of one period, which repeats from the start of
// the span.
type TDD struct {
	Reference Numerology
	Period    Tc          // P (+ P2)
	RefDirs   []SymbolDir // one per reference symbol of the period
}

// periodTc converts a period from the list to Tc; every listed period is a
// whole number of Tc.
func periodTc(ms float64) (Tc, bool) {
	if !slices.Contains(TDDPeriodsMs, ms) {
		return 0, false
	}
	return Tc(math.Round(ms * float64(TcPerSubframe))), true
}

func fmtMs(ms float64) string { return strconv.FormatFloat(ms, 'f', -1, 64) }

// checkTDD validates a TDD plan against TS 38.213 11.1 and TS 38.331 and
// returns the pattern, or false with findings.
func checkTDD(fs *findings, rng Range, t *TDDPlan) (TDD, bool) {
	ok := true
	mu, muOK := MuForSCS(t.ReferenceSCSKHz)
	if !muOK || !slices.Contains(rng.DataSCS(), t.ReferenceSCSKHz) {
		fs.add(Error, CodeTDD, "", "tdd.referenceScsKHz", "tdd.referenceScsKHz %s is not a subcarrier spacing of %s; use %s kHz.", given(t.ReferenceSCSKHz), rng, JoinInts(rng.DataSCS()))
		return TDD{}, false
	}
	ref := Numerology{Mu: mu}
	var dirs []SymbolDir
	var period Tc
	patterns := []*TDDPattern{&t.Pattern1}
	if t.Pattern2 != nil {
		patterns = append(patterns, t.Pattern2)
	}
	for i, p := range patterns {
		f := fmt.Sprintf("tdd.pattern%d", i+1)
		pt, listed := periodTc(p.PeriodMs)
		slots := float64(p.PeriodMs) * float64(ref.SlotsPerSubframe())
		switch {
		case !listed:
			fs.add(Error, CodeTDD, "", f+".periodMs", "%s.periodMs %s is not a dl-UL-TransmissionPeriodicity; use %s ms (TS 38.331).", f, fmtMs(p.PeriodMs), joinFloats(TDDPeriodsMs))
			ok = false
			continue
		case slots != math.Trunc(slots):
			var fits []float64
			for _, v := range TDDPeriodsMs {
				if s := v * float64(ref.SlotsPerSubframe()); s == math.Trunc(s) {
					fits = append(fits, v)
				}
			}
			fs.add(Error, CodeTDD, "", f+".periodMs", "%s.periodMs %s is not a whole number of %d kHz slots (TS 38.213 11.1); with referenceScsKHz %d use %s ms.", f, fmtMs(p.PeriodMs), t.ReferenceSCSKHz, t.ReferenceSCSKHz, joinFloats(fits))
			ok = false
			continue
		}
		s := int(slots)
		perSlot := ref.SymbolsPerSlot()
		fail := func(field, format string, args ...any) {
			fs.add(Error, CodeTDD, "", f+"."+field, format, args...)
			ok = false
		}
		for _, c := range []struct {
			name string
			v    int
			max  int
		}{{"downlinkSlots", p.DownlinkSlots, s}, {"uplinkSlots", p.UplinkSlots, s}, {"downlinkSymbols", p.DownlinkSymbols, perSlot - 1}, {"uplinkSymbols", p.UplinkSymbols, perSlot - 1}} {
			if c.v < 0 || c.v > c.max {
				fail(c.name, "%s.%s is %d; it must be 0 to %d.", f, c.name, c.v, c.max)
			}
		}
		if !ok {
			continue
		}
		dl := p.DownlinkSlots*perSlot + p.DownlinkSymbols
		ul := p.UplinkSlots*perSlot + p.UplinkSymbols
		if dl+ul > s*perSlot {
			fail("uplinkSlots", "%s has %d downlink and %d uplink symbols, more than the %d symbols of its %d slots of %s ms.", f, dl, ul, s*perSlot, s, fmtMs(p.PeriodMs))
			continue
		}
		for j := 0; j < s*perSlot; j++ {
			switch {
			case j < dl:
				dirs = append(dirs, Downlink)
			case j >= s*perSlot-ul:
				dirs = append(dirs, Uplink)
			default:
				dirs = append(dirs, Flexible)
			}
		}
		period += pt
	}
	if !ok {
		return TDD{}, false
	}
	// TS 38.213 11.1: with two patterns, 20 ms must hold a whole number of
	// P + P2. gridloom asks the same of a single pattern, so that it repeats
	// within two frames like every configuration 38.213 allows.
	if (20*TcPerSubframe)%period != 0 {
		field := "tdd.pattern1.periodMs"
		if t.Pattern2 != nil {
			field = "tdd.pattern2.periodMs"
		}
		fs.add(Error, CodeTDD, "", field, "The TDD period is %s ms, which does not divide 20 ms (TS 38.213 11.1); choose periods whose sum divides 20 ms, e.g. 3 + 2 ms.", fmtMs(float64(period)/float64(TcPerSubframe)))
		return TDD{}, false
	}
	return TDD{Reference: ref, Period: period, RefDirs: dirs}, true
}

func joinFloats(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = fmtMs(x)
	}
	return JoinOr(s)
}

// Directions maps the pattern onto a partition's symbols by time: a symbol
// takes the direction of the reference symbols it overlaps. It returns one
// direction per symbol of the span and the indices of symbols that straddle
// a change between downlink and uplink. Normal-CP partitions at or above
// the reference spacing never straddle (2^(μ−μref) symbols fill each
// reference symbol exactly, TS 38.213 11.1); an extended-CP partition can.
func (t TDD) Directions(l Lattice) (dirs []SymbolDir, straddles []int) {
	n := l.SymbolCount()
	dirs = make([]SymbolDir, n)
	period := len(t.RefDirs)
	// Walk the reference symbols alongside the partition's symbols: ref is
	// the first reference symbol that ends after the partition's symbol
	// starts, and at index r of the period.
	sym, ref := walkSymbols(l.Numerology), walkSymbols(t.Reference)
	r := 0
	for i := range n {
		start, end := sym.sym.Start, sym.sym.End()
		for ref.sym.End() <= start {
			ref.next()
			if r++; r == period {
				r = 0
			}
		}
		d := t.RefDirs[r]
		hasD, hasU := d == Downlink, d == Uplink
		// The reference symbols after ref that start before the symbol ends.
		next, lj, rj := ref.sym.End(), ref.l, r
		for next < end {
			if lj++; lj == ref.perSubframe {
				lj = 0
			}
			if rj++; rj == period {
				rj = 0
			}
			next += ref.lengthAt(lj)
			dj := t.RefDirs[rj]
			hasD = hasD || dj == Downlink
			hasU = hasU || dj == Uplink
			if dj != d {
				d = Flexible
			}
		}
		dirs[i] = d
		if hasD && hasU {
			straddles = append(straddles, i)
		}
		sym.next()
	}
	return dirs, straddles
}

// Share returns the fraction of a partition's symbols in one TDD period
// that go in direction d.
func (t TDD) Share(l Lattice, d SymbolDir) float64 {
	one := l
	one.SpanMs = int((t.Period + TcPerSubframe - 1) / TcPerSubframe)
	dirs, _ := t.Directions(one)
	return shareOf(dirs[:t.symbolsPerPeriod(l.Numerology)], d)
}

// symbolsPerPeriod is the number of symbols of n in one period.
func (t TDD) symbolsPerPeriod(n Numerology) int {
	return int(t.Period * Tc(n.SymbolsPerSubframe()) / TcPerSubframe)
}

// shareOf is the fraction of dirs that are d.
func shareOf(dirs []SymbolDir, d SymbolDir) float64 {
	count := 0
	for _, x := range dirs {
		if x == d {
			count++
		}
	}
	return float64(count) / float64(len(dirs))
}

// SlotString writes each reference slot of one period as D, U or S.
func (t TDD) SlotString() string {
	per := t.Reference.SymbolsPerSlot()
	b := make([]byte, 0, len(t.RefDirs)/per)
	for i := 0; i < len(t.RefDirs); i += per {
		c := byte('S')
		switch slot := t.RefDirs[i : i+per]; {
		case !slices.ContainsFunc(slot, func(d SymbolDir) bool { return d != Downlink }):
			c = 'D'
		case !slices.ContainsFunc(slot, func(d SymbolDir) bool { return d != Uplink }):
			c = 'U'
		}
		b = append(b, c)
	}
	return string(b)
}
