package gscn

import (
	"slices"
	"strconv"
	"strings"
)

// Entry is one row of an "applicable SS raster entries per operating band"
// table: the SS/PBCH block spacing and pattern a band allows, and its GSCNs.
// The GSCNs are First, First+Step, … up to Last; or, where the table gives
// an irregular set in a note, exactly List (First and Last are then the
// list's ends and Step is 0).
type Entry struct {
	Band   string // "n78"
	SCSKHz int    // SS/PBCH block subcarrier spacing
	Case   string // SS/PBCH block pattern, TS 38.213 4.1: "A" … "G"
	First  int
	Step   int
	Last   int
	List   []int
}

// Contains reports whether g is one of the entry's GSCNs.
func (e Entry) Contains(g int) bool {
	if e.List != nil {
		_, ok := slices.BinarySearch(e.List, g)
		return ok
	}
	return g >= e.First && g <= e.Last && (g-e.First)%e.Step == 0
}

// GSCNs lists the entry's GSCNs in increasing order.
func (e Entry) GSCNs() []int {
	if e.List != nil {
		return slices.Clone(e.List)
	}
	var out []int
	for g := e.First; g <= e.Last; g += e.Step {
		out = append(out, g)
	}
	return out
}

// Range writes the entry the way the table does: "7711 – <1> – 8051", or the
// list's ends and count for an irregular set.
func (e Entry) Range() string {
	if e.List != nil {
		return strconv.Itoa(len(e.List)) + " listed GSCNs from " + strconv.Itoa(e.First) + " to " + strconv.Itoa(e.Last)
	}
	return strconv.Itoa(e.First) + " – <" + strconv.Itoa(e.Step) + "> – " + strconv.Itoa(e.Last)
}

func span(band string, scs int, c string, first, step, last int) Entry {
	return Entry{Band: band, SCSKHz: scs, Case: c, First: first, Step: step, Last: last}
}

func list(band string, scs int, c string, gs ...int) Entry {
	return Entry{Band: band, SCSKHz: scs, Case: c, First: gs[0], Last: gs[len(gs)-1], List: gs}
}

// TableFR1 is TS 38.101-1 Table 5.4.3.3-1, "Applicable SS raster entries
// per operating band", Release 17 (V17.8.0), one Entry per row in the spec's
// order. Bands without a downlink (the SUL bands) have no row.
//
// Written from the spec text as remembered, then compared cell by cell
// with two independent copies (testdata/, TestTableAgainstCopies):
//   - n46, n96 and n102 have irregular sets given in notes (the SS/PBCH block
//     sits in fixed places of each 20 MHz LBT sub-band of the unlicensed
//     5 and 6 GHz bands). n96's set was remembered as ending 10201, 10215,
//     10229, … 10326, 10340, 10354; the independent copy (srsRAN, which names
//     the note) has 10214, 10228, … 10325, 10339, 10353. The spec text was not
//     at hand to settle it; this table follows the copy, and the difference is
//     reported, not hidden.
//   - TS 38.104 (the base-station spec, whose tables srsRAN carries) adds sets
//     of its own for n34/n38/n39 at 15 kHz and narrower n79/n90 rows for
//     small channels; those are base-station rows and are not in TS 38.101-1,
//     which this table follows.
var TableFR1 = []Entry{
	span("n1", 15, "A", 5279, 1, 5419),
	span("n2", 15, "A", 4829, 1, 4969),
	span("n3", 15, "A", 4517, 1, 4693),
	span("n5", 15, "A", 2177, 1, 2230),
	span("n5", 30, "B", 2183, 1, 2224),
	span("n7", 15, "A", 6554, 1, 6718),
	span("n8", 15, "A", 2318, 1, 2395),
	span("n12", 15, "A", 1828, 1, 1858),
	span("n13", 15, "A", 1871, 1, 1885),
	span("n14", 15, "A", 1901, 1, 1915),
	span("n18", 15, "A", 2156, 1, 2182),
	span("n20", 15, "A", 1982, 1, 2047),
	span("n24", 15, "A", 3818, 1, 3892),
	span("n24", 30, "B", 3824, 1, 3886),
	span("n25", 15, "A", 4829, 1, 4981),
	span("n26", 15, "A", 2153, 1, 2230),
	span("n28", 15, "A", 1901, 1, 2002),
	span("n29", 15, "A", 1798, 1, 1813),
	span("n30", 15, "A", 5879, 1, 5893),
	span("n34", 15, "A", 5030, 1, 5056),
	span("n34", 30, "C", 5036, 1, 5050),
	span("n38", 15, "A", 6431, 1, 6544),
	span("n38", 30, "C", 6437, 1, 6538),
	span("n39", 15, "A", 4706, 1, 4795),
	span("n39", 30, "C", 4712, 1, 4789),
	span("n40", 30, "C", 5762, 1, 5989),
	span("n41", 15, "A", 6246, 3, 6717),
	span("n41", 30, "C", 6252, 3, 6714),
	list("n46", 30, "C", 8996, 9010, 9024, 9038, 9051, 9065, 9079, 9093, 9107, 9121, 9218, 9232, 9246, 9260, 9274, 9288,
		9301, 9315, 9329, 9343, 9357, 9371, 9385, 9402, 9416, 9430, 9444, 9458, 9472, 9485, 9499, 9513),
	span("n48", 30, "C", 7884, 1, 7982),
	span("n50", 30, "C", 3590, 1, 3781),
	span("n51", 15, "A", 3572, 1, 3574),
	span("n53", 15, "A", 6215, 1, 6232),
	span("n53", 30, "C", 6221, 1, 6226),
	span("n65", 15, "A", 5279, 1, 5494),
	span("n66", 15, "A", 5279, 1, 5494),
	span("n66", 30, "B", 5285, 1, 5488),
	span("n67", 15, "A", 1850, 1, 1888),
	span("n70", 15, "A", 4993, 1, 5044),
	span("n71", 15, "A", 1547, 1, 1624),
	span("n74", 15, "A", 3692, 1, 3790),
	span("n75", 15, "A", 3584, 1, 3787),
	span("n76", 15, "A", 3572, 1, 3574),
	span("n77", 30, "C", 7711, 1, 8329),
	span("n78", 30, "C", 7711, 1, 8051),
	span("n79", 30, "C", 8480, 16, 8880),
	span("n85", 15, "A", 1826, 1, 1858),
	span("n90", 15, "A", 6246, 1, 6717),
	span("n90", 30, "C", 6252, 1, 6714),
	span("n91", 15, "A", 3572, 1, 3574),
	span("n92", 15, "A", 3584, 1, 3787),
	span("n93", 15, "A", 3572, 1, 3574),
	span("n94", 15, "A", 3584, 1, 3787),
	list("n96", 30, "C", 9548, 9562, 9576, 9590, 9603, 9617, 9631, 9645, 9659, 9673, 9687, 9701, 9714, 9728, 9742, 9756,
		9770, 9784, 9798, 9812, 9826, 9840, 9853, 9867, 9881, 9895, 9909, 9923, 9937, 9951, 9964, 9978, 9992, 10006,
		10020, 10034, 10048, 10062, 10076, 10090, 10103, 10117, 10131, 10145, 10159, 10173, 10187, 10201, 10214, 10228,
		10242, 10256, 10270, 10284, 10298, 10312, 10325, 10339, 10353),
	span("n100", 15, "A", 2303, 1, 2307),
	span("n101", 15, "A", 4754, 1, 4768),
	span("n101", 30, "C", 4760, 1, 4764),
	list("n102", 30, "C", 9535, 9548, 9562, 9576, 9590, 9603, 9617, 9631, 9645, 9659, 9673, 9687, 9701, 9714, 9728, 9742,
		9756, 9770, 9784, 9798, 9812, 9826, 9840, 9853, 9867),
	span("n104", 30, "C", 9882, 7, 10358),
}

