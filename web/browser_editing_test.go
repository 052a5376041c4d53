package web

import (
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"

	"gridloom/grid/demo"
)

// Browser tests of issue 19's second half: a new plan, the overlap drawn
// and cleared, the readout beside the pointer, the SS/PBCH labels apart
// from the names, and compare's B side opened from a file (axe-core is
// browser_axe_test.go's).

// issueWidths are the widths issue 19 tried the page at.
var issueWidths = []int{390, 1024, 1440, 1920}

// TestBrowserNewPlan: "New plan" in the masthead opens an empty carrier —
// one partition filling a 20 MHz carrier, no error or warning — at each
// width, and the address holds it, so reloading keeps it.
func TestBrowserNewPlan(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.open(srv.URL + "/?" + campusQuery(t))
			if !eval[bool](tb, `(() => { const r = document.querySelector('[data-testid=new-plan]').getBoundingClientRect(); return r.width > 0 && r.left >= 0 && r.right <= innerWidth; })()`) {
				t.Fatal("the New plan link is not in view")
			}
			tb.do("following New plan", chromedp.Click(chromedp.CSS(`[data-testid=new-plan]`)))
			tb.waitAcross("the new plan's page", `document.readyState === 'complete' && document.getElementById('f-name') && document.getElementById('f-name').value === 'New plan'`)
			got := eval[[]string](tb, `[location.pathname, document.getElementById('gl-work').dataset.status,
				String(document.querySelectorAll('[id^=f-p][id$=-name]').length), document.getElementById('f-bw').value,
				document.getElementById('f-p0-size').value, document.getElementById('f-p0-scs').value,
				String(document.querySelectorAll('[data-testid=findings] .gl-error, [data-testid=findings] .gl-warning').length)]`)
			if want := []string{"/", "200", "1", "20", "51", "30", "0"}; fmt.Sprint(got) != fmt.Sprint(want) {
				t.Errorf("the new plan: path, status, partitions, bandwidth, size, SCS, errors+warnings = %q, want %q", got, want)
			}
			if eval[int](tb, `document.querySelectorAll('#gl-figure svg').length`) != 1 {
				t.Error("the new plan has no figure")
			}
			tb.checkConsole()
		})
	}
}

// TestBrowserOverlapOutlined: two downlink partitions of the campus plan
// made to overlap are outlined on the page's figure in the error ink, the
// outline inside the figure and across the band both share, and the
// finding says how to clear it in CRBs and, the carrier having a centre,
// in MHz — at each width of the issue.
func TestBrowserOverlapOutlined(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	v := mustQuery(t, campusQuery(t))
	v.Set("p2.start", "140") // "control" (15 kHz, DL) into "video" (30 kHz CRBs 26–75, DL)
	q := v.Encode()
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.open(srv.URL + "/?" + q)
			got := eval[[]float64](tb, `(() => {
				const o = document.querySelector('#gl-figure .gl-overlap'), svg = document.querySelector('#gl-figure svg');
				if (!o) return [];
				const r = o.getBoundingClientRect(), s = svg.getBoundingClientRect();
				return [r.left - s.left, s.right - r.right, r.top - s.top, s.bottom - r.bottom, r.width, r.height];
			})()`)
			if len(got) == 0 {
				t.Fatal("no overlap outline in the figure")
			}
			for i, d := range got[:4] {
				if d < 0 {
					t.Errorf("the outline leaves the figure by %.1f px on side %d", -d, i)
				}
			}
			if got[4] < float64(width)/4 || got[5] < 1 {
				t.Errorf("the outline is %.0f × %.1f px, want across the plot", got[4], got[5])
			}
			if stroke := eval[string](tb, `getComputedStyle(document.querySelector('#gl-figure .gl-overlap')).stroke`); stroke != "rgb(176, 42, 32)" {
				t.Errorf("outline stroke %s, want the error ink rgb(176, 42, 32)", stroke)
			}
			text := eval[string](tb, `[...document.querySelectorAll('[data-testid=findings] .gl-error .gl-text')].map(e => e.textContent).join('\n')`)
			for _, want := range []string{`to clear it, start "control" at CRB 152 or above (its lower edge at `, ` MHz or higher)`} {
				if !strings.Contains(text, want) {
					t.Errorf("the overlap finding does not say %q:\n%s", want, text)
				}
			}
			// No checkConsole: a plan with an error finding is answered 422, which
			// the console reports as a failed load.
		})
	}
}

