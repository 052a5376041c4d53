package rrc_test

import (
	"fmt"

	"gridloom/grid/coreset0"
	"gridloom/grid/rrc"
)

// The MIB of a 30 kHz FR1 cell at SFN 612, CORESET#0 index 12, for
// SS/PBCH block 3 of 8.
func ExampleEncodeMIB() {
	m := rrc.MIB{SFN: 612, SubCarrierSpacingCommon: coreset0.SCS30or120, KSSB: 21,
		DMRSTypeAPosition: coreset0.Pos2, ControlResourceSetZero: 12}
	bits, err := rrc.EncodeMIB(m, rrc.PBCHTiming{FR: coreset0.FR1, LMax: 8, SSBIndex: 3})
	if err != nil {
		panic(err)
	}
	fmt.Print(bits)
	// Output:
	// BCCH-BCH-Message, X.691 unaligned PER, 24 bits: 010011010101011000000100 (hex 4D5604)
	//   0       message (CHOICE)                         0         mib, alternative 0 of 2
	//   1-6     systemFrameNumber                        100110    SFN 612: its 6 MSBs (38)
	//   7       subCarrierSpacingCommon                  1         scs30or120
	//   8-11    ssb-SubcarrierOffset                     0101      5 (k_SSB 21)
	//   12      dmrs-TypeA-Position                      0         pos2
	//   13-16   pdcch-ConfigSIB1.controlResourceSetZero  1100      12
	//   17-20   pdcch-ConfigSIB1.searchSpaceZero         0000      0
	//   21      cellBarred                               1         notBarred
	//   22      intraFreqReselection                     0         allowed
	//   23      spare                                    0         0
	// PBCH payload bits outside the MIB (TS 38.212 7.1.1), after the 24:
	//   A+0     4th LSB of SFN                           0
	//   A+1     3rd LSB of SFN                           1
	//   A+2     2nd LSB of SFN                           0
	//   A+3     1st LSB of SFN                           0
	//   A+4     half frame bit                           0
	//   A+5     MSB of k_SSB                             1
	//   A+6     reserved                                 0
	//   A+7     reserved                                 0
}
