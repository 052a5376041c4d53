package main

import (
	"bufio"
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gridloom/grid/planfile"
)

type hostileCase struct {
	file, status, code, what string
}

// hostileCases reads testdata/hostile/cases.tsv.
func hostileCases(t *testing.T) []hostileCase {
	t.Helper()
	f, err := os.Open("../../testdata/hostile/cases.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out []hostileCase
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 4 {
			t.Fatalf("bad manifest line %q", line)
		}
		out = append(out, hostileCase{c[0], c[1], c[2], c[3]})
	}
	if len(out) < 40 {
		t.Fatalf("the hostile corpus has %d cases, want at least 40", len(out))
	}
	return out
}

// Every hostile plan gets the exit status its manifest line names, and a
// 422 case the named error finding; nothing panics or hangs.
func TestHostileCorpusCLI(t *testing.T) {
	exitFor := map[string]int{"200": 0, "422": 1, "400": 2}
	for _, c := range hostileCases(t) {
		t.Run(c.file, func(t *testing.T) {
			out, errOut, code := runCLI(t, "", "check", "../../testdata/hostile/"+c.file)
			if want := exitFor[c.status]; code != want {
				t.Fatalf("%s: exit %d, want %d\n%s%s", c.what, code, want, out, errOut)
			}
			if c.code != "-" && !strings.Contains(out, "error "+c.code+" ") {
				t.Errorf("%s: no error %s finding:\n%s", c.what, c.code, out)
			}
			if c.status == "200" && strings.Contains(out, "\nerror ") {
				t.Errorf("%s: accepted plan has errors:\n%s", c.what, out)
			}
			// Accepted or judged plans also render in every format.
			if c.status != "400" {
				for _, format := range []string{"svg", "json", "csv"} {
					if _, errOut, code := runCLI(t, "", "render", "-format", format, "-o", filepath.Join(t.TempDir(), "out"), "../../testdata/hostile/"+c.file); code > 1 {
						t.Errorf("render -format %s: exit %d: %s", format, code, errOut)
					}
				}
			}
		})
	}
}

// Input beyond planfile.MaxSize is refused before it is decoded.
func TestOversizedInput(t *testing.T) {
	big := bytes.Repeat([]byte(" "), planfile.MaxSize+10)
	_, errOut, code := runCLI(t, string(big), "check", "-")
	if code != 2 || !strings.Contains(errOut, "at most") {
		t.Errorf("oversized input: exit %d, %q", code, errOut)
	}
}
