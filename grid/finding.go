package grid

import "fmt"

// Severity grades a Finding.
type Severity string

// Severities. A plan with an Error finding is not a legal plan; warnings
// point at something an engineer would question; info notes what Compute
// chose on the user's behalf.
const (
	Error   Severity = "error"
	Warning Severity = "warning"
	Info    Severity = "info"
)

// Finding codes. They are stable: tools and tests may match on them.
const (
	CodeEmpty          = "empty"           // no partitions
	CodeLimit          = "limit"           // a count, length or span beyond its bound
	CodeName           = "name"            // a partition name missing or repeated
	CodeRange          = "range"           // carrier.range unknown (error); a cell radius beyond the guard or timing advance (warning)
	CodeBandwidth      = "bandwidth"       // channel or carrier bandwidth not in the tables
	CodeSCSRange       = "scs-range"       // a subcarrier spacing that carries no data in the range
	CodeCP             = "cp"              // cyclic prefix unknown or not allowed at the spacing
	CodeSize           = "size"            // startCrb or sizePrb missing or out of bounds
	CodeRIV            = "riv"             // locationAndBandwidth out of range or disagreeing
	CodeOffset         = "offset"          // offsetToCarrier missing, partial or out of bounds
	CodeOutsideCarrier = "outside-carrier" // a partition beyond its SCS-specific carrier
	CodeOverlap        = "overlap"         // two partitions share spectrum
	CodeEdgeGuard      = "edge-guard"      // less than the minimum guardband at a channel edge
	CodeNumerologyGap  = "numerology-gap"  // partitions of different spacings closer than wanted
	CodeFrequency      = "frequency"       // centre or NR-ARFCN off the raster, disagreeing or outside the range
	CodeDirection      = "direction"       // direction not DL or UL
	CodeLayers         = "layers"          // layers outside the direction's bounds
	CodeModulation     = "modulation"      // modulation unknown
	CodeAutoOffset     = "auto-offset"     // offsets or carrier sizes Compute chose
	CodeTDD            = "tdd"             // a TDD pattern the standard does not allow, or a partition below its reference spacing
	CodeTDDStraddle    = "tdd-straddle"    // partition symbols that straddle a downlink/uplink change
	CodeSSB            = "ssb"             // an SS/PBCH configuration the standard does not allow, or blocks beyond the channel
	CodeSSBOverlap     = "ssb-overlap"     // SS/PBCH blocks on a partition of another spacing
	CodeSyncRaster     = "sync-raster"     // SS_REF off the synchronization raster, or outside the band's SS raster entries
	CodeFit            = "fit"             // a numerology that suits the radio channel poorly (rules of thumb)
	CodeBand           = "band"            // band unknown, channel outside it, or a bandwidth or spacing it does not allow
	CodeChannelRaster  = "channel-raster"  // centre off the band's channel raster (TS 38.101-1/-2 Table 5.4.2.3-1)
	CodeTiming         = "timing"          // ueCapability, dmrsAdditionalPosition or carrier.nTaOffset not defined; capability 2 falling back to 1
	CodeInitialAccess  = "initial-access"  // CORESET#0, Type0-PDCCH occasions or initial BWPs that do not fit (TS 38.213 12, 13)
	CodePRACH          = "prach"           // a PRACH configuration undefined, off the uplink symbols, the BWP or the carrier, or not mapping every SS/PBCH block (TS 38.211 6.3.3, TS 38.213 8.1)
)

// Finding is one result of checking a plan. Field is the path of the plan
// field it concerns, as the plan file spells it ("partitions[1].sizePrb",
// "carrier.offsetToCarrier.30"); Partition is the partition's name.
type Finding struct {
	Severity  Severity `json:"severity"`
	Code      string   `json:"code"`
	Message   string   `json:"message"`
	Partition string   `json:"partition,omitempty"`
	Field     string   `json:"field,omitempty"`
}

func (f Finding) String() string {
	s := string(f.Severity) + " " + f.Code
	if f.Field != "" {
		s += " (" + f.Field + ")"
	}
	return s + ": " + f.Message
}

// findings collects Findings in the order they are found.
type findings []Finding

func (fs *findings) add(sev Severity, code, partition, field, format string, args ...any) {
	*fs = append(*fs, Finding{Severity: sev, Code: code, Message: fmt.Sprintf(format, args...), Partition: partition, Field: field})
}
