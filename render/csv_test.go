package render

import (
	"bytes"
	"encoding/csv"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
)

func readCSV(t *testing.T, r grid.Result) [][]string {
	t.Helper()
	var b bytes.Buffer
	if err := SymbolCSV(&b, r); err != nil {
		t.Fatalf("SymbolCSV(%q): %v", r.Plan.Name, err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatalf("SymbolCSV(%q) wrote CSV that does not read back: %v", r.Plan.Name, err)
	}
	return rows
}

// TestSymbolCSVRows: a header, then one row per symbol of every partition.
func TestSymbolCSVRows(t *testing.T) {
	for _, path := range append(demoPlans(t), stressPlan) {
		t.Run(planName(path), func(t *testing.T) {
			r := compute(t, loadPlan(t, path))
			rows := readCSV(t, r)
			if !slices.Equal(rows[0], csvHeader) {
				t.Errorf("header %q, want %q", rows[0], csvHeader)
			}
			want := 0
			for _, l := range r.Partitions {
				want += l.SymbolCount()
			}
			if got := len(rows) - 1; got != want {
				t.Errorf("%d symbol rows, want Σ SymbolCount = %d", got, want)
			}
		})
	}
}

// TestSymbolCSVValues checks the first symbols of a 15 kHz, a 30 kHz and
// an extended-CP 60 kHz partition against TS 38.211 5.3.1:
// N_u = 2048κ·2^−μ, N_CP = 144κ·2^−μ + 16κ for the first symbol of each
// half subframe and 144κ·2^−μ otherwise, 512κ·2^−μ with extended CP;
// κ = 64 (TS 38.211 4.1). One µs is 1966.08 Tc.
func TestSymbolCSVValues(t *testing.T) {
	at := func(n int) *int { return &n }
	p := grid.Plan{Name: "values", Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{
			{Name: "fifteen", SCSKHz: 15, StartCRB: at(0), SizePRB: 20},
			{Name: "thirty", SCSKHz: 30, StartCRB: at(20), SizePRB: 20},
			{Name: "sixty-ext", SCSKHz: 60, CP: "extended", StartCRB: at(30), SizePRB: 10},
		}}
	rows := readCSV(t, compute(t, p))
	type want struct {
		row                     []string // partition, scsKHz, mu, cp, slot, symbol
		startTc, cpTc, lengthTc int64
		startUs, cpUs, lengthUs string
	}
	// Row numbers count from the first symbol row; 15 kHz has 14 symbols
	// and 30 kHz 28 in the 1 ms span.
	cases := map[int]want{
		// 15 kHz symbol 0: N_CP = 144·64 + 16·64 = 10240, N_u = 131072.
		0: {[]string{"fifteen", "15", "0", "normal", "0", "0"}, 0, 10240, 141312, "0.000000", "5.208333", "71.875000"},
		// 15 kHz symbol 1 starts after symbol 0; N_CP = 144·64 = 9216.
		1: {[]string{"fifteen", "15", "0", "normal", "0", "1"}, 141312, 9216, 140288, "71.875000", "4.687500", "71.354167"},
		// 15 kHz symbol 7 opens the second half subframe, 0.5 ms in: long CP again.
		7: {[]string{"fifteen", "15", "0", "normal", "0", "7"}, 983040, 10240, 141312, "500.000000", "5.208333", "71.875000"},
		// 30 kHz symbol 0: N_CP = 144·64/2 + 16·64 = 5632, N_u = 65536.
		14: {[]string{"thirty", "30", "1", "normal", "0", "0"}, 0, 5632, 71168, "0.000000", "2.864583", "36.197917"},
		// 30 kHz symbol 14 is symbol 0 of slot 1, 0.5 ms in (two slots per subframe).
		14 + 14: {[]string{"thirty", "30", "1", "normal", "1", "0"}, 983040, 5632, 71168, "500.000000", "2.864583", "36.197917"},
		// 60 kHz extended CP: N_CP = 512·64/4 = 8192, N_u = 32768, 12 symbols a slot.
		42:      {[]string{"sixty-ext", "60", "2", "extended", "0", "0"}, 0, 8192, 40960, "0.000000", "4.166667", "20.833333"},
		42 + 12: {[]string{"sixty-ext", "60", "2", "extended", "1", "0"}, 491520, 8192, 40960, "250.000000", "4.166667", "20.833333"},
	}
	for k, w := range cases {
		got := rows[1+k]
		wantRow := append(slices.Clone(w.row), strconv.FormatInt(w.startTc, 10), strconv.FormatInt(w.cpTc, 10),
			strconv.FormatInt(w.lengthTc, 10), w.startUs, w.cpUs, w.lengthUs)
		if !slices.Equal(got[:len(wantRow)], wantRow) {
			t.Errorf("symbol row %d:\n got  %q\n want %q", k, got, wantRow)
		}
	}
}

// TestSymbolCSVDirectionAndSpan checks the columns after lengthUs against
// values worked by hand. Edges: CRB n of spacing Δf spans
// [n·12·Δf − Δf/2, (n+size)·12·Δf − Δf/2) from point A (TS 38.211 4.4.4.3,
// point A the centre of subcarrier 0 of CRB 0). Point A: the centre is
// subcarrier 6·N_RB of the carrier (TS 38.101-1 5.4.2.2), so with offset 0
// point A = f_c − 6·N_RB·Δf; 40 MHz at 30 kHz has N_RB = 106 (TS 38.101-1
// Table 5.3.2-1): 3750 − 106·6·0.03 = 3730.92 MHz. Directions: a 1 ms
// period at 30 kHz is two slots; one downlink slot, then 10 downlink
// symbols, 2 flexible and 2 uplink symbols (TS 38.213 11.1: downlink first,
// uplink last, flexible between).
func TestSymbolCSVDirectionAndSpan(t *testing.T) {
	at := func(n int) *int { return &n }
	centre := 3750.0
	cols := map[string]int{}
	for i, h := range csvHeader {
		cols[h] = i
	}
	if !slices.Equal(csvHeader[:12], []string{"partition", "scsKHz", "mu", "cp", "slot", "symbol", "startTc", "cpTc", "lengthTc", "startUs", "cpUs", "lengthUs"}) {
		t.Fatalf("the first twelve columns moved: %q", csvHeader)
	}
	cell := func(row []string, name string) string { return row[cols[name]] }

	// Relative only, no TDD: no direction and no MHz.
	rel := grid.Plan{Name: "relative", Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{
			{Name: "fifteen", SCSKHz: 15, StartCRB: at(0), SizePRB: 20}, // [−7.5, 20·180 − 7.5 = 3592.5)
			{Name: "thirty", SCSKHz: 30, StartCRB: at(20), SizePRB: 20}, // [20·360 − 15 = 7185, 40·360 − 15 = 14385)
		}}
	rows := readCSV(t, compute(t, rel))
	for k, want := range map[int][5]string{0: {"", "-7.5", "3592.5", "", ""}, 13: {"", "-7.5", "3592.5", "", ""}, 14: {"", "7185", "14385", "", ""}} {
		row := rows[1+k]
		got := [5]string{cell(row, "direction"), cell(row, "lowKHz"), cell(row, "highKHz"), cell(row, "lowMHz"), cell(row, "highMHz")}
		if got != want {
			t.Errorf("relative row %d: %q, want %q", k, got, want)
		}
	}

	abs := grid.Plan{Name: "absolute", Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 40, CenterMHz: &centre},
		TDD:        &grid.TDDPlan{ReferenceSCSKHz: 30, Pattern1: grid.TDDPattern{PeriodMs: 1, DownlinkSlots: 1, DownlinkSymbols: 10, UplinkSymbols: 2}},
		Partitions: []grid.PartitionPlan{{Name: "a", SCSKHz: 30, StartCRB: at(0), SizePRB: 10}}}
	res := compute(t, abs)
	if res.HasErrors() {
		t.Fatalf("the plan has errors: %v", res.Findings)
	}
	rows = readCSV(t, res)
	if len(rows) != 1+28 {
		t.Fatalf("%d rows, want a header and 28 symbols", len(rows))
	}
	var dirs string
	for _, row := range rows[1:] {
		dirs += cell(row, "direction")
		// [−15 kHz, 10·360 − 15 = 3585 kHz); 3730.92 MHz − 0.015 = 3730.905, + 3.585 = 3734.505.
		if got := [4]string{cell(row, "lowKHz"), cell(row, "highKHz"), cell(row, "lowMHz"), cell(row, "highMHz")}; got != [4]string{"-15", "3585", "3730.905", "3734.505"} {
			t.Fatalf("span %q, want [-15 3585 3730.905 3734.505]", got)
		}
	}
	if want := strings.Repeat("D", 14) + strings.Repeat("D", 10) + "FFUU"; dirs != want {
		t.Errorf("directions %s, want %s", dirs, want)
	}
}

