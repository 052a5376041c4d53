package web

import (
	"net/http"
	"net/url"
	"strings"
	"testing"

	"gridloom/web/planform"
)

// TestNewPlanRoute: GET /new sends the browser to the page of the empty
// carrier (planform.NewPlan) by a 303, and that page opens with its one
// partition and no error.
func TestNewPlanRoute(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/new")
	wantStatus(t, r, http.StatusSeeOther)
	loc := r.Header.Get("Location")
	if want := "/?" + planform.FormOf(planform.NewPlan()).Query(); loc != want {
		t.Fatalf("Location %q, want %q", loc, want)
	}
	u, err := url.Parse(loc)
	if err != nil {
		t.Fatal(err)
	}
	page := get(t, srv, "/?"+u.RawQuery)
	wantStatus(t, page, http.StatusOK)
	if name := planform.NewPlan().Partitions[0].Name; !strings.Contains(page.body, name) {
		t.Errorf("the new plan's page does not show its partition %q", name)
	}
	if strings.Contains(page.body, `class="gl-finding gl-error`) {
		t.Error("the new plan's page shows an error")
	}
}
