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
		if !slices.Equal(got, wantRow) {
			t.Errorf("symbol row %d:\n got  %q\n want %q", k, got, wantRow)
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
	for _, row := range rows[1:] {
		for _, cell := range row[1:] {
			if strings.ContainsAny(cell[:1], "=+-@\t\r") {
				t.Errorf("numeric cell %q starts with a formula character", cell)
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
