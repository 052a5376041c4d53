package main

import (
	"encoding/json"
	"io"

	"gridloom/grid"
	"gridloom/grid/report"
)

func writeJSON(w io.Writer, res grid.Result) error { return report.Write(w, res, true) }

// writeFindingsJSON writes check's JSON: an object whose "findings" are
// exactly those of the render document, so one jq filter reads both.
func writeFindingsJSON(w io.Writer, res grid.Result) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(struct {
		Findings []grid.Finding `json:"findings"`
	}{report.Build(res, false).Findings})
}
