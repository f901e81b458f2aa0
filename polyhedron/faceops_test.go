package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/lctkit/lctkit/polyhedron/internal/instances"
)

func bigs(xs ...int64) []*big.Int {
	out := make([]*big.Int, len(xs))
	for i, x := range xs {
		out[i] = big.NewInt(x)
	}
	return out
}

func TestFaceSide(t *testing.T) {
	huge, _ := new(big.Int).SetString("100000000000000000000000", 10) // 10^23 > 2^63
	tests := []struct {
		name   string
		normal []*big.Int
		rhs    *big.Int
		x      []int
		want   int
	}{
		{"below", bigs(3, 2), big.NewInt(12), []int{1, 1}, -1},
		{"on", bigs(3, 2), big.NewInt(12), []int{4, 0}, 0},
		{"on other vertex", bigs(3, 2), big.NewInt(12), []int{0, 6}, 0},
		{"above", bigs(3, 2), big.NewInt(12), []int{4, 1}, 1},
		{"zero normal entry", bigs(0, 1), big.NewInt(2), []int{1000, 2}, 0},
		{"negative point", bigs(1, 1), big.NewInt(0), []int{-3, 2}, -1},
		// 2·(2^62) overflows int64: 2^63 > 2^63 − 1 = RHS.
		{"product overflow", bigs(2, 0), big.NewInt(math.MaxInt64), []int{1 << 62, 0}, 1},
		// (2^62 + 2^62) overflows the sum: 2^63 vs RHS 2^63 − 1.
		{"sum overflow", bigs(1, 1), big.NewInt(math.MaxInt64), []int{1 << 62, 1 << 62}, 1},
		{"huge normal", []*big.Int{huge, big.NewInt(1)}, huge, []int{1, 0}, 0},
		{"huge normal above", []*big.Int{huge, big.NewInt(1)}, huge, []int{1, 1}, 1},
		{"huge rhs", bigs(1, 1), huge, []int{5, 5}, -1},
		{"huge negative rhs", bigs(1, 1), new(big.Int).Neg(huge), []int{5, 5}, 1},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := &Face{Normal: tc.normal, RHS: tc.rhs}
			if got := f.Side(tc.x); got != tc.want {
				t.Errorf("Side(%v) = %d, want %d", tc.x, got, tc.want)
			}
			if got := f.Contains(tc.x); got != (tc.want == 0) {
				t.Errorf("Contains(%v) = %v", tc.x, got)
			}
		})
	}
}

func TestFaceSidePanicsOnLength(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("Side with a short point did not panic")
		}
	}()
	(&Face{Normal: bigs(1, 1), RHS: big.NewInt(1)}).Side([]int{1})
}

func TestFaceEqual(t *testing.T) {
	a := &Face{Vertices: []int{0, 2}, Dim: 1, Normal: bigs(1, 1), RHS: big.NewInt(2)}
	tests := []struct {
		name string
		f, g *Face
		want bool
	}{
		{"same", a, a, true},
		{"other normal", a, &Face{Vertices: []int{0, 2}, Dim: 1, Normal: bigs(2, 2), RHS: big.NewInt(4)}, true},
		{"other vertices", a, &Face{Vertices: []int{0, 1}}, false},
		{"prefix", a, &Face{Vertices: []int{0}}, false},
		{"rays differ", a, &Face{Vertices: []int{0, 2}, Rays: []int{1}}, false},
		{"nil rays vs empty", &Face{Vertices: []int{1}}, &Face{Vertices: []int{1}, Rays: []int{}}, true},
		{"both nil", nil, nil, true},
		{"one nil", a, nil, false},
		{"other nil", nil, a, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.f.Equal(tc.g); got != tc.want {
				t.Errorf("Equal = %v, want %v", got, tc.want)
			}
		})
	}
}

