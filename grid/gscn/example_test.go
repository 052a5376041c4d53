package gscn_test

import (
	"fmt"

	"gridloom/grid/gscn"
)

// SS_REF of a GSCN in each row of TS 38.101-1/-2 Table 5.4.3.1-1, and back.
func ExampleFrequency() {
	for _, g := range []int{5279, 8016, 22447} {
		f, _ := gscn.Frequency(g)
		back, on := gscn.FromFrequency(f)
		fmt.Println(g, float64(f)/1e6, "MHz", back, on)
	}
	// Output:
	// 5279 2112.05 MHz 5279 true
	// 8016 3744.48 MHz 8016 true
	// 22447 27550.56 MHz 22447 true
}

// n79's SS raster entries step by 16 GSCNs (TS 38.101-1 Table 5.4.3.3-1).
func ExampleLookup() {
	e, _ := gscn.Lookup("n79", 30)
	fmt.Println(e.Case, e.Range(), e.Contains(8496), e.Contains(8497), len(e.GSCNs()))
	// Output:
	// C 8480 – <16> – 8880 true false 26
}
