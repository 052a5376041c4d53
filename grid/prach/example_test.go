package prach_test

import (
	"fmt"

	"gridloom/grid/prach"
)

// Index 160 of TS 38.211 Table 6.3.3.2-3 (format B4) at 30 kHz: one occasion
// in the second slot of subframe 9, from symbol 2 of that slot.
func ExampleOccasions() {
	occ, err := prach.Occasions(prach.FR1Unpaired, 160, 0, 1)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, o := range occ {
		fmt.Printf("format %v, slot %d, symbol %d, %d symbols, start %d Tc, guard %d Tc\n",
			o.Format, o.Slot, o.Symbol, o.Duration, o.StartTc, o.GuardTc())
	}
	// Output:
	// format B4, slot 19, symbol 16, 12 symbols, start 18819072 Tc, guard 25344 Tc
}

func ExampleLookup() {
	s, _ := prach.TableFor(1, true)
	c, _ := prach.Lookup(s, 27)
	fmt.Printf("Table %s index 27: format %v, n_SFN mod %d = %v, subframes %v\n", s.Table(), c.Format, c.X, c.Y, c.Slots)
	_, err := prach.Lookup(s, 300)
	fmt.Println(err)
	// Output:
	// Table 6.3.3.2-2 index 27: format 0, n_SFN mod 1 = [0], subframes [0 1 2 3 4 5 6 7 8 9]
	// prach-ConfigurationIndex is 300; TS 38.211 Table 6.3.3.2-2 defines 0 to 255
}
