package grid

import (
	"errors"
	"slices"
	"strings"

	"gridloom/grid/prach"
)

// PRACHChoice is one prach-ConfigurationIndex whose every occasion is valid
// on the plan's TDD pattern and SS/PBCH blocks and that maps every sent
// block within an association period.
type PRACHChoice struct {
	ConfigurationIndex int
	Format             string
	SCSKHz             float64 // Δf^RA
	// OccasionsPer10ms counts occasions in time and frequency (msg1-FDM)
	// per 10 ms, averaged over the configuration period.
	OccasionsPer10ms        float64
	CellRangeKm             float64
	ConfigPeriodFrames      int
	AssociationPeriodFrames int
	// AssociationPatternPeriodFrames is the association pattern period of
	// TS 38.213 8.1 in frames (see PRACH).
	AssociationPatternPeriodFrames int
	// Warnings counts the prach warnings the index draws (such as a
	// cyclic-shift range below the guard's).
	Warnings int
}

// PRACHGroup holds the choices of one preamble format, in index order.
type PRACHGroup struct {
	Format  string
	Choices []PRACHChoice
}

// PRACHFound is what FindPRACH finds: the table it searched and the indexes
// that fit, grouped by format in the table's order of first appearance.
type PRACHFound struct {
	Table  string
	Tried  int
	Groups []PRACHGroup
}

// Count is the number of indexes found.
func (f PRACHFound) Count() int {
	n := 0
	for _, g := range f.Groups {
		n += len(g.Choices)
	}
	return n
}

// FindPRACH lists every configuration index of the plan's PRACH table that
// fits the plan as it stands: all its occasions valid (TS 38.213 8.1), every
// sent SS/PBCH block mapped, the occasions inside the uplink BWP and the
// carrier, and the plan's other prach keys (msg1-FDM, msg1-FrequencyStart,
// zeroCorrelationZoneConfig, restrictedSetConfig, ssbPerRachOccasion and, for
// the short formats, msg1-SubcarrierSpacing) accepted for it. Without a prach
// block the keys take their defaults. Engineers change the TDD pattern and
// then need an index again; this answers that in one call: the plan is
// computed once and each index costs only its own occasions.
func FindPRACH(plan Plan) (PRACHFound, error) {
	q := plan.Clone()
	pp := PRACHPlan{}
	if q.PRACH != nil {
		pp = *q.PRACH
	}
	q.PRACH = nil
	res := Compute(q)
	var why []string
	for _, f := range res.Findings {
		if f.Severity == Error {
			why = append(why, f.Message)
		}
	}
	if len(why) > 0 {
		return PRACHFound{}, errors.New("The plan has errors to fix before a PRACH index can be chosen: " + strings.Join(why, " "))
	}
	spec, err := prachSpectrum(&res)
	if err != nil {
		return PRACHFound{}, errors.New(capitalise(err.Error()))
	}
	if res.SSB == nil {
		return PRACHFound{}, errors.New("Finding a PRACH index needs the SS/PBCH blocks: add an ssb block, since TS 38.213 8.1 maps them onto the occasions.")
	}
	unpaired := spec != prach.FR1Paired
	bwp, source, ok := defaultPRACHBWP(&res, unpaired)
	if !ok {
		return PRACHFound{}, errors.New("Finding a PRACH index needs an uplink BWP: give initialAccess.initialUplinkBWP or a partition with direction UL.")
	}
	layout := prachLayout(&res, unpaired)
	out := PRACHFound{Table: spec.Table(), Tried: spec.Len()}
	seen := validities{}
	for index := range spec.Len() {
		pp.ConfigurationIndex = index
		var fs findings
		pr, ok := readPRACH(&fs, res.Channel.Range, spec, &pp, bwp.SCSKHz)
		if !ok {
			continue
		}
		pr.finder = true
		p := buildPRACH(&fs, pr, &res, bwp, source, layout, seen)
		if p == nil || slices.ContainsFunc(fs, func(f Finding) bool { return f.Severity == Error }) ||
			slices.ContainsFunc(p.Occasions, func(o PRACHOccasion) bool { return !o.Valid }) {
			continue
		}
		c := PRACHChoice{ConfigurationIndex: index, Format: p.Format, SCSKHz: float64(p.SCSHz) / 1000,
			OccasionsPer10ms: p.ValidPer10ms, CellRangeKm: p.CellRangeKm, ConfigPeriodFrames: p.ConfigPeriodFrames,
			AssociationPeriodFrames: p.AssociationPeriodFrames, AssociationPatternPeriodFrames: p.AssociationPatternPeriodFrames,
			Warnings: len(fs)}
		g := slices.IndexFunc(out.Groups, func(g PRACHGroup) bool { return g.Format == c.Format })
		if g < 0 {
			out.Groups = append(out.Groups, PRACHGroup{Format: c.Format})
			g = len(out.Groups) - 1
		}
		out.Groups[g].Choices = append(out.Groups[g].Choices, c)
	}
	return out, nil
}
