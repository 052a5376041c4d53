package web

import (
	"bytes"
	"compress/gzip"
	"context"
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"errors"
	"fmt"
	"html"
	"io"
	"log/slog"
	"mime"
	"net"
	"net/http"
	"net/http/httptest"
	"net/url"
	"os"
	"regexp"
	"runtime"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/render"
	"gridloom/web/planform"
)

// Tests of the app under bad input and abuse: bounded queries, refusals
// that keep what the user typed, and names that reach every output only as
// text.

func TestQueryLimit(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	// Keys the form does not know are ignored, so padding keeps the plan.
	pad := func(n int) string { return q + "&pad=" + strings.Repeat("x", n-len(q)-len("&pad=")) }

	over := pad(MaxQuery + 1)
	for _, path := range []string{"/", "/fragment", "/figure.svg", "/plan.json", "/symbols.csv", "/static/app.js"} {
		r := get(t, srv, path+"?"+over)
		wantStatus(t, r, http.StatusRequestURITooLong)
		wantContains(t, path+" 414", r.body, fmt.Sprint(MaxQuery+1), "32 KiB", "plan file")
	}
	r := post(t, srv, "/api/v1/render?"+over, "application/json", []byte(`{}`))
	wantStatus(t, r, http.StatusRequestURITooLong)
	var e apiError
	if err := json.Unmarshal([]byte(r.body), &e); err != nil || !strings.Contains(e.Error, "32 KiB") {
		t.Errorf("API 414 body %q: want a JSON error naming the limit", r.body)
	}

	// At the limit the plan is read as usual.
	r = get(t, srv, "/?"+pad(MaxQuery))
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "page at the limit", r.body, `value="Hillcrest campus 40 MHz"`)
}

// TestLargestPlanFitsTheLink: a plan with the most partitions the engine
// places and every value at its longest writes a query well under
// MaxQuery, as MaxQuery's doc comment says.
func TestLargestPlanFitsTheLink(t *testing.T) {
	n := func(x int) *int { return &x }
	fl := func(x float64) *float64 { return &x }
	long := func(i int) string { // 64 four-byte characters, unique per i
		return fmt.Sprintf("%02d", i) + strings.Repeat("𝄞", grid.MaxNameLen-2)
	}
	p := grid.Plan{
		Name: long(99), SpanMs: grid.MaxSpanMs, NumerologyGapKHz: fl(123.456),
		Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 100, CenterMHz: fl(3750.123456), ARFCN: n(650000),
			OffsetToCarrier: map[int]int{15: 2199, 30: 2199, 60: 2199}, CarrierBandwidth: map[int]int{15: 275, 30: 275, 60: 275}},
		TDD: &grid.TDDPlan{ReferenceSCSKHz: 30,
			Pattern1: grid.TDDPattern{PeriodMs: 0.625, DownlinkSlots: 10, DownlinkSymbols: 13, UplinkSlots: 10, UplinkSymbols: 13},
			Pattern2: &grid.TDDPattern{PeriodMs: 0.625, DownlinkSlots: 10, DownlinkSymbols: 13, UplinkSlots: 10, UplinkSymbols: 13}},
		SSB:         &grid.SSBPlan{SCSKHz: 30, Case: "C", Bitmap: strings.Repeat("10", 32), OffsetToPointA: 2199, KSSB: 23, ScsCommonKHz: 120, PeriodMs: 160},
		Environment: &grid.EnvironmentPlan{DelaySpreadNs: 1234.5678, DelayProfile: "very-long", SpeedKmh: 999.999, CarrierMHz: 3750.123456},
	}
	for i := range grid.MaxPartitions {
		p.Partitions = append(p.Partitions, grid.PartitionPlan{Name: long(i), SCSKHz: 60, CP: "extended", StartCRB: n(2473),
			SizePRB: 275, LocationAndBandwidth: n(37949), Direction: "DL", Layers: 8, Modulation: "1024QAM"})
	}
	q := planform.FormOf(p).Query()
	t.Logf("the longest plan within the limits writes a %d-byte query; the limit is %d", len(q), MaxQuery)
	if len(q) > MaxQuery/2 {
		t.Errorf("a plan within the limits writes a %d-byte query, more than half of MaxQuery (%d)", len(q), MaxQuery)
	}
}

// TestUnreadableQuery: a pair the query parser skips gets a message, and
// the rest of the plan stays.
func TestUnreadableQuery(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	for _, c := range []struct{ what, query, want string }{
		{"a bad escape", strings.Replace(q, "name=Hillcrest+campus+40+MHz", "name=100%zz", 1), `invalid URL escape &#34;%zz&#34;`},
		{"a semicolon", q + "&a;b=c", "semicolon"},
	} {
		r := get(t, srv, "/?"+c.query)
		wantStatus(t, r, http.StatusUnprocessableEntity)
		wantContains(t, c.what+": the form's general notes", noteText(t, r.body, "gl-form"), "Part of the link could not be read", c.want)
		if got := inputValue(t, r.body, "f-p2-name"); got != "control" {
			t.Errorf("%s: the third partition's name is %q; the rest of the plan should stay", c.what, got)
		}
		d := get(t, srv, "/plan.json?"+c.query)
		wantStatus(t, d, http.StatusUnprocessableEntity)
		wantContains(t, c.what+": plan.json", d.body, "query: Part of the link could not be read")
	}
}

// TestPageRefusalsKeepInput: values the plan cannot take are refused with
// 422 and a message naming the field and what it allows, and the page
// shows them again as typed, escaped.
func TestPageRefusalsKeepInput(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	// edit sets one field of the campus form as a user would type it.
	edit := func(key, val string) string {
		f := formOf(t, q)
		sf := fieldPtr(&f, key)
		if sf == nil {
			t.Fatalf("no field %s", key)
		}
		*sf = val
		return f.Query()
	}
	longName := strings.Repeat("<b>", 21) + `"&` // 65 characters
	many := q
	for i := 3; i <= 64; i++ {
		many += fmt.Sprintf("&p%d.name=x%d&p%d.scs=15&p%d.size=1", i, i, i, i)
	}
	cases := []struct {
		what, query, id string
		value           string   // the control's value as the page writes it
		note            []string // in the message beside the control
	}{
		{"an over-long name", edit("name", longName), "f-name", html.EscapeString(longName), []string{"65 characters", "at most 64"}},
		{"NaN", edit("fc", "NaN"), "f-fc", "NaN", []string{"&#34;NaN&#34; is not a number", "MHz"}},
		{"an infinite size", edit("p1.size", "1e999"), "f-p1-size", "1e999", []string{"not a whole number", "1 to 275"}},
		{"a size beyond int64", edit("p1.size", "99999999999999999999999"), "f-p1-size", "99999999999999999999999", []string{"far outside", "1 to 275"}},
		{"a start far below zero", edit("p0.start", "-99999999999"), "f-p0-start", "-99999999999", []string{"far outside", "0 to 2473"}},
		{"markup in a number", edit("p0.layers", `"><script>alert(1)</script>`), "f-p0-layers", "", []string{html.EscapeString(`"\"><script>alert(1)</script>" is not a whole number`)}},
	}
	for _, c := range cases {
		r := get(t, srv, "/?"+c.query)
		wantStatus(t, r, http.StatusUnprocessableEntity)
		if c.value != "" {
			if got := inputValue(t, r.body, c.id); got != c.value {
				t.Errorf("%s: %s shows %q, want %q", c.what, c.id, got, c.value)
			}
		}
		wantContains(t, c.what+": the note beside "+c.id, noteText(t, r.body, c.id), c.note...)
		checkMarkup(t, c.what, r.body, 2)
	}

	// A span of 99 ms: the select keeps it, marked, beside the limit.
	r := get(t, srv, "/?"+edit("span", "99"))
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "span 99", r.body, `<option value="99" selected>99 (not allowed)</option>`)
	wantContains(t, "span 99: the note beside the span", noteText(t, r.body, "f-span"), "spanMs is 99", "1 to 10")

	// A bandwidth beyond int64 in the bandwidth select.
	r = get(t, srv, "/?"+edit("bw", "99999999999999999999999"))
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "huge bandwidth", r.body, `<option value="99999999999999999999999" selected>`)
	wantContains(t, "huge bandwidth: the note", noteText(t, r.body, "f-bw"), "far outside")

	// 65 partitions: p64 is beyond the indexes a link may use; the other 64
	// are shown.
	r = get(t, srv, "/?"+many)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "65 partitions: the note on the partitions", noteText(t, r.body, "g-parts"), "p64", "p0 to p63")
	if got := inputValue(t, r.body, "f-p63-name"); got != "x63" {
		t.Errorf("65 partitions: p63 shows %q, want x63", got)
	}
	if strings.Contains(r.body, `id="f-p64-name"`) {
		t.Error("65 partitions: p64 has a control")
	}
}

