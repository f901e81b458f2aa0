package rlct

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"
)

// A sum of squared monomials has no unsafe point, so however many terms it
// has, it is exact without examining any face but the principal one
// (common practice: a sum of even-positive terms is positive on the torus).
func TestSquaredMonomialsNeedNoFaces(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	vars := []string{"x1", "x2", "x3", "x4", "x5", "x6", "x7", "x8", "x9", "x10"}
	var terms, roots []string // x^(2e) and x^e
	for range 2000 {
		var f, g []string
		for _, v := range vars {
			if e := rng.IntN(7); e > 0 && rng.IntN(3) == 0 {
				f = append(f, fmt.Sprintf("%s^%d", v, 2*e))
				g = append(g, fmt.Sprintf("%s^%d", v, e))
			}
		}
		if len(f) == 0 {
			v := vars[rng.IntN(len(vars))]
			f, g = []string{v + "^2"}, []string{v}
		}
		terms = append(terms, strings.Join(f, "*"))
		roots = append(roots, strings.Join(g, "*"))
	}
	r := solve(t, &Spec{K: strings.Join(terms, " + "), Vars: vars})
	if r.Status != Exact {
		t.Fatalf("status %s: %v", r.Status, r.Reasons)
	}
	c := r.Certificate
	if c.Unsafe != 0 || c.Examined > 1 || !c.Complete || r.Faces != nil {
		t.Errorf("certificate %+v, %d faces listed; want no unsafe point, at most the principal face examined", c, len(r.Faces))
	}
	// The same K as generators, each a single monomial x^e.
	rs := solve(t, &Spec{SOS: roots, Vars: vars})
	if rs.Status != Exact || rs.Lambda.Cmp(r.Lambda) != 0 || rs.Theta != r.Theta {
		t.Errorf("generators: %s λ = %s θ = %d; expanded λ = %s θ = %d", rs.Status, rs.Lambda.RatString(), rs.Theta, r.Lambda.RatString(), r.Theta)
	}
	if rs.Certificate.Unsafe != 0 {
		t.Errorf("single-term generators have %d unsafe points", rs.Certificate.Unsafe)
	}
}

// ‖BA‖² for B and A of shape 3×3 (rank 3 allowed, truth 0), expanded: the
// answer is the upper bound with a degenerate-face witness, found after
// examining a handful of faces (the full lattice has about 125,000), and it
// agrees with the sum-of-squares form (P(K) = 2·P(I), common practice).
func TestReducedRankExpandedStopsEarly(t *testing.T) {
	gens := lowRankGenerators(3, 3, 3)
	var squares []string
	for _, g := range gens {
		squares = append(squares, "("+g+")^2")
	}
	r := solve(t, &Spec{K: strings.Join(squares, " + ")})
	rs := solve(t, &Spec{SOS: gens})
	if r.Status != UpperBound || rs.Status != UpperBound {
		t.Fatalf("status %s / %s, want upper-bound", r.Status, rs.Status)
	}
	if r.Lambda.Cmp(rs.Lambda) != 0 || r.Theta != rs.Theta {
		t.Errorf("expanded (%s, %d), generators (%s, %d)", r.Lambda.RatString(), r.Theta, rs.Lambda.RatString(), rs.Theta)
	}
	for _, res := range []*Result{r, rs} {
		c := res.Certificate
		if c.Stop != StopSettled || c.Degenerate != 1 || c.Examined > 50 {
			t.Errorf("certificate %+v: want a stop at the first degenerate face after a few faces", c)
		}
		for _, f := range c.Deciding {
			if f.Verdict == Degenerate {
				checkWitness(t, res.Vars, f, res.Form == "sum-of-squares")
			}
		}
	}
}

// x⁴ + y⁴ + z⁴ − 4x²yz has only even-positive vertices and no edge with a
// sign change, but its 2-dimensional face (the whole polynomial) is −1 at
// (1, 1, 1), so K < 0 near 0: it must be rejected with that witness.
func TestNegativeTwoDimensionalFace(t *testing.T) {
	p := mustProblem(t, Spec{K: "x^4 + y^4 + z^4 - 4*x^2*y*z"})
	_, err := Bound(context.Background(), p, nil)
	if !errors.Is(err, ErrNegative) {
		t.Fatalf("error %v, want ErrNegative", err)
	}
	// Read the witness back from the message and substitute it exactly.
	msg := err.Error()
	at := strings.Index(msg, " at ")
	end := strings.Index(msg, ", so K is negative")
	if at < 0 || end < at {
		t.Fatalf("message has no witness point: %s", msg)
	}
	x := make([]*big.Rat, 3)
	for _, kv := range strings.Split(msg[at+4:end], ", ") {
		name, val, _ := strings.Cut(kv, "=")
		v, ok := new(big.Rat).SetString(val)
		if !ok {
			t.Fatalf("witness coordinate %q", kv)
		}
		x[strings.Index("xyz", name)] = v
	}
	if v := p.K.Eval(x); v.Sign() >= 0 {
		t.Errorf("K at the witness %v = %s, want < 0", x, v.RatString())
	}
	// A search that finds nothing claims nothing: the Motzkin-type
	// x⁴y² + x²y⁴ − 3x²y²z² + z⁶ is nonnegative (Motzkin 1967, the
	// arithmetic–geometric mean inequality; from memory), so no witness
	// may be reported for it.
	q := mustProblem(t, Spec{K: "x^4*y^2 + x^2*y^4 - 3*x^2*y^2*z^2 + z^6"})
	if _, err := Bound(context.Background(), q, nil); err != nil {
		t.Errorf("nonnegative K rejected: %v", err)
	}
}

