package rlct

import (
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// The sign check. If the face polynomial K_σ of a compact face σ with
// exposing normal a (strictly positive) takes a negative value at a torus
// point w0, then along the curve w(s) = (s^{a_1}·w0_1, …, s^{a_d}·w0_d), which
// tends to the point as s → 0+, K(w(s)) = s^b·K_σ(w0) + O(s^{b+1}), because
// the terms on σ are exactly those of least weighted degree b. So K is
// negative arbitrarily close to the point, and K is not a divergence there
// (common practice; the weighted-degree expansion is the one of Varchenko
// 1976). negativePoint looks for such a w0 and confirms it exactly:
//
//   - on a vertex the answer is exact and complete: c·w^v is negative
//     somewhere exactly when c < 0 or some v_i is odd;
//   - on an edge it is exact and complete: K_σ = w^v·p(w^u) changes sign
//     exactly when p has a real root of odd multiplicity, and then rational
//     points on both sides of the root are tried;
//   - on a face of dimension 2 or more it is a search: every sign pattern of
//     the variables (or a seeded sample of them when there are many), then
//     seeded random magnitudes, then a greedy descent from the best points,
//     each candidate evaluated in floating point and confirmed in exact
//     arithmetic. A face where the search finds nothing keeps its verdict;
//     nothing is claimed from the absence of a negative value.

// negative is a torus point where a face polynomial is negative.
type negative struct {
	point []*big.Rat
	value *big.Rat
}

func (n *negative) pointString(vars []string) string {
	parts := make([]string, len(vars))
	for i, v := range vars {
		parts[i] = v + "=" + n.point[i].RatString()
	}
	return strings.Join(parts, ", ")
}

// negativePoint returns a torus point where the face polynomial of fc
// (polynomial form) is negative, or nil when none was found.
func negativePoint(fc *faceCase) *negative {
	q := fc.parts[0]
	if evenPositive(q) {
		return nil
	}
	switch fc.face.Dim {
	case 0:
		return negativeTerm(q)
	case 1:
		return negativeOnEdge(fc)
	}
	return searchNegative(q, faceSeed(fc))
}

// confirm evaluates q exactly at x and returns the point when q(x) < 0.
func confirm(q *monomial.Poly, x []*big.Rat) *negative {
	for _, v := range x {
		if v.Sign() == 0 {
			return nil
		}
	}
	if v := q.Eval(x); v.Sign() < 0 {
		return &negative{point: x, value: v}
	}
	return nil
}

// negativeTerm handles a single term c·w^e.
func negativeTerm(q *monomial.Poly) *negative {
	e, c := q.Term(0)
	x := ones(len(e))
	if c.Sign() > 0 {
		odd := slices.IndexFunc(e, func(k int) bool { return k%2 != 0 })
		if odd < 0 {
			return nil
		}
		x[odd].SetInt64(-1)
	}
	return confirm(q, x)
}

// negativeOnEdge handles an edge: K_σ = w^v·p(w^u).
func negativeOnEdge(fc *faceCase) *negative {
	q := fc.parts[0]
	u, p := edgeUnivariate(fc)
	if countRealRoots(oddMultiplicityPart(p)) == 0 {
		return nil
	}
	// Candidate values s of w^u on both sides of every root of p: first the
	// simplest rational in each gap between the isolating intervals and
	// beyond them (for readable witnesses), then the interval ends and
	// midpoints, which lie on both sides of a root once the intervals are
	// narrow. A candidate that is a root, or 0, fails the exact check.
	ivs := isolateRoots(p, big.NewRat(1, 1<<20))
	one := big.NewRat(1, 1)
	half := big.NewRat(1, 2)
	first, last := ivs[0].Lo, ivs[len(ivs)-1].Hi
	cands := []*big.Rat{
		simplest(new(big.Rat).Sub(first, one), new(big.Rat).Sub(first, big.NewRat(1, 1<<20))),
		simplest(new(big.Rat).Add(last, big.NewRat(1, 1<<20)), new(big.Rat).Add(last, one)),
	}
	for k := 0; k+1 < len(ivs); k++ {
		if ivs[k].Hi.Cmp(ivs[k+1].Lo) < 0 {
			cands = append(cands, simplest(ivs[k].Hi, ivs[k+1].Lo))
		}
	}
	for k, iv := range ivs {
		cands = append(cands, iv.Lo, iv.Hi, new(big.Rat).Mul(new(big.Rat).Add(iv.Lo, iv.Hi), half))
		if k+1 < len(ivs) {
			cands = append(cands, new(big.Rat).Mul(new(big.Rat).Add(iv.Hi, ivs[k+1].Lo), half))
		}
	}
	// The coordinate that realises w^u = s: u_j ≠ 0, smallest |u_j|.
	for _, s := range cands {
		if s.Sign() == 0 {
			continue
		}
		for j, uj := range u {
			if uj == 0 || (s.Sign() < 0 && uj%2 == 0) {
				continue
			}
			x := ones(len(u))
			x[j] = rootApprox(s, uj)
			if neg := confirm(q, x); neg != nil {
				return neg
			}
			// Flip a coordinate that changes the sign of w^v but not of w^u.
			for i := range u {
				if i != j && u[i]%2 == 0 {
					x[i].SetInt64(-1)
					if neg := confirm(q, x); neg != nil {
						return neg
					}
					x[i].SetInt64(1)
				}
			}
		}
	}
	return nil
}

// rootApprox returns a rational r with r^k close to s (k ≠ 0; s < 0 only for
// odd k): exactly s^(1/k) when that is rational.
func rootApprox(s *big.Rat, k int) *big.Rat {
	if v, ok := ratRoot(s, abs(k)); ok {
		if k < 0 {
			v.Inv(v)
		}
		return v
	}
	f, _ := s.Float64()
	r := math.Pow(math.Abs(f), 1/float64(k))
	if f < 0 {
		r = -r
	}
	out := new(big.Rat)
	if out.SetFloat64(r) == nil {
		return big.NewRat(1, 1)
	}
	return out
}

func ones(n int) []*big.Rat {
	x := make([]*big.Rat, n)
	for i := range x {
		x[i] = big.NewRat(1, 1)
	}
	return x
}

// faceSeed derives the search's seed from the face, so that the search is
// the same on every run.
func faceSeed(fc *faceCase) uint64 {
	var h uint64 = 1469598103934665603
	for _, v := range fc.face.Vertices {
		h = (h ^ uint64(v)) * 1099511628211
	}
	return h
}

// searchNegative looks for a torus point where q is negative (see the
// comment at the top of this file), spending at most a fixed number of
// floating-point evaluations of q.
func searchNegative(q *monomial.Poly, seed uint64) *negative {
	d := q.NumVars()
	var active []int // variables that occur in q
	for i := range d {
		for e := range q.All() {
			if e[i] != 0 {
				active = append(active, i)
				break
			}
		}
	}
	eval := q.Compile()
	abs := absolutePoly(q).Compile()
	budget := min(max(200000/(q.Len()+1), 64), 4096)
	rng := rand.New(rand.NewPCG(seed, 0x5eed))
	x := make([]float64, d)
	for i := range x {
		x[i] = 1
	}
	// score is q(x) relative to the size of its terms, so that points of
	// different scale compare; it is negative exactly when q(x) is.
	score := func(x []float64) float64 {
		budget--
		return eval.Eval(x) / abs.Eval(absVec(x))
	}
	type cand struct {
		x []float64
		s float64
	}
	var best []cand
	// try evaluates x, confirms it exactly when it looks negative, and
	// keeps the best few points for the descent.
	try := func(x []float64) *negative {
		s := score(x)
		if s < 0 {
			if neg := confirmFloat(q, x); neg != nil {
				return neg
			}
		}
		best = append(best, cand{slices.Clone(x), s})
		slices.SortFunc(best, func(a, b cand) int { return cmpFloat(a.s, b.s) })
		if len(best) > 4 {
			best = best[:4]
		}
		return nil
	}
	// 1. Sign patterns with all magnitudes 1.
	m := len(active)
	patterns := 1 << min(m, 12)
	for k := 0; k < patterns && budget > 0; k++ {
		bits := uint64(k)
		if m > 12 {
			bits = rng.Uint64()
		}
		for a, i := range active {
			x[i] = 1
			if bits>>(a%64)&1 == 1 {
				x[i] = -1
			}
		}
		if neg := try(x); neg != nil {
			return neg
		}
	}
	// 2. Random magnitudes and signs.
	for r := 0; r < 64 && budget > 0; r++ {
		for _, i := range active {
			x[i] = math.Exp2(float64(rng.IntN(9) - 4))
			if rng.IntN(2) == 1 {
				x[i] = -x[i]
			}
		}
		if neg := try(x); neg != nil {
			return neg
		}
	}
	// 3. Greedy descent: scale one coordinate at a time by 2^{±step}.
	for _, c := range best {
		y := c.x
		cur := c.s
		for step := 1.0; step > 1.0/64 && budget > 0; {
			improved := false
			for _, i := range active {
				for _, f := range []float64{math.Exp2(step), math.Exp2(-step)} {
					old := y[i]
					y[i] *= f
					s := score(y)
					if s < cur {
						cur, improved = s, true
						if s < 0 {
							if neg := confirmFloat(q, y); neg != nil {
								return neg
							}
						}
						break
					}
					y[i] = old
				}
			}
			if !improved {
				step /= 2
			}
		}
	}
	return nil
}

// confirmFloat confirms a float candidate exactly, preferring a nearby point
// with simple rational coordinates.
func confirmFloat(q *monomial.Poly, x []float64) *negative {
	simple := make([]*big.Rat, len(x))
	exact := make([]*big.Rat, len(x))
	for i, v := range x {
		exact[i] = new(big.Rat)
		if exact[i].SetFloat64(v) == nil {
			return nil
		}
		lo := new(big.Rat).SetFloat64(v - math.Abs(v)/1024)
		hi := new(big.Rat).SetFloat64(v + math.Abs(v)/1024)
		simple[i] = simplest(lo, hi)
	}
	if neg := confirm(q, simple); neg != nil {
		return neg
	}
	return confirm(q, exact)
}

// absolutePoly returns Σ |c_e|·w^e for q = Σ c_e·w^e.
func absolutePoly(q *monomial.Poly) *monomial.Poly {
	exps := make([]monomial.Exponent, 0, q.Len())
	coefs := make([]*big.Rat, 0, q.Len())
	for e, c := range q.All() {
		exps = append(exps, slices.Clone(e))
		coefs = append(coefs, new(big.Rat).Abs(c))
	}
	p, err := monomial.FromTerms(q.Vars(), exps, coefs)
	if err != nil {
		panic("rlct: internal error: " + err.Error())
	}
	return p
}

func absVec(x []float64) []float64 {
	out := make([]float64, len(x))
	for i, v := range x {
		out[i] = math.Abs(v)
	}
	return out
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}
