package grid

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid/band"
	"gridloom/grid/prach"
)

// PRACHPlan is the random-access part of RACH-ConfigCommon and
// RACH-ConfigGeneric (TS 38.331), by their field names. Its zero values are
// the defaults each field names.
type PRACHPlan struct {
	// ConfigurationIndex is prach-ConfigurationIndex: a row of TS 38.211
	// Table 6.3.3.2-2, -3 or -4, chosen by the range and the band's duplex
	// mode; 0–255 (and 256–262 in FR1 unpaired spectrum).
	ConfigurationIndex int `json:"configurationIndex" yaml:"configurationIndex"`
	// Msg1SubcarrierSpacing is msg1-SubcarrierSpacing in kHz: 15 or 30 in
	// FR1, 60 or 120 in FR2 for the short formats. The long formats fix
	// their own spacing (1.25 or 5 kHz), which may be given or left at 0.
	// 0 means the initial uplink BWP's spacing for a short format.
	Msg1SubcarrierSpacing float64 `json:"msg1SubcarrierSpacing,omitempty" yaml:"msg1SubcarrierSpacing,omitempty"`
	// Msg1FDM is msg1-FDM, the occasions side by side in frequency: 1, 2, 4
	// or 8; 0 means 1.
	Msg1FDM int `json:"msg1FDM,omitempty" yaml:"msg1FDM,omitempty"`
	// Msg1FrequencyStart is msg1-FrequencyStart: the first PRB of the lowest
	// occasion, counted from the initial uplink BWP's first PRB, 0–274.
	Msg1FrequencyStart int `json:"msg1FrequencyStart,omitempty" yaml:"msg1FrequencyStart,omitempty"`
	// ZeroCorrelationZoneConfig (0–15) picks N_CS from TS 38.211 Tables
	// 6.3.3.1-5 to 6.3.3.1-7.
	ZeroCorrelationZoneConfig int `json:"zeroCorrelationZoneConfig,omitempty" yaml:"zeroCorrelationZoneConfig,omitempty"`
	// RestrictedSetConfig is unrestrictedSet, restrictedSetTypeA or
	// restrictedSetTypeB; "" means unrestrictedSet.
	RestrictedSetConfig string `json:"restrictedSetConfig,omitempty" yaml:"restrictedSetConfig,omitempty"`
	// SSBPerRachOccasion is the N of ssb-perRACH-OccasionAndCB-PreamblesPerSSB:
	// 1/8, 1/4, 1/2, 1, 2, 4, 8 or 16; "" means 1.
	SSBPerRachOccasion string `json:"ssbPerRachOccasion,omitempty" yaml:"ssbPerRachOccasion,omitempty"`
}

// Restricted sets by their TS 38.331 names.
var restrictedSets = map[string]prach.RestrictedSet{
	"unrestrictedSet":    prach.Unrestricted,
	"restrictedSetTypeA": prach.RestrictedTypeA,
	"restrictedSetTypeB": prach.RestrictedTypeB,
}

// ssbPerROValues are the values of ssb-perRACH-Occasion as the plan writes them.
var ssbPerROValues = []string{"1/8", "1/4", "1/2", "1", "2", "4", "8", "16"}

func parseSSBPerRO(s string) (prach.SSBPerRO, bool) {
	if !slices.Contains(ssbPerROValues, s) {
		return prach.SSBPerRO{}, false
	}
	if d, ok := strings.CutPrefix(s, "1/"); ok {
		n, _ := strconv.Atoi(d)
		return prach.SSBPerRO{Num: 1, Den: n}, true
	}
	n, _ := strconv.Atoi(s)
	return prach.SSBPerRO{Num: n, Den: 1}, true
}

