package planform

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
)

// Query keys that code refers to by name; Fields lists the plan's.
const (
	keyOffset    = "off." // + SCS in kHz
	keyCarrierBW = "cbw." // + SCS in kHz
	// KeyOp is the query key of an edit (see ApplyOp); it rides along with
	// the plan's keys.
	KeyOp = "op"
	// KeyQuery is not a query key: it keys the message about a query that
	// does not parse as a whole.
	KeyQuery = "query"
)

// OffsetKey is the query key of offsetToCarrier at a spacing ("off.30").
func OffsetKey(scsKHz int) string { return keyOffset + strconv.Itoa(scsKHz) }

// CarrierBWKey is the query key of carrierBandwidth at a spacing ("cbw.30").
func CarrierBWKey(scsKHz int) string { return keyCarrierBW + strconv.Itoa(scsKHz) }

// maxPartIndex bounds the partition indexes a query may use, so that a
// crafted link cannot make the form allocate without limit. It is well above
// grid.MaxPartitions, so a plan over the limit still shows and gets its finding.
const maxPartIndex = 4*grid.MaxPartitions - 1

// Value returns the text of a query key in f, plan-level ("bw") or of a
// partition ("p2.size"), or nil when f has no such field.
func (f *Form) Value(key string) *string {
	if fl, ok := fieldByKey[key]; ok {
		return fl.form(f, 0)
	}
	if i, sub, ok := partKey(key); ok && i < len(f.Parts) {
		return partFieldByKey[sub].form(f, i)
	}
	return nil
}

// Messages holds messages about a form, keyed by plan path ("carrier.bandwidthMHz",
// "partitions[1].sizePrb"), the same paths that grid.Finding.Field uses.
// Each is a whole sentence.
type Messages map[string]string

// Add keeps the first message about a field.
func (m Messages) Add(field, format string, args ...any) {
	if _, dup := m[field]; !dup {
		m[field] = fmt.Sprintf(format, args...)
	}
}

// ParseQuery reads a Form from a query. It never fails: what it cannot use
// it reports in Messages, keyed by the plan path it concerns.
func ParseQuery(v url.Values) (Form, Messages) {
	msgs := Messages{}
	var f Form
	for i := range Fields {
		if fl := &Fields[i]; fl.Block != BlockPartition {
			*fl.form(&f, 0) = v.Get(fl.Key)
		}
	}
	type partValue struct{ key, val string }
	parts := map[int][]partValue{}
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
				msgs.Add("partitions", "The link names partition p%d; partitions are numbered p0 to p%d.", i, maxPartIndex)
				continue
			}
			parts[i] = append(parts[i], partValue{sub, val})
		}
	}
	// Partitions keep the order of their indexes; gaps close up.
	idx := slices.Sorted(maps.Keys(parts))
	f.Parts = make([]PartForm, len(idx))
	for j, i := range idx {
		for _, pv := range parts[i] {
			*partFieldByKey[pv.key].form(&f, j) = pv.val
		}
	}
	if len(f.Parts) == 0 {
		f.Parts = nil
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
	n, ok := Index(s)
	return n, ok && n > 0 && n <= 960
}

// partKey splits "p12.size" into 12 and "size".
func partKey(key string) (int, string, bool) {
	if len(key) < 2 || key[0] != 'p' {
		return 0, "", false
	}
	num, sub, ok := strings.Cut(key[1:], ".")
	if _, known := partFieldByKey[sub]; !ok || !known {
		return 0, "", false
	}
	i, ok := Index(num)
	return i, sub, ok
}

// Index reads a decimal number of at most four digits without leading
// zeros, so every index in a key or an op has one spelling.
func Index(s string) (int, bool) {
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
	for i := range Fields {
		if fl := &Fields[i]; fl.Block != BlockPartition {
			put(fl.Key, *fl.form(&f, 0), false)
		}
	}
	for _, scs := range slices.Sorted(maps.Keys(f.Offset)) {
		put(OffsetKey(scs), f.Offset[scs], false)
	}
	for _, scs := range slices.Sorted(maps.Keys(f.CarrierBW)) {
		put(CarrierBWKey(scs), f.CarrierBW[scs], false)
	}
	for i := range f.Parts {
		for k := range Fields {
			if fl := &Fields[k]; fl.Block == BlockPartition {
				put(fl.FullKey(i), *fl.form(&f, i), fl.Key == "name")
			}
		}
	}
	return b.String()
}

