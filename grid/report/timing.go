package report

import (
	"math"
	"strconv"

	"gridloom/grid"
)

// PartitionTiming is the timing of one partition in a Document: T_proc in
// Tc (exact) and µs, the least K1 and K2, the HARQ round trip over the
// slots of the pattern, and the one-way user-plane latency per direction
// with 14-symbol slots (latencyUs) and with 2-, 4- and 7-symbol mini-slots
// (miniSlotLatencyUs). Every latency is an estimate of the air-interface
// part only; Timing.LatencyAssumptions lists what it assumes.
type PartitionTiming struct {
	UECapability           int     `json:"ueCapability"`
	DMRSAdditionalPosition string  `json:"dmrsAdditionalPosition"`
	TProc1Tc               grid.Tc `json:"tproc1Tc"`
	TProc1Us               float64 `json:"tproc1Us"`
	TProc2Tc               grid.Tc `json:"tproc2Tc"`
	TProc2Us               float64 `json:"tproc2Us"`
	K1MinSlots             int     `json:"k1MinSlots"`
	K2MinSlots             *int    `json:"k2MinSlots"` // null without a whole uplink slot
	// K1LatticeSlots and K2LatticeSlots are the least K1 and K2 of a PDSCH
	// or PUSCH filling its slot on the numerology's own lattice, as if every
	// symbol went both ways; present under a TDD pattern, to set beside
	// the pattern's.
	K1LatticeSlots    *int               `json:"k1LatticeSlots,omitempty"`
	K2LatticeSlots    *int               `json:"k2LatticeSlots,omitempty"`
	HARQRttUs         MinMeanMax         `json:"harqRttUs"`
	ULHARQRttUs       *MinMeanMax        `json:"ulHarqRttUs"` // null without a whole uplink slot
	LatencyUs         Latency            `json:"latencyUs"`
	MiniSlotLatencyUs map[string]Latency `json:"miniSlotLatencyUs"`
	GuardSymbols      int                `json:"guardSymbols,omitempty"`
	TimingAdvanceTc   grid.Tc            `json:"timingAdvanceTc"`
	TimingAdvanceKm   float64            `json:"timingAdvanceKm"`
}

// MinMeanMax is a spread in µs.
type MinMeanMax struct {
	Min  float64 `json:"min"`
	Mean float64 `json:"mean"`
	Max  float64 `json:"max"`
}

// Latency is the one-way latency of both directions; a direction is null
// when the pattern gives it no run of symbols long enough.
type Latency struct {
	DL *OneWay `json:"dl"`
	UL *OneWay `json:"ul"`
}

// OneWay is a one-way latency in µs: mean over arrival times and worst
// case, without and with one HARQ retransmission (probability
// grid.RetxProbability for the mean, a whole round trip for the worst).
type OneWay struct {
	Mean          float64 `json:"mean"`
	Worst         float64 `json:"worst"`
	MeanWithHARQ  float64 `json:"meanWithHarq"`
	WorstWithHARQ float64 `json:"worstWithHarq"`
}

// Timing is the carrier's timing in a Document. bwpSwitchUs maps a
// partition to every other it can switch to by DCI or timer and the delay
// for a UE of delay type 1 (TS 38.133 Table 8.6.2-1); bwpSwitchType2Us the
// same for type 2; bwpSwitchRrcUs the RRC-based switch (8.6.3).
type Timing struct {
	NTAOffsetTc         grid.Tc                       `json:"nTaOffsetTc"`
	RxTxTc              grid.Tc                       `json:"rxTxTc"`
	GuardTc             *grid.Tc                      `json:"guardTc,omitempty"`
	GuardUs             *float64                      `json:"guardUs,omitempty"`
	GuardSymbols        map[string]int                `json:"guardSymbols,omitempty"`
	MaxCellRadiusKm     *float64                      `json:"maxCellRadiusKm,omitempty"`
	BWPSwitchUs         map[string]map[string]float64 `json:"bwpSwitchUs"`
	BWPSwitchType2Us    map[string]map[string]float64 `json:"bwpSwitchType2Us"`
	BWPSwitchRRCUs      float64                       `json:"bwpSwitchRrcUs"`
	HARQRetxProbability float64                       `json:"harqRetxProbability"`
	LatencyAssumptions  []string                      `json:"latencyAssumptions"`
}

func us(t float64) float64 { return math.Round(t*1e9/float64(grid.TcPerSecond)) / 1e3 }

func oneWay(o *grid.OneWay) *OneWay {
	if o == nil {
		return nil
	}
	return &OneWay{Mean: us(o.Mean), Worst: us(float64(o.Worst)), MeanWithHARQ: us(o.MeanWithHARQ), WorstWithHARQ: us(float64(o.WorstWithHARQ))}
}

func latency(l grid.Latencies) Latency { return Latency{DL: oneWay(l.DL), UL: oneWay(l.UL)} }

