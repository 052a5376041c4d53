package render

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

// hostilePlanJSON is the hostile plan as a plan file, written without
// JSON's HTML escaping so that the raw <, > and & reach the bytes stored.
func hostilePlanJSON(t *testing.T) []byte {
	t.Helper()
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	p := hostilePlan()
	p.Name = "]]> </gl:plan></metadata><script>alert(1)</script> & <![CDATA[ x ]]> \u2028"
	if err := enc.Encode(p); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestPlanRoundTrip: plan file → figure → PlanFromSVG gives the same bytes
// back, whatever they hold, and the figure stays well-formed.
func TestPlanRoundTrip(t *testing.T) {
	campus, err := os.ReadFile("../grid/demo/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	hostile := hostilePlanJSON(t)
	cases := map[string][]byte{
		"hostile JSON":    hostile,
		"demo YAML":       campus,
		"control bytes":   []byte("{\"name\": \"a\x00b\x01c\x1b\x7f\"}\r\n\t"),
		"invalid UTF-8":   {0xff, 0xfe, '<', 0xc3, 0x28, ']', ']', '>', 0xed, 0xa0, 0x80},
		"empty":           {},
		"one byte":        {'<'},
		"largest allowed": bytes.Repeat([]byte("<&]]>"), MaxPlanBytes/5),
	}
	for name, plan := range cases {
		t.Run(name, func(t *testing.T) {
			var r grid.Result
			if p, err := planfile.Decode(plan); err == nil {
				r = grid.Compute(p)
			} else {
				r = compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
			}
			data := figure(t, r, Options{Plan: plan})
			root := parseSVG(t, data)
			selfContained(t, root, data)
			if len(plan) > 8 && bytes.Contains(data, plan[:8]) && !bytes.Equal(plan[:8], campus[:8]) {
				t.Errorf("the plan's bytes appear raw in the SVG")
			}
			got, err := PlanFromSVG(data)
			if err != nil {
				t.Fatalf("PlanFromSVG: %v", err)
			}
			if !bytes.Equal(got, plan) {
				t.Errorf("PlanFromSVG gave %d bytes %.40q, want %d bytes %.40q", len(got), got, len(plan), plan)
			}
			metas := root.all(func(n *node) bool { return n.name == "metadata" })
			if len(metas) != 1 {
				t.Fatalf("%d <metadata> elements, want 1", len(metas))
			}
		})
	}

	// The hostile plan drawn from itself: its name is in <title> and the
	// legend as escaped text, and still the stored bytes come back.
	p, err := planfile.Decode(hostile)
	if err != nil {
		t.Fatalf("the hostile plan does not decode: %v", err)
	}
	data := figure(t, grid.Compute(p), Options{Plan: hostile})
	if got, err := PlanFromSVG(data); err != nil || !bytes.Equal(got, hostile) {
		t.Errorf("hostile plan drawn from itself: PlanFromSVG = %d bytes, %v", len(got), err)
	}
	if bytes.Contains(data, []byte("<script")) {
		t.Error("the hostile plan put <script in the SVG")
	}
}

// TestPlanAbsent: a figure drawn without a plan carries none.
func TestPlanAbsent(t *testing.T) {
	r := compute(t, loadPlan(t, "../grid/demo/campus.yaml"))
	data := figure(t, r, Options{})
	if bytes.Contains(data, []byte("<metadata")) {
		t.Error("a figure without Options.Plan has <metadata>")
	}
	if _, err := PlanFromSVG(data); !errors.Is(err, ErrNoPlan) {
		t.Errorf("PlanFromSVG of a figure without a plan: %v, want ErrNoPlan", err)
	}
}

// TestPlanFromSVGRefuses: input that is not a figure with a plan gives a
// clear error, never a plan.
func TestPlanFromSVGRefuses(t *testing.T) {
	const ns = `xmlns="http://www.w3.org/2000/svg"`
	const open = `<gl:plan xmlns:gl="` + PlanNamespace + `" encoding="base64">`
	for _, tc := range []struct {
		name, in, want string
	}{
		{"not XML", "PNG\x89 not xml <", "well-formed"},
		{"HTML root", "<html><metadata>" + open + "eyJ9</gl:plan></metadata></html>", "root element is <html>"},
		{"svg without namespace", "<svg><metadata>" + open + "e30=</gl:plan></metadata></svg>", "root element"},
		{"no metadata", "<svg " + ns + "><title>x</title></svg>", "carries no gridloom plan"},
		{"plan outside metadata", "<svg " + ns + "><g>" + open + "e30=</gl:plan></g></svg>", "carries no gridloom plan"},
		{"plan in another namespace", "<svg " + ns + `><metadata><gl:plan xmlns:gl="urn:other">e30=</gl:plan></metadata></svg>`, "carries no gridloom plan"},
		{"plan text only in the title", "<svg " + ns + "><title>&lt;metadata&gt;" + strings.ReplaceAll(open, "<", "&lt;") + "e30=</title></svg>", "carries no gridloom plan"},
		{"damaged base64", "<svg " + ns + "><metadata>" + open + "e30=!!</gl:plan></metadata></svg>", "damaged"},
		{"markup inside", "<svg " + ns + "><metadata>" + open + "e3<b/>0=</gl:plan></metadata></svg>", "markup"},
		{"other encoding", "<svg " + ns + `><metadata><gl:plan xmlns:gl="` + PlanNamespace + `" encoding="hex">7b7d</gl:plan></metadata></svg>`, "only base64"},
		{"cut short", "<svg " + ns + "><metadata>" + open + "e30=", "cut short"},
		{"entity bomb", `<!DOCTYPE svg [<!ENTITY a "aaaa"><!ENTITY b "&a;&a;&a;">]><svg ` + ns + "><title>&b;</title></svg>", "well-formed"},
	} {
		got, err := PlanFromSVG([]byte(tc.in))
		if err == nil || !strings.Contains(err.Error(), tc.want) || got != nil {
			t.Errorf("%s: PlanFromSVG = %q, %v; want an error saying %q", tc.name, got, err, tc.want)
		}
	}
	// The one accepted form, hand-written, for contrast with the refusals.
	if got, err := PlanFromSVG([]byte("<svg " + ns + "><metadata>" + open + "\n e3\n0=\n</gl:plan></metadata></svg>")); err != nil || string(got) != "{}" {
		t.Errorf("a hand-written plan element: %q, %v; want {}", got, err)
	}

	big := append([]byte("<svg "+ns+"><desc>"), bytes.Repeat([]byte("x"), MaxSVGBytes)...)
	if _, err := PlanFromSVG(big); err == nil || !strings.Contains(err.Error(), "at most") {
		t.Errorf("a figure over MaxSVGBytes: %v, want a size error", err)
	}
	huge := "<svg " + ns + "><metadata>" + open + strings.Repeat("QUJD", MaxPlanBytes/3+8) + "</gl:plan></metadata></svg>"
	if _, err := PlanFromSVG([]byte(huge)); err == nil || !strings.Contains(err.Error(), fmt.Sprint(MaxPlanBytes)) {
		t.Errorf("a stored plan over MaxPlanBytes: %v, want a size error", err)
	}
}

// TestPlanLimitMatchesPlanFile: a figure can hold any plan file that
// grid/planfile reads, and no larger.
func TestPlanLimitMatchesPlanFile(t *testing.T) {
	if MaxPlanBytes != planfile.MaxSize {
		t.Errorf("MaxPlanBytes = %d, planfile.MaxSize = %d", MaxPlanBytes, planfile.MaxSize)
	}
}
