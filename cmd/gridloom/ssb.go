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

// runSSB lists the places on the synchronization raster where the plan's
// SS/PBCH block fits.
func runSSB(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("ssb", "[-band nBAND] [-format table|json] PLAN", stderr)
	band := fs.String("band", "", "operating `band` (such as n78): keep only its SS raster entries and take its SS/PBCH spacing when the plan has none; default the plan's carrier.band")
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
	found, err := grid.SSBPositions(p, *band)
	if err != nil {
		return &exitError{code: exitBadInput, msg: err.Error()}
	}
	if *format == "json" {
		doc := report.BuildSSBPositions(found)
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		return enc.Encode(doc)
	}
	where := ""
	if found.Band != "" {
		where = " of band " + found.Band
	}
	fmt.Fprintf(stdout, "%s: %s of %d kHz SS/PBCH blocks%s within %s (subCarrierSpacingCommon %d kHz)\n",
		displayName(path), count(len(found.Positions), "GSCN", "GSCNs"), found.SCSKHz, where, found.Within, found.ScsCommonKHz)
	if len(found.Positions) == 0 {
		return nil
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "GSCN\tSS_REF MHz\tabsoluteFrequencySSB\toffsetToPointA\tkSsb\tlow MHz\thigh MHz\t")
	mhz := func(f grid.Hz) string { return strconv.FormatFloat(f.MHz(), 'f', 3, 64) }
	for _, q := range found.Positions {
		fmt.Fprintf(tw, "%d\t%s\t%d\t%d\t%d\t%s\t%s\t\n", q.GSCN, mhz(q.SSRefHz), q.AbsoluteFrequencySSB, q.OffsetToPointA, q.KSSB, mhz(q.LowHz), mhz(q.HighHz))
	}
	return tw.Flush()
}
