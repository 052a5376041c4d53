package grid

import "testing"

// The raster inside a 40 MHz channel centred on 3750 MHz in n78, worked by
// hand from TS 38.101-1 Table 5.4.3.1-1 (SS_REF = 3000 MHz + N·1.44 MHz,
// GSCN = 7499 + N) and Table 5.4.3.3-1 (n78 at 30 kHz: GSCN 7711 – <1> – 8051):
// the channel runs from 3730 to 3770 MHz, so N = 507 … 534, GSCN 8006
// (3730.08 MHz) to 8033 (3768.96 MHz), 28 points.
//
// With only a 15 kHz partition there is no 30 kHz carrier, so a 30 kHz block
// (subCarrierSpacingCommon 30 kHz) must lie inside the channel alone: its
// lower edge is SS_REF − 120.5·30 kHz, its upper edge SS_REF + 119.5·30 kHz
// (TS 38.211 7.4.3.1), so SS_REF from 3733.615 to 3766.415 MHz: GSCN 8009
// (3734.40 MHz) to 8031 (3766.08 MHz). Point A is 3730.56 MHz (the 15 kHz
// carrier of 216 PRBs at offset 0); from it subcarrier 0 of the block lies
// 1440·N − 734160 kHz away, which is 240 kHz past a multiple of the 720 kHz
// common RB: k_SSB = 16 of 15 kHz (at most 23), so every one is reachable.
func TestSyncRasterByHand(t *testing.T) {
	p := plan(40, part("low", 15, 0, 216))
	p.Carrier.CenterMHz = fptr(3750)
	p.Carrier.Band = "n78"
	p.SSB = &SSBPlan{SCSKHz: 30, OffsetToPointA: 10, KSSB: 6}
	r := Compute(p)
	s := r.SyncRaster
	if s == nil {
		t.Fatalf("no sync raster; findings %v", r.Findings)
	}
	if r.Channel.PointAHz != 3730560e3 {
		t.Fatalf("point A %v, want 3730.56 MHz", r.Channel.PointAHz)
	}
	if s.Band != "n78" || s.SCSKHz != 30 || s.Case != "C" || s.ScsCommonKHz != 30 {
		t.Errorf("raster of %s at %d kHz, case %s, common %d kHz; want n78, 30, C, 30", s.Band, s.SCSKHz, s.Case, s.ScsCommonKHz)
	}
	if n := len(s.Points); n != 28 || s.Points[0].GSCN != 8006 || s.Points[n-1].GSCN != 8033 {
		t.Fatalf("%d points %v; want 28, GSCN 8006 to 8033", n, s.Points)
	}
	if a, b := r.Channel.Abs(s.Points[0].SSRef), r.Channel.Abs(s.Points[27].SSRef); a != 3730080e3 || b != 3768960e3 {
		t.Errorf("SS_REF %v to %v Hz; want 3730.08 to 3768.96 MHz", a, b)
	}
	for _, pt := range s.Points {
		if want := pt.GSCN >= 8009 && pt.GSCN <= 8031; pt.Fits != want {
			t.Errorf("GSCN %d (SS_REF %v Hz from point A): fits %v, want %v", pt.GSCN, pt.SSRef, pt.Fits, want)
		}
	}
}

// Without an absolute frequency, or without a band, there is no raster to
// draw.
func TestSyncRasterAbsent(t *testing.T) {
	p := plan(40, part("low", 15, 0, 216))
	if r := Compute(p); r.SyncRaster != nil {
		t.Errorf("a channel without a centre has a raster: %+v", r.SyncRaster)
	}
	p.Carrier.CenterMHz = fptr(60480)
	p.Carrier.Range = "FR2-2"
	p.Carrier.BandwidthMHz = 2000
	p.Partitions = []PartitionPlan{{Name: "wide", SCSKHz: 960, SizePRB: 148}}
	r := Compute(p)
	if r.Channel.Band == "" && r.SyncRaster != nil {
		t.Errorf("a channel without a band has a raster: %+v", r.SyncRaster)
	}
	if r.Channel.Band != "" && (r.SyncRaster == nil || len(r.SyncRaster.Points) > 120) {
		t.Errorf("the 2000 MHz channel in %s has raster %+v; want at most 2000/17.28 points", r.Channel.Band, r.SyncRaster)
	}
}
