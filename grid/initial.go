package grid

import (
	"cmp"
	"fmt"
	"slices"
	"sort"
	"strings"

	"gridloom/grid/band"
	"gridloom/grid/coreset0"
)

// InitialAccessPlan is what the MIB and SIB1 tell a UE that finds the cell's
// SS/PBCH block: pdcch-ConfigSIB1 (controlResourceSetZero and
// searchSpaceZero, TS 38.213 13), dmrs-TypeA-Position, and the initial
// bandwidth parts. The block's position and subCarrierSpacingCommon come
// from the plan's ssb block.
type InitialAccessPlan struct {
	// ControlResourceSetZero is the row of the CORESET#0 table (TS 38.213
	// Tables 13-1 to 13-10), 0 to 15: the four most significant bits of
	// pdcch-ConfigSIB1.
	ControlResourceSetZero int `json:"controlResourceSetZero" yaml:"controlResourceSetZero"`
	// SearchSpaceZero is the row of the Type0-PDCCH monitoring table
	// (Tables 13-11 to 13-15), 0 to 15: the four least significant bits.
	SearchSpaceZero int `json:"searchSpaceZero" yaml:"searchSpaceZero"`
	// DMRSTypeAPosition is "pos2" or "pos3" (TS 38.331 MIB); "" means pos2.
	DMRSTypeAPosition string `json:"dmrsTypeAPosition,omitempty" yaml:"dmrsTypeAPosition,omitempty"`
	// InitialDownlinkBWP is SIB1's initial downlink BWP; nil means CORESET#0's
	// extent, which a UE uses until SIB1 says otherwise (TS 38.213 12).
	InitialDownlinkBWP *InitialBWPPlan `json:"initialDownlinkBWP,omitempty" yaml:"initialDownlinkBWP,omitempty"`
	// InitialUplinkBWP is SIB1's initial uplink BWP; nil means the initial
	// downlink BWP's PRBs under a TDD pattern (unpaired spectrum, where the
	// two must share a centre, TS 38.213 12) and none without one.
	InitialUplinkBWP *InitialBWPPlan `json:"initialUplinkBWP,omitempty" yaml:"initialUplinkBWP,omitempty"`
}

// InitialBWPPlan is an initial BWP (TS 38.331 BWP): a partition of the plan
// named by Partition, or a place given by StartCRB and SizePRB or by
// LocationAndBandwidth (counted from the spacing's offsetToCarrier, N = 275,
// as for partitions).
type InitialBWPPlan struct {
	// Partition names a partition of the plan that is this BWP; the
	// fields below must then be left out.
	Partition            string `json:"partition,omitempty" yaml:"partition,omitempty"`
	StartCRB             *int   `json:"startCrb,omitempty" yaml:"startCrb,omitempty"`
	SizePRB              int    `json:"sizePrb,omitempty" yaml:"sizePrb,omitempty"`
	LocationAndBandwidth *int   `json:"locationAndBandwidth,omitempty" yaml:"locationAndBandwidth,omitempty"`
	// SubcarrierSpacingKHz is the BWP's subcarrierSpacing in kHz (the key
	// keeps TS 38.331's name); 0 means subCarrierSpacingCommon, which the
	// initial downlink BWP must have.
	SubcarrierSpacingKHz int `json:"subcarrierSpacing,omitempty" yaml:"subcarrierSpacing,omitempty"`
	// CyclicPrefix is "normal" or "extended"; "" means normal.
	CyclicPrefix string `json:"cyclicPrefix,omitempty" yaml:"cyclicPrefix,omitempty"`
}

func (ia *InitialAccessPlan) clone() *InitialAccessPlan {
	if ia == nil {
		return nil
	}
	q := *ia
	for _, b := range []**InitialBWPPlan{&q.InitialDownlinkBWP, &q.InitialUplinkBWP} {
		if *b != nil {
			c := **b
			c.StartCRB = clonePtr(c.StartCRB)
			c.LocationAndBandwidth = clonePtr(c.LocationAndBandwidth)
			*b = &c
		}
	}
	return &q
}

// InitialAccess is the checked initial access of a plan: CORESET#0 on the
// CRB grid, the Type0-PDCCH monitoring occasions, the MIB fields the plan
// implies and the initial BWPs.
type InitialAccess struct {
	CORESET0 CORESET0
	// SearchSpaceZero is the Type0-PDCCH row the occasions come from.
	SearchSpaceZero int
	// OccasionTable names the table of TS 38.213 the occasions were read
	// from ("13-11" … "13-15").
	OccasionTable string
	// WindowMs is how far the occasions are listed: one SS/PBCH period, and
	// at least 20 ms, since pattern 1 repeats every two frames.
	WindowMs int
	// Occasions are the Type0-PDCCH monitoring occasions of every SS/PBCH
	// block sent, one per slot, in time order from the start of frame 0.
	Occasions []Type0Occasion
	MIB       MIBFields
	// InitialDL is the initial downlink BWP; InitialUL the initial uplink
	// BWP, nil when the plan has none.
	InitialDL InitialBWP
	InitialUL *InitialBWP
}

