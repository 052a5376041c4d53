package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
	"gridloom/render"
)

// Exit statuses of render and check.
const (
	exitPlanErrors = 1 // the plan has error findings
	exitBadInput   = 2 // the input could not be read or decoded, or bad usage
)

func newFlags(name, args string, stderr io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet("gridloom "+name, flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() {
		fmt.Fprintf(stderr, "Usage: gridloom %s %s\n", name, args)
		fs.PrintDefaults()
	}
	return fs
}

// parseFlags parses and turns -h and flag mistakes into exit statuses.
func parseFlags(fs *flag.FlagSet, args []string) error {
	if err := fs.Parse(args); err != nil {
		if err == flag.ErrHelp {
			return &exitError{code: 0}
		}
		return &exitError{code: exitBadInput}
	}
	return nil
}

// parseInterspersed parses flags before, between and after the
// positional arguments and returns those, so that "render plan.yaml
// -format json" does what it says: the flag package alone stops at the
// first argument that is not a flag and would leave -format to be taken
// for a second plan file. "--" ends the flags; every argument after it is
// positional, so a plan file whose name starts with "-" can still be given.
func parseInterspersed(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := parseFlags(fs, args); err != nil {
			return nil, err
		}
		rest := fs.Args()
		if n := len(args) - len(rest); n > 0 && args[n-1] == "--" {
			return append(pos, rest...), nil
		}
		if len(rest) == 0 {
			return pos, nil
		}
		pos, args = append(pos, rest[0]), rest[1:]
	}
}

// maxInput bounds what readPlan reads: a figure may carry a plan of
// planfile.MaxSize in base64 beside its drawing; the decoders refuse a
// plan file beyond planfile.MaxSize themselves, naming its size.
const maxInput = render.MaxSVGBytes

// readPlan reads and decodes the plan named by path, "-" for stdin, and
// writes the decoder's notes (what value notation skipped) to notes. It
// gives up when ctx ends: standard input (or a named pipe) may never
// deliver, and Ctrl-C must still end the program.
func readPlan(ctx context.Context, path string, stdin io.Reader, notes io.Writer) (grid.Plan, error) {
	type result struct {
		data []byte
		err  error
	}
	read := make(chan result, 1)
	go func() {
		var r result
		if path == "-" {
			r.data, r.err = io.ReadAll(io.LimitReader(stdin, maxInput+1))
		} else {
			r.data, r.err = readFileLimited(path)
		}
		read <- r
	}()
	var data []byte
	select {
	case r := <-read:
		if r.err != nil {
			return grid.Plan{}, &exitError{code: exitBadInput, msg: r.err.Error()}
		}
		data = r.data
	case <-ctx.Done():
		// The reading goroutine stays blocked; the program is about to exit.
		return grid.Plan{}, interrupted(ctx, "while reading "+displayName(path))
	}
	var err error
	if planfile.MayBeFigure(path, data) {
		// A figure gridloom exported carries its plan, as on the page.
		if data, err = render.PlanFromSVG(data); err != nil {
			return grid.Plan{}, &exitError{code: exitBadInput, msg: fmt.Sprintf("%s cannot be opened as a plan: %s.", displayName(path), strings.TrimSuffix(err.Error(), "."))}
		}
	}
	p, said, err := planfile.DecodeFile(path, data)
	for _, n := range said {
		fmt.Fprintf(notes, "%s: note: %s\n", displayName(path), n)
	}
	if err != nil {
		return grid.Plan{}, &exitError{code: exitBadInput, msg: fmt.Sprintf("%s: %v", displayName(path), err)}
	}
	return p, nil
}

func readFileLimited(path string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return io.ReadAll(io.LimitReader(f, maxInput+1))
}

func displayName(path string) string {
	if path == "-" {
		return "standard input"
	}
	return path
}

