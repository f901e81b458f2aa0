package rlct

import (
	"errors"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// This file holds the exact algebra of the splitting reduction (reduce.go):
// rational matrices, substitution of power series truncated at a total
// degree, and the implicit-function solve by the chord iteration.

// errTooLarge reports that an exact substitution would exceed maxSubstTerms;
// the reduction then treats the result as unknown and does not claim it.
var errTooLarge = errors.New("rlct: substitution too large")

// maxSubstTerms bounds the terms of any polynomial the reduction builds.
const maxSubstTerms = 200_000

// ratMatrix is a dense matrix of exact rationals.
type ratMatrix [][]*big.Rat

func newRatMatrix(rows, cols int) ratMatrix {
	m := make(ratMatrix, rows)
	for i := range m {
		m[i] = make([]*big.Rat, cols)
		for j := range m[i] {
			m[i][j] = new(big.Rat)
		}
	}
	return m
}

// inverse returns m⁻¹ by Gauss–Jordan elimination, or false when m is
// singular. m is square and is not modified.
func (m ratMatrix) inverse() (ratMatrix, bool) {
	n := len(m)
	a := newRatMatrix(n, 2*n)
	for i := range n {
		for j := range n {
			a[i][j].Set(m[i][j])
		}
		a[i][n+i].SetInt64(1)
	}
	t := new(big.Rat)
	for c := range n {
		p := -1
		for i := c; i < n; i++ {
			if a[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			return nil, false
		}
		a[c], a[p] = a[p], a[c]
		inv := new(big.Rat).Inv(a[c][c])
		for j := range a[c] {
			a[c][j].Mul(a[c][j], inv)
		}
		for i := range n {
			if i == c || a[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(a[i][c])
			for j := range a[i] {
				a[i][j].Sub(a[i][j], t.Mul(f, a[c][j]))
			}
		}
	}
	out := make(ratMatrix, n)
	for i := range n {
		out[i] = a[i][n:]
	}
	return out, true
}

// substituter replaces the variables pivots[k] of polynomials by the power
// series phi[k] (polynomials in the same variable list that do not involve
// any pivot), keeping only the terms of total degree ≤ order, or all of them
// when order < 0. Powers of the series are cached.
type substituter struct {
	vars   []string
	pivots []int
	phi    []*monomial.Poly
	order  int
	powers []map[int]*monomial.Poly
}

func newSubstituter(vars []string, pivots []int, phi []*monomial.Poly, order int) *substituter {
	s := &substituter{vars: vars, pivots: pivots, phi: phi, order: order, powers: make([]map[int]*monomial.Poly, len(pivots))}
	for k := range s.powers {
		s.powers[k] = map[int]*monomial.Poly{0: monomial.Constant(vars, big.NewRat(1, 1))}
	}
	return s
}

func (s *substituter) trunc(p *monomial.Poly) (*monomial.Poly, error) {
	if s.order >= 0 {
		p = p.Truncate(s.order)
	}
	if p.Len() > maxSubstTerms {
		return nil, errTooLarge
	}
	return p, nil
}

// power returns phi[k]^n (truncated).
func (s *substituter) power(k, n int) (*monomial.Poly, error) {
	if p, ok := s.powers[k][n]; ok {
		return p, nil
	}
	prev, err := s.power(k, n-1)
	if err != nil {
		return nil, err
	}
	if prev.Len()*s.phi[k].Len() > 4*maxSubstTerms {
		return nil, errTooLarge
	}
	p, err := s.trunc(prev.Mul(s.phi[k]))
	if err != nil {
		return nil, err
	}
	s.powers[k][n] = p
	return p, nil
}

// apply returns p with the pivots replaced by their series (truncated).
func (s *substituter) apply(p *monomial.Poly) (*monomial.Poly, error) {
	out := monomial.Zero(s.vars)
	for e, c := range p.All() {
		rest := make(monomial.Exponent, len(e))
		copy(rest, e)
		term := (*monomial.Poly)(nil)
		for k, j := range s.pivots {
			if e[j] == 0 {
				continue
			}
			rest[j] = 0
			pw, err := s.power(k, e[j])
			if err != nil {
				return nil, err
			}
			if term == nil {
				term = pw
				continue
			}
			if term.Len()*pw.Len() > 4*maxSubstTerms {
				return nil, errTooLarge
			}
			if term, err = s.trunc(term.Mul(pw)); err != nil {
				return nil, err
			}
		}
		m := monomial.Monomial(s.vars, rest, c)
		if term != nil {
			m = m.Mul(term)
		}
		var err error
		if out, err = s.trunc(out.Add(m)); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// solveSeries solves F_k(x) = 0 (k < r) for the variables pivots[k] as
// power series in the other variables, exact up to total degree order
// (order ≥ 1), where every F_k vanishes at 0 and jinv is the inverse of
// J = (∂F_k/∂x_{pivots[l]})(0).
//
// It runs the chord iteration φ ← φ − J⁻¹·T(F(φ, v)) from φ = 0, where T
// drops the terms of degree > order. Write e = φ* − φ for the analytic
// solution φ* (implicit function theorem). Then F(φ, v) = F(φ*, v) −
// A(v, e)·e = −A·e with A(0, 0) = J, so one step maps e to
// (1 − J⁻¹A)·e + J⁻¹·(the terms of F(φ, v) above order), and since 1 − J⁻¹A
// vanishes at 0 the order of vanishing of e rises by at least one per step
// until it exceeds order. The loop stops when T(F(φ, v)) is exactly zero;
// then e = −A⁻¹·F(φ, v) has only terms of degree > order (A is invertible
// as a matrix of power series because A(0, 0) = J is), so the terms of φ
// of degree ≤ order are those of φ*. That stopping test is an exact
// polynomial identity, not an assumption on the number of steps.
func solveSeries(vars []string, F []*monomial.Poly, pivots []int, jinv ratMatrix, order int) ([]*monomial.Poly, error) {
	r := len(pivots)
	phi := make([]*monomial.Poly, r)
	for k := range phi {
		phi[k] = monomial.Zero(vars)
	}
	for range order + 3 {
		s := newSubstituter(vars, pivots, phi, order)
		res := make([]*monomial.Poly, r)
		zero := true
		for k, f := range F {
			v, err := s.apply(f)
			if err != nil {
				return nil, err
			}
			res[k] = v
			zero = zero && v.IsZero()
		}
		if zero {
			return phi, nil
		}
		for k := range r {
			step := monomial.Zero(vars)
			for l := range r {
				if jinv[k][l].Sign() != 0 {
					step = step.Add(res[l].Scale(jinv[k][l]))
				}
			}
			phi[k] = phi[k].Sub(step).Truncate(order)
		}
	}
	return nil, errors.New("rlct: the series solve did not converge") // not reached when J is the Jacobian
}
