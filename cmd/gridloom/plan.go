package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
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

// readPlan reads and decodes the plan named by path, "-" for stdin, and
// writes the decoder's notes (what value notation skipped) to notes.
func readPlan(path string, stdin io.Reader, notes io.Writer) (grid.Plan, error) {
	var data []byte
	var err error
	if path == "-" {
		data, err = io.ReadAll(io.LimitReader(stdin, planfile.MaxSize+1))
	} else {
		data, err = readFileLimited(path)
	}
	if err != nil {
		return grid.Plan{}, &exitError{code: exitBadInput, msg: err.Error()}
	}
	var p grid.Plan
	var said []string
	switch strings.ToLower(filepath.Ext(path)) {
	case ".json":
		p, err = planfile.DecodeJSON(data)
	case ".yaml", ".yml":
		p, err = planfile.DecodeYAML(data)
	case ".asn", ".asn1":
		p, said, err = planfile.DecodeValueNotation(data)
	default:
		p, said, err = planfile.DecodeNotes(data)
	}
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
	return io.ReadAll(io.LimitReader(f, planfile.MaxSize+1))
}

func displayName(path string) string {
	if path == "-" {
		return "standard input"
	}
	return path
}

func onePlanArg(fs *flag.FlagSet) (string, error) {
	if fs.NArg() != 1 {
		fs.Usage()
		return "", &exitError{code: exitBadInput, msg: "give exactly one plan file, or - for standard input"}
	}
	return fs.Arg(0), nil
}

func runCheck(args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("check", "PLAN", stderr)
	if err := parseFlags(fs, args); err != nil {
		return err
	}
	path, err := onePlanArg(fs)
	if err != nil {
		return err
	}
	p, err := readPlan(path, stdin, stdout)
	if err != nil {
		return err
	}
	res := grid.Compute(p)
	errs, warns := 0, 0
	for _, f := range res.Findings {
		fmt.Fprintln(stdout, f)
		switch f.Severity {
		case grid.Error:
			errs++
		case grid.Warning:
			warns++
		}
	}
	fmt.Fprintf(stdout, "%s: %s, %s, %s placed\n", displayName(path),
		count(errs, "error", "errors"), count(warns, "warning", "warnings"), count(len(res.Partitions), "partition", "partitions"))
	if errs > 0 {
		return &exitError{code: exitPlanErrors}
	}
	return nil
}

func runRender(args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("render", "[-format svg|png|json|csv|asn1] [-o FILE] [figure flags] PLAN", stderr)
	format := fs.String("format", "svg", "output `format`: svg or png (the figure), json (lattice, summary and findings), csv (one row per symbol) or asn1 (TS 38.331 value notation)")
	out := fs.String("o", "-", "write to `FILE` instead of standard output")
	width := fs.Int("width", 0, fmt.Sprintf("figure width in px, %d to %d (0 for %d)", render.MinWidth, render.MaxWidth, render.DefaultWidth))
	theme := fs.String("theme", "light", "figure `theme`: light, or print (greyscale-safe)")
	layers := fs.String("layers", "all", "figure `layers` to show, a comma list of "+strings.Join(render.LayerNames(), ", ")+", or all or none")
	caption := fs.String("caption", "", "a caption `line` under the figure; empty for the plan's name, - for none")
	if err := parseFlags(fs, args); err != nil {
		return err
	}
	switch *format {
	case "svg", "png", "json", "csv", "asn1":
	default:
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("-format %q is not a format; use svg, png, json, csv or asn1", *format)}
	}
	opt := render.Options{Width: *width}
	var err error
	if opt.Theme, err = render.ParseTheme(*theme); err != nil {
		return &exitError{code: exitBadInput, msg: "-theme: " + err.Error()}
	}
	if opt.Layers, err = render.ParseLayers(*layers); err != nil {
		return &exitError{code: exitBadInput, msg: "-" + err.Error()}
	}
	path, err := onePlanArg(fs)
	if err != nil {
		return err
	}
	p, err := readPlan(path, stdin, stderr)
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
