package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"slices"
)

// ErrFace is returned by Covers and NormalConeMin for a *Face that does not
// describe a face of P: nil, vertex or ray indices out of range or not
// strictly ascending, vertices and rays that are not exactly those of one
// face of P, or a wrong Dim; for a face that is not compact where a compact
// one is required; and by FacetsContaining, which checks only the indices.
var ErrFace = errors.New("polyhedron: not a face of the polyhedron")

// Side returns the sign of f.Normal·x − f.RHS: −1, 0 or +1. For a point x
// of P, 0 means that x lies on f, since the normal exposes f (f = P ∩
// {Normal·y = RHS}) and Normal·y >= RHS on P.
//
// Method: the dot product is accumulated in int64 with overflow detection
// (no allocation) and recomputed with math/big only when an entry of the
// normal does not fit in an int64 or a product or partial sum would
// overflow. Cost: O(d).
//
// Side panics if f.Normal or f.RHS is nil or len(x) != len(f.Normal) (a
// caller mistake: every face returned by this package has a normal of
// length d).
func (f *Face) Side(x []int) int {
	if f.Normal == nil || f.RHS == nil || len(x) != len(f.Normal) {
		panic(fmt.Sprintf("polyhedron: Face.Side: point of length %d for a normal of length %d", len(x), len(f.Normal)))
	}
	if s, ok := smallDot(f.Normal, x); ok {
		if f.RHS.IsInt64() {
			r := f.RHS.Int64()
			switch {
			case s < r:
				return -1
			case s > r:
				return 1
			}
			return 0
		}
		return -f.RHS.Sign() // |RHS| >= 2^63 > |s|
	}
	var acc, prod big.Int
	for i, a := range f.Normal {
		if x[i] != 0 && a.Sign() != 0 {
			prod.Mul(a, prod.SetInt64(int64(x[i])))
			acc.Add(&acc, &prod)
		}
	}
	return acc.Cmp(f.RHS)
}

// smallDot returns a·x in int64, and false if an entry of a does not fit
// or a product or partial sum would overflow.
func smallDot(a []*big.Int, x []int) (int64, bool) {
	var s int64
	for i, ai := range a {
		if x[i] == 0 || ai.Sign() == 0 {
			continue
		}
		if !ai.IsInt64() {
			return 0, false
		}
		term, ok := mul64(ai.Int64(), int64(x[i]))
		if !ok {
			return 0, false
		}
		ns := s + term
		if (term > 0 && ns < s) || (term < 0 && ns > s) {
			return 0, false
		}
		s = ns
	}
	return s, true
}

// Contains reports whether the point x lies on the face f, i.e. f.Side(x)
// == 0. x must be a point of P (for instance an exponent of the polynomial
// whose Newton polyhedron P is): for a point outside P a zero side only
// means that x is on the hyperplane Normal·y = RHS. Cost: O(d). It panics
// when Side does.
func (f *Face) Contains(x []int) bool { return f.Side(x) == 0 }

// Equal reports whether f and g are the same face of P: the same vertex
// indices and the same rays. Normals are not compared: a face that is not a
// facet has many exposing normals, and different methods return different
// ones. Two nil faces are equal. Cost: O(#vertices + #rays).
func (f *Face) Equal(g *Face) bool {
	if f == nil || g == nil {
		return f == g
	}
	return slices.Equal(f.Vertices, g.Vertices) && slices.Equal(f.Rays, g.Rays)
}

// Exposes reports whether f's Normal and RHS expose exactly f: len(Normal)
// == d, Normal >= 0, Normal·v >= RHS for every vertex v of P with equality
// exactly for the vertices listed in f.Vertices (which must be nonempty),
// and Normal_i == 0 exactly for the coordinates i listed in f.Rays. Then
// f = P ∩ {Normal·x = RHS} is a face of P with those vertices and rays (a
// check to run before trusting a face's normal, for instance one built or
// modified by hand). f.Dim and f.Facets are not checked. It returns an
// error wrapping ctx.Err() when ctx is done first.
//
// Method: exact integer evaluation of the normal on every vertex (int64 with
// overflow detection, math/big fallback), O(V·d) for V vertices, when the
// vertices are known. Otherwise the normal is evaluated on all N input
// points, O(N·d), and the vertices among the points where it is tight are
// found by the vertex filter on those points alone (see FaceAt): the
// vertices of P are never computed for this.
func (n *Newton) Exposes(ctx context.Context, f *Face) (bool, error) {
	if n.vertsDone.Load() {
		return n.exposes(f), nil
	}
	if !n.normalMatchesRays(f) {
		return false, nil
	}
	dt := newDotter(f.Normal)
	var tight []int
	for j, p := range n.points {
		switch dt.dot(p).Cmp(f.RHS) {
		case -1:
			return false, nil
		case 0:
			tight = append(tight, j)
		}
	}
	if len(tight) == 0 {
		return false, nil
	}
	verts, err := n.tightVertices(ctx, tight)
	if err != nil {
		return false, err
	}
	return slices.Equal(verts, f.Vertices), nil
}