// PRACH is the checked random-access configuration of a plan: the table row,
// the preamble, where its occasions lie over the association period in time
// (Tc from the start of frame 0) and frequency (relative to point A), which
// are valid (TS 38.213 8.1), which SS/PBCH blocks map onto each, and the
// cell range.
type PRACH struct {
	Table              string // "6.3.3.2-3"
	ConfigurationIndex int
	// Format is the format as the table prints it ("0", "B4", "A2/B2").
	Format         string
	SequenceLength int // L_RA: 839 or 139
	SCSHz          int // Δf^RA: 1250, 5000 or 15000·2^μ
	// PUSCHSCSKHz is the initial uplink BWP's spacing, the unit of
	// msg1-FrequencyStart and N_RB^RA (TS 38.211 Table 6.3.3.2-1).
	PUSCHSCSKHz int
	NRBRA       int // N_RB^RA, in PUSCH resource blocks
	KBar        int // k̄ of Table 6.3.3.2-1, in PRACH subcarriers
	FDM         int
	// FrequencyStart is msg1-FrequencyStart; StartCRB the CRB of the
	// BWP's spacing where the lowest occasion starts.
	FrequencyStart int
	StartCRB       int
	// BWP is the uplink BWP the occasions sit in: the initial uplink BWP of
	// initialAccess, or the default of defaultPRACHBWP; BWPSource says which.
	BWP       InitialBWP
	BWPSource string
	NCS       int
	// Range holds the cell radii in metres the preamble allows: from the
	// cyclic prefix, the guard time and N_CS; CellRangeKm is their limit.
	Range       prach.Range
	CellRangeKm float64
	// ConfigPeriodFrames is x of the table row; AssociationPeriodFrames the
	// association period of TS 38.213 Table 8.1-1 in frames (0 when the
	// blocks cannot be mapped within its longest value).
	ConfigPeriodFrames      int
	AssociationPeriodFrames int
	// AssociationPatternPeriodFrames is the association pattern period of
	// TS 38.213 8.1 in frames (0 without an association period), and
	// PatternNote says what makes it longer than the association period
	// ("" when it is not); see patternPeriod.
	AssociationPatternPeriodFrames int
	PatternNote                    string
	SSBPerRO                       string
	// ValidPer10ms counts the valid occasions in time and frequency per
	// 10 ms, averaged over the configuration period.
	ValidPer10ms float64
	// Occasions lists every occasion of the association period (or of one
	// configuration period when there is none), time first, then frequency.
	Occasions []PRACHOccasion
}

// PRACHOccasion is one PRACH occasion in time and frequency.
type PRACHOccasion struct {
	Frame int
	// Slot is the PRACH slot in the frame at Δf^RA (the subframe for the
	// long formats); StartSymbol the first symbol in that slot (for the
	// long formats l_0 of the table, in 15 kHz symbols of the subframe).
	Slot        int
	StartSymbol int
	FDM         int    // n_RA
	Format      string // the single format sent (A or B of a pair)
	Start, End  Tc     // from the start of frame 0
	Low, High   Hz     // the N_RB^RA resource blocks, relative to point A
	SSBIndexes  []int
	Valid       bool
	Reason      string // why it is valid or not (TS 38.213 8.1)
}

// prachParams are a PRACH plan's values once read and checked.
type prachParams struct {
	spec  prach.Spectrum
	cfg   prach.Config
	index int
	mu    int
	fdm   int
	start int
	zcz   int
	set   prach.RestrictedSet
	n     prach.SSBPerRO
	// finder marks the finder's run, which drops an index with an invalid
	// occasion and so needs no association pattern period for it.
	finder bool
}

const prachField = "prach"

// prachSpectrum chooses the configuration table from the range and the
// band's duplex mode; without a band the plan's TDD pattern decides
// (unpaired with one, paired without), as Compute does for the SS/PBCH
// candidates.
func prachSpectrum(res *Result) (prach.Spectrum, error) {
	fr := 1
	if res.Channel.Range.FR2() {
		fr = 2
	}
	paired := res.TDD == nil
	switch band.Duplex(res.Channel.Duplex) {
	case band.FDD, band.SUL:
		paired = true
	case band.TDD:
		paired = false
	case band.SDL:
		return 0, fmt.Errorf("band %s is supplementary downlink and carries no uplink, so it has no PRACH; remove prach or use a band with an uplink", res.Channel.Band)
	}
	return prach.TableFor(fr, paired)
}

