package monomial

import (
	"math/bits"
	"slices"
)

// This file holds the parser's fast path for sums of monomials, the common
// shape of large inputs: a Term that is a product of numbers and variables
// with literal integer powers is read straight into an exponent vector and
// a coefficient, appended to a flat buffer of terms, and the buffer is
// sorted and merged once at the end of the sum. Every other Term goes
// through the general path (parse.go), which builds a Poly per factor.

// fastPath enables the fast path. It exists only so that tests can compare
// the fast path with the general path; it must not be changed while other
// goroutines parse.
var fastPath = true

// fastDepth bounds the nesting (signs, parentheses, powers) that the fast
// path follows within one term. The fast path is only tried when the
// parser is at least this far from maxDepth, so it never reaches the
// nesting limit that the general path reports.
const fastDepth = 8

// maxFastExponent bounds the exponents the fast path builds. Larger ones go
// to the general path, which reports exponents of 2^62 or more and, in
// series mode, truncates them.
const maxFastExponent = 1 << expBits

// maxFastVars bounds the number of variables for the fast path (variable
// indices must fit in a packed factor).
const maxFastVars = 1 << (64 - expBits)

// varPower is x_v^e, one factor of a term read by the fast path.
type varPower struct{ v, e int }

// termBuf collects the terms of a sum in flat arrays: term i is
// coefs[i]·Π x_v^e over the factors facs[starts[i]:starts[i+1]] (to the
// end for the last term), each packed as v<<expBits | e, sorted by v, with
// distinct variables and e > 0. Exponent vectors may repeat and
// coefficients may be zero until the buffer is canonicalised. Memory is
// proportional to the text the terms came from, whatever the number of
// variables.
type termBuf struct {
	facs   []uint64
	starts []int
	coefs  []coef
}

// expBits is the width of the exponent in a packed factor; exponents are
// below maxFastExponent = 2^expBits and variable indices below 2^(64-expBits).
const expBits = 40

// fastTerm tries to read the next Term as a product of numbers, variables
// and parenthesized such products, each with optional signs and an
// optional power by a non-negative integer literal, and divisions by
// non-zero numbers, such as 2*x1^4*x3, -3/4*y or (a*b^2)^2. On success it
// appends the term (negated if neg) to buf and returns its source span. For
// any other term (a sum in parentheses, a function, a non-literal or
// chained exponent, a large exponent, deep nesting, an error) it returns
// false with the parser and the work budget exactly as they were, and the
// general path reads the term. The fast path draws from the work budget
// what the general path would for the same products.
func (p *parser) fastTerm(buf *termBuf, neg bool) (off, end int, ok bool) {
	if !fastPath || p.depth+fastDepth >= maxDepth || len(p.vars) >= maxFastVars {
		return 0, 0, false
	}
	savedLx, savedCur, savedWork := *p.lx, p.cur, p.guard.work
	off = p.cur.off
	p.fac = p.fac[:0]
	c, ok := p.fastProduct(0)
	if ok {
		ok = buf.add(p.fac, c, neg)
	}
	if !ok {
		*p.lx, p.cur, p.guard.work = savedLx, savedCur, savedWork
		return 0, 0, false
	}
	return off, p.lastEnd, true
}

// fastAdvance moves to the next token, remembering where the current one
// ends.
func (p *parser) fastAdvance() {
	p.lastEnd = p.cur.end
	p.advance()
}

// fastProduct reads factor { "*" factor | "/" number }.
func (p *parser) fastProduct(depth int) (coef, bool) {
	c, ok := p.fastFactor(depth)
	if !ok {
		return c, false
	}
	for {
		switch p.cur.kind {
		case tStar:
			p.fastAdvance()
			w, ok := p.fastFactor(depth)
			if !ok {
				return c, false
			}
			if !c.isZero() && !w.isZero() {
				// What multiply charges for a product of two terms.
				if p.guard.charge(pairCost(c.bitLen(), w.bitLen())) != nil {
					return c, false
				}
			}
			c = c.mul(w)
		case tSlash:
			p.fastAdvance()
			t := p.cur
			if t.kind != tNumber {
				return c, false
			}
			p.fastAdvance()
			if p.cur.kind == tPow {
				return c, false
			}
			d := numberCoef(p.src[t.off:t.end])
			if d.isZero() {
				return c, false // the general path reports the division by zero
			}
			c = c.mul(d.inv())
		default:
			return c, true
		}
	}
}

