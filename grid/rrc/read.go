package rrc

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"gridloom/grid"
	"gridloom/grid/asn1v"
	"gridloom/grid/band"
)

// Error is a value the reader refuses, at its place in the text. Field is
// the ASN.1 path of the value ("ServingCellConfigCommonSIB.ssb-PeriodicityServingCell").
type Error struct {
	Pos   asn1v.Pos
	Field string
	Msg   string
}

func (e *Error) Error() string {
	if e.Pos.Line == 0 {
		return e.Msg
	}
	return e.Pos.String() + ": " + e.Msg
}

// Decoded is a plan read from value notation.
type Decoded struct {
	Plan grid.Plan
	// Skipped lists the values and fields the reader passed over: types
	// gridloom does not read and fields of known IEs the plan has no place
	// for, each as a path with its line.
	Skipped []string
	// Assumed lists what the reader had to assume, such as a k_SSB of 0
	// when the text has no MIB.
	Assumed []string
}

// Notes returns the sentences to show beside a decoded plan: what was
// skipped and what was assumed.
func (d Decoded) Notes() []string {
	var out []string
	if len(d.Skipped) > 0 {
		out = append(out, fmt.Sprintf("Skipped %d values and fields gridloom does not read: %s.", len(d.Skipped), strings.Join(d.Skipped, ", ")))
	}
	out = append(out, d.Assumed...)
	return out
}

// Looks reports whether data starts like value notation: after comments,
// a value assignment "name Type ::=". Plan files in JSON or YAML never do.
func Looks(data []byte) bool { return asn1v.StartsWithAssignment(data) }

// Decode reads value notation into a plan: the IEs Encode writes, in any
// order and field order, with comments, as Encode writes them or as a log
// shows them. Notes written as "-- gridloom key: value" restore what 38.331
// has no field for. Types gridloom does not read are skipped and listed;
// values out of their ASN.1 range are refused naming the field.
func Decode(text []byte) (Decoded, error) {
	doc, err := asn1v.Parse(text)
	if err != nil {
		return Decoded{}, err
	}
	rd := &reader{}
	q, err := rd.read(doc)
	if err != nil {
		return Decoded{}, err
	}
	d := rd.d
	p := q.Clone()
	applied, err := applyNotes(doc, &p)
	if err != nil {
		return Decoded{}, err
	}
	if p.Carrier.BandwidthMHz == 0 {
		return Decoded{}, &Error{Msg: "No channel bandwidth of TS 38.101 Table 5.3.2-1 has N_RB equal to every carrierBandwidth of scs-SpecificCarrierList, and 38.331 has no field for the channel bandwidth; add a line \"-- gridloom carrier.bandwidthMHz: N\" at the top (and \"-- gridloom carrier.range: \\\"FR2-1\\\"\" outside FR1)."}
	}
	if rd.pointA != nil && p.Carrier.CenterMHz == nil && p.Carrier.ARFCN == nil {
		if err := centre(&p, rd.pointA, rd.pointAHz); err != nil {
			return Decoded{}, err
		}
	}
	res := grid.Compute(p)
	if v := rd.pointA; v != nil && res.Channel.Absolute {
		if n, ok := res.Channel.PointAARFCN, res.Channel.PointAOnRaster; !ok || int64(n) != v.Int {
			return Decoded{}, fail(v, "absoluteFrequencyPointA", "absoluteFrequencyPointA %d does not match the carrier the gridloom notes give (carrier.centerMHz or carrier.arfcn), whose point A is at %s MHz; correct the field or delete the note.", v.Int, fmtMHz(res.Channel.PointAHz))
		}
	}
	if v := rd.ssbARFCN; v != nil && p.SSB != nil {
		if n, ok := ssbARFCN(res); ok && int64(n) != v.Int {
			return Decoded{}, fail(v, "absoluteFrequencySSB", "absoluteFrequencySSB %d does not match the SS/PBCH block that offsetToPointA and ssb-SubcarrierOffset place, whose reference frequency is NR-ARFCN %d.", v.Int, n)
		}
	}
	if applied {
		if err := agree(q, p); err != nil {
			return Decoded{}, err
		}
	}
	d.Plan = p
	return d, nil
}

func fmtMHz(f grid.Hz) string { return fmt.Sprintf("%.6f", f.MHz()) }

// agree checks that the notes do not contradict the RRC fields: the plan
// they make, written again, must give the fields as read. A plan with
// error findings is left to the findings.
func agree(q, p grid.Plan) error {
	res := grid.Compute(p)
	if res.HasErrors() {
		return nil
	}
	doc, err := build(p, res)
	if err != nil {
		return nil
	}
	q2, _, err := readFields(doc)
	if err != nil {
		return nil
	}
	type pair struct {
		field string
		a, b  any
	}
	checks := []pair{
		{"scs-SpecificCarrierList (offsetToCarrier)", q.Carrier.OffsetToCarrier, q2.Carrier.OffsetToCarrier},
		{"scs-SpecificCarrierList (carrierBandwidth)", q.Carrier.CarrierBandwidth, q2.Carrier.CarrierBandwidth},
		{"tdd-UL-DL-ConfigurationCommon", q.TDD, q2.TDD},
		{"frequencyBandList", q.Carrier.Band, q2.Carrier.Band},
		{"n-TimingAdvanceOffset", q.Carrier.NTAOffset, q2.Carrier.NTAOffset},
		{"pdcch-ConfigSIB1, dmrs-TypeA-Position and the initial BWPs", q.InitialAccess, q2.InitialAccess},
		{"rach-ConfigCommon", rachWritten(q.PRACH), rachWritten(q2.PRACH)},
	}
	// gridloom never writes ssb-perRACH-OccasionAndCB-PreamblesPerSSB, so
	// the rebuilt text cannot have it; a text that does must agree with
	// the note instead.
	if q.PRACH != nil && q.PRACH.SSBPerRachOccasion != "" && p.PRACH != nil {
		checks = append(checks, pair{"ssb-perRACH-OccasionAndCB-PreamblesPerSSB", q.PRACH.SSBPerRachOccasion, p.PRACH.SSBPerRachOccasion})
	}
	if q.Carrier.CenterMHz != nil {
		checks = append(checks, pair{"absoluteFrequencyPointA", deref(q.Carrier.CenterMHz), deref(q2.Carrier.CenterMHz)})
	}
	if q.SSB != nil {
		checks = append(checks, pair{"the SS/PBCH fields (offsetToPointA, ssb-SubcarrierOffset, ssb-PositionsInBurst, ssb-PeriodicityServingCell, ssbSubcarrierSpacing)", *q.SSB, deref(q2.SSB)})
	}
	for i, pp := range q.Partitions {
		var other grid.PartitionPlan
		if i < len(q2.Partitions) {
			other = q2.Partitions[i]
		}
		pp.Name, other.Name = "", ""
		checks = append(checks, pair{fmt.Sprintf("the genericParameters of %s", q.Partitions[i].Name), pp, other})
	}
	for _, c := range checks {
		if a, b := noteJSON(c.a), noteJSON(c.b); a != b {
			return &Error{Msg: fmt.Sprintf("The gridloom notes contradict %s: the fields say %s, the notes make them %s; correct the field or delete the note.", c.field, a, b)}
		}
	}
	return nil
}

