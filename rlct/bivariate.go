package rlct

import (
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// monomialChange is a unimodular monomial change of coordinates that makes
// a polynomial F = w^base·P(y_1, …, y_r) with P a Laurent polynomial in r
// new variables. With the integer matrix U (det ±1), w_i = Π_j y_j^{U_ij}
// and y_j = Π_i w_i^{(U⁻¹)_ji}: a group automorphism of the real torus
// (R∖{0})^d, because both maps are monomial maps with integer exponents
// and they are inverse to each other. Under it w^v = y^{v·U}.
type monomialChange struct {
	base []int
	u    [][]int // d×d, unimodular
	rank int     // the number r of new variables P depends on
}

// maxEntry bounds the entries of U; a larger one makes the change decline.
const maxEntry = 1 << 30

// reduceSupport finds the change for the support of F: the differences of
// the exponents from the first one span a lattice L of rank r, and integer
// column operations (extended gcd steps, each unimodular) bring the matrix
// of differences to [H | 0] with r non-zero columns. ok is false when an
// entry grows beyond maxEntry.
func reduceSupport(sup []monomial.Exponent) (monomialChange, bool) {
	d := len(sup[0])
	base := append([]int(nil), sup[0]...)
	rows := make([][]int, 0, len(sup)-1)
	for _, e := range sup[1:] {
		r := make([]int, d)
		for i := range d {
			r[i] = e[i] - base[i]
		}
		rows = append(rows, r)
	}
	u := make([][]int, d)
	for i := range u {
		u[i] = make([]int, d)
		u[i][i] = 1
	}
	// colOp replaces columns a, b by (p·a + q·b, r·a + s·b) in rows and u,
	// with p·s − q·r = ±1.
	colOp := func(a, b, p, q, r, s int) bool {
		for _, m := range [][][]int{rows, u} {
			for _, row := range m {
				x, y := row[a], row[b]
				na, nb := p*x+q*y, r*x+s*y
				if abs(na) > maxEntry || abs(nb) > maxEntry {
					return false
				}
				row[a], row[b] = na, nb
			}
		}
		return true
	}
	rank := 0
	for _, row := range rows {
		if rank == d {
			break
		}
		for j := rank + 1; j < d; j++ {
			if row[j] == 0 {
				continue
			}
			// Extended gcd of row[rank], row[j]: x·a + y·b = g.
			a, b := row[rank], row[j]
			g, x, y := extGCD(a, b)
			// New column rank = x·col_rank + y·col_j; new column j =
			// (−b/g)·col_rank + (a/g)·col_j; determinant x·a/g + y·b/g = 1.
			if !colOp(rank, j, x, y, -b/g, a/g) {
				return monomialChange{}, false
			}
		}
		if row[rank] != 0 {
			rank++
		}
	}
	return monomialChange{base: base, u: u, rank: rank}, true
}

// extGCD returns g = gcd(a, b) > 0 and x, y with x·a + y·b = g (a, b not
// both zero).
func extGCD(a, b int) (g, x, y int) {
	oldR, r := a, b
	oldS, s := 1, 0
	oldT, t := 0, 1
	for r != 0 {
		q := oldR / r
		oldR, r = r, oldR-q*r
		oldS, s = s, oldS-q*s
		oldT, t = t, oldT-q*t
	}
	if oldR < 0 {
		oldR, oldS, oldT = -oldR, -oldS, -oldT
	}
	return oldR, oldS, oldT
}

// newExponent returns the first r entries of (e − base)·U.
func (c monomialChange) newExponent(e []int) []int {
	out := make([]int, c.rank)
	for j := range c.rank {
		for i := range e {
			out[j] += (e[i] - c.base[i]) * c.u[i][j]
		}
	}
	return out
}

// bpoly is a polynomial in s and t over Q: bpoly[k] is the coefficient of
// t^k, a polynomial in s. The canonical form has a non-zero last entry.
type bpoly []upoly

func (p bpoly) trim() bpoly {
	n := len(p)
	for n > 0 && len(p[n-1].trim()) == 0 {
		n--
	}
	return p[:n]
}

// plane returns, for a change of rank 2, P(s, t) = s^{-a0}·t^{-c0}·F/w^base
// with the least powers a0, c0 taken out, so that P is a polynomial with
// P(0, t) ≢ 0 and P(s, 0) ≢ 0.
func (c monomialChange) plane(F *monomial.Poly) bpoly {
	type term struct {
		a, t int
		c    *big.Rat
	}
	var terms []term
	amin, tmin, tmax, amax := 0, 0, 0, 0
	first := true
	for e, coef := range F.All() {
		ne := c.newExponent(e)
		terms = append(terms, term{ne[0], ne[1], coef})
		if first {
			amin, amax, tmin, tmax = ne[0], ne[0], ne[1], ne[1]
			first = false
		}
		amin, amax = min(amin, ne[0]), max(amax, ne[0])
		tmin, tmax = min(tmin, ne[1]), max(tmax, ne[1])
	}
	p := make(bpoly, tmax-tmin+1)
	for k := range p {
		p[k] = make(upoly, amax-amin+1)
		for i := range p[k] {
			p[k][i] = new(big.Rat)
		}
	}
	for _, tm := range terms {
		x := p[tm.t-tmin][tm.a-amin]
		x.Add(x, tm.c)
	}
	for k := range p {
		p[k] = p[k].trim()
	}
	return p.trim()
}

// degS returns the degree of p in s.
func (p bpoly) degS() int {
	d := -1
	for _, c := range p {
		d = max(d, c.deg())
	}
	return d
}

// content returns the monic gcd of the coefficients of p (in Q[s]).
func (p bpoly) content() upoly {
	var g upoly
	for _, c := range p {
		g = gcd(g, c)
	}
	return g
}

// primitivePart divides p by its content.
func (p bpoly) primitivePart() bpoly {
	g := p.content()
	out := make(bpoly, len(p))
	for k, c := range p {
		out[k], _ = c.divMod(g)
	}
	return out.trim()
}

// derivT returns ∂p/∂t.
func (p bpoly) derivT() bpoly {
	if len(p) <= 1 {
		return nil
	}
	out := make(bpoly, len(p)-1)
	for k := 1; k < len(p); k++ {
		out[k-1] = scale(p[k], new(big.Rat).SetInt64(int64(k)))
	}
	return out.trim()
}

// pseudoDivide returns q, r with lc(b)^{δ}·a = q·b + r, δ = deg a − deg b + 1,
// deg_t r < deg_t b (b non-zero).
func pseudoDivide(a, b bpoly) (q, r bpoly) {
	a, b = a.trim(), b.trim()
	r = append(bpoly(nil), a...)
	db := len(b) - 1
	if len(r)-1 < db {
		return nil, r
	}
	lc := b[db]
	q = make(bpoly, len(r)-db)
	for k := range q {
		q[k] = nil
	}
	for len(r)-1 >= db && len(r) > 0 {
		shift := len(r) - 1 - db
		c := r[len(r)-1]
		// r ← lc·r − c·t^shift·b; q ← lc·q + c·t^shift.
		for k := range q {
			q[k] = mul(q[k], lc)
		}
		q[shift] = add(q[shift], c)
		nr := make(bpoly, len(r))
		for k := range r {
			nr[k] = mul(r[k], lc)
		}
		for k := 0; k <= db; k++ {
			nr[shift+k] = sub(nr[shift+k], mul(c, b[k]))
		}
		r = nr.trim()
	}
	return q.trim(), r
}

// gcdT returns a primitive gcd in Q[s][t] of primitive a and b (primitive
// pseudo-remainder sequence; common practice, e.g. Knuth, TAOCP vol. 2,
// §4.6.1, from memory).
func gcdT(a, b bpoly) bpoly {
	a, b = a.primitivePart(), b.primitivePart()
	if len(a) < len(b) {
		a, b = b, a
	}
	for len(b) > 1 {
		_, r := pseudoDivide(a, b)
		if len(r) == 0 {
			return b
		}
		a, b = b, r.primitivePart()
	}
	if len(b) == 0 {
		return a
	}
	return bpoly{upoly{big.NewRat(1, 1)}} // b a non-zero polynomial in s only: the gcd has t-degree 0
}

// evalS returns p(s0, t) as a univariate polynomial in t.
func (p bpoly) evalS(s0 *big.Rat) upoly {
	out := make(upoly, len(p))
	for k, c := range p {
		out[k] = c.eval(s0)
	}
	return out.trim()
}

// resultant returns Res(a, b) for univariate a, b over Q (by the Euclidean
// algorithm: Res(A, B) = (−1)^{deg A·deg B}·lc(B)^{deg A − deg R}·Res(B, R)
// with R = A mod B; common practice).
func resultant(a, b upoly) *big.Rat {
	a, b = a.trim(), b.trim()
	if len(a) == 0 || len(b) == 0 {
		return new(big.Rat)
	}
	out := big.NewRat(1, 1)
	for {
		da, db := a.deg(), b.deg()
		if db == 0 {
			return out.Mul(out, ratPow(b[0], da))
		}
		_, r := a.divMod(b)
		if len(r) == 0 {
			return new(big.Rat)
		}
		if (da*db)%2 == 1 {
			out.Neg(out)
		}
		out.Mul(out, ratPow(b.lead(), da-r.deg()))
		a, b = b, r
	}
}

func ratPow(x *big.Rat, n int) *big.Rat {
	out := big.NewRat(1, 1)
	for range n {
		out.Mul(out, x)
	}
	return out
}

// discriminantT returns D(s) = Res_t(p, ∂p/∂t) as a polynomial in s, by
// evaluation at rational points where the leading coefficient does not
// vanish (there the resultant of the specialisations is the specialised
// resultant, since both leading coefficients survive) and interpolation
// through deg_s(p)·(2·deg_t(p) − 1) + 1 points, a bound on its degree (the
// Sylvester matrix has deg_t p − 1 rows of p and deg_t p rows of ∂p/∂t,
// each entry of degree ≤ deg_s p).
func (p bpoly) discriminantT() upoly {
	n := len(p) - 1
	dp := p.derivT()
	need := p.degS()*(2*n-1) + 1
	lc := p[n]
	var xs, ys []*big.Rat
	for k := int64(1); len(xs) < need; k++ {
		x := big.NewRat(k, 1)
		if lc.signAt(x) == 0 {
			continue
		}
		xs = append(xs, x)
		ys = append(ys, resultant(p.evalS(x), dp.evalS(x)))
	}
	return interpolate(xs, ys)
}

// interpolate returns the polynomial of degree < len(xs) through the
// points, by Newton's divided differences.
func interpolate(xs, ys []*big.Rat) upoly {
	n := len(xs)
	c := make([]*big.Rat, n)
	for i := range ys {
		c[i] = new(big.Rat).Set(ys[i])
	}
	for j := 1; j < n; j++ {
		for i := n - 1; i >= j; i-- {
			num := new(big.Rat).Sub(c[i], c[i-1])
			c[i] = num.Quo(num, new(big.Rat).Sub(xs[i], xs[i-j]))
		}
	}
	out := upoly{}
	for i := n - 1; i >= 0; i-- {
		// out ← out·(s − xs[i]) + c[i]
		out = add(mul(out, upoly{new(big.Rat).Neg(xs[i]), big.NewRat(1, 1)}), upoly{c[i]})
	}
	return out.trim()
}
