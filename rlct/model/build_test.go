package model

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/sbic"
	"gonum.org/v1/gonum/mat"
)

// mustBuild parses and builds a description, failing the test on an error.
func mustBuild(t *testing.T, src string) *Model {
	t.Helper()
	d, err := Parse(src)
	if err != nil {
		t.Fatalf("%s\n%v", src, err)
	}
	m, err := Build(context.Background(), d, nil)
	if err != nil {
		t.Fatalf("%s\n%v", src, err)
	}
	return m
}

// expanded returns K = Σ c_i·g_i² as one polynomial.
func expanded(m *Model) *monomial.Poly {
	p := m.Problem
	k := monomial.Zero(m.Vars())
	for i, g := range p.Generators {
		k = k.Add(g.Mul(g).Scale(p.GeneratorWeights[i]))
	}
	return k
}

// poly parses a polynomial written by a test in the given variables.
func poly(t *testing.T, vars []string, src string) *monomial.Poly {
	t.Helper()
	ex, err := monomial.Parse(src, monomial.Config{Vars: vars})
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	if got := ex.Poly.Vars(); strings.Join(got, ",") != strings.Join(vars, ",") {
		t.Fatalf("%s: variables %v, want %v", src, got, vars)
	}
	return ex.Poly
}

// frobenius writes ‖B·A − C‖²/(2σ²) as text for monomial.Parse, entry by
// entry, with the model's variable names: an independent way to write K of
// reduced-rank regression.
func frobenius(n, h, m int, c [][]*big.Rat, sigma2 string) string {
	var terms []string
	for i := range n {
		for j := range m {
			var prods []string
			for k := range h {
				prods = append(prods, fmt.Sprintf("B_%d_%d*A_%d_%d", i+1, k+1, k+1, j+1))
			}
			cij := "0"
			if c != nil {
				cij = c[i][j].RatString()
			}
			terms = append(terms, fmt.Sprintf("(%s - (%s))^2", strings.Join(prods, " + "), cij))
		}
	}
	return "(" + strings.Join(terms, " + ") + ")/(2*(" + sigma2 + "))"
}

// TestReducedRankSquareSum checks that reduced-rank regression built from
// matrix parameters with standard normal inputs is K = ‖BA − B*A*‖²/(2σ²)
// exactly. Derivation (common practice): with D = BA − B*A*,
// E_x‖Dx‖² = tr(D·E[xxᵀ]·Dᵀ) = tr(DDᵀ) = ‖D‖² since E[xxᵀ] = I, and the
// divergence of N(BAx, σ²I) from N(B*A*x, σ²I) is ‖Dx‖²/(2σ²).
func TestReducedRankSquareSum(t *testing.T) {
	cases := []struct {
		m, n, h int
		truth   [][]int64 // N×M, nil for 0
		sigma2  string
		b, a    string // truth of B and A in the description
	}{
		{3, 2, 1, nil, "1/2", "", ""},
		{2, 3, 2, nil, "3/2", "", ""},
		{3, 3, 2, [][]int64{{1, 0, 0}, {0, 0, 0}, {0, 0, 0}}, "1", "[1, 0; 0, 0; 0, 0]", "[1, 0, 0; 0, 0, 0]"},
		{2, 2, 2, [][]int64{{2, -1}, {4, -2}}, "1/4", "[1, 0; 2, 0]", "[2, -1; 0, 0]"},
	}
	for _, c := range cases {
		name := fmt.Sprintf("M=%d,N=%d,H=%d", c.m, c.n, c.h)
		t.Run(name, func(t *testing.T) {
			src := fmt.Sprintf("kind regression\nparam B[%d,%d], A[%d,%d]\ninput x[%d] ~ normal\nnoise %s\nmean B*A*x\n", c.n, c.h, c.h, c.m, c.m, c.sigma2)
			var truth [][]*big.Rat
			if c.truth != nil {
				src += fmt.Sprintf("truth B = %s, A = %s\n", c.b, c.a)
				for _, row := range c.truth {
					var r []*big.Rat
					for _, v := range row {
						r = append(r, big.NewRat(v, 1))
					}
					truth = append(truth, r)
				}
			}
			m := mustBuild(t, src)
			want := poly(t, m.Vars(), frobenius(c.n, c.h, c.m, truth, c.sigma2))
			if got := expanded(m); !got.Equal(want) {
				t.Errorf("K = %s\nwant %s", got, want)
			}
			// The same through the constructor (σ² = 1/2).
			if truth == nil {
				truth = make([][]*big.Rat, c.n)
				for i := range truth {
					truth[i] = make([]*big.Rat, c.m)
					for j := range truth[i] {
						truth[i][j] = new(big.Rat)
					}
				}
			}
			dense := mat.NewDense(c.n, c.m, nil)
			for i := range c.n {
				for j := range c.m {
					f, _ := truth[i][j].Float64()
					dense.Set(i, j, f)
				}
			}
			d, err := ReducedRankAt(c.h, dense)
			if err != nil {
				t.Fatal(err)
			}
			mc, err := Build(context.Background(), d, nil)
			if err != nil {
				t.Fatal(err)
			}
			want = poly(t, mc.Vars(), frobenius(c.n, c.h, c.m, truth, "1/2"))
			if got := expanded(mc); !got.Equal(want) {
				t.Errorf("constructor: K = %s\nwant %s", got, want)
			}
		})
	}
}

