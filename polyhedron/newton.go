package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"slices"
	"sync"
	"sync/atomic"
)

// Sentinel errors. Errors returned by this package wrap one of these (test with errors.Is).
var (
	// ErrEmpty is returned by New for an empty point set.
	ErrEmpty = errors.New("polyhedron: empty point set")
	// ErrDimension is returned by New for d < 1 or a point whose length is not d.
	ErrDimension = errors.New("polyhedron: dimension mismatch")
	// ErrNegative is returned by New for a point with a negative coordinate.
	ErrNegative = errors.New("polyhedron: negative exponent")
	// ErrDirection is returned by Distance for a direction that is not a
	// vector of d strictly positive rationals.
	ErrDirection = errors.New("polyhedron: direction must have d positive entries")
	// ErrNotBoundary is returned by FaceAt for a point not on the boundary of P.
	ErrNotBoundary = errors.New("polyhedron: point is not on the boundary")
	// ErrTooLarge is returned when a documented work limit (see Limits) is exceeded.
	ErrTooLarge = errors.New("polyhedron: work limit exceeded")
)

// Newton is the Newton polyhedron P = conv(A) + R^d_{>=0} of a finite set A of
// exponent vectors. New only validates and sorts A; everything else is
// computed when a question needs it: Distance and FaceAt work over the
// points directly, and the vertices, facets and compact faces are computed
// once on first use and cached. All methods are safe for concurrent use.
type Newton struct {
	d        int
	points   [][]int // the input points without duplicates, sorted lexicographically
	maxCoord int64   // largest coordinate of any point
	limits   Limits

	// The Pareto-minimal points and the vertices, computed on first use by
	// ensureVertices under mu (not a sync.Once: a cancelled computation is
	// not cached, so a later call with a live context can finish it).
	mu        sync.Mutex
	vertsDone atomic.Bool
	minimal   [][]int // Pareto-minimal points, sorted lexicographically
	vertices  [][]int // vertices of P, sorted lexicographically
	vertexIdx []int   // vertexIdx[k]: index into points of vertices[k]
	isVertex  []bool  // per point

	// The facets and the compact faces, computed on first use under
	// their own locks; a work-limit error is cached with them, a
	// cancelled computation is not.
	facetsMu   sync.Mutex
	facetsDone atomic.Bool // set after facets and vertexFacets are final
	facets     []Facet
	facetsErr  error // ErrTooLarge, cached
	// vertexFacets[j] is, for the vertex Points()[j], the bitset over
	// Facets() of the facets containing it (nil for other points).
	vertexFacets [][]uint64

	latticeMu   sync.Mutex
	latticeDone bool
	lattice     *Lattice
	latticeErr  error // ErrTooLarge, cached
}

// Limits bounds the work of the full enumerations (Facets, CompactFaces).
// A zero field means the default.
type Limits struct {
	// MaxRays bounds the number of intermediate rays kept by the double
	// description method in Facets (default 2,000,000).
	MaxRays int
	// MaxFaces bounds the number of compact faces built by CompactFaces
	// (default 1,000,000).
	MaxFaces int
}

const (
	defaultMaxRays  = 2_000_000
	defaultMaxFaces = 1_000_000
)

// New builds the Newton polyhedron of points in dimension d >= 1. The points
// are copied. It returns an error wrapping ErrEmpty, ErrDimension or
// ErrNegative (naming the offending point and coordinate) for bad input.
//
// New only checks, copies and sorts the points (duplicates removed): its
// cost is O(N log N) comparisons for N points. Nothing that a question may
// not need is computed here: Distance and FaceAt solve their LPs over the
// points themselves (a point that is no vertex never changes an LP over P),
// and the vertices are computed only for the faces they report (see
// FaceAt) or when Vertices, Minimal, Facets, CompactFaces or the face
// operations ask for them.
func New(d int, points [][]int) (*Newton, error) {
	return NewWithLimits(d, points, Limits{})
}

