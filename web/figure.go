package web

import (
	"bytes"
	"crypto/sha256"
	"encoding/base64"
	"errors"
	"html"
	"log/slog"
	"net/http"
	"regexp"
	"slices"
	"strings"

	"github.com/go-chi/chi/v5/middleware"

	"gridloom/grid"
	"gridloom/render"
)

// inlineFigure draws a figure for a page: the inline SVG and the CSP
// sources it needs, or, when drawing fails, the sentence the page shows in
// its place (the failure is logged; the rest of the page still serves).
func (s *server) inlineFigure(r *http.Request, res grid.Result, opt render.Options) (inline string, styles []string, failed string) {
	svg, err := drawFigure(s.cfg.Figure, res, opt)
	if err != nil {
		s.logger.LogAttrs(r.Context(), slog.LevelError, "figure", slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
		return "", nil, "The figure could not be drawn: " + err.Error()
	}
	inline = inlineSVG(svg)
	return inline, styleSources(inline), ""
}

// drawFigure draws res into memory, so that a failure never sends half a
// figure.
func drawFigure(draw FigureFunc, res grid.Result, opt render.Options) ([]byte, error) {
	var buf bytes.Buffer
	if err := draw(&buf, res, opt); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// figureFailed is the answer for a figure drawFigure could not make: 422
// for a PNG over render.MaxPNGPixels, which the link's fig.width, fig.scale
// and fig.dpi asked for, otherwise an internal error.
func figureFailed(err error) *problem {
	if se := (*render.PNGSizeError)(nil); errors.As(err, &se) {
		return &problem{status: http.StatusUnprocessableEntity, text: "The PNG cannot be drawn that large (" + se.Size() + "); fig.width, fig.scale and fig.dpi set its size."}
	}
	return internal("figure", err)
}

// inlineSVG prepares an SVG document for inlining in the page: the XML
// declaration and doctype before the root element go, since HTML has no use
// for them.
func inlineSVG(doc []byte) string {
	if i := bytes.Index(doc, []byte("<svg")); i > 0 {
		doc = doc[i:]
	}
	return string(bytes.TrimSpace(doc))
}

var (
	styleElement = regexp.MustCompile(`(?s)<style\b[^>]*>(.*?)</style\s*>`)
	styleAttr    = regexp.MustCompile(`\sstyle\s*=\s*("([^"]*)"|'([^']*)')`)
)

// styleSources lists the CSP sources that let the inline figure keep its own
// styling under the page's policy, which otherwise allows only the app's
// stylesheet: a hash for each <style> element and, with 'unsafe-hashes',
// for each distinct style attribute. The hashes cover exactly the figure
// drawn for this response, so nothing else can be injected through them.
func styleSources(svg string) []string {
	if !strings.Contains(svg, "style") {
		// Both patterns need the word, and render's own figure never has
		// it: skip the regular expressions, which cost more than drawing.
		return nil
	}
	var out []string
	for _, m := range styleElement.FindAllStringSubmatch(svg, -1) {
		out = append(out, cspHash(styleText(m[1])))
	}
	var attrs []string
	for _, m := range styleAttr.FindAllStringSubmatch(svg, -1) {
		v := m[2] + m[3]
		h := cspHash(html.UnescapeString(v))
		if !slices.Contains(attrs, h) {
			attrs = append(attrs, h)
		}
	}
	if len(attrs) > 0 {
		out = append(out, "'unsafe-hashes'")
		out = append(out, attrs...)
	}
	slices.Sort(out)
	return slices.Compact(out)
}

// styleText is the text of a <style> element as the HTML parser sees it in
// SVG content: CDATA sections are text, character references are decoded.
func styleText(raw string) string {
	var b strings.Builder
	for raw != "" {
		i := strings.Index(raw, "<![CDATA[")
		if i < 0 {
			b.WriteString(html.UnescapeString(raw))
			break
		}
		b.WriteString(html.UnescapeString(raw[:i]))
		raw = raw[i+len("<![CDATA["):]
		j := strings.Index(raw, "]]>")
		if j < 0 {
			b.WriteString(raw)
			break
		}
		b.WriteString(raw[:j])
		raw = raw[j+3:]
	}
	return b.String()
}

func cspHash(s string) string {
	sum := sha256.Sum256([]byte(s))
	return "'sha256-" + base64.StdEncoding.EncodeToString(sum[:]) + "'"
}
