package grid_test

import (
	"os"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// The demo plans' SS/PBCH blocks are on the synchronization raster and
// among the SS raster entries of the bands their carriers sit in (campus at
// 3750 MHz in n78, stadium at 27500.04 MHz in n257; TS 38.101-1 and
// TS 38.101-2 Table 5.4.3.3-1), so they stay clean once the plan names its
// band and Compute holds the block against it.
func TestDemoSSBsOnTheirBands(t *testing.T) {
	for _, c := range []struct{ file, band string }{
		{"../testdata/plans/campus.yaml", "n78"},
		{"../testdata/plans/stadium.yaml", "n257"},
	} {
		data, err := os.ReadFile(c.file)
		if err != nil {
			t.Fatal(err)
		}
		p, err := planfile.Decode(data)
		if err != nil {
			t.Fatal(err)
		}
		r := grid.Compute(p)
		if r.SSB == nil || !r.SSB.OnSyncRaster || r.HasErrors() {
			t.Fatalf("%s: SSB %+v, findings %v", c.file, r.SSB, r.Findings)
		}
		if fs := r.SSB.CheckBand(c.band); len(fs) > 0 {
			t.Errorf("%s in %s: %v", c.file, c.band, fs)
		}
	}
}
