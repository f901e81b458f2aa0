package model

import (
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// buildMixture builds K for a mixture p(y|w) = Σ_i a_i(w)·F(y; θ_i(w)) of
// distributions from one family, the weights a_i summing to 1
// identically.
//
// Binomial components (n trials, success probability θ_i; Bernoulli is
// n = 1) give a discrete model with categories y = 0, …, n and
// p(y) = C(n, y)·Σ_i a_i·θ_i^y·(1 − θ_i)^(n−y), and K is built as for a
// discrete model (see buildDiscrete).
//
// Poisson components with means μ_i need a truth that is a single Poisson
// law q = Poisson(μ*): every component with a positive weight at the truth
// has mean μ* there. Then, with Δ_i = μ_i − μ*,
//
//	Σ_y p(y)²/q(y) = Σ_{i,j} a_i·a_j·exp(Δ_i·Δ_j/μ*)
//
// (sum the exponential series Σ_y (μ_i·μ_j/μ*)^y/y!; common practice), and
// since Σ_{i,j} a_i·a_j = 1 the χ² divergence expands into a sum of squares,
//
//	χ²(p‖q) = Σ_y (p − q)²/q = Σ_{k≥1} (Σ_i a_i·Δ_i^k)²/(k!·μ*^k).
//
// K is χ²/2 = Σ_k g_k²/(2·k!·μ*^k) with g_k = Σ_i a_i·Δ_i^k, the generators
// for k = 1, …, D (the order). Every term of a generator left out (k > D)
// is a multiple of a monomial of a_i·Δ_i^(D+1) or of its remainder, since
// a_i·Δ_i^k = a_i·Δ_i^(D+1)·Δ_i^(k−D−1); these monomials are the remainder
// of K. That χ²/2 is comparable to the Kullback–Leibler divergence near
// such a truth, as for finitely many categories (buildDiscrete), is recalled
// from memory for this family with infinitely many counts (Watanabe 2009
// treats mixtures of exponential families through such sums), not proved
// here; TestPoissonKLRatio checks the ratio numerically on a grid.
func buildMixture(b *build) error {
	d := b.d
	env := b.environment(combo{values: map[string][]*big.Rat{}, weight: big.NewRat(1, 1)})
	ev := &evaluator{src: d.src, env: env, budget: &b.budget}
	var weights, args []*frag
	for _, c := range d.comps {
		w, err := ev.run(c.weight)
		if err != nil {
			return err
		}
		a, err := ev.run(c.arg)
		if err != nil {
			return err
		}
		weights, args = append(weights, w.e[0]), append(args, a.e[0])
	}
	if d.comps[0].family == "poisson" {
		return b.poisson(weights, args)
	}
	// Binomial: the weights first (for a clear message), then the counts.
	if err := b.checkWeights(weights); err != nil {
		return err
	}
	n := d.comps[0].trials
	g := categoryGroup{weight: big.NewRat(1, 1)}
	var pieces []piece
	for y := 0; y <= n; y++ {
		f := &frag{}
		f.emit(binomial(n, y).String()+"*(", d.comps[0].pos)
		for i, c := range d.comps {
			if i > 0 {
				f.emit(" + ", c.pos)
			}
			f.wrapped(weights[i], c.pos)
			f.emit("*", c.pos)
			f.wrapped(args[i], c.pos)
			f.emit(fmt.Sprintf("^%d*(1 - ", y), c.pos)
			f.wrapped(args[i], c.pos)
			f.emit(fmt.Sprintf(")^%d", n-y), c.pos)
		}
		f.emit(")", d.comps[0].pos)
		pieces = append(pieces, piece{f: f})
		g.labels = append(g.labels, fmt.Sprintf("y = %d", y))
		g.pos = append(g.pos, d.comps[0].pos)
	}
	exs, err := b.expandAll(pieces, nil, b.order)
	if err != nil {
		return err
	}
	g.exs = exs
	if err := b.addCategories([]categoryGroup{g}, d.kindPos); err != nil {
		return err
	}
	b.m.What = fmt.Sprintf("K(w) = Σ_y (p_y(w) − q_y)²/(2·q_y) over the counts y = 0, …, %d with q = p(w*), comparable to the Kullback–Leibler divergence near the truth (same λ and θ; Watanabe 2009)", n)
	return nil
}

// binomial returns C(n, k).
func binomial(n, k int) *big.Int { return new(big.Int).Binomial(int64(n), int64(k)) }

// checkWeights expands the mixing weights and checks that they sum to 1
// identically (as categories do, see addCategories).
func (b *build) checkWeights(weights []*frag) error {
	pieces := make([]piece, len(weights))
	for i, w := range weights {
		pieces[i] = piece{f: w}
	}
	exs, err := b.expandAll(pieces, nil, b.order)
	if err != nil {
		return err
	}
	return b.sumIsOne(exs, b.d.comps[0].pos, "the mixing weights")
}

// sumIsOne checks that expansions sum to 1: every term of their sum minus
// 1 must be a multiple of a remainder monomial.
func (b *build) sumIsOne(exs []*monomial.Expansion, pos int, what string) error {
	sum := monomial.Constant(b.vars, big.NewRat(-1, 1))
	var rem []monomial.Exponent
	for _, ex := range exs {
		sum = sum.Add(ex.Poly)
		rem = append(rem, ex.Remainder...)
	}
	for e, c := range sum.All() {
		inRem := false
		for _, r := range rem {
			if divides(r, e) {
				inRem = true
				break
			}
		}
		if !inRem {
			return errorAt(b.d.src, pos, "%s do not sum to 1: their sum minus 1 has the term %s%s", what, monomial.Monomial(b.vars, e, c).String(), b.offsetNote())
		}
	}
	return nil
}

// poisson builds K = χ²/2 for a Poisson mixture (see buildMixture).
func (b *build) poisson(weights, means []*frag) error {
	d := b.d
	if b.order == 0 {
		return errorAt(d.src, d.comps[0].pos, "a Poisson mixture needs an order statement: K = Σ_k (Σ_i a_i·(μ_i − μ*)^k)²/(2·k!·μ*^k) is cut at k = D (order D)")
	}
	if len(b.points) > 1 {
		return errorAt(d.src, d.truths[1].pos, "a Poisson mixture is expanded as a series at one truth; give one truth statement")
	}
	b.series, b.decided = true, true
	pieces := make([]piece, 0, 2*len(weights))
	for i := range weights {
		pieces = append(pieces, piece{f: weights[i]}, piece{f: means[i]})
	}
	exs, err := b.expandAll(pieces, nil, b.order)
	if err != nil {
		return err
	}
	var ws []*monomial.Expansion
	for i := range weights {
		ws = append(ws, exs[2*i])
	}
	if err := b.sumIsOne(ws, d.comps[0].pos, "the mixing weights"); err != nil {
		return err
	}
	zero := zeros(len(b.vars))
	var mu *big.Rat
	for i, c := range d.comps {
		a, m := exs[2*i].Poly.Eval(zero), exs[2*i+1].Poly.Eval(zero)
		switch {
		case a.Sign() < 0:
			return errorAt(d.src, c.weight.pos, "this component's weight is %s at the truth, which is negative", a.RatString())
		case m.Sign() <= 0:
			return errorAt(d.src, c.arg.pos, "a Poisson mean must be positive, and this one is %s at the truth", m.RatString())
		case a.Sign() > 0 && mu != nil && m.Cmp(mu) != 0:
			return errorAt(d.src, c.pos, "at the truth the components with positive weight have the means %s and %s: K is built for a Poisson mixture only at a truth that is a single Poisson law (every component with positive weight has the same mean there)", mu.RatString(), m.RatString())
		case a.Sign() > 0:
			mu = m
		}
	}
	// g_k = Σ_i a_i·(μ_i − μ*)^k for k = 1, …, D, and the monomials of the
	// generators left out.
	glue := d.comps[0].pos
	delta := func(i int, f *frag) {
		f.wrapped(weights[i], d.comps[i].pos)
		f.emit("*(", d.comps[i].pos)
		f.wrapped(means[i], d.comps[i].pos)
		f.emit(" - "+ratText(mu)+")", d.comps[i].pos)
	}
	pieces = pieces[:0]
	for k := 1; k <= b.order+1; k++ {
		if k <= b.order {
			f := &frag{}
			for i := range weights {
				if i > 0 {
					f.emit(" + ", glue)
				}
				delta(i, f)
				f.emit(fmt.Sprintf("^%d", k), glue)
			}
			pieces = append(pieces, piece{f: f})
			continue
		}
		for i := range weights {
			f := &frag{}
			delta(i, f)
			f.emit(fmt.Sprintf("^%d", k), glue)
			pieces = append(pieces, piece{f: f})
		}
	}
	if exs, err = b.expandAll(pieces, nil, b.order); err != nil {
		return err
	}
	fact := big.NewInt(1)
	for k := 1; k <= b.order; k++ {
		ex := exs[k-1]
		fact.Mul(fact, big.NewInt(int64(k)))
		w := new(big.Rat).SetInt(fact)
		w.Mul(w, pow(mu, k))
		w.Mul(w, big.NewRat(2, 1))
		w.Inv(w)
		b.addGenerator(ex.Poly, w, fmt.Sprintf("Σ_i a_i·(μ_i − μ*)^%d", k))
		if len(ex.Remainder) > 0 {
			b.addRemainder(ex.Remainder)
		}
	}
	for _, ex := range exs[b.order:] {
		// S = Min(supp P ∪ R): the value lies in the ideal of S.
		b.addRemainder(append(ex.Poly.Support(), ex.Remainder...))
	}
	b.m.What = fmt.Sprintf("K(w) = χ²(p_w‖q)/2 = Σ_k (Σ_i a_i·(μ_i − μ*)^k)²/(2·k!·μ*^k) with μ* = %s, the generators k = 1, …, %d written out and the others in the remainder; comparable to the Kullback–Leibler divergence near the truth (from memory, checked numerically)", mu.RatString(), b.order)
	return nil
}
