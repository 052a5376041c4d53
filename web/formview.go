package web

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/render"
	"gridloom/web/planform"
)

// The form's view: its controls, sections and partitions, and the box of
// figure options, with the messages beside the controls they concern.

// note is one message beside a control.
type note struct {
	Severity string // "error", "warning" or "info"
	Text     string
}

type option struct {
	Value, Label string
	Selected     bool
}

// control is one labelled input or select of the form.
type control struct {
	ID, Name, Label, Value string
	Placeholder            string
	InputMode              string // for text inputs: "numeric", "decimal" or ""
	Size                   string // columns of the form's 12-column grid: "2" to "6", or "12"
	Options                []option
	Notes                  []note
}

func (c control) isSelect() bool { return c.Options != nil }

func (c control) invalid() bool {
	return slices.ContainsFunc(c.Notes, func(n note) bool { return n.Severity == string(grid.Error) })
}

// group is a fieldset or section that findings can point at as a whole.
type group struct {
	ID    string
	Notes []note
}

type formView struct {
	// IDPrefix is put before every id of the form ("" on the planner,
	// "a-" or "b-" for a side of the comparison) and OpName is the query
	// key its edit buttons send ("op", or "a.op" …).
	IDPrefix string
	OpName   string
	Shape    string // changes whenever the set of controls does
	General  []note // messages that concern no control on the form
	Plan     []control
	Carrier  []control
	Carriers group // carrier.offsetToCarrier and carrier.carrierBandwidth as a whole
	SCSOpen  bool  // show the SCS-specific carriers unfolded
	SCSRows  []scsRow
	TDD      section
	SSB      section
	Env      section
	Init     section // initial access: CORESET#0, Type0-PDCCH, the initial BWPs
	PRACH    section // random access: RACH-ConfigCommon
	PartsBox group   // partitions as a whole
	Parts    []partView
	CanAdd   bool
	Figure   *figureView // the figure's options; nil where the page has its own box
	MIB      *mibBoxView // the MIB panel's frame and block; the planner's only
}

// mibBoxView is the controls of the MIB panel (mibview.go), in the
// planner's form so that the live update and the page without script both
// carry them.
type mibBoxView struct {
	Group                       group
	SFN, SSB, CellBarred, Intra control
	Open                        bool
	Hint                        string
}

// id is the form's id for name.
func (f formView) id(name string) string { return f.IDPrefix + name }

// section is an optional block of the plan (TDD, SS/PBCH, environment):
// rows of controls, open when it holds a value or a message.
type section struct {
	Group   group
	Title   string
	Hint    string
	Summary string // what the plan makes of it, e.g. "DDDSU on 15 kHz"
	Rows    []sectionRow
	Open    bool
	// Find is a finder's page for the plan as it stands ("" for none), with
	// FindText its link's words; the random access section's only.
	Find, FindText string
	ClearOp        string
	OpName         string // the query key of the clear button
	ClearID        string // the id of the clear button
}

type sectionRow struct {
	Label    string
	Controls []control
}

type scsRow struct {
	SCSKHz    int
	Offset    control
	CarrierBW control
	InUse     bool
}

type partView struct {
	Index       int
	Group       group
	Legend      string
	LegendID    string
	Controls    []control
	First, Last bool
	Label       string // the partition's name, or its number, for button labels
	IDPrefix    string // as formView's
	OpName      string
}

// noteID is the id of the messages beside the control id, which the
// control names in aria-describedby.
func noteID(id string) string { return "n-" + id }

// buttonID is the id of the partition's edit button verb.
func (p partView) buttonID(verb string) string { return p.IDPrefix + planform.ButtonID(verb, p.Index) }

// buildForm makes the form's view of a state; notes are the messages by
// control id. A message no control takes goes on top of the form.
func buildForm(s planform.State, notes map[string][]note) formView {
	fb := &formBuilder{s: s, f: s.Form, rng: planform.RangeOf(s.Form.Range), notes: notes, shown: map[string]bool{}}
	fv := formView{CanAdd: len(fb.f.Parts) < grid.MaxPartitions, OpName: planform.KeyOp}
	fv.Plan = fb.planControls()
	fv.Carrier = fb.carrierControls()
	var scsList []int
	fv.SCSRows, scsList, fv.SCSOpen = fb.scsRows()
	fv.Carriers = group{ID: planform.IDCarriers, Notes: fb.take(planform.IDCarriers)}
	fv.SCSOpen = fv.SCSOpen || hasSerious(fv.Carriers.Notes)
	fv.TDD, fv.SSB, fv.Env, fv.Init = fb.tddSection(), fb.ssbSection(), fb.envSection(), fb.initSection()
	fv.PRACH = fb.prachSection()
	fv.PartsBox = group{ID: planform.IDParts, Notes: fb.take(planform.IDParts)}
	for i := range fb.f.Parts {
		fv.Parts = append(fv.Parts, fb.part(i))
	}
	fb.take(planform.IDAdd)
	fb.take(planform.IDFile)
	for _, id := range sortedKeys(notes) {
		if !fb.shown[id] {
			fv.General = append(fv.General, notes[id]...)
		}
	}
	fv.Shape = formShape(fb.f, scsList, fb.showsSCSCommon())
	return fv
}