// givenBlocks lists the optional blocks that hold a value in f. Pattern 2
// brings the TDD block with it.
func (f *Form) givenBlocks() map[Block]bool {
	given := map[Block]bool{BlockPlan: true}
	for i := range Fields {
		if fl := &Fields[i]; fl.Block != BlockPartition && strings.TrimSpace(*fl.form(f, 0)) != "" {
			given[fl.Block] = true
		}
	}
	if given[BlockPattern2] {
		given[BlockTDD] = true
	}
	if given[BlockInitDL] || given[BlockInitUL] {
		given[BlockInit] = true
	}
	return given
}

// Plan reads the plan that f describes. A value that does not parse leaves
// its field unset and has a message in the result, keyed by the field's plan
// path; enumerations (range, cp, direction, modulation) pass through as typed,
// for grid.Compute to judge.
func (f Form) Plan() (grid.Plan, Messages) {
	msgs := Messages{}
	r := reader{msgs: msgs, rng: RangeOf(f.Range)}
	var p grid.Plan
	given := f.givenBlocks()
	if len(f.Parts) > 0 {
		p.Partitions = make([]grid.PartitionPlan, len(f.Parts))
	}
	for k := range Fields {
		fl := &Fields[k]
		switch {
		case fl.Block == BlockPartition:
			for i := range f.Parts {
				r.set(fl, fl.plan(&p, i), *fl.form(&f, i), fl.FullPath(i))
			}
		case given[fl.Block]:
			r.set(fl, fl.plan(&p, 0), *fl.form(&f, 0), fl.Path)
		}
	}
	for _, scs := range slices.Sorted(maps.Keys(f.Offset)) {
		field := fmt.Sprintf("carrier.offsetToCarrier.%d", scs)
		if n := r.optCount(f.Offset[scs], field, fmt.Sprintf("offsetToCarrier at %d kHz", scs), fmt.Sprintf("a whole number of CRBs from 0 to %d", grid.MaxOffset)); n != nil {
			p.Carrier.OffsetToCarrier = setIntMap(p.Carrier.OffsetToCarrier, scs, *n)
		}
	}
	for _, scs := range slices.Sorted(maps.Keys(f.CarrierBW)) {
		field := fmt.Sprintf("carrier.carrierBandwidth.%d", scs)
		if n := r.optCount(f.CarrierBW[scs], field, fmt.Sprintf("carrierBandwidth at %d kHz", scs), fmt.Sprintf("a whole number of PRBs from 1 to %d", grid.MaxPRB)); n != nil {
			p.Carrier.CarrierBandwidth = setIntMap(p.Carrier.CarrierBandwidth, scs, *n)
		}
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

// RangeOf is the frequency range a form names, read as grid.Compute reads
// it, or FR1 if it names none it knows.
func RangeOf(s string) grid.Range {
	if r, ok := grid.LookupRange(s); ok {
		return r
	}
	return grid.FR1
}

// maxNumber bounds whole numbers as the plan file does: far beyond any legal
// value, and small enough that no later arithmetic overflows.
const maxNumber = 1 << 31

type reader struct {
	msgs Messages
	rng  grid.Range
}

// set reads s into the plan value dst of field fl, at plan path path.
func (r reader) set(fl *Field, dst any, s, path string) {
	allowed := ""
	if fl.Allowed != nil {
		allowed = fl.Allowed(r.rng)
	}
	switch d := dst.(type) {
	case *string:
		if fl.Trim {
			s = strings.TrimSpace(s)
		}
		*d = s
	case *int:
		if n := r.optCount(s, path, fl.Noun, allowed); n != nil {
			*d = *n
		}
	case **int:
		*d = r.optCount(s, path, fl.Noun, allowed)
	case *float64:
		if x := r.optFloat(s, path, fl.Noun, allowed); x != nil {
			*d = *x
		}
	case **float64:
		*d = r.optFloat(s, path, fl.Noun, allowed)
	default:
		panic(fmt.Sprintf("planform: field %s has a plan value of type %T", fl.Key, dst))
	}
}

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
		r.msgs.Add(field, "%s: %s is far outside any value it can take; give %s.", label, t, allowed)
		return nil
	case err != nil:
		r.msgs.Add(field, "%s: %q is not a whole number; give %s.", label, s, allowed)
		return nil
	}
	return &n
}

