package web

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The comparison's view: both forms, both figures' places, the totals and
// partitions side by side and the findings sorted by side, built from the
// two planform.States of a planform.Compare.

// scaleNote says what the two figures share and, when they cannot share
// absolute frequency, why.
func scaleNote(ra, rb grid.Result) string {
	wa, _, absolute := planform.SharedWindows(ra, rb)
	ms := strconv.FormatFloat(float64(wa.Span)/float64(grid.TcPerSubframe), 'f', -1, 64)
	mhz := func(hz grid.Hz) string { return strconv.FormatFloat(hz.MHz(), 'f', 2, 64) }
	if absolute {
		lo, hi := ra.Channel.Abs(wa.Low), ra.Channel.Abs(wa.High)
		return fmt.Sprintf("Both figures share one pair of scales: time 0 to %s ms and absolute frequency %s to %s MHz, so the lattices line up where the plans overlap.", ms, mhz(lo), mhz(hi))
	}
	why := "neither plan has"
	switch {
	case ra.Channel.Absolute:
		why = "plan B has none"
	case rb.Channel.Absolute:
		why = "plan A has none"
	}
	return fmt.Sprintf("Both figures share one pair of scales: time 0 to %s ms, and frequency %s to %s MHz counted from each plan's own point A, not absolute frequency, since %s. Equal heights are equal offsets from point A.", ms, mhz(wa.Low), mhz(wa.High), why)
}

// compareView is the comparison page and its live fragment.
type compareView struct {
	Title  string
	Query  string
	Focus  string
	Status int
	Shape  string
	Sides  [2]compareSide
	Figure figureView
	Scale  string
	Notes  []note
	Totals []diffRow
	Parts  diffParts
	Finds  []findingGroup
	Swap   string
	Cross  crossLinkView // synchronised TDD (issue 17)
}

type compareSide struct {
	Key, Label, Name        string
	Form                    formView
	Figure, FigureErr       string
	Errors, Warnings, Infos int
	Placed, Total           int
	Planner, SVG, PNG       string
	Findings                []findingView
	// Open is the side's file control (issue 19): its form posts a plan
	// file to /compare/open for this side; OpenNotes say why the last file
	// was refused.
	Open      string
	OpenNotes []note
}

// diffRow is one quantity of the totals: A, B and B − A.
type diffRow struct {
	Label, A, B, Delta string
	Changed            bool
}

// diffParts is the partitions of both plans, matched by name.
type diffParts struct {
	Columns []string
	Rows    []diffPartRow
}

type diffPartRow struct {
	Name  string
	Where string // "A and B", "only in A" or "only in B"
	Cells []diffCell
}

// diffCell is one quantity of a partition: the same in both, changed
// (A → B), or on one side only.
type diffCell struct {
	A, B    string
	Changed bool
}

func (c diffCell) text() string {
	switch {
	case c.A == "":
		return c.B
	case c.B == "", !c.Changed:
		return c.A
	}
	return c.A + " → " + c.B
}

// findingGroup is the findings only one plan has, or both.
type findingGroup struct {
	Title, TestID string
	Items         []findingView
}

// buildCompare makes the comparison's view; cross is its cross-link view
// and figs are the two figures drawn for the page, on their shared scales,
// with cross's conflicts marked.
func buildCompare(c planform.Compare, cross crossLinkView, figs [2]drawn) compareView {
	q := c.Query()
	v := compareView{Query: q, Status: statusOf(c.Invalid()),
		Scale: scaleNote(c.Sides[0].Result, c.Sides[1].Result),
		Swap:  "/compare?" + c.SwapQuery(),
		Cross: cross,
	}
	if c.LinkErr != "" {
		v.Notes = []note{{Severity: string(grid.Error), Text: c.LinkErr}}
	}
	var shapes []string
	for i, side := range planform.Sides {
		st := c.Sides[i]
		sv := compareSide{Key: side, Label: strings.ToUpper(side), Name: strings.TrimSpace(st.Plan.Name),
			Placed: len(st.Result.Partitions), Total: len(st.Plan.Partitions),
			Figure: figs[i].SVG, FigureErr: figs[i].Failed,
			Planner: "/?" + st.Query(),
			SVG:     "/compare/figure.svg?" + planform.JoinQuery("side="+side, q, "download=1"),
			PNG:     "/compare/figure.png?" + planform.JoinQuery("side="+side, q, "download=1"),
			Open:    "/compare/open?" + planform.JoinQuery("side="+side, q),
		}
		if sv.Name == "" {
			sv.Name = "Untitled plan"
		}
		sv.Form = prefixForm(buildForm(st, notesOf(st)), side+".", side+"-")
		shapes = append(shapes, sv.Form.Shape)
		var findings []findingView
		findings, sv.Errors, sv.Warnings, sv.Infos = findingsOf(st)
		for _, f := range findings {
			if f.Control != "" {
				f.Control = side + "-" + f.Control
			}
			sv.Findings = append(sv.Findings, f)
		}
		v.Sides[i] = sv
	}
	names := v.Sides[0].Name + " against " + v.Sides[1].Name
	v.Title = names + " · gridloom"
	v.Figure = buildFigureBox(c.Sides[0].Fig, "")
	v.Figure.ShowCaption = false
	v.Figure.Hint = "Both figures use these options and share their time and frequency scales. The downloads of each side keep those scales, so the two can be set side by side in a document."
	v.Shape = strings.Join(shapes, "|") + ";" + v.Figure.shape()
	v.Totals = diffTotals(c.Sides[0], c.Sides[1])
	v.Parts = diffPartitions(c.Sides[0].Result, c.Sides[1].Result)
	v.Finds = diffFindings(v.Sides[0].Findings, v.Sides[1].Findings)
	return v
}

