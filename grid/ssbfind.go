package grid

import (
	"errors"
	"fmt"
	"slices"

	"gridloom/grid/gscn"
)

// SSBPosition is one place for the SS/PBCH block on the synchronization
// raster, with the offsetToPointA and k_SSB that put it there. Frequencies
// are absolute.
type SSBPosition struct {
	GSCN                 int `json:"gscn"`
	SSRefHz              Hz  `json:"ssRefHz"`
	AbsoluteFrequencySSB int `json:"absoluteFrequencySSB"`
	OffsetToPointA       int `json:"offsetToPointA"`
	KSSB                 int `json:"kSsb"`
	LowHz                Hz  `json:"lowHz"` // the block's outer subcarrier edges
	HighHz               Hz  `json:"highHz"`
}

// SSBSearch is what SSBPositions found, with the settings it searched by.
type SSBSearch struct {
	Band         string        `json:"band,omitempty"` // "" when no band was given
	SCSKHz       int           `json:"scsKHz"`
	ScsCommonKHz int           `json:"scsCommonKHz"`
	Within       string        `json:"within"` // what the blocks must fit in, for people
	Positions    []SSBPosition `json:"positions"`
}

// SSBPositions lists every GSCN at which the plan's SS/PBCH block fits: inside
// the channel and inside the carrier of subCarrierSpacingCommon when the plan
// has one (the block must lie on common RBs the UE can address, TS 38.211
// 4.4.4.2), keeping the 240 kHz block's guardband (TS 38.101-2 Table 5.3.3-2),
// reachable from point A by a whole offsetToPointA and k_SSB, and, when band
// is given, among the band's SS raster entries (Table 5.4.3.3-1). The block's
// spacing and subCarrierSpacingCommon come from plan.SSB; without it, from
// the band's first entry. The plan must give the carrier's frequency.
func SSBPositions(plan Plan, band string) (SSBSearch, error) {
	p := plan.Clone()
	var sp SSBPlan
	if p.SSB != nil {
		sp = *p.SSB
	}
	p.SSB = nil
	r := Compute(p)
	ch := r.Channel
	if !ch.Absolute {
		return SSBSearch{}, errors.New("the plan gives no carrier frequency; add carrier.centerMHz or carrier.arfcn to search the synchronization raster")
	}
	if !slices.Contains(r.Channel.Range.AllBandwidths(), ch.BandwidthMHz) {
		return SSBSearch{}, fmt.Errorf("carrier.bandwidthMHz %d is not a channel bandwidth of %s", ch.BandwidthMHz, ch.Range)
	}
	out := SSBSearch{SCSKHz: sp.SCSKHz, ScsCommonKHz: sp.ScsCommonKHz}
	var entry *gscn.Entry
	if band != "" {
		out.Band = gscn.Normalize(band)
		es, ok := gscn.Entries(out.Band)
		if !ok {
			return SSBSearch{}, fmt.Errorf("band %s has no SS raster entries (TS 38.101-1 and TS 38.101-2 Table 5.4.3.3-1); use one of %s", out.Band, JoinOr(gscn.Bands()))
		}
		if out.SCSKHz == 0 {
			out.SCSKHz = es[0].SCSKHz
		}
		i := slices.IndexFunc(es, func(e gscn.Entry) bool { return e.SCSKHz == out.SCSKHz })
		if i < 0 {
			return SSBSearch{}, fmt.Errorf("band %s has no %d kHz SS/PBCH blocks (Table 5.4.3.3-1)", out.Band, out.SCSKHz)
		}
		entry = &es[i]
	}
	rng := ch.Range
	if !slices.Contains(rng.SSBSCS(), out.SCSKHz) {
		return SSBSearch{}, fmt.Errorf("ssb.scsKHz %s is not an SS/PBCH block spacing of %s; use %s kHz, or name a band", given(out.SCSKHz), rng, JoinInts(rng.SSBSCS()))
	}
	if out.ScsCommonKHz == 0 {
		out.ScsCommonKHz = DefaultSCSCommon(rng, out.SCSKHz)
	}
	if !slices.Contains(SCSCommonChoices(rng), out.ScsCommonKHz) {
		return SSBSearch{}, fmt.Errorf("ssb.scsCommonKHz %d is not a subCarrierSpacingCommon of %s; use %s kHz", out.ScsCommonKHz, rng, JoinInts(SCSCommonChoices(rng)))
	}

	lo, hi, within := ssbWindow(r, out.SCSKHz, out.ScsCommonKHz)
	out.Within = within
	scs := Hz(out.SCSKHz) * 1000
	// SS_REF sits 120.5 subcarriers above the block's lower edge and 119.5
	// below its upper edge.
	first, _, okLo := gscn.Nearest(int64(ch.Abs(lo + 120*scs + scs/2)))
	_, last, okHi := gscn.Nearest(int64(ch.Abs(hi - 120*scs + scs/2)))
	if !okLo || !okHi {
		return out, nil
	}
	for g := first; g <= last; g++ {
		if entry != nil && !entry.Contains(g) {
			continue
		}
		f, _ := gscn.Frequency(g)
		ref := Hz(f) - ch.PointAHz
		o, k, fits := ssbFitsAt(rng, out.SCSKHz, out.ScsCommonKHz, ref, lo, hi)
		if !fits {
			continue
		}
		low := ssbLowEdge(ref, out.SCSKHz)
		n, _ := FrequencyARFCN(Hz(f))
		out.Positions = append(out.Positions, SSBPosition{GSCN: g, SSRefHz: Hz(f), AbsoluteFrequencySSB: n,
			OffsetToPointA: o, KSSB: k, LowHz: ch.Abs(low), HighHz: ch.Abs(low + 240*Hz(out.SCSKHz)*1000)})
	}
	return out, nil
}

