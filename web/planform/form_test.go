package planform

import (
	"io/fs"
	"net/url"
	"reflect"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
	"gridloom/grid/planfile"
)

// demoPlans decodes the embedded demo plans, by file name.
func demoPlans(t testing.TB) map[string]grid.Plan {
	t.Helper()
	names, err := fs.Glob(demo.FS, "*.yaml")
	if err != nil || len(names) == 0 {
		t.Fatalf("demo plans: %v, %d found", err, len(names))
	}
	out := map[string]grid.Plan{}
	for _, n := range names {
		b, err := fs.ReadFile(demo.FS, n)
		if err != nil {
			t.Fatal(err)
		}
		p, err := planfile.DecodeYAML(b)
		if err != nil {
			t.Fatalf("%s: %v", n, err)
		}
		out[n] = p
	}
	return out
}

func mustQuery(t *testing.T, q string) url.Values {
	t.Helper()
	v, err := url.ParseQuery(q)
	if err != nil {
		t.Fatalf("ParseQuery(%q): %v", q, err)
	}
	return v
}

// roundTrip checks that p written as a page query reads back, without a
// message, to p, and that writing it again gives the same query.
func roundTrip(t *testing.T, p grid.Plan) {
	t.Helper()
	q := FormOf(p).Query()
	f, qmsgs := ParseQuery(mustQuery(t, q))
	if len(qmsgs) > 0 {
		t.Fatalf("ParseQuery(%q) messages: %v", q, qmsgs)
	}
	got, msgs := f.Plan()
	if len(msgs) > 0 {
		t.Fatalf("Plan of %q: messages %v", q, msgs)
	}
	if !reflect.DeepEqual(got, p) {
		t.Errorf("plan → query → plan changed the plan:\nquery %s\ngot  %+v\nwant %+v", q, got, p)
	}
	if q2 := FormOf(got).Query(); q2 != q {
		t.Errorf("query → plan → query is not stable:\ngot  %s\nwant %s", q2, q)
	}
}

// TestRoundTripDemoPlans: a plan written as a page query reads back to the
// same plan, and writing that plan again gives the same query.
func TestRoundTripDemoPlans(t *testing.T) {
	for name, p := range demoPlans(t) {
		t.Run(name, func(t *testing.T) { roundTrip(t, p) })
	}
}

// TestRoundTripPlans covers the fields the demo plans leave out.
func TestRoundTripPlans(t *testing.T) {
	f := func(x float64) *float64 { return &x }
	n := func(x int) *int { return &x }
	cases := map[string]grid.Plan{
		"offsets and carrier sizes": {Name: "a & b = c?", SpanMs: 3, NumerologyGapKHz: f(0),
			Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 50, ARFCN: n(650000),
				OffsetToCarrier: map[int]int{15: 0, 30: 1}, CarrierBandwidth: map[int]int{30: 132}},
			Partitions: []grid.PartitionPlan{
				{Name: "riv", SCSKHz: 30, LocationAndBandwidth: n(1099)},
				{Name: "", SCSKHz: 15, CP: "normal", StartCRB: n(-3), SizePRB: -1, Direction: "ul", Layers: 9, Modulation: "8PSK"},
			}},
		"pattern2, bitmap of zeros, environment": {Carrier: grid.CarrierPlan{Range: "FR2-1", BandwidthMHz: 100, CenterMHz: f(28000.08)},
			TDD: &grid.TDDPlan{ReferenceSCSKHz: 120, Pattern1: grid.TDDPattern{PeriodMs: 0.625, DownlinkSlots: 3},
				Pattern2: &grid.TDDPattern{PeriodMs: 1.25, UplinkSlots: 2, UplinkSymbols: 4}},
			SSB:         &grid.SSBPlan{SCSKHz: 240, Case: "E", Bitmap: "0000", ScsCommonKHz: 120, PeriodMs: 5},
			Environment: &grid.EnvironmentPlan{DelaySpreadNs: 37.5, SpeedKmh: 3, CarrierMHz: 28000},
			Partitions:  []grid.PartitionPlan{{Name: "x", SCSKHz: 120, SizePRB: 66}}},
		"no partitions":           {Name: "empty"},
		"an environment of zeros": {Environment: &grid.EnvironmentPlan{}, Partitions: []grid.PartitionPlan{{Name: "a"}}},
		"initial access, row 0, BWPs of zeros": {InitialAccess: &grid.InitialAccessPlan{InitialDownlinkBWP: &grid.InitialBWPPlan{},
			InitialUplinkBWP: &grid.InitialBWPPlan{Partition: "a"}}, Partitions: []grid.PartitionPlan{{Name: "a"}}},
	}
	for name, p := range cases {
		t.Run(name, func(t *testing.T) { roundTrip(t, p) })
	}
}

