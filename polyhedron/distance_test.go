package polyhedron

import (
	"context"
	"errors"
	"math/big"
	"slices"
	"testing"
)

func rats(xs ...int64) []*big.Rat {
	out := make([]*big.Rat, len(xs))
	for i, x := range xs {
		out[i] = big.NewRat(x, 1)
	}
	return out
}

func ratsEqual(a []*big.Rat, b []*big.Rat) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Cmp(b[i]) != 0 {
			return false
		}
	}
	return true
}

func intsOf(a []*big.Int) []int64 {
	out := make([]int64, len(a))
	for i, x := range a {
		out[i] = x.Int64()
	}
	return out
}

// checkHit verifies the certificate of a Hit with exact arithmetic written
// independently of the package's solver: primal representation of Point,
// supporting hyperplane valid on every input point, and equality at Point.
// Together (weak LP duality) they prove T = min{t : t·τ ∈ P}.
func checkHit(t *testing.T, n *Newton, points [][]int, tau []*big.Rat, h *Hit) {
	t.Helper()
	d := n.Dim()
	verts := n.Points()
	if len(h.Slack) != d || len(h.Point) != d || len(h.Normal) != d {
		t.Fatalf("certificate has wrong lengths")
	}
	sum := new(big.Rat)
	rep := make([]*big.Rat, d)
	for i := range rep {
		rep[i] = new(big.Rat).Set(h.Slack[i])
		if h.Slack[i].Sign() < 0 {
			t.Errorf("negative slack %v", h.Slack[i])
		}
	}
	for j, w := range h.Weights {
		if w.Sign() <= 0 || j < 0 || j >= len(verts) {
			t.Errorf("weight %v at point %d of %d", w, j, len(verts))
			continue
		}
		sum.Add(sum, w)
		for i := range rep {
			rep[i].Add(rep[i], new(big.Rat).Mul(w, big.NewRat(int64(verts[j][i]), 1)))
		}
	}
	if sum.Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("weights sum to %v", sum)
	}
	for i := range rep {
		if rep[i].Cmp(h.Point[i]) != 0 {
			t.Errorf("representation gives %v at coordinate %d, point has %v", rep[i], i, h.Point[i])
		}
		if want := new(big.Rat).Mul(h.T, tau[i]); want.Cmp(h.Point[i]) != 0 {
			t.Errorf("point %v is not T·τ", h.Point[i])
		}
	}
	dot := func(a []*big.Rat, v []int) *big.Rat {
		s := new(big.Rat)
		for i := range a {
			s.Add(s, new(big.Rat).Mul(a[i], big.NewRat(int64(v[i]), 1)))
		}
		return s
	}
	nt := new(big.Rat)
	np := new(big.Rat)
	for i := range h.Normal {
		if h.Normal[i].Sign() < 0 {
			t.Errorf("negative normal entry %v", h.Normal[i])
		}
		nt.Add(nt, new(big.Rat).Mul(h.Normal[i], tau[i]))
		np.Add(np, new(big.Rat).Mul(h.Normal[i], h.Point[i]))
	}
	if nt.Sign() <= 0 {
		t.Errorf("normal·τ = %v, want > 0", nt)
	}
	if np.Cmp(h.RHS) != 0 {
		t.Errorf("normal·point = %v, RHS %v", np, h.RHS)
	}
	for _, v := range points {
		if dot(h.Normal, v).Cmp(h.RHS) < 0 {
			t.Errorf("input point %v violates the supporting hyperplane", v)
		}
	}
}

