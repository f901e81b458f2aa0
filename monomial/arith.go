package monomial

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"slices"
	"sort"
	"sync"
)

// Add returns p + q.
func (p *Poly) Add(q *Poly) *Poly {
	sameVars(p, q)
	return merge(p, q, false)
}

// Sub returns p - q.
func (p *Poly) Sub(q *Poly) *Poly {
	sameVars(p, q)
	return merge(p, q, true)
}

// merge adds (or subtracts) two sorted term lists in one pass.
func merge(p, q *Poly, negate bool) *Poly {
	r := &Poly{vars: p.vars, exps: make([]int, 0, len(p.exps)+len(q.exps)), coefs: make([]coef, 0, len(p.coefs)+len(q.coefs))}
	i, j := 0, 0
	for i < len(p.coefs) || j < len(q.coefs) {
		var c int
		switch {
		case i == len(p.coefs):
			c = 1
		case j == len(q.coefs):
			c = -1
		default:
			c = cmpTerms(p.exp(i), q.exp(j))
		}
		switch {
		case c < 0:
			r.exps = append(r.exps, p.exp(i)...)
			r.coefs = append(r.coefs, p.coefs[i])
			i++
		case c > 0:
			qc := q.coefs[j]
			if negate {
				qc = qc.neg()
			}
			r.exps = append(r.exps, q.exp(j)...)
			r.coefs = append(r.coefs, qc)
			j++
		default:
			var s coef
			if negate {
				s = p.coefs[i].sub(q.coefs[j])
			} else {
				s = p.coefs[i].add(q.coefs[j])
			}
			if !s.isZero() {
				r.exps = append(r.exps, p.exp(i)...)
				r.coefs = append(r.coefs, s)
			}
			i++
			j++
		}
	}
	return r
}

// Neg returns -p.
func (p *Poly) Neg() *Poly {
	r := &Poly{vars: p.vars, exps: p.exps, coefs: make([]coef, len(p.coefs))}
	for i, c := range p.coefs {
		r.coefs[i] = c.neg()
	}
	return r
}

// Scale returns c·p.
func (p *Poly) Scale(c *big.Rat) *Poly {
	return p.scale(coefFromRat(c))
}

func (p *Poly) scale(c coef) *Poly {
	if c.isZero() {
		return &Poly{vars: p.vars}
	}
	r := &Poly{vars: p.vars, exps: p.exps, coefs: make([]coef, len(p.coefs))}
	for i, d := range p.coefs {
		r.coefs[i] = d.mul(c)
	}
	return r
}

// Mul returns p·q. Exponents of the product must stay below 2^62; Mul
// panics otherwise (a caller mistake; the parser reports it as an error).
func (p *Poly) Mul(q *Poly) *Poly {
	sameVars(p, q)
	r, err := mul(p, q, -1, nil)
	if err != nil {
		panic(err) // exponent overflow: no other limits were given
	}
	return r
}

// Errors of a guarded computation.
var (
	errTooManyTerms = errors.New("monomial: too many terms")
	errTooMuchWork  = errors.New("monomial: too much work")
	// errExponentOverflow reports an exponent of 2^62 or more.
	errExponentOverflow = errors.New("monomial: exponent overflow (2^62 or more)")
)

// guard carries the limits of a computation through its steps: the term
// limit of every intermediate result, and a budget of work units that the
// steps draw from. A nil *guard means no limits.
type guard struct {
	maxTerms int
	work     float64 // units left
}

func newGuard(lim Limits) *guard {
	return &guard{maxTerms: lim.MaxTerms, work: float64(lim.MaxWork)}
}

// charge takes units from the budget, or reports that they exceed it.
func (g *guard) charge(units float64) error {
	if g == nil {
		return nil
	}
	if units > g.work {
		return errTooMuchWork
	}
	g.work -= units
	return nil
}

func (g *guard) tooMany(n int) bool { return g != nil && g.maxTerms > 0 && n > g.maxTerms }

