package render

import (
	"encoding/csv"
	"io"
	"strconv"

	"gridloom/grid"
)

// csvHeader names SymbolCSV's columns. Times are from the start of the
// span; the Tc columns are exact, the µs columns rounded to the picosecond.
var csvHeader = []string{"partition", "scsKHz", "mu", "cp", "slot", "symbol",
	"startTc", "cpTc", "lengthTc", "startUs", "cpUs", "lengthUs"}

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
			if err := cw.Write(row); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
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
