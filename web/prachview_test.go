package web

import (
	"encoding/json"
	"html"
	"net/http"
	"os"
	"reflect"
	"regexp"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/web/planform"
)

const prachDDDSU = "../testdata/prach/dddsu.yaml"

func prachPlanFile(t *testing.T) ([]byte, grid.Plan) {
	t.Helper()
	data, err := os.ReadFile(prachDDDSU)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.DecodeYAML(data)
	if err != nil {
		t.Fatal(err)
	}
	return data, p
}

// TestPRACHTable: the results show the random access table. Index 160 of
// TS 38.211 Table 6.3.3.2-3 is format B4, one occasion in time in subframe
// 9 of every frame (x = 1, y = 0); at 30 kHz that is slot 19, the U slot
// of DDDSU (19 mod 5 = 4), so with msg1-FDM 2 both occasions are valid:
// 2 valid occasions per 10 ms. The four blocks take two frames
// (association period 20 ms), and since slot 19 is valid with or without
// blocks the association pattern period is the same 20 ms (TS 38.213 8.1).
func TestPRACHTable(t *testing.T) {
	_, p := prachPlanFile(t)
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/?"+planform.FormOf(p).Query())
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "page", r.body, `data-testid="prach-table"`, `data-testid="prach-index">160<`, `data-testid="prach-format">B4<`,
		`data-testid="prach-per10ms">2<`, "TS 38.211 Table 6.3.3.2-3", `data-testid="prach-find"`,
		`data-testid="prach-pattern">20 ms<`)
	demo := get(t, srv, "/?"+planform.FormOf(testConfig(t).Plan).Query())
	if strings.Contains(demo.body, "prach-table") {
		t.Error("a plan without prach shows the random access table")
	}
}

var prachApplyLink = regexp.MustCompile(`<a href="([^"]*)" data-testid="prach-apply-(\d+)"`)

// TestPRACHFinderPage: the finder lists the indexes FindPRACH finds,
// grouped by format, and each link applies its index to the plan, without
// script.
func TestPRACHFinderPage(t *testing.T) {
	_, p := prachPlanFile(t)
	found, err := grid.FindPRACH(p)
	if err != nil {
		t.Fatal(err)
	}
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/prach?"+planform.FormOf(p).Query())
	wantStatus(t, r, http.StatusOK)
	links := prachApplyLink.FindAllStringSubmatch(r.body, -1)
	if len(links) != found.Count() || found.Count() == 0 {
		t.Fatalf("%d links, FindPRACH finds %d", len(links), found.Count())
	}
	for _, g := range found.Groups {
		wantContains(t, "finder", r.body, `data-testid="prach-format-`+g.Format+`"`)
	}
	var pick []string
	for _, l := range links {
		if l[2] != "160" {
			pick = l
			break
		}
	}
	if pick == nil {
		t.Fatal("no index but the plan's own fits")
	}
	applied := get(t, srv, html.UnescapeString(pick[1]))
	wantStatus(t, applied, http.StatusOK)
	wantContains(t, "applied", applied.body, `data-testid="prach-index">`+pick[2]+`<`)

	bad := p.Clone()
	bad.Partitions[0].SCSKHz = 7
	r = get(t, srv, "/prach?"+planform.FormOf(bad).Query())
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "refusal", r.body, `data-testid="prach-find-error"`, "errors to fix")
}

// TestAPIPRACH: POST /api/v1/prach answers the document of "gridloom prach
// -format json".
func TestAPIPRACH(t *testing.T) {
	data, p := prachPlanFile(t)
	found, err := grid.FindPRACH(p)
	if err != nil {
		t.Fatal(err)
	}
	srv, _ := newTestServer(t, testConfig(t))
	r := post(t, srv, "/api/v1/prach", "application/yaml", data)
	wantStatus(t, r, http.StatusOK)
	var got report.PRACHFinder
	if err := json.Unmarshal([]byte(r.body), &got); err != nil {
		t.Fatal(err)
	}
	if want := report.BuildPRACHFinder(found); !reflect.DeepEqual(got, want) {
		t.Errorf("document %+v, want %+v", got, want)
	}
	r = post(t, srv, "/api/v1/prach", "application/json", []byte(`{"carrier":{}}`))
	if r.StatusCode != http.StatusUnprocessableEntity && r.StatusCode != http.StatusBadRequest {
		t.Errorf("a plan with errors: status %d, want 422 or 400", r.StatusCode)
	}
}

