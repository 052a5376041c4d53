package rrc_test

import (
	"bufio"
	"os"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
)

// row is one line of a names table: an IE, a component, and values.
type row struct {
	ie, kind string
	values   []string
	file     string
}

func readTSV(t *testing.T, path string) []row {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var rows []row
	s := bufio.NewScanner(f)
	s.Buffer(nil, 1<<20)
	for s.Scan() {
		line := s.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		cols := strings.Split(line, "\t")
		if len(cols) < 3 {
			t.Fatalf("%s: short line %q", path, line)
		}
		r := row{ie: cols[0], kind: cols[1]}
		if cols[2] != "-" && cols[2] != "" {
			r.values = strings.Fields(cols[2])
		}
		if len(cols) > 3 {
			r.file = cols[3]
		}
		rows = append(rows, r)
	}
	return rows
}

// exportPlans are the demo plans and plans that reach the other branches:
// the 3 ms TDD period of the -v1530 extension, extended CP, FR2's
// subCarrierSpacingCommon and a 4-candidate SS/PBCH bitmap.
func exportPlans(t *testing.T) map[string]grid.Plan {
	out := map[string]grid.Plan{}
	all, err := demo.All()
	if err != nil {
		t.Fatal(err)
	}
	for _, d := range all {
		out[d.Name] = d.Plan
	}
	for name, p := range extraPlans() {
		out[name] = p
	}
	for name, p := range initialPlans(t) {
		out[name] = p
	}
	for name, p := range prachPlans(t) {
		out[name] = p
	}
	for name, p := range commonPlans() {
		out[name] = p
	}
	return out
}

func ptr[T any](v T) *T { return &v }

func extraPlans() map[string]grid.Plan {
	return map[string]grid.Plan{
		"tdd-3ms-low-band": {
			Name:    "3 ms pattern below 3 GHz",
			Carrier: grid.CarrierPlan{BandwidthMHz: 20, CenterMHz: ptr(2600.0)},
			TDD:     &grid.TDDPlan{ReferenceSCSKHz: 30, Pattern1: grid.TDDPattern{PeriodMs: 3, DownlinkSlots: 4, DownlinkSymbols: 6, UplinkSlots: 1, UplinkSymbols: 4}, Pattern2: &grid.TDDPattern{PeriodMs: 2, DownlinkSlots: 2, UplinkSlots: 2}},
			// k_SSB counts 15 kHz subcarriers of a 15 kHz common RB here,
			// so it is 0 to 11 (TS 38.211 7.4.3.1); frequency_test.go works
			// the block out by hand.
			SSB: &grid.SSBPlan{SCSKHz: 15, OffsetToPointA: 3, KSSB: 6, Bitmap: "1010"},
			Partitions: []grid.PartitionPlan{
				{Name: "all", SCSKHz: 30, StartCRB: ptr(0), SizePRB: 51, Direction: "DL", Layers: 2},
			},
		},
		"fr2-common-60": {
			Name:    "FR2 with a 60 kHz common spacing",
			Carrier: grid.CarrierPlan{Range: "FR2-1", BandwidthMHz: 100, ARFCN: ptr(2079167)},
			// SS_REF on GSCN 22474, an entry of n257 at 240 kHz, worked by
			// hand in frequency_test.go.
			SSB: &grid.SSBPlan{SCSKHz: 240, OffsetToPointA: 49, KSSB: 8, ScsCommonKHz: 60, PeriodMs: 40},
			Partitions: []grid.PartitionPlan{
				{Name: "sixty", SCSKHz: 60, CP: "extended", LocationAndBandwidth: ptr(275*19 + 2)},
				{Name: "up", SCSKHz: 120, StartCRB: ptr(20), SizePRB: 40, Direction: "UL", Modulation: "16QAM"},
			},
		},
	}
}

