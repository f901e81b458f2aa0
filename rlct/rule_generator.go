package rlct

import "fmt"

// generatorRule decides, in sum-of-squares form, a face on which one
// generator's part has no zero in the real torus.
//
// Soundness: the face polynomial of K = Σ g_i² is Σ (g_i on σ)² (common
// practice: the lowest weighted part of a sum of squares is the sum of the
// squares of the lowest parts, because the squares of the lowest parts
// cannot cancel), which vanishes at a torus point only where every part
// does. A part has no torus zero when it is a single term; when its terms
// have even exponents and coefficients of one sign; or when its support lies
// on a line, so that it is c·w^v·p(w^u) with p univariate and p(0) ≠ 0, and
// p has no real root (Sturm sequences, exactly), because w^u takes only
// non-zero real values on the torus.
var generatorRule = faceRule{
	name: RuleGenerator,
	decide: func(fc *faceCase) (decision, bool) {
		if !fc.sos {
			return decision{}, false
		}
		for i, q := range fc.parts {
			if q.IsZero() {
				continue
			}
			if evenSameSign(q) {
				return decision{verdict: Nondegenerate, detail: fmt.Sprintf("generator %d", i+1)}, true
			}
			if l, ok := alongLine(q); ok && countRealRoots(l.p) == 0 {
				return decision{verdict: Nondegenerate, detail: fmt.Sprintf("generator %d", i+1)}, true
			}
		}
		return decision{}, false
	},
}
