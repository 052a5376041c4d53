package web

import (
	"bytes"
	"compress/gzip"
	"encoding/json"
	"encoding/xml"
	"errors"
	"fmt"
	"html"
	"io"
	"log/slog"
	"mime"
	"mime/multipart"
	"net/http"
	"net/http/httptest"
	"net/url"
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"strconv"
	"strings"
	"sync"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/render"
	"gridloom/web/planform"
)

// logBuffer collects the server's log for assertions.
type logBuffer struct {
	mu  sync.Mutex
	buf bytes.Buffer
}

func (l *logBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.buf.Write(p)
}

func (l *logBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.buf.String()
}

// testConfig serves the demo plans with the real figure, opening with campus.
func testConfig(t testing.TB) Config {
	t.Helper()
	plans := demoPlans(t)
	// example.com is the host of httptest.NewRequest's requests.
	cfg := Config{Plan: plans["campus.yaml"], AllowHosts: []string{"example.com"}}
	for _, n := range []string{"campus.yaml", "port.yaml", "stadium.yaml"} {
		cfg.Demos = append(cfg.Demos, Demo{Name: strings.TrimSuffix(n, ".yaml"), Plan: plans[n]})
	}
	return cfg
}

func newTestServer(t *testing.T, cfg Config) (*httptest.Server, *logBuffer) {
	t.Helper()
	logs := &logBuffer{}
	srv := httptest.NewServer(NewServer(slog.New(slog.NewTextHandler(logs, nil)), cfg))
	t.Cleanup(srv.Close)
	return srv, logs
}

// noRedirect is a client that reports redirects instead of following them.
var noRedirect = &http.Client{CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}

type response struct {
	*http.Response
	body string
}

func do(t *testing.T, req *http.Request) response {
	t.Helper()
	res, err := noRedirect.Do(req)
	if err != nil {
		t.Fatalf("%s %s: %v", req.Method, req.URL, err)
	}
	defer res.Body.Close()
	b, err := io.ReadAll(res.Body)
	if err != nil {
		t.Fatal(err)
	}
	return response{res, string(b)}
}

func get(t *testing.T, srv *httptest.Server, path string) response {
	t.Helper()
	req, err := http.NewRequest(http.MethodGet, srv.URL+path, nil)
	if err != nil {
		t.Fatal(err)
	}
	return do(t, req)
}

func post(t *testing.T, srv *httptest.Server, path, ctype string, body []byte) response {
	t.Helper()
	req, err := http.NewRequest(http.MethodPost, srv.URL+path, bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	req.Header.Set("Content-Type", ctype)
	return do(t, req)
}

// planType is the Content-Type that the API takes for a plan file of the
// corpus: YAML by its extension, JSON for the rest (which the JSON decoder
// then judges, as it would any body so declared).
func planType(file string) string {
	if strings.HasSuffix(file, ".yaml") || strings.HasSuffix(file, ".yml") {
		return "application/yaml"
	}
	return "application/json"
}

func wantStatus(t *testing.T, r response, want int) {
	t.Helper()
	if r.StatusCode != want {
		t.Fatalf("%s %s: status %d, want %d; body:\n%.600s", r.Request.Method, r.Request.URL.Path, r.StatusCode, want, r.body)
	}
}

func wantContains(t *testing.T, what, s string, subs ...string) {
	t.Helper()
	for _, sub := range subs {
		if !strings.Contains(s, sub) {
			t.Errorf("%s does not contain %q", what, sub)
		}
	}
}

// noteText is the text of the message slot beside a control.
func noteText(t *testing.T, page, id string) string {
	t.Helper()
	re := regexp.MustCompile(`(?s)<div class="gl-notes" id="n-` + regexp.QuoteMeta(id) + `" data-notes>(.*?)</div>`)
	m := re.FindStringSubmatch(page)
	if m == nil {
		t.Fatalf("no message slot n-%s on the page", id)
	}
	return m[1]
}

// inputValue is the value attribute of an input, as the page writes it.
func inputValue(t *testing.T, page, id string) string {
	t.Helper()
	re := regexp.MustCompile(`<input type="text" id="` + regexp.QuoteMeta(id) + `" name="[^"]*" value="([^"]*)"`)
	m := re.FindStringSubmatch(page)
	if m == nil {
		t.Fatalf("no text input %s on the page", id)
	}
	return m[1]
}

// inputTag is the whole start tag of the input with the id.
func inputTag(t *testing.T, page, id string) string {
	t.Helper()
	m := regexp.MustCompile(`<input type="text" id="` + regexp.QuoteMeta(id) + `"[^>]*>`).FindString(page)
	if m == "" {
		t.Fatalf("no text input %s on the page", id)
	}
	return m
}

// formSubmission is the query a browser without script sends when the plan
// form is submitted: every text input and the selected option of every
// select, empty values included, in document order.
func formSubmission(t *testing.T, page string) string {
	t.Helper()
	start := strings.Index(page, `<form id="gl-form"`)
	end := strings.Index(page[start:], "</form>")
	if start < 0 || end < 0 {
		t.Fatal("no plan form on the page")
	}
	form := page[start : start+end]
	control := regexp.MustCompile(`(?s)<input type="text" id="[^"]*" name="([^"]*)" value="([^"]*)"|<select id="[^"]*" name="([^"]*)"[^>]*>(.*?)</select>`)
	selected := regexp.MustCompile(`<option value="([^"]*)" selected>`)
	var pairs []string
	for _, m := range control.FindAllStringSubmatch(form, -1) {
		name, value := m[1], m[2]
		if m[3] != "" {
			name = m[3]
			sel := selected.FindStringSubmatch(m[4])
			if sel == nil {
				t.Fatalf("select %s has no selected option", name)
			}
			value = sel[1]
		}
		pairs = append(pairs, url.QueryEscape(html.UnescapeString(name))+"="+url.QueryEscape(html.UnescapeString(value)))
	}
	return strings.Join(pairs, "&")
}

func TestFormWorksWithoutScript(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for _, d := range testConfig(t).Demos {
		page := get(t, srv, "/?"+planform.FormOf(d.Plan).Query())
		sub := formSubmission(t, page.body)
		r := get(t, srv, "/?"+sub)
		wantStatus(t, r, http.StatusOK)
		// The submitted plan computes exactly as the plan shown (selects
		// spell out defaults such as cp=normal, so compare the results).
		f, _ := planform.ParseQuery(mustQuery(t, sub))
		p, msgs := f.Plan()
		if len(msgs) > 0 {
			t.Fatalf("%s: the submitted form has messages %v", d.Name, msgs)
		}
		got, want := report.Build(grid.Compute(p), true), report.Build(grid.Compute(d.Plan), true)
		got.Plan, want.Plan = grid.Plan{}, grid.Plan{}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%s: submitting the form without script changes the result", d.Name)
		}
	}
}

