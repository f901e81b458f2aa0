package model

import (
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// maxCombos bounds the number of joint design points (the product of the
// designs of several inputs).
const maxCombos = 100_000

// maxBasis bounds the monomials of the integrated inputs that the mean may
// involve (the moment matrix has that many rows and is factored exactly).
const maxBasis = 300

// combo is one joint point of the design inputs, with its weight.
type combo struct {
	values map[string][]*big.Rat // input name → its coordinates
	weight *big.Rat
	label  string // "x = 2, c = (1, 0)"; empty without design inputs
}

// designCombos lists the joint points of independent design inputs: every
// choice of one point per input, with the product of their weights. Without
// design inputs it returns one empty combo of weight 1.
func designCombos(src string, designs []*input) ([]combo, error) {
	out := []combo{{values: map[string][]*big.Rat{}, weight: big.NewRat(1, 1)}}
	for _, in := range designs {
		if len(out)*len(in.law.points) > maxCombos {
			return nil, errorAt(src, in.law.pos, "the designs have more than %d joint points", maxCombos)
		}
		var next []combo
		for _, c := range out {
			for k, pt := range in.law.points {
				values := make(map[string][]*big.Rat, len(c.values)+1)
				for n, v := range c.values {
					values[n] = v
				}
				values[in.name] = pt
				label := in.name + " = " + pointText(pt, in.shape.vector)
				if c.label != "" {
					label = c.label + ", " + label
				}
				next = append(next, combo{values: values, weight: new(big.Rat).Mul(c.weight, in.law.weights[k]), label: label})
			}
		}
		out = next
	}
	return out, nil
}

// pointText writes a design point: 2, or (1, 0) for a vector.
func pointText(pt []*big.Rat, vector bool) string {
	if len(pt) == 1 && !vector {
		return pt[0].RatString()
	}
	return "(" + ratJoin(pt, ", ") + ")"
}

// environment returns the values of the names for one joint design point:
// parameters and integrated inputs as variables, design inputs as numbers.
func (b *build) environment(c combo) map[string]*value {
	env := map[string]*value{}
	set := func(dc *decl, entry func(i, j int) string) {
		v := &value{shape: dc.shape}
		for i := range dc.shape.rows {
			for j := range dc.shape.cols {
				f := &frag{prec: 5} // a name, or a number in parentheses
				f.emit(entry(i, j), dc.pos)
				v.e = append(v.e, f)
			}
		}
		env[dc.name] = v
	}
	for _, p := range b.d.params {
		set(&p.decl, p.entryName)
	}
	for _, in := range b.d.inputs {
		if pt, ok := c.values[in.name]; ok {
			set(&in.decl, func(i, _ int) string { return ratText(pt[i]) })
		} else {
			set(&in.decl, in.entryName)
		}
	}
	return env
}

// evalAll evaluates expressions in env and returns their entries, in
// order (a matrix row by row).
func (b *build) evalAll(env map[string]*value, exprs []*node) ([]*frag, error) {
	ev := &evaluator{src: b.d.src, env: env, budget: &b.budget}
	var out []*frag
	for _, n := range exprs {
		v, err := ev.run(n)
		if err != nil {
			return nil, err
		}
		out = append(out, v.e...)
	}
	return out, nil
}

// buildRegression builds K for the regression y = f(x; w) + ε with ε ~
// N(0, σ²·I) independent of x and σ² known:
//
//	K(w) = E_x[‖f(x; w) − f(x; w*)‖²]/(2σ²),
//
// the Kullback–Leibler divergence of the true conditional law from the
// model's, averaged over x (for two normal laws with one covariance σ²·I,
// KL = ‖m₁ − m₂‖²/(2σ²); common practice). It is computed exactly.
//
// Inputs with a design are substituted point by point (a weighted average
// over the design); the others are integrated out through their moments.
// Write D_n(x, w) = f_n(x; w) − f_n(x; w*) = Σ_α c_{n,α}(w)·x^α for each
// output n. Then E_x[D_n²] = c_nᵀ·M·c_n with the moment matrix M_{αβ} =
// E[x^(α+β)] over the monomials α that occur, and M = L·D·Lᵀ exactly (see
// ldl) gives
//
//	K(w) = Σ_j p_j Σ_n Σ_k (d_k/(2σ²))·(Σ_α L_{αk}·c_{jn,α}(w))²
//
// for design points j with weights p_j: a weighted sum of squares with
// positive rational weights, kept in that form. With standard normal
// inputs M is the identity on linear monomials, so f = B·A·x gives the
// generators (BA − B*A*)_{ni} with weight 1/(2σ²).
//
// When f is a series (it involves tanh, exp, …), it is expanded at the
// truth in the parameters and at 0 in the integrated inputs. Its expansion
// must determine every coefficient c_α(w) up to the order as a polynomial
// in x, or the expectation would not be a finite sum of moments; the
// expansion order in (w, x) is raised (to at most 4 times the order) until
// the remainder of the expansion leaves every term of w-degree up to the
// order exact. Then every term of the true K that differs from the computed
// one is a multiple of the w-part of a remainder monomial, which is passed
// on as the remainder of K. Only bounded inputs (uniform laws, designs) are
// allowed with a series: under a normal law E_x of a series in w whose
// coefficients grow with x need not converge, so K need not be analytic.
func buildRegression(b *build) error {
	d := b.d
	var designs, cont []*input
	var xvars []string
	for _, in := range d.inputs {
		if in.law.kind == lawDesign {
			designs = append(designs, in)
			continue
		}
		cont = append(cont, in)
		for i := range in.shape.rows {
			xvars = append(xvars, in.entryName(i, 0))
		}
	}
	combos, err := designCombos(d.src, designs)
	if err != nil {
		return err
	}
	// The texts to expand: every output at every joint design point.
	var pieces []piece
	var where []string
	outputs := 0
	for _, c := range combos {
		if err := b.stopped(); err != nil {
			return err
		}
		fs, err := b.evalAll(b.environment(c), d.means)
		if err != nil {
			return err
		}
		outputs = len(fs)
		for n, f := range fs {
			ctx := ""
			if c.label != "" {
				ctx = "at the design point " + c.label + ": "
			}
			pieces = append(pieces, piece{f: f, context: ctx})
			w := fmt.Sprintf("output %d", n+1)
			if c.label != "" {
				w += " at " + c.label
			}
			where = append(where, w)
		}
	}
	nw := len(b.vars)
	exs, err := b.expandAll(pieces, xvars, b.order)
	if err != nil {
		return err
	}
	if b.series && len(cont) > 0 {
		for _, in := range cont {
			if in.law.kind != lawUniform {
				return errorAt(d.src, in.law.pos, "the mean is a series in the parameters, and under a %s law its expectation need not converge; give the input a bounded law (uniform or a design), or a polynomial mean", lawName(in.law.kind))
			}
		}
		// Raise the joint order until every term of w-degree up to the
		// order is exact.
		for joint := b.order; ; {
			if low, _ := lowestW(exs, nw); low > b.order || joint >= 4*b.order || joint >= monomial.DefaultMaxOrder {
				break
			}
			joint = min(joint+b.order, 4*b.order, monomial.DefaultMaxOrder)
			if exs, err = b.expandAll(pieces, xvars, joint); err != nil {
				return err
			}
		}
		if low, k := lowestW(exs, nw); low == 0 {
			return errorAt(d.src, pieces[k].f.marks[0].src, "%sthe expansion of the mean in the inputs does not end: some coefficient in the parameters is not a polynomial in %s, so its expectation is no finite sum of moments (terms without parameters cancel in K: leave them out of the mean)", pieces[k].context, strings.Join(xvars, ", "))
		}
	}

	// Coefficients c_{jn,α}(w) − c_{jn,α}(w*), and the remainder.
	type coefs struct {
		alphas []monomial.Exponent
		c      []*monomial.Poly
	}
	all := make([]coefs, len(exs))
	basis := map[string]int{}
	var alphas []monomial.Exponent
	at := b.at(0)
	for k, ex := range exs {
		as, cs := split(ex.Poly, nw, b.vars)
		for i, c := range cs {
			c0 := c.Eval(at)
			if !b.series {
				for t := 1; t < len(b.points); t++ {
					if c.Eval(b.points[t]).Cmp(c0) != 0 {
						return errorAt(d.src, d.truths[t].pos, "this truth gives another regression function than the first (%s differs): the truths of one description must be points of one true distribution", where[k])
					}
				}
			}
			cs[i] = c.Sub(monomial.Constant(b.vars, c0))
			key := fmt.Sprint([]int(as[i]))
			if _, ok := basis[key]; !ok && !cs[i].IsZero() {
				basis[key] = -1
				alphas = append(alphas, as[i])
			}
		}
		all[k] = coefs{as, cs}
		for _, r := range ex.Remainder {
			b.addRemainder([]monomial.Exponent{slices.Clone(r[:nw])})
		}
	}
	// Order the basis by degree, then x_1 before x_2, and factor its
	// moment matrix.
	slices.SortFunc(alphas, func(a, c monomial.Exponent) int {
		if n := a.Degree() - c.Degree(); n != 0 {
			return n
		}
		return -slices.Compare(a, c)
	})
	if len(alphas) > maxBasis {
		return errorAt(d.src, d.means[0].start(), "the mean needs %d monomials of the integrated inputs, more than %d: their moment matrix would be too large", len(alphas), maxBasis)
	}
	if err := b.stopped(); err != nil {
		return err
	}
	for i, a := range alphas {
		basis[fmt.Sprint([]int(a))] = i
	}
	mom := newMoments(d.src, cont)
	gram := make([][]*big.Rat, len(alphas))
	sum := make([]int, len(xvars))
	for i, a := range alphas {
		gram[i] = make([]*big.Rat, len(alphas))
		for j, c := range alphas {
			for k := range sum {
				sum[k] = a[k] + c[k]
			}
			v, err := mom.of(sum)
			if err != nil {
				return err
			}
			gram[i][j] = v
		}
	}
	l, dd, ok := ldl(gram)
	if !ok {
		return errorAt(d.src, cont[0].law.pos, "these moments are not those of a probability law: the moment matrix of the monomials the mean needs is not positive semidefinite")
	}
	twoVar := new(big.Rat).Mul(big.NewRat(2, 1), d.noise)
	for k := range all {
		j := k / max(outputs, 1)
		vec := make([]*monomial.Poly, len(alphas))
		for i, a := range all[k].alphas {
			if idx, ok := basis[fmt.Sprint([]int(a))]; ok && idx >= 0 {
				vec[idx] = all[k].c[i]
			}
		}
		for col := range alphas {
			if dd[col].Sign() == 0 {
				continue
			}
			g := monomial.Zero(b.vars)
			for row := col; row < len(alphas); row++ {
				if vec[row] != nil && l[row][col].Sign() != 0 {
					g = g.Add(vec[row].Scale(l[row][col]))
				}
			}
			w := new(big.Rat).Mul(combos[j].weight, dd[col])
			w.Quo(w, twoVar)
			label := where[k]
			if len(alphas) > 1 || len(xvars) > 0 {
				label += ", along " + monomial.Monomial(xvars, alphas[col], big.NewRat(1, 1)).String()
			}
			b.addGenerator(g, w, label)
		}
	}
	kind := "exactly, as a weighted sum of squares"
	if b.remAll {
		kind = fmt.Sprintf("exactly up to degree %d in the offsets from the truth, with the remainder of the series", b.order)
	}
	b.m.What = fmt.Sprintf("K(w) = E_x‖f(x; w) − f(x; w*)‖²/(2σ²) with σ² = %s, computed %s", d.noise.RatString(), kind)
	return nil
}

// lowestW returns the least total degree in the parameters (the first nw
// variables) of the remainder monomials of the expansions, with the index
// of an expansion that attains it; it is larger than any order when no
// expansion was truncated.
func lowestW(exs []*monomial.Expansion, nw int) (low, at int) {
	low = int(^uint(0) >> 1)
	for k, ex := range exs {
		for _, r := range ex.Remainder {
			if n := monomial.Exponent(r[:nw]).Degree(); n < low {
				low, at = n, k
			}
		}
	}
	return low, at
}

// lawName names a law's kind in messages.
func lawName(k lawKind) string {
	return map[lawKind]string{lawNormal: "normal", lawUniform: "uniform", lawDesign: "design", lawMoments: "moment-table"}[k]
}
