package grid

import (
	"cmp"
	"errors"
	"fmt"
	"slices"
	"strings"

	"gridloom/grid/coreset0"
)

// InitialAccessOption is one SS/PBCH block position and pdcch-ConfigSIB1
// that pass every initial-access check.
type InitialAccessOption struct {
	// GSCN is the block's synchronization raster point, 0 when the plan
	// gives the carrier no frequency and the block stays where the plan
	// puts it.
	GSCN                   int `json:"gscn,omitempty"`
	OffsetToPointA         int `json:"offsetToPointA"`
	KSSB                   int `json:"kSsb"`
	ControlResourceSetZero int `json:"controlResourceSetZero"`
	SearchSpaceZero        int `json:"searchSpaceZero"`
	PDCCHConfigSIB1        int `json:"pdcchConfigSIB1"`
	// Table, Pattern, NRB, Symbols and StartCRB describe CORESET#0.
	Table    string `json:"table"`
	Pattern  int    `json:"pattern"`
	NRB      int    `json:"nrb"`
	Symbols  int    `json:"symbols"`
	StartCRB int    `json:"startCrb"`
	Low      Hz     `json:"lowHz"` // CORESET#0's outer edges relative to point A
	High     Hz     `json:"highHz"`
	// ClearOfSSB reports that CORESET#0 shares no spectrum with the
	// SS/PBCH block, so neither has to be rate-matched around the other.
	ClearOfSSB bool `json:"clearOfSsb"`
	// Warnings counts the initial-access warnings the row draws (pattern 1
	// occasions on the symbols of a block they overlap in frequency).
	Warnings int `json:"warnings"`
	// SSBFromCentre is how far the block's centre lies from the channel's.
	SSBFromCentre Hz `json:"ssbFromCentreHz"`
}

// InitialAccessSearch is what FindInitialAccess found.
type InitialAccessSearch struct {
	Band         string `json:"band,omitempty"` // the band whose SS raster entries were searched
	Table        string `json:"table"`          // the CORESET#0 table, "13-4"
	SSBSCSKHz    int    `json:"ssbScsKHz"`
	ScsCommonKHz int    `json:"scsCommonKHz"`
	// Positions is how many SS/PBCH block positions were tried: the GSCNs
	// where the block fits (see SSBPositions), or the plan's own one.
	Positions int                   `json:"positions"`
	Options   []InitialAccessOption `json:"options"`
	// Why says, when Options is empty, why no combination fits.
	Why string `json:"why,omitempty"`
}

