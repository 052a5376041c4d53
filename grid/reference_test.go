package grid

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// readTSV reads a tab-separated reference table from testdata/reference,
// skipping comments and blank lines.
func readTSV(t *testing.T, name string) [][]string {
	t.Helper()
	f, err := os.Open("../testdata/reference/" + name)
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
	if len(rows) == 0 {
		t.Fatalf("%s holds no rows", name)
	}
	return rows
}

func atoi(t *testing.T, s string) int {
	t.Helper()
	n, err := strconv.Atoi(s)
	if err != nil {
		t.Fatalf("bad number %q in a reference table", s)
	}
	return n
}

func atof(t *testing.T, s string) float64 {
	t.Helper()
	f, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("bad number %q in a reference table", s)
	}
	return f
}

// TS 38.101-1 / 38.101-2 Table 5.3.2-1 (N_RB) and Table 5.3.3-1 (minimum
// guardband), read again into testdata/reference/ts38101-bandwidth.tsv.
func TestBandwidthTables(t *testing.T) {
	rows := readTSV(t, "ts38101-bandwidth.tsv")
	seen := map[Range]int{}
	for _, row := range rows {
		rng, ok := ParseRange(row[0])
		if !ok {
			t.Fatalf("bad range %q", row[0])
		}
		scs, bw, wantNRB := atoi(t, row[1]), atoi(t, row[2]), atoi(t, row[3])
		wantGuard := Hz(math.Round(atof(t, row[4]) * 1000))
		seen[rng]++
		if got, ok := rng.NRB(scs, bw); !ok || got != wantNRB {
			t.Errorf("%s %d kHz %d MHz: N_RB = %d (defined %v), want %d", rng, scs, bw, got, ok, wantNRB)
		}
		if got, ok := rng.MinGuard(scs, bw); !ok || got != wantGuard {
			t.Errorf("%s %d kHz %d MHz: minimum guardband = %v kHz, want %v kHz", rng, scs, bw, got.KHz(), wantGuard.KHz())
		}
	}
	// The engine defines no pair the tables leave out.
	for rng, want := range seen {
		got := 0
		for _, scs := range rng.DataSCS() {
			got += len(rng.Bandwidths(scs))
		}
		if got != want {
			t.Errorf("%s: the engine defines %d SCS/bandwidth pairs, the reference table %d", rng, got, want)
		}
	}
}

// TS 38.101-1 Table 5.3.2-1 marks these N/A.
func TestBandwidthNotDefined(t *testing.T) {
	for _, c := range []struct {
		rng     Range
		scs, bw int
	}{
		{FR1, 15, 60}, {FR1, 15, 100}, {FR1, 60, 5}, {FR1, 30, 3}, {FR2_1, 60, 400}, {FR1, 120, 100}, {FR2_2, 240, 400},
	} {
		if n, ok := c.rng.NRB(c.scs, c.bw); ok {
			t.Errorf("%s %d kHz %d MHz: N_RB = %d, want not defined", c.rng, c.scs, c.bw, n)
		}
	}
}

// TS 38.211 Table 4.2-1, Table 4.3.2-1 and Table 4.3.2-2.
func TestNumerologyTable(t *testing.T) {
	for _, row := range readTSV(t, "ts38211-numerology.tsv") {
		mu, scs := atoi(t, row[0]), atoi(t, row[1])
		cp, ok := ParseCP(row[2])
		if !ok {
			t.Fatalf("bad cp %q", row[2])
		}
		n := Numerology{Mu: mu, CP: cp}
		if !n.Valid() {
			t.Errorf("%v: not valid, want valid", n)
		}
		if got, ok := MuForSCS(scs); !ok || got != mu {
			t.Errorf("MuForSCS(%d) = %d, %v; want %d", scs, got, ok, mu)
		}
		if got := n.SCSKHz(); got != scs {
			t.Errorf("%v: SCS %d kHz, want %d", n, got, scs)
		}
		if got, want := n.SymbolsPerSlot(), atoi(t, row[3]); got != want {
			t.Errorf("%v: %d symbols per slot, want %d", n, got, want)
		}
		if got, want := n.SlotsPerSubframe()*10, atoi(t, row[4]); got != want {
			t.Errorf("%v: %d slots per frame, want %d", n, got, want)
		}
		if got, want := n.SlotsPerSubframe(), atoi(t, row[5]); got != want {
			t.Errorf("%v: %d slots per subframe, want %d", n, got, want)
		}
	}
	// Extended CP exists only for μ = 2 (TS 38.211 Table 4.2-1).
	for mu := 0; mu <= MaxMu; mu++ {
		if got := (Numerology{Mu: mu, CP: ExtendedCP}).Valid(); got != (mu == 2) {
			t.Errorf("μ=%d extended CP valid = %v, want %v", mu, got, mu == 2)
		}
	}
}

func TestSymbolLengthsAsQuoted(t *testing.T) {
	for _, row := range readTSV(t, "symbol-lengths.tsv") {
		mu, _ := MuForSCS(atoi(t, row[0]))
		cp, _ := ParseCP(row[1])
		n := Numerology{Mu: mu, CP: cp}
		near := func(what string, got float64, col string) {
			t.Helper()
			if col == "-" {
				return
			}
			if want := atof(t, col); math.Abs(got-want) > 0.005 {
				t.Errorf("%v: %s = %.4f µs, want %s µs", n, what, got, col)
			}
		}
		near("useful symbol", n.UsefulTc().Micros(), row[2])
		near("CP", n.CPTc(1).Micros(), row[3])
		if cp == NormalCP {
			near("long CP", n.CPTc(0).Micros(), row[4])
		}
	}
}

// Facts of the trade (common practice): at 15 kHz the useful symbol is
// 1/15 kHz ≈ 66.7 µs; 14, 28, 56, 112 symbols fit in a millisecond at 15,
// 30, 60, 120 kHz; at 120 kHz the useful symbol is ≈ 8.3 µs.
func TestTradeFacts(t *testing.T) {
	n15 := Numerology{Mu: 0}
	if got := n15.UsefulTc().Micros(); math.Abs(got-1e3/15) > 1e-9 {
		t.Errorf("15 kHz useful symbol %v µs, want 1/15 kHz = 66.67 µs", got)
	}
	if got := (Numerology{Mu: 3}).UsefulTc().Micros(); math.Abs(got-8.33) > 0.01 {
		t.Errorf("120 kHz useful symbol %v µs, want ≈ 8.3 µs", got)
	}
	for mu, want := range []int{14, 28, 56, 112} {
		n := Numerology{Mu: mu}
		if got := n.SymbolsPerSubframe(); got != want {
			t.Errorf("%d kHz: %d symbols per ms, want %d", n.SCSKHz(), got, want)
		}
		// And they fill the millisecond exactly.
		if end := n.SymbolAt(want - 1).End(); end != TcPerSubframe {
			t.Errorf("%d kHz: symbol %d ends at %d Tc, want %d", n.SCSKHz(), want-1, end, TcPerSubframe)
		}
	}
}

// TS 38.211 4.1: Tc = 1/(480000·4096) s, κ = Ts/Tc = 64 with Ts = 1/(15000·2048) s.
func TestTimeUnit(t *testing.T) {
	if TcPerSecond != 1966080000 {
		t.Errorf("Tc per second = %d, want 480000·4096 = 1966080000", TcPerSecond)
	}
	if ts := TcPerSecond / (15000 * 2048); ts != Kappa {
		t.Errorf("Ts/Tc = %d, want κ = 64", ts)
	}
}
