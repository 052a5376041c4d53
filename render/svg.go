package render

import (
	"bytes"
	"fmt"
	"math"

	svg "github.com/ajstarks/svgo"
)

// writeSVG writes d with svgo. Every attribute value is a number or one of
// the package's constants; text goes through svgo's escaping functions.
func writeSVG(buf *bytes.Buffer, d *doc) {
	s := svg.New(buf)
	s.Start(d.outW, d.outH, fmt.Sprintf(`viewBox="0 0 %d %d"`, d.w, d.h), `role="img"`,
		`aria-labelledby="`+d.id("gl-title")+`"`, `aria-describedby="`+d.id("gl-desc")+`"`)
	textElement(buf, s, "title", d.id("gl-title"), d.title)
	textElement(buf, s, "desc", d.id("gl-desc"), d.desc)
	if d.plan != nil {
		writePlan(buf, d.id("gl-meta"), d.plan)
	}
	if len(d.patterns) > 0 {
		s.Def()
		for _, p := range d.patterns {
			s.Pattern(d.id(p.id), 0, 0, p.tile, p.tile, "user")
			for i := range p.shapes {
				writeShape(s, d, &p.shapes[i])
			}
			s.PatternEnd()
		}
		s.DefEnd()
	}

	s.Group(`font-family="sans-serif"`, fmt.Sprintf(`font-size="%s"`, width(baseFontSize)), `fill="`+d.ink.String()+`"`)
	sizes := []float64{baseFontSize} // the font size each open group passes on
	for _, it := range d.items {
		switch it := it.(type) {
		case *group:
			var attrs []string
			if it.id != "" {
				attrs = append(attrs, `id="`+d.id(it.id)+`"`)
			}
			if it.class != "" {
				attrs = append(attrs, `class="`+it.class+`"`)
			}
			for _, a := range it.data {
				attrs = append(attrs, a.key+`="`+a.value+`"`)
			}
			size := sizes[len(sizes)-1]
			if it.fontSize != 0 && it.fontSize != size {
				size = it.fontSize
				attrs = append(attrs, `font-size="`+width(size)+`"`)
			}
			sizes = append(sizes, size)
			s.Group(attrs...)
		case groupEnd:
			sizes = sizes[:len(sizes)-1]
			s.Gend()
		case *shape:
			writeShape(s, d, it)
		case *label:
			writeLabel(s, d, it, sizes[len(sizes)-1])
		}
	}
	s.Gend()
	s.End()
}

// textElement writes <tag id="id">text</tag>, the text escaped by svgo.
func textElement(buf *bytes.Buffer, s *svg.SVG, tag, id, text string) {
	fmt.Fprintf(buf, `<%s id="%s">`, tag, id)
	s.Span(text)
	fmt.Fprintf(buf, "</%s>\n", tag)
}

// paintAttrs writes a fill or stroke ("fill" or "stroke") as attributes.
func paintAttrs(d *doc, kind string, p paint) []string {
	switch p.kind {
	case paintSolid:
		out := []string{kind + `="` + p.rgb.String() + `"`}
		if p.alpha < 1 {
			out = append(out, kind+`-opacity="`+width(p.alpha)+`"`)
		}
		return out
	case paintPattern:
		return []string{kind + `="url(#` + d.id(d.patterns[p.pattern].id) + `)"`}
	}
	if kind == "fill" {
		return []string{`fill="none"`}
	}
	return nil
}

func writeShape(s *svg.SVG, d *doc, sh *shape) {
	var attrs []string
	if sh.class != "" {
		attrs = append(attrs, `class="`+sh.class+`"`)
	}
	attrs = append(attrs, paintAttrs(d, "fill", sh.fill)...)
	if sh.stroke.kind != paintNone && sh.strokeW > 0 {
		attrs = append(attrs, paintAttrs(d, "stroke", sh.stroke)...)
		attrs = append(attrs, `stroke-width="`+width(sh.strokeW)+`"`)
		if len(sh.dash) > 0 {
			v := ""
			for i, x := range sh.dash {
				if i > 0 {
					v += " "
				}
				v += width(x)
			}
			attrs = append(attrs, `stroke-dasharray="`+v+`"`)
		}
	}
	if c := sh.circle; c != nil {
		s.Circle(int(math.Round(c.cx)), int(math.Round(c.cy)), int(math.Round(c.r)), attrs...)
		return
	}
	s.Path(sh.d.String(), attrs...)
}

// pos is where a label is set, in whole pixels, in both backends.
func (l *label) pos() (int, int) { return int(math.Round(l.x)), int(math.Round(l.y)) }

func writeLabel(s *svg.SVG, d *doc, l *label, inherited float64) {
	if len(l.runs) == 0 {
		return
	}
	var attrs []string
	if l.class != "" {
		attrs = append(attrs, `class="`+l.class+`"`)
	}
	if l.size != inherited {
		attrs = append(attrs, `font-size="`+width(l.size)+`"`)
	}
	first := l.runs[0]
	if first.bold {
		attrs = append(attrs, `font-weight="bold"`)
	}
	if l.anchor != anchorStart {
		attrs = append(attrs, `text-anchor="`+l.anchor.String()+`"`)
	}
	if l.fill != d.ink {
		attrs = append(attrs, `fill="`+l.fill.String()+`"`)
	}
	if l.halo {
		attrs = append(attrs, `stroke="#ffffff"`, `stroke-width="3"`, `stroke-linejoin="round"`, `paint-order="stroke"`)
	}
	x, y := l.pos()
	if l.rotate {
		attrs = append(attrs, fmt.Sprintf(`transform="rotate(-90 %d %d)"`, x, y))
	}
	if len(l.runs) == 1 {
		s.Text(x, y, first.text, attrs...)
		return
	}
	s.Textspan(x, y, first.text, attrs...)
	for _, r := range l.runs[1:] {
		var ra []string
		if r.dx != 0 {
			ra = append(ra, `dx="`+width(r.dx)+`"`)
		}
		if r.bold != first.bold {
			w := "normal"
			if r.bold {
				w = "bold"
			}
			ra = append(ra, `font-weight="`+w+`"`)
		}
		s.Span(r.text, ra...)
	}
	s.TextEnd()
}
