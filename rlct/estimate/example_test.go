package estimate_test

import (
	"context"
	"fmt"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// squaredDifference is K(x, y) = (x − y)², a degenerate K: its Newton
// polyhedron gives the bound λ ≤ 1, while λ = 1/2 (u = x − y makes it u²).
type squaredDifference struct{}

func (squaredDifference) Eval(w []float64) float64 { d := w[0] - w[1]; return d * d }
func (squaredDifference) NumVars() int             { return 2 }

func ExampleRun() {
	e, err := estimate.Run(context.Background(), squaredDifference{}, estimate.Options{
		Lower: []float64{-1, -1},
		Upper: []float64{1, 1},
		Seed:  1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("λ ≈ %.1f, θ ≈ %.0f\n", e.Lambda, e.Theta)
	v := e.Compare(1, rlct.UpperBound) // the Newton-polyhedron bound and its status
	fmt.Println("consistent with the bound 1:", v.Consistent)
	// Output:
	// λ ≈ 0.5, θ ≈ 1
	// consistent with the bound 1: false
}

// twoZeros is K(x) = x²(x − 1)², which vanishes at 0 and at 1.
type twoZeros struct{}

func (twoZeros) Eval(w []float64) float64 { v := w[0] * (w[0] - 1); return v * v }
func (twoZeros) NumVars() int             { return 1 }

// ExampleZero estimates on a box that holds both zeros of x²(x − 1)²: the
// estimate is for the box, and the zero at 1 is reported.
func ExampleZero() {
	e, err := estimate.Run(context.Background(), twoZeros{}, estimate.Options{
		Lower: []float64{-0.5},
		Upper: []float64{1.5},
		Live:  50, Runs: 8, Seed: 1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, z := range e.OtherZeros {
		fmt.Printf("K is near 0 also at x ≈ %.3f\n", z.At[0])
	}
	// Output:
	// K is near 0 also at x ≈ 1.000
}

// ExampleResult_Compare compares one estimate with the same Newton value
// under two statuses: an exact value is never called strict.
func ExampleResult_Compare() {
	e := &estimate.Result{Lambda: 0.40, LambdaSE: 0.02}
	fmt.Println(e.Compare(0.5, rlct.UpperBound).Text)
	fmt.Println(e.Compare(0.5, rlct.Exact).Text)
	// Output:
	// below the bound by 5.0 standard errors: the bound is probably strict here
	// below the exact value by 5.0 standard errors: the value is certified, so the estimate is biased low here (not yet asymptotic, or another zero in the box)
}
