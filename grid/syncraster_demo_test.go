package grid_test

import (
	"slices"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
)

// FR2-1: SS_REF = 24250.08 MHz + N·17.28 MHz, GSCN = 22256 + N (TS 38.101-2
// Table 5.4.3.1-1); the stadium's 200 MHz channel centred on 27500.04 MHz
// runs from 27400.04 to 27600.04 MHz: N = 183 … 193, GSCN 22439 to 22449,
// all inside n257's 120 kHz entries 22388 – <1> – 22558 (Table 5.4.3.3-1).
// The block's own GSCN, 22447, is among them and fits.
func TestSyncRasterFR2(t *testing.T) {
	p, err := demo.Load("stadium")
	if err != nil {
		t.Fatal(err)
	}
	r := grid.Compute(p)
	s := r.SyncRaster
	if s == nil || len(s.Points) != 11 || s.Points[0].GSCN != 22439 || s.Points[10].GSCN != 22449 {
		t.Fatalf("raster %+v; want GSCN 22439 to 22449", s)
	}
	i := slices.IndexFunc(s.Points, func(pt grid.SyncPoint) bool { return pt.GSCN == r.SSB.GSCN })
	if i < 0 || !s.Points[i].Fits || s.Points[i].SSRef != r.SSB.SSRef {
		t.Errorf("the block's GSCN %d is not a fitting raster point at its SS_REF %v", r.SSB.GSCN, r.SSB.SSRef)
	}
}

// Fits marks exactly the places SSBPositions lists, for every demo plan.
func TestSyncRasterMatchesPositions(t *testing.T) {
	for _, name := range demo.Names() {
		p, err := demo.Load(name)
		if err != nil {
			t.Fatal(err)
		}
		r := grid.Compute(p)
		if r.SyncRaster == nil {
			t.Errorf("%s: no sync raster, though the plan has a centre and a band", name)
			continue
		}
		found, err := grid.SSBPositions(p, r.Channel.Band)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		var fits, listed []int
		for _, pt := range r.SyncRaster.Points {
			if pt.Fits {
				fits = append(fits, pt.GSCN)
			}
		}
		for _, pos := range found.Positions {
			listed = append(listed, pos.GSCN)
		}
		if len(fits) == 0 || !slices.Equal(fits, listed) {
			t.Errorf("%s: raster points that fit %v; SSBPositions lists %v", name, fits, listed)
		}
	}
}