func partitionTiming(t *grid.PartitionTiming, tdd bool) *PartitionTiming {
	if t == nil {
		return nil
	}
	out := &PartitionTiming{UECapability: t.Capability, DMRSAdditionalPosition: t.DMRS,
		TProc1Tc: t.TProc1, TProc1Us: us(float64(t.TProc1)), TProc2Tc: t.TProc2, TProc2Us: us(float64(t.TProc2)),
		K1MinSlots: t.K1Min,
		HARQRttUs:  MinMeanMax{Min: us(float64(t.HARQMin)), Mean: us(t.HARQMean), Max: us(float64(t.HARQMax))},
		LatencyUs:  latency(t.Slot), MiniSlotLatencyUs: map[string]Latency{}, GuardSymbols: t.GuardSymbols,
		TimingAdvanceTc: t.TimingAdvance, TimingAdvanceKm: math.Round(t.TimingAdvanceRadiusM) / 1e3}
	if t.K2Min >= 0 {
		out.K2MinSlots = ptr(t.K2Min)
	}
	if tdd {
		out.K1LatticeSlots, out.K2LatticeSlots = ptr(t.K1Lattice), ptr(t.K2Lattice)
	}
	if t.HasULHARQ {
		out.ULHARQRttUs = &MinMeanMax{Min: us(float64(t.ULHARQMin)), Mean: us(t.ULHARQMean), Max: us(float64(t.ULHARQMax))}
	}
	for n, l := range t.MiniSlot {
		out.MiniSlotLatencyUs[strconv.Itoa(n)] = latency(l)
	}
	return out
}

func planTiming(t *grid.PlanTiming) *Timing {
	if t == nil {
		return nil
	}
	out := &Timing{NTAOffsetTc: t.NTAOffset, RxTxTc: t.RxTx, BWPSwitchRRCUs: us(float64(t.BWPSwitchRRC)),
		BWPSwitchUs: map[string]map[string]float64{}, BWPSwitchType2Us: map[string]map[string]float64{},
		HARQRetxProbability: grid.RetxProbability, LatencyAssumptions: grid.LatencyAssumptions}
	if t.HasGuard {
		out.GuardTc = ptr(t.Guard)
		out.GuardUs = ptr(us(float64(t.Guard)))
		out.MaxCellRadiusKm = ptr(math.Round(t.MaxCellRadiusM) / 1e3)
		out.GuardSymbols = map[string]int{}
		for scs, n := range t.GuardSymbols {
			out.GuardSymbols[strconv.Itoa(scs)] = n
		}
	}
	for _, s := range t.BWPSwitch {
		if out.BWPSwitchUs[s.From] == nil {
			out.BWPSwitchUs[s.From] = map[string]float64{}
			out.BWPSwitchType2Us[s.From] = map[string]float64{}
		}
		out.BWPSwitchUs[s.From][s.To] = us(float64(s.Type1))
		out.BWPSwitchType2Us[s.From][s.To] = us(float64(s.Type2))
	}
	return out
}

// CrossLink is the JSON of grid.CrossLinkConflicts, for a comparison of two
// plans: the intervals on plan A's time (µs from A's frame start, within
// one cycle of both patterns) where one transmits downlink while the other
// receives uplink, and their total per 10 ms. Conflicts is empty, not
// null, when the two are aligned.
type CrossLink struct {
	FrameOffsetUs   float64             `json:"frameOffsetUs"`
	CycleUs         float64             `json:"cycleUs"`
	Conflicts       []CrossLinkConflict `json:"conflicts"`
	TotalPer10msUs  float64             `json:"totalPer10msUs"`
	TotalPerCycleTc grid.Tc             `json:"totalPerCycleTc"`
}

// CrossLinkConflict is one interval of a CrossLink: A and B are the
// directions of the two plans in it, "D" and "U" or "U" and "D".
type CrossLinkConflict struct {
	StartUs float64 `json:"startUs"`
	EndUs   float64 `json:"endUs"`
	StartTc grid.Tc `json:"startTc"`
	EndTc   grid.Tc `json:"endTc"`
	A       string  `json:"a"`
	B       string  `json:"b"`
}

// BuildCrossLink returns the JSON form of c.
func BuildCrossLink(c grid.CrossLink) CrossLink {
	out := CrossLink{FrameOffsetUs: us(float64(c.Offset)), CycleUs: us(float64(c.Cycle)), Conflicts: []CrossLinkConflict{},
		TotalPer10msUs: us(c.PerTenMs), TotalPerCycleTc: c.Total}
	for _, k := range c.Conflicts {
		out.Conflicts = append(out.Conflicts, CrossLinkConflict{StartUs: us(float64(k.Start)), EndUs: us(float64(k.End)),
			StartTc: k.Start, EndTc: k.End, A: k.A.String(), B: k.B.String()})
	}
	return out
}
