package monomial

import (
	"errors"
	"math/big"
	"math/bits"
)

// This file holds the bookkeeping of remainders (see "Remainders" in the
// package documentation for the rules and their proofs). A set of
// exponents is held as a *Poly whose coefficients are all 1, so that it is
// sorted in term order and the products of package arith.go give Minkowski
// sums: with positive coefficients nothing cancels, so the support of the
// product of two such sets is exactly the set of sums.

// unitSet returns the support of p as a set (p with every coefficient 1).
func unitSet(p *Poly) *Poly {
	if p.IsZero() {
		return p
	}
	r := &Poly{vars: p.vars, exps: p.exps, coefs: make([]coef, len(p.coefs))}
	for i := range r.coefs {
		r.coefs[i] = coefOne
	}
	return r
}

// splitDegree returns the terms of p of degree > d and those of degree <= d.
func splitDegree(p *Poly, d int) (high, low *Poly) {
	low = p.Truncate(d)
	i := len(p.coefs) - len(low.coefs)
	n := len(p.vars)
	return &Poly{vars: p.vars, exps: p.exps[: i*n : i*n], coefs: p.coefs[:i:i]}, low
}

// divTrie stores a set of exponents, each as the sequence of its non-zero
// entries (variable, power) in variable order, in a trie; covers(x) finds
// whether some stored exponent is <= x entrywise (divides x^x). It counts
// the edges it visits, which callers charge to their work budget.
type divTrie struct {
	nodes  []trieNode
	visits int
}

type trieNode struct {
	edges []trieEdge // sorted by (v, e)
	end   bool       // an exponent ends here
}

type trieEdge struct {
	e        int // exponents reach 2^62
	v, child int32
}

func newDivTrie() *divTrie { return &divTrie{nodes: make([]trieNode, 1, 64)} }

// insert adds x to the set.
func (t *divTrie) insert(x []int) {
	n := int32(0)
	for v, e := range x {
		if e == 0 {
			continue
		}
		edges := t.nodes[n].edges
		lo, hi := 0, len(edges)
		for lo < hi {
			mid := (lo + hi) / 2
			if ed := edges[mid]; ed.v < int32(v) || (ed.v == int32(v) && ed.e < e) {
				lo = mid + 1
			} else {
				hi = mid
			}
		}
		if lo < len(edges) && edges[lo].v == int32(v) && edges[lo].e == e {
			n = edges[lo].child
			continue
		}
		child := int32(len(t.nodes))
		t.nodes = append(t.nodes, trieNode{})
		edges = append(edges, trieEdge{})
		copy(edges[lo+1:], edges[lo:])
		edges[lo] = trieEdge{e: e, v: int32(v), child: child}
		t.nodes[n].edges = edges
		n = child
	}
	t.nodes[n].end = true
}

// covers reports whether some stored exponent is <= x entrywise.
func (t *divTrie) covers(x []int) bool { return t.walk(0, x) }

func (t *divTrie) walk(n int32, x []int) bool {
	nd := &t.nodes[n]
	if nd.end {
		return true
	}
	for _, ed := range nd.edges {
		t.visits++
		if x[ed.v] >= ed.e && t.walk(ed.child, x) {
			return true
		}
	}
	return false
}

// chargeVisits charges the trie's visits since the last call to g, at one
// unit per four visits.
func (t *divTrie) chargeVisits(g *guard) error {
	units := float64(t.visits) / 4
	t.visits = 0
	return g.charge(units)
}

