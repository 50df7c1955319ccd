package runtime_test

import (
	"testing"

	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/langtest"
)

// TestLanguageFiles runs testdata/*.txt (format: package langtest).
func TestLanguageFiles(t *testing.T) {
	langtest.Run(t, "testdata/*.txt", func() *runtime.Session { return runtime.NewSession(runtime.NewRegistry()) })
}
