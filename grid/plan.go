package grid

import "maps"

// Plan is a carrier and its partitions as the user wrote them. Enumerated
// values are kept as the strings typed, so that Compute can name the value it
// refuses; a zero value means "the default" where the field says so.
type Plan struct {
	Name    string      `json:"name,omitempty" yaml:"name,omitempty"`     // free text, at most MaxNameLen characters
	SpanMs  int         `json:"spanMs,omitempty" yaml:"spanMs,omitempty"` // 1…MaxSpanMs; 0 means 1 (or the TDD period)
	Carrier CarrierPlan `json:"carrier" yaml:"carrier"`
	// Partitions are the bandwidth parts, 1…MaxPartitions of them.
	Partitions []PartitionPlan `json:"partitions" yaml:"partitions"`
	// NumerologyGapKHz is the spacing wanted between adjacent partitions of
	// different subcarrier spacings (common practice, not a 3GPP rule). Nil
	// means one PRB of the wider spacing of the pair; 0 turns the check off.
	NumerologyGapKHz *float64 `json:"numerologyGapKHz,omitempty" yaml:"numerologyGapKHz,omitempty"`
	// TDD is the optional TDD pattern; with it, SpanMs 0 means the pattern's period.
	TDD *TDDPlan `json:"tdd,omitempty" yaml:"tdd,omitempty"`
	// SSB places the SS/PBCH blocks; optional.
	SSB *SSBPlan `json:"ssb,omitempty" yaml:"ssb,omitempty"`
	// Environment describes the radio channel for the numerology fit; optional.
	Environment *EnvironmentPlan `json:"environment,omitempty" yaml:"environment,omitempty"`
	// InitialAccess is pdcch-ConfigSIB1, dmrs-TypeA-Position and the
	// initial BWPs; optional, and it needs SSB.
	InitialAccess *InitialAccessPlan `json:"initialAccess,omitempty" yaml:"initialAccess,omitempty"`
	// PRACH is the random-access configuration (prachplan.go); optional,
	// and it needs SSB.
	PRACH *PRACHPlan `json:"prach,omitempty" yaml:"prach,omitempty"`
}

// CarrierPlan is the channel and its SCS-specific carriers.
type CarrierPlan struct {
	Range string `json:"range,omitempty" yaml:"range,omitempty"` // "FR1", "FR2-1" or "FR2-2"; "" means FR1
	// Band is the NR operating band ("n78", TS 38.101-1/-2 Table 5.2-1);
	// optional. Without it Compute lists the bands the channel fits.
	Band         string `json:"band,omitempty" yaml:"band,omitempty"`
	BandwidthMHz int    `json:"bandwidthMHz" yaml:"bandwidthMHz"` // channel bandwidth
	// CenterMHz is the channel centre, the RF reference frequency; ARFCN is
	// its NR-ARFCN. Either, both (they must agree) or neither may be given.
	CenterMHz *float64 `json:"centerMHz,omitempty" yaml:"centerMHz,omitempty"`
	ARFCN     *int     `json:"arfcn,omitempty" yaml:"arfcn,omitempty"`
	// OffsetToCarrier maps a subcarrier spacing (kHz) to the first CRB of its
	// carrier, counted from point A in CRBs of that spacing. Give it for every
	// spacing in use or for none; with none, Compute chooses the offsets.
	OffsetToCarrier map[int]int `json:"offsetToCarrier,omitempty" yaml:"offsetToCarrier,omitempty"`
	// CarrierBandwidth maps a subcarrier spacing (kHz) to the carrier's size
	// in PRBs; absent spacings take N_RB of TS 38.101 Table 5.3.2-1.
	CarrierBandwidth map[int]int `json:"carrierBandwidth,omitempty" yaml:"carrierBandwidth,omitempty"`
	// NTAOffset is n-TimingAdvanceOffset of TS 38.331
	// ServingCellConfigCommon: n0, n25600 or n39936 (N_TA,offset in Tc,
	// TS 38.133 Table 7.1.2-2). "" means the value for the range: 25600 in
	// FR1, 13792 in FR2, where the field does not apply.
	NTAOffset string `json:"nTaOffset,omitempty" yaml:"nTaOffset,omitempty"`
}