// minimal returns the minimal elements of the support of p under
// divisibility (no returned exponent divides another), as a set. A set
// containing the zero exponent reduces to it.
func minimal(p *Poly, g *guard) (*Poly, error) {
	n := len(p.vars)
	if len(p.coefs) <= 1 {
		return unitSet(p), nil
	}
	if Exponent(p.exp(len(p.coefs)-1)).Degree() == 0 {
		return constPoly(p.vars, coefOne), nil
	}
	keep := make([]int, 0, 16)
	// From the lowest degree up: an exponent can only be divided by one of
	// lower degree, which is already kept if it is minimal.
	if len(p.coefs) <= smallSet {
		for i := len(p.coefs) - 1; i >= 0; i-- {
			e := p.exp(i)
			covered := false
			for _, j := range keep {
				if covered = dividesExp(p.exp(j), e); covered {
					break
				}
			}
			if !covered {
				keep = append(keep, i)
			}
		}
	} else {
		t := newDivTrie()
		for i := len(p.coefs) - 1; i >= 0; i-- {
			e := p.exp(i)
			if !t.covers(e) {
				t.insert(e)
				keep = append(keep, i)
			}
			if t.visits > 4096 {
				if err := t.chargeVisits(g); err != nil {
					return nil, err
				}
			}
		}
		if err := t.chargeVisits(g); err != nil {
			return nil, err
		}
	}
	r := &Poly{vars: p.vars, exps: make([]int, 0, len(keep)*n), coefs: make([]coef, len(keep))}
	for j := len(keep) - 1; j >= 0; j-- {
		r.exps = append(r.exps, p.exp(keep[j])...)
	}
	for j := range r.coefs {
		r.coefs[j] = coefOne
	}
	return r, nil
}

// prune returns the elements of the set h that are not multiples of an
// element of the set by (nil means empty).
func prune(h, by *Poly, g *guard) (*Poly, error) {
	if by == nil || by.IsZero() || h.IsZero() {
		return h, nil
	}
	covers := func(e []int) bool {
		for i := range by.coefs {
			if dividesExp(by.exp(i), e) {
				return true
			}
		}
		return false
	}
	var t *divTrie
	if len(by.coefs) > smallSet {
		t = newDivTrie()
		for i := range by.coefs {
			t.insert(by.exp(i))
		}
		covers = t.covers
	}
	r := &Poly{vars: h.vars}
	for i := range h.coefs {
		if !covers(h.exp(i)) {
			r.exps = append(r.exps, h.exp(i)...)
			r.coefs = append(r.coefs, coefOne)
		}
	}
	if t == nil {
		return r, g.charge(float64(len(h.coefs)*len(by.coefs)) / 4)
	}
	return r, t.chargeVisits(g)
}

// smallSet is the size up to which minimal and prune compare exponents
// pairwise instead of building a trie.
const smallSet = 24

// dividesExp reports whether a <= b entrywise.
func dividesExp(a, b []int) bool {
	for i, x := range a {
		if x > b[i] {
			return false
		}
	}
	return true
}

// unionMin returns the minimal elements of the union of the sets (nil
// entries are skipped), or nil when the union is empty.
func unionMin(g *guard, sets ...*Poly) (*Poly, error) {
	var live []*Poly
	for _, s := range sets {
		if s != nil && !s.IsZero() {
			live = append(live, s)
		}
	}
	if len(live) == 0 {
		return nil, nil
	}
	// Merge pairwise, so that many small sets cost O(T log k).
	for len(live) > 1 {
		half := live[:0]
		for i := 0; i+1 < len(live); i += 2 {
			half = append(half, merge(live[i], live[i+1], false))
		}
		if len(live)%2 == 1 {
			half = append(half, live[len(live)-1])
		}
		live = half
	}
	return minimal(live[0], g)
}

// sumSet returns the minimal elements of {a + b : a in A, b in B}, where
// a sum that would have an exponent of 2^62 or more is replaced by the
// summand with the larger entry there (see sumSupport).
func sumSet(a, b *Poly, g *guard) (*Poly, error) {
	s, err := sumSupport(a, b, g)
	if err != nil {
		return nil, err
	}
	return minimal(s, g)
}

// sumSupport returns the set {a + b : a in A, b in B}. Exponents must stay
// below 2^62; a sum with an entry that would not is replaced by the summand
// whose entry there is at least 2^61, which divides the sum: so the result
// still divides every sum, and the replacement has an entry (and so a
// degree) above any truncation order.
func sumSupport(a, b *Poly, g *guard) (*Poly, error) {
	s, err := mul(unitSet(a), unitSet(b), -1, g)
	if err == nil {
		return unitSet(s), nil
	}
	if !errors.Is(err, errExponentOverflow) {
		return nil, err
	}
	n := len(a.vars)
	acc := newAccumulator(a.vars)
	e := make([]int, n)
	for i := range a.coefs {
		ea := a.exp(i)
		for j := range b.coefs {
			eb := b.exp(j)
			var big []int
			for v := range e {
				e[v] = ea[v] + eb[v]
				if big == nil && e[v] >= 1<<62 {
					big = ea
					if eb[v] > ea[v] {
						big = eb
					}
				}
			}
			if big != nil {
				copy(e, big)
			}
			acc.add(e, coefOne)
		}
		if g.tooMany(acc.len()) {
			return nil, errTooManyTerms
		}
	}
	return unitSet(acc.poly()), nil
}

