package timing

import (
	"math"
	"strings"
	"testing"
)

// Two guard symbols at 30 kHz, FR1 without LTE-NR coexistence:
// T_GP = 2·(2048 + 144)·64/2 = 140 288 Tc (71.35 µs); minus N_TA,offset =
// 25 600 Tc (TS 38.133 Table 7.1.2-2) leaves 114 688 Tc = 7/120 000 s
// (58.33 µs); r = c·T/2 = 299 792 458·7/240 000 = 8 743.95 m.
func TestMaxCellRadiusTwoGuardSymbols30kHz(t *testing.T) {
	gp := GuardTc(1, 2)
	if gp != 140288 {
		t.Fatalf("guard = %v, want 140288 Tc", gp)
	}
	off, err := NTAOffset(FR1NoCoexistence)
	if err != nil || off != 25600 {
		t.Fatalf("N_TA,offset = %v, %v; want 25600", off, err)
	}
	r := MaxCellRadius(gp, off, 0)
	if want := 299792458.0 * 7 / 240000; math.Abs(r-want) > 1e-6 || math.Abs(r-8743.9467) > 1e-3 {
		t.Errorf("radius %.4f m, want %.4f", r, want)
	}
	// A UE that is not full duplex also needs N_Rx-Tx = 25 600 Tc (TS 38.211
	// Table 4.3.2-3): 140 288 − 2·25 600 = 89 088 Tc = 29/640 000 s
	// (45.31 µs), r = 299 792 458·29/1 280 000 = 6 792.17 m.
	r = MaxCellRadius(gp, off, RxTxTransition(false))
	if want := 299792458.0 * 29 / 1280000; math.Abs(r-want) > 1e-6 || math.Abs(r-6792.1729) > 1e-3 {
		t.Errorf("radius with N_Rx-Tx %.4f m, want %.4f", r, want)
	}
	// The same guard measured in the DDDSU pattern (symbols 10–11 of the
	// special slot, neither the first of a half subframe).
	g, n, err := GuardOfPattern(dddsu)
	if err != nil || g != gp || n != 2 {
		t.Errorf("GuardOfPattern = %v over %d symbols, %v; want 140288 Tc over 2", g, n, err)
	}
	// A switching time of 10 µs (19 661 Tc, rounded) takes c·10 µs/2 ≈ 1.5 km off.
	sw := FromMicros(10)
	if sw != 19661 {
		t.Errorf("10 µs = %d Tc, want 19661 (19 660.8 rounded)", sw)
	}
	r = MaxCellRadius(gp, off, 0)
	if r2 := MaxCellRadius(gp, off, sw); math.Abs(r-r2-299792458.0*float64(sw)/1966080000/2) > 1e-6 {
		t.Errorf("radius with switching %.2f m, want %.2f less than %.2f", r2, 299792458.0*float64(sw)/1966080000/2, r)
	}
	// With the LTE-NR TDD coexistence offset (39 936 Tc) one symbol at
	// 120 kHz (17 536 Tc) is too short: zero.
	off, _ = NTAOffset(FR1TDDWithLTE)
	if r := MaxCellRadius(GuardTc(3, 1), off, 0); r != 0 {
		t.Errorf("radius %v, want 0", r)
	}
}

// A guard holding the first symbol of a half subframe is 16κ longer.
func TestGuardOfPatternHalfSubframeStart(t *testing.T) {
	// 15 kHz, guard on symbols 6–7 of slot 1: symbol 7 starts the second
	// half subframe, so 2·140 288 + 1024.
	p := Pattern{Mu: 0, Dir: []byte(strings.Repeat("D", 14) + "DDDDDDFFUUUUUU")}
	g, n, err := GuardOfPattern(p)
	if err != nil || n != 2 || g != 2*140288+1024 {
		t.Errorf("GuardOfPattern = %v over %d, %v; want %d over 2", g, n, err, 2*140288+1024)
	}
	if _, _, err := GuardOfPattern(Pattern{Mu: 0}); err == nil {
		t.Error("FDD has no guard; want an error")
	}
}

// TS 38.213 4.2: N_TA = T_A·16·64/2^μ for T_A up to 3846. At 15 kHz the
// largest is 3846·1024 = 3 938 304 Tc = 3846/1 920 000 s (2.003 ms), a
// radius of c·3846/3 840 000 = 300 261.7 m; at 120 kHz an eighth.
func TestTimingAdvanceRange(t *testing.T) {
	n, r, err := TimingAdvanceRange(0)
	if err != nil || n != 3938304 {
		t.Fatalf("N_TA max at μ=0 = %v, %v; want 3938304", n, err)
	}
	if want := 299792458.0 * 3846 / 3840000; math.Abs(r-want) > 1e-6 {
		t.Errorf("radius %.3f m, want %.3f", r, want)
	}
	n3, r3, _ := TimingAdvanceRange(3)
	if n3 != 3938304/8 || math.Abs(r3-r/8) > 1e-6 {
		t.Errorf("μ=3: %v, %.1f m; want %d, %.1f", n3, r3, 3938304/8, r/8)
	}
	if _, err := NTAFromRAR(1, 3847); err == nil {
		t.Error("T_A = 3847 is beyond the 12-bit range of the RAR; want an error")
	}
}

// TS 38.133 Table 8.6.2-1 and 8.6.3, worked by hand:
//   - 30 → 30 kHz, type 1: 2 slots of 0.5 ms = 1 ms, 2 slots.
//   - 30 → 120 kHz, type 1: before 2·0.5 = 1 ms, after 6·0.125 = 0.75 ms;
//     the larger, 1 ms, is 8 slots of 120 kHz.
//   - 120 → 15 kHz, type 2: 18·0.125 = 2.25 ms against 3·1 = 3 ms: 3 slots.
//   - RRC with 10 ms of processing: 16 ms, 32 slots of 30 kHz.
func TestBWPSwitchDelay(t *testing.T) {
	cases := []struct {
		from, to int
		typ      SwitchType
		want     BWPSwitch
	}{
		{1, 1, SwitchType1, BWPSwitch{TcPerMilli, 2}},
		{1, 3, SwitchType1, BWPSwitch{TcPerMilli, 8}},
		{3, 0, SwitchType2, BWPSwitch{3 * TcPerMilli, 3}},
		{2, 2, SwitchType2, BWPSwitch{9 * TcPerMilli / 4, 9}},
	}
	for _, c := range cases {
		got, err := BWPSwitchDelay(c.from, c.to, c.typ)
		if err != nil || got != c.want {
			t.Errorf("BWPSwitchDelay(%d, %d, type %d) = %+v, %v; want %+v", c.from, c.to, c.typ, got, err, c.want)
		}
	}
	if _, err := BWPSwitchDelay(5, 3, SwitchType1); err == nil {
		t.Error("μ = 5 is not carried; want an error")
	}
	got, err := BWPSwitchDelayByRRC(1, 10*TcPerMilli)
	if err != nil || got != (BWPSwitch{16 * TcPerMilli, 32}) {
		t.Errorf("RRC switch = %+v, %v; want 16 ms, 32 slots", got, err)
	}
}
