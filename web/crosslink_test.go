package web

import (
	"net/http"
	"strings"
	"testing"

	"gridloom/web/planform"
)

// campusCompare is the campus demo against itself, with extra keys.
func campusCompare(t *testing.T, extra string) string {
	f := planform.FormOf(demoPlans(t)["campus.yaml"])
	return planform.JoinQuery(planform.CompareQuery(f, f, planform.FigureForm{}), extra)
}

// TestCompareCrossLink: the comparison puts both TDD patterns on absolute
// time. The campus pattern against itself is aligned; one slot (1 ms) later
// A's downlink meets B's uplink on [0, 1000) µs and A's uplink B's downlink
// on 15 kHz symbols 54–65, 3857.292 to 4714.583 µs (3 ms + 10 symbols of
// 71.354 µs and 2 of 71.875, TS 38.211 5.3.1): 1857.292 µs per 5 ms,
// 3714.583 per 10 ms (worked in planform's TestCrossLinkOfTheComparison).
func TestCompareCrossLink(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))

	r := get(t, srv, "/compare?"+campusCompare(t, ""))
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "aligned", r.body, `data-testid="crosslink-empty"`, "0.000 µs of conflict per 10 ms",
		`name="b.frameOffsetUs" value=""`)
	if strings.Contains(r.body, "crosslink-marks") {
		t.Error("the aligned figures carry conflict marks")
	}

	r = get(t, srv, "/compare?"+campusCompare(t, "b.frameOffsetUs=1000"))
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "offset", r.body, "3714.583 µs of conflict per 10 ms", "(1857.292 µs per cycle)",
		`<th scope="row">A downlink, B uplink</th><td class="gl-num">0.000</td><td class="gl-num">1000.000</td>`,
		`<th scope="row">A uplink, B downlink</th><td class="gl-num">3857.292</td><td class="gl-num">4714.583</td><td class="gl-num">857.292</td>`,
		`data-testid="crosslink-strip"`, `name="b.frameOffsetUs" value="1000"`)
	if strings.Contains(r.body, `data-testid="crosslink-empty"`) {
		t.Error("the offset comparison says the patterns are aligned")
	}
	// Both figures mark them over their plot (x 92 to 968, y 48 to 508 for
	// the 5 ms span of 9 830 400 Tc, 175.2 px a millisecond), drawn by
	// render from the engine's list. On A's time the first conflict is
	// [0, 1) ms, x 92 to 267.2; the second [3857.292, 4714.583) µs is
	// [7 583 744, 9 269 248) Tc (3 ms = 5 898 240 Tc, then ten 15 kHz
	// symbols of 140 288 Tc and two of 141 312, TS 38.211 5.3.1), x
	// 92 + 876·7 583 744/9 830 400 = 767.8 to 918. On B's time, 1 ms
	// (1 966 080 Tc) earlier, the first wraps to [4, 5) ms, x 792.8 to 968,
	// and the second is [5 617 664, 7 303 168) Tc, x 592.6 to 742.8.
	wantContains(t, "marks", r.body, `data-testid="crosslink-marks"`,
		`data-start-tc="0 7583744" data-end-tc="1966080 9269248"`,
		`<path d="M92 48H267.2V508H92ZM767.8 48H918V508H767.8Z" class="gl-xl-mark" fill="#b02a20" fill-opacity="0.16"`,
		`data-start-tc="7864320 5617664" data-end-tc="9830400 7303168"`,
		`<path d="M792.8 48H968V508H792.8ZM592.6 48H742.8V508H592.6Z" class="gl-xl-mark" fill="#b02a20" fill-opacity="0.16"`)
	if n := strings.Count(r.body, `data-testid="crosslink-marks"`); n != 2 {
		t.Errorf("%d figures carry conflict marks, want 2", n)
	}
	// The swap turns the offset round: A's frame is 1 ms after B's.
	wantContains(t, "swap", r.body, "b.frameOffsetUs=-1000")

	r = get(t, srv, "/compare?"+campusCompare(t, "b.frameOffsetUs=30000"))
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "too far", r.body, `<p class="gl-note gl-error"><span class="gl-sev">Error</span> The frame offset (b.frameOffsetUs) must be a number of µs from −20000 to 20000; got &#34;30000&#34;.</p>`)
}
