package rlct

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
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
		all := &Options{AllFaces: true, NoReduction: true, NoRepair: true} // the Newton values of both forms
		rs := solveWith(t, &Spec{SOS: gens, Vars: vars[:d]}, all)
		rk := solveWith(t, &Spec{K: k, Vars: vars[:d]}, all)
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

// randomCase returns a random problem in 2 to 5 variables: a sum of squares
// of random generators with mixed signs, given as generators or expanded, or
// (one time in six) a random polynomial with mixed signs, which is often
// negative somewhere.
func randomCase(rng *rand.Rand) Spec {
	vars := []string{"x", "y", "z", "u", "v"}[:2+rng.IntN(4)]
	var gens []string
	for range 1 + rng.IntN(3) {
		gens = append(gens, randomGenerator(rng, vars, 1+rng.IntN(3), 3))
	}
	switch rng.IntN(6) {
	case 0:
		return Spec{K: randomGenerator(rng, vars, 2+rng.IntN(4), 4), Vars: vars}
	case 1, 2:
		return Spec{SOS: gens, Vars: vars}
	}
	var squares []string
	for _, g := range gens {
		squares = append(squares, "("+g+")^2")
	}
	return Spec{K: strings.Join(squares, " + "), Vars: vars}
}

// The targeted search (the default) against the full lattice (AllFaces),
// which enumerates every compact face by double description and decides
// each: on hundreds of seeded random cases they must give the same status,
// λ and θ, unless the targeted search stopped at a degenerate face before
// it reached a face that shows K < 0 (then it must not say Exact). Every
// error of the targeted search must be an error of the full one, and every
// degenerate face it reports must really vanish at its witness.
func TestTargetedAgreesWithFullLattice(t *testing.T) {
	rng := rand.New(rand.NewPCG(90, 91))
	ctx := context.Background()
	counts := map[string]int{}
	for trial := range 600 {
		spec := randomCase(rng)
		p, err := spec.Problem()
		if err != nil {
			t.Fatalf("trial %d: %+v: %v", trial, spec, err)
		}
		full, ferr := Bound(ctx, p, &Options{AllFaces: true})
		fast, terr := Bound(ctx, p, nil)
		switch {
		case terr != nil && ferr == nil:
			t.Fatalf("trial %d: %+v: targeted error %v, full lattice none", trial, spec, terr)
		case terr != nil:
			if errors.Is(terr, ErrNegative) != errors.Is(ferr, ErrNegative) {
				t.Fatalf("trial %d: %+v: targeted %v, full %v", trial, spec, terr, ferr)
			}
			counts["both errors"]++
			continue
		case ferr != nil:
			if !errors.Is(ferr, ErrNegative) {
				t.Fatalf("trial %d: %+v: full lattice error %v only", trial, spec, ferr)
			}
			if fast.Status == Exact || fast.Certificate.Complete {
				t.Fatalf("trial %d: %+v: full lattice finds K < 0 (%v), targeted search says %s (complete %v)", trial, spec, ferr, fast.Status, fast.Certificate.Complete)
			}
			counts["negative found only by the full lattice"]++
			continue
		}
		if fast.Status != full.Status || fast.Lambda.Cmp(full.Lambda) != 0 || fast.Theta != full.Theta {
			t.Fatalf("trial %d: %+v: targeted (%s, %d, %s), full (%s, %d, %s)\ntargeted reasons %v\nfull reasons %v", trial, spec,
				fast.Lambda.RatString(), fast.Theta, fast.Status, full.Lambda.RatString(), full.Theta, full.Status, fast.Reasons, full.Reasons)
		}
		if fast.Certificate.Examined > len(full.Faces) {
			t.Fatalf("trial %d: targeted search examined %d faces of %d", trial, fast.Certificate.Examined, len(full.Faces))
		}
		counts[string(fast.Status)]++
		for _, f := range fast.Certificate.Deciding {
			if f.Verdict == Degenerate {
				checkWitness(t, fast.Vars, f, p.Generators != nil)
			}
		}
	}
	// The sample must exercise both outcomes, or it proves little.
	if counts[string(Exact)] < 50 || counts[string(UpperBound)] < 50 {
		t.Errorf("weak sample: %v", counts)
	}
	t.Logf("outcomes: %v", counts)
}

// checkWitness substitutes the witness of a degenerate face into its face
// polynomial: exactly zero for an exact witness; for a witness with decimal
// coordinates (an irrational root), small compared with its terms.
func checkWitness(t *testing.T, vars []string, f Face, sos bool) {
	t.Helper()
	if f.Witness == nil {
		t.Fatalf("degenerate face %s without witness", formatVertices(f.Vertices))
	}
	exact := make([]*big.Rat, len(vars))
	approx := make([]float64, len(vars))
	isExact := true
	for i, s := range f.Witness.Point {
		name, val, ok := strings.Cut(s, "=")
		if !ok {
			name, val, _ = strings.Cut(s, "≈")
			isExact = false
		}
		if name != vars[i] {
			t.Fatalf("witness %v: coordinate %d is %s, want %s", f.Witness.Point, i, name, vars[i])
		}
		r, ok := new(big.Rat).SetString(val)
		if !ok {
			t.Fatalf("witness %v: bad value %q", f.Witness.Point, val)
		}
		exact[i] = r
		approx[i], _ = r.Float64()
	}
	if strings.Contains(f.Polynomial, "…") {
		t.Fatalf("face polynomial of a small case abbreviated: %s", f.Polynomial)
	}
	src := f.Polynomial
	face, err := monomial.Parse(src, monomial.Config{Vars: vars})
	if err != nil {
		t.Fatalf("face polynomial %q: %v", src, err)
	}
	if isExact {
		if v := face.Poly.Eval(exact); v.Sign() != 0 {
			t.Fatalf("face polynomial %s at witness %v = %s, want 0", src, f.Witness.Point, v.RatString())
		}
		return
	}
	size := 0.0
	for e, c := range face.Poly.All() {
		cf, _ := c.Float64()
		term := math.Abs(cf)
		for i, k := range e {
			term *= math.Pow(math.Abs(approx[i]), float64(k))
		}
		size += term
	}
	if v := face.Poly.Compile().Eval(approx); math.Abs(v) > 1e-6*size {
		t.Fatalf("face polynomial %s at witness %v = %g, not near 0 (terms %g)", src, f.Witness.Point, v, size)
	}
}
