// Package planform is the page model of gridloom's web app, with no HTTP
// and no templates in it: the plan form as typed (Form) and its one table of
// fields (Fields: query key, plan path, label, kind, allowed values), the
// query codec that makes a link hold the whole plan, the figure's options,
// the edits (add, remove, duplicate, move, clear), the computed page state
// (State) and the two-sided keys of the comparison.
//
// The web package only calls it: a handler reads a State from the query,
// builds a view from it and renders. A new plan field is a field of
// grid.Plan, one row of Fields and its control in the template.
//
// Security: every query is untrusted. Values are kept as typed strings and
// only ever parsed into numbers with bounds (see maxNumber and
// maxPartIndex), so a crafted link can neither make the form allocate
// without limit nor lose a value without a message.
package planform
