package render

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// Plans the tests draw: the demo plans and the heaviest plan a user can ask for.
const stressPlan = "../testdata/stress/fr2-2-2000mhz.yaml"

func demoPlans(t testing.TB) []string {
	t.Helper()
	paths, err := filepath.Glob("../grid/demo/*.yaml")
	if err != nil || len(paths) == 0 {
		t.Fatalf("no demo plans in ../grid/demo: %v", err)
	}
	return paths
}

func planName(path string) string { return strings.TrimSuffix(filepath.Base(path), filepath.Ext(path)) }

func loadPlan(t testing.TB, path string) grid.Plan {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatalf("decode %s: %v", path, err)
	}
	return p
}

// compute places plan p and fails the test if a partition was left out.
func compute(t testing.TB, p grid.Plan) grid.Result {
	t.Helper()
	r := grid.Compute(p)
	if len(r.Partitions) != len(p.Partitions) {
		t.Fatalf("plan %q: %d of %d partitions placed; findings %v", p.Name, len(r.Partitions), len(p.Partitions), r.Findings)
	}
	return r
}

func figure(t testing.TB, r grid.Result, opt Options) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := Figure(&b, r, opt); err != nil {
		t.Fatalf("Figure(%q, %+v): %v", r.Plan.Name, opt, err)
	}
	return b.Bytes()
}

// node is an element of a parsed SVG document.
type node struct {
	name string
	attr map[string]string
	text strings.Builder // character data directly inside
	kids []*node
}

// parseSVG walks the document with encoding/xml in strict mode, so it
// fails on anything that is not well-formed XML.
func parseSVG(t testing.TB, data []byte) *node {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	root := &node{name: "#document"}
	stack := []*node{root}
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			n := &node{name: tok.Name.Local, attr: map[string]string{}}
			for _, a := range tok.Attr {
				key := a.Name.Local
				if a.Name.Space != "" {
					key = a.Name.Space + ":" + key
				}
				n.attr[key] = a.Value
			}
			top := stack[len(stack)-1]
			top.kids = append(top.kids, n)
			stack = append(stack, n)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
		case xml.CharData:
			stack[len(stack)-1].text.Write(tok)
		}
	}
	if len(stack) != 1 || len(root.kids) != 1 || root.kids[0].name != "svg" {
		t.Fatalf("document has no single <svg> root")
	}
	return root.kids[0]
}

// walk calls fn for n and every element below it.
func (n *node) walk(fn func(*node)) {
	fn(n)
	for _, k := range n.kids {
		k.walk(fn)
	}
}

// all lists the elements below n (n included) for which keep is true.
func (n *node) all(keep func(*node) bool) []*node {
	var out []*node
	n.walk(func(m *node) {
		if keep(m) {
			out = append(out, m)
		}
	})
	return out
}

func (n *node) count() int { return len(n.all(func(*node) bool { return true })) }

// allText is the character data of n and everything below it.
func (n *node) allText() string {
	var b strings.Builder
	n.walk(func(m *node) { b.WriteString(m.text.String()) })
	return b.String()
}

func byClass(class string) func(*node) bool {
	return func(n *node) bool { return n.attr["class"] == class }
}

func attrInt(t testing.TB, n *node, key string) int64 {
	t.Helper()
	v, err := strconv.ParseInt(n.attr[key], 10, 64)
	if err != nil {
		t.Fatalf("<%s %s=%q>: %v", n.name, key, n.attr[key], err)
	}
	return v
}

var segRE = regexp.MustCompile(`M(-?[0-9.]+) (-?[0-9.]+)([VH])(-?[0-9.]+)`)

// segment is one subpath "Mx yVy2" or "Mx yHx2" of a line path.
type segment struct {
	x, y, to float64
	vertical bool
}

func segments(t testing.TB, d string) []segment {
	t.Helper()
	var out []segment
	for _, m := range segRE.FindAllStringSubmatch(d, -1) {
		x, _ := strconv.ParseFloat(m[1], 64)
		y, _ := strconv.ParseFloat(m[2], 64)
		to, _ := strconv.ParseFloat(m[4], 64)
		out = append(out, segment{x: x, y: y, to: to, vertical: m[3] == "V"})
	}
	if n := strings.Count(d, "M"); n != len(out) {
		t.Fatalf("path %q: %d subpaths, %d parsed as lines", d, n, len(out))
	}
	return out
}

var rectRE = regexp.MustCompile(`^M(-?[0-9.]+) (-?[0-9.]+)H(-?[0-9.]+)V(-?[0-9.]+)H(-?[0-9.]+)Z$`)

// rectOf reads a path made by pathData.rect.
func rectOf(t testing.TB, d string) (x1, y1, x2, y2 float64) {
	t.Helper()
	m := rectRE.FindStringSubmatch(d)
	if m == nil {
		t.Fatalf("path %q is not one rectangle", d)
	}
	v := make([]float64, 4)
	for i := range v {
		v[i], _ = strconv.ParseFloat(m[i+1], 64)
	}
	return v[0], v[1], v[2], v[3]
}

func near(a, b, tol float64) bool { return a-b <= tol && b-a <= tol }
