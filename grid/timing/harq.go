package timing

import "fmt"

// searchLimit bounds a walk for the next symbol of a direction: the wait
// itself plus two periods, time enough to meet any direction the pattern has.
func (p Pattern) searchLimit(from int, wait Tc) int {
	return from + int(wait/(NominalSymbolTc(p.Mu))) + 1 + 2*p.CycleSymbols() + 2*SymbolsPerSlot
}

// firstULRun returns the first symbol k ≥ from whose uplink start is at or
// after t and which begins a run of n uplink symbols inside one slot. It
// starts at the first symbol late enough and, on an indexed pattern, jumps
// over downlink and flexible runs.
func (p Pattern) firstULRun(from int, t Tc, n int) (int, bool) {
	limit := p.searchLimit(from, t-p.dlStart(from)+p.ULAdvance)
	for k := max(from, firstAtOrAfter(p.Mu, t+p.ULAdvance)); k < limit; k++ {
		if p.toUL != nil {
			d := p.toUL[k%len(p.Dir)]
			if d < 0 {
				return 0, false
			}
			k += int(d)
		}
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
	return p.earliestK1(slot, lastSymbol, tproc1)
}

// earliestK1 is EarliestK1 on a checked pattern: the walks over a cycle
// check it once, not once per slot (Check reads every symbol).
func (p Pattern) earliestK1(slot, lastSymbol int, tproc1 Tc) (AckTiming, error) {
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
	return p.earliestK2(slot, lastSymbol, length, tproc2)
}

// earliestK2 is EarliestK2 on a checked pattern.
func (p Pattern) earliestK2(slot, lastSymbol, length int, tproc2 Tc) (GrantTiming, error) {
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
	p = p.indexed()
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
		ack, err := p.earliestK1(s, last, tproc1)
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

// LeastK2 returns the least K2 over the slots of one cycle that start with
// two downlink symbols, for a PDCCH in symbols 0–1 granting a PUSCH of
// length symbols in one slot (EarliestK2's rule).
func LeastK2(p Pattern, length int, tproc2 Tc) (int, error) {
	if err := p.Check(); err != nil {
		return 0, err
	}
	p = p.indexed()
	least := -1
	for s := range p.CycleSlots() {
		if !p.IsDL(s*SymbolsPerSlot) || !p.IsDL(s*SymbolsPerSlot+1) {
			continue
		}
		g, err := p.earliestK2(s, 1, length, tproc2)
		if err != nil {
			return 0, err
		}
		if least < 0 || g.K2 < least {
			least = g.K2
		}
	}
	if least < 0 {
		return 0, fmt.Errorf("The pattern has no slot that starts with two downlink symbols for a PDCCH.")
	}
	return least, nil
}

// ULRoundTrip is the uplink HARQ round trip of the PUSCH sent in one slot.
type ULRoundTrip struct {
	Slot  int         // the slot of the first transmission, within the cycle
	Grant GrantTiming // the retransmission's grant, from the slot of its PDCCH
	Retx  int         // the slot of the retransmission
	RTT   Tc          // from the start of the first PUSCH to the start of the retransmission
}

// ULRoundTrips sums up the uplink HARQ round trips of one cycle.
type ULRoundTrips struct {
	PerSlot  []ULRoundTrip
	Min, Max Tc
	Mean     float64 // Tc
}

// ULHARQRoundTrips walks every whole uplink slot of one cycle: a PUSCH
// fills it; the gNB has it at the end of the slot on its own lattice (the
// timing advance undoes the propagation), decodes it for gnbProc, and
// grants a retransmission with a PDCCH in symbols 0–1 of the first slot
// that starts with two downlink symbols no earlier than that; the new PUSCH,
// a whole slot again, goes at EarliestK2 (T_proc,2 after the PDCCH). The
// round trip runs between the two PUSCHs' slot starts on the gNB's lattice.
// gnbProc is the gNB's implementation time, which no specification fixes.
func ULHARQRoundTrips(p Pattern, tproc2, gnbProc Tc) (ULRoundTrips, error) {
	if err := p.Check(); err != nil {
		return ULRoundTrips{}, err
	}
	if gnbProc < 0 || tproc2 < 0 {
		return ULRoundTrips{}, fmt.Errorf("The processing times must be zero or more Tc; got T_proc,2 = %d and gNB processing %d.", tproc2, gnbProc)
	}
	p = p.indexed()
	const n = SymbolsPerSlot
	var out ULRoundTrips
	var sum Tc
	for s := range p.CycleSlots() {
		full := true
		for j := 0; j < n && full; j++ {
			full = p.IsUL(s*n + j)
		}
		if !full {
			continue
		}
		ready := p.dlEnd(s*n+n-1) + gnbProc
		r, found := s+1, false
		for limit := r + 2*p.CycleSlots() + int(gnbProc/SlotTc(p.Mu)) + 2; r < limit; r++ {
			if p.IsDL(r*n) && p.IsDL(r*n+1) && p.dlStart(r*n) >= ready {
				found = true
				break
			}
		}
		if !found {
			return ULRoundTrips{}, fmt.Errorf("The pattern has no slot starting with two downlink symbols for the grant after the PUSCH of slot %d.", s)
		}
		g, err := p.earliestK2(r, 1, n, tproc2)
		if err != nil {
			return ULRoundTrips{}, err
		}
		rt := ULRoundTrip{Slot: s, Grant: g, Retx: g.Symbol / n, RTT: p.dlStart(g.Symbol) - p.dlStart(s*n)}
		if len(out.PerSlot) == 0 || rt.RTT < out.Min {
			out.Min = rt.RTT
		}
		out.Max = max(out.Max, rt.RTT)
		sum += rt.RTT
		out.PerSlot = append(out.PerSlot, rt)
	}
	if len(out.PerSlot) == 0 {
		return ULRoundTrips{}, fmt.Errorf("The pattern has no whole uplink slot for a PUSCH.")
	}
	out.Mean = float64(sum) / float64(len(out.PerSlot))
	return out, nil
}
