package grid

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gridloom/grid/timing"
)

// DMRSPositions are the values of dmrs-AdditionalPosition (TS 38.331
// DMRS-DownlinkConfig). The enumeration signals pos0, pos1 and pos3; pos2
// is what a UE applies when the field is absent, and the plan may name it.
var DMRSPositions = []string{"pos0", "pos1", "pos2", "pos3"}

// DefaultDMRSPosition is dmrs-AdditionalPosition when the plan gives none:
// "If the field is absent, the UE applies the value pos2" (TS 38.331
// DMRS-DownlinkConfig).
const DefaultDMRSPosition = "pos2"

// NTAOffsets are the values of n-TimingAdvanceOffset (TS 38.331
// ServingCellConfigCommon), N_TA,offset in Tc: n0 for an FR1 FDD band with
// LTE-NR coexistence, n25600 without coexistence (also the FR1 default),
// n39936 for an FR1 TDD band with coexistence (TS 38.133 Table 7.1.2-2).
var NTAOffsets = []string{"n0", "n25600", "n39936"}

var ntaOffsetCase = map[string]timing.Coexistence{
	"n0": timing.FR1FDDWithLTE, "n25600": timing.FR1NoCoexistence, "n39936": timing.FR1TDDWithLTE,
}

// Limits of the environment's timing keys.
const (
	MaxCellRadiusKm    = 1000 // beyond every timing advance range (300 km at 15 kHz)
	MaxLatencyTargetMs = 1000
)

// RetxProbability is the probability of one HARQ retransmission in the
// latency estimate with HARQ: 0.1, the value the IMT-2020 evaluation uses
// (TR 37.910 §5.7.1; from memory).
const RetxProbability = 0.1

// LatencyAssumptions are the assumptions of the user-plane latency
// estimate, one sentence each, for every view to show beside the numbers
// (the README says the same in its own words).
var LatencyAssumptions = []string{
	"An estimate of the air-interface part only, in the structure of the IMT-2020 evaluation (ITU-R M.2412, TR 37.910 §5.7.1): no core network, no queueing behind other users, no scheduling request (uplink data uses a configured grant).",
	"Processing on each side (gNB and UE, before and after the transmission) is half of N1 of the partition's capability (pos0), TS 38.214 Table 5.3-1/5.3-2; no specification fixes it.",
	"A packet arrives at a time uniform over the TDD pattern's cycle, waits for the next start of a slot (or mini-slot) whose symbols all go its way, and is sent in it; the mean averages over arrival times, the worst case arrives just after an opportunity began.",
	"Slots of 14 symbols start at symbol 0; mini-slots of 2, 4 or 7 symbols start at any symbol whose run stays in one slot.",
	"Flexible symbols carry neither direction; symbols are those of the normal cyclic prefix (an extended-CP partition is estimated on the normal-CP lattice, whose slot edges it shares).",
	"With HARQ: one retransmission with probability 0.1, one round trip later (the largest round trip of the pattern); the worst case with HARQ adds a whole round trip.",
	"HARQ round trip: the PDSCH ends with its slot's last downlink symbol, the HARQ-ACK takes the first uplink symbol T_proc,1 later (K1), the gNB decodes it in the same processing time and retransmits at the next slot that starts with a downlink symbol; in uplink the gNB decodes the PUSCH, grants again in the next downlink slot (PDCCH in symbols 0–1) and the PUSCH follows T_proc,2 later (K2).",
	"T_proc,1 and T_proc,2 take d1,1 = d2 = 0 and d2,1 = 1, no shared-spectrum access and no BWP switch (TS 38.214 5.3, 6.4); the uplink starts N_TA,offset plus the round trip to environment.cellRadiusKm (if given) before the downlink lattice.",
}

// OneWay is a one-way user-plane latency estimate of one direction, in Tc.
// Mean and MeanWithHARQ are means over arrival times and need not be
// whole Tc.
type OneWay struct {
	Mean          float64
	Worst         Tc
	MeanWithHARQ  float64
	WorstWithHARQ Tc
}

// Latencies holds the estimate of both directions; a direction is nil
// when the pattern gives it no run of symbols long enough.
type Latencies struct{ DL, UL *OneWay }

