package rlct

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// Reduction records the splitting of regular directions at the point: a
// change of coordinates that writes K, up to a factor bounded above and
// below by positive constants, as u_1² + … + u_r² + K'(v), after which
// λ = r/2 + λ(K') and θ = θ(K') (Bound, see reduce).
type Reduction struct {
	// Kind is "generators" (sum-of-squares form: r generators with
	// linearly independent linear parts were solved for r coordinates) or
	// "quadratic" (polynomial form: K's quadratic part has rank r, and
	// ∂K/∂x = 0 was solved for r coordinates, the splitting lemma, or the
	// square was completed in them, see Completions).
	Kind string `json:"kind"`
	// Rank is r, the number of regular directions split off; they
	// contribute r/2 to λ.
	Rank int `json:"rank"`
	// Solved names the coordinates that were solved for (moved).
	Solved []string `json:"solved"`
	// Generators are the generators solved (numbered from 1), in
	// sum-of-squares form; their squares are the u_k².
	Generators []int `json:"generators,omitempty"`
	// Solution gives each solved coordinate as a function of the others,
	// "x = y - y^2", in the offsets from the point. When Order > 0 it is a
	// series cut above degree Order. When Eliminations is set, each is the
	// exact rational function of that step, in the coordinates left by
	// the steps before it.
	Solution []string `json:"solution"`
	// Eliminations, when set, are the exact steps that solved the
	// generators one at a time (see Elimination): the core is then an
	// exact polynomial, and replaying the steps on the generators gives K.
	Eliminations []Elimination `json:"eliminations,omitempty"`
	// Completions, when set, are the exact steps that completed the
	// square in polynomial form, one coordinate at a time (see
	// Completion): the core is then the exact polynomial of the last step,
	// and the Solution of each step is x = −B/(2A).
	Completions []Completion `json:"completions,omitempty"`
	// K holds the core after the reduction (in sum-of-squares form its
	// generators), in the offsets from the point, when it is exact and
	// found by Eliminations or Completions.
	K []string `json:"k,omitempty"`
	// Order is 0 when the solution and the core are exact, otherwise the
	// total degree at which the core (a series) was cut; the core's
	// Truncation then says whether the omitted terms can matter.
	Order int `json:"order,omitempty"`
	// Free names the variables the core does not depend on: they
	// contribute 0 to λ and nothing to θ.
	Free []string `json:"free,omitempty"`
	// Kept names the coordinates that could have been solved for but were
	// not, because the prior has a non-zero exponent on them at the point
	// (moving them would change the prior's monomial factor).
	Kept []string `json:"kept,omitempty"`
	// Core is the answer for the core K' in the remaining variables (nil
	// when no variable depends on it: K' = 0, λ(K') = 0, θ(K') = 1).
	Core *Result `json:"core,omitempty"`
	// Unreduced is the Newton value of K itself, without the reduction.
	Unreduced Value `json:"unreduced"`
}

// Value is a pair (λ, θ) with its status.
type Value struct {
	Lambda *big.Rat `json:"lambda"`
	Theta  int      `json:"theta"`
	Status Status   `json:"status"`
}

// defaultReduceOrder is the first degree at which a reduction that needs
// a series cuts it; maxReduceOrder the highest it tries.
const (
	defaultReduceOrder = 8
	maxReduceOrder     = 40
)

