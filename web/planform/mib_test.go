package planform

import (
	"net/url"
	"strings"
	"testing"

	"gridloom/grid"
)

// blocksAt is a result whose SS/PBCH blocks with the given indices start
// at the given times (Tc).
func blocksAt(idx []int, start []grid.Tc) grid.Result {
	s := &grid.SSB{Candidates: 8}
	for i := range idx {
		s.Blocks = append(s.Blocks, grid.SSBBlock{Index: idx[i], Start: start[i]})
	}
	return grid.Result{SSB: s}
}

func TestReadMIB(t *testing.T) {
	// Blocks 0 and 1 in the first half frame; block 4 at 6 ms, in the
	// second (5 ms = 9 830 400 Tc, TS 38.211 4.1); block 0 again in the
	// next frame, in its first half.
	ms := grid.Tc(1966080)
	res := blocksAt([]int{0, 1, 4, 0}, []grid.Tc{0, ms / 4, 6 * ms, 10 * ms})
	for _, c := range []struct {
		query        string
		sfn, ssb, hf int
		msgKeys      string
	}{
		{"", 0, 0, 0, ""},
		{"mib.sfn=1023&mib.ssb=1", 1023, 1, 0, ""},
		{"mib.sfn=+7+&mib.ssb=4", 7, 4, 1, ""},
		{"mib.sfn=1024&mib.ssb=2", 0, 0, 0, "mib.sfn mib.ssb"},
		{"mib.sfn=-1&mib.ssb=x", 0, 0, 0, "mib.sfn mib.ssb"},
	} {
		v, _ := url.ParseQuery(c.query)
		got, ok := ReadMIB(ParseMIBForm(v), res)
		if !ok {
			t.Fatalf("%q: no MIB for a plan with blocks", c.query)
		}
		var keys []string
		for _, k := range MIBKeys {
			if _, bad := got.Msgs[k]; bad {
				keys = append(keys, k)
			}
		}
		if got.SFN != c.sfn || got.SSBIndex != c.ssb || got.HalfFrame != c.hf || strings.Join(keys, " ") != c.msgKeys {
			t.Errorf("%q: SFN %d, block %d, half frame %d, messages on %v; want %d, %d, %d, [%s]",
				c.query, got.SFN, got.SSBIndex, got.HalfFrame, keys, c.sfn, c.ssb, c.hf, c.msgKeys)
		}
		if got.SentText() != "0, 1 and 4" {
			t.Errorf("SentText %q, want the blocks sent once each", got.SentText())
		}
	}
	v, _ := url.ParseQuery("mib.ssb=2")
	got, _ := ReadMIB(ParseMIBForm(v), res)
	if m := got.Msgs[KeyMIBSSB]; !strings.Contains(m, "does not send block 2") || !strings.Contains(m, "0, 1 and 4") {
		t.Errorf("message %q does not name the block and the blocks sent", m)
	}
	if _, ok := ReadMIB(MIBForm{SFN: "3"}, grid.Result{}); ok {
		t.Error("a plan without blocks has a MIB")
	}
	if q := (MIBForm{SFN: "682", SSB: "3", CellBarred: "barred", IntraFreq: "notAllowed"}).Query(); q != "mib.sfn=682&mib.ssb=3&mib.cellBarred=barred&mib.intraFreqReselection=notAllowed" {
		t.Errorf("Query %q", q)
	}
}

// TestReadMIBAccessFields reads cellBarred and intraFreqReselection: the
// values of TS 38.331's ENUMERATED {barred, notBarred} and {allowed,
// notAllowed}, empty for a cell open to UEs (notBarred, allowed); any
// other text is named beside its control and the default used.
func TestReadMIBAccessFields(t *testing.T) {
	res := blocksAt([]int{0}, []grid.Tc{0})
	for _, c := range []struct {
		query             string
		barred, notAllow  bool
		barredMsg, intraM bool
	}{
		{"", false, false, false, false},
		{"mib.cellBarred=barred", true, false, false, false},
		{"mib.cellBarred=notBarred&mib.intraFreqReselection=notAllowed", false, true, false, false},
		{"mib.intraFreqReselection=allowed", false, false, false, false},
		{"mib.cellBarred=+barred+", true, false, false, false},
		{"mib.cellBarred=Barred&mib.intraFreqReselection=no", false, false, true, true},
	} {
		v, _ := url.ParseQuery(c.query)
		got, _ := ReadMIB(ParseMIBForm(v), res)
		_, bm := got.Msgs[KeyMIBCellBarred]
		_, im := got.Msgs[KeyMIBIntraFreq]
		if got.CellBarred != c.barred || got.IntraFreqNotAllowed != c.notAllow || bm != c.barredMsg || im != c.intraM {
			t.Errorf("%q: barred %v, notAllowed %v, messages %v %v; want %v %v %v %v", c.query, got.CellBarred, got.IntraFreqNotAllowed, bm, im, c.barred, c.notAllow, c.barredMsg, c.intraM)
		}
	}
	v, _ := url.ParseQuery("mib.cellBarred=Barred")
	got, _ := ReadMIB(ParseMIBForm(v), res)
	if m := got.Msgs[KeyMIBCellBarred]; !strings.Contains(m, `"Barred" is not a value; give barred or notBarred`) {
		t.Errorf("message %q does not name the value and the two allowed", m)
	}
}