// pairCost is the work of one term-by-term product of coefficients of the
// given sizes in bits: one unit per 64-bit word, at least one.
func pairCost(bitsP, bitsQ int) float64 { return 1 + float64(bitsP+bitsQ)/64 }

func maxBitLen(p *Poly) int {
	m := 0
	for _, c := range p.coefs {
		m = max(m, c.bitLen())
	}
	return m
}

// mul returns p·q without the terms of total degree > maxDeg (when maxDeg >=
// 0). With a guard it charges the work before starting (errTooMuchWork) and
// fails with errTooManyTerms as soon as more than g.maxTerms distinct
// exponents appear.
//
// The fast path packs each exponent vector into one uint64 with a bit field
// per variable wide enough for the largest exponent of the product, with the
// first variable in the most significant bits. Then the key of a product of
// two terms is the sum of their keys, and comparing keys compares exponents
// lexicographically. Products are accumulated in an open-addressing hash
// table from key to term, and the terms are sorted once at the end.
func mul(p, q *Poly, maxDeg int, g *guard) (*Poly, error) {
	n := len(p.vars)
	if len(p.coefs) == 0 || len(q.coefs) == 0 {
		return &Poly{vars: p.vars}, nil
	}
	if len(q.coefs) > len(p.coefs) {
		p, q = q, p // outer loop over the longer polynomial
	}
	degP, degQ := termDegrees(p), termDegrees(q)
	if g != nil {
		if err := g.charge(float64(countPairs(degP, degQ, maxDeg)) * pairCost(maxBitLen(p), maxBitLen(q))); err != nil {
			return nil, err
		}
	}
	maxP, maxQ := maxExponents(p), maxExponents(q)
	width := make([]uint, n)
	total := uint(0)
	for i := range n {
		s := maxP[i] + maxQ[i]
		if s < maxP[i] || s >= 1<<62 {
			return nil, errExponentOverflow
		}
		width[i] = uint(bits.Len(uint(s)))
		total += width[i]
	}
	if total > 64 {
		return mulGeneric(p, q, degP, degQ, maxDeg, g)
	}
	shift := make([]uint, n)
	s := total
	for i := range n {
		s -= width[i]
		shift[i] = s
	}
	pack := func(e []int) uint64 {
		var k uint64
		for i, x := range e {
			k |= uint64(x) << shift[i]
		}
		return k
	}
	keyP := make([]uint64, len(p.coefs))
	for i := range keyP {
		keyP[i] = pack(p.exp(i))
	}
	keyQ := make([]uint64, len(q.coefs))
	for j := range keyQ {
		keyQ[j] = pack(q.exp(j))
	}

	t := getTable(min(len(p.coefs)*len(q.coefs), 4*len(p.coefs)+len(q.coefs)))
	defer putTable(t)
	for i, kp := range keyP {
		cp := p.coefs[i]
		j0 := 0
		if maxDeg >= 0 {
			// q is sorted by descending degree: skip its terms of too high degree.
			lim := maxDeg - degP[i]
			if lim < 0 {
				continue
			}
			for j0 < len(degQ) && degQ[j0] > lim {
				j0++
			}
		}
		for j := j0; j < len(keyQ); j++ {
			slot := t.slot(kp + keyQ[j])
			t.coefs[slot] = t.coefs[slot].addMul(cp, q.coefs[j])
		}
		if g.tooMany(len(t.keys)) {
			return nil, errTooManyTerms
		}
	}
	// Sort the live terms by (degree desc, key desc), which is term order.
	// The degree goes above the key bits so that one uint64 orders them;
	// then a radix sort does the work in a few linear passes.
	live := make([]sortPair, 0, len(t.keys))
	maxTermDeg := 0
	for i, k := range t.keys {
		if !t.coefs[i].isZero() {
			d := 0
			for v := range n {
				d += int((k >> shift[v]) & (1<<width[v] - 1))
			}
			maxTermDeg = max(maxTermDeg, d)
			live = append(live, sortPair{key: uint64(d), idx: int32(i)})
		}
	}
	r := &Poly{vars: p.vars, exps: make([]int, len(live)*n), coefs: make([]coef, len(live))}
	degBits := uint(bits.Len(uint(maxTermDeg)))
	if total+degBits <= 64 {
		for i := range live {
			live[i].key = live[i].key<<total | t.keys[live[i].idx]
		}
		radixSortDesc(live, total+degBits)
	} else {
		slices.SortFunc(live, func(a, b sortPair) int {
			if a.key != b.key {
				return int(b.key) - int(a.key) // degrees, small
			}
			ka, kb := t.keys[a.idx], t.keys[b.idx]
			switch {
			case ka > kb:
				return -1
			case ka < kb:
				return 1
			}
			return 0
		})
	}
	for j, it := range live {
		k := t.keys[it.idx]
		e := r.exps[j*n : (j+1)*n]
		for v := range n {
			e[v] = int((k >> shift[v]) & (1<<width[v] - 1))
		}
		r.coefs[j] = t.coefs[it.idx]
	}
	return r, nil
}

