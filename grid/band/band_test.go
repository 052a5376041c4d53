package band

import (
	"slices"
	"testing"
)

func names(bs []Band) []string {
	var out []string
	for _, b := range bs {
		out = append(out, b.Name)
	}
	return out
}

func TestLookup(t *testing.T) {
	for _, s := range []string{"n78", "N78", "78", " n78 "} {
		b, ok := Lookup(s)
		// TS 38.101-1 Table 5.2-1: n78 3300–3800 MHz TDD.
		if !ok || b.Name != "n78" || b.Duplex != TDD || b.DL != (Span{3300e6, 3800e6}) || b.Range != "FR1" {
			t.Errorf("Lookup(%q) = %+v, %v; want n78 3300–3800 MHz TDD", s, b, ok)
		}
	}
	if b, ok := Lookup("n263"); !ok || b.Range != "FR2-2" { // TS 38.101-2 Table 5.2-1, Table 5.1-1
		t.Errorf("Lookup(n263) = %+v, %v; want an FR2-2 band", b, ok)
	}
	for _, s := range []string{"n4", "n255", "b78", ""} {
		if _, ok := Lookup(s); ok {
			t.Errorf("Lookup(%q) found a band; want none", s)
		}
	}
	b, _ := Lookup("n78")
	b.Rasters[0].RasterKHz = 1
	if c, _ := Lookup("n78"); c.Rasters[0].RasterKHz == 1 {
		t.Error("Lookup returns a band that shares its rasters with the table")
	}
}

func TestContaining(t *testing.T) {
	for _, c := range []struct {
		centreHz, bwHz int64
		want           []string
		note           string
	}{
		{3500e6, 100e6, []string{"n77", "n78"}, "TS 38.101-1 Table 5.2-1: n78 lies inside n77"},
		{3900e6, 100e6, []string{"n77"}, "above n78's 3800 MHz"},
		{3000e6, 40e6, nil, "2980–3020 MHz is in no FR1 band"},
		{1842.5e6, 20e6, []string{"n3"}, "n3 DL 1805–1880 MHz"},
		{2140e6, 20e6, []string{"n1", "n65", "n66"}, "n1 DL 2110–2170, n65/n66 DL 2110–2200 MHz"},
		{28000e6, 400e6, []string{"n257", "n261"}, "TS 38.101-2 Table 5.2-1: n257 26.5–29.5, n261 27.5–28.35 GHz"},
		{1750e6, 10e6, nil, "n80 and n3's uplink hold it, but a plan describes a DL carrier"},
	} {
		got := names(Containing(c.centreHz-c.bwHz/2, c.centreHz+c.bwHz/2))
		if !slices.Equal(got, c.want) {
			t.Errorf("Containing(%v MHz ± %v) = %v; want %v (%s)", float64(c.centreHz)/1e6, float64(c.bwHz)/2e6, got, c.want, c.note)
		}
	}
}

func TestARFCNBoundaries(t *testing.T) {
	// TS 38.101-1 5.4.2.1, Table 5.4.2.1-1, worked by hand.
	for _, c := range []struct {
		n int
		f int64
	}{{0, 0}, {599999, 2999.995e6}, {600000, 3000e6}, {2016666, 24249.99e6}, {2016667, 24250.08e6}, {MaxARFCN, 99999.96e6}} {
		if f, ok := ARFCNHz(c.n); !ok || f != c.f {
			t.Errorf("ARFCNHz(%d) = %d, %v; want %d", c.n, f, ok, c.f)
		}
		if n, on := ARFCN(c.f); !on || n != c.n {
			t.Errorf("ARFCN(%d) = %d, %v; want %d on the raster", c.f, n, on, c.n)
		}
	}
	for _, f := range []int64{2999.999e6, 3000.001e6, 24250e6, 24250.05e6} {
		if n, on := ARFCN(f); on {
			t.Errorf("ARFCN(%d Hz) = %d on the raster; want off", f, n)
		}
	}
}