func campusQuery(t *testing.T) string {
	return planform.FormOf(testConfig(t).Plan).Query()
}

func TestSecurityHeadersOnEveryResponse(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	tooLong := "/?" + q + "&pad=" + strings.Repeat("x", MaxQuery)
	for _, path := range []string{"/", "/?" + q, "/fragment?" + q, "/figure.svg?" + q, "/plan.json?" + q, "/static/app.js", "/nowhere", "/api/v1/nowhere", tooLong} {
		r := get(t, srv, path)
		h := r.Header
		csp := h.Get("Content-Security-Policy")
		if !strings.Contains(csp, "frame-ancestors 'none'") || (!strings.Contains(csp, "default-src 'self'") && !strings.Contains(csp, "default-src 'none'")) {
			t.Errorf("%s: Content-Security-Policy %q", path, csp)
		}
		if strings.Contains(csp, "unsafe-inline") || strings.Contains(csp, "unsafe-eval") {
			t.Errorf("%s: policy allows inline code: %q", path, csp)
		}
		if h.Get("X-Content-Type-Options") != "nosniff" || h.Get("Referrer-Policy") != "no-referrer" {
			t.Errorf("%s: X-Content-Type-Options %q, Referrer-Policy %q", path, h.Get("X-Content-Type-Options"), h.Get("Referrer-Policy"))
		}
	}
}

func TestPageOpensWithStartupPlan(t *testing.T) {
	srv, logs := newTestServer(t, testConfig(t))
	r := get(t, srv, "/")
	wantStatus(t, r, http.StatusSeeOther)
	loc := r.Header.Get("Location")
	if loc != "/?"+campusQuery(t) {
		t.Fatalf("Location %q, want the campus plan's query", loc)
	}
	page := get(t, srv, loc)
	wantStatus(t, page, http.StatusOK)
	wantContains(t, "the campus page", page.body,
		`<title>Hillcrest campus 40 MHz · gridloom</title>`,
		`<svg`, `id="gl-plot"`, `class="gl-part"`, // the real figure, inline
		`id="gl-lattice" type="application/json"`,
		`data-testid="timing-table"`, `<th scope="row">`+testConfig(t).Plan.Partitions[1].Name+`</th>`,
		`data-testid="caution"`, "not a compliance tool", "local regulator",
		`href="/figure.svg?`+strings.ReplaceAll(campusQuery(t), "&", "&amp;")+`&amp;download=1"`,
		`src="/static/app.js"`,
	)
	if strings.Contains(page.body, " style=") || regexp.MustCompile(`<script(?: [^>]*)?>[^<]`).MatchString(strings.ReplaceAll(page.body, `<script id="gl-lattice" type="application/json">`, "")) {
		t.Error("the page has an inline style attribute or an inline script")
	}
	if strings.Contains(page.body, " on") && regexp.MustCompile(`<[^>]+\son[a-z]+=`).MatchString(page.body) {
		t.Error("the page has an inline event handler")
	}
	if !strings.Contains(logs.String(), "msg=request") || !strings.Contains(logs.String(), "status=303") {
		t.Errorf("access log has no request line with its status:\n%s", logs)
	}
}

