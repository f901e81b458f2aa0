package monomial

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"slices"
)

// Config controls Parse and ParseList.
type Config struct {
	// Vars lists variables that come first in the variable list of the
	// result, in this order. It may include variables absent from the text.
	// The remaining identifiers of the text follow in the order of their
	// first appearance, so "y^2 + x^4" has the variables y, x: the order
	// the writer chose.
	Vars []string
	// Order, if > 0, asks for an expansion around 0 (or around At) that is
	// exact up to total degree Order: the parts of the expression that are
	// series are truncated above Order, the exact polynomial parts are kept
	// whole (see Expansion). If 0, the expression must be a polynomial, and
	// anything else (a function, a division by a non-constant, a negative
	// or fractional power) is an error asking for an order.
	Order int
	// At, if not empty, is the expansion point: it maps variable names to
	// exact values (absent names are 0). Every variable x of the text with
	// a value a is read as a + x before anything is evaluated, so each
	// function is expanded around the value of its argument at the point,
	// and the result (with its Remainder) is a polynomial in the offsets
	// from the point, under the same variable names. For a polynomial this
	// gives Poly.Translate of the polynomial at the point. A function
	// whose Taylor coefficients at the point are irrational is refused
	// (exp, sin, cos, sinh, cosh, tanh, atan need an argument that
	// vanishes at the point, log one that equals 1 there; see the package
	// documentation). Every name must be a variable of the text or of
	// Vars, and every value non-nil; otherwise Parse returns an error that
	// is not an *Error. The map is only read.
	At map[string]*big.Rat
	// Floor, in series mode (Order > 0) only, lets the expansion omit the
	// terms whose exponent strictly dominates a floor point (is >= it in
	// every variable and differs from it): each is a list of exponents in
	// the order of the variables of the result (Vars, then the other
	// identifiers of the text), and every point must have one exponent per
	// variable, or Parse returns an error that is not an *Error. Wherever
	// the expansion truncates a series at Order (products, powers, functions
	// and their intermediate steps), it also drops such terms, and every
	// dropped term is then covered by the Remainder (see "Truncation by a
	// floor" in the package documentation). So a term of Poly of degree <=
	// Order that strictly dominates no floor point is still a Taylor
	// coefficient, and exact values are never cut: an expression whose value
	// is exact stays exact, and Truncated is true when terms were dropped.
	// The slices are only read. With Order = 0 Floor is ignored.
	Floor [][]int
	// Limits guard against runaway expansion; zero fields take defaults.
	Limits Limits
}

// Expansion is the result of parsing one expression.
//
// With Order = 0, Poly is the value of the expression. With Order = D > 0
// the value of the expression (its Taylor series at Config.At, or at 0)
// minus Poly is a power series all of whose terms have total degree > D
// and are multiples of a monomial of Remainder, and Truncated is true
// exactly when Remainder is not empty. So Poly always has the Taylor
// coefficients of the value for every degree <= D; it also keeps, above D,
// every term of the exact polynomial parts of the expression (x^2 + y^10
// with Order 8 gives both terms and Truncated = false). When Truncated is
// true, a term of Poly above D need not be the Taylor coefficient of the
// value, but only at a multiple of a monomial of Remainder: in tanh(x) +
// x^11 with Order 4, Poly = x - 1/3*x^3 + x^11 with Remainder {x^5}, and the
// x^11 coefficient of the value also has a contribution from tanh(x).
//
// With Config.Floor, terms that strictly dominate a floor point may also
// be missing at degrees <= Order, and Remainder covers them: its elements
// then have degree > Order or strictly dominate a floor point, and the
// terms of Poly of degree <= Order that strictly dominate no floor point
// are Taylor coefficients.
type Expansion struct {
	// Poly is the expansion described above.
	Poly *Poly
	// Order is the Config.Order used.
	Order int
	// Truncated is true when terms of total degree > Order were or may have
	// been dropped: the expression involves a series (a function, a
	// division by a non-constant, a negative or fractional power of a
	// non-constant) that was truncated at Order, or, in series mode, an
	// exact part whose full expansion exceeded the Limits and was truncated
	// at Order instead, or (with Config.Floor) terms that strictly dominate
	// a floor point were dropped. False means Poly is exactly the value of
	// the expression. It equals len(Remainder) > 0.
	Truncated bool
	// Remainder certifies what Poly misses: every term of the value of
	// the expression minus Poly, as a formal power series, is a multiple
	// of x^r for some r in Remainder. It is nil when Poly is the value
	// itself. The exponents are distinct, none divides another (the set
	// is minimal), they are sorted in the term order of Poly (see Poly),
	// and each has total degree > Order (or, with Config.Floor, strictly
	// dominates a floor point), so the terms of Poly of degree <= Order
	// (that strictly dominate no floor point) are Taylor coefficients of
	// the value. The set may be larger
	// than the least one possible (see "Remainders" in the package
	// documentation for the rules), but never smaller.
	Remainder []Exponent
}

// Error is a parse error with a position in the source text. Offset is the
// byte offset; Line and Col are 1-based, and Col counts runes.
type Error struct {
	Offset, Line, Col int
	Msg               string
	// Setting names what would let the input through, when something
	// would: "Order" when the expression needs a truncation order
	// (Config.Order > 0); "At" when it has no Taylor series at the
	// expansion point because the argument of log, sqrt or a fractional
	// power, a negative power's base or a divisor vanishes there, so that
	// another point (Config.At) may lift the error; or the field of Limits
	// that was exceeded ("MaxTerms", "MaxExponent", "MaxBits", "MaxWork",
	// "MaxVars"). It is empty for errors in the text itself (irrational
	// coefficients included: they ask for a rewrite). Msg does not name the
	// setting, so that a program can say in its own terms what to change.
	Setting string
}

