package web

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"log/slog"
	"mime"
	"net/http"
	"net/url"
	"path/filepath"
	"slices"
	"strings"
	"unicode"

	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/render"
)

// handlePage serves the planner for the plan in the query. An empty query
// redirects to the startup plan, so the address always holds the plan; an
// op (a partition edit from a page without script) is applied and
// redirects to the edited plan, focused on the control it concerns.
func handlePage(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		if r.URL.RawQuery == "" {
			http.Redirect(w, r, "/?"+FormOf(cfg.Plan).Query(), http.StatusSeeOther)
			return
		}
		st, focus, opErr := stateOf(readQuery(r))
		if opErr == nil && focus != "" {
			http.Redirect(w, r, "/?"+st.query()+"#"+focus, http.StatusSeeOther)
			return
		}
		v, styles := viewOf(r, logger, cfg, st)
		writeHTML(w, r, logger, st.status(), page(v), styles)
	}
}

// editorMark separates a fragment's results from the forms after them; the
// page script (EDITOR_MARK in static/app.js) shows the results as soon as
// it has read them and brings the forms up to date a frame later.
const editorMark = "<!--gl-editor-->"

// partMark comes before each part of the results (the status bar, the
// figure, each table...), one element each: the page script (PART_MARK in
// static/app.js) compares each part's text with the one it shows and
// parses only the parts that changed.
const partMark = "<!--gl-part-->"

// handleFragment serves the workspace of the planner alone — figure,
// tables, findings, then editorMark and the form — for the page script to
// bring the page up to date with after an edit. It
// takes the same query as the page, op included. It answers 200 whenever it
// could build the workspace: the plan's own status (422 for a value that
// does not parse or an error finding) is in the workspace's data-status,
// since the request for a fragment did not fail.
func handleFragment(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		st, focus, _ := stateOf(readQuery(r))
		v, styles := viewOf(r, logger, cfg, st)
		v.Focus = focus
		writeHTML(w, r, logger, http.StatusOK, workFragment(v), styles)
	}
}

// readQuery reads the query of a request that carries a plan: the values
// and the form they hold, with ParseQuery's messages. The query parser skips
// a pair it cannot decode (a bad %-escape, a semicolon) and reads nothing
// from a query of more than 10000 pairs, so a message says so rather than
// let a value vanish without a word.
func readQuery(r *http.Request) (url.Values, Form, Messages) {
	q, err := url.ParseQuery(r.URL.RawQuery)
	f, msgs := ParseQuery(q)
	if err != nil {
		msgs.add(keyQuery, "Part of the link could not be read (%s), so a value it holds may be missing from the form; check the form against the plan you meant.", err)
	}
	return q, f, msgs
}

// stateOf computes the form of a query (read by readQuery, with its
// messages) and applies the query's op, if any, with the query's figure
// options. focus is the control to focus after a successful op; a failed op
// leaves the plan as it was and says why beside the partitions.
func stateOf(q url.Values, f Form, msgs Messages) (st state, focus string, opErr error) {
	return stateWithOp(f, msgs, q.Get(keyOp), parseFigureForm(q))
}

// stateWithOp is stateOf for a form and an op already read, so that each
// side of the comparison can use it with its own keys.
func stateWithOp(f Form, msgs Messages, op string, ff FigureForm) (st state, focus string, opErr error) {
	st = newState(f, msgs).withFigure(ff)
	if op == "" {
		return st, "", nil
	}
	g, focus, err := applyOp(st.form, op, st.res)
	if err != nil {
		withOp := Messages{"partitions": capitalize(err.Error()) + "."}
		for k, v := range msgs {
			withOp.add(k, "%s", v)
		}
		return newState(st.form, withOp).withFigure(ff), "", err
	}
	return newState(g, msgs).withFigure(ff), focus, nil
}

func capitalize(s string) string {
	if s == "" {
		return s
	}
	r := []rune(s)
	r[0] = unicode.ToUpper(r[0])
	return string(r)
}

