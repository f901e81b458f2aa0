package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/bits"
	"math/rand/v2"
	"slices"
)

// Facet is an inequality a·x >= b (a >= 0, primitive integer vector) that
// defines a facet of P.
type Facet struct {
	Normal   []*big.Int // a
	RHS      *big.Int   // b
	Vertices []int      // indices into Points() of the vertices on the facet, ascending
	Rays     []int      // coordinates i with a_i = 0 (e_i lies in the facet's recession cone), ascending
}

// Facets returns all facets of P, sorted by normal (lexicographically) and
// then by right-hand side. The result is computed once and shared; the
// caller must not modify it. It returns an error wrapping ErrTooLarge when
// the number of intermediate rays exceeds Limits.MaxRays (cached: later
// calls return it too), and one wrapping ctx.Err() when ctx is done first
// (not cached; ctx is checked before each vertex constraint is added).
//
// Algorithm: the inequalities a·x >= b valid on P are the cone
// C = {(a, b) : a_i >= 0, a·v − b >= 0 for every vertex v} in R^{d+1}, which
// is pointed; the facets of P are the extreme rays of C other than (0, −1).
// They are enumerated by the double description method (T. S. Motzkin et
// al., "The double description method", 1953; in the form of K. Fukuda and
// A. Prodon, "Double description method revisited", 1996): start from the
// simplicial cone of the d coordinate constraints and one vertex constraint,
// add the remaining vertex constraints one at a time, and combine each pair
// of rays on opposite sides that is adjacent (algebraic test: the constraints
// tight at both have rank d−1). Rays are primitive integer vectors (int64
// with overflow checks, restarting in math/big if needed), so no fractions
// arise. Cost: for each of the V added constraints, O(R·d) to evaluate the R
// current rays plus O(R₊·R₋) bitset intersections and a small exact rank
// computation per candidate pair; R can grow exponentially with d in the
// worst case (bounded by Limits.MaxRays), and is typically a small multiple
// of the final facet count.
func (n *Newton) Facets(ctx context.Context) ([]Facet, error) {
	if n.facetsDone.Load() {
		return n.facets, n.facetsErr
	}
	if err := n.ensureVertices(ctx); err != nil {
		return nil, err
	}
	n.facetsMu.Lock()
	defer n.facetsMu.Unlock()
	if n.facetsDone.Load() {
		return n.facets, n.facetsErr
	}
	facets, byVertex, err := enumerateFacets(ctx, n.d, n.vertices, n.limits.MaxRays)
	if err != nil && !errors.Is(err, ErrTooLarge) {
		return nil, err
	}
	if err == nil {
		// Vertex indices of the enumeration refer to n.vertices; the
		// API's refer to Points().
		for k := range facets {
			for i, v := range facets[k].Vertices {
				facets[k].Vertices[i] = n.vertexIdx[v]
			}
		}
		n.vertexFacets = make([][]uint64, len(n.points))
		for k, set := range byVertex {
			n.vertexFacets[n.vertexIdx[k]] = set
		}
		n.facets = facets
	}
	n.facetsErr = err
	n.facetsDone.Store(true)
	return n.facets, n.facetsErr
}

// attachFacets fills f.Facets when the facets have already been enumerated
// without error.
func (n *Newton) attachFacets(f *Face) {
	if !n.facetsDone.Load() || n.facetsErr != nil || len(f.Vertices) == 0 {
		return
	}
	set := slices.Clone(n.vertexFacets[f.Vertices[0]])
	for _, j := range f.Vertices[1:] {
		for k := range set {
			set[k] &= n.vertexFacets[j][k]
		}
	}
	for k := range set {
		for w := set[k]; w != 0; w &= w - 1 {
			fi := 64*k + bits.TrailingZeros64(w)
			if slices.ContainsFunc(f.Rays, func(i int) bool { return n.facets[fi].Normal[i].Sign() != 0 }) {
				continue
			}
			f.Facets = append(f.Facets, fi)
		}
	}
}

var errOverflow = errors.New("polyhedron: int64 overflow")

// ddState is the double description state for the cone C described above.
// Constraint k < d is a_k >= 0; constraint d+j is a·v_j − b >= 0 for the
// j-th vertex in insertion order.
type ddState struct {
	d, dim  int // dim = d+1
	verts   [][]int
	words   int
	small   [][]int64    // ray coordinates (int64 mode)
	large   [][]*big.Int // ray coordinates (big mode), used when useBig
	useBig  bool
	tight   [][]uint64 // tight constraint sets
	maxRays int
	// ctx is the caller's context, checked before each added constraint.
	ctx     context.Context
	zobrist []uint64 // random word per constraint (hashing of tight sets)
}

