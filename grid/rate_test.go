package grid

import (
	"math"
	"testing"
)

// TS 38.306 4.1.2 worked example, widely quoted: one 100 MHz FR1 carrier
// at 30 kHz (273 PRBs), 4 layers, 256QAM, downlink → about 2337 Mbps.
func TestPeakRateWorkedExample(t *testing.T) {
	got := PeakMbps(FR1, DL, Numerology{Mu: 1}, 273, 4, 8)
	if math.Abs(got-2337) > 1 {
		t.Errorf("PeakMbps = %.1f, want ≈ 2337", got)
	}
}

// The same formula worked by hand for other cases: the overheads of
// TS 38.306 4.1.2 (0.14 FR1 DL, 0.18 FR2 DL, 0.08 FR1 UL, 0.10 FR2 UL).
func TestPeakRateByHand(t *testing.T) {
	for _, c := range []struct {
		rng         Range
		dir         Direction
		mu, prb     int
		layers, qm  int
		want        float64
		description string
	}{
		// 2·6·(948/1024)·(264·12·14·8000)·0.82·1e−6
		{FR2_1, DL, 3, 264, 2, 6, 12 * 948.0 / 1024 * 264 * 12 * 112000 * 0.82 * 1e-6, "400 MHz at 120 kHz, 2 layers 64QAM DL"},
		// 1·4·(948/1024)·(51·12·28000)·0.92·1e−6 = 3.703125·17136000·0.92·1e−6 = 58.38 Mbps
		{FR1, UL, 1, 51, 1, 4, 58.38, "20 MHz at 30 kHz, 1 layer 16QAM UL"},
		{FR2_2, UL, 6, 148, 1, 2, 2 * 948.0 / 1024 * 148 * 12 * 896000 * 0.90 * 1e-6, "2000 MHz at 960 kHz, 1 layer QPSK UL"},
	} {
		got := PeakMbps(c.rng, c.dir, Numerology{Mu: c.mu}, c.prb, c.layers, c.qm)
		if math.Abs(got-c.want) > 0.01 {
			t.Errorf("%s: PeakMbps = %.3f, want %.3f", c.description, got, c.want)
		}
	}
}

func TestModulationBits(t *testing.T) {
	// Q_m of TS 38.211 7.3.1.2 / TS 38.214 Table 5.1.3.1-1..-4.
	for name, want := range map[string]int{"QPSK": 2, "16QAM": 4, "64QAM": 6, "256QAM": 8, "1024QAM": 10} {
		if got, ok := ModulationBits(name); !ok || got != want {
			t.Errorf("ModulationBits(%q) = %d, %v; want %d", name, got, ok, want)
		}
	}
	if _, ok := ModulationBits("8PSK"); ok {
		t.Error("ModulationBits(8PSK) accepted; want refused")
	}
}