// viewOf draws the figure and builds the page view of a state, with the
// CSP sources the inline figure needs.
func viewOf(r *http.Request, logger *slog.Logger, cfg Config, st state) (pageView, []string) {
	svg, err := drawFigure(cfg.Figure, st.res, st.fig.opt)
	inline := ""
	var styles []string
	if err != nil {
		logger.LogAttrs(r.Context(), slog.LevelError, "figure", slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
	} else {
		inline = inlineSVG(svg)
		styles = styleSources(inline)
	}
	return buildView(st, inline, err, demoLinks(cfg.Demos)), styles
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

// handleDemo redirects to the page of a demo plan.
func handleDemo(cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		name := chi.URLParam(r, "name")
		i := slices.IndexFunc(cfg.Demos, func(d Demo) bool { return d.Name == name })
		if i < 0 {
			handleNotFound()(w, r)
			return
		}
		http.Redirect(w, r, "/?"+FormOf(cfg.Demos[i].Plan).Query(), http.StatusSeeOther)
	}
}

// downloadState reads the plan of a download's query. A value that does not
// parse gets 422 and the messages, since no file could be faithful to it.
func downloadState(w http.ResponseWriter, r *http.Request) (state, bool) {
	q, f, msgs := readQuery(r)
	st := newState(f, msgs).withFigure(parseFigureForm(q))
	if len(st.inputErr) > 0 {
		refuse(w, "The plan in the link has values that do not parse:", st.inputErr)
		return st, false
	}
	return st, true
}

// refuse answers 422 with the messages, one line each after its key.
func refuse(w http.ResponseWriter, head string, msgs Messages) {
	var b strings.Builder
	b.WriteString(head + "\n")
	for _, k := range sortedKeys(msgs) {
		fmt.Fprintf(&b, "%s: %s\n", k, msgs[k])
	}
	w.Header().Set("Content-Type", "text/plain; charset=utf-8")
	w.WriteHeader(http.StatusUnprocessableEntity)
	_, _ = io.WriteString(w, b.String())
}

// figureDownloadState reads the plan and the figure options of a figure's query;
// an option that does not parse gets 422 as a plan value does.
func figureDownloadState(w http.ResponseWriter, r *http.Request) (state, bool) {
	st, ok := downloadState(w, r)
	if ok && len(st.fig.msgs) > 0 {
		refuse(w, "The figure options in the link have values that gridloom cannot draw:", st.fig.msgs)
		return st, false
	}
	return st, ok
}

// handleFigure serves the figure of the query's plan, drawn with the
// query's figure options and carrying the plan file in its metadata, so
// that the saved figure opens again as the plan. A plan with error
// findings is still drawn (with what could be placed), as the command line
// does: a figure of a broken plan is what a team discusses.
func handleFigure(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		st, ok := figureDownloadState(w, r)
		if !ok {
			return
		}
		opt := st.fig.opt
		plan, err := planfile.EncodeJSON(st.plan)
		if err != nil {
			serverError(w, r, logger, "figure", err)
			return
		}
		opt.Plan = plan
		svg, err := drawFigure(cfg.Figure, st.res, opt)
		if err != nil {
			serverError(w, r, logger, "figure", err)
			return
		}
		w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(svg))))
		if r.URL.Query().Get("download") == "1" {
			attach(w, st.plan.Name, ".svg")
		}
		send(w, http.StatusOK, "image/svg+xml", svg)
	}
}

// handleFigurePNG serves the figure as a PNG image, with the same options
// and the same layout as the SVG; an image carries no plan.
func handleFigurePNG(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		st, ok := figureDownloadState(w, r)
		if !ok {
			return
		}
		png, err := drawFigure(cfg.PNG, st.res, st.fig.opt)
		if err != nil {
			serverError(w, r, logger, "figure", err)
			return
		}
		if r.URL.Query().Get("download") == "1" {
			attach(w, st.plan.Name, ".png")
		}
		send(w, http.StatusOK, "image/png", png)
	}
}

