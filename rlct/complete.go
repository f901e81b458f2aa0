package rlct

import (
	"math/big"
	"slices"

	"github.com/lctkit/lctkit/monomial"
)

// Completion is one step of an exact reduction in polynomial form: K, of
// degree 2 in the coordinate x, is written K = A·x² + B·x + C with A, B, C
// free of x and A a unit at the point (A(0) > 0), and replaced by the core
// 4·A·C − B², a polynomial in the other coordinates (see completeSquares).
type Completion struct {
	// Variable is the coordinate x.
	Variable string `json:"variable"`
	// A and B are the coefficients of x² and x, in the offsets from the
	// point, in the coordinates left by the steps before this one; C is
	// the rest of K (its terms free of x), so the step can be replayed
	// from A and B alone.
	A string `json:"a"`
	B string `json:"b"`
	// Core is 4·A·C − B², the K of the next step (or the final core).
	Core string `json:"core"`
}

// exactCompletion is the outcome of completeSquares.
type exactCompletion struct {
	steps  []Completion
	pivots []int               // the coordinates split off, in order
	coef   [][2]*monomial.Poly // A and B of each step
	core   *monomial.Poly      // the K after the last step
}

// completeSquares splits regular directions off K (polynomial form, in the
// offsets from the point, K ≥ 0 near 0 and K(0) = 0) by completing the
// square exactly, one coordinate at a time, among pivots (the coordinates
// the LDLᵀ of quadraticSystem chose, all with τ = 1). At each step it takes
// the first remaining pivot x, in the order of pivots, in which the current
// K is K = A·x² + B·x + C (degree exactly 2 in x; A, B, C free of x) with
// A(0) > 0, B(0) = 0 and C(0) = 0, and replaces K by E = 4·A·C − B². It
// stops after want steps or when no pivot qualifies; it returns nil when
// no step applies, and errTooLarge when a polynomial would exceed
// maxSubstTerms.
//
// Soundness. Take one step on K(x, v) = A(v)·x² + B(v)·x + C(v), where
// A(0) > 0, B(0) = 0, and x carries τ = 1 (the prior is smooth and positive
// in x). On a neighbourhood U of 0, c ≤ A ≤ c' for constants 0 < c ≤ c',
// so 1/A is analytic there and
//
//		K = A·u² + D(v),  u = x + B/(2A),  D = (4AC − B²)/(4A) = E/(4A).
//
//	 1. (x, v) ↦ (u, v) is analytic, fixes 0 (B(0) = 0) and has a triangular
//	    Jacobian with determinant 1; the other coordinates are not moved, so
//	    the prior keeps its form (its factor in x is smooth and positive, and
//	    stays so). Point 1 of reduce applies.
//	 2. D ≥ 0 near 0: D(v) = K(−B(v)/(2A(v)), v), and the point
//	    (−B/(2A), v) tends to 0 as v → 0 because B(0) = 0, so it lies where
//	    K ≥ 0 for v near 0. Hence E = 4A·D ≥ 0 near 0 as well: the core is a
//	    nonnegative polynomial vanishing at 0 (E(0) = 4A(0)C(0) − B(0)² = 0),
//	    so the premises under which it is bounded (and certified) are those
//	    of K itself, and the next step may be taken on it.
//	 3. With both terms nonnegative, min(c, 1/(4c'))·(u² + E) ≤ K ≤
//	    max(c', 1/(4c))·(u² + E) near 0: K is comparable to u² + E(v), and
//	    points 2–3 of reduce give λ(K) = 1/2 + λ(E), θ(K) = θ(E), E in the
//	    coordinates other than x, with the prior of K restricted to them.
//
// By induction, after k steps λ(K) = k/2 + λ(E_k) and θ(K) = θ(E_k). Every
// polynomial is computed exactly (math/big coefficients through monomial),
// nothing is truncated, so the core's status is that of an exact
// polynomial. The steps only need τ = 1 on the pivots and A(0) > 0 (a
// negative A(0) would contradict K ≥ 0; such a pivot is just not used), so
// the order in which pivots are taken does not matter for soundness; the
// order of pivots is preferred so that the steps follow the LDLᵀ, whose
// later pivots keep a positive x² coefficient in E (E's quadratic part is
// 4A(0) times the Schur complement of the quadratic part of K).
func completeSquares(K *monomial.Poly, pivots []int, want int) (*exactCompletion, error) {
	vars := K.Vars()
	cur := K
	left := slices.Clone(pivots)
	out := &exactCompletion{}
	four := big.NewRat(4, 1)
	for len(out.pivots) < want {
		found := -1
		for k, x := range left {
			if degreeIn(cur, x) != 2 {
				continue
			}
			co := splitByDegree(cur, x)
			a, b, c := co[2], co[1], co[0]
			if a.ConstantTerm().Sign() <= 0 || b.ConstantTerm().Sign() != 0 || c.ConstantTerm().Sign() != 0 {
				continue
			}
			if a.Len()*c.Len() > 4*maxSubstTerms || b.Len()*b.Len() > 4*maxSubstTerms {
				return nil, errTooLarge
			}
			e := a.Mul(c).Scale(four).Sub(b.Mul(b))
			if e.Len() > maxSubstTerms {
				return nil, errTooLarge
			}
			out.steps = append(out.steps, Completion{Variable: vars[x], A: a.String(), B: b.String(), Core: e.String()})
			out.pivots = append(out.pivots, x)
			out.coef = append(out.coef, [2]*monomial.Poly{a, b})
			cur = e
			found = k
			break
		}
		if found < 0 {
			break
		}
		left = slices.Delete(left, found, found+1)
	}
	if len(out.pivots) == 0 {
		return nil, nil
	}
	out.core = cur
	return out, nil
}

// splitByDegree writes q = Σ_k c_k·x_j^k with c_k free of x_j and returns
// c_0, …, c_e (e the degree of q in x_j).
func splitByDegree(q *monomial.Poly, j int) []*monomial.Poly {
	vars := q.Vars()
	e := degreeIn(q, j)
	exps := make([][]monomial.Exponent, e+1)
	coefs := make([][]*big.Rat, e+1)
	for ex, c := range q.All() {
		f := slices.Clone(ex)
		k := f[j]
		f[j] = 0
		exps[k] = append(exps[k], f)
		coefs[k] = append(coefs[k], c)
	}
	out := make([]*monomial.Poly, e+1)
	for k := range out {
		out[k] = mustTerms(vars, exps[k], coefs[k])
	}
	return out
}

// solution returns step k as the text "x = −B/(2A)": the critical point of
// K in x, in the coordinates left by the steps before it (x = −B/(2A)
// solves ∂K/∂x = 2A·x + B = 0, as Reduction.Solution says in polynomial
// form).
func (c *exactCompletion) solution(vars []string, k int) string {
	a, b := c.coef[k][0], c.coef[k][1]
	x := vars[c.pivots[k]]
	if a.IsConstant() {
		inv := new(big.Rat).Inv(new(big.Rat).Mul(a.ConstantTerm(), big.NewRat(-2, 1)))
		return x + " = " + b.Scale(inv).String()
	}
	return x + " = (" + b.Neg().String() + ")/(" + a.Scale(big.NewRat(2, 1)).String() + ")"
}