// NewWithLimits is New with explicit work limits for the enumerations.
func NewWithLimits(d int, points [][]int, lim Limits) (*Newton, error) {
	if d < 1 {
		return nil, fmt.Errorf("%w: d = %d, want d >= 1", ErrDimension, d)
	}
	if len(points) == 0 {
		return nil, ErrEmpty
	}
	for k, p := range points {
		if len(p) != d {
			return nil, fmt.Errorf("%w: point %d has %d coordinates, want %d", ErrDimension, k, len(p), d)
		}
		for i, v := range p {
			if v < 0 {
				return nil, fmt.Errorf("%w: point %d coordinate %d is %d", ErrNegative, k, i, v)
			}
		}
	}
	if lim.MaxRays <= 0 {
		lim.MaxRays = defaultMaxRays
	}
	if lim.MaxFaces <= 0 {
		lim.MaxFaces = defaultMaxFaces
	}
	n := &Newton{d: d, limits: lim}
	flat := make([]int, len(points)*d) // one allocation for all copies
	n.points = make([][]int, len(points))
	for k, p := range points {
		q := flat[k*d : (k+1)*d : (k+1)*d]
		copy(q, p)
		n.points[k] = q
		for _, x := range q {
			n.maxCoord = max(n.maxCoord, int64(x))
		}
	}
	slices.SortFunc(n.points, slices.Compare)
	n.points = slices.CompactFunc(n.points, slices.Equal)
	return n, nil
}

// ensureVertices computes the Pareto-minimal points and the vertices once
// (the Pareto filter, then the vertex filter described at Vertices). It
// returns an error wrapping ctx.Err() when ctx is done first; nothing is
// cached then.
func (n *Newton) ensureVertices(ctx context.Context) error {
	return n.ensureVerticesStats(ctx, nil)
}

// ensureVerticesStats is ensureVertices with optional work counters.
func (n *Newton) ensureVerticesStats(ctx context.Context, st *vertexStats) error {
	if n.vertsDone.Load() {
		return nil
	}
	n.mu.Lock()
	defer n.mu.Unlock()
	if n.vertsDone.Load() {
		return nil
	}
	if err := contextErr(ctx); err != nil {
		return err
	}
	minimal := paretoMinimal(n.d, n.points)
	vertices, err := vertexFilter(ctx, n.d, minimal, st)
	if err != nil {
		return err
	}
	n.minimal, n.vertices = minimal, vertices
	n.vertexIdx = make([]int, len(vertices))
	n.isVertex = make([]bool, len(n.points))
	for k, v := range vertices {
		j := n.pointIndex(v)
		if j < 0 {
			panic("polyhedron: internal error: a vertex is not an input point")
		}
		n.vertexIdx[k] = j
		n.isVertex[j] = true
	}
	n.vertsDone.Store(true)
	return nil
}

// pointIndex returns the index of p in Points(), or -1.
func (n *Newton) pointIndex(p []int) int {
	j, ok := slices.BinarySearchFunc(n.points, p, slices.Compare)
	if !ok {
		return -1
	}
	return j
}

// Dim returns the dimension d of the ambient space.
func (n *Newton) Dim() int { return n.d }

// Points returns the input points without duplicates, sorted
// lexicographically. Indices in Hit, Face and Facet refer to this slice.
// The caller must not modify the result.
func (n *Newton) Points() [][]int { return n.points }

// Minimal returns the Pareto-minimal input points (those not dominated
// coordinatewise by another input point), sorted lexicographically. They
// are computed on first use (see Vertices). It returns an error wrapping
// ctx.Err() when ctx is done first. The caller must not modify the result.
func (n *Newton) Minimal(ctx context.Context) ([][]int, error) {
	if err := n.ensureVertices(ctx); err != nil {
		return nil, err
	}
	return n.minimal, nil
}

