package rrc

import (
	"fmt"
	"strings"

	"gridloom/grid"
	"gridloom/grid/asn1v"
	"gridloom/grid/band"
	"gridloom/grid/coreset0"
)

// Assignment names and types of the values Encode writes, in document
// order. A reader finds the values by type; the names are gridloom's.
const (
	typeMIB     = "MIB"
	typeBCCHBCH = "BCCH-BCH-Message"
	typeSIB1    = "SIB1"
	typeSCCSIB  = "ServingCellConfigCommonSIB"
	typeSCC     = "ServingCellConfigCommon"
	typeFreqDL  = "FrequencyInfoDL"
	typeTDD     = "TDD-UL-DL-ConfigCommon"
	typeBWPDL   = "BWP-Downlink"
	typeBWPUL   = "BWP-Uplink"
)

// Encode writes the plan as TS 38.331 value notation: the MIB fields the
// plan sets, ServingCellConfigCommonSIB, the FrequencyInfoDL and
// ssbSubcarrierSpacing of ServingCellConfigCommon, and one BWP-Downlink or
// BWP-Uplink per partition. It refuses a plan with error findings: an
// export is for a checked plan.
func Encode(p grid.Plan) ([]byte, error) {
	doc, err := Document(p)
	if err != nil {
		return nil, err
	}
	return asn1v.Format(doc), nil
}

// Document builds what Encode writes, as a value tree.
func Document(p grid.Plan) (*asn1v.Document, error) {
	res := grid.Compute(p)
	for _, f := range res.Findings {
		if f.Severity == grid.Error {
			return nil, fmt.Errorf("The plan has errors, so it is not exported; the first: %s", f.Message)
		}
	}
	doc, err := build(p, res)
	if err != nil {
		return nil, err
	}
	// Whatever 38.331 cannot say, or says differently from the plan as
	// written, travels in notes: read the fields back and note each
	// difference.
	q, _, err := readFields(doc)
	if err != nil {
		return nil, fmt.Errorf("gridloom could not read back its own value notation: %w", err)
	}
	addNotes(doc, p, q)
	return doc, nil
}

var header = []string{
	"A gridloom plan as TS 38.331 (Release 17, V17.1.0 ASN.1) value notation.",
	"Fields the plan does not determine are left out; each value lists the mandatory ones it leaves out.",
	"Lines \"gridloom key: value\" carry what 38.331 has no field for (values in JSON),",
	"so that the plan reads back exactly; a note overrides the field it names.",
}

