package rrc_test

import (
	"testing"

	"gridloom/grid/asn1v"
	"gridloom/grid/rrc"
)

// absoluteFrequencyPointA and absoluteFrequencySSB worked by hand for the
// 3 ms plan of extraPlans (20 MHz at 2600 MHz, one 30 kHz carrier of 51
// RBs, 15 kHz SS/PBCH blocks with offsetToPointA 2 and k_SSB 18):
//
//	point A = 2600 MHz − 51·12·30 kHz / 2 = 2600 − 9.18 = 2590.82 MHz
//	NR-ARFCN below 3 GHz = f / 5 kHz (TS 38.104 5.4.2.1) = 518164
//	SS/PBCH subcarrier 0 = point A + 2·12·15 kHz + 18·15 kHz = + 630 kHz
//	reference RE = subcarrier 120 (RE 0 of RB 10, TS 38.331 FrequencyInfoDL)
//	             = + 630 kHz + 120·15 kHz = point A + 2.43 MHz = 2593.25 MHz
//	NR-ARFCN = 2593.25 MHz / 5 kHz = 518650
func TestAbsoluteFrequenciesByHand(t *testing.T) {
	doc, err := rrc.Document(extraPlans()["tdd-3ms-low-band"])
	if err != nil {
		t.Fatal(err)
	}
	var freq *asn1v.Value
	for _, a := range doc.Assignments {
		if a.Type == "ServingCellConfigCommon" {
			freq = a.Value.Get("downlinkConfigCommon").Get("frequencyInfoDL")
		}
	}
	if freq == nil {
		t.Fatal("no ServingCellConfigCommon.downlinkConfigCommon.frequencyInfoDL written")
	}
	if got := freq.Get("absoluteFrequencyPointA"); got == nil || got.Int != 518164 {
		t.Errorf("absoluteFrequencyPointA = %+v, want 518164", got)
	}
	if got := freq.Get("absoluteFrequencySSB"); got == nil || got.Int != 518650 {
		t.Errorf("absoluteFrequencySSB = %+v, want 518650", got)
	}
}
