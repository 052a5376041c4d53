package web

import (
	"errors"
	"fmt"
	"maps"
	"math"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/grid/gscn"
)

// Query keys that code refers to by name; simpleFields lists the rest.
const (
	keyName      = "name"
	keyGap       = "gap"
	keyRange     = "range"
	keyBandwidth = "bw"
	keySpan      = "span"
	keyOffset    = "off." // + SCS in kHz
	keyCarrierBW = "cbw." // + SCS in kHz
	keyOp        = "op"
	// keyQuery is not a query key: it keys the message about a query that
	// does not parse as a whole.
	keyQuery = "query"
)

// Partition keys, after the "pI." prefix, in the order they are written.
var partKeys = []string{"name", "scs", "cp", "start", "size", "riv", "dir", "layers", "mod"}

// simpleField is one plan-level form field: its query key, the plan path
// that messages and findings use, and where the Form keeps it.
type simpleField struct {
	key, path string
	val       func(*Form) *string
}

// simpleFields lists the plan-level fields in query order.
var simpleFields = []simpleField{
	{"name", "name", func(f *Form) *string { return &f.Name }},
	{"span", "spanMs", func(f *Form) *string { return &f.Span }},
	{"range", "carrier.range", func(f *Form) *string { return &f.Range }},
	{"band", "carrier.band", func(f *Form) *string { return &f.Band }},
	{"bw", "carrier.bandwidthMHz", func(f *Form) *string { return &f.Bandwidth }},
	{"fc", "carrier.centerMHz", func(f *Form) *string { return &f.Center }},
	{"arfcn", "carrier.arfcn", func(f *Form) *string { return &f.ARFCN }},
	{"gap", "numerologyGapKHz", func(f *Form) *string { return &f.Gap }},
	{"tdd.ref", "tdd.referenceScsKHz", func(f *Form) *string { return &f.TDD.Ref }},
	{"tdd.ms", "tdd.pattern1.periodMs", func(f *Form) *string { return &f.TDD.P1.Ms }},
	{"tdd.dl", "tdd.pattern1.downlinkSlots", func(f *Form) *string { return &f.TDD.P1.DL }},
	{"tdd.dlsym", "tdd.pattern1.downlinkSymbols", func(f *Form) *string { return &f.TDD.P1.DLSym }},
	{"tdd.ul", "tdd.pattern1.uplinkSlots", func(f *Form) *string { return &f.TDD.P1.UL }},
	{"tdd.ulsym", "tdd.pattern1.uplinkSymbols", func(f *Form) *string { return &f.TDD.P1.ULSym }},
	{"tdd2.ms", "tdd.pattern2.periodMs", func(f *Form) *string { return &f.TDD.P2.Ms }},
	{"tdd2.dl", "tdd.pattern2.downlinkSlots", func(f *Form) *string { return &f.TDD.P2.DL }},
	{"tdd2.dlsym", "tdd.pattern2.downlinkSymbols", func(f *Form) *string { return &f.TDD.P2.DLSym }},
	{"tdd2.ul", "tdd.pattern2.uplinkSlots", func(f *Form) *string { return &f.TDD.P2.UL }},
	{"tdd2.ulsym", "tdd.pattern2.uplinkSymbols", func(f *Form) *string { return &f.TDD.P2.ULSym }},
	{"ssb.scs", "ssb.scsKHz", func(f *Form) *string { return &f.SSB.SCS }},
	{"ssb.case", "ssb.case", func(f *Form) *string { return &f.SSB.Case }},
	{"ssb.bitmap", "ssb.bitmap", func(f *Form) *string { return &f.SSB.Bitmap }},
	{"ssb.off", "ssb.offsetToPointA", func(f *Form) *string { return &f.SSB.Off }},
	{"ssb.k", "ssb.kSsb", func(f *Form) *string { return &f.SSB.K }},
	{"ssb.common", "ssb.scsCommonKHz", func(f *Form) *string { return &f.SSB.Common }},
	{"ssb.period", "ssb.periodMs", func(f *Form) *string { return &f.SSB.Period }},
	{"ssb.gscn", "ssb.gscn", func(f *Form) *string { return &f.SSB.GSCN }},
	{"env.ds", "environment.delaySpreadNs", func(f *Form) *string { return &f.Env.DelayNs }},
	{"env.profile", "environment.delayProfile", func(f *Form) *string { return &f.Env.Profile }},
	{"env.speed", "environment.speedKmh", func(f *Form) *string { return &f.Env.Speed }},
	{"env.fc", "environment.carrierMHz", func(f *Form) *string { return &f.Env.CarrierMHz }},
}

