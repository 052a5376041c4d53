package web

import (
	"fmt"
	"net/http"
	"slices"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
	"gridloom/web/planform"
)

// The comparison: each handler reads both plans of the query into a
// planform.Compare, builds the view from it and renders compare.templ.

// compare serves two plans side by side. An empty query compares the
// startup plan with its copy; an op from a page without script is applied
// and redirects to the edited comparison, as the planner does.
func (s *server) compare(w http.ResponseWriter, r *http.Request) error {
	if r.URL.RawQuery == "" {
		f := planform.FormOf(s.cfg.Plan)
		http.Redirect(w, r, "/compare?"+planform.CompareQuery(f, planform.CopyOf(f), planform.FigureForm{}), http.StatusSeeOther)
		return nil
	}
	c, opErr := planform.ReadCompare(r.URL.RawQuery)
	if opErr == nil && c.Focus != "" {
		http.Redirect(w, r, "/compare?"+c.Query()+"#"+c.Focus, http.StatusSeeOther)
		return nil
	}
	v, styles := s.compareOf(r, c)
	// The notes of a file just opened on a side, beside that side's file
	// control; the page's own links (its query) drop them.
	q := r.URL.Query()
	for i, side := range planform.Sides {
		v.Sides[i].OpenNotes = append(v.Sides[i].OpenNotes, openNotes(q[side+"."+keyOpenNote])...)
	}
	return writeHTML(w, r, v.Status, comparePage(v), styles)
}

// compareFragment serves the comparison's workspace alone, for the page
// script; like the planner's fragment it answers 200 and carries the
// page's own status in data-status.
func (s *server) compareFragment(w http.ResponseWriter, r *http.Request) error {
	c, _ := planform.ReadCompare(r.URL.RawQuery)
	v, styles := s.compareOf(r, c)
	v.Focus = c.Focus
	return writeHTML(w, r, http.StatusOK, compareWork(v), styles)
}

// compareOf draws both figures on their shared scales and builds the
// comparison's view, with the CSP sources the inline figures need.
func (s *server) compareOf(r *http.Request, c planform.Compare) (compareView, []string) {
	var figs [2]drawn
	var styles []string
	cross := crossLinkOf(c) // computed once: both figures mark it, the view lists it
	for i, side := range planform.Sides {
		opt := c.SideOptions(i)
		opt.Caption, opt.IDPrefix = "", side+"-" // the page names each side
		opt.CrossLink = render.CrossLinkMarks{Link: cross.x, SideB: i == 1}
		svg, st, failed := s.inlineFigure(r, c.Sides[i].Result, opt)
		figs[i] = drawn{SVG: svg, Failed: failed}
		styles = append(styles, st...)
	}
	slices.Sort(styles)
	return buildCompare(c, cross, figs), slices.Compact(styles)
}

// compareOpen reads an uploaded plan file (field "plan", as /open takes
// it) into one side of the comparison (side=a or b; the rest of the query
// is the comparison it came from) and redirects to the comparison with it,
// the other side kept as it was. On failure it shows that comparison with
// the reason beside the side's file control, which the page script then
// brings into view.
func (s *server) compareOpen(w http.ResponseWriter, r *http.Request) error {
	q := r.URL.Query()
	side := q.Get("side")
	i := slices.Index(planform.Sides[:], side)
	if i < 0 {
		return refusal("The form does not say which side to open the file on:", planform.Messages{"side": fmt.Sprintf("%q is not a side of the comparison; use a or b.", planform.ShortText(side))})
	}
	q.Del("side")
	raw := q.Encode()
	if len(q) == 0 {
		f := planform.FormOf(s.cfg.Plan)
		raw = planform.CompareQuery(f, planform.CopyOf(f), planform.FigureForm{})
	}
	c, _ := planform.ReadCompare(raw)
	plan, notes, status, reasons := readUpload(r)
	if status == http.StatusOK {
		opened := c
		opened.Sides[i].Form = planform.FormOf(plan)
		if query := opened.Query(); len(query) <= MaxQuery {
			// What reading the file skipped or assumed rides on the
			// redirect, as the planner's Open does, keyed by the side, in
			// what room the link has left (the last note, saying how many
			// more there were, may take 200 bytes beyond it).
			room := min(maxOpenNotesQuery, MaxQuery-len(query)-1-200)
			if room > 0 {
				query = planform.JoinQuery(query, notesQuery(side+"."+keyOpenNote, notes, room))
			}
			http.Redirect(w, r, "/compare?"+query, http.StatusSeeOther)
			return nil
		}
		status = http.StatusRequestURITooLong
		reasons = []string{fmt.Sprintf("%s is too large to compare: the comparison's link would be over %d bytes (32 KiB); open it in the planner, or trim it.", uploadName(r), MaxQuery)}
	}
	v, styles := s.compareOf(r, c)
	for _, m := range reasons {
		v.Sides[i].OpenNotes = append(v.Sides[i].OpenNotes, note{Severity: string(grid.Error), Text: m})
	}
	v.Focus = "f-" + side + "-file"
	return writeHTML(w, r, status, comparePage(v), styles)
}

// compareFigure serves one side's figure (side=a or b) on the scales it
// shares with the other, as SVG with its plan inside or as PNG, for a
// document that sets the two side by side.
func (s *server) compareFigure(format string) handlerFunc {
	return func(w http.ResponseWriter, r *http.Request) error {
		side := r.URL.Query().Get("side")
		i := slices.Index(planform.Sides[:], side)
		if i < 0 {
			return refusal("The link does not say which figure to draw:", planform.Messages{"side": fmt.Sprintf("%q is not a side of the comparison; use a or b.", planform.ShortText(side))})
		}
		c, _ := planform.ReadCompare(r.URL.RawQuery)
		st := c.Sides[i]
		if len(st.InputErr) > 0 || len(st.Fig.Msgs) > 0 {
			msgs := planform.Messages{}
			for k, m := range st.InputErr {
				msgs[side+"."+k] = m
			}
			for k, m := range st.Fig.Msgs {
				msgs[k] = m
			}
			return refusal("The link has values that do not parse:", msgs)
		}
		opt := c.SideOptions(i)
		draw, ctype, ext := s.cfg.Figure, "image/svg+xml", ".svg"
		if format == "png" {
			draw, ctype, ext = s.cfg.PNG, "image/png", ".png"
		} else {
			plan, err := planfile.EncodeJSON(st.Plan)
			if err != nil {
				return internal("figure", err)
			}
			opt.Plan = plan
		}
		out, err := drawFigure(draw, st.Result, opt)
		if err != nil {
			return figureFailed(err)
		}
		if format != "png" {
			w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(out))))
		}
		if r.URL.Query().Get("download") == "1" {
			attach(w, st.Plan.Name, "-"+side+ext)
		}
		send(w, r, http.StatusOK, ctype, out)
		return nil
	}
}