// defaultPRACHBWP is the uplink BWP the occasions are placed in. With
// initialAccess it is the initial uplink BWP, as TS 38.211 5.3.2 says.
// Without it the plan names no initial uplink BWP, so the first uplink
// partition stands in: the BWP a planner would open random access on.
// Without an uplink partition on unpaired spectrum the first partition
// stands in, since there the uplink and downlink BWPs of an index share
// their place (TS 38.213 12).
func defaultPRACHBWP(res *Result, unpaired bool) (InitialBWP, string, bool) {
	if ia := res.InitialAccess; ia != nil && ia.InitialUL != nil {
		return *ia.InitialUL, "initialAccess.initialUplinkBWP", true
	}
	pick := func(l Lattice) InitialBWP {
		return InitialBWP{Source: "partition", Partition: l.Name, SCSKHz: l.Numerology.SCSKHz(), CP: l.Numerology.CP.String(),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, LocationAndBandwidth: l.LocationAndBandwidth, Low: l.Low, High: l.High}
	}
	for _, l := range res.Partitions {
		if l.Direction == UL {
			return pick(l), "the first uplink partition", true
		}
	}
	if unpaired && len(res.Partitions) > 0 {
		return pick(res.Partitions[0]), "the first partition", true
	}
	return InitialBWP{}, "", false
}

// readPRACH checks the keys of pp that need no lattice; bad reports an
// error finding and false.
func readPRACH(fs *findings, rng Range, spec prach.Spectrum, pp *PRACHPlan, puschKHz int) (prachParams, bool) {
	ok := true
	bad := func(field, format string, args ...any) {
		fs.add(Error, CodePRACH, "", prachField+"."+field, format, args...)
		ok = false
	}
	out := prachParams{spec: spec, index: pp.ConfigurationIndex, fdm: pp.Msg1FDM, start: pp.Msg1FrequencyStart, zcz: pp.ZeroCorrelationZoneConfig}
	cfg, err := prach.Lookup(spec, pp.ConfigurationIndex)
	if err != nil {
		bad("configurationIndex", "prach.configurationIndex is %d; TS 38.211 Table %s (%s) defines 0 to %d.",
			pp.ConfigurationIndex, spec.Table(), spectrumWords(spec), spec.Len()-1)
		return out, false
	}
	out.cfg = cfg
	if out.fdm == 0 {
		out.fdm = 1
	}
	if !slices.Contains([]int{1, 2, 4, 8}, out.fdm) {
		bad("msg1FDM", "prach.msg1FDM is %d; it must be 1, 2, 4 or 8.", pp.Msg1FDM)
	}
	if out.start < 0 || out.start > MaxPRB-1 {
		bad("msg1FrequencyStart", "prach.msg1FrequencyStart is %d; it must be 0 to %d.", out.start, MaxPRB-1)
	}
	set, known := restrictedSets[pp.RestrictedSetConfig]
	if pp.RestrictedSetConfig == "" {
		set, known = prach.Unrestricted, true
	}
	if !known {
		bad("restrictedSetConfig", "prach.restrictedSetConfig %q is not a restricted set; use unrestrictedSet, restrictedSetTypeA or restrictedSetTypeB.", pp.RestrictedSetConfig)
	}
	out.set = set
	n, nok := prach.SSBPerRO{Num: 1, Den: 1}, true
	if pp.SSBPerRachOccasion != "" {
		n, nok = parseSSBPerRO(pp.SSBPerRachOccasion)
	}
	if !nok {
		bad("ssbPerRachOccasion", "prach.ssbPerRachOccasion %q is not a value of ssb-perRACH-Occasion; use 1/8, 1/4, 1/2, 1, 2, 4, 8 or 16.", pp.SSBPerRachOccasion)
	}
	out.n = n
	if pp.ZeroCorrelationZoneConfig < 0 || pp.ZeroCorrelationZoneConfig > 15 {
		bad("zeroCorrelationZoneConfig", "prach.zeroCorrelationZoneConfig is %d; it must be 0 to 15.", pp.ZeroCorrelationZoneConfig)
	} else if known {
		if _, err := prach.NCS(cfg.Format, pp.ZeroCorrelationZoneConfig, set); err != nil {
			bad("zeroCorrelationZoneConfig", "%s.", capitalise(err.Error()))
		}
	}
	// The spacing: fixed by a long format, chosen among two for a short one.
	a, _ := cfg.Format.Pair()
	pre, _ := prach.PreambleOf(a)
	scs := pp.Msg1SubcarrierSpacing
	if cfg.Format.Long() {
		fixed := float64(pre.SCSHz) / 1000
		if scs != 0 && scs != fixed {
			bad("msg1SubcarrierSpacing", "prach.msg1SubcarrierSpacing is %s kHz, but preamble format %v of index %d fixes %s kHz; give %s or leave it out.",
				fmtNum(scs), cfg.Format, pp.ConfigurationIndex, fmtNum(fixed), fmtNum(fixed))
		}
		return out, ok
	}
	allowed := []int{15, 30}
	if spec.FR() == 2 {
		allowed = []int{60, 120}
		if rng == FR2_2 {
			// FR2-2 carries 120 kHz among the spacings TS 38.211 6.3.3.2 allows
			// for L_RA = 139 there (480 and 960 kHz need L_RA 571/1151, not
			// modelled); 60 kHz is not an FR2-2 numerology (from memory).
			allowed = []int{120}
		}
	}
	if scs == 0 {
		scs = float64(puschKHz)
	}
	if scs != math.Trunc(scs) || !slices.Contains(allowed, int(scs)) {
		what := fmt.Sprintf("prach.msg1SubcarrierSpacing is %s kHz", fmtNum(scs))
		if pp.Msg1SubcarrierSpacing == 0 {
			what = fmt.Sprintf("prach.msg1SubcarrierSpacing is not given and the uplink BWP's %d kHz does not serve", puschKHz)
		}
		bad("msg1SubcarrierSpacing", "%s; preamble format %v of index %d in %s allows %s kHz.", what, cfg.Format, pp.ConfigurationIndex, rng, joinIntsOr(allowed))
		return out, false
	}
	out.mu, _ = MuForSCS(int(scs))
	return out, ok
}

