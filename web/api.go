package web

import (
	"bytes"
	"encoding/json"
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
//
// For value notation it also returns what the reader skipped and assumed,
// the notes the page's Open shows; the JSON answers carry them as "import"
// (see importNotes). For a plan file the notes are nil.
func readAPIPlan(r *http.Request) (grid.Plan, *importNotes, error) {
	ctype, _, _ := mime.ParseMediaType(r.Header.Get("Content-Type"))
	var notes *importNotes
	var decode func([]byte) (grid.Plan, error)
	switch ctype {
	case "application/json":
		decode = planfile.DecodeJSON
	case "application/yaml", "application/x-yaml", "text/yaml":
		decode = planfile.DecodeYAML
	case asn1Type:
		decode = func(b []byte) (grid.Plan, error) {
			d, err := planfile.ReadValueNotation(b)
			if err == nil {
				notes = &importNotes{Skipped: d.Skipped, Assumed: d.Assumed}
				if notes.Skipped == nil {
					notes.Skipped = []string{}
				}
				if notes.Assumed == nil {
					notes.Assumed = []string{}
				}
			}
			return d.Plan, err
		}
	default:
		given := "missing"
		if ctype != "" {
			given = fmt.Sprintf("%q", truncate(ctype, 100))
		}
		return grid.Plan{}, nil, &problem{status: http.StatusUnsupportedMediaType,
			text: fmt.Sprintf("The request's Content-Type is %s; the API takes a plan file as application/json or application/yaml (or application/x-yaml, text/yaml), or TS 38.331 value notation as text/x-asn1.", given)}
	}
	body, err := io.ReadAll(r.Body)
	if err != nil {
		if isTooLarge(err) {
			return grid.Plan{}, nil, tooLarge(maxBody)
		}
		return grid.Plan{}, nil, &problem{status: http.StatusBadRequest, text: "The request body could not be read."}
	}
	plan, err := decode(body)
	if err != nil {
		return grid.Plan{}, nil, badPlan(err)
	}
	return plan, notes, nil
}

// importNotes are what reading a value notation body skipped and assumed:
// the JSON answers of the API carry them as
//
//	"import": {"skipped": ["ServingCellConfigCommon.physCellId (line 12)", …],
//	           "assumed": ["The text has no MIB, so k_SSB …", …]}
//
// first in the document, for a value notation body only. skipped lists the
// values and fields gridloom does not read, each as its path and line;
// assumed the sentences saying what the reader took for granted.
type importNotes struct {
	Skipped []string `json:"skipped"`
	Assumed []string `json:"assumed"`
}

// withImport puts "import" first into an indented JSON object, as
// json.MarshalIndent(v, "", "  ") writes one; without notes it returns the
// object as it is.
func withImport(obj []byte, n *importNotes) []byte {
	if n == nil || !bytes.HasPrefix(obj, []byte("{\n")) {
		return obj
	}
	return append(importHead(n), obj[2:]...)
}

// importHead is the start of a JSON object holding "import" and a comma,
// to which the rest of an object, after its opening "{\n", is appended.
func importHead(n *importNotes) []byte {
	b, _ := json.MarshalIndent(n, "  ", "  ") // two slices of strings: cannot fail
	head := append([]byte("{\n  \"import\": "), b...)
	return append(head, ",\n"...)
}

// skipWriter drops the first n bytes written to it: the opening "{\n" of a
// streamed document whose head importHead wrote.
type skipWriter struct {
	w io.Writer
	n int
}

func (s *skipWriter) Write(p []byte) (int, error) {
	all := len(p)
	if s.n > 0 {
		k := min(s.n, len(p))
		s.n -= k
		p = p[k:]
	}
	if len(p) == 0 {
		return all, nil
	}
	if _, err := s.w.Write(p); err != nil {
		return 0, err
	}
	return all, nil
}

// sendJSONImport is sendJSON with the import notes of a value notation
// body first in the object.
func sendJSONImport(w http.ResponseWriter, r *http.Request, status int, v any, n *importNotes) error {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		return err
	}
	send(w, r, status, "application/json; charset=utf-8", append(withImport(b, n), '\n'))
	return nil
}

// apiRender computes a plan: the JSON document of the command line's
// render -format json, with 422 when the plan has error findings. The
// document is streamed: for the largest plan it is 25 MB.
func (s *server) apiRender(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	res := grid.Compute(plan)
	status := http.StatusOK
	if res.HasErrors() {
		status = http.StatusUnprocessableEntity
	}
	err = stream(w, r, status, "application/json; charset=utf-8", func(w io.Writer) error {
		if notes == nil {
			return report.Write(w, res, true)
		}
		if _, err := w.Write(importHead(notes)); err != nil {
			return err
		}
		return report.Write(&skipWriter{w: w, n: 2}, res, true)
	})
	if err != nil {
		return internal("lattice document", err)
	}
	return nil
}

// apiFigure draws a plan. A plan with error findings gets 422 and the JSON
// document without the symbol lists, so the caller sees why.
func (s *server) apiFigure(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	res := grid.Compute(plan)
	if res.HasErrors() {
		if err := sendJSONImport(w, r, http.StatusUnprocessableEntity, report.Build(res, false), notes); err != nil {
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
