package grid

import (
	"fmt"
	"slices"
	"strings"
)

// SSBPlan places the SS/PBCH blocks of the cell (TS 38.213 4.1,
// TS 38.211 7.4.3).
type SSBPlan struct {
	SCSKHz int    `json:"scsKHz" yaml:"scsKHz"`
	Case   string `json:"case,omitempty" yaml:"case,omitempty"` // "A"…"G"; "" derives it from the spacing
	// Bitmap says which candidate blocks are sent, '1' or '0' per candidate
	// in index order (ssb-PositionsInBurst); "" sends them all.
	Bitmap string `json:"bitmap,omitempty" yaml:"bitmap,omitempty"`
	// OffsetToPointA is N_CRB^SSB in RBs of 15 kHz (FR1) or 60 kHz (FR2),
	// and KSSB the subcarrier offset k_SSB in subcarriers of 15 kHz (FR1)
	// or of ScsCommonKHz (FR2), TS 38.211 4.4.4.2 and 7.4.3.1.
	OffsetToPointA int `json:"offsetToPointA" yaml:"offsetToPointA"`
	KSSB           int `json:"kSsb,omitempty" yaml:"kSsb,omitempty"`
	ScsCommonKHz   int `json:"scsCommonKHz,omitempty" yaml:"scsCommonKHz,omitempty"` // FR2 only; 0 means 120 kHz (FR2-1) or the block's spacing (FR2-2)
	PeriodMs       int `json:"periodMs,omitempty" yaml:"periodMs,omitempty"`         // 5, 10, 20, 40, 80 or 160; 0 means 20
}

// SSBPeriodsMs are the values of ssb-periodicityServingCell (TS 38.331).
var SSBPeriodsMs = []int{5, 10, 20, 40, 80, 160}

// ssbCase is one case of TS 38.213 4.1: the first symbols of the candidate
// blocks in a half frame are base + step·n for each listed n.
type ssbCase struct {
	name   string
	scsKHz int
	base   []int
	step   int
}

var ssbCases = []ssbCase{
	{"A", 15, []int{2, 8}, 14},
	{"B", 30, []int{4, 8, 16, 20}, 28},
	{"C", 30, []int{2, 8}, 14},
	{"D", 120, []int{4, 8, 16, 20}, 28},
	{"E", 240, []int{8, 12, 16, 20, 32, 36, 40, 44}, 56},
	{"F", 480, []int{2, 9}, 14},
	{"G", 960, []int{2, 9}, 14},
}

// SSBSCS lists the SS/PBCH block spacings (kHz) of the range (TS 38.101-1/-2
// and TS 38.104 band tables: 15 or 30 kHz in FR1; 120 or 240 kHz in FR2-1;
// 120, 480 or 960 kHz in FR2-2).
func (r Range) SSBSCS() []int {
	switch r {
	case FR2_1:
		return []int{120, 240}
	case FR2_2:
		return []int{120, 480, 960}
	}
	return []int{15, 30}
}

// ssbN returns the values of n for a case and carrier frequency
// (TS 38.213 4.1). unpaired selects the thresholds of unpaired (TDD)
// spectrum for case C.
func ssbN(c ssbCase, f Hz, unpaired bool) []int {
	upTo := func(k int) []int {
		n := make([]int, k)
		for i := range n {
			n[i] = i
		}
		return n
	}
	switch c.name {
	case "A":
		if f <= 3e9 {
			return upTo(2)
		}
		return upTo(4)
	case "B":
		if f <= 3e9 {
			return upTo(1)
		}
		return upTo(2)
	case "C":
		limit := Hz(3e9)
		if unpaired {
			limit = 1.88e9
		}
		if f <= limit {
			return upTo(2)
		}
		return upTo(4)
	case "D":
		return []int{0, 1, 2, 3, 5, 6, 7, 8, 10, 11, 12, 13, 15, 16, 17, 18}
	case "E":
		return []int{0, 1, 2, 3, 5, 6, 7, 8}
	}
	return upTo(32) // F and G
}

// SSBBlock is one SS/PBCH block sent within the span: four symbols of the
// block's numerology by 240 subcarriers. Slot and Symbol count in the
// block's own numerology over the span.
type SSBBlock struct {
	Index      int // candidate index ī_SSB
	Slot       int
	Symbol     int
	Start, End Tc
	Low, High  Hz
}

