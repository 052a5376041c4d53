package web

import (
	"bytes"
	"context"
	"encoding/json"
	"flag"
	"fmt"
	"net/http/httptest"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/css"
	"github.com/chromedp/cdproto/dom"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/tracing"
	"github.com/chromedp/chromedp"
)

// BenchmarkBrowserRepaint measures, in headless Chromium, the time from a
// change to a form field to the repaint of the redrawn figure: the page
// script fetches the fragment and brings the results in line with it, a
// MutationObserver sees the table show the new value (the figure redrawn,
// checked), and the repaint is the first task after
// the next animation frame (style, layout and paint of the new figure
// done). Both ends are read in the page with performance.now, from the
// change event's timestamp. Each iteration is one edit, alternating the
// first partition's size between two values so that every edit redraws.
//
//	go test ./web -run '^$' -bench BrowserRepaint -benchtime 30x
//
// repaint-ms-median and repaint-ms-p90 are over all edits of the run;
// swap-ms-median stops at the swap, before the frame. The floor
// sub-benchmark times an edit that costs nothing the same way. With
// -edit-trace FILE each plan's measured edits are also recorded as a
// Chromium trace (see editTrace).
func BenchmarkBrowserRepaint(b *testing.B) {
	path := chromiumPath()
	if path == "" {
		b.Skip("Chromium is not at /usr/bin/chromium nor on PATH; install it (apt-get install chromium) to run the browser benchmark")
	}
	srv := httptest.NewServer(perfServer(b))
	defer srv.Close()
	browser := benchBrowser(b, path, 1440, 1000)
	names, queries := perfPlans(b)
	sizes := map[string][2]int{"campus": {48, 47}, "port": {40, 39}, "stadium": {60, 59}, "stress": {148, 147}}
	for _, name := range names {
		b.Run(name, func(b *testing.B) {
			ctx := benchTab(b, browser, 1440, 1000)
			benchDo(b, ctx, "opening the plan", chromedp.Navigate(srv.URL+"/?"+queries[name]))
			c, cancel := context.WithTimeout(ctx, 30*time.Second)
			_, err := chromedp.Run(c, chromedp.Poll[bool](`document.querySelector('#gl-plot') !== null && document.readyState === 'complete'`,
				chromedp.WithPollingTimeout(20*time.Second)))
			cancel()
			if err != nil {
				b.Fatalf("waiting for the figure: %v", err)
			}
			benchDo(b, ctx, "quieting the tab", quiet)
			benchDo(b, ctx, "installing the probe", chromedp.Evaluate[chromedp.Void](repaintProbe))
			edit := func(size int) []float64 {
				c, cancel := context.WithTimeout(ctx, 30*time.Second)
				defer cancel()
				v, err := chromedp.Run(c, chromedp.Evaluate[[]float64](fmt.Sprintf(`window.glEdit('f-p0-size', '%d')`, size), chromedp.EvalAwaitPromise))
				if err != nil || len(v) != len(editMetrics) {
					b.Fatalf("editing the size to %d: %v", size, err)
				}
				return v
			}
			pair := sizes[name]
			n := 0 // edits so far: each one changes the size from the one before
			next := func() []float64 {
				n++
				return edit(pair[n%2])
			}
			for range 10 { // warm-up: the script's compiler, the style and the fetch path
				next()
			}
			stop := startTrace(b, ctx, name)
			var edits [][]float64
			for b.Loop() {
				edits = append(edits, next())
			}
			stop()
			reportEdits(b, edits, editMetrics)
		})
	}
	// The floor: on the same page, the same measurement of an edit that
	// costs next to nothing to answer or show: a change event whose
	// listener fetches a tiny file and swaps one text node in. What it
	// takes is the browser's and the machine's, not the app's.
	b.Run("floor", func(b *testing.B) {
		c, cancel := context.WithTimeout(benchTab(b, browser, 1440, 1000), 30*time.Second)
		defer cancel()
		if err := chromedp.Do(c, chromedp.Navigate(srv.URL+"/?"+queries[names[0]]), quiet, chromedp.Evaluate[chromedp.Void](floorProbe)); err != nil {
			b.Fatalf("opening the page: %v", err)
		}
		edit := func() []float64 {
			v, err := chromedp.Run(c, chromedp.Evaluate[[]float64](`window.glFloor()`, chromedp.EvalAwaitPromise))
			if err != nil || len(v) != 2 {
				b.Fatalf("floor edit: %v", err)
			}
			return v
		}
		for range 10 {
			edit()
		}
		var edits [][]float64
		for b.Loop() {
			edits = append(edits, edit())
		}
		reportEdits(b, edits, editMetrics[:2])
	})
}

