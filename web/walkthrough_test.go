package web

import (
	"fmt"
	"strings"
	"testing"

	"gridloom/grid"
)

func computeFile(t *testing.T, path string) grid.Result {
	t.Helper()
	return grid.Compute(loadPlanFile(t, path))
}

// The walkthrough is made from the plan's numbers: each step says what the
// engine computed, so a changed plan changes the narration.
func TestWalkthroughCampus(t *testing.T) {
	res := computeFile(t, "../grid/demo/campus.yaml")
	steps := Walkthrough(res)
	var keys []string
	for _, s := range steps {
		keys = append(keys, s.Key)
		if len(s.Narration) < 1 || len(s.Narration) > 4 {
			t.Errorf("step %s has %d sentences", s.Key, len(s.Narration))
		}
	}
	if got, want := strings.Join(keys, " "), "channel grids part-0 part-1 part-2 align tdd timing switch ssb band findings"; got != want {
		t.Errorf("steps %q, want %q", got, want)
	}
	say := func(key string) string {
		for _, s := range steps {
			if s.Key == key {
				return strings.Join(s.Narration, " ")
			}
		}
		return ""
	}
	for key, want := range map[string][]string{
		// TS 38.101-1 Table 5.3.3-1: 552.5 kHz at 15 kHz and 905 kHz at 30 kHz in 40 MHz.
		"channel": {"40 MHz of FR1", "3750.000 MHz (NR-ARFCN 650000)", "552.5 kHz", "905 kHz"},
		"grids":   {"3730.560 MHz", "30 kHz starts at CRB 1, chosen by gridloom", "half a subcarrier"},
		// 30 kHz: 33.33 µs useful, 2.34 µs CP, 2.86 µs at each half millisecond (TS 38.211 5.3.1).
		"part-1": {"30 kHz (μ = 1", "33.33 µs", "2.34 µs", "2.86 µs", "CRBs 26 to 75", "locationAndBandwidth 13500", "256QAM on 2 layers"},
		"align":  {"7 symbols of 15 kHz", "14 symbols of 30 kHz", "10 times in the 5 ms"},
		"tdd":    {"DDDSU", "every 5 ms on 15 kHz slots"},
		"ssb":    {"Case C at 30 kHz has 8 candidate", "4 symbols by 240 subcarriers"},
		// Worked by hand, capability 1 with dmrs pos2 (TS 38.214 5.3, 6.4): at 30 kHz
		// T_proc,1 = N1 13 · (2048+144)·64·2^-1 Tc = 911872 Tc = 463.80 µs and
		// T_proc,2 = (N2 12 + d2,1 1) · 70144 Tc = 463.80 µs; at 15 kHz 13 · 140288 Tc
		// = 927.60 µs and 11 · 140288 Tc = 784.90 µs. The guard is the special
		// slot's 2 flexible 15 kHz symbols, 2 · 140288 Tc = 142.71 µs; less
		// N_TA,offset 25600 Tc and N_Rx-Tx 25600 Tc it leaves 229376 Tc = 116.67 µs,
		// c·t/2 = 17.49 km (TS 38.133 Table 7.1.2-2, TS 38.211 Table 4.3.2-3).
		"timing": {"At 30 kHz (video) the UE needs T_proc,1 = 463.80 µs", "T_proc,2 = 463.80 µs", "At 15 kHz (sensors) the UE needs T_proc,1 = 927.60 µs", "T_proc,2 = 784.90 µs", "guard is 142.71 µs", "17.49 km", "air-interface part only"},
		// TS 38.133 Table 8.6.2-1: μ0 1 / 3 slots of 1 ms, μ1 2 / 5 slots of 0.5 ms;
		// the larger of the two: 1 ms for type 1, 3 ms for type 2. RRC: 10 ms of
		// RRC processing + 6 ms (8.6.3).
		"switch": {"from sensors (15 kHz) to video (30 kHz)", "1000.00 µs if it reports delay type 1 and 3000.00 µs if type 2", "16000.00 µs"},
	} {
		got := say(key)
		for _, w := range want {
			if !strings.Contains(got, w) {
				t.Errorf("step %s does not say %q:\n%s", key, w, got)
			}
		}
	}
}

func TestWalkthroughFollowsThePlan(t *testing.T) {
	res := computeFile(t, "../grid/demo/port.yaml")
	steps := Walkthrough(res)
	for _, s := range steps {
		if s.Key == "tdd" || s.Key == "ssb" {
			t.Errorf("the port plan has no %s, but the walkthrough has a step for it", s.Key)
		}
	}
	text := fmt.Sprint(steps)
	for _, want := range []string{"extended CP", "4.17 µs", "100 MHz of FR1"} {
		if !strings.Contains(text, want) {
			t.Errorf("port walkthrough lacks %q", want)
		}
	}
	// A broken plan's findings step names its errors and highlights the partition.
	res = computeFile(t, "../testdata/broken/overlap.yaml")
	last := Walkthrough(res)[len(Walkthrough(res))-1]
	if !strings.Contains(strings.Join(last.Narration, " "), "1 error") || len(last.Highlight) == 0 {
		t.Errorf("findings step %+v", last)
	}
}

// TestWalkthroughInitialAccess: the campus plan with initial access has a
// step for CORESET#0 and its occasions, from the plan's numbers:
// pdcch-ConfigSIB1 = 2·16 + 0 = 32 = 00100000; Table 13-4 row 2 is 24 RBs
// and 2 symbols (TS 38.213 13).
func TestWalkthroughInitialAccess(t *testing.T) {
	res := computeFile(t, "../testdata/initial/campus.yaml")
	for _, s := range Walkthrough(res) {
		if s.Key != "initial" {
			continue
		}
		got := strings.Join(s.Narration, " ")
		for _, w := range []string{"pdcch-ConfigSIB1 00100000 picks row 2 of Table 13-4", "24 RBs of 30 kHz and 2 symbols", "CRBs 26–49", "Row 0 of Table 13-11"} {
			if !strings.Contains(got, w) {
				t.Errorf("the initial step does not say %q:\n%s", w, got)
			}
		}
		return
	}
	t.Error("the campus plan with initial access has no initial step")
}
