package web

import (
	"bytes"
	"context"
	"fmt"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/emulation"
	cdpinput "github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The browser tests of the walkthrough, the comparison and opening a saved
// figure by dropping it on the planner.

// walkState is what the walkthrough shows: the step in the address, the
// step shown, the counter and the figure's highlight classes.
const walkState = `(() => ({
	url: new URL(location.href).searchParams.get('step') || '',
	shown: [...document.querySelectorAll('#gl-walk-text .gl-step')].filter(s => !s.hidden).map(s => s.id).join(' '),
	count: document.getElementById('gl-walk-count').textContent,
	figure: document.getElementById('gl-walk-figure').className,
	history: history.length,
	marker: window.glMarker || '',
}))()`

type walkSeen struct {
	URL, Shown, Count, Figure, Marker string
	History                           int
}

func (tb *tab) walkState() walkSeen {
	tb.t.Helper()
	m := eval[map[string]any](tb, walkState)
	return walkSeen{URL: m["url"].(string), Shown: m["shown"].(string), Count: m["count"].(string),
		Figure: m["figure"].(string), Marker: m["marker"].(string), History: int(m["history"].(float64))}
}

// waitStep waits until the walkthrough shows step key, and its address says so.
func (tb *tab) waitStep(key string) walkSeen {
	tb.t.Helper()
	tb.waitFor("step "+key, fmt.Sprintf(`new URL(location.href).searchParams.get('step') === %q && !document.getElementById('step-%s').hidden`, key, key))
	return tb.walkState()
}

// waitAcross is waitFor across a navigation: a poll that the navigation
// cuts off is started again in the new document.
func (tb *tab) waitAcross(what, cond string) {
	tb.t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for {
		ctx, cancel := context.WithTimeout(tb.ctx, 5*time.Second)
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool](cond))
		cancel()
		if err == nil && ok {
			return
		}
		if time.Now().After(deadline) {
			tb.t.Fatalf("waiting until %s (%s): %v", what, cond, err)
		}
		time.Sleep(50 * time.Millisecond)
	}
}

// opacity of the first element matching sel inside the walkthrough's figure,
// once its transition has settled.
func opacityOf(sel string) string {
	return fmt.Sprintf(`Number(getComputedStyle(document.querySelector('#gl-walk-figure %s')).opacity)`, sel)
}