// Error returns "line:col: message".
func (e *Error) Error() string { return fmt.Sprintf("%d:%d: %s", e.Line, e.Col, e.Msg) }

// ErrorList is a list of parse errors, in source order, as returned by
// ParseList when several expressions fail.
type ErrorList []*Error

// Error returns the first error followed by "(and N more errors)" when
// there are more.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Unwrap returns the errors of the list, so that errors.As finds an *Error.
func (l ErrorList) Unwrap() []error {
	errs := make([]error, len(l))
	for i, e := range l {
		errs[i] = e
	}
	return errs
}

// maxDepth bounds the nesting of parentheses, unary signs, powers and
// function calls, so that deeply nested input fails instead of exhausting
// the stack.
const maxDepth = 1000

// isFunction reports whether name is reserved for a function; such names
// cannot be variables.
func isFunction(name string) bool {
	switch name {
	case "exp", "log", "sin", "cos", "tanh", "sinh", "cosh", "atan", "sqrt":
		return true
	}
	return false
}

// IsIdentifier reports whether name is a valid variable name: an ASCII
// letter or underscore followed by letters, digits and underscores, and
// not a function name.
func IsIdentifier(name string) bool {
	if name == "" || isFunction(name) {
		return false
	}
	for i, r := range name {
		if !isLetter(r) && !(i > 0 && isDigit(r)) {
			return false
		}
	}
	return true
}

// Parse reads one expression and returns its expansion as a polynomial in
// the variables cfg.Vars followed by the other identifiers of src (see
// Config). Newlines are white space. Errors are of type *Error, except for
// an invalid Config.
func Parse(src string, cfg Config) (*Expansion, error) {
	s, err := newSession(src, cfg, false)
	if err != nil {
		return nil, err
	}
	p := s.newParser()
	if p.tok().kind == tEOF {
		return nil, p.expected("expression")
	}
	e, perr := p.item()
	if perr != nil {
		return nil, perr
	}
	return e, nil
}

// ParseList reads several expressions separated by ';' or by newlines,
// sharing one variable list (cfg.Vars followed by the other identifiers of
// the whole text in the order of their first appearance). A newline separates expressions only
// outside parentheses and after a token that can end an expression (a
// number, an identifier or ')'), so an expression can continue on the next
// line after an operator or inside parentheses. Empty expressions are
// skipped. Positions in errors are relative to the whole src. When one
// expression fails the error is an *Error; when several fail it is an
// ErrorList with one error per failing expression.
func ParseList(src string, cfg Config) ([]*Expansion, error) {
	s, err := newSession(src, cfg, true)
	if err != nil {
		return nil, err
	}
	var out []*Expansion
	var errs ErrorList
	p := s.newParser()
	for {
		switch p.tok().kind {
		case tEOF:
			switch len(errs) {
			case 0:
				return out, nil
			case 1:
				return nil, errs[0]
			}
			return nil, errs
		case tSemi:
			p.advance()
			continue
		}
		e, perr := p.item()
		if perr != nil {
			errs = append(errs, perr)
			// Skip the rest of the failed expression.
			for k := p.tok().kind; k != tSemi && k != tEOF; k = p.tok().kind {
				p.advance()
			}
			continue
		}
		out = append(out, e)
	}
}

// session holds what the expressions of one source share: the tokens, the
// variable list and the configuration.
type session struct {
	src   string
	list  bool
	vars  []string
	index map[string]int
	// idents holds the variable index of each identifier token of src in
	// order (-1 for a function name), so that the parser need not look
	// names up.
	idents []int32
	order  int
	// at holds the expansion point by variable index (nil when every
	// value is 0, the origin).
	at    []coef
	lim   Limits
	guard *guard // shared by all expressions of the source
	// series caches the Taylor coefficients of the functions (coefsOf).
	series map[seriesKey][]*big.Rat
	// rguard bounds the remainder bookkeeping with a budget of its own
	// (the same limits), so that the bookkeeping does not use up the
	// budget of the expansion.
	rguard *guard
	// floor holds Config.Floor in series mode (nil for none).
	floor *floorSet
}

func newSession(src string, cfg Config, list bool) (*session, error) {
	lim := cfg.Limits.withDefaults()
	if cfg.Order < 0 {
		return nil, fmt.Errorf("monomial: Config.Order is negative (%d)", cfg.Order)
	}
	if cfg.Order > lim.MaxOrder {
		return nil, fmt.Errorf("monomial: Config.Order %d exceeds the limit %d (Limits.MaxOrder)", cfg.Order, lim.MaxOrder)
	}
	s := &session{src: src, list: list, order: cfg.Order, lim: lim, index: map[string]int{}, guard: newGuard(lim)}
	if cfg.Order > 0 {
		s.rguard = newGuard(lim) // remainders only arise in series mode
	}
	if len(cfg.Vars) > lim.MaxVars {
		return nil, fmt.Errorf("monomial: Config.Vars has %d variables, more than the limit %d (Limits.MaxVars)", len(cfg.Vars), lim.MaxVars)
	}
	for _, v := range cfg.Vars {
		if !IsIdentifier(v) {
			return nil, fmt.Errorf("monomial: Config.Vars: %q is not a valid variable name", v)
		}
		if _, dup := s.index[v]; dup {
			return nil, fmt.Errorf("monomial: Config.Vars: %q appears twice", v)
		}
		s.index[v] = len(s.vars)
		s.vars = append(s.vars, v)
	}
	// Find the other variables, in the order of their first appearance,
	// and the variable index of each identifier token.
	var seen nameTable
	for i, v := range s.vars {
		seen.put(v, int32(i))
	}
	ids := make([]int32, 0, len(src)/4+1) // a guess that avoids regrowing for typical text
	lx := newLexer(src, false)
	var t token
	for lx.scan(&t); t.kind != tEOF; lx.scan(&t) {
		if t.kind != tIdent {
			continue
		}
		name := src[t.off:t.end]
		id, ok := seen.get(name)
		if !ok {
			id = -1
			if !isFunction(name) {
				if len(s.vars) >= lim.MaxVars {
					e := errAtTok(t, "more than %d variables, the limit", lim.MaxVars)
					e.Setting = "MaxVars"
					return nil, e
				}
				id = int32(len(s.vars))
				s.index[name] = len(s.vars)
				s.vars = append(s.vars, name)
			}
			seen.put(name, id)
		}
		ids = append(ids, id)
	}
	s.idents = ids
	if err := s.setPoint(cfg.At); err != nil {
		return nil, err
	}
	if cfg.Order > 0 {
		fs, err := newFloorSet(cfg.Floor, len(s.vars))
		if err != nil {
			return nil, err
		}
		s.floor = fs
	}
	return s, nil
}