// FindInitialAccess lists every SS/PBCH block position, controlResourceSetZero
// and searchSpaceZero that pass the initial-access checks for the plan's
// carrier, block spacing, subCarrierSpacingCommon, TDD pattern and initial
// BWPs. With the carrier's frequency known, the positions are the GSCNs
// SSBPositions finds (in band, when not ""); without, the block stays where
// the plan puts it. Best first: CORESET#0 clear of the block in frequency,
// then rows without warnings, then the widest CORESET#0, then the block nearest the channel centre, then
// the lowest numbers. The plan's own pdcch-ConfigSIB1 is ignored, its
// dmrsTypeAPosition and initial BWPs kept.
func FindInitialAccess(plan Plan, band string) (InitialAccessSearch, error) {
	p := plan.withDefaults()
	if p.SSB == nil {
		return InitialAccessSearch{}, errors.New("the plan has no ssb block; CORESET#0 is placed from the SS/PBCH block, so add ssb (scsKHz, and gscn or offsetToPointA and kSsb)")
	}
	base := p.InitialAccess
	p.InitialAccess = nil
	r := Compute(p)
	if r.Channel.Absolute && (p.SSB.GSCN != nil || p.SSB.OffsetToPointA != 0 || p.SSB.KSSB != 0) {
		// The finder chooses the block's position on the raster: a position
		// the plan gives, right or wrong, must not stop the search.
		p.SSB.GSCN, p.SSB.OffsetToPointA, p.SSB.KSSB = nil, 0, 0
		r = Compute(p)
	}
	if r.SSB == nil {
		return InitialAccessSearch{}, fmt.Errorf("the plan's ssb block has errors: %s", firstErrors(r.Findings))
	}
	rng := r.Channel.Range
	if rng == FR2_2 {
		return InitialAccessSearch{}, errors.New("CORESET#0 in FR2-2 follows TS 38.213 Tables 13-10A, 13-12A and 13-15A, which gridloom does not carry yet")
	}
	common := r.SSB.ScsCommonKHz
	cb, _ := coresetBand(rng, r.Channel)
	table, err := coreset0.SelectTable(r.SSB.Numerology.SCSKHz(), common, cb)
	if err != nil {
		return InitialAccessSearch{}, err
	}
	out := InitialAccessSearch{Table: strings.TrimPrefix(table.String(), "Table "), SSBSCSKHz: r.SSB.Numerology.SCSKHz(), ScsCommonKHz: common}
	var reasons []string
	seen := map[string]bool{}
	try := func(r *Result, gscn int) {
		opts, why := optionsAt(rng, table, base, p.SSB, r)
		for i := range opts {
			opts[i].GSCN = gscn
		}
		out.Options = append(out.Options, opts...)
		for _, w := range why {
			if k := strings.Map(noDigits, w); !seen[k] {
				seen[k] = true
				reasons = append(reasons, w)
			}
		}
	}
	if !r.Channel.Absolute {
		out.Positions = 1
		try(&r, 0)
	} else {
		search, err := SSBPositions(p, band)
		if err != nil {
			return InitialAccessSearch{}, err
		}
		out.Band = search.Band
		out.Positions = len(search.Positions)
		if len(search.Positions) == 0 {
			out.Why = fmt.Sprintf("No GSCN puts the %d kHz SS/PBCH block within %s; widen the channel or name another band.", out.SSBSCSKHz, search.Within)
			return out, nil
		}
		for _, pos := range search.Positions {
			q := p.Clone()
			g := pos.GSCN
			q.SSB.GSCN, q.SSB.OffsetToPointA, q.SSB.KSSB = &g, pos.OffsetToPointA, pos.KSSB
			rq := Compute(q)
			if rq.SSB == nil {
				continue
			}
			try(&rq, g)
		}
	}
	rankOptions(out.Options)
	if len(out.Options) == 0 {
		out.Why = whyNone(table, &r, reasons)
	}
	return out, nil
}

// optionsAt tries every pdcch-ConfigSIB1 for the block position of r and
// returns what passes and, one of each kind, why the rest fail.
func optionsAt(rng Range, table coreset0.Table, base *InitialAccessPlan, sp *SSBPlan, r *Result) ([]InitialAccessOption, []string) {
	var opts []InitialAccessOption
	var why []string
	ssbCentre := (r.SSB.Low + r.SSB.High) / 2
	for cs0 := range 16 {
		if table.Rows()[cs0].Reserved() {
			continue
		}
		for ss0 := range 16 {
			ia := base.clone()
			if ia == nil {
				ia = &InitialAccessPlan{}
			}
			ia.ControlResourceSetZero, ia.SearchSpaceZero = cs0, ss0
			var fs findings
			got := checkInitialAccess(&fs, rng, ia, sp, r, r.TDD)
			if i := slices.IndexFunc(fs, func(f Finding) bool { return f.Severity == Error }); i >= 0 || got == nil {
				if i < 0 {
					break
				}
				why = append(why, fs[i].Message)
				if fs[i].Field != iaField+".searchSpaceZero" {
					break // CORESET#0 itself does not fit: no searchSpaceZero helps
				}
				continue
			}
			c := got.CORESET0
			opts = append(opts, InitialAccessOption{OffsetToPointA: r.SSB.OffsetToPointA, KSSB: r.SSB.KSSB,
				ControlResourceSetZero: cs0, SearchSpaceZero: ss0, PDCCHConfigSIB1: got.MIB.PDCCHConfigSIB1,
				Table: c.Table, Pattern: c.Pattern, NRB: c.NRB, Symbols: c.Symbols, StartCRB: c.StartCRB, Low: c.Low, High: c.High,
				ClearOfSSB: min(c.High, r.SSB.High) <= max(c.Low, r.SSB.Low), SSBFromCentre: absHz(ssbCentre - r.Channel.Center),
				Warnings: countSeverity(fs, Warning)})
		}
	}
	return opts, why
}

