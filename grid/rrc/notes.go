package rrc

import (
	"bytes"
	"encoding/json"
	"fmt"
	"reflect"
	"strings"

	"gridloom/grid"
	"gridloom/grid/asn1v"
)

// A note is a comment "gridloom key: value" with a plan key and its value
// in JSON. Notes at the top of the text hold plan and carrier keys; notes
// inside a BWP-Downlink or BWP-Uplink value hold that partition's keys.
const notePrefix = "gridloom "

type planKey struct {
	key    string
	always bool // written even when the RRC fields read back the same
	ptr    func(p *grid.Plan) any
}

func ssbField(f func(s *grid.SSBPlan) any) func(p *grid.Plan) any {
	return func(p *grid.Plan) any {
		if p.SSB == nil {
			return nil
		}
		return f(p.SSB)
	}
}

// iaField reaches a key of initialAccess; nil when the plan has none, as
// ssbField does for ssb. A note on such a key makes the block (applyNotes).
func iaField(f func(ia *grid.InitialAccessPlan) any) func(p *grid.Plan) any {
	return func(p *grid.Plan) any {
		if p.InitialAccess == nil {
			return nil
		}
		return f(p.InitialAccess)
	}
}

// prachField reaches a key of prach; nil when the plan has none. A note on
// such a key makes the block (applyNotes).
func prachField(f func(r *grid.PRACHPlan) any) func(p *grid.Plan) any {
	return func(p *grid.Plan) any {
		if p.PRACH == nil {
			return nil
		}
		return f(p.PRACH)
	}
}

var planKeys = []planKey{
	{"name", true, func(p *grid.Plan) any { return &p.Name }},
	{"spanMs", false, func(p *grid.Plan) any { return &p.SpanMs }},
	{"numerologyGapKHz", false, func(p *grid.Plan) any { return &p.NumerologyGapKHz }},
	{"environment", false, func(p *grid.Plan) any { return &p.Environment }},
	{"carrier.range", true, func(p *grid.Plan) any { return &p.Carrier.Range }},
	{"carrier.band", false, func(p *grid.Plan) any { return &p.Carrier.Band }},
	{"carrier.bandwidthMHz", true, func(p *grid.Plan) any { return &p.Carrier.BandwidthMHz }},
	{"carrier.centerMHz", false, func(p *grid.Plan) any { return &p.Carrier.CenterMHz }},
	{"carrier.arfcn", false, func(p *grid.Plan) any { return &p.Carrier.ARFCN }},
	{"carrier.offsetToCarrier", false, func(p *grid.Plan) any { return &p.Carrier.OffsetToCarrier }},
	{"carrier.carrierBandwidth", false, func(p *grid.Plan) any { return &p.Carrier.CarrierBandwidth }},
	// ServingCellConfigCommon's n-TimingAdvanceOffset carries it; a note
	// only when the text would not (never, for a plan without errors).
	{"carrier.nTaOffset", false, func(p *grid.Plan) any { return &p.Carrier.NTAOffset }},
	{"tdd", false, func(p *grid.Plan) any { return &p.TDD }},
	{"ssb.scsKHz", false, ssbField(func(s *grid.SSBPlan) any { return &s.SCSKHz })},
	{"ssb.case", false, ssbField(func(s *grid.SSBPlan) any { return &s.Case })},
	{"ssb.bitmap", false, ssbField(func(s *grid.SSBPlan) any { return &s.Bitmap })},
	{"ssb.offsetToPointA", false, ssbField(func(s *grid.SSBPlan) any { return &s.OffsetToPointA })},
	{"ssb.kSsb", false, ssbField(func(s *grid.SSBPlan) any { return &s.KSSB })},
	{"ssb.scsCommonKHz", false, ssbField(func(s *grid.SSBPlan) any { return &s.ScsCommonKHz })},
	{"ssb.periodMs", false, ssbField(func(s *grid.SSBPlan) any { return &s.PeriodMs })},
	// A block placed by GSCN is written with the offsetToPointA and k_SSB
	// Compute derives; the notes give back the GSCN and the zero fields.
	{"ssb.gscn", false, ssbField(func(s *grid.SSBPlan) any { return &s.GSCN })},
	// The MIB's pdcch-ConfigSIB1 and dmrs-TypeA-Position and SIB1's
	// initial BWPs carry these; notes give back what the fields say
	// otherwise: pos2 written out, a default initial BWP the plan left
	// out, a BWP placed by startCrb/sizePrb or by naming a partition.
	{"initialAccess.controlResourceSetZero", false, iaField(func(ia *grid.InitialAccessPlan) any { return &ia.ControlResourceSetZero })},
	{"initialAccess.searchSpaceZero", false, iaField(func(ia *grid.InitialAccessPlan) any { return &ia.SearchSpaceZero })},
	{"initialAccess.dmrsTypeAPosition", false, iaField(func(ia *grid.InitialAccessPlan) any { return &ia.DMRSTypeAPosition })},
	{"initialAccess.initialDownlinkBWP", false, iaField(func(ia *grid.InitialAccessPlan) any { return &ia.InitialDownlinkBWP })},
	{"initialAccess.initialUplinkBWP", false, iaField(func(ia *grid.InitialAccessPlan) any { return &ia.InitialUplinkBWP })},
	// BWP-UplinkCommon's rach-ConfigCommon carries these; notes give back
	// a default the plan left out (msg1FDM, restrictedSetConfig), a long
	// format's spacing, and ssbPerRachOccasion, which 38.331 says only
	// together with a count of contention-based preambles the plan lacks.
	{"prach.configurationIndex", false, prachField(func(r *grid.PRACHPlan) any { return &r.ConfigurationIndex })},
	{"prach.msg1SubcarrierSpacing", false, prachField(func(r *grid.PRACHPlan) any { return &r.Msg1SubcarrierSpacing })},
	{"prach.msg1FDM", false, prachField(func(r *grid.PRACHPlan) any { return &r.Msg1FDM })},
	{"prach.msg1FrequencyStart", false, prachField(func(r *grid.PRACHPlan) any { return &r.Msg1FrequencyStart })},
	{"prach.zeroCorrelationZoneConfig", false, prachField(func(r *grid.PRACHPlan) any { return &r.ZeroCorrelationZoneConfig })},
	{"prach.restrictedSetConfig", false, prachField(func(r *grid.PRACHPlan) any { return &r.RestrictedSetConfig })},
	{"prach.ssbPerRachOccasion", false, prachField(func(r *grid.PRACHPlan) any { return &r.SSBPerRachOccasion })},
}

