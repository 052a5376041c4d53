package render

import (
	"fmt"

	"gridloom/grid"
)

// Level-of-detail thresholds. Lines closer than minLineGap merge into a
// grey blur on screen and on paper, so a coarser step is drawn instead;
// a cyclic prefix narrower than minStrip cannot be seen as a strip.
const (
	minLineGap = 4.0 // px
	minStrip   = 1.0 // px
)

// rowSteps are the PRB steps tried for the row lines, finest first.
var rowSteps = []int{1, 2, 5, 10, 20, 50, 100, 200, 500}

// detail is what is drawn of one partition at the figure's scale.
type detail struct {
	rowStep int  // PRBs between row lines
	symbols bool // a line at every symbol boundary
	slots   bool // a line at every slot boundary
	cp      bool // a strip over every cyclic prefix (all but the long ones)
	longCP  bool // a strip over the longer CP of each 0.5 ms's first symbol
	hasLong bool // the numerology has longer CPs (normal CP)
}

// chooseDetail picks the finest detail whose lines stay minLineGap apart
// and whose strips are at least minStrip wide. It is closed-form: the cost
// of deciding does not depend on the number of symbols or PRBs.
func chooseDetail(l grid.Lattice, f frame) detail {
	n := l.Numerology
	var d detail
	prbPx := float64(12*n.SCS()) * f.pxPerHz()
	d.rowStep = rowSteps[len(rowSteps)-1]
	for _, s := range rowSteps {
		if float64(s)*prbPx >= minLineGap {
			d.rowStep = s
			break
		}
	}
	// The shortest symbol and slot: those without a longer CP.
	symPx := float64(n.UsefulTc()+n.CPTc(1)) * f.pxPerTc()
	d.symbols = symPx >= minLineGap
	d.slots = symPx*float64(n.SymbolsPerSlot()) >= minLineGap
	d.hasLong = n.CPTc(0) != n.CPTc(1)
	d.cp = float64(n.CPTc(1))*f.pxPerTc() >= minStrip
	d.longCP = d.hasLong && float64(n.CPTc(0))*f.pxPerTc() >= minStrip
	return d
}

// parts says what d draws, one phrase per line kind.
func (d detail) parts(sizePRB int) []string {
	var parts []string
	switch {
	case d.rowStep >= sizePRB && sizePRB > 1:
		parts = append(parts, "PRB rows omitted at this scale")
	case d.rowStep == 1:
		parts = append(parts, "rows every PRB")
	default:
		parts = append(parts, fmt.Sprintf("rows every %d PRBs", d.rowStep))
	}
	switch {
	case d.symbols:
		parts = append(parts, "symbol and slot lines")
	case d.slots:
		parts = append(parts, "slot lines; symbol lines omitted at this scale")
	default:
		parts = append(parts, "symbol and slot lines omitted at this scale, 0.5 ms marks only")
	}
	switch {
	case d.cp && d.hasLong:
		parts = append(parts, "CP strips, longer CP darker")
	case d.cp:
		parts = append(parts, "CP strips")
	case d.longCP:
		parts = append(parts, "only the longer CP strips (others under 1 px)")
	default:
		parts = append(parts, "CP strips omitted (under 1 px)")
	}
	return parts
}