// handlePlanFile serves the query's plan as a plan file to keep or share.
func handlePlanFile(logger *slog.Logger, format string) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		st, ok := downloadState(w, r)
		if !ok {
			return
		}
		var (
			b   []byte
			err error
		)
		ctype := "application/json"
		if format == "yaml" {
			b, err = planfile.EncodeYAML(st.plan)
			ctype = "application/yaml"
		} else {
			b, err = planfile.EncodeJSON(st.plan)
		}
		if err != nil {
			serverError(w, r, logger, "plan file", err)
			return
		}
		attach(w, st.plan.Name, "."+format)
		send(w, http.StatusOK, ctype+"; charset=utf-8", b)
	}
}

// handleSymbols serves the symbol table of the query's plan as CSV.
func handleSymbols(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		st, ok := downloadState(w, r)
		if !ok {
			return
		}
		var buf bytes.Buffer
		if err := cfg.SymbolCSV(&buf, st.res); err != nil {
			serverError(w, r, logger, "symbol table", err)
			return
		}
		attach(w, st.plan.Name, "-symbols.csv")
		send(w, http.StatusOK, "text/csv; charset=utf-8", buf.Bytes())
	}
}

// handleOpen reads an uploaded plan file (field "plan": JSON, YAML, or a
// figure saved by gridloom, whose metadata holds the plan) and redirects to
// its page, keeping the figure options of the page it came from. On failure
// it shows that page (its query rides on the form's action) with the reason
// beside the file control.
func handleOpen(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		fail := func(status int, reasons ...string) {
			_, f, msgs := readQuery(r)
			if r.URL.RawQuery == "" {
				f = FormOf(cfg.Plan)
			}
			st := newState(f, msgs)
			v, styles := viewOf(r, logger, cfg, st)
			for _, m := range reasons {
				v.Upload.Notes = append(v.Upload.Notes, note{Severity: string(grid.Error), Text: m})
			}
			writeHTML(w, r, logger, status, page(v), styles)
		}
		if err := r.ParseMultipartForm(maxUploadBody); err != nil {
			if isTooLarge(err) {
				fail(http.StatusRequestEntityTooLarge, "The upload is larger than 1 MiB; a plan file may be at most 1 MiB.")
				return
			}
			fail(http.StatusBadRequest, "The upload could not be read: send the plan file as multipart/form-data in the field \"plan\".")
			return
		}
		defer func() { _ = r.MultipartForm.RemoveAll() }()
		file, hdr, err := r.FormFile("plan")
		if err != nil {
			fail(http.StatusBadRequest, "Choose a plan file (JSON or YAML) to open.")
			return
		}
		defer file.Close()
		data, err := io.ReadAll(io.LimitReader(file, planfile.MaxSize+1))
		if err != nil {
			fail(http.StatusBadRequest, "The file could not be read.")
			return
		}
		if len(data) > planfile.MaxSize {
			fail(http.StatusRequestEntityTooLarge, fmt.Sprintf("%s is larger than 1 MiB; a plan file may be at most 1 MiB.", hdr.Filename))
			return
		}
		var plan grid.Plan
		ext := strings.ToLower(filepath.Ext(hdr.Filename))
		if ext == ".svg" || (ext != ".json" && ext != ".yaml" && ext != ".yml" && looksLikeXML(data)) {
			inner, err := render.PlanFromSVG(data)
			if err != nil {
				fail(http.StatusBadRequest, fmt.Sprintf("%s cannot be opened as a plan: %s.", hdr.Filename, strings.TrimSuffix(err.Error(), ".")))
				return
			}
			data = inner
		}
		switch ext {
		case ".json":
			plan, err = planfile.DecodeJSON(data)
		case ".yaml", ".yml":
			plan, err = planfile.DecodeYAML(data)
		default:
			plan, err = planfile.Decode(data)
		}
		if err != nil {
			msgs := []string{fmt.Sprintf("%s is not a plan gridloom can open:", hdr.Filename)}
			for _, fe := range fieldErrors(err) {
				msgs = append(msgs, fe.Error())
			}
			fail(http.StatusBadRequest, msgs...)
			return
		}
		fig := parseFigureForm(r.URL.Query()).query()
		http.Redirect(w, r, "/?"+joinQuery(FormOf(plan).Query(), fig), http.StatusSeeOther)
	}
}

