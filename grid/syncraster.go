package grid

import (
	"slices"

	"gridloom/grid/gscn"
)

// SyncPoint is one GSCN of the band's SS raster entries whose SS_REF lies
// inside the channel: a frequency a UE searches for a cell-defining SS/PBCH
// block (TS 38.101-1 and TS 38.101-2 5.4.3).
type SyncPoint struct {
	GSCN  int
	SSRef Hz // SS_REF from point A, like every frequency of a Result; Channel.Abs makes it absolute
	// Fits says a block centred here would lie inside the channel and the
	// carrier of subCarrierSpacingCommon (and the 240 kHz block's
	// guardband), reachable from point A by a whole offsetToPointA and
	// k_SSB: the places SSBPositions lists.
	Fits bool
}

// SyncRaster is the synchronization raster inside the channel, for the
// channel's band and one SS/PBCH block spacing: what a figure draws beside
// the frequency axis so that a planner sees where the block may go.
type SyncRaster struct {
	Band         string // the channel's operating band as the tables write it, "n78"
	SCSKHz       int    // the SS/PBCH block spacing whose raster entries these are
	Case         string // its block pattern in the band, TS 38.213 4.1
	ScsCommonKHz int    // subCarrierSpacingCommon that Fits assumed
	Points       []SyncPoint
}

// syncRaster lists the band's GSCNs inside the channel. The spacing is the
// plan's block's, or without a block the band's first SS raster entry, as
// SSBPositions chooses. It returns nil when the channel has no absolute
// frequency or no band, or the band has no entry for the spacing.
func syncRaster(r Result, rng Range, sp *SSBPlan) *SyncRaster {
	ch := r.Channel
	if !ch.Absolute || ch.Band == "" || ch.High <= ch.Low {
		return nil
	}
	es, ok := gscn.Entries(ch.Band)
	if !ok {
		return nil
	}
	e := es[0]
	common := 0
	if sp != nil {
		i := slices.IndexFunc(es, func(e gscn.Entry) bool { return e.SCSKHz == sp.SCSKHz })
		if i < 0 {
			return nil // the band check reports the spacing
		}
		e = es[i]
		common = sp.ScsCommonKHz
	}
	if r.SSB != nil {
		common = r.SSB.ScsCommonKHz // the default filled in
	}
	if !slices.Contains(SCSCommonChoices(rng), common) {
		common = DefaultSCSCommon(rng, e.SCSKHz)
	}
	out := &SyncRaster{Band: e.Band, SCSKHz: e.SCSKHz, Case: e.Case, ScsCommonKHz: common}
	// The raster points from the channel's lower edge to its upper edge.
	_, first, okLo := gscn.Nearest(int64(ch.Abs(ch.Low)))
	last, _, okHi := gscn.Nearest(int64(ch.Abs(ch.High)))
	if !okLo {
		first = gscn.MinGSCN // the channel starts below the raster
	}
	if !okHi {
		last = gscn.MaxGSCN
	}
	first, last = max(first, e.First), min(last, e.Last)
	lo, hi, _ := ssbWindow(r, e.SCSKHz, common)
	for g := first; g <= last; g++ {
		if !e.Contains(g) {
			continue
		}
		f, _ := gscn.Frequency(g)
		ref := Hz(f) - ch.PointAHz
		_, _, fits := ssbFitsAt(rng, e.SCSKHz, common, ref, lo, hi)
		out.Points = append(out.Points, SyncPoint{GSCN: g, SSRef: ref, Fits: fits})
	}
	return out
}