// TestPageMiniSlots: the timing table gives each partition's mini-slots.
// TS 38.211 5.3.1, worked by hand: a normal-CP symbol away from the long
// CP lasts (2048 + 144)·64·2^-μ Tc, with Tc = 1/1966.08 µs; at 30 kHz
// (μ = 1) that is 70 144 Tc = 35.677 µs, so 2, 4 and 7 symbols last
// 71.354, 142.708 and 249.740 µs; at 15 kHz twice as long.
func TestPageMiniSlots(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for scs, want := range map[int]string{15: "142.708 / 285.417 / 499.479", 30: "71.354 / 142.708 / 249.740"} {
		plan := grid.Plan{Name: "mini", Carrier: grid.CarrierPlan{BandwidthMHz: 20},
			Partitions: []grid.PartitionPlan{{Name: "a", SCSKHz: scs, SizePRB: 20}}}
		r := get(t, srv, "/?"+planform.FormOf(plan).Query())
		wantStatus(t, r, http.StatusOK)
		wantContains(t, fmt.Sprintf("the timing table at %d kHz", scs), r.body, `<td class="gl-num" data-col="mini">`+want+`</td>`)
	}
}

func TestPageKeepsBadInput(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	bad := strings.Replace(q, "p1.size=50", "p1.size=5o%20PRBs", 1)
	r := get(t, srv, "/?"+bad)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if got := inputValue(t, r.body, "f-p1-size"); got != "5o PRBs" {
		t.Errorf("the size field shows %q, want the input as typed", got)
	}
	note := noteText(t, r.body, "f-p1-size")
	wantContains(t, "the note beside size", note, "&#34;5o PRBs&#34; is not a whole number", "1 to 275")
	if tag := inputTag(t, r.body, "f-p1-size"); !strings.Contains(tag, `aria-invalid="true"`) || !strings.Contains(tag, `aria-describedby="n-f-p1-size"`) {
		t.Errorf("the bad field is not marked invalid and tied to its message: %s", tag)
	}
	if tag := inputTag(t, r.body, "f-p1-start"); strings.Contains(tag, "aria-invalid") {
		t.Errorf("a good field is marked invalid: %s", tag)
	}
	// The figure still draws what the rest of the plan places.
	wantContains(t, "page", r.body, `id="gl-plot"`)
}

func TestPageShowsFindingsBesideFields(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	// The third partition moved onto the second's spectrum: an overlap,
	// reported at the third's startCrb.
	q := strings.Replace(campusQuery(t), "p2.start=154", "p2.start=60", 1)
	r := get(t, srv, "/?"+q)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "note beside control's start", noteText(t, r.body, "f-p2-start"), "overlap")
	wantContains(t, "findings", r.body, `data-code="overlap"`, `href="#f-p2-start"`)
	if got := inputValue(t, r.body, "f-p2-start"); got != "60" {
		t.Errorf("start shows %q, want 60", got)
	}
}

func TestFragment(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	r := get(t, srv, "/fragment?"+q)
	wantStatus(t, r, http.StatusOK)
	if strings.Contains(r.body, "<html") || !strings.HasPrefix(r.body, `<main id="gl-work"`) {
		t.Errorf("fragment is not the workspace alone: %.200s", r.body)
	}
	wantContains(t, "fragment", r.body, `data-query="`+strings.ReplaceAll(q, "&", "&amp;")+`"`, `id="gl-form"`, `id="gl-results"`)

	wantContains(t, "fragment", r.body, `data-status="200"`)

	// The page script shows what comes before editorMark at once and the
	// rest a frame later: the results must come first, the forms after.
	for _, path := range []string{"/fragment?" + q, "/compare/fragment?" + q} {
		body := get(t, srv, path).body
		results, mark := strings.Index(body, `id="gl-results"`), strings.Index(body, editorMark)
		form := strings.Index(body, `data-live`)
		if strings.Count(body, editorMark) != 1 || results < 0 || !(results < mark && mark < form) {
			t.Errorf("%s: results at %d, %d marks, first at %d, form at %d; want the results, one mark, then the form", path, results, strings.Count(body, editorMark), mark, form)
		}
	}

	// The fragment request succeeds; the plan's own status rides along.
	r = get(t, srv, "/fragment?"+q+"&op=dup.1")
	wantStatus(t, r, http.StatusOK)
	parts := testConfig(t).Plan.Partitions
	wantContains(t, "fragment after dup.1", r.body, `value="`+parts[1].Name+`-copy"`, `data-focus="f-p2-name"`, "p3.name="+parts[2].Name,
		`data-status="422"`) // the copy overlaps its original

	r = get(t, srv, "/fragment?"+q+"&op=del.9")
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "fragment after a bad op", noteText(t, r.body, "g-parts"), "del.9")
}