// setPoint checks Config.At and records the non-zero values.
func (s *session) setPoint(at map[string]*big.Rat) error {
	if len(at) == 0 {
		return nil
	}
	names := make([]string, 0, len(at))
	for name := range at {
		names = append(names, name)
	}
	slices.Sort(names) // report the first bad name in a fixed order
	for _, name := range names {
		a := at[name]
		i, ok := s.index[name]
		switch {
		case !ok && !IsIdentifier(name):
			return fmt.Errorf("monomial: Config.At: %q is not a valid variable name", name)
		case !ok:
			return fmt.Errorf("monomial: Config.At: %s is not a variable of the text or of Config.Vars", name)
		case a == nil:
			return fmt.Errorf("monomial: Config.At: the value of %s is nil", name)
		case a.Sign() == 0:
			continue
		}
		if s.at == nil {
			s.at = make([]coef, len(s.vars))
		}
		s.at[i] = coefFromRat(a)
	}
	return nil
}

// shifted reports whether variable v is read as a + x with a != 0.
func (s *session) shifted(v int) bool { return s.at != nil && !s.at[v].isZero() }

// place names the expansion point in messages.
func (s *session) place() string {
	if s.at == nil {
		return "0"
	}
	return "the expansion point"
}

// nameTable maps identifier names to int32 values, for the variable
// pre-pass that looks up every identifier of the text: open addressing with
// linear probing and FNV-1a hashes, which for short names costs less than
// a Go map.
type nameTable struct {
	slots []nameSlot // a power of two, at most half full
	n     int
}

type nameSlot struct {
	name string
	val  int32
	used bool
}

func fnv1a(s string) uint64 {
	h := uint64(14695981039346656037)
	for i := 0; i < len(s); i++ {
		h ^= uint64(s[i])
		h *= 1099511628211
	}
	return h
}

// get returns the value of name and whether it is present.
func (t *nameTable) get(name string) (int32, bool) {
	if len(t.slots) == 0 {
		return 0, false
	}
	mask := uint64(len(t.slots) - 1)
	for h := fnv1a(name) & mask; ; h = (h + 1) & mask {
		s := &t.slots[h]
		if !s.used {
			return 0, false
		}
		if s.name == name {
			return s.val, true
		}
	}
}

// put sets the value of name, which must not be present.
func (t *nameTable) put(name string, val int32) {
	if 2*(t.n+1) > len(t.slots) {
		old := t.slots
		t.slots = make([]nameSlot, max(16, 2*len(old)))
		t.n = 0
		for _, s := range old {
			if s.used {
				t.put(s.name, s.val)
			}
		}
	}
	mask := uint64(len(t.slots) - 1)
	h := fnv1a(name) & mask
	for t.slots[h].used {
		h = (h + 1) & mask
	}
	t.slots[h] = nameSlot{name, val, true}
	t.n++
}

func (s *session) errAt(t token, format string, args ...any) *Error {
	return &Error{Offset: t.off, Line: t.line, Col: t.col, Msg: fmt.Sprintf(format, args...)}
}

// errSetting is errAt for an error that the named setting would lift (see
// Error.Setting).
func (s *session) errSetting(t token, setting, format string, args ...any) *Error {
	e := s.errAt(t, format, args...)
	e.Setting = setting
	return e
}

func (s *session) newParser() *parser {
	p := &parser{session: s, lx: newLexer(s.src, s.list)}
	p.cur = p.lx.next()
	return p
}

// item parses one expression, up to the end of input or a separator.
func (p *parser) item() (*Expansion, *Error) {
	p.depth = 0
	v, err := p.expr()
	if err != nil {
		return nil, err
	}
	switch t := p.tok(); t.kind {
	case tEOF:
	case tSemi:
		if !p.list {
			return nil, p.errAt(t, "expected end of input, found %s (only one expression is read here)", describe(p.src, t))
		}
	case tIdent, tNumber, tLParen:
		return nil, p.errAt(t, "expected operator, found %s (write products with '*')", describe(p.src, t))
	default:
		return nil, p.expected("operator or end of expression")
	}
	e := &Expansion{Poly: v.p, Order: p.order}
	if v.rem != nil && !v.rem.IsZero() {
		e.Remainder = v.rem.Support()
		e.Truncated = true
	}
	return e, nil
}

// parser parses expressions, computing their values as it goes. It reads
// tokens from the lexer one at a time (no token list is kept), looking at
// the current token only.
type parser struct {
	*session
	lx    *lexer
	cur   token
	depth int
	// For the fast path (fast.go): the factors of the current term and
	// the end of the last token it consumed.
	fac     []varPower
	lastEnd int
}

