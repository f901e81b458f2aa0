package rlct

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// Status says how much a Result claims.
type Status string

const (
	// Exact means λ and θ are the learning coefficient and its multiplicity:
	// every compact face of the Newton polyhedron was certified
	// nondegenerate, and a truncated series was certified long enough.
	Exact Status = "exact"
	// UpperBound means (λ, θ) bounds the true pair from above in the order
	// where a smaller λ, or an equal λ with a larger θ, is smaller. Result.Reasons
	// says why nothing more is claimed.
	UpperBound Status = "upper-bound"
)

// Errors for input that has no learning coefficient to bound.
var (
	ErrZero        = errors.New("rlct: K is identically zero")
	ErrNotVanish   = errors.New("rlct: K does not vanish at the point")
	ErrNegative    = errors.New("rlct: K takes negative values near the point")
	ErrPrior       = errors.New("rlct: prior exponent must be greater than -1")
	ErrNoFunction  = errors.New("rlct: no function given (set K or Generators)")
	ErrTwoForms    = errors.New("rlct: give K or Generators, not both")
	ErrVariables   = errors.New("rlct: generators must share one variable list")
	ErrDimension   = errors.New("rlct: length does not match the number of variables")
	ErrNoVariables = errors.New("rlct: K has no variables")
	ErrShiftSeries = errors.New("rlct: K is a power series truncated around the origin; its truncation cannot be moved to another point (write K in variables shifted to the point)")
)

// Problem is one question: bound the learning coefficient of K at a point
// under a locally monomial prior.
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

	// Truncated reports that terms of total degree above Order were or may
	// have been dropped (see monomial.Expansion).
	Truncated bool

	// Prior holds h_i for a prior proportional to Π |w_i − w*_i|^{h_i} near the
	// point; nil means uniform. Each h_i must exceed −1.
	Prior []*big.Rat

	// Point is w*, nil for the origin.
	Point []*big.Rat
}

// Options tunes Bound. The zero value is ready to use.
type Options struct {
	// Limits bounds the enumeration of facets and faces (zero: defaults).
	Limits polyhedron.Limits

	// Context, if non-nil, lets the caller stop a long computation: Bound
	// checks it on entry (so BoundAt checks it between points) and before
	// each compact face it decides, and passes it to the Newton polyhedron
	// (its vertex tests and enumerations) when Limits.Context is nil (see
	// polyhedron.Limits). Once it is done, Bound returns an error wrapping
	// ctx.Err() instead of a partial answer. Parsing and expanding K
	// (Spec.Problem) and the distance LP do not check it.
	Context context.Context
}

// Result is the answer for one point.
type Result struct {
	// Lambda is 1/t_τ, the Newton value of the learning coefficient.
	Lambda *big.Rat
	// Theta is the codimension of the principal face.
	Theta int
	// Status is Exact or UpperBound.
	Status Status
	// Reasons says why the status is UpperBound (empty when Exact).
	Reasons []string
	// Distance is t_τ of the Newton polyhedron of K.
	Distance *big.Rat
	// Vars names the variables in order.
	Vars []string
	// Prior is h per variable as used (zeros for a uniform prior).
	Prior []*big.Rat
	// Weights is τ: τ_i = h_i + 1 where w*_i = 0, and 1 elsewhere.
	Weights []*big.Rat
	// Point is w*.
	Point []*big.Rat
	// Form is "polynomial" or "sum-of-squares".
	Form string
	// Principal is the face of P(K) holding t_τ·τ in its relative interior.
	Principal FaceReport
	// Faces has one entry per compact face of P(K), by dimension; nil when
	// the faces could not be enumerated (Reasons says so).
	Faces []FaceReport
	// Truncation is the check of a truncated series, nil when K is exact.
	Truncation *TruncationReport
	// Locals holds the answer at each point when several were given; the
	// fields above are then the minimum over them.
	Locals []*Result

	newton *polyhedron.Newton
	scale  int
}

// Newton returns the Newton polyhedron the result was computed from: P(K),
// or P(⟨g_1, …, g_r⟩) in sum-of-squares form, where P(K) is twice it (see
// Scale).
func (r *Result) Newton() *polyhedron.Newton { return r.newton }

// Scale is 1, or 2 in sum-of-squares form: P(K) = Scale·Newton().
func (r *Result) Scale() int { return r.scale }