type partitionKey struct {
	key    string
	always bool
	ptr    func(p *grid.PartitionPlan) any
}

var partitionKeys = []partitionKey{
	{"name", true, func(p *grid.PartitionPlan) any { return &p.Name }},
	{"scsKHz", false, func(p *grid.PartitionPlan) any { return &p.SCSKHz }},
	{"cp", false, func(p *grid.PartitionPlan) any { return &p.CP }},
	{"startCrb", false, func(p *grid.PartitionPlan) any { return &p.StartCRB }},
	{"sizePrb", false, func(p *grid.PartitionPlan) any { return &p.SizePRB }},
	{"locationAndBandwidth", false, func(p *grid.PartitionPlan) any { return &p.LocationAndBandwidth }},
	{"direction", false, func(p *grid.PartitionPlan) any { return &p.Direction }},
	{"layers", false, func(p *grid.PartitionPlan) any { return &p.Layers }},
	{"modulation", false, func(p *grid.PartitionPlan) any { return &p.Modulation }},
	// The timing keys have no field in the IEs written: the processing
	// capability is the UE's (UE-NR-Capability), and dmrs-AdditionalPosition
	// lives in DMRS-DownlinkConfig under PDSCH-Config of bwp-Dedicated,
	// which gridloom does not write.
	{"ueCapability", false, func(p *grid.PartitionPlan) any { return &p.UECapability }},
	{"dmrsAdditionalPosition", false, func(p *grid.PartitionPlan) any { return &p.DMRSAdditionalPosition }},
}

// noteJSON writes a value for a note. "--" would end an ASN.1 comment, so
// it is written with an escape JSON reads back.
func noteJSON(v any) string {
	b, _ := json.Marshal(v) // plan fields always marshal
	return strings.ReplaceAll(string(b), "--", `-\u002d`)
}

func isZero(v any) bool {
	b, _ := json.Marshal(v)
	switch string(b) {
	case "null", `""`, "0", "false":
		return true
	}
	return false
}

// addNotes adds a note for each key whose value differs between the plan
// p and q, the plan the RRC fields alone read back to.
func addNotes(doc *asn1v.Document, p, q grid.Plan) {
	for _, k := range planKeys {
		a, b := k.ptr(&p), k.ptr(&q)
		if a == nil {
			continue
		}
		va := noteJSON(a)
		if (k.always && !isZero(a)) || b == nil || va != noteJSON(b) {
			doc.Comments = append(doc.Comments, asn1v.Comment{Text: notePrefix + k.key + ": " + va})
		}
	}
	i := 0
	for _, a := range doc.Assignments {
		if a.Type != typeBWPDL && a.Type != typeBWPUL {
			continue
		}
		pp, qp := p.Partitions[i], q.Partitions[i]
		i++
		var notes []asn1v.Comment
		for _, k := range partitionKeys {
			va := noteJSON(k.ptr(&pp))
			if (k.always && !isZero(k.ptr(&pp))) || va != noteJSON(k.ptr(&qp)) {
				notes = append(notes, asn1v.Comment{Text: notePrefix + k.key + ": " + va})
			}
		}
		a.Value.Comments = append(notes, a.Value.Comments...)
	}
}

