package coreset0

import "fmt"

// FR is the frequency range an SS/PBCH block is in. It decides the units of
// k_SSB and offsetToPointA (TS 38.211 7.4.3.1, 4.4.4.2) and which tables apply.
type FR uint8

// The frequency ranges of TS 38.104 5.1. FR2 here means FR2-1 (24.25–52.6 GHz);
// FR2-2 has tables of its own that this package does not carry.
const (
	FR1 FR = 1
	FR2 FR = 2
)

// String returns "FR1" or "FR2".
func (f FR) String() string {
	switch f {
	case FR1:
		return "FR1"
	case FR2:
		return "FR2"
	}
	return fmt.Sprintf("FR(%d)", uint8(f))
}

// Table names one of the CORESET#0 tables of TS 38.213 clause 13. The zero
// value names none.
type Table uint8

// The CORESET#0 tables of TS 38.213 clause 13, Release 17.
const (
	Table13_1  Table = iota + 1 // {15, 15} kHz, minimum channel bandwidth 5 or 10 MHz
	Table13_1A                  // {15, 15} kHz, shared spectrum channel access
	Table13_2                   // {15, 30} kHz, minimum channel bandwidth 5 or 10 MHz
	Table13_3                   // {30, 15} kHz, minimum channel bandwidth 5 or 10 MHz
	Table13_4                   // {30, 30} kHz, minimum channel bandwidth 5 or 10 MHz
	Table13_4A                  // {30, 30} kHz, shared spectrum channel access
	Table13_5                   // {30, 15} kHz, minimum channel bandwidth 40 MHz
	Table13_6                   // {30, 30} kHz, minimum channel bandwidth 40 MHz
	Table13_7                   // {120, 60} kHz
	Table13_8                   // {120, 120} kHz
	Table13_9                   // {240, 60} kHz
	Table13_10                  // {240, 120} kHz
	tableEnd
)

// Tables lists every CORESET#0 table in the order the clause prints them.
func Tables() []Table {
	out := make([]Table, 0, tableEnd-1)
	for t := Table13_1; t < tableEnd; t++ {
		out = append(out, t)
	}
	return out
}

type tableInfo struct {
	name              string
	ssbKHz, pdcchKHz  int
	fr                FR
	shared            bool
	minBandwidthsText string
	rows              *[16]Row
}

var tableInfos = [tableEnd]tableInfo{
	Table13_1:  {"Table 13-1", 15, 15, FR1, false, "5 or 10 MHz", &table13_1},
	Table13_1A: {"Table 13-1A", 15, 15, FR1, true, "", &table13_1A},
	Table13_2:  {"Table 13-2", 15, 30, FR1, false, "5 or 10 MHz", &table13_2},
	Table13_3:  {"Table 13-3", 30, 15, FR1, false, "5 or 10 MHz", &table13_3},
	Table13_4:  {"Table 13-4", 30, 30, FR1, false, "5 or 10 MHz", &table13_4},
	Table13_4A: {"Table 13-4A", 30, 30, FR1, true, "", &table13_4A},
	Table13_5:  {"Table 13-5", 30, 15, FR1, false, "40 MHz", &table13_5},
	Table13_6:  {"Table 13-6", 30, 30, FR1, false, "40 MHz", &table13_6},
	Table13_7:  {"Table 13-7", 120, 60, FR2, false, "", &table13_7},
	Table13_8:  {"Table 13-8", 120, 120, FR2, false, "", &table13_8},
	Table13_9:  {"Table 13-9", 240, 60, FR2, false, "", &table13_9},
	Table13_10: {"Table 13-10", 240, 120, FR2, false, "", &table13_10},
}

func (t Table) valid() bool { return t >= Table13_1 && t < tableEnd }

// String returns the table's number as TS 38.213 prints it, "Table 13-4A".
func (t Table) String() string {
	if !t.valid() {
		return fmt.Sprintf("Table(%d)", uint8(t))
	}
	return tableInfos[t].name
}

// SSBSCSkHz returns the SS/PBCH block subcarrier spacing the table is for.
func (t Table) SSBSCSkHz() int {
	if !t.valid() {
		return 0
	}
	return tableInfos[t].ssbKHz
}

// PDCCHSCSkHz returns the CORESET#0 subcarrier spacing the table is for:
// subCarrierSpacingCommon in FR1 and FR2-1 (TS 38.213 13).
func (t Table) PDCCHSCSkHz() int {
	if !t.valid() {
		return 0
	}
	return tableInfos[t].pdcchKHz
}

// FR returns the frequency range the table belongs to.
func (t Table) FR() FR {
	if !t.valid() {
		return 0
	}
	return tableInfos[t].fr
}

// Rows returns a copy of the table's 16 rows, indexed by controlResourceSetZero.
func (t Table) Rows() [16]Row {
	if !t.valid() {
		return [16]Row{}
	}
	return *tableInfos[t].rows
}

