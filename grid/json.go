package grid

// The JSON form of a Result, shared by the command line and the web API.
// kHz values are relative to point A; MHz values are absolute and present
// only when the plan ties the channel to a frequency.

// JSONResult is the document that Result.JSON returns.
type JSONResult struct {
	Plan       Plan            `json:"plan"`
	Channel    JSONChannel     `json:"channel"`
	Carriers   []JSONCarrier   `json:"carriers"`
	Partitions []JSONPartition `json:"partitions"`
	Findings   []Finding       `json:"findings"`
}

// JSONChannel is the channel of a JSONResult.
type JSONChannel struct {
	Range        string   `json:"range"`
	BandwidthMHz int      `json:"bandwidthMHz"`
	CenterMHz    *float64 `json:"centerMHz,omitempty"`
	ARFCN        *int     `json:"arfcn,omitempty"`
	PointAMHz    *float64 `json:"pointAMHz,omitempty"`
	PointAARFCN  *int     `json:"pointAArfcn,omitempty"`
	LowKHz       float64  `json:"lowKHz"`
	HighKHz      float64  `json:"highKHz"`
	CenterKHz    float64  `json:"centerKHz"`
	UsePercent   float64  `json:"usePercent"`
}

// JSONCarrier is one SCS-specific carrier of a JSONResult.
type JSONCarrier struct {
	SCSKHz           int     `json:"scsKHz"`
	NRB              int     `json:"nrb"`
	CarrierBandwidth int     `json:"carrierBandwidth"`
	OffsetToCarrier  int     `json:"offsetToCarrier"`
	OffsetChosen     bool    `json:"offsetChosen"`
	LowKHz           float64 `json:"lowKHz"`
	HighKHz          float64 `json:"highKHz"`
	MinGuardKHz      float64 `json:"minGuardKHz"`
	GuardLowKHz      float64 `json:"guardLowKHz"`
	GuardHighKHz     float64 `json:"guardHighKHz"`
}

// JSONPartition is one placed partition of a JSONResult, with its symbols.
type JSONPartition struct {
	Name                 string   `json:"name"`
	SCSKHz               int      `json:"scsKHz"`
	Mu                   int      `json:"mu"`
	CP                   string   `json:"cp"`
	StartCRB             int      `json:"startCrb"`
	SizePRB              int      `json:"sizePrb"`
	LocationAndBandwidth *int     `json:"locationAndBandwidth"` // null when not expressible
	LowKHz               float64  `json:"lowKHz"`
	HighKHz              float64  `json:"highKHz"`
	LowMHz               *float64 `json:"lowMHz,omitempty"`
	HighMHz              *float64 `json:"highMHz,omitempty"`
	OccupiedMHz          float64  `json:"occupiedMHz"`
	SlotsPerSubframe     int      `json:"slotsPerSubframe"`
	SymbolsPerSlot       int      `json:"symbolsPerSlot"`
	Slots                int      `json:"slots"`
	SymbolCount          int      `json:"symbolCount"`
	SlotUs               float64  `json:"slotUs"`
	UsefulUs             float64  `json:"usefulUs"`
	CPUs                 float64  `json:"cpUs"`
	LongCPUs             float64  `json:"longCpUs"`
	REPerSlot            int      `json:"rePerSlot"`
	Direction            string   `json:"direction"`
	Layers               int      `json:"layers"`
	Modulation           string   `json:"modulation"`
	PeakMbps             float64  `json:"peakMbps"`
	Symbols              []Symbol `json:"symbols"`
}

// JSON returns the JSON document of r. With symbols false the per-symbol
// lists are left empty, for callers that want the summary only.
func (r Result) JSON(symbols bool) JSONResult {
	ch := r.Channel
	out := JSONResult{
		Plan: r.Plan,
		Channel: JSONChannel{Range: ch.Range.String(), BandwidthMHz: ch.BandwidthMHz,
			LowKHz: ch.Low.KHz(), HighKHz: ch.High.KHz(), CenterKHz: ch.Center.KHz(), UsePercent: ch.UsePercent},
		Carriers:   []JSONCarrier{},
		Partitions: []JSONPartition{},
		Findings:   r.Findings,
	}
	if out.Findings == nil {
		out.Findings = []Finding{}
	}
	if ch.Absolute {
		out.Channel.CenterMHz = ptr(ch.CenterHz.MHz())
		out.Channel.PointAMHz = ptr(ch.PointAHz.MHz())
		if ch.OnRaster {
			out.Channel.ARFCN = ptr(ch.ARFCN)
		}
		if ch.PointAOnRaster {
			out.Channel.PointAARFCN = ptr(ch.PointAARFCN)
		}
	}
	for _, c := range r.Carriers {
		out.Carriers = append(out.Carriers, JSONCarrier{SCSKHz: c.SCSKHz, NRB: c.NRB, CarrierBandwidth: c.CarrierBandwidth,
			OffsetToCarrier: c.OffsetToCarrier, OffsetChosen: c.Chosen, LowKHz: c.Low.KHz(), HighKHz: c.High.KHz(),
			MinGuardKHz: c.MinGuard.KHz(), GuardLowKHz: c.GuardLow.KHz(), GuardHighKHz: c.GuardHigh.KHz()})
	}
	for _, l := range r.Partitions {
		n := l.Numerology
		jp := JSONPartition{Name: l.Name, SCSKHz: n.SCSKHz(), Mu: n.Mu, CP: n.CP.String(),
			StartCRB: l.StartCRB, SizePRB: l.SizePRB, LowKHz: l.Low.KHz(), HighKHz: l.High.KHz(),
			OccupiedMHz: l.Width().MHz(), SlotsPerSubframe: n.SlotsPerSubframe(), SymbolsPerSlot: n.SymbolsPerSlot(),
			Slots: l.SlotCount(), SymbolCount: l.SymbolCount(), SlotUs: n.SlotTc().Micros(),
			UsefulUs: n.UsefulTc().Micros(), CPUs: n.CPTc(1).Micros(), LongCPUs: n.CPTc(0).Micros(),
			REPerSlot: l.REPerSlot(), Direction: string(l.Direction), Layers: l.Layers, Modulation: l.Modulation,
			PeakMbps: l.PeakMbps, Symbols: []Symbol{}}
		if l.LocationAndBandwidth >= 0 {
			jp.LocationAndBandwidth = ptr(l.LocationAndBandwidth)
		}
		if ch.Absolute {
			jp.LowMHz = ptr(ch.Abs(l.Low).MHz())
			jp.HighMHz = ptr(ch.Abs(l.High).MHz())
		}
		if symbols {
			jp.Symbols = l.Symbols()
		}
		out.Partitions = append(out.Partitions, jp)
	}
	return out
}

func ptr[T any](v T) *T { return &v }