func spectrumWords(s prach.Spectrum) string {
	switch s {
	case prach.FR1Paired:
		return "FR1, paired spectrum or supplementary uplink"
	case prach.FR1Unpaired:
		return "FR1, unpaired spectrum"
	}
	return "FR2, unpaired spectrum"
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

func fmtNum(f float64) string { return strconv.FormatFloat(f, 'f', -1, 64) }

func joinIntsOr(v []int) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = strconv.Itoa(x)
	}
	return JoinOr(s)
}

// prachLayout is one radio frame of the carrier for TS 38.213 8.1: the TDD
// direction of each symbol and the SS/PBCH symbols, on the finer of the
// TDD reference and the SS/PBCH numerologies (at most 120 kHz; a 240 kHz
// block marks the 120 kHz symbols it overlaps).
//
// Readings: blocks are marked in the first half frame of every frame (and
// the second with a 5 ms period): the layout assumes every frame alike, and
// marking the blocks in frames that carry none keeps an occasion valid in
// every frame. A TDD pattern of 20 ms (P + P2 not dividing 10 ms) merges
// its two frames the same way: a symbol is uplink only when uplink in both
// and downlink when downlink in either.
func prachLayout(res *Result, unpaired bool) prach.Layout {
	mu := 0
	if res.TDD != nil {
		mu = res.TDD.Reference.Mu
	}
	if res.SSB != nil {
		mu = max(mu, res.SSB.Numerology.Mu)
	}
	mu = min(mu, 3)
	n := 10 * 14 << mu
	l := prach.Layout{Mu: mu, SSB: make([]bool, n), Paired: !unpaired}
	startOf := func(k int) Tc { return Tc(prach.SymbolStartTc(mu, k)) }
	// mark sets every layout symbol overlapping [a, b).
	mark := func(a, b Tc) {
		k := int(int64(a) * int64(n) / int64(10*TcPerSubframe))
		k = max(0, k-1)
		for ; k < n && startOf(k) < b; k++ {
			if startOf(k+1) > a {
				l.SSB[k] = true
			}
		}
	}
	if s := res.SSB; s != nil {
		halves := []Tc{0}
		if s.PeriodMs == 5 {
			halves = append(halves, 5*TcPerSubframe)
		}
		for i, first := range s.first {
			if !s.sent[i] {
				continue
			}
			a, b := s.Numerology.SymbolAt(first), s.Numerology.SymbolAt(first+3)
			for _, h := range halves {
				mark(h+a.Start, h+b.End())
			}
		}
	}
	if t := res.TDD; t != nil && unpaired {
		l.Dir = make([]prach.Direction, n)
		frames := 1
		if (10*TcPerSubframe)%t.Period != 0 {
			frames = 2
		}
		perFrame := t.Reference.SymbolsPerSubframe() * 10
		for f := range frames {
			j := f * perFrame
			off := Tc(f) * 10 * TcPerSubframe
			for k := range n {
				a, b := off+startOf(k), off+startOf(k+1)
				for t.Reference.SymbolAt(j).End() <= a {
					j++
				}
				d := prach.Uplink
				for jj := j; t.Reference.SymbolAt(jj).Start < b; jj++ {
					switch t.RefDirs[jj%len(t.RefDirs)] {
					case Downlink:
						d = prach.Downlink
					case Flexible:
						if d == prach.Uplink {
							d = prach.Flexible
						}
					}
				}
				if f == 0 || d == prach.Downlink || (d == prach.Flexible && l.Dir[k] == prach.Uplink) {
					l.Dir[k] = d
				}
			}
		}
	}
	return l
}

