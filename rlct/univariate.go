package rlct

import (
	"math/big"
)

// upoly is a univariate polynomial over Q, coefficients from the constant
// term up: p(s) = Σ c[k]·s^k. The canonical form has no trailing zeros, so
// the zero polynomial is the empty slice. Functions on upoly never modify
// their arguments.
type upoly []*big.Rat

// trim returns p without trailing zero coefficients.
func (p upoly) trim() upoly {
	n := len(p)
	for n > 0 && p[n-1].Sign() == 0 {
		n--
	}
	return p[:n]
}

// deg returns the degree of p, or -1 for the zero polynomial.
func (p upoly) deg() int { return len(p.trim()) - 1 }

// lead returns the leading coefficient (p must be non-zero).
func (p upoly) lead() *big.Rat { q := p.trim(); return q[len(q)-1] }

// eval returns p(x) exactly, by Horner's rule.
func (p upoly) eval(x *big.Rat) *big.Rat {
	v := new(big.Rat)
	for k := len(p) - 1; k >= 0; k-- {
		v.Mul(v, x)
		v.Add(v, p[k])
	}
	return v
}

// signAt returns the sign of p(x).
func (p upoly) signAt(x *big.Rat) int { return p.eval(x).Sign() }

// derivative returns p'.
func (p upoly) derivative() upoly {
	if len(p) <= 1 {
		return nil
	}
	d := make(upoly, len(p)-1)
	for k := 1; k < len(p); k++ {
		d[k-1] = new(big.Rat).Mul(p[k], new(big.Rat).SetInt64(int64(k)))
	}
	return d.trim()
}

// divMod returns q, r with p = q·m + r and deg r < deg m. m must be non-zero.
func (p upoly) divMod(m upoly) (q, r upoly) {
	m = m.trim()
	r = clone(p.trim())
	dm := len(m) - 1
	if len(r)-1 < dm {
		return nil, r
	}
	q = make(upoly, len(r)-dm)
	for k := range q {
		q[k] = new(big.Rat)
	}
	lc := m[dm]
	for len(r)-1 >= dm && len(r) > 0 {
		shift := len(r) - 1 - dm
		c := new(big.Rat).Quo(r[len(r)-1], lc)
		q[shift] = c
		for k := 0; k <= dm; k++ {
			r[shift+k] = new(big.Rat).Sub(r[shift+k], new(big.Rat).Mul(c, m[k]))
		}
		r = r.trim()
	}
	return q.trim(), r
}

// monic returns p divided by its leading coefficient (p non-zero).
func (p upoly) monic() upoly {
	p = p.trim()
	lc := p[len(p)-1]
	out := make(upoly, len(p))
	for k := range p {
		out[k] = new(big.Rat).Quo(p[k], lc)
	}
	return out
}

// gcd returns the monic greatest common divisor of p and q; gcd(0, 0) = 0.
func gcd(p, q upoly) upoly {
	a, b := p.trim(), q.trim()
	for len(b) > 0 {
		_, r := a.divMod(b)
		a, b = b, r
	}
	if len(a) == 0 {
		return nil
	}
	return a.monic()
}

// squareFree returns the square-free decomposition of a non-constant p by
// Yun's algorithm: factors[i] is the product of the irreducible factors of
// multiplicity i+1, so p = c·Π factors[i]^(i+1) for a constant c.
// (Yun 1976, "On square-free decomposition algorithms", SYMSAC '76.)
func squareFree(p upoly) []upoly {
	p = p.trim()
	if p.deg() < 1 {
		return nil
	}
	dp := p.derivative()
	a := gcd(p, dp)
	b, _ := p.divMod(a)
	c, _ := dp.divMod(a)
	d := sub(c, b.derivative())
	var out []upoly
	for b.deg() >= 1 {
		g := gcd(b, d)
		out = append(out, g)
		b, _ = b.divMod(g)
		c, _ = d.divMod(g)
		d = sub(c, b.derivative())
	}
	return out
}

