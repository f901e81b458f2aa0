package rlct

import (
	"context"
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// rrGenerators returns the generators of ‖BA − B*A*‖² for reduced-rank
// regression with M inputs, N outputs and rank H (B is N×H, A is H×M) at
// the truth B* = A* = the first r unit vectors, and the point (b_kk = a_kk
// = 1 for k < r).
func rrGenerators(m, n, h, r int) ([]string, []string) {
	var gens []string
	for i := range n {
		for j := range m {
			var t []string
			for k := range h {
				t = append(t, fmt.Sprintf("b%d%d*a%d%d", i, k, k, j))
			}
			g := strings.Join(t, " + ")
			if i == j && i < r {
				g += " - 1"
			}
			gens = append(gens, g)
		}
	}
	var at []string
	for k := range r {
		at = append(at, fmt.Sprintf("b%d%d=1,a%d%d=1", k, k, k, k))
	}
	return gens, []string{strings.Join(at, ",")}
}

// Reductions with hand-derived values.
var reduceTests = []struct {
	name       string
	spec       Spec
	lambda     string
	theta      int
	status     Status
	free       []string
	reduced    bool
	noteSubstr string
}{
	// u = x − y: K = u² + z⁴, λ = 1/2 + 1/4, θ = 1, y free (hand).
	{"(x-y)^2+z^4", Spec{K: "(x-y)^2 + z^4"}, "3/4", 1, Exact, []string{"y"}, true, ""},
	// u = x − y: K = u², λ = 1/2, y free (hand).
	{"(x-y)^2", Spec{K: "(x-y)^2"}, "1/2", 1, Exact, []string{"y"}, true, ""},
	// (y − x²)²: u = y − x², core 0, x free: λ = 1/2 (hand; the Newton
	// value 3/4 is only a bound).
	{"(y-x^2)^2", Spec{K: "(y - x^2)^2"}, "1/2", 1, Exact, []string{"x"}, true, ""},
	// K = (x + y²)² + y⁶ expanded: u = x + y², λ = 1/2 + 1/6 (hand).
	{"(x+y^2)^2+y^6", Spec{K: "x^2 + 2*x*y^2 + y^4 + y^6"}, "2/3", 1, Exact, nil, true, ""},
	// Sum-of-squares form, the same function.
	{"sos x+y^2, y^3", Spec{SOS: []string{"x + y^2", "y^3"}}, "2/3", 1, Exact, nil, true, ""},
	// Three independent linear generators: a regular point, λ = 3/2
	// (hand; common practice: d/2 at a regular point). Exact without a
	// reduction (quadratic-form rule), so none is reported.
	{"sos regular", Spec{SOS: []string{"x+y+z", "x-y", "y+2*z"}}, "3/2", 1, Exact, nil, false, ""},
	// Prior |x|: y is moved instead (u = x − y), x stays, free in the
	// core; λ = 1/2 + 1/4 (hand).
	{"prior on x", Spec{SOS: []string{"x - y", "z^2"}, Prior: "x=1"}, "3/4", 1, Exact, []string{"x"}, true, ""},
	// Prior on both x and y: nothing may be moved (moving either would
	// change the prior's monomial factor), so the Newton value of
	// (x−y)² + z⁴ stays an upper bound and a note says why.
	{"prior on x and y", Spec{SOS: []string{"x - y", "z^2"}, Prior: "x=1,y=1"}, "", 0, UpperBound, nil, false, "prior has a non-zero exponent"},
	// Reduced-rank regression at a rank-r truth, r = H: the model is
	// regular there, λ = H(M+N−H)/2, θ = 1 (Aoyagi & Watanabe 2005,
	// Stochastic complexities of reduced rank regression in Bayesian
	// estimation, Neural Networks 18, main theorem at r = H; from memory,
	// as in rlct/sbic/reducedrank.go).
	{"rr 3x3 H=1 r=1", rrSpec(3, 3, 1, 1), "5/2", 1, Exact, []string{"a00"}, true, ""},
	{"rr 2x2 H=1 r=1", rrSpec(2, 2, 1, 1), "3/2", 1, Exact, []string{"a00"}, true, ""},
	{"rr 3x2 H=1 r=1", rrSpec(3, 2, 1, 1), "2", 1, Exact, []string{"a00"}, true, ""},
	{"rr 4x3 H=1 r=1", rrSpec(4, 3, 1, 1), "3", 1, Exact, []string{"a00"}, true, ""},
}

func rrSpec(m, n, h, r int) Spec {
	g, at := rrGenerators(m, n, h, r)
	return Spec{SOS: g, At: at}
}

func TestReduce(t *testing.T) {
	for _, tc := range reduceTests {
		t.Run(tc.name, func(t *testing.T) {
			p, err := tc.spec.Problem()
			if err != nil {
				t.Fatal(err)
			}
			r, err := Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatal(err)
			}
			if tc.lambda != "" {
				want, _ := new(big.Rat).SetString(tc.lambda)
				if r.Lambda.Cmp(want) != 0 || r.Theta != tc.theta {
					t.Errorf("λ = %s, θ = %d, want %s, %d", r.Lambda.RatString(), r.Theta, tc.lambda, tc.theta)
				}
			}
			if r.Status != tc.status {
				t.Errorf("status %s, want %s (reasons %q, notes %q)", r.Status, tc.status, r.Reasons, r.Notes)
			}
			if (r.Reduction != nil) != tc.reduced {
				t.Fatalf("reduction %+v, want reduced %v (notes %q)", r.Reduction, tc.reduced, r.Notes)
			}
			if tc.noteSubstr != "" && !slices.ContainsFunc(r.Notes, func(n string) bool { return strings.Contains(n, tc.noteSubstr) }) {
				t.Errorf("no note containing %q in %q", tc.noteSubstr, r.Notes)
			}
			if r.Reduction == nil {
				return
			}
			if !slices.Equal(r.Reduction.Free, tc.free) {
				t.Errorf("free %q, want %q", r.Reduction.Free, tc.free)
			}
			if r.Reduction.Unreduced.Lambda == nil {
				t.Error("no unreduced value")
			}
		})
	}
}

