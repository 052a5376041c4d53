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
// All tables are those of 3GPP Release 17: TS 38.211 V17.x.0 and TS 38.213
// V17.x.0. The Release 16/17 additions that serve NR-U and FR2-2 only (L_RA =
// 571 and 1151, Δf^RA = 480 and 960 kHz, the FR1 unpaired indexes 256–262 of
// prach-ConfigurationIndex-v1610) are not transcribed; asking for them is an
// error that says so.
package prach
