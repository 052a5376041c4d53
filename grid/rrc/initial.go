package rrc

import (
	"gridloom/grid"
	"gridloom/grid/asn1v"
)

// initialFields gathers the initial-access fields of a text as the reader
// meets them: they stand in the MIB, in ServingCellConfigCommon and in
// ServingCellConfigCommonSIB's initial BWPs.
type initialFields struct {
	cs0, ss0   int
	pdcchAt    *asn1v.Value // where controlResourceSetZero was first read
	pdcchPath  string
	dmrs       string
	dmrsAt     *asn1v.Value
	dmrsPath   string
	dl, ul     *grid.InitialBWPPlan
	dlAt, ulAt *asn1v.Value
}

// takeDMRS reads a dmrs-TypeA-Position; the MIB's and
// ServingCellConfigCommon's must agree (TS 38.331 gives both the same
// meaning, the first symbol of the type A DM-RS, TS 38.211 7.4.1.1.2).
func (ia *initialFields) takeDMRS(v *asn1v.Value, path string) error {
	if v == nil {
		return nil
	}
	name, err := ident(v, path, "pos2 or pos3")
	if err != nil {
		return err
	}
	if name != "pos2" && name != "pos3" {
		return fail(v, path, "%s %s is not a value; use pos2 or pos3.", path, name)
	}
	if ia.dmrsAt != nil && name != ia.dmrs {
		return fail(v, path, "%s is %s, but %s at %s is %s; a cell has one.", path, name, ia.dmrsPath, ia.dmrsAt.Pos, ia.dmrs)
	}
	ia.dmrs, ia.dmrsAt, ia.dmrsPath = name, v, path
	return nil
}

// takePDCCH reads controlResourceSetZero and searchSpaceZero, each
// INTEGER (0..15) (TS 38.331 ControlResourceSetZero, SearchSpaceZero); the
// MIB's pdcch-ConfigSIB1 and the initial BWP's PDCCH-ConfigCommon must
// agree, since both name the CORESET#0 and search space 0 of the cell.
func (ia *initialFields) takePDCCH(cs, ss *asn1v.Value, path string) error {
	c, err := integer(cs, path+".controlResourceSetZero", 0, 15)
	if err != nil {
		return err
	}
	s, err := integer(ss, path+".searchSpaceZero", 0, 15)
	if err != nil {
		return err
	}
	if ia.pdcchAt != nil && (c != ia.cs0 || s != ia.ss0) {
		return fail(cs, path, "%s says controlResourceSetZero %d and searchSpaceZero %d, but %s at %s says %d and %d; they must be the same.", path, c, s, ia.pdcchPath, ia.pdcchAt.Pos, ia.cs0, ia.ss0)
	}
	ia.cs0, ia.ss0, ia.pdcchAt, ia.pdcchPath = c, s, cs, path
	return nil
}

// initialBWP reads the genericParameters of an initial BWP as the plan's
// locationAndBandwidth, subcarrierSpacing and cyclicPrefix: the fields as
// they stand, so that the text reads back to itself.
func (rd *reader) initialBWP(at, g *asn1v.Value, path string) (*grid.InitialBWPPlan, error) {
	if g == nil {
		return nil, fail(at, path+".genericParameters", "%s needs genericParameters.", path)
	}
	gm, err := rd.seq(g, "BWP", "locationAndBandwidth", "subcarrierSpacing", "cyclicPrefix")
	if err != nil {
		return nil, err
	}
	if gm["locationAndBandwidth"] == nil || gm["subcarrierSpacing"] == nil {
		return nil, fail(g, path+".genericParameters", "The genericParameters of %s need locationAndBandwidth and subcarrierSpacing.", path)
	}
	b := &grid.InitialBWPPlan{}
	riv, err := integer(gm["locationAndBandwidth"], "locationAndBandwidth", 0, maxRIV)
	if err != nil {
		return nil, err
	}
	b.LocationAndBandwidth = &riv
	if b.SubcarrierSpacingKHz, err = scsField(gm["subcarrierSpacing"], "BWP.subcarrierSpacing"); err != nil {
		return nil, err
	}
	if cp := gm["cyclicPrefix"]; cp != nil {
		s, err := ident(cp, "cyclicPrefix", "extended")
		if err != nil {
			return nil, err
		}
		if s != "extended" {
			return nil, fail(cp, "BWP.cyclicPrefix", "cyclicPrefix %s is not a value; the only value is extended (leave it out for the normal cyclic prefix).", s)
		}
		b.CyclicPrefix = "extended"
	}
	return b, nil
}

// initialAccess makes the plan's initialAccess from the fields read. It
// needs controlResourceSetZero and searchSpaceZero: without them the
// initial BWPs and dmrs-TypeA-Position are skipped and listed, since the
// plan's initialAccess cannot stand without its CORESET#0. pos2, the
// value a plan leaves out, reads as "".
func (rd *reader) initialAccess(ia *initialFields) *grid.InitialAccessPlan {
	if ia.pdcchAt == nil {
		for _, v := range []struct {
			at   *asn1v.Value
			path string
		}{{ia.dmrsAt, ia.dmrsPath}, {ia.dlAt, "DownlinkConfigCommonSIB.initialDownlinkBWP"}, {ia.ulAt, "UplinkConfigCommonSIB.initialUplinkBWP"}} {
			if v.at != nil {
				rd.skip(v.path+" (no controlResourceSetZero and searchSpaceZero)", v.at.Pos)
			}
		}
		return nil
	}
	out := &grid.InitialAccessPlan{ControlResourceSetZero: ia.cs0, SearchSpaceZero: ia.ss0,
		InitialDownlinkBWP: ia.dl, InitialUplinkBWP: ia.ul}
	if ia.dmrs == "pos3" {
		out.DMRSTypeAPosition = "pos3"
	}
	return out
}