// sturm returns the Sturm sequence p0 = p, p1 = p', p_{k+1} = −rem(p_{k−1}, p_k).
func sturm(p upoly) []upoly {
	seq := []upoly{p.trim()}
	d := p.derivative()
	if len(d) == 0 {
		return seq
	}
	seq = append(seq, d)
	for {
		_, r := seq[len(seq)-2].divMod(seq[len(seq)-1])
		if len(r) == 0 {
			return seq
		}
		seq = append(seq, neg(r))
	}
}

// signChanges counts sign changes in the sequence of signs, ignoring zeros.
func signChanges(signs []int) int {
	n, last := 0, 0
	for _, s := range signs {
		if s == 0 {
			continue
		}
		if last != 0 && s != last {
			n++
		}
		last = s
	}
	return n
}

// changesAt counts the sign changes of a Sturm sequence at x.
func changesAt(seq []upoly, x *big.Rat) int {
	signs := make([]int, len(seq))
	for i, q := range seq {
		signs[i] = q.signAt(x)
	}
	return signChanges(signs)
}

// changesAtInfinity counts sign changes at +∞ (neg false) or −∞ (neg true).
func changesAtInfinity(seq []upoly, negative bool) int {
	signs := make([]int, len(seq))
	for i, q := range seq {
		s := q.lead().Sign()
		if negative && q.deg()%2 == 1 {
			s = -s
		}
		signs[i] = s
	}
	return signChanges(signs)
}

// countRealRoots returns the number of distinct real roots of a non-zero p
// (Sturm's theorem; see e.g. Basu, Pollack & Roy 2006, Algorithms in Real
// Algebraic Geometry, Theorem 2.50).
func countRealRoots(p upoly) int {
	if p.deg() < 1 {
		return 0
	}
	seq := sturm(p)
	return changesAtInfinity(seq, true) - changesAtInfinity(seq, false)
}

// rootBound returns a rational B with every real root of p in (−B, B):
// Cauchy's bound 1 + max |c_k / c_n|.
func rootBound(p upoly) *big.Rat {
	p = p.trim()
	lc := new(big.Rat).Abs(p[len(p)-1])
	m := new(big.Rat)
	for _, c := range p[:len(p)-1] {
		q := new(big.Rat).Quo(new(big.Rat).Abs(c), lc)
		if q.Cmp(m) > 0 {
			m = q
		}
	}
	return m.Add(m, big.NewRat(1, 1))
}

// interval holds one real root r with Lo < r <= Hi, or r = Lo = Hi when the
// root is rational and was hit exactly.
type interval struct{ Lo, Hi *big.Rat }

// exact reports whether the interval is a single rational point.
func (iv interval) exact() bool { return iv.Lo.Cmp(iv.Hi) == 0 }

