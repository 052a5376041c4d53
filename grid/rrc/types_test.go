package rrc_test

import (
	"fmt"
	"go/ast"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode"

	"gridloom/grid"
	"gridloom/grid/asn1v"
	"gridloom/grid/rrc"
)

// typesFile is the second reading of the TS 38.331 V17.1.0 ASN.1 that the
// value notation is checked against (see its header for the source).
const typesFile = "../../testdata/reference/rrc/ts38331-v17.1.0-types.asn"

// asnType is a type of the excerpt, as far as value notation shows it.
type asnType struct {
	kind   string // SEQUENCE, SEQOF, CHOICE, ENUMERATED, INTEGER, BITSTRING, OCTETSTRING, BOOLEAN, NULL, REF
	comps  []asnComp
	elem   *asnType // SEQOF's element
	lo, hi string   // INTEGER range, or SEQOF and BITSTRING size
	enums  []string
	ref    string // REF: the type named
	params []*asnType
}

type asnComp struct {
	name     string
	t        *asnType
	optional bool
}

// asnModule is the excerpt: its types, the parameters of parameterised
// types, and its INTEGER constants.
type asnModule struct {
	types  map[string]*asnType
	params map[string][]string
	consts map[string]int
}

// asnTokens splits the excerpt into tokens, dropping comments.
func asnTokens(src string) []string {
	var out []string
	for _, line := range strings.Split(src, "\n") {
		if i := strings.Index(line, "--"); i >= 0 {
			line = line[:i]
		}
		for i := 0; i < len(line); {
			c := line[i]
			switch {
			case c == ' ' || c == '\t' || c == '\r':
				i++
			case strings.HasPrefix(line[i:], "::="):
				out, i = append(out, "::="), i+3
			case strings.HasPrefix(line[i:], "..."):
				out, i = append(out, "..."), i+3
			case strings.HasPrefix(line[i:], ".."):
				out, i = append(out, ".."), i+2
			case strings.HasPrefix(line[i:], "[["), strings.HasPrefix(line[i:], "]]"):
				out, i = append(out, line[i:i+2]), i+2
			case strings.ContainsRune("{}(),", rune(c)):
				out, i = append(out, string(c)), i+1
			default:
				j := i + 1
				for j < len(line) && (unicode.IsLetter(rune(line[j])) || unicode.IsDigit(rune(line[j])) || line[j] == '-') {
					if line[j] == '-' && j+1 < len(line) && line[j+1] == '-' {
						break
					}
					j++
				}
				out, i = append(out, line[i:j]), j
			}
		}
	}
	return out
}

type asnParser struct {
	toks []string
	i    int
}

func (p *asnParser) peek() string {
	if p.i < len(p.toks) {
		return p.toks[p.i]
	}
	return ""
}

func (p *asnParser) next() string { s := p.peek(); p.i++; return s }

func (p *asnParser) want(s string) {
	if got := p.next(); got != s {
		panic(fmt.Sprintf("token %d: want %q, got %q", p.i, s, got))
	}
}

// bounds reads "(lo..hi)" or "(n)" after the opening parenthesis.
func (p *asnParser) bounds() (lo, hi string) {
	lo = p.next()
	hi = lo
	if p.peek() == ".." {
		p.next()
		hi = p.next()
	}
	p.want(")")
	return lo, hi
}

func (p *asnParser) size() (lo, hi string) {
	p.want("(")
	p.want("SIZE")
	p.want("(")
	lo, hi = p.bounds()
	p.want(")")
	return lo, hi
}

func (p *asnParser) typ() *asnType {
	switch t := p.next(); t {
	case "SEQUENCE":
		if p.peek() == "(" {
			lo, hi := p.size()
			p.want("OF")
			return &asnType{kind: "SEQOF", lo: lo, hi: hi, elem: p.typ()}
		}
		if p.peek() == "OF" {
			p.next()
			return &asnType{kind: "SEQOF", elem: p.typ()}
		}
		return &asnType{kind: "SEQUENCE", comps: p.comps()}
	case "CHOICE":
		return &asnType{kind: "CHOICE", comps: p.comps()}
	case "ENUMERATED":
		out := &asnType{kind: "ENUMERATED"}
		p.want("{")
		for s := p.next(); s != "}"; s = p.next() {
			if s != "," && s != "..." {
				out.enums = append(out.enums, s)
			}
		}
		return out
	case "INTEGER":
		out := &asnType{kind: "INTEGER"}
		if p.peek() == "(" {
			p.next()
			out.lo, out.hi = p.bounds()
		}
		return out
	case "BIT":
		p.want("STRING")
		out := &asnType{kind: "BITSTRING"}
		if p.peek() == "(" {
			out.lo, out.hi = p.size()
		}
		return out
	case "OCTET":
		p.want("STRING")
		return &asnType{kind: "OCTETSTRING"}
	case "BOOLEAN", "NULL":
		return &asnType{kind: t}
	default:
		out := &asnType{kind: "REF", ref: t}
		if p.peek() == "{" {
			p.next()
			out.params = append(out.params, p.typ())
			p.want("}")
		}
		return out
	}
}

