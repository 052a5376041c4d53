package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// The JSON document of a plan with initial access, kept as a golden file
// beside the demo plans' (the demo plans carry no initialAccess: the page's
// form does not hold it yet).
func TestRenderJSONGoldenInitialAccess(t *testing.T) {
	out, errOut, code := runCLI(t, "", "render", "-format", "json", "../../testdata/initial/campus.yaml")
	if code != 0 {
		t.Fatalf("exit %d, stderr %s", code, errOut)
	}
	golden(t, "../../testdata/golden/json/initial-campus.json", []byte(out))
	var doc struct {
		InitialAccess struct {
			CORESET0 struct {
				Table    string  `json:"table"`
				StartCRB int     `json:"startCrb"`
				LowKHz   float64 `json:"lowKHz"`
			} `json:"coreset0"`
			SearchSpace0 struct {
				Occasions []map[string]any `json:"occasions"`
			} `json:"searchSpace0"`
			MIB struct {
				SSBSubcarrierOffset int `json:"ssbSubcarrierOffset"`
				KSSBMsb             int `json:"kSsbMsb"`
				PDCCHConfigSIB1     int `json:"pdcchConfigSIB1"`
			} `json:"mib"`
		} `json:"initialAccess"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	// GSCN 8016 is SS_REF 3000 MHz + (8016 − 7499)·1.44 MHz = 3744.48 MHz
	// (TS 38.101-1 Table 5.4.3.1-1), 13920 kHz above point A (3730.56 MHz,
	// where the channel puts it). SS_REF is subcarrier 120 of the block
	// (TS 38.101-1 5.4.3.1), so subcarrier 0 is 3600 kHz lower, at 10320 kHz
	// = 56·180 + 16·15: offsetToPointA 56 and k_SSB 16, in the 30 kHz CRB
	// ⌊10320/360⌋ = 28. Table 13-4 row 2 starts CORESET#0 2 CRBs lower,
	// at CRB 26, edge 26·360 − 15 = 9345 kHz (TS 38.211 4.4.4.3). k_SSB 16 is
	// ssb-SubcarrierOffset 0 with the PBCH bit ā_{A+5} = 1 (TS 38.212 7.1.1).
	ia := doc.InitialAccess
	if ia.CORESET0.Table != "13-4" || ia.CORESET0.StartCRB != 26 || ia.CORESET0.LowKHz != 9345 ||
		len(ia.SearchSpace0.Occasions) != 8 || ia.MIB.PDCCHConfigSIB1 != 0x20 || ia.MIB.SSBSubcarrierOffset != 0 || ia.MIB.KSSBMsb != 1 {
		t.Errorf("initialAccess %+v", ia)
	}
}

// Every row the initial command lists, applied to the plan, leaves no
// initial-access error; the command exits 0 when it lists some.
func TestInitialCommandRowsApply(t *testing.T) {
	out, errOut, code := runCLI(t, "", "initial", "-format", "json", "../../testdata/initial/campus.yaml")
	if code != 0 {
		t.Fatalf("exit %d, stderr %s", code, errOut)
	}
	var doc struct {
		Options []struct {
			GSCN                   int `json:"gscn"`
			OffsetToPointA         int `json:"offsetToPointA"`
			KSSB                   int `json:"kSsb"`
			ControlResourceSetZero int `json:"controlResourceSetZero"`
			SearchSpaceZero        int `json:"searchSpaceZero"`
		} `json:"options"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Options) == 0 {
		t.Fatal("no rows")
	}
	data, err := os.ReadFile("../../testdata/initial/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	base, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	for _, o := range doc.Options {
		p := base.Clone()
		p.SSB.GSCN, p.SSB.OffsetToPointA, p.SSB.KSSB = &o.GSCN, o.OffsetToPointA, o.KSSB
		p.InitialAccess.ControlResourceSetZero, p.InitialAccess.SearchSpaceZero = o.ControlResourceSetZero, o.SearchSpaceZero
		for _, f := range grid.Compute(p).Findings {
			if f.Code == grid.CodeInitialAccess && f.Severity == grid.Error {
				t.Errorf("row %+v: %s", o, f)
			}
		}
	}
	table, _, code := runCLI(t, "", "initial", "../../testdata/initial/campus.yaml")
	if code != 0 || !strings.Contains(table, "controlResourceSetZero") || strings.Count(table, "\n") != len(doc.Options)+2 {
		t.Errorf("table: exit %d, %d lines for %d rows:\n%s", code, strings.Count(table, "\n"), len(doc.Options), table)
	}
}

// 5 MHz at 30 kHz common admits no CORESET#0: the command says why and
// exits 1; a plan without an ssb block is bad input.
func TestInitialCommandNone(t *testing.T) {
	out, _, code := runCLI(t, "", "initial", "../../testdata/initial/narrow.yaml")
	if code != 1 || !strings.Contains(out, "0 combinations") || !strings.Contains(out, "24 RBs of 30 kHz") {
		t.Errorf("exit %d:\n%s", code, out)
	}
	plan := filepath.Join(t.TempDir(), "plan.yaml")
	if err := os.WriteFile(plan, []byte("carrier: {bandwidthMHz: 20}\npartitions: [{name: a, scsKHz: 30, sizePrb: 51}]\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, errOut, code := runCLI(t, "", "initial", plan)
	if code != 2 || !strings.Contains(errOut, "no ssb block") {
		t.Errorf("exit %d, stderr %q", code, errOut)
	}
	if _, errOut, code := runCLI(t, "", "initial", "-h"); code != 0 || !strings.Contains(errOut, "Usage: gridloom initial") {
		t.Errorf("-h: exit %d, %q", code, errOut)
	}
}
