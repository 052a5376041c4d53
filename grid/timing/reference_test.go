package timing

import (
	"bufio"
	"os"
	"strconv"
	"strings"
	"testing"
)

// readTSV returns the data rows of a testdata table: lines that are not
// blank and do not start with '#', split at tabs.
func readTSV(t *testing.T, name string) [][]string {
	t.Helper()
	f, err := os.Open("../../testdata/reference/timing/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var rows [][]string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		rows = append(rows, strings.Split(line, "\t"))
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows
}

// ourCell returns this package's value for a row of the processing-time
// copies, in the copy's unit (symbols, slots or Tc), or false if the
// package has no such cell.
func ourCell(t *testing.T, table, muS, col string) (float64, bool) {
	t.Helper()
	mu, _ := strconv.Atoi(muS)
	dmrs := map[string]DMRS{"pos0": DMRSPos0, "additional": DMRSAdditional, "additional-l1-12": DMRSAdditionalL1At12}
	switch table {
	case "N1cap1", "N1cap2":
		c := Cap1
		if table == "N1cap2" {
			c = Cap2
		}
		d, ok := dmrs[col]
		if !ok {
			t.Fatalf("unknown DM-RS column %q", col)
		}
		n, err := N1(mu, c, d)
		if err != nil {
			return 0, false
		}
		return float64(n) / 2, true
	case "N2cap1", "N2cap2":
		c := Cap1
		if table == "N2cap2" {
			c = Cap2
		}
		n, err := N2(mu, c)
		if err != nil {
			return 0, false
		}
		return float64(n) / 2, true
	case "BWPswitch":
		typ := map[string]int{"type1": 0, "type2": 1}[col]
		if mu < 0 || mu >= len(Table8_6_2_1) {
			return 0, false
		}
		return float64(Table8_6_2_1[mu][typ]), true
	case "transition":
		return float64(RxTxTransition(col == "FR2")), true
	case "ta":
		switch col {
		case "max-rar":
			return MaxRARTimingAdvance, true
		case "step-tc-at-mu0":
			n, err := NTAFromRAR(0, 1)
			if err != nil {
				t.Fatal(err)
			}
			return float64(n), true
		}
	}
	t.Fatalf("unknown table %q column %q", table, col)
	return 0, false
}

// compareCopy compares every cell of an independent copy with this
// package's tables and returns how many cells it compared.
func compareCopy(t *testing.T, name string) (compared int, seen map[string]bool) {
	t.Helper()
	seen = map[string]bool{}
	differ := 0
	for _, r := range readTSV(t, name) {
		if len(r) != 4 {
			t.Fatalf("%s: row %q has %d fields, want 4", name, r, len(r))
		}
		want, err := strconv.ParseFloat(r[3], 64)
		if err != nil {
			t.Fatalf("%s: row %q: %v", name, r, err)
		}
		got, ok := ourCell(t, r[0], r[1], r[2])
		compared++
		seen[r[0]+"/"+r[1]+"/"+r[2]] = true
		if !ok || got != want {
			differ++
			t.Errorf("%s: %s μ=%s %s: ours %v (defined %v), copy %v", name, r[0], r[1], r[2], got, ok, want)
		}
	}
	t.Logf("%s: compared %d cells, %d differ", name, compared, differ)
	return compared, seen
}

// TS 38.214 Tables 5.3-1, 5.3-2, 6.4-1, 6.4-2 and TS 38.133 Table 8.6.2-1
// against OpenAirInterface's copy (Release 15 rows, μ 0–3). The one
// difference in wording: OAI's comment puts the N1,0 = 14 cell under
// "l1 = 1,2", TS 38.214 5.3 under "l1 = 12"; the value is the same and this
// package follows the specification's condition.
func TestTablesAgainstOAI(t *testing.T) {
	n, _ := compareCopy(t, "oai-processing-times.tsv")
	if n != 30 {
		t.Errorf("compared %d cells of the OAI copy, want all 30", n)
	}
}

// The same tables against a second reading of the specification text,
// which also carries the Rel-17 rows μ = 5 and 6, TS 38.213 4.2's
// timing-advance range and TS 38.211 Table 4.3.2-3. Every defined cell of the four TS 38.214 tables
// must be among those compared.
func TestTablesAgainstSpecText(t *testing.T) {
	n, seen := compareCopy(t, "ts38214-text-second-reading.tsv")
	if n != 29 {
		t.Errorf("compared %d cells of the spec-text copy, want all 29", n)
	}
	for mu := 0; mu <= MaxMu; mu++ {
		m := strconv.Itoa(mu)
		for col, v := range Table5_3_1[mu] {
			name := []string{"pos0", "additional"}[col]
			if v != notDefined && !seen["N1cap1/"+m+"/"+name] {
				t.Errorf("Table 5.3-1 μ=%d %s is not checked against the text", mu, name)
			}
		}
		for table, v := range map[string]float64{"N1cap2/" + m + "/pos0": Table5_3_2[mu], "N2cap1/" + m + "/-": Table6_4_1[mu], "N2cap2/" + m + "/-": Table6_4_2[mu]} {
			if v != notDefined && !seen[table] {
				t.Errorf("%s is not checked against the text", table)
			}
		}
	}
}

// TS 38.133 Table 7.1.2-2 against srsRAN_Project's enum of N_TA,offset.
func TestNTAOffsetAgainstSrsRAN(t *testing.T) {
	rows := map[string]Coexistence{
		"FR1 FDD band with LTE-NR coexistence case":                                                        FR1FDDWithLTE,
		"FR1 FDD band without LTE-NR coexistence case or for FR1 TDD band without LTE-NR coexistence case": FR1NoCoexistence,
		"FR2": FR2,
		"FR1 TDD band with LTE-NR coexistence case": FR1TDDWithLTE,
	}
	compared, differ := 0, 0
	for _, r := range readTSV(t, "srsran-n-ta-offset.tsv") {
		c, ok := rows[r[0]]
		if !ok {
			t.Fatalf("row %q of the srsRAN copy matches no row of Table 7.1.2-2", r[0])
		}
		want, _ := strconv.ParseInt(r[1], 10, 64)
		got, err := NTAOffset(c)
		compared++
		if err != nil || int64(got) != want {
			differ++
			t.Errorf("%v: ours %d, srsRAN %d", c, got, want)
		}
	}
	t.Logf("srsran-n-ta-offset.tsv: compared %d cells, %d differ", compared, differ)
	if compared != len(Table7_1_2_2) {
		t.Errorf("compared %d rows, want the table's %d", compared, len(Table7_1_2_2))
	}
}
