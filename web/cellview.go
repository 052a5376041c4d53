package web

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The cell's view: what a UE meets first — the band and its rasters, where
// the SS/PBCH block sits on the synchronization raster, CORESET#0 and its
// Type0-PDCCH occasions, the MIB fields and the initial BWPs — built from
// grid.Result, with the findings on those fields and the links to the two
// finders, which run only when asked (the initial-access one is costly).

// cellOf is the cell's view of a state, or nil when the plan says nothing
// of a band, a block or initial access; query is the state's link.
func cellOf(s planform.State, query string) *cellView {
	res := s.Result
	ch := res.Channel
	if ch.Band == "" && len(ch.BandCandidates) == 0 && res.SSB == nil && res.InitialAccess == nil {
		return nil
	}
	cv := &cellView{FindSSB: "/find/ssb?" + query, FindInitial: "/find/initial?" + query}
	cv.Band = bandFacts(ch)
	if b := res.SSB; b != nil {
		cv.Block = blockFacts(*b)
	}
	if ia := res.InitialAccess; ia != nil {
		cv.Coreset, cv.MIB, cv.BWPs = initialFacts(*ia)
	}
	cv.Findings = cellFindings(s)
	return cv
}

// cellFindings keeps the page's findings on the band, the GSCN and initial
// access, so they stand beside the facts they concern.
func cellFindings(s planform.State) []findingView {
	all, _, _, _ := findingsOf(s)
	var out []findingView
	for _, f := range all {
		if cellField(f.Control) {
			out = append(out, f)
		}
	}
	return out
}

// cellField tells whether a control id belongs to the cell's fields.
func cellField(id string) bool {
	return id == planform.ControlID("carrier.band") || id == planform.ControlID("ssb.gscn") ||
		strings.HasPrefix(id, planform.KeyID("ia."))
}

// bandFacts: the band, its duplex mode, its channel raster and the
// paired uplink.
func bandFacts(ch grid.Channel) []fact {
	var fs []fact
	switch {
	case ch.Band != "":
		fs = append(fs, fact{"Band", ch.Band + " (" + ch.Duplex + ")"})
	case len(ch.BandCandidates) > 0:
		fs = append(fs, fact{"Band", "none named; the channel lies in " + strings.Join(ch.BandCandidates, ", ")})
	default:
		fs = append(fs, fact{"Band", "none named"})
	}
	if ch.RasterKHz > 0 {
		fs = append(fs, fact{"Channel raster ΔF_Raster", strconv.Itoa(ch.RasterKHz) + " kHz"})
	}
	if ch.HasUL {
		fs = append(fs, fact{"Paired uplink", fmt.Sprintf("%s MHz (NR-ARFCN %d)", exact(ch.ULCenterHz.MHz()), ch.ULARFCN)})
	}
	return fs
}

// blockFacts: where the block sits and the fields that say so.
func blockFacts(b grid.SSB) []fact {
	fs := []fact{}
	if b.Absolute {
		fs = append(fs, fact{"SS_REF", exact(b.SSRefHz.MHz()) + " MHz"})
		if b.OnSyncRaster {
			fs = append(fs, fact{"GSCN", strconv.Itoa(b.GSCN)})
		} else {
			fs = append(fs, fact{"GSCN", "none: SS_REF is off the synchronization raster"})
		}
		if b.OnARFCNRaster {
			fs = append(fs, fact{"absoluteFrequencySSB", strconv.Itoa(b.AbsoluteFrequencySSB)})
		}
	} else {
		fs = append(fs, fact{"SS_REF", exact(b.SSRef.KHz()) + " kHz from point A (no carrier frequency, so no GSCN)"})
	}
	fs = append(fs,
		fact{"offsetToPointA", fmt.Sprintf("%d (RBs of %d kHz)", b.OffsetToPointA, offsetUnitKHz(b))},
		fact{"k_SSB", strconv.Itoa(b.KSSB)},
		fact{"ssb-PositionsInBurst", b.BitmapForm})
	return fs
}

