package planform

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/gscn"
)

// Form is the plan form as the user typed it: every value a string, so that
// a value that does not parse is kept and shown again beside its control.
//
// The query string of a page holds the whole plan, so that a link reproduces
// it. Keys are short and stable; they are part of every shared link:
//
//	name span range band bw fc arfcn nta gap     plan and carrier
//	off.SCS cbw.SCS                              offsetToCarrier, carrierBandwidth per SCS (kHz)
//	tdd.ref tdd.ms tdd.dl tdd.dlsym tdd.ul tdd.ulsym   TDD reference SCS and pattern1
//	tdd2.ms tdd2.dl tdd2.dlsym tdd2.ul tdd2.ulsym      pattern2
//	ssb.scs ssb.case ssb.bitmap ssb.off ssb.k ssb.common ssb.period ssb.gscn
//	env.ds env.profile env.speed env.fc          radio channel for the numerology fit
//	env.radius env.latency                       and for the timing advice
//	ia.coreset ia.ss0 ia.dmrs                    initial access: pdcch-ConfigSIB1, dmrs-TypeA-Position
//	ia.dl.part ia.dl.start ia.dl.size ia.dl.riv ia.dl.scs ia.dl.cp   initial downlink BWP
//	ia.ul.*                                      initial uplink BWP, the same keys
//	prach.idx prach.scs prach.fdm prach.start prach.zcz prach.set prach.ssbro   RACH-ConfigCommon
//	pI.name pI.scs pI.cp pI.start pI.size        partition I, from 0
//	pI.riv pI.dir pI.layers pI.mod pI.cap pI.dmrs
//
// Fields lists them with their plan paths. An absent key and an empty value
// mean the same: the plan field is left out, and a block (tdd, pattern2,
// ssb, env) is in the plan when any of its keys has a value. Other keys are
// ignored, so "op" and "download" can ride along.
type Form struct {
	Name, Span, Range, Band, Bandwidth, Center, ARFCN, NTA, Gap string
	Offset                                                      map[int]string // subcarrier spacing (kHz) → offsetToCarrier as typed
	CarrierBW                                                   map[int]string // subcarrier spacing (kHz) → carrierBandwidth as typed
	TDD                                                         TDDForm
	SSB                                                         SSBForm
	Env                                                         EnvForm
	Init                                                        InitForm
	PRACH                                                       PRACHForm
	Parts                                                       []PartForm
}

// TDDForm is the TDD pattern of a Form: the reference spacing and up to two
// patterns.
type TDDForm struct {
	Ref    string
	P1, P2 PatternForm
}

// PatternForm is one TDD-UL-DL-Pattern of a Form.
type PatternForm struct{ Ms, DL, DLSym, UL, ULSym string }

// SSBForm is the SS/PBCH block configuration of a Form.
type SSBForm struct{ SCS, Case, Bitmap, Off, K, Common, Period, GSCN string }

// EnvForm is the radio channel of a Form, for the numerology fit.
type EnvForm struct{ DelayNs, Profile, Speed, CarrierMHz, RadiusKm, LatencyMs string }

// InitForm is the initial access of a Form: pdcch-ConfigSIB1's two rows,
// dmrs-TypeA-Position, and the initial BWPs.
type InitForm struct {
	CORESET, SS0, DMRS string
	DL, UL             BWPForm
}

// PRACHForm is the random access of a Form: prach-ConfigurationIndex,
// msg1-SubcarrierSpacing, msg1-FDM, msg1-FrequencyStart,
// zeroCorrelationZoneConfig, restrictedSetConfig and ssb-perRACH-Occasion.
type PRACHForm struct{ Index, SCS, FDM, Start, ZCZ, Set, SSBPerRO string }

// BWPForm is an initial BWP of a Form: a partition's name, or a place.
type BWPForm struct{ Part, Start, Size, RIV, SCS, CP string }

// PartForm is one partition of a Form.
type PartForm struct {
	Name, SCS, CP, Start, Size, RIV, Dir, Layers, Mod, Cap, DMRS string
}

// Block is the part of the plan a field belongs to. An optional block (TDD,
// its second pattern, SS/PBCH, environment) is in the plan when any of its
// fields has a value, so that a form needs no separate switch for it.
type Block string

