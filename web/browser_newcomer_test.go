package web

import (
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// The browser tests of issue 19: what a first afternoon with the page ran
// into, each at the widths the issue names.

// TestBrowserFormBesideFigure: at 1024 × 768 the editor no longer drops under
// the results, so the figure and the form are both in view while editing;
// at 800 px (under the 56 rem breakpoint) the page is one column again,
// figure first.
func TestBrowserFormBesideFigure(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	for _, c := range []struct {
		width, height int
		beside        bool
	}{{1024, 768, true}, {900, 700, true}, {800, 700, false}} {
		t.Run(fmt.Sprintf("%dx%d", c.width, c.height), func(t *testing.T) {
			tb := newTab(t, c.width, c.height)
			tb.open(srv.URL + "/?" + campusQuery(t))
			// Each box as [left, top, right, bottom] in the viewport.
			box := func(sel string) []float64 {
				return eval[[]float64](tb, `(() => { const r = document.querySelector('`+sel+`').getBoundingClientRect(); return [r.left, r.top, r.right, r.bottom]; })()`)
			}
			fig, name := box("#gl-figure svg"), box("#f-name")
			inView := func(b []float64) bool {
				return b[0] >= 0 && b[2] <= float64(c.width) && b[1] < float64(c.height) && b[3] > 0
			}
			if c.beside {
				if !inView(fig) || !inView(name) {
					t.Errorf("figure at %v and the plan name field at %v: want both in the %d×%d viewport", fig, name, c.width, c.height)
				}
				if name[2] > fig[0] {
					t.Errorf("the form (right edge %.0f) is not beside the figure (left edge %.0f)", name[2], fig[0])
				}
				if w := fig[2] - fig[0]; w < 0.45*float64(c.width) {
					t.Errorf("the figure is %.0f px wide in a %d px window, want at least 45 %%", w, c.width)
				}
			} else if fig[3] > name[1] {
				t.Errorf("one column: the figure (bottom %.0f) should come before the form (top %.0f)", fig[3], name[1])
			}
			if sw := eval[float64](tb, `document.documentElement.scrollWidth`); sw > float64(c.width) {
				t.Errorf("the page is %.0f px wide in a %d px window", sw, c.width)
			}
			tb.checkConsole()
		})
	}
}

// TestBrowserNotesSpanTheBox: a message under a narrow field (Start CRB,
// DL slots) takes the whole width of its box and reads in a few lines, at
// 390 px and at 1440 px, without widening the page; the fields of its row
// stay on their row.
func TestBrowserNotesSpanTheBox(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	v := mustQuery(t, campusQuery(t))
	v.Set("p1.start", "2x6")
	v.Set("tdd.dl", "3q")
	q := v.Encode()
	for _, width := range []int{390, 1440} {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.open(srv.URL + "/?" + q)
			tb.do("opening the TDD section", chromedp.Evaluate[chromedp.Void](`document.getElementById('f-tdd-dl').closest('details').open = true`))
			for _, id := range []string{"f-p1-start", "f-tdd-dl"} {
				// The notes' width against their grid's, and their lines.
				got := eval[[]float64](tb, `(() => {
					const n = document.getElementById('n-`+id+`'), g = n.parentElement;
					const f = document.getElementById('`+id+`').closest('.gl-field');
					const nr = n.getBoundingClientRect(), gr = g.getBoundingClientRect(), fr = f.getBoundingClientRect();
					const p = n.querySelector('.gl-note');
					const lh = parseFloat(getComputedStyle(p).lineHeight);
					return [nr.width, gr.width, nr.top, fr.bottom, p.getBoundingClientRect().height / lh];
				})()`)
				nw, gw, top, fieldBottom, lines := got[0], got[1], got[2], got[3], got[4]
				if nw < gw-1 {
					t.Errorf("%s: the notes are %.0f px wide in a box of %.0f px, want the whole box", id, nw, gw)
				}
				if top < fieldBottom-1 {
					t.Errorf("%s: the notes start at %.0f, above the bottom of their field (%.0f)", id, top, fieldBottom)
				}
				if lines > 6 {
					t.Errorf("%s: the note takes %.1f lines at %d px, want at most 6", id, lines, width)
				}
			}
			// Start CRB's row-mates stay beside it.
			if !eval[bool](tb, `(() => {
				const a = document.getElementById('f-p1-start').getBoundingClientRect(), b = document.getElementById('f-p1-size').getBoundingClientRect();
				return Math.abs(a.top - b.top) < 1;
			})()`) {
				t.Error("Size (PRB) left the row of Start CRB when its note appeared")
			}
			if sw := eval[float64](tb, `document.documentElement.scrollWidth`); sw > float64(width) {
				t.Errorf("the page is %.0f px wide in a %d px window", sw, width)
			}
		})
	}
}