// formBuilder makes the controls of one form, handing each the messages of
// its id and noting which ids the form shows.
type formBuilder struct {
	s     planform.State
	f     planform.Form
	rng   grid.Range
	notes map[string][]note
	shown map[string]bool // ids of the controls and groups on the form
}

// take returns the messages of a control or group, noting that the form
// shows it.
func (fb *formBuilder) take(id string) []note {
	fb.shown[id] = true
	return fb.notes[id]
}

// text makes the control of a plan-level field from its key: its label and
// value come from the field's row of planform.Fields, the layout from the
// view (size in columns of 12, input mode, placeholder).
func (fb *formBuilder) text(key, size, mode, placeholder string) control {
	id := planform.KeyID(key)
	return control{ID: id, Name: key, Label: planform.FieldOf(key).Label, Value: *fb.f.Value(key), Size: size, InputMode: mode,
		Placeholder: placeholder, Notes: fb.take(id)}
}

// choice is text as a select of opts.
func (fb *formBuilder) choice(key, size string, opts []option) control {
	c := fb.text(key, size, "", "")
	c.Options = opts
	return c
}

func (fb *formBuilder) planControls() []control {
	spans := []option{{Value: "", Label: "auto (TDD period or 1)"}}
	for i := 1; i <= grid.MaxSpanMs; i++ {
		spans = append(spans, option{Value: strconv.Itoa(i), Label: strconv.Itoa(i)})
	}
	return []control{
		fb.text("name", "12", "", "untitled"),
		fb.choice("span", "6", pick(spans, fb.f.Span, nil)),
		fb.text("gap", "6", "decimal", "1 PRB of the wider SCS"),
	}
}

func (fb *formBuilder) carrierControls() []control {
	res := fb.s.Result
	return []control{
		fb.choice("range", "6", pick(plain(grid.RangeNames()), orDefault(fb.f.Range, grid.DefaultRange), nil)),
		fb.text("band", "6", "", placeholderBand(res)),
		fb.choice("bw", "6", bandwidthOptions(fb.rng, fb.s.Plan.SCSInUse(), fb.f.Bandwidth)),
		fb.text("fc", "6", "decimal", placeholderCenter(res)),
		fb.text("arfcn", "6", "numeric", placeholderARFCN(res)),
		fb.choice("nta", "6", pick(append([]option{{Value: "", Label: "for the range"}}, plain(grid.NTAOffsets)...), fb.f.NTA, nil)),
	}
}

// scsRows are the SCS-specific carriers: one row per data SCS of the
// range, and per spacing the form names besides, so that nothing typed
// disappears when the range changes. open says whether a row holds a value
// or a message worth unfolding them for.
func (fb *formBuilder) scsRows() (rows []scsRow, scsList []int, open bool) {
	f, s := fb.f, fb.s
	scsList = fb.rng.DataSCS()
	for _, m := range []map[int]string{f.Offset, f.CarrierBW} {
		for scs := range m {
			if !slices.Contains(scsList, scs) {
				scsList = append(scsList, scs)
			}
		}
	}
	slices.Sort(scsList)
	inUse := s.Plan.SCSInUse()
	for _, scs := range scsList {
		row := scsRow{SCSKHz: scs, InUse: slices.Contains(inUse, scs)}
		offKey, cbwKey := planform.OffsetKey(scs), planform.CarrierBWKey(scs)
		offID, cbwID := planform.KeyID(offKey), planform.KeyID(cbwKey)
		row.Offset = control{ID: offID, Name: offKey, Label: fmt.Sprintf("offsetToCarrier at %d kHz (CRBs)", scs),
			Value: f.Offset[scs], Size: "12", InputMode: "numeric", Notes: fb.take(offID)}
		row.CarrierBW = control{ID: cbwID, Name: cbwKey, Label: fmt.Sprintf("carrierBandwidth at %d kHz (PRBs)", scs),
			Value: f.CarrierBW[scs], Size: "12", InputMode: "numeric", Notes: fb.take(cbwID)}
		if c, ok := s.Result.Carrier(scs); ok {
			row.Offset.Placeholder = strconv.Itoa(c.OffsetToCarrier)
			row.CarrierBW.Placeholder = strconv.Itoa(c.CarrierBandwidth)
		} else if n, ok := fb.rng.NRB(scs, s.Plan.Carrier.BandwidthMHz); ok {
			row.CarrierBW.Placeholder = strconv.Itoa(n)
		}
		if row.Offset.Value != "" || row.CarrierBW.Value != "" || hasSerious(row.Offset.Notes) || hasSerious(row.CarrierBW.Notes) {
			open = true
		}
		rows = append(rows, row)
	}
	return rows, scsList, open
}

