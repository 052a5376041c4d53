package grid

import (
	"slices"
	"strings"
	"testing"
)

// bandPlan is a one-partition plan of a carrier in a range, at a centre,
// optionally naming its band.
func bandPlan(rng string, bw int, centreMHz float64, bandName string, scs, prb int) Plan {
	return Plan{Name: "band", Carrier: CarrierPlan{Range: rng, Band: bandName, BandwidthMHz: bw, CenterMHz: fptr(centreMHz)},
		Partitions: []PartitionPlan{{Name: "all", SCSKHz: scs, SizePRB: prb}}}
}

func findFinding(fs []Finding, sev Severity, code, field, say string) bool {
	return slices.ContainsFunc(fs, func(f Finding) bool {
		return f.Severity == sev && f.Code == code && f.Field == field && strings.Contains(f.Message, say)
	})
}

func TestBandFindings(t *testing.T) {
	for _, c := range []struct {
		name  string
		plan  Plan
		sev   Severity
		code  string
		field string
		say   string
	}{
		// TS 38.101-1 Table 5.4.2.3-1, n3 DL 361000–<20>–376000 (100 kHz):
		// 1842.505 MHz is on the 5 kHz global raster (368501), not on
		// n3's; the neighbours are 368500 (1842.5) and 368520 (1842.6).
		{"n3 off its raster", bandPlan("FR1", 20, 1842.505, "n3", 15, 106), Error, CodeChannelRaster, "carrier.centerMHz",
			"the nearest valid centres are 1842.500 MHz (368500) and 1842.600 MHz (368520)"},
		// TS 38.101-1 Table 5.2-1: no FR1 band holds 2980–3020 MHz.
		{"40 MHz at 3000 MHz in no band", bandPlan("FR1", 40, 3000, "", 30, 106), Warning, CodeBand, "carrier.centerMHz", "lies in no NR operating band of FR1"},
		{"unknown band", bandPlan("FR1", 40, 3750, "n4", 30, 106), Error, CodeBand, "carrier.band", "n79, n85, n90, n91, n92, n93, n94, n96, n100, n101, n102 or n104"},
		{"FR2 band in FR1", bandPlan("FR1", 40, 3750, "n257", 30, 106), Error, CodeBand, "carrier.band", "is a band of FR2-1"},
		{"SUL band", bandPlan("FR1", 20, 1750, "n80", 15, 106), Error, CodeBand, "carrier.band", "supplementary uplink"},
		{"outside n78", bandPlan("FR1", 100, 3900, "n78", 30, 273), Error, CodeBand, "carrier.centerMHz", "outside band n78's downlink range 3300.000 MHz to 3800.000 MHz"},
		// TS 38.101-1 Table 5.3.5-1: n78 has no 5 MHz channel; n28 no 60 kHz.
		{"n78 at 5 MHz", bandPlan("FR1", 5, 3750, "n78", 15, 25), Error, CodeBand, "carrier.bandwidthMHz", "use 10, 15, 20, 25, 30, 40 or 50 MHz"},
		{"n28 at 60 kHz", bandPlan("FR1", 20, 780, "n28", 60, 24), Error, CodeBand, "partitions[0].scsKHz", "use 15 or 30 kHz"},
		// n41: 499200–<3>–537999 at 15 kHz, 499200–<6>–537996 at 30 kHz;
		// 2593 MHz is 518600, 19400 from the start, no multiple of 3.
		{"n41 off its raster", bandPlan("FR1", 100, 2593, "n41", 30, 273), Error, CodeChannelRaster, "carrier.centerMHz",
			"2592.990 MHz (518598) and 2593.005 MHz (518601)"},
		// n66: DL 2110–2200, UL 1710–1780 MHz (TS 38.101-1 Table 5.2-1);
		// 2190 MHz pairs with 1790 MHz at 400 MHz, above the uplink range.
		{"n66 uplink beyond the band", bandPlan("FR1", 20, 2190, "n66", 15, 106), Error, CodeBand, "carrier.centerMHz", "1790.000 MHz (NR-ARFCN 358000)"},
		// FR2: TS 38.101-2 Table 5.4.2.3-1, n257 60 kHz 2054166–<1>–2104165;
		// 28000.05 MHz is on neither global raster nor n257's.
		{"n257 off the 60 kHz raster", bandPlan("FR2-1", 100, 28000.05, "n257", 120, 66), Error, CodeFrequency, "carrier.centerMHz", "28000.020 MHz (2079166) and 28000.080 MHz (2079167)"},
		// The gap between the 15 and 60 kHz global rasters (TS 38.104
		// Table 5.4.2.1-1): the suggestions come from both rows.
		{"24250.05 MHz", bandPlan("FR2-1", 100, 24250.05, "", 120, 66), Error, CodeFrequency, "carrier.centerMHz", "24249.990 MHz (2016666) and 24250.080 MHz (2016667)"},
		// n263: 120 kHz raster 2564083–<2>–2794243 (TS 38.101-2 Table
		// 5.4.2.3-1); 60000.06 MHz is 2612500, an odd step from the start.
		{"n263 off its raster", bandPlan("FR2-2", 400, 60000.06, "n263", 120, 264), Error, CodeChannelRaster, "carrier.centerMHz", "60000.000 MHz (2612499) and 60000.120 MHz (2612501)"},
		{"n48 bandwidths not carried", bandPlan("FR1", 20, 3625.005, "n48", 30, 51), Info, CodeBand, "carrier.band", "not carried"},
		{"n46 listed NR-ARFCNs", bandPlan("FR1", 20, 5180.01, "n46", 30, 51), Info, CodeChannelRaster, "carrier.centerMHz", "lists for each channel bandwidth"},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := Compute(c.plan)
			if !findFinding(r.Findings, c.sev, c.code, c.field, c.say) {
				t.Errorf("want %s %s on %s saying %q; got:\n%s", c.sev, c.code, c.field, c.say, describeFindings(r.Findings))
			}
		})
	}
}

