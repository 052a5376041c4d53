// Package report is the JSON document of a computed plan, shared by the
// command line and the web API. It lives outside the engine so that grid
// stays computation only and the document's form has one owner; kHz values
// are relative to point A, MHz values are absolute and present only when the
// plan ties the channel to a frequency.
package report

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"io"
	"math"
	"strconv"

	"gridloom/grid"
)

// Document is the JSON document of one grid.Result, as Build makes it.
type Document struct {
	Spec       string      `json:"spec"` // the 3GPP release followed, grid.Spec
	Plan       grid.Plan   `json:"plan"`
	Channel    Channel     `json:"channel"`
	Carriers   []Carrier   `json:"carriers"`
	Partitions []Partition `json:"partitions"`
	// Overlaps are the bands two partitions share, one per pair, in the
	// order of the overlap findings; an empty list when none do.
	Overlaps []Overlap      `json:"overlaps"`
	TDD      *TDD           `json:"tdd,omitempty"`
	SSB      *SSB           `json:"ssb,omitempty"`
	Fit      *grid.Fit      `json:"fit,omitempty"`
	Findings []grid.Finding `json:"findings"`
	// Timing is the carrier's timing (timing.go); Advice the numerology
	// advice, present when the plan describes its environment.
	Timing *Timing      `json:"timing,omitempty"`
	Advice *grid.Advice `json:"advice,omitempty"`
	// InitialAccess is present when the plan has an initialAccess block
	// whose CORESET#0 could be placed.
	InitialAccess *InitialAccess `json:"initialAccess,omitempty"`
	// PRACH is present when the plan has a prach block that could be placed
	// (prach.go).
	PRACH *PRACH `json:"prach,omitempty"`
}

// InitialAccess is the initial access of a Document: CORESET#0, the
// Type0-PDCCH occasions, the MIB fields and the initial BWPs. CRBs count in
// subCarrierSpacingCommon; slots count in CORESET#0's numerology from the
// start of frame 0, over windowMs.
type InitialAccess struct {
	CORESET0           CORESET0     `json:"coreset0"`
	SearchSpace0       SearchSpace0 `json:"searchSpace0"`
	MIB                MIB          `json:"mib"`
	InitialDownlinkBWP InitialBWP   `json:"initialDownlinkBWP"`
	InitialUplinkBWP   *InitialBWP  `json:"initialUplinkBWP,omitempty"`
}

// CORESET0 is CORESET#0 as TS 38.213 Tables 13-1 to 13-10 place it.
type CORESET0 struct {
	Table    string   `json:"table"`
	Index    int      `json:"index"`
	Pattern  int      `json:"pattern"`
	NRB      int      `json:"nrb"`
	Symbols  int      `json:"symbols"`
	OffsetRB int      `json:"offsetRb"`
	SCSKHz   int      `json:"scsKHz"`
	StartCRB int      `json:"startCrb"`
	LowKHz   float64  `json:"lowKHz"`
	HighKHz  float64  `json:"highKHz"`
	LowMHz   *float64 `json:"lowMHz,omitempty"`
	HighMHz  *float64 `json:"highMHz,omitempty"`
}

// SearchSpace0 is the Type0-PDCCH CSS set: the row read and its
// monitoring occasions, one per slot.
type SearchSpace0 struct {
	Index     int        `json:"index"`
	Table     string     `json:"table"`
	WindowMs  int        `json:"windowMs"`
	Occasions []Occasion `json:"occasions"`
}

// Occasion is one Type0-PDCCH monitoring occasion of a SearchSpace0.
type Occasion struct {
	SSBIndex    int     `json:"ssbIndex"`
	Slot        int     `json:"slot"`
	FirstSymbol int     `json:"firstSymbol"`
	StartTc     grid.Tc `json:"startTc"`
	EndTc       grid.Tc `json:"endTc"`
}

