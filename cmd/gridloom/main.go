// Command gridloom plans 5G NR carriers split into partitions of different
// numerologies: it computes each partition's time-frequency lattice, checks
// the plan, and draws it.
//
//	gridloom [serve] [-addr 127.0.0.1:8080] [-plan FILE]   the web app
//	gridloom render [-format svg|json|csv|asn1] [-o FILE] PLAN  draw or export a plan
//	gridloom check PLAN                                    list the findings
//
// PLAN is a JSON or YAML plan file, TS 38.331 ASN.1 value notation (.asn,
// .asn1, or recognised by its first line), or "-" for standard input.
package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	err := run(ctx, os.Args[1:], os.Stdin, os.Stdout, os.Stderr)
	stop()
	os.Exit(exitCode(err, os.Stderr))
}

// exitError carries an exit status; its message, if any, is printed.
type exitError struct {
	code int
	msg  string
}

func (e *exitError) Error() string { return e.msg }

func exitCode(err error, stderr io.Writer) int {
	if err == nil {
		return 0
	}
	var e *exitError
	if errors.As(err, &e) {
		if e.msg != "" {
			fmt.Fprintln(stderr, "gridloom:", e.msg)
		}
		return e.code
	}
	fmt.Fprintln(stderr, "gridloom:", err)
	return 1
}

const usage = `gridloom plans 5G NR carriers split into partitions of different numerologies.

Usage:
  gridloom [serve] [flags]          start the web app (default 127.0.0.1:8080)
  gridloom render [flags] PLAN      draw or export a plan: -format svg, json, csv or asn1
  gridloom check PLAN               list the plan's findings

PLAN is a JSON or YAML plan file, TS 38.331 value notation (.asn, .asn1),
or - for standard input.
Run "gridloom COMMAND -h" for the flags of a command.
`

// run is the whole program, so tests can run it with their own arguments and streams.
func run(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	cmd := "serve"
	if len(args) > 0 && args[0] != "" && args[0][0] != '-' {
		cmd, args = args[0], args[1:]
	}
	switch cmd {
	case "serve":
		return runServe(ctx, args, stdout, stderr)
	case "render":
		return runRender(args, stdin, stdout, stderr)
	case "check":
		return runCheck(args, stdin, stdout, stderr)
	case "help":
		fmt.Fprint(stdout, usage)
		return nil
	}
	fmt.Fprint(stderr, usage)
	return &exitError{code: 2, msg: fmt.Sprintf("unknown command %q; use serve, render or check", cmd)}
}