func TestChannelRaster(t *testing.T) {
	for _, c := range []struct {
		band         string
		centreHz     int64
		scs          []int
		bwMHz        int
		on           bool
		arfcn        int
		rasterKHz    int
		below, above int
		note         string
	}{
		// n3: TS 38.101-1 Table 5.4.2.3-1, DL 361000–<20>–376000, 100 kHz.
		{"n3", 1842.5e6, []int{15}, 20, true, 368500, 100, -1, -1, "1842.5 MHz / 5 kHz = 368500, (368500−361000)/20 whole"},
		{"n3", 1842.505e6, []int{15}, 20, false, -1, 100, 368500, 368520, "5 kHz off the 100 kHz raster"},
		{"n3", 1842.51e6, []int{15}, 20, false, -1, 100, 368500, 368520, "on the global raster, not the band's"},
		// n78: 620000–<1>–653333 (15 kHz), 620000–<2>–653332 (30 kHz).
		{"n78", 3600.12e6, []int{30}, 100, true, 640008, 30, -1, -1, "640008 − 620000 even: on the 30 kHz raster too"},
		{"n78", 3600.135e6, []int{30}, 100, true, 640009, 15, -1, -1, "odd offset: the 15 kHz raster only"},
		{"n78", 3600.135e6, []int{15, 30}, 100, true, 640009, 15, -1, -1, "15 kHz carriers may not use the 30 kHz raster"},
		{"n78", 3600.13e6, []int{30}, 100, false, -1, 15, 640008, 640009, "between two 15 kHz points"},
		// n41: 499200–<3>–537999 (15 kHz), 499200–<6>–537996 (30 kHz).
		{"n41", 2592.99e6, []int{30}, 100, true, 518598, 30, -1, -1, "518598 − 499200 = 19398 = 6·3233"},
		{"n41", 2593e6, []int{30}, 100, false, -1, 15, 518598, 518601, "19400 is no multiple of 3"},
		// n79: 693334–<1>–733333, 693334–<2>–733332.
		{"n79", 4850.01e6, []int{30}, 100, true, 723334, 30, -1, -1, "723334 − 693334 = 30000, even"},
		{"n79", 4399.995e6, []int{30}, 100, false, -1, 15, -1, 693334, "below the band's first NR-ARFCN"},
		// FR2: TS 38.101-2 Table 5.4.2.3-1.
		{"n258", 24250.08e6, []int{120}, 100, true, 2016667, 120, -1, -1, "n258's first point, 60 and 120 kHz"},
		{"n258", 24250.05e6, []int{120}, 100, false, -1, 60, -1, 2016667, "in the gap between the 15 and 60 kHz global rasters"},
		{"n257", 28000.08e6, []int{120}, 100, true, 2079167, 120, -1, -1, "2079167 − 2054167 = 25000, even"},
		{"n257", 28000.02e6, []int{120}, 100, true, 2079166, 60, -1, -1, "60 kHz raster, usable by 120 kHz carriers"},
		{"n257", 28000.02e6, []int{60}, 100, true, 2079166, 60, -1, -1, "60 kHz carrier"},
		{"n261", 28350.06e6, []int{120}, 100, false, -1, 60, 2084999, -1, "above n261's last NR-ARFCN 2084999"},
		{"n259", 41000.04e6, []int{120}, 100, true, 2295833, 120, -1, -1, "(41000.04 − 24250.08)/0.06 = 279166, + 2016667"},
		{"n260", 38500.08e6, []int{120}, 100, true, 2254167, 120, -1, -1, "(38500.08 − 24250.08)/0.06 = 237500; 2254167 − 2229167 = 25000"},
		{"n262", 47700e6, []int{120}, 100, true, 2407499, 120, -1, -1, "(47700 − 24250.08)/0.06 = 390832; 2407499 − 2399167 = 8332, even"},
		{"n263", 60000e6, []int{960}, 400, true, 2612499, 960, -1, -1, "2612499 − 2564083 = 48416 = 16·3026"},
		{"n263", 60000e6, []int{120}, 400, true, 2612499, 120, -1, -1, "the 480 and 960 kHz rasters are not for 120 kHz carriers"},
		{"n263", 60000.06e6, []int{120}, 400, false, -1, 120, 2612499, 2612501, "odd offset from 2564083"},
		// n28's note: DL 155608 (778.04 MHz) with the 40 MHz channel only.
		{"n28", 778.04e6, []int{15}, 40, true, 155608, 100, -1, -1, "the note's extra NR-ARFCN"},
		{"n28", 778.04e6, []int{15}, 20, false, -1, 100, 155600, 155620, "not for 20 MHz"},
	} {
		b, ok := Lookup(c.band)
		if !ok {
			t.Fatalf("no band %s", c.band)
		}
		got := b.CheckDL(c.centreHz, c.scs, c.bwMHz)
		want := Check{On: c.on, ARFCN: c.arfcn, RasterKHz: c.rasterKHz, Below: c.below, Above: c.above}
		if got != want {
			t.Errorf("%s.CheckDL(%v MHz, SCS %v) = %+v; want %+v (%s)", c.band, float64(c.centreHz)/1e6, c.scs, got, want, c.note)
		}
	}
}