// MIB holds the MIB fields a plan implies, by their TS 38.331 names.
// kSsbMsb is the PBCH payload bit that carries k_SSB's fifth bit in FR1.
// SubCarrierSpacingCommon is null where the field gives no spacing
// (grid.CommonIsSpacing): in FR2-2 and on a shared spectrum FR1 band.
type MIB struct {
	SubCarrierSpacingCommon *string `json:"subCarrierSpacingCommon"`
	SSBSubcarrierOffset     int     `json:"ssbSubcarrierOffset"`
	KSSBMsb                 int     `json:"kSsbMsb"`
	DMRSTypeAPosition       string  `json:"dmrsTypeAPosition"`
	PDCCHConfigSIB1         int     `json:"pdcchConfigSIB1"`
}

// InitialBWP is an initial BWP of a Document; source says where it came
// from (coreset0, plan, partition, initialDownlinkBWP).
type InitialBWP struct {
	Source               string  `json:"source"`
	Partition            string  `json:"partition,omitempty"`
	SCSKHz               int     `json:"scsKHz"`
	CP                   string  `json:"cp"`
	StartCRB             int     `json:"startCrb"`
	SizePRB              int     `json:"sizePrb"`
	LocationAndBandwidth *int    `json:"locationAndBandwidth"` // null when not expressible
	LowKHz               float64 `json:"lowKHz"`
	HighKHz              float64 `json:"highKHz"`
}

// SSB is the SS/PBCH configuration of a Document. Slot and symbol
// of each block count in the block's own spacing over the span.
//
// SSRefKHz is SS_REF relative to point A; SSRefMHz, AbsoluteFrequencySSB
// (its NR-ARFCN) and GSCN (when it is on the synchronization raster) are
// present only when the plan ties the carrier to a frequency.
type SSB struct {
	Case                 string     `json:"case"`
	SCSKHz               int        `json:"scsKHz"`
	Candidates           int        `json:"candidates"`
	BitmapForm           string     `json:"bitmapForm"`
	PeriodMs             int        `json:"periodMs"`
	OffsetToPointA       int        `json:"offsetToPointA"`
	KSSB                 int        `json:"kSsb"`
	ScsCommonKHz         int        `json:"scsCommonKHz"`
	SSRefKHz             float64    `json:"ssRefKHz"`
	SSRefMHz             *float64   `json:"ssRefMHz,omitempty"`
	AbsoluteFrequencySSB *int       `json:"absoluteFrequencySSB,omitempty"`
	GSCN                 *int       `json:"gscn,omitempty"`
	Blocks               []SSBBlock `json:"blocks"`
}

// SSBBlock is one SS/PBCH block of an SSB.
type SSBBlock struct {
	Index   int     `json:"index"`
	Slot    int     `json:"slot"`
	Symbol  int     `json:"symbol"`
	StartTc grid.Tc `json:"startTc"`
	EndTc   grid.Tc `json:"endTc"`
	LowKHz  float64 `json:"lowKHz"`
	HighKHz float64 `json:"highKHz"`
}

// TDD is the TDD pattern of a Document. Slots writes each reference
// slot of one period as D (all downlink), U (all uplink) or S (mixed or
// flexible), the way engineers write patterns ("DDDSU").
type TDD struct {
	ReferenceSCSKHz int     `json:"referenceScsKHz"`
	PeriodMs        float64 `json:"periodMs"`
	Slots           string  `json:"slots"`
}

// Symbol is one symbol of a Partition; Direction is D, U or F under
// a TDD pattern and absent without one.
type Symbol struct {
	grid.Symbol
	Direction string `json:"direction,omitempty"`
}

// Channel is the channel of a Document.
type Channel struct {
	Range        string   `json:"range"`
	BandwidthMHz int      `json:"bandwidthMHz"`
	CenterMHz    *float64 `json:"centerMHz,omitempty"`
	ARFCN        *int     `json:"arfcn,omitempty"`
	PointAMHz    *float64 `json:"pointAMHz,omitempty"`
	PointAARFCN  *int     `json:"pointAArfcn,omitempty"`
	// Band is the operating band the channel is checked against;
	// BandCandidates the bands whose downlink range holds it, listed when
	// the plan names no band. RasterKHz is the band's ΔF_Raster at the
	// centre. ULCenterMHz and ULARFCN are the paired uplink of an FDD band.
	Band           string   `json:"band,omitempty"`
	BandCandidates []string `json:"bandCandidates,omitempty"`
	Duplex         string   `json:"duplex,omitempty"`
	RasterKHz      int      `json:"rasterKHz,omitempty"`
	ULCenterMHz    *float64 `json:"ulCenterMHz,omitempty"`
	ULARFCN        *int     `json:"ulArfcn,omitempty"`
	LowKHz         float64  `json:"lowKHz"`
	HighKHz        float64  `json:"highKHz"`
	CenterKHz      float64  `json:"centerKHz"`
	UsePercent     float64  `json:"usePercent"`
}

