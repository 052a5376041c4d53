package web

import (
	"io/fs"
	"net/url"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/demo"
	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// demoPlans decodes the embedded demo plans, by file name.
func demoPlans(t testing.TB) map[string]grid.Plan {
	t.Helper()
	names, err := fs.Glob(demo.FS, "*.yaml")
	if err != nil || len(names) == 0 {
		t.Fatalf("demo plans: %v, %d found", err, len(names))
	}
	out := map[string]grid.Plan{}
	for _, n := range names {
		b, err := fs.ReadFile(demo.FS, n)
		if err != nil {
			t.Fatal(err)
		}
		p, err := planfile.DecodeYAML(b)
		if err != nil {
			t.Fatalf("%s: %v", n, err)
		}
		out[n] = p
	}
	return out
}

func mustQuery(t *testing.T, q string) url.Values {
	t.Helper()
	v, err := url.ParseQuery(q)
	if err != nil {
		t.Fatalf("planform.ParseQuery(%q): %v", q, err)
	}
	return v
}

func formOf(t *testing.T, q string) planform.Form {
	t.Helper()
	f, _ := planform.ParseQuery(mustQuery(t, q))
	return f
}

func TestFileName(t *testing.T) {
	for in, want := range map[string]string{
		"Hillcrest campus 40 MHz":        "hillcrest-campus-40-mhz",
		`../../etc/passwd "x"; rm -rf /`: "etc-passwd-x-rm-rf",
		"":                               "gridloom-plan",
		"☃☃☃":                            "gridloom-plan",
		"Été 2026":                       "t-2026",
		strings.Repeat("a", 100):         strings.Repeat("a", 60),
		"CON":                            "con-plan",
		"com1":                           "com1-plan",
		"console":                        "console",
	} {
		if got := fileName(in); got != want {
			t.Errorf("fileName(%q) = %q, want %q", in, got, want)
		}
	}
}