// Vertices returns the vertices of P sorted lexicographically (each is one
// of Points()). They are computed once, on first use by this or another
// method that needs them, and cached; when ctx is done first, the error
// wraps ctx.Err() and a later call starts again.
//
// Method: the Pareto-minimal points first (a skyline filter: sort by
// coordinate sum, then test each point only against minimal points with a
// smaller sum and a support contained in its own); then a minimal point p
// is a vertex of P exactly when it is a vertex of the Newton polyhedron of
// the minimal points whose support lies in supp(p) (a face of P). The
// vertex filter keeps a growing set of certified vertices, seeded with the
// unique minimisers of a few positive linear orders, and decides each point
// by a float64 LP over the known vertices with support in supp(p) only: a
// point found inside is accepted as a non-vertex only with an exact
// certificate (the LP basis solved exactly in integers, or a basis cached
// from a point of the same support); a point found outside gives a
// separating normal whose exact minimisers over all candidate points, ties
// broken lexicographically, are a new vertex for the set or prove that p is
// one. On small inputs, cheap LP-free tests come first (unique minimiser of
// a linear order; lying above a segment between two other points); whatever
// the float LPs cannot certify is decided by the exact LP over all
// candidates.
//
// Cost: about one small float LP (d' + 1 rows for support size d', columns
// the known vertices) per minimal point, fewer when points of one support
// share a basis, plus an O(M·d) exact pricing pass over the M minimal points
// about twice per vertex; run on all cores. On the 2-core development
// machine: the 92,378 points of degree 10 in d = 10 (10 vertices) take
// about 0.15 s; 10^5 random points in d = 20 with exponents up to 12 (about
// 78,000 minimal, 32,000 vertices) about 24 s, which is why nothing that
// does not need the vertices computes them.
func (n *Newton) Vertices(ctx context.Context) ([][]int, error) {
	if err := n.ensureVertices(ctx); err != nil {
		return nil, err
	}
	return n.vertices, nil
}

// support returns the bitset of nonzero coordinates of p.
func support(p []int, words int) []uint64 {
	s := make([]uint64, words)
	for i, v := range p {
		if v != 0 {
			s[i/64] |= 1 << (i % 64)
		}
	}
	return s
}

func subset(a, b []uint64) bool { // a ⊆ b
	for k := range a {
		if a[k]&^b[k] != 0 {
			return false
		}
	}
	return true
}

func dominates(q, p []int) bool { // q <= p coordinatewise
	for i := range q {
		if q[i] > p[i] {
			return false
		}
	}
	return true
}

// sum128 is the exact coordinate sum of a nonnegative point as a 128-bit
// number (hi, lo), so that huge exponents cannot overflow.
type sum128 struct{ hi, lo uint64 }

func sumOf(p []int) sum128 {
	var s sum128
	for _, v := range p {
		var c uint64
		s.lo, c = bits.Add64(s.lo, uint64(v), 0)
		s.hi += c
	}
	return s
}

func (s sum128) cmp(t sum128) int {
	switch {
	case s.hi != t.hi:
		if s.hi < t.hi {
			return -1
		}
		return 1
	case s.lo != t.lo:
		if s.lo < t.lo {
			return -1
		}
		return 1
	}
	return 0
}

