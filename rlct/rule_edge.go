package rlct

import "math/big"

// edgeRule decides a 1-dimensional face exactly.
//
// Soundness: every exponent on an edge with vertices v0, v1 is v0 + k·u for
// the primitive vector u = (v1 − v0)/g and an integer k, so each part is
// w^v·p_i(w^u) with p_i univariate and p_i(0) ≠ 0. On the real torus w^u
// takes every non-zero real value (u is primitive, so it has an odd entry
// for negative values), and w^v ≠ 0, so the face polynomial vanishes on the
// torus exactly when the p_i have a common real root, a root of their gcd
// (for K itself, a root of p). Sturm's theorem counts the real roots of the
// gcd exactly (common practice; any text on real algebra, e.g. Basu,
// Pollack & Roy 2006, Algorithms in Real Algebraic Geometry, Theorem 2.50,
// from memory), and a root is isolated in an exact interval for the witness.
var edgeRule = faceRule{
	name: RuleEdge,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.face.Dim != 1 {
			return decision{}, false
		}
		u, g := edgeUnivariate(fc)
		if countRealRoots(g) == 0 {
			return decision{verdict: Nondegenerate}, true
		}
		root := isolateRoots(g, big.NewRat(1, 1<<30))[0]
		return decision{verdict: Degenerate, witness: torusWitness(fc.vars, u, root)}, true
	},
}

// edgeUnivariate returns the primitive direction u of the edge fc and the
// gcd of the univariate polynomials p_i with part_i = w^v·p_i(w^u).
func edgeUnivariate(fc *faceCase) ([]int, upoly) {
	v0, v1 := fc.verts[fc.face.Vertices[0]], fc.verts[fc.face.Vertices[1]]
	u := primitive(v0, v1)
	var g upoly
	for _, q := range fc.parts {
		if q.IsZero() {
			continue
		}
		g = gcd(g, univariate(q, v0, u))
	}
	return u, g
}
