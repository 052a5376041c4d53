package timing

import (
	"math"
	"strings"
	"testing"
)

// dddsu is the DDDSU pattern at 30 kHz with a special slot of 10 downlink,
// 2 guard and 2 uplink symbols (2.5 ms; a common TDD configuration).
var dddsu = Pattern{Mu: 1, Dir: []byte(strings.Repeat("D", 14*3) + "DDDDDDDDDDFFUU" + strings.Repeat("U", 14))}

// TS 38.214 5.3, Table 5.3-1: capability 1 at 30 kHz with pos0 has N1 = 10
// symbols, so T_proc,1 = 10·(2048 + 144)·64·2^−1 Tc = 10·2192·32 = 701 440 Tc,
// 701 440 / 1 966 080 000 s = 356.77 µs.
func TestTProc1Cap1At30kHzPos0(t *testing.T) {
	got, err := TProc1(1, Cap1, DMRSPos0, Adders{})
	if err != nil {
		t.Fatal(err)
	}
	if want := Tc(10 * 2192 * 32); got != want {
		t.Errorf("T_proc,1 = %v, want %v", got, want)
	}
	if us := got.Micros(); math.Abs(us-356.770833) > 1e-5 {
		t.Errorf("T_proc,1 = %.6f µs, want 356.770833", us)
	}
	// d1,1 = 3 (a 2-symbol mapping type B PDSCH with no PDCCH overlap,
	// TS 38.214 5.3) and T_ext add (10 + 3)·2192·32 + T_ext.
	got, err = TProc1(1, Cap1, DMRSPos0, Adders{D11: 3, Ext: 100})
	if err != nil || got != Tc(13*2192*32+100) {
		t.Errorf("T_proc,1 with d1,1 = 3, T_ext = 100 Tc: %v, %v; want %d Tc", got, err, 13*2192*32+100)
	}
}

// Capability 1 stops shrinking above 120 kHz: N1 scales with 2^μ from
// μ = 3 on (20, 80, 160 symbols for pos0; Table 5.3-1), so
// 20·2192·64/8 = 80·2192·64/32 = 160·2192·64/64 = 350 720 Tc (178.4 µs),
// while 60 kHz needs 17·2192·64/4 = 596 224 Tc. N2 does the same with
// d2,1 = 0: 36·2192·8 = 144·2192·2 = 288·2192 = 631 296 Tc.
func TestCap1StopsShrinkingAbove120kHz(t *testing.T) {
	for _, mu := range []int{3, 5, 6} {
		got, err := TProc1(mu, Cap1, DMRSPos0, Adders{})
		if err != nil || got != 350720 {
			t.Errorf("T_proc,1 at μ=%d: %v, %v; want 350720 Tc", mu, got, err)
		}
		got, err = TProc2(mu, Cap1, Adders{FirstPUSCHSymbolDMRSOnly: true})
		if err != nil || got != 631296 {
			t.Errorf("T_proc,2 at μ=%d: %v, %v; want 631296 Tc", mu, got, err)
		}
	}
	if got, _ := TProc1(2, Cap1, DMRSPos0, Adders{}); got != 596224 {
		t.Errorf("T_proc,1 at μ=2 = %v, want 596224 Tc", got)
	}
	if _, err := TProc1(4, Cap1, DMRSPos0, Adders{}); err == nil {
		t.Error("μ = 4 (240 kHz) has no row in Table 5.3-1, want an error")
	}
	if _, err := N1(3, Cap2, DMRSPos0); err == nil {
		t.Error("capability 2 has no μ = 3 row in Table 5.3-2, want an error")
	}
}

// TS 38.214 6.4: capability 2 at 30 kHz, N2 = 5.5, d2,1 = 1:
// (5.5 + 1)·2192·32 = 455 936 Tc; with d2,2 = 1 ms (a BWP switch) the max
// takes d2,2.
func TestTProc2(t *testing.T) {
	got, err := TProc2(1, Cap2, Adders{})
	if err != nil || got != 455936 {
		t.Errorf("T_proc,2 = %v, %v; want 455936 Tc", got, err)
	}
	got, _ = TProc2(1, Cap2, Adders{D22: TcPerMilli})
	if got != TcPerMilli {
		t.Errorf("T_proc,2 with d2,2 = 1 ms = %v, want %v", got, TcPerMilli)
	}
}

