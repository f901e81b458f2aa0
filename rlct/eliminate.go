package rlct

import (
	"math/big"
	"slices"

	"github.com/lctkit/lctkit/monomial"
)

// Elimination is one step of an exact reduction in sum-of-squares form: a
// generator g = a·x + b that is linear in the coordinate x, with a
// coefficient a that is a unit at the point (a(0) ≠ 0), solved exactly for
// x = −b/a; each other generator h, of degree e in x, is replaced by the
// polynomial a^e·h(−b/a) (see eliminate).
type Elimination struct {
	// Generator is the generator solved, numbered from 1 in the original
	// list.
	Generator int `json:"generator"`
	// Variable is the coordinate x solved for.
	Variable string `json:"variable"`
	// Numerator and Denominator give x = Numerator/Denominator, in the
	// offsets from the point, in the coordinates left by the steps before
	// this one: Numerator is −b, Denominator is a, whose constant term is
	// not zero.
	Numerator   string `json:"numerator"`
	Denominator string `json:"denominator"`
}

// exactElimination is the outcome of eliminate.
type exactElimination struct {
	steps  []Elimination
	pivots []int            // the coordinates solved for, in order
	gens   []int            // the generators solved (0-based), in order
	core   []*monomial.Poly // the other generators after the last step
}

// eliminate solves generators of l (sum-of-squares form) one at a time
// for coordinates among cols, exactly, while some generator g = a·x + b is
// of degree at most 1 in a coordinate x of cols with a(0) ≠ 0; it stops
// after want steps. The coordinates are tried in the order of cols and,
// for each, the generators in their order, as the Gaussian elimination of
// generatorSystem does, so that it reaches the same rank when it can.
//
// Soundness. Take one step on K = g² + Σ h_i² (in the offsets x, v from
// the point), g = a(v)·x + b(v), where a, b do not involve x and a(0) ≠ 0.
// Then ∂g/∂x(0) = a(0) ≠ 0, and φ(v) = −b(v)/a(v) is the analytic solution
// of g(φ(v), v) = 0 near 0 (a rational function whose denominator does
// not vanish near 0). The argument of reduce (sum-of-squares form, with
// u = g) shows K comparable to u² + Σ h_i(φ(v), v)², so λ(K) = 1/2 +
// λ(Σ h_i(φ, v)²) and θ(K) = θ(Σ h_i(φ, v)²), when x carries τ = 1. If h_i
// has degree e_i in x, p_i = a^{e_i}·h_i(φ, v) is a polynomial, and since
// c ≤ |a| ≤ C near 0 for constants 0 < c ≤ C, h_i(φ, v)² = p_i²/a^{2e_i} is
// bounded above and below by constant multiples of p_i²; so Σ h_i(φ, v)²
// and Σ p_i² are comparable and have the same λ and θ (Watanabe 2009, the
// comparison of zeta functions; from memory). Each p_i vanishes at 0
// (h_i(0) = 0 and φ(0) = 0). The next step applies the same argument to
// Σ p_i² in the remaining coordinates, whose prior is that of K restricted
// to them. After k steps λ(K) = k/2 + λ(Σ p_i²) and θ(K) = θ(Σ p_i²), and
// every polynomial is exact: nothing is truncated, so the core's status is
// that of an exact polynomial.
//
// It returns nil when no step applies, and errTooLarge when a polynomial
// would exceed maxSubstTerms.
func eliminate(l *Local, cols []int, want int) (*exactElimination, error) {
	vars := l.Vars
	cur := slices.Clone(l.Polys)
	alive := make([]bool, len(cur))
	for i := range alive {
		alive[i] = true
	}
	out := &exactElimination{}
	for _, c := range cols {
		if len(out.pivots) == want {
			break
		}
		for i, g := range cur {
			if !alive[i] || degreeIn(g, c) != 1 {
				continue
			}
			a, b := splitLinear(g, c)
			if a.ConstantTerm().Sign() == 0 {
				continue
			}
			num := b.Neg()
			for k, h := range cur {
				if !alive[k] || k == i {
					continue
				}
				p, err := clearSubstitute(h, c, num, a)
				if err != nil {
					return nil, err
				}
				cur[k] = p
			}
			alive[i] = false
			out.pivots = append(out.pivots, c)
			out.gens = append(out.gens, i)
			out.steps = append(out.steps, Elimination{Generator: i + 1, Variable: vars[c], Numerator: num.String(), Denominator: a.String()})
			break
		}
	}
	if len(out.pivots) == 0 {
		return nil, nil
	}
	for i, g := range cur {
		if alive[i] {
			out.core = append(out.core, g)
		}
	}
	return out, nil
}

// degreeIn returns the degree of q in the variable j.
func degreeIn(q *monomial.Poly, j int) int {
	d := 0
	for e := range q.All() {
		d = max(d, e[j])
	}
	return d
}

// splitLinear writes q, of degree at most 1 in x_j, as a·x_j + b.
func splitLinear(q *monomial.Poly, j int) (a, b *monomial.Poly) {
	var ae, be []monomial.Exponent
	var ac, bc []*big.Rat
	for e, c := range q.All() {
		f := slices.Clone(e)
		if f[j] == 1 {
			f[j] = 0
			ae, ac = append(ae, f), append(ac, c)
		} else {
			be, bc = append(be, f), append(bc, c)
		}
	}
	a = mustTerms(q.Vars(), ae, ac)
	b = mustTerms(q.Vars(), be, bc)
	return a, b
}

func mustTerms(vars []string, exps []monomial.Exponent, coefs []*big.Rat) *monomial.Poly {
	p, err := monomial.FromTerms(vars, exps, coefs)
	if err != nil {
		panic(err) // not reached: the exponents come from a polynomial in vars
	}
	return p
}

// clearSubstitute returns den^e·h(x_j = num/den), a polynomial, where e is
// the degree of h in x_j: with h = Σ_k c_k·x_j^k (c_k free of x_j), it is
// Σ_k c_k·num^k·den^(e−k).
func clearSubstitute(h *monomial.Poly, j int, num, den *monomial.Poly) (*monomial.Poly, error) {
	e := degreeIn(h, j)
	if e == 0 {
		return h, nil
	}
	vars := h.Vars()
	coef := make([]*monomial.Poly, e+1)
	for k := range coef {
		coef[k] = monomial.Zero(vars)
	}
	for ex, c := range h.All() {
		f := slices.Clone(ex)
		k := f[j]
		f[j] = 0
		coef[k] = coef[k].Add(monomial.Monomial(vars, f, c))
	}
	one := monomial.Constant(vars, big.NewRat(1, 1))
	numPow := []*monomial.Poly{one}
	denPow := []*monomial.Poly{one}
	for k := 1; k <= e; k++ {
		if numPow[k-1].Len()*num.Len() > 4*maxSubstTerms || denPow[k-1].Len()*den.Len() > 4*maxSubstTerms {
			return nil, errTooLarge
		}
		numPow = append(numPow, numPow[k-1].Mul(num))
		denPow = append(denPow, denPow[k-1].Mul(den))
		if numPow[k].Len() > maxSubstTerms || denPow[k].Len() > maxSubstTerms {
			return nil, errTooLarge
		}
	}
	out := monomial.Zero(vars)
	for k, ck := range coef {
		if ck.IsZero() {
			continue
		}
		t := ck.Mul(numPow[k])
		if t.Len()*denPow[e-k].Len() > 4*maxSubstTerms {
			return nil, errTooLarge
		}
		out = out.Add(t.Mul(denPow[e-k]))
		if out.Len() > maxSubstTerms {
			return nil, errTooLarge
		}
	}
	return out, nil
}