// span returns S(v), the minimal elements of supp(p) ∪ rem: the true value
// of v lies in the ideal they generate.
func span(p, rem *Poly, g *guard) (*Poly, error) {
	if p.IsZero() && rem == nil {
		return p, nil
	}
	if n := len(p.coefs); n > 0 && Exponent(p.exp(n-1)).Degree() == 0 {
		return constPoly(p.vars, coefOne), nil // a unit: the whole ring
	}
	s, err := unionMin(g, unitSet(p), rem)
	if s == nil {
		s = &Poly{vars: p.vars}
	}
	return s, err
}

// productRem returns the remainder of the product of two values (p1, r1)
// and (p2, r2) whose computed polynomial is p1·p2 truncated at degree d
// (rule "Products" of the package documentation): the minimal elements of
// r1 + S(v2), S(v1) + r2 and the exponents of p1·p2 of degree > d. It
// returns nil when the remainder is empty.
func productRem(p1, r1, p2, r2 *Poly, d int, g *guard) (*Poly, error) {
	var parts []*Poly
	if r1 != nil {
		s2, err := span(p2, r2, g)
		if err != nil {
			return nil, err
		}
		t, err := sumSet(r1, s2, g)
		if err != nil {
			return nil, err
		}
		parts = append(parts, t)
	}
	if r2 != nil {
		s1, err := span(p1, r1, g)
		if err != nil {
			return nil, err
		}
		t, err := sumSet(s1, r2, g)
		if err != nil {
			return nil, err
		}
		parts = append(parts, t)
	}
	dropped, err := droppedProducts(p1, p2, d, g)
	if err != nil {
		return nil, err
	}
	parts = append(parts, dropped)
	return unionMin(g, parts...)
}

// droppedProducts returns a set of exponents that divides every exponent
// e1 + e2 (e1 in supp p1, e2 in supp p2) of degree > d: for each e2 the
// sums e2 + e1 over the minimal e1 of degree >= d+1-|e2|. (If e1' <= e1
// both qualify, e2 + e1' divides e2 + e1.) The result is minimal.
func droppedProducts(p1, p2 *Poly, d int, g *guard) (*Poly, error) {
	if p1.IsZero() || p2.IsZero() || p1.Degree()+p2.Degree() <= d {
		return nil, nil
	}
	var parts []*Poly
	// The degree classes of p2 from the lowest degree up: the threshold
	// t = d+1-δ falls, so the part of p1 of degree >= t grows, and its
	// minimal elements are updated with the new (lower) terms only.
	n := len(p1.vars)
	var mins *Poly // minimal elements of p1's terms of degree >= t
	taken := 0     // how many leading terms of p1 are in mins
	for hi := len(p2.coefs); hi > 0; {
		delta := Exponent(p2.exp(hi - 1)).Degree()
		lo := hi - 1
		for lo > 0 && Exponent(p2.exp(lo-1)).Degree() == delta {
			lo--
		}
		class := &Poly{vars: p2.vars, exps: p2.exps[lo*n : hi*n], coefs: p2.coefs[lo:hi]}
		hi = lo
		t := d + 1 - delta
		end := taken
		for end < len(p1.coefs) && Exponent(p1.exp(end)).Degree() >= t {
			end++
		}
		if end > taken {
			add := &Poly{vars: p1.vars, exps: p1.exps[taken*n : end*n], coefs: p1.coefs[taken:end]}
			var err error
			if mins, err = unionMin(g, mins, unitSet(add)); err != nil {
				return nil, err
			}
			taken = end
		}
		if mins == nil {
			continue
		}
		s, err := sumSupport(mins, class, g)
		if err != nil {
			return nil, err
		}
		parts = append(parts, s)
	}
	return unionMin(g, parts...)
}