// TestReduceAgreesWhenExact runs the reduction on functions whose Newton
// value is already exact: both must give the same pair (the reduction is
// skipped in Bound then, so it is called directly here).
func TestReduceAgreesWhenExact(t *testing.T) {
	for _, sp := range []Spec{
		{K: "x^2 + y^4"},
		{K: "x^2 + y^2 + z^6"},
		{K: "x^2 + x*y + y^2 + z^2"},
		{K: "x^2 + y^4*z^2 + z^8"},
		{SOS: []string{"x", "y^2", "x*y"}},
		{SOS: []string{"x + y*z", "y + x*z"}},
	} {
		p, err := sp.Problem()
		if err != nil {
			t.Fatal(err)
		}
		ls, err := p.Locals()
		if err != nil {
			t.Fatal(err)
		}
		plain, err := boundPlain(context.Background(), ls[0], 0, false, &Options{})
		if err != nil {
			t.Fatal(err)
		}
		if plain.Status != Exact {
			t.Fatalf("%+v: plain status %s, the test needs an exact case", sp, plain.Status)
		}
		red, got, why, err := reduce(context.Background(), ls[0], 0, false, &Options{})
		if err != nil || red == nil {
			t.Fatalf("%+v: no reduction (%q, %v)", sp, why, err)
		}
		if got.Status == Exact && (got.Lambda.Cmp(plain.Lambda) != 0 || got.Theta != plain.Theta) {
			t.Errorf("%+v: reduced λ = %s, θ = %d, plain λ = %s, θ = %d, both exact", sp, got.Lambda.RatString(), got.Theta, plain.Lambda.RatString(), plain.Theta)
		}
		if got.Status != Exact {
			t.Logf("%+v: the reduction gives only %s", sp, got.Status)
		}
	}
}

