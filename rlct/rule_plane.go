package rlct

// planeRule decides a 2-dimensional face exactly (see decidePlane for the
// method and its soundness argument): a unimodular monomial change of
// coordinates, built from the lattice spanned by the differences of the
// face polynomial's exponents, writes F = w^v·P(s, t) with P a polynomial in
// two variables; the change is a group automorphism of the real torus, so
// F and P have torus zeros together. The s-line is cut at the real roots
// of s·lc_t(P)·P(s, 0)·Res_t(P, ∂P/∂t) (P made square-free in t first),
// and one rational point of each open interval and every root (rational,
// or algebraic with exact arithmetic in Q(α)) is tested exactly with
// Sturm sequences for a non-zero real root in t.
//
// The rule uses no sign premise: it decides whether F vanishes on the torus
// whatever the sign of F. (When K ≥ 0, the premise of the computation, F is
// ≥ 0 on the torus and its zeros are critical points of F, which is why
// they sit above roots of the discriminant; the decomposition does not
// need this.) Limits on the degrees make it decline rather than run long.
var planeRule = faceRule{
	name: RulePlane,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.face.Dim != 2 {
			return decision{}, false
		}
		F := facePoly(fc)
		dec, how, ok := decidePlane(F)
		if !ok {
			return decision{}, false
		}
		if !dec.zero {
			return decision{verdict: Nondegenerate, detail: how}, true
		}
		change, _ := reduceSupport(F.Support())
		return decision{verdict: Degenerate, detail: how, witness: witnessOf(fc.vars, dec.point, "", change.describe(fc.vars))}, true
	},
}