// looksLikeXML reports whether data opens as an XML document does: with
// "<" after any byte-order mark and white space. No plan file does.
func looksLikeXML(data []byte) bool {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	data = bytes.TrimLeft(data, " \t\r\n")
	return len(data) > 0 && data[0] == '<'
}

func isTooLarge(err error) bool {
	var mbe *http.MaxBytesError
	return errors.As(err, &mbe)
}

// fieldErrors lists the field errors of a planfile error.
func fieldErrors(err error) []*planfile.FieldError {
	var es planfile.Errors
	if errors.As(err, &es) {
		return es
	}
	var fe *planfile.FieldError
	if errors.As(err, &fe) {
		return []*planfile.FieldError{fe}
	}
	return []*planfile.FieldError{{Msg: err.Error()}}
}

// apiError is the body of an API error: one sentence, and the fields it
// concerns, by plan path.
type apiError struct {
	Error  string       `json:"error"`
	Fields []apiFieldEr `json:"fields,omitempty"`
}

type apiFieldEr struct {
	Field   string `json:"field"`
	Message string `json:"message"`
}

// readAPIPlan reads the plan of an API request, or answers with 413 or 400
// and reports false. The body is a plan file: JSON (the API's own syntax)
// or YAML, by its Content-Type, or sniffed when that names neither.
func readAPIPlan(w http.ResponseWriter, r *http.Request) (grid.Plan, bool) {
	body, err := io.ReadAll(r.Body)
	if err != nil {
		if isTooLarge(err) {
			tooLarge(w, r, maxBody)
			return grid.Plan{}, false
		}
		writeJSON(w, http.StatusBadRequest, apiError{Error: "The request body could not be read."})
		return grid.Plan{}, false
	}
	var plan grid.Plan
	ctype, _, _ := mime.ParseMediaType(r.Header.Get("Content-Type"))
	switch ctype {
	case "application/json":
		plan, err = planfile.DecodeJSON(body)
	case "application/yaml", "application/x-yaml", "text/yaml":
		plan, err = planfile.DecodeYAML(body)
	default:
		plan, err = planfile.Decode(body)
	}
	if err != nil {
		fes := fieldErrors(err)
		out := apiError{Error: err.Error()}
		for _, fe := range fes {
			out.Fields = append(out.Fields, apiFieldEr{Field: fe.Field, Message: fe.Msg})
		}
		writeJSON(w, http.StatusBadRequest, out)
		return grid.Plan{}, false
	}
	return plan, true
}

// handleAPIRender computes a plan: the JSON document of the command line's
// render -format json, with 422 when the plan has error findings and 400
// (naming the field) when the body is no plan file.
func handleAPIRender(logger *slog.Logger) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		plan, ok := readAPIPlan(w, r)
		if !ok {
			return
		}
		res := grid.Compute(plan)
		status := http.StatusOK
		if res.HasErrors() {
			status = http.StatusUnprocessableEntity
		}
		writeJSON(w, status, report.Build(res, true))
	}
}

// handleAPIFigure draws a plan. A plan with error findings gets 422 and the
// JSON document without the symbol lists, so the caller sees why.
func handleAPIFigure(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		plan, ok := readAPIPlan(w, r)
		if !ok {
			return
		}
		res := grid.Compute(plan)
		if res.HasErrors() {
			writeJSON(w, http.StatusUnprocessableEntity, report.Build(res, false))
			return
		}
		svg, err := drawFigure(cfg.Figure, res, render.Options{})
		if err != nil {
			serverError(w, r, logger, "figure", err)
			return
		}
		w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(svg))))
		send(w, http.StatusOK, "image/svg+xml", svg)
	}
}

// writeJSON encodes v into memory first, so an encoding failure is a clean 500.
func writeJSON(w http.ResponseWriter, status int, v any) {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		http.Error(w, "Internal error: the response could not be encoded.", http.StatusInternalServerError)
		return
	}
	send(w, status, "application/json; charset=utf-8", append(b, '\n'))
}