// The blocks of a plan, by the prefix of their plan paths.
const (
	BlockPlan      Block = ""             // plan-level and carrier fields, always present
	BlockTDD       Block = "tdd"          // the TDD reference and pattern 1
	BlockPattern2  Block = "tdd.pattern2" // pattern 2, which brings the TDD block with it
	BlockSSB       Block = "ssb"
	BlockEnv       Block = "environment"
	BlockInit      Block = "initialAccess"
	BlockInitDL    Block = "initialAccess.initialDownlinkBWP" // brings the initial access with it
	BlockInitUL    Block = "initialAccess.initialUplinkBWP"   // brings the initial access with it
	BlockPRACH     Block = "prach"
	BlockPartition Block = "partitions" // one set per partition, keys after "pI.", paths after "partitions[I]."
)

// Field is one plan field of the form: everything the codec, the messages,
// the edits and the view need to know about it. Fields is the only place
// that lists them.
type Field struct {
	Key   string // the query key; for a partition field, after "pI."
	Path  string // the plan path, as grid.Finding.Field and planfile name it; for a partition, after "partitions[I]."
	Block Block
	// Label names the field at its control; Noun names it in messages.
	Label, Noun string
	// Allowed says in words what the field takes, in the frequency range
	// of the form (nil for fields that pass through as typed).
	Allowed func(grid.Range) string
	// KeepZero writes a zero value into the query rather than leaving it
	// out: a zero that keeps its block in the plan.
	KeepZero bool
	// Trim takes white space off a text value on its way to the plan.
	Trim bool
	// Anchor writes a zero value into the query when its block is in the
	// plan but no other field of the block has a value, so that the block
	// stays in the plan.
	Anchor bool

	// form is the field's string in a Form (partition i for a partition field).
	form func(f *Form, i int) *string
	// plan is the field in a grid.Plan, allocating its block: a *string
	// (passed through), *int (zero means not given), **int, *float64 (zero
	// means not given) or **float64. Its type is the field's kind.
	plan func(p *grid.Plan, i int) any
}

// Kind is how a field's text becomes a plan value.
type Kind int

// The kinds of field, from the type of the plan value.
const (
	Text      Kind = iota // passed through as typed, for grid.Compute to judge
	Count                 // a whole number whose zero means "not given"
	OptCount              // a whole number or nothing
	Number                // a number whose zero means "not given"
	OptNumber             // a number or nothing
)

// Kind is the kind of f, read from the type of its plan value.
func (f Field) Kind() Kind {
	var p grid.Plan
	p.Partitions = make([]grid.PartitionPlan, 1)
	switch f.plan(&p, 0).(type) {
	case *int:
		return Count
	case **int:
		return OptCount
	case *float64:
		return Number
	case **float64:
		return OptNumber
	}
	return Text
}

// Value returns a pointer to f's text in a Form; i is the partition, for a
// partition field.
func (f Field) Value(form *Form, i int) *string { return f.form(form, i) }

// FullKey is f's query key for partition i ("p2.size"), or its key.
func (f Field) FullKey(i int) string {
	if f.Block == BlockPartition {
		return fmt.Sprintf("p%d.%s", i, f.Key)
	}
	return f.Key
}

// FullPath is f's plan path for partition i ("partitions[2].sizePrb"), or its path.
func (f Field) FullPath(i int) string {
	if f.Block == BlockPartition {
		return fmt.Sprintf("partitions[%d].%s", i, f.Path)
	}
	return f.Path
}

func fixed(s string) func(grid.Range) string { return func(grid.Range) string { return s } }

func dataSCS(rng grid.Range) string {
	return "a subcarrier spacing in kHz: " + grid.JoinInts(rng.DataSCS())
}

// Allocators of the optional blocks, for the plan accessors.
func tdd(p *grid.Plan) *grid.TDDPlan {
	if p.TDD == nil {
		p.TDD = &grid.TDDPlan{}
	}
	return p.TDD
}

func pattern2(p *grid.Plan) *grid.TDDPattern {
	t := tdd(p)
	if t.Pattern2 == nil {
		t.Pattern2 = &grid.TDDPattern{}
	}
	return t.Pattern2
}

func ssb(p *grid.Plan) *grid.SSBPlan {
	if p.SSB == nil {
		p.SSB = &grid.SSBPlan{}
	}
	return p.SSB
}

