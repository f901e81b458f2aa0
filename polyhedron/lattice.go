package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/bits"
	"slices"
)

// Lattice is the set of compact faces of P of every dimension (vertices
// included), with inclusions.
type Lattice struct {
	Faces []*Face // ordered by dimension, then by vertex set lexicographically
	Sub   [][]int // Sub[i]: indices of the faces of dimension Dim-1 contained in Faces[i]
}

// CompactFaces returns the compact faces of P with their inclusions. It
// enumerates the facets first (see Facets) and returns their error, or an
// error wrapping ErrTooLarge when more than Limits.MaxFaces faces arise
// (cached), or one wrapping ctx.Err() when ctx is done first (not cached;
// ctx is checked before each face is extended). The result is computed
// once and shared; the caller must not modify it.
//
// Algorithm: a face is identified by its closure, the set of facets
// containing it; the vertices and rays of a face are those common to all
// its facets, and it is compact iff no ray is common, i.e. iff the sum of
// its facet normals (used as Face.Normal) is strictly positive. Starting
// from the vertices, the compact faces of dimension k+1 containing a compact
// face G of dimension k are exactly the closures of G ∪ {u} (u a vertex not
// in G) that are compact and of dimension k+1; dimensions are exact ranks.
// Cost: O(F·V·(V/64 + #facets/64)) bitset work for F compact faces and V
// vertices, plus one small rank per candidate.
func (n *Newton) CompactFaces(ctx context.Context) (*Lattice, error) {
	n.latticeMu.Lock()
	defer n.latticeMu.Unlock()
	if n.latticeDone {
		return n.lattice, n.latticeErr
	}
	lat, err := n.buildLattice(ctx)
	if err != nil && !errors.Is(err, ErrTooLarge) {
		return nil, err
	}
	n.lattice, n.latticeErr, n.latticeDone = lat, err, true
	return lat, err
}