func enumerateFacets(ctx context.Context, d int, verts [][]int, maxRays int) ([]Facet, [][]uint64, error) {
	st := &ddState{d: d, dim: d + 1, verts: verts, words: (d + len(verts) + 63) / 64, maxRays: maxRays, ctx: ctx}
	err := st.run()
	if errors.Is(err, errOverflow) {
		st = &ddState{d: d, dim: d + 1, verts: verts, words: (d + len(verts) + 63) / 64, maxRays: maxRays, useBig: true, ctx: ctx}
		err = st.run()
	}
	if err != nil {
		return nil, nil, err
	}
	return st.collect()
}

func (st *ddState) coords(r int) []*big.Int {
	if st.useBig {
		return st.large[r]
	}
	out := make([]*big.Int, st.dim)
	for i, x := range st.small[r] {
		out[i] = big.NewInt(x)
	}
	return out
}

func (st *ddState) constraint(k int) (coord int, v []int) {
	if k < st.d {
		return k, nil
	}
	return -1, st.verts[k-st.d]
}

func (st *ddState) run() error {
	d := st.d
	rng := rand.New(rand.NewPCG(1, 2))
	st.zobrist = make([]uint64, d+len(st.verts))
	for k := range st.zobrist {
		st.zobrist[k] = rng.Uint64()
	}
	// initial rays for constraints 0..d-1 and vertex 0
	v0 := st.verts[0]
	addRay := func(c []int64, tight []uint64) {
		if st.useBig {
			b := make([]*big.Int, len(c))
			for i, x := range c {
				b[i] = big.NewInt(x)
			}
			st.large = append(st.large, b)
		} else {
			st.small = append(st.small, c)
		}
		st.tight = append(st.tight, tight)
	}
	{
		c := make([]int64, st.dim)
		c[d] = -1
		t := make([]uint64, st.words)
		for k := 0; k < d; k++ {
			setBit(t, k)
		}
		addRay(c, t)
	}
	for i := 0; i < d; i++ {
		c := make([]int64, st.dim)
		c[i] = 1
		c[d] = int64(v0[i])
		t := make([]uint64, st.words)
		for k := 0; k < d; k++ {
			if k != i {
				setBit(t, k)
			}
		}
		setBit(t, d)
		addRay(c, t)
	}
	for j := 1; j < len(st.verts); j++ {
		if err := contextErr(st.ctx); err != nil {
			return err
		}
		if err := st.addConstraint(d + j); err != nil {
			return err
		}
	}
	return nil
}

func setBit(s []uint64, k int)      { s[k/64] |= 1 << (k % 64) }
func hasBit(s []uint64, k int) bool { return s[k/64]&(1<<(k%64)) != 0 }

// eval returns the sign of constraint k (a vertex constraint) at ray r.
func (st *ddState) value(r int, v []int) (int64, *big.Int, error) {
	d := st.d
	if st.useBig {
		c := st.large[r]
		s := new(big.Int).Neg(c[d])
		var t big.Int
		for i, x := range v {
			if x != 0 && c[i].Sign() != 0 {
				t.Mul(c[i], t.SetInt64(int64(x)))
				s.Add(s, &t)
			}
		}
		return 0, s, nil
	}
	c := st.small[r]
	s, ok := checkedDot(c[:d], v)
	if !ok {
		return 0, nil, errOverflow
	}
	ns := s - c[d]
	if (c[d] > 0 && ns > s) || (c[d] < 0 && ns < s) {
		return 0, nil, errOverflow
	}
	return ns, nil, nil
}

