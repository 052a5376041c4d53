package web

import (
	"fmt"
	"maps"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
)

// The timing section of the results (issue 17), built from grid.Result:
// what each partition's numerology buys in time, the BWP switching
// matrix, and the numerology advice. It stands apart from resultsview.go
// (which only calls timingOf), so the two files do not use each other.

// timingCaveat heads the section: every latency is an estimate of the
// air-interface part only.
const timingCaveat = "Every latency here is an estimate of the air-interface part only: no core network, no queueing, no scheduling request. The assumptions are listed below."

type timingView struct {
	Facts       []timingFact
	Parts       []timingPartRow
	Latency     []latencyRow
	Switch      *switchMatrix
	Assumptions []string
	Advice      *adviceView
}

type timingFact struct{ Label, Value, TestID string }

type timingPartRow struct {
	Name, Numerology, Cap, DMRS string
	TProc1, TProc2              string // µs
	K1, K2                      string // least on the pattern (and on the lattice)
	HARQ, ULHARQ                string // min / mean / max µs
	Guard, TA                   string
}

// latencyRow is one partition at one granularity (slot or mini-slot).
type latencyRow struct {
	Name, Unit                           string
	DLMean, DLWorst, ULMean, ULWorst     string
	DLMeanH, DLWorstH, ULMeanH, ULWorstH string
	First                                bool // the first row of its partition
	Span                                 int  // rows of its partition, on the first
}

// switchMatrix is the BWP switching delay between partitions: rows from,
// columns to; each cell type 1 and type 2 in µs.
type switchMatrix struct {
	Names []string
	Cells [][]switchCell
	RRC   string
}

type switchCell struct {
	Type1, Type2 string
	Self, None   bool
}

type adviceView struct {
	Criteria   []string // names, the columns
	Rules      []string // each column's rule in words
	Rows       []adviceRowView
	Chosen     string // "30 kHz normal CP", or "" when none suits
	Reason     string
	Capability string
	Caution    string
}

type adviceRowView struct {
	Numerology, Verdict   string
	Cells                 []adviceCell
	LatencyDL, LatencyUL  string // slot, mean / worst µs
	MiniSlot2             string // DL and UL worst µs with 2-symbol mini-slots
	GuardRadius, TARadius string // km
	Note                  string
	Chosen                bool
}

type adviceCell struct{ Value, Verdict string }

// tcUs writes a duration in Tc as µs with three decimals.
func tcUs(t float64) string {
	return strconv.FormatFloat(t*1e6/float64(grid.TcPerSecond), 'f', 3, 64)
}

func km(m float64) string { return strconv.FormatFloat(m/1000, 'f', 3, 64) }

