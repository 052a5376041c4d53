package main

import (
	"bytes"
	"context"
	"encoding/binary"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gridloom/grid/planfile"
	"gridloom/render"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// runCLI runs the program as a user would and returns its output and exit status.
func runCLI(t *testing.T, stdin string, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errOut bytes.Buffer
	err := run(context.Background(), args, strings.NewReader(stdin), &out, &errOut)
	code = exitCode(err, &errOut)
	return out.String(), errOut.String(), code
}

func demoPlans(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob("../../grid/demo/*.yaml")
	if err != nil || len(files) < 3 {
		t.Fatalf("demo plans: %v, %d found", err, len(files))
	}
	return files
}

func golden(t *testing.T, path string, got []byte) {
	t.Helper()
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/gridloom -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs (go test ./cmd/gridloom -update rewrites it):\n%s", path, firstDiff(string(want), string(got)))
	}
}

func firstDiff(want, got string) string {
	w, g := strings.Split(want, "\n"), strings.Split(got, "\n")
	for i := 0; i < max(len(w), len(g)); i++ {
		var wl, gl string
		if i < len(w) {
			wl = w[i]
		}
		if i < len(g) {
			gl = g[i]
		}
		if wl != gl {
			return fmt.Sprintf("line %d:\n- %s\n+ %s", i+1, wl, gl)
		}
	}
	return "(only line endings differ)"
}

func TestRenderJSONGolden(t *testing.T) {
	for _, f := range demoPlans(t) {
		out, errOut, code := runCLI(t, "", "render", "-format", "json", f)
		if code != 0 {
			t.Fatalf("%s: exit %d, stderr %s", f, code, errOut)
		}
		name := strings.TrimSuffix(filepath.Base(f), ".yaml")
		golden(t, "../../testdata/golden/json/"+name+".json", []byte(out))
	}
}

