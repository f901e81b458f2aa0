package rlct

import (
	"fmt"
	"math/big"
	"slices"

	"github.com/lctkit/lctkit/monomial"
)

// Problem is one question: bound the learning coefficient of K at one or
// several points under a locally monomial prior. Bound answers it; Locals
// gives it checked and translated to each point.
type Problem struct {
	// K is the function, for example a Kullback–Leibler divergence, or a
	// function comparable to it near the point. Set K or Generators.
	K *monomial.Poly

	// Generators g_1, …, g_r stand for K = Σ g_i² (sum-of-squares form), or
	// for any K comparable to it. Then P(K) = 2·P(⟨g_1, …, g_r⟩), and nothing
	// is expanded. All generators must have the same variable list.
	Generators []*monomial.Poly

	// Order is the total degree at which K (or each generator) was
	// truncated when it came from a power series; 0 when exact.
	Order int

	// Truncated reports that K (or a generator) differs from the true
	// function by a power series whose terms all have total degree above
	// Order (see monomial.Expansion). Such a series is truncated around
	// the origin, so it can only be bounded there, unless it was expanded
	// at its point (Centered).
	Truncated bool

	// Prior holds h_i for a prior density proportional to Π |w_i|^{h_i}
	// times a smooth positive function, written in the coordinates of K
	// (not in offsets from the point). At a point w*, the factor |w_i|^{h_i}
	// contributes the exponent h_i where w*_i = 0 and is smooth and
	// positive where w*_i ≠ 0, so it matters only in coordinates that
	// vanish at the point (see Local.Weights; Local.Notes names the
	// exponents that do not count). nil means uniform; a nil entry is 0.
	// Each h_i must exceed −1.
	Prior []*big.Rat

	// Points lists the points w* at which to bound K, each with one entry
	// per variable (a nil entry is 0). nil or empty means the origin
	// alone. With several points Bound returns the minimum over them with
	// each point's answer (Result.Locals), since the learning coefficient
	// of a model is the least of the local ones over the true set.
	Points [][]*big.Rat

	// Centered reports that K (or each generator) is already written in
	// the offsets w − w* from the single point of Points, for instance a
	// series expanded there (monomial.Config.At; Spec does this for a
	// series at one point). It is not translated again: the point serves
	// the prior rule (see Prior) and the report. Points must then hold
	// exactly one point.
	Centered bool

	// Remainder, when Truncated is set, says more about the omitted terms
	// than their total degree: every term of the true function minus K (in
	// sum-of-squares form, of each true generator minus the given one, and
	// of every generator left out) is a multiple of w^r for some r in
	// Remainder, as monomial.Expansion.Remainder says of one expansion.
	// The exponents are in the variables of K (offsets from the point
	// when Centered, else exponents at the origin), in the coordinates of the polyhedron that is
	// built (P(K), or P(⟨g_1, …, g_r⟩) in sum-of-squares form), and each has
	// total degree above Order or strictly dominates (is ≥ in every
	// variable and differs from) an exponent of K, or in sum-of-squares
	// form of a generator: a series cut by the polyhedron
	// (monomial.Config.Floor) omits such terms at any degree. nil means
	// only the total degree is known. See Truncation for how it is used.
	Remainder []monomial.Exponent

	// GeneratorWeights, in sum-of-squares form, makes K = Σ c_i·g_i² with
	// rational weights c_i > 0, one per generator; nil means every c_i = 1.
	// The weights are used only to print K: its face polynomials and the
	// coefficients of its vertices. They change neither λ, θ nor the status,
	// because they change neither P(K) nor the zeros of any face polynomial
	// in the real torus: a vertex 2v of P(K) = 2·P(⟨g_1, …, g_r⟩) is the sum
	// of two exponents of the generators only as v + v (v is a vertex), so
	// its coefficient in K is Σ c_i·g_i(v)², positive with or without the
	// weights; and the face polynomial on a compact face σ is
	// Σ c_i·(g_i on σ)², which vanishes exactly where every g_i on σ does,
	// whatever the positive c_i (common practice).
	GeneratorWeights []*big.Rat
}

// Local is a Problem checked and translated to one of its points: what
// Bound analyses there, and what a numerical estimate evaluates.
type Local struct {
	// Vars names the variables in order.
	Vars []string
	// Point is w*, with every entry set.
	Point []*big.Rat
	// Polys holds K, or in sum-of-squares form the generators, as
	// polynomials in the offsets w − w* from the point (under the same
	// variable names).
	Polys []*monomial.Poly
	// SumOfSquares reports that Polys are the generators of K = Σ g_i².
	SumOfSquares bool
	// Prior is h per variable as given (zeros for a uniform prior).
	Prior []*big.Rat
	// Weights is τ: τ_i = h_i + 1 where w*_i = 0, and 1 elsewhere, where
	// the prior factor |w_i|^{h_i} is smooth and positive near the point.
	Weights []*big.Rat
	// Notes are remarks on the problem at this point that change no
	// value: a prior exponent given for a coordinate that is not 0 at the
	// point, which therefore does not count there.
	Notes []string
	// GeneratorWeights and Remainder are those of the Problem.
	GeneratorWeights []*big.Rat
	Remainder        []monomial.Exponent
}

