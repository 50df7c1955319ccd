package runtime

import (
	"context"
	"errors"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/loligo-lab/loligo/display"
)

// testRegistry adds builtins that misbehave on purpose.
func testRegistry() *Registry {
	r := NewRegistry()
	r.Register(
		&Builtin{Name: "boom", Doc: "Panics.", Fn: func(c *Call) (Value, error) { panic("kaboom") }},
		&Builtin{Name: "spin", Doc: "Loops until cancelled.", Fn: func(c *Call) (Value, error) {
			for c.Ctx.Err() == nil {
				time.Sleep(time.Millisecond)
			}
			return nil, c.Ctx.Err()
		}},
		&Builtin{Name: "cell_model", Doc: "A value with fields.", Params: []Param{
			{Name: "tau_m", Kind: KindNumber, Unit: "ms", Default: "20 ms"},
			{Name: "tau_ref", Kind: KindNumber, Unit: "ms", Default: "2 ms"},
		}, Fn: func(c *Call) (Value, error) {
			return &Record{Names: []string{"tau_m", "tau_ref"}, Values: []Value{c.Quantity("tau_m"), c.Quantity("tau_ref")}}, nil
		}},
	)
	return r
}

func TestPanicInBuiltinBecomesError(t *testing.T) {
	s := NewSession(testRegistry())
	_, err := s.Execute(context.Background(), "cell", "x = 1\nboom()", nil)
	var re *Error
	if !errors.As(err, &re) || re.Kind != KindInternal || re.Pos.Line != 2 {
		t.Fatalf("got %v, want an internal error at line 2", err)
	}
	if _, ok := s.Lookup("x"); ok {
		t.Error("binding from the failed cell was kept")
	}
	if _, err := s.Execute(context.Background(), "cell", "1 + 1", nil); err != nil {
		t.Errorf("session unusable after a panic: %v", err)
	}
}

func TestCancelBeforeStart(t *testing.T) {
	s := NewSession(testRegistry())
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := s.Execute(ctx, "cell", "y = 1 ms", nil)
	var re *Error
	if !errors.As(err, &re) || re.Kind != KindInterrupted {
		t.Fatalf("got %v, want Interrupted", err)
	}
	if _, ok := s.Lookup("y"); ok {
		t.Error("an interrupted cell bound y")
	}
}

func TestCancelInsideBuiltin(t *testing.T) {
	s := NewSession(testRegistry())
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() {
		_, err := s.Execute(ctx, "cell", "z = 1\nspin()", nil)
		done <- err
	}()
	time.Sleep(20 * time.Millisecond)
	start := time.Now()
	cancel()
	select {
	case err := <-done:
		var re *Error
		if !errors.As(err, &re) || re.Kind != KindInterrupted {
			t.Fatalf("got %v, want Interrupted", err)
		}
		// 100 ms is the interrupt latency the kernel promises a user.
		if d := time.Since(start); d > 100*time.Millisecond {
			t.Errorf("interrupt took %v", d)
		}
	case <-time.After(2 * time.Second):
		t.Fatal("cell did not stop after cancel")
	}
}

type recorder struct {
	bundles []display.Bundle
	text    strings.Builder
}

func (r *recorder) Display(b display.Bundle, id string, update bool) {
	r.bundles = append(r.bundles, b)
}
func (r *recorder) Stream(name, text string) { r.text.WriteString(text) }

func TestRunShowsEveryExpression(t *testing.T) {
	s := NewSession(testRegistry())
	var out recorder
	if err := s.Run(context.Background(), "script", "a = 2 ms\na\nprint(\"hi\", a)\na * 2", &out); err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, b := range out.bundles {
		got = append(got, b.PlainText())
	}
	if !slices.Equal(got, []string{"2 ms", "4 ms"}) || out.text.String() != "hi 2 ms\n" {
		t.Errorf("shown %q, printed %q", got, out.text.String())
	}
}