// sortPair is a sort key with the index of the item it stands for.
type sortPair struct {
	key uint64
	idx int32
}

// radixSortDesc sorts a by key, descending, looking only at the low nbits
// bits of the keys (the others must be zero): an LSD radix sort with 8-bit
// digits.
func radixSortDesc(a []sortPair, nbits uint) {
	if len(a) < 64 {
		slices.SortFunc(a, func(x, y sortPair) int {
			switch {
			case x.key > y.key:
				return -1
			case x.key < y.key:
				return 1
			}
			return 0
		})
		return
	}
	buf := make([]sortPair, len(a))
	src, dst := a, buf
	for shift := uint(0); shift < nbits; shift += 8 {
		var count [257]int
		for _, x := range src {
			count[255-(x.key>>shift)&0xff+1]++
		}
		for i := 1; i < 257; i++ {
			count[i] += count[i-1]
		}
		for _, x := range src {
			d := 255 - (x.key>>shift)&0xff
			dst[count[d]] = x
			count[d]++
		}
		src, dst = dst, src
	}
	if &src[0] != &a[0] {
		copy(a, src)
	}
}

// mulGeneric is mul for exponents too wide to pack into 64 bits.
func mulGeneric(p, q *Poly, degP, degQ []int, maxDeg int, g *guard) (*Poly, error) {
	n := len(p.vars)
	acc := newAccumulator(p.vars)
	e := make([]int, n)
	for i := range p.coefs {
		if maxDeg >= 0 && degP[i] > maxDeg {
			continue
		}
		ep := p.exp(i)
		for j := range q.coefs {
			if maxDeg >= 0 && degP[i]+degQ[j] > maxDeg {
				continue
			}
			for v, k := range q.exp(j) {
				e[v] = ep[v] + k
			}
			acc.add(e, p.coefs[i].mul(q.coefs[j]))
		}
		if g.tooMany(acc.len()) {
			return nil, errTooManyTerms
		}
	}
	return acc.poly(), nil
}

// countPairs returns the number of term pairs whose degrees sum to at most
// maxDeg (all pairs when maxDeg < 0); degQ is sorted descending.
func countPairs(degP, degQ []int, maxDeg int) int {
	if maxDeg < 0 {
		return len(degP) * len(degQ)
	}
	n := 0
	for _, d := range degP {
		// The terms of q with degree <= maxDeg - d form a suffix.
		lim := maxDeg - d
		n += len(degQ) - sort.Search(len(degQ), func(j int) bool { return degQ[j] <= lim })
	}
	return n
}

func termDegrees(p *Poly) []int {
	d := make([]int, len(p.coefs))
	for i := range d {
		d[i] = Exponent(p.exp(i)).Degree()
	}
	return d
}

