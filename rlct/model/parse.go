package model

import (
	"math/big"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// MaxSource bounds the length of a description in bytes (16 MiB).
const MaxSource = 16 << 20

// maxNesting bounds the nesting of parentheses, signs, powers and calls in
// an expression, so that deeply nested input fails instead of exhausting
// the stack.
const maxNesting = 500

// Description is a model described in the text format of this package (see
// the package documentation): its parameters with their priors, the true
// parameters, the kind of model and its parts. Parse reads one; Build turns
// it into K. A Description is immutable and safe for concurrent use.
type Description struct {
	src string

	name     string
	kind     Kind
	kindPos  int
	order    int
	ordPos   int
	noise    *big.Rat
	noisePos int

	params []*param
	inputs []*input
	truths []*truth
	means  []*node
	cats   []*category
	comps  []*component
	stmts  []stmt // in source order, for printing
}

// stmt is one statement, kept for printing.
type stmt interface{ print(b *strings.Builder) }

// Name returns the name given by the model statement ("" when there is
// none).
func (d *Description) Name() string { return d.name }

// Kind returns the kind of the model.
func (d *Description) Kind() Kind { return d.kind }

// Source returns the text the description was read from.
func (d *Description) Source() string { return d.src }

// String returns the description in canonical form: one statement per line
// in the order given, comments and redundant parentheses left out, numbers
// in lowest terms. Parse reads it back to a description with the same
// String.
func (d *Description) String() string {
	var b strings.Builder
	for _, s := range d.stmts {
		s.print(&b)
		b.WriteByte('\n')
	}
	return b.String()
}

// bailout unwinds the parser to the statement loop with an error.
type bailout struct{ err *Error }

// parser reads a description.
type parser struct {
	src   string
	lex   lexer
	tok   token
	depth int
	d     *Description
}

// Parse reads a description. Errors are of type *Error, or ErrorList when
// several statements fail (every statement is read, so that all the
// syntax errors are reported at once); both point at the line and column.
// Parse checks the form of each statement and that the description is
// complete and consistent (a kind, the parts that kind needs, names
// declared once, truths that fit the declarations); whether the model's
// expressions can be expanded is checked by Build.
func Parse(src string) (*Description, error) {
	if len(src) > MaxSource {
		return nil, errorAt("", 0, "the description is longer than %d bytes", MaxSource)
	}
	p := &parser{src: src, lex: lexer{src: src}, d: &Description{src: src}}
	var errs ErrorList
	p.advance(&errs)
	for p.tok.kind != tEOF {
		if err := p.statement(); err != nil {
			errs = append(errs, err)
			p.skipLine(&errs)
		}
	}
	if len(errs) == 0 {
		if err := p.d.check(); err != nil {
			errs = append(errs, err)
		}
	}
	switch len(errs) {
	case 0:
		return p.d, nil
	case 1:
		return nil, errs[0]
	}
	return nil, errs
}

// advance reads the next token, recording lexical errors in errs and
// skipping the offending character.
func (p *parser) advance(errs *ErrorList) {
	for {
		t, err := p.lex.next()
		if err == nil {
			p.tok = t
			return
		}
		*errs = append(*errs, err)
	}
}

// next reads the next token inside a statement; a lexical error ends the
// statement.
func (p *parser) next() {
	t, err := p.lex.next()
	if err != nil {
		panic(bailout{err})
	}
	p.tok = t
}

// skipLine skips to the token after the next end of line.
func (p *parser) skipLine(errs *ErrorList) {
	for p.tok.kind != tNewline && p.tok.kind != tEOF {
		p.advance(errs)
	}
	if p.tok.kind == tNewline {
		p.advance(errs)
	}
}

// fail ends the statement with an error at offset off.
func (p *parser) fail(off int, format string, args ...any) {
	panic(bailout{errorAt(p.src, off, format, args...)})
}

// text is the text of the current token.
func (p *parser) text() string { return p.src[p.tok.off:p.tok.end] }

// found names the current token for "expected X, found Y" messages.
func (p *parser) found() string {
	switch p.tok.kind {
	case tIdent, tNumber:
		return strconv.Quote(p.text())
	}
	return p.tok.kind.String()
}

// expect checks that the current token is of kind k and reads past it.
func (p *parser) expect(k tokenKind, what string) token {
	if p.tok.kind != k {
		p.fail(p.tok.off, "expected %s, found %s", what, p.found())
	}
	t := p.tok
	p.next()
	return t
}

// keyword checks that the current token is the identifier kw and reads
// past it.
func (p *parser) keyword(kw string) {
	if p.tok.kind != tIdent || p.text() != kw {
		p.fail(p.tok.off, "expected %q, found %s", kw, p.found())
	}
	p.next()
}

// statement reads one statement and the end of its line. It recovers the
// parser's bailouts and returns their error.
func (p *parser) statement() (err *Error) {
	defer func() {
		if r := recover(); r != nil {
			b, ok := r.(bailout)
			if !ok {
				panic(r)
			}
			err = b.err
		}
	}()
	if p.tok.kind == tNewline {
		p.next()
		return nil
	}
	if p.tok.kind != tIdent {
		p.fail(p.tok.off, "expected a statement (model, kind, param, truth, order, input, noise, mean, category or component), found %s", p.found())
	}
	kw, at := p.text(), p.tok.off
	switch kw {
	case "model":
		p.modelStmt(at)
		return nil // modelStmt reads the line's end itself
	case "kind":
		p.next()
		p.kindStmt(at)
	case "param":
		p.next()
		p.paramStmt()
	case "truth":
		p.next()
		p.truthStmt(at)
	case "order":
		p.next()
		p.orderStmt(at)
	case "input":
		p.next()
		p.inputStmt()
	case "noise":
		p.next()
		p.noiseStmt(at)
	case "mean":
		p.next()
		e := p.expr()
		p.d.means = append(p.d.means, e)
		p.d.stmts = append(p.d.stmts, exprStmt{"mean", e})
	case "category":
		p.next()
		p.categoryStmt()
	case "component":
		p.next()
		p.componentStmt()
	default:
		p.fail(at, "unknown statement %q (expected model, kind, param, truth, order, input, noise, mean, category or component)", kw)
	}
	if p.tok.kind != tNewline && p.tok.kind != tEOF {
		p.fail(p.tok.off, "expected end of line, found %s", p.found())
	}
	if p.tok.kind == tNewline {
		p.next()
	}
	return nil
}

// modelStmt reads "model" text: the rest of the line, without a comment and
// surrounding white space, is the model's name.
//
//	ModelStmt = "model" text .
func (p *parser) modelStmt(at int) {
	if p.d.name != "" {
		p.fail(at, "the model is named twice")
	}
	start := p.tok.end
	end := start
	for end < len(p.src) && p.src[end] != '\n' && p.src[end] != '#' {
		end++
	}
	name := strings.TrimSpace(p.src[start:end])
	if name == "" {
		p.fail(at, "expected a name after model")
	}
	for _, r := range name {
		if r < ' ' || r == 0x7f {
			p.fail(at, "the model's name holds the control character %s", quoteRune(r))
		}
	}
	p.d.name = name
	p.d.stmts = append(p.d.stmts, textStmt{"model", name})
	p.lex.off = end
	p.next()
	if p.tok.kind == tNewline {
		p.next()
	}
}

// kindStmt reads the kind.
//
//	KindStmt = "kind" ( "regression" | "discrete" | "mixture" ) .
func (p *parser) kindStmt(at int) {
	if p.d.kind != "" {
		p.fail(at, "the kind is given twice (first at %s)", p.pos(p.d.kindPos))
	}
	t := p.expect(tIdent, "regression, discrete or mixture")
	k := Kind(p.src[t.off:t.end])
	switch k {
	case Regression, Discrete, Mixture:
	default:
		p.fail(t.off, "unknown kind %q (expected regression, discrete or mixture)", k)
	}
	p.d.kind, p.d.kindPos = k, at
	p.d.stmts = append(p.d.stmts, textStmt{"kind", string(k)})
}

// pos writes offset off as "line:col".
func (p *parser) pos(off int) string {
	l, c := position(p.src, off)
	return strconv.Itoa(l) + ":" + strconv.Itoa(c)
}

// paramStmt reads parameter declarations with a common prior exponent.
//
//	ParamStmt = "param" Decl { "," Decl } [ "prior" Number ] .
func (p *parser) paramStmt() {
	var ps []*param
	for {
		ps = append(ps, &param{decl: p.decl(true)})
		if p.tok.kind != tComma {
			break
		}
		p.next()
	}
	prior := new(big.Rat)
	if p.tok.kind == tIdent && p.text() == "prior" {
		p.next()
		at := p.tok.off
		prior = p.number()
		if prior.Cmp(big.NewRat(-1, 1)) <= 0 {
			p.fail(at, "a prior exponent must be greater than -1, found %s (the prior ∝ |w|^h must be integrable near 0)", prior.RatString())
		}
	}
	for _, q := range ps {
		q.prior = prior
	}
	p.d.params = append(p.d.params, ps...)
	p.d.stmts = append(p.d.stmts, paramStmt(ps))
}

// decl reads a name with an optional shape.
//
//	Decl = identifier [ "[" integer [ "," integer ] "]" ] .
func (p *parser) decl(matrix bool) decl {
	t := p.expect(tIdent, "a name")
	d := decl{name: p.src[t.off:t.end], pos: t.off, shape: shape{rows: 1, cols: 1}}
	p.checkName(d.name, t.off)
	if p.tok.kind != tLBrack {
		return d
	}
	p.next()
	d.shape.rows = p.size()
	if p.tok.kind == tComma {
		if !matrix {
			p.fail(p.tok.off, "an input is a scalar or a vector, not a matrix")
		}
		p.next()
		d.shape.cols = p.size()
	} else {
		d.shape.vector = true
	}
	p.expect(tRBrack, "']'")
	return d
}

// checkName refuses names the expression language reserves.
func (p *parser) checkName(name string, off int) {
	if isFunction(name) { // the lexer only makes identifiers
		p.fail(off, "%s is a function of the expression language and cannot name a parameter or an input", name)
	}
}

// size reads a dimension, an integer from 1 to maxShape.
func (p *parser) size() int {
	t := p.expect(tNumber, "a size")
	n, err := strconv.Atoi(p.src[t.off:t.end])
	if err != nil || n < 1 || n > maxShape {
		p.fail(t.off, "a size must be an integer from 1 to %d, found %q", maxShape, p.src[t.off:t.end])
	}
	return n
}

// number reads a signed rational.
//
//	Number = [ "+" | "-" ] number [ "/" number ] .
func (p *parser) number() *big.Rat {
	neg := false
	switch p.tok.kind {
	case tMinus:
		neg = true
		p.next()
	case tPlus:
		p.next()
	}
	x := p.unsigned()
	if p.tok.kind == tSlash {
		p.next()
		at := p.tok.off
		y := p.unsigned()
		if y.Sign() == 0 {
			p.fail(at, "division by zero")
		}
		x.Quo(x, y)
	}
	if neg {
		x.Neg(x)
	}
	return x
}

// unsigned reads one number token exactly.
func (p *parser) unsigned() *big.Rat {
	t := p.expect(tNumber, "a number")
	x, err := monomial.ParseRat(p.src[t.off:t.end])
	if err != nil {
		p.fail(t.off, "%s", strings.TrimPrefix(err.Error(), "1:1: "))
	}
	return x
}

// integer reads a non-negative integer up to max.
func (p *parser) integer(what string, lo, hi int) int {
	t := p.expect(tNumber, what)
	n, err := strconv.Atoi(p.src[t.off:t.end])
	if err != nil || n < lo || n > hi {
		p.fail(t.off, "%s must be an integer from %d to %d, found %q", what, lo, hi, p.src[t.off:t.end])
	}
	return n
}

// truthStmt reads one true parameter; unnamed parameters are 0.
//
//	TruthStmt = "truth" [ Binding { "," Binding } ] .
//	Binding   = identifier "=" ( Number | "[" Row { ";" Row } "]" ) .
//	Row       = Number { "," Number } .
func (p *parser) truthStmt(at int) {
	tr := &truth{pos: at}
	for p.tok.kind == tIdent {
		b := binding{name: p.text(), pos: p.tok.off}
		for _, o := range tr.bindings {
			if o.name == b.name {
				p.fail(b.pos, "%s is set twice in one truth", b.name)
			}
		}
		p.next()
		p.expect(tAssign, "'='")
		if p.tok.kind == tLBrack {
			p.next()
			row := []*big.Rat{p.number()}
			for {
				switch p.tok.kind {
				case tComma:
					p.next()
					row = append(row, p.number())
					continue
				case tSemi:
					p.next()
					b.rows = append(b.rows, row)
					row = []*big.Rat{p.number()}
					continue
				}
				break
			}
			b.rows = append(b.rows, row)
			for _, r := range b.rows {
				if len(r) != len(b.rows[0]) {
					p.fail(b.pos, "the rows of %s have different lengths", b.name)
				}
			}
			if len(b.rows)*len(b.rows[0]) > maxShape*maxShape {
				p.fail(b.pos, "the value of %s is too large", b.name)
			}
			b.shape = shape{rows: len(b.rows), cols: len(b.rows[0])}
			p.expect(tRBrack, "',', ';' or ']'")
		} else {
			b.one = p.number()
		}
		tr.bindings = append(tr.bindings, b)
		if p.tok.kind != tComma {
			break
		}
		p.next()
	}
	p.d.truths = append(p.d.truths, tr)
	p.d.stmts = append(p.d.stmts, tr)
}

// orderStmt reads the truncation order of series.
//
//	OrderStmt = "order" integer .
func (p *parser) orderStmt(at int) {
	if p.d.ordPos != 0 || p.d.order != 0 {
		p.fail(at, "the order is given twice")
	}
	p.d.order = p.integer("the order", 1, monomial.DefaultMaxOrder)
	p.d.ordPos = at
	p.d.stmts = append(p.d.stmts, textStmt{"order", strconv.Itoa(p.d.order)})
}

// noiseStmt reads the noise variance σ² of a regression.
//
//	NoiseStmt = "noise" Number .
func (p *parser) noiseStmt(at int) {
	if p.d.noise != nil {
		p.fail(at, "the noise variance is given twice")
	}
	vat := p.tok.off
	v := p.number()
	if v.Sign() <= 0 {
		p.fail(vat, "the noise variance σ² must be positive, found %s", v.RatString())
	}
	p.d.noise, p.d.noisePos = v, at
	p.d.stmts = append(p.d.stmts, textStmt{"noise", v.RatString()})
}

// inputStmt reads an input and its law.
//
//	InputStmt = "input" Decl "~" Law .
//	Law       = "normal" [ "(" Number "," Number ")" ]
//	          | "uniform" "(" Number "," Number ")"
//	          | "design" "{" Entry { "," Entry } "}"
//	          | "moments" "{" Entry { "," Entry } "}" .
//	Entry     = Point ":" Number .
//	Point     = Number | "(" Number { "," Number } ")" .
func (p *parser) inputStmt() {
	in := &input{decl: p.decl(false)}
	p.expect(tTilde, "'~'")
	in.law.pos = p.tok.off
	t := p.expect(tIdent, "a law (normal, uniform, design or moments)")
	switch name := p.src[t.off:t.end]; name {
	case "normal":
		in.law.kind = lawNormal
		in.law.a, in.law.b = new(big.Rat), big.NewRat(1, 1)
		if p.tok.kind == tLParen {
			p.next()
			in.law.a = p.number()
			p.expect(tComma, "','")
			at := p.tok.off
			in.law.b = p.number()
			if in.law.b.Sign() <= 0 {
				p.fail(at, "the variance of a normal law must be positive, found %s", in.law.b.RatString())
			}
			p.expect(tRParen, "')'")
		}
	case "uniform":
		in.law.kind = lawUniform
		p.expect(tLParen, "'('")
		in.law.a = p.number()
		p.expect(tComma, "','")
		at := p.tok.off
		in.law.b = p.number()
		if in.law.b.Cmp(in.law.a) <= 0 {
			p.fail(at, "a uniform law needs a < b, found uniform(%s, %s)", in.law.a.RatString(), in.law.b.RatString())
		}
		p.expect(tRParen, "')'")
	case "design", "moments":
		in.law.kind = lawDesign
		if name == "moments" {
			in.law.kind = lawMoments
		}
		p.expect(tLBrace, "'{'")
		for {
			at := p.tok.off
			pt := p.point(in.shape.rows, in.law.kind == lawMoments)
			p.expect(tColon, "':'")
			wat := p.tok.off
			w := p.number()
			for k, q := range in.law.points {
				if ratsEqual(q, pt) {
					p.fail(at, "this point is listed twice (first at %s)", p.pos(in.law.pointPos[k]))
				}
			}
			if in.law.kind == lawDesign && w.Sign() <= 0 {
				p.fail(wat, "a design weight must be positive, found %s", w.RatString())
			}
			in.law.points = append(in.law.points, pt)
			in.law.weights = append(in.law.weights, w)
			in.law.pointPos = append(in.law.pointPos, at)
			if p.tok.kind != tComma {
				break
			}
			p.next()
		}
		p.expect(tRBrace, "',' or '}'")
		if in.law.kind == lawDesign {
			sum := new(big.Rat)
			for _, w := range in.law.weights {
				sum.Add(sum, w)
			}
			if sum.Cmp(big.NewRat(1, 1)) != 0 {
				p.fail(in.law.pos, "the design weights sum to %s, not 1", sum.RatString())
			}
		}
	default:
		p.fail(t.off, "unknown law %q (expected normal, uniform, design or moments)", name)
	}
	p.d.inputs = append(p.d.inputs, in)
	p.d.stmts = append(p.d.stmts, in)
}

// point reads a point of a design (n coordinates) or an exponent of a
// moment table (n non-negative integers).
func (p *parser) point(n int, exponent bool) []*big.Rat {
	at := p.tok.off
	var pt []*big.Rat
	if p.tok.kind == tLParen {
		p.next()
		pt = append(pt, p.number())
		for p.tok.kind == tComma {
			p.next()
			pt = append(pt, p.number())
		}
		p.expect(tRParen, "',' or ')'")
	} else {
		pt = append(pt, p.number())
	}
	if len(pt) != n {
		p.fail(at, "expected %d coordinates, found %d", n, len(pt))
	}
	if exponent {
		for _, x := range pt {
			if !x.IsInt() || x.Sign() < 0 || x.Num().Cmp(big.NewInt(maxMomentDegree)) > 0 {
				p.fail(at, "a moment's exponents must be integers from 0 to %d, found %s", maxMomentDegree, x.RatString())
			}
		}
	}
	return pt
}

// maxMomentDegree bounds the exponents of a moment table.
const maxMomentDegree = 1000

// categoryStmt reads a category (or a vector of categories).
//
//	CategoryStmt = "category" identifier "=" Expr .
func (p *parser) categoryStmt() {
	t := p.expect(tIdent, "the category's name")
	c := &category{name: p.src[t.off:t.end], pos: t.off}
	for _, o := range p.d.cats {
		if o.name == c.name {
			p.fail(c.pos, "category %s is declared twice (first at %s)", c.name, p.pos(o.pos))
		}
	}
	p.expect(tAssign, "'='")
	c.expr = p.expr()
	p.d.cats = append(p.d.cats, c)
	p.d.stmts = append(p.d.stmts, c)
}

// componentStmt reads a mixture component.
//
//	ComponentStmt = "component" Family "weight" Expr .
//	Family        = "poisson" "(" Expr ")" | "bernoulli" "(" Expr ")"
//	              | "binomial" "(" integer "," Expr ")" .
func (p *parser) componentStmt() {
	t := p.expect(tIdent, "a family (poisson, binomial or bernoulli)")
	c := &component{pos: t.off, family: p.src[t.off:t.end], trials: 1}
	p.expect(tLParen, "'('")
	switch c.family {
	case "poisson", "bernoulli":
	case "binomial":
		c.trials = p.integer("the number of trials", 1, maxTrials)
		p.expect(tComma, "','")
	default:
		p.fail(t.off, "unknown family %q (expected poisson, binomial or bernoulli)", c.family)
	}
	c.arg = p.expr()
	p.expect(tRParen, "')'")
	p.keyword("weight")
	c.weight = p.expr()
	p.d.comps = append(p.d.comps, c)
	p.d.stmts = append(p.d.stmts, c)
}

// maxTrials bounds the trials of a binomial component (each count is a
// category).
const maxTrials = 1000

// ratsEqual reports whether two vectors are equal.
func ratsEqual(a, b []*big.Rat) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Cmp(b[i]) != 0 {
			return false
		}
	}
	return true
}