func onePlanArg(fs *flag.FlagSet, pos []string) (string, error) {
	if len(pos) != 1 {
		fs.Usage()
		msg := "give exactly one plan file, or - for standard input"
		if len(pos) > 1 {
			msg += fmt.Sprintf("; got %d: %s", len(pos), strings.Join(quoteAll(pos), " "))
		}
		return "", &exitError{code: exitBadInput, msg: msg}
	}
	return pos[0], nil
}

// readPlanArg takes the one plan argument of a command and reads it, with
// readPlan's notes going to notes.
func readPlanArg(ctx context.Context, fs *flag.FlagSet, pos []string, stdin io.Reader, notes io.Writer) (grid.Plan, string, error) {
	path, err := onePlanArg(fs, pos)
	if err != nil {
		return grid.Plan{}, "", err
	}
	p, err := readPlan(ctx, path, stdin, notes)
	return p, path, err
}

// checkFormat refuses a -format value that is not one of the command's.
func checkFormat(format string, allowed ...string) error {
	if slices.Contains(allowed, format) {
		return nil
	}
	return &exitError{code: exitBadInput, msg: fmt.Sprintf("-format %q is not a format; use %s", format, grid.JoinOr(allowed))}
}

func quoteAll(ss []string) []string {
	q := make([]string, len(ss))
	for i, s := range ss {
		q[i] = strconv.Quote(s)
	}
	return q
}

func runCheck(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("check", "[-format text|json] [-strict] PLAN", stderr)
	format := fs.String("format", "text", "output `format`: text (one finding a line and a summary) or json (an object whose \"findings\" are those of render -format json)")
	strict := fs.Bool("strict", false, "exit 1 on warnings as well as errors, for CI")
	pos, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	if *format != "text" && *format != "json" {
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("-format %q is not a format of check; use text or json", *format)}
	}
	p, path, err := readPlanArg(ctx, fs, pos, stdin, stdout)
	if err != nil {
		return err
	}
	res := grid.Compute(p)
	errs, warns := 0, 0
	for _, f := range res.Findings {
		switch f.Severity {
		case grid.Error:
			errs++
		case grid.Warning:
			warns++
		}
	}
	if *format == "json" {
		if err := writeFindingsJSON(stdout, res); err != nil {
			return &exitError{code: exitBadInput, msg: err.Error()}
		}
	} else {
		for _, f := range res.Findings {
			fmt.Fprintln(stdout, f)
		}
		fmt.Fprintf(stdout, "%s: %s, %s, %s placed\n", displayName(path),
			count(errs, "error", "errors"), count(warns, "warning", "warnings"), count(len(res.Partitions), "partition", "partitions"))
	}
	switch {
	case errs > 0:
		return &exitError{code: exitPlanErrors}
	case *strict && warns > 0:
		return &exitError{code: exitPlanErrors, msg: fmt.Sprintf("%s: -strict fails on %s", displayName(path), count(warns, "warning", "warnings"))}
	}
	return nil
}

