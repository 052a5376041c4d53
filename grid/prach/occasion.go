package prach

import "fmt"

// Occasion is one time-domain PRACH occasion of a configuration index in one
// radio frame (TS 38.211 5.3.2 and 6.3.3.2). Times count Tc from the start of
// the radio frame, with N_TA = 0 as 5.3.2 assumes.
type Occasion struct {
	SFN      int
	Subframe int // subframe 0–9 that holds the occasion's start
	// Slot60 is the slot 0–39 of the 60 kHz slot grid (FR2 table); -1 for FR1.
	Slot60 int
	// Slot is the PRACH slot in the frame, numbered at Δf^RA (short formats);
	// for the long formats it is the subframe.
	Slot int
	// NSlot is n_slot^RA: 1 for the second of two PRACH slots in a subframe
	// (30 kHz) or 60 kHz slot (120 kHz), 0 otherwise.
	NSlot int
	// Index is n_t^RA, the occasion within its PRACH slot, from 0.
	Index int
	// Symbol is l = l_0 + n_t^RA·N_dur^RA + 14·n_slot^RA (TS 38.211 5.3.2),
	// counted at Δf^RA (μ = 0 for the long formats) from the start of the
	// subframe (FR1) or of the 60 kHz slot (FR2).
	Symbol   int
	Duration int    // N_dur^RA in symbols; 0 for the long formats
	Format   Format // the single format sent: A or B of a paired format
	Mu       int    // μ of the symbol grid of Symbol: Δf^RA = 15·2^μ kHz; 0 for long formats

	StartTc int64 // t_start^RA: start of the cyclic prefix
	CPTc    int64 // N_CP,l^RA with the 16κ of 5.3.2 where the preamble crosses 0 or 0.5 ms
	SeqTc   int64 // N_u: the sequence, all repetitions
	// EndTc closes the time the occasion holds: the end of its N_dur^RA
	// symbols (short formats), or for the long formats the common-practice
	// allotment of LongAllotmentTc (38.211 defines no guard period for them).
	EndTc int64
}

// PreambleEndTc is where the preamble's last sample ends.
func (o Occasion) PreambleEndTc() int64 { return o.StartTc + o.CPTc + o.SeqTc }

// GuardTc is the time left after the preamble within what the occasion holds.
func (o Occasion) GuardTc() int64 { return o.EndTc - o.PreambleEndTc() }

// LongAllotmentTc is the time a long-format preamble is usually drawn to hold,
// sequence, cyclic prefix and guard together: 1 ms for formats 0 and 3, 3 ms
// for format 1 and 3.5 ms for format 2. This is common practice (the guard
// periods quoted with these formats), not a number of TS 38.211. Sources
// differ here: the srsRAN Project rounds a long preamble's window up to whole
// milliseconds, 4 ms for format 2; the 3.5 ms kept here is the allotment the
// 22 km usually quoted for format 2 comes from (from memory).
func LongAllotmentTc(f Format) (int64, error) {
	switch f {
	case Format0, Format3:
		return TcPerSubframe, nil
	case Format1:
		return 3 * TcPerSubframe, nil
	case Format2:
		return 3*TcPerSubframe + TcPerHalfSubframe, nil
	}
	return 0, fmt.Errorf("preamble format %v is not a long format (0 to 3)", f)
}

// SymbolStartTc is t_start,l^μ of TS 38.211 5.3.1 for normal cyclic prefix:
// the start of symbol l of a subframe at numerology mu, from the subframe's
// start. Symbols 0 and 7·2^μ carry 16κ more cyclic prefix; l may run past the
// subframe, each further subframe adding 1 ms.
func SymbolStartTc(mu, l int) int64 {
	per := 14 << mu
	sf, l := l/per, l%per
	t := int64(sf)*TcPerSubframe + int64(l)*int64((2048+144)*Kappa>>mu)
	if l >= 1 {
		t += 16 * Kappa
	}
	if l >= 7<<mu+1 {
		t += 16 * Kappa
	}
	return t
}