func TestPageOpWithoutScript(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	r := get(t, srv, "/?"+q+"&op=up.2")
	wantStatus(t, r, http.StatusSeeOther)
	loc := r.Header.Get("Location")
	u, err := url.Parse(loc)
	if err != nil {
		t.Fatal(err)
	}
	parts := testConfig(t).Plan.Partitions
	if u.Fragment != "b-up-1" || u.Query().Get("p1.name") != parts[2].Name || u.Query().Get("p2.name") != parts[1].Name || u.Query().Has("op") {
		t.Errorf("after up.2: Location %s", loc)
	}
}

func TestRoundTripThroughPage(t *testing.T) {
	// The query the page writes for its own plan is the query it was given.
	srv, _ := newTestServer(t, testConfig(t))
	for _, d := range testConfig(t).Demos {
		q := planform.FormOf(d.Plan).Query()
		r := get(t, srv, "/fragment?"+q)
		want := `data-query="` + strings.ReplaceAll(q, "&", "&amp;") + `"`
		if !strings.Contains(r.body, want) {
			t.Errorf("%s: the page does not write back its query %s", d.Name, q)
		}
	}
}

func TestDemoRoute(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/demo/port")
	wantStatus(t, r, http.StatusSeeOther)
	if loc := r.Header.Get("Location"); !strings.Contains(loc, "name=Saltmarsh+port+100+MHz") {
		t.Errorf("Location %q", loc)
	}
	wantStatus(t, get(t, srv, "/demo/nowhere"), http.StatusNotFound)
}

func TestFigureDownload(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	r := get(t, srv, "/figure.svg?"+q)
	wantStatus(t, r, http.StatusOK)
	if ct := r.Header.Get("Content-Type"); ct != "image/svg+xml" {
		t.Errorf("Content-Type %q", ct)
	}
	if cd := r.Header.Get("Content-Disposition"); cd != "" {
		t.Errorf("without download=1 the figure is inline, got Content-Disposition %q", cd)
	}
	var root struct {
		XMLName xml.Name
	}
	if err := xml.Unmarshal([]byte(r.body), &root); err != nil || root.XMLName.Local != "svg" {
		t.Fatalf("not an SVG document: %v, root %v", err, root.XMLName)
	}
	if !strings.Contains(r.Header.Get("Content-Security-Policy"), "default-src 'none'") {
		t.Errorf("figure CSP %q", r.Header.Get("Content-Security-Policy"))
	}

	r = get(t, srv, "/figure.svg?"+q+"&download=1")
	wantStatus(t, r, http.StatusOK)
	wantDisposition(t, r, "hillcrest-campus-40-mhz.svg")

	// A hostile plan name makes a harmless file name.
	evil := strings.Replace(q, "name=Hillcrest+campus+40+MHz", "name="+url.QueryEscape(`..\..\"boot"; x=.svg`), 1)
	wantDisposition(t, get(t, srv, "/figure.svg?"+evil+"&download=1"), "boot-x-svg.svg")

	wantStatus(t, get(t, srv, "/figure.svg?p0.name=a&p0.size=abc"), http.StatusUnprocessableEntity)
}

func wantDisposition(t *testing.T, r response, file string) {
	t.Helper()
	disp, params, err := mime.ParseMediaType(r.Header.Get("Content-Disposition"))
	if err != nil || disp != "attachment" || params["filename"] != file {
		t.Errorf("Content-Disposition %q: %v, %v; want attachment with filename %q", r.Header.Get("Content-Disposition"), disp, params, file)
	}
}

func TestPlanDownloads(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	want := testConfig(t).Plan
	q := planform.FormOf(want).Query()
	for _, c := range []struct {
		path, ctype, file string
		decode            func([]byte) (grid.Plan, error)
	}{
		{"/plan.json", "application/json; charset=utf-8", "hillcrest-campus-40-mhz.json", planfile.DecodeJSON},
		{"/plan.yaml", "application/yaml; charset=utf-8", "hillcrest-campus-40-mhz.yaml", planfile.DecodeYAML},
	} {
		r := get(t, srv, c.path+"?"+q)
		wantStatus(t, r, http.StatusOK)
		if ct := r.Header.Get("Content-Type"); ct != c.ctype {
			t.Errorf("%s: Content-Type %q, want %q", c.path, ct, c.ctype)
		}
		wantDisposition(t, r, c.file)
		got, err := c.decode([]byte(r.body))
		if err != nil {
			t.Fatalf("%s: the plan file does not read back: %v", c.path, err)
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%s: plan file reads back as %+v, want %+v", c.path, got, want)
		}
	}
	wantStatus(t, get(t, srv, "/plan.json?p0.name=a&p0.scs=x"), http.StatusUnprocessableEntity)
}