// fieldPtr returns the Form field of a query key, plan-level or partition.
func fieldPtr(f *planform.Form, key string) *string { return f.Value(key) }

// startTag is one start tag of a page, with its attributes decoded.
type startTag struct {
	name  string
	attrs map[string]string
}

// startTags lists the start tags of an HTML document as a browser's
// tokenizer finds them: a tag opens at "<" and a letter, and its attribute
// values are quoted or end at white space. Text and attribute values that
// the page escaped hold no "<" and no quote of their own, so markup smuggled
// in through them shows up here as tags and attributes of its own.
func startTags(body string) []startTag {
	var out []startTag
	isSpace := func(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' }
	for i := 0; i < len(body); i++ {
		if body[i] != '<' || i+1 >= len(body) || !isLetter(body[i+1]) {
			continue
		}
		j := i + 1
		for j < len(body) && !isSpace(body[j]) && body[j] != '>' && body[j] != '/' {
			j++
		}
		tag := startTag{name: strings.ToLower(body[i+1 : j]), attrs: map[string]string{}}
		for j < len(body) && body[j] != '>' {
			if isSpace(body[j]) || body[j] == '/' {
				j++
				continue
			}
			k := j
			for k < len(body) && !isSpace(body[k]) && body[k] != '=' && body[k] != '>' && body[k] != '/' {
				k++
			}
			name := strings.ToLower(body[j:k])
			val := ""
			if k < len(body) && body[k] == '=' {
				k++
				if k < len(body) && (body[k] == '"' || body[k] == '\'') {
					q := body[k]
					e := strings.IndexByte(body[k+1:], q)
					if e < 0 {
						e = len(body) - k - 1
					}
					val = body[k+1 : k+1+e]
					k += e + 2
				} else {
					e := k
					for e < len(body) && !isSpace(body[e]) && body[e] != '>' {
						e++
					}
					val, k = body[k:e], e
				}
			}
			tag.attrs[name] = html.UnescapeString(val)
			j = k
		}
		out = append(out, tag)
		i = j
	}
	return out
}

func isLetter(c byte) bool { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') }

// checkMarkup fails when a page or fragment has markup that the app does
// not write itself: a script beyond its own, an img beyond its logo, a
// second svg, an iframe, object or embed, an event handler attribute, a
// link or source that leaves the app, or a CDATA end outside a CDATA
// section.
func checkMarkup(t *testing.T, what, body string, scripts int) {
	t.Helper()
	for _, p := range markupProblems(body, scripts) {
		t.Errorf("%s: %s", what, p)
	}
}

// markupProblems lists what checkMarkup finds wrong with body.
func markupProblems(body string, scripts int) []string {
	var out []string
	bad := func(format string, args ...any) { out = append(out, fmt.Sprintf(format, args...)) }
	count := map[string]int{}
	for _, tag := range startTags(body) {
		count[tag.name]++
		switch tag.name {
		case "script":
			if tag.attrs["src"] != "/static/app.js" && (tag.attrs["id"] != "gl-lattice" || tag.attrs["type"] != "application/json") {
				bad("a script element that is not the app's: %v", tag.attrs)
			}
		case "img":
			if tag.attrs["src"] != "/static/icon.svg" {
				bad("an img that is not the logo: %v", tag.attrs)
			}
		case "iframe", "object", "embed", "base", "frame", "frameset", "applet":
			bad("a %s element", tag.name)
		}
		for name, v := range tag.attrs {
			switch {
			case strings.HasPrefix(name, "on"):
				bad("<%s %s=%q>", tag.name, name, v)
			case name == "href" || name == "src" || name == "action" || name == "formaction":
				if !strings.HasPrefix(v, "/") && !strings.HasPrefix(v, "#") || strings.HasPrefix(v, "//") {
					bad("<%s %s=%q> leaves the app", tag.name, name, v)
				}
			}
		}
	}
	if count["script"] != scripts {
		bad("%d script elements, want %d", count["script"], scripts)
	}
	if count["svg"] != 1 {
		bad("%d svg elements, want the figure only", count["svg"])
	}
	if strings.Count(body, "]]>") != strings.Count(body, "<![CDATA[") {
		bad("a CDATA end outside a CDATA section")
	}
	// The lattice data is JSON that cannot end its script element.
	const open = `<script id="gl-lattice" type="application/json">`
	if i := strings.Index(body, open); i >= 0 {
		data := body[i+len(open):]
		data = data[:strings.Index(data, "</script>")]
		if strings.ContainsAny(data, "<>") {
			bad("the lattice data holds < or >: %.200s", data)
		}
	}
	return out
}

// The hostile names of the escaping tests: markup, attribute breakers,
// CDATA ends, entities, control characters. Each is at most 64 characters.
const (
	evilPlan = `<script>alert(1)</script>`
	evilImg  = `<img src=x onerror=alert(1)>`
	evilAttr = `"><svg onload=alert(1)>`
	evilMix  = "]]><!-- & 'q' \a\x01 &amp; </title>"
)

// evilTexts are the parts of the hostile names that every figure shows as
// text: the renderer may replace control characters.
var evilTexts = []string{evilPlan, evilImg, evilAttr, "]]><!-- & 'q'"}

// hostilePlan is the campus plan with hostile names.
func hostilePlan(t *testing.T) grid.Plan {
	t.Helper()
	p := testConfig(t).Plan
	p.Name = evilPlan
	p.Partitions = append([]grid.PartitionPlan(nil), p.Partitions...)
	for i, name := range []string{evilImg, evilAttr, evilMix} {
		p.Partitions[i].Name = name
	}
	if res := grid.Compute(p); res.HasErrors() {
		t.Fatalf("the hostile plan has errors: %v", res.Findings)
	}
	return p
}

func TestNamesAreTextInThePage(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	p := hostilePlan(t)
	q := planform.FormOf(p).Query()
	for _, c := range []struct {
		path    string
		scripts int
	}{{"/", 2}, {"/fragment", 1}} {
		r := get(t, srv, c.path+"?"+q)
		wantStatus(t, r, http.StatusOK)
		checkMarkup(t, c.path, r.body, c.scripts)
		if got := inputValue(t, r.body, "f-name"); html.UnescapeString(got) != evilPlan {
			t.Errorf("%s: the plan name shows as %q", c.path, got)
		}
		for i, part := range p.Partitions {
			if got := inputValue(t, r.body, planform.PartControlID(i, "name")); got != html.EscapeString(part.Name) {
				t.Errorf("%s: partition %d's name is written %q, want %q", c.path, i, got, html.EscapeString(part.Name))
			}
		}
		if c.path == "/" {
			wantContains(t, "page title", r.body, "<title>"+html.EscapeString(evilPlan)+" · gridloom</title>")
		}
		// The lattice data gives the names back exactly.
		const open = `<script id="gl-lattice" type="application/json">`
		data := r.body[strings.Index(r.body, open)+len(open):]
		var lat latticeData
		if err := json.Unmarshal([]byte(data[:strings.Index(data, "</script>")]), &lat); err != nil {
			t.Fatalf("%s: lattice data: %v", c.path, err)
		}
		for _, lp := range lat.Parts {
			if lp.Name != p.Partitions[lp.Plan].Name {
				t.Errorf("%s: lattice name %q, want %q", c.path, lp.Name, p.Partitions[lp.Plan].Name)
			}
		}
		// The inline figure is well-formed and has the names only as text.
		svg := r.body[strings.Index(r.body, "<svg") : strings.LastIndex(r.body, "</svg>")+len("</svg>")]
		checkSVG(t, c.path+" inline figure", []byte(svg), evilTexts...)
	}
}

func TestNamesAreTextInTheDownloads(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	p := hostilePlan(t)
	q := planform.FormOf(p).Query()

	for _, path := range []string{"/figure.svg?" + q, "/figure.svg?" + q + "&download=1"} {
		r := get(t, srv, path)
		wantStatus(t, r, http.StatusOK)
		checkSVG(t, "GET /figure.svg", []byte(r.body), evilTexts...)
	}
	body, _ := planfile.EncodeJSON(p)
	r := post(t, srv, "/api/v1/figure", "application/json", body)
	wantStatus(t, r, http.StatusOK)
	checkSVG(t, "POST /api/v1/figure", []byte(r.body), evilTexts...)

	for _, c := range []struct {
		path   string
		decode func([]byte) (grid.Plan, error)
	}{{"/plan.json", planfile.DecodeJSON}, {"/plan.yaml", planfile.DecodeYAML}} {
		r := get(t, srv, c.path+"?"+q)
		wantStatus(t, r, http.StatusOK)
		got, err := c.decode([]byte(r.body))
		if err != nil {
			t.Fatalf("%s: %v", c.path, err)
		}
		if got.Name != p.Name {
			t.Errorf("%s: plan name %q, want %q", c.path, got.Name, p.Name)
		}
		for i := range p.Partitions {
			if got.Partitions[i].Name != p.Partitions[i].Name {
				t.Errorf("%s: partition %d name %q, want %q", c.path, i, got.Partitions[i].Name, p.Partitions[i].Name)
			}
		}
	}
	r = post(t, srv, "/api/v1/render", "application/json", body)
	wantStatus(t, r, http.StatusOK)
	var doc report.Document
	if err := json.Unmarshal([]byte(r.body), &doc); err != nil || doc.Plan.Name != evilPlan {
		t.Errorf("API document: %v, plan name %q", err, doc.Plan.Name)
	}
	for _, part := range doc.Partitions {
		if !strings.Contains(evilImg+evilAttr+evilMix, part.Name) {
			t.Errorf("API document: partition name %q is none of the plan's", part.Name)
		}
	}

	r = get(t, srv, "/symbols.csv?"+q)
	wantStatus(t, r, http.StatusOK)
	rows, err := csv.NewReader(strings.NewReader(r.body)).ReadAll()
	if err != nil {
		t.Fatalf("symbols.csv: %v", err)
	}
	seen := map[string]bool{}
	for _, row := range rows[1:] {
		seen[row[0]] = true
	}
	for _, part := range p.Partitions {
		if !seen[part.Name] {
			t.Errorf("symbols.csv: no rows for %q; partitions seen %v", part.Name, seen)
		}
	}
}

// TestCSVFormulasNeutralised: a name a spreadsheet would read as a formula
// starts its cell with an apostrophe.
func TestCSVFormulasNeutralised(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	names := []string{`=HYPERLINK("http://x","y")`, "+1+1", "-2+3", "@SUM(A1)", "\t=1", "\r=1", "plain"}
	var b strings.Builder
	b.WriteString("bw=40")
	for i, n := range names {
		fmt.Fprintf(&b, "&p%d.name=%s&p%d.scs=15&p%d.start=%d&p%d.size=10", i, url.QueryEscape(n), i, i, i*20, i)
	}
	r := get(t, srv, "/symbols.csv?"+b.String())
	wantStatus(t, r, http.StatusOK)
	rows, err := csv.NewReader(strings.NewReader(r.body)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	cells := map[string]bool{}
	for _, row := range rows[1:] {
		cells[row[0]] = true
	}
	for _, n := range names {
		want := "'" + n
		if n == "plain" {
			want = n
		}
		if !cells[want] {
			t.Errorf("name %q: no cell %q; cells %v", n, want, cells)
		}
	}
	for c := range cells {
		if strings.ContainsAny(c[:1], "=+-@\t\r") {
			t.Errorf("cell %q starts a formula", c)
		}
	}
}

func TestDownloadFileNamesHostile(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	safe := regexp.MustCompile(`^[a-z0-9]+(-[a-z0-9]+)*\.(svg|json|yaml|csv)$`)
	for _, name := range []string{
		"../../etc/passwd", `..\..\windows\system32`, `a"b'c;d=e`, "line\r\nSet-Cookie: x=1",
		"Été ☃ 2026", "日本語の計画", "\u202egpj.exe", "", "CON", "nul", "Com1", "LPT9", ".", "-", "a/b\\c",
	} {
		v := mustQuery(t, q)
		v.Set("name", name)
		nq := v.Encode()
		for _, c := range []struct{ path, ext string }{
			{"/figure.svg?download=1&", ".svg"}, {"/plan.json?", ".json"}, {"/plan.yaml?", ".yaml"}, {"/symbols.csv?", ".csv"},
		} {
			r := get(t, srv, c.path+nq)
			if r.StatusCode != http.StatusOK && r.StatusCode != http.StatusUnprocessableEntity {
				t.Errorf("name %q, %s: status %d", name, c.path, r.StatusCode)
				continue
			}
			if r.StatusCode != http.StatusOK {
				continue // an over-long name is no download; the page says why
			}
			raw := r.Header.Get("Content-Disposition")
			disp, params, err := mime.ParseMediaType(raw)
			file := params["filename"]
			if err != nil || disp != "attachment" || !safe.MatchString(file) || !strings.HasSuffix(file, c.ext) || strings.ContainsAny(raw, "\r\n") {
				t.Errorf("name %q, %s: Content-Disposition %q (%v): want an attachment with a plain %s file name", name, c.path, raw, err, c.ext)
			}
			if base, _, _ := strings.Cut(file, "."); reservedFileName(base) {
				t.Errorf("name %q: file name %q is a device name on Windows", name, file)
			}
		}
	}
}

// reservedFileName reports whether Windows reserves base as a device name.
func reservedFileName(base string) bool {
	return regexp.MustCompile(`^(?i)(con|prn|aux|nul|com[0-9]|lpt[0-9])$`).MatchString(base)
}

// svgColour is every value a colour attribute of the figure may have: a
// colour written by the renderer, none, or a reference to its own pattern.
var (
	svgColour = regexp.MustCompile(`^(none|currentColor|#[0-9a-fA-F]{3,8}|url\(#[a-z0-9-]+\))$`)
	svgClass  = regexp.MustCompile(`^[a-z0-9 -]*$`)
	svgID     = regexp.MustCompile(`^[a-z0-9-]+$`)
)

// checkSVG fails unless doc is a well-formed SVG document whose elements
// and attributes are the renderer's own (no script or foreign content, no
// event handler, no link; colours, classes and ids only of the renderer's
// patterns) and whose text holds each of texts.
func checkSVG(t *testing.T, what string, doc []byte, texts ...string) {
	t.Helper()
	for _, p := range svgProblems(doc, texts...) {
		t.Errorf("%s: %s", what, p)
	}
}

// svgProblems lists what checkSVG finds wrong with doc, texts included.
func svgProblems(doc []byte, texts ...string) []string {
	var out []string
	bad := func(format string, args ...any) { out = append(out, fmt.Sprintf(format, args...)) }
	if err := wellFormedSVG(doc); err != nil {
		return []string{err.Error()}
	}
	var text strings.Builder
	d := xml.NewDecoder(bytes.NewReader(doc))
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return append(out, err.Error())
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			switch tok.Name.Local {
			case "script", "foreignObject", "iframe", "img", "image", "a", "use", "animate", "set", "handler", "object", "embed":
				bad("a <%s> element", tok.Name.Local)
			}
			for _, a := range tok.Attr {
				name, v := a.Name.Local, a.Value
				switch {
				case strings.HasPrefix(strings.ToLower(name), "on"), name == "href":
					bad("<%s %s=%q>", tok.Name.Local, name, v)
				case name == "fill" || name == "stroke" || name == "color" || name == "stop-color" || name == "flood-color":
					if !svgColour.MatchString(v) {
						bad("<%s %s=%q> is not a colour of the renderer", tok.Name.Local, name, v)
					}
				case name == "class" && !svgClass.MatchString(v), name == "id" && !svgID.MatchString(v):
					bad("<%s %s=%q>", tok.Name.Local, name, v)
				case name == "style" && strings.ContainsAny(v, "<>\"'"):
					bad("<%s style=%q>", tok.Name.Local, v)
				}
			}
		case xml.CharData:
			text.Write(tok)
		}
	}
	for _, want := range texts {
		if !strings.Contains(text.String(), want) {
			bad("the text does not hold %q", want)
		}
	}
	return out
}

// TestFigureLookIsNotUserSet: the web sets no theme, layer, colour or
// style of the figure, so query keys that sound like them change nothing.
func TestFigureLookIsNotUserSet(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	want := get(t, srv, "/figure.svg?"+q)
	wantStatus(t, want, http.StatusOK)
	extra := url.Values{
		"theme": {"print"}, "layers": {"none"}, "style": {"fill:red"}, "color": {"#f00"}, "fill": {"url(javascript:alert(1))"},
		"css": {"</style><script>alert(1)</script>"}, "width": {"99999"}, "caption": {"<b>x</b>"},
	}
	got := get(t, srv, "/figure.svg?"+q+"&"+extra.Encode())
	if got.body != want.body {
		t.Error("look keys in the query changed the figure")
	}
}

// TestCheckersSeeInjection: the markup and SVG checks above are not blind.
func TestCheckersSeeInjection(t *testing.T) {
	page := `<html><script src="/static/app.js"></script><input value="&lt;img src=x onerror=alert(1)&gt;" title='a "b"'><svg></svg>`
	if p := markupProblems(page, 1); len(p) > 0 {
		t.Errorf("a clean page: %v", p)
	}
	for _, inj := range []string{
		`<img src=x onerror=alert(1)>`, `"><svg onload=alert(1)>`, `<script>alert(1)</script>`, `<a href="javascript:alert(1)">`,
		`<a href=//evil.example>`, `<iframe src="/x">`, `<div ONCLICK='x'>`, `]]>`,
	} {
		if p := markupProblems(strings.Replace(page, "<svg>", inj+"<svg>", 1), 1); len(p) == 0 {
			t.Errorf("markupProblems sees nothing wrong with %q", inj)
		}
	}
	svg := `<svg xmlns="http://www.w3.org/2000/svg"><title>&lt;b&gt;</title><path fill="#fff" class="gl-x"/></svg>`
	if p := svgProblems([]byte(svg), "<b>"); len(p) > 0 {
		t.Errorf("a clean figure: %v", p)
	}
	for _, inj := range []string{
		`<script>alert(1)</script>`, `<g onload="alert(1)"/>`, `<path fill="red;x:expression(1)"/>`, `<path fill="url(javascript:x)"/>`,
		`<a href="x"/>`, `<foreignObject/>`, `<path class="a&quot;b"/>`, `<text>` + "\x01" + `</text>`, `<g>`,
	} {
		if p := svgProblems([]byte(strings.Replace(svg, "</svg>", inj+"</svg>", 1)), "<b>"); len(p) == 0 {
			t.Errorf("svgProblems sees nothing wrong with %q", inj)
		}
	}
	if p := svgProblems([]byte(svg), "missing"); len(p) == 0 {
		t.Error("svgProblems does not miss a text")
	}
}

// TestClientGoneIsNoServerError: a client that leaves before its page is
// built is no server error: nothing is sent, nothing logged as an error,
// and the access log says 499.
func TestClientGoneIsNoServerError(t *testing.T) {
	logs := &logBuffer{}
	h := NewServer(slog.New(slog.NewTextHandler(logs, nil)), testConfig(t))
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	q := campusQuery(t)
	for _, path := range []string{"/?" + q, "/fragment?" + q} {
		w := httptest.NewRecorder()
		h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, path, nil).WithContext(ctx))
		if w.Body.Len() > 0 {
			t.Errorf("GET %.20s… for a client gone: %d, %d bytes; want nothing sent", path, w.Code, w.Body.Len())
		}
	}
	if s := logs.String(); strings.Contains(s, "level=ERROR") || strings.Count(s, "status=499") != 2 {
		t.Errorf("log:\n%s\nwant no error and two requests with status 499", s)
	}
}

