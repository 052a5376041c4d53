package asn1v

import (
	"bytes"
	"strconv"
	"strings"
)

// Indent is the indentation of one level in written text.
const Indent = "  "

// Format writes the document deterministically: the document's comments
// first, then each assignment separated by a blank line, one field or
// element per line, each value's comments at the top of its braces. Parse
// reads the result back to an equal document (comments keep their value
// but not their place within it).
func Format(d *Document) []byte {
	var b bytes.Buffer
	for _, c := range d.Comments {
		writeComment(&b, c, "")
	}
	for i, a := range d.Assignments {
		if i > 0 || len(d.Comments) > 0 {
			b.WriteByte('\n')
		}
		if a.Name != "" {
			b.WriteString(a.Name + " " + a.Type + " ::= ")
		}
		writeValue(&b, a.Value, "")
		b.WriteByte('\n')
	}
	return b.Bytes()
}

// FormatValue writes one value as Format would, at no indentation.
func FormatValue(v *Value) []byte {
	var b bytes.Buffer
	writeValue(&b, v, "")
	return b.Bytes()
}

func writeComment(b *bytes.Buffer, c Comment, indent string) {
	b.WriteString(indent)
	if c.Block {
		b.WriteString("/*" + strings.ReplaceAll(c.Text, "*/", "* /") + "*/\n")
		return
	}
	t := strings.NewReplacer("\r", " ", "\n", " ").Replace(c.Text)
	for strings.Contains(t, "--") {
		t = strings.ReplaceAll(t, "--", "- -")
	}
	b.WriteString(strings.TrimRight("-- "+t, " ") + "\n")
}

func writeValue(b *bytes.Buffer, v *Value, indent string) {
	if v == nil {
		b.WriteString("NULL")
		return
	}
	switch v.Kind {
	case Sequence, SequenceOf:
		n := len(v.Fields)
		if v.Kind == SequenceOf {
			n = len(v.Elems)
		}
		if n == 0 && len(v.Comments) == 0 {
			b.WriteString("{}")
			return
		}
		inner := indent + Indent
		b.WriteString("{\n")
		for _, c := range v.Comments {
			writeComment(b, c, inner)
		}
		for i := range n {
			b.WriteString(inner)
			if v.Kind == Sequence {
				b.WriteString(v.Fields[i].Name + " ")
				writeValue(b, v.Fields[i].Value, inner)
			} else {
				writeValue(b, v.Elems[i], inner)
			}
			if i < n-1 {
				b.WriteByte(',')
			}
			b.WriteByte('\n')
		}
		b.WriteString(indent + "}")
	case Choice:
		b.WriteString(v.Name + " : ")
		var inner *Value
		if len(v.Elems) > 0 {
			inner = v.Elems[0]
		}
		writeValue(b, inner, indent)
	case Integer:
		b.WriteString(strconv.FormatInt(v.Int, 10))
	case Identifier:
		b.WriteString(v.Text)
	case Boolean:
		if v.Bool {
			b.WriteString("TRUE")
		} else {
			b.WriteString("FALSE")
		}
	case BitString:
		b.WriteString("'" + v.Text + "'B")
	case HexString:
		b.WriteString("'" + v.Text + "'H")
	case Null:
		b.WriteString("NULL")
	case String:
		b.WriteString(`"` + strings.ReplaceAll(v.Text, `"`, `""`) + `"`)
	}
}