func (r reader) optFloat(s, field, label, allowed string) *float64 {
	t := strings.TrimSpace(s)
	if t == "" {
		return nil
	}
	x, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		r.msgs.Add(field, "%s: %q is not a number; give %s.", label, s, allowed)
		return nil
	}
	return &x
}

// FormOf writes a plan as the form that reads back to it: Form.Plan of the
// result equals p. Zero counts are left empty, since the plan reads them as
// "not given" either way, except where a zero keeps its block in the plan
// (Field.KeepZero).
func FormOf(p grid.Plan) Form {
	var f Form
	present := map[Block]bool{
		BlockPlan: true, BlockTDD: p.TDD != nil, BlockPattern2: p.TDD != nil && p.TDD.Pattern2 != nil,
		BlockSSB: p.SSB != nil, BlockEnv: p.Environment != nil,
		BlockInit:   p.InitialAccess != nil,
		BlockInitDL: p.InitialAccess != nil && p.InitialAccess.InitialDownlinkBWP != nil,
		BlockInitUL: p.InitialAccess != nil && p.InitialAccess.InitialUplinkBWP != nil,
		BlockPRACH:  p.PRACH != nil,
	}
	for k := range Fields {
		fl := &Fields[k]
		switch {
		case fl.Block == BlockPartition:
			if f.Parts == nil && len(p.Partitions) > 0 {
				f.Parts = make([]PartForm, len(p.Partitions))
			}
			for i := range p.Partitions {
				*fl.form(&f, i) = text(fl, fl.plan(&p, i))
			}
		case present[fl.Block]:
			*fl.form(&f, 0) = text(fl, fl.plan(&p, 0))
		}
	}
	// A block of zeros is still in the plan: its anchor, written as 0,
	// keeps it there, as offsetToPointA does for the SS/PBCH block.
	given := f.givenBlocks()
	for k := range Fields {
		if fl := &Fields[k]; fl.Anchor && present[fl.Block] && !given[fl.Block] {
			*fl.form(&f, 0) = "0"
		}
	}
	for scs, n := range p.Carrier.OffsetToCarrier {
		f.Offset = setMap(f.Offset, scs, strconv.Itoa(n))
	}
	for scs, n := range p.Carrier.CarrierBandwidth {
		f.CarrierBW = setMap(f.CarrierBW, scs, strconv.Itoa(n))
	}
	return f
}

// text writes a plan value as its field's text.
func text(fl *Field, v any) string {
	switch v := v.(type) {
	case *string:
		return *v
	case *int:
		if *v == 0 && !fl.KeepZero {
			return ""
		}
		return strconv.Itoa(*v)
	case **int:
		if *v == nil {
			return ""
		}
		return strconv.Itoa(**v)
	case *float64:
		if *v == 0 && !fl.KeepZero {
			return ""
		}
		return strconv.FormatFloat(*v, 'f', -1, 64)
	case **float64:
		if *v == nil {
			return ""
		}
		return strconv.FormatFloat(**v, 'f', -1, 64)
	}
	panic(fmt.Sprintf("planform: field %s has a plan value of type %T", fl.Key, v))
}

// Clone returns a deep copy of f.
func (f Form) Clone() Form {
	g := f
	g.Offset = maps.Clone(f.Offset)
	g.CarrierBW = maps.Clone(f.CarrierBW)
	g.Parts = slices.Clone(f.Parts)
	return g
}
