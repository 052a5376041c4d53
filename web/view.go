package web

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/report"
)

// The view models of the page. Templates take these, never the request.

// pageView is everything the page and its live fragment show.
type pageView struct {
	Title   string // the document title
	Query   string // the canonical query of the form as shown
	Focus   string // id of the control to focus after an edit, or ""
	Status  int    // the HTTP status of the page of this plan: 200 or 422
	Form    formView
	Results resultsView
	Upload  uploadView
	Demos   []demoLink
}

type demoLink struct{ Href, Label string }

type uploadView struct {
	From  string // the query to come back to
	Notes []note
}

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
	PartsBox group // partitions as a whole
	Parts    []partView
	CanAdd   bool
	Figure   *figureView // the figure's options; nil where the page has its own box
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
	ClearOp string
	OpName  string // the query key of the clear button
	ClearID string // the id of the clear button
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

// buttonID is the id of the partition's edit button verb.
func (p partView) buttonID(verb string) string { return p.IDPrefix + buttonID(verb, p.Index) }

type resultsView struct {
	Errors, Warnings, Infos int
	Placed, Total           int
	Figure                  string // the inline SVG markup, or "" when FigureErr says why not
	FigureErr               string
	FigureAlt               string
	Lattice                 latticeData
	Downloads               []download
	Views                   []download // the walkthrough and the comparison of this plan
	Findings                []findingView
	Parts                   []partRow
	Carriers                []carrierRow
	Channel                 []fact
	Absolute                bool
	SpanMs                  int
	HasTDD                  bool
	SSB                     *ssbView
	Fit                     *fitView
}

type ssbView struct {
	Facts  []fact
	Blocks []ssbRow
}

type ssbRow struct{ Index, Slot, Symbol, StartUs, EndUs string }

type fitView struct {
	Facts     []fact
	Criteria  []string // rule names, the columns
	Rules     []string // the rules in words, for the column headers' titles
	Rows      []fitRow
	Suggested string
	Caution   string
}

type fitRow struct {
	Name, Numerology, Verdict string
	Cells                     []fitCell
}

type fitCell struct{ Value, Verdict string }

type download struct {
	Label, Href, TestID, Hint string
}

type findingView struct {
	Severity, Code, Text, Partition string
	Control, ControlLabel           string // the control it concerns: its id and label
}

type fact struct{ Label, Value string }

type partRow struct {
	Name, Mu, SCS, CP, Slots, Symbols, SlotUs, UsefulUs, CPUs string
	MiniSlotsUs                                               string // 2, 4 and 7 symbols
	PRBs, CRBs, OccupiedMHz, LowKHz, HighKHz, LowMHz, HighMHz string
	RIV, Link, PeakMbps, Share                                string
}

type carrierRow struct {
	SCS, NRB, CarrierBW, Offset, Chosen, CRBs  string
	GuardLow, GuardHigh, MinGuard              string
	GuardLowShort, GuardHighShort, SizeReduced bool
}

// latticeData is what the page script needs to read the figure: per
// partition the numerology and the placement, in the units of the figure's
// hover contract (Tc and Hz from point A).
type latticeData struct {
	SpanTc   int64         `json:"spanTc"`
	PointAHz *int64        `json:"pointAHz"`
	Parts    []latticePart `json:"parts"`
	SSB      []latticeSSB  `json:"ssb"`
}

type latticePart struct {
	Plan           int    `json:"plan"` // index in the plan's partitions
	Name           string `json:"name"`
	Mu             int    `json:"mu"`
	Extended       bool   `json:"extended"`
	SCSHz          int64  `json:"scsHz"`
	StartCRB       int    `json:"startCrb"`
	SizePRB        int    `json:"sizePrb"`
	LowHz          int64  `json:"lowHz"`
	HighHz         int64  `json:"highHz"`
	Symbols        int    `json:"symbols"`
	SymbolsPerSlot int    `json:"symbolsPerSlot"`
	// Dirs is the TDD direction of each symbol, one letter (D, U or F)
	// per symbol; empty without a TDD pattern.
	Dirs string `json:"dirs,omitempty"`
}

type latticeSSB struct {
	Index   int   `json:"index"`
	StartTc int64 `json:"startTc"`
	EndTc   int64 `json:"endTc"`
	LowHz   int64 `json:"lowHz"`
	HighHz  int64 `json:"highHz"`
}

// Control ids. Findings name plan paths; controlID turns one into the id
// of the control (or group) beside which its message belongs. A control's
// id is its query key with dots as hyphens (see controlIDOfKey).
const (
	idCarriers, idParts, idFile, idAdd = "g-carriers", "g-parts", "f-file", "b-add"
	idTDD, idSSB, idEnv, idForm        = "g-tdd", "g-ssb", "g-env", "gl-form"
)

var partIDKey = map[string]string{
	"name": "name", "scsKHz": "scs", "cp": "cp", "startCrb": "start", "sizePrb": "size",
	"locationAndBandwidth": "riv", "direction": "dir", "layers": "layers", "modulation": "mod",
}