// paretoMinimal returns the distinct points not dominated by another point,
// sorted lexicographically.
func paretoMinimal(d int, points [][]int) [][]int {
	order := make([]int, len(points))
	sums := make([]sum128, len(points))
	for k := range order {
		order[k] = k
		sums[k] = sumOf(points[k])
	}
	slices.SortFunc(order, func(a, b int) int {
		if c := sums[a].cmp(sums[b]); c != 0 {
			return c
		}
		return slices.Compare(points[a], points[b])
	})
	words := (d + 63) / 64
	var kept [][]int
	var keptSupp [][]uint64
	bySupport := map[uint64][]int{} // support mask -> indices into kept (only when d <= 64)
	var prev []int
	smaller := 0 // kept[:smaller] have a smaller coordinate sum than p
	for idx, k := range order {
		p := points[k]
		if prev != nil && slices.Equal(prev, p) {
			continue
		}
		prev = p
		if idx > 0 && sums[order[idx-1]].cmp(sums[k]) != 0 {
			smaller = len(kept)
		}
		// Only a point with a smaller sum can dominate p (a distinct point
		// q <= p has a smaller sum).
		if smaller == 0 {
			kept = append(kept, slices.Clone(p))
			sp := support(p, words)
			if d <= 64 {
				bySupport[sp[0]] = append(bySupport[sp[0]], len(kept)-1)
			}
			keptSupp = append(keptSupp, sp)
			continue
		}
		sp := support(p, words)
		dominated := false
		pop := 0
		for _, w := range sp {
			pop += bits.OnesCount64(w)
		}
		if d <= 64 && pop < 20 && 16<<pop < smaller {
			// enumerate the subsets of supp(p)
			mask := sp[0]
			for sub := mask; ; sub = (sub - 1) & mask {
				for _, j := range bySupport[sub] {
					if j >= smaller {
						break // indices ascend
					}
					if dominates(kept[j], p) {
						dominated = true
						break
					}
				}
				if dominated || sub == 0 {
					break
				}
			}
		} else {
			for j, q := range kept[:smaller] {
				if subset(keptSupp[j], sp) && dominates(q, p) {
					dominated = true
					break
				}
			}
		}
		if dominated {
			continue
		}
		c := slices.Clone(p)
		if d <= 64 {
			bySupport[sp[0]] = append(bySupport[sp[0]], len(kept))
		}
		kept = append(kept, c)
		keptSupp = append(keptSupp, sp)
	}
	slices.SortFunc(kept, slices.Compare)
	// One contiguous block in the final order: later passes scan the
	// points in this order.
	flat := make([]int, len(kept)*d)
	for k, p := range kept {
		row := flat[k*d : (k+1)*d : (k+1)*d]
		copy(row, p)
		kept[k] = row
	}
	return kept
}

// candidatesBelow appends to q the indices j != k of the points whose
// support lies in the support of pts[k].
func candidatesBelow(k int, pts [][]int, supp [][]uint64, bySupport map[string][]int, d int, q []int) []int {
	pop := 0
	for _, w := range supp[k] {
		pop += bits.OnesCount64(w)
	}
	if d <= 64 && pop < 20 && 16<<pop < len(pts) {
		mask := supp[k][0]
		for sub := mask; ; sub = (sub - 1) & mask {
			q = append(q, bySupport[bitsKey([]uint64{sub})]...)
			if sub == 0 {
				break
			}
		}
	} else {
		for j := range pts {
			if subset(supp[j], supp[k]) {
				q = append(q, j)
			}
		}
	}
	return slices.DeleteFunc(q, func(j int) bool { return j == k })
}

func bitsKey(s []uint64) string {
	b := make([]byte, 8*len(s))
	for k, w := range s {
		for i := 0; i < 8; i++ {
			b[8*k+i] = byte(w >> (8 * i))
		}
	}
	return string(b)
}

// vertexScratch holds buffers reused by the vertex tests of one worker.
type vertexScratch struct {
	rows [][]int
	flat []int
}

// isVertex decides whether p is a vertex of conv({p} ∪ pts[q]) + orthant,
// where every pts[j], j in q, has support inside supp(p) and p is
// Pareto-minimal (so no pts[j] dominates p).
func isVertex(p []int, pts [][]int, q []int, scratch *vertexScratch) bool {
	if len(q) == 0 {
		return true
	}
	var coords []int
	for i, v := range p {
		if v != 0 {
			coords = append(coords, i)
		}
	}
	if isV, decided := cheapVertexTests(p, pts, q, coords); decided {
		return isV
	}
	// LP: shoot from p along (1,…,1) within the coordinates of supp(p); p is
	// a vertex iff t0 = min{t : p + t·1 ∈ conv(Q) + orthant} > 0. A float64
	// solve proposes an answer with a certificate that is checked exactly
	// (t0 > 0: a rounded integer normal A >= 0 with A·p < A·q for all q;
	// t0 < 0: rounded rational weights λ with Σ λ_j q_j <= p); otherwise, or
	// if the check fails, the exact LP decides.
	sub := scratch.rows[:0]
	flat := scratch.flat[:0]
	if len(coords) < len(p) {
		flat = slices.Grow(flat, len(q)*len(coords))[:len(q)*len(coords)]
	}
	for k, j := range q {
		if len(coords) == len(p) {
			sub = append(sub, pts[j])
			continue
		}
		r := flat[k*len(coords) : (k+1)*len(coords) : (k+1)*len(coords)]
		for t, i := range coords {
			r[t] = pts[j][i]
		}
		sub = append(sub, r)
	}
	scratch.rows, scratch.flat = sub, flat
	pr := make([]int, len(coords))
	pf := make([]float64, len(coords))
	ones := make([]float64, len(coords))
	for t, i := range coords {
		pr[t] = p[i]
		pf[t] = float64(p[i])
		ones[t] = 1
	}
	if fs, ok := shootFloat(sub, pf, ones); ok {
		if fs.t > 1e-7 && certifyOutside(fs.a, pr, sub) {
			return true
		}
		if fs.t < -1e-7 && certifyInside(fs.weights, pr, sub) {
			return false
		}
		if fs.t <= 1e-7 {
			// Probably t0 = 0 (p on the boundary of the others' polyhedron):
			// solve exactly over the float solution's points only; a
			// restricted optimum <= 0 already proves p ∈ conv(Q) + orthant.
			var few [][]int
			for j := range fs.weights {
				few = append(few, sub[j])
			}
			if len(few) > 0 && shoot(few, ratVec(pr), ratOnes(len(pr))).t.Sign() <= 0 {
				return false
			}
		}
	}
	return shoot(sub, ratVec(pr), ratOnes(len(pr))).t.Sign() > 0
}