// comps reads the components of a SEQUENCE or the alternatives of a
// CHOICE; extension markers and the brackets of extension groups are
// dropped, since value notation lists those components with the others.
func (p *asnParser) comps() []asnComp {
	var out []asnComp
	p.want("{")
	for {
		switch p.peek() {
		case "}":
			p.next()
			return out
		case ",", "...", "[[", "]]":
			p.next()
			continue
		}
		c := asnComp{name: p.next(), t: p.typ()}
		if p.peek() == "OPTIONAL" {
			p.next()
			c.optional = true
		}
		out = append(out, c)
	}
}

func loadTypes(t testing.TB) asnModule {
	t.Helper()
	src, err := os.ReadFile(typesFile)
	if err != nil {
		t.Fatal(err)
	}
	m := asnModule{types: map[string]*asnType{}, params: map[string][]string{}, consts: map[string]int{}}
	p := &asnParser{toks: asnTokens(string(src))}
	defer func() {
		if r := recover(); r != nil {
			t.Fatalf("%s: %v", typesFile, r)
		}
	}()
	for p.peek() != "" {
		name := p.next()
		if p.peek() == "INTEGER" {
			p.next()
			p.want("::=")
			n, err := strconv.Atoi(p.next())
			if err != nil {
				t.Fatalf("%s: constant %s: %v", typesFile, name, err)
			}
			m.consts[name] = n
			continue
		}
		if p.peek() == "{" {
			p.next()
			m.params[name] = append(m.params[name], p.next())
			p.want("}")
		}
		p.want("::=")
		m.types[name] = p.typ()
	}
	return m
}

// resolve follows type references, substituting the arguments of a
// parameterised type (SetupRelease { X }). It returns nil for a type the
// excerpt does not define.
func (m asnModule) resolve(t *asnType, args map[string]*asnType) *asnType {
	for t != nil && t.kind == "REF" {
		if a, ok := args[t.ref]; ok {
			t, args = a, nil
			continue
		}
		def, ok := m.types[t.ref]
		if !ok {
			return nil
		}
		if names := m.params[t.ref]; len(names) > 0 {
			sub := map[string]*asnType{}
			for i, n := range names {
				sub[n] = t.params[i]
			}
			return m.bind(def, sub)
		}
		t = def
	}
	return t
}

// bind replaces parameter references in a parameterised type's body.
func (m asnModule) bind(t *asnType, args map[string]*asnType) *asnType {
	if t.kind == "REF" {
		if a, ok := args[t.ref]; ok {
			return a
		}
		return t
	}
	out := *t
	out.comps = nil
	for _, c := range t.comps {
		c.t = m.bind(c.t, args)
		out.comps = append(out.comps, c)
	}
	if t.elem != nil {
		out.elem = m.bind(t.elem, args)
	}
	return &out
}

func (m asnModule) bound(s string) int {
	if n, err := strconv.Atoi(s); err == nil {
		return n
	}
	n, ok := m.consts[s]
	if !ok {
		panic("constant " + s + " is not in the excerpt")
	}
	return n
}

// typeWalk checks a value against a type of the excerpt and records what
// it met.
type typeWalk struct {
	m       asnModule
	errs    []string
	fields  map[string]bool // Type.component pairs met
	enums   int
	mention int // mandatory components left out and named in a comment
}

func (w *typeWalk) errorf(format string, args ...any) {
	w.errs = append(w.errs, fmt.Sprintf(format, args...))
}

// outside reports whether n (a count of elements or bits, or an integer)
// lies outside the bounds rt gives; false when rt has none.
func (w *typeWalk) outside(rt *asnType, n int64) bool {
	return rt.lo != "" && (n < int64(w.m.bound(rt.lo)) || n > int64(w.m.bound(rt.hi)))
}

