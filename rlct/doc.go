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
// # Problems and points
//
// A Problem holds K (or its generators in sum-of-squares form), the prior
// and the points where the learning coefficient is wanted; Spec reads one
// from text, the way the command line and batch records write it. Bound is
// the one entry point: at one point (the origin when none is given) it
// returns the answer there, at several the minimum with each point's answer
// (Result.Locals). Describe answers the same problem and writes out the
// Newton polyhedron at each point. Problem.Locals gives the problem as both
// see it at each point: K in the offsets from the point, the weights τ, and
// notes such as a prior exponent that does not count there.
//
// # The Newton value
//
// The prior is a density proportional to Π |w_i|^{h_i} times a smooth
// positive function, written in the coordinates of K (Problem.Prior). At a
// point w*, translated to the origin, let τ_i = h_i + 1 where w*_i = 0 and
// τ_i = 1 elsewhere (there |w_i|^{h_i} is smooth and positive). Let t_τ be
// the least t with t·τ in the Newton polyhedron P(K) = conv(supp K) +
// R^d_{≥0} of K translated to the point. The Newton value is λ = 1/t_τ,
// with θ the codimension of the face of P(K) that holds t_τ·τ in its
// relative interior (the principal face).
//
// # Statuses
//
// A Result has one of three statuses, and claims exactly what it says:
//
//   - Exact: (λ, θ) is the learning coefficient and its multiplicity.
//   - UpperBound: the Newton value bounds the true pair from above in the
//     order where a smaller λ, or an equal λ with a larger θ, is smaller
//     (see Less): the true λ is at most λ, and at equal λ the true θ is at
//     least θ. A degenerate face does not make the bound strict, and
//     nothing here claims that it does.
//   - Uncertified: the value of a truncated series whose omitted terms
//     could change it. It is not known to bound anything and may lie below
//     the true λ; Truncation says which order would certify it.
//
// # The certificate
//
// The Newton value is the learning coefficient when K is nondegenerate over
// the reals: for every compact face σ of P(K) the face polynomial K_σ has no
// zero in the real torus (R∖{0})^d (Varchenko 1976, Newton polyhedra and
// estimation of oscillating integrals, Funct. Anal. Appl. 10; in the form
// with a monomial prior, Arnold, Gusein-Zade & Varchenko 1988, Singularities
// of Differentiable Maps Vol. II).
//
// Most faces need no work: a face polynomial whose terms all have positive
// coefficients and even exponents is positive on the torus. So only the
// faces holding an unsafe point (a negative or odd term; in sum-of-squares
// form the midpoint of two terms of one generator) are decided, found from
// the unsafe points upwards: the smallest face holding each (an exact LP),
// then the faces above it (see Certificate). A sum of squared monomials,
// however large, is Exact without examining any face but the principal one.
// Each examined face is decided by the first rule of an ordered table that
// applies (vertex, even positive terms, a generator without torus zeros,
// edges by exact Sturm sequences; see the rule_*.go files for each rule's
// soundness argument); a face no rule decides is Undetermined. The search
// stops at the first degenerate face (with a witness, the status is settled
// as UpperBound) and at a budget of faces examined or the context's deadline
// (UpperBound, with the reason "budget reached"). Options.AllFaces decides
// and lists every compact face instead; the status is the same.
//
// Before the rules, every examined face in polynomial form gets a sign
// check: a torus point where K_σ < 0 makes K negative near the point
// (ErrNegative, with the point). On vertices and edges the check is exact
// and complete; on larger faces it is a seeded search whose candidates are
// confirmed in exact arithmetic, and a face where it finds nothing keeps its
// verdict.
//
// # Sum-of-squares form
//
// Problem.Generators g_1, …, g_r stand for K = Σ g_i². Then P(K) = 2·P(I)
// for the ideal I = ⟨g_1, …, g_r⟩, the face polynomials are Σ (g_i on the
// face)², and nothing is expanded.
//
// # Changes of coordinates
//
// λ and θ do not change under an analytic change of coordinates at the
// point that keeps the prior smooth and positive where it moves a
// coordinate, while the Newton value of K may. Before the polyhedron is
// read, Bound therefore splits off the regular directions at the point
// (generators, or the quadratic part, of full linear rank are solved for as
// many coordinates, exactly or as certified series, and λ = r/2 + λ(core),
// θ = θ(core); Result.Reduction) and repairs degenerate edges along their
// rational roots (x_j → x_j + c·w^m; Result.Repair); in two variables with a
// uniform prior, Varchenko's criterion for adapted coordinates can certify λ
// alone (Result.LambdaCertified). Every change is listed (Result.Changes)
// with what is needed to replay it, and a changed answer replaces the plain
// Newton value only when its status is stronger or it is a smaller bound.
// Options.NoReduction and Options.NoRepair give the Newton value of K as
// written. The soundness arguments are in the doc comments of reduce.go,
// eliminate.go and repair.go.
//
// # Truncated series
//
// A truncated series differs from the true K by omitted terms. Bound
// certifies that they lie strictly above one optimal supporting hyperplane
// at t_τ·τ (then the value is that of the full K: UpperBound or better) and,
// for Exact, in the polyhedron on no compact face (then the face verdicts
// carry over); otherwise the value is Uncertified. What is known of the
// omitted terms is either their total degree (above Problem.Order) or,
// finer, Problem.Remainder: monomials that every omitted term is a multiple
// of (monomial.Expansion.Remainder), which certifies shapes such as
// a²b²·(a unit) that no total degree can. Both checks are exact LPs and need
// no facet enumeration; see Truncation. Spec.Bound with Order = OrderAuto
// raises the order until the check passes, and from the second order on
// expands with a floor (monomial.Config.Floor): terms strictly above the
// exact part of the previous order are dropped into the remainder as the
// expansion proceeds, which the check then certifies without an LP.
//
// # Numerical estimates
//
// Package github.com/lctkit/lctkit/rlct/estimate gives an independent
// numerical estimate of λ and θ by nested sampling, with standard errors. It
// is an estimate, not a proof: it is labelled as such everywhere, and it
// never changes a Status. This package does not depend on it.
package rlct