// reduce tries to split the regular directions off K at the point of l,
// and returns the answer through the reduction, or nil when there is
// nothing to split or the reduction cannot be carried out soundly (the
// second result then says why, or is empty when there was nothing to do).
//
// Soundness. Let x be the offsets from the point, with prior
// Π|x_i|^{h_i}·(smooth positive) and τ_i = h_i + 1 (Problem.Prior).
//
//  1. λ and θ are invariant under an analytic change of coordinates y = Φ(x)
//     at the point with invertible Jacobian, provided the prior keeps its
//     form: the zeta function ∫ K^z φ dx becomes ∫ (K∘Φ⁻¹)^z φ(Φ⁻¹)
//     |det DΦ⁻¹| dy, and the Jacobian is smooth and positive near 0. The
//     factor |x_i|^{h_i} is unchanged when x_i is not moved (y_i = x_i);
//     a coordinate with τ_i ≠ 1 is therefore never moved. (Watanabe 2009,
//     Algebraic Geometry and Statistical Learning Theory, ch. 2, the
//     change of variables in the zeta function; from memory.)
//  2. Functions K₁ ≤ C·K₂ and K₂ ≤ C·K₁ near the point have the same λ and θ
//     (their zeta functions have the same largest pole and order; Watanabe
//     2009, the comparison of zeta functions; from memory).
//  3. For K = K₁(u) + K₂(v) in disjoint variables, with a prior that is a
//     product, λ = λ₁ + λ₂ and θ = θ₁ + θ₂ − 1 (Watanabe 2009, the
//     learning coefficient of a sum in disjoint variables; from memory).
//     u_1² + … + u_r² has λ = r/2 and θ = 1, so λ = r/2 + λ(K'), θ = θ(K');
//     a K' = 0 (or a variable K' does not involve) contributes 0 to λ and
//     nothing to θ, since ∫|v|^{h} dv over a neighbourhood is finite.
//
// Sum-of-squares form (K = Σ g_i²). When generators g_{R_1}, …, g_{R_r}
// have linear parts that are independent on the coordinates x_P
// (|P| = r, every τ = 1), the map (x_P, v) ↦ (u = g_R(x), v) is an analytic
// change of coordinates (its Jacobian block J = ∂g_R/∂x_P(0) is invertible).
// Let φ(v) solve g_R(φ(v), v) = 0 (implicit function theorem). Every other
// g_i equals h_i(v) + Σ_k u_k·a_ik with h_i(v) = g_i(φ(v), v), since
// g_i − h_i vanishes where u = 0. So K is comparable (2, by (a+b)² ≤ 2a² +
// 2b² both ways) to Σ u_k² + Σ h_i(v)², and 1–3 give λ = r/2 + λ(Σ h_i²),
// θ = θ(Σ h_i²).
//
// Polynomial form. When K ≥ 0 has a quadratic part Q whose block Q_PP is
// positive definite (an exact LDLᵀ with diagonal pivots on the coordinates
// with τ = 1 chooses P; a negative pivot means K is not ≥ 0 and nothing is
// reduced), let φ(v) solve ∂K/∂x_P(φ(v), v) = 0 (Jacobian 2·Q_PP). By Taylor's
// formula in x_P around φ(v), K(x) = f(v) + wᵀ·A(x)·w with w = x_P − φ(v),
// f(v) = K(φ(v), v) and A(0) = Q_PP positive definite (the splitting lemma
// with parameters). f ≥ 0 because K ≥ 0, so near 0, K is comparable to
// |w|² + f(v), and 1–3 give λ = r/2 + λ(f), θ = θ(f).
//
// Polynomial form, exactly. When K has degree 2 in a pivot x with an x²
// coefficient that is a unit at the point, the square is completed
// (completeSquares, whose comment has the argument): K is comparable to
// u² + (4AC − B²)(v), an exact polynomial core, and this is repeated on
// the core. It is used only when it splits off every pivot of the LDLᵀ;
// otherwise the series below is used.
//
// Series. φ is computed exactly up to a total degree D (solveSeries); when
// it is not exact (checked by exact substitution) the core is a series cut
// at D whose omitted terms all have degree > D: in sum-of-squares form
// h_i(φ_true) − h_i(φ) has the order of φ_true − φ; in polynomial form
// f(φ_true + e) − f... is O(e²) because ∂K/∂x_P vanishes at φ_true; and for a
// K that is itself a series cut at D₀ (D = D₀), the omitted terms of K, of
// degree > D₀, stay above D₀ after substituting φ (which has no constant
// term), and in polynomial form they move φ by terms of degree ≥ D₀, which
// change f by terms of degree ≥ 2·D₀ > D₀. The core is then bounded as a
// truncated series (Truncation), so its status claims no more than that
// check proves. A solved coordinate whose series is exact is recognised by
// exactSubset; a core that does not involve the other ones is exact.
func reduce(ctx context.Context, l *Local, order int, truncated bool, opt *Options) (*Reduction, *Result, string, error) {
	d := len(l.Vars)
	var movable, kept []int
	for i, w := range l.Weights {
		if w.Cmp(big.NewRat(1, 1)) == 0 {
			movable = append(movable, i)
		} else {
			kept = append(kept, i)
		}
	}
	var sys *splitSystem
	if l.SumOfSquares {
		sys = generatorSystem(l, movable)
	} else {
		var why string
		if sys, why = quadraticSystem(l, movable); sys == nil {
			return nil, nil, why, nil
		}
	}
	// Coordinates with τ ≠ 1 that the full linear algebra would have used.
	var keptNames []string
	if len(kept) > 0 {
		var all *splitSystem
		if l.SumOfSquares {
			all = generatorSystem(l, allIndices(d))
		} else {
			all, _ = quadraticSystem(l, allIndices(d))
		}
		if all != nil && all.rank() > sys.rank() {
			for _, j := range kept {
				keptNames = append(keptNames, l.Vars[j])
			}
		}
	}
	if sys.rank() == 0 {
		if keptNames != nil {
			return nil, nil, fmt.Sprintf("no regular direction was split off: the ones at the point involve %s, where the prior has a non-zero exponent, and moving a coordinate would change the prior's monomial factor", strings.Join(keptNames, ", ")), nil
		}
		return nil, nil, "", nil
	}
	if truncated && cutByFloor(l.Remainder, order) {
		return nil, nil, floorReductionNote, nil
	}
	red := &Reduction{Kind: sys.kind, Rank: sys.rank(), Kept: keptNames}
	if l.SumOfSquares {
		for _, g := range sys.eqIndex {
			red.Generators = append(red.Generators, g+1)
		}
	}
	for _, j := range sys.pivots {
		red.Solved = append(red.Solved, l.Vars[j])
	}

	if l.SumOfSquares && !truncated {
		red, res, why, err := reduceExact(ctx, l, movable, sys.rank(), opt, red)
		if err != nil || red != nil || why != "" {
			return red, res, why, err
		}
	}
	if !l.SumOfSquares && !truncated {
		red, res, why, err := reduceCompleted(ctx, l, sys.pivots, opt, red)
		if err != nil || red != nil || why != "" {
			return red, res, why, err
		}
	}
	D := order
	if !truncated {
		D = defaultReduceOrder
	}
	for {
		core, solution, exact, err := sys.core(l, D, truncated)
		if err != nil {
			if errors.Is(err, errTooLarge) {
				return nil, nil, "the reduction was not applied: the series solution grew beyond the size limit", nil
			}
			return nil, nil, "", err
		}
		red.Solution = solution
		red.Order = 0
		if !exact {
			red.Order = D
		}
		res, why, err := boundCore(ctx, l, core, sys.pivots, !exact, D, opt, red)
		if err != nil || res == nil {
			return nil, nil, why, err
		}
		if red.Core == nil {
			return red, res, "", nil
		}
		tr := red.Core.Truncation
		if !exact && !truncated && tr != nil && !tr.Faces && tr.NeededOrder > D && tr.NeededOrder <= maxReduceOrder {
			D = tr.NeededOrder
			continue
		}
		return red, res, "", nil
	}
}

