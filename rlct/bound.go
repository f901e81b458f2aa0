package rlct

import (
	"context"
	"fmt"
	"math/big"

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

	// NoReduction turns off the splitting of regular directions (see
	// Reduction): the answer is then the Newton value of K itself.
	NoReduction bool

	// NoRepair turns off the repair of degenerate edges by changes of
	// coordinates (see Repair): with NoReduction as well, the answer is
	// the Newton value of K itself.
	NoRepair bool

	// AfterChanges makes Describe write out the polyhedron of the problem
	// after the last change of coordinates (see Description.After)
	// instead of that of K itself. Bound ignores it.
	AfterChanges bool
}

func (o *Options) maxFaces() int {
	if o.MaxFaces > 0 {
		return o.MaxFaces
	}
	return DefaultMaxFaces
}

// Result is the answer for one point, or for several (see Locals). It is
// its own JSON form: encoding/json writes it with the field names below,
// and exact numbers as strings in lowest terms ("3/4", "2"), so no value
// passes through a float.
type Result struct {
	// Lambda is 1/t_τ, the Newton value of the learning coefficient, or
	// with a Reduction r/2 + λ(core).
	Lambda *big.Rat `json:"lambda"`
	// Theta is the codimension of the principal face.
	Theta int `json:"theta"`
	// Status is Exact, UpperBound or Uncertified.
	Status Status `json:"status"`
	// Summary says in one sentence what the status claims, and for a value
	// that is not a bound, what would certify it.
	Summary string `json:"summary"`
	// Distance is t_τ of the Newton polyhedron of K (of K itself, also
	// with a Reduction, whose Core has the core's).
	Distance *big.Rat `json:"distance"`
	// Vars names the variables in order.
	Vars []string `json:"variables"`
	// Prior is h per variable as given (zeros for a uniform prior).
	Prior []*big.Rat `json:"prior"`
	// Weights is τ: τ_i = h_i + 1 where w*_i = 0, and 1 elsewhere (see
	// Problem.Prior).
	Weights []*big.Rat `json:"weights"`
	// Point is w*.
	Point []*big.Rat `json:"point"`
	// Form is "polynomial" or "sum-of-squares".
	Form string `json:"form"`
	// Reasons says why the status is not Exact (empty when it is).
	Reasons []string `json:"reasons,omitempty"`
	// Notes are remarks that change no value (see Local.Notes).
	Notes []string `json:"notes,omitempty"`
	// Principal is the face of P(K) holding t_τ·τ in its relative interior.
	Principal Face `json:"principal_face,omitzero"`
	// Certificate records how the faces were decided: how many could be
	// degenerate, how many were examined, and the faces that decided the
	// status. Nil when no face needed deciding because a truncated series
	// had already settled the status.
	Certificate *Certificate `json:"certificate,omitempty"`
	// Faces has one entry per compact face of P(K), by dimension, only
	// when Options.AllFaces was set and the faces could be enumerated.
	Faces []Face `json:"nondegeneracy,omitempty"`
	// Truncation is the check of a truncated series, nil when K is exact.
	Truncation *Truncation `json:"truncation,omitempty"`
	// Reduction, when not nil, is the splitting of regular directions at
	// the point that gave Lambda, Theta and Status (the fields that
	// describe the polyhedron above are those of K itself, and
	// Reduction.Unreduced has its Newton value).
	Reduction *Reduction `json:"reduction,omitempty"`
	// Repair, when not nil, is the sequence of coordinate changes along
	// degenerate edges that gave Lambda, Theta and Status (the fields
	// that describe the polyhedron above are those of K itself, and
	// Repair.Unrepaired has its Newton value).
	Repair *Repair `json:"repair,omitempty"`
	// LambdaCertified is set when λ itself is certified to be the learning
	// coefficient while θ is not (Status is then UpperBound: the true λ
	// equals Lambda and the true θ is at least Theta). It is false when
	// Status is Exact, which certifies both.
	LambdaCertified bool `json:"lambda_certified,omitempty"`
	// Changes lists every change of coordinates behind the answer, in the
	// order made (a reduction, then repair steps), in words a reader can
	// replay; Reduction and Repair hold the details.
	Changes []string `json:"changes,omitempty"`
	// Locals holds the answer at each point when several were given, in
	// the order of Problem.Points; the fields above are then those of the
	// minimum over them, except Status, Summary and Reasons, which are
	// those of the minimum as a bound on the learning coefficient of the
	// whole problem (see Bound).
	Locals []*Result `json:"locals,omitempty"`

	newton *polyhedron.Newton
	scale  int
	local  *Local // the problem this answer is the Newton value of
	// reductionBlocked says that a reduction was not tried because the
	// series was cut by a floor (see cutByFloor); Spec.Bound then expands
	// again without the floor.
	reductionBlocked bool
}

