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

// Repair records the repair of degenerate edges: a sequence of coordinate
// changes x_j → x_j + c·w^m along edges of the Newton polyhedron (the
// Newton–Puiseux step), after which the Newton value of K in the new
// coordinates gave Lambda, Theta and Status (see repair).
type Repair struct {
	// Steps are the changes made, in order; each is applied to K as the
	// previous ones left it.
	Steps []RepairStep `json:"steps"`
	// K holds K after the last step (in sum-of-squares form its
	// generators), in the offsets from the point, so a reader can check
	// the steps by substituting.
	K []string `json:"k"`
	// Criterion is set when λ is certified by a criterion on the
	// coordinates reached rather than by the face certificate:
	// CriterionVarchenko.
	Criterion string `json:"criterion,omitempty"`
	// Final is the Newton value of K after the last step.
	Final Value `json:"final"`
	// Unrepaired is the Newton value of K itself, before any step.
	Unrepaired Value `json:"unrepaired"`

	final *Result // the answer after the last step, with its polyhedron
}

// RepairStep is one coordinate change x_j → x_j + c·w^m.
type RepairStep struct {
	// Edge holds the vertices of the compact edge the step was read from,
	// in P(K) coordinates (in sum-of-squares form twice those of the
	// generators), in the coordinates before the step.
	Edge [][]int `json:"edge"`
	// Polynomial is the univariate polynomial p with edge polynomial
	// w^v·p(w^u), in the variable s = w^u (Monomial).
	Polynomial string `json:"polynomial"`
	Monomial   string `json:"monomial"`
	// Root is the rational root c of p the step moves to the axis.
	Root *big.Rat `json:"root"`
	// Variable is the coordinate moved, Substitution the change made, as
	// "y -> y + x^2": every occurrence of y in K is replaced by y + x^2.
	Variable     string `json:"variable"`
	Substitution string `json:"substitution"`
	// Value is the Newton value of K after this step.
	Value Value `json:"value"`
}

// CriterionVarchenko names Varchenko's criterion for adapted coordinates
// in two variables (see varchenkoAdapted).
const CriterionVarchenko = "varchenko-adapted-coordinates"

// Bounds on the repair: steps taken in a row, candidate changes tried per
// step, and the degree of an edge polynomial it reads roots from.
const (
	maxRepairSteps      = 8
	maxRepairCandidates = 12
	maxRepairDegree     = 200
)

// repairCandidate is one sound change x_j → x_j + coef·w^m read from an
// edge.
type repairCandidate struct {
	step RepairStep
	j    int
	phi  *monomial.Poly // x_j + coef·w^m
}

