package rrc

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
)

// The ASN.1 names of TS 38.331 (Release 17, V17.1.0) that gridloom
// reads and writes; testdata/reference/rrc/ts38331-v17.1.0-types.asn has
// the type definitions, TestValuesFollowTS38331Types checks every value the
// writer emits against them and TestEnumerationsAreTS38331 the lists below.

// scsNames is SubcarrierSpacing (TS 38.331 6.3.2), kHz15 … kHz960-v1700.
var scsNames = []struct {
	kHz  int
	name string
}{{15, "kHz15"}, {30, "kHz30"}, {60, "kHz60"}, {120, "kHz120"}, {240, "kHz240"}, {480, "kHz480-v1700"}, {960, "kHz960-v1700"}}

func scsName(kHz int) string {
	for _, s := range scsNames {
		if s.kHz == kHz {
			return s.name
		}
	}
	return ""
}

func scsKHz(name string) (int, bool) {
	for _, s := range scsNames {
		if s.name == name {
			return s.kHz, true
		}
	}
	return 0, false
}

func scsList() string {
	names := make([]string, len(scsNames))
	for i, s := range scsNames {
		names[i] = s.name
	}
	return strings.Join(names, ", ")
}

// tddPeriods is dl-UL-TransmissionPeriodicity and its -v1530 extension
// (TDD-UL-DL-Pattern, TS 38.331 6.3.2).
var tddPeriods = []struct {
	ms    float64
	name  string
	v1530 bool
}{
	{0.5, "ms0p5", false}, {0.625, "ms0p625", false}, {1, "ms1", false}, {1.25, "ms1p25", false},
	{2, "ms2", false}, {2.5, "ms2p5", false}, {5, "ms5", false}, {10, "ms10", false},
	{3, "ms3", true}, {4, "ms4", true},
}

func tddPeriodName(ms float64) (name string, v1530, ok bool) {
	for _, p := range tddPeriods {
		if p.ms == ms {
			return p.name, p.v1530, true
		}
	}
	return "", false, false
}

func tddPeriodMs(name string, v1530 bool) (float64, bool) {
	for _, p := range tddPeriods {
		if p.name == name && p.v1530 == v1530 {
			return p.ms, true
		}
	}
	return 0, false
}

func tddPeriodList(v1530 bool) string {
	var names []string
	for _, p := range tddPeriods {
		if p.v1530 == v1530 {
			names = append(names, p.name)
		}
	}
	return strings.Join(names, ", ")
}

// ssbPeriods is ssb-PeriodicityServingCell of ServingCellConfigCommonSIB.
var ssbPeriods = []int{5, 10, 20, 40, 80, 160}

func ssbPeriodName(ms int) string { return "ms" + strconv.Itoa(ms) }

func ssbPeriodMs(name string) (int, bool) {
	ms, err := strconv.Atoi(strings.TrimPrefix(name, "ms"))
	if err != nil || !strings.HasPrefix(name, "ms") || !slices.Contains(ssbPeriods, ms) || name != ssbPeriodName(ms) {
		return 0, false
	}
	return ms, true
}

func ssbPeriodList() string {
	names := make([]string, len(ssbPeriods))
	for i, ms := range ssbPeriods {
		names[i] = ssbPeriodName(ms)
	}
	return strings.Join(names, ", ")
}

// Value ranges of the INTEGER fields read (TS 38.331).
const (
	maxBWPID     = 4       // BWP-Id ::= INTEGER (0..maxNrofBWPs), maxNrofBWPs = 4
	maxRIV       = 37949   // BWP locationAndBandwidth
	maxARFCN     = 3279165 // ARFCN-ValueNR
	maxSlots     = 320     // nrofDownlinkSlots, nrofUplinkSlots: 0..maxNrofSlots
	maxSymbol    = 13      // nrofDownlinkSymbols, nrofUplinkSymbols: 0..maxNrofSymbols-1
	maxOffset    = 2199    // offsetToPointA, offsetToCarrier
	maxCarrierBW = 275     // carrierBandwidth 1..maxNrofPhysicalResourceBlocks
	maxBand      = 1024    // FreqBandIndicatorNR ::= INTEGER (1..1024)
	maxBands     = 8       // frequencyBandList: SIZE (1..maxNrofMultiBands), maxNrofMultiBands = 8
)

func rangeMsg(name string, lo, hi int) string {
	return fmt.Sprintf("%s must be an INTEGER from %d to %d (TS 38.331).", name, lo, hi)
}