func TestSymbolCSV(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/symbols.csv?"+campusQuery(t))
	wantStatus(t, r, http.StatusOK)
	if ct := r.Header.Get("Content-Type"); ct != "text/csv; charset=utf-8" {
		t.Errorf("Content-Type %q", ct)
	}
	wantDisposition(t, r, "hillcrest-campus-40-mhz-symbols.csv")
	var want bytes.Buffer
	if err := render.SymbolCSV(&want, grid.Compute(testConfig(t).Plan)); err != nil {
		t.Fatal(err)
	}
	if r.body != want.String() {
		t.Errorf("the CSV differs from render.SymbolCSV of the plan")
	}
}

func multipartBody(t *testing.T, field, filename string, content []byte) ([]byte, string) {
	t.Helper()
	var buf bytes.Buffer
	w := multipart.NewWriter(&buf)
	if field != "" {
		fw, err := w.CreateFormFile(field, filename)
		if err != nil {
			t.Fatal(err)
		}
		fw.Write(content)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes(), w.FormDataContentType()
}

func TestUpload(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	port := testConfig(t).Demos[1].Plan
	yamlPlan, err := planfile.EncodeYAML(port)
	if err != nil {
		t.Fatal(err)
	}
	body, ctype := multipartBody(t, "plan", "port.yaml", yamlPlan)
	r := post(t, srv, "/open", ctype, body)
	wantStatus(t, r, http.StatusSeeOther)
	if loc := r.Header.Get("Location"); loc != "/?"+planform.FormOf(port).Query() {
		t.Errorf("after upload: Location %q, want the port plan's page", loc)
	}

	jsonPlan, _ := planfile.EncodeJSON(port)
	body, ctype = multipartBody(t, "plan", "no-extension", jsonPlan)
	wantStatus(t, post(t, srv, "/open", ctype, body), http.StatusSeeOther)

	// A broken file: the page it came from, with the reason beside the file control.
	from := campusQuery(t)
	body, ctype = multipartBody(t, "plan", "bad.json", []byte(`{"partitions": [{"name": "a", "sizePrb": "ten"}]}`))
	r = post(t, srv, "/open?"+from, ctype, body)
	wantStatus(t, r, http.StatusBadRequest)
	wantContains(t, "note beside the file control", noteText(t, r.body, "f-file"), "bad.json", "partitions[0].sizePrb")
	wantContains(t, "page after a failed upload", r.body, `value="Hillcrest campus 40 MHz"`)

	body, ctype = multipartBody(t, "", "", nil)
	r = post(t, srv, "/open?"+from, ctype, body)
	wantStatus(t, r, http.StatusBadRequest)
	wantContains(t, "note for no file", noteText(t, r.body, "f-file"), "Choose a plan file")

	big := bytes.Repeat([]byte("# padding\n"), (planfile.MaxSize/10)+10)
	body, ctype = multipartBody(t, "plan", "big.yaml", big)
	r = post(t, srv, "/open?"+from, ctype, body)
	wantStatus(t, r, http.StatusRequestEntityTooLarge)
	wantContains(t, "note for a big file", noteText(t, r.body, "f-file"), "1 MiB")

	// Far beyond the limit: the body is cut off while it is read.
	body, ctype = multipartBody(t, "plan", "huge.yaml", bytes.Repeat(big, 2))
	r = post(t, srv, "/open?"+from, ctype, body)
	wantStatus(t, r, http.StatusRequestEntityTooLarge)
	wantContains(t, "note for a huge upload", noteText(t, r.body, "f-file"), "larger than 1 MiB")
	wantContains(t, "page after a huge upload", r.body, `value="Hillcrest campus 40 MHz"`)

	wantStatus(t, post(t, srv, "/open", "text/plain", []byte("name: x")), http.StatusBadRequest)
}

func TestAPIRender(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	plan := testConfig(t).Plan
	body, _ := planfile.EncodeJSON(plan)
	r := post(t, srv, "/api/v1/render", "application/json", body)
	wantStatus(t, r, http.StatusOK)
	if ct := r.Header.Get("Content-Type"); ct != "application/json; charset=utf-8" {
		t.Errorf("Content-Type %q", ct)
	}
	// The same document as the command line's render -format json.
	want, _ := json.Marshal(report.Build(grid.Compute(plan), true))
	var gotV, wantV any
	json.Unmarshal([]byte(r.body), &gotV)
	json.Unmarshal(want, &wantV)
	if !reflect.DeepEqual(gotV, wantV) {
		t.Error("the API document differs from report.Build(grid.Compute(plan), true)")
	}

	r = post(t, srv, "/api/v1/render", "application/json", []byte(`{"carrier": {"bandwidthMHz": 40}, "partitions": [{"name": "a", "sizePrb": "ten"}]}`))
	wantStatus(t, r, http.StatusBadRequest)
	var e apiError
	if err := json.Unmarshal([]byte(r.body), &e); err != nil || len(e.Fields) != 1 || e.Fields[0].Field != "partitions[0].sizePrb" {
		t.Errorf("400 body %s: want one field error at partitions[0].sizePrb", r.body)
	}
	r = post(t, srv, "/api/v1/render", "application/json", []byte(`{"carrier": `))
	wantStatus(t, r, http.StatusBadRequest)
	wantContains(t, "malformed JSON error", r.body, "not valid JSON")

	broken := `{"carrier": {"bandwidthMHz": 40}, "partitions": [{"name": "a", "scsKHz": 15, "sizePrb": 300}]}`
	r = post(t, srv, "/api/v1/render", "application/json", []byte(broken))
	wantStatus(t, r, http.StatusUnprocessableEntity)
	var doc report.Document
	if err := json.Unmarshal([]byte(r.body), &doc); err != nil || len(doc.Findings) == 0 || doc.Channel.BandwidthMHz != 40 {
		t.Errorf("422 body: %v; want the findings and the rest of the document", err)
	}

	huge := append([]byte(`{"name": "`), bytes.Repeat([]byte("x"), maxBody)...)
	r = post(t, srv, "/api/v1/render", "application/json", append(huge, `"}`...))
	wantStatus(t, r, http.StatusRequestEntityTooLarge)
	wantContains(t, "413 body", r.body, `"error"`, "1 MiB")

	// Without a declared length the body is cut at the limit all the same.
	req, _ := http.NewRequest(http.MethodPost, srv.URL+"/api/v1/render", io.MultiReader(bytes.NewReader(huge), strings.NewReader(`"}`)))
	req.ContentLength = -1
	req.Header.Set("Content-Type", "application/json")
	wantStatus(t, do(t, req), http.StatusRequestEntityTooLarge)
}

func TestAPIFigure(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	body, _ := planfile.EncodeJSON(testConfig(t).Plan)
	r := post(t, srv, "/api/v1/figure", "application/json", body)
	wantStatus(t, r, http.StatusOK)
	if ct := r.Header.Get("Content-Type"); ct != "image/svg+xml" || !strings.Contains(r.body, `id="gl-plot"`) {
		t.Errorf("Content-Type %q; want the figure", ct)
	}
	wantStatus(t, post(t, srv, "/api/v1/figure", "application/json", []byte(`[]`)), http.StatusBadRequest)
	r = post(t, srv, "/api/v1/figure", "application/json", []byte(`{"partitions": []}`))
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "422 figure body", r.body, `"findings"`, `"code": "empty"`)
}