// K1 on FDD at 15 kHz, capability 1, pos0: T_proc,1 = 8·2192·64 = 1 122 304 Tc.
// A PDSCH filling slot 0 ends at 1 966 080 Tc; the ACK may start at
// 3 088 384 Tc. In slot 1, symbol l ≥ 7 starts at 1 966 080 + 983 040 +
// 1024 + (l − 7)·140 288: symbol 7 at 2 950 144 is too early, symbol 8 at
// 3 090 432 is the first. So K1 = 1, the ACK on symbol 8 of slot 1 (22).
func TestEarliestK1FDD15kHz(t *testing.T) {
	tp, _ := TProc1(0, Cap1, DMRSPos0, Adders{})
	if tp != 1122304 {
		t.Fatalf("T_proc,1 = %v, want 1122304", tp)
	}
	got, err := EarliestK1(Pattern{Mu: 0}, 0, 13, tp)
	if err != nil {
		t.Fatal(err)
	}
	if want := (AckTiming{K1: 1, Symbol: 22, Start: 3090432}); got != want {
		t.Errorf("EarliestK1 = %+v, want %+v", got, want)
	}
	// With the cell-edge advance of N_TA,offset = 25600 Tc the UE sends
	// earlier, so symbol 8 (3 090 432 − 25 600) is too early: symbol 9.
	got, _ = EarliestK1(Pattern{Mu: 0, ULAdvance: 25600}, 0, 13, tp)
	if got.K1 != 1 || got.Symbol != 23 {
		t.Errorf("EarliestK1 with the advance = %+v, want K1 1 at symbol 23", got)
	}
}

// K2 on DDDSU at 30 kHz, capability 1: T_proc,2 = (12 + 1)·2192·32 =
// 911 872 Tc. A PDCCH in symbols 0–1 of slot 0 ends at 1024 + 2·70 144 =
// 141 312 Tc; the PUSCH may start at 1 053 184 Tc (in slot 1), but the first
// uplink symbols are symbols 12–13 of slot 3. A 2-symbol PUSCH fits there
// (K2 = 3); a 14-symbol one needs slot 4 (K2 = 4).
func TestEarliestK2DDDSU(t *testing.T) {
	tp, _ := TProc2(1, Cap1, Adders{})
	if tp != 911872 {
		t.Fatalf("T_proc,2 = %v, want 911872", tp)
	}
	g, err := EarliestK2(dddsu, 0, 1, 2, tp)
	if err != nil || g.K2 != 3 || g.Symbol != 3*14+12 {
		t.Errorf("2-symbol PUSCH: %+v, %v; want K2 3 at symbol 54", g, err)
	}
	g, err = EarliestK2(dddsu, 0, 1, 14, tp)
	if err != nil || g.K2 != 4 || g.Symbol != 4*14 {
		t.Errorf("14-symbol PUSCH: %+v, %v; want K2 4 at symbol 56", g, err)
	}
}