func mentions(v *asn1v.Value, name string) bool {
	for _, c := range v.Comments {
		for _, word := range strings.FieldsFunc(c.Text, func(r rune) bool { return r == ' ' || r == ',' || r == ':' || r == '(' || r == ')' || r == ';' }) {
			if word == name {
				return true
			}
		}
	}
	return false
}

// shapes are the value shapes of the excerpt's kinds that take one shape
// (an ENUMERATED value is checked against its names instead).
var shapes = map[string]struct {
	kind asn1v.Kind
	name string
}{
	"SEQUENCE":  {asn1v.Sequence, "a SEQUENCE"},
	"SEQOF":     {asn1v.SequenceOf, "a SEQUENCE OF"},
	"CHOICE":    {asn1v.Choice, "a CHOICE"},
	"INTEGER":   {asn1v.Integer, "an INTEGER"},
	"BITSTRING": {asn1v.BitString, "a BIT STRING"},
}

func (w *typeWalk) walk(path, typeName string, v *asn1v.Value, t *asnType) {
	rt := w.m.resolve(t, nil)
	if rt == nil {
		w.errorf("%s: type %s is not in the excerpt, but gridloom writes a value of it", path, t.ref)
		return
	}
	if t.kind == "REF" && len(t.params) == 0 {
		typeName = t.ref
	}
	if want, ok := shapes[rt.kind]; ok && v.Kind != want.kind {
		w.errorf("%s: %s is %s, written as a %s", path, typeName, want.name, v.Kind)
		return
	}
	switch rt.kind {
	case "SEQUENCE":
		last := -1
		for _, f := range v.Fields {
			i := slices.IndexFunc(rt.comps, func(c asnComp) bool { return c.name == f.Name })
			if i < 0 {
				w.errorf("%s: %s has no component %s", path, typeName, f.Name)
				continue
			}
			if i <= last {
				w.errorf("%s: %s comes before %s in %s, so value notation lists it first", path, f.Name, rt.comps[last].name, typeName)
			}
			last = i
			w.fields[typeName+"."+f.Name] = true
			w.walk(path+"."+f.Name, typeName+"."+f.Name, f.Value, rt.comps[i].t)
		}
		for _, c := range rt.comps {
			if c.optional || v.Get(c.name) != nil {
				continue
			}
			if !mentions(v, c.name) {
				w.errorf("%s: the mandatory %s.%s is left out without a comment naming it", path, typeName, c.name)
			} else {
				w.mention++
			}
		}
	case "SEQOF":
		if w.outside(rt, int64(len(v.Elems))) {
			w.errorf("%s: %d elements, but %s allows %s to %s", path, len(v.Elems), typeName, rt.lo, rt.hi)
		}
		for i, e := range v.Elems {
			w.walk(fmt.Sprintf("%s[%d]", path, i), typeName, e, rt.elem)
		}
	case "CHOICE":
		i := slices.IndexFunc(rt.comps, func(c asnComp) bool { return c.name == v.Name })
		if i < 0 {
			w.errorf("%s: %s has no alternative %s", path, typeName, v.Name)
			return
		}
		w.fields[typeName+"."+v.Name] = true
		w.walk(path+"."+v.Name, typeName+"."+v.Name, v.Elems[0], rt.comps[i].t)
	case "ENUMERATED":
		if v.Kind != asn1v.Identifier || !slices.Contains(rt.enums, v.Text) {
			w.errorf("%s: %s is not a value of %s %v", path, v.Text, typeName, rt.enums)
		}
		w.enums++
	case "INTEGER":
		if w.outside(rt, v.Int) {
			w.errorf("%s: %d is outside %s (%s..%s)", path, v.Int, typeName, rt.lo, rt.hi)
		}
	case "BITSTRING":
		if w.outside(rt, int64(len(v.Text))) {
			w.errorf("%s: %d bits, but %s has SIZE (%s..%s)", path, len(v.Text), typeName, rt.lo, rt.hi)
		}
	default:
		w.errorf("%s: gridloom writes a value of %s (%s), which it has no reason to", path, typeName, rt.kind)
	}
}

