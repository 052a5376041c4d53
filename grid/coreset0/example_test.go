package coreset0_test

import (
	"fmt"

	"gridloom/grid/coreset0"
)

// A 30 kHz SS/PBCH block with a 30 kHz CORESET#0 in a band whose minimum
// channel bandwidth is 10 MHz: the MIB's pdcch-ConfigSIB1 picks the row and
// the monitoring occasions, offsetToPointA and k_SSB place it.
func Example() {
	band := coreset0.Band{FR: coreset0.FR1, MinChannelBandwidthMHz: 10}
	table, _ := coreset0.SelectTable(30, 30, band)
	coresetZero, searchSpaceZero := coreset0.SplitPDCCHConfigSIB1(0x24) // 0b0010_0100

	pos := coreset0.SSBPosition{FR: coreset0.FR1, CommonSCSkHz: 30, OffsetToPointA: 20, KSSB: 6}
	p, _ := coreset0.Place(table, coresetZero, pos)
	fmt.Printf("%v index %d: CRB %d to %d\n", table, coresetZero, p.FirstCRB, p.FirstCRB+p.NumRBs-1)

	for i := range 2 {
		o, _ := coreset0.Pattern1Occasion(coreset0.FR1, searchSpaceZero, 1, 2, i)
		fmt.Printf("SS/PBCH block %d: slots %d and %d of frames with SFN mod 2 = %d, symbols %d to %d\n",
			i, o.Slot, o.Slot+1, o.FrameParity, o.FirstSymbol, o.FirstSymbol+o.NumSymbols-1)
	}
	// Output:
	// Table 13-4 index 2: CRB 8 to 31
	// SS/PBCH block 0: slots 10 and 11 of frames with SFN mod 2 = 0, symbols 0 to 1
	// SS/PBCH block 1: slots 11 and 12 of frames with SFN mod 2 = 0, symbols 0 to 1
}
