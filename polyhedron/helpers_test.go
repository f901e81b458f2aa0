package polyhedron

import (
	"context"
	"encoding/binary"
	"iter"
	"slices"
	"testing"
)

// mustVertices returns n's vertices, failing the test on error.
func mustVertices(t testing.TB, n *Newton) [][]int {
	t.Helper()
	v, err := n.Vertices(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// mustMinimal returns n's Pareto-minimal points, failing the test on error.
func mustMinimal(t testing.TB, n *Newton) [][]int {
	t.Helper()
	m, err := n.Minimal(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// vertexPoints returns the vertices of n as a map from their index in
// Points() (the index space of faces and facets) to their coordinates.
func vertexPoints(t testing.TB, n *Newton) map[int][]int {
	t.Helper()
	isV := map[string]bool{}
	for _, v := range mustVertices(t, n) {
		isV[key(v)] = true
	}
	out := map[int][]int{}
	for j, p := range n.Points() {
		if isV[key(p)] {
			out[j] = p
		}
	}
	return out
}

func key(p []int) string {
	b := make([]byte, 0, 8*len(p))
	for _, x := range p {
		b = binary.BigEndian.AppendUint64(b, uint64(x))
	}
	return string(b)
}

// vertexIndexList returns the indices into Points() of n's vertices,
// ascending.
func vertexIndexList(t testing.TB, n *Newton) []int {
	t.Helper()
	var out []int
	for j := range vertexPoints(t, n) {
		out = append(out, j)
	}
	slices.Sort(out)
	return out
}

// vertexSeq yields (index into Points(), coordinates) for each vertex of n,
// in ascending index order.
func vertexSeq(t testing.TB, n *Newton) iter.Seq2[int, []int] {
	idx := vertexIndexList(t, n)
	return func(yield func(int, []int) bool) {
		for _, j := range idx {
			if !yield(j, n.Points()[j]) {
				return
			}
		}
	}
}

// vertexSlice returns a slice parallel to Points() holding the vertices
// and nil for the other points.
func vertexSlice(t testing.TB, n *Newton) [][]int {
	out := make([][]int, len(n.Points()))
	for j, v := range vertexSeq(t, n) {
		out[j] = v
	}
	return out
}