func (fb *formBuilder) tddSection() section {
	refOpts := []option{{Value: "", Label: "—"}}
	for _, scs := range fb.rng.DataSCS() {
		refOpts = append(refOpts, option{Value: strconv.Itoa(scs), Label: strconv.Itoa(scs)})
	}
	periods := []option{{Value: "", Label: "—"}}
	for _, ms := range grid.TDDPeriodsMs {
		v := strconv.FormatFloat(ms, 'f', -1, 64)
		periods = append(periods, option{Value: v, Label: v})
	}
	patternRow := func(prefix, label string) sectionRow {
		return sectionRow{Label: label, Controls: []control{
			fb.choice(prefix+".ms", "4", pick(periods, *fb.f.Value(prefix + ".ms"), nil)),
			fb.text(prefix+".dl", "2", "numeric", ""),
			fb.text(prefix+".dlsym", "2", "numeric", ""),
			fb.text(prefix+".ulsym", "2", "numeric", ""),
			fb.text(prefix+".ul", "2", "numeric", ""),
		}}
	}
	sec := section{
		Group: group{ID: planform.IDTDD, Notes: fb.take(planform.IDTDD)}, Title: "TDD pattern", ClearOp: "clear.tdd",
		Hint: "TDD-UL-DL-ConfigCommon: downlink slots and symbols open each period, uplink symbols and slots close it, the rest is flexible. Leave it empty for no pattern.",
		Rows: []sectionRow{
			{Label: "Reference", Controls: []control{fb.choice("tdd.ref", "6", pick(refOpts, fb.f.TDD.Ref, nil))}},
			patternRow("tdd", "Pattern 1"),
			patternRow("tdd2", "Pattern 2 (optional)"),
		},
	}
	if t := fb.s.Result.TDD; t != nil {
		sec.Summary = fmt.Sprintf("%s on %d kHz, every %s ms", t.SlotString(), t.Reference.SCSKHz(),
			strconv.FormatFloat(float64(t.Period)/float64(grid.TcPerSubframe), 'f', -1, 64))
	}
	return finishSection(sec)
}

func (fb *formBuilder) ssbSection() section {
	cases := []option{{Value: "", Label: "from the SCS"}}
	for _, c := range []string{"A", "B", "C", "D", "E", "F", "G"} { // TS 38.213 4.1
		cases = append(cases, option{Value: c, Label: c})
	}
	periods := []option{{Value: "", Label: "20 (default)"}}
	for _, ms := range grid.SSBPeriodsMs {
		periods = append(periods, option{Value: strconv.Itoa(ms), Label: strconv.Itoa(ms)})
	}
	sec := section{
		Group: group{ID: planform.IDSSB, Notes: fb.take(planform.IDSSB)}, Title: "SS/PBCH blocks", ClearOp: "clear.ssb",
		Hint: "offsetToPointA counts RBs of 15 kHz (FR1) or 60 kHz (FR2); k_SSB counts subcarriers. A GSCN places the block on the synchronization raster and sets both. The bitmap is ssb-PositionsInBurst, empty for every candidate.",
		Rows: []sectionRow{
			{Label: "Blocks", Controls: []control{
				fb.choice("ssb.scs", "4", ssbSCSOptions(fb.rng, fb.f.SSB.SCS)),
				fb.choice("ssb.case", "4", pick(cases, fb.f.SSB.Case, nil)),
				fb.choice("ssb.period", "4", pick(periods, fb.f.SSB.Period, nil)),
				fb.text("ssb.bitmap", "12", "numeric", "all candidates"),
			}},
			{Label: "Position", Controls: fb.positionControls()},
		},
	}
	if b := fb.s.Result.SSB; b != nil {
		sec.Summary = fmt.Sprintf("case %s, %d of %d candidates sent in the span", b.Case, len(b.Blocks), b.Candidates)
	}
	return finishSection(sec)
}

