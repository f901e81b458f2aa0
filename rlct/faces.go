package rlct

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// FaceVerdict is the outcome of the nondegeneracy test on one face.
type FaceVerdict string

const (
	// Nondegenerate: the face polynomial has no zero in the real torus.
	Nondegenerate FaceVerdict = "nondegenerate"
	// Degenerate: the face polynomial vanishes somewhere in the real torus;
	// Witness shows where. This alone does not make the bound strict.
	Degenerate FaceVerdict = "degenerate"
	// Undetermined: no sound test applied; the face is not certified.
	Undetermined FaceVerdict = "undetermined"
)

// Rules name how a face was decided.
const (
	// RuleVertex: a single term c·w^v (c ≠ 0) never vanishes on the torus.
	RuleVertex = "vertex"
	// RuleEvenPositive: a positive combination of monomials with even
	// exponents is positive on the torus.
	RuleEvenPositive = "even-positive-terms"
	// RuleGenerator: in sum-of-squares form, one generator's face part is
	// c·w^v·p(w^u) with p free of real roots (a single monomial included),
	// so the generators have no common torus zero.
	RuleGenerator = "generator-without-torus-zero"
	// RuleEdge: on an edge the face polynomial is w^v·p(w^u) with p
	// univariate; a real root of p (of the gcd of the p_i in sum-of-squares
	// form) was sought exactly with Sturm sequences.
	RuleEdge = "edge-sturm"
	// RuleNone: no test applies.
	RuleNone = "none"
)

// FaceReport describes a face of P(K) and, for compact faces, how its
// nondegeneracy was decided.
type FaceReport struct {
	Dim       int
	Codim     int
	Compact   bool
	Principal bool // the face holds t_τ·τ in its relative interior
	// Vertices are exponent vectors in P(K) (in sum-of-squares form, twice
	// those of the generators).
	Vertices [][]int
	// Rays names the variables whose unit directions the face contains.
	Rays []string
	// Normal and RHS give a·x ≥ RHS on P(K) with the face = P(K) ∩ {a·x = RHS}.
	Normal []*big.Int
	RHS    *big.Int
	// Polynomial is the face polynomial of K, in the parser's syntax; in
	// sum-of-squares form it is written as a sum of squared face parts.
	Polynomial string
	// Verdict, Rule, Witness and Reason record the nondegeneracy test
	// (compact faces only).
	Verdict FaceVerdict
	Rule    string
	Witness *Witness
	Reason  string
}

// Witness shows a zero of a degenerate face polynomial in the real torus.
type Witness struct {
	// Root is the real root r of the univariate polynomial p with the face
	// polynomial w^v·p(w^u): exact, or an isolating interval.
	Root string `json:"root"`
	// Monomial is w^u, written out.
	Monomial string `json:"monomial"`
	// Point is a torus point with w^u = r: exact values where possible,
	// decimals marked "≈" otherwise.
	Point []string `json:"point"`
}

// TruncationReport is the check that the terms a truncated series left out
// cannot change the answer.
type TruncationReport struct {
	// Order is the degree at which the series was cut.
	Order int `json:"order"`
	// Principal is true when the omitted terms cannot change t_τ, θ or the
	// principal face: (D+1)·min_i y_i > t for every optimal supporting
	// hyperplane y·x ≥ t (y ≥ 0, y·τ = 1).
	Principal bool `json:"principal"`
	// Faces is true when, in addition, the omitted terms cannot change any
	// compact face or face polynomial, so nondegeneracy carries over.
	Faces bool `json:"faces"`
	// NeededOrder is the smallest order that would certify both, or -1 when
	// no order can (a supporting hyperplane gives some variable no weight).
	NeededOrder int `json:"needed_order"`
}

// analysis holds what the face checks share.
type analysis struct {
	res   *Result
	polys []*monomial.Poly
	sos   bool
	vars  []string

	// terms caches the exponents and coefficients of each polynomial, so
	// that the many faces are matched against plain integer slices.
	terms [][]termData

	// ctx is Options.Context, checked before each face is decided.
	ctx context.Context
}

type termData struct {
	exp  monomial.Exponent
	coef *big.Rat
}

