package report

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
	"gridloom/grid/planfile"
)

func sample() grid.Result {
	start := 0
	return grid.Compute(grid.Plan{Name: "sample", Carrier: grid.CarrierPlan{BandwidthMHz: 20},
		Partitions: []grid.PartitionPlan{{Name: "a", SCSKHz: 30, StartCRB: &start, SizePRB: 51}},
		TDD:        &grid.TDDPlan{ReferenceSCSKHz: 30, Pattern1: grid.TDDPattern{PeriodMs: 2.5, DownlinkSlots: 3, DownlinkSymbols: 6, UplinkSlots: 1, UplinkSymbols: 4}}})
}

// Write gives the bytes that marshalling Build's document gives, so a
// caller may use either; the command line's golden files pin the bytes.
func TestWriteMatchesBuild(t *testing.T) {
	r := sample()
	for _, indent := range []bool{true, false} {
		var buf bytes.Buffer
		if err := Write(&buf, r, indent); err != nil {
			t.Fatal(err)
		}
		var want []byte
		var err error
		if indent {
			want, err = json.MarshalIndent(Build(r, true), "", "  ")
		} else {
			want, err = json.Marshal(Build(r, true))
		}
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(buf.Bytes(), append(want, '\n')) {
			t.Errorf("indent %v: Write and Build differ", indent)
		}
	}
}

// The summary keeps empty symbol lists (never null), the full document lists
// every symbol of the span: 28 per millisecond at 30 kHz (TS 38.211 4.3.2).
func TestSymbols(t *testing.T) {
	r := sample()
	sum, full := Build(r, false), Build(r, true)
	if len(sum.Partitions) != 1 || sum.Partitions[0].Symbols == nil || len(sum.Partitions[0].Symbols) != 0 {
		t.Fatalf("summary partitions %+v, want one with an empty symbol list", sum.Partitions)
	}
	p := full.Partitions[0]
	if len(p.Symbols) != 28*r.Plan.SpanMs || p.SymbolCount != len(p.Symbols) {
		t.Errorf("%d symbols over %d ms, symbolCount %d; want 28 a millisecond", len(p.Symbols), r.Plan.SpanMs, p.SymbolCount)
	}
	if p.Symbols[0].Direction != "D" {
		t.Errorf("first symbol under a DDDSU pattern is %q, want D", p.Symbols[0].Direction)
	}
}

// The channel's band fields reach the document under the names the README
// gives them: an FDD carrier in n3 reports its paired uplink.
func TestChannelBand(t *testing.T) {
	// TS 38.101-1 Table 5.2-1: n3 is FDD, UL 1710–1785 MHz, DL 1805–1880 MHz,
	// so the duplex spacing is 95 MHz and a 1842.5 MHz downlink centre pairs
	// with 1747.5 MHz; NR-ARFCN 349500 = 1747.5 MHz / 5 kHz (TS 38.104 5.4.2.1).
	fc := 1842.5
	r := grid.Compute(grid.Plan{Name: "n3", Carrier: grid.CarrierPlan{Band: "n3", BandwidthMHz: 20, CenterMHz: &fc},
		Partitions: []grid.PartitionPlan{{Name: "a", SCSKHz: 15, SizePRB: 106}}})
	c := Build(r, false).Channel
	if c.Band != "n3" || c.Duplex != "FDD" || c.ULARFCN == nil || *c.ULARFCN != 349500 || c.ULCenterMHz == nil || *c.ULCenterMHz != 1747.5 {
		t.Errorf("channel %+v; want band n3, FDD, uplink 1747.5 MHz at NR-ARFCN 349500", c)
	}
}

// The SS/PBCH block's raster facts reach the document: the campus demo
// plan places its block by GSCN 8016. TS 38.101-1 Table 5.4.3.1-1 above
// 3000 MHz: SS_REF = 3000 MHz + (8016 − 7499)·1.44 MHz = 3744.48 MHz; its
// NR-ARFCN (TS 38.104 5.4.2.1, 15 kHz above 3000 MHz) is
// 600000 + 744.48 MHz / 15 kHz = 649632.
func TestSSBRaster(t *testing.T) {
	p, err := demo.Load("campus")
	if err != nil {
		t.Fatal(err)
	}
	s := Build(grid.Compute(p), false).SSB
	if s == nil || s.GSCN == nil || *s.GSCN != 8016 || s.SSRefMHz == nil || *s.SSRefMHz != 3744.48 ||
		s.AbsoluteFrequencySSB == nil || *s.AbsoluteFrequencySSB != 649632 {
		t.Errorf("ssb %+v; want GSCN 8016, SS_REF 3744.48 MHz, absoluteFrequencySSB 649632", s)
	}
}

