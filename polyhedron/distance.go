package polyhedron

import (
	"fmt"
	"math/big"
	"slices"
)

// Hit is the result of Distance: the Newton distance t_τ along τ together
// with a certificate that can be checked on its own with exact arithmetic
// (see Check).
type Hit struct {
	T       *big.Rat   // t_τ
	Point   []*big.Rat // t_τ·τ
	Weights []*big.Rat // convex weights on Vertices() (len = #vertices, >= 0, sum 1) ...
	Slack   []*big.Rat // ... and orthant part >= 0 with Point = Σ Weights[j]·Vertices()[j] + Slack
	Normal  []*big.Rat // supporting hyperplane Normal·x >= RHS with Normal >= 0, Normal·Point == RHS,
	RHS     *big.Rat   //   and Normal·v >= RHS for every input point v
	Face    *Face      // the face of P holding Point in its relative interior
}

// Face is a face of P = conv(Vertices()) + R^d_{>=0}.
type Face struct {
	Vertices []int // indices into Vertices() of the vertices of the face, ascending
	Rays     []int // coordinates i such that e_i is in the face's recession cone, ascending
	Dim      int   // dimension of the face
	// Normal a >= 0 (primitive integer) and RHS b with a·x >= b on P and
	// face = P ∩ {a·x = b}. Normal is strictly positive in every coordinate
	// iff the face is compact.
	Normal []*big.Int
	RHS    *big.Int
	// Facets holds the indices into Facets() of the facets containing the
	// face. It is set by CompactFaces and, for the other methods, only when
	// the facets had already been enumerated; otherwise it is nil.
	Facets []int
}

// Compact reports whether the face is bounded (it contains no ray).
func (f *Face) Compact() bool { return len(f.Rays) == 0 }

// Codim returns the codimension d − Dim of the face in R^d.
func (f *Face) Codim(d int) int { return d - f.Dim }

// Distance returns t_τ = min{t : t·τ ∈ P} for a direction τ of d positive
// rationals, with an exact certificate and the face of P that holds t_τ·τ in
// its relative interior. It returns an error wrapping ErrDirection for a bad
// τ.
//
// Method: t_τ is the optimum of the ray-shooting LP
//
//	minimise t  subject to  Σ_j λ_j v_j + s = t·τ,  Σ_j λ_j = 1,  λ, s >= 0
//
// over the vertices v_j; it is solved by column generation with an exact
// simplex master (see LP) and exact integer pricing of every vertex, so the
// optimal dual (a, b) with a >= 0, a·τ = 1, a·v >= b for all vertices is the
// certificate Normal, RHS. The face is then found without enumerating facets
// (see FaceAt). Cost: a few small exact LPs with d+1 rows plus O(N·d) integer
// work per pricing round for N vertices.
func (n *Newton) Distance(tau []*big.Rat) (*Hit, error) {
	if len(tau) != n.d {
		return nil, fmt.Errorf("%w: got %d entries, want %d", ErrDirection, len(tau), n.d)
	}
	for i, x := range tau {
		if x == nil || x.Sign() <= 0 {
			return nil, fmt.Errorf("%w: entry %d is %v", ErrDirection, i, x)
		}
	}
	x0 := make([]*big.Rat, n.d)
	for i := range x0 {
		x0[i] = new(big.Rat)
	}
	s := shoot(n.vertices, x0, tau)
	h := &Hit{T: s.t, Slack: s.slack, Normal: s.a, RHS: s.b}
	h.Point = make([]*big.Rat, n.d)
	for i := range h.Point {
		h.Point[i] = new(big.Rat).Mul(s.t, tau[i])
	}
	h.Weights = make([]*big.Rat, len(n.vertices))
	for j := range h.Weights {
		if w, ok := s.weights[j]; ok {
			h.Weights[j] = w
		} else {
			h.Weights[j] = new(big.Rat)
		}
	}
	f, err := n.faceFromShot(h.Point, s)
	if err != nil {
		return nil, err
	}
	h.Face = f
	return h, nil
}

