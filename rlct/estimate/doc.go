// Package estimate gives numerical estimates of the learning coefficient λ and
// its multiplicity θ of a nonnegative function K at a point, by nested
// sampling, to cross-check the exact Newton-polyhedron results of package rlct.
//
// Everything here is a statistical estimate, not a proof: the numbers carry
// standard errors that cover only the statistical error, and nothing in this
// package changes an rlct.Status. Package rlct does not depend on it.
//
// The quantity estimated is the asymptotic behaviour of the local zeta integral
//
//	Z(n) = ∫_W exp(−n·K(w)) φ(w) dw ≈ C·n^(−λ)·(log n)^(θ−1)   (n → ∞)
//
// on a box W with the monomial prior φ(w) = ∏|w_i|^(h_i) (Watanabe 2009,
// Algebraic Geometry and Statistical Learning Theory, Cambridge University
// Press; from memory). Its logarithmic derivative is the curve
//
//	y(n) := n·E_n[K] = −d log Z / d log n,
//
// where E_n is the expectation under the density ∝ exp(−nK)·φ. The estimator
// computes y(n) over several decades of n from nested-sampling runs and fits
// the asymptotic form of that curve; see Run.
//
// Run takes any Evaluator of K in coordinates where the point is the origin.
// Problem takes an rlct.Problem, translates it to its point exactly and
// compiles it (NewProblemEvaluator), and reads its prior the way rlct.Bound
// does (Prior). Result.Compare sets an estimate beside the Newton value of
// rlct.Bound, reading its status.
package estimate