// Issue 13: the server bounded under load and against hostile pages.

// largestPlan is the plan with the most symbols the engine accepts (16
// partitions at 960 kHz over 10 ms, 143 360 symbols), and its link.
func largestPlan(t *testing.T) (grid.Plan, string) {
	t.Helper()
	data, err := os.ReadFile("../testdata/stress/fr2-2-16-partitions.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	return p, planform.FormOf(p).Query()
}

func gunzip(t *testing.T, b []byte) []byte {
	t.Helper()
	zr, err := gzip.NewReader(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	out, err := io.ReadAll(zr)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// The symbol table and the lattice document of the largest plan are
// streamed (no Content-Length, since they are not held whole), plain and
// gzip, and are the bytes that render.SymbolCSV and report.Write give.
func TestExportsAreStreamed(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	plan, q := largestPlan(t)
	res := grid.Compute(plan)
	var wantCSV, wantJSON bytes.Buffer
	if err := render.SymbolCSV(&wantCSV, res); err != nil {
		t.Fatal(err)
	}
	if err := report.Write(&wantJSON, res, true); err != nil {
		t.Fatal(err)
	}
	body, _ := planfile.EncodeJSON(plan)
	for _, gz := range []bool{false, true} {
		req, _ := http.NewRequest(http.MethodGet, srv.URL+"/symbols.csv?"+q, nil)
		req2, _ := http.NewRequest(http.MethodPost, srv.URL+"/api/v1/render", bytes.NewReader(body))
		req2.Header.Set("Content-Type", "application/json")
		for _, c := range []struct {
			req  *http.Request
			want []byte
		}{{req, wantCSV.Bytes()}, {req2, wantJSON.Bytes()}} {
			if gz {
				c.req.Header.Set("Accept-Encoding", "gzip")
			} else {
				c.req.Header.Set("Accept-Encoding", "identity")
			}
			r := do(t, c.req)
			wantStatus(t, r, http.StatusOK)
			got := []byte(r.body)
			if gz {
				if r.Header.Get("Content-Encoding") != "gzip" {
					t.Fatalf("%s with gzip: Content-Encoding %q", c.req.URL.Path, r.Header.Get("Content-Encoding"))
				}
				got = gunzip(t, got)
			}
			if r.ContentLength != -1 {
				t.Errorf("%s: Content-Length %d; a streamed answer has none", c.req.URL.Path, r.ContentLength)
			}
			if !bytes.Equal(got, c.want) {
				t.Errorf("%s (gzip %v): %d bytes differ from the %d of the direct writer", c.req.URL.Path, gz, len(got), len(c.want))
			}
		}
	}
	t.Logf("CSV %d bytes, JSON %d bytes", wantCSV.Len(), wantJSON.Len())
}

// A streamed export stops when its client leaves: the writer the symbol
// table is written to fails from the next write on.
func TestExportStopsWhenClientLeaves(t *testing.T) {
	var rows atomic.Int64
	ctx, cancel := context.WithCancel(context.Background())
	cfg := testConfig(t)
	cfg.SymbolCSV = func(w io.Writer, r grid.Result) error {
		line := bytes.Repeat([]byte("x"), 1023)
		line = append(line, '\n')
		for i := range 100000 { // 100 MB if nothing stopped it
			if i == 200 {
				cancel() // the client leaves after 200 KB
			}
			if _, err := w.Write(line); err != nil {
				return err
			}
			rows.Add(1)
		}
		return nil
	}
	h := NewServer(slog.New(slog.DiscardHandler), cfg)
	w := httptest.NewRecorder()
	h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, "/symbols.csv?"+campusQuery(t), nil).WithContext(ctx))
	if n := rows.Load(); n > 200 {
		t.Errorf("%d rows written after the client left at row 200; want the next write to fail", n-200)
	}
}

// blockingFigure is a figure drawer that waits until released, to hold
// the heavy slots.
type blockingFigure struct {
	calls   atomic.Int64
	started chan struct{}
	release chan struct{}
}

func (b *blockingFigure) draw(w io.Writer, r grid.Result, opt render.Options) error {
	b.calls.Add(1)
	b.started <- struct{}{}
	<-b.release
	_, err := w.Write([]byte("\x89PNG\r\n\x1a\n"))
	return err
}

// Heavy work waits for one of a bounded number of slots; when none frees up
// in time the answer is 503 with Retry-After and a sentence, while the
// light routes answer as usual. Once a slot frees, heavy work goes on.
func TestHeavyWorkIsAdmitted(t *testing.T) {
	fig := &blockingFigure{started: make(chan struct{}, 4), release: make(chan struct{})}
	cfg := testConfig(t)
	cfg.PNG = fig.draw
	cfg.HeavySlots = 1
	cfg.HeavyWait = 20 * time.Millisecond
	srv, logs := newTestServer(t, cfg)
	q := campusQuery(t)
	var wg sync.WaitGroup
	wg.Add(1)
	var first response
	go func() {
		defer wg.Done()
		req, _ := http.NewRequest(http.MethodGet, srv.URL+"/figure.png?"+q, nil)
		res, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Error(err)
			return
		}
		b, _ := io.ReadAll(res.Body)
		res.Body.Close()
		first = response{res, string(b)}
	}()
	<-fig.started // the one slot is taken
	body, _ := planfile.EncodeJSON(cfg.Plan)
	for _, r := range []response{
		get(t, srv, "/figure.png?"+q+"&fig.width=1000"),
		get(t, srv, "/symbols.csv?"+q),
		get(t, srv, "/compare?a."+strings.ReplaceAll(q, "&", "&a.")),
		get(t, srv, "/walk?"+q+"&view=print"),
		post(t, srv, "/api/v1/render", "application/json", body),
	} {
		wantStatus(t, r, http.StatusServiceUnavailable)
		if r.Header.Get("Retry-After") != "1" {
			t.Errorf("%s: Retry-After %q, want 1", r.Request.URL.Path, r.Header.Get("Retry-After"))
		}
		wantContains(t, r.Request.URL.Path+" 503", r.body, "gridloom is busy", "at most 1 heavy answers", "Try again in 1 second.")
	}
	for _, path := range []string{"/?" + q, "/fragment?" + q, "/figure.svg?" + q, "/plan.json?" + q, "/walk?" + q, "/static/app.js"} {
		wantStatus(t, get(t, srv, path), http.StatusOK)
	}
	close(fig.release)
	wg.Wait()
	if first.StatusCode != http.StatusOK {
		t.Errorf("the request holding the slot: %d", first.StatusCode)
	}
	wantStatus(t, get(t, srv, "/symbols.csv?"+q), http.StatusOK)
	if strings.Contains(logs.String(), "level=ERROR") {
		t.Errorf("a 503 of admission logged as an error:\n%s", logs)
	}
}

