package rrc_test

import (
	"math/rand"
	"os"
	"reflect"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
	"gridloom/grid/gscn"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
)

// bytesource hands out small numbers from fuzz input, 0 when it runs out.
type bytesource []byte

func (b *bytesource) n(k int) int {
	if len(*b) == 0 {
		return 0
	}
	v := int((*b)[0]) % k
	*b = (*b)[1:]
	return v
}

// planFrom builds a plan from fuzz bytes: any range, bandwidth, centre or
// NR-ARFCN, up to four partitions placed either way, a TDD pattern,
// SS/PBCH blocks placed by offsets or by a GSCN near the centre, and an
// operating band. Most such plans have errors and are refused by Encode;
// the rest must read back exactly. The choices added last take the last
// bytes, so that the earlier ones stay as they were.
func planFrom(data []byte) grid.Plan {
	b := bytesource(data)
	rng := []grid.Range{grid.FR1, grid.FR2_1, grid.FR2_2}[b.n(3)]
	p := grid.Plan{Name: []string{"", "fuzz", "a--b \"c\" */ \n d"}[b.n(3)], SpanMs: b.n(3)}
	if b.n(2) == 1 {
		p.Carrier.Range = rng.String()
	}
	bws := rng.AllBandwidths()
	p.Carrier.BandwidthMHz = bws[b.n(len(bws))]
	lo, _ := rng.Limits()
	switch b.n(3) {
	case 1:
		mhz := float64(lo)/1e6 + float64(b.n(200))*60 + 300
		p.Carrier.CenterMHz = &mhz
	case 2:
		n, _ := grid.FrequencyARFCN(lo + grid.Hz(b.n(200))*60e6 + 300e6)
		p.Carrier.ARFCN = &n
	}
	scs := rng.DataSCS()
	if b.n(2) == 1 {
		p.Carrier.OffsetToCarrier = map[int]int{}
		for _, k := range scs {
			p.Carrier.OffsetToCarrier[k] = b.n(4)
		}
	}
	for i := range b.n(4) + 1 {
		pp := grid.PartitionPlan{Name: string(rune('p' + i)), SCSKHz: scs[b.n(len(scs))]}
		if b.n(4) == 0 {
			pp.Name = ""
		}
		start, size := b.n(40)*4, b.n(30)+10
		switch b.n(3) {
		case 0:
			pp.StartCRB, pp.SizePRB = &start, size
		case 1:
			riv, _ := grid.EncodeRIV(start, size)
			pp.LocationAndBandwidth = &riv
		default:
			pp.SizePRB = size
		}
		pp.Direction = []string{"", "DL", "UL", "dl"}[b.n(4)]
		pp.CP = []string{"", "normal", "extended"}[b.n(3)]
		pp.Layers = b.n(3)
		pp.Modulation = []string{"", "QPSK", "256QAM"}[b.n(3)]
		p.Partitions = append(p.Partitions, pp)
	}
	if b.n(2) == 1 {
		per := grid.TDDPeriodsMs[b.n(len(grid.TDDPeriodsMs))]
		p.TDD = &grid.TDDPlan{ReferenceSCSKHz: scs[b.n(len(scs))], Pattern1: grid.TDDPattern{PeriodMs: per, DownlinkSlots: b.n(4), DownlinkSymbols: b.n(14), UplinkSlots: b.n(2), UplinkSymbols: b.n(3)}}
		if b.n(3) == 0 {
			p.TDD.Pattern2 = &grid.TDDPattern{PeriodMs: grid.TDDPeriodsMs[b.n(len(grid.TDDPeriodsMs))], DownlinkSlots: b.n(2)}
		}
	}
	if b.n(2) == 1 {
		ssbSCS := rng.SSBSCS()
		s := &grid.SSBPlan{SCSKHz: ssbSCS[b.n(len(ssbSCS))], OffsetToPointA: b.n(60), KSSB: b.n(24), PeriodMs: []int{0, 5, 20, 160}[b.n(4)]}
		if b.n(2) == 1 {
			s.Bitmap = []string{"1000", "10000001", "0110"}[b.n(3)]
		}
		if rng.FR2() && b.n(2) == 1 {
			s.ScsCommonKHz = scs[b.n(len(scs))]
		}
		p.SSB = s
	}
	if s := p.SSB; s != nil && rng == grid.FR1 && b.n(2) == 1 {
		s.ScsCommonKHz = []int{15, 30}[b.n(2)]
	}
	if s := p.SSB; s != nil && b.n(2) == 1 {
		var centre grid.Hz
		switch {
		case p.Carrier.CenterMHz != nil:
			centre = grid.Hz(*p.Carrier.CenterMHz * 1e6)
		case p.Carrier.ARFCN != nil:
			centre, _ = grid.ARFCNFrequency(*p.Carrier.ARFCN)
		}
		if below, _, ok := gscn.Nearest(gscn.Hz(centre)); ok {
			g := below + b.n(9) - 4
			s.GSCN, s.OffsetToPointA, s.KSSB = &g, 0, 0
		}
	}
	if b.n(2) == 1 {
		p.Carrier.Band = []string{"n78", "N77", "n41", "n1", "n257", "n258"}[b.n(6)]
	}
	// The timing keys and initial access, added with them.
	p.Carrier.NTAOffset = []string{"", "", "n0", "n25600", "n39936", "N25600"}[b.n(6)]
	for i := range p.Partitions {
		p.Partitions[i].UECapability = b.n(3)
		p.Partitions[i].DMRSAdditionalPosition = []string{"", "pos0", "pos1", "pos2", "pos3"}[b.n(5)]
	}
	if b.n(3) == 1 {
		p.Environment = &grid.EnvironmentPlan{CellRadiusKm: float64(b.n(20)) / 2, LatencyTargetMs: float64(b.n(10))}
	}
	if p.SSB != nil && b.n(2) == 1 {
		ia := &grid.InitialAccessPlan{ControlResourceSetZero: b.n(16), SearchSpaceZero: b.n(4), DMRSTypeAPosition: []string{"", "pos2", "pos3"}[b.n(3)]}
		bwp := func() *grid.InitialBWPPlan {
			start, size := b.n(20)*2, b.n(30)+24
			switch b.n(4) {
			case 1:
				return &grid.InitialBWPPlan{Partition: p.Partitions[0].Name}
			case 2:
				return &grid.InitialBWPPlan{StartCRB: &start, SizePRB: size}
			case 3:
				riv, _ := grid.EncodeRIV(start, size)
				return &grid.InitialBWPPlan{LocationAndBandwidth: &riv, CyclicPrefix: []string{"", "normal"}[b.n(2)]}
			}
			return nil
		}
		ia.InitialDownlinkBWP, ia.InitialUplinkBWP = bwp(), bwp()
		p.InitialAccess = ia
	}
	// Random access, added with rach-ConfigCommon. Few random plans can
	// place occasions (an uplink BWP, valid symbols, every block mapped):
	// the fixed corpus of TestRoundTripRandomPlans reaches none, so the
	// prach round trip rests on TestRoundTripPRACHPlans and on -fuzz.
	if p.SSB != nil && b.n(2) == 1 {
		p.PRACH = &grid.PRACHPlan{
			ConfigurationIndex:        []int{b.n(30), b.n(256), 256 + b.n(7), 100 + b.n(60)}[b.n(4)],
			Msg1SubcarrierSpacing:     []float64{0, 0, 15, 30, 60, 120, 1.25, 5}[b.n(8)],
			Msg1FDM:                   []int{0, 1, 2, 4, 8}[b.n(5)],
			Msg1FrequencyStart:        b.n(12),
			ZeroCorrelationZoneConfig: b.n(16),
			RestrictedSetConfig:       []string{"", "unrestrictedSet", "restrictedSetTypeA", "restrictedSetTypeB"}[b.n(4)],
			SSBPerRachOccasion:        []string{"", "1/8", "1/4", "1/2", "1", "2", "4", "8", "16"}[b.n(9)],
		}
	}
	return p
}

