package web

import (
	"fmt"
	"io"
	"net/http"
	"net/url"
	"slices"
	"strings"

	"github.com/go-chi/chi/v5"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
	"gridloom/web/planform"
)

// The planner: each handler reads the plan of the query into a
// planform.State, builds the page view from it and renders page.templ.

// planner serves the planner for the plan in the query. An empty query
// redirects to the startup plan, so the address always holds the plan; an
// op (a partition edit from a page without script) is applied and
// redirects to the edited plan, focused on the control it concerns.
func (s *server) planner(w http.ResponseWriter, r *http.Request) error {
	if r.URL.RawQuery == "" {
		http.Redirect(w, r, "/?"+planform.FormOf(s.cfg.Plan).Query(), http.StatusSeeOther)
		return nil
	}
	st, focus, opErr := planform.Read(r.URL.RawQuery)
	if opErr == nil && focus != "" {
		mib := planform.ParseMIBForm(r.URL.Query()).Query()
		http.Redirect(w, r, "/?"+planform.JoinQuery(st.Query(), mib)+"#"+focus, http.StatusSeeOther)
		return nil
	}
	v, styles := s.pageOf(r, st)
	v.Upload.Notes = append(v.Upload.Notes, openNotes(r.URL.Query()[keyOpenNote])...)
	return writeHTML(w, r, v.Status, page(v), styles)
}

// plannerFragment serves the workspace of the planner alone — figure,
// tables, findings, then editorMark and the form — for the page script to
// bring the page up to date with after an edit. It takes the same query as
// the page, op included. It answers 200 whenever it could build the
// workspace: the plan's own status (422 for a value that does not parse or
// an error finding) is in the workspace's data-status, since the request
// for a fragment did not fail.
func (s *server) plannerFragment(w http.ResponseWriter, r *http.Request) error {
	st, focus, _ := planform.Read(r.URL.RawQuery)
	v, styles := s.pageOf(r, st)
	v.Focus = focus
	return writeHTML(w, r, http.StatusOK, workFragment(v), styles)
}

// pageOf draws the figure and builds the page view of a state, with the
// CSP sources the inline figure needs, and the MIB panel for the query's
// mib.* keys (frame, block, cellBarred, intraFreqReselection), which the
// page's query then carries.
func (s *server) pageOf(r *http.Request, st planform.State) (pageView, []string) {
	svg, styles, failed := s.inlineFigure(r, st.Result, st.Fig.Opt)
	v := buildPage(st, drawn{SVG: svg, Failed: failed}, demoLinks(s.cfg.Demos))
	mf := planform.ParseMIBForm(r.URL.Query())
	if box, panel := buildMIB(st, mf); panel != nil {
		// Only a plan with SS/PBCH blocks has a MIB; the form's shape
		// says when the box comes or goes, so the page script brings it.
		v.Form.MIB, v.Results.MIB = &box, panel
		v.Form.Shape += ";mib"
	}
	v.Query = planform.JoinQuery(v.Query, mf.Query())
	return v, styles
}

// demo redirects to the page of a demo plan.
func (s *server) demo(w http.ResponseWriter, r *http.Request) error {
	name := chi.URLParam(r, "name")
	i := slices.IndexFunc(s.cfg.Demos, func(d Demo) bool { return d.Name == name })
	if i < 0 {
		return &problem{status: http.StatusNotFound, text: "There is no demo plan " + name + "."}
	}
	http.Redirect(w, r, "/?"+planform.FormOf(s.cfg.Demos[i].Plan).Query(), http.StatusSeeOther)
	return nil
}

// newPlan redirects to the page of planform.NewPlan, an empty carrier to
// start from.
func (s *server) newPlan(w http.ResponseWriter, r *http.Request) error {
	http.Redirect(w, r, "/?"+planform.FormOf(planform.NewPlan()).Query(), http.StatusSeeOther)
	return nil
}

// open reads an uploaded plan file (field "plan": JSON, YAML, TS 38.331
// value notation, or a figure saved by gridloom, whose metadata holds the
// plan) and redirects to its page, keeping the figure options of the page
// it came from. What reading value notation skipped or assumed rides on the
// redirect as open.note keys, which the page shows beside the file control
// (and which the page's own links drop: they concern the file, not the
// plan). On failure it shows that page (its query rides on the form's
// action) with the reason beside the file control: the answer is the page,
// not an error.
func (s *server) open(w http.ResponseWriter, r *http.Request) error {
	plan, notes, status, reasons := readUpload(r)
	if status != http.StatusOK {
		_, f, msgs := planform.ReadQuery(r.URL.RawQuery)
		if r.URL.RawQuery == "" {
			f = planform.FormOf(s.cfg.Plan)
		}
		v, styles := s.pageOf(r, planform.NewState(f, msgs))
		for _, m := range reasons {
			v.Upload.Notes = append(v.Upload.Notes, note{Severity: string(grid.Error), Text: m})
		}
		v.Focus = "f-file" // the page script brings the reason into view
		return writeHTML(w, r, status, page(v), styles)
	}
	ff := planform.ParseFigureForm(r.URL.Query())
	query := planform.JoinQuery(planform.FormOf(plan).Query(), ff.Query(), openNotesQuery(notes))
	if len(query) <= MaxQuery {
		http.Redirect(w, r, "/?"+query, http.StatusSeeOther)
		return nil
	}
	// A plan whose link the app would refuse (64 partitions, a name of
	// megabytes) is shown here, at once, rather than sent to a link that
	// answers 414 or a Location header over the server's limit.
	st := planform.NewState(planform.FormOf(plan), nil).WithFigure(ff)
	v, styles := s.pageOf(r, st)
	for _, n := range notes {
		v.Upload.Notes = append(v.Upload.Notes, note{Severity: string(grid.Info), Text: n})
	}
	v.Upload.Notes = append(v.Upload.Notes, note{Severity: string(grid.Error), Text: fmt.Sprintf(
		"%s is shown here without a link: its link would be %d bytes long and gridloom reads at most %d (32 KiB), so editing it on this page, downloading it and reloading need a smaller plan. Fix what the findings name in the file and open it again.",
		uploadName(r), len(query), MaxQuery)})
	return writeHTML(w, r, v.Status, page(v), styles)
}

