package monomial

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"testing"
)

func parseXYZ(t *testing.T, s string) *Poly {
	t.Helper()
	e, err := Parse(s, Config{Vars: xyz})
	if err != nil {
		t.Fatal(err)
	}
	p, err := e.Poly.Embed(xyz)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// Exact divisions with quotients worked out by hand (each quotient times
// the divisor, expanded by hand, gives the dividend), and dividends that
// are not multiples of the divisor.
func TestDivExact(t *testing.T) {
	tests := []struct {
		p, q, s string // s == "" when q does not divide p
	}{
		{"x^2 - y^2", "x - y", "x + y"},
		{"x^2 - y^2", "x + y", "x - y"},
		{"x^3 - 1", "x - 1", "x^2 + x + 1"},
		{"x^3 + y^3", "x + y", "x^2 - x*y + y^2"},
		// (1 + z²)·(4z⁴ − 2xy) = 4z⁴ − 2xy + 4z⁶ − 2xyz².
		{"4*z^4 - 2*x*y + 4*z^6 - 2*x*y*z^2", "1 + z^2", "4*z^4 - 2*x*y"},
		{"6*x*y + 9*z^2", "3", "2*x*y + 3*z^2"},
		{"6*x*y + 9*z^2", "-3/2", "-4*x*y - 6*z^2"},
		{"0", "x + 1", "0"},
		{"x*y*z", "x*z", "y"},
		{"x^2 + y^2", "x + y", ""},     // remainder 2y²
		{"x^2 + 1", "x", ""},           // remainder 1
		{"x*y", "x^2", ""},             // degree in x too small
		{"x + y + z", "x + y + 1", ""}, // same degree, not a multiple
		{"x^2*y + 1", "x*y + 1", ""},   // x²y + 1 = x(xy + 1) − x + 1
		{"x + 1", "0", ""},
	}
	for _, tc := range tests {
		p, q := parseXYZ(t, tc.p), parseXYZ(t, tc.q)
		s, ok, err := p.DivExact(q, Limits{})
		if err != nil {
			t.Errorf("(%s)/(%s): %v", tc.p, tc.q, err)
			continue
		}
		if tc.s == "" {
			if ok {
				t.Errorf("(%s)/(%s) = %s, want not divisible", tc.p, tc.q, s)
			}
			continue
		}
		if !ok || !s.Equal(parseXYZ(t, tc.s)) {
			t.Errorf("(%s)/(%s) = %v (%v), want %s", tc.p, tc.q, s, ok, tc.s)
		}
	}
}

// Random products a·b divide by b with quotient a; a·b + 1 does not
// divide by a non-constant b (b·s = a·b + 1 would make b divide 1).
func TestDivExactRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	one := Constant(xyz, big.NewRat(1, 1))
	for range 200 {
		a := randomPoly(r, xyz, 1+r.IntN(8), 4)
		b := randomPoly(r, xyz, 1+r.IntN(6), 3)
		if b.IsZero() || a.IsZero() {
			continue
		}
		s, ok, err := a.Mul(b).DivExact(b, Limits{})
		if err != nil || !ok || !s.Equal(a) {
			t.Fatalf("(%s)·(%s) / (%s) = %v (%v, %v)", a, b, b, s, ok, err)
		}
		if b.IsConstant() {
			continue
		}
		if s, ok, err := a.Mul(b).Add(one).DivExact(b, Limits{}); err != nil || ok {
			t.Fatalf("(%s)·(%s) + 1 divided by %s: %v (%v, %v)", a, b, b, s, ok, err)
		}
	}
}

func TestDivExactVarsAndLimits(t *testing.T) {
	p := parseXYZ(t, "x^2 - y^2")
	other := Variable([]string{"x", "y"}, 0)
	if _, ok, err := p.DivExact(other, Limits{}); ok || err != nil {
		t.Errorf("division across variable lists: %v, %v", ok, err)
	}
	// (x^10 − 1)/(x − 1) has ten terms.
	big10 := parseXYZ(t, "x^10 - 1")
	_, ok, err := big10.DivExact(parseXYZ(t, "x - 1"), Limits{MaxTerms: 5})
	var le *LimitError
	if ok || !errors.As(err, &le) || le.Limit != "MaxTerms" {
		t.Errorf("MaxTerms 5: %v, %v", ok, err)
	}
	_, ok, err = big10.DivExact(parseXYZ(t, "x - 1"), Limits{MaxWork: 3})
	if ok || !errors.As(err, &le) || le.Limit != "MaxWork" {
		t.Errorf("MaxWork 3: %v, %v", ok, err)
	}
}
