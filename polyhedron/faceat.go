package polyhedron

import (
	"math"
	"math/big"
	"slices"
)

// compactFaceFast tries to decide CompactFaceAt for a point x of P with
// float64 proposals and exact certificates only; decided is false when a
// certificate fails or int64 does not suffice (the caller then uses the
// exact LPs). When decided, face is the compact face holding x in its
// relative interior, or nil (x interior, or its face not compact).
//
// Method: a float ray-shooting LP from x along (1,…,1) gives t0 and a
// supporting normal a. For t0 < 0 its basis, solved exactly in integers,
// must give t < 0 (x + t·1 ∈ P, so x is interior). For t0 = 0 a float
// face LP over the generators tight for a (maximising, round by round, the
// weight of those not yet seen positive) proposes the generators of the
// face. If a ray is among them, an exactly solved basis with a positive
// weight on that ray proves the face is not compact (x ± ε·e_i ∈ P). Else
// the proposed vertex set S is certified by (i) an exact representation of
// x with all weights on S strictly positive (see interiorOfExposed), and
// (ii) an exposing normal: the float normal K·a + a” (a” the dual of the
// last face LP) is rounded inside the integer lattice of normals constant
// on S (free coordinates of an exact echelon form of S − s0, the others
// recomputed exactly), and Exposes must accept it. Then conv(S) is a
// compact face containing x in its relative interior, which is the answer.
func (n *Newton) compactFaceFast(x []*big.Rat) (*Face, bool) {
	d := n.d
	xs, lx, ok := ratsToInt64(x)
	if !ok {
		return nil, false
	}
	xf := make([]float64, d)
	for i := range xf {
		xf[i], _ = x[i].Float64()
	}
	fs, ok := shootFloat(n.vertices, xf, onesFloat(d)) // indices into n.vertices
	if !ok || fs.t > 1e-9 {
		return nil, false
	}
	if fs.t < -1e-9 {
		// Interior: the basis solved exactly must give t < 0.
		var verts []int
		for k := range fs.weights {
			verts = append(verts, n.vertexIdx[k])
		}
		slices.Sort(verts)
		vals, okSolve := n.solveGenerators(verts, fs.slacks, fs.tBasic, xs, lx)
		if !okSolve {
			return nil, false
		}
		for c := 0; c < len(vals)-1; c++ {
			if vals[c] < 0 {
				return nil, false
			}
		}
		if !fs.tBasic || vals[len(vals)-1] >= 0 {
			return nil, false
		}
		return nil, true
	}
	// t0 = 0: generators tight for the float normal.
	top := 0.0
	for _, ai := range fs.a {
		top = max(top, math.Abs(ai))
	}
	if !(top > 0) || math.IsInf(top, 0) {
		return nil, false
	}
	var tight, rays []int
	for _, j := range n.vertexIdx {
		s, norm := -fs.b, math.Abs(fs.b)
		for i, e := range n.points[j] {
			s += fs.a[i] * float64(e)
			norm += math.Abs(fs.a[i] * float64(e))
		}
		if s <= 1e-9*max(norm, 1) {
			tight = append(tight, j)
		}
	}
	for i, ai := range fs.a {
		if ai <= 1e-9*top {
			rays = append(rays, i)
		}
	}
	if len(tight) == 0 {
		return nil, false
	}
	ff, ok := floatFace(n.points, xf, tight, rays)
	if !ok {
		return nil, false
	}
	if ff.rayBasis != nil {
		// A basis with a ray at positive weight: certify it exactly.
		vals, okSolve := n.solveGenerators(ff.rayBasis.verts, ff.rayBasis.rays, false, xs, lx)
		if !okSolve {
			return nil, false
		}
		rayPos := false
		for c, v := range vals {
			if v < 0 {
				return nil, false
			}
			if c >= len(ff.rayBasis.verts) && v > 0 {
				rayPos = true
			}
		}
		if rayPos {
			return nil, true
		}
		return nil, false
	}
	var S []int
	for k, j := range tight {
		if ff.pos[k] {
			S = append(S, j)
		}
	}
	if len(S) == 0 {
		return nil, false
	}
	// (i) x in the relative interior of conv(S).
	if !n.interiorOfExposed(x, S, nil, make([]bool, len(S))) {
		return nil, false
	}
	// (ii) an exposing normal for S.
	face := &Face{Vertices: S, Dim: n.faceDim(S, nil)}
	nf := n.floatExposingNormal(fs.a, fs.b, ff.a2, ff.b2, tight)
	if nf == nil {
		return nil, false
	}
	N := roundNormalOnFace(n, face, nf)
	if N == nil {
		return nil, false
	}
	face.Normal, face.RHS = primitive(N, new(big.Int).Set(newDotter(N).dot(n.points[S[0]])))
	face.RHS = new(big.Int).Set(face.RHS)
	if !n.exposes(face) {
		return nil, false
	}
	n.attachFacets(face)
	return face, true
}

func onesFloat(d int) []float64 {
	out := make([]float64, d)
	for i := range out {
		out[i] = 1
	}
	return out
}