// TestPRACHWalkAndCompare: a plan with prach gets a random access step
// that highlights the prach layer, and the comparison rows for it; a plan
// without prach gets neither. Index 160 is format B4 with 2 valid
// occasions per 10 ms (see TestPRACHTable).
func TestPRACHWalkAndCompare(t *testing.T) {
	_, p := prachPlanFile(t)
	steps := Walkthrough(grid.Compute(p))
	i := slices.IndexFunc(steps, func(s WalkStep) bool { return s.Key == "prach" })
	if i < 0 {
		t.Fatal("no prach step")
	}
	text := strings.Join(steps[i].Narration, " ")
	for _, want := range []string{"prach-ConfigurationIndex 160", "format B4 at 30 kHz", "2 valid per 10 ms"} {
		if !strings.Contains(text, want) {
			t.Errorf("the step does not say %q: %s", want, text)
		}
	}
	if highlightClass(steps[i].Highlight) != "gl-hl gl-hl-prach" {
		t.Errorf("highlight %q", highlightClass(steps[i].Highlight))
	}
	plain := testConfig(t).Plan
	if slices.ContainsFunc(Walkthrough(grid.Compute(plain)), func(s WalkStep) bool { return s.Key == "prach" }) {
		t.Error("a plan without prach has a prach step")
	}

	a := planform.NewState(planform.FormOf(p), nil)
	q := p.Clone()
	q.PRACH = nil
	b := planform.NewState(planform.FormOf(q), nil)
	rows := map[string]diffRow{}
	for _, r := range diffTotals(a, b) {
		rows[r.Label] = r
	}
	if r := rows["PRACH configuration"]; r.A != "index 160, format B4" || r.B != "none" || !r.Changed {
		t.Errorf("PRACH configuration row %+v", r)
	}
	if r := rows["Valid PRACH occasions per 10 ms"]; r.A != "2.00" || r.B != "0.00" {
		t.Errorf("occasions row %+v", r)
	}
	if _, ok := rows["PRACH cell range km"]; !ok {
		t.Error("no cell range row")
	}
	for _, r := range diffTotals(b, b) {
		if strings.Contains(r.Label, "PRACH") {
			t.Errorf("two plans without prach get the row %q", r.Label)
		}
	}
}

// TestPRACHAssociationInWalkAndCompare: the random access step and the
// comparison give the association period and the association pattern
// period as the Random access table does. dddsu.yaml maps its four blocks
// over 2 frames (20 ms, TS 38.213 Table 8.1-1) and, slot 19 being valid
// with blocks or without, repeats the mapping every 20 ms too (TS 38.213
// 8.1). Without its TDD pattern and with index 167 (B4 in every slot) one
// frame maps them (10 ms), but the blocks come every 20 ms and the frames
// without them validate 2 more occasions, so the pattern period is
// lcm(1, 2) frames, 20 ms (both worked in grid's
// TestPRACHAssociationPatternPeriod).
func TestPRACHAssociationInWalkAndCompare(t *testing.T) {
	_, p := prachPlanFile(t)
	q := p.Clone()
	q.TDD = nil
	q.PRACH.ConfigurationIndex = 167
	for _, c := range []struct {
		name  string
		plan  grid.Plan
		wants []string
	}{
		{"dddsu", p, []string{"association period of 20 ms (TS 38.213 Table 8.1-1)", "association pattern period, 20 ms (TS 38.213 8.1)."}},
		{"index 167", q, []string{"association period of 10 ms (TS 38.213 Table 8.1-1)", "association pattern period, 20 ms (TS 38.213 8.1): the SS/PBCH blocks come every 20 ms, and in the frames without them 2 more occasion"}},
	} {
		steps := Walkthrough(grid.Compute(c.plan))
		i := slices.IndexFunc(steps, func(s WalkStep) bool { return s.Key == "prach" })
		if i < 0 {
			t.Fatalf("%s: no prach step", c.name)
		}
		text := strings.Join(steps[i].Narration, " ")
		for _, want := range c.wants {
			if !strings.Contains(text, want) {
				t.Errorf("%s: the step does not say %q: %s", c.name, want, text)
			}
		}
	}

	none := p.Clone()
	none.PRACH = nil
	state := func(p grid.Plan) planform.State { return planform.NewState(planform.FormOf(p), nil) }
	for _, c := range []struct {
		name           string
		b              grid.Plan
		assoc, patt    string
		changedAssoc   bool
		changedPattern bool
	}{
		{"index 167", q, "10 ms", "20 ms", true, false},
		{"no prach", none, "none", "none", true, true},
	} {
		rows := map[string]diffRow{}
		for _, r := range diffTotals(state(p), state(c.b)) {
			rows[r.Label] = r
		}
		if r := rows["PRACH association period"]; r.A != "20 ms" || r.B != c.assoc || r.Changed != c.changedAssoc {
			t.Errorf("%s: association period row %+v, want 20 ms against %s", c.name, r, c.assoc)
		}
		if r := rows["PRACH association pattern period"]; r.A != "20 ms" || r.B != c.patt || r.Changed != c.changedPattern {
			t.Errorf("%s: association pattern period row %+v, want 20 ms against %s", c.name, r, c.patt)
		}
	}
}

var (
	prachSectionFind = regexp.MustCompile(`<a href="([^"]*)" data-testid="find-g-prach"`)
	prachFindingFind = regexp.MustCompile(`<a class="gl-goto" href="([^"]*)" data-testid="finding-find"`)
)

