package picture

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// describe runs the library on a problem given as text, at its one point.
func describe(t testing.TB, spec rlct.Spec) *rlct.Description {
	t.Helper()
	p, err := spec.Problem()
	if err != nil {
		t.Fatalf("%+v: %v", spec, err)
	}
	return describeOne(t, p)
}

// describeOne describes a problem with one point.
func describeOne(t testing.TB, p *rlct.Problem) *rlct.Description {
	t.Helper()
	ds, err := rlct.Describe(context.Background(), p, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(ds) != 1 {
		t.Fatalf("%d descriptions, want 1", len(ds))
	}
	return ds[0]
}

// scene builds the scene of a problem given as text.
func sceneOf(t testing.TB, spec rlct.Spec) *scene {
	t.Helper()
	sc, err := newScene(describe(t, spec))
	if err != nil {
		t.Fatalf("%+v: %v", spec, err)
	}
	return sc
}

// shapeOf returns the shape of the facet with the inequality, as the
// library writes it.
func shapeOf(t *testing.T, sc *scene, inequality string) *shape {
	t.Helper()
	var all []string
	for i, f := range sc.d.Facets {
		if f.Inequality == inequality {
			return sc.shapes[i]
		}
		all = append(all, f.Inequality)
	}
	t.Fatalf("no facet %s among %q", inequality, all)
	return nil
}

// pts writes integer points compactly: pts(0,0,2, 0,3,2) is (0,0,2), (0,3,2)
// in three variables.
func pts(n int, xs ...int64) [][]int64 {
	var out [][]int64
	for i := 0; i+n <= len(xs); i += n {
		out = append(out, xs[i:i+n])
	}
	return out
}

// sideCounts counts the sides of a shape by kind: bounded, ray, cut.
func sideCounts(sh *shape) [3]int {
	var c [3]int
	for _, s := range sh.sides {
		c[s.kind]++
	}
	return c
}

// TestFrameExtents checks the frame against hand-worked extents: the
// largest coordinate of a vertex or of t_τ·τ rounded up, plus a quarter of
// it rounded up and at least one.
func TestFrameExtents(t *testing.T) {
	tests := []struct {
		verts [][]int64
		hit   []*big.Rat
		want  []int64
	}{
		// x⁴ + y⁶: t_τ·τ = (12/5, 12/5); 4 + 1 and 6 + 2.
		{pts(2, 4, 0, 0, 6), []*big.Rat{big.NewRat(12, 5), big.NewRat(12, 5)}, []int64{5, 8}},
		// x² + y² + z²: (2/3, 2/3, 2/3); 2 + 1 on each axis.
		{pts(3, 2, 0, 0, 0, 2, 0, 0, 0, 2), []*big.Rat{big.NewRat(2, 3), big.NewRat(2, 3), big.NewRat(2, 3)}, []int64{3, 3, 3}},
		// A hit beyond the vertices: ⌈9/2⌉ = 5, 5 + 2; 20 + 5.
		{pts(2, 1, 20), []*big.Rat{big.NewRat(9, 2), big.NewRat(1, 1)}, []int64{7, 25}},
		// Nothing beyond 0 on an axis still gets one step: 1 + 1.
		{pts(2, 0, 0), []*big.Rat{new(big.Rat), new(big.Rat)}, []int64{2, 2}},
	}
	for _, tt := range tests {
		if got := frameExtents(tt.verts, tt.hit); !slices.Equal(got, tt.want) {
			t.Errorf("frameExtents(%v, %v) = %v, want %v", tt.verts, tt.hit, got, tt.want)
		}
	}
}

// TestFacetShapes3 checks the facets of P(K) cut at the frame against
// polygons worked out by hand: the corners are the facet's exact vertices,
// and the points where its rays meet the far sides of the frame.
func TestFacetShapes3(t *testing.T) {
	type want struct {
		corners [][]int64
		sides   [3]int // bounded, ray, cut
	}
	tests := []struct {
		spec   rlct.Spec
		box    []int64
		facets map[string]want
	}{
		{
			// x²y² + z²: vertices (0,0,2), (2,2,0); frame 2 + 1 = 3. On
			// x + z = 2, the other facets leave y ≥ x: the strip
			// between (0,0,2)–(2,2,0) and y = 3. On y + z = 2 likewise
			// x ≥ y up to x = 3. The coordinate facets are quarter
			// planes at their vertex.
			spec: rlct.Spec{K: "x^2*y^2 + z^2"},
			box:  []int64{3, 3, 3},
			facets: map[string]want{
				"x >= 0":     {pts(3, 0, 0, 2, 0, 3, 2, 0, 3, 3, 0, 0, 3), [3]int{0, 2, 2}},
				"y >= 0":     {pts(3, 0, 0, 2, 3, 0, 2, 3, 0, 3, 0, 0, 3), [3]int{0, 2, 2}},
				"z >= 0":     {pts(3, 2, 2, 0, 3, 2, 0, 3, 3, 0, 2, 3, 0), [3]int{0, 2, 2}},
				"x + z >= 2": {pts(3, 0, 0, 2, 2, 2, 0, 2, 3, 0, 0, 3, 2), [3]int{1, 2, 1}},
				"y + z >= 2": {pts(3, 0, 0, 2, 2, 2, 0, 3, 2, 0, 3, 0, 2), [3]int{1, 2, 1}},
			},
		},
		{
			// x² + y² + z²: the triangle x + y + z = 2 and, on each
			// coordinate plane, the region above the edge between two
			// vertices: on x = 0 the corners (0,0,2), (0,2,0), then
			// (0,3,0), (0,3,3), (0,0,3).
			spec: rlct.Spec{K: "x^2 + y^2 + z^2"},
			box:  []int64{3, 3, 3},
			facets: map[string]want{
				"x + y + z >= 2": {pts(3, 2, 0, 0, 0, 2, 0, 0, 0, 2), [3]int{3, 0, 0}},
				"x >= 0":         {pts(3, 0, 0, 2, 0, 2, 0, 0, 3, 0, 0, 3, 3, 0, 0, 3), [3]int{1, 2, 2}},
				"y >= 0":         {pts(3, 0, 0, 2, 2, 0, 0, 3, 0, 0, 3, 0, 3, 0, 0, 3), [3]int{1, 2, 2}},
				"z >= 0":         {pts(3, 0, 2, 0, 2, 0, 0, 3, 0, 0, 3, 3, 0, 0, 3, 0), [3]int{1, 2, 2}},
			},
		},
		{
			// x² + y² in (x, y, z): the vertices (2,0,0), (0,2,0), and
			// t_τ·τ = (1,1,1), so the frame reaches 2 + 1 along x and y,
			// 1 + 1 along z. The facet x + y = 2 is the strip above
			// their edge, along z up to 2; z = 0 is the region above
			// that edge.
			spec: rlct.Spec{K: "x^2 + y^2", Vars: []string{"x", "y", "z"}},
			box:  []int64{3, 3, 2},
			facets: map[string]want{
				"x + y >= 2": {pts(3, 0, 2, 0, 2, 0, 0, 2, 0, 2, 0, 2, 2), [3]int{1, 2, 1}},
				"z >= 0":     {pts(3, 0, 2, 0, 2, 0, 0, 3, 0, 0, 3, 3, 0, 0, 3, 0), [3]int{1, 2, 2}},
			},
		},
	}
	for _, tt := range tests {
		sc := sceneOf(t, tt.spec)
		if !slices.Equal(sc.box, tt.box) {
			t.Errorf("K = %s: frame %v, want %v", tt.spec.K, sc.box, tt.box)
		}
		for ineq, w := range tt.facets {
			sh := shapeOf(t, sc, ineq)
			if !sameSet(sh.corners, w.corners) || len(sh.corners) != len(w.corners) {
				t.Errorf("K = %s, facet %s: corners %s, want %s", tt.spec.K, ineq, pointsString(sh.corners), pointsString(w.corners))
			}
			if got := sideCounts(sh); got != w.sides {
				t.Errorf("K = %s, facet %s: %v bounded, ray and cut sides, want %v", tt.spec.K, ineq, got, w.sides)
			}
			checkSidesJoinCorners(t, sh)
		}
	}
}

// checkSidesJoinCorners checks that side i runs between corners i and i+1.
func checkSidesJoinCorners(t *testing.T, sh *shape) {
	t.Helper()
	n := len(sh.corners)
	for i, s := range sh.sides {
		a, b := sh.corners[i], sh.corners[(i+1)%n]
		if !(slices.Equal(s.a, a) && slices.Equal(s.b, b)) && !(slices.Equal(s.a, b) && slices.Equal(s.b, a)) {
			t.Errorf("side %d %s–%s does not join corners %s and %s", i, pointString(s.a), pointString(s.b), pointString(a), pointString(b))
		}
	}
}

// TestCompactFacetOrder checks the order of a compact facet's corners on a
// hexagon: the exponents of y²z⁴ + y⁴z² + x²z⁴ + x⁴z² + x²y⁴ + x⁴y² are the
// permutations of (0,2,4), all on x + y + z = 6, a regular hexagon whose
// neighbours differ by moving 2 between two coordinates (by hand).
func TestCompactFacetOrder(t *testing.T) {
	sc := sceneOf(t, rlct.Spec{K: "y^2*z^4 + y^4*z^2 + x^2*z^4 + x^4*z^2 + x^2*y^4 + x^4*y^2", Vars: []string{"x", "y", "z"}})
	around := pts(3, 0, 2, 4, 2, 0, 4, 4, 0, 2, 4, 2, 0, 2, 4, 0, 0, 4, 2)
	got := shapeOf(t, sc, "x + y + z >= 6").corners
	if !cyclicallyEqual(got, around) && !cyclicallyEqual(got, reversed(around)) {
		t.Errorf("hexagon corners %s, want the cyclic order %s", pointsString(got), pointsString(around))
	}
	// The ray along (1,1,1) meets the hexagon at its centre (2,2,2),
	// t = 2: λ = 1/2, θ = 1 (by hand), and the hexagon is principal.
	if sc.pf.facet < 0 || sc.d.Facets[sc.pf.facet].Inequality != "x + y + z >= 6" {
		t.Errorf("principal face %+v is not the hexagon", sc.pf)
	}
}

func reversed(p [][]int64) [][]int64 {
	q := slices.Clone(p)
	slices.Reverse(q)
	return q
}

// cyclicallyEqual reports whether b is a rotation of a.
func cyclicallyEqual(a, b [][]int64) bool {
	if len(a) != len(b) {
		return false
	}
	for r := range b {
		ok := true
		for i := range a {
			if !slices.Equal(a[i], b[(i+r)%len(b)]) {
				ok = false
				break
			}
		}
		if ok {
			return true
		}
	}
	return false
}

// TestBoundary2 checks the Newton polygon walked from the facets against
// hand-worked chains.
func TestBoundary2(t *testing.T) {
	tests := []struct {
		spec  rlct.Spec
		chain [][]int64
		box   []int64
	}{
		// x⁴ + y⁶: one edge; frame 5 and 8, drawn to one scale as 8.
		{rlct.Spec{K: "x^4 + y^6"}, pts(2, 0, 6, 4, 0), []int64{8, 8}},
		// x⁴ + x²y² + y⁶: (2,2) lies below 3x + 2y = 12 (6 + 4 < 12),
		// so it is a vertex between (0,6) and (4,0).
		{rlct.Spec{K: "x^4 + x^2*y^2 + y^6"}, pts(2, 0, 6, 2, 2, 4, 0), []int64{8, 8}},
		// x²: one vertex; frame 3, and 0 + 1 = 1 stretched to 3.
		{rlct.Spec{K: "x^2", Vars: []string{"x", "y"}}, pts(2, 2, 0), []int64{3, 3}},
		// x²⁰ + y⁴: 20 + 5 and 4 + 1, too different for one scale.
		{rlct.Spec{K: "x^20 + y^4"}, pts(2, 0, 4, 20, 0), []int64{25, 5}},
	}
	for _, tt := range tests {
		sc := sceneOf(t, tt.spec)
		if !slices.EqualFunc(sc.chain, tt.chain, slices.Equal) {
			t.Errorf("K = %s: chain %s, want %s", tt.spec.K, pointsString(sc.chain), pointsString(tt.chain))
		}
		if !slices.Equal(sc.box, tt.box) {
			t.Errorf("K = %s: frame %v, want %v", tt.spec.K, sc.box, tt.box)
		}
		// The unbounded edges leave the ends of the chain up to the
		// frame.
		first, last := tt.chain[0], tt.chain[len(tt.chain)-1]
		wantRays := [][2][]int64{{first, {first[0], tt.box[1]}}, {last, {tt.box[0], last[1]}}}
		var gotRays [][2][]int64
		for _, sh := range sc.shapes {
			for _, s := range sh.sides {
				if s.kind == sideRay {
					gotRays = append(gotRays, [2][]int64{s.a, s.b})
				}
			}
		}
		for _, w := range wantRays {
			if !slices.ContainsFunc(gotRays, func(g [2][]int64) bool { return slices.Equal(g[0], w[0]) && slices.Equal(g[1], w[1]) }) {
				t.Errorf("K = %s: no unbounded edge %s–%s among %v", tt.spec.K, pointString(w[0]), pointString(w[1]), gotRays)
			}
		}
	}
}

// TestFlaggedFaces checks which faces are marked, against faces worked out
// by hand.
func TestFlaggedFaces(t *testing.T) {
	tests := []struct {
		spec rlct.Spec
		want map[rlct.FaceVerdict][][][]int64 // verdict → the vertex sets of the faces
	}{
		// (y − x²)²: the edge (0,2)–(4,0) has the face polynomial
		// (y − x²)², zero at x = y = 1.
		{rlct.Spec{K: "(y - x^2)^2", Vars: []string{"x", "y"}}, map[rlct.FaceVerdict][][][]int64{
			rlct.Degenerate: {pts(2, 0, 2, 4, 0)},
		}},
		// (x − y)² + z⁴: the edge (2,0,0)–(0,2,0) has (x − y)², zero at
		// x = y; the triangle with (0,0,4) has (x − y)² + z⁴, whose parts
		// in disjoint variables have no common torus zero, so it is
		// nondegenerate (the split rule) and not flagged.
		{rlct.Spec{K: "(x - y)^2 + z^4"}, map[rlct.FaceVerdict][][][]int64{
			rlct.Degenerate: {pts(3, 2, 0, 0, 0, 2, 0)},
		}},
		// x²⁶ + y²⁶ + z²⁶ − x¹³y⁷z⁶: positive on the torus (weighted
		// AM–GM with weights 13/26, 7/26, 6/26 bounds the last term by
		// x²⁶/2 + 7y²⁶/26 + 6z²⁶/26), but its triangle is beyond the
		// degree limits of the plane rule, so undetermined.
		{rlct.Spec{K: "x^26 + y^26 + z^26 - x^13*y^7*z^6"}, map[rlct.FaceVerdict][][][]int64{
			rlct.Undetermined: {pts(3, 26, 0, 0, 0, 26, 0, 0, 0, 26)},
		}},
		// x⁴ + y⁶: nothing to mark.
		{rlct.Spec{K: "x^4 + y^6"}, nil},
	}
	for _, tt := range tests {
		sc := sceneOf(t, tt.spec)
		got := map[rlct.FaceVerdict][][][]int64{}
		for _, f := range sc.flags {
			got[f.verdict] = append(got[f.verdict], f.face.verts)
			if f.face.dim == 2 && !sameSet(f.face.corners, f.face.verts) {
				t.Errorf("K = %s: the corners %s of a flagged face are not its vertices %s", tt.spec.K, pointsString(f.face.corners), pointsString(f.face.verts))
			}
		}
		for _, v := range []rlct.FaceVerdict{rlct.Degenerate, rlct.Undetermined} {
			if len(got[v]) != len(tt.want[v]) {
				t.Errorf("K = %s: %d %s faces, want %d", tt.spec.K, len(got[v]), v, len(tt.want[v]))
				continue
			}
			for i := range got[v] {
				if !sameSet(got[v][i], tt.want[v][i]) {
					t.Errorf("K = %s: %s face %s, want %s", tt.spec.K, v, pointsString(got[v][i]), pointsString(tt.want[v][i]))
				}
			}
		}
	}
}

// TestFacetShapesRandom checks the shapes of the facets of random Newton
// polyhedra in three variables against the exact inequalities from the
// library: every corner satisfies every facet inequality, lies on its own
// facet and in the frame; the corners of a compact facet are its vertices;
// the corners of an unbounded one are its vertices and points on the far
// sides of the frame. Each side is what its kind says: a bounded side joins
// two vertices that share two facets (an edge of P(K)), a ray side leaves a
// vertex along an axis e_j in two facets with a_j = 0 (an unbounded edge),
// and a cut side lies in one far side of the frame.
func TestFacetShapesRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 13))
	vars := []string{"x", "y", "z"}
	for range 80 {
		k := monomial.Zero(vars)
		for range 2 + rng.IntN(7) {
			e := monomial.Exponent{2 * rng.IntN(5), 2 * rng.IntN(5), 2 * rng.IntN(5)}
			if e[0]+e[1]+e[2] == 0 {
				e[rng.IntN(3)] = 2
			}
			k = k.Add(monomial.Monomial(vars, e, big.NewRat(int64(1+rng.IntN(3)), 1)))
		}
		d := describeOne(t, &rlct.Problem{K: k})
		sc, err := newScene(d)
		if err != nil {
			t.Fatalf("K = %s: %v", k, err)
		}
		slack := func(f rlct.Facet, p []int64) int {
			s := new(big.Int).Neg(f.RHS)
			for j, a := range f.Normal {
				s.Add(s, new(big.Int).Mul(a, big.NewInt(p[j])))
			}
			return s.Sign()
		}
		// on lists the facets through p.
		on := func(p []int64) []int {
			var out []int
			for i, f := range d.Facets {
				if slack(f, p) == 0 {
					out = append(out, i)
				}
			}
			return out
		}
		isVert := func(p []int64) bool {
			return slices.ContainsFunc(sc.verts, func(v []int64) bool { return slices.Equal(v, p) })
		}
		farSides := func(p []int64) []int {
			var out []int
			for j := range 3 {
				if p[j] == sc.box[j] {
					out = append(out, j)
				}
			}
			return out
		}
		for i, f := range d.Facets {
			sh := sc.shapes[i]
			checkSidesJoinCorners(t, sh)
			var vs [][]int64
			for _, c := range sh.corners {
				for _, g := range d.Facets {
					if slack(g, c) < 0 {
						t.Errorf("K = %s: corner %s of %s violates %s", k, pointString(c), f.Inequality, g.Inequality)
					}
				}
				if slack(f, c) != 0 {
					t.Errorf("K = %s: corner %s is off its facet %s", k, pointString(c), f.Inequality)
				}
				for j := range 3 {
					if c[j] < 0 || c[j] > sc.box[j] {
						t.Errorf("K = %s: corner %s of %s outside the frame %v", k, pointString(c), f.Inequality, sc.box)
					}
				}
				if isVert(c) {
					vs = append(vs, c)
				} else if len(farSides(c)) == 0 {
					t.Errorf("K = %s: corner %s of %s is neither a vertex nor on the frame", k, pointString(c), f.Inequality)
				}
			}
			wantVerts := make([][]int64, len(f.Vertices))
			for a, v := range f.Vertices {
				wantVerts[a] = []int64{int64(v[0]), int64(v[1]), int64(v[2])}
			}
			if !sameSet(vs, wantVerts) {
				t.Errorf("K = %s: facet %s has the vertices %v, its polygon %s", k, f.Inequality, f.Vertices, pointsString(sh.corners))
			}
			if len(f.Rays) == 0 && len(sh.corners) != len(f.Vertices) {
				t.Errorf("K = %s: compact facet %s drawn with corners %s", k, f.Inequality, pointsString(sh.corners))
			}
			for _, s := range sh.sides {
				switch s.kind {
				case sideBounded:
					if !isVert(s.a) || !isVert(s.b) || len(intersect(on(s.a), on(s.b))) < 2 {
						t.Errorf("K = %s: bounded side %s–%s of %s is no edge of P(K)", k, pointString(s.a), pointString(s.b), f.Inequality)
					}
				case sideRay:
					j := slices.IndexFunc([]int{0, 1, 2}, func(j int) bool { return s.a[j] != s.b[j] })
					zero := 0
					for _, g := range on(s.a) {
						if d.Facets[g].Normal[j].Sign() == 0 {
							zero++
						}
					}
					if !isVert(s.a) || j < 0 || s.b[j] != sc.box[j] || !slices.Equal(moved(s.a, j, sc.box[j]), s.b) || zero < 2 {
						t.Errorf("K = %s: ray side %s–%s of %s is no unbounded edge of P(K) cut at the frame", k, pointString(s.a), pointString(s.b), f.Inequality)
					}
				case sideCut:
					if len(intersect(farSides(s.a), farSides(s.b))) == 0 {
						t.Errorf("K = %s: cut side %s–%s of %s is not on one side of the frame", k, pointString(s.a), pointString(s.b), f.Inequality)
					}
				}
			}
		}
	}
}

