package rlct_test

import (
	"context"
	"fmt"

	"github.com/lctkit/lctkit/rlct"
)

// squaredDifference is K(x, y) = (x − y)², a degenerate K: its Newton
// polyhedron gives the bound λ ≤ 1, while λ = 1/2 (u = x − y makes it u²).
type squaredDifference struct{}

func (squaredDifference) Eval(w []float64) float64 { d := w[0] - w[1]; return d * d }
func (squaredDifference) NumVars() int             { return 2 }

func ExampleEstimateThreshold() {
	e, err := rlct.EstimateThreshold(context.Background(), squaredDifference{}, rlct.EstimateOptions{
		Lower: []float64{-1, -1},
		Upper: []float64{1, 1},
		Seed:  1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("λ ≈ %.1f, θ ≈ %.0f\n", e.Lambda, e.Theta)
	v := e.Compare(1) // the Newton-polyhedron bound
	fmt.Println("consistent with the bound 1:", v.Consistent)
	// Output:
	// λ ≈ 0.5, θ ≈ 1
	// consistent with the bound 1: false
}
