package picture

import (
	"errors"
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/rlct"
)

// MinVars and MaxVars are the fewest and the most variables a picture can
// show.
const (
	MinVars = 2
	MaxVars = 3
)

var (
	// ErrDimension is returned (wrapped) for a polyhedron in fewer than
	// MinVars or more than MaxVars variables.
	ErrDimension = errors.New("picture: a picture needs 2 or 3 variables")
	// ErrMalformed is returned (wrapped) for a description that is not one
	// rlct.Describe could have made: missing fields, lengths that do not
	// match the variables, or facets and faces that do not fit together.
	ErrMalformed = errors.New("picture: malformed description")
	// ErrTooLarge is returned (wrapped) when an exponent or a coordinate of
	// t_τ·τ exceeds 2^50.
	ErrTooLarge = errors.New("picture: exponents too large to draw")
)

// SVG draws the Newton polyhedron that d describes as an SVG document, with
// title as its heading (such as "K = x^4 + y^6"; it is shortened when long).
// d must come from rlct.Describe, or be consistent as if it did, for K in
// two or three variables. SVG returns an error wrapping ErrDimension for
// another number of variables, ErrTooLarge for exponents beyond 2^50, and
// ErrMalformed when d is incomplete or its facets do not fit together.
func SVG(d *rlct.Description, title string) ([]byte, error) {
	sc, err := newScene(d)
	if err != nil {
		return nil, err
	}
	return sc.page(title), nil
}

// scene is a checked description with the exact geometry of the picture.
type scene struct {
	d      *rlct.Description
	n      int       // the number of variables, 2 or 3
	verts  [][]int64 // the vertices of P(K)
	facets []*facet  // the facets of P(K), in the order of d.Facets
	shapes []*shape  // facet i cut at the frame
	box    []int64   // the far sides of the frame
	// stretched is set when the axes are drawn to different scales.
	stretched bool
	chain     [][]int64   // in two variables, the vertices along the boundary
	flags     []flagged   // the compact faces that are degenerate or undetermined
	pf        facePicture // the principal face
}

// facePicture is a face of P(K) in integer coordinates, as drawn.
type facePicture struct {
	dim     int
	verts   [][]int64
	rays    []int
	facet   int       // in three variables, the facet the face is (dimension 2), else −1
	corners [][]int64 // a compact face of dimension 2: its vertices in order
}

// flagged is a compact face whose polynomial may vanish in the torus.
type flagged struct {
	verdict rlct.FaceVerdict
	face    facePicture
}

// malformed returns an error wrapping ErrMalformed.
func malformed(format string, args ...any) error {
	return fmt.Errorf("%w: %s", ErrMalformed, fmt.Sprintf(format, args...))
}

