package polyhedron

import (
	"context"
	"errors"
	"math/big"
	"math/rand/v2"
	"slices"
	"sync"
	"testing"
)

// TestHugeExponents scales instances by a huge factor K, which forces the
// int64 fast paths to overflow and fall back to math/big. Scaling P by K
// scales t by K and the right-hand sides by K, and keeps normals, vertices
// and faces (common practice: P(K·A) = K·P(A)).
func TestHugeExponents(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	const K = 1 << 61
	for trial := 0; trial < 20; trial++ {
		d := 2 + rng.IntN(3)
		pts := randomPoints(rng, d, 3+rng.IntN(6), 3)
		big1, err := New(d, pts)
		if err != nil {
			t.Fatal(err)
		}
		scaled := make([][]int, len(pts))
		for k, p := range pts {
			scaled[k] = make([]int, d)
			for i, x := range p {
				scaled[k][i] = x * K / 4 // x <= 3 keeps this below 2^63
			}
		}
		n, err := New(d, scaled)
		if err != nil {
			t.Fatal(err)
		}
		if len(mustVertices(t, n)) != len(mustVertices(t, big1)) {
			t.Fatalf("scaled instance has %d vertices, original %d", len(mustVertices(t, n)), len(mustVertices(t, big1)))
		}
		tau := make([]*big.Rat, d)
		for i := range tau {
			tau[i] = big.NewRat(int64(1+rng.IntN(4)), int64(1+rng.IntN(3)))
		}
		h0, err := big1.Distance(context.Background(), tau)
		if err != nil {
			t.Fatal(err)
		}
		h, err := n.Distance(context.Background(), tau)
		if err != nil {
			t.Fatal(err)
		}
		want := new(big.Rat).Mul(h0.T, big.NewRat(K/4, 1))
		if h.T.Cmp(want) != 0 {
			t.Errorf("scaled t = %v, want %v", h.T, want)
		}
		checkHit(t, n, scaled, tau, h)
		if !slices.Equal(h.Face.Vertices, h0.Face.Vertices) || h.Face.Dim != h0.Face.Dim {
			t.Errorf("scaled face %v dim %d, original %v dim %d", h.Face.Vertices, h.Face.Dim, h0.Face.Vertices, h0.Face.Dim)
		}
		fs0, _ := big1.Facets(context.Background())
		fs, err := n.Facets(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		if len(fs) != len(fs0) {
			t.Fatalf("scaled instance has %d facets, original %d", len(fs), len(fs0))
		}
		for k := range fs {
			if !slices.EqualFunc(fs[k].Normal, fs0[k].Normal, func(a, b *big.Int) bool { return a.Cmp(b) == 0 }) ||
				fs[k].RHS.Cmp(new(big.Int).Mul(fs0[k].RHS, big.NewInt(K/4))) != 0 {
				t.Errorf("facet %d: %v >= %v, original %v >= %v", k, fs[k].Normal, fs[k].RHS, fs0[k].Normal, fs0[k].RHS)
			}
		}
		checkFacets(t, n, scaled)
	}
}

// TestConcurrentQueries runs queries from several goroutines on one
// polyhedron (run with -race), and checks that Face.Facets is filled once
// the facets are known.
func TestConcurrentQueries(t *testing.T) {
	pts := [][]int{{4, 0, 0}, {0, 4, 0}, {0, 0, 4}, {1, 1, 1}, {2, 2, 0}, {3, 0, 1}}
	n, err := New(3, pts)
	if err != nil {
		t.Fatal(err)
	}
	var wg sync.WaitGroup
	for g := 0; g < 8; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if _, err := n.Distance(context.Background(), rats(1, 2, 3)); err != nil {
				t.Error(err)
			}
			if _, err := n.Facets(context.Background()); err != nil {
				t.Error(err)
			}
			if _, err := n.CompactFaces(context.Background()); err != nil {
				t.Error(err)
			}
		}()
	}
	wg.Wait()
	fs, _ := n.Facets(context.Background())
	h, err := n.Distance(context.Background(), rats(1, 1, 1))
	if err != nil {
		t.Fatal(err)
	}
	if len(h.Face.Facets) == 0 {
		t.Fatalf("Face.Facets not set after the facets were enumerated")
	}
	for _, k := range h.Face.Facets {
		f := fs[k]
		if !isSubset(h.Face.Vertices, f.Vertices) || !isSubset(h.Face.Rays, f.Rays) {
			t.Errorf("facet %d does not contain the face", k)
		}
	}
	// The facets listed are all facets containing the face: their number
	// of independent normals is the codimension.
	if r := normalRank(fs, h.Face.Facets, 3); r != h.Face.Codim(3) {
		t.Errorf("facets through the face have normal rank %d, codim %d", r, h.Face.Codim(3))
	}
}

