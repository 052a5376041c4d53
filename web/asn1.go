package web

import (
	"net/http"
	"strings"

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
//
// The answer is text, not JSON, so for a value notation body the import
// notes lead it as comments, one a line: "-- import skipped: <path (line
// n)>" and "-- import assumed: <sentence>", which reading the answer back
// ignores.
func (s *server) apiASN1(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	b, err := encodeASN1(plan)
	if err != nil {
		return err
	}
	if notes != nil {
		var head []byte
		for _, n := range notes.Skipped {
			head = append(head, "-- import skipped: "+oneLine(n)+"\n"...)
		}
		for _, n := range notes.Assumed {
			head = append(head, "-- import assumed: "+oneLine(n)+"\n"...)
		}
		b = append(head, b...)
	}
	send(w, r, http.StatusOK, "text/plain; charset=utf-8", b)
	return nil
}

// oneLine keeps a note on its comment line: a line break would end the
// comment, and "--" inside one would too.
func oneLine(s string) string {
	return strings.NewReplacer("\r", " ", "\n", " ", "--", "- -").Replace(s)
}
