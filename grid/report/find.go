package report

import "gridloom/grid"

// The finders' documents: what `gridloom ssb` and `gridloom initial` write
// with -format json and what POST /api/v1/ssb and /api/v1/initial answer,
// built here once so that the command line and the API cannot drift apart.

// SSBPositions is the JSON document of grid.SSBPositions.
type SSBPositions struct {
	Band         string        `json:"band,omitempty"`
	SCSKHz       int           `json:"scsKHz"`
	ScsCommonKHz int           `json:"scsCommonKHz"`
	Within       string        `json:"within"`
	Positions    []SSBPosition `json:"positions"`
}

// SSBPosition is one GSCN where the plan's block fits, with the offsets
// that put it there.
type SSBPosition struct {
	GSCN                 int     `json:"gscn"`
	SSRefMHz             float64 `json:"ssRefMHz"`
	AbsoluteFrequencySSB int     `json:"absoluteFrequencySSB"`
	OffsetToPointA       int     `json:"offsetToPointA"`
	KSSB                 int     `json:"kSsb"`
	LowMHz               float64 `json:"lowMHz"`
	HighMHz              float64 `json:"highMHz"`
}

// BuildSSBPositions makes the document of a GSCN search; Positions is
// never nil, so the JSON holds [] rather than null when nothing fits.
func BuildSSBPositions(found grid.SSBSearch) SSBPositions {
	doc := SSBPositions{Band: found.Band, SCSKHz: found.SCSKHz, ScsCommonKHz: found.ScsCommonKHz, Within: found.Within, Positions: []SSBPosition{}}
	for _, q := range found.Positions {
		doc.Positions = append(doc.Positions, SSBPosition{GSCN: q.GSCN, SSRefMHz: q.SSRefHz.MHz(), AbsoluteFrequencySSB: q.AbsoluteFrequencySSB,
			OffsetToPointA: q.OffsetToPointA, KSSB: q.KSSB, LowMHz: q.LowHz.MHz(), HighMHz: q.HighHz.MHz()})
	}
	return doc
}

// InitialOptions is the JSON document of grid.FindInitialAccess.
type InitialOptions struct {
	Band         string          `json:"band,omitempty"`
	Positions    int             `json:"positions"`
	Table        string          `json:"table"`
	SSBSCSKHz    int             `json:"ssbScsKHz"`
	ScsCommonKHz int             `json:"scsCommonKHz"`
	Options      []InitialOption `json:"options"`
	Why          string          `json:"why,omitempty"`
}

// InitialOption is one ranked combination of block position,
// controlResourceSetZero and searchSpaceZero; kHz from point A, MHz
// absolute when the channel has a frequency.
type InitialOption struct {
	GSCN                   int      `json:"gscn,omitempty"`
	OffsetToPointA         int      `json:"offsetToPointA"`
	KSSB                   int      `json:"kSsb"`
	ControlResourceSetZero int      `json:"controlResourceSetZero"`
	SearchSpaceZero        int      `json:"searchSpaceZero"`
	PDCCHConfigSIB1        int      `json:"pdcchConfigSIB1"`
	Pattern                int      `json:"pattern"`
	NRB                    int      `json:"nrb"`
	Symbols                int      `json:"symbols"`
	StartCRB               int      `json:"startCrb"`
	LowKHz                 float64  `json:"lowKHz"`
	HighKHz                float64  `json:"highKHz"`
	ClearOfSSB             bool     `json:"clearOfSsb"`
	Warnings               int      `json:"warnings"`
	SSBFromCentreKHz       float64  `json:"ssbFromCentreKHz"`
	LowMHz                 *float64 `json:"lowMHz,omitempty"`
	HighMHz                *float64 `json:"highMHz,omitempty"`
}

// BuildInitialOptions makes the document of an initial-access search; ch
// is the plan's channel, for the absolute edges.
func BuildInitialOptions(found grid.InitialAccessSearch, ch grid.Channel) InitialOptions {
	doc := InitialOptions{Band: found.Band, Positions: found.Positions, Table: found.Table, SSBSCSKHz: found.SSBSCSKHz, ScsCommonKHz: found.ScsCommonKHz, Why: found.Why, Options: []InitialOption{}}
	for _, o := range found.Options {
		j := InitialOption{GSCN: o.GSCN, OffsetToPointA: o.OffsetToPointA, KSSB: o.KSSB, ControlResourceSetZero: o.ControlResourceSetZero,
			SearchSpaceZero: o.SearchSpaceZero, PDCCHConfigSIB1: o.PDCCHConfigSIB1, Pattern: o.Pattern, NRB: o.NRB,
			Symbols: o.Symbols, StartCRB: o.StartCRB, LowKHz: o.Low.KHz(), HighKHz: o.High.KHz(), ClearOfSSB: o.ClearOfSSB, Warnings: o.Warnings,
			SSBFromCentreKHz: o.SSBFromCentre.KHz()}
		if ch.Absolute {
			lo, hi := ch.Abs(o.Low).MHz(), ch.Abs(o.High).MHz()
			j.LowMHz, j.HighMHz = &lo, &hi
		}
		doc.Options = append(doc.Options, j)
	}
	return doc
}