// seriesShape describes which Taylor coefficients a_j of a univariate
// series f(t) = Σ a_j t^j are non-zero, as far as the remainder rule for
// f(u) needs it (rule "Composition" of the package documentation).
type seriesShape struct {
	// nz reports a_j != 0 for 1 <= j <= the truncation index k.
	nz func(j int) bool
	// first is the least j >= 1 with a_j != 0, or a lower bound >= 1 of
	// it; 0 when there is none (f is constant).
	first int
	// next is the least j > k with a_j != 0, or a lower bound > k of it;
	// 0 when there is none (f is a polynomial of degree <= k).
	next int
}

// shapeOf returns the shape of the series with the Taylor coefficients a
// (a_0..a_K, K >= k+2) truncated after index k; terminates says that a_j = 0
// for every j > K.
func shapeOf(a []*big.Rat, k int, terminates bool) seriesShape {
	sh := seriesShape{nz: func(j int) bool { return j < len(a) && a[j].Sign() != 0 }}
	for j := 1; j < len(a); j++ {
		if a[j].Sign() != 0 {
			sh.first = j
			break
		}
	}
	if sh.first == 0 && !terminates {
		sh.first = len(a) // a lower bound: no non-zero coefficient below
	}
	for j := k + 1; j < len(a); j++ {
		if a[j].Sign() != 0 {
			sh.next = j
			break
		}
	}
	if sh.next == 0 && !terminates {
		sh.next = k + 1 // a lower bound, always sound
	}
	return sh
}

// powerShape is the shape of t^n truncated after index k.
func powerShape(n, k int) seriesShape {
	sh := seriesShape{nz: func(j int) bool { return j == n }, first: n}
	if n > k {
		sh.next = n
	}
	return sh
}

// capGens bounds the generator sets that the optional steps of composeRem
// build; past it a coarser sound set is used.
const capGens = 1 << 12

// tailWork is the work budget (in guard units) of the optional steps of
// composeRem, the ones that only tighten a remainder that is already
// sound.
const tailWork = 2e6

// composeRem returns the remainder of f(a) (rule "Composition" of the
// package documentation), where the computed polynomial is Σ_{j<=k} a_j U^j
// truncated at degree d, U is the computed argument without its constant
// term (any scaling is irrelevant to supports), ra the remainder of the
// argument and sh the shape of f. It returns nil when the remainder is
// empty.
func composeRem(u, ra *Poly, sh seriesShape, k, d int, g *guard) (*Poly, error) {
	var acc *Poly // generators found so far (minimal), nil for none
	// The cost of replacing the argument by its computed part:
	// ra + S(u)^(first-1), or ra + S(u)^(i) for some i <= first-1 when the
	// power is too large to form (a larger ideal, so still sound).
	if ra != nil && sh.first > 0 {
		acc = ra
		if sh.first > 1 {
			s, err := span(u, ra, g)
			if err != nil {
				return nil, err
			}
			tail := subGuard(g, tailWork/2)
			x := setPower(s, sh.first-1, tail)
			g.settle(tail, tailWork/2)
			tail = subGuard(g, tailWork/2)
			if t, err := sumSet(ra, x, tail); err == nil && t.Len() <= capGens {
				acc = t
			}
			g.settle(tail, tailWork/2)
		}
	}
	if u.IsZero() {
		return acc, nil
	}
	if u.Len() == 1 {
		return monomialComposeRem(u, acc, sh, k, g)
	}
	gen := unitSet(u)
	low := constPoly(u.vars, coefOne) // L_0 = {0}
	high := &Poly{vars: u.vars}       // H_0 = ∅
	for j := 1; j <= max(k, min(sh.next, k+1)); j++ {
		h, l, err := powerSupportStep(low, high, gen, d, acc, g)
		if err != nil {
			return nil, err
		}
		high, low = h, l
		if (j <= k && sh.nz(j)) || j == sh.next {
			if acc, err = unionMin(g, acc, high); err != nil {
				return nil, err
			}
		}
	}
	if sh.next <= k+1 || high.IsZero() {
		// Done: the first omitted index is at most k+1 (or there is
		// none), or every element of PS_(k+1), and so of every later
		// PS_j, is already a multiple of an element of acc.
		return acc, nil
	}
	// The first omitted index is next > k+1. U^next has support in
	// H_{k+1} + PS_{next-k-1} (up to multiples of acc), and H_{k+1} alone
	// covers it: tighten as far as the budget allows, half of it for the
	// power and half for the final sum.
	best := high
	tail := subGuard(g, tailWork/2)
	x := setPower(gen, sh.next-k-1, tail)
	g.settle(tail, tailWork/2)
	tail = subGuard(g, tailWork/2)
	if t, err := sumSet(high, x, tail); err == nil && t.Len() <= capGens {
		if t, err = prune(t, acc, tail); err == nil {
			best = t
		}
	}
	g.settle(tail, tailWork/2)
	return unionMin(g, acc, best)
}