// controlIDOfKey is the id of a form control: "f-" and its query key with
// dots as hyphens ("f-tdd-dlsym", "f-p1-size", "f-off-30").
func controlIDOfKey(key string) string { return "f-" + strings.ReplaceAll(key, ".", "-") }

// maxPartIndex bounds the partition indexes a query may use, so that a
// crafted link cannot make the form allocate without limit. It is well above
// grid.MaxPartitions, so a plan over the limit still shows and gets its finding.
const maxPartIndex = 4*grid.MaxPartitions - 1

// Form is the plan form as the user typed it: every value a string, so that
// a value that does not parse is kept and shown again beside its control.
//
// The query string of a page holds the whole plan, so that a link reproduces
// it. Keys are short and stable; they are part of every shared link:
//
//	name span range bw fc arfcn gap              plan and carrier
//	off.SCS cbw.SCS                              offsetToCarrier, carrierBandwidth per SCS (kHz)
//	tdd.ref tdd.ms tdd.dl tdd.dlsym tdd.ul tdd.ulsym   TDD reference SCS and pattern1
//	tdd2.ms tdd2.dl tdd2.dlsym tdd2.ul tdd2.ulsym      pattern2
//	ssb.scs ssb.case ssb.bitmap ssb.off ssb.k ssb.common ssb.period ssb.gscn
//	env.ds env.profile env.speed env.fc          radio channel for the numerology fit
//	pI.name pI.scs pI.cp pI.start pI.size        partition I, from 0
//	pI.riv pI.dir pI.layers pI.mod
//
// An absent key and an empty value mean the same: the plan field is left
// out, and a block (tdd, pattern2, ssb, env) is in the plan when any of its
// keys has a value. Other keys are ignored, so "op" and "download" can ride
// along.
type Form struct {
	Name, Span, Range, Band, Bandwidth, Center, ARFCN, Gap string
	Offset                                                 map[int]string // subcarrier spacing (kHz) → offsetToCarrier as typed
	CarrierBW                                              map[int]string // subcarrier spacing (kHz) → carrierBandwidth as typed
	TDD                                                    TDDForm
	SSB                                                    SSBForm
	Env                                                    EnvForm
	Parts                                                  []PartForm
}

// TDDForm is the TDD pattern of a Form: the reference spacing and up to two
// patterns.
type TDDForm struct {
	Ref    string
	P1, P2 PatternForm
}

// PatternForm is one TDD-UL-DL-Pattern of a Form.
type PatternForm struct{ Ms, DL, DLSym, UL, ULSym string }

// SSBForm is the SS/PBCH block configuration of a Form.
type SSBForm struct{ SCS, Case, Bitmap, Off, K, Common, Period, GSCN string }

// EnvForm is the radio channel of a Form, for the numerology fit.
type EnvForm struct{ DelayNs, Profile, Speed, CarrierMHz string }

func given(vals ...string) bool {
	return slices.ContainsFunc(vals, func(v string) bool { return strings.TrimSpace(v) != "" })
}

func (p PatternForm) given() bool { return given(p.Ms, p.DL, p.DLSym, p.UL, p.ULSym) }
func (t TDDForm) given() bool     { return given(t.Ref) || t.P1.given() || t.P2.given() }
func (s SSBForm) given() bool {
	return given(s.SCS, s.Case, s.Bitmap, s.Off, s.K, s.Common, s.Period, s.GSCN)
}
func (e EnvForm) given() bool { return given(e.DelayNs, e.Profile, e.Speed, e.CarrierMHz) }

// PartForm is one partition of a Form.
type PartForm struct {
	Name, SCS, CP, Start, Size, RIV, Dir, Layers, Mod string
}

func (p *PartForm) field(key string) *string {
	switch key {
	case "name":
		return &p.Name
	case "scs":
		return &p.SCS
	case "cp":
		return &p.CP
	case "start":
		return &p.Start
	case "size":
		return &p.Size
	case "riv":
		return &p.RIV
	case "dir":
		return &p.Dir
	case "layers":
		return &p.Layers
	case "mod":
		return &p.Mod
	}
	return nil
}

// Messages holds messages about a form, keyed by plan path ("carrier.bandwidthMHz",
// "partitions[1].sizePrb"), the same paths that grid.Finding.Field uses.
type Messages map[string]string