// ssbWindow returns the span, relative to point A, that an SS/PBCH block of
// scsKHz must lie in, and says what it is for people: the channel, and the
// carrier of subCarrierSpacingCommon when the result has one (the block
// must lie on common RBs the UE can address, TS 38.211 4.4.4.2), less the
// 240 kHz block's guardband (TS 38.101-2 Table 5.3.3-2).
func ssbWindow(r Result, scsKHz, commonKHz int) (lo, hi Hz, within string) {
	ch := r.Channel
	lo, hi = ch.Low, ch.High
	within = fmt.Sprintf("the %d MHz channel", ch.BandwidthMHz)
	if c, ok := r.Carrier(commonKHz); ok {
		lo, hi = max(lo, c.Low), min(hi, c.High)
		within += fmt.Sprintf(" and the %d kHz carrier (CRBs %d to %d)", c.SCSKHz, c.OffsetToCarrier, c.OffsetToCarrier+c.CarrierBandwidth-1)
	}
	if g, ok := ssbGuard240[ch.BandwidthMHz]; ok && scsKHz == 240 {
		lo, hi = max(lo, ch.Low+g), min(hi, ch.High-g)
		within += fmt.Sprintf(", %s from each channel edge", fmtKHz(g))
	}
	return lo, hi, within
}

// ssbLowEdge is the lower edge of a block whose SS_REF is ref: SS_REF is
// the centre of subcarrier 120 (subcarrier 0 of RB 10), 120.5 subcarriers
// above the block's lower edge and 119.5 below its upper edge.
func ssbLowEdge(ref Hz, scsKHz int) Hz {
	scs := Hz(scsKHz) * 1000
	return ref - 120*scs - scs/2
}

// ssbFitsAt reports whether a block whose SS_REF is ref (from point A) lies
// within [lo, hi] and is reachable from point A by a whole offsetToPointA
// and k_SSB, and returns them.
func ssbFitsAt(rng Range, scsKHz, commonKHz int, ref, lo, hi Hz) (offset, k int, fits bool) {
	low := ssbLowEdge(ref, scsKHz)
	if low < lo || low+240*Hz(scsKHz)*1000 > hi {
		return 0, 0, false
	}
	o, k, why := placeBySSRef(rng, scsKHz, commonKHz, ref)
	return o, k, why == ""
}