// PartitionTiming is what a partition's numerology buys in time: its
// processing times, HARQ timing and user-plane latency on the plan's TDD
// pattern (or FDD), and the timing advance range. See LatencyAssumptions.
type PartitionTiming struct {
	Capability int    // the capability applied, 1 or 2 (2 falls back to 1 where TS 38.214 defines no row)
	DMRS       string // dmrs-AdditionalPosition applied
	TProc1     Tc     // TS 38.214 5.3
	TProc2     Tc     // TS 38.214 6.4
	// K1Min is the least PDSCH-to-HARQ-ACK offset in slots over the
	// pattern's downlink slots; K2Min the least PDCCH-to-PUSCH offset for a
	// 14-symbol PUSCH (−1 when the pattern has no whole uplink slot).
	K1Min, K2Min int
	// K1Lattice and K2Lattice are the same for a PDSCH or PUSCH filling its
	// slot on the numerology's own lattice, every symbol usable both ways
	// (as FDD), to set beside the pattern's. Equal to K1Min and K2Min
	// without TDD.
	K1Lattice, K2Lattice int
	// HARQ round trip of the downlink, over the slots of one cycle.
	HARQMin, HARQMax Tc
	HARQMean         float64
	// The uplink HARQ round trip over the whole uplink slots of one cycle
	// (timing.ULHARQRoundTrips); HasULHARQ is false without one.
	HasULHARQ            bool
	ULHARQMin, ULHARQMax Tc
	ULHARQMean           float64
	// Slot is the latency with 14-symbol slots; MiniSlot with 2, 4 and 7
	// symbols, indexed by the length.
	Slot     Latencies
	MiniSlot map[int]Latencies
	// GuardSymbols is the shortest downlink-to-uplink guard of the pattern
	// in symbols of this numerology; 0 without TDD.
	GuardSymbols int
	// TimingAdvance is the largest N_TA a random access response sets at
	// this μ (TS 38.213 4.2) and TimingAdvanceRadiusM the radius its round
	// trip covers.
	TimingAdvance        Tc
	TimingAdvanceRadiusM float64
}

// BWPSwitch is the delay of switching from one partition (as a BWP) to
// another by DCI or timer, TS 38.133 8.6.2, for both UE delay types.
type BWPSwitch struct {
	From, To     string
	Type1, Type2 Tc
}

// PlanTiming is the timing of the whole carrier: N_TA,offset, the guard
// period against the cell range, and the BWP switching delays.
type PlanTiming struct {
	NTAOffset Tc   // N_TA,offset·Tc (TS 38.133 Table 7.1.2-2)
	RxTx      Tc   // N_Rx-Tx·Tc of TS 38.211 Table 4.3.2-3 for the range
	HasGuard  bool // the TDD pattern switches from downlink to uplink
	Guard     Tc   // the shortest downlink-to-uplink guard, exact
	// GuardSymbols is the guard in symbols of each subcarrier spacing in use
	// (kHz → symbols), at or above the TDD reference spacing.
	GuardSymbols map[int]int
	// MaxCellRadiusM is c·(Guard − N_TA,offset − N_Rx-Tx)/2 in metres
	// (timing.MaxCellRadius); meaningful when HasGuard.
	MaxCellRadiusM float64
	// BWPSwitch lists every ordered pair of partitions whose numerologies
	// TS 38.133 Table 8.6.2-1 covers (μ 0–3); BWPSwitchRRC is the delay of an
	// RRC-based switch (8.6.3) with 10 ms of RRC processing.
	BWPSwitch    []BWPSwitch
	BWPSwitchRRC Tc
}

// RRCProcessing is the RRC procedure delay assumed for an RRC-based BWP
// switch: 10 ms for RRCReconfiguration (TS 38.331 clause 12; from memory).
const RRCProcessing = 10 * TcPerSubframe

// timingIn is what the timing keys of a plan say once checked.
type timingIn struct {
	caps   []timing.Capability // per plan partition
	dmrs   []string
	off    Tc
	radius float64 // metres; 0 when not stated
}