// build writes the RRC fields of a computed plan without error findings.
// given is the plan as written, before Compute filled in defaults: a field
// whose absence means the default (n-TimingAdvanceOffset, Need S in TS
// 38.331) is written only when the plan gives it.
func build(given grid.Plan, r grid.Result) (*asn1v.Document, error) {
	doc := &asn1v.Document{}
	for _, h := range header {
		doc.Comments = append(doc.Comments, asn1v.Comment{Text: h})
	}
	add := func(name, typ string, v *asn1v.Value) {
		doc.Assignments = append(doc.Assignments, asn1v.Assignment{Name: name, Type: typ, Value: v})
	}
	p := r.Plan
	carriers := carrierList(r)

	var ssbBits string
	if r.SSB != nil && p.SSB != nil {
		ssbBits = p.SSB.Bitmap
		if ssbBits == "" {
			ssbBits = strings.Repeat("1", r.SSB.Candidates)
		}
		add("mib", typeMIB, mibValue(r))
	}

	// ServingCellConfigCommonSIB (TS 38.331 6.3.2), as in SIB1.
	freqDL := asn1v.Seq(
		asn1v.F("frequencyBandList", sibBandList(r)),
		asn1v.F("offsetToPointA", ssbOffset(r)),
		asn1v.F("scs-SpecificCarrierList", carriers),
	)
	noteBand(freqDL, r)
	if r.SSB == nil {
		// TS 38.331 FrequencyInfoDL-SIB: offsetToPointA is mandatory; it
		// counts from point A to the SS/PBCH block's common RB.
		freqDL.Note("offsetToPointA is left out: the plan places no SS/PBCH block, whose common RB it counts to")
	}
	initDL, initUL, whyDL, whyUL := initialBWPs(r, rachValue(given.PRACH, r))
	dl := asn1v.Seq(asn1v.F("frequencyInfoDL", freqDL), asn1v.F("initialDownlinkBWP", initDL)).
		Note("not set by the plan: bcch-Config, pcch-Config")
	if whyDL != "" {
		dl.Note(whyDL)
	}
	var ul *asn1v.Value
	hasUL := initUL != nil
	for _, l := range r.Partitions {
		hasUL = hasUL || l.Direction == grid.UL
	}
	if hasUL {
		leftUL := "not set by the plan: frequencyBandList"
		if _, ok := bandNumber(r); ok {
			leftUL = "frequencyBandList is left out: gridloom writes carrier.band in the downlink's lists only"
		}
		ul = asn1v.Seq(
			asn1v.F("frequencyInfoUL", asn1v.Seq(asn1v.F("scs-SpecificCarrierList", carrierList(r))).Note(leftUL)),
			asn1v.F("initialUplinkBWP", initUL),
		).Note("not set by the plan: timeAlignmentTimerCommon")
		if whyUL != "" {
			ul.Note(whyUL)
		}
	}
	var burst, period *asn1v.Value
	if ssbBits != "" {
		in, group, ok := sibBitmap(ssbBits)
		if ok {
			burst = asn1v.Seq(asn1v.F("inOneGroup", asn1v.Bits(in)), asn1v.F("groupPresence", group))
		}
		period = asn1v.Ident(ssbPeriodName(r.SSB.PeriodMs))
	}
	sib := asn1v.Seq(
		asn1v.F("downlinkConfigCommon", dl),
		asn1v.F("uplinkConfigCommon", ul),
		asn1v.F("ssb-PositionsInBurst", burst),
		asn1v.F("ssb-PeriodicityServingCell", period),
		asn1v.F("tdd-UL-DL-ConfigurationCommon", tddValue(p.TDD)),
	).Note("not set by the plan: ss-PBCH-BlockPower")
	if ssbBits != "" && burst == nil {
		sib.Note("ssb-PositionsInBurst is left out: inOneGroup and groupPresence cannot say this bitmap, whose groups of 8 differ; ServingCellConfigCommon's longBitmap carries it")
	}
	if ssbBits == "" {
		sib.Note("no SS/PBCH blocks in the plan: ssb-PositionsInBurst and ssb-PeriodicityServingCell are left out")
	}
	add("sib1-ServingCellConfigCommon", typeSCCSIB, sib)

	// ServingCellConfigCommon (TS 38.331 6.3.2): the absolute frequencies.
	freq := asn1v.Seq(
		asn1v.F("absoluteFrequencySSB", ssbARFCNValue(r)),
		asn1v.F("frequencyBandList", bandList(r)),
		asn1v.F("absoluteFrequencyPointA", pointAValue(r)),
		asn1v.F("scs-SpecificCarrierList", carrierList(r)),
	)
	noteBand(freq, r)
	if !r.Channel.Absolute {
		freq.Note("absoluteFrequencyPointA is left out: the plan gives no carrier.centerMHz or carrier.arfcn")
	} else if !r.Channel.PointAOnRaster {
		freq.Note(fmt.Sprintf("absoluteFrequencyPointA is left out: point A at %s Hz is not on the NR-ARFCN raster", fmtHz(r.Channel.PointAHz)))
	}
	if r.SSB != nil && r.Channel.Absolute && ssbARFCNValue(r) == nil {
		freq.Note("absoluteFrequencySSB is left out: the SS/PBCH block's reference frequency is not on the NR-ARFCN raster")
	}
	var ssbSCS, longBurst *asn1v.Value
	if r.SSB != nil {
		ssbSCS = asn1v.Ident(scsName(r.SSB.Numerology.SCSKHz()))
		longBurst = sccBitmap(ssbBits)
	}
	var nTA, dmrsA *asn1v.Value
	if given.Carrier.NTAOffset != "" {
		nTA = asn1v.Ident(p.Carrier.NTAOffset) // as Compute spelt it
	}
	left := "not set by the plan: physCellId, dmrs-TypeA-Position, ss-PBCH-BlockPower"
	if ia := r.InitialAccess; ia != nil {
		dmrsA = asn1v.Ident(ia.MIB.DMRSTypeAPosition)
		left = "not set by the plan: physCellId, ss-PBCH-BlockPower"
	}
	scc := asn1v.Seq(
		asn1v.F("downlinkConfigCommon", asn1v.Seq(asn1v.F("frequencyInfoDL", freq)).Note("initialDownlinkBWP is left out: ServingCellConfigCommonSIB above carries the initial BWPs")),
		asn1v.F("n-TimingAdvanceOffset", nTA),
		asn1v.F("ssb-PositionsInBurst", longBurst),
		asn1v.F("dmrs-TypeA-Position", dmrsA),
		asn1v.F("ssbSubcarrierSpacing", ssbSCS),
	).Note("only frequencyInfoDL and the SS/PBCH fields are written, with n-TimingAdvanceOffset and dmrs-TypeA-Position when the plan sets them; ServingCellConfigCommonSIB above has the rest", left)
	add("servingCellConfigCommon", typeSCC, scc)

	dlID, ulID := 0, 0
	for _, l := range r.Partitions {
		id, typ, name := &dlID, typeBWPDL, "bwp-Downlink-"
		left := "not set by the plan: pdcch-ConfigCommon, pdsch-ConfigCommon, bwp-Dedicated"
		if l.Direction == grid.UL {
			id, typ, name = &ulID, typeBWPUL, "bwp-Uplink-"
			left = "not set by the plan: rach-ConfigCommon, pusch-ConfigCommon, pucch-ConfigCommon, bwp-Dedicated"
		}
		*id++
		if *id > maxBWPID {
			return nil, fmt.Errorf("The plan has more than %d %s partitions; a serving cell configures at most %d bandwidth parts per direction (TS 38.331 maxNrofBWPs), so bwp-Id cannot number them.", maxBWPID, l.Direction, maxBWPID)
		}
		if l.LocationAndBandwidth < 0 {
			return nil, fmt.Errorf("Partition %q cannot be written: its start is beyond what locationAndBandwidth can say from offsetToCarrier (TS 38.214 5.1.2.2.2).", l.Name)
		}
		var cp *asn1v.Value
		if l.Numerology.CP == grid.ExtendedCP {
			cp = asn1v.Ident("extended")
		}
		generic := asn1v.Seq(
			asn1v.F("locationAndBandwidth", asn1v.Int(l.LocationAndBandwidth)),
			asn1v.F("subcarrierSpacing", asn1v.Ident(scsName(l.Numerology.SCSKHz()))),
			asn1v.F("cyclicPrefix", cp),
		)
		bwp := asn1v.Seq(
			asn1v.F("bwp-Id", asn1v.Int(*id)),
			asn1v.F("bwp-Common", asn1v.Seq(asn1v.F("genericParameters", generic))),
		).Note(left)
		add(fmt.Sprintf("%s%d", name, *id), typ, bwp)
	}
	return doc, nil
}

