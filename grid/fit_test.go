package grid

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"
)

// Worked by hand: 120 km/h at 3.5 GHz gives f_d = 33.33 m/s · 3.5 GHz / c
// = 389.16 Hz and a coherence time 0.423/f_d = 1087 µs (Rappaport's 50 %
// rule); the "long" delay profile of TR 38.901 Table 7.7.3-1 is 300 ns,
// for a coherence bandwidth 1/(5σ) = 666.7 kHz.
func TestFitNumbers(t *testing.T) {
	p := plan(40, part("a", 30, 1, 50), part("b", 15, 120, 60))
	p.Carrier.CenterMHz = fptr(3500.01)
	p.Carrier.CenterMHz = fptr(3500)
	p.Environment = &EnvironmentPlan{DelayProfile: "long", SpeedKmh: 120}
	r := Compute(p)
	f := r.Fit
	if f == nil {
		t.Fatalf("no fit: %v", r.Findings)
	}
	near := func(what string, got, want, tol float64) {
		t.Helper()
		if math.Abs(got-want) > tol {
			t.Errorf("%s = %v, want %v", what, got, want)
		}
	}
	near("Doppler Hz", f.DopplerHz, 389.16, 0.01)
	near("coherence time µs", f.CoherenceTimeUs, 1087, 1)
	near("coherence bandwidth kHz", f.CoherenceBWKHz, 666.67, 0.01)
	near("delay spread ns", f.DelaySpreadNs, 300, 0)

	// 30 kHz: σ/CP = 0.3/2.344 = 0.128 (suits); SCS/B_c = 0.045 (suits);
	// f_d/SCS = 0.013 (suits); slot/T_c = 500/1087 = 0.46 (marginal).
	a := f.Partitions[0]
	wantVerdicts := map[string]Verdict{"cp-vs-delay-spread": Suits, "scs-vs-coherence-bandwidth": Suits, "doppler-vs-scs": Suits, "slot-vs-coherence-time": Marginal}
	for _, c := range a.Criteria {
		if c.Verdict != wantVerdicts[c.Name] {
			t.Errorf("30 kHz %s = %v: %s, want %s", c.Name, c.Value, c.Verdict, wantVerdicts[c.Name])
		}
	}
	if a.Verdict != Marginal {
		t.Errorf("30 kHz verdict %s, want marginal", a.Verdict)
	}
	// 60 kHz with the extended CP (4.17 µs) keeps every rule: σ/CP 0.072,
	// SCS/B_c 0.09, f_d/SCS 0.0065, slot/T_c 0.23. Normal-CP 60 kHz misses
	// the CP rule by a hair (σ/CP = 0.256), so the extended CP is the pick.
	if s := f.Suggested; s.SCSKHz != 60 || s.CP != "extended" || s.Verdict != Suits {
		t.Errorf("suggested %d kHz %s CP (%s), want 60 kHz extended (suits)", s.SCSKHz, s.CP, s.Verdict)
	}
	if !strings.Contains(f.Caution, "not a link budget") {
		t.Errorf("caution %q", f.Caution)
	}
}

// 960 kHz has a 73 ns CP: against a 1000 ns spread it is poor, and a
// finding says so.
func TestFitPoor(t *testing.T) {
	p := Plan{Carrier: CarrierPlan{Range: "FR2-2", BandwidthMHz: 2000, CenterMHz: fptr(60480)},
		Partitions:  []PartitionPlan{{Name: "wide", SCSKHz: 960, SizePRB: 100}},
		Environment: &EnvironmentPlan{DelaySpreadNs: 1000}}
	r := Compute(p)
	if f := findCode(r, CodeFit); f == nil || f.Severity != Warning || !strings.Contains(f.Message, "cp-vs-delay-spread") {
		t.Errorf("want a fit warning on the CP; got %v", r.Findings)
	}
}

