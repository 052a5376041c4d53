package web

import (
	"encoding/json"
	"net/http"
	"os"
	"regexp"
	"strings"
	"testing"

	"gridloom/grid/planfile"
	"gridloom/grid/report"
	"gridloom/web/planform"
)

// initialCampusFile is the campus plan with initial access (testdata/initial).
const initialCampusFile = "../testdata/initial/campus.yaml"

// TestAPISSB: POST /api/v1/ssb lists GSCN 8016 of the campus plan at
// SS_REF 3744.48 MHz: N = 8016 − 7499 = 517, 3000 MHz + 517 × 1.44 MHz
// (TS 38.101-1 Table 5.4.3.1-1, 3000–24250 MHz), in the CLI's shape.
func TestAPISSB(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	body, err := os.ReadFile(initialCampusFile)
	if err != nil {
		t.Fatal(err)
	}
	r := post(t, srv, "/api/v1/ssb", "application/yaml", body)
	wantStatus(t, r, http.StatusOK)
	var doc report.SSBPositions
	if err := json.Unmarshal([]byte(r.body), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Band != "n78" || doc.SCSKHz != 30 {
		t.Errorf("band %q at %d kHz, want n78 at 30 kHz", doc.Band, doc.SCSKHz)
	}
	found := false
	for _, q := range doc.Positions {
		if q.GSCN == 8016 {
			found = true
			if q.SSRefMHz != 3744.48 {
				t.Errorf("GSCN 8016 at SS_REF %v MHz, want 3744.48", q.SSRefMHz)
			}
		}
	}
	if !found {
		t.Errorf("GSCN 8016 is not among %d positions", len(doc.Positions))
	}
	r = post(t, srv, "/api/v1/ssb?band=n1", "application/yaml", body)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if !strings.Contains(r.body, "n1") {
		t.Errorf("a band without the channel: %s", r.body)
	}
}

// TestAPIInitial: POST /api/v1/initial lists the campus plan's own
// choice, controlResourceSetZero 2 and searchSpaceZero 0 at GSCN 8016,
// which checks clean, with pdcch-ConfigSIB1 = 2·16 + 0 = 32 (TS 38.213 13).
func TestAPIInitial(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	body, err := os.ReadFile(initialCampusFile)
	if err != nil {
		t.Fatal(err)
	}
	r := post(t, srv, "/api/v1/initial", "application/yaml", body)
	wantStatus(t, r, http.StatusOK)
	var doc report.InitialOptions
	if err := json.Unmarshal([]byte(r.body), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Table != "13-4" || len(doc.Options) == 0 {
		t.Fatalf("table %q, %d options; want 13-4 and some", doc.Table, len(doc.Options))
	}
	found := false
	for _, o := range doc.Options {
		if o.GSCN == 8016 && o.ControlResourceSetZero == 2 && o.SearchSpaceZero == 0 {
			found = o.PDCCHConfigSIB1 == 32
		}
	}
	if !found {
		t.Errorf("GSCN 8016 with rows 2 and 0 (pdcch-ConfigSIB1 32) is not among %d options", len(doc.Options))
	}
}

var badRE = regexp.MustCompile(`class="gl-finding gl-(error|warning)" data-code="(ssb|initial-access)"`)

var applyRE = regexp.MustCompile(`href="(/\?[^"]*)"[^>]*data-testid="find-apply"`)

// TestFindPagesApply: each finder's page lists rows whose links open the
// planner with the row applied, and the planner then shows those values in
// its cell section, without any script.
func TestFindPagesApply(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	data, err := os.ReadFile(initialCampusFile)
	if err != nil {
		t.Fatal(err)
	}
	plan, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	q := planform.FormOf(plan).Query()
	for _, tc := range []struct{ path, want string }{
		{"/find/ssb?", "GSCN"},
		{"/find/initial?", "controlResourceSetZero"},
	} {
		r := get(t, srv, tc.path+q)
		wantStatus(t, r, http.StatusOK)
		m := applyRE.FindAllStringSubmatch(r.body, -1)
		if len(m) == 0 || len(m) > maxFindRows {
			t.Fatalf("%s: %d apply links, want 1 to %d", tc.path, len(m), maxFindRows)
		}
		link := strings.ReplaceAll(m[0][1], "&amp;", "&")
		page := get(t, srv, link)
		wantStatus(t, page, http.StatusOK)
		if !strings.Contains(page.body, `data-testid="cell"`) {
			t.Errorf("%s: the applied plan's page has no cell section", tc.path)
		}
		if badRE.MatchString(page.body) {
			t.Errorf("%s: the applied row %s brings a finding", tc.path, link)
		}
	}
	// The check above can fail: a GSCN the offsets do not reach is a finding.
	off := get(t, srv, "/?"+strings.Replace(q, "ssb.gscn=8016", "ssb.gscn=8030&ssb.off=56&ssb.k=16", 1))
	if !badRE.MatchString(off.body) {
		t.Error("GSCN 8030 with the offsets of 8016 shows no ssb finding; the apply check cannot see one")
	}
	// A plan with no carrier frequency cannot be searched; the page says why.
	r := get(t, srv, "/find/ssb?bw=40&p0.name=a&p0.scs=30&p0.size=10")
	wantStatus(t, r, http.StatusOK)
	if !strings.Contains(r.body, `data-testid="find-why"`) || !strings.Contains(r.body, "carrier frequency") {
		t.Errorf("a plan without frequency: no reason shown:\n%.400s", r.body)
	}
}
