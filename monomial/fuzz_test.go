package monomial

import (
	"errors"
	"math/big"
	"testing"
	"unicode/utf8"
)

// fuzzLimits keep each fuzz input cheap.
var fuzzLimits = Limits{MaxTerms: 5000, MaxExponent: 60, MaxOrder: 8, MaxBits: 50000}

// FuzzParse checks that no input makes the parser panic, that errors carry
// sane positions, that whatever parses prints and re-parses to the same
// polynomial, that a series expansion agrees with the one of the next
// order up to its own order (exactly, when it is not truncated), that its
// remainder is well formed and covers the difference with the expansion of
// the next order (checkRemainderAgainst), that the lexer agrees with the
// reference lexer, that the fast path for sums of monomials gives the same
// result or error as the general path, and that an expansion around a
// point (chosen from the order byte) either fails with a positioned error
// or has a well-formed remainder, and equals Poly.Translate when the
// expression is an exact polynomial.
func FuzzParse(f *testing.F) {
	for _, tc := range validCases {
		f.Add(tc.src, uint8(tc.order))
	}
	for _, tc := range invalidCases {
		f.Add(tc.src, uint8(tc.order))
	}
	for _, s := range []string{"a*tanh(b)", "tanh(b)^2", "x^2*(1 - cos(y))", "log(x)", "sqrt(x - 1)", "exp(x - 1/2)*y", "tanh(x*y+z)", "atan(x)^3/(1+y)", "exp(sin(x))", "(1+x+y)^(-1/2)", "x;y\nz", "((x)", "1/(1+x", "2**-1**2", "-(-(-x))^2", "(x^3)^4611686018427387904", "x^123456*y", "(-1)^99999999999"} {
		f.Add(s, uint8(4))
	}
	// Shapes of the fast path for sums of monomials, and where it declines.
	for _, s := range []string{"x1^4*x3^10*x7^2 + x2^12*x5^6", "(a*b)^2 + (c*d^2)^2", "2*x1^2*x2 - 3/4*x3^4 + 0.5*x", "x/2/3 - -y*--z", "(2*x)^10*(y^0)^3", "x*x^1099511627775", "x^2^3 + (x*y)^2^2", "x/0 + y", "x^1.5 + x/y", "(((((((((x)))))))))^2", "0*x^4611686018427387904 + 1"} {
		f.Add(s, uint8(0))
		f.Add(s, uint8(3))
	}
	f.Fuzz(func(t *testing.T, src string, order uint8) {
		compareLexers(t, src)
		cfg := Config{Order: int(order % 9), Limits: fuzzLimits}
		sameResult(t, src, cfg)
		e, err := Parse(src, cfg)
		if err != nil {
			checkErrorPosition(t, src, err)
		} else {
			roundTrip(t, src, e)
			checkRemainderShape(t, src, e)
			checkAtPoint(t, src, cfg, e, order)
			if cfg.Order > 0 {
				next := cfg
				next.Order++
				next.Limits.MaxOrder = next.Order
				if e2, err := Parse(src, next); err == nil {
					checkOrders(t, src, e, e2)
				}
			}
		}
		list, err := ParseList(src, cfg)
		if err != nil {
			checkErrorPosition(t, src, err)
		} else {
			for _, e := range list {
				roundTrip(t, src, e)
				checkRemainderShape(t, src, e)
			}
		}
		if r, err := ParseRat(src); err == nil {
			if r2, err := ParseRat(r.RatString()); err != nil || r2.Cmp(r) != 0 {
				t.Fatalf("ParseRat(%q) = %v, re-read %v, %v", src, r, r2, err)
			}
		} else {
			checkErrorPosition(t, src, err)
		}
		if names, values, err := ParseBindings(src); err == nil {
			if len(names) != len(values) {
				t.Fatalf("ParseBindings(%q): %d names, %d values", src, len(names), len(values))
			}
		} else {
			checkErrorPosition(t, src, err)
		}
	})
}

func checkErrorPosition(t *testing.T, src string, err error) {
	t.Helper()
	var pe *Error
	if !errors.As(err, &pe) {
		t.Fatalf("%q: error %v is not an *Error", src, err)
	}
	if pe.Offset < 0 || pe.Offset > len(src) || pe.Line < 1 || pe.Col < 1 || pe.Msg == "" {
		t.Fatalf("%q: bad error position %+v", src, pe)
	}
	// Line and Col must describe Offset.
	line, col := 1, 1
	for _, r := range src[:pe.Offset] {
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
	}
	if utf8.ValidString(src[:pe.Offset]) && (line != pe.Line || col != pe.Col) {
		t.Fatalf("%q: error at offset %d says %d:%d, want %d:%d", src, pe.Offset, pe.Line, pe.Col, line, col)
	}
}

func roundTrip(t *testing.T, src string, e *Expansion) {
	t.Helper()
	s := e.Poly.String()
	e2, err := Parse(s, Config{Vars: e.Poly.Vars()})
	if err != nil {
		t.Fatalf("%q parsed to %q, which does not parse: %v", src, s, err)
	}
	if !e2.Poly.Equal(e.Poly) || e2.Truncated {
		t.Fatalf("%q parsed to %q, which re-parses to %q", src, s, e2.Poly)
	}
}

// checkOrders checks the invariant of series mode on two expansions of src
// at orders D < D': the value minus each Poly has only terms of degree
// above its order, so both agree on the terms of degree <= D; and a
// non-truncated Poly is the value itself, so when both are exact they are
// equal.
func checkOrders(t *testing.T, src string, lo, hi *Expansion) {
	t.Helper()
	if a, b := lo.Poly.Truncate(lo.Order), hi.Poly.Truncate(lo.Order); !a.Equal(b) {
		t.Fatalf("%q: order %d gives %v, order %d gives %v: they differ up to degree %d", src, lo.Order, lo.Poly, hi.Order, hi.Poly, lo.Order)
	}
	if !lo.Truncated && !hi.Truncated && !lo.Poly.Equal(hi.Poly) {
		t.Fatalf("%q: exact at orders %d and %d but %v != %v", src, lo.Order, hi.Order, lo.Poly, hi.Poly)
	}
	checkRemainderAgainst(t, src, lo, hi)
}

// checkAtPoint parses src again around a point where the first variable
// of e has a value chosen by the order byte (in -2, -3/2, …, 2), and checks
// the result: a positioned error, or a well-formed remainder, and for an
// exact polynomial e with an exact result, e translated to the point.
func checkAtPoint(t *testing.T, src string, cfg Config, e *Expansion, order uint8) {
	t.Helper()
	vars := e.Poly.Vars()
	if len(vars) == 0 {
		return
	}
	a := big.NewRat(int64(order/9%9)-4, 2)
	cfg.At = map[string]*big.Rat{vars[0]: a}
	cfg.Vars = vars
	ea, err := Parse(src, cfg)
	if err != nil {
		checkErrorPosition(t, src, err)
		return
	}
	checkRemainderShape(t, src, ea)
	if !e.Truncated && !ea.Truncated {
		point := make([]*big.Rat, len(vars))
		for i := range point {
			point[i] = new(big.Rat)
		}
		point[0] = a
		if want := e.Poly.Translate(point); !ea.Poly.Equal(want) {
			t.Fatalf("%q at %s = %s: %v, want the translate %v", src, vars[0], a.RatString(), ea.Poly, want)
		}
	}
}
