package monomial

import (
	"fmt"
	"iter"
	"math/big"
	"slices"
	"sort"
)

// Exponent is an exponent vector: Exponent[i] is the power of variable i.
// Entries are >= 0.
type Exponent []int

// Degree returns the total degree of e, the sum of its entries.
func (e Exponent) Degree() int {
	d := 0
	for _, k := range e {
		d += k
	}
	return d
}

// Poly is an exact polynomial with rational coefficients in a fixed ordered
// list of named variables.
//
// A Poly is always canonical: no zero coefficients, one term per exponent,
// and terms sorted in the graded lexicographic order, descending: a term
// of higher total degree comes first, and among terms of equal total degree
// the one with the larger power of the first variable comes first (then the
// second variable, and so on). So x^2*y precedes x*y^2 precedes x precedes
// y precedes the constant term.
//
// Polys are immutable values: operations return new polynomials and never
// modify their operands, so a Poly may be shared between goroutines. Two
// polynomials taking part in one operation must have the same variable list
// (same names in the same order); otherwise the operation panics. Use Embed
// to bring polynomials to a common variable list. A Poly must be made by the
// functions of this package; the zero value of Poly is not usable.
type Poly struct {
	vars  []string // shared between polys, never modified
	exps  []int    // len(coefs)*len(vars) exponents, term after term
	coefs []coef
}

// Zero returns the zero polynomial in the given variables. The variable
// names should be distinct; the slice is copied.
func Zero(vars []string) *Poly {
	return &Poly{vars: slices.Clone(vars)}
}

// Constant returns the constant polynomial c in the given variables.
func Constant(vars []string, c *big.Rat) *Poly {
	return Monomial(vars, make(Exponent, len(vars)), c)
}

// Variable returns the polynomial vars[i]. It panics if i is out of range.
func Variable(vars []string, i int) *Poly {
	if i < 0 || i >= len(vars) {
		panic(fmt.Sprintf("monomial: Variable index %d out of range [0,%d)", i, len(vars)))
	}
	e := make(Exponent, len(vars))
	e[i] = 1
	return Monomial(vars, e, big.NewRat(1, 1))
}

// Monomial returns the polynomial c·x^e. It panics if len(e) != len(vars) or
// an entry of e is negative (a caller mistake).
func Monomial(vars []string, e Exponent, c *big.Rat) *Poly {
	p := Zero(vars)
	checkExponent(len(vars), e)
	if c.Sign() == 0 {
		return p
	}
	p.exps = slices.Clone([]int(e))
	p.coefs = []coef{coefFromRat(c)}
	return p
}

func checkExponent(n int, e Exponent) {
	if len(e) != n {
		panic(fmt.Sprintf("monomial: exponent has %d entries, want %d", len(e), n))
	}
	for _, k := range e {
		if k < 0 {
			panic(fmt.Sprintf("monomial: negative exponent %v", e))
		}
	}
}

// FromTerms returns the polynomial Σ coefs[i]·x^exps[i], summing the terms
// with equal exponents. It returns an error when the lengths disagree, an
// exponent has the wrong length, an entry is negative, or a coefficient is nil.
func FromTerms(vars []string, exps []Exponent, coefs []*big.Rat) (*Poly, error) {
	if len(exps) != len(coefs) {
		return nil, fmt.Errorf("monomial: FromTerms: %d exponents but %d coefficients", len(exps), len(coefs))
	}
	acc := newAccumulator(Zero(vars).vars)
	for i, e := range exps {
		if len(e) != len(vars) {
			return nil, fmt.Errorf("monomial: FromTerms: exponent %d has %d entries, want %d", i, len(e), len(vars))
		}
		for _, k := range e {
			if k < 0 {
				return nil, fmt.Errorf("monomial: FromTerms: exponent %d has a negative entry %v", i, e)
			}
		}
		if coefs[i] == nil {
			return nil, fmt.Errorf("monomial: FromTerms: coefficient %d is nil", i)
		}
		acc.add(e, coefFromRat(coefs[i]))
	}
	return acc.poly(), nil
}

// Vars returns a copy of the variable names, in order.
func (p *Poly) Vars() []string { return slices.Clone(p.vars) }

// NumVars returns the number of variables.
func (p *Poly) NumVars() int { return len(p.vars) }

// Len returns the number of non-zero terms.
func (p *Poly) Len() int { return len(p.coefs) }

// IsZero reports whether p is the zero polynomial.
func (p *Poly) IsZero() bool { return len(p.coefs) == 0 }

// exp returns the exponent of term i without copying; do not modify.
func (p *Poly) exp(i int) []int {
	n := len(p.vars)
	return p.exps[i*n : (i+1)*n : (i+1)*n]
}

// Term returns the i-th term in term order (0 <= i < Len). The returned
// values are copies.
func (p *Poly) Term(i int) (Exponent, *big.Rat) {
	return slices.Clone(Exponent(p.exp(i))), p.coefs[i].rat()
}

