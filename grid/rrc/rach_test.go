package rrc_test

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
)

func loadPRACHPlan(t *testing.T, name string) grid.Plan {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "prach", name))
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.DecodeYAML(b)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// The plans of testdata/prach (FDD long format, DDDSU short format in FR1,
// FR2-1 B4) travel through rach-ConfigCommon and read back exactly.
func TestRoundTripPRACHPlans(t *testing.T) {
	for _, name := range []string{"fdd-long.yaml", "dddsu.yaml", "fr2.yaml"} {
		t.Run(name, func(t *testing.T) {
			p := loadPRACHPlan(t, name)
			roundTrip(t, name, p)
			text, err := rrc.Encode(p)
			if err != nil {
				t.Fatal(err)
			}
			s := string(text)
			// TS 38.331 RACH-ConfigGeneric and RACH-ConfigCommon: the
			// fields the plan determines are written, not noted.
			for _, want := range []string{
				"rach-ConfigCommon setup : {",
				"prach-ConfigurationIndex " + itoa(p.PRACH.ConfigurationIndex),
				"msg1-FrequencyStart " + itoa(p.PRACH.Msg1FrequencyStart),
				"zeroCorrelationZoneConfig " + itoa(p.PRACH.ZeroCorrelationZoneConfig),
				"restrictedSetConfig unrestrictedSet",
				"prach-RootSequenceIndex",
				"ra-ContentionResolutionTimer",
			} {
				if !strings.Contains(s, want) {
					t.Errorf("the text lacks %q:\n%s", want, s)
				}
			}
			for _, bad := range []string{"gridloom prach.configurationIndex", "gridloom prach.msg1FrequencyStart", "gridloom prach.zeroCorrelationZoneConfig", "ssb-perRACH-OccasionAndCB-PreamblesPerSSB one"} {
				if strings.Contains(s, bad) {
					t.Errorf("the text has %q:\n%s", bad, s)
				}
			}
		})
	}
}

func itoa(n int) string { return strconv.Itoa(n) }

