// Package planfile reads and writes gridloom plan files, JSON or YAML with
// the same keys (see the README's plan file reference). It also reads
// TS 38.331 ASN.1 value notation, through package grid/rrc, so that every
// caller that opens a plan file opens a configuration from a log too.
//
// Security: Decode takes untrusted bytes. It refuses input over MaxSize,
// unknown keys, duplicate keys, values of the wrong type, numbers that are
// not finite or not whole where a count is wanted, YAML whose aliases
// expand past a bound, a second YAML document (which would otherwise be
// dropped unread) and !!binary values (which would read as their base64),
// so the plan it returns is small and well-typed. It does not judge
// values: grid.Compute does, with findings.
package planfile

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"reflect"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"go.yaml.in/yaml/v3"

	"gridloom/grid"
	"gridloom/grid/rrc"
)

var bom = []byte("\ufeff")

// MaxSize is the largest plan file accepted, in bytes.
const MaxSize = 1 << 20

// maxNumber bounds whole numbers so that no later arithmetic can overflow;
// every legal value of a plan is far smaller.
const maxNumber = 1 << 31

// FieldError is a problem with one field of a plan file. Field is the path
// as the plan spells it ("partitions[2].scsKHz"); empty for the whole file.
type FieldError struct {
	Field string
	Msg   string
}

func (e *FieldError) Error() string {
	if e.Field == "" {
		return e.Msg
	}
	return e.Field + ": " + e.Msg
}

// Errors is every FieldError found in one file, in file order.
type Errors []*FieldError

func (es Errors) Error() string {
	msgs := make([]string, len(es))
	for i, e := range es {
		msgs[i] = e.Error()
	}
	return strings.Join(msgs, "; ")
}

// Format is a plan file's syntax.
type Format int

// Formats.
const (
	JSON Format = iota
	YAML
	// ValueNotation is TS 38.331 information elements in ASN.1 value
	// notation (X.680), as package grid/rrc writes and reads them.
	ValueNotation
)

// Sniff guesses the format of data: JSON when it starts with '{' after
// white space, value notation when it starts (after comments) with a value
// assignment "name Type ::=", YAML otherwise.
func Sniff(data []byte) Format {
	if t := bytes.TrimLeft(data, " \t\r\n\ufeff"); len(t) > 0 && t[0] == '{' {
		return JSON
	}
	if rrc.Looks(bytes.TrimPrefix(data, bom)) {
		return ValueNotation
	}
	return YAML
}

// Decode reads a plan file in any of the formats. A leading UTF-8 byte
// order mark, which some editors write, is ignored.
func Decode(data []byte) (grid.Plan, error) {
	p, _, err := DecodeNotes(data)
	return p, err
}

// DecodeNotes is Decode that also returns the notes a reader should see:
// for value notation, the values and fields skipped and anything assumed
// (rrc.Decoded.Notes); JSON and YAML have none.
func DecodeNotes(data []byte) (grid.Plan, []string, error) {
	switch Sniff(data) {
	case JSON:
		p, err := DecodeJSON(data)
		if err != nil {
			// A value of value notation standing alone opens with '{' too.
			if q, notes, verr := DecodeValueNotation(data); verr == nil {
				return q, notes, nil
			}
		}
		return p, nil, err
	case ValueNotation:
		return DecodeValueNotation(data)
	}
	p, err := DecodeYAML(data)
	return p, nil, err
}

// Extensions are the file name endings of plan files: a file so named is
// read in that format, and never taken for a saved figure.
var Extensions = []string{".json", ".yaml", ".yml", ".asn", ".asn1"}

// DecodeFile reads a plan file called name, as the command line and the
// page's Open both do: the extension picks the format, and a file with any
// other name is read as DecodeNotes reads it.
func DecodeFile(name string, data []byte) (grid.Plan, []string, error) {
	switch strings.ToLower(filepath.Ext(name)) {
	case ".json":
		p, err := DecodeJSON(data)
		return p, nil, err
	case ".yaml", ".yml":
		p, err := DecodeYAML(data)
		return p, nil, err
	case ".asn", ".asn1":
		return DecodeValueNotation(data)
	}
	return DecodeNotes(data)
}

// MayBeFigure reports whether a file called name holding data may be a
// figure gridloom exported, which carries its plan: one named .svg, or one
// not named as a plan file that opens as an XML document does ("<" after
// any byte order mark and white space; no plan file does).
func MayBeFigure(name string, data []byte) bool {
	ext := strings.ToLower(filepath.Ext(name))
	if ext == ".svg" {
		return true
	}
	if slices.Contains(Extensions, ext) {
		return false
	}
	data = bytes.TrimLeft(bytes.TrimPrefix(data, bom), " \t\r\n")
	return len(data) > 0 && data[0] == '<'
}

