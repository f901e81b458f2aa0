package polyhedron

import (
	"context"
	"math"
	"math/big"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
)

// vertexStats counts the work of the vertex filter (reported by the
// benchmarks).
type vertexStats struct {
	floatLPs atomic.Int64 // float LPs over known vertices
	exactLPs atomic.Int64 // points decided by the exact fallback
	pricings atomic.Int64 // exact pricing passes over all minimal points
}

// Point states in the vertex filter.
const (
	stateUnknown int32 = iota
	stateVertex
	stateNotVertex
)

// vertexFilter returns the vertices of the Newton polyhedron of the
// Pareto-minimal points pts (sorted; the result keeps the order).
//
// A point p is a vertex of P iff it is a vertex of the face P_S = P ∩
// {x_i = 0 for i ∉ S}, S = supp(p), which is the Newton polyhedron of the
// points with support in S (its vertices are vertices of P). The filter
// keeps a growing set C of certified vertices, seeded with the unique
// minimisers of a few positive linear orders, and decides each other point
// p against the vertices C_p of C with support in S:
//
//   - A float64 ray-shooting LP from p along (1,…,1) over conv(C_p) +
//     orthant (coordinates S). If it finds p inside or on the boundary
//     (t0 <= 0), p is no vertex, which is accepted only with an exact
//     certificate: the float basis (points, slacks, t) is solved exactly
//     in integers (solveInt64) and the weights and slacks must come out
//     >= 0 and t <= 0; or rounded convex weights are checked exactly.
//   - Otherwise its dual proposes a normal A >= 0 separating p from
//     C_p. The exact minimisers of A over all minimal points with support
//     in S are found with integer arithmetic, ties broken
//     lexicographically: the chosen point is the unique minimiser of a
//     strictly positive perturbation of A, hence a vertex. If it is p, p
//     is a vertex; else it is a new vertex for C, and the LP is retried.
//   - When a certificate fails, a rounded normal does not separate, or
//     int64 would overflow, the point is decided by the exact method of
//     isVertex over all candidate points.
//
// Every answer is exact. The number of pricing passes is at most about two
// per vertex, so the work is about one small LP over known vertices per
// minimal point.
func vertexFilter(ctx context.Context, d int, pts [][]int, st *vertexStats) ([][]int, error) {
	vf := &vfilter{d: d, pts: pts, st: st, words: (d + 63) / 64}
	vf.supp = make([][]uint64, len(pts))
	for k, p := range pts {
		vf.supp[k] = support(p, vf.words)
	}
	vf.state = make([]atomic.Int32, len(pts))
	if len(pts) > cheapTestsMax { // small inputs: the cheap tests decide most points
		for _, k := range vf.seeds() {
			vf.markVertex(k)
		}
	}
	// Points with large coordinate sums (likely non-vertices) go first;
	// the order does not change the answer.
	order := make([]int, len(pts))
	sums := make([]sum128, len(pts))
	for k := range order {
		order[k] = k
		sums[k] = sumOf(pts[k])
	}
	slices.SortStableFunc(order, func(a, b int) int { return -sums[a].cmp(sums[b]) })
	workers := runtime.GOMAXPROCS(0)
	if len(pts) < 256 {
		workers = 1 // not worth waking other threads
	}
	var next atomic.Int64
	var failed atomic.Bool
	work := func() {
		var sc vfScratch
		for {
			i := int(next.Add(1) - 1)
			if i >= len(order) || failed.Load() {
				return
			}
			k := order[i]
			if vf.state[k].Load() != stateUnknown {
				continue
			}
			if contextErr(ctx) != nil {
				failed.Store(true)
				return
			}
			if vf.test(k, &sc) {
				vf.markVertex(k)
			} else {
				vf.state[k].Store(stateNotVertex)
			}
		}
	}
	var wg sync.WaitGroup
	for w := 1; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			work()
		}()
	}
	work()
	wg.Wait()
	if err := contextErr(ctx); err != nil {
		return nil, err
	}
	var out [][]int
	for k, p := range pts {
		if vf.state[k].Load() == stateVertex {
			out = append(out, p)
		}
	}
	return out, nil
}

// vfilter is the shared state of one vertex filter run.
type vfilter struct {
	d     int
	pts   [][]int
	supp  [][]uint64
	words int
	st    *vertexStats
	state []atomic.Int32

	mu    sync.Mutex
	known []int // certified vertices, append-only

	fallbackOnce sync.Once
	bySupport    map[string][]int
}

