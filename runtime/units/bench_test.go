package units

import "testing"

var sinkUnit Unit
var sinkString string
var sinkBytes []byte

func BenchmarkParse(b *testing.B) {
	for _, text := range []string{"mV", "uA/cm^2", "kg*m^2/s^3/A"} {
		b.Run(text, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				u, err := Parse(text)
				if err != nil {
					b.Fatal(err)
				}
				sinkUnit = u
			}
		})
	}
}

func BenchmarkFormat(b *testing.B) {
	b.Run("Format", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkString = Format(-0.0655, Voltage)
		}
	})
	b.Run("AppendFormat", func(b *testing.B) {
		b.ReportAllocs()
		buf := make([]byte, 0, 64)
		for b.Loop() {
			sinkBytes = AppendFormat(buf[:0], 1.5e-9, Current)
		}
	})
	b.Run("FormatIn", func(b *testing.B) {
		b.ReportAllocs()
		mV := MustParse("mV")
		for b.Loop() {
			sinkString = FormatIn(-0.065, mV)
		}
	})
}

func BenchmarkChoose(b *testing.B) {
	v := make([]float64, 10000)
	for i := range v {
		v[i] = -0.065 + 1e-6*float64(i%977) // invented membrane-potential-like ramp
	}
	b.ReportAllocs()
	for b.Loop() {
		sinkUnit = Choose(v, Voltage)
	}
}
