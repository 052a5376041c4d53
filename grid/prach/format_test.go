package prach

import (
	"bufio"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestNCSAndAllocationAgainstCopies compares Tables 6.3.3.1-5, 6.3.3.1-6,
// 6.3.3.1-7 and 6.3.3.2-1 with the copies in testdata/reference/prach/ncs_and_rb.tsv.
func TestNCSAndAllocationAgainstCopies(t *testing.T) {
	f, err := os.Open("../../testdata/reference/prach/ncs_and_rb.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cells, diffs := 0, 0
	fmtFor := map[string]Format{"6.3.3.1-5": Format0, "6.3.3.1-6": Format3, "6.3.3.1-7": FormatA1}
	setFor := map[string]RestrictedSet{"unrestricted": Unrestricted, "typeA": RestrictedTypeA, "typeB": RestrictedTypeB}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		c := strings.Split(sc.Text(), "\t")
		switch c[0] {
		case "ncs":
			for z, v := range c[3:] {
				cells++
				got, err := NCS(fmtFor[c[1]], z, setFor[c[2]])
				if v == "-" {
					if err == nil {
						diffs++
						t.Errorf("Table %s %s config %d: got N_CS %d, the copy has an empty cell", c[1], c[2], z, got)
					}
					continue
				}
				want, _ := strconv.Atoi(v)
				if err != nil || got != want {
					diffs++
					t.Errorf("Table %s %s config %d: N_CS %d (%v), copy %d", c[1], c[2], z, got, err, want)
				}
			}
		case "rb":
			n := make([]int, 5)
			for i := range n {
				n[i], _ = strconv.Atoi(c[i+1])
			}
			a, err := AllocationFor(n[0], n[1], n[2])
			cells += 2
			if err != nil || a.NRB != n[3] || a.KBar != n[4] {
				diffs++
				t.Errorf("Table 6.3.3.2-1 %v: got %+v (%v)", n, a, err)
			}
		}
	}
	t.Logf("N_CS and Table 6.3.3.2-1: %d cells compared, %d differ", cells, diffs)
	if cells != 7*16+16*2 {
		t.Errorf("compared %d cells, want %d: the copy file is incomplete", cells, 7*16+16*2)
	}
	if len(allocations) != 16 {
		t.Errorf("Table 6.3.3.2-1 has %d rows here, the copy 16", len(allocations))
	}
}

// TestPreambleTimes checks Tables 6.3.3.1-1 and 6.3.3.1-2 against the
// physics they encode: one sequence period N_u/repeats is 1/Δf^RA.
func TestPreambleTimes(t *testing.T) {
	for f := Format0; f <= FormatC2; f++ {
		p, err := PreambleOf(f)
		if err != nil {
			t.Fatal(err)
		}
		for mu := 0; mu <= 3; mu++ {
			scs := p.ScsHz(mu)
			if got, want := p.SequenceTc(mu), int64(TcPerSecond/scs); got != want {
				t.Errorf("format %v, μ %d: T_seq %d Tc, want 1/%d Hz = %d Tc", f, mu, got, scs, want)
			}
			if p.Format.Long() {
				break
			}
		}
	}
	// Format 3 is the 5 kHz one; formats 0–2 are 1.25 kHz (Table 6.3.3.1-1).
	if p, _ := PreambleOf(Format3); p.SCSHz != 5000 || p.NCPKappa != 3168 {
		t.Errorf("format 3: %+v", p)
	}
	if _, err := PreambleOf(FormatA1B1); err == nil {
		t.Error("PreambleOf(A1/B1) gave no error")
	}
}

func TestNCSErrors(t *testing.T) {
	for _, tc := range []struct {
		f    Format
		z    int
		set  RestrictedSet
		want string
	}{
		{Format0, 16, Unrestricted, "0 to 15"},
		{Format0, 15, RestrictedTypeA, "empty cell of TS 38.211 Table 6.3.3.1-5"},
		{Format3, 14, RestrictedTypeB, "Table 6.3.3.1-6"},
		{FormatB4, 3, RestrictedTypeA, "supports no restricted set type A"},
	} {
		_, err := NCS(tc.f, tc.z, tc.set)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("NCS(%v, %d, %v) error = %v, want one containing %q", tc.f, tc.z, tc.set, err, tc.want)
		}
	}
}

func TestFormatNames(t *testing.T) {
	for f := Format0; f < numFormats; f++ {
		g, err := ParseFormat(f.String())
		if err != nil || g != f {
			t.Errorf("ParseFormat(%q) = %v, %v", f.String(), g, err)
		}
	}
	if _, err := ParseFormat("D1"); err == nil {
		t.Error("ParseFormat(D1) gave no error")
	}
}

// TestPreamblesAgainstCopy compares Tables 6.3.3.1-1 and 6.3.3.1-2 with the
// srsRAN copy in testdata/reference/prach/preambles.tsv. The long formats were also read
// against the text of TS 38.211 V18.7.0; the short formats' N_u and N_CP are
// pictures in that text, so this copy is their only outside check.
func TestPreamblesAgainstCopy(t *testing.T) {
	f, err := os.Open("../../testdata/reference/prach/preambles.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cells, rows := 0, 0
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		c := strings.Split(sc.Text(), "\t")
		if strings.HasPrefix(c[0], "#") || c[0] == "format" {
			continue
		}
		rows++
		fm, err := ParseFormat(c[0])
		if err != nil {
			t.Fatal(err)
		}
		p, err := PreambleOf(fm)
		if err != nil {
			t.Fatal(err)
		}
		v := make([]int, 4)
		for i := range v {
			v[i], _ = strconv.Atoi(c[i+1])
		}
		seqUnit := 2048
		if fm.Long() {
			seqUnit = 24576
			if v[1] == 5000 {
				seqUnit = 6144
			}
		}
		got := []int{p.LRA, p.SCSHz, p.Repeats, p.NCPKappa, p.NuKappa}
		want := []int{v[0], v[1], v[2], v[3], v[2] * seqUnit}
		for i := range got {
			cells++
			if got[i] != want[i] {
				t.Errorf("format %v column %d: %d, copy %d", fm, i, got[i], want[i])
			}
		}
	}
	t.Logf("preamble formats: %d rows, %d cells compared", rows, cells)
	if rows != 13 {
		t.Errorf("%d rows in the copy, want 13", rows)
	}
}