// HARQ round trips on DDDSU at 30 kHz, capability 1 pos0 (T_proc,1 =
// 701 440 Tc), no gNB processing. Slots are 983 040 Tc, symbols 70 144 Tc
// (+1024 for symbol 0). Worked per slot:
//
//	slot 0: ends 983 040, ACK from 1 684 480 → slot 3 symbol 12 (3 791 872), K1 3
//	slot 1: ends 1 966 080 → the same symbol, K1 2
//	slot 2: ends 2 949 120 → the same symbol, K1 1
//	slot 3: PDSCH symbols 0–9 ends 3 651 584, ACK from 4 353 024: symbol 12
//	        is too early, slot 4 symbol 6 starts 3 932 160 + 1024 + 6·70 144
//	        = 4 354 048, K1 1
//
// Every retransmission waits for slot 5 (the next period's slot 0,
// 4 915 200 Tc): round trips of 5, 4, 3 and 2 slots.
func TestHARQRoundTripsDDDSU(t *testing.T) {
	tp, _ := TProc1(1, Cap1, DMRSPos0, Adders{})
	rt, err := HARQRoundTrips(dddsu, tp, 0)
	if err != nil {
		t.Fatal(err)
	}
	wantK1 := []int{3, 2, 1, 1}
	wantRTT := []Tc{5 * 983040, 4 * 983040, 3 * 983040, 2 * 983040}
	if len(rt.PerSlot) != 4 {
		t.Fatalf("%d slots with a PDSCH, want 4: %+v", len(rt.PerSlot), rt.PerSlot)
	}
	for i, r := range rt.PerSlot {
		if r.Ack.K1 != wantK1[i] || r.RTT != wantRTT[i] || r.Retx != 5 {
			t.Errorf("slot %d: K1 %d, RTT %v, retransmission in slot %d; want K1 %d, RTT %v, slot 5", r.Slot, r.Ack.K1, r.RTT, r.Retx, wantK1[i], wantRTT[i])
		}
	}
	if rt.PerSlot[3].Ack.Start != 4354048 || rt.PerSlot[3].PDSCHEnd != 9 {
		t.Errorf("special slot: ACK at %v after a PDSCH ending at symbol %d; want 4354048 Tc after symbol 9", rt.PerSlot[3].Ack.Start, rt.PerSlot[3].PDSCHEnd)
	}
	if rt.Min != 1966080 || rt.Max != 4915200 || rt.Mean != 3440640 || rt.MinSlots != 2 || rt.MaxSlots != 5 {
		t.Errorf("min %v, mean %v, max %v (%d–%d slots); want 1966080, 3440640, 4915200 (2–5 slots)", rt.Min, rt.Mean, rt.Max, rt.MinSlots, rt.MaxSlots)
	}
}

// FDD at 15 kHz with a 14-symbol slot (TR 37.910 §5.7.1 structure):
// processing N1/2 = 4 symbols of 140 288 Tc on each side (561 152 Tc),
// one opportunity per 1 ms slot (g = d = 1 966 080 Tc, P = 1 966 080):
//
//	Mean  = 2·561 152 + g·(g/2 + d)/P = 1 122 304 + 2 949 120 = 4 071 424 Tc (2.071 ms)
//	Worst = 1 122 304 + g + d = 5 054 464 Tc
//	Best  = 1 122 304 + d = 3 088 384 Tc
//
// With HARQ: the round trip on FDD (T_proc,1 = 1 122 304, gNB processing
// 561 152) puts the ACK on slot 1 symbol 8 (ends 3 230 720), ready at
// 3 791 872, retransmission in slot 2: 2 ms. With p = 0.1 the TR's
// T0 + p·T_HARQ = 4 071 424 + 393 216 = 4 464 640 Tc.
func TestLatencyFDD15kHzSlot(t *testing.T) {
	proc, err := EvaluationProcessing(0, Cap1)
	if err != nil || proc != 561152 {
		t.Fatalf("EvaluationProcessing = %v, %v; want 561152", proc, err)
	}
	tp, _ := TProc1(0, Cap1, DMRSPos0, Adders{})
	rt, err := HARQRoundTrips(Pattern{Mu: 0}, tp, proc)
	if err != nil || rt.Max != 2*TcPerMilli || rt.Min != 2*TcPerMilli {
		t.Fatalf("FDD round trip %+v, %v; want 2 ms in every slot", rt, err)
	}
	l, err := UserPlaneLatency(LatencyConfig{Pattern: Pattern{Mu: 0}, Dir: Downlink, Length: 14,
		TxProc: proc, RxProc: proc, RetxProb: 0.1, HARQRTT: rt.Max})
	if err != nil {
		t.Fatal(err)
	}
	if l.Mean != 4071424 || l.Worst != 5054464 || l.Best != 3088384 || l.WithHARQ != 4464640 || l.Opportunities != 1 {
		t.Errorf("got %+v; want mean 4071424, worst 5054464, best 3088384, with HARQ 4464640, 1 opportunity", l)
	}
}

