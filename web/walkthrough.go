package web

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/web/planform"
)

// WalkStep is one step of a walkthrough: a title, two or three sentences
// of narration made from the plan's own numbers, and the parts of the
// figure it highlights (the others are dimmed).
type WalkStep struct {
	Key       string // stable name of the step: "channel", "grids", "part-0", "align", "tdd", "timing", "switch", "ssb", "band", "initial", "prach", "findings"
	Title     string
	Narration []string
	Highlight []string // figure targets: "channel", "guards", "carriers", "part:I", "align", "longcp", "tdd", "ssb", "raster", "coreset0", "prach"
}

// Walkthrough turns a computed plan into the steps an engineer would walk
// a team through: the channel and its guardbands, point A and the CRB
// grids, each partition, the half-millisecond alignment, the TDD pattern
// and the SS/PBCH blocks when the plan has them, and the findings.
func Walkthrough(res grid.Result) []WalkStep {
	var steps []WalkStep
	steps = append(steps, channelStep(res))
	if len(res.Carriers) > 0 {
		steps = append(steps, gridsStep(res))
	}
	for i, l := range res.Partitions {
		steps = append(steps, partitionStep(res, i, l))
	}
	if len(res.Partitions) > 0 {
		steps = append(steps, alignStep(res))
	}
	if res.TDD != nil {
		steps = append(steps, tddStep(res))
	}
	if st, ok := timingStep(res); ok {
		steps = append(steps, st)
	}
	if st, ok := switchStep(res); ok {
		steps = append(steps, st)
	}
	if res.SSB != nil {
		steps = append(steps, ssbStep(res))
	}
	if res.SyncRaster != nil {
		steps = append(steps, bandStep(res))
	}
	if res.InitialAccess != nil {
		steps = append(steps, initialStep(res))
	}
	if res.PRACH != nil {
		steps = append(steps, prachStep(res))
	}
	steps = append(steps, findingsStep(res))
	return steps
}

func num(f float64) string { return strconv.FormatFloat(f, 'f', -1, 64) }

// kHz writes a frequency in kHz, or in MHz from 10 MHz up, as an engineer
// would say it.
func kHz(f grid.Hz) string {
	if f >= 10e6 || f <= -10e6 {
		return num(float64(f)/1e6) + " MHz"
	}
	return num(f.KHz()) + " kHz"
}

func microseconds(d grid.Tc) string { return strconv.FormatFloat(d.Micros(), 'f', 2, 64) + " µs" }

func channelStep(res grid.Result) WalkStep {
	ch := res.Channel
	s := WalkStep{Key: "channel", Title: "The channel and its guardbands", Highlight: []string{"channel", "guards"}}
	where := "its position is given relative to point A only"
	if ch.Absolute {
		where = fmt.Sprintf("centred on %s MHz", strconv.FormatFloat(ch.CenterHz.MHz(), 'f', 3, 64))
		if ch.OnRaster {
			where += fmt.Sprintf(" (NR-ARFCN %d)", ch.ARFCN)
		}
	}
	s.Narration = append(s.Narration, fmt.Sprintf("The channel is %d MHz of %s, %s.", ch.BandwidthMHz, ch.Range, where))
	for _, c := range res.Carriers {
		s.Narration = append(s.Narration, fmt.Sprintf("At %d kHz it holds N_RB = %d PRBs; the carrier leaves %s below and %s above, against a minimum guardband of %s.",
			c.SCSKHz, c.NRB, kHz(c.GuardLow), kHz(c.GuardHigh), kHz(c.MinGuard)))
	}
	s.Narration = append(s.Narration, fmt.Sprintf("The partitions use %s%% of the channel.", num(ch.UsePercent)))
	return s
}

