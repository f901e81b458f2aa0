package monomial

import (
	"fmt"
	"slices"
)

// This file holds the truncation by a floor (Config.Floor; see "Truncation
// by a floor" in the package documentation for the rule and its proof).

// floorSet is the set of minimal points of Config.Floor, an antichain: no
// point is <= another.
type floorSet struct {
	pts  [][]int
	trie *divTrie // the points, to test quickly whether one is <= e
}

// newFloorSet checks the floor points against the n variables and keeps
// the minimal ones. It returns nil for an empty floor.
func newFloorSet(floor [][]int, n int) (*floorSet, error) {
	if len(floor) == 0 {
		return nil, nil
	}
	pts := make([][]int, 0, len(floor))
	for i, f := range floor {
		if len(f) != n {
			return nil, fmt.Errorf("monomial: Config.Floor: point %d has %d exponents for %d variables", i+1, len(f), n)
		}
		for _, x := range f {
			if x < 0 {
				return nil, fmt.Errorf("monomial: Config.Floor: point %d has a negative exponent", i+1)
			}
		}
		pts = append(pts, f)
	}
	// Minimal points: from the lowest degree up, keep a point unless a
	// kept one is <= it (a point can only be above one of lower or equal
	// degree, and an equal point is a duplicate).
	slices.SortStableFunc(pts, func(a, b []int) int { return Exponent(a).Degree() - Exponent(b).Degree() })
	fs := &floorSet{trie: newDivTrie()}
	for _, f := range pts {
		if fs.trie.covers(f) {
			continue
		}
		fs.trie.insert(f)
		fs.pts = append(fs.pts, slices.Clone(f))
	}
	return fs, nil
}

// below returns a floor point g that e strictly dominates (g <= e
// entrywise, g != e), or nil when there is none.
func (fs *floorSet) below(e []int) []int {
	if !fs.trie.covers(e) {
		return nil
	}
	for _, g := range fs.pts {
		if dividesExp(g, e) {
			if slices.Equal(g, e) {
				return nil // e is a floor point; no other is <= e (antichain)
			}
			return g
		}
	}
	return nil
}

// floorCutter removes from polynomials the terms whose exponents strictly
// dominate a floor point, and collects for each removed exponent e a
// generator g + u_i that divides it, where g is the floor point below e and
// i the first variable with e_i > g_i. Every multiple of e is a multiple of
// that generator.
type floorCutter struct {
	fs   *floorSet
	gens *accumulator // nil until a term is removed
	g    *guard
}

// cut returns q without the terms that strictly dominate a floor point.
func (c *floorCutter) cut(q *Poly) *Poly {
	if c == nil || q.IsZero() {
		return q
	}
	n := len(q.vars)
	var out *Poly
	gen := make([]int, n)
	for i := range q.coefs {
		e := q.exp(i)
		g := c.fs.below(e)
		if g == nil {
			if out != nil {
				out.exps = append(out.exps, e...)
				out.coefs = append(out.coefs, q.coefs[i])
			}
			continue
		}
		if out == nil {
			out = &Poly{vars: q.vars, exps: make([]int, 0, i*n), coefs: make([]coef, 0, i)}
			out.exps = append(out.exps, q.exps[:i*n]...)
			out.coefs = append(out.coefs, q.coefs[:i]...)
		}
		copy(gen, g)
		for v := range e {
			if e[v] > g[v] {
				gen[v]++
				break
			}
		}
		if c.gens == nil {
			c.gens = newAccumulator(q.vars)
		}
		c.gens.add(gen, coefOne)
	}
	c.fs.trie.visits = 0 // the test costs as much as reading q: not charged
	if out == nil {
		return q
	}
	return out
}

// remainder returns the minimal elements of rem together with the
// generators of the removed terms (nil when both are empty).
func (c *floorCutter) remainder(rem *Poly) (*Poly, error) {
	if c == nil || c.gens == nil {
		return rem, nil
	}
	return unionMin(c.g, rem, unitSet(c.gens.poly()))
}

// cutter returns a floorCutter for one operation, or nil when there is no
// floor.
func (p *parser) cutter() *floorCutter {
	if p.floor == nil {
		return nil
	}
	return &floorCutter{fs: p.floor, g: p.rguard}
}

// applyFloor removes from the inexact value v the terms that strictly
// dominate a floor point and adds their generators to its remainder
// (rule "Floor" of the package documentation). The cutter c may already
// hold generators of terms removed inside the operation that computed v.
func (p *parser) applyFloor(v value, c *floorCutter, op token) (value, *Error) {
	if c == nil {
		return v, nil
	}
	v.p = c.cut(v.p)
	rem, err := c.remainder(v.rem)
	if err != nil {
		return v, p.remErr(err, op, v)
	}
	v.rem = rem
	return v, nil
}