// applyNotes sets the plan keys the notes name and reports whether there
// were any.
func applyNotes(doc *asn1v.Document, p *grid.Plan) (bool, error) {
	applied := false
	for _, c := range doc.Comments {
		key, val, ok := splitNote(c)
		if !ok {
			continue
		}
		applied = true
		i := indexFunc(planKeys, func(k planKey) bool { return k.key == key })
		if i < 0 {
			return applied, &Error{Pos: c.Pos, Field: key, Msg: fmt.Sprintf("%q is not a gridloom note key at the top of the text; use %s.", key, planKeyList())}
		}
		dst := planKeys[i].ptr(p)
		if dst == nil && strings.HasPrefix(key, "initialAccess.") {
			p.InitialAccess = &grid.InitialAccessPlan{}
			dst = planKeys[i].ptr(p)
		}
		if dst == nil && strings.HasPrefix(key, "prach.") {
			p.PRACH = &grid.PRACHPlan{}
			dst = planKeys[i].ptr(p)
		}
		if dst == nil {
			return applied, &Error{Pos: c.Pos, Field: key, Msg: fmt.Sprintf("The note %s applies to SS/PBCH blocks, but the text places none (it needs offsetToPointA and ssbSubcarrierSpacing).", key)}
		}
		if err := decodeNote(val, dst); err != nil {
			return applied, &Error{Pos: c.Pos, Field: key, Msg: fmt.Sprintf("The note %s holds %s, which is not a value for it: %v.", key, val, err)}
		}
	}
	idx := 0
	for _, a := range doc.Assignments {
		if a.Type != typeBWPDL && a.Type != typeBWPUL {
			if err := misplaced(a.Value); err != nil {
				return applied, err
			}
			continue
		}
		for _, c := range a.Value.Comments {
			key, val, ok := splitNote(c)
			if !ok {
				continue
			}
			applied = true
			i := indexFunc(partitionKeys, func(k partitionKey) bool { return k.key == key })
			if i < 0 {
				return applied, &Error{Pos: c.Pos, Field: key, Msg: fmt.Sprintf("%q is not a gridloom note key of a partition; use %s.", key, partitionKeyList())}
			}
			if err := decodeNote(val, partitionKeys[i].ptr(&p.Partitions[idx])); err != nil {
				return applied, &Error{Pos: c.Pos, Field: key, Msg: fmt.Sprintf("The note %s holds %s, which is not a value for it: %v.", key, val, err)}
			}
		}
		for _, f := range a.Value.Fields {
			if err := misplaced(f.Value); err != nil {
				return applied, err
			}
		}
		idx++
	}
	return applied, nil
}

// misplaced refuses a note anywhere below v, where the reader would not
// look for it.
func misplaced(v *asn1v.Value) error {
	if v == nil {
		return nil
	}
	for _, c := range v.Comments {
		if key, _, ok := splitNote(c); ok {
			return &Error{Pos: c.Pos, Field: key, Msg: "A gridloom note stands at the top of the text or at the top of a BWP-Downlink or BWP-Uplink value; move this one there."}
		}
	}
	for _, f := range v.Fields {
		if err := misplaced(f.Value); err != nil {
			return err
		}
	}
	for _, e := range v.Elems {
		if err := misplaced(e); err != nil {
			return err
		}
	}
	return nil
}

func splitNote(c asn1v.Comment) (key, val string, ok bool) {
	if c.Block || !strings.HasPrefix(c.Text, notePrefix) {
		return "", "", false
	}
	key, val, ok = strings.Cut(strings.TrimPrefix(c.Text, notePrefix), ": ")
	if !ok || strings.ContainsAny(key, " \t") {
		return "", "", false
	}
	return key, strings.TrimSpace(val), true
}

func decodeNote(val string, dst any) error {
	// Start from the zero value: JSON would merge into a map or struct.
	z := reflect.ValueOf(dst).Elem()
	z.Set(reflect.Zero(z.Type()))
	dec := json.NewDecoder(bytes.NewReader([]byte(val)))
	dec.DisallowUnknownFields()
	if err := dec.Decode(dst); err != nil {
		return err
	}
	if dec.More() {
		return fmt.Errorf("more follows the value")
	}
	return nil
}

func indexFunc[T any](s []T, f func(T) bool) int {
	for i, v := range s {
		if f(v) {
			return i
		}
	}
	return -1
}

func planKeyList() string {
	keys := make([]string, len(planKeys))
	for i, k := range planKeys {
		keys[i] = k.key
	}
	return strings.Join(keys, ", ")
}

func partitionKeyList() string {
	keys := make([]string, len(partitionKeys))
	for i, k := range partitionKeys {
		keys[i] = k.key
	}
	return strings.Join(keys, ", ")
}