func TestDistanceHandDrawn(t *testing.T) {
	tests := []struct {
		name   string
		d      int
		points [][]int
		tau    []*big.Rat
		// expected values, worked out by hand in the comments
		verts  [][]int
		t      *big.Rat
		face   []int // indices into verts
		rays   []int
		dim    int
		normal []int64
		rhs    int64
	}{
		{
			// x² + y²: the polygon has the single compact edge from (0,2) to (2,0) on
			// the line x + y = 2, and the rays from each end go up and right. The
			// diagonal t·(1,1) meets the edge at 2t = 2, t = 1, in the middle of the
			// edge: face = edge, dim 1, codim 1, normal (1,1), RHS 2.
			name: "x2+y2", d: 2, points: [][]int{{2, 0}, {0, 2}}, tau: rats(1, 1),
			verts: [][]int{{0, 2}, {2, 0}}, t: big.NewRat(1, 1), face: []int{0, 1}, dim: 1,
			normal: []int64{1, 1}, rhs: 2,
		},
		{
			// x²y²: P = (2,2) + R²₊ is a quadrant with corner (2,2). The diagonal
			// enters it at the corner, t = 2 (so the threshold 1/t is 1/2): the face
			// is the vertex, dim 0, codim 2; any positive normal exposes it, the
			// smallest one is (1,1) with RHS 4.
			name: "x2y2", d: 2, points: [][]int{{2, 2}}, tau: rats(1, 1),
			verts: [][]int{{2, 2}}, t: big.NewRat(2, 1), face: []int{0}, dim: 0,
			normal: []int64{1, 1}, rhs: 4,
		},
		{
			// x² + xy + y²: (1,1) lies on the segment from (2,0) to (0,2), so it is
			// not a vertex; the diagonal still hits the edge x + y = 2 at (1,1), t = 1.
			name: "x2+xy+y2", d: 2, points: [][]int{{2, 0}, {1, 1}, {0, 2}}, tau: rats(1, 1),
			verts: [][]int{{0, 2}, {2, 0}}, t: big.NewRat(1, 1), face: []int{0, 1}, dim: 1,
			normal: []int64{1, 1}, rhs: 2,
		},
		{
			// x⁴ + y⁶: the edge from (4,0) to (0,6) lies on x/4 + y/6 = 1, i.e.
			// 3x + 2y = 12. The diagonal gives 5t = 12, t = 12/5, inside the edge.
			name: "x4+y6", d: 2, points: [][]int{{4, 0}, {0, 6}}, tau: rats(1, 1),
			verts: [][]int{{0, 6}, {4, 0}}, t: big.NewRat(12, 5), face: []int{0, 1}, dim: 1,
			normal: []int64{3, 2}, rhs: 12,
		},
		{
			// x² alone in the plane: P = (2,0) + R²₊, bounded by the vertical line
			// x = 2 (above the corner) and the horizontal line y = 0 (right of it).
			// t·(1,1) ∈ P needs t >= 2 (and t >= 0), so t = 2 and the hit point
			// (2,2) lies in the relative interior of the non-compact facet x >= 2,
			// which contains the ray e_y: rays {1}, dim 1, codim 1, normal (1,0).
			name: "x2 in the plane", d: 2, points: [][]int{{2, 0}}, tau: rats(1, 1),
			verts: [][]int{{2, 0}}, t: big.NewRat(2, 1), face: []int{0}, rays: []int{1}, dim: 1,
			normal: []int64{1, 0}, rhs: 2,
		},
		{
			// A non-simple vertex. P = conv{(1,1,2),(2,2,1)} + R³₊ has the facets
			// x >= 1, y >= 1, z >= 1, x + z >= 3, y + z >= 3 (check: each holds on
			// both points, and each is tight on a 2-dimensional piece, e.g.
			// x + z = 3 contains the segment and the ray e_y). The vertex (1,1,2)
			// lies on four of them: x >= 1, y >= 1, x + z >= 3, y + z >= 3, but its
			// codimension is 3, not 4. Along τ = (1,1,2): t·τ needs t >= 1 from
			// x >= 1, and t = 1 gives (1,1,2) itself. Smallest exposing normal with
			// all entries >= 1: a·(1,1,2) < a·(2,2,1) means a3 < a1 + a2, e.g.
			// (1,1,1) with RHS 4 (other vertex: 5); not unique, so only
			// exposure is checked.
			name: "non-simple vertex", d: 3, points: [][]int{{1, 1, 2}, {2, 2, 1}}, tau: rats(1, 1, 2),
			verts: [][]int{{1, 1, 2}, {2, 2, 1}}, t: big.NewRat(1, 1), face: []int{0}, dim: 0,
			normal: []int64{1, 1, 1}, rhs: 4,
		},
		{
			// Same polyhedron along the diagonal: t·(1,1,1) needs x + z = 2t >= 3,
			// t = 3/2; the hit point (3/2,3/2,3/2) is on x + z = 3 and y + z = 3
			// only, whose intersection with P is the segment between the two
			// vertices: a compact edge, dim 1, codim 2, exposed e.g. by (1,1,2)
			// (the sum of the two facet normals), RHS 6.
			name: "edge in 3-D", d: 3, points: [][]int{{1, 1, 2}, {2, 2, 1}}, tau: rats(1, 1, 1),
			verts: [][]int{{1, 1, 2}, {2, 2, 1}}, t: big.NewRat(3, 2), face: []int{0, 1}, dim: 1,
			normal: []int64{1, 1, 2}, rhs: 6,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			n, err := New(tc.d, tc.points)
			if err != nil {
				t.Fatal(err)
			}
			// Distance first, on a Newton whose vertices are not
			// computed yet (the path that works over the points).
			h, err := n.Distance(context.Background(), tc.tau)
			if err != nil {
				t.Fatal(err)
			}
			if vs := mustVertices(t, n); !slices.EqualFunc(vs, tc.verts, slices.Equal) {
				t.Fatalf("vertices %v, want %v", vs, tc.verts)
			}
			if h.T.Cmp(tc.t) != 0 {
				t.Errorf("t = %v, want %v", h.T, tc.t)
			}
			checkHit(t, n, tc.points, tc.tau, h)
			f := h.Face
			var got, want [][]int
			for _, j := range f.Vertices {
				got = append(got, n.Points()[j])
			}
			for _, k := range tc.face {
				want = append(want, tc.verts[k])
			}
			if !slices.EqualFunc(got, want, slices.Equal) || !slices.Equal(f.Rays, tc.rays) {
				t.Errorf("face vertices %v rays %v, want %v %v", got, f.Rays, want, tc.rays)
			}
			if f.Dim != tc.dim || f.Codim(tc.d) != tc.d-tc.dim {
				t.Errorf("face dim %d, want %d", f.Dim, tc.dim)
			}
			if f.Compact() != (len(tc.rays) == 0) {
				t.Errorf("Compact() = %v", f.Compact())
			}
			// The normal must expose exactly the face; for a facet it is unique
			// (primitive), so compare it with the hand-computed one.
			checkExposes(t, n, f)
			if got := intsOf(f.Normal); f.Dim == tc.d-1 && (!slices.Equal(got, tc.normal) || f.RHS.Int64() != tc.rhs) {
				t.Errorf("face normal %v RHS %v, want %v %v", got, f.RHS, tc.normal, tc.rhs)
			}
		})
	}
}

