package main

import (
	"io"

	"gridloom/grid"
	"gridloom/grid/report"
)

func writeJSON(w io.Writer, res grid.Result) error { return report.Write(w, res, true) }
