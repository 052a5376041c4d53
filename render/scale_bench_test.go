package render

import (
	"fmt"
	"testing"

	"gridloom/grid"
)

// The figure's cost follows what is drawn, not the size of the lattice.
// BenchmarkFigureCells changes the number of cells (symbols × PRBs) by up
// to 1480 times at one kind of drawing; BenchmarkFigureDrawing keeps the
// cells and changes what is drawn: partitions, or the width, which lets
// finer lines through. Each reports cells, lines (subpaths in the display
// list: every line, rectangle and mark drawn), svg-bytes and ns/op, so
// that bytes and time can be set against lines and against cells.
//
//	go test ./render -run '^$' -bench 'FigureCells|FigureDrawing' -benchmem -count 6

// scalePlan is a plan of parts equal partitions side by side, each of
// prbs PRBs at scsKHz, over spanMs, placed from the first CRB of the
// carrier that Compute chooses.
func scalePlan(tb testing.TB, rng string, bwMHz, scsKHz, parts, prbs, spanMs int) grid.Result {
	tb.Helper()
	p := grid.Plan{Name: fmt.Sprintf("%d × %d PRBs at %d kHz, %d ms", parts, prbs, scsKHz, spanMs), SpanMs: spanMs,
		Carrier: grid.CarrierPlan{Range: rng, BandwidthMHz: bwMHz}}
	first := grid.Compute(grid.Plan{Carrier: p.Carrier, Partitions: []grid.PartitionPlan{{Name: "x", SCSKHz: scsKHz, SizePRB: 1}}})
	c, ok := first.Carrier(scsKHz)
	if !ok {
		tb.Fatalf("no %d kHz carrier in %d MHz %s: %v", scsKHz, bwMHz, rng, first.Findings)
	}
	for i := range parts {
		start := c.OffsetToCarrier + i*prbs
		p.Partitions = append(p.Partitions, grid.PartitionPlan{Name: fmt.Sprintf("p%d", i), SCSKHz: scsKHz, StartCRB: &start, SizePRB: prbs})
	}
	r := compute(tb, p)
	if r.HasErrors() {
		tb.Fatalf("plan %q: %v", p.Name, r.Findings)
	}
	return r
}

// benchmarkDrawing draws r at opt and reports what it drew.
func benchmarkDrawing(b *testing.B, r grid.Result, opt Options) {
	d, err := build(r, opt)
	if err != nil {
		b.Fatal(err)
	}
	lines := 0
	for _, it := range d.items {
		if s, ok := it.(*shape); ok {
			lines += s.d.segs
		}
	}
	cells := 0
	for _, l := range r.Partitions {
		cells += l.SymbolCount() * l.SizePRB
	}
	b.ReportAllocs()
	svg := drawLoop(b, Figure, r, opt)
	b.ReportMetric(float64(cells), "cells")
	b.ReportMetric(float64(lines), "lines")
	b.ReportMetric(float64(len(svg)), "svg-bytes")
}

// BenchmarkFigureCells: one 960 kHz partition of 1 or 148 PRBs over 1 or
// 10 ms in the 2000 MHz FR2-2 channel, from 896 to 1 326 080 cells.
func BenchmarkFigureCells(b *testing.B) {
	for _, c := range []struct{ prbs, spanMs int }{{1, 1}, {148, 1}, {1, 10}, {148, 10}} {
		r := scalePlan(b, "FR2-2", 2000, 960, 1, c.prbs, c.spanMs)
		b.Run(fmt.Sprintf("prb=%d/ms=%d", c.prbs, c.spanMs), func(b *testing.B) { benchmarkDrawing(b, r, Options{}) })
	}
}

// BenchmarkFigureDrawing: the same 272 PRBs of 30 kHz over 2 ms (15 232
// cells) as 1, 4 or 16 partitions at the default width; and one 960 kHz
// partition of 148 PRBs over 1 ms (132 608 cells) at widths from the
// narrowest to the widest, where slot lines and then symbol lines come
// into view.
func BenchmarkFigureDrawing(b *testing.B) {
	for _, parts := range []int{1, 4, 16} {
		r := scalePlan(b, "FR1", 100, 30, parts, 272/parts, 2)
		b.Run(fmt.Sprintf("parts=%d", parts), func(b *testing.B) { benchmarkDrawing(b, r, Options{}) })
	}
	r := scalePlan(b, "FR2-2", 2000, 960, 1, 148, 1)
	for _, w := range []int{MinWidth, DefaultWidth, 2400, MaxWidth} {
		b.Run(fmt.Sprintf("width=%d", w), func(b *testing.B) { benchmarkDrawing(b, r, Options{Width: w}) })
	}
}