func initial(p *grid.Plan) *grid.InitialAccessPlan {
	if p.InitialAccess == nil {
		p.InitialAccess = &grid.InitialAccessPlan{}
	}
	return p.InitialAccess
}

func prachOf(p *grid.Plan) *grid.PRACHPlan {
	if p.PRACH == nil {
		p.PRACH = &grid.PRACHPlan{}
	}
	return p.PRACH
}

func initialDL(p *grid.Plan) *grid.InitialBWPPlan {
	ia := initial(p)
	if ia.InitialDownlinkBWP == nil {
		ia.InitialDownlinkBWP = &grid.InitialBWPPlan{}
	}
	return ia.InitialDownlinkBWP
}

func initialUL(p *grid.Plan) *grid.InitialBWPPlan {
	ia := initial(p)
	if ia.InitialUplinkBWP == nil {
		ia.InitialUplinkBWP = &grid.InitialBWPPlan{}
	}
	return ia.InitialUplinkBWP
}

// bwpFields are the six fields of an initial BWP: prefix "ia.dl" or
// "ia.ul", path its plan path.
func bwpFields(prefix, path string, block Block, form func(*Form) *BWPForm, plan func(*grid.Plan) *grid.InitialBWPPlan) []Field {
	return []Field{
		{Key: prefix + ".part", Path: path + ".partition", Block: block, Label: "Partition", Noun: "The BWP's partition",
			form: func(f *Form, _ int) *string { return &form(f).Part }, plan: func(p *grid.Plan, _ int) any { return &plan(p).Partition }},
		{Key: prefix + ".start", Path: path + ".startCrb", Block: block, Label: "Start CRB", Noun: "The BWP's start CRB",
			Allowed: fixed(fmt.Sprintf("a CRB index from 0 to %d, or nothing", grid.MaxStartCRB)),
			form:    func(f *Form, _ int) *string { return &form(f).Start }, plan: func(p *grid.Plan, _ int) any { return &plan(p).StartCRB }},
		{Key: prefix + ".size", Path: path + ".sizePrb", Block: block, Label: "Size (PRB)", Noun: "The BWP's size", Anchor: true,
			Allowed: fixed(fmt.Sprintf("a whole number of PRBs from 1 to %d, or nothing", grid.MaxPRB)),
			form:    func(f *Form, _ int) *string { return &form(f).Size }, plan: func(p *grid.Plan, _ int) any { return &plan(p).SizePRB }},
		{Key: prefix + ".riv", Path: path + ".locationAndBandwidth", Block: block, Label: "locationAndBandwidth", Noun: "The BWP's locationAndBandwidth",
			Allowed: fixed(fmt.Sprintf("a whole number from 0 to %d, or nothing", grid.MaxRIV)),
			form:    func(f *Form, _ int) *string { return &form(f).RIV }, plan: func(p *grid.Plan, _ int) any { return &plan(p).LocationAndBandwidth }},
		{Key: prefix + ".scs", Path: path + ".subcarrierSpacing", Block: block, Label: "SCS (kHz)", Noun: "The BWP's subcarrierSpacing",
			Allowed: func(rng grid.Range) string { return dataSCS(rng) + ", or nothing for subCarrierSpacingCommon" },
			form:    func(f *Form, _ int) *string { return &form(f).SCS }, plan: func(p *grid.Plan, _ int) any { return &plan(p).SubcarrierSpacingKHz }},
		{Key: prefix + ".cp", Path: path + ".cyclicPrefix", Block: block, Label: "CP", Noun: "The BWP's cyclic prefix",
			form: func(f *Form, _ int) *string { return &form(f).CP }, plan: func(p *grid.Plan, _ int) any { return &plan(p).CyclicPrefix }},
	}
}

func env(p *grid.Plan) *grid.EnvironmentPlan {
	if p.Environment == nil {
		p.Environment = &grid.EnvironmentPlan{}
	}
	return p.Environment
}

