package render

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"os"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// FuzzFigure: any plan the decoder accepts draws to well-formed XML with
// no script, whatever its names, numbers and findings, in every theme and
// in a window larger than the plan's; and the plan carried in the metadata
// comes back unchanged.
func FuzzFigure(f *testing.F) {
	for _, path := range demoPlans(f) {
		data, err := os.ReadFile(path)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data, uint8(0))
	}
	f.Add([]byte(`{"name":"<script>]]>&","carrier":{"bandwidthMHz":40},"partitions":[{"name":"a\u0000\"<b>","scsKHz":15,"sizePrb":216}]}`), uint8(1))
	f.Add([]byte(`{"spanMs":10,"carrier":{"range":"FR2-2","bandwidthMHz":2000},"tdd":{"referenceScsKHz":120,"pattern1":{"periodMs":0.625,"downlinkSlots":3,"uplinkSlots":1}},"partitions":[{"name":"w","scsKHz":960,"sizePrb":148}]}`), uint8(2))
	f.Add([]byte(`{"spanMs":1,"carrier":{"bandwidthMHz":40,"centerMHz":3600},"partitions":[{"name":"a","scsKHz":30,"sizePrb":106}]}`), uint8(5))
	f.Fuzz(func(t *testing.T, data []byte, opts uint8) {
		p, err := planfile.Decode(data)
		if err != nil {
			return
		}
		r := grid.Compute(p)
		opt := Options{Plan: data, Caption: p.Name}
		if opts&1 != 0 {
			opt.Theme = ThemePrint
		}
		if opts&2 != 0 {
			opt.Layers = opt.Layers.Hide(LayerLattice, LayerCP)
		}
		if opts&4 != 0 {
			// A window wider and longer than the plan's, as a comparison
			// draws, is never refused.
			w := FitWindow(r)
			w.Span, w.Low, w.High, w.Rails = grid.MaxSpanMs*grid.TcPerSubframe, w.Low-1_000_000, w.High+1_000_000, w.Rails+1
			opt.Window, opt.IDPrefix, opt.FromPointA = w, "fz-", true
		}
		if len(opt.Caption) > MaxCaption {
			opt.Caption = ""
		}
		var buf bytes.Buffer
		if err := Figure(&buf, r, opt); err != nil {
			// The only refusals are of options, never of a computed plan.
			if len(data) > MaxPlanBytes {
				return
			}
			t.Fatalf("Figure refused a computed plan: %v", err)
		}
		if strings.Contains(strings.ToLower(buf.String()), "<script") {
			t.Fatal("the figure holds a <script element")
		}
		dec := xml.NewDecoder(bytes.NewReader(buf.Bytes()))
		for {
			_, err := dec.Token()
			if errors.Is(err, io.EOF) {
				break
			}
			if err != nil {
				t.Fatalf("the figure is not well-formed XML: %v", err)
			}
		}
		back, err := PlanFromSVG(buf.Bytes())
		if err != nil || !bytes.Equal(back, data) {
			t.Fatalf("the plan in the metadata came back as %q (err %v)", back, err)
		}
	})
}
