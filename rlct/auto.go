package rlct

import (
	"context"
	"errors"
	"fmt"
	"slices"

	"github.com/lctkit/lctkit/monomial"
)

// OrderAuto as Spec.Order asks Spec.Bound to choose the truncation order
// of the power series in K (see Spec.Bound).
const OrderAuto = -1

// Orders tried by Spec.Bound with OrderAuto: from autoFirstOrder up to
// MaxAutoOrder.
const (
	autoFirstOrder = 4
	// MaxAutoOrder is the highest truncation order Spec.Bound tries with
	// OrderAuto.
	MaxAutoOrder = 24
)

// Bound parses s and bounds the problem (see Problem and Bound); it
// returns the problem it bounded with the result.
//
// With s.Order == OrderAuto the truncation order of the power series in K
// is chosen: K is expanded at order 4, then at higher orders, until the
// omitted terms are certified not to change the answer (Truncation.Faces,
// so the status is decided as for a polynomial), the expansion reaches a
// limit of s.Limits, ctx is done, or the order reaches MaxAutoOrder. Each
// next order is the least order the truncation check names as needed
// (Truncation.NeededOrder) when that is higher, else two more. The result
// is that of the best order tried (certified before uncertified, then the
// highest order), and Result.Notes says which order was used and why the
// search stopped. A K without series is bounded once, exactly, whatever
// its size: it is parsed at order 0 first, and only an expression that
// needs a truncation order is expanded as a series.
//
// From the second order on, the expansion is cut by the Newton polyhedron
// of the order before (monomial.Config.Floor with the points of floorOf,
// which also says why that is sound): terms that strictly dominate a kept
// exponent of low degree are dropped as the expansion proceeds and covered
// by the remainder, so that high orders stay cheap. The cut series has the
// Newton polyhedron, compact faces and face polynomials of the full
// expansion at that order, so the same λ, θ and face verdicts; the
// truncation checks judge its remainder (a floored problem that the checks
// refuse, or whose reduction the cut prevents, is expanded again without
// the floor). The returned Problem may be the cut one, with fewer terms
// strictly inside the polyhedron; Spec.Problem at the returned Order gives
// the full expansion.
func (s *Spec) Bound(ctx context.Context, opt *Options) (*Problem, *Result, error) {
	if s.Order != OrderAuto {
		p, err := s.Problem()
		if err != nil {
			return nil, nil, err
		}
		res, err := Bound(ctx, p, opt)
		return p, res, err
	}
	// A K without series is bounded exactly, never truncated: only an
	// expression that needs an order (Setting "Order") goes on.
	exact := *s
	exact.Order = 0
	if p, err := exact.Problem(); err == nil {
		res, err := Bound(ctx, p, opt)
		return p, res, err
	} else if !needsOrder(err) {
		return nil, nil, err
	}
	var bestP *Problem
	var best *Result
	var floor [][]int
	stop := ""
	for order := autoFirstOrder; ; {
		at := *s
		at.Order = order
		p, res, err := at.boundFloored(ctx, floor, opt)
		if err != nil && errors.Is(err, errParse) {
			err = errors.Unwrap(err)
			if best != nil && isLimit(err) {
				stop = fmt.Sprintf("the expansion at order %d exceeds a limit (%v)", order, err)
				break
			}
			return nil, nil, err
		}
		if err != nil {
			if best != nil && isStop(err) {
				stop = fmt.Sprintf("the time ran out at order %d", order)
				break
			}
			return nil, nil, err
		}
		if !p.Truncated {
			return p, res, nil // no series, or one that ended exactly
		}
		if best == nil || rank(res) >= rank(best) {
			bestP, best = p, res
		}
		if rank(res) == 2 {
			break
		}
		if order >= MaxAutoOrder {
			stop = fmt.Sprintf("no order up to %d certifies the omitted terms", MaxAutoOrder)
			break
		}
		next := order + 2
		if tr := truncationOf(res); tr != nil && tr.NeededOrder > next {
			next = tr.NeededOrder
		}
		order = min(next, MaxAutoOrder)
		if autoFloor {
			floor = floorOf(p)
		}
	}
	note := fmt.Sprintf("truncation order %d chosen automatically", bestP.Order)
	if stop != "" {
		note += "; the search stopped because " + stop
	} else {
		note += ": the lowest order tried at which the omitted terms cannot change the answer"
	}
	best.Notes = append(best.Notes, note)
	return bestP, best, nil
}

// autoFloor turns the cut by the polyhedron of Spec.Bound on (tests and
// benchmarks compare with it off).
var autoFloor = true

// errParse marks an error of boundFloored that comes from the expansion
// (it wraps the error of Spec.Problem).
var errParse = errors.New("rlct: expansion failed")

// parseError wraps an error of Spec.Problem for boundFloored.
type parseError struct{ err error }

func (e *parseError) Error() string        { return e.err.Error() }
func (e *parseError) Unwrap() error        { return e.err }
func (e *parseError) Is(target error) bool { return target == errParse }