// value is the value of a subexpression: its polynomial, whether that is
// exact, its remainder and its source span. When exact is false (series
// mode only) the true value minus p is a power series with terms of total
// degree > order only; p may still hold terms above the order that come
// from exact summands (a sum keeps them), but every other operation with an
// inexact operand truncates its result at the order. exact decides how p is
// computed, as it always has; rem certifies the result: every term of the
// true value minus p is a multiple of an element of the set rem (a set of
// exponents with unit coefficients, minimal, every element of degree >
// order), and rem is nil when the difference is zero. An exact value has a
// nil rem; an inexact one usually has a non-nil rem, but not always (a
// series that happens to terminate within the order).
type value struct {
	p        *Poly
	exact    bool
	rem      *Poly
	off, end int
}

func (p *parser) tok() token { return p.cur }

func (p *parser) advance() {
	if p.cur.kind != tEOF {
		p.lx.scan(&p.cur)
	}
}

// expected returns the error "expected what, found <current token>", or
// the lexical error of the current token.
func (p *parser) expected(what string) *Error {
	t := p.cur
	if t.kind == tIllegal {
		return p.errAt(t, "%s", t.msg)
	}
	return p.errAt(t, "expected %s, found %s", what, describe(p.src, t))
}

func (p *parser) snippet(v value) string { return shorten(p.src[v.off:v.end]) }

func (p *parser) enter() *Error {
	p.depth++
	if p.depth > maxDepth {
		return p.errAt(p.tok(), "expression nested too deeply (more than %d levels)", maxDepth)
	}
	return nil
}

func (p *parser) leave() { p.depth-- }

// expr = term { ("+" | "-") term } .
func (p *parser) expr() (value, *Error) {
	// Terms that are monomials are read by the fast path into one flat
	// buffer, sorted and merged once at the end. The other summands are
	// collected and added pairwise, like a merge sort, so that a long sum
	// costs O(T log k) rather than O(T k) for k summands with T terms in all.
	var buf termBuf
	var sum, rems []*Poly
	v := value{exact: true}
	for i := 0; ; i++ {
		neg := false
		if i > 0 {
			k := p.tok().kind
			if k != tPlus && k != tMinus {
				break
			}
			neg = k == tMinus
			p.advance()
		}
		if off, end, ok := p.fastTerm(&buf, neg); ok {
			if i == 0 {
				v.off = off
			}
			v.end = end
			continue
		}
		w, err := p.term()
		if err != nil {
			return w, err
		}
		if neg {
			w.p = w.p.Neg()
		}
		if i == 0 {
			v.off = w.off
		}
		v.exact = v.exact && w.exact
		v.end = w.end
		sum = append(sum, w.p)
		if w.rem != nil {
			rems = append(rems, w.rem)
		}
	}
	if len(buf.coefs) > 0 {
		sum = append(sum, buf.poly(p.vars))
	}
	for len(sum) > 1 {
		half := sum[:0]
		for i := 0; i+1 < len(sum); i += 2 {
			half = append(half, sum[i].Add(sum[i+1]))
		}
		if len(sum)%2 == 1 {
			half = append(half, sum[len(sum)-1])
		}
		sum = half
	}
	v.p = sum[0]
	if v.p.Len() > p.lim.MaxTerms {
		return v, p.tooMany(p.tok(), v)
	}
	if len(rems) == 1 {
		v.rem = rems[0]
	} else if len(rems) > 1 {
		// Rule "Sums": the union of the remainders.
		r, err := unionMin(p.rguard, rems...)
		if err != nil {
			return v, p.remErr(err, p.tok(), v)
		}
		v.rem = r
	}
	return v, nil
}

// term = unary { ("*" | "/") unary } .
func (p *parser) term() (value, *Error) {
	v, err := p.unary()
	if err != nil {
		return v, err
	}
	for k := p.tok().kind; k == tStar || k == tSlash; k = p.tok().kind {
		op := p.tok()
		p.advance()
		w, err := p.unary()
		if err != nil {
			return w, err
		}
		if k == tStar {
			v, err = p.multiply(v, w, op)
		} else {
			v, err = p.divide(v, w, op)
		}
		if err != nil {
			return v, err
		}
	}
	return v, nil
}

// unary = ("+" | "-") unary | power .
func (p *parser) unary() (value, *Error) {
	t := p.tok()
	if t.kind != tPlus && t.kind != tMinus {
		return p.power()
	}
	if err := p.enter(); err != nil {
		return value{}, err
	}
	defer p.leave()
	p.advance()
	v, err := p.unary()
	if err != nil {
		return v, err
	}
	v.off = t.off
	if t.kind == tMinus {
		v.p = v.p.Neg()
	}
	return v, nil
}

// power = primary [ ("^" | "**") unary ] .
func (p *parser) power() (value, *Error) {
	base, err := p.primary()
	if err != nil {
		return base, err
	}
	if p.tok().kind != tPow {
		return base, nil
	}
	op := p.tok()
	if err := p.enter(); err != nil {
		return value{}, err
	}
	defer p.leave()
	p.advance()
	ex, err := p.unary()
	if err != nil {
		return ex, err
	}
	return p.raise(base, ex, op)
}

// primary = number | identifier | function "(" expr ")" | "(" expr ")" .
func (p *parser) primary() (value, *Error) {
	t := p.tok()
	switch t.kind {
	case tNumber:
		p.advance()
		r, _ := numberValue(p.src[t.off:t.end])
		return value{p: constPoly(p.vars, coefFromRat(r)), exact: true, off: t.off, end: t.end}, nil
	case tIdent:
		name := p.src[t.off:t.end]
		if isFunction(name) {
			p.advance()
			return p.call(name, t)
		}
		v := p.varIndex(name)
		p.advance()
		if p.tok().kind == tLParen {
			return value{}, p.errAt(t, "unknown function %s", name)
		}
		x := p.variable(v)
		if p.shifted(v) {
			x = x.Add(constPoly(p.vars, p.at[v])) // the point plus the offset
		}
		return value{p: x, exact: true, off: t.off, end: t.end}, nil
	case tLParen:
		if err := p.enter(); err != nil {
			return value{}, err
		}
		defer p.leave()
		p.advance()
		v, err := p.expr()
		if err != nil {
			return v, err
		}
		if p.tok().kind != tRParen {
			return v, p.expected("')'")
		}
		v.off, v.end = t.off, p.tok().end
		p.advance()
		return v, nil
	}
	return value{}, p.expected("operand")
}