// Carrier is one SCS-specific carrier of a Document.
type Carrier struct {
	SCSKHz           int     `json:"scsKHz"`
	NRB              int     `json:"nrb"`
	CarrierBandwidth int     `json:"carrierBandwidth"`
	OffsetToCarrier  int     `json:"offsetToCarrier"`
	OffsetChosen     bool    `json:"offsetChosen"`
	LowKHz           float64 `json:"lowKHz"`
	HighKHz          float64 `json:"highKHz"`
	MinGuardKHz      float64 `json:"minGuardKHz"`
	GuardLowKHz      float64 `json:"guardLowKHz"`
	GuardHighKHz     float64 `json:"guardHighKHz"`
}

// Partition is one placed partition of a Document, with its symbols.
type Partition struct {
	Name                 string   `json:"name"`
	SCSKHz               int      `json:"scsKHz"`
	Mu                   int      `json:"mu"`
	CP                   string   `json:"cp"`
	StartCRB             int      `json:"startCrb"`
	SizePRB              int      `json:"sizePrb"`
	LocationAndBandwidth *int     `json:"locationAndBandwidth"` // null when not expressible
	LowKHz               float64  `json:"lowKHz"`
	HighKHz              float64  `json:"highKHz"`
	LowMHz               *float64 `json:"lowMHz,omitempty"`
	HighMHz              *float64 `json:"highMHz,omitempty"`
	OccupiedMHz          float64  `json:"occupiedMHz"`
	SlotsPerSubframe     int      `json:"slotsPerSubframe"`
	SymbolsPerSlot       int      `json:"symbolsPerSlot"`
	Slots                int      `json:"slots"`
	SymbolCount          int      `json:"symbolCount"`
	SlotUs               float64  `json:"slotUs"`
	UsefulUs             float64  `json:"usefulUs"`
	CPUs                 float64  `json:"cpUs"`
	LongCPUs             float64  `json:"longCpUs"`
	REPerSlot            int      `json:"rePerSlot"`
	Direction            string   `json:"direction"`
	Layers               int      `json:"layers"`
	Modulation           string   `json:"modulation"`
	PeakMbps             float64  `json:"peakMbps"`
	// Share is the fraction of symbols in the partition's direction under
	// the TDD pattern, by which PeakMbps is scaled; 1 without TDD.
	Share float64 `json:"share"`
	// MiniSlotUs gives the length of mini-slots of 2, 4 and 7 symbols away
	// from the longer CP, for latency.
	MiniSlotUs map[string]float64 `json:"miniSlotUs"`
	Symbols    []Symbol           `json:"symbols"`
	// Timing is what the numerology buys in time (timing.go); absent for a
	// partition below the TDD reference spacing.
	Timing *PartitionTiming `json:"timing,omitempty"`
}

// Overlap is the band two partitions share (grid.Overlap). Partitions
// names the two, PartitionIndexes gives their places in the plan (the
// lower first), and Severity is that of the overlap finding: error when
// both send in the same direction, warning for a downlink and an uplink
// partition, which a TDD carrier may keep apart in time. The band is
// relative to point A; LowMHz and HighMHz are present when the plan ties
// the channel to a frequency.
type Overlap struct {
	PartitionIndexes [2]int        `json:"partitionIndexes"`
	Partitions       [2]string     `json:"partitions"`
	LowKHz           float64       `json:"lowKHz"`
	HighKHz          float64       `json:"highKHz"`
	LowMHz           *float64      `json:"lowMHz,omitempty"`
	HighMHz          *float64      `json:"highMHz,omitempty"`
	Severity         grid.Severity `json:"severity"`
}

