// Package coreset0 holds the initial-access rules of TS 38.213 clause 13 as
// plain data and integer functions: which CORESET#0 table applies to an SS/PBCH
// block and common subcarrier spacing, the CORESET#0 rows of Tables 13-1 to
// 13-10 (with 13-1A and 13-4A for shared spectrum), where CORESET#0 sits on the
// common resource block grid, when the Type0-PDCCH common search space is
// monitored (Tables 13-11 to 13-15), and the MIB fields that carry all of it.
//
// It imports nothing of the project, so that package grid can build initial
// access on top of it without a cycle.
//
// # Release
//
// Every table is pinned to Release 17 of TS 38.213 (the V17.x.0 versions).
// The values were read from a later-release text of clause 13 (it
// already carries Release 18's Table 13-0 for 3 MHz channels and the FR2-NTN
// wording). A quotation of the Release 17 opening of clause 13 confirms the
// set of tables: 13-1 to 13-10 without shared spectrum in FR1 and FR2-1,
// 13-1A and 13-4A with shared spectrum in FR1, 13-10A for FR2-2, and 13-11 to
// 13-15A for the occasions. That the rows read the same in V17.x.0 is from
// memory: none of them changed in Release 18. The FR2-2 tables (13-10A,
// 13-12A and 13-15A, for 120, 480 and 960 kHz in FR2-2) are not carried
// here; SelectTable refuses FR2-2 spacings.
//
// # Units
//
// Subcarrier spacings are in kHz. Frequencies are integer Hz measured from
// point A, the centre of subcarrier 0 of common resource block 0 (TS 38.211
// 4.4.4.2). Resource block offsets count RBs of the CORESET's own subcarrier
// spacing, as the tables do. Slots count slots of the CORESET's numerology
// within a frame; symbols count OFDM symbols of normal cyclic prefix within a
// slot, 0 to 13.
package coreset0
