package web

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"

	"gridloom/web/planform"
)

// TestBrowserTiming: the results carry the Timing section (issue 17) with
// the numbers worked by hand, the assumptions and the caveat; the advice
// follows an edit of the cell radius, and the range warning sits beside
// the field.
func TestBrowserTiming(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	q := planform.FormOf(demoPlans(t)["campus.yaml"]).Query()
	tb.open(srv.URL + "/?" + q + "&env.radius=20&env.latency=6")

	// T_proc,1 of video (30 kHz, capability 1, dmrs pos2): N1 = 13 symbols of
	// (2048+144)·64·2^-1 Tc, 911872 Tc = 463.802 µs (TS 38.214 Table 5.3-1);
	// T_proc,2 of sensors (15 kHz): (N2 10 + d2,1 1)·140288 Tc = 784.896 µs
	// (TS 38.214 Table 6.4-1).
	if got := eval[string](tb, `document.querySelector('[data-testid=timing-parts] tbody tr:nth-child(2) [data-testid=tproc1]').textContent`); got != "463.802" {
		t.Errorf("T_proc,1 of video %q, want 463.802", got)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=timing-parts] tbody tr:nth-child(1) [data-testid=tproc2]').textContent`); got != "784.896" {
		t.Errorf("T_proc,2 of sensors %q, want 784.896", got)
	}
	// Guard: the special slot's 2 flexible 15 kHz symbols, 2·140288 Tc =
	// 142.708 µs; less N_TA,offset and N_Rx-Tx (25600 Tc each) it covers
	// 229376 Tc · c/2 = 17.488 km.
	facts := eval[string](tb, `document.querySelector('[data-testid=timing-facts]').textContent`)
	for _, want := range []string{"142.708 µs", "17.488 km", "25600 Tc = 13.021 µs"} {
		if !strings.Contains(facts, want) {
			t.Errorf("the timing facts do not say %q: %s", want, facts)
		}
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=timing-caveat]').textContent`); !strings.Contains(got, "air-interface part only") {
		t.Errorf("the caveat says %q", got)
	}
	if n := eval[int](tb, `document.querySelectorAll('[data-testid=timing-assumptions] li').length`); n < 5 {
		t.Errorf("%d assumptions listed", n)
	}
	// The matrix: 15 ↔ 30 kHz is 1 ms for type 1 and 3 ms for type 2, the
	// larger of μ0's 1 / 3 slots of 1 ms and μ1's 2 / 5 of 0.5 ms (TS 38.133
	// Table 8.6.2-1); RRC 10 ms + 6 ms.
	if got := eval[string](tb, `document.querySelector('[data-testid=switch-matrix] tbody tr:nth-child(1) td:nth-child(3)').textContent`); got != "1000.000 / 3000.000" {
		t.Errorf("sensors → video %q, want 1000.000 / 3000.000", got)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=switch-matrix] caption').textContent`); !strings.Contains(got, "16000.000 µs") {
		t.Errorf("the matrix's caption %q does not give the RRC switch", got)
	}

	// 20 km is beyond the guard's 17.488 km: every row is poor on it, no
	// numerology is chosen, and the range warning stands beside the field.
	if n := eval[int](tb, `document.querySelectorAll('[data-testid=advice-table] tbody tr').length`); n != 4 {
		t.Errorf("%d advice rows, want 4 (15, 30, 60 kHz normal and 60 kHz extended CP in FR1)", n)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=advice-reason]').textContent`); !strings.Contains(got, "No numerology suits every criterion") {
		t.Errorf("the advice says %q", got)
	}
	if got := eval[string](tb, `document.getElementById('n-f-env-radius').textContent`); !strings.Contains(got, "beyond the 17.49 km the TDD guard allows") {
		t.Errorf("beside the cell radius: %q", got)
	}

	// At 5 km (0.29 of the guard's range) the latency decides: the worst
	// one-way slot latency against 6 ms is 6570.8 µs at 15 kHz (marginal),
	// 5356.8 at 30 and 4803.3 at 60 kHz (suits); 60 kHz has the widest
	// margin, and its normal CP comes before the extended one.
	tb.do("typing 5 km", chromedp.Focus(chromedp.ID("f-env-radius")), chromedp.Evaluate[chromedp.Void](`document.getElementById('f-env-radius').select()`),
		chromedp.KeyEvent("5"), chromedp.KeyEvent(kb.Tab))
	tb.waitFor("the advice chooses", `(document.querySelector('[data-testid=advice-chosen]') || {}).textContent === 'Advice: 60 kHz normal CP.'`)
	if got := eval[string](tb, `document.querySelector('[data-testid=advice-table] tr[data-chosen=true] th').textContent`); got != "60 kHz normal CP" {
		t.Errorf("the chosen row is %q", got)
	}
	// The form follows a frame after the results.
	tb.waitFor("the Radio channel section names the advice", `document.getElementById('g-env').textContent.includes('the timing advice favours 60 kHz normal CP')`)
	tb.waitFor("the warning leaves the field", `document.getElementById('n-f-env-radius').textContent.trim() === ''`)
	tb.checkConsole()
}