func deref[T any](p *T) T {
	var zero T
	if p == nil {
		return zero
	}
	return *p
}

// reader reads the RRC fields of a document into a plan, without notes.
type reader struct {
	d        Decoded
	pointA   *asn1v.Value
	pointAHz grid.Hz
	ssbARFCN *asn1v.Value // absoluteFrequencySSB, checked once the plan is whole
	bwpIDs   map[string]string
}

func (rd *reader) skip(path string, pos asn1v.Pos) {
	rd.d.Skipped = append(rd.d.Skipped, fmt.Sprintf("%s (line %d)", path, pos.Line))
}

func fail(v *asn1v.Value, field, format string, args ...any) error {
	e := &Error{Field: field, Msg: fmt.Sprintf(format, args...)}
	if v != nil {
		e.Pos = v.Pos
	}
	return e
}

// seq checks that v is a SEQUENCE value and returns its fields by name;
// fields not in known are skipped and listed.
func (rd *reader) seq(v *asn1v.Value, path string, known ...string) (map[string]*asn1v.Value, error) {
	if v.Kind != asn1v.Sequence {
		return nil, fail(v, path, "%s must be a SEQUENCE value { name value, ... }, not a %s.", path, v.Kind)
	}
	m := map[string]*asn1v.Value{}
	for _, f := range v.Fields {
		if slices.Contains(known, f.Name) {
			m[f.Name] = f.Value
		} else {
			rd.skip(path+"."+f.Name, f.Pos)
		}
	}
	return m, nil
}

func integer(v *asn1v.Value, path string, lo, hi int) (int, error) {
	if v.Kind != asn1v.Integer {
		return 0, fail(v, path, "%s must be an INTEGER, not a %s.", path, v.Kind)
	}
	if v.Int < int64(lo) || v.Int > int64(hi) {
		return 0, fail(v, path, "%s is %d; %s", path, v.Int, rangeMsg(path, lo, hi))
	}
	return int(v.Int), nil
}

func ident(v *asn1v.Value, path, allowed string) (string, error) {
	if v.Kind != asn1v.Identifier {
		return "", fail(v, path, "%s must be one of %s, not a %s.", path, allowed, v.Kind)
	}
	return v.Text, nil
}

func scsField(v *asn1v.Value, path string) (int, error) {
	name, err := ident(v, path, scsList())
	if err != nil {
		return 0, err
	}
	k, ok := scsKHz(name)
	if !ok {
		return 0, fail(v, path, "%s %s is not a SubcarrierSpacing; use %s.", path, name, scsList())
	}
	return k, nil
}

func bits(v *asn1v.Value, path string, size int) (string, error) {
	if v.Kind != asn1v.BitString || len(v.Text) != size {
		return "", fail(v, path, "%s must be a BIT STRING of %d bits, such as '%s'B.", path, size, strings.Repeat("1", size))
	}
	return v.Text, nil
}

// carrier is one SCS-SpecificCarrier.
type carrier struct{ offset, size int }

// known lists the types the reader reads.
var known = []string{typeMIB, typeBCCHBCH, typeSIB1, typeSCCSIB, typeSCC, typeFreqDL, typeTDD, typeBWPDL, typeBWPUL}

// inferType names the type of a value standing alone by its fields.
func inferType(v *asn1v.Value) string {
	switch {
	case v.Get("systemFrameNumber") != nil || v.Get("ssb-SubcarrierOffset") != nil:
		return typeMIB
	case v.Get("message") != nil:
		return typeBCCHBCH
	case v.Get("servingCellConfigCommon") != nil:
		return typeSIB1
	case v.Get("ssb-PeriodicityServingCell") != nil:
		return typeSCCSIB
	case v.Get("ssbSubcarrierSpacing") != nil || v.Get("ssb-periodicityServingCell") != nil:
		return typeSCC
	}
	return ""
}

// readFields reads the RRC fields of a document, without notes.
func readFields(doc *asn1v.Document) (grid.Plan, Decoded, error) {
	rd := &reader{}
	p, err := rd.read(doc)
	return p, rd.d, err
}

