package planfile

import (
	"reflect"
	"strings"
	"testing"

	"gridloom/grid"
)

// full is a plan with every field of every struct set to a value other
// than its zero, so a round trip shows that the walk reads every key the
// structs write.
func full() grid.Plan {
	i := func(v int) *int { return &v }
	f := func(v float64) *float64 { return &v }
	return grid.Plan{Name: "all", SpanMs: 2,
		Carrier: grid.CarrierPlan{Range: "FR1", Band: "n78", BandwidthMHz: 40, CenterMHz: f(3750), ARFCN: i(650000),
			OffsetToCarrier: map[int]int{15: 1}, CarrierBandwidth: map[int]int{15: 200}, NTAOffset: "n39936"},
		Partitions: []grid.PartitionPlan{{Name: "p", SCSKHz: 15, CP: "normal", StartCRB: i(1), SizePRB: 10,
			LocationAndBandwidth: i(9), Direction: "UL", Layers: 2, Modulation: "256QAM", UECapability: 2, DMRSAdditionalPosition: "pos0"}},
		NumerologyGapKHz: f(180),
		TDD: &grid.TDDPlan{ReferenceSCSKHz: 15,
			Pattern1: grid.TDDPattern{PeriodMs: 5, DownlinkSlots: 3, DownlinkSymbols: 6, UplinkSlots: 1, UplinkSymbols: 4},
			Pattern2: &grid.TDDPattern{PeriodMs: 1, DownlinkSlots: 1, DownlinkSymbols: 1, UplinkSlots: 1, UplinkSymbols: 1}},
		SSB:         &grid.SSBPlan{SCSKHz: 30, Case: "C", Bitmap: "1010", OffsetToPointA: 4, KSSB: 2, ScsCommonKHz: 30, PeriodMs: 20, GSCN: i(8016)},
		Environment: &grid.EnvironmentPlan{DelaySpreadNs: 300, DelayProfile: "nominal", SpeedKmh: 120, CarrierMHz: 3500, CellRadiusKm: 5, LatencyTargetMs: 1},
		InitialAccess: &grid.InitialAccessPlan{ControlResourceSetZero: 2, SearchSpaceZero: 4, DMRSTypeAPosition: "pos3",
			InitialDownlinkBWP: &grid.InitialBWPPlan{Partition: "p", StartCRB: i(3), SizePRB: 24, LocationAndBandwidth: i(7),
				SubcarrierSpacingKHz: 30, CyclicPrefix: "normal"},
			InitialUplinkBWP: &grid.InitialBWPPlan{Partition: "q", StartCRB: i(4), SizePRB: 25, LocationAndBandwidth: i(8),
				SubcarrierSpacingKHz: 15, CyclicPrefix: "extended"}},
		PRACH: &grid.PRACHPlan{ConfigurationIndex: 98, Msg1SubcarrierSpacing: 30, Msg1FDM: 2, Msg1FrequencyStart: 3,
			ZeroCorrelationZoneConfig: 12, RestrictedSetConfig: "unrestrictedSet", SSBPerRachOccasion: "1/2"},
	}
}

// zeroFields names the fields of v, a struct, that hold their zero value,
// following pointers, slices and the structs within.
func zeroFields(v reflect.Value, path string) []string {
	switch v.Kind() {
	case reflect.Pointer:
		if v.IsNil() {
			return []string{path}
		}
		return zeroFields(v.Elem(), path)
	case reflect.Slice:
		if v.Len() == 0 {
			return []string{path}
		}
		return zeroFields(v.Index(0), path+"[0]")
	case reflect.Struct:
		var out []string
		for i := range v.NumField() {
			out = append(out, zeroFields(v.Field(i), path+"."+v.Type().Field(i).Name)...)
		}
		return out
	}
	if v.IsZero() {
		return []string{path}
	}
	return nil
}

// Every field the structs write is read back, in both syntaxes: a field
// added to grid.Plan without a line in the walk fails here.
func TestEveryFieldRoundTrips(t *testing.T) {
	p := full()
	if z := zeroFields(reflect.ValueOf(p), "Plan"); len(z) > 0 {
		t.Fatalf("full() leaves %s at zero: set them, or the round trip proves nothing about them", strings.Join(z, ", "))
	}
	for name, enc := range map[string]func(grid.Plan) ([]byte, error){"json": EncodeJSON, "yaml": EncodeYAML} {
		b, err := enc(p)
		if err != nil {
			t.Fatal(err)
		}
		back, err := Decode(b)
		if err != nil {
			t.Fatalf("%s: %v\n%s", name, err, b)
		}
		if !reflect.DeepEqual(back, p) {
			t.Errorf("%s round trip lost a field:\n got %+v\nwant %+v", name, back, p)
		}
	}
}

// The keys read from the tags are the ones the messages always listed, in
// the same order (README, plan file reference).
func TestKeysFromTags(t *testing.T) {
	for _, c := range []struct {
		got  []string
		want string
	}{
		{keys.plan, "name spanMs carrier partitions numerologyGapKHz tdd ssb environment initialAccess prach"},
		{keys.carrier, "range band bandwidthMHz centerMHz arfcn offsetToCarrier carrierBandwidth nTaOffset"},
		{keys.partition, "name scsKHz cp startCrb sizePrb locationAndBandwidth direction layers modulation ueCapability dmrsAdditionalPosition"},
		{keys.tdd, "referenceScsKHz pattern1 pattern2"},
		{keys.tddPattern, "periodMs downlinkSlots downlinkSymbols uplinkSlots uplinkSymbols"},
		{keys.ssb, "scsKHz case bitmap offsetToPointA kSsb scsCommonKHz periodMs gscn"},
		{keys.environment, "delaySpreadNs delayProfile speedKmh carrierMHz cellRadiusKm latencyTargetMs"},
		{keys.initialAccess, "controlResourceSetZero searchSpaceZero dmrsTypeAPosition initialDownlinkBWP initialUplinkBWP"},
		{keys.initialBWP, "partition startCrb sizePrb locationAndBandwidth subcarrierSpacing cyclicPrefix"},
		{keys.prach, "configurationIndex msg1SubcarrierSpacing msg1FDM msg1FrequencyStart zeroCorrelationZoneConfig restrictedSetConfig ssbPerRachOccasion"},
	} {
		if got := strings.Join(c.got, " "); got != c.want {
			t.Errorf("keys %q, want %q", got, c.want)
		}
	}
	_, err := DecodeJSON([]byte(`{"carrier": {"bandwidth": 40}}`))
	want := `carrier.bandwidth: unknown key "bandwidth"; the keys here are range, band, bandwidthMHz, centerMHz, arfcn, offsetToCarrier, carrierBandwidth, nTaOffset. Did you mean bandwidthMHz?`
	if err == nil || err.Error() != want {
		t.Errorf("unknown key: %v\nwant %s", err, want)
	}
}

func TestTagKeysRefusesDisagreement(t *testing.T) {
	type bad struct {
		A int `json:"a" yaml:"b"`
	}
	defer func() {
		if recover() == nil {
			t.Error("tagKeys accepted a field whose json and yaml keys differ")
		}
	}()
	tagKeys(reflect.TypeFor[bad]())
}
