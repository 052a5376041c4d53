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
		{"demo/campus.yaml", "n78"},
		{"demo/stadium.yaml", "n257"},
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

// Compute holds the block against the channel's band: n78 sends 30 kHz
// blocks in case C only (TS 38.101-1 Table 5.4.3.3-1), so the campus plan
// with case B is refused.
func TestComputeChecksSSBAgainstBand(t *testing.T) {
	data, err := os.ReadFile("demo/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	if p.Carrier.Band != "n78" {
		t.Fatalf("campus names band %q; this test expects n78", p.Carrier.Band)
	}
	caseB := p.Clone()
	caseB.SSB.Case = "B"
	if !hasFinding(grid.Compute(caseB).Findings, grid.Error, grid.CodeSyncRaster, "ssb.case") {
		t.Errorf("case B in n78: want a sync-raster error on ssb.case; got %v", grid.Compute(caseB).Findings)
	}
}

func hasFinding(fs []grid.Finding, sev grid.Severity, code, field string) bool {
	for _, f := range fs {
		if f.Severity == sev && f.Code == code && f.Field == field {
			return true
		}
	}
	return false
}