// monomialComposeRem is the second part of composeRem when U is a single
// term c·x^e: then PS_j = {j·e}, which has degree <= d exactly for j <= k,
// so every H_j with j <= k is empty and H_j = {j·e} beyond; the result
// is acc with next·e added (or i·e for the largest i in k+1..next that
// keeps the exponents below 2^62).
func monomialComposeRem(u, acc *Poly, sh seriesShape, k int, g *guard) (*Poly, error) {
	if sh.next == 0 {
		return acc, nil
	}
	e := u.exp(0)
	top := 0
	for _, x := range e {
		top = max(top, x)
	}
	i := sh.next
	if top > 0 {
		i = max(k+1, min(i, (1<<62-1)/top))
	}
	m := make([]int, len(e))
	for v, x := range e {
		m[v] = i * x
	}
	h := &Poly{vars: u.vars, exps: m, coefs: []coef{coefOne}}
	return unionMin(g, acc, h)
}

// setPower returns the minimal elements of the m-fold sums of the set s
// (PS_m of s), or, when that is too large or too costly for the guard or
// would overflow the exponents, of the i-fold sums for some 0 <= i <= m
// (whose multiples include all m-fold sums). The 0-fold sum is {0}.
func setPower(s *Poly, m int, g *guard) *Poly {
	x := constPoly(s.vars, coefOne)
	if m <= 0 || s.IsZero() {
		return x
	}
	base, err := minimal(s, g)
	if err != nil {
		return x
	}
	// Left-to-right binary powering: after each step x holds the j-fold
	// sums for a prefix j of the binary digits of m, so j <= m.
	started := false
	for i := bits.Len(uint(m)) - 1; i >= 0; i-- {
		if started {
			y, err := sumSet(x, x, g)
			if err != nil || y.Len() > capGens {
				return x
			}
			x = y
		}
		if m>>i&1 == 1 {
			y, err := sumSet(x, base, g)
			if err != nil || y.Len() > capGens {
				return x
			}
			x = y
			started = true
		}
	}
	return x
}

// powerSupportStep computes L_j and H_j from L_{j-1}, H_{j-1} (see
// composeRem): L_j is the part of degree <= d of L_{j-1} + G, and H_j the
// minimal elements of the part of degree > d of L_{j-1} + G and of
// H_{j-1} + G, without the multiples of elements of acc.
func powerSupportStep(low, high, gen *Poly, d int, acc *Poly, g *guard) (h, l *Poly, err error) {
	t, err := sumSupport(low, gen, g)
	if err != nil {
		return nil, nil, err
	}
	cand, l := splitDegree(t, d)
	if !high.IsZero() {
		s, err := sumSupport(high, gen, g)
		if err != nil {
			return nil, nil, err
		}
		cand = merge(cand, s, false)
	}
	if cand.IsZero() {
		return cand, l, nil
	}
	if h, err = minimal(cand, g); err != nil {
		return nil, nil, err
	}
	if h, err = prune(h, acc, g); err != nil {
		return nil, nil, err
	}
	return h, unitSet(l), nil
}

// subGuard returns a guard for optional work: the term limit of g and at
// most budget units of g's work.
func subGuard(g *guard, budget float64) *guard {
	if g == nil {
		return &guard{work: budget}
	}
	return &guard{maxTerms: g.maxTerms, work: min(budget, g.work)}
}

// settle charges g with the work that sub (made by subGuard with budget)
// used.
func (g *guard) settle(sub *guard, budget float64) {
	if g == nil || sub == nil {
		return
	}
	used := min(budget, g.work) - sub.work
	g.work -= used
}
