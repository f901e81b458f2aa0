package rlct

// quadraticRule decides a face whose polynomial F is a quadratic form in
// monomials, F = w^b·Σ M_ij·w^{u_i}·w^{u_j} (for example every term of
// degree 2 after dividing by a common monomial), by an exact symmetric
// elimination over Q (see decideQuadratic).
//
// Soundness: if M is positive definite (Sylvester's criterion on the exact
// pivots; common practice), F > 0 wherever every w^{u_i} ≠ 0, so on the
// whole torus. When the w^{u_i} are distinct variables they range over the
// whole torus of those variables, and a positive semidefinite M (checked
// exactly) vanishes exactly on its kernel, so F has a torus zero exactly
// when the kernel holds a vector with no zero coordinate; a rational one
// is found exactly and is the witness. Any other case declines. No sign
// premise is used.
var quadraticRule = faceRule{
	name: RuleQuadratic,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.face.Dim < 1 {
			return decision{}, false
		}
		dec, how, ok := decideQuadratic(facePoly(fc))
		if !ok {
			return decision{}, false
		}
		if !dec.zero {
			return decision{verdict: Nondegenerate, detail: how}, true
		}
		return decision{verdict: Degenerate, detail: how, witness: witnessOf(fc.vars, dec.point, "", "")}, true
	},
}