// Row is one row of a CORESET#0 table, in the spec's column order. A row with
// Pattern 0 is a reserved index.
type Row struct {
	// Pattern is the SS/PBCH block and CORESET multiplexing pattern, 1, 2 or 3.
	Pattern int
	// NumRBs is N_RB^CORESET: 12, 24, 48 or 96 RBs of the CORESET's SCS.
	NumRBs int
	// NumSymbols is N_symb^CORESET, 1 to 3.
	NumSymbols int
	// Offset is the offset in RBs of the CORESET's SCS from the CORESET's
	// first RB to the common RB overlapping the SS/PBCH block's first RB,
	// for k_SSB = 0.
	Offset int
	// OffsetKSSBPositive is the same offset for k_SSB > 0. It differs from
	// Offset only in the rows of patterns 2 and 3 that the spec writes as
	// "−41 if k_SSB = 0, −42 if k_SSB > 0" (Tables 13-7, 13-10) and
	// "−20 if k_SSB = 0, −21 if k_SSB > 0" (Table 13-8).
	OffsetKSSBPositive int
}

// Reserved reports whether the row is a reserved index.
func (r Row) Reserved() bool { return r.Pattern == 0 }

// OffsetFor returns the row's offset for a given k_SSB.
func (r Row) OffsetFor(kSSB int) int {
	if kSSB > 0 {
		return r.OffsetKSSBPositive
	}
	return r.Offset
}

// row is a row whose offset does not depend on k_SSB.
func row(pattern, nRB, nSymb, offset int) Row {
	return Row{pattern, nRB, nSymb, offset, offset}
}

// rowK is a row written "a if k_SSB = 0, b if k_SSB > 0".
func rowK(pattern, nRB, nSymb, offsetK0, offsetKPos int) Row {
	return Row{pattern, nRB, nSymb, offsetK0, offsetKPos}
}

var reserved = Row{}

// table13_1 is TS 38.213 Table 13-1 (Release 17): {SS/PBCH block, PDCCH} SCS
// {15, 15} kHz for frequency bands with minimum channel bandwidth 5 MHz or
// 10 MHz. Columns: pattern, N_RB^CORESET, N_symb^CORESET, offset (RBs).
var table13_1 = [16]Row{
	row(1, 24, 2, 0),
	row(1, 24, 2, 2),
	row(1, 24, 2, 4),
	row(1, 24, 3, 0),
	row(1, 24, 3, 2),
	row(1, 24, 3, 4),
	row(1, 48, 1, 12),
	row(1, 48, 1, 16),
	row(1, 48, 2, 12),
	row(1, 48, 2, 16),
	row(1, 48, 3, 12),
	row(1, 48, 3, 16),
	row(1, 96, 1, 38),
	row(1, 96, 2, 38),
	row(1, 96, 3, 38),
	reserved,
}

// table13_1A is TS 38.213 Table 13-1A (Release 17): {SS/PBCH block, PDCCH}
// SCS {15, 15} kHz for frequency bands operated with shared spectrum channel
// access.
var table13_1A = [16]Row{
	row(1, 96, 1, 10),
	row(1, 96, 1, 12),
	row(1, 96, 1, 14),
	row(1, 96, 1, 16),
	row(1, 96, 2, 10),
	row(1, 96, 2, 12),
	row(1, 96, 2, 14),
	row(1, 96, 2, 16),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
}

// table13_2 is TS 38.213 Table 13-2 (Release 17): {SS/PBCH block, PDCCH} SCS
// {15, 30} kHz for frequency bands with minimum channel bandwidth 5 MHz or
// 10 MHz.
var table13_2 = [16]Row{
	row(1, 24, 2, 5),
	row(1, 24, 2, 6),
	row(1, 24, 2, 7),
	row(1, 24, 2, 8),
	row(1, 24, 3, 5),
	row(1, 24, 3, 6),
	row(1, 24, 3, 7),
	row(1, 24, 3, 8),
	row(1, 48, 1, 18),
	row(1, 48, 1, 20),
	row(1, 48, 2, 18),
	row(1, 48, 2, 20),
	row(1, 48, 3, 18),
	row(1, 48, 3, 20),
	reserved,
	reserved,
}

// table13_3 is TS 38.213 Table 13-3 (Release 17): {SS/PBCH block, PDCCH} SCS
// {30, 15} kHz for frequency bands with minimum channel bandwidth 5 MHz or
// 10 MHz.
var table13_3 = [16]Row{
	row(1, 48, 1, 2),
	row(1, 48, 1, 6),
	row(1, 48, 2, 2),
	row(1, 48, 2, 6),
	row(1, 48, 3, 2),
	row(1, 48, 3, 6),
	row(1, 96, 1, 28),
	row(1, 96, 2, 28),
	row(1, 96, 3, 28),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved,
}

