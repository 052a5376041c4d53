package web

import (
	"cmp"
	"fmt"
	"log/slog"
	"math"
	"net/http"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"github.com/go-chi/chi/v5/middleware"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/render"
)

// The comparison holds two plans in one link: plan A's keys after "a.",
// plan B's after "b." (a.name, b.p0.scs, a.op …), and the figure options,
// which both figures share, under their own "fig." keys.
var compareSides = [2]string{"a", "b"}

// prefixQuery puts prefix before every key of a query that Form.Query
// wrote; its keys are plain and its values escaped, so "&" and "=" split
// it exactly.
func prefixQuery(q, prefix string) string {
	if q == "" {
		return ""
	}
	parts := strings.Split(q, "&")
	for i, p := range parts {
		parts[i] = prefix + p
	}
	return strings.Join(parts, "&")
}

// compareQuery is the link of a comparison of a and b.
func compareQuery(a, b Form, ff FigureForm) string {
	return joinQuery(prefixQuery(a.Query(), "a."), prefixQuery(b.Query(), "b."), ff.query())
}

// copyForm is f renamed as its copy: the B that "compare with…" opens.
func copyForm(f Form) Form {
	g := f.clone()
	const suffix = " (copy)"
	name := strings.TrimSpace(f.Name)
	if name == "" {
		name = "Untitled plan"
	}
	g.Name = truncate(name, grid.MaxNameLen-len(suffix)) + suffix
	return g
}

// sideValues are the keys of one side, without its prefix.
func sideValues(q url.Values, side string) url.Values {
	out := url.Values{}
	for k, v := range q {
		if rest, ok := strings.CutPrefix(k, side+"."); ok {
			out[rest] = v
		}
	}
	return out
}

// compareState is both plans, computed, with the figure options they share.
type compareState struct {
	sides [2]state
	fig   FigureForm
	focus string // the control to focus after an edit, with its side's prefix
	notes []note // about the link as a whole
}

func (cs compareState) query() string {
	return compareQuery(cs.sides[0].form, cs.sides[1].form, cs.fig)
}

func (cs compareState) status() int {
	if len(cs.notes) > 0 || cs.sides[0].status() != http.StatusOK || cs.sides[1].status() != http.StatusOK {
		return http.StatusUnprocessableEntity
	}
	return http.StatusOK
}

// compareStateOf reads a comparison's query and applies each side's op.
// opErr is the last op that failed.
func compareStateOf(r *http.Request) (cs compareState, opErr error) {
	q, err := url.ParseQuery(r.URL.RawQuery)
	if err != nil {
		cs.notes = append(cs.notes, note{Severity: string(grid.Error), Text: fmt.Sprintf("Part of the link could not be read (%s), so a value it holds may be missing from the forms; check them against the plans you meant.", err)})
	}
	cs.fig = parseFigureForm(q)
	for i, side := range compareSides {
		sv := sideValues(q, side)
		f, msgs := ParseQuery(sv)
		st, focus, err := stateWithOp(f, msgs, sv.Get(keyOp), cs.fig)
		if err != nil {
			opErr = err
		}
		if focus != "" {
			cs.focus = side + "-" + focus
		}
		cs.sides[i] = st
	}
	return cs, opErr
}

// sharedWindows are the windows of the two plans' figures on one pair of
// scales: the union of both fitted windows, in absolute frequency when
// both channels have one, otherwise from each plan's point A.
func sharedWindows(ra, rb grid.Result) (wa, wb render.Window, absolute bool) {
	fa, fb := render.FitWindow(ra), render.FitWindow(rb)
	if ra.Channel.Absolute && rb.Channel.Absolute {
		pa, pb := ra.Channel.PointAHz, rb.Channel.PointAHz
		u := fa.Shift(pa).Union(fb.Shift(pb))
		return u.Shift(-pa), u.Shift(-pb), true
	}
	u := fa.Union(fb)
	return u, u, false
}

