package grid

import (
	"fmt"
	"testing"
)

// The walk must give SymbolAt's symbols, one by one, over the longest span.
func TestSymbolWalkIsSymbolAt(t *testing.T) {
	for _, n := range allNumerologies() {
		w := walkSymbols(n)
		for k := 0; k < MaxSpanMs*n.SymbolsPerSubframe(); k++ {
			if want := n.SymbolAt(k); w.sym != want || w.k != k {
				t.Fatalf("%v: step %d of the walk is symbol %d %+v, want %+v", n, k, w.k, w.sym, want)
			}
			w.next()
		}
	}
}

// directionsByDefinition is TDD.Directions as its doc comment reads, with
// SymbolAt for every symbol: the reference the walk is checked against.
func directionsByDefinition(t TDD, l Lattice) (dirs []SymbolDir, straddles []int) {
	dir := func(k int) SymbolDir { return t.RefDirs[k%len(t.RefDirs)] }
	for i := range l.SymbolCount() {
		s := l.Numerology.SymbolAt(i)
		var d SymbolDir
		hasD, hasU := false, false
		// From the first reference symbol of the half subframe that holds
		// the symbol's start, where every numerology starts a symbol.
		k0 := int(s.Start/TcPerHalfFrame) * (7 << t.Reference.Mu)
		for k := k0; t.Reference.SymbolAt(k).Start < s.End(); k++ {
			if t.Reference.SymbolAt(k).End() <= s.Start {
				continue
			}
			dk := dir(k)
			hasD = hasD || dk == Downlink
			hasU = hasU || dk == Uplink
			switch {
			case d == NoDir:
				d = dk
			case d != dk:
				d = Flexible
			}
		}
		dirs = append(dirs, d)
		if hasD && hasU {
			straddles = append(straddles, i)
		}
	}
	return dirs, straddles
}

// tddCases are patterns on every reference spacing with every period that
// fits it, with uneven splits, so that runs change inside slots.
func tddCases(t *testing.T) []TDD {
	t.Helper()
	var out []TDD
	for _, rng := range []Range{FR1, FR2_1, FR2_2} {
		for _, scs := range rng.DataSCS() {
			for _, ms := range TDDPeriodsMs {
				p := &TDDPlan{ReferenceSCSKHz: scs, Pattern1: TDDPattern{PeriodMs: ms, DownlinkSlots: 1, DownlinkSymbols: 5, UplinkSymbols: 3}}
				var fs findings
				if tdd, ok := checkTDD(&fs, rng, p); ok {
					out = append(out, tdd)
				}
			}
			p := &TDDPlan{ReferenceSCSKHz: scs, Pattern1: TDDPattern{PeriodMs: 3, DownlinkSlots: 2, DownlinkSymbols: 7, UplinkSlots: 1, UplinkSymbols: 1},
				Pattern2: &TDDPattern{PeriodMs: 2, DownlinkSlots: 1, UplinkSymbols: 4}}
			var fs findings
			if tdd, ok := checkTDD(&fs, rng, p); ok {
				out = append(out, tdd)
			}
		}
	}
	if len(out) < 20 {
		t.Fatalf("only %d TDD patterns checked", len(out))
	}
	return out
}

func TestDirectionsMatchDefinition(t *testing.T) {
	for _, tdd := range tddCases(t) {
		for _, n := range allNumerologies() {
			if n.Mu < tdd.Reference.Mu {
				continue
			}
			for _, span := range []int{1, 3, 10} {
				l := Lattice{Numerology: n, SpanMs: span}
				name := fmt.Sprintf("%s per %d Tc on %v, %v over %d ms", tdd.SlotString(), tdd.Period, tdd.Reference, n, span)
				dirs, straddles := tdd.Directions(l)
				wantDirs, wantStraddles := directionsByDefinition(tdd, l)
				if string(dirsText(dirs)) != string(dirsText(wantDirs)) {
					t.Fatalf("%s: directions\n%s\nwant\n%s", name, dirsText(dirs), dirsText(wantDirs))
				}
				if fmt.Sprint(straddles) != fmt.Sprint(wantStraddles) {
					t.Fatalf("%s: straddles %v, want %v", name, straddles, wantStraddles)
				}
				// The share from the span's directions, as Compute takes it,
				// is Share's whenever the span holds a period.
				if per := tdd.symbolsPerPeriod(n); per <= len(dirs) {
					for _, d := range []SymbolDir{Downlink, Uplink} {
						if got, want := shareOf(dirs[:per], d), tdd.Share(l, d); got != want {
							t.Errorf("%s: share of %v from the span %v, Share says %v", name, d, got, want)
						}
					}
				}
			}
		}
	}
}

func dirsText(dirs []SymbolDir) []byte {
	b := make([]byte, len(dirs))
	for i, d := range dirs {
		b[i] = byte(d)
		if d == NoDir {
			b[i] = '.'
		}
	}
	return b
}

// The uplink check of the SS/PBCH blocks must warn about exactly the
// candidates that share time with an uplink reference symbol in some
// SS/PBCH period. The definition here walks twelve 5 ms periods (60 ms, a
// multiple of every TDD period P+P2 in the cases), more than the check needs.
func TestSSBUplinkCheckMatchesDefinition(t *testing.T) {
	for _, tdd := range tddCases(t) {
		for _, c := range ssbCases {
			mu, _ := MuForSCS(c.scsKHz)
			n := Numerology{Mu: mu}
			if n.Mu < tdd.Reference.Mu && c.scsKHz < 120 {
				continue
			}
			var s SSB
			s.Numerology, s.Low, s.High, s.PeriodMs = n, 0, 1, 5
			for k := 0; k+3 < 5*n.SymbolsPerSubframe(); k += 2 {
				s.first = append(s.first, k)
				s.sent = append(s.sent, k%6 != 4) // leave some out of the bitmap
			}
			var fs findings
			checkSSBOverlaps(&fs, s, nil, &tdd)
			var want []int
		candidates:
			for i, sym := range s.first {
				if !s.sent[i] {
					continue
				}
				for m := range 12 {
					off := Tc(m) * 5 * TcPerSubframe
					start, end := off+n.SymbolAt(sym).Start, off+n.SymbolAt(sym+3).End()
					k0 := int(start/TcPerHalfFrame) * (7 << tdd.Reference.Mu)
					for k := k0; tdd.Reference.SymbolAt(k).Start < end; k++ {
						rs := tdd.Reference.SymbolAt(k)
						if rs.End() > start && tdd.RefDirs[k%len(tdd.RefDirs)] == Uplink {
							want = append(want, i)
							continue candidates
						}
					}
				}
			}
			var got []int
			for _, f := range fs {
				var idx int
				if _, err := fmt.Sscanf(f.Message, "SS/PBCH block %d", &idx); err != nil {
					t.Fatalf("finding %q: %v", f.Message, err)
				}
				got = append(got, idx)
			}
			if fmt.Sprint(got) != fmt.Sprint(want) {
				t.Fatalf("case %s on %s per %d Tc: warned blocks %v, want %v", c.name, tdd.SlotString(), tdd.Period, got, want)
			}
		}
	}
}
