package planfile

import (
	"errors"
	"fmt"
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
		{"second YAML document", "name: a\n---\nname: b\n", "", "Line 3: a second YAML document"},
		{"second YAML document, a list", "name: a\n--- [1, 2]\n", "", "second YAML document"},
		{"third YAML document", "name: a\n---\n---\nname: b\n", "", "more than one YAML document"},
		{"broken second YAML document", "name: a\n---\n: [\n", "", "not valid YAML"},
		{"YAML binary", "name: !!binary aGVsbG8=\n", "", "Line 1: !!binary values are not accepted"},
		{"YAML binary in a partition", "partitions:\n  - {name: a, cp: !!binary bm9ybWFs}\n", "", "Line 2: !!binary"},
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

// YAML that marks the start or end of its one document, or ends with an
// empty one, is a single plan and reads as one.
func TestYAMLOneDocument(t *testing.T) {
	for _, doc := range []string{"name: a\n", "---\nname: a\n", "name: a\n...\n", "name: a\n---\n", "--- \nname: a\n---\n# the end\n"} {
		p, err := DecodeYAML([]byte(doc))
		if err != nil || p.Name != "a" {
			t.Errorf("%q: %+v, %v; want the plan named a", doc, p, err)
		}
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

// A tab in the indentation is reported on its own line. The parser names
// the line of the token before the tab, one or more lines up.
func TestYAMLTabLine(t *testing.T) {
	for _, c := range []struct {
		doc  string
		line int
	}{
		{"name: x\ncarrier:\n  bandwidthMHz: 40\npartitions:\n  - name: a\n    scsKHz: 15\n    sizePrb: 10\n\t  startCrb: 0\n", 8},
		{"a:\n  b: 1\n\n\n\tc: 2\n", 5}, // across blank lines
		{"a:\n  - 1\n\t- 2\n", 3},       // in a list
		{"name: x\n\tcarrier: 1\n", 2},  // named right already
		{"a: |\n  text\n\tmore\n", 3},   // in a block scalar
		{"name: x\ncarrier:\n\tbandwidthMHz: 40\n", 3},
		{"a: [1,\n\t2]\nb:\n  c: 1\n \td: 2\n", 5}, // a tab inside brackets is allowed
	} {
		_, err := DecodeYAML([]byte(c.doc))
		want := fmt.Sprintf("not valid YAML: line %d: ", c.line)
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%q: error %v, want it to say %q", c.doc, err, want)
		}
	}
}

// An unknown key close to a valid one names it; one far from all does not.
func TestUnknownKeySuggestion(t *testing.T) {
	part := func(key string) string {
		return `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":15,"` + key + `":3}]}`
	}
	for _, c := range []struct {
		doc, want string // want "" for no suggestion
	}{
		{part("sizPrb"), "sizePrb"},  // one letter left out
		{part("sizePbr"), "sizePrb"}, // two letters swapped
		{part("SizePRB"), "sizePrb"}, // letter case
		{part("size"), "sizePrb"},    // the unit left off
		{part("scs"), "scsKHz"},      // the unit left off
		{part("startCrbs"), "startCrb"},
		{part("colour"), ""}, // nothing like it
		{part("x"), ""},      // too short to guess from
		{part("mode"), ""},   // 3 edits from "layers" and "modulation" is not a prefix
		{`{"carier":{}}`, "carrier"},
		{`{"partition":[]}`, "partitions"},
		{`{"environment":{"delaySpread":5}}`, "delaySpreadNs"},
		{`{"carrier":{"bandwidthMHz":40,"offsetToPointA":0}}`, ""}, // an ssb key in the carrier
	} {
		_, err := Decode([]byte(c.doc))
		if err == nil {
			t.Fatalf("%s decoded", c.doc)
		}
		msg := err.Error()
		switch {
		case c.want == "" && strings.Contains(msg, "Did you mean"):
			t.Errorf("%s: %q suggests a key, want none", c.doc, msg)
		case c.want != "" && !strings.Contains(msg, "Did you mean "+c.want+"?"):
			t.Errorf("%s: %q does not suggest %s", c.doc, msg, c.want)
		}
	}
}

func TestEditDistance(t *testing.T) {
	for _, c := range []struct {
		a, b string
		d    int
	}{{"", "", 0}, {"abc", "", 3}, {"kitten", "sitting", 3}, {"sizepbr", "sizeprb", 1}, {"ab", "ba", 1}, {"carier", "carrier", 1}} {
		if got := editDistance(c.a, c.b); got != c.d {
			t.Errorf("editDistance(%q, %q) = %d, want %d", c.a, c.b, got, c.d)
		}
	}
}

// An image, above all a PNG figure gridloom exported, is named as such,
// with the files that do carry a plan, in every decoder.
func TestImageIsNotAPlan(t *testing.T) {
	png := "\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR\x00\x00\x02\x80" // RFC 2083 3.1 signature, then the IHDR chunk's start
	for _, c := range []struct{ name, data, say string }{
		{"PNG", png, "a PNG image, not a plan file: a PNG figure does not carry its plan."},
		{"JPEG", "\xff\xd8\xff\xe0\x00\x10JFIF\x00", "a JPEG image"},
		{"GIF", "GIF89a\x01\x00\x01\x00", "a GIF image"},
		{"WebP", "RIFF\x24\x00\x00\x00WEBPVP8 ", "a WebP image"},
		{"TIFF", "II*\x00\x08\x00\x00\x00", "a TIFF image"},
		{"BMP", "BM\x36\x00\x0c\x00\x00\x00\x00\x00\x36\x00", "a BMP image"},
		{"AVIF", "\x00\x00\x00\x1cftypavif", "an AVIF image"},
	} {
		for name, decode := range map[string]func([]byte) (grid.Plan, error){"Decode": Decode, "DecodeYAML": DecodeYAML, "DecodeJSON": DecodeJSON} {
			_, err := decode([]byte(c.data))
			if err == nil || !strings.Contains(err.Error(), c.say) || !strings.Contains(err.Error(), "JSON or YAML file, or an SVG figure") {
				t.Errorf("%s of a %s: %v; want it to say %q and name the files that carry a plan", name, c.name, err, c.say)
			}
		}
	}
	// Text that merely starts like a signature is still read as a plan.
	for _, doc := range []string{"BM: 1\n", "GIF: x\n", "II: 1\n"} {
		if _, err := Decode([]byte(doc)); err == nil || strings.Contains(err.Error(), "image") {
			t.Errorf("%q: %v; want an unknown-key error, not an image", doc, err)
		}
	}
}

// A plan whose text is not valid UTF-8 (a name typed into a link) is
// written with U+FFFD, as EncodeJSON writes it, and reads back: the YAML
// encoder's own choice, !!binary, is refused by DecodeYAML.
func TestEncodeYAMLInvalidUTF8(t *testing.T) {
	p := grid.Plan{Name: "a\xffb", Carrier: grid.CarrierPlan{BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{{Name: "\xc3", SCSKHz: 15, SizePRB: 10}}}
	b, err := EncodeYAML(p)
	if err != nil {
		t.Fatal(err)
	}
	q, err := DecodeYAML(b)
	if err != nil {
		t.Fatalf("the YAML does not read back: %v\n%s", err, b)
	}
	if q.Name != "a\uFFFDb" || q.Partitions[0].Name != "\uFFFD" || p.Name != "a\xffb" {
		t.Errorf("names %q, %q (the caller's plan %q); want %q, %q and the caller's plan untouched", q.Name, q.Partitions[0].Name, p.Name, "a\uFFFDb", "\uFFFD")
	}
}

// A file's name picks its format, and only a file not named as a plan file
// may be taken for a saved figure: the command line and the page's Open
// both read files this way.
func TestDecodeFileAndMayBeFigure(t *testing.T) {
	yamlPlan := []byte("carrier: {bandwidthMHz: 40}\npartitions: [{name: a, scsKHz: 30, sizePrb: 106}]\n")
	if _, _, err := DecodeFile("plan.json", yamlPlan); err == nil {
		t.Error("YAML in a .json file was read; the extension should have chosen JSON")
	}
	if p, _, err := DecodeFile("plan.YML", yamlPlan); err != nil || p.Carrier.BandwidthMHz != 40 {
		t.Errorf("plan.YML: %+v, %v", p.Carrier, err)
	}
	if p, _, err := DecodeFile("-", yamlPlan); err != nil || len(p.Partitions) != 1 {
		t.Errorf("standard input: %+v, %v", p, err)
	}
	for _, c := range []struct {
		name, data string
		want       bool
	}{
		{"fig.svg", "anything", true},
		{"fig.SVG", "", true},
		{"download", "\ufeff \n<svg>", true},
		{"plan.yaml", "<svg>", false},
		{"plan.asn1", "<svg>", false},
		{"plan", "name: x", false},
	} {
		if got := MayBeFigure(c.name, []byte(c.data)); got != c.want {
			t.Errorf("MayBeFigure(%q, %q) = %v, want %v", c.name, c.data, got, c.want)
		}
	}
}