// newScene checks d and builds the geometry of its picture.
func newScene(d *rlct.Description) (*scene, error) {
	if d == nil || d.Result == nil {
		return nil, malformed("no description")
	}
	n := len(d.Vars)
	if n < MinVars || n > MaxVars {
		return nil, fmt.Errorf("%w; K has %d (%s)", ErrDimension, n, strings.Join(d.Vars, ", "))
	}
	sc := &scene{d: d, n: n}
	if err := sc.checkResult(); err != nil {
		return nil, err
	}
	if len(d.Vertices) == 0 {
		return nil, malformed("no vertices")
	}
	for _, v := range d.Vertices {
		p, err := sc.point(v.Exponent)
		if err != nil {
			return nil, fmt.Errorf("vertex: %w", err)
		}
		sc.verts = append(sc.verts, p)
	}
	for _, e := range d.Support {
		if _, err := sc.point(e); err != nil {
			return nil, fmt.Errorf("support: %w", err)
		}
	}
	for _, fr := range d.Facets {
		f, err := sc.facet(fr)
		if err != nil {
			return nil, err
		}
		sc.facets = append(sc.facets, f)
	}
	sc.box = frameExtents(sc.verts, d.Hit)
	extents := make([]float64, n)
	for j, b := range sc.box {
		extents[j] = float64(b)
	}
	sc.stretched = !sameScale(extents...)
	if n == 2 && !sc.stretched {
		// One scale for both axes keeps the lattice square and the
		// direction of τ true.
		m := max(sc.box[0], sc.box[1])
		sc.box[0], sc.box[1] = m, m
	}
	for _, f := range sc.facets {
		sh, err := facetShape(f, sc.box)
		if err != nil {
			return nil, fmt.Errorf("%w: %w", ErrMalformed, err)
		}
		sc.shapes = append(sc.shapes, sh)
	}
	if n == 2 {
		chain, err := boundary2(sc.facets)
		if err != nil {
			return nil, fmt.Errorf("%w: %w", ErrMalformed, err)
		}
		if !sameSet(chain, sc.verts) {
			return nil, malformed("the edges join the vertices %s, but the vertices are %s", pointsString(chain), pointsString(sc.verts))
		}
		sc.chain = chain
	}
	pf, err := sc.face(d.Principal)
	if err != nil {
		return nil, fmt.Errorf("principal face: %w", err)
	}
	sc.pf = pf
	for _, f := range d.Faces {
		if f.Verdict != rlct.Degenerate && f.Verdict != rlct.Undetermined {
			continue
		}
		if !f.Compact {
			return nil, malformed("an unbounded face is %s; only compact faces are decided", f.Verdict)
		}
		fp, err := sc.face(f)
		if err != nil {
			return nil, fmt.Errorf("%s face: %w", f.Verdict, err)
		}
		sc.flags = append(sc.flags, flagged{f.Verdict, fp})
	}
	return sc, nil
}

// checkResult checks the numbers the caption and the frame read.
func (sc *scene) checkResult() error {
	d := sc.d
	if d.Lambda == nil || d.Distance == nil {
		return malformed("no λ or t_τ")
	}
	for _, v := range []struct {
		name string
		xs   []*big.Rat
		opt  bool
	}{{"the hit point", d.Hit, false}, {"τ", d.Weights, false}, {"the point", d.Point, false}, {"the prior", d.Prior, true}} {
		if len(v.xs) != sc.n && !(v.opt && len(v.xs) == 0) {
			return malformed("%s has %d coordinates for %d variables", v.name, len(v.xs), sc.n)
		}
		if slices.Contains(v.xs, nil) {
			return malformed("%s has a missing coordinate", v.name)
		}
	}
	limit := new(big.Rat).SetInt64(maxCoordinate)
	for _, h := range d.Hit {
		if h.Sign() < 0 {
			return malformed("the hit point %s has a negative coordinate", ratList(d.Hit))
		}
		if h.Cmp(limit) > 0 {
			return fmt.Errorf("%w: the hit point has the coordinate %s", ErrTooLarge, h.RatString())
		}
	}
	return nil
}

// point converts an exponent vector, checking its length and range.
func (sc *scene) point(e []int) ([]int64, error) {
	if len(e) != sc.n {
		return nil, malformed("%v has %d coordinates for %d variables", e, len(e), sc.n)
	}
	p := make([]int64, sc.n)
	for i, x := range e {
		if x < 0 {
			return nil, malformed("%v has a negative exponent", e)
		}
		if int64(x) > maxCoordinate {
			return nil, fmt.Errorf("%w: %v has the exponent %d", ErrTooLarge, e, x)
		}
		p[i] = int64(x)
	}
	return p, nil
}

// vertices converts exponent vectors that must be vertices of P(K).
func (sc *scene) vertices(es [][]int) ([][]int64, error) {
	var out [][]int64
	for _, e := range es {
		p, err := sc.point(e)
		if err != nil {
			return nil, err
		}
		if !slices.ContainsFunc(sc.verts, func(v []int64) bool { return slices.Equal(v, p) }) {
			return nil, malformed("%s is not a vertex of P(K)", pointString(p))
		}
		out = append(out, p)
	}
	return out, nil
}

// axes converts variable names to axes, ascending.
func (sc *scene) axes(names []string) ([]int, error) {
	var out []int
	for _, name := range names {
		j := slices.Index(sc.d.Vars, name)
		if j < 0 || slices.Contains(out, j) {
			return nil, malformed("ray %q is not a variable, or repeated", name)
		}
		out = append(out, j)
	}
	slices.Sort(out)
	return out, nil
}