// checkTimingKeys checks the timing keys and fills their defaults into p.
func checkTimingKeys(fs *findings, rng Range, p *Plan) timingIn {
	var in timingIn
	off, _ := timing.NTAOffset(timing.FR1NoCoexistence)
	if rng.FR2() {
		off, _ = timing.NTAOffset(timing.FR2)
	}
	if v := p.Carrier.NTAOffset; v != "" {
		name, ok := parseFold(v, NTAOffsets, func(s string) (string, bool) { return s, slices.Contains(NTAOffsets, s) })
		switch {
		case !ok:
			fs.add(Error, CodeTiming, "", "carrier.nTaOffset", "carrier.nTaOffset %q is not a value of n-TimingAdvanceOffset; use %s (TS 38.331; N_TA,offset in Tc, TS 38.133 Table 7.1.2-2).", v, JoinOr(NTAOffsets))
		case rng.FR2():
			fs.add(Warning, CodeTiming, "", "carrier.nTaOffset", "carrier.nTaOffset %s is ignored in %s: N_TA,offset is 13792 Tc in FR2 (TS 38.133 Table 7.1.2-2).", name, rng)
		default:
			p.Carrier.NTAOffset = name
			off, _ = timing.NTAOffset(ntaOffsetCase[name])
			// TS 38.133 Table 7.1.2-2 ties n0 to FDD and n39936 to TDD bands.
			switch {
			case name == "n0" && p.TDD != nil:
				fs.add(Warning, CodeTiming, "", "carrier.nTaOffset", "carrier.nTaOffset n0 is the value for an FR1 FDD band with LTE-NR coexistence (TS 38.133 Table 7.1.2-2), but the plan has a TDD pattern; a TDD band takes n25600, or n39936 with LTE-NR coexistence.")
			case name == "n39936" && p.TDD == nil:
				fs.add(Warning, CodeTiming, "", "carrier.nTaOffset", "carrier.nTaOffset n39936 is the value for an FR1 TDD band with LTE-NR coexistence (TS 38.133 Table 7.1.2-2), but the plan has no TDD pattern; an FDD band takes n25600, or n0 with LTE-NR coexistence.")
			}
		}
	} else if !rng.FR2() {
		p.Carrier.NTAOffset = "n25600"
	}
	in.off = Tc(off)
	for i := range p.Partitions {
		pp := &p.Partitions[i]
		f := fmt.Sprintf("partitions[%d]", i)
		c := timing.Cap1
		switch pp.UECapability {
		case 0, 1:
			pp.UECapability = 1
		case 2:
			c = timing.Cap2
		default:
			fs.add(Error, CodeTiming, pp.Name, f+".ueCapability", "%s.ueCapability is %d; the UE processing capability is 1 or 2 (TS 38.214 5.3, 6.4).", f, pp.UECapability)
		}
		d := DefaultDMRSPosition
		if pp.DMRSAdditionalPosition != "" {
			if v, ok := parseFold(pp.DMRSAdditionalPosition, DMRSPositions, func(s string) (string, bool) { return s, slices.Contains(DMRSPositions, s) }); ok {
				d = v
			} else {
				fs.add(Error, CodeTiming, pp.Name, f+".dmrsAdditionalPosition", "%s.dmrsAdditionalPosition %q is not a value of dmrs-AdditionalPosition; use %s (TS 38.331 DMRS-DownlinkConfig; absent means pos2).", f, pp.DMRSAdditionalPosition, JoinOr(DMRSPositions))
			}
		}
		pp.DMRSAdditionalPosition = d
		in.caps = append(in.caps, c)
		in.dmrs = append(in.dmrs, d)
	}
	if e := p.Environment; e != nil {
		if r := e.CellRadiusKm; math.IsNaN(r) || r < 0 || r > MaxCellRadiusKm {
			fs.add(Error, CodeFit, "", "environment.cellRadiusKm", "environment.cellRadiusKm must be 0 (not stated) to %d km.", MaxCellRadiusKm)
		} else {
			in.radius = r * 1000
		}
		if t := e.LatencyTargetMs; math.IsNaN(t) || t < 0 || t > MaxLatencyTargetMs {
			fs.add(Error, CodeFit, "", "environment.latencyTargetMs", "environment.latencyTargetMs must be 0 (none) to %d ms.", MaxLatencyTargetMs)
			e.LatencyTargetMs = 0
		}
	}
	return in
}

// roundTripTc is the timing advance of a UE at radius r metres, 2r/c.
func roundTripTc(r float64) Tc { return Tc(math.Round(2 * r / speedOfLight * float64(TcPerSecond))) }

