package runtime

import (
	"context"
	"errors"
	"testing"
	"time"
)

// FuzzExecute runs arbitrary text as a cell: it must return a value or an
// *Error, never panic, and leave the session usable. Its seed corpus is in
// testdata/fuzz/FuzzExecute and replays in every test run.
func FuzzExecute(f *testing.F) {
	for _, s := range []string{
		"x = 20 ms\nx in us", "[1, 2, 3] pA * 2", "formula f(x; a) = a * x\nf(2, a = 3 mV)",
		"span(0, 1, n = 5)[-1]", "(a = 1, b = 2 ms).b", "if 1 < 2 then 1 mV else 2 mV",
		"1 / 0", "exp(1000)", "5 mVV", "sqrt(-1 mV^2)", "v = [1,2] mV\nv[v > 1 mV]",
	} {
		f.Add(s)
	}
	reg := NewRegistry()
	f.Fuzz(func(t *testing.T, src string) {
		if len(src) > 4096 {
			return
		}
		s := NewSession(reg)
		ctx, cancel := context.WithTimeout(context.Background(), 2*time.Second)
		defer cancel()
		res, err := s.Execute(ctx, "fuzz", src, nil)
		if err != nil {
			var re *Error
			if !errors.As(err, &re) {
				t.Fatalf("error of type %T: %v", err, err)
			}
			if re.Kind == KindInternal {
				t.Fatalf("internal error: %v", err)
			}
			_ = re.Format()
			return
		}
		if res.Value != nil {
			_ = res.Value.String()
			if _, err := Show(res.Value); err != nil {
				t.Fatalf("Show: %v", err)
			}
		}
		s.Complete(src, len([]rune(src))/2)
		s.Inspect(src, len([]rune(src))/2)
	})
}
