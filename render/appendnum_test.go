package render

import (
	"math"
	"strconv"
	"testing"
)

// appendNum must write what strconv's shortest formatting writes, for
// every coordinate round10 can give and for values it never gives.
func TestAppendNumIsShortest(t *testing.T) {
	check := func(v float64) {
		t.Helper()
		if got, want := string(appendNum(nil, v)), strconv.FormatFloat(v, 'f', -1, 64); got != want {
			t.Fatalf("appendNum(%v) = %q, want %q", v, got, want)
		}
	}
	for k := -200000; k <= 200000; k++ {
		check(round10(float64(k) / 10))
		check(round10(float64(k)*0.37 + 0.049))
	}
	for _, v := range []float64{0.25, -0.05, 1e17, -1e300, math.Pi, 1.0 / 3, 123456789.1} {
		check(v)
	}
}
