package rlct_test

import (
	"context"
	"fmt"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// Bound a divergence given as a polynomial. x⁴ + y⁶ is a sum of squared
// monomials, so the answer is certified exact.
func ExampleBound() {
	ex, err := monomial.Parse("x^4 + y^6", monomial.Config{})
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := rlct.Bound(context.Background(), &rlct.Problem{K: ex.Poly}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(r.Lambda.RatString(), r.Theta, r.Status)
	// Output: 5/12 1 exact
}

// A degenerate divergence gives only an upper bound, with the reason.
func ExampleBound_degenerate() {
	ex, _ := monomial.Parse("(x^2 - y)^2", monomial.Config{})
	r, _ := rlct.Bound(context.Background(), &rlct.Problem{K: ex.Poly}, nil)
	fmt.Println(r.Lambda.RatString(), r.Theta, r.Status)
	fmt.Println(r.Reasons[0])
	// Output:
	// 3/4 1 upper-bound
	// the face with vertices (0,2) (4,0) is degenerate: its face polynomial x^4 - 2*x^2*y + y^2 vanishes at x=1, y=1 in the real torus
}

// A Spec reads the problem from text, as the command line does: here the
// sum-of-squares form with a prior |a|^1 near the origin.
func ExampleSpec() {
	spec := &rlct.Spec{SOS: []string{"a*b", "a*c"}, Prior: "a=1"}
	p, points, err := spec.Problem()
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := rlct.BoundAt(context.Background(), p, points, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("λ = %s, θ = %d (%s)\n", r.Lambda.RatString(), r.Theta, r.Status)
	// Output: λ = 1, θ = 2 (exact)
}