func TestPairedUL(t *testing.T) {
	for _, c := range []struct {
		band    string
		dlHz    int64
		ulHz    int64
		arfcn   int
		inRange bool
		note    string
	}{
		// TS 38.101-1 Table 5.2-1 duplex spacings, F_DL_low − F_UL_low.
		{"n3", 1842.5e6, 1747.5e6, 349500, true, "n3: 1805 − 1710 = 95 MHz; UL raster 342000–<20>–357000"},
		{"n1", 2140e6, 1950e6, 390000, true, "n1: 190 MHz"},
		{"n20", 806e6, 847e6, 169400, true, "n20: 791 − 832 = −41 MHz, the uplink above"},
		{"n28", 778.04e6, 723.04e6, 144608, true, "n28: 55 MHz; the note's UL partner 144608"},
		{"n66", 2190e6, 1790e6, 358000, false, "n66: 400 MHz, and the uplink stops at 1780 MHz"},
	} {
		b, _ := Lookup(c.band)
		ul, n, ok := b.PairedUL(c.dlHz)
		if !ok || ul != c.ulHz || n != c.arfcn {
			t.Errorf("%s.PairedUL(%v MHz) = %d, %d, %v; want %d, %d (%s)", c.band, float64(c.dlHz)/1e6, ul, n, ok, c.ulHz, c.arfcn, c.note)
		}
		if got := b.UL.Holds(ul-10e6, ul+10e6); got != c.inRange {
			t.Errorf("%s: a 20 MHz uplink at %v MHz in the UL range = %v; want %v (%s)", c.band, float64(ul)/1e6, got, c.inRange, c.note)
		}
	}
	for _, s := range []string{"n78", "n29", "n80"} {
		b, _ := Lookup(s)
		if _, _, ok := b.PairedUL(3500e6); ok {
			t.Errorf("%s.PairedUL accepted; want no pair for %s", s, b.Duplex)
		}
	}
	b, _ := Lookup("n3")
	if c := b.CheckUL(1747.5e6, []int{15}, 20); !c.On || c.ARFCN != 349500 {
		t.Errorf("n3.CheckUL(1747.5 MHz) = %+v; want on, 349500", c)
	}
}

