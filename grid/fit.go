package grid

import (
	"fmt"
	"math"
	"slices"
)

// EnvironmentPlan describes the radio channel a plan must serve, for the
// numerology fit. These are first-order rules of thumb, not a link budget.
type EnvironmentPlan struct {
	// DelaySpreadNs is the RMS delay spread; DelayProfile names one of the
	// scaling values of TR 38.901 Table 7.7.3-1 instead (see DelayProfiles).
	DelaySpreadNs float64 `json:"delaySpreadNs,omitempty" yaml:"delaySpreadNs,omitempty"`
	DelayProfile  string  `json:"delayProfile,omitempty" yaml:"delayProfile,omitempty"`
	SpeedKmh      float64 `json:"speedKmh,omitempty" yaml:"speedKmh,omitempty"`
	// CarrierMHz is the carrier frequency for the Doppler shift when the
	// plan gives no centerMHz or arfcn.
	CarrierMHz float64 `json:"carrierMHz,omitempty" yaml:"carrierMHz,omitempty"`
	// CellRadiusKm is the radius the cell must cover, judged against the
	// guard period and the timing advance range (a range warning) and in
	// the numerology advice; 0 means not stated.
	CellRadiusKm float64 `json:"cellRadiusKm,omitempty" yaml:"cellRadiusKm,omitempty"`
	// LatencyTargetMs is the one-way user-plane latency the numerology advice
	// judges against; 0 means none.
	LatencyTargetMs float64 `json:"latencyTargetMs,omitempty" yaml:"latencyTargetMs,omitempty"`
}

// DelayProfiles are the RMS delay spread scaling values of TR 38.901
// Table 7.7.3-1 (for scaling the CDL/TDL models), in ns.
var DelayProfiles = []struct {
	Name string
	Ns   float64
}{{"very-short", 10}, {"short", 30}, {"nominal", 100}, {"long", 300}, {"very-long", 1000}}

// Verdict grades how well a numerology suits the channel.
type Verdict string

// Verdicts, best first.
const (
	Suits    Verdict = "suits"
	Marginal Verdict = "marginal"
	Poor     Verdict = "poor"
)

func (v Verdict) rank() int { return slices.Index([]Verdict{Suits, Marginal, Poor}, v) }

// Criterion is one rule of thumb applied to one numerology: the ratio that
// decides it and the verdict.
type Criterion struct {
	Name    string  `json:"name"`
	Value   float64 `json:"value"` // the ratio the rule judges
	Rule    string  `json:"rule"`  // the rule, in words
	Verdict Verdict `json:"verdict"`
}

// NumerologyFit is the fit of one numerology to the channel.
type NumerologyFit struct {
	SCSKHz   int         `json:"scsKHz"`
	CP       string      `json:"cp"`
	Verdict  Verdict     `json:"verdict"`
	Criteria []Criterion `json:"criteria"`
	score    float64     // the smallest margin below a "suits" bound; larger is better
}

// Fit is the numerology fit of a plan: the channel's figures, each
// partition's fit and the numerology the rules would pick.
type Fit struct {
	DelaySpreadNs   float64         `json:"delaySpreadNs"`
	CoherenceBWKHz  float64         `json:"coherenceBandwidthKHz"` // ≈ 1/(5σ)
	SpeedKmh        float64         `json:"speedKmh"`
	CarrierMHz      float64         `json:"carrierMHz,omitempty"`
	DopplerHz       float64         `json:"dopplerHz"`       // v·f/c
	CoherenceTimeUs float64         `json:"coherenceTimeUs"` // ≈ 0.423/f_d; 0 when f_d rounds to 0 Hz
	Partitions      []NumerologyFit `json:"partitions"`      // in Result.Partitions order
	Suggested       NumerologyFit   `json:"suggested"`       // the best of the range's numerologies
	Caution         string          `json:"caution"`
}

// FitCaution goes with every fit: the rules are first-order.
const FitCaution = "First-order rules of thumb for choosing a numerology, not a link budget or a system simulation."

const speedOfLight = 299792458.0

