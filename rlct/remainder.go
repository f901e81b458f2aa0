package rlct

import (
	"context"
	"errors"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// ErrWeights is returned for generator weights that are not one positive
// rational per generator, or that are given without generators.
var ErrWeights error = &inputError{"rlct: generator weights must be positive rationals, one per generator"}

// checkExtras checks Problem.Remainder and Problem.GeneratorWeights against
// the d variables of the problem.
func (p *Problem) checkExtras(d int) error {
	if p.GeneratorWeights != nil {
		if len(p.GeneratorWeights) != len(p.Generators) {
			return fmt.Errorf("%w: %d weights for %d generators", ErrWeights, len(p.GeneratorWeights), len(p.Generators))
		}
		for i, c := range p.GeneratorWeights {
			if c == nil || c.Sign() <= 0 {
				return fmt.Errorf("%w (generator %d)", ErrWeights, i+1)
			}
		}
	}
	for _, r := range p.Remainder {
		if len(r) != d {
			return fmt.Errorf("%w: a remainder monomial has %d exponents for %d variables", ErrDimension, len(r), d)
		}
		for _, x := range r {
			if x < 0 {
				return fmt.Errorf("%w: a remainder monomial has a negative exponent", ErrDimension)
			}
		}
		if p.Truncated && r.Degree() <= p.Order {
			return fmt.Errorf("%w: a remainder monomial has total degree %d, not above the order %d", ErrDimension, r.Degree(), p.Order)
		}
	}
	return nil
}

// remainderCheck is the truncation check with the monomials of
// Problem.Remainder in place of the total degree. Let R be the omitted
// part: every term of R is a multiple of w^r for some r in rem (in the
// coordinates of the polyhedron P that was built), and the terms of K that
// are not such multiples are exact.
//
//   - If r lies in P and is not a vertex of P, then no multiple of r is a
//     vertex (a vertex v = r + s with s ≥ 0, s ≠ 0 would dominate the point r
//     of P, and a vertex dominates no other point of P), so every vertex of
//     P keeps its exact coefficient, and every term added lies in r + R^d_{≥0}
//     ⊆ P: the full K has the same Newton polyhedron, hence the same t_τ,
//     principal face and θ.
//   - Otherwise, if min y·r > t_τ over the optimal supporting hyperplanes y
//     at t_τ·τ (the normalised normal cone of the principal face, y ≥ 0, so
//     y·(r + s) ≥ y·r), every multiple of r lies strictly above all of them,
//     which keeps t_τ and the principal face, as in the total-degree rule.
//   - If r lies in P on no compact face, then no multiple of r lies on a
//     compact face either (a compact face has a strictly positive normal a,
//     and a·(r + s) ≥ a·r > b), so every compact face and its face polynomial
//     are those of the full K, and the face verdicts carry over.
//
// CompactFaceAt decides where r lies, exactly: outside P (an error wrapping
// polyhedron.ErrNotBoundary), in P on no compact face (nil), or on a
// compact face, which is a vertex when it has dimension 0. principal and
// faces report the two conditions for every r; first is the first r that
// fails the principal condition (or, when that holds, the faces
// condition), nil when both hold.
func (an *analysis) remainderCheck(ctx context.Context, rem []monomial.Exponent, hit *polyhedron.Hit) (principal, faces bool, first monomial.Exponent, err error) {
	newton := an.res.newton
	principal, faces = true, true
	var firstPrincipal, firstFaces monomial.Exponent
	x := make([]*big.Rat, len(an.vars))
	c := make([]*big.Rat, len(an.vars))
	for _, r := range rem {
		for i, e := range r {
			x[i] = new(big.Rat).SetInt64(int64(e))
			c[i] = x[i]
		}
		f, ferr := newton.CompactFaceAt(ctx, x)
		inP := ferr == nil
		if ferr != nil && !errors.Is(ferr, polyhedron.ErrNotBoundary) {
			return false, false, nil, ferr
		}
		okPrincipal := inP && (f == nil || f.Dim > 0)
		if !okPrincipal {
			v, _, err := newton.NormalConeMin(ctx, hit.Face, an.res.Weights, c)
			if err != nil {
				return false, false, nil, err
			}
			okPrincipal = v.Cmp(hit.T) > 0
		}
		okFaces := inP && f == nil
		if !okPrincipal && principal {
			principal, firstPrincipal = false, r
		}
		if !okFaces && faces {
			faces, firstFaces = false, r
		}
	}
	if !principal {
		return false, false, firstPrincipal, nil
	}
	return true, faces, firstFaces, nil
}