func TestBrowserWalkthrough(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	steps := Walkthrough(grid.Compute(testConfig(t).Plan))
	keys := make([]string, len(steps))
	for i, s := range steps {
		keys[i] = s.Key
	}
	tb := newTab(t, 1440, 900)
	tb.open(srv.URL + "/walk?" + q)
	tb.do("marking the window", chromedp.Evaluate[chromedp.Void](`window.glMarker = 'still here'`))
	start := tb.walkState()
	if start.Shown != "step-channel" || start.Count != "Step 1 of 12" || !strings.Contains(start.Figure, "gl-hl-channel") {
		t.Fatalf("the walkthrough opens at %+v, want the first step", start)
	}

	// → moves one step: the address, the text, the counter and the highlight follow.
	tb.do("pressing →", chromedp.KeyEvent(kb.ArrowRight))
	s := tb.waitStep("grids")
	if s.Count != "Step 2 of 12" || s.Figure != "gl-walk-figure "+highlightClass(steps[1].Highlight) || s.History != start.History+1 {
		t.Errorf("after →: %+v; want step 2, its highlight, one more history entry", s)
	}

	// Page Down, as a presenter's remote sends it, to the first partition:
	// it stays at full strength while the others dim.
	tb.do("pressing Page Down", chromedp.KeyEvent(kb.PageDown))
	tb.waitStep("part-0")
	tb.waitFor("partition 0 highlighted, 1 and 2 dimmed",
		opacityOf(`.gl-part[data-index="0"] .gl-body`)+` === 1 && `+opacityOf(`.gl-part[data-index="1"] .gl-body`)+` < 0.3 && `+
			opacityOf(`.gl-part[data-index="2"] .gl-body`)+` < 0.3 && `+opacityOf(`.gl-legend-part[data-index="0"]`)+` === 1 && `+
			opacityOf(`.gl-legend-part[data-index="1"]`)+` < 0.7`) // dimmed labels stay legible (issue 19): .62, see app.css
	tb.do("pressing → twice", chromedp.KeyEvent(kb.ArrowRight+kb.ArrowRight))
	tb.waitStep("part-2")
	tb.waitFor("partition 2 highlighted, 0 dimmed", opacityOf(`.gl-part[data-index="2"] .gl-body`)+` === 1 && `+opacityOf(`.gl-part[data-index="0"] .gl-body`)+` < 0.3`)

	// End and Home.
	tb.do("pressing End", chromedp.KeyEvent(kb.End))
	s = tb.waitStep(keys[len(keys)-1])
	if s.Count != fmt.Sprintf("Step %d of %d", len(keys), len(keys)) {
		t.Errorf("after End: %+v", s)
	}
	if v := eval[string](tb, `document.getElementById('gl-walk-next').getAttribute('aria-disabled') + '/' + document.getElementById('gl-walk-next').hasAttribute('href')`); v != "true/false" {
		t.Errorf("at the last step the next link is %s, want disabled", v)
	}
	tb.do("pressing → at the end", chromedp.KeyEvent(kb.ArrowRight))
	if s := tb.walkState(); s.URL != keys[len(keys)-1] {
		t.Errorf("→ at the last step moved to %q", s.URL)
	}
	tb.do("pressing Home", chromedp.KeyEvent(kb.Home))
	tb.waitStep("channel")
	tb.do("pressing ← at the start", chromedp.KeyEvent(kb.ArrowLeft))
	if s := tb.walkState(); s.URL != "channel" {
		t.Errorf("← at the first step moved to %q", s.URL)
	}

	// History: back returns to the step before, forward again.
	tb.do("going back", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitStep(keys[len(keys)-1])
	tb.do("going back again", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitStep("part-2")
	tb.do("going forward", chromedp.Evaluate[chromedp.Void](`history.forward()`))
	tb.waitStep(keys[len(keys)-1])

	// The links move too, without a reload.
	tb.do("clicking Previous", chromedp.Click(chromedp.ID("gl-walk-prev")))
	tb.waitStep(keys[len(keys)-2])
	tb.do("clicking a step in the list", chromedp.Click(chromedp.CSS(`.gl-walk-toc a[data-step="6"]`)))
	s = tb.waitStep("tdd")
	tb.waitFor("the TDD band at full strength, the partition bodies dimmed",
		opacityOf(`.gl-tdd-d`)+` === 1 && `+opacityOf(`.gl-body`)+` < 0.3`)
	if s.Marker != "still here" {
		t.Error("moving between steps reloaded the page")
	}
	if got := eval[string](tb, `document.title`); !strings.HasPrefix(got, "7/12 The TDD pattern") {
		t.Errorf("title %q does not name the step", got)
	}

	// A link opens at its step, and the server marks the highlight.
	tb.open(srv.URL + "/walk?" + q + "&step=ssb")
	s = tb.walkState()
	if s.Shown != "step-ssb" || !strings.Contains(s.Figure, "gl-hl-ssb") {
		t.Errorf("the link to the SS/PBCH step opens %+v", s)
	}
	tb.waitFor("the blocks at full strength", opacityOf(`.gl-ssb`)+` === 1 && `+opacityOf(`.gl-body`)+` < 0.3`)

	// The switching step (issue 17) lights the two partitions it is about
	// and gives the delays of the matrix: sensors at 15 kHz to video at 30 kHz
	// is max(1 slot of 1 ms, 2 of 0.5 ms) = 1 ms for type 1 and max(3 ms,
	// 5 · 0.5 ms) = 3 ms for type 2 (TS 38.133 Table 8.6.2-1).
	tb.open(srv.URL + "/walk?" + q + "&step=switch")
	s = tb.walkState()
	if s.Shown != "step-switch" || !strings.Contains(s.Figure, "gl-hl-part-0") || !strings.Contains(s.Figure, "gl-hl-part-1") {
		t.Errorf("the switching step opens %+v", s)
	}
	if got := eval[string](tb, `document.querySelector('#step-switch').textContent`); !strings.Contains(got, "Switching from sensors to video") || !strings.Contains(got, "1000.00 µs if it reports delay type 1 and 3000.00 µs if type 2") {
		t.Errorf("the switching step says %q", got)
	}

	// The projector layout keeps its layout from step to step.
	tb.open(srv.URL + "/walk?" + q + "&view=projector&step=channel")
	tb.do("pressing →", chromedp.KeyEvent(kb.ArrowRight))
	tb.waitStep("grids")
	if u := eval[string](tb, `location.search`); !strings.Contains(u, "view=projector") {
		t.Errorf("the projector layout lost its view: %s", u)
	}
	if href := eval[string](tb, `document.querySelector('[data-layout]').getAttribute('href')`); !strings.HasSuffix(href, "step=grids") {
		t.Errorf("the page-layout link %s does not follow the step", href)
	}
	if px := eval[float64](tb, `parseFloat(getComputedStyle(document.querySelector('#step-grids p:not(.gl-step-no)')).fontSize)`); px < 20 {
		t.Errorf("the projector's narration is %g px, want large type", px)
	}
	tb.checkConsole()
}

// TestBrowserWalkthroughPrint: printed, the print layout puts one step on
// each page, the controls hidden.
func TestBrowserWalkthroughPrint(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1280, 900)
	tb.do("opening the print layout", chromedp.Navigate(srv.URL+"/walk?"+campusQuery(t)+"&view=print"))
	tb.waitFor("the steps", `document.readyState === 'complete' && document.querySelectorAll('.gl-print-step svg').length === 12`)
	if _, err := chromedp.Call(tb.ctx, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"}); err != nil {
		t.Fatal(err)
	}
	got := eval[map[string]any](tb, `(() => {
		const steps = [...document.querySelectorAll('.gl-print-step')];
		return {
			breaks: steps.slice(0, -1).every(s => getComputedStyle(s).breakAfter === 'page'),
			bar: getComputedStyle(document.querySelector('.gl-walkbar')).display,
			masthead: getComputedStyle(document.querySelector('.gl-masthead')).display,
			page: getComputedStyle(document.body).page,
		};
	})()`)
	if got["breaks"] != true || got["bar"] != "none" || got["masthead"] != "none" || got["page"] != "walk" {
		t.Errorf("printed: %v; want a page break after every step, no bar, no masthead, the walk page style", got)
	}
	tb.checkConsole()
}

// scalesOf reads the plot geometry of the comparison's side.
func scalesOf(side string) string {
	return fmt.Sprintf(`(() => { const d = document.getElementById('%s-gl-plot').dataset;
		return [d.x, d.y, d.w, d.h, d.spanTc, d.lowHz, d.highHz].join(' '); })()`, side)
}

func TestBrowserCompare(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	pa, _ := comparePlans(t)
	tb := newTab(t, 1440, 1000)
	// "Compare with…" from the planner: the plan as A, its copy as B.
	tb.open(srv.URL + "/?" + planform.FormOf(pa).Query())
	tb.do("opening the comparison", chromedp.Click(chromedp.CSS(`[data-testid=open-compare]`)))
	tb.waitAcross("the comparison", `document.getElementById('b-gl-plot') !== null && document.readyState === 'complete'`)
	tb.do("marking the window", chromedp.Evaluate[chromedp.Void](`window.glMarker = 'still here';
		window.glFigures = [document.querySelector('[data-testid=figure-a] svg').outerHTML, document.querySelector('[data-testid=figure-b] svg').outerHTML];
		window.glLegendA = [...document.querySelectorAll('[data-testid=figure-a] .gl-legend-part')].map(g => g.querySelector('text').textContent).join('|')`))
	if got := eval[string](tb, `document.getElementById('b-f-name').value`); got != "30 kHz everywhere (copy)" {
		t.Errorf("B is named %q, want the copy's name", got)
	}
	if a, b := eval[string](tb, scalesOf("a")), eval[string](tb, scalesOf("b")); a != b {
		t.Errorf("before the edit the scales differ: A %s, B %s", a, b)
	}
	cell := `(document.querySelector('[data-testid=diff-parts] tr[data-part=broadband] td[data-col="SCS kHz"]') || {}).textContent`
	if got := eval[string](tb, cell); got != "30" {
		t.Errorf("the SCS cell reads %q before the edit, want 30", got)
	}

	// Edit B: its partition to 15 kHz (and the size it then needs), then
	// a span of 2 ms. B's figure and the table follow; A's does not change.
	tb.do("choosing 15 kHz for B", chromedp.Focus(chromedp.ID("b-f-p0-scs")), chromedp.KeyEvent(kb.ArrowUp))
	tb.waitFor("the table shows 30 → 15", cell+` === '30 → 15'`)
	tb.do("choosing a span of 2 ms for B", chromedp.Evaluate[chromedp.Void](`(() => { const s = document.getElementById('b-f-span'); s.value = '2'; s.dispatchEvent(new Event('change', { bubbles: true })); })()`))
	tb.waitFor("B's figure over 2 ms", fmt.Sprintf(`document.getElementById('b-gl-plot').dataset.spanTc === '%d'`, 2*grid.TcPerSubframe))
	// A is the same plan, drawn in the window it shares with B, which grew to 2 ms.
	// (The legend's heads name the partitions; what is drawn of them follows the scale.)
	if !eval[bool](tb, `[...document.querySelectorAll('[data-testid=figure-a] .gl-legend-part')].map(g => g.querySelector('text').textContent).join('|') === window.glLegendA`) {
		t.Error("A's figure shows another plan after an edit of B")
	}
	if eval[bool](tb, `document.querySelector('[data-testid=figure-b] svg').outerHTML === window.glFigures[1]`) {
		t.Error("B's figure did not change with its plan")
	}
	if a, b := eval[string](tb, scalesOf("a")), eval[string](tb, scalesOf("b")); a != b || !strings.Contains(a, fmt.Sprint(2*grid.TcPerSubframe)) {
		t.Errorf("after the edit the scales differ or miss B's span: A %s, B %s", a, b)
	}
	tb.waitFor("the address holds both plans", `['b.p0.scs=15', 'b.span=2', 'a.p0.scs=30'].every((k) => location.search.includes(k))`)
	if eval[string](tb, `window.glMarker`) != "still here" {
		t.Error("editing B reloaded the page")
	}

	// Add a partition to B with its own button: the form is rebuilt, the
	// new partition focused, and the table lists it as B's only.
	tb.do("adding a partition to B", chromedp.Click(chromedp.ID("b-b-add")))
	tb.waitFor("B's new partition", `document.activeElement && document.activeElement.id === 'b-f-p1-name'`)
	tb.waitFor("the table lists it", `[...document.querySelectorAll('[data-testid=diff-parts] tbody tr')].some(r => r.children[1].textContent === 'only in B')`)

	// Back undoes the last edit.
	tb.do("going back", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitFor("B without the new partition", `document.getElementById('b-f-p1-name') === null`)
	tb.checkConsole()
}

// TestBrowserDropFigure drops a saved figure of one plan on the planner of
// another, as a file from the desktop: the page opens the dropped plan.
func TestBrowserDropFigure(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	port := testConfig(t).Demos[1].Plan
	svg := get(t, srv, "/figure.svg?"+planform.FormOf(port).Query())
	wantStatus(t, svg, 200)
	dir := t.TempDir()
	path := filepath.Join(dir, "saltmarsh.svg")
	if err := os.WriteFile(path, []byte(svg.body), 0o644); err != nil {
		t.Fatal(err)
	}
	notAPlan := filepath.Join(dir, "notes.svg")
	if err := os.WriteFile(notAPlan, []byte(`<svg xmlns="http://www.w3.org/2000/svg"/>`), 0o644); err != nil {
		t.Fatal(err)
	}

	tb := newTab(t, 1280, 900)
	tb.open(srv.URL + "/?" + campusQuery(t) + "&fig.theme=print")
	drop := func(file string) {
		data := &cdpinput.DragData{Files: []string{file}, DragOperationsMask: 1}
		for _, typ := range []cdpinput.DispatchDragEventType{cdpinput.DispatchDragEventTypeDragEnter, cdpinput.DispatchDragEventTypeDragOver, cdpinput.DispatchDragEventTypeDrop} {
			if _, err := chromedp.Call(tb.ctx, cdpinput.DispatchDragEvent, cdpinput.DispatchDragEventParams{Type: typ, X: 700, Y: 400, Data: data}); err != nil {
				t.Fatalf("%s %s: %v", typ, file, err)
			}
		}
	}

	// A figure without a plan: the reason beside the file control, the page stays.
	drop(notAPlan)
	tb.waitFor("the reason beside the file control", `document.getElementById('n-f-file').textContent.includes('carries no gridloom plan')`)
	if got := eval[string](tb, `document.getElementById('f-name').value`); got != "Hillcrest campus 40 MHz" {
		t.Errorf("after a refused drop the plan is %q", got)
	}

	drop(path)
	tb.waitAcross("the dropped plan", `document.getElementById('f-name') && document.getElementById('f-name').value === 'Saltmarsh port 100 MHz' && document.readyState === 'complete'`)
	want := "/?" + planform.JoinQuery(planform.FormOf(port).Query(), "fig.theme=print")
	if got := eval[string](tb, `location.pathname + location.search`); got != want {
		t.Errorf("after the drop the address is %s, want %s (the plan, and the page's figure options)", got, want)
	}
	if eval[bool](tb, `document.body.classList.contains('gl-dropping')`) {
		t.Error("the drop hint is still shown")
	}
	// The refused drop's answer is logged by the browser as a failed load,
	// once; anything else on the console is a failure.
	tb.flushConsole()
	tb.mu.Lock()
	defer tb.mu.Unlock()
	refused := 0
	for _, m := range tb.console {
		if m.Type == chromedp.ConsoleError && strings.Contains(m.Text, "status of 400") && strings.Contains(m.URL, "/open?") {
			refused++
			continue
		}
		if m.Type == chromedp.ConsoleError || m.IsException() || m.Type == chromedp.ConsoleWarning {
			t.Errorf("browser console %s: %s (%s:%d)", m.Type, m.Text, m.URL, m.Line)
		}
	}
	if refused != 1 {
		t.Errorf("%d refused uploads logged, want the one refused drop", refused)
	}
}

// TestScreenshotPresent captures the walkthrough (page, projector and
// printed) and the comparison, and checks each is a whole image; with
// -screenshot they are written to testdata/screenshot/ for review:
//
//	go test ./web -run TestScreenshotPresent -screenshot
func TestScreenshotPresent(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	pa, pb := comparePlans(t)
	out := t.TempDir()
	if *screenshot {
		out = filepath.Join("..", "testdata", "screenshot")
	}
	for _, c := range []struct {
		file, path string
		w, h       int
		print      bool
	}{
		{"walk.png", "/walk?" + q + "&step=part-1", 1440, 900, false},
		{"projector.png", "/walk?" + q + "&step=align&view=projector", 1920, 1080, false},
		{"walk-print.png", "/walk?" + q + "&view=print&fig.theme=print", 1123, 794, true},
		{"compare.png", "/compare?" + planform.CompareQuery(planform.FormOf(pa), planform.FormOf(pb), planform.FigureForm{}), 1440, 1400, false},
	} {
		tb := newTab(t, c.w, c.h)
		tb.do("opening "+c.file, chromedp.Navigate(srv.URL+c.path))
		tb.waitFor("the page", `document.readyState === 'complete' && document.querySelector('svg [id$=gl-plot]') !== null`)
		if c.print {
			if _, err := chromedp.Call(tb.ctx, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"}); err != nil {
				t.Fatal(err)
			}
		}
		tb.waitFor("the highlight's transition to end", `document.getAnimations().every(a => a.playState !== 'running')`)
		shot, err := chromedpRun(tb, chromedp.CaptureScreenshot())
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(bytes.NewReader(shot))
		if err != nil || img.Bounds().Dx() != c.w || img.Bounds().Dy() != c.h {
			t.Fatalf("%s: %v, %v", c.file, err, img.Bounds())
		}
		if err := os.WriteFile(filepath.Join(out, c.file), shot, 0o644); err != nil {
			t.Fatal(err)
		}
		tb.checkConsole()
	}
}