// MinDelaySpreadNs and MaxDelaySpreadNs bound environment.delaySpreadNs.
// The lower bound keeps the coherence bandwidth 1/(5σ) finite (a spread of
// 1e-300 ns would make it infinite) and lies far below any real channel's
// spread (TR 38.901 Table 7.7.3-1 starts at 10 ns).
const (
	MinDelaySpreadNs = 0.001
	MaxDelaySpreadNs = 100000
)

// The bounds of the rules (common practice; gridloom's choice where the
// trade gives a range):
//   - CP against delay spread: the CP should exceed a few RMS spreads;
//     suits from 4σ, marginal from 2σ.
//   - SCS against coherence bandwidth B_c ≈ 1/(5σ) (50 % correlation,
//     Rappaport): each subcarrier should see flat fading; suits up to
//     B_c/10, marginal up to B_c/2.
//   - Doppler against SCS: inter-carrier interference of about
//     (π·f_d/Δf)²/3 of the signal power; suits up to f_d = 1.75 % of the
//     spacing (about −30 dB), marginal up to 5.5 % (about −20 dB).
//   - Slot against coherence time T_c ≈ 0.423/f_d (Rappaport): the channel
//     should hold over a slot; suits up to T_c/4, marginal up to T_c (more
//     DMRS symbols then).
var fitRules = []struct {
	name          string
	rule          string
	suits, margin float64 // upper bounds of the ratio for suits and marginal
	ratio         func(n Numerology, sigmaS, fd float64) float64
}{
	{"cp-vs-delay-spread", "σ/CP: suits up to 1/4 (CP ≥ 4σ), marginal up to 1/2", 0.25, 0.5,
		func(n Numerology, sigma, _ float64) float64 { return sigma / seconds(n.CPTc(1)) }},
	{"scs-vs-coherence-bandwidth", "SCS/B_c with B_c ≈ 1/(5σ): suits up to 0.1, marginal up to 0.5", 0.1, 0.5,
		func(n Numerology, sigma, _ float64) float64 { return float64(n.SCS()) * 5 * sigma }},
	{"doppler-vs-scs", "f_d/SCS: suits up to 0.0175 (ICI ≈ −30 dB), marginal up to 0.055 (≈ −20 dB)", 0.0175, 0.055,
		func(n Numerology, _, fd float64) float64 { return fd / float64(n.SCS()) }},
	{"slot-vs-coherence-time", "slot/T_c with T_c ≈ 0.423/f_d: suits up to 0.25, marginal up to 1", 0.25, 1,
		func(n Numerology, _, fd float64) float64 { return seconds(n.SlotTc()) * fd / 0.423 }},
}

func seconds(d Tc) float64 { return float64(d) / float64(TcPerSecond) }

func judge(n Numerology, sigma, fd float64) NumerologyFit {
	out := NumerologyFit{SCSKHz: n.SCSKHz(), CP: n.CP.String(), Verdict: Suits, score: math.Inf(1)}
	for _, r := range fitRules {
		v := r.ratio(n, sigma, fd)
		c := Criterion{Name: r.name, Value: math.Round(v*1e4) / 1e4, Rule: r.rule, Verdict: Suits}
		switch {
		case v > r.margin:
			c.Verdict = Poor
		case v > r.suits:
			c.Verdict = Marginal
		}
		if c.Verdict.rank() > out.Verdict.rank() {
			out.Verdict = c.Verdict
		}
		if v > 0 {
			out.score = min(out.score, math.Log(r.suits/v))
		}
		out.Criteria = append(out.Criteria, c)
	}
	return out
}