// fastFactor reads { "+" | "-" } primary [ pow integer ].
func (p *parser) fastFactor(depth int) (coef, bool) {
	neg := false
	for p.cur.kind == tPlus || p.cur.kind == tMinus {
		if depth++; depth > fastDepth {
			return coefZero, false
		}
		neg = neg != (p.cur.kind == tMinus)
		p.fastAdvance()
	}
	start := len(p.fac)
	c, ok := p.fastPrimary(depth)
	if !ok {
		return c, false
	}
	if p.cur.kind == tPow {
		if depth++; depth > fastDepth {
			return c, false
		}
		p.fastAdvance()
		t := p.cur
		if t.kind != tNumber {
			return c, false
		}
		n, ok := smallUint(p.src[t.off:t.end])
		if !ok {
			return c, false
		}
		p.fastAdvance()
		if p.cur.kind == tPow {
			return c, false // x^2^3 is x^(2^3)
		}
		for i := start; i < len(p.fac); i++ {
			if e := p.fac[i].e; e > 0 && n >= maxFastExponent/e {
				return c, false
			}
			p.fac[i].e *= n
		}
		switch {
		case n == 1:
		case n == 0:
			c = coefOne
		case c.big == nil && c.den == 1 && (c.num == 0 || c.num == 1):
			// 0^n = 0 and 1^n = 1 for n > 0
		case c.big == nil && c.den == 1 && c.num == -1:
			c.num = 1 - 2*int64(n%2)
		default:
			// Pow refuses coefficients estimated above MaxBits (the bound
			// of powBitsBound for one term, which is also above the
			// estimate for a constant base).
			ln, ld := c.log2Parts()
			if float64(n)*(ln+2*ld) > float64(p.lim.MaxBits) {
				return c, false
			}
			c = c.powInt(n)
		}
	}
	if neg {
		c = c.neg()
	}
	return c, true
}

// fastPrimary reads number | variable | "(" product ")".
func (p *parser) fastPrimary(depth int) (coef, bool) {
	t := p.cur
	switch t.kind {
	case tNumber:
		p.fastAdvance()
		return numberCoef(p.src[t.off:t.end]), true
	case tIdent:
		name := p.src[t.off:t.end]
		if isFunction(name) {
			return coefZero, false
		}
		v := p.varIndex(name)
		if p.shifted(v) {
			return coefZero, false // a + x at the expansion point is not a monomial
		}
		p.fastAdvance()
		if p.cur.kind == tLParen {
			return coefZero, false // the general path reports the unknown function
		}
		p.fac = append(p.fac, varPower{v, 1})
		return coefOne, true
	case tLParen:
		if depth++; depth > fastDepth {
			return coefZero, false
		}
		p.fastAdvance()
		c, ok := p.fastProduct(depth)
		if !ok || p.cur.kind != tRParen {
			return c, false
		}
		p.fastAdvance()
		return c, true
	}
	return coefZero, false
}

// smallUint returns the value of a number literal made of at most 12
// decimal digits (no point, no exponent).
func smallUint(s string) (int, bool) {
	if len(s) > 12 {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		if !isDigitByte(s[i]) {
			return 0, false
		}
		n = n*10 + int(s[i]-'0')
	}
	return n, true
}

// numberCoef returns the exact value of a valid number token. Integers and
// decimals with at most 18 digits and no exponent are read without
// allocating.
func numberCoef(s string) coef {
	if !forceBig && len(s) <= 19 {
		var num, den int64 = 0, 1
		digits, point := 0, false
		ok := true
		for i := 0; i < len(s) && ok; i++ {
			switch c := s[i]; {
			case isDigitByte(c):
				num = num*10 + int64(c-'0')
				if point {
					den *= 10
				}
				digits++
			case c == '.' && !point:
				point = true
			default:
				ok = false // an exponent
			}
		}
		if ok && digits <= 18 {
			g := int64(gcd64(uint64(num), uint64(den)))
			if g > 1 {
				num, den = num/g, den/g
			}
			if num == 0 {
				return coefZero
			}
			return coef{num: num, den: den}
		}
	}
	r, _ := numberValue(s)
	return coefFromRat(r)
}

// add appends the monomial c·Π x_v^e (the product of the factors, negated
// if neg). It reports false, adding nothing, when an exponent reaches
// maxFastExponent.
func (b *termBuf) add(fac []varPower, c coef, neg bool) bool {
	at := len(b.facs)
	if len(fac) > cap(b.facs)-at {
		// Double by hand: slices.Grow would zero and copy a temporary of
		// the same size as well, which dominates the cost of long sums.
		grown := make([]uint64, at, max(2*cap(b.facs), at+len(fac), 64))
		copy(grown, b.facs)
		b.facs = grown
	}
	for _, f := range fac {
		if f.e > 0 {
			b.facs = append(b.facs, uint64(f.v)<<expBits|uint64(f.e))
		}
	}
	t := b.facs[at:]
	if len(t) > 1 {
		// Sort by variable (insertion sort: terms are short and usually
		// written in order) and merge repeated variables.
		if len(t) <= 32 {
			for i := 1; i < len(t); i++ {
				for j := i; j > 0 && t[j] < t[j-1]; j-- {
					t[j], t[j-1] = t[j-1], t[j]
				}
			}
		} else {
			slices.Sort(t)
		}
		w := 0
		for _, f := range t[1:] {
			if f>>expBits == t[w]>>expBits {
				t[w] += f & (maxFastExponent - 1)
				if t[w]>>expBits != f>>expBits {
					b.facs = b.facs[:at] // the sum reached maxFastExponent and carried
					return false
				}
				continue
			}
			w++
			t[w] = f
		}
		b.facs = b.facs[:at+w+1]
	}
	if neg {
		c = c.neg()
	}
	b.starts = append(b.starts, at)
	b.coefs = append(b.coefs, c)
	return true
}

