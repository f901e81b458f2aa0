package rlct

import "fmt"

// A faceRule is one sound test of whether a compact face polynomial K_σ
// vanishes somewhere in the real torus (R∖{0})^d. The rules are tried in
// the order of faceRules and the first that applies decides the face; a
// face no rule decides is Undetermined. A rule must never guess: when it
// cannot prove its verdict it does not apply. Each rule lives in a file of
// its own (rule_*.go) whose doc comment gives its soundness argument and
// source, so a new rule is one new file and one line in faceRules.
//
// K_σ is a sum of even-positive terms on every face that holds none of the
// unsafe points (see Certificate.Unsafe), so only those faces, and
// the faces of the full list (Options.AllFaces), reach the rules.
type faceRule struct {
	// name is the value of Face.Rule for the faces this rule decides.
	name string
	// decide returns the verdict on fc, or ok = false when the rule does
	// not apply.
	decide func(fc *faceCase) (dec decision, ok bool)
}

// decision is a rule's verdict on one face.
type decision struct {
	verdict FaceVerdict
	// detail, when set, says what the rule used ("generator 2").
	detail string
	// witness shows the torus zero of a Degenerate face.
	witness *Witness
}

// Rule names, the values of Face.Rule.
const (
	// RuleVertex: a single term c·w^v (c ≠ 0) never vanishes on the torus.
	RuleVertex = "vertex"
	// RuleEvenPositive: a positive combination of monomials with even
	// exponents is positive on the torus.
	RuleEvenPositive = "even-positive-terms"
	// RuleGenerator: in sum-of-squares form, one generator's face part has
	// no torus zero (a single term, terms of one sign with even exponents,
	// or c·w^v·p(w^u) with p free of real roots), so the generators have
	// no common torus zero.
	RuleGenerator = "generator-without-torus-zero"
	// RuleEdge: on an edge the face polynomial is w^v·p(w^u) with p
	// univariate; a real root of p (of the gcd of the p_i in sum-of-squares
	// form) was sought exactly with Sturm sequences.
	RuleEdge = "edge-sturm"
	// RuleSplit: the face polynomial is a sum of parts in disjoint sets of
	// variables, each decided exactly (relies on K ≥ 0 in polynomial form).
	RuleSplit = "split-variables"
	// RuleQuadratic: the face polynomial is a quadratic form in monomials,
	// decided by an exact symmetric elimination over Q.
	RuleQuadratic = "quadratic-form"
	// RulePlane: on a 2-dimensional face the polynomial is, after a
	// unimodular monomial change, a polynomial in two variables whose
	// torus zeros were sought exactly (discriminant, Sturm sequences).
	RulePlane = "plane-decomposition"
	// RuleNone: no rule applies; the face is Undetermined.
	RuleNone = "none"
)

// faceRules is the ordered table of rules.
var faceRules = []faceRule{
	vertexRule,
	evenPositiveRule,
	generatorRule,
	edgeRule,
	splitRule,
	quadraticRule,
	planeRule,
}

// decideFace applies the rules in order and fills in the verdict of fr.
func decideFace(fc *faceCase, fr *Face) {
	for _, r := range faceRules {
		dec, ok := r.decide(fc)
		if !ok {
			continue
		}
		fr.Verdict, fr.Rule, fr.Witness = dec.verdict, r.name, dec.witness
		fr.Reason = dec.detail
		return
	}
	fr.Verdict, fr.Rule = Undetermined, RuleNone
	if fc.sos {
		fr.Reason = fmt.Sprintf("a %d-dimensional face where every generator's face part has several terms and none is free of torus zeros by the rules available", fc.face.Dim)
	} else {
		fr.Reason = fmt.Sprintf("a %d-dimensional face whose polynomial has negative coefficients or odd exponents; no exact rule decides it", fc.face.Dim)
	}
}