func intersect(a, b []int) []int {
	var out []int
	for _, x := range a {
		if slices.Contains(b, x) {
			out = append(out, x)
		}
	}
	return out
}

// TestMalformed checks that descriptions that do not fit together are
// refused with an error, never a panic.
func TestMalformed(t *testing.T) {
	tests := []struct {
		name   string
		spec   rlct.Spec
		change func(d *rlct.Description)
		want   error
	}{
		{"nil", rlct.Spec{K: "x^2 + y^2"}, func(d *rlct.Description) { d.Result = nil }, ErrMalformed},
		{"four variables", rlct.Spec{K: "a^2 + b^2 + c^2 + d^2"}, nil, ErrDimension},
		{"one variable", rlct.Spec{K: "x^2"}, nil, ErrDimension},
		{"off the facet", rlct.Spec{K: "x^4 + y^6"}, func(d *rlct.Description) {
			d.Facets[len(d.Facets)-1].RHS = big.NewInt(13)
		}, ErrMalformed},
		{"rays against the normal", rlct.Spec{K: "x^2 + y^2 + z^2"}, func(d *rlct.Description) {
			d.Facets[0].Rays = nil
		}, ErrMalformed},
		{"an edge missing", rlct.Spec{K: "x^4 + x^2*y^2 + y^6"}, func(d *rlct.Description) {
			d.Facets = slices.DeleteFunc(d.Facets, func(f rlct.Facet) bool { return f.Inequality == "x + y >= 4" })
		}, ErrMalformed},
		{"not a vertex", rlct.Spec{K: "x^4 + y^6"}, func(d *rlct.Description) {
			d.Principal.Vertices = [][]int{{1, 1}}
		}, ErrMalformed},
		{"short hit", rlct.Spec{K: "x^4 + y^6"}, func(d *rlct.Description) { d.Hit = d.Hit[:1] }, ErrMalformed},
		{"missing λ", rlct.Spec{K: "x^4 + y^6"}, func(d *rlct.Description) { d.Lambda = nil }, ErrMalformed},
		{"huge exponent", rlct.Spec{K: "x^4 + y^6"}, func(d *rlct.Description) {
			d.Vertices[0].Exponent = []int{0, 1 << 51}
		}, ErrTooLarge},
		{"a compact facet with too few vertices", rlct.Spec{K: "x^2 + y^2 + z^2"}, func(d *rlct.Description) {
			for i, f := range d.Facets {
				if len(f.Rays) == 0 {
					d.Facets[i].Vertices = f.Vertices[:2]
				}
			}
		}, ErrMalformed},
		{"no facet for a flagged triangle", rlct.Spec{K: "x^26 + y^26 + z^26 - x^13*y^7*z^6"}, func(d *rlct.Description) {
			d.Facets = slices.DeleteFunc(d.Facets, func(f rlct.Facet) bool { return len(f.Rays) == 0 })
		}, ErrMalformed},
	}
	for _, tt := range tests {
		d := describe(t, tt.spec)
		if tt.change != nil {
			tt.change(d)
		}
		svg, err := SVG(d, "K")
		if !errors.Is(err, tt.want) || svg != nil {
			t.Errorf("%s: err %v, want %v", tt.name, err, tt.want)
		}
	}
	if _, err := SVG(nil, "K"); !errors.Is(err, ErrMalformed) {
		t.Errorf("nil description: err %v", err)
	}
}

