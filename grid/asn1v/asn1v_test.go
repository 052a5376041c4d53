package asn1v

import (
	"bytes"
	"errors"
	"reflect"
	"strings"
	"testing"
)

// The MIB of TS 38.331 6.2.2 in value notation, written by hand with the
// habits of pasted text: comments of both kinds, a field order of its own,
// white space inside a binary string.
const pasted = `-- a MIB as a log shows it
mib MIB ::= {
  subCarrierSpacingCommon scs30or120, -- 30 kHz in FR1
  systemFrameNumber '10 0110'B,
  /* pdcch-ConfigSIB1 packs two 4-bit indices */
  pdcch-ConfigSIB1 { controlResourceSetZero 12, searchSpaceZero 0 },
  ssb-SubcarrierOffset -0,
  cellBarred notBarred,
  spare 'A'H,
  list { 1, -2, c : TRUE }, flag FALSE, nothing NULL, s "a ""b"""
}
`

func TestParseShapes(t *testing.T) {
	doc, err := Parse([]byte(pasted))
	if err != nil {
		t.Fatal(err)
	}
	if len(doc.Assignments) != 1 || doc.Assignments[0].Name != "mib" || doc.Assignments[0].Type != "MIB" {
		t.Fatalf("assignments %+v", doc.Assignments)
	}
	if len(doc.Comments) != 1 || doc.Comments[0].Text != "a MIB as a log shows it" || doc.Comments[0].Pos != (Pos{1, 1}) {
		t.Errorf("document comments %+v", doc.Comments)
	}
	v := doc.Assignments[0].Value
	checks := []struct {
		field string
		kind  Kind
		text  string
		n     int64
	}{
		{"subCarrierSpacingCommon", Identifier, "scs30or120", 0},
		{"systemFrameNumber", BitString, "100110", 0},
		{"ssb-SubcarrierOffset", Integer, "", 0},
		{"cellBarred", Identifier, "notBarred", 0},
		{"spare", HexString, "A", 0},
		{"flag", Boolean, "", 0},
		{"nothing", Null, "", 0},
		{"s", String, `a "b"`, 0},
	}
	for _, c := range checks {
		got := v.Get(c.field)
		if got == nil || got.Kind != c.kind || got.Text != c.text || got.Int != c.n {
			t.Errorf("%s = %+v, want kind %v text %q int %d", c.field, got, c.kind, c.text, c.n)
		}
	}
	pdcch := v.Get("pdcch-ConfigSIB1")
	if pdcch.Get("controlResourceSetZero").Int != 12 || pdcch.Get("searchSpaceZero").Int != 0 {
		t.Errorf("pdcch-ConfigSIB1 = %+v", pdcch)
	}
	list := v.Get("list")
	if list.Kind != SequenceOf || len(list.Elems) != 3 || list.Elems[1].Int != -2 ||
		list.Elems[2].Kind != Choice || list.Elems[2].Name != "c" || !list.Elems[2].Elems[0].Bool {
		t.Errorf("list = %+v", list)
	}
	var texts []string
	for _, c := range v.Comments {
		texts = append(texts, c.Text)
	}
	want := []string{"30 kHz in FR1", " pdcch-ConfigSIB1 packs two 4-bit indices "}
	if !reflect.DeepEqual(texts, want) {
		t.Errorf("value comments %q, want %q", texts, want)
	}
	if v.Comments[1].Pos != (Pos{5, 3}) || !v.Comments[1].Block {
		t.Errorf("block comment at %v block %v, want line 5, column 3", v.Comments[1].Pos, v.Comments[1].Block)
	}
}

// equal compares two documents ignoring positions.
func equal(a, b *Document) bool {
	return bytes.Equal(Format(a), Format(b)) && reflect.DeepEqual(strip(a), strip(b))
}

func strip(d *Document) *Document {
	out := &Document{}
	for _, c := range d.Comments {
		c.Pos = Pos{}
		out.Comments = append(out.Comments, c)
	}
	for _, a := range d.Assignments {
		a.Pos = Pos{}
		a.Value = stripValue(a.Value)
		out.Assignments = append(out.Assignments, a)
	}
	return out
}

func stripValue(v *Value) *Value {
	if v == nil {
		return nil
	}
	w := *v
	w.Pos = Pos{}
	w.Fields, w.Elems, w.Comments = nil, nil, nil
	for _, f := range v.Fields {
		w.Fields = append(w.Fields, Field{Name: f.Name, Value: stripValue(f.Value)})
	}
	for _, e := range v.Elems {
		w.Elems = append(w.Elems, stripValue(e))
	}
	for _, c := range v.Comments {
		c.Pos = Pos{}
		w.Comments = append(w.Comments, c)
	}
	return &w
}