// DDDSU at 30 kHz, slot-based, no processing (alignment and transmission
// only). Downlink: full DL slots 0, 1, 2 start at 0, 983 040, 1 966 080 in
// a 4 915 200 Tc period; gaps 2 949 120, 983 040, 983 040; d = 983 040:
//
//	Σ g(g/2 + d) = 2 949 120·(1 474 560 + 983 040) + 2·983 040·(491 520 + 983 040)
//	Mean = Σ / 4 915 200 = 2 064 384 Tc (1.05 ms);  Worst = 2 949 120 + 983 040
//
// Uplink: slot 4 only: Mean = P/2 + d = 3 440 640, Worst = P + d.
func TestLatencyDDDSU30kHz(t *testing.T) {
	dl, err := UserPlaneLatency(LatencyConfig{Pattern: dddsu, Dir: Downlink, Length: 14})
	if err != nil {
		t.Fatal(err)
	}
	sum := 2949120.0*(1474560+983040) + 2*983040.0*(491520+983040)
	if want := sum / 4915200; dl.Mean != want || want != 2064384 {
		t.Errorf("downlink mean %v, want %v (2064384)", dl.Mean, want)
	}
	if dl.Worst != 2949120+983040 || dl.Best != 983040 || dl.Opportunities != 3 {
		t.Errorf("downlink %+v; want worst 3932160, best 983040, 3 opportunities", dl)
	}
	ul, err := UserPlaneLatency(LatencyConfig{Pattern: dddsu, Dir: Uplink, Length: 14})
	if err != nil {
		t.Fatal(err)
	}
	if ul.Mean != 4915200/2+983040 || ul.Worst != 4915200+983040 || ul.Opportunities != 1 {
		t.Errorf("uplink %+v; want mean 3440640, worst 5898240, 1 opportunity", ul)
	}
	// A 2-symbol uplink mini-slot also fits symbols 12–13 of the special slot.
	ul2, _ := UserPlaneLatency(LatencyConfig{Pattern: dddsu, Dir: Uplink, Length: 2})
	if ul2.Opportunities != 1+13 {
		t.Errorf("2-symbol uplink opportunities %d, want 14 (1 in the special slot, 13 in slot 4)", ul2.Opportunities)
	}
}

// A 2-symbol mini-slot at 120 kHz on FDD. Symbols are n = 17 536 Tc, the
// first of each half subframe e = 1024 Tc longer; the lattice repeats every
// half subframe, 56 symbols = 56n + e = 983 040 Tc. A mini-slot may start at
// symbols 0–12 of each of the 4 slots: 52 starts. Gaps and durations:
//
//	slot starts (4):       g = 2n, d = 2n (+e in slot 0)  → 4·2n·3n + 2n·e
//	symbol 1 of slot 0:    g = n + e, d = 2n              → (n+e)((n+e)/2 + 2n)
//	the other 47:          g = n, d = 2n                  → 47·2.5n²
//
// With 10 symbols (175 360 Tc) of processing on each side (N1/2 for
// capability 1 at μ = 3), the worst case is 2·175 360 + 4n + e.
func TestLatencyMiniSlot120kHz(t *testing.T) {
	const n, e = 17536.0, 1024.0
	proc, _ := EvaluationProcessing(3, Cap1)
	if proc != 175360 {
		t.Fatalf("EvaluationProcessing(3) = %v, want 175360", proc)
	}
	l, err := UserPlaneLatency(LatencyConfig{Pattern: Pattern{Mu: 3}, Dir: Downlink, Length: 2, TxProc: proc, RxProc: proc})
	if err != nil {
		t.Fatal(err)
	}
	sum := 4*2*n*3*n + 2*n*e + (n+e)*((n+e)/2+2*n) + 47*2.5*n*n
	want := 2*175360 + sum/(56*n+e)
	if l.Opportunities != 52 || math.Abs(l.Mean-want) > 1e-6 {
		t.Errorf("mean %v over %d starts, want %v over 52", l.Mean, l.Opportunities, want)
	}
	if l.Worst != Tc(2*175360+4*n+e) || l.Best != Tc(2*175360+2*n) {
		t.Errorf("worst %v, best %v; want %v, %v", l.Worst, l.Best, Tc(2*175360+4*n+e), Tc(2*175360+2*n))
	}
	// About 0.21 ms, a tenth of the 15 kHz slot's 2.07 ms.
	if us := l.Mean * 1e6 / float64(TcPerSecond); us < 200 || us > 220 {
		t.Errorf("mean %.1f µs, want about 210", us)
	}
}

