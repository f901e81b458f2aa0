package polyhedron

import (
	"context"
	"math/big"
	"testing"
)

// byteReader hands out small integers from fuzz input, 0 when exhausted.
type byteReader struct {
	b []byte
	i int
}

func (r *byteReader) next(n int) int {
	if r.i >= len(r.b) || n <= 0 {
		return 0
	}
	v := int(r.b[r.i]) % n
	r.i++
	return v
}

// bruteFeasible decides A x = b, x >= 0 by trying every set of at most m
// columns as a basis (an LP that is feasible has a basic feasible solution;
// common practice) and solving it exactly by Gaussian elimination.
func bruteFeasible(lp *LP) bool {
	m, n := len(lp.B), len(lp.C)
	for mask := 0; mask < 1<<n; mask++ {
		var cols []int
		for j := 0; j < n; j++ {
			if mask&(1<<j) != 0 {
				cols = append(cols, j)
			}
		}
		if len(cols) > m {
			continue
		}
		// augmented system over the chosen columns
		rows := make([][]*big.Rat, m)
		for i := range rows {
			rows[i] = make([]*big.Rat, len(cols)+1)
			for k, j := range cols {
				rows[i][k] = new(big.Rat).Set(lp.A[i][j])
			}
			rows[i][len(cols)] = new(big.Rat).Set(lp.B[i])
		}
		x, ok := solveExact(rows, len(cols))
		if !ok {
			continue
		}
		nonneg := true
		for _, v := range x {
			if v.Sign() < 0 {
				nonneg = false
			}
		}
		if nonneg {
			return true
		}
	}
	return false
}

// solveExact returns a solution of the augmented system (unique when the
// columns are independent), or false if it is inconsistent or the columns
// are dependent.
func solveExact(rows [][]*big.Rat, nc int) ([]*big.Rat, bool) {
	r := 0
	piv := make([]int, 0, nc)
	for c := 0; c < nc; c++ {
		p := -1
		for i := r; i < len(rows); i++ {
			if rows[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			return nil, false
		}
		rows[r], rows[p] = rows[p], rows[r]
		for i := range rows {
			if i == r || rows[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(rows[i][c], rows[r][c])
			for k := c; k <= nc; k++ {
				rows[i][k].Sub(rows[i][k], new(big.Rat).Mul(f, rows[r][k]))
			}
		}
		piv = append(piv, r)
		r++
	}
	for i := r; i < len(rows); i++ {
		if rows[i][nc].Sign() != 0 {
			return nil, false
		}
	}
	x := make([]*big.Rat, nc)
	for c := 0; c < nc; c++ {
		x[c] = new(big.Rat).Quo(rows[piv[c]][nc], rows[piv[c]][c])
	}
	return x, true
}

func FuzzLP(f *testing.F) {
	f.Add([]byte{2, 3, 1, 2, 3, 4, 5, 6, 7, 8, 9, 1, 2, 3})
	f.Add([]byte{1, 2, 6, 6, 3, 0, 0})
	f.Add([]byte{3, 5, 0, 1, 2, 3, 4, 5, 6, 0, 0, 0, 6, 5, 4, 3, 2, 1, 0, 1, 2, 3, 4, 5, 6, 6, 6})
	f.Fuzz(func(t *testing.T, data []byte) {
		r := &byteReader{b: data}
		m := 1 + r.next(3)
		n := 1 + r.next(5)
		lp := &LP{A: make([][]*big.Rat, m), B: make([]*big.Rat, m), C: make([]*big.Rat, n)}
		for i := range lp.A {
			lp.A[i] = make([]*big.Rat, n)
			for j := range lp.A[i] {
				lp.A[i][j] = big.NewRat(int64(r.next(7)-3), 1)
			}
			lp.B[i] = big.NewRat(int64(r.next(9)-4), 1)
		}
		for j := range lp.C {
			lp.C[j] = big.NewRat(int64(r.next(7)-3), int64(1+r.next(2)))
		}
		sol := lp.Solve()
		feasible := bruteFeasible(lp)
		switch sol.Status {
		case Optimal:
			checkOptimal(t, lp, sol)
		case Infeasible:
			if feasible {
				t.Errorf("reported infeasible, but a basic feasible solution exists")
			}
		case Unbounded:
			if !feasible {
				t.Errorf("reported unbounded, but the LP is infeasible")
			}
		}
		if sol.Status != Infeasible && !feasible {
			t.Errorf("status %v for an infeasible LP", sol.Status)
		}
	})
}

// FuzzHull decodes a small point set and checks the facet, lattice, distance
// and face invariants of cross_test.go on it.
func FuzzHull(f *testing.F) {
	f.Add([]byte{2, 3, 2, 0, 1, 1, 0, 2})
	f.Add([]byte{3, 4, 1, 1, 2, 2, 2, 1, 0, 0, 3, 3, 0, 0})
	f.Add([]byte{1, 2, 5, 3})
	f.Fuzz(func(t *testing.T, data []byte) {
		r := &byteReader{b: data}
		d := 1 + r.next(4)
		np := 1 + r.next(8)
		points := make([][]int, np)
		for k := range points {
			points[k] = make([]int, d)
			for i := range points[k] {
				points[k][i] = r.next(6)
			}
		}
		n, err := New(d, points)
		if err != nil {
			t.Fatal(err)
		}
		fs := checkFacets(t, n, points)
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		checkLattice(t, n, fs, lat)
		tau := make([]*big.Rat, d)
		for i := range tau {
			tau[i] = big.NewRat(int64(1+r.next(4)), int64(1+r.next(3)))
		}
		h, err := n.Distance(context.Background(), tau)
		if err != nil {
			t.Fatal(err)
		}
		checkHit(t, n, points, tau, h)
		if want := facetDistance(fs, tau); h.T.Cmp(want) != 0 {
			t.Errorf("t = %v, facets give %v", h.T, want)
		}
		checkFace(t, n, fs, lat, h.Point, h.Face)
		// The same on a fresh polyhedron, whose vertices are not known:
		// the distance over the points, the face's vertices among its own
		// points.
		lazy, err := New(d, points)
		if err != nil {
			t.Fatal(err)
		}
		hl, err := lazy.Distance(context.Background(), tau)
		if err != nil {
			t.Fatal(err)
		}
		if hl.T.Cmp(h.T) != 0 || !hl.Face.Equal(h.Face) || hl.Face.Dim != h.Face.Dim {
			t.Errorf("over the points: t = %v face %v dim %d; over the vertices: t = %v face %v dim %d",
				hl.T, hl.Face.Vertices, hl.Face.Dim, h.T, h.Face.Vertices, h.Face.Dim)
		}
		if ok, err := lazy.Exposes(context.Background(), h.Face); err != nil || !ok {
			t.Errorf("over the points, Exposes(the face hit) = %v, %v", ok, err)
		}
	})
}
