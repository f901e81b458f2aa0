package rlct

import (
	"math/big"
	"slices"
	"strings"
	"testing"
)

// Repairs of degenerate edges, with values derived by hand in the comments.
// The reduction is off (NoReduction) where it would settle the case first,
// so that the repair itself is tested.
var repairTests = []struct {
	name   string
	spec   Spec
	opt    *Options
	lambda string
	theta  int
	status Status
	// lambdaCertified is the expected Result.LambdaCertified.
	lambdaCertified bool
	// steps are the substitutions expected, in order (nil: no Repair).
	steps []string
	// criterion is the expected Repair.Criterion.
	criterion string
	// note is a substring expected in Notes (empty: none checked).
	note string
}{
	// K = (y − x²)², variables (y, x). The edge (2,0)–(0,4) (y², x⁴) has
	// polynomial y²·(1 − s)² with s = y⁻¹x², root 1, so y → y + x²: K = y².
	// P(y²) = (2,0) + R²₊ meets the diagonal at (2,2), on the unbounded edge
	// {y-exponent 2}: λ = 1/2, θ = 1, nondegenerate (one term). (Hand.)
	{"(y-x^2)^2", Spec{K: "(y - x^2)^2"}, &Options{NoReduction: true}, "1/2", 1, Exact, false, []string{"y -> y + x^2"}, "", ""},
	// The same in sum-of-squares form: g = y − x² becomes y. (Hand.)
	{"sos y-x^2", Spec{SOS: []string{"y - x^2"}}, &Options{NoReduction: true}, "1/2", 1, Exact, false, []string{"y -> y + x^2"}, "", ""},
	// K = (y − x² − x³)²: first y → y + x² (the edge (2,0)–(0,4), root 1)
	// gives (y − x³)², Newton value 1/(3/2) = 2/3 < 3/4; then the edge
	// (2,0)–(0,6), root 1, gives y → y + x³ and K = y²: λ = 1/2, θ = 1.
	// (Hand.)
	{"(y-x^2-x^3)^2", Spec{K: "(y - x^2 - x^3)^2"}, &Options{NoReduction: true}, "1/2", 1, Exact, false, []string{"y -> y + x^2", "y -> y + x^3"}, "", ""},
	// K = x²y² − 2xy³ + y⁴ + x⁶ = y²(x − y)² + x⁶. Its Newton polygon has
	// vertices (6,0), (2,2), (0,4); (2,2) is on the diagonal, so the Newton
	// value is λ = 1/2, θ = 2, but the edge (2,2)–(0,4) has polynomial
	// y²(x − y)² (s = x/y, root 1 twice): only an upper bound. x → x + y
	// gives y²x² + (x + y)⁶: the terms of (x + y)⁶ are x^k y^(6−k), and
	// (x+y)⁶ + x²y² has vertices (6,0), (2,2), (0,6) (the other terms lie
	// above: x + 2y > 6 on the first edge for k = 1…5, 2x + y > 6 on the
	// second), edge polynomials x⁶ + x²y² and x²y² + y⁶ with positive even
	// terms, so it is nondegenerate: λ = 1/2, θ = 2 exactly. (Hand; the other
	// change y → y + x gives y²(x + y)² + x⁶, degenerate again at s = −1,
	// with the same value, so it is not taken.)
	{"y^2(x-y)^2+x^6", Spec{K: "x^2*y^2 - 2*x*y^3 + y^4 + x^6"}, nil, "1/2", 2, Exact, false, []string{"x -> x + y"}, "", ""},
	// K = (x − y)² + z⁴ without the reduction: the edge (2,0,0)–(0,2,0)
	// (root 1 of (s − 1)², s = x/y) gives x → x + y and K = x² + z⁴, whose
	// polyhedron x/2 + z/4 ≥ 1 meets (t,t,t) at t = 4/3 on a facet with the
	// ray y: λ = 3/4, θ = 1. (Hand; the value.)
	{"(x-y)^2+z^4", Spec{K: "(x-y)^2 + z^4"}, &Options{NoReduction: true}, "3/4", 1, Exact, false, []string{"x -> x + y"}, "", ""},
	// K = (x² − y³)²: the only compact edge (4,0)–(0,6) meets the diagonal
	// at t/4 + t/6 = 1, d = 12/5. Its polynomial is (x² − y³)², s = x²y⁻³,
	// p(s) = (s − 1)²: one real root, multiplicity 2 ≤ 12/5, so by
	// Varchenko's criterion the coordinates are adapted and λ = 5/12. The
	// direction (2, −3) has no entry ±1 (x = y^{3/2} is not a power series
	// in y), so no step is made. The cusp x² − y³ has log canonical
	// threshold 1/2 + 1/3 = 5/6 (from memory), and K = f² halves it: 5/12
	// agrees. θ is not certified (the Newton θ is 1; true θ ≥ 1 holds
	// trivially).
	{"(x^2-y^3)^2", Spec{K: "(x^2 - y^3)^2"}, nil, "5/12", 1, UpperBound, true, []string{}, CriterionVarchenko, "fractional power"},
	// K = (y² − 2x²)²: the edge (0,4)–(4,0) has p(s) = (s² − 2)² with
	// s = y/x: irrational roots ±√2, minimal polynomial s² − 2, so not
	// repaired. d = 2 (t/4 + t/4 = 1) and the root multiplicity is 2 ≤ 2:
	// adapted, λ = 1/2 (K = ((y − √2x)(y + √2x))², two transversal lines:
	// λ = 1/2, θ = 2 by hand, so θ = 1 is only a bound).
	{"(y^2-2x^2)^2", Spec{K: "(y^2 - 2*x^2)^2"}, nil, "1/2", 1, UpperBound, true, []string{}, CriterionVarchenko, "minimal polynomial s^2 - 2"},
	// A non-uniform prior on the coordinate to move: with |y|¹ (τ_y = 2)
	// y may not move, and x cannot (the edge direction (−1, 2) in (y, x)
	// has no other entry ±1); the Newton value stays: P((y − x²)²) has the
	// edge (2,0)–(0,4), and (2t, t) on it at 2t/2 + t/4 = 1, t = 4/5:
	// λ = 5/4, θ = 1, an upper bound. (Hand.)
	{"prior on y", Spec{K: "(y - x^2)^2", Prior: "y=1"}, &Options{NoReduction: true}, "5/4", 1, UpperBound, false, nil, "", "a repaired coordinate carries a non-uniform prior exponent"},
}

