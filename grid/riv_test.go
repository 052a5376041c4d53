package grid

import "testing"

// TS 38.214 5.1.2.2.2 with N = 275: the RIV is a bijection between all
// (start, length) pairs with start + length ≤ 275 and 0…37949.
func TestRIVRoundTripAll(t *testing.T) {
	seen := make([]bool, MaxRIV+1)
	count := 0
	for start := 0; start < RIVSize; start++ {
		for length := 1; start+length <= RIVSize; length++ {
			riv, ok := EncodeRIV(start, length)
			if !ok || riv < 0 || riv > MaxRIV {
				t.Fatalf("EncodeRIV(%d, %d) = %d, %v", start, length, riv, ok)
			}
			if seen[riv] {
				t.Fatalf("EncodeRIV(%d, %d) = %d twice", start, length, riv)
			}
			seen[riv] = true
			count++
			s, l, ok := DecodeRIV(riv)
			if !ok || s != start || l != length {
				t.Fatalf("DecodeRIV(%d) = %d, %d, %v; want %d, %d", riv, s, l, ok, start, length)
			}
		}
	}
	if count != 37950 {
		t.Errorf("%d RIV values, want 275·276/2 = 37950", count)
	}
}

func TestRIVExamples(t *testing.T) {
	// Values engineers put in locationAndBandwidth for a BWP over a whole
	// carrier from offsetToCarrier 0 (common practice, widely quoted; from
	// memory), each also worked by hand from TS 38.214 5.1.2.2.2.
	for _, c := range []struct{ start, length, riv int }{
		{0, 273, 1099},  // 100 MHz at 30 kHz: L−1 > 137, so 275·3 + 274
		{0, 106, 28875}, // 40 MHz at 30 kHz: 275·105
		{0, 51, 13750},  // 20 MHz at 30 kHz: 275·50
		{0, 24, 6325},   // 10 MHz at 30 kHz: 275·23
		{0, 275, 549},   // hand-worked: 275·1 + 274
		{274, 1, 274},   // hand-worked: 275·0 + 274
		{10, 138, 37685},
	} {
		got, ok := EncodeRIV(c.start, c.length)
		if !ok || got != c.riv {
			t.Errorf("EncodeRIV(%d, %d) = %d, %v; want %d", c.start, c.length, got, ok, c.riv)
		}
	}
}

func TestRIVRefuses(t *testing.T) {
	for _, c := range []struct{ start, length int }{{0, 0}, {-1, 5}, {200, 76}, {0, 276}} {
		if riv, ok := EncodeRIV(c.start, c.length); ok {
			t.Errorf("EncodeRIV(%d, %d) = %d, true; want refused", c.start, c.length, riv)
		}
	}
	for _, riv := range []int{-1, 37950, 1 << 40} {
		if s, l, ok := DecodeRIV(riv); ok {
			t.Errorf("DecodeRIV(%d) = %d, %d, true; want refused", riv, s, l)
		}
	}
}

// FuzzRIV: any value decodes only inside 0…37949, and then to a start and
// length that encode back to it (TS 38.214 5.1.2.2.2).
func FuzzRIV(f *testing.F) {
	for _, v := range []int{0, 1099, 13750, 37949, 37950, -1, 274, 275, 1 << 40} {
		f.Add(v)
	}
	f.Fuzz(func(t *testing.T, riv int) {
		start, length, ok := DecodeRIV(riv)
		if ok != (riv >= 0 && riv <= MaxRIV) {
			t.Fatalf("DecodeRIV(%d) ok = %v", riv, ok)
		}
		if !ok {
			return
		}
		if start < 0 || length < 1 || start+length > RIVSize {
			t.Fatalf("DecodeRIV(%d) = start %d, length %d: outside the %d RBs", riv, start, length, RIVSize)
		}
		if back, ok := EncodeRIV(start, length); !ok || back != riv {
			t.Fatalf("EncodeRIV(DecodeRIV(%d)) = %d, %v", riv, back, ok)
		}
	})
}