func checkFit(fs *findings, rng Range, e *EnvironmentPlan, ch Channel, ls []Lattice) (*Fit, bool) {
	sigmaNs := e.DelaySpreadNs
	if e.DelayProfile != "" {
		i := slices.IndexFunc(DelayProfiles, func(p struct {
			Name string
			Ns   float64
		}) bool {
			return p.Name == e.DelayProfile
		})
		if i < 0 {
			var names []string
			for _, p := range DelayProfiles {
				names = append(names, fmt.Sprintf("%s (%g ns)", p.Name, p.Ns))
			}
			fs.add(Error, CodeFit, "", "environment.delayProfile", "environment.delayProfile %q is not a profile; use %s (TR 38.901 Table 7.7.3-1).", e.DelayProfile, JoinOr(names))
			return nil, false
		}
		if e.DelaySpreadNs != 0 && e.DelaySpreadNs != DelayProfiles[i].Ns {
			fs.add(Error, CodeFit, "", "environment.delaySpreadNs", "environment.delaySpreadNs %g disagrees with delayProfile %s (%g ns); give one.", e.DelaySpreadNs, e.DelayProfile, DelayProfiles[i].Ns)
			return nil, false
		}
		sigmaNs = DelayProfiles[i].Ns
	}
	switch {
	case !(sigmaNs >= MinDelaySpreadNs && sigmaNs <= MaxDelaySpreadNs):
		fs.add(Error, CodeFit, "", "environment.delaySpreadNs", "environment.delaySpreadNs must be from %g to %g ns, or give environment.delayProfile.", MinDelaySpreadNs, float64(MaxDelaySpreadNs))
		return nil, false
	case !(e.SpeedKmh >= 0 && e.SpeedKmh <= 1000):
		fs.add(Error, CodeFit, "", "environment.speedKmh", "environment.speedKmh must be 0 to 1000 km/h.")
		return nil, false
	}
	fHz := 0.0
	switch {
	case ch.Absolute:
		fHz = float64(ch.CenterHz)
		if e.CarrierMHz != 0 && math.Abs(e.CarrierMHz*1e6-fHz) > 0.5 {
			fs.add(Warning, CodeFit, "", "environment.carrierMHz", "environment.carrierMHz %g differs from the carrier's centre %s; the centre is used.", e.CarrierMHz, fmtMHz(ch.CenterHz))
		}
	case e.CarrierMHz > 0 && e.CarrierMHz <= 100000:
		fHz = e.CarrierMHz * 1e6
	case e.SpeedKmh > 0:
		fs.add(Error, CodeFit, "", "environment.carrierMHz", "The Doppler shift needs the carrier frequency: give carrier.centerMHz, carrier.arfcn or environment.carrierMHz (up to 100000 MHz).")
		return nil, false
	}
	sigma := sigmaNs * 1e-9
	fd := e.SpeedKmh / 3.6 * fHz / speedOfLight
	fit := &Fit{DelaySpreadNs: sigmaNs, CoherenceBWKHz: 1 / (5 * sigma) / 1e3, SpeedKmh: e.SpeedKmh,
		CarrierMHz: fHz / 1e6, DopplerHz: math.Round(fd*100) / 100, Caution: FitCaution}
	// A Doppler shift that rounds to 0 Hz has no coherence time worth
	// reporting, and 0.423/f_d of a vanishing f_d (a speed or carrier of
	// 1e-320) would be infinite: both report 0, as for no motion.
	if fit.DopplerHz > 0 {
		fit.CoherenceTimeUs = math.Round(0.423/fd*1e6*100) / 100
	}
	for _, l := range ls {
		nf := judge(l.Numerology, sigma, fd)
		fit.Partitions = append(fit.Partitions, nf)
		if nf.Verdict == Poor {
			var why []string
			for _, c := range nf.Criteria {
				if c.Verdict == Poor {
					why = append(why, fmt.Sprintf("%s %g (%s)", c.Name, c.Value, c.Rule))
				}
			}
			fs.add(Warning, CodeFit, l.Name, fmt.Sprintf("partitions[%d].scsKHz", l.Index), "Partition %q at %d kHz %s CP suits the channel poorly by first-order rules: %s.", l.Name, nf.SCSKHz, nf.CP, JoinOr(why))
		}
	}
	var best NumerologyFit
	first := true
	for _, scs := range rng.DataSCS() {
		mu, _ := MuForSCS(scs)
		cands := []Numerology{{Mu: mu}}
		if mu == 2 {
			cands = append(cands, Numerology{Mu: 2, CP: ExtendedCP})
		}
		for _, n := range cands {
			nf := judge(n, sigma, fd)
			if first || nf.Verdict.rank() < best.Verdict.rank() || (nf.Verdict == best.Verdict && nf.score > best.score) {
				best, first = nf, false
			}
		}
	}
	fit.Suggested = best
	return fit, true
}