// report describes face f of the base polyhedron in P(K) coordinates, with
// the face polynomial printed from parts (nil: computed here).
func (an *analysis) report(f *polyhedron.Face, parts []*monomial.Poly) FaceReport {
	d := len(an.vars)
	verts := an.res.newton.Vertices()
	fr := FaceReport{Dim: f.Dim, Codim: f.Codim(d), Compact: f.Compact(), Normal: f.Normal}
	fr.RHS = new(big.Int).Mul(f.RHS, big.NewInt(int64(an.res.scale)))
	for _, j := range f.Vertices {
		v := make([]int, d)
		for i, x := range verts[j] {
			v[i] = x * an.res.scale
		}
		fr.Vertices = append(fr.Vertices, v)
	}
	for _, i := range f.Rays {
		fr.Rays = append(fr.Rays, an.vars[i])
	}
	if parts == nil {
		parts = an.parts(f)
	}
	fr.Polynomial = an.facePolynomial(parts)
	return fr
}

// parts returns, for each analysed polynomial, its part on face f: the
// terms whose exponent e has Normal·e = RHS.
func (an *analysis) parts(f *polyhedron.Face) []*monomial.Poly {
	onFace := faceTest(f)
	out := make([]*monomial.Poly, len(an.polys))
	for i, q := range an.polys {
		out[i] = q.Filter(onFace)
	}
	return out
}

// faceTest returns a test for Normal·e = RHS.
func faceTest(f *polyhedron.Face) func(monomial.Exponent) bool {
	cmp := faceCompare(f)
	return func(e monomial.Exponent) bool { return cmp(e) == 0 }
}

// faceCompare returns a function giving the sign of Normal·e − RHS, in
// int64 arithmetic when the normal is small enough that no sum can
// overflow, in big.Int otherwise.
func faceCompare(f *polyhedron.Face) func(monomial.Exponent) int {
	small := f.RHS.IsInt64() && f.RHS.Int64() < 1<<31 && f.RHS.Sign() >= 0
	a := make([]int64, len(f.Normal))
	for i, x := range f.Normal {
		if !x.IsInt64() || x.Int64() >= 1<<31 || x.Sign() < 0 {
			small = false
			break
		}
		a[i] = x.Int64()
	}
	if small {
		b := f.RHS.Int64()
		return func(e monomial.Exponent) int {
			// Entries of a are in [0, 2^31), 0 ≤ b < 2^31, and the
			// partial sums only grow, so stopping once past b is safe
			// and no product or sum reaches 2^63 before that.
			var s int64
			for i, x := range e {
				if a[i] == 0 {
					continue
				}
				if x >= 1<<31 {
					return 1 // a[i]·x ≥ 2^31 > b
				}
				s += a[i] * int64(x)
				if s > b {
					return 1
				}
			}
			if s == b {
				return 0
			}
			return -1
		}
	}
	dot, t := new(big.Int), new(big.Int)
	return func(e monomial.Exponent) int {
		dot.SetInt64(0)
		for k, a := range f.Normal {
			dot.Add(dot, t.Mul(a, big.NewInt(int64(e[k]))))
		}
		return dot.Cmp(f.RHS)
	}
}

// facePolynomial prints the face polynomial of K from the parts.
func (an *analysis) facePolynomial(parts []*monomial.Poly) string {
	if !an.sos {
		return parts[0].String()
	}
	var terms []string
	for _, q := range parts {
		if !q.IsZero() {
			terms = append(terms, "("+q.String()+")^2")
		}
	}
	return strings.Join(terms, " + ")
}

// checkVertices rejects K with a vertex term that is negative or has an odd
// exponent: along a curve w = s·t^a that picks out the vertex, the term
// dominates, and flipping the sign of a variable with an odd exponent (or a
// negative coefficient) makes K negative arbitrarily close to the point.
func (an *analysis) checkVertices() error {
	k := an.polys[0]
	for _, v := range an.res.newton.Vertices() {
		c := k.Coefficient(monomial.Exponent(v))
		term := monomial.Monomial(an.vars, monomial.Exponent(v), c).String()
		if c.Sign() < 0 {
			return fmt.Errorf("%w: the term %s at a vertex of the Newton polyhedron has a negative coefficient", ErrNegative, term)
		}
		for i, x := range v {
			if x%2 == 1 {
				return fmt.Errorf("%w: the term %s at a vertex of the Newton polyhedron has an odd power of %s", ErrNegative, term, an.vars[i])
			}
		}
	}
	return nil
}

