package model

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// Options tunes Build. The zero value is ready to use.
type Options struct {
	// Order, if > 0, replaces the order statement of the description: the
	// total degree in the parameters at which series are truncated.
	Order int
	// Limits guard the expansions; zero fields take the defaults of package
	// monomial.
	Limits monomial.Limits
}

// Model is the function K built from a description, in sum-of-squares
// form K = Σ c_i·g_i² with rational weights c_i > 0, ready to be bounded.
type Model struct {
	// Name is the description's name, Kind its kind.
	Name string
	Kind Kind
	// Problem is the question for package rlct: the generators g_i with
	// their weights, the prior, the truths as its points when K is a
	// polynomial in the parameters themselves, and (for a series) the order
	// and remainder.
	Problem *rlct.Problem
	// Offsets is true when K is a series expanded at the truth: the
	// generators are then polynomials in the offsets w − w* from Truth
	// (under the parameters' names), and Problem's point is the origin.
	Offsets bool
	// Truth is the first true parameter.
	Truth []*big.Rat
	// Labels says where each generator comes from ("output 1 at x = 2",
	// "category heads given c = 1", …), one per generator.
	Labels []string
	// What says in words what K is and how it was computed.
	What string
}

// Vars returns the variables of K: the entries of the parameters in the
// order of their declarations, a matrix row by row (B[1,2] is B_1_2, v[3]
// is v_3).
func (m *Model) Vars() []string { return m.Problem.Generators[0].Vars() }

// String writes K in the expression syntax: Σ c_i·(g_i)^2, the weight left
// out where it is 1.
func (m *Model) String() string {
	var b strings.Builder
	for i, g := range m.Problem.Generators {
		if i > 0 {
			b.WriteString(" + ")
		}
		if c := m.Problem.GeneratorWeights[i]; c.Cmp(big.NewRat(1, 1)) != 0 {
			b.WriteString(c.RatString() + "*")
		}
		b.WriteString("(" + g.String() + ")^2")
	}
	return b.String()
}

// Bound bounds the learning coefficient of the model at its truths (the
// minimum over them when there are several): rlct.Bound of m.Problem.
func (m *Model) Bound(ctx context.Context, opt *rlct.Options) (*rlct.Result, error) {
	return rlct.Bound(ctx, m.Problem, opt)
}

// builders are the kinds of model, each in its own file with its
// mathematics in the doc comment.
var builders = map[Kind]func(*build) error{
	Regression: buildRegression,
	Discrete:   buildDiscrete,
	Mixture:    buildMixture,
}

// Build turns a description into K. Errors in the description (an
// expression that needs an order, a function with no rational Taylor
// series at the truth, a probability that vanishes at the truth, a
// parameter that K does not depend on, …) are *Error values with the line
// and column of the place they come from, and match rlct.ErrInput. A
// cancelled ctx (nil means context.Background()) stops the work between
// expansions with an error wrapping ctx.Err().
func Build(ctx context.Context, d *Description, opt *Options) (*Model, error) {
	if ctx == nil {
		ctx = context.Background()
	}
	if opt == nil {
		opt = &Options{}
	}
	b := &build{ctx: ctx, d: d, opt: opt, order: d.order, budget: maxText}
	if opt.Order > 0 {
		b.order = opt.Order
	}
	b.declare()
	if err := b.truths(); err != nil {
		return nil, err
	}
	if err := builders[d.kind](b); err != nil {
		return nil, err
	}
	if err := b.finish(); err != nil {
		return nil, err
	}
	return b.m, nil
}

// build is the state of one Build.
type build struct {
	ctx   context.Context
	d     *Description
	opt   *Options
	order int

	vars   []string // the parameters' entries, in order
	labels []string // each variable as the description writes it
	decls  []*param // the declaration of each variable
	points [][]*big.Rat

	// series is set when some expression is not a polynomial: everything
	// is then expanded at the (single) truth, in offsets from it.
	series, decided bool

	// budget is the text the expressions may still expand to (maxText).
	budget int

	m      *Model
	rem    []monomial.Exponent // remainder of a series, in the parameters
	remAll bool                // rem was set (a series was truncated)
}