// varIndex returns the index of the variable name, which is the current
// token.
func (p *parser) varIndex(name string) int {
	if k := p.lx.nident - 1; k >= 0 && k < len(p.idents) {
		if id := p.idents[k]; id >= 0 && p.vars[id] == name {
			return int(id)
		}
	}
	return p.index[name] // not reached: both lexers see the same identifiers
}

func (p *parser) variable(v int) *Poly {
	e := make([]int, len(p.vars))
	e[v] = 1
	return &Poly{vars: p.vars, exps: e, coefs: []coef{coefOne}}
}

// call parses "(" expr ")" after a function name and applies the function.
func (p *parser) call(name string, nameTok token) (value, *Error) {
	if p.tok().kind != tLParen {
		return value{}, p.expected("'(' after function name " + name)
	}
	if err := p.enter(); err != nil {
		return value{}, err
	}
	defer p.leave()
	p.advance()
	arg, err := p.expr()
	if err != nil {
		return arg, err
	}
	if p.tok().kind != tRParen {
		return arg, p.expected("')'")
	}
	whole := value{off: nameTok.off, end: p.tok().end}
	p.advance()
	if p.order == 0 {
		return whole, p.errSetting(nameTok, "Order", "%s is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order", p.snippet(whole))
	}
	// The constant term of the argument is its value at the expansion
	// point (a remainder only has terms of positive degree).
	c := arg.p.constCoef()
	switch name {
	case "sqrt":
		return p.seriesPower(arg, big.NewRat(1, 2), whole, nameTok, "sqrt")
	case "log":
		if !c.isOne() {
			return whole, p.logErr(nameTok, whole, arg, c)
		}
	default:
		if !c.isZero() {
			return whole, p.irrationalErr(nameTok, name, whole, arg, c)
		}
	}
	u := arg.p.withoutConstant()
	k := p.order
	if !u.IsZero() {
		k = p.order / u.MinDegree()
	}
	// Two more coefficients than the expansion needs tell the remainder
	// where the omitted part starts.
	a := p.coefsOf(name, k+2)
	cut := p.cutter()
	res, cerr := compose(a[:k+1], u, p.order, p.guard, cut)
	if cerr != nil {
		return whole, p.limitErr(cerr, nameTok, whole)
	}
	whole.p = res
	whole.exact = arg.exact && u.IsZero()
	rem, rerr := composeRem(u, arg.rem, shapeOf(a, k, false), k, p.order, p.rguard)
	if rerr != nil {
		return whole, p.remErr(rerr, nameTok, whole)
	}
	whole.rem = rem
	if whole.exact {
		return whole, nil
	}
	return p.applyFloor(whole, cut, nameTok)
}

// pointErr is errAt for an expression that has no Taylor series at the
// expansion point because v vanishes there: Setting is "At" unless v is an
// exact constant, which vanishes at every point.
func (p *parser) pointErr(t token, v value, format string, args ...any) *Error {
	e := p.errAt(t, format, args...)
	if !(v.exact && v.p.IsConstant()) {
		e.Setting = "At"
	}
	return e
}

// logErr reports log(a) where a does not equal 1 at the expansion point;
// c is the value there.
func (p *parser) logErr(t token, whole, arg value, c coef) *Error {
	what, cs := p.snippet(whole), c.ratView().RatString()
	switch c.sign() {
	case 0:
		return p.pointErr(t, arg, "%s: the argument vanishes at %s, where log has no Taylor series", what, p.place())
	case -1:
		return p.errAt(t, "%s: the argument equals %s at %s, where log is not real", what, cs, p.place())
	}
	a := shorten(p.src[arg.off:arg.end])
	return p.errAt(t, "%s: the argument equals %s at %s, so the Taylor series starts with the irrational constant log(%s); since log(a) = log(%s) + log(a/%s), write the model with log(%s*(%s)), whose argument is 1 there", what, cs, p.place(), cs, cs, cs, c.inv().ratView().RatString(), a)
}

// irrationalErr reports a function other than log, sqrt and powers whose
// argument does not vanish at the expansion point (c is its value there):
// its Taylor coefficients there are irrational.
func (p *parser) irrationalErr(t token, name string, whole, arg value, c coef) *Error {
	what, cs := p.snippet(whole), c.ratView().RatString()
	switch name {
	case "exp":
		return p.errAt(t, "%s: the argument equals %s at %s, so the Taylor coefficients would be irrational (multiples of exp(%s)); factor the constant out: exp(%s + u) = exp(%s)·exp(u), so write the model with exp(u)", what, cs, p.place(), cs, cs, cs)
	case "atan":
		a := "(" + shorten(p.src[arg.off:arg.end]) + ")"
		num, den := offsetText("a", c)
		rnum, rden := offsetText(a, c)
		return p.errAt(t, "%s: the argument equals %s at %s, so the Taylor series starts with the irrational constant atan(%s); since atan(a) = atan(%s) + atan((%s)/(%s)), write the model with atan((%s)/(%s)), whose argument is 0 there", what, cs, p.place(), cs, cs, num, den, rnum, rden)
	}
	identity := map[string]string{
		"sin":  "sin(%[1]s + u) = sin(%[1]s)·cos(u) + cos(%[1]s)·sin(u)",
		"cos":  "cos(%[1]s + u) = cos(%[1]s)·cos(u) - sin(%[1]s)·sin(u)",
		"sinh": "sinh(%[1]s + u) = cosh(%[1]s)·sinh(u) + sinh(%[1]s)·cosh(u)",
		"cosh": "cosh(%[1]s + u) = cosh(%[1]s)·cosh(u) + sinh(%[1]s)·sinh(u)",
		"tanh": "tanh(%[1]s + u) = (tanh(%[1]s) + tanh(u))/(1 + tanh(%[1]s)·tanh(u))",
	}[name]
	return p.errAt(t, "%s: the argument equals %s at %s, so the Taylor coefficients would be irrational: %s, and no rewrite has rational ones; write the model with an argument that vanishes there (shift the variable or move the constant into a parameter)", what, cs, p.place(), fmt.Sprintf(identity, cs))
}