func carrierList(r grid.Result) *asn1v.Value {
	list := asn1v.SeqOf()
	for _, c := range r.Carriers {
		list.Elems = append(list.Elems, asn1v.Seq(
			asn1v.F("offsetToCarrier", asn1v.Int(c.OffsetToCarrier)),
			asn1v.F("subcarrierSpacing", asn1v.Ident(scsName(c.SCSKHz))),
			asn1v.F("carrierBandwidth", asn1v.Int(c.CarrierBandwidth)),
		))
	}
	return list
}

// ssbOffset is offsetToPointA as Compute resolved it: a plan that places
// its block by ssb.gscn leaves the field 0 and Compute derives it.
func ssbOffset(r grid.Result) *asn1v.Value {
	if r.SSB == nil {
		return nil
	}
	return asn1v.Int(r.SSB.OffsetToPointA)
}

// bandNumber is freqBandIndicatorNR: the number of the band the plan
// names. A band Compute only inferred is not written: the channel may lie
// in several, and the plan has not chosen.
func bandNumber(r grid.Result) (int, bool) {
	if r.Plan.Carrier.Band == "" {
		return 0, false
	}
	b, ok := band.Lookup(r.Plan.Carrier.Band)
	return b.Number, ok
}

// sibBandList is FrequencyInfoDL-SIB's frequencyBandList, a
// MultiFrequencyBandListNR-SIB: SEQUENCE OF NR-MultiBandInfo (TS 38.331).
func sibBandList(r grid.Result) *asn1v.Value {
	n, ok := bandNumber(r)
	if !ok {
		return nil
	}
	return asn1v.SeqOf(asn1v.Seq(asn1v.F("freqBandIndicatorNR", asn1v.Int(n))))
}