// Carriers that exist, in each band family, check clean and report their
// band, raster and (FDD) paired uplink.
func TestBandClean(t *testing.T) {
	for _, c := range []struct {
		name       string
		plan       Plan
		band       string
		candidates []string
		duplex     string
		rasterKHz  int
		ulHz       Hz
		ulARFCN    int
		note       string
	}{
		{"n3 FDD", bandPlan("FR1", 20, 1842.5, "n3", 15, 106), "n3", nil, "FDD", 100, 1747.5e6, 349500, "TS 38.101-1 Table 5.2-1: 95 MHz duplex; UL 342000–<20>–357000"},
		{"n1 unnamed", bandPlan("FR1", 20, 2140, "", 15, 106), "n1", []string{"n1", "n65", "n66"}, "FDD", 100, 1950e6, 390000, "n1 190 MHz duplex"},
		{"n28 40 MHz note", bandPlan("FR1", 40, 778.04, "n28", 15, 216), "n28", nil, "FDD", 100, 723.04e6, 144608, "the note's extra pair 155608/144608"},
		{"n78 30 kHz raster", bandPlan("FR1", 100, 3600.12, "n78", 30, 273), "n78", nil, "TDD", 30, 0, 0, "640008 − 620000 even"},
		{"n77/n78 overlap", bandPlan("FR1", 100, 3500.01, "", 30, 273), "n77", []string{"n77", "n78"}, "TDD", 30, 0, 0, "3500.01 MHz is 633334, 13334 from 620000: even"},
		{"n78 15 kHz raster", bandPlan("FR1", 100, 3499.995, "n78", 30, 273), "n78", nil, "TDD", 15, 0, 0, "633333, 13333 from 620000: odd, the 15 kHz raster only"},
		{"n79", bandPlan("FR1", 100, 4850.01, "n79", 30, 273), "n79", nil, "TDD", 30, 0, 0, "723334 − 693334 even"},
		{"n41", bandPlan("FR1", 100, 2592.99, "n41", 30, 273), "n41", nil, "TDD", 30, 0, 0, "19398 = 6·3233"},
		{"n257", bandPlan("FR2-1", 100, 28000.08, "n257", 120, 66), "n257", nil, "TDD", 120, 0, 0, "2079167 − 2054167 even"},
		{"n258 first point", bandPlan("FR2-1", 50, 24275.04, "n258", 120, 32), "n258", nil, "TDD", 120, 0, 0, "(24275.04 − 24250.08)/0.06 = 416 steps from 2016667: even"},
		{"n259", bandPlan("FR2-1", 100, 41000.04, "n259", 120, 66), "n259", nil, "TDD", 120, 0, 0, "279166 steps from 2016667"},
		{"n260", bandPlan("FR2-1", 100, 38500.08, "n260", 120, 66), "n260", nil, "TDD", 120, 0, 0, "2254167 − 2229167 even"},
		{"n261", bandPlan("FR2-1", 100, 27925.08, "n261", 120, 66), "n261", nil, "TDD", 120, 0, 0, "2077917 − 2070833 = 7084, even"},
		{"n262", bandPlan("FR2-1", 100, 47700, "n262", 120, 66), "n262", nil, "TDD", 120, 0, 0, "2407499 − 2399167 even"},
		{"n263", bandPlan("FR2-2", 400, 60000, "n263", 120, 264), "n263", nil, "TDD", 120, 0, 0, "48416 = 2·24208"},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := Compute(c.plan)
			for _, f := range r.Findings {
				if f.Severity != Info {
					t.Errorf("unexpected finding %v (%s)", f, c.note)
				}
			}
			ch := r.Channel
			if ch.Band != c.band || !slices.Equal(ch.BandCandidates, c.candidates) || ch.Duplex != c.duplex || ch.RasterKHz != c.rasterKHz {
				t.Errorf("band %q candidates %v duplex %q raster %d kHz; want %q %v %q %d (%s)",
					ch.Band, ch.BandCandidates, ch.Duplex, ch.RasterKHz, c.band, c.candidates, c.duplex, c.rasterKHz, c.note)
			}
			if ch.HasUL != (c.ulHz != 0) || ch.ULCenterHz != c.ulHz || ch.ULARFCN != c.ulARFCN {
				t.Errorf("uplink %v, %d (%v); want %d, %d (%s)", ch.ULCenterHz.MHz(), ch.ULARFCN, ch.HasUL, c.ulHz, c.ulARFCN, c.note)
			}
		})
	}
}

// A plan that names its band but no centre is still held against the
// band's bandwidths and spacings.
func TestBandWithoutCentre(t *testing.T) {
	r := Compute(Plan{Name: "x", Carrier: CarrierPlan{Band: "78", BandwidthMHz: 100}, Partitions: []PartitionPlan{{Name: "a", SCSKHz: 30, SizePRB: 273}}})
	if r.HasErrors() || r.Channel.Band != "n78" || r.Plan.Carrier.Band != "n78" || r.Channel.RasterKHz != 0 {
		t.Errorf("band 78 without a centre: band %q (plan %q), raster %d, findings:\n%s", r.Channel.Band, r.Plan.Carrier.Band, r.Channel.RasterKHz, describeFindings(r.Findings))
	}
	r = Compute(Plan{Name: "x", Carrier: CarrierPlan{Band: "n28", BandwidthMHz: 50}, Partitions: []PartitionPlan{{Name: "a", SCSKHz: 15, SizePRB: 270}}})
	if !findFinding(r.Findings, Error, CodeBand, "carrier.bandwidthMHz", "band n28 at 15 kHz") {
		t.Errorf("n28 at 50 MHz: want a band finding; got:\n%s", describeFindings(r.Findings))
	}
}