// All returns an iterator over the terms in term order. The yielded values
// are copies.
func (p *Poly) All() iter.Seq2[Exponent, *big.Rat] {
	return func(yield func(Exponent, *big.Rat) bool) {
		for i := range p.coefs {
			if !yield(p.Term(i)) {
				return
			}
		}
	}
}

// Support returns the exponents of the terms, in term order.
func (p *Poly) Support() []Exponent {
	s := make([]Exponent, len(p.coefs))
	for i := range s {
		s[i] = slices.Clone(Exponent(p.exp(i)))
	}
	return s
}

// Coefficient returns the coefficient of x^e, which is 0 when p has no such
// term. It panics if len(e) != NumVars.
func (p *Poly) Coefficient(e Exponent) *big.Rat {
	if len(e) != len(p.vars) {
		panic(fmt.Sprintf("monomial: exponent has %d entries, want %d", len(e), len(p.vars)))
	}
	if i, ok := p.find(e); ok {
		return p.coefs[i].rat()
	}
	return new(big.Rat)
}

// find returns the index of the term with exponent e.
func (p *Poly) find(e []int) (int, bool) {
	d := Exponent(e).Degree()
	i := sort.Search(len(p.coefs), func(i int) bool {
		return compareExp(p.exp(i), e, d) >= 0
	})
	if i < len(p.coefs) && slices.Equal(p.exp(i), e) {
		return i, true
	}
	return i, false
}

// compareExp compares a with b (whose total degree is db) in term order: it
// returns -1 if a comes before b, 0 if equal, +1 if a comes after b.
func compareExp(a, b []int, db int) int {
	da := Exponent(a).Degree()
	if da != db {
		if da > db {
			return -1
		}
		return 1
	}
	for i := range a {
		if a[i] != b[i] {
			if a[i] > b[i] {
				return -1
			}
			return 1
		}
	}
	return 0
}

// cmpTerms compares two exponent vectors in term order.
func cmpTerms(a, b []int) int { return compareExp(a, b, Exponent(b).Degree()) }

// IsConstant reports whether p has no term of positive degree.
func (p *Poly) IsConstant() bool {
	return len(p.coefs) == 0 || (len(p.coefs) == 1 && Exponent(p.exp(0)).Degree() == 0)
}

// ConstantTerm returns the coefficient of the constant term (the value at 0).
func (p *Poly) ConstantTerm() *big.Rat { return p.constCoef().rat() }

func (p *Poly) constCoef() coef {
	if n := len(p.coefs); n > 0 && Exponent(p.exp(n-1)).Degree() == 0 {
		return p.coefs[n-1]
	}
	return coefZero
}

// Equal reports whether p and q have the same variables (names and order)
// and the same terms.
func (p *Poly) Equal(q *Poly) bool {
	if !slices.Equal(p.vars, q.vars) || len(p.coefs) != len(q.coefs) || !slices.Equal(p.exps, q.exps) {
		return false
	}
	for i := range p.coefs {
		if !p.coefs[i].equal(q.coefs[i]) {
			return false
		}
	}
	return true
}

// Degree returns the total degree of p, or -1 for the zero polynomial.
func (p *Poly) Degree() int {
	if len(p.coefs) == 0 {
		return -1
	}
	return Exponent(p.exp(0)).Degree() // the first term has the largest degree
}

// MinDegree returns the smallest total degree of a term (the order of
// vanishing at 0), or -1 for the zero polynomial.
func (p *Poly) MinDegree() int {
	if len(p.coefs) == 0 {
		return -1
	}
	return Exponent(p.exp(len(p.coefs) - 1)).Degree()
}

// WeightedDegree returns the maximum over the terms of w·e, or nil for the
// zero polynomial. It panics if len(w) != NumVars.
func (p *Poly) WeightedDegree(w []*big.Rat) *big.Rat {
	if len(w) != len(p.vars) {
		panic(fmt.Sprintf("monomial: weight has %d entries, want %d", len(w), len(p.vars)))
	}
	var best *big.Rat
	s, t := new(big.Rat), new(big.Rat)
	for i := range p.coefs {
		s.SetInt64(0)
		for j, k := range p.exp(i) {
			if k != 0 {
				t.SetInt64(int64(k))
				s.Add(s, t.Mul(t, w[j]))
			}
		}
		if best == nil || s.Cmp(best) > 0 {
			best = new(big.Rat).Set(s)
		}
	}
	return best
}

// Filter returns the part of p made of the terms whose exponent is kept
// (for example the face polynomial of a face of the Newton polyhedron). keep
// receives each exponent in term order; it must neither modify nor retain
// it, which lets Filter run without copying (it is called once per face on
// large polynomials).
func (p *Poly) Filter(keep func(Exponent) bool) *Poly {
	r := &Poly{vars: p.vars}
	for i := range p.coefs {
		e := p.exp(i)
		if keep(Exponent(e[:len(e):len(e)])) {
			r.exps = append(r.exps, e...)
			r.coefs = append(r.coefs, p.coefs[i])
		}
	}
	return r
}