// bandList is FrequencyInfoDL's frequencyBandList, a
// MultiFrequencyBandListNR: SEQUENCE OF FreqBandIndicatorNR (TS 38.331).
func bandList(r grid.Result) *asn1v.Value {
	n, ok := bandNumber(r)
	if !ok {
		return nil
	}
	return asn1v.SeqOf(asn1v.Int(n))
}

// noteBand says why a mandatory frequencyBandList is left out.
func noteBand(v *asn1v.Value, r grid.Result) {
	if _, ok := bandNumber(r); ok {
		return
	}
	why := "frequencyBandList is left out: the plan names no carrier.band"
	if c := r.Channel.BandCandidates; len(c) > 0 {
		why += fmt.Sprintf(" (the channel lies in %s)", grid.JoinOr(c))
	}
	v.Note(why)
}

// commonLeftOut says why subCarrierSpacingCommon is not written where it
// gives no spacing (grid.CommonIsSpacing).
func commonLeftOut(r grid.Result) string {
	return "subCarrierSpacingCommon is left out: " + grid.CommonNoSpacing(r.Channel.Range, r.Channel.Band, r.SSB.Numerology.SCSKHz())
}

// mibValue writes the MIB fields a plan sets: ssb-SubcarrierOffset and,
// where it gives a spacing (grid.CommonIsSpacing), subCarrierSpacingCommon,
// with the values Compute resolved (a block placed by ssb.gscn, the
// default common spacing).
func mibValue(r grid.Result) *asn1v.Value {
	s := r.SSB
	var common *asn1v.Value
	v := asn1v.Seq()
	if !r.CommonIsSpacing() {
		v.Note(mibLeft(r), commonLeftOut(r))
	} else {
		if m, _, err := MIBForPlan(r); err == nil {
			common = asn1v.Ident(m.SubCarrierSpacingCommon.String())
		}
		v.Note(mibLeft(r))
	}
	if r.Channel.Range == grid.FR1 && band.SharedSpectrum(r.Plan.Carrier.Band) && s.KSSB < 24 {
		// TS 38.331 MIB, ssb-SubcarrierOffset: with shared spectrum in FR1
		// the field is k̄_SSB, k_SSB is obtained from it (TS 38.211 7.4.3.1:
		// k_SSB = 2⌊k̄_SSB/2⌋ below 24), and its least significant bit also
		// gives the QCL relation (TS 38.213 4.1).
		msg := "ssb-SubcarrierOffset is k̄_SSB with shared spectrum channel access: k_SSB = 2⌊k̄_SSB/2⌋ (TS 38.211 7.4.3.1), and its least significant bit gives the QCL relation between SS/PBCH blocks, which the plan does not hold; it is written as k_SSB's"
		if s.KSSB%2 == 1 {
			msg = fmt.Sprintf("k_SSB %d is odd, which ssb-SubcarrierOffset cannot say with shared spectrum channel access: k_SSB = 2⌊k̄_SSB/2⌋ below 24 (TS 38.211 7.4.3.1)", s.KSSB)
		}
		v.Note(msg)
	}
	if r.Channel.Range == grid.FR1 && s.KSSB >= 16 {
		msg := fmt.Sprintf("k_SSB is %d: ssb-SubcarrierOffset carries its 4 least significant bits and PBCH payload bit a(A+5) its most significant (TS 38.212 7.1.1)", s.KSSB)
		if _, ok := ssbARFCN(r); ok {
			msg += "; absoluteFrequencySSB below fixes it too"
		}
		v.Note(msg)
	}
	if common != nil {
		v.Fields = append(v.Fields, asn1v.F("subCarrierSpacingCommon", common))
	}
	v.Fields = append(v.Fields, asn1v.F("ssb-SubcarrierOffset", asn1v.Int(s.KSSB&15)))
	if ia := r.InitialAccess; ia != nil {
		cs0, ss0 := coreset0.SplitPDCCHConfigSIB1(uint8(ia.MIB.PDCCHConfigSIB1))
		v.Fields = append(v.Fields,
			asn1v.F("dmrs-TypeA-Position", asn1v.Ident(ia.MIB.DMRSTypeAPosition)),
			asn1v.F("pdcch-ConfigSIB1", asn1v.Seq(
				asn1v.F("controlResourceSetZero", asn1v.Int(cs0)),
				asn1v.F("searchSpaceZero", asn1v.Int(ss0)),
			)))
	}
	return v
}