// boundFloored expands s with the floor (see floorOf; nil for none) and
// bounds the problem. When the floored problem is refused (a remainder
// monomial of low degree that dominates no kept exponent, which floorOf's
// argument rules out, is checked all the same) or a reduction was not
// tried because of the floor, it expands and bounds again without the
// floor, so the floor never changes an answer. Errors of the expansion
// are wrapped in a *parseError.
func (s *Spec) boundFloored(ctx context.Context, floor [][]int, opt *Options) (*Problem, *Result, error) {
	if floor != nil {
		p, err := s.problem(floor)
		if err != nil {
			return nil, nil, &parseError{err}
		}
		res, err := Bound(ctx, p, opt)
		switch {
		case err == nil && !blocked(res):
			return p, res, nil
		case err != nil && !errors.Is(err, ErrDimension):
			return nil, nil, err
		}
	}
	p, err := s.problem(nil)
	if err != nil {
		return nil, nil, &parseError{err}
	}
	res, err := Bound(ctx, p, opt)
	return p, res, err
}

// blocked reports a result (or one of its points) whose reduction was not
// tried because the series was cut by a floor.
func blocked(r *Result) bool {
	if r.reductionBlocked {
		return true
	}
	for _, l := range r.Locals {
		if blocked(l) {
			return true
		}
	}
	return false
}

// floorOf returns the floor for the next, higher order: the minimal
// exponents (under the entrywise order) among those of degree ≤ p.Order of
// K, or in sum-of-squares form of all the generators; nil when p has more
// than one point (each is a problem of its own), when p is not truncated,
// or when the support is empty.
//
// Why this is sound for the certificate. Let D0 < D1 be the two orders and
// F the floor. Every f in F is an exponent of degree ≤ D0 of the problem
// at D0 and is minimal there; by induction on the orders (the first order
// has no floor) the floor F0 used at D0 lies in that support, so f strictly
// dominates no point of F0 (it would not be minimal), and by the rules of
// package monomial (the terms of degree ≤ the order that strictly dominate
// no floor point are Taylor coefficients) its coefficient at D0 is the
// true, non-zero one. At D1 the same holds with F, since f strictly
// dominates no point of the antichain F: so f is an exponent of the
// problem at D1 as well. Every term the expansion at D1 drops, and every
// remainder monomial of degree ≤ D1 it adds, strictly dominates some g in
// F, hence a point of the final support: it lies in the Newton polyhedron
// P and on no compact face (a·(g + s) > a·g ≥ b for a compact face with
// normal a > 0 and level b), so it changes neither P, t_τ, θ nor a face
// polynomial, and the remainder check (remainderCheck) and the total-degree
// check (checkTruncation) certify it. Problem.checkExtras checks that
// every low remainder monomial strictly dominates a kept exponent, so a
// flaw in this argument would show as a refused problem (then
// boundFloored expands again without the floor), not as a wrong answer.
// The reduction needs omitted terms of degree above the order, so it is
// not tried on a floored series (cutByFloor), and boundFloored then
// expands again without the floor.
func floorOf(p *Problem) [][]int {
	if len(p.Points) > 1 || !p.Truncated {
		return nil
	}
	polys := p.Generators
	if p.K != nil {
		polys = []*monomial.Poly{p.K}
	}
	var low [][]int
	for _, q := range polys {
		for e := range q.All() {
			if e.Degree() <= p.Order {
				low = append(low, slices.Clone([]int(e)))
			}
		}
	}
	slices.SortFunc(low, func(a, b []int) int { return monomial.Exponent(a).Degree() - monomial.Exponent(b).Degree() })
	var floor [][]int
	for _, e := range low {
		if !slices.ContainsFunc(floor, func(g []int) bool { return leq(g, e) }) {
			floor = append(floor, e)
		}
	}
	return floor
}

// leq reports a ≤ b entrywise.
func leq(a, b []int) bool {
	for i, x := range a {
		if x > b[i] {
			return false
		}
	}
	return true
}

// rank orders results by how much of the truncation is certified: 2 when
// the omitted terms can change nothing, 1 when they cannot change the
// value (Truncation.Principal), 0 otherwise. Several points count by the
// weakest.
func rank(r *Result) int {
	if len(r.Locals) > 0 {
		least := 2
		for _, l := range r.Locals {
			least = min(least, rank(l))
		}
		return least
	}
	switch tr := r.Truncation; {
	case tr == nil || tr.Faces:
		return 2
	case tr.Principal:
		return 1
	}
	return 0
}

// truncationOf returns the truncation check of r (of its first point that
// has one, with several points).
func truncationOf(r *Result) *Truncation {
	if r.Truncation != nil {
		return r.Truncation
	}
	for _, l := range r.Locals {
		if l.Truncation != nil {
			return l.Truncation
		}
	}
	return nil
}

// needsOrder reports a parse error that only a truncation order lifts.
func needsOrder(err error) bool {
	var me *monomial.Error
	return errors.As(err, &me) && me.Setting == "Order"
}

// isLimit reports an expansion stopped by one of its limits (terms,
// exponent, bits, work), which a higher order can only make worse.
func isLimit(err error) bool {
	var me *monomial.Error
	return errors.As(err, &me) && me.Setting != "" && me.Setting != "Order" && me.Setting != "At" && me.Setting != "Vars"
}