// TestReduceRegular: a K whose quadratic part has full rank d has λ = d/2,
// θ = 1 (Morse lemma; common practice), whatever its higher terms.
func TestReduceRegular(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	vars := []string{"x", "y", "z"}
	for trial := range 20 {
		// K = Σ ℓ_k² + cubic and quartic terms, with ℓ_k independent.
		var b strings.Builder
		for k := range 3 {
			fmt.Fprintf(&b, "(%s)^2 + ", randomLinear(rng, vars, k))
		}
		fmt.Fprintf(&b, "%d*x^2*y + %d*y*z^2 + %d*x*y*z + %d*z^4", rng.IntN(7)-3, rng.IntN(7)-3, rng.IntN(7)-3, rng.IntN(5)+1)
		sp := Spec{K: b.String()}
		p, err := sp.Problem()
		if err != nil {
			t.Fatal(err)
		}
		r, err := Bound(context.Background(), p, nil)
		if err != nil {
			t.Fatalf("trial %d, K = %s: %v", trial, b.String(), err)
		}
		if r.Lambda.Cmp(big.NewRat(3, 2)) != 0 || r.Theta != 1 || r.Status != Exact {
			t.Errorf("trial %d, K = %s: λ = %s, θ = %d (%s), want 3/2, 1, exact", trial, b.String(), r.Lambda.RatString(), r.Theta, r.Status)
		}
	}
}

// randomLinear returns a linear form whose coefficient of vars[k] is 1 and
// whose others are small integers, for a triangular (so invertible) set of
// forms when the earlier variables get 0.
func randomLinear(rng *rand.Rand, vars []string, k int) string {
	var t []string
	for i, v := range vars {
		switch {
		case i == k:
			t = append(t, v)
		case i > k:
			t = append(t, fmt.Sprintf("%d*%s", rng.IntN(7)-3, v))
		}
	}
	return strings.Join(t, " + ")
}

// TestReduceLinearChange is the differential test: a nondegenerate K =
// x1² + … + x_r² + Σ c_j·v_j^{2k_j} has λ = r/2 + Σ 1/(2k_j) and θ = 1
// (hand: a sum in disjoint variables, Watanabe 2009; each v^{2k} has
// λ = 1/(2k)). After a random linear change x ← A·x + B·v (A invertible,
// v unchanged) the reduction must give the same pair, exactly, in
// polynomial form and in sum-of-squares form.
func TestReduceLinearChange(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := range 30 {
		r := 1 + rng.IntN(2)
		nv := 1 + rng.IntN(2)
		var xs, vs []string
		for i := range r {
			xs = append(xs, fmt.Sprintf("x%d", i))
		}
		want := big.NewRat(int64(r), 2)
		var vterms, vgens []string
		for j := range nv {
			v := fmt.Sprintf("v%d", j)
			vs = append(vs, v)
			k := 1 + rng.IntN(3)
			if k == 1 {
				k = 2 // keep v out of the quadratic part
			}
			want.Add(want, big.NewRat(1, int64(2*k)))
			vterms = append(vterms, fmt.Sprintf("%d*%s^%d", 1+rng.IntN(3), v, 2*k))
			vgens = append(vgens, fmt.Sprintf("%s^%d", v, k))
		}
		all := append(slices.Clone(xs), vs...)
		// x_i ← x_i + (terms in later x) + (terms in v): triangular, so
		// the change is invertible.
		var forms []string
		for i := range r {
			var t []string
			for m, name := range all {
				switch {
				case m == i:
					t = append(t, fmt.Sprintf("%d*%s", 1+rng.IntN(3), name))
				case m > i:
					t = append(t, fmt.Sprintf("%d*%s", rng.IntN(7)-3, name))
				}
			}
			forms = append(forms, strings.Join(t, " + "))
		}
		var sq []string
		for _, f := range forms {
			sq = append(sq, "("+f+")^2")
		}
		k := strings.Join(append(sq, vterms...), " + ")
		for _, sp := range []Spec{{K: k, Vars: all}, {SOS: append(slices.Clone(forms), vgens...), Vars: all}} {
			p, err := sp.Problem()
			if err != nil {
				t.Fatal(err)
			}
			res, err := Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatalf("trial %d %+v: %v", trial, sp, err)
			}
			if res.Lambda.Cmp(want) != 0 || res.Theta != 1 || res.Status != Exact {
				t.Errorf("trial %d %+v: λ = %s, θ = %d (%s), want %s, 1, exact (reasons %q)", trial, sp, res.Lambda.RatString(), res.Theta, res.Status, want.RatString(), res.Reasons)
			}
		}
	}
}

