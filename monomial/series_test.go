package monomial

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"strconv"
	"testing"
)

// expand parses src as a truncated series of order d in the variables vars.
func expand(t *testing.T, src string, d int, vars ...string) *Poly {
	t.Helper()
	e, err := Parse(src, Config{Vars: vars, Order: d})
	if err != nil {
		t.Fatalf("Parse(%q, order %d): %v", src, d, err)
	}
	if got := e.Poly.Degree(); got > d {
		t.Fatalf("Parse(%q, order %d) has degree %d", src, d, got)
	}
	return e.Poly
}

func factorial(n int) *big.Int {
	r := big.NewInt(1)
	for k := 2; k <= n; k++ {
		r.Mul(r, big.NewInt(int64(k)))
	}
	return r
}

// bernoulli returns B_0..B_n from their own recurrence
// Σ_{k=0}^{m} C(m+1, k) B_k = 0 for m >= 1, B_0 = 1 (common practice; the
// convention B_1 = -1/2 of Abramowitz & Stegun 1964, 23.1.2).
func bernoulli(n int) []*big.Rat {
	b := make([]*big.Rat, n+1)
	b[0] = big.NewRat(1, 1)
	for m := 1; m <= n; m++ {
		s := new(big.Rat)
		for k := range m {
			c := new(big.Int).Binomial(int64(m+1), int64(k))
			s.Add(s, new(big.Rat).Mul(new(big.Rat).SetInt(c), b[k]))
		}
		b[m] = s.Neg(s).Quo(s, big.NewRat(int64(m+1), 1))
	}
	return b
}

func TestBernoulliTable(t *testing.T) {
	// Abramowitz & Stegun 1964, Handbook of Mathematical Functions, Table
	// 23.2 (from memory): B_2 = 1/6, B_4 = -1/30, B_6 = 1/42, B_8 = -1/30,
	// B_10 = 5/66, B_12 = -691/2730, B_14 = 7/6.
	want := map[int]string{1: "-1/2", 2: "1/6", 3: "0", 4: "-1/30", 6: "1/42", 8: "-1/30", 10: "5/66", 12: "-691/2730", 14: "7/6"}
	b := bernoulli(14)
	for n, w := range want {
		if b[n].Cmp(rat(w)) != 0 {
			t.Errorf("B_%d = %v, want %s", n, b[n], w)
		}
	}
}

// univariateWant gives the expected Taylor coefficient of x^n, written
// from the published formula, never from the code under test.
type univariateWant struct {
	src    string
	source string
	coef   func(n int) *big.Rat // coefficient of x^n
}

func invFact(n int) *big.Rat { return new(big.Rat).SetFrac(big.NewInt(1), factorial(n)) }

func signed(r *big.Rat, negative bool) *big.Rat {
	if negative {
		return r.Neg(r)
	}
	return r
}

