package monomial

import (
	"math"
	"math/big"
)

// This file holds the truncated power series machinery: Taylor coefficients
// of univariate functions at 0, and their composition with a multivariate
// polynomial that vanishes at 0.

// A univariate series a_0 + a_1 t + a_2 t^2 + ... truncated after a_K is
// held as a []*big.Rat of length K+1.

// seriesCoefs returns the Taylor coefficients at 0, up to t^k, of the named
// function (log means log(1+t)); ok is false for an unknown name.
func seriesCoefs(name string, k int) (a []*big.Rat, ok bool) {
	switch name {
	case "exp":
		return expCoefs(k, 0, 1, 1), true
	case "sin":
		return expCoefs(k, 1, 2, -1), true
	case "cos":
		return expCoefs(k, 0, 2, -1), true
	case "sinh":
		return expCoefs(k, 1, 2, 1), true
	case "cosh":
		return expCoefs(k, 0, 2, 1), true
	case "tanh":
		return divideSeries(expCoefs(k, 1, 2, 1), expCoefs(k, 0, 2, 1)), true
	case "log":
		// log(1+t) = Σ_{j>=1} (-1)^(j+1) t^j / j
		a := zeroSeries(k)
		for j := 1; j <= k; j++ {
			a[j].SetFrac64(1, int64(j))
			if j%2 == 0 {
				a[j].Neg(a[j])
			}
		}
		return a, true
	case "atan":
		// atan(t) = Σ_{j>=0} (-1)^j t^(2j+1) / (2j+1)
		a := zeroSeries(k)
		for j := 1; j <= k; j += 2 {
			a[j].SetFrac64(1, int64(j))
			if j%4 == 3 {
				a[j].Neg(a[j])
			}
		}
		return a, true
	}
	return nil, false
}

func zeroSeries(k int) []*big.Rat {
	a := make([]*big.Rat, k+1)
	for i := range a {
		a[i] = new(big.Rat)
	}
	return a
}

// expCoefs returns the series Σ_j s^j t^(first + step·j) / (first + step·j)!
// up to t^k: exp is (0,1,1), sin (1,2,-1), cos (0,2,-1), sinh (1,2,1),
// cosh (0,2,1).
func expCoefs(k, first, step int, s int64) []*big.Rat {
	a := zeroSeries(k)
	fact := big.NewInt(1) // i!
	sign := int64(1)
	for i := 0; i <= k; i++ {
		if i > 0 {
			fact.Mul(fact, big.NewInt(int64(i)))
		}
		if i >= first && (i-first)%step == 0 {
			a[i].SetFrac(big.NewInt(sign), fact)
			sign *= s
		}
	}
	return a
}

// divideSeries returns a/b for univariate series with b[0] != 0, by the
// recurrence c_n = (a_n - Σ_{j=1..n} b_j c_{n-j}) / b_0.
func divideSeries(a, b []*big.Rat) []*big.Rat {
	c := zeroSeries(len(a) - 1)
	t := new(big.Rat)
	for n := range c {
		c[n].Set(a[n])
		for j := 1; j <= n && j < len(b); j++ {
			if b[j].Sign() != 0 {
				c[n].Sub(c[n], t.Mul(b[j], c[n-j]))
			}
		}
		c[n].Quo(c[n], b[0])
	}
	return c
}

// binomialCoefs returns the coefficients of (1+t)^r up to t^k:
// C(r, j) = r(r-1)...(r-j+1)/j!.
func binomialCoefs(r *big.Rat, k int) []*big.Rat {
	a := zeroSeries(k)
	a[0].SetInt64(1)
	t := new(big.Rat)
	for j := 1; j <= k; j++ {
		t.SetInt64(int64(j - 1))
		t.Sub(r, t) // r - j + 1
		a[j].Mul(a[j-1], t)
		a[j].Quo(a[j], t.SetInt64(int64(j)))
	}
	return a
}

// compose returns Σ_j a_j u^j truncated to total degree d, where u has zero
// constant term. It evaluates Horner's scheme h_j = a_j + u·h_{j+1} from the
// top and truncates h_j to degree d - j·m (m is the lowest degree in u),
// which is all of h_j that can reach degree d in the result. The guard
// limits the terms and work of each step. A non-nil cut also removes from
// u and every h_j the terms that strictly dominate a floor point: every
// term of the result that such a term contributes to is a multiple of it,
// so it strictly dominates the floor point too, and the result is the
// full one without those terms (the cutter records their generators).
func compose(a []*big.Rat, u *Poly, d int, g *guard, cut *floorCutter) (*Poly, error) {
	if u.IsZero() {
		return constPoly(u.vars, coefFromRat(a[0])), nil
	}
	m := u.MinDegree()
	if m <= 0 {
		panic("monomial: compose with an argument that does not vanish at 0")
	}
	k := min(len(a)-1, d/m)
	u = cut.cut(u.Truncate(d))
	if g != nil {
		if est := composeWork(a[:k+1], u, d); est > g.work {
			return nil, errTooMuchWork // refused before any work
		}
	}
	h := constPoly(u.vars, coefFromRat(a[k]))
	for j := k - 1; j >= 0; j-- {
		var err error
		h, err = mul(u, h, d-j*m, g)
		if err != nil {
			return nil, err
		}
		h = cut.cut(h)
		if a[j].Sign() != 0 {
			h = h.Add(constPoly(u.vars, coefFromRat(a[j])))
		}
	}
	return h, nil
}