// FaceAt returns the face of P that holds the boundary point x in its
// relative interior, or an error wrapping ErrNotBoundary if x is in the
// interior of P or outside P (or ErrDimension if len(x) != d).
//
// Method: the ray-shooting LP from x along (1,…,1) gives t0 = min{t : x +
// t·1 ∈ P}, and x is on the boundary exactly when t0 = 0 (for an interior x,
// t0 < 0; outside P, t0 > 0). Its optimal dual (a, b) is a supporting
// hyperplane at x; the face sought lies in P ∩ {a·y = b}, whose generators
// are the vertices with a·v = b and the rays e_i with a_i = 0. Among those,
// a generator belongs to the face holding x in its relative interior iff it
// has a positive coefficient in some representation of x (common practice:
// the generators of the minimal face are exactly the ones used by some
// representation). These are found by repeated exact LPs, each maximising
// the total weight of the generators not yet seen positive, until the
// maximum is 0 (at most one LP per new generator, usually one or two). The
// dimension is the affine rank of the vertices plus rays, and the normal is
// an exposing inequality found by an exact LP with lazily added vertex
// constraints.
func (n *Newton) FaceAt(x []*big.Rat) (*Face, error) {
	if len(x) != n.d {
		return nil, fmt.Errorf("%w: point has %d coordinates, want %d", ErrDimension, len(x), n.d)
	}
	tau := make([]*big.Rat, n.d)
	for i := range tau {
		tau[i] = big.NewRat(1, 1)
	}
	s := shoot(n.vertices, x, tau)
	switch s.t.Sign() {
	case -1:
		return nil, fmt.Errorf("%w: it is in the interior of P", ErrNotBoundary)
	case 1:
		return nil, fmt.Errorf("%w: it is outside P", ErrNotBoundary)
	}
	return n.faceFromShot(x, s)
}

// faceFromShot computes the face holding x in its relative interior, given
// an optimal ray-shooting solution whose hit point is x.
func (n *Newton) faceFromShot(x []*big.Rat, s *shot) (*Face, error) {
	d := n.d
	// Candidate generators: tight vertices and rays with a_i = 0.
	var rays []int
	for i, ai := range s.a {
		if ai.Sign() == 0 {
			rays = append(rays, i)
		}
	}
	verts := s.tight
	// Known positive generators from the optimal solution.
	inV := make([]bool, len(verts))
	inR := make([]bool, len(rays))
	for k, j := range verts {
		if w, ok := s.weights[j]; ok && w.Sign() > 0 {
			inV[k] = true
		}
	}
	for k, i := range rays {
		if s.slack[i].Sign() > 0 {
			inR[k] = true
		}
	}
	// LP over representations: columns = tight vertices then tight rays.
	nc := len(verts) + len(rays)
	lp := &LP{A: make([][]*big.Rat, d+1), B: make([]*big.Rat, d+1), C: make([]*big.Rat, nc)}
	for i := 0; i <= d; i++ {
		lp.A[i] = make([]*big.Rat, nc)
		if i < d {
			lp.B[i] = x[i]
		} else {
			lp.B[i] = big.NewRat(1, 1)
		}
	}
	for k, j := range verts {
		for i := 0; i < d; i++ {
			lp.A[i][k] = new(big.Rat).SetInt64(int64(n.vertices[j][i]))
		}
		lp.A[d][k] = new(big.Rat)
		lp.A[d][k].SetInt64(1)
	}
	for k, r := range rays {
		c := len(verts) + k
		for i := 0; i <= d; i++ {
			lp.A[i][c] = new(big.Rat)
		}
		lp.A[r][c].SetInt64(1)
	}
	for {
		any := false
		for c := 0; c < nc; c++ {
			var known bool
			if c < len(verts) {
				known = inV[c]
			} else {
				known = inR[c-len(verts)]
			}
			if known {
				lp.C[c] = new(big.Rat)
			} else {
				lp.C[c] = big.NewRat(-1, 1)
				any = true
			}
		}
		if !any {
			break
		}
		sol := lp.Solve()
		if sol.Status != Optimal {
			panic("polyhedron: internal error: face LP " + sol.Status.String())
		}
		if sol.Value.Sign() == 0 {
			break
		}
		for c := 0; c < nc; c++ {
			if sol.X[c].Sign() > 0 {
				if c < len(verts) {
					inV[c] = true
				} else {
					inR[c-len(verts)] = true
				}
			}
		}
	}
	f := &Face{}
	for k, j := range verts {
		if inV[k] {
			f.Vertices = append(f.Vertices, j)
		}
	}
	for k, i := range rays {
		if inR[k] {
			f.Rays = append(f.Rays, i)
		}
	}
	f.Dim = n.faceDim(f.Vertices, f.Rays)
	f.Normal, f.RHS = n.exposingNormal(f.Vertices, f.Rays)
	n.attachFacets(f)
	return f, nil
}

// faceDim returns the dimension of conv(vertices) + cone(e_i : i in rays):
// the rank of {v − v_0} ∪ {e_i}.
func (n *Newton) faceDim(verts, rays []int) int {
	if len(verts) == 0 {
		return -1
	}
	var rows [][]int64
	v0 := n.vertices[verts[0]]
	for _, j := range verts[1:] {
		r := make([]int64, n.d)
		for i := range r {
			r[i] = int64(n.vertices[j][i]) - int64(v0[i])
		}
		rows = append(rows, r)
	}
	for _, i := range rays {
		r := make([]int64, n.d)
		r[i] = 1
		rows = append(rows, r)
	}
	return rankInt(rows, n.d)
}