// TestReducedRankAoyagiWatanabe compares the bounds lctkit certifies for
// reduced-rank regression built from a description with the closed form of
// Aoyagi & Watanabe (2005, Neural Networks 18, main theorem; the formula in
// package sbic is from memory). For H = 1 at the truth 0, K = ‖b‖²·‖a‖² is
// a product of two definite forms (normal crossings) and the bound must be
// exact and equal to it; everywhere else it must be a certified bound that
// is never below it (a larger λ, or an equal λ with a θ no larger).
func TestReducedRankAoyagiWatanabe(t *testing.T) {
	shapes := [][4]int{ // M, N, H, r
		{1, 1, 1, 0}, {2, 1, 1, 0}, {1, 3, 1, 0}, {2, 2, 1, 0}, {3, 2, 1, 0}, {3, 3, 1, 0}, {4, 2, 1, 0},
		{2, 2, 1, 1}, {3, 2, 1, 1},
		{2, 2, 2, 0}, {3, 2, 2, 0}, {2, 3, 2, 0}, {3, 3, 2, 0}, {2, 2, 2, 1}, {3, 3, 2, 1}, {3, 2, 2, 2},
		{4, 4, 2, 0}, {4, 4, 3, 0}, {4, 3, 3, 1}, {5, 3, 2, 0}, {4, 4, 3, 2},
	}
	if testing.Short() {
		shapes = shapes[:9]
	}
	for _, s := range shapes {
		m, n, h, r := s[0], s[1], s[2], s[3]
		t.Run(fmt.Sprintf("M=%d,N=%d,H=%d,r=%d", m, n, h, r), func(t *testing.T) {
			d, err := ReducedRank(m, n, h, r)
			if err != nil {
				t.Fatal(err)
			}
			mod, err := Build(context.Background(), d, nil)
			if err != nil {
				t.Fatal(err)
			}
			res, err := mod.Bound(context.Background(), nil)
			if err != nil {
				t.Fatal(err)
			}
			want, err := sbic.ReducedRank(m, n, h, r)
			if err != nil {
				t.Fatal(err)
			}
			if !isBound(res.Status) {
				t.Fatalf("status %s, want a certified bound", res.Status)
			}
			if h == 1 && r == 0 {
				if res.Status != rlct.Exact || res.Lambda.Cmp(want.Lambda) != 0 || res.Theta != want.Theta {
					t.Errorf("got (%s, %d, %s), want exact (%s, %d)", res.Lambda.RatString(), res.Theta, res.Status, want.Lambda.RatString(), want.Theta)
				}
				return
			}
			switch c := res.Lambda.Cmp(want.Lambda); {
			case c < 0, c == 0 && res.Theta > want.Theta:
				t.Errorf("bound (%s, %d) lies below the formula's (%s, %d)", res.Lambda.RatString(), res.Theta, want.Lambda.RatString(), want.Theta)
			}
		})
	}
}

