package units_test

import (
	"fmt"

	"github.com/loligo-lab/loligo/runtime/units"
)

func ExampleParse() {
	u, err := units.Parse("uA/cm^2")
	fmt.Println(u.Symbol, u.Scale, u.Dim.Name(), err)
	_, err = units.Parse("mVV")
	fmt.Println(err)
	// Output:
	// µA/cm^2 0.01 current density <nil>
	// units: unknown unit mVV; did you mean mV?
}

func ExampleFormat() {
	fmt.Println(units.Format(0.0125, units.Time))
	fmt.Println(units.Format(1.5e-9, units.Current))
	fmt.Println(units.Format(279.45, units.Temperature))
	// Output:
	// 12.5 ms
	// 1.5 nA
	// 279.45 K
}

func ExampleFormatIn() {
	fmt.Println(units.FormatIn(-0.065, units.MustParse("mV")))
	fmt.Println(units.FormatIn(279.45, units.MustParse("degC")))
	// Output:
	// -65 mV
	// 6.3 °C
}

func ExampleChoose() {
	v := []float64{-0.070, -0.0652, 0.021} // invented membrane potentials, in V
	u := units.Choose(v, units.Voltage)
	for _, x := range v {
		fmt.Print(units.FormatNumber(u.FromSI(x)), " ")
	}
	fmt.Println(u.Symbol)
	// Output: -70 -65.2 21 mV
}
