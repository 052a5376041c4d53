package web

import (
	"bytes"
	"flag"
	"image/png"
	"os"
	"path/filepath"
	"testing"

	"github.com/chromedp/chromedp"

	"gridloom/grid"
	"gridloom/web/planform"
)

var screenshot = flag.Bool("screenshot", false, "write the README screenshot to testdata/screenshot/page.png")

// TestScreenshot captures the page as the README shows it: the demo plan,
// with the pointer on the 30 kHz partition so the readout and its mark are
// visible. Every run captures and checks the image; with -screenshot it is
// written to testdata/screenshot/page.png:
//
//	go test ./web -run TestScreenshot -screenshot
func TestScreenshot(t *testing.T) {
	t.Parallel()
	const width, height = 1440, 900
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, width, height)
	plan := testConfig(t).Plan
	tb.open(srv.URL + "/?" + planform.FormOf(plan).Query())
	tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true)`))

	res := grid.Compute(plan)
	l := res.Partitions[1]
	s := l.Numerology.SymbolAt(57)
	crb := l.StartCRB + l.SizePRB/2
	tb.pointAt(s.Start+s.Length/2, grid.CRBEdge(l.Numerology.SCSKHz(), crb)+grid.Hz(l.Numerology.SCSKHz())*6000)
	tb.waitFor("the readout", `document.getElementById('gl-readout').dataset.k === '57'`)

	shot, err := chromedpRun(tb, chromedp.CaptureScreenshot())
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(shot))
	if err != nil {
		t.Fatalf("the screenshot is not a PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() != width || b.Dy() != height {
		t.Errorf("screenshot is %v, want %dx%d", b, width, height)
	}
	out := filepath.Join(t.TempDir(), "page.png")
	if *screenshot {
		out = filepath.Join("..", "testdata", "screenshot", "page.png")
		if err := os.MkdirAll(filepath.Dir(out), 0o755); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.WriteFile(out, shot, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Logf("wrote %s", out)
	tb.checkConsole()
}

func chromedpRun[T any](tb *tab, a chromedp.Action[T]) (T, error) {
	return chromedp.Run(tb.ctx, a)
}