// TestValuesFollowTS38331Types walks every value gridloom writes for the
// demo plans and the plans that reach its other branches through the type
// definitions of TS 38.331 V17.1.0 (testdata/reference/rrc/
// ts38331-v17.1.0-types.asn): each assignment's type is an IE there, each
// field a component of its SEQUENCE in definition order, each CHOICE
// (SetupRelease's setup, ssb-PositionsInBurst's bitmaps) an alternative,
// each identifier a value of its ENUMERATED, each INTEGER inside its range
// and each BIT STRING of its size; a mandatory component left out must be
// named in a comment of its value.
//
// Differences this walk found against what had been written from memory,
// each fixed to what the V17.1.0 text says:
//   - UplinkConfigCommonSIB's initialUplinkBWP is mandatory; a plan with
//     uplink partitions but no initialAccess wrote uplinkConfigCommon
//     without saying it was left out.
//   - FrequencyInfoDL-SIB's offsetToPointA is mandatory; a plan without
//     SS/PBCH blocks left it out without saying so.
//   - RACH-ConfigCommon's msg1-SubcarrierSpacing is "OPTIONAL -- Cond L139",
//     which the field's conditional presence makes mandatory for a short
//     (L = 139) format; gridloom wrote it only when the plan gave it, and
//     now writes the spacing Compute resolved, with a note when the plan
//     left it to its default.
//
// Shapes written from memory that the text confirms as they were: the band
// lists (FrequencyInfoDL-SIB's MultiFrequencyBandListNR-SIB is SEQUENCE
// (SIZE (1..maxNrofMultiBands)) OF NR-MultiBandInfo, whose
// freqBandIndicatorNR is OPTIONAL, Cond OptULNotSIB2; FrequencyInfoDL's
// MultiFrequencyBandListNR a SEQUENCE OF FreqBandIndicatorNR,
// INTEGER (1..1024)); pdcch-ConfigCommon and rach-ConfigCommon as
// SetupRelease { ... }, written "setup : { ... }"; prach-ConfigurationIndex-v1610
// INTEGER (256..262) in RACH-ConfigGeneric's first extension group, the
// UE ignoring prach-ConfigurationIndex when it is present;
// msg1-SubcarrierSpacing a SubcarrierSpacing of RACH-ConfigCommon;
// ssb-PeriodicityServingCell without spares in the SIB and
// ssb-periodicityServingCell with spare2, spare1 in ServingCellConfigCommon.
func TestValuesFollowTS38331Types(t *testing.T) {
	m := loadTypes(t)
	w := &typeWalk{m: m, fields: map[string]bool{}}
	for name, p := range exportPlans(t) {
		doc, err := rrc.Document(p)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		for _, a := range doc.Assignments {
			if _, ok := m.types[a.Type]; !ok {
				w.errorf("%s: %s %s: the excerpt has no type %s", name, a.Name, a.Type, a.Type)
				continue
			}
			w.walk(name+": "+a.Name, a.Type, a.Value, &asnType{kind: "REF", ref: a.Type})
		}
	}
	for _, e := range w.errs {
		t.Error(e)
	}
	// Each branch the writer has must be reached, or the walk proves
	// nothing about it.
	for _, f := range []string{
		"MIB.subCarrierSpacingCommon", "MIB.pdcch-ConfigSIB1", "PDCCH-ConfigSIB1.controlResourceSetZero",
		"FrequencyInfoDL-SIB.frequencyBandList", "NR-MultiBandInfo.freqBandIndicatorNR", "FrequencyInfoDL.frequencyBandList",
		"BWP-DownlinkCommon.pdcch-ConfigCommon", "BWP-DownlinkCommon.pdcch-ConfigCommon.setup",
		"BWP-UplinkCommon.rach-ConfigCommon.setup", "RACH-ConfigGeneric.prach-ConfigurationIndex-v1610",
		"RACH-ConfigCommon.msg1-SubcarrierSpacing", "ServingCellConfigCommon.ssb-PositionsInBurst.shortBitmap",
		"ServingCellConfigCommon.ssb-PositionsInBurst.mediumBitmap", "ServingCellConfigCommon.ssb-PositionsInBurst.longBitmap",
		"ServingCellConfigCommon.n-TimingAdvanceOffset", "TDD-UL-DL-Pattern.dl-UL-TransmissionPeriodicity-v1530",
		"BWP.cyclicPrefix", "BWP-Uplink.bwp-Id", "BWP-Downlink.bwp-Common", "ServingCellConfigCommonSIB.ssb-PositionsInBurst.groupPresence",
	} {
		if !w.fields[f] {
			t.Errorf("no plan writes %s; the walk does not reach it", f)
		}
	}
	t.Logf("%d components and %d enumeration values checked against TS 38.331 V17.1.0; %d mandatory components left out, each named in a comment", len(w.fields), w.enums, w.mention)
}

