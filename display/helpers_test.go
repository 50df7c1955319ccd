package display

import (
	"flag"
	"math"
	"os"
	"path/filepath"
	"testing"
)

var update = flag.Bool("update", false, "rewrite testdata/*.golden from the current output")

// near reports whether got is within abs or rel of want (either suffices);
// NaN matches only NaN. It is the one tolerance helper of these tests.
func near(got, want, abs, rel float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

// golden compares got with testdata/name, or rewrites it under -update.
func golden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update to create it)", err)
	}
	if got != string(want) {
		t.Errorf("%s differs from golden file:\n--- got ---\n%s\n--- want ---\n%s", name, got, want)
	}
}

// noFiles fails if dir holds any file (a half-written or temporary file
// left behind by a failed save).
func noFiles(t *testing.T, dir string) {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		return
	}
	for _, e := range es {
		t.Errorf("file %q left behind in %s", e.Name(), dir)
	}
}