// checkFaces decides every compact face and records the verdicts. It returns
// ErrNegative when an edge shows that K changes sign.
func (an *analysis) checkFaces(lat *polyhedron.Lattice, principal *polyhedron.Face) error {
	res := an.res
	verts := res.newton.Vertices()
	failed := 0
	for _, f := range lat.Faces {
		if err := stopped(an.ctx); err != nil {
			return err
		}
		parts := an.parts(f)
		fr := an.report(f, parts)
		fr.Principal = sameFace(f, principal)
		if err := an.decide(&fr, f, parts, verts); err != nil {
			return err
		}
		if fr.Verdict != Nondegenerate {
			failed++
		}
		switch {
		case failed > maxFaceReasons || fr.Verdict == Nondegenerate:
		case fr.Verdict == Degenerate:
			res.Reasons = append(res.Reasons, fmt.Sprintf("the face with vertices %s is degenerate: its face polynomial %s vanishes at %s in the real torus",
				formatVertices(fr.Vertices), fr.Polynomial, strings.Join(fr.Witness.Point, ", ")))
		case fr.Verdict == Undetermined:
			res.Reasons = append(res.Reasons, fmt.Sprintf("the face with vertices %s could not be decided: %s", formatVertices(fr.Vertices), fr.Reason))
		}
		res.Faces = append(res.Faces, fr)
	}
	if failed > maxFaceReasons {
		res.Reasons = append(res.Reasons, fmt.Sprintf("%d more of the %d compact faces are degenerate or undetermined (see the per-face verdicts)", failed-maxFaceReasons, len(lat.Faces)))
	}
	return nil
}

// maxFaceReasons is how many failing faces are described in Result.Reasons;
// the rest are counted there and listed in Result.Faces.
const maxFaceReasons = 3

// decide applies the sound tests to one compact face, in order.
func (an *analysis) decide(fr *FaceReport, f *polyhedron.Face, parts []*monomial.Poly, verts [][]int) error {
	if !exposes(f, verts) {
		// The face polynomials are read off with the face's normal; if
		// that normal does not cut out exactly this face, no verdict
		// built on them can be trusted.
		fr.Verdict, fr.Rule = Undetermined, RuleNone
		fr.Reason = "internal check failed: the face's normal does not expose exactly its vertices"
		return nil
	}
	if f.Dim == 0 {
		fr.Verdict, fr.Rule = Nondegenerate, RuleVertex
		return nil
	}
	if !an.sos && evenPositive(parts[0]) {
		fr.Verdict, fr.Rule = Nondegenerate, RuleEvenPositive
		return nil
	}
	if an.sos {
		for i, q := range parts {
			if q.IsZero() {
				continue
			}
			line, ok := alongLine(q)
			if ok && countRealRoots(line.p) == 0 {
				fr.Verdict, fr.Rule = Nondegenerate, RuleGenerator
				fr.Reason = fmt.Sprintf("generator %d", i+1)
				return nil
			}
		}
	}
	if f.Dim != 1 {
		fr.Verdict, fr.Rule = Undetermined, RuleNone
		if an.sos {
			fr.Reason = fmt.Sprintf("a %d-dimensional face where no generator's face part is free of torus zeros by the tests available", f.Dim)
		} else {
			fr.Reason = fmt.Sprintf("a %d-dimensional face whose polynomial has negative coefficients or odd exponents; no exact test for it is available", f.Dim)
		}
		return nil
	}
	// An edge: every part is w^v0·s^k-shaped along u = (v1 − v0)/g.
	v0, v1 := verts[f.Vertices[0]], verts[f.Vertices[1]]
	u := primitive(v0, v1)
	var g upoly
	for _, q := range parts {
		if q.IsZero() {
			continue
		}
		p := univariate(q, v0, u)
		g = gcd(g, p)
	}
	fr.Rule = RuleEdge
	if !an.sos {
		if odd := oddMultiplicityPart(g); countRealRoots(odd) > 0 {
			root := isolateRoots(odd, big.NewRat(1, 1<<30))[0]
			return fmt.Errorf("%w: on the edge with vertices %s the face polynomial %s changes sign (root of odd multiplicity at %s = %s)",
				ErrNegative, formatVertices(fr.Vertices), fr.Polynomial, monomialString(an.vars, u), formatRoot(root))
		}
	}
	if countRealRoots(g) == 0 {
		fr.Verdict = Nondegenerate
		return nil
	}
	root := isolateRoots(g, big.NewRat(1, 1<<30))[0]
	fr.Verdict = Degenerate
	fr.Witness = torusWitness(an.vars, u, root)
	return nil
}

