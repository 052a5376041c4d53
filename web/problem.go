package web

import (
	"errors"
	"fmt"
	"maps"
	"net/http"
	"slices"
	"strings"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// problem is an error with the answer it deserves.
type problem struct {
	status int
	text   string         // what the user reads: whole sentences, one or more lines
	fields []problemField // the plan paths it concerns, for the API's body
	what   string         // for a 5xx: what could not be made, for the log
	err    error          // for a 5xx: the cause, for the log
}

type problemField struct {
	Field   string `json:"field"`
	Message string `json:"message"`
}

func (p *problem) Error() string {
	if p.err != nil {
		return p.text + ": " + p.err.Error()
	}
	return p.text
}

func (p *problem) Unwrap() error { return p.err }

// refusal is a 422 for values that do not parse: a head line, then one line
// per message after its key.
func refusal(head string, msgs planform.Messages) *problem {
	var b strings.Builder
	b.WriteString(head)
	for _, k := range slices.Sorted(maps.Keys(msgs)) {
		fmt.Fprintf(&b, "\n%s: %s", k, msgs[k])
	}
	return &problem{status: http.StatusUnprocessableEntity, text: b.String()}
}

// internal is a 500 for something of the app's own that failed; the log
// has the cause.
func internal(what string, err error) *problem {
	return &problem{status: http.StatusInternalServerError, what: what, err: err,
		text: fmt.Sprintf("Internal error: the %s could not be made; the log has the details.", what)}
}

// badPlan is a 400 for a body that is no plan file, naming its fields.
func badPlan(err error) *problem {
	p := &problem{status: http.StatusBadRequest, text: err.Error()}
	for _, fe := range fieldErrors(err) {
		p.fields = append(p.fields, problemField{Field: fe.Field, Message: fe.Msg})
	}
	return p
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

// tooLarge is a 413 for a body over its limit.
func tooLarge(limit int64) *problem {
	size := "1 MiB"
	if limit != maxBody {
		size = "1 MiB plus 64 KiB for the upload form"
	}
	return &problem{status: http.StatusRequestEntityTooLarge,
		text: "The request body is larger than " + size + "; a plan file may be at most 1 MiB."}
}

func isTooLarge(err error) bool {
	var mbe *http.MaxBytesError
	return errors.As(err, &mbe)
}