// exposingNormal finds a primitive a >= 0 and b with a·v = b on the given
// vertices, a·v > b on the other vertices, a_i = 0 exactly for i in rays. It
// solves the exact LP
//
//	minimise Σ a_i  s.t.  a·v − b = 0 (v in face),  a·v − b >= 1 (v not in face),
//	                      a_i = 0 (i in rays),  a_i >= 1 (i not in rays),
//
// adding the constraints of vertices outside the face only when violated
// (cutting planes, checked over all vertices in exact integer arithmetic).
func (n *Newton) exposingNormal(verts, rays []int) ([]*big.Int, *big.Int) {
	d := n.d
	inFace := make(map[int]bool, len(verts))
	for _, j := range verts {
		inFace[j] = true
	}
	isRay := make([]bool, d)
	for _, i := range rays {
		isRay[i] = true
	}
	var cuts []int // vertices outside the face whose constraint is present
	for {
		// Variables: a_0..a_{d-1}, b⁺, b⁻, then one surplus per inequality
		// (cuts, then coordinates not in rays). Rows: face vertices, cuts,
		// coordinate bounds, ray equalities.
		var free []int
		for i := 0; i < d; i++ {
			if !isRay[i] {
				free = append(free, i)
			}
		}
		nv := d + 2 + len(cuts) + len(free)
		var A [][]*big.Rat
		var B []*big.Rat
		row := func() []*big.Rat {
			r := make([]*big.Rat, nv)
			for k := range r {
				r[k] = new(big.Rat)
			}
			return r
		}
		addVertexRow := func(j int, rhs int64, surplus int) {
			r := row()
			for i := 0; i < d; i++ {
				r[i].SetInt64(int64(n.vertices[j][i]))
			}
			r[d].SetInt64(-1)
			r[d+1].SetInt64(1)
			if surplus >= 0 {
				r[surplus].SetInt64(-1)
			}
			A = append(A, r)
			B = append(B, big.NewRat(rhs, 1))
		}
		for _, j := range verts {
			addVertexRow(j, 0, -1)
		}
		for k, j := range cuts {
			addVertexRow(j, 1, d+2+k)
		}
		for k, i := range free {
			r := row()
			r[i].SetInt64(1)
			r[d+2+len(cuts)+k].SetInt64(-1)
			A = append(A, r)
			B = append(B, big.NewRat(1, 1))
		}
		for _, i := range rays {
			r := row()
			r[i].SetInt64(1)
			A = append(A, r)
			B = append(B, new(big.Rat))
		}
		C := make([]*big.Rat, nv)
		for k := range C {
			C[k] = new(big.Rat)
			if k < d {
				C[k].SetInt64(1)
			}
		}
		sol := (&LP{A: A, B: B, C: C}).Solve()
		if sol.Status != Optimal {
			panic("polyhedron: internal error: exposing-normal LP " + sol.Status.String())
		}
		a := sol.X[:d]
		b := new(big.Rat).Sub(sol.X[d], sol.X[d+1])
		ai, bi := scaleToInts(a, b)
		// Check all vertices: a·v − b >= 1 scaled, i.e. a·v > b suffices for
		// exposure, but we demand the LP's constraint to keep it bounded.
		// Any vertex with a·v <= b outside the face is violated.
		var worst []int
		var acc, prod big.Int
		for j, v := range n.vertices {
			if inFace[j] {
				continue
			}
			acc.SetInt64(0)
			for i, x := range v {
				if x != 0 {
					prod.Mul(ai[i], prod.SetInt64(int64(x)))
					acc.Add(&acc, &prod)
				}
			}
			if acc.Cmp(bi) <= 0 {
				worst = append(worst, j)
				if len(worst) >= 2*(d+1) {
					break
				}
			}
		}
		if len(worst) == 0 {
			return primitive(ai, bi)
		}
		cuts = append(cuts, worst...)
		slices.Sort(cuts)
	}
}

// primitive divides (a, b) by the gcd of the entries of a (which must divide
// b: b = a·v for an integer point v).
func primitive(a []*big.Int, b *big.Int) ([]*big.Int, *big.Int) {
	g := new(big.Int)
	for _, x := range a {
		g.GCD(nil, nil, g, new(big.Int).Abs(x))
	}
	if g.Sign() == 0 || g.Cmp(big.NewInt(1)) == 0 {
		return a, b
	}
	out := make([]*big.Int, len(a))
	for i, x := range a {
		out[i] = new(big.Int).Quo(x, g)
	}
	return out, new(big.Int).Quo(b, g)
}