func TestExposes(t *testing.T) {
	// x⁴ + x²y² + y⁶ in the plane: vertices (0,6), (2,2), (4,0) (sorted).
	// The edge from (0,6) to (2,2) has normal (2,1) and value 6; the edge
	// from (2,2) to (4,0) has (1,1) and 4 (hand-worked).
	n, err := New(2, [][]int{{4, 0}, {2, 2}, {0, 6}})
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		f    *Face
		want bool
	}{
		{"edge", &Face{Vertices: []int{0, 1}, Dim: 1, Normal: bigs(2, 1), RHS: big.NewInt(6)}, true},
		{"other edge", &Face{Vertices: []int{1, 2}, Dim: 1, Normal: bigs(1, 1), RHS: big.NewInt(4)}, true},
		{"vertex", &Face{Vertices: []int{1}, Normal: bigs(3, 2), RHS: big.NewInt(10)}, true},
		{"scaled normal", &Face{Vertices: []int{0, 1}, Dim: 1, Normal: bigs(4, 2), RHS: big.NewInt(12)}, true},
		{"ray face", &Face{Vertices: []int{2}, Rays: []int{0}, Normal: bigs(0, 1), RHS: big.NewInt(0)}, true},
		{"normal exposes less", &Face{Vertices: []int{0, 1}, Normal: bigs(3, 2), RHS: big.NewInt(10)}, false},
		{"normal exposes more", &Face{Vertices: []int{1}, Normal: bigs(1, 1), RHS: big.NewInt(4)}, false},
		{"violated", &Face{Vertices: []int{1}, Normal: bigs(1, 1), RHS: big.NewInt(5)}, false},
		{"zero entry without ray", &Face{Vertices: []int{2}, Normal: bigs(0, 1), RHS: big.NewInt(0)}, false},
		{"ray without zero entry", &Face{Vertices: []int{1}, Rays: []int{0}, Normal: bigs(3, 2), RHS: big.NewInt(10)}, false},
		{"negative entry", &Face{Vertices: []int{0}, Normal: bigs(-1, 1), RHS: big.NewInt(6)}, false},
		{"short normal", &Face{Vertices: []int{1}, Normal: bigs(3), RHS: big.NewInt(10)}, false},
		{"no vertices", &Face{Normal: bigs(1, 1), RHS: big.NewInt(1)}, false},
		{"vertex out of range", &Face{Vertices: []int{1, 3}, Normal: bigs(3, 2), RHS: big.NewInt(10)}, false},
		{"unsorted rays", &Face{Vertices: []int{0}, Rays: []int{1, 0}, Normal: bigs(0, 0), RHS: big.NewInt(0)}, false},
		{"nil rhs", &Face{Vertices: []int{1}, Normal: bigs(3, 2)}, false},
		{"nil", nil, false},
	}
	// Both paths: over the points of a fresh polyhedron, then over the
	// vertices once they are known.
	for _, path := range []string{"points", "vertices"} {
		if path == "vertices" {
			mustVertices(t, n)
		}
		for _, tc := range tests {
			t.Run(path+"/"+tc.name, func(t *testing.T) {
				got, err := n.Exposes(context.Background(), tc.f)
				if err != nil {
					t.Fatal(err)
				}
				if got != tc.want {
					t.Errorf("Exposes = %v, want %v", got, tc.want)
				}
			})
		}
	}
	// A point on an edge that is no vertex must not be listed: with (1,4)
	// on the edge from (0,6) to (2,2), Points() is (0,6), (1,4), (2,2),
	// (4,0).
	for _, known := range []bool{false, true} {
		m, _ := New(2, [][]int{{4, 0}, {2, 2}, {0, 6}, {1, 4}})
		if known {
			mustVertices(t, m)
		}
		for _, tc := range []struct {
			verts []int
			want  bool
		}{{[]int{0, 2}, true}, {[]int{0, 1, 2}, false}, {[]int{1}, false}} {
			f := &Face{Vertices: tc.verts, Dim: 1, Normal: bigs(2, 1), RHS: big.NewInt(6)}
			if got, err := m.Exposes(context.Background(), f); err != nil || got != tc.want {
				t.Errorf("vertices known %v: Exposes(%v) = %v, %v; want %v", known, tc.verts, got, err, tc.want)
			}
		}
	}
}

// facetsContainingBrute lists the facets whose inequality is tight on every
// vertex of f and whose normal vanishes on every ray of f.
func facetsContainingBrute(fs []Facet, verts [][]int, f *Face) []int {
	out := []int{}
	for k, fc := range fs {
		ok := true
		for _, j := range f.Vertices {
			if dotInt(fc.Normal, verts[j]).Cmp(fc.RHS) != 0 {
				ok = false
			}
		}
		for _, i := range f.Rays {
			if fc.Normal[i].Sign() != 0 {
				ok = false
			}
		}
		if ok {
			out = append(out, k)
		}
	}
	return out
}