// timingPattern puts the plan's TDD pattern on the lattice of μ: at or
// above the reference each reference symbol holds 2^(μ−μref) symbols
// exactly (TS 38.213 11.1); below it a symbol spans several reference
// symbols and is flexible unless they agree. ok is false when the period
// is not a whole number of slots at μ. Without TDD the pattern is FDD.
func timingPattern(t *TDD, mu int, adv Tc) (timing.Pattern, bool) {
	p := timing.Pattern{Mu: mu, ULAdvance: timing.Tc(adv)}
	if t == nil {
		return p, true
	}
	ref := t.Reference.Mu
	if mu >= ref {
		f := 1 << (mu - ref)
		p.Dir = make([]byte, 0, len(t.RefDirs)*f)
		for _, d := range t.RefDirs {
			for range f {
				p.Dir = append(p.Dir, byte(d))
			}
		}
		return p, true
	}
	f := 1 << (ref - mu)
	if len(t.RefDirs)%(f*timing.SymbolsPerSlot) != 0 {
		return p, false
	}
	for k := 0; k < len(t.RefDirs); k += f {
		d := t.RefDirs[k]
		for _, x := range t.RefDirs[k+1 : k+f] {
			if x != d {
				d = Flexible
			}
		}
		p.Dir = append(p.Dir, byte(d))
	}
	return p, true
}

// shortestGuard returns the shortest run of flexible symbols between a
// downlink and an uplink symbol of p (cyclically), exactly, and its
// length in symbols; a downlink symbol followed at once by an uplink one is
// a guard of zero. ok is false when p never turns from downlink to uplink.
func shortestGuard(p timing.Pattern) (guard Tc, symbols int, ok bool) {
	n := len(p.Dir)
	for k := range n {
		if p.Dir[k] != 'D' || p.Dir[(k+1)%n] == 'D' {
			continue
		}
		var t Tc
		j := k + 1
		for ; j < k+n && p.Dir[j%n] == 'F'; j++ {
			_, l := timing.SymbolStart(p.Mu, j)
			t += Tc(l)
		}
		if p.Dir[j%n] != 'U' {
			continue
		}
		if !ok || t < guard {
			guard, symbols, ok = t, j-k-1, true
		}
	}
	return guard, symbols, ok
}

// extendedGuardSymbols counts the flexible symbols of an extended-CP
// partition in the shortest downlink-to-uplink turn of one period, by the
// directions Directions gives it: its symbols do not nest in the normal-CP
// reference symbols, so one that straddles the guard's edge is flexible too.
func extendedGuardSymbols(t TDD, l Lattice) int {
	one := l
	one.SpanMs = int((t.Period + TcPerSubframe - 1) / TcPerSubframe)
	dirs, _ := t.Directions(one)
	dirs = dirs[:t.symbolsPerPeriod(l.Numerology)]
	n, best := len(dirs), -1
	for k := range n {
		if dirs[k] != Downlink || dirs[(k+1)%n] == Downlink {
			continue
		}
		j := k + 1
		for ; j < k+n && dirs[j%n] == Flexible; j++ {
		}
		if dirs[j%n] == Uplink && (best < 0 || j-k-1 < best) {
			best = j - k - 1
		}
	}
	return max(best, 0)
}

