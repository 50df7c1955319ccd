package activation_test

import (
	"fmt"

	"github.com/loligo-lab/loligo/stdlib/activation"
)

func ExampleLogistic() {
	f := activation.Logistic{Gain: 2}
	fmt.Printf("%.4f %.4f %.4f\n", f.Eval(-1), f.Eval(0), f.Deriv(0))
	// Output: 0.1192 0.5000 0.5000
}

func ExampleReLU_Apply() {
	dst := make([]float64, 4)
	activation.ReLU{}.Apply(dst, []float64{-2, -0.5, 0.5, 2})
	fmt.Println(dst)
	// Output: [0 0 0.5 2]
}

func ExampleNew() {
	f, err := activation.New("leaky_relu", map[string]float64{"slope": 0.1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(f.Name(), f.Params(), f.Eval(-3))
	_, err = activation.New("elu", map[string]float64{"beta": 1})
	fmt.Println(err)
	// Output:
	// leaky_relu [{slope 0.1}] -0.30000000000000004
	// activation: elu has no parameter "beta"; its parameters are alpha
}

func ExampleSoftmax() {
	p := make([]float64, 3)
	if err := activation.Softmax(p, []float64{1000, 1001, 1002}, 1); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f\n", p)
	// Output: [0.0900 0.2447 0.6652]
}

func ExampleLogSoftmax() {
	lp := make([]float64, 2)
	_ = activation.LogSoftmax(lp, []float64{0, 0}, 1)
	fmt.Printf("%.6f\n", lp)
	// Output: [-0.693147 -0.693147]
}

func ExampleOneHot() {
	w := make([]float64, 4)
	_ = activation.OneHot(w, []float64{1, 3, 3, 0})
	i, _ := activation.Argmax([]float64{1, 3, 3, 0})
	fmt.Println(w, i)
	// Output: [0 0.5 0.5 0] 1
}
