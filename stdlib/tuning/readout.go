package tuning

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
)

// ReadoutProblem is a linear readout problem: find decoders d (length N)
// such that Σ_i d_i·Responses[i][j] ≈ Target[j] at every input j.
// Responses is N × M (rates in Hz, as filled by Population.Responses) and
// Target has length M. Neither is modified.
type ReadoutProblem struct {
	Responses *mat.Dense
	Target    []float64
}

// ReadoutSettings controls the regularisation. A nil *ReadoutSettings or a
// zero field means the default.
type ReadoutSettings struct {
	// Noise is the standard deviation σ of the response noise the decoders
	// should tolerate, as a fraction of the largest response; default 0.1
	// (common practice, from memory).
	Noise float64
	// Lambda, if positive, is used as the ridge parameter instead of the
	// rule from Noise.
	Lambda float64
}

// Readout is the result of Decode.
type Readout struct {
	Decoders []float64 // length N, in target units per Hz
	Estimate []float64 // decoded target at each of the M inputs
	RMSE     float64   // root-mean-square of Estimate − Target (noise-free responses)
	Lambda   float64   // ridge parameter used
	MaxRate  float64   // largest response, Hz
}

// Decode solves the ridge (Tikhonov) least-squares problem
//
//	(R Rᵀ + λ I) d = R y,    λ = M·(σ·r_max)²,
//
// with R the N × M responses, y the target, σ the relative noise and r_max
// the largest response. The rule for λ is the expected diagonal that
// independent noise of standard deviation σ·r_max on each of the M samples
// adds to R Rᵀ, so the noise-free solve matches the average noisy one
// (common practice). The system is solved by Cholesky factorisation with
// gonum/mat. It returns an error for mismatched sizes, non-finite data, a
// negative noise, or a matrix that is not positive definite (raise the
// noise or Lambda).
func Decode(p ReadoutProblem, s *ReadoutSettings) (*Readout, error) {
	n, m := p.Responses.Dims()
	if len(p.Target) != m {
		return nil, fmt.Errorf("tuning: readout target has %d values for %d inputs; they must match", len(p.Target), m)
	}
	rmax, err := maxFinite(p.Responses, p.Target)
	if err != nil {
		return nil, err
	}
	lambda, err := ridge(s, m, rmax)
	if err != nil {
		return nil, err
	}
	var g mat.SymDense
	g.SymOuterK(1, p.Responses) // R Rᵀ, N × N
	for i := range n {
		g.SetSym(i, i, g.At(i, i)+lambda)
	}
	var chol mat.Cholesky
	if ok := chol.Factorize(&g); !ok {
		return nil, fmt.Errorf("tuning: readout matrix is not positive definite (λ = %g); set a positive noise level or Lambda", lambda)
	}
	y := mat.NewVecDense(m, clone(p.Target))
	var ry, d mat.VecDense
	ry.MulVec(p.Responses, y)
	if err := chol.SolveVecTo(&d, &ry); err != nil {
		return nil, fmt.Errorf("tuning: readout solve failed (%v); raise the noise level or Lambda", err)
	}
	res := &Readout{Decoders: clone(d.RawVector().Data), Lambda: lambda, MaxRate: rmax}
	res.Estimate = make([]float64, m)
	res.RMSE = decodeRMSE(res.Estimate, p.Responses, res.Decoders, p.Target)
	return res, nil
}

// ridge returns λ from the settings.
func ridge(s *ReadoutSettings, m int, rmax float64) (float64, error) {
	var d ReadoutSettings
	if s != nil {
		d = *s
	}
	if d.Lambda > 0 && !math.IsInf(d.Lambda, 1) {
		return d.Lambda, nil
	}
	if d.Lambda < 0 || math.IsNaN(d.Lambda) || math.IsInf(d.Lambda, 1) {
		return 0, fmt.Errorf("tuning: readout Lambda must be ≥ 0 and finite, got %g; leave it 0 to use the noise rule", d.Lambda)
	}
	if d.Noise < 0 || math.IsNaN(d.Noise) || math.IsInf(d.Noise, 1) {
		return 0, fmt.Errorf("tuning: readout noise must be ≥ 0 and finite, got %g; use e.g. 0.1 (10 %% of the largest rate)", d.Noise)
	}
	if d.Noise == 0 {
		d.Noise = 0.1
	}
	sr := d.Noise * rmax
	return float64(m) * sr * sr, nil
}

// maxFinite returns the largest response and checks that all data are finite.
func maxFinite(r *mat.Dense, target []float64) (float64, error) {
	n, _ := r.Dims()
	rmax := 0.0
	for i := range n {
		for j, v := range r.RawRowView(i) {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, fmt.Errorf("tuning: response [%d, %d] = %g is not finite", i, j, v)
			}
			rmax = max(rmax, math.Abs(v))
		}
	}
	for j, v := range target {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("tuning: readout target[%d] = %g is not finite", j, v)
		}
	}
	if rmax == 0 {
		return 0, fmt.Errorf("tuning: every response is 0, so nothing can be read out; widen the input span or lower the intercepts")
	}
	return rmax, nil
}

// decodeRMSE sets est = Rᵀ d and returns the RMS of est − target.
func decodeRMSE(est []float64, r *mat.Dense, d, target []float64) float64 {
	clear(est)
	for i, di := range d {
		for j, v := range r.RawRowView(i) {
			est[j] += di * v
		}
	}
	ss := 0.0
	for j, e := range est {
		ss += (e - target[j]) * (e - target[j])
	}
	return math.Sqrt(ss / float64(len(est)))
}

// NoisyRMSE returns the RMS readout error when independent Gaussian noise of
// standard deviation noise·MaxRate is added to every response before
// decoding with r.Decoders; the noise comes from a PCG generator seeded by
// seed. p is not modified. It returns an error for a negative noise or
// sizes that do not match r.
func (r *Readout) NoisyRMSE(p ReadoutProblem, noise float64, seed uint64) (float64, error) {
	n, m := p.Responses.Dims()
	if n != len(r.Decoders) || m != len(p.Target) {
		return 0, fmt.Errorf("tuning: readout for %d neurons cannot decode a %d × %d response matrix with %d targets", len(r.Decoders), n, m, len(p.Target))
	}
	if !(noise >= 0) || math.IsInf(noise, 1) {
		return 0, fmt.Errorf("tuning: noise must be ≥ 0 and finite, got %g", noise)
	}
	rng := rand.New(rand.NewPCG(seed, 0x6e6f697365)) // second word fixed: "noise"
	noisy := mat.DenseCopyOf(p.Responses)
	sd := noise * r.MaxRate
	for i := range n {
		row := noisy.RawRowView(i)
		for j := range row {
			row[j] += sd * rng.NormFloat64()
		}
	}
	return decodeRMSE(make([]float64, m), noisy, r.Decoders, p.Target), nil
}
