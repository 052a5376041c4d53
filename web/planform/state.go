package planform

import (
	"net/url"

	"gridloom/grid"
)

// State is one form with everything computed from it: the page model that
// the planner, the walkthrough, the downloads and each side of the
// comparison read.
type State struct {
	Form     Form // as typed (after any edit and RIV fill)
	Plan     grid.Plan
	InputErr Messages // values that did not parse, and query problems
	Result   grid.Result
	Fig      FigureState // the figure's options, read by WithFigure
}

// NewState reads and computes a form. The RIV fill is applied to the form
// that is shown, after computing, so that the messages match it.
func NewState(f Form, queryMsgs Messages) State {
	plan, msgs := f.Plan()
	for k, v := range queryMsgs {
		msgs.Add(k, "%s", v)
	}
	res := grid.Compute(plan)
	return State{Form: fill(f, res), Plan: plan, InputErr: msgs, Result: res}
}

// WithFigure returns s with the figure options ff.
func (s State) WithFigure(ff FigureForm) State {
	s.Fig = NewFigureState(ff, s.Plan.Name)
	return s
}

// Query is the canonical query of s: the plan's keys, then the figure's.
func (s State) Query() string { return JoinQuery(s.Form.Query(), s.Fig.Form.Query()) }

// Invalid reports whether a value did not parse (of the plan or of the
// figure's options) or the plan has error findings: a page of s answers 422.
func (s State) Invalid() bool {
	return len(s.InputErr) > 0 || len(s.Fig.Msgs) > 0 || s.Result.HasErrors()
}

// ReadQuery reads a raw query that carries a plan: the values and the form
// they hold, with ParseQuery's messages. The query parser skips a pair it
// cannot decode (a bad %-escape, a semicolon) and reads nothing from a query
// of more than 10000 pairs, so a message says so rather than let a value
// vanish without a word.
func ReadQuery(raw string) (url.Values, Form, Messages) {
	q, err := url.ParseQuery(raw)
	f, msgs := ParseQuery(q)
	if err != nil {
		msgs.Add(KeyQuery, "Part of the link could not be read (%s), so a value it holds may be missing from the form; check the form against the plan you meant.", err)
	}
	return q, f, msgs
}

// Read computes the plan of a raw query with its figure options, and
// applies the query's op, if any. focus is the control to focus after a
// successful op; a failed op leaves the plan as it was, says why beside the
// partitions and is returned as an *OpError.
func Read(raw string) (st State, focus string, opErr error) {
	q, f, msgs := ReadQuery(raw)
	return WithOp(f, msgs, q.Get(KeyOp), ParseFigureForm(q))
}

// ReadPlan computes the plan of a raw query with its figure options and no
// op: what a download draws or writes.
func ReadPlan(raw string) State {
	q, f, msgs := ReadQuery(raw)
	return NewState(f, msgs).WithFigure(ParseFigureForm(q))
}

// WithOp is Read for a form and an op already read, so that each side of
// the comparison can use it with its own keys.
func WithOp(f Form, msgs Messages, op string, ff FigureForm) (st State, focus string, opErr error) {
	st = NewState(f, msgs).WithFigure(ff)
	if op == "" {
		return st, "", nil
	}
	g, focus, err := ApplyOp(st.Form, op, st.Result)
	if err != nil {
		withOp := Messages{"partitions": err.Error()}
		for k, v := range msgs {
			withOp.Add(k, "%s", v)
		}
		return NewState(st.Form, withOp).WithFigure(ff), "", err
	}
	return NewState(g, msgs).WithFigure(ff), focus, nil
}
