package demo

import (
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
)

// Every demo plan decodes and computes without an error finding: they are
// what a new user sees first.
func TestAll(t *testing.T) {
	plans, err := All()
	if err != nil {
		t.Fatal(err)
	}
	if want := []string{"campus", "port", "stadium"}; !slices.Equal(Names(), want) {
		t.Errorf("Names() = %v, want %v", Names(), want)
	}
	if len(plans) != len(Names()) || !slices.Contains(Names(), Default) {
		t.Fatalf("%d plans for names %v; default %q", len(plans), Names(), Default)
	}
	for _, p := range plans {
		if r := grid.Compute(p.Plan); r.HasErrors() {
			t.Errorf("demo plan %s: %v", p.Name, r.Findings)
		}
	}
}

func TestUnknown(t *testing.T) {
	_, err := Load("../campus")
	if err == nil || !strings.Contains(err.Error(), "campus, port or stadium") {
		t.Errorf("Load of an unknown name: %v; want a sentence naming the plans", err)
	}
}