// TestEnumerationsAreTS38331 compares the enumerations the reader and
// writer spell (names.go, rach.go, grid.NTAOffsets) value by value, in
// order, with the excerpt: a missing or misspelt value, or one in the
// wrong place, fails.
func TestEnumerationsAreTS38331(t *testing.T) {
	m := loadTypes(t)
	comp := func(typ, name string) *asnType {
		def := m.types[typ]
		for _, c := range def.comps {
			if c.name == name {
				return m.resolve(c.t, nil)
			}
		}
		t.Fatalf("%s has no component %s", typ, name)
		return nil
	}
	names := func(ty *asnType) []string {
		if ty.kind == "CHOICE" {
			var out []string
			for _, c := range ty.comps {
				out = append(out, c.name)
			}
			return out
		}
		return ty.enums
	}
	spec := map[string][]string{
		"SubcarrierSpacing":                         m.types["SubcarrierSpacing"].enums,
		"dl-UL-TransmissionPeriodicity":             names(comp("TDD-UL-DL-Pattern", "dl-UL-TransmissionPeriodicity")),
		"dl-UL-TransmissionPeriodicity-v1530":       names(comp("TDD-UL-DL-Pattern", "dl-UL-TransmissionPeriodicity-v1530")),
		"ssb-PeriodicityServingCell":                names(comp("ServingCellConfigCommonSIB", "ssb-PeriodicityServingCell")),
		"msg1-FDM":                                  names(comp("RACH-ConfigGeneric", "msg1-FDM")),
		"restrictedSetConfig":                       names(comp("RACH-ConfigCommon", "restrictedSetConfig")),
		"ssb-perRACH-OccasionAndCB-PreamblesPerSSB": names(comp("RACH-ConfigCommon", "ssb-perRACH-OccasionAndCB-PreamblesPerSSB")),
		"n-TimingAdvanceOffset":                     names(comp("ServingCellConfigCommon", "n-TimingAdvanceOffset")),
	}
	got := rrc.Enumerations()
	cells := 0
	for key, want := range spec {
		// spare values name no value a plan can take.
		want = slices.DeleteFunc(slices.Clone(want), func(s string) bool { return strings.HasPrefix(s, "spare") })
		if !slices.Equal(got[key], want) {
			t.Errorf("%s: gridloom spells %v, TS 38.331 V17.1.0 %v", key, got[key], want)
		}
		cells += len(want)
	}
	t.Logf("%d enumerations, %d values compared with TS 38.331 V17.1.0", len(spec), cells)
	if len(got) != len(spec) {
		t.Errorf("gridloom has %d enumerations, the check covers %d", len(got), len(spec))
	}
}

// TestReaderNamesAreTS38331 reads the reader's source for the field names
// it looks for (the names given to its seq helper) and checks each against
// the excerpt: against the named type when the call names one, else
// against every component the excerpt has.
func TestReaderNamesAreTS38331(t *testing.T) {
	m := loadTypes(t)
	all := map[string]bool{}
	var gather func(ty *asnType)
	gather = func(ty *asnType) {
		for _, c := range ty.comps {
			all[c.name] = true
			gather(c.t)
		}
		if ty.elem != nil {
			gather(ty.elem)
		}
	}
	for _, ty := range m.types {
		gather(ty)
	}
	consts := map[string]string{"typeMIB": "MIB", "typeBCCHBCH": "BCCH-BCH-Message", "typeSIB1": "SIB1", "typeFreqDL": "FrequencyInfoDL"}
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	fset := token.NewFileSet()
	checked := 0
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fset, name, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		ast.Inspect(f, func(n ast.Node) bool {
			call, ok := n.(*ast.CallExpr)
			if !ok {
				return true
			}
			sel, ok := call.Fun.(*ast.SelectorExpr)
			if !ok || sel.Sel.Name != "seq" || len(call.Args) < 3 {
				return true
			}
			var typ string
			switch a := call.Args[1].(type) {
			case *ast.BasicLit:
				typ, _ = strconv.Unquote(a.Value)
			case *ast.Ident:
				typ = consts[a.Name]
			}
			def := m.types[typ]
			for _, arg := range call.Args[2:] {
				lit, ok := arg.(*ast.BasicLit)
				if !ok {
					continue
				}
				field, _ := strconv.Unquote(lit.Value)
				checked++
				switch {
				case def != nil && m.resolve(def, nil).kind == "SEQUENCE" && !slices.ContainsFunc(m.resolve(def, nil).comps, func(c asnComp) bool { return c.name == field }):
					t.Errorf("%s: the reader looks for %s in %s, which has no such component", fset.Position(lit.Pos()), field, typ)
				case !all[field]:
					t.Errorf("%s: the reader looks for %s, a component of no type in the excerpt", fset.Position(lit.Pos()), field)
				}
			}
			return true
		})
	}
	if checked < 50 {
		t.Errorf("only %d field names found in the reader", checked)
	}
	t.Logf("%d field names the reader looks for, all in TS 38.331 V17.1.0", checked)
}

