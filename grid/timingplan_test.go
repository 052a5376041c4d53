package grid

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// dddsu30 is a 100 MHz FR1 carrier at 30 kHz under the 2.5 ms DDDSU
// pattern with a 10:2:2 special slot, all on the 30 kHz reference.
func dddsu30() Plan {
	p := plan(100, part("all", 30, 0, 273))
	p.TDD = &TDDPlan{ReferenceSCSKHz: 30,
		Pattern1: TDDPattern{PeriodMs: 2.5, DownlinkSlots: 3, DownlinkSymbols: 10, UplinkSlots: 1, UplinkSymbols: 2}}
	return p
}

func findingAt(r Result, sev Severity, code, field string) (Finding, bool) {
	for _, f := range r.Findings {
		if f.Severity == sev && f.Code == code && f.Field == field {
			return f, true
		}
	}
	return Finding{}, false
}

func mustTiming(t *testing.T, r Result, i int) *PartitionTiming {
	t.Helper()
	if r.HasErrors() {
		t.Fatalf("findings: %v", r.Findings)
	}
	tm := r.Partitions[i].Timing
	if tm == nil {
		t.Fatalf("partition %d has no timing", i)
	}
	return tm
}

// Symbol lengths worked by hand (TS 38.211 5.3.1, normal CP):
// (2048 + 144)·64·2^−μ Tc, and 16·64 = 1024 Tc more for the first symbol
// of each half subframe.
const (
	sym30  Tc = 2192 * 64 / 2 // 70144
	sym120 Tc = 2192 * 64 / 8 // 17536
	ms     Tc = 1966080
)

// FDD at 30 kHz with 14-symbol slots, by hand. Processing on each side is
// N1/2 of capability 1 with pos0 (TS 38.214 Table 5.3-1: N1 = 10 at μ = 1),
// 5 symbols = 350720 Tc. A slot starts every 0.5 ms and lasts 0.5 ms (at
// 30 kHz a half subframe is one slot, so every slot is exactly 0.5 ms). A
// packet waits 0.25 ms on average, 0.5 ms at worst, then is sent in 0.5 ms:
// mean = 2·350720 + 0.25 ms + 0.5 ms = 701440 + 1474560 = 2176000 Tc
// (1106.77 µs); worst = 701440 + 0.5 ms + 0.5 ms = 2667520 Tc.
func TestLatencyFDD30kHz(t *testing.T) {
	tm := mustTiming(t, Compute(plan(100, part("all", 30, 0, 273))), 0)
	for _, d := range []*OneWay{tm.Slot.DL, tm.Slot.UL} {
		if d == nil || d.Mean != 2176000 || d.Worst != 2667520 {
			t.Errorf("FDD 30 kHz slot latency %+v, want mean 2176000 and worst 2667520 Tc", d)
		}
	}
	// The HARQ round trip on FDD is the same for every slot; one
	// retransmission with p = 0.1 adds a tenth of it to the mean.
	if tm.HARQMin != tm.HARQMax || tm.Slot.DL.MeanWithHARQ != 2176000+0.1*float64(tm.HARQMax) {
		t.Errorf("FDD HARQ: min %d max %d, mean with HARQ %g", tm.HARQMin, tm.HARQMax, tm.Slot.DL.MeanWithHARQ)
	}
}

