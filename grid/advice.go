package grid

import (
	"fmt"
	"math"
	"strings"

	"gridloom/grid/timing"
)

// Advice weighs every numerology the range allows against the plan's
// environment: the channel (the fit's rules of thumb), the latency target,
// and the cell radius against the guard period and the timing advance. It
// names the numerology that satisfies every criterion, or why none does.
type Advice struct {
	Rows   []AdviceRow   `json:"rows"`
	Chosen *AdviceChoice `json:"chosen"` // nil when no row suits every criterion
	Reason string        `json:"reason"` // why Chosen, or why none
	// Capability is the UE processing capability the latency assumes: 2
	// when every partition asks for it, else 1, so the advice holds for
	// every UE the plan serves.
	Capability int    `json:"ueCapability"`
	Caution    string `json:"caution"`
}

// AdviceChoice names a numerology.
type AdviceChoice struct {
	SCSKHz int    `json:"scsKHz"`
	CP     string `json:"cp"`
}

// AdviceRow is one numerology with every criterion's number and verdict.
// The latency is that of 14-symbol slots on the plan's TDD pattern (or
// FDD) at this spacing, without retransmission; MiniSlot2 the same with
// 2-symbol mini-slots, for comparison. MaxCellRadiusKm is the guard's
// range (TDD only), TimingAdvanceKm the random access response's.
type AdviceRow struct {
	SCSKHz          int            `json:"scsKHz"`
	CP              string         `json:"cp"`
	Verdict         Verdict        `json:"verdict"`
	Criteria        []Criterion    `json:"criteria"`
	LatencyUs       *AdviceLatency `json:"latencyUs,omitempty"`
	MiniSlot2Us     *AdviceLatency `json:"miniSlot2LatencyUs,omitempty"`
	MaxCellRadiusKm *float64       `json:"maxCellRadiusKm,omitempty"`
	TimingAdvanceKm float64        `json:"timingAdvanceKm"`
	Note            string         `json:"note,omitempty"`
	score           float64
}

// AdviceLatency is a latency of both directions in µs, rounded to 0.1.
type AdviceLatency struct {
	DL MeanWorst `json:"dl"`
	UL MeanWorst `json:"ul"`
}

// MeanWorst is a latency averaged over arrival times and its worst case, µs.
type MeanWorst struct {
	Mean  float64 `json:"mean"`
	Worst float64 `json:"worst"`
}

// AdviceCaution goes with every advice.
const AdviceCaution = "First-order rules and an estimate of the air-interface latency only (see the latency assumptions), not a link budget or a system simulation."

// Bounds of the advice's own criteria (gridloom's choice): a cell radius
// suits up to 80 % of what the guard or the timing advance allows and is
// marginal up to 100 %; a latency suits when the worst case meets the
// target and is marginal when only the mean does.
const radiusSuits, radiusMarginal = 0.8, 1.0

// wantsFit reports whether the environment asks for the channel fit: it
// does unless it gives only the timing keys.
func wantsFit(e *EnvironmentPlan) bool {
	return e.DelaySpreadNs != 0 || e.DelayProfile != "" || e.SpeedKmh != 0 || e.CarrierMHz != 0 ||
		(e.CellRadiusKm == 0 && e.LatencyTargetMs == 0)
}

// computeAdvice builds the advice when the plan has an environment.
func computeAdvice(rng Range, e *EnvironmentPlan, in timingIn, fit *Fit, res *Result) *Advice {
	c := timing.Cap2
	for _, l := range res.Partitions {
		if in.caps[l.Index] != timing.Cap2 {
			c = timing.Cap1
		}
	}
	if len(res.Partitions) == 0 {
		c = timing.Cap1
	}
	adv := &Advice{Capability: int(c), Caution: AdviceCaution}
	var sigma, fd float64
	if fit != nil {
		sigma, fd = fit.DelaySpreadNs*1e-9, fit.DopplerHz
	}
	target := e.LatencyTargetMs * float64(TcPerSubframe) // in Tc
	for _, scs := range rng.DataSCS() {
		mu, _ := MuForSCS(scs)
		ns := []Numerology{{Mu: mu}}
		if mu == 2 {
			ns = append(ns, Numerology{Mu: 2, CP: ExtendedCP})
		}
		for _, n := range ns {
			adv.Rows = append(adv.Rows, adviceRow(rng, n, c, fit != nil, sigma, fd, target, in, res))
		}
	}
	var best *AdviceRow
	for i := range adv.Rows {
		r := &adv.Rows[i]
		if r.Verdict == Suits && (best == nil || r.score > best.score) {
			best = r
		}
	}
	if best != nil {
		adv.Chosen = &AdviceChoice{SCSKHz: best.SCSKHz, CP: best.CP}
		adv.Reason = fmt.Sprintf("%d kHz %s CP suits every criterion with the widest margin.", best.SCSKHz, best.CP)
		return adv
	}
	var why []string
	for _, r := range adv.Rows {
		var bad []string
		for _, c := range r.Criteria {
			if c.Verdict != Suits {
				bad = append(bad, fmt.Sprintf("%s %s", c.Name, c.Verdict))
			}
		}
		why = append(why, fmt.Sprintf("%d kHz %s CP: %s", r.SCSKHz, r.CP, strings.Join(bad, ", ")))
	}
	adv.Reason = "No numerology suits every criterion: " + strings.Join(why, "; ") + "."
	return adv
}