// reduceExact runs eliminate on the coordinates cols and, when it splits
// off all rank regular directions, bounds the exact polynomial core. It
// returns a nil Reduction and an empty reason when the series solve should
// be tried instead (some direction could not be eliminated exactly, or the
// polynomials grew too large).
func reduceExact(ctx context.Context, l *Local, cols []int, rank int, opt *Options, red *Reduction) (*Reduction, *Result, string, error) {
	el, err := eliminate(l, cols, rank)
	if errors.Is(err, errTooLarge) || el == nil || len(el.pivots) != rank {
		return nil, nil, "", nil
	}
	if err != nil {
		return nil, nil, "", err
	}
	red.Generators, red.Solved, red.Solution = nil, nil, nil
	for k, j := range el.pivots {
		red.Generators = append(red.Generators, el.gens[k]+1)
		red.Solved = append(red.Solved, l.Vars[j])
		st := el.steps[k]
		sol := l.Vars[j] + " = " + st.Numerator
		if st.Denominator != "1" {
			sol = l.Vars[j] + " = (" + st.Numerator + ")/(" + st.Denominator + ")"
		}
		red.Solution = append(red.Solution, sol)
	}
	red.Eliminations = el.steps
	red.Order = 0
	for _, q := range el.core {
		red.K = append(red.K, q.String())
	}
	res, why, err := boundCore(ctx, l, el.core, el.pivots, false, 0, opt, red)
	if err != nil || res == nil {
		return nil, nil, why, err
	}
	return red, res, "", nil
}

