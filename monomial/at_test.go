package monomial

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// randomPolyText returns a random polynomial expression in x, y, z with
// sums, products, integer powers and rational coefficients.
func randomPolyText(r *rand.Rand, depth int) string {
	if depth == 0 || r.IntN(3) == 0 {
		switch r.IntN(4) {
		case 0:
			return strconv.Itoa(r.IntN(7)-3) + "/" + strconv.Itoa(1+r.IntN(3))
		case 1:
			return []string{"x", "y", "z"}[r.IntN(3)] + "^" + strconv.Itoa(r.IntN(5))
		}
		return []string{"x", "y", "z"}[r.IntN(3)]
	}
	sub := func() string { return randomPolyText(r, depth-1) }
	switch r.IntN(4) {
	case 0:
		return "(" + sub() + " + " + sub() + ")"
	case 1:
		return "(" + sub() + " - " + sub() + ")"
	case 2:
		return sub() + "*" + sub()
	}
	return "(" + sub() + ")^" + strconv.Itoa(r.IntN(4))
}

func randomAt(r *rand.Rand) ([]*big.Rat, map[string]*big.Rat) {
	point := make([]*big.Rat, 3)
	at := map[string]*big.Rat{}
	for i, v := range []string{"x", "y", "z"} {
		point[i] = big.NewRat(int64(r.IntN(9)-4), int64(1+r.IntN(3)))
		if r.IntN(4) > 0 {
			at[v] = point[i]
		} else {
			point[i] = new(big.Rat) // absent from At: the origin
		}
	}
	return point, at
}

// TestAtPolynomial: for polynomials, the expansion at a point is
// Poly.Translate of the polynomial, in polynomial mode and in series mode,
// exact, through the general path and the fast path for sums of monomials.
func TestAtPolynomial(t *testing.T) {
	r := rand.New(rand.NewPCG(41, 42))
	vars := []string{"x", "y", "z"}
	for i := range 300 {
		src := randomPolyText(r, 4)
		if i%3 == 0 {
			src = "2*x^3*y - 3/4*(x*z^2)^2 + y/5 + " + src // fast-path shapes
		}
		point, at := randomAt(r)
		base, err := Parse(src, Config{Vars: vars})
		if err != nil {
			t.Fatalf("%q: %v", src, err)
		}
		want := base.Poly.Translate(point)
		for _, order := range []int{0, 2} {
			e, err := Parse(src, Config{Vars: vars, Order: order, At: at})
			if err != nil {
				t.Fatalf("%q at %v order %d: %v", src, at, order, err)
			}
			if !e.Poly.Equal(want) || e.Truncated || e.Remainder != nil {
				t.Fatalf("%q at %v order %d = %v (remainder %v), want %v", src, at, order, e.Poly, e.Remainder, want)
			}
		}
	}
}

// shiftText replaces each variable v of src (x, y or z) by "(v - a_v)".
func shiftText(src string, at map[string]*big.Rat) string {
	return regexp.MustCompile(`\b[xyz]\b`).ReplaceAllStringFunc(src, func(v string) string {
		a, ok := at[v]
		if !ok || a.Sign() == 0 {
			return v
		}
		return "(" + v + " - " + a.RatString() + ")"
	})
}

// TestAtShiftedRewrite: expanding f(x - a) around x = a gives the expansion
// of f(x) around 0, polynomial and remainder alike, for random expressions
// mixing polynomials and series.
func TestAtShiftedRewrite(t *testing.T) {
	r := rand.New(rand.NewPCG(43, 44))
	vars := []string{"x", "y", "z"}
	n := 0
	for range 300 {
		src := randomMixed(r, 3)
		_, at := randomAt(r)
		d := 1 + r.IntN(5)
		want, err := Parse(src, Config{Vars: vars, Order: d})
		if err != nil {
			t.Fatalf("%q: %v", src, err)
		}
		shifted := shiftText(src, at)
		got, err := Parse(shifted, Config{Vars: vars, Order: d, At: at})
		if err != nil {
			t.Fatalf("%q at %v: %v", shifted, at, err)
		}
		if !got.Poly.Equal(want.Poly) || remString(vars, got.Remainder) != remString(vars, want.Remainder) {
			t.Fatalf("%q at %v order %d = %v with remainder %s; %q at 0 = %v with remainder %s",
				shifted, at, d, got.Poly, remString(vars, got.Remainder), src, want.Poly, remString(vars, want.Remainder))
		}
		if want.Truncated {
			n++
		}
	}
	if n < 50 {
		t.Errorf("weak sample: %d series", n)
	}
}

