package main

import (
	"context"
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"

	"gridloom/grid"
)

// runTiming prints the timing of a plan as text tables: what each
// partition's numerology buys in time, the guard against the cell range,
// the BWP switch delays and, with an environment, the numerology advice.
func runTiming(ctx context.Context, args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("timing", "PLAN", stderr)
	pos, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	p, _, err := readPlanArg(ctx, fs, pos, stdin, stderr)
	if err != nil {
		return err
	}
	res := grid.Compute(p)
	writeTiming(stdout, res)
	for _, f := range res.Findings {
		if f.Severity != grid.Info {
			fmt.Fprintln(stderr, f)
		}
	}
	if res.HasErrors() {
		return &exitError{code: exitPlanErrors, msg: "the plan has errors; the tables show what could be placed"}
	}
	return nil
}

func us(t float64) string { return fmt.Sprintf("%.1f", t*1e6/float64(grid.TcPerSecond)) }

func meanWorst(o *grid.OneWay) string {
	if o == nil {
		return "–"
	}
	return us(o.Mean) + " / " + us(float64(o.Worst))
}

func writeTiming(w io.Writer, r grid.Result) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(w, "Per partition (µs; latency is mean / worst over arrival times, 14-symbol slots, no retransmission):")
	fmt.Fprintln(tw, "partition\tkHz\tcap\tT_proc,1\tT_proc,2\tK1\tK2\tHARQ RTT min/mean/max\tDL latency\tUL latency\tDL 2-symbol\tUL 2-symbol\t")
	for _, l := range r.Partitions {
		t := l.Timing
		if t == nil {
			fmt.Fprintf(tw, "%s\t%d\t\t\t\t\t\t(below the TDD reference spacing)\t\t\t\t\t\n", l.Name, l.Numerology.SCSKHz())
			continue
		}
		k2 := "–"
		if t.K2Min >= 0 {
			k2 = fmt.Sprint(t.K2Min)
		}
		fmt.Fprintf(tw, "%s\t%d\t%d\t%s\t%s\t%d\t%s\t%s / %s / %s\t%s\t%s\t%s\t%s\t\n", l.Name, l.Numerology.SCSKHz(), t.Capability,
			us(float64(t.TProc1)), us(float64(t.TProc2)), t.K1Min, k2,
			us(float64(t.HARQMin)), us(t.HARQMean), us(float64(t.HARQMax)),
			meanWorst(t.Slot.DL), meanWorst(t.Slot.UL), meanWorst(t.MiniSlot[2].DL), meanWorst(t.MiniSlot[2].UL))
	}
	tw.Flush()
	if pt := r.Timing; pt != nil {
		fmt.Fprintf(w, "\nN_TA,offset %d Tc (%s µs), UE Rx-to-Tx switch %d Tc.\n", int64(pt.NTAOffset), us(float64(pt.NTAOffset)), int64(pt.RxTx))
		if pt.HasGuard {
			var scs []int
			for k := range pt.GuardSymbols {
				scs = append(scs, k)
			}
			slices.Sort(scs)
			var at []string
			for _, k := range scs {
				at = append(at, fmt.Sprintf("%d at %d kHz", pt.GuardSymbols[k], k))
			}
			fmt.Fprintf(w, "Guard %d Tc (%s µs; symbols: %s): the largest cell radius is %.2f km.\n", int64(pt.Guard), us(float64(pt.Guard)), strings.Join(at, ", "), pt.MaxCellRadiusM/1000)
		}
		if len(pt.BWPSwitch) > 0 {
			fmt.Fprintln(w, "\nBWP switch by DCI or timer (TS 38.133 Table 8.6.2-1), µs for delay type 1 / type 2:")
			for _, s := range pt.BWPSwitch {
				fmt.Fprintf(w, "  %s → %s: %s / %s\n", s.From, s.To, us(float64(s.Type1)), us(float64(s.Type2)))
			}
			fmt.Fprintf(w, "  by RRC (8.6.3): %s\n", us(float64(pt.BWPSwitchRRC)))
		}
	}
	if a := r.Advice; a != nil {
		fmt.Fprintln(w, "\nNumerology advice:")
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		for _, row := range a.Rows {
			var cs []string
			for _, c := range row.Criteria {
				cs = append(cs, fmt.Sprintf("%s %g %s", c.Name, c.Value, c.Verdict))
			}
			fmt.Fprintf(tw, "  %d kHz %s\t%s\t%s\n", row.SCSKHz, row.CP, row.Verdict, strings.Join(cs, ", "))
		}
		tw.Flush()
		fmt.Fprintln(w, "  "+a.Reason)
	}
	fmt.Fprintln(w, "\nLatency is an estimate of the air-interface part only; its assumptions are in the README and in the JSON (timing.latencyAssumptions).")
}
