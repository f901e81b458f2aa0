package monomial

import (
	"math/rand/v2"
	"strconv"
	"strings"
)

// This file generates the large inputs of the parser benchmarks and of the
// differential tests. Each generator is deterministic (seeded) and returns
// the source text with its number of summands.

// genSquares returns a sum of terms squared monomials in nvars variables
// x1..xn, written out as x1^4*x3^10*x7^2 + x2^12*x5^6 + …: each variable
// appears in a term with probability quarters/4 (at least one per term)
// with an even exponent from 2 to 12.
func genSquares(seed uint64, terms, nvars, quarters int) string {
	r := rand.New(rand.NewPCG(seed, 1))
	var b strings.Builder
	for t := range terms {
		if t > 0 {
			b.WriteString(" + ")
		}
		first := true
		for v := range nvars {
			if r.IntN(4) >= quarters && !(v == nvars-1 && first) {
				continue
			}
			if !first {
				b.WriteByte('*')
			}
			first = false
			b.WriteString("x" + strconv.Itoa(v+1) + "^" + strconv.Itoa(2*(1+r.IntN(6))))
		}
	}
	return b.String()
}

// genEvenDegree returns the sum of all monomials Π x_i^(2 e_i) with
// e_1 + … + e_n = deg in n variables: C(deg+n-1, n-1) terms.
func genEvenDegree(n, deg int) (string, int) {
	var b strings.Builder
	e := make([]int, n)
	count := 0
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == n-1 {
			e[i] = left
			if count > 0 {
				b.WriteString(" + ")
			}
			count++
			first := true
			for v, k := range e {
				if k == 0 {
					continue
				}
				if !first {
					b.WriteByte('*')
				}
				first = false
				b.WriteString("x" + strconv.Itoa(v+1) + "^" + strconv.Itoa(2*k))
			}
			return
		}
		for k := left; k >= 0; k-- {
			e[i] = k
			rec(i+1, left-k)
		}
	}
	rec(0, deg)
	return b.String(), count
}

// genSquaredProducts returns terms summands like (x2*x5^2*x9)^2: a
// product of one to four distinct variables among nvars, with exponents 1
// to 3, in parentheses and squared.
func genSquaredProducts(seed uint64, terms, nvars int) string {
	r := rand.New(rand.NewPCG(seed, 2))
	var b strings.Builder
	for t := range terms {
		if t > 0 {
			b.WriteString(" + ")
		}
		b.WriteByte('(')
		for i, v := range r.Perm(nvars)[:1+r.IntN(4)] {
			if i > 0 {
				b.WriteByte('*')
			}
			b.WriteString("x" + strconv.Itoa(v+1))
			if k := 1 + r.IntN(3); k > 1 {
				b.WriteString("^" + strconv.Itoa(k))
			}
		}
		b.WriteString(")^2")
	}
	return b.String()
}

// genCoefficients returns terms summands like 2*x1^2*x2 - 3/4*x3^4: a
// sign, a coefficient (an integer, a fraction p/q or a decimal, or none),
// and one to four variables among nvars with exponents 1 to 6.
func genCoefficients(seed uint64, terms, nvars int) string {
	r := rand.New(rand.NewPCG(seed, 3))
	var b strings.Builder
	for t := range terms {
		switch {
		case r.IntN(2) == 0:
			b.WriteString(" - ")
		case t > 0:
			b.WriteString(" + ")
		}
		switch r.IntN(4) {
		case 0:
			b.WriteString(strconv.Itoa(1+r.IntN(99)) + "*")
		case 1:
			b.WriteString(strconv.Itoa(1+r.IntN(99)) + "/" + strconv.Itoa(1+r.IntN(99)) + "*")
		case 2:
			b.WriteString("0." + strconv.Itoa(1+r.IntN(999)) + "*")
		}
		for i, v := range r.Perm(nvars)[:1+r.IntN(4)] {
			if i > 0 {
				b.WriteByte('*')
			}
			b.WriteString("x" + strconv.Itoa(v+1))
			if k := 1 + r.IntN(6); k > 1 {
				b.WriteString("^" + strconv.Itoa(k))
			}
		}
	}
	return b.String()
}
