package timing

import "testing"

// The walks are linear in the symbols of a cycle; the 0.625 ms pattern at
// 120 kHz is the longest common one (280 symbols per cycle).
func BenchmarkHARQRoundTrips(b *testing.B) {
	dir, _ := ExpandSlots("DDDSU", "DDDDDDDDDDFFUU")
	p := Pattern{Mu: 3, Dir: dir}
	tp, _ := TProc1(3, Cap1, DMRSPos0, Adders{})
	for b.Loop() {
		if _, err := HARQRoundTrips(p, tp, tp/2); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkUserPlaneLatency(b *testing.B) {
	dir, _ := ExpandSlots("DDDSU", "DDDDDDDDDDFFUU")
	c := LatencyConfig{Pattern: Pattern{Mu: 3, Dir: dir}, Dir: Downlink, Length: 2}
	for b.Loop() {
		if _, err := UserPlaneLatency(c); err != nil {
			b.Fatal(err)
		}
	}
}