// TestBrowserFailedOpenInView: a file the Open button cannot open answers
// with the page again; the reason beside the file control is in view, at a
// phone's width (where the editor follows the results) and at 1024 px.
func TestBrowserFailedOpenInView(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	bad := filepath.Join(t.TempDir(), "plan.yaml")
	if err := os.WriteFile(bad, []byte("carrier: [\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, size := range [][2]int{{390, 800}, {1024, 768}} {
		t.Run(fmt.Sprintf("%dx%d", size[0], size[1]), func(t *testing.T) {
			tb := newTab(t, size[0], size[1])
			tb.open(srv.URL + "/?" + campusQuery(t))
			tb.do("choosing the file", chromedp.SetUploadFiles(chromedp.CSS("#f-file"), []string{bad}))
			tb.do("pressing Open", chromedp.Click(chromedp.CSS(`[data-testid=open]`)))
			tb.waitAcross("the reason beside the file control", `document.readyState === 'complete' && location.pathname === '/open' && document.getElementById('n-f-file') && document.getElementById('n-f-file').textContent.trim() !== ''`)
			tb.waitFor("the reason in view", `(() => { const r = document.getElementById('n-f-file').getBoundingClientRect(); return r.top >= 0 && r.bottom <= innerHeight + 1; })()`) // scrolling aligns to a fractional pixel
			if got := eval[string](tb, `document.activeElement && document.activeElement.id`); got != "f-file" {
				t.Errorf("focus on %q after the refused file, want the file control", got)
			}
		})
	}
}

// TestBrowserFindingsNameThePartition: a finding about a partition's field
// reads with the partition's box title and the field's label on the page,
// in the list and beside the field, while the API keeps the plan path.
func TestBrowserFindingsNameThePartition(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	v := mustQuery(t, campusQuery(t))
	v.Set("p2.name", "video") // grid: "partitions[2].name "video" is already the name of partitions[1]"
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/?" + v.Encode())
	tb.waitFor("the findings", `document.querySelectorAll('[data-testid=findings] .gl-text').length > 0`)
	texts := eval[string](tb, `[...document.querySelectorAll('[data-testid=findings] .gl-text, [data-testid=findings] .gl-goto, .gl-note')].map(e => e.textContent).join('\n')`)
	if strings.Contains(texts, "partitions[") {
		t.Errorf("the page shows plan paths:\n%s", texts)
	}
	if want := `Name of 3 · video "video" is already the name of 2 · video`; !strings.Contains(texts, want) {
		t.Errorf("no finding reads %q:\n%s", want, texts)
	}
}

// TestBrowserBandwidthsSaySo: with a 15 kHz partition the bandwidth list
// still offers 60–100 MHz, saying which spacing lacks them, and choosing one
// gives the finding; the SS/PBCH spacing is a list like a partition's; the
// partition's layers are named MIMO layers, apart from the figure's layers.
func TestBrowserBandwidthsSaySo(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1024, 768)
	tb.open(srv.URL + "/?" + campusQuery(t))
	opts := eval[[]string](tb, `[...document.getElementById('f-bw').options].map(o => o.textContent)`)
	if !slices.Contains(opts, "100 (not at 15 kHz)") || !slices.Contains(opts, "40") {
		t.Fatalf("the bandwidths offered with a 15 kHz partition: %q, want 100 offered and marked", opts)
	}
	tb.do("choosing 100 MHz", chromedp.SetValue(chromedp.ID("f-bw"), "100"),
		chromedp.Evaluate[chromedp.Void](`document.getElementById('f-bw').dispatchEvent(new Event('change', {bubbles: true}))`))
	tb.waitFor("the finding beside the bandwidth", `document.getElementById('n-f-bw').textContent.includes('not defined for 15 kHz')`)
	if got := eval[string](tb, `document.getElementById('f-ssb-scs').tagName`); got != "SELECT" {
		t.Errorf("the SS/PBCH SCS control is a %s, want a list", got)
	}
	if got := eval[[]string](tb, `[...document.getElementById('f-ssb-scs').options].map(o => o.value)`); !slices.Equal(got, []string{"15", "30"}) {
		t.Errorf("SS/PBCH spacings offered in FR1: %q, want 15 and 30", got)
	}
	if got := eval[string](tb, `document.querySelector('label[for=f-p0-layers]').textContent`); got != "MIMO layers" {
		t.Errorf("the partition's layers are labelled %q", got)
	}
}