// Bound computes the Newton-polyhedron value (λ, θ) of p at each of its
// points with a certificate: status Exact when K is nondegenerate over the
// reals on every compact face (Varchenko 1976), UpperBound when the value is
// only certified to bound the truth, Uncertified when even that is unknown
// (a truncated series); Result.Reasons says why.
//
// With one point (or none: the origin) the result is the answer there.
// With several it is the minimum over them in the order of Less, with every
// point's answer in Locals, since the learning coefficient of the model is
// the minimum over the points of the true set. The minimum is Exact only
// when every point's answer is; it is an UpperBound when the point that
// attains it is certified (Exact or UpperBound there), since the true
// minimum is at most the true value there; otherwise it is Uncertified.
//
// Bound returns the errors of Problem.Locals, and for each point ErrZero,
// ErrNotVanish or ErrNegative when K has no learning coefficient to bound
// there; with several points the error names the point. ctx (nil means
// context.Background()) stops the work: when it is cancelled, Bound returns
// an error wrapping ctx.Err(); when its deadline passes while faces are
// being examined, the search ends like a reached MaxFaces budget, with the
// value, status UpperBound and the reason.
func Bound(ctx context.Context, p *Problem, opt *Options) (*Result, error) {
	results, _, err := boundEach(ctx, p, opt)
	if err != nil {
		return nil, err
	}
	if len(results) == 1 {
		return results[0], nil
	}
	return minimum(results), nil
}

// boundEach bounds p at each of its points and returns the answers with
// the problem at each point.
func boundEach(ctx context.Context, p *Problem, opt *Options) ([]*Result, []*Local, error) {
	if ctx == nil {
		ctx = context.Background()
	}
	if opt == nil {
		opt = &Options{}
	}
	if err := stopped(ctx); err != nil {
		return nil, nil, err
	}
	locals, err := p.Locals()
	if err != nil {
		return nil, nil, err
	}
	results := make([]*Result, len(locals))
	for k, l := range locals {
		r, err := boundLocal(ctx, l, p.Order, p.Truncated, opt)
		if err != nil {
			return nil, nil, atPoint(k, len(locals), err)
		}
		results[k] = r
	}
	return results, locals, nil
}

// boundLocal bounds the problem at one point, through the reduction of
// reduce.go when it claims more; order and truncated are those of the
// Problem.
func boundLocal(ctx context.Context, l *Local, order int, truncated bool, opt *Options) (*Result, error) {
	res, err := boundPlain(ctx, l, order, truncated, opt)
	if err != nil {
		return nil, err
	}
	plain := res
	if !opt.NoReduction {
		if res, err = applyReduction(ctx, l, order, truncated, opt, res); err != nil {
			return nil, err
		}
	}
	if !opt.NoRepair {
		return applyRepair(ctx, l, truncated, opt, plain, res)
	}
	return res, nil
}

// boundPlain bounds the problem at one point by the Newton polyhedron of
// K itself.
func boundPlain(ctx context.Context, l *Local, order int, truncated bool, opt *Options) (*Result, error) {
	if err := checkVanishing(l.Polys, l.SumOfSquares); err != nil {
		return nil, err
	}
	d := len(l.Vars)
	var support [][]int
	for _, q := range l.Polys {
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
	res := &Result{Vars: l.Vars, Prior: l.Prior, Weights: l.Weights, Point: l.Point, Notes: l.Notes,
		newton: newton, scale: 1, Form: "polynomial", local: l}
	if l.SumOfSquares {
		res.scale, res.Form = 2, "sum-of-squares"
	}
	an := newAnalysis(res, l.Polys, l.SumOfSquares, opt)
	an.weights = l.GeneratorWeights
	hit, err := newton.Distance(ctx, l.Weights)
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
	if truncated {
		res.Truncation, err = an.checkTruncation(ctx, order, l.Remainder, hit)
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
	res.Summary = res.summary()
	return res, nil
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

// minimum returns the least of the answers at several points (in the order
// of Less, the first of equal ones) with every answer in Locals, and the
// status of the minimum as a bound on the whole problem (see Bound).
func minimum(locals []*Result) *Result {
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
	out.Summary = out.summary()
	return &out
}

// summary says in one sentence what the status of r claims, and for a
// value that is not a bound, what would certify it.
func (r *Result) summary() string {
	switch r.Status {
	case Exact:
		return "exact: λ and θ are the learning coefficient and its multiplicity, with a certificate"
	case UpperBound:
		if r.LambdaCertified {
			return "λ certified, θ not: λ is the learning coefficient, with a certificate; θ is only bounded (the true θ is at least this θ)"
		}
		return "upper bound: the true λ is at most this λ, and if they are equal the true θ is at least this θ (θ is ordered together with λ); this is not necessarily the learning coefficient"
	}
	tr := r.Truncation
	switch {
	case tr != nil && tr.BoundOrder >= 0:
		return fmt.Sprintf("not a bound: the value comes from a series truncated at degree %d whose omitted terms could change it, so it may lie below the true learning coefficient; truncating at degree %d or more would certify it as a bound, judging by the terms known now", tr.Order, tr.BoundOrder)
	case tr != nil && tr.Remainder:
		return fmt.Sprintf("not a bound: the value comes from a series truncated at degree %d whose omitted terms could change it, so it may lie below the true learning coefficient; the total degree names no order that would certify it, but a higher order may, since the omitted terms then have higher degree", tr.Order)
	case tr != nil:
		return fmt.Sprintf("not a bound: the value comes from a series truncated at degree %d whose omitted terms could change it at any order, so it may lie below the true learning coefficient; no truncation order certifies it (write K exactly, or in coordinates where every variable has weight at the principal face)", tr.Order)
	case len(r.Locals) > 0:
		return "not a bound: the minimum is attained at a point whose value is not certified (see the points), so it may lie below the true learning coefficient"
	}
	return "not a bound: the value is not certified, so it may lie below the true learning coefficient"
}