func (st *ddState) addConstraint(k int) error {
	_, v := st.constraint(k)
	nr := len(st.tight)
	sign := make([]int8, nr)
	vals := make([]int64, nr)
	bigVals := make([]*big.Int, nr)
	var pos, neg []int
	for r := 0; r < nr; r++ {
		x, bx, err := st.value(r, v)
		if err != nil {
			return err
		}
		s := 0
		if bx != nil {
			s = bx.Sign()
			bigVals[r] = bx
		} else {
			vals[r] = x
			switch {
			case x > 0:
				s = 1
			case x < 0:
				s = -1
			}
		}
		sign[r] = int8(s)
		switch s {
		case 1:
			pos = append(pos, r)
		case -1:
			neg = append(neg, r)
		}
	}
	if len(neg) == 0 {
		for r := 0; r < nr; r++ {
			if sign[r] == 0 {
				setBit(st.tight[r], k)
			}
		}
		return nil
	}
	// New rays from adjacent (pos, neg) pairs.
	need := st.dim - 2
	var newSmall [][]int64
	var newLarge [][]*big.Int
	var newTight [][]uint64
	z := make([]uint64, st.words)
	var failed error
	try := func(p, q int) bool {
		tp, tq := st.tight[p], st.tight[q]
		cnt := 0
		for w := range z {
			z[w] = tp[w] & tq[w]
			cnt += bits.OnesCount64(z[w])
		}
		if cnt < need || !st.adjacent(z, cnt) {
			return true
		}
		nt := slices.Clone(z)
		setBit(nt, k)
		if st.useBig {
			newLarge = append(newLarge, combineBig(st.large[p], st.large[q], bigVals[p], bigVals[q]))
		} else {
			c, ok := combine64(st.small[p], st.small[q], vals[p], vals[q])
			if !ok {
				failed = errOverflow
				return false
			}
			newSmall = append(newSmall, c)
		}
		newTight = append(newTight, nt)
		if nr+len(newTight) > st.maxRays {
			failed = fmt.Errorf("%w: more than %d rays in the double description method", ErrTooLarge, st.maxRays)
			return false
		}
		return true
	}
	// Candidate pairs share at least dim−2 tight constraints. Rays whose
	// tight set T has few subsets of size dim−2 are indexed by the Zobrist
	// hashes of those subsets, so that such pairs are found by lookup; pairs
	// involving a ray with many such subsets (degenerate) are scanned.
	// Collisions only add candidates; the count check above filters them.
	// The smaller side is indexed, the larger one probes.
	small, large := neg, pos
	pair := func(x, y int) bool { return try(y, x) } // x from small (neg), y from large (pos)
	if len(pos) < len(neg) {
		small, large = pos, neg
		pair = try
	}
	index := make(map[uint64][]int32)
	var degSmall, simpleSmall []int
	var elems []int
	for _, x := range small {
		elems = st.elems(x, elems[:0])
		r := len(elems) - need
		if r < 0 {
			continue // shares fewer than dim−2 constraints with anything
		}
		if binomialCapped(len(elems), r, maxSubsets) > maxSubsets {
			degSmall = append(degSmall, x)
			continue
		}
		simpleSmall = append(simpleSmall, x)
		h := st.hash(elems)
		forSubsets(elems, r, func(removed uint64) {
			index[h^removed] = append(index[h^removed], int32(x))
		}, st.zobrist)
	}
	var seen []int32
	for _, y := range large {
		elems = st.elems(y, elems[:0])
		r := len(elems) - need
		if r < 0 {
			continue
		}
		if binomialCapped(len(elems), r, maxSubsets) > maxSubsets {
			for _, x := range simpleSmall {
				if !pair(x, y) {
					return failed
				}
			}
			continue
		}
		h := st.hash(elems)
		seen = seen[:0]
		ok := true
		forSubsets(elems, r, func(removed uint64) {
			if !ok {
				return
			}
			for _, x := range index[h^removed] {
				if slices.Contains(seen, x) {
					continue
				}
				seen = append(seen, x)
				if !pair(int(x), y) {
					ok = false
					return
				}
			}
		}, st.zobrist)
		if !ok {
			return failed
		}
	}
	for _, x := range degSmall {
		for _, y := range large {
			if !pair(x, y) {
				return failed
			}
		}
	}
	// Keep rays with value >= 0.
	keep := 0
	for r := 0; r < nr; r++ {
		if sign[r] < 0 {
			continue
		}
		if sign[r] == 0 {
			setBit(st.tight[r], k)
		}
		st.tight[keep] = st.tight[r]
		if st.useBig {
			st.large[keep] = st.large[r]
		} else {
			st.small[keep] = st.small[r]
		}
		keep++
	}
	st.tight = append(st.tight[:keep], newTight...)
	if st.useBig {
		st.large = append(st.large[:keep], newLarge...)
	} else {
		st.small = append(st.small[:keep], newSmall...)
	}
	return nil
}

// adjacent reports whether the constraints in z (cnt of them) have rank dim−2.
func (st *ddState) adjacent(z []uint64, cnt int) bool {
	d := st.d
	// Coordinate constraints a_i >= 0 in z fix a_i = 0: drop those columns.
	var cols []int
	for i := 0; i < d; i++ {
		if !hasBit(z, i) {
			cols = append(cols, i)
		}
	}
	nc := d - len(cols)
	need := st.dim - 2 - nc
	if need <= 0 {
		return need == 0
	}
	var rows [][]int64
	for w := range z {
		for x := z[w]; x != 0; x &= x - 1 {
			k := 64*w + bits.TrailingZeros64(x)
			if k < d {
				continue
			}
			v := st.verts[k-d]
			r := make([]int64, len(cols)+1)
			for t, i := range cols {
				r[t] = int64(v[i])
			}
			r[len(cols)] = -1
			rows = append(rows, r)
		}
	}
	if len(rows) < need {
		return false
	}
	return rankInt(rows, len(cols)+1) == need
}

