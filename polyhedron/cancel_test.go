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

func TestLimitsContext(t *testing.T) {
	d, pts := lowRankSupport(3, 2, 2)
	plain, err := New(d, pts)
	if err != nil {
		t.Fatal(err)
	}
	wantFacets, err := plain.Facets()
	if err != nil {
		t.Fatal(err)
	}
	wantFaces, err := plain.CompactFaces()
	if err != nil {
		t.Fatal(err)
	}

	// A live context changes nothing.
	live, err := NewWithLimits(d, pts, Limits{Context: context.Background()})
	if err != nil {
		t.Fatal(err)
	}
	fs, err := live.Facets()
	if err != nil || len(fs) != len(wantFacets) {
		t.Fatalf("live context: %d facets, error %v; want %d", len(fs), err, len(wantFacets))
	}
	lat, err := live.CompactFaces()
	if err != nil || len(lat.Faces) != len(wantFaces.Faces) {
		t.Fatalf("live context: %d faces, error %v; want %d", len(lat.Faces), err, len(wantFaces.Faces))
	}

	// A cancelled context stops New, and both enumerations of a Newton
	// built before the cancellation; the error is kept.
	ctx, cancel := context.WithCancel(context.Background())
	stopped, err := NewWithLimits(d, pts, Limits{Context: ctx})
	if err != nil {
		t.Fatal(err)
	}
	cancel()
	if _, err := NewWithLimits(d, pts, Limits{Context: ctx}); !errors.Is(err, context.Canceled) {
		t.Errorf("New with a cancelled context: error %v, want context.Canceled", err)
	}
	for range 2 {
		if _, err := stopped.Facets(); !errors.Is(err, context.Canceled) {
			t.Errorf("Facets with a cancelled context: error %v, want context.Canceled", err)
		}
		if _, err := stopped.CompactFaces(); !errors.Is(err, context.Canceled) {
			t.Errorf("CompactFaces with a cancelled context: error %v, want context.Canceled", err)
		}
	}
	// Distance does not enumerate and does not look at the context.
	if _, err := stopped.Distance(allOnes(d)); err != nil {
		t.Errorf("Distance with a cancelled context: %v", err)
	}
}

func allOnes(d int) []*big.Rat {
	out := make([]*big.Rat, d)
	for i := range out {
		out[i] = big.NewRat(1, 1)
	}
	return out
}
