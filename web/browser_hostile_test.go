package web

import (
	"fmt"
	"strings"
	"sync"
	"testing"
	"time"

	cdppage "github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"

	"gridloom/grid"
	"gridloom/web/planform"
)

// noInjectedMarkup is true when the document holds no markup beyond the
// app's own: its two scripts, its logo, the one figure, and no attribute
// that runs code.
const noInjectedMarkup = `(() => {
	const all = [...document.querySelectorAll('*')];
	const handlers = all.filter(e => [...e.attributes].some(a => a.name.toLowerCase().startsWith('on')));
	const scripts = [...document.scripts].filter(s => s.getAttribute('src') !== '/static/app.js' && s.id !== 'gl-lattice');
	return handlers.length === 0 && scripts.length === 0 &&
		document.querySelectorAll('img:not(.gl-logo), iframe, object, embed').length === 0 &&
		document.querySelectorAll('svg').length === 1 && !('glInjected' in window);
})()`

// TestBrowserHostileNames loads a plan whose names are script payloads,
// points at the figure and edits the form (a live redraw, and a payload
// typed into the plan name), and proves that no payload ran: no
// JavaScript dialog opened, no console error or exception (a payload the
// CSP blocked would report one), and the document holds no markup of
// theirs; the names show as text.
func TestBrowserHostileNames(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1600, 1100)

	var (
		mu      sync.Mutex
		dialogs []string
	)
	events := chromedp.Events(tb.ctx, cdppage.JavascriptDialogOpening)
	go func() {
		for ev, err := range events {
			if err != nil {
				return
			}
			mu.Lock()
			dialogs = append(dialogs, ev.Message)
			mu.Unlock()
			// An open dialog stalls the page; dismiss it so the test goes on.
			_, _ = chromedp.Call(tb.ctx, cdppage.HandleJavaScriptDialog, cdppage.HandleJavaScriptDialogParams{Accept: false})
		}
	}()
	seen := func() []string {
		mu.Lock()
		defer mu.Unlock()
		return append([]string(nil), dialogs...)
	}

	p := testConfig(t).Plan
	p.Name = `<script>alert(1)</script>`
	p.Partitions = append([]grid.PartitionPlan(nil), p.Partitions...)
	names := []string{`<img src=x onerror=alert(1)>`, `"><svg onload=alert(1)>`, `]]><script>alert(2)</script>`}
	for i, n := range names {
		p.Partitions[i].Name = n
	}
	res := grid.Compute(p)
	if res.HasErrors() {
		t.Fatalf("the plan has errors: %v", res.Findings)
	}
	tb.open(srv.URL + "/?" + planform.FormOf(p).Query())
	if !eval[bool](tb, noInjectedMarkup) {
		t.Fatal("the page holds markup from a name")
	}
	if got := eval[string](tb, `document.title`); got != p.Name+" · gridloom" {
		t.Errorf("title %q, want the plan name as text", got)
	}
	for i, n := range names {
		if got := eval[string](tb, fmt.Sprintf(`document.getElementById('f-p%d-name').value`, i)); got != n {
			t.Errorf("partition %d's name field holds %q, want %q", i, got, n)
		}
	}
	if got := eval[string](tb, `document.querySelector('#gl-figure svg title').textContent`); got != p.Name {
		t.Errorf("figure title %q, want %q", got, p.Name)
	}

	// Point at the first partition: the readout names it, as text.
	tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true);
		document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
	l := res.Partitions[0]
	sym := l.Numerology.SymbolAt(3)
	scs := l.Numerology.SCSKHz()
	tb.pointAt(sym.Start+sym.Length/2, grid.CRBEdge(scs, l.StartCRB+2)+grid.Hz(scs)*6000)
	tb.waitFor("the readout names the partition", fmt.Sprintf(`document.getElementById('gl-readout').dataset.name === %q`, l.Name))
	if !eval[bool](tb, fmt.Sprintf(`document.getElementById('gl-readout').children.length === 0 && document.getElementById('gl-readout').textContent.includes(%q)`, l.Name)) {
		t.Error("the readout does not show the name as plain text")
	}

	// A live redraw: the second partition's size.
	tb.do("typing a size", chromedp.Focus(chromedp.ID("f-p1-size")), chromedp.Evaluate[chromedp.Void](`document.getElementById('f-p1-size').select()`),
		chromedp.KeyEvent("40"))
	tb.waitFor("the table shows 40 PRBs", `document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(2)').textContent === '40'`)
	// A payload typed into the plan name, redrawn live.
	typed := `<img src=y onerror=alert(3)>`
	tb.do("typing markup into the name", chromedp.Focus(chromedp.ID("f-name")),
		chromedp.Evaluate[chromedp.Void](`document.getElementById('f-name').setSelectionRange(1e3, 1e3)`), chromedp.KeyEvent(typed), chromedp.KeyEvent(kb.Tab))
	want := p.Name + typed
	tb.waitFor("the title follows the name", fmt.Sprintf(`document.title === %q && document.querySelector('#gl-figure svg title').textContent === %q`, want+" · gridloom", want))
	if !eval[bool](tb, noInjectedMarkup) {
		t.Error("after the live redraws the page holds markup from a name")
	}
	if got := eval[string](tb, `document.getElementById('f-p0-name').value`); got != names[0] {
		t.Errorf("after the redraws partition 0's name holds %q", got)
	}
	if got := seen(); len(got) > 0 {
		t.Errorf("JavaScript dialogs opened: %q", got)
	}

	// The watch is not blind: a dialog the test opens itself is seen.
	tb.do("opening a dialog", chromedp.Evaluate[chromedp.Void](`setTimeout(() => alert('probe'), 0)`))
	for range 200 {
		if len(seen()) > 0 {
			break
		}
		time.Sleep(25 * time.Millisecond)
	}
	if got := seen(); len(got) != 1 || got[0] != "probe" {
		t.Errorf("dialogs %q, want just the probe", got)
	}
	tb.checkConsole()
	if strings.Contains(eval[string](tb, `document.body.innerHTML`), "<img src=") {
		t.Error("the body holds an img from a name")
	}
}
