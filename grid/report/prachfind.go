package report

import "gridloom/grid"

// PRACHFinder is the document of the PRACH configuration finder
// (grid.FindPRACH): the same for "gridloom prach -format json" and
// POST /api/v1/prach, so that a script reads either.
type PRACHFinder struct {
	Table  string             `json:"table"`
	Tried  int                `json:"tried"`
	Count  int                `json:"count"`
	Groups []PRACHFinderGroup `json:"groups"`
}

// PRACHFinderGroup holds the fitting indexes of one preamble format.
type PRACHFinderGroup struct {
	Format  string              `json:"format"`
	Choices []PRACHFinderChoice `json:"choices"`
}

// PRACHFinderChoice is one fitting prach-ConfigurationIndex.
type PRACHFinderChoice struct {
	ConfigurationIndex             int     `json:"configurationIndex"`
	SCSKHz                         float64 `json:"scsKHz"`
	OccasionsPer10ms               float64 `json:"occasionsPer10ms"`
	CellRangeKm                    float64 `json:"cellRangeKm"`
	ConfigPeriodFrames             int     `json:"configPeriodFrames"`
	AssociationPeriodFrames        int     `json:"associationPeriodFrames"`
	AssociationPatternPeriodFrames int     `json:"associationPatternPeriodFrames"`
	Warnings                       int     `json:"warnings"`
}

// BuildPRACHFinder turns what FindPRACH found into its document; Groups is
// never null, so that "none fits" reads as an empty list.
func BuildPRACHFinder(found grid.PRACHFound) PRACHFinder {
	doc := PRACHFinder{Table: found.Table, Tried: found.Tried, Count: found.Count(), Groups: []PRACHFinderGroup{}}
	for _, g := range found.Groups {
		jg := PRACHFinderGroup{Format: g.Format}
		for _, c := range g.Choices {
			jg.Choices = append(jg.Choices, PRACHFinderChoice{ConfigurationIndex: c.ConfigurationIndex, SCSKHz: c.SCSKHz,
				OccasionsPer10ms: c.OccasionsPer10ms, CellRangeKm: c.CellRangeKm, ConfigPeriodFrames: c.ConfigPeriodFrames,
				AssociationPeriodFrames: c.AssociationPeriodFrames, AssociationPatternPeriodFrames: c.AssociationPatternPeriodFrames,
				Warnings: c.Warnings})
		}
		doc.Groups = append(doc.Groups, jg)
	}
	return doc
}
