package rrc

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/asn1v"
)

// msg1FDMNames are msg1-FDM's enumeration (TS 38.331 RACH-ConfigGeneric)
// by the number of occasions side by side.
var msg1FDMNames = map[int]string{1: "one", 2: "two", 4: "four", 8: "eight"}

// ssbPerROChoices are the alternatives of
// ssb-perRACH-OccasionAndCB-PreamblesPerSSB (TS 38.331 RACH-ConfigCommon)
// by the plan's ssbPerRachOccasion.
var ssbPerROChoices = map[string]string{
	"1/8": "oneEighth", "1/4": "oneFourth", "1/2": "oneHalf", "1": "one",
	"2": "two", "4": "four", "8": "eight", "16": "sixteen",
}

// restrictedSetNames is restrictedSetConfig's enumeration (TS 38.331
// RACH-ConfigCommon).
var restrictedSetNames = []string{"unrestrictedSet", "restrictedSetTypeA", "restrictedSetTypeB"}

// rachLeft lists the mandatory fields of RACH-ConfigGeneric and
// RACH-ConfigCommon (TS 38.331 V17.1.0) the plan does not determine.
const (
	rachGenericLeft = "not set by the plan: preambleReceivedTargetPower, preambleTransMax, powerRampingStep, ra-ResponseWindow"
	rachCommonLeft  = "not set by the plan: ra-ContentionResolutionTimer, prach-RootSequenceIndex"
	rachSSBLeft     = "ssb-perRACH-OccasionAndCB-PreamblesPerSSB is left out: the plan gives no count of contention-based preambles per SS/PBCH block, the second half of that CHOICE"
)

// rachValue writes the plan's prach as the setup of BWP-UplinkCommon's
// rach-ConfigCommon, with the values as the plan gives them and Compute
// checked them: a field the plan leaves to its default is written as that
// default where 38.331 has the field mandatory (msg1-FDM,
// restrictedSetConfig, and for a short format msg1-SubcarrierSpacing, which
// TS 38.331 Cond L139 makes mandatory for L = 139 and absent otherwise: for
// the long formats the UE takes the spacing from the format).
func rachValue(given *grid.PRACHPlan, r grid.Result) *asn1v.Value {
	if given == nil || r.PRACH == nil {
		return nil
	}
	fdm := given.Msg1FDM
	if fdm == 0 {
		fdm = 1
	}
	generic := asn1v.Seq()
	if given.ConfigurationIndex > 255 {
		generic.Note("prach-ConfigurationIndex is left out: index " + strconv.Itoa(given.ConfigurationIndex) + " only fits prach-ConfigurationIndex-v1610 (256..262), which the UE reads instead")
	} else {
		generic.Fields = append(generic.Fields, asn1v.F("prach-ConfigurationIndex", asn1v.Int(given.ConfigurationIndex)))
	}
	generic.Fields = append(generic.Fields,
		asn1v.F("msg1-FDM", asn1v.Ident(msg1FDMNames[fdm])),
		asn1v.F("msg1-FrequencyStart", asn1v.Int(given.Msg1FrequencyStart)),
		asn1v.F("zeroCorrelationZoneConfig", asn1v.Int(given.ZeroCorrelationZoneConfig)),
	)
	if given.ConfigurationIndex > 255 {
		generic.Fields = append(generic.Fields, asn1v.F("prach-ConfigurationIndex-v1610", asn1v.Int(given.ConfigurationIndex)))
	}
	generic.Note(rachGenericLeft)
	set := given.RestrictedSetConfig
	if set == "" {
		set = "unrestrictedSet"
	}
	v := asn1v.Seq(asn1v.F("rach-ConfigGeneric", generic))
	if r.PRACH.SequenceLength == 139 {
		// Mandatory for L = 139 (TS 38.331 RACH-ConfigCommon, Cond L139):
		// the spacing Compute resolved, the plan's or its default.
		v.Fields = append(v.Fields, asn1v.F("msg1-SubcarrierSpacing", asn1v.Ident(scsName(r.PRACH.SCSHz/1000))))
	}
	v.Fields = append(v.Fields, asn1v.F("restrictedSetConfig", asn1v.Ident(set)))
	v.Note(rachCommonLeft, rachSSBLeft)
	return asn1v.Choose("setup", v)
}

