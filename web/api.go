package web

import (
	"io"
	"mime"
	"net/http"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/render"
)

// The JSON API: a plan file in the body, the lattice document or the
// figure out. Its errors are JSON (see apiErrors).

// readAPIPlan reads the plan of an API request: a plan file, JSON (the
// API's own syntax) or YAML, by its Content-Type, or sniffed when that
// names neither. A body over the limit is a 413, one that is no plan a 400
// naming its fields.
func readAPIPlan(r *http.Request) (grid.Plan, error) {
	body, err := io.ReadAll(r.Body)
	if err != nil {
		if isTooLarge(err) {
			return grid.Plan{}, tooLarge(maxBody)
		}
		return grid.Plan{}, &problem{status: http.StatusBadRequest, text: "The request body could not be read."}
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
		return grid.Plan{}, badPlan(err)
	}
	return plan, nil
}

// apiRender computes a plan: the JSON document of the command line's
// render -format json, with 422 when the plan has error findings.
func (s *server) apiRender(w http.ResponseWriter, r *http.Request) error {
	plan, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	res := grid.Compute(plan)
	status := http.StatusOK
	if res.HasErrors() {
		status = http.StatusUnprocessableEntity
	}
	if err := sendJSON(w, r, status, report.Build(res, true)); err != nil {
		return internal("lattice document", err)
	}
	return nil
}

// apiFigure draws a plan. A plan with error findings gets 422 and the JSON
// document without the symbol lists, so the caller sees why.
func (s *server) apiFigure(w http.ResponseWriter, r *http.Request) error {
	plan, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	res := grid.Compute(plan)
	if res.HasErrors() {
		if err := sendJSON(w, r, http.StatusUnprocessableEntity, report.Build(res, false)); err != nil {
			return internal("lattice document", err)
		}
		return nil
	}
	svg, err := drawFigure(s.cfg.Figure, res, render.Options{})
	if err != nil {
		return internal("figure", err)
	}
	w.Header().Set("Content-Security-Policy", figurePolicy(styleSources(string(svg))))
	send(w, r, http.StatusOK, "image/svg+xml", svg)
	return nil
}
