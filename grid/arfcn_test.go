package grid

import "testing"

func TestARFCN(t *testing.T) {
	for _, c := range []struct {
		n    int
		f    Hz
		note string
	}{
		// The ends of each row of TS 38.104 Table 5.4.2.1-1.
		{0, 0, "first point of the 5 kHz raster"},
		{599999, 2999.995e6, "last point of the 5 kHz raster"},
		{600000, 3000e6, "F_REF-Offs of the 15 kHz raster"},
		{2016666, 24249.99e6, "last point of the 15 kHz raster"},
		{2016667, 24250.08e6, "F_REF-Offs of the 60 kHz raster"},
		{3279165, 99999.96e6, "last NR-ARFCN"},
		// Worked by hand from the table's formula; the pairs are common in
		// public configurations (from memory).
		{428000, 2140e6, "5 kHz raster"},
		{620000, 3300e6, "15 kHz raster"},
		{650000, 3750e6, "15 kHz raster"},
		{640008, 3600.12e6, "15 kHz raster"},
		{641280, 3619.2e6, "15 kHz raster"},
		{2079167, 28000.08e6, "60 kHz raster"},
	} {
		f, ok := ARFCNFrequency(c.n)
		if !ok || f != c.f {
			t.Errorf("ARFCNFrequency(%d) = %v MHz, %v; want %v MHz (%s)", c.n, f.MHz(), ok, c.f.MHz(), c.note)
		}
		n, on := FrequencyARFCN(c.f)
		if !on || n != c.n {
			t.Errorf("FrequencyARFCN(%v MHz) = %d, %v; want %d (%s)", c.f.MHz(), n, on, c.n, c.note)
		}
	}
}

func TestARFCNOffRaster(t *testing.T) {
	for _, f := range []Hz{3750.007e6, 2140.001e6, 24250e6, 28000.1e6, 100001e6, -5e3} {
		if n, on := FrequencyARFCN(f); on {
			t.Errorf("FrequencyARFCN(%v MHz) = %d on the raster; want off", f.MHz(), n)
		}
	}
	if _, ok := ARFCNFrequency(MaxARFCN + 1); ok {
		t.Errorf("ARFCNFrequency(%d) accepted; want refused", MaxARFCN+1)
	}
	below, above, ok := NearestARFCN(3750.007e6)
	if !ok || below != 650000 || above != 650001 {
		t.Errorf("NearestARFCN(3750.007 MHz) = %d, %d, %v; want 650000, 650001", below, above, ok)
	}
}

// NearestARFCN at the edges of the rows of TS 38.104 Table 5.4.2.1-1: the
// neighbours of a frequency between two rows come from both rows.
func TestNearestARFCNBoundaries(t *testing.T) {
	for _, c := range []struct {
		f            Hz
		below, above int
		note         string
	}{
		{2999.999e6, 599999, 600000, "between 2999.995 (5 kHz row) and 3000 MHz (15 kHz row)"},
		{3000.001e6, 600000, 600001, "just above 3000 MHz: 3000 and 3000.015 MHz"},
		{24250.05e6, 2016666, 2016667, "the gap: 24249.99 (15 kHz row) and 24250.08 MHz (60 kHz row)"},
		{24250e6, 2016666, 2016667, "the FR2 edge itself is on neither raster"},
		{24249.995e6, 2016666, 2016667, "just above the 15 kHz row's last point"},
		{24250.1e6, 2016667, 2016668, "inside the 60 kHz row"},
		{1842.507e6, 368501, 368502, "5 kHz row: 1842.505 and 1842.510 MHz"},
	} {
		below, above, ok := NearestARFCN(c.f)
		if !ok || below != c.below || above != c.above {
			t.Errorf("NearestARFCN(%v MHz) = %d, %d, %v; want %d, %d (%s)", c.f.MHz(), below, above, ok, c.below, c.above, c.note)
		}
	}
	if _, _, ok := NearestARFCN(99999.99e6); ok {
		t.Error("NearestARFCN(99999.99 MHz) accepted; it is above the last NR-ARFCN")
	}
}