// TestQueryKeepsInput: whatever a query holds, reading it and writing it
// again gives the same query, so a value that does not parse survives.
func TestQueryKeepsInput(t *testing.T) {
	for _, q := range []string{
		"name=x&bw=forty&p0.name=a&p0.scs=15&p0.size=abc",
		"span=0.5&fc=NaN&off.30=-&cbw.15=1e3&p0.name=&p0.start=+4",
		"tdd.ms=7&tdd2.dl=x&ssb.bitmap=1010&env.profile=nowhere&p0.name=%C3%A9t%C3%A9&p0.riv=12+",
		"p0.name=a&p1.name=b&p2.name=c&p2.mod=256QAM",
	} {
		f, _ := ParseQuery(mustQuery(t, q))
		if got := f.Query(); got != q {
			t.Errorf("ParseQuery(%q).Query() = %q", q, got)
		}
	}
}

func TestPlanMessages(t *testing.T) {
	cases := []struct {
		query, field string
		want         []string // substrings of the message
	}{
		{"p0.name=a&p0.size=abc", "partitions[0].sizePrb", []string{`"abc"`, "Size", "1 to 275"}},
		{"p0.name=a&p0.scs=fifteen", "partitions[0].scsKHz", []string{`"fifteen"`, "15, 30 or 60"}},
		{"p0.name=a&p0.start=1.5", "partitions[0].startCrb", []string{`"1.5"`, "0 to 2473"}},
		{"p0.name=a&p0.riv=x", "partitions[0].locationAndBandwidth", []string{"0 to 37949"}},
		{"p0.name=a&p0.layers=two", "partitions[0].layers", []string{"1 to 8 for DL"}},
		{"span=half", "spanMs", []string{"1 to 10"}},
		{"bw=forty", "carrier.bandwidthMHz", []string{"Channel bandwidth", "40"}},
		{"range=FR2-1&bw=big", "carrier.bandwidthMHz", []string{"400"}},
		{"fc=NaN", "carrier.centerMHz", []string{`"NaN"`, "MHz"}},
		{"arfcn=6e5", "carrier.arfcn", []string{"3279165"}},
		{"off.30=-", "carrier.offsetToCarrier.30", []string{"offsetToCarrier at 30 kHz", "0 to 2199"}},
		{"cbw.15=lots", "carrier.carrierBandwidth.15", []string{"1 to 275"}},
		{"gap=wide", "numerologyGapKHz", []string{"kHz"}},
		{"tdd.ref=15&tdd.ms=five", "tdd.pattern1.periodMs", []string{"0.5, 0.625"}},
		{"tdd2.ulsym=x", "tdd.pattern2.uplinkSymbols", []string{"Pattern 2"}},
		{"ssb.scs=30&ssb.k=?", "ssb.kSsb", []string{"0 to 23"}},
		{"env.speed=fast", "environment.speedKmh", []string{"km/h"}},
		{"p0.name=a&p0.size=99999999999", "partitions[0].sizePrb", []string{"far outside", "1 to 275"}},
		{"p0.name=a&p0.size=99999999999999999999999", "partitions[0].sizePrb", []string{"far outside"}},
	}
	for _, c := range cases {
		f, _ := ParseQuery(mustQuery(t, c.query))
		_, msgs := f.Plan()
		msg, ok := msgs[c.field]
		if !ok {
			t.Errorf("%s: no message at %s; got %v", c.query, c.field, msgs)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(msg, w) {
				t.Errorf("%s: message %q does not contain %q", c.query, msg, w)
			}
		}
	}
}