// positionControls are the SS/PBCH block's offsets, with SCS common
// (subCarrierSpacingCommon) only where it means something: in FR1 it
// changes neither offsetToPointA nor k_SSB (both count 15 kHz units, TS
// 38.211 7.4.3.1), only CORESET#0 and the initial BWPs, so without initial
// access and with nothing typed the control would be a field that does
// nothing; a typed value keeps its control, so it is never lost.
func (fb *formBuilder) positionControls() []control {
	cs := []control{fb.text("ssb.off", "4", "numeric", ""), fb.text("ssb.k", "4", "numeric", "0")}
	if fb.showsSCSCommon() {
		cs = append(cs, fb.choice("ssb.common", "4", scsCommonOptions(fb.rng, strings.TrimSpace(fb.f.SSB.Common))))
	}
	return append(cs, fb.text("ssb.gscn", "6", "numeric", "or the offsets"))
}

// showsSCSCommon says whether the form offers SCS common (positionControls);
// the form's shape follows it, so the page replaces the form when it comes
// or goes.
func (fb *formBuilder) showsSCSCommon() bool {
	return fb.rng != grid.FR1 || fb.s.Plan.InitialAccess != nil || strings.TrimSpace(fb.f.SSB.Common) != ""
}

// scsCommonOptions offers the range's subCarrierSpacingCommon values, and
// empty for the default, which it names.
func scsCommonOptions(rng grid.Range, cur string) []option {
	auto := "auto (the block's spacing)"
	if rng == grid.FR2_1 {
		auto = fmt.Sprintf("auto (%d)", grid.DefaultSCSCommon(rng, 120))
	}
	vals := []option{{Value: "", Label: auto}}
	for _, scs := range grid.SCSCommonChoices(rng) {
		vals = append(vals, option{Value: strconv.Itoa(scs), Label: strconv.Itoa(scs)})
	}
	why := func(string) string { return "not a subCarrierSpacingCommon of " + rng.String() }
	return pick(vals, cur, why)
}

func (fb *formBuilder) envSection() section {
	profiles := []option{{Value: "", Label: "— (give a spread)"}}
	for _, d := range grid.DelayProfiles {
		profiles = append(profiles, option{Value: d.Name, Label: fmt.Sprintf("%s (%s ns)", d.Name, strconv.FormatFloat(d.Ns, 'f', -1, 64))})
	}
	sec := section{
		Group: group{ID: planform.IDEnv, Notes: fb.take(planform.IDEnv)}, Title: "Radio channel", ClearOp: "clear.env",
		Hint: "For the numerology fit: first-order rules that weigh CP against delay spread and SCS against Doppler; the cell radius and the latency target are judged in the timing advice. Leave it empty to skip the fit.",
		Rows: []sectionRow{{Label: "Channel", Controls: []control{
			fb.choice("env.profile", "6", pick(profiles, fb.f.Env.Profile, nil)),
			fb.text("env.ds", "6", "decimal", ""),
			fb.text("env.speed", "6", "decimal", "0"),
			fb.text("env.fc", "6", "decimal", placeholderCenter(fb.s.Result)),
		}}, {Label: "Timing", Controls: []control{
			fb.text("env.radius", "6", "decimal", ""),
			fb.text("env.latency", "6", "decimal", ""),
		}}},
	}
	if fit := fb.s.Result.Fit; fit != nil {
		sec.Summary = fmt.Sprintf("the rules favour %d kHz %s CP", fit.Suggested.SCSKHz, fit.Suggested.CP)
	} else if a := fb.s.Result.Advice; a != nil {
		// Only the timing keys: the section names the timing advice's choice.
		sec.Summary = "no numerology suits every timing criterion"
		if a.Chosen != nil {
			sec.Summary = fmt.Sprintf("the timing advice favours %d kHz %s CP", a.Chosen.SCSKHz, a.Chosen.CP)
		}
	}
	return finishSection(sec)
}

