package web

import (
	"fmt"
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