func TestParseQueryPartitions(t *testing.T) {
	f, msgs := ParseQuery(mustQuery(t, "p3.name=c&p0.name=a&p03.name=skipped&p1.nope=x&p70.name=far&px.name=y"))
	if got := []string{f.Parts[0].Name, f.Parts[1].Name}; len(f.Parts) != 2 || got[0] != "a" || got[1] != "c" {
		t.Errorf("partitions = %+v, want a then c (gaps close, bad keys ignored)", f.Parts)
	}
	if m := msgs["partitions"]; !strings.Contains(m, "p70") || !strings.Contains(m, "p63") {
		t.Errorf("message for p70 = %q, want it to name p70 and the limit p63", m)
	}
}

func TestBlocksPresentOnlyWhenGiven(t *testing.T) {
	for _, c := range []struct {
		query         string
		tdd, p2, ssb  bool
		env, anyBlock bool
	}{
		{query: "p0.name=a"},
		{query: "tdd.ref=30", tdd: true, anyBlock: true},
		{query: "tdd2.ms=2", tdd: true, p2: true, anyBlock: true},
		{query: "ssb.off=0", ssb: true, anyBlock: true},
		{query: "env.profile=long", env: true, anyBlock: true},
		{query: "tdd.ref=+&ssb.scs=%20"}, // white space is nothing
	} {
		f, _ := ParseQuery(mustQuery(t, c.query))
		p, _ := f.Plan()
		if (p.TDD != nil) != c.tdd || (p.TDD != nil && (p.TDD.Pattern2 != nil) != c.p2) || (p.SSB != nil) != c.ssb || (p.Environment != nil) != c.env {
			t.Errorf("%s: tdd %v (pattern2 %v), ssb %v, env %v; want %v %v %v %v", c.query,
				p.TDD != nil, p.TDD != nil && p.TDD.Pattern2 != nil, p.SSB != nil, p.Environment != nil, c.tdd, c.p2, c.ssb, c.env)
		}
	}
}

func formOf(t *testing.T, q string) Form {
	t.Helper()
	f, _ := ParseQuery(mustQuery(t, q))
	return f
}

func names(f Form) string {
	var s []string
	for _, p := range f.Parts {
		s = append(s, p.Name)
	}
	return strings.Join(s, ",")
}

func TestApplyOp(t *testing.T) {
	base := "bw=40&fc=3750&p0.name=a&p0.scs=15&p0.start=0&p0.size=10&p1.name=b&p1.scs=30&p1.start=bad&p1.size=20&p2.name=c&p2.scs=15&p2.start=100&p2.size=10"
	cases := []struct {
		op, names, focus string
	}{
		{"del.1", "a,c", "f-p1-name"},
		{"del.2", "a,b", "f-p1-name"},
		{"dup.0", "a,a-copy,b,c", "f-p1-name"},
		{"up.2", "a,c,b", "b-up-1"},
		{"up.0", "a,b,c", "b-up-0"},
		{"down.0", "b,a,c", "b-down-1"},
		{"add", "a,b,c,part-4", "f-p3-name"},
	}
	for _, c := range cases {
		f := formOf(t, base)
		st := NewState(f, nil)
		g, focus, err := ApplyOp(st.Form, c.op, st.Result)
		if err != nil {
			t.Errorf("%s: %v", c.op, err)
			continue
		}
		if got := names(g); got != c.names || focus != c.focus {
			t.Errorf("%s: partitions %s, focus %s; want %s, %s", c.op, got, focus, c.names, c.focus)
		}
		if c.op == "up.2" && g.Parts[2].Start != "bad" {
			t.Errorf("up.2 lost the typed start %q", g.Parts[2].Start)
		}
		if names(f) != "a,b,c" {
			t.Errorf("%s changed the form it was given: %s", c.op, names(f))
		}
	}
	for _, op := range []string{"del.3", "dup.x", "up", "zap.0", "del.01", "clear.all"} {
		st := NewState(formOf(t, base), nil)
		if _, _, err := ApplyOp(st.Form, op, st.Result); err == nil {
			t.Errorf("ApplyOp(%q) = nil error, want one", op)
		}
	}
}

