package planform

import (
	"net/url"
	"testing"
)

// TestWithSetsKeys: a finder's row sets its keys in a copy and leaves the
// form it came from as it was.
func TestWithSetsKeys(t *testing.T) {
	f, _ := ParseQuery(url.Values{"bw": {"40"}, "ssb.gscn": {"7800"}})
	g := f.With(map[string]string{"ssb.gscn": "7812", "ia.coreset": "2", "no.such": "1"})
	if f.SSB.GSCN != "7800" {
		t.Errorf("the original form's GSCN changed to %q", f.SSB.GSCN)
	}
	if g.SSB.GSCN != "7812" || g.Init.CORESET != "2" || g.Bandwidth != "40" {
		t.Errorf("With: gscn %q, coreset %q, bw %q; want 7812, 2, 40", g.SSB.GSCN, g.Init.CORESET, g.Bandwidth)
	}
}
