package prach

import (
	"bufio"
	"fmt"
	"os"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// copyRow is one row of an independent copy of a configuration table.
type copyRow struct {
	table                    string
	index                    int
	format                   string
	missing                  bool // the copy names only the format
	x                        int
	y                        []int
	slots                    []int
	start, nslots, nocc, dur int
}

func ints(t *testing.T, s string) []int {
	t.Helper()
	var out []int
	for _, f := range strings.Split(s, ",") {
		v, err := strconv.Atoi(f)
		if err != nil {
			t.Fatalf("bad integer list %q: %v", s, err)
		}
		out = append(out, v)
	}
	return out
}

func readCopy(t *testing.T, path string) []copyRow {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var rows []copyRow
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.HasPrefix(line, "table\t") || line == "" {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 10 {
			t.Fatalf("%s: %d cells in %q, want 10", path, len(c), line)
		}
		r := copyRow{table: c[0], format: c[2]}
		r.index, _ = strconv.Atoi(c[1])
		if c[3] == "-" {
			r.missing = true
		} else {
			r.x, _ = strconv.Atoi(c[3])
			r.y, r.slots = ints(t, c[4]), ints(t, c[5])
			r.start, _ = strconv.Atoi(c[6])
			r.nslots, _ = strconv.Atoi(c[7])
			r.nocc, _ = strconv.Atoi(c[8])
			r.dur, _ = strconv.Atoi(c[9])
		}
		rows = append(rows, r)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows
}

// compareCopy compares every row of a copy with ours, cell by cell, and
// returns the cells compared and the differences ("table index column ours
// copy"). want gives the rows the copy must hold of each table.
func compareCopy(t *testing.T, rows []copyRow, want map[string]int) (cells int, diffs []string) {
	t.Helper()
	seen := map[string]int{}
	for _, r := range rows {
		var s Spectrum
		switch r.table {
		case "6.3.3.2-2":
			s = FR1Paired
		case "6.3.3.2-3":
			s = FR1Unpaired
		case "6.3.3.2-4":
			s = FR2Unpaired
		default:
			t.Fatalf("unknown table %q", r.table)
		}
		seen[r.table]++
		c, err := Lookup(s, r.index)
		if err != nil {
			t.Fatalf("Lookup(%v, %d): %v", s.Table(), r.index, err)
		}
		diff := func(col string, ours, theirs any) {
			cells++
			if fmt.Sprint(ours) != fmt.Sprint(theirs) {
				diffs = append(diffs, fmt.Sprintf("%s %d %s %v %v", r.table, r.index, col, ours, theirs))
			}
		}
		diff("format", c.Format.String(), r.format)
		if r.missing {
			continue
		}
		diff("x", c.X, r.x)
		diff("y", c.Y, r.y)
		diff("slots", c.Slots, r.slots)
		diff("start", c.StartSymbol, r.start)
		// The spec prints "-" for the long formats' PRACH slots and occasions;
		// each copy writes its own filler there, so those two cells are skipped.
		if !c.Format.Long() {
			diff("nslots", c.SlotsPerSubframe, r.nslots)
			diff("nocc", c.OccasionsPerSlot, r.nocc)
		}
		diff("dur", c.Duration, r.dur)
	}
	for _, tb := range []string{"6.3.3.2-2", "6.3.3.2-3", "6.3.3.2-4"} {
		if seen[tb] != want[tb] {
			t.Errorf("the copy has %d rows of Table %s, want %d", seen[tb], tb, want[tb])
		}
	}
	return cells, diffs
}

// rows256 is what the base-station copies hold: indexes 0–255 of each table.
var rows256 = map[string]int{"6.3.3.2-2": 256, "6.3.3.2-3": 256, "6.3.3.2-4": 256}

// TestTablesAgainstText compares the three tables with a second reading of
// the text they were read from, TS 38.211 V18.7.0 (Release 18): every row,
// 256 + 263 + 256, read by a script from the Markdown of that text
// (testdata/reference/prach/ts38211-v18.7.0-tables.tsv). No Release 17
// text of the tables was at hand (see config.go for the search and for what
// Release 18 changed around them), so this checks the reading, not the
// release; the two base-station copies below are the independent check.
func TestTablesAgainstText(t *testing.T) {
	want := map[string]int{"6.3.3.2-2": 256, "6.3.3.2-3": 263, "6.3.3.2-4": 256}
	cells, diffs := compareCopy(t, readCopy(t, "../../testdata/reference/prach/ts38211-v18.7.0-tables.tsv"), want)
	t.Logf("TS 38.211 V18.7.0 text (second reading): 775 rows (256 + 263 + 256), %d cells compared, %d differ: %v", cells, len(diffs), diffs)
	if len(diffs) != 0 {
		t.Errorf("differences from the V18.7.0 text: %q", diffs)
	}
	// Each row has 8 cells besides its index, less the 2 "-" cells of a
	// long-format row.
	long := 0
	for _, s := range []Spectrum{FR1Paired, FR1Unpaired, FR2Unpaired} {
		for i := range s.Len() {
			if c, _ := Lookup(s, i); c.Format.Long() {
				long++
			}
		}
	}
	if want := 775*8 - 2*long; cells != want {
		t.Errorf("compared %d cells, want %d (775 rows × 8, less 2 per long-format row)", cells, want)
	}
}

// TestTablesAgainstOAI compares Tables 6.3.3.2-2/-3/-4 with the
// OpenAirInterface copy (testdata/reference/prach/oai_prach_config.tsv). Neither copy has
// the Release 16 rows 256–262 of Table 6.3.3.2-3; TestOccasionsIndex261
// works one of them by hand.
func TestTablesAgainstOAI(t *testing.T) {
	cells, diffs := compareCopy(t, readCopy(t, "../../testdata/reference/prach/oai_prach_config.tsv"), rows256)
	// The one difference: Table 6.3.3.2-3 index 95, where the spec text (and
	// the srsRAN copy) has x = 2 and the OAI copy 16 (see table6332_3).
	want := []string{"6.3.3.2-3 95 x 2 16"}
	t.Logf("OpenAirInterface copy: 768 rows, %d cells compared, %d differ: %v", cells, len(diffs), diffs)
	if !slices.Equal(diffs, want) {
		t.Errorf("differences = %q, want exactly the settled %q", diffs, want)
	}
}

// TestTablesAgainstSRSRAN compares the three tables with the srsRAN Project
// copy (testdata/reference/prach/srsran_prach_config.tsv), which leaves the rows of formats
// B1, C2, A1/B1, A2/B2 and A3/B3 unimplemented; those rows compare the
// format only.
func TestTablesAgainstSRSRAN(t *testing.T) {
	rows := readCopy(t, "../../testdata/reference/prach/srsran_prach_config.tsv")
	full := 0
	for _, r := range rows {
		if !r.missing {
			full++
		}
	}
	cells, diffs := compareCopy(t, rows, rows256)
	t.Logf("srsRAN copy: 768 rows (%d with every column, %d format only), %d cells compared, %d differ: %v",
		full, len(rows)-full, cells, len(diffs), diffs)
	if len(diffs) != 0 {
		t.Errorf("differences from the srsRAN copy: %q", diffs)
	}
	if full < 500 {
		t.Errorf("only %d rows of the srsRAN copy carry values; the check would be too thin", full)
	}
}

// TestTablesShape checks what the spec's own structure requires of every
// row, so a slip in copying that both copies would not catch (they
// only cover what they carry) still shows.
func TestTablesShape(t *testing.T) {
	for _, s := range []Spectrum{FR1Paired, FR1Unpaired, FR2Unpaired} {
		maxSlot := 9
		if s == FR2Unpaired {
			maxSlot = 39
		}
		if want := map[Spectrum]int{FR1Paired: 256, FR1Unpaired: 263, FR2Unpaired: 256}[s]; s.Len() != want {
			t.Errorf("Table %s has %d rows, want %d", s.Table(), s.Len(), want)
		}
		for i := range s.Len() {
			c, err := Lookup(s, i)
			if err != nil {
				t.Fatalf("Lookup(%s, %d): %v", s.Table(), i, err)
			}
			name := fmt.Sprintf("Table %s index %d", s.Table(), i)
			if !slices.Contains([]int{1, 2, 4, 8, 16}, c.X) {
				t.Errorf("%s: x = %d, not one of 1, 2, 4, 8, 16", name, c.X)
			}
			for _, y := range c.Y {
				if y < 0 || y >= c.X {
					t.Errorf("%s: y = %d outside 0..x-1 (x = %d)", name, y, c.X)
				}
			}
			if !slices.IsSorted(c.Slots) || len(c.Slots) == 0 || c.Slots[0] < 0 || c.Slots[len(c.Slots)-1] > maxSlot {
				t.Errorf("%s: slots %v not increasing within 0..%d", name, c.Slots, maxSlot)
			}
			if c.Format.Long() {
				if s == FR2Unpaired || c.Duration != 0 || c.SlotsPerSubframe != 0 || c.OccasionsPerSlot != 0 {
					t.Errorf("%s: long format %v with duration %d, slots %d, occasions %d", name, c.Format, c.Duration, c.SlotsPerSubframe, c.OccasionsPerSlot)
				}
				continue
			}
			// TS 38.211 Tables 6.3.3.1-2 and 6.3.3.2-x: N_dur is 2 (A1, B1, C0), 4 (A2), 6 (A3, C2), 12 (B4).
			a, _ := c.Format.Pair()
			wantDur := map[Format]int{FormatA1: 2, FormatB1: 2, FormatC0: 2, FormatA2: 4, FormatA3: 6, FormatC2: 6, FormatB4: 12}[a]
			if c.Duration != wantDur {
				t.Errorf("%s: format %v with N_dur %d, want %d", name, c.Format, c.Duration, wantDur)
			}
			if end := c.StartSymbol + c.OccasionsPerSlot*c.Duration; end > 14 {
				t.Errorf("%s: occasions run to symbol %d, past the 14-symbol slot", name, end)
			}
			if c.SlotsPerSubframe != 1 && c.SlotsPerSubframe != 2 {
				t.Errorf("%s: %d PRACH slots, want 1 or 2", name, c.SlotsPerSubframe)
			}
		}
	}
}

func TestLookupErrors(t *testing.T) {
	for _, tc := range []struct {
		s     Spectrum
		index int
		want  string
	}{
		{FR1Paired, 256, "defines 0 to 255"},
		{FR1Paired, -1, "defines 0 to 255"},
		{FR1Unpaired, 263, "Table 6.3.3.2-3 defines 0 to 262"},
		{FR2Unpaired, 300, "Table 6.3.3.2-4 defines 0 to 255"},
		{Spectrum(7), 0, "not one of"},
	} {
		_, err := Lookup(tc.s, tc.index)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Lookup(%d, %d) error = %v, want one containing %q", tc.s, tc.index, err, tc.want)
		}
	}
}

func TestTableFor(t *testing.T) {
	for _, tc := range []struct {
		fr     int
		paired bool
		want   string
	}{
		{1, true, "6.3.3.2-2"}, {1, false, "6.3.3.2-3"}, {2, false, "6.3.3.2-4"},
	} {
		s, err := TableFor(tc.fr, tc.paired)
		if err != nil || s.Table() != tc.want {
			t.Errorf("TableFor(%d, %v) = %s, %v; want %s", tc.fr, tc.paired, s.Table(), err, tc.want)
		}
	}
	if _, err := TableFor(2, true); err == nil {
		t.Error("TableFor(2, paired) gave no error")
	}
	if _, err := TableFor(3, false); err == nil {
		t.Error("TableFor(3, unpaired) gave no error")
	}
}
