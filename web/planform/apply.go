package planform

// With returns a copy of f with the plan-level query keys of kv ("ssb.gscn",
// "ia.coreset") set to their values, so that a finder's row becomes a
// link that applies it; keys f has no field for are left out.
func (f Form) With(kv map[string]string) Form {
	g := f.Clone()
	for k, v := range kv {
		if p := g.Value(k); p != nil {
			*p = v
		}
	}
	return g
}
