// Command gridloom plans 5G NR carriers split into partitions of different
// numerologies: it computes each partition's time-frequency lattice, checks
// the plan, and draws it.
//
//	gridloom [serve] [-addr 127.0.0.1:8080] [-plan FILE]       the web app
//	gridloom render [-format svg|png|json|csv|asn1] [-o FILE] PLAN  draw or export a plan
//	gridloom check [-format text|json] [-strict] PLAN          list the findings
//	gridloom ssb [-band nBAND] [-format table|json] PLAN       where the SS/PBCH block fits on the sync raster
//	gridloom initial [-band nBAND] [-format table|json] PLAN   the GSCNs and pdcch-ConfigSIB1 values that fit
//	gridloom prach [-format table|json] PLAN                   the PRACH configuration indexes that fit
//	gridloom timing PLAN                                       the timing tables and the numerology advice
//	gridloom version                                           the version and the 3GPP release
//
// PLAN is a JSON or YAML plan file, TS 38.331 ASN.1 value notation (.asn,
// .asn1, or recognised by its first line), or "-" for standard input.
// Ctrl-C or SIGTERM ends render and check at once and lets the server
// drain; a second one ends the server at once.
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
	ctx, cancel := context.WithCancelCause(context.Background())
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	go func() {
		// The first Ctrl-C or SIGTERM ends the context: the server drains,
		// render and check stop waiting for their input. A second one
		// means the user will not wait for the drain either.
		sig := <-sigs
		cancel(signalCause{sig})
		sig = <-sigs
		fmt.Fprintf(os.Stderr, "gridloom: %s again: stopping at once\n", sig)
		os.Exit(signalStatus(sig))
	}()
	err := run(ctx, os.Args[1:], os.Stdin, os.Stdout, os.Stderr)
	signal.Stop(sigs)
	os.Exit(exitCode(err, os.Stderr))
}

// signalCause is the cause of the context's end when a signal ended it.
type signalCause struct{ sig os.Signal }

func (c signalCause) Error() string { return c.sig.String() }

// signalStatus is the exit status for a program ended by sig: 128 plus the
// signal's number, as a shell reports a program the signal killed (130 for
// Ctrl-C, 143 for SIGTERM), so that scripts see the same either way.
func signalStatus(sig os.Signal) int {
	if s, ok := sig.(syscall.Signal); ok {
		return 128 + int(s)
	}
	return 1
}

// interrupted is the error of a command that ctx stopped while it was
// doing what: the exit status of the signal that ended ctx.
func interrupted(ctx context.Context, what string) error {
	code := 1
	var c signalCause
	if errors.As(context.Cause(ctx), &c) {
		code = signalStatus(c.sig)
	}
	return &exitError{code: code, msg: "interrupted " + what}
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
  gridloom render [flags] PLAN      draw or export a plan: -format svg, png, json, csv or asn1
  gridloom check [flags] PLAN       list the plan's findings: -format text or json, -strict
  gridloom ssb [flags] PLAN         list the GSCNs where the SS/PBCH block fits, with
                                    offsetToPointA and k_SSB: -band, -format table or json
  gridloom initial [flags] PLAN     list the GSCNs, controlResourceSetZero and searchSpaceZero
                                    that fit CORESET#0: -band, -format table or json
  gridloom prach [flags] PLAN       list the prach-ConfigurationIndex values whose occasions
                                    all fit the TDD pattern and SS/PBCH blocks: -format table or json
  gridloom timing PLAN              processing times, HARQ, latency, guard range, BWP
                                    switching and the numerology advice, as text tables
  gridloom version                  print the version and the 3GPP release it follows
  gridloom help                     print this text

PLAN is a JSON or YAML plan file, TS 38.331 value notation (.asn, .asn1),
or - for standard input. Flags may come before or after PLAN; after "--"
every argument is taken as a plan file.
Run "gridloom COMMAND -h" for the flags of a command.
`

// run is the whole program, so tests can run it with their own arguments and streams.
func run(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	cmd := "serve"
	if len(args) > 0 && args[0] != "" && args[0][0] != '-' {
		cmd, args = args[0], args[1:]
	} else if len(args) > 0 && (args[0] == "-version" || args[0] == "--version") {
		cmd, args = "version", args[1:]
	} else {
		// Flags alone, as in "gridloom -h", are the server's: the
		// default command's help also lists the commands.
		return runServe(ctx, args, stdout, stderr, true)
	}
	switch cmd {
	case "serve":
		return runServe(ctx, args, stdout, stderr, false)
	case "render":
		return runRender(ctx, args, stdin, stdout, stderr)
	case "check":
		return runCheck(ctx, args, stdin, stdout, stderr)
	case "version":
		return runVersion(args, stdout, stderr)
	case "ssb":
		return runSSB(ctx, args, stdin, stdout, stderr)
	case "initial":
		return runInitial(ctx, args, stdin, stdout, stderr)
	case "prach":
		return runPRACH(ctx, args, stdin, stdout, stderr)
	case "timing":
		return runTiming(ctx, args, stdin, stdout, stderr)
	case "help":
		fmt.Fprint(stdout, usage)
		return nil
	}
	fmt.Fprint(stderr, usage)
	return &exitError{code: 2, msg: fmt.Sprintf("unknown command %q; use serve, render, check, ssb, initial, prach, timing, version or help", cmd)}
}