// repair tries to improve res, the answer for l, by changing coordinates
// along degenerate compact edges and, in two variables with a uniform
// prior, by Varchenko's criterion. It returns the better answer with its
// Repair record, or nil and the notes saying why nothing was repaired.
//
// Soundness of a step. Let an edge of P(K) (or of P(I) in sum-of-squares
// form) have primitive direction u with an entry u_j = σ = ±1 and every
// other entry of the opposite sign or zero, and τ_j = 1. Put m_i = −σ·u_i
// for i ≠ j and m_j = 0, so m ≥ 0, m ≠ 0 (a compact edge has a normal with
// positive entries, orthogonal to u, so u has entries of both signs), and
// w^u = (x_j / w^m)^σ. The map x_j ↦ x_j + c^σ·w^m (the others fixed) is
// a polynomial change of coordinates at the point with inverse x_j ↦
// x_j − c^σ·w^m and Jacobian determinant 1; it does not move x_j's prior
// factor |x_j|^{h_j} only because τ_j = 1 means that factor is smooth and
// positive there, and the other coordinates are not moved. So λ and θ of K
// and of K after the change are the same (change of variables in the zeta
// function, Watanabe 2009, Algebraic Geometry and Statistical Learning
// Theory, ch. 2; from memory), and every status the certificate gives in
// the new coordinates holds for K. The root c only chooses the change;
// the change is sound for any c. A step is kept only when the answer after
// it is stronger (a stronger status, or a smaller upper bound).
//
// Only exact polynomials are changed: for a truncated series (truncated)
// the omitted terms would move as well, and nothing is repaired.
func repair(ctx context.Context, l *Local, truncated bool, opt *Options, res *Result) (*Result, *Repair, []string, error) {
	if truncated {
		return nil, nil, nil, nil
	}
	var notes []string
	note := func(s string) {
		if !slices.Contains(notes, s) {
			notes = append(notes, s)
		}
	}
	rep := &Repair{Steps: []RepairStep{}, Unrepaired: valueOf(res)}
	cur, curL := res, l
	for range maxRepairSteps {
		if ctx.Err() != nil {
			break // the deadline ends the repair like a budget: the answer so far stands
		}
		if cur.Status == Exact {
			break
		}
		cands, why, err := repairCandidates(ctx, curL, cur)
		if err != nil {
			return nil, nil, nil, err
		}
		for _, w := range why {
			note(w)
		}
		var best *Result
		var bestL *Local
		var bestC *repairCandidate
		for k := range cands {
			c := &cands[k]
			nl, err := substituteLocal(curL, c)
			if err != nil {
				continue // too large: not tried
			}
			r, err := boundPlain(ctx, nl, 0, false, opt)
			if err != nil {
				if errors.Is(err, ErrInput) || ctx.Err() != nil {
					continue // a candidate that cannot be bounded in time is not used
				}
				return nil, nil, nil, err
			}
			if best == nil || stronger(r, best) {
				best, bestL, bestC = r, nl, c
			}
		}
		if best == nil || !stronger(best, cur) {
			break
		}
		bestC.step.Value = valueOf(best)
		rep.Steps = append(rep.Steps, bestC.step)
		cur, curL = best, bestL
	}
	if cur.Status != Exact {
		if ok, why := varchenkoAdapted(curL, cur); ok {
			c := *cur
			c.LambdaCertified = true
			c.Reasons = append(slices.Clone(cur.Reasons), "θ is not certified: λ is, by Varchenko's criterion (the coordinates are adapted), but the criterion says nothing about θ")
			cur = &c
			rep.Criterion = CriterionVarchenko
		} else if why != "" && len(rep.Steps) == 0 {
			note(why)
		}
	}
	if len(rep.Steps) == 0 && rep.Criterion == "" {
		return nil, nil, notes, nil
	}
	if err := checkConsistent(cur, res); err != nil {
		return nil, nil, nil, err
	}
	if !stronger(cur, res) {
		return nil, nil, notes, nil
	}
	rep.Final = valueOf(cur)
	rep.final = cur
	for _, q := range curL.Polys {
		rep.K = append(rep.K, q.String())
	}
	return cur, rep, notes, nil
}

func valueOf(r *Result) Value {
	return Value{Lambda: r.Lambda, Theta: r.Theta, Status: r.Status}
}

// strength orders what an answer claims: Exact, then an upper bound whose
// λ is certified, then an upper bound, then an uncertified value.
func strength(r *Result) int {
	switch {
	case r.Status == Exact:
		return 3
	case r.Status == UpperBound && r.LambdaCertified:
		return 2
	case r.Status == UpperBound:
		return 1
	}
	return 0
}

// stronger reports whether a claims more than b: a stronger status, or at
// the same status (not Exact) a smaller pair in the order of Less.
func stronger(a, b *Result) bool {
	if sa, sb := strength(a), strength(b); sa != sb {
		return sa > sb
	}
	return a.Status != Exact && Less(a, b)
}

// checkConsistent returns an error when two certified values of one
// problem contradict each other: both exact and different, or one exact
// and the other a bound below it.
func checkConsistent(a, b *Result) error {
	ex, other := a, b
	if b.Status == Exact {
		ex, other = b, a
	}
	if ex.Status != Exact {
		return nil
	}
	bad := false
	switch other.Status {
	case Exact:
		bad = other.Lambda.Cmp(ex.Lambda) != 0 || other.Theta != ex.Theta
	case UpperBound:
		bad = Less(other, ex)
	}
	if bad {
		return fmt.Errorf("rlct: internal inconsistency: the repair gives λ = %s, θ = %d (%s), and K itself λ = %s, θ = %d (%s)",
			a.Lambda.RatString(), a.Theta, a.Status, b.Lambda.RatString(), b.Theta, b.Status)
	}
	return nil
}

