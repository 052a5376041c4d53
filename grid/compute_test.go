package grid

import (
	"fmt"
	"slices"
	"strings"
	"testing"
)

func iptr(v int) *int         { return &v }
func fptr(v float64) *float64 { return &v }
func part(name string, scs, start, size int) PartitionPlan {
	return PartitionPlan{Name: name, SCSKHz: scs, StartCRB: iptr(start), SizePRB: size}
}

func plan(bw int, parts ...PartitionPlan) Plan {
	return Plan{Name: "test", Carrier: CarrierPlan{BandwidthMHz: bw}, Partitions: parts}
}

// TS 38.101-1 5.4.2.2, Table 5.4.2.2-1: the RF reference frequency maps to
// subcarrier k of PRB n_PRB = ⌊N_RB/2⌋ with k = 0 for even N_RB and k = 6
// for odd N_RB. With one SCS and offset 0, the lower guard is then the
// minimum guardband of Table 5.3.3-1 and the upper guard one subcarrier more.
func TestSingleCarrierPlacement(t *testing.T) {
	for _, rng := range []Range{FR1, FR2_1, FR2_2} {
		for _, scs := range rng.DataSCS() {
			for _, bw := range rng.Bandwidths(scs) {
				nrb, _ := rng.NRB(scs, bw)
				r := Compute(Plan{Carrier: CarrierPlan{Range: rng.String(), BandwidthMHz: bw},
					Partitions: []PartitionPlan{{Name: "all", SCSKHz: scs, SizePRB: nrb}}})
				name := fmt.Sprintf("%s %d kHz %d MHz", rng, scs, bw)
				if r.HasErrors() {
					t.Errorf("%s: %v", name, r.Findings)
					continue
				}
				k := 0
				if nrb%2 == 1 {
					k = 6
				}
				sub := Hz(12*(nrb/2) + k)
				wantCentre := sub * Hz(scs) * 1000 // point A is the carrier's subcarrier 0
				if r.Channel.Center != wantCentre {
					t.Errorf("%s: centre %v kHz from point A, want subcarrier %d = %v kHz", name, r.Channel.Center.KHz(), sub, wantCentre.KHz())
				}
				c := r.Carriers[0]
				g, _ := rng.MinGuard(scs, bw)
				if c.GuardLow != g || c.GuardHigh != g+Hz(scs)*1000 {
					t.Errorf("%s: guards %v / %v kHz, want %v / %v kHz", name, c.GuardLow.KHz(), c.GuardHigh.KHz(), g.KHz(), (g + Hz(scs)*1000).KHz())
				}
				if l := r.Partitions[0]; l.Low != -Hz(scs)*500 {
					t.Errorf("%s: CRB 0 lower edge %v kHz, want −SCS/2", name, l.Low.KHz())
				}
			}
		}
	}
}

// TS 38.211 4.4.4.3: subcarrier 0 of CRB 0 is centred on point A for every
// spacing, so CRB edges sit at n·12·SCS − SCS/2 and the grids of 15 and
// 30 kHz never share an edge: the nearest are 7.5 kHz apart.
func TestMixedGridsOffsetByHalfSubcarrier(t *testing.T) {
	nearest := Hz(1 << 62)
	for n := 0; n <= 550; n++ {
		for m := 0; m <= 275; m++ {
			d := CRBEdge(15, n) - CRBEdge(30, m)
			if d < 0 {
				d = -d
			}
			nearest = min(nearest, d)
		}
	}
	if nearest != 7500 {
		t.Errorf("nearest 15/30 kHz CRB edges %v kHz apart, want 7.5 kHz", nearest.KHz())
	}
}