// DDDSU at 30 kHz (2.5 ms, special slot 10:2:2), by hand. Downlink slots
// 0, 1 and 2 are whole (the special slot is not): the gaps before them
// are 1.5, 0.5 and 0.5 ms, each slot lasts 0.5 ms, so over P = 2.5 ms
//
//	mean = 701440 + (1.5·(1.5/2 + 0.5) + 2·0.5·(0.5/2 + 0.5))/2.5 ms
//	     = 701440 + (1.875 + 0.75)/2.5 ms = 701440 + 1.05 ms = 2765824 Tc
//	worst = 701440 + 1.5 ms + 0.5 ms = 4633600 Tc.
//
// Uplink has one whole slot per period (slot 4): mean = 701440 +
// 2.5·(1.25 + 0.5)/2.5 ms = 701440 + 1.75 ms = 4142080 Tc; worst =
// 701440 + 2.5 ms + 0.5 ms = 6599680 Tc.
func TestLatencyDDDSU30kHz(t *testing.T) {
	tm := mustTiming(t, Compute(dddsu30()), 0)
	dl, ul := tm.Slot.DL, tm.Slot.UL
	if dl == nil || dl.Mean != 701440+1.05*float64(ms) || dl.Worst != 4633600 {
		t.Errorf("DDDSU downlink %+v, want mean 2765824 and worst 4633600 Tc", dl)
	}
	if ul == nil || ul.Mean != 701440+1.75*float64(ms) || ul.Worst != 6599680 {
		t.Errorf("DDDSU uplink %+v, want mean 4142080 and worst 6599680 Tc", ul)
	}
	// K1 (TS 38.214 5.3): T_proc,1 with the default pos2 is N1 = 13
	// symbols, 911872 Tc (463.8 µs). A PDSCH filling slot 2 ends at 1.5 ms;
	// the uplink starts N_TA,offset = 25600 Tc early, so the first uplink
	// symbol it may use starts at or after 1.5 ms + 463.8 µs on the downlink
	// lattice: symbol 12 of slot 3 starts at 1.5 ms + 1024 + 12·70144 Tc =
	// 1.5 ms + 842752 Tc (428.6 µs): too early. Slot 4 symbol 0 (2 ms) is in
	// time (K1 = 2 for slot 2), and the least K1 is that of slot 3, the special
	// slot: its PDSCH ends with symbol 9 at 1.5 ms + 1024 + 10·70144 Tc =
	// 1.5 ms + 702464 Tc, and its ACK goes in slot 4 (K1 = 1).
	if tm.TProc1 != 13*sym30 || tm.K1Min != 1 {
		t.Errorf("T_proc,1 %d Tc (want %d), K1 min %d (want 1)", tm.TProc1, 13*sym30, tm.K1Min)
	}
	// T_proc,2 (TS 38.214 6.4): N2 = 12 at μ = 1, plus d2,1 = 1: 13 symbols.
	if tm.TProc2 != 13*sym30 {
		t.Errorf("T_proc,2 %d Tc, want %d", tm.TProc2, 13*sym30)
	}
	if tm.GuardSymbols != 2 {
		t.Errorf("guard %d symbols, want 2", tm.GuardSymbols)
	}
	// On its own lattice (every symbol both ways) a PDSCH filling slot 0
	// ends at 0.5 ms; the last symbol of slot 1 starts at 0.5 ms + 1024 +
	// 13·70144 Tc = 0.5 ms + 912896 Tc, advanced by 25600 Tc to 0.5 ms +
	// 887296 Tc, before the 911872 Tc it must wait: K1 = 2. The
	// pattern's special slot, whose PDSCH ends earlier, does better (1).
	// K2: the PDCCH ends 141312 Tc in; a slot-long PUSCH may start
	// 1053184 Tc after the slot starts, beyond slot 1 (983040 − 25600):
	// K2 = 2, as on the pattern.
	if tm.K1Lattice != 2 || tm.K2Lattice != 2 || tm.K2Min != 2 {
		t.Errorf("K1 %d and K2 %d on the lattice, K2 %d on the pattern; want 2, 2, 2", tm.K1Lattice, tm.K2Lattice, tm.K2Min)
	}
	// A TDD pattern Compute refuses leaves no timing rather than FDD figures.
	p := dddsu30()
	p.TDD.Pattern1.PeriodMs = 3.5
	p.Environment = &EnvironmentPlan{CellRadiusKm: 1}
	if r := Compute(p); r.Timing != nil || r.Advice != nil || r.Partitions[0].Timing != nil {
		t.Errorf("refused TDD: timing %v, advice %v", r.Timing, r.Advice)
	}
}

