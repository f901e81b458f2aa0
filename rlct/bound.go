package rlct

import (
	"context"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// Status says how much a Result claims. There are three, and only Exact and
// UpperBound make a claim about the true learning coefficient.
type Status string

const (
	// Exact means λ and θ are the learning coefficient and its multiplicity:
	// every compact face that could be degenerate was certified
	// nondegenerate (every other compact face is nondegenerate by its
	// terms alone), and a truncated series was certified long enough.
	Exact Status = "exact"
	// UpperBound means (λ, θ) is certified to bound the true pair from
	// above in the order where a smaller λ, or an equal λ with a larger θ,
	// is smaller (see Less): the true λ is at most this λ, and when the two
	// λ are equal the true θ is at least this θ. Result.Reasons says why
	// nothing more is claimed.
	UpperBound Status = "upper-bound"
	// Uncertified means the value is not known to bound the truth at all:
	// it is the Newton value of a truncated series whose omitted terms
	// could lower it (or change θ). It may lie below the true λ. Result.Reasons
	// and Result.Truncation say which order would certify it, or why none can.
	Uncertified Status = "uncertified"
)

// IsBound reports whether s certifies the pair as a bound on the true one
// (Exact or UpperBound).
func (s Status) IsBound() bool { return s == Exact || s == UpperBound }

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

	// Truncated reports that K (or a generator) differs from the true
	// function by a power series whose terms all have total degree above
	// Order (see monomial.Expansion).
	Truncated bool

	// Prior holds h_i for a prior density proportional to Π |w_i|^{h_i}
	// times a smooth positive function, written in the coordinates of K
	// (not in offsets from the point). At a point w*, the factor |w_i|^{h_i}
	// contributes the exponent h_i where w*_i = 0 and is smooth and
	// positive where w*_i ≠ 0, so it matters only in coordinates that
	// vanish at the point (see Result.Weights). nil means uniform. Each h_i
	// must exceed −1.
	Prior []*big.Rat

	// Point is w*, nil for the origin.
	Point []*big.Rat
}

// DefaultMaxFaces is the default of Options.MaxFaces.
const DefaultMaxFaces = 20000

// Options tunes Bound. The zero value is ready to use.
type Options struct {
	// Limits bounds the enumerations of the Newton polyhedron that the full
	// face list needs (see AllFaces); zero fields take the defaults, except
	// MaxFaces, which defaults to Options.MaxFaces there.
	Limits polyhedron.Limits

	// AllFaces asks for every compact face of P(K) to be decided and listed
	// in Result.Faces (the full per-face report, whose size can grow
	// exponentially with the number of variables). Without it Bound
	// examines only the faces that could be degenerate and stops once the
	// status is settled; the status is the same either way.
	AllFaces bool

	// MaxFaces bounds the number of compact faces the certificate
	// examines (and, with AllFaces, the size of the face list); 0 means
	// DefaultMaxFaces. When the bound is reached before the status is
	// settled, the status is UpperBound and the reason says so.
	MaxFaces int
}

func (o *Options) maxFaces() int {
	if o.MaxFaces > 0 {
		return o.MaxFaces
	}
	return DefaultMaxFaces
}