// A worked 40 MHz mixed plan: with 15 kHz at offset 0 (216 PRBs) the
// 30 kHz carrier (106 PRBs) keeps both its 905 kHz minimum guards only at
// offset 1 (hand-worked: 6·216·15 − 6·106·30 = 360 kHz = one 30 kHz CRB).
func TestAutoOffsets40MHz(t *testing.T) {
	r := Compute(plan(40, part("a", 15, 0, 24), part("b", 30, 30, 20)))
	var got []string
	for _, c := range r.Carriers {
		got = append(got, fmt.Sprintf("%d:%d/%d", c.SCSKHz, c.OffsetToCarrier, c.CarrierBandwidth))
		if c.GuardLow < c.MinGuard || c.GuardHigh < c.MinGuard {
			t.Errorf("%d kHz carrier guards %v/%v kHz below the minimum %v", c.SCSKHz, c.GuardLow.KHz(), c.GuardHigh.KHz(), c.MinGuard.KHz())
		}
	}
	if want := []string{"15:0/216", "30:1/106"}; !slices.Equal(got, want) {
		t.Errorf("carriers %v, want %v", got, want)
	}
	if !hasCode(r, CodeAutoOffset) {
		t.Errorf("no %s finding reports the offsets chosen: %v", CodeAutoOffset, r.Findings)
	}
}

// At 100 MHz with 30 and 60 kHz no whole 60 kHz CRB keeps both 1370 kHz
// guards of a 135-PRB carrier (the window for its lower edge is 60 kHz wide,
// CRB steps are 720 kHz; hand-worked), so the rule in the README gives the
// 60 kHz carrier 134 PRBs, and says so.
func TestAutoOffsetsShrinkWhenNoOffsetFits(t *testing.T) {
	r := Compute(plan(100, part("a", 30, 0, 50), part("b", 60, 40, 20)))
	c, _ := r.Carrier(60)
	if c.CarrierBandwidth != 134 || c.NRB != 135 {
		t.Errorf("60 kHz carrier %d PRBs of N_RB %d, want 134 of 135", c.CarrierBandwidth, c.NRB)
	}
	if c.GuardLow < c.MinGuard || c.GuardHigh < c.MinGuard {
		t.Errorf("60 kHz guards %v/%v kHz below the minimum %v", c.GuardLow.KHz(), c.GuardHigh.KHz(), c.MinGuard.KHz())
	}
	if f := findCode(r, CodeAutoOffset); f == nil || !strings.Contains(f.Message, "134") {
		t.Errorf("auto-offset finding %v does not mention the reduced size", f)
	}
	// Every mixed pair of every FR1 bandwidth gets guard-keeping carriers.
	for _, bw := range FR1.AllBandwidths() {
		var parts []PartitionPlan
		for _, scs := range FR1.DataSCS() {
			if _, ok := FR1.NRB(scs, bw); ok {
				parts = append(parts, PartitionPlan{Name: fmt.Sprint(scs), SCSKHz: scs, SizePRB: 1, StartCRB: nil})
			}
		}
		r := Compute(Plan{Carrier: CarrierPlan{BandwidthMHz: bw}, Partitions: parts, NumerologyGapKHz: fptr(0)})
		for _, c := range r.Carriers {
			if c.GuardLow < c.MinGuard || c.GuardHigh < c.MinGuard || c.OffsetToCarrier < 0 {
				t.Errorf("%d MHz, %d kHz carrier: offset %d, guards %v/%v kHz, minimum %v", bw, c.SCSKHz, c.OffsetToCarrier, c.GuardLow.KHz(), c.GuardHigh.KHz(), c.MinGuard.KHz())
			}
		}
	}
}

// Common configuration (from memory): a 40 MHz carrier at 30 kHz with 106
// PRBs centred on 3619.2 MHz (NR-ARFCN 641280) has point A at 3600.12 MHz,
// NR-ARFCN 640008: 3619.2 − 6·106·30 kHz.
func TestPointAAbsolute(t *testing.T) {
	p := plan(40, part("all", 30, 0, 106))
	p.Carrier.CenterMHz = fptr(3619.2)
	r := Compute(p)
	ch := r.Channel
	if !ch.Absolute || ch.PointAHz != 3600.12e6 || !ch.PointAOnRaster || ch.PointAARFCN != 640008 || ch.ARFCN != 641280 {
		t.Errorf("channel %+v; want point A 3600.12 MHz (640008), centre NR-ARFCN 641280", ch)
	}
	p.Carrier.CenterMHz = nil
	p.Carrier.ARFCN = iptr(641280)
	if r2 := Compute(p); r2.Channel.PointAHz != 3600.12e6 {
		t.Errorf("from arfcn: point A %v MHz, want 3600.12", r2.Channel.PointAHz.MHz())
	}
}