// solveGenerators solves Σ λ_j v_j + Σ_{i in rays} s_i e_i (− t·1 if
// withT) = x, Σ λ_j = 1 exactly over the given generators, with x = xs/lx
// (xs integers), and returns the signs of the unknowns in that order (t
// last), or false if the system is inconsistent or int64 does not suffice.
// The unknowns of dependent columns are set to 0.
func (n *Newton) solveGenerators(verts, rays []int, withT bool, xs []int64, lx int64) ([]int, bool) {
	d := n.d
	m := d + 1
	var cols [][]int64
	for _, j := range verts {
		c := make([]int64, m)
		for i, e := range n.points[j] {
			c[i] = int64(e)
		}
		c[d] = 1
		cols = append(cols, c)
	}
	for _, i := range rays {
		c := make([]int64, m)
		c[i] = 1
		cols = append(cols, c)
	}
	if withT {
		c := make([]int64, m)
		for i := 0; i < d; i++ {
			c[i] = -1
		}
		cols = append(cols, c)
	}
	// Scaled by lx: the unknowns become lx times larger, signs unchanged.
	rhs := make([]int64, m)
	copy(rhs, xs)
	rhs[d] = lx
	num, den, st := solveInt64(cols, rhs)
	if st != solved {
		return nil, false
	}
	signs := make([]int, len(num))
	for c, v := range num {
		switch {
		case v == 0:
		case (v > 0) == (den > 0):
			signs[c] = 1
		default:
			signs[c] = -1
		}
	}
	return signs, true
}

// fFace is the result of floatFace.
type fFace struct {
	pos      []bool    // per generator (tight vertices, then rays): seen positive
	a2       []float64 // dual of the last face LP: a2·g >= b2 on the generators,
	b2       float64   // with equality on the face
	rayBasis *struct{ verts, rays []int }
}

// floatFace runs, in float64, the face LPs of faceFromShot over the tight
// vertices and the rays: x = Σ w_g g (Σ over vertices = 1), maximising round
// by round the total weight of the generators not yet seen positive, until
// that maximum is 0. It records the first basis that gives a ray a positive
// weight.
func floatFace(verts [][]int, xf []float64, tight, rays []int) (fFace, bool) {
	d := len(xf)
	m := d + 1
	nc := len(tight) + len(rays)
	ft := newFTableau(append(slices.Clone(xf), 1))
	col := make([]float64, m)
	for _, j := range tight {
		for i, e := range verts[j] {
			col[i] = float64(e)
		}
		col[d] = 1
		ft.addColumn(col, 0)
	}
	for _, i := range rays {
		clear(col)
		col[i] = 1
		ft.addColumn(col, 0)
	}
	var out fFace
	out.pos = make([]bool, nc)
	if !ft.solve() {
		return out, false
	}
	collect := func() {
		for r, c := range ft.basis {
			if c >= m && ft.rhs[r] > 1e-9 {
				out.pos[c-m] = true
				if c-m >= len(tight) && out.rayBasis == nil {
					rb := &struct{ verts, rays []int }{}
					for _, cc := range ft.basis {
						switch {
						case cc < m:
						case cc-m < len(tight):
							rb.verts = append(rb.verts, tight[cc-m])
						default:
							rb.rays = append(rb.rays, rays[cc-m-len(tight)])
						}
					}
					out.rayBasis = rb
				}
			}
		}
	}
	collect()
	for round := 0; round <= nc; round++ {
		if out.rayBasis != nil {
			return out, true
		}
		any := false
		for c := 0; c < nc; c++ {
			ft.cost[m+c] = 0
			if !out.pos[c] {
				ft.cost[m+c] = -1
				any = true
			}
		}
		for j := range ft.red {
			ft.red[j] = ft.reducedCost(j)
		}
		if any && !ft.iterate() {
			return out, false
		}
		z := 0.0
		for r, c := range ft.basis {
			z += ft.cost[c] * ft.rhs[r]
		}
		if !any || z > -1e-9 {
			y := ft.duals()
			out.a2 = make([]float64, d)
			for i := range out.a2 {
				out.a2[i] = -y[i]
			}
			out.b2 = y[d]
			return out, true
		}
		collect()
	}
	return out, false
}

// floatExposingNormal combines the supporting normal (a, b) (tight on the
// vertices tight) with the face LP dual (a2, b2) into K·a + a2 with K large
// enough, in float64, that it is positive where a is and strictly above
// its value on the face at every vertex outside tight; nil if it fails.
func (n *Newton) floatExposingNormal(a []float64, b float64, a2 []float64, b2 float64, tight []int) []float64 {
	if a2 == nil {
		return a
	}
	K := 1.0
	for i := range a {
		if a[i] > 0 && a2[i] < 0 {
			K = max(K, -a2[i]/a[i])
		}
	}
	isTight := make([]bool, len(n.points))
	for _, j := range tight {
		isTight[j] = true
	}
	for _, j := range n.vertexIdx {
		if isTight[j] {
			continue
		}
		v := n.points[j]
		av, cv := -b, b2
		for i, e := range v {
			av += a[i] * float64(e)
			cv -= a2[i] * float64(e)
		}
		if av <= 0 {
			return nil
		}
		if cv > 0 {
			K = max(K, cv/av)
		}
	}
	K = 2*K + 1
	out := make([]float64, len(a))
	for i := range out {
		out[i] = K*a[i] + a2[i]
	}
	return out
}

// roundNormalOnFace rounds a float normal to an integer normal that is
// exactly constant on the vertices of f: with the exact integer map M of
// newQuotient (kernel the span of f − f_0), N = Mᵀh where h is the rounded
// free-coordinate part of nf (Mᵀ is D on the free coordinates, so h ≈
// nf_free/D up to scale). nil if int64 does not suffice.
func roundNormalOnFace(n *Newton, f *Face, nf []float64) []*big.Int {
	q := newQuotient(n, f)
	if q == nil {
		return nil
	}
	top := 0.0
	for _, i := range q.free {
		top = max(top, math.Abs(nf[i]))
	}
	if !(top > 0) || math.IsInf(top, 0) || math.IsNaN(top) {
		return nil
	}
	h := make([]int64, len(q.free))
	for t, i := range q.free {
		h[t] = int64(math.Round(nf[i] / top * certScale))
	}
	return q.transpose(h)
}
