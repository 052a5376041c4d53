package prach

import (
	"bufio"
	"os"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// Tables 8.1-1 and 8.1-2 of TS 38.213 against a second reading of the text
// (testdata/reference/prach/ts38213-tables-8.1.tsv), cell by cell. N_gap is
// kept by format (the long formats are the 1.25 and 5 kHz preambles, the
// short ones run at 15–120 kHz here), so each spacing is checked through
// the formats that use it; format B4's N_gap of 0 is the text's own
// exception beside the table.
func TestTables81AgainstText(t *testing.T) {
	f, err := os.Open("../../testdata/reference/prach/ts38213-tables-8.1.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cells, differ := 0, 0
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") || strings.HasPrefix(line, "table\t") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 3 {
			t.Fatalf("%q: %d cells, want 3", line, len(c))
		}
		switch c[0] {
		case "8.1-1":
			period, _ := strconv.Atoi(c[1])
			var want []int
			for _, v := range strings.Split(c[2], ",") {
				n, _ := strconv.Atoi(v)
				want = append(want, n)
			}
			cells++
			if got := associationPeriods[period]; !slices.Equal(got, want) {
				differ++
				t.Errorf("Table 8.1-1, %d ms: %v, the text says %v", period, got, want)
			}
		case "8.1-2":
			want, _ := strconv.Atoi(c[2])
			formats := []Format{FormatA1, FormatA2, FormatA3, FormatB1, FormatC0, FormatC2}
			if c[1] == "1.25" || c[1] == "5" {
				formats = []Format{Format0, Format1, Format2, Format3}
			}
			cells++
			for _, fm := range formats {
				if got := NGap(Occasion{Format: fm}); got != want {
					differ++
					t.Errorf("Table 8.1-2, %s kHz, format %v: N_gap %d, the text says %d", c[1], fm, got, want)
				}
			}
		default:
			t.Fatalf("unknown table %q", c[0])
		}
	}
	if cells != 11 {
		t.Errorf("%d cells read, want the 5 rows of Table 8.1-1 and the 6 of Table 8.1-2 used here", cells)
	}
	if NGap(Occasion{Format: FormatB4}) != 0 {
		t.Error("format B4: N_gap should be 0 (TS 38.213 8.1, beside Table 8.1-2)")
	}
	t.Logf("Tables 8.1-1 and 8.1-2 against the text: %d cells compared, %d differ", cells, differ)
}
