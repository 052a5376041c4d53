package web

import (
	"bytes"
	"encoding/csv"
	"encoding/xml"
	"errors"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"net/url"
	"reflect"
	"slices"
	"strings"
	"testing"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// The fuzz targets of the web app. Each runs its seeds (the demo plans'
// queries, here, and testdata/fuzz/<target>) as a plain test; to fuzz:
//
//	go test ./web -run '^$' -fuzz '^FuzzParseQuery$' -fuzztime 60s
//
// A query is fuzzed as the raw text after "?", so the fuzzer reaches what
// a hand-edited or crafted link can hold: bad %-escapes, semicolons,
// repeated keys, partition indexes of any spelling, values of any bytes.

// addDemoSeeds adds the query of every demo plan, and of each with an op.
func addDemoSeeds(f *testing.F) {
	for _, p := range demoPlans(f) {
		q := planform.FormOf(p).Query()
		f.Add(q)
		f.Add(q + "&op=add")
	}
}

// FuzzParseQuery: reading any query never panics; the query written back
// for what was read reads back to the same form and the same query; and a
// form whose values all parse describes a plan that FormOf writes as a
// form reading back to that plan, as FormOf promises.
func FuzzParseQuery(f *testing.F) {
	addDemoSeeds(f)
	f.Fuzz(func(t *testing.T, raw string) {
		v, _ := url.ParseQuery(raw)
		form, _ := planform.ParseQuery(v)
		q := form.Query()
		v2, err := url.ParseQuery(q)
		if err != nil {
			t.Fatalf("Query() of the form of %q is %q, which does not parse: %v", raw, q, err)
		}
		form2, msgs2 := planform.ParseQuery(v2)
		if len(msgs2) > 0 {
			t.Errorf("the query Query() wrote, %q, has messages %v", q, msgs2)
		}
		if !reflect.DeepEqual(form2, form) {
			t.Errorf("query %q reads back as a different form:\ngot  %+v\nwant %+v", q, form2, form)
		}
		if q2 := form2.Query(); q2 != q {
			t.Errorf("Query() is not stable:\nfirst  %q\nsecond %q", q, q2)
		}

		plan, msgs := form.Plan()
		if len(msgs) > 0 {
			return
		}
		back, msgs := planform.FormOf(plan).Plan()
		if len(msgs) > 0 {
			t.Fatalf("planform.FormOf(plan of %q) has messages %v", raw, msgs)
		}
		if !reflect.DeepEqual(back, plan) {
			t.Errorf("plan of %q does not survive FormOf:\ngot  %+v\nwant %+v", raw, back, plan)
		}
		if a, b := planform.FormOf(back).Query(), planform.FormOf(plan).Query(); a != b {
			t.Errorf("FormOf is not stable:\nfirst  %q\nsecond %q", b, a)
		}
	})
}

// fuzzHandler is the whole app with the real figure and the demo plans.
func fuzzHandler(f *testing.F) http.Handler {
	return NewServer(slog.New(slog.NewTextHandler(io.Discard, nil)), testConfig(f))
}

// serveQuery sends GET path?raw straight to h. The query is set as it
// stands, since a request line can carry bytes a URL parser refuses.
func serveQuery(h http.Handler, path, raw string) *httptest.ResponseRecorder {
	req := httptest.NewRequest(http.MethodGet, path, nil)
	req.URL.RawQuery = raw
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	return w
}

// FuzzPage: the page and its fragment answer every query with one of
// their statuses, never a 5xx, and with HTML whenever they show the plan.
func FuzzPage(f *testing.F) {
	addDemoSeeds(f)
	h := fuzzHandler(f)
	f.Fuzz(func(t *testing.T, raw string) {
		for _, c := range []struct {
			path string
			want []int
		}{
			{"/", []int{http.StatusOK, http.StatusSeeOther, http.StatusUnprocessableEntity, http.StatusRequestURITooLong}},
			{"/fragment", []int{http.StatusOK, http.StatusRequestURITooLong}},
		} {
			w := serveQuery(h, c.path, raw)
			if !slices.Contains(c.want, w.Code) {
				t.Fatalf("GET %s?%q: status %d, want one of %v; body %.300s", c.path, raw, w.Code, c.want, w.Body)
			}
			if w.Code == http.StatusOK || w.Code == http.StatusUnprocessableEntity {
				if ct := w.Header().Get("Content-Type"); ct != "text/html; charset=utf-8" {
					t.Errorf("GET %s?%q: Content-Type %q", c.path, raw, ct)
				}
				if !strings.Contains(w.Body.String(), `id="gl-form"`) {
					t.Errorf("GET %s?%q: %d without the form", c.path, raw, w.Code)
				}
			}
		}
	})
}

// FuzzFigure: the figure of any query is a well-formed SVG document with
// the renderer's own elements, colours and classes only (see checkSVG), or
// a 422 saying which values do not parse; never a 5xx.
func FuzzFigure(f *testing.F) {
	addDemoSeeds(f)
	h := fuzzHandler(f)
	f.Fuzz(func(t *testing.T, raw string) {
		w := serveQuery(h, "/figure.svg", raw)
		switch w.Code {
		case http.StatusOK:
			if p := svgProblems(w.Body.Bytes()); len(p) > 0 {
				t.Fatalf("GET /figure.svg?%q: %v", raw, p)
			}
		case http.StatusUnprocessableEntity, http.StatusRequestURITooLong:
		default:
			t.Fatalf("GET /figure.svg?%q: status %d; body %.300s", raw, w.Code, w.Body)
		}
	})
}

// wellFormedSVG reads doc with encoding/xml in strict mode, which refuses
// malformed markup and characters XML does not allow, and checks that its
// root is an svg element.
func wellFormedSVG(doc []byte) error {
	d := xml.NewDecoder(bytes.NewReader(doc))
	root := ""
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return err
		}
		if se, ok := tok.(xml.StartElement); ok && root == "" {
			root = se.Name.Local
		}
	}
	if root != "svg" {
		return errors.New("the root element is <" + root + ">, want <svg>")
	}
	return nil
}

// FuzzDownloads: the plan files of any query open again in gridloom, the
// symbol table is CSV with its header, and nothing is a 5xx.
func FuzzDownloads(f *testing.F) {
	addDemoSeeds(f)
	h := fuzzHandler(f)
	f.Fuzz(func(t *testing.T, raw string) {
		for _, c := range []struct {
			path  string
			check func([]byte) error
		}{
			{"/plan.json", func(b []byte) error { _, err := planfile.DecodeJSON(b); return err }},
			{"/plan.yaml", func(b []byte) error { _, err := planfile.DecodeYAML(b); return err }},
			{"/symbols.csv", func(b []byte) error {
				rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
				if err == nil && (len(rows) == 0 || rows[0][0] != "partition") {
					err = errors.New("no header row")
				}
				return err
			}},
		} {
			w := serveQuery(h, c.path, raw)
			switch w.Code {
			case http.StatusOK:
				if err := c.check(w.Body.Bytes()); err != nil {
					t.Fatalf("GET %s?%q: the download does not read back: %v\n%.600s", c.path, raw, err, w.Body)
				}
			case http.StatusUnprocessableEntity, http.StatusRequestURITooLong:
			default:
				t.Fatalf("GET %s?%q: status %d; body %.300s", c.path, raw, w.Code, w.Body)
			}
		}
	})
}