// cheapVertexTests runs the sufficient tests of isVertex that need no LP;
// decided is false when none applies. coords is supp(p).
func cheapVertexTests(p []int, pts [][]int, q []int, coords []int) (isV, decided bool) {
	// Sufficient tests: p is the unique minimiser of a linear functional with
	// positive weights (coordinate sum; lexicographic orders starting at
	// each coordinate, which are limits of positive weights).
	ps := sumOf(p)
	unique := true
	for _, j := range q {
		if sumOf(pts[j]).cmp(ps) <= 0 {
			unique = false
			break
		}
	}
	if unique {
		return true, true
	}
	for s := range coords {
		unique = true
		for _, j := range q {
			c := 0
			for t := 0; t < len(coords) && c == 0; t++ {
				i := coords[(s+t)%len(coords)]
				c = pts[j][i] - p[i]
			}
			if c <= 0 { // c == 0 impossible for distinct points with support in coords
				unique = false
				break
			}
		}
		if unique {
			return true, true
		}
	}
	if onSegmentAbove(p, pts, q, coords) {
		return false, true
	}
	return false, false
}

func ratVec(v []int) []*big.Rat {
	out := make([]*big.Rat, len(v))
	for i, x := range v {
		out[i] = new(big.Rat).SetInt64(int64(x))
	}
	return out
}

func ratOnes(n int) []*big.Rat {
	out := make([]*big.Rat, n)
	for i := range out {
		out[i] = big.NewRat(1, 1)
	}
	return out
}

// pairSieve is the number of candidate points tried in pairs by
// onSegmentAbove.
const pairSieve = 16

// onSegmentAbove is a cheap sufficient test for p not being a vertex: among
// the points q of Q that come closest to dominating p (smallest
// max_i(q_i − p_i)), it looks for two with λ·q1 + (1−λ)·q2 <= p for some
// λ in [0, 1], decided exactly with integer arithmetic. Q's points have
// support in coords.
func onSegmentAbove(p []int, pts [][]int, q []int, coords []int) bool {
	type cand struct{ j, need int }
	var best [pairSieve]cand
	nb := 0
	for _, j := range q {
		need := math.MinInt
		for _, i := range coords {
			need = max(need, pts[j][i]-p[i])
		}
		if nb == pairSieve && need >= best[nb-1].need {
			continue
		}
		k := nb
		if nb < pairSieve {
			nb++
		} else {
			k = nb - 1
		}
		for k > 0 && best[k-1].need > need {
			best[k] = best[k-1]
			k--
		}
		best[k] = cand{j, need}
	}
	for a := 0; a < nb; a++ {
		for b := a + 1; b < nb; b++ {
			if segmentBelow(p, pts[best[a].j], pts[best[b].j], coords) {
				return true
			}
		}
	}
	return false
}

