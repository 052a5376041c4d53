package web

import (
	"fmt"
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

// asn1Type is the Content-Type under which the API reads a body as TS
// 38.331 value notation. No registered type exists for ASN.1 value
// notation; text/x-asn1 says what it is, and, not being text/plain, it is
// no type another site's page may post without asking. Answers are
// text/plain; charset=utf-8, so that a browser shows the text.
const asn1Type = "text/x-asn1"

// readAPIPlan reads the plan of an API request: a plan file, JSON (the
// API's own syntax), YAML or TS 38.331 value notation (text/x-asn1), as its
// Content-Type says. Any other type is refused with 415 before the body is
// read: text/plain and form bodies are what another site's page may post
// without asking (a "simple" request), so the API does not guess a plan
// from them. A body over the limit is a 413, one that is no plan a 400
// naming its fields.
func readAPIPlan(r *http.Request) (grid.Plan, error) {
	ctype, _, _ := mime.ParseMediaType(r.Header.Get("Content-Type"))
	var decode func([]byte) (grid.Plan, error)
	switch ctype {
	case "application/json":
		decode = planfile.DecodeJSON
	case "application/yaml", "application/x-yaml", "text/yaml":
		decode = planfile.DecodeYAML
	case asn1Type:
		decode = func(b []byte) (grid.Plan, error) {
			p, _, err := planfile.DecodeValueNotation(b)
			return p, err
		}
	default:
		given := "missing"
		if ctype != "" {
			given = fmt.Sprintf("%q", truncate(ctype, 100))
		}
		return grid.Plan{}, &problem{status: http.StatusUnsupportedMediaType,
			text: fmt.Sprintf("The request's Content-Type is %s; the API takes a plan file as application/json or application/yaml (or application/x-yaml, text/yaml), or TS 38.331 value notation as text/x-asn1.", given)}
	}
	body, err := io.ReadAll(r.Body)
	if err != nil {
		if isTooLarge(err) {
			return grid.Plan{}, tooLarge(maxBody)
		}
		return grid.Plan{}, &problem{status: http.StatusBadRequest, text: "The request body could not be read."}
	}
	plan, err := decode(body)
	if err != nil {
		return grid.Plan{}, badPlan(err)
	}
	return plan, nil
}

// apiRender computes a plan: the JSON document of the command line's
// render -format json, with 422 when the plan has error findings. The
// document is streamed: for the largest plan it is 25 MB.
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
	err = stream(w, r, status, "application/json; charset=utf-8", func(w io.Writer) error {
		return report.Write(w, res, true)
	})
	if err != nil {
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