// Build returns the document of r. With symbols false the per-symbol lists
// are left empty, for callers that want the summary only.
func Build(r grid.Result, symbols bool) Document {
	ch := r.Channel
	out := Document{
		Spec: grid.Spec,
		Plan: r.Plan,
		Channel: Channel{Range: ch.Range.String(), BandwidthMHz: ch.BandwidthMHz,
			LowKHz: ch.Low.KHz(), HighKHz: ch.High.KHz(), CenterKHz: ch.Center.KHz(), UsePercent: ch.UsePercent},
		Carriers:   []Carrier{},
		Partitions: []Partition{},
		Overlaps:   []Overlap{},
		Findings:   r.Findings,
	}
	if out.Findings == nil {
		out.Findings = []grid.Finding{}
	}
	if ch.Absolute {
		out.Channel.CenterMHz = ptr(ch.CenterHz.MHz())
		out.Channel.PointAMHz = ptr(ch.PointAHz.MHz())
		if ch.OnRaster {
			out.Channel.ARFCN = ptr(ch.ARFCN)
		}
		if ch.PointAOnRaster {
			out.Channel.PointAARFCN = ptr(ch.PointAARFCN)
		}
		if ch.HasUL {
			out.Channel.ULCenterMHz = ptr(ch.ULCenterHz.MHz())
			out.Channel.ULARFCN = ptr(ch.ULARFCN)
		}
	}
	out.Channel.Band, out.Channel.BandCandidates = ch.Band, ch.BandCandidates
	out.Channel.Duplex, out.Channel.RasterKHz = ch.Duplex, ch.RasterKHz
	for _, c := range r.Carriers {
		out.Carriers = append(out.Carriers, Carrier{SCSKHz: c.SCSKHz, NRB: c.NRB, CarrierBandwidth: c.CarrierBandwidth,
			OffsetToCarrier: c.OffsetToCarrier, OffsetChosen: c.Chosen, LowKHz: c.Low.KHz(), HighKHz: c.High.KHz(),
			MinGuardKHz: c.MinGuard.KHz(), GuardLowKHz: c.GuardLow.KHz(), GuardHighKHz: c.GuardHigh.KHz()})
	}
	for _, l := range r.Partitions {
		n := l.Numerology
		jp := Partition{Name: l.Name, SCSKHz: n.SCSKHz(), Mu: n.Mu, CP: n.CP.String(),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, LowKHz: l.Low.KHz(), HighKHz: l.High.KHz(),
			OccupiedMHz: l.Width().MHz(), SlotsPerSubframe: n.SlotsPerSubframe(), SymbolsPerSlot: n.SymbolsPerSlot(),
			Slots: l.SlotCount(), SymbolCount: l.SymbolCount(), SlotUs: n.SlotTc().Micros(),
			UsefulUs: n.UsefulTc().Micros(), CPUs: n.CPTc(1).Micros(), LongCPUs: n.CPTc(0).Micros(),
			REPerSlot: l.REPerSlot(), Direction: string(l.Direction), Layers: l.Layers, Modulation: l.Modulation,
			PeakMbps: l.PeakMbps, Share: math.Round(l.Share*1e4) / 1e4, Symbols: []Symbol{},
			MiniSlotUs: map[string]float64{}}
		for _, k := range []int{2, 4, 7} {
			jp.MiniSlotUs[strconv.Itoa(k)] = math.Round((grid.Tc(k)*(n.UsefulTc()+n.CPTc(1))).Micros()*1e4) / 1e4
		}
		if l.LocationAndBandwidth >= 0 {
			jp.LocationAndBandwidth = ptr(l.LocationAndBandwidth)
		}
		if ch.Absolute {
			jp.LowMHz = ptr(ch.Abs(l.Low).MHz())
			jp.HighMHz = ptr(ch.Abs(l.High).MHz())
		}
		if symbols {
			jp.Symbols = make([]Symbol, l.SymbolCount())
			for k := range jp.Symbols {
				jp.Symbols[k] = symbolAt(l, k)
			}
		}
		jp.Timing = partitionTiming(l.Timing, r.TDD != nil)
		out.Partitions = append(out.Partitions, jp)
	}
	for _, o := range r.Overlaps {
		jo := Overlap{PartitionIndexes: [2]int{o.A, o.B}, LowKHz: o.Low.KHz(), HighKHz: o.High.KHz(), Severity: grid.Warning}
		jo.Partitions = [2]string{partitionName(r.Partitions, o.A), partitionName(r.Partitions, o.B)}
		if o.Error {
			jo.Severity = grid.Error
		}
		if ch.Absolute {
			jo.LowMHz = ptr(ch.Abs(o.Low).MHz())
			jo.HighMHz = ptr(ch.Abs(o.High).MHz())
		}
		out.Overlaps = append(out.Overlaps, jo)
	}
	out.Timing = planTiming(r.Timing)
	out.Advice = r.Advice
	if s := r.SSB; s != nil {
		js := &SSB{Case: s.Case, SCSKHz: s.Numerology.SCSKHz(), Candidates: s.Candidates, BitmapForm: s.BitmapForm,
			PeriodMs: s.PeriodMs, OffsetToPointA: s.OffsetToPointA, KSSB: s.KSSB, ScsCommonKHz: s.ScsCommonKHz,
			SSRefKHz: s.SSRef.KHz(), Blocks: []SSBBlock{}}
		if s.Absolute {
			js.SSRefMHz = ptr(s.SSRefHz.MHz())
			if s.OnARFCNRaster {
				js.AbsoluteFrequencySSB = ptr(s.AbsoluteFrequencySSB)
			}
			if s.OnSyncRaster {
				js.GSCN = ptr(s.GSCN)
			}
		}
		for _, b := range s.Blocks {
			js.Blocks = append(js.Blocks, SSBBlock{Index: b.Index, Slot: b.Slot, Symbol: b.Symbol, StartTc: b.Start, EndTc: b.End, LowKHz: b.Low.KHz(), HighKHz: b.High.KHz()})
		}
		out.SSB = js
	}
	out.Fit = r.Fit
	if ia := r.InitialAccess; ia != nil {
		out.InitialAccess = initialAccess(ia, ch)
	}
	if p := r.PRACH; p != nil {
		out.PRACH = prachDoc(p)
	}
	if t := r.TDD; t != nil {
		out.TDD = &TDD{ReferenceSCSKHz: t.Reference.SCSKHz(), PeriodMs: float64(t.Period) / float64(grid.TcPerSubframe), Slots: t.SlotString()}
	}
	return out
}

