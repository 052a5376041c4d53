package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"reflect"
	"runtime/debug"
	"strings"
	"testing"

	"gridloom/grid"
)

// A plan whose only warning is a numerology gap: partition b (30 kHz)
// starts at CRB 51, 352.5 kHz above a (15 kHz), less than the 360 kHz of
// one 30 kHz PRB; at CRB 55 the gap is wide enough and the plan is clean.
const (
	warnOnlyPlan = "carrier: {bandwidthMHz: 40}\npartitions:\n  - {name: a, scsKHz: 15, sizePrb: 100, startCrb: 0}\n  - {name: b, scsKHz: 30, sizePrb: 50, startCrb: 51}\n"
	cleanPlan    = "carrier: {bandwidthMHz: 40}\npartitions:\n  - {name: a, scsKHz: 15, sizePrb: 100, startCrb: 0}\n  - {name: b, scsKHz: 30, sizePrb: 50, startCrb: 55}\n"
)

// "gridloom -h" is the default command's help, and lists every command
// with it, png and asn1 (TS 38.331 value notation) among render's formats.
func TestTopLevelHelp(t *testing.T) {
	for _, args := range [][]string{{"-h"}, {"--help"}, {"-help"}} {
		out, errOut, code := runCLI(t, "", args...)
		if code != 0 {
			t.Errorf("%v: exit %d", args, code)
		}
		for _, want := range []string{"gridloom render", "gridloom check", "gridloom version", "svg, png, json, csv or asn1", "-addr", "-plan"} {
			if !strings.Contains(out+errOut, want) {
				t.Errorf("%v: the help does not say %q:\n%s", args, want, out+errOut)
			}
		}
	}
	if out, _, _ := runCLI(t, "", "help"); !strings.Contains(out, "png") || !strings.Contains(out, "-strict") {
		t.Errorf("help does not name png or -strict:\n%s", out)
	}
	// "serve -h" stays the server's own help.
	if _, errOut, _ := runCLI(t, "", "serve", "-h"); strings.Contains(errOut, "gridloom render") || !strings.Contains(errOut, "-addr") {
		t.Errorf("serve -h:\n%s", errOut)
	}
}

// Flags after the plan file are read as flags; "--" makes the rest plan
// files, and two plan files are refused with both named.
func TestFlagsAfterThePlan(t *testing.T) {
	const campus = "../../grid/demo/campus.yaml"
	out, errOut, code := runCLI(t, "", "render", campus, "-format", "json")
	var doc map[string]any
	if code != 0 || json.Unmarshal([]byte(out), &doc) != nil || doc["partitions"] == nil {
		t.Errorf("render PLAN -format json: exit %d, stderr %q, %.100q", code, errOut, out)
	}
	if _, _, code := runCLI(t, warnOnlyPlan, "check", "-", "-strict"); code != 1 {
		t.Errorf("check - -strict on a plan with a warning: exit %d, want 1", code)
	}
	_, errOut, code = runCLI(t, "", "check", "--", "-format")
	if code != 2 || !strings.Contains(errOut, "-format") || !strings.Contains(errOut, "no such file") {
		t.Errorf(`check -- -format: exit %d, %q; want 2 and the file "-format" not found`, code, errOut)
	}
	_, errOut, code = runCLI(t, "", "render", campus, "-o", "x.svg", "extra.yaml")
	if code != 2 || !strings.Contains(errOut, `got 2: "../../grid/demo/campus.yaml" "extra.yaml"`) {
		t.Errorf("two plan files: exit %d, %q", code, errOut)
	}
}

// check -format json writes the findings under the same key and with the
// same fields as the document of render -format json.
func TestCheckJSON(t *testing.T) {
	for _, c := range []struct {
		name, stdin, file string
		code              int
	}{
		{"warning", warnOnlyPlan, "-", 0},
		{"errors", "", "../../testdata/broken/overlap.yaml", 1},
		{"clean", cleanPlan, "-", 0},
	} {
		t.Run(c.name, func(t *testing.T) {
			out, errOut, code := runCLI(t, c.stdin, "check", "-format", "json", c.file)
			if code != c.code {
				t.Fatalf("exit %d, want %d: %s", code, c.code, errOut)
			}
			var got struct {
				Findings []grid.Finding `json:"findings"`
			}
			dec := json.NewDecoder(strings.NewReader(out))
			dec.DisallowUnknownFields()
			if err := dec.Decode(&got); err != nil {
				t.Fatalf("not the findings object: %v\n%s", err, out)
			}
			doc, _, _ := runCLI(t, c.stdin, "render", "-format", "json", c.file)
			var want struct {
				Findings json.RawMessage `json:"findings"`
			}
			if err := json.Unmarshal([]byte(doc), &want); err != nil {
				t.Fatal(err)
			}
			var gotRaw struct {
				Findings json.RawMessage `json:"findings"`
			}
			_ = json.Unmarshal([]byte(out), &gotRaw)
			var a, b any
			_ = json.Unmarshal(gotRaw.Findings, &a)
			_ = json.Unmarshal(want.Findings, &b)
			if !reflect.DeepEqual(a, b) || len(got.Findings) == 0 {
				t.Errorf("check's findings\n%s\ndiffer from render's\n%s", gotRaw.Findings, want.Findings)
			}
		})
	}
}