// The cross-link JSON of the sample's pattern (DDDSU at 30 kHz, special
// slot 6:4:4) against itself: aligned, an empty list; one slot (500 µs)
// late, B's uplink slot 4 falls on A's downlink slot 0 (0 to 500 µs).
func TestBuildCrossLink(t *testing.T) {
	tdd := *sample().TDD
	cl, err := grid.CrossLinkConflicts(tdd, tdd, 0)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := json.Marshal(BuildCrossLink(cl))
	if got := string(b); got != `{"frameOffsetUs":0,"cycleUs":2500,"conflicts":[],"totalPer10msUs":0,"totalPerCycleTc":0}` {
		t.Errorf("aligned: %s", got)
	}
	cl, _ = grid.CrossLinkConflicts(tdd, tdd, 500)
	doc := BuildCrossLink(cl)
	if len(doc.Conflicts) == 0 || doc.Conflicts[0] != (CrossLinkConflict{StartUs: 0, EndUs: 500, StartTc: 0, EndTc: 983040, A: "D", B: "U"}) {
		t.Errorf("one slot late: %+v", doc.Conflicts)
	}
}

// Write streams the symbol lists into the document that Build gives without
// them; the bytes must be those of marshalling Build's whole document for
// every demo plan, the plans with initial access and PRACH, and the
// heaviest plans a user can ask for (partitions
// with and without a TDD pattern, absolute and relative channels, 16
// partitions of 960 kHz), in both forms.
func TestWriteStreamsBuildsBytes(t *testing.T) {
	plans := map[string]grid.Plan{}
	for _, name := range demo.Names() {
		p, err := demo.Load(name)
		if err != nil {
			t.Fatal(err)
		}
		plans["demo "+name] = p
	}
	files, _ := filepath.Glob("../../testdata/stress/*.yaml")
	if len(files) == 0 {
		t.Fatal("no stress plans under testdata/stress")
	}
	// Plans with initial access and PRACH blocks: documents with more
	// keys around the symbol lists.
	for _, glob := range []string{"../../testdata/initial/*.yaml", "../../testdata/prach/*.yaml"} {
		more, _ := filepath.Glob(glob)
		files = append(files, more...)
	}
	for _, f := range files {
		if testing.Short() && strings.Contains(f, "16-partitions") {
			continue // 143 360 symbols: seconds of marshalling on a loaded machine
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := planfile.Decode(b)
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		plans[filepath.Base(f)] = p
	}
	symbols := 0
	for name, p := range plans {
		r := grid.Compute(p)
		for _, indent := range []bool{true, false} {
			var got bytes.Buffer
			if err := Write(&got, r, indent); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			doc := Build(r, true)
			var want []byte
			var err error
			if indent {
				want, err = json.MarshalIndent(doc, "", "  ")
			} else {
				want, err = json.Marshal(doc)
			}
			if err != nil {
				t.Fatal(err)
			}
			want = append(want, '\n')
			if !bytes.Equal(got.Bytes(), want) {
				i := 0
				for i < len(want) && i < got.Len() && want[i] == got.Bytes()[i] {
					i++
				}
				t.Errorf("%s, indent %v: Write's %d bytes differ from Build's %d at byte %d: got %q, want %q",
					name, indent, got.Len(), len(want), i, excerpt(got.Bytes(), i), excerpt(want, i))
			}
			if indent {
				for _, jp := range doc.Partitions {
					symbols += len(jp.Symbols)
				}
			}
		}
	}
	if symbols == 0 {
		t.Error("no plan had symbols to stream")
	}
	t.Logf("%d plans, %d symbols streamed", len(plans), symbols)
}

func excerpt(b []byte, i int) []byte {
	return b[max(0, i-40):min(len(b), i+40)]
}

// A write that fails stops Write with the error instead of going on with a
// document no one reads (a client that left).
func TestWriteStopsOnWriteError(t *testing.T) {
	w := &failAfter{}
	err := Write(w, sample(), true)
	if err == nil {
		t.Fatal("Write into a failing writer returned no error")
	}
	if w.writes > 3 {
		t.Errorf("Write went on after the failure: %d writes", w.writes)
	}
}

type failAfter struct{ writes int }

func (f *failAfter) Write(p []byte) (int, error) {
	f.writes++
	return 0, errors.New("client gone")
}

// The bands two partitions share reach the document as "overlaps", each
// naming the two partitions, their indexes, the band from point A and the
// severity of its finding. 15 kHz CRB k spans [180·k − 7.5, 180·(k+1) − 7.5)
// kHz from point A (TS 38.211 4.4.4.3): downlink a holds CRBs 0–29 and b
// 20–49, so they share [3592.5, 5392.5) kHz, an error; uplink c holds
// CRBs 40–59 and shares [7192.5, 8992.5) kHz with b, a warning (TDD may
// keep them apart in time); a and c do not touch.
func TestOverlaps(t *testing.T) {
	at := func(v int) *int { return &v }
	fc := 3750.0 // n78, TS 38.101-1 Table 5.2-1
	p := grid.Plan{Name: "overlaps", Carrier: grid.CarrierPlan{Band: "n78", BandwidthMHz: 40, CenterMHz: &fc},
		Partitions: []grid.PartitionPlan{
			{Name: "a", SCSKHz: 15, StartCRB: at(0), SizePRB: 30},
			{Name: "b", SCSKHz: 15, StartCRB: at(20), SizePRB: 30},
			{Name: "c", SCSKHz: 15, StartCRB: at(40), SizePRB: 20, Direction: "UL"}}}
	doc := Build(grid.Compute(p), false)
	// In MHz, worked by hand: 40 MHz at 15 kHz is N_RB 216 (TS 38.101-1
	// Table 5.3.2-1), centred on 3750 MHz, so point A is 3750 − 108·0.18 =
	// 3730.56 MHz and each edge is that plus the kHz above.
	mhz := func(v float64) *float64 { return &v }
	want := []Overlap{
		{PartitionIndexes: [2]int{0, 1}, Partitions: [2]string{"a", "b"}, LowKHz: 3592.5, HighKHz: 5392.5, LowMHz: mhz(3734.1525), HighMHz: mhz(3735.9525), Severity: grid.Error},
		{PartitionIndexes: [2]int{1, 2}, Partitions: [2]string{"b", "c"}, LowKHz: 7192.5, HighKHz: 8992.5, LowMHz: mhz(3737.7525), HighMHz: mhz(3739.5525), Severity: grid.Warning},
	}
	if len(doc.Overlaps) != len(want) {
		t.Fatalf("overlaps %+v, want %+v", doc.Overlaps, want)
	}
	for i, w := range want {
		o := doc.Overlaps[i]
		if o.PartitionIndexes != w.PartitionIndexes || o.Partitions != w.Partitions || o.LowKHz != w.LowKHz || o.HighKHz != w.HighKHz || o.Severity != w.Severity {
			t.Errorf("overlap %d: %+v, want %+v", i, o, w)
		}
		if o.LowMHz == nil || o.HighMHz == nil || math.Abs(*o.LowMHz-*w.LowMHz) > 1e-9 || math.Abs(*o.HighMHz-*w.HighMHz) > 1e-9 {
			t.Errorf("overlap %d: %v–%v MHz, want %v–%v", i, o.LowMHz, o.HighMHz, *w.LowMHz, *w.HighMHz)
		}
	}

	// The JSON names the README lists; a plan without overlaps gives an
	// empty list, never null.
	b, err := json.Marshal(doc)
	if err != nil {
		t.Fatal(err)
	}
	var m struct {
		Overlaps []map[string]any `json:"overlaps"`
	}
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"partitionIndexes", "partitions", "lowKHz", "highKHz", "lowMHz", "highMHz", "severity"} {
		if _, ok := m.Overlaps[0][k]; !ok {
			t.Errorf("overlap %v lacks %q", m.Overlaps[0], k)
		}
	}
	b, err = json.Marshal(Build(sample(), false))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(b, []byte(`"overlaps":[]`)) {
		t.Errorf("a plan without overlaps: want \"overlaps\":[] in %s", excerpt(b, bytes.Index(b, []byte(`"overlaps"`))))
	}
}