// exposes checks that Normal·x ≥ RHS holds on every vertex with equality
// exactly on the face's own vertices, and that the normal is strictly
// positive, as a compact face's must be.
func exposes(f *polyhedron.Face, verts [][]int) bool {
	for _, a := range f.Normal {
		if a.Sign() <= 0 {
			return false
		}
	}
	cmp := faceCompare(f)
	own := make(map[int]bool, len(f.Vertices))
	for _, j := range f.Vertices {
		own[j] = true
	}
	for j, v := range verts {
		c := cmp(monomial.Exponent(v))
		if c < 0 || (c == 0) != own[j] {
			return false
		}
	}
	return true
}

// evenPositive reports whether every term of q has a positive coefficient
// and only even exponents.
func evenPositive(q *monomial.Poly) bool {
	for e, c := range q.All() {
		if c.Sign() <= 0 {
			return false
		}
		for _, x := range e {
			if x%2 != 0 {
				return false
			}
		}
	}
	return true
}

// line is a polynomial whose support lies on a line: c·w^base·p(w^u).
type line struct {
	base []int
	u    []int
	p    upoly
}

// alongLine writes q as w^base·p(w^u) with u primitive and p(0) ≠ 0 when
// the support of q is collinear; ok is false otherwise. A single term gives
// a constant p.
func alongLine(q *monomial.Poly) (line, bool) {
	sup := q.Support()
	base := []int(sup[0])
	if len(sup) == 1 {
		_, c := q.Term(0)
		return line{base: base, u: make([]int, len(base)), p: upoly{c}}, true
	}
	u := primitive(base, sup[1])
	for _, e := range sup[2:] {
		if _, ok := stepsAlong(base, e, u); !ok {
			return line{}, false
		}
	}
	return line{base: base, u: u, p: univariate(q, base, u)}, true
}

// primitive returns (b − a)/g with g the gcd of the entries of b − a.
func primitive(a, b []int) []int {
	u := make([]int, len(a))
	g := 0
	for i := range a {
		u[i] = b[i] - a[i]
		g = gcdInt(g, u[i])
	}
	for i := range u {
		u[i] /= g
	}
	return u
}

