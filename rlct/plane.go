package rlct

import (
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// Limits on the plane decision: beyond them it declines (the face stays
// undetermined) rather than spend unbounded time.
const (
	maxPlaneDegT = 12
	maxPlaneDegS = 24
)

// decidePlane decides exactly whether F, whose support spans an affine
// plane, vanishes on the real torus. It needs no sign premise on F.
//
// Method (a cylindrical decomposition of the s-line, common practice; the
// delineability argument is that of Basu, Pollack & Roy 2006, Algorithms in
// Real Algebraic Geometry, chapter 5, from memory):
//
//  1. A unimodular monomial change (reduceSupport) writes F = w^v·P(s, t)
//     with P a polynomial, P(0, t) ≢ 0 and P(s, 0) ≢ 0. The change is an
//     automorphism of the torus, so F has a torus zero exactly when P has
//     a zero with s ≠ 0 and t ≠ 0.
//  2. P = c(s)·Q(s, t) with c the content. A non-zero real root s0 of c
//     gives the zero (s0, 1). Q is replaced by its square-free part in
//     Q(s)[t] (Q divided by gcd(Q, ∂Q/∂t), a primitive pseudo-remainder
//     gcd), which has the same zeros: every irreducible factor of Q with
//     positive degree in t divides it, and it has no factor in s alone.
//  3. With n = deg_t Q, let D(s) = s·lc(s)·Q(s, 0)·Res_t(Q, ∂Q/∂t). The
//     resultant is not identically zero because Q is square-free over Q(s).
//     On an open interval I of the s-line free of roots of D, Q(s, ·) has
//     degree n and n distinct complex roots that depend continuously on s,
//     none equal to 0; a real root cannot turn complex without meeting its
//     conjugate, which needs Res_t = 0. So the number of non-zero real
//     roots of Q(s, ·) is the same for every s in I, and one rational s in I
//     decides all of I.
//  4. At each non-zero real root α of D (rational, or algebraic and handled
//     in Q(α), see algebraic.go) the number of real roots of Q(α, ·) after
//     removing the factor t^k is counted by a Sturm sequence over Q(α).
//
// Every real s ≠ 0 is in one of the intervals or is one of the roots, so F
// vanishes on the torus exactly when one of these finitely many exact tests
// finds a real root. ok is false when F is not of this kind, when a limit is
// exceeded, or when the algebraic arithmetic gives up.
func decidePlane(F *monomial.Poly) (torusDecision, string, bool) {
	if F == nil || F.Len() < 3 {
		return torusDecision{}, "", false
	}
	change, ok := reduceSupport(F.Support())
	if !ok || change.rank != 2 {
		return torusDecision{}, "", false
	}
	p := change.plane(F)
	if len(p)-1 > maxPlaneDegT || p.degS() > maxPlaneDegS || len(p) < 2 {
		return torusDecision{}, "", false
	}
	how := fmt.Sprintf("F = w^(%s)·P(s, t), P = %s", intsString(change.base), bpolyString(p))
	zero := func(yExact []*big.Rat, yApprox []float64, note string) (torusDecision, string, bool) {
		pt := change.pointFromNew(yExact, yApprox)
		pt.note = note
		return torusDecision{zero: true, point: pt}, how, true
	}
	// Step 2: the content.
	if c := p.content(); c.deg() >= 1 && countRealRoots(c) > 0 {
		iv := isolateRoots(c, big.NewRat(1, 1<<50))[0]
		a := newRealAlg(c, iv)
		one := big.NewRat(1, 1)
		if r, ok := a.rational(); ok {
			return zero([]*big.Rat{r, one}, []float64{ratFloat(r), 1}, fmt.Sprintf("s = %s, t = 1", r.RatString()))
		}
		return zero(nil, []float64{a.approx(big.NewRat(1, 1<<60)), 1}, fmt.Sprintf("s = %s, t = 1", a.String()))
	}
	q := p.primitivePart()
	if g := gcdT(q, q.derivT()); len(g) > 1 {
		h, r := pseudoDivide(q, g)
		if len(r) != 0 {
			return torusDecision{}, "", false
		}
		q = h.primitivePart()
	}
	if len(q) < 2 {
		return torusDecision{}, how, true
	}
	if len(q[0]) == 0 {
		return torusDecision{}, "", false // cannot happen: Q(s, 0) ≢ 0
	}
	disc := q.discriminantT()
	if len(disc) == 0 {
		return torusDecision{}, "", false
	}
	crit := mul(mul(mul(disc, q[len(q)-1]), q[0]), upoly{new(big.Rat), big.NewRat(1, 1)})
	var roots []*realAlg
	ivs := isolateRoots(crit, big.NewRat(1, 1))
	if len(ivs) != countRealRoots(crit) {
		return torusDecision{}, "", false
	}
	for i, iv := range ivs {
		a := newRealAlg(crit, iv)
		if i > 0 && roots[i-1].hi.Cmp(a.lo) > 0 {
			return torusDecision{}, "", false // isolation not as documented
		}
		if _, ok := a.rational(); !ok && (a.m.signAt(a.lo) == 0 || a.m.signAt(a.hi) == 0 || rootsIn(a.m, a.lo, a.hi) != 1) {
			return torusDecision{}, "", false // isolation not as documented
		}
		roots = append(roots, a)
	}
	// Step 3: one rational sample in each open interval.
	var samples []*big.Rat
	one := big.NewRat(1, 1)
	samples = append(samples, new(big.Rat).Sub(roots[0].lo, one))
	for i := 0; i+1 < len(roots); i++ {
		a, b := roots[i], roots[i+1]
		for k := 0; a.hi.Cmp(b.lo) >= 0; k++ {
			if k > maxBisections {
				return torusDecision{}, "", false
			}
			b.bisect()
			a.bisect()
		}
		c := simplest(a.hi, b.lo)
		if c.Cmp(a.hi) == 0 || c.Cmp(b.lo) == 0 {
			c = new(big.Rat).Add(a.hi, b.lo)
			c.Quo(c, big.NewRat(2, 1))
		}
		samples = append(samples, c)
	}
	samples = append(samples, new(big.Rat).Add(roots[len(roots)-1].hi, one))
	for _, s0 := range samples {
		if s0.Sign() == 0 {
			continue
		}
		if d, ok := rationalFiber(q, s0); ok {
			return zero(d.exact, d.approx, d.note)
		}
	}
	// Step 4: the roots of D.
	for _, a := range roots {
		if r, ok := a.rational(); ok {
			if r.Sign() == 0 {
				continue
			}
			if d, ok := rationalFiber(q, r); ok {
				return zero(d.exact, d.approx, d.note)
			}
			continue
		}
		found, t0, err := algebraicFiber(q, a)
		if err != nil {
			return torusDecision{}, "", false
		}
		if found {
			sApprox := a.approx(big.NewRat(1, 1<<60))
			note := fmt.Sprintf("s = %s, t = %s", a.String(), t0.note)
			return zero(nil, []float64{sApprox, t0.approx[0]}, note)
		}
	}
	return torusDecision{}, how, true
}

// rationalFiber looks for a non-zero real root of q(s0, ·) for a rational
// s0 ≠ 0 and returns the point (s0, t0) when there is one.
func rationalFiber(q bpoly, s0 *big.Rat) (*torusPoint, bool) {
	f := q.evalS(s0)
	if len(f) == 0 {
		one := big.NewRat(1, 1)
		return &torusPoint{exact: []*big.Rat{s0, one}, approx: []float64{ratFloat(s0), 1}, note: fmt.Sprintf("s = %s, t = 1", s0.RatString())}, true
	}
	k := 0
	for k < len(f) && f[k].Sign() == 0 {
		k++
	}
	f = f[k:]
	if countRealRoots(f) == 0 {
		return nil, false
	}
	iv := isolateRoots(f, big.NewRat(1, 1<<44))[0]
	if iv.exact() {
		return &torusPoint{exact: []*big.Rat{s0, iv.Lo}, approx: []float64{ratFloat(s0), ratFloat(iv.Lo)}, note: fmt.Sprintf("s = %s, t = %s", s0.RatString(), iv.Lo.RatString())}, true
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	return &torusPoint{approx: []float64{ratFloat(s0), ratFloat(mid)}, note: fmt.Sprintf("s = %s, t = the root of %s in (%s, %s]", s0.RatString(), upolyString(f, "t"), iv.Lo.RatString(), iv.Hi.RatString())}, true
}

// algebraicFiber looks for a real root t0 ≠ 0 of q(α, ·) and returns an
// approximation of it with an exact description.
func algebraicFiber(q bpoly, a *realAlg) (bool, *torusPoint, error) {
	P := make(apoly, len(q))
	for k, c := range q {
		P[k] = a.reduce(c)
	}
	k := 0
	for k < len(P) && a.isZero(P[k]) {
		k++
	}
	if k == len(P) {
		return true, &torusPoint{approx: []float64{1}, note: "1"}, nil
	}
	P = P[k:]
	n, err := a.realRootCount(P)
	if err != nil || n == 0 {
		return false, nil, err
	}
	iv, err := a.isolateRealRootA(P, big.NewRat(1, 1<<44))
	if err != nil {
		return false, nil, err
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	note := fmt.Sprintf("a root of P(s, t) in t in (%s, %s]", iv.Lo.FloatString(12), iv.Hi.FloatString(12))
	if iv.exact() {
		note = iv.Lo.RatString()
	}
	return true, &torusPoint{approx: []float64{ratFloat(mid)}, note: note}, nil
}

func ratFloat(r *big.Rat) float64 {
	f, _ := r.Float64()
	return f
}

func intsString(v []int) string {
	s := ""
	for i, x := range v {
		if i > 0 {
			s += ","
		}
		s += fmt.Sprint(x)
	}
	return s
}

// bpolyString writes P(s, t).
func bpolyString(p bpoly) string {
	var vars = []string{"s", "t"}
	var exps []monomial.Exponent
	var coefs []*big.Rat
	for k, c := range p {
		for i, x := range c {
			if x.Sign() != 0 {
				exps = append(exps, monomial.Exponent{i, k})
				coefs = append(coefs, x)
			}
		}
	}
	q, err := monomial.FromTerms(vars, exps, coefs)
	if err != nil {
		return "?"
	}
	return q.String()
}