// TestNamesTableMatchesTypes checks the names table (the rows compared
// with srsRAN_Project's V17.4.0 code below) against the V17.1.0 ASN.1
// excerpt, so that the two sources and the excerpt agree: each row's
// component is one of its IE's components, or a component or CHOICE
// alternative nested inline in it (inOneGroup, shortBitmap, oneEighth),
// and an enumeration row lists that component's values in order.
func TestNamesTableMatchesTypes(t *testing.T) {
	m := loadTypes(t)
	// find looks for a component among an IE's own and inline types.
	var find func(ty *asnType, name string) *asnType
	find = func(ty *asnType, name string) *asnType {
		if ty == nil {
			return nil
		}
		for _, c := range ty.comps {
			if c.name == name {
				return c.t
			}
		}
		for _, c := range ty.comps {
			if c.t.kind != "REF" {
				if got := find(c.t, name); got != nil {
					return got
				}
			}
		}
		return nil
	}
	rows, values := 0, 0
	for _, r := range readTSV(t, "../../testdata/reference/rrc/ts38331-names.tsv") {
		def := m.types[r.ie]
		if def == nil {
			t.Errorf("%s is not a type of the excerpt", r.ie)
			continue
		}
		rows++
		ty := def
		if r.kind != "-" {
			if ty = find(def, r.kind); ty == nil {
				t.Errorf("%s has no component %s in TS 38.331 V17.1.0", r.ie, r.kind)
				continue
			}
		}
		if r.values != nil {
			rt := m.resolve(ty, nil)
			if rt == nil || !slices.Equal(rt.enums, r.values) {
				t.Errorf("%s.%s: the table has %v, TS 38.331 V17.1.0 %v", r.ie, r.kind, r.values, rt)
			}
			values += len(r.values)
		}
	}
	t.Logf("%d rows of the names table found in TS 38.331 V17.1.0, %d enumeration values compared", rows, values)
	if rows < 100 {
		t.Errorf("only %d rows checked", rows)
	}
}

// TestNamesAgainstSrsRAN compares the names table cell by cell with the
// names srsRAN_Project's generated code (38.331 v17.4.0) prints: each
// component must be one its IE prints (a field, or a CHOICE alternative in
// its names[] arrays), and each enumeration must equal one of that IE's
// names[] arrays value for value.
//
// Differences found and settled: ServingCellConfigCommon's
// ssb-periodicityServingCell was first read without spare2, spare1;
// the clause text has them, and the table now does (0 differences).
func TestNamesAgainstSrsRAN(t *testing.T) {
	type ieNames struct {
		components []string
		enums      [][]string
	}
	other := map[string]*ieNames{}
	for _, r := range readTSV(t, "../../testdata/reference/rrc/srsran_names.tsv") {
		n := other[r.ie]
		if n == nil {
			n = &ieNames{}
			other[r.ie] = n
		}
		switch r.kind {
		case "components":
			n.components = append(n.components, r.values...)
		case "enumerated":
			n.enums = append(n.enums, r.values)
		case "missing":
			t.Errorf("srsRAN's code has no IE %s", r.ie)
		}
	}
	cells, differ := 0, 0
	for _, r := range readTSV(t, "../../testdata/reference/rrc/ts38331-names.tsv") {
		n := other[r.ie]
		if n == nil {
			t.Errorf("IE %s is not in the srsRAN copy", r.ie)
			differ++
			continue
		}
		if r.kind != "-" {
			cells++
			alt := slices.ContainsFunc(n.enums, func(e []string) bool { return slices.Contains(e, r.kind) })
			if !slices.Contains(n.components, r.kind) && !alt {
				t.Errorf("%s.%s: srsRAN's %s does not print it", r.ie, r.kind, r.ie)
				differ++
			}
		}
		if r.values != nil {
			cells += len(r.values)
			if !slices.ContainsFunc(n.enums, func(e []string) bool { return slices.Equal(e, r.values) }) {
				t.Errorf("%s.%s: enumeration %v is none of srsRAN's %v", r.ie, r.kind, r.values, n.enums)
				differ += len(r.values)
			}
		}
	}
	t.Logf("compared %d cells with srsRAN_Project's 38.331 v17.4.0 names; %d differ", cells, differ)
	if cells < 100 {
		t.Errorf("only %d cells compared", cells)
	}
}
