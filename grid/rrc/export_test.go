package rrc

import "gridloom/grid"

// Enumerations returns, for the tests, the enumeration values the reader
// and writer use, each in gridloom's order, keyed by the field (or type)
// whose ENUMERATED or CHOICE they spell.
func Enumerations() map[string][]string {
	out := map[string][]string{}
	for _, s := range scsNames {
		out["SubcarrierSpacing"] = append(out["SubcarrierSpacing"], s.name)
	}
	for _, p := range tddPeriods {
		key := "dl-UL-TransmissionPeriodicity"
		if p.v1530 {
			key += "-v1530"
		}
		out[key] = append(out[key], p.name)
	}
	for _, ms := range ssbPeriods {
		out["ssb-PeriodicityServingCell"] = append(out["ssb-PeriodicityServingCell"], ssbPeriodName(ms))
	}
	for _, n := range []int{1, 2, 4, 8} {
		out["msg1-FDM"] = append(out["msg1-FDM"], msg1FDMNames[n])
	}
	out["restrictedSetConfig"] = restrictedSetNames
	for _, k := range []string{"1/8", "1/4", "1/2", "1", "2", "4", "8", "16"} {
		out["ssb-perRACH-OccasionAndCB-PreamblesPerSSB"] = append(out["ssb-perRACH-OccasionAndCB-PreamblesPerSSB"], ssbPerROChoices[k])
	}
	out["n-TimingAdvanceOffset"] = grid.NTAOffsets
	return out
}
