package model

import (
	"math/big"

	"github.com/lctkit/lctkit/monomial"
)

// check verifies that a description read without syntax errors is complete
// and consistent: a kind with the parts it needs and nothing it cannot
// use, names declared once, truths that fit the declarations, and
// expressions whose names are declared and whose shapes fit.
func (d *Description) check() *Error {
	src := d.src
	if d.kind == "" {
		return errorAt(src, 0, "the description has no kind statement (kind regression, kind discrete or kind mixture)")
	}
	at := d.kindPos
	if len(d.params) == 0 {
		return errorAt(src, at, "the model has no parameters (declare them with param)")
	}
	// Parts the kind needs, and parts it cannot use.
	switch d.kind {
	case Regression:
		switch {
		case d.noise == nil:
			return errorAt(src, at, "a regression needs its noise variance (noise σ², a positive rational)")
		case len(d.means) == 0:
			return errorAt(src, at, "a regression needs its mean function (mean EXPR)")
		case len(d.cats) > 0:
			return errorAt(src, d.cats[0].pos, "category is for discrete models, and this one is a regression")
		case len(d.comps) > 0:
			return errorAt(src, d.comps[0].pos, "component is for mixtures, and this model is a regression")
		}
	case Discrete:
		switch {
		case len(d.cats) == 0:
			return errorAt(src, at, "a discrete model needs its categories (category NAME = EXPR)")
		case d.noise != nil:
			return errorAt(src, d.noisePos, "noise is for regressions, and this model is discrete")
		case len(d.means) > 0:
			return errorAt(src, d.means[0].pos, "mean is for regressions, and this model is discrete (give category probabilities)")
		case len(d.comps) > 0:
			return errorAt(src, d.comps[0].pos, "component is for mixtures, and this model is discrete")
		}
		for _, in := range d.inputs {
			if in.law.kind != lawDesign {
				return errorAt(src, in.law.pos, "the input of a discrete model takes finitely many values: give it a design { value: weight, … }")
			}
		}
	case Mixture:
		switch {
		case len(d.comps) == 0:
			return errorAt(src, at, "a mixture needs its components (component poisson(EXPR) weight EXPR, …)")
		case d.noise != nil:
			return errorAt(src, d.noisePos, "noise is for regressions, and this model is a mixture")
		case len(d.means) > 0:
			return errorAt(src, d.means[0].pos, "mean is for regressions, and this model is a mixture")
		case len(d.cats) > 0:
			return errorAt(src, d.cats[0].pos, "category is for discrete models, and this model is a mixture")
		case len(d.inputs) > 0:
			return errorAt(src, d.inputs[0].pos, "a mixture has no inputs")
		}
		family := func(c *component) string {
			if c.family == "bernoulli" {
				return "binomial" // with one trial
			}
			return c.family
		}
		for _, c := range d.comps[1:] {
			if family(c) != family(d.comps[0]) || c.trials != d.comps[0].trials {
				return errorAt(src, c.pos, "the components of a mixture must come from one family, and this one differs from the first")
			}
		}
	}

	// Names: declared once, and their entries' variable names distinct.
	declared := map[string]int{}
	entries := map[string]string{} // variable name → the entry it names
	addEntries := func(dc *decl) *Error {
		if o, ok := declared[dc.name]; ok {
			return errorAt(src, dc.pos, "%s is declared twice (first at %s)", dc.name, posString(src, o))
		}
		declared[dc.name] = dc.pos
		for i := range dc.shape.rows {
			for j := range dc.shape.cols {
				n, label := dc.entryName(i, j), dc.entryLabel(i, j)
				if o, ok := entries[n]; ok {
					return errorAt(src, dc.pos, "the entry %s would have the same variable name %s as %s; rename one of them", label, n, o)
				}
				entries[n] = label
			}
		}
		return nil
	}
	total := 0
	for _, p := range d.params {
		if err := addEntries(&p.decl); err != nil {
			return err
		}
		if total += p.shape.size(); total > monomial.DefaultMaxVars {
			return errorAt(src, p.pos, "the parameters have more than %d entries", monomial.DefaultMaxVars)
		}
	}
	for _, in := range d.inputs {
		if err := addEntries(&in.decl); err != nil {
			return err
		}
		if total += in.shape.size(); total > monomial.DefaultMaxVars {
			return errorAt(src, in.pos, "the parameters and inputs have more than %d entries", monomial.DefaultMaxVars)
		}
		if in.law.kind == lawMoments {
			if err := in.law.checkMoments(src, in); err != nil {
				return err
			}
		}
	}

	// Truths fit the declarations.
	params := map[string]*param{}
	for _, p := range d.params {
		params[p.name] = p
	}
	for _, t := range d.truths {
		for _, b := range t.bindings {
			p, ok := params[b.name]
			if !ok {
				if _, isInput := declared[b.name]; isInput {
					return errorAt(src, b.pos, "%s is an input, not a parameter; a truth sets parameters", b.name)
				}
				return errorAt(src, b.pos, "unknown parameter %s", b.name)
			}
			if b.one != nil {
				continue
			}
			s := p.shape
			fits := b.shape.rows == s.rows && b.shape.cols == s.cols ||
				s.vector && b.shape.rows == 1 && b.shape.cols == s.rows
			if !fits {
				return errorAt(src, b.pos, "%s is declared %s, and its true value is %s", b.name, shapeWords(s), shapeWords(b.shape))
			}
		}
	}

	// Expressions: names and shapes.
	ev := &evaluator{src: src, env: map[string]*value{}, shapes: true}
	for _, p := range d.params {
		ev.env[p.name] = &value{shape: p.shape}
	}
	for _, in := range d.inputs {
		ev.env[in.name] = &value{shape: in.shape}
	}
	for _, m := range d.means {
		if _, err := ev.run(m); err != nil {
			return err
		}
	}
	for _, c := range d.cats {
		v, err := ev.run(c.expr)
		if err != nil {
			return err
		}
		if v.shape.rows != 1 && v.shape.cols != 1 {
			return errorAt(src, c.pos, "a category's probability is a scalar or a vector of them, and this one is %s", shapeWords(v.shape))
		}
	}
	for _, c := range d.comps {
		for _, n := range []*node{c.arg, c.weight} {
			v, err := ev.run(n)
			if err != nil {
				return err
			}
			if !scalar(v) {
				return errorAt(src, n.pos, "a component's parameter and weight are scalars, and this is %s", shapeWords(v.shape))
			}
		}
	}
	return nil
}

// posString writes offset off of src as "line:col".
func posString(src string, off int) string {
	l, c := position(src, off)
	return itoa(l) + ":" + itoa(c)
}

// checkMoments checks a moment table: no exponent 0 other than the
// constant moment E[1] = 1.
func (l *law) checkMoments(src string, in *input) *Error {
	for k, pt := range l.points {
		zero := true
		for _, x := range pt {
			if x.Sign() != 0 {
				zero = false
			}
		}
		if zero && l.weights[k].Cmp(big.NewRat(1, 1)) != 0 {
			return errorAt(src, l.pointPos[k], "the moment E[1] of %s is 1, not %s", in.name, l.weights[k].RatString())
		}
	}
	return nil
}