// A 2-symbol mini-slot at 120 kHz on FDD, by hand. Processing: N1 = 20
// (capability 1, pos0, μ = 3), 10 symbols each side: 2·175360 = 350720 Tc.
// The lattice repeats every half subframe (0.5 ms = 983040 Tc, 4 slots, 56
// symbols of s = 17536 Tc, the first s + 1024). A mini-slot may start at
// symbols 0 to 12 of each slot. For each start: the gap g since the
// previous start and the duration d (two symbols):
//
//	slot 0, symbol 0:      g = 2s (symbols 12, 13 of the slot before), d = 2s + 1024
//	slot 0, symbol 1:      g = s + 1024, d = 2s
//	slot 0, symbols 2–12:  g = s, d = 2s (11 starts)
//	slots 1–3, symbol 0:   g = 2s, d = 2s (3 starts)
//	slots 1–3, 1–12:       g = s, d = 2s (36 starts)
//
// mean = 350720 + Σ g·(g/2 + d) / 983040; worst = 350720 + max(g + d) =
// 350720 + 4s + 1024 = 421888 Tc (214.58 µs).
func TestLatencyMiniSlot120kHz(t *testing.T) {
	p := plan(100, part("all", 120, 0, 66))
	p.Carrier.Range = "FR2-1"
	tm := mustTiming(t, Compute(p), 0)
	s := float64(sym120)
	term := func(g, d float64) float64 { return g * (g/2 + d) }
	sum := term(2*s, 2*s+1024) + term(s+1024, 2*s) + 11*term(s, 2*s) + 3*term(2*s, 2*s) + 36*term(s, 2*s)
	want := 350720 + sum/983040
	got := tm.MiniSlot[2].DL
	if got == nil || math.Abs(got.Mean-want) > 1e-6 || got.Worst != 421888 {
		t.Errorf("120 kHz 2-symbol mini-slot %+v, want mean %.3f and worst 421888 Tc", got, want)
	}
}

// The range formula against a worked number (TS 38.211 4.3.1 and Table
// 4.3.2-3, TS 38.133 Table 7.1.2-2): two guard symbols at 30 kHz are
// 2·70144 = 140288 Tc (71.35 µs); less N_TA,offset 25600 Tc (FR1 default)
// and the UE's Rx-to-Tx switch N_Rx-Tx = 25600 Tc leaves 89088 Tc =
// 45.3125 µs, so r = c·t/2 = 149896229 m/s · 45.3125e−6 s = 6792.17 m.
func TestGuardRange(t *testing.T) {
	p := dddsu30()
	p.Environment = &EnvironmentPlan{CellRadiusKm: 7}
	r := Compute(p)
	if r.Timing == nil || !r.Timing.HasGuard || r.Timing.Guard != 140288 {
		t.Fatalf("timing %+v, want a guard of 140288 Tc", r.Timing)
	}
	if got := r.Timing.MaxCellRadiusM; math.Abs(got-6792.17) > 0.01 {
		t.Errorf("max cell radius %.2f m, want 6792.17", got)
	}
	if r.Timing.GuardSymbols[30] != 2 {
		t.Errorf("guard symbols %v, want 2 at 30 kHz", r.Timing.GuardSymbols)
	}
	if _, ok := findingAt(r, Warning, CodeRange, "environment.cellRadiusKm"); !ok {
		t.Errorf("7 km > 6.792 km: no range warning in %v", r.Findings)
	}
	p.Environment.CellRadiusKm = 6.7
	if f, ok := findingAt(Compute(p), Warning, CodeRange, "environment.cellRadiusKm"); ok {
		t.Errorf("6.7 km < 6.792 km warned: %v", f)
	}
	// n39936 (FR1 TDD with LTE-NR coexistence) takes 14336 Tc more:
	// 140288 − 39936 − 25600 = 74752 Tc = 38.0208 µs → 149896229 · 38.0208e−6 = 5699.18 m.
	p.Carrier.NTAOffset = "n39936"
	if got := Compute(p).Timing.MaxCellRadiusM; math.Abs(got-5699.18) > 0.01 {
		t.Errorf("with n39936 the radius is %.2f m, want 5699.18", got)
	}
}