// Retransmissions: T0 + p·T_HARQ with one (TR 37.910), and with up to two
// p(1−p)·rtt + 2p²·rtt.
func TestExpectedRetxTime(t *testing.T) {
	if got := ExpectedRetxTime(0.1, 1, 1000); math.Abs(got-100) > 1e-9 {
		t.Errorf("one retransmission: %v, want 100", got)
	}
	if got := ExpectedRetxTime(0.1, 2, 1000); math.Abs(got-(0.1*0.9*1000+2*0.01*1000)) > 1e-9 {
		t.Errorf("two retransmissions: %v, want 110", got)
	}
}

// The least K2 on DDDSU at 30 kHz for a 14-symbol PUSCH, T_proc,2 =
// 911 872 Tc: a PDCCH in symbols 0–1 of slot s ends 141 312 Tc after the
// slot starts, so the PUSCH may start 1 053 184 Tc (1.07 slots) later.
// Slots 0, 1 and 2 reach slot 4 (K2 4, 3, 2); slot 3's PDCCH would need
// 3 932 160 + 1 053 184 − 983 040 = 4 002 304 > 3 932 160, so slot 4 is too
// early and it waits for slot 9 (K2 6). The least is 2.
func TestLeastK2DDDSU(t *testing.T) {
	tp, _ := TProc2(1, Cap1, Adders{})
	k2, err := LeastK2(dddsu, 14, tp)
	if err != nil || k2 != 2 {
		t.Errorf("LeastK2 = %d, %v; want 2", k2, err)
	}
	if _, err := LeastK2(Pattern{Mu: 1, Dir: []byte(strings.Repeat("U", 14))}, 14, tp); err == nil {
		t.Error("a pattern without downlink gave a K2")
	}
}

// The uplink round trip on DDDSU at 30 kHz, T_proc,2 = 911 872 Tc and
// 350 720 Tc (5 symbols) of gNB processing. The PUSCH of slot 4 ends at
// 2.5 ms = 4 915 200 Tc; decoded by 5 265 920. Slot 5 (4 915 200) starts
// too early, slot 6 (5 898 240) carries the grant; its PDCCH ends 141 312 Tc
// in, and the PUSCH may start 1 053 184 Tc after slot 6 starts, which only
// slot 9 (the next whole uplink slot, 8 847 360) meets. Round trip:
// 8 847 360 − 3 932 160 = 4 915 200 Tc, 2.5 ms, five slots.
func TestULHARQRoundTripsDDDSU(t *testing.T) {
	tp, _ := TProc2(1, Cap1, Adders{})
	rt, err := ULHARQRoundTrips(dddsu, tp, 350720)
	if err != nil || len(rt.PerSlot) != 1 {
		t.Fatalf("%+v, %v; want one uplink slot", rt, err)
	}
	r := rt.PerSlot[0]
	if r.Slot != 4 || r.Retx != 9 || r.Grant.K2 != 3 || r.RTT != 4915200 || rt.Max != 4915200 || rt.Min != 4915200 {
		t.Errorf("%+v; want slot 4, grant in slot 6 with K2 3, retransmission in slot 9, 4915200 Tc", rt)
	}
	if _, err := ULHARQRoundTrips(Pattern{Mu: 1, Dir: []byte(strings.Repeat("D", 14))}, tp, 0); err == nil {
		t.Error("a pattern without uplink gave a round trip")
	}
}
