package timing

import (
	"fmt"
	"math"
)

// Direction is the direction of a user-plane transfer.
type Direction uint8

// Directions.
const (
	Downlink Direction = iota
	Uplink
)

func (d Direction) String() string {
	if d == Uplink {
		return "uplink"
	}
	return "downlink"
}

// LatencyConfig describes one user-plane transfer in the structure of the
// IMT-2020 evaluation (ITU-R M.2412; 3GPP TR 37.910 §5.7.1): the sender's
// processing, the alignment to the next transmission opportunity, the
// transmission, and the receiver's processing; optionally HARQ
// retransmissions. It estimates the air-interface part only: no core
// network, no scheduling request (an uplink transfer uses a configured
// grant, one of the TR's uplink cases), no queueing behind other users.
type LatencyConfig struct {
	Pattern Pattern
	Dir     Direction
	// Length is the transmission's length in symbols: 14 for a slot, which
	// starts at symbol 0 of a slot; 2, 4 or 7 for a mini-slot (PDSCH/PUSCH
	// mapping type B), which may start at any symbol whose run of Length
	// symbols of the direction stays in one slot. Any length 1–14 is taken.
	Length int
	// TxProc is the sender's processing before the transmission (t_BS,tx for
	// downlink, t_UE,tx for uplink) and RxProc the receiver's after it
	// (t_UE,rx, t_BS,rx). No specification fixes them; EvaluationProcessing
	// gives the value this package uses when told nothing.
	TxProc, RxProc Tc
	// RetxProb is the probability that a transmission fails and is
	// retransmitted (the TR evaluates p = 0.1, from memory); HARQRTT the time one
	// retransmission adds, e.g. a RoundTrips.Max; MaxRetx how many
	// retransmissions at most (the TR counts one; 0 means 1 when RetxProb > 0).
	RetxProb float64
	HARQRTT  Tc
	MaxRetx  int
}

// Latency is the one-way user-plane latency of a LatencyConfig over a
// packet arriving at a time uniform over the pattern's cycle.
type Latency struct {
	// Best, Mean and Worst are the latency without retransmission (T0):
	// for a packet ready exactly at an opportunity, averaged over arrival
	// times, and the supremum, for a packet ready just after an
	// opportunity began. Mean is in Tc but need not be whole.
	Best, Worst Tc
	Mean        float64
	// WithHARQ is Mean plus the expected retransmission time,
	// Σ P(n)·n·HARQRTT with P(n) = p^n(1−p) for n < MaxRetx and p^MaxRetx
	// for n = MaxRetx (the last attempt is taken to succeed).
	WithHARQ float64
	// Opportunities is the number of transmission starts in one cycle.
	Opportunities int
}

// EvaluationProcessing is the processing time this package assumes on each
// side when the caller has no better figure: half of N1 of the capability at
// μ (TS 38.214 Table 5.3-1/5.3-2, pos0), in (2048 + 144)·κ·2^−μ symbols.
// TR 37.910 §5.7.1 expresses the processing terms in OFDM symbols tied to
// the UE capability (from memory; the TR's tables were not at hand when this
// was written), so treat this as an assumption to override, not a quote.
func EvaluationProcessing(mu int, c Capability) (Tc, error) {
	n1, err := N1(mu, c, DMRSPos0)
	if err != nil {
		return 0, err
	}
	return HalfSymbols(n1).Tc(mu) / 2, nil
}

type opportunity struct{ start, end Tc }

// eachOpportunity calls f with the transmission opportunities of one
// cycle, latest first. It walks the cycle backwards once, counting the run
// of symbols of the direction that starts at each symbol and stays in its
// slot, and keeps no list: the cycle of a 960 kHz pattern holds thousands.
func (c LatencyConfig) eachOpportunity(f func(opportunity)) {
	p := c.Pattern
	is := p.IsDL
	if c.Dir == Uplink {
		is = p.IsUL
	}
	run := 0
	for k := p.CycleSymbols() - 1; k >= 0; k-- {
		l := k % SymbolsPerSlot
		switch {
		case !is(k):
			run = 0
		case l == SymbolsPerSlot-1:
			run = 1
		default:
			run++
		}
		if run >= c.Length && (c.Length != SymbolsPerSlot || l == 0) {
			f(opportunity{p.dlStart(k), p.dlEnd(k + c.Length - 1)})
		}
	}
}