func TestLimits(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 9))
	pts := randomPoints(rng, 6, 60, 9)
	n, err := NewWithLimits(6, pts, Limits{MaxRays: 5})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := n.Facets(context.Background()); !errors.Is(err, ErrTooLarge) {
		t.Errorf("Facets with MaxRays 5: err = %v, want ErrTooLarge", err)
	}
	if _, err := n.CompactFaces(context.Background()); !errors.Is(err, ErrTooLarge) {
		t.Errorf("CompactFaces with MaxRays 5: err = %v, want ErrTooLarge", err)
	}
	n, _ = NewWithLimits(6, pts, Limits{MaxFaces: 3})
	if _, err := n.CompactFaces(context.Background()); !errors.Is(err, ErrTooLarge) {
		t.Errorf("CompactFaces with MaxFaces 3: err = %v, want ErrTooLarge", err)
	}
	// Distance needs no enumeration and works under any limit.
	if _, err := n.Distance(context.Background(), ones6()); err != nil {
		t.Error(err)
	}
}

func ones6() []*big.Rat { return rats(1, 1, 1, 1, 1, 1) }

// TestFaceAtErrors covers points off the boundary and bad lengths.
func TestFaceAtErrors(t *testing.T) {
	n, _ := New(2, [][]int{{2, 0}, {0, 2}})
	tests := []struct {
		x    []*big.Rat
		want error
	}{
		{rats(1), ErrDimension},
		{rats(3, 3), ErrNotBoundary}, // interior
		{[]*big.Rat{big.NewRat(1, 2), big.NewRat(1, 2)}, ErrNotBoundary}, // outside
	}
	for _, tc := range tests {
		if _, err := n.FaceAt(context.Background(), tc.x); !errors.Is(err, tc.want) {
			t.Errorf("FaceAt(%v): err = %v, want %v", tc.x, err, tc.want)
		}
	}
	// On the boundary: (3, 0) lies on the facet y >= 0, which contains the
	// vertex (2,0) and the ray e_x: vertices [1], rays [0], dim 1.
	f, err := n.FaceAt(context.Background(), rats(3, 0))
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(f.Vertices, []int{1}) || !slices.Equal(f.Rays, []int{0}) || f.Dim != 1 {
		t.Errorf("FaceAt(3,0) = %v %v dim %d", f.Vertices, f.Rays, f.Dim)
	}
}

func TestSegmentBelow(t *testing.T) {
	tests := []struct {
		p, q1, q2 []int
		want      bool
	}{
		// by hand: λ(2,0) + (1−λ)(0,2) <= (1,1) at λ = 1/2
		{[]int{1, 1}, []int{2, 0}, []int{0, 2}, true},
		// 3λ <= 1 and 3(1−λ) <= 1 need λ <= 1/3 and λ >= 2/3: impossible
		{[]int{1, 1}, []int{3, 0}, []int{0, 3}, false},
		// λ <= 2/3 and λ >= 1/3
		{[]int{2, 2}, []int{3, 0}, []int{0, 3}, true},
		// a coordinate where both exceed p
		{[]int{2, 0}, []int{1, 1}, []int{3, 1}, false},
		// equal coordinate (dlt = 0) below p, the other forces λ = 1/2 exactly
		{[]int{1, 5, 1}, []int{2, 5, 0}, []int{0, 5, 2}, true},
	}
	for _, tc := range tests {
		if got := segmentBelow(tc.p, tc.q1, tc.q2, []int{0, 1, 2}[:len(tc.p)]); got != tc.want {
			t.Errorf("segmentBelow(%v, %v, %v) = %v, want %v", tc.p, tc.q1, tc.q2, got, tc.want)
		}
	}
}

// TestExtremeDirections uses directions whose entries differ by 60 orders
// of magnitude (float64 guidance degrades; the exact answer must not).
func TestExtremeDirections(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	huge := new(big.Rat).SetFrac(new(big.Int).Exp(big.NewInt(10), big.NewInt(30), nil), big.NewInt(1))
	tiny := new(big.Rat).Inv(huge)
	for trial := 0; trial < 20; trial++ {
		d := 2 + rng.IntN(3)
		pts := randomPoints(rng, d, 2+rng.IntN(8), 6)
		n, err := New(d, pts)
		if err != nil {
			t.Fatal(err)
		}
		fs := checkFacets(t, n, pts)
		tau := make([]*big.Rat, d)
		for i := range tau {
			switch rng.IntN(3) {
			case 0:
				tau[i] = huge
			case 1:
				tau[i] = tiny
			default:
				tau[i] = big.NewRat(int64(1+rng.IntN(5)), 3)
			}
		}
		h, err := n.Distance(context.Background(), tau)
		if err != nil {
			t.Fatal(err)
		}
		checkHit(t, n, pts, tau, h)
		if want := facetDistance(fs, tau); h.T.Cmp(want) != 0 {
			t.Errorf("t = %v, facets give %v", h.T, want)
		}
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		checkFace(t, n, fs, lat, h.Point, h.Face)
	}
}
