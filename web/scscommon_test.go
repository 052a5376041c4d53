package web

import (
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/web/planform"
)

// TestSCSCommonControl: SCS common (ssb.common, subCarrierSpacingCommon) is
// offered only where it means something. In FR1 offsetToPointA and k_SSB
// count 15 kHz units whatever it is (TS 38.211 7.4.3.1), so it matters only
// to initial access (CORESET#0, TS 38.213 13); in FR2-1 it sets the units of
// both (60 or 120 kHz). When offered it is a choice of the range's values
// (TS 38.331 MIB: scs15or60, scs30or120), and a value typed where it is not
// offered keeps its control, named as not allowed when it is not a value.
func TestSCSCommonControl(t *testing.T) {
	commonControl := func(p grid.Plan, common string) (control, bool) {
		f := planform.FormOf(p)
		f.SSB.Common = common
		fv := buildForm(planform.NewState(f, nil), nil)
		for _, row := range fv.SSB.Rows {
			for _, c := range row.Controls {
				if c.Name == "ssb.common" {
					if !strings.HasSuffix(fv.Shape, ";common") {
						t.Errorf("the form shows SCS common but its shape %q does not say so", fv.Shape)
					}
					return c, true
				}
			}
		}
		if strings.HasSuffix(fv.Shape, ";common") {
			t.Errorf("the form's shape %q names SCS common, which it does not show", fv.Shape)
		}
		return fv.SSB.Rows[0].Controls[0], false
	}
	values := func(c control) (out []string) {
		for _, o := range c.Options {
			out = append(out, o.Value)
		}
		return out
	}
	fr1 := planform.NewPlan()
	fr1.SSB = &grid.SSBPlan{SCSKHz: 30}
	if _, shown := commonControl(fr1, ""); shown {
		t.Error("FR1 without initial access shows SCS common, which changes nothing there")
	}
	if c, shown := commonControl(fr1, "45"); !shown || c.Value != "45" || c.Options[0].Label != "45 (not a subCarrierSpacingCommon of FR1)" {
		t.Errorf("a typed 45 kHz in FR1: shown %v, %+v; want its control kept, the value named not allowed", shown, c)
	}
	withIA := fr1
	withIA.InitialAccess = &grid.InitialAccessPlan{}
	if c, shown := commonControl(withIA, ""); !shown || !equal(values(c), []string{"", "15", "30"}) {
		t.Errorf("FR1 with initial access: shown %v, values %v; want '', 15, 30", shown, values(c))
	}
	fr2 := grid.Plan{Name: "mm", Carrier: grid.CarrierPlan{Range: "FR2-1", BandwidthMHz: 100},
		SSB: &grid.SSBPlan{SCSKHz: 120}}
	if c, shown := commonControl(fr2, ""); !shown || !equal(values(c), []string{"", "60", "120"}) || c.Options[0].Label != "auto (120)" {
		t.Errorf("FR2-1: shown %v, %+v; want auto (120), 60, 120", shown, c)
	}
}

func equal(a, b []string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