// table13_4 is TS 38.213 Table 13-4 (Release 17): {SS/PBCH block, PDCCH} SCS
// {30, 30} kHz for frequency bands with minimum channel bandwidth 5 MHz or
// 10 MHz. It has no reserved index.
var table13_4 = [16]Row{
	row(1, 24, 2, 0),
	row(1, 24, 2, 1),
	row(1, 24, 2, 2),
	row(1, 24, 2, 3),
	row(1, 24, 2, 4),
	row(1, 24, 3, 0),
	row(1, 24, 3, 1),
	row(1, 24, 3, 2),
	row(1, 24, 3, 3),
	row(1, 24, 3, 4),
	row(1, 48, 1, 12),
	row(1, 48, 1, 14),
	row(1, 48, 1, 16),
	row(1, 48, 2, 12),
	row(1, 48, 2, 14),
	row(1, 48, 2, 16),
}

// table13_4A is TS 38.213 Table 13-4A (Release 17): {SS/PBCH block, PDCCH}
// SCS {30, 30} kHz for frequency bands operated with shared spectrum channel
// access.
var table13_4A = [16]Row{
	row(1, 48, 1, 0),
	row(1, 48, 1, 1),
	row(1, 48, 1, 2),
	row(1, 48, 1, 3),
	row(1, 48, 2, 0),
	row(1, 48, 2, 1),
	row(1, 48, 2, 2),
	row(1, 48, 2, 3),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
}

// table13_5 is TS 38.213 Table 13-5 (Release 17): {SS/PBCH block, PDCCH} SCS
// {30, 15} kHz for frequency bands with minimum channel bandwidth 40 MHz.
var table13_5 = [16]Row{
	row(1, 48, 1, 4),
	row(1, 48, 2, 4),
	row(1, 48, 3, 4),
	row(1, 96, 1, 0),
	row(1, 96, 1, 56),
	row(1, 96, 2, 0),
	row(1, 96, 2, 56),
	row(1, 96, 3, 0),
	row(1, 96, 3, 56),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved,
}

// table13_6 is TS 38.213 Table 13-6 (Release 17): {SS/PBCH block, PDCCH} SCS
// {30, 30} kHz for frequency bands with minimum channel bandwidth 40 MHz.
var table13_6 = [16]Row{
	row(1, 24, 2, 0),
	row(1, 24, 2, 4),
	row(1, 24, 3, 0),
	row(1, 24, 3, 4),
	row(1, 48, 1, 0),
	row(1, 48, 1, 28),
	row(1, 48, 2, 0),
	row(1, 48, 2, 28),
	row(1, 48, 3, 0),
	row(1, 48, 3, 28),
	reserved, reserved, reserved,
	reserved, reserved, reserved,
}

// table13_7 is TS 38.213 Table 13-7 (Release 17): {SS/PBCH block, PDCCH} SCS
// {120, 60} kHz. Indexes 8 and 10 are written "−41 if k_SSB = 0, −42 if
// k_SSB > 0".
var table13_7 = [16]Row{
	row(1, 48, 1, 0),
	row(1, 48, 1, 8),
	row(1, 48, 2, 0),
	row(1, 48, 2, 8),
	row(1, 48, 3, 0),
	row(1, 48, 3, 8),
	row(1, 96, 1, 28),
	row(1, 96, 2, 28),
	rowK(2, 48, 1, -41, -42),
	row(2, 48, 1, 49),
	rowK(2, 96, 1, -41, -42),
	row(2, 96, 1, 97),
	reserved, reserved, reserved, reserved,
}

// table13_8 is TS 38.213 Table 13-8 (Release 17): {SS/PBCH block, PDCCH} SCS
// {120, 120} kHz (FR2-1). Indexes 4 and 6 are written "−20 if k_SSB = 0,
// −21 if k_SSB > 0".
var table13_8 = [16]Row{
	row(1, 24, 2, 0),
	row(1, 24, 2, 4),
	row(1, 48, 1, 14),
	row(1, 48, 2, 14),
	rowK(3, 24, 2, -20, -21),
	row(3, 24, 2, 24),
	rowK(3, 48, 2, -20, -21),
	row(3, 48, 2, 48),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
}

// table13_9 is TS 38.213 Table 13-9 (Release 17): {SS/PBCH block, PDCCH} SCS
// {240, 60} kHz.
var table13_9 = [16]Row{
	row(1, 96, 1, 0),
	row(1, 96, 1, 16),
	row(1, 96, 2, 0),
	row(1, 96, 2, 16),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
}

// table13_10 is TS 38.213 Table 13-10 (Release 17): {SS/PBCH block, PDCCH}
// SCS {240, 120} kHz. Indexes 4 and 6 are written "−41 if k_SSB = 0, −42 if
// k_SSB > 0".
var table13_10 = [16]Row{
	row(1, 48, 1, 0),
	row(1, 48, 1, 8),
	row(1, 48, 2, 0),
	row(1, 48, 2, 8),
	rowK(2, 24, 1, -41, -42),
	row(2, 24, 1, 25),
	rowK(2, 48, 1, -41, -42),
	row(2, 48, 1, 49),
	reserved, reserved, reserved, reserved,
	reserved, reserved, reserved, reserved,
}
