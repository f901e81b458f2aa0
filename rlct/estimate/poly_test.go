package estimate

import (
	"context"
	"math"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// TestCompiledPolynomial runs the estimator the way the command line
// does, on parsed and expanded polynomials compiled by package monomial, for
// the degenerate cases of validationCases (same sources and exact volumes):
// the expanded forms are evaluated with cancellation near the zero set, so
// RoundOff is set to 1e−16 times the sum of the absolute coefficients on the
// unit box (4 for both), as its documentation suggests.
func TestCompiledPolynomial(t *testing.T) {
	for _, c := range []struct {
		src  string
		vars []string
		vc   validationCase
	}{
		{"(x-y)^2", []string{"x", "y"}, validationCases[4]},
		{"(y-x^2)^2", []string{"x", "y"}, validationCases[5]},
	} {
		t.Run(c.src, func(t *testing.T) {
			e, err := monomial.Parse(c.src, monomial.Config{Vars: c.vars})
			if err != nil {
				t.Fatal(err)
			}
			k := e.Poly.Compile()
			// The compiled polynomial agrees with the direct formula.
			for _, w := range [][]float64{{0.3, -0.7}, {1, 1}, {-0.25, 0.5}} {
				if got, want := k.Eval(w), c.vc.k(w); math.Abs(got-want) > 1e-14 {
					t.Fatalf("K(%v) = %g, want %g", w, got, want)
				}
			}
			est, err := Run(context.Background(), k, Options{
				Lower: c.vc.lower, Upper: c.vc.upper, Live: 100, Runs: 16, Seed: 5, RoundOff: 4e-16})
			if err != nil {
				t.Fatal(err)
			}
			limL, _ := limitFit(c.vc.vol, est)
			t.Logf("λ̂ = %.4f ± %.4f (limit %.4f), θ̂ = %.3f ± %.3f", est.Lambda, est.LambdaSE, limL, est.Theta, est.ThetaSE)
			if tol := 4*est.LambdaSE + math.Abs(limL-c.vc.lambda); math.Abs(est.Lambda-c.vc.lambda) > tol {
				t.Errorf("λ̂ = %.4f ± %.4f, want %.4f within %.4f", est.Lambda, est.LambdaSE, c.vc.lambda, tol)
			}
			if v := est.Compare(c.vc.newton, c.vc.status); v.Consistent {
				t.Errorf("Compare(%g, %s) = %+v, want the bound found strict", c.vc.newton, c.vc.status, v)
			}
		})
	}
}