// composeWork estimates the work of compose: step j multiplies u by h_{j+1},
// whose number of terms is at most the number of monomials of degree
// <= k-j-1 in the terms of u, and at most the number of monomials of
// degree <= d-(j+1)m in the variables of u.
func composeWork(a []*big.Rat, u *Poly, d int) float64 {
	k := len(a) - 1
	m := u.MinDegree()
	t := float64(u.Len())
	active := 0.0
	for _, e := range maxExponents(u) {
		if e > 0 {
			active++
		}
	}
	bitsA := 0
	for _, c := range a {
		bitsA = max(bitsA, c.Num().BitLen()+c.Denom().BitLen())
	}
	cost := pairCost(bitsA+maxBitLen(u)*k, maxBitLen(u))
	w := 0.0
	for j := k - 1; j >= 0; j-- {
		byTerms := binomialF(float64(k-j-1)+t, t)
		byDegree := binomialF(float64(d-(j+1)*m)+active, active)
		w += t * math.Min(byTerms, byDegree) * cost
	}
	return w
}

// intRoot returns the q-th root of n >= 0 when it is an integer.
func intRoot(n *big.Int, q int) (*big.Int, bool) {
	if n.Sign() == 0 || q == 1 {
		return new(big.Int).Set(n), true
	}
	if q == 2 {
		r := new(big.Int).Sqrt(n)
		return r, new(big.Int).Mul(r, r).Cmp(n) == 0
	}
	if q > n.BitLen() {
		// The root is below 2, so it is 1 or not an integer.
		return big.NewInt(1), n.Cmp(big.NewInt(1)) == 0
	}
	// Binary search for r with r^q = n in [0, 2^(bitlen/q + 1)).
	lo := big.NewInt(0)
	hi := new(big.Int).Lsh(big.NewInt(1), uint(n.BitLen()/q+1))
	bq := big.NewInt(int64(q))
	mid, p := new(big.Int), new(big.Int)
	for new(big.Int).Sub(hi, lo).Cmp(big.NewInt(1)) > 0 {
		mid.Add(lo, hi).Rsh(mid, 1)
		p.Exp(mid, bq, nil)
		switch p.Cmp(n) {
		case 0:
			return mid, true
		case -1:
			lo.Set(mid)
		default:
			hi.Set(mid)
		}
	}
	p.Exp(lo, bq, nil)
	return lo, p.Cmp(n) == 0
}

// ratRoot returns the real q-th root (q >= 1) of c when it is rational. A
// negative c has a real root only for odd q.
func ratRoot(c *big.Rat, q int) (*big.Rat, bool) {
	neg := c.Sign() < 0
	if neg && q%2 == 0 {
		return nil, false
	}
	num := new(big.Int).Abs(c.Num())
	a, ok1 := intRoot(num, q)
	b, ok2 := intRoot(c.Denom(), q)
	if !ok1 || !ok2 {
		return nil, false
	}
	r := new(big.Rat).SetFrac(a, b)
	if neg {
		r.Neg(r)
	}
	return r, true
}

// ratPow returns c^r, r = p/q in lowest terms, taking the real q-th root,
// when it is rational. It returns false when it is not rational, not real,
// or c = 0 with p < 0.
func ratPow(c *big.Rat, r *big.Rat) (*big.Rat, bool) {
	if !r.Denom().IsInt64() || !r.Num().IsInt64() {
		return nil, false
	}
	root, ok := ratRoot(c, int(r.Denom().Int64()))
	if !ok {
		return nil, false
	}
	p := r.Num().Int64()
	if p < 0 && root.Sign() == 0 {
		return nil, false
	}
	e := big.NewInt(p)
	e.Abs(e)
	n := new(big.Int).Exp(root.Num(), e, nil) // keeps the sign for odd p
	d := new(big.Int).Exp(root.Denom(), e, nil)
	if p < 0 {
		n, d = d, n
	}
	return new(big.Rat).SetFrac(n, d), true
}
