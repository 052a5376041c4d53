// Package demo holds the demo plans, invented scenarios that the web app
// offers and opens with and that the tests and the README use. They live in
// a product package rather than under testdata so that go vet and go test
// ./... see the code that embeds them.
package demo

import (
	"embed"
	"fmt"
	"io/fs"
	"slices"
	"strings"

	"gridloom/grid"
	"gridloom/grid/planfile"
)

//go:embed *.yaml
var files embed.FS

// FS holds the demo plan files at its root (campus.yaml, port.yaml,
// stadium.yaml), for callers that want the bytes as written.
var FS fs.FS = files

// Default is the name of the plan the app opens with.
const Default = "campus"

// Plan is one decoded demo plan and its name, the file name without .yaml.
type Plan struct {
	Name string
	Plan grid.Plan
}

// Names lists the demo plans' names in alphabetical order.
func Names() []string {
	paths, _ := fs.Glob(files, "*.yaml") // the pattern is valid: no error
	names := make([]string, len(paths))
	for i, p := range paths {
		names[i] = strings.TrimSuffix(p, ".yaml")
	}
	slices.Sort(names)
	return names
}

// File returns the YAML of the demo plan of that name.
func File(name string) ([]byte, error) {
	if !slices.Contains(Names(), name) {
		return nil, fmt.Errorf("There is no demo plan %q; use %s.", name, grid.JoinOr(Names()))
	}
	return fs.ReadFile(files, name+".yaml")
}

// Load decodes the demo plan of that name.
func Load(name string) (grid.Plan, error) {
	b, err := File(name)
	if err != nil {
		return grid.Plan{}, err
	}
	p, err := planfile.DecodeYAML(b)
	if err != nil {
		return grid.Plan{}, fmt.Errorf("demo plan %s: %w", name, err)
	}
	return p, nil
}

// All decodes every demo plan, in the order of Names.
func All() ([]Plan, error) {
	var out []Plan
	for _, n := range Names() {
		p, err := Load(n)
		if err != nil {
			return nil, err
		}
		out = append(out, Plan{Name: n, Plan: p})
	}
	return out, nil
}