// vfScratch holds per-worker buffers and a cache of the last certifying
// basis per support: points with the same support often have a
// representation over the same vertices, which is then certified exactly
// without an LP.
type vfScratch struct {
	old   vertexScratch
	q     []int
	cp    []int
	sub   [][]int
	flat  []int
	cols  [][]int64
	cflat []int64
	rhs   []int64
	kind  []int8
	cache map[string]basisCache
}

// basisCache is a basis of the ray-shooting LP: vertices (point indices),
// basic slack positions (within the support) and whether t is basic.
type basisCache struct {
	verts  []int
	slacks []int
	tBasic bool
}

// markVertex records k as a certified vertex (once).
func (vf *vfilter) markVertex(k int) {
	if vf.state[k].CompareAndSwap(stateUnknown, stateVertex) {
		vf.mu.Lock()
		vf.known = append(vf.known, k)
		vf.mu.Unlock()
	}
}

// snapshot returns the certified vertices so far. The slice is append-only,
// so its elements are never written again.
func (vf *vfilter) snapshot() []int {
	vf.mu.Lock()
	defer vf.mu.Unlock()
	return vf.known
}

// seeds returns unique minimisers of positive linear orders over all
// points: coordinate sum, then lexicographic; up to eight lexicographic
// orders starting at coordinates spread over 0..d−1 (cyclically); and up to
// eight fixed positive integer weights, each with lexicographic
// tie-breaking. Cost: O(M·d) each. Each is the unique
// minimiser of a strictly positive functional, hence a vertex.
func (vf *vfilter) seeds() []int {
	d := vf.d
	var out []int
	ones := make([]int64, d)
	for i := range ones {
		ones[i] = 1
	}
	weights := [][]int64{ones}
	for s := 0; s < min(d, 8); s++ {
		w := make([]int64, d)
		for i := range w {
			w[i] = 1 + int64((i*7+s*13+i*i*s)%11)
		}
		weights = append(weights, w)
	}
	for _, w := range weights {
		if k, ok := vf.argmin(w, nil, -1); ok {
			out = append(out, k)
		}
	}
	nl := min(d, 8)
	for r := 0; r < nl; r++ {
		s := r * d / nl
		best := -1
		for k, p := range vf.pts {
			if best < 0 || cyclicLess(p, vf.pts[best], s) {
				best = k
			}
		}
		out = append(out, best)
	}
	return out
}

// cyclicLess compares p and q lexicographically in the coordinate order
// s, s+1, …, d−1, 0, …, s−1.
func cyclicLess(p, q []int, s int) bool {
	d := len(p)
	for t := 0; t < d; t++ {
		i := (s + t) % d
		if p[i] != q[i] {
			return p[i] < q[i]
		}
	}
	return false
}

// argmin returns the point minimising w·q, ties broken lexicographically,
// over the points whose support lies in supp (all points if supp is nil),
// always including point self (if >= 0). false on int64 overflow.
func (vf *vfilter) argmin(w []int64, supp []uint64, self int) (int, bool) {
	if vf.st != nil {
		vf.st.pricings.Add(1)
	}
	best := -1
	var bestVal int64
	for k, q := range vf.pts {
		if k != self && supp != nil && !subset(vf.supp[k], supp) {
			continue
		}
		v, ok := checkedDot(w, q)
		if !ok {
			return -1, false
		}
		if best < 0 || v < bestVal || (v == bestVal && slices.Compare(q, vf.pts[best]) < 0) {
			best, bestVal = k, v
		}
	}
	return best, best >= 0
}

// cheapTestsMax is the number of minimal points up to which each point is
// first put through the LP-free tests of isVertex (they scan all candidate
// points, O(M·d) per point).
const cheapTestsMax = 512

// maxVertexRounds bounds the LP-and-pricing rounds per point before the
// exact fallback (each round certifies a new vertex).
const maxVertexRounds = 64

