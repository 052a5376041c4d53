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
	Range, Binds                     string
	FindHref                         string
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
	assoc := "none: the blocks cannot be mapped within 160 ms (TS 38.213 Table 8.1-1)"
	if p.AssociationPeriodFrames > 0 {
		assoc = strconv.Itoa(10*p.AssociationPeriodFrames) + " ms"
	}
	return &prachView{
		Index: strconv.Itoa(p.ConfigurationIndex), Format: p.Format, Table: "TS 38.211 Table " + p.Table,
		SCS: prachNum(float64(p.SCSHz)/1000) + " kHz", NRBRA: strconv.Itoa(p.NRBRA),
		Per10ms:     prachNum(p.ValidPer10ms),
		Valid:       fmt.Sprintf("%d of %d", valid, len(p.Occasions)),
		Association: assoc,
		Range:       prachNum(float64(int(p.Range.Limit/10+0.5))/100) + " km",
		Binds:       rangeBinds(p),
		FindHref:    "/prach?" + query,
	}
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
	Index, SCS, Per10ms, Range, Period, Association, Warnings string
	Href, Current                                             string
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
				Association: strconv.Itoa(10*c.AssociationPeriodFrames) + " ms", Warnings: strconv.Itoa(c.Warnings),
				Href: "/?" + q.Encode() + "#h-prach"}
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
