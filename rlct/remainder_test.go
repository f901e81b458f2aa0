package rlct

import (
	"context"
	"errors"
	"math/big"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// remainderCases are truncated problems with remainder monomials, each
// worked by hand (the derivation is in the comment above the case).
var remainderCases = []struct {
	name      string
	k         string   // K, or
	sos       []string // generators
	order     int
	remainder [][]int // nil: the total-degree rule alone
	lambda    string
	theta     int
	status    Status
	reason    string // a part of the first reason, when not exact
}{
	// a·tanh(b) to order 4 is a·b − a·b³/3 with remainder {a·b^5}. P(I) =
	// (1,1) + R², whose only compact face is the vertex (1,1); t = 1 in
	// P(I), 2 in P(K): λ = 1/2 with θ = 2 (a vertex in the plane). (1,5)
	// dominates (1,1), so it lies in P on no compact face: exact.
	{name: "a*tanh(b) with its remainder", sos: []string{"a*b - 1/3*a*b^3"}, order: 4,
		remainder: [][]int{{1, 5}}, lambda: "1/2", theta: 2, status: Exact},
	// The same without the remainder: the normal cone of the vertex (1,1)
	// is every y >= 0 with y_a + y_b = 1; y = (1/2, 1/2) puts the degree-5
	// omitted terms at 5/2 > t = 1, so the value is certified (the
	// sharpened rule: one y suffices), but without a pure power in a no
	// order rules out new compact faces: an upper bound.
	{name: "a*tanh(b) by the degree alone", sos: []string{"a*b - 1/3*a*b^3"}, order: 4,
		lambda: "1/2", theta: 2, status: UpperBound, reason: "no truncation order can rule that out"},
	// x²(1 − cos y) = x²y²/2 − x²y⁴/24 + … by the degree alone: the vertex
	// (2,2), t = 2, max over its normal cone of min(y_x, y_y) is 1/2, so
	// (D+1)/2 > 2 needs D ≥ 4 (worked by hand): order 3 is not a bound,
	// order 4 an upper bound.
	{name: "x^2(1-cos y) by the degree alone at order 3", k: "1/2*x^2*y^2", order: 3,
		lambda: "1/2", theta: 2, status: Uncertified, reason: "order 4 would"},
	{name: "x^2(1-cos y) by the degree alone at order 4", k: "1/2*x^2*y^2 - 1/24*x^2*y^4", order: 4,
		lambda: "1/2", theta: 2, status: UpperBound, reason: "no truncation order can rule that out"},
	// x² + y⁴: the edge x/2 + y/4 = 1 meets the diagonal at t = 4/3, λ =
	// 3/4, θ = 1. Order 3 by the degree: the normal cone of the edge is
	// y = (2/3, 1/3), and (D+1)·min y_i = 4/3 is not above t: not certified.
	{name: "x^2 + y^4 by the degree alone", k: "x^2 + y^4", order: 3,
		lambda: "3/4", theta: 1, status: Uncertified, reason: "too low to certify"},
	// With remainder {x³y, xy⁴}: (3,1) ≥ (2,0) and (1,4) ≥ (0,4), both
	// strictly, so both lie in P on no compact face: exact.
	{name: "x^2 + y^4 with dominated remainders", k: "x^2 + y^4", order: 3,
		remainder: [][]int{{3, 1}, {1, 4}}, lambda: "3/4", theta: 1, status: Exact},
	// With remainder {y³}: (0,3) is outside P (3/4 < 1 on the edge's
	// line) and y·(0,3) = 1 < 4/3 for y = (2/3, 1/3): a term y³ could lower
	// the distance, so the value is not a bound.
	{name: "x^2 + y^4 with a remainder below the edge", k: "x^2 + y^4", order: 2,
		remainder: [][]int{{0, 3}}, lambda: "3/4", theta: 1, status: Uncertified, reason: "multiples of y^3"},
	// x² + y² with remainder {xy}: (1,1) lies on the compact edge between
	// (2,0) and (0,2) but is no vertex, so P, t = 1 and θ = 1 stay, but
	// the edge polynomial x² + c·xy + y² could vanish on the torus (c = ±2):
	// a certified upper bound only.
	{name: "x^2 + y^2 with a remainder on the edge", k: "x^2 + y^2", order: 1,
		remainder: [][]int{{1, 1}}, lambda: "1", theta: 1, status: UpperBound, reason: "multiples of x*y"},
	// x² + y² with remainder {x²}: the vertex's coefficient could cancel,
	// and y·(2,0) = 1 = t for the only normal y = (1/2, 1/2): not a bound.
	{name: "x^2 + y^2 with a vertex as remainder", k: "x^2 + y^2", order: 1,
		remainder: [][]int{{2, 0}}, lambda: "1", theta: 1, status: Uncertified, reason: "multiples of x^2"},
	// x² + y² with remainder {x³}: outside no compact face, beyond the
	// vertex (2,0) on the axis, so in P on no compact face: exact λ = 1.
	{name: "x^2 + y^2 with a remainder past a vertex", k: "x^2 + y^2", order: 2,
		remainder: [][]int{{3, 0}}, lambda: "1", theta: 1, status: Exact},
}

func TestRemainder(t *testing.T) {
	for _, c := range remainderCases {
		t.Run(c.name, func(t *testing.T) {
			p := &Problem{Order: c.order, Truncated: true}
			cfg := monomial.Config{Vars: []string{"a", "b"}}
			if c.k != "" {
				cfg.Vars = []string{"x", "y"}
				ex, err := monomial.Parse(c.k, cfg)
				if err != nil {
					t.Fatal(err)
				}
				p.K = ex.Poly
			}
			for _, g := range c.sos {
				ex, err := monomial.Parse(g, cfg)
				if err != nil {
					t.Fatal(err)
				}
				p.Generators = append(p.Generators, ex.Poly)
			}
			for _, r := range c.remainder {
				p.Remainder = append(p.Remainder, monomial.Exponent(r))
			}
			r, err := Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatal(err)
			}
			if r.Lambda.RatString() != c.lambda || r.Theta != c.theta || r.Status != c.status {
				t.Fatalf("got (%s, %d, %s), want (%s, %d, %s); reasons %q", r.Lambda.RatString(), r.Theta, r.Status, c.lambda, c.theta, c.status, r.Reasons)
			}
			if c.reason != "" && (len(r.Reasons) == 0 || !strings.Contains(r.Reasons[0], c.reason)) {
				t.Errorf("reasons %q, want one containing %q", r.Reasons, c.reason)
			}
			if r.Truncation == nil || r.Truncation.Remainder != (c.remainder != nil) {
				t.Errorf("truncation report %+v: remainder used should be %v", r.Truncation, c.remainder != nil)
			}
		})
	}
}

