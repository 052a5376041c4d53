package asn1v

import (
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"
)

type tokKind int

const (
	tEOF tokKind = iota
	tIdent
	tNumber
	tBString
	tHString
	tCString
	tLBrace
	tRBrace
	tComma
	tColon
	tAssign
)

var tokNames = [...]string{"the end of the text", "an identifier", "a number", "a binary string", "a hexadecimal string", "a character string", "'{'", "'}'", "','", "':'", "'::='"}

type token struct {
	kind tokKind
	text string
	pos  Pos
}

func (t token) describe() string {
	switch t.kind {
	case tIdent, tNumber:
		return fmt.Sprintf("%s %q", tokNames[t.kind], t.text)
	}
	return tokNames[t.kind]
}

type parser struct {
	src   string
	off   int
	line  int
	col   int
	tok   token
	depth int
	// notes is the comment list of the innermost open brace value (or of
	// the document); the lexer files each comment it passes there.
	notes *[]Comment
}

// Parse reads a document of value assignments, or a single value standing
// alone (an Assignment with an empty Name and Type). Errors are *Error with
// the line and column of the problem.
func Parse(text []byte) (*Document, error) {
	if len(text) > MaxSize {
		return nil, &Error{Pos: Pos{1, 1}, Msg: fmt.Sprintf("the text is %d bytes; at most %d are accepted.", len(text), MaxSize)}
	}
	doc := &Document{}
	p := &parser{src: strings.TrimPrefix(string(text), "\ufeff"), line: 1, col: 1, notes: &doc.Comments}
	if err := p.next(); err != nil {
		return nil, err
	}
	for p.tok.kind != tEOF {
		a, err := p.assignment()
		if err != nil {
			return nil, err
		}
		doc.Assignments = append(doc.Assignments, a)
	}
	return doc, nil
}

// ParseValue reads one value standing alone.
func ParseValue(text []byte) (*Value, error) {
	doc, err := Parse(text)
	if err != nil {
		return nil, err
	}
	if len(doc.Assignments) != 1 || doc.Assignments[0].Name != "" {
		return nil, &Error{Pos: Pos{1, 1}, Msg: "expected exactly one value standing alone."}
	}
	return doc.Assignments[0].Value, nil
}

func (p *parser) errf(pos Pos, format string, args ...any) error {
	return &Error{Pos: pos, Msg: fmt.Sprintf(format, args...)}
}

func (p *parser) assignment() (Assignment, error) {
	if p.tok.kind == tLBrace {
		pos := p.tok.pos
		v, err := p.value()
		if err != nil {
			return Assignment{}, err
		}
		return Assignment{Pos: pos, Value: v}, nil
	}
	if p.tok.kind != tIdent {
		return Assignment{}, p.errf(p.tok.pos, "expected a value assignment (name Type ::= value), found %s.", p.tok.describe())
	}
	a := Assignment{Name: p.tok.text, Pos: p.tok.pos}
	if err := p.next(); err != nil {
		return a, err
	}
	if p.tok.kind != tIdent {
		return a, p.errf(p.tok.pos, "expected the type of %s (name Type ::= value), found %s.", a.Name, p.tok.describe())
	}
	a.Type = p.tok.text
	if err := p.next(); err != nil {
		return a, err
	}
	if p.tok.kind != tAssign {
		return a, p.errf(p.tok.pos, "expected '::=' after %s %s, found %s.", a.Name, a.Type, p.tok.describe())
	}
	if err := p.next(); err != nil {
		return a, err
	}
	v, err := p.value()
	a.Value = v
	return a, err
}

func reserved(s string) bool { return s == "TRUE" || s == "FALSE" || s == "NULL" }