// SSB is the checked SS/PBCH configuration with its blocks in the span.
type SSB struct {
	Case       string
	Numerology Numerology
	Candidates int // L_max
	PeriodMs   int
	Low, High  Hz // the blocks' subcarrier edges
	Blocks     []SSBBlock
}

func checkSSB(fs *findings, rng Range, s *SSBPlan, ch Channel, freq Hz, freqKnown, unpaired bool, span int) (SSB, bool) {
	allowed := rng.SSBSCS()
	mu, _ := MuForSCS(s.SCSKHz)
	if !slices.Contains(allowed, s.SCSKHz) {
		fs.add(Error, CodeSSB, "", "ssb.scsKHz", "ssb.scsKHz %s is not an SS/PBCH block spacing of %s; use %s kHz.", given(s.SCSKHz), rng, JoinInts(allowed))
		return SSB{}, false
	}
	var cases []string
	for _, c := range ssbCases {
		if c.scsKHz == s.SCSKHz {
			cases = append(cases, c.name)
		}
	}
	name := strings.ToUpper(s.Case)
	if name == "" {
		name = cases[len(cases)-1] // 30 kHz: case C, the case of most TDD bands
	}
	i := slices.IndexFunc(ssbCases, func(c ssbCase) bool { return c.name == name })
	if !slices.Contains(cases, name) {
		fs.add(Error, CodeSSB, "", "ssb.case", "ssb.case %q does not exist at %d kHz; use %s (TS 38.213 4.1).", s.Case, s.SCSKHz, JoinOr(cases))
		return SSB{}, false
	}
	c := ssbCases[i]
	if !freqKnown && (name == "A" || name == "B" || name == "C") {
		fs.add(Info, CodeSSB, "", "carrier.centerMHz", "The carrier frequency is not given, so the SS/PBCH candidates of case %s assume a carrier above 3 GHz (TS 38.213 4.1); give carrier.centerMHz or carrier.arfcn to fix them.", name)
		freq = 3.5e9
	}
	var first []int
	for _, n := range ssbN(c, freq, unpaired) {
		for _, b := range c.base {
			first = append(first, b+c.step*n)
		}
	}
	slices.Sort(first)
	lmax := len(first)

	ok := true
	fail := func(field, format string, args ...any) {
		fs.add(Error, CodeSSB, "", field, format, args...)
		ok = false
	}
	sent := make([]bool, lmax)
	switch {
	case s.Bitmap == "":
		for k := range sent {
			sent[k] = true
		}
	case len(s.Bitmap) != lmax || strings.Trim(s.Bitmap, "01") != "":
		fail("ssb.bitmap", "ssb.bitmap must be %d characters of 0 and 1, one per candidate block of case %s at this frequency (L_max = %d).", lmax, name, lmax)
	default:
		for k := range sent {
			sent[k] = s.Bitmap[k] == '1'
		}
	}
	period := s.PeriodMs
	if period == 0 {
		period = 20
	}
	if !slices.Contains(SSBPeriodsMs, period) {
		fail("ssb.periodMs", "ssb.periodMs %d is not an SS/PBCH period; use %s ms (TS 38.331 ssb-periodicityServingCell).", period, JoinInts(SSBPeriodsMs))
	}
	rbUnit, kUnit, kMax := Hz(15e3), Hz(15e3), 23
	if rng.FR2() {
		rbUnit, kMax = 60e3, 11
		common := s.ScsCommonKHz
		if common == 0 {
			common = 120
			if rng == FR2_2 {
				common = s.SCSKHz
			}
		}
		if !slices.Contains(rng.DataSCS(), common) {
			fail("ssb.scsCommonKHz", "ssb.scsCommonKHz %d is not a data spacing of %s; use %s kHz.", common, rng, JoinInts(rng.DataSCS()))
		}
		kUnit = Hz(common) * 1000
	} else if s.ScsCommonKHz != 0 {
		fs.add(Warning, CodeSSB, "", "ssb.scsCommonKHz", "ssb.scsCommonKHz is used only in FR2; in FR1 k_SSB counts 15 kHz subcarriers, so it is ignored.")
	}
	if s.KSSB < 0 || s.KSSB > kMax {
		fail("ssb.kSsb", "ssb.kSsb is %d; it must be 0 to %d (TS 38.211 7.4.3.1).", s.KSSB, kMax)
	}
	if s.OffsetToPointA < 0 || s.OffsetToPointA > MaxOffset {
		fail("ssb.offsetToPointA", "ssb.offsetToPointA is %d; it must be 0 to %d RBs.", s.OffsetToPointA, MaxOffset)
	}
	if !ok {
		return SSB{}, false
	}

	num := Numerology{Mu: mu}
	scs := num.SCS()
	centre0 := Hz(s.OffsetToPointA)*12*rbUnit + Hz(s.KSSB)*kUnit // subcarrier 0 of the block
	low := centre0 - scs/2
	out := SSB{Case: name, Numerology: num, Candidates: lmax, PeriodMs: period, Low: low, High: low + 240*scs}
	if out.Low < ch.Low || out.High > ch.High {
		fs.add(Error, CodeSSB, "", "ssb.offsetToPointA", "The SS/PBCH blocks span %s to %s, beyond the channel (%s to %s); move ssb.offsetToPointA.", fmtKHz(out.Low), fmtKHz(out.High), fmtKHz(ch.Low), fmtKHz(ch.High))
	}
	// Blocks are sent in the first half frame of each period.
	perHalf := num.SymbolsPerSubframe() * 5
	for start := 0; start < span; start += period {
		base := start * num.SymbolsPerSubframe()
		for k, sym := range first {
			if !sent[k] || sym+3 >= perHalf {
				continue
			}
			a, b := num.SymbolAt(base+sym), num.SymbolAt(base+sym+3)
			if a.Start >= Tc(span)*TcPerSubframe {
				continue
			}
			out.Blocks = append(out.Blocks, SSBBlock{Index: k, Slot: a.Slot, Symbol: a.Symbol, Start: a.Start, End: b.End(), Low: out.Low, High: out.High})
		}
	}
	return out, true
}