// TableFR2 is TS 38.101-2 Table 5.4.3.3-1, "Applicable SS raster entries
// per operating band", Release 17 (V17.8.0): FR2-1 bands n257 … n262 and
// the FR2-2 band n263.
//
// The FR2-1 rows were compared cell by cell with an independent copy
// (testdata/). No independent copy of the n263 rows was found: they are
// from memory of the spec text and unchecked; the steps follow the rule the
// other rows show (the GSCN step grows with the block's spacing: 1 at
// 120 kHz, 2 at 240 kHz, so 4 at 480 kHz and 8 at 960 kHz).
var TableFR2 = []Entry{
	span("n257", 120, "D", 22388, 1, 22558),
	span("n257", 240, "E", 22390, 2, 22556),
	span("n258", 120, "D", 22257, 1, 22443),
	span("n258", 240, "E", 22258, 2, 22442),
	span("n259", 120, "D", 23140, 1, 23369),
	span("n259", 240, "E", 23142, 2, 23368),
	span("n260", 120, "D", 22995, 1, 23166),
	span("n260", 240, "E", 22996, 2, 23164),
	span("n261", 120, "D", 22446, 1, 22492),
	span("n261", 240, "E", 22446, 2, 22490),
	span("n262", 120, "D", 23586, 1, 23641),
	span("n262", 240, "E", 23588, 2, 23640),
	span("n263", 120, "D", 24156, 1, 24960),
	span("n263", 480, "F", 24162, 4, 24954),
	span("n263", 960, "G", 24186, 8, 24930),
}

// Entries returns the rows of a band ("n78", any letter case, with or
// without the n), and false when neither table has the band.
func Entries(band string) ([]Entry, bool) {
	name := Normalize(band)
	var out []Entry
	for _, t := range [][]Entry{TableFR1, TableFR2} {
		for _, e := range t {
			if e.Band == name {
				out = append(out, e)
			}
		}
	}
	return out, len(out) > 0
}

// Lookup returns a band's row for an SS/PBCH block spacing.
func Lookup(band string, scsKHz int) (Entry, bool) {
	es, _ := Entries(band)
	for _, e := range es {
		if e.SCSKHz == scsKHz {
			return e, true
		}
	}
	return Entry{}, false
}

// Normalize writes a band name the way the tables do: "N78", "78" and
// " n78 " become "n78".
func Normalize(band string) string {
	s := strings.ToLower(strings.TrimSpace(band))
	if !strings.HasPrefix(s, "n") {
		s = "n" + s
	}
	return s
}

// Bands lists every band that has SS raster entries, in table order.
func Bands() []string {
	var out []string
	for _, t := range [][]Entry{TableFR1, TableFR2} {
		for _, e := range t {
			if !slices.Contains(out, e.Band) {
				out = append(out, e.Band)
			}
		}
	}
	return out
}
