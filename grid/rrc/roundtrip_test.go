package rrc_test

import (
	"bytes"
	"reflect"
	"testing"

	"gridloom/grid"
	"gridloom/grid/coreset0"
	"gridloom/grid/demo"
	"gridloom/grid/planfile"
	"gridloom/grid/rrc"
	"gridloom/render"
)

// figure draws a plan as the CLI does, with the plan file embedded, so
// that a difference anywhere in the plan shows in the bytes.
func figure(t testing.TB, p grid.Plan) []byte {
	t.Helper()
	plan, err := planfile.EncodeJSON(p)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := render.Figure(&b, grid.Compute(p), render.Options{Caption: p.Name, Plan: plan}); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// roundTrip writes p, reads it back and compares plan and figure.
func roundTrip(t testing.TB, name string, p grid.Plan) {
	t.Helper()
	text, err := rrc.Encode(p)
	if err != nil {
		t.Fatalf("%s: Encode: %v", name, err)
	}
	d, err := rrc.Decode(text)
	if err != nil {
		t.Fatalf("%s: Decode: %v\n%s", name, err, text)
	}
	if !reflect.DeepEqual(d.Plan, p) {
		a, _ := planfile.EncodeJSON(p)
		b, _ := planfile.EncodeJSON(d.Plan)
		t.Fatalf("%s: plan → value notation → plan changed the plan:\n%s\n---\n%s\n---\n%s", name, a, b, text)
	}
	if len(d.Skipped) != 0 || len(d.Assumed) != 0 {
		t.Errorf("%s: reading gridloom's own text skipped %v and assumed %v", name, d.Skipped, d.Assumed)
	}
	if !bytes.Equal(figure(t, p), figure(t, d.Plan)) {
		t.Errorf("%s: the figure of the re-read plan differs", name)
	}
}

func TestRoundTripDemoPlans(t *testing.T) {
	plans, err := demo.All()
	if err != nil {
		t.Fatal(err)
	}
	for _, dp := range plans {
		t.Run(dp.Name, func(t *testing.T) { roundTrip(t, dp.Name, dp.Plan) })
	}
}

func TestRoundTripOtherBranches(t *testing.T) {
	for name, p := range extraPlans() {
		t.Run(name, func(t *testing.T) { roundTrip(t, name, p) })
	}
}

// MIBForPlan takes k_SSB, subCarrierSpacingCommon and L_max from the
// computed plan. campus is FR1 at 3750 MHz with 30 kHz case C blocks in
// unpaired spectrum, so L_max = 8 (TS 38.213 4.1, above 1.88 GHz); its
// common spacing defaults to the block's, 30 kHz, scs30or120 in FR1; its
// block is placed by GSCN 8016, which gives k_SSB 16 (worked by hand in
// TestGSCNBlockByHand). stadium is FR2-1 with 120 kHz case D blocks,
// L_max = 64, and the default common spacing of 120 kHz, scs30or120; GSCN
// 22447 puts SS_REF at 24250.08 + 191·17.28 = 27550.56 MHz, point A is at
// 27500.04 − 264·12·60 kHz / 2 = 27405.00 MHz, so the block's subcarrier 0
// is 145.56 − 120·120 kHz = 131.16 MHz above point A: offsetToPointA
// 2·⌊131.16 / 1.44⌋ = 182 RBs of 60 kHz (131.04 MHz) and k_SSB
// 0.12 MHz / 120 kHz = 1.
func TestMIBForPlan(t *testing.T) {
	for name, want := range map[string]struct {
		lmax   int
		fr     coreset0.FR
		common coreset0.SubCarrierSpacingCommon
		kSSB   int
	}{"campus": {8, coreset0.FR1, coreset0.SCS30or120, 16}, "stadium": {64, coreset0.FR2, coreset0.SCS30or120, 1}} {
		p, err := demo.Load(name)
		if err != nil {
			t.Fatal(err)
		}
		m, timing, err := rrc.MIBForPlan(grid.Compute(p))
		if err != nil {
			t.Fatal(err)
		}
		if timing.LMax != want.lmax || timing.FR != want.fr || m.SubCarrierSpacingCommon != want.common || m.KSSB != want.kSSB {
			t.Errorf("%s: %+v %+v, want L_max %d, %v, %v, k_SSB %d", name, m, timing, want.lmax, want.fr, want.common, want.kSSB)
		}
		if _, err := rrc.EncodeMIB(m, timing); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
	port, _ := demo.Load("port")
	if _, _, err := rrc.MIBForPlan(grid.Compute(port)); err == nil {
		t.Error("a plan without SS/PBCH blocks gave a MIB")
	}
}
