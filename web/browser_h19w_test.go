package web

import (
	"fmt"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// Browser tests of issue 19's second half: a new plan, the overlap drawn
// and cleared, the readout beside the pointer, the SS/PBCH labels apart
// from the names, compare's B side opened from a file, and axe-core.

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
