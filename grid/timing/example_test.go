package timing_test

import (
	"fmt"

	"gridloom/grid/timing"
)

// Capability 1 shortens T_proc,1 with every step of μ up to 120 kHz and not
// beyond: N1 grows as fast as the symbols shrink.
func ExampleTProc1() {
	for _, mu := range []int{0, 1, 2, 3, 5, 6} {
		t, _ := timing.TProc1(mu, timing.Cap1, timing.DMRSPos0, timing.Adders{})
		fmt.Printf("%3d kHz: %v\n", 15<<mu, t)
	}
	// Output:
	//  15 kHz: 1122304 Tc (570.833 µs)
	//  30 kHz: 701440 Tc (356.771 µs)
	//  60 kHz: 596224 Tc (303.255 µs)
	// 120 kHz: 350720 Tc (178.385 µs)
	// 480 kHz: 350720 Tc (178.385 µs)
	// 960 kHz: 350720 Tc (178.385 µs)
}

// The trade of a higher numerology: lower latency, less range from the
// same two guard symbols. From 480 kHz on, two guard symbols do not even
// cover FR2's N_TA,offset, and the latency floor is the UE's processing
// (N1/2 on each side here), which capability 1 stops shortening at 120 kHz.
func ExampleProfiles() {
	ps, _ := timing.Profiles(timing.Cap1, timing.FR1NoCoexistence)
	fmt.Println("kHz  slot µs  K1  K2  DL slot µs  DL 2-symbol µs  2-symbol guard km")
	for _, p := range ps {
		fmt.Printf("%3d %8.1f %3d %3d %11.1f %15.1f %18.2f\n", p.SCSKHz, p.Slot.Micros(), p.K1, p.K2,
			p.SlotLatency.Mean*1e6/float64(timing.TcPerSecond),
			p.MiniSlotLatency.Mean*1e6/float64(timing.TcPerSecond), p.GuardRadius/1000)
	}
	// Output:
	// kHz  slot µs  K1  K2  DL slot µs  DL 2-symbol µs  2-symbol guard km
	//  15   1000.0   1   1      2070.8           754.5              19.44
	//  30    500.0   1   2      1106.8           448.6               8.74
	//  60    250.0   2   2       678.3           349.2               3.40
	// 120    125.0   2   3       365.9           201.3               1.62
	// 480     31.2   6  11       225.3           184.1               0.00
	// 960     15.6  12  21       201.8           181.3               0.00
}

// The HARQ round trip of every downlink slot of a DDDSU pattern at 30 kHz.
func ExampleHARQRoundTrips() {
	p := timing.Pattern{Mu: 1, Dir: []byte("DDDDDDDDDDDDDD" + "DDDDDDDDDDDDDD" + "DDDDDDDDDDDDDD" + "DDDDDDDDDDFFUU" + "UUUUUUUUUUUUUU")}
	tp, _ := timing.TProc1(1, timing.Cap1, timing.DMRSPos0, timing.Adders{})
	rt, _ := timing.HARQRoundTrips(p, tp, 0)
	for _, r := range rt.PerSlot {
		fmt.Printf("slot %d: K1 = %d, retransmission in slot %d, %v\n", r.Slot, r.Ack.K1, r.Retx, r.RTT)
	}
	// Output:
	// slot 0: K1 = 3, retransmission in slot 5, 4915200 Tc (2500.000 µs)
	// slot 1: K1 = 2, retransmission in slot 5, 3932160 Tc (2000.000 µs)
	// slot 2: K1 = 1, retransmission in slot 5, 2949120 Tc (1500.000 µs)
	// slot 3: K1 = 1, retransmission in slot 5, 1966080 Tc (1000.000 µs)
}