// The JSON document carries every symbol of every partition over the span.
func TestRenderJSONShape(t *testing.T) {
	out, _, code := runCLI(t, "", "render", "-format", "json", "../../grid/demo/port.yaml")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	var doc struct {
		Plan       map[string]any   `json:"plan"`
		Channel    map[string]any   `json:"channel"`
		Carriers   []map[string]any `json:"carriers"`
		Partitions []struct {
			SCSKHz  int              `json:"scsKHz"`
			CP      string           `json:"cp"`
			Symbols []map[string]any `json:"symbols"`
		} `json:"partitions"`
		Findings []map[string]any `json:"findings"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	for _, p := range doc.Partitions {
		// 2 ms: 24 symbols per ms at 60 kHz extended CP, 28 at 30 kHz (TS 38.211 Tables 4.3.2-1/-2).
		want := 2 * 28
		if p.CP == "extended" {
			want = 2 * 48
		}
		if len(p.Symbols) != want {
			t.Errorf("%d kHz %s CP: %d symbols, want %d", p.SCSKHz, p.CP, len(p.Symbols), want)
		}
		for _, k := range []string{"slot", "symbol", "startTc", "cpTc", "lengthTc"} {
			if _, ok := p.Symbols[0][k]; !ok {
				t.Errorf("symbol lacks %q: %v", k, p.Symbols[0])
			}
		}
	}
	if doc.Channel["pointAMHz"] == nil || len(doc.Carriers) != 2 {
		t.Errorf("channel %v, %d carriers", doc.Channel, len(doc.Carriers))
	}
}

func TestStdin(t *testing.T) {
	data, err := os.ReadFile("../../grid/demo/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	fromFile, _, _ := runCLI(t, "", "render", "-format", "json", "../../grid/demo/campus.yaml")
	fromStdin, errOut, code := runCLI(t, string(data), "render", "-format", "json", "-")
	if code != 0 || fromStdin != fromFile {
		t.Errorf("stdin: exit %d, stderr %q; same output as the file: %v", code, errOut, fromStdin == fromFile)
	}
}

func TestCheckExitCodes(t *testing.T) {
	for _, c := range []struct {
		name, stdin string
		args        []string
		code        int
		say         string
	}{
		{"clean demo", "", []string{"check", "../../grid/demo/campus.yaml"}, 0, "0 errors, 0 warnings, 3 partitions placed"},
		{"one error", "", []string{"check", "../../testdata/broken/bandwidth.yaml"}, 1, "1 error, 0 warnings, 0 partitions placed"},
		{"warnings only", `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":15,"sizePrb":24},{"name":"b","scsKHz":30,"startCrb":13,"sizePrb":10}]}`,
			[]string{"check", "-"}, 0, "numerology-gap"},
		{"errors", `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":120,"sizePrb":24}]}`, []string{"check", "-"}, 1, "scs-range"},
		// DDDSU at 30 kHz with a 10:2:2 special slot: two guard symbols
		// reach 6.79 km (TS 38.211 4.3.1), so a 10 km cell is a range warning.
		{"cell range", `{"carrier":{"bandwidthMHz":40},"environment":{"cellRadiusKm":10},
			"tdd":{"referenceScsKHz":30,"pattern1":{"periodMs":2.5,"downlinkSlots":3,"downlinkSymbols":10,"uplinkSlots":1,"uplinkSymbols":2}},
			"partitions":[{"name":"a","scsKHz":30,"sizePrb":24}]}`, []string{"check", "-"}, 0, "warning range (environment.cellRadiusKm): environment.cellRadiusKm 10 km is beyond the 6.79 km the TDD guard allows"},
		// The campus guard: two 15 kHz symbols, 280576 Tc, less 25600 + 25600
		// Tc, is 116.67 µs: c·t/2 = 17.49 km (TS 38.211 4.3.1).
		{"timing tables", "", []string{"timing", "../../grid/demo/campus.yaml"}, 0, "the largest cell radius is 17.49 km"},
		{"unreadable", "", []string{"check", "../../grid/demo/no-such-plan.yaml"}, 2, "no-such-plan"},
		{"undecodable", `{"carrier":`, []string{"check", "-"}, 2, "not valid JSON"},
		{"no plan argument", "", []string{"check"}, 2, "exactly one plan"},
		{"unknown command", "", []string{"draw"}, 2, "unknown command"},
		{"unknown format", "", []string{"render", "-format", "pdf", "x.yaml"}, 2, "svg, png, json, csv or asn1"},
		{"unknown theme", "", []string{"render", "-theme", "dark", "x.yaml"}, 2, "light or print"},
		{"unknown layer", "", []string{"render", "-layers", "grid", "x.yaml"}, 2, "lattice"},
		{"width out of range", "", []string{"render", "-width", "100", "../../grid/demo/campus.yaml"}, 2, "640"},
		{"unknown preset", "", []string{"render", "-preset", "letter", "x.yaml"}, 2, "a4, slide, poster"},
		{"unknown time unit", "", []string{"render", "-timeunit", "s", "x.yaml"}, 2, "auto, us or ms"},
		{"scale out of range", "", []string{"render", "-format", "png", "-scale", "8", "x.yaml"}, 2, "1 to 4"},
		{"dpi out of range", "", []string{"render", "-format", "png", "-dpi", "20", "x.yaml"}, 2, "72 to 1200"},
		// 800 mm at 300 dpi is 9449 px, past 4800; 4800 px hold 152 dpi.
		{"poster at 300 dpi", "", []string{"render", "-format", "png", "-preset", "poster", "-dpi", "300", "-o", os.DevNull, "../../grid/demo/campus.yaml"}, 2, "152 dpi"},
		{"ssb table", "", []string{"ssb", "-band", "n78", "../../grid/demo/campus.yaml"}, 0, "8016    3744.480                649632              56    16"},
		{"ssb unknown band", "", []string{"ssb", "-band", "n80", "../../grid/demo/campus.yaml"}, 2, "no SS raster entries"},
		{"ssb wrong band spacing", "", []string{"ssb", "-band", "n1", "../../grid/demo/campus.yaml"}, 2, "no 30 kHz SS/PBCH blocks"},
		{"ssb no frequency", `{"carrier":{"bandwidthMHz":40},"partitions":[{"name":"a","scsKHz":30,"sizePrb":106}]}`, []string{"ssb", "-band", "n78", "-"}, 2, "carrier.centerMHz"},
		{"ssb unknown format", "", []string{"ssb", "-format", "csv", "x.yaml"}, 2, "table or json"},
	} {
		t.Run(c.name, func(t *testing.T) {
			out, errOut, code := runCLI(t, c.stdin, c.args...)
			if code != c.code {
				t.Errorf("exit %d, want %d; stdout %q stderr %q", code, c.code, out, errOut)
			}
			if !strings.Contains(out+errOut, c.say) {
				t.Errorf("output does not say %q:\n%s%s", c.say, out, errOut)
			}
		})
	}
}