// TestReduceReducedRankExact: reduced-rank regression at a truth of rank
// r ≥ 1. The generators Σ_k b_ik·a_kj − δ_ij are solved exactly, one at a
// time (eliminate), so the core is an exact polynomial. The expected
// values come from aoyagiWatanabe (bound_test.go: Aoyagi & Watanabe 2005,
// main theorem, from memory). Checks:
//   - the value never lies below the Aoyagi–Watanabe formula (it is
//     certified, so a value below would be a wrong bound), and equals it
//     when exact;
//   - λ(M,N,H,r) = λ(M−r, N−r, H−r, 0) + r(M+N−r)/2 (Aoyagi & Watanabe
//     2005, the reduction of the rank-r case to the rank-0 case; from
//     memory), checked on the formula itself so that the two recollections
//     agree;
//   - when H − r ≤ 1 the core is exact (H − r = 1: the core is ‖b·aᵀ‖²
//     for vectors b, a, whose Newton polyhedron is nondegenerate, common
//     practice; H − r = 0: the core is 0), so the answer must be exact.
func TestReduceReducedRankExact(t *testing.T) {
	for _, s := range [][4]int{
		{2, 2, 2, 1}, {3, 3, 2, 1}, {3, 2, 2, 1}, {2, 3, 2, 1}, {4, 3, 2, 1},
		{2, 4, 2, 1}, {4, 2, 2, 1}, {5, 5, 2, 1}, {3, 3, 3, 2}, {4, 3, 3, 2},
		{4, 4, 3, 2}, {5, 4, 3, 2}, {3, 3, 3, 1}, {4, 4, 3, 1},
	} {
		m, n, h, r := s[0], s[1], s[2], s[3]
		t.Run(fmt.Sprintf("M=%d,N=%d,H=%d,r=%d", m, n, h, r), func(t *testing.T) {
			wantL, wantT := aoyagiWatanabe(m, n, h, r)
			coreL, coreT := aoyagiWatanabe(m-r, n-r, h-r, 0)
			if m-r < 1 || n-r < 1 {
				coreL, coreT = new(big.Rat), 1
			}
			split := new(big.Rat).Add(coreL, big.NewRat(int64(r*(m+n-r)), 2))
			if split.Cmp(wantL) != 0 || coreT != wantT {
				t.Fatalf("the formula disagrees with its reduction: %s, %d vs %s, %d", wantL.RatString(), wantT, split.RatString(), coreT)
			}
			sp := rrSpec(m, n, h, r)
			p, err := sp.Problem()
			if err != nil {
				t.Fatal(err)
			}
			res, err := Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatal(err)
			}
			got := fmt.Sprintf("λ = %s, θ = %d (%s)", res.Lambda.RatString(), res.Theta, res.Status)
			switch c := res.Lambda.Cmp(wantL); {
			case res.Status == Uncertified:
				t.Errorf("%s: uncertified", got)
			case c < 0 || c == 0 && res.Theta > wantT: // below in the order of Less
				t.Errorf("%s lies below the formula's λ = %s, θ = %d", got, wantL.RatString(), wantT)
			case res.Status == Exact && (c != 0 || res.Theta != wantT):
				t.Errorf("%s, want λ = %s, θ = %d", got, wantL.RatString(), wantT)
			}
			if h-r <= 1 {
				if res.Status != Exact {
					t.Errorf("%s, want exact (core with H − r = %d); notes %q", got, h-r, res.Notes)
				}
				if res.Reduction == nil || len(res.Reduction.Eliminations) != r*(m+n-r) || res.Reduction.Order != 0 {
					t.Errorf("reduction %+v, want %d exact eliminations", res.Reduction, r*(m+n-r))
				}
			}
		})
	}
}

