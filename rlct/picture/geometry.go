package picture

import (
	"fmt"
	"math/big"
	"slices"
	"strings"
)

// This file builds the polygons and segments of the picture from the exact
// facets of P(K). Every corner is an integer point: a vertex of P(K), or a
// vertex moved along a ray of its facet to the far side of the frame, whose
// sides are integers beyond every vertex. No coordinate is rounded before it
// is mapped to the page.

// maxCoordinate bounds the exponents that are drawn, so that the frame and
// every corner fit in an int64 and convert to float64 without rounding.
const maxCoordinate = 1 << 50

// sideKind says what a side of a drawn facet is.
type sideKind int

const (
	// sideBounded joins two vertices of P(K): it is an edge of P(K).
	sideBounded sideKind = iota
	// sideRay leaves a vertex of P(K) along a coordinate direction and
	// ends on the frame, beyond which P(K) continues.
	sideRay
	// sideCut is where the frame cuts an unbounded facet.
	sideCut
)

// side is one side of a drawn facet. For sideRay, a is the vertex of P(K)
// and b lies on the frame.
type side struct {
	a, b []int64
	kind sideKind
}

// facet is a facet of P(K) as the picture uses it: a·x ≥ b with exact
// integer vertices and the axes of its rays.
type facet struct {
	normal []*big.Int
	rhs    *big.Int
	verts  [][]int64 // the vertices of P(K) on the facet
	rays   []int     // axes j with e_j in the facet's recession cone, ascending
	label  string    // the inequality, for error messages
}

// compact reports whether the facet is bounded.
func (f *facet) compact() bool { return len(f.rays) == 0 }

// shape is a facet cut at the frame: a segment in two variables, a convex
// polygon in three, with its corners in order and its sides between them
// (side i joins corner i and corner i+1, cyclically for a polygon).
type shape struct {
	corners [][]int64
	sides   []side
}

// frameExtents returns the far side of the frame along each axis: the
// largest coordinate m of a vertex or of t_τ·τ rounded up, plus a quarter
// of it and at least one, so that the unbounded part shows.
func frameExtents(verts [][]int64, hit []*big.Rat) []int64 {
	box := make([]int64, len(hit))
	for j, h := range hit {
		m := ceilRat(h)
		for _, v := range verts {
			m = max(m, v[j])
		}
		m = max(m, 1)
		box[j] = m + max(1, (m+3)/4)
	}
	return box
}

// ceilRat is ⌈r⌉ for a non-negative r below 2^62.
func ceilRat(r *big.Rat) int64 {
	q, m := new(big.Int).QuoRem(r.Num(), r.Denom(), new(big.Int))
	if m.Sign() > 0 {
		q.Add(q, big.NewInt(1))
	}
	return q.Int64()
}

// facetShape cuts facet f of P(K) at the frame [0, box] and returns its
// corners in order. A compact facet is the convex hull of its vertices
// (in two variables the segment between them). An unbounded facet is its
// vertices plus its ray directions: each ray leaving the vertices is
// stopped at the far side of the frame, and the frame closes the polygon.
// It returns an error when the facet's vertices and rays do not make a
// facet of a Newton polyhedron.
func facetShape(f *facet, box []int64) (*shape, error) {
	n := len(box)
	if n == 2 {
		return facetSegment(f, box)
	}
	var sh shape
	switch len(f.rays) {
	case 0:
		// A compact facet is a convex polygon whose corners are its
		// vertices.
		corners, err := convexOrder(f.verts, f.normal)
		if err != nil {
			return nil, fmt.Errorf("facet %s: %w", f.label, err)
		}
		sh.corners = corners
		for i, c := range corners {
			sh.sides = append(sh.sides, side{c, corners[(i+1)%len(corners)], sideBounded})
		}
		return &sh, nil
	case 1:
		// a_j = 0 for the ray j and a_i, a_k > 0 for the others: the
		// facet is the strip above the chain of its vertices, which lie
		// on the line a_i·x_i + a_k·x_k = b. Order them by x_i; the frame
		// cuts the strip at x_j = box_j.
		j := f.rays[0]
		i := (j + 1) % 3
		if k := (j + 2) % 3; k < i {
			i = k
		}
		chain := sortedBy(f.verts, i)
		if len(chain) < 2 || !strictlyIncreasing(chain, i) {
			return nil, fmt.Errorf("facet %s with a ray along axis %d needs two or more vertices with different coordinates %d", f.label, j+1, i+1)
		}
		first, last := chain[0], chain[len(chain)-1]
		liftFirst, liftLast := moved(first, j, box[j]), moved(last, j, box[j])
		sh.corners = append(chain, liftLast, liftFirst)
		for a := 0; a+1 < len(chain); a++ {
			sh.sides = append(sh.sides, side{chain[a], chain[a+1], sideBounded})
		}
		sh.sides = append(sh.sides,
			side{last, liftLast, sideRay},
			side{liftLast, liftFirst, sideCut},
			side{first, liftFirst, sideRay})
	case 2:
		// a = e_i: the facet lies in the plane x_i = b and is the Newton
		// polygon of its vertices in the coordinates j < k of the rays, a
		// staircase from the vertex with the least x_j to the one with
		// the least x_k, cut at x_j = box_j and x_k = box_k.
		j, k := f.rays[0], f.rays[1]
		chain := sortedBy(f.verts, j)
		if len(chain) == 0 || !strictlyIncreasing(chain, j) || !strictlyDecreasing(chain, k) {
			return nil, fmt.Errorf("facet %s: its vertices do not form a staircase in coordinates %d and %d", f.label, j+1, k+1)
		}
		first, last := chain[0], chain[len(chain)-1]
		right := moved(last, j, box[j])
		corner := moved(right, k, box[k])
		top := moved(first, k, box[k])
		sh.corners = append(chain, right, corner, top)
		for a := 0; a+1 < len(chain); a++ {
			sh.sides = append(sh.sides, side{chain[a], chain[a+1], sideBounded})
		}
		sh.sides = append(sh.sides,
			side{last, right, sideRay},
			side{right, corner, sideCut},
			side{corner, top, sideCut},
			side{first, top, sideRay})
	default:
		return nil, fmt.Errorf("facet %s has %d rays in 3 variables", f.label, len(f.rays))
	}
	if err := checkConvex(sh.corners, f.normal); err != nil {
		return nil, fmt.Errorf("facet %s: %w", f.label, err)
	}
	return &sh, nil
}