// substituteLocal returns l with x_j replaced by c.phi in every
// polynomial.
func substituteLocal(l *Local, c *repairCandidate) (*Local, error) {
	for _, q := range l.Polys {
		for e := range q.All() {
			if e[c.j] > maxRepairDegree {
				return nil, errTooLarge // (x_j + c·w^m)^e would be too large to expand
			}
		}
	}
	sub := newSubstituter(l.Vars, []int{c.j}, []*monomial.Poly{c.phi}, -1)
	nl := *l
	nl.Polys = make([]*monomial.Poly, len(l.Polys))
	for i, q := range l.Polys {
		p, err := sub.apply(q)
		if err != nil {
			return nil, err
		}
		nl.Polys[i] = p
	}
	return &nl, nil
}

// repairEdge is a compact edge in the base coordinates (P(K), or P(I) in
// sum-of-squares form).
type repairEdge struct{ v0, v1 []int }

// repairEdges lists the compact edges to read changes from: the principal
// face when it is an edge, the edges that decided the status, and in two
// variables every compact edge (there are few).
func repairEdges(ctx context.Context, res *Result) ([]repairEdge, error) {
	var out []repairEdge
	seen := map[string]bool{}
	add := func(v0, v1 []int) {
		k := fmt.Sprint(v0, v1)
		if !seen[k] {
			seen[k] = true
			out = append(out, repairEdge{v0, v1})
		}
	}
	fromFace := func(f Face) {
		if f.Dim == 1 && f.Compact && len(f.Vertices) == 2 {
			add(unscaled(f.Vertices[0], res.scale), unscaled(f.Vertices[1], res.scale))
		}
	}
	fromFace(res.Principal)
	if res.Certificate != nil {
		for _, f := range res.Certificate.Deciding {
			fromFace(f)
		}
	}
	if len(res.Vars) == 2 && res.newton != nil {
		vs, err := res.newton.Vertices(ctx)
		if err != nil {
			return nil, err
		}
		vs = slices.Clone(vs)
		slices.SortFunc(vs, slices.Compare[[]int])
		for k := 0; k+1 < len(vs); k++ {
			add(vs[k], vs[k+1])
		}
	}
	return out, nil
}

func unscaled(v []int, scale int) []int {
	out := make([]int, len(v))
	for i, x := range v {
		out[i] = x / scale
	}
	return out
}

// edgePolynomial returns, for the edge e, the primitive direction u from
// v0 and the gcd g of the univariate polynomials p_i of the parts of l's
// polynomials on the edge (part_i = w^v·p_i(w^u)): the real roots of g are
// those of K's edge polynomial in s = w^u. It also returns P, the
// univariate polynomial of K's edge polynomial itself (Σ p_i² in
// sum-of-squares form, with the generator weights), whose root
// multiplicities are those of K.
func edgePolynomial(l *Local, e repairEdge) (u []int, g, P upoly) {
	u = primitive(e.v0, e.v1)
	steps, _ := stepsAlong(e.v0, e.v1, u)
	for i, q := range l.Polys {
		part := q.Filter(func(x monomial.Exponent) bool {
			k, ok := stepsAlong(e.v0, x, u)
			return ok && k >= 0 && k <= steps
		})
		if part.IsZero() {
			continue
		}
		// Align every part at v0 so that Σ p_i² is K's polynomial.
		p := alignedUnivariate(part, e.v0, u)
		g = gcd(g, p)
		if !l.SumOfSquares {
			P = p
			continue
		}
		sq := mul(p, p)
		if l.GeneratorWeights != nil {
			sq = scale(sq, l.GeneratorWeights[i])
		}
		P = add(P, sq)
	}
	return u, g, P
}

// alignedUnivariate returns p with q = w^v0·p(w^u), every exponent of q
// being v0 + k·u with k ≥ 0.
func alignedUnivariate(q *monomial.Poly, v0, u []int) upoly {
	var p upoly
	for x, c := range q.All() {
		k, _ := stepsAlong(v0, x, u)
		for len(p) <= k {
			p = append(p, new(big.Rat))
		}
		p[k] = new(big.Rat).Add(p[k], c)
	}
	p = p.trim()
	// Strip the factor s^k shared by every term (p(0) ≠ 0 afterwards).
	for len(p) > 0 && p[0].Sign() == 0 {
		p = p[1:]
	}
	return p
}