// CORESET0 is CORESET#0 placed: the table row read, and its CRBs
// [StartCRB, StartCRB+NRB) of subCarrierSpacingCommon.
type CORESET0 struct {
	Table    string // "13-4"
	Index    int    // controlResourceSetZero
	Pattern  int    // SS/PBCH and CORESET multiplexing pattern, 1 to 3
	NRB      int    // N_RB^CORESET
	Symbols  int    // N_symb^CORESET
	OffsetRB int    // the table's offset, resolved for k_SSB
	SCSKHz   int    // subCarrierSpacingCommon
	StartCRB int
	// ReferenceCRB is the common RB that overlaps the SS/PBCH block's first
	// RB, from which the offset counts.
	ReferenceCRB int
	Low, High    Hz // outer subcarrier edges relative to point A
}

// Type0Occasion is one slot in which a UE monitors the Type0-PDCCH CSS set
// for one SS/PBCH block: CORESET#0's symbols [FirstSymbol,
// FirstSymbol+Symbols) of slot Slot, counted in CORESET#0's numerology from
// the start of frame 0, occupying [Start, End).
type Type0Occasion struct {
	SSBIndex    int
	Slot        int
	FirstSymbol int
	Symbols     int
	Start, End  Tc
}

// MIBFields are the MIB fields the plan implies, by their TS 38.331 names.
type MIBFields struct {
	// SubCarrierSpacingCommon is "scs15or60" or "scs30or120" where the
	// field gives a spacing (CommonIsSpacing), and "" where it does not;
	// CommonNote then says what SIB1 uses instead and what the bit carries
	// (CommonNoSpacing).
	SubCarrierSpacingCommon string
	CommonNote              string
	// SSBSubcarrierOffset is ssb-SubcarrierOffset, k_SSB's four least
	// significant bits; KSSBMsb is k_SSB's fifth bit, which FR1 carries in
	// the PBCH payload bit ā_{A+5} (TS 38.212 7.1.1); always 0 in FR2.
	SSBSubcarrierOffset int
	KSSBMsb             int
	DMRSTypeAPosition   string // "pos2" or "pos3"
	PDCCHConfigSIB1     int    // 8 bits: controlResourceSetZero·16 + searchSpaceZero
}

// CommonIsSpacing reports whether the MIB's subCarrierSpacingCommon gives
// the spacing of SIB1, Msg.2/4 and paging on a carrier of range rng in the
// operating band bandName: in FR1 and FR2-1, but not in FR2-2 nor on an FR1
// band operated with shared spectrum channel access (band.SharedSpectrum:
// n46, n96, n102). TS 38.331 Release 17, MIB field description
// (testdata/reference/rrc/ts38331-mib-fields.txt): "For operation with
// shared spectrum channel access in FR1 (see 37.213) and for operation in
// FR2-2, the subcarrier spacing for SIB1, Msg.2/4 and MsgB for initial
// access, paging and broadcast SI-messages is same as that for the
// corresponding SSB. For operation with shared spectrum channel access,
// this field instead is used for deriving the QCL relation between SS/PBCH
// blocks as specified in TS 38.213 [13], clause 4.1". This is the one rule
// the report, the views and grid/rrc follow.
func CommonIsSpacing(rng Range, bandName string) bool {
	return rng != FR2_2 && !(rng == FR1 && band.SharedSpectrum(bandName))
}

// CommonIsSpacing reports whether the MIB's subCarrierSpacingCommon gives a
// spacing on r's channel: its range and the band it is checked against
// (Channel.Band, whose shared spectrum also picks CORESET#0's Tables 13-1A
// and 13-4A).
func (r Result) CommonIsSpacing() bool {
	return CommonIsSpacing(r.Channel.Range, r.Channel.Band)
}

// CommonNoSpacing says, where subCarrierSpacingCommon gives no spacing
// (CommonIsSpacing), what SIB1, Msg.2/4 and paging use instead (the
// ssbKHz of the SS/PBCH block) and what the bit carries, as a clause for
// a sentence; "" where it gives a spacing. FR2-2 is operated with shared
// spectrum channel access too, so the bit gives the QCL relation there as
// well.
func CommonNoSpacing(rng Range, bandName string, ssbKHz int) string {
	if CommonIsSpacing(rng, bandName) {
		return ""
	}
	where := "in FR2-2"
	qcl := "with shared spectrum channel access it gives the QCL relation between SS/PBCH blocks instead"
	if rng == FR1 {
		where = "with shared spectrum channel access (band " + bandName + ")"
		qcl = "the field, with the least significant bit of ssb-SubcarrierOffset, gives the QCL relation between SS/PBCH blocks instead"
	}
	return fmt.Sprintf("%s, SIB1, Msg.2/4 and paging use the SS/PBCH block's spacing, %d kHz, and %s (TS 38.331 MIB, TS 38.213 4.1), which the plan does not hold", where, ssbKHz, qcl)
}

