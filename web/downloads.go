package web

import (
	"io"
	"net/http"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// The downloads: the figure (SVG with the plan inside, or PNG), the plan
// files and the symbol table of the query's plan.

// downloadState reads the plan of a download's query. A value that does not
// parse gets 422 and the messages, since no file could be faithful to it.
func downloadState(r *http.Request) (planform.State, error) {
	st := planform.ReadPlan(r.URL.RawQuery)
	if len(st.InputErr) > 0 {
		return st, refusal("The plan in the link has values that do not parse:", st.InputErr)
	}
	return st, nil
}

// figureState reads the plan and the figure options of a figure's query;
// an option that does not parse gets 422 as a plan value does.
func figureState(r *http.Request) (planform.State, error) {
	st, err := downloadState(r)
	if err == nil && len(st.Fig.Msgs) > 0 {
		return st, refusal("The figure options in the link have values that gridloom cannot draw:", st.Fig.Msgs)
	}
	return st, err
}

// figureSVG serves the figure of the query's plan, drawn with the query's
// figure options and carrying the plan file in its metadata, so that the
// saved figure opens again as the plan. A plan with error findings is still
// drawn (with what could be placed), as the command line does: a figure of
// a broken plan is what a team discusses.
func (s *server) figureSVG(w http.ResponseWriter, r *http.Request) error {
	st, err := figureState(r)
	if err != nil {
		return err
	}
	if head(w, r, "image/svg+xml", st.Plan.Name, ".svg") {
		return nil
	}
	opt := st.Fig.Opt
	if opt.Plan, err = planfile.EncodeJSON(st.Plan); err != nil {
		return internal("figure", err)
	}
	svg, err := drawFigure(s.cfg.Figure, st.Result, opt)
	if err != nil {
		return internal("figure", err)
	}
	w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(svg))))
	if r.URL.Query().Get("download") == "1" {
		attach(w, st.Plan.Name, ".svg")
	}
	send(w, r, http.StatusOK, "image/svg+xml", svg)
	return nil
}

// figurePNG serves the figure as a PNG image, with the same options and the
// same layout as the SVG; an image carries no plan.
func (s *server) figurePNG(w http.ResponseWriter, r *http.Request) error {
	st, err := figureState(r)
	if err != nil {
		return err
	}
	if head(w, r, "image/png", st.Plan.Name, ".png") {
		return nil
	}
	png, err := drawFigure(s.cfg.PNG, st.Result, st.Fig.Opt)
	if err != nil {
		return figureFailed(err)
	}
	if r.URL.Query().Get("download") == "1" {
		attach(w, st.Plan.Name, ".png")
	}
	send(w, r, http.StatusOK, "image/png", png)
	return nil
}

// planFile serves the query's plan as a plan file to keep or share.
func (s *server) planFile(format string) handlerFunc {
	return func(w http.ResponseWriter, r *http.Request) error {
		st, err := downloadState(r)
		if err != nil {
			return err
		}
		var b []byte
		ctype := "application/json"
		if format == "yaml" {
			b, err = planfile.EncodeYAML(st.Plan)
			ctype = "application/yaml"
		} else {
			b, err = planfile.EncodeJSON(st.Plan)
		}
		if err != nil {
			return internal("plan file", err)
		}
		attach(w, st.Plan.Name, "."+format)
		send(w, r, http.StatusOK, ctype+"; charset=utf-8", b)
		return nil
	}
}

// symbols serves the symbol table of the query's plan as CSV, streamed: for
// the largest plan it is 46 MB.
func (s *server) symbols(w http.ResponseWriter, r *http.Request) error {
	st, err := downloadState(r)
	if err != nil {
		return err
	}
	attach(w, st.Plan.Name, "-symbols.csv")
	err = stream(w, r, http.StatusOK, "text/csv; charset=utf-8", func(w io.Writer) error {
		return s.cfg.SymbolCSV(w, st.Result)
	})
	if err != nil {
		return internal("symbol table", err)
	}
	return nil
}

// head answers a HEAD request for a figure with the headers its GET would
// carry, without drawing it, and reports whether it did.
func head(w http.ResponseWriter, r *http.Request, ctype, planName, suffix string) bool {
	if r.Method != http.MethodHead {
		return false
	}
	if r.URL.Query().Get("download") == "1" {
		attach(w, planName, suffix)
	}
	w.Header().Set("Content-Type", ctype)
	if isCompressible(ctype) {
		w.Header().Add("Vary", "Accept-Encoding")
	}
	w.WriteHeader(http.StatusOK)
	return true
}
