// Numerical estimates for an rlct.Problem: K translated to the point
// exactly, then compiled to float64 for Run.

package estimate

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// unitRoundOff is u = 2^−53, the unit round-off of float64.
const unitRoundOff = 0x1p-53

// ProblemEvaluator is the float64 evaluator of K for an rlct.Problem at its
// point, in the translated coordinates (offsets from the point) that Options
// uses. It is built by NewProblemEvaluator.
type ProblemEvaluator struct {
	// Vars names the variables, in the order Eval expects them.
	Vars []string

	// Polys holds K translated to the point, or in sum-of-squares form the
	// translated generators g_i, all exact.
	Polys []*monomial.Poly

	// SumOfSquares reports that Eval returns Σ g_i(w)² from Polys
	// evaluated one by one (never negative), rather than K itself.
	SumOfSquares bool

	compiled []*monomial.Compiled
}

// ErrSeveralPoints is returned for a problem with more than one point: an
// estimate studies one point at a time.
var ErrSeveralPoints = errors.New("estimate: the problem has several points; estimate one point at a time")

// NewProblemEvaluator takes K (or each generator) of p at its point as
// rlct.Problem.Locals translates it, exactly, and compiles the result. In
// sum-of-squares form nothing is expanded: Eval squares and adds the
// generators' values, which keeps K ≥ 0 and its relative accuracy near the
// zero set. A series truncated around the origin (p.Truncated) is evaluated
// as the truncated polynomial, a proxy for the full function. It returns
// the errors of rlct.Problem.Locals for a malformed problem (the same as
// rlct.Bound gives), and ErrSeveralPoints when p has more than one point.
func NewProblemEvaluator(p *rlct.Problem) (*ProblemEvaluator, error) {
	l, err := local(p)
	if err != nil {
		return nil, err
	}
	ev := &ProblemEvaluator{Vars: l.Vars, Polys: l.Polys, SumOfSquares: l.SumOfSquares}
	for _, q := range l.Polys {
		ev.compiled = append(ev.compiled, q.Compile())
	}
	return ev, nil
}

// local returns p at its one point.
func local(p *rlct.Problem) (*rlct.Local, error) {
	locals, err := p.Locals()
	if err != nil {
		return nil, err
	}
	if len(locals) > 1 {
		return nil, fmt.Errorf("%w (%d points)", ErrSeveralPoints, len(locals))
	}
	return locals[0], nil
}

// NumVars returns the number of variables.
func (ev *ProblemEvaluator) NumVars() int { return len(ev.Vars) }

// Eval returns K at the offsets w from the point, in float64 arithmetic. It
// is safe for concurrent use and panics if len(w) != NumVars.
func (ev *ProblemEvaluator) Eval(w []float64) float64 {
	if !ev.SumOfSquares {
		return ev.compiled[0].Eval(w)
	}
	var sum float64
	for _, g := range ev.compiled {
		v := g.Eval(w)
		sum += v * v
	}
	return sum
}

// RoundOff returns an estimate of the absolute rounding error of Eval near
// the zero set of K over the box [lower, upper] (offsets from the point),
// for Options.RoundOff.
//
// A polynomial q = Σ c_t·w^(e_t) with T terms and degree D is summed term by
// term; its error is estimated as δ(q) = (D + 2 + √T)·u·S with u = 2^−53 and
// S = Σ|c_t|·∏ m_i^(e_ti), m_i = max(|lower_i|, |upper_i|), the largest sum of
// the absolute values of the terms on the box. The √T growth of a sum of T
// rounding errors is the usual statistical rule of thumb, not a worst-case
// bound (Higham 2002, Accuracy and Stability of Numerical Algorithms, 2nd
// ed., SIAM, section 2.8; from memory). A polynomial whose terms all have
// positive coefficients and even exponents has no cancellation and is never
// negative, so its estimate is 0.
//
// In sum-of-squares form K = Σ g_i² is computed from the generators' values,
// so it is never negative; near the zero set the computed K is reliable down
// to about Σ δ(g_i)², which is returned: Run then refuses a grid
// of n that would need K resolved below 100 times that.
//
// It panics if the box does not have NumVars entries.
func (ev *ProblemEvaluator) RoundOff(lower, upper []float64) float64 {
	if len(lower) != len(ev.Vars) || len(upper) != len(ev.Vars) {
		panic(fmt.Sprintf("estimate: RoundOff: box has %d and %d entries for %d variables", len(lower), len(upper), len(ev.Vars)))
	}
	m := make([]float64, len(lower))
	for i := range m {
		m[i] = math.Max(math.Abs(lower[i]), math.Abs(upper[i]))
	}
	if !ev.SumOfSquares {
		if cancellationFree(ev.Polys[0]) {
			return 0
		}
		return roundOffOf(ev.Polys[0], m)
	}
	var sum float64
	for _, g := range ev.Polys {
		d := roundOffOf(g, m)
		sum += d * d
	}
	return sum
}