// exportable is planFrom's plan, without its prach when that alone makes
// it fail: most random prach blocks have errors, and dropping them keeps
// the other branches as often reached as before.
func exportable(data []byte) (grid.Plan, bool) {
	p := planFrom(data)
	if _, err := rrc.Encode(p); err == nil {
		return p, true
	}
	if p.PRACH == nil {
		return p, false
	}
	p.PRACH = nil
	_, err := rrc.Encode(p)
	return p, err == nil
}

func FuzzRoundTrip(f *testing.F) {
	f.Add([]byte{0, 1, 5, 1, 0, 1, 1, 2, 10, 20, 0, 1, 0, 1, 1, 1, 0, 2, 3, 4, 5, 1, 1, 0, 3, 4})
	f.Add([]byte{1, 0, 1, 2, 7, 0, 1, 0, 3, 1, 3, 30, 1, 2, 2, 2, 1, 0, 0, 1, 0, 2, 1, 0, 0, 20, 5, 2, 1, 1})
	f.Add([]byte{2, 1, 0, 0, 0, 0, 2, 0, 0, 2, 1, 0, 0, 1, 0})
	m := loadTypes(f)
	f.Fuzz(func(t *testing.T, data []byte) {
		p, ok := exportable(data)
		if !ok {
			return // a plan with errors is not exported
		}
		roundTrip(t, "fuzz", p)
		checkPlanValues(t, m, "fuzz", p)
	})
}

