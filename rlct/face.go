package rlct

import (
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

// Face describes a face of P(K) and, for compact faces that were
// examined, how its nondegeneracy was decided. In JSON the integers of
// Normal and RHS are strings, as every exact number is.
type Face struct {
	// Dim is the dimension of the face, Codim its codimension.
	Dim   int
	Codim int
	// Compact reports that the face is bounded (it has no rays).
	Compact bool
	// Principal reports that the face holds t_τ·τ in its relative
	// interior.
	Principal bool
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
	// Outside the full face list (Options.AllFaces) a long polynomial is
	// abbreviated after its first terms, and Terms gives the full count.
	Polynomial string
	// Terms is the number of terms of the face polynomial (in
	// sum-of-squares form, of all the squared parts together).
	Terms int
	// Verdict, Rule, Witness and Reason record the nondegeneracy test
	// (compact faces that were examined only; empty otherwise).
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

// maxPrintedTerms is how many terms of a face polynomial the default
// report holds before abbreviating it: enough for any face a reader
// studies, while a face of 10^5 terms does not make the report megabytes
// long (the full report, Options.AllFaces, keeps every term).
const maxPrintedTerms = 1000

// faceCase is one compact face being decided: the face, its dimension and
// the part of each analysed polynomial on it.
type faceCase struct {
	face  *polyhedron.Face
	parts []*monomial.Poly // K's part, or each generator's part
	sos   bool
	vars  []string
	verts [][]int // the points of the base polyhedron (Newton.Points), indexed by face.Vertices
}

// report describes face f of the base polyhedron in P(K) coordinates, with
// the face polynomial printed from parts (nil: computed here).
func (an *analysis) report(f *polyhedron.Face, parts []*monomial.Poly) Face {
	d := len(an.vars)
	verts := an.res.newton.Points()
	fr := Face{Dim: f.Dim, Codim: f.Codim(d), Compact: f.Compact(), Normal: f.Normal}
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
	limit := maxPrintedTerms
	if an.opt.AllFaces {
		limit = math.MaxInt
	}
	fr.Polynomial, fr.Terms = an.facePolynomial(parts, limit)
	return fr
}

// parts returns, for each analysed polynomial, its part on face f: the
// terms whose exponent lies on f.
func (an *analysis) parts(f *polyhedron.Face) []*monomial.Poly {
	onFace := func(e monomial.Exponent) bool { return f.Contains([]int(e)) }
	out := make([]*monomial.Poly, len(an.polys))
	for i, q := range an.polys {
		out[i] = q.Filter(onFace)
	}
	return out
}

// ratOne is 1, for comparisons only.
var ratOne = big.NewRat(1, 1)

// facePolynomial prints the face polynomial of K from the parts (in
// sum-of-squares form with the generator weights written in front of the
// squares they multiply), with at
// most limit terms before an abbreviation, and returns it with its number
// of terms.
func (an *analysis) facePolynomial(parts []*monomial.Poly, limit int) (string, int) {
	total := 0
	for _, q := range parts {
		total += q.Len()
	}
	if !an.sos {
		return abbreviatePoly(parts[0], limit), total
	}
	var terms []string
	shown := 0
	for i, q := range parts {
		if q.IsZero() {
			continue
		}
		if shown >= limit {
			terms = append(terms, "…")
			break
		}
		weight := ""
		if an.weights != nil && an.weights[i].Cmp(ratOne) != 0 {
			weight = an.weights[i].RatString() + "*"
		}
		terms = append(terms, weight+"("+abbreviatePoly(q, limit-shown)+")^2")
		shown += q.Len()
	}
	return strings.Join(terms, " + "), total
}

// abbreviatePoly prints q, or its first limit terms followed by a note of how
// many more there are.
func abbreviatePoly(q *monomial.Poly, limit int) string {
	if q.Len() <= limit {
		return q.String()
	}
	k := 0
	head := q.Filter(func(monomial.Exponent) bool { k++; return k <= limit })
	return fmt.Sprintf("%s + … (%d more terms)", head.String(), q.Len()-limit)
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

// formatRoot renders an isolated root: the exact rational, or its interval.
func formatRoot(iv interval) string {
	if iv.exact() {
		return iv.Lo.RatString()
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	return fmt.Sprintf("≈%s in (%s, %s]", mid.FloatString(9), iv.Lo.RatString(), iv.Hi.RatString())
}
