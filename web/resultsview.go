package web

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/render"
	"gridloom/web/planform"
)

// The results' view: the status, the figure, the findings and the tables,
// built from the grid.Result of a planform.State (never from its JSON
// document, which is the API's).

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
	Cell                    *cellView
	MIB                     *mibView // the MIB as bits; the planner's only
	Fit                     *fitView
	Timing                  *timingView // issue 17; nil without timing
	PRACH                   *prachView  // issue 16; nil without prach
}

// cellView is the summary's cell and initial-access section (cellview.go
// builds it).
type cellView struct {
	Band     []fact
	Block    []fact
	Coreset  []fact
	MIB      []fact
	BWPs     []fact
	Findings []findingView
	// FindSSB and FindInitial are the finders' pages for this plan.
	FindSSB, FindInitial string
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
	// Copy marks a link whose text the page script copies to the
	// clipboard instead of following it; without script it opens the text.
	Copy bool
}

type findingView struct {
	Severity, Code, Text, Partition string
	Control, ControlLabel           string // the control it concerns: its id and label
	Find                            string // a finder's page for the plan that answers it, or ""
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

// drawn is a figure drawn for a page: its inline SVG, or the sentence
// shown in its place.
type drawn struct {
	SVG, Failed string
}

// findingsOf lists the messages of a state as findings of the page, each
// linked to its control: values that did not parse, the plan's findings
// (less those on such values), the figure options' messages; errors first,
// then warnings, then notes, in order within each. It counts each severity.
func findingsOf(s planform.State) (out []findingView, errors, warnings, infos int) {
	errors = len(s.InputErr)
	for _, field := range sortedKeys(s.InputErr) {
		out = append(out, findingView{Severity: string(grid.Error), Code: "input", Text: s.InputErr[field],
			Control: planform.ControlID(field), ControlLabel: fieldLabel(field)})
	}
	for _, f := range s.Result.Findings {
		if _, bad := s.InputErr[f.Field]; bad {
			continue
		}
		switch f.Severity {
		case grid.Error:
			errors++
		case grid.Warning:
			warnings++
		default:
			infos++
		}
		fv := findingView{Severity: string(f.Severity), Code: f.Code, Text: planform.NamePaths(f.Message, s.Plan.Partitions),
			Partition: f.Partition, Control: planform.ControlID(f.Field), ControlLabel: findingLabel(f.Field, s.Plan.Partitions)}
		if f.Code == grid.CodePRACH {
			fv.Find = "/prach?" + s.Query() // the PRACH finder on this plan
		}
		out = append(out, fv)
	}
	for _, k := range planform.FigKeys {
		if m, ok := s.Fig.Msgs[k]; ok {
			errors++
			out = append(out, findingView{Severity: string(grid.Error), Code: "input", Text: m, Control: planform.KeyID(k), ControlLabel: "figure " + strings.TrimPrefix(k, "fig.")})
		}
	}
	rank := map[string]int{string(grid.Error): 0, string(grid.Warning): 1, string(grid.Info): 2}
	slices.SortStableFunc(out, func(a, b findingView) int { return rank[a.Severity] - rank[b.Severity] })
	return out, errors, warnings, infos
}

// describeFigure says what options a download is drawn with, for the
// links' titles.
func describeFigure(opt render.Options) string {
	w := opt.Width
	if w == 0 {
		w = render.DefaultWidth
		if opt.Preset.Name != "" {
			w = opt.Preset.Width
		}
	}
	out := fmt.Sprintf("%d px, %s theme, layers %s", w, opt.Theme, opt.Layers)
	if opt.Preset.Name != "" {
		out += fmt.Sprintf(", %s preset (text at least %g pt)", opt.Preset.Name, opt.Preset.MinPt)
	}
	if opt.PNGScale > 1 {
		out += fmt.Sprintf(", PNG ×%d", opt.PNGScale)
	}
	if opt.DPI != 0 {
		out += fmt.Sprintf(", PNG %d dpi", opt.DPI)
	}
	return out
}

// Quantities of a partition as the tables show them.

func slotUs(n grid.Numerology) float64   { return n.SlotTc().Micros() }
func usefulUs(n grid.Numerology) float64 { return n.UsefulTc().Micros() }
func cpUs(n grid.Numerology) float64     { return n.CPTc(1).Micros() }

// miniSlotUs is the length of a mini-slot of k symbols, each with the
// short cyclic prefix, rounded to 0.1 ns as the lattice document has it.
func miniSlotUs(n grid.Numerology, k int) float64 {
	return math.Round((grid.Tc(k)*(n.UsefulTc()+n.CPTc(1))).Micros()*1e4) / 1e4
}

// sharePercent is the partition's TDD share in percent, rounded as the
// lattice document rounds it.
func sharePercent(l grid.Lattice) float64 { return math.Round(l.Share*1e4) / 1e4 * 100 }

func crbRange(start, size int) string { return fmt.Sprintf("%d–%d", start, start+size-1) }

func linkText(l grid.Lattice) string {
	return fmt.Sprintf("%s %d×%s", l.Direction, l.Layers, l.Modulation)
}

// buildResults makes the results' view of a state; query is its canonical
// query, for the links.
func buildResults(s planform.State, query string, fig drawn) resultsView {
	res := s.Result
	rv := resultsView{
		Placed: len(res.Partitions), Total: len(s.Plan.Partitions),
		Figure: fig.SVG, FigureErr: fig.Failed, Absolute: res.Channel.Absolute, SpanMs: res.Plan.SpanMs,
		FigureAlt: fmt.Sprintf("Lattice of %d partitions over %d ms", len(res.Partitions), res.Plan.SpanMs),
	}
	rv.Findings, rv.Errors, rv.Warnings, rv.Infos = findingsOf(s)

	look := describeFigure(s.Fig.Opt)
	rv.Downloads = []download{
		{Label: "Figure (SVG)", Href: "/figure.svg?" + withKey(query, "download", "1"), TestID: "download-svg", Hint: "the lattice as drawn, " + look + ", with the plan inside: drop it on the page to open it again"},
		{Label: "Figure (PNG)", Href: "/figure.png?" + withKey(query, "download", "1"), TestID: "download-png", Hint: "the lattice as an image, " + look},
		{Label: "Plan (JSON)", Href: "/plan.json?" + query, TestID: "download-json", Hint: "a plan file to open again"},
		{Label: "Plan (YAML)", Href: "/plan.yaml?" + query, TestID: "download-yaml", Hint: "a plan file to open again"},
		{Label: "Symbols (CSV)", Href: "/symbols.csv?" + query, TestID: "download-csv", Hint: "one row per OFDM symbol"},
		{Label: "Plan (TS 38.331)", Href: "/plan.asn?" + withKey(query, "download", "1"), TestID: "download-asn", Hint: "the plan as TS 38.331 value notation (MIB, ServingCellConfigCommon(SIB), the BWPs): to open again or to take to a base station's configuration"},
		{Label: "Copy as TS 38.331", Href: "/plan.asn?" + query, TestID: "copy-asn", Copy: true, Hint: "copies the plan as TS 38.331 value notation; without the page script it opens the text"},
		{Label: "Figure options…", Href: "#" + planform.IDFigure, TestID: "figure-options-link", Hint: "width, theme, layers, caption, preset, time unit and PNG scale and dpi of the figure and its downloads"},
	}
	rv.Views = []download{
		{Label: "Walk through it", Href: "/walk?" + query, TestID: "open-walk", Hint: "the plan step by step, for presenting to a team"},
		{Label: "Compare with…", Href: "/compare?" + planform.CompareQuery(s.Form, planform.CopyOf(s.Form), s.Fig.Form), TestID: "open-compare", Hint: "this plan as A against an editable copy as B"},
	}

	rv.Parts = partRows(res)
	rv.Carriers = carrierRows(res)
	rv.Channel, rv.HasTDD = channelFacts(res), res.TDD != nil
	rv.SSB = ssbOf(res)
	rv.Fit = fitOf(res)
	rv.Timing = timingOf(res)
	rv.PRACH = prachOf(res, query)
	rv.Lattice = latticeOf(res)
	return rv
}

// partRows are the rows of the timing and frequency table, one per placed partition.
func partRows(res grid.Result) []partRow {
	ch := res.Channel
	var rows []partRow
	for _, l := range res.Partitions {
		n := l.Numerology
		row := partRow{
			Name: l.Name, Mu: strconv.Itoa(n.Mu), SCS: strconv.Itoa(n.SCSKHz()), CP: n.CP.String(),
			Slots: strconv.Itoa(l.SlotCount()), Symbols: strconv.Itoa(l.SymbolCount()),
			SlotUs: us(slotUs(n)), UsefulUs: us(usefulUs(n)), CPUs: us(cpUs(n)),
			MiniSlotsUs: us(miniSlotUs(n, 2)) + " / " + us(miniSlotUs(n, 4)) + " / " + us(miniSlotUs(n, 7)),
			PRBs:        strconv.Itoa(l.SizePRB), CRBs: crbRange(l.StartCRB, l.SizePRB),
			OccupiedMHz: strconv.FormatFloat(l.Width().MHz(), 'f', 2, 64),
			LowKHz:      exact(l.Low.KHz()), HighKHz: exact(l.High.KHz()),
			RIV:      "—",
			Link:     linkText(l),
			PeakMbps: strconv.FormatFloat(l.PeakMbps, 'f', 1, 64),
		}
		if n.CP != grid.ExtendedCP {
			row.CPUs = us(cpUs(n)) + " (" + us(n.CPTc(0).Micros()) + ")"
		}
		if res.TDD != nil {
			row.Share = strconv.FormatFloat(sharePercent(l), 'f', 1, 64) + " % " + string(l.Direction)
		}
		if l.LocationAndBandwidth >= 0 {
			row.RIV = strconv.Itoa(l.LocationAndBandwidth)
		}
		if ch.Absolute {
			row.LowMHz, row.HighMHz = exact(ch.Abs(l.Low).MHz()), exact(ch.Abs(l.High).MHz())
		}
		rows = append(rows, row)
	}
	return rows
}

// carrierRows are the rows of the SCS-specific carriers' table.
func carrierRows(res grid.Result) []carrierRow {
	var rows []carrierRow
	for _, c := range res.Carriers {
		nrb, cbw := c.NRB, c.CarrierBandwidth
		rows = append(rows, carrierRow{
			SCS: strconv.Itoa(c.SCSKHz), NRB: strconv.Itoa(nrb), CarrierBW: strconv.Itoa(cbw),
			Offset: strconv.Itoa(c.OffsetToCarrier), Chosen: yesNo(c.Chosen, "chosen", "given"),
			CRBs:     crbRange(c.OffsetToCarrier, cbw),
			GuardLow: exact(c.GuardLow.KHz()), GuardHigh: exact(c.GuardHigh.KHz()), MinGuard: exact(c.MinGuard.KHz()),
			GuardLowShort: c.GuardLow < c.MinGuard, GuardHighShort: c.GuardHigh < c.MinGuard, SizeReduced: cbw < nrb,
		})
	}
	return rows
}

// channelFacts describe the channel: range, edges, centre, point A, use, TDD pattern.
func channelFacts(res grid.Result) []fact {
	ch := res.Channel
	facts := []fact{
		{"Range", ch.Range.String()},
		{"Channel", fmt.Sprintf("%d MHz: %s to %s kHz from point A", ch.BandwidthMHz, exact(ch.Low.KHz()), exact(ch.High.KHz()))},
	}
	if ch.Absolute {
		centre := exact(ch.CenterHz.MHz()) + " MHz"
		if ch.OnRaster {
			centre += fmt.Sprintf(" (NR-ARFCN %d)", ch.ARFCN)
		}
		facts = append(facts, fact{"Centre", centre})
		pa := exact(ch.PointAHz.MHz()) + " MHz"
		if ch.PointAOnRaster {
			pa += fmt.Sprintf(" (absoluteFrequencyPointA %d)", ch.PointAARFCN)
		}
		facts = append(facts, fact{"Point A", pa})
	} else {
		facts = append(facts, fact{"Centre", exact(ch.Center.KHz()) + " kHz from point A (no absolute frequency given)"})
	}
	facts = append(facts, fact{"Channel use", strconv.FormatFloat(ch.UsePercent, 'f', 2, 64) + " %"})
	if t := res.TDD; t != nil {
		facts = append(facts, fact{"TDD pattern", tddText(t, "%s on %d kHz slots, period %s ms")})
	}
	return facts
}

// ssbOf is the SS/PBCH table, or nil without blocks.
func ssbOf(res grid.Result) *ssbView {
	if b := res.SSB; b != nil {
		sv := &ssbView{Facts: []fact{
			{"Case", fmt.Sprintf("%s at %d kHz", b.Case, b.Numerology.SCSKHz())},
			{"Candidates (L_max)", fmt.Sprintf("%d (ssb-PositionsInBurst %s)", b.Candidates, b.BitmapForm)},
			{"Period", strconv.Itoa(b.PeriodMs) + " ms"},
			{"Sent in the span", strconv.Itoa(len(b.Blocks))},
			{"Placement", fmt.Sprintf("offsetToPointA %d, k_SSB %d, subCarrierSpacingCommon %d kHz", b.OffsetToPointA, b.KSSB, b.ScsCommonKHz)},
		}}
		if b.Absolute {
			ref := exact(b.SSRefHz.MHz()) + " MHz"
			if b.OnARFCNRaster {
				ref += fmt.Sprintf(", absoluteFrequencySSB %d", b.AbsoluteFrequencySSB)
			}
			if b.OnSyncRaster {
				ref += fmt.Sprintf(", GSCN %d", b.GSCN)
			} else {
				ref += ", off the synchronization raster"
			}
			sv.Facts = append(sv.Facts, fact{"SS_REF", ref})
		}
		if len(b.Blocks) > 0 {
			sv.Facts = append(sv.Facts, fact{"Frequency", fmt.Sprintf("%s to %s kHz from point A", exact(b.Blocks[0].Low.KHz()), exact(b.Blocks[0].High.KHz()))})
		}
		for _, blk := range b.Blocks {
			sv.Blocks = append(sv.Blocks, ssbRow{Index: strconv.Itoa(blk.Index), Slot: strconv.Itoa(blk.Slot), Symbol: strconv.Itoa(blk.Symbol),
				StartUs: us(blk.Start.Micros()), EndUs: us(blk.End.Micros())})
		}
		return sv
	}
	return nil
}

// fitOf is the numerology fit's table, or nil without an environment.
func fitOf(res grid.Result) *fitView {
	if fit := res.Fit; fit != nil {
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
			if i < len(res.Partitions) {
				name = res.Partitions[i].Name
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
		return fv
	}

	return nil
}

// latticeOf is what the page script reads the figure with.
func latticeOf(res grid.Result) latticeData {
	ch := res.Channel
	lat := latticeData{SpanTc: int64(grid.TcPerSubframe) * int64(res.Plan.SpanMs), Parts: []latticePart{}}
	if ch.Absolute {
		pa := int64(ch.PointAHz)
		lat.PointAHz = &pa
	}
	for _, l := range res.Partitions {
		n := l.Numerology
		lat.Parts = append(lat.Parts, latticePart{
			Plan: l.Index, Name: l.Name, Mu: n.Mu, Extended: n.CP == grid.ExtendedCP, SCSHz: int64(n.SCS()),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, LowHz: int64(l.Low), HighHz: int64(l.High),
			Symbols: l.SymbolCount(), SymbolsPerSlot: n.SymbolsPerSlot(), Dirs: dirString(l.Dirs),
		})
	}
	lat.SSB = []latticeSSB{}
	if b := res.SSB; b != nil {
		for _, blk := range b.Blocks {
			lat.SSB = append(lat.SSB, latticeSSB{Index: blk.Index, StartTc: int64(blk.Start), EndTc: int64(blk.End),
				LowHz: int64(blk.Low), HighHz: int64(blk.High)})
		}
	}
	return lat
}

// tddText writes a TDD pattern with format's verbs: its slots, reference
// spacing and period in ms.
func tddText(t *grid.TDD, format string) string {
	return fmt.Sprintf(format, t.SlotString(), t.Reference.SCSKHz(), exact(float64(t.Period)/float64(grid.TcPerSubframe)))
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
		return strings.TrimSpace(fmt.Sprintf("partition %d %s", i+1, strings.TrimPrefix(rest, ".")))
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

func sortedKeys[V any](m map[string]V) []string {
	return slices.Sorted(maps.Keys(m))
}

// findingLabel names the control of a finding's field for its "Go to" link.
func findingLabel(field string, parts []grid.PartitionPlan) string {
	if strings.HasPrefix(field, "partitions[") {
		return planform.NamePaths(field, parts)
	}
	return fieldLabel(field)
}