// subCarrierSpacingCommon keeps its name in the document and is null where
// the field gives no spacing. TS 38.331 MIB field description
// (testdata/reference/rrc/ts38331-mib-fields.txt): "For operation with
// shared spectrum channel access in FR1 ... the subcarrier spacing for
// SIB1, Msg.2/4 and MsgB ... is same as that for the corresponding SSB";
// n46 is such a band. On n78 30 kHz is scs30or120 (FR1).
func TestMIBCommonSpacing(t *testing.T) {
	at := func(v int) *int { return &v }
	for _, c := range []struct {
		band   string
		centre float64
		want   string
	}{{"n78", 3750, `"subCarrierSpacingCommon":"scs30or120"`}, {"n46", 5505, `"subCarrierSpacingCommon":null`}} {
		p := grid.Plan{Name: c.band, Carrier: grid.CarrierPlan{Band: c.band, BandwidthMHz: 40, CenterMHz: &c.centre},
			SSB:           &grid.SSBPlan{SCSKHz: 30, OffsetToPointA: 60},
			Partitions:    []grid.PartitionPlan{{Name: "all", SCSKHz: 30, StartCRB: at(0), SizePRB: 106}},
			InitialAccess: &grid.InitialAccessPlan{}}
		doc := Build(grid.Compute(p), false)
		if doc.InitialAccess == nil {
			t.Fatalf("%s: no initial access: %v", c.band, doc.Findings)
		}
		b, err := json.Marshal(doc.InitialAccess.MIB)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Contains(b, []byte(c.want)) {
			t.Errorf("%s: mib %s, want %s", c.band, b, c.want)
		}
	}
}
