package estimate_test

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// benchSizes are the numbers of variables of the benchmarks, with the degree
// of the random polynomials squared (chosen so that about 1000 distinct
// monomials exist up to twice that degree).
var benchSizes = []struct{ d, degree int }{{2, 40}, {6, 4}, {10, 3}}

// randomSumOfSquares returns K = Σ_j p_j² with at least 1000 terms, where p_j
// are random sparse polynomials with 4 terms of degree 1..degree and small
// rational coefficients; p_j for j < d also contains the term x_j, so the
// quadratic part of K is positive definite and K is regular at the origin:
// λ = d/2, θ = 1 (Watanabe 2009, the regular case; from memory).
func randomSumOfSquares(d, degree int, seed uint64) *monomial.Poly {
	rng := rand.New(rand.NewPCG(seed, 1))
	vars := make([]string, d)
	for i := range vars {
		vars[i] = fmt.Sprintf("w%d", i+1)
	}
	k := monomial.Zero(vars)
	for j := 0; k.Len() < 1000; j++ {
		var exps []monomial.Exponent
		var coefs []*big.Rat
		if j < d {
			e := make(monomial.Exponent, d)
			e[j] = 1
			exps, coefs = append(exps, e), append(coefs, big.NewRat(1, 1))
		}
		for range 4 {
			e := make(monomial.Exponent, d)
			for range 1 + rng.IntN(degree) {
				e[rng.IntN(d)]++
			}
			c := int64(rng.IntN(16)) - 8
			if c >= 0 {
				c++
			}
			exps, coefs = append(exps, e), append(coefs, big.NewRat(c, 4))
		}
		p, err := monomial.FromTerms(vars, exps, coefs)
		if err != nil {
			panic(err)
		}
		k = k.Add(p.Mul(p))
	}
	return k
}

// BenchmarkEval measures evaluations of a compiled 1000-term K per
// second, the inner cost of Run.
func BenchmarkEval(b *testing.B) {
	for _, s := range benchSizes {
		k := randomSumOfSquares(s.d, s.degree, 1)
		c := k.Compile()
		b.Run(fmt.Sprintf("d=%d", s.d), func(b *testing.B) {
			rng := rand.New(rand.NewPCG(2, 2))
			pts := make([][]float64, 64)
			for i := range pts {
				pts[i] = make([]float64, s.d)
				for j := range pts[i] {
					pts[i][j] = 2*rng.Float64() - 1
				}
			}
			b.ReportAllocs()
			i := 0
			var sink float64
			for b.Loop() {
				sink += c.Eval(pts[i%len(pts)])
				i++
			}
			b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "evals/s")
			b.ReportMetric(float64(k.Len()), "terms")
			_ = sink
		})
	}
}

// BenchmarkRun runs Run on a random 1000-term K
// (regular, λ = d/2) on [−1/2,1/2]^d (on [−1,1]^d its higher-degree terms
// dominate the low end of the grid) with Live·Runs live points in all, and
// reports λ̂, its standard error, evaluations per second over the workers,
// and the wall time projected to reach se(λ̂) = 0.02 from the measured one,
// using that se(λ̂) falls like 1/sqrt(Live·Runs) while the work grows like
// Live·Runs (a projection, not a measurement). Run with -benchtime=1x.
func BenchmarkRun(b *testing.B) {
	for _, s := range benchSizes {
		k := randomSumOfSquares(s.d, s.degree, 1).Compile()
		b.Run(fmt.Sprintf("d=%d", s.d), func(b *testing.B) {
			lo, hi := make([]float64, s.d), make([]float64, s.d)
			for i := range lo {
				lo[i], hi[i] = -0.5, 0.5
			}
			opt := estimate.Options{Lower: lo, Upper: hi, Live: 50, Runs: 8, Seed: 1}
			b.ReportAllocs()
			var e *estimate.Result
			var wall time.Duration
			for b.Loop() {
				start := time.Now()
				var err error
				if e, err = estimate.Run(context.Background(), k, opt); err != nil {
					b.Fatal(err)
				}
				wall = time.Since(start)
			}
			b.ReportMetric(e.Lambda, "lambda")
			b.ReportMetric(e.LambdaSE, "lambda-se")
			b.ReportMetric(float64(s.d)/2, "lambda-true")
			b.ReportMetric(float64(e.Evaluations)/wall.Seconds(), "evals/s")
			b.ReportMetric(wall.Seconds()*math.Pow(e.LambdaSE/0.02, 2), "s-to-se0.02")
		})
	}
}