func TestExactDecimal(t *testing.T) {
	for _, c := range []struct {
		v      int64
		places int
		want   string
	}{{7500, 3, "7.5"}, {-7500, 3, "-7.5"}, {0, 3, "0"}, {5, 3, "0.005"}, {-5, 6, "-0.000005"}, {3730905000, 6, "3730.905"}, {3000000000, 6, "3000"}, {-9223372036854775808, 3, "-9223372036854775.808"}} {
		if got := exactDecimal(c.v, c.places); got != c.want {
			t.Errorf("exactDecimal(%d, %d) = %q, want %q", c.v, c.places, got, c.want)
		}
	}
}

// TestSymbolCSVInjection: a name a spreadsheet would run as a formula is
// neutralised with a leading apostrophe (common practice: the OWASP note on
// CSV injection lists =, +, -, @, tab and carriage return).
func TestSymbolCSVInjection(t *testing.T) {
	names := map[string]string{
		"=HYPERLINK(\"x\")": "'=HYPERLINK(\"x\")",
		"+1+1":              "'+1+1",
		"-2+3":              "'-2+3",
		"@SUM(A1)":          "'@SUM(A1)",
		"\tcmd":             "'\tcmd",
		"\rcmd":             "'\rcmd",
		"plain=1":           "plain=1",
		"a,b \"quoted\"":    "a,b \"quoted\"",
	}
	p := grid.Plan{Name: "inject", Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 100}}
	order := keys(names)
	for i, name := range order {
		start := 12 * i
		p.Partitions = append(p.Partitions, grid.PartitionPlan{Name: name, SCSKHz: 30, StartCRB: &start, SizePRB: 10})
	}
	rows := readCSV(t, compute(t, p))
	seen := map[string]bool{}
	for _, row := range rows[1:] {
		seen[row[0]] = true
	}
	for _, name := range order {
		if !seen[names[name]] {
			t.Errorf("name %q: no row with partition cell %q (cells seen: %q)", name, names[name], keys(seen))
		}
	}
	// Every other cell is a number, a CP or a direction, which no
	// spreadsheet runs as a formula; a number may be negative (a
	// partition at CRB 0 starts half a subcarrier below point A).
	for _, row := range rows[1:] {
		for i, cell := range row[1:] {
			switch h := csvHeader[1+i]; h {
			case "cp":
				if cell != "normal" && cell != "extended" {
					t.Errorf("cp cell %q", cell)
				}
			case "direction":
				if cell != "" && cell != "D" && cell != "U" && cell != "F" {
					t.Errorf("direction cell %q", cell)
				}
			case "lowMHz", "highMHz":
				if cell == "" {
					continue
				}
				fallthrough
			default:
				if _, err := strconv.ParseFloat(cell, 64); err != nil || strings.ContainsAny(cell[:1], "=+@\t\r") {
					t.Errorf("%s cell %q is not a plain number", h, cell)
				}
			}
		}
	}
}

func keys[V any](m map[string]V) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}