func TestAddPlacesInFreeSpectrum(t *testing.T) {
	// 40 MHz at 15 kHz: N_RB 216. One partition on CRBs 0–99; the new one
	// takes the rest of the carrier.
	st := NewState(formOf(t, "bw=40&p0.name=low&p0.scs=15&p0.start=0&p0.size=100"), nil)
	g, _, err := ApplyOp(st.Form, "add", st.Result)
	if err != nil {
		t.Fatal(err)
	}
	np := g.Parts[1]
	if np.SCS != "15" || np.Start != "100" || np.Size != "116" {
		t.Errorf("added %+v, want 15 kHz at CRB 100, size 116", np)
	}
	res := grid.Compute(must(g.Plan()))
	if res.HasErrors() {
		t.Errorf("the added partition makes errors: %v", res.Findings)
	}
}

func must(p grid.Plan, m Messages) grid.Plan {
	if len(m) > 0 {
		panic(m)
	}
	return p
}

func TestClearOps(t *testing.T) {
	q := "tdd.ref=15&tdd.ms=5&ssb.scs=30&env.profile=long&p0.name=a"
	for _, c := range []struct{ op, gone string }{{"clear.tdd", "tdd."}, {"clear.ssb", "ssb."}, {"clear.env", "env."}} {
		st := NewState(formOf(t, q), nil)
		g, _, err := ApplyOp(st.Form, c.op, st.Result)
		if err != nil {
			t.Fatal(err)
		}
		if got := g.Query(); strings.Contains(got, c.gone) || !strings.Contains(got, "p0.name=a") {
			t.Errorf("%s: query %s, want no %s keys and the partition kept", c.op, got, c.gone)
		}
	}
}

func TestFillFromRIV(t *testing.T) {
	// RIV 1099 with N = 275: L = 1099/275 + 1 = 4, RB_start = 1099 mod 275 = 274,
	// which is the second branch: L = 275 − 4 + 2 = 273, RB_start = 0.
	st := NewState(formOf(t, "bw=100&p0.name=a&p0.scs=30&p0.riv=1099"), nil)
	p := st.Form.Parts[0]
	if p.RIV != "" || p.Start == "" || p.Size != "273" {
		t.Errorf("after fill %+v, want start and size 273 filled and the RIV field empty", p)
	}
	// An RIV beside a start is not filled over: the user typed both.
	st = NewState(formOf(t, "bw=100&p0.name=a&p0.scs=30&p0.riv=1099&p0.start=5"), nil)
	if p := st.Form.Parts[0]; p.RIV != "1099" || p.Start != "5" || p.Size != "" {
		t.Errorf("fill overwrote typed input: %+v", p)
	}
}

func TestControlID(t *testing.T) {
	for field, want := range map[string]string{
		"carrier.bandwidthMHz":         "f-bw",
		"carrier.offsetToCarrier.30":   "f-off-30",
		"carrier.offsetToCarrier":      "g-carriers",
		"partitions[12].sizePrb":       "f-p12-size",
		"partitions[1].startCrb":       "f-p1-start",
		"partitions[0]":                "g-p0",
		"partitions":                   "g-parts",
		"spanMs":                       "f-span",
		"tdd.pattern2.downlinkSymbols": "f-tdd2-dlsym",
		"tdd.pattern1":                 "g-tdd",
		"ssb.scsCommonKHz":             "f-ssb-common",
		"environment.delayProfile":     "f-env-profile",
		"nonsense":                     "",
	} {
		if got := ControlID(field); got != want {
			t.Errorf("ControlID(%q) = %q, want %q", field, got, want)
		}
	}
}

// TestClearInit: clear.init empties the initial access and keeps the rest.
func TestClearInit(t *testing.T) {
	st := NewState(formOf(t, "bw=40&ia.coreset=3&ia.dl.part=a&p0.name=a&p0.scs=30"), nil)
	if st.Plan.InitialAccess == nil || st.Plan.InitialAccess.InitialDownlinkBWP == nil {
		t.Fatalf("ia.coreset and ia.dl.part give no initial access: %+v", st.Plan.InitialAccess)
	}
	g, focus, err := ApplyOp(st.Form, "clear.init", st.Result)
	if err != nil {
		t.Fatal(err)
	}
	if q := g.Query(); strings.Contains(q, "ia.") || !strings.Contains(q, "p0.name=a") || focus != "f-ia-coreset" {
		t.Errorf("clear.init: query %s, focus %s; want no ia. keys, the partition kept, focus f-ia-coreset", q, focus)
	}
}
