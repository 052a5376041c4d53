package coreset0

import "fmt"

// Band is what TS 38.213 clause 13 asks of an operating band to choose a
// CORESET#0 table. The caller reads it from the band tables of TS 38.101-1
// and TS 38.101-2; this package keeps no list of bands.
type Band struct {
	// FR is the band's frequency range.
	FR FR
	// MinChannelBandwidthMHz is the band's minimum channel bandwidth (FR1
	// only): 5 or 10 MHz select Tables 13-1 to 13-4, 40 MHz Tables 13-5 and
	// 13-6. Release 17 has no table for other values (Release 18 adds 3 MHz).
	MinChannelBandwidthMHz int
	// SharedSpectrum marks an FR1 band operated with shared spectrum channel
	// access (Tables 13-1A and 13-4A).
	SharedSpectrum bool
	// Uses40MHzTables marks an FR1 band that TS 38.101-1 Table 5.2-1 sends to
	// Tables 13-5 and 13-6 whatever its minimum channel bandwidth (the text
	// read names it note 17 of Table 5.2-1; srsRAN applies it to n79 and
	// n104).
	Uses40MHzTables bool
}

// SelectTable returns the CORESET#0 table for an SS/PBCH block subcarrier
// spacing, a common subcarrier spacing (subCarrierSpacingCommon) and a band,
// as TS 38.213 clause 13 chooses it, or an error that says why none applies.
func SelectTable(ssbSCSkHz, commonSCSkHz int, band Band) (Table, error) {
	switch band.FR {
	case FR1:
		return selectFR1(ssbSCSkHz, commonSCSkHz, band)
	case FR2:
		return selectFR2(ssbSCSkHz, commonSCSkHz)
	}
	return 0, fmt.Errorf("The frequency range %d is not one this package knows; it must be FR1 or FR2 (FR2-1).", band.FR)
}

func selectFR1(ssb, common int, band Band) (Table, error) {
	if ssb != 15 && ssb != 30 {
		return 0, fmt.Errorf("The SS/PBCH subcarrier spacing %d kHz is not an FR1 SS/PBCH spacing; FR1 allows 15 or 30 kHz (TS 38.213 4.1).", ssb)
	}
	if common != 15 && common != 30 {
		return 0, fmt.Errorf("The common subcarrier spacing %d kHz is not one subCarrierSpacingCommon can carry in FR1; it must be 15 or 30 kHz (TS 38.331 MIB).", common)
	}
	if band.SharedSpectrum {
		switch {
		case ssb == 15 && common == 15:
			return Table13_1A, nil
		case ssb == 30 && common == 30:
			return Table13_4A, nil
		}
		return 0, fmt.Errorf("With shared spectrum channel access TS 38.213 has CORESET#0 tables only for {SS/PBCH, PDCCH} subcarrier spacings {15, 15} kHz (Table 13-1A) and {30, 30} kHz (Table 13-4A), not {%d, %d} kHz.", ssb, common)
	}
	if band.Uses40MHzTables || band.MinChannelBandwidthMHz == 40 {
		switch {
		case ssb == 30 && common == 15:
			return Table13_5, nil
		case ssb == 30 && common == 30:
			return Table13_6, nil
		}
		return 0, fmt.Errorf("For bands with a 40 MHz minimum channel bandwidth TS 38.213 has CORESET#0 tables only for a 30 kHz SS/PBCH block (Tables 13-5 and 13-6), not %d kHz.", ssb)
	}
	switch band.MinChannelBandwidthMHz {
	case 5, 10:
	case 3:
		return 0, fmt.Errorf("The minimum channel bandwidth 3 MHz has no CORESET#0 table in Release 17 of TS 38.213 (Release 18 adds Table 13-0); this package allows 5, 10 or 40 MHz.")
	default:
		return 0, fmt.Errorf("The minimum channel bandwidth %d MHz has no CORESET#0 table in TS 38.213 Release 17; it must be 5 or 10 MHz (Tables 13-1 to 13-4) or 40 MHz (Tables 13-5 and 13-6).", band.MinChannelBandwidthMHz)
	}
	switch {
	case ssb == 15 && common == 15:
		return Table13_1, nil
	case ssb == 15 && common == 30:
		return Table13_2, nil
	case ssb == 30 && common == 15:
		return Table13_3, nil
	default:
		return Table13_4, nil
	}
}

func selectFR2(ssb, common int) (Table, error) {
	if ssb != 120 && ssb != 240 {
		return 0, fmt.Errorf("The SS/PBCH subcarrier spacing %d kHz is not an FR2-1 SS/PBCH spacing; FR2-1 allows 120 or 240 kHz (TS 38.213 4.1).", ssb)
	}
	if common != 60 && common != 120 {
		return 0, fmt.Errorf("The common subcarrier spacing %d kHz is not one subCarrierSpacingCommon can carry in FR2-1; it must be 60 or 120 kHz (TS 38.331 MIB).", common)
	}
	switch {
	case ssb == 120 && common == 60:
		return Table13_7, nil
	case ssb == 120 && common == 120:
		return Table13_8, nil
	case ssb == 240 && common == 60:
		return Table13_9, nil
	default:
		return Table13_10, nil
	}
}

