// Package grid computes the time-frequency lattice of a 5G NR carrier split
// into partitions (bandwidth parts) of different numerologies, exactly as
// 3GPP defines it, and checks the plan.
//
// The package is pure: value types and functions, no I/O. Two units carry
// every number that the standards define exactly:
//
//   - Time is a count of Tc, the basic time unit of TS 38.211 clause 4.1,
//     Tc = 1/(480000·4096) s. One subframe is 1 966 080 Tc; every symbol start
//     and cyclic prefix of every numerology is a whole number of Tc.
//   - Frequency is a count of Hz. Subcarrier edges sit half a subcarrier
//     from a centre, so at 15 kHz they fall on multiples of 7.5 kHz, which is
//     a whole number of Hz.
//
// Relative frequencies are measured from point A (TS 38.211 4.4.4.2), the
// centre of subcarrier 0 of common resource block 0 of every subcarrier
// spacing. Frequency ranges are half-open intervals [Low, High).
//
// The entry point is Compute, which turns a Plan into a Result: the channel,
// one SCS-specific carrier per subcarrier spacing in use, one Lattice per
// partition, the Spectrum they leave in the channel (guardbands, unused
// spans, use) and the Findings. The JSON document of a Result is package
// grid/report's; the demo plans are package grid/demo's.
package grid