// reduceCompleted runs completeSquares on K (polynomial form) for the
// pivots of the LDLᵀ and, when it splits off all of them, bounds the exact
// polynomial core. It returns a nil Reduction and an empty reason when the
// series solve should be tried instead (some direction could not be split
// off this way, or the polynomials grew too large).
func reduceCompleted(ctx context.Context, l *Local, pivots []int, opt *Options, red *Reduction) (*Reduction, *Result, string, error) {
	cs, err := completeSquares(l.Polys[0], pivots, len(pivots))
	if errors.Is(err, errTooLarge) || cs == nil || len(cs.pivots) != len(pivots) {
		return nil, nil, "", nil
	}
	if err != nil {
		return nil, nil, "", err
	}
	red.Solved, red.Solution = nil, nil
	for k, j := range cs.pivots {
		red.Solved = append(red.Solved, l.Vars[j])
		red.Solution = append(red.Solution, cs.solution(l.Vars, k))
	}
	red.Completions = cs.steps
	red.Order = 0
	red.K = []string{cs.core.String()}
	res, why, err := boundCore(ctx, l, []*monomial.Poly{cs.core}, cs.pivots, false, 0, opt, red)
	if err != nil || res == nil {
		return nil, nil, why, err
	}
	return red, res, "", nil
}

func allIndices(d int) []int {
	out := make([]int, d)
	for i := range out {
		out[i] = i
	}
	return out
}

// boundCore bounds the core and builds the answer r/2 + λ(core).
func boundCore(ctx context.Context, l *Local, core []*monomial.Poly, pivots []int, truncated bool, order int, opt *Options, red *Reduction) (*Result, string, error) {
	// The core's variables: those not solved for; when the core is exact,
	// only those it involves (the others are free).
	used := make([]bool, len(l.Vars))
	for _, q := range core {
		for e := range q.All() {
			for i, x := range e {
				if x > 0 {
					used[i] = true
				}
			}
		}
	}
	var keep []int
	red.Free = nil
	for i := range l.Vars {
		if slices.Contains(pivots, i) {
			continue
		}
		if used[i] || truncated {
			keep = append(keep, i)
		} else {
			red.Free = append(red.Free, l.Vars[i])
		}
	}
	var polys []*monomial.Poly
	for _, q := range core {
		if !q.IsZero() {
			polys = append(polys, q)
		}
	}
	r := int64(red.Rank)
	res := &Result{}
	if len(polys) == 0 || len(keep) == 0 {
		if truncated {
			return nil, fmt.Sprintf("the reduction was not applied: the core vanishes up to degree %d, and the omitted terms are unknown", order), nil
		}
		red.Core = nil
		res.Lambda, res.Theta, res.Status = big.NewRat(r, 2), 1, Exact
		return res, "", nil
	}
	names := make([]string, len(keep))
	cl := &Local{SumOfSquares: l.SumOfSquares, Vars: names}
	for k, i := range keep {
		names[k] = l.Vars[i]
		cl.Point = append(cl.Point, l.Point[i])
		cl.Prior = append(cl.Prior, l.Prior[i])
		cl.Weights = append(cl.Weights, l.Weights[i])
	}
	for _, q := range polys {
		p, err := project(q, keep, names)
		if err != nil {
			return nil, "", err
		}
		cl.Polys = append(cl.Polys, p)
	}
	c, err := boundPlain(ctx, cl, order, truncated, opt)
	if err != nil {
		if errors.Is(err, ErrNegative) && !truncated {
			return nil, "", err // K(φ(v), v) < 0 somewhere near the point: K takes negative values
		}
		if errors.Is(err, ErrInput) || errors.Is(err, ErrNegative) {
			return nil, "the reduction was not applied: the core could not be bounded (" + err.Error() + ")", nil
		}
		return nil, "", err
	}
	red.Core = c
	res.Lambda = new(big.Rat).Add(big.NewRat(r, 2), c.Lambda)
	res.Theta, res.Status = c.Theta, c.Status
	for _, why := range c.Reasons {
		res.Reasons = append(res.Reasons, "in the core after the reduction: "+why)
	}
	return res, "", nil
}