// computeTiming fills the per-partition and the carrier's timing, and
// warns (code range) when the stated cell radius is beyond the guard or the
// timing advance.
func computeTiming(fs *findings, rng Range, in timingIn, tddRefused bool, res *Result) {
	if tddRefused {
		return // a TDD pattern the plan gives but Compute refused: FDD figures would mislead
	}
	pt := &PlanTiming{NTAOffset: in.off, RxTx: Tc(timing.RxTxTransition(rng.FR2())), GuardSymbols: map[int]int{}}
	adv := in.off + roundTripTc(in.radius)
	if t := res.TDD; t != nil {
		ref, _ := timingPattern(t, t.Reference.Mu, 0)
		if g, n, ok := shortestGuard(ref); ok {
			pt.HasGuard, pt.Guard = true, g
			pt.MaxCellRadiusM = timing.MaxCellRadius(timing.Tc(g), timing.Tc(pt.NTAOffset), timing.Tc(pt.RxTx))
			pt.GuardSymbols[t.Reference.SCSKHz()] = n
		}
	}
	type timingKey struct {
		mu   int
		c    timing.Capability
		dmrs string
	}
	type timingDone struct {
		tm  PartitionTiming
		err error
	}
	done := map[timingKey]timingDone{}
	for i := range res.Partitions {
		l := &res.Partitions[i]
		mu := l.Numerology.Mu
		if res.TDD != nil && mu < res.TDD.Reference.Mu {
			continue // below the reference spacing: a tdd error already
		}
		c := in.caps[l.Index]
		if c == timing.Cap2 {
			if _, err := timing.N1(mu, c, dmrsCase(in.dmrs[l.Index])); err != nil || (rng.FR2() && mu == 2) {
				fs.add(Warning, CodeTiming, l.Name, fmt.Sprintf("partitions[%d].ueCapability", l.Index),
					"Partition %q asks for capability 2, which TS 38.214 Tables 5.3-2 and 6.4-2 define only in FR1 (μ 0–2) with dmrs-AdditionalPosition pos0; capability 1 applies (it has %s at %d kHz).",
					l.Name, in.dmrs[l.Index], l.Numerology.SCSKHz())
				c = timing.Cap1
			}
		}
		// Partitions of one numerology, capability and DM-RS case share their
		// timing: the pattern and the advance are the carrier's.
		key := timingKey{mu, c, in.dmrs[l.Index]}
		tm, err := done[key].tm, done[key].err
		if _, ok := done[key]; !ok {
			p, _ := timingPattern(res.TDD, mu, adv)
			tm, err = partitionTiming(p, c, key.dmrs)
			done[key] = timingDone{tm, err}
		}
		if err != nil {
			fs.add(Warning, CodeTiming, l.Name, fmt.Sprintf("partitions[%d].scsKHz", l.Index), "Partition %q has no HARQ or latency estimate: %v", l.Name, err)
			continue
		}
		switch {
		case !pt.HasGuard:
		case l.Numerology.CP == ExtendedCP:
			tm.GuardSymbols = extendedGuardSymbols(*res.TDD, *l)
		default:
			tm.GuardSymbols = pt.GuardSymbols[res.TDD.Reference.SCSKHz()] << (mu - res.TDD.Reference.Mu)
			pt.GuardSymbols[l.Numerology.SCSKHz()] = tm.GuardSymbols
		}
		l.Timing = &tm
	}
	for _, a := range res.Partitions {
		for _, b := range res.Partitions {
			if a.Index == b.Index {
				continue
			}
			t1, err1 := timing.BWPSwitchDelay(a.Numerology.Mu, b.Numerology.Mu, timing.SwitchType1)
			t2, err2 := timing.BWPSwitchDelay(a.Numerology.Mu, b.Numerology.Mu, timing.SwitchType2)
			if err1 == nil && err2 == nil {
				pt.BWPSwitch = append(pt.BWPSwitch, BWPSwitch{From: a.Name, To: b.Name, Type1: Tc(t1.Delay), Type2: Tc(t2.Delay)})
			}
		}
	}
	rrc, _ := timing.BWPSwitchDelayByRRC(0, timing.Tc(RRCProcessing))
	pt.BWPSwitchRRC = Tc(rrc.Delay)
	res.Timing = pt
	checkCellRange(fs, in.radius, pt, res.Partitions)
}

// checkCellRange warns when the stated cell radius is beyond what the
// guard period or the random access response's timing advance allows.
func checkCellRange(fs *findings, radius float64, pt *PlanTiming, ls []Lattice) {
	if radius <= 0 {
		return
	}
	const field = "environment.cellRadiusKm"
	if pt.HasGuard && radius > pt.MaxCellRadiusM {
		fs.add(Warning, CodeRange, "", field, "environment.cellRadiusKm %g km is beyond the %.2f km the TDD guard allows: a guard of %.2f µs less N_TA,offset %d Tc and the UE's Rx-to-Tx switch %d Tc leaves c·t/2 = %.2f km (TS 38.211 4.3.1, Table 4.3.2-3; TS 38.133 Table 7.1.2-2); lengthen the guard (fewer downlinkSymbols or uplinkSymbols) or shrink the cell.",
			radius/1000, pt.MaxCellRadiusM/1000, pt.Guard.Micros(), int64(pt.NTAOffset), int64(pt.RxTx), pt.MaxCellRadiusM/1000)
	}
	var far []string
	for _, l := range ls {
		if l.Timing != nil && radius > l.Timing.TimingAdvanceRadiusM {
			far = append(far, fmt.Sprintf("%q at %d kHz (%.1f km)", l.Name, l.Numerology.SCSKHz(), l.Timing.TimingAdvanceRadiusM/1000))
		}
	}
	if len(far) > 0 {
		fs.add(Warning, CodeRange, "", field, "environment.cellRadiusKm %g km is beyond the timing advance a random access response can set (T_A up to %d, TS 38.213 4.2) for partition %s.",
			radius/1000, timing.MaxRARTimingAdvance, strings.Join(far, ", "))
	}
}