// declare lists the variables.
func (b *build) declare() {
	for _, p := range b.d.params {
		for i := range p.shape.rows {
			for j := range p.shape.cols {
				b.vars = append(b.vars, p.entryName(i, j))
				b.labels = append(b.labels, p.entryLabel(i, j))
				b.decls = append(b.decls, p)
			}
		}
	}
	b.m = &Model{Name: b.d.name, Kind: b.d.kind, Problem: &rlct.Problem{}}
}

// truths reads the true parameters as vectors over the variables; no truth
// statement means the origin.
func (b *build) truths() error {
	index := map[string]int{}
	for k, v := range b.vars {
		index[v] = k
	}
	for _, t := range b.d.truths {
		w := make([]*big.Rat, len(b.vars))
		for k := range w {
			w[k] = new(big.Rat)
		}
		for _, x := range t.bindings {
			p := b.paramNamed(x.name)
			for i := range p.shape.rows {
				for j := range p.shape.cols {
					v := x.one
					if v == nil {
						if x.shape.rows == p.shape.rows {
							v = x.rows[i][j]
						} else { // a vector written as a row
							v = x.rows[0][i]
						}
					}
					w[index[p.entryName(i, j)]].Set(v)
				}
			}
		}
		b.points = append(b.points, w)
	}
	if len(b.points) == 0 {
		w := make([]*big.Rat, len(b.vars))
		for k := range w {
			w[k] = new(big.Rat)
		}
		b.points = [][]*big.Rat{w}
	}
	b.m.Truth = b.points[0]
	return nil
}

func (b *build) paramNamed(name string) *param {
	for _, p := range b.d.params {
		if p.name == name {
			return p
		}
	}
	return nil
}

// stopped returns ctx's error, wrapped, when it is done.
func (b *build) stopped() error {
	if err := b.ctx.Err(); err != nil {
		return fmt.Errorf("model: %w", err)
	}
	return nil
}

// piece is one scalar text to expand, with what it is for messages.
type piece struct {
	f       *frag
	context string // "at design point x = 2: ", prefixed to errors
}

// expandAll expands the texts in the variables b.vars followed by extra
// (inputs that are integrated out). On the first call it decides the mode:
// polynomials when every text is one, otherwise series at the truth to the
// given order (an *Error when there is no order, or several truths).
// Polynomials are in the parameters themselves; series in the offsets from
// the truth, with their remainders.
func (b *build) expandAll(pieces []piece, extra []string, order int) ([]*monomial.Expansion, error) {
	vars := append(slices.Clip(b.vars), extra...)
	lim := b.opt.Limits
	if !b.decided {
		out, err := b.expandWith(pieces, monomial.Config{Vars: vars, Limits: lim})
		var me *Error
		if err == nil || !errors.As(err, &me) || me.Setting != "Order" {
			b.decided = true
			return out, err
		}
		if b.order == 0 {
			me.Msg += " (add an order statement, order D, to expand the model as a series to total degree D in the parameters)"
			return nil, me
		}
		if len(b.points) > 1 {
			return nil, errorAt(b.d.src, b.d.truths[1].pos,
				"the model is a series (%s), which is expanded at one truth; give one truth statement (or describe each truth on its own)", strings.TrimSpace(me.Msg))
		}
		b.series, b.decided = true, true
	}
	if !b.series {
		return b.expandWith(pieces, monomial.Config{Vars: vars, Limits: lim})
	}
	at := map[string]*big.Rat{}
	for k, v := range b.points[0] {
		if v.Sign() != 0 {
			at[b.vars[k]] = v
		}
	}
	return b.expandWith(pieces, monomial.Config{Vars: vars, Order: order, At: at, Limits: lim})
}

// expandWith parses each text with cfg, leading errors back to the
// description.
func (b *build) expandWith(pieces []piece, cfg monomial.Config) ([]*monomial.Expansion, error) {
	out := make([]*monomial.Expansion, len(pieces))
	for k, pc := range pieces {
		if err := b.stopped(); err != nil {
			return nil, err
		}
		ex, err := monomial.Parse(string(pc.f.b), cfg)
		if err != nil {
			return nil, fromMonomial(b.d.src, &sourceMap{pc.f.marks}, err, pc.context)
		}
		out[k] = ex
	}
	return out, nil
}

// at returns the point where a polynomial of the current mode takes the
// true value: the first truth, or the origin for offsets.
func (b *build) at(t int) []*big.Rat {
	if b.series {
		return zeros(len(b.vars))
	}
	return b.points[t]
}

