// Package activation provides element-wise activation functions with their
// derivatives, and group functions (softmax, log-softmax, one-hot, argmax)
// that act on a whole vector.
//
// Every element-wise function is a value implementing Func: Eval and Deriv
// act on one number, Apply and ApplyDeriv on a slice (destination first,
// source never modified, dst and src may be the same slice). The sigmoids
// take a steepness (gain) a and evaluate f(a·z); as a grows they approach the
// threshold function of the same range at every z ≠ 0.
//
//	function        formula                         range
//	logistic        1/(1+e^(−a z))                  (0, 1)
//	tanh            tanh(a z)                       (−1, 1)
//	arctan          atan(a z)                       (−π/2, π/2)
//	threshold       H(z), value at 0 settable       {0, h0, 1}
//	sign threshold  sgn(z), value at 0 settable     {−1, s0, 1}
//	ReLU            max(0, z)                       [0, ∞)
//	leaky ReLU      z if z > 0, else s·z            (−∞, ∞)
//	two-slope       r·z if z ≥ 0, else l·z          depends on l, r
//	softplus        log(1+e^(a z))/a                (0, ∞)
//	ELU             z if z > 0, else α(e^z − 1)     (−α, ∞)
//
// Table lists one Descriptor per function (name, LaTeX formula, range,
// parameters with defaults and limits, source); New builds a function from
// a descriptor name and parameter values, so a language layer and its
// documentation read one declaration.
//
// Special values. NaN in gives NaN out, for every element-wise function and
// its derivative: a missing sample stays visibly missing. ±Inf give the
// limits of the function (logistic(+Inf) = 1, ELU(−Inf) = −α, ...). The
// logistic and softplus are evaluated by branching on the sign and using
// e^(−|z|) and log1p, so they neither overflow nor lose precision for |z| up
// to the largest float64. At z = 0, where a piecewise function has a kink,
// its derivative takes the left-hand value (ReLU'(0) = 0; common practice).
//
// Group functions return an error, not NaN, for empty or NaN input: one NaN
// spoils every entry of the output through the normalising sum, so the
// result would be meaningless as a whole rather than at one entry.
package activation