// InitialBWP is an initial BWP placed: PRBs [StartCRB, StartCRB+SizePRB)
// of its spacing.
type InitialBWP struct {
	// Source says where it came from: "coreset0" (the default extent),
	// "plan" (given by place), "partition" (a partition of the plan) or
	// "initialDownlinkBWP" (the uplink default under TDD).
	Source    string
	Partition string // the partition's name when Source is "partition"
	SCSKHz    int
	CP        string
	StartCRB  int
	SizePRB   int
	// LocationAndBandwidth is the RIV from the spacing's offsetToCarrier, or
	// −1 when there is no carrier of the spacing or no RIV expresses it.
	LocationAndBandwidth int
	Low, High            Hz
}

// coresetFR is the frequency range as package coreset0 names it.
func coresetFR(rng Range) coreset0.FR {
	if rng == FR1 {
		return coreset0.FR1
	}
	return coreset0.FR2
}

// coresetBand is what the CORESET#0 table choice needs of the operating
// band (TS 38.213 13): its minimum channel bandwidth, the smallest of TS
// 38.101-1 Table 5.3.5-1 for the band; whether it uses the 40 MHz tables
// whatever that minimum (n79 and n104, by the band note the coreset0 package
// names); and whether it is operated with shared spectrum channel access
// (n46, n96 and n102, TS 38.101-1 Table 5.2-1, from memory). Without a band,
// or a band whose bandwidths are not carried, gridloom assumes a 5 or
// 10 MHz minimum (Tables 13-1 to 13-4), as most FR1 bands have, and assumed
// says so.
func coresetBand(rng Range, ch Channel) (b coreset0.Band, assumed string) {
	b = coreset0.Band{FR: coresetFR(rng), MinChannelBandwidthMHz: 10}
	if rng != FR1 {
		return b, ""
	}
	bd, ok := band.Lookup(ch.Band)
	if !ok {
		return b, "Without an operating band"
	}
	minBW := 0
	for _, list := range bd.Bandwidths {
		for _, mhz := range list {
			if minBW == 0 || mhz < minBW {
				minBW = mhz
			}
		}
	}
	b.Uses40MHzTables = bd.Name == "n79" || bd.Name == "n104"
	b.SharedSpectrum = band.SharedSpectrum(bd.Name)
	if minBW == 0 {
		return b, "Band " + bd.Name + "'s channel bandwidths are not carried, so"
	}
	b.MinChannelBandwidthMHz = minBW
	return b, ""
}

// candidateFirsts returns the first symbols, in a half frame, of the L_max
// candidate SS/PBCH blocks of a case (TS 38.213 4.1), in index order.
func candidateFirsts(caseName string, lmax int) []int {
	i := slices.IndexFunc(ssbCases, func(c ssbCase) bool { return c.name == caseName })
	if i < 0 {
		return nil
	}
	c := ssbCases[i]
	var first []int
	for _, n := range ssbN(c, 1e12, false) { // the longest list of n; L_max cuts it
		for _, b := range c.base {
			first = append(first, b+c.step*n)
		}
	}
	slices.Sort(first)
	return first[:min(lmax, len(first))]
}

// sentIndexes lists the SS/PBCH block indexes the bitmap sends.
func sentIndexes(bitmap string, lmax int) []int {
	var out []int
	for k := range lmax {
		if bitmap == "" || (k < len(bitmap) && bitmap[k] == '1') {
			out = append(out, k)
		}
	}
	return out
}

const iaField = "initialAccess"