// roundOffOf returns δ(q) of ProblemEvaluator.RoundOff for the largest
// absolute values m of the variables.
func roundOffOf(q *monomial.Poly, m []float64) float64 {
	var s float64
	for e, c := range q.All() {
		f, _ := new(big.Rat).Abs(c).Float64()
		for i, k := range e {
			if k > 0 {
				f *= math.Pow(m[i], float64(k))
			}
		}
		s += f
	}
	return (float64(q.Degree()) + 2 + math.Sqrt(float64(q.Len()))) * unitRoundOff * s
}

// cancellationFree reports whether every term of q has a positive
// coefficient and even exponents, so that each term is ≥ 0 everywhere.
func cancellationFree(q *monomial.Poly) bool {
	for e, c := range q.All() {
		if c.Sign() < 0 {
			return false
		}
		for _, k := range e {
			if k%2 != 0 {
				return false
			}
		}
	}
	return true
}

// Problem estimates λ and θ of the problem p at its point by Run over the box
// opt.Lower, opt.Upper, given as offsets from the point. K comes from
// NewProblemEvaluator. When opt.Prior is nil it is taken from p.Prior the way
// rlct.Bound reads it (see Prior). When opt.RoundOff is 0 it is set to
// ProblemEvaluator.RoundOff of the box.
//
// The result is a numerical estimate with the caveats listed under Run, and
// for a truncated series (p.Truncated) it is an estimate for the truncated
// polynomial only. A *KValueError reports its point, and Result.OtherZeros
// their places, as offsets from the point. Besides the errors of Run and
// NewProblemEvaluator it returns rlct.ErrDimension for a box that does not
// match the variables and the errors of Prior.
func Problem(ctx context.Context, p *rlct.Problem, opt Options) (*Result, error) {
	ev, err := NewProblemEvaluator(p)
	if err != nil {
		return nil, err
	}
	d := ev.NumVars()
	if len(opt.Lower) != d || len(opt.Upper) != d {
		return nil, fmt.Errorf("%w: box has %d lower and %d upper bounds for %d variables", rlct.ErrDimension, len(opt.Lower), len(opt.Upper), d)
	}
	if opt.Prior == nil && p.Prior != nil {
		prior, err := Prior(p)
		if err != nil {
			return nil, err
		}
		opt.Prior = prior
	}
	if opt.RoundOff == 0 {
		opt.RoundOff = ev.RoundOff(opt.Lower, opt.Upper)
	}
	return Run(ctx, ev, opt)
}

// Prior returns the prior exponents Problem uses for p, in the translated
// coordinates: h_i from p.Prior where the point is 0, and 0 (uniform) where
// it is not, since there the prior factor |w_i|^(h_i) is smooth and
// positive near the point and does not change λ or θ: h_i = τ_i − 1 for the
// weights τ of rlct.Local, which rlct.Bound uses. It returns the errors of
// NewProblemEvaluator (rlct.ErrPrior for an exponent ≤ −1, rlct.ErrDimension
// for lengths that do not match the variables).
func Prior(p *rlct.Problem) ([]float64, error) {
	l, err := local(p)
	if err != nil {
		return nil, err
	}
	out := make([]float64, len(l.Vars))
	for i, h := range l.Prior {
		if l.Point[i].Sign() == 0 {
			out[i], _ = h.Float64()
		}
	}
	return out, nil
}
