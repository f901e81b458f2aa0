package rlct

import (
	"context"
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// Description is the Newton polyhedron P(K) written out in full beside the
// bound computed from it: the vertices with the terms of K there, the facets
// as inequalities, the exponents it was built from, and the point t_τ·τ where
// the weighted ray meets it. Everything is in P(K) coordinates, so in
// sum-of-squares form the exponents are twice those of the generators. Its
// JSON form is that of the Result with "vertices", "facets" and "hit_point"
// beside it.
type Description struct {
	// Result is the bound, exactly as Bound returns it.
	*Result
	// Vertices are the vertices of P(K), sorted lexicographically.
	Vertices []Vertex `json:"vertices"`
	// Facets are the facets of P(K), sorted by normal and then right-hand
	// side.
	Facets []Facet `json:"facets"`
	// Support holds the points whose Newton polyhedron P(K) is: the
	// exponents of K, or in sum-of-squares form twice the exponents of the
	// generators, without duplicates, sorted lexicographically.
	Support [][]int `json:"-"`
	// Hit is t_τ·τ, the point where the ray from the origin along τ meets
	// P(K); it lies in the relative interior of the principal face.
	Hit []*big.Rat `json:"hit_point"`
	// After is set by Describe with Options.AfterChanges when the answer
	// for K came through a change of coordinates whose last problem has a
	// polyhedron: "reduction" (the core after the reduction, in its own
	// variables) or "repair" (K after the repair's last step). Result is
	// then the answer for that problem, and Whole the answer for K.
	After string `json:"after,omitempty"`
	// Whole is set with Options.AfterChanges whenever the answer for K
	// came through a change of coordinates: that answer, whose Changes,
	// Reduction and Repair list the steps. When After is empty (the core
	// after the reduction is 0, so it has no polyhedron) the polyhedron is
	// that of K itself and Result its Newton value.
	Whole *Result `json:"whole,omitempty"`
}

// Vertex is a vertex of P(K) with the term of K there.
type Vertex struct {
	// Exponent is the vertex, an exponent vector of K.
	Exponent []int `json:"exponent"`
	// Monomial is w^Exponent in the parser's syntax, such as "x^4*y^2".
	Monomial string `json:"monomial"`
	// Coefficient is the coefficient of w^Exponent in K; it is never zero.
	// In sum-of-squares form it is Σ_i c_i² with c_i from Generators (each
	// square times its weight when Problem.GeneratorWeights is set): the
	// vertex is 2v for a vertex v of P(⟨g_1, …, g_r⟩), and the only way to
	// write 2v as a sum of two exponents of the generators is v + v, because
	// v is a vertex (common practice).
	Coefficient *big.Rat `json:"coefficient"`
	// Generators holds, in sum-of-squares form only, the coefficient c_i of
	// w^(Exponent/2) in each generator g_i (zero where g_i lacks the term);
	// nil in polynomial form.
	Generators []*big.Rat `json:"generators,omitempty"`
}

// Facet is a facet of P(K): the inequality a·x ≥ b holds on P(K), and
// the facet is P(K) ∩ {a·x = b}. In JSON the integers of Normal and RHS are
// strings, as every exact number is.
type Facet struct {
	// Normal is a, a primitive vector of non-negative integers.
	Normal []*big.Int
	// RHS is b.
	RHS *big.Int
	// Inequality is a·x ≥ b written with the variable names, such as
	// "3*x + 2*y >= 12".
	Inequality string
	// Vertices are the vertices of P(K) on the facet.
	Vertices [][]int
	// Rays names the variables whose unit directions lie in the facet; the
	// facet is compact when there are none.
	Rays []string
}

// Describe bounds p at each of its points, as Bound does with
// Options.AllFaces, Options.NoReduction and Options.NoRepair set (every
// compact face of the polyhedron of K itself is decided and listed), and
// describes the Newton polyhedron each answer comes from: one Description
// per point, in the order of Problem.Points (one for the origin when there
// are none). With Options.AfterChanges it bounds p as Bound does (with
// AllFaces) and, where the answer came through a change of coordinates,
// describes the problem after the last change instead (Description.After,
// Description.Whole). It returns the errors of Bound, and an error
// wrapping polyhedron.ErrTooLarge when the facets cannot be enumerated
// within opt.Limits; with several points the error names the point.
func Describe(ctx context.Context, p *Problem, opt *Options) ([]*Description, error) {
	o := Options{}
	if opt != nil {
		o = *opt
	}
	o.AllFaces = true
	plainOpt := o
	plainOpt.NoReduction = true // the answer the polyhedron gives, that of K itself
	plainOpt.NoRepair = true
	results, locals, err := boundEach(ctx, p, &plainOpt)
	if err != nil {
		return nil, err
	}
	var changed []*Result
	if o.AfterChanges {
		if changed, _, err = boundEach(ctx, p, &o); err != nil {
			return nil, err
		}
	}
	out := make([]*Description, len(results))
	for k, res := range results {
		l, after := locals[k], ""
		var whole *Result
		if changed != nil && (changed[k].Reduction != nil || changed[k].Repair != nil) {
			whole = changed[k]
			if final, what := lastProblem(whole); final != nil {
				res, l, after = final, final.local, what
			}
		}
		d, err := describe(ctx, res, l)
		if err != nil {
			return nil, atPoint(k, len(results), err)
		}
		d.After, d.Whole = after, whole
		out[k] = d
	}
	return out, nil
}

// lastProblem returns the answer for the problem after the last change of
// coordinates behind r, with its polyhedron, and which change it follows;
// nil when there is none with a polyhedron.
func lastProblem(r *Result) (*Result, string) {
	switch {
	case r.Repair != nil && r.Repair.final != nil && r.Repair.final.local != nil:
		return r.Repair.final, "repair"
	case r.Reduction != nil && r.Reduction.Core != nil && r.Reduction.Core.local != nil:
		return r.Reduction.Core, "reduction"
	}
	return nil, ""
}

// describe writes out the polyhedron of res, the answer for l.
func describe(ctx context.Context, res *Result, l *Local) (*Description, error) {
	facets, err := res.newton.Facets(ctx)
	if err != nil {
		return nil, fmt.Errorf("listing the facets of the Newton polyhedron: %w", err)
	}
	d := &Description{Result: res}
	scale := res.scale
	verts, err := res.newton.Vertices(ctx)
	if err != nil {
		return nil, err
	}
	for _, v := range verts {
		d.Vertices = append(d.Vertices, newVertex(res.Vars, l.Polys, l.GeneratorWeights, v, l.SumOfSquares, scale))
	}
	for _, f := range facets {
		d.Facets = append(d.Facets, newFacet(res.Vars, res.newton.Points(), f, scale))
	}
	d.Support = scaledSupport(l.Polys, scale)
	for _, w := range res.Weights {
		d.Hit = append(d.Hit, new(big.Rat).Mul(res.Distance, w))
	}
	return d, nil
}

// newVertex describes the vertex v of the base polyhedron.
// weights are Problem.GeneratorWeights (nil: all 1).
func newVertex(vars []string, polys []*monomial.Poly, weights []*big.Rat, v []int, sos bool, scale int) Vertex {
	vr := Vertex{Exponent: scaled(v, scale)}
	vr.Monomial = monomial.Monomial(vars, monomial.Exponent(vr.Exponent), big.NewRat(1, 1)).String()
	if !sos {
		vr.Coefficient = polys[0].Coefficient(monomial.Exponent(v))
		return vr
	}
	vr.Coefficient = new(big.Rat)
	sq := new(big.Rat)
	for i, g := range polys {
		c := g.Coefficient(monomial.Exponent(v))
		vr.Generators = append(vr.Generators, c)
		sq.Mul(c, c)
		if weights != nil {
			sq.Mul(sq, weights[i])
		}
		vr.Coefficient.Add(vr.Coefficient, sq)
	}
	return vr
}

// newFacet describes facet f of the base polyhedron in P(K) coordinates.
func newFacet(vars []string, verts [][]int, f polyhedron.Facet, scale int) Facet {
	fr := Facet{Normal: f.Normal, RHS: new(big.Int).Mul(f.RHS, big.NewInt(int64(scale)))}
	fr.Inequality = FormatInequality(vars, fr.Normal, fr.RHS)
	for _, j := range f.Vertices {
		fr.Vertices = append(fr.Vertices, scaled(verts[j], scale))
	}
	for _, i := range f.Rays {
		fr.Rays = append(fr.Rays, vars[i])
	}
	return fr
}

// FormatInequality writes a·x ≥ b with the variable names, as in
// "3*x + 2*y >= 12": terms with a zero coefficient are left out and a
// coefficient 1 is not written. It panics if len(a) != len(vars).
func FormatInequality(vars []string, a []*big.Int, b *big.Int) string {
	if len(a) != len(vars) {
		panic("rlct: FormatInequality: length mismatch")
	}
	var terms []string
	for i, c := range a {
		switch {
		case c.Sign() == 0:
		case c.IsInt64() && c.Int64() == 1:
			terms = append(terms, vars[i])
		default:
			terms = append(terms, c.String()+"*"+vars[i])
		}
	}
	if len(terms) == 0 {
		terms = []string{"0"}
	}
	return strings.Join(terms, " + ") + " >= " + b.String()
}

// scaledSupport returns the exponents of all polys times scale, without
// duplicates, sorted lexicographically.
func scaledSupport(polys []*monomial.Poly, scale int) [][]int {
	seen := map[string]bool{}
	var out [][]int
	for _, q := range polys {
		for _, e := range q.Support() {
			key := fmt.Sprint([]int(e))
			if seen[key] {
				continue
			}
			seen[key] = true
			out = append(out, scaled(e, scale))
		}
	}
	sortLex(out)
	return out
}

func scaled(v []int, scale int) []int {
	out := make([]int, len(v))
	for i, x := range v {
		out[i] = x * scale
	}
	return out
}

// sortLex sorts integer vectors of one length lexicographically.
func sortLex(vs [][]int) {
	slices.SortFunc(vs, slices.Compare[[]int])
}
