package grid

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Result is what Compute makes of a Plan. Frequencies are relative to
// point A unless a name says otherwise.
type Result struct {
	Plan       Plan      // the plan with defaults filled and every partition placed by startCrb/sizePrb
	Channel    Channel   // the channel and, when known, its absolute frequencies
	Carriers   []Carrier // one per subcarrier spacing in use, ascending
	Partitions []Lattice // the partitions that could be placed, in plan order
	TDD        *TDD      // the TDD pattern, when the plan has a valid one
	SSB        *SSB      // the SS/PBCH blocks, when the plan places valid ones
	// SyncRaster is the band's synchronization raster inside the channel,
	// when the channel has an absolute frequency and a band.
	SyncRaster *SyncRaster
	Fit        *Fit // the numerology fit, when the plan describes its environment
	// Spectrum is how the carriers and partitions divide the channel.
	Spectrum Spectrum
	// Overlaps are the bands two partitions share, one per pair, in the
	// order of the overlap findings (the figure outlines them).
	Overlaps []Overlap
	Findings []Finding
	// Timing is the carrier's timing: N_TA,offset, the guard against the
	// cell range, the BWP switch delays (timingplan.go).
	Timing *PlanTiming
	// Advice weighs every numerology of the range against the environment,
	// when the plan describes one (advice.go).
	Advice *Advice
	// InitialAccess is CORESET#0, its monitoring occasions, the MIB fields
	// and the initial BWPs, when the plan asks for them and CORESET#0 fits.
	InitialAccess *InitialAccess
	// PRACH is the random-access configuration with its occasions over the
	// association period, when the plan has a prach block that can be placed
	// (prachplan.go).
	PRACH *PRACH
}

// HasErrors reports whether any finding is an Error.
func (r Result) HasErrors() bool {
	return slices.ContainsFunc(r.Findings, func(f Finding) bool { return f.Severity == Error })
}

// Carrier returns the SCS-specific carrier of a subcarrier spacing.
func (r Result) Carrier(scsKHz int) (Carrier, bool) {
	i := slices.IndexFunc(r.Carriers, func(c Carrier) bool { return c.SCSKHz == scsKHz })
	if i < 0 {
		return Carrier{}, false
	}
	return r.Carriers[i], true
}

// Channel is the channel bandwidth placed on the point A axis.
type Channel struct {
	Range        Range
	BandwidthMHz int
	Low, High    Hz // channel edges; High − Low is the channel bandwidth
	Center       Hz // the RF reference frequency
	// Absolute is true when the plan gives centerMHz or arfcn; then the
	// fields below hold absolute frequencies.
	Absolute       bool
	CenterHz       Hz
	PointAHz       Hz
	ARFCN          int // NR-ARFCN of the centre, when OnRaster
	OnRaster       bool
	PointAARFCN    int // NR-ARFCN of point A (absoluteFrequencyPointA), when PointAOnRaster
	PointAOnRaster bool
	// Band is the operating band the channel is checked against: the
	// plan's carrier.band, or the first of BandCandidates it passes; ""
	// when neither applies. Duplex is that band's duplex mode.
	Band           string
	BandCandidates []string // bands whose downlink range holds the channel, when Absolute and no band is named
	Duplex         string
	RasterKHz      int // ΔF_Raster of the band's channel raster that holds the centre (or applies), when Absolute
	// ULCenterHz and ULARFCN are the paired uplink carrier of an FDD band
	// at its duplex spacing, when HasUL.
	HasUL      bool
	ULCenterHz Hz
	ULARFCN    int
	// UsePercent is the share of the channel bandwidth that partitions occupy.
	UsePercent float64
}

// Abs converts a frequency relative to point A to an absolute one; valid
// only when c.Absolute.
func (c Channel) Abs(f Hz) Hz { return c.PointAHz + f }

// Carrier is the SCS-specific carrier of one subcarrier spacing
// (TS 38.331 SCS-SpecificCarrier): CRBs [OffsetToCarrier,
// OffsetToCarrier+CarrierBandwidth) of that spacing.
type Carrier struct {
	SCSKHz           int
	NRB              int // N_RB of TS 38.101 Table 5.3.2-1 for the channel bandwidth
	CarrierBandwidth int
	OffsetToCarrier  int
	Chosen           bool // the offset (and size, if it differs from NRB) was chosen by Compute
	Low, High        Hz   // outer edges of the carrier's subcarriers
	MinGuard         Hz   // TS 38.101 Table 5.3.3-1
	GuardLow         Hz   // Low − channel low edge
	GuardHigh        Hz   // channel high edge − High
}

// Lattice is one placed partition: its numerology over the span and its
// PRBs [StartCRB, StartCRB+SizePRB) in CRBs of its spacing.
type Lattice struct {
	Index      int // position in Plan.Partitions
	Name       string
	Numerology Numerology
	StartCRB   int
	SizePRB    int
	// LocationAndBandwidth is the RIV from the spacing's offsetToCarrier, or
	// −1 when the partition starts outside what a RIV can express.
	LocationAndBandwidth int
	Low, High            Hz // outer edges of the partition's subcarriers
	Direction            Direction
	Layers               int
	Modulation           string
	// PeakMbps is the TS 38.306 4.1.2 estimate; under a TDD pattern it is
	// scaled by Share, the fraction of the partition's symbols in its direction.
	PeakMbps float64
	Share    float64
	SpanMs   int
	// Dirs holds the TDD direction of every symbol of the span; nil without TDD.
	Dirs []SymbolDir
	// Timing is what the numerology buys in time on the plan's pattern;
	// nil when the partition sits below the TDD reference spacing.
	Timing *PartitionTiming
}

// SymbolCount is the number of OFDM symbols in the span.
func (l Lattice) SymbolCount() int { return l.Numerology.SymbolsPerSubframe() * l.SpanMs }

// SlotCount is the number of slots in the span.
func (l Lattice) SlotCount() int { return l.Numerology.SlotsPerSubframe() * l.SpanMs }