// facetSegment is facetShape in two variables: a compact facet is the
// segment between its two vertices, an unbounded one its vertex and the ray
// up to the frame.
func facetSegment(f *facet, box []int64) (*shape, error) {
	switch {
	case len(f.rays) == 0 && len(f.verts) == 2:
		a, b := f.verts[0], f.verts[1]
		return &shape{corners: [][]int64{a, b}, sides: []side{{a, b, sideBounded}}}, nil
	case len(f.rays) == 1 && len(f.verts) == 1:
		a := f.verts[0]
		b := moved(a, f.rays[0], box[f.rays[0]])
		return &shape{corners: [][]int64{a, b}, sides: []side{{a, b, sideRay}}}, nil
	}
	return nil, fmt.Errorf("facet %s has %d vertices and %d rays; an edge of a Newton polygon has two vertices, or one and a ray", f.label, len(f.verts), len(f.rays))
}

// boundary2 walks the edges of a Newton polygon from the facets: from the
// vertex on the vertical unbounded edge (x_1 = min) along the compact edges
// to the vertex on the horizontal one (x_2 = min). It returns the vertices
// in that order, or an error when the facets do not join up that way.
func boundary2(facets []*facet) ([][]int64, error) {
	var up, right *facet
	var compact []*facet
	for _, f := range facets {
		switch {
		case f.compact():
			compact = append(compact, f)
		case f.rays[0] == 1 && up == nil:
			up = f
		case f.rays[0] == 0 && right == nil:
			right = f
		default:
			return nil, fmt.Errorf("facet %s is a second unbounded edge along the same axis", f.label)
		}
	}
	if up == nil || right == nil {
		return nil, fmt.Errorf("a Newton polygon has one unbounded edge along each axis")
	}
	chain := [][]int64{up.verts[0]}
	used := make([]bool, len(compact))
	for step := 0; step < len(compact); step++ {
		cur := chain[len(chain)-1]
		next := -1
		for i, f := range compact {
			if !used[i] && (slices.Equal(f.verts[0], cur) || slices.Equal(f.verts[1], cur)) {
				next = i
				break
			}
		}
		if next < 0 {
			return nil, fmt.Errorf("no edge of the Newton polygon leaves the vertex %s", pointString(cur))
		}
		used[next] = true
		other := compact[next].verts[0]
		if slices.Equal(other, cur) {
			other = compact[next].verts[1]
		}
		if other[0] <= cur[0] || other[1] >= cur[1] {
			return nil, fmt.Errorf("the edge %s of the Newton polygon does not run down and to the right", compact[next].label)
		}
		chain = append(chain, other)
	}
	if last := chain[len(chain)-1]; !slices.Equal(last, right.verts[0]) {
		return nil, fmt.Errorf("the edges of the Newton polygon end at %s, not at the vertex %s of the horizontal edge", pointString(last), pointString(right.verts[0]))
	}
	return chain, nil
}