func (rd *reader) read(doc *asn1v.Document) (grid.Plan, error) {
	var p grid.Plan
	single := map[string]asn1v.Assignment{}
	var bwps []asn1v.Assignment
	for _, a := range doc.Assignments {
		typ := a.Type
		if typ == "" {
			typ = inferType(a.Value)
		}
		switch {
		case typ == typeBWPDL || typ == typeBWPUL:
			a.Type = typ
			bwps = append(bwps, a)
		case slices.Contains(known, typ):
			if typ == typeBCCHBCH {
				typ = typeMIB
			}
			if first, dup := single[typ]; dup {
				return p, fail(a.Value, typ, "A second %s value (%s) follows the one at %s; give one.", typ, a.Name, first.Pos)
			}
			a.Type = typ
			single[typ] = a
		default:
			what := a.Name + " " + a.Type
			if a.Name == "" {
				what = "a value standing alone"
			}
			rd.skip(what, a.Pos)
		}
	}

	// The values hold the carriers, TDD and SS/PBCH fields in several
	// places; each found is read, and copies must agree.
	var carriers map[int]carrier
	var carriersAt *asn1v.Value
	takeCarriers := func(v *asn1v.Value, path string) error {
		if v == nil {
			return nil
		}
		c, err := rd.carrierList(v, path)
		if err != nil {
			return err
		}
		if carriers == nil {
			carriers, carriersAt = c, v
			return nil
		}
		if fmt.Sprint(c) != fmt.Sprint(carriers) {
			return fail(v, path, "%s differs from the scs-SpecificCarrierList at %s; gridloom plans one channel, so every copy must be the same.", path, carriersAt.Pos)
		}
		return nil
	}
	var tdd *asn1v.Value
	var tddPath string
	takeTDD := func(v *asn1v.Value, path string) error {
		if v == nil {
			return nil
		}
		if tdd != nil && !asn1v.Equal(tdd, v) {
			return fail(v, path, "%s differs from %s at %s; give one TDD pattern.", path, tddPath, tdd.Pos)
		}
		tdd, tddPath = v, path
		return nil
	}
	var bandAt *asn1v.Value
	var bandN int
	takeBand := func(v *asn1v.Value, path string, sib bool) error {
		if v == nil {
			return nil
		}
		n, err := rd.bandList(v, path, sib)
		if err != nil {
			return err
		}
		if bandAt != nil && n != bandN {
			return fail(v, path, "%s starts with band n%d, but the frequencyBandList at %s with n%d; gridloom plans one channel in one band, so the first bands must be the same.", path, n, bandAt.Pos, bandN)
		}
		bandAt, bandN = v, n
		return nil
	}
	var ssbSCS, offsetToPointA, kSSB, common, period, pointA, ssbARFCNv *asn1v.Value
	// Initial access: pdcch-ConfigSIB1 of the MIB and PDCCH-ConfigCommon of
	// the initial downlink BWP, dmrs-TypeA-Position of the MIB and of
	// ServingCellConfigCommon; each pair must agree.
	var ia initialFields
	var nTA *asn1v.Value
	var bitmap string
	var bitmapAt *asn1v.Value

	if a, ok := single[typeMIB]; ok {
		v := a.Value
		if a.Type == typeMIB && v.Get("message") != nil {
			m, err := rd.seq(v, typeBCCHBCH, "message")
			if err != nil {
				return p, err
			}
			msg := m["message"]
			if msg == nil || msg.Kind != asn1v.Choice || msg.Name != "mib" {
				return p, fail(v, "BCCH-BCH-Message.message", "BCCH-BCH-Message.message must be the choice mib : { ... }.")
			}
			v = msg.Elems[0]
		}
		m, err := rd.seq(v, typeMIB, "subCarrierSpacingCommon", "ssb-SubcarrierOffset", "dmrs-TypeA-Position", "pdcch-ConfigSIB1")
		if err != nil {
			return p, err
		}
		common, kSSB = m["subCarrierSpacingCommon"], m["ssb-SubcarrierOffset"]
		if err := ia.takeDMRS(m["dmrs-TypeA-Position"], "MIB.dmrs-TypeA-Position"); err != nil {
			return p, err
		}
		if pc := m["pdcch-ConfigSIB1"]; pc != nil {
			pm, err := rd.seq(pc, "PDCCH-ConfigSIB1", "controlResourceSetZero", "searchSpaceZero")
			if err != nil {
				return p, err
			}
			if pm["controlResourceSetZero"] == nil || pm["searchSpaceZero"] == nil {
				return p, fail(pc, "MIB.pdcch-ConfigSIB1", "MIB.pdcch-ConfigSIB1 needs controlResourceSetZero and searchSpaceZero, each 0 to 15.")
			}
			if err := ia.takePDCCH(pm["controlResourceSetZero"], pm["searchSpaceZero"], "MIB.pdcch-ConfigSIB1"); err != nil {
				return p, err
			}
		}
	}

	sibValue := (*asn1v.Value)(nil)
	if a, ok := single[typeSIB1]; ok {
		m, err := rd.seq(a.Value, typeSIB1, "servingCellConfigCommon")
		if err != nil {
			return p, err
		}
		sibValue = m["servingCellConfigCommon"]
		if _, dup := single[typeSCCSIB]; dup && sibValue != nil {
			return p, fail(sibValue, typeSCCSIB, "SIB1 carries a servingCellConfigCommon and a separate ServingCellConfigCommonSIB value follows too; give one.")
		}
	}
	if a, ok := single[typeSCCSIB]; ok {
		sibValue = a.Value
	}
	if sibValue != nil {
		const path = typeSCCSIB
		m, err := rd.seq(sibValue, path, "downlinkConfigCommon", "uplinkConfigCommon", "ssb-PositionsInBurst", "ssb-PeriodicityServingCell", "tdd-UL-DL-ConfigurationCommon")
		if err != nil {
			return p, err
		}
		if dl := m["downlinkConfigCommon"]; dl != nil {
			dm, err := rd.seq(dl, path+".downlinkConfigCommon", "frequencyInfoDL", "initialDownlinkBWP")
			if err != nil {
				return p, err
			}
			if b := dm["initialDownlinkBWP"]; b != nil {
				const bp = "DownlinkConfigCommonSIB.initialDownlinkBWP"
				bm, err := rd.seq(b, bp, "genericParameters", "pdcch-ConfigCommon")
				if err != nil {
					return p, err
				}
				if ia.dl, err = rd.initialBWP(b, bm["genericParameters"], bp); err != nil {
					return p, err
				}
				ia.dlAt = b
				if pc := bm["pdcch-ConfigCommon"]; pc != nil {
					// A SetupRelease: setup : { ... }, or the
					// PDCCH-ConfigCommon alone as some logs print it.
					if pc.Kind == asn1v.Choice && pc.Name == "setup" {
						pc = pc.Elems[0]
					}
					pm, err := rd.seq(pc, "PDCCH-ConfigCommon", "controlResourceSetZero", "searchSpaceZero")
					if err != nil {
						return p, err
					}
					if pm["controlResourceSetZero"] != nil && pm["searchSpaceZero"] != nil {
						if err := ia.takePDCCH(pm["controlResourceSetZero"], pm["searchSpaceZero"], bp+".pdcch-ConfigCommon"); err != nil {
							return p, err
						}
					}
				}
			}
			if f := dm["frequencyInfoDL"]; f != nil {
				fm, err := rd.seq(f, "FrequencyInfoDL-SIB", "frequencyBandList", "offsetToPointA", "scs-SpecificCarrierList")
				if err != nil {
					return p, err
				}
				offsetToPointA = fm["offsetToPointA"]
				if err := takeBand(fm["frequencyBandList"], "FrequencyInfoDL-SIB.frequencyBandList", true); err != nil {
					return p, err
				}
				if err := takeCarriers(fm["scs-SpecificCarrierList"], "FrequencyInfoDL-SIB.scs-SpecificCarrierList"); err != nil {
					return p, err
				}
			}
		}
		if ul := m["uplinkConfigCommon"]; ul != nil {
			um, err := rd.seq(ul, path+".uplinkConfigCommon", "frequencyInfoUL", "initialUplinkBWP")
			if err != nil {
				return p, err
			}
			if b := um["initialUplinkBWP"]; b != nil {
				const bp = "UplinkConfigCommonSIB.initialUplinkBWP"
				bm, err := rd.seq(b, bp, "genericParameters", "rach-ConfigCommon")
				if err != nil {
					return p, err
				}
				if rc := bm["rach-ConfigCommon"]; rc != nil {
					if p.PRACH, err = rd.readRACH(rc, bp+".rach-ConfigCommon"); err != nil {
						return p, err
					}
				}
				// A value with rach-ConfigCommon alone places no initial
				// uplink BWP: its random access sits in the plan's default.
				if bm["genericParameters"] != nil || bm["rach-ConfigCommon"] == nil {
					if ia.ul, err = rd.initialBWP(b, bm["genericParameters"], bp); err != nil {
						return p, err
					}
					ia.ulAt = b
				}
			}
			if f := um["frequencyInfoUL"]; f != nil {
				fm, err := rd.seq(f, "FrequencyInfoUL-SIB", "scs-SpecificCarrierList")
				if err != nil {
					return p, err
				}
				if err := takeCarriers(fm["scs-SpecificCarrierList"], "FrequencyInfoUL-SIB.scs-SpecificCarrierList"); err != nil {
					return p, err
				}
			}
		}
		if b := m["ssb-PositionsInBurst"]; b != nil {
			bm, err := rd.seq(b, path+".ssb-PositionsInBurst", "inOneGroup", "groupPresence")
			if err != nil {
				return p, err
			}
			if bm["inOneGroup"] == nil {
				return p, fail(b, path+".ssb-PositionsInBurst.inOneGroup", "ssb-PositionsInBurst needs inOneGroup, a BIT STRING of 8 bits.")
			}
			in, err := bits(bm["inOneGroup"], "inOneGroup", 8)
			if err != nil {
				return p, err
			}
			bitmap, bitmapAt = in, b
			if g := bm["groupPresence"]; g != nil {
				group, err := bits(g, "groupPresence", 8)
				if err != nil {
					return p, err
				}
				var all strings.Builder
				for _, c := range group {
					if c == '1' {
						all.WriteString(in)
					} else {
						all.WriteString("00000000")
					}
				}
				bitmap = all.String()
			}
		}
		period = m["ssb-PeriodicityServingCell"]
		if err := takeTDD(m["tdd-UL-DL-ConfigurationCommon"], path+".tdd-UL-DL-ConfigurationCommon"); err != nil {
			return p, err
		}
	}

	freqDL := (*asn1v.Value)(nil)
	if a, ok := single[typeSCC]; ok {
		const path = typeSCC
		m, err := rd.seq(a.Value, path, "downlinkConfigCommon", "n-TimingAdvanceOffset", "ssb-PositionsInBurst", "dmrs-TypeA-Position", "ssbSubcarrierSpacing", "ssb-periodicityServingCell", "tdd-UL-DL-ConfigurationCommon")
		if err != nil {
			return p, err
		}
		nTA = m["n-TimingAdvanceOffset"]
		if err := ia.takeDMRS(m["dmrs-TypeA-Position"], path+".dmrs-TypeA-Position"); err != nil {
			return p, err
		}
		if dl := m["downlinkConfigCommon"]; dl != nil {
			dm, err := rd.seq(dl, path+".downlinkConfigCommon", "frequencyInfoDL")
			if err != nil {
				return p, err
			}
			freqDL = dm["frequencyInfoDL"]
		}
		if b := m["ssb-PositionsInBurst"]; b != nil {
			sizes := map[string]int{"shortBitmap": 4, "mediumBitmap": 8, "longBitmap": 64}
			if b.Kind != asn1v.Choice || sizes[b.Name] == 0 {
				return p, fail(b, path+".ssb-PositionsInBurst", "ServingCellConfigCommon.ssb-PositionsInBurst must be the choice shortBitmap, mediumBitmap or longBitmap : 'bits'B.")
			}
			long, err := bits(b.Elems[0], b.Name, sizes[b.Name])
			if err != nil {
				return p, err
			}
			if bitmapAt != nil && strings.TrimRight(bitmap, "0") != strings.TrimRight(long, "0") {
				return p, fail(b, path+".ssb-PositionsInBurst", "ServingCellConfigCommon.ssb-PositionsInBurst says %s, but ServingCellConfigCommonSIB's at %s says %s.", long, bitmapAt.Pos, bitmap)
			}
			bitmap, bitmapAt = long, b
		}
		ssbSCS = m["ssbSubcarrierSpacing"]
		if sp := m["ssb-periodicityServingCell"]; sp != nil {
			if period != nil && (sp.Kind != period.Kind || sp.Text != period.Text) {
				return p, fail(sp, path+".ssb-periodicityServingCell", "ssb-periodicityServingCell differs from ssb-PeriodicityServingCell at %s.", period.Pos)
			}
			period = sp
		}
		if err := takeTDD(m["tdd-UL-DL-ConfigurationCommon"], path+".tdd-UL-DL-ConfigurationCommon"); err != nil {
			return p, err
		}
	}
	if a, ok := single[typeFreqDL]; ok {
		if freqDL != nil {
			return p, fail(a.Value, typeFreqDL, "A FrequencyInfoDL value follows the one in ServingCellConfigCommon at %s; give one.", freqDL.Pos)
		}
		freqDL = a.Value
	}
	if freqDL != nil {
		m, err := rd.seq(freqDL, typeFreqDL, "absoluteFrequencySSB", "frequencyBandList", "absoluteFrequencyPointA", "scs-SpecificCarrierList")
		if err != nil {
			return p, err
		}
		if err := takeBand(m["frequencyBandList"], "FrequencyInfoDL.frequencyBandList", false); err != nil {
			return p, err
		}
		pointA, ssbARFCNv = m["absoluteFrequencyPointA"], m["absoluteFrequencySSB"]
		if err := takeCarriers(m["scs-SpecificCarrierList"], "FrequencyInfoDL.scs-SpecificCarrierList"); err != nil {
			return p, err
		}
	}
	if a, ok := single[typeTDD]; ok {
		if err := takeTDD(a.Value, typeTDD); err != nil {
			return p, err
		}
	}

	// Every value read is checked against its ASN.1 range before the plan
	// is judged as a whole.
	if kSSB != nil {
		if _, err := integer(kSSB, "ssb-SubcarrierOffset", 0, 15); err != nil {
			return p, err
		}
	}
	if offsetToPointA != nil {
		if _, err := integer(offsetToPointA, "offsetToPointA", 0, maxOffset); err != nil {
			return p, err
		}
	}
	if ssbSCS != nil {
		if _, err := scsField(ssbSCS, "ssbSubcarrierSpacing"); err != nil {
			return p, err
		}
	}
	if common != nil {
		if name, err := ident(common, "subCarrierSpacingCommon", "scs15or60, scs30or120"); err != nil {
			return p, err
		} else if name != "scs15or60" && name != "scs30or120" {
			return p, fail(common, "subCarrierSpacingCommon", "subCarrierSpacingCommon %s is not a value; use scs15or60 or scs30or120.", name)
		}
	}
	if period != nil {
		name, err := ident(period, "ssb-PeriodicityServingCell", ssbPeriodList())
		if err != nil {
			return p, err
		}
		if _, ok := ssbPeriodMs(name); !ok {
			return p, fail(period, "ssb-PeriodicityServingCell", "ssb-PeriodicityServingCell %s is not a value; use %s.", name, ssbPeriodList())
		}
	}
	for _, v := range []struct {
		v    *asn1v.Value
		name string
	}{{pointA, "absoluteFrequencyPointA"}, {ssbARFCNv, "absoluteFrequencySSB"}} {
		if v.v != nil {
			if _, err := integer(v.v, v.name, 0, maxARFCN); err != nil {
				return p, err
			}
		}
	}

	// The plan.
	if carriers == nil {
		return p, &Error{Msg: "The text has no scs-SpecificCarrierList (in FrequencyInfoDL-SIB or FrequencyInfoDL), so gridloom cannot place the carrier; give one."}
	}
	if bandAt != nil {
		p.Carrier.Band = fmt.Sprintf("n%d", bandN)
	}
	if nTA != nil {
		name, err := ident(nTA, "n-TimingAdvanceOffset", grid.JoinOr(grid.NTAOffsets))
		if err != nil {
			return p, err
		}
		if !slices.Contains(grid.NTAOffsets, name) {
			return p, fail(nTA, "n-TimingAdvanceOffset", "n-TimingAdvanceOffset %s is not a value; use %s (TS 38.331 ServingCellConfigCommon).", name, grid.JoinOr(grid.NTAOffsets))
		}
		p.Carrier.NTAOffset = name
	}
	p.InitialAccess = rd.initialAccess(&ia)
	p.Carrier.OffsetToCarrier = map[int]int{}
	p.Carrier.CarrierBandwidth = map[int]int{}
	for scs, c := range carriers {
		p.Carrier.OffsetToCarrier[scs] = c.offset
		p.Carrier.CarrierBandwidth[scs] = c.size
	}
	if tdd != nil {
		t, err := rd.tdd(tdd, tddPath)
		if err != nil {
			return p, err
		}
		p.TDD = t
	}
	for _, a := range bwps {
		pp, err := rd.bwp(a, carriers, p.Partitions)
		if err != nil {
			return p, err
		}
		p.Partitions = append(p.Partitions, pp)
	}

	var pointAHz grid.Hz
	if pointA != nil {
		n, err := integer(pointA, "absoluteFrequencyPointA", 0, maxARFCN)
		if err != nil {
			return p, err
		}
		pointAHz, _ = grid.ARFCNFrequency(n)
		rd.pointA, rd.pointAHz = pointA, pointAHz
	}
	if err := rd.channel(&p, carriers, pointA, pointAHz); err != nil {
		return p, err
	}

	// SS/PBCH blocks: placed when the text says where (offsetToPointA)
	// and at which spacing (ssbSubcarrierSpacing).
	if offsetToPointA != nil || ssbSCS != nil {
		if offsetToPointA == nil || ssbSCS == nil {
			missing, have := "offsetToPointA (FrequencyInfoDL-SIB)", ssbSCS
			if ssbSCS == nil {
				missing, have = "ssbSubcarrierSpacing (ServingCellConfigCommon)", offsetToPointA
			}
			return p, fail(have, "ssb", "The SS/PBCH blocks need %s as well; give it, or neither.", missing)
		}
		s := &grid.SSBPlan{}
		var err error
		if s.SCSKHz, err = scsField(ssbSCS, "ssbSubcarrierSpacing"); err != nil {
			return p, err
		}
		if s.OffsetToPointA, err = integer(offsetToPointA, "offsetToPointA", 0, maxOffset); err != nil {
			return p, err
		}
		if kSSB != nil {
			if s.KSSB, err = integer(kSSB, "ssb-SubcarrierOffset", 0, 15); err != nil {
				return p, err
			}
		} else {
			rd.d.Assumed = append(rd.d.Assumed, "The text has no MIB, so k_SSB (ssb-SubcarrierOffset) is taken as 0.")
		}
		rng, _ := grid.ParseRange(p.Carrier.Range)
		// The text's band decides (grid.CommonIsSpacing): in FR2-2 and with
		// shared spectrum in FR1 the common spacing is the block's, and the
		// field gives the QCL relation or nothing.
		spacing := grid.CommonIsSpacing(rng, p.Carrier.Band)
		if common != nil && !spacing {
			name, _ := ident(common, "subCarrierSpacingCommon", "scs15or60, scs30or120")
			rd.d.Assumed = append(rd.d.Assumed, fmt.Sprintf("subCarrierSpacingCommon %s (%s) gives no spacing: %s.", name, common.Pos, grid.CommonNoSpacing(rng, p.Carrier.Band, s.SCSKHz)))
		}
		if common != nil && spacing {
			name, err := ident(common, "subCarrierSpacingCommon", "scs15or60, scs30or120")
			if err != nil {
				return p, err
			}
			// 15 or 30 kHz in FR1, 60 or 120 kHz in FR2-1 (TS 38.331 MIB).
			fr1 := p.Carrier.Range == grid.FR1.String()
			switch {
			case name == "scs15or60" && fr1:
				s.ScsCommonKHz = 15
			case name == "scs30or120" && fr1:
				s.ScsCommonKHz = 30
			case name == "scs15or60":
				s.ScsCommonKHz = 60
			case name == "scs30or120":
				s.ScsCommonKHz = 120
			default:
				return p, fail(common, "subCarrierSpacingCommon", "subCarrierSpacingCommon %s is not a value; use scs15or60 or scs30or120.", name)
			}
		}
		if period != nil {
			name, err := ident(period, "ssb-PeriodicityServingCell", ssbPeriodList())
			if err != nil {
				return p, err
			}
			var known bool
			if s.PeriodMs, known = ssbPeriodMs(name); !known {
				return p, fail(period, "ssb-PeriodicityServingCell", "ssb-PeriodicityServingCell %s is not a value; use %s.", name, ssbPeriodList())
			}
		}
		s.Bitmap = bitmap
		if len(bitmap) == 8 && strings.HasSuffix(bitmap, "0000") {
			// inOneGroup or mediumBitmap for L_max = 4 holds four bits the
			// UE ignores; keep the four the candidates use.
			probe := p.Clone()
			probe.SSB = &grid.SSBPlan{SCSKHz: s.SCSKHz, OffsetToPointA: s.OffsetToPointA, KSSB: s.KSSB, ScsCommonKHz: s.ScsCommonKHz}
			if r := grid.Compute(probe); r.SSB != nil && r.SSB.Candidates == 4 {
				s.Bitmap = bitmap[:4]
			}
		}
		if ssbARFCNv != nil {
			if _, err := integer(ssbARFCNv, "absoluteFrequencySSB", 0, maxARFCN); err != nil {
				return p, err
			}
			rd.ssbARFCN = ssbARFCNv
		}
		if kSSB != nil && rng == grid.FR1 && band.SharedSpectrum(p.Carrier.Band) && s.KSSB%2 == 1 {
			// TS 38.331 MIB: with shared spectrum channel access in FR1
			// ssb-SubcarrierOffset is k̄_SSB and k_SSB = 2⌊k̄_SSB/2⌋ below 24
			// (TS 38.211 7.4.3.1); its least significant bit gives the QCL
			// relation (TS 38.213 4.1).
			rd.d.Assumed = append(rd.d.Assumed, fmt.Sprintf("ssb-SubcarrierOffset %d (%s) is k̄_SSB with shared spectrum channel access, so k_SSB is %d (TS 38.211 7.4.3.1); its least significant bit gives the QCL relation between SS/PBCH blocks (TS 38.213 4.1), which a plan does not hold.", s.KSSB, kSSB.Pos, s.KSSB-1))
			s.KSSB--
		}
		if ssbARFCNv != nil {
			if kSSB != nil && p.Carrier.Range == grid.FR1.String() {
				s.KSSB = fifthBit(p, *s, ssbARFCNv.Int)
			}
		}
		p.SSB = s
	}
	sort.Strings(rd.d.Skipped)
	return p, nil
}

