package rlct

import (
	"context"
	"math/big"
	"slices"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// rrPolySpec is rrSpec in polynomial form: K = Σ g_i² given as one
// expression, so that it reaches the reduction expanded.
func rrPolySpec(m, n, h, r int) Spec {
	g, at := rrGenerators(m, n, h, r)
	sq := make([]string, len(g))
	for i, x := range g {
		sq[i] = "(" + x + ")^2"
	}
	return Spec{K: strings.Join(sq, " + "), At: at}
}

// Completions of the square with hand-derived values. Every K is given
// expanded (polynomial form). Each core 4AC − B² is divided by the units
// that divide it exactly (the A's so far, then the positive content).
var completeTests = []struct {
	name     string
	spec     Spec
	lambda   string
	theta    int
	steps    int
	core     string   // the final core, derived by hand
	divisors []string // the divisor of each step, derived by hand ("" none)
	free     []string
}{
	// K = x² − 2xy + y² + z⁴: A = 1, B = −2y, C = y² + z⁴, so
	// 4AC − B² = 4y² + 4z⁴ − 4y² = 4z⁴ = 4·z⁴ (content 4); λ = 1/2 + λ(z⁴)
	// = 1/2 + 1/4 = 3/4, θ = 1, y free.
	{"(x-y)^2+z^4", Spec{K: "x^2 - 2*x*y + y^2 + z^4"}, "3/4", 1, 1, "z^4", []string{"4"}, []string{"y"}},
	// K = x² + 2xy² + y⁴ + y⁶: A = 1, B = 2y², C = y⁴ + y⁶, so
	// 4AC − B² = 4y⁴ + 4y⁶ − 4y⁴ = 4·y⁶; λ = 1/2 + 1/6 = 2/3, θ = 1.
	{"(x+y^2)^2+y^6", Spec{K: "x^2 + 2*x*y^2 + y^4 + y^6"}, "2/3", 1, 1, "y^6", []string{"4"}, nil},
	// K = (1 + z²)(x − y²)² + z⁴, expanded: A = 1 + z², B = −2y²(1 + z²),
	// C = y⁴(1 + z²) + z⁴, so 4AC − B² = 4(1 + z²)z⁴: A = 1 + z² divides
	// it, leaving 4z⁴, and the content 4 leaves z⁴; the divisor is
	// 4(1 + z²) = 4 + 4z². λ = 1/2 + 1/4 = 3/4, θ = 1, y free. A is not a
	// constant here.
	{"unit A", Spec{K: "(1 + z^2)*x^2 - 2*(1 + z^2)*y^2*x + (1 + z^2)*y^4 + z^4"}, "3/4", 1, 1, "z^4", []string{"4 + 4*z^2"}, []string{"y"}},
	// K = (x + y)² + (y + z²)² + z⁶ expanded: x² + 2xy + 2y² + 2yz² + z⁴ +
	// z⁶. Step x: A = 1, B = 2y, C = 2y² + 2yz² + z⁴ + z⁶, 4AC − B² =
	// 4y² + 8yz² + 4z⁴ + 4z⁶ = 4·(y² + 2yz² + z⁴ + z⁶). Step y: A = 1,
	// B = 2z², C = z⁴ + z⁶, 4AC − B² = 4z⁴ + 4z⁶ − 4z⁴ = 4·z⁶.
	// λ = 1/2 + 1/2 + 1/6 = 7/6, θ = 1 (u = x + y, w = y + z² give
	// u² + w² + z⁶ directly).
	{"two steps", Spec{K: "x^2 + 2*x*y + 2*y^2 + 2*y*z^2 + z^4 + z^6"}, "7/6", 1, 2, "z^6", []string{"4", "4"}, nil},
}

func TestCompleteSquares(t *testing.T) {
	for _, tc := range completeTests {
		t.Run(tc.name, func(t *testing.T) {
			local, r := specAtPoint(t, tc.spec)
			want, _ := new(big.Rat).SetString(tc.lambda)
			if r.Status != Exact || r.Lambda.Cmp(want) != 0 || r.Theta != tc.theta {
				t.Errorf("λ = %s, θ = %d (%s), want %s, %d exact; notes %q", r.Lambda.RatString(), r.Theta, r.Status, tc.lambda, tc.theta, r.Notes)
			}
			red := r.Reduction
			if red == nil || len(red.Completions) != tc.steps || red.Order != 0 || len(red.K) != 1 {
				t.Fatalf("reduction %+v, want %d completions and an exact core", red, tc.steps)
			}
			vars := local.Vars
			if got, want := parseIn(t, vars, red.K[0]), parseIn(t, vars, tc.core); !got.Equal(want) {
				t.Errorf("core %s, want %s", got, want)
			}
			if !slices.Equal(red.Free, tc.free) {
				t.Errorf("free %q, want %q", red.Free, tc.free)
			}
			for k, st := range red.Completions {
				if d := tc.divisors[k]; d == "" && st.Divisor != "" || d != "" && (st.Divisor == "" || !parseIn(t, vars, st.Divisor).Equal(parseIn(t, vars, d))) {
					t.Errorf("step %s: divisor %q, want %q", st.Variable, st.Divisor, d)
				}
			}
		})
	}
}

func parseIn(t *testing.T, vars []string, s string) *monomial.Poly {
	t.Helper()
	e, err := monomial.Parse(s, monomial.Config{Vars: vars})
	if err != nil {
		t.Fatal(err)
	}
	q, err := e.Poly.Embed(vars)
	if err != nil {
		t.Fatal(err)
	}
	return q
}

// TestCompleteReplay replays the recorded completions on K with the
// polynomial arithmetic of monomial only: at each step K must have degree
// at most 2 in the variable, with x² coefficient A (a unit: non-zero
// constant term) and x coefficient B as recorded; 4·A·C − B² (C the terms
// free of x) must be the recorded Divisor (positive at the point) times
// the recorded core of the step (checked by multiplying out, not by
// dividing), and the last core Reduction.K.
func TestCompleteReplay(t *testing.T) {
	cases := []struct {
		name string
		sp   Spec
	}{{"rr 3x3 H=2 r=1 expanded", rrPolySpec(3, 3, 2, 1)}}
	for _, tc := range completeTests {
		cases = append(cases, struct {
			name string
			sp   Spec
		}{tc.name, tc.spec})
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			local, r := specAtPoint(t, tc.sp)
			red := r.Reduction
			if red == nil || len(red.Completions) == 0 {
				t.Fatalf("no completion (reduction %+v, notes %q)", red, r.Notes)
			}
			vars := local.Vars
			cur := local.Polys[0]
			for _, st := range red.Completions {
				j := slices.Index(vars, st.Variable)
				a, b := parseIn(t, vars, st.A), parseIn(t, vars, st.B)
				if a.ConstantTerm().Sign() <= 0 {
					t.Fatalf("step %s: A = %s is not a positive unit at the point", st.Variable, st.A)
				}
				c := monomial.Zero(vars)
				ga, gb := monomial.Zero(vars), monomial.Zero(vars)
				for ex, k := range cur.All() {
					f := slices.Clone(ex)
					f[j] = 0
					m := monomial.Monomial(vars, f, k)
					switch ex[j] {
					case 0:
						c = c.Add(m)
					case 1:
						gb = gb.Add(m)
					case 2:
						ga = ga.Add(m)
					default:
						t.Fatalf("step %s: K has degree %d in it", st.Variable, ex[j])
					}
				}
				if !ga.Equal(a) || !gb.Equal(b) {
					t.Fatalf("step %s: K has A = %s, B = %s; recorded %s, %s", st.Variable, ga, gb, st.A, st.B)
				}
				e := a.Mul(c).Scale(big.NewRat(4, 1)).Sub(b.Mul(b))
				cur = parseIn(t, vars, st.Core)
				u := monomial.Constant(vars, big.NewRat(1, 1))
				if st.Divisor != "" {
					u = parseIn(t, vars, st.Divisor)
					if u.ConstantTerm().Sign() <= 0 {
						t.Fatalf("step %s: divisor %s is not positive at the point", st.Variable, st.Divisor)
					}
				}
				if !u.Mul(cur).Equal(e) {
					t.Fatalf("step %s: 4AC − B² = %s, recorded divisor %q times core %s", st.Variable, e, st.Divisor, st.Core)
				}
			}
			if len(red.K) != 1 || !cur.Equal(parseIn(t, vars, red.K[0])) {
				t.Errorf("replayed %s, recorded %q", cur, red.K)
			}
		})
	}
}