// Locals checks p and returns it at each of its points, in order (one
// Local at the origin when p.Points is empty). It returns ErrTwoForms,
// ErrNoFunction, ErrNoVariables or ErrVariables for a malformed function,
// ErrDimension for a prior or a point whose length does not match the
// variables or a remainder monomial that does not fit, ErrWeights for
// generator weights that are not one positive rational per generator,
// ErrPrior for an exponent ≤ −1, and ErrShiftSeries for a
// truncated series at a point other than the origin; with several points
// the error names the point ("point 2: …").
func (p *Problem) Locals() ([]*Local, error) {
	vars, polys, err := p.forms()
	if err != nil {
		return nil, err
	}
	d := len(vars)
	if err := p.checkExtras(d); err != nil {
		return nil, err
	}
	if p.Prior != nil && len(p.Prior) != d {
		return nil, fmt.Errorf("%w: prior has %d entries for %d variables", ErrDimension, len(p.Prior), d)
	}
	prior := make([]*big.Rat, d)
	minusOne := big.NewRat(-1, 1)
	for i := range d {
		prior[i] = new(big.Rat)
		if p.Prior != nil && p.Prior[i] != nil {
			if p.Prior[i].Cmp(minusOne) <= 0 {
				return nil, fmt.Errorf("%w: %s has exponent %s", ErrPrior, vars[i], p.Prior[i].RatString())
			}
			prior[i].Set(p.Prior[i])
		}
	}
	points := p.Points
	if len(points) == 0 {
		points = [][]*big.Rat{nil}
	}
	if p.Centered && len(p.Points) != 1 {
		return nil, fmt.Errorf("%w: a centered problem has exactly one point, not %d", ErrDimension, len(p.Points))
	}
	out := make([]*Local, len(points))
	for k, w := range points {
		l, err := local(vars, polys, p.Generators != nil, prior, w, p.Truncated, p.Centered)
		if err != nil {
			return nil, atPoint(k, len(points), err)
		}
		l.GeneratorWeights, l.Remainder = p.GeneratorWeights, p.Remainder
		out[k] = l
	}
	return out, nil
}

// local builds the problem at the point w (nil: the origin).
func local(vars []string, polys []*monomial.Poly, sos bool, prior, w []*big.Rat, truncated, centered bool) (*Local, error) {
	d := len(vars)
	if w != nil && len(w) != d {
		return nil, fmt.Errorf("%w: point has %d entries for %d variables", ErrDimension, len(w), d)
	}
	l := &Local{Vars: vars, SumOfSquares: sos, Prior: make([]*big.Rat, d), Point: make([]*big.Rat, d), Weights: make([]*big.Rat, d)}
	for i := range d {
		l.Prior[i] = new(big.Rat).Set(prior[i]) // each point's own copy
		l.Point[i] = new(big.Rat)
		if w != nil && w[i] != nil {
			l.Point[i].Set(w[i])
		}
		l.Weights[i] = big.NewRat(1, 1)
		switch {
		case l.Point[i].Sign() == 0:
			l.Weights[i].Add(l.Weights[i], prior[i])
		case prior[i].Sign() != 0:
			l.Notes = append(l.Notes, fmt.Sprintf(
				"the prior exponent %s of %s does not count at this point: %s = %s there, not 0, so |%s|^%s is smooth and positive near the point and changes neither λ nor θ",
				prior[i].RatString(), vars[i], vars[i], l.Point[i].RatString(), vars[i], prior[i].RatString()))
		}
	}
	l.Polys = polys
	if !isOrigin(l.Point) && !centered {
		if truncated {
			return nil, ErrShiftSeries
		}
		l.Polys = make([]*monomial.Poly, len(polys))
		for i, q := range polys {
			l.Polys[i] = q.Translate(l.Point)
		}
	}
	return l, nil
}

// atPoint names point k (from 0) of n in err when there are several.
func atPoint(k, n int, err error) error {
	if n > 1 {
		return fmt.Errorf("point %d: %w", k+1, err)
	}
	return err
}

// forms returns the variables and the polynomials to analyse (K alone, or
// the generators), checking the shape of the problem.
func (p *Problem) forms() ([]string, []*monomial.Poly, error) {
	switch {
	case p.K != nil && p.Generators != nil:
		return nil, nil, ErrTwoForms
	case p.K != nil:
		if p.K.NumVars() == 0 {
			return nil, nil, ErrNoVariables
		}
		return p.K.Vars(), []*monomial.Poly{p.K}, nil
	case len(p.Generators) > 0:
		vars := p.Generators[0].Vars()
		if len(vars) == 0 {
			return nil, nil, ErrNoVariables
		}
		out := make([]*monomial.Poly, len(p.Generators))
		for i, g := range p.Generators {
			if g == nil || !slices.Equal(vars, g.Vars()) {
				return nil, nil, fmt.Errorf("%w (generator %d)", ErrVariables, i+1)
			}
			out[i] = g
		}
		return vars, out, nil
	}
	return nil, nil, ErrNoFunction
}

// checkVanishing checks that K (or every generator) is zero at the point,
// after translation to it.
func checkVanishing(polys []*monomial.Poly, sos bool) error {
	allZero := true
	for i, q := range polys {
		if q.IsZero() {
			continue
		}
		allZero = false
		zero := make(monomial.Exponent, q.NumVars())
		if c := q.Coefficient(zero); c.Sign() != 0 {
			if sos {
				return fmt.Errorf("%w: generator %d equals %s there", ErrNotVanish, i+1, c.RatString())
			}
			return fmt.Errorf("%w: K equals %s there", ErrNotVanish, c.RatString())
		}
	}
	if allZero {
		return ErrZero
	}
	return nil
}

func isOrigin(x []*big.Rat) bool {
	for _, v := range x {
		if v.Sign() != 0 {
			return false
		}
	}
	return true
}

// Vars returns the variables of p in order: those of K, or of the first
// generator; nil when p has no function.
func (p *Problem) Vars() []string {
	switch {
	case p.K != nil:
		return p.K.Vars()
	case len(p.Generators) > 0 && p.Generators[0] != nil:
		return p.Generators[0].Vars()
	}
	return nil
}
