package render

import (
	"bytes"
	"encoding/base64"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
)

// The plan travels inside the SVG as base64 text in an element of the
// package's own namespace:
//
//	<metadata id="gl-meta"><gl:plan xmlns:gl="urn:x-gridloom:plan:1" encoding="base64">…</gl:plan></metadata>
//
// Base64 holds any bytes, so no plan name can end the element, open
// markup or carry a character XML forbids.

// PlanNamespace is the XML namespace of the plan element in a figure's
// metadata.
const PlanNamespace = "urn:x-gridloom:plan:1"

// Limits of PlanFromSVG. MaxPlanBytes matches the plan file limit of
// grid/planfile (MaxSize); MaxSVGBytes leaves room for the largest figure
// (16 partitions at the widest, about 200 KB) with the largest plan in
// base64 (1.4 MB).
const (
	MaxPlanBytes = 1 << 20
	MaxSVGBytes  = 4 << 20
)

// ErrNoPlan is returned by PlanFromSVG for a figure that carries no plan.
var ErrNoPlan = errors.New("the figure carries no gridloom plan; only an SVG exported by gridloom with its plan can be reopened")

// writePlan writes the <metadata> element holding plan, with the given id.
func writePlan(buf *bytes.Buffer, id string, plan []byte) {
	buf.WriteString(`<metadata id="` + id + `"><gl:plan xmlns:gl="` + PlanNamespace + `" encoding="base64">` + "\n")
	enc := base64.StdEncoding.EncodeToString(plan)
	for len(enc) > 76 {
		buf.WriteString(enc[:76])
		buf.WriteByte('\n')
		enc = enc[76:]
	}
	buf.WriteString(enc)
	buf.WriteString("\n</gl:plan></metadata>\n")
}

// PlanFromSVG returns the plan file stored in a figure by Figure with
// Options.Plan, byte for byte. It reads at most MaxSVGBytes of well-formed
// XML whose root is an SVG element, and returns ErrNoPlan when there is no
// plan in its <metadata>.
func PlanFromSVG(svgData []byte) ([]byte, error) {
	if len(svgData) > MaxSVGBytes {
		return nil, fmt.Errorf("the figure is %d bytes; at most %d bytes are read", len(svgData), MaxSVGBytes)
	}
	dec := xml.NewDecoder(bytes.NewReader(svgData))
	depth := 0
	inMeta := -1 // depth of the <metadata> being read, or −1
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			return nil, ErrNoPlan
		}
		if err != nil {
			return nil, fmt.Errorf("the figure is not a well-formed SVG document: %v", err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			switch {
			case depth == 1 && (t.Name.Local != "svg" || t.Name.Space != "http://www.w3.org/2000/svg"):
				return nil, fmt.Errorf("the file is not an SVG figure: its root element is <%s>", t.Name.Local)
			case depth == 2 && t.Name.Local == "metadata":
				inMeta = depth
			case inMeta > 0 && t.Name.Space == PlanNamespace && t.Name.Local == "plan":
				return readPlan(dec, t)
			}
		case xml.EndElement:
			if depth == inMeta {
				inMeta = -1
			}
			depth--
		}
	}
}

// readPlan decodes the base64 text of the plan element start.
func readPlan(dec *xml.Decoder, start xml.StartElement) ([]byte, error) {
	for _, a := range start.Attr {
		if a.Name.Local == "encoding" && a.Value != "base64" {
			return nil, fmt.Errorf("the figure's plan is in encoding %q; only base64 is read", shownN(a.Value, 20))
		}
	}
	var text []byte
	for {
		tok, err := dec.Token()
		if err != nil {
			return nil, fmt.Errorf("the figure's plan element is cut short: %v", err)
		}
		switch t := tok.(type) {
		case xml.CharData:
			text = append(text, t...)
			if len(text) > base64.StdEncoding.EncodedLen(MaxPlanBytes)+base64.StdEncoding.EncodedLen(MaxPlanBytes)/76+16 {
				return nil, fmt.Errorf("the figure's plan is over %d bytes", MaxPlanBytes)
			}
		case xml.StartElement:
			return nil, errors.New("the figure's plan element holds markup; it must hold base64 text only")
		case xml.EndElement:
			text = bytes.Join(bytes.Fields(text), nil)
			plan := make([]byte, base64.StdEncoding.DecodedLen(len(text)))
			n, err := base64.StdEncoding.Decode(plan, text)
			if err != nil {
				return nil, fmt.Errorf("the figure's plan is damaged: %v", err)
			}
			if n > MaxPlanBytes {
				return nil, fmt.Errorf("the figure's plan is %d bytes; at most %d are read", n, MaxPlanBytes)
			}
			return plan[:n], nil
		}
	}
}
