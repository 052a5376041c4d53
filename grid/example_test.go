package grid_test

import (
	"fmt"

	"gridloom/grid"
)

// A 40 MHz FR1 channel split between 15 and 30 kHz partitions.
func ExampleCompute() {
	start0, start26 := 0, 26
	res := grid.Compute(grid.Plan{
		Name:    "two numerologies",
		Carrier: grid.CarrierPlan{BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{
			{Name: "narrow", SCSKHz: 15, StartCRB: &start0, SizePRB: 48},
			{Name: "wide", SCSKHz: 30, StartCRB: &start26, SizePRB: 50},
		},
	})
	for _, c := range res.Carriers {
		fmt.Printf("%d kHz carrier: offsetToCarrier %d, %d PRBs, guards %v/%v kHz (min %v)\n",
			c.SCSKHz, c.OffsetToCarrier, c.CarrierBandwidth, c.GuardLow.KHz(), c.GuardHigh.KHz(), c.MinGuard.KHz())
	}
	for _, l := range res.Partitions {
		fmt.Printf("%s: %v to %v kHz, locationAndBandwidth %d, %d symbols\n",
			l.Name, l.Low.KHz(), l.High.KHz(), l.LocationAndBandwidth, l.SymbolCount())
	}
	// Output:
	// 15 kHz carrier: offsetToCarrier 0, 216 PRBs, guards 552.5/567.5 kHz (min 552.5)
	// 30 kHz carrier: offsetToCarrier 1, 106 PRBs, guards 905/935 kHz (min 905)
	// narrow: -7.5 to 8632.5 kHz, locationAndBandwidth 12925, 14 symbols
	// wide: 9345 to 27345 kHz, locationAndBandwidth 13500, 28 symbols
}

// The first symbols of a 30 kHz subframe: the longer cyclic prefix opens
// each half subframe.
func ExampleNumerology_SymbolAt() {
	n := grid.Numerology{Mu: 1}
	for _, k := range []int{0, 1, 13, 14} {
		s := n.SymbolAt(k)
		fmt.Printf("slot %d symbol %2d: start %6d Tc, CP %4d Tc (%.3f µs)\n", s.Slot, s.Symbol, s.Start, s.CP, s.CP.Micros())
	}
	// Output:
	// slot 0 symbol  0: start      0 Tc, CP 5632 Tc (2.865 µs)
	// slot 0 symbol  1: start  71168 Tc, CP 4608 Tc (2.344 µs)
	// slot 0 symbol 13: start 912896 Tc, CP 4608 Tc (2.344 µs)
	// slot 1 symbol  0: start 983040 Tc, CP 5632 Tc (2.865 µs)
}

func ExampleEncodeRIV() {
	riv, _ := grid.EncodeRIV(0, 273)
	start, length, _ := grid.DecodeRIV(riv)
	fmt.Println(riv, start, length)
	// Output: 1099 0 273
}

func ExampleARFCNFrequency() {
	f, _ := grid.ARFCNFrequency(650000)
	n, onRaster := grid.FrequencyARFCN(28000.08e6)
	fmt.Println(f.MHz(), n, onRaster)
	// Output: 3750 2079167 true
}

func ExamplePeakMbps() {
	mbps := grid.PeakMbps(grid.FR1, grid.DL, grid.Numerology{Mu: 1}, 273, 4, 8)
	fmt.Printf("%.0f Mbps\n", mbps)
	// Output: 2337 Mbps
}
