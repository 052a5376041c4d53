package grid

// RIVSize is N_BWP^size = 275, which TS 38.331 sets for the
// locationAndBandwidth of a bandwidth part (BWP IE, and TS 38.214 5.1.2.2.2).
const RIVSize = 275

// MaxRIV is the largest locationAndBandwidth: N(N+1)/2 − 1 = 37949.
const MaxRIV = RIVSize*(RIVSize+1)/2 - 1

// EncodeRIV returns the resource indication value of TS 38.214 5.1.2.2.2 for
// a start RB_start and length L_RBs with N = 275:
//
//	if (L−1) ≤ ⌊N/2⌋: RIV = N(L−1) + RB_start
//	else:             RIV = N(N−L+1) + (N−1−RB_start)
//
// It reports false unless 1 ≤ L ≤ N − RB_start and RB_start ≥ 0.
func EncodeRIV(start, length int) (int, bool) {
	const n = RIVSize
	if start < 0 || length < 1 || length > n-start {
		return 0, false
	}
	if length-1 <= n/2 {
		return n*(length-1) + start, true
	}
	return n*(n-length+1) + (n - 1 - start), true
}

// DecodeRIV inverts EncodeRIV and reports false for a value outside 0…37949.
func DecodeRIV(riv int) (start, length int, ok bool) {
	const n = RIVSize
	if riv < 0 || riv > MaxRIV {
		return 0, 0, false
	}
	length = riv/n + 1
	start = riv % n
	if start+length > n {
		// The second branch of the encoding: RIV = N(N−L'+1) + (N−1−start').
		length = n - length + 2
		start = n - 1 - start
	}
	return start, length, true
}