// offsetUnitKHz is the spacing offsetToPointA counts RBs of: 15 kHz in
// FR1, 60 kHz in FR2 (TS 38.211 4.4.4.2).
func offsetUnitKHz(b grid.SSB) int {
	if b.Numerology.SCSKHz() >= 120 {
		return 60
	}
	return 15
}

// initialFacts: CORESET#0 and searchSpace0, the MIB and the initial BWPs.
func initialFacts(ia grid.InitialAccess) (coreset, mib, bwps []fact) {
	c := ia.CORESET0
	coreset = []fact{
		{"CORESET#0", fmt.Sprintf("TS 38.213 Table %s, index %d: pattern %d, %d RBs × %d symbols, offset %d RBs", c.Table, c.Index, c.Pattern, c.NRB, c.Symbols, c.OffsetRB)},
		{"CORESET#0 place", fmt.Sprintf("CRBs %s of %d kHz, %s to %s MHz from point A (%s MHz wide)", crbRange(c.StartCRB, c.NRB), c.SCSKHz,
			exact(c.Low.MHz()), exact(c.High.MHz()), exact((c.High - c.Low).MHz()))},
		{"searchSpace0", occasionSummary(ia)},
	}
	m := ia.MIB
	mib = []fact{
		{"subCarrierSpacingCommon", commonText(m)},
		{"ssb-SubcarrierOffset", fmt.Sprintf("%d (k_SSB's fifth bit %d)", m.SSBSubcarrierOffset, m.KSSBMsb)},
		{"dmrs-TypeA-Position", m.DMRSTypeAPosition},
		{"pdcch-ConfigSIB1", fmt.Sprintf("%08b (%d: controlResourceSetZero %d, searchSpaceZero %d)", m.PDCCHConfigSIB1, m.PDCCHConfigSIB1, c.Index, ia.SearchSpaceZero)},
	}
	bwps = []fact{{"Initial downlink BWP", bwpText(ia.InitialDL)}}
	if ia.InitialUL != nil {
		bwps = append(bwps, fact{"Initial uplink BWP", bwpText(*ia.InitialUL)})
	}
	return coreset, mib, bwps
}

// commonText is subCarrierSpacingCommon as the cell view gives it: the
// value, or where it gives no spacing what SIB1 uses instead (grid's
// CommonNote).
func commonText(m grid.MIBFields) string {
	if m.SubCarrierSpacingCommon != "" {
		return m.SubCarrierSpacingCommon
	}
	return "no spacing: " + m.CommonNote
}

// occasionSummary says how many Type0-PDCCH occasions the window holds and
// where the first ones are.
func occasionSummary(ia grid.InitialAccess) string {
	occ := ia.Occasions
	s := fmt.Sprintf("index %d (TS 38.213 Table %s): %s in %d ms", ia.SearchSpaceZero, ia.OccasionTable, plural(len(occ), "occasion", "occasions"), ia.WindowMs)
	if len(occ) > 0 {
		o := occ[0]
		s += fmt.Sprintf("; the first, for SSB %d, in slot %d, symbols %d–%d", o.SSBIndex, o.Slot, o.FirstSymbol, o.FirstSymbol+o.Symbols-1)
	}
	return s
}

// bwpText places an initial BWP and says where it came from.
func bwpText(b grid.InitialBWP) string {
	s := fmt.Sprintf("PRBs %s of %d kHz %s CP (%s to %s MHz from point A)", crbRange(b.StartCRB, b.SizePRB), b.SCSKHz, b.CP, exact(b.Low.MHz()), exact(b.High.MHz()))
	if b.LocationAndBandwidth >= 0 {
		s += fmt.Sprintf(", locationAndBandwidth %d", b.LocationAndBandwidth)
	}
	switch b.Source {
	case "coreset0":
		s += "; CORESET#0's extent"
	case "partition":
		s += "; partition " + b.Partition
	case "initialDownlinkBWP":
		s += "; the downlink one's"
	}
	return s
}