// tanhDesigns are input laws for the one-unit tanh regression.
var tanhDesigns = []string{
	"design { -1: 1/4, 1/2: 1/4, 2: 1/2 }",
	"design { 0: 1/2, 3: 1/2 }",
	"uniform(-1, 1)",
	"uniform(0, 1/2)",
}

// TestTanhOneUnit checks f(x) = a·tanh(b·x) at the truth a = b = 0:
// exact λ = 1/2, θ = 2. Derivation: tanh(bx) = bx·u(bx) with u(s) =
// tanh(s)/s = 1 − s²/3 + … analytic and u(0) = 1, so
// K = a²b²·E_x[x²·u(bx)²]/(2σ²) = a²b²·U(b) with U(0) = E[x²]/(2σ²) > 0
// whenever x is not 0 almost surely (on these laws x is bounded, so U is
// analytic near 0). K is a normal crossing a²b² times a positive unit, and
// ∫∫ (a²b²)^z da db near 0 has its largest pole at z = −1/2 with order 2,
// each variable giving −1/2 (Watanabe 2009, Algebraic Geometry and
// Statistical Learning Theory, normal crossing case): λ = 1/2, θ = 2.
func TestTanhOneUnit(t *testing.T) {
	for _, law := range tanhDesigns {
		for _, order := range []int{2, 4, 7} {
			src := fmt.Sprintf("kind regression\nparam a, b\ninput x ~ %s\nnoise 1\nmean a*tanh(b*x)\norder %d\n", law, order)
			m := mustBuild(t, src)
			if !m.Offsets || !m.Problem.Truncated || len(m.Problem.Remainder) == 0 {
				t.Errorf("%s order %d: a series should be truncated with a remainder, got %+v", law, order, m.Problem)
			}
			r, err := m.Bound(context.Background(), nil)
			if err != nil {
				t.Fatal(err)
			}
			if r.Lambda.Cmp(big.NewRat(1, 2)) != 0 || r.Theta != 2 || r.Status != rlct.Exact {
				t.Errorf("%s order %d: got (%s, %d, %s) %q, want exact (1/2, 2)", law, order, r.Lambda.RatString(), r.Theta, r.Status, r.Reasons)
			}
		}
	}
}

// TestTanhSeriesTerms checks the generators of a tanh regression on a
// design against the Taylor series tanh(s) = s − s³/3 + 2s⁵/15 − …
// (common practice): at x = 2 with weight 1/2 and σ² = 1, the generator is
// a·tanh(2b) = 2ab − 8/3·ab³ + 64/15·ab⁵ to order 6, weight 1/4.
func TestTanhSeriesTerms(t *testing.T) {
	m := mustBuild(t, "kind regression\nparam a, b\ninput x ~ design { 2: 1/2, 0: 1/2 }\nnoise 1\nmean a*tanh(b*x)\norder 6\n")
	want := poly(t, []string{"a", "b"}, "2*a*b - 8/3*a*b^3 + 64/15*a*b^5")
	if len(m.Problem.Generators) != 1 || !m.Problem.Generators[0].Equal(want) {
		t.Fatalf("generators %v, want [%s] (the point x = 0 gives 0)", m.Problem.Generators, want)
	}
	if w := m.Problem.GeneratorWeights[0]; w.Cmp(big.NewRat(1, 4)) != 0 {
		t.Errorf("weight %s, want 1/2 / (2·1) = 1/4", w.RatString())
	}
	if rem := m.RemainderStrings(); len(rem) != 1 || rem[0] != "a*b^7" {
		t.Errorf("remainder %v, want [a*b^7] (tanh's next term is of degree 7 in b)", rem)
	}
}

