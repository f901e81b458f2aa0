package polyhedron

import (
	"context"
	"errors"
	"math/big"
	"testing"
)

// lowRankSupport returns the exponents of the products b_ih·a_hj of a
// rank-H factorisation B·A (N×H times H×M), in the variables a (H·M of
// them) followed by b (N·H): the support of the generators of ‖BA‖².
func lowRankSupport(m, n, h int) (int, [][]int) {
	d := h*m + n*h
	var pts [][]int
	for i := range n {
		for j := range m {
			for k := range h {
				p := make([]int, d)
				p[k*m+j] = 1
				p[h*m+i*h+k] = 1
				pts = append(pts, p)
			}
		}
	}
	return d, pts
}

func TestContextStopsEnumerations(t *testing.T) {
	d, pts := lowRankSupport(3, 2, 2)
	plain, err := New(d, pts)
	if err != nil {
		t.Fatal(err)
	}
	wantFacets, err := plain.Facets(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	wantFaces, err := plain.CompactFaces(context.Background())
	if err != nil {
		t.Fatal(err)
	}

	// A cancelled context stops the vertices, both enumerations and the
	// face operations that need the vertices; nothing is cached, so a live
	// context afterwards gets the full answer.
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	n, err := New(d, pts)
	if err != nil {
		t.Fatal(err)
	}
	for range 2 {
		if _, err := n.Vertices(ctx); !errors.Is(err, context.Canceled) {
			t.Errorf("Vertices with a cancelled context: error %v, want context.Canceled", err)
		}
		if _, err := n.Facets(ctx); !errors.Is(err, context.Canceled) {
			t.Errorf("Facets with a cancelled context: error %v, want context.Canceled", err)
		}
		if _, err := n.CompactFaces(ctx); !errors.Is(err, context.Canceled) {
			t.Errorf("CompactFaces with a cancelled context: error %v, want context.Canceled", err)
		}
		if _, err := n.CompactFaceAt(ctx, allOnes(d)); !errors.Is(err, context.Canceled) {
			t.Errorf("CompactFaceAt with a cancelled context: error %v, want context.Canceled", err)
		}
	}
	// The distance needs no vertex when the face hit has a single tight
	// point; here it does not look at the context at all.
	if _, err := n.Distance(context.Background(), allOnes(d)); err != nil {
		t.Errorf("Distance: %v", err)
	}
	fs, err := n.Facets(context.Background())
	if err != nil || len(fs) != len(wantFacets) {
		t.Fatalf("after a cancelled call: %d facets, error %v; want %d", len(fs), err, len(wantFacets))
	}
	lat, err := n.CompactFaces(context.Background())
	if err != nil || len(lat.Faces) != len(wantFaces.Faces) {
		t.Fatalf("after a cancelled call: %d faces, error %v; want %d", len(lat.Faces), err, len(wantFaces.Faces))
	}
}

func allOnes(d int) []*big.Rat {
	out := make([]*big.Rat, d)
	for i := range out {
		out[i] = big.NewRat(1, 1)
	}
	return out
}