func partControlID(i int, key string) string { return fmt.Sprintf("f-p%d-%s", i, key) }
func partGroupID(i int) string               { return fmt.Sprintf("g-p%d", i) }
func buttonID(verb string, i int) string     { return fmt.Sprintf("b-%s-%d", verb, i) }
func noteID(id string) string                { return "n-" + id }

// pathIDs maps the plan path of every plan-level field to its control.
var pathIDs = func() map[string]string {
	m := map[string]string{
		"carrier.offsetToCarrier": idCarriers, "carrier.carrierBandwidth": idCarriers, "carrier": idCarriers,
		"partitions": idParts, "tdd": idTDD, "tdd.pattern1": idTDD, "tdd.pattern2": idTDD,
		"ssb": idSSB, "environment": idEnv,
	}
	for _, sf := range simpleFields {
		m[sf.path] = controlIDOfKey(sf.key)
	}
	return m
}()

func controlID(field string) string {
	if id, ok := pathIDs[field]; ok {
		return id
	}
	if s, ok := strings.CutPrefix(field, "carrier.offsetToCarrier."); ok {
		return "f-off-" + s
	}
	if s, ok := strings.CutPrefix(field, "carrier.carrierBandwidth."); ok {
		return "f-cbw-" + s
	}
	if s, ok := strings.CutPrefix(field, "partitions["); ok {
		num, rest, ok := strings.Cut(s, "]")
		i, okIdx := index(num)
		if !ok || !okIdx {
			return ""
		}
		if key, ok := partIDKey[strings.TrimPrefix(rest, ".")]; ok {
			return partControlID(i, key)
		}
		return partGroupID(i)
	}
	return ""
}

// state is one form with everything computed from it.
type state struct {
	form     Form // as typed (after any edit and RIV fill)
	plan     grid.Plan
	inputErr Messages // values that did not parse, and query problems
	res      grid.Result
	fig      figureState // the figure's options, read by withFigure
}

// withFigure returns s with the figure options ff.
func (s state) withFigure(ff FigureForm) state {
	s.fig = newFigureState(ff, s.plan.Name)
	return s
}

// query is the canonical query of s: the plan's keys, then the figure's.
func (s state) query() string { return joinQuery(s.form.Query(), s.fig.form.query()) }

// newState reads and computes a form. The RIV fill is applied to the form
// that is shown, after computing, so that the messages match it.
func newState(f Form, queryMsgs Messages) state {
	plan, msgs := f.Plan()
	for k, v := range queryMsgs {
		msgs.add(k, "%s", v)
	}
	res := grid.Compute(plan)
	return state{form: fill(f, res), plan: plan, inputErr: msgs, res: res}
}

// status is the HTTP status of a page of this state: 422 when a value did
// not parse (of the plan or of the figure's options) or the plan has error
// findings.
func (s state) status() int {
	if len(s.inputErr) > 0 || len(s.fig.msgs) > 0 || s.res.HasErrors() {
		return 422
	}
	return 200
}

// buildView makes the page view of a state. figure is the inline SVG or an
// error from drawing it.
func buildView(s state, figure string, figErr error, demos []demoLink) pageView {
	q := s.query()
	notes := s.notes()
	v := pageView{
		Title:  pageTitle(s.form.Name),
		Query:  q,
		Status: s.status(),
		Demos:  demos,
		Upload: uploadView{
			From:  q,
			Notes: notes[idFile],
		},
	}
	v.Form = buildForm(s, notes)
	fig := buildFigureView(s.fig, s.plan.Name)
	v.Form.Figure = &fig
	v.Form.Shape += ";" + fig.shape()
	v.Results = buildResults(s, q, figure, figErr)
	return v
}

// shape names the figure box's set of controls, for formShape.
func (fv figureView) shape() string {
	if fv.LayersText != nil {
		return "fig:text"
	}
	return "fig:boxes"
}

func pageTitle(name string) string {
	if strings.TrimSpace(name) == "" {
		return "gridloom"
	}
	return name + " · gridloom"
}

// notes collects the messages per control id: values that did not parse
// first, then the findings. A finding on a field whose value did not parse
// is left out, since it would judge a value the user did not give.
func (s state) notes() map[string][]note {
	out := map[string][]note{}
	for _, field := range sortedKeys(s.inputErr) {
		id := controlID(field)
		out[id] = append(out[id], note{Severity: string(grid.Error), Text: s.inputErr[field]})
	}
	for _, f := range s.res.Findings {
		if _, bad := s.inputErr[f.Field]; bad {
			continue
		}
		id := controlID(f.Field)
		out[id] = append(out[id], note{Severity: string(f.Severity), Text: f.Message})
	}
	return out
}

func sortedKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func buildForm(s state, notes map[string][]note) formView {
	f := s.form
	rng := rangeOf(f.Range)
	shown := map[string]bool{} // ids of the controls and groups on the form
	take := func(id string) []note {
		shown[id] = true
		return notes[id]
	}
	// text and choice make the control of a plan-level field from its key.
	text := func(key, label, size, mode, placeholder string) control {
		id := controlIDOfKey(key)
		f := f
		return control{ID: id, Name: key, Label: label, Value: *fieldByKey(&f, key), Size: size, InputMode: mode,
			Placeholder: placeholder, Notes: take(id)}
	}
	choice := func(key, label, size string, opts []option) control {
		c := text(key, label, size, "", "")
		c.Options = opts
		return c
	}
	fv := formView{CanAdd: len(f.Parts) < grid.MaxPartitions, OpName: keyOp}

	spans := []option{{Value: "", Label: "auto (TDD period or 1)"}}
	for i := 1; i <= grid.MaxSpanMs; i++ {
		spans = append(spans, option{Value: strconv.Itoa(i), Label: strconv.Itoa(i)})
	}
	fv.Plan = []control{
		text("name", "Plan name", "12", "", "untitled"),
		choice("span", "Span (ms)", "6", pick(spans, f.Span, nil)),
		text("gap", "Numerology gap (kHz)", "6", "decimal", "1 PRB of the wider SCS"),
	}

	scsInUse := s.scsInUse()
	fv.Carrier = []control{
		choice("range", "Frequency range", "6", pick(plain(grid.RangeNames()), orDefault(f.Range, grid.DefaultRange), nil)),
		text("band", "Operating band", "6", "", placeholderBand(s.res)),
		choice("bw", "Channel bandwidth (MHz)", "6", bandwidthOptions(rng, scsInUse, f.Bandwidth)),
		text("fc", "Centre (MHz)", "6", "decimal", placeholderCenter(s.res)),
		text("arfcn", "NR-ARFCN", "6", "numeric", placeholderARFCN(s.res)),
	}

	// One row per data SCS of the range, and per spacing the form names
	// besides, so that nothing typed disappears when the range changes.
	scsList := rng.DataSCS()
	for _, m := range []map[int]string{f.Offset, f.CarrierBW} {
		for scs := range m {
			if !slices.Contains(scsList, scs) {
				scsList = append(scsList, scs)
			}
		}
	}
	slices.Sort(scsList)
	for _, scs := range scsList {
		row := scsRow{SCSKHz: scs, InUse: slices.Contains(scsInUse, scs)}
		offKey, cbwKey := keyOffset+strconv.Itoa(scs), keyCarrierBW+strconv.Itoa(scs)
		offID, cbwID := controlIDOfKey(offKey), controlIDOfKey(cbwKey)
		row.Offset = control{ID: offID, Name: offKey, Label: fmt.Sprintf("offsetToCarrier at %d kHz (CRBs)", scs),
			Value: f.Offset[scs], Size: "12", InputMode: "numeric", Notes: take(offID)}
		row.CarrierBW = control{ID: cbwID, Name: cbwKey, Label: fmt.Sprintf("carrierBandwidth at %d kHz (PRBs)", scs),
			Value: f.CarrierBW[scs], Size: "12", InputMode: "numeric", Notes: take(cbwID)}
		if c, ok := s.res.Carrier(scs); ok {
			row.Offset.Placeholder = strconv.Itoa(c.OffsetToCarrier)
			row.CarrierBW.Placeholder = strconv.Itoa(c.CarrierBandwidth)
		} else if n, ok := rng.NRB(scs, s.plan.Carrier.BandwidthMHz); ok {
			row.CarrierBW.Placeholder = strconv.Itoa(n)
		}
		if row.Offset.Value != "" || row.CarrierBW.Value != "" || hasSerious(row.Offset.Notes) || hasSerious(row.CarrierBW.Notes) {
			fv.SCSOpen = true
		}
		fv.SCSRows = append(fv.SCSRows, row)
	}
	fv.Carriers = group{ID: idCarriers, Notes: take(idCarriers)}
	if hasSerious(fv.Carriers.Notes) {
		fv.SCSOpen = true
	}

	// TDD pattern.
	refOpts := []option{{Value: "", Label: "—"}}
	for _, scs := range rng.DataSCS() {
		refOpts = append(refOpts, option{Value: strconv.Itoa(scs), Label: strconv.Itoa(scs)})
	}
	periods := []option{{Value: "", Label: "—"}}
	for _, ms := range grid.TDDPeriodsMs {
		v := strconv.FormatFloat(ms, 'f', -1, 64)
		periods = append(periods, option{Value: v, Label: v})
	}
	patternRow := func(prefix, label string) sectionRow {
		return sectionRow{Label: label, Controls: []control{
			choice(prefix+".ms", "Period (ms)", "4", pick(periods, *fieldByKey(&f, prefix+".ms"), nil)),
			text(prefix+".dl", "DL slots", "2", "numeric", ""),
			text(prefix+".dlsym", "DL sym", "2", "numeric", ""),
			text(prefix+".ulsym", "UL sym", "2", "numeric", ""),
			text(prefix+".ul", "UL slots", "2", "numeric", ""),
		}}
	}
	fv.TDD = section{
		Group: group{ID: idTDD, Notes: take(idTDD)}, Title: "TDD pattern", ClearOp: "clear.tdd",
		Hint: "TDD-UL-DL-ConfigCommon: downlink slots and symbols open each period, uplink symbols and slots close it, the rest is flexible. Leave it empty for no pattern.",
		Rows: []sectionRow{
			{Label: "Reference", Controls: []control{choice("tdd.ref", "Reference SCS (kHz)", "6", pick(refOpts, f.TDD.Ref, nil))}},
			patternRow("tdd", "Pattern 1"),
			patternRow("tdd2", "Pattern 2 (optional)"),
		},
	}
	if t := s.res.TDD; t != nil {
		fv.TDD.Summary = fmt.Sprintf("%s on %d kHz, every %s ms", t.SlotString(), t.Reference.SCSKHz(),
			strconv.FormatFloat(float64(t.Period)/float64(grid.TcPerSubframe), 'f', -1, 64))
	}

	// SS/PBCH blocks.
	cases := []option{{Value: "", Label: "from the SCS"}}
	for _, c := range []string{"A", "B", "C", "D", "E", "F", "G"} { // TS 38.213 4.1
		cases = append(cases, option{Value: c, Label: c})
	}
	ssbPeriods := []option{{Value: "", Label: "20 (default)"}}
	for _, ms := range grid.SSBPeriodsMs {
		ssbPeriods = append(ssbPeriods, option{Value: strconv.Itoa(ms), Label: strconv.Itoa(ms)})
	}
	fv.SSB = section{
		Group: group{ID: idSSB, Notes: take(idSSB)}, Title: "SS/PBCH blocks", ClearOp: "clear.ssb",
		Hint: "offsetToPointA counts RBs of 15 kHz (FR1) or 60 kHz (FR2); k_SSB counts subcarriers. A GSCN places the block on the synchronization raster and sets both. The bitmap is ssb-PositionsInBurst, empty for every candidate.",
		Rows: []sectionRow{
			{Label: "Blocks", Controls: []control{
				text("ssb.scs", "SCS (kHz)", "4", "numeric", ""),
				choice("ssb.case", "Case", "4", pick(cases, f.SSB.Case, nil)),
				choice("ssb.period", "Period (ms)", "4", pick(ssbPeriods, f.SSB.Period, nil)),
				text("ssb.bitmap", "Bitmap (ssb-PositionsInBurst)", "12", "numeric", "all candidates"),
			}},
			{Label: "Position", Controls: []control{
				text("ssb.off", "offsetToPointA", "4", "numeric", ""),
				text("ssb.k", "k_SSB", "4", "numeric", "0"),
				text("ssb.common", "SCS common", "4", "numeric", ""),
				text("ssb.gscn", "GSCN", "6", "numeric", "or the offsets"),
			}},
		},
	}
	if b := s.res.SSB; b != nil {
		fv.SSB.Summary = fmt.Sprintf("case %s, %d of %d candidates sent in the span", b.Case, len(b.Blocks), b.Candidates)
	}

	// Radio channel for the numerology fit.
	profiles := []option{{Value: "", Label: "— (give a spread)"}}
	for _, d := range grid.DelayProfiles {
		profiles = append(profiles, option{Value: d.Name, Label: fmt.Sprintf("%s (%s ns)", d.Name, strconv.FormatFloat(d.Ns, 'f', -1, 64))})
	}
	fv.Env = section{
		Group: group{ID: idEnv, Notes: take(idEnv)}, Title: "Radio channel", ClearOp: "clear.env",
		Hint: "For the numerology fit: first-order rules that weigh CP against delay spread and SCS against Doppler. Leave it empty to skip the fit.",
		Rows: []sectionRow{{Label: "Channel", Controls: []control{
			choice("env.profile", "Delay profile", "6", pick(profiles, f.Env.Profile, nil)),
			text("env.ds", "Delay spread (ns)", "6", "decimal", ""),
			text("env.speed", "Speed (km/h)", "6", "decimal", "0"),
			text("env.fc", "Carrier for Doppler (MHz)", "6", "decimal", placeholderCenter(s.res)),
		}}},
	}
	if fit := s.res.Fit; fit != nil {
		fv.Env.Summary = fmt.Sprintf("the rules favour %d kHz %s CP", fit.Suggested.SCSKHz, fit.Suggested.CP)
	}
	for _, sec := range []*section{&fv.TDD, &fv.SSB, &fv.Env} {
		sec.OpName, sec.ClearID = keyOp, "b-"+sec.ClearOp
		sec.Open = sec.Summary != "" || hasSerious(sec.Group.Notes)
		for _, row := range sec.Rows {
			for _, c := range row.Controls {
				if strings.TrimSpace(c.Value) != "" || hasSerious(c.Notes) {
					sec.Open = true
				}
			}
		}
	}

	fv.PartsBox = group{ID: idParts, Notes: take(idParts)}
	for i, p := range f.Parts {
		fv.Parts = append(fv.Parts, buildPart(s, i, p, rng, take))
	}
	take(idAdd)
	take(idFile)

	// Whatever no control on the form took goes on top of the form.
	for _, id := range sortedKeys(notes) {
		if !shown[id] {
			fv.General = append(fv.General, notes[id]...)
		}
	}
	fv.Shape = formShape(f, scsList)
	return fv
}