// checkPRACH computes the PRACH of a plan from its Result: the plan's
// SS/PBCH blocks, TDD pattern, band and uplink BWP must be known first.
func checkPRACH(fs *findings, rng Range, pp *PRACHPlan, res *Result) *PRACH {
	spec, err := prachSpectrum(res)
	if err != nil {
		fs.add(Error, CodePRACH, "", prachField, "%s.", capitalise(strings.TrimSuffix(err.Error(), ".")))
		return nil
	}
	if res.SSB == nil {
		fs.add(Error, CodePRACH, "", prachField, "prach needs the SS/PBCH blocks (the ssb block, placed without errors): TS 38.213 8.1 maps them onto the PRACH occasions.")
		return nil
	}
	unpaired := spec != prach.FR1Paired
	bwp, source, found := defaultPRACHBWP(res, unpaired)
	if !found {
		fs.add(Error, CodePRACH, "", prachField, "prach needs an uplink BWP for its occasions: give initialAccess.initialUplinkBWP or a partition with direction UL.")
		return nil
	}
	pr, ok := readPRACH(fs, rng, spec, pp, bwp.SCSKHz)
	if !ok {
		return nil
	}
	return buildPRACH(fs, pr, res, bwp, source, prachLayout(res, unpaired), nil)
}

// validities remembers the verdict of TS 38.213 8.1 on an occasion (with
// SFN 0) under one layout, and under the same layout without its SS/PBCH
// blocks (bare): the finder's indexes share most occasions.
type validities map[validityKey]prach.Validity

type validityKey struct {
	o    prach.Occasion
	bare bool
}

// judge returns the verdict on o (whose SFN is ignored) under layout, or
// under bare when bare is true, remembering it in seen.
func (seen validities) judge(o prach.Occasion, layout prach.Layout, isBare bool) (prach.Validity, error) {
	o.SFN = 0
	key := validityKey{o, isBare}
	if v, known := seen[key]; known {
		return v, nil
	}
	if isBare {
		layout.SSB = make([]bool, len(layout.SSB))
	}
	v, err := prach.Valid(o, layout)
	if err == nil {
		seen[key] = v
	}
	return v, err
}