// DecodeValueNotation reads TS 38.331 value notation into a plan (see
// package grid/rrc) and returns its notes. Errors give the line and column.
func DecodeValueNotation(data []byte) (grid.Plan, []string, error) {
	d, err := ReadValueNotation(data)
	if err != nil {
		return grid.Plan{}, nil, err
	}
	return d.Plan, d.Notes(), nil
}

// ReadValueNotation is DecodeValueNotation with what the reader skipped
// and assumed kept apart, for answers that list them separately.
func ReadValueNotation(data []byte) (rrc.Decoded, error) {
	if len(data) > MaxSize {
		return rrc.Decoded{}, tooLarge(len(data))
	}
	d, err := rrc.Decode(bytes.TrimPrefix(data, bom))
	if err != nil {
		return rrc.Decoded{}, &FieldError{Msg: "The plan is not TS 38.331 value notation gridloom can read: " + err.Error()}
	}
	return d, nil
}

// DecodeJSON reads a JSON plan file.
func DecodeJSON(data []byte) (grid.Plan, error) {
	if len(data) > MaxSize {
		return grid.Plan{}, tooLarge(len(data))
	}
	if err := imageError(data); err != nil {
		return grid.Plan{}, err
	}
	data = bytes.TrimPrefix(data, bom)
	tree, err := jsonTree(data)
	if err != nil {
		return grid.Plan{}, &FieldError{Msg: "The plan is not valid JSON: " + err.Error() + "."}
	}
	return FromTree(tree)
}

// DecodeYAML reads a YAML plan file.
func DecodeYAML(data []byte) (grid.Plan, error) {
	if len(data) > MaxSize {
		return grid.Plan{}, tooLarge(len(data))
	}
	if err := imageError(data); err != nil {
		return grid.Plan{}, err
	}
	data = bytes.TrimPrefix(data, bom)
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var doc yaml.Node
	if err := dec.Decode(&doc); err != nil && err != io.EOF {
		return grid.Plan{}, yamlSyntaxError(data, err)
	}
	if doc.Kind == 0 {
		return grid.Plan{}, &FieldError{Msg: "The plan file is empty."}
	}
	// JSON refuses data after the plan; YAML would read the first of
	// several documents and drop the rest without a word. An empty
	// document after a closing "---" drops nothing and passes.
	var next yaml.Node
	if err := dec.Decode(&next); err != io.EOF {
		if err != nil {
			return grid.Plan{}, yamlSyntaxError(data, err)
		}
		if !emptyDocument(&next) {
			return grid.Plan{}, &FieldError{Msg: fmt.Sprintf("Line %d: a second YAML document starts here; a plan file holds one plan, so remove the \"---\" line and what follows, or put each plan in a file of its own.", documentLine(&next))}
		}
		var more yaml.Node
		if err := dec.Decode(&more); err != io.EOF {
			return grid.Plan{}, &FieldError{Msg: "The plan file holds more than one YAML document; a plan file holds one plan, so put each plan in a file of its own."}
		}
	}
	budget := maxNodes
	tree, err := yamlTree(&doc, &budget, 0)
	if err != nil {
		return grid.Plan{}, err
	}
	return FromTree(tree)
}

// emptyDocument reports whether a YAML document holds nothing.
func emptyDocument(n *yaml.Node) bool {
	if len(n.Content) == 0 {
		return true
	}
	c := n.Content[0]
	return c.Kind == yaml.ScalarNode && c.Tag == "!!null" && c.Value == ""
}

// documentLine is the first line of a document's content.
func documentLine(n *yaml.Node) int {
	if len(n.Content) > 0 && n.Content[0].Line > 0 {
		return n.Content[0].Line
	}
	return n.Line
}

// imageSignatures are the first bytes of the image formats a figure may
// have been saved in, each with its article and name for the message:
// PNG's signature (RFC 2083 3.1), GIF's header (GIF89a), JPEG's SOI marker
// and the next marker's first byte, TIFF's header in both byte orders,
// BMP's "BM" with its zero reserved bytes, and the RIFF and ISO-BMFF
// containers of WebP, AVIF and HEIF, whose type follows a length (all from
// memory of the formats' specifications; the PNG one is checked against a
// PNG gridloom wrote, in cmd/gridloom). "?" matches any byte. None can
// begin a plan file, which is text.
var imageSignatures = []struct{ name, sig string }{
	{"a PNG", "\x89PNG\r\n\x1a\n"},
	{"a JPEG", "\xff\xd8\xff"},
	{"a GIF", "GIF87a"},
	{"a GIF", "GIF89a"},
	{"a WebP", "RIFF????WEBP"},
	{"a TIFF", "II*\x00"},
	{"a TIFF", "MM\x00*"},
	{"a BMP", "BM????\x00\x00\x00\x00"},
	{"an AVIF", "????ftypavif"},
	{"a HEIF", "????ftypheic"},
	{"a HEIF", "????ftypmif1"},
}