// checkInitialAccess resolves the plan's initialAccess block against the
// computed result (channel, carriers, partitions, SS/PBCH blocks, TDD) and
// reports the initial-access findings. It returns nil when CORESET#0 cannot
// be placed.
func checkInitialAccess(fs *findings, rng Range, ia *InitialAccessPlan, sp *SSBPlan, res *Result, tdd *TDD) *InitialAccess {
	bad := func(field, format string, args ...any) {
		fs.add(Error, CodeInitialAccess, "", field, format, args...)
	}
	ok := true
	for _, v := range []struct {
		name string
		n    int
	}{{"controlResourceSetZero", ia.ControlResourceSetZero}, {"searchSpaceZero", ia.SearchSpaceZero}} {
		if v.n < 0 || v.n > 15 {
			bad(iaField+"."+v.name, "%s.%s is %d; it is four bits of pdcch-ConfigSIB1, 0 to 15 (TS 38.331 MIB).", iaField, v.name, v.n)
			ok = false
		}
	}
	dmrs, dmrsOK := parseFold(ia.DMRSTypeAPosition, []string{"pos2", "pos3"}, parseDMRS)
	if ia.DMRSTypeAPosition == "" {
		dmrs, dmrsOK = coreset0.Pos2, true
	}
	if !dmrsOK {
		bad(iaField+".dmrsTypeAPosition", "%s.dmrsTypeAPosition %q is not a value of dmrs-TypeA-Position; use pos2 or pos3 (TS 38.331 MIB).", iaField, ia.DMRSTypeAPosition)
		ok = false
	} else {
		ia.DMRSTypeAPosition = dmrs.String()
	}
	if sp == nil {
		bad(iaField, "initialAccess needs the ssb block: CORESET#0 and its monitoring occasions are placed from the SS/PBCH block (TS 38.213 13); add ssb.")
		return nil
	}
	if res.SSB == nil || !ok {
		return nil // the ssb findings say why
	}
	if rng == FR2_2 {
		fs.add(Info, CodeInitialAccess, "", iaField, "CORESET#0 in FR2-2 follows TS 38.213 Tables 13-10A, 13-12A and 13-15A, which gridloom does not carry yet; initialAccess is not checked.")
		return nil
	}
	fr := coresetFR(rng)
	ssbKHz := res.SSB.Numerology.SCSKHz()
	common := res.SSB.ScsCommonKHz
	cb, assumed := coresetBand(rng, res.Channel)
	table, err := coreset0.SelectTable(ssbKHz, common, cb)
	if err != nil {
		bad("ssb.scsCommonKHz", "%s", err)
		return nil
	}
	if assumed != "" {
		fs.add(Info, CodeInitialAccess, "", "carrier.band", "%s, CORESET#0 is read from TS 38.213 %s, the table for bands whose minimum channel bandwidth is 5 or 10 MHz; bands n79 and n104 use Tables 13-5 and 13-6, and shared spectrum Tables 13-1A and 13-4A.", assumed, table)
	}
	kSSB := res.SSB.KSSB
	pos := coreset0.SSBPosition{FR: fr, CommonSCSkHz: common, OffsetToPointA: res.SSB.OffsetToPointA, KSSB: kSSB}
	cfg, err := coreset0.Lookup(table, ia.ControlResourceSetZero, kSSB)
	if err != nil {
		bad(iaField+".controlResourceSetZero", "%s", err)
		return nil
	}
	pl, err := coreset0.Place(table, ia.ControlResourceSetZero, pos)
	if err != nil {
		bad(iaField+".controlResourceSetZero", "%s Choose another initialAccess.controlResourceSetZero or move ssb.offsetToPointA.", err)
		return nil
	}
	name := strings.TrimPrefix(table.String(), "Table ")
	out := &InitialAccess{
		CORESET0: CORESET0{Table: name, Index: ia.ControlResourceSetZero, Pattern: cfg.Pattern, NRB: cfg.NumRBs,
			Symbols: cfg.NumSymbols, OffsetRB: cfg.OffsetRBs, SCSKHz: common, StartCRB: pl.FirstCRB,
			ReferenceCRB: pl.ReferenceCRB, Low: Hz(pl.LowHz), High: Hz(pl.HighHz)},
		SearchSpaceZero: ia.SearchSpaceZero,
	}
	cs := out.CORESET0
	carrier, haveCarrier := res.Carrier(common)
	switch {
	case !haveCarrier:
		bad("ssb.scsCommonKHz", "subCarrierSpacingCommon is %d kHz, but no partition uses %d kHz, so the plan has no %d kHz carrier for CORESET#0 and the initial BWP (TS 38.331 scs-SpecificCarrierList); add a partition at %d kHz or set ssb.scsCommonKHz to a spacing in use.", common, common, common, common)
		if cs.Low < res.Channel.Low || cs.High > res.Channel.High {
			bad(iaField+".controlResourceSetZero", "CORESET#0 (%s index %d: CRBs %d to %d of %d kHz, %s to %s) reaches beyond the channel (%s to %s); choose another initialAccess.controlResourceSetZero or move the SS/PBCH block.",
				table, cs.Index, cs.StartCRB, cs.StartCRB+cs.NRB-1, common, fmtKHz(cs.Low), fmtKHz(cs.High), fmtKHz(res.Channel.Low), fmtKHz(res.Channel.High))
		}
	case cs.StartCRB < carrier.OffsetToCarrier || cs.StartCRB+cs.NRB > carrier.OffsetToCarrier+carrier.CarrierBandwidth:
		bad(iaField+".controlResourceSetZero", "CORESET#0 (%s index %d) covers CRBs %d to %d of %d kHz, beyond the %d kHz carrier (CRBs %d to %d); choose another initialAccess.controlResourceSetZero or move the SS/PBCH block.",
			table, cs.Index, cs.StartCRB, cs.StartCRB+cs.NRB-1, common, common, carrier.OffsetToCarrier, carrier.OffsetToCarrier+carrier.CarrierBandwidth-1)
	}

	occasions(fs, out, table, cfg, fr, sp, res.SSB, ia.SearchSpaceZero)
	if tdd != nil {
		checkOccasionDirections(fs, out, *tdd)
	}
	if cfg.Pattern == 1 {
		checkOccasionsOnBlocks(fs, out, res.SSB, sp)
	}

	// The MIB: every value below was range-checked above.
	low4, msb, _ := coreset0.SubcarrierOffsetBits(fr, kSSB)
	pdcch, _ := coreset0.PDCCHConfigSIB1(ia.ControlResourceSetZero, ia.SearchSpaceZero)
	out.MIB = MIBFields{SSBSubcarrierOffset: int(low4), DMRSTypeAPosition: dmrs.String(), PDCCHConfigSIB1: int(pdcch)}
	if res.CommonIsSpacing() {
		scc, _ := coreset0.SubCarrierSpacingCommonFor(fr, common)
		out.MIB.SubCarrierSpacingCommon = scc.String()
	} else {
		out.MIB.CommonNote = CommonNoSpacing(rng, res.Channel.Band, ssbKHz)
	}
	if msb {
		out.MIB.KSSBMsb = 1
	}

	// The initial BWPs.
	dl := InitialBWP{Source: "coreset0", SCSKHz: common, CP: DefaultCP, StartCRB: cs.StartCRB, SizePRB: cs.NRB,
		LocationAndBandwidth: -1, Low: cs.Low, High: cs.High}
	if b := ia.InitialDownlinkBWP; b != nil {
		if got, placed := resolveBWP(fs, iaField+".initialDownlinkBWP", b, common, true, res); placed {
			dl = got
		}
	}
	dl.LocationAndBandwidth = bwpRIV(dl, res)
	if dl.Source != "coreset0" { // the default is CORESET#0, checked above
		checkBWPInCarrier(fs, iaField+".initialDownlinkBWP", "initial downlink BWP", dl, res)
	}
	if dl.Source != "coreset0" && (cs.Low < dl.Low || cs.High > dl.High) {
		bad(iaField+".initialDownlinkBWP", "The initial downlink BWP (%s to %s) does not hold CORESET#0 (%s to %s); the network sets it to contain the whole CORESET#0 in frequency (TS 38.331 initialDownlinkBWP).",
			fmtKHz(dl.Low), fmtKHz(dl.High), fmtKHz(cs.Low), fmtKHz(cs.High))
	}
	out.InitialDL = dl
	switch b := ia.InitialUplinkBWP; {
	case b != nil:
		if ul, placed := resolveBWP(fs, iaField+".initialUplinkBWP", b, common, false, res); placed {
			ul.LocationAndBandwidth = bwpRIV(ul, res)
			checkBWPInCarrier(fs, iaField+".initialUplinkBWP", "initial uplink BWP", ul, res)
			if tdd != nil && ul.Low+ul.High != dl.Low+dl.High {
				bad(iaField+".initialUplinkBWP", "On unpaired spectrum the initial uplink BWP (centre %s) must share the initial downlink BWP's centre (%s): both are BWP 0 (TS 38.213 12).",
					fmtKHz((ul.Low+ul.High)/2), fmtKHz((dl.Low+dl.High)/2))
			}
			out.InitialUL = &ul
		}
	case tdd != nil:
		ul := dl
		ul.Source = "initialDownlinkBWP"
		out.InitialUL = &ul
	}
	return out
}