// dmrsCase maps dmrs-AdditionalPosition to the column of TS 38.214 Table
// 5.3-1. The μ = 0 cell for an additional DM-RS at l1 = 12 (N1 = 14) needs
// the PDSCH's length and dmrs-TypeA-Position, which a plan does not give:
// the value 13 is taken.
func dmrsCase(pos string) timing.DMRS {
	if pos == "pos0" {
		return timing.DMRSPos0
	}
	return timing.DMRSAdditional
}

// partitionTiming computes the timing of one numerology on pattern p.
func partitionTiming(p timing.Pattern, c timing.Capability, dmrs string) (PartitionTiming, error) {
	mu := p.Mu
	out := PartitionTiming{Capability: int(c), DMRS: dmrs, K2Min: -1, MiniSlot: map[int]Latencies{}}
	t1, err := timing.TProc1(mu, c, dmrsCase(dmrs), timing.Adders{})
	if err != nil {
		return out, err
	}
	t2, err := timing.TProc2(mu, c, timing.Adders{})
	if err != nil {
		return out, err
	}
	proc, err := timing.EvaluationProcessing(mu, c)
	if err != nil {
		return out, err
	}
	out.TProc1, out.TProc2 = Tc(t1), Tc(t2)
	rt, err := timing.HARQRoundTrips(p, t1, proc)
	if err != nil {
		return out, err
	}
	out.HARQMin, out.HARQMax, out.HARQMean = Tc(rt.Min), Tc(rt.Max), rt.Mean
	out.K1Min = rt.PerSlot[0].Ack.K1
	for _, r := range rt.PerSlot {
		out.K1Min = min(out.K1Min, r.Ack.K1)
	}
	if k2, err := timing.LeastK2(p, timing.SymbolsPerSlot, t2); err == nil {
		out.K2Min = k2
	}
	out.K1Lattice, out.K2Lattice = out.K1Min, out.K2Min
	if !p.FDD() {
		fdd := timing.Pattern{Mu: mu, ULAdvance: p.ULAdvance}
		if rt, err := timing.HARQRoundTrips(fdd, t1, proc); err == nil {
			out.K1Lattice = rt.PerSlot[0].Ack.K1
			for _, r := range rt.PerSlot {
				out.K1Lattice = min(out.K1Lattice, r.Ack.K1)
			}
		}
		if k2, err := timing.LeastK2(fdd, timing.SymbolsPerSlot, t2); err == nil {
			out.K2Lattice = k2
		}
	}
	if ul, err := timing.ULHARQRoundTrips(p, t2, proc); err == nil {
		out.HasULHARQ = true
		out.ULHARQMin, out.ULHARQMax, out.ULHARQMean = Tc(ul.Min), Tc(ul.Max), ul.Mean
	}
	for _, n := range []int{timing.SymbolsPerSlot, 2, 4, 7} {
		ls := Latencies{DL: oneWay(p, timing.Downlink, n, proc, rt.Max)}
		if ul := timing.Tc(out.ULHARQMax); p.FDD() && ls.DL != nil {
			// On FDD both directions have every symbol: the same waits, only
			// the round trip differs.
			o := *ls.DL
			o.MeanWithHARQ = o.Mean + timing.ExpectedRetxTime(RetxProbability, 1, ul)
			o.WorstWithHARQ = o.Worst + Tc(ul)
			ls.UL = &o
		} else {
			ls.UL = oneWay(p, timing.Uplink, n, proc, ul)
		}
		if n == timing.SymbolsPerSlot {
			out.Slot = ls
		} else {
			out.MiniSlot[n] = ls
		}
	}
	ta, radius, err := timing.TimingAdvanceRange(mu)
	if err != nil {
		return out, err
	}
	out.TimingAdvance, out.TimingAdvanceRadiusM = Tc(ta), radius
	return out, nil
}

// oneWay is the latency of one direction, or nil when the pattern has no
// run of n symbols that way. Without an uplink round trip (no whole uplink
// slot) the retransmission terms repeat the figures without HARQ.
func oneWay(p timing.Pattern, d timing.Direction, n int, proc, rtt timing.Tc) *OneWay {
	l, err := timing.UserPlaneLatency(timing.LatencyConfig{Pattern: p, Dir: d, Length: n, TxProc: proc, RxProc: proc,
		RetxProb: RetxProbability, HARQRTT: rtt, MaxRetx: 1})
	if err != nil {
		return nil
	}
	return &OneWay{Mean: l.Mean, Worst: Tc(l.Worst), MeanWithHARQ: l.WithHARQ, WorstWithHARQ: Tc(l.Worst + rtt)}
}
