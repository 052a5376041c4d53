package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// render -format asn1 writes value notation that check and render read
// back: the same findings and the same figure as the plan file.
func TestValueNotationRoundTrip(t *testing.T) {
	dir := t.TempDir()
	for _, f := range demoPlans(t) {
		text, errOut, code := runCLI(t, "", "render", "-format", "asn1", f)
		if code != 0 || !strings.Contains(text, "ServingCellConfigCommonSIB ::= {") {
			t.Fatalf("%s: render -format asn1: exit %d\n%s%s", f, code, text, errOut)
		}
		asn := filepath.Join(dir, strings.TrimSuffix(filepath.Base(f), ".yaml")+".asn")
		if err := os.WriteFile(asn, []byte(text), 0o600); err != nil {
			t.Fatal(err)
		}
		want, _, _ := runCLI(t, "", "check", f)
		got, errOut, code := runCLI(t, "", "check", asn)
		if code != 0 || strings.ReplaceAll(got, asn, f) != want {
			t.Errorf("%s: check of the value notation: exit %d\n%s%s\nwant\n%s", f, code, got, errOut, want)
		}
		// Standard input has no extension: the content says what it is.
		svgPlan, _, _ := runCLI(t, "", "render", f)
		svgASN, errOut, code := runCLI(t, text, "render", "-")
		if code != 0 || svgASN != svgPlan {
			t.Errorf("%s: the figure of the value notation differs (exit %d) %s", f, code, errOut)
		}
	}
}

func TestValueNotationNotesAndErrors(t *testing.T) {
	dir := t.TempDir()
	text, _, _ := runCLI(t, "", "render", "-format", "asn1", "../../grid/demo/campus.yaml")
	logged := filepath.Join(dir, "log.asn1")
	writeFile(t, logged, text+"\nsib2 SIB2 ::= {}\n")
	out, errOut, code := runCLI(t, "", "check", logged)
	if code != 0 || !strings.Contains(out, "note: Skipped 1 values and fields gridloom does not read: sib2 SIB2 (line") {
		t.Errorf("check of a text with an unknown IE: exit %d\n%s%s", code, out, errOut)
	}
	bad := filepath.Join(dir, "bad.asn")
	writeFile(t, bad, "mib MIB ::= {\n  ssb-SubcarrierOffset 3,\n}\n")
	_, errOut, code = runCLI(t, "", "check", bad)
	if code != 2 || !strings.Contains(errOut, "line 3, column 1") {
		t.Errorf("check of malformed text: exit %d, want 2 naming line 3, column 1:\n%s", code, errOut)
	}
	// A plan with errors is not exported.
	broken, _ := filepath.Glob("../../testdata/broken/*.yaml")
	_, errOut, code = runCLI(t, "", "render", "-format", "asn1", broken[0])
	if code != 1 || !strings.Contains(errOut, "not exported") {
		t.Errorf("render -format asn1 of %s: exit %d, want 1:\n%s", broken[0], code, errOut)
	}
}

func writeFile(t *testing.T, path, text string) {
	t.Helper()
	if err := os.WriteFile(path, []byte(text), 0o600); err != nil {
		t.Fatal(err)
	}
}