// patternFields are the five fields of a TDD pattern: prefix "tdd" or
// "tdd2", pat its TDDForm pattern and plan pattern.
func patternFields(prefix, path, label string, block Block, form func(*Form) *PatternForm, plan func(*grid.Plan) *grid.TDDPattern) []Field {
	slots := fixed("a whole number of slots of the reference SCS")
	symbols := fixed("a whole number of symbols from 0 to 13")
	return []Field{
		{Key: prefix + ".ms", Path: path + ".periodMs", Block: block, Label: "Period (ms)", Noun: label + " period (ms)",
			Allowed: func(grid.Range) string { return "one of " + joinFloats(grid.TDDPeriodsMs) + " ms" },
			form:    func(f *Form, _ int) *string { return &form(f).Ms }, plan: func(p *grid.Plan, _ int) any { return &plan(p).PeriodMs }},
		{Key: prefix + ".dl", Path: path + ".downlinkSlots", Block: block, Label: "DL slots", Noun: label + " downlink slots", Allowed: slots, KeepZero: true,
			form: func(f *Form, _ int) *string { return &form(f).DL }, plan: func(p *grid.Plan, _ int) any { return &plan(p).DownlinkSlots }},
		{Key: prefix + ".dlsym", Path: path + ".downlinkSymbols", Block: block, Label: "DL sym", Noun: label + " downlink symbols", Allowed: symbols, KeepZero: true,
			form: func(f *Form, _ int) *string { return &form(f).DLSym }, plan: func(p *grid.Plan, _ int) any { return &plan(p).DownlinkSymbols }},
		{Key: prefix + ".ul", Path: path + ".uplinkSlots", Block: block, Label: "UL slots", Noun: label + " uplink slots", Allowed: slots, KeepZero: true,
			form: func(f *Form, _ int) *string { return &form(f).UL }, plan: func(p *grid.Plan, _ int) any { return &plan(p).UplinkSlots }},
		{Key: prefix + ".ulsym", Path: path + ".uplinkSymbols", Block: block, Label: "UL sym", Noun: label + " uplink symbols", Allowed: symbols, KeepZero: true,
			form: func(f *Form, _ int) *string { return &form(f).ULSym }, plan: func(p *grid.Plan, _ int) any { return &plan(p).UplinkSymbols }},
	}
}