// prefixForm gives a form's controls the keys and ids of one side of the
// comparison: keyPrefix before every query key, idPrefix before every id.
func prefixForm(fv formView, keyPrefix, idPrefix string) formView {
	ctl := func(cs []control) []control {
		out := slices.Clone(cs)
		for i := range out {
			out[i].ID, out[i].Name = idPrefix+out[i].ID, keyPrefix+out[i].Name
		}
		return out
	}
	fv.IDPrefix, fv.OpName = idPrefix, keyPrefix+planform.KeyOp
	fv.Plan, fv.Carrier = ctl(fv.Plan), ctl(fv.Carrier)
	fv.Carriers.ID = idPrefix + fv.Carriers.ID
	fv.SCSRows = slices.Clone(fv.SCSRows)
	for i := range fv.SCSRows {
		row := &fv.SCSRows[i]
		row.Offset = ctl([]control{row.Offset})[0]
		row.CarrierBW = ctl([]control{row.CarrierBW})[0]
	}
	for _, sec := range []*section{&fv.TDD, &fv.SSB, &fv.Env, &fv.Init, &fv.PRACH} {
		sec.Group.ID = idPrefix + sec.Group.ID
		sec.OpName, sec.ClearID = keyPrefix+planform.KeyOp, idPrefix+sec.ClearID
		sec.Rows = slices.Clone(sec.Rows)
		for j := range sec.Rows {
			sec.Rows[j].Controls = ctl(sec.Rows[j].Controls)
		}
	}
	fv.PartsBox.ID = idPrefix + fv.PartsBox.ID
	fv.Parts = slices.Clone(fv.Parts)
	for i := range fv.Parts {
		p := &fv.Parts[i]
		p.Group.ID, p.LegendID = idPrefix+p.Group.ID, idPrefix+p.LegendID
		p.Controls = ctl(p.Controls)
		p.IDPrefix, p.OpName = idPrefix, keyPrefix+planform.KeyOp
	}
	fv.Shape = keyPrefix + fv.Shape
	return fv
}

// Numbers of the difference table.

// signed formats b − a with its sign and the given decimals; "0" when the
// two round to the same value.
func signed(d float64, decimals int) string {
	s := strconv.FormatFloat(math.Abs(d), 'f', decimals, 64)
	if strings.Trim(s, "0.") == "" {
		return "0"
	}
	if d < 0 {
		return "−" + s
	}
	return "+" + s
}

// cellRows are the comparison's rows of the band and initial access, each
// left out when neither plan has it.
var cellRows = []struct {
	label string
	value func(grid.Result) string
}{
	{"Band", func(r grid.Result) string { return orNone(r.Channel.Band) }},
	{"GSCN", func(r grid.Result) string {
		if r.SSB == nil || !r.SSB.OnSyncRaster {
			return "none"
		}
		return strconv.Itoa(r.SSB.GSCN)
	}},
	{"CORESET#0", func(r grid.Result) string {
		if r.InitialAccess == nil {
			return "none"
		}
		c := r.InitialAccess.CORESET0
		return fmt.Sprintf("index %d: %d RBs × %d symbols", c.Index, c.NRB, c.Symbols)
	}},
	{"pdcch-ConfigSIB1", func(r grid.Result) string {
		if r.InitialAccess == nil {
			return "none"
		}
		return fmt.Sprintf("%08b", r.InitialAccess.MIB.PDCCHConfigSIB1)
	}},
	{"Initial downlink BWP", func(r grid.Result) string {
		if r.InitialAccess == nil {
			return "none"
		}
		b := r.InitialAccess.InitialDL
		return fmt.Sprintf("%d PRBs of %d kHz from CRB %d", b.SizePRB, b.SCSKHz, b.StartCRB)
	}},
}