// offsetText formats a minus c and 1 plus c times a, where a is the text
// of an operand, for the rewrite of atan.
func offsetText(a string, c coef) (minus, onePlus string) {
	abs, op1, op2 := c, "-", "+"
	if c.sign() < 0 {
		abs, op1, op2 = c.neg(), "+", "-"
	}
	cs := abs.ratView().RatString()
	factor := cs + "*"
	if abs.isOne() {
		factor = ""
	}
	return fmt.Sprintf("%s %s %s", a, op1, cs), fmt.Sprintf("1 %s %s%s", op2, factor, a)
}

// coefsOf returns seriesCoefs(name, k), computed once per source: a model
// often applies one function many times at one order. The result is shared
// and must not be modified.
func (p *parser) coefsOf(name string, k int) []*big.Rat {
	key := seriesKey{name, k}
	if a, ok := p.series[key]; ok {
		return a
	}
	a, _ := seriesCoefs(name, k)
	if p.series == nil {
		p.series = map[seriesKey][]*big.Rat{}
	}
	p.series[key] = a
	return a
}

// seriesKey identifies the Taylor coefficients of a function up to t^k.
type seriesKey struct {
	name string
	k    int
}

// limitErr turns an error of a guarded computation into a parse error.
func (p *parser) limitErr(err error, t token, v value) *Error {
	switch {
	case errors.Is(err, errTooMuchWork):
		return p.errSetting(t, "MaxWork", "%s needs more work than the limit %d allows", p.snippet(v), p.lim.MaxWork)
	case errors.Is(err, errExponentOverflow):
		return p.errAt(t, "%s: exponents of 2^62 or more are not supported", p.snippet(v))
	}
	return p.tooMany(t, v)
}

// remErr turns an error of the remainder bookkeeping into a parse error.
func (p *parser) remErr(err error, t token, v value) *Error {
	switch {
	case errors.Is(err, errTooMuchWork):
		return p.errSetting(t, "MaxWork", "%s: bounding the omitted terms needs more work than the limit %d allows", p.snippet(v), p.lim.MaxWork)
	case errors.Is(err, errTooManyTerms):
		return p.errSetting(t, "MaxTerms", "%s: bounding the omitted terms needs more than %d monomials, the limit", p.snippet(v), p.lim.MaxTerms)
	}
	return p.limitErr(err, t, v)
}

func (p *parser) tooMany(t token, v value) *Error {
	return p.errSetting(t, "MaxTerms", "%s expands to more than %d terms, the limit", p.snippet(v), p.lim.MaxTerms)
}

// multiply returns v·w: the whole product when both are exact, else (in
// series mode) the product truncated at the order. In series mode an exact
// product that exceeds the limits is truncated at the order instead of
// failing, and the result is inexact.
func (p *parser) multiply(v, w value, op token) (value, *Error) {
	r := value{off: v.off, end: w.end}
	if (v.exact && v.p.IsZero()) || (w.exact && w.p.IsZero()) {
		r.p, r.exact = &Poly{vars: p.vars}, true
		return r, nil
	}
	if v.exact && w.exact {
		prod, merr := mul(v.p, w.p, -1, p.guard)
		if merr == nil {
			r.p, r.exact = prod, true
			return r, nil
		}
		if p.order == 0 {
			return r, p.limitErr(merr, op, r)
		}
	}
	// A constant factor scales every term, the exact ones above the order
	// included, and cannot make them incomplete. A non-zero constant keeps
	// the remainder (rule "Sums").
	if w.exact && w.p.IsConstant() {
		r.p, r.exact, r.rem = v.p.scale(w.p.constCoef()), v.exact, v.rem
		return r, nil
	}
	if v.exact && v.p.IsConstant() {
		r.p, r.exact, r.rem = w.p.scale(v.p.constCoef()), w.exact, w.rem
		return r, nil
	}
	prod, merr := p.mulTruncated(v.p, w.p)
	if merr != nil {
		return r, p.limitErr(merr, op, r)
	}
	r.p = prod
	rem, rerr := productRem(v.p, v.rem, w.p, w.rem, p.order, p.rguard)
	if rerr != nil {
		return r, p.remErr(rerr, op, r)
	}
	r.rem = rem
	return p.applyFloor(r, p.cutter(), op)
}

// mulTruncated returns a·b without its terms of total degree above the
// order. Terms of a or b above the order cannot reach the result (degrees
// are non-negative), so they are dropped first.
func (p *parser) mulTruncated(a, b *Poly) (*Poly, error) {
	return mul(a.Truncate(p.order), b.Truncate(p.order), p.order, p.guard)
}