// imageError refuses an image with a message that says where the plan is.
// Without it, a PNG the app exported read as "not valid YAML: invalid
// leading UTF-8 octet", which tells a user nothing about what to open.
func imageError(data []byte) error {
	for _, im := range imageSignatures {
		if len(data) < len(im.sig) {
			continue
		}
		match := true
		for i := range len(im.sig) {
			if im.sig[i] != '?' && im.sig[i] != data[i] {
				match = false
				break
			}
		}
		if !match {
			continue
		}
		why := ""
		if im.name == "a PNG" {
			why = ": a PNG figure does not carry its plan"
		}
		return &FieldError{Msg: fmt.Sprintf("The file is %s image, not a plan file%s. Open the plan's JSON or YAML file, or an SVG figure gridloom exported, which carries its plan.", im.name, why)}
	}
	return nil
}

func tooLarge(n int) error {
	return &FieldError{Msg: fmt.Sprintf("The plan file is %d bytes; at most %d bytes are accepted.", n, MaxSize)}
}

// A tree is a decoded document: map[string]any, []any, string, number,
// bool or nil. Both syntaxes become a tree, and one walk reads a plan
// from it, so JSON and YAML accept exactly the same plans.
type number string

const (
	maxNodes = 100000 // YAML nodes after alias expansion
	maxDepth = 64
)

func jsonTree(data []byte) (any, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	v, err := jsonValue(dec, 0)
	if err != nil {
		return nil, err
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, errors.New("there is more after the end of the plan object")
	}
	return v, nil
}

func jsonValue(dec *json.Decoder, depth int) (any, error) {
	if depth > maxDepth {
		return nil, fmt.Errorf("it nests deeper than %d levels", maxDepth)
	}
	tok, err := dec.Token()
	if err != nil {
		if err == io.EOF {
			return nil, errors.New("it ends early")
		}
		return nil, err
	}
	switch t := tok.(type) {
	case json.Delim:
		switch t {
		case '{':
			m := map[string]any{}
			for dec.More() {
				kt, err := dec.Token()
				if err != nil {
					return nil, err
				}
				k := kt.(string)
				if _, dup := m[k]; dup {
					return nil, fmt.Errorf("the key %q appears twice in one object", k)
				}
				v, err := jsonValue(dec, depth+1)
				if err != nil {
					return nil, err
				}
				m[k] = v
			}
			_, err := dec.Token()
			return m, err
		case '[':
			var a []any
			for dec.More() {
				v, err := jsonValue(dec, depth+1)
				if err != nil {
					return nil, err
				}
				a = append(a, v)
			}
			_, err := dec.Token()
			return a, err
		}
		return nil, fmt.Errorf("unexpected %v", t)
	case json.Number:
		return number(t), nil
	default:
		return t, nil // string, bool or nil
	}
}

