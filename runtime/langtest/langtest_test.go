package langtest

import (
	"testing"

	"github.com/loligo-lab/loligo/runtime"
)

// TestRunnerCatchesMismatches: wrong expectations must be reported, so the
// language tests cannot pass vacuously; right ones must not.
func TestRunnerCatchesMismatches(t *testing.T) {
	text := "-- wrong value\n1 ms\n=> 2 ms\n-- wrong error\n1\n!! nope\n-- still bound\nx = 1\n?? x\n" +
		"-- wrong kind\n1 ms\n## image/svg+xml\n-- right\n2 ms\n=> 2 ms\n-- right error\n1 mV + 1 ms\n!! 1:6: cannot add\n"
	chunks := split(text)
	if len(chunks) != 6 {
		t.Fatalf("split found %d chunks, want 6", len(chunks))
	}
	s := runtime.NewSession(runtime.NewRegistry())
	for i, ch := range chunks {
		got := ch.failures(s)
		if wantFail := i < 4; (len(got) > 0) != wantFail {
			t.Errorf("chunk %q: failures %q, want failing = %v", ch.name, got, wantFail)
		}
	}
}