// bandList reads a frequencyBandList — MultiFrequencyBandListNR-SIB
// (SEQUENCE OF NR-MultiBandInfo) when sib, else MultiFrequencyBandListNR
// (SEQUENCE OF FreqBandIndicatorNR), TS 38.331 — and returns its first
// band: a plan names one band, and the UE takes the first it supports.
func (rd *reader) bandList(v *asn1v.Value, path string, sib bool) (int, error) {
	form := "{ 78 }"
	if sib {
		form = "{ { freqBandIndicatorNR 78 } }"
	}
	if v.Kind != asn1v.SequenceOf || len(v.Elems) == 0 || len(v.Elems) > maxBands {
		return 0, fail(v, path, "%s must be a SEQUENCE OF 1 to %d bands (maxNrofMultiBands, TS 38.331), such as %s.", path, maxBands, form)
	}
	first := 0
	for i, e := range v.Elems {
		iv := e
		if sib {
			m, err := rd.seq(e, "NR-MultiBandInfo", "freqBandIndicatorNR")
			if err != nil {
				return 0, err
			}
			if iv = m["freqBandIndicatorNR"]; iv == nil {
				if i == 0 {
					return 0, fail(e, path, "The first NR-MultiBandInfo of %s has no freqBandIndicatorNR; gridloom reads the band from it, so give one, such as %s.", path, form)
				}
				continue
			}
		}
		n, err := integer(iv, "freqBandIndicatorNR", 1, maxBand)
		if err != nil {
			return 0, err
		}
		if i == 0 {
			first = n
		}
	}
	if len(v.Elems) > 1 {
		rd.d.Assumed = append(rd.d.Assumed, fmt.Sprintf("%s lists %d bands; the plan takes the first, n%d.", path, len(v.Elems), first))
	}
	return first, nil
}

