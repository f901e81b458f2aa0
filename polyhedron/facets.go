package polyhedron

import "math/big"

// Facet is an inequality a·x >= b (a >= 0, primitive integer vector) that defines a facet of P.
type Facet struct {
	Normal   []*big.Int
	RHS      *big.Int
	Vertices []int
	Rays     []int
}

// Lattice is the set of compact faces of P of every dimension (vertices included), with inclusions.
type Lattice struct {
	Faces []*Face
	Sub   [][]int
}

// attachFacets fills f.Facets when the facets have already been enumerated.
func (n *Newton) attachFacets(f *Face) {}