// TestReduceReplay replays the recorded eliminations on the generators and
// checks that they give Reduction.K: the record alone reproduces the core.
// The replay substitutes x = Numerator/Denominator in each generator h not
// yet solved and multiplies by Denominator^e (e the degree of h in x),
// with the polynomial arithmetic of monomial only.
func TestReduceReplay(t *testing.T) {
	for _, tc := range []struct {
		name string
		sp   Spec
	}{
		{"rr 3x3 H=2 r=1", rrSpec(3, 3, 2, 1)},
		{"rr 3x3 H=3 r=2", rrSpec(3, 3, 3, 2)},
		{"x-y; z^2", Spec{SOS: []string{"x - y", "z^2"}}},
		{"unit coefficient 1+z", Spec{SOS: []string{"(1 + z)*x + y^2", "x*y + z^3"}}},
	} {
		sp := tc.sp
		t.Run(tc.name, func(t *testing.T) {
			local, r := specAtPoint(t, sp)
			red := r.Reduction
			if red == nil || len(red.Eliminations) == 0 {
				t.Fatalf("no exact reduction: %+v (notes %q)", red, r.Notes)
			}
			vars := local.Vars
			polys := slices.Clone(local.Polys)
			alive := make([]bool, len(polys))
			for i := range alive {
				alive[i] = true
			}
			parse := func(s string) *monomial.Poly { return parseIn(t, vars, s) }
			for _, st := range red.Eliminations {
				j := slices.Index(vars, st.Variable)
				num, den := parse(st.Numerator), parse(st.Denominator)
				if den.ConstantTerm().Sign() == 0 {
					t.Fatalf("denominator %s is not a unit at the point", st.Denominator)
				}
				g := polys[st.Generator-1]
				// The solved generator vanishes: den·g(num/den) = 0.
				if v := g.Substitute(j, monomial.Zero(vars)).Mul(den).Add(g.Sub(g.Substitute(j, monomial.Zero(vars))).Substitute(j, num)); !v.IsZero() {
					t.Errorf("step %+v: den·g(x = num/den) = %s, want 0", st, v)
				}
				alive[st.Generator-1] = false
				for i, h := range polys {
					if !alive[i] {
						continue
					}
					e := 0
					for ex := range h.All() {
						e = max(e, ex[j])
					}
					out := monomial.Zero(vars)
					for ex, c := range h.All() {
						f := slices.Clone(ex)
						k := f[j]
						f[j] = 0
						term := monomial.Monomial(vars, f, c)
						for range k {
							term = term.Mul(num)
						}
						for range e - k {
							term = term.Mul(den)
						}
						out = out.Add(term)
					}
					polys[i] = out
				}
			}
			var got []string
			for i, q := range polys {
				if alive[i] {
					got = append(got, q.String())
				}
			}
			if !slices.Equal(got, red.K) {
				t.Errorf("replayed %q, recorded %q", got, red.K)
			}
		})
	}
}

// specAtPoint parses sp and bounds it, failing the test on an error; it
// returns the problem at its (single) point, as Bound analyses it, with the
// result.
func specAtPoint(t *testing.T, sp Spec) (*Local, *Result) {
	t.Helper()
	p, err := sp.Problem()
	if err != nil {
		t.Fatal(err)
	}
	locals, err := p.Locals()
	if err != nil {
		t.Fatal(err)
	}
	r, err := Bound(context.Background(), p, nil)
	if err != nil {
		t.Fatal(err)
	}
	return locals[0], r
}