// fifthBit returns k_SSB with its fifth bit restored. In FR1 k_SSB runs to
// 23 (subCarrierSpacingCommon 30 kHz), but ssb-SubcarrierOffset holds its
// 4 least significant bits and the fifth rides in the PBCH payload
// (TS 38.212 7.1.1), which value notation does not show.
// absoluteFrequencySSB fixes it: k_SSB + 16 is kept when it, and not k_SSB,
// puts SS_REF at that NR-ARFCN.
func fifthBit(p grid.Plan, s grid.SSBPlan, want int64) int {
	at := func(k int) bool {
		probe := p.Clone()
		t := s
		t.KSSB = k
		probe.SSB = &t
		n, ok := ssbARFCN(grid.Compute(probe))
		return ok && int64(n) == want
	}
	if !at(s.KSSB) && at(s.KSSB+16) {
		return s.KSSB + 16
	}
	return s.KSSB
}

func (rd *reader) carrierList(v *asn1v.Value, path string) (map[int]carrier, error) {
	if v.Kind == asn1v.Sequence && len(v.Fields) == 0 {
		return nil, fail(v, path, "%s must list at least one SCS-SpecificCarrier.", path)
	}
	if v.Kind != asn1v.SequenceOf {
		return nil, fail(v, path, "%s must be a SEQUENCE OF value { { offsetToCarrier n, subcarrierSpacing kHzN, carrierBandwidth n }, ... }.", path)
	}
	if len(v.Elems) > 5 {
		return nil, fail(v, path, "%s has %d entries; it holds 1 to 5 (maxSCSs, TS 38.331).", path, len(v.Elems))
	}
	out := map[int]carrier{}
	for _, e := range v.Elems {
		m, err := rd.seq(e, "SCS-SpecificCarrier", "offsetToCarrier", "subcarrierSpacing", "carrierBandwidth")
		if err != nil {
			return nil, err
		}
		for _, name := range []string{"offsetToCarrier", "subcarrierSpacing", "carrierBandwidth"} {
			if m[name] == nil {
				return nil, fail(e, "SCS-SpecificCarrier."+name, "SCS-SpecificCarrier needs %s.", name)
			}
		}
		scs, err := scsField(m["subcarrierSpacing"], "SCS-SpecificCarrier.subcarrierSpacing")
		if err != nil {
			return nil, err
		}
		off, err := integer(m["offsetToCarrier"], "offsetToCarrier", 0, maxOffset)
		if err != nil {
			return nil, err
		}
		size, err := integer(m["carrierBandwidth"], "carrierBandwidth", 1, maxCarrierBW)
		if err != nil {
			return nil, err
		}
		if _, dup := out[scs]; dup {
			return nil, fail(e, path, "%s lists %s twice.", path, scsName(scs))
		}
		out[scs] = carrier{off, size}
	}
	return out, nil
}

