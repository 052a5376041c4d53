package planfile

import (
	"errors"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/report"
)

const campusYAML = `
name: Test campus
spanMs: 2
carrier:
  range: FR1
  band: n78
  bandwidthMHz: 40
  centerMHz: 3750.0
  offsetToCarrier: {15: 0, "30": 1}
partitions:
  - name: sensors
    scsKHz: 15
    startCrb: 0
    sizePrb: 48
  - name: video
    scsKHz: 30
    locationAndBandwidth: 13500
    direction: DL
    layers: 2
    modulation: 256QAM
`

const campusJSON = `{
  "name": "Test campus", "spanMs": 2,
  "carrier": {"range": "FR1", "band": "n78", "bandwidthMHz": 40, "centerMHz": 3750.0, "offsetToCarrier": {"15": 0, "30": 1}},
  "partitions": [
    {"name": "sensors", "scsKHz": 15, "startCrb": 0, "sizePrb": 48},
    {"name": "video", "scsKHz": 30, "locationAndBandwidth": 13500, "direction": "DL", "layers": 2, "modulation": "256QAM"}
  ]
}`

func TestJSONAndYAMLAgree(t *testing.T) {
	fromYAML, err := DecodeYAML([]byte(campusYAML))
	if err != nil {
		t.Fatal(err)
	}
	fromJSON, err := DecodeJSON([]byte(campusJSON))
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(fromYAML, fromJSON) {
		t.Errorf("YAML and JSON of one plan differ:\nYAML %+v\nJSON %+v", fromYAML, fromJSON)
	}
	if fromJSON.Carrier.OffsetToCarrier[30] != 1 || fromJSON.Carrier.Band != "n78" || *fromJSON.Partitions[1].LocationAndBandwidth != 13500 {
		t.Errorf("decoded %+v", fromJSON)
	}
	if got, _ := Decode([]byte(campusJSON)); !reflect.DeepEqual(got, fromJSON) {
		t.Error("Decode did not take JSON for JSON")
	}
}

func TestRoundTrip(t *testing.T) {
	p, err := DecodeYAML([]byte(campusYAML))
	if err != nil {
		t.Fatal(err)
	}
	for name, enc := range map[string]func(grid.Plan) ([]byte, error){"json": EncodeJSON, "yaml": EncodeYAML} {
		b, err := enc(p)
		if err != nil {
			t.Fatal(err)
		}
		back, err := Decode(b)
		if err != nil {
			t.Fatalf("%s: decoding what was encoded: %v\n%s", name, err, b)
		}
		if !reflect.DeepEqual(back, p) {
			t.Errorf("%s round trip changed the plan:\n%s", name, b)
		}
	}
}

func TestDemoPlansDecode(t *testing.T) {
	files, _ := filepath.Glob("../demo/*.yaml")
	if len(files) < 3 {
		t.Fatalf("found %d demo plans, want at least 3", len(files))
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := Decode(data)
		if err != nil {
			t.Errorf("%s: %v", f, err)
			continue
		}
		if r := grid.Compute(p); r.HasErrors() {
			t.Errorf("%s: demo plan has errors: %v", f, r.Findings)
		}
	}
}