// isolateRoots returns intervals, in increasing order, each holding exactly
// one distinct real root of p, narrowed until the width is at most width
// (or the root is hit exactly).
//
// It bisects with Sturm counts. For a square-free p and Var(x) the number of
// sign changes of the Sturm sequence at x (zeros skipped), the number of
// roots in (a, b] is Var(a) − Var(b) whenever p(a) ≠ 0 or a is itself a
// root counted outside; a root at b is counted (Var(b) equals Var(b+)).
func isolateRoots(p upoly, width *big.Rat) []interval {
	if p.deg() < 1 {
		return nil
	}
	g := gcd(p, p.derivative())
	sf, _ := p.divMod(g)
	if sf.deg() == 1 {
		// One root, −c0/c1, exactly.
		r := new(big.Rat).Quo(sf[0], sf[1])
		r.Neg(r)
		return []interval{{r, new(big.Rat).Set(r)}}
	}
	seq := sturm(sf)
	var out []interval
	half := big.NewRat(1, 2)
	// split isolates the n roots in (lo, hi], or in (lo, hi) when open is
	// set (hi is then a root already recorded).
	var split func(lo, hi *big.Rat, n int, open bool)
	split = func(lo, hi *big.Rat, n int, open bool) {
		if n <= 0 {
			return
		}
		if n == 1 && !open && sf.signAt(hi) == 0 {
			out = append(out, interval{hi, hi})
			return
		}
		if n == 1 && new(big.Rat).Sub(hi, lo).Cmp(width) <= 0 {
			// A rational root is most likely the simplest rational in
			// the interval; test it exactly.
			// In an open interval hi is a root already recorded and
			// must not be taken again.
			if r := simplest(lo, hi); r.Cmp(lo) > 0 && (!open || r.Cmp(hi) < 0) && sf.signAt(r) == 0 {
				out = append(out, interval{r, r})
				return
			}
			out = append(out, interval{lo, hi})
			return
		}
		mid := new(big.Rat).Mul(new(big.Rat).Add(lo, hi), half)
		left := changesAt(seq, lo) - changesAt(seq, mid) // roots in (lo, mid]
		right := n - left
		if sf.signAt(mid) == 0 {
			split(lo, mid, left-1, true)
			out = append(out, interval{mid, mid})
			split(mid, hi, right, open)
			return
		}
		split(lo, mid, left, false)
		split(mid, hi, right, open)
	}
	b := rootBound(sf)
	lo, hi := new(big.Rat).Neg(b), b
	split(lo, hi, changesAt(seq, lo)-changesAt(seq, hi), false)
	return out
}

// simplest returns the rational with the smallest denominator in [a, b]
// (a ≤ b), by continued fractions.
func simplest(a, b *big.Rat) *big.Rat {
	switch {
	case a.Sign() <= 0 && b.Sign() >= 0:
		return new(big.Rat)
	case b.Sign() < 0:
		r := simplest(new(big.Rat).Neg(b), new(big.Rat).Neg(a))
		return r.Neg(r)
	}
	n := new(big.Int).Quo(a.Num(), a.Denom()) // floor, as a > 0
	fl := new(big.Rat).SetInt(n)
	if fl.Cmp(a) == 0 {
		return fl
	}
	next := new(big.Rat).Add(fl, big.NewRat(1, 1))
	if next.Cmp(b) <= 0 {
		return next
	}
	lo := new(big.Rat).Inv(new(big.Rat).Sub(b, fl))
	hi := new(big.Rat).Inv(new(big.Rat).Sub(a, fl))
	r := simplest(lo, hi)
	return r.Add(fl, r.Inv(r))
}

// oddMultiplicityPart returns the product of the irreducible factors of p of
// odd multiplicity: p changes sign exactly at the real roots of this part.
func oddMultiplicityPart(p upoly) upoly {
	f := squareFree(p)
	out := upoly{big.NewRat(1, 1)}
	for i, q := range f {
		if i%2 == 0 {
			out = mul(out, q)
		}
	}
	return out
}

func clone(p upoly) upoly {
	out := make(upoly, len(p))
	for k, c := range p {
		out[k] = new(big.Rat).Set(c)
	}
	return out
}

func neg(p upoly) upoly {
	out := make(upoly, len(p))
	for k, c := range p {
		out[k] = new(big.Rat).Neg(c)
	}
	return out
}

func sub(p, q upoly) upoly {
	n := max(len(p), len(q))
	out := make(upoly, n)
	for k := range out {
		out[k] = new(big.Rat)
		if k < len(p) {
			out[k].Add(out[k], p[k])
		}
		if k < len(q) {
			out[k].Sub(out[k], q[k])
		}
	}
	return out.trim()
}

func mul(p, q upoly) upoly {
	if len(p) == 0 || len(q) == 0 {
		return nil
	}
	out := make(upoly, len(p)+len(q)-1)
	for k := range out {
		out[k] = new(big.Rat)
	}
	t := new(big.Rat)
	for i, a := range p {
		for j, b := range q {
			out[i+j].Add(out[i+j], t.Mul(a, b))
		}
	}
	return out.trim()
}
