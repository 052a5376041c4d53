package planfile

import (
	"reflect"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/rrc"
)

// Value notation opens through Decode like a JSON or YAML plan.
func TestDecodeValueNotation(t *testing.T) {
	start := 26
	p := grid.Plan{
		Name:    "hook",
		Carrier: grid.CarrierPlan{BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{
			{Name: "video", SCSKHz: 30, StartCRB: &start, SizePRB: 50},
		},
	}
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	if f := Sniff(text); f != ValueNotation {
		t.Fatalf("Sniff = %v, want ValueNotation", f)
	}
	got, err := Decode(append([]byte("\ufeff"), text...))
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, p) {
		t.Errorf("Decode = %+v, want %+v", got, p)
	}
	// A log excerpt with a value gridloom does not read: the plan opens and
	// the note lists what was skipped.
	log := "-- from a log\n" + string(text) + "\nsib2 SIB2 ::= { cellReselectionInfoCommon { q-Hyst dB0 } }\n"
	_, notes, err := DecodeNotes([]byte(log))
	if err != nil {
		t.Fatal(err)
	}
	if len(notes) != 1 || !strings.Contains(notes[0], "sib2 SIB2 (line") {
		t.Errorf("notes %q, want one naming sib2 SIB2", notes)
	}
	_, err = Decode([]byte("mib MIB ::= {\n  ssb-SubcarrierOffset 16\n}\n"))
	if err == nil || !strings.Contains(err.Error(), "line 2, column 24") {
		t.Errorf("an out-of-range value: %v, want its line and column", err)
	}
	// A value standing alone starts with '{' like JSON; it opens all the same.
	bare := "{ servingCellConfigCommon { downlinkConfigCommon { frequencyInfoDL { scs-SpecificCarrierList {\n" +
		"  { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } } } } }"
	if q, err := Decode([]byte(bare)); err != nil || q.Carrier.BandwidthMHz != 40 {
		t.Errorf("a bare SIB1 value: %+v, %v; want a 40 MHz carrier", q.Carrier, err)
	}
	if f := Sniff([]byte("name: x\n")); f != YAML {
		t.Errorf("Sniff(YAML) = %v", f)
	}
}