// divide returns v/w: an exact division by a constant, or in series mode a
// product with the series of 1/w.
func (p *parser) divide(v, w value, op token) (value, *Error) {
	r := value{off: v.off, end: w.end}
	if w.exact && w.p.IsConstant() {
		c := w.p.constCoef()
		if c.isZero() {
			return r, p.errAt(op, "division by zero")
		}
		// Scaling keeps the exact terms above the order exact, and the
		// remainder.
		r.p, r.exact, r.rem = v.p.scale(c.inv()), v.exact, v.rem
		return r, nil
	}
	if p.order == 0 {
		return r, p.errSetting(op, "Order", "division by %s, which is not constant, is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order", p.snippet(w))
	}
	if w.p.vanishesAtZero() {
		return r, p.pointErr(op, w, "division by %s, which vanishes at %s: the quotient has no Taylor series there", p.snippet(w), p.place())
	}
	inv, err := p.seriesPower(w, big.NewRat(-1, 1), w, op, "")
	if err != nil {
		return r, err
	}
	return p.multiply(v, value{p: inv.p, exact: false, rem: inv.rem, off: w.off, end: w.end}, op)
}

// raise returns base^ex; ex must be an exact constant.
func (p *parser) raise(base, ex value, op token) (value, *Error) {
	r := value{off: base.off, end: ex.end}
	if !ex.p.IsConstant() || !ex.exact {
		return r, p.errAt(op, "the exponent %s is not a constant", p.snippet(ex))
	}
	e := ex.p.constCoef().rat()
	// A power of a single term costs nothing to expand, so MaxExponent
	// applies to the powers of sums and to rational exponents only.
	if !e.Num().IsInt64() || !e.Denom().IsInt64() || e.Num().Int64() == math.MinInt64 {
		return r, p.errAt(op, "exponent %s is too large", shorten(e.RatString()))
	}
	if base.p.Len() > 1 || !e.IsInt() {
		if e.Num().CmpAbs(big.NewInt(int64(p.lim.MaxExponent))) > 0 || e.Denom().Cmp(big.NewInt(int64(p.lim.MaxExponent))) > 0 {
			return r, p.errSetting(op, "MaxExponent", "exponent %s exceeds the limit %d", shorten(e.RatString()), p.lim.MaxExponent)
		}
	}
	n := int(e.Num().Int64())
	if n == 0 {
		r.p, r.exact = constPoly(p.vars, coefOne), true // p^0 = 1, also 0^0
		return r, nil
	}
	// Constant base: exact rational power when it exists.
	if base.exact && base.p.IsConstant() {
		c := base.p.constCoef()
		if c.isZero() && e.Sign() < 0 {
			return r, p.errAt(op, "division by zero: %s", p.snippet(r))
		}
		ln, ld := c.log2Parts()
		if bitsEst := (ln + ld) * math.Abs(float64(n)); bitsEst > float64(p.lim.MaxBits) {
			return r, p.errSetting(op, "MaxBits", "%s would have about %.3g bits, more than the limit %d", p.snippet(r), bitsEst, p.lim.MaxBits)
		}
		v, ok := ratPow(c.ratView(), e)
		if !ok {
			return r, p.errAt(op, "%s is not rational", p.snippet(r))
		}
		r.p, r.exact = constPoly(p.vars, coefFromRat(v)), true
		return r, nil
	}
	if e.IsInt() && n >= 0 {
		if base.exact {
			// The whole power, under the same limits in both modes. In
			// series mode a power beyond them is truncated below instead.
			res, perr := base.p.Pow(n, p.lim)
			if perr == nil {
				r.p, r.exact = res, true
				return r, nil
			}
			if p.order == 0 {
				var le *LimitError
				if errors.As(perr, &le) {
					return r, p.errSetting(op, le.Limit, "%s", le.describe(p.snippet(r)))
				}
				return r, p.limitErr(perr, op, r)
			}
		}
		if base.p.vanishesAtZero() {
			res, perr := base.p.pow(n, p.order, p.guard) // truncates base first
			if perr != nil {
				return r, p.limitErr(perr, op, r)
			}
			r.p, r.exact = res, false
			// Rule "Composition" with f(t) = t^n: res is U^n truncated
			// at the order, which is 0 when n·m > order.
			k := n
			if m := base.p.MinDegree(); m > 0 {
				k = min(n, p.order/m)
			}
			rem, rerr := composeRem(base.p, base.rem, powerShape(n, k), k, p.order, p.rguard)
			if rerr != nil {
				return r, p.remErr(rerr, op, r)
			}
			r.rem = rem
			return p.applyFloor(r, p.cutter(), op)
		}
		return p.seriesPower(base, e, r, op, "")
	}
	if p.order == 0 {
		kind := "negative"
		if !e.IsInt() {
			kind = "fractional"
		}
		return r, p.errSetting(op, "Order", "%s (a %s power) is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order", p.snippet(r), kind)
	}
	return p.seriesPower(base, e, r, op, "")
}