// The prior follows its documentation (Problem.Prior): |w_i|^{h_i} in K's
// coordinates, so at a point with w*_i ≠ 0 it is smooth and positive and
// changes nothing, while at w*_i = 0 it adds h_i to the weight.
func TestPriorFollowsDoc(t *testing.T) {
	tests := []struct {
		spec   Spec
		lambda string
		weight string
		noted  bool // the exponent is reported as not counting
	}{
		// (x−1)² at x = 1 with prior |x|: |x| ≈ 1 there, so λ = 1/2, the
		// regular value d/2 (Schwarz 1978).
		{Spec{K: "(x-1)^2", Prior: "x=1", At: []string{"x=1"}}, "1/2", "1", true},
		// x² at 0 with prior |x|: ∫ |x|·n^{-…} gives λ = (h+1)/(2k) = 2/2 = 1
		// (Watanabe 2009, the monomial case of the main formula; from memory).
		{Spec{K: "x^2", Prior: "x=1"}, "1", "2", false},
		// The prior |u| at the truth u = 0 written in shifted coordinates.
		{Spec{K: "u^2", Prior: "u=1"}, "1", "2", false},
		// A zero exponent at a shifted coordinate says nothing.
		{Spec{K: "(x-1)^2", Prior: "x=0", At: []string{"x=1"}}, "1/2", "1", false},
	}
	for _, tt := range tests {
		r := solve(t, &tt.spec)
		if r.Lambda.RatString() != tt.lambda || r.Weights[0].RatString() != tt.weight || r.Status != Exact {
			t.Errorf("%+v: λ = %s, τ = %s, %s; want %s, %s, exact", tt.spec, r.Lambda.RatString(), r.Weights[0].RatString(), r.Status, tt.lambda, tt.weight)
		}
		if noted := len(r.Notes) == 1 && strings.Contains(r.Notes[0], "of x does not count"); noted != tt.noted || !tt.noted && len(r.Notes) > 0 {
			t.Errorf("%+v: notes %q, want a note about x: %v", tt.spec, r.Notes, tt.noted)
		}
	}
}

// In sum-of-squares form a face where some generator is a single term is
// nondegenerate without a rule; the certificate counts only faces holding
// the midpoint of two terms of one generator.
func TestSumOfSquaresUnsafeMidpoints(t *testing.T) {
	// (x − y)² as a generator x − y: one midpoint (1/2, 1/2) on the edge
	// from (1,0) to (0,1), degenerate at x = y (worked by hand).
	r := solveWith(t, &Spec{SOS: []string{"x - y"}}, &Options{NoReduction: true, NoRepair: true})
	if r.Certificate.Unsafe != 1 || r.Status != UpperBound || r.Certificate.Degenerate != 1 {
		t.Errorf("x − y: certificate %+v, status %s", r.Certificate, r.Status)
	}
	// x·y and x² + y²: the second generator has two terms, but it is
	// even-positive, so the edge it spans is nondegenerate; exact 1/2 + …
	// (the polyhedron of {(1,1), (2,0), (0,2)} in generator coordinates is
	// the simplex x + y ≥ 2, t = 1, P(K) = 2·P(I) gives t = 2, λ = 1/2; θ =
	// 1, worked by hand).
	r = solve(t, &Spec{SOS: []string{"x*y", "x^2 + y^2"}})
	if r.Status != Exact || r.Lambda.RatString() != "1/2" || r.Theta != 1 {
		t.Errorf("x·y, x² + y²: %s λ = %s θ = %d, %v", r.Status, r.Lambda.RatString(), r.Theta, r.Reasons)
	}
}

// The default report abbreviates a long face polynomial, keeps its count and
// says how many terms it left out; the full report does not.
func TestLongFacePolynomialAbbreviated(t *testing.T) {
	var terms []string
	for i := 0; i <= 1100; i++ {
		terms = append(terms, fmt.Sprintf("x^%d*y^%d", 2*i, 2200-2*i))
	}
	r := solve(t, &Spec{K: strings.Join(terms, " + ")})
	pf := r.Principal
	if pf.Terms != 1101 || !strings.Contains(pf.Polynomial, "… (101 more terms)") {
		t.Errorf("principal face: %d terms, %q", pf.Terms, pf.Polynomial)
	}
	full := solveWith(t, &Spec{K: strings.Join(terms, " + ")}, &Options{AllFaces: true})
	if strings.Contains(full.Principal.Polynomial, "…") {
		t.Errorf("the full report abbreviates: %q", full.Principal.Polynomial)
	}
}