// normalMatchesRays checks the parts of Exposes that concern the normal
// alone: f has vertices, len(Normal) == d, Normal >= 0, and Normal_i == 0
// exactly for i in f.Rays (ascending).
func (n *Newton) normalMatchesRays(f *Face) bool {
	if f == nil || len(f.Vertices) == 0 || len(f.Normal) != n.d || f.RHS == nil {
		return false
	}
	k := 0 // position in f.Rays
	for i, a := range f.Normal {
		if a == nil || a.Sign() < 0 {
			return false
		}
		isRay := k < len(f.Rays) && f.Rays[k] == i
		if isRay {
			k++
		}
		if (a.Sign() == 0) != isRay {
			return false
		}
	}
	return k == len(f.Rays) // else Rays not ascending or out of range
}

// exposes is Exposes once the vertices are known.
func (n *Newton) exposes(f *Face) bool {
	if !n.normalMatchesRays(f) {
		return false
	}
	dt := newDotter(f.Normal)
	k := 0 // position in f.Vertices
	for _, j := range n.vertexIdx {
		for k < len(f.Vertices) && f.Vertices[k] < j {
			return false // a listed point that is no vertex (vertexIdx is ascending)
		}
		c := dt.dot(n.points[j]).Cmp(f.RHS)
		if c < 0 {
			return false
		}
		own := k < len(f.Vertices) && f.Vertices[k] == j
		if own {
			k++
		}
		if (c == 0) != own {
			return false
		}
	}
	return k == len(f.Vertices)
}

// validIndices reports whether xs is strictly ascending with entries in
// [0, limit).
func validIndices(xs []int, limit int) bool {
	for k, x := range xs {
		if x < 0 || x >= limit || (k > 0 && xs[k-1] >= x) {
			return false
		}
	}
	return true
}

// checkFace verifies that f describes a face of P (see ErrFace) and returns
// an exposing integer normal for it: f's own when it exposes f, or else the
// one found at the relative interior point Σ_{v in f} v/k + Σ_{i in rays}
// e_i, whose face must then be f. The dimension must match the affine rank.
// It computes the vertices first if they are not known yet.
func (n *Newton) checkFace(ctx context.Context, f *Face) ([]*big.Int, *big.Int, error) {
	if f == nil {
		return nil, nil, fmt.Errorf("%w: nil face", ErrFace)
	}
	if err := n.ensureVertices(ctx); err != nil {
		return nil, nil, err
	}
	if len(f.Vertices) == 0 || !validIndices(f.Vertices, len(n.points)) || !validIndices(f.Rays, n.d) ||
		slices.ContainsFunc(f.Vertices, func(j int) bool { return !n.isVertex[j] }) {
		return nil, nil, fmt.Errorf("%w: vertices %v, rays %v", ErrFace, f.Vertices, f.Rays)
	}
	if dim := n.faceDim(f.Vertices, f.Rays); dim != f.Dim {
		return nil, nil, fmt.Errorf("%w: vertices %v and rays %v span dimension %d, face says %d", ErrFace, f.Vertices, f.Rays, dim, f.Dim)
	}
	if n.exposes(f) {
		return f.Normal, f.RHS, nil
	}
	x := n.centroid(f.Vertices)
	for _, i := range f.Rays {
		x[i].Add(x[i], ratOne)
	}
	g, sign, err := n.faceHolding(ctx, x)
	if err != nil {
		return nil, nil, err
	}
	if sign != 0 || !g.Equal(f) {
		return nil, nil, fmt.Errorf("%w: vertices %v and rays %v are not those of a face", ErrFace, f.Vertices, f.Rays)
	}
	return g.Normal, g.RHS, nil
}

// centroid returns the average of the given vertices.
func (n *Newton) centroid(verts []int) []*big.Rat {
	x := make([]*big.Rat, n.d)
	k := big.NewInt(int64(len(verts)))
	var s, t big.Int
	for i := range x {
		s.SetInt64(0)
		for _, j := range verts {
			s.Add(&s, t.SetInt64(int64(n.points[j][i])))
		}
		x[i] = new(big.Rat).SetFrac(&s, k)
	}
	return x
}

// faceHolding shoots from x along (1,…,1) and returns the sign of t0 (−1:
// x interior, +1: x outside P) and, when t0 = 0, the face holding x in its
// relative interior (see FaceAt).
func (n *Newton) faceHolding(ctx context.Context, x []*big.Rat) (*Face, int, error) {
	s := n.shoot(x, ratOnes(n.d))
	if sign := s.t.Sign(); sign != 0 {
		return nil, sign, nil
	}
	f, err := n.faceFromShot(ctx, x, s)
	if err != nil {
		return nil, 0, err
	}
	return f, 0, nil
}