func gridsStep(res grid.Result) WalkStep {
	ch := res.Channel
	s := WalkStep{Key: "grids", Title: "Point A and the CRB grids", Highlight: []string{"carriers", "channel"}}
	pa := "Point A is the frequency from which every CRB grid counts"
	if ch.Absolute {
		pa += fmt.Sprintf("; here it is %s MHz", strconv.FormatFloat(ch.PointAHz.MHz(), 'f', 3, 64))
		if ch.PointAOnRaster {
			pa += fmt.Sprintf(" (absoluteFrequencyPointA %d)", ch.PointAARFCN)
		}
	}
	s.Narration = append(s.Narration, pa+".")
	var parts []string
	for _, c := range res.Carriers {
		how := ""
		if c.Chosen {
			how = ", chosen by gridloom"
		}
		parts = append(parts, fmt.Sprintf("%d kHz starts at CRB %d%s and spans %d PRBs", c.SCSKHz, c.OffsetToCarrier, how, c.CarrierBandwidth))
	}
	s.Narration = append(s.Narration, "Each subcarrier spacing has its own carrier: "+strings.Join(parts, "; ")+".")
	if len(res.Carriers) > 1 {
		a, b := res.Carriers[0].SCSKHz, res.Carriers[1].SCSKHz
		s.Narration = append(s.Narration, fmt.Sprintf("Subcarrier 0 of CRB 0 sits on point A for every spacing, so the CRB edges of %d and %d kHz are offset by half a subcarrier and never coincide.", a, b))
	}
	return s
}

func partitionStep(res grid.Result, i int, l grid.Lattice) WalkStep {
	n := l.Numerology
	s := WalkStep{Key: fmt.Sprintf("part-%d", i), Title: fmt.Sprintf("Partition %s", l.Name), Highlight: []string{fmt.Sprintf("part:%d", i)}}
	s.Narration = append(s.Narration, fmt.Sprintf("%s uses %d kHz (μ = %d, %s CP): %d slots per millisecond of %d symbols, each a %s useful symbol with a %s cyclic prefix (%s at each half millisecond).",
		l.Name, n.SCSKHz(), n.Mu, n.CP, n.SlotsPerSubframe(), n.SymbolsPerSlot(), microseconds(n.UsefulTc()), microseconds(n.CPTc(1)), microseconds(n.CPTc(0))))
	riv := "which no locationAndBandwidth can express"
	if l.LocationAndBandwidth >= 0 {
		riv = fmt.Sprintf("locationAndBandwidth %d", l.LocationAndBandwidth)
	}
	where := fmt.Sprintf("%s to %s from point A", kHz(l.Low), kHz(l.High))
	if res.Channel.Absolute {
		where = fmt.Sprintf("%s to %s MHz", strconv.FormatFloat(res.Channel.Abs(l.Low).MHz(), 'f', 4, 64), strconv.FormatFloat(res.Channel.Abs(l.High).MHz(), 'f', 4, 64))
	}
	s.Narration = append(s.Narration, fmt.Sprintf("It takes CRBs %d to %d, %d PRBs or %s MHz, %s; %s.",
		l.StartCRB, l.StartCRB+l.SizePRB-1, l.SizePRB, num(l.Width().MHz()), where, riv))
	rate := fmt.Sprintf("At %s on %s it carries about %s Mb/s %s", l.Modulation, plural(l.Layers, "layer", "layers"), strconv.FormatFloat(l.PeakMbps, 'f', 0, 64), l.Direction)
	if res.TDD != nil && l.Dirs != nil {
		rate += fmt.Sprintf(", on the %s%% of its symbols the TDD pattern gives that direction", strconv.FormatFloat(l.Share*100, 'f', 0, 64))
	}
	s.Narration = append(s.Narration, rate+" (TS 38.306 4.1.2).")
	return s
}

func alignStep(res grid.Result) WalkStep {
	s := WalkStep{Key: "align", Title: "Every numerology meets every half millisecond", Highlight: []string{"align", "longcp"}}
	var counts []string
	seen := map[int]bool{}
	for _, l := range res.Partitions {
		n := l.Numerology
		if seen[n.SCSKHz()*10+int(n.CP)] {
			continue
		}
		seen[n.SCSKHz()*10+int(n.CP)] = true
		counts = append(counts, fmt.Sprintf("%d symbols of %d kHz", n.SymbolsPerSubframe()/2, n.SCSKHz()))
	}
	s.Narration = append(s.Narration, fmt.Sprintf("In each half millisecond fit exactly %s, so all partitions start a symbol together %d times in the %d ms shown.",
		strings.Join(counts, ", "), 2*res.Partitions[0].SpanMs, res.Partitions[0].SpanMs))
	s.Narration = append(s.Narration, "It works because the first symbol of each half millisecond has a cyclic prefix 16κ = 1024 Tc (0.52 µs) longer than the others, in every numerology with normal CP (TS 38.211 5.3.1).")
	return s
}

