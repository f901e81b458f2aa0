package estimate_test

import (
	"context"
	"fmt"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// ExampleProblem estimates λ for K = (x − 1)² − 2(x − 1)y + y² at
// x = 1, which is u² − 2uy + y² = (u − y)² in the offset u = x − 1: the Newton
// polyhedron of K itself gives the bound 1, while λ = 1/2 (which Bound finds
// exactly through its reduction, turned off here).
func ExampleProblem() {
	s := rlct.Spec{K: "(x-1)^2 - 2*(x-1)*y + y^2", At: []string{"x=1"}}
	p, err := s.Problem()
	if err != nil {
		fmt.Println(err)
		return
	}
	bound, err := rlct.Bound(context.Background(), p, &rlct.Options{NoReduction: true, NoRepair: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	e, err := estimate.Problem(context.Background(), p, estimate.Options{
		Lower: []float64{-1, -1}, // offsets from the point
		Upper: []float64{1, 1},
		Live:  50, Runs: 8, Seed: 1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	l, _ := bound.Lambda.Float64()
	fmt.Printf("Newton bound λ = %s (%s)\n", bound.Lambda.RatString(), bound.Status)
	fmt.Printf("estimate λ ≈ %.1f\n", e.Lambda)
	fmt.Println(e.Compare(l, bound.Status).Consistent)
	// Output:
	// Newton bound λ = 1 (upper-bound)
	// estimate λ ≈ 0.5
	// false
}