func maxExponents(p *Poly) []int {
	m := make([]int, len(p.vars))
	for i := range p.coefs {
		for v, k := range p.exp(i) {
			m[v] = max(m[v], k)
		}
	}
	return m
}

// hashTable maps packed exponent keys to accumulated coefficients, with
// open addressing and linear probing. Each slot holds the key next to the
// entry index, so a probe touches one cache line.
type hashTable struct {
	slots []hashSlot
	mask  uint64
	shift uint
	keys  []uint64
	coefs []coef
}

type hashSlot struct {
	key uint64
	idx int32 // index+1 into keys/coefs, 0 for empty
}

// tablePool recycles hash tables between products: allocating and
// clearing fresh large tables costs more than the multiplication itself.
var tablePool = sync.Pool{New: func() any { return new(hashTable) }}

// getTable returns an empty table sized for about hint entries.
func getTable(hint int) *hashTable {
	t := tablePool.Get().(*hashTable)
	size := 16
	for size < 2*hint {
		size <<= 1
	}
	if cap(t.keys) < hint {
		t.keys = make([]uint64, 0, hint)
		t.coefs = make([]coef, 0, hint)
	}
	t.resize(size)
	return t
}

// putTable empties t (dropping its references to big.Rats) and recycles it.
func putTable(t *hashTable) {
	clear(t.coefs)
	t.keys, t.coefs = t.keys[:0], t.coefs[:0]
	tablePool.Put(t)
}

func (t *hashTable) resize(size int) {
	if cap(t.slots) >= size {
		t.slots = t.slots[:size] // a recycled table: reuse its memory
		clear(t.slots)
	} else {
		t.slots = make([]hashSlot, size)
	}
	t.mask = uint64(size - 1)
	t.shift = uint(64 - bits.Len(uint(size-1)))
	for i, k := range t.keys {
		h := (k * 0x9E3779B97F4A7C15) >> t.shift
		for t.slots[h].idx != 0 {
			h = (h + 1) & t.mask
		}
		t.slots[h] = hashSlot{k, int32(i + 1)}
	}
}

// slot returns the index of key's entry, creating a zero entry if needed.
func (t *hashTable) slot(key uint64) int {
	h := (key * 0x9E3779B97F4A7C15) >> t.shift
	for {
		s := &t.slots[h]
		if s.idx == 0 {
			break
		}
		if s.key == key {
			return int(s.idx - 1)
		}
		h = (h + 1) & t.mask
	}
	if 2*(len(t.keys)+1) > len(t.slots) {
		t.resize(2 * len(t.slots))
		return t.slot(key)
	}
	t.keys = append(t.keys, key)
	t.coefs = append(t.coefs, coefZero)
	t.slots[h] = hashSlot{key, int32(len(t.keys))}
	return len(t.keys) - 1
}

// Limits guard against runaway expansion. A zero field means its default.
type Limits struct {
	// MaxTerms bounds the number of terms of a result (and of intermediate
	// results while parsing). Default 2,000,000.
	MaxTerms int
	// MaxExponent bounds the exponent n of a power p^n of a polynomial with
	// two or more terms, checked before any work (and, for a rational
	// exponent p/q in an expression, both |p| and q). Powers of a single
	// term are cheap and only limited by MaxBits and by exponent overflow
	// (exponents must stay below 2^62). Default 10,000.
	MaxExponent int
	// MaxOrder bounds Config.Order, the total degree of truncated series.
	// Default 1,000.
	MaxOrder int
	// MaxBits bounds the estimated size in bits (numerator plus denominator)
	// of a coefficient of a power, checked before expanding. Default
	// 1,000,000 (about 300,000 decimal digits).
	MaxBits int
	// MaxVars bounds the number of variables of a parsed text (exponent
	// vectors are stored densely, so memory grows with terms × variables).
	// Default 1,000.
	MaxVars int
	// MaxWork bounds the work of one Pow or one Parse/ParseList call, in
	// term-by-term coefficient products weighted by coefficient size (one
	// unit per 64-bit word). Powers are estimated and refused before any
	// work; other steps are charged before they start. Default 500,000,000
	// (minutes of work at most).
	MaxWork int
}