// test decides whether point k is a vertex (see vertexFilter).
func (vf *vfilter) test(k int, sc *vfScratch) bool {
	p := vf.pts[k]
	var coords []int
	for i, v := range p {
		if v != 0 {
			coords = append(coords, i)
		}
	}
	if len(coords) == 0 {
		return true // the origin dominates every point: it is the only minimal point
	}
	if len(vf.pts) <= cheapTestsMax {
		sc.q = vf.candidates(k, sc.q[:0])
		if isV, decided := cheapVertexTests(p, vf.pts, sc.q, coords); decided {
			return isV
		}
	}
	ns := len(coords)
	pr := make([]int, ns)
	pf := make([]float64, ns)
	ones := make([]float64, ns)
	for t, i := range coords {
		pr[t] = p[i]
		pf[t] = float64(p[i])
		ones[t] = 1
	}
	w := make([]int64, vf.d)
	for round := 0; round < maxVertexRounds; round++ {
		// C_p: certified vertices with support in supp(p).
		sc.cp = sc.cp[:0]
		full := ns == vf.d
		for _, j := range vf.snapshot() {
			if j != k && (full || subset(vf.supp[j], vf.supp[k])) {
				sc.cp = append(sc.cp, j)
			}
		}
		key := ""
		if round == 0 {
			key = bitsKey(vf.supp[k])
			if b, ok := sc.cache[key]; ok && vf.certify(b, coords, pr, sc) {
				return false
			}
		}
		clear(w)
		if len(sc.cp) == 0 {
			for _, i := range coords {
				w[i] = 1
			}
		} else {
			sub := sc.restrict(vf.pts, sc.cp, coords)
			if vf.st != nil {
				vf.st.floatLPs.Add(1)
			}
			fs, ok := shootFloat(sub, pf, ones)
			if !ok {
				break
			}
			if fs.t < -1e-7 && certifyInside(fs.weights, pr, sub) {
				return false
			}
			if fs.t <= 1e-7 {
				b := basisCache{slacks: fs.slacks, tBasic: fs.tBasic}
				for j := range fs.weights {
					b.verts = append(b.verts, sc.cp[j])
				}
				slices.Sort(b.verts)
				if vf.certify(b, coords, pr, sc) {
					if key == "" {
						key = bitsKey(vf.supp[k])
					}
					if sc.cache == nil {
						sc.cache = map[string]basisCache{}
					}
					sc.cache[key] = b
					return false
				}
				break
			}
			top := 0.0
			for _, x := range fs.a {
				top = max(top, x)
			}
			if !(top > 0) || math.IsInf(top, 0) {
				break
			}
			for t, i := range coords {
				if fs.a[t] > 0 {
					w[i] = int64(math.Round(fs.a[t] / top * certScale))
				}
			}
		}
		q, ok := vf.argmin(w, vf.supp[k], k)
		if !ok {
			break
		}
		if q == k {
			return true // unique minimiser of a positive perturbation of w
		}
		if slices.Contains(sc.cp, q) {
			break // the rounded normal does not separate p from C_p
		}
		vf.markVertex(q)
	}
	return vf.exactTest(k, sc)
}

// restrict returns the points idx restricted to coords (rows reuse the
// scratch buffers).
func (sc *vfScratch) restrict(pts [][]int, idx, coords []int) [][]int {
	n := len(coords)
	sc.flat = slices.Grow(sc.flat[:0], len(idx)*n)[:len(idx)*n]
	sc.sub = sc.sub[:0]
	for r, j := range idx {
		row := sc.flat[r*n : (r+1)*n : (r+1)*n]
		for t, i := range coords {
			row[t] = pts[j][i]
		}
		sc.sub = append(sc.sub, row)
	}
	return sc.sub
}

// exactTest decides point k by the exact method over all points with
// support in supp(k) that are not known non-vertices.
func (vf *vfilter) exactTest(k int, sc *vfScratch) bool {
	if vf.st != nil {
		vf.st.exactLPs.Add(1)
	}
	sc.q = vf.candidates(k, sc.q[:0])
	return isVertex(vf.pts[k], vf.pts, sc.q, &sc.old)
}

// candidates appends to q the points other than k with support in supp(k)
// that are not known non-vertices (dropping those keeps the answer: p is a
// vertex iff it is outside conv(V \ {p}) + orthant for the vertex set V).
func (vf *vfilter) candidates(k int, q []int) []int {
	vf.fallbackOnce.Do(func() {
		vf.bySupport = map[string][]int{}
		for j := range vf.pts {
			key := bitsKey(vf.supp[j])
			vf.bySupport[key] = append(vf.bySupport[key], j)
		}
	})
	q = candidatesBelow(k, vf.pts, vf.supp, vf.bySupport, vf.d, q)
	return slices.DeleteFunc(q, func(j int) bool { return vf.state[j].Load() == stateNotVertex })
}