// value reads one value starting at the current token and leaves the
// token after it current.
func (p *parser) value() (*Value, error) {
	p.depth++
	defer func() { p.depth-- }()
	if p.depth > MaxDepth {
		return nil, p.errf(p.tok.pos, "values nest deeper than %d levels.", MaxDepth)
	}
	t := p.tok
	v := &Value{Pos: t.pos}
	switch t.kind {
	case tLBrace:
		return p.braces()
	case tIdent:
		if err := p.next(); err != nil {
			return nil, err
		}
		return p.afterIdent(t)
	case tNumber:
		n, err := strconv.ParseInt(t.text, 10, 64)
		if err != nil {
			return nil, p.errf(t.pos, "the number %s is outside the 64-bit range.", t.text)
		}
		v.Kind, v.Int = Integer, n
	case tBString:
		v.Kind, v.Text = BitString, t.text
	case tHString:
		v.Kind, v.Text = HexString, t.text
	case tCString:
		v.Kind, v.Text = String, t.text
	default:
		return nil, p.errf(t.pos, "expected a value, found %s.", t.describe())
	}
	return v, p.next()
}

// afterIdent finishes a value that began with the identifier t, which has
// been consumed: a choice (t : value), TRUE, FALSE, NULL or an identifier.
func (p *parser) afterIdent(t token) (*Value, error) {
	v := &Value{Pos: t.pos}
	if p.tok.kind == tColon {
		if reserved(t.text) {
			return nil, p.errf(t.pos, "%s cannot name a CHOICE alternative.", t.text)
		}
		if err := p.next(); err != nil {
			return nil, err
		}
		inner, err := p.value()
		if err != nil {
			return nil, err
		}
		v.Kind, v.Name, v.Elems = Choice, t.text, []*Value{inner}
		return v, nil
	}
	switch t.text {
	case "TRUE", "FALSE":
		v.Kind, v.Bool = Boolean, t.text == "TRUE"
	case "NULL":
		v.Kind = Null
	default:
		v.Kind, v.Text = Identifier, t.text
	}
	return v, nil
}

// braces reads { ... }: a Sequence when its items are "name value", a
// SequenceOf when they are bare values.
func (p *parser) braces() (*Value, error) {
	v := &Value{Kind: Sequence, Pos: p.tok.pos}
	outer := p.notes
	p.notes = &v.Comments
	if err := p.next(); err != nil {
		return nil, err
	}
	decided := false
	for p.tok.kind != tRBrace {
		if p.tok.kind == tEOF {
			return nil, p.errf(p.tok.pos, "the value opened at %s is not closed with '}'.", v.Pos)
		}
		if !decided {
			decided = true
			v.Kind = SequenceOf
			if t := p.tok; t.kind == tIdent {
				if err := p.next(); err != nil {
					return nil, err
				}
				switch p.tok.kind {
				case tComma, tRBrace, tColon:
					e, err := p.afterIdent(t)
					if err != nil {
						return nil, err
					}
					v.Elems = append(v.Elems, e)
				default:
					v.Kind = Sequence
					if err := p.field(v, t); err != nil {
						return nil, err
					}
				}
				if err := p.separator(v); err != nil {
					return nil, err
				}
				continue
			}
		}
		if v.Kind == Sequence {
			t := p.tok
			if t.kind != tIdent {
				return nil, p.errf(t.pos, "expected a field name, found %s.", t.describe())
			}
			if err := p.next(); err != nil {
				return nil, err
			}
			if err := p.field(v, t); err != nil {
				return nil, err
			}
		} else {
			e, err := p.value()
			if err != nil {
				return nil, err
			}
			v.Elems = append(v.Elems, e)
		}
		if err := p.separator(v); err != nil {
			return nil, err
		}
	}
	p.notes = outer
	return v, p.next()
}

// field reads the value of the field named by t, which has been consumed.
func (p *parser) field(v *Value, t token) error {
	if reserved(t.text) {
		return p.errf(t.pos, "%s cannot name a field.", t.text)
	}
	for _, f := range v.Fields {
		if f.Name == t.text {
			return p.errf(t.pos, "the field %s appears twice in one value (first at %s).", t.text, f.Pos)
		}
	}
	fv, err := p.value()
	if err != nil {
		return err
	}
	v.Fields = append(v.Fields, Field{Name: t.text, Pos: t.pos, Value: fv})
	return nil
}