func TestErrorTracebackHasCaret(t *testing.T) {
	s := NewSession(testRegistry())
	_, err := s.Execute(context.Background(), "cell[4]", "a = 1 mV\nb = a + 2 ms", nil)
	var re *Error
	if !errors.As(err, &re) {
		t.Fatalf("got %v", err)
	}
	tb := re.Traceback()
	want := []string{"cell[4]:2:7: cannot add voltage (mV) to time (ms)", "    b = a + 2 ms", "          ^"}
	if !slices.Equal(tb[:3], want) {
		t.Errorf("traceback\n%q\nwant\n%q", tb, want)
	}
}

func TestComplete(t *testing.T) {
	s := NewSession(testRegistry())
	if _, err := s.Execute(context.Background(), "cell", "m = cell_model()\nmembrane = 1\nµ1 = 2", nil); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		code       string
		want       string // one match that must be offered
		start, end int
	}{
		{"me", "membrane", 0, 2},
		{"sp", "span", 0, 2},
		{"x = m.ta", "tau_m", 6, 8},
		{"cell_model(tau_", "tau_ref", 11, 15},
		{"y = 20 m", "ms", 7, 8},
		{"y = 20 ms in u", "us", 13, 14},
		{"x = 1\nlen(µ", "µ1", 10, 11},
	}
	for _, c := range cases {
		got := s.Complete(c.code, len([]rune(c.code)))
		if !slices.Contains(got.Matches, c.want) || got.Start != c.start || got.End != c.end {
			t.Errorf("Complete(%q) = %v [%d,%d), want %q in [%d,%d)", c.code, got.Matches, got.Start, got.End, c.want, c.start, c.end)
		}
	}
}

func TestInspect(t *testing.T) {
	s := NewSession(testRegistry())
	text, ok := s.Inspect("span(0, 1, n = 3)", 2)
	if !ok || !strings.Contains(text, "span(from, to, by = none, n = none)") {
		t.Errorf("Inspect span: %v %q", ok, text)
	}
	text, ok = s.Inspect("cell_model(tau_m = 3 ms, ", 24)
	if !ok || !strings.Contains(text, "tau_m: ms = 20 ms") {
		t.Errorf("Inspect inside call: %v %q", ok, text)
	}
	if _, ok := s.Inspect("   ", 1); ok {
		t.Error("Inspect of blank text found something")
	}
}

func TestIsComplete(t *testing.T) {
	s := NewSession(testRegistry())
	cases := map[string]string{"x = 1": "complete", "span(0,": "incomplete", "1 +": "incomplete", "x = )": "invalid"}
	for code, want := range cases {
		if got, _ := s.IsComplete(code); got != want {
			t.Errorf("IsComplete(%q) = %s, want %s", code, got, want)
		}
	}
}

// BenchmarkCell50 parses and evaluates a 50-line cell of arithmetic with
// units (the foundation issue's target: under 200 µs per cell).
func BenchmarkCell50(b *testing.B) {
	var src strings.Builder
	src.WriteString("C = 150 pF\ng = 7.5 nS\nE = -68 mV\n")
	for i := 0; i < 47; i++ {
		src.WriteString("x = (C / g) * 2 + 3 ms - (E - -70 mV) / (1 mV/ms) + 10 uA/cm^2 * 0 cm^2 / 1 nA * 1 ms\n")
	}
	s := NewSession(NewRegistry())
	code := src.String()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.Execute(context.Background(), "bench", code, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCell50Typical is a 50-line cell shaped like the examples' cells:
// bindings of quantities and short formulas of two to four operations.
func BenchmarkCell50Typical(b *testing.B) {
	lines := []string{
		"C = 150 pF", "g_L = 7.5 nS", "E_L = -68 mV", "V_th = -48 mV", "I = 250 pA",
		"tau_m = C / g_L", "R = 1 / g_L", "V_inf = E_L + I * R", "dV = (V_inf - V_th) in mV",
		"t99 = tau_m * log(100)",
	}
	var src strings.Builder
	for i := 0; i < 50; i++ {
		src.WriteString(lines[i%len(lines)] + "\n")
	}
	s := NewSession(NewRegistry())
	code := src.String()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.Execute(context.Background(), "bench", code, nil); err != nil {
			b.Fatal(err)
		}
	}
}