// TestMomentLaws checks K for inputs integrated out under each law against
// expectations worked by hand from the moments (common practice): uniform
// on (−1, 1): E x^(2k) = 1/(2k+1), odd moments 0; uniform on (0, 1):
// E x^k = 1/(k+1); N(μ, v): E x = μ, E x² = μ² + v; N(0, 1): E x² = 1,
// E x³ = 0, E x⁴ = 3.
func TestMomentLaws(t *testing.T) {
	cases := []struct {
		name, src string
		vars      []string
		k         string
	}{
		{"uniform on (-1, 1)", "input x ~ uniform(-1, 1)\nnoise 1/2\nmean a*x + b*x^3",
			[]string{"a", "b"}, "a^2/3 + 2*a*b/5 + b^2/7"},
		{"normal(1, 2) with an intercept", "input x ~ normal(1, 2)\nnoise 1\nmean a*x + b",
			[]string{"a", "b"}, "(3*a^2 + 2*a*b + b^2)/2"},
		{"normal(1, 2) at a truth", "input x ~ normal(1, 2)\nnoise 1\nmean a*x + b\ntruth a = 1, b = 2",
			[]string{"a", "b"}, "(3*(a-1)^2 + 2*(a-1)*(b-2) + (b-2)^2)/2"},
		{"standard normal, a square", "input x ~ normal\nnoise 2\nmean a*x^2 + b*x",
			[]string{"a", "b"}, "(3*a^2 + b^2)/4"},
		{"a joint moment table", "input x[2] ~ moments { (2, 0): 1, (1, 1): 1/2, (0, 2): 2 }\nnoise 1/2\nmean a*x[1] + b*x[2]",
			[]string{"a", "b"}, "a^2 + a*b + 2*b^2"},
		{"two independent inputs", "input x ~ uniform(0, 1)\ninput z ~ normal\nnoise 1/2\nmean a*x*z + b*x",
			// E[x²]E[z²]a² + 2ab·E[x²]E[z] + b²E[x²]
			[]string{"a", "b"}, "a^2/3 + b^2/3"},
		{"two designs", "input x ~ design { 0: 1/2, 1: 1/2 }\ninput c ~ design { 1: 1/3, 2: 2/3 }\nnoise 1/2\nmean a*x*c + b*c",
			// E[(a x c + b c)²] = E[c²]·E[(a x + b)²] = 3·(a²/2 + a b + b²)
			[]string{"a", "b"}, "3*(a^2/2 + a*b + b^2)"},
		{"a design and a normal input", "input x ~ design { 1: 1/2, -1: 1/2 }\ninput z ~ normal\nnoise 1/2\nmean a*x + b*z",
			[]string{"a", "b"}, "a^2 + b^2"},
		{"two outputs", "input x ~ normal\nnoise 1/2\nmean [a*x; b*x + a]",
			[]string{"a", "b"}, "a^2 + b^2 + a^2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := mustBuild(t, "kind regression\nparam a, b\n"+c.src+"\n")
			want := poly(t, c.vars, c.k)
			if got := expanded(m); !got.Equal(want) {
				t.Errorf("K = %s, want %s", got, want)
			}
		})
	}
}

// TestDiscreteK checks the weighted sum of squares of discrete models by
// hand: Σ_k (p_k − q_k)²/(2q_k), averaged over the input's design.
func TestDiscreteK(t *testing.T) {
	cases := []struct {
		name, src, k string
	}{
		// q = (1/3, 2/3): (ab)²/(2/3) + (ab)²/(4/3) = 9/4·a²b².
		{"a coin", "category h = 1/3 + a*b\ncategory t = 2/3 - a*b", "9/4*a^2*b^2"},
		// Given c = 1 (weight 1/2): q = (1/2, 1/2), 2·a²/(2·1/2) = 2a²,
		// times 1/2; given c = 0 the same with b.
		{"a coin given an input", "input c ~ design { 0: 1/2, 1: 1/2 }\ncategory h = 1/2 + a*c + b*(1 - c)\ncategory t = 1/2 - a*c - b*(1 - c)", "a^2 + b^2"},
		// Three categories as a vector, q = (1/4, 1/4, 1/2):
		// 2a² + 2b² + (a+b)².
		{"a vector of categories", "category y = [1/4 + a; 1/4 + b; 1/2 - a - b]", "2*a^2 + 2*b^2 + (a + b)^2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := mustBuild(t, "kind discrete\nparam a, b\n"+c.src+"\n")
			if got, want := expanded(m), poly(t, []string{"a", "b"}, c.k); !got.Equal(want) {
				t.Errorf("K = %s, want %s", got, want)
			}
		})
	}
}