func (fb *formBuilder) initSection() section {
	dmrs := []option{{Value: "", Label: "pos2 (default)"}, {Value: "pos2", Label: "pos2"}, {Value: "pos3", Label: "pos3"}}
	cps := []option{{Value: "", Label: "normal (default)"}, {Value: "normal", Label: "normal"}, {Value: "extended", Label: "extended"}}
	bwpRow := func(prefix, label string, bwp planform.BWPForm) sectionRow {
		return sectionRow{Label: label, Controls: []control{
			fb.text(prefix+".part", "4", "", "or a place"),
			fb.text(prefix+".start", "2", "numeric", ""),
			fb.text(prefix+".size", "2", "numeric", ""),
			fb.text(prefix+".riv", "4", "numeric", ""),
			fb.text(prefix+".scs", "4", "numeric", "SCS common"),
			fb.choice(prefix+".cp", "4", pick(cps, bwp.CP, nil)),
		}}
	}
	sec := section{
		Group: group{ID: planform.IDInit, Notes: fb.take(planform.IDInit)}, Title: "Initial access", ClearOp: "clear.init",
		Hint: "pdcch-ConfigSIB1 is controlResourceSetZero (the CORESET#0 row, TS 38.213 Tables 13-1 to 13-10) and searchSpaceZero (the Type0-PDCCH row, Tables 13-11 to 13-15). An initial BWP names a partition, or gives a place as a partition does; without one, the downlink BWP is CORESET#0. Leave it empty for no initial access.",
		Rows: []sectionRow{
			{Label: "CORESET#0", Controls: []control{
				fb.text("ia.coreset", "4", "numeric", ""),
				fb.text("ia.ss0", "4", "numeric", ""),
				fb.choice("ia.dmrs", "4", pick(dmrs, fb.f.Init.DMRS, nil)),
			}},
			bwpRow("ia.dl", "Initial DL BWP", fb.f.Init.DL),
			bwpRow("ia.ul", "Initial UL BWP", fb.f.Init.UL),
		},
	}
	if ia := fb.s.Result.InitialAccess; ia != nil {
		c := ia.CORESET0
		sec.Summary = fmt.Sprintf("CORESET#0 of %d RBs × %d symbols from CRB %d at %d kHz", c.NRB, c.Symbols, c.StartCRB, c.SCSKHz)
	}
	return finishSection(sec)
}

func (fb *formBuilder) prachSection() section {
	sets := []option{{Value: "", Label: "unrestrictedSet (default)"}, {Value: "unrestrictedSet", Label: "unrestrictedSet"},
		{Value: "restrictedSetTypeA", Label: "restrictedSetTypeA"}, {Value: "restrictedSetTypeB", Label: "restrictedSetTypeB"}}
	sec := section{
		Group: group{ID: planform.IDPRACH, Notes: fb.take(planform.IDPRACH)}, Title: "Random access", ClearOp: "clear.prach",
		Hint: "RACH-ConfigCommon: prach-ConfigurationIndex picks a row of TS 38.211 Table 6.3.3.2-2 (FR1 paired), -3 (FR1 unpaired) or -4 (FR2), by the range and the band's duplex mode; the occasions sit in the initial uplink BWP (or the first uplink partition) from msg1-FrequencyStart, msg1-FDM side by side. `gridloom prach PLAN` lists every index whose occasions all fit. Leave it empty for no random access.",
		Rows: []sectionRow{
			{Label: "Configuration", Controls: []control{
				fb.text("prach.idx", "4", "numeric", ""),
				fb.text("prach.scs", "4", "decimal", "BWP's"),
				fb.text("prach.fdm", "2", "numeric", "1"),
				fb.text("prach.start", "3", "numeric", "0"),
			}},
			{Label: "Preambles", Controls: []control{
				fb.text("prach.zcz", "2", "numeric", "0"),
				fb.choice("prach.set", "6", pick(sets, fb.f.PRACH.Set, nil)),
				fb.text("prach.ssbro", "4", "", "1"),
			}},
		},
	}
	if pr := fb.s.Result.PRACH; pr != nil {
		valid := 0
		for _, o := range pr.Occasions {
			if o.Valid {
				valid++
			}
		}
		sec.Summary = fmt.Sprintf("index %d, format %s: %d of %d occasions valid", pr.ConfigurationIndex, pr.Format, valid, len(pr.Occasions))
	}
	// The finder, for the plan as it stands: when the prach block has
	// errors the results have no Random access table, and this link (with
	// the prach finding's) is the way to an index that fits.
	sec.Find, sec.FindText = "/prach?"+fb.s.Query(), "Find a configuration index whose occasions all fit this plan"
	return finishSection(sec)
}

// finishSection names a section's clear button and opens it when the plan
// makes something of it or it holds a value or a message worth seeing.
func finishSection(sec section) section {
	sec.OpName, sec.ClearID = planform.KeyOp, "b-"+sec.ClearOp
	sec.Open = sec.Summary != "" || hasSerious(sec.Group.Notes)
	invalid := false
	for _, row := range sec.Rows {
		for _, c := range row.Controls {
			if strings.TrimSpace(c.Value) != "" || hasSerious(c.Notes) {
				sec.Open = true
			}
			invalid = invalid || c.invalid()
		}
	}
	if invalid {
		// A value being fixed leaves the block out of the plan, or in it
		// without that value: say so rather than "not in the plan" or a
		// summary of what the user did not type (issue 19).
		sec.Summary = "invalid: fix the marked field"
	}
	return sec
}