// REPerSlot is the number of resource elements in one slot: every subcarrier
// of every PRB in every symbol, before any reference signal or control.
func (l Lattice) REPerSlot() int { return l.SizePRB * 12 * l.Numerology.SymbolsPerSlot() }

// Width is the partition's bandwidth, SizePRB·12·SCS.
func (l Lattice) Width() Hz { return l.High - l.Low }

// Symbols lists every OFDM symbol of the partition over the span.
func (l Lattice) Symbols() []Symbol {
	out := make([]Symbol, l.SymbolCount())
	w := walkSymbols(l.Numerology)
	for k := range out {
		out[k] = w.sym
		w.next()
	}
	return out
}

// CRBEdge is the lower edge of CRB n of a subcarrier spacing: subcarrier 0
// of CRB 0 is centred on point A (TS 38.211 4.4.4.3), so the edge is
// n·12·SCS − SCS/2. Grids of different spacings are offset by half
// subcarriers and their CRB edges never coincide.
func CRBEdge(scsKHz, n int) Hz {
	scs := Hz(scsKHz) * 1000
	return Hz(n)*12*scs - scs/2
}

// pending is a partition between validation and placement.
type pending struct {
	index int
	field string // "partitions[i]"
	plan  *PartitionPlan
	num   Numerology
	place bool // its spacing, CP and bandwidth allow it to be placed
	dir   Direction
	bits  int
}

// Compute places every partition of p on the lattice of TS 38.211 and
// checks the plan. It never fails: what cannot be placed is left out of
// Result.Partitions and explained in Result.Findings.
func Compute(plan Plan) Result {
	p := plan.withDefaults()
	var fs findings

	if n := utf8.RuneCountInString(p.Name); n > MaxNameLen {
		fs.add(Error, CodeLimit, "", "name", "The plan name is %d characters long; at most %d are allowed.", n, MaxNameLen)
	}
	rng, rangeOK := parseFold(p.Carrier.Range, RangeNames(), ParseRange)
	if !rangeOK {
		fs.add(Error, CodeRange, "", "carrier.range", "carrier.range %q is not a frequency range; use %s.", p.Carrier.Range, JoinOr(RangeNames()))
	}
	p.Carrier.Range = rng.String()
	var tdd *TDD
	if p.TDD != nil {
		if t, ok := checkTDD(&fs, rng, p.TDD); ok {
			tdd = &t
		}
	}
	span := p.SpanMs
	switch {
	case span == 0 && tdd != nil:
		span = min(int((tdd.Period+TcPerSubframe-1)/TcPerSubframe), MaxSpanMs)
	case span == 0:
		span = 1
	case span < 1 || span > MaxSpanMs:
		fs.add(Error, CodeLimit, "", "spanMs", "spanMs is %d; it must be a whole number of milliseconds from 1 to %d.", span, MaxSpanMs)
		span = min(max(span, 1), MaxSpanMs)
	}
	bw := p.Carrier.BandwidthMHz
	bwKnown := slices.Contains(rng.AllBandwidths(), bw)
	if !bwKnown {
		fs.add(Error, CodeBandwidth, "", "carrier.bandwidthMHz", "carrier.bandwidthMHz %s is not a channel bandwidth of %s; use %s MHz.", given(bw), rng, JoinInts(rng.AllBandwidths()))
	}
	if g := p.NumerologyGapKHz; g != nil && (math.IsNaN(*g) || *g < 0 || *g > 1e6) {
		fs.add(Error, CodeLimit, "", "numerologyGapKHz", "numerologyGapKHz must be from 0 (no check) to 1000000 kHz.")
		p.NumerologyGapKHz = nil
	}

	if len(p.Partitions) == 0 {
		fs.add(Error, CodeEmpty, "", "partitions", "The plan has no partitions; add at least one.")
	}
	if n := len(p.Partitions); n > MaxPartitions {
		fs.add(Error, CodeLimit, "", "partitions", "The plan has %d partitions; at most %d are allowed, and only the first %d are placed.", n, MaxPartitions, MaxPartitions)
		p.Partitions = p.Partitions[:MaxPartitions]
	}

	parts := make([]pending, len(p.Partitions))
	for i := range p.Partitions {
		parts[i] = checkPartition(&fs, rng, bw, bwKnown, i, &p.Partitions[i], p.Partitions[:i])
	}

	// The subcarrier spacings in use set the SCS-specific carriers.
	var inUse []int
	for _, pt := range parts {
		if pt.place && !slices.Contains(inUse, pt.num.SCSKHz()) {
			inUse = append(inUse, pt.num.SCSKHz())
		}
	}
	slices.Sort(inUse)

	carriers, centre := placeCarriers(&fs, rng, bw, inUse, p.Carrier)
	res := Result{Carriers: carriers}
	res.Channel = Channel{Range: rng, BandwidthMHz: bw, Center: centre,
		Low: centre - Hz(bw)*5e5, High: centre + Hz(bw)*5e5}
	for i := range res.Carriers {
		c := &res.Carriers[i]
		c.GuardLow = c.Low - res.Channel.Low
		c.GuardHigh = res.Channel.High - c.High
		checkCarrierGuard(&fs, rng, bw, *c)
	}

	for _, pt := range parts {
		if !pt.place {
			continue
		}
		c, _ := res.Carrier(pt.num.SCSKHz())
		l := placePartition(&fs, rng, pt, c, span)
		res.Partitions = append(res.Partitions, l)
		pt.plan.StartCRB = &l.StartCRB
		pt.plan.SizePRB = l.SizePRB
		pt.plan.LocationAndBandwidth = nil
	}

	if tdd != nil {
		res.TDD = tdd
		applyTDD(&fs, *tdd, p.TDD.ReferenceSCSKHz, &res)
	}
	for i := range res.Partitions {
		l := &res.Partitions[i]
		l.PeakMbps = math.Round(l.PeakMbps*100) / 100
	}
	// The channel's absolute frequencies first: the overlap findings name
	// the edges that clear them in MHz.
	placeAbsolute(&fs, rng, &res.Channel, p.Carrier)
	res.Overlaps = checkOverlaps(&fs, res.Partitions, res.Channel)
	checkEdgeGuards(&fs, rng, bw, res.Channel, res.Partitions)
	checkNumerologyGaps(&fs, p.NumerologyGapKHz, res.Partitions)
	if rangeOK && (p.Carrier.Band != "" || res.Channel.Absolute) {
		checkBand(&fs, rng, &res.Channel, &p.Carrier, p.Partitions, inUse, bwKnown)
	}
	if p.SSB != nil && bwKnown {
		if s, ok := checkSSB(&fs, rng, p.SSB, res.Channel, res.Channel.CenterHz, res.Channel.Absolute, tdd != nil, span); ok {
			res.SSB = &s
			checkSSBOverlaps(&fs, s, res.Partitions, tdd)
			if res.Channel.Band != "" {
				fs = append(fs, s.CheckBand(res.Channel.Band)...)
			}
		}
	}
	if rangeOK && bwKnown {
		res.SyncRaster = syncRaster(res, rng, p.SSB)
	}
	if p.InitialAccess != nil {
		res.InitialAccess = checkInitialAccess(&fs, rng, p.InitialAccess, p.SSB, &res, tdd)
	}
	tin := checkTimingKeys(&fs, rng, &p)
	if p.Environment != nil && wantsFit(p.Environment) {
		if f, ok := checkFit(&fs, rng, p.Environment, res.Channel, res.Partitions); ok {
			res.Fit = f
		}
	}
	computeTiming(&fs, rng, tin, p.TDD != nil && tdd == nil, &res)
	if p.PRACH != nil && rangeOK {
		res.PRACH = checkPRACH(&fs, rng, p.PRACH, &res)
	}
	if e := p.Environment; e != nil && res.Timing != nil && (res.Fit != nil || !wantsFit(e)) {
		res.Advice = computeAdvice(rng, e, tin, res.Fit, &res)
	}
	res.Spectrum = spectrumOf(res.Channel, res.Carriers, res.Partitions)
	res.Channel.UsePercent = usePercent(res.Channel, res.Spectrum)

	p.SpanMs = span
	res.Plan = p
	res.Findings = fs
	return res
}

