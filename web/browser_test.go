package web

import (
	"context"
	"encoding/xml"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/browser"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"

	"gridloom/grid"
	"gridloom/web/planform"
)

// The browser tests drive Chromium headless against the real server, figure
// included. Without Chromium they skip, unless GRIDLOOM_REQUIRE_TOOLS=1
// (as in CI), when a missing browser is a failure.

func chromiumPath() string {
	if _, err := os.Stat("/usr/bin/chromium"); err == nil {
		return "/usr/bin/chromium"
	}
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome", "google-chrome-stable"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	return ""
}

// tab is one browser tab with the console watched.
type tab struct {
	t   *testing.T
	ctx context.Context

	mu      sync.Mutex
	console []chromedp.ConsoleMessage
	flushes int
}

// One Chromium serves every browser test of the package: the first test
// that needs it starts it, each test works in a tab of its own (closed when
// the test ends), and TestMain stops it. Starting Chromium took a second or
// more per test, and most tests run in parallel in their tabs.
var chromium struct {
	once sync.Once
	ctx  context.Context // the browser, for tabs to open in
	stop func()
	err  error
}

// sharedBrowser starts the package's Chromium at path, once.
func sharedBrowser(path string) (context.Context, error) {
	chromium.once.Do(func() {
		dir, err := os.MkdirTemp("", "gridloom-chromium-")
		if err != nil {
			chromium.err = err
			return
		}
		// The window is as large as the largest viewport a test emulates.
		actx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), chromiumOptions(path, dir, 2400, 1500)...)
		bctx, cancelBrowser := chromedp.NewContext(actx)
		chromium.stop = func() {
			cancelBrowser()
			cancelAlloc()
			_ = os.RemoveAll(dir)
		}
		if err := chromedp.Do(bctx); err != nil {
			chromium.err = fmt.Errorf("starting Chromium at %s: %w", path, err)
			return
		}
		chromium.ctx = bctx
	})
	return chromium.ctx, chromium.err
}

func TestMain(m *testing.M) {
	code := m.Run()
	if chromium.stop != nil {
		chromium.stop()
	}
	os.Exit(code)
}

// newTab opens a tab of the package's Chromium with a viewport of width ×
// height, its console watched. It skips the test without Chromium.
func newTab(t *testing.T, width, height int) *tab {
	t.Helper()
	path := chromiumPath()
	if path == "" {
		if os.Getenv("GRIDLOOM_REQUIRE_TOOLS") == "1" {
			t.Fatal("GRIDLOOM_REQUIRE_TOOLS=1 but Chromium is not at /usr/bin/chromium nor on PATH (apt-get install chromium)")
		}
		t.Skip("Chromium is not at /usr/bin/chromium nor on PATH; install it (apt-get install chromium) to run the browser tests")
	}
	bctx, err := sharedBrowser(path)
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := chromedp.NewContext(bctx)
	t.Cleanup(cancel)
	if err := chromedp.Do(ctx); err != nil {
		t.Fatalf("opening a tab: %v", err)
	}
	tb := &tab{t: t, ctx: ctx}
	msgs := chromedp.Console(ctx)
	go func() {
		for m, err := range msgs {
			if err != nil {
				return
			}
			tb.mu.Lock()
			tb.console = append(tb.console, m)
			tb.mu.Unlock()
		}
	}()
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(int64(width), int64(height))); err != nil {
		t.Fatal(err)
	}
	return tb
}

// chromiumOptions are the flags of every test and benchmark browser:
// headless, no sandbox (the tests may run as root), no GPU, nothing
// fetched in the background, a profile in dir.
func chromiumOptions(path, dir string, width, height int) []chromedp.ExecAllocatorOption {
	return append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(path),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-quic", true),
		chromedp.NoFirstRun,
		chromedp.UserDataDir(dir),
		chromedp.WindowSize(width, height),
	)
}

// do runs actions with a time limit, failing the test on an error.
func (tb *tab) do(what string, actions ...chromedp.Action[chromedp.Void]) {
	tb.t.Helper()
	ctx, cancel := context.WithTimeout(tb.ctx, 20*time.Second)
	defer cancel()
	if err := chromedp.Do(ctx, actions...); err != nil {
		tb.t.Fatalf("%s: %v", what, err)
	}
}