// Result is the answer for one point.
type Result struct {
	// Lambda is 1/t_τ, the Newton value of the learning coefficient.
	Lambda *big.Rat
	// Theta is the codimension of the principal face.
	Theta int
	// Status is Exact, UpperBound or Uncertified.
	Status Status
	// Reasons says why the status is not Exact (empty when it is).
	Reasons []string
	// Distance is t_τ of the Newton polyhedron of K.
	Distance *big.Rat
	// Vars names the variables in order.
	Vars []string
	// Prior is h per variable as given (zeros for a uniform prior).
	Prior []*big.Rat
	// Weights is τ: τ_i = h_i + 1 where w*_i = 0, and 1 elsewhere (see
	// Problem.Prior).
	Weights []*big.Rat
	// Point is w*.
	Point []*big.Rat
	// Form is "polynomial" or "sum-of-squares".
	Form string
	// Principal is the face of P(K) holding t_τ·τ in its relative interior.
	Principal FaceReport
	// Certificate records how the faces were decided: how many could be
	// degenerate, how many were examined, and the faces that decided the
	// status. Nil when no face needed deciding because a truncated series
	// had already settled the status.
	Certificate *Certificate
	// Faces has one entry per compact face of P(K), by dimension, only
	// when Options.AllFaces was set and the faces could be enumerated.
	Faces []FaceReport
	// Truncation is the check of a truncated series, nil when K is exact.
	Truncation *TruncationReport
	// Locals holds the answer at each point when several were given; the
	// fields above are then those of the minimum over them.
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
// compact face (Varchenko 1976), UpperBound when the value is only certified
// to bound the truth, Uncertified when even that is unknown (a truncated
// series); Result.Reasons says why.
//
// ctx (nil means context.Background()) stops the work: when it is
// cancelled, Bound returns an error wrapping ctx.Err(); when its deadline
// passes while faces are being examined, the search ends like a reached
// MaxFaces budget, with the value, status UpperBound and the reason.
func Bound(ctx context.Context, p *Problem, opt *Options) (*Result, error) {
	if ctx == nil {
		ctx = context.Background()
	}
	if opt == nil {
		opt = &Options{}
	}
	if err := stopped(ctx); err != nil {
		return nil, err
	}
	vars, polys, err := p.forms()
	if err != nil {
		return nil, err
	}
	d := len(vars)
	if p.Prior != nil && len(p.Prior) != d {
		return nil, fmt.Errorf("%w: prior has %d entries for %d variables", ErrDimension, len(p.Prior), d)
	}
	if p.Point != nil && len(p.Point) != d {
		return nil, fmt.Errorf("%w: point has %d entries for %d variables", ErrDimension, len(p.Point), d)
	}
	prior := make([]*big.Rat, d)
	point := make([]*big.Rat, d)
	tau := make([]*big.Rat, d)
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
		// The prior factor |w_i|^{h_i} is written in K's coordinates: at a
		// point with w*_i ≠ 0 it is smooth and positive (Problem.Prior).
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
	lim := opt.Limits
	if lim.MaxFaces == 0 {
		lim.MaxFaces = opt.maxFaces()
	}
	newton, err := polyhedron.NewWithLimits(d, support, lim)
	if err != nil {
		return nil, err
	}
	res := &Result{Vars: vars, Prior: prior, Weights: tau, Point: point, newton: newton, scale: 1, Form: "polynomial"}
	if sos {
		res.scale, res.Form = 2, "sum-of-squares"
	}
	an := newAnalysis(res, polys, sos, opt)
	hit, err := newton.Distance(ctx, tau)
	if err != nil {
		return nil, err
	}
	res.Distance = new(big.Rat).Mul(hit.T, big.NewRat(int64(res.scale), 1))
	res.Lambda = new(big.Rat).Inv(res.Distance)
	res.Theta = hit.Face.Codim(d)
	res.Principal = an.report(hit.Face, nil)
	res.Principal.Principal = true

	// A truncated series is checked first: when its omitted terms could
	// change the compact faces, no face verdict would carry over to the
	// full K, and the status is settled without deciding any face.
	facesCarryOver := true
	if p.Truncated {
		res.Truncation, err = an.checkTruncation(ctx, p.Order, hit)
		if err != nil {
			return nil, err
		}
		facesCarryOver = res.Truncation.Faces
	}
	if facesCarryOver {
		if err := an.certify(ctx, hit.Face); err != nil {
			return nil, err
		}
	}
	res.Status = Exact
	switch {
	case res.Truncation != nil && !res.Truncation.Principal:
		res.Status = Uncertified
	case len(res.Reasons) > 0:
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
// Locals; the learning coefficient of the model is the minimum over the
// points of the true set. The minimum is Exact only when every local answer
// is; it is an UpperBound when the point that attains it is certified
// (Exact or UpperBound there), since the true minimum is at most the true
// value there; otherwise it is Uncertified. p.Point is ignored.
func BoundAt(ctx context.Context, p *Problem, points [][]*big.Rat, opt *Options) (*Result, error) {
	if len(points) == 0 {
		return Bound(ctx, p, opt)
	}
	var locals []*Result
	for i, w := range points {
		q := *p
		q.Point = w
		r, err := Bound(ctx, &q, opt)
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
		if r == best {
			continue
		}
		switch r.Status {
		case UpperBound:
			out.Reasons = append(out.Reasons, fmt.Sprintf("point %d gives only an upper bound, so the true minimum may lie there", i+1))
		case Uncertified:
			out.Reasons = append(out.Reasons, fmt.Sprintf("point %d gives an uncertified value (not a bound), so the true minimum may lie there", i+1))
		}
	}
	switch {
	case best.Status == Uncertified:
		out.Status = Uncertified
	case len(out.Reasons) > 0:
		out.Status = UpperBound
	default:
		out.Status = Exact
	}
	return &out, nil
}

// Headline says in one sentence what the status of r claims, and for a
// value that is not a bound, what would certify it.
func (r *Result) Headline() string {
	switch r.Status {
	case Exact:
		return "exact: λ and θ are the learning coefficient and its multiplicity, with a certificate"
	case UpperBound:
		return "upper bound: the true λ is at most this λ, and if they are equal the true θ is at least this θ (θ is ordered together with λ); this is not necessarily the learning coefficient"
	}
	tr := r.Truncation
	switch {
	case tr != nil && tr.BoundOrder >= 0:
		return fmt.Sprintf("not a bound: the value comes from a series truncated at degree %d whose omitted terms could change it, so it may lie below the true learning coefficient; truncating at degree %d or more would certify it as a bound, judging by the terms known now", tr.Order, tr.BoundOrder)
	case tr != nil:
		return fmt.Sprintf("not a bound: the value comes from a series truncated at degree %d whose omitted terms could change it at any order, so it may lie below the true learning coefficient; no truncation order certifies it (write K exactly, or in coordinates where every variable has weight at the principal face)", tr.Order)
	case len(r.Locals) > 0:
		return "not a bound: the minimum is attained at a point whose value is not certified (see the points), so it may lie below the true learning coefficient"
	}
	return "not a bound: the value is not certified, so it may lie below the true learning coefficient"
}
