package prach

import "fmt"

// SpeedOfLight is c in m/s (exact by the SI definition of the metre).
const SpeedOfLight = 299792458

// Range gives the cell radii, in metres, that a preamble allows, each from
// the round trip 2r/c it can absorb.
type Range struct {
	// CP is c·T_CP/2: a round trip longer than the cyclic prefix breaks the
	// preamble's cyclic structure at the receiver.
	CP float64
	// Guard is c·T_GP/2 with T_GP the time after the preamble within what the
	// occasion holds (Occasion.GuardTc); a later arrival spills into the next
	// symbols. Zero when the occasion leaves no time after the preamble (the
	// A formats, packed back to back, whose spill lands in the next
	// occasion's cyclic prefix); Limit then ignores it.
	Guard float64
	// ZeroCorrelation is c·N_CS·T_seq/(2·L_RA): a round trip longer than one
	// cyclic shift makes a preamble alias onto its neighbour's shift. It is
	// 0 when N_CS = 0 (a single preamble per root; no limit from the shift).
	ZeroCorrelation float64
	// Limit is the smallest of the three that apply (Guard only when
	// positive, ZeroCorrelation only when N_CS > 0), before any allowance for
	// delay spread. Taking the minimum is common practice, not a 3GPP rule.
	Limit float64
}

// metres turns a one-way time of t Tc into c·t/2 metres for a round trip.
func metres(t int64) float64 {
	return float64(SpeedOfLight) * float64(t) / (2 * float64(TcPerSecond))
}

// ZeroCorrelationRange is r = c·N_CS·T_seq/(2·L_RA) in metres, with T_seq =
// 1/Δf^RA: the round trip a cyclic shift of N_CS samples of an L_RA-long
// sequence absorbs. The formula is the usual reading of TS 38.211 6.3.3.1
// (N_CS samples of a sequence lasting T_seq), common practice.
func ZeroCorrelationRange(p Preamble, mu, ncs int) float64 {
	seq := p.SequenceTc(mu)
	return float64(SpeedOfLight) * float64(ncs) * float64(seq) / (2 * float64(p.LRA) * float64(TcPerSecond))
}

// CellRange returns the radii of occasion o's preamble with cyclic shift
// N_CS (see NCS).
func CellRange(o Occasion, ncs int) (Range, error) {
	p, err := PreambleOf(o.Format)
	if err != nil {
		return Range{}, err
	}
	if ncs < 0 || ncs >= p.LRA {
		return Range{}, fmt.Errorf("N_CS is %d; it must be 0 to %d for L_RA = %d", ncs, p.LRA-1, p.LRA)
	}
	r := Range{CP: metres(o.CPTc), ZeroCorrelation: ZeroCorrelationRange(p, o.Mu, ncs)}
	if g := o.GuardTc(); g > 0 {
		r.Guard = metres(g)
	}
	r.Limit = r.CP
	if r.Guard > 0 && r.Guard < r.Limit {
		r.Limit = r.Guard
	}
	if ncs > 0 && r.ZeroCorrelation < r.Limit {
		r.Limit = r.ZeroCorrelation
	}
	return r, nil
}