// drawPartition draws lattice l, number i of the result, in its gl-part
// group: the filled body, the wash over symbols of the other TDD direction,
// then one path per line kind with one segment per drawn line, the TDD
// band and the name.
func drawPartition(b *builder, f frame, i int, l grid.Lattice, d detail, t *tddDrawing, tdd *grid.TDD) {
	lk := b.lk
	top, bottom := f.Y(l.High), f.Y(l.Low)
	left, right := float64(f.x), f.planRight()
	span := f.planSpan
	half := grid.TcPerHalfFrame

	b.open(group{class: "gl-part", data: []attr{{"data-index", fmt.Sprint(i)}}})
	b.add(shape{class: "gl-body", d: pathOf(func(p *pathData) { p.rect(left, top, right, bottom) }),
		fill: b.partFill(i), stroke: solid(lk.part(i)), strokeW: lk.bodyW})
	if t != nil {
		drawTDDWash(b, t, top, bottom)
	}

	n := l.Numerology
	count := l.SymbolCount()

	// Cyclic prefixes: each strip is one stroke as wide as the CP, centred
	// on it, so a strip is a single segment.
	if b.shows(LayerCP) {
		cpW, longW := float64(n.CPTc(1))*f.pxPerTc(), float64(n.CPTc(0))*f.pxPerTc()
		var normal, long pathData
		if d.cp {
			for k := range count {
				sym := n.SymbolAt(k)
				if sym.Start >= span {
					break
				}
				if !d.hasLong || sym.CP == n.CPTc(1) {
					normal.vline(f.X(sym.Start)+cpW/2, top, bottom)
				}
			}
		}
		if d.longCP {
			// The longer CP opens every half subframe (TS 38.211 5.3.1).
			for t := grid.Tc(0); t < span; t += half {
				long.vline(f.X(t)+longW/2, top, bottom)
			}
		}
		b.add(line("gl-cp", normal, lk.lattice, lk.cpA, cpW))
		b.add(line("gl-longcp", long, lk.lattice, lk.longA, longW))
	}

	if b.shows(LayerLattice) {
		// PRB rows, counted from PRB 0 of the partition; a row too close to
		// the partition's upper edge would merge with it and is left out.
		var rows pathData
		prbPx := float64(12*n.SCS()) * f.pxPerHz()
		for p := d.rowStep; p < l.SizePRB; p += d.rowStep {
			if float64(l.SizePRB-p)*prbPx < minLineGap {
				break
			}
			rows.hline(f.Y(l.Low+grid.Hz(p)*12*n.SCS()), left, right)
		}
		b.add(line("gl-rows", rows, lk.lattice, lk.rowA, lk.rowW))

		// Symbol boundaries that are not slot boundaries, and slot boundaries
		// that are not 0.5 ms marks (those are drawn across the whole plot).
		var syms, slots pathData
		if d.symbols {
			for k := 1; k < count; k++ {
				sym := n.SymbolAt(k)
				if sym.Start >= span {
					break
				}
				if sym.Start%half == 0 || sym.Symbol == 0 {
					continue
				}
				syms.vline(f.X(sym.Start), top, bottom)
			}
		}
		if d.slots {
			for k := 1; k < l.SlotCount(); k++ {
				start, _ := n.Slot(k)
				if start >= span {
					break
				}
				if start%half != 0 {
					slots.vline(f.X(start), top, bottom)
				}
			}
		}
		b.add(line("gl-symbols", syms, lk.lattice, lk.symA, lk.symW))
		b.add(line("gl-slots", slots, lk.lattice, lk.slotA, lk.slotW))
	}

	if t != nil {
		drawTDDBand(b, t, tdd, top, bottom)
	}

	// The name, where the partition is tall enough to hold it; the legend
	// always has it.
	if name, ok := nameLabel(f, l); ok && b.shows(LayerLabels) {
		b.text(name)
	}
	b.end()
}

// nameLabel is a partition's name in the plot, and false where the
// partition is too low to hold it. Its size is set, not inherited, so that
// measure gives the width other labels keep clear of.
func nameLabel(f frame, l grid.Lattice) (label, bool) {
	top, bottom := f.Y(l.High), f.Y(l.Low)
	return label{class: "gl-name", x: float64(f.x + 5), y: float64(int(top) + 13),
		runs: []run{{text: clean(shown(l.Name)), bold: true}, {text: fmt.Sprintf("%d kHz", l.Numerology.SCSKHz()), dx: 6}},
		size: baseFontSize, halo: true}, bottom-top >= 16
}
