package monomial_test

import (
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

func ExampleParse() {
	e, err := monomial.Parse("(a*b - c)^2 + 1/2*d", monomial.Config{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(e.Poly)
	fmt.Println(e.Poly.Vars(), e.Truncated)
	// Output:
	// a^2*b^2 - 2*a*b*c + c^2 + 1/2*d
	// [a b c d] false
}

func ExampleParse_series() {
	e, err := monomial.Parse("tanh(x*y + z)", monomial.Config{Order: 3})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(e.Poly, e.Truncated)
	// Output: -1/3*z^3 + x*y + z true
}

func ExampleParse_error() {
	_, err := monomial.Parse("exp(1+x)", monomial.Config{Order: 4})
	fmt.Println(err)
	_, err = monomial.Parse("(x + y))", monomial.Config{})
	fmt.Println(err)
	// Output:
	// 1:1: exp(1+x): the argument equals 1 at 0, so the Taylor coefficients would be irrational (multiples of exp(1)); factor the constant out: exp(1 + u) = exp(1)·exp(u), so write the model with exp(u)
	// 1:8: expected operator or end of expression, found ')'
}

func ExampleParseList() {
	gens, err := monomial.ParseList("w1*w2 - 1; w2^2\nw3", monomial.Config{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, g := range gens {
		fmt.Println(g.Poly, g.Poly.Vars())
	}
	// Output:
	// w1*w2 - 1 [w1 w2 w3]
	// w2^2 [w1 w2 w3]
	// w3 [w1 w2 w3]
}

func ExampleParseBindings() {
	names, values, err := monomial.ParseBindings("a=1, b=-1/2, c=0.25")
	fmt.Println(names, values, err)
	// Output: [a b c] [1/1 -1/2 1/4] <nil>
}

func ExamplePoly_Translate() {
	e, _ := monomial.Parse("x^2*y", monomial.Config{})
	// Expand around the point x = 1, y = -1.
	fmt.Println(e.Poly.Translate([]*big.Rat{big.NewRat(1, 1), big.NewRat(-1, 1)}))
	// Output: x^2*y - x^2 + 2*x*y - 2*x + y - 1
}

func ExamplePoly_Pow() {
	vars := []string{"x", "y", "z"}
	sum := monomial.Zero(vars)
	for i := range vars {
		sum = sum.Add(monomial.Variable(vars, i))
	}
	p, err := sum.Pow(6, monomial.Limits{})
	fmt.Println(p.Len(), err)
	_, err = sum.Pow(100000, monomial.Limits{})
	fmt.Println(err)
	// Output:
	// 28 <nil>
	// monomial: power: exponent 100000 exceeds the limit 10000 (Limits.MaxExponent)
}

func ExamplePoly_Filter() {
	e, _ := monomial.Parse("x^2 + x*y^2 + y^4 + x^3", monomial.Config{})
	// The terms on the line 2i + j = 4 of the Newton polygon (weights 2, 1).
	face := e.Poly.Filter(func(x monomial.Exponent) bool { return 2*x[0]+x[1] == 4 })
	fmt.Println(face)
	// Output: y^4 + x*y^2 + x^2
}

func ExamplePoly_Compile() {
	e, _ := monomial.Parse("x^2 - 3*x*y + 1/4", monomial.Config{})
	f := e.Poly.Compile()
	fmt.Println(f.Eval([]float64{2, 1}))
	// Output: -1.75
}

func ExamplePoly_Embed() {
	e, _ := monomial.Parse("x*y", monomial.Config{})
	p, err := e.Poly.Embed([]string{"y", "z", "x"})
	fmt.Println(p, p.Vars(), err)
	_, err = e.Poly.Embed([]string{"x"})
	fmt.Println(err)
	// Output:
	// y*x [y z x] <nil>
	// monomial: Embed: variable "y" is missing from the target list [x]
}

// ExampleExpansion_remainder shows a remainder: tanh(b) = b - b^3/3 + …
// (Abramowitz & Stegun 1964, eq. 4.5.64, from memory), so a·tanh(b) to
// order 4 misses only multiples of a·b^5.
func ExampleExpansion_remainder() {
	e, err := monomial.Parse("a*tanh(b) + c^7", monomial.Config{Order: 4})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(e.Poly, e.Poly.Vars())
	fmt.Println(e.Remainder, e.Truncated)
	// Output:
	// c^7 - 1/3*a*b^3 + a*b [a b c]
	// [[1 5 0]] true
}

func ExampleConfig_at() {
	// Around x = 4, sqrt(x) = 2·(1 + u/4)^(1/2) with u = x - 4.
	at := map[string]*big.Rat{"x": big.NewRat(4, 1)}
	e, err := monomial.Parse("sqrt(x)", monomial.Config{Order: 2, At: at})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(e.Poly, e.Remainder)
	// exp(x) around x = 1/4 would have irrational coefficients.
	_, err = monomial.Parse("exp(x)", monomial.Config{Order: 2, At: map[string]*big.Rat{"x": big.NewRat(1, 4)}})
	fmt.Println(err)
	// Output:
	// -1/64*x^2 + 1/4*x + 2 [[3]]
	// 1:1: exp(x): the argument equals 1/4 at the expansion point, so the Taylor coefficients would be irrational (multiples of exp(1/4)); factor the constant out: exp(1/4 + u) = exp(1/4)·exp(u), so write the model with exp(u)
}