var editTrace = flag.String("edit-trace", "", "BenchmarkBrowserRepaint: record each plan's measured edits as a Chromium trace in this file, the plan's name added before the extension")

// startTrace starts recording a Chromium trace of the tab when
// -edit-trace is set, and returns the function that stops it and writes
// the trace. The file opens in Perfetto (ui.perfetto.dev) or
// chrome://tracing: the page's gl: marks show each edit on the renderer's
// main thread beside the frames, the parsing and the network. Tracing
// slows the browser, so the metrics of a traced run are not comparable.
func startTrace(b *testing.B, ctx context.Context, plan string) (stop func()) {
	if *editTrace == "" {
		return func() {}
	}
	var mu sync.Mutex
	var events []json.RawMessage
	done := make(chan struct{})
	var once sync.Once
	err := chromedp.Listen(ctx, func(ev any) {
		switch e := ev.(type) {
		case *tracing.EventDataCollected:
			mu.Lock()
			for _, v := range e.Value {
				if raw, err := json.Marshal(v); err == nil {
					events = append(events, raw)
				}
			}
			mu.Unlock()
		case *tracing.EventTracingComplete:
			once.Do(func() { close(done) })
		}
	})
	if err != nil {
		b.Fatalf("listening for the trace: %v", err)
	}
	benchDo(b, ctx, "starting the trace", chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
		_, err := cdp.Call(ctx, t, tracing.Start, tracing.StartParams{
			TransferMode: tracing.StartTransferModeReportEvents,
			TraceConfig: &tracing.TraceConfig{IncludedCategories: []string{
				"devtools.timeline", "disabled-by-default-devtools.timeline", "toplevel",
				"blink", "blink.user_timing", "loading", "v8", "cc", "viz", "netlog",
			}},
		})
		return err
	}))
	return func() {
		benchDo(b, ctx, "ending the trace", chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
			_, err := cdp.Call(ctx, t, tracing.End, cdp.Empty{})
			return err
		}))
		select {
		case <-done:
		case <-time.After(30 * time.Second):
			b.Fatal("the trace did not complete within 30 s")
		}
		mu.Lock()
		defer mu.Unlock()
		var out bytes.Buffer
		out.WriteString(`{"traceEvents":[`)
		for i, e := range events {
			if i > 0 {
				out.WriteString(",\n")
			}
			out.Write(e)
		}
		out.WriteString("]}\n")
		ext := filepath.Ext(*editTrace)
		file := strings.TrimSuffix(*editTrace, ext) + "-" + plan + ext
		if err := os.WriteFile(file, out.Bytes(), 0o644); err != nil {
			b.Fatal(err)
		}
		b.Logf("trace of %d events in %s", len(events), file)
	}
}

// benchDo runs a on the tab of ctx within 30 s, or ends the benchmark.
func benchDo(b *testing.B, ctx context.Context, what string, a chromedp.Action[chromedp.Void]) {
	b.Helper()
	c, cancel := context.WithTimeout(ctx, 30*time.Second)
	defer cancel()
	if err := chromedp.Do(c, a); err != nil {
		b.Fatalf("%s: %v", what, err)
	}
}

// quiet turns off the DevTools domains that chromedp enables on a tab and
// that a person's browser does not run: network (which records every
// request and keeps its body), DOM and CSS (which report every node and
// style change to the test). Left on, they cost the browser more than the
// edit does; the benchmark only evaluates scripts, which needs none of them.
var quiet = chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
	for _, c := range []cdp.Command[cdp.Empty, cdp.Empty]{network.Disable, css.Disable, dom.Disable} {
		if _, err := cdp.Call(ctx, t, c, cdp.Empty{}); err != nil {
			return fmt.Errorf("%s: %w", c.Method, err)
		}
	}
	return nil
})

// editMetrics names what glEdit measures, in its order, all in ms from
// the change event: the end of the swap, the repaint, and the page
// script's marks (static/app.js): the answer's headers, its body read, its
// results parsed, the results shown.
var editMetrics = []string{"swap", "repaint", "sent", "answered", "read", "parsed", "shown"}

// reportEdits reports the median of each metric over the edits, and the
// 90th percentile of the repaint.
func reportEdits(b *testing.B, edits [][]float64, metrics []string) {
	for i, m := range metrics {
		col := make([]float64, len(edits))
		for j, e := range edits {
			col[j] = e[i]
		}
		b.ReportMetric(quantile(col, 0.5), m+"-ms-median")
		if m == "repaint" {
			b.ReportMetric(quantile(col, 0.9), m+"-ms-p90")
		}
	}
	b.ReportMetric(float64(len(edits)), "edits")
}

