package table_test

import (
	"fmt"
	"os"
	"strings"

	"github.com/loligo-lab/loligo/stdlib/table"
)

// Reading a small CSV table of invented demo data.
func ExampleReadCSV() {
	in := `# invented demo data: an f–I curve, not a recording
current (pA),rate [Hz],cell
0,0,a
50,NA,a
100,12.5,b
`
	t, err := table.ReadCSV(strings.NewReader(in))
	if err != nil {
		fmt.Println(err)
		return
	}
	rate, unit, _ := t.Floats("rate")
	fmt.Println(t.Len(), t.Names(), rate, unit, t.Comments[0])
	_, err = t.Column("rat")
	fmt.Println(err)
	// Output:
	// 3 [current rate cell] [0 NaN 12.5] Hz invented demo data: an f–I curve, not a recording
	// table: no column "rat"; did you mean "rate"?
}

// Building, filtering and writing a table.
func ExampleTable_WriteCSV() {
	t := table.New()
	t.Comments = []string{"invented demo data"}
	_ = t.AddFloats("time", "s", []float64{0, 0.1, 0.2})
	_ = t.AddFloats("v", "mV", []float64{-65, -40, 20})
	f, _ := t.Filter([]bool{false, true, true})
	_ = f.WriteCSV(os.Stdout)
	// Output:
	// # invented demo data
	// time (s),v (mV)
	// 0.1,-40
	// 0.2,20
}