// Default limits, used for the zero fields of a Limits.
const (
	DefaultMaxTerms    = 2_000_000
	DefaultMaxExponent = 10_000
	DefaultMaxOrder    = 1_000
	DefaultMaxBits     = 1_000_000
	DefaultMaxVars     = 1_000
	DefaultMaxWork     = 500_000_000
)

func (l Limits) withDefaults() Limits {
	if l.MaxTerms <= 0 {
		l.MaxTerms = DefaultMaxTerms
	}
	if l.MaxExponent <= 0 {
		l.MaxExponent = DefaultMaxExponent
	}
	if l.MaxOrder <= 0 {
		l.MaxOrder = DefaultMaxOrder
	}
	if l.MaxBits <= 0 {
		l.MaxBits = DefaultMaxBits
	}
	if l.MaxVars <= 0 {
		l.MaxVars = DefaultMaxVars
	}
	if l.MaxWork <= 0 {
		l.MaxWork = DefaultMaxWork
	}
	return l
}

// LimitError reports that a computation was refused because its result
// would exceed a field of Limits.
type LimitError struct {
	Limit string  // name of the Limits field, e.g. "MaxTerms"
	Value float64 // the estimated or requested size
	Max   int     // the limit in force
	What  string  // what was being computed
}

// Error describes the refused computation and the limit in force, naming
// the field of Limits.
func (e *LimitError) Error() string {
	return "monomial: " + e.describe(e.What) + " (Limits." + e.Limit + ")"
}

// describe says that what was refused and why, without naming the limit's
// field.
func (e *LimitError) describe(what string) string {
	switch e.Limit {
	case "MaxExponent":
		return fmt.Sprintf("%s: exponent %.0f exceeds the limit %d", what, e.Value, e.Max)
	case "MaxTerms":
		return fmt.Sprintf("%s would have up to %.3g terms, more than the limit %d", what, e.Value, e.Max)
	case "MaxBits":
		return fmt.Sprintf("%s would have coefficients of about %.3g bits, more than the limit %d", what, e.Value, e.Max)
	case "MaxWork":
		return fmt.Sprintf("%s would take about %.3g units of work, more than the limit %d", what, e.Value, e.Max)
	case "MaxOrder":
		return fmt.Sprintf("%s: order %.0f exceeds the limit %d", what, e.Value, e.Max)
	}
	return fmt.Sprintf("%s exceeds the limit %d", what, e.Max)
}

// Pow returns p^n for n >= 0 (p^0 = 1, also for p = 0). Before expanding it
// estimates the result and returns a *LimitError, without doing the work,
// when n exceeds lim.MaxExponent (for p with two or more terms), when an upper bound on the number of terms
// exceeds lim.MaxTerms, when the estimated coefficient size exceeds
// lim.MaxBits, or when the estimated work exceeds lim.MaxWork. The term
// bound is the least of the number of multisets of n terms of p, the number
// of exponents in the box n·[min_i, max_i], and the number of monomials of
// total degree at most n·Degree(p). Being upper bounds, these estimates can
// refuse a power whose terms would largely cancel. Pow also returns an
// error when an exponent of the result would reach 2^62.
func (p *Poly) Pow(n int, lim Limits) (*Poly, error) {
	lim = lim.withDefaults()
	if n < 0 {
		return nil, fmt.Errorf("monomial: Pow: negative exponent %d", n)
	}
	if n > lim.MaxExponent && p.Len() > 1 {
		return nil, &LimitError{Limit: "MaxExponent", Value: float64(n), Max: lim.MaxExponent, What: "power"}
	}
	if est := p.powTermBound(n); est > float64(lim.MaxTerms) {
		return nil, &LimitError{Limit: "MaxTerms", Value: est, Max: lim.MaxTerms, What: fmt.Sprintf("power ^%d of a %d-term polynomial", n, p.Len())}
	}
	if est := p.powBitsBound(n); est > float64(lim.MaxBits) {
		return nil, &LimitError{Limit: "MaxBits", Value: est, Max: lim.MaxBits, What: fmt.Sprintf("power ^%d", n)}
	}
	if est := p.powWork(n); est > float64(lim.MaxWork) {
		return nil, &LimitError{Limit: "MaxWork", Value: est, Max: lim.MaxWork, What: fmt.Sprintf("power ^%d of a %d-term polynomial", n, p.Len())}
	}
	if n > 0 && len(p.coefs) > 0 {
		if md := slices.Max(maxExponents(p)); md > 0 && n >= (1<<62)/md {
			return nil, errExponentOverflow
		}
	}
	return p.pow(n, -1, newGuard(lim))
}