// uploadName is the file name of an upload read by readUpload, for the
// notes about it.
func uploadName(r *http.Request) string {
	if r.MultipartForm != nil {
		if fs := r.MultipartForm.File["plan"]; len(fs) > 0 && fs[0].Filename != "" {
			return truncate(fs[0].Filename, 100)
		}
	}
	return "The plan"
}

// keyOpenNote is the query key of a note about the file just opened.
const keyOpenNote = "open.note"

// openNotes are the notes about a file just opened, as a query's
// keyOpenNote values carry them, shown beside the file control.
func openNotes(texts []string) []note {
	var notes []note
	for _, n := range texts {
		notes = append(notes, note{Severity: string(grid.Info), Text: n})
	}
	return notes
}

// maxOpenNote and maxOpenNotesQuery bound what the notes add to the
// address: a log of a whole cell can skip hundreds of fields, and the
// query, plan included (up to about 15 KiB), may hold at most MaxQuery
// (32 KiB).
const (
	maxOpenNote       = 1000
	maxOpenNotesQuery = 8 << 10
)

// openNotesQuery writes the notes of an opened file as open.note keys,
// each cut to maxOpenNote characters, as many as fit maxOpenNotesQuery;
// a last note says how many more gridloom check would show.
func openNotesQuery(notes []string) string {
	return notesQuery(keyOpenNote, notes, maxOpenNotesQuery)
}

// notesQuery writes notes as key keys, each cut to maxOpenNote characters,
// as many as fit budget bytes; a last note, of about 100 bytes beyond the
// budget, says how many more gridloom check would show.
func notesQuery(key string, notes []string, budget int) string {
	var parts []string
	size := 0
	for i, n := range notes {
		part := url.Values{key: {planform.Truncate(n, maxOpenNote)}}.Encode()
		if size+len(part) > budget {
			parts = append(parts, url.Values{key: {fmt.Sprintf("And %d more notes; gridloom check on the file shows them all.", len(notes)-i)}}.Encode())
			break
		}
		parts = append(parts, part)
		size += len(part) + 1
	}
	return strings.Join(parts, "&")
}

// readUpload reads the plan of an upload and the notes its reader left
// (what value notation skipped or assumed), or the status and the
// sentences that say why it cannot.
func readUpload(r *http.Request) (grid.Plan, []string, int, []string) {
	fail := func(status int, reasons ...string) (grid.Plan, []string, int, []string) {
		return grid.Plan{}, nil, status, reasons
	}
	if err := r.ParseMultipartForm(maxUploadBody); err != nil {
		if isTooLarge(err) {
			return fail(http.StatusRequestEntityTooLarge, "The upload is larger than 1 MiB; a plan file may be at most 1 MiB.")
		}
		return fail(http.StatusBadRequest, "The upload could not be read: send the plan file as multipart/form-data in the field \"plan\".")
	}
	defer func() { _ = r.MultipartForm.RemoveAll() }()
	file, hdr, err := r.FormFile("plan")
	if err != nil {
		return fail(http.StatusBadRequest, "Choose a plan file (JSON, YAML or TS 38.331 value notation) to open.")
	}
	defer file.Close()
	data, err := io.ReadAll(io.LimitReader(file, planfile.MaxSize+1))
	if err != nil {
		return fail(http.StatusBadRequest, "The file could not be read.")
	}
	if len(data) > planfile.MaxSize {
		return fail(http.StatusRequestEntityTooLarge, fmt.Sprintf("%s is larger than 1 MiB; a plan file may be at most 1 MiB.", hdr.Filename))
	}
	if planfile.MayBeFigure(hdr.Filename, data) {
		inner, err := render.PlanFromSVG(data)
		if err != nil {
			return fail(http.StatusBadRequest, fmt.Sprintf("%s cannot be opened as a plan: %s", hdr.Filename, sentence(err)))
		}
		data = inner
	}
	plan, notes, err := planfile.DecodeFile(hdr.Filename, data)
	if err != nil {
		msgs := []string{fmt.Sprintf("%s is not a plan gridloom can open:", hdr.Filename)}
		for _, fe := range fieldErrors(err) {
			msgs = append(msgs, fe.Error())
		}
		return fail(http.StatusBadRequest, msgs...)
	}
	return plan, notes, http.StatusOK, nil
}

// sentence is an error's text as the end of a sentence: with its full stop.
func sentence(err error) string {
	s := err.Error()
	if strings.HasSuffix(s, ".") {
		return s
	}
	return s + "."
}