// TestTypeWalkFails shows the walk can fail: a value with a misspelt
// field, fields out of order, an enumeration value 38.331 lacks, a
// SetupRelease written bare and a mandatory field left out without a word
// gives one error each.
func TestTypeWalkFails(t *testing.T) {
	m := loadTypes(t)
	w := &typeWalk{m: m, fields: map[string]bool{}}
	bwp := asn1v.Seq(
		asn1v.F("genericParameters", asn1v.Seq(
			asn1v.F("subcarrierSpacing", asn1v.Ident("kHz30")), // after locationAndBandwidth in BWP
			asn1v.F("locationAndBandwidth", asn1v.Int(1099)),   // out of order
			asn1v.F("cyclicPrefix", asn1v.Ident("normal")),     // BWP's only value is extended
		)),
		asn1v.F("pdcch-ConfigCommon", asn1v.Seq(asn1v.F("searchSpaceZero", asn1v.Int(0)))), // setup : { ... } missing
	)
	v := asn1v.Seq(asn1v.F("bwp-Common", bwp), asn1v.F("bwp-Idx", asn1v.Int(1))) // misspelt; bwp-Id left out
	w.walk("test", "BWP-Downlink", v, &asnType{kind: "REF", ref: "BWP-Downlink"})
	if len(w.errs) != 5 {
		t.Errorf("%d errors, want 5 (order, enumeration, SetupRelease, misspelt field, mandatory bwp-Id):\n%s", len(w.errs), strings.Join(w.errs, "\n"))
	}
}

// checkPlanValues walks a plan's value notation through the TS 38.331
// types (as TestValuesFollowTS38331Types does) and checks its bandwidth
// parts: each partition is one BWP-Downlink or BWP-Uplink, by its
// direction, in plan order, whose bwp-Id counts 1 to 4 per direction and
// whose only fields are bwp-Id and bwp-Common.genericParameters — the
// partition's locationAndBandwidth, subcarrierSpacing and, for the
// extended cyclic prefix only, cyclicPrefix — since the plan determines
// nothing else of a BWP (pdcch-ConfigCommon, bwp-Dedicated, … are left
// out and named in a comment).
func checkPlanValues(t testing.TB, m asnModule, name string, p grid.Plan) {
	t.Helper()
	doc, err := rrc.Document(p)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	w := &typeWalk{m: m, fields: map[string]bool{}}
	var bwps []asn1v.Assignment
	for _, a := range doc.Assignments {
		w.walk(name+": "+a.Name, a.Type, a.Value, &asnType{kind: "REF", ref: a.Type})
		if a.Type == "BWP-Downlink" || a.Type == "BWP-Uplink" {
			bwps = append(bwps, a)
		}
	}
	for _, e := range w.errs {
		t.Error(e)
	}
	r := grid.Compute(p)
	if len(bwps) != len(r.Partitions) {
		t.Fatalf("%s: %d BWP values for %d partitions", name, len(bwps), len(r.Partitions))
	}
	ids := map[string]int{}
	for i, l := range r.Partitions {
		a := bwps[i]
		want := "BWP-Downlink"
		if l.Direction == grid.UL {
			want = "BWP-Uplink"
		}
		ids[want]++
		v := a.Value
		g := v.Get("bwp-Common").Get("genericParameters")
		switch {
		case a.Type != want:
			t.Errorf("%s: partition %d (%s) is written as %s", name, i, l.Direction, a.Type)
		case len(v.Fields) != 2 || v.Fields[0].Name != "bwp-Id" || v.Fields[1].Name != "bwp-Common" || len(v.Get("bwp-Common").Fields) != 1 || g == nil:
			t.Errorf("%s: %s holds more or less than bwp-Id and bwp-Common.genericParameters", name, a.Name)
		case v.Get("bwp-Id").Int != int64(ids[want]):
			t.Errorf("%s: %s has bwp-Id %d, want %d", name, a.Name, v.Get("bwp-Id").Int, ids[want])
		case g.Get("locationAndBandwidth").Int != int64(l.LocationAndBandwidth):
			t.Errorf("%s: %s locationAndBandwidth %d, the partition's is %d", name, a.Name, g.Get("locationAndBandwidth").Int, l.LocationAndBandwidth)
		case g.Get("subcarrierSpacing").Text != rrc.Enumerations()["SubcarrierSpacing"][l.Numerology.Mu]:
			t.Errorf("%s: %s subcarrierSpacing %s for μ = %d", name, a.Name, g.Get("subcarrierSpacing").Text, l.Numerology.Mu)
		case (g.Get("cyclicPrefix") != nil) != (l.Numerology.CP == grid.ExtendedCP):
			t.Errorf("%s: %s cyclicPrefix %v for a %v cyclic prefix", name, a.Name, g.Get("cyclicPrefix"), l.Numerology.CP)
		}
	}
}

