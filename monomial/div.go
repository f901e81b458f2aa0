package monomial

import (
	"container/heap"
	"slices"
)

// DivExact returns s with p = q·s when q divides p in the ring of
// polynomials with rational coefficients, with ok = false when it does not
// (q zero, a non-zero remainder, or p and q in different variable lists).
// The error is a *LimitError when the division would exceed lim.MaxTerms
// (terms of the quotient or of the running remainder) or lim.MaxWork
// (term-by-term coefficient products); zero fields take the defaults.
//
// Method: division by leading terms in the term order of Poly (graded
// lexicographic, a well-order on exponents). The running remainder is
// r = p − q·s', s' the quotient so far. If q divides p, then r = q·(s − s')
// is a multiple of q, so its leading term is the leading term of q times a
// term of s − s'; hence when the leading term of r is not divisible by that
// of q, q does not divide p and DivExact returns false. Otherwise the
// quotient of the leading terms is moved to s', which cancels the leading
// term of r; r's leading term strictly decreases, so the process ends. It
// stops at r = 0 with p = q·s' exactly (every coefficient is exact).
//
// Two checks bound the work when q does not divide p: the degree of a
// product in each variable, and its total degree, is the sum of those of
// its factors (leading coefficients in one variable multiply to a non-zero
// polynomial), so a term of s has degree at most deg_i(p) − deg_i(q) in
// variable i and total degree at most deg(p) − deg(q); a quotient term
// outside these bounds means q does not divide p.
func (p *Poly) DivExact(q *Poly, lim Limits) (s *Poly, ok bool, err error) {
	if !slices.Equal(p.vars, q.vars) || q.IsZero() {
		return nil, false, nil
	}
	if p.IsZero() {
		return &Poly{vars: p.vars}, true, nil
	}
	lim = lim.withDefaults()
	n := len(p.vars)
	degP, degQ := p.Degree(), q.Degree()
	if degP < degQ {
		return nil, false, nil
	}
	box := maxExponents(p)
	for i, k := range maxExponents(q) {
		box[i] -= k
		if box[i] < 0 {
			return nil, false, nil
		}
	}
	lt := q.exp(0)
	lcInv := q.coefs[0].inv()
	bitsQ := maxBitLen(q)
	work := float64(lim.MaxWork)

	// The remainder: a map from exponent keys to coefficients and a heap
	// of its exponents in term order (a key may be pushed again after its
	// coefficient cancelled; stale entries are skipped).
	r := &remainder{n: n, index: make(map[string]int), h: expHeap{n: n}}
	for i := range p.coefs {
		r.add(p.exp(i), p.coefs[i])
	}
	var qexps []int
	var qcoefs []coef
	t := make([]int, n)
	e := make([]int, n)
	for {
		top, c, found := r.popLead()
		if !found {
			break
		}
		deg := 0
		for i := range t {
			t[i] = top[i] - lt[i]
			if t[i] < 0 || t[i] > box[i] {
				return nil, false, nil
			}
			deg += t[i]
		}
		if deg > degP-degQ {
			return nil, false, nil
		}
		if len(qcoefs)+1 > lim.MaxTerms || r.live > lim.MaxTerms {
			return nil, false, &LimitError{Limit: "MaxTerms", Value: float64(max(len(qcoefs)+1, r.live)), Max: lim.MaxTerms, What: "exact division"}
		}
		work -= float64(len(q.coefs)) * pairCost(c.bitLen(), bitsQ)
		if work < 0 {
			return nil, false, &LimitError{Limit: "MaxWork", Value: float64(lim.MaxWork) - work, Max: lim.MaxWork, What: "exact division"}
		}
		m := c.mul(lcInv)
		qexps = append(qexps, t...)
		qcoefs = append(qcoefs, m)
		// r −= m·x^t·q; its leading term cancels exactly (it is not
		// re-added: top was removed by popLead and m·lc(q) = c).
		neg := m.neg()
		for i := 1; i < len(q.coefs); i++ {
			qe := q.exp(i)
			for v := range e {
				e[v] = t[v] + qe[v]
			}
			r.add(e, neg.mul(q.coefs[i]))
		}
	}
	// The quotient terms came out in strictly decreasing term order (their
	// products with lt are the successive leading terms of r), but
	// canonical sorts them anyway.
	return canonical(p.vars, qexps, qcoefs), true, nil
}

// remainder is the running remainder of DivExact.
type remainder struct {
	n     int
	index map[string]int // key → slot
	exps  []int
	coefs []coef
	live  int // slots with a non-zero coefficient
	h     expHeap
	key   []byte
}

func (r *remainder) add(e []int, c coef) {
	if c.isZero() {
		return
	}
	r.key = r.key[:0]
	for _, k := range e {
		r.key = appendUvarint(r.key, uint64(k))
	}
	if i, ok := r.index[string(r.key)]; ok {
		was := !r.coefs[i].isZero()
		r.coefs[i] = r.coefs[i].add(c)
		switch now := !r.coefs[i].isZero(); {
		case was && !now:
			r.live--
		case !was && now:
			r.live++
			heap.Push(&r.h, heapItem{slot: i, exps: r.exps})
		}
		return
	}
	i := len(r.coefs)
	r.index[string(r.key)] = i
	r.exps = append(r.exps, e...)
	r.coefs = append(r.coefs, c)
	r.live++
	heap.Push(&r.h, heapItem{slot: i, exps: r.exps})
}

// popLead removes the leading term of r and returns its exponent (a copy)
// and coefficient; found is false when r is zero.
func (r *remainder) popLead() ([]int, coef, bool) {
	for r.h.Len() > 0 {
		it := heap.Pop(&r.h).(heapItem)
		c := r.coefs[it.slot]
		if c.isZero() {
			continue // stale: cancelled after it was pushed
		}
		r.coefs[it.slot] = coefZero
		r.live--
		return slices.Clone(r.exps[it.slot*r.n : (it.slot+1)*r.n]), c, true
	}
	return nil, coefZero, false
}

// heapItem is a slot of the remainder; exps is the remainder's exponent
// array when the item was pushed (appends may reallocate it, but the
// slot's entries are never changed, so any version holds them).
type heapItem struct {
	slot int
	exps []int
}

// expHeap is a max-heap of slots in term order (the leading term on top).
type expHeap struct {
	n     int
	items []heapItem
}

func (h *expHeap) Len() int { return len(h.items) }
func (h *expHeap) Less(i, j int) bool {
	a, b := h.items[i], h.items[j]
	return cmpTerms(a.exps[a.slot*h.n:(a.slot+1)*h.n], b.exps[b.slot*h.n:(b.slot+1)*h.n]) < 0
}
func (h *expHeap) Swap(i, j int) { h.items[i], h.items[j] = h.items[j], h.items[i] }
func (h *expHeap) Push(x any)    { h.items = append(h.items, x.(heapItem)) }
func (h *expHeap) Pop() any {
	it := h.items[len(h.items)-1]
	h.items = h.items[:len(h.items)-1]
	return it
}