func TestFitRefused(t *testing.T) {
	for _, c := range []struct {
		env   EnvironmentPlan
		field string
	}{
		{EnvironmentPlan{DelayProfile: "medium"}, "environment.delayProfile"},
		{EnvironmentPlan{DelaySpreadNs: -5}, "environment.delaySpreadNs"},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 5000}, "environment.speedKmh"},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 50}, "environment.carrierMHz"}, // no frequency anywhere
		{EnvironmentPlan{DelayProfile: "short", DelaySpreadNs: 31}, "environment.delaySpreadNs"},
	} {
		p := plan(40, part("a", 30, 1, 50))
		env := c.env
		p.Environment = &env
		r := Compute(p)
		if f := findCode(r, CodeFit); f == nil || f.Field != c.field || f.Severity != Error {
			t.Errorf("%+v: want a fit error on %s; got %v", c.env, c.field, r.Findings)
		}
	}
}

// Extreme but finite inputs: every number the fit derives is finite, or
// the input is refused with an error naming its field. Before the bounds,
// a spread of 1e-300 ns made the coherence bandwidth +Inf and a speed of
// 1e-320 km/h the coherence time.
func TestFitExtremeNumbers(t *testing.T) {
	for _, c := range []struct {
		env     EnvironmentPlan
		centre  bool
		refused string // the field of the fit error, or "" when judged
	}{
		{EnvironmentPlan{DelaySpreadNs: 1e-300}, true, "environment.delaySpreadNs"},
		{EnvironmentPlan{DelaySpreadNs: 5e-324}, true, "environment.delaySpreadNs"},
		{EnvironmentPlan{DelaySpreadNs: 0.0009}, true, "environment.delaySpreadNs"},
		{EnvironmentPlan{DelaySpreadNs: 0.001}, true, ""}, // the lower bound itself
		{EnvironmentPlan{DelaySpreadNs: 100000}, true, ""},
		{EnvironmentPlan{DelaySpreadNs: 100000.01}, true, "environment.delaySpreadNs"},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 1e-320}, true, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 5e-324}, true, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 1e-300}, true, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 1000}, true, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 1000, CarrierMHz: 5e-324}, false, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 5e-324, CarrierMHz: 5e-324}, false, ""},
		{EnvironmentPlan{DelaySpreadNs: 100, SpeedKmh: 1, CarrierMHz: 100000}, false, ""},
		{EnvironmentPlan{DelaySpreadNs: 5e-324, SpeedKmh: 5e-324, CarrierMHz: 5e-324}, true, "environment.delaySpreadNs"},
	} {
		p := plan(40, part("a", 30, 1, 50))
		if c.centre {
			p.Carrier.CenterMHz = fptr(3500.01) // on the 15 kHz raster
		}
		env := c.env
		p.Environment = &env
		r := Compute(p)
		f := findCode(r, CodeFit)
		if c.refused != "" {
			if f == nil || f.Field != c.refused || f.Severity != Error || r.Fit != nil {
				t.Errorf("%+v: want a fit error on %s and no fit; got %v", c.env, c.refused, r.Findings)
			}
			continue
		}
		if r.Fit == nil {
			t.Errorf("%+v: no fit: %v", c.env, r.Findings)
			continue
		}
		fit := r.Fit
		nums := map[string]float64{"delaySpreadNs": fit.DelaySpreadNs, "coherenceBandwidthKHz": fit.CoherenceBWKHz,
			"speedKmh": fit.SpeedKmh, "carrierMHz": fit.CarrierMHz, "dopplerHz": fit.DopplerHz, "coherenceTimeUs": fit.CoherenceTimeUs}
		for _, nf := range append(slices.Clone(fit.Partitions), fit.Suggested) {
			for _, cr := range nf.Criteria {
				nums[fmt.Sprintf("%d kHz %s", nf.SCSKHz, cr.Name)] = cr.Value
			}
		}
		for name, v := range nums {
			if math.IsInf(v, 0) || math.IsNaN(v) {
				t.Errorf("%+v: %s = %v, want a finite number", c.env, name, v)
			}
		}
	}
}