func plain(vals []string) []option {
	out := make([]option, len(vals))
	for i, v := range vals {
		out[i] = option{Value: v, Label: v}
	}
	return out
}

// part makes the fieldset of partition i: its controls, from the rows of
// planform.Fields, with the placement grid made of it as placeholders.
func (fb *formBuilder) part(i int) partView {
	s, rng, p := fb.s, fb.rng, fb.f.Parts[i]
	id := func(k string) string { return planform.PartControlID(i, k) }
	scsOpts := make([]string, 0, 4)
	for _, scs := range rng.DataSCS() {
		scsOpts = append(scsOpts, strconv.Itoa(scs))
	}
	dir := orDefault(p.Dir, grid.DefaultDirection)
	maxLayers := grid.Direction(strings.ToUpper(dir)).MaxLayers()
	layerOpts := make([]string, maxLayers)
	for k := range layerOpts {
		layerOpts[k] = strconv.Itoa(k + 1)
	}
	label := strings.TrimSpace(p.Name)
	if label == "" {
		label = fmt.Sprintf("partition %d", i+1)
	}
	pv := partView{
		Index: i, Group: group{ID: planform.PartGroupID(i), Notes: fb.take(planform.PartGroupID(i))},
		Legend: fmt.Sprintf("%d · %s", i+1, label), Label: label, LegendID: fmt.Sprintf("l-p%d", i),
		First: i == 0, Last: i == len(s.Form.Parts)-1, OpName: planform.KeyOp,
	}
	var placed *grid.Lattice
	for k := range s.Result.Partitions {
		if s.Result.Partitions[k].Index == i {
			placed = &s.Result.Partitions[k]
		}
	}
	ctl := func(key, size, mode string, opts []option) control {
		fl := planform.PartFieldOf(key)
		return control{ID: id(key), Name: fl.FullKey(i), Label: fl.Label, Value: *fl.Value(&fb.f, i), Size: size, InputMode: mode,
			Options: opts, Notes: fb.take(id(key))}
	}
	start, size, riv := ctl("start", "3", "numeric", nil), ctl("size", "3", "numeric", nil), ctl("riv", "6", "numeric", nil)
	if placed != nil {
		start.Placeholder = strconv.Itoa(placed.StartCRB)
		size.Placeholder = strconv.Itoa(placed.SizePRB)
		if placed.LocationAndBandwidth >= 0 {
			riv.Placeholder = strconv.Itoa(placed.LocationAndBandwidth)
		}
	}
	pv.Controls = []control{
		ctl("name", "5", "", nil),
		ctl("scs", "3", "", pick(plain(scsOpts), p.SCS, func(string) string { return "not a data SCS of " + rng.String() })),
		ctl("cp", "4", "", pick(plain([]string{"normal", "extended"}), orDefault(p.CP, grid.DefaultCP), nil)),
		start, size, riv,
		ctl("dir", "4", "", pick(plain([]string{"DL", "UL"}), dir, nil)),
		ctl("layers", "4", "", pick(plain(layerOpts), orDefault(p.Layers, "1"), func(string) string { return fmt.Sprintf("%s allows 1 to %d", dir, maxLayers) })),
		ctl("mod", "4", "", pick(plain(grid.ModulationNames()), orDefault(p.Mod, grid.DefaultModulation), nil)),
		ctl("cap", "4", "", pick([]option{{Value: "", Label: "1 (default)"}, {Value: "1", Label: "1"}, {Value: "2", Label: "2"}}, p.Cap, nil)),
		ctl("dmrs", "4", "", pick(append([]option{{Value: "", Label: "pos2 (default)"}}, plain(grid.DMRSPositions)...), p.DMRS, nil)),
	}
	for _, b := range []string{"up", "down", "dup", "del"} {
		fb.take(planform.ButtonID(b, i))
	}
	return pv
}

// pick marks cur selected among the allowed options. A current value that
// is not allowed stays in the list, marked, so that it is neither lost nor
// silently replaced; why says what is wrong with it.
func pick(allowed []option, cur string, why func(string) string) []option {
	out := make([]option, 0, len(allowed)+1)
	found := false
	for _, a := range allowed {
		a.Selected = a.Value == cur
		found = found || a.Selected
		out = append(out, a)
	}
	if !found {
		label := cur + " (not allowed)"
		if cur == "" {
			label = "(choose)"
		} else if why != nil {
			label = cur + " (" + why(cur) + ")"
		}
		out = append([]option{{Value: cur, Label: label, Selected: true}}, out...)
	}
	return out
}

