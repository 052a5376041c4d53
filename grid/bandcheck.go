package grid

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid/band"
)

// bandSource names the tables of a band's frequency range, for messages.
func bandSource(b band.Band, table string) string {
	if b.Range == "FR1" {
		return "TS 38.101-1 Table " + table
	}
	return "TS 38.101-2 Table " + table
}

// bandsOf lists the names of the bands of a range that carry a downlink.
func bandsOf(rng Range) []string {
	var out []string
	for _, b := range band.All() {
		if b.Range == rng.String() && !b.DL.Empty() {
			out = append(out, b.Name)
		}
	}
	return out
}

// checkBand holds the channel against its operating band (TS 38.101-1/-2
// clause 5): carrier.band when the plan names one, otherwise the bands
// whose downlink range holds the channel. It fills the band fields of ch.
// scsInUse are the spacings of the placed carriers; name is the plan's
// carrier.band, canonicalised in place when it names a band.
func checkBand(fs *findings, rng Range, ch *Channel, cp *CarrierPlan, parts []PartitionPlan, scsInUse []int, bwKnown bool) {
	if strings.TrimSpace(cp.Band) != "" {
		b, ok := band.Lookup(cp.Band)
		switch {
		case !ok:
			fs.add(Error, CodeBand, "", "carrier.band", "carrier.band %q is not an NR operating band of %s; use %s (TS 38.101-1 and TS 38.101-2 Table 5.2-1).",
				cp.Band, rng, JoinOr(bandsOf(rng)))
			return
		case b.Range != rng.String():
			fs.add(Error, CodeBand, "", "carrier.band", "carrier.band %s is a band of %s (%s), but carrier.range is %s; use %s.",
				b.Name, b.Range, bandSource(b, "5.2-1"), rng, JoinOr(bandsOf(rng)))
			return
		case b.DL.Empty():
			fs.add(Error, CodeBand, "", "carrier.band", "carrier.band %s is a supplementary uplink band without a downlink (%s); a plan describes a downlink carrier, so use %s.",
				b.Name, bandSource(b, "5.2-1"), JoinOr(bandsOf(rng)))
			return
		}
		cp.Band = b.Name
		var own findings
		checkInBand(&own, b, rng, ch, *cp, parts, scsInUse, bwKnown)
		*fs = append(*fs, own...)
		setBand(ch, b, *cp, scsInUse)
		return
	}
	if !ch.Absolute {
		return
	}
	lo, hi := int64(ch.Abs(ch.Low)), int64(ch.Abs(ch.High))
	var cands []band.Band
	for _, b := range band.Containing(lo, hi) {
		if b.Range == rng.String() {
			cands = append(cands, b)
			ch.BandCandidates = append(ch.BandCandidates, b.Name)
		}
	}
	if len(cands) == 0 {
		fs.add(Warning, CodeBand, "", "carrier.centerMHz", "The channel spans %s to %s and lies in no NR operating band of %s (TS 38.101-1 and TS 38.101-2 Table 5.2-1); it can serve no user equipment there.",
			fmtMHz(ch.Abs(ch.Low)), fmtMHz(ch.Abs(ch.High)), rng)
		return
	}
	// Check against each band the channel fits; the first that passes
	// everything is the band of the channel. If none passes, report against
	// the first.
	var first findings
	for i, b := range cands {
		var own findings
		checkInBand(&own, b, rng, ch, *cp, parts, scsInUse, bwKnown)
		if i == 0 {
			first = own
		}
		if !slices.ContainsFunc(own, func(f Finding) bool { return f.Severity != Info }) {
			if len(cands) == 1 {
				fs.add(Info, CodeBand, "", "carrier.band", "The channel lies in band %s (%s) and is checked against it; carrier.band may name it.",
					b.Name, bandSource(b, "5.2-1"))
			} else {
				fs.add(Info, CodeBand, "", "carrier.band", "The channel lies in band %s (%s); it is checked as %s, the first it fits. Name the band in carrier.band to choose.",
					JoinOr(ch.BandCandidates), bandSource(b, "5.2-1"), b.Name)
			}
			*fs = append(*fs, own...)
			setBand(ch, b, *cp, scsInUse)
			return
		}
	}
	fs.add(Info, CodeBand, "", "carrier.band", "The channel lies in band %s (%s) but none of them allows it as planned; the findings below are against %s.",
		JoinOr(ch.BandCandidates), bandSource(cands[0], "5.2-1"), cands[0].Name)
	*fs = append(*fs, first...)
	setBand(ch, cands[0], *cp, scsInUse)
}

// setBand records the band of the channel and, with an absolute centre,
// its raster and paired uplink.
func setBand(ch *Channel, b band.Band, cp CarrierPlan, scsInUse []int) {
	ch.Band = b.Name
	ch.Duplex = string(b.Duplex)
	if !ch.Absolute {
		return
	}
	c := b.CheckDL(int64(ch.CenterHz), scsInUse, ch.BandwidthMHz)
	ch.RasterKHz = c.RasterKHz
	if ul, n, ok := b.PairedUL(int64(ch.CenterHz)); ok {
		ch.HasUL, ch.ULCenterHz, ch.ULARFCN = true, Hz(ul), n
	}
}