// readRACH reads BWP-UplinkCommon's rach-ConfigCommon into a PRACH plan.
// Fields the plan has no key for are skipped and listed.
func (rd *reader) readRACH(v *asn1v.Value, path string) (*grid.PRACHPlan, error) {
	if v.Kind != asn1v.Choice || (v.Name != "setup" && v.Name != "release") {
		return nil, fail(v, path, "%s is a SetupRelease: write setup : { ... } or release : NULL.", path)
	}
	if v.Name == "release" {
		return nil, nil
	}
	path += ".setup"
	m, err := rd.seq(v.Elems[0], path, "rach-ConfigGeneric", "ssb-perRACH-OccasionAndCB-PreamblesPerSSB", "msg1-SubcarrierSpacing", "restrictedSetConfig")
	if err != nil {
		return nil, err
	}
	g := m["rach-ConfigGeneric"]
	if g == nil {
		return nil, fail(v, path+".rach-ConfigGeneric", "rach-ConfigCommon needs rach-ConfigGeneric, which holds prach-ConfigurationIndex.")
	}
	gp := path + ".rach-ConfigGeneric"
	gm, err := rd.seq(g, gp, "prach-ConfigurationIndex", "msg1-FDM", "msg1-FrequencyStart", "zeroCorrelationZoneConfig", "prach-ConfigurationIndex-v1610")
	if err != nil {
		return nil, err
	}
	var out grid.PRACHPlan
	switch {
	case gm["prach-ConfigurationIndex-v1610"] != nil:
		// TS 38.331: the UE ignores prach-ConfigurationIndex when the
		// extension is present.
		if out.ConfigurationIndex, err = integer(gm["prach-ConfigurationIndex-v1610"], "prach-ConfigurationIndex-v1610", 256, 262); err != nil {
			return nil, err
		}
	case gm["prach-ConfigurationIndex"] != nil:
		if out.ConfigurationIndex, err = integer(gm["prach-ConfigurationIndex"], "prach-ConfigurationIndex", 0, 255); err != nil {
			return nil, err
		}
	default:
		return nil, fail(g, gp+".prach-ConfigurationIndex", "rach-ConfigGeneric needs prach-ConfigurationIndex, an INTEGER (0..255).")
	}
	if f := gm["msg1-FDM"]; f != nil {
		name, err := ident(f, "msg1-FDM", "one, two, four or eight")
		if err != nil {
			return nil, err
		}
		out.Msg1FDM = -1
		for n, s := range msg1FDMNames {
			if s == name {
				out.Msg1FDM = n
			}
		}
		if out.Msg1FDM < 0 {
			return nil, fail(f, "msg1-FDM", "msg1-FDM %s is not one of one, two, four or eight.", name)
		}
	}
	if f := gm["msg1-FrequencyStart"]; f != nil {
		// maxNrofPhysicalResourceBlocks-1 = 274 (TS 38.331).
		if out.Msg1FrequencyStart, err = integer(f, "msg1-FrequencyStart", 0, 274); err != nil {
			return nil, err
		}
	}
	if f := gm["zeroCorrelationZoneConfig"]; f != nil {
		if out.ZeroCorrelationZoneConfig, err = integer(f, "zeroCorrelationZoneConfig", 0, 15); err != nil {
			return nil, err
		}
	}
	if f := m["msg1-SubcarrierSpacing"]; f != nil {
		k, err := scsField(f, "msg1-SubcarrierSpacing")
		if err != nil {
			return nil, err
		}
		out.Msg1SubcarrierSpacing = float64(k)
	}
	if f := m["restrictedSetConfig"]; f != nil {
		all := strings.Join(restrictedSetNames, ", ")
		name, err := ident(f, "restrictedSetConfig", all)
		if err != nil {
			return nil, err
		}
		if indexFunc(restrictedSetNames, func(s string) bool { return s == name }) < 0 {
			return nil, fail(f, "restrictedSetConfig", "restrictedSetConfig %s is not one of %s.", name, all)
		}
		out.RestrictedSetConfig = name
	}
	if f := m["ssb-perRACH-OccasionAndCB-PreamblesPerSSB"]; f != nil {
		// The plan keeps the SS/PBCH blocks per occasion; the count of
		// contention-based preambles inside the alternative is not a plan
		// key and is skipped.
		if f.Kind != asn1v.Choice {
			return nil, fail(f, "ssb-perRACH-OccasionAndCB-PreamblesPerSSB", "ssb-perRACH-OccasionAndCB-PreamblesPerSSB is a CHOICE such as one : n16.")
		}
		for n, s := range ssbPerROChoices {
			if s == f.Name {
				out.SSBPerRachOccasion = n
			}
		}
		if out.SSBPerRachOccasion == "" {
			return nil, fail(f, "ssb-perRACH-OccasionAndCB-PreamblesPerSSB", "ssb-perRACH-OccasionAndCB-PreamblesPerSSB %s is not one of oneEighth, oneFourth, oneHalf, one, two, four, eight or sixteen.", f.Name)
		}
		rd.skip(fmt.Sprintf("%s.ssb-perRACH-OccasionAndCB-PreamblesPerSSB.%s", path, f.Name), f.Pos)
	}
	return &out, nil
}