// TestBrowserCompareCrossLink: the comparison's conflict list is empty when
// the two patterns are aligned and follows a typed frame offset: the
// campus pattern one slot later conflicts 1857.292 µs per 5 ms, 3714.583
// per 10 ms (worked by hand in planform's TestCrossLinkOfTheComparison).
func TestBrowserCompareCrossLink(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.do("opening the comparison", chromedp.Navigate(srv.URL+"/compare?"+campusCompare(t, "")))
	tb.waitAcross("the comparison", `document.getElementById('b-gl-plot') !== null && document.readyState === 'complete'`)
	tb.do("marking the window", chromedp.Evaluate[chromedp.Void](`window.glMarker = 'still here'`))
	if !eval[bool](tb, `document.querySelector('[data-testid=crosslink-empty]') !== null && document.querySelector('[data-testid=crosslink-table]') === null`) {
		t.Error("the aligned patterns show conflicts")
	}

	tb.do("typing a frame offset of 1000 µs", chromedp.Focus(chromedp.ID("b-f-frameOffsetUs")), chromedp.KeyEvent("1000"))
	tb.waitFor("the conflicts", `(document.querySelector('[data-testid=crosslink-total]') || {}).textContent?.startsWith('3714.583 µs of conflict per 10 ms')`)
	if n := eval[int](tb, `document.querySelectorAll('[data-testid=crosslink-table] tbody tr').length`); n != 2 {
		t.Errorf("%d conflicts listed, want 2", n)
	}
	if n := eval[int](tb, `document.querySelectorAll('[data-testid=crosslink-strip] .gl-xl-conflict').length`); n != 2 {
		t.Errorf("%d conflicts marked on the strip, want 2", n)
	}
	// The figures mark them too, each on its own time: 2 bands in 5 ms each,
	// one path of two rectangles.
	for _, side := range []string{"a", "b"} {
		if n := eval[int](tb, `(() => { const g = document.querySelector('[data-testid=figure-`+side+`] .gl-xl-marks'); return g ? Math.min(g.dataset.startTc.split(' ').length, (g.querySelector('.gl-xl-mark').getAttribute('d').match(/M/g) || []).length) : 0 })()`); n != 2 {
			t.Errorf("figure %s marks %d conflicts, want 2", side, n)
		}
	}
	tb.waitFor("the address holds the offset", `location.search.includes('b.frameOffsetUs=1000')`)
	if got := eval[string](tb, `window.glMarker`); got != "still here" {
		t.Error("the edit reloaded the page")
	}

	// Back to 0: aligned again.
	tb.do("clearing the offset", chromedp.Evaluate[chromedp.Void](`document.getElementById('b-f-frameOffsetUs').select()`), chromedp.KeyEvent("0"))
	tb.waitFor("the empty list", `document.querySelector('[data-testid=crosslink-empty]') !== null`)

	// An offset beyond a 20 ms cycle is refused beside the field, and the
	// list gives way to the same sentence.
	tb.do("typing 30000", chromedp.Evaluate[chromedp.Void](`document.getElementById('b-f-frameOffsetUs').select()`), chromedp.KeyEvent("30000"))
	tb.waitFor("the message beside the field", `document.getElementById('n-b-f-frameOffsetUs').textContent.includes('must be a number of µs from −20000 to 20000')`)
	if got := eval[string](tb, `document.querySelector('[data-testid=crosslink-why]').textContent`); !strings.Contains(got, "b.frameOffsetUs") {
		t.Errorf("the conflicts section says %q", got)
	}
	tb.checkConsole()
}
