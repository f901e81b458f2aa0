package rlct

import (
	"context"
	"errors"
	"fmt"

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
	stop := ""
	for order := autoFirstOrder; ; {
		at := *s
		at.Order = order
		p, err := at.Problem()
		if err != nil {
			if best != nil && isLimit(err) {
				stop = fmt.Sprintf("the expansion at order %d exceeds a limit (%v)", order, err)
				break
			}
			return nil, nil, err
		}
		res, err := Bound(ctx, p, opt)
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
