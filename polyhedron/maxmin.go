package polyhedron

import (
	"context"
	"fmt"
	"math/big"
	"slices"
)

// NormalConeMaxMin maximises, over the normalised normal cone of the face f
// (the y >= 0 with y·τ = 1, y·v >= y·x for every vertex v of P and every
// point x of f, and y_i = 0 for every ray i of f; see NormalConeMin), the
// least of the values y·p over the points p of pts. It returns the exact
// optimum and an optimal y. It is the test that a set of points lies above
// f for one common supporting functional: the value exceeds y·x on f
// (for the face hit by Distance along τ, the distance t_τ) exactly when
// some y of the cone puts every point of pts strictly above f; then so does
// a y in the relative interior of the cone, which exposes f exactly.
//
// τ must be d positive rationals (else an error wrapping ErrDirection);
// pts must be nonempty with points of length d (else ErrDimension). It
// returns an error wrapping ErrFace when f is not a face of P or is P
// itself, and one wrapping ctx.Err() when ctx (which may be nil) is done
// before the LP.
//
// Method: one exact LP (see LP) in the variables y (coordinates outside
// f.Rays) and s = s⁺ − s⁻: maximise s subject to y·τ = 1, y·(w − w0) = 0
// for the vertices w of f (w0 its first vertex), y·(v − w0) >= 0 for the
// other vertices v of P, and y·p >= s for p in pts. Cost: a dense exact
// tableau with about V + |pts| rows for V vertices; meant for the
// remainder sets of truncated series (tens to hundreds of points) on
// polyhedra of moderate size.
func (n *Newton) NormalConeMaxMin(ctx context.Context, f *Face, tau []*big.Rat, pts [][]int) (*big.Rat, []*big.Rat, error) {
	d := n.d
	if len(tau) != d {
		return nil, nil, fmt.Errorf("%w: got %d entries, want %d", ErrDirection, len(tau), d)
	}
	for i, x := range tau {
		if x == nil || x.Sign() <= 0 {
			return nil, nil, fmt.Errorf("%w: entry %d is %v", ErrDirection, i, x)
		}
	}
	if len(pts) == 0 {
		return nil, nil, fmt.Errorf("%w: no points to separate", ErrDimension)
	}
	for k, p := range pts {
		if len(p) != d {
			return nil, nil, fmt.Errorf("%w: point %d has %d coordinates, want %d", ErrDimension, k, len(p), d)
		}
	}
	if _, _, err := n.checkFace(ctx, f); err != nil {
		return nil, nil, err
	}
	if err := contextErr(ctx); err != nil {
		return nil, nil, err
	}
	var cols []int // the coordinates of y that may be nonzero
	for i := 0; i < d; i++ {
		if !slices.Contains(f.Rays, i) {
			cols = append(cols, i)
		}
	}
	if len(cols) == 0 {
		return nil, nil, fmt.Errorf("%w: the face is P itself, whose normal cone is {0}", ErrFace)
	}
	inF := make(map[int]bool, len(f.Vertices))
	for _, j := range f.Vertices {
		inF[j] = true
	}
	w0 := n.points[f.Vertices[0]]
	var others []int
	for _, j := range n.vertexIdx {
		if !inF[j] {
			others = append(others, j)
		}
	}
	// Columns: y (len(cols)), s⁺, s⁻, one slack per vertex outside f, one
	// per point of pts.
	ny := len(cols)
	sPlus, sMinus := ny, ny+1
	nCols := ny + 2 + len(others) + len(pts)
	zero := new(big.Rat)
	var A [][]*big.Rat
	var B []*big.Rat
	row := func() []*big.Rat {
		r := make([]*big.Rat, nCols)
		for k := range r {
			r[k] = zero
		}
		return r
	}
	diff := func(r []*big.Rat, p, q []int) {
		for k, i := range cols {
			if x := p[i] - q[i]; x != 0 {
				r[k] = new(big.Rat).SetInt64(int64(x))
			}
		}
	}
	r := row()
	for k, i := range cols {
		r[k] = tau[i]
	}
	A, B = append(A, r), append(B, ratOne)
	for _, j := range f.Vertices[1:] {
		r := row()
		diff(r, n.points[j], w0)
		A, B = append(A, r), append(B, zero)
	}
	minusOne := big.NewRat(-1, 1)
	for k, j := range others {
		r := row()
		diff(r, n.points[j], w0)
		r[ny+2+k] = minusOne
		A, B = append(A, r), append(B, zero)
	}
	origin := make([]int, d)
	for k, p := range pts {
		r := row()
		diff(r, p, origin)
		r[sPlus], r[sMinus] = minusOne, ratOne
		r[ny+2+len(others)+k] = minusOne
		A, B = append(A, r), append(B, zero)
	}
	C := make([]*big.Rat, nCols)
	for k := range C {
		C[k] = zero
	}
	C[sPlus], C[sMinus] = minusOne, ratOne
	sol := (&LP{A: A, B: B, C: C}).Solve()
	if sol.Status != Optimal {
		// Feasible (the cone of a face other than P is not {0}) and
		// bounded (y·τ = 1 with τ > 0 bounds y, hence s).
		return nil, nil, fmt.Errorf("%w: normal cone LP %v", ErrFace, sol.Status)
	}
	y := make([]*big.Rat, d)
	for i := range y {
		y[i] = new(big.Rat)
	}
	for k, i := range cols {
		y[i].Set(sol.X[k])
	}
	return new(big.Rat).Neg(sol.Value), y, nil
}