// project writes q, which involves only the variables keep, in those
// variables.
func project(q *monomial.Poly, keep []int, names []string) (*monomial.Poly, error) {
	var exps []monomial.Exponent
	var coefs []*big.Rat
	for e, c := range q.All() {
		f := make(monomial.Exponent, len(keep))
		for k, i := range keep {
			f[k] = e[i]
		}
		exps = append(exps, f)
		coefs = append(coefs, c)
	}
	return monomial.FromTerms(names, exps, coefs)
}

// splitSystem is the system F(x) = 0 solved for the coordinates pivots:
// r generators (sum-of-squares form) or r partial derivatives of K
// (polynomial form), with the inverse of their Jacobian block at 0.
type splitSystem struct {
	kind    string
	eqs     []*monomial.Poly
	eqIndex []int // the generators solved, in sum-of-squares form
	pivots  []int
	jinv    ratMatrix
	rest    []*monomial.Poly // the other generators, or K itself
}

func (s *splitSystem) rank() int { return len(s.pivots) }

// linearPart returns the coefficients of the degree-1 terms of q.
func linearPart(q *monomial.Poly, d int) []*big.Rat {
	row := make([]*big.Rat, d)
	for i := range row {
		row[i] = new(big.Rat)
	}
	for e, c := range q.All() {
		if j, ok := purePower(e); ok && e[j] == 1 {
			row[j].Set(c)
		}
	}
	return row
}