// buildPRACH places the occasions of pr and checks them; the keys of pr are
// valid. seen may be nil; the finder shares one across the indexes.
func buildPRACH(fs *findings, pr prachParams, res *Result, bwp InitialBWP, source string, layout prach.Layout, seen validities) *PRACH {
	if seen == nil {
		seen = validities{}
	}
	cfg := pr.cfg
	a, _ := cfg.Format.Pair()
	pre, _ := prach.PreambleOf(a)
	ncs, _ := prach.NCS(cfg.Format, pr.zcz, pr.set)
	out := &PRACH{Table: pr.spec.Table(), ConfigurationIndex: pr.index, Format: cfg.Format.String(), SequenceLength: pre.LRA,
		SCSHz: pre.ScsHz(pr.mu), PUSCHSCSKHz: bwp.SCSKHz, FDM: pr.fdm, FrequencyStart: pr.start, BWP: bwp, BWPSource: source,
		NCS: ncs, ConfigPeriodFrames: cfg.X, SSBPerRO: pr.n.String()}
	alloc, err := prach.AllocationFor(pre.LRA, out.SCSHz, bwp.SCSKHz*1000)
	if err != nil {
		fs.add(Error, CodePRACH, "", prachField+".msg1SubcarrierSpacing", "TS 38.211 Table 6.3.3.2-1 has no row for a PRACH spacing of %s kHz (format %v) in an uplink BWP of %d kHz; with L_RA = 839 the BWP must be 15, 30 or 60 kHz, with 15 or 30 kHz PRACH 15–60 kHz, with 60 or 120 kHz PRACH 60 or 120 kHz.",
			fmtNum(float64(out.SCSHz)/1000), cfg.Format, bwp.SCSKHz)
		return nil
	}
	out.NRBRA, out.KBar = alloc.NRB, alloc.KBar
	out.StartCRB = bwp.StartCRB + pr.start

	// Frequency: msg1-FDM occasions side by side from msg1-FrequencyStart.
	width := pr.fdm * alloc.NRB
	if pr.start+width > bwp.SizePRB {
		fs.add(Error, CodePRACH, "", prachField+".msg1FrequencyStart", "The %d PRACH occasions side by side (msg1-FDM %d × N_RB^RA %d PRBs of %d kHz) from msg1-FrequencyStart %d end at PRB %d, beyond the %d PRBs of the uplink BWP (%s); msg1-FrequencyStart may be at most %d, or lower msg1-FDM.",
			pr.fdm, pr.fdm, alloc.NRB, bwp.SCSKHz, pr.start, pr.start+width, bwp.SizePRB, source, max(-1, bwp.SizePRB-width))
	}
	if c, ok := res.Carrier(bwp.SCSKHz); ok {
		if out.StartCRB < c.OffsetToCarrier || out.StartCRB+width > c.OffsetToCarrier+c.CarrierBandwidth {
			fs.add(Error, CodePRACH, "", prachField+".msg1FrequencyStart", "The PRACH occasions span CRBs %d to %d of %d kHz, outside the carrier's CRBs %d to %d.",
				out.StartCRB, out.StartCRB+width-1, bwp.SCSKHz, c.OffsetToCarrier, c.OffsetToCarrier+c.CarrierBandwidth-1)
		}
	} else {
		fs.add(Error, CodePRACH, "", prachField, "The plan has no %d kHz carrier for the uplink BWP the PRACH occasions sit in.", bwp.SCSKHz)
	}

	// Time: the occasions of one frame that carries them, with their
	// validity, which is the same in every such frame (the layout repeats).
	var frame []prach.Occasion
	var verdict []prach.Validity
	for sfn := range cfg.X {
		if !cfg.InFrame(sfn) {
			continue
		}
		occ, err := prach.Occasions(pr.spec, pr.index, sfn, pr.mu)
		if err != nil {
			fs.add(Error, CodePRACH, "", prachField, "%s.", capitalise(err.Error()))
			return nil
		}
		frame = occ
		break
	}
	nValid := 0
	firstBad := ""
	for _, o := range frame {
		v, err := seen.judge(o, layout, false)
		if err != nil {
			fs.add(Error, CodePRACH, "", prachField, "%s.", capitalise(err.Error()))
			return nil
		}
		verdict = append(verdict, v)
		if v.Valid {
			nValid++
		} else if firstBad == "" {
			firstBad = fmt.Sprintf("slot %d, symbol %d: %s", o.Slot, o.Symbol%14, v.Reason)
		}
	}
	framesWith := len(cfg.Y)
	out.ValidPer10ms = float64(nValid*pr.fdm*framesWith) / float64(cfg.X)

	// The cell range: the least over the occasions, since the 16κ of
	// TS 38.211 5.3.2 lengthens the cyclic prefix of some of them only and a
	// pair sends two formats.
	for _, o := range frame {
		r, err := prach.CellRange(o, ncs)
		if err == nil && (out.Range.Limit == 0 || r.Limit < out.Range.Limit) {
			out.Range = r
		}
	}
	out.CellRangeKm = math.Round(out.Range.Limit) / 1000

	// The association period and the SS/PBCH blocks of each occasion.
	var sent []int
	for i, s := range res.SSB.sent {
		if s {
			sent = append(sent, i)
		}
	}
	// TS 38.213 8.1: the association period is the least value of Table
	// 8.1-1 (1, 2, 4, 8 or 16 configuration periods, at most 160 ms) whose
	// valid occasions map every sent block at least once; blocks go to
	// occasions by preamble, then frequency, then time, in whole mapping
	// cycles. prach.Associate does the same; this walk reuses the verdicts
	// above instead of judging every occasion again (TestPRACHMappingAgreesWithAssociate).
	if len(sent) == 0 {
		fs.add(Error, CodePRACH, "", "ssb.bitmap", "The SS/PBCH bitmap sends no block, so none can map onto the PRACH occasions; send at least one.")
		return nil
	}
	perPeriod := nValid * pr.fdm * framesWith
	perCycle := occasionsPerCycle(pr.n, len(sent))
	periods := 0
	for p := 1; p*cfg.X <= 16; p *= 2 {
		if p*perPeriod >= perCycle {
			periods = p
			break
		}
	}
	mapped := 0
	if periods > 0 {
		out.AssociationPeriodFrames = periods * cfg.X
		mapped = periods * perPeriod / perCycle * perCycle
		if !pr.finder || nValid == len(frame) {
			out.AssociationPatternPeriodFrames, out.PatternNote = patternPeriod(out.AssociationPeriodFrames, frame, verdict, res, layout, seen)
		}
	}
	var aerr error
	if periods == 0 {
		aerr = fmt.Errorf("no association period")
		periods = 1
	}
	switch {
	case nValid == 0:
		fs.add(Error, CodePRACH, "", prachField+".configurationIndex", "None of the %d PRACH occasions of index %d (format %v) is valid under TS 38.213 8.1 on this TDD pattern and these SS/PBCH blocks (%s); `gridloom prach` lists the indexes that fit.",
			len(frame), pr.index, cfg.Format, firstBad)
	case aerr != nil:
		fs.add(Error, CodePRACH, "", prachField+".ssbPerRachOccasion", "The %d sent SS/PBCH blocks at %v per occasion need %d PRACH occasions, but index %d with msg1-FDM %d gives %d valid per %d ms configuration period, too few within the longest association period of TS 38.213 Table 8.1-1; raise ssbPerRachOccasion or msg1-FDM, or pick a denser index.",
			len(sent), pr.n, occasionsPerCycle(pr.n, len(sent)), pr.index, pr.fdm, nValid*pr.fdm*framesWith, 10*cfg.X)
	case nValid < len(frame):
		fs.add(Warning, CodePRACH, "", prachField+".configurationIndex", "%d of the %d PRACH occasions per frame of index %d are not valid under TS 38.213 8.1 and go unused (first: %s).",
			len(frame)-nValid, len(frame), pr.index, firstBad)
	}
	if t := res.Timing; t != nil && t.HasGuard && ncs > 0 && out.Range.ZeroCorrelation < t.MaxCellRadiusM {
		fix := "Raise zeroCorrelationZoneConfig."
		if pr.zcz == 15 {
			fix = "No higher zeroCorrelationZoneConfig exists; a long format (L_RA = 839) or a lower PRACH spacing reaches further."
		}
		fs.add(Warning, CodePRACH, "", prachField+".zeroCorrelationZoneConfig", "zeroCorrelationZoneConfig %d gives N_CS = %d, a cyclic-shift range of %.2f km, below the %.2f km the TDD pattern's guard period allows; a UE beyond it aliases onto the next preamble's shift. %s",
			pr.zcz, ncs, out.Range.ZeroCorrelation/1000, t.MaxCellRadiusM/1000, fix)
	}

	// Every occasion of the association period, valid or not.
	k := 0 // valid occasions so far, in mapping order
	for p := range periods {
		for sfn := range cfg.X {
			if !cfg.InFrame(sfn) {
				continue
			}
			shift := Tc(p*cfg.X+sfn) * 10 * TcPerSubframe
			for i, o := range frame {
				for f := range pr.fdm {
					lo := bwp.StartCRB + pr.start + f*alloc.NRB
					po := PRACHOccasion{Frame: p*cfg.X + sfn, Slot: o.Slot, StartSymbol: o.Symbol % 14, FDM: f, Format: o.Format.String(),
						Start: shift + Tc(o.StartTc), End: shift + Tc(o.EndTc),
						Low: CRBEdge(bwp.SCSKHz, lo), High: CRBEdge(bwp.SCSKHz, lo+alloc.NRB),
						Valid: verdict[i].Valid, Reason: verdict[i].Reason}
					if po.Valid {
						if k < mapped {
							j := k % perCycle
							if pr.n.Den > 1 {
								po.SSBIndexes = []int{sent[j/pr.n.Den]}
							} else {
								po.SSBIndexes = slices.Clone(sent[j*pr.n.Num : min((j+1)*pr.n.Num, len(sent))])
							}
						}
						k++
					}
					out.Occasions = append(out.Occasions, po)
				}
			}
		}
	}
	return out
}

