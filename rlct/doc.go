// Package rlct bounds, and when it can certify them computes exactly, the
// learning coefficient λ (the real log canonical threshold) and its
// multiplicity θ of a function K(w) at a point, through the Newton
// polyhedron of K.
//
// These numbers govern the asymptotics of the marginal likelihood of a
// singular statistical model whose Kullback–Leibler divergence from the
// truth is K:
//
//	−log Z_n = n·S_n + λ·log n − (θ−1)·log log n + O_p(1)
//
// (Watanabe 2009, Algebraic Geometry and Statistical Learning Theory). They
// are asymptotic statements about the model, not about a finite sample.
//
// # The Newton value
//
// For a prior that is locally Π |w_i − w*_i|^{h_i}, let τ_i = h_i + 1 where
// w*_i = 0 after translation (τ_i = 1 elsewhere, where the prior factor is
// smooth and positive). Let t_τ be the least t with t·τ in the Newton
// polyhedron P(K) = conv(supp K) + R^d_{≥0} of K translated to the point.
// The Newton value is λ = 1/t_τ, with θ the codimension of the face of P(K)
// that holds t_τ·τ in its relative interior. It bounds the true pair from
// above in the order where a smaller λ, or an equal λ with a larger θ, is
// smaller (see Less).
//
// # The certificate
//
// The Newton value is the learning coefficient when K is nondegenerate over
// the reals: for every compact face σ of P(K) the face polynomial K_σ has no
// zero in the real torus (R∖{0})^d (Varchenko 1976, Newton polyhedra and
// estimation of oscillating integrals, Funct. Anal. Appl. 10; in the form
// with a monomial prior, Arnold, Gusein-Zade & Varchenko 1988, Singularities
// of Differentiable Maps Vol. II). Bound decides every compact face with
// sound tests only, and records which one applied:
//
//   - a vertex is a single term and never vanishes on the torus (K ≥ 0 is
//     checked first: a vertex term with a negative coefficient or an odd
//     exponent, or an edge polynomial with a real root of odd multiplicity,
//     makes K negative near the point, which is an error);
//   - a face polynomial whose terms all have positive coefficients and even
//     exponents is positive on the torus;
//   - on an edge the face polynomial is w^v·p(w^u) with p univariate and
//     p(0) ≠ 0; as w^u takes every non-zero real value on the torus, the
//     edge is degenerate exactly when p has a real root, which Sturm
//     sequences decide in exact arithmetic (the witness names the root and
//     a torus point);
//   - in sum-of-squares form, a face on which some generator's part is
//     c·w^v·p(w^u) with p free of real roots (a single monomial included)
//     has no common zero.
//
// Any other face is undetermined. The status is Exact only when every
// compact face is certified nondegenerate; otherwise it is UpperBound and
// Result.Reasons says which face failed or could not be decided. A
// degenerate face does not make the bound strict, and nothing here claims
// that it does.
//
// # Sum-of-squares form
//
// Problem.Generators g_1, …, g_r stand for K = Σ g_i². Then P(K) = 2·P(I)
// for the ideal I = ⟨g_1, …, g_r⟩, the face polynomials are Σ (g_i on the
// face)², and nothing is expanded.
//
// # Truncated series
//
// Dropping terms can only shrink P(K), so the value of a truncated series
// need not bound the full K. When Problem.Truncated is set, Bound checks
// that every omitted term (total degree above Problem.Order) lies strictly
// above every optimal supporting hyperplane at t_τ·τ, and, for Exact, above
// every compact face; see TruncationReport.
//
// # Numerical estimates
//
// EstimateThreshold gives an independent numerical estimate of λ and θ by
// nested sampling, with standard errors. It is an estimate, not a proof: it
// is labelled as such everywhere, and it never changes a Status.
package rlct