// TestGeneratorWeights checks that weights are printed in the face
// polynomial and vertex coefficients and change nothing else.
func TestGeneratorWeights(t *testing.T) {
	vars := []string{"x", "y"}
	gens := []*monomial.Poly{monomial.Variable(vars, 0), monomial.Variable(vars, 1)}
	plains, err := Describe(context.Background(), &Problem{Generators: gens}, nil)
	if err != nil {
		t.Fatal(err)
	}
	plain := plains[0]
	w := []*big.Rat{big.NewRat(1, 2), big.NewRat(3, 1)}
	weighteds, err := Describe(context.Background(), &Problem{Generators: gens, GeneratorWeights: w}, nil)
	if err != nil {
		t.Fatal(err)
	}
	weighted := weighteds[0]
	if plain.Lambda.Cmp(weighted.Lambda) != 0 || plain.Theta != weighted.Theta || plain.Status != weighted.Status {
		t.Errorf("weights changed the answer: (%s, %d, %s) against (%s, %d, %s)", weighted.Lambda, weighted.Theta, weighted.Status, plain.Lambda, plain.Theta, plain.Status)
	}
	// K = x²/2 + 3y²: λ = 1 (the edge x + y = 2 of P(K) at t = 1), θ = 1.
	if got, want := weighted.Principal.Polynomial, "1/2*(x)^2 + 3*(y)^2"; got != want {
		t.Errorf("face polynomial %q, want %q", got, want)
	}
	if got, want := plain.Principal.Polynomial, "(x)^2 + (y)^2"; got != want {
		t.Errorf("face polynomial without weights %q, want %q", got, want)
	}
	coef := map[string]string{}
	for _, v := range weighted.Vertices {
		coef[v.Monomial] = v.Coefficient.RatString()
	}
	if coef["x^2"] != "1/2" || coef["y^2"] != "3" {
		t.Errorf("vertex coefficients %v, want x^2: 1/2 and y^2: 3", coef)
	}
}