// repairCandidates returns the sound changes read from rational real roots
// of the edges of cur's polyhedron, and notes on the roots that give none.
func repairCandidates(ctx context.Context, l *Local, cur *Result) ([]repairCandidate, []string, error) {
	edges, err := repairEdges(ctx, cur)
	if err != nil {
		return nil, nil, err
	}
	var out []repairCandidate
	var why []string
	for _, e := range edges {
		u, g, _ := edgePolynomial(l, e)
		if g.deg() < 1 || g.deg() > maxRepairDegree {
			continue
		}
		rats, rest := rationalRoots(g)
		if rest.deg() >= 1 && countRealRoots(rest) > 0 {
			why = append(why, irrationalNote(l.Vars, e, u, rest, cur.scale))
		}
		if len(rats) == 0 {
			continue
		}
		js := movable(u)
		if len(js) == 0 {
			why = append(why, fmt.Sprintf("the edge %s was not repaired: its direction %v has no entry ±1 with every other entry of the opposite sign or zero, so no coordinate x_j can be moved to x_j + c·w^m along it (a monomial w^m with m ≥ 0) for its root %s of %s = c; in two variables that root needs a fractional power (a Puiseux step with ramification)",
				formatVertices([][]int{scaled(e.v0, cur.scale), scaled(e.v1, cur.scale)}), u, rats[0].RatString(), monomialString(l.Vars, u)))
			continue
		}
		for _, c := range rats {
			for _, j := range js {
				if l.Weights[j].Cmp(big.NewRat(1, 1)) != 0 {
					why = append(why, fmt.Sprintf("not repaired along the edge %s: a repaired coordinate carries a non-uniform prior exponent (%s has τ = %s at the point; moving it would change the prior's monomial factor)",
						formatVertices([][]int{scaled(e.v0, cur.scale), scaled(e.v1, cur.scale)}), l.Vars[j], l.Weights[j].RatString()))
					continue
				}
				if len(out) < maxRepairCandidates {
					out = append(out, newCandidate(l, e, u, g, c, j, cur.scale))
				}
			}
		}
	}
	return out, why, nil
}

// movable returns the j with u_j = ±1 and every other entry of u of the
// opposite sign or zero.
func movable(u []int) []int {
	var out []int
	for j, x := range u {
		if x != 1 && x != -1 {
			continue
		}
		ok, nonzero := true, false
		for i, y := range u {
			if i == j {
				continue
			}
			if y*x > 0 {
				ok = false
			}
			if y != 0 {
				nonzero = true
			}
		}
		if ok && nonzero {
			out = append(out, j)
		}
	}
	return out
}

// newCandidate builds the change x_j → x_j + c^σ·w^m for the root c of the
// edge e with direction u (see repair).
func newCandidate(l *Local, e repairEdge, u []int, g upoly, c *big.Rat, j int, sc int) repairCandidate {
	sigma := u[j]
	m := make(monomial.Exponent, len(u))
	for i, x := range u {
		if i != j {
			m[i] = -sigma * x
		}
	}
	coef := new(big.Rat).Set(c)
	if sigma < 0 {
		coef.Inv(coef)
	}
	shift := monomial.Monomial(l.Vars, m, coef)
	phi := monomial.Variable(l.Vars, j).Add(shift)
	rhs := l.Vars[j] + " + " + shift.String()
	if coef.Sign() < 0 {
		rhs = l.Vars[j] + " - " + shift.Neg().String()
	}
	return repairCandidate{
		j:   j,
		phi: phi,
		step: RepairStep{
			Edge:         [][]int{scaled(e.v0, sc), scaled(e.v1, sc)},
			Polynomial:   upolyString(g, "s"),
			Monomial:     monomialString(l.Vars, u),
			Root:         c,
			Variable:     l.Vars[j],
			Substitution: l.Vars[j] + " -> " + rhs,
		},
	}
}