// term returns the packed factors of term i.
func (b *termBuf) term(i int) []uint64 {
	if i+1 < len(b.starts) {
		return b.facs[b.starts[i]:b.starts[i+1]]
	}
	return b.facs[b.starts[i]:]
}

// poly returns the canonical polynomial of the buffer in the n variables
// vars.
func (b *termBuf) poly(vars []string) *Poly {
	n := len(vars)
	if len(b.coefs) == 1 {
		if b.coefs[0].isZero() {
			return &Poly{vars: vars}
		}
		e := make([]int, n)
		for _, f := range b.term(0) {
			e[f>>expBits] = int(f & (maxFastExponent - 1))
		}
		return &Poly{vars: vars, exps: e, coefs: b.coefs}
	}
	return b.sorted(vars)
}

// sorted returns the polynomial Σ coefs[i]·x^e_i in term order, with equal
// exponents summed and zero coefficients dropped.
//
// Each exponent vector is packed with its total degree into a key of one
// or more 64-bit words: the degree in the highest bits, then one bit field
// per variable (wide enough for its largest exponent), first variable
// first, no field split between words. Comparing keys word by word then
// compares terms in term order. The keys are radix sorted.
func (b *termBuf) sorted(vars []string) *Poly {
	n, t := len(vars), len(b.coefs)
	maxExp := make([]int, n)
	maxDeg := 0
	for i := range t {
		d := 0
		for _, f := range b.term(i) {
			v, e := int(f>>expBits), int(f&(maxFastExponent-1))
			maxExp[v] = max(maxExp[v], e)
			d += e
		}
		maxDeg = max(maxDeg, d)
	}
	// Lay out the fields: word and shift of the degree and of each variable.
	type field struct {
		word  int
		shift uint
	}
	fields := make([]field, n+1) // fields[0] is the degree
	words, used := 1, uint(0)
	free := []uint{64} // unused low bits of each word
	place := func(width uint) field {
		if used+width > 64 {
			words++
			used = 0
			free = append(free, 64)
		}
		used += width
		free[words-1] = 64 - used
		return field{words - 1, 64 - used}
	}
	fields[0] = place(uint(bits.Len(uint(maxDeg))))
	for v := range n {
		fields[v+1] = place(uint(bits.Len(uint(maxExp[v]))))
	}
	keys := make([]uint64, t*words)
	for i := range t {
		k := keys[i*words : (i+1)*words]
		d := 0
		for _, f := range b.term(i) {
			v, e := int(f>>expBits), f&(maxFastExponent-1)
			fv := fields[v+1]
			k[fv.word] |= e << fv.shift
			d += int(e)
		}
		k[fields[0].word] |= uint64(d) << fields[0].shift
	}
	order := make([]sortPair, t)
	for i := range order {
		order[i].idx = int32(i)
	}
	switch {
	case words == 1:
		for i := range order {
			order[i].key = keys[i] >> free[0]
		}
		radixSortDesc(order, 64-free[0])
	case t >= 64:
		// Stable LSD radix passes over the words, least significant first.
		// (radixSortDesc is stable from 64 items on.)
		for j := words - 1; j >= 0; j-- {
			for i := range order {
				order[i].key = keys[int(order[i].idx)*words+j] >> free[j]
			}
			radixSortDesc(order, 64-free[j])
		}
	default:
		slices.SortFunc(order, func(a, b sortPair) int {
			ka := keys[int(a.idx)*words : int(a.idx+1)*words]
			kb := keys[int(b.idx)*words : int(b.idx+1)*words]
			for j := range ka {
				if ka[j] != kb[j] {
					if ka[j] > kb[j] {
						return -1
					}
					return 1
				}
			}
			return 0
		})
	}
	// Merge runs of equal keys.
	distinct := 0
	for i := range t {
		if i == 0 || !slices.Equal(keys[int(order[i].idx)*words:int(order[i].idx+1)*words], keys[int(order[i-1].idx)*words:int(order[i-1].idx+1)*words]) {
			distinct++
		}
	}
	r := &Poly{vars: vars, exps: make([]int, distinct*n), coefs: make([]coef, 0, distinct)}
	for i := 0; i < t; {
		first := int(order[i].idx)
		c := b.coefs[first]
		j := i + 1
		for ; j < t && slices.Equal(keys[int(order[j].idx)*words:int(order[j].idx+1)*words], keys[first*words:(first+1)*words]); j++ {
			c = c.add(b.coefs[order[j].idx])
		}
		if !c.isZero() {
			e := r.exps[len(r.coefs)*n : (len(r.coefs)+1)*n]
			for _, f := range b.term(first) {
				e[f>>expBits] = int(f & (maxFastExponent - 1))
			}
			r.coefs = append(r.coefs, c)
		}
		i = j
	}
	r.exps = r.exps[:len(r.coefs)*n]
	return r
}
