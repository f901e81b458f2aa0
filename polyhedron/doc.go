// Package polyhedron computes with Newton polyhedra in exact arithmetic.
//
// For a finite set A of exponent vectors in Z^d with nonnegative entries, the
// Newton polyhedron is P = conv(A) + R^d_{>=0}. New builds it once (Pareto
// filter, then the vertices); the methods then answer the questions needed for
// learning coefficients (real log canonical thresholds) of a function whose
// support is A: the Newton distance along a direction, the face of P hit there
// and its codimension (the multiplicity), and for moderate dimension the full
// facet description and the lattice of compact faces. The package knows
// nothing about polynomials: it takes exponent vectors as [][]int.
//
// # Exactness
//
// Every answer is exact: rationals and integers from math/big, with int64 fast
// paths that detect overflow and fall back to math/big. Floating point is used
// only to propose candidates (an LP basis, a separating normal, convex
// weights) that are then verified, or replaced, by exact computation; a float
// result is never returned.
//
// # Distance and faces
//
// Distance solves the ray-shooting linear program min{t : t·τ ∈ P} by column
// generation over the vertices, with an exact simplex master problem and exact
// integer pricing of every vertex, and returns a self-contained certificate:
// the hit point as a convex combination of vertices plus an orthant part, and
// a supporting hyperplane Normal·x >= RHS valid on every input point. The face
// holding the hit point in its relative interior is then found without
// enumerating facets, from the generators that some representation of the
// point uses (see FaceAt), so that the codimension is right also at non-simple
// vertices, where more than codim facets meet. Cost: a few exact LPs with d+1
// rows and O(N·d) integer work per pricing round for N vertices.
//
// # Face operations without facets
//
// For computations that visit only some faces, the faces can be reached
// without the facet enumeration: Face.Side and Face.Contains evaluate a
// face's exposing normal on a point, Newton.Exposes checks such a normal,
// CompactFaceAt finds the compact face holding a point, Covers lists the
// compact faces one dimension up from a compact face (about one small float
// LP with an exact certificate per vertex), and NormalConeMin minimises a
// linear function over the normal cone of a face. Their cost grows with the
// number of vertices, not with the number of faces or facets.
//
// # Facets and compact faces
//
// Facets enumerates all facets by the double description method in integer
// arithmetic, and CompactFaces builds the compact faces of every dimension
// with their inclusions from the facet–vertex incidences. These full
// enumerations can grow exponentially with d; Limits bounds their work and
// ErrTooLarge reports when a bound is hit.
//
// # Linear programming
//
// LP is a general exact linear program in standard form, solved by the
// two-phase simplex method with an anti-cycling rule; the Newton-specific
// methods use the same exact tableau.
//
// # Concurrency
//
// A *Newton is immutable after New, except for the facet enumeration and the
// compact faces, which are computed once on first use under sync.Once; all
// methods may be called concurrently. A *Face is not modified by the
// package after it is returned.
package polyhedron