// -strict fails on warnings; without it warnings pass, as the README says.
func TestCheckStrict(t *testing.T) {
	for _, c := range []struct {
		stdin string
		args  []string
		code  int
	}{
		{warnOnlyPlan, []string{"check", "-"}, 0},
		{warnOnlyPlan, []string{"check", "-strict", "-"}, 1},
		{warnOnlyPlan, []string{"check", "-strict", "-format", "json", "-"}, 1},
		{cleanPlan, []string{"check", "-strict", "-"}, 0}, // info findings do not count
	} {
		out, errOut, code := runCLI(t, c.stdin, c.args...)
		if code != c.code {
			t.Errorf("%v: exit %d, want %d\n%s%s", c.args, code, c.code, out, errOut)
		}
		if code == 1 && !strings.Contains(errOut, "-strict fails on 1 warning") {
			t.Errorf("%v: stderr does not say why: %q", c.args, errOut)
		}
	}
	if _, errOut, code := runCLI(t, cleanPlan, "check", "-format", "csv", "-"); code != 2 || !strings.Contains(errOut, "text or json") {
		t.Errorf("check -format csv: exit %d, %q", code, errOut)
	}
}

// version, -version and --version print the version and the release.
func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"version"}, {"-version"}, {"--version"}} {
		out, errOut, code := runCLI(t, "", args...)
		if code != 0 || !strings.HasPrefix(out, "gridloom ") || !strings.HasSuffix(out, "\nspec: 3GPP Release 17\n") {
			t.Errorf("%v: exit %d, %q %q", args, code, out, errOut)
		}
	}
	bi := &debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Path: "gridloom", Version: "v0.3.0"},
		Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: "1506865abc"}, {Key: "vcs.time", Value: "2026-12-02T05:55:13Z"}, {Key: "vcs.modified", Value: "true"}}}
	want := "gridloom v0.3.0\ncommit: 1506865abc (2026-12-02T05:55:13Z, with uncommitted changes)\ngo: go1.26.8\nspec: 3GPP Release 17\n"
	if got := versionText(bi, true); got != want {
		t.Errorf("versionText = %q, want %q", got, want)
	}
	if got := versionText(nil, false); got != "gridloom (unknown)\nspec: 3GPP Release 17\n" {
		t.Errorf("without build information: %q", got)
	}
}

// A PNG figure gridloom wrote is refused with a message that says it does
// not carry the plan and which files do; the SVG figure opens as its plan.
func TestOpenFigures(t *testing.T) {
	dir := t.TempDir()
	const campus = "../../grid/demo/campus.yaml"
	png, svg, svgNoExt := filepath.Join(dir, "campus.png"), filepath.Join(dir, "campus.svg"), filepath.Join(dir, "figure")
	for _, c := range [][]string{{"png", png}, {"svg", svg}, {"svg", svgNoExt}} {
		if _, errOut, code := runCLI(t, "", "render", "-format", c[0], "-o", c[1], campus); code != 0 {
			t.Fatalf("render -format %s: exit %d: %s", c[0], code, errOut)
		}
	}
	_, errOut, code := runCLI(t, "", "check", png)
	if code != 2 || !strings.Contains(errOut, "a PNG figure does not carry its plan") || !strings.Contains(errOut, "JSON or YAML file, or an SVG figure") || strings.Contains(errOut, "UTF-8") {
		t.Errorf("check on a PNG figure: exit %d, %q", code, errOut)
	}
	want, _, _ := runCLI(t, "", "check", campus)
	for _, f := range []string{svg, svgNoExt} {
		out, errOut, code := runCLI(t, "", "check", f)
		if code != 0 || !strings.Contains(out, "0 errors") {
			t.Errorf("check %s: exit %d, %q %q", f, code, out, errOut)
		}
		// The same findings as the plan file, but for the summary line's file name.
		if strings.ReplaceAll(out, f, campus) != want {
			t.Errorf("check %s:\n%s\nwant the findings of the plan file:\n%s", f, out, want)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "plain.svg"), []byte(`<svg xmlns="http://www.w3.org/2000/svg"/>`), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errOut, code := runCLI(t, "", "check", filepath.Join(dir, "plain.svg")); code != 2 || !strings.Contains(errOut, "carries no gridloom plan") {
		t.Errorf("an SVG without a plan: exit %d, %q", code, errOut)
	}
}
