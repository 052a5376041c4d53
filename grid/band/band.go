// Package band holds the NR operating bands and their channel rasters
// (TS 38.101-1 and TS 38.101-2, Release 17): which bands a channel fits,
// which channel bandwidths and subcarrier spacings a band allows, where its
// RF reference frequency may sit and, for FDD, where the paired uplink
// carrier lies. It imports nothing of the project, so that the engine
// (package grid) can import it; frequencies are exact integer Hz.
package band

import (
	"cmp"
	"slices"
	"strconv"
	"strings"
)

// Duplex is the duplex mode of an operating band (TS 38.101-1 Table 5.2-1).
type Duplex string

// Duplex modes: FDD pairs an uplink and a downlink range, TDD shares one,
// SDL is a downlink alone and SUL an uplink alone.
const (
	FDD Duplex = "FDD"
	TDD Duplex = "TDD"
	SDL Duplex = "SDL"
	SUL Duplex = "SUL"
)

// Span is a closed frequency range [LowHz, HighHz] of a band edge pair; the
// zero Span stands for a direction the band does not have.
type Span struct {
	LowHz, HighHz int64
}

// Empty reports whether the span stands for an absent direction.
func (s Span) Empty() bool { return s.HighHz <= s.LowHz }

// Holds reports whether [lowHz, highHz] lies within the span. A channel is
// held by its channel edges, F_C ∓ BW_Channel/2 (TS 38.101-1 5.3.1), which
// may reach the band edges.
func (s Span) Holds(lowHz, highHz int64) bool {
	return !s.Empty() && lowHz >= s.LowHz && highHz <= s.HighHz && lowHz <= highHz
}

// Band is one NR operating band.
type Band struct {
	Name   string // "n78"
	Number int
	Range  string // "FR1", "FR2-1" or "FR2-2" (TS 38.101-2 Table 5.1-1 for FR2)
	Duplex Duplex
	UL, DL Span
	// Rasters are the rows of Table 5.4.2.3-1 for the band, finest
	// ΔF_Raster first.
	Rasters []Raster
	// Bandwidths maps a subcarrier spacing (kHz) to the channel
	// bandwidths (MHz) of Table 5.3.5-1; nil when that table's row for the
	// band is not carried.
	Bandwidths map[int][]int
}

// Raster is one channel raster of a band (Table 5.4.2.3-1): ΔF_Raster and
// the NR-ARFCNs it allows in each direction.
type Raster struct {
	RasterKHz int
	UL, DL    ARFCNRange
}

// ARFCNRange is the NR-ARFCN pattern first–<step>–last of Table 5.4.2.3-1;
// a zero Step stands for a direction without entries.
type ARFCNRange struct {
	First, Step, Last int
}

// Holds reports whether n is one of the pattern's NR-ARFCNs.
func (a ARFCNRange) Holds(n int) bool {
	return a.Step > 0 && n >= a.First && n <= a.Last && (n-a.First)%a.Step == 0
}

// String writes the pattern the way the spec does, "620000–<2>–653332".
func (a ARFCNRange) String() string {
	if a.Step == 0 {
		return "N/A"
	}
	return strconv.Itoa(a.First) + "–<" + strconv.Itoa(a.Step) + ">–" + strconv.Itoa(a.Last)
}

var (
	bands  []Band
	byName = map[string]int{}
)

func init() {
	add := func(rows []operatingBandRow, rng func(int) string) {
		for _, r := range rows {
			b := Band{Name: "n" + strconv.Itoa(r.band), Number: r.band, Range: rng(r.band), Duplex: r.duplex,
				UL: Span{r.ulLowKHz * 1000, r.ulHighKHz * 1000}, DL: Span{r.dlLowKHz * 1000, r.dlHighKHz * 1000}}
			bands = append(bands, b)
		}
	}
	add(tableFR1OperatingBands[:], func(int) string { return "FR1" })
	add(tableFR2OperatingBands[:], func(n int) string {
		if n == 263 {
			return "FR2-2"
		}
		return "FR2-1"
	})
	for i := range bands {
		b := &bands[i]
		for _, r := range slices.Concat(tableFR1ChannelRaster[:], tableFR2ChannelRaster[:]) {
			if r.band == b.Number {
				b.Rasters = append(b.Rasters, Raster{RasterKHz: r.rasterKHz,
					UL: ARFCNRange{r.ulFirst, r.ulStep, r.ulLast}, DL: ARFCNRange{r.dlFirst, r.dlStep, r.dlLast}})
			}
		}
		slices.SortStableFunc(b.Rasters, func(x, y Raster) int { return cmp.Compare(x.RasterKHz, y.RasterKHz) })
		for _, r := range slices.Concat(tableFR1ChannelBandwidths[:], tableFR2ChannelBandwidths[:]) {
			if r.band == b.Number {
				if b.Bandwidths == nil {
					b.Bandwidths = map[int][]int{}
				}
				b.Bandwidths[r.scsKHz] = r.mhz
			}
		}
		byName[b.Name] = i
	}
}