// mibLeft lists the MIB fields the plan does not set: pdcch-ConfigSIB1 and
// dmrs-TypeA-Position come from initialAccess when the plan has it.
func mibLeft(r grid.Result) string {
	if r.InitialAccess != nil {
		return "not set by the plan: systemFrameNumber, cellBarred, intraFreqReselection, spare"
	}
	return "not set by the plan: systemFrameNumber, dmrs-TypeA-Position, pdcch-ConfigSIB1, cellBarred, intraFreqReselection, spare"
}

// initialBWPs writes SIB1's initialDownlinkBWP (BWP-DownlinkCommon) and
// initialUplinkBWP (BWP-UplinkCommon) as Compute placed them: the
// genericParameters of each and, for the downlink, the two fields of
// PDCCH-ConfigCommon the plan determines, controlResourceSetZero and
// searchSpaceZero (TS 38.331 PDCCH-ConfigCommon: present in the initial
// BWP, Cond InitialBWP-Only). A BWP that no RIV from its spacing's
// offsetToCarrier says is left out, and why says so.
func initialBWPs(r grid.Result, rach *asn1v.Value) (dl, ul *asn1v.Value, whyDL, whyUL string) {
	// rach-ConfigCommon lives in the initial uplink BWP (TS 38.331
	// BWP-UplinkCommon); without one the plan places, the value holds only
	// rach-ConfigCommon and says that genericParameters is left out.
	rachOnly := func() *asn1v.Value {
		if rach == nil {
			return nil
		}
		why := "genericParameters is left out: the plan has no initialAccess.initialUplinkBWP; its prach sits in " + r.PRACH.BWPSource
		return asn1v.Seq(asn1v.F("rach-ConfigCommon", rach)).
			Note(why, "not set by the plan: pusch-ConfigCommon, pucch-ConfigCommon")
	}
	ia := r.InitialAccess
	if ia == nil {
		ul = rachOnly()
		if ul == nil {
			// initialUplinkBWP is mandatory in UplinkConfigCommonSIB (TS
			// 38.331).
			whyUL = "not set by the plan: initialUplinkBWP (the plan has no initialAccess)"
		}
		return nil, ul, "not set by the plan: initialDownlinkBWP (the plan has no initialAccess)", whyUL
	}
	generic := func(b grid.InitialBWP) *asn1v.Value {
		var cp *asn1v.Value
		if b.CP == grid.ExtendedCP.String() {
			cp = asn1v.Ident("extended")
		}
		return asn1v.Seq(
			asn1v.F("locationAndBandwidth", asn1v.Int(b.LocationAndBandwidth)),
			asn1v.F("subcarrierSpacing", asn1v.Ident(scsName(b.SCSKHz))),
			asn1v.F("cyclicPrefix", cp),
		)
	}
	if ia.InitialDL.LocationAndBandwidth < 0 {
		whyDL = "initialDownlinkBWP is left out: no locationAndBandwidth from its spacing's offsetToCarrier says it"
	} else {
		cs0, ss0 := coreset0.SplitPDCCHConfigSIB1(uint8(ia.MIB.PDCCHConfigSIB1))
		dl = asn1v.Seq(
			asn1v.F("genericParameters", generic(ia.InitialDL)),
			// pdcch-ConfigCommon is a SetupRelease { PDCCH-ConfigCommon }.
			asn1v.F("pdcch-ConfigCommon", asn1v.Choose("setup", asn1v.Seq(
				asn1v.F("controlResourceSetZero", asn1v.Int(cs0)),
				asn1v.F("searchSpaceZero", asn1v.Int(ss0)),
			).Note("not set by the plan: commonControlResourceSet, commonSearchSpaceList, searchSpaceSIB1, searchSpaceOtherSystemInformation, pagingSearchSpace, ra-SearchSpace"))),
		).Note("not set by the plan: pdsch-ConfigCommon")
	}
	switch {
	case ia.InitialUL == nil:
		if ul = rachOnly(); ul == nil {
			whyUL = "not set by the plan: initialUplinkBWP (the plan gives none and Compute places none)"
		}
	case ia.InitialUL.LocationAndBandwidth < 0:
		whyUL = "initialUplinkBWP is left out: no locationAndBandwidth from its spacing's offsetToCarrier says it"
	default:
		left := "not set by the plan: rach-ConfigCommon, pusch-ConfigCommon, pucch-ConfigCommon"
		if rach != nil {
			left = "not set by the plan: pusch-ConfigCommon, pucch-ConfigCommon"
		}
		ul = asn1v.Seq(asn1v.F("genericParameters", generic(*ia.InitialUL)), asn1v.F("rach-ConfigCommon", rach)).Note(left)
	}
	return dl, ul, whyDL, whyUL
}

