package stdlib

import (
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/langtest"
)

// TestLanguageFiles runs testdata/*.txt (format: package langtest) with
// every builtin of the standard library.
func TestLanguageFiles(t *testing.T) {
	langtest.Run(t, "testdata/*.txt", newTestSession)
}

func newTestSession() *runtime.Session {
	reg := runtime.NewRegistry()
	Register(reg)
	return runtime.NewSession(reg)
}

// discard is an output that keeps nothing, for tests that only look at results.
type discard struct{}

func (discard) Display(display.Bundle, string, bool) {}
func (discard) Stream(string, string)                {}
