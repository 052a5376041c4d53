// Package asn1v reads and writes ASN.1 value notation (ITU-T X.680): the
// text form in which 3GPP specifications, test specifications and base
// station logs show a message, such as
//
//	mib MIB ::= {
//	  systemFrameNumber '000000'B,
//	  subCarrierSpacingCommon scs30or120,
//	  pdcch-ConfigSIB1 { controlResourceSetZero 12, searchSpaceZero 0 }
//	}
//
// It knows no ASN.1 types: a value is read by its shape alone, which is what
// lets gridloom read a configuration pasted from a log without the 38.331
// module. The shapes are SEQUENCE and SET values { name value, ... },
// SEQUENCE OF and SET OF values { value, value }, CHOICE values
// name : value, INTEGER, identifiers (enumerations and value references),
// BOOLEAN (TRUE, FALSE), BIT STRING ('0101'B, 'A5'H), NULL and character
// strings ("text"). A document is a list of value assignments
// (name Type ::= value). Comments are kept: "--" to the end of the line or
// to the next "--", and "/* ... */" (not nested), each attached to the
// brace value or document it stands in, so a reader can pick up notes
// written as comments.
//
// # Why by hand
//
// No maintained Go library parses X.680 value notation. The standard
// library's encoding/asn1 and golang.org/x/crypto/cryptobyte read and write
// DER (X.690) only; the value-notation readers found (asn1vnparser for
// Python, the avn module of the Rust crate rasn, snacc's C value parser) are
// not Go. The subset above is small, so this package parses it by hand with
// one token of look-ahead.
//
// # Security
//
// Parse takes untrusted text. It refuses input over MaxSize bytes, nesting
// deeper than MaxDepth, and integers outside int64, and reports every
// problem with its line and column; it never panics (FuzzParse).
package asn1v

import (
	"fmt"
	"strconv"
)

// Limits on what Parse accepts.
const (
	MaxSize  = 1 << 20 // bytes of text
	MaxDepth = 64      // nested braces and choices
)

// Kind is the shape of a value.
type Kind int

// The shapes of a value. An empty pair of braces is a Sequence with no
// fields: value notation cannot tell an empty SEQUENCE from an empty
// SEQUENCE OF.
const (
	Sequence   Kind = iota // { name value, ... }: SEQUENCE or SET
	SequenceOf             // { value, ... }: SEQUENCE OF or SET OF
	Choice                 // name : value
	Integer
	Identifier // an enumeration or a value reference
	Boolean
	BitString // 'bits'B
	HexString // 'hex'H
	Null
	String // "characters"
)

var kindNames = [...]string{"SEQUENCE", "SEQUENCE OF", "CHOICE", "INTEGER", "identifier", "BOOLEAN", "binary string", "hexadecimal string", "NULL", "character string"}

// String names the kind as a message would.
func (k Kind) String() string {
	if k < 0 || int(k) >= len(kindNames) {
		return "Kind(" + strconv.Itoa(int(k)) + ")"
	}
	return kindNames[k]
}

// Pos is a place in the text: Line and Col count from 1, Col in characters.
type Pos struct {
	Line, Col int
}

func (p Pos) String() string { return fmt.Sprintf("line %d, column %d", p.Line, p.Col) }

// Comment is one comment as written, without its delimiters. Block is true
// for /* */ comments, which may hold several lines.
type Comment struct {
	Text  string
	Block bool
	Pos   Pos
}

// Value is one value. Which fields are set depends on Kind: Fields for
// Sequence, Elems for SequenceOf, Name and Elems[0] for Choice, Int for
// Integer, Bool for Boolean, Text for Identifier, String, BitString (the
// binary digits) and HexString (the hexadecimal digits, upper case).
type Value struct {
	Kind     Kind
	Pos      Pos
	Fields   []Field
	Elems    []*Value
	Name     string
	Int      int64
	Bool     bool
	Text     string
	Comments []Comment // comments inside the braces of a Sequence or SequenceOf
}

// Field is one named component of a Sequence value.
type Field struct {
	Name  string
	Pos   Pos
	Value *Value
}

// Assignment is a value assignment, Name Type ::= Value.
type Assignment struct {
	Name  string
	Type  string
	Pos   Pos
	Value *Value
}

// Document is a parsed text: its value assignments in order and the
// comments that stand outside every value.
type Document struct {
	Assignments []Assignment
	Comments    []Comment
}

// Error is a problem at one place in the text.
type Error struct {
	Pos Pos
	Msg string
}

func (e *Error) Error() string { return "ASN.1 value notation, " + e.Pos.String() + ": " + e.Msg }

// Get returns the value of the named field of a Sequence, or nil.
func (v *Value) Get(name string) *Value {
	if v == nil || v.Kind != Sequence {
		return nil
	}
	for _, f := range v.Fields {
		if f.Name == name {
			return f.Value
		}
	}
	return nil
}

// Constructors, for writers that build a value tree.

// Seq returns a Sequence value with the fields given in pairs of a name and
// a value; a nil value leaves its field out, which is how an absent
// OPTIONAL component is written.
func Seq(fields ...Field) *Value {
	v := &Value{Kind: Sequence}
	for _, f := range fields {
		if f.Value != nil {
			v.Fields = append(v.Fields, f)
		}
	}
	return v
}

// F pairs a field name with its value, for Seq.
func F(name string, v *Value) Field { return Field{Name: name, Value: v} }

// SeqOf returns a SequenceOf value.
func SeqOf(elems ...*Value) *Value { return &Value{Kind: SequenceOf, Elems: elems} }

// Int returns an Integer value.
func Int(n int) *Value { return &Value{Kind: Integer, Int: int64(n)} }

// Ident returns an Identifier value, such as an enumeration.
func Ident(s string) *Value { return &Value{Kind: Identifier, Text: s} }

// Bits returns a BitString value from a string of 0 and 1.
func Bits(s string) *Value { return &Value{Kind: BitString, Text: s} }

// Choose returns a Choice value.
func Choose(name string, v *Value) *Value {
	return &Value{Kind: Choice, Name: name, Elems: []*Value{v}}
}

// Note adds line comments to a Sequence or SequenceOf value and returns it.
func (v *Value) Note(lines ...string) *Value {
	for _, l := range lines {
		v.Comments = append(v.Comments, Comment{Text: l})
	}
	return v
}

// Equal reports whether two values are the same, ignoring positions and
// comments: the same kind, names, fields in the same order and contents.
func Equal(a, b *Value) bool {
	if a == nil || b == nil {
		return a == b
	}
	if a.Kind != b.Kind || a.Name != b.Name || a.Int != b.Int || a.Bool != b.Bool || a.Text != b.Text ||
		len(a.Fields) != len(b.Fields) || len(a.Elems) != len(b.Elems) {
		return false
	}
	for i := range a.Fields {
		if a.Fields[i].Name != b.Fields[i].Name || !Equal(a.Fields[i].Value, b.Fields[i].Value) {
			return false
		}
	}
	for i := range a.Elems {
		if !Equal(a.Elems[i], b.Elems[i]) {
			return false
		}
	}
	return true
}
