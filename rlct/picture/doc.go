// Package picture draws the Newton polyhedron P(K) of a function K in two or
// three variables as an SVG picture, from the exact description that
// rlct.Describe returns: the polyhedron cut off at a frame, its vertices
// labelled with the monomials of K, the ray from the origin along τ with the
// point t_τ·τ where it meets P(K), the principal face highlighted, the
// compact faces that are degenerate or undetermined marked, and a caption
// with λ, θ and their status (exact, upper bound, or not a bound).
//
// The geometry comes from the library's exact facets. A compact facet is
// drawn as the convex hull of its vertices, ordered around its normal by
// exact orientation tests; an unbounded facet as its vertices and its ray
// directions, each ray stopped at the far side of the frame. The frame's
// sides are integers beyond every vertex, so the corners of every drawn
// polygon are integer points; floating point enters only when they are
// mapped to the page. Three variables are drawn in a fixed oblique
// projection.
//
// The colours are the Okabe–Ito palette, which readers with the common
// colour-vision deficiencies can tell apart, and no element is told apart
// by colour alone: each also differs by line style, marker or label.
package picture