// parseFold accepts a name in any letter case and returns its value.
func parseFold[T any](s string, names []string, parse func(string) (T, bool)) (T, bool) {
	for _, n := range names {
		if strings.EqualFold(s, n) {
			return parse(n)
		}
	}
	return parse(s)
}

func checkPartition(fs *findings, rng Range, bw int, bwKnown bool, i int, pp *PartitionPlan, before []PartitionPlan) pending {
	f := fmt.Sprintf("partitions[%d]", i)
	pt := pending{index: i, field: f, plan: pp, place: true}
	who := pp.Name

	switch n := utf8.RuneCountInString(pp.Name); {
	case strings.TrimSpace(pp.Name) == "":
		fs.add(Error, CodeName, who, f+".name", "%s.name is empty; give every partition a name.", f)
	case n > MaxNameLen:
		fs.add(Error, CodeLimit, who, f+".name", "%s.name is %d characters long; at most %d are allowed.", f, n, MaxNameLen)
	default:
		if j := slices.IndexFunc(before, func(q PartitionPlan) bool { return q.Name == pp.Name }); j >= 0 {
			fs.add(Error, CodeName, who, f+".name", "%s.name %q is already the name of partitions[%d]; names must be unique.", f, pp.Name, j)
		} else if j := slices.IndexFunc(before, func(q PartitionPlan) bool { return visible(q.Name) == visible(pp.Name) }); j >= 0 {
			fs.add(Error, CodeName, who, f+".name", "%s.name %q looks the same as partitions[%d].name %q: they differ only in spaces or invisible characters; names must be told apart.", f, pp.Name, j, before[j].Name)
		}
	}

	mu, muOK := MuForSCS(pp.SCSKHz)
	if !muOK || !slices.Contains(rng.DataSCS(), pp.SCSKHz) {
		extra := ""
		if pp.SCSKHz == 240 {
			extra = " (240 kHz carries SS/PBCH blocks only, no data)"
		}
		fs.add(Error, CodeSCSRange, who, f+".scsKHz", "%s.scsKHz %s is not a data subcarrier spacing of %s%s; use %s kHz.", f, given(pp.SCSKHz), rng, extra, JoinInts(rng.DataSCS()))
		pt.place = false
	}
	cp, cpOK := parseFold(pp.CP, []string{"normal", "extended"}, ParseCP)
	switch {
	case !cpOK:
		fs.add(Error, CodeCP, who, f+".cp", "%s.cp %q is not a cyclic prefix; use normal or extended.", f, pp.CP)
		pt.place = false
	case cp == ExtendedCP && muOK && mu != 2:
		fs.add(Error, CodeCP, who, f+".cp", "%s.cp extended is defined only at 60 kHz (TS 38.211 Table 4.2-1); use normal at %d kHz.", f, pp.SCSKHz)
		pt.place = false
	}
	pp.CP = cp.String()
	pt.num = Numerology{Mu: mu, CP: cp}
	if pt.place && bwKnown {
		if _, ok := rng.NRB(pp.SCSKHz, bw); !ok {
			fs.add(Error, CodeBandwidth, who, "carrier.bandwidthMHz", "carrier.bandwidthMHz %d is not defined for %d kHz in %s (TS 38.101 Table 5.3.2-1); at %d kHz use %s MHz.", bw, pp.SCSKHz, rng, pp.SCSKHz, JoinInts(rng.Bandwidths(pp.SCSKHz)))
			pt.place = false
		}
	}
	if !bwKnown {
		pt.place = false
	}

	if d, ok := parseFold(pp.Direction, []string{"DL", "UL"}, parseDirection); ok {
		pt.dir = d
		pp.Direction = string(d)
		if pp.Layers < 1 || pp.Layers > d.MaxLayers() {
			fs.add(Error, CodeLayers, who, f+".layers", "%s.layers is %d; %s allows 1 to %d layers.", f, pp.Layers, d, d.MaxLayers())
		}
	} else {
		fs.add(Error, CodeDirection, who, f+".direction", "%s.direction %q is not a direction; use DL or UL.", f, pp.Direction)
		pt.dir = DL
	}
	if m, ok := parseFold(pp.Modulation, ModulationNames(), modulationName); ok {
		pp.Modulation = m
		pt.bits, _ = ModulationBits(m)
	} else {
		fs.add(Error, CodeModulation, who, f+".modulation", "%s.modulation %q is not a modulation; use %s.", f, pp.Modulation, JoinOr(ModulationNames()))
	}

	if pp.SizePRB == 0 && pp.LocationAndBandwidth == nil {
		fs.add(Error, CodeSize, who, f+".sizePrb", "%s has neither sizePrb nor locationAndBandwidth; give sizePrb (1 to %d PRBs) or locationAndBandwidth (0 to %d).", f, MaxPRB, MaxRIV)
		pt.place = false
	}
	if pp.SizePRB < 0 || pp.SizePRB > MaxPRB {
		fs.add(Error, CodeSize, who, f+".sizePrb", "%s.sizePrb is %d; it must be 1 to %d PRBs.", f, pp.SizePRB, MaxPRB)
		pt.place = false
	}
	if s := pp.StartCRB; s != nil && (*s < 0 || *s > MaxStartCRB) {
		fs.add(Error, CodeSize, who, f+".startCrb", "%s.startCrb is %d; it must be a CRB index from 0 to %d.", f, *s, MaxStartCRB)
		pt.place = false
	}
	if r := pp.LocationAndBandwidth; r != nil && (*r < 0 || *r > MaxRIV) {
		fs.add(Error, CodeRIV, who, f+".locationAndBandwidth", "%s.locationAndBandwidth is %d; it must be 0 to %d (TS 38.214 5.1.2.2.2 with N = %d).", f, *r, MaxRIV, RIVSize)
		pt.place = false
	}
	return pt
}

