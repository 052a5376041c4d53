package web

import (
	"encoding/json"
	"net/http"
	"net/url"
	"os"
	"reflect"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
	"gridloom/web/planform"
)

// initialCampus is the campus plan with initial access
// (testdata/initial/campus.yaml): the plan whose MIB the tests check by
// hand, since without initialAccess pdcch-ConfigSIB1 would be 0.
func initialCampus(t *testing.T) grid.Plan {
	t.Helper()
	b, err := os.ReadFile("../testdata/initial/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.DecodeYAML(b)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// pagePlan is the plan a page of query q computes, which its downloads
// write.
func pagePlan(q string) grid.Plan { return planform.ReadPlan(q).Plan }

func TestPlanASN(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := planform.FormOf(initialCampus(t)).Query()
	want, err := rrc.Encode(pagePlan(q))
	if err != nil {
		t.Fatal(err)
	}

	r := get(t, srv, "/plan.asn?"+q+"&download=1")
	wantStatus(t, r, http.StatusOK)
	if ct := r.Header.Get("Content-Type"); ct != "text/plain; charset=utf-8" {
		t.Errorf("Content-Type %q, want text/plain; charset=utf-8", ct)
	}
	if cd := r.Header.Get("Content-Disposition"); cd != `attachment; filename=hillcrest-campus-40-mhz-initial-access.asn` {
		t.Errorf("Content-Disposition %q, want the plan's name with .asn", cd)
	}
	if r.body != string(want) {
		t.Errorf("the download differs from rrc.Encode of the page's plan")
	}
	// Opened again, the text is the page's plan: the link it came from.
	back, _, err := planfile.DecodeValueNotation([]byte(r.body))
	if err != nil {
		t.Fatalf("the download does not read back: %v", err)
	}
	if got := planform.FormOf(back).Query(); got != q {
		t.Errorf("the download read back is another plan:\n got %s\nwant %s", got, q)
	}

	// The copy link's address: the same text, shown rather than saved.
	r = get(t, srv, "/plan.asn?"+q)
	wantStatus(t, r, http.StatusOK)
	if r.Header.Get("Content-Disposition") != "" || r.body != string(want) {
		t.Errorf("without download=1: Content-Disposition %q and a body of %d bytes, want none and the text", r.Header.Get("Content-Disposition"), len(r.body))
	}
}

// brokenCampus is the campus plan with a partition far outside the
// carrier: an error finding, so no export.
func brokenCampus(t *testing.T) grid.Plan {
	p := initialCampus(t)
	p.Partitions[0].SizePRB = 400
	if !grid.Compute(p).HasErrors() {
		t.Fatal("the broken plan has no error finding")
	}
	return p
}

func TestPlanASNRefusesAPlanWithErrors(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	r := get(t, srv, "/plan.asn?"+planform.FormOf(brokenCampus(t)).Query()+"&download=1")
	wantStatus(t, r, http.StatusUnprocessableEntity)
	wantContains(t, "refusal", r.body, "The plan has errors, so it is not exported; the first: ")
	if r.Header.Get("Content-Disposition") != "" {
		t.Error("a refusal is sent as a file")
	}
	// A value that does not parse is refused as by the other downloads.
	v := mustQuery(t, campusQuery(t))
	v.Set("p0.size", "ten")
	r = get(t, srv, "/plan.asn?"+v.Encode())
	wantStatus(t, r, http.StatusUnprocessableEntity)
}

func TestAPIASN1(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	p := initialCampus(t)
	want, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	body, _ := planfile.EncodeJSON(p)
	r := post(t, srv, "/api/v1/asn1", "application/json", body)
	wantStatus(t, r, http.StatusOK)
	if r.body != string(want) || r.Header.Get("Content-Type") != "text/plain; charset=utf-8" {
		t.Errorf("POST /api/v1/asn1: %q and %d bytes, want text/plain and rrc.Encode's text", r.Header.Get("Content-Type"), len(r.body))
	}

	body, _ = planfile.EncodeJSON(brokenCampus(t))
	r = post(t, srv, "/api/v1/asn1", "application/json", body)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	var e apiError
	if err := json.Unmarshal([]byte(r.body), &e); err != nil || !strings.HasPrefix(e.Error, "The plan has errors") {
		t.Errorf("refusal: %v, %+v", err, e)
	}

	// render reads value notation under text/x-asn1: the same document as
	// from the JSON plan file, with the import notes (none here) first.
	r = post(t, srv, "/api/v1/render", "text/x-asn1", want)
	wantStatus(t, r, http.StatusOK)
	fromJSON, _ := planfile.EncodeJSON(p)
	noNotes := "{\n  \"import\": {\n    \"skipped\": [],\n    \"assumed\": []\n  },\n"
	if j := post(t, srv, "/api/v1/render", "application/json", fromJSON); noNotes+j.body[2:] != r.body {
		t.Error("the document of the value notation differs from the document of the JSON plan file")
	}
	// Malformed text is refused with its line and column.
	r = post(t, srv, "/api/v1/render", "text/x-asn1", []byte("mib MIB ::= {\n  subCarrierSpacingCommon scs30or120,\n  ssb-SubcarrierOffset 99\n}\n"))
	wantStatus(t, r, http.StatusBadRequest)
	wantContains(t, "malformed value notation", r.body, "line 3, column")
}

// TestAPIImportNotes: every API answer to a value notation body carries
// what reading it skipped and assumed — the notes Open shows — as
// "import": {"skipped": [...], "assumed": [...]} first in its JSON, and
// /api/v1/asn1, whose answer is text, as leading comment lines; an answer
// to a plan file has none.
func TestAPIImportNotes(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	text, err := rrc.Encode(initialCampus(t))
	if err != nil {
		t.Fatal(err)
	}
	// A second band in FrequencyInfoDL's list: the reader takes the first
	// and says so; the PCI-Range value is skipped.
	two := strings.Replace(string(text), "        78\n", "        78,\n        77\n", 1)
	body := []byte(two + skippedIE)
	d, err := rrc.Decode(body)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Skipped) == 0 || len(d.Assumed) == 0 {
		t.Fatalf("the test text should leave both kinds of note: %v %v", d.Skipped, d.Assumed)
	}
	type withImport struct {
		Import *struct {
			Skipped []string `json:"skipped"`
			Assumed []string `json:"assumed"`
		} `json:"import"`
	}
	for _, route := range []string{"/api/v1/render", "/api/v1/ssb", "/api/v1/initial"} {
		r := post(t, srv, route, "text/x-asn1", body)
		if !strings.HasPrefix(r.body, "{\n  \"import\": {") {
			t.Errorf("%s: the answer does not start with the import notes:\n%.200s", route, r.body)
		}
		var got withImport
		if err := json.Unmarshal([]byte(r.body), &got); err != nil || got.Import == nil {
			t.Fatalf("%s (%s): %v\n%.300s", route, r.Status, err, r.body)
		}
		if !slices.Equal(got.Import.Skipped, d.Skipped) || !slices.Equal(got.Import.Assumed, d.Assumed) {
			t.Errorf("%s: import %+v, want skipped %v and assumed %v", route, *got.Import, d.Skipped, d.Assumed)
		}
		if !strings.Contains(strings.Join(got.Import.Skipped, " "), "other-cell") || !strings.Contains(strings.Join(got.Import.Assumed, " "), "takes the first, n78") {
			t.Errorf("%s: the notes do not name the skipped value and the band taken: %+v", route, *got.Import)
		}
		// A plan file leaves no notes and gets no "import".
		fromJSON, _ := planfile.EncodeJSON(d.Plan)
		if j := post(t, srv, route, "application/json", fromJSON); strings.Contains(j.body, `"import"`) {
			t.Errorf("%s: a JSON plan file's answer has import notes", route)
		}
	}
	r := post(t, srv, "/api/v1/asn1", "text/x-asn1", body)
	wantStatus(t, r, http.StatusOK)
	for _, n := range d.Skipped {
		wantContains(t, "asn1 answer", r.body, "-- import skipped: "+n+"\n")
	}
	for _, n := range d.Assumed {
		wantContains(t, "asn1 answer", r.body, "-- import assumed: "+n+"\n")
	}
	if back, err := rrc.Decode([]byte(r.body)); err != nil || !reflect.DeepEqual(back.Plan, d.Plan) {
		t.Errorf("the asn1 answer with its note lines does not read back to the plan: %v", err)
	}
}

// skippedIE is a value of a type gridloom does not read, which Open skips
// with a note.
const skippedIE = "\nother-cell PCI-Range ::= {\n  start 17,\n  range n4\n}\n"

func TestOpenValueNotation(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	p := initialCampus(t)
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	body, ctype := multipartBody(t, "plan", "cell.asn", append(text, skippedIE...))
	r := post(t, srv, "/open?"+campusQuery(t)+"&fig.theme=print", ctype, body)
	wantStatus(t, r, http.StatusSeeOther)
	loc, err := url.Parse(r.Header.Get("Location"))
	if err != nil {
		t.Fatal(err)
	}
	q := loc.Query()
	if got := planform.FormOf(pagePlan(loc.RawQuery)).Query(); got != planform.FormOf(p).Query() {
		t.Errorf("the opened plan differs from the file's:\n got %s\nwant %s", got, planform.FormOf(p).Query())
	}
	if q.Get("fig.theme") != "print" {
		t.Error("the figure options of the page it came from are lost")
	}
	notes := q[keyOpenNote]
	if len(notes) == 0 || !strings.Contains(notes[0], "Skipped") || !strings.Contains(notes[0], "other-cell") {
		t.Fatalf("the notes on the redirect %q do not name the skipped value", notes)
	}
	page := get(t, srv, loc.String())
	wantStatus(t, page, http.StatusOK)
	wantContains(t, "note beside the file control", noteText(t, page.body, "f-file"), "Skipped", "other-cell")
	// The page's own address drops the notes: they concern the file.
	if strings.Contains(between(page.body, `data-query="`, `"`), "open.note") {
		t.Error("the page's query carries the notes")
	}

	// Malformed text: the page it came from, with the line and column.
	body, ctype = multipartBody(t, "plan", "bad.asn", []byte("mib MIB ::= {\n  subCarrierSpacingCommon scs30or120,\n  ssb-SubcarrierOffset\n}\n"))
	r = post(t, srv, "/open?"+campusQuery(t), ctype, body)
	wantStatus(t, r, http.StatusBadRequest)
	wantContains(t, "note beside the file control", noteText(t, r.body, "f-file"), "bad.asn", "line 4, column")
}

// between returns the text of s after the first from and before the next to.
func between(s, from, to string) string {
	_, s, _ = strings.Cut(s, from)
	s, _, _ = strings.Cut(s, to)
	return s
}

// TestMIBPanel checks the panel's bits for the campus plan by hand. The
// plan sets subCarrierSpacingCommon scs30or120 (ssb.scsKHz 30, the default
// common spacing), k_SSB 16 (from ssb.gscn 8016, as Compute derives it),
// controlResourceSetZero 2, searchSpaceZero 0 and pos2; L_max is 8
// (TS 38.213 4.1, case C below 6 GHz).
//
// BCCH-BCH-Message in the field order of TS 38.331 6.2.2, unaligned PER
// (X.691): the CHOICE bit 0 for mib; systemFrameNumber, the 6 MSBs of the
// SFN; subCarrierSpacingCommon (scs15or60 0, scs30or120 1);
// ssb-SubcarrierOffset, k_SSB mod 16 in 4 bits; dmrs-TypeA-Position (pos2
// 0); controlResourceSetZero and searchSpaceZero, 4 bits each; cellBarred
// (barred 0, notBarred 1); intraFreqReselection (allowed 0); spare 0.
//
//	SFN 682 = 1010101010b: 0 101010 1 0000 0 0010 0000 1 0 0
//	  = 0101 0101 0000 0001 0000 0100 = 550104 hex
//	SFN 1: 0 000000 1 0000 0 0010 0000 1 0 0 = 010104 hex
//
// The PBCH payload (TS 38.212 7.1.1): ā(A) … ā(A+3) the 4th, 3rd, 2nd and
// 1st LSB of the SFN, ā(A+4) the half frame bit, and with L_max = 8 ā(A+5)
// the MSB of k_SSB (16 = 10000b: 1), then two reserved bits:
//
//	SFN 682: 1010 0 1 0 0; SFN 1: 0001 0 1 0 0
func TestMIBPanel(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := planform.FormOf(initialCampus(t)).Query()
	for _, c := range []struct {
		keys, title, hex, binary, payload string
	}{
		{"&mib.sfn=682", "MIB of SS/PBCH block 0 in frame 682", "550104", "010101010000000100000100", "10100100"},
		{"&mib.sfn=1&mib.ssb=3", "MIB of SS/PBCH block 3 in frame 1", "010104", "000000010000000100000100", "00010100"},
		// cellBarred and intraFreqReselection are bits 21 and 22
		// (ENUMERATED, one bit each in ASN.1 order: barred 0, notBarred 1;
		// allowed 0, notAllowed 1), before the spare bit 23:
		//	barred, allowed:        0 101010 1 0000 0 0010 0000 0 0 0 = 0101 0101 0000 0001 0000 0000 = 550100
		//	notBarred, notAllowed:  0 101010 1 0000 0 0010 0000 1 1 0 = 0101 0101 0000 0001 0000 0110 = 550106
		//	barred, notAllowed:     0 101010 1 0000 0 0010 0000 0 1 0 = 0101 0101 0000 0001 0000 0010 = 550102
		{"&mib.sfn=682&mib.cellBarred=barred", "MIB of SS/PBCH block 0 in frame 682", "550100", "010101010000000100000000", "10100100"},
		{"&mib.sfn=682&mib.intraFreqReselection=notAllowed", "MIB of SS/PBCH block 0 in frame 682", "550106", "010101010000000100000110", "10100100"},
		{"&mib.sfn=682&mib.cellBarred=barred&mib.intraFreqReselection=notAllowed", "MIB of SS/PBCH block 0 in frame 682", "550102", "010101010000000100000010", "10100100"},
	} {
		r := get(t, srv, "/?"+q+c.keys)
		wantStatus(t, r, http.StatusOK)
		panel := between(r.body, `data-testid="mib"`, `</section>`)
		wantContains(t, "MIB panel", panel, c.title, `data-testid="mib-hex">`+c.hex+`<`, `data-testid="mib-binary">`+c.binary+`<`)
		var payload strings.Builder
		for _, cell := range strings.Split(between(panel, `data-testid="mib-payload"`, `</table>`), `data-col="bits"><code>`)[1:] {
			payload.WriteString(cell[:1])
		}
		if payload.String() != c.payload {
			t.Errorf("%s: payload bits %s, want %s", c.keys, payload.String(), c.payload)
		}
		if !strings.Contains(between(r.body, `data-query="`, `"`), strings.ReplaceAll(c.keys[1:], "&", "&amp;")) {
			t.Errorf("%s: the page's query drops the MIB keys", c.keys)
		}
	}

	// Values out of range are named beside their control, and the panel
	// shows the default instead.
	r := get(t, srv, "/?"+q+"&mib.sfn=1024&mib.ssb=5&mib.cellBarred=maybe")
	wantContains(t, "SFN note", noteText(t, r.body, "f-mib-sfn"), "1024 is outside 0 to 1023")
	wantContains(t, "cellBarred note", noteText(t, r.body, "f-mib-cellBarred"), "maybe", "is not a value; give barred or notBarred")
	wantContains(t, "cellBarred control", between(r.body, `id="f-mib-cellBarred"`, `</select>`), `value="maybe" selected`)
	wantContains(t, "SSB note", noteText(t, r.body, "f-mib-ssb"), "does not send block 5", "0, 1, 2 and 3")
	wantContains(t, "MIB panel", between(r.body, `data-testid="mib"`, `</section>`), "MIB of SS/PBCH block 0 in frame 0")

	// Without initial access the panel says pdcch-ConfigSIB1 is not the plan's.
	r = get(t, srv, "/?"+campusQuery(t))
	wantContains(t, "MIB panel", between(r.body, `data-testid="mib"`, `</section>`), "pdcch-ConfigSIB1 is 0")

	// Without SS/PBCH blocks there is no MIB: neither panel nor controls.
	p := initialCampus(t)
	p.SSB, p.InitialAccess = nil, nil
	r = get(t, srv, "/?"+planform.FormOf(p).Query()+"&mib.sfn=5")
	wantStatus(t, r, http.StatusOK)
	if strings.Contains(r.body, `data-testid="mib"`) || strings.Contains(r.body, `id="f-mib-sfn"`) {
		t.Error("a plan without SS/PBCH blocks shows the MIB panel")
	}
}

// TestOpenNotesFitTheAddress: however many notes a file leaves, the
// redirect's query stays far below MaxQuery, and says how many it left out.
func TestOpenNotesFitTheAddress(t *testing.T) {
	notes := make([]string, 40)
	for i := range notes {
		notes[i] = "Skipped " + strings.Repeat("physCellId, ", 100)
	}
	q := openNotesQuery(notes)
	if len(q) > maxOpenNotesQuery+200 {
		t.Errorf("the notes take %d bytes of query, want at most about %d", len(q), maxOpenNotesQuery)
	}
	v, err := url.ParseQuery(q)
	if err != nil {
		t.Fatal(err)
	}
	got := v[keyOpenNote]
	if len(got) < 2 || !strings.HasPrefix(got[len(got)-1], "And ") || !strings.Contains(got[len(got)-1], " more notes") {
		t.Errorf("the last of %d notes is %q, want how many were left out", len(got), got[len(got)-1])
	}
	if q := openNotesQuery(nil); q != "" {
		t.Errorf("no notes: %q", q)
	}
}
