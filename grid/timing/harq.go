package timing

import "fmt"

// searchLimit bounds a walk for the next symbol of a direction: the wait
// itself plus two periods, time enough to meet any direction the pattern has.
func (p Pattern) searchLimit(from int, wait Tc) int {
	return from + int(wait/(NominalSymbolTc(p.Mu))) + 1 + 2*p.CycleSymbols() + 2*SymbolsPerSlot
}

// firstULRun returns the first symbol k ≥ from whose uplink start is at or
// after t and which begins a run of n uplink symbols inside one slot.
func (p Pattern) firstULRun(from int, t Tc, n int) (int, bool) {
	limit := p.searchLimit(from, t-p.dlStart(from)+p.ULAdvance)
	for k := from; k < limit; k++ {
		if !p.IsUL(k) || p.ulStart(k) < t {
			continue
		}
		if k%SymbolsPerSlot+n > SymbolsPerSlot {
			continue
		}
		ok := true
		for j := 1; j < n && ok; j++ {
			ok = p.IsUL(k + j)
		}
		if ok {
			return k, true
		}
	}
	return 0, false
}

// AckTiming is where the HARQ-ACK of one PDSCH can go.
type AckTiming struct {
	K1     int // slots from the PDSCH's slot to the ACK's slot
	Symbol int // the ACK's first symbol, counted from the pattern's start
	Start  Tc  // the ACK's start on the uplink lattice
}

// EarliestK1 returns the smallest K1 for a PDSCH in slot whose last symbol is
// lastSymbol (0–13 in the slot). The rule is TS 38.214 5.3's: the first
// uplink symbol of the PUCCH must start no earlier than T_proc,1 after the
// end of the PDSCH's last symbol. A PUCCH may start at any symbol of a slot,
// so the earliest slot is the first with an uplink symbol that starts late
// enough; the ACK takes that symbol (a one-symbol PUCCH, the shortest).
// Pass the T_proc,1 of TProc1; a nil pattern direction is FDD.
func EarliestK1(p Pattern, slot, lastSymbol int, tproc1 Tc) (AckTiming, error) {
	if err := p.Check(); err != nil {
		return AckTiming{}, err
	}
	if slot < 0 || lastSymbol < 0 || lastSymbol >= SymbolsPerSlot {
		return AckTiming{}, fmt.Errorf("The PDSCH must end in a slot ≥ 0 at symbol 0 to 13; got slot %d, symbol %d.", slot, lastSymbol)
	}
	g := slot*SymbolsPerSlot + lastSymbol
	if !p.IsDL(g) {
		return AckTiming{}, fmt.Errorf("The PDSCH's last symbol (slot %d, symbol %d) is not a downlink symbol of the pattern.", slot, lastSymbol)
	}
	t := p.dlEnd(g) + tproc1
	k, ok := p.firstULRun(g+1, t, 1)
	if !ok {
		return AckTiming{}, fmt.Errorf("The pattern has no uplink symbol to carry a HARQ-ACK.")
	}
	return AckTiming{K1: k/SymbolsPerSlot - slot, Symbol: k, Start: p.ulStart(k)}, nil
}

// GrantTiming is where the PUSCH of one uplink grant can go.
type GrantTiming struct {
	K2     int // slots from the PDCCH's slot to the PUSCH's slot
	Symbol int // the PUSCH's first symbol, counted from the pattern's start
	Start  Tc
}

// EarliestK2 returns the smallest K2 for a grant whose PDCCH ends with symbol
// lastSymbol of slot, for a PUSCH of length uplink symbols in one slot. The
// rule is TS 38.214 6.4's: the PUSCH's first symbol must start no earlier than
// T_proc,2 after the end of the PDCCH.
func EarliestK2(p Pattern, slot, lastSymbol, length int, tproc2 Tc) (GrantTiming, error) {
	if err := p.Check(); err != nil {
		return GrantTiming{}, err
	}
	if slot < 0 || lastSymbol < 0 || lastSymbol >= SymbolsPerSlot {
		return GrantTiming{}, fmt.Errorf("The PDCCH must end in a slot ≥ 0 at symbol 0 to 13; got slot %d, symbol %d.", slot, lastSymbol)
	}
	if length < 1 || length > SymbolsPerSlot {
		return GrantTiming{}, fmt.Errorf("The PUSCH length must be 1 to 14 symbols; got %d.", length)
	}
	g := slot*SymbolsPerSlot + lastSymbol
	if !p.IsDL(g) {
		return GrantTiming{}, fmt.Errorf("The PDCCH's last symbol (slot %d, symbol %d) is not a downlink symbol of the pattern.", slot, lastSymbol)
	}
	k, ok := p.firstULRun(g+1, p.dlEnd(g)+tproc2, length)
	if !ok {
		return GrantTiming{}, fmt.Errorf("The pattern has no run of %d uplink symbols in one slot for the PUSCH.", length)
	}
	return GrantTiming{K2: k/SymbolsPerSlot - slot, Symbol: k, Start: p.ulStart(k)}, nil
}