// timingOf is the timing section of a result, or nil when the plan has no
// timing (a TDD pattern that Compute refused, or nothing placed).
func timingOf(res grid.Result) *timingView {
	pt := res.Timing
	if pt == nil {
		return nil
	}
	tv := &timingView{Assumptions: grid.LatencyAssumptions, Advice: adviceOf(res)}
	tv.Facts = append(tv.Facts,
		timingFact{"N_TA,offset (TS 38.133 Table 7.1.2-2)", fmt.Sprintf("%d Tc = %s µs", pt.NTAOffset, tcUs(float64(pt.NTAOffset))), "nta"},
		timingFact{"UE Rx-to-Tx switch N_Rx-Tx (TS 38.211 Table 4.3.2-3)", fmt.Sprintf("%d Tc = %s µs", pt.RxTx, tcUs(float64(pt.RxTx))), "rxtx"})
	if pt.HasGuard {
		var syms []string
		for _, scs := range slices.Sorted(maps.Keys(pt.GuardSymbols)) {
			syms = append(syms, fmt.Sprintf("%d symbols at %d kHz", pt.GuardSymbols[scs], scs))
		}
		g := fmt.Sprintf("%s µs", tcUs(float64(pt.Guard)))
		if len(syms) > 0 {
			g += " (" + strings.Join(syms, ", ") + ")"
		}
		tv.Facts = append(tv.Facts,
			timingFact{"Shortest downlink-to-uplink guard", g, "guard"},
			timingFact{"Largest cell radius the guard allows", km(pt.MaxCellRadiusM) + " km", "max-radius"})
	} else {
		tv.Facts = append(tv.Facts, timingFact{"Guard period", "none: the plan has no downlink-to-uplink turn (FDD or no TDD pattern)", "guard"})
	}
	if e := res.Plan.Environment; e != nil {
		if e.CellRadiusKm > 0 {
			tv.Facts = append(tv.Facts, timingFact{"Cell radius (environment.cellRadiusKm)", strconv.FormatFloat(e.CellRadiusKm, 'f', -1, 64) + " km", "radius"})
		}
		if e.LatencyTargetMs > 0 {
			tv.Facts = append(tv.Facts, timingFact{"Latency target (environment.latencyTargetMs)", strconv.FormatFloat(e.LatencyTargetMs, 'f', -1, 64) + " ms", "target"})
		}
	}
	tdd := res.TDD != nil
	for _, l := range res.Partitions {
		t := l.Timing
		if t == nil {
			continue
		}
		row := timingPartRow{Name: l.Name, Numerology: fmt.Sprintf("%d kHz %s", l.Numerology.SCSKHz(), l.Numerology.CP),
			Cap: strconv.Itoa(t.Capability), DMRS: t.DMRS,
			TProc1: tcUs(float64(t.TProc1)), TProc2: tcUs(float64(t.TProc2)),
			K1: strconv.Itoa(t.K1Min), K2: "no uplink slot",
			HARQ:   spread(float64(t.HARQMin), t.HARQMean, float64(t.HARQMax)),
			ULHARQ: "no uplink slot",
			TA:     fmt.Sprintf("%s µs, %s km", tcUs(float64(t.TimingAdvance)), km(t.TimingAdvanceRadiusM)),
			Guard:  "—",
		}
		if t.K2Min >= 0 {
			row.K2 = strconv.Itoa(t.K2Min)
		}
		if tdd {
			row.K1 += fmt.Sprintf(" (lattice %d)", t.K1Lattice)
			row.K2 += fmt.Sprintf(" (lattice %d)", t.K2Lattice)
			if pt.HasGuard {
				row.Guard = strconv.Itoa(t.GuardSymbols) + " symbols"
			}
		}
		if t.HasULHARQ {
			row.ULHARQ = spread(float64(t.ULHARQMin), t.ULHARQMean, float64(t.ULHARQMax))
		}
		tv.Parts = append(tv.Parts, row)
		rows := []latencyRow{latencyOf(l.Name, "slot (14 symbols)", t.Slot)}
		for _, n := range []int{7, 4, 2} {
			if m, ok := t.MiniSlot[n]; ok {
				rows = append(rows, latencyOf(l.Name, fmt.Sprintf("mini-slot of %d", n), m))
			}
		}
		rows[0].First, rows[0].Span = true, len(rows)
		tv.Latency = append(tv.Latency, rows...)
	}
	tv.Switch = switchOf(res, pt)
	return tv
}

func spread(lo, mean, hi float64) string {
	return tcUs(lo) + " / " + tcUs(mean) + " / " + tcUs(hi)
}

func latencyOf(name, unit string, l grid.Latencies) latencyRow {
	r := latencyRow{Name: name, Unit: unit}
	none := "no run"
	r.DLMean, r.DLWorst, r.DLMeanH, r.DLWorstH = none, none, none, none
	r.ULMean, r.ULWorst, r.ULMeanH, r.ULWorstH = none, none, none, none
	if d := l.DL; d != nil {
		r.DLMean, r.DLWorst, r.DLMeanH, r.DLWorstH = tcUs(d.Mean), tcUs(float64(d.Worst)), tcUs(d.MeanWithHARQ), tcUs(float64(d.WorstWithHARQ))
	}
	if u := l.UL; u != nil {
		r.ULMean, r.ULWorst, r.ULMeanH, r.ULWorstH = tcUs(u.Mean), tcUs(float64(u.Worst)), tcUs(u.MeanWithHARQ), tcUs(float64(u.WorstWithHARQ))
	}
	return r
}

