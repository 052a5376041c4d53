package band

import "slices"

// The global frequency raster of TS 38.101-1 / TS 38.104 5.4.2.1, Table
// 5.4.2.1-1: F_REF = F_REF-Offs + ΔF_Global·(N_REF − N_REF-Offs), with
// ΔF_Global 5 kHz below 3000 MHz, 15 kHz from 3000 to 24250 MHz and 60 kHz
// from 24250.08 MHz. Package grid has the same formula; it is repeated here
// so that this package imports nothing of the project.
const (
	MaxARFCN  = 3279165 // the last NR-ARFCN, 99999.96 MHz
	lastFR1N  = 2016666 // 24249.99 MHz, the last point of the 15 kHz raster
	firstFR2N = 2016667 // 24250.08 MHz, the first point of the 60 kHz raster
)

// ARFCNHz returns F_REF of an NR-ARFCN, and false outside 0…MaxARFCN.
func ARFCNHz(n int) (int64, bool) {
	switch {
	case n < 0 || n > MaxARFCN:
		return 0, false
	case n < 600000:
		return int64(n) * 5000, true
	case n <= lastFR1N:
		return 3000e6 + int64(n-600000)*15000, true
	}
	return 24250.08e6 + int64(n-firstFR2N)*60000, true
}

// floorARFCN is the largest NR-ARFCN at or below f; −1 below 0 Hz.
func floorARFCN(f int64) int {
	switch {
	case f < 0:
		return -1
	case f < 3000e6:
		return int(f / 5000)
	case f < 24250.08e6:
		return min(600000+int((f-3000e6)/15000), lastFR1N)
	}
	return min(firstFR2N+int((f-24250.08e6)/60000), MaxARFCN)
}

// ARFCN returns the NR-ARFCN of f and whether f lies exactly on the global
// raster.
func ARFCN(f int64) (int, bool) {
	n := floorARFCN(f)
	g, ok := ARFCNHz(n)
	return n, ok && g == f
}

// Check is the result of holding a carrier's centre (its RF reference
// frequency) against a band's channel raster.
type Check struct {
	On        bool // the centre is one of the band's NR-ARFCNs for the spacings in use
	ARFCN     int  // the centre's NR-ARFCN when On
	RasterKHz int  // ΔF_Raster: of the coarsest row holding the centre, else of the finest row that applies
	// Below and Above are the nearest valid NR-ARFCNs under and over the
	// centre when it is off the raster; −1 where the band has none.
	Below, Above int
}

// CheckDL holds a downlink centre against the band's channel raster for a
// carrier of the given channel bandwidth and subcarrier spacings (kHz).
func (b Band) CheckDL(centreHz int64, scsKHz []int, bandwidthMHz int) Check {
	return b.check(centreHz, scsKHz, bandwidthMHz, false)
}

// CheckUL holds an uplink centre against the band's channel raster, as
// CheckDL does for the downlink.
func (b Band) CheckUL(centreHz int64, scsKHz []int, bandwidthMHz int) Check {
	return b.check(centreHz, scsKHz, bandwidthMHz, true)
}

// Serves reports whether a carrier whose smallest subcarrier spacing is
// minSCSKHz may use the raster. TS 38.101-1 5.4.2.3: a 100 kHz raster
// serves every spacing; where Table 5.4.2.3-1 gives ΔF_Raster per spacing
// (15/30 kHz in FR1, 60/120 kHz in FR2-1, 120/480/960 kHz in n263) a raster
// coarser than the carrier's smallest spacing may not be used (the 30 kHz
// raster is not for 15 kHz carriers). A minSCSKHz of 0 means any.
func (r Raster) Serves(minSCSKHz int) bool {
	return r.RasterKHz == 100 || minSCSKHz <= 0 || r.RasterKHz <= minSCSKHz
}

// minSCS is the smallest spacing of a carrier, 0 when none is given or
// when no raster of the band serves it (then every raster is tried).
func (b Band) minSCS(scsKHz []int) int {
	if len(scsKHz) == 0 {
		return 0
	}
	m := slices.Min(scsKHz)
	for _, r := range b.Rasters {
		if r.Serves(m) {
			return m
		}
	}
	return 0
}

func (b Band) check(f int64, scsKHz []int, bandwidthMHz int, ul bool) Check {
	pick := func(r Raster) ARFCNRange {
		if ul {
			return r.UL
		}
		return r.DL
	}
	minSCS := b.minSCS(scsKHz)
	c := Check{ARFCN: -1, Below: -1, Above: -1}
	for _, r := range b.Rasters {
		if r.Serves(minSCS) {
			c.RasterKHz = r.RasterKHz
			break
		}
	}
	n, exact := ARFCN(f)
	if exact {
		for _, r := range b.Rasters {
			if r.Serves(minSCS) && pick(r).Holds(n) {
				c.On, c.ARFCN, c.RasterKHz = true, n, r.RasterKHz
			}
		}
		for _, e := range extraARFCNs {
			if e.band == b.Number && e.bandwidthMHz == bandwidthMHz && ((ul && e.ul == n) || (!ul && e.dl == n)) {
				c.On, c.ARFCN = true, n
			}
		}
		if c.On {
			return c
		}
	}
	lo := floorARFCN(f) // F(lo) ≤ f
	hi := lo + 1        // F(hi) > f when f is off the global raster
	if exact {
		hi = lo
	}
	better := func(cur, cand int, below bool) int {
		if cand < 0 {
			return cur
		}
		if cur < 0 || (below && cand > cur) || (!below && cand < cur) {
			return cand
		}
		return cur
	}
	for _, r := range b.Rasters {
		a := pick(r)
		if a.Step == 0 || !r.Serves(minSCS) {
			continue
		}
		if lo >= a.First {
			top := min(lo, a.Last)
			cand := a.First + (top-a.First)/a.Step*a.Step
			if cand == n && exact { // the centre itself is not a neighbour
				cand -= a.Step
			}
			if cand >= a.First {
				c.Below = better(c.Below, cand, true)
			}
		}
		if hi <= a.Last {
			cand := a.First
			if hi > a.First {
				cand = a.First + (hi-a.First+a.Step-1)/a.Step*a.Step
			}
			if cand == n && exact {
				cand += a.Step
			}
			if cand <= a.Last {
				c.Above = better(c.Above, cand, false)
			}
		}
	}
	return c
}

// PairedUL returns the uplink centre of an FDD band's downlink carrier at
// the band's default duplex spacing, with its NR-ARFCN; false for a band
// without a pair. Table 5.4.2.3-1 lists the uplink and downlink NR-ARFCNs
// of an FDD band entry by entry, so the pair keeps the spacing of the
// ranges' lower edges (the n28 note's 155608/144608 keeps it too).
func (b Band) PairedUL(dlCentreHz int64) (ulCentreHz int64, arfcn int, ok bool) {
	d, ok := b.DuplexSpacingHz()
	if !ok {
		return 0, 0, false
	}
	ulCentreHz = dlCentreHz - d
	arfcn, _ = ARFCN(ulCentreHz)
	return ulCentreHz, arfcn, true
}