// TestPartitionsAreBWPs runs checkPlanValues over the demo plans and the
// plans of the other branches; TestRoundTripRandomPlans and FuzzRoundTrip
// run it over their generated plans.
func TestPartitionsAreBWPs(t *testing.T) {
	m := loadTypes(t)
	for name, p := range exportPlans(t) {
		checkPlanValues(t, m, name, p)
	}
}

// TestTypeWalkBounds: the walk holds INTEGER values and SEQUENCE OF sizes
// to the excerpt's bounds. TS 38.331 V17.1.0: BWP-Id ::= INTEGER
// (0..maxNrofBWPs) and SEQUENCE (SIZE (1..maxSCSs)) OF SCS-SpecificCarrier,
// with maxNrofBWPs = 4 and maxSCSs = 5 (clause 6.4).
func TestTypeWalkBounds(t *testing.T) {
	m := loadTypes(t)
	if m.bound("maxNrofBWPs") != 4 || m.bound("maxSCSs") != 5 {
		t.Fatalf("the excerpt has maxNrofBWPs %d and maxSCSs %d; TS 38.331 6.4 has 4 and 5", m.bound("maxNrofBWPs"), m.bound("maxSCSs"))
	}
	list := &asnType{kind: "SEQOF", lo: "1", hi: "maxSCSs", elem: &asnType{kind: "INTEGER"}}
	for _, c := range []struct {
		name string
		v    *asn1v.Value
		t    *asnType
		want string // "" for no error
	}{
		{"BWP-Id 4", asn1v.Int(4), &asnType{kind: "REF", ref: "BWP-Id"}, ""},
		{"BWP-Id 5", asn1v.Int(5), &asnType{kind: "REF", ref: "BWP-Id"}, "5 is outside BWP-Id (0..maxNrofBWPs)"},
		{"BWP-Id -1", asn1v.Int(-1), &asnType{kind: "REF", ref: "BWP-Id"}, "-1 is outside"},
		{"5 carriers", asn1v.SeqOf(asn1v.Int(0), asn1v.Int(0), asn1v.Int(0), asn1v.Int(0), asn1v.Int(0)), list, ""},
		{"no carrier", asn1v.SeqOf(), list, "0 elements, but list allows 1 to maxSCSs"},
		{"6 carriers", asn1v.SeqOf(asn1v.Int(0), asn1v.Int(0), asn1v.Int(0), asn1v.Int(0), asn1v.Int(0), asn1v.Int(0)), list, "6 elements"},
	} {
		w := &typeWalk{m: m, fields: map[string]bool{}}
		w.walk("test", "list", c.v, c.t)
		got := strings.Join(w.errs, "; ")
		if (c.want == "") != (got == "") || !strings.Contains(got, c.want) {
			t.Errorf("%s: errors %q, want %q", c.name, got, c.want)
		}
	}
}