// PartitionPlan is one bandwidth part. Place it by StartCRB and SizePRB, or
// by LocationAndBandwidth; if both are given they must agree.
type PartitionPlan struct {
	Name   string `json:"name" yaml:"name"`
	SCSKHz int    `json:"scsKHz" yaml:"scsKHz"`
	CP     string `json:"cp,omitempty" yaml:"cp,omitempty"` // "normal" or "extended"; "" means normal
	// StartCRB is N_BWP^start, a CRB index from point A in this spacing; nil
	// means the first CRB of the spacing's carrier.
	StartCRB *int `json:"startCrb,omitempty" yaml:"startCrb,omitempty"`
	SizePRB  int  `json:"sizePrb,omitempty" yaml:"sizePrb,omitempty"` // N_BWP^size, 1…275; 0 means "from LocationAndBandwidth"
	// LocationAndBandwidth is the RIV of TS 38.214 5.1.2.2.2 with N = 275,
	// counted from the spacing's offsetToCarrier (TS 38.331 BWP).
	LocationAndBandwidth *int   `json:"locationAndBandwidth,omitempty" yaml:"locationAndBandwidth,omitempty"`
	Direction            string `json:"direction,omitempty" yaml:"direction,omitempty"`   // "DL" or "UL"; "" means DL
	Layers               int    `json:"layers,omitempty" yaml:"layers,omitempty"`         // 1…8 DL, 1…4 UL; 0 means 1
	Modulation           string `json:"modulation,omitempty" yaml:"modulation,omitempty"` // see Modulations; "" means 64QAM
	// UECapability is the UE processing capability of TS 38.214 5.3 and 6.4
	// that the timing assumes: 1 or 2; 0 means 1.
	UECapability int `json:"ueCapability,omitempty" yaml:"ueCapability,omitempty"`
	// DMRSAdditionalPosition is dmrs-AdditionalPosition of TS 38.331
	// DMRS-DownlinkConfig, which picks the column of TS 38.214 Table 5.3-1:
	// pos0, pos1, pos2 or pos3; "" means pos2, the value a UE applies when
	// the field is absent (TS 38.331 DMRS-DownlinkConfig).
	DMRSAdditionalPosition string `json:"dmrsAdditionalPosition,omitempty" yaml:"dmrsAdditionalPosition,omitempty"`
}

// Limits on a plan: they bound the work of Compute for any input.
const (
	MaxNameLen    = 64
	MaxSpanMs     = 10
	MaxPartitions = 16
	MaxOffset     = 2199 // offsetToCarrier, TS 38.331 SCS-SpecificCarrier
	MaxStartCRB   = MaxOffset + RIVSize - 1
	MaxPRB        = 275 // carrierBandwidth and N_BWP^size, TS 38.331
)

// Defaults of a plan's optional fields.
const (
	DefaultRange      = "FR1"
	DefaultCP         = "normal"
	DefaultDirection  = "DL"
	DefaultModulation = "64QAM"
)

// Clone returns a deep copy of p, so a caller may change it freely.
func (p Plan) Clone() Plan {
	q := p
	q.Carrier.OffsetToCarrier = maps.Clone(p.Carrier.OffsetToCarrier)
	q.Carrier.CarrierBandwidth = maps.Clone(p.Carrier.CarrierBandwidth)
	q.Carrier.CenterMHz = clonePtr(p.Carrier.CenterMHz)
	q.Carrier.ARFCN = clonePtr(p.Carrier.ARFCN)
	q.NumerologyGapKHz = clonePtr(p.NumerologyGapKHz)
	if p.SSB != nil {
		s := *p.SSB
		s.GSCN = clonePtr(p.SSB.GSCN)
		q.SSB = &s
	}
	q.Environment = clonePtr(p.Environment)
	q.InitialAccess = p.InitialAccess.clone()
	q.PRACH = clonePtr(p.PRACH)
	if p.TDD != nil {
		t := *p.TDD
		t.Pattern2 = clonePtr(p.TDD.Pattern2)
		q.TDD = &t
	}
	q.Partitions = make([]PartitionPlan, len(p.Partitions))
	for i, pp := range p.Partitions {
		pp.StartCRB = clonePtr(pp.StartCRB)
		pp.LocationAndBandwidth = clonePtr(pp.LocationAndBandwidth)
		q.Partitions[i] = pp
	}
	return q
}

func clonePtr[T any](p *T) *T {
	if p == nil {
		return nil
	}
	v := *p
	return &v
}

// withDefaults fills the fields whose zero value means a default.
func (p Plan) withDefaults() Plan {
	q := p.Clone()
	if q.Carrier.Range == "" {
		q.Carrier.Range = DefaultRange
	}
	for i := range q.Partitions {
		pp := &q.Partitions[i]
		if pp.CP == "" {
			pp.CP = DefaultCP
		}
		if pp.Direction == "" {
			pp.Direction = DefaultDirection
		}
		if pp.Layers == 0 {
			pp.Layers = 1
		}
		if pp.Modulation == "" {
			pp.Modulation = DefaultModulation
		}
	}
	return q
}