// CompactFaceAt returns, for a point x of P, the face of P that holds x in
// its relative interior when that face is compact, and (nil, nil) when x is
// in the interior of P or its face is not compact. The face is complete
// (Vertices, empty Rays, Dim, a strictly positive primitive integer Normal
// exposing it, RHS). It returns an error wrapping ErrDimension if len(x) !=
// d or an entry is nil, ErrNotBoundary if x is outside P, and one wrapping
// ctx.Err() if ctx (which may be nil) is done before the LP. It computes the
// vertices first if they are not known yet (see Vertices).
//
// Method: a point on a compact face dominates no other point of P (a
// strictly positive normal would be larger on it), so x is first compared
// coordinatewise with the Pareto-minimal points (integer comparisons of
// ⌊x_i⌋, O(M·d) for M minimal points); if x >= m for a minimal m != x, the
// answer is nil without any LP. Otherwise float64 LPs propose the answer
// and exact certificates confirm it (see compactFaceFast: an exactly solved
// basis for an interior point or for a representation using a ray; for a
// compact face, an exact strictly positive representation of x over its
// vertices and an exposing normal checked by Exposes). When a certificate
// fails, the face is found by exact LPs as by FaceAt (ray-shooting LP from
// x along (1,…,1), then the face of the hit point), stopping early when the
// representation of x already uses a ray. Cost: that scan, a float LP over
// the V vertices with O(V·d) pricing rounds and O(V·d) exact checks; the
// cost of FaceAt in the fallback.
func (n *Newton) CompactFaceAt(ctx context.Context, x []*big.Rat) (*Face, error) {
	if len(x) != n.d {
		return nil, fmt.Errorf("%w: point has %d coordinates, want %d", ErrDimension, len(x), n.d)
	}
	fl := make([]int, n.d)
	integral := true
	var q big.Int
	for i, xi := range x {
		if xi == nil {
			return nil, fmt.Errorf("%w: coordinate %d is nil", ErrDimension, i)
		}
		if xi.Sign() < 0 {
			return nil, fmt.Errorf("%w: coordinate %d is negative, so the point is outside P", ErrNotBoundary, i)
		}
		if !xi.IsInt() {
			integral = false
		}
		q.Quo(xi.Num(), xi.Denom()) // floor, as x_i >= 0
		if q.IsInt64() && q.Int64() <= math.MaxInt {
			fl[i] = int(q.Int64())
		} else {
			fl[i] = math.MaxInt // m_i <= ⌊x_i⌋ still decides m_i <= x_i
		}
	}
	if err := n.ensureVertices(ctx); err != nil {
		return nil, err
	}
	for _, m := range n.minimal {
		if dominates(m, fl) && !(integral && slices.Equal(m, fl)) {
			return nil, nil // x >= m, x != m: x is on no compact face
		}
	}
	if err := contextErr(ctx); err != nil {
		return nil, err
	}
	if f, decided := n.compactFaceFast(x); decided {
		return f, nil
	}
	s := n.shoot(x, ratOnes(n.d))
	switch s.t.Sign() {
	case -1:
		return nil, nil
	case 1:
		return nil, fmt.Errorf("%w: it is outside P", ErrNotBoundary)
	}
	for _, si := range s.slack {
		if si.Sign() > 0 {
			return nil, nil // x = Σ λ_j v_j + s uses a ray: its face is not compact
		}
	}
	f, err := n.faceFromShot(ctx, x, s)
	if err != nil {
		return nil, err
	}
	if !f.Compact() {
		return nil, nil
	}
	return f, nil
}

// FacetsContaining returns the indices into Facets() of the facets that
// contain the face f (all of f's vertices lie on the facet and the facet's
// normal vanishes on f's rays), ascending. It enumerates the facets first
// (see Facets) and returns their error, or one wrapping ErrFace when f's
// vertex or ray indices are out of range, not strictly ascending, or name a
// point that is no vertex.
//
// Method: intersection of the per-vertex facet bitsets built with the
// facets, then a check of the rays. Cost: O(|f.Vertices|·F/64 + F·|f.Rays|)
// for F facets, after the enumeration.
func (n *Newton) FacetsContaining(ctx context.Context, f *Face) ([]int, error) {
	if f == nil || !validIndices(f.Vertices, len(n.points)) || !validIndices(f.Rays, n.d) {
		return nil, fmt.Errorf("%w: bad vertex or ray indices", ErrFace)
	}
	fs, err := n.Facets(ctx)
	if err != nil {
		return nil, err
	}
	if slices.ContainsFunc(f.Vertices, func(j int) bool { return !n.isVertex[j] }) {
		return nil, fmt.Errorf("%w: a listed point is no vertex", ErrFace)
	}
	set := make([]uint64, (len(fs)+63)/64)
	for k := range fs {
		setBit(set, k)
	}
	for _, j := range f.Vertices {
		for w := range set {
			set[w] &= n.vertexFacets[j][w]
		}
	}
	out := []int{}
	for k := range fs {
		if !hasBit(set, k) {
			continue
		}
		if slices.ContainsFunc(f.Rays, func(i int) bool { return fs[k].Normal[i].Sign() != 0 }) {
			continue
		}
		out = append(out, k)
	}
	return out, nil
}