// The heavy slots leave one processor to the light routes, and there is
// always one (measured: DEVELOPERS.md, "Bounded under load").
func TestHeavySlotsLeaveAProcessor(t *testing.T) {
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(0))
	for procs, want := range map[int]int{1: 1, 2: 1, 4: 3, 16: 15} {
		runtime.GOMAXPROCS(procs)
		if got := defaultHeavySlots(); got != want {
			t.Errorf("GOMAXPROCS %d: %d heavy slots, want %d", procs, got, want)
		}
	}
}

// HEAD answers with the headers and builds no body: the figure is not
// drawn nor the symbol table written.
func TestHeadBuildsNoBody(t *testing.T) {
	var drawn, written atomic.Int64
	cfg := testConfig(t)
	cfg.PNG = func(w io.Writer, r grid.Result, opt render.Options) error { drawn.Add(1); return nil }
	cfg.Figure = cfg.PNG
	cfg.SymbolCSV = func(w io.Writer, r grid.Result) error { written.Add(1); return nil }
	srv, _ := newTestServer(t, cfg)
	q := campusQuery(t)
	for path, ctype := range map[string]string{
		"/figure.png?" + q:                 "image/png",
		"/figure.svg?" + q + "&download=1": "image/svg+xml",
		"/symbols.csv?" + q:                "text/csv; charset=utf-8",
	} {
		req, _ := http.NewRequest(http.MethodHead, srv.URL+path, nil)
		r := do(t, req)
		wantStatus(t, r, http.StatusOK)
		if got := r.Header.Get("Content-Type"); got != ctype {
			t.Errorf("HEAD %.20s…: Content-Type %q, want %q", path, got, ctype)
		}
	}
	if drawn.Load() != 0 || written.Load() != 0 {
		t.Errorf("HEAD drew %d figures and wrote %d symbol tables; want none", drawn.Load(), written.Load())
	}
	// A HEAD leaves nothing in the cache: the GET after it draws.
	wantStatus(t, get(t, srv, "/figure.png?"+q), http.StatusOK)
	if drawn.Load() != 1 {
		t.Errorf("GET after HEAD drew %d figures, want 1", drawn.Load())
	}
}