// Fields lists every field of the form in query order: the plan and its
// carrier, the TDD pattern, the SS/PBCH blocks, the radio channel, then the
// fields of each partition. The per-spacing carrier keys (off.SCS, cbw.SCS)
// are families, not fields; see keyOffset.
var Fields = func() []Field {
	fs := []Field{
		{Key: "name", Path: "name", Label: "Plan name", Noun: "Plan name",
			form: func(f *Form, _ int) *string { return &f.Name }, plan: func(p *grid.Plan, _ int) any { return &p.Name }},
		{Key: "span", Path: "spanMs", Label: "Span (ms)", Noun: "Span (ms)",
			Allowed: fixed(fmt.Sprintf("a whole number of milliseconds from 1 to %d", grid.MaxSpanMs)),
			form:    func(f *Form, _ int) *string { return &f.Span }, plan: func(p *grid.Plan, _ int) any { return &p.SpanMs }},
		{Key: "range", Path: "carrier.range", Label: "Frequency range", Noun: "Frequency range",
			form: func(f *Form, _ int) *string { return &f.Range }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.Range }},
		{Key: "band", Path: "carrier.band", Label: "Operating band", Noun: "Operating band",
			form: func(f *Form, _ int) *string { return &f.Band }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.Band }},
		{Key: "bw", Path: "carrier.bandwidthMHz", Label: "Channel bandwidth (MHz)", Noun: "Channel bandwidth",
			Allowed: func(rng grid.Range) string {
				return "a channel bandwidth in whole MHz, such as " + grid.JoinInts(rng.AllBandwidths())
			},
			form: func(f *Form, _ int) *string { return &f.Bandwidth }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.BandwidthMHz }},
		{Key: "fc", Path: "carrier.centerMHz", Label: "Centre (MHz)", Noun: "Centre frequency",
			Allowed: fixed("a frequency in MHz such as 3750 or 3750.12, or nothing"),
			form:    func(f *Form, _ int) *string { return &f.Center }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.CenterMHz }},
		{Key: "arfcn", Path: "carrier.arfcn", Label: "NR-ARFCN", Noun: "NR-ARFCN",
			Allowed: fixed(fmt.Sprintf("a whole number from 0 to %d, or nothing", grid.MaxARFCN)),
			form:    func(f *Form, _ int) *string { return &f.ARFCN }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.ARFCN }},
		{Key: "nta", Path: "carrier.nTaOffset", Label: "n-TimingAdvanceOffset", Noun: "n-TimingAdvanceOffset",
			form: func(f *Form, _ int) *string { return &f.NTA }, plan: func(p *grid.Plan, _ int) any { return &p.Carrier.NTAOffset }},
		{Key: "gap", Path: "numerologyGapKHz", Label: "Numerology gap (kHz)", Noun: "Gap between numerologies",
			Allowed: fixed("a spacing in kHz (0 turns the check off), or nothing for one PRB of the wider spacing"),
			form:    func(f *Form, _ int) *string { return &f.Gap }, plan: func(p *grid.Plan, _ int) any { return &p.NumerologyGapKHz }},
		{Key: "tdd.ref", Path: "tdd.referenceScsKHz", Block: BlockTDD, Label: "Reference SCS (kHz)", Noun: "TDD reference SCS", Allowed: dataSCS,
			form: func(f *Form, _ int) *string { return &f.TDD.Ref }, plan: func(p *grid.Plan, _ int) any { return &tdd(p).ReferenceSCSKHz }},
	}
	fs = append(fs, patternFields("tdd", "tdd.pattern1", "Pattern 1", BlockTDD,
		func(f *Form) *PatternForm { return &f.TDD.P1 }, func(p *grid.Plan) *grid.TDDPattern { return &tdd(p).Pattern1 })...)
	fs = append(fs, patternFields("tdd2", "tdd.pattern2", "Pattern 2", BlockPattern2,
		func(f *Form) *PatternForm { return &f.TDD.P2 }, pattern2)...)
	fs = append(fs, []Field{
		{Key: "ssb.scs", Path: "ssb.scsKHz", Block: BlockSSB, Label: "SCS (kHz)", Noun: "SS/PBCH SCS",
			Allowed: fixed("a subcarrier spacing in kHz such as 15, 30, 120 or 240"),
			form:    func(f *Form, _ int) *string { return &f.SSB.SCS }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).SCSKHz }},
		{Key: "ssb.case", Path: "ssb.case", Block: BlockSSB, Label: "Case", Noun: "SS/PBCH case",
			form: func(f *Form, _ int) *string { return &f.SSB.Case }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).Case }},
		{Key: "ssb.bitmap", Path: "ssb.bitmap", Block: BlockSSB, Label: "Bitmap (ssb-PositionsInBurst)", Noun: "ssb-PositionsInBurst", Trim: true,
			form: func(f *Form, _ int) *string { return &f.SSB.Bitmap }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).Bitmap }},
		{Key: "ssb.off", Path: "ssb.offsetToPointA", Block: BlockSSB, Label: "offsetToPointA", Noun: "offsetToPointA", KeepZero: true,
			Allowed: fixed("a whole number of RBs (15 kHz in FR1, 60 kHz in FR2)"),
			form:    func(f *Form, _ int) *string { return &f.SSB.Off }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).OffsetToPointA }},
		{Key: "ssb.k", Path: "ssb.kSsb", Block: BlockSSB, Label: "k_SSB", Noun: "k_SSB",
			Allowed: fixed("a whole number of subcarriers from 0 to 23"),
			form:    func(f *Form, _ int) *string { return &f.SSB.K }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).KSSB }},
		{Key: "ssb.common", Path: "ssb.scsCommonKHz", Block: BlockSSB, Label: "SCS common", Noun: "subCarrierSpacingCommon",
			Allowed: fixed("15 or 30 kHz (FR1), 60 or 120 kHz (FR2), or nothing"),
			form:    func(f *Form, _ int) *string { return &f.SSB.Common }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).ScsCommonKHz }},
		{Key: "ssb.period", Path: "ssb.periodMs", Block: BlockSSB, Label: "Period (ms)", Noun: "SS/PBCH period",
			Allowed: func(grid.Range) string { return "one of " + grid.JoinInts(grid.SSBPeriodsMs) + " ms" },
			form:    func(f *Form, _ int) *string { return &f.SSB.Period }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).PeriodMs }},
		{Key: "ssb.gscn", Path: "ssb.gscn", Block: BlockSSB, Label: "GSCN", Noun: "GSCN",
			Allowed: fixed(fmt.Sprintf("a whole number from %d to %d, or nothing", gscn.MinGSCN, gscn.MaxGSCN)),
			form:    func(f *Form, _ int) *string { return &f.SSB.GSCN }, plan: func(p *grid.Plan, _ int) any { return &ssb(p).GSCN }},
		{Key: "env.ds", Path: "environment.delaySpreadNs", Block: BlockEnv, Label: "Delay spread (ns)", Noun: "Delay spread",
			Allowed: fixed("an RMS delay spread in ns, such as 100, or nothing with a delay profile"),
			form:    func(f *Form, _ int) *string { return &f.Env.DelayNs }, plan: func(p *grid.Plan, _ int) any { return &env(p).DelaySpreadNs }},
		{Key: "env.profile", Path: "environment.delayProfile", Block: BlockEnv, Label: "Delay profile", Noun: "Delay profile",
			form: func(f *Form, _ int) *string { return &f.Env.Profile }, plan: func(p *grid.Plan, _ int) any { return &env(p).DelayProfile }},
		{Key: "env.speed", Path: "environment.speedKmh", Block: BlockEnv, Label: "Speed (km/h)", Noun: "Speed", Anchor: true,
			Allowed: fixed("a speed in km/h from 0 to 1000"),
			form:    func(f *Form, _ int) *string { return &f.Env.Speed }, plan: func(p *grid.Plan, _ int) any { return &env(p).SpeedKmh }},
		{Key: "env.fc", Path: "environment.carrierMHz", Block: BlockEnv, Label: "Carrier for Doppler (MHz)", Noun: "Carrier for Doppler",
			Allowed: fixed("a frequency in MHz, or nothing when the carrier has a centre"),
			form:    func(f *Form, _ int) *string { return &f.Env.CarrierMHz }, plan: func(p *grid.Plan, _ int) any { return &env(p).CarrierMHz }},
		{Key: "env.radius", Path: "environment.cellRadiusKm", Block: BlockEnv, Label: "Cell radius (km)", Noun: "Cell radius",
			Allowed: fixed("a radius in km, such as 2.5, or nothing"),
			form:    func(f *Form, _ int) *string { return &f.Env.RadiusKm }, plan: func(p *grid.Plan, _ int) any { return &env(p).CellRadiusKm }},
		{Key: "env.latency", Path: "environment.latencyTargetMs", Block: BlockEnv, Label: "Latency target (ms)", Noun: "Latency target",
			Allowed: fixed("a one-way latency in ms, such as 1 or 0.5, or nothing"),
			form:    func(f *Form, _ int) *string { return &f.Env.LatencyMs }, plan: func(p *grid.Plan, _ int) any { return &env(p).LatencyTargetMs }},
		{Key: "ia.coreset", Path: "initialAccess.controlResourceSetZero", Block: BlockInit, Label: "controlResourceSetZero", Noun: "controlResourceSetZero", KeepZero: true,
			Allowed: fixed("a row of the CORESET#0 table from 0 to 15"),
			form:    func(f *Form, _ int) *string { return &f.Init.CORESET }, plan: func(p *grid.Plan, _ int) any { return &initial(p).ControlResourceSetZero }},
		{Key: "ia.ss0", Path: "initialAccess.searchSpaceZero", Block: BlockInit, Label: "searchSpaceZero", Noun: "searchSpaceZero", KeepZero: true,
			Allowed: fixed("a row of the Type0-PDCCH monitoring table from 0 to 15"),
			form:    func(f *Form, _ int) *string { return &f.Init.SS0 }, plan: func(p *grid.Plan, _ int) any { return &initial(p).SearchSpaceZero }},
		{Key: "ia.dmrs", Path: "initialAccess.dmrsTypeAPosition", Block: BlockInit, Label: "dmrs-TypeA-Position", Noun: "dmrs-TypeA-Position",
			form: func(f *Form, _ int) *string { return &f.Init.DMRS }, plan: func(p *grid.Plan, _ int) any { return &initial(p).DMRSTypeAPosition }},
	}...)
	fs = append(fs, bwpFields("ia.dl", "initialAccess.initialDownlinkBWP", BlockInitDL,
		func(f *Form) *BWPForm { return &f.Init.DL }, initialDL)...)
	fs = append(fs, bwpFields("ia.ul", "initialAccess.initialUplinkBWP", BlockInitUL,
		func(f *Form) *BWPForm { return &f.Init.UL }, initialUL)...)
	fs = append(fs, []Field{
		{Key: "prach.idx", Path: "prach.configurationIndex", Block: BlockPRACH, Label: "prach-ConfigurationIndex", Noun: "prach-ConfigurationIndex", KeepZero: true,
			Allowed: fixed("a row of TS 38.211 Table 6.3.3.2-2, -3 or -4, from 0 to 255 (to 262 in FR1 unpaired spectrum)"),
			form:    func(f *Form, _ int) *string { return &f.PRACH.Index }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).ConfigurationIndex }},
		{Key: "prach.scs", Path: "prach.msg1SubcarrierSpacing", Block: BlockPRACH, Label: "msg1-SubcarrierSpacing (kHz)", Noun: "msg1-SubcarrierSpacing",
			Allowed: fixed("15 or 30 kHz in FR1, 60 or 120 kHz in FR2 for a short format, or nothing for the long formats and the initial uplink BWP's spacing"),
			form:    func(f *Form, _ int) *string { return &f.PRACH.SCS }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).Msg1SubcarrierSpacing }},
		{Key: "prach.fdm", Path: "prach.msg1FDM", Block: BlockPRACH, Label: "msg1-FDM", Noun: "msg1-FDM",
			Allowed: fixed("1, 2, 4 or 8, or nothing for 1"),
			form:    func(f *Form, _ int) *string { return &f.PRACH.FDM }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).Msg1FDM }},
		{Key: "prach.start", Path: "prach.msg1FrequencyStart", Block: BlockPRACH, Label: "msg1-FrequencyStart", Noun: "msg1-FrequencyStart",
			Allowed: fixed("a PRB from 0 to 274 counted from the initial uplink BWP's first PRB, or nothing for 0"),
			form:    func(f *Form, _ int) *string { return &f.PRACH.Start }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).Msg1FrequencyStart }},
		{Key: "prach.zcz", Path: "prach.zeroCorrelationZoneConfig", Block: BlockPRACH, Label: "zeroCorrelationZoneConfig", Noun: "zeroCorrelationZoneConfig",
			Allowed: fixed("a row from 0 to 15, or nothing for 0"),
			form:    func(f *Form, _ int) *string { return &f.PRACH.ZCZ }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).ZeroCorrelationZoneConfig }},
		{Key: "prach.set", Path: "prach.restrictedSetConfig", Block: BlockPRACH, Label: "restrictedSetConfig", Noun: "restrictedSetConfig", Trim: true,
			form: func(f *Form, _ int) *string { return &f.PRACH.Set }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).RestrictedSetConfig }},
		{Key: "prach.ssbro", Path: "prach.ssbPerRachOccasion", Block: BlockPRACH, Label: "ssb-perRACH-Occasion", Noun: "ssb-perRACH-Occasion", Trim: true,
			form: func(f *Form, _ int) *string { return &f.PRACH.SSBPerRO }, plan: func(p *grid.Plan, _ int) any { return &prachOf(p).SSBPerRachOccasion }},
	}...)
	fs = append(fs, []Field{
		// Partition fields, in the order a partition's keys are written.
		{Key: "name", Path: "name", Block: BlockPartition, Label: "Name", Noun: "Name",
			form: func(f *Form, i int) *string { return &f.Parts[i].Name }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].Name }},
		{Key: "scs", Path: "scsKHz", Block: BlockPartition, Label: "SCS (kHz)", Noun: "SCS", Allowed: dataSCS,
			form: func(f *Form, i int) *string { return &f.Parts[i].SCS }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].SCSKHz }},
		{Key: "cp", Path: "cp", Block: BlockPartition, Label: "CP", Noun: "CP",
			form: func(f *Form, i int) *string { return &f.Parts[i].CP }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].CP }},
		{Key: "start", Path: "startCrb", Block: BlockPartition, Label: "Start CRB", Noun: "Start CRB",
			Allowed: fixed(fmt.Sprintf("a CRB index from 0 to %d, or nothing to start at the carrier's first CRB", grid.MaxStartCRB)),
			form:    func(f *Form, i int) *string { return &f.Parts[i].Start }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].StartCRB }},
		{Key: "size", Path: "sizePrb", Block: BlockPartition, Label: "Size (PRB)", Noun: "Size",
			Allowed: fixed(fmt.Sprintf("a whole number of PRBs from 1 to %d", grid.MaxPRB)),
			form:    func(f *Form, i int) *string { return &f.Parts[i].Size }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].SizePRB }},
		{Key: "riv", Path: "locationAndBandwidth", Block: BlockPartition, Label: "locationAndBandwidth", Noun: "locationAndBandwidth",
			Allowed: fixed(fmt.Sprintf("a whole number from 0 to %d, or nothing", grid.MaxRIV)),
			form:    func(f *Form, i int) *string { return &f.Parts[i].RIV }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].LocationAndBandwidth }},
		{Key: "dir", Path: "direction", Block: BlockPartition, Label: "Direction", Noun: "Direction",
			form: func(f *Form, i int) *string { return &f.Parts[i].Dir }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].Direction }},
		{Key: "layers", Path: "layers", Block: BlockPartition, Label: "MIMO layers", Noun: "MIMO layers",
			Allowed: fixed("a whole number: 1 to 8 for DL, 1 to 4 for UL"),
			form:    func(f *Form, i int) *string { return &f.Parts[i].Layers }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].Layers }},
		{Key: "mod", Path: "modulation", Block: BlockPartition, Label: "Modulation", Noun: "Modulation",
			form: func(f *Form, i int) *string { return &f.Parts[i].Mod }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].Modulation }},
		{Key: "cap", Path: "ueCapability", Block: BlockPartition, Label: "UE capability", Noun: "UE capability",
			Allowed: fixed("1 or 2, or nothing for 1"),
			form:    func(f *Form, i int) *string { return &f.Parts[i].Cap }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].UECapability }},
		{Key: "dmrs", Path: "dmrsAdditionalPosition", Block: BlockPartition, Label: "dmrs-AdditionalPosition", Noun: "dmrs-AdditionalPosition",
			form: func(f *Form, i int) *string { return &f.Parts[i].DMRS }, plan: func(p *grid.Plan, i int) any { return &p.Partitions[i].DMRSAdditionalPosition }},
	}...)
	return fs
}()