func publishedSeries() []univariateWant {
	bern := bernoulli(64)
	return []univariateWant{
		{"exp(x)", "Abramowitz & Stegun 1964, eq. 4.2.1 (from memory): e^z = Σ z^n/n!",
			invFact},
		{"log(1+x)", "Abramowitz & Stegun 1964, eq. 4.1.24 (from memory): ln(1+z) = z - z^2/2 + z^3/3 - …",
			func(n int) *big.Rat {
				if n == 0 {
					return new(big.Rat)
				}
				return signed(big.NewRat(1, int64(n)), n%2 == 0)
			}},
		{"sin(x)", "Abramowitz & Stegun 1964, eq. 4.3.65 (from memory): sin z = z - z^3/3! + z^5/5! - …",
			func(n int) *big.Rat {
				if n%2 == 0 {
					return new(big.Rat)
				}
				return signed(invFact(n), n%4 == 3)
			}},
		{"cos(x)", "Abramowitz & Stegun 1964, eq. 4.3.66 (from memory): cos z = 1 - z^2/2! + z^4/4! - …",
			func(n int) *big.Rat {
				if n%2 == 1 {
					return new(big.Rat)
				}
				return signed(invFact(n), n%4 == 2)
			}},
		{"sinh(x)", "Abramowitz & Stegun 1964, eq. 4.5.62 (from memory): sinh z = z + z^3/3! + z^5/5! + …",
			func(n int) *big.Rat {
				if n%2 == 0 {
					return new(big.Rat)
				}
				return invFact(n)
			}},
		{"cosh(x)", "Abramowitz & Stegun 1964, eq. 4.5.63 (from memory): cosh z = 1 + z^2/2! + z^4/4! + …",
			func(n int) *big.Rat {
				if n%2 == 1 {
					return new(big.Rat)
				}
				return invFact(n)
			}},
		{"tanh(x)", "Abramowitz & Stegun 1964, eq. 4.5.64 (from memory): tanh z = Σ_{n>=1} 2^{2n}(2^{2n}-1) B_{2n} z^{2n-1}/(2n)!",
			func(m int) *big.Rat {
				if m%2 == 0 {
					return new(big.Rat)
				}
				n := (m + 1) / 2
				p := new(big.Int).Lsh(big.NewInt(1), uint(2*n))      // 2^{2n}
				q := new(big.Int).Sub(p, big.NewInt(1))              // 2^{2n} - 1
				r := new(big.Rat).SetInt(new(big.Int).Mul(p, q))     // 2^{2n}(2^{2n}-1)
				r.Mul(r, bern[2*n])                                  // · B_{2n}
				return r.Quo(r, new(big.Rat).SetInt(factorial(2*n))) // / (2n)!
			}},
		{"atan(x)", "Abramowitz & Stegun 1964, eq. 4.4.42 (from memory): arctan z = z - z^3/3 + z^5/5 - …",
			func(n int) *big.Rat {
				if n%2 == 0 {
					return new(big.Rat)
				}
				return signed(big.NewRat(1, int64(n)), n%4 == 3)
			}},
		{"(1+x)^(-5/3)", "binomial series, Abramowitz & Stegun 1964, eq. 3.6.8 (from memory, number not checked): (1+z)^a = Σ a(a-1)…(a-n+1)/n! z^n",
			func(n int) *big.Rat { return generalizedBinomial(big.NewRat(-5, 3), n) }},
		{"sqrt(1+x)", "binomial series with a = 1/2 (Abramowitz & Stegun 1964, eq. 3.6.8, from memory)",
			func(n int) *big.Rat { return generalizedBinomial(big.NewRat(1, 2), n) }},
		{"1/(1-x)", "geometric series (common practice)",
			func(int) *big.Rat { return big.NewRat(1, 1) }},
	}
}

// generalizedBinomial returns a(a-1)…(a-n+1)/n! from the product formula.
func generalizedBinomial(a *big.Rat, n int) *big.Rat {
	num := big.NewRat(1, 1)
	for j := range n {
		num.Mul(num, new(big.Rat).Sub(a, big.NewRat(int64(j), 1)))
	}
	return num.Quo(num, new(big.Rat).SetInt(factorial(n)))
}

// TestPublishedSeries compares Taylor coefficients with published formulas.
func TestPublishedSeries(t *testing.T) {
	const d = 25
	for _, w := range publishedSeries() {
		p := expand(t, w.src, d, "x")
		for n := 0; n <= d; n++ {
			want := w.coef(n)
			if got := p.Coefficient(Exponent{n}); got.Cmp(want) != 0 {
				t.Errorf("%s: coefficient of x^%d = %v, want %v (%s)", w.src, n, got, want, w.source)
			}
		}
	}
}

// TestTanhTable checks the first tanh coefficients as printed in
// Abramowitz & Stegun 1964, eq. 4.5.64 (from memory):
// tanh z = z - z^3/3 + 2z^5/15 - 17z^7/315 + 62z^9/2835 - 1382z^11/155925 + …
func TestTanhTable(t *testing.T) {
	want := []string{"0", "1", "0", "-1/3", "0", "2/15", "0", "-17/315", "0", "62/2835", "0", "-1382/155925"}
	p := expand(t, "tanh(x)", 11, "x")
	for n, w := range want {
		if got := p.Coefficient(Exponent{n}); got.Cmp(rat(w)) != 0 {
			t.Errorf("tanh: coefficient of x^%d = %v, want %s", n, got, w)
		}
	}
}

