// Package polyhedron computes with Newton polyhedra in exact arithmetic.
//
// For a finite set A of exponent vectors in Z^d with nonnegative entries, the
// Newton polyhedron is P = conv(A) + R^d_{>=0}. New only checks and sorts A;
// the methods then answer the questions needed for learning coefficients
// (real log canonical thresholds) of a function whose support is A: the
// Newton distance along a direction, the face of P hit there and its
// codimension (the multiplicity), and for moderate dimension the full facet
// description and the lattice of compact faces. The package knows nothing
// about polynomials: it takes exponent vectors as [][]int.
//
// # Work on demand
//
// Nothing is computed before a question needs it. Distance and FaceAt solve
// their LPs over the input points themselves (a point that is no vertex
// changes no LP over P) and find the vertices of the face they return among
// the points on it only; Exposes does the same. The Pareto-minimal points and
// the vertices of P (Minimal, Vertices) are computed once, on first use by a
// method that needs them (Vertices, Minimal, Facets, CompactFaces,
// CompactFaceAt, Covers, NormalConeMin, FacetsContaining), and cached. So the
// distance and the multiplicity of 10^5 points in 20 variables cost a few
// LPs, while their 32,000 vertices would take about 24 s. Indices in Face,
// Facet and Hit refer to Points(), the input without duplicates in
// lexicographic order; a face lists only vertices of P.
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
// rows and O(N·d) integer work per pricing round for N points (the vertices
// once they are known).
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
// ErrTooLarge reports when a bound is hit. Methods that can take long take a
// context.Context first and stop with an error wrapping ctx.Err() when it is
// done; a cancelled computation is not cached.
//
// # Linear programming
//
// LP is a general exact linear program in standard form, solved by the
// two-phase simplex method with an anti-cycling rule; the Newton-specific
// methods use the same exact tableau.
//
// # Concurrency
//
// A *Newton holds only its points after New; the vertices, facets and
// compact faces are computed once on first use under locks, and all methods
// may be called concurrently. A *Face is not modified by the
// package after it is returned.
package polyhedron
