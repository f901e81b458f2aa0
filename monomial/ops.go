package monomial

import (
	"fmt"
	"math/big"
	"strings"
)

// Eval returns p(x) exactly. It panics if len(x) != NumVars. Its cost
// grows with the size of the powers x_i^k, which is large for large k
// unless x_i is 0 or ±1.
func (p *Poly) Eval(x []*big.Rat) *big.Rat {
	if len(x) != len(p.vars) {
		panic(fmt.Sprintf("monomial: Eval: %d values for %d variables", len(x), len(p.vars)))
	}
	// Powers are computed by exponentiation by squaring and cached.
	type key struct{ v, k int }
	cache := map[key]*big.Rat{}
	power := func(v, k int) *big.Rat {
		if r, ok := cache[key{v, k}]; ok {
			return r
		}
		e := big.NewInt(int64(k))
		r := new(big.Rat).SetFrac(new(big.Int).Exp(x[v].Num(), e, nil), new(big.Int).Exp(x[v].Denom(), e, nil))
		cache[key{v, k}] = r
		return r
	}
	sum, t := new(big.Rat), new(big.Rat)
	for i, c := range p.coefs {
		t.Set(c.ratView())
		for v, k := range p.exp(i) {
			if k > 0 {
				t.Mul(t, power(v, k))
			}
		}
		sum.Add(sum, t)
	}
	return sum
}

// Substitute returns p with variable i replaced by q, which must have the
// same variables as p. It panics if i is out of range or the variables differ.
func (p *Poly) Substitute(i int, q *Poly) *Poly {
	sameVars(p, q)
	if i < 0 || i >= len(p.vars) {
		panic(fmt.Sprintf("monomial: Substitute: variable index %d out of range", i))
	}
	// Group the terms by their power of variable i: p = Σ_k c_k · x_i^k.
	groups := map[int]*accumulator{}
	e := make([]int, len(p.vars))
	maxK := 0
	for t := range p.coefs {
		copy(e, p.exp(t))
		k := e[i]
		e[i] = 0
		g := groups[k]
		if g == nil {
			g = newAccumulator(p.vars)
			groups[k] = g
		}
		g.add(e, p.coefs[t])
		maxK = max(maxK, k)
	}
	r := &Poly{vars: p.vars}
	qk := constPoly(p.vars, coefOne)
	for k := 0; k <= maxK; k++ {
		if k > 0 {
			qk = qk.Mul(q)
		}
		if g := groups[k]; g != nil {
			r = r.Add(g.poly().Mul(qk))
		}
	}
	return r
}

// Translate returns p(point + u) as a polynomial in u, with the same
// variable names: the Taylor expansion of p around point. It panics if
// len(point) != NumVars.
func (p *Poly) Translate(point []*big.Rat) *Poly {
	if len(point) != len(p.vars) {
		panic(fmt.Sprintf("monomial: Translate: point has %d entries for %d variables", len(point), len(p.vars)))
	}
	r := p
	for v, a := range point {
		if a.Sign() == 0 {
			continue
		}
		r = r.shift(v, coefFromRat(a))
	}
	return r
}

// shift returns p with x_v replaced by x_v + a, expanding each power
// (x_v + a)^k by the binomial theorem.
func (p *Poly) shift(v int, a coef) *Poly {
	acc := newAccumulator(p.vars)
	maxK := 0
	for t := range p.coefs {
		maxK = max(maxK, p.exp(t)[v])
	}
	apow := make([]coef, maxK+1) // a^j
	apow[0] = coefOne
	for j := 1; j <= maxK; j++ {
		apow[j] = apow[j-1].mul(a)
	}
	e := make([]int, len(p.vars))
	binom := make([]coef, maxK+1)
	for t := range p.coefs {
		copy(e, p.exp(t))
		k := e[v]
		// binom[j] = C(k, j), built row by row.
		binom[0] = coefOne
		for j := 1; j <= k; j++ {
			binom[j] = binom[j-1].mul(smallInt(int64(k - j + 1))).mul(coef{num: 1, den: int64(j)})
		}
		for j := 0; j <= k; j++ {
			e[v] = j
			acc.add(e, p.coefs[t].mul(binom[j]).mul(apow[k-j]))
		}
	}
	return acc.poly()
}

// String returns p in the syntax read by Parse, in term order, for example
// "3*x^2*y - 1/2*z + 4"; the zero polynomial prints as "0". When the
// variable names are identifiers of the expression language (not function
// names), Parse(p.String(), Config{Vars: p.Vars()}) returns p again, within
// the parser's Limits on the number of variables and terms.
func (p *Poly) String() string {
	if len(p.coefs) == 0 {
		return "0"
	}
	var b strings.Builder
	for i, c := range p.coefs {
		neg := c.sign() < 0
		if neg {
			c = c.neg()
		}
		switch {
		case i == 0 && neg:
			b.WriteString("-")
		case i > 0 && neg:
			b.WriteString(" - ")
		case i > 0:
			b.WriteString(" + ")
		}
		mono := monomialString(p.vars, p.exp(i))
		switch {
		case mono == "":
			b.WriteString(c.ratView().RatString())
		case c.isOne():
			b.WriteString(mono)
		default:
			b.WriteString(c.ratView().RatString())
			b.WriteString("*")
			b.WriteString(mono)
		}
	}
	return b.String()
}

func monomialString(vars []string, e []int) string {
	var b strings.Builder
	for v, k := range e {
		if k == 0 {
			continue
		}
		if b.Len() > 0 {
			b.WriteString("*")
		}
		b.WriteString(vars[v])
		if k > 1 {
			fmt.Fprintf(&b, "^%d", k)
		}
	}
	return b.String()
}

// GoString returns a Go-syntax-like description, for debugging.
func (p *Poly) GoString() string {
	return fmt.Sprintf("monomial.Poly{vars: %q, %s}", p.vars, p.String())
}

// vanishesAtZero reports whether p has zero constant term.
func (p *Poly) vanishesAtZero() bool { return p.constCoef().isZero() }

// withoutConstant returns p minus its constant term.
func (p *Poly) withoutConstant() *Poly {
	n := len(p.coefs)
	if n > 0 && Exponent(p.exp(n-1)).Degree() == 0 {
		return &Poly{vars: p.vars, exps: p.exps[:(n-1)*len(p.vars)], coefs: p.coefs[:n-1]}
	}
	return p
}