func orNone(s string) string {
	if s == "" {
		return "none"
	}
	return s
}

// diffTotals compares the plans as a whole.
func diffTotals(a, b planform.State) []diffRow {
	ra, rb := a.Result, b.Result
	var rows []diffRow
	text := func(label, x, y string) {
		rows = append(rows, diffRow{Label: label, A: x, B: y, Changed: x != y})
	}
	num := func(label string, x, y float64, decimals int) {
		fx, fy := strconv.FormatFloat(x, 'f', decimals, 64), strconv.FormatFloat(y, 'f', decimals, 64)
		rows = append(rows, diffRow{Label: label, A: fx, B: fy, Delta: signed(y-x, decimals), Changed: fx != fy})
	}
	channel := func(r grid.Result) string {
		s := fmt.Sprintf("%d MHz %s", r.Channel.BandwidthMHz, r.Channel.Range)
		if r.Channel.Absolute {
			s += " at " + strconv.FormatFloat(r.Channel.CenterHz.MHz(), 'f', -1, 64) + " MHz"
		}
		return s
	}
	text("Channel", channel(ra), channel(rb))
	text("Partitions placed", fmt.Sprintf("%d of %d", len(ra.Partitions), len(a.Plan.Partitions)), fmt.Sprintf("%d of %d", len(rb.Partitions), len(b.Plan.Partitions)))
	sum := func(r grid.Result, f func(grid.Lattice) float64) float64 {
		t := 0.0
		for _, l := range r.Partitions {
			t += f(l)
		}
		return t
	}
	prbs := func(l grid.Lattice) float64 { return float64(l.SizePRB) }
	mhz := func(l grid.Lattice) float64 { return l.Width().MHz() }
	num("PRBs in partitions", sum(ra, prbs), sum(rb, prbs), 0)
	num("Occupied MHz", sum(ra, mhz), sum(rb, mhz), 2)
	num("Channel use %", ra.Channel.UsePercent, rb.Channel.UsePercent, 2)
	spa, spb := ra.Spectrum, rb.Spectrum
	num("Lower guardband kHz", spa.LowGuard.Width().KHz(), spb.LowGuard.Width().KHz(), 1)
	num("Upper guardband kHz", spa.HighGuard.Width().KHz(), spb.HighGuard.Width().KHz(), 1)
	num("Unused inside the channel MHz", spa.UnusedWidth().MHz(), spb.UnusedWidth().MHz(), 3)
	shortest := func(r grid.Result) (float64, bool) {
		if len(r.Partitions) == 0 {
			return 0, false
		}
		return slices.MinFunc(r.Partitions, func(x, y grid.Lattice) int {
			return cmp.Compare(x.Numerology.SlotTc(), y.Numerology.SlotTc())
		}).Numerology.SlotTc().Micros(), true
	}
	if sa, okA := shortest(ra); okA {
		if sb, okB := shortest(rb); okB {
			num("Shortest slot µs", sa, sb, 3)
		}
	}
	peak := func(want grid.Direction) func(grid.Lattice) float64 {
		return func(l grid.Lattice) float64 {
			if l.Direction == want {
				return l.PeakMbps
			}
			return 0
		}
	}
	num("Peak downlink Mb/s", sum(ra, peak(grid.DL)), sum(rb, peak(grid.DL)), 1)
	num("Peak uplink Mb/s", sum(ra, peak(grid.UL)), sum(rb, peak(grid.UL)), 1)
	tdd := func(r grid.Result) string {
		if r.TDD == nil {
			return "none"
		}
		return tddText(r.TDD, "%s on %d kHz, %s ms")
	}
	text("TDD pattern", tdd(ra), tdd(rb))
	ssb := func(r grid.Result) string {
		if r.SSB == nil {
			return "none"
		}
		return fmt.Sprintf("case %s at %d kHz, %d in the span", r.SSB.Case, r.SSB.Numerology.SCSKHz(), len(r.SSB.Blocks))
	}
	text("SS/PBCH blocks", ssb(ra), ssb(rb))
	for _, c := range cellRows {
		if x, y := c.value(ra), c.value(rb); x != "none" || y != "none" {
			text(c.label, x, y)
		}
	}
	if ra.PRACH != nil || rb.PRACH != nil {
		// Random access (issue 16): rows only when a side has a prach block,
		// so that comparisons without one read as before.
		prach := func(r grid.Result) string {
			if r.PRACH == nil {
				return "none"
			}
			return fmt.Sprintf("index %d, format %s", r.PRACH.ConfigurationIndex, r.PRACH.Format)
		}
		per10 := func(r grid.Result) float64 {
			if r.PRACH == nil {
				return 0
			}
			return r.PRACH.ValidPer10ms
		}
		km := func(r grid.Result) float64 {
			if r.PRACH == nil {
				return 0
			}
			return r.PRACH.Range.Limit / 1000
		}
		text("PRACH configuration", prach(ra), prach(rb))
		text("PRACH association period", associationMs(ra.PRACH), associationMs(rb.PRACH))
		text("PRACH association pattern period", patternMs(ra.PRACH), patternMs(rb.PRACH))
		num("Valid PRACH occasions per 10 ms", per10(ra), per10(rb), 2)
		num("PRACH cell range km", km(ra), km(rb), 2)
	}
	count := func(s planform.State, sev grid.Severity) float64 {
		n := 0
		for _, f := range s.Result.Findings {
			if f.Severity == sev {
				n++
			}
		}
		if sev == grid.Error {
			n += len(s.InputErr) + len(s.Fig.Msgs)
		}
		return float64(n)
	}
	num("Errors", count(a, grid.Error), count(b, grid.Error), 0)
	num("Warnings", count(a, grid.Warning), count(b, grid.Warning), 0)
	num("Notes", count(a, grid.Info), count(b, grid.Info), 0)
	return rows
}