func eval[T any](tb *tab, expr string) T {
	tb.t.Helper()
	ctx, cancel := context.WithTimeout(tb.ctx, 20*time.Second)
	defer cancel()
	v, err := chromedp.Run(ctx, chromedp.Evaluate[T](expr))
	if err != nil {
		tb.t.Fatalf("evaluating %s: %v", expr, err)
	}
	return v
}

// waitFor polls a JavaScript condition until it holds.
func (tb *tab) waitFor(what, cond string) {
	tb.t.Helper()
	ctx, cancel := context.WithTimeout(tb.ctx, 20*time.Second)
	defer cancel()
	if _, err := chromedp.Run(ctx, chromedp.Poll[bool](cond, chromedp.WithPollingTimeout(15*time.Second), chromedp.WithPollingInterval(25*time.Millisecond))); err != nil {
		tb.t.Fatalf("waiting until %s (%s): %v", what, cond, err)
	}
}

// checkConsole fails the test for any console error or uncaught exception.
func (tb *tab) checkConsole() {
	tb.t.Helper()
	tb.flushConsole()
	tb.mu.Lock()
	defer tb.mu.Unlock()
	for _, m := range tb.console {
		if m.Type == chromedp.ConsoleError || m.IsException() || m.Type == chromedp.ConsoleWarning {
			tb.t.Errorf("browser console %s: %s (%s:%d)", m.Type, m.Text, m.URL, m.Line)
		}
	}
}

// flushConsole waits until every console message the page sent so far has
// reached tb.console: it logs a marker and polls until the marker arrives,
// since the messages arrive in the order they were sent.
func (tb *tab) flushConsole() {
	tb.t.Helper()
	tb.mu.Lock()
	tb.flushes++
	marker := fmt.Sprintf("gl-test-flush-%d", tb.flushes)
	tb.mu.Unlock()
	tb.do("logging a marker", chromedp.Evaluate[chromedp.Void](`console.debug('`+marker+`')`))
	deadline := time.Now().Add(10 * time.Second)
	for {
		tb.mu.Lock()
		arrived := slices.ContainsFunc(tb.console, func(m chromedp.ConsoleMessage) bool { return m.Text == marker })
		tb.mu.Unlock()
		if arrived {
			return
		}
		if time.Now().After(deadline) {
			tb.t.Fatalf("the console marker %s did not arrive", marker)
		}
		time.Sleep(10 * time.Millisecond)
	}
}

func (tb *tab) open(url string) {
	tb.t.Helper()
	tb.do("opening "+url, chromedp.Navigate(url))
	tb.waitFor("the page has its figure and script", `document.querySelector('#gl-plot') !== null && document.readyState === 'complete'`)
}

// scsOfSecond reads the SCS cell of the second partition in the timing table.
const scsOfSecond = `(document.querySelector('[data-testid=timing-table] tbody tr:nth-child(2) td[data-col=scs]') || {}).textContent`