func TestNotFoundAndMethods(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/nowhere")
	wantStatus(t, r, http.StatusNotFound)
	wantContains(t, "404 page", r.body, "Nothing at /nowhere")
	r = get(t, srv, "/api/v2/render")
	wantStatus(t, r, http.StatusNotFound)
	wantContains(t, "API 404", r.body, `"error"`, "POST /api/v1/render")
	wantStatus(t, get(t, srv, "/static/"), http.StatusNotFound)
	wantStatus(t, get(t, srv, "/static/static.go"), http.StatusNotFound)

	for _, c := range []struct{ method, path, allow string }{
		{http.MethodPost, "/", "GET, HEAD"},
		{http.MethodDelete, "/figure.svg", "GET, HEAD"},
		{http.MethodGet, "/api/v1/render", "POST"},
		{http.MethodPut, "/api/v1/figure", "POST"},
		{http.MethodGet, "/open", "POST"},
	} {
		req, _ := http.NewRequest(c.method, srv.URL+c.path, nil)
		r := do(t, req)
		if r.StatusCode != http.StatusMethodNotAllowed || r.Header.Get("Allow") != c.allow {
			t.Errorf("%s %s: status %d, Allow %q; want 405 with %q", c.method, c.path, r.StatusCode, r.Header.Get("Allow"), c.allow)
		}
	}
	req, _ := http.NewRequest(http.MethodHead, srv.URL+"/?"+campusQuery(t), nil)
	if r := do(t, req); r.StatusCode != http.StatusOK || r.body != "" {
		t.Errorf("HEAD /: status %d, %d bytes", r.StatusCode, len(r.body))
	}
}

