package rlct

import (
	"fmt"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// splitRule decides a face whose polynomial F splits into parts in disjoint
// sets of variables, F = A_1 + … + A_k (k ≥ 2), deciding each part with the
// exact tests of decideTorus (single term, even terms of one sign, a
// collinear support, a quadratic form, a support in a plane).
//
// Soundness. No part has a constant term (every exponent on a compact face
// is non-zero; the rule checks it), so each A_j tends to 0 as its variables
// tend to 0 inside the torus, and inf A_j ≤ 0 over the torus. If F ≥ 0 on
// the torus then, since the parts have disjoint variables, inf F = Σ inf A_j
// ≥ 0, which forces inf A_j = 0: every part is ≥ 0 on the torus. Then F
// vanishes at a torus point exactly when every part does there, and the
// parts can be chosen independently, so F has a torus zero exactly when
// each part has one (the witness joins their zeros, 1 in the variables of
// no part), and none when one part has none.
//
// Premise. F ≥ 0 on the torus holds in sum-of-squares form (F is a sum of
// squares). In polynomial form it follows from K ≥ 0, the premise of the
// whole computation (K is a Kullback–Leibler divergence): if F(w0) < 0 at a
// torus point, K is negative along w = s^a·w0 for small s > 0 (see the
// sign check in signcheck.go). The rule therefore relies on K ≥ 0 in
// polynomial form, as the certificate as a whole does.
var splitRule = faceRule{
	name: RuleSplit,
	decide: func(fc *faceCase) (decision, bool) {
		if fc.face.Dim < 2 {
			return decision{}, false
		}
		F := facePoly(fc)
		if F == nil {
			return decision{}, false
		}
		parts := splitByVariables(F)
		if len(parts) < 2 {
			return decision{}, false
		}
		d := F.NumVars()
		point := &torusPoint{exact: make([]*big.Rat, d), approx: make([]float64, d)}
		for i := range d {
			point.exact[i], point.approx[i] = big.NewRat(1, 1), 1
		}
		exact := true
		var notes []string
		for j, A := range parts {
			if A.ConstantTerm().Sign() != 0 {
				return decision{}, false
			}
			dec, _, ok := decideTorus(A)
			if !ok {
				return decision{}, false
			}
			if !dec.zero {
				return decision{verdict: Nondegenerate, detail: fmt.Sprintf("part %d of %d, %s, has no torus zero", j+1, len(parts), A.String())}, true
			}
			used := usedVars(A)
			for i := range d {
				if !used[i] {
					continue
				}
				point.approx[i] = dec.point.approx[i]
				if dec.point.exact != nil {
					point.exact[i] = dec.point.exact[i]
				} else {
					exact = false
				}
			}
			if dec.point.note != "" {
				notes = append(notes, fmt.Sprintf("part %d: %s", j+1, dec.point.note))
			}
		}
		if !exact {
			point.exact = nil
		}
		point.note = strings.Join(notes, "; ")
		return decision{verdict: Degenerate, detail: fmt.Sprintf("every one of the %d parts in disjoint variables vanishes", len(parts)),
			witness: witnessOf(fc.vars, point, "", "")}, true
	},
}

// decideTorus decides whether a polynomial vanishes on the torus by the
// exact tests available, cheapest first; ok is false when none applies.
// how says what decided it.
func decideTorus(F *monomial.Poly) (torusDecision, string, bool) {
	if dec, ok := decideTorusCheap(F); ok {
		return dec, "", true
	}
	if dec, how, ok := decideQuadratic(F); ok {
		return dec, how, true
	}
	return decidePlane(F)
}

// usedVars marks the variables that occur in q.
func usedVars(q *monomial.Poly) []bool {
	used := make([]bool, q.NumVars())
	for e := range q.All() {
		for i, x := range e {
			if x != 0 {
				used[i] = true
			}
		}
	}
	return used
}

// splitByVariables returns the parts of F in disjoint sets of variables:
// the terms grouped by the connected components of the graph in which two
// terms are joined when they share a variable.
func splitByVariables(F *monomial.Poly) []*monomial.Poly {
	d := F.NumVars()
	parent := make([]int, d)
	for i := range parent {
		parent[i] = i
	}
	find := func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for e := range F.All() {
		first := -1
		for i, x := range e {
			if x == 0 {
				continue
			}
			if first < 0 {
				first = i
				continue
			}
			parent[find(i)] = find(first)
		}
	}
	comp := func(e monomial.Exponent) int {
		for i, x := range e {
			if x != 0 {
				return find(i)
			}
		}
		return -1
	}
	seen := map[int]bool{}
	var roots []int
	for e := range F.All() {
		if c := comp(e); !seen[c] {
			seen[c] = true
			roots = append(roots, c)
		}
	}
	var out []*monomial.Poly
	for _, r := range roots {
		out = append(out, F.Filter(func(e monomial.Exponent) bool { return comp(e) == r }))
	}
	return out
}