// separator consumes the ',' between items, or stops at '}'.
func (p *parser) separator(v *Value) error {
	switch p.tok.kind {
	case tRBrace:
		return nil
	case tEOF:
		return p.errf(p.tok.pos, "the value opened at %s is not closed with '}'.", v.Pos)
	case tComma:
		if err := p.next(); err != nil {
			return err
		}
		if p.tok.kind == tRBrace {
			return p.errf(p.tok.pos, "expected another item after ',', found '}'.")
		}
		return nil
	}
	what := "a field"
	if v.Kind == SequenceOf {
		what = "an element"
	}
	return p.errf(p.tok.pos, "expected ',' or '}' after %s, found %s.", what, p.tok.describe())
}

// The lexer.

func (p *parser) peekByte(k int) byte {
	if p.off+k < len(p.src) {
		return p.src[p.off+k]
	}
	return 0
}

// advance moves past one character, keeping the line and column.
func (p *parser) advance() {
	r, size := utf8.DecodeRuneInString(p.src[p.off:])
	p.off += size
	if r == '\n' {
		p.line++
		p.col = 1
	} else {
		p.col++
	}
}

func (p *parser) pos() Pos { return Pos{p.line, p.col} }

func isSpace(c byte) bool {
	return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f'
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }
func isDigit(c byte) bool  { return c >= '0' && c <= '9' }

// next lexes one token into p.tok, filing the comments before it.
func (p *parser) next() error {
	for {
		for p.off < len(p.src) && isSpace(p.src[p.off]) {
			p.advance()
		}
		if p.off >= len(p.src) {
			p.tok = token{kind: tEOF, pos: p.pos()}
			return nil
		}
		c, start := p.src[p.off], p.pos()
		switch {
		case c == '-' && p.peekByte(1) == '-':
			p.lineComment(start)
			continue
		case c == '/' && p.peekByte(1) == '*':
			if err := p.blockComment(start); err != nil {
				return err
			}
			continue
		case c == '{' || c == '}' || c == ',':
			p.advance()
			p.tok = token{kind: map[byte]tokKind{'{': tLBrace, '}': tRBrace, ',': tComma}[c], pos: start}
			return nil
		case c == ':':
			if strings.HasPrefix(p.src[p.off:], "::=") {
				p.advance()
				p.advance()
				p.advance()
				p.tok = token{kind: tAssign, pos: start}
				return nil
			}
			p.advance()
			p.tok = token{kind: tColon, pos: start}
			return nil
		case isLetter(c):
			return p.identifier(start)
		case isDigit(c) || c == '-' && isDigit(p.peekByte(1)):
			return p.number(start)
		case c == '\'':
			return p.quotedBits(start)
		case c == '"':
			return p.cstring(start)
		}
		r, _ := utf8.DecodeRuneInString(p.src[p.off:])
		return p.errf(start, "unexpected character %q.", r)
	}
}

func (p *parser) lineComment(start Pos) {
	p.advance()
	p.advance()
	from := p.off
	for p.off < len(p.src) {
		c := p.src[p.off]
		if c == '\n' || c == '\r' {
			break
		}
		if c == '-' && p.peekByte(1) == '-' {
			text := p.src[from:p.off]
			p.advance()
			p.advance()
			p.file(Comment{Text: strings.Trim(text, " \t\v\f"), Pos: start})
			return
		}
		p.advance()
	}
	p.file(Comment{Text: strings.Trim(p.src[from:p.off], " \t\v\f"), Pos: start})
}

func (p *parser) blockComment(start Pos) error {
	p.advance()
	p.advance()
	end := strings.Index(p.src[p.off:], "*/")
	if end < 0 {
		return p.errf(start, "the comment opened with /* is not closed with */.")
	}
	text := p.src[p.off : p.off+end]
	for range utf8.RuneCountInString(text) + 2 {
		p.advance()
	}
	p.file(Comment{Text: text, Block: true, Pos: start})
	return nil
}

func (p *parser) file(c Comment) {
	*p.notes = append(*p.notes, c)
}

