package grid

// The global frequency raster of TS 38.104 5.4.2.1, Table 5.4.2.1-1:
// F_REF = F_REF-Offs + ΔF_Global·(N_REF − N_REF-Offs).
type rasterRow struct {
	stepHz     Hz // ΔF_Global
	offsetHz   Hz // F_REF-Offs
	offsetN    int
	firstN     int
	lastN      int
	describeAs string
}

var rasterRows = [...]rasterRow{
	{stepHz: 5e3, offsetHz: 0, offsetN: 0, firstN: 0, lastN: 599999, describeAs: "5 kHz below 3000 MHz"},
	{stepHz: 15e3, offsetHz: 3000e6, offsetN: 600000, firstN: 600000, lastN: 2016666, describeAs: "15 kHz from 3000 to 24250 MHz"},
	{stepHz: 60e3, offsetHz: 24250.08e6, offsetN: 2016667, firstN: 2016667, lastN: 3279165, describeAs: "60 kHz from 24250.08 to 100000 MHz"},
}

// MaxARFCN is the largest NR-ARFCN (TS 38.104 Table 5.4.2.1-1).
const MaxARFCN = 3279165

// RasterRule describes the global raster steps, for messages.
const RasterRule = "the NR-ARFCN global raster steps 5 kHz below 3000 MHz, 15 kHz from 3000 to 24250 MHz and 60 kHz from 24250.08 MHz up"

// ARFCNFrequency returns F_REF for an NR-ARFCN N_REF (TS 38.104 5.4.2.1),
// and false if n is outside 0…3279165.
func ARFCNFrequency(n int) (Hz, bool) {
	for _, r := range rasterRows {
		if n >= r.firstN && n <= r.lastN {
			return r.offsetHz + r.stepHz*Hz(n-r.offsetN), true
		}
	}
	return 0, false
}

// rowFor returns the raster row whose frequency span holds f.
func rowFor(f Hz) (rasterRow, bool) {
	for _, r := range rasterRows {
		lo, _ := ARFCNFrequency(r.firstN)
		hi, _ := ARFCNFrequency(r.lastN)
		if f >= lo && f <= hi+r.stepHz-1 {
			return r, true
		}
	}
	return rasterRow{}, false
}

// FrequencyARFCN returns the NR-ARFCN of f and whether f lies exactly on the
// global raster.
func FrequencyARFCN(f Hz) (int, bool) {
	r, ok := rowFor(f)
	if !ok {
		return 0, false
	}
	d := f - r.offsetHz
	if d%r.stepHz != 0 {
		return 0, false
	}
	n := r.offsetN + int(d/r.stepHz)
	return n, n >= r.firstN && n <= r.lastN
}

// NearestARFCN returns the raster points just below and above f, to suggest
// in a message. Both equal f's NR-ARFCN when f is on the raster; ok is false
// outside the raster. Between two rows of Table 5.4.2.1-1 (24249.99 to
// 24250.08 MHz) the neighbours are the last point of the lower row and the
// first of the upper one.
func NearestARFCN(f Hz) (below, above int, ok bool) {
	if f < 0 {
		return 0, 0, false
	}
	if n, on := FrequencyARFCN(f); on {
		return n, n, true
	}
	below = -1
	for _, r := range rasterRows {
		lo, _ := ARFCNFrequency(r.firstN)
		if f < lo {
			break
		}
		below = min(r.offsetN+int((f-r.offsetHz)/r.stepHz), r.lastN)
	}
	if below < 0 || below >= MaxARFCN {
		return 0, 0, false
	}
	return below, below + 1, true
}
