package planform

import (
	"strings"
	"testing"
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