// TestAtRational: functions whose Taylor coefficients at the point are
// rational, against the same expansion written around 0.
func TestAtRational(t *testing.T) {
	for _, tc := range []struct {
		src  string
		at   map[string]*big.Rat
		want string // the same function written around 0
	}{
		{"exp(x)", map[string]*big.Rat{"x": new(big.Rat)}, "exp(x)"},
		{"exp(x)", nil, "exp(x)"},
		{"tanh(x - 1)", map[string]*big.Rat{"x": big.NewRat(1, 1)}, "tanh(x)"},
		{"sqrt(x)", map[string]*big.Rat{"x": big.NewRat(4, 1)}, "sqrt(4 + x)"},
		{"x^(1/2)", map[string]*big.Rat{"x": big.NewRat(9, 1)}, "(9 + x)^(1/2)"},
		{"(x + 5)^(1/2)", map[string]*big.Rat{"x": big.NewRat(4, 1)}, "(9 + x)^(1/2)"},
		{"log(x)", map[string]*big.Rat{"x": big.NewRat(1, 1)}, "log(1 + x)"},
		{"log(x*y)", map[string]*big.Rat{"x": big.NewRat(2, 1), "y": big.NewRat(1, 2)}, "log((2 + x)*(1/2 + y))"},
		{"1/x", map[string]*big.Rat{"x": big.NewRat(-3, 2)}, "(-3/2 + x)^(-1)"},
		{"y/(x - 1)^2", map[string]*big.Rat{"x": big.NewRat(3, 1)}, "y/(2 + x)^2"},
		{"sin(x*y)", map[string]*big.Rat{"y": big.NewRat(5, 1)}, "sin(x*(5 + y))"},
		{"atan(x - y)", map[string]*big.Rat{"x": big.NewRat(1, 3), "y": big.NewRat(1, 3)}, "atan(x - y)"},
	} {
		for _, d := range []int{1, 4} {
			got, err := Parse(tc.src, Config{Vars: []string{"x", "y"}, Order: d, At: tc.at})
			if err != nil {
				t.Errorf("%q at %v: %v", tc.src, tc.at, err)
				continue
			}
			want, err := Parse(tc.want, Config{Vars: []string{"x", "y"}, Order: d})
			if err != nil {
				t.Fatal(err)
			}
			checkRemainderShape(t, tc.src, got)
			if !got.Poly.Equal(want.Poly) || remString(got.Poly.Vars(), got.Remainder) != remString(want.Poly.Vars(), want.Remainder) {
				t.Errorf("%q at %v order %d = %v %v, want %v %v (%s)", tc.src, tc.at, d, got.Poly, got.Remainder, want.Poly, want.Remainder, tc.want)
			}
		}
	}
	// Around x = 4, sqrt(x) = 2 + u/4 - u^2/64 + u^3/512 - … with u = x - 4
	// (binomial series of 2·(1 + u/4)^(1/2), A&S 3.6.8, from memory).
	e, err := Parse("sqrt(x)", Config{Order: 3, At: map[string]*big.Rat{"x": big.NewRat(4, 1)}})
	if err != nil || e.Poly.String() != "1/512*x^3 - 1/64*x^2 + 1/4*x + 2" || remString(e.Poly.Vars(), e.Remainder) != "{x^4}" {
		t.Errorf("sqrt(x) at 4: %v, %v", e, err)
	}
}

// TestAtIrrational: where the value at the point makes a coefficient
// irrational, the expansion is refused with a message that names the
// function, its argument's value and a rewrite.
func TestAtIrrational(t *testing.T) {
	for _, tc := range []struct {
		src string
		at  map[string]*big.Rat
		err string
	}{
		{"y + exp(x)", map[string]*big.Rat{"x": big.NewRat(1, 4)}, "1:5: exp(x): the argument equals 1/4 at the expansion point, so the Taylor coefficients would be irrational (multiples of exp(1/4)); factor the constant out: exp(1/4 + u) = exp(1/4)·exp(u), so write the model with exp(u)"},
		{"log(x)", map[string]*big.Rat{"x": big.NewRat(3, 1)}, "1:1: log(x): the argument equals 3 at the expansion point, so the Taylor series starts with the irrational constant log(3); since log(a) = log(3) + log(a/3), write the model with log(1/3*(x)), whose argument is 1 there"},
		{"x*\n  sin(x)", map[string]*big.Rat{"x": big.NewRat(1, 1)}, "2:3: sin(x): the argument equals 1 at the expansion point, so the Taylor coefficients would be irrational: sin(1 + u) = sin(1)·cos(u) + cos(1)·sin(u), and no rewrite has rational ones; write the model with an argument that vanishes there (shift the variable or move the constant into a parameter)"},
		{"atan(x)", map[string]*big.Rat{"x": big.NewRat(2, 1)}, "1:1: atan(x): the argument equals 2 at the expansion point, so the Taylor series starts with the irrational constant atan(2); since atan(a) = atan(2) + atan((a - 2)/(1 + 2*a)), write the model with atan(((x) - 2)/(1 + 2*(x))), whose argument is 0 there"},
		{"sqrt(x)", map[string]*big.Rat{"x": big.NewRat(2, 1)}, "1:1: sqrt(x): the argument equals 2 at the expansion point, which is not the square of a rational, so the Taylor coefficients would be irrational (multiples of sqrt(2)); scale the argument so that its value there is a rational square such as 1 or 4 (sqrt(c*v) = sqrt(c)*sqrt(v) moves a factor out)"},
		{"tanh(x*y)", map[string]*big.Rat{"x": big.NewRat(-1, 2), "y": big.NewRat(1, 1)}, "1:1: tanh(x*y): the argument equals -1/2 at the expansion point, so the Taylor coefficients would be irrational: tanh(-1/2 + u) = (tanh(-1/2) + tanh(u))/(1 + tanh(-1/2)·tanh(u)), and no rewrite has rational ones; write the model with an argument that vanishes there (shift the variable or move the constant into a parameter)"},
		{"(x + 1)^(1/3)", map[string]*big.Rat{"x": big.NewRat(1, 1)}, "1:8: (x + 1)^(1/3): the base equals 2 at the expansion point, which has no rational 3-th root, so the Taylor coefficients would be irrational; scale the base so that its value there is, for example, 1"},
		{"log(x)", map[string]*big.Rat{"x": big.NewRat(-1, 1)}, "1:1: log(x): the argument equals -1 at the expansion point, where log is not real"},
	} {
		_, err := Parse(tc.src, Config{Order: 3, At: tc.at})
		var pe *Error
		if err == nil || !errors.As(err, &pe) || err.Error() != tc.err || pe.Setting != "" {
			t.Errorf("%q at %v:\n got  %v\n want %s", tc.src, tc.at, err, tc.err)
		}
	}
}