// TestBrowserHoldsGeometryWhileFixing: a typo in a partition's start keeps
// the figure of the last plan that parsed (point A and the other partitions
// do not move), marked as held, until the value parses; an invalid TDD
// value makes its section say "invalid", not "not in the plan".
func TestBrowserHoldsGeometryWhileFixing(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/?" + campusQuery(t))
	tb.do("marking the figure", chromedp.Evaluate[chromedp.Void](`window.glFigureBefore = document.querySelector('#gl-figure svg').outerHTML`))
	typeInto := func(id, text string) {
		tb.do("typing "+text+" into "+id, chromedp.Focus(chromedp.ID(id)),
			chromedp.Evaluate[chromedp.Void](`document.getElementById('`+id+`').select()`), chromedp.KeyEvent(text))
	}
	typeInto("f-p1-start", "2x")
	tb.waitFor("the message beside Start CRB", `document.getElementById('n-f-p1-start').textContent.includes('not a whole number')`)
	tb.waitFor("the figure marked as held", `document.querySelector('.gl-figure-box').classList.contains('gl-held')`)
	if !eval[bool](tb, `document.querySelector('#gl-figure svg').outerHTML === window.glFigureBefore`) {
		t.Error("the figure changed while Start CRB did not parse")
	}
	typeInto("f-p1-start", "30")
	tb.waitFor("the figure follows the fixed value", `!document.querySelector('.gl-figure-box').classList.contains('gl-held') && document.querySelector('#gl-figure svg').outerHTML !== window.glFigureBefore`)

	typeInto("f-tdd-dl", "3q")
	tb.waitFor("the TDD section says invalid", `document.getElementById('s-g-tdd').textContent.includes('invalid')`)
	tb.checkConsole()
}

// TestBrowserBackAfterTypingAndButton: a value typed and, before the pause
// that records it, a button (Add partition): Back returns to the typed
// value, not to the state before it.
func TestBrowserBackAfterTypingAndButton(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1440, 1000)
	tb.open(srv.URL + "/?" + campusQuery(t))
	tb.do("typing a size and adding a partition at once", chromedp.Focus(chromedp.ID("f-p1-size")),
		chromedp.Evaluate[chromedp.Void](`document.getElementById('f-p1-size').select()`), chromedp.KeyEvent("40"),
		chromedp.Evaluate[chromedp.Void](`document.getElementById('b-add').click()`))
	tb.waitFor("a fourth partition", `document.getElementById('f-p3-name') !== null && location.search.includes('p3.')`)
	tb.do("going back", chromedp.Evaluate[chromedp.Void](`history.back()`))
	tb.waitFor("the typed size, three partitions", `document.getElementById('f-p3-name') === null && document.getElementById('f-p1-size').value === '40'`)
	if !eval[bool](tb, `location.search.includes('p1.size=40')`) {
		t.Errorf("one step back the address is %s, want the typed size", eval[string](tb, `location.search`))
	}
	tb.checkConsole()
}

// TestBrowserAccessibleLayout: the page has one level-one heading, the
// upload label is read whole at every width, and the timing table fits at
// 1440 px without a horizontal scroll.
func TestBrowserAccessibleLayout(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	for _, width := range []int{390, 1024, 1440} {
		t.Run(fmt.Sprint(width), func(t *testing.T) {
			tb := newTab(t, width, 900)
			tb.open(srv.URL + "/?" + campusQuery(t))
			if n := eval[int](tb, `document.querySelectorAll('h1').length`); n != 1 {
				t.Errorf("%d level-one headings, want 1", n)
			}
			if cut := eval[bool](tb, `(() => {
				const l = document.querySelector('#gl-upload > label'), box = document.getElementById('gl-upload');
				return l.getBoundingClientRect().right > box.getBoundingClientRect().right || (l.clientWidth > 0 && l.scrollWidth > l.clientWidth + 1);
			})()`); cut {
				t.Error("the upload label is cut")
			}
			if width == 1440 {
				if cut := eval[bool](tb, `(() => { const s = document.querySelector('[data-testid=timing-table]').parentElement; return s.scrollWidth > s.clientWidth + 1; })()`); cut {
					t.Error("the timing table scrolls sideways at 1440 px")
				}
			}
		})
	}
}