// checkSSBOverlaps reports partitions of another spacing that share
// spectrum with the blocks, and blocks that fall on uplink symbols.
func checkSSBOverlaps(fs *findings, s SSB, ls []Lattice, tdd *TDD) {
	if len(s.Blocks) == 0 {
		return
	}
	for _, l := range ls {
		over := min(l.High, s.High) - max(l.Low, s.Low)
		if over > 0 && l.Numerology.SCSKHz() != s.Numerology.SCSKHz() {
			fs.add(Warning, CodeSSBOverlap, l.Name, fmt.Sprintf("partitions[%d].startCrb", l.Index),
				"The %d kHz SS/PBCH blocks overlap partition %q (%d kHz) by %s; its symbols there must be left out around the blocks, and different spacings side by side interfere.",
				s.Numerology.SCSKHz(), l.Name, l.Numerology.SCSKHz(), fmtKHz(over))
		}
	}
	if tdd == nil {
		return
	}
	// The blocks are in time order, so one walk through the reference
	// symbols serves them all: a symbol that ends before a block starts
	// ends before every later block starts too.
	ref, r := walkSymbols(tdd.Reference), 0
	for i, b := range s.Blocks {
		if i > 0 && b.Start < s.Blocks[i-1].Start {
			ref, r = walkSymbols(tdd.Reference), 0 // out of order: start again
		}
		for ref.sym.End() <= b.Start {
			ref.next()
			if r++; r == len(tdd.RefDirs) {
				r = 0
			}
		}
		for rs, k := ref, r; rs.sym.Start < b.End; {
			if tdd.RefDirs[k] == Uplink {
				fs.add(Warning, CodeSSB, "", "ssb.bitmap", "SS/PBCH block %d (slot %d, symbol %d at %d kHz) falls on uplink symbols of the TDD pattern; leave it out of ssb.bitmap or move the pattern.", b.Index, b.Slot, b.Symbol, s.Numerology.SCSKHz())
				break
			}
			rs.next()
			if k++; k == len(tdd.RefDirs) {
				k = 0
			}
		}
	}
}