func parseDMRS(s string) (coreset0.DMRSTypeAPosition, bool) {
	switch s {
	case "pos2":
		return coreset0.Pos2, true
	case "pos3":
		return coreset0.Pos3, true
	}
	return 0, false
}

// occasions lists the Type0-PDCCH monitoring occasions over the window.
func occasions(fs *findings, out *InitialAccess, table coreset0.Table, cfg coreset0.Config, fr coreset0.FR, sp *SSBPlan, s *SSB, ss0 int) {
	period := s.PeriodMs
	window := max(period, 20)
	out.WindowMs = window
	mu, _ := MuForSCS(out.CORESET0.SCSKHz)
	num := Numerology{Mu: mu}
	perFrame := coreset0.SlotsPerFrame(mu)
	total := perFrame * window / 10
	add := func(i, slot, first int) {
		slot = ((slot % total) + total) % total // n0+1 past the window's end is slot 0 of a window alike
		k := slot*14 + first
		out.Occasions = append(out.Occasions, Type0Occasion{SSBIndex: i, Slot: slot, FirstSymbol: first, Symbols: cfg.NumSymbols,
			Start: num.SymbolAt(k).Start, End: num.SymbolAt(k + cfg.NumSymbols - 1).End()})
	}
	sent := sentIndexes(sp.Bitmap, s.Candidates)
	out.Occasions = make([]Type0Occasion, 0, 2*len(sent)*window/period)
	field := iaField + ".searchSpaceZero"
	if cfg.Pattern == 1 {
		out.OccasionTable = "13-11"
		if fr == coreset0.FR2 {
			out.OccasionTable = "13-12"
		}
		for _, i := range sent {
			o, err := coreset0.Pattern1Occasion(fr, ss0, mu, cfg.NumSymbols, i)
			if err != nil {
				fs.add(Error, CodeInitialAccess, "", field, "%s", err)
				out.Occasions = nil
				return
			}
			for frame := o.FrameParity; frame < window/10; frame += 2 {
				add(i, frame*perFrame+o.Slot, o.FirstSymbol)
				add(i, frame*perFrame+o.Slot+1, o.FirstSymbol)
			}
		}
	} else {
		_, name, _ := coreset0.Pattern23Table(table)
		out.OccasionTable = strings.TrimPrefix(name, "Table ")
		for start := 0; start < window; start += period {
			frame, half := start/10, (start%10)/5
			for _, i := range sent {
				o, err := coreset0.Pattern23Occasion(table, out.CORESET0.Index, s.KSSB, ss0, half, i)
				if err != nil {
					fs.add(Error, CodeInitialAccess, "", field, "%s", err)
					out.Occasions = nil
					return
				}
				add(i, frame*perFrame+o.Slot, o.FirstSymbol)
			}
		}
	}
	slices.SortFunc(out.Occasions, func(a, b Type0Occasion) int {
		return cmp.Or(cmp.Compare(a.Start, b.Start), cmp.Compare(a.SSBIndex, b.SSBIndex))
	})
}