// buildLattice works with indices into n.vertices (0 … nv−1) and turns
// them into indices into Points() for the faces it returns.
func (n *Newton) buildLattice(ctx context.Context) (*Lattice, error) {
	fs, err := n.Facets(ctx)
	if err != nil {
		return nil, err
	}
	d := n.d
	nv := len(n.vertices)
	vertexPos := make(map[int]int, nv) // index into Points() -> index into n.vertices
	for k, j := range n.vertexIdx {
		vertexPos[j] = k
	}
	facetsOf := func(k int) []uint64 { return n.vertexFacets[n.vertexIdx[k]] }
	toPoints := func(list []int) []int {
		out := make([]int, len(list))
		for i, k := range list {
			out[i] = n.vertexIdx[k]
		}
		return out
	}
	vw := (nv + 63) / 64
	fw := (len(fs) + 63) / 64
	// Per facet: vertex bitset. Per vertex: facet bitset (n.vertexFacets).
	facetVerts := make([][]uint64, len(fs))
	for k, f := range fs {
		facetVerts[k] = make([]uint64, vw)
		for _, j := range f.Vertices {
			setBit(facetVerts[k], vertexPos[j])
		}
	}
	// raysOf(facetSet) is empty iff for every coordinate some facet has a_i > 0.
	positive := make([][]uint64, d) // positive[i]: facets with a_i > 0
	for i := range positive {
		positive[i] = make([]uint64, fw)
	}
	for k, f := range fs {
		for i, a := range f.Normal {
			if a.Sign() > 0 {
				setBit(positive[i], k)
			}
		}
	}
	compact := func(fset []uint64) bool {
		for i := 0; i < d; i++ {
			hit := false
			for w := range fset {
				if fset[w]&positive[i][w] != 0 {
					hit = true
					break
				}
			}
			if !hit {
				return false
			}
		}
		return true
	}
	type node struct {
		verts []uint64 // vertex bitset
		fset  []uint64 // facets containing the face
		list  []int
		dim   int
	}
	closure := func(fset []uint64) []uint64 {
		vs := make([]uint64, vw)
		for w := range vs {
			vs[w] = ^uint64(0)
		}
		if nv%64 != 0 {
			vs[vw-1] = (1 << (nv % 64)) - 1
		}
		for w := range fset {
			for x := fset[w]; x != 0; x &= x - 1 {
				k := 64*w + bits.TrailingZeros64(x)
				for t := range vs {
					vs[t] &= facetVerts[k][t]
				}
			}
		}
		return vs
	}
	listOf := func(s []uint64) []int {
		var out []int
		for w := range s {
			for x := s[w]; x != 0; x &= x - 1 {
				out = append(out, 64*w+bits.TrailingZeros64(x))
			}
		}
		return out
	}
	var levels [][]*node
	index := map[string]int{} // vertex-set key -> index within its level
	var level []*node
	for j := 0; j < nv; j++ {
		vs := make([]uint64, vw)
		setBit(vs, j)
		level = append(level, &node{verts: vs, fset: slices.Clone(facetsOf(j)), list: []int{j}, dim: 0})
	}
	subs := [][][]int{make([][]int, nv)}
	total := nv
	for len(level) > 0 {
		levels = append(levels, level)
		clear(index)
		var next []*node
		var nextSub [][]int
		for gi, g := range level {
			if err := contextErr(ctx); err != nil {
				return nil, err
			}
			for u := 0; u < nv; u++ {
				if hasBit(g.verts, u) {
					continue
				}
				fset := make([]uint64, fw)
				for w := range fset {
					fset[w] = g.fset[w] & facetsOf(u)[w]
				}
				if !compact(fset) {
					continue
				}
				vs := closure(fset)
				key := bitsKey(vs)
				if k, ok := index[key]; ok {
					if k >= 0 && !slices.Contains(nextSub[k], gi) {
						nextSub[k] = append(nextSub[k], gi)
					}
					continue
				}
				list := listOf(vs)
				if n.faceDim(toPoints(list), nil) != g.dim+1 {
					index[key] = -1
					continue
				}
				index[key] = len(next)
				next = append(next, &node{verts: vs, fset: fset, list: list, dim: g.dim + 1})
				nextSub = append(nextSub, []int{gi})
				total++
				if total > n.limits.MaxFaces {
					return nil, fmt.Errorf("%w: more than %d compact faces", ErrTooLarge, n.limits.MaxFaces)
				}
			}
		}
		level = next
		subs = append(subs, nextSub)
	}
	// Order each level by vertex list and renumber.
	lat := &Lattice{}
	offset := 0
	var prevPos []int // position in the final order of each node of the previous level
	for li, lv := range levels {
		order := make([]int, len(lv))
		for k := range order {
			order[k] = k
		}
		slices.SortFunc(order, func(a, b int) int { return slices.Compare(lv[a].list, lv[b].list) })
		pos := make([]int, len(lv))
		for r, k := range order {
			pos[k] = offset + r
		}
		for _, k := range order {
			g := lv[k]
			f := &Face{Vertices: toPoints(g.list), Dim: g.dim}
			// Normal: sum of the normals of the facets containing the face.
			sum := make([]*big.Int, d)
			for i := range sum {
				sum[i] = new(big.Int)
			}
			rhs := new(big.Int)
			for _, fi := range listOf(g.fset) {
				f.Facets = append(f.Facets, fi)
				for i := range sum {
					sum[i].Add(sum[i], fs[fi].Normal[i])
				}
				rhs.Add(rhs, fs[fi].RHS)
			}
			f.Normal, f.RHS = primitive(sum, rhs)
			lat.Faces = append(lat.Faces, f)
			var sub []int
			if li > 0 {
				for _, s := range subs[li][k] {
					sub = append(sub, prevPos[s])
				}
				slices.Sort(sub)
			}
			lat.Sub = append(lat.Sub, sub)
		}
		prevPos = pos
		offset += len(lv)
	}
	return lat, nil
}
