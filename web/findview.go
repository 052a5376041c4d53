package web

import (
	"fmt"
	"strconv"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The finders' page: a ranked table whose rows are links to the planner
// with the row's values set, so applying one needs no script.

// maxFindRows caps the rows a finder's page lists; the API lists all.
const maxFindRows = 30

type findView struct {
	Title, Lead string
	Back        string   // the planner with the plan as it was
	Head        []string // the columns
	Rows        []findRow
	More        int    // rows left out past maxFindRows
	Why         string // why nothing is listed
}

type findRow struct {
	Cells []string
	Apply string // the planner's link with the row applied
	Label string // what the apply link sets, for its title
}

// applyLink is the planner's link for st's plan with kv set.
func applyLink(st planform.State, kv map[string]string) string {
	return "/?" + planform.JoinQuery(st.Form.With(kv).Query(), st.Fig.Form.Query())
}

// ssbFindView lists the GSCNs grid.SSBPositions found; applying one sets
// ssb.gscn with the offsets that reach it, so the plan's fields agree.
func ssbFindView(st planform.State, found grid.SSBSearch, err error) findView {
	v := findView{Title: "Find a place for the SS/PBCH block", Back: "/?" + st.Query(),
		Head: []string{"GSCN", "SS_REF (MHz)", "absoluteFrequencySSB", "offsetToPointA", "k_SSB", "Block (MHz)"}}
	if err != nil {
		v.Why = "The search could not run: " + err.Error() + "."
		return v
	}
	where := ""
	if found.Band != "" {
		where = " of band " + found.Band
	}
	v.Lead = fmt.Sprintf("%s of %d kHz SS/PBCH blocks%s within %s (subCarrierSpacingCommon %d kHz; TS 38.101-1/-2 5.4.3).",
		plural(len(found.Positions), "GSCN", "GSCNs"), found.SCSKHz, where, found.Within, found.ScsCommonKHz)
	for i, q := range found.Positions {
		if i == maxFindRows {
			v.More = len(found.Positions) - i
			break
		}
		kv := map[string]string{"ssb.gscn": strconv.Itoa(q.GSCN), "ssb.off": strconv.Itoa(q.OffsetToPointA), "ssb.k": strconv.Itoa(q.KSSB)}
		if st.Form.SSB.SCS == "" {
			kv["ssb.scs"] = strconv.Itoa(found.SCSKHz)
		}
		v.Rows = append(v.Rows, findRow{
			Cells: []string{strconv.Itoa(q.GSCN), exact(q.SSRefHz.MHz()), strconv.Itoa(q.AbsoluteFrequencySSB), strconv.Itoa(q.OffsetToPointA), strconv.Itoa(q.KSSB),
				exact(q.LowHz.MHz()) + "–" + exact(q.HighHz.MHz())},
			Apply: applyLink(st, kv), Label: fmt.Sprintf("Use GSCN %d", q.GSCN)})
	}
	if len(found.Positions) == 0 {
		v.Why = "No GSCN of the band puts the block inside the channel and the carrier of subCarrierSpacingCommon."
	}
	return v
}

// initialFindView lists grid.FindInitialAccess's combinations, best
// first; applying one sets the GSCN and offsets, controlResourceSetZero and
// searchSpaceZero.
func initialFindView(st planform.State, found grid.InitialAccessSearch, err error) findView {
	v := findView{Title: "Find initial-access settings", Back: "/?" + st.Query(),
		Head: []string{"GSCN", "offsetToPointA", "k_SSB", "controlResourceSetZero", "searchSpaceZero", "pdcch-ConfigSIB1", "Pattern", "RBs × symbols", "CRBs", "Clear of the block", "Warnings"}}
	if err != nil {
		v.Why = "The search could not run: " + err.Error() + "."
		return v
	}
	v.Lead = fmt.Sprintf("%s over %s, for %d kHz blocks with subCarrierSpacingCommon %d kHz (TS 38.213 Table %s), best first: CORESET#0 clear of the block, no warnings, the widest CORESET#0, the block nearest the centre.",
		plural(len(found.Options), "combination", "combinations"), plural(found.Positions, "block position", "block positions"), found.SSBSCSKHz, found.ScsCommonKHz, found.Table)
	for i, o := range found.Options {
		if i == maxFindRows {
			v.More = len(found.Options) - i
			break
		}
		kv := map[string]string{"ia.coreset": strconv.Itoa(o.ControlResourceSetZero), "ia.ss0": strconv.Itoa(o.SearchSpaceZero),
			"ssb.off": strconv.Itoa(o.OffsetToPointA), "ssb.k": strconv.Itoa(o.KSSB)}
		g := "—"
		if o.GSCN != 0 {
			g = strconv.Itoa(o.GSCN)
			kv["ssb.gscn"] = g
		}
		v.Rows = append(v.Rows, findRow{
			Cells: []string{g, strconv.Itoa(o.OffsetToPointA), strconv.Itoa(o.KSSB), strconv.Itoa(o.ControlResourceSetZero), strconv.Itoa(o.SearchSpaceZero),
				fmt.Sprintf("%08b", o.PDCCHConfigSIB1), strconv.Itoa(o.Pattern), fmt.Sprintf("%d × %d", o.NRB, o.Symbols), crbRange(o.StartCRB, o.NRB),
				yesNo(o.ClearOfSSB, "yes", "no"), strconv.Itoa(o.Warnings)},
			Apply: applyLink(st, kv), Label: fmt.Sprintf("Use controlResourceSetZero %d, searchSpaceZero %d at GSCN %s", o.ControlResourceSetZero, o.SearchSpaceZero, g)})
	}
	if len(found.Options) == 0 {
		v.Why = found.Why
	}
	return v
}