// rankOptions sorts the options as an engineer prefers them.
func rankOptions(opts []InitialAccessOption) {
	slices.SortStableFunc(opts, func(a, b InitialAccessOption) int {
		if a.ClearOfSSB != b.ClearOfSSB {
			if a.ClearOfSSB {
				return -1
			}
			return 1
		}
		return cmp.Or(cmp.Compare(a.Warnings, b.Warnings), cmp.Compare(b.NRB, a.NRB), cmp.Compare(a.SSBFromCentre, b.SSBFromCentre),
			cmp.Compare(a.GSCN, b.GSCN), cmp.Compare(a.OffsetToPointA, b.OffsetToPointA), cmp.Compare(a.KSSB, b.KSSB),
			cmp.Compare(a.ControlResourceSetZero, b.ControlResourceSetZero), cmp.Compare(a.SearchSpaceZero, b.SearchSpaceZero))
	})
}

// whyNone explains an empty search: first the width that no row can fit,
// otherwise the distinct reasons the rows were refused.
func whyNone(table coreset0.Table, r *Result, reasons []string) string {
	narrowest := 0
	for _, row := range table.Rows() {
		if !row.Reserved() && (narrowest == 0 || row.NumRBs < narrowest) {
			narrowest = row.NumRBs
		}
	}
	common := table.PDCCHSCSkHz()
	width := Hz(narrowest) * 12 * Hz(common) * 1000
	if c, ok := r.Carrier(common); ok && c.CarrierBandwidth < narrowest {
		return fmt.Sprintf("The narrowest CORESET#0 of %s is %d RBs of %d kHz (%s), wider than the %d kHz carrier of %d PRBs (%s); choose a smaller subCarrierSpacingCommon or a wider channel.",
			table, narrowest, common, fmtKHz(width), common, c.CarrierBandwidth, fmtKHz(c.High-c.Low))
	}
	if ch := r.Channel; width > ch.High-ch.Low {
		return fmt.Sprintf("The narrowest CORESET#0 of %s is %d RBs of %d kHz (%s), wider than the %d MHz channel; choose a smaller subCarrierSpacingCommon or a wider channel.",
			table, narrowest, common, fmtKHz(width), ch.BandwidthMHz)
	}
	if len(reasons) > 3 {
		reasons = append(reasons[:3:3], fmt.Sprintf("(%d more reasons of other kinds.)", len(reasons)-3))
	}
	return "No row of " + table.String() + " passes the checks: " + strings.Join(reasons, " ")
}

func countSeverity(fs []Finding, sev Severity) int {
	n := 0
	for _, f := range fs {
		if f.Severity == sev {
			n++
		}
	}
	return n
}

func noDigits(r rune) rune {
	if r >= '0' && r <= '9' {
		return -1
	}
	return r
}

func absHz(f Hz) Hz {
	if f < 0 {
		return -f
	}
	return f
}

// firstErrors joins the messages of the first error findings.
func firstErrors(fs []Finding) string {
	var msgs []string
	for _, f := range fs {
		if f.Severity == Error && len(msgs) < 3 {
			msgs = append(msgs, f.Message)
		}
	}
	if len(msgs) == 0 {
		return "none reported"
	}
	return strings.Join(msgs, " ")
}