// segmentBelow reports whether λ·q1 + (1−λ)·q2 <= p on coords for some λ in
// [0, 1]: each coordinate bounds λ by a fraction; the bounds are compared
// exactly (false on int64 overflow).
func segmentBelow(p, q1, q2 []int, coords []int) bool {
	loN, loD := int64(0), int64(1) // λ >= loN/loD
	hiN, hiD := int64(1), int64(1) // λ <= hiN/hiD
	for _, i := range coords {
		dlt := int64(q1[i]) - int64(q2[i])
		r := int64(p[i]) - int64(q2[i])
		switch {
		case dlt > 0: // λ <= r/dlt
			x, ok1 := mul64(r, hiD)
			y, ok2 := mul64(hiN, dlt)
			if !ok1 || !ok2 {
				return false
			}
			if x < y {
				hiN, hiD = r, dlt
			}
		case dlt < 0: // λ >= r/dlt = (−r)/(−dlt)
			x, ok1 := mul64(-r, loD)
			y, ok2 := mul64(loN, -dlt)
			if !ok1 || !ok2 {
				return false
			}
			if x > y {
				loN, loD = -r, -dlt
			}
		default:
			if r < 0 {
				return false
			}
		}
	}
	x, ok1 := mul64(loN, hiD)
	y, ok2 := mul64(hiN, loD)
	return ok1 && ok2 && x <= y
}

const certScale = 1 << 20

// certifyOutside rounds a float normal a to integers A >= 0 and checks
// exactly that A·p < A·q for every q, which proves p ∉ conv(Q) + orthant.
func certifyOutside(a []float64, p []int, q [][]int) bool {
	top := 0.0
	for _, x := range a {
		top = max(top, x)
	}
	if top <= 0 {
		return false
	}
	A := make([]int64, len(a))
	for i, x := range a {
		if x > 0 {
			A[i] = int64(math.Round(x / top * certScale))
		}
	}
	ap, ok := checkedDot(A, p)
	if !ok {
		return false
	}
	for _, v := range q {
		av, ok := checkedDot(A, v)
		if !ok || av <= ap {
			return false
		}
	}
	return true
}

// certifyInside rounds float convex weights to rationals with denominator
// certScale and checks exactly that Σ λ_j q_j <= p coordinatewise, which
// proves p ∈ conv(Q) + orthant.
func certifyInside(w map[int]float64, p []int, q [][]int) bool {
	idx := make([]int, 0, len(w))
	for j := range w {
		idx = append(idx, j)
	}
	slices.Sort(idx)
	lam := make([]int64, len(idx))
	var sum int64
	big := 0
	for k, j := range idx {
		lam[k] = int64(math.Round(max(w[j], 0) * certScale))
		sum += lam[k]
		if lam[k] > lam[big] {
			big = k
		}
	}
	lam[big] += certScale - sum
	if lam[big] < 0 {
		return false
	}
	for i := range p {
		var s int64
		for k, j := range idx {
			term, ok := mul64(lam[k], int64(q[j][i]))
			if !ok {
				return false
			}
			s += term
			if s < 0 {
				return false
			}
		}
		lim, ok := mul64(certScale, int64(p[i]))
		if !ok || s > lim {
			return false
		}
	}
	return true
}

// checkedDot returns a·v for an int64 vector a and a point v, and false on
// int64 overflow.
func checkedDot(a []int64, v []int) (int64, bool) {
	var s int64
	for i, x := range v {
		if x == 0 || a[i] == 0 {
			continue
		}
		if a[i] == math.MinInt64 {
			return 0, false
		}
		hi, lo := bits.Mul64(uint64(abs64(a[i])), uint64(x))
		if hi != 0 || lo > math.MaxInt64/2 {
			return 0, false
		}
		term := int64(lo)
		if a[i] < 0 {
			term = -term
		}
		ns := s + term
		if (term > 0 && ns < s) || (term < 0 && ns > s) {
			return 0, false
		}
		s = ns
	}
	return s, true
}

func abs64(x int64) int64 {
	if x < 0 {
		return -x
	}
	return x
}