func zeros(n int) []*big.Rat {
	w := make([]*big.Rat, n)
	for k := range w {
		w[k] = new(big.Rat)
	}
	return w
}

// addGenerator appends c·g² to K; a zero g is left out.
func (b *build) addGenerator(g *monomial.Poly, c *big.Rat, label string) {
	if g.IsZero() {
		return
	}
	b.m.Problem.Generators = append(b.m.Problem.Generators, g)
	b.m.Problem.GeneratorWeights = append(b.m.Problem.GeneratorWeights, c)
	b.m.Labels = append(b.m.Labels, label)
}

// addRemainder records remainder monomials (in the parameters) of a
// truncated series.
func (b *build) addRemainder(rem []monomial.Exponent) {
	b.remAll = true
	b.rem = append(b.rem, rem...)
}

// finish sets the prior, the points and the truncation, and refuses
// parameters that K does not depend on.
func (b *build) finish() error {
	p := b.m.Problem
	if len(p.Generators) == 0 {
		return errorAt(b.d.src, b.d.kindPos, "K is identically zero: the model does not depend on its parameters")
	}
	used := make([]bool, len(b.vars))
	mark := func(e monomial.Exponent) {
		for k, x := range e {
			if x > 0 {
				used[k] = true
			}
		}
	}
	for _, g := range p.Generators {
		for e := range g.All() {
			mark(e)
		}
	}
	b.rem = minimal(b.rem)
	for _, r := range b.rem {
		mark(r)
	}
	for k, u := range used {
		if !u {
			return errorAt(b.d.src, b.decls[k].pos,
				"the parameter %s does not enter the model: K does not depend on it (it would add nothing to λ); remove it, or check the model's expressions", b.labels[k])
		}
	}
	p.Prior = make([]*big.Rat, len(b.vars))
	for k, dcl := range b.decls {
		p.Prior[k] = new(big.Rat).Set(dcl.prior)
		if b.series && b.points[0][k].Sign() != 0 {
			// In offsets the origin is the truth; there |w|^h is smooth
			// and positive, so it contributes no exponent (rlct.Problem.Prior).
			p.Prior[k].SetInt64(0)
		}
	}
	if b.series {
		b.m.Offsets = true
	} else {
		p.Points = b.points
	}
	if b.remAll {
		p.Truncated = true
		p.Remainder = b.rem
		p.Order = b.order
		for _, r := range b.rem {
			p.Order = min(p.Order, r.Degree()-1)
		}
	}
	return nil
}

// minimal returns the exponents of es that are not multiples of another
// one, without duplicates, sorted.
func minimal(es []monomial.Exponent) []monomial.Exponent {
	slices.SortFunc(es, func(a, b monomial.Exponent) int {
		if c := a.Degree() - b.Degree(); c != 0 {
			return c
		}
		return slices.Compare(a, b)
	})
	var out []monomial.Exponent
next:
	for _, e := range es {
		for _, m := range out {
			if divides(m, e) {
				continue next
			}
		}
		out = append(out, e)
	}
	return out
}

// divides reports whether x^a divides x^b.
func divides(a, b monomial.Exponent) bool {
	for k := range a {
		if a[k] > b[k] {
			return false
		}
	}
	return true
}

// split writes a polynomial in (w, x) as Σ_α c_α(w)·x^α: it returns the
// x-exponents α (the last len(p.Vars()) − nw variables) and the
// coefficients c_α as polynomials in the first nw variables.
func split(p *monomial.Poly, nw int, wvars []string) (alphas []monomial.Exponent, coefs []*monomial.Poly) {
	type group struct {
		exps  []monomial.Exponent
		coefs []*big.Rat
	}
	groups := map[string]*group{}
	var order []string
	for e, c := range p.All() {
		key := fmt.Sprint([]int(e[nw:]))
		g, ok := groups[key]
		if !ok {
			g = &group{}
			groups[key] = g
			order = append(order, key)
			alphas = append(alphas, slices.Clone(e[nw:]))
		}
		g.exps = append(g.exps, slices.Clone(e[:nw]))
		g.coefs = append(g.coefs, c)
	}
	for _, key := range order {
		g := groups[key]
		q, err := monomial.FromTerms(wvars, g.exps, g.coefs)
		if err != nil {
			panic(err) // cannot happen: the terms come from a polynomial
		}
		coefs = append(coefs, q)
	}
	return alphas, coefs
}