// TestBinomialMixture checks the counts of a binomial mixture: with
// a·Bin(2, 1/2 + p) + (1 − a)·Bin(2, 1/2) at p = 0, q = (1/4, 1/2, 1/4) and
// p_y − q_y = a·(C(2,y)(1/2+p)^y(1/2−p)^(2−y) − q_y): y = 0: a(−p + p²),
// y = 1: −2a·p², y = 2: a(p + p²) (by hand). K = Σ (p_y − q_y)²/(2q_y).
func TestBinomialMixture(t *testing.T) {
	m := mustBuild(t, "kind mixture\nparam a, p\ncomponent binomial(2, 1/2 + p) weight a\ncomponent binomial(2, 1/2) weight 1 - a\n")
	want := poly(t, []string{"a", "p"}, "2*(a*(p^2 - p))^2 + (2*a*p^2)^2 + 2*(a*(p + p^2))^2")
	if got := expanded(m); !got.Equal(want) {
		t.Errorf("K = %s, want %s", got, want)
	}
}

// TestPoissonGenerators checks the moment generators of a Poisson mixture
// at a·Poisson(2 + m) + (1 − a)·Poisson(2): g_k = a·m^k with weights
// 1/(2·k!·2^k) (buildMixture), and the generators left out, a·m^k for
// k > D, give the remainder a·m^(D+1).
func TestPoissonGenerators(t *testing.T) {
	m := mustBuild(t, "kind mixture\nparam a, m\ncomponent poisson(2 + m) weight a\ncomponent poisson(2) weight 1 - a\norder 3\n")
	weights := []*big.Rat{big.NewRat(1, 4), big.NewRat(1, 16), big.NewRat(1, 96)}
	for k, g := range m.Problem.Generators {
		want := poly(t, []string{"a", "m"}, fmt.Sprintf("a*m^%d", k+1))
		if !g.Equal(want) || m.Problem.GeneratorWeights[k].Cmp(weights[k]) != 0 {
			t.Errorf("generator %d: %s·(%s)², want %s·(%s)²", k+1, m.Problem.GeneratorWeights[k].RatString(), g, weights[k].RatString(), want)
		}
	}
	if rem := m.RemainderStrings(); len(rem) != 1 || rem[0] != "a*m^4" {
		t.Errorf("remainder %v, want [a*m^4]", rem)
	}
	// K ≍ a²m²: normal crossings, λ = 1/2 with θ = 2 (as TestTanhOneUnit).
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Lambda.Cmp(big.NewRat(1, 2)) != 0 || r.Theta != 2 || r.Status != rlct.Exact {
		t.Errorf("got (%s, %d, %s), want exact (1/2, 2)", r.Lambda.RatString(), r.Theta, r.Status)
	}
}

