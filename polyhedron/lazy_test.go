package polyhedron

import (
	"context"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestLazyAgreesWithVertices checks that Distance and FaceAt answer the
// same on a fresh polyhedron (the path over all points, with the face's
// vertices found among its tight points only) as on one whose vertices are
// already known (the path over the vertices). The instances have many
// points that are no vertices, some of them on faces (the midpoints of
// edges are added on purpose), and the face found must list only vertices
// and be exposed by its normal, checked against the vertex list.
func TestLazyAgreesWithVertices(t *testing.T) {
	ctx := context.Background()
	rng := rand.New(rand.NewPCG(31, 32))
	for trial := 0; trial < 150; trial++ {
		d := 2 + rng.IntN(4)
		pts := randomPoints(rng, d, 3+rng.IntN(12), 6)
		// Add doubled points and sums of pairs, so that midpoints of
		// segments between points lie on faces as non-vertices.
		for i := range pts {
			for k := range pts[i] {
				pts[i][k] *= 2
			}
		}
		m := len(pts)
		for k := 0; k < m; k++ {
			a, b := pts[rng.IntN(m)], pts[rng.IntN(m)]
			mid := make([]int, d)
			for i := range mid {
				mid[i] = (a[i] + b[i]) / 2
			}
			pts = append(pts, mid)
		}
		lazy, err := New(d, pts)
		if err != nil {
			t.Fatal(err)
		}
		eager, err := New(d, pts)
		if err != nil {
			t.Fatal(err)
		}
		isVertex := vertexPoints(t, eager)
		for k := 0; k < 4; k++ {
			tau := make([]*big.Rat, d)
			for i := range tau {
				tau[i] = big.NewRat(int64(1+rng.IntN(5)), int64(1+rng.IntN(3)))
			}
			fresh, err := New(d, pts)
			if err != nil {
				t.Fatal(err)
			}
			h1, err := fresh.Distance(ctx, tau)
			if err != nil {
				t.Fatal(err)
			}
			h2, err := eager.Distance(ctx, tau)
			if err != nil {
				t.Fatal(err)
			}
			if h1.T.Cmp(h2.T) != 0 || !h1.Face.Equal(h2.Face) || h1.Face.Dim != h2.Face.Dim {
				t.Fatalf("%v τ=%v: lazy t=%v face %v dim %d, eager t=%v face %v dim %d",
					pts, tau, h1.T, h1.Face.Vertices, h1.Face.Dim, h2.T, h2.Face.Vertices, h2.Face.Dim)
			}
			for _, j := range h1.Face.Vertices {
				if isVertex[j] == nil {
					t.Fatalf("%v τ=%v: face lists point %v, which is no vertex", pts, tau, fresh.Points()[j])
				}
			}
			checkExposes(t, eager, h1.Face)
			checkHit(t, fresh, pts, tau, h1)
		}
		// FaceAt at midpoints of two points (often on a face, sometimes
		// interior or on a ray).
		for k := 0; k < 4; k++ {
			a, b := pts[rng.IntN(len(pts))], pts[rng.IntN(len(pts))]
			x := make([]*big.Rat, d)
			for i := range x {
				x[i] = big.NewRat(int64(a[i]+b[i]), 2)
			}
			f1, err1 := lazy.FaceAt(ctx, x)
			f2, err2 := eager.FaceAt(ctx, x)
			if (err1 == nil) != (err2 == nil) {
				t.Fatalf("FaceAt(%v): lazy error %v, eager error %v", x, err1, err2)
			}
			if err1 == nil && (!f1.Equal(f2) || f1.Dim != f2.Dim || !slices.Equal(f1.Rays, f2.Rays)) {
				t.Fatalf("FaceAt(%v): lazy %v dim %d, eager %v dim %d", x, f1.Vertices, f1.Dim, f2.Vertices, f2.Dim)
			}
		}
	}
}
