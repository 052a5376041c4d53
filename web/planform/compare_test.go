package planform

import (
	"net/url"
	"strings"
	"testing"

	"gridloom/grid"
)

// campusTDD is a link side with the campus demo's pattern (TS 38.213 11.1
// fields: 15 kHz reference, 5 ms, 3 downlink slots, 10 downlink and 2 uplink
// symbols in the special slot, 1 uplink slot) and one partition.
const campusTDD = "name=x&range=FR1&bw=40&tdd.ref=15&tdd.ms=5&tdd.dl=3&tdd.dlsym=10&tdd.ul=1&tdd.ulsym=2&p0.name=p&p0.scs=30&p0.start=0&p0.size=50"

func compareLink(a, b, extra string) string {
	return JoinQuery(prefixQuery(a, "a."), prefixQuery(b, "b."), extra)
}

func TestFrameOffsetKey(t *testing.T) {
	for _, tc := range []struct {
		extra       string
		want        float64
		bad         bool
		swapped     string // b.frameOffsetUs of the swapped link
		conflictsOK bool
	}{
		{extra: "", want: 0, swapped: "", conflictsOK: true},
		{extra: "b.frameOffsetUs=1000", want: 1000, swapped: "-1000", conflictsOK: true},
		{extra: "b.frameOffsetUs=-2500.5", want: -2500.5, swapped: "2500.5", conflictsOK: true},
		{extra: "b.frameOffsetUs=20001", bad: true, swapped: "20001"},
		{extra: "b.frameOffsetUs=abc", bad: true, swapped: "abc"},
		{extra: "b.frameOffsetUs=NaN", bad: true, swapped: "NaN"},
	} {
		t.Run(tc.extra, func(t *testing.T) {
			c, _ := ReadCompare(compareLink(campusTDD, campusTDD, tc.extra))
			if tc.bad {
				if c.FrameOffsetErr == "" || !c.Invalid() || !strings.Contains(c.FrameOffsetErr, "b.frameOffsetUs") || !strings.Contains(c.FrameOffsetErr, "20000") {
					t.Errorf("%s: message %q, invalid %v; want a sentence naming the key and the range", tc.extra, c.FrameOffsetErr, c.Invalid())
				}
			} else if c.FrameOffsetErr != "" || c.FrameOffsetUs != tc.want {
				t.Errorf("%s: read %g (%q), want %g", tc.extra, c.FrameOffsetUs, c.FrameOffsetErr, tc.want)
			}
			// The link keeps the key as typed, and the swap turns it round.
			q, _ := url.ParseQuery(c.Query())
			if got, want := q.Get(KeyFrameOffset), strings.TrimPrefix(tc.extra, "b.frameOffsetUs="); got != want {
				t.Errorf("%s: the link holds %q", tc.extra, got)
			}
			s, _ := url.ParseQuery(c.SwapQuery())
			if got := s.Get(KeyFrameOffset); got != tc.swapped {
				t.Errorf("%s: the swapped link holds %q, want %q", tc.extra, got, tc.swapped)
			}
			if _, why, ok := c.CrossLink(); ok != tc.conflictsOK || (!ok && why == "") {
				t.Errorf("%s: CrossLink ok %v, why %q", tc.extra, ok, why)
			}
		})
	}
}

// TestCrossLinkOfTheComparison: the same pattern against itself is aligned
// at offset 0 and conflicts at 1 ms. Worked by hand on 15 kHz symbols (70
// per 5 ms: D 0–51, F 52–53, U 54–69): B one slot later has U on 0–13 and
// 68–69, D on 14–65, so A's D meets B's U on 0–13 (1 ms) and A's U meets
// B's D on 54–65: 10 symbols of 140288 Tc and 2 of 141312 (the first of a
// half subframe, TS 38.211 5.3.1), 1685504 Tc; with the 1966080 of the first,
// 3651584 Tc per 5 ms.
func TestCrossLinkOfTheComparison(t *testing.T) {
	c, _ := ReadCompare(compareLink(campusTDD, campusTDD, ""))
	x, _, ok := c.CrossLink()
	if !ok || len(x.Conflicts) != 0 || x.Total != 0 {
		t.Errorf("aligned: ok %v, %d conflicts, total %d Tc; want none", ok, len(x.Conflicts), x.Total)
	}
	c, _ = ReadCompare(compareLink(campusTDD, campusTDD, "b.frameOffsetUs=1000"))
	x, _, ok = c.CrossLink()
	if !ok || len(x.Conflicts) != 2 || x.Total != 3651584 || x.PerTenMs != 2*3651584 {
		t.Fatalf("1 ms: ok %v, %+v; want 2 conflicts, 3651584 Tc per 5 ms", ok, x)
	}
	if k := x.Conflicts[0]; k.Start != 0 || k.End != grid.TcPerSubframe || k.A != grid.Downlink || k.B != grid.Uplink {
		t.Errorf("first conflict %+v, want [0, 1 ms) A downlink B uplink", k)
	}

	// A side without TDD: no list, and the sentence says which.
	noTDD := "name=x&range=FR1&bw=40&p0.name=p&p0.scs=30&p0.start=0&p0.size=50"
	c, _ = ReadCompare(compareLink(campusTDD, noTDD, ""))
	if _, why, ok := c.CrossLink(); ok || !strings.Contains(why, "Plan B has no TDD pattern") {
		t.Errorf("B without TDD: ok %v, %q", ok, why)
	}
}