// TestMultivariateComposition checks composition with multivariate
// arguments against the univariate formulas: f(x+y) has coefficient
// f_n·C(n, a) at x^a y^(n-a) (binomial theorem, common practice), and
// exp(x+y+z) has 1/(a! b! c!) (common practice).
func TestMultivariateComposition(t *testing.T) {
	const d = 9
	for _, w := range publishedSeries() {
		src := w.src
		sub := map[string]string{
			"exp(x)": "exp(x+y)", "log(1+x)": "log(1+x+y)", "sin(x)": "sin(x+y)", "cos(x)": "cos(x+y)",
			"sinh(x)": "sinh(x+y)", "cosh(x)": "cosh(x+y)", "tanh(x)": "tanh(x+y)", "atan(x)": "atan(x+y)",
			"(1+x)^(-5/3)": "(1+x+y)^(-5/3)", "sqrt(1+x)": "sqrt(1+x+y)", "1/(1-x)": "1/(1-x-y)",
		}[src]
		p := expand(t, sub, d, "x", "y")
		for n := 0; n <= d; n++ {
			for a := 0; a <= n; a++ {
				want := new(big.Rat).Mul(w.coef(n), new(big.Rat).SetInt(new(big.Int).Binomial(int64(n), int64(a))))
				if got := p.Coefficient(Exponent{a, n - a}); got.Cmp(want) != 0 {
					t.Fatalf("%s: coefficient of x^%d y^%d = %v, want %v", sub, a, n-a, got, want)
				}
			}
		}
	}
	p := expand(t, "exp(x+y+z)", 6, "x", "y", "z")
	if p.Len() != 84 { // monomials of degree <= 6 in 3 variables: C(9, 3)
		t.Errorf("exp(x+y+z) to order 6 has %d terms, want 84", p.Len())
	}
	for e, c := range p.All() {
		want := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Mul(factorial(e[0]), new(big.Int).Mul(factorial(e[1]), factorial(e[2]))))
		if c.Cmp(want) != 0 {
			t.Errorf("exp(x+y+z): coefficient of %v = %v, want %v", e, c, want)
		}
	}
	// Argument of order 2: log(1+x*y) = x y - x^2 y^2/2 + x^3 y^3/3 (A&S 4.1.24).
	if got, want := expand(t, "log(1+x*y)", 7, "x", "y").String(), "1/3*x^3*y^3 - 1/2*x^2*y^2 + x*y"; got != want {
		t.Errorf("log(1+x*y) = %s, want %s", got, want)
	}
}

// TestSeriesIdentities checks classical identities in the ring of
// truncated power series (common practice).
func TestSeriesIdentities(t *testing.T) {
	const d = 12
	for _, tc := range []struct{ lhs, rhs string }{
		{"sin(x)^2 + cos(x)^2", "1"},
		{"sin(x+y)^2 + cos(x+y)^2", "1"},
		{"exp(log(1+x))", "1+x"},
		{"exp(log(1+x+y*z))", "1+x+y*z"},
		{"log(exp(x) )", "x"}, // exp(x) has constant term 1
		{"cosh(x)^2 - sinh(x)^2", "1"},
		{"tanh(x+y)", "sinh(x+y)/cosh(x+y)"},
		{"sqrt(1+x)^2", "1+x"},
		{"sqrt(4+x*y)^2", "4+x*y"},
		{"((1+x)^(1/3))^3", "1+x"},
		{"(8+x)^(2/3)", "((8+x)^(1/3))^2"},
		{"(-8+x)^(1/3)", "-(8-x)^(1/3)"},
		{"exp(x)*exp(y)", "exp(x+y)"},
		{"exp(2*x)", "exp(x)^2"},
		{"log(1+x) + log(1+y)", "log((1+x)*(1+y))"},
		{"1/(1+x+y) * (1+x+y)", "1"},
		{"(1+x)^-3 * (1+x)^3", "1"},
		{"sin(2*x)", "2*sin(x)*cos(x)"},
		{"tanh(2*x)", "2*tanh(x)/(1+tanh(x)^2)"},
		{"atan(x) + atan(y)", "atan((x+y)/(1-x*y))"},
		{"(1+x)^10000", "(1+x)^10000"}, // exponent at the limit, via the binomial series
	} {
		l := expand(t, tc.lhs, d, "x", "y", "z")
		r := expand(t, tc.rhs, d, "x", "y", "z")
		if !l.Equal(r) {
			t.Errorf("%s = %v\n%s = %v", tc.lhs, l, tc.rhs, r)
		}
	}
}

// derivative returns ∂p/∂x_i (written here for the tests).
func derivative(p *Poly, i int) *Poly {
	r := Zero(p.Vars())
	for e, c := range p.All() {
		if e[i] == 0 {
			continue
		}
		c.Mul(c, big.NewRat(int64(e[i]), 1))
		e[i]--
		r = r.Add(Monomial(p.Vars(), e, c))
	}
	return r
}