func yamlTree(n *yaml.Node, budget *int, depth int) (any, error) {
	*budget--
	if *budget < 0 {
		return nil, &FieldError{Msg: fmt.Sprintf("The YAML plan expands to more than %d nodes (aliases?); write it out plainly.", maxNodes)}
	}
	if depth > maxDepth {
		return nil, &FieldError{Msg: fmt.Sprintf("The YAML plan nests deeper than %d levels.", maxDepth)}
	}
	switch n.Kind {
	case yaml.DocumentNode:
		if len(n.Content) == 0 {
			return nil, nil
		}
		return yamlTree(n.Content[0], budget, depth+1)
	case yaml.AliasNode:
		return yamlTree(n.Alias, budget, depth+1)
	case yaml.SequenceNode:
		a := make([]any, 0, len(n.Content))
		for _, c := range n.Content {
			v, err := yamlTree(c, budget, depth+1)
			if err != nil {
				return nil, err
			}
			a = append(a, v)
		}
		return a, nil
	case yaml.MappingNode:
		m := make(map[string]any, len(n.Content)/2)
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := n.Content[i], n.Content[i+1]
			if k.Kind != yaml.ScalarNode {
				return nil, &FieldError{Msg: fmt.Sprintf("Line %d: a key must be plain text or a number.", k.Line)}
			}
			if k.Tag == "!!merge" {
				return nil, &FieldError{Msg: fmt.Sprintf("Line %d: YAML merge keys (<<) are not accepted in a plan.", k.Line)}
			}
			if _, dup := m[k.Value]; dup {
				return nil, &FieldError{Msg: fmt.Sprintf("Line %d: the key %q appears twice in one mapping.", k.Line, k.Value)}
			}
			val, err := yamlTree(v, budget, depth+1)
			if err != nil {
				return nil, err
			}
			m[k.Value] = val
		}
		return m, nil
	case yaml.ScalarNode:
		switch n.Tag {
		case "!!null":
			return nil, nil
		case "!!bool":
			var b bool
			if err := n.Decode(&b); err != nil {
				return nil, &FieldError{Msg: fmt.Sprintf("Line %d: %v.", n.Line, err)}
			}
			return b, nil
		case "!!int":
			if strings.Trim(strings.TrimLeft(n.Value, "+-"), "0123456789") == "" {
				return number(n.Value), nil // plain digits: keep them, leading zeros and all
			}
			var i int64
			if err := n.Decode(&i); err != nil {
				return number(n.Value), nil // too large for int64: the walk refuses it by size
			}
			return number(strconv.FormatInt(i, 10)), nil
		case "!!binary":
			// Read as its text, base64 would pass for a name or a case.
			return nil, &FieldError{Msg: fmt.Sprintf("Line %d: !!binary values are not accepted in a plan; write the value as plain text.", n.Line)}
		case "!!float":
			var f float64
			if err := n.Decode(&f); err != nil {
				return nil, &FieldError{Msg: fmt.Sprintf("Line %d: %q is not a number.", n.Line, n.Value)}
			}
			return number(strconv.FormatFloat(f, 'g', -1, 64)), nil
		}
		return n.Value, nil
	}
	return nil, &FieldError{Msg: "The YAML plan holds a node of an unknown kind."}
}

// FromTree reads a plan from a decoded document; see the package doc.
func FromTree(tree any) (grid.Plan, error) {
	var w walker
	p := w.plan(tree)
	if len(w.errs) > 0 {
		return grid.Plan{}, w.errs
	}
	return p, nil
}

// keys are the keys of each object of a plan file, in field order, read
// once from the json tags of grid.Plan and the types it holds: the structs
// own the format, and the walk accepts exactly the keys they write.
var keys = struct {
	plan, carrier, partition, tdd, tddPattern, ssb, environment []string
	initialAccess, initialBWP, prach                            []string
}{
	plan:        tagKeys(reflect.TypeFor[grid.Plan]()),
	carrier:     tagKeys(reflect.TypeFor[grid.CarrierPlan]()),
	partition:   tagKeys(reflect.TypeFor[grid.PartitionPlan]()),
	tdd:         tagKeys(reflect.TypeFor[grid.TDDPlan]()),
	tddPattern:  tagKeys(reflect.TypeFor[grid.TDDPattern]()),
	ssb:         tagKeys(reflect.TypeFor[grid.SSBPlan]()),
	environment: tagKeys(reflect.TypeFor[grid.EnvironmentPlan]()),

	initialAccess: tagKeys(reflect.TypeFor[grid.InitialAccessPlan]()),
	initialBWP:    tagKeys(reflect.TypeFor[grid.InitialBWPPlan]()),
	prach:         tagKeys(reflect.TypeFor[grid.PRACHPlan]()),
}

// tagKeys lists the json keys of a struct's fields. A field without a key,
// or whose yaml key differs, would make the two syntaxes disagree: that is
// a mistake in grid, reported at start-up by any test.
func tagKeys(t reflect.Type) []string {
	out := make([]string, 0, t.NumField())
	for i := range t.NumField() {
		f := t.Field(i)
		j, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		y, _, _ := strings.Cut(f.Tag.Get("yaml"), ",")
		if j == "" || j == "-" || j != y {
			panic(fmt.Sprintf("planfile: %s.%s has json key %q and yaml key %q; give both the same key", t.Name(), f.Name, j, y))
		}
		out = append(out, j)
	}
	return out
}

type walker struct{ errs Errors }

func (w *walker) fail(field, format string, args ...any) {
	w.errs = append(w.errs, &FieldError{Field: field, Msg: fmt.Sprintf(format, args...)})
}

// object returns m's keys checked against the known ones.
func (w *walker) object(v any, field string, known ...string) map[string]any {
	m, ok := v.(map[string]any)
	if !ok {
		w.fail(field, "want an object with keys %s, got %s.", strings.Join(known, ", "), describe(v))
		return nil
	}
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	for _, k := range keys {
		if !slices.Contains(known, k) {
			msg := fmt.Sprintf("unknown key %q; the keys here are %s.", k, strings.Join(known, ", "))
			if near := nearestKey(k, known); near != "" {
				msg += " Did you mean " + near + "?"
			}
			w.fail(join(field, k), "%s", msg)
		}
	}
	return m
}

