package render

import (
	"bytes"
	"fmt"
	"math/bits"
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// TestParseTheme reads the names the web takes as a query parameter; an
// unknown name is an error that names both themes.
func TestParseTheme(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Theme
	}{{"", ThemeLight}, {"light", ThemeLight}, {" Print ", ThemePrint}, {"PRINT", ThemePrint}} {
		got, err := ParseTheme(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("ParseTheme(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
		if again, err := ParseTheme(got.String()); err != nil || again != got {
			t.Errorf("ParseTheme(%q.String() = %q) = %v, %v", tc.in, got.String(), again, err)
		}
	}
	for _, in := range []string{"dark", "light,print", "<b>", strings.Repeat("x", 500)} {
		_, err := ParseTheme(in)
		if err == nil || !strings.Contains(err.Error(), "light") || !strings.Contains(err.Error(), "print") || !strings.HasPrefix(err.Error(), "theme ") {
			t.Errorf("ParseTheme(%.20q): error %v, want one that starts with the field and names light and print", in, err)
		}
		if err != nil && len(err.Error()) > 200 {
			t.Errorf("ParseTheme(%.20q): error of %d bytes repeats the whole input", in, len(err.Error()))
		}
	}
}

// TestLayerTitles: every layer has its words, and no more.
func TestLayerTitles(t *testing.T) {
	names, labels := LayerNames(), LayerTitles()
	if len(labels) != len(names) || len(names) != bits.OnesCount16(uint16(allLayers)) {
		t.Errorf("%d layer labels for %d names and %d layers", len(labels), len(names), bits.OnesCount16(uint16(allLayers)))
	}
}

// TestParseLayers reads comma lists of the layers to show.
func TestParseLayers(t *testing.T) {
	all := strings.Join(LayerNames(), ",")
	for _, tc := range []struct {
		in    string
		shown string // Layers.String of the result
	}{
		{"", all},
		{"all", all},
		{"none", "none"},
		{"lattice", "lattice"},
		{"ssb, TDD ,lattice", "lattice,tdd,ssb"},
		{"cp,cp,", "cp"},
		{all, all},
	} {
		got, err := ParseLayers(tc.in)
		if err != nil || got.String() != tc.shown {
			t.Errorf("ParseLayers(%q) = %q, %v; want %q", tc.in, got.String(), err, tc.shown)
			continue
		}
		if again, err := ParseLayers(got.String()); err != nil || again != got {
			t.Errorf("ParseLayers(%q) does not read its own String %q back: %v, %v", tc.in, got.String(), again, err)
		}
	}
	if (Layers{}).String() != all {
		t.Errorf("the zero Layers shows %q, want every layer %q", Layers{}.String(), all)
	}
	for _, in := range []string{"grid", "lattice,foo", "lattice;cp", "LABEL"} {
		_, err := ParseLayers(in)
		if err == nil || !strings.HasPrefix(err.Error(), "layers: ") {
			t.Errorf("ParseLayers(%q): error %v, want one that starts with the field", in, err)
			continue
		}
		for _, name := range LayerNames() {
			if !strings.Contains(err.Error(), name) {
				t.Errorf("ParseLayers(%q): error %q does not name the layer %q", in, err, name)
			}
		}
	}
}

// layerClasses are the classes each layer draws; hiding the layer must
// remove every one of them and nothing of the other layers. TDD letters
// and SS/PBCH labels belong to two layers each.
var layerClasses = map[Layer][]string{
	LayerLattice: {"gl-rows", "gl-symbols", "gl-align", "gl-align-heads"},
	LayerCP:      {"gl-cp", "gl-longcp"},
	LayerGuards:  {"gl-guard", "gl-unused", "gl-minguard"},
	LayerLabels:  {"gl-name", "gl-note", "gl-tdd-letter", "gl-ssb-label"},
	LayerTDD:     {"gl-tdd-d", "gl-tdd-f", "gl-tdd-u", "gl-tdd-off", "gl-tdd-edge", "gl-tdd-letter"},
	LayerSSB:     {"gl-ssb", "gl-ssb-label"},
	LayerRaster:  {"gl-raster", "gl-raster-fit", "gl-raster-off", "gl-raster-block"},
}

// TestLayersHidden draws the campus plan, which shows every layer at the
// widest figure (CP strips need wide symbols), with each layer hidden in turn.
func TestLayersHidden(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	classes := func(data []byte) map[string]bool {
		seen := map[string]bool{}
		parseSVG(t, data).walk(func(n *node) {
			for _, c := range strings.Fields(n.attr["class"]) {
				seen[c] = true
			}
		})
		return seen
	}
	full := classes(figure(t, r, Options{Width: MaxWidth}))
	for l, cs := range layerClasses {
		for _, c := range cs {
			if !full[c] {
				t.Fatalf("the full figure has no %s; the test cannot see layer %v hidden", c, Layers{hidden: allLayers &^ l})
			}
		}
	}
	for l, cs := range layerClasses {
		opt := Options{Width: MaxWidth, Layers: Layers{}.Hide(l)}
		data := figure(t, r, opt)
		got := classes(data)
		for _, c := range cs {
			if got[c] {
				t.Errorf("layers %q: the figure still has class %s", opt.Layers, c)
			}
		}
		for other, ocs := range layerClasses {
			if other == l {
				continue
			}
			for _, c := range ocs {
				if !got[c] && !slices.Contains(cs, c) {
					t.Errorf("layers %q: class %s of another layer is missing", opt.Layers, c)
				}
			}
		}
		root := parseSVG(t, data)
		if n := len(root.all(byClass("gl-part"))); n != len(r.Partitions) {
			t.Errorf("layers %q: %d partition groups, want %d", opt.Layers, n, len(r.Partitions))
		}
		if len(root.all(func(n *node) bool { return n.attr["id"] == "gl-plot" })) != 1 {
			t.Errorf("layers %q: the gl-plot group is missing", opt.Layers)
		}
	}
	none := classes(figure(t, r, Options{Width: MaxWidth, Layers: Layers{hidden: allLayers}}))
	for _, cs := range layerClasses {
		for _, c := range cs {
			if none[c] {
				t.Errorf("every layer hidden: class %s drawn", c)
			}
		}
	}
	if !none["gl-body"] {
		t.Error("every layer hidden: the partition bodies are gone too")
	}
}

// TestLayersKey: the key explains only what is drawn.
func TestLayersKey(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	key := func(opt Options) string {
		return parseSVG(t, figure(t, r, opt)).all(byClass("gl-key"))[0].allText()
	}
	for _, tc := range []struct {
		hide Layer
		text string
	}{
		{LayerCP, "cyclic prefix"},
		{LayerLattice, "slot boundary"},
		{LayerGuards, "guardband"},
		{LayerTDD, "TDD DDDSU"},
		{LayerSSB, "SS/PBCH block, case"},
		{LayerRaster, "sync raster"},
	} {
		if !strings.Contains(key(Options{}), tc.text) {
			t.Fatalf("the full key does not say %q", tc.text)
		}
		if got := key(Options{Layers: Layers{}.Hide(tc.hide)}); strings.Contains(got, tc.text) {
			t.Errorf("layers %q: the key still says %q", Layers{}.Hide(tc.hide), tc.text)
		}
	}
}

// TestOptionsRefused: values no caller can mean are errors, and nothing
// is written.
func TestOptionsRefused(t *testing.T) {
	r := compute(t, loadPlan(t, demoPlans(t)[0]))
	for _, tc := range []struct {
		opt  Options
		want string
	}{
		{Options{Theme: Theme(2)}, "ThemePrint"},
		{Options{Layers: Layers{hidden: 1 << 15}}, "ParseLayers"},
		{Options{Caption: strings.Repeat("é", MaxCaption+1)}, fmt.Sprint(MaxCaption)},
		{Options{Plan: make([]byte, MaxPlanBytes+1)}, fmt.Sprint(MaxPlanBytes)},
	} {
		for name, draw := range map[string]func(*bytes.Buffer) error{
			"Figure":    func(b *bytes.Buffer) error { return Figure(b, r, tc.opt) },
			"FigurePNG": func(b *bytes.Buffer) error { return FigurePNG(b, r, tc.opt) },
		} {
			var b bytes.Buffer
			err := draw(&b)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%s with %.60v: error %v, want one mentioning %q", name, tc.opt, err, tc.want)
			}
			if b.Len() != 0 {
				t.Errorf("%s with %.60v: wrote %d bytes despite the error", name, tc.opt, b.Len())
			}
		}
	}
	if err := Figure(&bytes.Buffer{}, r, Options{Caption: strings.Repeat("é", MaxCaption)}); err != nil {
		t.Errorf("a caption of exactly %d characters: %v", MaxCaption, err)
	}
}

// TestCaption: the caption is escaped element text under the legend,
// wrapped to the figure's width, and never an attribute.
func TestCaption(t *testing.T) {
	r := compute(t, loadPlan(t, demoPlans(t)[0]))
	hostile := "Fig. 3 </text><script>alert(1)</script> ]]> & \"q\" <!-- \x01 x"
	base := parseSVG(t, figure(t, r, Options{}))
	for _, width := range []int{MinWidth, DefaultWidth} {
		data := figure(t, r, Options{Width: width, Caption: hostile})
		root := parseSVG(t, data)
		selfContained(t, root, data)
		if bytes.Contains(data, []byte("<script")) || bytes.Contains(data, []byte("]]>")) {
			t.Errorf("width %d: the caption's markup reached the SVG unescaped", width)
		}
		groups := root.all(byClass("gl-caption"))
		if len(groups) != 1 {
			t.Fatalf("width %d: %d caption groups, want 1", width, len(groups))
		}
		want := asXMLText(strings.ReplaceAll(hostile, "\x01", "\uFFFD"))
		var lines []string
		for _, n := range groups[0].all(func(n *node) bool { return n.name == "text" }) {
			lines = append(lines, n.allText())
		}
		if got := strings.Join(lines, " "); got != want {
			t.Errorf("width %d: caption reads %q, want %q", width, got, want)
		}
		root.walk(func(n *node) {
			for k, v := range n.attr {
				if strings.Contains(v, "alert") || strings.Contains(v, "Fig. 3") {
					t.Errorf("width %d: <%s %s=%q> carries the caption", width, n.name, k, v)
				}
			}
		})
		if width == DefaultWidth {
			if h, h0 := attrInt(t, root, "height"), attrInt(t, base, "height"); h <= h0 {
				t.Errorf("the caption did not make room: height %d, %d without", h, h0)
			}
		}
	}

	// A long caption wraps at spaces into lines that fit the figure.
	long := strings.TrimSpace(strings.Repeat("The 30 kHz partition carries the camera backhaul. ", 6))
	for _, width := range []int{MinWidth, DefaultWidth} {
		root := parseSVG(t, figure(t, r, Options{Width: width, Caption: long}))
		texts := root.all(byClass("gl-caption"))[0].all(func(n *node) bool { return n.name == "text" })
		var lines []string
		for _, n := range texts {
			line := n.allText()
			lines = append(lines, line)
			if w := textWidth(line, captionSize, false); w > float64(width-2*legendLeft) {
				t.Errorf("width %d: caption line %q is %.0f px wide, more than %d", width, line, w, width-2*legendLeft)
			}
		}
		if len(lines) < 2 {
			t.Errorf("width %d: a %d-character caption is one line", width, utf8.RuneCountInString(long))
		}
		if got := strings.Join(lines, " "); got != long {
			t.Errorf("width %d: wrapped caption reads %q, want %q", width, got, long)
		}
	}
	// A word longer than a line is cut, not lost.
	word := strings.Repeat("x", MaxCaption)
	root := parseSVG(t, figure(t, r, Options{Width: MinWidth, Caption: word}))
	texts := root.all(byClass("gl-caption"))[0].all(func(n *node) bool { return n.name == "text" })
	var joined strings.Builder
	for _, n := range texts {
		joined.WriteString(n.allText())
	}
	if joined.String() != word || len(texts) < 2 {
		t.Errorf("a %d-character word: %d lines reading %d characters", len(word), len(texts), joined.Len())
	}
}

// TestPrintTheme: the print theme has no colours and no tints, draws the
// partition patterns in black on white and its lines heavier than the
// light theme's.
func TestPrintTheme(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	light, print := parseSVG(t, figure(t, r, Options{})), parseSVG(t, figure(t, r, Options{Theme: ThemePrint}))
	for _, p := range print.all(func(n *node) bool { return n.name == "pattern" }) {
		p.walk(func(n *node) {
			for _, k := range []string{"fill", "stroke"} {
				v := n.attr[k]
				if v == "" || v == "none" {
					continue
				}
				if !isGrey(v) {
					t.Errorf("print pattern %s: %s=%q is a colour", p.attr["id"], k, v)
				}
				if strings.HasPrefix(p.attr["id"], "gl-fill-") && v != "#000000" && v != "#ffffff" {
					t.Errorf("print partition pattern %s: %s=%q, want black on white", p.attr["id"], k, v)
				}
			}
			if op, err := strconv.ParseFloat(n.attr["fill-opacity"], 64); err == nil && op < 0.3 {
				t.Errorf("print pattern %s: fill-opacity %v is a tint a printer drops", p.attr["id"], op)
			}
		})
	}
	print.walk(func(n *node) {
		for _, k := range []string{"fill", "stroke"} {
			if v := n.attr[k]; strings.HasPrefix(v, "#") && !isGrey(v) {
				t.Errorf("print: <%s class=%q %s=%q> is a colour", n.name, n.attr["class"], k, v)
			}
		}
	})
	strokeW := func(root *node, class string) float64 {
		ns := root.all(byClass(class))
		if len(ns) == 0 {
			t.Fatalf("no %s", class)
		}
		w, err := strconv.ParseFloat(ns[0].attr["stroke-width"], 64)
		if err != nil {
			t.Fatalf("%s: stroke-width %q", class, ns[0].attr["stroke-width"])
		}
		return w
	}
	for _, class := range []string{"gl-body", "gl-rows", "gl-symbols", "gl-edges", "gl-align", "gl-ssb"} {
		if lw, pw := strokeW(light, class), strokeW(print, class); !(pw > lw) {
			t.Errorf("%s: print stroke %v px, light %v px; want print heavier", class, pw, lw)
		}
	}
	if !slices.ContainsFunc(light.all(func(n *node) bool { return n.name == "pattern" }), func(n *node) bool {
		return slices.ContainsFunc(n.kids, func(k *node) bool { return k.attr["fill-opacity"] == "0.14" })
	}) {
		t.Error("the light theme has no tinted pattern; the print check above proves nothing")
	}
}

// isGrey reports whether #rrggbb has equal channels.
func isGrey(v string) bool { return len(v) == 7 && v[1:3] == v[3:5] && v[3:5] == v[5:7] }