// newStandInPNGServer is a test server whose PNG figures are a few
// stand-in bytes, counted as they are drawn.
func newStandInPNGServer(t *testing.T) (*httptest.Server, *atomic.Int64) {
	t.Helper()
	pngs := new(atomic.Int64)
	cfg := testConfig(t)
	cfg.PNG = func(w io.Writer, r grid.Result, opt render.Options) error {
		pngs.Add(1)
		_, err := w.Write([]byte("\x89PNG\r\n\x1a\nstand-in"))
		return err
	}
	srv, _ := newTestServer(t, cfg)
	return srv, pngs
}

// PNG figures are kept like SVG figures, each under its own route: the
// second request of a query is not drawn again, and the SVG of the same
// query is not answered with the PNG.
func TestPNGFiguresAreCached(t *testing.T) {
	srv, pngs := newStandInPNGServer(t)
	q := campusQuery(t)
	a, b := get(t, srv, "/figure.png?"+q), get(t, srv, "/figure.png?"+q)
	if pngs.Load() != 1 || a.body != b.body || b.Header.Get("Content-Type") != "image/png" {
		t.Errorf("two requests drew %d PNGs (want 1); second Content-Type %q", pngs.Load(), b.Header.Get("Content-Type"))
	}
	svg := get(t, srv, "/figure.svg?"+q)
	if svg.Header.Get("Content-Type") != "image/svg+xml" || !strings.Contains(svg.body, "<svg") {
		t.Errorf("the SVG of a query whose PNG is cached: %q, %.40q", svg.Header.Get("Content-Type"), svg.body)
	}
}