// sibBitmap splits an SS/PBCH bitmap into ServingCellConfigCommonSIB's
// inOneGroup and groupPresence (TS 38.331): for L_max = 4 the four bits
// and four zeros the UE ignores; for 8 the bitmap; for 64 one pattern of 8
// shared by the groups present, which only some bitmaps have.
func sibBitmap(bits string) (in string, group *asn1v.Value, ok bool) {
	switch len(bits) {
	case 4:
		return bits + "0000", nil, true
	case 8:
		return bits, nil, true
	case 64:
		var pattern string
		g := make([]byte, 8)
		for i := range 8 {
			chunk := bits[8*i : 8*i+8]
			g[i] = '0'
			if chunk == "00000000" {
				continue
			}
			if pattern != "" && chunk != pattern {
				return "", nil, false
			}
			pattern, g[i] = chunk, '1'
		}
		if pattern == "" {
			pattern = "00000000"
		}
		return pattern, asn1v.Bits(string(g)), true
	}
	return "", nil, false
}

// sccBitmap is ServingCellConfigCommon's ssb-PositionsInBurst CHOICE.
func sccBitmap(bits string) *asn1v.Value {
	switch len(bits) {
	case 4:
		return asn1v.Choose("shortBitmap", asn1v.Bits(bits))
	case 8:
		return asn1v.Choose("mediumBitmap", asn1v.Bits(bits))
	case 64:
		return asn1v.Choose("longBitmap", asn1v.Bits(bits))
	}
	return nil
}

func tddValue(t *grid.TDDPlan) *asn1v.Value {
	if t == nil {
		return nil
	}
	v := asn1v.Seq(
		asn1v.F("referenceSubcarrierSpacing", asn1v.Ident(scsName(t.ReferenceSCSKHz))),
		asn1v.F("pattern1", patternValue(t.Pattern1)),
	)
	if t.Pattern2 != nil {
		v.Fields = append(v.Fields, asn1v.F("pattern2", patternValue(*t.Pattern2)))
	}
	return v
}

func patternValue(p grid.TDDPattern) *asn1v.Value {
	name, v1530, _ := tddPeriodName(p.PeriodMs)
	fields := []asn1v.Field{}
	if !v1530 {
		fields = append(fields, asn1v.F("dl-UL-TransmissionPeriodicity", asn1v.Ident(name)))
	}
	fields = append(fields,
		asn1v.F("nrofDownlinkSlots", asn1v.Int(p.DownlinkSlots)),
		asn1v.F("nrofDownlinkSymbols", asn1v.Int(p.DownlinkSymbols)),
		asn1v.F("nrofUplinkSlots", asn1v.Int(p.UplinkSlots)),
		asn1v.F("nrofUplinkSymbols", asn1v.Int(p.UplinkSymbols)),
	)
	v := asn1v.Seq(fields...)
	if v1530 {
		v.Fields = append(v.Fields, asn1v.F("dl-UL-TransmissionPeriodicity-v1530", asn1v.Ident(name)))
		v.Note("dl-UL-TransmissionPeriodicity is left out: the UE ignores it when the -v1530 extension is present (TS 38.331 TDD-UL-DL-Pattern), and the plan does not choose it")
	}
	return v
}

// ssbARFCN is absoluteFrequencySSB: the NR-ARFCN of SS_REF, subcarrier 0
// of resource block 10 of the SS/PBCH block (TS 38.331 FrequencyInfoDL,
// TS 38.211 7.4.3.1), as Compute found it.
func ssbARFCN(r grid.Result) (int, bool) {
	if r.SSB == nil || !r.SSB.Absolute || !r.SSB.OnARFCNRaster {
		return 0, false
	}
	return r.SSB.AbsoluteFrequencySSB, true
}

func ssbARFCNValue(r grid.Result) *asn1v.Value {
	if n, ok := ssbARFCN(r); ok {
		return asn1v.Int(n)
	}
	return nil
}

func pointAValue(r grid.Result) *asn1v.Value {
	if r.Channel.Absolute && r.Channel.PointAOnRaster {
		return asn1v.Int(r.Channel.PointAARFCN)
	}
	return nil
}

func fmtHz(f grid.Hz) string { return fmt.Sprintf("%d", int64(f)) }
