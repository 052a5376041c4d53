package web

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"

	"gridloom/grid"
	"gridloom/web/planform"
)

// TestBrowserPRACH: the results carry the Random access table; its link
// opens the finder, and one click on an index there brings the planner
// back with that index applied (TS 38.211 Table 6.3.3.2-3: index 160 is
// format B4, as TestPRACHTable works out).
func TestBrowserPRACH(t *testing.T) {
	t.Parallel()
	_, p := prachPlanFile(t)
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/?" + planform.FormOf(p).Query())
	if got := eval[string](tb, `document.querySelector('[data-testid=prach-index]').textContent`); got != "160" {
		t.Errorf("the table's index %q, want 160", got)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=prach-format]').textContent`); got != "B4" {
		t.Errorf("the table's format %q, want B4", got)
	}
	tb.do("opening the finder", chromedp.Click(chromedp.CSS(`[data-testid=prach-find]`)), chromedp.WaitVisible(chromedp.CSS(`[data-testid=prach-finder]`)))
	tb.waitFor("the finder lists indexes", `document.querySelectorAll('[data-testid^=prach-apply-]').length > 1`)
	pick := eval[string](tb, `[...document.querySelectorAll('[data-testid^=prach-apply-]')].map(a => a.textContent).find(s => s !== '160')`)
	tb.do("applying index "+pick, chromedp.Click(chromedp.CSS(`[data-testid=prach-apply-`+pick+`]`)), chromedp.WaitVisible(chromedp.CSS(`[data-testid=prach-table]`)))
	tb.waitFor("the planner shows index "+pick, `(document.querySelector('[data-testid=prach-index]') || {}).textContent === '`+pick+`'`)
	if got := eval[string](tb, `document.querySelector('#`+planform.KeyID("prach.idx")+`').value`); got != pick {
		t.Errorf("the form's prach-ConfigurationIndex %q, want %s", got, pick)
	}
	tb.checkConsole()
}

// TestBrowserPRACHReadout: with the span at 10 ms the occasions of subframe
// 9 are drawn, and the readout names the one under the pointer, as the
// engine places it (grid.Result.PRACH, the occasion's middle).
func TestBrowserPRACHReadout(t *testing.T) {
	t.Parallel()
	_, p := prachPlanFile(t)
	p.SpanMs = 10
	o := grid.Compute(p).PRACH.Occasions[0]
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 2400, 1500)
	tb.open(srv.URL + "/?" + planform.FormOf(p).Query())
	tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true);
		document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
	tb.pointAt((o.Start+o.End)/2, (o.Low+o.High)/2)
	tb.waitFor("the readout names the occasion", `document.getElementById('gl-readout').textContent.includes('PRACH occasion (index 160, B4)')`)
	text := eval[string](tb, `document.getElementById('gl-readout').textContent`)
	valid := " not valid"
	if o.Valid {
		valid = " valid"
	}
	if !strings.Contains(text, "PRACH occasion (index 160, B4)"+valid) {
		t.Errorf("readout %q; the engine says the occasion is%s", text, valid)
	}
	tb.checkConsole()
}