// nearestKey is the known key that key was most likely meant to be, or ""
// when none is close: a suggestion that is far off misleads more than
// the list of keys helps. Close is an edit distance (letter case aside,
// a swap of two neighbours counting as one edit) of at most 2 and under
// half the key's length, or a known key that begins with key or that key
// begins with, within 4 edits: a unit left off or added, as in "scs" for
// scsKHz.
func nearestKey(key string, known []string) string {
	best, bestD := "", -1
	lk := strings.ToLower(key)
	for _, k := range known {
		lkn := strings.ToLower(k)
		d := editDistance(lk, lkn)
		prefix := len(lk) >= 3 && (strings.HasPrefix(lkn, lk) || strings.HasPrefix(lk, lkn))
		if !(d <= 2 && 2*d < len(lk)) && !(prefix && d <= 4) {
			continue
		}
		if bestD < 0 || d < bestD {
			best, bestD = k, d
		}
	}
	return best
}

// editDistance counts the insertions, deletions, substitutions and swaps
// of neighbouring bytes that turn a into b (optimal string alignment).
func editDistance(a, b string) int {
	prev2 := make([]int, len(b)+1)
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}

func join(field, key string) string {
	if field == "" {
		return key
	}
	return field + "." + key
}

func describe(v any) string {
	switch t := v.(type) {
	case nil:
		return "null"
	case string:
		if len(t) > 40 {
			t = t[:40] + "…"
		}
		return fmt.Sprintf("the text %q", t)
	case number:
		return "the number " + string(t)
	case bool:
		return fmt.Sprintf("%v", t)
	case []any:
		return "a list"
	case map[string]any:
		return "an object"
	}
	return fmt.Sprintf("%T", v)
}

func (w *walker) str(v any, field string) string {
	switch t := v.(type) {
	case nil:
		return ""
	case string:
		return t
	}
	w.fail(field, "want text, got %s.", describe(v))
	return ""
}

func (w *walker) float(v any, field string) (float64, bool) {
	n, ok := v.(number)
	if !ok {
		w.fail(field, "want a number, got %s.", describe(v))
		return 0, false
	}
	f, err := strconv.ParseFloat(string(n), 64)
	if err != nil || math.IsNaN(f) || math.IsInf(f, 0) {
		w.fail(field, "want a finite number, got %s.", string(n))
		return 0, false
	}
	return f, true
}

func (w *walker) integer(v any, field string) (int, bool) {
	f, ok := w.float(v, field)
	if !ok {
		return 0, false
	}
	if f != math.Trunc(f) {
		w.fail(field, "want a whole number, got %v.", f)
		return 0, false
	}
	if math.Abs(f) >= maxNumber {
		w.fail(field, "%v is far outside any value this field allows.", f)
		return 0, false
	}
	return int(f), true
}

func (w *walker) optInt(v any, field string) *int {
	if v == nil {
		return nil
	}
	if i, ok := w.integer(v, field); ok {
		return &i
	}
	return nil
}

func (w *walker) optFloat(v any, field string) *float64 {
	if v == nil {
		return nil
	}
	if f, ok := w.float(v, field); ok {
		return &f
	}
	return nil
}

func (w *walker) intOr0(v any, field string) int {
	if v == nil {
		return 0
	}
	i, _ := w.integer(v, field)
	return i
}

// scsMap reads {"15": 0, "30": 1}: subcarrier spacing in kHz → a count.
func (w *walker) scsMap(v any, field string) map[int]int {
	if v == nil {
		return nil
	}
	m, ok := v.(map[string]any)
	if !ok {
		w.fail(field, "want an object from subcarrier spacing in kHz to a number of CRBs, like {\"15\": 0, \"30\": 1}; got %s.", describe(v))
		return nil
	}
	out := make(map[int]int, len(m))
	for _, k := range sortedKeys(m) {
		scs, err := strconv.Atoi(k)
		if err != nil || scs <= 0 || scs > 960 {
			w.fail(join(field, k), "the key %q is not a subcarrier spacing; use 15, 30, 60, 120, 480 or 960.", k)
			continue
		}
		if n, ok := w.integer(m[k], join(field, k)); ok {
			out[scs] = n
		}
	}
	return out
}

