package web

import (
	"fmt"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/rrc"
	"gridloom/web/planform"
)

// The MIB panel's view: the 24 bits of BCCH-BCH-Message and the 8 PBCH
// payload bits outside it (rrc.EncodeMIB) for the plan's MIB fields
// (rrc.MIBForPlan) and the frame and block the user chooses (mib.sfn,
// mib.ssb), each field's bits labelled with their places, so that an
// engineer can check a capture or a test vector bit by bit.

// idMIB is the id of the MIB panel's controls, for the links to them.
const idMIB = "g-mib"

// mibView is the MIB panel in the results.
type mibView struct {
	Title       string
	Hex, Binary string
	Message     []bitRow // BCCH-BCH-Message, 24 bits
	Payload     []bitRow // ā(A) … ā(A+7)
	Facts       []string // which values come from the plan and which are assumed
	Err         string   // why there are no bits
}

// bitRow is one labelled field: its places, name, bits and meaning.
type bitRow struct{ Place, Name, Bits, Value string }

// buildMIB makes the panel's controls and view for the plan of st and the
// choice mf; the view is nil for a plan without SS/PBCH blocks, which has
// no MIB, and the page then shows neither.
func buildMIB(st planform.State, mf planform.MIBForm) (mibBoxView, *mibView) {
	c, ok := planform.ReadMIB(mf, st.Result)
	note := func(key string) []note {
		if m, bad := c.Msgs[key]; bad {
			return []note{{Severity: string(grid.Error), Text: m}}
		}
		return nil
	}
	ssbHolder := ""
	if ok {
		ssbHolder = strconv.Itoa(c.Sent[0])
	}
	box := mibBoxView{
		Group: group{ID: idMIB},
		SFN: control{ID: planform.KeyID(planform.KeyMIBSFN), Name: planform.KeyMIBSFN, Label: "System frame number (0–1023)",
			Value: mf.SFN, InputMode: "numeric", Placeholder: "0", Size: "6", Notes: note(planform.KeyMIBSFN)},
		SSB: control{ID: planform.KeyID(planform.KeyMIBSSB), Name: planform.KeyMIBSSB, Label: "SS/PBCH block",
			Value: mf.SSB, InputMode: "numeric", Placeholder: ssbHolder, Size: "6", Notes: note(planform.KeyMIBSSB)},
		CellBarred: enumControl(planform.KeyMIBCellBarred, "cellBarred", mf.CellBarred, planform.CellBarredValues, "notBarred", note(planform.KeyMIBCellBarred)),
		Intra:      enumControl(planform.KeyMIBIntraFreq, "intraFreqReselection", mf.IntraFreq, planform.IntraFreqValues, "allowed", note(planform.KeyMIBIntraFreq)),
		Open:       mf != planform.MIBForm{},
		Hint:       "The frame and the SS/PBCH block whose MIB and PBCH payload bits the results show, and the MIB's cellBarred and intraFreqReselection. The plan holds none of them: the first two change from block to block and frame to frame, the last two are the operator's to set.",
	}
	if !ok {
		return box, nil
	}
	box.Hint += " The plan sends blocks " + c.SentText() + "."
	v := &mibView{Title: fmt.Sprintf("MIB of SS/PBCH block %d in frame %d", c.SSBIndex, c.SFN)}
	m, t, err := rrc.MIBForPlan(st.Result)
	if err != nil {
		v.Err = withStop(err)
		return box, v
	}
	m.SFN = c.SFN
	m.CellBarred, m.IntraFreqReselectionNotAllowed = c.CellBarred, c.IntraFreqNotAllowed
	t.SSBIndex = c.SSBIndex
	t.HalfFrame = c.HalfFrame
	bits, err := rrc.EncodeMIB(m, t)
	if err != nil {
		v.Err = "The MIB cannot be encoded: " + withStop(err)
		return box, v
	}
	v.Hex, v.Binary = bits.Hex(), bits.Binary()
	for _, f := range bits.Message {
		v.Message = append(v.Message, bitRow{Place: places("", f), Name: f.Name, Bits: f.Bits, Value: f.Value})
	}
	for _, f := range bits.Payload {
		v.Payload = append(v.Payload, bitRow{Place: places("A+", f), Name: f.Name, Bits: f.Bits, Value: payloadMeaning(f, c, m.KSSB)})
	}
	v.Facts = mibFacts(st.Result, c)
	return box, v
}

