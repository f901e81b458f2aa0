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
	// Divisor, when set, is a polynomial u with u(0) > 0 (a product of A's
	// of this step and the ones before, and of a positive constant) that
	// divides 4·A·C − B² exactly; Core is then the quotient, so that
	// 4·A·C − B² = Divisor·Core (see divideCore).
	Divisor string `json:"divisor,omitempty"`
	// Core is (4·A·C − B²)/Divisor (4·A·C − B² without a Divisor), the K of
	// the next step (or the final core).
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
// A(0) > 0, B(0) = 0 and C(0) = 0, and replaces K by E = 4·A·C − B²,
// divided by what divideCore finds dividing it exactly (units at the
// point: the A's of the steps so far and a positive constant). It
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
//	 4. Replacing E by E/u, u a polynomial with u(0) > 0 dividing it
//	    exactly, keeps 2–3: E/u ≥ 0 near 0 and is comparable to E (see
//	    divideCore).
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
			units := []*monomial.Poly{a}
			for k := len(out.coef) - 1; k >= 0; k-- {
				units = append(units, out.coef[k][0])
			}
			e, u := divideCore(e, units)
			st := Completion{Variable: vars[x], A: a.String(), B: b.String(), Core: e.String()}
			if u != nil {
				st.Divisor = u.String()
			}
			out.steps = append(out.steps, st)
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

// divideCore divides the core e = 4AC − B² of a completion by factors that
// are units at the point and divide it exactly: by each non-constant w of
// units (the A of this step and of the steps before; completeSquares
// passes them latest first) as many times as e = w·s exactly (at most
// maxUnitPower times each), then by the positive rational content of what
// is left (the c > 0 making the coefficients coprime integers). It returns
// the quotient and the product u of what was divided out, nil when nothing
// was. A division that would exceed maxSubstTerms terms or maxDivideWork
// is skipped, as is one that is not exact.
//
// Soundness. Every w used has w(0) > 0 (checked here; completeSquares
// takes a pivot only when its A is positive at 0) and the content is a
// positive constant, so u is a polynomial with u(0) > 0: on a
// neighbourhood of 0, c ≤ u ≤ c' for constants 0 < c ≤ c'. The division
// is exact, checked term by term
// (monomial.DivExact stops with "not divisible" on a non-zero remainder),
// so e = u·s as polynomials, and near 0, c·s ≤ e ≤ c'·s with s ≥ 0 (e ≥ 0
// and u > 0) and s(0) = e(0)/u(0) = 0. Hence s is a nonnegative polynomial
// vanishing at 0, comparable to e: it has the same λ and θ under any prior,
// and the next step may be taken on it just as on e (point 2 of
// completeSquares holds for s as for e). Dividing by the A of the step
// before is the exact division of fraction-free (Bareiss) elimination,
// which keeps the degrees of the cores from growing at every step; with
// polynomial coefficients no division is assumed to be exact: each is
// attempted and used only when its remainder is zero.
func divideCore(e *monomial.Poly, units []*monomial.Poly) (*monomial.Poly, *monomial.Poly) {
	var u *monomial.Poly
	for _, w := range units {
		if w.IsConstant() || w.ConstantTerm().Sign() <= 0 {
			continue
		}
		for range maxUnitPower {
			if e.IsZero() {
				break
			}
			// A division refused by its limits is not taken: not
			// dividing is always sound, the core only stays larger.
			s, ok, err := e.DivExact(w, monomial.Limits{MaxTerms: maxSubstTerms, MaxWork: maxDivideWork})
			if err != nil || !ok {
				break
			}
			e = s
			if u == nil {
				u = w
			} else {
				u = u.Mul(w)
			}
		}
	}
	if c := content(e); c != nil && c.Cmp(big.NewRat(1, 1)) != 0 {
		e = e.Scale(new(big.Rat).Inv(c))
		if u == nil {
			u = monomial.Constant(e.Vars(), c)
		} else {
			u = u.Scale(c)
		}
	}
	return e, u
}

// maxUnitPower bounds how many times divideCore divides by one unit, and
// maxDivideWork the work of one division (monomial.Limits.MaxWork).
const (
	maxUnitPower  = 16
	maxDivideWork = 50_000_000
)

// content returns the positive rational c such that q/c has coprime
// integer coefficients (the gcd of the numerators over the lcm of the
// denominators), or nil for q = 0.
func content(q *monomial.Poly) *big.Rat {
	var num, den *big.Int
	for _, c := range q.All() {
		n := new(big.Int).Abs(c.Num())
		if num == nil {
			num, den = n, new(big.Int).Set(c.Denom())
			continue
		}
		num.GCD(nil, nil, num, n)
		g := new(big.Int).GCD(nil, nil, den, c.Denom())
		den.Mul(den, new(big.Int).Quo(c.Denom(), g))
	}
	if num == nil {
		return nil
	}
	return new(big.Rat).SetFrac(num, den)
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
