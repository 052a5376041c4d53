package grid

import (
	"math"
	"strings"
	"testing"
)

// The 5 ms "DDDDDDDSUU" pattern at 30 kHz with a 6:4:4 special slot — a
// pattern in common use on 3.5 GHz TDD carriers (common practice, from
// memory) — written as TDD-UL-DL-Pattern fields (TS 38.331).
func dddddddsuu() *TDDPlan {
	return &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 5, DownlinkSlots: 7, DownlinkSymbols: 6, UplinkSlots: 2, UplinkSymbols: 4}}
}

func TestTDDOn30And60kHz(t *testing.T) {
	p := plan(100, part("dl30", 30, 0, 100), part("dl60", 60, 60, 60))
	p.TDD = dddddddsuu()
	r := Compute(p)
	if r.HasErrors() || r.TDD == nil {
		t.Fatalf("findings %v", r.Findings)
	}
	if got := r.TDD.SlotString(); got != "DDDDDDDSUU" {
		t.Errorf("slots %q, want DDDDDDDSUU", got)
	}
	if r.Plan.SpanMs != 5 || r.Partitions[0].SpanMs != 5 {
		t.Errorf("span %d ms, want the 5 ms period", r.Partitions[0].SpanMs)
	}
	p.SpanMs = 10
	r = Compute(p)
	dirString := func(l Lattice, slot int) string {
		per := l.Numerology.SymbolsPerSlot()
		var b strings.Builder
		for _, d := range l.Dirs[slot*per : (slot+1)*per] {
			b.WriteString(d.String())
		}
		return b.String()
	}
	// TS 38.213 11.1: slot 7 holds 6 downlink symbols, 4 flexible, 4 uplink.
	l30, l60 := r.Partitions[0], r.Partitions[1]
	for _, c := range []struct {
		l    Lattice
		slot int
		want string
	}{
		{l30, 0, "DDDDDDDDDDDDDD"},
		{l30, 7, "DDDDDDFFFFUUUU"},
		{l30, 8, "UUUUUUUUUUUUUU"},
		{l30, 19, "UUUUUUUUUUUUUU"}, // the second period, last slot
		// At 60 kHz each 30 kHz symbol is two: reference slot 7 becomes
		// 60 kHz slots 14 (reference symbols 0–6) and 15 (7–13).
		{l60, 14, "DDDDDDDDDDDDFF"},
		{l60, 15, "FFFFFFUUUUUUUU"},
		{l60, 13, "DDDDDDDDDDDDDD"},
	} {
		if got := dirString(c.l, c.slot); got != c.want {
			t.Errorf("%s slot %d: %s, want %s", c.l.Name, c.slot, got, c.want)
		}
	}
	// Downlink share: 7·14 + 6 = 104 of 140 symbols, the same at both spacings.
	for _, l := range r.Partitions {
		if math.Abs(l.Share-104.0/140) > 1e-12 {
			t.Errorf("%s: downlink share %v, want 104/140", l.Name, l.Share)
		}
	}
	full := PeakMbps(FR1, DL, l30.Numerology, 100, 1, 6)
	if math.Abs(l30.PeakMbps-full*104/140) > 0.01 {
		t.Errorf("TDD-scaled rate %v, want %v·104/140", l30.PeakMbps, full)
	}
}

// An extended-CP 60 kHz symbol (40960 Tc) does not fit the 30 kHz symbol
// grid, so where downlink meets uplink with no flexible symbol between, one
// straddles the change: downlink ends 983040 + 71168 + 6·70144 = 1475072 Tc
// into the period, 36.01 extended symbols.
func TestTDDStraddle(t *testing.T) {
	tdd := &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 1, DownlinkSlots: 1, DownlinkSymbols: 7, UplinkSymbols: 7}}
	p := plan(100, with(part("ext", 60, 0, 20), func(pp *PartitionPlan) { pp.CP = "extended" }), part("normal", 60, 40, 20))
	p.TDD = tdd
	r := Compute(p)
	var got []string
	for _, f := range r.Findings {
		if f.Code == CodeTDDStraddle {
			got = append(got, f.Partition)
		}
	}
	if len(got) != 1 || got[0] != "ext" {
		t.Errorf("straddle findings for %v, want only the extended-CP partition", got)
	}
}

func TestTDDRefused(t *testing.T) {
	ok := part("a", 30, 0, 50)
	for _, c := range []struct {
		name  string
		tdd   TDDPlan
		parts []PartitionPlan
		field string
		say   string
	}{
		// TS 38.213 11.1: P = 0.625 ms only for μref = 3 (a whole number of slots).
		{"0.625 ms at 30 kHz", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 0.625}}, []PartitionPlan{ok}, "tdd.pattern1.periodMs", "use 0.5, 1, 2, 2.5, 3, 4, 5 or 10 ms"},
		{"period not listed", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 1.5}}, []PartitionPlan{ok}, "tdd.pattern1.periodMs", "dl-UL-TransmissionPeriodicity"},
		{"3 ms alone", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 3}}, []PartitionPlan{ok}, "tdd.pattern1.periodMs", "does not divide 20 ms"},
		{"too many slots", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 2.5, DownlinkSlots: 6}}, []PartitionPlan{ok}, "tdd.pattern1.downlinkSlots", "0 to 5"},
		{"symbol 14", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 2.5, DownlinkSymbols: 14}}, []PartitionPlan{ok}, "tdd.pattern1.downlinkSymbols", "0 to 13"},
		{"D and U overfill", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 2.5, DownlinkSlots: 3, DownlinkSymbols: 10, UplinkSlots: 2}}, []PartitionPlan{ok}, "tdd.pattern1.uplinkSlots", "more than the 70 symbols"},
		{"reference not in range", TDDPlan{ReferenceSCSKHz: 120, Pattern1: TDDPattern{PeriodMs: 1}}, []PartitionPlan{ok}, "tdd.referenceScsKHz", "15, 30 or 60"},
		{"partition below reference", TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 5, DownlinkSlots: 7}}, []PartitionPlan{part("slow", 15, 0, 10)}, "partitions[0].scsKHz", "below tdd.referenceScsKHz 30"},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := plan(40, c.parts...)
			tdd := c.tdd
			p.TDD = &tdd
			r := Compute(p)
			for _, f := range r.Findings {
				if f.Code == CodeTDD && f.Severity == Error && f.Field == c.field && strings.Contains(f.Message, c.say) {
					return
				}
			}
			t.Errorf("want tdd error on %s saying %q; got:\n%s", c.field, c.say, describeFindings(r.Findings))
		})
	}
	// Two patterns whose sum divides 20 ms are accepted (TS 38.213 11.1).
	p := plan(40, ok)
	p.TDD = &TDDPlan{ReferenceSCSKHz: 30, Pattern1: TDDPattern{PeriodMs: 3, DownlinkSlots: 4}, Pattern2: &TDDPattern{PeriodMs: 2, UplinkSlots: 2}}
	if r := Compute(p); r.HasErrors() || r.TDD.SlotString() != "DDDDSSSSUU" || r.Partitions[0].SpanMs != 5 {
		t.Errorf("3 + 2 ms: findings %v, slots %q", r.Findings, r.TDD.SlotString())
	}
}