// The random access response's T_A reaches 3846·16·64/2^μ Tc (TS 38.213
// 4.2): at 120 kHz 492288 Tc = 250.390625 µs, a radius of
// 149896229 m/s · 250.390625e−6 s = 37532.6 m.
func TestTimingAdvanceRange(t *testing.T) {
	p := plan(100, part("all", 120, 0, 66))
	p.Carrier.Range = "FR2-1"
	p.Environment = &EnvironmentPlan{CellRadiusKm: 40}
	r := Compute(p)
	tm := mustTiming(t, r, 0)
	if tm.TimingAdvance != 492288 || math.Abs(tm.TimingAdvanceRadiusM-37532.6) > 0.1 {
		t.Errorf("TA %d Tc, radius %.1f m; want 492288 Tc and 37532.6 m", tm.TimingAdvance, tm.TimingAdvanceRadiusM)
	}
	f, ok := findingAt(r, Warning, CodeRange, "environment.cellRadiusKm")
	if !ok || !strings.Contains(f.Message, "timing advance") {
		t.Errorf("40 km at 120 kHz: no timing advance warning in %v", r.Findings)
	}
	if r.Timing.HasGuard {
		t.Error("FDD has a guard")
	}
}

// The plan keys: values refused with a finding naming the field and the
// allowed values; defaults written into the normalised plan.
func TestTimingKeys(t *testing.T) {
	p := plan(100, part("all", 30, 0, 273))
	r := Compute(p)
	if got := r.Plan.Partitions[0]; got.UECapability != 1 || got.DMRSAdditionalPosition != "pos2" || r.Plan.Carrier.NTAOffset != "n25600" {
		t.Errorf("defaults: capability %d, %q, %q", got.UECapability, got.DMRSAdditionalPosition, r.Plan.Carrier.NTAOffset)
	}
	for _, c := range []struct {
		edit  func(*Plan)
		sev   Severity
		field string
		want  string
	}{
		{func(p *Plan) { p.Partitions[0].UECapability = 3 }, Error, "partitions[0].ueCapability", "1 or 2"},
		{func(p *Plan) { p.Partitions[0].DMRSAdditionalPosition = "pos4" }, Error, "partitions[0].dmrsAdditionalPosition", "pos0, pos1, pos2 or pos3"},
		{func(p *Plan) { p.Carrier.NTAOffset = "n13792" }, Error, "carrier.nTaOffset", "n0, n25600 or n39936"},
		{func(p *Plan) { p.Partitions[0].UECapability = 2 }, Warning, "partitions[0].ueCapability", "capability 1 applies"},
		{func(p *Plan) { p.Carrier.NTAOffset = "n39936" }, Warning, "carrier.nTaOffset", "no TDD pattern"},
		{func(p *Plan) { p.Environment = &EnvironmentPlan{CellRadiusKm: -1} }, Error, "environment.cellRadiusKm", "0 (not stated) to 1000 km"},
		{func(p *Plan) { p.Environment = &EnvironmentPlan{LatencyTargetMs: math.NaN()} }, Error, "environment.latencyTargetMs", "0 (none) to 1000 ms"},
	} {
		q := p.Clone()
		c.edit(&q)
		f, ok := findingAt(Compute(q), c.sev, map[bool]string{true: CodeFit, false: CodeTiming}[strings.HasPrefix(c.field, "environment")], c.field)
		if !ok || !strings.Contains(f.Message, c.want) {
			t.Errorf("%s: got %v (found %v), want a %s naming %q", c.field, f, ok, c.sev, c.want)
		}
	}
	// Capability 2 with pos0 at 30 kHz: N1 = 4.5 (TS 38.214 Table 5.3-2),
	// 4.5·70144 = 315648 Tc; N2 = 5.5 (Table 6.4-2) plus d2,1 = 1: 6.5 symbols,
	// 455936 Tc.
	q := p.Clone()
	q.Partitions[0].UECapability, q.Partitions[0].DMRSAdditionalPosition = 2, "POS0"
	tm := mustTiming(t, Compute(q), 0)
	if tm.Capability != 2 || tm.TProc1 != 315648 || tm.TProc2 != 455936 || tm.DMRS != "pos0" {
		t.Errorf("capability 2: %+v", tm)
	}
	// n0: N_TA,offset 0 (FR1 FDD with LTE-NR coexistence); ignored in FR2.
	q = p.Clone()
	q.Carrier.NTAOffset = "n0"
	if got := Compute(q).Timing.NTAOffset; got != 0 {
		t.Errorf("n0 gives N_TA,offset %d", got)
	}
	q = plan(100, part("all", 120, 0, 66))
	q.Carrier.Range, q.Carrier.NTAOffset = "FR2-1", "n0"
	r = Compute(q)
	if _, ok := findingAt(r, Warning, CodeTiming, "carrier.nTaOffset"); !ok || r.Timing.NTAOffset != 13792 {
		t.Errorf("FR2 with n0: N_TA,offset %d, findings %v", r.Timing.NTAOffset, r.Findings)
	}
}