func (rd *reader) tdd(v *asn1v.Value, path string) (*grid.TDDPlan, error) {
	m, err := rd.seq(v, path, "referenceSubcarrierSpacing", "pattern1", "pattern2")
	if err != nil {
		return nil, err
	}
	if m["referenceSubcarrierSpacing"] == nil || m["pattern1"] == nil {
		return nil, fail(v, path, "%s needs referenceSubcarrierSpacing and pattern1.", path)
	}
	t := &grid.TDDPlan{}
	if t.ReferenceSCSKHz, err = scsField(m["referenceSubcarrierSpacing"], "referenceSubcarrierSpacing"); err != nil {
		return nil, err
	}
	if t.Pattern1, err = rd.pattern(m["pattern1"], "pattern1"); err != nil {
		return nil, err
	}
	if m["pattern2"] != nil {
		p2, err := rd.pattern(m["pattern2"], "pattern2")
		if err != nil {
			return nil, err
		}
		t.Pattern2 = &p2
	}
	return t, nil
}

func (rd *reader) pattern(v *asn1v.Value, path string) (grid.TDDPattern, error) {
	var out grid.TDDPattern
	m, err := rd.seq(v, path, "dl-UL-TransmissionPeriodicity", "nrofDownlinkSlots", "nrofDownlinkSymbols", "nrofUplinkSlots", "nrofUplinkSymbols", "dl-UL-TransmissionPeriodicity-v1530")
	if err != nil {
		return out, err
	}
	// The -v1530 extension, when present, replaces the base field.
	name, v1530 := "dl-UL-TransmissionPeriodicity", false
	if m[name+"-v1530"] != nil {
		name, v1530 = name+"-v1530", true
	}
	pv := m[name]
	if pv == nil {
		return out, fail(v, path+".dl-UL-TransmissionPeriodicity", "%s needs dl-UL-TransmissionPeriodicity.", path)
	}
	s, err := ident(pv, name, tddPeriodList(v1530))
	if err != nil {
		return out, err
	}
	ms, ok := tddPeriodMs(s, v1530)
	if !ok {
		return out, fail(pv, path+"."+name, "%s %s is not a value; use %s.", name, s, tddPeriodList(v1530))
	}
	out.PeriodMs = ms
	for _, f := range []struct {
		name string
		max  int
		dst  *int
	}{{"nrofDownlinkSlots", maxSlots, &out.DownlinkSlots}, {"nrofDownlinkSymbols", maxSymbol, &out.DownlinkSymbols}, {"nrofUplinkSlots", maxSlots, &out.UplinkSlots}, {"nrofUplinkSymbols", maxSymbol, &out.UplinkSymbols}} {
		fv := m[f.name]
		if fv == nil {
			return out, fail(v, path+"."+f.name, "%s needs %s.", path, f.name)
		}
		if *f.dst, err = integer(fv, path+"."+f.name, 0, f.max); err != nil {
			return out, err
		}
	}
	return out, nil
}