// visible is a name as a reader sees it: without surrounding spaces and
// without format characters (zero-width spaces, direction overrides).
func visible(name string) string {
	return strings.Map(func(r rune) rune {
		if unicode.Is(unicode.Cf, r) {
			return -1
		}
		return r
	}, strings.TrimSpace(name))
}

// given formats a number the user typed for a message; 0 is how a missing
// field arrives.
func given(n int) string {
	if n == 0 {
		return "is missing or 0, which"
	}
	return strconv.Itoa(n)
}

func parseDirection(s string) (Direction, bool) {
	switch Direction(s) {
	case DL, UL:
		return Direction(s), true
	}
	return "", false
}

func modulationName(s string) (string, bool) {
	_, ok := ModulationBits(s)
	return s, ok
}

// placeCarriers builds the SCS-specific carriers and returns them with the
// channel centre relative to point A. The centre is the RF reference
// frequency of the smallest-spacing carrier: its subcarrier 6·N_RB above
// the carrier's lowest subcarrier (TS 38.101-1 5.4.2.2).
func placeCarriers(fs *findings, rng Range, bw int, inUse []int, cp CarrierPlan) ([]Carrier, Hz) {
	for _, scs := range sortedKeys(cp.OffsetToCarrier) {
		field := fmt.Sprintf("carrier.offsetToCarrier.%d", scs)
		switch o := cp.OffsetToCarrier[scs]; {
		case !slices.Contains(rng.DataSCS(), scs):
			fs.add(Error, CodeOffset, "", field, "%s names %d kHz, which is not a data subcarrier spacing of %s; use %s kHz.", field, scs, rng, JoinInts(rng.DataSCS()))
		case o < 0 || o > MaxOffset:
			fs.add(Error, CodeOffset, "", field, "%s is %d; it must be 0 to %d CRBs (TS 38.331 SCS-SpecificCarrier).", field, o, MaxOffset)
		case !slices.Contains(inUse, scs):
			fs.add(Warning, CodeOffset, "", field, "%s is given but no partition uses %d kHz; it is ignored.", field, scs)
		}
	}
	for _, scs := range sortedKeys(cp.CarrierBandwidth) {
		field := fmt.Sprintf("carrier.carrierBandwidth.%d", scs)
		n := cp.CarrierBandwidth[scs]
		nrb, known := rng.NRB(scs, bw)
		switch {
		case !slices.Contains(rng.DataSCS(), scs):
			fs.add(Error, CodeBandwidth, "", field, "%s names %d kHz, which is not a data subcarrier spacing of %s; use %s kHz.", field, scs, rng, JoinInts(rng.DataSCS()))
		case known && (n < 1 || n > nrb):
			fs.add(Error, CodeBandwidth, "", field, "%s is %d; at %d kHz a %d MHz channel holds 1 to %d PRBs (N_RB, TS 38.101 Table 5.3.2-1).", field, n, scs, bw, nrb)
		case !slices.Contains(inUse, scs):
			fs.add(Warning, CodeBandwidth, "", field, "%s is given but no partition uses %d kHz; it is ignored.", field, scs)
		}
	}

	ref := inUse
	if len(ref) == 0 {
		// Nothing placeable: still put the channel on the axis, on the
		// smallest spacing the bandwidth allows, so it can be drawn.
		for _, scs := range rng.DataSCS() {
			if _, ok := rng.NRB(scs, bw); ok {
				ref = []int{scs}
				break
			}
		}
		if len(ref) == 0 {
			return nil, Hz(bw) * 5e5
		}
	}

	sizes := make(map[int]int, len(ref))
	given := make(map[int]bool, len(ref))
	for _, scs := range ref {
		nrb, _ := rng.NRB(scs, bw)
		sizes[scs] = nrb
		if n, ok := cp.CarrierBandwidth[scs]; ok && n >= 1 && n <= nrb {
			sizes[scs], given[scs] = n, true
		}
	}

	var offsets map[int]int
	var missing []int
	for _, scs := range inUse {
		if o, ok := cp.OffsetToCarrier[scs]; !ok || o < 0 || o > MaxOffset {
			missing = append(missing, scs)
		}
	}
	chosen := len(missing) > 0
	switch {
	case len(missing) == 0 && len(inUse) > 0:
		offsets = cp.OffsetToCarrier
	case len(missing) < len(inUse):
		fs.add(Error, CodeOffset, "", "carrier.offsetToCarrier", "carrier.offsetToCarrier has no valid offset for %s kHz; give one for every subcarrier spacing in use (%s kHz) or for none.", JoinInts(missing), JoinInts(inUse))
		fallthrough
	default:
		var note string
		offsets, note = chooseOffsets(rng, bw, ref, sizes, given)
		if len(inUse) > 1 {
			fs.add(Info, CodeAutoOffset, "", "carrier.offsetToCarrier", "gridloom chose offsetToCarrier %s%s", describeOffsets(ref, offsets), note)
		}
	}

	s0 := ref[0]
	nrb0, _ := rng.NRB(s0, bw)
	centre := (12*Hz(offsets[s0]) + 6*Hz(nrb0)) * Hz(s0) * 1000
	var out []Carrier
	for _, scs := range inUse {
		nrb, _ := rng.NRB(scs, bw)
		g, _ := rng.MinGuard(scs, bw)
		o := offsets[scs]
		low := CRBEdge(scs, o)
		out = append(out, Carrier{SCSKHz: scs, NRB: nrb, CarrierBandwidth: sizes[scs], OffsetToCarrier: o,
			Chosen: chosen, Low: low, High: low + Hz(sizes[scs])*12*Hz(scs)*1000, MinGuard: g})
	}
	return out, centre
}