// rationalRoots returns the distinct rational roots of p (non-zero, since
// the edge polynomials have p(0) ≠ 0, but zero is found too) and p's
// square-free part divided by their linear factors.
//
// Completeness: write the square-free part as a primitive integer
// polynomial with leading coefficient L. A rational root a/b in lowest
// terms has b | L (the rational root theorem, common practice), so it is
// k/L for an integer k. Each real root is isolated in an interval (lo, hi]
// of width below 1/L, which holds at most one number k/L, namely
// ⌊hi·L⌋/L, tested exactly. So every rational root is found.
func rationalRoots(p upoly) ([]*big.Rat, upoly) {
	p = p.trim()
	if p.deg() < 1 {
		return nil, p
	}
	g := gcd(p, p.derivative())
	sf, _ := p.divMod(g)
	sf = sf.monic()
	// Leading coefficient of the primitive integer multiple: the lcm of
	// the denominators, divided by the content of the numerators.
	den := big.NewInt(1)
	for _, c := range sf {
		den = lcmInt(den, c.Denom())
	}
	num := new(big.Int)
	for _, c := range sf {
		v := new(big.Int).Mul(c.Num(), new(big.Int).Quo(den, c.Denom()))
		num.GCD(nil, nil, num, v.Abs(v))
	}
	L := new(big.Rat).SetFrac(den, num) // leading coefficient of the integer polynomial
	width := new(big.Rat).Inv(new(big.Rat).Mul(L, big.NewRat(2, 1)))
	var out []*big.Rat
	rest := sf
	for _, iv := range isolateRoots(sf, width) {
		var cand *big.Rat
		if iv.exact() {
			cand = iv.Lo
		} else {
			hl := new(big.Rat).Mul(iv.Hi, L)
			k := new(big.Int).Div(hl.Num(), hl.Denom()) // floor
			cand = new(big.Rat).Quo(new(big.Rat).SetInt(k), L)
			if cand.Cmp(iv.Lo) <= 0 {
				continue
			}
		}
		if sf.eval(cand).Sign() == 0 {
			out = append(out, new(big.Rat).Set(cand))
			rest, _ = rest.divMod(upoly{new(big.Rat).Neg(cand), big.NewRat(1, 1)})
		}
	}
	return out, rest
}

func lcmInt(a, b *big.Int) *big.Int {
	g := new(big.Int).GCD(nil, nil, a, b)
	out := new(big.Int).Mul(a, b)
	out.Quo(out, g)
	return out.Abs(out)
}

// irrationalNote says that an edge has real roots that are not rational,
// with their minimal polynomial when it is known.
func irrationalNote(vars []string, e repairEdge, u []int, rest upoly, sc int) string {
	edge := formatVertices([][]int{scaled(e.v0, sc), scaled(e.v1, sc)})
	s := monomialString(vars, u)
	if rest.deg() <= 3 {
		// No rational root and degree at most 3: irreducible over Q.
		return fmt.Sprintf("the edge %s was not repaired: its real roots are irrational, roots of the minimal polynomial %s with s = %s, and a change of coordinates with an irrational coefficient is not made",
			edge, upolyString(rest.monic(), "s"), s)
	}
	return fmt.Sprintf("the edge %s was not repaired: its real roots are irrational, roots of %s with s = %s (no rational root; the minimal polynomial of each is a factor of it), and a change of coordinates with an irrational coefficient is not made",
		edge, upolyString(rest.monic(), "s"), s)
}

// varchenkoAdapted reports whether Varchenko's criterion certifies λ for
// the answer cur in the coordinates of l, and otherwise why not (empty
// when it does not apply at all).
//
// The criterion (Varchenko 1976, Newton polyhedra and estimation of
// oscillating integrals, Funct. Anal. Appl. 10; in the form stated by
// Ikromov & Müller 2011, On adapted coordinate systems, Trans. AMS 363;
// both from memory): for a real-analytic f of two variables with f(0) = 0,
// the coordinates are adapted to f, that is the Newton distance d(f) (t
// with (t, t) on the boundary of P(f)) equals the height h(f), the largest
// Newton distance over all analytic coordinate systems at 0, when the
// principal face (the face holding (d, d) in its relative interior) is
//
//	(a) a vertex, or
//	(b) an unbounded edge, or
//	(c) a compact edge whose polynomial f_π has no real zero on the unit
//	    circle of order above d; for f_π = x^a·y^b·p(x^{u_1}·y^{u_2}) the
//	    order at a zero off the axes is the multiplicity of the root of p,
//	    and at the axes it is a or b, both at most d because the edge
//	    meets the diagonal at (d, d).
//
// With adapted coordinates, the threshold of integrability of |f|^{−s}
// near 0 is 1/h(f) (Varchenko 1976 for the oscillation index; for the
// integrability threshold of real-analytic functions of two variables,
// Phong, Stein & Sturm 1999, On the growth and stability of real-analytic
// functions, Amer. J. Math. 121; from memory). For K ≥ 0 with a uniform
// prior that threshold is the learning coefficient (the largest pole of
// ∫K^z dw is at −λ; Watanabe 2009, ch. 2), so λ = 1/d(K). The criterion
// says nothing about θ, which stays the bound the certificate gives (the
// true θ is at least Theta, as for every upper bound).
func varchenkoAdapted(l *Local, cur *Result) (bool, string) {
	if len(l.Vars) != 2 {
		return false, ""
	}
	for _, w := range l.Weights {
		if w.Cmp(big.NewRat(1, 1)) != 0 {
			return false, ""
		}
	}
	f := cur.Principal
	switch {
	case f.Dim == 0, f.Dim == 1 && !f.Compact:
		return true, ""
	case f.Dim != 1 || len(f.Vertices) != 2:
		return false, ""
	}
	e := repairEdge{unscaled(f.Vertices[0], cur.scale), unscaled(f.Vertices[1], cur.scale)}
	_, _, P := edgePolynomial(l, e)
	mult := maxRealMultiplicity(P)
	if new(big.Rat).SetInt64(int64(mult)).Cmp(cur.Distance) <= 0 {
		return true, ""
	}
	return false, fmt.Sprintf("Varchenko's criterion does not certify λ: the principal edge's polynomial has a real root of multiplicity %d, above the Newton distance %s, so these coordinates are not adapted", mult, cur.Distance.RatString())
}

