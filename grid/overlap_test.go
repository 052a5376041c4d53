package grid

import (
	"slices"
	"testing"
)

// TestOverlapsAreFacts: Result.Overlaps holds the band each pair of
// overlapping partitions shares, from point A, marked an error when both
// send in the same direction, in the order of the overlap findings; pairs
// that do not touch give none.
func TestOverlapsAreFacts(t *testing.T) {
	// 15 kHz CRB k spans [180·k − 7.5, 180·(k+1) − 7.5) kHz from point A
	// (TS 38.211 4.4.4.3): a is CRBs 0–29, b 20–49, c 60–69 (apart), d
	// 25–34 uplink.
	ul := part("d", 15, 25, 10)
	ul.Direction = "UL"
	r := Compute(plan(40, part("a", 15, 0, 30), part("b", 15, 20, 30), part("c", 15, 60, 10), ul))
	khz := func(v float64) Hz { return Hz(v * 1000) }
	want := []Overlap{
		{A: 0, B: 1, Low: khz(20*180 - 7.5), High: khz(30*180 - 7.5), Error: true},
		{A: 0, B: 3, Low: khz(25*180 - 7.5), High: khz(30*180 - 7.5), Error: false},
		{A: 1, B: 3, Low: khz(25*180 - 7.5), High: khz(35*180 - 7.5), Error: false},
	}
	if !slices.Equal(r.Overlaps, want) {
		t.Errorf("overlaps %+v\nwant %+v", r.Overlaps, want)
	}
	n := 0
	for _, f := range r.Findings {
		if f.Code == CodeOverlap {
			n++
		}
	}
	if n != len(r.Overlaps) {
		t.Errorf("%d overlap findings for %d overlaps", n, len(r.Overlaps))
	}
	if r := Compute(plan(40, part("a", 15, 0, 30), part("b", 15, 30, 30))); len(r.Overlaps) != 0 {
		t.Errorf("partitions that meet edge to edge overlap: %+v", r.Overlaps)
	}
}