func tddStep(res grid.Result) WalkStep {
	t := res.TDD
	s := WalkStep{Key: "tdd", Title: "The TDD pattern", Highlight: []string{"tdd"}}
	ms := float64(t.Period) / float64(grid.TcPerSubframe)
	d, u, f := 0, 0, 0
	for _, x := range t.RefDirs {
		switch x {
		case grid.Downlink:
			d++
		case grid.Uplink:
			u++
		default:
			f++
		}
	}
	s.Narration = append(s.Narration, fmt.Sprintf("The pattern %s repeats every %s ms on %d kHz slots: %d downlink, %d flexible and %d uplink symbols of %d.",
		t.SlotString(), num(ms), t.Reference.SCSKHz(), d, f, u, len(t.RefDirs)))
	s.Narration = append(s.Narration, "Each partition's symbols take the direction of the reference symbols they overlap in time, and its rate estimate counts only the symbols in its own direction.")
	return s
}

// timingStep tells what each numerology in use buys in time (issue 17):
// processing, HARQ round trip, the latency of a slot, and the guard's
// range; false when the plan has no timing.
func timingStep(res grid.Result) (WalkStep, bool) {
	pt := res.Timing
	if pt == nil || len(res.Partitions) == 0 {
		return WalkStep{}, false
	}
	s := WalkStep{Key: "timing", Title: "What each numerology buys in time"}
	if res.TDD != nil {
		s.Highlight = append(s.Highlight, "tdd")
	}
	seen := map[string]bool{}
	for i, l := range res.Partitions {
		t, n := l.Timing, l.Numerology
		if t == nil {
			continue
		}
		key := fmt.Sprintf("%d %s %d %s", n.SCSKHz(), n.CP, t.Capability, t.DMRS)
		if seen[key] {
			continue
		}
		seen[key] = true
		s.Highlight = append(s.Highlight, fmt.Sprintf("part:%d", i))
		line := fmt.Sprintf("At %d kHz (%s) the UE needs T_proc,1 = %s to acknowledge a PDSCH and T_proc,2 = %s to prepare a PUSCH (TS 38.214 5.3, 6.4); a downlink HARQ round trip takes %s to %s",
			n.SCSKHz(), l.Name, microseconds(t.TProc1), microseconds(t.TProc2), microseconds(t.HARQMin), microseconds(t.HARQMax))
		if d, u := t.Slot.DL, t.Slot.UL; d != nil && u != nil {
			line += fmt.Sprintf(", and a packet waits and travels %s on average downlink (%s at worst), %s uplink (%s at worst)",
				microseconds(grid.Tc(d.Mean)), microseconds(d.Worst), microseconds(grid.Tc(u.Mean)), microseconds(u.Worst))
		}
		s.Narration = append(s.Narration, line+".")
	}
	if pt.HasGuard {
		s.Narration = append(s.Narration, fmt.Sprintf("The shortest downlink-to-uplink guard is %s; after N_TA,offset and the UE's switch from receiving to sending it covers a cell of %s km.",
			microseconds(pt.Guard), strconv.FormatFloat(pt.MaxCellRadiusM/1000, 'f', 2, 64)))
	}
	s.Narration = append(s.Narration, "These latencies are an estimate of the air-interface part only; the results list every assumption behind them.")
	return s, true
}

