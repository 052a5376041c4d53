package planform

import (
	"net/url"
	"strings"
	"testing"

	"gridloom/render"
)

// TestLayersMessage: a layer list with a name that is no layer gets one
// sentence that quotes that name and lists the layers there are.
func TestLayersMessage(t *testing.T) {
	st := NewFigureState(FigureForm{Layers: "lattice, grid ,tdd"}, "")
	msg := st.Msgs[KeyFigLayers]
	for _, want := range []string{`Figure layers (fig.layers): "grid" is not a figure layer`, "lattice, cp, guards, labels, tdd, ssb, raster, coreset0, prach and overlap", "all or none."} {
		if !strings.Contains(msg, want) {
			t.Errorf("message %q does not contain %q", msg, want)
		}
	}
	if st := NewFigureState(FigureForm{Layers: "lattice,TDD"}, ""); len(st.Msgs) > 0 {
		t.Errorf("lattice,TDD: messages %v, want none", st.Msgs)
	}
}

// TestPaperKeys: fig.preset, fig.timeUnit, fig.scale and fig.dpi reach the
// renderer's options, travel in the link, and a bad value gets a sentence
// naming the key and the values it takes, its text kept for the form.
func TestPaperKeys(t *testing.T) {
	v, _ := url.ParseQuery("fig.preset=A4&fig.timeUnit=ms&fig.scale=2&fig.dpi=300")
	ff := ParseFigureForm(v)
	st := NewFigureState(ff, "")
	if len(st.Msgs) > 0 {
		t.Fatalf("messages %v", st.Msgs)
	}
	if st.Opt.Preset.Name != "a4" || st.Opt.TimeUnit != render.TimeMs || st.Opt.PNGScale != 2 || st.Opt.DPI != 300 {
		t.Errorf("options %+v", st.Opt)
	}
	if q := ff.Query(); q != "fig.preset=A4&fig.timeUnit=ms&fig.scale=2&fig.dpi=300" {
		t.Errorf("Query() = %q", q)
	}
	for _, tc := range []struct {
		ff       FigureForm
		key      string
		contains []string
	}{
		{FigureForm{Preset: "letter"}, KeyFigPreset, []string{`Preset (fig.preset): "letter"`, "a4, slide and poster"}},
		{FigureForm{TimeUnit: "s"}, KeyFigTimeUnit, []string{`(fig.timeUnit): "s"`, "auto, us or ms"}},
		{FigureForm{Scale: "5"}, KeyFigScale, []string{"(fig.scale): 5 is outside 1 to 4"}},
		{FigureForm{Scale: "2x"}, KeyFigScale, []string{`"2x" is not a whole number`}},
		{FigureForm{DPI: "30"}, KeyFigDPI, []string{"30 is outside 72 to 1200"}},
		// 800 mm at 300 dpi: 800/25.4 × 300 = 9449 px; 4800 px hold 152 dpi.
		{FigureForm{Preset: "poster", DPI: "300"}, KeyFigDPI, []string{"9449 px", "72 to 152 dpi"}},
	} {
		st := NewFigureState(tc.ff, "")
		msg := st.Msgs[tc.key]
		for _, want := range tc.contains {
			if !strings.Contains(msg, want) {
				t.Errorf("%+v: message %q lacks %q", tc.ff, msg, want)
			}
		}
	}
}
