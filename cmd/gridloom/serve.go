package main

import (
	"context"
	"fmt"
	"io"
)

// runServe starts the web app. Until it exists, gridloom prints its usage.
func runServe(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	fmt.Fprint(stderr, usage)
	return &exitError{code: exitBadInput, msg: "the web app is not built yet; use render or check"}
}