// switchStep walks through switching a UE from the first partition to the
// first after it of another numerology, with the delays of the switching
// matrix; false when the plan has no such pair in the matrix.
func switchStep(res grid.Result) (WalkStep, bool) {
	pt := res.Timing
	if pt == nil || len(res.Partitions) < 2 {
		return WalkStep{}, false
	}
	a := res.Partitions[0]
	for j, b := range res.Partitions[1:] {
		if a.Numerology == b.Numerology {
			continue
		}
		for _, sw := range pt.BWPSwitch {
			if sw.From != a.Name || sw.To != b.Name {
				continue
			}
			s := WalkStep{Key: "switch", Title: fmt.Sprintf("Switching from %s to %s", a.Name, b.Name),
				Highlight: []string{"part:0", fmt.Sprintf("part:%d", 1+j)}}
			s.Narration = append(s.Narration,
				fmt.Sprintf("A UE moved from %s (%d kHz) to %s (%d kHz) by DCI or by the inactivity timer is off the air for %s if it reports delay type 1 and %s if type 2 (TS 38.133 Table 8.6.2-1: the larger of the two spacings' delays).",
					a.Name, a.Numerology.SCSKHz(), b.Name, b.Numerology.SCSKHz(), microseconds(sw.Type1), microseconds(sw.Type2)),
				fmt.Sprintf("Switched by RRC reconfiguration it takes %s (TS 38.133 8.6.3, with 10 ms of RRC processing); the results show the whole matrix.", microseconds(pt.BWPSwitchRRC)))
			return s, true
		}
		break // the matrix has no row for this pair (μ above 3)
	}
	return WalkStep{}, false
}

func ssbStep(res grid.Result) WalkStep {
	b := res.SSB
	s := WalkStep{Key: "ssb", Title: "SS/PBCH blocks", Highlight: []string{"ssb"}}
	s.Narration = append(s.Narration, fmt.Sprintf("Case %s at %d kHz has %d candidate positions per half frame; %d blocks fall in the span shown, every %d ms.",
		b.Case, b.Numerology.SCSKHz(), b.Candidates, len(b.Blocks), b.PeriodMs))
	s.Narration = append(s.Narration, fmt.Sprintf("Each block is 4 symbols by 240 subcarriers, %s to %s from point A.", kHz(b.Low), kHz(b.High)))
	return s
}

// bandStep tells the band and where on its synchronization raster a block
// may sit inside the channel (TS 38.101-1/-2 5.4.3).
func bandStep(res grid.Result) WalkStep {
	ch, sr := res.Channel, res.SyncRaster
	s := WalkStep{Key: "band", Title: "The band and the synchronization raster", Highlight: []string{"raster", "ssb"}}
	band := fmt.Sprintf("The channel is checked against band %s (%s)", sr.Band, ch.Duplex)
	if ch.RasterKHz > 0 {
		band += fmt.Sprintf(", whose channel raster steps %d kHz", ch.RasterKHz)
	}
	s.Narration = append(s.Narration, band+".")
	fits := 0
	for _, p := range sr.Points {
		if p.Fits {
			fits++
		}
	}
	s.Narration = append(s.Narration, fmt.Sprintf("A UE searches for %d kHz SS/PBCH blocks only on the GSCNs of the synchronization raster: %d lie inside the channel, and a block centred on %d of them would fit it and the carrier of subCarrierSpacingCommon (the long ticks).",
		sr.SCSKHz, len(sr.Points), fits))
	if b := res.SSB; b != nil && b.Absolute {
		if b.OnSyncRaster {
			s.Narration = append(s.Narration, fmt.Sprintf("This plan's block sits at GSCN %d, SS_REF %s MHz (absoluteFrequencySSB %d).", b.GSCN, num(b.SSRefHz.MHz()), b.AbsoluteFrequencySSB))
		} else {
			s.Narration = append(s.Narration, fmt.Sprintf("This plan's block, at SS_REF %s MHz, is off the raster: a UE's initial search would not find it.", num(b.SSRefHz.MHz())))
		}
	}
	return s
}