func sortedKeys(m map[string]any) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func (w *walker) plan(v any) grid.Plan {
	m := w.object(v, "", keys.plan...)
	if m == nil {
		return grid.Plan{}
	}
	p := grid.Plan{
		Name:             w.str(m["name"], "name"),
		SpanMs:           w.intOr0(m["spanMs"], "spanMs"),
		NumerologyGapKHz: w.optFloat(m["numerologyGapKHz"], "numerologyGapKHz"),
	}
	if c := m["carrier"]; c != nil {
		p.Carrier = w.carrier(c)
	}
	if t := m["tdd"]; t != nil {
		p.TDD = w.tdd(t)
	}
	if s := m["ssb"]; s != nil {
		p.SSB = w.ssb(s)
	}
	if e := m["environment"]; e != nil {
		p.Environment = w.environment(e)
	}
	if ia := m["initialAccess"]; ia != nil {
		p.InitialAccess = w.initialAccess(ia)
	}
	if pr := m["prach"]; pr != nil {
		p.PRACH = w.prach(pr)
	}
	switch ps := m["partitions"].(type) {
	case nil:
	case []any:
		if len(ps) > grid.MaxPartitions*4 {
			w.fail("partitions", "%d partitions is far beyond the limit of %d.", len(ps), grid.MaxPartitions)
			break
		}
		for i, pv := range ps {
			p.Partitions = append(p.Partitions, w.partition(pv, fmt.Sprintf("partitions[%d]", i)))
		}
	default:
		w.fail("partitions", "want a list of partitions, got %s.", describe(ps))
	}
	return p
}

func (w *walker) carrier(v any) grid.CarrierPlan {
	m := w.object(v, "carrier", keys.carrier...)
	if m == nil {
		return grid.CarrierPlan{}
	}
	c := grid.CarrierPlan{
		Range:            w.str(m["range"], "carrier.range"),
		Band:             w.str(m["band"], "carrier.band"),
		BandwidthMHz:     w.intOr0(m["bandwidthMHz"], "carrier.bandwidthMHz"),
		CenterMHz:        w.optFloat(m["centerMHz"], "carrier.centerMHz"),
		ARFCN:            w.optInt(m["arfcn"], "carrier.arfcn"),
		OffsetToCarrier:  w.scsMap(m["offsetToCarrier"], "carrier.offsetToCarrier"),
		CarrierBandwidth: w.scsMap(m["carrierBandwidth"], "carrier.carrierBandwidth"),
		NTAOffset:        w.str(m["nTaOffset"], "carrier.nTaOffset"),
	}
	return c
}

func (w *walker) partition(v any, f string) grid.PartitionPlan {
	m := w.object(v, f, keys.partition...)
	if m == nil {
		return grid.PartitionPlan{}
	}
	pp := grid.PartitionPlan{
		Name:                   w.str(m["name"], f+".name"),
		SCSKHz:                 w.intOr0(m["scsKHz"], f+".scsKHz"),
		CP:                     w.str(m["cp"], f+".cp"),
		StartCRB:               w.optInt(m["startCrb"], f+".startCrb"),
		SizePRB:                w.intOr0(m["sizePrb"], f+".sizePrb"),
		LocationAndBandwidth:   w.optInt(m["locationAndBandwidth"], f+".locationAndBandwidth"),
		Direction:              w.str(m["direction"], f+".direction"),
		Layers:                 w.intOr0(m["layers"], f+".layers"),
		Modulation:             w.str(m["modulation"], f+".modulation"),
		UECapability:           w.intOr0(m["ueCapability"], f+".ueCapability"),
		DMRSAdditionalPosition: w.str(m["dmrsAdditionalPosition"], f+".dmrsAdditionalPosition"),
	}
	return pp
}

func (w *walker) tdd(v any) *grid.TDDPlan {
	m := w.object(v, "tdd", keys.tdd...)
	if m == nil {
		return nil
	}
	t := &grid.TDDPlan{ReferenceSCSKHz: w.intOr0(m["referenceScsKHz"], "tdd.referenceScsKHz")}
	if m["pattern1"] == nil {
		w.fail("tdd.pattern1", "a TDD pattern needs pattern1 (periodMs, downlinkSlots, downlinkSymbols, uplinkSlots, uplinkSymbols).")
	} else {
		t.Pattern1 = w.tddPattern(m["pattern1"], "tdd.pattern1")
	}
	if m["pattern2"] != nil {
		p2 := w.tddPattern(m["pattern2"], "tdd.pattern2")
		t.Pattern2 = &p2
	}
	return t
}