// convexOrder returns the points, which lie in a plane with a normal a
// whose entries are positive or zero (not all zero), in order around the
// convex polygon they span. It returns an error unless each point is a
// corner of that polygon and there are at least three.
//
// The points are projected along the axis p where a_p is largest, which is
// one to one on the plane because a_p > 0, and ordered by the monotone
// chain (Andrew 1979, "Another efficient algorithm for convex hulls in two
// dimensions") with exact orientation tests.
func convexOrder(pts [][]int64, a []*big.Int) ([][]int64, error) {
	if len(pts) < 3 {
		return nil, fmt.Errorf("%d vertices do not span a polygon", len(pts))
	}
	p := largest(a)
	sorted := slices.Clone(pts)
	slices.SortFunc(sorted, func(x, y []int64) int {
		ux, vx := project(x, p)
		uy, vy := project(y, p)
		if ux != uy {
			return cmpInt(ux, uy)
		}
		return cmpInt(vx, vy)
	})
	var hull [][]int64
	for pass := range 2 {
		start := len(hull)
		for _, q := range sorted {
			for len(hull) >= start+2 && orient(hull[len(hull)-2], hull[len(hull)-1], q, p) <= 0 {
				hull = hull[:len(hull)-1]
			}
			hull = append(hull, q)
		}
		hull = hull[:len(hull)-1] // the last point starts the other half
		if pass == 0 {
			slices.Reverse(sorted)
		}
	}
	if len(hull) != len(pts) {
		return nil, fmt.Errorf("the vertices %s are not all corners of one convex polygon", pointsString(pts))
	}
	return hull, nil
}

// checkConvex returns an error unless the corners, which lie in a plane with
// the normal a, make a strictly convex polygon in that order.
func checkConvex(corners [][]int64, a []*big.Int) error {
	p := largest(a)
	sign := 0
	for i := range corners {
		s := orient(corners[i], corners[(i+1)%len(corners)], corners[(i+2)%len(corners)], p)
		if s == 0 || (sign != 0 && s != sign) {
			return fmt.Errorf("the corners %s do not make a convex polygon", pointsString(corners))
		}
		sign = s
	}
	return nil
}

// largest returns the axis of the largest entry of a.
func largest(a []*big.Int) int {
	p := 0
	for i := range a {
		if a[i].Cmp(a[p]) > 0 {
			p = i
		}
	}
	return p
}

// project drops axis p of a point in three variables.
func project(x []int64, p int) (int64, int64) {
	return x[(p+1)%3], x[(p+2)%3]
}

// orient is the sign of the turn a → b → c in the projection along axis
// p: 1 for a left turn, −1 for a right one, 0 when they are collinear.
// It is computed exactly.
func orient(a, b, c []int64, p int) int {
	au, av := project(a, p)
	bu, bv := project(b, p)
	cu, cv := project(c, p)
	l := new(big.Int).Mul(big.NewInt(bu-au), big.NewInt(cv-av))
	r := new(big.Int).Mul(big.NewInt(bv-av), big.NewInt(cu-au))
	return l.Cmp(r)
}

func cmpInt(a, b int64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// sortedBy returns the points sorted by coordinate i.
func sortedBy(pts [][]int64, i int) [][]int64 {
	out := slices.Clone(pts)
	slices.SortStableFunc(out, func(x, y []int64) int { return cmpInt(x[i], y[i]) })
	return out
}

func strictlyIncreasing(pts [][]int64, i int) bool {
	for a := 1; a < len(pts); a++ {
		if pts[a][i] <= pts[a-1][i] {
			return false
		}
	}
	return true
}

func strictlyDecreasing(pts [][]int64, i int) bool {
	for a := 1; a < len(pts); a++ {
		if pts[a][i] >= pts[a-1][i] {
			return false
		}
	}
	return true
}

// moved returns x with coordinate j set to t.
func moved(x []int64, j int, t int64) []int64 {
	y := slices.Clone(x)
	y[j] = t
	return y
}

// sameSet reports whether two lists of points hold the same points.
func sameSet(a, b [][]int64) bool {
	if len(a) != len(b) {
		return false
	}
	for _, p := range a {
		if !slices.ContainsFunc(b, func(q []int64) bool { return slices.Equal(p, q) }) {
			return false
		}
	}
	return true
}

func pointString(x []int64) string {
	s := make([]string, len(x))
	for i, v := range x {
		s[i] = fmt.Sprint(v)
	}
	return "(" + strings.Join(s, ",") + ")"
}

func pointsString(pts [][]int64) string {
	s := make([]string, len(pts))
	for i, p := range pts {
		s[i] = pointString(p)
	}
	return strings.Join(s, " ")
}