// patternPeriod is the association pattern period of TS 38.213 8.1 in
// frames, with what makes it longer than the association period in words.
// The occasions of one frame are judged as if every frame carried its
// SS/PBCH blocks (prachLayout), so the occasions gridloom lists repeat every
// association period. A UE judges each frame as it is: where blocks come
// every 20 ms or more, the frames without them may validate occasions the
// blocks rule out, and a TDD pattern of 20 ms differs between even and odd
// frames; the pattern between occasions and blocks then repeats only when
// the association period and those frames start together again
// (prach.AssociationPatternPeriod). Paired spectrum validates every
// occasion, so its pattern is the association period.
func patternPeriod(assoc int, frame []prach.Occasion, verdict []prach.Validity, res *Result, layout prach.Layout, seen validities) (int, string) {
	repeat := 1
	var why []string
	if !layout.Paired {
		if s := res.SSB; s != nil && s.PeriodMs > 10 {
			more := 0
			for i, o := range frame {
				if verdict[i].Valid {
					continue // valid with the blocks, so without them too
				}
				if v, err := seen.judge(o, layout, true); err == nil && v.Valid {
					more++
				}
			}
			if more > 0 {
				repeat = s.PeriodMs / 10
				why = append(why, fmt.Sprintf("the SS/PBCH blocks come every %d ms, and in the frames without them %d more occasion(s) per frame would be valid", s.PeriodMs, more))
			}
		}
		if t := res.TDD; t != nil && (10*TcPerSubframe)%t.Period != 0 {
			repeat = max(repeat, 2) // both are 1, 2, 4, 8 or 16
			why = append(why, "the TDD pattern repeats every 20 ms")
		}
	}
	p, err := prach.AssociationPatternPeriod(assoc, repeat)
	if err != nil {
		return 0, ""
	}
	if p == assoc {
		return p, ""
	}
	return p, strings.Join(why, "; ")
}

