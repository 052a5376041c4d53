package render

import (
	"sync"

	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// The PNG draws its text in the Go fonts (golang.org/x/image/font/gofont),
// which are embedded in the program. The SVG names the generic family
// sans-serif and its viewer chooses the face, so the layout never depends
// on a width measured in one face only: measure adds a margin for faces
// wider than Go Regular.

// widthMargin covers sans-serif faces wider than Go Regular. DejaVu Sans,
// the usual sans-serif on Linux, set this package's key and legend texts
// 9 to 15 % wider than Go Regular when measured during development; Arial
// and Helvetica are narrower than DejaVu.
const widthMargin = 1.2

type faces struct {
	regular, bold *sfnt.Font
}

var loadFaces = sync.OnceValues(func() (*faces, error) {
	r, err := sfnt.Parse(goregular.TTF)
	if err != nil {
		return nil, err
	}
	b, err := sfnt.Parse(gobold.TTF)
	if err != nil {
		return nil, err
	}
	return &faces{regular: r, bold: b}, nil
})

func (fs *faces) face(bold bool) *sfnt.Font {
	if bold {
		return fs.bold
	}
	return fs.regular
}

func ppem(size float64) fixed.Int26_6 { return fixed.Int26_6(size*64 + 0.5) }

// advance is the width of s in px set in Go Regular or Bold at size px,
// with kerning. buf may be nil.
func advance(fs *faces, buf *sfnt.Buffer, s string, size float64, bold bool) float64 {
	if buf == nil {
		buf = new(sfnt.Buffer)
	}
	f := fs.face(bold)
	em := ppem(size)
	var w fixed.Int26_6
	prev, hasPrev := sfnt.GlyphIndex(0), false
	for _, r := range s {
		g, err := f.GlyphIndex(buf, r)
		if err != nil {
			g = 0
		}
		if hasPrev {
			if k, err := f.Kern(buf, prev, g, em, font.HintingNone); err == nil {
				w += k
			}
		}
		a, err := f.GlyphAdvance(buf, g, em, font.HintingNone)
		if err == nil {
			w += a
		}
		prev, hasPrev = g, true
	}
	return float64(w) / 64
}

// measure is the width a label will take in either backend, in px: its
// runs and gaps, with widthMargin.
func measure(l *label) float64 {
	fs, err := loadFaces()
	if err != nil {
		return 0
	}
	var buf sfnt.Buffer
	w := 0.0
	for _, r := range l.runs {
		w += r.dx + advance(fs, &buf, r.text, l.size, r.bold)
	}
	return w * widthMargin
}

// textWidth measures one run of text.
func textWidth(s string, size float64, bold bool) float64 {
	return measure(&label{runs: []run{{text: s, bold: bold}}, size: size})
}