// Occasions lists the PRACH occasions of row index of table s in radio frame
// sfn, in time order; none if the frame fails n_SFN mod x = y. mu gives
// Δf^RA = 15·2^μ kHz for the short formats (msg1-SubcarrierSpacing: 0 or 1 in
// FR1, 2 or 3 in FR2) and is ignored for the long formats.
//
// The PRACH slots follow TS 38.211 5.3.2: n_slot^RA = 0 at 15 and 60 kHz; at
// 30 and 120 kHz both slots of the subframe / 60 kHz slot when the table says
// 2, and only the second (n_slot^RA = 1) when it says 1. In a paired format
// (A1/B1...) the last occasion of each PRACH slot sends the B format, the
// others the A format (TS 38.211 5.3.2: B when n_t^RA = N_t^{RA,slot} − 1).
//
// Times sit on the uplink symbol grid of TS 38.211 5.3.1 counted from the
// start of the subframe, so an occasion holds exactly its N_dur^RA symbols.
// Clause 5.3.2 measures t_start^RA from the start of the 60 kHz slot "assumed
// to start at t = 0"; read literally in the 60 kHz slots that do not begin at
// 0 or 0.5 ms of a subframe (slots 1 and 3 of each subframe) that puts 16κ
// (0.52 µs) into symbols that have none on the grid. This package follows
// the grid there.
func Occasions(s Spectrum, index, sfn, mu int) ([]Occasion, error) {
	c, err := Lookup(s, index)
	if err != nil {
		return nil, err
	}
	if sfn < 0 || sfn > 1023 {
		return nil, fmt.Errorf("the SFN is %d; it must be 0 to 1023", sfn)
	}
	if !c.Format.Long() {
		lo, hi := 0, 1
		if s.FR() == 2 {
			lo, hi = 2, 3
		}
		if mu < lo || mu > hi {
			return nil, fmt.Errorf("msg1-SubcarrierSpacing gives μ = %d; with preamble format %v in FR%d it must be %d (%d kHz) or %d (%d kHz)",
				mu, c.Format, s.FR(), lo, 15<<lo, hi, 15<<hi)
		}
	}
	if !c.InFrame(sfn) {
		return nil, nil
	}
	frameTc := int64(0)
	var out []Occasion
	if c.Format.Long() {
		p := preambles[c.Format]
		allot, _ := LongAllotmentTc(c.Format)
		for _, sf := range c.Slots {
			start := frameTc + int64(sf)*TcPerSubframe + SymbolStartTc(0, c.StartSymbol)
			out = append(out, Occasion{
				SFN: sfn, Subframe: sf, Slot60: -1, Slot: sf, Symbol: c.StartSymbol, Format: c.Format,
				StartTc: start, CPTc: p.CPTc(0), SeqTc: p.UsefulTc(0), EndTc: start + allot,
			})
		}
		return out, nil
	}
	var nslots []int
	switch {
	case mu == 0 || mu == 2:
		nslots = []int{0}
	case c.SlotsPerSubframe == 1:
		nslots = []int{1}
	default:
		nslots = []int{0, 1}
	}
	for _, at := range c.Slots {
		// base: the first symbol of the subframe (FR1) or 60 kHz slot (FR2),
		// counted at μ from the start of its subframe.
		sf, base, slot60 := at, 0, -1
		if s.FR() == 2 {
			sf, slot60 = at/4, at
			base = (at % 4) * (14 << (mu - 2))
		}
		for _, ns := range nslots {
			for nt := 0; nt < c.OccasionsPerSlot; nt++ {
				l := c.StartSymbol + nt*c.Duration + 14*ns
				L := base + l
				f := c.Format
				if a, b := f.Pair(); a != b {
					f = a
					if nt == c.OccasionsPerSlot-1 {
						f = b
					}
				}
				p := preambles[f]
				sfStart := frameTc + int64(sf)*TcPerSubframe
				start := sfStart + SymbolStartTc(mu, L)
				cp, seq := p.CPTc(mu), p.UsefulTc(mu)
				// TS 38.211 5.3.2: 16κ more CP for each of the instants 0 and 0.5 ms
				// of a subframe that the preamble [start, start+N_u+N_CP^RA) holds.
				for _, inst := range []int64{sfStart, sfStart + TcPerHalfSubframe, sfStart + TcPerSubframe} {
					if inst >= start && inst < start+cp+seq {
						cp += 16 * Kappa
					}
				}
				slot := sf*(1<<mu) + L/14
				out = append(out, Occasion{
					SFN: sfn, Subframe: sf, Slot60: slot60, Slot: slot, NSlot: ns, Index: nt,
					Symbol: l, Duration: c.Duration, Format: f, Mu: mu,
					StartTc: start, CPTc: cp, SeqTc: seq, EndTc: sfStart + SymbolStartTc(mu, L+c.Duration),
				})
			}
		}
	}
	return out, nil
}