func describeOffsets(scsList []int, offsets map[int]int) string {
	parts := make([]string, len(scsList))
	for i, scs := range scsList {
		parts[i] = fmt.Sprintf("%d kHz: %d", scs, offsets[scs])
	}
	return strings.Join(parts, ", ") + " CRBs"
}

// chooseOffsets places the SCS-specific carriers when the plan gives no
// offsets. The rule (also in the README):
//
//  1. The smallest spacing s0 anchors the channel: its carrier's subcarrier
//     6·N_RB is the channel centre, and point A lies offsetToCarrier(s0) CRBs
//     below the carrier's first CRB, as few as possible (usually 0).
//  2. Every other carrier takes the whole-CRB offset that keeps both its
//     minimum guardbands (TS 38.101 Table 5.3.3-1) and puts its midpoint
//     nearest the channel centre.
//  3. Where no whole-CRB offset keeps both guardbands at N_RB — the window
//     for the lower edge is only one subcarrier wide, and CRB steps are twelve
//     — a carrier whose size the plan leaves open gets N_RB − 1 PRBs, which
//     always fits. Offsets of s0 up to MaxOffset are tried before that.
//
// It returns the offsets and a note on any size it reduced.
func chooseOffsets(rng Range, bw int, ref []int, sizes map[int]int, given map[int]bool) (map[int]int, string) {
	s0 := ref[0]
	nrb0, _ := rng.NRB(s0, bw)
	half := Hz(bw) * 5e5
	others := ref[1:]
	found := make([]int, len(others))
	shrunk := make([]bool, len(others))
	// try fits every other carrier with point A o0 CRBs of s0 below the
	// anchor carrier; below reports that some carrier would need a negative
	// offset, which only a larger o0 can cure.
	try := func(o0 int, shrink bool) (ok, below bool) {
		centre := (12*Hz(o0) + 6*Hz(nrb0)) * Hz(s0) * 1000
		ok = true
		for i, scs := range others {
			o, fits, neg := fitCarrier(rng, bw, scs, sizes[scs], centre, half)
			shrunk[i] = false
			if !fits && shrink && !given[scs] {
				o, fits, neg = fitCarrier(rng, bw, scs, sizes[scs]-1, centre, half)
				shrunk[i] = fits
			}
			below = below || neg
			ok = ok && fits
			found[i] = o
		}
		return ok, below
	}
	// Whether a carrier fits depends on where point A falls modulo its CRB
	// width, which repeats every smax/s0 steps of o0; once no carrier needs a
	// negative offset, one such cycle decides.
	cycle := ref[len(ref)-1] / s0
	for _, shrink := range []bool{false, true} {
		clear := -1
		for o0 := 0; o0 <= MaxOffset && (clear < 0 || o0 < clear+cycle); o0++ {
			ok, below := try(o0, shrink)
			if !below && clear < 0 {
				clear = o0
			}
			if !ok {
				continue
			}
			offsets := map[int]int{s0: o0}
			note := ""
			for i, scs := range others {
				offsets[scs] = found[i]
				if shrunk[i] {
					sizes[scs]--
					note += fmt.Sprintf("; the %d kHz carrier has carrierBandwidth %d instead of N_RB %d, because no whole-CRB offset keeps both of its minimum guardbands at N_RB", scs, sizes[scs], sizes[scs]+1)
				}
			}
			return offsets, note + "."
		}
	}
	// Sizes the plan fixed leave no legal offset: centre each carrier as
	// well as the grid allows and let the guard checks speak.
	centre := 6 * Hz(nrb0) * Hz(s0) * 1000
	offsets := map[int]int{s0: 0}
	for _, scs := range others {
		offsets[scs] = max(0, centredOffset(scs, sizes[scs], centre))
	}
	return offsets, "; no offset keeps every minimum guardband with the carrierBandwidth given."
}