// TS 38.133 Table 8.6.2-1: 1 slot at 15 kHz (1 ms) and 2 at 30 kHz (1 ms)
// for type 1, 3 (3 ms) and 5 (2.5 ms) for type 2; a switch between the two
// takes the larger, in both directions. The RRC switch: 10 ms + 6 ms.
func TestBWPSwitchMatrix(t *testing.T) {
	r := Compute(plan(40, part("a", 15, 0, 50), part("b", 30, 40, 50)))
	if r.HasErrors() {
		t.Fatal(r.Findings)
	}
	want := []BWPSwitch{{"a", "b", ms, 3 * ms}, {"b", "a", ms, 3 * ms}}
	if got := r.Timing.BWPSwitch; len(got) != 2 || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("BWP switch %+v, want %+v", got, want)
	}
	if r.Timing.BWPSwitchRRC != 16*ms {
		t.Errorf("RRC switch %d Tc, want 16 ms", r.Timing.BWPSwitchRRC)
	}
}

// The advice: an environment with only the timing keys judges latency and
// range without the channel fit. FDD in FR1 at 7 km: every timing advance
// covers it; a 1.2 ms target is met in the worst case (slot latency) by
// 60 kHz only (803.3 µs; 30 kHz has 1356.8), marginally by 30 kHz (mean
// 1106.8 µs), and missed by 15 kHz (mean 2070.8 µs) — the FDD figures of
// TestLatencyFDD30kHz's arithmetic at each spacing.
func TestAdviceLatencyAndRange(t *testing.T) {
	p := plan(100, part("all", 30, 0, 273))
	p.Environment = &EnvironmentPlan{CellRadiusKm: 7, LatencyTargetMs: 1.2}
	r := Compute(p)
	if r.Fit != nil || r.Advice == nil {
		t.Fatalf("fit %v, advice %v, findings %v", r.Fit, r.Advice, r.Findings)
	}
	want := map[string]Verdict{"15 normal": Poor, "30 normal": Marginal, "60 normal": Suits, "60 extended": Suits}
	for _, row := range r.Advice.Rows {
		key := strconv.Itoa(row.SCSKHz) + " " + row.CP
		if row.Verdict != want[key] {
			t.Errorf("%s: %s, want %s (%+v)", key, row.Verdict, want[key], row.Criteria)
		}
		if len(row.Criteria) != 2 {
			t.Errorf("%s: criteria %+v, want latency and timing advance", key, row.Criteria)
		}
	}
	if c := r.Advice.Chosen; c == nil || c.SCSKHz != 60 {
		t.Errorf("chosen %+v, want 60 kHz", c)
	}
	// A target no numerology meets: none chosen, and the reason says why.
	p.Environment.LatencyTargetMs = 0.1
	a := Compute(p).Advice
	if a.Chosen != nil || !strings.Contains(a.Reason, "15 kHz normal CP: latency-target poor") {
		t.Errorf("0.1 ms: chosen %+v, reason %q", a.Chosen, a.Reason)
	}
}