func (w *walker) tddPattern(v any, f string) grid.TDDPattern {
	m := w.object(v, f, keys.tddPattern...)
	if m == nil {
		return grid.TDDPattern{}
	}
	var p grid.TDDPattern
	if m["periodMs"] == nil {
		w.fail(f+".periodMs", "the pattern has no periodMs; use one of %s ms.", periodList())
	} else if ms, ok := w.float(m["periodMs"], f+".periodMs"); ok {
		p.PeriodMs = ms
	}
	p.DownlinkSlots = w.intOr0(m["downlinkSlots"], f+".downlinkSlots")
	p.DownlinkSymbols = w.intOr0(m["downlinkSymbols"], f+".downlinkSymbols")
	p.UplinkSlots = w.intOr0(m["uplinkSlots"], f+".uplinkSlots")
	p.UplinkSymbols = w.intOr0(m["uplinkSymbols"], f+".uplinkSymbols")
	return p
}

func (w *walker) ssb(v any) *grid.SSBPlan {
	m := w.object(v, "ssb", keys.ssb...)
	if m == nil {
		return nil
	}
	return &grid.SSBPlan{
		SCSKHz:         w.intOr0(m["scsKHz"], "ssb.scsKHz"),
		Case:           w.str(m["case"], "ssb.case"),
		Bitmap:         w.bitmap(m["bitmap"], "ssb.bitmap"),
		OffsetToPointA: w.intOr0(m["offsetToPointA"], "ssb.offsetToPointA"),
		KSSB:           w.intOr0(m["kSsb"], "ssb.kSsb"),
		ScsCommonKHz:   w.intOr0(m["scsCommonKHz"], "ssb.scsCommonKHz"),
		PeriodMs:       w.intOr0(m["periodMs"], "ssb.periodMs"),
		GSCN:           w.optInt(m["gscn"], "ssb.gscn"),
	}
}

// bitmap reads a string of 0 and 1; YAML may read an unquoted one as a number.
func (w *walker) bitmap(v any, field string) string {
	if n, ok := v.(number); ok && strings.Trim(string(n), "01") == "" {
		return string(n)
	}
	return w.str(v, field)
}

func (w *walker) environment(v any) *grid.EnvironmentPlan {
	m := w.object(v, "environment", keys.environment...)
	if m == nil {
		return nil
	}
	e := &grid.EnvironmentPlan{DelayProfile: w.str(m["delayProfile"], "environment.delayProfile")}
	if m["delaySpreadNs"] != nil {
		e.DelaySpreadNs, _ = w.float(m["delaySpreadNs"], "environment.delaySpreadNs")
	}
	if m["speedKmh"] != nil {
		e.SpeedKmh, _ = w.float(m["speedKmh"], "environment.speedKmh")
	}
	if m["carrierMHz"] != nil {
		e.CarrierMHz, _ = w.float(m["carrierMHz"], "environment.carrierMHz")
	}
	if m["cellRadiusKm"] != nil {
		e.CellRadiusKm, _ = w.float(m["cellRadiusKm"], "environment.cellRadiusKm")
	}
	if m["latencyTargetMs"] != nil {
		e.LatencyTargetMs, _ = w.float(m["latencyTargetMs"], "environment.latencyTargetMs")
	}
	return e
}

func (w *walker) initialAccess(v any) *grid.InitialAccessPlan {
	const f = "initialAccess"
	m := w.object(v, f, keys.initialAccess...)
	if m == nil {
		return nil
	}
	ia := &grid.InitialAccessPlan{
		ControlResourceSetZero: w.intOr0(m["controlResourceSetZero"], f+".controlResourceSetZero"),
		SearchSpaceZero:        w.intOr0(m["searchSpaceZero"], f+".searchSpaceZero"),
		DMRSTypeAPosition:      w.str(m["dmrsTypeAPosition"], f+".dmrsTypeAPosition"),
	}
	if b := m["initialDownlinkBWP"]; b != nil {
		ia.InitialDownlinkBWP = w.initialBWP(b, f+".initialDownlinkBWP")
	}
	if b := m["initialUplinkBWP"]; b != nil {
		ia.InitialUplinkBWP = w.initialBWP(b, f+".initialUplinkBWP")
	}
	return ia
}

func (w *walker) initialBWP(v any, f string) *grid.InitialBWPPlan {
	m := w.object(v, f, keys.initialBWP...)
	if m == nil {
		return nil
	}
	return &grid.InitialBWPPlan{
		Partition:            w.str(m["partition"], f+".partition"),
		StartCRB:             w.optInt(m["startCrb"], f+".startCrb"),
		SizePRB:              w.intOr0(m["sizePrb"], f+".sizePrb"),
		LocationAndBandwidth: w.optInt(m["locationAndBandwidth"], f+".locationAndBandwidth"),
		SubcarrierSpacingKHz: w.intOr0(m["subcarrierSpacing"], f+".subcarrierSpacing"),
		CyclicPrefix:         w.str(m["cyclicPrefix"], f+".cyclicPrefix"),
	}
}

