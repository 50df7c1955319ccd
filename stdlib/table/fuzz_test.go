package table

import (
	"bytes"
	"testing"
)

// FuzzReadCSV checks that ReadCSV never panics and that whatever it accepts
// survives a write and a second read unchanged. The checked-in corpus lives in
// testdata/fuzz/FuzzReadCSV; run longer with
//
//	go test -run XXX -fuzz FuzzReadCSV -fuzztime 30s ./stdlib/table
func FuzzReadCSV(f *testing.F) {
	f.Add(sample)
	f.Add("a,b\n1,2\n")
	f.Add("x (mV)\n\n\"\"\nNA\n")
	f.Add("# c\nlabel\n#x\n\"#y\"\n")
	f.Fuzz(func(t *testing.T, in string) {
		tab, err := ReadCSV(bytes.NewReader([]byte(in)))
		if err != nil {
			return
		}
		var buf bytes.Buffer
		if err := tab.WriteCSV(&buf); err != nil {
			return // e.g. a unit that cannot be written back; reported as an error
		}
		back, err := ReadCSV(&buf)
		if err != nil {
			t.Fatalf("re-read failed: %v\ninput %q\nwritten %q", err, in, buf.String())
		}
		if d := equalTables(tab, back); d != "" {
			t.Fatalf("round trip: %s\ninput %q\nwritten %q", d, in, buf.String())
		}
	})
}