func TestFacetsContaining(t *testing.T) {
	// x² + xy + y²: Points() (0,2), (1,1), (2,0); facets [0 1]>=0
	// (point 2 = (2,0), ray 0), [1 0]>=0 (point 0 = (0,2), ray 1), [1 1]>=2
	// (both); see ExampleNewton_Facets.
	n, _ := New(2, [][]int{{2, 0}, {1, 1}, {0, 2}})
	tests := []struct {
		name string
		f    *Face
		want []int
	}{
		{"vertex (0,2)", &Face{Vertices: []int{0}}, []int{1, 2}},
		{"vertex (2,0)", &Face{Vertices: []int{2}}, []int{0, 2}},
		{"edge", &Face{Vertices: []int{0, 2}, Dim: 1}, []int{2}},
		{"ray face", &Face{Vertices: []int{2}, Rays: []int{0}, Dim: 1}, []int{0}},
		{"P itself", &Face{Vertices: []int{0, 2}, Rays: []int{0, 1}, Dim: 2}, []int{}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := n.FacetsContaining(context.Background(), tc.f)
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(got, tc.want) {
				t.Errorf("FacetsContaining = %v, want %v", got, tc.want)
			}
		})
	}
	for _, bad := range []*Face{nil, {Vertices: []int{3}}, {Vertices: []int{1}}, {Vertices: []int{2, 0}}, {Vertices: []int{0}, Rays: []int{2}}} {
		if _, err := n.FacetsContaining(context.Background(), bad); !errors.Is(err, ErrFace) {
			t.Errorf("FacetsContaining(%v): err = %v, want ErrFace", bad, err)
		}
	}
	// Random instances: every compact face and every face found at random
	// boundary points, against the brute-force test of each facet.
	rng := rand.New(rand.NewPCG(21, 22))
	for trial := 0; trial < 60; trial++ {
		d := 2 + rng.IntN(4)
		n, err := New(d, randomPoints(rng, d, 3+rng.IntN(10), 5))
		if err != nil {
			t.Fatal(err)
		}
		fs, err := n.Facets(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		faces := slices.Clone(lat.Faces)
		for k := range fs {
			faces = append(faces, &Face{Vertices: fs[k].Vertices, Rays: fs[k].Rays})
		}
		for _, f := range faces {
			got, err := n.FacetsContaining(context.Background(), f)
			if err != nil {
				t.Fatal(err)
			}
			if want := facetsContainingBrute(fs, n.Points(), f); !slices.Equal(got, want) {
				t.Errorf("trial %d face %v rays %v: FacetsContaining = %v, brute force %v", trial, f.Vertices, f.Rays, got, want)
			}
		}
	}
}

// randomInstances returns seeded random point sets in d <= 6 (small
// exponents make degenerate, non-simple polyhedra common).
func randomInstances(seed uint64, count int) []instances.Instance {
	rng := rand.New(rand.NewPCG(seed, seed+1))
	var out []instances.Instance
	for k := 0; k < count; k++ {
		d := 1 + rng.IntN(6)
		np := 1 + rng.IntN(16)
		maxExp := 1 + rng.IntN(6)
		if d >= 5 {
			np = min(np, 10)
		}
		out = append(out, instances.Instance{Name: fmt.Sprintf("random%d_d%d", k, d), D: d, Points: randomPoints(rng, d, np, maxExp)})
	}
	return out
}

// checkCompleteCompact checks that f is a complete compact face: sorted
// vertices, no rays, Dim equal to the affine rank, and a strictly positive
// normal exposing exactly its vertices (brute force over the vertices).
func checkCompleteCompact(t *testing.T, n *Newton, f *Face) {
	t.Helper()
	if len(f.Rays) != 0 {
		t.Errorf("face %v has rays %v", f.Vertices, f.Rays)
	}
	if !slices.IsSorted(f.Vertices) {
		t.Errorf("face vertices %v not sorted", f.Vertices)
	}
	if got := n.faceDim(f.Vertices, nil); got != f.Dim {
		t.Errorf("face %v: Dim %d, affine rank %d", f.Vertices, f.Dim, got)
	}
	if len(f.Normal) != n.Dim() {
		t.Fatalf("face %v: normal of length %d", f.Vertices, len(f.Normal))
	}
	for _, a := range f.Normal {
		if a.Sign() <= 0 {
			t.Errorf("face %v: normal %v not strictly positive", f.Vertices, f.Normal)
		}
	}
	checkExposes(t, n, f)
}

// coversFromLattice inverts Lattice.Sub: the faces of dimension Dim+1 that
// contain face i.
func coversFromLattice(lat *Lattice) [][]int {
	up := make([][]int, len(lat.Faces))
	for h, sub := range lat.Sub {
		for _, g := range sub {
			up[g] = append(up[g], h)
		}
	}
	return up
}