// Another site's page cannot have the app draw for it: a cross-site or
// same-site load that is not a navigation (an <img>, a fetch) is refused
// before any work, while a link opened from anywhere, the app's own loads
// and clients that are not browsers are answered. Fetch Metadata (W3C
// Working Draft), the Sec-Fetch-Site and Sec-Fetch-Mode values.
func TestCrossSiteLoadsRefused(t *testing.T) {
	srv, pngs := newStandInPNGServer(t)
	q := campusQuery(t)
	for _, c := range []struct {
		site, mode, dest string
		want             int
	}{
		{"cross-site", "no-cors", "image", http.StatusForbidden}, // <img> on another site
		{"cross-site", "cors", "empty", http.StatusForbidden},    // fetch() from another site
		{"same-site", "no-cors", "image", http.StatusForbidden},  // another port of the same host name
		{"cross-site", "navigate", "document", http.StatusOK},    // a shared link followed
		{"same-origin", "no-cors", "image", http.StatusOK},       // the app's own page
		{"none", "navigate", "document", http.StatusOK},          // typed in the address bar
		{"", "", "", http.StatusOK},                              // curl, scripts
	} {
		for _, path := range []string{"/figure.png?" + q + "&fig.width=4800", "/symbols.csv?" + q, "/?" + q, "/static/app.css"} {
			for _, method := range []string{http.MethodGet, http.MethodHead} {
				req, _ := http.NewRequest(method, srv.URL+path, nil)
				for k, v := range map[string]string{"Sec-Fetch-Site": c.site, "Sec-Fetch-Mode": c.mode, "Sec-Fetch-Dest": c.dest} {
					if v != "" {
						req.Header.Set(k, v)
					}
				}
				r := do(t, req)
				if r.StatusCode != c.want {
					t.Errorf("%s %.14s… Sec-Fetch-Site %q, Mode %q: %d, want %d", method, path, c.site, c.mode, r.StatusCode, c.want)
				}
				if c.want == http.StatusForbidden && method == http.MethodGet {
					wantContains(t, c.site+" "+path, r.body, "was asked for by another site's page")
				}
			}
		}
	}
	if pngs.Load() != 1 {
		t.Errorf("the PNG was drawn %d times, want once (the refused loads draw nothing)", pngs.Load())
	}
}

// A kept figure carries an ETag; a browser that names it in If-None-Match
// (as it does when it reloads an image it holds) gets 304 and no body, in
// either encoding; another tag gets the figure. RFC 9110 sections 8.8.3
// and 13.1.2 (weak comparison, "*").
func TestFiguresRevalidate(t *testing.T) {
	srv, pngs := newStandInPNGServer(t)
	q := campusQuery(t)
	for _, path := range []string{"/figure.png?" + q, "/figure.svg?" + q} {
		first := get(t, srv, path)
		wantStatus(t, first, http.StatusOK)
		tag := first.Header.Get("Etag")
		if !regexp.MustCompile(`^"[0-9a-f]{16}"$`).MatchString(tag) || first.Header.Get("Cache-Control") != "no-cache" {
			t.Fatalf("%.12s…: Etag %q, Cache-Control %q; want a quoted hash and no-cache", path, tag, first.Header.Get("Cache-Control"))
		}
		for _, c := range []struct {
			match, encoding string
			want            int
		}{
			{tag, "", http.StatusNotModified},
			{tag, "gzip", http.StatusNotModified},
			{`"other", W/` + tag, "gzip", http.StatusNotModified},
			{"*", "", http.StatusNotModified},
			{`"0123456789abcdef"`, "", http.StatusOK},
			{strings.Trim(tag, `"`), "", http.StatusOK}, // unquoted: not the tag
		} {
			req, _ := http.NewRequest(http.MethodGet, srv.URL+path, nil)
			req.Header.Set("If-None-Match", c.match)
			req.Header.Set("Accept-Encoding", c.encoding)
			r := do(t, req)
			if r.StatusCode != c.want {
				t.Errorf("%.12s… If-None-Match %s, Accept-Encoding %q: status %d, want %d", path, c.match, c.encoding, r.StatusCode, c.want)
			}
			if c.want == http.StatusNotModified && (r.body != "" || r.Header.Get("Etag") != tag) {
				t.Errorf("%.12s… 304: body %d bytes, Etag %q; want none and %s", path, len(r.body), r.Header.Get("Etag"), tag)
			}
		}
	}
	if pngs.Load() != 1 {
		t.Errorf("the PNG was drawn %d times, want once: a revalidation is answered from the cache", pngs.Load())
	}
}