func TestStaticAssets(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for path, ctype := range map[string]string{
		"/static/app.js":   "text/javascript; charset=utf-8",
		"/static/app.css":  "text/css; charset=utf-8",
		"/static/icon.svg": "image/svg+xml",
	} {
		r := get(t, srv, path)
		wantStatus(t, r, http.StatusOK)
		if got := r.Header.Get("Content-Type"); got != ctype {
			t.Errorf("%s: Content-Type %q, want %q", path, got, ctype)
		}
		tag := r.Header.Get("ETag")
		if tag == "" {
			t.Fatalf("%s: no ETag", path)
		}
		req, _ := http.NewRequest(http.MethodGet, srv.URL+path, nil)
		req.Header.Set("If-None-Match", tag)
		if r := do(t, req); r.StatusCode != http.StatusNotModified {
			t.Errorf("%s with If-None-Match: status %d, want 304", path, r.StatusCode)
		}
	}
}

func TestCompression(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for _, path := range []string{"/?" + campusQuery(t), "/figure.svg?" + campusQuery(t), "/static/app.js", "/static/app.css"} {
		req, _ := http.NewRequest(http.MethodGet, srv.URL+path, nil)
		req.Header.Set("Accept-Encoding", "gzip")
		// The transport does not decompress when the request asks for gzip itself.
		res, err := http.DefaultTransport.RoundTrip(req)
		if err != nil {
			t.Fatal(err)
		}
		if res.Header.Get("Content-Encoding") != "gzip" {
			t.Errorf("%s: Content-Encoding %q, want gzip", path, res.Header.Get("Content-Encoding"))
		} else if zr, err := gzip.NewReader(res.Body); err != nil {
			t.Errorf("%s: %v", path, err)
		} else if _, err := io.Copy(io.Discard, zr); err != nil {
			t.Errorf("%s: gzip body: %v", path, err)
		}
		res.Body.Close()
	}
}

// TestGzipRefused: a client that refuses gzip (q=0) gets every answer
// plain, as RFC 9110 12.5.3 says, from the pages, the figure (cached or
// not), the plan files and the static assets alike.
func TestGzipRefused(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	for _, path := range []string{"/?" + q, "/figure.svg?" + q, "/figure.svg?" + q, "/plan.json?" + q, "/static/app.js", "/fragment?" + q} {
		for _, ae := range []string{"gzip;q=0", "gzip; q=0.0, identity", "identity"} {
			req, _ := http.NewRequest(http.MethodGet, srv.URL+path, nil)
			req.Header.Set("Accept-Encoding", ae)
			res, err := http.DefaultTransport.RoundTrip(req)
			if err != nil {
				t.Fatal(err)
			}
			body, _ := io.ReadAll(res.Body)
			res.Body.Close()
			if res.StatusCode != http.StatusOK || res.Header.Get("Content-Encoding") != "" || len(body) < 2 || (body[0] == 0x1f && body[1] == 0x8b) {
				route, _, _ := strings.Cut(path, "?")
				t.Errorf("%s with Accept-Encoding %q: status %d, Content-Encoding %q, body starts %q; want 200, plain",
					route, ae, res.StatusCode, res.Header.Get("Content-Encoding"), body[:min(len(body), 2)])
			}
		}
	}
}

func TestFigureFailureKeepsPage(t *testing.T) {
	cfg := testConfig(t)
	cfg.Figure = func(io.Writer, grid.Result, render.Options) error { return errors.New("pen ran dry") }
	srv, logs := newTestServer(t, cfg)
	r := get(t, srv, "/?"+campusQuery(t))
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "page without figure", r.body, "The figure could not be drawn: pen ran dry", `data-testid="timing-table"`, `data-testid="findings"`)
	wantContains(t, "log", logs.String(), "pen ran dry")
	wantStatus(t, get(t, srv, "/figure.svg?"+campusQuery(t)), http.StatusInternalServerError)
}

func TestPanicIsA500(t *testing.T) {
	cfg := testConfig(t)
	cfg.Figure = func(io.Writer, grid.Result, render.Options) error { panic("boom") }
	srv, logs := newTestServer(t, cfg)
	r := get(t, srv, "/figure.svg?"+campusQuery(t))
	wantStatus(t, r, http.StatusInternalServerError)
	wantContains(t, "log", logs.String(), "panic", "boom")
	wantStatus(t, get(t, srv, "/static/app.css"), http.StatusOK) // still serving
}