// Truncate returns p without its terms of total degree > d.
func (p *Poly) Truncate(d int) *Poly {
	// Terms are sorted by descending degree: drop a prefix.
	i := sort.Search(len(p.coefs), func(i int) bool { return Exponent(p.exp(i)).Degree() <= d })
	n := len(p.vars)
	return &Poly{vars: p.vars, exps: p.exps[i*n:], coefs: p.coefs[i:]}
}

// Embed re-expresses p in the variable list vars, which must contain every
// variable of p (in any order) and may contain more. It returns an error
// naming a variable of p missing from vars, or a name repeated in vars.
func (p *Poly) Embed(vars []string) (*Poly, error) {
	pos := make(map[string]int, len(vars))
	for i, v := range vars {
		if _, dup := pos[v]; dup {
			return nil, fmt.Errorf("monomial: Embed: variable %q appears twice in the target list", v)
		}
		pos[v] = i
	}
	where := make([]int, len(p.vars))
	for i, v := range p.vars {
		j, ok := pos[v]
		if !ok {
			return nil, fmt.Errorf("monomial: Embed: variable %q is missing from the target list %v", v, vars)
		}
		where[i] = j
	}
	acc := newAccumulator(slices.Clone(vars))
	e := make([]int, len(vars))
	for i := range p.coefs {
		for j, k := range p.exp(i) {
			e[where[j]] = k
		}
		acc.add(e, p.coefs[i])
	}
	return acc.poly(), nil
}

// sameVars panics unless p and q have the same variable list.
func sameVars(p, q *Poly) {
	if len(p.vars) == len(q.vars) && (len(p.vars) == 0 || &p.vars[0] == &q.vars[0]) {
		return
	}
	if !slices.Equal(p.vars, q.vars) {
		panic(fmt.Sprintf("monomial: operands have different variables %v and %v", p.vars, q.vars))
	}
}

// accumulator collects terms with arbitrary exponents, summing duplicates,
// and produces a canonical polynomial.
type accumulator struct {
	vars  []string
	index map[string]int
	exps  []int
	coefs []coef
	key   []byte
}

func newAccumulator(vars []string) *accumulator {
	return &accumulator{vars: vars, index: make(map[string]int)}
}

func (a *accumulator) add(e []int, c coef) {
	if c.isZero() {
		return
	}
	a.key = a.key[:0]
	for _, k := range e {
		a.key = appendUvarint(a.key, uint64(k))
	}
	if i, ok := a.index[string(a.key)]; ok {
		a.coefs[i] = a.coefs[i].add(c)
		return
	}
	a.index[string(a.key)] = len(a.coefs)
	a.exps = append(a.exps, e...)
	a.coefs = append(a.coefs, c)
}

func (a *accumulator) len() int { return len(a.index) }

func appendUvarint(b []byte, x uint64) []byte {
	for x >= 0x80 {
		b = append(b, byte(x)|0x80)
		x >>= 7
	}
	return append(b, byte(x))
}

// poly returns the canonical polynomial of the collected terms.
func (a *accumulator) poly() *Poly {
	return canonical(a.vars, a.exps, a.coefs)
}

// canonical sorts the terms (whose exponents are distinct) into term order
// and drops zero coefficients.
func canonical(vars []string, exps []int, coefs []coef) *Poly {
	n := len(vars)
	type item struct {
		deg int
		i   int
	}
	items := make([]item, 0, len(coefs))
	for i, c := range coefs {
		if !c.isZero() {
			items = append(items, item{Exponent(exps[i*n : (i+1)*n]).Degree(), i})
		}
	}
	slices.SortFunc(items, func(x, y item) int {
		if x.deg != y.deg {
			return y.deg - x.deg
		}
		a, b := exps[x.i*n:(x.i+1)*n], exps[y.i*n:(y.i+1)*n]
		for k := range a {
			if a[k] != b[k] {
				if a[k] > b[k] {
					return -1
				}
				return 1
			}
		}
		return 0
	})
	p := &Poly{vars: vars, exps: make([]int, 0, len(items)*n), coefs: make([]coef, len(items))}
	for j, it := range items {
		p.exps = append(p.exps, exps[it.i*n:(it.i+1)*n]...)
		p.coefs[j] = coefs[it.i]
	}
	return p
}

// constPoly returns the constant c in the (shared) variable list vars.
func constPoly(vars []string, c coef) *Poly {
	if c.isZero() {
		return &Poly{vars: vars}
	}
	return &Poly{vars: vars, exps: make([]int, len(vars)), coefs: []coef{c}}
}
