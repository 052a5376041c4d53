package web

import (
	"fmt"
	"net/http"
	"net/url"
	"strconv"

	"gridloom/grid"
	"gridloom/grid/report"
	"gridloom/web/planform"
)

// The random access part of the results (issue 16), built from
// grid.Result: the configuration's table row, its occasions and its cell
// range, and the finder that lists every configuration index that fits
// the plan. It stands apart from resultsview.go, which only calls prachOf.

// prachView is the "Random access" table of the results.
type prachView struct {
	Index, Format, Table, SCS, NRBRA string
	Per10ms, Valid, Association      string
	// Pattern is the association pattern period (TS 38.213 8.1), with
	// what makes it longer than the association period.
	Pattern      string
	Range, Binds string
	FindHref     string
	// Span says what the figure's span leaves out of the association
	// period ("" when it shows every occasion); SpanHref and SpanLink offer
	// the span that shows the most of it ("" when no longer span helps).
	Span, SpanHref, SpanLink string
}

// prachOf builds the table, nil for a plan without PRACH; query is the
// page's canonical query, for the finder's link.
func prachOf(res grid.Result, query string) *prachView {
	p := res.PRACH
	if p == nil {
		return nil
	}
	valid := 0
	for _, o := range p.Occasions {
		if o.Valid {
			valid++
		}
	}
	assoc := associationMs(p)
	if p.AssociationPeriodFrames == 0 {
		assoc += ": the blocks cannot be mapped within 160 ms (TS 38.213 Table 8.1-1)"
	}
	v := &prachView{
		Index: strconv.Itoa(p.ConfigurationIndex), Format: p.Format, Table: "TS 38.211 Table " + p.Table,
		SCS: prachNum(float64(p.SCSHz)/1000) + " kHz", NRBRA: strconv.Itoa(p.NRBRA),
		Per10ms:     prachNum(p.ValidPer10ms),
		Valid:       fmt.Sprintf("%d of %d", valid, len(p.Occasions)),
		Association: assoc,
		Pattern:     patternOf(p),
		Range:       prachNum(float64(int(p.Range.Limit/10+0.5))/100) + " km",
		Binds:       rangeBinds(p),
		FindHref:    "/prach?" + query,
	}
	v.Span, v.SpanHref, v.SpanLink = spanOf(p, res.Plan.SpanMs, query)
	return v
}

// spanOf says what the figure, from the start of frame 0 over spanMs, shows
// of the occasions, and which span (the plan's span key) shows more. The
// span stops at grid.MaxSpanMs, so an association period longer than a
// frame, or occasions only in later frames (n_SFN mod x = y, y ≠ 0), are
// never all in the figure; the sentence says so and where to find them.
func spanOf(p *grid.PRACH, spanMs int, query string) (text, href, link string) {
	s := p.InSpan(spanMs)
	if s.Next == nil {
		return "", "", ""
	}
	period, what := p.AssociationPeriodFrames, "association period"
	if period == 0 {
		period, what = p.ConfigPeriodFrames, "configuration period"
	}
	n := s.Next
	slot := "slot" // the PRACH slot at Δf^RA; a long format's is the subframe
	if p.SequenceLength == 839 {
		slot = "subframe"
	}
	text = fmt.Sprintf("The figure spans 0–%d ms and shows %d of the %d occasions of the %d ms %s; the next is in frame %d, %s %d, from %s ms, outside the span 0–%d ms.",
		spanMs, s.Shown, s.Total, 10*period, what, n.Frame, slot, n.Slot, prachNum(float64(int64(n.Start)*1000/int64(grid.TcPerSubframe))/1000), spanMs)
	switch {
	case s.FitMs > spanMs:
		q, _ := url.ParseQuery(query)
		q.Set("span", strconv.Itoa(s.FitMs))
		href = "/?" + q.Encode() + "#h-prach"
		link = fmt.Sprintf("Show 0–%d ms", s.FitMs)
		if s.FitShown == s.Total {
			link += ", one whole " + what
		} else {
			if s.FitShown == 1 {
				link += ", frame 0's occasion"
			} else {
				link += fmt.Sprintf(", frame 0's %d occasions", s.FitShown)
			}
			text += fmt.Sprintf(" The figure starts at frame 0 and spans at most %d ms, so no span shows the whole %d ms; the result document (gridloom render -format json, or POST /api/v1/render) lists every occasion.", grid.MaxSpanMs, 10*period)
		}
	case s.FitMs == 0:
		text += fmt.Sprintf(" Frame 0 holds none of them (n_SFN mod %d is not one of the index's y), and the figure starts at frame 0 and spans at most %d ms, so no span shows them; the result document (gridloom render -format json, or POST /api/v1/render) lists every occasion.", p.ConfigPeriodFrames, grid.MaxSpanMs)
	default:
		text += fmt.Sprintf(" The rest lie in later frames: the figure starts at frame 0 and spans at most %d ms; the result document (gridloom render -format json, or POST /api/v1/render) lists every occasion.", grid.MaxSpanMs)
	}
	return text, href, link
}

