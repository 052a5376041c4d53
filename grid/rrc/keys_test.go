package rrc

import (
	"reflect"
	"slices"
	"strings"
	"testing"

	"gridloom/grid"
)

func jsonKeys(t reflect.Type) []string {
	var out []string
	for f := range t.Fields() {
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if name != "" && name != "-" {
			out = append(out, name)
		}
	}
	return out
}

// TestEveryPlanKeyTravels fails when a plan key is added that the value
// notation would lose: each key of grid.Plan, CarrierPlan, SSBPlan and
// PartitionPlan must be a row of planKeys or partitionKeys, whose notes
// carry it when no RRC field does. Adding a key (carrier.band,
// ssb.gscn, initialAccess.*, prach.*) means adding its row here and, if 38.331 has
// a field for it, writing and reading that field in build and read.
func TestEveryPlanKeyTravels(t *testing.T) {
	var plan []string
	for _, k := range planKeys {
		plan = append(plan, k.key)
	}
	var part []string
	for _, k := range partitionKeys {
		part = append(part, k.key)
	}
	check := func(keys []string, prefix string, rows []string) {
		for _, k := range keys {
			if !slices.Contains(rows, prefix+k) {
				t.Errorf("plan key %s%s has no row in notes.go: a plan that sets it would not read back", prefix, k)
			}
		}
	}
	for _, k := range jsonKeys(reflect.TypeFor[grid.Plan]()) {
		switch k {
		case "carrier", "ssb", "partitions", "initialAccess", "prach":
			continue // their keys are checked below
		}
		check([]string{k}, "", plan)
	}
	check(jsonKeys(reflect.TypeFor[grid.CarrierPlan]()), "carrier.", plan)
	check(jsonKeys(reflect.TypeFor[grid.SSBPlan]()), "ssb.", plan)
	check(jsonKeys(reflect.TypeFor[grid.InitialAccessPlan]()), "initialAccess.", plan)
	check(jsonKeys(reflect.TypeFor[grid.PRACHPlan]()), "prach.", plan)
	check(jsonKeys(reflect.TypeFor[grid.PartitionPlan]()), "", part)
}