// partitionName is the name of the partition at index i of the plan.
func partitionName(ls []grid.Lattice, i int) string {
	for _, l := range ls {
		if l.Index == i {
			return l.Name
		}
	}
	return ""
}

// symbolAt is the k-th symbol of partition l as the document lists it.
func symbolAt(l grid.Lattice, k int) Symbol {
	s := Symbol{Symbol: l.Numerology.SymbolAt(k)}
	if l.Dirs != nil {
		s.Direction = l.Dirs[k].String()
	}
	return s
}

// Write writes the document of r, symbols included, to w as JSON and a
// newline; with indent each value stands on its own line, two spaces deep,
// as the command line and the web API give it. The bytes are those of
// marshalling Build(r, true), but the symbol lists, which are nearly all of
// a large document (143 360 symbols, 25 MB, for the largest plan), are
// never held: the document is marshalled without them and each symbol is
// encoded on its own into its place, through a buffer, so Write holds the
// summary and one symbol at a time. A failing write stops it at once.
func Write(w io.Writer, r grid.Result, indent bool) error {
	var head []byte
	var err error
	marker := []byte(`"symbols":[]`)
	if indent {
		head, err = json.MarshalIndent(Build(r, false), "", "  ")
		marker = []byte(`"symbols": []`)
	} else {
		head, err = json.Marshal(Build(r, false))
	}
	if err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 32<<10)
	var one bytes.Buffer
	enc := json.NewEncoder(&one)
	// The key "symbols" with an empty list is a partition's and nothing
	// else's (other "symbols" keys hold numbers), and cannot occur inside
	// a string, where every quote is escaped; partitions come in order.
	for _, l := range r.Partitions {
		i := bytes.Index(head, marker)
		if i < 0 {
			return errors.New("report: a partition's symbol list is missing from the document")
		}
		open := i + len(marker) - 1 // the index of ']'
		if _, err := bw.Write(head[:open]); err != nil {
			return err
		}
		// In the indented form the key's line starts with its depth; the
		// elements stand two spaces deeper, and ']' on a line at the key's.
		var keyPad, elemPad string
		if indent {
			keyPad = "\n" + string(head[bytes.LastIndexByte(head[:i], '\n')+1:i])
			elemPad = keyPad + "  "
			enc.SetIndent(elemPad[1:], "  ")
		}
		head = head[open:]
		n := l.SymbolCount()
		for k := range n {
			one.Reset()
			if err := enc.Encode(symbolAt(l, k)); err != nil {
				return err
			}
			if k > 0 {
				if err := bw.WriteByte(','); err != nil {
					return err
				}
			}
			if _, err := bw.WriteString(elemPad); err != nil {
				return err
			}
			if _, err := bw.Write(bytes.TrimSuffix(one.Bytes(), []byte{'\n'})); err != nil {
				return err
			}
		}
		if n > 0 {
			if _, err := bw.WriteString(keyPad); err != nil {
				return err
			}
		}
	}
	if _, err := bw.Write(head); err != nil {
		return err
	}
	if err := bw.WriteByte('\n'); err != nil {
		return err
	}
	return bw.Flush()
}

