package grid

import (
	"slices"
	"strconv"
	"strings"
	"testing"
)

// Candidate first symbols of TS 38.213 4.1, written out from its case
// definitions: A {2,8}+14n, B {4,8,16,20}+28n, C {2,8}+14n,
// D {4,8,16,20}+28n, E {8,12,16,20,32,36,40,44}+56n, F and G {2,9}+14n.
func TestSSBCandidates(t *testing.T) {
	firsts := func(c string, f Hz, unpaired bool) []int {
		i := slices.IndexFunc(ssbCases, func(x ssbCase) bool { return x.name == c })
		var out []int
		for _, n := range ssbN(ssbCases[i], f, unpaired) {
			for _, b := range ssbCases[i].base {
				out = append(out, b+ssbCases[i].step*n)
			}
		}
		slices.Sort(out)
		return out
	}
	for _, c := range []struct {
		name     string
		c        string
		f        Hz
		unpaired bool
		want     []int
	}{
		{"A at 2 GHz (n = 0, 1)", "A", 2e9, false, []int{2, 8, 16, 22}},
		{"A at 3.5 GHz (n = 0…3)", "A", 3.5e9, false, []int{2, 8, 16, 22, 30, 36, 44, 50}},
		{"B at 2 GHz (n = 0)", "B", 2e9, false, []int{4, 8, 16, 20}},
		{"B at 3.5 GHz (n = 0, 1)", "B", 3.5e9, false, []int{4, 8, 16, 20, 32, 36, 44, 48}},
		{"C paired at 2.5 GHz (n = 0, 1)", "C", 2.5e9, false, []int{2, 8, 16, 22}},
		{"C unpaired at 2.5 GHz (above 1.88 GHz: n = 0…3)", "C", 2.5e9, true, []int{2, 8, 16, 22, 30, 36, 44, 50}},
		{"C unpaired at 1.8 GHz (n = 0, 1)", "C", 1.8e9, true, []int{2, 8, 16, 22}},
	} {
		if got := firsts(c.c, c.f, c.unpaired); !slices.Equal(got, c.want) {
			t.Errorf("%s: %v, want %v", c.name, got, c.want)
		}
	}
	// The 64-candidate cases: count, first and last.
	for _, c := range []struct {
		c           string
		first, last int
	}{
		{"D", 4, 20 + 28*18},
		{"E", 8, 44 + 56*8},
		{"F", 2, 9 + 14*31},
		{"G", 2, 9 + 14*31},
	} {
		got := firsts(c.c, 28e9, false)
		if len(got) != 64 || got[0] != c.first || got[63] != c.last {
			t.Errorf("case %s: %d candidates from %d to %d, want 64 from %d to %d", c.c, len(got), got[0], got[len(got)-1], c.first, c.last)
		}
	}
	// Case D skips n = 4, 9, 14: no candidate starts at 4 + 28·4 = 116.
	if slices.Contains(firsts("D", 28e9, false), 116) {
		t.Error("case D has a candidate at symbol 116; n = 4 is not in TS 38.213 4.1")
	}
}

func ssbPlan() Plan {
	p := plan(40, part("data", 30, 30, 60), part("low", 15, 0, 40))
	p.Carrier.CenterMHz = fptr(3750)
	p.SSB = &SSBPlan{SCSKHz: 30, OffsetToPointA: 10, KSSB: 6, PeriodMs: 5, Bitmap: "11110000"}
	p.SpanMs = 10
	return p
}

func TestSSBBlocks(t *testing.T) {
	r := Compute(ssbPlan())
	if r.SSB == nil {
		t.Fatalf("no SSB; findings %v", r.Findings)
	}
	s := r.SSB
	// Subcarrier 0 of the block: 10 RBs of 180 kHz + 6 subcarriers of 15 kHz
	// from point A (TS 38.211 4.4.4.2, 7.4.3.1); 240 subcarriers of 30 kHz.
	if s.Case != "C" || s.Candidates != 8 || s.Low != 1875e3 || s.High != 9075e3 {
		t.Errorf("SSB case %s, L_max %d, %v to %v kHz; want C, 8, 1875 to 9075 kHz", s.Case, s.Candidates, s.Low.KHz(), s.High.KHz())
	}
	// Four blocks sent in each 5 ms half frame of the 10 ms span.
	var got []string
	for _, b := range s.Blocks {
		got = append(got, strings.Join([]string{itoa(b.Index), itoa(b.Slot), itoa(b.Symbol)}, "/"))
	}
	want := []string{"0/0/2", "1/0/8", "2/1/2", "3/1/8", "0/10/2", "1/10/8", "2/11/2", "3/11/8"}
	if !slices.Equal(got, want) {
		t.Errorf("blocks (index/slot/symbol) %v, want %v", got, want)
	}
	// Block 0 starts after the first two 30 kHz symbols: 71168 + 70144 Tc,
	// and lasts four symbols.
	if b := s.Blocks[0]; b.Start != 141312 || b.End != 141312+4*70144 {
		t.Errorf("block 0 at %d–%d Tc, want 141312–%d", b.Start, b.End, 141312+4*70144)
	}
	// The blocks sit on the 15 kHz partition (CRBs 0–39, up to 7192.5 kHz).
	if f := findCode(r, CodeSSBOverlap); f == nil || f.Partition != "low" {
		t.Errorf("want an ssb-overlap warning on partition low; got %v", r.Findings)
	}
}

func TestSSBRefused(t *testing.T) {
	for _, c := range []struct {
		name  string
		edit  func(*SSBPlan)
		field string
		say   string
	}{
		{"spacing", func(s *SSBPlan) { s.SCSKHz = 120 }, "ssb.scsKHz", "15 or 30"},
		{"case", func(s *SSBPlan) { s.Case = "A" }, "ssb.case", "B or C"},
		{"bitmap length", func(s *SSBPlan) { s.Bitmap = "1111" }, "ssb.bitmap", "8 characters"},
		{"period", func(s *SSBPlan) { s.PeriodMs = 7 }, "ssb.periodMs", "5, 10, 20"},
		{"k_SSB", func(s *SSBPlan) { s.KSSB = 24 }, "ssb.kSsb", "0 to 23"},
		{"beyond channel", func(s *SSBPlan) { s.OffsetToPointA = 210 }, "ssb.offsetToPointA", "beyond the channel"},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := ssbPlan()
			c.edit(p.SSB)
			r := Compute(p)
			for _, f := range r.Findings {
				if f.Code == CodeSSB && f.Severity == Error && f.Field == c.field && strings.Contains(f.Message, c.say) {
					return
				}
			}
			t.Errorf("want ssb error on %s saying %q; got:\n%s", c.field, c.say, describeFindings(r.Findings))
		})
	}
}

// A block on uplink symbols of the TDD pattern is reported.
func TestSSBOnUplink(t *testing.T) {
	p := ssbPlan()
	p.TDD = &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 0.5, UplinkSlots: 1}}
	if r := Compute(p); !slices.ContainsFunc(r.Findings, func(f Finding) bool {
		return f.Code == CodeSSB && strings.Contains(f.Message, "uplink")
	}) {
		t.Errorf("no warning for blocks on uplink symbols: %v", r.Findings)
	}
}

func itoa(n int) string { return strconv.Itoa(n) }