// checkOccasionDirections reports occasions on uplink or flexible symbols of
// the TDD pattern: a UE monitors Type0-PDCCH on downlink symbols only.
func checkOccasionDirections(fs *findings, out *InitialAccess, t TDD) {
	ref := t.Reference
	perSF := ref.SymbolsPerSubframe()
	period := len(t.RefDirs)
	var onU, onF int
	var firstU, firstF *Type0Occasion
	for k := range out.Occasions {
		o := &out.Occasions[k]
		// The reference symbol holding o.Start: symbols of a subframe differ
		// in length by at most 16·κ, so the even share of the subframe
		// lands on it or next to it.
		sf := o.Start / TcPerSubframe
		j := int(sf)*perSF + int((o.Start-sf*TcPerSubframe)*Tc(perSF)/TcPerSubframe)
		for j > 0 && ref.SymbolAt(j).Start > o.Start {
			j--
		}
		for ref.SymbolAt(j).End() <= o.Start {
			j++
		}
		hasU, hasF := false, false
		for ; ref.SymbolAt(j).Start < o.End; j++ {
			switch t.RefDirs[j%period] {
			case Uplink:
				hasU = true
			case Flexible:
				hasF = true
			}
		}
		switch {
		case hasU:
			if onU++; firstU == nil {
				firstU = o
			}
		case hasF:
			if onF++; firstF == nil {
				firstF = o
			}
		}
	}
	for _, c := range []struct {
		n     int
		o     *Type0Occasion
		which string
	}{{onU, firstU, "uplink"}, {onF, firstF, "flexible"}} {
		if c.n > 0 {
			fs.add(Error, CodeInitialAccess, "", iaField+".searchSpaceZero", "%d of %d Type0-PDCCH occasions fall on %s symbols of the TDD pattern, the first for SS/PBCH block %d in slot %d, symbols %d to %d at %d kHz; CORESET#0 needs downlink symbols: choose another initialAccess.searchSpaceZero or change the pattern.",
				c.n, len(out.Occasions), c.which, c.o.SSBIndex, c.o.Slot, c.o.FirstSymbol, c.o.FirstSymbol+c.o.Symbols-1, out.CORESET0.SCSKHz)
		}
	}
}

