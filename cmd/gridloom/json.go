package main

import (
	"encoding/json"
	"io"

	"gridloom/grid"
)

func writeJSON(w io.Writer, res grid.Result) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(res.JSON(true))
}
