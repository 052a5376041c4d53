package web

import (
	"net/http"

	"gridloom/grid"
	"gridloom/grid/rrc"
)

// The plan as TS 38.331 value notation (package grid/rrc): the page's
// download and copy link, and the API's POST /api/v1/asn1. An export is for
// a checked plan, so a plan with error findings gets 422 and rrc.Encode's
// sentence naming the first error.

// encodeASN1 writes a plan as value notation; a plan rrc.Encode refuses
// gets 422 with its sentence.
func encodeASN1(plan grid.Plan) ([]byte, error) {
	b, err := rrc.Encode(plan)
	if err != nil {
		return nil, &problem{status: http.StatusUnprocessableEntity, text: sentence(err)}
	}
	return b, nil
}

// planASN serves the query's plan as value notation: shown as text, or with
// download=1 saved as a file named after the plan, like the other
// downloads. The page's "Copy as TS 38.331" link fetches it.
func (s *server) planASN(w http.ResponseWriter, r *http.Request) error {
	st, err := downloadState(r)
	if err != nil {
		return err
	}
	b, err := encodeASN1(st.Plan)
	if err != nil {
		return err
	}
	if r.URL.Query().Get("download") == "1" {
		attach(w, st.Plan.Name, ".asn")
	}
	send(w, r, http.StatusOK, "text/plain; charset=utf-8", b)
	return nil
}

// apiASN1 takes a plan file (JSON, YAML or value notation, as readAPIPlan
// reads it) and answers its value notation, the command line's
// render -format asn1.
func (s *server) apiASN1(w http.ResponseWriter, r *http.Request) error {
	plan, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	b, err := encodeASN1(plan)
	if err != nil {
		return err
	}
	send(w, r, http.StatusOK, "text/plain; charset=utf-8", b)
	return nil
}