// TestDerivativeIdentities checks d/dx of series against known derivatives
// (common practice): atan' = 1/(1+x^2), tanh' = 1 - tanh^2, log(1+x)' =
// 1/(1+x), exp' = exp, sqrt(1+x)' = 1/(2 sqrt(1+x)).
func TestDerivativeIdentities(t *testing.T) {
	const d = 14
	for _, tc := range []struct{ f, df string }{
		{"atan(x)", "1/(1+x^2)"},
		{"atan(x*y+x)", "(y+1)/(1+(x*y+x)^2)"},
		{"tanh(x)", "1 - tanh(x)^2"},
		{"log(1+x)", "1/(1+x)"},
		{"exp(x+y)", "exp(x+y)"},
		{"sqrt(1+x)", "1/(2*sqrt(1+x))"},
		{"sin(x)", "cos(x)"},
		{"cosh(x)", "sinh(x)"},
	} {
		got := derivative(expand(t, tc.f, d, "x", "y"), 0)
		want := expand(t, tc.df, d-1, "x", "y")
		if !got.Truncate(d - 1).Equal(want) {
			t.Errorf("d/dx %s = %v, want %s = %v", tc.f, got, tc.df, want)
		}
	}
}

// TestTruncatedFlag checks when an expansion is reported exact.
func TestTruncatedFlag(t *testing.T) {
	for _, tc := range []struct {
		src       string
		order     int
		truncated bool
		want      string
	}{
		{"x^2 + y", 0, false, "x^2 + y"},
		{"x^2 + y", 2, false, "x^2 + y"},
		// Exact polynomials keep their terms above the order.
		{"x^3 + y", 2, false, "x^3 + y"},
		{"x*y", 1, false, "x*y"},
		{"(1+x)^2", 2, false, "x^2 + 2*x + 1"},
		{"(1+x)^3", 2, false, "x^3 + 3*x^2 + 3*x + 1"},
		{"x/2", 1, false, "1/2*x"},
		{"x/(1/2)", 1, false, "2*x"},
		{"1/(1+x)", 1, true, "-x + 1"},
		{"exp(0)", 3, false, "1"},
		{"exp(x)", 1, true, "x + 1"},
		{"0*exp(x)", 3, false, "0"},
		{"exp(x) - exp(x)", 3, true, "0"},
		{"(x^2)^2", 4, false, "x^4"},
		{"(x^2)^3", 4, false, "x^6"},
		{"4^(1/2)*x", 1, false, "2*x"},
	} {
		e, err := Parse(tc.src, Config{Order: tc.order})
		if err != nil {
			t.Errorf("%q: %v", tc.src, err)
			continue
		}
		if e.Truncated != tc.truncated || e.Poly.String() != tc.want || e.Order != tc.order {
			t.Errorf("%q order %d: got %v, truncated %v; want %s, truncated %v", tc.src, tc.order, e.Poly, e.Truncated, tc.want, tc.truncated)
		}
	}
}

func TestUnivariateHelpers(t *testing.T) {
	// Integer roots, checked against squares and cubes built here.
	for _, tc := range []struct {
		n    string
		q    int
		root string
		ok   bool
	}{
		{"0", 3, "0", true}, {"1", 7, "1", true}, {"16", 2, "4", true}, {"17", 2, "4", false},
		{"1000000000000000000000000000000", 3, "10000000000", true}, {"2", 100, "", false},
		{"1267650600228229401496703205376", 100, "2", true}, // 2^100
	} {
		n, _ := new(big.Int).SetString(tc.n, 10)
		r, ok := intRoot(n, tc.q)
		if ok != tc.ok || (ok && r.String() != tc.root) {
			t.Errorf("intRoot(%s, %d) = %v, %v; want %s, %v", tc.n, tc.q, r, ok, tc.root, tc.ok)
		}
	}
	for _, tc := range []struct {
		c, e, want string
	}{
		{"4", "1/2", "2"}, {"4", "-3/2", "1/8"}, {"-8", "1/3", "-2"}, {"-8", "2/3", "4"}, {"-8", "-1/3", "-1/2"},
		{"9/4", "1/2", "3/2"}, {"2", "1/2", ""}, {"-4", "1/2", ""}, {"0", "-1", ""}, {"0", "1/2", "0"},
	} {
		r, ok := ratPow(rat(tc.c), rat(tc.e))
		if got := fmt.Sprint(ok); (tc.want == "") == ok || (ok && r.Cmp(rat(tc.want)) != 0) {
			t.Errorf("ratPow(%s, %s) = %v (ok %s), want %q", tc.c, tc.e, r, got, tc.want)
		}
	}
}