// The pacer books bytes on one shared line: an idle line lets paceBurst
// bytes leave at once, then each writer waits its bytes' time at the rate,
// in the order they asked, and idle time earns no more than the burst.
func TestPacerSharesTheRate(t *testing.T) {
	clock := time.Unix(1e9, 0)
	p := newPacer(1 << 20) // 1 MiB/s: paceBurst (1 MiB) is one second
	p.now = func() time.Time { return clock }
	for i, c := range []struct {
		advance time.Duration
		n       int
		want    time.Duration
	}{
		{0, paceBurst, 0},                                  // the burst leaves at once
		{0, 1 << 20, time.Second},                          // then 1 MiB waits 1 s
		{0, 512 << 10, 1500 * time.Millisecond},            // and the next writer behind it
		{time.Second, 64 << 10, 562500 * time.Microsecond}, // 1.5625 s booked, 1 s gone
		{time.Minute, paceBurst, 0},                        // idle: the burst again,
		{0, 64 << 10, 62500 * time.Microsecond},            // but no more (64 KiB at 1 MiB/s)
	} {
		clock = clock.Add(c.advance)
		if got := p.reserve(c.n); got != c.want {
			t.Errorf("step %d: %d bytes after %s wait %s, want %s", i, c.n, c.advance, got, c.want)
		}
	}
}

// A large kept answer is written whole through the pacer, and stops at
// its next chunk once the client has gone; a small one is never held.
func TestPacedWrite(t *testing.T) {
	body := bytes.Repeat([]byte("0123456789abcdef"), 3<<20/16) // 3 MiB
	var out bytes.Buffer
	if err := newPacer(1<<40).write(context.Background(), &out, body); err != nil || !bytes.Equal(out.Bytes(), body) {
		t.Errorf("paced write: %v, %d bytes of %d, equal %v", err, out.Len(), len(body), bytes.Equal(out.Bytes(), body))
	}
	gone, cancel := context.WithCancel(context.Background())
	cancel()
	clock := time.Unix(1e9, 0)
	p := newPacer(1 << 20)
	p.now = func() time.Time { return clock } // frozen: only the burst may leave
	out.Reset()
	err := p.write(gone, &out, body)
	// The burst is 16 chunks of 64 KiB; the 17th must wait 62.5 ms.
	if !errors.Is(err, context.Canceled) || out.Len() != paceBurst {
		t.Errorf("client gone: %v after %d bytes, want context.Canceled after %d", err, out.Len(), paceBurst)
	}
	out.Reset()
	small := body[:paceOver]
	if err := p.write(gone, &out, small); err != nil || out.Len() != len(small) {
		t.Errorf("an answer of paceOver bytes: %v after %d bytes; want it sent whole at once", err, out.Len())
	}
}

// Only the names of the app are answered: the listen address's host,
// localhost, IP addresses and the operator's names. A rebound name gets
// 421 with the security headers and a sentence naming the flag.
func TestHostCheck(t *testing.T) {
	cfg := testConfig(t)
	cfg.AllowHosts = []string{"planner.lan"}
	cfg.Addr = "gridbox:8080"
	h := NewServer(slog.New(slog.DiscardHandler), cfg)
	q := campusQuery(t)
	for host, want := range map[string]int{
		"127.0.0.1:8080": 200, "localhost:8080": 200, "LOCALHOST": 200, "[::1]:8080": 200, "app.localhost": 200,
		"192.168.1.20": 200, "planner.lan": 200, "Planner.LAN.:80": 200, "gridbox:8080": 200,
		"evil.example": 421, "evil.example:8080": 421, "localhost.evil.example": 421, "127.0.0.1.nip.io": 421, "planner.lan.evil": 421,
	} {
		for _, path := range []string{"/?" + q, "/api/v1/render"} {
			method := http.MethodGet
			if strings.HasPrefix(path, "/api") {
				method = http.MethodPost
			}
			req := httptest.NewRequest(method, path, strings.NewReader(`{}`))
			req.Header.Set("Content-Type", "application/json")
			req.Host = host
			w := httptest.NewRecorder()
			h.ServeHTTP(w, req)
			got := w.Code
			if got != 421 {
				got = 200 // any answer of the app itself
			}
			if got != want {
				t.Errorf("%s %s with Host %q: %d, want %d", method, path[:5], host, w.Code, want)
			}
			if w.Code == 421 {
				wantContains(t, "421", w.Body.String(), "does not answer to the host name", "-allow-host")
				if w.Header().Get("Content-Security-Policy") == "" || w.Header().Get("Cross-Origin-Resource-Policy") != "same-origin" {
					t.Errorf("the 421 lacks the security headers: %v", w.Header())
				}
			}
		}
	}
}

// A POST from another site's page is refused, by Sec-Fetch-Site or, when a
// browser sends no such header, by Origin; the app's own pages and programs
// that are not browsers pass.
func TestCrossSitePostsRefused(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	body, _ := planfile.EncodeJSON(testConfig(t).Plan)
	upload, ctype := multipartBody(t, "plan", "campus.json", body)
	for _, c := range []struct {
		name, site, origin string
		want               int
	}{
		{"cross-site", "cross-site", "https://evil.example", http.StatusForbidden},
		{"same-site", "same-site", "http://sub." + strings.TrimPrefix(srv.URL, "http://"), http.StatusForbidden},
		{"origin only", "", "https://evil.example", http.StatusForbidden},
		{"same-origin", "same-origin", srv.URL, 0},
		{"no browser", "", "", 0},
	} {
		for _, p := range []struct {
			path, ctype string
			body        []byte
		}{
			{"/api/v1/render", "application/json", body},
			{"/api/v1/figure", "application/json", body},
			{"/open", ctype, upload},
		} {
			req, _ := http.NewRequest(http.MethodPost, srv.URL+p.path, bytes.NewReader(p.body))
			req.Header.Set("Content-Type", p.ctype)
			if c.site != "" {
				req.Header.Set("Sec-Fetch-Site", c.site)
			}
			if c.origin != "" {
				req.Header.Set("Origin", c.origin)
			}
			r := do(t, req)
			if c.want == http.StatusForbidden {
				wantStatus(t, r, http.StatusForbidden)
				wantContains(t, c.name+" "+p.path, r.body, "came from another site's page")
			} else if r.StatusCode >= 400 {
				t.Errorf("%s POST %s: %d; want it answered", c.name, p.path, r.StatusCode)
			}
		}
	}
}

