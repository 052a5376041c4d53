package report

import (
	"math"

	"gridloom/grid"
)

// PRACH is the random-access configuration of a Document (TS 38.211 6.3.3,
// TS 38.213 8.1): the table row, the preamble, the cell range and every
// occasion of the association period. Times count Tc from the start of
// frame 0; kHz are relative to point A.
type PRACH struct {
	Table                   string     `json:"table"`
	ConfigurationIndex      int        `json:"configurationIndex"`
	Format                  string     `json:"format"`
	SequenceLength          int        `json:"sequenceLength"`
	SCSKHz                  float64    `json:"scsKHz"`
	PUSCHSCSKHz             int        `json:"puschScsKHz"`
	NRBRA                   int        `json:"nRbRa"`
	KBar                    int        `json:"kBar"`
	Msg1FDM                 int        `json:"msg1FDM"`
	Msg1FrequencyStart      int        `json:"msg1FrequencyStart"`
	StartCRB                int        `json:"startCrb"`
	BWP                     string     `json:"bwp"`
	NCS                     int        `json:"nCs"`
	CellRangeKm             float64    `json:"cellRangeKm"`
	CellRange               PRACHRange `json:"cellRange"`
	ConfigPeriodFrames      int        `json:"configPeriodFrames"`
	AssociationPeriodFrames int        `json:"associationPeriodFrames"`
	// AssociationPatternPeriodFrames is TS 38.213 8.1's association
	// pattern period in frames (0 without an association period).
	AssociationPatternPeriodFrames int             `json:"associationPatternPeriodFrames"`
	SSBPerRachOccasion             string          `json:"ssbPerRachOccasion"`
	ValidPer10ms                   float64         `json:"validPer10ms"`
	Occasions                      []PRACHOccasion `json:"occasions"`
}

// PRACHRange is the radius in km each limit allows: the cyclic prefix, the
// guard time after the preamble (0 when the format leaves none) and the
// cyclic shift N_CS (0 when N_CS is 0).
type PRACHRange struct {
	CPKm              float64 `json:"cpKm"`
	GuardKm           float64 `json:"guardKm"`
	ZeroCorrelationKm float64 `json:"zeroCorrelationKm"`
}

// PRACHOccasion is one occasion in time and frequency with the SS/PBCH
// block indexes mapped to it (none when invalid or past the last whole
// mapping cycle).
type PRACHOccasion struct {
	Frame       int     `json:"frame"`
	Slot        int     `json:"slot"`
	StartSymbol int     `json:"startSymbol"`
	FDM         int     `json:"fdm"`
	Format      string  `json:"format"`
	StartTc     grid.Tc `json:"startTc"`
	EndTc       grid.Tc `json:"endTc"`
	LowKHz      float64 `json:"lowKHz"`
	HighKHz     float64 `json:"highKHz"`
	SSBIndexes  []int   `json:"ssbIndexes"`
	Valid       bool    `json:"valid"`
	Reason      string  `json:"reason"`
}

// round3 keeps three decimals, metres for a km value.
func round3(v float64) float64 { return math.Round(v*1000) / 1000 }

func km(m float64) float64 { return round3(m / 1000) }

func prachDoc(p *grid.PRACH) *PRACH {
	bwp := p.BWPSource
	if p.BWP.Partition != "" {
		bwp += " (" + p.BWP.Partition + ")"
	}
	out := &PRACH{Table: p.Table, ConfigurationIndex: p.ConfigurationIndex, Format: p.Format, SequenceLength: p.SequenceLength,
		SCSKHz: float64(p.SCSHz) / 1000, PUSCHSCSKHz: p.PUSCHSCSKHz, NRBRA: p.NRBRA, KBar: p.KBar, Msg1FDM: p.FDM,
		Msg1FrequencyStart: p.FrequencyStart, StartCRB: p.StartCRB, BWP: bwp, NCS: p.NCS, CellRangeKm: p.CellRangeKm,
		CellRange:          PRACHRange{CPKm: km(p.Range.CP), GuardKm: km(p.Range.Guard), ZeroCorrelationKm: km(p.Range.ZeroCorrelation)},
		ConfigPeriodFrames: p.ConfigPeriodFrames, AssociationPeriodFrames: p.AssociationPeriodFrames,
		AssociationPatternPeriodFrames: p.AssociationPatternPeriodFrames,
		SSBPerRachOccasion:             p.SSBPerRO, ValidPer10ms: round3(p.ValidPer10ms), Occasions: make([]PRACHOccasion, len(p.Occasions))}
	for i, o := range p.Occasions {
		ssb := o.SSBIndexes
		if ssb == nil {
			ssb = []int{}
		}
		out.Occasions[i] = PRACHOccasion{Frame: o.Frame, Slot: o.Slot, StartSymbol: o.StartSymbol, FDM: o.FDM, Format: o.Format,
			StartTc: o.Start, EndTc: o.End, LowKHz: o.Low.KHz(), HighKHz: o.High.KHz(), SSBIndexes: ssb, Valid: o.Valid, Reason: o.Reason}
	}
	return out
}