func checkCoversAgainstLattice(t *testing.T, name string, n *Newton) {
	t.Helper()
	lat, err := n.CompactFaces(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	up := coversFromLattice(lat)
	for g, f := range lat.Faces {
		got, err := n.Covers(context.Background(), f)
		if err != nil {
			t.Fatalf("%s: Covers(%v): %v", name, f.Vertices, err)
		}
		var want [][]int
		for _, h := range up[g] {
			want = append(want, lat.Faces[h].Vertices)
		}
		slices.SortFunc(want, slices.Compare)
		var gotV [][]int
		for _, c := range got {
			gotV = append(gotV, c.Vertices)
			if c.Dim != f.Dim+1 {
				t.Errorf("%s: cover %v of %v has Dim %d", name, c.Vertices, f.Vertices, c.Dim)
			}
			checkCompleteCompact(t, n, c)
		}
		if !slices.EqualFunc(gotV, want, slices.Equal) {
			t.Errorf("%s: Covers(%v) = %v, lattice gives %v", name, f.Vertices, gotV, want)
		}
	}
}

func TestCoversRandom(t *testing.T) {
	count := 400
	if testing.Short() {
		count = 80
	}
	for _, in := range randomInstances(31, count) {
		n, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		checkCoversAgainstLattice(t, in.Name, n)
	}
}

func TestCoversLowRank(t *testing.T) {
	cases := []instances.Instance{instances.LowRank(2, 2, 2), instances.LowRank(2, 3, 2)}
	if !testing.Short() {
		cases = append(cases, instances.LowRank(3, 3, 2))
	}
	for _, in := range cases {
		n, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		checkCoversAgainstLattice(t, in.Name, n)
	}
}

func TestCoversErrors(t *testing.T) {
	n, _ := New(2, [][]int{{4, 0}, {2, 2}, {0, 6}})
	ctx := context.Background()
	tests := []struct {
		name string
		f    *Face
	}{
		{"nil", nil},
		{"no vertices", &Face{}},
		{"out of range", &Face{Vertices: []int{3}}},
		{"unsorted", &Face{Vertices: []int{1, 0}, Dim: 1}},
		{"not a face", &Face{Vertices: []int{0, 2}, Dim: 1}},
		{"wrong dim", &Face{Vertices: []int{0, 1}, Dim: 0}},
		{"not compact", &Face{Vertices: []int{2}, Rays: []int{0}, Dim: 1, Normal: bigs(0, 1), RHS: big.NewInt(0)}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if _, err := n.Covers(ctx, tc.f); !errors.Is(err, ErrFace) {
				t.Errorf("err = %v, want ErrFace", err)
			}
		})
	}
	// A face given without a normal is accepted.
	got, err := n.Covers(ctx, &Face{Vertices: []int{1}})
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != 2 || !slices.Equal(got[0].Vertices, []int{0, 1}) || !slices.Equal(got[1].Vertices, []int{1, 2}) {
		t.Errorf("covers of (2,2): %v", got)
	}
	done, cancel := context.WithCancel(ctx)
	cancel()
	if _, err := n.Covers(done, &Face{Vertices: []int{1}}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled: err = %v", err)
	}
}

