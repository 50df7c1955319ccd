package main

import (
	"go/parser"
	"go/token"
	"io/fs"
	"path/filepath"
	"strings"
	"testing"
)

const module = "github.com/loligo-lab/loligo"

// allowed says which of our packages each package may import, as the map in
// the design notes (shared/design/ARCHITECTURE.md) draws it. A package is
// matched by the longest rule that is a prefix of its path.
var allowed = []struct {
	pkg   string
	may   []string
	exact bool // the rule is for this package only, not its sub-packages
}{
	{pkg: "display", may: nil},
	{pkg: "runtime/syntax", may: nil},
	{pkg: "runtime/units", may: nil},
	{pkg: "runtime", may: []string{"runtime/syntax", "runtime/units", "display"}},
	{pkg: "runtime/langtest", may: []string{"runtime", "display"}, exact: true}, // a test helper over the runtime
	{pkg: "kernel", may: []string{"kernel", "kernel/"}},                         // itself and its own sub-packages only
	{pkg: "stdlib", may: []string{"runtime", "runtime/", "display", "stdlib/"}, exact: true},
	{pkg: "stdlib/", may: nil},                // a domain package: nothing of ours
	{pkg: "", may: []string{""}, exact: true}, // main wires everything
}

// TestImportMap fails when a package imports one of ours that the map
// forbids (kernel knows no neurons, runtime knows no Jupyter, domain
// packages know no language).
func TestImportMap(t *testing.T) {
	imports := packageImports(t)
	if len(imports) < 3 {
		t.Fatalf("found only %d packages; is the test running at the module root?", len(imports))
	}
	for pkg, imps := range imports {
		rule := ruleFor(pkg)
		for imp := range imps {
			if !strings.HasPrefix(imp, module) {
				continue
			}
			ours := strings.TrimPrefix(strings.TrimPrefix(imp, module), "/")
			if !permitted(pkg, ours, rule) {
				t.Errorf("package %q imports %q, which the architecture map forbids (allowed: %v)", pkg, ours, rule)
			}
		}
	}
}

func ruleFor(pkg string) []string {
	best, bestLen := []string(nil), -1
	for _, r := range allowed {
		match := pkg == r.pkg || (!r.exact && strings.HasPrefix(pkg, strings.TrimSuffix(r.pkg, "/")+"/")) ||
			(strings.HasSuffix(r.pkg, "/") && strings.HasPrefix(pkg, r.pkg))
		if match && len(r.pkg) > bestLen {
			best, bestLen = r.may, len(r.pkg)
		}
	}
	return best
}

func permitted(pkg, imp string, rule []string) bool {
	if strings.HasPrefix(imp, pkg+"/") { // a package may use its own sub-packages
		return true
	}
	for _, m := range rule {
		if m == "" || imp == m || (strings.HasSuffix(m, "/") && strings.HasPrefix(imp, m)) {
			return true
		}
	}
	return false
}

// packageImports parses every non-test Go file and collects its imports by
// package directory (relative to the module root; "" is the root).
func packageImports(t *testing.T) map[string]map[string]bool {
	out := map[string]map[string]bool{}
	fset := token.NewFileSet()
	err := filepath.WalkDir(".", func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && (strings.HasPrefix(d.Name(), ".") && path != "." || d.Name() == "testdata") {
			return filepath.SkipDir
		}
		if d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		f, err := parser.ParseFile(fset, path, nil, parser.ImportsOnly)
		if err != nil {
			return err
		}
		dir := filepath.ToSlash(filepath.Dir(path))
		if dir == "." {
			dir = ""
		}
		if out[dir] == nil {
			out[dir] = map[string]bool{}
		}
		for _, imp := range f.Imports {
			out[dir][strings.Trim(imp.Path.Value, `"`)] = true
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// TestImportRules checks the rules themselves against the map's own
// statements, so that a mistake in the table cannot make the test vacuous.
func TestImportRules(t *testing.T) {
	cases := []struct {
		pkg, imp string
		ok       bool
	}{
		{"display", "runtime", false},
		{"runtime/syntax", "runtime/units", false},
		{"runtime", "kernel", false},
		{"runtime", "display", true},
		{"runtime/langtest", "runtime", true},
		{"runtime/langtest", "stdlib", false},
		{"kernel", "runtime", false},
		{"kernel", "kernel/internal/fake", true},
		{"kernel/notebook", "kernel", true},
		{"kernel/notebook", "runtime", false},
		{"stdlib/neuron", "stdlib", false},
		{"stdlib/neuron", "runtime", false},
		{"stdlib/neuron", "stdlib/stimulus", false},
		{"stdlib", "stdlib/neuron", true},
		{"stdlib", "kernel", false},
		{"", "kernel", true},
	}
	for _, c := range cases {
		if got := permitted(c.pkg, c.imp, ruleFor(c.pkg)); got != c.ok {
			t.Errorf("%q importing %q: permitted = %v, want %v", c.pkg, c.imp, got, c.ok)
		}
	}
}
