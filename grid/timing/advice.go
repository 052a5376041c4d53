package timing

import "fmt"

// Profile puts the two sides of a numerology's trade side by side: what its
// short symbols buy in processing time and latency, and what its short
// cyclic prefix and guard cost in range. Profiles builds one per μ.
type Profile struct {
	Mu     int
	SCSKHz int
	Slot   Tc // nominal slot, 1 ms / 2^μ
	CP     Tc // normal cyclic prefix of a symbol that does not start a half subframe, 144κ·2^−μ
	TProc1 Tc // T_proc,1 with pos0 and the Adders zero value
	TProc2 Tc // T_proc,2 with the Adders zero value (d2,1 = 1)
	// K1 and K2 are the least slot offsets the numerology meets on its own
	// (FDD, no timing advance): K1 for a PDSCH that ends with the slot, K2
	// for a PDCCH in symbols 0–1 granting a 14-symbol PUSCH.
	K1, K2 int
	// SlotLatency and MiniSlotLatency are the downlink user-plane latency on
	// FDD with a 14-symbol slot and a 2-symbol mini-slot, EvaluationProcessing
	// on each side, no retransmission.
	SlotLatency, MiniSlotLatency Latency
	// GuardRadius is the largest cell radius with two guard symbols, in
	// metres, after the N_TA,offset of the FR1 case given to Profiles
	// (μ ≤ 2) or of FR2 (μ ≥ 3: 120 kHz and above carry data only in FR2).
	GuardRadius float64
	// TARadius is the radius the random access response's timing advance
	// covers, in metres.
	TARadius float64
}

// Profiles returns a Profile for every μ at which TS 38.214 defines N1 and
// N2 for capability c (capability 1: μ 0–3, 5, 6; capability 2: μ 0–2).
// fr1 is the FR1 row of Table 7.1.2-2 for the guard radius up to 60 kHz.
func Profiles(c Capability, fr1 Coexistence) ([]Profile, error) {
	if fr1 == FR2 {
		return nil, fmt.Errorf("Profiles takes an FR1 row of TS 38.133 Table 7.1.2-2 for 15 to 60 kHz and uses FR2 above; got FR2.")
	}
	offFR1, err := NTAOffset(fr1)
	if err != nil {
		return nil, err
	}
	var out []Profile
	for mu := 0; mu <= MaxMu; mu++ {
		t1, err := TProc1(mu, c, DMRSPos0, Adders{})
		if err != nil {
			continue
		}
		t2, err := TProc2(mu, c, Adders{})
		if err != nil {
			continue
		}
		ack, err := EarliestK1(Pattern{Mu: mu}, 0, SymbolsPerSlot-1, t1)
		if err != nil {
			return nil, err
		}
		grant, err := EarliestK2(Pattern{Mu: mu}, 0, 1, SymbolsPerSlot, t2)
		if err != nil {
			return nil, err
		}
		proc, err := EvaluationProcessing(mu, c)
		if err != nil {
			return nil, err
		}
		cfg := LatencyConfig{Pattern: Pattern{Mu: mu}, Dir: Downlink, Length: SymbolsPerSlot, TxProc: proc, RxProc: proc}
		slot, err := UserPlaneLatency(cfg)
		if err != nil {
			return nil, err
		}
		cfg.Length = 2
		mini, err := UserPlaneLatency(cfg)
		if err != nil {
			return nil, err
		}
		off := offFR1
		if mu >= 3 {
			off = Table7_1_2_2[FR2]
		}
		_, ta, err := TimingAdvanceRange(mu)
		if err != nil {
			return nil, err
		}
		out = append(out, Profile{
			Mu: mu, SCSKHz: 15 << mu, Slot: SlotTc(mu), CP: Tc(144*Kappa) >> mu,
			TProc1: t1, TProc2: t2, K1: ack.K1, K2: grant.K2, SlotLatency: slot, MiniSlotLatency: mini,
			GuardRadius: MaxCellRadius(GuardTc(mu, 2), off, 0), TARadius: ta,
		})
	}
	return out, nil
}
