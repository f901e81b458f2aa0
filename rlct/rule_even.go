package rlct

import "github.com/lctkit/lctkit/monomial"

// evenPositiveRule decides a face whose polynomial (in polynomial form) has
// only positive coefficients and even exponents.
//
// Soundness: on the real torus each term c·w^e with c > 0 and e even is
// strictly positive, so their sum is too (common practice). Every compact
// face holding no unsafe point (see Certificate.Unsafe) is of this kind,
// which is why the certificate never needs to visit those faces.
var evenPositiveRule = faceRule{
	name: RuleEvenPositive,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.sos || !evenPositive(fc.parts[0]) {
			return decision{}, false
		}
		return decision{verdict: Nondegenerate}, true
	},
}

// evenPositive reports whether every term of q has a positive coefficient
// and only even exponents.
func evenPositive(q *monomial.Poly) bool {
	for e, c := range q.All() {
		if c.Sign() <= 0 || !allEven(e) {
			return false
		}
	}
	return true
}

// evenSameSign reports whether q is non-zero and all its terms have even
// exponents and coefficients of one sign.
func evenSameSign(q *monomial.Poly) bool {
	sign := 0
	for e, c := range q.All() {
		if !allEven(e) || (sign != 0 && c.Sign() != sign) {
			return false
		}
		sign = c.Sign()
	}
	return sign != 0
}

func allEven(e monomial.Exponent) bool {
	for _, x := range e {
		if x%2 != 0 {
			return false
		}
	}
	return true
}