// MaxKSSB returns the largest k_SSB with which a CORESET for Type0-PDCCH is
// present: 23 in FR1, 11 in FR2 (TS 38.213 4.1 and 13; larger values say that
// the SS/PBCH block has no CORESET#0 and point to another GSCN).
func MaxKSSB(fr FR) int {
	if fr == FR2 {
		return 11
	}
	return 23
}

// Config is one CORESET#0 configuration: a table row resolved for a k_SSB.
type Config struct {
	// Table and Index say where the row was read (Index is
	// controlResourceSetZero).
	Table Table
	Index int
	// Pattern is the SS/PBCH block and CORESET multiplexing pattern, 1 to 3.
	Pattern int
	// NumRBs and NumSymbols are N_RB^CORESET and N_symb^CORESET.
	NumRBs, NumSymbols int
	// OffsetRBs is the table's offset for the k_SSB given to Lookup, in RBs
	// of the CORESET's subcarrier spacing.
	OffsetRBs int
}

// Lookup reads row controlResourceSetZero of a table and resolves its offset
// for k_SSB: the rows of patterns 2 and 3 that TS 38.213 writes as "−41 if
// k_SSB = 0, −42 if k_SSB > 0" (Tables 13-7, 13-10) or "−20 … −21" (Table
// 13-8) take one RB more when the SS/PBCH block is shifted by k_SSB > 0.
func Lookup(t Table, controlResourceSetZero, kSSB int) (Config, error) {
	if !t.valid() {
		return Config{}, fmt.Errorf("The CORESET#0 table %d is not one of TS 38.213 Tables 13-1 to 13-10.", uint8(t))
	}
	if controlResourceSetZero < 0 || controlResourceSetZero > 15 {
		return Config{}, fmt.Errorf("controlResourceSetZero %d is out of range; it is 4 bits, 0 to 15 (TS 38.331 MIB).", controlResourceSetZero)
	}
	if maxK := MaxKSSB(t.FR()); kSSB < 0 || kSSB > maxK {
		return Config{}, fmt.Errorf("k_SSB %d is out of range for a CORESET#0 in %v; it must be 0 to %d (larger values say no CORESET#0 is present, TS 38.213 13).", kSSB, t.FR(), maxK)
	}
	r := tableInfos[t].rows[controlResourceSetZero]
	if r.Reserved() {
		return Config{}, fmt.Errorf("controlResourceSetZero %d is reserved in %v; it allows %s.", controlResourceSetZero, t, t.allowedIndexes())
	}
	return Config{
		Table:      t,
		Index:      controlResourceSetZero,
		Pattern:    r.Pattern,
		NumRBs:     r.NumRBs,
		NumSymbols: r.NumSymbols,
		OffsetRBs:  r.OffsetFor(kSSB),
	}, nil
}

func (t Table) allowedIndexes() string {
	rows := tableInfos[t].rows
	last := -1
	for i, r := range rows {
		if !r.Reserved() {
			last = i
		}
	}
	return fmt.Sprintf("0 to %d", last)
}

// WidthHz returns the CORESET's width, N_RB^CORESET × 12 subcarriers of the
// CORESET's spacing.
func (c Config) WidthHz() int64 {
	return int64(c.NumRBs) * 12 * int64(c.Table.PDCCHSCSkHz()) * 1000
}

// SSBPosition places an SS/PBCH block relative to point A with the two
// integers the network signals.
type SSBPosition struct {
	// FR decides the units of the two fields below.
	FR FR
	// CommonSCSkHz is subCarrierSpacingCommon: the SCS of CORESET#0 and of
	// the CRB grid the offsets refer to.
	CommonSCSkHz int
	// OffsetToPointA is the offset from point A to the lowest subcarrier of
	// the lowest common-SCS RB that overlaps the SS/PBCH block, in RBs of
	// 15 kHz (FR1) or 60 kHz (FR2) (TS 38.211 4.4.4.2, TS 38.331
	// offsetToPointA).
	OffsetToPointA int
	// KSSB is k_SSB, the offset from that RB's subcarrier 0 to the SS/PBCH
	// block's subcarrier 0, in subcarriers of 15 kHz (FR1) or of the common
	// SCS (FR2) (TS 38.211 7.4.3.1).
	KSSB int
}

// unitsKHz returns the kHz of one offsetToPointA RB's subcarrier and of one
// k_SSB step.
func (p SSBPosition) unitsKHz() (refKHz, kKHz int) {
	if p.FR == FR2 {
		return 60, p.CommonSCSkHz
	}
	return 15, 15
}