func (p *parser) identifier(start Pos) error {
	from := p.off
	for p.off < len(p.src) {
		c := p.src[p.off]
		if c == '-' && p.peekByte(1) == '-' {
			break
		}
		if !isLetter(c) && !isDigit(c) && c != '-' {
			break
		}
		p.advance()
	}
	text := p.src[from:p.off]
	if strings.HasSuffix(text, "-") {
		return p.errf(start, "the identifier %q ends with a hyphen, which X.680 does not allow.", text)
	}
	p.tok = token{kind: tIdent, text: text, pos: start}
	return nil
}

func (p *parser) number(start Pos) error {
	from := p.off
	p.advance() // a digit or '-'
	for p.off < len(p.src) && isDigit(p.src[p.off]) {
		p.advance()
	}
	if p.off < len(p.src) && (p.src[p.off] == '.' || p.src[p.off] == 'e' || p.src[p.off] == 'E') {
		return p.errf(start, "real numbers are not read; the values gridloom reads are whole numbers.")
	}
	if p.off < len(p.src) && (isLetter(p.src[p.off]) || p.src[p.off] == '-' && p.peekByte(1) != '-') {
		return p.errf(p.pos(), "expected a separator after the number %s.", p.src[from:p.off])
	}
	p.tok = token{kind: tNumber, text: p.src[from:p.off], pos: start}
	return nil
}

// quotedBits reads 'bits'B or 'hex'H; white space inside is dropped, as
// X.680 12.10 and 12.12 allow.
func (p *parser) quotedBits(start Pos) error {
	p.advance()
	var b strings.Builder
	for {
		if p.off >= len(p.src) {
			return p.errf(start, "the string opened with ' is not closed; write 'bits'B or 'hex'H.")
		}
		c := p.src[p.off]
		if c == '\'' {
			break
		}
		switch {
		case isSpace(c):
		case c >= '0' && c <= '9' || c >= 'A' && c <= 'F':
			b.WriteByte(c)
		case c >= 'a' && c <= 'f':
			b.WriteByte(c - 'a' + 'A')
		default:
			r, _ := utf8.DecodeRuneInString(p.src[p.off:])
			return p.errf(p.pos(), "%q cannot stand in a binary or hexadecimal string.", r)
		}
		p.advance()
	}
	p.advance() // the closing '
	kind := p.peekByte(0)
	text := b.String()
	switch kind {
	case 'B':
		if strings.Trim(text, "01") != "" {
			return p.errf(start, "the binary string '%s'B holds digits other than 0 and 1.", text)
		}
		p.tok = token{kind: tBString, text: text, pos: start}
	case 'H':
		p.tok = token{kind: tHString, text: text, pos: start}
	default:
		return p.errf(p.pos(), "a quoted string must end with 'B (binary) or 'H (hexadecimal).")
	}
	p.advance()
	if c := p.peekByte(0); isLetter(c) || isDigit(c) {
		return p.errf(p.pos(), "expected a separator after the string.")
	}
	return nil
}

// cstring reads "text", where "" stands for one quotation mark.
func (p *parser) cstring(start Pos) error {
	p.advance()
	var b strings.Builder
	for {
		if p.off >= len(p.src) {
			return p.errf(start, "the character string is not closed with \".")
		}
		c := p.src[p.off]
		if c == '"' {
			if p.peekByte(1) != '"' {
				p.advance()
				break
			}
			p.advance()
		}
		_, size := utf8.DecodeRuneInString(p.src[p.off:])
		b.WriteString(p.src[p.off : p.off+size])
		p.advance()
	}
	p.tok = token{kind: tCString, text: b.String(), pos: start}
	return nil
}

// StartsWithAssignment reports whether text opens, after white space and
// comments, with "name Type ::=": a cheap test for value notation that
// reads only the first three tokens.
func StartsWithAssignment(text []byte) bool {
	if len(text) > MaxSize {
		text = text[:MaxSize]
	}
	var sink []Comment
	p := &parser{src: strings.TrimPrefix(string(text), "\ufeff"), line: 1, col: 1, notes: &sink}
	for _, want := range []tokKind{tIdent, tIdent, tAssign} {
		if err := p.next(); err != nil || p.tok.kind != want {
			return false
		}
	}
	return true
}