// Reduced-rank regression given expanded, 3×3, H = 2 at a rank-1 truth:
// the true pair is λ = 7/2, θ = 2 (Aoyagi & Watanabe 2005, see
// aoyagiWatanabe: n + r = 4 ≤ m + h = 5, h + r = 3 ≤ 6, so
// λ = (2·3·6 − 0 − 9 + 1)/8 = 7/2 with θ = 2, m + h + n + r = 9 being
// odd). Every one of the five LDLᵀ pivots is completed, the cores being
// divided by the A's before them (fraction-free elimination, without which
// their degrees grow and the last two pivots have degree 6 in K), and the
// answer must be exactly that pair (the expected values come from the
// formula alone). For orientation only: five regular directions give 5/2,
// and the rest is like the square sum of the 2×2 block (b11, b21)ᵀ(a11,
// a12) beyond the rank-1 truth, (b11² + b21²)(a11² + a12²), with λ = 1,
// θ = 2.
func TestCompleteReducedRank(t *testing.T) {
	sp := rrPolySpec(3, 3, 2, 1)
	p, err := sp.Problem()
	if err != nil {
		t.Fatal(err)
	}
	r, err := Bound(context.Background(), p, nil)
	if err != nil {
		t.Fatal(err)
	}
	wantL, wantT := aoyagiWatanabe(3, 3, 2, 1)
	if wantL.Cmp(big.NewRat(7, 2)) != 0 || wantT != 2 {
		t.Fatalf("formula gives %s, %d", wantL.RatString(), wantT)
	}
	if r.Status != Exact || r.Lambda.Cmp(wantL) != 0 || r.Theta != wantT {
		t.Errorf("λ = %s, θ = %d (%s), want 7/2, 2 exact; notes %q", r.Lambda.RatString(), r.Theta, r.Status, r.Notes)
	}
	red := r.Reduction
	if red == nil || red.Rank != 5 || len(red.Completions) != red.Rank || red.Order != 0 {
		t.Fatalf("reduction %+v, want all 5 pivots completed and an exact core", red)
	}
	// A divisor that is not a plain number involves a variable.
	divided := 0
	for _, st := range red.Completions {
		if _, ok := new(big.Rat).SetString(st.Divisor); st.Divisor != "" && !ok {
			divided++
		}
	}
	if divided == 0 {
		t.Errorf("no core was divided by a non-constant unit: %+v", red.Completions)
	}
}

