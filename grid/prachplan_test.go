package grid_test

import (
	"math"
	"os"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// prachPlan reads a plan of testdata/prach.
func prachPlan(t testing.TB, name string) grid.Plan {
	t.Helper()
	data, err := os.ReadFile("../testdata/prach/" + name)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// prachFindings are the findings of code prach.
func prachFindings(r grid.Result) []grid.Finding {
	var out []grid.Finding
	for _, f := range r.Findings {
		if f.Code == grid.CodePRACH {
			out = append(out, f)
		}
	}
	return out
}

func near(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

// Worked by hand: a long format on FDD. testdata/prach/fdd-long.yaml is
// n3 (FDD, TS 38.101-1 Table 5.2-1), so Table 6.3.3.2-2 applies; index 17
// is format 0, x = 1, y = 0, subframe 4, starting symbol 0 (TS 38.211
// Table 6.3.3.2-2).
func TestPRACHLongFormatFDD(t *testing.T) {
	r := grid.Compute(prachPlan(t, "fdd-long.yaml"))
	if fs := prachFindings(r); len(fs) > 0 || r.HasErrors() {
		t.Fatalf("findings %v", r.Findings)
	}
	p := r.PRACH
	if p == nil {
		t.Fatal("no PRACH")
	}
	// Format 0: L_RA = 839, Δf^RA = 1.25 kHz (TS 38.211 Table 6.3.3.1-1).
	// Table 6.3.3.2-1: L_RA 839, 1.25 kHz PRACH in a 15 kHz PUSCH BWP:
	// N_RB^RA = 6, k̄ = 7.
	if p.Table != "6.3.3.2-2" || p.Format != "0" || p.SequenceLength != 839 || p.SCSHz != 1250 || p.NRBRA != 6 || p.KBar != 7 {
		t.Errorf("row: table %s format %s L_RA %d Δf %d Hz N_RB^RA %d k̄ %d; want 6.3.3.2-2, 0, 839, 1250, 6, 7",
			p.Table, p.Format, p.SequenceLength, p.SCSHz, p.NRBRA, p.KBar)
	}
	// Four blocks (bitmap 1111), one per occasion, one occasion per 10 ms:
	// a mapping cycle takes 4 occasions = 4 configuration periods, a value
	// of TS 38.213 Table 8.1-1 for a 10 ms period (1, 2, 4, 8, 16).
	if p.AssociationPeriodFrames != 4 || len(p.Occasions) != 4 {
		t.Fatalf("association period %d frames with %d occasions; want 4 and 4", p.AssociationPeriodFrames, len(p.Occasions))
	}
	// The occasion of frame f starts at subframe 4: (10f + 4)·1 966 080 Tc
	// (Tc = 1/(480000·4096) s, TS 38.211 4.1; 1 ms = 1 966 080 Tc); frame 0:
	// 7 864 320 Tc. It holds 1 ms by common practice: end 9 830 400 Tc.
	// Frequency: the uplink partition starts at CRB 54, msg1-FrequencyStart
	// 10 puts the occasion on CRBs 64–69 of 15 kHz; CRB n's lower edge is
	// n·180 − 7.5 kHz from point A (TS 38.211 4.4.4.3): 11 512.5 to
	// 12 592.5 kHz.
	for f, o := range p.Occasions {
		start := grid.Tc(10*f+4) * 1966080
		if o.Frame != f || o.Start != start || o.End != start+1966080 || o.Low != 11512500 || o.High != 12592500 ||
			!o.Valid || !slices.Equal(o.SSBIndexes, []int{f}) {
			t.Errorf("occasion %d: %+v; want frame %d, %d–%d Tc, 11512.5–12592.5 kHz, valid, block %d", f, o, f, start, start+1966080, f)
		}
	}
	// Cell range. CP: N_CP = 3168κ = 202 752 Tc → c·T/2 = 299 792 458 ·
	// 202 752 / (2 · 1 966 080 000) = 15 458 m. Guard: 1 966 080 − 202 752 −
	// 24 576·64 (= 1 572 864) = 190 464 Tc → 14 521 m. N_CS: zeroCorrelation-
	// ZoneConfig 12, unrestricted, 1.25 kHz: 119 (TS 38.211 Table 6.3.3.1-5);
	// r = c·119·(1/1250 s)/(2·839) = 17 008 m. The limit is the guard's.
	if p.NCS != 119 || !near(p.Range.CP, 15458, 1) || !near(p.Range.Guard, 14521, 1) || !near(p.Range.ZeroCorrelation, 17008, 1) || p.CellRangeKm != 14.521 {
		t.Errorf("N_CS %d, range CP %.0f m guard %.0f m N_CS %.0f m limit %v km; want 119, 15458, 14521, 17008, 14.521",
			p.NCS, p.Range.CP, p.Range.Guard, p.Range.ZeroCorrelation, p.CellRangeKm)
	}
}

// Worked by hand: a short format on a DDDSU pattern at 30 kHz.
// testdata/prach/dddsu.yaml is n78 (TDD), Table 6.3.3.2-3; index 160 is
// format B4, x = 1, y = 0, subframe 9, starting symbol 2, one PRACH slot
// per subframe (so the second at 30 kHz, n_slot^RA = 1), N_dur = 12.
func TestPRACHShortFormatDDDSU(t *testing.T) {
	r := grid.Compute(prachPlan(t, "dddsu.yaml"))
	p := r.PRACH
	if p == nil || r.HasErrors() {
		t.Fatalf("no PRACH, findings %v", r.Findings)
	}
	// Table 6.3.3.2-1: L_RA 139, 30 kHz PRACH in a 30 kHz BWP: 12 RBs.
	if p.Format != "B4" || p.SCSHz != 30000 || p.NRBRA != 12 || p.FDM != 2 {
		t.Errorf("format %s Δf %d N_RB^RA %d FDM %d; want B4, 30000, 12, 2", p.Format, p.SCSHz, p.NRBRA, p.FDM)
	}
	// DDDSU at 30 kHz: slots 4, 9, 14, 19 of each frame are uplink; slot 19
	// is the second slot of subframe 9. l = 2 + 14·1 = 16 at μ = 1 from the
	// subframe's start: 16 symbols of (2048+144)·64/2 = 70 144 Tc plus 16κ =
	// 1024 Tc for each half subframe passed (l ≥ 1 and l ≥ 15): 16·70 144 +
	// 2048 = 1 124 352 Tc, after 9·1 966 080 = 17 694 720: 18 819 072 Tc. Its
	// 12 symbols end with the slot: 10 ms = 19 660 800 Tc. All uplink, so valid.
	// msg1-FDM 2 doubles each: blocks 0,1 in frame 0 and 2,3 in frame 1
	// (frequency first, TS 38.213 8.1): two frames, Table 8.1-1 allows 2.
	// Frequency: msg1-FrequencyStart 4 on the BWP from CRB 0: CRBs 4–15 and
	// 16–27 of 30 kHz; edges n·360 − 15 kHz: 1425, 5745, 10065 kHz.
	want := []struct {
		frame, fdm int
		start      grid.Tc
		low, high  grid.Hz
		ssb        int
	}{
		{0, 0, 18819072, 1425000, 5745000, 0},
		{0, 1, 18819072, 5745000, 10065000, 1},
		{1, 0, 18819072 + 19660800, 1425000, 5745000, 2},
		{1, 1, 18819072 + 19660800, 5745000, 10065000, 3},
	}
	if p.AssociationPeriodFrames != 2 || len(p.Occasions) != len(want) {
		t.Fatalf("association period %d frames, %d occasions; want 2 and 4", p.AssociationPeriodFrames, len(p.Occasions))
	}
	for i, w := range want {
		o := p.Occasions[i]
		if o.Frame != w.frame || o.FDM != w.fdm || o.Start != w.start || o.End != grid.Tc(w.frame+1)*19660800 ||
			o.Slot != 19 || o.StartSymbol != 2 || o.Low != w.low || o.High != w.high || !o.Valid || !slices.Equal(o.SSBIndexes, []int{w.ssb}) {
			t.Errorf("occasion %d: %+v; want %+v", i, o, w)
		}
	}
	// B4 at 30 kHz: N_CP = 936κ/2 = 29 952 Tc → 2 283.6 m; guard = 12 symbols
	// (841 728 Tc) − 29 952 − 12·2048·32 (786 432) = 25 344 Tc → 1 932.3 m;
	// N_CS = 27 (zeroCorrelationZoneConfig 12, TS 38.211 Table 6.3.3.1-7):
	// c·27/(30 000·2·139) = 970.6 m, the limit.
	if !near(p.Range.CP, 2283.6, 0.1) || !near(p.Range.Guard, 1932.3, 0.1) || !near(p.Range.ZeroCorrelation, 970.6, 0.1) || p.CellRangeKm != 0.971 {
		t.Errorf("range CP %.1f guard %.1f N_CS %.1f limit %v km; want 2283.6, 1932.3, 970.6, 0.971", p.Range.CP, p.Range.Guard, p.Range.ZeroCorrelation, p.CellRangeKm)
	}
	// The guard of DDDSU (2 flexible symbols at 30 kHz, 71.9 µs less
	// N_TA,offset 13 µs) reaches further than 0.97 km: the warning.
	fs := prachFindings(r)
	if len(fs) != 1 || fs[0].Severity != grid.Warning || fs[0].Field != "prach.zeroCorrelationZoneConfig" {
		t.Errorf("findings %v; want one zeroCorrelationZoneConfig warning", fs)
	}
}

// Worked by hand: an FR2 index. testdata/prach/fr2.yaml is n257 at 120 kHz
// under DDDSU of 0.625 ms; index 135 of Table 6.3.3.2-4 is format B4,
// x = 1, y = 0, 60 kHz slots 4, 9, …, 39, starting symbol 0, one PRACH slot
// per 60 kHz slot (the second 120 kHz slot, TS 38.211 5.3.2), N_dur = 12.
func TestPRACHFR2(t *testing.T) {
	r := grid.Compute(prachPlan(t, "fr2.yaml"))
	p := r.PRACH
	if p == nil || r.HasErrors() {
		t.Fatalf("no PRACH, findings %v", r.Findings)
	}
	// 60 kHz slot 4 → 120 kHz slots 8 and 9; the occasion is in 9, the
	// uplink slot of the second DDDSU period. Slot 9 is the second of
	// subframe 1 (8 slots a subframe): l = 14 at μ = 3, 14·(2192·64/8 =
	// 17 536) + 1024 (16κ at l ≥ 1) = 246 528 Tc after 1 966 080: 2 212 608 Tc;
	// it ends at l = 26: 26·17 536 + 1024 = 456 960 → 2 423 040 Tc. The
	// others follow every ten 120 kHz slots (slot s = 10i + 9: subframe
	// s/8, l = 14·(s mod 8)), by the same sum of TS 38.211 5.3.1: 16κ more
	// at l ≥ 1 and at l ≥ 57, the second half subframe.
	if len(p.Occasions) != 8 || p.AssociationPeriodFrames != 1 {
		t.Fatalf("%d occasions over %d frames; want 8 over 1 (8 blocks, one each)", len(p.Occasions), p.AssociationPeriodFrames)
	}
	at := func(sf, l int) grid.Tc {
		t := grid.Tc(sf)*1966080 + grid.Tc(l)*17536
		if l >= 1 {
			t += 1024
		}
		if l >= 57 {
			t += 1024
		}
		return t
	}
	if at(1, 14) != 2212608 || at(1, 26) != 2423040 {
		t.Fatalf("the sum disagrees with the worked first occasion")
	}
	for i, o := range p.Occasions {
		s := 10*i + 9
		start, end := at(s/8, 14*(s%8)), at(s/8, 14*(s%8)+12)
		if o.Slot != s || o.Start != start || o.End != end || !o.Valid || !slices.Equal(o.SSBIndexes, []int{i}) {
			t.Errorf("occasion %d: %+v; want slot %d, %d–%d Tc, valid, block %d", i, o, s, start, end, i)
		}
	}
	// B4 at 120 kHz: N_CP = 936·64/8 = 7 488 Tc → 570.9 m; guard 210 432 −
	// 7 488 − 12·2048·8 (196 608) = 6 336 Tc → 483.1 m; N_CS 27 →
	// c·27/(120 000·2·139) = 242.6 m (TS 38.211 Tables 6.3.3.1-2, -7).
	// Table 6.3.3.2-1: 120 kHz PRACH in a 120 kHz BWP, 12 RBs.
	if p.NRBRA != 12 || !near(p.Range.CP, 570.9, 0.1) || !near(p.Range.Guard, 483.1, 0.1) || !near(p.Range.ZeroCorrelation, 242.6, 0.1) {
		t.Errorf("N_RB^RA %d, range CP %.1f guard %.1f N_CS %.1f; want 12, 570.9, 483.1, 242.6", p.NRBRA, p.Range.CP, p.Range.Guard, p.Range.ZeroCorrelation)
	}
}

// Each finding of code prach, from a plan that draws it.
func TestPRACHFindings(t *testing.T) {
	for _, c := range []struct {
		name, plan string
		edit       func(*grid.PRACHPlan)
		sev        grid.Severity
		field, has string
	}{
		{"index beyond the table", "fdd-long.yaml", func(p *grid.PRACHPlan) { p.ConfigurationIndex = 256 }, grid.Error, "prach.configurationIndex", "defines 0 to 255"},
		{"spacing the long format does not allow", "fdd-long.yaml", func(p *grid.PRACHPlan) { p.Msg1SubcarrierSpacing = 15 }, grid.Error, "prach.msg1SubcarrierSpacing", "fixes 1.25 kHz"},
		{"spacing of FR2 in FR1", "dddsu.yaml", func(p *grid.PRACHPlan) { p.Msg1SubcarrierSpacing = 120 }, grid.Error, "prach.msg1SubcarrierSpacing", "allows 15 or 30 kHz"},
		{"msg1-FDM", "dddsu.yaml", func(p *grid.PRACHPlan) { p.Msg1FDM = 3 }, grid.Error, "prach.msg1FDM", "1, 2, 4 or 8"},
		{"beyond the BWP", "dddsu.yaml", func(p *grid.PRACHPlan) { p.Msg1FrequencyStart = 90 }, grid.Error, "prach.msg1FrequencyStart", "beyond the 106 PRBs"},
		{"restricted set on a short format", "dddsu.yaml", func(p *grid.PRACHPlan) { p.RestrictedSetConfig = "restrictedSetTypeA" }, grid.Error, "prach.zeroCorrelationZoneConfig", "supports no restricted set type A"},
		{"restricted set name", "dddsu.yaml", func(p *grid.PRACHPlan) { p.RestrictedSetConfig = "typeA" }, grid.Error, "prach.restrictedSetConfig", "unrestrictedSet, restrictedSetTypeA or restrictedSetTypeB"},
		{"ssb per occasion", "dddsu.yaml", func(p *grid.PRACHPlan) { p.SSBPerRachOccasion = "3" }, grid.Error, "prach.ssbPerRachOccasion", "1/8, 1/4"},
		// Index 159: subframe 9, starting symbol 0 of slot 19 — its
		// occasion ends at symbol 11, all uplink, valid. Index 157 puts it in
		// subframe 4's second slot, slot 9: uplink as well. Index 156 is
		// subframe 2, slot 5: downlink.
		{"occasions on downlink symbols", "dddsu.yaml", func(p *grid.PRACHPlan) { p.ConfigurationIndex = 156 }, grid.Error, "prach.configurationIndex", "overlaps a downlink symbol"},
		// Four blocks at 1/8 per occasion need 32 occasions; index 160 with
		// msg1-FDM 1 gives one per 10 ms, 16 in the longest association
		// period of TS 38.213 Table 8.1-1 for a 10 ms period (16 periods).
		{"blocks not mapped", "dddsu.yaml", func(p *grid.PRACHPlan) { p.SSBPerRachOccasion = "1/8"; p.Msg1FDM = 1 }, grid.Error, "prach.ssbPerRachOccasion", "too few"},
		{"cyclic shift below the guard", "dddsu.yaml", func(p *grid.PRACHPlan) {}, grid.Warning, "prach.zeroCorrelationZoneConfig", "below the 6.79 km"},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := prachPlan(t, c.plan)
			c.edit(p.PRACH)
			fs := prachFindings(grid.Compute(p))
			i := slices.IndexFunc(fs, func(f grid.Finding) bool { return f.Field == c.field && f.Severity == c.sev })
			if i < 0 || !strings.Contains(fs[i].Message, c.has) {
				t.Fatalf("findings %v; want a %s on %s saying %q", fs, c.sev, c.field, c.has)
			}
		})
	}
}

// Every index the finder lists passes the checks when applied to the plan:
// no prach error and every occasion valid; and one index it leaves out
// fails them.
func TestFindPRACHRowsPass(t *testing.T) {
	for _, name := range []string{"fdd-long.yaml", "dddsu.yaml", "fr2.yaml"} {
		t.Run(name, func(t *testing.T) {
			p := prachPlan(t, name)
			found, err := grid.FindPRACH(p)
			if err != nil {
				t.Fatal(err)
			}
			if found.Count() == 0 {
				t.Fatal("the finder lists no index, but the plan's own index fits")
			}
			listed := map[int]bool{}
			for _, g := range found.Groups {
				for _, c := range g.Choices {
					listed[c.ConfigurationIndex] = true
					q := p.Clone()
					q.PRACH.ConfigurationIndex = c.ConfigurationIndex
					r := grid.Compute(q)
					for _, f := range prachFindings(r) {
						if f.Severity == grid.Error {
							t.Errorf("index %d: %v", c.ConfigurationIndex, f)
						}
					}
					if r.PRACH == nil || r.PRACH.Format != g.Format || r.PRACH.CellRangeKm != c.CellRangeKm {
						t.Fatalf("index %d: PRACH %+v; want format %s, cell range %v km", c.ConfigurationIndex, r.PRACH, g.Format, c.CellRangeKm)
					}
					for _, o := range r.PRACH.Occasions {
						if !o.Valid {
							t.Errorf("index %d: occasion %+v not valid", c.ConfigurationIndex, o)
						}
					}
				}
			}
			if !listed[p.PRACH.ConfigurationIndex] {
				t.Errorf("the plan's own index %d, which passes, is not listed", p.PRACH.ConfigurationIndex)
			}
			// An index left out must fail when applied.
			for i := range found.Tried {
				if listed[i] {
					continue
				}
				q := p.Clone()
				q.PRACH.ConfigurationIndex = i
				r := grid.Compute(q)
				bad := r.PRACH == nil || slices.ContainsFunc(r.PRACH.Occasions, func(o grid.PRACHOccasion) bool { return !o.Valid }) ||
					slices.ContainsFunc(prachFindings(r), func(f grid.Finding) bool { return f.Severity == grid.Error })
				if !bad {
					t.Errorf("index %d passes every check but the finder leaves it out", i)
				}
			}
			t.Logf("%d of %d indexes of Table %s listed", found.Count(), found.Tried, found.Table)
		})
	}
}

// BenchmarkComputePRACH is Compute with a prach block on the stress plans
// and the three PRACH plans, against the same plans without.
func BenchmarkComputePRACH(b *testing.B) {
	plans := map[string]grid.Plan{}
	for _, n := range []string{"fdd-long", "dddsu", "fr2"} {
		plans[n] = prachPlan(b, n+".yaml")
	}
	st := prachPlan(b, "../stress/fr2-1-initial-access.yaml")
	// 64 blocks at 8 per occasion on the two uplink slots of 40: index 135
	// of Table 6.3.3.2-4 at 120 kHz, every 60 kHz slot 4, 9, …, 39.
	st.PRACH = &grid.PRACHPlan{ConfigurationIndex: 135, Msg1SubcarrierSpacing: 120, Msg1FDM: 8, SSBPerRachOccasion: "8"}
	plans["stress-fr2-64"] = st
	for name, p := range plans {
		without := p.Clone()
		without.PRACH = nil
		for _, c := range []struct {
			run  string
			plan grid.Plan
		}{{"with", p}, {"without", without}} {
			b.Run(name+"/"+c.run, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					_ = grid.Compute(c.plan)
				}
			})
		}
	}
}

