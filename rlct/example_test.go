package rlct_test

import (
	"context"
	"fmt"
	"math/big"

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

// A degenerate divergence gives only an upper bound, with the reason, when
// no reduction applies (here it is turned off; see ExampleBound_reduction).
func ExampleBound_degenerate() {
	ex, _ := monomial.Parse("(x^2 - y)^2", monomial.Config{})
	r, _ := rlct.Bound(context.Background(), &rlct.Problem{K: ex.Poly}, &rlct.Options{NoReduction: true, NoRepair: true})
	fmt.Println(r.Lambda.RatString(), r.Theta, r.Status)
	fmt.Println(r.Reasons[0])
	// Output:
	// 3/4 1 upper-bound
	// the face with vertices (0,2) (4,0) is degenerate: its face polynomial x^4 - 2*x^2*y + y^2 vanishes at x=1, y=1 in the real torus
}

// The same divergence through the reduction: K's quadratic part y² has
// rank 1, so solving ∂K/∂y = 0 (y = x²) splits off u = y − x², and the core
// K(x, x²) = 0 leaves x free: λ = 1/2, θ = 1.
func ExampleBound_reduction() {
	ex, _ := monomial.Parse("(x^2 - y)^2", monomial.Config{})
	r, _ := rlct.Bound(context.Background(), &rlct.Problem{K: ex.Poly}, nil)
	fmt.Println(r.Lambda.RatString(), r.Theta, r.Status)
	fmt.Println(r.Reduction.Solution[0], "free:", r.Reduction.Free)
	u := r.Reduction.Unreduced
	fmt.Println("without it:", u.Lambda.RatString(), u.Theta, u.Status)
	// Output:
	// 1/2 1 exact
	// y = x^2 free: [x]
	// without it: 3/4 1 upper-bound
}

// A Spec reads the problem from text, as the command line does: here the
// sum-of-squares form with a prior |a|^1 near the origin.
func ExampleSpec() {
	spec := &rlct.Spec{SOS: []string{"a*b", "a*c"}, Prior: "a=1"}
	p, err := spec.Problem()
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := rlct.Bound(context.Background(), p, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("λ = %s, θ = %d (%s)\n", r.Lambda.RatString(), r.Theta, r.Status)
	// Output: λ = 1, θ = 2 (exact)
}

// A problem at several points: Bound returns the minimum over them, the
// learning coefficient of a model whose true set holds them all, with the
// answer at each point in Locals.
func ExampleBound_points() {
	ex, err := monomial.Parse("x^2*(x-1)^4 + y^2", monomial.Config{})
	if err != nil {
		fmt.Println(err)
		return
	}
	p := &rlct.Problem{K: ex.Poly, Points: [][]*big.Rat{
		{big.NewRat(0, 1), big.NewRat(0, 1)},
		{big.NewRat(1, 1), big.NewRat(0, 1)},
	}}
	r, err := rlct.Bound(context.Background(), p, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("minimum:", r.Lambda.RatString(), r.Theta, r.Status)
	for i, l := range r.Locals {
		fmt.Printf("point %d at (%s, %s): %s %d %s\n", i+1, l.Point[0].RatString(), l.Point[1].RatString(), l.Lambda.RatString(), l.Theta, l.Status)
	}
	// Output:
	// minimum: 3/4 1 exact
	// point 1 at (0, 0): 1 1 exact
	// point 2 at (1, 0): 3/4 1 exact
}

// Locals shows the problem as Bound sees it at each point: K in the offsets
// from the point, the weights τ, and a note for a prior exponent that does
// not count there.
func ExampleProblem_Locals() {
	p, err := (&rlct.Spec{K: "(x-1)^2 + y^2", Prior: "x=1,y=1", At: []string{"x=1"}}).Problem()
	if err != nil {
		fmt.Println(err)
		return
	}
	locals, err := p.Locals()
	if err != nil {
		fmt.Println(err)
		return
	}
	l := locals[0]
	fmt.Println(l.Polys[0], l.Weights)
	fmt.Println(l.Notes[0])
	// Output:
	// x^2 + y^2 [1/1 2/1]
	// the prior exponent 1 of x does not count at this point: x = 1 there, not 0, so |x|^1 is smooth and positive near the point and changes neither λ nor θ
}