// bandwidthOptions offers every channel bandwidth of the range. One that a
// spacing in use does not allow stays in the list, labelled with the
// spacings it lacks: hiding 60–100 MHz while a partition is at 15 kHz left a
// newcomer with no word why (issue 19); choosing it gives the finding that
// names the partition to change.
func bandwidthOptions(rng grid.Range, scsInUse []int, cur string) []option {
	var opts []option
	for _, bw := range rng.AllBandwidths() {
		v := strconv.Itoa(bw)
		var lacking []int
		for _, scs := range scsInUse {
			if !slices.Contains(rng.CommonBandwidths([]int{scs}), bw) {
				lacking = append(lacking, scs)
			}
		}
		label := v
		if len(lacking) > 0 {
			label = v + " (not at " + grid.JoinInts(lacking) + " kHz)"
		}
		opts = append(opts, option{Value: v, Label: label})
	}
	why := func(string) string { return "not a channel bandwidth of " + rng.String() }
	return pick(opts, strings.TrimSpace(cur), why)
}

// ssbSCSOptions offers the SS/PBCH spacings of the range as a list, like
// a partition's SCS, where free text invited values no case has (issue 19).
func ssbSCSOptions(rng grid.Range, cur string) []option {
	var vals []string
	for _, scs := range rng.SSBSCS() {
		vals = append(vals, strconv.Itoa(scs))
	}
	why := func(string) string { return "not an SS/PBCH spacing of " + rng.String() }
	return pick(plain(vals), strings.TrimSpace(cur), why)
}

func orDefault(s, def string) string {
	if strings.TrimSpace(s) == "" {
		return def
	}
	return s
}

func hasSerious(ns []note) bool {
	return slices.ContainsFunc(ns, func(n note) bool { return n.Severity != string(grid.Info) })
}

func placeholderCenter(res grid.Result) string {
	if res.Channel.Absolute {
		return strconv.FormatFloat(res.Channel.CenterHz.MHz(), 'f', -1, 64)
	}
	return "none"
}

// placeholderBand shows the band Compute checked the channel against when
// the plan names none.
func placeholderBand(res grid.Result) string {
	if res.Channel.Band != "" {
		return res.Channel.Band
	}
	return "any"
}

func placeholderARFCN(res grid.Result) string {
	if res.Channel.Absolute && res.Channel.OnRaster {
		return strconv.Itoa(res.Channel.ARFCN)
	}
	return "none"
}

// formShape names the set of controls: the live script swaps the whole form
// when it changes and patches it in place otherwise.
func formShape(f planform.Form, scsRows []int, scsCommon bool) string {
	parts := make([]string, len(scsRows))
	for i, scs := range scsRows {
		parts[i] = strconv.Itoa(scs)
	}
	shape := fmt.Sprintf("p%d;scs%s", len(f.Parts), strings.Join(parts, ","))
	if scsCommon {
		shape += ";common"
	}
	return shape
}

// figureView is the form's box of figure options.
type figureView struct {
	Group   group
	Open    bool
	Width   control
	Theme   control
	Caption control
	// Paper and rooms (issue 19): preset, time unit, PNG scale and dpi.
	Preset, TimeUnit, Scale, DPI control
	// Layers is one checkbox per layer, or, when the typed list does not
	// parse, LayersText: a text input holding it as typed, so nothing is
	// lost and the user can correct it.
	Layers     []checkbox
	LayersText *control
	Hint       string
	// ShowCaption is false where the page draws its own captions (the
	// comparison): the caption then rides along unseen, so a round trip
	// through that page keeps it.
	ShowCaption bool
}

type checkbox struct {
	ID, Name, Value, Label string
	Checked                bool
}

