package web

import (
	"fmt"
	"net/http"
	"slices"

	"gridloom/web/planform"
)

// walk serves the walkthrough of the query's plan: one step at a time
// (step=), as a page or in a projector's large type, or every step one per
// printed page (view=print). The server marks the highlight, so the steps
// work as plain links; the page script adds the keys and moves between
// steps without reloading. An empty query opens the startup plan.
func (s *server) walk(w http.ResponseWriter, r *http.Request) error {
	if r.URL.RawQuery == "" {
		http.Redirect(w, r, "/walk?"+planform.FormOf(s.cfg.Plan).Query(), http.StatusSeeOther)
		return nil
	}
	st := planform.ReadPlan(r.URL.RawQuery)
	v := buildWalk(st, r.URL.Query())
	var styles []string
	draw := func(prefix string) string {
		svg, css, failed := s.inlineFigure(r, st.Result, walkFigureOptions(st, prefix, v.View))
		if failed != "" {
			v.FigureErr = failed
		}
		styles = append(styles, css...)
		return svg
	}
	if v.View == viewPrint {
		for i := range v.Steps {
			v.Steps[i].Figure = draw(fmt.Sprintf("s%d-", i+1))
		}
	} else {
		v.Figure = draw("")
	}
	slices.Sort(styles)
	return writeHTML(w, r, v.Status, walkPage(v), slices.Compact(styles))
}