func (rd *reader) bwp(a asn1v.Assignment, carriers map[int]carrier, before []grid.PartitionPlan) (grid.PartitionPlan, error) {
	dir, common := "DL", "BWP-DownlinkCommon"
	if a.Type == typeBWPUL {
		dir, common = "UL", "BWP-UplinkCommon"
	}
	m, err := rd.seq(a.Value, a.Type, "bwp-Id", "bwp-Common")
	if err != nil {
		return grid.PartitionPlan{}, err
	}
	if m["bwp-Id"] == nil || m["bwp-Common"] == nil {
		return grid.PartitionPlan{}, fail(a.Value, a.Type, "%s %s needs bwp-Id and bwp-Common with its genericParameters.", a.Type, a.Name)
	}
	id, err := integer(m["bwp-Id"], a.Type+".bwp-Id", 0, maxBWPID)
	if err != nil {
		return grid.PartitionPlan{}, err
	}
	key := fmt.Sprintf("%s %d", dir, id)
	if first, dup := rd.bwpIDs[key]; dup {
		return grid.PartitionPlan{}, fail(m["bwp-Id"], a.Type+".bwp-Id", "bwp-Id %d of %s is also the bwp-Id of %s; each %s bandwidth part needs its own.", id, a.Name, first, dir)
	}
	if rd.bwpIDs == nil {
		rd.bwpIDs = map[string]string{}
	}
	rd.bwpIDs[key] = a.Name
	name := a.Name
	if name == "" {
		name = fmt.Sprintf("%s bwp-Id %d", dir, id)
	}
	for _, b := range before {
		if b.Name == name {
			return grid.PartitionPlan{}, fail(a.Value, a.Type, "The value name %s is used twice.", name)
		}
	}
	cm, err := rd.seq(m["bwp-Common"], common, "genericParameters")
	if err != nil {
		return grid.PartitionPlan{}, err
	}
	g := cm["genericParameters"]
	if g == nil {
		return grid.PartitionPlan{}, fail(m["bwp-Common"], common+".genericParameters", "%s of %s needs genericParameters.", common, name)
	}
	gm, err := rd.seq(g, "BWP", "locationAndBandwidth", "subcarrierSpacing", "cyclicPrefix")
	if err != nil {
		return grid.PartitionPlan{}, err
	}
	if gm["locationAndBandwidth"] == nil || gm["subcarrierSpacing"] == nil {
		return grid.PartitionPlan{}, fail(g, "BWP", "The genericParameters of %s need locationAndBandwidth and subcarrierSpacing.", name)
	}
	pp := grid.PartitionPlan{Name: name, Direction: dir}
	if pp.SCSKHz, err = scsField(gm["subcarrierSpacing"], "BWP.subcarrierSpacing"); err != nil {
		return pp, err
	}
	riv, err := integer(gm["locationAndBandwidth"], "locationAndBandwidth", 0, maxRIV)
	if err != nil {
		return pp, err
	}
	if cp := gm["cyclicPrefix"]; cp != nil {
		s, err := ident(cp, "cyclicPrefix", "extended")
		if err != nil {
			return pp, err
		}
		if s != "extended" {
			return pp, fail(cp, "BWP.cyclicPrefix", "cyclicPrefix %s is not a value; the only value is extended (leave it out for the normal cyclic prefix).", s)
		}
		pp.CP = "extended"
	}
	c, ok := carriers[pp.SCSKHz]
	if !ok {
		return pp, fail(g, "BWP.subcarrierSpacing", "%s uses %s, but scs-SpecificCarrierList has no carrier of that spacing.", name, scsName(pp.SCSKHz))
	}
	start, size, ok := grid.DecodeRIV(riv)
	if !ok {
		return pp, fail(gm["locationAndBandwidth"], "locationAndBandwidth", "locationAndBandwidth %d is not a RIV with N = 275 (TS 38.214 5.1.2.2.2).", riv)
	}
	crb := c.offset + start
	pp.StartCRB, pp.SizePRB = &crb, size
	return pp, nil
}