// buildFigureBox makes the figure box of st. planName is the caption's
// placeholder.
func buildFigureBox(st planform.FigureState, planName string) figureView {
	ff := st.Form
	note := func(key string) []note {
		if m, ok := st.Msgs[key]; ok {
			return []note{{Severity: "error", Text: m}}
		}
		return nil
	}
	text := func(key, label, value, mode, placeholder, size string) control {
		return control{ID: planform.KeyID(key), Name: key, Label: label, Value: value, InputMode: mode,
			Placeholder: placeholder, Size: size, Notes: note(key)}
	}
	capHolder := strings.TrimSpace(planName)
	if capHolder == "" {
		capHolder = "none (the plan has no name)"
	}
	fv := figureView{
		Group:   group{ID: planform.IDFigure},
		Width:   text(planform.KeyFigWidth, "Width (px)", ff.Width, "numeric", strconv.Itoa(render.DefaultWidth), "4"),
		Theme:   text(planform.KeyFigTheme, "Theme", ff.Theme, "", "", "4"),
		Caption: text(planform.KeyFigCaption, "Caption", ff.Caption, "", capHolder, "12"),
		Hint: "These options shape the figure on the page, the SVG and PNG downloads, the walkthrough and the comparison. " +
			"An empty caption is the plan's name; a single - draws none. " +
			"A preset lays the figure out for an A4 column, a slide or a poster so that no text prints below its least size; PNG scale and dpi shape the PNG download.",
		ShowCaption: true,
	}
	fv.Theme.Options = pick([]option{{Value: "light", Label: "light (screen)"}, {Value: "print", Label: "print (black and white)"}},
		orDefault(strings.ToLower(strings.TrimSpace(ff.Theme)), "light"), func(string) string { return "not a theme" })
	if _, bad := st.Msgs[planform.KeyFigLayers]; bad {
		c := text(planform.KeyFigLayers, "Layers shown", ff.Layers, "", "all", "12")
		fv.LayersText = &c
	} else {
		titles := render.LayerTitles()
		for i, name := range render.LayerNames() {
			fv.Layers = append(fv.Layers, checkbox{ID: planform.KeyID(planform.KeyFigLayers) + "-" + name, Name: planform.KeyFigLayers, Value: name,
				Label: titles[i], Checked: st.Opt.Layers.Shows(render.Layer(1 << i))})
		}
	}
	paperControls(&fv, ff, text)
	fv.Open = ff != planform.FigureForm{} || len(st.Msgs) > 0
	return fv
}

// paperControls fills the figure box's controls for paper and rooms: the
// preset and time unit as lists, the PNG's scale and dpi as numbers.
func paperControls(fv *figureView, ff planform.FigureForm, text func(key, label, value, mode, placeholder, size string) control) {
	fv.Preset = text(planform.KeyFigPreset, "Preset", ff.Preset, "", "", "4")
	presets := []option{{Value: "", Label: "none (width as set)"}}
	for _, p := range render.Presets() {
		presets = append(presets, option{Value: p.Name, Label: p.Title})
	}
	fv.Preset.Options = pick(presets, strings.ToLower(strings.TrimSpace(ff.Preset)), func(string) string { return "not a preset" })
	fv.TimeUnit = text(planform.KeyFigTimeUnit, "Time unit", ff.TimeUnit, "", "", "4")
	fv.TimeUnit.Options = pick([]option{{Value: "", Label: "auto (µs to 2 ms)"}, {Value: "us", Label: "µs"}, {Value: "ms", Label: "ms"}},
		strings.ToLower(strings.TrimSpace(ff.TimeUnit)), func(string) string { return "not a unit" })
	fv.Scale = text(planform.KeyFigScale, "PNG scale (×)", ff.Scale, "numeric", "1", "2")
	fv.DPI = text(planform.KeyFigDPI, "PNG dpi", ff.DPI, "numeric", "none", "4")
}

// summary is the box's closed line: what it holds, or what is set.
func (fv figureView) summary() string {
	var set []string
	if fv.Width.Value != "" {
		set = append(set, fv.Width.Value+" px")
	}
	if v := strings.TrimSpace(fv.Theme.Value); v != "" {
		set = append(set, v+" theme")
	}
	if fv.LayersText != nil {
		set = append(set, "layers "+fv.LayersText.Value)
	} else if n := len(fv.Layers) - countChecked(fv.Layers); n > 0 {
		set = append(set, plural(n, "layer", "layers")+" hidden")
	}
	if fv.ShowCaption && fv.Caption.Value != "" {
		set = append(set, "own caption")
	}
	if v := strings.TrimSpace(fv.Preset.Value); v != "" {
		set = append(set, v+" preset")
	}
	if v := strings.TrimSpace(fv.TimeUnit.Value); v != "" {
		set = append(set, "time in "+v)
	}
	if v := strings.TrimSpace(fv.Scale.Value); v != "" {
		set = append(set, "PNG ×"+v)
	}
	if v := strings.TrimSpace(fv.DPI.Value); v != "" {
		set = append(set, v+" dpi")
	}
	if len(set) == 0 {
		if fv.ShowCaption {
			return "width, theme, layers, caption, paper"
		}
		return "width, theme, layers, paper"
	}
	return strings.Join(set, ", ")
}

func countChecked(cs []checkbox) int {
	n := 0
	for _, c := range cs {
		if c.Checked {
			n++
		}
	}
	return n
}

// shape names the figure box's set of controls, for formShape.
func (fv figureView) shape() string {
	if fv.LayersText != nil {
		return "fig:text"
	}
	return "fig:boxes"
}