// Bound computes the Newton-polyhedron value (λ, θ) of p at its point with a
// certificate: status Exact when K is nondegenerate over the reals on every
// compact face (Varchenko 1976), UpperBound otherwise, with the reasons.
func Bound(p *Problem, opt *Options) (*Result, error) {
	if opt == nil {
		opt = &Options{}
	}
	if err := stopped(opt.Context); err != nil {
		return nil, err
	}
	lim := opt.Limits
	if lim.Context == nil {
		lim.Context = opt.Context
	}
	vars, polys, err := p.forms()
	if err != nil {
		return nil, err
	}
	d := len(vars)
	prior := make([]*big.Rat, d)
	point := make([]*big.Rat, d)
	tau := make([]*big.Rat, d)
	if p.Prior != nil && len(p.Prior) != d {
		return nil, fmt.Errorf("%w: prior has %d entries for %d variables", ErrDimension, len(p.Prior), d)
	}
	if p.Point != nil && len(p.Point) != d {
		return nil, fmt.Errorf("%w: point has %d entries for %d variables", ErrDimension, len(p.Point), d)
	}
	minusOne := big.NewRat(-1, 1)
	for i := range d {
		prior[i], point[i] = new(big.Rat), new(big.Rat)
		if p.Prior != nil && p.Prior[i] != nil {
			if p.Prior[i].Cmp(minusOne) <= 0 {
				return nil, fmt.Errorf("%w: %s has exponent %s", ErrPrior, vars[i], p.Prior[i].RatString())
			}
			prior[i].Set(p.Prior[i])
		}
		if p.Point != nil && p.Point[i] != nil {
			point[i].Set(p.Point[i])
		}
		tau[i] = big.NewRat(1, 1)
		if point[i].Sign() == 0 {
			tau[i].Add(tau[i], prior[i])
		}
	}
	sos := p.Generators != nil
	if p.Truncated && !isOrigin(point) {
		return nil, ErrShiftSeries
	}
	if !isOrigin(point) {
		for i, q := range polys {
			polys[i] = q.Translate(point)
		}
	}
	if err := checkVanishing(polys, sos); err != nil {
		return nil, err
	}
	var support [][]int
	for _, q := range polys {
		for _, e := range q.Support() {
			support = append(support, []int(e))
		}
	}
	newton, err := polyhedron.NewWithLimits(d, support, lim)
	if err != nil {
		return nil, err
	}
	res := &Result{Vars: vars, Prior: prior, Weights: tau, Point: point, newton: newton, scale: 1, Form: "polynomial"}
	if sos {
		res.scale, res.Form = 2, "sum-of-squares"
	}
	an := &analysis{res: res, polys: polys, sos: sos, vars: vars, ctx: opt.Context}
	if !sos {
		if err := an.checkVertices(); err != nil {
			return nil, err
		}
	}
	hit, err := newton.Distance(tau)
	if err != nil {
		return nil, err
	}
	res.Distance = new(big.Rat).Mul(hit.T, big.NewRat(int64(res.scale), 1))
	res.Lambda = new(big.Rat).Inv(res.Distance)
	res.Theta = hit.Face.Codim(d)
	res.Principal = an.report(hit.Face, nil)
	res.Principal.Principal = true

	lattice, lerr := newton.CompactFaces()
	if isStop(lerr) {
		return nil, lerr
	}
	if lerr != nil {
		res.Reasons = append(res.Reasons, fmt.Sprintf("the compact faces could not be enumerated (%v), so nondegeneracy was not checked", lerr))
	} else {
		if err := an.checkFaces(lattice, hit.Face); err != nil {
			return nil, err
		}
	}
	if p.Truncated {
		var facets []polyhedron.Facet
		if lerr == nil {
			facets, lerr = newton.Facets()
		}
		res.Truncation = an.checkTruncation(p.Order, hit.Face, facets, lattice, lerr)
	}
	res.Status = Exact
	if len(res.Reasons) > 0 {
		res.Status = UpperBound
	}
	return res, nil
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
			if g == nil || !sameVars(vars, g.Vars()) {
				return nil, nil, fmt.Errorf("%w (generator %d)", ErrVariables, i+1)
			}
			out[i] = g
		}
		return vars, out, nil
	}
	return nil, nil, ErrNoFunction
}

// checkVanishing checks that K (or every generator) is zero at the point,
// after translation to it, and drops zero generators.
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

func sameVars(a, b []string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// Less reports whether a is smaller than b in the order of learning
// coefficients: a smaller λ, or an equal λ with a larger θ. The smaller pair
// dominates the marginal likelihood asymptotically.
func Less(a, b *Result) bool {
	if c := a.Lambda.Cmp(b.Lambda); c != 0 {
		return c < 0
	}
	return a.Theta > b.Theta
}

// BoundAt bounds the learning coefficient at each of several points and
// returns the minimum (in the order of Less) with every local answer in
// Locals. The minimum is Exact only when every local answer is. p.Point is
// ignored.
func BoundAt(p *Problem, points [][]*big.Rat, opt *Options) (*Result, error) {
	if len(points) == 0 {
		return Bound(p, opt)
	}
	var locals []*Result
	for i, w := range points {
		q := *p
		q.Point = w
		r, err := Bound(&q, opt)
		if err != nil {
			if len(points) > 1 {
				return nil, fmt.Errorf("point %d: %w", i+1, err)
			}
			return nil, err
		}
		locals = append(locals, r)
	}
	if len(locals) == 1 {
		return locals[0], nil
	}
	best := locals[0]
	for _, r := range locals[1:] {
		if Less(r, best) {
			best = r
		}
	}
	out := *best
	out.Locals = locals
	out.Reasons = append([]string(nil), best.Reasons...)
	for i, r := range locals {
		if r.Status != Exact && r != best {
			out.Reasons = append(out.Reasons, fmt.Sprintf("point %d gives only an upper bound, so the true minimum may lie there", i+1))
		}
	}
	out.Status = Exact
	if len(out.Reasons) > 0 {
		out.Status = UpperBound
	}
	return &out, nil
}

// formatRoot renders an isolated root: the exact rational, or its interval.
func formatRoot(iv interval) string {
	if iv.exact() {
		return iv.Lo.RatString()
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	return fmt.Sprintf("≈%s in (%s, %s]", mid.FloatString(9), iv.Lo.RatString(), iv.Hi.RatString())
}

// joinNames joins variable names picked by index.
func joinNames(vars []string, idx []int) string {
	names := make([]string, len(idx))
	for i, j := range idx {
		names[i] = vars[j]
	}
	return strings.Join(names, ",")
}
