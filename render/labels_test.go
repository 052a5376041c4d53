package render

import (
	"testing"
)

// labelCollisionPlan is the campus plan with "video" cut to 28 PRBs, so
// that its top edge lies 10 px above the SS/PBCH blocks' at the default
// width: "SSB 0–3", set above the blocks, would sit on the name
// "video 30 kHz" (issue 19), which starts at the same time.
func labelCollisionPlan(t *testing.T) *node {
	p := loadPlan(t, "../grid/demo/campus.yaml")
	p.Partitions[1].SizePRB = 28
	r := compute(t, p)
	if r.SSB == nil {
		t.Fatalf("no SS/PBCH blocks: %v", r.Findings)
	}
	f := plotFrame(r, DefaultWidth)
	d := planSSB(*r.SSB, f)
	name, _ := nameLabel(f, r.Partitions[1])
	above := float64(int(d.top - 4))
	l := label{x: float64(int(d.groups[0].x0 + 0.5)), runs: []run{{text: "SSB " + indexList(d.groups[0].indices), bold: true}}, size: 10}
	if !(labelBox{l.x, above - 10, l.x + measure(&l), above + 3}).hitsAny([]labelBox{{name.x, name.y - 11, name.x + measure(&name), name.y + 3}}) {
		t.Fatal("the plan no longer puts the SS/PBCH label on the partition's name; choose another size")
	}
	return parseSVG(t, figure(t, r, Options{}))
}

// TestSSBLabelClearsNames: where the SS/PBCH label would sit on a
// partition's name it goes below the blocks; no two labels of the plot
// overlap (boxes measured with the figure's own font metrics, the name's
// at its size); and the label is still drawn.
func TestSSBLabelClearsNames(t *testing.T) {
	root := labelCollisionPlan(t)
	var placed []labelBox
	for _, class := range []string{"gl-name", "gl-ssb-label"} {
		for _, l := range root.all(byClass(class)) {
			x, y := float64(attrInt(t, l, "x")), float64(attrInt(t, l, "y"))
			size := 11.0 // baseFontSize, inherited by the names
			if class == "gl-ssb-label" {
				size = 10
			}
			tl := label{runs: []run{{text: l.allText(), bold: true}}, size: size}
			b := labelBox{x, y - 10, x + measure(&tl), y + 3}
			if b.hitsAny(placed) {
				t.Errorf("label %q (%s) at (%v, %v) overlaps another", l.allText(), class, x, y)
			}
			placed = append(placed, b)
		}
	}
	if n := len(root.all(byClass("gl-ssb-label"))); n == 0 {
		t.Error("the SS/PBCH blocks lost their label")
	}
}