// TestAtSetting: an expression without a Taylor series at the point names
// the setting "At", and another point lifts the error.
func TestAtSetting(t *testing.T) {
	for _, tc := range []struct {
		src, err string
		at       map[string]*big.Rat
	}{
		{"log(x)", "1:1: log(x): the argument vanishes at 0, where log has no Taylor series", map[string]*big.Rat{"x": big.NewRat(1, 1)}},
		{"sqrt(x - 4)", "1:1: sqrt(x - 4): the argument vanishes at the expansion point, where sqrt has no Taylor series", map[string]*big.Rat{"x": big.NewRat(8, 1)}},
		{"1/(x*y)", "1:2: division by (x*y), which vanishes at 0: the quotient has no Taylor series there", map[string]*big.Rat{"x": big.NewRat(1, 1), "y": big.NewRat(-2, 1)}},
		{"(x - 1)^(-2)", "1:8: (x - 1)^(-2): the base vanishes at the expansion point, so this power has no Taylor series there", map[string]*big.Rat{"x": big.NewRat(2, 1)}},
	} {
		at := map[string]*big.Rat{"x": big.NewRat(4, 1)}
		if !strings.Contains(tc.err, "expansion point") {
			at = nil
		} else if tc.src == "(x - 1)^(-2)" {
			at = map[string]*big.Rat{"x": big.NewRat(1, 1)}
		}
		_, err := Parse(tc.src, Config{Order: 2, At: at})
		var pe *Error
		if err == nil || !errors.As(err, &pe) || err.Error() != tc.err || pe.Setting != "At" {
			t.Errorf("%q at %v:\n got  %v\n want %s {At}", tc.src, at, err, tc.err)
			continue
		}
		if _, err := Parse(tc.src, Config{Order: 2, At: tc.at}); err != nil {
			t.Errorf("%q at %v: %v", tc.src, tc.at, err)
		}
	}
}

// TestAtConfig: invalid points are errors of the configuration.
func TestAtConfig(t *testing.T) {
	for _, tc := range []struct {
		at  map[string]*big.Rat
		err string
	}{
		{map[string]*big.Rat{"w": big.NewRat(1, 1)}, "monomial: Config.At: w is not a variable of the text or of Config.Vars"},
		{map[string]*big.Rat{"2x": big.NewRat(1, 1)}, `monomial: Config.At: "2x" is not a valid variable name`},
		{map[string]*big.Rat{"x": nil}, "monomial: Config.At: the value of x is nil"},
	} {
		_, err := Parse("x + y", Config{At: tc.at})
		var pe *Error
		if err == nil || err.Error() != tc.err || errors.As(err, &pe) {
			t.Errorf("At %v: err %v, want %s", tc.at, err, tc.err)
		}
	}
	// A variable of Config.Vars absent from the text may be given.
	if e, err := Parse("x", Config{Vars: []string{"w"}, At: map[string]*big.Rat{"w": big.NewRat(1, 1), "x": big.NewRat(2, 1)}}); err != nil || e.Poly.String() != "x + 2" {
		t.Errorf("x at w=1, x=2: %v, %v", e, err)
	}
	// ParseList reads every expression at the point.
	list, err := ParseList("x^2; log(x)", Config{Order: 2, At: map[string]*big.Rat{"x": big.NewRat(1, 1)}})
	if err != nil || len(list) != 2 || list[0].Poly.String() != "x^2 + 2*x + 1" || list[1].Poly.String() != "-1/2*x^2 + x" {
		t.Errorf("ParseList at x=1: %v, %v", list, err)
	}
}