// Lookups into Fields, built once.
var (
	fieldByKey      = map[string]*Field{} // plan-level fields by query key
	partFieldByKey  = map[string]*Field{} // partition fields by key after "pI."
	fieldByPath     = map[string]*Field{} // plan-level fields by plan path
	partFieldByPath = map[string]*Field{}
)

func init() {
	for i := range Fields {
		f := &Fields[i]
		if f.Block == BlockPartition {
			partFieldByKey[f.Key], partFieldByPath[f.Path] = f, f
		} else {
			fieldByKey[f.Key], fieldByPath[f.Path] = f, f
		}
	}
}

// FieldOf returns the plan-level field of a query key; it panics for a key
// that is not one, since that is a mistake in the program.
func FieldOf(key string) Field {
	f, ok := fieldByKey[key]
	if !ok {
		panic("planform: no plan field " + key)
	}
	return *f
}

// PartFieldOf returns the partition field of a key after "pI.".
func PartFieldOf(key string) Field {
	f, ok := partFieldByKey[key]
	if !ok {
		panic("planform: no partition field " + key)
	}
	return *f
}

// partPath is a partition's plan path in a finding's text:
// "partitions[1]" or "partitions[1].startCrb".
var partPath = regexp.MustCompile(`partitions\[(\d+)\](?:\.([A-Za-z][A-Za-z0-9]*))?`)

// NamePaths names the partitions and fields in a finding's text as the page
// shows them: "Start CRB of 2 · lowlat" for "partitions[1].startCrb", since
// the partition's box is titled by its number and name and the control by
// its label. The CLI and the API keep the plan path, which is what a plan
// file spells. parts are the plan's partitions; a path beyond them is left.
func NamePaths(text string, parts []grid.PartitionPlan) string {
	return partPath.ReplaceAllStringFunc(text, func(m string) string {
		sub := partPath.FindStringSubmatch(m)
		i, err := strconv.Atoi(sub[1])
		if err != nil || i >= len(parts) {
			return m
		}
		who := strconv.Itoa(i + 1)
		if parts[i].Name != "" {
			who += " · " + parts[i].Name
		}
		if sub[2] == "" {
			return who
		}
		if f, ok := partFieldByPath[sub[2]]; ok {
			return f.Label + " of " + who
		}
		return sub[2] + " of " + who
	})
}

func joinFloats(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = strconv.FormatFloat(x, 'f', -1, 64)
	}
	return strings.Join(s, ", ")
}