func runRender(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("render", "[-format svg|png|json|csv|asn1] [-o FILE] [figure flags] PLAN", stderr)
	format := fs.String("format", "svg", "output `format`: svg or png (the figure), json (lattice, summary and findings), csv (one row per symbol) or asn1 (TS 38.331 value notation)")
	out := fs.String("o", "-", "write to `FILE` instead of standard output")
	width := fs.Int("width", 0, fmt.Sprintf("figure width in px, %d to %d (0 for %d)", render.MinWidth, render.MaxWidth, render.DefaultWidth))
	theme := fs.String("theme", "light", "figure `theme`: light, or print (greyscale-safe)")
	layers := fs.String("layers", "all", "figure `layers` to show, a comma list of "+strings.Join(render.LayerNames(), ", ")+", or all or none")
	caption := fs.String("caption", "", "a caption `line` under the figure; empty for the plan's name, - for none")
	preset := fs.String("preset", "", "lay the figure out for `paper`: "+strings.Join(render.PresetNames(), ", ")+" (a least type size at the printed width), or none")
	timeUnit := fs.String("timeunit", "auto", "the time axis's `unit`: auto (µs up to 2 ms, ms beyond), us or ms")
	scale := fs.Int("scale", 1, fmt.Sprintf("PNG pixels per figure px, 1 to %d", render.MaxPNGScale))
	dpi := fs.Int("dpi", 0, fmt.Sprintf("PNG resolution in dots per inch for its pHYs chunk, %d to %d (0 for none); with -preset and no -width it also sets the width", render.MinDPI, render.MaxDPI))
	pos, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	switch *format {
	case "svg", "png", "json", "csv", "asn1":
	default:
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("-format %q is not a format; use svg, png, json, csv or asn1", *format)}
	}
	opt := render.Options{Width: *width}
	if opt.Theme, err = render.ParseTheme(*theme); err != nil {
		return &exitError{code: exitBadInput, msg: "-theme: " + err.Error()}
	}
	if opt.Layers, err = render.ParseLayers(*layers); err != nil {
		return &exitError{code: exitBadInput, msg: "-" + err.Error()}
	}
	if pr, err := render.ParsePreset(*preset); err != nil {
		return &exitError{code: exitBadInput, msg: "-" + err.Error()}
	} else if pr != nil {
		opt.Preset = *pr
	}
	if opt.TimeUnit, err = render.ParseTimeUnit(*timeUnit); err != nil {
		return &exitError{code: exitBadInput, msg: "-timeunit: " + err.Error()}
	}
	if *scale < 1 || *scale > render.MaxPNGScale {
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("-scale %d is outside 1 to %d", *scale, render.MaxPNGScale)}
	}
	opt.PNGScale = *scale
	if *dpi != 0 && (*dpi < render.MinDPI || *dpi > render.MaxDPI) {
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("-dpi %d is outside %d to %d; give 0 for none", *dpi, render.MinDPI, render.MaxDPI)}
	}
	opt.DPI = *dpi
	p, _, err := readPlanArg(ctx, fs, pos, stdin, stderr)
	if err != nil {
		return err
	}
	var asn1 []byte
	if *format == "asn1" {
		// An export is for a checked plan: Encode refuses one with errors,
		// before an output file is created.
		if asn1, err = rrc.Encode(p); err != nil {
			return &exitError{code: exitPlanErrors, msg: err.Error()}
		}
	}
	res := grid.Compute(p)
	switch c := strings.TrimSpace(*caption); c {
	case "-":
	case "":
		opt.Caption = truncateRunes(strings.TrimSpace(p.Name), render.MaxCaption)
	default:
		opt.Caption = c
	}
	// The figure carries the plan, so a saved figure opens again as the plan.
	if opt.Plan, err = planfile.EncodeJSON(p); err != nil {
		return err
	}

	w := stdout
	var file *os.File
	if *out != "-" {
		if file, err = os.Create(*out); err != nil {
			return &exitError{code: exitBadInput, msg: err.Error()}
		}
		w = file
	}
	switch *format {
	case "svg":
		err = render.Figure(w, res, opt)
	case "png":
		err = render.FigurePNG(w, res, opt)
	case "csv":
		err = render.SymbolCSV(w, res)
	case "json":
		err = writeJSON(w, res)
	case "asn1":
		_, err = w.Write(asn1)
	}
	if file != nil {
		if cerr := file.Close(); err == nil {
			err = cerr
		}
	}
	if se := (*render.PNGSizeError)(nil); errors.As(err, &se) {
		return &exitError{code: exitBadInput, msg: "the PNG cannot be drawn that large (" + se.Size() + "); -width, -scale and -dpi set its size"}
	}
	if err != nil {
		return &exitError{code: exitBadInput, msg: err.Error()}
	}
	for _, f := range res.Findings {
		if f.Severity != grid.Info {
			fmt.Fprintln(stderr, f)
		}
	}
	if res.HasErrors() {
		return &exitError{code: exitPlanErrors, msg: "the plan has errors; the output shows what could be placed"}
	}
	return nil
}

// truncateRunes cuts s to at most n characters.
func truncateRunes(s string, n int) string {
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	return string([]rune(s)[:n])
}

// count says n things: "1 error", "2 errors".
func count(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}
