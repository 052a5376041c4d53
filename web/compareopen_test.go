package web

import (
	"net/http"
	"strings"
	"testing"

	"gridloom/grid/planfile"
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