// TestSeriesAtATruth checks a series expanded at a truth away from 0: with
// a* = 1, b* = 0, f = a·tanh(b·x) is (1 + u)·tanh(b·x) in the offset u, so
// K ≍ b² and, with the prior ∝ |b|¹ (h = 1 counts only at b* = 0, where
// τ_b = 2), λ = τ_b/2 = 1 with θ = 1 (a regular direction with a prior
// exponent, common practice). The prior exponent of a is dropped, a* ≠ 0.
func TestSeriesAtATruth(t *testing.T) {
	m := mustBuild(t, "kind regression\nparam a, b prior 1\ninput x ~ design { 1: 1/2, -2: 1/2 }\nnoise 1\nmean a*tanh(b*x)\ntruth a = 1\norder 4\n")
	if !m.Offsets || m.Problem.Points != nil {
		t.Fatalf("offsets %v, points %v: want a series in offsets", m.Offsets, m.Problem.Points)
	}
	if m.Problem.Prior[0].Sign() != 0 || m.Problem.Prior[1].Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("prior %v, want [0 1]", m.Problem.Prior)
	}
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Lambda.Cmp(big.NewRat(1, 1)) != 0 || r.Theta != 1 || r.Status != rlct.Exact {
		t.Errorf("got (%s, %d, %s) %q, want exact (1, 1)", r.Lambda.RatString(), r.Theta, r.Status, r.Reasons)
	}
}

// TestSeveralTruths checks a polynomial model with two truths of one true
// distribution: f = a·b·x is 0 at (0, 0) and at (0, 1). At (0, 0), K =
// a²b²/2 gives (1/2, 2); at (0, 1), K = a²(1 + v)²/2 ≍ a² gives (1/2, 1);
// the minimum is (1/2, 2) (the larger θ), exact.
func TestSeveralTruths(t *testing.T) {
	m := mustBuild(t, "kind regression\nparam a, b\ninput x ~ normal\nnoise 1\nmean a*b*x\ntruth a = 0, b = 0\ntruth b = 1\n")
	if len(m.Problem.Points) != 2 || m.Offsets {
		t.Fatalf("points %v, offsets %v", m.Problem.Points, m.Offsets)
	}
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Locals) != 2 || r.Lambda.Cmp(big.NewRat(1, 2)) != 0 || r.Theta != 2 || r.Status != rlct.Exact {
		t.Errorf("got (%s, %d, %s) with %d locals, want exact (1/2, 2) over 2 points", r.Lambda.RatString(), r.Theta, r.Status, len(r.Locals))
	}
	if l := r.Locals[1]; l.Lambda.Cmp(big.NewRat(1, 2)) != 0 || l.Theta != 1 {
		t.Errorf("at (0, 1): (%s, %d), want (1/2, 1)", l.Lambda.RatString(), l.Theta)
	}
}