// TestMalformedRandom changes one number of a valid description at random
// and checks that the picture is drawn or refused, without a panic.
func TestMalformedRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	specs := []rlct.Spec{{K: "x^4 + x^2*y^2 + y^6"}, {K: "x^2*y^2 + z^2"}, {K: "(x - y)^2 + z^4"}, {K: "x^2 + y^2 + z^2"}}
	for i := range 400 {
		spec := specs[i%len(specs)]
		d := describe(t, spec)
		var ints [][]int
		for _, v := range d.Vertices {
			ints = append(ints, v.Exponent)
		}
		for _, f := range d.Facets {
			ints = append(ints, f.Vertices...)
		}
		ints = append(ints, d.Principal.Vertices...)
		for _, f := range d.Faces {
			ints = append(ints, f.Vertices...)
		}
		v := ints[rng.IntN(len(ints))]
		v[rng.IntN(len(v))] += rng.IntN(5) - 2
		if rng.IntN(4) == 0 {
			f := &d.Facets[rng.IntN(len(d.Facets))]
			f.Normal[rng.IntN(len(f.Normal))] = big.NewInt(int64(rng.IntN(3)))
		}
		svg, err := SVG(d, fmt.Sprint(spec.K))
		if err == nil {
			if _, err := decodeSVG(svg); err != nil {
				t.Errorf("%s, changed: %v", spec.K, err)
			}
		} else if !errors.Is(err, ErrMalformed) {
			t.Errorf("%s, changed: %v is not ErrMalformed", spec.K, err)
		}
	}
}
