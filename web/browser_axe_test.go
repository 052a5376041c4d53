package web

import (
	"context"
	"encoding/json"
	"fmt"
	"os"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"gridloom/web/planform"
)

// TestBrowserAxe runs axe-core (https://github.com/dequelabs/axe-core, the
// checker issue 19 used) on the planner, the comparison, the walkthrough
// and the finders at the issue's widths, and fails on any violation. axe
// is not vendored: GRIDLOOM_AXE names its axe.min.js (npm install --prefix
// /tmp/axe axe-core@4 puts it at /tmp/axe/node_modules/axe-core/axe.min.js;
// .ci/run does). Without it the test skips, unless GRIDLOOM_REQUIRE_TOOLS=1.
//
// The script is evaluated through the DevTools protocol, which the pages'
// Content-Security-Policy does not govern; the pages are not changed.
// Every rule axe runs by default (WCAG 2.0–2.2 A and AA and its best
// practices) is on: none is disabled.
func TestBrowserAxe(t *testing.T) {
	path := os.Getenv("GRIDLOOM_AXE")
	if path == "" {
		if os.Getenv("GRIDLOOM_REQUIRE_TOOLS") == "1" {
			t.Fatal("GRIDLOOM_REQUIRE_TOOLS=1 but GRIDLOOM_AXE does not name axe.min.js (npm install --prefix /tmp/axe axe-core@4; GRIDLOOM_AXE=/tmp/axe/node_modules/axe-core/axe.min.js)")
		}
		t.Skip("GRIDLOOM_AXE does not name axe-core's axe.min.js; npm install --prefix /tmp/axe axe-core@4 and set GRIDLOOM_AXE=/tmp/axe/node_modules/axe-core/axe.min.js to run the accessibility check")
	}
	axe, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("GRIDLOOM_AXE=%s: %v", path, err)
	}
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	iq := planform.FormOf(initialCampusPlan(t)).Query()
	pages := []struct{ name, path string }{
		{"planner", "/?" + q},
		{"compare", "/compare"},
		{"walkthrough", "/walk?" + q + "&step=ssb"},
		{"walkthrough-projector", "/walk?" + q + "&view=projector&step=channel"},
		{"find-ssb", "/find/ssb?" + q},
		{"find-initial", "/find/initial?" + iq},
		{"find-prach", "/prach?" + iq},
	}
	for _, width := range issueWidths {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			t.Parallel()
			tb := newTab(t, width, 900)
			for _, p := range pages {
				tb.do("opening "+p.name, chromedp.Navigate(srv.URL+p.path))
				tb.waitFor(p.name+" loaded", `document.readyState === 'complete'`)
				tb.do("injecting axe-core", chromedp.Evaluate[chromedp.Void](string(axe)))
				out := eval[string](tb, `typeof axe`)
				if out != "object" {
					t.Fatalf("axe-core did not load on %s (typeof axe = %s)", p.name, out)
				}
				res := evalAwait[string](tb, `axe.run(document, {resultTypes: ['violations']}).then(r => JSON.stringify(r.violations.map(v => ({
					id: v.id, impact: v.impact, help: v.help,
					nodes: v.nodes.slice(0, 4).map(n => n.target.join(' ') + ': ' + (n.failureSummary || '').replace(/\s+/g, ' ').slice(0, 240))
				}))))`)
				var vs []struct {
					ID, Impact, Help string
					Nodes            []string
				}
				if err := json.Unmarshal([]byte(res), &vs); err != nil {
					t.Fatalf("%s: axe's answer %q: %v", p.name, res, err)
				}
				for _, v := range vs {
					t.Errorf("%s at %d px: axe %s (%s): %s\n\t%s", p.name, width, v.ID, v.Impact, v.Help, strings.Join(v.Nodes, "\n\t"))
				}
			}
		})
	}
}

// evalAwait evaluates expr, a promise, and returns what it resolves to.
func evalAwait[T any](tb *tab, expr string) T {
	tb.t.Helper()
	ctx, cancel := context.WithTimeout(tb.ctx, 60*time.Second)
	defer cancel()
	v, err := chromedp.Run(ctx, chromedp.Evaluate[T](expr, chromedp.EvalAwaitPromise))
	if err != nil {
		tb.t.Fatalf("evaluating %s: %v", expr, err)
	}
	return v
}