// certify proves p ∈ conv(Q) + orthant exactly from a basis of the
// ray-shooting LP (in the coordinates coords of supp(p), p restricted being
// pr): it solves Σ λ_j v_j + Σ s_i e_i − t·1 = p, Σ λ_j = 1 over the basic
// columns in integers (solveInt64) and accepts only λ >= 0, s >= 0 and t <=
// 0 (then p = (p + t·1) + (−t)·1 lies in conv(Q) + orthant). The vertices
// of the basis must have their support in supp(p): they come from C_p, or
// from the cache entry of the same support.
func (vf *vfilter) certify(b basisCache, coords, pr []int, sc *vfScratch) bool {
	m := len(pr) + 1
	nc := len(b.verts) + len(b.slacks)
	if b.tBasic {
		nc++
	}
	sc.cflat = slices.Grow(sc.cflat[:0], nc*m)[:nc*m]
	clear(sc.cflat)
	sc.cols = sc.cols[:0]
	sc.kind = sc.kind[:0]
	col := func(c int) []int64 { return sc.cflat[c*m : (c+1)*m : (c+1)*m] }
	for _, j := range b.verts {
		c := col(len(sc.cols))
		for t, i := range coords {
			c[t] = int64(vf.pts[j][i])
		}
		c[m-1] = 1
		sc.cols = append(sc.cols, c)
		sc.kind = append(sc.kind, 0)
	}
	for _, i := range b.slacks {
		c := col(len(sc.cols))
		c[i] = 1
		sc.cols = append(sc.cols, c)
		sc.kind = append(sc.kind, 0)
	}
	if b.tBasic {
		c := col(len(sc.cols))
		for i := 0; i < m-1; i++ {
			c[i] = -1
		}
		sc.cols = append(sc.cols, c)
		sc.kind = append(sc.kind, 1)
	}
	sc.rhs = slices.Grow(sc.rhs[:0], m)[:m]
	for i, x := range pr {
		sc.rhs[i] = int64(x)
	}
	sc.rhs[m-1] = 1
	num, den, st := solveInt64(sc.cols, sc.rhs)
	if st != solved {
		if st == overflowed {
			return certifyBasisRat(sc.cols, sc.kind, sc.rhs)
		}
		return false
	}
	for c, x := range num {
		s := x
		if den < 0 {
			s = -x
		}
		if (sc.kind[c] == 0 && s < 0) || (sc.kind[c] == 1 && s > 0) {
			return false
		}
	}
	return true
}

// certifyBasisRat is certifyBasis in math/big rationals (Gauss–Jordan
// elimination; unknowns of dependent columns set to 0).
func certifyBasisRat(cols [][]int64, kind []int8, rhs []int64) bool {
	m, nc := len(rhs), len(cols)
	rows := make([][]*big.Rat, m)
	for i := range rows {
		rows[i] = make([]*big.Rat, nc+1)
		for c := range cols {
			rows[i][c] = new(big.Rat).SetInt64(cols[c][i])
		}
		rows[i][nc] = new(big.Rat).SetInt64(rhs[i])
	}
	var tmp big.Rat
	var pivCols []int
	r := 0
	for c := 0; c < nc && r < m; c++ {
		p := -1
		for i := r; i < m; i++ {
			if rows[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		rows[r], rows[p] = rows[p], rows[r]
		piv := new(big.Rat).Set(rows[r][c])
		for x := c; x <= nc; x++ {
			rows[r][x].Quo(rows[r][x], piv)
		}
		for i := 0; i < m; i++ {
			if i == r || rows[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(rows[i][c])
			for x := c; x <= nc; x++ {
				tmp.Mul(f, rows[r][x])
				rows[i][x].Sub(rows[i][x], &tmp)
			}
		}
		pivCols = append(pivCols, c)
		r++
	}
	for i := r; i < m; i++ {
		if rows[i][nc].Sign() != 0 {
			return false
		}
	}
	for i, c := range pivCols {
		s := rows[i][nc].Sign()
		if (kind[c] == 0 && s < 0) || (kind[c] == 1 && s > 0) {
			return false
		}
	}
	return true
}