// generatorSystem picks, by Gaussian elimination over Q on the columns
// cols, generators with independent linear parts and their pivot columns.
func generatorSystem(l *Local, cols []int) *splitSystem {
	d := len(l.Vars)
	n := len(l.Polys)
	rows := make(ratMatrix, n)
	for i, g := range l.Polys {
		rows[i] = linearPart(g, d)
	}
	work := make(ratMatrix, n)
	for i := range rows {
		work[i] = make([]*big.Rat, d)
		for j := range rows[i] {
			work[i][j] = new(big.Rat).Set(rows[i][j])
		}
	}
	s := &splitSystem{kind: "generators"}
	used := make([]bool, n)
	t := new(big.Rat)
	for _, c := range cols {
		p := -1
		for i := range n {
			if !used[i] && work[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		used[p] = true
		s.eqIndex = append(s.eqIndex, p)
		s.pivots = append(s.pivots, c)
		for i := range n {
			if used[i] || work[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(work[i][c], work[p][c])
			for j := range d {
				work[i][j].Sub(work[i][j], t.Mul(f, work[p][j]))
			}
		}
	}
	r := len(s.pivots)
	J := newRatMatrix(r, r)
	for k, i := range s.eqIndex {
		s.eqs = append(s.eqs, l.Polys[i])
		for m, j := range s.pivots {
			J[k][m].Set(rows[i][j])
		}
	}
	inv, ok := J.inverse()
	if !ok {
		return &splitSystem{kind: "generators"} // not reached: elimination found r pivots
	}
	s.jinv = inv
	for i, g := range l.Polys {
		if !used[i] {
			s.rest = append(s.rest, g)
		}
	}
	return s
}

// quadraticSystem picks, by an exact LDLᵀ with diagonal pivots on the
// columns cols, coordinates P on which K's quadratic part is positive
// definite, and returns the system ∂K/∂x_P = 0. A negative pivot, or a zero
// pivot with a non-zero row, shows that the quadratic part is not positive
// semidefinite (so K takes negative values), and nothing is reduced.
func quadraticSystem(l *Local, cols []int) (*splitSystem, string) {
	K := l.Polys[0]
	d := len(l.Vars)
	q := newRatMatrix(d, d)
	half := big.NewRat(1, 2)
	for e, c := range K.All() {
		if e.Degree() != 2 {
			continue
		}
		var ij []int
		for i, x := range e {
			for range x {
				ij = append(ij, i)
			}
		}
		if ij[0] == ij[1] {
			q[ij[0]][ij[0]].Set(c)
		} else {
			h := new(big.Rat).Mul(c, half)
			q[ij[0]][ij[1]].Set(h)
			q[ij[1]][ij[0]].Set(h)
		}
	}
	work := newRatMatrix(d, d)
	for i := range q {
		for j := range q {
			work[i][j].Set(q[i][j])
		}
	}
	s := &splitSystem{kind: "quadratic", rest: []*monomial.Poly{K}}
	done := make([]bool, d)
	t := new(big.Rat)
	for {
		p := -1
		for _, c := range cols {
			if done[c] {
				continue
			}
			switch work[c][c].Sign() {
			case 1:
				if p < 0 {
					p = c
				}
			case -1:
				return nil, fmt.Sprintf("the reduction was not applied: the quadratic part of K is not positive semidefinite (pivot %s at %s)", work[c][c].RatString(), l.Vars[c])
			}
		}
		if p < 0 {
			break
		}
		done[p] = true
		s.pivots = append(s.pivots, p)
		for _, i := range cols {
			if done[i] || work[i][p].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(work[i][p], work[p][p])
			for _, j := range cols {
				work[i][j].Sub(work[i][j], t.Mul(f, work[p][j]))
			}
		}
	}
	for _, i := range cols {
		for _, j := range cols {
			if !done[i] && !done[j] && work[i][j].Sign() != 0 {
				return nil, fmt.Sprintf("the reduction was not applied: the quadratic part of K is not positive semidefinite (%s and %s)", l.Vars[i], l.Vars[j])
			}
		}
	}
	r := len(s.pivots)
	J := newRatMatrix(r, r)
	two := big.NewRat(2, 1)
	for k, i := range s.pivots {
		s.eqs = append(s.eqs, derivative(K, i))
		for m, j := range s.pivots {
			J[k][m].Mul(two, q[i][j])
		}
	}
	inv, ok := J.inverse()
	if !ok {
		return nil, "" // not reached: Q_PP is positive definite
	}
	s.jinv = inv
	return s, ""
}

// derivative returns ∂q/∂x_i.
func derivative(q *monomial.Poly, i int) *monomial.Poly {
	var exps []monomial.Exponent
	var coefs []*big.Rat
	for e, c := range q.All() {
		if e[i] == 0 {
			continue
		}
		f := slices.Clone(e)
		f[i]--
		exps = append(exps, f)
		coefs = append(coefs, new(big.Rat).Mul(c, big.NewRat(int64(e[i]), 1)))
	}
	p, err := monomial.FromTerms(q.Vars(), exps, coefs)
	if err != nil {
		panic(err) // not reached: the exponents and lengths are those of q
	}
	return p
}

// core solves the system to degree D and returns the core polynomials (in
// all variables; they do not involve the pivots), the solution as text, and
// whether the core is exact (when the input is not itself truncated).
func (s *splitSystem) core(l *Local, D int, truncated bool) ([]*monomial.Poly, []string, bool, error) {
	vars := l.Vars
	phi, err := solveSeries(vars, s.eqs, s.pivots, s.jinv, D)
	if err != nil {
		return nil, nil, false, err
	}
	exactSet := s.exactSubset(vars, phi)
	solution := make([]string, len(phi))
	for k, j := range s.pivots {
		solution[k] = vars[j] + " = " + phi[k].String()
		if !exactSet[k] || truncated {
			solution[k] += fmt.Sprintf(" + (terms of degree > %d)", D)
		}
	}
	// Substitute the exact components first, whatever the degree.
	var ePiv, iPiv []int
	var ePhi, iPhi []*monomial.Poly
	for k, j := range s.pivots {
		if exactSet[k] {
			ePiv, ePhi = append(ePiv, j), append(ePhi, phi[k])
		} else {
			iPiv, iPhi = append(iPiv, j), append(iPhi, phi[k])
		}
	}
	full := newSubstituter(vars, ePiv, ePhi, -1)
	cut := newSubstituter(vars, iPiv, iPhi, D)
	exact := !truncated
	out := make([]*monomial.Poly, len(s.rest))
	for k, g := range s.rest {
		h, err := full.apply(g)
		if err != nil {
			return nil, nil, false, err
		}
		if involves(h, iPiv) {
			exact = false
			if h, err = cut.apply(h.Truncate(D)); err != nil {
				return nil, nil, false, err
			}
		}
		out[k] = h
	}
	if !exact {
		for k := range out {
			out[k] = out[k].Truncate(D)
		}
	}
	return out, solution, exact, nil
}

// involves reports whether q has a term in one of the variables vs.
func involves(q *monomial.Poly, vs []int) bool {
	for e := range q.All() {
		for _, j := range vs {
			if e[j] > 0 {
				return true
			}
		}
	}
	return false
}

// exactSubset returns, per solved coordinate, whether its series is the
// exact solution. A set E of them is exact when the equations of E vanish
// identically after substituting the series of E alone (the other solved
// coordinates left as variables) and the Jacobian block J_EE is
// invertible: by the implicit function theorem the equations of E
// determine x_E uniquely near 0 as a function of the other coordinates,
// and the polynomials of E are such a function. Starting from the
// equations whose residual vanishes, equations are dropped until both
// hold (or E is empty). Sizes beyond maxSubstTerms count as inexact.
func (s *splitSystem) exactSubset(vars []string, phi []*monomial.Poly) []bool {
	r := len(s.pivots)
	in := make([]bool, r)
	for k := range in {
		in[k] = true
	}
	for {
		var piv []int
		var ph []*monomial.Poly
		for k := range r {
			if in[k] {
				piv, ph = append(piv, s.pivots[k]), append(ph, phi[k])
			}
		}
		sub := newSubstituter(vars, piv, ph, -1)
		changed := false
		for k := range r {
			if !in[k] {
				continue
			}
			v, err := sub.apply(s.eqs[k])
			if err != nil || !v.IsZero() {
				in[k] = false
				changed = true
			}
		}
		if !changed {
			break
		}
	}
	var idx []int
	for k := range r {
		if in[k] {
			idx = append(idx, k)
		}
	}
	if len(idx) == 0 {
		return in
	}
	// J_EE from the inverse of J: invert J⁻¹ back is not needed; rebuild J.
	J, ok := s.jinv.inverse()
	if !ok {
		return make([]bool, r)
	}
	sub := newRatMatrix(len(idx), len(idx))
	for a, k := range idx {
		for b, m := range idx {
			sub[a][b].Set(J[k][m])
		}
	}
	if _, ok := sub.inverse(); !ok {
		return make([]bool, r)
	}
	return in
}

// applyReduction tries the reduction at one point and returns the answer
// to report: the reduced one when it claims more, or a smaller bound,
// than res, the plain Newton value (which it keeps in Reduction.Unreduced);
// otherwise res, with a note when a reduction was possible but not used.
func applyReduction(ctx context.Context, l *Local, order int, truncated bool, opt *Options, res *Result) (*Result, error) {
	if res.Status == Exact {
		return res, nil // nothing to gain
	}
	red, got, why, err := reduce(ctx, l, order, truncated, opt)
	if err != nil {
		return nil, err
	}
	if red == nil {
		if why != "" {
			res.Notes = append(res.Notes, why)
		}
		res.reductionBlocked = why == floorReductionNote
		return res, nil
	}
	red.Unreduced = Value{Lambda: res.Lambda, Theta: res.Theta, Status: res.Status}
	better := false
	switch a, b := statusRank(got.Status), statusRank(res.Status); {
	case a > b:
		better = true
	case a == b && a == statusRank(Exact):
		if got.Lambda.Cmp(res.Lambda) != 0 || got.Theta != res.Theta {
			return nil, fmt.Errorf("rlct: internal inconsistency: the reduction (%s) gives λ = %s, θ = %d, and K itself λ = %s, θ = %d, both exact",
				red.describe(), got.Lambda.RatString(), got.Theta, res.Lambda.RatString(), res.Theta)
		}
	case a == b && a == statusRank(UpperBound):
		better = Less(got, res)
	}
	if !better {
		if a := statusRank(got.Status); a < statusRank(res.Status) {
			res.Notes = append(res.Notes, fmt.Sprintf("a reduction (%s) was possible but gives only λ = %s, θ = %d (%s), so it is not used", red.describe(), got.Lambda.RatString(), got.Theta, got.Status))
		}
		return res, nil
	}
	out := *res
	out.Lambda, out.Theta, out.Status = got.Lambda, got.Theta, got.Status
	out.Reasons = got.Reasons
	out.Reduction = red
	out.Changes = []string{"reduction: " + red.describe() + " (" + strings.Join(red.Solution, "; ") + ")"}
	out.Summary = out.summary()
	return &out, nil
}

func statusRank(s Status) int {
	switch s {
	case Exact:
		return 2
	case UpperBound:
		return 1
	}
	return 0
}

// describe says in a few words which change was made.
func (r *Reduction) describe() string {
	var b strings.Builder
	switch r.Kind {
	case "generators":
		gs := make([]string, len(r.Generators))
		for i, g := range r.Generators {
			gs[i] = fmt.Sprint(g)
		}
		fmt.Fprintf(&b, "generator%s %s solved for %s", plural(len(gs)), strings.Join(gs, ", "), strings.Join(r.Solved, ", "))
	default:
		if len(r.Completions) > 0 {
			fmt.Fprintf(&b, "quadratic part of rank %d split off by completing the square in %s", r.Rank, strings.Join(r.Solved, ", "))
			break
		}
		fmt.Fprintf(&b, "quadratic part of rank %d split off by solving ∂K/∂%s = 0", r.Rank, strings.Join(r.Solved, ", ∂K/∂"))
	}
	return b.String()
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// floorReductionNote is the reason given when a reduction is not applied
// because the series was cut below its order (see cutByFloor).
const floorReductionNote = "the reduction was not applied: the series omits terms of degree at most its order (it was cut by the Newton polyhedron), and a change of coordinates could move them below the terms that are kept"

// cutByFloor reports a remainder with a monomial of total degree ≤ order:
// a series cut by a floor (monomial.Config.Floor). The reduction's
// argument for a truncated K needs every omitted term to have degree
// above the order (they stay there after substituting a series without
// constant term); a term that is only known to dominate a kept one can
// fall below the kept terms after the substitution, so the reduction is
// not applied to such a series.
func cutByFloor(rem []monomial.Exponent, order int) bool {
	for _, r := range rem {
		if r.Degree() <= order {
			return true
		}
	}
	return false
}