// fitCarrier returns the offset of a carrier of n PRBs at scsKHz whose
// lower and upper guards both reach the minimum, nearest the centre, with
// the channel [centre−half, centre+half) on the point A axis. negative
// reports that only a negative offset could fit.
func fitCarrier(rng Range, bw, scsKHz, n int, centre, half Hz) (offset int, ok, negative bool) {
	g, _ := rng.MinGuard(scsKHz, bw)
	scs := Hz(scsKHz) * 1000
	step := 12 * scs
	// CRBEdge(o) = o·step − scs/2 must lie in [centre−half+g, centre+half−g−n·step].
	lo := ceilDiv(centre-half+g+scs/2, step)
	hi := floorDiv(centre+half-g-Hz(n)*step+scs/2, step)
	if hi < 0 {
		return 0, false, true
	}
	lo = max(lo, 0)
	if lo > hi {
		return 0, false, false
	}
	return int(min(max(Hz(centredOffset(scsKHz, n, centre)), lo), hi)), true, false
}

// centredOffset is the offset that puts a carrier's midpoint nearest the centre.
func centredOffset(scsKHz, n int, centre Hz) int {
	scs := Hz(scsKHz) * 1000
	step := 12 * scs
	// midpoint = o·step − scs/2 + n·step/2
	x := centre + scs/2 - Hz(n)*step/2
	return int(floorDiv(2*x+step, 2*step))
}

func floorDiv(a, b Hz) Hz {
	q := a / b
	if a%b != 0 && (a < 0) != (b < 0) {
		q--
	}
	return q
}

func ceilDiv(a, b Hz) Hz { return -floorDiv(-a, b) }

