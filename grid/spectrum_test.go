package grid

import (
	"slices"
	"testing"
)

// The channel splits into its guardbands, the unused stretches and what the
// partitions cover, and nothing else.
func checkSplit(t *testing.T, name string, r Result) {
	t.Helper()
	s, ch := r.Spectrum, r.Channel
	total := s.LowGuard.Width() + s.HighGuard.Width() + s.UnusedWidth() + s.Used
	if total != ch.High-ch.Low {
		t.Errorf("%s: guards %v + %v, unused %v and used %v kHz make %v kHz, want the channel's %v kHz", name,
			s.LowGuard.Width().KHz(), s.HighGuard.Width().KHz(), s.UnusedWidth().KHz(), s.Used.KHz(), total.KHz(), (ch.High - ch.Low).KHz())
	}
}

// 216 PRBs at 15 kHz in 40 MHz (TS 38.101-1 Table 5.3.2-1): the lower guard
// is the minimum guardband of Table 5.3.3-1, 552.5 kHz, the upper one a
// subcarrier more (Table 5.4.2.2-1 puts the centre on subcarrier 0 of PRB
// 108); 216·12·15 kHz = 38.88 MHz is used. Worked by hand.
func TestSpectrumFullCarrier(t *testing.T) {
	r := Compute(plan(40, part("all", 15, 0, 216)))
	s := r.Spectrum
	if s.LowGuard.Width() != 552500 || s.HighGuard.Width() != 567500 {
		t.Errorf("guards %v / %v kHz, want 552.5 / 567.5 kHz", s.LowGuard.Width().KHz(), s.HighGuard.Width().KHz())
	}
	if s.LowGuard.Low != r.Channel.Low || s.HighGuard.High != r.Channel.High {
		t.Errorf("guards %v and %v do not start at the channel edges %v, %v", s.LowGuard, s.HighGuard, r.Channel.Low, r.Channel.High)
	}
	if s.Used != 38_880_000 || len(s.Unused) != 0 {
		t.Errorf("used %v kHz, unused %v; want 38880 kHz and none", s.Used.KHz(), s.Unused)
	}
	if len(s.Guards()) != 2 {
		t.Errorf("Guards() = %v, want both", s.Guards())
	}
	checkSplit(t, "full", r)
}

// A hole of 20 PRBs between two partitions of one spacing is unused
// spectrum, from the lower edge of CRB 100 to that of CRB 120 (TS 38.211
// 4.4.4.3 edges), and the free run a new partition would take.
func TestSpectrumHoleAndFreeRun(t *testing.T) {
	r := Compute(plan(40, part("a", 15, 0, 100), part("b", 15, 120, 96)))
	want := []Span{{CRBEdge(15, 100), CRBEdge(15, 120)}}
	if !slices.Equal(r.Spectrum.Unused, want) {
		t.Errorf("unused %v, want %v", r.Spectrum.Unused, want)
	}
	if r.Spectrum.UnusedWidth() != 3_600_000 {
		t.Errorf("unused %v kHz, want 20·12·15 = 3600 kHz", r.Spectrum.UnusedWidth().KHz())
	}
	checkSplit(t, "hole", r)
	if start, size, ok := r.FreeRun(15); !ok || start != 100 || size != 20 {
		t.Errorf("FreeRun(15) = %d, %d, %v; want CRBs 100 to 119", start, size, ok)
	}
	if _, _, ok := r.FreeRun(30); ok {
		t.Errorf("FreeRun(30) found a run without a 30 kHz carrier")
	}
}

// A full carrier leaves no free CRB: the proposal is one CRB just above the
// highest partition, whose upper edge is the lower edge of CRB 216.
func TestFreeRunFull(t *testing.T) {
	r := Compute(plan(40, part("all", 15, 0, 216)))
	if start, size, ok := r.FreeRun(15); !ok || start != 216 || size != 1 {
		t.Errorf("FreeRun(15) = %d, %d, %v; want 216, 1", start, size, ok)
	}
	for _, f := range []Hz{CRBEdge(15, 216), CRBEdge(15, 216) - 1, CRBEdge(15, 216) + 1} {
		n := firstCRBAbove(15, f)
		if CRBEdge(15, n) < f || CRBEdge(15, n-1) >= f {
			t.Errorf("firstCRBAbove(15, %v) = %d: edge %v, the one below %v", f, n, CRBEdge(15, n), CRBEdge(15, n-1))
		}
	}
}

