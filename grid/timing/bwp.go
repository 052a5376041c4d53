package timing

import "fmt"

// SwitchType is the UE's BWP switching capability (bwp-SwitchingDelay,
// TS 38.306), which picks the column of TS 38.133 Table 8.6.2-1.
type SwitchType uint8

// BWP switch delay types.
const (
	SwitchType1 SwitchType = iota + 1
	SwitchType2
)

// Table8_6_2_1 is TS 38.133 Table 8.6.2-1 (Release 17), the BWP switch delay
// T_BWPswitchDelay in slots for type 1 and type 2, indexed by μ (from
// memory; every cell agrees with OpenAirInterface's copy); the table's
// other column, the slot length, is SlotTc. Rows exist for μ 0–3 only here:
// rows for 480 and 960 kHz, if Release 17 added them for FR2-2, were not at
// hand and are absent (a request for μ 4–6 is refused).
var Table8_6_2_1 = [4][2]int{
	0: {1, 3},
	1: {2, 5},
	2: {3, 9},
	3: {6, 18},
}

// BWPSwitch is a switching delay in time and in slots of the new BWP.
type BWPSwitch struct {
	Delay Tc
	Slots int // slots of the target numerology covering Delay, rounded up
}

func bwpDelay(mu int, t SwitchType) (Tc, error) {
	if mu < 0 || mu >= len(Table8_6_2_1) {
		return 0, fmt.Errorf("TS 38.133 Table 8.6.2-1 as carried here covers μ 0 to 3 (15 to 120 kHz); got μ = %d.", mu)
	}
	if t != SwitchType1 && t != SwitchType2 {
		return 0, fmt.Errorf("The BWP switch delay type must be 1 or 2; got %d.", uint8(t))
	}
	return Tc(Table8_6_2_1[mu][t-1]) * SlotTc(mu), nil
}

// BWPSwitchDelay is the DCI- or timer-based switch delay of TS 38.133 8.6.2
// from a BWP at μ from to one at μ to. Note 2 of Table 8.6.2-1 (from
// memory): when the switch changes the subcarrier spacing, the delay is the
// larger of the delays before and after the switch. The two are counted in slots of
// different lengths, so this package compares them in time (the reading
// taken here) and expresses the larger in slots of the new BWP, rounded up.
func BWPSwitchDelay(from, to int, t SwitchType) (BWPSwitch, error) {
	a, err := bwpDelay(from, t)
	if err != nil {
		return BWPSwitch{}, err
	}
	b, err := bwpDelay(to, t)
	if err != nil {
		return BWPSwitch{}, err
	}
	d := max(a, b)
	return BWPSwitch{Delay: d, Slots: ceilDiv(d, SlotTc(to))}, nil
}

// BWPSwitchDelayRRC is the fixed part of an RRC-based switch,
// T_BWPswitchDelayRRC = 6 ms (TS 38.133 8.6.3).
const BWPSwitchDelayRRC = 6 * TcPerMilli

// BWPSwitchDelayByRRC is the delay of TS 38.133 8.6.3:
// T_RRCprocessingDelay + T_BWPswitchDelayRRC, where the RRC processing delay
// is the procedure delay of TS 38.331 clause 12 for the message that carries
// the switch (10 ms for RRCReconfiguration, from memory); the UE may use the
// new BWP from the first slot after it. μ to sets the slot count.
func BWPSwitchDelayByRRC(to int, rrcProcessing Tc) (BWPSwitch, error) {
	if err := checkMu("The target numerology", to); err != nil {
		return BWPSwitch{}, err
	}
	if rrcProcessing < 0 {
		return BWPSwitch{}, fmt.Errorf("The RRC processing delay must be zero or more Tc; got %d.", rrcProcessing)
	}
	d := rrcProcessing + BWPSwitchDelayRRC
	return BWPSwitch{Delay: d, Slots: ceilDiv(d, SlotTc(to))}, nil
}

func ceilDiv(a, b Tc) int { return int((a + b - 1) / b) }
