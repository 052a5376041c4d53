// Package prach holds the random-access (PRACH) rules of TS 38.211 clause 6.3.3
// and TS 38.213 clause 8.1 as exact data and pure integer arithmetic: the
// preamble formats, the three PRACH configuration tables, where each PRACH
// occasion of a configuration index falls in a radio frame (in Tc), which
// occasions are valid against a TDD pattern and the SS/PBCH blocks, how the
// blocks map onto the occasions, and the cell range each format and N_CS allow.
//
// The package imports nothing of the project so that package grid can import
// it. Time is a count of Tc = 1/(480000·4096) s (TS 38.211 4.1) held in an
// int64 whose name ends in Tc; κ = 64.
//
// The configuration tables are read from the text of TS 38.211 V18.7.0
// (Release 18) — no Release 17 text of them was found — and checked cell by
// cell against a second reading of that text (775 rows, none differ) and
// two base-station copies (768 rows each; one cell of OAI's differs and the
// text settles it). config.go says which Release 18 changes touch clause
// 6.3.3.2, which part of that was read and which inferred, and why the rows
// are taken to be Release 17's. The rules of TS 38.213
// clause 8.1 follow its Release 17 content (the later additions — SBFD,
// LTM candidate cells, preamble repetitions, shared spectrum — are left
// out). The additions that serve only NR-U and FR2-2 (L_RA = 571 and 1151,
// Δf^RA = 480 and 960 kHz) are not carried; asking for them is an error.
package prach
