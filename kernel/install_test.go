package kernel

import "testing"

// TestInstallRefusesGoRunBinary: a kernelspec must not point at the
// temporary binary of `go run`, which is deleted when it exits.
func TestInstallRefusesGoRunBinary(t *testing.T) {
	cases := map[string]bool{
		"/tmp/go-build82798428/b001/exe/loligo": true,
		"/usr/local/bin/loligo":                 false,
		"/home/a/go-build-tools/loligo":         false,
	}
	for exe, want := range cases {
		if got := inBuildCache(exe); got != want {
			t.Errorf("inBuildCache(%q) = %v, want %v", exe, got, want)
		}
	}
}