// sideOptions are the figure options of side i on the shared scales.
func (cs compareState) sideOptions(i int) render.Options {
	wa, wb, absolute := sharedWindows(cs.sides[0].res, cs.sides[1].res)
	opt := cs.sides[i].fig.opt
	opt.Window = [2]render.Window{wa, wb}[i]
	opt.FromPointA = !absolute
	return opt
}

// scaleNote says what the two figures share and, when they cannot share
// absolute frequency, why.
func scaleNote(ra, rb grid.Result) string {
	wa, _, absolute := sharedWindows(ra, rb)
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
}

type compareSide struct {
	Key, Label, Name        string
	Form                    formView
	Figure, FigureErr       string
	Errors, Warnings, Infos int
	Placed, Total           int
	Planner, SVG, PNG       string
	Findings                []findingView
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

// handleCompare serves two plans side by side. An empty query compares the
// startup plan with its copy; an op from a page without script is applied
// and redirects to the edited comparison, as the planner does.
func handleCompare(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		if r.URL.RawQuery == "" {
			f := FormOf(cfg.Plan)
			http.Redirect(w, r, "/compare?"+compareQuery(f, copyForm(f), FigureForm{}), http.StatusSeeOther)
			return
		}
		cs, opErr := compareStateOf(r)
		if opErr == nil && cs.focus != "" {
			http.Redirect(w, r, "/compare?"+cs.query()+"#"+cs.focus, http.StatusSeeOther)
			return
		}
		v, styles := compareViewOf(r, logger, cfg, cs)
		writeHTML(w, r, logger, v.Status, comparePage(v), styles)
	}
}

// handleCompareFragment serves the comparison's workspace alone, for the
// page script; like the planner's fragment it answers 200 and carries the
// page's own status in data-status.
func handleCompareFragment(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		cs, _ := compareStateOf(r)
		v, styles := compareViewOf(r, logger, cfg, cs)
		v.Focus = cs.focus
		writeHTML(w, r, logger, http.StatusOK, compareWork(v), styles)
	}
}

// handleCompareFigure serves one side's figure (side=a or b) on the scales
// it shares with the other, as SVG with its plan inside or as PNG, for a
// document that sets the two side by side.
func handleCompareFigure(logger *slog.Logger, cfg Config, format string) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		side := r.URL.Query().Get("side")
		i := slices.Index(compareSides[:], side)
		if i < 0 {
			refuse(w, "The link does not say which figure to draw:", Messages{"side": fmt.Sprintf("%q is not a side of the comparison; use a or b.", shortText(side))})
			return
		}
		cs, _ := compareStateOf(r)
		st := cs.sides[i]
		if len(st.inputErr) > 0 || len(st.fig.msgs) > 0 {
			msgs := Messages{}
			for k, m := range st.inputErr {
				msgs[side+"."+k] = m
			}
			for k, m := range st.fig.msgs {
				msgs[k] = m
			}
			refuse(w, "The link has values that do not parse:", msgs)
			return
		}
		opt := cs.sideOptions(i)
		draw, ctype, ext := cfg.Figure, "image/svg+xml", ".svg"
		if format == "png" {
			draw, ctype, ext = cfg.PNG, "image/png", ".png"
		} else {
			plan, err := planfile.EncodeJSON(st.plan)
			if err != nil {
				serverError(w, r, logger, "figure", err)
				return
			}
			opt.Plan = plan
		}
		out, err := drawFigure(draw, st.res, opt)
		if err != nil {
			serverError(w, r, logger, "figure", err)
			return
		}
		if format != "png" {
			w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(out))))
		}
		if r.URL.Query().Get("download") == "1" {
			attach(w, st.plan.Name, "-"+side+ext)
		}
		send(w, http.StatusOK, ctype, out)
	}
}