// prachPlans are the plans of testdata/prach and a variant that reaches
// the other branches: campus with initial access, so that
// rach-ConfigCommon sits beside the initial uplink BWP's
// genericParameters, with format 0 (index 0 of TS 38.211 Table 6.3.3.2-3),
// eight occasions side by side, restricted set type A and one SS/PBCH
// block per two occasions, which only a note carries.
func prachPlans(t *testing.T) map[string]grid.Plan {
	t.Helper()
	out := map[string]grid.Plan{}
	for _, name := range []string{"fdd-long.yaml", "dddsu.yaml", "fr2.yaml"} {
		out["prach/"+name] = loadPRACHPlan(t, name)
	}
	b, err := os.ReadFile("../../testdata/initial/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	campus, err := planfile.DecodeYAML(b)
	if err != nil {
		t.Fatal(err)
	}
	campus.PRACH = &grid.PRACHPlan{ConfigurationIndex: 0, Msg1FDM: 8, Msg1FrequencyStart: 0, ZeroCorrelationZoneConfig: 1, RestrictedSetConfig: "restrictedSetTypeA", SSBPerRachOccasion: "1/2"}
	out["campus+prach"] = campus
	// Index 258 of TS 38.211 Table 6.3.3.2-3 (format 0), beyond
	// prach-ConfigurationIndex's 0..255, under a pattern whose slots 2 to
	// 19 are uplink, so that prach-ConfigurationIndex-v1610 is written.
	ext := loadPRACHPlan(t, "dddsu.yaml")
	ext.TDD.Pattern1 = grid.TDDPattern{PeriodMs: 10, DownlinkSlots: 2, UplinkSlots: 18}
	ext.PRACH.ConfigurationIndex, ext.PRACH.Msg1SubcarrierSpacing = 258, 0
	out["dddsu+v1610"] = ext
	// Format B4 (L = 139) with msg1SubcarrierSpacing left to its default:
	// the mandatory msg1-SubcarrierSpacing (Cond L139) is written as the
	// spacing Compute resolved, and a note keeps the plan's absence.
	def := loadPRACHPlan(t, "dddsu.yaml")
	def.PRACH.Msg1SubcarrierSpacing = 0
	out["dddsu+default-msg1"] = def
	return out
}

// TestRoundTripPRACHVariants round-trips the variants and checks that the
// initial uplink BWP holds both genericParameters and rach-ConfigCommon.
func TestRoundTripPRACHVariants(t *testing.T) {
	for name, p := range prachPlans(t) {
		if res := grid.Compute(p); res.HasErrors() {
			t.Fatalf("%s has errors: %v", name, res.Findings)
		}
		roundTrip(t, name, p)
	}
	p := prachPlans(t)["campus+prach"]
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	s := string(text)
	for _, want := range []string{"msg1-FDM eight", "restrictedSetConfig restrictedSetTypeA", `gridloom prach.ssbPerRachOccasion: "1/2"`} {
		if !strings.Contains(s, want) {
			t.Errorf("the text lacks %q:\n%s", want, s)
		}
	}
	ul := s[strings.Index(s, "initialUplinkBWP"):]
	if g, r := strings.Index(ul, "genericParameters"), strings.Index(ul, "rach-ConfigCommon setup"); g < 0 || r < 0 || g > r {
		t.Errorf("initialUplinkBWP does not hold genericParameters then rach-ConfigCommon:\n%s", ul)
	}
}

// A note that contradicts rach-ConfigCommon is refused, as the other notes
// are; a field edited with no note naming it is read as edited.
func TestRACHNoteContradiction(t *testing.T) {
	p := loadPRACHPlan(t, "dddsu.yaml")
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	s := string(text)
	if !strings.Contains(s, "msg1-FrequencyStart 4,") {
		t.Fatalf("the text lacks msg1-FrequencyStart 4:\n%s", s)
	}
	edited := strings.Replace(s, "msg1-FrequencyStart 4,", "msg1-FrequencyStart 6,", 1)
	d, err := rrc.Decode([]byte(edited))
	if err != nil {
		t.Fatalf("an edited msg1-FrequencyStart was refused: %v", err)
	}
	if got := d.Plan.PRACH.Msg1FrequencyStart; got != 6 {
		t.Errorf("msg1-FrequencyStart read as %d, want 6", got)
	}
	noted := strings.Replace(s, "-- gridloom name:", "-- gridloom prach.configurationIndex: 159\n-- gridloom name:", 1)
	_, err = rrc.Decode([]byte(noted))
	if err == nil || !strings.Contains(err.Error(), "rach-ConfigCommon") {
		t.Errorf("a note contradicting prach-ConfigurationIndex 160 gave %v, want a refusal naming rach-ConfigCommon", err)
	}
	bad := strings.Replace(s, "msg1-FDM two", "msg1-FDM three", 1)
	if _, err := rrc.Decode([]byte(bad)); err == nil || !strings.Contains(err.Error(), "one, two, four or eight") {
		t.Errorf("msg1-FDM three gave %v, want a refusal naming the allowed values", err)
	}
}

// A text from elsewhere may carry ssb-perRACH-OccasionAndCB-PreamblesPerSSB:
// its alternative gives ssbPerRachOccasion (TS 38.331 RACH-ConfigCommon:
// oneHalf is one SS/PBCH block per two occasions), the preamble count
// inside is skipped and listed, and a note that says otherwise is refused.
func TestRACHReadsSSBPerOccasion(t *testing.T) {
	p := loadPRACHPlan(t, "dddsu.yaml")
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatal(err)
	}
	s := string(text)
	const note = "-- gridloom prach.ssbPerRachOccasion: \"1\"\n"
	if !strings.Contains(s, note) {
		t.Fatalf("the text lacks the note %q:\n%s", note, s)
	}
	field := "msg1-SubcarrierSpacing kHz30,"
	withField := strings.Replace(strings.Replace(s, note, "", 1), field, "ssb-perRACH-OccasionAndCB-PreamblesPerSSB oneHalf : n32,\n"+field, 1)
	d, err := rrc.Decode([]byte(withField))
	if err != nil {
		t.Fatalf("Decode: %v\n%s", err, withField)
	}
	if got := d.Plan.PRACH.SSBPerRachOccasion; got != "1/2" {
		t.Errorf("ssbPerRachOccasion read as %q, want 1/2", got)
	}
	if !strings.Contains(strings.Join(d.Skipped, " "), "ssb-perRACH-OccasionAndCB-PreamblesPerSSB.oneHalf") {
		t.Errorf("the preamble count was not listed as skipped: %v", d.Skipped)
	}
	both := strings.Replace(s, field, "ssb-perRACH-OccasionAndCB-PreamblesPerSSB oneHalf : n32,\n"+field, 1)
	if _, err := rrc.Decode([]byte(both)); err == nil || !strings.Contains(err.Error(), "ssb-perRACH-OccasionAndCB-PreamblesPerSSB") {
		t.Errorf("a note of 1 against oneHalf gave %v, want a refusal naming the field", err)
	}
}

// Indexes 256 to 262 travel in prach-ConfigurationIndex-v1610, which the UE
// reads instead of prach-ConfigurationIndex (TS 38.331 RACH-ConfigGeneric).
func TestRACHReadsIndexExtension(t *testing.T) {
	text, err := rrc.Encode(loadPRACHPlan(t, "dddsu.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s := string(text)
	ext := strings.Replace(s, "prach-ConfigurationIndex 160,", "prach-ConfigurationIndex 0,\nprach-ConfigurationIndex-v1610 258,", 1)
	d, err := rrc.Decode([]byte(ext))
	if err != nil {
		t.Fatalf("Decode: %v", err)
	}
	if got := d.Plan.PRACH.ConfigurationIndex; got != 258 {
		t.Errorf("prach-ConfigurationIndex-v1610 258 read as index %d", got)
	}
	bad := strings.Replace(s, "prach-ConfigurationIndex 160,", "prach-ConfigurationIndex-v1610 255,", 1)
	if _, err := rrc.Decode([]byte(bad)); err == nil || !strings.Contains(err.Error(), "prach-ConfigurationIndex-v1610") {
		t.Errorf("prach-ConfigurationIndex-v1610 255 gave %v, want a refusal naming the field", err)
	}
}