// diffPartitions matches the partitions of the two plans by name, in A's
// order and then B's, and compares each quantity of a matched pair.
func diffPartitions(ra, rb grid.Result) diffParts {
	tdd := ra.TDD != nil || rb.TDD != nil
	dp := diffParts{Columns: []string{"SCS kHz", "CP", "PRBs", "CRBs", "MHz", "Slot µs", "Symbol µs", "CP µs", "Link", "Peak Mb/s"}}
	if tdd {
		dp.Columns = append(dp.Columns, "TDD share")
	}
	values := func(l grid.Lattice) []string {
		n := l.Numerology
		v := []string{strconv.Itoa(n.SCSKHz()), n.CP.String(), strconv.Itoa(l.SizePRB), crbRange(l.StartCRB, l.SizePRB),
			strconv.FormatFloat(l.Width().MHz(), 'f', 2, 64), us(slotUs(n)), us(usefulUs(n)), us(cpUs(n)),
			linkText(l), strconv.FormatFloat(l.PeakMbps, 'f', 1, 64)}
		if tdd {
			v = append(v, strconv.FormatFloat(sharePercent(l), 'f', 1, 64)+" %")
		}
		return v
	}
	used := make([]bool, len(rb.Partitions))
	for _, pa := range ra.Partitions {
		row := diffPartRow{Name: pa.Name, Where: "only in A"}
		av := values(pa)
		var bv []string
		for j, pb := range rb.Partitions {
			if !used[j] && pb.Name == pa.Name {
				used[j], bv = true, values(pb)
				row.Where = "A and B"
				break
			}
		}
		for k, x := range av {
			c := diffCell{A: x}
			if bv != nil {
				c.B, c.Changed = bv[k], bv[k] != x
			}
			row.Cells = append(row.Cells, c)
		}
		dp.Rows = append(dp.Rows, row)
	}
	for j, pb := range rb.Partitions {
		if used[j] {
			continue
		}
		row := diffPartRow{Name: pb.Name, Where: "only in B"}
		for _, x := range values(pb) {
			row.Cells = append(row.Cells, diffCell{B: x})
		}
		dp.Rows = append(dp.Rows, row)
	}
	return dp
}

// diffFindings sorts the findings of the two plans into those only A
// has, those only B has, and those both have (by severity and text).
func diffFindings(a, b []findingView) []findingGroup {
	key := func(f findingView) string { return f.Severity + "\x00" + f.Text }
	in := func(fs []findingView, f findingView) bool {
		return slices.ContainsFunc(fs, func(g findingView) bool { return key(g) == key(f) })
	}
	groups := []findingGroup{{Title: "Only in A", TestID: "findings-a"}, {Title: "Only in B", TestID: "findings-b"}, {Title: "In both", TestID: "findings-both"}}
	for _, f := range a {
		if in(b, f) {
			f.Control = "" // it concerns both forms
			groups[2].Items = append(groups[2].Items, f)
		} else {
			groups[0].Items = append(groups[0].Items, f)
		}
	}
	for _, f := range b {
		if !in(a, f) {
			groups[1].Items = append(groups[1].Items, f)
		}
	}
	return groups
}
