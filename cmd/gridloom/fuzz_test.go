package main

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
)

// FuzzPipeline runs the command line's whole path, decode → compute →
// JSON, SVG and CSV, on any input: it fails on a panic, on any float of
// the result that is not finite (the JSON encoder refuses them and the
// page would show "+Inf kHz"), and on any encoding error for a plan the
// decoder accepted. The seeds are the demo plans, the initial-access and
// PRACH plans, the hostile corpus and the extreme numbers that once made the
// numerology fit infinite.
func FuzzPipeline(f *testing.F) {
	for _, glob := range []string{"../../grid/demo/*.yaml", "../../testdata/initial/*.yaml", "../../testdata/prach/*.yaml", "../../testdata/stress/fr2-1-initial-access.yaml", "../../testdata/hostile/*.json", "../../testdata/hostile/*.yaml"} {
		files, err := filepath.Glob(glob)
		if err != nil {
			f.Fatal(err)
		}
		for _, path := range files {
			data, err := os.ReadFile(path)
			if err != nil {
				f.Fatal(err)
			}
			f.Add(data)
		}
	}
	for _, env := range []string{
		`{delaySpreadNs: 1e-300}`,
		`{delaySpreadNs: 100, speedKmh: 1e-320}`,
		`{delaySpreadNs: 5e-324, speedKmh: 5e-324, carrierMHz: 5e-324}`,
		`{delaySpreadNs: 100, speedKmh: 1000, carrierMHz: 5e-324}`,
	} {
		f.Add([]byte("carrier: {bandwidthMHz: 40, centerMHz: 3500.01}\npartitions: [{name: a, scsKHz: 30, sizePrb: 50}]\nenvironment: " + env + "\n"))
	}
	f.Add([]byte(`{"numerologyGapKHz":5e-324,"carrier":{"bandwidthMHz":40,"centerMHz":5e-324},"tdd":{"referenceScsKHz":15,"pattern1":{"periodMs":5e-324}},"partitions":[{"name":"a","scsKHz":15,"sizePrb":5}]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := planfile.Decode(data)
		if err != nil {
			if err.Error() == "" {
				t.Fatal("a refusal with no message")
			}
			return
		}
		checkPipeline(t, p)
	})
}

// FuzzPipelineNumbers reaches the numbers byte mutations of a plan file
// seldom make: any finite value in the environment, the numerology gap and
// the centre of the campus demo plan, from 5e-324 to 1.8e308 and below
// zero. The decoder refuses only NaN and infinities; the engine must take
// every other value to a finite result or a finding.
func FuzzPipelineNumbers(f *testing.F) {
	data, err := os.ReadFile("../../grid/demo/campus.yaml")
	if err != nil {
		f.Fatal(err)
	}
	base, err := planfile.Decode(data)
	if err != nil {
		f.Fatal(err)
	}
	f.Add(1e-300, 0.0, 0.0, 360.0, 3750.0, "")
	f.Add(100.0, 1e-320, 0.0, 360.0, 3750.0, "")
	f.Add(5e-324, 5e-324, 5e-324, 5e-324, 5e-324, "")
	f.Add(0.0, 1000.0, 5e-324, 1e308, 3750.0, "long")
	f.Add(1e5, 1000.0, 1e5, -1.0, 24250.08, "very-short")
	f.Fuzz(func(t *testing.T, spreadNs, speedKmh, carrierMHz, gapKHz, centreMHz float64, profile string) {
		for _, v := range []float64{spreadNs, speedKmh, carrierMHz, gapKHz, centreMHz} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return // the decoder refuses these before the engine sees them
			}
		}
		p := base.Clone()
		p.Environment = &grid.EnvironmentPlan{DelaySpreadNs: spreadNs, DelayProfile: profile, SpeedKmh: speedKmh, CarrierMHz: carrierMHz}
		p.NumerologyGapKHz = &gapKHz
		p.Carrier.CenterMHz = &centreMHz
		checkPipeline(t, p)
		p.Carrier.CenterMHz, p.Carrier.ARFCN = nil, nil // the Doppler from environment.carrierMHz
		checkPipeline(t, p)
	})
}

// checkPipeline computes p and writes it in every format the command line
// writes, failing on a float that is not finite and on any error.
func checkPipeline(t *testing.T, p grid.Plan) {
	t.Helper()
	res := grid.Compute(p)
	if path := nonFinite(reflect.ValueOf(res), "Result"); path != "" {
		t.Fatalf("%s is not finite", path)
	}
	var buf bytes.Buffer
	if err := writeJSON(&buf, res); err != nil {
		t.Fatalf("JSON: %v", err)
	}
	plan, err := planfile.EncodeJSON(p)
	if err != nil {
		t.Fatalf("the plan as JSON: %v", err)
	}
	buf.Reset()
	if err := render.Figure(&buf, res, render.Options{Plan: plan}); err != nil {
		t.Fatalf("SVG: %v", err)
	}
	buf.Reset()
	if err := render.SymbolCSV(&buf, res); err != nil {
		t.Fatalf("CSV: %v", err)
	}
}

// nonFinite returns the path of the first float in v, exported or not,
// that is NaN or infinite, or "".
func nonFinite(v reflect.Value, path string) string {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return fmt.Sprintf("%s = %v", path, f)
		}
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			return nonFinite(v.Elem(), path)
		}
	case reflect.Struct:
		for i := range v.NumField() {
			if s := nonFinite(v.Field(i), path+"."+v.Type().Field(i).Name); s != "" {
				return s
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			if s := nonFinite(v.Index(i), fmt.Sprintf("%s[%d]", path, i)); s != "" {
				return s
			}
		}
	case reflect.Map:
		it := v.MapRange()
		for it.Next() {
			if s := nonFinite(it.Value(), fmt.Sprintf("%s[%v]", path, it.Key())); s != "" {
				return s
			}
		}
	}
	return ""
}