// fieldByKey returns the Form field of a plan-level query key.
func fieldByKey(f *Form, key string) *string {
	for _, sf := range simpleFields {
		if sf.key == key {
			return sf.val(f)
		}
	}
	panic("web: no form field " + key)
}

func plain(vals []string) []option {
	out := make([]option, len(vals))
	for i, v := range vals {
		out[i] = option{Value: v, Label: v}
	}
	return out
}

func buildPart(s state, i int, p PartForm, rng grid.Range, take func(string) []note) partView {
	id := func(k string) string { return partControlID(i, k) }
	name := func(k string) string { return fmt.Sprintf("p%d.%s", i, k) }
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
		Index: i, Group: group{ID: partGroupID(i), Notes: take(partGroupID(i))},
		Legend: fmt.Sprintf("%d · %s", i+1, label), Label: label, LegendID: fmt.Sprintf("l-p%d", i),
		First: i == 0, Last: i == len(s.form.Parts)-1, OpName: keyOp,
	}
	var placed *grid.Lattice
	for k := range s.res.Partitions {
		if s.res.Partitions[k].Index == i {
			placed = &s.res.Partitions[k]
		}
	}
	start := control{ID: id("start"), Name: name("start"), Label: "Start CRB", Value: p.Start, Size: "3", InputMode: "numeric", Notes: take(id("start"))}
	size := control{ID: id("size"), Name: name("size"), Label: "Size (PRB)", Value: p.Size, Size: "3", InputMode: "numeric", Notes: take(id("size"))}
	riv := control{ID: id("riv"), Name: name("riv"), Label: "locationAndBandwidth", Value: p.RIV, Size: "6", InputMode: "numeric", Notes: take(id("riv"))}
	if placed != nil {
		start.Placeholder = strconv.Itoa(placed.StartCRB)
		size.Placeholder = strconv.Itoa(placed.SizePRB)
		if placed.LocationAndBandwidth >= 0 {
			riv.Placeholder = strconv.Itoa(placed.LocationAndBandwidth)
		}
	}
	pv.Controls = []control{
		{ID: id("name"), Name: name("name"), Label: "Name", Value: p.Name, Size: "5", Notes: take(id("name"))},
		{ID: id("scs"), Name: name("scs"), Label: "SCS (kHz)", Value: p.SCS, Size: "3", Notes: take(id("scs")),
			Options: pick(plain(scsOpts), p.SCS, func(v string) string { return "not a data SCS of " + rng.String() })},
		{ID: id("cp"), Name: name("cp"), Label: "CP", Value: p.CP, Size: "4", Notes: take(id("cp")),
			Options: pick(plain([]string{"normal", "extended"}), orDefault(p.CP, grid.DefaultCP), nil)},
		start, size, riv,
		{ID: id("dir"), Name: name("dir"), Label: "Direction", Value: p.Dir, Size: "4", Notes: take(id("dir")),
			Options: pick(plain([]string{"DL", "UL"}), dir, nil)},
		{ID: id("layers"), Name: name("layers"), Label: "Layers", Value: p.Layers, Size: "4", Notes: take(id("layers")),
			Options: pick(plain(layerOpts), orDefault(p.Layers, "1"), func(string) string { return fmt.Sprintf("%s allows 1 to %d", dir, maxLayers) })},
		{ID: id("mod"), Name: name("mod"), Label: "Modulation", Value: p.Mod, Size: "4", Notes: take(id("mod")),
			Options: pick(plain(grid.ModulationNames()), orDefault(p.Mod, grid.DefaultModulation), nil)},
	}
	for _, b := range []string{"up", "down", "dup", "del"} {
		take(buttonID(b, i))
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

// bandwidthOptions offers the channel bandwidths that every spacing in use
// allows in the range, or all of the range's when no spacing is usable.
func bandwidthOptions(rng grid.Range, scsInUse []int, cur string) []option {
	var allowed []int
	if len(scsInUse) == 0 {
		allowed = rng.AllBandwidths()
	} else {
		allowed = rng.Bandwidths(scsInUse[0])
		for _, scs := range scsInUse[1:] {
			other := rng.Bandwidths(scs)
			allowed = slices.DeleteFunc(allowed, func(bw int) bool { return !slices.Contains(other, bw) })
		}
	}
	vals := make([]string, len(allowed))
	for i, bw := range allowed {
		vals[i] = strconv.Itoa(bw)
	}
	why := func(string) string {
		if len(scsInUse) == 0 {
			return "not a channel bandwidth of " + rng.String()
		}
		return "not defined for " + grid.JoinInts(scsInUse) + " kHz in " + rng.String()
	}
	if len(vals) == 0 && len(scsInUse) > 0 {
		// The spacings in use share no bandwidth: offer the range's, and
		// let the findings say which spacing cannot have it.
		return bandwidthOptions(rng, nil, cur)
	}
	return pick(plain(vals), strings.TrimSpace(cur), why)
}

// scsInUse lists the spacings of the form's partitions that are data
// spacings of its range, ascending.
func (s state) scsInUse() []int {
	rng := rangeOf(s.plan.Carrier.Range)
	var out []int
	for _, p := range s.plan.Partitions {
		if slices.Contains(rng.DataSCS(), p.SCSKHz) && !slices.Contains(out, p.SCSKHz) {
			out = append(out, p.SCSKHz)
		}
	}
	slices.Sort(out)
	return out
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
func formShape(f Form, scsRows []int) string {
	parts := make([]string, len(scsRows))
	for i, scs := range scsRows {
		parts[i] = strconv.Itoa(scs)
	}
	return fmt.Sprintf("p%d;scs%s", len(f.Parts), strings.Join(parts, ","))
}

func buildResults(s state, query string, figure string, figErr error) resultsView {
	res := s.res
	doc := report.Build(res, false)
	rv := resultsView{
		Placed: len(res.Partitions), Total: len(s.plan.Partitions),
		Figure: figure, Absolute: res.Channel.Absolute, SpanMs: res.Plan.SpanMs,
		FigureAlt: fmt.Sprintf("Lattice of %d partitions over %d ms", len(res.Partitions), res.Plan.SpanMs),
	}
	if figErr != nil {
		rv.Figure = ""
		rv.FigureErr = "The figure could not be drawn: " + figErr.Error()
	}
	rv.Errors = len(s.inputErr)
	for _, field := range sortedKeys(s.inputErr) {
		rv.Findings = append(rv.Findings, findingView{Severity: string(grid.Error), Code: "input", Text: s.inputErr[field],
			Control: controlID(field), ControlLabel: fieldLabel(field)})
	}
	for _, f := range res.Findings {
		if _, bad := s.inputErr[f.Field]; bad {
			continue
		}
		switch f.Severity {
		case grid.Error:
			rv.Errors++
		case grid.Warning:
			rv.Warnings++
		default:
			rv.Infos++
		}
		rv.Findings = append(rv.Findings, findingView{Severity: string(f.Severity), Code: f.Code, Text: f.Message,
			Partition: f.Partition, Control: controlID(f.Field), ControlLabel: fieldLabel(f.Field)})
	}
	figFindings := s.fig.findings()
	rv.Errors += len(figFindings)
	rv.Findings = append(rv.Findings, figFindings...)
	// Errors first, then warnings, then notes; in finding order within each.
	rank := map[string]int{string(grid.Error): 0, string(grid.Warning): 1, string(grid.Info): 2}
	slices.SortStableFunc(rv.Findings, func(a, b findingView) int { return rank[a.Severity] - rank[b.Severity] })

	look := s.fig.describe()
	rv.Downloads = []download{
		{Label: "Figure (SVG)", Href: "/figure.svg?" + withKey(query, "download", "1"), TestID: "download-svg", Hint: "the lattice as drawn, " + look + ", with the plan inside: drop it on the page to open it again"},
		{Label: "Figure (PNG)", Href: "/figure.png?" + withKey(query, "download", "1"), TestID: "download-png", Hint: "the lattice as an image, " + look},
		{Label: "Plan (JSON)", Href: "/plan.json?" + query, TestID: "download-json", Hint: "a plan file to open again"},
		{Label: "Plan (YAML)", Href: "/plan.yaml?" + query, TestID: "download-yaml", Hint: "a plan file to open again"},
		{Label: "Symbols (CSV)", Href: "/symbols.csv?" + query, TestID: "download-csv", Hint: "one row per OFDM symbol"},
		{Label: "Figure options…", Href: "#" + idFigure, TestID: "figure-options-link", Hint: "width, theme, layers and caption of the figure and its downloads"},
	}
	rv.Views = []download{
		{Label: "Walk through it", Href: "/walk?" + query, TestID: "open-walk", Hint: "the plan step by step, for presenting to a team"},
		{Label: "Compare with…", Href: "/compare?" + compareQuery(s.form, copyForm(s.form), s.fig.form), TestID: "open-compare", Hint: "this plan as A against an editable copy as B"},
	}

	for _, p := range doc.Partitions {
		row := partRow{
			Name: p.Name, Mu: strconv.Itoa(p.Mu), SCS: strconv.Itoa(p.SCSKHz), CP: p.CP,
			Slots: strconv.Itoa(p.Slots), Symbols: strconv.Itoa(p.SymbolCount),
			SlotUs: us(p.SlotUs), UsefulUs: us(p.UsefulUs), CPUs: us(p.CPUs),
			MiniSlotsUs: us(p.MiniSlotUs["2"]) + " / " + us(p.MiniSlotUs["4"]) + " / " + us(p.MiniSlotUs["7"]),
			PRBs:        strconv.Itoa(p.SizePRB), CRBs: fmt.Sprintf("%d–%d", p.StartCRB, p.StartCRB+p.SizePRB-1),
			OccupiedMHz: strconv.FormatFloat(p.OccupiedMHz, 'f', 2, 64),
			LowKHz:      exact(p.LowKHz), HighKHz: exact(p.HighKHz),
			RIV:      "—",
			Link:     fmt.Sprintf("%s %d×%s", p.Direction, p.Layers, p.Modulation),
			PeakMbps: strconv.FormatFloat(p.PeakMbps, 'f', 1, 64),
		}
		if p.CP == "normal" {
			row.CPUs = us(p.CPUs) + " (" + us(p.LongCPUs) + ")"
		}
		if res.TDD != nil {
			row.Share = strconv.FormatFloat(p.Share*100, 'f', 1, 64) + " % " + p.Direction
		}
		if p.LocationAndBandwidth != nil {
			row.RIV = strconv.Itoa(*p.LocationAndBandwidth)
		}
		if p.LowMHz != nil && p.HighMHz != nil {
			row.LowMHz, row.HighMHz = exact(*p.LowMHz), exact(*p.HighMHz)
		}
		rv.Parts = append(rv.Parts, row)
	}
	for _, c := range res.Carriers {
		nrb, cbw := c.NRB, c.CarrierBandwidth
		rv.Carriers = append(rv.Carriers, carrierRow{
			SCS: strconv.Itoa(c.SCSKHz), NRB: strconv.Itoa(nrb), CarrierBW: strconv.Itoa(cbw),
			Offset: strconv.Itoa(c.OffsetToCarrier), Chosen: yesNo(c.Chosen, "chosen", "given"),
			CRBs:     fmt.Sprintf("%d–%d", c.OffsetToCarrier, c.OffsetToCarrier+cbw-1),
			GuardLow: exact(c.GuardLow.KHz()), GuardHigh: exact(c.GuardHigh.KHz()), MinGuard: exact(c.MinGuard.KHz()),
			GuardLowShort: c.GuardLow < c.MinGuard, GuardHighShort: c.GuardHigh < c.MinGuard, SizeReduced: cbw < nrb,
		})
	}
	ch := doc.Channel
	rv.Channel = []fact{
		{"Range", ch.Range},
		{"Channel", fmt.Sprintf("%d MHz: %s to %s kHz from point A", ch.BandwidthMHz, exact(ch.LowKHz), exact(ch.HighKHz))},
	}
	if ch.CenterMHz != nil {
		centre := exact(*ch.CenterMHz) + " MHz"
		if ch.ARFCN != nil {
			centre += fmt.Sprintf(" (NR-ARFCN %d)", *ch.ARFCN)
		}
		rv.Channel = append(rv.Channel, fact{"Centre", centre})
	} else {
		rv.Channel = append(rv.Channel, fact{"Centre", exact(ch.CenterKHz) + " kHz from point A (no absolute frequency given)"})
	}
	if ch.PointAMHz != nil {
		pa := exact(*ch.PointAMHz) + " MHz"
		if ch.PointAARFCN != nil {
			pa += fmt.Sprintf(" (absoluteFrequencyPointA %d)", *ch.PointAARFCN)
		}
		rv.Channel = append(rv.Channel, fact{"Point A", pa})
	}
	rv.Channel = append(rv.Channel, fact{"Channel use", strconv.FormatFloat(ch.UsePercent, 'f', 2, 64) + " %"})
	if t := doc.TDD; t != nil {
		rv.HasTDD = true
		rv.Channel = append(rv.Channel, fact{"TDD pattern", fmt.Sprintf("%s on %d kHz slots, period %s ms", t.Slots, t.ReferenceSCSKHz, exact(t.PeriodMs))})
	}
	if b := doc.SSB; b != nil {
		sv := &ssbView{Facts: []fact{
			{"Case", fmt.Sprintf("%s at %d kHz", b.Case, b.SCSKHz)},
			{"Candidates (L_max)", fmt.Sprintf("%d (ssb-PositionsInBurst %s)", b.Candidates, b.BitmapForm)},
			{"Period", strconv.Itoa(b.PeriodMs) + " ms"},
			{"Sent in the span", strconv.Itoa(len(b.Blocks))},
			{"Placement", fmt.Sprintf("offsetToPointA %d, k_SSB %d, subCarrierSpacingCommon %d kHz", b.OffsetToPointA, b.KSSB, b.ScsCommonKHz)},
		}}
		if b.SSRefMHz != nil {
			ref := exact(*b.SSRefMHz) + " MHz"
			if b.AbsoluteFrequencySSB != nil {
				ref += fmt.Sprintf(", absoluteFrequencySSB %d", *b.AbsoluteFrequencySSB)
			}
			if b.GSCN != nil {
				ref += fmt.Sprintf(", GSCN %d", *b.GSCN)
			} else {
				ref += ", off the synchronization raster"
			}
			sv.Facts = append(sv.Facts, fact{"SS_REF", ref})
		}
		if len(b.Blocks) > 0 {
			sv.Facts = append(sv.Facts, fact{"Frequency", fmt.Sprintf("%s to %s kHz from point A", exact(b.Blocks[0].LowKHz), exact(b.Blocks[0].HighKHz))})
		}
		for _, blk := range b.Blocks {
			sv.Blocks = append(sv.Blocks, ssbRow{Index: strconv.Itoa(blk.Index), Slot: strconv.Itoa(blk.Slot), Symbol: strconv.Itoa(blk.Symbol),
				StartUs: us(blk.StartTc.Micros()), EndUs: us(blk.EndTc.Micros())})
		}
		rv.SSB = sv
	}
	if fit := doc.Fit; fit != nil {
		fv := &fitView{Caution: fit.Caution, Facts: []fact{
			{"RMS delay spread", exact(fit.DelaySpreadNs) + " ns"},
			{"Coherence bandwidth", strconv.FormatFloat(fit.CoherenceBWKHz, 'f', 1, 64) + " kHz"},
			{"Speed", exact(fit.SpeedKmh) + " km/h"},
			{"Doppler shift", strconv.FormatFloat(fit.DopplerHz, 'f', 2, 64) + " Hz"},
		}}
		if fit.CoherenceTimeUs > 0 {
			fv.Facts = append(fv.Facts, fact{"Coherence time", strconv.FormatFloat(fit.CoherenceTimeUs, 'f', 1, 64) + " µs"})
		}
		fv.Suggested = fmt.Sprintf("%d kHz, %s CP (%s)", fit.Suggested.SCSKHz, fit.Suggested.CP, fit.Suggested.Verdict)
		for i, nf := range fit.Partitions {
			name := ""
			if i < len(doc.Partitions) {
				name = doc.Partitions[i].Name
			}
			row := fitRow{Name: name, Numerology: fmt.Sprintf("%d kHz %s", nf.SCSKHz, nf.CP), Verdict: string(nf.Verdict)}
			for _, c := range nf.Criteria {
				if i == 0 {
					fv.Criteria = append(fv.Criteria, criterionLabel(c.Name))
					fv.Rules = append(fv.Rules, c.Rule)
				}
				row.Cells = append(row.Cells, fitCell{Value: strconv.FormatFloat(c.Value, 'g', 3, 64), Verdict: string(c.Verdict)})
			}
			fv.Rows = append(fv.Rows, row)
		}
		rv.Fit = fv
	}

	rv.Lattice = latticeData{SpanTc: int64(grid.TcPerSubframe) * int64(res.Plan.SpanMs), Parts: []latticePart{}}
	if res.Channel.Absolute {
		pa := int64(res.Channel.PointAHz)
		rv.Lattice.PointAHz = &pa
	}
	for _, l := range res.Partitions {
		n := l.Numerology
		rv.Lattice.Parts = append(rv.Lattice.Parts, latticePart{
			Plan: l.Index, Name: l.Name, Mu: n.Mu, Extended: n.CP == grid.ExtendedCP, SCSHz: int64(n.SCS()),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, LowHz: int64(l.Low), HighHz: int64(l.High),
			Symbols: l.SymbolCount(), SymbolsPerSlot: n.SymbolsPerSlot(), Dirs: dirString(l.Dirs),
		})
	}
	rv.Lattice.SSB = []latticeSSB{}
	if b := res.SSB; b != nil {
		for _, blk := range b.Blocks {
			rv.Lattice.SSB = append(rv.Lattice.SSB, latticeSSB{Index: blk.Index, StartTc: int64(blk.Start), EndTc: int64(blk.End),
				LowHz: int64(blk.Low), HighHz: int64(blk.High)})
		}
	}
	return rv
}

// fieldLabel names a plan path for a link to its control.
func fieldLabel(field string) string {
	switch field {
	case "":
		return ""
	case "name":
		return "plan name"
	case "spanMs":
		return "span"
	case "numerologyGapKHz":
		return "numerology gap"
	case "partitions":
		return "partitions"
	}
	if s, ok := strings.CutPrefix(field, "partitions["); ok {
		num, rest, _ := strings.Cut(s, "]")
		i, _ := strconv.Atoi(num)
		return fmt.Sprintf("partition %d %s", i+1, strings.TrimPrefix(rest, "."))
	}
	return strings.TrimPrefix(field, "carrier.")
}

func withKey(query, k, v string) string {
	if query == "" {
		return k + "=" + v
	}
	return query + "&" + k + "=" + v
}

// us formats microseconds to the nanosecond.
func us(x float64) string { return strconv.FormatFloat(x, 'f', 3, 64) }

// exact formats a value whose digits are all significant (kHz and MHz of
// subcarrier edges) without rounding.
func exact(x float64) string {
	if x == math.Trunc(x) && math.Abs(x) < 1e15 {
		return strconv.FormatFloat(x, 'f', 0, 64)
	}
	return strconv.FormatFloat(x, 'f', -1, 64)
}

func yesNo(b bool, yes, no string) string {
	if b {
		return yes
	}
	return no
}

func severityLabel(sev string) string {
	switch sev {
	case string(grid.Error):
		return "Error"
	case string(grid.Warning):
		return "Warning"
	}
	return "Note"
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

func dirString(ds []grid.SymbolDir) string {
	b := make([]byte, len(ds))
	for i, d := range ds {
		b[i] = byte(d)
	}
	return string(b)
}

// criterionLabel names a rule of the numerology fit for a column header.
func criterionLabel(name string) string {
	switch name {
	case "cp-vs-delay-spread":
		return "σ / CP"
	case "scs-vs-coherence-bandwidth":
		return "SCS / B_c"
	case "doppler-vs-scs":
		return "f_d / SCS"
	case "slot-vs-coherence-time":
		return "slot / T_c"
	}
	return name
}
