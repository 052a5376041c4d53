package prach

import (
	"strings"
	"testing"
)

// TestAssociationPatternPeriod works TS 38.213 clause 8.1's association
// pattern period by hand: the least number of frames that holds a whole
// number of association periods and after which the carrier's frames look
// the same again, at most 160 ms.
func TestAssociationPatternPeriod(t *testing.T) {
	for _, tc := range []struct {
		name              string
		assoc, repeat, pp int
	}{
		// Index with x = 1 and one configuration period mapping every block,
		// every frame alike (paired spectrum): the pattern is one 10 ms
		// association period, the case TS 38.211 6.3.3.2 calls an association
		// pattern period of 10 ms.
		{"every frame alike", 1, 1, 1},
		// The same index on unpaired spectrum with blocks every 20 ms that
		// change which occasions are valid: frames 0 and 1 differ, so the
		// pattern is two association periods, 20 ms.
		{"blocks every 20 ms", 1, 2, 2},
		// x = 2 and two configuration periods (40 ms) with blocks every
		// 20 ms: 40 is already a multiple of 20, so one association period.
		{"association period covers the block period", 4, 2, 4},
		// x = 1, one period, blocks every 160 ms: 16 association periods,
		// the 160 ms the clause allows at most.
		{"blocks every 160 ms", 1, 16, 16},
		// x = 16 (160 ms), a 20 ms TDD pattern: 160 ms.
		{"longest configuration period", 16, 2, 16},
	} {
		got, err := AssociationPatternPeriod(tc.assoc, tc.repeat)
		if err != nil || got != tc.pp {
			t.Errorf("%s: AssociationPatternPeriod(%d, %d) = %d, %v; want %d", tc.name, tc.assoc, tc.repeat, got, err, tc.pp)
		}
		if got%tc.assoc != 0 {
			t.Errorf("%s: %d frames hold no whole number of %d-frame association periods", tc.name, got, tc.assoc)
		}
	}
	// Periods NR never has, to see the 160 ms limit and the inputs checked:
	// lcm(16, 3) = 48 frames = 480 ms.
	for _, tc := range []struct {
		assoc, repeat int
		want          string
	}{
		{16, 3, "480 ms, beyond the 160 ms"},
		{0, 1, "allows 1 to 16"},
		{32, 1, "allows 1 to 16"},
		{1, 0, "at least 1"},
	} {
		if _, err := AssociationPatternPeriod(tc.assoc, tc.repeat); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("AssociationPatternPeriod(%d, %d) error = %v, want one containing %q", tc.assoc, tc.repeat, err, tc.want)
		}
	}
}