func TestExtrasErrors(t *testing.T) {
	vars := []string{"x", "y"}
	x := monomial.Variable(vars, 0)
	k := x.Mul(x)
	cases := []struct {
		name string
		p    *Problem
		want error
	}{
		{"weights without generators", &Problem{K: k, GeneratorWeights: []*big.Rat{big.NewRat(1, 1)}}, ErrWeights},
		{"too few weights", &Problem{Generators: []*monomial.Poly{x, x}, GeneratorWeights: []*big.Rat{big.NewRat(1, 1)}}, ErrWeights},
		{"zero weight", &Problem{Generators: []*monomial.Poly{x}, GeneratorWeights: []*big.Rat{new(big.Rat)}}, ErrWeights},
		{"nil weight", &Problem{Generators: []*monomial.Poly{x}, GeneratorWeights: []*big.Rat{nil}}, ErrWeights},
		{"remainder of the wrong length", &Problem{K: k, Truncated: true, Order: 2, Remainder: []monomial.Exponent{{3}}}, ErrDimension},
		{"negative remainder exponent", &Problem{K: k, Truncated: true, Order: 2, Remainder: []monomial.Exponent{{4, -1}}}, ErrDimension},
		{"remainder not above the order", &Problem{K: k, Truncated: true, Order: 2, Remainder: []monomial.Exponent{{1, 1}}}, ErrDimension},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Bound(context.Background(), c.p, nil)
			if !errors.Is(err, c.want) || !errors.Is(err, ErrInput) {
				t.Errorf("got %v, want %v (an input error)", err, c.want)
			}
		})
	}
}

// TestRemainderAgainstHigherOrder bounds series truncated at low orders with
// their remainders (monomial.Expansion.Remainder) and checks every certified
// answer against the same series at a much higher order: a value certified
// as a bound must be the value of the full K, so it cannot change when more
// terms are known (the definition of the remainder, monomial package doc).
func TestRemainderAgainstHigherOrder(t *testing.T) {
	exprs := []struct {
		k   string
		sos bool
	}{
		{"a*tanh(b)", true},
		{"a*tanh(b); a*sin(2*b)", true},
		{"x^2*(1 - cos(y))", false},
		{"a^2*(exp(b^2) - 1) + b^4*(1 - cos(a))", false},
		{"sinh(x*y); x*(1 - cos(y)) + y^5", true},
		{"(x - tanh(x))^2 + y^2", false},
		{"log(1 + x^2*y) + x^3*sin(y)", true},
		{"x*y*exp(x) - x*y", true},
	}
	const high = 16
	bound := func(k string, sos bool, order int) *Result {
		t.Helper()
		cfg := monomial.Config{Vars: []string{"x", "y"}, Order: order}
		if strings.Contains(k, "a") {
			cfg.Vars = []string{"a", "b"}
		}
		p := &Problem{Order: order}
		var exs []*monomial.Expansion
		if sos {
			var err error
			exs, err = monomial.ParseList(k, cfg)
			if err != nil {
				t.Fatal(err)
			}
		} else {
			ex, err := monomial.Parse(k, cfg)
			if err != nil {
				t.Fatal(err)
			}
			exs = []*monomial.Expansion{ex}
		}
		for _, ex := range exs {
			if sos {
				p.Generators = append(p.Generators, ex.Poly)
			} else {
				p.K = ex.Poly
			}
			p.Truncated = p.Truncated || ex.Truncated
			p.Remainder = append(p.Remainder, ex.Remainder...)
		}
		r, err := Bound(context.Background(), p, nil)
		if errors.Is(err, ErrZero) {
			return nil // nothing left at this order
		}
		if err != nil {
			t.Fatalf("%s at order %d: %v", k, order, err)
		}
		return r
	}
	for _, e := range exprs {
		ref := bound(e.k, e.sos, high)
		if ref == nil || !isBound(ref.Status) {
			t.Errorf("%s at order %d: %s, want a certified reference", e.k, high, ref.Status)
			continue
		}
		certified := 0
		for order := 2; order <= 8; order++ {
			r := bound(e.k, e.sos, order)
			if r == nil {
				continue
			}
			if isBound(r.Status) {
				certified++
			}
			if isBound(r.Status) && (r.Lambda.Cmp(ref.Lambda) != 0 || r.Theta != ref.Theta) {
				t.Errorf("%s: order %d certifies (%s, %d, %s), order %d gives (%s, %d)", e.k, order,
					r.Lambda.RatString(), r.Theta, r.Status, high, ref.Lambda.RatString(), ref.Theta)
			}
			if r.Status == Exact && ref.Status != Exact {
				t.Errorf("%s: order %d is exact, order %d only %s", e.k, order, high, ref.Status)
			}
		}
		// Every case certifies by order 8 with its remainder (so the
		// comparison above is not vacuous).
		if certified == 0 {
			t.Errorf("%s: no order up to 8 certifies it", e.k)
		}
	}
}

// isBound reports whether s certifies a bound (Exact or UpperBound).
func isBound(s Status) bool { return s == Exact || s == UpperBound }