// patternOf writes the association pattern period and, when it is longer
// than the association period, why.
func patternOf(p *grid.PRACH) string {
	s := patternMs(p)
	switch {
	case p.AssociationPatternPeriodFrames == 0:
		s += ": no association period"
	case p.PatternNote != "":
		s += ": " + p.PatternNote
	}
	return s
}

// associationMs and patternMs write the association period (TS 38.213
// Table 8.1-1) and the association pattern period (TS 38.213 8.1) in ms,
// "none" without one or without a prach block; the Random access table,
// the walkthrough and the comparison all say them so.
func associationMs(p *grid.PRACH) string {
	if p == nil {
		return "none"
	}
	return framesMs(p.AssociationPeriodFrames)
}

func patternMs(p *grid.PRACH) string {
	if p == nil {
		return "none"
	}
	return framesMs(p.AssociationPatternPeriodFrames)
}

// framesMs is a number of 10 ms frames in ms, "none" for 0.
func framesMs(frames int) string {
	if frames == 0 {
		return "none"
	}
	return strconv.Itoa(10*frames) + " ms"
}

// rangeBinds names the limit that sets the cell range: the smallest of the
// cyclic prefix, the guard time and the cyclic shift (the rule of
// grid/prach's Range.Limit, common practice).
func rangeBinds(p *grid.PRACH) string {
	r := p.Range
	switch {
	case r.Limit == r.ZeroCorrelation && r.ZeroCorrelation > 0:
		return "the cyclic shift N_CS " + strconv.Itoa(p.NCS)
	case r.Limit == r.Guard && r.Guard > 0:
		return "the guard time"
	default:
		return "the cyclic prefix"
	}
}

// prachNum writes a number as short as it reads exactly.
func prachNum(f float64) string { return strconv.FormatFloat(f, 'f', -1, 64) }

// prachFindView is the finder's page: every configuration index whose
// occasions are all valid on the plan, grouped by format, each a link that
// applies it.
type prachFindView struct {
	Title, Back, Error, Head string
	Groups                   []prachFindGroup
}

type prachFindGroup struct {
	Format  string
	Choices []prachFindRow
}

type prachFindRow struct {
	Index, SCS, Per10ms, Range, Period, Association, Pattern, Warnings string
	Href, Current                                                      string
}

// prachFind answers GET /prach: the finder on the plan of the query. A
// plan the finder cannot work on gets the page with the reason, 422.
func (s *server) prachFind(w http.ResponseWriter, r *http.Request) error {
	st, _, _ := planform.Read(r.URL.RawQuery)
	query := st.Query()
	v := prachFindView{Title: "Find a PRACH configuration index · gridloom", Back: "/?" + query}
	found, err := grid.FindPRACH(st.Plan)
	status := http.StatusOK
	if err != nil {
		v.Error, status = err.Error(), http.StatusUnprocessableEntity
		return writeHTML(w, r, status, prachFindPage(v), nil)
	}
	v.Head = fmt.Sprintf("%d of the %d configuration indexes of TS 38.211 Table %s fit: every occasion valid (TS 38.213 8.1) and every SS/PBCH block mapped.",
		found.Count(), found.Tried, found.Table)
	cur := ""
	if st.Plan.PRACH != nil {
		cur = strconv.Itoa(st.Plan.PRACH.ConfigurationIndex)
	}
	base, _ := url.ParseQuery(query)
	for _, g := range found.Groups {
		fg := prachFindGroup{Format: g.Format}
		for _, c := range g.Choices {
			q := url.Values{}
			for k, vs := range base {
				q[k] = vs
			}
			idx := strconv.Itoa(c.ConfigurationIndex)
			q.Set("prach.idx", idx)
			row := prachFindRow{Index: idx, SCS: prachNum(c.SCSKHz) + " kHz", Per10ms: prachNum(c.OccasionsPer10ms),
				Range: prachNum(c.CellRangeKm) + " km", Period: strconv.Itoa(10*c.ConfigPeriodFrames) + " ms",
				Association: strconv.Itoa(10*c.AssociationPeriodFrames) + " ms", Pattern: strconv.Itoa(10*c.AssociationPatternPeriodFrames) + " ms",
				Warnings: strconv.Itoa(c.Warnings),
				Href:     "/?" + q.Encode() + "#h-prach"}
			if idx == cur {
				row.Current = "the plan's index"
			}
			fg.Choices = append(fg.Choices, row)
		}
		v.Groups = append(v.Groups, fg)
	}
	return writeHTML(w, r, status, prachFindPage(v), nil)
}

// apiPRACH answers POST /api/v1/prach: the finder on the plan in the body,
// the document of "gridloom prach -format json"; 422 with the reason when
// the plan has errors to fix first.
func (s *server) apiPRACH(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	found, err := grid.FindPRACH(plan)
	if err != nil {
		return &problem{status: http.StatusUnprocessableEntity, text: err.Error()}
	}
	if err := sendJSONImport(w, r, http.StatusOK, report.BuildPRACHFinder(found), notes); err != nil {
		return internal("prach finder document", err)
	}
	return nil
}