func sortedKeys(m map[int]int) []int {
	keys := make([]int, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func checkCarrierGuard(fs *findings, rng Range, bw int, c Carrier) {
	field := fmt.Sprintf("carrier.offsetToCarrier.%d", c.SCSKHz)
	for _, side := range []struct {
		name  string
		guard Hz
	}{{"lower", c.GuardLow}, {"upper", c.GuardHigh}} {
		switch {
		case side.guard < 0:
			fs.add(Error, CodeEdgeGuard, "", field, "The %d kHz carrier (CRBs %d to %d) reaches %s beyond the channel's %s edge; change %s or carrier.carrierBandwidth.%d.",
				c.SCSKHz, c.OffsetToCarrier, c.OffsetToCarrier+c.CarrierBandwidth-1, fmtKHz(-side.guard), side.name, field, c.SCSKHz)
		case side.guard < c.MinGuard:
			fs.add(Warning, CodeEdgeGuard, "", field, "The %d kHz carrier leaves %s at the channel's %s edge, less than the minimum guardband of %s for %d kHz in %d MHz (%s Table 5.3.3-1); only the numerology sent next to the edge must keep its guardband (TS 38.101-1 5.3.3).",
				c.SCSKHz, fmtKHz(side.guard), side.name, fmtKHz(c.MinGuard), c.SCSKHz, bw, specFor(rng))
		}
	}
}

func specFor(rng Range) string {
	if rng == FR1 {
		return "TS 38.101-1"
	}
	return "TS 38.101-2"
}

// placePartition places a partition whose spacing, CP and bandwidth allow
// it. It always places it, as the plan asks, even outside its carrier: the
// findings say why that does not fit, and the figure shows where it went.
func placePartition(fs *findings, rng Range, pt pending, c Carrier, span int) Lattice {
	pp, f, who := pt.plan, pt.field, pt.plan.Name
	scs := pt.num.SCSKHz()
	start, size := c.OffsetToCarrier, pp.SizePRB
	if pp.StartCRB != nil {
		start = *pp.StartCRB
	}
	if r := pp.LocationAndBandwidth; r != nil {
		rs, rl, _ := DecodeRIV(*r)
		rivStart := c.OffsetToCarrier + rs
		if (pp.StartCRB != nil && *pp.StartCRB != rivStart) || (pp.SizePRB != 0 && pp.SizePRB != rl) {
			fs.add(Error, CodeRIV, who, f+".locationAndBandwidth", "%s.locationAndBandwidth %d means startCrb %d and sizePrb %d (RB_start %d from offsetToCarrier %d), but startCrb %s and sizePrb %d are given; give one or make them agree.",
				f, *r, rivStart, rl, rs, c.OffsetToCarrier, optInt(pp.StartCRB), pp.SizePRB)
		}
		if pp.StartCRB == nil {
			start = rivStart
		}
		if pp.SizePRB == 0 {
			size = rl
		}
	}
	end := start + size
	cEnd := c.OffsetToCarrier + c.CarrierBandwidth
	if start < c.OffsetToCarrier || end > cEnd {
		field := f + ".sizePrb"
		if start < c.OffsetToCarrier {
			field = f + ".startCrb"
		}
		fs.add(Error, CodeOutsideCarrier, who, field, "%s covers CRBs %d to %d, beyond the %d kHz carrier (CRBs %d to %d: offsetToCarrier %d, carrierBandwidth %d); keep startCrb from %d and startCrb + sizePrb up to %d.",
			f, start, end-1, scs, c.OffsetToCarrier, cEnd-1, c.OffsetToCarrier, c.CarrierBandwidth, c.OffsetToCarrier, cEnd)
	}
	riv, ok := EncodeRIV(start-c.OffsetToCarrier, size)
	if !ok {
		riv = -1
	}
	low := CRBEdge(scs, start)
	l := Lattice{Index: pt.index, Name: pp.Name, Numerology: pt.num, StartCRB: start, SizePRB: size,
		LocationAndBandwidth: riv, Low: low, High: low + Hz(size)*12*Hz(scs)*1000,
		Direction: pt.dir, Layers: pp.Layers, Modulation: pp.Modulation, SpanMs: span}
	l.Share = 1
	if pt.bits > 0 && pp.Layers >= 1 && pp.Layers <= pt.dir.MaxLayers() {
		l.PeakMbps = PeakMbps(rng, pt.dir, pt.num, size, pp.Layers, pt.bits)
	}
	return l
}

// applyTDD maps the TDD pattern onto every partition and scales the rate
// estimates. A partition below the reference spacing keeps no directions.
func applyTDD(fs *findings, t TDD, refKHz int, res *Result) {
	for i := range res.Partitions {
		l := &res.Partitions[i]
		if l.Numerology.Mu < t.Reference.Mu {
			fs.add(Error, CodeTDD, l.Name, fmt.Sprintf("partitions[%d].scsKHz", l.Index), "Partition %q uses %d kHz, below tdd.referenceScsKHz %d; the reference spacing must be at most every partition's spacing (TS 38.213 11.1).", l.Name, l.Numerology.SCSKHz(), refKHz)
			continue
		}
		dirs, straddles := t.Directions(*l)
		l.Dirs = dirs
		if len(straddles) > 0 {
			s := l.Numerology.SymbolAt(straddles[0])
			fs.add(Warning, CodeTDDStraddle, l.Name, fmt.Sprintf("partitions[%d].cp", l.Index), "Partition %q has %d symbols that straddle a downlink/uplink change of the %d kHz TDD pattern, the first slot %d symbol %d; they are marked flexible and cannot carry either direction whole.", l.Name, len(straddles), refKHz, s.Slot, s.Symbol)
		}
		want := Downlink
		if l.Direction == UL {
			want = Uplink
		}
		// The directions of a symbol depend on its time alone, so the span's
		// first period gives the share whenever the span holds a period.
		if per := t.symbolsPerPeriod(l.Numerology); per <= len(dirs) {
			l.Share = shareOf(dirs[:per], want)
		} else {
			l.Share = t.Share(*l, want)
		}
		l.PeakMbps *= l.Share
	}
}

func optInt(p *int) string {
	if p == nil {
		return "(none)"
	}
	return strconv.Itoa(*p)
}

// Overlap is the band two partitions share.
type Overlap struct {
	A, B      int // the partitions' indexes in the plan, A < B
	Low, High Hz  // the shared band, from point A
	// Error is true when both send in the same direction (an error
	// finding); a downlink and an uplink partition may share spectrum on a
	// TDD carrier (a warning).
	Error bool
}

func checkOverlaps(fs *findings, ls []Lattice, ch Channel) []Overlap {
	var out []Overlap
	for i, a := range ls {
		for _, b := range ls[i+1:] {
			lo, hi := max(a.Low, b.Low), min(a.High, b.High)
			over := hi - lo
			if over <= 0 {
				continue
			}
			out = append(out, Overlap{A: a.Index, B: b.Index, Low: lo, High: hi, Error: a.Direction == b.Direction})
			f := fmt.Sprintf("partitions[%d].startCrb", b.Index)
			why := ""
			if a.Numerology.SCSKHz() != b.Numerology.SCSKHz() && over < Hz(max(a.Numerology.SCSKHz(), b.Numerology.SCSKHz()))*1000 {
				why = fmt.Sprintf(": CRB edges of %d and %d kHz are offset by half a subcarrier (TS 38.211 4.4.4.3), so they never meet exactly; leave a CRB free between them", a.Numerology.SCSKHz(), b.Numerology.SCSKHz())
			}
			if a.Direction != b.Direction {
				fs.add(Warning, CodeOverlap, b.Name, f, "Partitions %q (%s) and %q (%s) share %s of spectrum%s; on a TDD carrier that is legal only if they never transmit at the same time.", a.Name, a.Direction, b.Name, b.Direction, fmtKHz(over), why)
				continue
			}
			fs.add(Error, CodeOverlap, b.Name, f, "Partitions %q (%s to %s) and %q (%s to %s) overlap by %s%s; %s.", a.Name, fmtKHz(a.Low), fmtKHz(a.High), b.Name, fmtKHz(b.Low), fmtKHz(b.High), fmtKHz(over), why, clearOverlap(a, b, ch))
		}
	}
	return out
}

// clearOverlap says how to part two overlapping partitions: the first CRB
// of its own grid at which the upper one clears the lower, or the most PRBs
// the lower one may keep below the upper (issue 19). CRB k of spacing Δf
// spans [12·k·Δf − Δf/2, 12·(k+1)·Δf − Δf/2) from point A, the outer edges
// of its subcarriers (TS 38.211 4.4.4.3 puts subcarrier 0 of CRB 0 on
// point A). When the channel has an absolute frequency, each advice also
// names the edge it puts the partition at in MHz.
func clearOverlap(a, b Lattice, ch Channel) string {
	lower, upper := a, b
	if b.Low < a.Low || (b.Low == a.Low && b.High < a.High) {
		lower, upper = b, a
	}
	scsU, scsL := Hz(upper.Numerology.SCSKHz())*1000, Hz(lower.Numerology.SCSKHz())*1000
	at := func(f Hz) string {
		if !ch.Absolute {
			return ""
		}
		return strconv.FormatFloat((ch.PointAHz+f).MHz(), 'f', -1, 64) + " MHz"
	}
	start := ceilDiv(lower.High+scsU/2, 12*scsU)
	s := fmt.Sprintf("to clear it, start %q at CRB %d or above", upper.Name, start)
	if e := at(12*start*scsU - scsU/2); e != "" {
		s += " (its lower edge at " + e + " or higher)"
	}
	if keep := floorDiv(upper.Low+scsL/2, 12*scsL) - Hz(lower.StartCRB); keep > 0 {
		s += fmt.Sprintf(", or shrink %q to %d PRBs or fewer", lower.Name, keep)
		if e := at(12*(Hz(lower.StartCRB)+keep)*scsL - scsL/2); e != "" {
			s += " (its upper edge at " + e + " or lower)"
		}
	}
	return s
}

// checkEdgeGuards applies the mixed-numerology rule of TS 38.101-1 5.3.3:
// the guardband at each channel edge is the one of the numerology sent
// immediately next to it.
func checkEdgeGuards(fs *findings, rng Range, bw int, ch Channel, ls []Lattice) {
	if len(ls) == 0 {
		return
	}
	lowest := slices.MinFunc(ls, func(a, b Lattice) int { return cmp.Compare(a.Low, b.Low) }).Low
	highest := slices.MaxFunc(ls, func(a, b Lattice) int { return cmp.Compare(a.High, b.High) }).High
	for _, l := range ls {
		scs := l.Numerology.SCSKHz()
		g, _ := rng.MinGuard(scs, bw)
		check := func(guard Hz, side, field string) {
			switch {
			case guard < 0:
				fs.add(Error, CodeEdgeGuard, l.Name, field, "Partition %q reaches %s beyond the channel's %s edge.", l.Name, fmtKHz(-guard), side)
			case guard < g:
				fs.add(Error, CodeEdgeGuard, l.Name, field, "Partition %q leaves %s at the channel's %s edge; at %d kHz in %d MHz the minimum guardband is %s (%s Table 5.3.3-1; the numerology next to the edge sets it, TS 38.101-1 5.3.3).",
					l.Name, fmtKHz(guard), side, scs, bw, fmtKHz(g), specFor(rng))
			}
		}
		if l.Low == lowest {
			check(l.Low-ch.Low, "lower", fmt.Sprintf("partitions[%d].startCrb", l.Index))
		}
		if l.High == highest {
			check(ch.High-l.High, "upper", fmt.Sprintf("partitions[%d].sizePrb", l.Index))
		}
	}
}

func checkNumerologyGaps(fs *findings, gapKHz *float64, ls []Lattice) {
	if gapKHz != nil && *gapKHz == 0 {
		return
	}
	sorted := slices.Clone(ls)
	slices.SortStableFunc(sorted, func(a, b Lattice) int { return cmp.Compare(a.Low, b.Low) })
	for i := 1; i < len(sorted); i++ {
		a, b := sorted[i-1], sorted[i]
		sa, sb := a.Numerology.SCSKHz(), b.Numerology.SCSKHz()
		if sa == sb {
			continue
		}
		want := Hz(max(sa, sb)) * 12 * 1000
		rule := fmt.Sprintf("one PRB of the wider spacing, %s", fmtKHz(want))
		if gapKHz != nil {
			want = Hz(math.Round(*gapKHz * 1000))
			rule = fmt.Sprintf("numerologyGapKHz %s", fmtKHz(want))
		}
		gap := b.Low - a.High
		if gap >= 0 && gap < want {
			fs.add(Warning, CodeNumerologyGap, b.Name, fmt.Sprintf("partitions[%d].startCrb", b.Index),
				"Partitions %q (%d kHz) and %q (%d kHz) are %s apart, less than %s; common practice (not a 3GPP rule) leaves a gap between numerologies against inter-numerology interference.",
				a.Name, sa, b.Name, sb, fmtKHz(gap), rule)
		}
	}
}

// placeAbsolute ties the point A axis to absolute frequency when the plan
// gives centerMHz or arfcn (TS 38.104 5.4.2.1).
func placeAbsolute(fs *findings, rng Range, ch *Channel, cp CarrierPlan) {
	var centre Hz
	have := false
	if m := cp.CenterMHz; m != nil {
		if math.IsNaN(*m) || math.IsInf(*m, 0) || *m <= 0 || *m > 100000 {
			fs.add(Error, CodeFrequency, "", "carrier.centerMHz", "carrier.centerMHz must be a frequency from 0 to 100000 MHz.")
		} else {
			centre, have = Hz(math.Round(*m*1e6)), true
			if _, on := FrequencyARFCN(centre); !on {
				below, above, _ := NearestARFCN(centre)
				fb, _ := ARFCNFrequency(below)
				fa, _ := ARFCNFrequency(above)
				fs.add(Error, CodeFrequency, "", "carrier.centerMHz", "carrier.centerMHz %s is not on the NR-ARFCN global raster (TS 38.104 5.4.2.1: %s); the nearest points are %s (%d) and %s (%d).",
					fmtMHz(centre), RasterRule, fmtMHz(fb), below, fmtMHz(fa), above)
			}
		}
	}
	if n := cp.ARFCN; n != nil {
		f, ok := ARFCNFrequency(*n)
		switch {
		case !ok:
			fs.add(Error, CodeFrequency, "", "carrier.arfcn", "carrier.arfcn %d is not an NR-ARFCN; it must be 0 to %d (TS 38.104 5.4.2.1).", *n, MaxARFCN)
		case have && f != centre:
			fs.add(Error, CodeFrequency, "", "carrier.arfcn", "carrier.arfcn %d is %s, but carrier.centerMHz is %s; give one or make them agree.", *n, fmtMHz(f), fmtMHz(centre))
		default:
			centre, have = f, true
		}
	}
	if !have {
		return
	}
	ch.Absolute = true
	ch.CenterHz = centre
	ch.PointAHz = centre - ch.Center
	ch.ARFCN, ch.OnRaster = FrequencyARFCN(centre)
	ch.PointAARFCN, ch.PointAOnRaster = FrequencyARFCN(ch.PointAHz)
	lo, hi := rng.Limits()
	if ch.Abs(ch.Low) < lo || ch.Abs(ch.High) > hi {
		fs.add(Error, CodeFrequency, "", "carrier.centerMHz", "The channel spans %s to %s, outside %s (%s to %s).",
			fmtMHz(ch.Abs(ch.Low)), fmtMHz(ch.Abs(ch.High)), rng, fmtMHz(lo), fmtMHz(hi))
	}
}

func fmtKHz(f Hz) string { return strconv.FormatFloat(f.KHz(), 'f', -1, 64) + " kHz" }

func fmtMHz(f Hz) string { return strconv.FormatFloat(f.MHz(), 'f', 3, 64) + " MHz" }
