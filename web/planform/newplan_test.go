package planform

import (
	"net/url"
	"testing"

	"gridloom/grid"
)

// TestNewPlanIsValid: the plan "New plan" opens computes without an error
// or a warning, one partition filling the 30 kHz carrier of a 20 MHz
// channel (N_RB 51, TS 38.101-1 Table 5.3.2-1), and travels through the
// page's query unchanged.
func TestNewPlanIsValid(t *testing.T) {
	p := NewPlan()
	r := grid.Compute(p)
	for _, f := range r.Findings {
		if f.Severity != grid.Info {
			t.Errorf("the new plan has a finding: %v", f)
		}
	}
	if len(r.Partitions) != 1 {
		t.Fatalf("%d partitions placed, want 1", len(r.Partitions))
	}
	c, ok := r.Carrier(30)
	if !ok || r.Partitions[0].SizePRB != 51 || c.CarrierBandwidth != 51 || r.Partitions[0].StartCRB != c.OffsetToCarrier {
		t.Errorf("partition at CRB %d, %d PRBs; carrier %+v: want the whole 51-PRB carrier", r.Partitions[0].StartCRB, r.Partitions[0].SizePRB, c)
	}
	v, err := url.ParseQuery(FormOf(p).Query())
	if err != nil {
		t.Fatal(err)
	}
	back, msgs := ParseQuery(v)
	if len(msgs) != 0 {
		t.Errorf("the new plan's query reads with messages %v", msgs)
	}
	if got := back.Query(); got != FormOf(p).Query() {
		t.Errorf("the query does not travel: %q then %q", FormOf(p).Query(), got)
	}
}
