package main

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"text/tabwriter"

	"gridloom/grid"
	"gridloom/grid/report"
)

// runPRACH lists the prach-ConfigurationIndex values whose occasions all
// fit the plan's TDD pattern and SS/PBCH blocks, grouped by preamble
// format. It exits 1 when none fits, like check on a plan with errors.
func runPRACH(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("prach", "[-format table|json] PLAN", stderr)
	format := fs.String("format", "table", "output `format`: table or json")
	pos, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	if err := checkFormat(*format, "table", "json"); err != nil {
		return err
	}
	p, path, err := readPlanArg(ctx, fs, pos, stdin, stderr)
	if err != nil {
		return err
	}
	found, err := grid.FindPRACH(p)
	if err != nil {
		return &exitError{code: exitBadInput, msg: err.Error()}
	}
	if *format == "json" {
		doc := report.BuildPRACHFinder(found)
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(doc); err != nil {
			return err
		}
		if doc.Count == 0 {
			return &exitError{code: exitPlanErrors}
		}
		return nil
	}
	fmt.Fprintf(stdout, "%s: %s of the %d of TS 38.211 Table %s fit: every occasion valid (TS 38.213 8.1), every SS/PBCH block mapped\n",
		displayName(path), count(found.Count(), "configuration index", "configuration indexes"), found.Tried, found.Table)
	if found.Count() == 0 {
		return &exitError{code: exitPlanErrors}
	}
	num := func(f float64) string { return strconv.FormatFloat(f, 'f', -1, 64) }
	for _, g := range found.Groups {
		fmt.Fprintf(stdout, "\nformat %s: %s\n", g.Format, count(len(g.Choices), "index", "indexes"))
		tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "index\tkHz\toccasions per 10 ms\tcell range km\tperiod ms\tassociation ms\tpattern ms\twarnings\t")
		for _, c := range g.Choices {
			fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%d\t%d\t%d\t%d\t\n", c.ConfigurationIndex, num(c.SCSKHz), num(c.OccasionsPer10ms),
				num(c.CellRangeKm), 10*c.ConfigPeriodFrames, 10*c.AssociationPeriodFrames, 10*c.AssociationPatternPeriodFrames, c.Warnings)
		}
		if err := tw.Flush(); err != nil {
			return err
		}
	}
	return nil
}