// Partitions of another spacing keep one PRB of the wider spacing away
// (common practice, the numerology gap): beside a 30 kHz partition from
// 30 kHz CRB 50, 15 kHz CRBs within 360 kHz of its edges are not free.
func TestFreeRunNumerologyGap(t *testing.T) {
	p := plan(40, part("a", 15, 0, 50), part("b", 30, 50, 50))
	r := Compute(p)
	start, size, ok := r.FreeRun(15)
	if !ok {
		t.Fatalf("no 15 kHz carrier: %v", r.Findings)
	}
	var b Lattice
	for _, l := range r.Partitions {
		if l.Name == "b" {
			b = l
		}
	}
	lo, hi := CRBEdge(15, start), CRBEdge(15, start+size)
	if lo < b.High+360_000 && hi > b.Low-360_000 {
		t.Errorf("FreeRun(15) = %d, %d: %v to %v kHz comes within 360 kHz of b (%v to %v kHz)", start, size, lo.KHz(), hi.KHz(), b.Low.KHz(), b.High.KHz())
	}
	// By hand: b starts at 50·360 − 15 = 17 985 kHz; 15 kHz CRB 96 ends at
	// 97·180 − 7.5 = 17 452.5 kHz, below 17 985 − 360, and CRB 97 would not.
	// Above b only CRBs 202 to 215 are free, a shorter run.
	if start != 50 || size != 47 {
		t.Errorf("FreeRun(15) = %d, %d; want CRBs 50 to 96", start, size)
	}
	checkSplit(t, "mixed", r)
}

// With no partition the whole channel is unused and no guardband is drawn.
func TestSpectrumEmpty(t *testing.T) {
	r := Compute(plan(40))
	if len(r.Spectrum.Guards()) != 0 || !slices.Equal(r.Spectrum.Unused, []Span{{r.Channel.Low, r.Channel.High}}) {
		t.Errorf("spectrum %+v, want the whole channel unused", r.Spectrum)
	}
	checkSplit(t, "empty", r)
}

// A partition beyond the channel's upper edge counts only up to the edge.
func TestSpectrumBeyondChannel(t *testing.T) {
	r := Compute(plan(40, part("a", 15, 0, 100), part("far", 15, 260, 10)))
	if r.Spectrum.HighGuard.Width() != 0 {
		t.Errorf("upper guard %v kHz, want 0: a partition reaches beyond the edge", r.Spectrum.HighGuard.Width().KHz())
	}
	checkSplit(t, "beyond", r)
}

func TestSpacingsAndBandwidths(t *testing.T) {
	p := Plan{Carrier: CarrierPlan{Range: "fr2-1"}, Partitions: []PartitionPlan{
		{SCSKHz: 120}, {SCSKHz: 60}, {SCSKHz: 120}, {SCSKHz: 15}}}
	if got := p.SCSInUse(); !slices.Equal(got, []int{60, 120}) {
		t.Errorf("SCSInUse = %v, want [60 120]: 15 kHz carries no data in FR2-1 (TS 38.101-2 Table 5.3.2-1)", got)
	}
	for _, c := range []struct {
		in   string
		want Range
		ok   bool
	}{{"", FR1, true}, {"fr2-2", FR2_2, true}, {"FR2-1", FR2_1, true}, {"FR3", 0, false}} {
		if got, ok := LookupRange(c.in); ok != c.ok || (ok && got != c.want) {
			t.Errorf("LookupRange(%q) = %v, %v; want %v, %v", c.in, got, ok, c.want, c.ok)
		}
	}
	// TS 38.101-1 Table 5.3.5-1: 15 kHz goes up to 50 MHz, 60 kHz starts at
	// 10 MHz; together they share the bandwidths from 10 to 50 MHz that both list.
	got := FR1.CommonBandwidths([]int{15, 60})
	for _, bw := range FR1.AllBandwidths() {
		both := slices.Contains(FR1.Bandwidths(15), bw) && slices.Contains(FR1.Bandwidths(60), bw)
		if slices.Contains(got, bw) != both {
			t.Errorf("CommonBandwidths(15, 60) = %v: %d MHz wrongly in or out", got, bw)
		}
	}
	if slices.Contains(got, 5) || slices.Contains(got, 60) || !slices.Contains(got, 10) || !slices.Contains(got, 50) {
		t.Errorf("CommonBandwidths(15, 60) = %v, want 10 to 50 MHz", got)
	}
	if !slices.Equal(FR1.CommonBandwidths(nil), FR1.AllBandwidths()) {
		t.Errorf("CommonBandwidths(nil) is not every FR1 bandwidth")
	}
}