// RoundTrip is the HARQ round trip of the PDSCH sent in one slot.
type RoundTrip struct {
	Slot     int // the slot of the first transmission, within the period
	PDSCHEnd int // its last symbol in the slot
	Ack      AckTiming
	Retx     int // the slot of the earliest retransmission
	RTT      Tc  // from the start of the first transmission to the start of the retransmission
}

// RoundTrips sums up the HARQ round trips of one cycle of the pattern.
type RoundTrips struct {
	PerSlot            []RoundTrip
	Min, Max           Tc
	Mean               float64 // Tc; a mean over slots need not be whole
	MinSlots, MaxSlots int
}

// HARQRoundTrips walks every slot of one cycle (CycleSlots) that starts with a downlink
// symbol and sends a PDSCH from symbol 0 to the last downlink symbol of its
// leading run. Its HARQ-ACK goes at EarliestK1; the gNB has it at the end of
// that uplink symbol on its own lattice (the timing advance undoes the
// propagation; N_TA,offset, which makes it earlier, is neglected), decodes
// it for gnbProc, and retransmits in the first slot that starts with a
// downlink symbol no earlier than that. gnbProc is the gNB's implementation
// time, which no specification fixes.
func HARQRoundTrips(p Pattern, tproc1, gnbProc Tc) (RoundTrips, error) {
	if err := p.Check(); err != nil {
		return RoundTrips{}, err
	}
	if gnbProc < 0 || tproc1 < 0 {
		return RoundTrips{}, fmt.Errorf("The processing times must be zero or more Tc; got T_proc,1 = %d and gNB processing %d.", tproc1, gnbProc)
	}
	var out RoundTrips
	var sum Tc
	for s := 0; s < p.CycleSlots(); s++ {
		first := s * SymbolsPerSlot
		if !p.IsDL(first) {
			continue
		}
		last := 0
		for last+1 < SymbolsPerSlot && p.IsDL(first+last+1) {
			last++
		}
		ack, err := EarliestK1(p, s, last, tproc1)
		if err != nil {
			return RoundTrips{}, err
		}
		ready := p.dlEnd(ack.Symbol) + gnbProc
		r, found := ack.Symbol/SymbolsPerSlot+1, false
		for limit := r + 2*p.CycleSlots() + int(gnbProc/SlotTc(p.Mu)) + 2; r < limit; r++ {
			if p.IsDL(r*SymbolsPerSlot) && p.dlStart(r*SymbolsPerSlot) >= ready {
				found = true
				break
			}
		}
		if !found {
			return RoundTrips{}, fmt.Errorf("The pattern has no slot starting with a downlink symbol after the HARQ-ACK of slot %d.", s)
		}
		rt := RoundTrip{Slot: s, PDSCHEnd: last, Ack: ack, Retx: r,
			RTT: p.dlStart(r*SymbolsPerSlot) - p.dlStart(first)}
		if len(out.PerSlot) == 0 || rt.RTT < out.Min {
			out.Min, out.MinSlots = rt.RTT, r-s
		}
		if rt.RTT > out.Max {
			out.Max, out.MaxSlots = rt.RTT, r-s
		}
		sum += rt.RTT
		out.PerSlot = append(out.PerSlot, rt)
	}
	if len(out.PerSlot) == 0 {
		return RoundTrips{}, fmt.Errorf("The pattern has no slot that starts with a downlink symbol, so no PDSCH to acknowledge.")
	}
	out.Mean = float64(sum) / float64(len(out.PerSlot))
	return out, nil
}
