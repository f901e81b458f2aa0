package sbic

import (
	"math"
)

// checkData checks the sample size and the log-likelihoods.
func (c *Candidates) checkData(n float64, logLik []float64) error {
	if !(n > math.E) || math.IsInf(n, 0) {
		return inputf("sbic: sample size n = %g must be finite and greater than e ≈ 2.718 (log log n must be defined)", n)
	}
	if len(logLik) != len(c.models) {
		return inputf("sbic: %d log-likelihoods for %d models", len(logLik), len(c.models))
	}
	for i, l := range logLik {
		if math.IsNaN(l) || math.IsInf(l, 0) {
			return inputf("sbic: model %q: log-likelihood %g is not finite", c.models[i].Name, l)
		}
	}
	return nil
}

// Scores returns sBIC(M_i) = log L'(M_i) of every model, in the order of the
// models given to New, for maximised log-likelihoods logLik (one per model,
// natural logarithms) at sample size n > e. It is the plain-number entry
// point for loops over many data sets; Choose adds the BIC, the choices, the
// weights and the sensitivity report. The scores are float64 evaluations
// (see the package documentation).
func (c *Candidates) Scores(n float64, logLik []float64) ([]float64, error) {
	if err := c.checkData(n, logLik); err != nil {
		return nil, err
	}
	return c.scores(n, logLik, nil), nil
}

// BIC returns ℓ_i − (d_i/2)·log n for every model, in the order of the
// models given to New.
func (c *Candidates) BIC(n float64, logLik []float64) ([]float64, error) {
	if err := c.checkData(n, logLik); err != nil {
		return nil, err
	}
	return c.bic(n, logLik), nil
}

func (c *Candidates) bic(n float64, logLik []float64) []float64 {
	out := make([]float64, len(logLik))
	logn := math.Log(n)
	for i, l := range logLik {
		out[i] = l - float64(c.models[i].Dim)/2*logn
	}
	return out
}

// override replaces the values of some pairs: override[i][j], when set,
// stands for the pair (i, j).
type override map[[2]int]Value

// scores solves the recursion. The data have been checked.
func (c *Candidates) scores(n float64, logLik []float64, alt override) []float64 {
	k := len(c.models)
	// The common scale: the largest log-likelihood.
	scale := math.Inf(-1)
	for _, l := range logLik {
		scale = math.Max(scale, l)
	}
	logn := math.Log(n)
	loglogn := math.Log(logn)
	// logL returns log L'_ij − scale.
	logL := func(i, j int) float64 {
		lambda, theta := c.lambda[i][j], c.theta[i][j]
		if v, ok := alt[[2]int{i, j}]; ok {
			lambda, _ = v.Lambda.Float64()
			theta = v.Theta
		}
		return (logLik[i] - scale) - lambda*logn + float64(theta-1)*loglogn
	}
	u := make([]float64, k) // log L'(M_i) − scale
	bterms := make([]float64, 0, k)
	gterms := make([]float64, 0, k)
	for _, i := range c.topo {
		a := logL(i, i)
		if len(c.below[i]) == 0 {
			u[i] = a
			continue
		}
		bterms, gterms = bterms[:0], gterms[:0]
		for _, j := range c.below[i] {
			w := c.logPrior[j] - c.logPrior[i] + u[j]
			bterms = append(bterms, w)
			gterms = append(gterms, w+logL(i, j))
		}
		u[i] = positiveRoot(a, logSumExp(bterms), logSumExp(gterms))
	}
	out := make([]float64, k)
	for i := range u {
		out[i] = scale + u[i]
	}
	return out
}

// positiveRoot returns log x for the positive root x of x² − βx − γ = 0,
// where β = e^a − e^b and γ = e^g > 0, without subtracting anything but
// e^a − e^b (see the package documentation). g = −Inf (γ = 0) is allowed
// when a > b, and gives x = β.
func positiveRoot(a, b, g float64) float64 {
	// |β| and its sign, in logs.
	var lb float64
	sign := 0
	switch {
	case a > b:
		sign, lb = 1, a+log1mexp(b-a)
	case a < b:
		sign, lb = -1, b+log1mexp(a-b)
	default:
		lb = math.Inf(-1)
	}
	// d = log √(β² + 4γ).
	d := logAddExp(2*lb, math.Ln2*2+g) / 2
	if sign >= 0 {
		return logAddExp(lb, d) - math.Ln2
	}
	return math.Ln2 + g - logAddExp(lb, d)
}

// log1mexp returns log(1 − e^x) for x < 0, accurately for x near 0 and for
// x far below it.
func log1mexp(x float64) float64 {
	if x > -math.Ln2 {
		return math.Log(-math.Expm1(x))
	}
	return math.Log1p(-math.Exp(x))
}

// logAddExp returns log(e^x + e^y).
func logAddExp(x, y float64) float64 {
	if x < y {
		x, y = y, x
	}
	if math.IsInf(y, -1) {
		return x
	}
	return x + math.Log1p(math.Exp(y-x))
}

// logSumExp returns log Σ e^(x_i), scaled by the largest term.
func logSumExp(xs []float64) float64 {
	m := math.Inf(-1)
	for _, x := range xs {
		m = math.Max(m, x)
	}
	if math.IsInf(m, -1) {
		return m
	}
	s := 0.0
	for _, x := range xs {
		s += math.Exp(x - m)
	}
	return m + math.Log(s)
}

// roundingTolerance estimates the absolute float64 rounding error of a
// score: a few units in the last place of the largest magnitude the
// evaluation handles (the log-likelihoods, the penalties and the log prior
// weights), for each of the models the recursion passes through. Scores
// closer than this are reported as tied.
func (c *Candidates) roundingTolerance(n float64, logLik []float64) float64 {
	mag := 0.0
	for _, l := range logLik {
		mag = math.Max(mag, math.Abs(l))
	}
	for _, lp := range c.logPrior {
		mag = math.Max(mag, math.Abs(lp))
	}
	logn := math.Log(n)
	mag += c.maxLambda*logn + float64(c.maxTheta())*math.Abs(math.Log(logn)) + 1
	const eps = 0x1p-52
	return 16 * float64(len(c.models)+1) * eps * mag
}

// maxTheta is the largest θ of the pairs and estimates.
func (c *Candidates) maxTheta() int {
	m := 1
	for _, p := range c.pairs {
		m = max(m, p.Theta)
		if p.Estimate != nil {
			m = max(m, p.Estimate.Theta)
		}
	}
	return m
}