// checkInBand adds the findings of one band: the spacings and bandwidth of
// Table 5.3.5-1, the downlink range of Table 5.2-1, the channel raster of
// Table 5.4.2.3-1 and, for FDD, the paired uplink in the uplink range.
func checkInBand(fs *findings, b band.Band, rng Range, ch *Channel, cp CarrierPlan, parts []PartitionPlan, scsInUse []int, bwKnown bool) {
	if b.Bandwidths == nil {
		fs.add(Info, CodeBand, "", "carrier.band", "Band %s's row of %s is not carried here; carrier.bandwidthMHz and the subcarrier spacings are not checked against the band.",
			b.Name, bandSource(b, "5.3.5-1"))
	} else {
		allowed, data := b.SCS(), rng.DataSCS()
		for i, p := range parts {
			if slices.Contains(data, p.SCSKHz) && !slices.Contains(allowed, p.SCSKHz) {
				fs.add(Error, CodeBand, p.Name, fmt.Sprintf("partitions[%d].scsKHz", i), "Partition %q uses %d kHz, which band %s does not allow (%s); use %s kHz.",
					p.Name, p.SCSKHz, b.Name, bandSource(b, "5.3.5-1"), JoinInts(allowed))
			}
		}
		if bwKnown {
			for _, scs := range scsInUse {
				if ok, _ := b.AllowsBandwidth(scs, ch.BandwidthMHz); !ok && slices.Contains(allowed, scs) {
					fs.add(Error, CodeBand, "", "carrier.bandwidthMHz", "carrier.bandwidthMHz %d is not a channel bandwidth of band %s at %d kHz (%s); use %s MHz.",
						ch.BandwidthMHz, b.Name, scs, bandSource(b, "5.3.5-1"), JoinInts(b.Bandwidths[scs]))
				}
			}
		}
	}
	if !ch.Absolute {
		return
	}
	field := "carrier.centerMHz"
	if cp.CenterMHz == nil {
		field = "carrier.arfcn"
	}
	lo, hi := ch.Abs(ch.Low), ch.Abs(ch.High)
	if !b.DL.Holds(int64(lo), int64(hi)) {
		fs.add(Error, CodeBand, "", field, "The channel spans %s to %s, outside band %s's downlink range %s to %s (%s).",
			fmtMHz(lo), fmtMHz(hi), b.Name, fmtMHz(Hz(b.DL.LowHz)), fmtMHz(Hz(b.DL.HighHz)), bandSource(b, "5.2-1"))
		return
	}
	if _, on := FrequencyARFCN(ch.CenterHz); on {
		c := b.CheckDL(int64(ch.CenterHz), scsInUse, ch.BandwidthMHz)
		if !c.On {
			fs.add(Error, CodeChannelRaster, "", field, "%s %s is not on the channel raster of band %s (%s: %s); %s.",
				field, fmtMHz(ch.CenterHz), b.Name, bandSource(b, "5.4.2.3-1"), rasterRule(b, scsInUse), nearest(c))
		} else if b.ListsARFCNs() {
			fs.add(Info, CodeChannelRaster, "", field, "Band %s allows only the NR-ARFCNs that %s lists for each channel bandwidth; the centre is checked against the band's raster span only.",
				b.Name, bandSource(b, "5.4.2.3-1"))
		}
	}
	if ul, n, ok := b.PairedUL(int64(ch.CenterHz)); ok {
		half := int64(ch.High-ch.Low) / 2
		if !b.UL.Holds(ul-half, ul+half) {
			d, _ := b.DuplexSpacingHz()
			fs.add(Error, CodeBand, "", field, "The paired uplink carrier of band %s, %s (NR-ARFCN %d) at the duplex spacing of %s, spans %s to %s, outside the uplink range %s to %s (%s).",
				b.Name, fmtMHz(Hz(ul)), n, fmtMHz(Hz(d)), fmtMHz(Hz(ul-half)), fmtMHz(Hz(ul+half)), fmtMHz(Hz(b.UL.LowHz)), fmtMHz(Hz(b.UL.HighHz)), bandSource(b, "5.2-1"))
		}
	}
}

// rasterRule describes the rows of a band's channel raster that apply.
func rasterRule(b band.Band, scsInUse []int) string {
	minSCS := 0
	if len(scsInUse) > 0 {
		minSCS = slices.Min(scsInUse)
	}
	var rows []string
	for _, r := range b.Rasters {
		if r.Serves(minSCS) {
			rows = append(rows, "ΔF_Raster "+strconv.Itoa(r.RasterKHz)+" kHz, NR-ARFCN "+r.DL.String())
		}
	}
	return JoinOr(rows)
}

// nearest names the nearest valid centres of a raster check.
func nearest(c band.Check) string {
	var s []string
	for _, n := range []int{c.Below, c.Above} {
		if n >= 0 {
			f, _ := ARFCNFrequency(n)
			s = append(s, fmt.Sprintf("%s (%d)", fmtMHz(f), n))
		}
	}
	if len(s) == 1 {
		return "the nearest valid centre is " + s[0]
	}
	return "the nearest valid centres are " + strings.Join(s, " and ")
}