// TestExactTermsKept: in series mode the exact polynomial parts of an
// expression keep their terms above the order, and only the parts that
// involve a series are truncated. Expected values are derived by hand in
// the comments.
func TestExactTermsKept(t *testing.T) {
	for _, tc := range []struct {
		src       string
		order     int
		want      string
		truncated bool
	}{
		// Both terms are exact: nothing is dropped.
		{"x^2 + y^10", 8, "y^10 + x^2", false},
		{"x^2 + y^10 - y^10", 8, "x^2", false},
		{"(x^2 + y^10)/2", 8, "1/2*y^10 + 1/2*x^2", false},
		{"(x^2 + y^10)*(1 + z^7)", 3, "y^10*z^7 + y^10 + x^2*z^7 + x^2", false},
		// cos(z) is a truncated series (1 - z^2/2 + z^4/24 at order 4), so
		// the product is truncated at 4. Every term of x^10*cos(z) has
		// degree >= 10 > 4, so the truncated product is 0, and the value
		// minus 0 has only terms of degree > 4 as required. Keeping x^10,
		// -1/2*x^10*z^2, … would show terms above the order with missing
		// companions (x^10*z^6 is absent at order 4), hence the rule.
		{"x^10*cos(z)", 4, "0", true},
		// tanh x = x - x^3/3 + O(x^5) (A&S 4.5.64), so tanh(x)^2 = x^2 -
		// 2/3*x^4 + O(x^6); the exact summand y^10 is kept whole.
		{"tanh(x)^2 + y^10", 4, "y^10 - 2/3*x^4 + x^2", true},
		// exp(x) = 1 + x + x^2/2 + x^3/6 + O(x^4) (A&S 4.2.1); times 1 + y^9,
		// every y^9 term has degree >= 9 > 3.
		{"exp(x)*(1+y^9)", 3, "1/6*x^3 + 1/2*x^2 + x + 1", true},
		// A sum keeps the exact terms of its summands, also under a sign
		// or a constant factor, which scales them without making them
		// incomplete.
		{"-(tanh(x) + y^10)", 4, "-y^10 + 1/3*x^3 - x", true},
		{"2*(tanh(x) + y^10)", 4, "2*y^10 - 2/3*x^3 + 2*x", true},
		{"(tanh(x) + y^10)*3", 4, "3*y^10 - x^3 + 3*x", true},
		{"(tanh(x) + y^10)/2", 4, "1/2*y^10 - 1/6*x^3 + 1/2*x", true},
		// Any other operation with an inexact operand truncates at the order.
		{"(tanh(x) + y^10)^2", 4, "-2/3*x^4 + x^2", true},
		{"exp(y^10)", 4, "1", true},
		// Exact powers whose expansion would exceed the default limits are
		// truncated instead: (x+y+z)^5000 has only terms of degree 5000,
		// and (1+x)^10000 = 1 + 10000 x + C(10000, 2) x^2 + … with
		// C(10000, 2) = 10000·9999/2 = 49995000.
		{"(x+y+z)^5000", 3, "0", true},
		{"(1+x)^10000", 2, "49995000*x^2 + 10000*x + 1", true},
	} {
		e, err := Parse(tc.src, Config{Order: tc.order})
		if err != nil {
			t.Errorf("%q order %d: %v", tc.src, tc.order, err)
			continue
		}
		if got := e.Poly.String(); got != tc.want || e.Truncated != tc.truncated {
			t.Errorf("%q order %d = %s (truncated %v), want %s (truncated %v)", tc.src, tc.order, got, e.Truncated, tc.want, tc.truncated)
		}
	}
}

