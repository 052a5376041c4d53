package planform

import (
	"fmt"
	"strings"
)

// Control ids. Findings name plan paths; ControlID turns one into the id of
// the control (or group) beside which its message belongs, and an edit
// returns the id of the control to focus next. A control's id is its query
// key with dots as hyphens (see KeyID).
const (
	IDCarriers = "g-carriers" // the SCS-specific carriers as a whole
	IDParts    = "g-parts"    // the partitions as a whole
	IDFile     = "f-file"     // the plan file upload
	IDAdd      = "b-add"      // the button that adds a partition
	IDTDD      = "g-tdd"
	IDSSB      = "g-ssb"
	IDEnv      = "g-env"
	IDInit     = "g-init"  // the initial access
	IDPRACH    = "g-prach" // the random access
	IDForm     = "gl-form"
	IDFigure   = "g-fig" // the figure's options
)

// KeyID is the id of a form control: "f-" and its query key with dots as
// hyphens ("f-tdd-dlsym", "f-p1-size", "f-off-30").
func KeyID(key string) string { return "f-" + strings.ReplaceAll(key, ".", "-") }

// PartControlID is the id of partition i's control of key ("name", "size").
func PartControlID(i int, key string) string { return fmt.Sprintf("f-p%d-%s", i, key) }

// PartGroupID is the id of partition i's fieldset.
func PartGroupID(i int) string { return fmt.Sprintf("g-p%d", i) }

// ButtonID is the id of partition i's edit button verb ("up", "del").
func ButtonID(verb string, i int) string { return fmt.Sprintf("b-%s-%d", verb, i) }

// groupIDs maps the plan paths of whole blocks to their group.
var groupIDs = map[string]string{
	"carrier.offsetToCarrier": IDCarriers, "carrier.carrierBandwidth": IDCarriers, "carrier": IDCarriers,
	"partitions": IDParts, "tdd": IDTDD, "tdd.pattern1": IDTDD, "tdd.pattern2": IDTDD,
	"ssb": IDSSB, "environment": IDEnv,
	"initialAccess": IDInit, "initialAccess.initialDownlinkBWP": IDInit, "initialAccess.initialUplinkBWP": IDInit,
	"prach": IDPRACH,
}

// ControlID is the id of the control or group that a plan path concerns,
// or "" for a path the form has no place for.
func ControlID(path string) string {
	if id, ok := groupIDs[path]; ok {
		return id
	}
	if fl, ok := fieldByPath[path]; ok {
		return KeyID(fl.Key)
	}
	if s, ok := strings.CutPrefix(path, "carrier.offsetToCarrier."); ok {
		return "f-off-" + s
	}
	if s, ok := strings.CutPrefix(path, "carrier.carrierBandwidth."); ok {
		return "f-cbw-" + s
	}
	if s, ok := strings.CutPrefix(path, "partitions["); ok {
		num, rest, ok := strings.Cut(s, "]")
		i, okIdx := Index(num)
		if !ok || !okIdx {
			return ""
		}
		if fl, ok := partFieldByPath[strings.TrimPrefix(rest, ".")]; ok {
			return PartControlID(i, fl.Key)
		}
		return PartGroupID(i)
	}
	return ""
}