// maxSubsets bounds the number of (dim−2)-subsets of a tight set for which a
// ray is indexed by hashing instead of scanned.
const maxSubsets = 64

// elems appends the indices of the tight constraints of ray r to buf.
func (st *ddState) elems(r int, buf []int) []int {
	for w, x := range st.tight[r] {
		for ; x != 0; x &= x - 1 {
			buf = append(buf, 64*w+bits.TrailingZeros64(x))
		}
	}
	return buf
}

// hash is the Zobrist hash (xor of per-constraint random words) of a set.
func (st *ddState) hash(elems []int) uint64 {
	var h uint64
	for _, k := range elems {
		h ^= st.zobrist[k]
	}
	return h
}

// forSubsets calls f with the xor of the Zobrist words of every r-subset of
// elems (the elements removed to leave a subset of size len(elems)−r).
func forSubsets(elems []int, r int, f func(uint64), zob []uint64) {
	var rec func(start, left int, h uint64)
	rec = func(start, left int, h uint64) {
		if left == 0 {
			f(h)
			return
		}
		for i := start; i <= len(elems)-left; i++ {
			rec(i+1, left-1, h^zob[elems[i]])
		}
	}
	rec(0, r, 0)
}

// binomialCapped returns C(n, r), or limit+1 if it exceeds limit.
func binomialCapped(n, r, limit int) int {
	if r > n-r {
		r = n - r
	}
	c := 1
	for i := 1; i <= r; i++ {
		c = c * (n - r + i) / i
		if c > limit {
			return limit + 1
		}
	}
	return c
}

func combine64(p, q []int64, vp, vq int64) ([]int64, bool) {
	// r = vp·q − vq·p (vp > 0, vq < 0): value vp·vq − vq·vp = 0 on the new constraint.
	out := make([]int64, len(p))
	var g uint64
	for i := range p {
		x, ok1 := mul64(vp, q[i])
		y, ok2 := mul64(-vq, p[i])
		if !ok1 || !ok2 {
			return nil, false
		}
		s := x + y
		if (y > 0 && s < x) || (y < 0 && s > x) {
			return nil, false
		}
		out[i] = s
		g = gcd64(g, uint64(abs64(s)))
	}
	if g > 1 {
		for i := range out {
			out[i] /= int64(g)
		}
	}
	return out, true
}

func gcd64(a, b uint64) uint64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func combineBig(p, q []*big.Int, vp, vq *big.Int) []*big.Int {
	out := make([]*big.Int, len(p))
	g := new(big.Int)
	nvq := new(big.Int).Neg(vq)
	var t big.Int
	for i := range p {
		out[i] = new(big.Int).Mul(vp, q[i])
		t.Mul(nvq, p[i])
		out[i].Add(out[i], &t)
		g.GCD(nil, nil, g, new(big.Int).Abs(out[i]))
	}
	if g.Sign() > 0 && g.Cmp(big.NewInt(1)) != 0 {
		for i := range out {
			out[i].Quo(out[i], g)
		}
	}
	return out
}

// collect turns the extreme rays into sorted facets and per-vertex incidence.
func (st *ddState) collect() ([]Facet, [][]uint64, error) {
	d := st.d
	var fs []Facet
	for r := range st.tight {
		c := st.coords(r)
		allZero := true
		for _, x := range c[:d] {
			if x.Sign() != 0 {
				allZero = false
			}
		}
		if allZero {
			continue // the ray (0, −1): not a facet
		}
		a, b := primitive(c[:d], c[d])
		f := Facet{Normal: a, RHS: b}
		for i := 0; i < d; i++ {
			if a[i].Sign() == 0 {
				f.Rays = append(f.Rays, i)
			}
		}
		for j := range st.verts {
			if hasBit(st.tight[r], d+j) {
				f.Vertices = append(f.Vertices, j)
			}
		}
		fs = append(fs, f)
	}
	slices.SortFunc(fs, func(x, y Facet) int {
		for i := range x.Normal {
			if c := x.Normal[i].Cmp(y.Normal[i]); c != 0 {
				return c
			}
		}
		return x.RHS.Cmp(y.RHS)
	})
	fw := (len(fs) + 63) / 64
	inc := make([][]uint64, len(st.verts))
	for j := range inc {
		inc[j] = make([]uint64, fw)
	}
	for k, f := range fs {
		for _, j := range f.Vertices {
			setBit(inc[j], k)
		}
	}
	return fs, inc, nil
}
