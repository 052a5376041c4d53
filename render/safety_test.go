package render

import (
	"bytes"
	"strings"
	"testing"
	"unicode/utf8"

	"gridloom/grid"
)

// hostilePlan names a plan and its partitions with text that would break
// out of an element or an attribute, or run a script, if pasted raw.
func hostilePlan() grid.Plan {
	at := func(n int) *int { return &n }
	return grid.Plan{
		Name:    `</title><script>alert(1)</script>`,
		Carrier: grid.CarrierPlan{Range: "FR1", BandwidthMHz: 40},
		Partitions: []grid.PartitionPlan{
			{Name: `<script>alert("x")</script>`, SCSKHz: 15, StartCRB: at(0), SizePRB: 40},
			{Name: "a\"b'c&d]]><!-- \x01\x1b\u2028 x=\"1\" onload=\"e()\"", SCSKHz: 15, StartCRB: at(60), SizePRB: 40},
			{Name: "<![CDATA[ ]]> <svg onload=alert(2)>", SCSKHz: 30, StartCRB: at(60), SizePRB: 30},
			{Name: strings.Repeat("wordy", 24), SCSKHz: 30, StartCRB: at(92), SizePRB: 10},
		},
	}
}

// asXMLText is how s reads back from an XML document written by
// encoding/xml: characters XML cannot carry become U+FFFD.
func asXMLText(s string) string {
	return strings.Map(func(r rune) rune {
		if r == '\t' || r == '\n' || r == '\r' || r >= 0x20 && r <= 0xD7FF || r >= 0xE000 && r <= 0xFFFD || r >= 0x10000 && r <= 0x10FFFF {
			return r
		}
		return '\uFFFD'
	}, s)
}

// TestHostileNames checks that untrusted names cannot change the document:
// it stays well-formed, holds no script, carries the names only as escaped
// element text, and never in an attribute.
func TestHostileNames(t *testing.T) {
	p := hostilePlan()
	r := grid.Compute(p)
	if len(r.Partitions) != len(p.Partitions) {
		t.Fatalf("%d of %d partitions placed: %v", len(r.Partitions), len(p.Partitions), r.Findings)
	}
	for _, width := range []int{MinWidth, DefaultWidth} {
		data := figure(t, r, Options{Width: width})
		root := parseSVG(t, data)
		if bytes.Contains(bytes.ToLower(data), []byte("<script")) {
			t.Errorf("width %d: the SVG contains <script", width)
		}
		if bytes.Contains(data, []byte("<![CDATA[")) || bytes.Contains(data, []byte("<!-- \x01")) {
			t.Errorf("width %d: a name's markup reached the SVG unescaped", width)
		}
		if !bytes.Contains(data, []byte("&lt;script&gt;alert(&#34;x&#34;)&lt;/script&gt;")) {
			t.Errorf("width %d: the escaped partition name is not in the SVG", width)
		}
		if !utf8.Valid(data) {
			t.Errorf("width %d: the SVG is not valid UTF-8", width)
		}
		selfContained(t, root, data)

		titles := root.all(func(n *node) bool { return n.name == "title" })
		if len(titles) != 1 || titles[0].allText() != p.Name {
			t.Errorf("width %d: <title> reads %q, want %q", width, titles[0].allText(), p.Name)
		}
		legend := root.all(byClass("gl-legend"))[0].allText()
		for _, pp := range p.Partitions {
			if want := asXMLText(shown(pp.Name)); !strings.Contains(legend, want) {
				t.Errorf("width %d: legend does not show %q", width, want)
			}
		}
		if strings.Contains(legend, strings.Repeat("wordy", 9)) {
			t.Errorf("width %d: a 120-character name is shown whole", width)
		}
		root.walk(func(n *node) {
			for k, v := range n.attr {
				for _, bad := range []string{"alert", "]]>", "onload", "wordy"} {
					if strings.Contains(v, bad) {
						t.Errorf("width %d: <%s %s=%q> carries user text", width, n.name, k, v)
					}
				}
			}
		})
		for _, n := range root.all(func(n *node) bool { return n.name == "svg" }) {
			if n != root {
				t.Errorf("width %d: a nested <svg> element appeared", width)
			}
		}
	}
}

// TestShownN checks the shortening of names: whole runes, an ellipsis, and
// nothing cut from a name that fits.
func TestShownN(t *testing.T) {
	for _, tc := range []struct {
		in   string
		n    int
		want string
	}{
		{"short", 10, "short"},
		{"exactly10!", 10, "exactly10!"},
		{"eleven char", 10, "eleven ch…"},
		{"µµµµµµ", 4, "µµµ…"},
		{"", 3, ""},
	} {
		if got := shownN(tc.in, tc.n); got != tc.want {
			t.Errorf("shownN(%q, %d) = %q, want %q", tc.in, tc.n, got, tc.want)
		}
	}
}
