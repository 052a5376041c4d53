package grid_test

import (
	"fmt"

	"gridloom/grid"
)

// A 30 kHz SS/PBCH block 60 RBs of 15 kHz above point A and
// pdcch-ConfigSIB1 0x20: row 2 of TS 38.213 Table 13-4 and row 0 of Table
// 13-11.
func ExampleCompute_initialAccess() {
	res := grid.Compute(grid.Plan{
		Carrier:       grid.CarrierPlan{BandwidthMHz: 40},
		SSB:           &grid.SSBPlan{SCSKHz: 30, OffsetToPointA: 60, Bitmap: "11000000"},
		Partitions:    []grid.PartitionPlan{{Name: "cell", SCSKHz: 30, SizePRB: 106}},
		InitialAccess: &grid.InitialAccessPlan{ControlResourceSetZero: 2, SearchSpaceZero: 0},
	})
	ia := res.InitialAccess
	c := ia.CORESET0
	fmt.Printf("Table %s row %d: %d RBs, %d symbols, CRBs %d to %d\n", c.Table, c.Index, c.NRB, c.Symbols, c.StartCRB, c.StartCRB+c.NRB-1)
	for _, o := range ia.Occasions {
		fmt.Printf("block %d: slot %d, symbols %d to %d\n", o.SSBIndex, o.Slot, o.FirstSymbol, o.FirstSymbol+o.Symbols-1)
	}
	fmt.Printf("pdcch-ConfigSIB1 %d, %s\n", ia.MIB.PDCCHConfigSIB1, ia.MIB.SubCarrierSpacingCommon)
	// Output:
	// Table 13-4 row 2: 24 RBs, 2 symbols, CRBs 28 to 51
	// block 0: slot 0, symbols 0 to 1
	// block 0: slot 1, symbols 0 to 1
	// block 1: slot 1, symbols 0 to 1
	// block 1: slot 2, symbols 0 to 1
	// pdcch-ConfigSIB1 32, scs30or120
}

// 5 MHz with a 30 kHz common spacing has room for no CORESET#0.
func ExampleFindInitialAccess() {
	found, _ := grid.FindInitialAccess(grid.Plan{
		Carrier:    grid.CarrierPlan{BandwidthMHz: 5},
		SSB:        &grid.SSBPlan{SCSKHz: 15, ScsCommonKHz: 30},
		Partitions: []grid.PartitionPlan{{Name: "cell", SCSKHz: 30, SizePRB: 11}},
	}, "")
	fmt.Println(len(found.Options))
	fmt.Println(found.Why)
	// Output:
	// 0
	// The narrowest CORESET#0 of Table 13-2 is 24 RBs of 30 kHz (8640 kHz), wider than the 30 kHz carrier of 11 PRBs (3960 kHz); choose a smaller subCarrierSpacingCommon or a wider channel.
}