func TestRepair(t *testing.T) {
	for _, tt := range repairTests {
		t.Run(tt.name, func(t *testing.T) {
			r := solveWith(t, &tt.spec, tt.opt)
			if r.Lambda.RatString() != tt.lambda || r.Theta != tt.theta || r.Status != tt.status {
				t.Fatalf("got λ = %s, θ = %d (%s), want %s, %d (%s); notes %q reasons %q", r.Lambda.RatString(), r.Theta, r.Status, tt.lambda, tt.theta, tt.status, r.Notes, r.Reasons)
			}
			if r.LambdaCertified != tt.lambdaCertified {
				t.Errorf("LambdaCertified = %v, want %v", r.LambdaCertified, tt.lambdaCertified)
			}
			if tt.note != "" && !slices.ContainsFunc(r.Notes, func(s string) bool { return strings.Contains(s, tt.note) }) {
				t.Errorf("no note containing %q in %q", tt.note, r.Notes)
			}
			if tt.steps == nil {
				if r.Repair != nil {
					t.Errorf("unexpected repair %+v", r.Repair)
				}
				return
			}
			if r.Repair == nil {
				t.Fatalf("no repair recorded")
			}
			var got []string
			for _, s := range r.Repair.Steps {
				got = append(got, s.Substitution)
			}
			if !slices.Equal(got, tt.steps) {
				t.Errorf("steps %q, want %q", got, tt.steps)
			}
			if r.Repair.Criterion != tt.criterion {
				t.Errorf("criterion %q, want %q", r.Repair.Criterion, tt.criterion)
			}
			if len(r.Changes) != len(tt.steps)+btoi(tt.criterion != "") {
				t.Errorf("changes %q do not list the steps", r.Changes)
			}
			if r.Status == UpperBound && r.Summary == "" {
				t.Errorf("no summary")
			}
		})
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// TestRepairReplay replays the recorded substitutions on K and checks that
// they give Repair.K, so the record is enough to reproduce the change.
func TestRepairReplay(t *testing.T) {
	for _, tt := range repairTests {
		if len(tt.steps) == 0 {
			continue
		}
		t.Run(tt.name, func(t *testing.T) {
			p, err := tt.spec.Problem()
			if err != nil {
				t.Fatal(err)
			}
			locals, err := p.Locals()
			if err != nil {
				t.Fatal(err)
			}
			r := solveWith(t, &tt.spec, tt.opt)
			polys := locals[0].Polys
			vars := locals[0].Vars
			for _, s := range r.Repair.Steps {
				j := slices.Index(vars, s.Variable)
				rhs := strings.TrimSpace(strings.SplitN(s.Substitution, "->", 2)[1])
				q, err := (&Spec{K: rhs, Vars: vars}).Problem()
				if err != nil {
					t.Fatal(err)
				}
				qv, err := q.K.Embed(vars)
				if err != nil {
					t.Fatal(err)
				}
				for i := range polys {
					polys[i] = polys[i].Substitute(j, qv)
				}
			}
			for i, q := range polys {
				if q.String() != r.Repair.K[i] {
					t.Errorf("replayed %s, recorded %s", q, r.Repair.K[i])
				}
			}
		})
	}
}

// TestRationalRoots checks the exact rational roots against polynomials
// built from known roots (hand).
func TestRationalRoots(t *testing.T) {
	tests := []struct {
		name  string
		p     upoly // constant term first
		roots []string
		rest  int // degree of what is left
	}{
		// (s − 1/2)(s + 3) = s² + 5/2 s − 3/2
		{"two", upoly{big.NewRat(-3, 2), big.NewRat(5, 2), big.NewRat(1, 1)}, []string{"-3", "1/2"}, 0},
		// 6s² − 5s + 1 = (2s − 1)(3s − 1)
		{"close", upoly{big.NewRat(1, 1), big.NewRat(-5, 1), big.NewRat(6, 1)}, []string{"1/3", "1/2"}, 0},
		// s² − 2: no rational root
		{"irrational", upoly{big.NewRat(-2, 1), new(big.Rat), big.NewRat(1, 1)}, nil, 2},
		// (3s − 2)²(s² + 1) = (9s² − 12s + 4)(s² + 1) = 9s⁴ − 12s³ + 13s² − 12s + 4
		{"double and complex", upoly{big.NewRat(4, 1), big.NewRat(-12, 1), big.NewRat(13, 1), big.NewRat(-12, 1), big.NewRat(9, 1)}, []string{"2/3"}, 2},
		// (1000s − 999)(s − 1) = 1000s² − 1999s + 999: close roots
		{"near", upoly{big.NewRat(999, 1), big.NewRat(-1999, 1), big.NewRat(1000, 1)}, []string{"999/1000", "1"}, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, rest := rationalRoots(tt.p)
			var s []string
			for _, r := range got {
				s = append(s, r.RatString())
			}
			if !slices.Equal(s, tt.roots) || rest.deg() != tt.rest {
				t.Errorf("roots %q rest degree %d, want %q and %d", s, rest.deg(), tt.roots, tt.rest)
			}
		})
	}
}