// checkOccasionsOnBlocks warns when a pattern 1 occasion shares symbols and
// spectrum with an SS/PBCH block: with multiplexing pattern 1 the two are
// meant to take turns in time.
func checkOccasionsOnBlocks(fs *findings, out *InitialAccess, s *SSB, sp *SSBPlan) {
	cs := out.CORESET0
	if min(cs.High, s.High) <= max(cs.Low, s.Low) {
		return
	}
	type span struct {
		index      int
		start, end Tc
	}
	first := candidateFirsts(s.Case, s.Candidates)
	sent := sentIndexes(sp.Bitmap, s.Candidates)
	var blocks []span
	perSF := s.Numerology.SymbolsPerSubframe()
	for start := 0; start < out.WindowMs; start += s.PeriodMs {
		for _, i := range sent {
			if i >= len(first) {
				continue
			}
			k := start*perSF + first[i]
			blocks = append(blocks, span{i, s.Numerology.SymbolAt(k).Start, s.Numerology.SymbolAt(k + 3).End()})
		}
	}
	sort.Slice(blocks, func(a, b int) bool { return blocks[a].start < blocks[b].start })
	count := 0
	var o0 Type0Occasion
	var b0 span
	for _, o := range out.Occasions {
		j := sort.Search(len(blocks), func(j int) bool { return blocks[j].end > o.Start })
		if j < len(blocks) && blocks[j].start < o.End {
			if count == 0 {
				o0, b0 = o, blocks[j]
			}
			count++
		}
	}
	if count > 0 {
		fs.add(Warning, CodeInitialAccess, "", iaField+".searchSpaceZero", "%d Type0-PDCCH occasions fall on the symbols of an SS/PBCH block they overlap in frequency, the first for block %d in slot %d (symbols %d to %d) on block %d; multiplexing pattern 1 puts CORESET#0 in other symbols than the blocks: choose an initialAccess.searchSpaceZero whose offset O or first symbol moves it.",
			count, o0.SSBIndex, o0.Slot, o0.FirstSymbol, o0.FirstSymbol+o0.Symbols-1, b0.index)
	}
}

// resolveBWP places an initial BWP the plan gives. common is
// subCarrierSpacingCommon, the spacing when the plan gives none; downlink
// says the BWP must have it (TS 38.331 BWP subcarrierSpacing).
func resolveBWP(fs *findings, f string, b *InitialBWPPlan, common int, downlink bool, res *Result) (InitialBWP, bool) {
	scsMust := 0
	if downlink {
		scsMust = common
	}
	bad := func(field, format string, args ...any) {
		fs.add(Error, CodeInitialAccess, "", field, format, args...)
	}
	if b.Partition != "" {
		if b.StartCRB != nil || b.SizePRB != 0 || b.LocationAndBandwidth != nil || b.SubcarrierSpacingKHz != 0 || b.CyclicPrefix != "" {
			bad(f+".partition", "%s names partition %q and gives a place or numerology too; give partition alone, or leave it out.", f, b.Partition)
		}
		i := slices.IndexFunc(res.Partitions, func(l Lattice) bool { return l.Name == b.Partition })
		if i < 0 {
			bad(f+".partition", "%s.partition %q is not a placed partition of the plan; use one of %s.", f, b.Partition, partitionNames(res.Partitions))
			return InitialBWP{}, false
		}
		l := res.Partitions[i]
		if scsMust != 0 && l.Numerology.SCSKHz() != scsMust {
			bad(f+".partition", "Partition %q is meant as the initial downlink BWP but uses %d kHz; the initial downlink BWP has subCarrierSpacingCommon, %d kHz (TS 38.331 BWP subcarrierSpacing).", l.Name, l.Numerology.SCSKHz(), scsMust)
		}
		return InitialBWP{Source: "partition", Partition: l.Name, SCSKHz: l.Numerology.SCSKHz(), CP: l.Numerology.CP.String(),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, Low: l.Low, High: l.High}, true
	}
	scs := b.SubcarrierSpacingKHz
	if scs == 0 {
		scs = common
	}
	if scsMust != 0 && scs != scsMust {
		bad(f+".subcarrierSpacing", "%s.subcarrierSpacing is %d kHz, but the initial downlink BWP has subCarrierSpacingCommon, %d kHz (TS 38.331 BWP subcarrierSpacing); leave it out or set it to %d.", f, scs, scsMust, scsMust)
	}
	mu, muOK := MuForSCS(scs)
	if !muOK || !slices.Contains(res.Channel.Range.DataSCS(), scs) {
		bad(f+".subcarrierSpacing", "%s.subcarrierSpacing %d kHz is not a data subcarrier spacing of %s; use %s kHz.", f, scs, res.Channel.Range, JoinInts(res.Channel.Range.DataSCS()))
		return InitialBWP{}, false
	}
	cp, cpOK := parseFold(b.CyclicPrefix, []string{"normal", "extended"}, ParseCP)
	switch {
	case b.CyclicPrefix == "":
		cp = NormalCP
	case !cpOK:
		bad(f+".cyclicPrefix", "%s.cyclicPrefix %q is not a cyclic prefix; use normal or extended.", f, b.CyclicPrefix)
		return InitialBWP{}, false
	case cp == ExtendedCP && mu != 2:
		bad(f+".cyclicPrefix", "%s.cyclicPrefix extended is defined only at 60 kHz (TS 38.211 Table 4.2-1); use normal at %d kHz.", f, scs)
		return InitialBWP{}, false
	}
	b.CyclicPrefix = cp.String()
	c, haveCarrier := res.Carrier(scs)
	if !haveCarrier {
		bad(f+".subcarrierSpacing", "%s uses %d kHz, but no partition uses %d kHz, so the plan has no %d kHz carrier to hold it; add a partition at %d kHz.", f, scs, scs, scs, scs)
		return InitialBWP{}, false
	}
	start, size := c.OffsetToCarrier, b.SizePRB
	if b.StartCRB != nil {
		start = *b.StartCRB
	}
	if r := b.LocationAndBandwidth; r != nil {
		if *r < 0 || *r > MaxRIV {
			bad(f+".locationAndBandwidth", "%s.locationAndBandwidth is %d; it must be 0 to %d (TS 38.214 5.1.2.2.2 with N = %d).", f, *r, MaxRIV, RIVSize)
			return InitialBWP{}, false
		}
		rs, rl, _ := DecodeRIV(*r)
		if (b.StartCRB != nil && *b.StartCRB != c.OffsetToCarrier+rs) || (b.SizePRB != 0 && b.SizePRB != rl) {
			bad(f+".locationAndBandwidth", "%s.locationAndBandwidth %d means startCrb %d and sizePrb %d, but startCrb %s and sizePrb %d are given; give one or make them agree.", f, *r, c.OffsetToCarrier+rs, rl, optInt(b.StartCRB), b.SizePRB)
		}
		if b.StartCRB == nil {
			start = c.OffsetToCarrier + rs
		}
		if b.SizePRB == 0 {
			size = rl
		}
	}
	if size < 1 || size > MaxPRB || start < 0 || start > MaxStartCRB {
		bad(f+".sizePrb", "%s needs sizePrb from 1 to %d PRBs and startCrb from 0 to %d, or locationAndBandwidth; it has sizePrb %d and startCrb %d.", f, MaxPRB, MaxStartCRB, size, start)
		return InitialBWP{}, false
	}
	low := CRBEdge(scs, start)
	return InitialBWP{Source: "plan", SCSKHz: scs, CP: cp.String(), StartCRB: start, SizePRB: size,
		Low: low, High: low + Hz(size)*12*Hz(scs)*1000}, true
}