func send(w http.ResponseWriter, status int, ctype string, body []byte) {
	w.Header().Set("Content-Type", ctype)
	w.WriteHeader(status)
	_, _ = w.Write(body)
}

func serverError(w http.ResponseWriter, r *http.Request, logger *slog.Logger, what string, err error) {
	logger.LogAttrs(r.Context(), slog.LevelError, what, slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
	msg := fmt.Sprintf("Internal error: the %s could not be made; the log has the details.", what)
	if isAPI(r) {
		writeJSON(w, http.StatusInternalServerError, apiError{Error: msg})
		return
	}
	http.Error(w, msg, http.StatusInternalServerError)
}

// attach marks the response as a file to save, named after the plan.
func attach(w http.ResponseWriter, planName, suffix string) {
	w.Header().Set("Content-Disposition", mime.FormatMediaType("attachment", map[string]string{"filename": fileName(planName) + suffix}))
}

// fileName makes a plan name safe as a file name on any system: lower-case
// ASCII letters and digits, runs of anything else as one hyphen, at most 60
// characters; "gridloom-plan" when nothing is left, and "-plan" after a
// name that Windows keeps for a device (con, nul, com1 …).
func fileName(name string) string {
	var b strings.Builder
	dash := false
	for _, c := range strings.ToLower(name) {
		if (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(c)
			if b.Len() >= 60 {
				break
			}
			continue
		}
		dash = true
	}
	if b.Len() == 0 {
		return "gridloom-plan"
	}
	if windowsDevice(b.String()) {
		b.WriteString("-plan")
	}
	return b.String()
}

// windowsDevice reports whether Windows reserves s, with any extension, as
// the name of a device.
func windowsDevice(s string) bool {
	switch s {
	case "con", "prn", "aux", "nul":
		return true
	}
	return len(s) == 4 && (strings.HasPrefix(s, "com") || strings.HasPrefix(s, "lpt")) && s[3] >= '0' && s[3] <= '9'
}

// handleNotFound answers unknown paths: JSON under /api/, a short page
// elsewhere.
func handleNotFound() http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		if isAPI(r) {
			writeJSON(w, http.StatusNotFound, apiError{Error: fmt.Sprintf("There is no %s; the API has POST /api/v1/render and POST /api/v1/figure.", r.URL.Path)})
			return
		}
		var buf bytes.Buffer
		if err := notFoundPage(r.URL.Path).Render(r.Context(), &buf); err != nil {
			http.Error(w, "Not found.", http.StatusNotFound)
			return
		}
		send(w, http.StatusNotFound, "text/html; charset=utf-8", buf.Bytes())
	}
}

// handleMethodNotAllowed answers 405 with the Allow header listing the
// methods the path has.
func handleMethodNotAllowed(routes chi.Routes) http.HandlerFunc {
	methods := []string{http.MethodGet, http.MethodHead, http.MethodPost, http.MethodPut, http.MethodPatch, http.MethodDelete, http.MethodOptions}
	return func(w http.ResponseWriter, r *http.Request) {
		var allow []string
		for _, m := range methods {
			if routes.Match(chi.NewRouteContext(), m, r.URL.Path) {
				allow = append(allow, m)
			}
		}
		if slices.Contains(allow, http.MethodGet) && !slices.Contains(allow, http.MethodHead) {
			allow = append(allow, http.MethodHead)
		}
		w.Header().Set("Allow", strings.Join(allow, ", "))
		msg := fmt.Sprintf("%s is not allowed on %s; use %s.", r.Method, r.URL.Path, strings.Join(allow, " or "))
		if isAPI(r) {
			writeJSON(w, http.StatusMethodNotAllowed, apiError{Error: msg})
			return
		}
		w.Header().Set("Content-Type", "text/plain; charset=utf-8")
		w.WriteHeader(http.StatusMethodNotAllowed)
		_, _ = io.WriteString(w, msg+"\n")
	}
}