// FuzzDecode feeds text to Decode: it never panics, and a plan it reads
// that can be exported reads back to itself.
func FuzzDecode(f *testing.F) {
	plans, err := demo.All()
	if err != nil {
		f.Fatal(err)
	}
	for _, d := range plans {
		text, err := rrc.Encode(d.Plan)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(text)
	}
	// The plans with random access, so that mutations reach
	// rach-ConfigCommon.
	for _, name := range []string{"fdd-long", "dddsu", "fr2"} {
		b, err := os.ReadFile("../../testdata/prach/" + name + ".yaml")
		if err != nil {
			f.Fatal(err)
		}
		p, err := planfile.DecodeYAML(b)
		if err != nil {
			f.Fatal(err)
		}
		text, err := rrc.Encode(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(text)
	}
	f.Add([]byte("mib MIB ::= { ssb-SubcarrierOffset 3 }\nf FrequencyInfoDL ::= { absoluteFrequencyPointA 620000, scs-SpecificCarrierList { { offsetToCarrier 0, subcarrierSpacing kHz30, carrierBandwidth 106 } } }"))
	f.Fuzz(func(t *testing.T, text []byte) {
		d, err := rrc.Decode(text)
		if err != nil {
			return
		}
		again, err := rrc.Encode(d.Plan)
		if err != nil {
			return
		}
		d2, err := rrc.Decode(again)
		if err != nil {
			t.Fatalf("gridloom's own text does not read: %v\n%s", err, again)
		}
		if !reflect.DeepEqual(d2.Plan, d.Plan) {
			t.Fatalf("read → write → read changed the plan:\n%+v\n%+v\n%s", d.Plan, d2.Plan, again)
		}
	})
}

// TestRoundTripRandomPlans runs the round trip over a fixed corpus of
// generated plans, so that it is checked on every test run and not only
// under -fuzz: of 20000 inputs about 160 give a plan without errors (the
// band and synchronization-raster checks refuse most blocks placed by
// offsets at an absolute frequency).
func TestRoundTripRandomPlans(t *testing.T) {
	m := loadTypes(t)
	r := rand.New(rand.NewSource(18))
	exported, withSSB, withTDD, withBand, withGSCN, withIA, withNTA, withPRACH := 0, 0, 0, 0, 0, 0, 0, 0
	for range 40000 {
		b := make([]byte, 90)
		r.Read(b)
		p, ok := exportable(b)
		if !ok {
			continue
		}
		exported++
		if p.SSB != nil {
			withSSB++
		}
		if p.TDD != nil {
			withTDD++
		}
		if p.Carrier.Band != "" {
			withBand++
		}
		if p.SSB != nil && p.SSB.GSCN != nil {
			withGSCN++
		}
		if p.InitialAccess != nil {
			withIA++
		}
		if p.Carrier.NTAOffset != "" {
			withNTA++
		}
		if p.PRACH != nil {
			withPRACH++
		}
		roundTrip(t, "generated", p)
		checkPlanValues(t, m, "generated", p)
	}
	t.Logf("%d plans exported and read back (%d with SS/PBCH blocks, %d placed by GSCN, %d with TDD, %d naming a band, %d with initial access, %d with nTaOffset, %d with prach)", exported, withSSB, withGSCN, withTDD, withBand, withIA, withNTA, withPRACH)
	if exported < 100 || withSSB < 20 || withTDD < 20 || withGSCN < 3 || withBand < 10 || withIA < 3 || withNTA < 20 {
		t.Errorf("only %d plans (%d SS/PBCH, %d by GSCN, %d TDD, %d with a band, %d with initial access, %d with nTaOffset) reached the round trip; the generator should reach more", exported, withSSB, withGSCN, withTDD, withBand, withIA, withNTA)
	}
}