func partitionNames(ls []Lattice) string {
	if len(ls) == 0 {
		return "none (no partition is placed)"
	}
	names := make([]string, len(ls))
	for i, l := range ls {
		names[i] = fmt.Sprintf("%q", l.Name)
	}
	return JoinOr(names)
}

// bwpRIV is the BWP's locationAndBandwidth from its spacing's carrier.
func bwpRIV(b InitialBWP, res *Result) int {
	c, ok := res.Carrier(b.SCSKHz)
	if !ok {
		return -1
	}
	riv, ok := EncodeRIV(b.StartCRB-c.OffsetToCarrier, b.SizePRB)
	if !ok {
		return -1
	}
	return riv
}

func checkBWPInCarrier(fs *findings, f, what string, b InitialBWP, res *Result) {
	c, ok := res.Carrier(b.SCSKHz)
	if !ok {
		return // reported where the spacing was chosen
	}
	end, cEnd := b.StartCRB+b.SizePRB, c.OffsetToCarrier+c.CarrierBandwidth
	if b.StartCRB < c.OffsetToCarrier || end > cEnd {
		fs.add(Error, CodeInitialAccess, "", f, "The %s covers CRBs %d to %d of %d kHz, beyond the %d kHz carrier (CRBs %d to %d); keep it inside the carrier.",
			what, b.StartCRB, end-1, b.SCSKHz, b.SCSKHz, c.OffsetToCarrier, cEnd-1)
	}
}

// OccasionGroup is a run of Type0-PDCCH occasions that share their symbols:
// the blocks whose UEs monitor the same CORESET#0 symbols. A figure draws
// one outline per group rather than one per occasion or resource element.
type OccasionGroup struct {
	Slot, FirstSymbol, Symbols int
	Start, End                 Tc
	SSBIndexes                 []int // ascending
}

// OccasionGroups merges the occasions that cover the same symbols, in time
// order. With M = 1/2 or with n0 + 1 of one block being n0 of the next,
// several blocks share a slot's CORESET#0 (TS 38.213 13).
func (ia *InitialAccess) OccasionGroups() []OccasionGroup {
	var out []OccasionGroup
	for _, o := range ia.Occasions { // sorted by start, then block index
		if n := len(out); n > 0 && out[n-1].Start == o.Start && out[n-1].End == o.End {
			out[n-1].SSBIndexes = append(out[n-1].SSBIndexes, o.SSBIndex)
			continue
		}
		out = append(out, OccasionGroup{Slot: o.Slot, FirstSymbol: o.FirstSymbol, Symbols: o.Symbols,
			Start: o.Start, End: o.End, SSBIndexes: []int{o.SSBIndex}})
	}
	return out
}