// The advice's row for a partition's own numerology repeats the
// partition's latency (the same walk on the same pattern), one row per
// SCS and CP of the range.
func TestAdviceRowsMatchPartitions(t *testing.T) {
	p := dddsu30()
	p.Partitions = append(p.Partitions, part("fast", 60, 0, 10))
	p.Partitions[0].SizePRB = 100
	p.Partitions[1].StartCRB = iptr(60)
	p.Environment = &EnvironmentPlan{LatencyTargetMs: 4}
	r := Compute(p)
	if r.HasErrors() || r.Advice == nil {
		t.Fatalf("findings %v", r.Findings)
	}
	if n := len(r.Advice.Rows); n != 4 {
		t.Fatalf("%d rows in FR1, want 4 (15, 30, 60 and 60 extended)", n)
	}
	for _, l := range r.Partitions {
		var row *AdviceRow
		for i := range r.Advice.Rows {
			if rr := &r.Advice.Rows[i]; rr.SCSKHz == l.Numerology.SCSKHz() && rr.CP == "normal" {
				row = rr
			}
		}
		want := adviceLatency(l.Timing.Slot.DL, l.Timing.Slot.UL)
		if row == nil || row.LatencyUs == nil || *row.LatencyUs != *want {
			t.Errorf("%s: advice row %+v, partition %+v", l.Name, row, want)
		}
	}
	// 15 kHz cannot keep a 2.5 ms period (2.5 slots, TS 38.213 11.1).
	r15 := r.Advice.Rows[0]
	if r15.SCSKHz != 15 || r15.Note == "" || r15.Verdict != Poor || r15.LatencyUs != nil {
		t.Errorf("15 kHz under a 2.5 ms pattern: %+v", r15)
	}
	for _, rng := range []string{"FR2-1", "FR2-2"} {
		q := plan(100, part("all", 120, 0, 66))
		q.Carrier.Range = rng
		q.Environment = &EnvironmentPlan{CellRadiusKm: 1}
		if n := len(Compute(q).Advice.Rows); n != 3 {
			t.Errorf("%s: %d rows, want 3", rng, n)
		}
	}
}

// Below the reference spacing the pattern is kept in time: a 15 kHz
// symbol spans two 30 kHz ones and is flexible unless both agree. With 5 ms
// of DDDDDDDSUU at 30 kHz, 15 kHz slot 3 holds 30 kHz slots 6 (D) and 7
// (10 D, 2 F, 2 U): 7 + 5 downlink symbols, one flexible, one uplink. The
// guard is 30 kHz symbols 10–11 of slot 7, one 15 kHz symbol (symbol 12,
// not the first of a half subframe), the same 140288 Tc.
func TestAdviceBelowReference(t *testing.T) {
	tdd := &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 5, DownlinkSlots: 7, DownlinkSymbols: 10, UplinkSlots: 2, UplinkSymbols: 2}}
	p := plan(100, part("all", 30, 0, 273))
	p.TDD = tdd
	r := Compute(p)
	pat, ok := timingPattern(r.TDD, 0, 0)
	if !ok || len(pat.Dir) != 5*14 {
		t.Fatalf("15 kHz pattern: %v, %d symbols", ok, len(pat.Dir))
	}
	if got := string(pat.Dir[3*14 : 4*14]); got != "DDDDDDDDDDDDFU" {
		t.Errorf("15 kHz slot 3 %s, want DDDDDDDDDDDDFU", got)
	}
	if g, n, ok := shortestGuard(pat); !ok || n != 1 || g != 140288 {
		t.Errorf("guard %d Tc, %d symbols", g, n)
	}
}

// An extended-CP partition counts its own symbols in the guard: at 60 kHz
// a symbol lasts (2048 + 512)·64/4 = 40960 Tc. Under DDDSU at 30 kHz
// (10:2:2) the guard, 30 kHz symbols 10–11 of slot 3, runs from 1.5 ms +
// 1024 + 10·70144 Tc to 1.5 ms + 1024 + 12·70144 Tc, that is 702464 to
// 842752 Tc into the half subframe at 1.5 ms. Extended-CP symbols start
// every 40960 Tc from 1.5 ms: symbol 17 (696320 to 737280) straddles the
// start, 18 to 19 (737280 to 819200) lie inside, 20 (819200 to 860160)
// straddles the end. Symbols 17 and 20 hold downlink and uplink edges
// with flexible time, so they are flexible too: 4 symbols in all.
func TestExtendedCPGuardSymbols(t *testing.T) {
	p := dddsu30()
	p.Partitions = []PartitionPlan{{Name: "ecp", SCSKHz: 60, CP: "extended", StartCRB: iptr(0), SizePRB: 100}}
	r := Compute(p)
	if tm := r.Partitions[0].Timing; tm == nil || tm.GuardSymbols != 4 {
		t.Fatalf("extended CP guard: %+v, findings %v", tm, r.Findings)
	}
	if _, ok := r.Timing.GuardSymbols[60]; ok {
		t.Errorf("the normal-CP guard table counts extended-CP symbols: %v", r.Timing.GuardSymbols)
	}
}