// checkExposes checks that f.Normal·x >= f.RHS holds on every vertex with
// equality exactly on f's vertices, and that the normal vanishes exactly on
// f's rays.
func checkExposes(t *testing.T, n *Newton, f *Face) {
	t.Helper()
	for j, v := range vertexSeq(t, n) {
		c := dotInt(f.Normal, v).Cmp(f.RHS)
		if c < 0 || (c == 0) != slices.Contains(f.Vertices, j) {
			t.Errorf("normal %v >= %v does not expose vertices %v", f.Normal, f.RHS, f.Vertices)
			return
		}
	}
	for i, a := range f.Normal {
		if a.Sign() < 0 || (a.Sign() == 0) != slices.Contains(f.Rays, i) {
			t.Errorf("normal %v does not match rays %v", f.Normal, f.Rays)
		}
	}
}

func TestNewErrors(t *testing.T) {
	tests := []struct {
		name   string
		d      int
		points [][]int
		want   error
	}{
		{"empty", 2, nil, ErrEmpty},
		{"zero dimension", 0, [][]int{{}}, ErrDimension},
		{"short point", 2, [][]int{{1, 2}, {1}}, ErrDimension},
		{"negative", 2, [][]int{{1, 2}, {1, -1}}, ErrNegative},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := New(tc.d, tc.points)
			if !errors.Is(err, tc.want) {
				t.Errorf("err = %v, want %v", err, tc.want)
			}
		})
	}
	n, _ := New(2, [][]int{{1, 0}})
	for _, tau := range [][]*big.Rat{rats(1), rats(1, 0), rats(-1, 1), {big.NewRat(1, 1), nil}} {
		if _, err := n.Distance(context.Background(), tau); !errors.Is(err, ErrDirection) {
			t.Errorf("Distance(%v): err = %v, want ErrDirection", tau, err)
		}
	}
}
