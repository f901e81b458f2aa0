package rlct

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/polyhedron"
)

// randomGenerator returns a polynomial with small integer coefficients and
// no constant term in the given variables.
func randomGenerator(rng *rand.Rand, vars []string, terms, maxExp int) string {
	var parts []string
	for range terms {
		var f []string
		for _, v := range vars {
			if e := rng.IntN(maxExp + 1); e > 0 {
				f = append(f, fmt.Sprintf("%s^%d", v, e))
			}
		}
		if len(f) == 0 {
			f = append(f, vars[rng.IntN(len(vars))])
		}
		c := rng.IntN(5) - 2
		if c == 0 {
			c = 1
		}
		parts = append(parts, fmt.Sprintf("(%d)*%s", c, strings.Join(f, "*")))
	}
	return strings.Join(parts, " + ")
}

// The same K given as generators and expanded must give the same (λ, θ),
// and the two forms must never disagree on a face they both decide: the face
// polynomials are the same, Σ (g_i on σ)² (common practice: the lowest
// weighted part of a sum of squares is the sum of the lowest parts squared).
func TestSumOfSquaresAgreesWithExpansion(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	vars := []string{"x", "y", "z"}
	for trial := range 120 {
		d := 2 + rng.IntN(2)
		var gens []string
		for range 1 + rng.IntN(3) {
			gens = append(gens, randomGenerator(rng, vars[:d], 1+rng.IntN(3), 3))
		}
		var squares []string
		for _, g := range gens {
			squares = append(squares, "("+g+")^2")
		}
		k := strings.Join(squares, " + ")
		rs := solve(t, &Spec{SOS: gens, Vars: vars[:d]})
		rk := solve(t, &Spec{K: k, Vars: vars[:d]})
		if rs.Lambda.Cmp(rk.Lambda) != 0 || rs.Theta != rk.Theta {
			t.Fatalf("trial %d: generators %v give (%s, %d), expanded K gives (%s, %d)", trial, gens,
				rs.Lambda.RatString(), rs.Theta, rk.Lambda.RatString(), rk.Theta)
		}
		verdicts := map[string]FaceVerdict{}
		for _, f := range rs.Faces {
			verdicts[formatVertices(f.Vertices)] = f.Verdict
		}
		if len(rs.Faces) != len(rk.Faces) {
			t.Fatalf("trial %d: %d faces in sum-of-squares form, %d expanded", trial, len(rs.Faces), len(rk.Faces))
		}
		for _, f := range rk.Faces {
			v, ok := verdicts[formatVertices(f.Vertices)]
			if !ok {
				t.Fatalf("trial %d: face %s missing in sum-of-squares form", trial, formatVertices(f.Vertices))
			}
			if (v == Nondegenerate && f.Verdict == Degenerate) || (v == Degenerate && f.Verdict == Nondegenerate) {
				t.Fatalf("trial %d: K = %s: face %s is %s as generators but %s expanded", trial, k, formatVertices(f.Vertices), v, f.Verdict)
			}
		}
	}
}

// exposes guards the face polynomials: a normal that cuts out more than the
// face (or is not strictly positive) must be rejected. Worked by hand on the
// segment from (2,0) to (0,2).
func TestExposes(t *testing.T) {
	verts := [][]int{{0, 2}, {2, 0}}
	face := func(a, b int64, rhs int64, vs ...int) *polyhedron.Face {
		return &polyhedron.Face{Vertices: vs, Normal: []*big.Int{big.NewInt(a), big.NewInt(b)}, RHS: big.NewInt(rhs)}
	}
	tests := []struct {
		f    *polyhedron.Face
		want bool
	}{
		{face(2, 1, 2, 0), true},     // 2x + y ≥ 2 touches (0,2) only
		{face(1, 1, 2, 0, 1), true},  // x + y ≥ 2 is the edge
		{face(1, 1, 2, 0), false},    // the edge's normal does not expose the vertex alone
		{face(1, 0, 0, 0), false},    // not strictly positive
		{face(1, 1, 3, 0, 1), false}, // not supporting: points below it
	}
	for i, tt := range tests {
		if got := exposes(tt.f, verts); got != tt.want {
			t.Errorf("case %d: exposes = %v, want %v", i, got, tt.want)
		}
	}
}