// maxRealMultiplicity returns the largest multiplicity of a real root of
// p (0 when it has none), from its square-free decomposition.
func maxRealMultiplicity(p upoly) int {
	if p.deg() < 1 {
		return 0
	}
	m := 0
	for i, f := range squareFree(p) {
		if f.deg() >= 1 && countRealRoots(f) > 0 {
			m = i + 1
		}
	}
	return m
}

// describe says in a few words which changes were made.
func (r *Repair) describe() string {
	var parts []string
	for _, s := range r.Steps {
		parts = append(parts, s.Substitution)
	}
	out := strings.Join(parts, ", then ")
	if r.Criterion != "" {
		if out != "" {
			out += "; "
		}
		out += "λ certified by Varchenko's criterion for adapted coordinates"
	}
	return out
}

// applyRepair tries the repair at one point and returns the answer to
// report: the repaired one when it claims more than best (the answer so
// far, perhaps through a reduction), never less; plain is the Newton value
// of K itself, which the repair starts from. When nothing was repaired,
// the notes say why.
func applyRepair(ctx context.Context, l *Local, truncated bool, opt *Options, plain, best *Result) (*Result, error) {
	if best.Status == Exact {
		return best, nil
	}
	got, rep, notes, err := repair(ctx, l, truncated, opt, plain)
	if err != nil {
		return nil, err
	}
	withNotes := func(r *Result, extra ...string) *Result {
		if len(notes)+len(extra) == 0 {
			return r
		}
		out := *r
		out.Notes = append(slices.Clone(r.Notes), notes...)
		out.Notes = append(out.Notes, extra...)
		return &out
	}
	if rep == nil {
		return withNotes(best), nil
	}
	if err := checkConsistent(got, best); err != nil {
		return nil, err
	}
	if !stronger(got, best) {
		return withNotes(best, fmt.Sprintf("a repair (%s) was possible but gives only λ = %s, θ = %d (%s), so it is not used",
			rep.describe(), got.Lambda.RatString(), got.Theta, got.Status)), nil
	}
	out := *plain
	out.Lambda, out.Theta, out.Status = got.Lambda, got.Theta, got.Status
	out.LambdaCertified = got.LambdaCertified
	out.Reasons = got.Reasons
	if len(rep.Steps) > 0 {
		out.Reasons = nil
		for _, why := range got.Reasons {
			out.Reasons = append(out.Reasons, "after the changes of coordinates: "+why)
		}
	}
	out.Notes = append(slices.Clone(plain.Notes), notes...)
	out.Repair = rep
	out.Changes = nil
	for _, s := range rep.Steps {
		out.Changes = append(out.Changes, fmt.Sprintf("repair: %s (the root %s of %s with s = %s on the edge %s)",
			s.Substitution, s.Root.RatString(), s.Polynomial, s.Monomial, formatVertices(s.Edge)))
	}
	if rep.Criterion != "" {
		out.Changes = append(out.Changes, "λ certified by Varchenko's criterion: the coordinates reached are adapted")
	}
	out.Summary = out.summary()
	return &out, nil
}