func TestLocationAndBandwidth(t *testing.T) {
	p := plan(100, PartitionPlan{Name: "riv", SCSKHz: 30, LocationAndBandwidth: iptr(1099)})
	r := Compute(p)
	if len(r.Partitions) != 1 || r.Partitions[0].StartCRB != 0 || r.Partitions[0].SizePRB != 273 {
		t.Fatalf("RIV 1099 placed %+v; want start 0, 273 PRBs (TS 38.214 5.1.2.2.2)", r.Partitions)
	}
	// Relative to offsetToCarrier (TS 38.331 BWP): with the 30 kHz carrier at
	// offset 1, startCrb 26 and 50 PRBs are RIV 275·49 + 25 = 13500.
	r = Compute(Plan{Carrier: CarrierPlan{BandwidthMHz: 40, OffsetToCarrier: map[int]int{15: 0, 30: 1}},
		Partitions: []PartitionPlan{part("a", 15, 0, 48), part("b", 30, 26, 50)}})
	if got := r.Partitions[1].LocationAndBandwidth; got != 13500 {
		t.Errorf("locationAndBandwidth %d, want 13500", got)
	}
	if r.Plan.Partitions[0].LocationAndBandwidth != nil || *r.Plan.Partitions[1].StartCRB != 26 {
		t.Errorf("normalised plan partitions %+v; want startCrb/sizePrb filled and no RIV", r.Plan.Partitions)
	}
}

func with(pp PartitionPlan, f func(*PartitionPlan)) PartitionPlan { f(&pp); return pp }

func hasCode(r Result, code string) bool { return findCode(r, code) != nil }

func findCode(r Result, code string) *Finding {
	for i, f := range r.Findings {
		if f.Code == code {
			return &r.Findings[i]
		}
	}
	return nil
}