// initialStep tells where CORESET#0 is and when a UE looks for SIB1's
// PDCCH in it (TS 38.213 13).
func initialStep(res grid.Result) WalkStep {
	ia := res.InitialAccess
	c := ia.CORESET0
	s := WalkStep{Key: "initial", Title: "Initial access: CORESET#0 and its occasions", Highlight: []string{"coreset0", "ssb"}}
	s.Narration = append(s.Narration, fmt.Sprintf("The MIB's pdcch-ConfigSIB1 %08b picks row %d of Table %s: CORESET#0 spans %d RBs of %d kHz and %d symbols, CRBs %s, %s to %s from point A.",
		ia.MIB.PDCCHConfigSIB1, c.Index, c.Table, c.NRB, c.SCSKHz, c.Symbols, crbRange(c.StartCRB, c.NRB), kHz(c.Low), kHz(c.High)))
	occ := fmt.Sprintf("Row %d of Table %s gives %s in %d ms", ia.SearchSpaceZero, ia.OccasionTable, plural(len(ia.Occasions), "Type0-PDCCH monitoring occasion", "Type0-PDCCH monitoring occasions"), ia.WindowMs)
	if len(ia.Occasions) > 0 {
		o := ia.Occasions[0]
		occ += fmt.Sprintf("; the first, for block %d, is in slot %d from symbol %d", o.SSBIndex, o.Slot, o.FirstSymbol)
	}
	s.Narration = append(s.Narration, occ+".")
	s.Narration = append(s.Narration, fmt.Sprintf("Until it is configured, the UE works in the initial downlink BWP, %d PRBs from CRB %d.", ia.InitialDL.SizePRB, ia.InitialDL.StartCRB))
	return s
}

// prachStep is the random access step (issue 16): where the occasions
// are, how many are valid, and the cell range.
func prachStep(res grid.Result) WalkStep {
	p := res.PRACH
	s := WalkStep{Key: "prach", Title: "Random access", Highlight: []string{"prach"}}
	valid := 0
	for _, o := range p.Occasions {
		if o.Valid {
			valid++
		}
	}
	s.Narration = append(s.Narration, fmt.Sprintf("prach-ConfigurationIndex %d of TS 38.211 Table %s is format %s at %s kHz; each occasion takes %d resource blocks of %d kHz, %d side by side (msg1-FDM).",
		p.ConfigurationIndex, p.Table, p.Format, num(float64(p.SCSHz)/1000), p.NRBRA, p.PUSCHSCSKHz, p.FDM))
	s.Narration = append(s.Narration, fmt.Sprintf("%d of the %d occasions listed are valid (TS 38.213 8.1): %s valid per 10 ms. The invalid ones are drawn dotted and crossed.",
		valid, len(p.Occasions), num(p.ValidPer10ms)))
	if p.AssociationPeriodFrames > 0 {
		line := fmt.Sprintf("The SS/PBCH blocks are mapped to the valid occasions over an association period of %s (TS 38.213 Table 8.1-1), and that mapping repeats every association pattern period, %s (TS 38.213 8.1)",
			associationMs(p), patternMs(p))
		if p.PatternNote != "" {
			line += ": " + p.PatternNote
		}
		s.Narration = append(s.Narration, line+".")
	} else {
		s.Narration = append(s.Narration, "No association period of TS 38.213 Table 8.1-1 maps every SS/PBCH block within 160 ms, so there is no association pattern period either (TS 38.213 8.1).")
	}
	s.Narration = append(s.Narration, fmt.Sprintf("The preamble allows a cell of %s km, set by %s.", num(float64(int(p.Range.Limit/10+0.5))/100), rangeBinds(p)))
	return s
}

func findingsStep(res grid.Result) WalkStep {
	s := WalkStep{Key: "findings", Title: "Findings"}
	counts := map[grid.Severity]int{}
	for _, f := range res.Findings {
		counts[f.Severity]++
	}
	if counts[grid.Error]+counts[grid.Warning] == 0 {
		s.Narration = append(s.Narration, "The plan raises no errors and no warnings.")
	} else {
		s.Narration = append(s.Narration, fmt.Sprintf("The plan raises %s and %s.", plural(counts[grid.Error], "error", "errors"), plural(counts[grid.Warning], "warning", "warnings")))
	}
	shown := 0
	for _, f := range res.Findings {
		if f.Severity == grid.Info || shown == 2 {
			continue
		}
		s.Narration = append(s.Narration, planform.NamePaths(f.Message, res.Plan.Partitions))
		shown++
		for i, l := range res.Partitions {
			if l.Name == f.Partition {
				s.Highlight = append(s.Highlight, fmt.Sprintf("part:%d", i))
			}
		}
	}
	if counts[grid.Info] > 0 && shown < 2 {
		for _, f := range res.Findings {
			if f.Severity == grid.Info {
				s.Narration = append(s.Narration, planform.NamePaths(f.Message, res.Plan.Partitions))
				break
			}
		}
	}
	return s
}
