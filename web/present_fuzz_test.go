package web

import (
	"gridloom/web/planform"
	"net/http"
	"slices"
	"strings"
	"testing"
)

// Fuzz targets of the walkthrough and the comparison; see fuzz_test.go
// for how to run them.

// FuzzWalk: the walkthrough answers every query with one of its statuses,
// never a 5xx, and with a page that has at least one step.
func FuzzWalk(f *testing.F) {
	addDemoSeeds(f)
	for _, p := range demoPlans(f) {
		q := planform.FormOf(p).Query()
		f.Add(q + "&step=3&view=projector")
		f.Add(q + "&step=tdd&view=print&fig.theme=print&fig.layers=none")
		f.Add(q + "&step=99&view=x&fig.width=1")
	}
	h := fuzzHandler(f)
	f.Fuzz(func(t *testing.T, raw string) {
		w := serveQuery(h, "/walk", raw)
		switch w.Code {
		case http.StatusOK, http.StatusUnprocessableEntity:
			if !strings.Contains(w.Body.String(), `id="gl-walk"`) || !strings.Contains(w.Body.String(), `id="step-`) {
				t.Fatalf("GET /walk?%q: %d without a step", raw, w.Code)
			}
		case http.StatusSeeOther, http.StatusRequestURITooLong:
		default:
			t.Fatalf("GET /walk?%q: status %d; body %.300s", raw, w.Code, w.Body)
		}
	})
}

// FuzzCompare: the comparison, its fragment and its figures answer every
// query with one of their statuses, never a 5xx; the figures are the
// renderer's own SVG.
func FuzzCompare(f *testing.F) {
	for _, p := range demoPlans(f) {
		a := planform.FormOf(p)
		q := planform.CompareQuery(a, planform.CopyOf(a), planform.FigureForm{})
		f.Add(q)
		f.Add("side=b&" + q + "&b.op=add&fig.theme=print")
		f.Add("side=a&" + strings.ReplaceAll(q, "b.", "a.") + "&a.p0.scs=x")
	}
	h := fuzzHandler(f)
	f.Fuzz(func(t *testing.T, raw string) {
		for _, c := range []struct {
			path string
			want []int
		}{
			{"/compare", []int{http.StatusOK, http.StatusSeeOther, http.StatusUnprocessableEntity, http.StatusRequestURITooLong}},
			{"/compare/fragment", []int{http.StatusOK, http.StatusRequestURITooLong}},
			{"/compare/figure.svg", []int{http.StatusOK, http.StatusUnprocessableEntity, http.StatusRequestURITooLong}},
		} {
			w := serveQuery(h, c.path, raw)
			if !slices.Contains(c.want, w.Code) {
				t.Fatalf("GET %s?%q: status %d, want one of %v; body %.300s", c.path, raw, w.Code, c.want, w.Body)
			}
			if c.path == "/compare/figure.svg" && w.Code == http.StatusOK {
				if p := svgProblems(w.Body.Bytes()); len(p) > 0 {
					t.Fatalf("GET %s?%q: %v", c.path, raw, p)
				}
			}
		}
	})
}
