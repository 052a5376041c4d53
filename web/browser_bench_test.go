package web

import (
	"context"
	"fmt"
	"net/http/httptest"
	"slices"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// BenchmarkBrowserRepaint measures, in headless Chromium, the time from a
// change to a form field to the repaint of the redrawn figure: the page
// script fetches the fragment and swaps it in, a MutationObserver sees the
// new results with their figure, and the repaint is the first task after
// the next animation frame (style, layout and paint of the new figure
// done). Both ends are read in the page with performance.now, from the
// change event's timestamp. Each iteration is one edit, alternating the
// first partition's size between two values so that every edit redraws.
//
//	go test ./web -run '^$' -bench BrowserRepaint -benchtime 30x
//
// repaint-ms-median and repaint-ms-p90 are over all edits of the run;
// swap-ms-median stops at the swap, before the frame. The floor
// sub-benchmark times an edit that costs nothing the same way.
func BenchmarkBrowserRepaint(b *testing.B) {
	path := chromiumPath()
	if path == "" {
		b.Skip("Chromium is not at /usr/bin/chromium nor on PATH; install it (apt-get install chromium) to run the browser benchmark")
	}
	srv := httptest.NewServer(perfServer(b))
	defer srv.Close()
	ctx := benchBrowser(b, path, 1440, 1000)
	names, queries := perfPlans(b)
	sizes := map[string][2]int{"campus": {48, 47}, "port": {40, 39}, "stadium": {60, 59}, "stress": {148, 147}}
	for _, name := range names {
		b.Run(name, func(b *testing.B) {
			run := func(what string, a chromedp.Action[chromedp.Void]) {
				b.Helper()
				c, cancel := context.WithTimeout(ctx, 30*time.Second)
				defer cancel()
				if err := chromedp.Do(c, a); err != nil {
					b.Fatalf("%s: %v", what, err)
				}
			}
			run("opening the plan", chromedp.Navigate(srv.URL+"/?"+queries[name]))
			c, cancel := context.WithTimeout(ctx, 30*time.Second)
			_, err := chromedp.Run(c, chromedp.Poll[bool](`document.querySelector('#gl-plot') !== null && document.readyState === 'complete'`,
				chromedp.WithPollingTimeout(20*time.Second)))
			cancel()
			if err != nil {
				b.Fatalf("waiting for the figure: %v", err)
			}
			run("installing the probe", chromedp.Evaluate[chromedp.Void](repaintProbe))
			edit := func(size int) (swap, repaint float64) {
				c, cancel := context.WithTimeout(ctx, 30*time.Second)
				defer cancel()
				v, err := chromedp.Run(c, chromedp.Evaluate[[]float64](fmt.Sprintf(`window.glEdit('f-p0-size', '%d')`, size), chromedp.EvalAwaitPromise))
				if err != nil || len(v) != 2 {
					b.Fatalf("editing the size to %d: %v", size, err)
				}
				return v[0], v[1]
			}
			pair := sizes[name]
			for i := range 3 { // warm-up: the script, the style and the fetch path
				edit(pair[(i+1)%2])
			}
			edit(pair[0])
			var swaps, repaints []float64
			i := 0
			for b.Loop() {
				i++
				s, r := edit(pair[i%2])
				swaps = append(swaps, s)
				repaints = append(repaints, r)
			}
			reportRepaints(b, swaps, repaints)
		})
	}
	// The floor: on the same page, the same measurement of an edit that
	// costs next to nothing to answer or show: a change event whose
	// listener fetches a tiny file and swaps one text node in. What it
	// takes is the browser's and the machine's, not the app's.
	b.Run("floor", func(b *testing.B) {
		c, cancel := context.WithTimeout(ctx, 30*time.Second)
		defer cancel()
		if err := chromedp.Do(c, chromedp.Navigate(srv.URL+"/?"+queries[names[0]]), chromedp.Evaluate[chromedp.Void](floorProbe)); err != nil {
			b.Fatalf("opening the page: %v", err)
		}
		edit := func() (swap, repaint float64) {
			v, err := chromedp.Run(c, chromedp.Evaluate[[]float64](`window.glFloor()`, chromedp.EvalAwaitPromise))
			if err != nil || len(v) != 2 {
				b.Fatalf("floor edit: %v", err)
			}
			return v[0], v[1]
		}
		for range 3 {
			edit()
		}
		var swaps, repaints []float64
		for b.Loop() {
			s, r := edit()
			swaps = append(swaps, s)
			repaints = append(repaints, r)
		}
		reportRepaints(b, swaps, repaints)
	})
}

func reportRepaints(b *testing.B, swaps, repaints []float64) {
	b.ReportMetric(quantile(repaints, 0.5), "repaint-ms-median")
	b.ReportMetric(quantile(repaints, 0.9), "repaint-ms-p90")
	b.ReportMetric(quantile(swaps, 0.5), "swap-ms-median")
	b.ReportMetric(float64(len(repaints)), "edits")
}

// floorProbe defines glFloor(): a change event on a detached input whose
// listener fetches the smallest static file (the icon, under 500 bytes)
// and puts its length in a new element, timed as glEdit times an edit.
const floorProbe = `
window.glFloor = () => new Promise((resolve) => {
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
});`

// repaintProbe defines glEdit(id, value): it sets the field, fires its
// change event (which the page script answers at once, without the typing
// debounce) and resolves with [swap, repaint] in ms from the event, once
// the results shown hold the new value.
const repaintProbe = `
window.glEdit = (id, value) => new Promise((resolve, reject) => {
  const el = document.getElementById(id);
  const before = document.getElementById('gl-results');
  const shown = () => (document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(1) td:nth-child(2)') || {}).textContent;
  let t0 = -1;
  document.addEventListener('change', (e) => { t0 = e.timeStamp; }, { capture: true, once: true });
  const timeout = setTimeout(() => { mo.disconnect(); reject(new Error('no new figure within 10 s')); }, 10000);
  const mo = new MutationObserver(() => {
    const now = document.getElementById('gl-results');
    if (now === before || !now || !now.querySelector('#gl-plot')) return;
    mo.disconnect();
    clearTimeout(timeout);
    const swap = performance.now() - t0;
    requestAnimationFrame(() => setTimeout(() => {
      if (shown() !== value) reject(new Error('the table shows ' + shown() + ', want ' + value));
      else resolve([swap, performance.now() - t0]);
    }, 0));
  });
  mo.observe(document.body, { childList: true, subtree: true });
  el.value = value;
  el.dispatchEvent(new Event('change', { bubbles: true }));
});`

// benchBrowser starts headless Chromium with the flags of the browser tests.
func benchBrowser(b *testing.B, path string, width, height int) context.Context {
	b.Helper()
	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(path),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-quic", true),
		chromedp.NoFirstRun,
		chromedp.UserDataDir(b.TempDir()),
		chromedp.WindowSize(width, height),
	)
	actx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), opts...)
	b.Cleanup(cancelAlloc)
	ctx, cancel := chromedp.NewContext(actx)
	b.Cleanup(cancel)
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(int64(width), int64(height))); err != nil {
		b.Fatalf("starting Chromium at %s: %v", path, err)
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
