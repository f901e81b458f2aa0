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
		if p.Truncated && r.Degree() <= p.Order && !p.abovePoint(r) {
			return fmt.Errorf("%w: a remainder monomial has total degree %d, not above the order %d, and dominates no exponent of K", ErrDimension, r.Degree(), p.Order)
		}
	}
	return nil
}

// abovePoint reports whether r strictly dominates (is ≥ entrywise and
// differs from) an exponent of K, or in sum-of-squares form of a
// generator: then r lies in the Newton polyhedron that is built and on
// none of its compact faces, and so does every multiple of r (see
// remainderCheck).
func (p *Problem) abovePoint(r monomial.Exponent) bool {
	polys := p.Generators
	if p.K != nil {
		polys = []*monomial.Poly{p.K}
	}
	return dominatesSupport(r, polys)
}

// dominatesSupport reports whether r strictly dominates an exponent of one
// of the polynomials.
func dominatesSupport(r monomial.Exponent, polys []*monomial.Poly) bool {
	for _, q := range polys {
		if q == nil {
			continue
		}
		for e := range q.All() {
			if strictlyBelow(e, r) {
				return true
			}
		}
	}
	return false
}

// strictlyBelow reports e ≤ r entrywise and e ≠ r.
func strictlyBelow(e, r monomial.Exponent) bool {
	if len(e) != len(r) {
		return false
	}
	differ := false
	for i, x := range e {
		if x > r[i] {
			return false
		}
		differ = differ || x < r[i]
	}
	return differ
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
//   - The other monomials r must lie strictly above the principal face for
//     one common optimal supporting hyperplane y at t_τ·τ (an element of the
//     normalised normal cone of the principal face; y ≥ 0, so y·(r + s) ≥
//     y·r): one exact LP maximises min_r y·r over that cone
//     (polyhedron.NormalConeMaxMin), and the condition holds when the
//     maximum exceeds t_τ. Then a y of the relative interior near the
//     optimum does too; it exposes the principal face of P, every point of P
//     and of the first kind lies on or above it, and every multiple of these
//     r strictly above, so the full K keeps t_τ and the principal face.
//   - If r lies in P on no compact face, then no multiple of r lies on a
//     compact face either (a compact face has a strictly positive normal a,
//     and a·(r + s) ≥ a·r > b), so every compact face and its face polynomial
//     are those of the full K, and the face verdicts carry over.
//
// A monomial r that strictly dominates an exponent e of the polynomials
// (r = e + s, s ≥ 0, s ≠ 0) lies in P and on no compact face (a·r = a·e +
// a·s > a·e ≥ b for a strictly positive normal a), so it is not a vertex
// either: it passes both conditions without an LP. Such monomials come
// from the truncation by a floor (monomial.Config.Floor, which Spec.Bound
// uses with OrderAuto), and may have total degree ≤ the order.
//
// CompactFaceAt decides where r lies, exactly: outside P (an error wrapping
// polyhedron.ErrNotBoundary), in P on no compact face (nil), or on a
// compact face, which is a vertex when it has dimension 0. principal and
// faces report the two conditions for every r; first is the first r that
// fails the principal condition (or, when that holds, the faces
// condition), nil when both hold.
func (an *analysis) remainderCheck(ctx context.Context, rem []monomial.Exponent, hit *polyhedron.Hit) (principal, faces bool, first monomial.Exponent, err error) {
	newton := an.res.newton
	faces = true
	var firstFaces monomial.Exponent
	var above [][]int // the monomials that must lie above the principal face
	var aboveExp []monomial.Exponent
	x := make([]*big.Rat, len(an.vars))
	for _, r := range rem {
		if dominatesSupport(r, an.polys) {
			continue // in P, on no compact face: passes both conditions
		}
		for i, e := range r {
			x[i] = new(big.Rat).SetInt64(int64(e))
		}
		f, ferr := newton.CompactFaceAt(ctx, x)
		inP := ferr == nil
		if ferr != nil && !errors.Is(ferr, polyhedron.ErrNotBoundary) {
			return false, false, nil, ferr
		}
		if !(inP && (f == nil || f.Dim > 0)) {
			above, aboveExp = append(above, []int(r)), append(aboveExp, r)
		}
		if !(inP && f == nil) && faces {
			faces, firstFaces = false, r
		}
	}
	if len(above) > 0 {
		v, y, err := newton.NormalConeMaxMin(ctx, hit.Face, an.res.Weights, above)
		if err != nil {
			return false, false, nil, err
		}
		if v.Cmp(hit.T) <= 0 {
			// Name a monomial that this best y does not put above.
			for k, r := range above {
				yr := new(big.Rat)
				for i, e := range r {
					yr.Add(yr, new(big.Rat).Mul(y[i], big.NewRat(int64(e), 1)))
				}
				if yr.Cmp(hit.T) <= 0 {
					return false, false, aboveExp[k], nil
				}
			}
			return false, false, aboveExp[0], nil
		}
	}
	return true, faces, firstFaces, nil
}