// binomialPow returns (a·x^e + b·x^f)^n = Σ_k C(n,k)·a^k·b^(n−k)·x^(k·e + (n−k)·f)
// (the binomial theorem, common practice), truncated to total degree maxDeg
// when maxDeg >= 0: n+1 terms whose coefficients follow one another by
// C(n,k+1) = C(n,k)·(n−k)/(k+1), instead of the n−1 products of a growing
// polynomial that repeated multiplication needs. p must have two terms and
// n·e, n·f must not overflow (Pow checks it).
func (p *Poly) binomialPow(n, maxDeg int) *Poly {
	e, f := p.exp(0), p.exp(1)
	a, b := p.coefs[0].rat(), p.coefs[1].rat()
	acc := newAccumulator(p.vars)
	exp := make(Exponent, len(e))
	binom := big.NewInt(1) // C(n, k)
	ak := big.NewRat(1, 1) // a^k
	bPow := make([]*big.Rat, n+1)
	bPow[0] = big.NewRat(1, 1)
	for k := 1; k <= n; k++ {
		bPow[k] = new(big.Rat).Mul(bPow[k-1], b)
	}
	c := new(big.Rat)
	for k := 0; k <= n; k++ {
		if k > 0 {
			binom.Mul(binom, big.NewInt(int64(n-k+1)))
			binom.Quo(binom, big.NewInt(int64(k)))
			ak.Mul(ak, a)
		}
		deg := 0
		for i := range exp {
			exp[i] = k*e[i] + (n-k)*f[i]
			deg += exp[i]
		}
		if maxDeg >= 0 && deg > maxDeg {
			continue
		}
		c.SetInt(binom)
		c.Mul(c, ak)
		c.Mul(c, bPow[n-k])
		acc.add(exp, coefFromRat(c))
	}
	return acc.poly()
}

// pow computes p^n, truncated to total degree maxDeg when maxDeg >= 0.
func (p *Poly) pow(n, maxDeg int, g *guard) (*Poly, error) {
	if n == 0 {
		return constPoly(p.vars, coefOne), nil
	}
	if len(p.coefs) == 0 {
		return &Poly{vars: p.vars}, nil
	}
	if len(p.coefs) == 1 {
		e := slices.Clone(p.exp(0))
		d := 0
		for i := range e {
			if e[i] > 0 && n >= (1<<62)/e[i] {
				if maxDeg >= 0 {
					return &Poly{vars: p.vars}, nil // far above the order
				}
				return nil, errExponentOverflow
			}
			e[i] *= n
			d += e[i]
		}
		if maxDeg >= 0 && d > maxDeg {
			return &Poly{vars: p.vars}, nil
		}
		return &Poly{vars: p.vars, exps: e, coefs: []coef{p.coefs[0].powInt(n)}}, nil
	}
	if maxDeg >= 0 {
		p = p.Truncate(maxDeg)
		if m := p.MinDegree(); m > 0 && n > maxDeg/m {
			return &Poly{vars: p.vars}, nil
		}
	}
	if len(p.coefs) == 2 {
		return p.binomialPow(n, maxDeg), nil
	}
	// Repeated multiplication by p: for sparse p the intermediate powers are
	// much smaller than the squares that binary powering would form.
	r := p
	for k := 2; k <= n; k++ {
		var err error
		if r, err = mul(r, p, maxDeg, g); err != nil {
			return nil, err
		}
	}
	return r, nil
}