// UserPlaneLatency computes the latency of c. Times are on the gNB's
// lattice for both directions (an uplink symbol arrives at the gNB where the
// lattice puts it, the timing advance having undone the propagation).
//
// With the opportunities s_i of one cycle P (CycleTc), gaps g_i = s_i − s_{i−1}
// (cyclic) and durations d_i, a packet ready in (s_{i−1}, s_i] waits
// s_i − t and is sent in d_i, so
//
//	Mean  = TxProc + RxProc + Σ g_i·(g_i/2 + d_i) / P
//	Worst = TxProc + RxProc + max(g_i + d_i)
//	Best  = TxProc + RxProc + min(d_i)
func UserPlaneLatency(c LatencyConfig) (Latency, error) {
	if err := c.Pattern.Check(); err != nil {
		return Latency{}, err
	}
	if c.Length < 1 || c.Length > SymbolsPerSlot {
		return Latency{}, fmt.Errorf("The transmission length must be 1 to 14 symbols (a slot, or a mini-slot of 2, 4 or 7); got %d.", c.Length)
	}
	if c.TxProc < 0 || c.RxProc < 0 || c.HARQRTT < 0 {
		return Latency{}, fmt.Errorf("The processing times and the HARQ round trip must be zero or more Tc.")
	}
	if !(c.RetxProb >= 0 && c.RetxProb < 1) {
		return Latency{}, fmt.Errorf("The retransmission probability must be at least 0 and below 1; got %g.", c.RetxProb)
	}
	if c.MaxRetx < 0 {
		return Latency{}, fmt.Errorf("The number of retransmissions must be zero or more; got %d.", c.MaxRetx)
	}
	period := c.Pattern.CycleTc()
	fixed := c.TxProc + c.RxProc
	out := Latency{Best: math.MaxInt64}
	var num float64 // Σ g_i·(g_i/2 + d_i), in Tc²
	// term adds opportunity o, whose predecessor starts at prev.
	term := func(o opportunity, prev Tc) {
		g, d := o.start-prev, o.end-o.start
		num += float64(g) * (float64(g)/2 + float64(d))
		out.Worst = max(out.Worst, fixed+g+d)
		out.Best = min(out.Best, fixed+d)
	}
	// Latest first: each opportunity closes the term of the one after it;
	// the earliest closes with the latest of the cycle before.
	var latest, later opportunity
	c.eachOpportunity(func(o opportunity) {
		if out.Opportunities == 0 {
			latest = o
		} else {
			term(later, o.start)
		}
		later = o
		out.Opportunities++
	})
	if out.Opportunities == 0 {
		return Latency{}, fmt.Errorf("The pattern has no run of %d %s symbols in one slot to transmit in.", c.Length, c.Dir)
	}
	term(later, latest.start-period)
	out.Mean = float64(fixed) + num/float64(period)
	out.WithHARQ = out.Mean + ExpectedRetxTime(c.RetxProb, c.MaxRetx, c.HARQRTT)
	return out, nil
}

// ExpectedRetxTime is the mean time that retransmissions add:
// Σ_{n=1..N} n·P(n)·rtt with P(n) = p^n(1−p) for n < N and p^N for n = N.
// With N = 1 (also when maxRetx is 0) it is p·rtt, the TR 37.910 form
// T = T0 + p·T_HARQ.
func ExpectedRetxTime(p float64, maxRetx int, rtt Tc) float64 {
	if maxRetx < 1 {
		maxRetx = 1
	}
	var e float64
	pn := 1.0
	for n := 1; n <= maxRetx; n++ {
		pn *= p
		prob := pn * (1 - p)
		if n == maxRetx {
			prob = pn
		}
		e += float64(n) * prob * float64(rtt)
	}
	return e
}
