package main

import (
	"encoding/json"
	"os"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// The JSON document of a plan with a prach block, kept as a golden file;
// its prach object carries the names the issue fixes.
func TestRenderJSONGoldenPRACH(t *testing.T) {
	out, errOut, code := runCLI(t, "", "render", "-format", "json", "../../testdata/prach/dddsu.yaml")
	if code != 0 {
		t.Fatalf("exit %d, stderr %s", code, errOut)
	}
	golden(t, "../../testdata/golden/json/prach-dddsu.json", []byte(out))
	var doc struct {
		PRACH map[string]json.RawMessage `json:"prach"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"configurationIndex", "format", "sequenceLength", "scsKHz", "nRbRa", "cellRangeKm", "associationPeriodFrames", "occasions"} {
		if _, ok := doc.PRACH[k]; !ok {
			t.Errorf("prach has no %q", k)
		}
	}
	var occ []map[string]any
	if err := json.Unmarshal(doc.PRACH["occasions"], &occ); err != nil || len(occ) == 0 {
		t.Fatalf("occasions %s: %v", doc.PRACH["occasions"], err)
	}
	for i, o := range occ {
		for _, k := range []string{"frame", "slot", "startSymbol", "startTc", "endTc", "lowKHz", "highKHz", "ssbIndexes", "valid"} {
			if _, ok := o[k]; !ok {
				t.Errorf("occasion %d has no %q", i, k)
			}
		}
		// ssbIndexes is a list (empty, never null), valid a boolean, the
		// times whole numbers of Tc.
		if _, ok := o["ssbIndexes"].([]any); !ok {
			t.Errorf("occasion %d: ssbIndexes %v is not a list", i, o["ssbIndexes"])
		}
		if _, ok := o["valid"].(bool); !ok {
			t.Errorf("occasion %d: valid %v is not a boolean", i, o["valid"])
		}
		for _, k := range []string{"startTc", "endTc"} {
			if v, ok := o[k].(float64); !ok || v != float64(int64(v)) {
				t.Errorf("occasion %d: %s %v is not a whole number", i, k, o[k])
			}
		}
	}
	// The association pattern period (TS 38.213 8.1) beside the period.
	if string(doc.PRACH["associationPatternPeriodFrames"]) != "2" {
		t.Errorf("associationPatternPeriodFrames %s, want 2 (dddsu: 20 ms)", doc.PRACH["associationPatternPeriodFrames"])
	}
}

// Every index "gridloom prach" lists, applied to the plan, checks without a
// prach error; the table names the same count as the JSON.
func TestPRACHCommandRowsApply(t *testing.T) {
	const path = "../../testdata/prach/dddsu.yaml"
	out, errOut, code := runCLI(t, "", "prach", "-format", "json", path)
	if code != 0 {
		t.Fatalf("exit %d, stderr %s", code, errOut)
	}
	var doc struct {
		Table  string `json:"table"`
		Count  int    `json:"count"`
		Groups []struct {
			Format  string `json:"format"`
			Choices []struct {
				ConfigurationIndex             int `json:"configurationIndex"`
				AssociationPatternPeriodFrames int `json:"associationPatternPeriodFrames"`
			} `json:"choices"`
		} `json:"groups"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Table != "6.3.3.2-3" || doc.Count == 0 {
		t.Fatalf("table %s, %d rows", doc.Table, doc.Count)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, g := range doc.Groups {
		for _, c := range g.Choices {
			n++
			q := p.Clone()
			q.PRACH.ConfigurationIndex = c.ConfigurationIndex
			r := grid.Compute(q)
			if r.HasErrors() || r.PRACH == nil || r.PRACH.Format != g.Format {
				t.Errorf("index %d (format %s): findings %v", c.ConfigurationIndex, g.Format, r.Findings)
			} else if c.AssociationPatternPeriodFrames != r.PRACH.AssociationPatternPeriodFrames || c.AssociationPatternPeriodFrames == 0 {
				t.Errorf("index %d: pattern period %d frames in the finder, %d in the plan", c.ConfigurationIndex, c.AssociationPatternPeriodFrames, r.PRACH.AssociationPatternPeriodFrames)
			}
		}
	}
	if n != doc.Count {
		t.Errorf("%d rows, count %d", n, doc.Count)
	}
	table, _, code := runCLI(t, "", "prach", path)
	if code != 0 || !strings.Contains(table, "configuration indexes of the 263 of TS 38.211 Table 6.3.3.2-3 fit") || !strings.Contains(table, "format B4:") {
		t.Errorf("exit %d, table:\n%s", code, table)
	}
	// A plan without SS/PBCH blocks cannot be searched: exit 2 with the reason.
	_, errOut, code = runCLI(t, "", "prach", "../../testdata/broken/overlap.yaml")
	if code == 0 || errOut == "" {
		t.Errorf("a plan with errors: exit %d, stderr %q", code, errOut)
	}
}
