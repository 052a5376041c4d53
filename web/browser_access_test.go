package web

import (
	"fmt"
	"os"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// TestBrowserCellAndFinders: the campus plan with initial access has the cell
// section (pdcch-ConfigSIB1 = 2·16 + 0 = 00100000, TS 38.213 13); each
// finder opens from it, and one click on a row's link brings the planner
// back with the row applied to the form and the section.
func TestBrowserCellAndFinders(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/?" + planform.FormOf(initialCampusPlan(t)).Query())
	tb.waitFor("the cell section", `(document.querySelector('[data-testid=cell-mib-facts]') || {}).textContent.includes('00100000')`)
	if got := eval[string](tb, `document.querySelector('[data-testid=cell-block-facts]').textContent`); !contains(got, "8016") {
		t.Errorf("the cell section's block facts %q do not name GSCN 8016", got)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=spec]').textContent`); !contains(got, "3GPP Release 17") {
		t.Errorf("the footer says %q, want the release followed", got)
	}

	tb.follow("opening the SS/PBCH finder", `[data-testid=find-ssb]`)
	tb.waitFor("the GSCN rows", `document.readyState === 'complete' && document.querySelectorAll('[data-testid=find-table] tbody tr').length > 1`)
	gscn := eval[string](tb, `document.querySelector('[data-testid=find-table] tbody tr:nth-child(2) td').textContent`)
	tb.follow("applying the second GSCN", `[data-testid=find-table] tbody tr:nth-child(2) [data-testid=find-apply]`)
	tb.waitFor("the planner with the GSCN", `location.pathname === '/' && document.readyState === 'complete' && (document.getElementById('f-ssb-gscn') || {}).value === '`+gscn+`'`)
	if got := eval[string](tb, `document.querySelector('[data-testid=cell-block-facts]').textContent`); !contains(got, gscn) {
		t.Errorf("after applying GSCN %s the block facts say %q", gscn, got)
	}

	tb.follow("opening the initial-access finder", `[data-testid=find-initial]`)
	tb.waitFor("the ranked rows", `document.readyState === 'complete' && document.querySelectorAll('[data-testid=find-table] tbody tr').length > 0`)
	cells := eval[[]string](tb, `[...document.querySelectorAll('[data-testid=find-table] tbody tr:first-child td')].map(td => td.textContent)`)
	if len(cells) < 6 {
		t.Fatalf("the first row has %d cells", len(cells))
	}
	tb.follow("applying the first row", `[data-testid=find-table] tbody tr:first-child [data-testid=find-apply]`)
	tb.waitFor("the planner with the row", `location.pathname === '/' && document.readyState === 'complete' && document.getElementById('f-ia-coreset') !== null`)
	got := eval[[]string](tb, `[document.getElementById('f-ssb-gscn').value, document.getElementById('f-ia-coreset').value, document.getElementById('f-ia-ss0').value]`)
	if got[0] != cells[0] || got[1] != cells[3] || got[2] != cells[4] {
		t.Errorf("after applying row %v the form holds GSCN %s, controlResourceSetZero %s, searchSpaceZero %s", cells[:5], got[0], got[1], got[2])
	}
	if pdcch := eval[string](tb, `document.querySelector('[data-testid=cell-mib-facts]').textContent`); !contains(pdcch, cells[5]) {
		t.Errorf("the MIB facts %q lack the row's pdcch-ConfigSIB1 %s", pdcch, cells[5])
	}
	tb.checkConsole()
}

// follow opens the link a selector finds, as a click on it would, and
// waits for the new page to load (a click's navigation would end the
// polling's JavaScript context midway).
func (tb *tab) follow(what, sel string) {
	tb.t.Helper()
	href := eval[string](tb, "document.querySelector(`"+sel+"`).href")
	tb.do(what, chromedp.Navigate(href))
}

func contains(s, sub string) bool { return sub != "" && strings.Contains(s, sub) }

// TestBrowserReadoutCell: on the campus plan with initial access the readout names GSCN 8016
// when the pointer is on the raster strip at the block's SS_REF, and the
// CORESET#0 occasion of SSB 0 in slot 0 (TS 38.213 Table 13-11 row 0:
// slots n0 = i and n0 + 1) when it is on CORESET#0 there.
func TestBrowserReadoutCell(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	plan := initialCampusPlan(t)
	res := grid.Compute(plan)
	tb := newTab(t, 2400, 1500)
	tb.open(srv.URL + "/?" + planform.FormOf(plan).Query())
	tb.do("showing the figure", chromedp.Evaluate[chromedp.Void](`document.addEventListener('pointermove', e => { window.glPointer = [e.clientX, e.clientY]; }, true);
		document.getElementById('gl-figure').scrollIntoView({block: 'center'})`))
	xy := eval[[]float64](tb, fmt.Sprintf(`(() => {
		const g = document.getElementById('gl-plot'), d = g.dataset;
		const uy = +d.y + +d.h - (%d - +d.lowHz) / (+d.highHz - +d.lowHz) * +d.h;
		const p = new DOMPoint(+d.x - 6, uy).matrixTransform(g.getScreenCTM());
		return [p.x, p.y];
	})()`, res.SSB.SSRef))
	tb.do("pointing at the raster", chromedp.MouseEvent(chromedp.MouseMoved, xy[0]+2, xy[1]), chromedp.MouseEvent(chromedp.MouseMoved, xy[0], xy[1]))
	tb.waitFor("the readout names the GSCN", `document.getElementById('gl-readout').dataset.gscn === '8016'`)
	if got := eval[string](tb, `document.getElementById('gl-readout').textContent`); !strings.Contains(got, "band n78") || !strings.Contains(got, "block is here") {
		t.Errorf("raster readout %q", got)
	}
	c := res.InitialAccess.CORESET0
	o := res.InitialAccess.Occasions[0]
	tb.pointAt((o.Start+o.End)/2, (c.Low+c.High)/2)
	tb.waitFor("the readout names the occasion", `document.getElementById('gl-readout').textContent.includes('CORESET#0 occasion for SSB 0')`)
	tb.checkConsole()
}

// initialCampusPlan is the campus plan with initial access.
func initialCampusPlan(t *testing.T) grid.Plan {
	t.Helper()
	data, err := os.ReadFile(initialCampusFile)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	return p
}