// switchOf is the switching matrix over the placed partitions, or nil with
// fewer than two.
func switchOf(res grid.Result, pt *grid.PlanTiming) *switchMatrix {
	if len(res.Partitions) < 2 {
		return nil
	}
	m := &switchMatrix{RRC: tcUs(float64(pt.BWPSwitchRRC))}
	for _, l := range res.Partitions {
		m.Names = append(m.Names, l.Name)
	}
	for i, from := range m.Names {
		row := make([]switchCell, len(m.Names))
		for j, to := range m.Names {
			switch k := slices.IndexFunc(pt.BWPSwitch, func(s grid.BWPSwitch) bool { return s.From == from && s.To == to }); {
			case i == j:
				row[j].Self = true
			case k < 0:
				row[j].None = true
			default:
				row[j].Type1, row[j].Type2 = tcUs(float64(pt.BWPSwitch[k].Type1)), tcUs(float64(pt.BWPSwitch[k].Type2))
			}
		}
		m.Cells = append(m.Cells, row)
	}
	return m
}

// adviceOf is the numerology advice's table, or nil without one.
func adviceOf(res grid.Result) *adviceView {
	a := res.Advice
	if a == nil {
		return nil
	}
	av := &adviceView{Reason: a.Reason, Caution: a.Caution, Capability: strconv.Itoa(a.Capability)}
	if a.Chosen != nil {
		av.Chosen = fmt.Sprintf("%d kHz %s CP", a.Chosen.SCSKHz, a.Chosen.CP)
	}
	for _, r := range a.Rows {
		for _, c := range r.Criteria {
			if !slices.Contains(av.Criteria, c.Name) {
				av.Criteria = append(av.Criteria, c.Name)
				av.Rules = append(av.Rules, c.Rule)
			}
		}
	}
	for _, r := range a.Rows {
		row := adviceRowView{Numerology: fmt.Sprintf("%d kHz %s CP", r.SCSKHz, r.CP), Verdict: string(r.Verdict), Note: r.Note,
			TARadius: strconv.FormatFloat(r.TimingAdvanceKm, 'f', 3, 64), GuardRadius: "—", LatencyDL: "—", LatencyUL: "—", MiniSlot2: "—"}
		row.Chosen = a.Chosen != nil && a.Chosen.SCSKHz == r.SCSKHz && a.Chosen.CP == r.CP
		if r.MaxCellRadiusKm != nil {
			row.GuardRadius = strconv.FormatFloat(*r.MaxCellRadiusKm, 'f', 3, 64)
		}
		if l := r.LatencyUs; l != nil {
			row.LatencyDL, row.LatencyUL = meanWorst(l.DL), meanWorst(l.UL)
		}
		if l := r.MiniSlot2Us; l != nil {
			row.MiniSlot2 = meanWorst(l.DL) + " · " + meanWorst(l.UL)
		}
		for _, name := range av.Criteria {
			cell := adviceCell{Value: "—", Verdict: "none"}
			if k := slices.IndexFunc(r.Criteria, func(c grid.Criterion) bool { return c.Name == name }); k >= 0 {
				c := r.Criteria[k]
				cell = adviceCell{Value: strconv.FormatFloat(c.Value, 'g', 3, 64), Verdict: string(c.Verdict)}
			}
			row.Cells = append(row.Cells, cell)
		}
		av.Rows = append(av.Rows, row)
	}
	return av
}

func meanWorst(m grid.MeanWorst) string {
	return strconv.FormatFloat(m.Mean, 'f', 1, 64) + " / " + strconv.FormatFloat(m.Worst, 'f', 1, 64)
}

func itoa(n int) string { return strconv.Itoa(n) }

func boolAttr(b bool) string { return strconv.FormatBool(b) }