// buildErrors are descriptions that parse but cannot be built, with the
// position and a part of the message.
var buildErrors = []struct {
	name, src, pos, msg, setting string
}{
	{"a parameter that does not enter", "kind regression\nparam a, b, c\ninput x ~ normal\nnoise 1\nmean a*b*x",
		"2:13", "the parameter c does not enter the model", ""},
	{"a matrix entry that does not enter", "kind regression\nparam B[2,2]\ninput x[2] ~ normal\nnoise 1\nmean B[1,1]*x[1] + B[2,1]*x[2] + B[1,2]",
		"2:7", "the parameter B[2,2] does not enter", ""},
	{"a model without parameters in K", "kind regression\nparam a\ninput x ~ normal\nnoise 1\nmean x",
		"1:1", "K is identically zero", ""},
	{"truths of two distributions", "kind regression\nparam a, b\ninput x ~ normal\nnoise 1\nmean a*x + b\ntruth a = 1\ntruth b = 1",
		"7:1", "another regression function than the first", ""},
	{"a series at two truths", "kind regression\nparam a, b\ninput x ~ uniform(0, 1)\nnoise 1\nmean a*tanh(b*x)\norder 3\ntruth a = 1\ntruth a = 2",
		"8:1", "expanded at one truth", ""},
	{"a series without an order", "kind regression\nparam a, b\ninput x ~ uniform(0, 1)\nnoise 1\nmean a*tanh(b*x)",
		"5:8", "add an order statement", "Order"},
	{"a Taylor series that is not rational", "kind regression\nparam a, b\ninput x ~ design { 1: 1 }\nnoise 1\nmean a*exp(b*x + 1)\norder 3",
		"5:8", "irrational", ""},
	{"a series under a normal law", "kind regression\nparam a, b\ninput x ~ normal\nnoise 1\nmean a*tanh(b*x)\norder 3",
		"3:11", "under a normal law its expectation need not converge", ""},
	{"a series whose inputs part never ends", "kind regression\nparam a\ninput x ~ uniform(0, 1)\nnoise 1\nmean a*x + tanh(x)\norder 3",
		"5:6", "does not end", ""},
	{"a moment the table lacks", "kind regression\nparam a\ninput x ~ moments { 1: 0, 2: 1 }\nnoise 1\nmean a*x^2",
		"3:11", "E[x^4] is needed", ""},
	{"moments of no law", "kind regression\nparam a, b\ninput x ~ moments { 2: 1, 3: 2, 4: 1 }\nnoise 1\nmean a*x + b*x^2",
		"3:11", "not positive semidefinite", ""},
	{"a probability 0 at the truth", "kind discrete\nparam a\ncategory h = a\ncategory t = 1 - a",
		"3:10", "probability 0 at the truth", ""},
	{"a negative probability", "kind discrete\nparam a\ncategory h = a - 1/2\ncategory t = 3/2 - a",
		"3:10", "negative", ""},
	{"probabilities that do not sum to 1", "kind discrete\nparam a\ninput c ~ design { 1: 1 }\ncategory h = 1/2 + a*c\ncategory t = 1/2 - 2*a",
		"4:10", "the probabilities given c = 1 do not sum to 1: their sum minus 1 has the term -a", ""},
	{"a discrete truth of another distribution", "kind discrete\nparam a\ncategory h = 1/2 + a\ncategory t = 1/2 - a\ntruth a = 0\ntruth a = 1/4",
		"6:1", "another distribution than the first", ""},
	{"mixing weights that do not sum to 1", "kind mixture\nparam a, p\ncomponent bernoulli(p) weight a\ncomponent bernoulli(p) weight 1 - 2*a\ntruth p = 1/2",
		"3:11", "the mixing weights do not sum to 1", ""},
	{"a Poisson mixture without an order", "kind mixture\nparam a, m\ncomponent poisson(m) weight a\ncomponent poisson(1) weight 1 - a\ntruth m = 1",
		"3:11", "needs an order statement", ""},
	{"a Poisson mixture of two laws", "kind mixture\nparam a, m\ncomponent poisson(m) weight a\ncomponent poisson(1) weight 1 - a\ntruth a = 1/2, m = 2\norder 3",
		"4:11", "a single Poisson law", ""},
	{"a Poisson mean that is not positive", "kind mixture\nparam a, m\ncomponent poisson(m) weight a\ncomponent poisson(1) weight 1 - a\norder 3",
		"3:19", "must be positive", ""},
}

func TestBuildErrors(t *testing.T) {
	for _, c := range buildErrors {
		t.Run(c.name, func(t *testing.T) {
			d, err := Parse(c.src)
			if err != nil {
				t.Fatalf("parse: %v", err)
			}
			_, err = Build(context.Background(), d, nil)
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("got %v, want an *Error", err)
			}
			if got := fmt.Sprintf("%d:%d", e.Line, e.Col); got != c.pos || !strings.Contains(e.Msg, c.msg) || e.Setting != c.setting {
				t.Errorf("got %v (setting %q), want %s: …%s… (setting %q)", err, e.Setting, c.pos, c.msg, c.setting)
			}
			if !errors.Is(err, rlct.ErrInput) {
				t.Errorf("%v does not match rlct.ErrInput", err)
			}
		})
	}
}

// TestBuildCancelled checks that a cancelled context stops Build.
func TestBuildCancelled(t *testing.T) {
	d, err := ReducedRank(3, 3, 2, 0)
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Build(ctx, d, nil); !errors.Is(err, context.Canceled) {
		t.Errorf("got %v, want context.Canceled", err)
	}
}

// isBound reports whether s certifies a bound (Exact or UpperBound).
func isBound(s rlct.Status) bool { return s == rlct.Exact || s == rlct.UpperBound }