// facet checks a facet: a non-negative normal whose zero entries are the
// rays, and vertices on the hyperplane a·x = b.
func (sc *scene) facet(fr rlct.Facet) (*facet, error) {
	f := &facet{normal: fr.Normal, rhs: fr.RHS, label: fr.Inequality}
	if f.label == "" {
		f.label = "(unnamed)"
	}
	if len(fr.Normal) != sc.n || fr.RHS == nil || slices.Contains(fr.Normal, nil) {
		return nil, malformed("facet %s: the normal has %d entries for %d variables, or an entry is missing", f.label, len(fr.Normal), sc.n)
	}
	rays, err := sc.axes(fr.Rays)
	if err != nil {
		return nil, fmt.Errorf("facet %s: %w", f.label, err)
	}
	f.rays = rays
	for j, a := range fr.Normal {
		if a.Sign() < 0 || (a.Sign() == 0) != slices.Contains(rays, j) {
			return nil, malformed("facet %s: the normal %s does not match the rays %v", f.label, intList(fr.Normal), fr.Rays)
		}
	}
	if len(rays) == sc.n {
		return nil, malformed("facet %s has a zero normal", f.label)
	}
	if f.verts, err = sc.vertices(fr.Vertices); err != nil {
		return nil, fmt.Errorf("facet %s: %w", f.label, err)
	}
	for _, v := range f.verts {
		s := new(big.Int)
		for j, a := range fr.Normal {
			s.Add(s, new(big.Int).Mul(a, big.NewInt(v[j])))
		}
		if s.Cmp(fr.RHS) != 0 {
			return nil, malformed("facet %s: the vertex %s is not on it", f.label, pointString(v))
		}
	}
	return f, nil
}

// face checks a face of P(K) and finds what draws it: its vertices for a
// vertex or an edge, the facet it is for a face of dimension 2 in three
// variables, and the order of the corners of a compact one.
func (sc *scene) face(fr rlct.Face) (facePicture, error) {
	fp := facePicture{dim: fr.Dim, facet: -1}
	var err error
	if fp.verts, err = sc.vertices(fr.Vertices); err != nil {
		return fp, err
	}
	if fp.rays, err = sc.axes(fr.Rays); err != nil {
		return fp, err
	}
	if fr.Compact != (len(fp.rays) == 0) {
		return fp, malformed("a face marked compact=%v has the rays %v", fr.Compact, fr.Rays)
	}
	switch {
	case fr.Dim == 0 && len(fp.verts) == 1 && len(fp.rays) == 0:
	case fr.Dim == 1 && len(fp.verts) == 2 && len(fp.rays) == 0:
	case fr.Dim == 1 && len(fp.verts) == 1 && len(fp.rays) == 1:
	case fr.Dim == 2 && sc.n == 3 && len(fp.verts)+len(fp.rays) >= 3:
		for i, f := range sc.facets {
			if sameSet(f.verts, fp.verts) && slices.Equal(f.rays, fp.rays) {
				fp.facet = i
			}
		}
		if fp.facet < 0 {
			return fp, malformed("the face with vertices %s and rays %v is no facet", pointsString(fp.verts), fr.Rays)
		}
		if len(fp.rays) == 0 {
			fp.corners = sc.shapes[fp.facet].corners
		}
	default:
		return fp, malformed("a face of dimension %d with %d vertices and %d rays in %d variables",
			fr.Dim, len(fp.verts), len(fp.rays), sc.n)
	}
	return fp, nil
}

// sameScale reports whether axes reaching these extents are drawn to one
// scale: unless the longest is more than three times the shortest, which
// would squeeze the others into a sliver.
func sameScale(extents ...float64) bool {
	return slices.Max(extents) <= 3*slices.Min(extents)
}

// ratList writes exact rationals separated by commas.
func ratList(xs []*big.Rat) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = x.RatString()
	}
	return strings.Join(parts, ", ")
}

func intList(xs []*big.Int) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = x.String()
	}
	return "(" + strings.Join(parts, ",") + ")"
}