func TestCompactFaceAtRandom(t *testing.T) {
	count := 200
	if testing.Short() {
		count = 50
	}
	rng := rand.New(rand.NewPCG(41, 42))
	ctx := context.Background()
	for _, in := range randomInstances(43, count) {
		n, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		d := in.D
		fs, err := n.Facets(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		// The centroid of every compact face lies in its relative interior.
		for _, f := range lat.Faces {
			x := n.centroid(f.Vertices)
			got, err := n.CompactFaceAt(ctx, x)
			if err != nil {
				t.Fatal(err)
			}
			if !got.Equal(f) || got.Dim != f.Dim {
				t.Errorf("%s: CompactFaceAt(centroid of %v) = %v", in.Name, f.Vertices, got)
				continue
			}
			checkCompleteCompact(t, n, got)
		}
		// Random points of P: a random convex combination of a few
		// vertices, sometimes plus a step along a coordinate, compared with
		// the face that the facets give.
		verts := mustVertices(t, n)
		byPoint := vertexSlice(t, n)
		for k := 0; k < 10; k++ {
			x := make([]*big.Rat, d)
			for i := range x {
				x[i] = new(big.Rat)
			}
			pick := rng.Perm(len(verts))[:1+rng.IntN(min(3, len(verts)))]
			den := int64(0)
			ws := make([]int64, len(pick))
			for q := range pick {
				ws[q] = 1 + rng.Int64N(3)
				den += ws[q]
			}
			for q, j := range pick {
				for i := range x {
					x[i].Add(x[i], big.NewRat(ws[q]*int64(verts[j][i]), den))
				}
			}
			if rng.IntN(3) == 0 {
				i := rng.IntN(d)
				x[i].Add(x[i], big.NewRat(1, 2))
			}
			got, err := n.CompactFaceAt(ctx, x)
			if err != nil {
				t.Fatal(err)
			}
			vs, rays, dim := faceByFacets(fs, byPoint, d, x)
			onBoundary := slices.ContainsFunc(fs, func(fc Facet) bool {
				return dotRat(fc.Normal, x).Cmp(new(big.Rat).SetInt(fc.RHS)) == 0
			})
			if !onBoundary || len(rays) > 0 {
				if got != nil {
					t.Errorf("%s: CompactFaceAt(%v) = %v, want nil (facets: vertices %v rays %v)", in.Name, x, got.Vertices, vs, rays)
				}
				continue
			}
			if got == nil || !slices.Equal(got.Vertices, vs) || got.Dim != dim {
				t.Errorf("%s: CompactFaceAt(%v) = %v, facets give %v dim %d", in.Name, x, got, vs, dim)
				continue
			}
			checkCompleteCompact(t, n, got)
		}
		// A point outside P.
		out := make([]*big.Rat, d)
		for i := range out {
			out[i] = big.NewRat(int64(verts[0][i]), 1)
		}
		out[0].Sub(out[0], big.NewRat(1, 3))
		if _, err := n.CompactFaceAt(ctx, out); !errors.Is(err, ErrNotBoundary) {
			t.Errorf("%s: CompactFaceAt(outside %v): err = %v", in.Name, out, err)
		}
	}
}

func TestCompactFaceAt(t *testing.T) {
	// x⁴ + x²y² + y⁶ + x³y³: vertices (0,6), (2,2), (4,0); (3,3) dominates (2,2).
	// Points(): (0,6), (2,2), (3,3), (4,0); vertices all but (3,3).
	n, _ := New(2, [][]int{{4, 0}, {2, 2}, {0, 6}, {3, 3}})
	r := func(num, den int64) *big.Rat { return big.NewRat(num, den) }
	tests := []struct {
		name  string
		x     []*big.Rat
		verts []int // nil: no compact face
		err   error
	}{
		{"vertex", []*big.Rat{r(2, 1), r(2, 1)}, []int{1}, nil},
		{"edge midpoint", []*big.Rat{r(1, 1), r(4, 1)}, []int{0, 1}, nil},
		{"edge point", []*big.Rat{r(3, 1), r(1, 1)}, []int{1, 3}, nil},
		{"rational edge point", []*big.Rat{r(5, 2), r(3, 2)}, []int{1, 3}, nil},
		{"minimal non-vertex", []*big.Rat{r(3, 1), r(3, 1)}, nil, nil},
		{"on a ray", []*big.Rat{r(5, 1), r(0, 1)}, nil, nil},
		{"on a ray, rational", []*big.Rat{r(9, 2), r(0, 1)}, nil, nil},
		{"interior", []*big.Rat{r(3, 1), r(5, 2)}, nil, nil},
		{"outside", []*big.Rat{r(1, 1), r(1, 1)}, nil, ErrNotBoundary},
		{"negative", []*big.Rat{r(-1, 1), r(9, 1)}, nil, ErrNotBoundary},
		{"short", []*big.Rat{r(1, 1)}, nil, ErrDimension},
		{"nil entry", []*big.Rat{r(1, 1), nil}, nil, ErrDimension},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f, err := n.CompactFaceAt(context.Background(), tc.x)
			if tc.err != nil {
				if !errors.Is(err, tc.err) {
					t.Errorf("err = %v, want %v", err, tc.err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if tc.verts == nil {
				if f != nil {
					t.Errorf("got face %v, want nil", f.Vertices)
				}
				return
			}
			if f == nil || !slices.Equal(f.Vertices, tc.verts) {
				t.Fatalf("got %v, want vertices %v", f, tc.verts)
			}
			checkCompleteCompact(t, n, f)
		})
	}
	done, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := n.CompactFaceAt(done, []*big.Rat{r(1, 1), r(4, 1)}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled: err = %v", err)
	}
}

// normalConeMinBrute minimises c·y over the facet normals a of the facets
// containing f, scaled to a·τ = 1: the normal cone of a face of a
// full-dimensional polyhedron is generated by those normals (common
// practice), so the minimum over the cone ∩ {y·τ = 1} is attained at one of
// them.
func normalConeMinBrute(fs []Facet, containing []int, tau, c []*big.Rat) *big.Rat {
	var best *big.Rat
	for _, k := range containing {
		a := fs[k].Normal
		v := new(big.Rat).Quo(dotRat(a, c), dotRat(a, tau))
		if best == nil || v.Cmp(best) < 0 {
			best = v
		}
	}
	return best
}

// checkNormalConeY checks that y lies in the normalised normal cone of f:
// y >= 0, y·τ = 1, y_i = 0 on f's rays, y·v >= y·w for every vertex v and
// every vertex w of f, with equality for v in f.
func checkNormalConeY(t *testing.T, n *Newton, f *Face, tau, y []*big.Rat) {
	t.Helper()
	dot := func(v []int) *big.Rat {
		s := new(big.Rat)
		for i := range y {
			s.Add(s, new(big.Rat).Mul(y[i], big.NewRat(int64(v[i]), 1)))
		}
		return s
	}
	yt := new(big.Rat)
	for i := range y {
		if y[i].Sign() < 0 {
			t.Errorf("y = %v has a negative entry", y)
		}
		yt.Add(yt, new(big.Rat).Mul(y[i], tau[i]))
	}
	if yt.Cmp(ratOne) != 0 {
		t.Errorf("y·τ = %v", yt)
	}
	for _, i := range f.Rays {
		if y[i].Sign() != 0 {
			t.Errorf("y = %v nonzero on ray %d", y, i)
		}
	}
	b := dot(n.Points()[f.Vertices[0]])
	for j, v := range vertexSeq(t, n) {
		c := dot(v).Cmp(b)
		if c < 0 || (c != 0 && slices.Contains(f.Vertices, j)) {
			t.Errorf("y = %v is not minimised on face %v (vertex %v)", y, f.Vertices, v)
			return
		}
	}
}

func TestNormalConeMin(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	ctx := context.Background()
	count := 150
	if testing.Short() {
		count = 40
	}
	for _, in := range randomInstances(53, count) {
		n, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		d := in.D
		fs, err := n.Facets(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		faces := slices.Clone(lat.Faces)
		for k := range fs { // facets, including non-compact ones
			faces = append(faces, &Face{Vertices: fs[k].Vertices, Rays: fs[k].Rays, Dim: d - 1})
		}
		// faces with rays: at random vertex + e_i points
		for j, v := range vertexSeq(t, n) {
			x := make([]*big.Rat, d)
			for i := range x {
				x[i] = big.NewRat(int64(v[i]), 1)
			}
			x[rng.IntN(d)].Add(x[rng.IntN(d)], ratOne)
			if f, err := n.FaceAt(context.Background(), x); err == nil && len(f.Rays) < d {
				faces = append(faces, f)
			}
			_ = j
		}
		for _, f := range faces {
			tau := make([]*big.Rat, d)
			c := make([]*big.Rat, d)
			for i := range tau {
				tau[i] = big.NewRat(int64(1+rng.IntN(4)), int64(1+rng.IntN(3)))
				c[i] = big.NewRat(int64(rng.IntN(7)-2), int64(1+rng.IntN(2)))
			}
			containing := facetsContainingBrute(fs, n.Points(), f)
			objectives := [][]*big.Rat{c}
			for i := 0; i < d; i++ { // the caller's use: c = e_i
				e := make([]*big.Rat, d)
				for q := range e {
					e[q] = new(big.Rat)
				}
				e[i].SetInt64(1)
				objectives = append(objectives, e)
			}
			for _, obj := range objectives {
				val, y, err := n.NormalConeMin(ctx, f, tau, obj)
				if err != nil {
					t.Fatalf("%s: NormalConeMin(%v rays %v): %v", in.Name, f.Vertices, f.Rays, err)
				}
				if want := normalConeMinBrute(fs, containing, tau, obj); val.Cmp(want) != 0 {
					t.Errorf("%s: face %v rays %v τ %v c %v: min %v, facets give %v", in.Name, f.Vertices, f.Rays, tau, obj, val, want)
				}
				checkNormalConeY(t, n, f, tau, y)
				cy := new(big.Rat)
				for i := range y {
					cy.Add(cy, new(big.Rat).Mul(obj[i], y[i]))
				}
				if cy.Cmp(val) != 0 {
					t.Errorf("c·y = %v, value %v", cy, val)
				}
			}
		}
	}
}

func TestNormalConeMinHandWorked(t *testing.T) {
	// x⁴ + x²y² + y⁶: the vertex (2,2) lies on the edges with normals
	// (2,1) and (1,1), so its normal cone is cone{(2,1), (1,1)}; with τ =
	// (1,1) the normalised generators are (2/3,1/3) and (1/2,1/2): min y_1
	// = 1/2, min y_2 = 1/3 (hand-worked).
	n, _ := New(2, [][]int{{4, 0}, {2, 2}, {0, 6}})
	ctx := context.Background()
	tau := rats(1, 1)
	v := &Face{Vertices: []int{1}}
	tests := []struct {
		name string
		f    *Face
		c    []*big.Rat
		want *big.Rat
		y    []*big.Rat
	}{
		{"vertex, y1", v, rats(1, 0), big.NewRat(1, 2), []*big.Rat{big.NewRat(1, 2), big.NewRat(1, 2)}},
		{"vertex, y2", v, rats(0, 1), big.NewRat(1, 3), []*big.Rat{big.NewRat(2, 3), big.NewRat(1, 3)}},
		{"edge", &Face{Vertices: []int{0, 1}, Dim: 1}, rats(1, 0), big.NewRat(2, 3), []*big.Rat{big.NewRat(2, 3), big.NewRat(1, 3)}},
		// The ray face {(4,0)} + R·e_1 has normal cone cone{(0,1)}.
		{"ray face", &Face{Vertices: []int{2}, Rays: []int{0}, Dim: 1}, rats(0, 1), big.NewRat(1, 1), rats(0, 1)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			val, y, err := n.NormalConeMin(ctx, tc.f, tau, tc.c)
			if err != nil {
				t.Fatal(err)
			}
			if val.Cmp(tc.want) != 0 || !ratsEqual(y, tc.y) {
				t.Errorf("min = %v at %v, want %v at %v", val, y, tc.want, tc.y)
			}
		})
	}
	for _, bad := range []struct {
		f      *Face
		tau, c []*big.Rat
		want   error
	}{
		{v, rats(1, 0), rats(1, 0), ErrDirection},
		{v, rats(1), rats(1, 0), ErrDirection},
		{v, tau, rats(1), ErrDimension},
		{v, tau, []*big.Rat{nil, big.NewRat(1, 1)}, ErrDimension},
		{&Face{Vertices: []int{0, 2}, Dim: 1}, tau, rats(1, 0), ErrFace},
		{&Face{Vertices: []int{0, 1, 2}, Rays: []int{0, 1}, Dim: 2}, tau, rats(1, 0), ErrFace},
	} {
		if _, _, err := n.NormalConeMin(ctx, bad.f, bad.tau, bad.c); !errors.Is(err, bad.want) {
			t.Errorf("NormalConeMin(%v, %v, %v): err = %v, want %v", bad.f, bad.tau, bad.c, err, bad.want)
		}
	}
}

func TestInConeRoutes(t *testing.T) {
	tests := []struct {
		name string
		cols [][]int64
		y    []int64
		want bool
	}{
		{"unit vectors", [][]int64{{1, 0}, {0, 1}}, []int64{2, 3}, true},
		{"negative weight", [][]int64{{1, 0}, {0, 1}}, []int64{2, -3}, false},
		{"inconsistent", [][]int64{{1, 1, 0}}, []int64{1, 1, 1}, false},
		{"consistent overdetermined", [][]int64{{1, 1, 0}}, []int64{3, 3, 0}, true},
		// (1,1) = ½(2,0) + ½(0,2); the dependent third column gets weight 0.
		{"dependent column", [][]int64{{2, 0}, {0, 2}, {4, 0}}, []int64{1, 1}, true},
		// (3,1) = 1·(1,1) + 1·(2,0) with the first column dependent on them.
		{"order", [][]int64{{1, 1}, {2, 0}}, []int64{3, 1}, true},
		{"needs negative", [][]int64{{1, 1}, {2, 0}}, []int64{0, 1}, false},
		{"zero column", [][]int64{{0, 0}, {1, 2}}, []int64{2, 4}, true},
		{"large", [][]int64{{1 << 40, 1}, {1, 1 << 40}}, []int64{1<<40 + 1, 1<<40 + 1}, true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cs := &coverSearch{}
			var basic []int
			for k, c := range tc.cols {
				cs.groups = append(cs.groups, coverGroup{y: c})
				basic = append(basic, k)
			}
			if got := cs.inConeRat(tc.y, basic); got != tc.want {
				t.Errorf("inConeRat = %v, want %v", got, tc.want)
			}
			ok, decided := cs.inCone64(tc.y, basic)
			if decided && ok != tc.want {
				t.Errorf("inCone64 = %v, want %v", ok, tc.want)
			}
			if !decided && tc.name != "large" {
				t.Errorf("inCone64 undecided")
			}
		})
	}
}

// TestCoversHuge scales instances by K = 2^40 and 2^57, which makes the
// certificate arithmetic leave int64 and, for the larger K, the integer
// points of the quotient overflow so that Covers takes its exact fallback;
// the faces (as vertex index sets) do not change under scaling (common
// practice: P(K·A) = K·P(A)). Exponents are at most 6, so 6·2^57 fits.
func TestCoversHuge(t *testing.T) {
	for _, K := range []int{1 << 40, 1 << 57} {
		testCoversScaled(t, K)
	}
}

func testCoversScaled(t *testing.T, K int) {
	for _, in := range randomInstances(61, 25) {
		n0, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		scaled := make([][]int, len(in.Points))
		for k, p := range in.Points {
			scaled[k] = make([]int, in.D)
			for i, x := range p {
				scaled[k][i] = x * K
			}
		}
		n, err := New(in.D, scaled)
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n0.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		up := coversFromLattice(lat)
		for g, f := range lat.Faces {
			got, err := n.Covers(context.Background(), &Face{Vertices: f.Vertices, Dim: f.Dim})
			if err != nil {
				t.Fatal(err)
			}
			var want [][]int
			for _, h := range up[g] {
				want = append(want, lat.Faces[h].Vertices)
			}
			slices.SortFunc(want, slices.Compare)
			var gotV [][]int
			for _, c := range got {
				gotV = append(gotV, c.Vertices)
				checkCompleteCompact(t, n, c)
			}
			if !slices.EqualFunc(gotV, want, slices.Equal) {
				t.Errorf("%s ×%d: Covers(%v) = %v, want %v", in.Name, K, f.Vertices, gotV, want)
			}
		}
	}
}

// TestNormalConeMinHuge scales instances by K = 2^40: faces and normal
// cones do not change (common practice: P(K·A) = K·P(A)), so the optimum
// must equal the unscaled one; the integer check overflows int64 and the
// exact simplex fallback decides.
func TestNormalConeMinHuge(t *testing.T) {
	const K = 1 << 40
	rng := rand.New(rand.NewPCG(81, 82))
	ctx := context.Background()
	for _, in := range randomInstances(83, 30) {
		n0, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		scaled := make([][]int, len(in.Points))
		for k, p := range in.Points {
			scaled[k] = make([]int, in.D)
			for i, x := range p {
				scaled[k][i] = x * K
			}
		}
		n, err := New(in.D, scaled)
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n0.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range lat.Faces {
			tau := make([]*big.Rat, in.D)
			c := make([]*big.Rat, in.D)
			for i := range tau {
				tau[i] = big.NewRat(int64(1+rng.IntN(4)), int64(1+rng.IntN(3)))
				c[i] = big.NewRat(int64(rng.IntN(7)-2), int64(1+rng.IntN(2)))
			}
			want, _, err := n0.NormalConeMin(ctx, f, tau, c)
			if err != nil {
				t.Fatal(err)
			}
			g := &Face{Vertices: f.Vertices, Dim: f.Dim}
			got, y, err := n.NormalConeMin(ctx, g, tau, c)
			if err != nil {
				t.Fatal(err)
			}
			if got.Cmp(want) != 0 {
				t.Errorf("%s ×2^40 face %v: min %v, unscaled %v", in.Name, f.Vertices, got, want)
			}
			checkNormalConeY(t, n, g, tau, y)
		}
	}
}

// TestCompactFaceAtHuge scales instances by K = 2^40 (faces keep their
// vertex indices; common practice: P(K·A) = K·P(A)), so that the integer
// certificates overflow int64 and CompactFaceAt takes its exact LPs.
func TestCompactFaceAtHuge(t *testing.T) {
	const K = 1 << 40
	ctx := context.Background()
	for _, in := range randomInstances(91, 30) {
		n0, err := New(in.D, in.Points)
		if err != nil {
			t.Fatal(err)
		}
		scaled := make([][]int, len(in.Points))
		for k, p := range in.Points {
			scaled[k] = make([]int, in.D)
			for i, x := range p {
				scaled[k][i] = x * K
			}
		}
		n, err := New(in.D, scaled)
		if err != nil {
			t.Fatal(err)
		}
		lat, err := n0.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range lat.Faces {
			x := n.centroid(f.Vertices)
			got, err := n.CompactFaceAt(ctx, x)
			if err != nil {
				t.Fatal(err)
			}
			if !got.Equal(f) || got.Dim != f.Dim {
				t.Errorf("%s ×2^40: CompactFaceAt(centroid of %v) = %v", in.Name, f.Vertices, got)
				continue
			}
			checkCompleteCompact(t, n, got)
			// A step along a coordinate leaves the compact faces.
			x[0] = new(big.Rat).Add(x[0], big.NewRat(K, 3))
			if got, err := n.CompactFaceAt(ctx, x); err != nil || got != nil {
				t.Errorf("%s ×2^40: CompactFaceAt(centroid of %v + e_0·K/3) = %v, %v; want nil", in.Name, f.Vertices, got, err)
			}
		}
	}
}

// TestFaceOpsHugeExponents runs the face operations on instances scaled by
// 2^59 (coordinates near 2^61, so nearly every int64 path overflows) and
// compares with the unscaled instance: faces keep their vertex indices and
// normal cones (common practice: P(K·A) = K·P(A)).
func TestFaceOpsHugeExponents(t *testing.T) {
	const K = 1 << 59
	ctx := context.Background()
	rng := rand.New(rand.NewPCG(101, 102))
	for trial := 0; trial < 15; trial++ {
		d := 2 + rng.IntN(3)
		pts := randomPoints(rng, d, 3+rng.IntN(6), 3)
		n0, err := New(d, pts)
		if err != nil {
			t.Fatal(err)
		}
		scaled := make([][]int, len(pts))
		for k, p := range pts {
			scaled[k] = make([]int, d)
			for i, x := range p {
				scaled[k][i] = x * K
			}
		}
		n, err := New(d, scaled)
		if err != nil {
			t.Fatal(err)
		}
		e0 := make([]*big.Rat, d)
		for i := range e0 {
			e0[i] = new(big.Rat)
		}
		e0[0].SetInt64(1)
		for j, v := range vertexSeq(t, n) {
			f := &Face{Vertices: []int{j}}
			want, err := n0.Covers(ctx, f)
			if err != nil {
				t.Fatal(err)
			}
			got, err := n.Covers(ctx, f)
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != len(want) {
				t.Fatalf("trial %d vertex %d: %d covers, unscaled %d", trial, j, len(got), len(want))
			}
			for k := range got {
				if !got[k].Equal(want[k]) {
					t.Errorf("trial %d vertex %d: cover %v, unscaled %v", trial, j, got[k].Vertices, want[k].Vertices)
				}
				checkCompleteCompact(t, n, got[k])
			}
			x := make([]*big.Rat, d)
			for i := range x {
				x[i] = new(big.Rat).SetInt64(int64(v[i]))
			}
			if g, err := n.CompactFaceAt(ctx, x); err != nil || g == nil || !g.Equal(f) {
				t.Errorf("trial %d: CompactFaceAt(vertex %d) = %v, %v", trial, j, g, err)
			}
			w, _, err := n0.NormalConeMin(ctx, f, ones(d), e0)
			if err != nil {
				t.Fatal(err)
			}
			if g, _, err := n.NormalConeMin(ctx, f, ones(d), e0); err != nil || g.Cmp(w) != 0 {
				t.Errorf("trial %d vertex %d: NormalConeMin = %v, %v; unscaled %v", trial, j, g, err, w)
			}
		}
	}
}