func adviceRow(rng Range, n Numerology, c timing.Capability, hasFit bool, sigma, fd, target float64, in timingIn, res *Result) AdviceRow {
	row := AdviceRow{SCSKHz: n.SCSKHz(), CP: n.CP.String(), Verdict: Suits, Criteria: []Criterion{}, score: math.Inf(1)}
	if hasFit {
		nf := judge(n, sigma, fd)
		row.Criteria = append(row.Criteria, nf.Criteria...)
		row.score = nf.score
	}
	rc := c
	if _, err := timing.N1(n.Mu, rc, timing.DMRSPos0); err != nil || (rng.FR2() && n.Mu == 2) {
		rc = timing.Cap1
	}
	p, ok := timingPattern(res.TDD, n.Mu, 0)
	if !ok {
		row.Note = fmt.Sprintf("The TDD period is not a whole number of %d kHz slots, so the pattern cannot be kept at this spacing (TS 38.213 11.1).", n.SCSKHz())
	}
	proc, err := timing.EvaluationProcessing(n.Mu, rc)
	var dl, ul, dl2, ul2 *OneWay
	if ok && err == nil {
		dl, ul = oneWay(p, timing.Downlink, timing.SymbolsPerSlot, proc, 0), oneWay(p, timing.Uplink, timing.SymbolsPerSlot, proc, 0)
		dl2, ul2 = oneWay(p, timing.Downlink, 2, proc, 0), oneWay(p, timing.Uplink, 2, proc, 0)
		row.LatencyUs = adviceLatency(dl, ul)
		row.MiniSlot2Us = adviceLatency(dl2, ul2)
	}
	if target > 0 {
		cr := Criterion{Name: "latency-target", Rule: fmt.Sprintf("one-way latency of a slot against %g ms, the worse direction: suits when the worst case meets it, marginal when only the mean does", target/float64(TcPerSubframe))}
		switch {
		case !ok:
			cr.Verdict = Poor
			cr.Rule += "; the TDD pattern cannot be kept at this spacing, so no value"
		case dl == nil || ul == nil:
			cr.Verdict = Poor
			cr.Rule += "; the pattern gives this spacing no slot in one direction, so no value"
		default:
			worst := float64(max(dl.Worst, ul.Worst))
			mean := max(dl.Mean, ul.Mean)
			cr.Value = round4(worst / target)
			cr.Rule += " (the value is worst/target)"
			switch {
			case worst <= target:
				cr.Verdict = Suits
			case mean <= target:
				cr.Verdict = Marginal
			default:
				cr.Verdict = Poor
			}
			row.score = min(row.score, math.Log(target/worst))
		}
		row.Criteria = append(row.Criteria, cr)
	}
	_, taRadius, _ := timing.TimingAdvanceRange(n.Mu)
	row.TimingAdvanceKm = round4(taRadius / 1000)
	var guardRadius float64
	hasGuard := false
	if ok && res.TDD != nil {
		if g, _, found := shortestGuard(p); found {
			off := timing.Tc(in.off)
			guardRadius = timing.MaxCellRadius(timing.Tc(g), off, timing.RxTxTransition(rng.FR2()))
			hasGuard = true
			km := round4(guardRadius / 1000)
			row.MaxCellRadiusKm = &km
		}
	}
	if in.radius > 0 {
		if hasGuard {
			row.Criteria = append(row.Criteria, radiusCriterion("cell-radius-vs-guard", "cell radius / the radius the TDD guard allows after N_TA,offset and the UE's Rx-to-Tx switch: suits up to 0.8, marginal up to 1", in.radius, guardRadius, &row.score))
		}
		row.Criteria = append(row.Criteria, radiusCriterion("cell-radius-vs-timing-advance", "cell radius / the radius the random access response's timing advance covers (TS 38.213 4.2): suits up to 0.8, marginal up to 1", in.radius, taRadius, &row.score))
	}
	for _, cr := range row.Criteria {
		if cr.Verdict.rank() > row.Verdict.rank() {
			row.Verdict = cr.Verdict
		}
	}
	return row
}

func radiusCriterion(name, rule string, radius, limit float64, score *float64) Criterion {
	cr := Criterion{Name: name, Rule: rule, Verdict: Suits}
	if limit > 0 {
		cr.Value = round4(radius / limit)
		*score = min(*score, math.Log(radiusSuits*limit/radius))
	} else {
		cr.Rule += "; the guard allows no radius at all, so no value"
	}
	switch v := radius / limit; {
	case limit <= 0 || v > radiusMarginal:
		cr.Verdict = Poor
	case v > radiusSuits:
		cr.Verdict = Marginal
	}
	return cr
}

func adviceLatency(dl, ul *OneWay) *AdviceLatency {
	if dl == nil || ul == nil {
		return nil
	}
	us := func(t float64) float64 { return math.Round(t*1e7/float64(TcPerSecond)) / 10 }
	return &AdviceLatency{DL: MeanWorst{us(dl.Mean), us(float64(dl.Worst))}, UL: MeanWorst{us(ul.Mean), us(float64(ul.Worst))}}
}

func round4(v float64) float64 { return math.Round(v*1e4) / 1e4 }