// TestExactPowerAllTerms: (x+y)^12 at order 3 keeps all 13 terms, with the
// binomial coefficients C(12, k) (binomial theorem, common practice).
func TestExactPowerAllTerms(t *testing.T) {
	e, err := Parse("(x+y)^12", Config{Order: 3})
	if err != nil {
		t.Fatal(err)
	}
	if e.Truncated || e.Poly.Len() != 13 {
		t.Fatalf("(x+y)^12 at order 3: %d terms, truncated %v; want 13 terms, exact", e.Poly.Len(), e.Truncated)
	}
	for k := 0; k <= 12; k++ {
		want := new(big.Rat).SetInt(new(big.Int).Binomial(12, int64(k)))
		if got := e.Poly.Coefficient(Exponent{k, 12 - k}); got.Cmp(want) != 0 {
			t.Errorf("coefficient of x^%d*y^%d = %v, want C(12,%d) = %v", k, 12-k, got, k, want)
		}
	}
}

// randomMixed returns a random expression in x, y, z mixing exact
// polynomials (with terms of degree up to 9) and series (functions,
// divisions and fractional powers whose arguments vanish at 0 or have
// constant term 1).
func randomMixed(r *rand.Rand, depth int) string {
	vars := []string{"x", "y", "z"}
	v := func() string { return vars[r.IntN(3)] }
	if depth == 0 || r.IntN(4) == 0 {
		switch r.IntN(3) {
		case 0:
			return v()
		case 1:
			return strconv.Itoa(1 + r.IntN(3))
		}
		return v() + "^" + strconv.Itoa(2+r.IntN(8))
	}
	sub := func() string { return randomMixed(r, depth-1) }
	switch r.IntN(10) {
	case 0:
		return "(" + sub() + " + " + sub() + ")"
	case 1:
		return "(" + sub() + " - " + sub() + ")"
	case 2, 3:
		return sub() + "*" + sub()
	case 4:
		return "(" + sub() + ")^" + strconv.Itoa(r.IntN(4))
	case 5:
		fn := []string{"exp", "sin", "cos", "tanh", "atan", "sinh"}[r.IntN(6)]
		return fn + "(" + v() + "*(" + sub() + "))"
	case 6:
		return "log(1 + " + v() + "*(" + sub() + "))"
	case 7:
		return "(" + sub() + ")/(1 + " + v() + "*(" + sub() + "))"
	case 8:
		return "(1 + " + v() + "*(" + sub() + "))^(" + []string{"-1/2", "1/3", "-2"}[r.IntN(3)] + ")"
	}
	return "(" + sub() + ")/3"
}

// TestSeriesInvariantRandom checks the invariant of series mode on random
// expressions: the value minus Poly has only terms of degree > Order, so
// the expansions at orders D and D+k agree on all terms of degree <= D; an
// expansion that is not truncated is the value itself, so it is the same
// at every order and equal to the polynomial-mode result when that exists.
// Whether an expansion is truncated depends on the expression only (these
// are far inside the limits).
func TestSeriesInvariantRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(21, 22))
	vars := []string{"x", "y", "z"}
	exact, inexact := 0, 0
	for range 400 {
		src := randomMixed(r, 3)
		d := 1 + r.IntN(5)
		k := 1 + r.IntN(3)
		lo, err := Parse(src, Config{Vars: vars, Order: d})
		if err != nil {
			t.Fatalf("%q order %d: %v", src, d, err)
		}
		hi, err := Parse(src, Config{Vars: vars, Order: d + k})
		if err != nil {
			t.Fatalf("%q order %d: %v", src, d+k, err)
		}
		if !lo.Poly.Truncate(d).Equal(hi.Poly.Truncate(d)) {
			t.Fatalf("%q: order %d gives %v, order %d gives %v", src, d, lo.Poly, d+k, hi.Poly)
		}
		if lo.Truncated != hi.Truncated {
			t.Fatalf("%q: truncated %v at order %d but %v at order %d", src, lo.Truncated, d, hi.Truncated, d+k)
		}
		if lo.Truncated {
			inexact++
			continue
		}
		exact++
		if !lo.Poly.Equal(hi.Poly) {
			t.Fatalf("%q exact: order %d gives %v, order %d gives %v", src, d, lo.Poly, d+k, hi.Poly)
		}
		if p0, err := Parse(src, Config{Vars: vars}); err == nil && !p0.Poly.Equal(lo.Poly) {
			t.Fatalf("%q exact: order %d gives %v, polynomial mode %v", src, d, lo.Poly, p0.Poly)
		}
	}
	t.Logf("%d exact, %d truncated", exact, inexact)
	if exact < 40 || inexact < 40 {
		t.Errorf("weak sample: %d exact and %d truncated expressions", exact, inexact)
	}
}