func TestDecodeErrorsNameTheField(t *testing.T) {
	for _, c := range []struct {
		name, doc, field, say string
	}{
		{"unknown top key", `{"name":"x","carier":{}}`, "carier", `unknown key "carier"`},
		{"unknown partition key", `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":15,"size":3}]}`, "partitions[0].size", "sizePrb"},
		{"string for number", `{"carrier":{"bandwidthMHz":"forty"}}`, "carrier.bandwidthMHz", `the text "forty"`},
		{"fraction for count", `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":15,"sizePrb":2.5}]}`, "partitions[0].sizePrb", "whole number"},
		{"huge number", `{"carrier":{"bandwidthMHz":1e300}}`, "carrier.bandwidthMHz", "far outside"},
		{"number for text", `{"name":5,"carrier":{"bandwidthMHz":40}}`, "name", "want text"},
		{"list for object", `{"carrier":[1,2]}`, "carrier", "want an object"},
		{"object for list", `{"carrier":{"bandwidthMHz":40},"partitions":{"name":"a"}}`, "partitions", "want a list"},
		{"bad SCS key", `{"carrier":{"bandwidthMHz":40,"offsetToCarrier":{"fifteen":0}}}`, "carrier.offsetToCarrier.fifteen", "not a subcarrier spacing"},
		{"YAML NaN", "carrier:\n  bandwidthMHz: 40\n  centerMHz: .nan\n", "carrier.centerMHz", "finite"},
		{"YAML infinity", "carrier:\n  bandwidthMHz: .inf\n", "carrier.bandwidthMHz", "finite"},
		{"JSON duplicate key", `{"name":"a","name":"b"}`, "", "appears twice"},
		{"YAML duplicate key", "name: a\nname: b\n", "", "appears twice"},
		{"not JSON", `{"name":`, "", "not valid JSON"},
		{"trailing JSON", `{"name":"a"} {}`, "", "more after the end"},
		{"top-level list", `[1]`, "", "want an object"},
		{"empty YAML", "", "", "empty"},
		{"deep nesting", strings.Repeat("[", 100) + strings.Repeat("]", 100), "", "deeper"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Decode([]byte(c.doc))
			if err == nil {
				t.Fatalf("decoded %q without error", c.doc)
			}
			if !strings.Contains(err.Error(), c.say) {
				t.Errorf("error %q does not say %q", err, c.say)
			}
			if c.field == "" {
				return
			}
			var es Errors
			var fe *FieldError
			switch {
			case errors.As(err, &es):
				for _, e := range es {
					if e.Field == c.field {
						return
					}
				}
			case errors.As(err, &fe) && fe.Field == c.field:
				return
			}
			t.Errorf("error %q does not name field %q", err, c.field)
		})
	}
}

// Aliases that expand exponentially are refused, not expanded.
func TestYAMLAliasBomb(t *testing.T) {
	doc := "a: &a [x, x, x, x, x, x, x, x, x, x]\n"
	prev := "a"
	for _, n := range []string{"b", "c", "d", "e", "f", "g"} {
		doc += n + ": &" + n + " [*" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + ", *" + prev + "]\n"
		prev = n
	}
	if _, err := DecodeYAML([]byte(doc)); err == nil {
		t.Fatal("alias bomb decoded without error")
	}
}

func TestTooLarge(t *testing.T) {
	big := make([]byte, MaxSize+1)
	if _, err := Decode(big); err == nil || !strings.Contains(err.Error(), "at most") {
		t.Errorf("oversized input: err %v", err)
	}
}

// FuzzDecode: any input either fails cleanly or yields a plan that Compute
// handles, and that survives a JSON round trip unchanged.
func FuzzDecode(f *testing.F) {
	f.Add([]byte(campusYAML))
	f.Add([]byte(campusJSON))
	f.Add([]byte(`{"carrier":{"bandwidthMHz":100},"partitions":[{"name":"a","scsKHz":30,"locationAndBandwidth":1099}]}`))
	f.Add([]byte("carrier: {bandwidthMHz: 40}\npartitions: [{name: x, scsKHz: 60, cp: extended, sizePrb: 3}]\n"))
	files, _ := filepath.Glob("../demo/*.yaml")
	for _, file := range files {
		if data, err := os.ReadFile(file); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Decode(data)
		if err != nil {
			return
		}
		res := grid.Compute(p)
		_ = report.Build(res, false)
		b, err := EncodeJSON(p)
		if err != nil {
			t.Fatalf("encoding a decoded plan: %v", err)
		}
		back, err := DecodeJSON(b)
		if err != nil {
			t.Fatalf("decoding an encoded plan: %v\n%s", err, b)
		}
		if !reflect.DeepEqual(normalise(back), normalise(p)) {
			t.Fatalf("JSON round trip changed the plan:\n%s", b)
		}
	})
}

// normalise makes empty and nil collections compare equal.
func normalise(p grid.Plan) grid.Plan {
	if len(p.Partitions) == 0 {
		p.Partitions = nil
	}
	if len(p.Carrier.OffsetToCarrier) == 0 {
		p.Carrier.OffsetToCarrier = nil
	}
	if len(p.Carrier.CarrierBandwidth) == 0 {
		p.Carrier.CarrierBandwidth = nil
	}
	return p
}