func gcdInt(a, b int) int {
	if a < 0 {
		a = -a
	}
	if b < 0 {
		b = -b
	}
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// stepsAlong returns k with e = base + k·u, if there is one.
func stepsAlong(base, e, u []int) (int, bool) {
	k, set := 0, false
	for i := range u {
		diff := e[i] - base[i]
		if u[i] == 0 {
			if diff != 0 {
				return 0, false
			}
			continue
		}
		if diff%u[i] != 0 {
			return 0, false
		}
		if !set {
			k, set = diff/u[i], true
		} else if diff/u[i] != k {
			return 0, false
		}
	}
	return k, true
}

// univariate returns p with q = w^(base + kmin·u)·p(w^u): the coefficients of
// q indexed by the step k along u, shifted so that p(0) ≠ 0. Every exponent
// of q must lie on the line base + Z·u.
func univariate(q *monomial.Poly, base, u []int) upoly {
	type kc struct {
		k int
		c *big.Rat
	}
	var terms []kc
	kmin := math.MaxInt
	for e, c := range q.All() {
		k, ok := stepsAlong(base, e, u)
		if !ok {
			panic("rlct: internal error: exponent off the line")
		}
		terms = append(terms, kc{k, c})
		kmin = min(kmin, k)
	}
	kmax := math.MinInt
	for _, t := range terms {
		kmax = max(kmax, t.k)
	}
	p := make(upoly, kmax-kmin+1)
	for i := range p {
		p[i] = new(big.Rat)
	}
	for _, t := range terms {
		p[t.k-kmin].Add(p[t.k-kmin], t.c)
	}
	return p.trim()
}

// torusWitness returns a point of the real torus with w^u = r for the root
// r isolated in iv: all coordinates 1 but one, w_j, chosen with u_j odd when
// r < 0 (a primitive u has an odd entry) and with |u_j| = 1 when possible.
func torusWitness(vars []string, u []int, iv interval) *Witness {
	r := iv.Lo
	if !iv.exact() {
		r = new(big.Rat).Add(iv.Lo, iv.Hi)
		r.Quo(r, big.NewRat(2, 1))
	}
	j := -1
	for i, x := range u {
		if x == 0 || (r.Sign() < 0 && x%2 == 0) {
			continue
		}
		if j < 0 || abs(x) < abs(u[j]) {
			j = i
		}
	}
	w := &Witness{Root: formatRoot(iv), Monomial: monomialString(vars, u)}
	for i, name := range vars {
		if i != j {
			w.Point = append(w.Point, name+"=1")
			continue
		}
		if iv.exact() {
			if v, ok := ratRoot(r, abs(u[j])); ok {
				if u[j] < 0 {
					v.Inv(v)
				}
				w.Point = append(w.Point, name+"="+v.RatString())
				continue
			}
		}
		f, _ := r.Float64()
		v := math.Pow(math.Abs(f), 1/float64(u[j]))
		if f < 0 {
			v = -v
		}
		w.Point = append(w.Point, fmt.Sprintf("%s≈%.9g", name, v))
	}
	return w
}

// ratRoot returns the real k-th root of r when it is rational (k ≥ 1; for
// even k, r must be positive, which torusWitness guarantees).
func ratRoot(r *big.Rat, k int) (*big.Rat, bool) {
	num, ok1 := intRoot(new(big.Int).Abs(r.Num()), k)
	den, ok2 := intRoot(r.Denom(), k)
	if !ok1 || !ok2 || (r.Sign() < 0 && k%2 == 0) {
		return nil, false
	}
	v := new(big.Rat).SetFrac(num, den)
	if r.Sign() < 0 {
		v.Neg(v)
	}
	return v, true
}

// intRoot returns the k-th root of n ≥ 0 when n is a perfect k-th power, by
// bisection.
func intRoot(n *big.Int, k int) (*big.Int, bool) {
	lo, hi := big.NewInt(0), new(big.Int).Add(n, big.NewInt(1))
	kk := big.NewInt(int64(k))
	for new(big.Int).Sub(hi, lo).Cmp(big.NewInt(1)) > 0 {
		mid := new(big.Int).Rsh(new(big.Int).Add(lo, hi), 1)
		if new(big.Int).Exp(mid, kk, nil).Cmp(n) <= 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo, new(big.Int).Exp(lo, kk, nil).Cmp(n) == 0
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// monomialString writes w^u for an integer vector u (negative powers
// allowed), e.g. "x^2*y^-1".
func monomialString(vars []string, u []int) string {
	var parts []string
	for i, x := range u {
		switch x {
		case 0:
		case 1:
			parts = append(parts, vars[i])
		default:
			parts = append(parts, fmt.Sprintf("%s^%d", vars[i], x))
		}
	}
	if len(parts) == 0 {
		return "1"
	}
	return strings.Join(parts, "*")
}

func formatVertices(vs [][]int) string {
	parts := make([]string, len(vs))
	for i, v := range vs {
		s := make([]string, len(v))
		for k, x := range v {
			s[k] = fmt.Sprint(x)
		}
		parts[i] = "(" + strings.Join(s, ",") + ")"
	}
	return strings.Join(parts, " ")
}

// sameFace reports whether two faces have the same vertices and rays.
func sameFace(a, b *polyhedron.Face) bool {
	if len(a.Vertices) != len(b.Vertices) || len(a.Rays) != len(b.Rays) {
		return false
	}
	for i := range a.Vertices {
		if a.Vertices[i] != b.Vertices[i] {
			return false
		}
	}
	for i := range a.Rays {
		if a.Rays[i] != b.Rays[i] {
			return false
		}
	}
	return true
}