// occasionsPerCycle is how many occasions map every sent block once:
// 1/N per block when N < 1, ⌈blocks/N⌉ when N ≥ 1 (TS 38.213 8.1).
func occasionsPerCycle(n prach.SSBPerRO, blocks int) int {
	if n.Den > 1 {
		return blocks * n.Den
	}
	return (blocks + n.Num - 1) / n.Num
}

// PRACHSpan is how much of the association period a figure shows: the
// figure's time axis runs from the start of frame 0 over the plan's span,
// at most MaxSpanMs.
type PRACHSpan struct {
	// Shown counts the occasions (time × msg1-FDM) that start within the
	// span; Total those of the association period (PRACH.Occasions).
	Shown, Total int
	// Next is the first occasion that starts at or after the span's end;
	// nil when every occasion is shown.
	Next *PRACHOccasion
	// FitMs is the least span, at most MaxSpanMs, that holds every
	// occasion of frame 0 whole (0 when frame 0 has none), and FitShown
	// how many occasions that span shows.
	FitMs, FitShown int
}

// InSpan tells what a figure over spanMs milliseconds from frame 0 shows of
// p's occasions. A configuration whose occasions lie in other frames only
// (n_SFN mod x = y with y ≠ 0), or whose association period is longer than
// a frame, can never be shown whole: the figure starts at frame 0.
func (p *PRACH) InSpan(spanMs int) PRACHSpan {
	span := Tc(spanMs) * TcPerSubframe
	out := PRACHSpan{Total: len(p.Occasions)}
	var end0 Tc
	for i, o := range p.Occasions {
		if o.Start < span {
			out.Shown++
		} else if out.Next == nil {
			out.Next = &p.Occasions[i]
		}
		if o.Frame == 0 {
			end0 = max(end0, o.End)
		}
	}
	if end0 > 0 {
		out.FitMs = min(int((end0+TcPerSubframe-1)/TcPerSubframe), MaxSpanMs)
		fit := Tc(out.FitMs) * TcPerSubframe
		for _, o := range p.Occasions {
			if o.Start < fit {
				out.FitShown++
			}
		}
	}
	return out
}