// payloadMeaning says what a PBCH payload bit is taken from, in the
// numbers the user chose or the plan set, for a field that gives no value
// of its own.
func payloadMeaning(f rrc.BitField, c planform.MIBChoice, kSSB int) string {
	switch {
	case f.Value != "":
		return f.Value
	case strings.HasSuffix(f.Name, "of SFN"):
		return fmt.Sprintf("SFN %d = %010b", c.SFN, c.SFN)
	case f.Name == "half frame bit":
		return []string{"first half frame", "second half frame"}[c.HalfFrame]
	case strings.Contains(f.Name, "k_SSB"):
		return fmt.Sprintf("k_SSB %d = %05b", kSSB, kSSB)
	case strings.Contains(f.Name, "block index"):
		return fmt.Sprintf("block %d = %06b", c.SSBIndex, c.SSBIndex)
	}
	return "not used: 0"
}

// places names a field's bits: "7" or "1–6", counted from 0, the first bit
// sent; prefix "A+" counts the payload bits after the A = 24 of the MIB.
func places(prefix string, f rrc.BitField) string {
	if f.Len == 1 {
		return prefix + strconv.Itoa(f.First)
	}
	return fmt.Sprintf("%s%d–%s%d", prefix, f.First, prefix, f.First+f.Len-1)
}

// mibFacts says where each value comes from: the plan, the choice, or an
// assumption the plan does not settle.
func mibFacts(res grid.Result, c planform.MIBChoice) []string {
	half := "first"
	if c.HalfFrame == 1 {
		half = "second"
	}
	facts := []string{
		fmt.Sprintf("Block %d lies in the %s half of its frame as the plan places it, which sets the half frame bit ā(A+4).", c.SSBIndex, half),
		fmt.Sprintf("k_SSB %d is the plan's; L_max = %d decides what ā(A+5) to ā(A+7) carry (TS 38.212 7.1.1).", res.SSB.KSSB, res.SSB.Candidates),
		fmt.Sprintf("cellBarred %s and intraFreqReselection %s are the panel's choice (mib.cellBarred, mib.intraFreqReselection): the plan does not hold them.",
			planform.CellBarredValues[boolIndex(!c.CellBarred)], planform.IntraFreqValues[boolIndex(c.IntraFreqNotAllowed)]),
	}
	if res.InitialAccess == nil {
		facts = append(facts, "pdcch-ConfigSIB1 is 0 and dmrs-TypeA-Position pos2 here because the plan has no initial access block; set CORESET#0 and the search space zero to encode yours.")
	}
	if why := grid.CommonNoSpacing(res.Channel.Range, res.Channel.Band, res.SSB.Numerology.SCSKHz()); why != "" {
		facts = append(facts, "subCarrierSpacingCommon is scs15or60 here, for it gives no spacing: "+why+".")
	}
	return facts
}

// enumControl is a select of the MIB's two-valued field: empty (its usual
// value, def) and the two values TS 38.331 spells. A value typed into the
// address that is neither stays selectable (pick), so it is not lost.
func enumControl(key, label, value string, values []string, def string, notes []note) control {
	opts := []option{{Value: "", Label: def + " (default)"}}
	for _, v := range values {
		opts = append(opts, option{Value: v, Label: v})
	}
	opts = pick(opts, value, func(string) string { return "not a value of TS 38.331" })
	return control{ID: planform.KeyID(key), Name: key, Label: label, Value: value, Size: "6", Options: opts, Notes: notes}
}

// boolIndex is 1 for true, 0 for false.
func boolIndex(b bool) int {
	if b {
		return 1
	}
	return 0
}

// withStop is an error's text ending in a full stop, as the panel shows it.
func withStop(err error) string { return strings.TrimSuffix(err.Error(), ".") + "." }