// TestBrowserReadoutBesidePointer: pointing at the figure puts the readout
// beside the pointer — its nearest edge within 40 px, not over the point,
// wholly inside the viewport — at points near each corner of the plot's
// visible part, at each width of the issue; what follows the figure does
// not move; leaving the figure docks it under the figure again; the
// keyboard's mark brings it beside the mark.
func TestBrowserReadoutBesidePointer(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			height := 900
			if width == 390 {
				height = 800
			}
			tb := newTab(t, width, height)
			tb.open(srv.URL + "/?" + campusQuery(t))
			tb.do("scrolling the figure into view", chromedp.Evaluate[chromedp.Void](`document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
			tb.waitFor("the scroll done", `(() => { const r = document.getElementById('gl-figure').getBoundingClientRect(); return r.bottom > 0 && r.top < innerHeight; })()`)
			tb.do("watching the pointer", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY, performance.now()]; }, true)`))
			below := eval[float64](tb, `document.querySelector('.gl-downloads').getBoundingClientRect().top`)
			// The plot's visible part in the viewport: [left, top, right, bottom].
			plot := eval[[]float64](tb, `(() => { const r = document.querySelector('#gl-plot').getBoundingClientRect();
				return [Math.max(r.left, 0), Math.max(r.top, 0), Math.min(r.right, innerWidth), Math.min(r.bottom, innerHeight)]; })()`)
			for _, at := range [][2]float64{{0.05, 0.05}, {0.95, 0.05}, {0.5, 0.5}, {0.05, 0.95}, {0.95, 0.95}} {
				x := plot[0] + at[0]*(plot[2]-plot[0])
				y := plot[1] + at[1]*(plot[3]-plot[1])
				tb.do("pointing", chromedp.MouseEvent(chromedp.MouseMoved, x+2, y+2), chromedp.MouseEvent(chromedp.MouseMoved, x, y))
				// The readout follows on the next frame: wait for the event, then 100 ms.
				tb.waitFor("the readout placed", fmt.Sprintf(`window.glPointer && Math.abs(glPointer[0] - %f) < 1 && Math.abs(glPointer[1] - %f) < 1 && performance.now() > glPointer[2] + 100 && document.getElementById('gl-readout').classList.contains('gl-float')`, x, y))
				r := eval[[]float64](tb, `(() => { const r = document.getElementById('gl-readout').getBoundingClientRect(); return [r.left, r.top, r.right, r.bottom]; })()`)
				dx := max(r[0]-x, x-r[2], 0)
				dy := max(r[1]-y, y-r[3], 0)
				dist := max(dx, dy)
				if dist > 40 {
					t.Errorf("pointer at (%.0f, %.0f): the readout at %v is %.0f px away, want at most 40", x, y, r, dist)
				}
				if dx == 0 && dy == 0 {
					t.Errorf("pointer at (%.0f, %.0f): the readout at %v covers the point read", x, y, r)
				}
				if r[0] < 0 || r[1] < 0 || r[2] > float64(width) || r[3] > float64(height) {
					t.Errorf("pointer at (%.0f, %.0f): the readout at %v leaves the %d×%d viewport", x, y, r, width, height)
				}
			}
			if got := eval[float64](tb, `document.querySelector('.gl-downloads').getBoundingClientRect().top`); math.Abs(got-below) > 0.5 {
				t.Errorf("what follows the figure moved from %.1f to %.1f while pointing", below, got)
			}
			tb.do("leaving the figure", chromedp.MouseEvent(chromedp.MouseMoved, 1, 1))
			tb.waitFor("the readout docked under the figure", `(() => { const o = document.getElementById('gl-readout'); return !o.classList.contains('gl-float') && o.getBoundingClientRect().top >= document.getElementById('gl-figure').getBoundingClientRect().bottom - 1; })()`)
			tb.do("focusing the figure", chromedp.Focus(chromedp.ID("gl-figure")))
			tb.waitFor("the readout beside the keyboard's mark", `(() => {
				const o = document.getElementById('gl-readout'), m = document.querySelector('#gl-plot .gl-cursor');
				if (!m || !o.classList.contains('gl-float')) return false;
				const a = o.getBoundingClientRect(), b = m.getBoundingClientRect();
				return Math.max(a.left - b.right, b.left - a.right, a.top - b.bottom, b.top - a.bottom) <= 40;
			})()`)
			tb.checkConsole()
		})
	}
}