// floorProbe defines glFloor(): a change event on a detached input whose
// listener fetches the smallest static file (the icon, under 500 bytes)
// and puts its length in a new element, timed as glEdit times an edit.
const floorProbe = settleJS + `
window.glFloor = () => settle().then(() => new Promise((resolve) => {
  const input = document.createElement('input');
  let t0 = -1;
  input.addEventListener('change', async (e) => {
    t0 = e.timeStamp;
    const text = await (await fetch('/static/icon.svg?floor', { headers: { Accept: 'text/html' } })).text();
    const box = document.getElementById('gl-floor') || document.body.appendChild(Object.assign(document.createElement('p'), { id: 'gl-floor' }));
    const fresh = document.createElement('span');
    fresh.textContent = String(text.length);
    box.replaceChildren(fresh);
    const swap = performance.now() - t0;
    requestAnimationFrame(() => setTimeout(() => resolve([swap, performance.now() - t0]), 0));
  });
  input.dispatchEvent(new Event('change'));
}));`

// settleJS defines settle(): a promise that resolves PAUSE_MS after it is
// asked for, once the page is idle. Every measured edit waits for it, as a
// person pauses between two edits: no one commits two changes within
// 150 ms, and typing reaches the server at most every 250 ms (the page
// script's debounce). Without the pause an edit would also pay for the
// raster and the history update of the one before, which the browser
// finishes off the main thread after the page is idle.
const settleJS = `
const PAUSE_MS = 150;
window.settle = () => new Promise((done) => setTimeout(() => requestIdleCallback(done, { timeout: 500 }), PAUSE_MS));`

// repaintProbe defines glEdit(id, value): once the page has settled (see
// settleJS) it sets
// the field, fires its change event (which the page script answers at
// once, without the typing debounce) and resolves with [swap, repaint] in
// ms from the event, once the results shown hold the new value.
const repaintProbe = settleJS + `
window.glEdit = (id, value) => settle().then(() => new Promise((resolve, reject) => {
  const el = document.getElementById(id);
  const plot = () => document.querySelector('#gl-results #gl-plot');
  const shown = () => (document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(1) td:nth-child(2)') || {}).textContent;
  const figureBefore = plot() && plot().innerHTML;
  let t0 = -1;
  document.addEventListener('change', (e) => { t0 = e.timeStamp; }, { capture: true, once: true });
  const timeout = setTimeout(() => { mo.disconnect(); reject(new Error('no new figure within 10 s')); }, 10000);
  const mo = new MutationObserver(() => {
    if (shown() !== value || !plot()) return;
    mo.disconnect();
    clearTimeout(timeout);
    const swap = performance.now() - t0;
    const redrawn = plot().innerHTML !== figureBefore;
    const at = (name) => { const m = performance.getEntriesByName('gl:' + name, 'mark').pop(); return m ? m.startTime - t0 : -1; };
    const steps = [at('sent'), at('answered'), at('read'), at('parsed'), at('shown')];
    performance.clearMarks();
    requestAnimationFrame(() => setTimeout(() => {
      if (!redrawn) reject(new Error('the table shows ' + value + ' but the figure is as before'));
      else resolve([swap, performance.now() - t0, ...steps]);
    }, 0));
  });
  mo.observe(document.body, { childList: true, characterData: true, subtree: true });
  el.value = value;
  el.dispatchEvent(new Event('change', { bubbles: true }));
}));`

// benchBrowser starts headless Chromium with the flags of the browser tests.
func benchBrowser(b *testing.B, path string, width, height int) context.Context {
	b.Helper()
	actx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), chromiumOptions(path, b.TempDir(), width, height)...)
	b.Cleanup(cancelAlloc)
	ctx, cancel := chromedp.NewContext(actx)
	b.Cleanup(cancel)
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(int64(width), int64(height))); err != nil {
		b.Fatalf("starting Chromium at %s: %v", path, err)
	}
	return ctx
}

// benchTab opens a new tab in the browser of benchBrowser; the tab closes
// when the benchmark ends.
func benchTab(b *testing.B, browser context.Context, width, height int) context.Context {
	b.Helper()
	ctx, cancel := chromedp.NewContext(browser)
	b.Cleanup(cancel)
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(int64(width), int64(height))); err != nil {
		b.Fatalf("opening a tab: %v", err)
	}
	return ctx
}

// quantile is the q-quantile of v (nearest rank), 0 for none.
func quantile(v []float64, q float64) float64 {
	if len(v) == 0 {
		return 0
	}
	s := slices.Clone(v)
	slices.Sort(s)
	return s[min(len(s)-1, int(q*float64(len(s))))]
}