// TestInlineFigureStyles: an inline figure that brings its own styling gets
// exactly the CSP hashes for it, and nothing broader.
func TestInlineFigureStyles(t *testing.T) {
	svg := `<?xml version="1.0"?>
<!DOCTYPE svg>
<svg xmlns="http://www.w3.org/2000/svg"><style><![CDATA[.a{fill:red}]]></style><rect style="fill:blue" class="a"/><rect style='fill:blue'/></svg>`
	inline := inlineSVG([]byte(svg))
	if !strings.HasPrefix(inline, "<svg") {
		t.Errorf("inline figure starts %q", inline[:10])
	}
	got := styleSources(inline)
	want := []string{cspHash(".a{fill:red}"), cspHash("fill:blue"), "'unsafe-hashes'"}
	for _, w := range want {
		found := false
		for _, g := range got {
			found = found || g == w
		}
		if !found {
			t.Errorf("styleSources = %v, want %s among them", got, w)
		}
	}
	if len(got) != 3 {
		t.Errorf("styleSources = %v, want 3 sources", got)
	}
	if styleSources(`<svg><rect fill="red"/></svg>`) != nil {
		t.Error("a figure without styles needs no style sources")
	}
}

// hostileCase is one line of testdata/hostile/cases.tsv.
type hostileCase struct {
	file      string
	apiStatus int
	code      string
}

func hostileCases(t *testing.T) []hostileCase {
	t.Helper()
	b, err := os.ReadFile("../testdata/hostile/cases.tsv")
	if err != nil {
		t.Fatal(err)
	}
	var out []hostileCase
	for _, line := range strings.Split(string(b), "\n") {
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		f := strings.Split(line, "\t")
		if len(f) < 3 {
			t.Fatalf("cases.tsv: bad line %q", line)
		}
		status, err := strconv.Atoi(f[1])
		if err != nil {
			t.Fatalf("cases.tsv: bad status in %q", line)
		}
		out = append(out, hostileCase{f[0], status, f[2]})
	}
	if len(out) < 50 {
		t.Fatalf("cases.tsv has %d cases", len(out))
	}
	return out
}

// TestHostileCorpus sends every hostile plan file through the API, the
// upload and the page: the API answers as the corpus manifest says, and
// nothing is a 500 or lets markup from a name through.
func TestHostileCorpus(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for _, c := range hostileCases(t) {
		data, err := os.ReadFile(filepath.Join("../testdata/hostile", c.file))
		if err != nil {
			t.Fatal(err)
		}
		r := post(t, srv, "/api/v1/render", planType(c.file), data)
		if r.StatusCode != c.apiStatus {
			t.Errorf("%s: POST /api/v1/render %d, want %d; %.300s", c.file, r.StatusCode, c.apiStatus, r.body)
			continue
		}
		if c.code != "-" && !strings.Contains(r.body, `"code": "`+c.code+`"`) {
			t.Errorf("%s: the 422 has no %s finding", c.file, c.code)
		}

		body, ctype := multipartBody(t, "plan", c.file, data)
		up := post(t, srv, "/open", ctype, body)
		if c.apiStatus == http.StatusBadRequest {
			if up.StatusCode != http.StatusBadRequest {
				t.Errorf("%s: upload %d, want 400", c.file, up.StatusCode)
			}
			continue
		}
		// A plan whose link would be over the query limit opens as a page
		// at once; any other redirects to a link the app reads (issue 13).
		if up.StatusCode == http.StatusUnprocessableEntity && strings.Contains(up.body, "is shown here without a link") {
			if strings.Contains(up.body, "<script>alert") || strings.Contains(up.body, "<img src=x") {
				t.Errorf("%s: markup from a name reached the page unescaped", c.file)
			}
			continue
		}
		if up.StatusCode != http.StatusSeeOther {
			t.Errorf("%s: upload %d, want 303; %.300s", c.file, up.StatusCode, up.body)
			continue
		}
		loc := up.Header.Get("Location")
		if _, q, _ := strings.Cut(loc, "?"); len(q) > MaxQuery {
			t.Errorf("%s: upload redirects to a query of %d bytes, over MaxQuery", c.file, len(q))
		}
		for _, path := range []string{loc, strings.Replace(loc, "/?", "/fragment?", 1), strings.Replace(loc, "/?", "/figure.svg?", 1),
			strings.Replace(loc, "/?", "/plan.yaml?", 1), strings.Replace(loc, "/?", "/symbols.csv?", 1)} {
			page := get(t, srv, path)
			if page.StatusCode >= 500 {
				t.Errorf("%s: GET %.60s… %d", c.file, path, page.StatusCode)
			}
			if strings.HasPrefix(page.Header.Get("Content-Type"), "text/html") &&
				(strings.Contains(page.body, "<script>alert") || strings.Contains(page.body, "<img src=x")) {
				t.Errorf("%s: markup from a name reached the page unescaped", c.file)
			}
		}
	}
}
