package model

import (
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// buildDiscrete builds K for a model of a discrete observation y with
// category probabilities p_k(w), optionally given a discrete input c with
// weights π_c (a design). The Kullback–Leibler divergence
//
//	KL(w) = Σ_c π_c Σ_k q_{ck}·log(q_{ck}/p_{ck}(w)),  q = p(w*),
//
// is not a polynomial, and K is replaced by the weighted sum of squares
//
//	K(w) = Σ_c π_c Σ_k (p_{ck}(w) − q_{ck})²/(2·q_{ck}),
//
// which needs every q_{ck} > 0. The two are comparable near the truth:
// with r = p/q − 1, KL = Σ π q·(r − log(1 + r)) because Σ_k q_{ck}·r_{ck} =
// Σ_k (p_{ck} − q_{ck}) = 0, and r − log(1 + r) lies between r²/4 and r²
// for |r| ≤ 1/2 (its ratio to r² falls from 0.773 at r = −1/2 to 0.378 at
// r = 1/2), so K/2 ≤ KL ≤ 2K wherever every |p_{ck}/q_{ck} − 1| ≤ 1/2, a
// neighbourhood of the truth since there are finitely many categories and
// q > 0. Functions comparable in this way have the same real log
// canonical threshold and multiplicity (Watanabe 2009, Algebraic Geometry
// and Statistical Learning Theory, Cambridge University Press: the learning
// coefficient depends only on K up to such bounds; the theorem's number is
// from memory and not checked here). The positive weights π_c/(2q_{ck})
// change neither the Newton polyhedron nor the zeros of any face
// polynomial (rlct.Problem.GeneratorWeights).
//
// The probabilities must sum to 1 identically: exactly for polynomials, and
// for series every term of their sum minus 1 must lie in the remainder
// (a term that the expansion determines must vanish).
func buildDiscrete(b *build) error {
	d := b.d
	combos, err := designCombos(d.src, d.inputs)
	if err != nil {
		return err
	}
	var groups []categoryGroup
	var pieces []piece
	for _, c := range combos {
		if err := b.stopped(); err != nil {
			return err
		}
		env := b.environment(c)
		g := categoryGroup{weight: c.weight, given: c.label}
		ev := &evaluator{src: d.src, env: env, budget: &b.budget}
		for _, cat := range d.cats {
			v, err := ev.run(cat.expr)
			if err != nil {
				return err
			}
			for k, f := range v.e {
				label := cat.name
				if len(v.e) > 1 {
					label = fmt.Sprintf("%s[%d]", cat.name, k+1)
				}
				g.labels = append(g.labels, label)
				g.pos = append(g.pos, cat.pos)
				ctx := ""
				if c.label != "" {
					ctx = "given " + c.label + ": "
				}
				pieces = append(pieces, piece{f: f, context: ctx})
			}
		}
		groups = append(groups, g)
	}
	if len(groups[0].labels) < 2 {
		return errorAt(d.src, d.cats[0].pos, "a discrete model needs at least two categories")
	}
	exs, err := b.expandAll(pieces, nil, b.order)
	if err != nil {
		return err
	}
	k := 0
	for i := range groups {
		n := len(groups[i].labels)
		groups[i].exs = exs[k : k+n]
		k += n
	}
	if err := b.addCategories(groups, d.kindPos); err != nil {
		return err
	}
	b.m.What = "K(w) = Σ_k (p_k(w) − q_k)²/(2·q_k) with q = p(w*)" + b.weighted() + ", comparable to the Kullback–Leibler divergence near the truth (same λ and θ; Watanabe 2009)"
	return nil
}

// weighted says how K averages over a discrete input, when there is one.
func (b *build) weighted() string {
	if len(b.d.inputs) == 0 {
		return ""
	}
	return ", averaged over the input's design"
}

// categoryGroup is one conditional distribution: the categories given one
// joint point of the inputs.
type categoryGroup struct {
	weight *big.Rat
	given  string // the joint input point, "" without inputs
	labels []string
	pos    []int // where each category is declared
	exs    []*monomial.Expansion
}

// addCategories checks each group's probabilities and adds the generators
// p_k − q_k with weights π/(2·q_k) (see buildDiscrete). sumPos is where an
// error about the sum is reported when the group has no position of its
// own.
func (b *build) addCategories(groups []categoryGroup, sumPos int) error {
	src := b.d.src
	at := b.at(0)
	for _, g := range groups {
		given := ""
		if g.given != "" {
			given = " given " + g.given
		}
		// Σ_k p_k = 1, identically.
		if err := b.sumIsOne(g.exs, g.pos[0], "the probabilities"+given); err != nil {
			return err
		}
		for k, ex := range g.exs {
			q := ex.Poly.Eval(at)
			if !b.series {
				for t := 1; t < len(b.points); t++ {
					if ex.Poly.Eval(b.points[t]).Cmp(q) != 0 {
						return errorAt(src, b.d.truths[t].pos, "this truth gives another distribution than the first (category %s%s): the truths of one description must be points of one true distribution", g.labels[k], given)
					}
				}
			}
			switch q.Sign() {
			case -1:
				return errorAt(src, g.pos[k], "category %s%s has probability %s at the truth, which is negative", g.labels[k], given, q.RatString())
			case 0:
				return errorAt(src, g.pos[k], "category %s%s has probability 0 at the truth: K is replaced by Σ (p − q)²/(2q), which needs q > 0 (near such a truth the divergence is not comparable to a sum of squares); leave the category out if it is impossible in the model, or choose a truth where it is possible", g.labels[k], given)
			}
			w := new(big.Rat).Quo(g.weight, new(big.Rat).Mul(big.NewRat(2, 1), q))
			label := "category " + g.labels[k] + given
			b.addGenerator(ex.Poly.Sub(monomial.Constant(b.vars, q)), w, label)
			if len(ex.Remainder) > 0 {
				b.addRemainder(ex.Remainder)
			}
		}
	}
	return nil
}

// offsetNote says, for a series, that polynomials are in offsets.
func (b *build) offsetNote() string {
	if !b.series {
		return ""
	}
	return " (in the offsets from the truth)"
}