// compareViewOf draws both figures and builds the comparison's view, with
// the CSP sources the inline figures need.
func compareViewOf(r *http.Request, logger *slog.Logger, cfg Config, cs compareState) (compareView, []string) {
	q := cs.query()
	v := compareView{Query: q, Status: cs.status(), Notes: cs.notes,
		Scale: scaleNote(cs.sides[0].res, cs.sides[1].res),
		Swap:  "/compare?" + compareQuery(cs.sides[1].form, cs.sides[0].form, cs.fig),
	}
	var styles []string
	var shapes []string
	for i, side := range compareSides {
		st := cs.sides[i]
		opt := cs.sideOptions(i)
		opt.Caption, opt.IDPrefix = "", side+"-" // the page names each side
		svg, err := drawFigure(cfg.Figure, st.res, opt)
		sv := compareSide{Key: side, Label: strings.ToUpper(side), Name: strings.TrimSpace(st.plan.Name),
			Placed: len(st.res.Partitions), Total: len(st.plan.Partitions),
			Planner: "/?" + st.query(),
			SVG:     "/compare/figure.svg?" + joinQuery("side="+side, q, "download=1"),
			PNG:     "/compare/figure.png?" + joinQuery("side="+side, q, "download=1"),
		}
		if sv.Name == "" {
			sv.Name = "Untitled plan"
		}
		if err != nil {
			logger.LogAttrs(r.Context(), slog.LevelError, "figure", slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
			sv.FigureErr = "The figure could not be drawn: " + err.Error()
		} else {
			sv.Figure = inlineSVG(svg)
			styles = append(styles, styleSources(sv.Figure)...)
		}
		notes := st.notes()
		sv.Form = prefixForm(buildForm(st, notes), side+".", side+"-")
		shapes = append(shapes, sv.Form.Shape)
		res := buildResults(st, "", "", nil)
		sv.Errors, sv.Warnings, sv.Infos = res.Errors, res.Warnings, res.Infos
		for _, f := range res.Findings {
			if f.Control != "" {
				f.Control = side + "-" + f.Control
			}
			sv.Findings = append(sv.Findings, f)
		}
		v.Sides[i] = sv
	}
	names := v.Sides[0].Name + " against " + v.Sides[1].Name
	v.Title = names + " · gridloom"
	v.Figure = buildFigureView(cs.sides[0].fig, "")
	v.Figure.ShowCaption = false
	v.Figure.Hint = "Both figures use these options and share their time and frequency scales. The downloads of each side keep those scales, so the two can be set side by side in a document."
	v.Shape = strings.Join(shapes, "|") + ";" + v.Figure.shape()
	v.Totals = diffTotals(cs.sides[0], cs.sides[1])
	v.Parts = diffPartitions(cs.sides[0].res, cs.sides[1].res)
	v.Finds = diffFindings(v.Sides[0].Findings, v.Sides[1].Findings)
	slices.Sort(styles)
	return v, slices.Compact(styles)
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
	fv.IDPrefix, fv.OpName = idPrefix, keyPrefix+keyOp
	fv.Plan, fv.Carrier = ctl(fv.Plan), ctl(fv.Carrier)
	fv.Carriers.ID = idPrefix + fv.Carriers.ID
	fv.SCSRows = slices.Clone(fv.SCSRows)
	for i := range fv.SCSRows {
		row := &fv.SCSRows[i]
		row.Offset = ctl([]control{row.Offset})[0]
		row.CarrierBW = ctl([]control{row.CarrierBW})[0]
	}
	for _, sec := range []*section{&fv.TDD, &fv.SSB, &fv.Env} {
		sec.Group.ID = idPrefix + sec.Group.ID
		sec.OpName, sec.ClearID = keyPrefix+keyOp, idPrefix+sec.ClearID
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
		p.IDPrefix, p.OpName = idPrefix, keyPrefix+keyOp
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

// diffTotals compares the plans as a whole.
func diffTotals(a, b state) []diffRow {
	ra, rb := a.res, b.res
	da, db := report.Build(ra, false), report.Build(rb, false)
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
	text("Partitions placed", fmt.Sprintf("%d of %d", len(ra.Partitions), len(a.plan.Partitions)), fmt.Sprintf("%d of %d", len(rb.Partitions), len(b.plan.Partitions)))
	sum := func(d report.Document, f func(report.Partition) float64) float64 {
		t := 0.0
		for _, p := range d.Partitions {
			t += f(p)
		}
		return t
	}
	num("PRBs in partitions", sum(da, func(p report.Partition) float64 { return float64(p.SizePRB) }), sum(db, func(p report.Partition) float64 { return float64(p.SizePRB) }), 0)
	num("Occupied MHz", sum(da, func(p report.Partition) float64 { return p.OccupiedMHz }), sum(db, func(p report.Partition) float64 { return p.OccupiedMHz }), 2)
	num("Channel use %", da.Channel.UsePercent, db.Channel.UsePercent, 2)
	spa, spb := ra.Spectrum, rb.Spectrum
	num("Lower guardband kHz", spa.LowGuard.Width().KHz(), spb.LowGuard.Width().KHz(), 1)
	num("Upper guardband kHz", spa.HighGuard.Width().KHz(), spb.HighGuard.Width().KHz(), 1)
	num("Unused inside the channel MHz", spa.UnusedWidth().MHz(), spb.UnusedWidth().MHz(), 3)
	shortest := func(d report.Document) (float64, bool) {
		if len(d.Partitions) == 0 {
			return 0, false
		}
		return slices.MinFunc(d.Partitions, func(x, y report.Partition) int {
			return cmp.Compare(x.SlotUs, y.SlotUs)
		}).SlotUs, true
	}
	if sa, okA := shortest(da); okA {
		if sb, okB := shortest(db); okB {
			num("Shortest slot µs", sa, sb, 3)
		}
	}
	dir := func(want string) func(report.Partition) float64 {
		return func(p report.Partition) float64 {
			if p.Direction == want {
				return p.PeakMbps
			}
			return 0
		}
	}
	num("Peak downlink Mb/s", sum(da, dir("DL")), sum(db, dir("DL")), 1)
	num("Peak uplink Mb/s", sum(da, dir("UL")), sum(db, dir("UL")), 1)
	tdd := func(d report.Document) string {
		if d.TDD == nil {
			return "none"
		}
		return fmt.Sprintf("%s on %d kHz, %s ms", d.TDD.Slots, d.TDD.ReferenceSCSKHz, exact(d.TDD.PeriodMs))
	}
	text("TDD pattern", tdd(da), tdd(db))
	ssb := func(d report.Document) string {
		if d.SSB == nil {
			return "none"
		}
		return fmt.Sprintf("case %s at %d kHz, %d in the span", d.SSB.Case, d.SSB.SCSKHz, len(d.SSB.Blocks))
	}
	text("SS/PBCH blocks", ssb(da), ssb(db))
	count := func(s state, sev grid.Severity) float64 {
		n := 0
		for _, f := range s.res.Findings {
			if f.Severity == sev {
				n++
			}
		}
		if sev == grid.Error {
			n += len(s.inputErr) + len(s.fig.msgs)
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
	da, db := report.Build(ra, false), report.Build(rb, false)
	tdd := ra.TDD != nil || rb.TDD != nil
	dp := diffParts{Columns: []string{"SCS kHz", "CP", "PRBs", "CRBs", "MHz", "Slot µs", "Symbol µs", "CP µs", "Link", "Peak Mb/s"}}
	if tdd {
		dp.Columns = append(dp.Columns, "TDD share")
	}
	values := func(p report.Partition) []string {
		v := []string{strconv.Itoa(p.SCSKHz), p.CP, strconv.Itoa(p.SizePRB),
			fmt.Sprintf("%d–%d", p.StartCRB, p.StartCRB+p.SizePRB-1),
			strconv.FormatFloat(p.OccupiedMHz, 'f', 2, 64), us(p.SlotUs), us(p.UsefulUs), us(p.CPUs),
			fmt.Sprintf("%s %d×%s", p.Direction, p.Layers, p.Modulation), strconv.FormatFloat(p.PeakMbps, 'f', 1, 64)}
		if tdd {
			v = append(v, strconv.FormatFloat(p.Share*100, 'f', 1, 64)+" %")
		}
		return v
	}
	used := make([]bool, len(db.Partitions))
	for _, pa := range da.Partitions {
		row := diffPartRow{Name: pa.Name, Where: "only in A"}
		av := values(pa)
		var bv []string
		for j, pb := range db.Partitions {
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
	for j, pb := range db.Partitions {
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
