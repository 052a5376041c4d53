// Package rrc writes a gridloom plan as TS 38.331 information elements in
// ASN.1 value notation (X.680) and reads such text back into a plan, so that
// a checked plan can move into base-station configuration without
// retyping, and a configuration from a log can be drawn and checked. It
// also encodes the MIB as the 24 bits of BCCH-BCH-Message (MIBBits).
//
// # What is written
//
// Encode writes, with the IE, field and enumeration names of TS 38.331
// Release 17 as the ASN.1 of V17.1.0 (2022-06) spells them
// (testdata/reference/rrc/ts38331-v17.1.0-types.asn holds the type
// definitions used; TestValuesFollowTS38331Types walks every written value
// through them: names, nesting, order, optionality, enumerations and
// ranges), cross-checked against srsRAN_Project's code generated from
// V17.4.0 (2023-03), which spells the same IEs alike
// (testdata/reference/rrc/ts38331-names.tsv and srsran_names.tsv):
//
//   - MIB: ssb-SubcarrierOffset (k_SSB's 4 least significant bits), in
//     FR1 and FR2-1 subCarrierSpacingCommon, and with initialAccess
//     dmrs-TypeA-Position and pdcch-ConfigSIB1. In FR2-2 and with shared
//     spectrum channel access in FR1 (bands n46, n96, n102)
//     subCarrierSpacingCommon gives no spacing — SIB1, Msg.2/4 and paging
//     use the SS/PBCH block's — and with shared spectrum it is the QCL
//     relation between SS/PBCH blocks (TS 38.331 MIB field description,
//     TS 38.213 4.1), which a plan does not hold: it is left out with a
//     comment saying so, and read as giving nothing. With shared spectrum
//     in FR1 ssb-SubcarrierOffset is k̄_SSB: written as k_SSB, read as
//     k_SSB = 2⌊k̄_SSB/2⌋ (TS 38.211 7.4.3.1), its low bit the QCL bit.
//   - ServingCellConfigCommonSIB: downlinkConfigCommon.frequencyInfoDL
//     (frequencyBandList, offsetToPointA, scs-SpecificCarrierList), uplinkConfigCommon
//     .frequencyInfoUL.scs-SpecificCarrierList when a partition is uplink,
//     ssb-PositionsInBurst (inOneGroup, groupPresence),
//     ssb-PeriodicityServingCell and tdd-UL-DL-ConfigurationCommon; with
//     initialAccess the initialDownlinkBWP (genericParameters, and
//     pdcch-ConfigCommon's controlResourceSetZero and searchSpaceZero) and
//     the initialUplinkBWP's genericParameters, as Compute places them;
//     with prach the initialUplinkBWP's rach-ConfigCommon (rach-ConfigGeneric's
//     prach-ConfigurationIndex, msg1-FDM, msg1-FrequencyStart and
//     zeroCorrelationZoneConfig, msg1-SubcarrierSpacing for a short
//     (L = 139) format, which Cond L139 makes mandatory there,
//     restrictedSetConfig), alone in the
//     initialUplinkBWP when the plan places none.
//   - ServingCellConfigCommon: downlinkConfigCommon.frequencyInfoDL
//     (absoluteFrequencySSB, frequencyBandList, absoluteFrequencyPointA,
//     scs-SpecificCarrierList), n-TimingAdvanceOffset when the plan gives
//     carrier.nTaOffset, ssb-PositionsInBurst (the short, medium or long
//     bitmap, which says any bitmap), dmrs-TypeA-Position with
//     initialAccess, and ssbSubcarrierSpacing.
//   - Each partition as BWP-Downlink or BWP-Uplink: bwp-Id (1 to 4,
//     counted per direction in plan order) and bwp-Common.genericParameters
//     (locationAndBandwidth, subcarrierSpacing, cyclicPrefix).
//
// The SS/PBCH fields are those of the block Compute places: a plan that
// gives ssb.gscn instead of offsetToPointA and kSsb is written with the
// offsetToPointA, k_SSB, subCarrierSpacingCommon and absoluteFrequencySSB
// Compute derives. frequencyBandList carries carrier.band as
// freqBandIndicatorNR, and only the band the plan names: a band Compute
// infers is one of possibly several the channel lies in.
//
// Fields the plan does not determine are left out, never invented; each
// value says in a comment which of its mandatory fields it leaves out
// (frequencyBandList without carrier.band, initialDownlinkBWP without initialAccess,
// pdcch-ConfigSIB1, ...). In FR1 a k_SSB of 16 or more (possible with a
// 30 kHz subCarrierSpacingCommon) has its fifth bit in the PBCH payload,
// outside the MIB (TS 38.212 7.1.1); a comment says so, and the reader
// restores that bit from absoluteFrequencySSB.
//
// # Notes: what 38.331 has no field for
//
// Partition names, layers, modulation, ueCapability and
// dmrsAdditionalPosition (38.331 has the latter in DMRS-DownlinkConfig under
// bwp-Dedicated, which is not written), the plan's name, span and
// environment, the channel bandwidth and range, how the plan gave an
// initial BWP (a partition's name, startCrb and sizePrb), and which values the plan
// left to their defaults (offsetToPointA and kSsb left to ssb.gscn, and
// the GSCN itself; prach's msg1FDM and restrictedSetConfig) have no RRC
// field, nor has prach.ssbPerRachOccasion alone:
// ssb-perRACH-OccasionAndCB-PreamblesPerSSB pairs it with a count of
// contention-based preambles the plan lacks, so that field is left out. They travel as comments
// "-- gridloom key: value" (the value in JSON): at the top of the text for
// plan keys (carrier.bandwidthMHz, ssb.bitmap, ...), at the top of a BWP
// value for that partition's keys (name, layers, ...). Encode writes a note
// for each key the RRC fields alone would read back differently, so that
// Decode(Encode(p)) is p. A note overrides the field it names; if the plan
// the notes make would write different RRC fields than the text has, Decode
// refuses the text rather than guess which to believe.
//
// # Reading
//
// Decode accepts the values in any order, fields in any order, comments and
// white space, and values standing alone whose type it infers from their
// fields. It reads MIB (or BCCH-BCH-Message), SIB1 or
// ServingCellConfigCommonSIB, ServingCellConfigCommon, FrequencyInfoDL,
// TDD-UL-DL-ConfigCommon, BWP-Downlink and BWP-Uplink, with the initial
// BWPs, rach-ConfigCommon and MIB fields above; other values and the
// fields of these it has no use for are skipped and listed in
// Decoded.Skipped. carrier.band is the first band of frequencyBandList
// (FrequencyInfoDL-SIB and FrequencyInfoDL must start with the same band).
// Without notes the channel bandwidth is the one of
// TS 38.101 Table 5.3.2-1 whose N_RB is every carrierBandwidth, the range
// follows absoluteFrequencyPointA or the spacings, and partitions are named
// after their values. Values outside their ASN.1 range are refused naming
// the field, with the line and column.
package rrc
