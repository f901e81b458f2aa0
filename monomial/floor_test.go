package monomial

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// strictlyAbove reports whether e strictly dominates some point of floor.
func strictlyAbove(e Exponent, floor [][]int) bool {
	for _, g := range floor {
		if dividesExp(g, e) && !slices.Equal(g, e) {
			return true
		}
	}
	return false
}

// TestFloor compares expansions with a floor against expansions without one:
// at the same order they agree at every exponent that strictly dominates no
// floor point; against a higher order without a floor (whose terms up to that
// order are Taylor coefficients), every coefficient that differs lies at a
// multiple of a remainder monomial; and every remainder monomial has degree
// above the order or strictly dominates a floor point. The floors are the
// minimal points of the unfloored support (as rlct uses them) and random
// points.
func TestFloor(t *testing.T) {
	exprs := []string{
		"(a*tanh(b) + c*sin(a*b))^2 + exp(a*c)*b^2",
		"(a*tanh(b) + c*tanh(2*b) - a*b)^2 + (a*tanh(3*b) + c*tanh(b))^2",
		"exp(a + b) - 1 - a - b + c^2*cos(a) + c^5",
		"sin(a)*sinh(b)*tanh(c) + (a*b - tanh(a)*tanh(b))^2",
		"1/(1 + a + b*c) - 1 + a + b^3",
		"log(1 + a*b)^2 + atan(c)^2*b + sqrt(1 + a*b*c) - 1",
		"(x - tanh(x))^2 + y^2 + x^3*tanh(y)^3",
	}
	rng := rand.New(rand.NewPCG(1, 11))
	const D, higher = 7, 12
	half := map[string]*big.Rat{"a": big.NewRat(1, 2)}
	for i := range 2 * len(exprs) {
		src := exprs[i%len(exprs)]
		var at map[string]*big.Rat
		if i >= len(exprs) {
			if !strings.Contains(src, "a") {
				continue
			}
			at = half // also at a point: a = 1/2
		}
		plain, err := Parse(src, Config{Order: D, At: at})
		if err != nil {
			if at != nil {
				continue // no rational expansion there
			}
			t.Fatalf("%s: %v", src, err)
		}
		ref, err := Parse(src, Config{Order: higher, At: at})
		if err != nil {
			t.Fatalf("%s at %d: %v", src, higher, err)
		}
		n := plain.Poly.NumVars()
		var floors [][][]int
		// The minimal points of the support of degree <= D - 2.
		var mins [][]int
		for e := range plain.Poly.All() {
			if e.Degree() <= D-2 && !strictlyAbove(e, mins) {
				mins = append(mins, slices.Clone(e))
			}
		}
		floors = append(floors, mins)
		for range 4 {
			var f [][]int
			for range 1 + rng.IntN(4) {
				g := make([]int, n)
				for i := range g {
					g[i] = rng.IntN(3)
				}
				f = append(f, g)
			}
			floors = append(floors, f)
		}
		for _, floor := range floors {
			got, err := Parse(src, Config{Order: D, Floor: floor, At: at})
			if err != nil {
				t.Fatalf("%s floor %v: %v", src, floor, err)
			}
			if got.Truncated != (len(got.Remainder) > 0) {
				t.Errorf("%s floor %v: Truncated %v with %d remainder monomials", src, floor, got.Truncated, len(got.Remainder))
			}
			for _, r := range got.Remainder {
				if r.Degree() <= D && !strictlyAbove(r, floor) {
					t.Errorf("%s floor %v: remainder monomial %v has degree <= %d and dominates no floor point", src, floor, r, D)
				}
			}
			// Same order: equal off the strictly dominating exponents.
			for _, e := range union(plain.Poly, got.Poly) {
				if strictlyAbove(e, floor) {
					continue
				}
				if a, b := plain.Poly.Coefficient(e), got.Poly.Coefficient(e); a.Cmp(b) != 0 {
					t.Errorf("%s floor %v: coefficient of %v is %s, without the floor %s", src, floor, e, b.RatString(), a.RatString())
				}
			}
			// Every dropped or changed term is covered.
			for _, e := range union(ref.Poly, got.Poly) {
				if e.Degree() > higher {
					continue
				}
				if a, b := ref.Poly.Coefficient(e), got.Poly.Coefficient(e); a.Cmp(b) != 0 && !inIdeal(e, got.Remainder) {
					t.Errorf("%s floor %v: coefficient of %v is %s, the value has %s, and no remainder monomial divides it (remainder %v)",
						src, floor, e, b.RatString(), a.RatString(), got.Remainder)
				}
			}
		}
	}
}

// union returns the exponents of the supports of p and q.
func union(p, q *Poly) []Exponent {
	var out []Exponent
	seen := map[string]bool{}
	for _, x := range []*Poly{p, q} {
		for e := range x.All() {
			k := fmt.Sprint([]int(e))
			if !seen[k] {
				seen[k] = true
				out = append(out, slices.Clone(e))
			}
		}
	}
	return out
}

// TestFloorExact checks that exact values are never cut and that Floor is
// ignored in polynomial mode, and that a bad floor is refused.
func TestFloorExact(t *testing.T) {
	floor := [][]int{{1, 0}, {0, 1}}
	for _, order := range []int{0, 4} {
		e, err := Parse("(x + y)^6 + x*y", Config{Order: order, Floor: floor})
		if err != nil {
			t.Fatal(err)
		}
		if e.Truncated || e.Poly.Len() != 8 {
			t.Errorf("order %d: %v, truncated %v; want the whole exact polynomial", order, e.Poly, e.Truncated)
		}
	}
	if _, err := Parse("tanh(x)", Config{Order: 4, Floor: [][]int{{1, 0}}}); err == nil {
		t.Error("a floor point with two exponents for one variable was accepted")
	}
	if _, err := Parse("tanh(x)", Config{Order: 4, Floor: [][]int{{-1}}}); err == nil {
		t.Error("a negative floor exponent was accepted")
	}
	e, err := Parse("tanh(x)*y", Config{Order: 6, Floor: [][]int{{1, 1}}})
	if err != nil {
		t.Fatal(err)
	}
	if got := e.Poly.String(); got != "x*y" || !e.Truncated {
		t.Errorf("tanh(x)*y with floor x*y: %s, truncated %v; want x*y, truncated", got, e.Truncated)
	}
}

// TestFloorDrops checks that the floor saves terms on a tanh network.
func TestFloorDrops(t *testing.T) {
	src := "(a1*tanh(b1) + a2*tanh(b2))^2 + (a1*tanh(2*b1) + a2*tanh(2*b2))^2"
	plain, err := Parse(src, Config{Order: 10})
	if err != nil {
		t.Fatal(err)
	}
	var floor [][]int
	for e := range plain.Poly.All() {
		if e.Degree() <= 4 && !strictlyAbove(e, floor) {
			floor = append(floor, slices.Clone(e))
		}
	}
	got, err := Parse(src, Config{Order: 10, Floor: floor})
	if err != nil {
		t.Fatal(err)
	}
	if got.Poly.Len() >= plain.Poly.Len() {
		t.Errorf("with the floor %v: %d terms, without: %d", floor, got.Poly.Len(), plain.Poly.Len())
	}
	t.Logf("%d terms with the floor, %d without; remainder %d monomials, without %d", got.Poly.Len(), plain.Poly.Len(), len(got.Remainder), len(plain.Remainder))
}