func TestFormatRoundTrip(t *testing.T) {
	doc, err := Parse([]byte(pasted))
	if err != nil {
		t.Fatal(err)
	}
	out := Format(doc)
	again, err := Parse(out)
	if err != nil {
		t.Fatalf("reparse: %v\n%s", err, out)
	}
	if !equal(doc, again) {
		t.Errorf("parse→format→parse changed the document:\n%s\n---\n%s", out, Format(again))
	}
	if !bytes.Equal(Format(again), out) {
		t.Error("format is not stable")
	}
	// The layout is fixed: two spaces per level, one item per line.
	if !strings.Contains(string(out), "mib MIB ::= {\n  -- 30 kHz in FR1\n") || !strings.Contains(string(out), "  pdcch-ConfigSIB1 {\n    controlResourceSetZero 12,\n    searchSpaceZero 0\n  },\n") {
		t.Errorf("unexpected layout:\n%s", out)
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct {
		text string
		pos  Pos
		msg  string
	}{
		{"mib MIB ::= {\n  a 1,\n  b\n}", Pos{4, 1}, "expected a value"},
		{"mib MIB ::= {\n  a 1\n  b 2\n}", Pos{3, 3}, "expected ',' or '}'"},
		{"mib MIB ::= {\n  a 1,\n  a 2\n}", Pos{3, 3}, "appears twice"},
		{"mib MIB = {}", Pos{1, 9}, "unexpected character"},
		{"mib MIB ::= {\n  a '012'B\n}", Pos{2, 5}, "other than 0 and 1"},
		{"mib MIB ::= {\n  a 99999999999999999999\n}", Pos{2, 5}, "64-bit"},
		{"mib MIB ::= {\n  a 1,\n}", Pos{3, 1}, "after ','"},
		{"mib MIB ::= {\n  a { b 1 }", Pos{2, 12}, "not closed"},
		{"mib MIB ::= {\n  a 1.5\n}", Pos{2, 5}, "real numbers"},
		{"x /* open", Pos{1, 3}, "not closed with */"},
		{"mib MIB ::= { a \"open }", Pos{1, 17}, "not closed"},
		{"mib MIB ::= { a-: 1 }", Pos{1, 15}, "ends with a hyphen"},
		{"mib ::= {}", Pos{1, 5}, "expected the type of mib"},
	}
	for _, c := range cases {
		_, err := Parse([]byte(c.text))
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("Parse(%q) = %v, want an *Error", c.text, err)
			continue
		}
		if e.Pos != c.pos || !strings.Contains(e.Msg, c.msg) {
			t.Errorf("Parse(%q) = %v, want %v and %q", c.text, err, c.pos, c.msg)
		}
	}
}

func TestDepthLimit(t *testing.T) {
	deep := "v T ::= " + strings.Repeat("{ ", MaxDepth+1) + strings.Repeat("} ", MaxDepth+1)
	if _, err := Parse([]byte(deep)); err == nil || !strings.Contains(err.Error(), "deeper") {
		t.Errorf("Parse of %d levels = %v, want a depth error", MaxDepth+1, err)
	}
	ok := "v T ::= " + strings.Repeat("{ ", MaxDepth) + strings.Repeat("} ", MaxDepth)
	if _, err := Parse([]byte(ok)); err != nil {
		t.Errorf("Parse of %d levels: %v", MaxDepth, err)
	}
}

func TestConstructedComments(t *testing.T) {
	// Text a writer puts in a comment cannot end the comment early.
	v := Seq(F("a", Int(1))).Note("x -- y\nz")
	v.Comments = append(v.Comments, Comment{Text: "p */ q", Block: true})
	doc := &Document{Assignments: []Assignment{{Name: "v", Type: "T", Value: v}}}
	back, err := Parse(Format(doc))
	if err != nil {
		t.Fatal(err)
	}
	got := back.Assignments[0].Value.Comments
	if len(got) != 2 || got[0].Text != "x - - y z" || got[1].Text != "p * / q" || back.Assignments[0].Value.Get("a").Int != 1 {
		t.Errorf("comments read back as %+v", got)
	}
}

func FuzzParse(f *testing.F) {
	f.Add([]byte(pasted))
	f.Add([]byte("a B ::= { c d : { e '0'B } }\n{ 1, 2 }"))
	f.Add([]byte("x Y ::= \"\"\"\" /* */ -- \n"))
	f.Add([]byte("v T ::= { a 1 -- b -- , c -5 }"))
	f.Fuzz(func(t *testing.T, data []byte) {
		doc, err := Parse(data)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) || e.Pos.Line < 1 || e.Pos.Col < 1 {
				t.Fatalf("error without a position: %v", err)
			}
			return
		}
		out := Format(doc)
		again, err := Parse(out)
		if err != nil {
			t.Fatalf("written text does not parse: %v\n%s", err, out)
		}
		if !equal(doc, again) {
			t.Fatalf("parse→write→parse is not stable:\n%q\n%q", out, Format(again))
		}
	})
}

func TestStartsWithAssignment(t *testing.T) {
	for text, want := range map[string]bool{
		"-- {a}\n/* b */ mib MIB ::= {": true,
		"mib MIB ::=":                   true,
		"name: campus\n":                false,
		"# comment\nname: x":            false,
		"--- \nname: x":                 false,
		"{ \"name\": 1 }":               false,
		"mib MIB = {}":                  false,
	} {
		if got := StartsWithAssignment([]byte(text)); got != want {
			t.Errorf("StartsWithAssignment(%q) = %v, want %v", text, got, want)
		}
	}
}
