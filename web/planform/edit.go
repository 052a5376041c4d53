package planform

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"gridloom/grid"
)

// Edits change the list of partitions, or empty an optional block. They
// work on the Form, not the plan, so every other value stays as typed,
// including ones that do not parse. The op key names one: "add"; "del.I",
// "dup.I", "up.I" or "down.I" for partition I; "clear.tdd", "clear.ssb",
// "clear.env", "clear.init" or "clear.prach".

// OpError is an edit that cannot be made; its text is a whole sentence for
// the user, shown beside the partitions.
type OpError struct{ Msg string }

// Error returns the sentence.
func (e *OpError) Error() string { return e.Msg }

func opErrorf(format string, args ...any) error { return &OpError{Msg: fmt.Sprintf(format, args...)} }

// ApplyOp performs op on f. res is the result of f's plan, which "add" uses
// to place the new partition in free spectrum. It returns the id of the
// control to focus next, or an *OpError naming the allowed ops.
func ApplyOp(f Form, op string, res grid.Result) (Form, string, error) {
	verb, num, hasIndex := strings.Cut(op, ".")
	g := f.Clone()
	if verb == "add" && !hasIndex {
		if len(g.Parts) >= grid.MaxPartitions {
			return f, "", opErrorf("A plan holds at most %d partitions; remove one before adding another.", grid.MaxPartitions)
		}
		g.Parts = append(g.Parts, newPartition(g, res))
		return g, PartControlID(len(g.Parts)-1, "name"), nil
	}
	if verb == "clear" {
		switch num {
		case "tdd":
			g.TDD = TDDForm{}
			return g, KeyID("tdd.ref"), nil
		case "ssb":
			g.SSB = SSBForm{}
			return g, KeyID("ssb.scs"), nil
		case "env":
			g.Env = EnvForm{}
			return g, KeyID("env.profile"), nil
		case "init":
			g.Init = InitForm{}
			return g, KeyID("ia.coreset"), nil
		case "prach":
			g.PRACH = PRACHForm{}
			return g, KeyID("prach.idx"), nil
		}
	}
	i, ok := Index(num)
	if !hasIndex || !ok || i >= len(g.Parts) {
		return f, "", opErrorf("%q is not an edit of this plan; use add, or del, dup, up or down with a partition number from 0 to %d.", op, len(g.Parts)-1)
	}
	switch verb {
	case "del":
		g.Parts = slices.Delete(g.Parts, i, i+1)
		switch {
		case len(g.Parts) == 0:
			return g, IDAdd, nil
		case i < len(g.Parts):
			return g, PartControlID(i, "name"), nil
		}
		return g, PartControlID(len(g.Parts)-1, "name"), nil
	case "dup":
		if len(g.Parts) >= grid.MaxPartitions {
			return f, "", opErrorf("A plan holds at most %d partitions; remove one before duplicating another.", grid.MaxPartitions)
		}
		c := g.Parts[i]
		c.Name = uniqueName(g, c.Name+"-copy")
		g.Parts = slices.Insert(g.Parts, i+1, c)
		return g, PartControlID(i+1, "name"), nil
	case "up":
		if i > 0 {
			g.Parts[i-1], g.Parts[i] = g.Parts[i], g.Parts[i-1]
			i--
		}
		return g, ButtonID("up", i), nil
	case "down":
		if i+1 < len(g.Parts) {
			g.Parts[i], g.Parts[i+1] = g.Parts[i+1], g.Parts[i]
			i++
		}
		return g, ButtonID("down", i), nil
	}
	return f, "", opErrorf("%q is not an edit; use add, del, dup, up, down or clear.", op)
}

// uniqueName returns base, or base with the first free "-2", "-3" … suffix,
// cut to fit grid.MaxNameLen.
func uniqueName(f Form, base string) string {
	taken := func(n string) bool {
		return slices.ContainsFunc(f.Parts, func(p PartForm) bool { return p.Name == n })
	}
	for k := 1; ; k++ {
		suffix := ""
		if k > 1 {
			suffix = "-" + strconv.Itoa(k)
		}
		name := Truncate(base, grid.MaxNameLen-utf8.RuneCountInString(suffix)) + suffix
		if !taken(name) {
			return name
		}
	}
}

// newPartition proposes the partition that "add" appends: the settings of
// the last partition, on the longest run of free CRBs of its spacing's
// carrier, kept a PRB of the wider spacing away from partitions of other
// spacings (the numerology gap). With no free CRB it gets one CRB above the
// highest partition, and the findings say why that does not fit.
func newPartition(f Form, res grid.Result) PartForm {
	np := PartForm{Name: uniqueName(f, fmt.Sprintf("part-%d", len(f.Parts)+1))}
	if n := len(f.Parts); n > 0 {
		last := f.Parts[n-1]
		np.SCS, np.CP, np.Dir, np.Layers, np.Mod = last.SCS, last.CP, last.Dir, last.Layers, last.Mod
	} else {
		rng := res.Channel.Range
		for _, scs := range rng.DataSCS() {
			if _, ok := rng.NRB(scs, res.Channel.BandwidthMHz); ok {
				np.SCS = strconv.Itoa(scs)
				break
			}
		}
		np.Dir, np.Layers, np.Mod = grid.DefaultDirection, "1", grid.DefaultModulation
	}
	scs, err := strconv.Atoi(strings.TrimSpace(np.SCS))
	if err != nil {
		return np
	}
	start, size, ok := res.FreeRun(scs)
	if !ok {
		// No carrier of this spacing yet: take the whole of N_RB and let
		// gridloom choose the offset.
		if nrb, ok := res.Channel.Range.NRB(scs, res.Channel.BandwidthMHz); ok {
			np.Size = strconv.Itoa(nrb)
		}
		return np
	}
	np.Start = strconv.Itoa(start)
	np.Size = strconv.Itoa(size)
	return np
}

// fill writes the placement of each partition given only by
// locationAndBandwidth into its start and size, as the field promises, once
// the plan places it without an error on that field. The RIV stays visible
// as the field's placeholder.
func fill(f Form, res grid.Result) Form {
	g := f
	changed := false
	for i, p := range f.Parts {
		if strings.TrimSpace(p.RIV) == "" || strings.TrimSpace(p.Start) != "" || strings.TrimSpace(p.Size) != "" {
			continue
		}
		j := slices.IndexFunc(res.Partitions, func(l grid.Lattice) bool { return l.Index == i })
		if j < 0 || hasError(res, fmt.Sprintf("partitions[%d].locationAndBandwidth", i)) {
			continue
		}
		if !changed {
			g = f.Clone()
			changed = true
		}
		l := res.Partitions[j]
		g.Parts[i].Start, g.Parts[i].Size, g.Parts[i].RIV = strconv.Itoa(l.StartCRB), strconv.Itoa(l.SizePRB), ""
	}
	return g
}

func hasError(res grid.Result, field string) bool {
	return slices.ContainsFunc(res.Findings, func(f grid.Finding) bool { return f.Severity == grid.Error && f.Field == field })
}
