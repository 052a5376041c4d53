package web

import (
	"encoding/binary"
	"net/http"
	"strings"
	"testing"

	"gridloom/web/planform"
)

// TestFigurePaperKeys: fig.preset, fig.timeUnit, fig.scale and fig.dpi
// reach /figure.svg, /figure.png, the page's controls and its links
// (issue 19, figures for paper and rooms).
func TestFigurePaperKeys(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)

	r := get(t, srv, "/figure.svg?"+q+"&fig.preset=a4&fig.timeUnit=ms")
	wantStatus(t, r, http.StatusOK)
	// The A4 column's layout: ⌊8 × 453.54 pt / 6 pt⌋ = 604 px (render.Preset).
	if !strings.Contains(r.body, `viewBox="0 0 604 `) || !strings.Contains(r.body, `width="1208"`) || !strings.Contains(r.body, "time (ms)") {
		t.Errorf("the SVG lacks the A4 layout, its written width or the ms axis: %.300s", r.body)
	}

	r = get(t, srv, "/figure.png?"+q+"&fig.preset=a4&fig.dpi=300&fig.scale=1")
	wantStatus(t, r, http.StatusOK)
	png := []byte(r.body)
	// IHDR's width at byte 16; pHYs right after IHDR at byte 33: 300 dpi is
	// 300/0.0254 = 11811 px/m (PNG specification 11.3.5.3); 160 mm at 300
	// dpi is 1890 px.
	if len(png) < 54 || binary.BigEndian.Uint32(png[16:]) != 1890 || string(png[37:41]) != "pHYs" || binary.BigEndian.Uint32(png[41:]) != 11811 {
		t.Errorf("the 300 dpi PNG lacks its width of 1890 px or its pHYs of 11811 px/m")
	}
	r = get(t, srv, "/figure.png?"+q+"&fig.scale=2")
	wantStatus(t, r, http.StatusOK)
	if w := binary.BigEndian.Uint32([]byte(r.body)[16:]); w != 2400 {
		t.Errorf("fig.scale=2: %d px wide, want 2 × 1200", w)
	}

	r = get(t, srv, "/figure.png?"+q+"&fig.width=4800&fig.scale=4")
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if !strings.Contains(r.body, "PNG cannot be drawn that large") {
		t.Errorf("a PNG past the pixel bound: %.300s", r.body)
	}
	// The comparison's PNG has the same bound, and says so with 422 rather
	// than an internal error: 4800 × 4 px across is past 40 million pixels
	// whatever the height.
	campus := planform.FormOf(testConfig(t).Plan)
	cq := planform.CompareQuery(campus, planform.CopyOf(campus), planform.FigureForm{})
	r = get(t, srv, "/compare/figure.png?side=b&"+cq+"&fig.width=4800&fig.scale=4")
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if !strings.Contains(r.body, "PNG cannot be drawn that large") || !strings.Contains(r.body, "fig.scale") {
		t.Errorf("the comparison's PNG past the pixel bound: %.300s", r.body)
	}
	r = get(t, srv, "/figure.png?"+q+"&fig.dpi=abc")
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if !strings.Contains(r.body, "fig.dpi") {
		t.Errorf("fig.dpi=abc: %.300s", r.body)
	}

	r = get(t, srv, "/?"+q+"&fig.preset=slide&fig.timeUnit=us")
	wantStatus(t, r, http.StatusOK)
	for _, want := range []string{`name="fig.preset"`, `name="fig.timeUnit"`, `name="fig.scale"`, `name="fig.dpi"`,
		`value="slide" selected`, `fig.preset=slide&amp;fig.timeUnit=us`, `viewBox="0 0 640 `} {
		if !strings.Contains(r.body, want) {
			t.Errorf("the page lacks %s", want)
		}
	}
}
