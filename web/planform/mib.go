package planform

import (
	"fmt"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
)

// Query keys of the MIB panel: the system frame number and the SS/PBCH
// block index whose MIB and PBCH payload bits the page shows, and the
// MIB's cellBarred and intraFreqReselection (TS 38.331 6.2.2). They are not
// plan keys — a plan holds none of them — so they live in their own "mib."
// namespace, as the figure's options live in "fig.".
const (
	KeyMIBSFN        = "mib.sfn"
	KeyMIBSSB        = "mib.ssb"
	KeyMIBCellBarred = "mib.cellBarred"
	KeyMIBIntraFreq  = "mib.intraFreqReselection"
)

// MIBKeys lists the MIB panel's keys in query order.
var MIBKeys = []string{KeyMIBSFN, KeyMIBSSB, KeyMIBCellBarred, KeyMIBIntraFreq}

// The values of the MIB's two access fields, as TS 38.331 spells them
// (ENUMERATED {barred, notBarred} and {allowed, notAllowed}); empty is the
// second of barred's and the first of intraFreqReselection's, a cell open
// to UEs.
var (
	CellBarredValues = []string{"barred", "notBarred"}
	IntraFreqValues  = []string{"allowed", "notAllowed"}
)

// MIBForm is the MIB panel's choice as typed, kept as strings so that a
// value that does not parse is shown again beside its control:
//
//	mib.sfn   the system frame number, 0 to 1023; empty is 0
//	mib.ssb   the SS/PBCH block index, one the plan's ssb.bitmap sends;
//	          empty is the first block sent
//	mib.cellBarred            barred or notBarred; empty is notBarred
//	mib.intraFreqReselection  allowed or notAllowed; empty is allowed
type MIBForm struct {
	SFN, SSB, CellBarred, IntraFreq string
}

// ParseMIBForm reads the MIB keys of a query.
func ParseMIBForm(v url.Values) MIBForm {
	return MIBForm{SFN: v.Get(KeyMIBSFN), SSB: v.Get(KeyMIBSSB),
		CellBarred: v.Get(KeyMIBCellBarred), IntraFreq: v.Get(KeyMIBIntraFreq)}
}

// Query writes the MIB keys that have a value, in a fixed order.
func (m MIBForm) Query() string {
	var parts []string
	for i, val := range []string{m.SFN, m.SSB, m.CellBarred, m.IntraFreq} {
		if val != "" {
			parts = append(parts, MIBKeys[i]+"="+url.QueryEscape(val))
		}
	}
	return strings.Join(parts, "&")
}

// MIBChoice is a MIBForm read against a computed plan: the frame and the
// block to encode, with the messages, by query key, about what was typed.
type MIBChoice struct {
	SFN      int
	SSBIndex int
	// HalfFrame is 1 when the chosen block lies in the second half of its
	// frame (TS 38.212 7.1.1's ā(A+4)), as Compute placed it.
	HalfFrame int
	// Sent lists the block indices the plan sends, for the messages and
	// the control's hint.
	Sent []int
	// CellBarred is cellBarred barred; IntraFreqNotAllowed is
	// intraFreqReselection notAllowed.
	CellBarred, IntraFreqNotAllowed bool
	Msgs                            Messages
}

// tcPerFrame and tcPerHalfFrame are 10 ms and 5 ms in Tc (TS 38.211 4.1:
// Tc = 1/(480 kHz · 4096), so 1 ms is 1 966 080 Tc).
const (
	tcPerFrame     = 19660800
	tcPerHalfFrame = tcPerFrame / 2
)

// ReadMIB reads m for the plan computed as res. A value that does not parse
// or is out of range is reported and replaced by its default, so the panel
// still shows the bits of a valid choice. A plan without SS/PBCH blocks
// has no MIB: ok is false.
func ReadMIB(m MIBForm, res grid.Result) (c MIBChoice, ok bool) {
	c.Msgs = Messages{}
	if res.SSB == nil || len(res.SSB.Blocks) == 0 {
		return c, false
	}
	seen := map[int]bool{}
	for _, b := range res.SSB.Blocks {
		if !seen[b.Index] {
			seen[b.Index] = true
			c.Sent = append(c.Sent, b.Index)
		}
	}
	if t := strings.TrimSpace(m.SFN); t != "" {
		n, err := strconv.Atoi(t)
		switch {
		case err != nil:
			c.Msgs.Add(KeyMIBSFN, "System frame number (mib.sfn): %q is not a whole number; give 0 to 1023, or nothing for 0.", ShortText(m.SFN))
		case n < 0 || n > 1023:
			c.Msgs.Add(KeyMIBSFN, "System frame number (mib.sfn): %d is outside 0 to 1023 (TS 38.331 MIB: 6 bits in the MIB and 4 in the PBCH payload); give a number in that range.", n)
		default:
			c.SFN = n
		}
	}
	c.SSBIndex = c.Sent[0]
	if t := strings.TrimSpace(m.SSB); t != "" {
		n, err := strconv.Atoi(t)
		switch {
		case err != nil:
			c.Msgs.Add(KeyMIBSSB, "SS/PBCH block index (mib.ssb): %q is not a whole number; give one of the blocks the plan sends: %s.", ShortText(m.SSB), intList(c.Sent))
		case !seen[n]:
			c.Msgs.Add(KeyMIBSSB, "SS/PBCH block index (mib.ssb): the plan's ssb.bitmap does not send block %d; give one of the blocks it sends: %s.", n, intList(c.Sent))
		default:
			c.SSBIndex = n
		}
	}
	// read takes one of the MIB's two-valued access fields as typed; empty
	// is the cell's usual value, def, and so is a value 38.331 lacks, which
	// is reported beside its control.
	read := func(key, field, typed string, values []string, def string) string {
		t := strings.TrimSpace(typed)
		switch {
		case t == "":
			return def
		case !slices.Contains(values, t):
			c.Msgs.Add(key, "%s (%s): %q is not a value; give %s or %s (TS 38.331 MIB), or nothing for %s.", field, key, ShortText(typed), values[0], values[1], def)
			return def
		}
		return t
	}
	c.CellBarred = read(KeyMIBCellBarred, "cellBarred", m.CellBarred, CellBarredValues, "notBarred") == "barred"
	c.IntraFreqNotAllowed = read(KeyMIBIntraFreq, "intraFreqReselection", m.IntraFreq, IntraFreqValues, "allowed") == "notAllowed"
	for _, b := range res.SSB.Blocks {
		if b.Index == c.SSBIndex {
			if int64(b.Start)%tcPerFrame >= tcPerHalfFrame {
				c.HalfFrame = 1
			}
			break
		}
	}
	return c, true
}

// SentText lists the blocks the plan sends, as "0, 1, 2 and 3".
func (c MIBChoice) SentText() string { return intList(c.Sent) }

// intList writes numbers as "0, 1, 2 and 3".
func intList(ns []int) string {
	s := make([]string, len(ns))
	for i, n := range ns {
		s[i] = strconv.Itoa(n)
	}
	if len(s) == 1 {
		return s[0]
	}
	return fmt.Sprintf("%s and %s", strings.Join(s[:len(s)-1], ", "), s[len(s)-1])
}