// A coordinate whose x² coefficient vanishes at the point is not
// completed: K = x²y² + z² has A = y² in x, A(0) = 0.
func TestCompleteNotUnit(t *testing.T) {
	vars := []string{"x", "y", "z"}
	K := parseIn(t, vars, "x^2*y^2 + z^2")
	cs, err := completeSquares(K, []int{0}, 1)
	if err != nil || cs != nil {
		t.Errorf("completed %+v (err %v), want nothing", cs, err)
	}
	// z qualifies (A = 1, B = 0, C = x²y²): 4AC − B² = 4x²y², divided by
	// its content 4.
	cs, err = completeSquares(K, []int{0, 2}, 2)
	if err != nil || cs == nil || len(cs.pivots) != 1 || cs.pivots[0] != 2 || !cs.core.Equal(parseIn(t, vars, "x^2*y^2")) || cs.steps[0].Divisor != "4" {
		t.Errorf("got %+v (err %v), want z alone with core x²y², divisor 4", cs, err)
	}
}

// K = (x − y²)² + x⁴ has degree 4 in its pivot x, so the square is not
// completed and the series path is taken. By hand: with u = x − y²,
// K = u² + (u + y²)⁴ is comparable to u² + y⁸ (if |u| ≤ y²/2 then
// (u + y²)⁴ ≥ y⁸/16, otherwise u² ≥ y⁴/4 ≥ y⁸/4; and (u + y²)⁴ ≤
// 8u⁴ + 8y⁸ ≤ 8u² + 8y⁸ near 0), so λ = 1/2 + 1/8 = 5/8, θ = 1: an exact
// answer must be that, any other not below it.
func TestCompleteFallsBack(t *testing.T) {
	p, err := (&Spec{K: "x^2 - 2*x*y^2 + y^4 + x^4"}).Problem()
	if err != nil {
		t.Fatal(err)
	}
	r, err := Bound(context.Background(), p, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Reduction != nil && len(r.Reduction.Completions) > 0 {
		t.Errorf("completed the square in a coordinate of degree 4: %+v", r.Reduction.Completions)
	}
	want := big.NewRat(5, 8)
	switch c := r.Lambda.Cmp(want); {
	case r.Status == Exact && (c != 0 || r.Theta != 1):
		t.Errorf("λ = %s, θ = %d exact, want 5/8, 1", r.Lambda.RatString(), r.Theta)
	case r.Status != Uncertified && (c < 0 || c == 0 && r.Theta > 1):
		t.Errorf("λ = %s, θ = %d (%s) lies below 5/8, 1", r.Lambda.RatString(), r.Theta, r.Status)
	}
}

// Small reduced-rank square sums given expanded, against the formula of
// aoyagiWatanabe: an exact answer must be the formula's pair, and no
// answer that claims to be a bound may lie below it. (With the cores
// divided by the units that divide them, most of these complete every
// pivot and are exact; the test asks only for soundness.)
func TestCompleteReducedRankFormula(t *testing.T) {
	for _, c := range [][4]int{{2, 2, 1, 1}, {2, 2, 2, 1}, {3, 2, 2, 1}, {2, 3, 2, 1}, {3, 3, 1, 1}, {2, 2, 2, 2}, {3, 2, 1, 1}, {3, 3, 2, 2}} {
		sp := rrPolySpec(c[0], c[1], c[2], c[3])
		p, err := sp.Problem()
		if err != nil {
			t.Fatal(err)
		}
		r, err := Bound(context.Background(), p, nil)
		if err != nil {
			t.Fatal(err)
		}
		wl, wt := aoyagiWatanabe(c[0], c[1], c[2], c[3])
		switch cmp := r.Lambda.Cmp(wl); {
		case r.Status == Exact && (cmp != 0 || r.Theta != wt):
			t.Errorf("m, n, h, r = %v: λ = %s, θ = %d exact, formula %s, %d", c, r.Lambda.RatString(), r.Theta, wl.RatString(), wt)
		case r.Status != Uncertified && (cmp < 0 || cmp == 0 && r.Theta > wt):
			t.Errorf("m, n, h, r = %v: λ = %s, θ = %d (%s) below the formula's %s, %d", c, r.Lambda.RatString(), r.Theta, r.Status, wl.RatString(), wt)
		}
	}
}