// seriesPower returns base^e as a truncated series by the binomial series:
// base = c·(1+u) with c the constant term, base^e = c^e·(1+u)^e. fn names
// the function for messages ("sqrt") or is empty for a power.
func (p *parser) seriesPower(base value, e *big.Rat, whole value, at token, fn string) (value, *Error) {
	c := base.p.constCoef()
	what := p.snippet(whole)
	if c.isZero() {
		if fn != "" {
			return whole, p.pointErr(at, base, "%s: the argument vanishes at %s, where %s has no Taylor series", what, p.place(), fn)
		}
		return whole, p.pointErr(at, base, "%s: the base vanishes at %s, so this power has no Taylor series there", what, p.place())
	}
	ce, ok := ratPow(c.ratView(), e)
	if !ok {
		cs := c.ratView().RatString()
		switch {
		case fn == "sqrt" && c.sign() < 0:
			return whole, p.errAt(at, "%s: the argument equals %s at %s, where sqrt is not real", what, cs, p.place())
		case fn == "sqrt":
			return whole, p.errAt(at, "%s: the argument equals %s at %s, which is not the square of a rational, so the Taylor coefficients would be irrational (multiples of sqrt(%s)); scale the argument so that its value there is a rational square such as 1 or 4 (sqrt(c*v) = sqrt(c)*sqrt(v) moves a factor out)", what, cs, p.place(), cs)
		case c.sign() < 0 && e.Denom().Bit(0) == 0:
			return whole, p.errAt(at, "%s: the base equals %s at %s, so the power is not real", what, cs, p.place())
		default:
			return whole, p.errAt(at, "%s: the base equals %s at %s, which has no rational %s-th root, so the Taylor coefficients would be irrational; scale the base so that its value there is, for example, 1", what, cs, p.place(), e.Denom())
		}
	}
	if float64(ce.Num().BitLen()+ce.Denom().BitLen()) > float64(p.lim.MaxBits) {
		return whole, p.errSetting(at, "MaxBits", "%s would have coefficients of more than %d bits, the limit", what, p.lim.MaxBits)
	}
	u := base.p.withoutConstant().scale(c.inv())
	k := p.order
	if !u.IsZero() {
		k = p.order / u.MinDegree()
	}
	a := binomialCoefs(e, k+2) // two more for the remainder
	cut := p.cutter()
	res, cerr := compose(a[:k+1], u, p.order, p.guard, cut)
	if cerr != nil {
		return whole, p.limitErr(cerr, at, whole)
	}
	whole.p = res.scale(coefFromRat(ce))
	whole.exact = base.exact && u.IsZero()
	// The binomial series terminates when e is a natural number.
	sh := shapeOf(a, k, e.IsInt() && e.Sign() >= 0)
	rem, rerr := composeRem(u, base.rem, sh, k, p.order, p.rguard)
	if rerr != nil {
		return whole, p.remErr(rerr, at, whole)
	}
	whole.rem = rem
	if whole.exact {
		return whole, nil
	}
	return p.applyFloor(whole, cut, at)
}

// ParseRat reads one number in the number syntax of the expression
// language, exactly: an optional sign, then a number (integer, decimal or
// scientific notation such as 12, 0.25, 1e-3, 2.5E2), optionally followed
// by "/" and a second such number, e.g. "1/3", "-2", "0.25". Surrounding
// white space is allowed. Errors are of type *Error.
func ParseRat(s string) (*big.Rat, error) {
	toks := newLexer(s, false).tokens()
	if err := firstIllegal(toks); err != nil {
		return nil, err
	}
	r, i, err := ratTokens(s, toks, 0)
	if err != nil {
		return nil, err
	}
	if t := toks[i]; t.kind != tEOF {
		return nil, errAtTok(t, "expected end of number, found %s", describe(s, t))
	}
	return r, nil
}

// firstIllegal returns the error of the first lexical error token.
func firstIllegal(toks []token) *Error {
	for _, t := range toks {
		if t.kind == tIllegal {
			return errAtTok(t, "%s", t.msg)
		}
	}
	return nil
}

func errAtTok(t token, format string, args ...any) *Error {
	return &Error{Offset: t.off, Line: t.line, Col: t.col, Msg: fmt.Sprintf(format, args...)}
}

// ratTokens reads [sign] number ["/" number] from toks[i:].
func ratTokens(src string, toks []token, i int) (*big.Rat, int, *Error) {
	neg := false
	if k := toks[i].kind; k == tPlus || k == tMinus {
		neg = k == tMinus
		i++
	}
	num := func() (*big.Rat, *Error) {
		t := toks[i]
		switch t.kind {
		case tIllegal:
			return nil, errAtTok(t, "%s", t.msg)
		case tNumber:
			i++
			r, _ := numberValue(src[t.off:t.end])
			return r, nil
		}
		return nil, errAtTok(t, "expected number, found %s", describe(src, t))
	}
	r, err := num()
	if err != nil {
		return nil, i, err
	}
	if toks[i].kind == tSlash {
		slash := toks[i]
		i++
		d, err := num()
		if err != nil {
			return nil, i, err
		}
		if d.Sign() == 0 {
			return nil, i, errAtTok(slash, "division by zero")
		}
		r.Quo(r, d)
	}
	if neg {
		r.Neg(r)
	}
	return r, i, nil
}

// ParseBindings reads name=value pairs separated by commas, such as
// "x=1, y=1/2", returning the names and values in the given order. Names
// are identifiers (not function names); values are read by the syntax of
// ParseRat. White space is allowed around every part; the empty string
// gives no bindings. Errors (of type *Error, with column positions) report
// malformed pairs, bad names or numbers, and repeated names.
func ParseBindings(s string) (names []string, values []*big.Rat, err error) {
	toks := newLexer(s, false).tokens()
	if err := firstIllegal(toks); err != nil {
		return nil, nil, err
	}
	seen := map[string]token{}
	i := 0
	if toks[0].kind == tEOF {
		return nil, nil, nil
	}
	for {
		t := toks[i]
		if t.kind != tIdent {
			if t.kind == tIllegal {
				return nil, nil, errAtTok(t, "%s", t.msg)
			}
			return nil, nil, errAtTok(t, "expected name, found %s", describe(s, t))
		}
		name := s[t.off:t.end]
		if isFunction(name) {
			return nil, nil, errAtTok(t, "%s is a function name, not a variable", name)
		}
		if first, dup := seen[name]; dup {
			return nil, nil, errAtTok(t, "duplicate name %s (first at column %d)", name, first.col)
		}
		seen[name] = t
		i++
		if toks[i].kind != tAssign {
			return nil, nil, errAtTok(toks[i], "expected '=' after %s, found %s", name, describe(s, toks[i]))
		}
		i++
		r, next, perr := ratTokens(s, toks, i)
		if perr != nil {
			return nil, nil, perr
		}
		i = next
		names = append(names, name)
		values = append(values, r)
		switch toks[i].kind {
		case tEOF:
			return names, values, nil
		case tComma:
			i++
		default:
			return nil, nil, errAtTok(toks[i], "expected ',' or end of input, found %s", describe(s, toks[i]))
		}
	}
}