func initialAccess(ia *grid.InitialAccess, ch grid.Channel) *InitialAccess {
	c := ia.CORESET0
	out := &InitialAccess{
		CORESET0: CORESET0{Table: c.Table, Index: c.Index, Pattern: c.Pattern, NRB: c.NRB, Symbols: c.Symbols,
			OffsetRB: c.OffsetRB, SCSKHz: c.SCSKHz, StartCRB: c.StartCRB, LowKHz: c.Low.KHz(), HighKHz: c.High.KHz()},
		SearchSpace0: SearchSpace0{Index: ia.SearchSpaceZero, Table: ia.OccasionTable, WindowMs: ia.WindowMs,
			Occasions: make([]Occasion, len(ia.Occasions))},
		MIB: MIB{SSBSubcarrierOffset: ia.MIB.SSBSubcarrierOffset,
			KSSBMsb: ia.MIB.KSSBMsb, DMRSTypeAPosition: ia.MIB.DMRSTypeAPosition, PDCCHConfigSIB1: ia.MIB.PDCCHConfigSIB1},
		InitialDownlinkBWP: initialBWP(ia.InitialDL),
	}
	if scc := ia.MIB.SubCarrierSpacingCommon; scc != "" {
		out.MIB.SubCarrierSpacingCommon = ptr(scc)
	}
	if ch.Absolute {
		out.CORESET0.LowMHz = ptr(ch.Abs(c.Low).MHz())
		out.CORESET0.HighMHz = ptr(ch.Abs(c.High).MHz())
	}
	for i, o := range ia.Occasions {
		out.SearchSpace0.Occasions[i] = Occasion{SSBIndex: o.SSBIndex, Slot: o.Slot, FirstSymbol: o.FirstSymbol, StartTc: o.Start, EndTc: o.End}
	}
	if ul := ia.InitialUL; ul != nil {
		b := initialBWP(*ul)
		out.InitialUplinkBWP = &b
	}
	return out
}

func initialBWP(b grid.InitialBWP) InitialBWP {
	out := InitialBWP{Source: b.Source, Partition: b.Partition, SCSKHz: b.SCSKHz, CP: b.CP, StartCRB: b.StartCRB,
		SizePRB: b.SizePRB, LowKHz: b.Low.KHz(), HighKHz: b.High.KHz()}
	if b.LocationAndBandwidth >= 0 {
		out.LocationAndBandwidth = ptr(b.LocationAndBandwidth)
	}
	return out
}

func ptr[T any](v T) *T { return &v }