// TestBrowserLabelsDoNotCollide: with "video" cut to 28 PRBs the label
// "SSB 0–3" would sit on the name "video 30 kHz"; in the page's figure no
// SS/PBCH label's box (as the browser lays its glyphs out) overlaps a
// partition's name, at each width of the issue.
func TestBrowserLabelsDoNotCollide(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	v := mustQuery(t, campusQuery(t))
	v.Set("p1.size", "28")
	q := v.Encode()
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.open(srv.URL + "/?" + q)
			hits := eval[[]string](tb, `(() => {
				const box = (e) => e.getBoundingClientRect();
				const names = [...document.querySelectorAll('#gl-figure .gl-name')], ssb = [...document.querySelectorAll('#gl-figure .gl-ssb-label')];
				if (ssb.length === 0) return ['no SS/PBCH label'];
				const out = [];
				for (const s of ssb) for (const n of names) {
					const a = box(s), b = box(n);
					if (a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom) out.push(s.textContent + ' on ' + n.textContent);
				}
				return out;
			})()`)
			if len(hits) > 0 {
				t.Errorf("labels overlap: %q", hits)
			}
		})
	}
}

// TestBrowserCompareOpenB: compare's B side opens a plan from a file — its
// Open button and a file dropped on it — keeping A; a file it cannot open
// is refused beside B's control, in view; and B's edit form sits right
// under the figures, before what differs (it sat about 2 000 px below),
// at each width of the issue.
func TestBrowserCompareOpenB(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	dir := t.TempDir()
	port, err := fs.ReadFile(demo.FS, "port.yaml")
	if err != nil {
		t.Fatal(err)
	}
	stadium, err := fs.ReadFile(demo.FS, "stadium.yaml")
	if err != nil {
		t.Fatal(err)
	}
	portFile := filepath.Join(dir, "port.yaml")
	if err := os.WriteFile(portFile, port, 0o644); err != nil {
		t.Fatal(err)
	}
	// drop dispatches a drop of a file on B's figure, as a browser does
	// for a file dragged from the desktop.
	drop := func(tb *tab, name, text string) {
		tb.do("dropping "+name+" on B", chromedp.Evaluate[chromedp.Void](fmt.Sprintf(`(() => {
			const dt = new DataTransfer();
			dt.items.add(new File([%q], %q, {type: 'text/yaml'}));
			const at = document.querySelector('[data-testid=figure-b] .gl-cmp-figure');
			at.dispatchEvent(new DragEvent('dragover', {dataTransfer: dt, bubbles: true, cancelable: true}));
			at.dispatchEvent(new DragEvent('drop', {dataTransfer: dt, bubbles: true, cancelable: true}));
		})()`, text, name)))
	}
	names := `[...document.querySelectorAll('.gl-cmp-head .gl-cmp-name')].map(e => e.textContent).join(' | ')`
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.do("opening the comparison", chromedp.Navigate(srv.URL+"/compare"))
			tb.waitFor("the comparison", `document.readyState === 'complete' && document.querySelector('[data-testid=figure-b]') !== null`)

			// Where B's edit form is, against B's figure and the tables.
			geo := eval[[]float64](tb, `(() => {
				const y = (sel, edge) => document.querySelector(sel).getBoundingClientRect()[edge] + scrollY;
				return [y('[data-testid=figure-b]', 'bottom'), y('[data-testid=form-b]', 'top'), y('[data-testid=form-a]', 'top'), y('[data-testid=diff-totals]', 'top'),
					y('[data-testid=figure-a]', 'bottom'), y('[data-testid=figure-b]', 'top')];
			})()`)
			figB, formB, formA, diff := geo[0], geo[1], geo[2], geo[3]
			if formA > diff || formB > diff {
				t.Errorf("the edit forms (A at %.0f, B at %.0f) come after the difference table (%.0f)", formA, formB, diff)
			}
			// At every width B's form starts at most 400 px below B's
			// figure: beside A's under both figures from 1024 px, right
			// under B's own figure in one column (at 390 px it sat 2 700 px
			// below, after A's form).
			if formB-figB > 400 || formB < figB {
				t.Errorf("B's edit form starts %.0f px below B's figure, want 0 to 400", formB-figB)
			}
			if figA, figBTop := geo[4], geo[5]; width < 900 && !(figA <= formA && formA < figBTop) {
				t.Errorf("one column: A's figure ends at %.0f, A's form starts at %.0f, B's figure at %.0f; want A's form between the figures", figA, formA, figBTop)
			}
			t.Logf("%d px: B's form %.0f px below B's figure", width, formB-figB)
			if sw := eval[float64](tb, `document.documentElement.scrollWidth`); sw > float64(width) {
				t.Errorf("the page is %.0f px wide in a %d px window", sw, width)
			}
			// The form over the results' middle row takes the pointer.
			if !eval[bool](tb, `(() => { const e = document.getElementById('b-p0-name') || document.querySelector('[data-testid=form-b] input'); e.scrollIntoView({block: 'center'});
				const r = e.getBoundingClientRect(); const hit = document.elementFromPoint(r.left + r.width / 2, r.top + r.height / 2); return hit === e; })()`) {
				t.Error("a field of B's form is not what the pointer reaches")
			}

			// In one column the live update still follows B's form: B
			// renamed shows in B's figure's heading without a reload, and
			// B's form stays right under B's figure.
			if width < 900 {
				tb.do("marking the window", chromedp.Evaluate[chromedp.Void](`window.glMarker = 'still here'`))
				tb.do("renaming B", chromedp.Evaluate[chromedp.Void](`(() => { const s = document.getElementById('b-f-name'); s.value = 'Renamed in one column'; s.dispatchEvent(new Event('change', { bubbles: true })); })()`))
				tb.waitFor("B's figure renamed", `document.querySelector('[data-testid=figure-b] .gl-cmp-name').textContent === 'Renamed in one column'`)
				if eval[string](tb, `window.glMarker`) != "still here" {
					t.Error("editing B reloaded the page")
				}
				if d := eval[float64](tb, `document.querySelector('[data-testid=form-b]').getBoundingClientRect().top - document.querySelector('[data-testid=figure-b]').getBoundingClientRect().bottom`); d < 0 || d > 400 {
					t.Errorf("after the update B's form starts %.0f px below B's figure, want 0 to 400", d)
				}
			}

			// "Edit B" beside B's figure brings B's form into view (at 390 px A's
			// form comes first, one column).
			tb.do("following Edit B", chromedp.Click(chromedp.CSS(`[data-testid=edit-b]`)))
			tb.waitFor("B's form in view", `(() => { const r = document.getElementById('h-edit-b').getBoundingClientRect(); return r.top >= 0 && r.bottom <= innerHeight; })()`)

			// The Open button on B's side.
			tb.do("choosing the port plan for B", chromedp.SetUploadFiles(chromedp.CSS("#f-b-file"), []string{portFile}))
			tb.do("pressing Open as B", chromedp.Click(chromedp.CSS(`[data-testid=open-b]`)))
			tb.waitAcross("B is the port plan", `document.readyState === 'complete' && location.pathname === '/compare' && (`+names+`) === 'Hillcrest campus 40 MHz | Saltmarsh port 100 MHz'`)

			// A file dropped on B's side.
			drop(tb, "stadium.yaml", string(stadium))
			tb.waitAcross("B is the stadium plan", `document.readyState === 'complete' && (`+names+`).startsWith('Hillcrest campus 40 MHz | ') && !(`+names+`).includes('Saltmarsh')`)
			if got := eval[string](tb, names); !strings.Contains(got, "Hillcrest") || strings.Contains(got, "Saltmarsh") {
				t.Errorf("after the drop the sides are %q", got)
			}

			// A file B cannot open: the reason beside B's control, in view.
			drop(tb, "broken.yaml", "carrier: [\n")
			tb.waitFor("the reason beside B's file control", `document.getElementById('n-f-b-file').textContent.includes('broken.yaml')`)
			tb.waitFor("the reason in view", `(() => { const r = document.getElementById('n-f-b-file').getBoundingClientRect(); return r.top >= 0 && r.bottom <= innerHeight + 1; })()`)
		})
	}
}
