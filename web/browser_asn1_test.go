package web

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/browser"
	cdpinput "github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"

	"gridloom/grid/rrc"
	"gridloom/web/planform"
)

// TestBrowserCopyASN clicks "Copy as TS 38.331": the page script puts the
// plan's value notation on the clipboard and says so.
func TestBrowserCopyASN(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	q := planform.FormOf(initialCampus(t)).Query()
	want, err := rrc.Encode(pagePlan(q))
	if err != nil {
		t.Fatal(err)
	}
	tb := newTab(t, 1280, 900)
	for _, name := range []string{"clipboard-read", "clipboard-write"} {
		if _, err := chromedp.CallBrowser(tb.ctx, browser.SetPermission, browser.SetPermissionParams{
			Permission: &browser.PermissionDescriptor{Name: name}, Setting: browser.PermissionSettingGranted, Origin: srv.URL,
		}); err != nil {
			t.Fatal(err)
		}
	}
	tb.open(srv.URL + "/?" + q)
	tb.do("clicking the copy link", chromedp.Click(chromedp.CSS(`[data-testid=copy-asn]`)))
	tb.waitFor("the copy is confirmed", `document.getElementById('gl-copied').textContent.startsWith('Copied the plan as TS 38.331')`)
	if got := eval[string](tb, `location.pathname + location.search`); got != "/?"+q {
		t.Errorf("the copy link was followed: the address is %s", got)
	}
	got, err := chromedp.Run(tb.ctx, chromedp.Evaluate[string](`navigator.clipboard.readText()`, chromedp.EvalAwaitPromise))
	if err != nil {
		t.Fatalf("reading the clipboard: %v", err)
	}
	if got != string(want) {
		t.Errorf("the clipboard holds %d bytes, not rrc.Encode's %d:\n%.300s", len(got), len(want), got)
	}
	tb.checkConsole()
}

// TestBrowserCopyASNRefused: for a plan with errors the copy link puts
// nothing on the clipboard and shows the server's sentence instead.
func TestBrowserCopyASNRefused(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1280, 900)
	tb.open(srv.URL + "/?" + planform.FormOf(brokenCampus(t)).Query())
	tb.do("clicking the copy link", chromedp.Click(chromedp.CSS(`[data-testid=copy-asn]`)))
	tb.waitFor("the refusal is shown", `document.getElementById('gl-copied').textContent.startsWith('The plan has errors, so it is not exported; the first: ')`)
	// The 422 is logged by the browser as a failed load; anything else on
	// the console is a failure.
	tb.flushConsole()
	tb.mu.Lock()
	defer tb.mu.Unlock()
	for _, m := range tb.console {
		if m.Type == chromedp.ConsoleError && strings.Contains(m.Text, "status of 422") {
			continue
		}
		if m.Type == chromedp.ConsoleError || m.IsException() || m.Type == chromedp.ConsoleWarning {
			t.Errorf("browser console %s: %s (%s:%d)", m.Type, m.Text, m.URL, m.Line)
		}
	}
}

// TestBrowserMIBPanel types a frame number into the MIB panel's control:
// the live update shows the bits TestMIBPanel checks by hand (SFN 682 of
// the campus plan with initial access: 550104 hex), and the address keeps
// the choice.
func TestBrowserMIBPanel(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	tb := newTab(t, 1280, 900)
	tb.open(srv.URL + "/?" + planform.FormOf(initialCampus(t)).Query())
	if got := eval[string](tb, `document.querySelector('[data-testid=mib-hex]').textContent`); got != "010104" {
		// SFN 0, block 0: as SFN 1 of TestMIBPanel with systemFrameNumber 0.
		t.Errorf("the MIB of frame 0 is %s, want 010104", got)
	}
	tb.do("opening the MIB controls", chromedp.Click(chromedp.CSS(`#g-mib summary`)))
	tb.do("typing a frame number", chromedp.Focus(chromedp.ID("f-mib-sfn")), chromedp.SendKeys(chromedp.ID("f-mib-sfn"), "682"))
	tb.waitFor("the bits of frame 682", `document.querySelector('[data-testid=mib-hex]').textContent === '550104' && document.querySelector('[data-testid=mib-binary]').textContent === '010101010000000100000100'`)
	tb.waitFor("the address keeps the frame", `new URLSearchParams(location.search).get('mib.sfn') === '682'`)
	tb.checkConsole()
}

// TestBrowserOpenASN drops a .asn file on the planner: the page opens its
// plan, draws it, and says beside the file control what was skipped; a
// malformed file is refused with its line and column.
func TestBrowserOpenASN(t *testing.T) {
	t.Parallel()
	srv, _ := newTestServer(t, testConfig(t))
	text, err := rrc.Encode(initialCampus(t))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	good, bad := filepath.Join(dir, "cell.asn"), filepath.Join(dir, "bad.asn")
	if err := os.WriteFile(good, append(text, skippedIE...), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(bad, []byte("mib MIB ::= {\n  subCarrierSpacingCommon scs30or120,\n  ssb-SubcarrierOffset\n}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	tb := newTab(t, 1280, 900)
	tb.open(srv.URL + "/?" + campusQuery(t))
	drop := func(file string) {
		data := &cdpinput.DragData{Files: []string{file}, DragOperationsMask: 1}
		for _, typ := range []cdpinput.DispatchDragEventType{cdpinput.DispatchDragEventTypeDragEnter, cdpinput.DispatchDragEventTypeDragOver, cdpinput.DispatchDragEventTypeDrop} {
			if _, err := chromedp.Call(tb.ctx, cdpinput.DispatchDragEvent, cdpinput.DispatchDragEventParams{Type: typ, X: 700, Y: 400, Data: data}); err != nil {
				t.Fatalf("%s %s: %v", typ, file, err)
			}
		}
	}
	drop(bad)
	tb.waitFor("the reason beside the file control", `document.getElementById('n-f-file').textContent.includes('line 4, column')`)

	drop(good)
	tb.waitAcross("the opened plan", `document.getElementById('f-name') && document.getElementById('f-name').value === 'Hillcrest campus 40 MHz, initial access' && document.readyState === 'complete' && document.querySelector('#gl-plot') !== null`)
	notes := eval[string](tb, `document.getElementById('n-f-file').textContent`)
	if !strings.Contains(notes, "Skipped") || !strings.Contains(notes, "other-cell") {
		t.Errorf("beside the file control: %q, want the skipped value named", notes)
	}
	if got := eval[string](tb, `document.querySelector('[data-testid=status]').textContent`); !strings.Contains(got, "3 of 3 partitions placed") {
		t.Errorf("the opened plan's status reads %q, want its 3 partitions placed and drawn", got)
	}
}
