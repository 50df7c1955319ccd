package display

import (
	"io"
	"testing"
)

// BenchmarkSVGMillion renders a 1 M-sample trace to SVG (target ≤ 100 ms).
func BenchmarkSVGMillion(b *testing.B) {
	tm, v := demoTrace(1_000_000)
	f := &Figure{Panels: []Panel{{XLabel: "time (ms)", YLabel: "V (mV)", Series: []Series{{Kind: Line, X: tm, Y: v}}}}}
	b.ReportAllocs()
	for b.Loop() {
		if err := f.WriteSVG(io.Discard); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkTableHTML renders a 200-row table to HTML.
func BenchmarkTableHTML(b *testing.B) {
	tab := longTable(200)
	tab.Head = 200
	b.ReportAllocs()
	for b.Loop() {
		if _, err := tab.HTML(); err != nil {
			b.Fatal(err)
		}
	}
}