// The API takes plans as JSON or YAML only: the "simple" types a foreign
// page may post without asking get 415 and a sentence naming the types.
func TestAPIRequiresPlanType(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	body, _ := planfile.EncodeJSON(testConfig(t).Plan)
	yamlBody, _ := planfile.EncodeYAML(testConfig(t).Plan)
	for _, path := range []string{"/api/v1/render", "/api/v1/figure"} {
		for _, ct := range []string{"", "text/plain", "text/plain; charset=utf-8", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"} {
			r := post(t, srv, path, ct, body)
			wantStatus(t, r, http.StatusUnsupportedMediaType)
			wantContains(t, path+" "+ct, r.body, `"error"`, "application/json or application/yaml")
		}
		wantStatus(t, post(t, srv, path, "application/json; charset=utf-8", body), http.StatusOK)
		wantStatus(t, post(t, srv, path, "application/yaml", yamlBody), http.StatusOK)
		wantStatus(t, post(t, srv, path, "text/yaml", yamlBody), http.StatusOK)
	}
}

// An unknown method on an unknown path is a 404 of the path, not a 405
// that offers "use ." with an empty Allow.
func TestUnknownMethodOnUnknownPath(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	for _, c := range []struct {
		method, path string
		want         int
		allow        string
	}{
		{"FOO", "/nowhere", http.StatusNotFound, ""},
		{"FOO", "/api/v1/nowhere", http.StatusNotFound, ""},
		{"PROPFIND", "/x/y", http.StatusNotFound, ""},
		{"FOO", "/", http.StatusMethodNotAllowed, "GET, HEAD"},
		{"DELETE", "/api/v1/render", http.StatusMethodNotAllowed, "POST"},
	} {
		req, _ := http.NewRequest(c.method, srv.URL+c.path, nil)
		r := do(t, req)
		wantStatus(t, r, c.want)
		if r.Header.Get("Allow") != c.allow {
			t.Errorf("%s %s: Allow %q, want %q", c.method, c.path, r.Header.Get("Allow"), c.allow)
		}
		if strings.Contains(r.body, "use .") {
			t.Errorf("%s %s: %q", c.method, c.path, r.body)
		}
	}
}

// An upload whose link would be over the query limit (64 partitions; a
// name of 800 KB) opens as a page at once, with the reason, instead of
// redirecting to a link that answers 414 or 431.
func TestUploadOverLinkLimitOpensAsPage(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	var parts []string
	for i := range 64 {
		// 64 names of 62 four-byte characters and a number: 12 bytes of
		// link a character, about 48 KB of names.
		parts = append(parts, fmt.Sprintf(`{"name": "%s%02d", "scsKHz": 30, "sizePrb": 4}`, strings.Repeat("𝕏", 62), i))
	}
	many := []byte(`{"name": "sixty-four", "carrier": {"bandwidthMHz": 100}, "partitions": [` + strings.Join(parts, ",") + `]}`)
	longName := []byte(`{"name": "` + strings.Repeat("n", 800<<10) + `", "carrier": {"bandwidthMHz": 20}, "partitions": [{"name": "a", "scsKHz": 30, "sizePrb": 51}]}`)
	for name, plan := range map[string][]byte{"many.json": many, "long-name.json": longName} {
		body, ctype := multipartBody(t, "plan", name, plan)
		r := post(t, srv, "/open", ctype, body)
		if loc := r.Header.Get("Location"); loc != "" || r.StatusCode == http.StatusSeeOther {
			t.Errorf("%s: %d with a Location of %d bytes; want the page itself", name, r.StatusCode, len(loc))
			continue
		}
		wantStatus(t, r, http.StatusUnprocessableEntity)
		wantContains(t, name, r.body, name+" is shown here without a link", "gridloom reads at most 32768")
		if !strings.Contains(r.body, `data-testid="figure`) && !strings.Contains(r.body, "<form") {
			t.Errorf("%s: the answer is not the page", name)
		}
	}
	// Within the limits, the upload still redirects to its link.
	ok, _ := planfile.EncodeJSON(testConfig(t).Plan)
	body, ctype := multipartBody(t, "plan", "campus.json", ok)
	wantStatus(t, post(t, srv, "/open", ctype, body), http.StatusSeeOther)
}

// A client that leaves while its export is gathered is no server error:
// nothing is sent and the access log says 499, not 500.
func TestExportClientGoneIsNo500(t *testing.T) {
	logs := &logBuffer{}
	ctx, cancel := context.WithCancel(context.Background())
	cfg := testConfig(t)
	cfg.SymbolCSV = func(w io.Writer, r grid.Result) error {
		_, _ = w.Write([]byte("a,b\n"))
		cancel()
		_, err := w.Write([]byte("c,d\n"))
		return err
	}
	h := NewServer(slog.New(slog.NewTextHandler(logs, nil)), cfg)
	w := httptest.NewRecorder()
	h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, "/symbols.csv?"+campusQuery(t), nil).WithContext(ctx))
	if w.Body.Len() > 0 || strings.Contains(logs.String(), "level=ERROR") || !strings.Contains(logs.String(), "status=499") {
		t.Errorf("%d bytes sent; log:\n%s\nwant nothing sent, no error and status 499", w.Body.Len(), logs)
	}
}

// The answers net/http writes itself (a malformed request, headers over
// the limit) carry the security headers through SecureListener; the app's
// own answers pass through it unchanged.
func TestServerWrittenAnswersCarryHeaders(t *testing.T) {
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	srv := &http.Server{Handler: NewServer(slog.New(slog.DiscardHandler), testConfig(t)), MaxHeaderBytes: 4 << 10}
	go func() { _ = srv.Serve(SecureListener(ln)) }()
	t.Cleanup(func() { _ = srv.Close() })
	raw := func(req string) string {
		c, err := net.Dial("tcp", ln.Addr().String())
		if err != nil {
			t.Fatal(err)
		}
		defer c.Close()
		_ = c.SetDeadline(time.Now().Add(5 * time.Second))
		_, _ = io.WriteString(c, req)
		b, _ := io.ReadAll(c)
		return string(b)
	}
	for name, c := range map[string]struct{ req, status string }{
		"431":          {"GET / HTTP/1.1\r\nHost: localhost\r\nX-Big: " + strings.Repeat("a", 16<<10) + "\r\n\r\n", "HTTP/1.1 431 "},
		"bad line":     {"GET\r\n\r\n", "HTTP/1.1 400 "},
		"no host":      {"GET / HTTP/1.1\r\n\r\n", "HTTP/1.1 400 Bad Request: missing required Host header"},
		"app's answer": {"GET /static/app.css HTTP/1.1\r\nHost: localhost\r\nConnection: close\r\n\r\n", "HTTP/1.1 200 OK"},
	} {
		got := raw(c.req)
		head, body, _ := strings.Cut(got, "\r\n\r\n")
		if !strings.HasPrefix(head, c.status) {
			t.Errorf("%s: answer %.80q, want status %q", name, got, c.status)
			continue
		}
		for _, kv := range securityHeaderList {
			if strings.Count(head, "\r\n"+kv[0]+": "+kv[1]) != 1 {
				t.Errorf("%s: header %s not once in\n%s", name, kv[0], head)
			}
		}
		if name != "app's answer" && !strings.HasPrefix(body, strings.Fields(c.status)[1]) {
			t.Errorf("%s: body %q lost its text", name, body)
		}
	}
}