func (m Messages) add(field, format string, args ...any) {
	if _, dup := m[field]; !dup {
		m[field] = fmt.Sprintf(format, args...)
	}
}

// ParseQuery reads a Form from a query. It never fails: what it cannot use
// it reports in Messages, keyed by the plan path it concerns.
func ParseQuery(v url.Values) (Form, Messages) {
	msgs := Messages{}
	var f Form
	for _, sf := range simpleFields {
		*sf.val(&f) = v.Get(sf.key)
	}
	parts := map[int]*PartForm{}
	for key, vals := range v {
		val := ""
		if len(vals) > 0 {
			val = vals[0]
		}
		switch {
		case strings.HasPrefix(key, keyOffset):
			if scs, ok := scsKey(key[len(keyOffset):]); ok && val != "" {
				f.Offset = setMap(f.Offset, scs, val)
			}
		case strings.HasPrefix(key, keyCarrierBW):
			if scs, ok := scsKey(key[len(keyCarrierBW):]); ok && val != "" {
				f.CarrierBW = setMap(f.CarrierBW, scs, val)
			}
		case len(key) > 1 && key[0] == 'p':
			i, sub, ok := partKey(key)
			if !ok {
				continue
			}
			if i > maxPartIndex {
				msgs.add("partitions", "The link names partition p%d; partitions are numbered p0 to p%d.", i, maxPartIndex)
				continue
			}
			p := parts[i]
			if p == nil {
				p = &PartForm{}
				parts[i] = p
			}
			*p.field(sub) = val
		}
	}
	// Partitions keep the order of their indexes; gaps close up.
	idx := make([]int, 0, len(parts))
	for i := range parts {
		idx = append(idx, i)
	}
	slices.Sort(idx)
	for _, i := range idx {
		f.Parts = append(f.Parts, *parts[i])
	}
	return f, msgs
}

func setMap(m map[int]string, k int, v string) map[int]string {
	if m == nil {
		m = map[int]string{}
	}
	m[k] = v
	return m
}

// scsKey reads the spacing of an "off." or "cbw." key: a whole number of kHz
// without leading zeros, the same bound the plan file uses.
func scsKey(s string) (int, bool) {
	n, ok := index(s)
	return n, ok && n > 0 && n <= 960
}

// partKey splits "p12.size" into 12 and "size".
func partKey(key string) (int, string, bool) {
	num, sub, ok := strings.Cut(key[1:], ".")
	if !ok || !slices.Contains(partKeys, sub) {
		return 0, "", false
	}
	i, ok := index(num)
	return i, sub, ok
}