// powTermBound returns an upper bound on the number of terms of p^n.
func (p *Poly) powTermBound(n int) float64 { return newPowBound(p).terms(n) }

// powBound holds what the term bound of p^k needs, for any k.
type powBound struct {
	t, deg int
	ranges []int // max - min exponent of each variable that varies
}

func newPowBound(p *Poly) powBound {
	b := powBound{t: len(p.coefs), deg: p.Degree()}
	if b.t <= 1 {
		return b
	}
	lo := slices.Clone(p.exp(0))
	hi := slices.Clone(p.exp(0))
	for i := range p.coefs {
		for v, k := range p.exp(i) {
			lo[v] = min(lo[v], k)
			hi[v] = max(hi[v], k)
		}
	}
	for v := range hi {
		if hi[v] > lo[v] {
			b.ranges = append(b.ranges, hi[v]-lo[v])
		}
	}
	return b
}

// terms bounds the number of terms of p^k by the least of the number of
// multisets of k terms of p, the number of exponents in the box
// k·[min_v, max_v], and the number of monomials of degree <= k·Degree(p)
// in the variables that vary.
func (b powBound) terms(k int) float64 {
	if b.t <= 1 || k <= 1 {
		return float64(b.t)
	}
	multisets := binomialF(float64(k+b.t-1), float64(b.t-1))
	box := 1.0
	for _, r := range b.ranges {
		box *= float64(k)*float64(r) + 1
	}
	a := float64(len(b.ranges))
	monomials := binomialF(float64(k)*float64(b.deg)+a, a)
	return math.Min(multisets, math.Min(box, monomials))
}

// powWork estimates the work of computing p^n by repeated multiplication:
// Σ_{k<n} terms(p^k)·Len(p) products of coefficients of growing size.
func (p *Poly) powWork(n int) float64 {
	if len(p.coefs) <= 1 || n <= 1 {
		return 0
	}
	b := newPowBound(p)
	bitsP := maxBitLen(p)
	per := p.powBitsBound(1)
	w := 0.0
	for k := 1; k < n; k++ {
		w += b.terms(k) * float64(len(p.coefs)) * pairCost(int(per*float64(k)), bitsP)
		if math.IsInf(w, 1) {
			break
		}
	}
	return w
}

// powBitsBound bounds the size in bits of the coefficients of p^n. With
// D the product of the denominators, p = (1/D)·Σ a_i x^(e_i) with integers
// |a_i| <= |num_i|·D, so the coefficients of p^n are integers at most
// (Σ|a_i|)^n over D^n: about n·(log2 t + max log2|num_i| + 2·log2 D) bits.
func (p *Poly) powBitsBound(n int) float64 {
	if len(p.coefs) == 0 {
		return 0
	}
	maxNum, logD := 0.0, 0.0
	for _, c := range p.coefs {
		num, den := c.log2Parts()
		maxNum = math.Max(maxNum, num)
		logD += den
	}
	return float64(n) * (math.Log2(float64(len(p.coefs))) + maxNum + 2*logD)
}

// binomialF returns C(n, k) in floating point (+Inf if huge).
func binomialF(n, k float64) float64 {
	if k < 0 || k > n {
		return 0
	}
	a, _ := math.Lgamma(n + 1)
	b, _ := math.Lgamma(k + 1)
	c, _ := math.Lgamma(n - k + 1)
	v := math.Exp(a - b - c)
	if v < 1e15 {
		v = math.Round(v) // remove the rounding error of Lgamma on exact counts
	}
	return v
}