func (p SSBPosition) check() error {
	switch {
	case p.FR == FR1 && p.CommonSCSkHz != 15 && p.CommonSCSkHz != 30:
		return fmt.Errorf("The common subcarrier spacing %d kHz is not one FR1 allows; it must be 15 or 30 kHz.", p.CommonSCSkHz)
	case p.FR == FR2 && p.CommonSCSkHz != 60 && p.CommonSCSkHz != 120:
		return fmt.Errorf("The common subcarrier spacing %d kHz is not one FR2 allows; it must be 60 or 120 kHz.", p.CommonSCSkHz)
	case p.FR != FR1 && p.FR != FR2:
		return fmt.Errorf("The frequency range %d is not one this package knows; it must be FR1 or FR2.", p.FR)
	case p.OffsetToPointA < 0 || p.OffsetToPointA > 2199:
		return fmt.Errorf("offsetToPointA %d is out of range; it must be 0 to 2199 (TS 38.331).", p.OffsetToPointA)
	case p.KSSB < 0 || p.KSSB > MaxKSSB(p.FR):
		return fmt.Errorf("k_SSB %d is out of range for a CORESET#0 in %v; it must be 0 to %d.", p.KSSB, p.FR, MaxKSSB(p.FR))
	}
	refKHz, _ := p.unitsKHz()
	if ratio := p.CommonSCSkHz / refKHz; p.OffsetToPointA%ratio != 0 {
		return fmt.Errorf("offsetToPointA %d does not fall on a %d kHz common RB: it counts %d kHz RBs and must be a multiple of %d here.", p.OffsetToPointA, p.CommonSCSkHz, refKHz, ratio)
	}
	return nil
}

// FirstSubcarrierHz returns the centre of the SS/PBCH block's subcarrier 0
// above point A: offsetToPointA × 12 × 15 kHz + k_SSB × 15 kHz in FR1,
// offsetToPointA × 12 × 60 kHz + k_SSB × the common SCS in FR2.
func (p SSBPosition) FirstSubcarrierHz() (int64, error) {
	if err := p.check(); err != nil {
		return 0, err
	}
	refKHz, kKHz := p.unitsKHz()
	return (int64(p.OffsetToPointA)*12*int64(refKHz) + int64(p.KSSB)*int64(kKHz)) * 1000, nil
}

// ReferenceCRB returns the common RB (at the common SCS) that overlaps the
// SS/PBCH block's first RB, the one its subcarrier 0 falls in. The CORESET#0
// offsets count from it.
func (p SSBPosition) ReferenceCRB() (int, error) {
	f, err := p.FirstSubcarrierHz()
	if err != nil {
		return 0, err
	}
	return int(f / (12 * int64(p.CommonSCSkHz) * 1000)), nil
}

// Placement is where CORESET#0 sits on the common RB grid of the common SCS.
type Placement struct {
	// FirstCRB is the common RB index of CORESET#0's first RB; NumRBs RBs
	// follow it.
	FirstCRB, NumRBs int
	// ReferenceCRB is the common RB overlapping the SS/PBCH block's first RB.
	ReferenceCRB int
	// LowHz and HighHz bound CORESET#0 as the half-open interval [LowHz,
	// HighHz) of subcarrier edges above point A (an edge sits half a
	// subcarrier below the centre of subcarrier 0).
	LowHz, HighHz int64
}

// Place puts CORESET#0 on the common RB grid: its first RB is the reference
// CRB minus the table's offset (TS 38.213 13: "the offset is defined … from
// the smallest RB index of the CORESET … to the smallest RB index of the
// common RB overlapping with the first RB of the corresponding SS/PBCH
// block"). The k_SSB of the position resolves the k_SSB-dependent rows; a
// CORESET that would start below CRB 0 is an error. With shared spectrum
// (Tables 13-1A, 13-4A) this is the placement for an SS/PBCH block on a
// synchronization raster entry; a block placed off the raster by ssbFrequency
// adds a second offset (TS 38.213 13) that Place does not compute.
func Place(t Table, controlResourceSetZero int, p SSBPosition) (Placement, error) {
	if p.FR != t.FR() || p.CommonSCSkHz != t.PDCCHSCSkHz() {
		return Placement{}, fmt.Errorf("The SS/PBCH position (%v, common SCS %d kHz) does not match %v, which is for %v with a %d kHz CORESET.", p.FR, p.CommonSCSkHz, t, t.FR(), t.PDCCHSCSkHz())
	}
	cfg, err := Lookup(t, controlResourceSetZero, p.KSSB)
	if err != nil {
		return Placement{}, err
	}
	ref, err := p.ReferenceCRB()
	if err != nil {
		return Placement{}, err
	}
	first := ref - cfg.OffsetRBs
	if first < 0 {
		return Placement{}, fmt.Errorf("CORESET#0 of %v index %d would start at common RB %d, below point A: offsetToPointA %d leaves only %d common RBs under the SS/PBCH block for an offset of %d RBs.", t, controlResourceSetZero, first, p.OffsetToPointA, ref, cfg.OffsetRBs)
	}
	scsHz := int64(p.CommonSCSkHz) * 1000
	low := int64(first)*12*scsHz - scsHz/2
	return Placement{
		FirstCRB:     first,
		NumRBs:       cfg.NumRBs,
		ReferenceCRB: ref,
		LowHz:        low,
		HighHz:       low + int64(cfg.NumRBs)*12*scsHz,
	}, nil
}