// index reads a decimal number of at most four digits without leading zeros,
// so every index has one spelling.
func index(s string) (int, bool) {
	if s == "" || len(s) > 4 || (len(s) > 1 && s[0] == '0') {
		return 0, false
	}
	n := 0
	for _, c := range s {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, true
}

// Query writes f as a query string with the keys in a fixed order, so that
// one form has one link. Empty values are left out, except each partition's
// name, which keeps an unnamed partition in the plan.
func (f Form) Query() string {
	var b strings.Builder
	put := func(k, v string, always bool) {
		if v == "" && !always {
			return
		}
		if b.Len() > 0 {
			b.WriteByte('&')
		}
		b.WriteString(k)
		b.WriteByte('=')
		b.WriteString(url.QueryEscape(v))
	}
	for _, sf := range simpleFields {
		put(sf.key, *sf.val(&f), false)
	}
	for _, scs := range sortedSCS(f.Offset) {
		put(keyOffset+strconv.Itoa(scs), f.Offset[scs], false)
	}
	for _, scs := range sortedSCS(f.CarrierBW) {
		put(keyCarrierBW+strconv.Itoa(scs), f.CarrierBW[scs], false)
	}
	for i := range f.Parts {
		p := &f.Parts[i]
		for _, k := range partKeys {
			put(fmt.Sprintf("p%d.%s", i, k), *p.field(k), k == "name")
		}
	}
	return b.String()
}

func sortedSCS[V any](m map[int]V) []int {
	keys := make([]int, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

// Plan reads the plan that f describes. A value that does not parse leaves
// its field unset and has a message in the result, keyed by the field's plan
// path; enumerations (range, cp, direction, modulation) pass through as typed,
// for grid.Compute to judge.
func (f Form) Plan() (grid.Plan, Messages) {
	msgs := Messages{}
	r := reader{msgs: msgs}
	p := grid.Plan{
		Name:   f.Name,
		SpanMs: r.count(f.Span, "spanMs", "Span (ms)", fmt.Sprintf("a whole number of milliseconds from 1 to %d", grid.MaxSpanMs)),
		Carrier: grid.CarrierPlan{
			Range: f.Range,
			Band:  f.Band,
			BandwidthMHz: r.count(f.Bandwidth, "carrier.bandwidthMHz", "Channel bandwidth",
				"a channel bandwidth in whole MHz, such as "+grid.JoinInts(rangeOf(f.Range).AllBandwidths())),
			CenterMHz: r.optFloat(f.Center, "carrier.centerMHz", "Centre frequency", "a frequency in MHz such as 3750 or 3750.12, or nothing"),
			ARFCN:     r.optCount(f.ARFCN, "carrier.arfcn", "NR-ARFCN", fmt.Sprintf("a whole number from 0 to %d, or nothing", grid.MaxARFCN)),
		},
		NumerologyGapKHz: r.optFloat(f.Gap, "numerologyGapKHz", "Gap between numerologies", "a spacing in kHz (0 turns the check off), or nothing for one PRB of the wider spacing"),
	}
	for _, scs := range sortedSCS(f.Offset) {
		field := fmt.Sprintf("carrier.offsetToCarrier.%d", scs)
		if n := r.optCount(f.Offset[scs], field, fmt.Sprintf("offsetToCarrier at %d kHz", scs), fmt.Sprintf("a whole number of CRBs from 0 to %d", grid.MaxOffset)); n != nil {
			p.Carrier.OffsetToCarrier = setIntMap(p.Carrier.OffsetToCarrier, scs, *n)
		}
	}
	for _, scs := range sortedSCS(f.CarrierBW) {
		field := fmt.Sprintf("carrier.carrierBandwidth.%d", scs)
		if n := r.optCount(f.CarrierBW[scs], field, fmt.Sprintf("carrierBandwidth at %d kHz", scs), fmt.Sprintf("a whole number of PRBs from 1 to %d", grid.MaxPRB)); n != nil {
			p.Carrier.CarrierBandwidth = setIntMap(p.Carrier.CarrierBandwidth, scs, *n)
		}
	}
	if f.TDD.given() {
		t := &grid.TDDPlan{
			ReferenceSCSKHz: r.count(f.TDD.Ref, "tdd.referenceScsKHz", "TDD reference SCS", "a subcarrier spacing in kHz: "+grid.JoinInts(rangeOf(f.Range).DataSCS())),
			Pattern1:        r.pattern(f.TDD.P1, "tdd.pattern1", "Pattern 1"),
		}
		if f.TDD.P2.given() {
			p2 := r.pattern(f.TDD.P2, "tdd.pattern2", "Pattern 2")
			t.Pattern2 = &p2
		}
		p.TDD = t
	}
	if s := f.SSB; s.given() {
		p.SSB = &grid.SSBPlan{
			SCSKHz:         r.count(s.SCS, "ssb.scsKHz", "SS/PBCH SCS", "a subcarrier spacing in kHz such as 15, 30, 120 or 240"),
			Case:           s.Case,
			Bitmap:         strings.TrimSpace(s.Bitmap),
			OffsetToPointA: r.count(s.Off, "ssb.offsetToPointA", "offsetToPointA", "a whole number of RBs (15 kHz in FR1, 60 kHz in FR2)"),
			KSSB:           r.count(s.K, "ssb.kSsb", "k_SSB", "a whole number of subcarriers from 0 to 23"),
			ScsCommonKHz:   r.count(s.Common, "ssb.scsCommonKHz", "subCarrierSpacingCommon", "15 or 30 kHz (FR1), 60 or 120 kHz (FR2), or nothing"),
			PeriodMs:       r.count(s.Period, "ssb.periodMs", "SS/PBCH period", "one of "+grid.JoinInts(grid.SSBPeriodsMs)+" ms"),
			GSCN:           r.optCount(s.GSCN, "ssb.gscn", "GSCN", fmt.Sprintf("a whole number from %d to %d, or nothing", gscn.MinGSCN, gscn.MaxGSCN)),
		}
	}
	if e := f.Env; e.given() {
		p.Environment = &grid.EnvironmentPlan{
			DelaySpreadNs: r.float0(e.DelayNs, "environment.delaySpreadNs", "Delay spread", "an RMS delay spread in ns, such as 100, or nothing with a delay profile"),
			DelayProfile:  e.Profile,
			SpeedKmh:      r.float0(e.Speed, "environment.speedKmh", "Speed", "a speed in km/h from 0 to 1000"),
			CarrierMHz:    r.float0(e.CarrierMHz, "environment.carrierMHz", "Carrier for Doppler", "a frequency in MHz, or nothing when the carrier has a centre"),
		}
	}
	scsAllowed := "a subcarrier spacing in kHz: " + grid.JoinInts(rangeOf(f.Range).DataSCS())
	for i, pf := range f.Parts {
		at := fmt.Sprintf("partitions[%d].", i)
		p.Partitions = append(p.Partitions, grid.PartitionPlan{
			Name:   pf.Name,
			SCSKHz: r.count(pf.SCS, at+"scsKHz", "SCS", scsAllowed),
			CP:     pf.CP,
			StartCRB: r.optCount(pf.Start, at+"startCrb", "Start CRB",
				fmt.Sprintf("a CRB index from 0 to %d, or nothing to start at the carrier's first CRB", grid.MaxStartCRB)),
			SizePRB: r.count(pf.Size, at+"sizePrb", "Size", fmt.Sprintf("a whole number of PRBs from 1 to %d", grid.MaxPRB)),
			LocationAndBandwidth: r.optCount(pf.RIV, at+"locationAndBandwidth", "locationAndBandwidth",
				fmt.Sprintf("a whole number from 0 to %d, or nothing", grid.MaxRIV)),
			Direction:  pf.Dir,
			Layers:     r.count(pf.Layers, at+"layers", "Layers", "a whole number: 1 to 8 for DL, 1 to 4 for UL"),
			Modulation: pf.Mod,
		})
	}
	return p, msgs
}

func setIntMap(m map[int]int, k, v int) map[int]int {
	if m == nil {
		m = map[int]int{}
	}
	m[k] = v
	return m
}

// rangeOf is the frequency range a form names, FR1 if it names none it knows.
func rangeOf(s string) grid.Range {
	for _, n := range grid.RangeNames() {
		if strings.EqualFold(s, n) {
			r, _ := grid.ParseRange(n)
			return r
		}
	}
	return grid.FR1
}

// maxNumber bounds whole numbers as the plan file does: far beyond any legal
// value, and small enough that no later arithmetic overflows.
const maxNumber = 1 << 31

type reader struct{ msgs Messages }

// optCount reads a whole number; empty means absent.
func (r reader) optCount(s, field, label, allowed string) *int {
	t := strings.TrimSpace(s)
	if t == "" {
		return nil
	}
	n, err := strconv.Atoi(t)
	var numErr *strconv.NumError
	switch {
	case errors.As(err, &numErr) && numErr.Err == strconv.ErrRange, err == nil && (n <= -maxNumber || n >= maxNumber):
		r.msgs.add(field, "%s: %s is far outside any value it can take; give %s.", label, t, allowed)
		return nil
	case err != nil:
		r.msgs.add(field, "%s: %q is not a whole number; give %s.", label, s, allowed)
		return nil
	}
	return &n
}

// count reads a whole number whose zero means "not given".
func (r reader) count(s, field, label, allowed string) int {
	if n := r.optCount(s, field, label, allowed); n != nil {
		return *n
	}
	return 0
}

func (r reader) pattern(pf PatternForm, at, label string) grid.TDDPattern {
	slots := "a whole number of slots of the reference SCS"
	symbols := "a whole number of symbols from 0 to 13"
	return grid.TDDPattern{
		PeriodMs:        r.float0(pf.Ms, at+".periodMs", label+" period (ms)", "one of "+joinFloats(grid.TDDPeriodsMs)+" ms"),
		DownlinkSlots:   r.count(pf.DL, at+".downlinkSlots", label+" downlink slots", slots),
		DownlinkSymbols: r.count(pf.DLSym, at+".downlinkSymbols", label+" downlink symbols", symbols),
		UplinkSlots:     r.count(pf.UL, at+".uplinkSlots", label+" uplink slots", slots),
		UplinkSymbols:   r.count(pf.ULSym, at+".uplinkSymbols", label+" uplink symbols", symbols),
	}
}

func joinFloats(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = strconv.FormatFloat(x, 'f', -1, 64)
	}
	return strings.Join(s, ", ")
}

// float0 reads a number whose zero means "not given".
func (r reader) float0(s, field, label, allowed string) float64 {
	if x := r.optFloat(s, field, label, allowed); x != nil {
		return *x
	}
	return 0
}

func (r reader) optFloat(s, field, label, allowed string) *float64 {
	t := strings.TrimSpace(s)
	if t == "" {
		return nil
	}
	x, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		r.msgs.add(field, "%s: %q is not a number; give %s.", label, s, allowed)
		return nil
	}
	return &x
}

// FormOf writes a plan as the form that reads back to it: Form.Plan of the
// result equals p. Zero counts are left empty, since the plan reads them as
// "not given" either way.
func FormOf(p grid.Plan) Form {
	f := Form{
		Name:      p.Name,
		Span:      itoa0(p.SpanMs),
		Range:     p.Carrier.Range,
		Band:      p.Carrier.Band,
		Bandwidth: itoa0(p.Carrier.BandwidthMHz),
		Center:    ftoaPtr(p.Carrier.CenterMHz),
		ARFCN:     itoaPtr(p.Carrier.ARFCN),
		Gap:       ftoaPtr(p.NumerologyGapKHz),
	}
	for scs, n := range p.Carrier.OffsetToCarrier {
		f.Offset = setMap(f.Offset, scs, strconv.Itoa(n))
	}
	for scs, n := range p.Carrier.CarrierBandwidth {
		f.CarrierBW = setMap(f.CarrierBW, scs, strconv.Itoa(n))
	}
	if t := p.TDD; t != nil {
		f.TDD = TDDForm{Ref: itoa0(t.ReferenceSCSKHz), P1: patternForm(t.Pattern1)}
		if t.Pattern2 != nil {
			f.TDD.P2 = patternForm(*t.Pattern2)
		}
	}
	if s := p.SSB; s != nil {
		// offsetToPointA is written even when 0: it keeps the block in the plan.
		f.SSB = SSBForm{SCS: itoa0(s.SCSKHz), Case: s.Case, Bitmap: s.Bitmap, Off: strconv.Itoa(s.OffsetToPointA),
			K: itoa0(s.KSSB), Common: itoa0(s.ScsCommonKHz), Period: itoa0(s.PeriodMs), GSCN: itoaPtr(s.GSCN)}
	}
	if e := p.Environment; e != nil {
		f.Env = EnvForm{DelayNs: ftoa0(e.DelaySpreadNs), Profile: e.DelayProfile, Speed: ftoa0(e.SpeedKmh), CarrierMHz: ftoa0(e.CarrierMHz)}
		if !f.Env.given() {
			// A block of zeros is still in the plan: its speed, written as
			// 0, keeps it there, as offsetToPointA does for the SS/PBCH block.
			f.Env.Speed = "0"
		}
	}
	for _, pp := range p.Partitions {
		f.Parts = append(f.Parts, PartForm{
			Name: pp.Name, SCS: itoa0(pp.SCSKHz), CP: pp.CP, Start: itoaPtr(pp.StartCRB), Size: itoa0(pp.SizePRB),
			RIV: itoaPtr(pp.LocationAndBandwidth), Dir: pp.Direction, Layers: itoa0(pp.Layers), Mod: pp.Modulation,
		})
	}
	return f
}

// patternForm writes every count, 0 included, so the pattern stays in the plan.
func patternForm(t grid.TDDPattern) PatternForm {
	return PatternForm{Ms: ftoa0(t.PeriodMs), DL: strconv.Itoa(t.DownlinkSlots), DLSym: strconv.Itoa(t.DownlinkSymbols),
		UL: strconv.Itoa(t.UplinkSlots), ULSym: strconv.Itoa(t.UplinkSymbols)}
}

func ftoa0(x float64) string {
	if x == 0 {
		return ""
	}
	return strconv.FormatFloat(x, 'f', -1, 64)
}

func itoa0(n int) string {
	if n == 0 {
		return ""
	}
	return strconv.Itoa(n)
}

func itoaPtr(p *int) string {
	if p == nil {
		return ""
	}
	return strconv.Itoa(*p)
}

func ftoaPtr(p *float64) string {
	if p == nil {
		return ""
	}
	return strconv.FormatFloat(*p, 'f', -1, 64)
}

// clone returns a deep copy of f.
func (f Form) clone() Form {
	g := f
	g.Offset = maps.Clone(f.Offset)
	g.CarrierBW = maps.Clone(f.CarrierBW)
	g.Parts = slices.Clone(f.Parts)
	return g
}