func TestBandwidths(t *testing.T) {
	b, _ := Lookup("n78")
	// TS 38.101-1 Table 5.3.5-1: n78 has no 5 MHz channel; 100 MHz needs 30 or 60 kHz.
	for _, c := range []struct {
		scs, mhz int
		want     bool
	}{{30, 100, true}, {15, 100, false}, {30, 5, false}, {15, 50, true}, {60, 70, true}} {
		if ok, known := b.AllowsBandwidth(c.scs, c.mhz); !known || ok != c.want {
			t.Errorf("n78.AllowsBandwidth(%d, %d) = %v, %v; want %v", c.scs, c.mhz, ok, known, c.want)
		}
	}
	if got := b.SCS(); !slices.Equal(got, []int{15, 30, 60}) {
		t.Errorf("n78.SCS() = %v; want [15 30 60]", got)
	}
	if b, _ := Lookup("n28"); !slices.Equal(b.SCS(), []int{15, 30}) { // no 60 kHz in the low bands
		t.Errorf("n28.SCS() = %v; want [15 30]", b.SCS())
	}
	if b, _ := Lookup("n263"); !slices.Equal(b.SCS(), []int{120, 480, 960}) { // TS 38.101-2 Table 5.3.5-1
		t.Errorf("n263.SCS() = %v; want [120 480 960]", b.SCS())
	}
	if b, _ := Lookup("n48"); b.Bandwidths != nil {
		t.Errorf("n48 has bandwidths %v; its row is not carried", b.Bandwidths)
	}
	if _, known := func() (bool, bool) { b, _ := Lookup("n48"); return b.AllowsBandwidth(30, 20) }(); known {
		t.Error("n48.AllowsBandwidth claims to know")
	}
}

// Every row of the raster tables must lie on the global raster inside its
// band: first and last within [F_low, F_high] and last−first a whole number
// of steps. This holds the copied table against Table 5.2-1.
func TestRasterRowsInsideBands(t *testing.T) {
	for _, b := range All() {
		if len(b.Rasters) == 0 {
			t.Errorf("%s has no channel raster", b.Name)
		}
		for _, r := range b.Rasters {
			for _, d := range []struct {
				name string
				a    ARFCNRange
				s    Span
			}{{"UL", r.UL, b.UL}, {"DL", r.DL, b.DL}} {
				if d.a.Step == 0 {
					if !d.s.Empty() {
						t.Errorf("%s %s: a range but no raster entries", b.Name, d.name)
					}
					continue
				}
				lo, _ := ARFCNHz(d.a.First)
				hi, _ := ARFCNHz(d.a.Last)
				if lo < d.s.LowHz || hi > d.s.HighHz || (d.a.Last-d.a.First)%d.a.Step != 0 {
					t.Errorf("%s %s ΔF_Raster %d: %s spans %d–%d Hz, outside %d–%d or not whole steps",
						b.Name, d.name, r.RasterKHz, d.a, lo, hi, d.s.LowHz, d.s.HighHz)
				}
			}
		}
	}
}

// A second reading of TS 38.101-2 Table 5.4.2.3-1 for FR2-1, derived from
// the band edges of Table 5.2-1: the 60 kHz raster is every global raster
// point (60 kHz from 24250.08 MHz, TS 38.101-2 5.4.2.1) inside the band;
// the 120 kHz raster is those an even number of points from 24250.08 MHz.
// This holds n259 and n262 too, for which no independent copy was found.
func TestFR2RasterFromBandEdges(t *testing.T) {
	for _, name := range []string{"n257", "n258", "n259", "n260", "n261", "n262"} {
		b, _ := Lookup(name)
		first := firstFR2N + int((b.DL.LowHz-24250.08e6+59999)/60000) // ceil
		last := firstFR2N + int((b.DL.HighHz-24250.08e6)/60000)       // floor
		want := map[int]ARFCNRange{60: {first, 1, last}, 120: {first + (first-firstFR2N)%2, 2, last - (last-firstFR2N)%2}}
		if len(b.Rasters) != 2 {
			t.Fatalf("%s has %d rasters; want 60 and 120 kHz", name, len(b.Rasters))
		}
		for _, r := range b.Rasters {
			if r.DL != want[r.RasterKHz] || r.UL != r.DL {
				t.Errorf("%s ΔF_Raster %d kHz: DL %s, UL %s; derived from %d–%d Hz: %s", name, r.RasterKHz, r.DL, r.UL, b.DL.LowHz, b.DL.HighHz, want[r.RasterKHz])
			}
		}
	}
}
