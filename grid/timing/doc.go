// Package timing holds the time rules of NR that decide how fast a numerology
// can answer: the UE processing times N1 and N2 (TS 38.214 5.3 and 6.4), the
// earliest HARQ-ACK and PUSCH slots a TDD pattern allows, the user-plane
// latency in the structure of the IMT-2020 evaluation (ITU-R M.2412,
// 3GPP TR 37.910), the guard period against the cell range (TS 38.211
// 4.3.1, TS 38.133 7.1.2) and the BWP switching delay (TS 38.133 8.6).
//
// Why it exists: a higher numerology has shorter symbols and slots, hence
// lower latency, but a shorter cyclic prefix and guard, hence less
// coverage. These functions put numbers on both sides of that trade.
//
// The package is a leaf: it imports nothing of the project, so package grid
// can import it. Time is a count of Tc = 1/(480000·4096) s with κ = 64
// (TS 38.211 4.1), as in package grid; every duration the standards define
// exactly is a whole number of Tc. Only means over a distribution (the
// average latency) are fractional and carried as float64 Tc.
//
// Release: the tables are pinned to 3GPP Release 17. The exact V17.x.0
// documents were not at hand; the TS 38.214 and TS 38.213 cells were read in
// a stored Release 18 text of those clauses, whose rows are those of
// Release 17 (from memory: Rel-18 added the d3 and d4 terms to T_proc, which
// this package leaves out as Release 17 has them not), and compared cell by
// cell with OpenAirInterface's copy; TS 38.211 Table 4.3.2-3 likewise. The
// TS 38.133 values (N_TA,offset, BWP switch delay, the RRC switch's 6 ms)
// are from memory, compared with srsRAN_Project's and OpenAirInterface's
// copies; the text of TS 38.133 and of TR 37.910 was not at hand. testdata/ holds those copies and
// reference_test.go counts the cells. Each table's doc comment names its
// clause and what is absent.
//
// Normal cyclic prefix only: TS 38.214 applies the same T_proc to extended
// CP, but the symbol lattice here is the normal-CP one.
package timing