// "gridloom ssb -format json" lists the GSCNs with their placement; the
// campus plan's own GSCN 8016 is among them with the offsets worked by hand
// in render's TestSSBCampus (offsetToPointA 56, k_SSB 16).
func TestSSBCommandJSON(t *testing.T) {
	out, errOut, code := runCLI(t, "", "ssb", "-band", "n78", "-format", "json", "../../grid/demo/campus.yaml")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var doc struct {
		Band      string `json:"band"`
		Positions []struct {
			GSCN           int     `json:"gscn"`
			SSRefMHz       float64 `json:"ssRefMHz"`
			OffsetToPointA int     `json:"offsetToPointA"`
			KSSB           int     `json:"kSsb"`
		} `json:"positions"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("%v: %s", err, out)
	}
	found := false
	for _, q := range doc.Positions {
		if q.GSCN < 7711 || q.GSCN > 8051 {
			t.Errorf("GSCN %d is outside n78's 7711 – 8051", q.GSCN)
		}
		if q.GSCN == 8016 {
			found = q.SSRefMHz == 3744.48 && q.OffsetToPointA == 56 && q.KSSB == 16
		}
	}
	if doc.Band != "n78" || !found {
		t.Errorf("band %q; GSCN 8016 at 3744.48 MHz with 56/16 found: %v\n%s", doc.Band, found, out)
	}
}

func TestBrokenPlansExitOne(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/broken/*.yaml")
	if len(files) == 0 {
		t.Fatal("no broken plans in testdata/broken")
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		// Each file names the finding it must raise on its first line: "# expect: CODE".
		first, _, _ := strings.Cut(string(data), "\n")
		code, ok := strings.CutPrefix(first, "# expect: ")
		if !ok {
			t.Fatalf("%s: first line must be '# expect: CODE'", f)
		}
		out, errOut, exit := runCLI(t, "", "check", f)
		if exit != 1 || !strings.Contains(out, "error "+code+" ") {
			t.Errorf("%s: exit %d, want 1 with an error %s finding; got:\n%s%s", f, exit, code, out, errOut)
		}
	}
}

func TestHelpOnEverySubcommand(t *testing.T) {
	for _, cmd := range []string{"render", "check", "ssb", "initial", "timing"} {
		_, errOut, code := runCLI(t, "", cmd, "-h")
		if code != 0 || !strings.Contains(errOut, "Usage: gridloom "+cmd) {
			t.Errorf("%s -h: exit %d, output %q", cmd, code, errOut)
		}
	}
	if out, _, code := runCLI(t, "", "help"); code != 0 || !strings.Contains(out, "render") {
		t.Errorf("help: exit %d, %q", code, out)
	}
	if _, errOut, _ := runCLI(t, "", "render", "-h"); !strings.Contains(errOut, "-format") {
		t.Errorf("render -h does not list -format: %q", errOut)
	}
}

func TestRenderWritesFile(t *testing.T) {
	out := filepath.Join(t.TempDir(), "plan.json")
	if _, errOut, code := runCLI(t, "", "render", "-format", "json", "-o", out, "../../grid/demo/stadium.yaml"); code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	data, err := os.ReadFile(out)
	if err != nil || !json.Valid(data) {
		t.Errorf("-o wrote %d bytes of valid JSON %v (err %v)", len(data), json.Valid(data), err)
	}
}

func TestExitErrorMessage(t *testing.T) {
	var buf bytes.Buffer
	if code := exitCode(errors.New("boom"), &buf); code != 1 || !strings.Contains(buf.String(), "gridloom: boom") {
		t.Errorf("plain error: exit %d, %q", code, buf.String())
	}
}

// The figure carries its plan: the plan read back from the SVG's metadata
// decodes to the plan the figure was drawn from. PNG output is a PNG.
func TestRenderFigureFormats(t *testing.T) {
	dir := t.TempDir()
	src := "../../grid/demo/stadium.yaml"
	svgPath, pngPath := filepath.Join(dir, "f.svg"), filepath.Join(dir, "f.png")
	for _, c := range [][]string{
		{"render", "-format", "svg", "-theme", "print", "-layers", "lattice,tdd,ssb", "-o", svgPath, src},
		{"render", "-format", "png", "-width", "800", "-o", pngPath, src},
	} {
		if _, errOut, code := runCLI(t, "", c...); code != 0 {
			t.Fatalf("%v: exit %d: %s", c, code, errOut)
		}
	}
	svg, _ := os.ReadFile(svgPath)
	embedded, err := render.PlanFromSVG(svg)
	if err != nil {
		t.Fatal(err)
	}
	fromSVG, err := planfile.Decode(embedded)
	if err != nil {
		t.Fatal(err)
	}
	data, _ := os.ReadFile(src)
	want, _ := planfile.Decode(data)
	if !reflect.DeepEqual(fromSVG, want) {
		t.Errorf("the plan in the figure differs from the plan file:\n%s", embedded)
	}
	if !bytes.Contains(svg, []byte("Northgate arena")) {
		t.Error("the figure has no caption with the plan's name")
	}
	png, _ := os.ReadFile(pngPath)
	if !bytes.HasPrefix(png, []byte("\x89PNG\r\n\x1a\n")) {
		t.Errorf("-format png wrote %d bytes that are not a PNG", len(png))
	}

	// A preset and a time unit reach the SVG; scale and dpi the PNG.
	out, errOut, code := runCLI(t, "", "render", "-preset", "a4", "-timeunit", "ms", src)
	if code != 0 || !strings.Contains(out, `viewBox="0 0 604 `) || !strings.Contains(out, "time (ms)") {
		t.Errorf("-preset a4 -timeunit ms: exit %d, %s; the SVG lacks the 604 px layout or the ms axis", code, errOut)
	}
	if _, errOut, code := runCLI(t, "", "render", "-format", "png", "-preset", "a4", "-dpi", "300", "-scale", "1", "-o", pngPath, src); code != 0 {
		t.Fatalf("-dpi 300: exit %d: %s", code, errOut)
	}
	png, _ = os.ReadFile(pngPath)
	// pHYs follows IHDR: 8 + 25 bytes in, length 9, 11811 px/m each way
	// (300 / 0.0254, PNG specification 11.3.5.3), unit 1 (metre).
	if len(png) < 33+21 || string(png[37:41]) != "pHYs" || binary.BigEndian.Uint32(png[41:]) != 11811 || png[49] != 1 {
		t.Errorf("-dpi 300 wrote no pHYs of 11811 px/m after IHDR")
	}
	if w := binary.BigEndian.Uint32(png[16:]); w != 1890 {
		t.Errorf("-preset a4 -dpi 300: %d px wide, want 160/25.4×300 = 1890", w)
	}
	// Too large a PNG is refused with the flags that size it, exit 2.
	_, errOut, code = runCLI(t, "", "render", "-format", "png", "-width", "4800", "-scale", "4", "-o", pngPath, src)
	if code != 2 || !strings.Contains(errOut, "-width, -scale and -dpi") {
		t.Errorf("-width 4800 -scale 4: exit %d, %q; want 2 naming -width, -scale and -dpi", code, errOut)
	}
}