// channel fills the range, the channel bandwidth and, from
// absoluteFrequencyPointA, the centre: none has an RRC field of its own.
func (rd *reader) channel(p *grid.Plan, carriers map[int]carrier, pointA *asn1v.Value, pointAHz grid.Hz) error {
	scs := make([]int, 0, len(carriers))
	for k := range carriers {
		scs = append(scs, k)
	}
	slices.Sort(scs)
	for _, rng := range []grid.Range{grid.FR1, grid.FR2_1, grid.FR2_2} {
		if pointA != nil {
			if lo, hi := rng.Limits(); pointAHz < lo || pointAHz >= hi {
				continue
			}
		}
		for _, bw := range rng.AllBandwidths() {
			fits := true
			for _, k := range scs {
				if n, ok := rng.NRB(k, bw); !ok || n != carriers[k].size {
					fits = false
					break
				}
			}
			if fits {
				p.Carrier.Range, p.Carrier.BandwidthMHz = rng.String(), bw
				break
			}
		}
		if p.Carrier.BandwidthMHz != 0 {
			break
		}
	}
	if pointA == nil || p.Carrier.BandwidthMHz == 0 {
		return nil // Decode asks for the bandwidth after the notes
	}
	return centre(p, pointA, pointAHz)
}

// centre sets carrier.centerMHz from absoluteFrequencyPointA.
func centre(p *grid.Plan, pointA *asn1v.Value, pointAHz grid.Hz) error {
	probe := p.Clone()
	r := grid.Compute(probe)
	if r.Channel.BandwidthMHz == 0 || len(r.Carriers) == 0 {
		return fail(pointA, "absoluteFrequencyPointA", "The carriers of scs-SpecificCarrierList do not place a channel, so absoluteFrequencyPointA cannot fix its centre.")
	}
	mhz := float64(pointAHz+r.Channel.Center) / 1e6
	p.Carrier.CenterMHz = &mhz
	return nil
}

// rachWritten is the part of a PRACH plan that gridloom writes in
// rach-ConfigCommon: all but ssbPerRachOccasion.
func rachWritten(r *grid.PRACHPlan) *grid.PRACHPlan {
	if r == nil {
		return nil
	}
	c := *r
	c.SSBPerRachOccasion = ""
	return &c
}