// All returns every band, FR1 first, in the order of the spec's tables.
func All() []Band {
	out := make([]Band, len(bands))
	for i, b := range bands {
		out[i] = b.clone()
	}
	return out
}

// Names lists the band names, for messages and forms.
func Names() []string {
	out := make([]string, len(bands))
	for i, b := range bands {
		out[i] = b.Name
	}
	return out
}

// Lookup finds a band by name; "n78", "N78" and "78" all name n78.
func Lookup(name string) (Band, bool) {
	s := strings.ToLower(strings.TrimSpace(name))
	if !strings.HasPrefix(s, "n") {
		s = "n" + s
	}
	i, ok := byName[s]
	if !ok {
		return Band{}, false
	}
	return bands[i].clone(), true
}

func (b Band) clone() Band {
	b.Rasters = slices.Clone(b.Rasters)
	if b.Bandwidths != nil {
		m := make(map[int][]int, len(b.Bandwidths))
		for k, v := range b.Bandwidths {
			m[k] = slices.Clone(v)
		}
		b.Bandwidths = m
	}
	return b
}

// Containing returns the bands whose downlink range holds a channel
// [lowHz, highHz], in table order. A DL carrier is what a plan describes,
// so supplementary uplink bands never match. Bands overlap (n77 holds
// n78), so there may be several.
func Containing(lowHz, highHz int64) []Band {
	var out []Band
	for _, b := range bands {
		if b.DL.Holds(lowHz, highHz) {
			out = append(out, b.clone())
		}
	}
	return out
}

// DuplexSpacingHz is the FDD band's default separation of the downlink
// above the uplink, F_DL_low − F_UL_low (negative where the downlink lies
// below, as in n20 and n71); false for bands without a pair.
func (b Band) DuplexSpacingHz() (int64, bool) {
	if b.Duplex != FDD || b.UL.Empty() || b.DL.Empty() {
		return 0, false
	}
	return b.DL.LowHz - b.UL.LowHz, true
}

// SCS lists, ascending, the subcarrier spacings (kHz) that Table 5.3.5-1
// allows in the band; nil when that row is not carried.
func (b Band) SCS() []int {
	var out []int
	for scs, mhz := range b.Bandwidths {
		if len(mhz) > 0 {
			out = append(out, scs)
		}
	}
	slices.Sort(out)
	return out
}

// AllowsBandwidth reports whether Table 5.3.5-1 lists the channel
// bandwidth for the spacing in the band. known is false when the band's
// row is not carried; then ok means nothing.
func (b Band) AllowsBandwidth(scsKHz, mhz int) (ok, known bool) {
	if b.Bandwidths == nil {
		return false, false
	}
	return slices.Contains(b.Bandwidths[scsKHz], mhz), true
}

// ListsARFCNs reports whether the band is one whose applicable NR-ARFCNs
// Table 5.4.2.3-1 lists one by one per channel bandwidth; this package
// holds only their span, so a centre it accepts may still be off the list.
func (b Band) ListsARFCNs() bool { return slices.Contains(listedARFCNBands[:], b.Number) }

// SharedSpectrum reports whether an FR1 band is operated with shared
// spectrum channel access: n46, n96 and n102 (TS 38.101-1 Table 5.2-1,
// Release 17, from memory; srsRAN's copy of TS 38.104 Table 5.2-1 agrees on
// every FR1 band, TestSharedSpectrumAgainstSrsRAN). TS 38.331 and TS 38.213 give some fields another meaning
// there (the MIB's subCarrierSpacingCommon, for one).
func SharedSpectrum(name string) bool {
	return name == "n46" || name == "n96" || name == "n102"
}
