package polyhedron

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"slices"
)

// Hit is the result of Distance: the Newton distance t_τ along τ together
// with a certificate that can be checked on its own with exact arithmetic
// (see Check).
type Hit struct {
	T       *big.Rat         // t_τ
	Point   []*big.Rat       // t_τ·τ
	Weights map[int]*big.Rat // positive convex weights (sum 1) keyed by index into Points() ...
	Slack   []*big.Rat       // ... and orthant part >= 0 with Point = Σ Weights[j]·Points()[j] + Slack
	Normal  []*big.Rat       // supporting hyperplane Normal·x >= RHS with Normal >= 0, Normal·Point == RHS,
	RHS     *big.Rat         //   and Normal·v >= RHS for every input point v
	Face    *Face            // the face of P holding Point in its relative interior

	pivots int // exact simplex pivots (for benchmarks)
}

// Face is a face of P = conv(A) + R^d_{>=0}.
type Face struct {
	Vertices []int // indices into Points() of the vertices of the face (vertices of P), ascending
	Rays     []int // coordinates i such that e_i is in the face's recession cone, ascending
	Dim      int   // dimension of the face
	// Normal a >= 0 (primitive integer) and RHS b with a·x >= b on P and
	// face = P ∩ {a·x = b}. Normal is strictly positive in every coordinate
	// iff the face is compact. Any such a lies in the relative interior of
	// the face's normal cone; it is unique (up to scale) only for facets.
	// CompactFaces uses the sum of the facet normals, Distance, FaceAt and
	// CompactFaceAt a normal built from LP duals, Covers one built from a
	// separating vector, so compare faces by Vertices and Rays (Equal).
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
// τ, and one wrapping ctx.Err() when ctx is done while the face's vertices
// are computed (the only step whose cost is not a few small LPs).
//
// Method: t_τ is the optimum of the ray-shooting LP
//
//	minimise t  subject to  Σ_j λ_j v_j + s = t·τ,  Σ_j λ_j = 1,  λ, s >= 0
//
// over the input points v_j (points that are not vertices change nothing);
// it is solved by column generation with an exact simplex master (see LP)
// and exact integer pricing of every point, so the optimal dual (a, b) with
// a >= 0, a·τ = 1, a·v >= b for all points is the certificate Normal, RHS.
// The face is then found without enumerating facets (see FaceAt). Cost: a
// few small exact LPs with d+1 rows plus O(N·d) integer work per pricing
// round for N points, plus the vertices of the face hit (see FaceAt).
func (n *Newton) Distance(ctx context.Context, tau []*big.Rat) (*Hit, error) {
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
	s := n.shoot(x0, tau)
	h := &Hit{T: s.t, Slack: s.slack, Normal: s.a, RHS: s.b, pivots: s.pivots}
	h.Point = make([]*big.Rat, n.d)
	for i := range h.Point {
		h.Point[i] = new(big.Rat).Mul(s.t, tau[i])
	}
	h.Weights = s.weights
	f, err := n.faceFromShot(ctx, h.Point, s)
	if err != nil {
		return nil, err
	}
	h.Face = f
	return h, nil
}

// FaceAt returns the face of P that holds the boundary point x in its
// relative interior, or an error wrapping ErrNotBoundary if x is in the
// interior of P or outside P (or ErrDimension if len(x) != d, or one
// wrapping ctx.Err() as for Distance).
//
// Method: the ray-shooting LP from x along (1,…,1) gives t0 = min{t : x +
// t·1 ∈ P}, and x is on the boundary exactly when t0 = 0 (for an interior x,
// t0 < 0; outside P, t0 > 0). Its optimal dual (a, b) is a supporting
// hyperplane at x; the face sought lies in P ∩ {a·y = b}, whose generators
// are the vertices with a·v = b and the rays e_i with a_i = 0: the vertices
// of the Newton polyhedron of the points with a·v = b, which are found by
// the vertex filter (see Vertices) on those points alone, or read off the
// cached vertices when they are known. Among those,
// a generator belongs to the face holding x in its relative interior iff it
// has a positive coefficient in some representation of x (common practice:
// the generators of the minimal face are exactly the ones used by some
// representation). First, a float64 search proposes strictly positive
// weights on all of them; if an exact representation with all weights
// positive is then verified, the face is P ∩ {a·y = b} itself. Otherwise
// exact LPs on one tableau, each maximising the total weight of the
// generators not yet seen positive, run until that maximum is 0; the dual of
// the last one separates the remaining generators and gives, combined with
// (a, b), an exposing normal (see faceFromShot). The dimension is the exact
// affine rank of the vertices plus rays.
func (n *Newton) FaceAt(ctx context.Context, x []*big.Rat) (*Face, error) {
	if len(x) != n.d {
		return nil, fmt.Errorf("%w: point has %d coordinates, want %d", ErrDimension, len(x), n.d)
	}
	tau := make([]*big.Rat, n.d)
	for i := range tau {
		tau[i] = big.NewRat(1, 1)
	}
	s := n.shoot(x, tau)
	switch s.t.Sign() {
	case -1:
		return nil, fmt.Errorf("%w: it is in the interior of P", ErrNotBoundary)
	case 1:
		return nil, fmt.Errorf("%w: it is outside P", ErrNotBoundary)
	}
	return n.faceFromShot(ctx, x, s)
}

// faceFromShot computes the face holding x in its relative interior, given
// an optimal ray-shooting solution whose hit point is x.
//
// The optimal dual (a, b) exposes a face F_a ⊇ F whose generators T are the
// tight vertices (see tightVertices) and the rays e_i with a_i = 0. One exact tableau over T
// (rows: x = Σ w_g g, Σ_v w_v = 1) is reused with changing objectives: each
// round maximises the total weight of the generators not yet seen positive
// (U). When that maximum is 0, F is the set of generators seen positive, and
// the optimal dual of that round is (a”, b”) with a”·x = b”, a”·g >= b”
// on F and a”·g >= b” + 1 on U (a”_i >= 0 resp. >= 1 for rays); it is
// tight on F. The face normal is K·a + a” with the least integer K >= 1
// that makes it positive where a is and strict on every vertex outside
// F_a, which exposes exactly F.
func (n *Newton) faceFromShot(ctx context.Context, x []*big.Rat, s *shot) (*Face, error) {
	d := n.d
	var rays []int
	for i, ai := range s.a {
		if ai.Sign() == 0 {
			rays = append(rays, i)
		}
	}
	verts, err := n.tightVertices(ctx, s.tight)
	if err != nil {
		return nil, err
	}
	nc := len(verts) + len(rays)
	known := make([]bool, nc)
	for k, j := range verts {
		if w, ok := s.weights[j]; ok && w.Sign() > 0 {
			known[k] = true
		}
	}
	for k, i := range rays {
		if s.slack[i].Sign() > 0 {
			known[len(verts)+k] = true
		}
	}
	if n.interiorOfExposed(x, verts, rays, known) {
		// x is in the relative interior of F_a itself.
		f := &Face{Vertices: slices.Clone(verts), Rays: rays}
		f.Dim = n.faceDim(f.Vertices, f.Rays)
		f.Normal, f.RHS = primitive(scaleToInts(s.a, s.b))
		n.attachFacets(f)
		return f, nil
	}
	rhs := make([]*big.Rat, d+1)
	copy(rhs, x)
	rhs[d] = big.NewRat(1, 1)
	t := newTableau(rhs)
	col := make([]*big.Rat, d+1)
	zero := new(big.Rat)
	for _, j := range verts {
		for i := 0; i < d; i++ {
			col[i] = new(big.Rat).SetInt64(int64(n.points[j][i]))
		}
		col[d] = ratOne
		t.addColumn(col, zero)
	}
	for _, r := range rays {
		for i := range col {
			col[i] = zero
		}
		col[r] = ratOne
		t.addColumn(col, zero)
	}
	if st := t.solve(); st != Optimal {
		panic("polyhedron: internal error: hit point has no representation: " + st.String())
	}
	m := d + 1
	var a2 []*big.Rat // a'' (nil means 0)
	var b2 *big.Rat
	minusOne := big.NewRat(-1, 1)
	for {
		any := false
		for c := 0; c < nc; c++ {
			if known[c] {
				t.cost[m+c] = zero
			} else {
				t.cost[m+c] = minusOne
				any = true
			}
		}
		if !any {
			break
		}
		t.setPhase2()
		if st := t.iterate(); st != Optimal {
			panic("polyhedron: internal error: face LP " + st.String())
		}
		if t.z.Sign() == 0 {
			y := t.duals()
			a2 = make([]*big.Rat, d)
			for i := range a2 {
				a2[i] = new(big.Rat).Neg(y[i])
			}
			b2 = y[d]
			break
		}
		for r, c := range t.basis {
			if c >= m && t.rhs[r].Sign() > 0 {
				known[c-m] = true
			}
		}
	}
	f := &Face{}
	for k, j := range verts {
		if known[k] {
			f.Vertices = append(f.Vertices, j)
		}
	}
	for k, i := range rays {
		if known[len(verts)+k] {
			f.Rays = append(f.Rays, i)
		}
	}
	f.Dim = n.faceDim(f.Vertices, f.Rays)
	f.Normal, f.RHS = n.combineNormals(s.a, s.b, a2, b2, s.tight)
	n.attachFacets(f)
	return f, nil
}

// tightVertices returns the vertices of P among the points tight (indices
// into Points(), ascending): all points on one face F_a of P. A point of F_a
// is a vertex of P iff it is a vertex of conv(tight) + R^d_{>=0}: that set
// lies in P, and a point of the face that is the midpoint of two points of
// P has both in F_a ⊆ conv(tight) + R^d_{>=0}. So the vertex filter runs
// on the tight points only; when the vertices of P are already known they
// are simply looked up.
func (n *Newton) tightVertices(ctx context.Context, tight []int) ([]int, error) {
	if n.vertsDone.Load() {
		var out []int
		for _, j := range tight {
			if n.isVertex[j] {
				out = append(out, j)
			}
		}
		return out, nil
	}
	if len(tight) == 1 {
		return slices.Clone(tight), nil
	}
	pts := make([][]int, len(tight))
	for k, j := range tight {
		pts[k] = n.points[j]
	}
	minimal := paretoMinimal(n.d, pts)
	verts, err := vertexFilter(ctx, n.d, minimal, nil)
	if err != nil {
		return nil, err
	}
	out := make([]int, len(verts))
	for k, v := range verts {
		out[k] = n.pointIndex(v)
	}
	slices.Sort(out)
	return out, nil
}

// faceDim returns the dimension of conv(vertices) + cone(e_i : i in rays):
// the rank of {v − v_0} ∪ {e_i}.
func (n *Newton) faceDim(verts, rays []int) int {
	if len(verts) == 0 {
		return -1
	}
	var rows [][]int64
	v0 := n.points[verts[0]]
	for _, j := range verts[1:] {
		r := make([]int64, n.d)
		for i := range r {
			r[i] = int64(n.points[j][i]) - int64(v0[i])
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

// combineNormals returns the primitive form of K·(a, b) + (a2, b2) for the
// least integer K >= 1 such that the result is > 0 wherever a is and
// strictly above its right-hand side on every point not in tight (the
// points with a·v == b). a2 == nil stands for 0.
func (n *Newton) combineNormals(a []*big.Rat, b *big.Rat, a2 []*big.Rat, b2 *big.Rat, tight []int) ([]*big.Int, *big.Int) {
	ai, bi := scaleToInts(a, b)
	if a2 == nil {
		return primitive(ai, bi)
	}
	ci, di := scaleToInts(a2, b2)
	// K > −c_i/a_i for a_i > 0, and K > (d − c·v)/(a·v − b) for vertices off F_a.
	best := new(big.Rat) // K must exceed best
	q := new(big.Rat)
	for i := range ai {
		if ai[i].Sign() > 0 && ci[i].Sign() < 0 {
			q.SetFrac(new(big.Int).Neg(ci[i]), ai[i])
			if q.Cmp(best) > 0 {
				best.Set(q)
			}
		}
	}
	isTight := make(map[int]bool, len(tight))
	for _, j := range tight {
		isTight[j] = true
	}
	av, cv := newDotter(ai), newDotter(ci)
	num, den := new(big.Int), new(big.Int)
	// Over the vertices when they are known, else over all points (the
	// bound for a point that is no vertex is implied; checking it costs
	// only time).
	check := func(v []int) {
		den.Sub(av.dot(v), bi)
		num.Sub(di, cv.dot(v))
		if num.Sign() <= 0 || den.Sign() <= 0 {
			// den == 0 only for a point of F_a missing from tight, which
			// is a combination of F_a's generators, where a2 >= b2 holds.
			return
		}
		q.SetFrac(num, den)
		if q.Cmp(best) > 0 {
			best.Set(q)
		}
	}
	if n.vertsDone.Load() {
		for _, j := range n.vertexIdx {
			if !isTight[j] {
				check(n.points[j])
			}
		}
	} else {
		for j, v := range n.points {
			if !isTight[j] {
				check(v)
			}
		}
	}
	k := new(big.Int).Quo(best.Num(), best.Denom()) // floor (best >= 0)
	k.Add(k, big.NewInt(1))
	out := make([]*big.Int, len(ai))
	for i := range out {
		out[i] = new(big.Int).Mul(k, ai[i])
		out[i].Add(out[i], ci[i])
	}
	rhs := new(big.Int).Mul(k, bi)
	rhs.Add(rhs, di)
	return primitive(out, rhs)
}

// dotter evaluates an integer vector on points, in int64 when it fits.
type dotter struct {
	big   []*big.Int
	small []int64
	fits  bool
	acc   big.Int
	prod  big.Int
}

func newDotter(a []*big.Int) *dotter {
	dt := &dotter{big: a, small: make([]int64, len(a)), fits: true}
	for i, x := range a {
		if !x.IsInt64() {
			dt.fits = false
			break
		}
		dt.small[i] = x.Int64()
	}
	return dt
}

// dot returns a·v; the result is only valid until the next call.
func (dt *dotter) dot(v []int) *big.Int {
	if dt.fits {
		if s, ok := checkedDot(dt.small, v); ok {
			return dt.acc.SetInt64(s)
		}
	}
	dt.acc.SetInt64(0)
	for i, x := range v {
		if x != 0 {
			dt.prod.Mul(dt.big[i], dt.prod.SetInt64(int64(x)))
			dt.acc.Add(&dt.acc, &dt.prod)
		}
	}
	return &dt.acc
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

// interiorOfExposed reports whether x provably lies in the relative
// interior of the face generated by the vertices verts and rays e_i (i in
// rays), i.e. has a representation x = Σ w_v v + Σ w_i e_i, Σ w_v = 1, with
// every weight strictly positive. A float64 search (maximising, round by
// round, the weight of generators not yet seen positive) proposes averaged
// positive weights; they are rounded, a basis of the generators is solved
// exactly for the remaining weights, and the representation is accepted
// only if it is exact and strictly positive. false means "not shown" (the
// caller then uses the exact method).
func (n *Newton) interiorOfExposed(x []*big.Rat, verts, rays []int, known []bool) bool {
	d := n.d
	m := d + 1
	nc := len(verts) + len(rays)
	if !slices.Contains(known, false) {
		return true // the exact optimal solution already uses every generator
	}
	col := func(c int) []int64 {
		v := make([]int64, m)
		if c < len(verts) {
			for i, e := range n.points[verts[c]] {
				v[i] = int64(e)
			}
			v[d] = 1
		} else {
			v[rays[c-len(verts)]] = 1
		}
		return v
	}
	cols := make([][]int64, nc)
	for c := range cols {
		cols[c] = col(c)
	}
	xf := make([]float64, m)
	for i := 0; i < d; i++ {
		xf[i], _ = x[i].Float64()
	}
	xf[d] = 1
	ft := newFTableau(xf)
	fc := make([]float64, m)
	for _, v := range cols {
		for i := range fc {
			fc[i] = float64(v[i])
		}
		ft.addColumn(fc, 0)
	}
	if !ft.solve() {
		return false
	}
	pos := make([]bool, nc)
	sum := make([]float64, nc)
	count := 0
	collect := func() {
		count++
		for r, c := range ft.basis {
			if c >= m && ft.rhs[r] > 1e-9 {
				pos[c-m] = true
				sum[c-m] += ft.rhs[r]
			}
		}
	}
	collect()
	for round := 0; round <= nc && slices.Contains(pos, false); round++ {
		for c := 0; c < nc; c++ {
			ft.cost[m+c] = 0
			if !pos[c] {
				ft.cost[m+c] = -1
			}
		}
		for j := range ft.red {
			ft.red[j] = ft.reducedCost(j)
		}
		if !ft.iterate() {
			return false
		}
		z := 0.0
		for r, c := range ft.basis {
			z += ft.cost[c] * ft.rhs[r]
		}
		if z > -1e-9 {
			return false // some generator seems never positive: not the whole face
		}
		collect()
	}
	if slices.Contains(pos, false) {
		return false
	}
	w := make([]float64, nc)
	for c := range w {
		w[c] = sum[c] / float64(count)
	}
	// Basis of the columns, preferring large weights (float elimination).
	order := make([]int, nc)
	for c := range order {
		order[c] = c
	}
	slices.SortStableFunc(order, func(a, b int) int {
		switch {
		case w[a] > w[b]:
			return -1
		case w[a] < w[b]:
			return 1
		}
		return 0
	})
	var basis, pivRows []int
	var reduced [][]float64
	for _, c := range order {
		v := make([]float64, m)
		for i := range v {
			v[i] = float64(cols[c][i])
		}
		for k, u := range reduced {
			f := v[pivRows[k]] / u[pivRows[k]]
			for i := range v {
				v[i] -= f * u[i]
			}
		}
		best, bi := 1e-7, -1
		for i, e := range v {
			if math.Abs(e) > best {
				best, bi = math.Abs(e), i
			}
		}
		if bi < 0 {
			continue
		}
		basis = append(basis, c)
		pivRows = append(pivRows, bi)
		reduced = append(reduced, v)
		if len(basis) == m {
			break
		}
	}
	inBasis := make([]bool, nc)
	for _, c := range basis {
		inBasis[c] = true
	}
	// Exact: fix the other weights to rounded positive rationals, solve the
	// basis for the rest, and check everything.
	res := make([]*big.Rat, m)
	for i := 0; i < d; i++ {
		res[i] = new(big.Rat).Set(x[i])
	}
	res[d] = big.NewRat(1, 1)
	var tmp big.Rat
	for c := 0; c < nc; c++ {
		if inBasis[c] {
			continue
		}
		wc := max(int64(math.Round(w[c]*certScale)), 1)
		q := big.NewRat(wc, certScale)
		for i, e := range cols[c] {
			if e != 0 {
				tmp.Mul(q, tmp.SetInt64(e))
				res[i].Sub(res[i], &tmp)
			}
		}
	}
	r := len(basis)
	sys := make([][]*big.Rat, r)
	for k, row := range pivRows {
		sys[k] = make([]*big.Rat, r+1)
		for j, c := range basis {
			sys[k][j] = new(big.Rat).SetInt64(cols[c][row])
		}
		sys[k][r] = new(big.Rat).Set(res[row])
	}
	wb, ok := solveSquare(sys)
	if !ok {
		return false
	}
	for _, v := range wb {
		if v.Sign() <= 0 {
			return false
		}
	}
	for i := 0; i < m; i++ { // every row, not only the pivot rows
		s := new(big.Rat)
		for j, c := range basis {
			if cols[c][i] != 0 {
				tmp.Mul(wb[j], tmp.SetInt64(cols[c][i]))
				s.Add(s, &tmp)
			}
		}
		if s.Cmp(res[i]) != 0 {
			return false
		}
	}
	return true
}

// solveSquare solves the r×r system given as augmented rows exactly by
// Gauss–Jordan elimination; false if it is singular. The rows are modified.
func solveSquare(rows [][]*big.Rat) ([]*big.Rat, bool) {
	r := len(rows)
	var tmp big.Rat
	for c := 0; c < r; c++ {
		p := -1
		for i := c; i < r; i++ {
			if rows[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			return nil, false
		}
		rows[c], rows[p] = rows[p], rows[c]
		piv := new(big.Rat).Set(rows[c][c])
		for k := c; k <= r; k++ {
			rows[c][k].Quo(rows[c][k], piv)
		}
		for i := 0; i < r; i++ {
			if i == c || rows[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(rows[i][c])
			for k := c; k <= r; k++ {
				tmp.Mul(f, rows[c][k])
				rows[i][k].Sub(rows[i][k], &tmp)
			}
		}
	}
	out := make([]*big.Rat, r)
	for i := range out {
		out[i] = rows[i][r]
	}
	return out, true
}