// BenchmarkFindPRACH tries every index of the table.
func BenchmarkFindPRACH(b *testing.B) {
	for _, n := range []string{"fdd-long", "dddsu", "fr2"} {
		p := prachPlan(b, n+".yaml")
		b.Run(n, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := grid.FindPRACH(p); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// Worked by hand: the association pattern period of TS 38.213 clause 8.1,
// the least whole number of association periods after which the pattern
// between PRACH occasions and SS/PBCH block indexes repeats, at most 160 ms.
func TestPRACHAssociationPatternPeriod(t *testing.T) {
	// Paired spectrum validates every occasion, so the pattern is the
	// association period: 4 frames for fdd-long.yaml (TestPRACHLongFormatFDD).
	r := grid.Compute(prachPlan(t, "fdd-long.yaml"))
	if p := r.PRACH; p == nil || p.AssociationPatternPeriodFrames != 4 || p.PatternNote != "" {
		t.Errorf("fdd-long: %+v; want a pattern period of 4 frames and no note", p)
	}
	// dddsu.yaml sends its blocks every 20 ms, but its occasions fill slot
	// 19, all uplink and valid in every frame, blocks or not: the pattern is
	// the association period, 2 frames.
	r = grid.Compute(prachPlan(t, "dddsu.yaml"))
	if p := r.PRACH; p == nil || p.AssociationPeriodFrames != 2 || p.AssociationPatternPeriodFrames != 2 || p.PatternNote != "" {
		t.Errorf("dddsu: %+v; want association and pattern periods of 2 frames", p)
	}
	// The same carrier without tdd-UL-DL-ConfigurationCommon and index 167
	// of Table 6.3.3.2-3: B4, x = 1, every subframe, two PRACH slots per
	// subframe, so at 30 kHz an occasion in symbols 0–11 of each of the 20
	// slots. The four blocks of case C at 30 kHz sit in symbols 2–5 and
	// 8–11 of slots 0 and 1 (TS 38.213 4.1, case C: {2, 8} + 14·n from the
	// half frame's start, n = 0, 1 for the bitmap's first four: symbols 2,
	// 8, 16, 22). Without a TDD pattern an occasion is valid if no block
	// follows it in its PRACH slot and it
	// starts N_gap = 2 symbols after the last block symbol (TS 38.213 8.1,
	// Table 8.1-2): slots 0 and 1 have blocks after symbol 0, invalid; slot
	// 2 starts at symbol 28, two symbols after the last block symbol (25),
	// valid, and so are slots 3 to 19. A frame with blocks has 18 valid
	// occasions, 36 with msg1-FDM 2, against 4 for a mapping cycle: the
	// association period is one frame. The blocks come every 20 ms, so frame
	// 1 has none, and there all 20 are valid: the frames repeat every 2,
	// and the pattern period is lcm(1, 2) = 2 frames.
	plan := prachPlan(t, "dddsu.yaml")
	plan.TDD = nil
	plan.PRACH.ConfigurationIndex = 167
	r = grid.Compute(plan)
	p := r.PRACH
	if p == nil || r.HasErrors() {
		t.Fatalf("no PRACH, findings %v", r.Findings)
	}
	valid := 0
	for _, o := range p.Occasions {
		if o.Valid {
			valid++
		}
	}
	if p.AssociationPeriodFrames != 1 || len(p.Occasions) != 40 || valid != 36 {
		t.Errorf("association period %d frames, %d occasions, %d valid; want 1, 40, 36", p.AssociationPeriodFrames, len(p.Occasions), valid)
	}
	if p.AssociationPatternPeriodFrames != 2 || !strings.Contains(p.PatternNote, "every 20 ms") || !strings.Contains(p.PatternNote, "2 more occasion") {
		t.Errorf("pattern period %d frames, note %q; want 2 frames, blocks every 20 ms and 2 more occasions", p.AssociationPatternPeriodFrames, p.PatternNote)
	}
	// Blocks every 10 ms: every frame alike again, the pattern is one frame.
	plan.SSB.PeriodMs = 10
	if p := grid.Compute(plan).PRACH; p == nil || p.AssociationPatternPeriodFrames != 1 {
		t.Errorf("blocks every 10 ms: %+v; want a pattern period of 1 frame", p)
	}
	// Blocks every 160 ms: 16 frames, the longest the clause allows.
	plan.SSB.PeriodMs = 160
	if p := grid.Compute(plan).PRACH; p == nil || p.AssociationPatternPeriodFrames != 16 {
		t.Errorf("blocks every 160 ms: %+v; want a pattern period of 16 frames", p)
	}
}

// Worked by hand: what a figure span from frame 0 shows of the occasions.
func TestPRACHInSpan(t *testing.T) {
	// dddsu.yaml: the span defaults to the TDD period rounded up, 3 ms; the
	// occasions start at 18 819 072 Tc = 9.571 ms of frames 0 and 1 (two
	// side by side in each, TestPRACHShortFormatDDDSU): none shown, the
	// next is frame 0's first, and a 10 ms span (the end of frame 0, where
	// they end) shows frame 0's two of the four.
	r := grid.Compute(prachPlan(t, "dddsu.yaml"))
	if r.Plan.SpanMs != 3 {
		t.Fatalf("span %d ms, want 3", r.Plan.SpanMs)
	}
	s := r.PRACH.InSpan(r.Plan.SpanMs)
	if s.Shown != 0 || s.Total != 4 || s.Next == nil || s.Next.Frame != 0 || s.Next.Start != 18819072 || s.FitMs != 10 || s.FitShown != 2 {
		t.Errorf("dddsu: %+v; want 0 of 4 shown, next frame 0 at 18819072 Tc, fit 10 ms showing 2", s)
	}
	if s := r.PRACH.InSpan(10); s.Shown != 2 || s.Next == nil || s.Next.Frame != 1 {
		t.Errorf("dddsu at 10 ms: %+v; want 2 shown, next in frame 1", s)
	}
	// fdd-long.yaml: no TDD, span 1 ms; the occasions hold subframe 4 of
	// frames 0–3 (TestPRACHLongFormatFDD): none shown, next at 4 ms of
	// frame 0; a 5 ms span holds frame 0's whole (it ends at 5 ms).
	r = grid.Compute(prachPlan(t, "fdd-long.yaml"))
	s = r.PRACH.InSpan(r.Plan.SpanMs)
	if r.Plan.SpanMs != 1 || s.Shown != 0 || s.Total != 4 || s.Next == nil || s.Next.Start != 4*1966080 || s.FitMs != 5 || s.FitShown != 1 {
		t.Errorf("fdd-long (span %d ms): %+v; want 0 of 4, next at 7864320 Tc, fit 5 ms showing 1", r.Plan.SpanMs, s)
	}
	// Index 1 of Table 6.3.3.2-2: format 0, x = 16, y = 1, subframe 4
	// (TS 38.211 Table 6.3.3.2-2): occasions only in frames 1, 17, …; the
	// association period (4 blocks, one occasion per 160 ms) cannot map
	// the four blocks within 160 ms, so the occasions are those of one
	// configuration period: one, in frame 1 at 14 ms. No span from frame 0
	// shows it.
	p := prachPlan(t, "fdd-long.yaml")
	p.PRACH.ConfigurationIndex = 1
	p.SpanMs = 10
	r = grid.Compute(p)
	if r.PRACH == nil {
		t.Fatalf("no PRACH: %v", r.Findings)
	}
	s = r.PRACH.InSpan(r.Plan.SpanMs)
	if s.Shown != 0 || s.Total != 1 || s.Next == nil || s.Next.Frame != 1 || s.Next.Start != 14*1966080 || s.FitMs != 0 || s.FitShown != 0 {
		t.Errorf("x = 16, y = 1: %+v; want 0 of 1, next in frame 1 at 14 ms, no fit", s)
	}
	// Every occasion shown: nothing next.
	r = grid.Compute(prachPlan(t, "fdd-long.yaml"))
	r.PRACH.Occasions = r.PRACH.Occasions[:1]
	if s := r.PRACH.InSpan(10); s.Shown != 1 || s.Next != nil {
		t.Errorf("one occasion in 10 ms: %+v; want it shown and nothing next", s)
	}
}