// Broken plans and the finding each must raise.
func TestFindings(t *testing.T) {
	many := make([]PartitionPlan, 17)
	for i := range many {
		many[i] = part(fmt.Sprint("p", i), 15, i, 1)
	}
	withCarrier := func(p Plan, f func(*CarrierPlan)) Plan { f(&p.Carrier); return p }
	ok40 := part("a", 15, 0, 24)

	for _, c := range []struct {
		name  string
		plan  Plan
		sev   Severity
		code  string
		field string
		say   string // part of the message
	}{
		{"no partitions", plan(40), Error, CodeEmpty, "partitions", "no partitions"},
		{"17 partitions", plan(40, many...), Error, CodeLimit, "partitions", "at most 16"},
		{"long plan name", Plan{Name: strings.Repeat("é", 65), Carrier: CarrierPlan{BandwidthMHz: 40}, Partitions: []PartitionPlan{ok40}}, Error, CodeLimit, "name", "at most 64"},
		{"long partition name", plan(40, part(strings.Repeat("x", 65), 15, 0, 1)), Error, CodeLimit, "partitions[0].name", "at most 64"},
		{"span 11 ms", Plan{SpanMs: 11, Carrier: CarrierPlan{BandwidthMHz: 40}, Partitions: []PartitionPlan{ok40}}, Error, CodeLimit, "spanMs", "1 to 10"},
		{"negative span", Plan{SpanMs: -1, Carrier: CarrierPlan{BandwidthMHz: 40}, Partitions: []PartitionPlan{ok40}}, Error, CodeLimit, "spanMs", "1 to 10"},
		{"unknown range", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.Range = "FR3" }), Error, CodeRange, "carrier.range", "FR1, FR2-1 or FR2-2"},
		{"unknown bandwidth", plan(33, ok40), Error, CodeBandwidth, "carrier.bandwidthMHz", "use 3, 5, 10"},
		{"missing bandwidth", plan(0, ok40), Error, CodeBandwidth, "carrier.bandwidthMHz", "missing"},
		{"15 kHz at 100 MHz", plan(100, ok40), Error, CodeBandwidth, "carrier.bandwidthMHz", "at 15 kHz use 3, 5"},
		{"carrierBandwidth above N_RB", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.CarrierBandwidth = map[int]int{15: 217} }), Error, CodeBandwidth, "carrier.carrierBandwidth.15", "1 to 216"},
		{"120 kHz in FR1", plan(40, part("a", 120, 0, 10)), Error, CodeSCSRange, "partitions[0].scsKHz", "15, 30 or 60"},
		{"240 kHz in FR2-1", withCarrier(plan(100, part("a", 240, 0, 10)), func(c *CarrierPlan) { c.Range = "FR2-1" }), Error, CodeSCSRange, "partitions[0].scsKHz", "SS/PBCH"},
		{"extended CP at 30 kHz", plan(40, with(part("a", 30, 0, 10), func(p *PartitionPlan) { p.CP = "extended" })), Error, CodeCP, "partitions[0].cp", "only at 60 kHz"},
		{"unknown CP", plan(40, with(ok40, func(p *PartitionPlan) { p.CP = "long" })), Error, CodeCP, "partitions[0].cp", "normal or extended"},
		{"no size", plan(40, PartitionPlan{Name: "a", SCSKHz: 15}), Error, CodeSize, "partitions[0].sizePrb", "locationAndBandwidth"},
		{"size 276", plan(40, part("a", 15, 0, 276)), Error, CodeSize, "partitions[0].sizePrb", "1 to 275"},
		{"negative start", plan(40, part("a", 15, -1, 10)), Error, CodeSize, "partitions[0].startCrb", "0 to 2473"},
		{"RIV out of range", plan(40, PartitionPlan{Name: "a", SCSKHz: 15, LocationAndBandwidth: iptr(37950)}), Error, CodeRIV, "partitions[0].locationAndBandwidth", "0 to 37949"},
		{"RIV disagrees", plan(100, with(part("a", 30, 2, 273), func(p *PartitionPlan) { p.LocationAndBandwidth = iptr(1099) })), Error, CodeRIV, "partitions[0].locationAndBandwidth", "startCrb 0 and sizePrb 273"},
		{"beyond carrier", plan(40, part("a", 15, 0, 217)), Error, CodeOutsideCarrier, "partitions[0].sizePrb", "CRBs 0 to 215"},
		{"below carrier", withCarrier(plan(40, part("a", 15, 0, 10)), func(c *CarrierPlan) {
			c.OffsetToCarrier = map[int]int{15: 2}
			c.CarrierBandwidth = map[int]int{15: 200}
		}), Error, CodeOutsideCarrier, "partitions[0].startCrb", "startCrb from 2"},
		{"same-SCS overlap", plan(40, part("a", 15, 0, 30), part("b", 15, 20, 30)), Error, CodeOverlap, "partitions[1].startCrb", "overlap by 1800 kHz"},
		// 15 kHz CRBs 0–23 end at 4312.5 kHz; the 30 kHz carrier at offset 1
		// puts CRB 12 at 360·12 − 15 = 4305 kHz: 7.5 kHz of overlap.
		{"half-subcarrier overlap", plan(40, part("a", 15, 0, 24), part("b", 30, 12, 10)), Error, CodeOverlap, "partitions[1].startCrb", "7.5 kHz"},
		// How to clear it, worked by hand: a's 15 kHz CRBs 0–29 end at
		// 30·180 − 7.5 = 5392.5 kHz, so b clears from CRB 30 (30·180 − 7.5);
		// b starts at 20·180 − 7.5 = 3592.5 kHz, so a may keep 20 PRBs.
		{"overlap, how to clear", plan(40, part("a", 15, 0, 30), part("b", 15, 20, 30)), Error, CodeOverlap, "partitions[1].startCrb",
			`to clear it, start "b" at CRB 30 or above, or shrink "a" to 20 PRBs or fewer.`},
		// a ends at 4312.5 kHz: b's 30 kHz CRB k starts at 360·k − 15 kHz,
		// ≥ 4312.5 from k = 13 (12 gives 4305); a's m PRBs end at
		// 180·m − 7.5 ≤ 4305 up to m = 23.
		{"half-subcarrier overlap, how to clear", plan(40, part("a", 15, 0, 24), part("b", 30, 12, 10)), Error, CodeOverlap, "partitions[1].startCrb",
			`start "b" at CRB 13 or above, or shrink "a" to 23 PRBs or fewer`},
		// With a centre the advice names the edges in MHz, worked by hand:
		// with offset 0 the centre 3750 MHz is subcarrier 0 of CRB 108
		// (N_RB 216, TS 38.101-1 5.4.2.2), so point A is 3750 − 108·0.18 =
		// 3730.56 MHz; CRB 30 starts at 3730.56 + 5.4 − 0.0075 and 20 PRBs
		// end at 3730.56 + 3.6 − 0.0075 (outer edges of the subcarriers).
		{"overlap, how to clear in MHz", withCarrier(plan(40, part("a", 15, 0, 30), part("b", 15, 20, 30)), func(c *CarrierPlan) {
			c.CenterMHz = fptr(3750)
			c.OffsetToCarrier = map[int]int{15: 0}
		}), Error, CodeOverlap, "partitions[1].startCrb",
			`start "b" at CRB 30 or above (its lower edge at 3735.9525 MHz or higher), or shrink "a" to 20 PRBs or fewer (its upper edge at 3734.1525 MHz or lower).`},
		{"DL/UL overlap", plan(40, part("a", 15, 0, 30), with(part("b", 15, 20, 30), func(p *PartitionPlan) { p.Direction = "UL" })), Warning, CodeOverlap, "partitions[1].startCrb", "TDD"},
		{"carrier beyond channel", withCarrier(plan(40, part("a", 15, 0, 10)), func(c *CarrierPlan) {
			c.OffsetToCarrier = map[int]int{15: 0}
			c.CarrierBandwidth = map[int]int{15: 216}
		}), Info, "", "", ""},
		// With offsets 15: 0 and 30: 0 the 30 kHz carrier's lower edge is
		// −15 kHz: 545 kHz from the channel edge, less than its 905 kHz.
		{"carrier guard", withCarrier(plan(40, part("a", 15, 0, 10), part("b", 30, 20, 10)), func(c *CarrierPlan) { c.OffsetToCarrier = map[int]int{15: 0, 30: 0} }), Warning, CodeEdgeGuard, "carrier.offsetToCarrier.30", "545 kHz"},
		{"partition guard", withCarrier(plan(40, part("b", 30, 0, 10), part("a", 15, 100, 10)), func(c *CarrierPlan) { c.OffsetToCarrier = map[int]int{15: 0, 30: 0} }), Error, CodeEdgeGuard, "partitions[0].startCrb", "minimum guardband is 905 kHz"},
		{"numerology gap", plan(40, part("a", 15, 0, 24), part("b", 30, 13, 10)), Warning, CodeNumerologyGap, "partitions[1].startCrb", "common practice"},
		{"offset for one SCS of two", withCarrier(plan(40, part("a", 15, 0, 10), part("b", 30, 20, 10)), func(c *CarrierPlan) { c.OffsetToCarrier = map[int]int{15: 0} }), Error, CodeOffset, "carrier.offsetToCarrier", "every subcarrier spacing in use"},
		{"offset too large", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.OffsetToCarrier = map[int]int{15: 2200} }), Error, CodeOffset, "carrier.offsetToCarrier.15", "0 to 2199"},
		{"offset unused", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.OffsetToCarrier = map[int]int{15: 0, 30: 1} }), Warning, CodeOffset, "carrier.offsetToCarrier.30", "ignored"},
		{"centre off raster", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.CenterMHz = fptr(3750.007) }), Error, CodeFrequency, "carrier.centerMHz", "3750.000 MHz (650000)"},
		{"centre and arfcn disagree", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.CenterMHz = fptr(3750); c.ARFCN = iptr(650001) }), Error, CodeFrequency, "carrier.arfcn", "make them agree"},
		{"arfcn out of range", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.ARFCN = iptr(4000000) }), Error, CodeFrequency, "carrier.arfcn", "0 to 3279165"},
		{"channel outside FR1", withCarrier(plan(40, ok40), func(c *CarrierPlan) { c.CenterMHz = fptr(420) }), Error, CodeFrequency, "carrier.centerMHz", "outside FR1"},
		{"bad direction", plan(40, with(ok40, func(p *PartitionPlan) { p.Direction = "SL" })), Error, CodeDirection, "partitions[0].direction", "DL or UL"},
		{"9 DL layers", plan(40, with(ok40, func(p *PartitionPlan) { p.Layers = 9 })), Error, CodeLayers, "partitions[0].layers", "1 to 8"},
		{"5 UL layers", plan(40, with(ok40, func(p *PartitionPlan) { p.Layers = 5; p.Direction = "ul" })), Error, CodeLayers, "partitions[0].layers", "1 to 4"},
		{"bad modulation", plan(40, with(ok40, func(p *PartitionPlan) { p.Modulation = "8PSK" })), Error, CodeModulation, "partitions[0].modulation", "QPSK, 16QAM"},
		{"duplicate names", plan(40, part("a", 15, 0, 10), part("a", 15, 20, 10)), Error, CodeName, "partitions[1].name", "unique"},
		{"empty name", plan(40, part(" ", 15, 0, 10)), Error, CodeName, "partitions[0].name", "empty"},
		{"names alike but for a zero-width space", plan(40, part("cam", 15, 0, 10), part("c\u200bam", 15, 20, 10)), Error, CodeName, "partitions[1].name", "invisible"},
		{"negative gap", Plan{Carrier: CarrierPlan{BandwidthMHz: 40}, Partitions: []PartitionPlan{ok40}, NumerologyGapKHz: fptr(-1)}, Error, CodeLimit, "numerologyGapKHz", "0 (no check)"},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := Compute(c.plan)
			if c.code == "" {
				// Expected clean: no error or warning at all.
				for _, f := range r.Findings {
					if f.Severity != Info {
						t.Errorf("unexpected finding %v", f)
					}
				}
				return
			}
			for _, f := range r.Findings {
				if f.Code == c.code && f.Severity == c.sev && f.Field == c.field && strings.Contains(f.Message, c.say) {
					return
				}
			}
			t.Errorf("want %s %s on %s saying %q; got:\n%s", c.sev, c.code, c.field, c.say, describeFindings(r.Findings))
		})
	}
}

