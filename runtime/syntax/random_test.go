package syntax

import (
	"math/rand/v2"
	"testing"
)

// TestRandomMegabyte parses 1 MB of seeded random bytes: the parse must
// stop with at most MaxErrors errors and no internal error. Its speed is
// shown by the benchmark below, not timed here.
func TestRandomMegabyte(t *testing.T) {
	t.Parallel()
	src := randomBytes(1<<20, 7)
	_, err := Parse("rand", src)
	if err == nil {
		t.Fatal("1 MB of random bytes parsed without error")
	}
	checkErrors(t, src, err)
	if st, _ := Completeness(src); st != Invalid {
		t.Errorf("Completeness of random bytes = %v, want invalid", st)
	}
	// Random text from the language's own alphabet reaches deeper into
	// the parser than random bytes, which fail on the first line.
	src = randomFrom(1<<20, 11, []string{"x", " ", "1", "ms", "(", ")", "[", "]", ",", "\n", "+", "^", "=", "if", "then", "else", "in", "-", "/", ".", "\"s\""})
	_, err = Parse("rand", src)
	checkErrors(t, src, err)
}

func randomBytes(n int, seed uint64) string {
	r := rand.New(rand.NewPCG(seed, 0))
	b := make([]byte, n)
	for i := range b {
		b[i] = byte(r.Uint32())
	}
	return string(b)
}

func randomFrom(n int, seed uint64, words []string) string {
	r := rand.New(rand.NewPCG(seed, 0))
	b := make([]byte, 0, n+16)
	for len(b) < n {
		b = append(b, words[r.IntN(len(words))]...)
	}
	return string(b)
}

func BenchmarkParseRandomMegabyte(b *testing.B) {
	src := randomFrom(1<<20, 11, []string{"x", " ", "1", "ms", "(", ")", ",", "\n", "+", "="})
	b.ReportAllocs()
	for b.Loop() {
		Parse("rand", src)
	}
}
