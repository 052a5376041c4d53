package web

import (
	"net/http"
	"net/url"
	"strings"
	"testing"

	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
	"gridloom/web/planform"
)

// TestCompareOpen: a plan file posted to /compare/open for side b replaces
// B and keeps A (and the figure options); for side a, the other way round;
// a file it cannot open answers the comparison with the reason beside that
// side's file control; a side that is neither a nor b is refused.
func TestCompareOpen(t *testing.T) {
	cfg := testConfig(t)
	srv, _ := newTestServer(t, cfg)
	campus, port := planform.FormOf(cfg.Plan), cfg.Demos[1].Plan
	yamlPlan, err := planfile.EncodeYAML(port)
	if err != nil {
		t.Fatal(err)
	}
	from := planform.CompareQuery(campus, planform.CopyOf(campus), planform.FigureForm{})
	body, ctype := multipartBody(t, "plan", "port.yaml", yamlPlan)
	r := post(t, srv, "/compare/open?side=b&"+from, ctype, body)
	wantStatus(t, r, http.StatusSeeOther)
	if loc, want := r.Header.Get("Location"), "/compare?"+planform.CompareQuery(campus, planform.FormOf(port), planform.FigureForm{}); loc != want {
		t.Errorf("B opened: Location %q\nwant %q", loc, want)
	}
	r = post(t, srv, "/compare/open?side=a&"+from, ctype, body)
	wantStatus(t, r, http.StatusSeeOther)
	if loc, want := r.Header.Get("Location"), "/compare?"+planform.CompareQuery(planform.FormOf(port), planform.CopyOf(campus), planform.FigureForm{}); loc != want {
		t.Errorf("A opened: Location %q\nwant %q", loc, want)
	}

	body, ctype = multipartBody(t, "plan", "broken.yaml", []byte("carrier: [\n"))
	r = post(t, srv, "/compare/open?side=b&"+from, ctype, body)
	wantStatus(t, r, http.StatusBadRequest)
	notes := r.body[strings.Index(r.body, `id="n-f-b-file"`):]
	notes = notes[:strings.Index(notes, "</div>")]
	if !strings.Contains(notes, "broken.yaml is not a plan gridloom can open") {
		t.Errorf("B's notes after a broken file: %s", notes)
	}
	if !strings.Contains(r.body, `data-focus="f-b-file"`) {
		t.Error("the answer does not bring B's file control into view")
	}

	r = post(t, srv, "/compare/open?side=c&"+from, ctype, body)
	wantStatus(t, r, http.StatusUnprocessableEntity) // as /compare/figure.svg refuses a side
}

// TestCompareOpenValueNotation: value notation opened on a compare side
// (its Open button, POST /compare/open) keeps what reading it skipped or
// assumed, as the planner's Open does: the notes ride on the redirect as
// b.open.note keys and show beside B's file control, not A's; the page's
// own query drops them, since they concern the file, not the plan.
func TestCompareOpenValueNotation(t *testing.T) {
	cfg := testConfig(t)
	srv, _ := newTestServer(t, cfg)
	p := initialCampus(t)
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	campus := planform.FormOf(cfg.Plan)
	from := planform.CompareQuery(campus, planform.CopyOf(campus), planform.FigureForm{})
	body, ctype := multipartBody(t, "plan", "cell.asn", append(text, skippedIE...))
	r := post(t, srv, "/compare/open?side=b&"+from, ctype, body)
	wantStatus(t, r, http.StatusSeeOther)
	loc, err := url.Parse(r.Header.Get("Location"))
	if err != nil {
		t.Fatal(err)
	}
	notes := loc.Query()["b."+keyOpenNote]
	if len(notes) == 0 || !strings.Contains(notes[0], "Skipped") || !strings.Contains(notes[0], "other-cell") {
		t.Fatalf("the notes on the redirect %q do not name the skipped value", notes)
	}
	if a := loc.Query()["a."+keyOpenNote]; len(a) != 0 {
		t.Errorf("A, not opened, has notes %q", a)
	}
	page := get(t, srv, loc.String())
	wantStatus(t, page, http.StatusOK)
	wantContains(t, "note beside B's file control", noteText(t, page.body, "f-b-file"), "Skipped", "other-cell")
	if a := noteText(t, page.body, "f-a-file"); strings.Contains(a, "other-cell") {
		t.Errorf("A's file control shows B's notes: %s", a)
	}
	if strings.Contains(between(page.body, `data-query="`, `"`), "open.note") {
		t.Error("the comparison's query carries the notes")
	}
	// The plan opened is the file's, on B, with A kept.
	c, _ := planform.ReadCompare(loc.RawQuery)
	if got, want := c.Sides[1].Form.Query(), planform.FormOf(p).Query(); got != want {
		t.Errorf("B differs from the file's plan:\n got %s\nwant %s", got, want)
	}
	if got, want := c.Sides[0].Form.Query(), campus.Query(); got != want {
		t.Errorf("A changed:\n got %s\nwant %s", got, want)
	}
}
