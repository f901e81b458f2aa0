package rlct

// vertexRule decides a 0-dimensional face.
//
// Soundness: the face polynomial of a vertex v is the single term c·w^v with
// c ≠ 0 (in sum-of-squares form Σ c_i²·w^{2v} with some c_i ≠ 0), which has
// no zero where every w_i ≠ 0 (common practice).
var vertexRule = faceRule{
	name: RuleVertex,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.face.Dim != 0 {
			return decision{}, false
		}
		return decision{verdict: Nondegenerate}, true
	},
}