// TestPRACHFinderFromErrors: a prach block with an error leaves the results
// without the Random access table; the form's random access section and the
// prach finding then lead to the finder, with the plan as it stands (index
// 300 kept in the query), and the finder lists the indexes that fit.
func TestPRACHFinderFromErrors(t *testing.T) {
	_, p := prachPlanFile(t)
	p.PRACH.ConfigurationIndex = 300 // Table 6.3.3.2-3 defines 0 to 262
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/?"+planform.FormOf(p).Query())
	wantStatus(t, r, http.StatusUnprocessableEntity) // the page of a plan with errors
	if strings.Contains(r.body, `data-testid="prach-table"`) {
		t.Fatal("a prach block with errors still shows the random access table")
	}
	wantContains(t, "page", r.body, `data-code="prach"`)
	sec := prachSectionFind.FindStringSubmatch(r.body)
	fnd := prachFindingFind.FindStringSubmatch(r.body)
	if sec == nil || fnd == nil {
		t.Fatalf("finder links: section %v, finding %v", sec, fnd)
	}
	for what, href := range map[string]string{"section": html.UnescapeString(sec[1]), "finding": html.UnescapeString(fnd[1])} {
		if !strings.HasPrefix(href, "/prach?") || !strings.Contains(href, "prach.idx=300") {
			t.Errorf("%s link %q: want the finder with the plan's state (prach.idx=300)", what, href)
			continue
		}
		f := get(t, srv, href)
		wantStatus(t, f, http.StatusOK)
		wantContains(t, what+" finder", f.body, `data-testid="prach-find-head"`, `data-testid="prach-apply-160"`)
	}
	// Every prach finding has the link and no other finding has: the plan
	// as it is (a prach warning) and the demo plan (findings, none prach).
	_, ok := prachPlanFile(t)
	for _, q := range []string{planform.FormOf(p).Query(), planform.FormOf(ok).Query(), planform.FormOf(testConfig(t).Plan).Query()} {
		b := get(t, srv, "/?"+q).body
		if n, m := len(prachFindingFind.FindAllString(b, -1)), strings.Count(b, `data-code="prach"`); n != m {
			t.Errorf("%d finder links on findings, %d prach findings", n, m)
		}
	}
}

var prachSpanFit = regexp.MustCompile(`<a href="([^"]*)" data-testid="prach-span-fit">([^<]*)</a>`)

// TestPRACHSpanHidesOccasions: dddsu.yaml's span defaults to 3 ms (the
// 2.5 ms TDD period rounded up) while its occasions start at 9.571 ms of
// frames 0 and 1 (grid's TestPRACHInSpan): the table says none of the four
// is shown and where the next is, and offers 0–10 ms, which shows frame
// 0's two; at 10 ms it still says the association period (20 ms) is longer
// than any span, and offers nothing longer.
func TestPRACHSpanHidesOccasions(t *testing.T) {
	_, p := prachPlanFile(t)
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/?"+planform.FormOf(p).Query())
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "3 ms", html.UnescapeString(r.body), `data-testid="prach-span"`,
		"The figure spans 0–3 ms and shows 0 of the 4 occasions of the 20 ms association period; the next is in frame 0, slot 19, from 9.571 ms, outside the span 0–3 ms.")
	m := prachSpanFit.FindStringSubmatch(r.body)
	if m == nil || html.UnescapeString(m[2]) != "Show 0–10 ms, frame 0's 2 occasions" || !strings.Contains(html.UnescapeString(m[1]), "span=10") {
		t.Fatalf("span link %q; want one to span=10 showing frame 0's 2 occasions", m)
	}
	wide := get(t, srv, html.UnescapeString(m[1]))
	wantStatus(t, wide, http.StatusOK)
	wantContains(t, "10 ms", html.UnescapeString(wide.body), "shows 2 of the 4 occasions", "the next is in frame 1, slot 19", "spans at most 10 ms")
	if strings.Contains(wide.body, `data-testid="prach-span-fit"`) {
		t.Error("at 10 ms a longer span is still offered")
	}
	// Every occasion in the span: no sentence. With one block sent, the two
	// occasions of frame 0 map it (association period 10 ms, TS 38.213
	// Table 8.1-1) and a 10 ms span holds both.
	one := p.Clone()
	one.SSB.Bitmap = "10000000"
	one.SpanMs = 10
	r = get(t, srv, "/?"+planform.FormOf(one).Query())
	wantStatus(t, r, http.StatusOK)
	if strings.Contains(r.body, `data-testid="prach-span"`) {
		t.Errorf("every occasion in the span, yet the table says some are not: %s", html.UnescapeString(r.body[strings.Index(r.body, `data-testid="prach-span"`):][:300]))
	}
}

// TestPRACHSpanLongFormat: fdd-long.yaml (no TDD: a 1 ms span) has its
// format 0 occasions in subframe 4 of frames 0–3 (grid's TestPRACHInSpan):
// the table names the subframe, and offers 0–5 ms for frame 0's one.
func TestPRACHSpanLongFormat(t *testing.T) {
	p := loadPlanFile(t, "../testdata/prach/fdd-long.yaml")
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/?"+planform.FormOf(p).Query())
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "fdd-long", html.UnescapeString(r.body),
		"shows 0 of the 4 occasions of the 40 ms association period; the next is in frame 0, subframe 4, from 4 ms, outside the span 0–1 ms.",
		"Show 0–5 ms, frame 0's occasion")
}
