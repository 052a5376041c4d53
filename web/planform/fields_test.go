package planform

import (
	"encoding/json"
	"errors"
	"fmt"
	"reflect"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// The families of per-spacing keys, which are not rows of Fields.
var families = map[string]string{"carrier.offsetToCarrier": keyOffset, "carrier.carrierBandwidth": keyCarrierBW}

// tablePaths are the plan paths that Fields and the families name, with
// partitions as "partitions[]".
func tablePaths() []string {
	var out []string
	for _, fl := range Fields {
		p := fl.Path
		if fl.Block == BlockPartition {
			p = "partitions[]." + p
		}
		out = append(out, p)
	}
	for p := range families {
		out = append(out, p)
	}
	slices.Sort(out)
	return out
}

// tagPaths walks the json tags of t: the leaves of a plan, with slices of
// structs as "name[]" and maps as leaves.
func tagPaths(t reflect.Type, prefix string) []string {
	var out []string
	for i := range t.NumField() {
		sf := t.Field(i)
		name, _, _ := strings.Cut(sf.Tag.Get("json"), ",")
		if name == "" || name == "-" {
			continue
		}
		ft := sf.Type
		if ft.Kind() == reflect.Pointer {
			ft = ft.Elem()
		}
		switch {
		case ft.Kind() == reflect.Struct:
			out = append(out, tagPaths(ft, prefix+name+".")...)
		case ft.Kind() == reflect.Slice && ft.Elem().Kind() == reflect.Struct:
			out = append(out, tagPaths(ft.Elem(), prefix+name+"[].")...)
		default:
			out = append(out, prefix+name)
		}
	}
	return out
}

// TestFieldsNameThePlanTags: the table's plan paths are exactly the leaves
// of grid.Plan's json tags, each named once.
func TestFieldsNameThePlanTags(t *testing.T) {
	want := tagPaths(reflect.TypeFor[grid.Plan](), "")
	slices.Sort(want)
	got := tablePaths()
	if !slices.Equal(got, want) {
		t.Errorf("the table's plan paths differ from grid.Plan's tags:\ntable %v\ntags  %v", got, want)
	}
	keys := map[string]bool{}
	for _, fl := range Fields {
		k := string(fl.Block) + ":" + fl.Key
		if keys[k] {
			t.Errorf("key %s is in the table twice", k)
		}
		keys[k] = true
	}
	t.Logf("%d plan paths compared", len(want))
}

// sampleForm gives every field of the table, in one partition, a value of
// its kind that differs from every other, and one offset and carrier size.
func sampleForm() Form {
	f := Form{Parts: make([]PartForm, 1)}
	for k, fl := range Fields {
		var s string
		switch fl.Kind() {
		case Count, OptCount:
			s = strconv.Itoa(100 + k)
		case Number, OptNumber:
			s = strconv.Itoa(100+k) + ".5"
		default:
			s = fmt.Sprintf("text%d", k)
		}
		*fl.Value(&f, 0) = s
	}
	f.Offset = map[int]string{30: "7"}
	f.CarrierBW = map[int]string{30: "99"}
	return f
}

// TestFieldsMatchThePlanFile: a plan file written by hand from the table's
// paths and the sample values decodes, through planfile's walker, to the
// plan the form reads to; and the walker knows no key the table lacks.
func TestFieldsMatchThePlanFile(t *testing.T) {
	f := sampleForm()
	want, msgs := f.Plan()
	if len(msgs) > 0 {
		t.Fatalf("the sample form has messages: %v", msgs)
	}
	doc := map[string]any{}
	put := func(path string, v any) {
		m := doc
		parts := strings.Split(path, ".")
		for _, p := range parts[:len(parts)-1] {
			if p == "partitions[0]" {
				list, _ := m["partitions"].([]any)
				if list == nil {
					list = []any{map[string]any{}}
					m["partitions"] = list
				}
				m = list[0].(map[string]any)
				continue
			}
			next, _ := m[p].(map[string]any)
			if next == nil {
				next = map[string]any{}
				m[p] = next
			}
			m = next
		}
		m[parts[len(parts)-1]] = v
	}
	for _, fl := range Fields {
		s := *fl.Value(&f, 0)
		var v any = s
		if fl.Kind() != Text {
			v = json.Number(s)
		}
		put(fl.FullPath(0), v)
	}
	put("carrier.offsetToCarrier", map[string]any{"30": 7})
	put("carrier.carrierBandwidth", map[string]any{"30": 99})
	b, err := json.Marshal(doc)
	if err != nil {
		t.Fatal(err)
	}
	got, err := planfile.DecodeJSON(b)
	if err != nil {
		t.Fatalf("planfile does not read the table's keys: %v\n%s", err, b)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("planfile and the form read different plans:\nplanfile %+v\nform     %+v", got, want)
	}

	// The walker's keys of each object, from its message about a key it
	// does not know, against the table's.
	known := regexp.MustCompile(`the keys here are ([^.]*)\.`)
	objects := map[string]string{"": "", "carrier": "carrier.", "tdd": "tdd.", "tdd.pattern1": "tdd.pattern1.",
		"tdd.pattern2": "tdd.pattern2.", "ssb": "ssb.", "environment": "environment.", "partitions[0]": "partitions[0]."}
	compared := 0
	for obj, prefix := range objects {
		probe := strings.TrimPrefix(prefix+"zzUnknown", ".")
		put(probe, 1)
		b, _ := json.Marshal(doc)
		_, err := planfile.DecodeJSON(b)
		var walker []string
		for _, fe := range fieldErrors(err) {
			if m := known.FindStringSubmatch(fe.Msg); m != nil && fe.Field == probe {
				walker = strings.Split(m[1], ", ")
			}
		}
		if walker == nil {
			t.Errorf("no unknown-key message for %s: %v", probe, err)
		}
		var table []string
		for _, p := range tablePaths() {
			p = strings.Replace(p, "partitions[]", "partitions[0]", 1)
			if rest, ok := strings.CutPrefix(p, prefix); ok || prefix == "" {
				if prefix == "" {
					rest = p
				}
				head, _, _ := strings.Cut(rest, ".")
				head = strings.TrimSuffix(head, "[0]")
				if !slices.Contains(table, head) {
					table = append(table, head)
				}
			}
		}
		slices.Sort(walker)
		slices.Sort(table)
		if !slices.Equal(walker, table) {
			t.Errorf("object %q: planfile knows %v, the table %v", obj, walker, table)
		}
		compared += len(walker)
		removeProbe(doc, probe)
	}
	t.Logf("%d fields read through planfile; %d keys of %d objects compared with its walker", len(Fields)+2, compared, len(objects))
}

func removeProbe(doc map[string]any, path string) {
	m := doc
	parts := strings.Split(path, ".")
	for _, p := range parts[:len(parts)-1] {
		if p == "partitions[0]" {
			m = m["partitions"].([]any)[0].(map[string]any)
			continue
		}
		m = m[p].(map[string]any)
	}
	delete(m, parts[len(parts)-1])
}

func fieldErrors(err error) planfile.Errors {
	var es planfile.Errors
	errors.As(err, &es)
	return es
}

// TestFieldsRoundTrip: every field of the table survives form → plan →
// form → query → form.
func TestFieldsRoundTrip(t *testing.T) {
	f := sampleForm()
	p, _ := f.Plan()
	g := FormOf(p)
	q := g.Query()
	h, msgs := ParseQuery(mustQuery(t, q))
	if len(msgs) > 0 {
		t.Fatal(msgs)
	}
	for _, fl := range Fields {
		if a, b := *fl.Value(&g, 0), *fl.Value(&h, 0); a == "" || a != b {
			t.Errorf("%s: %q after the plan, %q after the query", fl.FullKey(0), a, b)
		}
	}
}