func describeFindings(fs []Finding) string {
	var b strings.Builder
	for _, f := range fs {
		fmt.Fprintf(&b, "  %v\n", f)
	}
	return b.String()
}

// A finding's message names the field and the allowed values; the test
// above checks both for each code. Here: messages are whole sentences.
func TestFindingMessagesAreSentences(t *testing.T) {
	r := Compute(Plan{SpanMs: 99, Carrier: CarrierPlan{Range: "x", BandwidthMHz: 7},
		Partitions: []PartitionPlan{{Name: "", SCSKHz: 7, CP: "?", Direction: "?", Modulation: "?", Layers: 99}}})
	if len(r.Findings) < 6 {
		t.Fatalf("only %d findings for a plan broken six ways", len(r.Findings))
	}
	for _, f := range r.Findings {
		if !strings.HasSuffix(f.Message, ".") || f.Field == "" {
			t.Errorf("finding %v: want a sentence ending in '.' and a field", f)
		}
	}
}

func TestUsePercent(t *testing.T) {
	// 216 PRBs at 15 kHz fill 38.88 of 40 MHz: 97.2 %.
	r := Compute(plan(40, part("all", 15, 0, 216)))
	if r.Channel.UsePercent != 97.2 {
		t.Errorf("use %v %%, want 97.2 %%", r.Channel.UsePercent)
	}
}