func TestBrowserLiveEdit(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/")
	tb.do("marking the window", chromedp.Evaluate[chromedp.Void](`window.glMarker = 'still here'; window.glFigureBefore = document.querySelector('#gl-figure svg').outerHTML`))
	startURL := eval[string](tb, `location.href`)
	startLen := eval[int](tb, `history.length`)
	if got := eval[string](tb, scsOfSecond); got != "30" {
		t.Fatalf("the second partition's SCS in the table is %q before the edit, want 30", got)
	}

	// Change the second partition's SCS from 30 to 15 kHz with the keyboard, as a user would.
	tb.do("choosing 15 kHz", chromedp.Focus(chromedp.ID("f-p1-scs")), chromedp.KeyEvent(kb.ArrowUp))
	tb.waitFor("the table shows 15 kHz", scsOfSecond+` === '15'`)
	if got := eval[string](tb, `window.glMarker`); got != "still here" {
		t.Errorf("window marker %q after the edit: the page was reloaded", got)
	}
	if eval[bool](tb, `document.querySelector('#gl-figure svg').outerHTML === window.glFigureBefore`) {
		t.Error("the figure did not change with the SCS")
	}
	// The address follows the repaint.
	tb.waitFor("the address holds the edit", `location.search.includes('p1.scs=15')`)
	if n := eval[int](tb, `history.length`); n != startLen+1 {
		t.Errorf("history length %d after one committed edit, want %d", n, startLen+1)
	}

	// Type a size: one history entry for the burst, the table follows.
	tb.do("typing a size", chromedp.Focus(chromedp.ID("f-p1-size")), chromedp.Evaluate[chromedp.Void](`document.getElementById('f-p1-size').select()`),
		chromedp.KeyEvent("40"))
	tb.waitFor("the table shows 40 PRBs", `document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(2)').textContent === '40'`)
	tb.waitFor("the address holds the size", `location.search.includes('p1.size=40')`)
	if n := eval[int](tb, `history.length`); n != startLen+2 {
		t.Errorf("history length %d after typing, want %d (one entry per burst of typing)", n, startLen+2)
	}
	if got := eval[string](tb, `window.glMarker`); got != "still here" {
		t.Error("the page was reloaded while typing")
	}

	// A value that does not parse: the message beside the field, the input kept.
	tb.do("typing a bad size", chromedp.KeyEvent("x"))
	tb.waitFor("a message beside size", `document.getElementById('n-f-p1-size').textContent.includes('not a whole number')`)
	if v := eval[string](tb, `document.getElementById('f-p1-size').value`); v != "40x" {
		t.Errorf("size field holds %q, want the input as typed", v)
	}
	if v := eval[string](tb, `document.getElementById('f-p1-size').getAttribute('aria-invalid')`); v != "true" {
		t.Errorf("aria-invalid %q on the bad field", v)
	}
	tb.waitFor("the address holds the input as typed", `location.search.includes('p1.size=40x')`)

	// Back walks through the edits.
	tb.do("going back", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitFor("size back to 50", `document.getElementById('f-p1-size').value === '50' && document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(2)').textContent === '50'`)
	if got := eval[string](tb, scsOfSecond); got != "15" {
		t.Errorf("one step back: the SCS is %q, want 15", got)
	}
	tb.do("going back again", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitFor("SCS back to 30", scsOfSecond+` === '30' && document.getElementById('f-p1-scs').value === '30'`)
	if u := eval[string](tb, `location.href`); u != startURL {
		t.Errorf("two steps back the address is %s, want %s", u, startURL)
	}
	if got := eval[string](tb, `window.glMarker`); got != "still here" {
		t.Error("going back reloaded the page")
	}

	// Adding a partition rebuilds the form and focuses the new name.
	tb.do("adding a partition", chromedp.Click(chromedp.ID("b-add")))
	tb.waitFor("a fourth partition", `document.getElementById('f-p3-name') !== null && document.activeElement.id === 'f-p3-name'`)
	tb.checkConsole()
}

// TestBrowserQuickEdits: an edit made the moment the one before is shown,
// while that one's address update still waits for the repaint, must not
// lose its own. Each round changes the second partition's size twice in
// a row; the address must end with the second value.
func TestBrowserQuickEdits(t *testing.T) {
	t.Parallel()
	checkPageScript(t, quickEdits)
}

// checkPageScript opens the startup plan and runs script, a promise that
// resolves with "" or with what went wrong, in the page.
func checkPageScript(t *testing.T, script string) {
	t.Helper()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/")
	ctx, cancel := context.WithTimeout(tb.ctx, 60*time.Second)
	defer cancel()
	got, err := chromedp.Run(ctx, chromedp.Evaluate[string](untilJS+script, chromedp.EvalAwaitPromise))
	if err != nil {
		t.Fatal(err)
	}
	if got != "" {
		t.Error(got)
	}
	tb.checkConsole()
}

// untilJS defines until(ok, ms): a promise of whether ok() holds within ms.
const untilJS = `
const until = async (ok, ms) => {
  for (const end = performance.now() + ms; performance.now() < end; ) {
    if (ok()) return true;
    await new Promise((r) => setTimeout(r, 10));
  }
  return ok();
};
`

// quickEdits resolves with "" or with what went wrong.
const quickEdits = `(async () => {
  const shown = () => document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(2)').textContent;
  const el = document.getElementById('f-p1-size');
  const edit = (v) => { el.value = v; el.dispatchEvent(new Event('change', { bubbles: true })); };
  for (let round = 0; round < 8; round++) {
    const first = String(30 + 2 * round), second = String(31 + 2 * round);
    await new Promise((resolve) => {
      const mo = new MutationObserver(() => {
        if (shown() !== first) return;
        mo.disconnect();
        edit(second);
        resolve();
      });
      mo.observe(document.body, { childList: true, characterData: true, subtree: true });
      edit(first);
    });
    if (!await until(() => shown() === second, 5000)) return 'round ' + round + ': the table shows ' + shown() + ', want ' + second;
    if (!await until(() => new URLSearchParams(location.search).get('p1.size') === second, 2000)) {
      return 'round ' + round + ': the address holds size ' + new URLSearchParams(location.search).get('p1.size') + ' after the table shows ' + second;
    }
  }
  return '';
})()`

// TestBrowserKeepsUnchangedParts: after an edit the page parses and
// touches only the parts of the results that changed. A size edit changes
// the figure and the partition table, not the SS/PBCH table: the partition
// table shows the new size, and
// the figure is redrawn. An attribute the test puts on that table shows it
// untouched (bringing it in line would remove it). Sending one block
// instead of four then changes that table, and it is brought in line.
func TestBrowserKeepsUnchangedParts(t *testing.T) {
	t.Parallel()
	checkPageScript(t, keptParts)
}

// keptParts resolves with "" or with what went wrong.
const keptParts = `(async () => {
  const q = (sel) => document.querySelector(sel);
  const size = () => q('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(2)').textContent;
  const edit = (id, v) => { const el = document.getElementById(id); el.value = v; el.dispatchEvent(new Event('change', { bubbles: true })); };
  const ssb = () => q('[data-testid=ssb-table]');
  if (!ssb()) return 'the startup plan has no SS/PBCH table';
  edit('f-p1-size', '31'); // the first update after the page loads parses everything
  if (!await until(() => size() === '31', 5000)) return 'the table shows size ' + size() + ', want 31';
  const table = ssb(), figure = q('#gl-plot').innerHTML;
  table.setAttribute('data-probe', 'untouched');
  edit('f-p1-size', '30');
  if (!await until(() => size() === '30', 5000)) return 'the table shows size ' + size() + ', want 30';
  if (ssb() !== table || table.getAttribute('data-probe') !== 'untouched') return 'a size edit touched the SS/PBCH table';
  if (q('#gl-plot').innerHTML === figure) return 'a size edit left the figure as it was';
  const rows = table.querySelectorAll('tbody tr').length;
  const bitmap = document.getElementById('f-ssb-bitmap');
  if (!bitmap || !/^1+0*$/.test(bitmap.value) || rows < 2) return 'the startup plan does not send its blocks from a leading run of ones: ' + (bitmap && bitmap.value);
  edit('f-ssb-bitmap', '1' + '0'.repeat(bitmap.value.length - 1)); // TS 38.213 4.1: one block sent instead of several
  if (!await until(() => ssb() && ssb().querySelectorAll('tbody tr').length < rows, 5000)) {
    return 'with one block in the bitmap the SS/PBCH table has ' + (ssb() ? ssb().querySelectorAll('tbody tr').length : 'no') + ' rows, want fewer than ' + rows;
  }
  if (ssb().hasAttribute('data-probe')) return 'the changed SS/PBCH table kept an attribute the server did not send';
  return '';
})()`

// TestBrowserRIVFills: typing a locationAndBandwidth places the partition
// by it; committing the field fills start and size from it.
func TestBrowserRIVFills(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/")
	// TS 38.214 5.1.2.2.2, N = 275: RB_start 30, L 40 → RIV = 275·39 + 30 = 10755,
	// counted from offsetToCarrier 1 of the 30 kHz carrier.
	riv, ok := grid.EncodeRIV(30, 40)
	if !ok || riv != 10755 {
		t.Fatalf("EncodeRIV(30, 40) = %d, %v", riv, ok)
	}
	tb.do("typing an RIV", chromedp.Focus(chromedp.ID("f-p1-riv")), chromedp.KeyEvent(fmt.Sprint(riv)))
	if v := eval[string](tb, `document.getElementById('f-p1-start').value + '/' + document.getElementById('f-p1-size').value`); v != "/" {
		t.Errorf("start/size while typing the RIV: %q, want both cleared", v)
	}
	tb.waitFor("the table places the partition by the RIV", `document.querySelector('[data-testid=spectrum-table] tbody tr:nth-child(2) td:nth-child(3)').textContent === '31–70'`)
	tb.do("leaving the field", chromedp.KeyEvent(kb.Tab))
	tb.waitFor("start and size filled from the RIV", `document.getElementById('f-p1-start').value === '31' && document.getElementById('f-p1-size').value === '40' && document.getElementById('f-p1-riv').value === '' && document.getElementById('f-p1-riv').placeholder === '10755'`)
	tb.waitFor("the address holds start and size", `location.search.includes('p1.start=31&p1.size=40') && !location.search.includes('p1.riv')`)
	tb.checkConsole()
}

func TestBrowserDownloadsFigure(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1280, 900)
	dir := t.TempDir()
	events := true
	if _, err := chromedp.CallBrowser(tb.ctx, browser.SetDownloadBehavior, browser.SetDownloadBehaviorParams{
		Behavior: browser.SetDownloadBehaviorBehaviorAllow, DownloadPath: dir, EventsEnabled: &events,
	}); err != nil {
		t.Fatal(err)
	}
	tb.open(srv.URL + "/")
	tb.do("clicking the figure link", chromedp.Click(chromedp.CSS(`[data-testid=download-svg]`)))
	path := filepath.Join(dir, "hillcrest-campus-40-mhz.svg")
	deadline := time.Now().Add(15 * time.Second)
	var data []byte
	for {
		b, err := os.ReadFile(path)
		if err == nil && len(b) > 0 && strings.HasSuffix(strings.TrimSpace(string(b)), "</svg>") {
			data = b
			break
		}
		if time.Now().After(deadline) {
			entries, _ := os.ReadDir(dir)
			t.Fatalf("no download at %s; the folder holds %v", path, entries)
		}
		time.Sleep(50 * time.Millisecond)
	}
	var root struct {
		XMLName xml.Name
		ViewBox string `xml:"viewBox,attr"`
	}
	if err := xml.Unmarshal(data, &root); err != nil || root.XMLName.Local != "svg" || root.ViewBox == "" {
		t.Errorf("the download is not a valid SVG with a viewBox: %v, %v", err, root)
	}
	if !strings.Contains(string(data), `id="gl-plot"`) {
		t.Error("the downloaded SVG has no plot")
	}
	tb.checkConsole()
}

// pointAt moves the mouse onto time t (Tc) and frequency hz (from point A)
// of the figure, by the hover contract, and returns where the pointer event
// landed in plot units, as the page saw it.
func (tb *tab) pointAt(t grid.Tc, hz grid.Hz) (x, y float64) {
	tb.t.Helper()
	xy := eval[[]float64](tb, fmt.Sprintf(`(() => {
		const g = document.getElementById('gl-plot'), d = g.dataset;
		const ux = +d.x + %d / +d.spanTc * +d.w;
		const uy = +d.y + +d.h - (%d - +d.lowHz) / (+d.highHz - +d.lowHz) * +d.h;
		const p = new DOMPoint(ux, uy).matrixTransform(g.getScreenCTM());
		return [p.x, p.y];
	})()`, t, hz))
	tb.do("moving the mouse", chromedp.MouseEvent(chromedp.MouseMoved, xy[0]+3, xy[1]+3), chromedp.MouseEvent(chromedp.MouseMoved, xy[0], xy[1]))
	got := eval[[]float64](tb, `(() => {
		const g = document.getElementById('gl-plot');
		const p = new DOMPoint(window.glPointer[0], window.glPointer[1]).matrixTransform(g.getScreenCTM().inverse());
		return [p.x, p.y];
	})()`)
	return got[0], got[1]
}

// plotGeometry reads the hover contract of the figure on the page.
type plotGeometry struct{ X, Y, W, H, SpanTc, LowHz, HighHz float64 }

func (tb *tab) geometry() plotGeometry {
	g := eval[[]float64](tb, `(() => { const d = document.getElementById('gl-plot').dataset;
		return [+d.x, +d.y, +d.w, +d.h, +d.spanTc, +d.lowHz, +d.highHz]; })()`)
	return plotGeometry{g[0], g[1], g[2], g[3], g[4], g[5], g[6]}
}

// symbolAtTime finds, with grid's own SymbolAt, the symbol holding instant t.
func symbolAtTime(n grid.Numerology, count int, t float64) (int, grid.Symbol) {
	for k := range count {
		s := n.SymbolAt(k)
		if t >= float64(s.Start) && t < float64(s.End()) {
			return k, s
		}
	}
	return -1, grid.Symbol{}
}

func TestBrowserReadout(t *testing.T) {
	t.Parallel()
	plans := demoPlans(t)
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 2400, 1500)
	cases := []struct {
		plan      string
		part      int // index in Result.Partitions
		k, crbOff int // symbol, and CRB counted from the partition's start
	}{
		{"campus.yaml", 1, 17, 10},  // 30 kHz, normal CP
		{"campus.yaml", 0, 7, 20},   // 15 kHz: l = 7 carries the long CP
		{"campus.yaml", 2, 999, 61}, // 15 kHz: clamped to the last symbol of the span
		{"port.yaml", 0, 29, 3},     // 60 kHz extended CP
		{"port.yaml", 2, 28, 88},    // 30 kHz, l = 0 of the second subframe
		{"stadium.yaml", 1, 56, 5},  // 120 kHz: l = 56 opens the second half subframe
		{"stadium.yaml", 0, 27, 0},  // 60 kHz
	}
	opened := ""
	for _, c := range cases {
		res := grid.Compute(plans[c.plan])
		if opened != c.plan {
			tb.open(srv.URL + "/?" + planform.FormOf(plans[c.plan]).Query())
			tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true);
				document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
			opened = c.plan
		}
		l := res.Partitions[c.part]
		k := min(c.k, l.SymbolCount()-1)
		sym := l.Numerology.SymbolAt(k)
		scs := l.Numerology.SCSKHz()
		crb := l.StartCRB + min(c.crbOff, l.SizePRB-1)
		target := grid.CRBEdge(scs, crb) + grid.Hz(scs)*6000 // the CRB's centre
		ux, uy := tb.pointAt(sym.Start+sym.Length/2, target)

		// What the pointer really points at, by the contract and grid alone.
		g := tb.geometry()
		tAt := (ux - g.X) / g.W * g.SpanTc
		hzAt := g.LowHz + (g.Y+g.H-uy)/g.H*(g.HighHz-g.LowHz)
		wantK, wantSym := symbolAtTime(l.Numerology, l.SymbolCount(), tAt)
		wantCRB := int(math.Floor((hzAt + float64(scs)*500) / float64(scs*12000)))
		if wantK != k || wantCRB != crb {
			t.Fatalf("%s %s: the pointer landed on symbol %d, CRB %d; aimed at %d, %d (figure too small?)", c.plan, l.Name, wantK, wantCRB, k, crb)
		}
		tb.waitFor("the readout names the symbol", fmt.Sprintf(`document.getElementById('gl-readout').dataset.k === '%d' && document.getElementById('gl-readout').dataset.name === %q`, k, l.Name))
		ro := eval[map[string]string](tb, `Object.assign({}, document.getElementById('gl-readout').dataset, {text: document.getElementById('gl-readout').textContent})`)
		want := map[string]string{
			"part": fmt.Sprint(l.Index), "slot": fmt.Sprint(wantSym.Slot), "symbol": fmt.Sprint(wantSym.Symbol),
			"startTc": fmt.Sprint(int64(wantSym.Start)), "cpTc": fmt.Sprint(int64(wantSym.CP)), "crb": fmt.Sprint(crb),
		}
		for key, w := range want {
			if ro[key] != w {
				t.Errorf("%s %s symbol %d: readout %s = %q, want %q (grid SymbolAt)", c.plan, l.Name, k, key, ro[key], w)
			}
		}
		// The readout keeps the time axis's unit (issue 19): µs to the ns
		// on a span up to 2 ms, ms to the ns beyond (fig.timeUnit auto),
		// judged from the figure's span, not from the unit the page says.
		us, unit := fmt.Sprintf("starts %.3f µs, CP %.3f µs", wantSym.Start.Micros(), wantSym.CP.Micros()), "us"
		if g.SpanTc > 2*float64(grid.TcPerSubframe) {
			us, unit = fmt.Sprintf("starts %.6f ms, CP %.6f ms", wantSym.Start.Micros()/1000, wantSym.CP.Micros()/1000), "ms"
		}
		if got := eval[string](tb, `document.getElementById('gl-plot').dataset.timeUnit`); got != unit {
			t.Errorf("%s: a %.0f Tc span draws its time axis in %q, want %q", c.plan, g.SpanTc, got, unit)
		}
		if !strings.Contains(ro["text"], us) || !strings.Contains(ro["text"], fmt.Sprintf("slot %d, symbol %d", wantSym.Slot, wantSym.Symbol)) {
			t.Errorf("%s %s: readout %q, want it to say %q", c.plan, l.Name, ro["text"], us)
		}
		if eval[int](tb, `document.querySelectorAll('#gl-plot .gl-cursor').length`) != 1 {
			t.Errorf("%s: the cell is not outlined in the figure", c.plan)
		}
	}

	// fig.timeUnit=ms on the 2 ms stadium plan: the axis and the readout
	// both in ms (issue 19).
	res := grid.Compute(plans["stadium.yaml"])
	tb.open(srv.URL + "/?" + planform.FormOf(plans["stadium.yaml"]).Query() + "&fig.timeUnit=ms")
	tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true);
		document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
	s0 := res.Partitions[0].Numerology.SymbolAt(2)
	tb.pointAt(s0.Start+s0.Length/2, (res.Partitions[0].Low+res.Partitions[0].High)/2)
	tb.waitFor("the readout in ms", `document.getElementById('gl-readout').dataset.k === '2'`)
	text := eval[string](tb, `document.getElementById('gl-readout').textContent`)
	axis := eval[string](tb, `document.querySelector('#gl-figure .gl-axes').textContent`)
	if want := fmt.Sprintf("starts %.6f ms", s0.Start.Micros()/1000); !strings.Contains(text, want) || strings.Contains(text, "µs") || !strings.Contains(axis, "time (ms)") {
		t.Errorf("fig.timeUnit=ms: readout %q (want %q and no µs), axis %q", text, want, axis)
	}

	// The keyboard: focus the figure, then step through symbols and partitions.
	tb.open(srv.URL + "/?" + planform.FormOf(plans["stadium.yaml"]).Query())
	tb.do("focusing the figure", chromedp.Focus(chromedp.ID("gl-figure")))
	lowest := res.Partitions[0] // gates, at the bottom of the channel
	tb.waitFor("the readout at the first symbol", fmt.Sprintf(`document.getElementById('gl-readout').dataset.name === %q && document.getElementById('gl-readout').dataset.k === '0'`, lowest.Name))
	tb.do("stepping right", chromedp.KeyEvent(kb.ArrowRight+kb.ArrowRight+kb.ArrowRight))
	s3 := lowest.Numerology.SymbolAt(3)
	tb.waitFor("symbol 3", fmt.Sprintf(`document.getElementById('gl-readout').dataset.k === '3' && document.getElementById('gl-readout').dataset.startTc === '%d'`, s3.Start))
	tb.do("next partition up", chromedp.KeyEvent(kb.PageUp))
	tb.waitFor("the next partition", fmt.Sprintf(`document.getElementById('gl-readout').dataset.name === %q`, res.Partitions[1].Name))
	tb.checkConsole()
}

