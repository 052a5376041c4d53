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

// runInitial lists the pdcch-ConfigSIB1 values (controlResourceSetZero and
// searchSpaceZero) that fit the plan's SS/PBCH block, carrier and TDD
// pattern, best first; each row is a plan's initialAccess block ready to use.
// It exits 1 when none fits, like check on a plan with errors.
func runInitial(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("initial", "[-band nBAND] [-format table|json] PLAN", stderr)
	band := fs.String("band", "", "operating `band` (such as n78) whose SS raster entries the block may take; default the plan's carrier.band")
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
	if *band == "" {
		*band = p.Carrier.Band
	}
	found, err := grid.FindInitialAccess(p, *band)
	if err != nil {
		return &exitError{code: exitBadInput, msg: err.Error()}
	}
	ch := grid.Compute(p).Channel
	if *format == "json" {
		doc := report.BuildInitialOptions(found, ch)
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(doc); err != nil {
			return err
		}
		if len(doc.Options) == 0 {
			return &exitError{code: exitPlanErrors}
		}
		return nil
	}
	where := "the plan's SS/PBCH position"
	if found.Positions != 1 || found.Options == nil || found.Options[0].GSCN != 0 {
		where = count(found.Positions, "GSCN", "GSCNs")
		if found.Band != "" {
			where += " of band " + found.Band
		}
	}
	fmt.Fprintf(stdout, "%s: %s at %s for %d kHz SS/PBCH blocks with subCarrierSpacingCommon %d kHz (TS 38.213 Table %s), best first\n",
		displayName(path), count(len(found.Options), "combination", "combinations"), where, found.SSBSCSKHz, found.ScsCommonKHz, found.Table)
	if len(found.Options) == 0 {
		fmt.Fprintln(stdout, found.Why)
		return &exitError{code: exitPlanErrors}
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "GSCN\toffsetToPointA\tkSsb\tcontrolResourceSetZero\tsearchSpaceZero\tpdcch-ConfigSIB1\tpattern\tRBs\tsymbols\tCRBs\tlow kHz\thigh kHz\tclear of SSB\t")
	khz := func(f grid.Hz) string { return strconv.FormatFloat(f.KHz(), 'f', -1, 64) }
	for _, o := range found.Options {
		clear := "no"
		if o.ClearOfSSB {
			clear = "yes"
		}
		gscn := "-"
		if o.GSCN != 0 {
			gscn = strconv.Itoa(o.GSCN)
		}
		fmt.Fprintf(tw, "%s\t%d\t%d\t%d\t%d\t%d\t%d\t%d\t%d\t%d–%d\t%s\t%s\t%s\t\n", gscn, o.OffsetToPointA, o.KSSB, o.ControlResourceSetZero, o.SearchSpaceZero,
			o.PDCCHConfigSIB1, o.Pattern, o.NRB, o.Symbols, o.StartCRB, o.StartCRB+o.NRB-1, khz(o.Low), khz(o.High), clear)
	}
	return tw.Flush()
}
