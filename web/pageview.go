package web

import (
	"net/url"
	"strings"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The planner's view: what the page and its live fragment show, built from
// a planform.State. Templates (page.templ) take these, never the request.

// editorMark separates a fragment's results from the forms after them; the
// page script (EDITOR_MARK in static/app.js) shows the results as soon as
// it has read them and brings the forms up to date a frame later.
const editorMark = "<!--gl-editor-->"

// partMark comes before each part of the results (the status bar, the
// figure, each table...), one element each: the page script (PART_MARK in
// static/app.js) compares each part's text with the one it shows and
// parses only the parts that changed.
const partMark = "<!--gl-part-->"

// pageView is everything the page and its live fragment show.
type pageView struct {
	Title  string // the document title
	Query  string // the canonical query of the form as shown
	Focus  string // id of the control to focus after an edit, or ""
	Status int    // the HTTP status of the page of this plan: 200 or 422
	// Unparsed is set while a value does not parse: the plan drawn lacks
	// it, so the page script keeps the last figure it showed (issue 19).
	Unparsed bool
	Form     formView
	Results  resultsView
	Upload   uploadView
	Demos    []demoLink
}

type demoLink struct{ Href, Label string }

type uploadView struct {
	From  string // the query to come back to
	Notes []note
}

// buildPage makes the page view of a state. fig is the figure drawn for
// the page.
func buildPage(s planform.State, fig drawn, demos []demoLink) pageView {
	q := s.Query()
	notes := notesOf(s)
	v := pageView{
		Title:    pageTitle(s.Form.Name),
		Query:    q,
		Status:   statusOf(s.Invalid()),
		Unparsed: len(s.InputErr) > 0,
		Demos:    demos,
		Upload: uploadView{
			From:  q,
			Notes: notes[planform.IDFile],
		},
	}
	v.Form = buildForm(s, notes)
	box := buildFigureBox(s.Fig, s.Plan.Name)
	v.Form.Figure = &box
	v.Form.Shape += ";" + box.shape()
	v.Results = buildResults(s, q, fig)
	v.Results.Cell = cellOf(s, q)
	return v
}

// statusOf is the HTTP status of a page: 422 for a plan or a link with a
// problem, which the page shows.
func statusOf(invalid bool) int {
	if invalid {
		return 422
	}
	return 200
}

func pageTitle(name string) string {
	if strings.TrimSpace(name) == "" {
		return "gridloom"
	}
	return name + " · gridloom"
}

func demoLinks(demos []Demo) []demoLink {
	out := make([]demoLink, len(demos))
	for i, d := range demos {
		label := d.Plan.Name
		if label == "" {
			label = d.Name
		}
		out[i] = demoLink{Href: "/demo/" + url.PathEscape(d.Name), Label: label}
	}
	return out
}

// notesOf collects the messages per control id: values that did not parse
// first, then the findings. A finding on a field whose value did not parse
// is left out, since it would judge a value the user did not give.
func notesOf(s planform.State) map[string][]note {
	out := map[string][]note{}
	for _, field := range sortedKeys(s.InputErr) {
		id := planform.ControlID(field)
		out[id] = append(out[id], note{Severity: string(grid.Error), Text: s.InputErr[field]})
	}
	for _, f := range s.Result.Findings {
		if _, bad := s.InputErr[f.Field]; bad {
			continue
		}
		id := planform.ControlID(f.Field)
		out[id] = append(out[id], note{Severity: string(f.Severity), Text: planform.NamePaths(f.Message, s.Plan.Partitions)})
	}
	return out
}