func (w *walker) prach(v any) *grid.PRACHPlan {
	const f = "prach"
	m := w.object(v, f, keys.prach...)
	if m == nil {
		return nil
	}
	p := &grid.PRACHPlan{
		ConfigurationIndex:        w.intOr0(m["configurationIndex"], f+".configurationIndex"),
		Msg1FDM:                   w.intOr0(m["msg1FDM"], f+".msg1FDM"),
		Msg1FrequencyStart:        w.intOr0(m["msg1FrequencyStart"], f+".msg1FrequencyStart"),
		ZeroCorrelationZoneConfig: w.intOr0(m["zeroCorrelationZoneConfig"], f+".zeroCorrelationZoneConfig"),
		RestrictedSetConfig:       w.str(m["restrictedSetConfig"], f+".restrictedSetConfig"),
		SSBPerRachOccasion:        w.fraction(m["ssbPerRachOccasion"], f+".ssbPerRachOccasion"),
	}
	if s := m["msg1SubcarrierSpacing"]; s != nil {
		p.Msg1SubcarrierSpacing, _ = w.float(s, f+".msg1SubcarrierSpacing")
	}
	return p
}

// fraction reads a value written as text ("1/8", "4") or as a number (4,
// 0.125), so that YAML's unquoted 4 and JSON's "1/8" both read; a number
// below 1 becomes the fraction 1/n it equals.
func (w *walker) fraction(v any, field string) string {
	n, ok := v.(number)
	if !ok {
		return w.str(v, field)
	}
	f, ok := w.float(n, field)
	if !ok {
		return ""
	}
	if f > 0 && f < 1 && 1/f == math.Trunc(1/f) {
		return "1/" + strconv.FormatFloat(1/f, 'f', -1, 64)
	}
	return strconv.FormatFloat(f, 'f', -1, 64)
}

func periodList() string {
	s := make([]string, len(grid.TDDPeriodsMs))
	for i, v := range grid.TDDPeriodsMs {
		s[i] = strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strings.Join(s, ", ")
}

// EncodeJSON writes p as an indented JSON plan file.
func EncodeJSON(p grid.Plan) ([]byte, error) {
	b, err := json.MarshalIndent(p, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// EncodeYAML writes p as a YAML plan file. Text that is not valid UTF-8
// is written with U+FFFD in place of the bad bytes, as EncodeJSON does:
// the YAML encoder would otherwise write it as !!binary, which DecodeYAML
// refuses, and a download must read back.
func EncodeYAML(p grid.Plan) ([]byte, error) {
	p = p.Clone()
	validUTF8(reflect.ValueOf(&p).Elem())
	var buf bytes.Buffer
	enc := yaml.NewEncoder(&buf)
	enc.SetIndent(2)
	if err := enc.Encode(p); err != nil {
		return nil, err
	}
	if err := enc.Close(); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// validUTF8 replaces the invalid bytes of every string v holds, following
// pointers, slices and structs (a plan's maps hold only numbers).
func validUTF8(v reflect.Value) {
	switch v.Kind() {
	case reflect.String:
		if v.CanSet() && !utf8.ValidString(v.String()) {
			v.SetString(strings.ToValidUTF8(v.String(), "\uFFFD"))
		}
	case reflect.Pointer:
		if !v.IsNil() {
			validUTF8(v.Elem())
		}
	case reflect.Slice:
		for i := range v.Len() {
			validUTF8(v.Index(i))
		}
	case reflect.Struct:
		for i := range v.NumField() {
			validUTF8(v.Field(i))
		}
	}
}

// yamlSyntaxError turns the YAML parser's error into the message users see.
//
// For a tab that breaks the indentation the parser names the line of the
// token before it ("line 7" for a tab on line 8, or further up across blank
// lines and comments), so the line is moved to the first line from there
// whose indentation holds a tab: only white space and comments lie between.
func yamlSyntaxError(data []byte, err error) error {
	msg := strings.TrimPrefix(err.Error(), "yaml: ")
	var line int
	if _, scanErr := fmt.Sscanf(msg, "line %d:", &line); scanErr == nil && strings.Contains(msg, "tab character") {
		lines := strings.Split(string(data), "\n")
		for n := line; n >= 1 && n <= len(lines); n++ {
			l := lines[n-1]
			if strings.ContainsRune(l[:len(l)-len(strings.TrimLeft(l, " \t"))], '\t') {
				_, rest, _ := strings.Cut(msg, ":")
				msg = fmt.Sprintf("line %d:%s", n, rest)
				break
			}
		}
	}
	return &FieldError{Msg: "The plan is not valid YAML: " + msg + "."}
}
