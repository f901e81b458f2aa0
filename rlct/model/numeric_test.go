package model

import (
	"math"
	"math/big"
	"testing"
)

// These are numerical checks in float64 arithmetic, labelled as such: they
// compare the K that Build computes exactly with the Kullback–Leibler
// divergence it stands for, on grids of points near the truth.

// grid returns the points w* + ε·s for s in {−1, −1/2, 0, 1/2, 1}^d.
func grid(center []float64, eps float64) [][]float64 {
	steps := []float64{-1, -0.5, 0, 0.5, 1}
	out := [][]float64{nil}
	for _, c := range center {
		var next [][]float64
		for _, p := range out {
			for _, s := range steps {
				next = append(next, append(append([]float64(nil), p...), c+eps*s))
			}
		}
		out = next
	}
	return out
}

// floats converts rationals to float64.
func floats(xs []*big.Rat) []float64 {
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i], _ = x.Float64()
	}
	return out
}

// TestDiscreteKLRatio compares, numerically, K = Σ (p_k − q_k)²/(2q_k) with
// the divergence KL = Σ q_k·log(q_k/p_k) of discrete models without input,
// on a grid around the truth: wherever every |p_k/q_k − 1| ≤ 1/2, the
// bounds K/2 ≤ KL ≤ 2K derived in buildDiscrete must hold, and the grid
// must reach points where K > 0.
func TestDiscreteKLRatio(t *testing.T) {
	srcs := []string{
		"kind discrete\nparam a, b\ncategory h = 1/3 + a*b\ncategory t = 2/3 - a*b\ntruth a = 1/2",
		"kind discrete\nparam a, b\ncategory y = [1/4 + a; 1/4 + b^2; 1/2 - a - b^2]",
		"kind mixture\nparam a, p1, p2\ncomponent binomial(3, p1) weight a\ncomponent binomial(3, p2) weight 1 - a\ntruth a = 1/3, p1 = 2/5, p2 = 2/5",
	}
	d, err := LatentClass(2, 2, big.NewRat(1, 3))
	if err != nil {
		t.Fatal(err)
	}
	srcs = append(srcs, d.String())
	for _, src := range srcs {
		m := mustBuild(t, src)
		if m.Offsets {
			t.Fatalf("%s: expected a polynomial model", src)
		}
		gens := make([]func([]float64) float64, len(m.Problem.Generators))
		q := make([]float64, len(gens))
		c := make([]float64, len(gens))
		for k, g := range m.Problem.Generators {
			gens[k] = g.Compile().Eval
			c[k], _ = m.Problem.GeneratorWeights[k].Float64()
			q[k] = 1 / (2 * c[k]) // no input: the weight is 1/(2q)
		}
		checked := 0
		for _, w := range grid(floats(m.Truth), 0.05) {
			kk, kl, far := 0.0, 0.0, false
			for k := range gens {
				g := gens[k](w)
				p := q[k] + g
				if math.Abs(p/q[k]-1) > 0.5 {
					far = true
				}
				kk += c[k] * g * g
				kl += q[k] * math.Log(q[k]/p)
			}
			if far {
				continue
			}
			if kk < 1e-14 {
				if math.Abs(kl) > 1e-12 {
					t.Errorf("%s at %v: K = %g but KL = %g", m.Name, w, kk, kl)
				}
				continue
			}
			checked++
			if r := kl / kk; r < 0.5-1e-9 || r > 2+1e-9 {
				t.Errorf("%s at %v: KL/K = %g, outside [1/2, 2]", m.Name, w, r)
			}
		}
		if checked < 10 {
			t.Errorf("%s: only %d grid points with K > 0", src, checked)
		}
	}
}

// poissonLog returns log Poisson(y; μ).
func poissonLog(y int, mu float64) float64 {
	lg, _ := math.Lgamma(float64(y) + 1)
	return float64(y)*math.Log(mu) - mu - lg
}

// TestPoissonChiSquare checks numerically, for p = a·Poisson(μ1) +
// (1 − a)·Poisson(μ2) and q = Poisson(μ*), (1) that 2K from the generators
// (order 14) equals χ²(p‖q) = Σ_y p(y)²/q(y) − 1 summed directly over the
// counts, which checks the identity of buildMixture; (2) that KL(q‖p)/K
// stays between 1/2 and 2 on a grid near the truth, the comparability that
// buildMixture recalls from memory for this family.
func TestPoissonChiSquare(t *testing.T) {
	const mu = 3.0
	src := "kind mixture\nparam a, m1, m2\ncomponent poisson(m1) weight a\ncomponent poisson(m2) weight 1 - a\ntruth a = 1/3, m1 = 3, m2 = 3\norder 14"
	m := mustBuild(t, src)
	evals := make([]func([]float64) float64, len(m.Problem.Generators))
	c := make([]float64, len(evals))
	for k, g := range m.Problem.Generators {
		evals[k] = g.Compile().Eval
		c[k], _ = m.Problem.GeneratorWeights[k].Float64()
	}
	checked := 0
	for _, off := range grid([]float64{0, 0, 0}, 0.2) {
		a, m1, m2 := 1.0/3+off[0], mu+off[1], mu+off[2]
		kk := 0.0
		for k := range evals {
			g := evals[k](off) // the generators are in the offsets
			kk += c[k] * g * g
		}
		chi2, kl := -1.0, 0.0
		for y := range 200 {
			lq := poissonLog(y, mu)
			p := a*math.Exp(poissonLog(y, m1)) + (1-a)*math.Exp(poissonLog(y, m2))
			q := math.Exp(lq)
			chi2 += p * p / q
			if q > 0 {
				kl += q * (lq - math.Log(p))
			}
		}
		if math.Abs(2*kk-chi2) > 1e-9*math.Max(chi2, 1e-6) {
			t.Errorf("at offsets %v: 2K = %.15g, χ² summed over the counts = %.15g", off, 2*kk, chi2)
		}
		if kk < 1e-14 {
			continue
		}
		checked++
		if r := kl / kk; r < 0.5 || r > 2 {
			t.Errorf("at offsets %v: KL/K = %g, outside [1/2, 2]", off, r)
		}
	}
	if checked < 50 {
		t.Errorf("only %d grid points with K > 0", checked)
	}
}

// TestTanhKNumeric checks, numerically, the series K of a tanh regression
// on a design against E_x[(a·tanh(b·x))²]/(2σ²) computed with math.Tanh at
// small parameters: the order 12 series must agree to 1e-10.
func TestTanhKNumeric(t *testing.T) {
	m := mustBuild(t, "kind regression\nparam a, b\ninput x ~ design { -1: 1/4, 1/2: 1/4, 2: 1/2 }\nnoise 3/2\nmean a*tanh(b*x)\norder 12\n")
	xs, ps := []float64{-1, 0.5, 2}, []float64{0.25, 0.25, 0.5}
	for _, w := range grid([]float64{0, 0}, 0.1) {
		want := 0.0
		for j, x := range xs {
			f := w[0] * math.Tanh(w[1]*x)
			want += ps[j] * f * f / 3
		}
		got := 0.0
		for k, g := range m.Problem.Generators {
			v := g.Compile().Eval(w)
			c, _ := m.Problem.GeneratorWeights[k].Float64()
			got += c * v * v
		}
		if math.Abs(got-want) > 1e-10*math.Max(want, 1e-12) {
			t.Errorf("at %v: K = %.15g, direct = %.15g", w, got, want)
		}
	}
}
