package web

// criterionLabel names a criterion for a column header: the numerology
// fit's four rules and the timing advice's three, which the advice table
// shows beside the fit's.
func criterionLabel(name string) string {
	switch name {
	case "cp-vs-delay-spread":
		return "σ / CP"
	case "scs-vs-coherence-bandwidth":
		return "SCS / B_c"
	case "doppler-vs-scs":
		return "f_d / SCS"
	case "slot-vs-coherence-time":
		return "slot / T_c"
	case "latency-target":
		return "latency / target"
	case "cell-radius-vs-guard":
		return "radius / guard's"
	case "cell-radius-vs-timing-advance":
		return "radius / TA's"
	}
	return name
}
