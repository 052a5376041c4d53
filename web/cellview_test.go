package web

import (
	"html"
	"net/http"
	"strings"
	"testing"

	"gridloom/web/planform"
)

// TestCellCommonSpacing: the cell's MIB fields give subCarrierSpacingCommon
// as sent where it gives a spacing, and otherwise say what SIB1 uses
// instead, as the MIB panel does. TS 38.331 MIB field description
// (testdata/reference/rrc/ts38331-mib-fields.txt): "For operation with
// shared spectrum channel access in FR1 ... the subcarrier spacing for
// SIB1, Msg.2/4 and MsgB ... is same as that for the corresponding SSB.
// For operation with shared spectrum channel access, this field instead is
// used for deriving the QCL relation between SS/PBCH blocks"; n46 is
// operated so, n78 is not, and there 30 kHz is scs30or120 (FR1).
func TestCellCommonSpacing(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))

	r := get(t, srv, "/?"+planform.FormOf(initialCampus(t)).Query())
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "n78 cell", html.UnescapeString(between(r.body, `data-testid="cell-mib-facts"`, `</dl>`)), "subCarrierSpacingCommon", "scs30or120")

	p := initialCampus(t)
	centre := 5505.0
	p.Carrier.Band, p.Carrier.CenterMHz = "n46", &centre
	p.SSB.GSCN, p.SSB.OffsetToPointA = nil, 60
	r = get(t, srv, "/?"+planform.FormOf(p).Query())
	mib := html.UnescapeString(between(r.body, `data-testid="cell-mib-facts"`, `</dl>`))
	wantContains(t, "n46 cell", mib, "no spacing: with shared spectrum channel access (band n46), SIB1, Msg.2/4 and paging use the SS/PBCH block's spacing, 30 kHz", "QCL relation")
	if v := between(mib, "subCarrierSpacingCommon", "ssb-SubcarrierOffset"); v == "" || strings.Contains(v, "scs15or60") || strings.Contains(v, "scs30or120") {
		t.Errorf("n46: the cell gives subCarrierSpacingCommon a value:\n%s", mib)
	}
	wantContains(t, "n46 MIB panel", html.UnescapeString(between(r.body, `data-testid="mib"`, `</section>`)),
		"subCarrierSpacingCommon is scs15or60 here, for it gives no spacing: with shared spectrum channel access (band n46)")
}
