package web

import (
	"encoding/json"
	"go/ast"
	"go/importer"
	"go/parser"
	"go/token"
	"go/types"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestFilesDoNotUseEachOther keeps the layout of DEVELOPERS.md: no two
// files of web (or of web/planform) use each other's declarations, so each
// page reads one way, handler → model → view, except a view and its own
// template. It type-checks each package from source against its
// dependencies' export data, which go list builds.
func TestFilesDoNotUseEachOther(t *testing.T) {
	if testing.Short() {
		t.Skip("type-checks the packages with go list; skipped under -short")
	}
	for _, pkg := range []string{".", "./planform"} {
		uses := fileUses(t, pkg)
		var pairs []string
		for ab := range uses {
			a, b := ab[0], ab[1]
			if a < b && uses[[2]string{b, a}] && !strings.HasSuffix(a, "_templ.go") && !strings.HasSuffix(b, "_templ.go") {
				pairs = append(pairs, a+" ↔ "+b)
			}
		}
		slices.Sort(pairs)
		if len(pairs) > 0 {
			t.Errorf("%s: files that use each other: %s", pkg, strings.Join(pairs, ", "))
		}
		t.Logf("%s: %d one-way uses between files, no pair", pkg, len(uses))
	}
}

// fileUses lists which file of the package in dir uses a package-level
// declaration, method or field declared in which other file.
func fileUses(t *testing.T, dir string) map[[2]string]bool {
	t.Helper()
	cmd := exec.Command("go", "list", "-export", "-deps", "-json", dir)
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	exports := map[string]string{}
	var self string
	var files []string
	dec := json.NewDecoder(strings.NewReader(string(out)))
	for {
		var p struct {
			ImportPath, Export, Dir string
			GoFiles                 []string
		}
		if err := dec.Decode(&p); err == io.EOF {
			break
		} else if err != nil {
			t.Fatal(err)
		}
		exports[p.ImportPath] = p.Export
		self, files = p.ImportPath, nil // the package itself comes last
		for _, f := range p.GoFiles {
			files = append(files, filepath.Join(p.Dir, f))
		}
	}
	fset := token.NewFileSet()
	var asts []*ast.File
	for _, f := range files {
		a, err := parser.ParseFile(fset, f, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		asts = append(asts, a)
	}
	imp := importer.ForCompiler(fset, "gc", func(path string) (io.ReadCloser, error) { return os.Open(exports[path]) })
	info := &types.Info{Uses: map[*ast.Ident]types.Object{}}
	pkg, err := (&types.Config{Importer: imp}).Check(self, fset, asts, info)
	if err != nil {
		t.Fatal(err)
	}
	uses := map[[2]string]bool{}
	for id, obj := range info.Uses {
		if obj.Pkg() != pkg || (obj.Parent() != nil && obj.Parent() != pkg.Scope()) {
			continue // another package's, or local to a function
		}
		a, b := filepath.Base(fset.Position(id.Pos()).Filename), filepath.Base(fset.Position(obj.Pos()).Filename)
		if a != b {
			uses[[2]string{a, b}] = true
		}
	}
	return uses
}