// An upload whose link would be over the query limit opens as its page at
// once, with the reason beside the file control, and not as a redirect to
// a link the app answers with 414 (issue 13).
func TestBrowserUploadOverLinkLimit(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	file, err := filepath.Abs("../testdata/hostile/link-too-long.json")
	if err != nil {
		t.Fatal(err)
	}
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/")
	tb.do("choosing the file", chromedp.SetUploadFiles(chromedp.ID("f-file"), []string{file}))
	tb.do("opening it", chromedp.Click(`[data-testid=open]`))
	// The page is replaced by the answer: poll through the navigation,
	// when an evaluation may find no page to run in.
	note := `(document.querySelector('#n-f-file') || {textContent: ''}).textContent.includes('shown here without a link')`
	for deadline := time.Now().Add(15 * time.Second); ; {
		ctx, cancel := context.WithTimeout(tb.ctx, 2*time.Second)
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool](note))
		cancel()
		if err == nil && ok && eval[string](tb, `document.readyState`) == "complete" {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("no note about the link after the upload (last error %v)", err)
		}
		time.Sleep(25 * time.Millisecond)
	}
	if got := eval[string](tb, `location.pathname`); got != "/open" {
		t.Errorf("the page's address is %q, want /open: the plan was not redirected to a link", got)
	}
	if got := eval[string](tb, `document.title`); !strings.Contains(got, "sixty-four partitions") {
		t.Errorf("title %q: the page is not the uploaded plan's", got)
	}
	// No console check: Chromium logs the page's own 422 (the plan has
	// error findings) as a resource that failed to load.
}
