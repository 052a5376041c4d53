package render

import (
	"encoding/csv"
	"io"
	"strconv"
	"strings"

	"gridloom/grid"
)

// csvHeader names SymbolCSV's columns. Times are from the start of the
// span; the Tc columns are exact, the µs columns rounded to the picosecond.
// direction is the symbol's D, U or F under the plan's TDD pattern, empty
// without one (as the JSON document's symbols). lowKHz and highKHz are the
// outer edges of the partition's subcarriers from point A, exact; lowMHz
// and highMHz the same edges in absolute frequency, exact, empty when the
// plan gives no centre. The columns after lengthUs came later, so they
// follow the first twelve and a reader that takes columns by position
// keeps working.
var csvHeader = []string{"partition", "scsKHz", "mu", "cp", "slot", "symbol",
	"startTc", "cpTc", "lengthTc", "startUs", "cpUs", "lengthUs",
	"direction", "lowKHz", "highKHz", "lowMHz", "highMHz"}

// SymbolCSV writes a header and then one row per OFDM symbol per partition,
// partitions in result order and symbols in time order.
func SymbolCSV(w io.Writer, r grid.Result) error {
	if err := checkNumerologies(r); err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	if err := cw.Write(csvHeader); err != nil {
		return err
	}
	row := make([]string, len(csvHeader))
	for _, l := range r.Partitions {
		n := l.Numerology
		row[0] = safeCell(l.Name)
		row[1] = strconv.Itoa(n.SCSKHz())
		row[2] = strconv.Itoa(n.Mu)
		row[3] = n.CP.String()
		row[12] = ""
		row[13], row[14] = exactDecimal(int64(l.Low), 3), exactDecimal(int64(l.High), 3)
		row[15], row[16] = "", ""
		if r.Channel.Absolute {
			row[15], row[16] = exactDecimal(int64(r.Channel.Abs(l.Low)), 6), exactDecimal(int64(r.Channel.Abs(l.High)), 6)
		}
		for k := range l.SymbolCount() {
			sym := n.SymbolAt(k)
			row[4] = strconv.Itoa(sym.Slot)
			row[5] = strconv.Itoa(sym.Symbol)
			row[6] = strconv.FormatInt(int64(sym.Start), 10)
			row[7] = strconv.FormatInt(int64(sym.CP), 10)
			row[8] = strconv.FormatInt(int64(sym.Length), 10)
			row[9] = micros(sym.Start)
			row[10] = micros(sym.CP)
			row[11] = micros(sym.Length)
			if l.Dirs != nil {
				row[12] = l.Dirs[k].String()
			}
			if err := cw.Write(row); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// exactDecimal writes v·10^−places with no rounding and no trailing
// zeros: 7500 Hz with places 3 is "7.5" (kHz), −7500 is "-7.5". Frequencies
// are whole Hz, so kHz and MHz need no float.
func exactDecimal(v int64, places int) string {
	neg := v < 0
	u := uint64(v)
	if neg {
		u = -u
	}
	digits := strconv.FormatUint(u, 10)
	for len(digits) <= places {
		digits = "0" + digits
	}
	whole, frac := digits[:len(digits)-places], strings.TrimRight(digits[len(digits)-places:], "0")
	out := whole
	if frac != "" {
		out += "." + frac
	}
	if neg {
		out = "-" + out
	}
	return out
}

func micros(t grid.Tc) string { return strconv.FormatFloat(t.Micros(), 'f', 6, 64) }

// safeCell keeps a spreadsheet from reading untrusted text as a formula: a
// cell that starts with =, +, -, @, tab or carriage return gets a leading
// apostrophe (common practice, after the OWASP note on CSV injection).
func safeCell(s string) string {
	if s != "" && (s[0] == '=' || s[0] == '+' || s[0] == '-' || s[0] == '@' || s[0] == '\t' || s[0] == '\r') {
		return "'" + s
	}
	return s
}
