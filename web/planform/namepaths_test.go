package planform

import (
	"testing"

	"gridloom/grid"
)

// TestNamePaths: the page names a finding's partition by its box's title and
// its field by the control's label (issue 19); what it cannot name stays.
func TestNamePaths(t *testing.T) {
	parts := []grid.PartitionPlan{{Name: "sensors"}, {Name: "lowlat"}, {}}
	for _, c := range []struct{ in, want string }{
		{"partitions[1].startCrb 20 overlaps partitions[0].", "Start CRB of 2 · lowlat 20 overlaps 1 · sensors."},
		{"partitions[0].scsKHz 45 is not a data subcarrier spacing of FR1.", "SCS (kHz) of 1 · sensors 45 is not a data subcarrier spacing of FR1."},
		{"partitions[2].sizePrb is too large.", "Size (PRB) of 3 is too large."},
		{"partitions[1].noSuchKey", "noSuchKey of 2 · lowlat"},
		{"partitions[7].startCrb is beyond the plan.", "partitions[7].startCrb is beyond the plan."},
		{"tdd.referenceScsKHz stays a path.", "tdd.referenceScsKHz stays a path."},
	} {
		if got := NamePaths(c.in, parts); got != c.want {
			t.Errorf("NamePaths(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
