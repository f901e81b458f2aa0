// Package sbic chooses among candidate statistical models, some of them
// singular, by the singular Bayesian information criterion (sBIC) of Drton
// and Plummer (2017, "A Bayesian information criterion for singular models",
// J. R. Statist. Soc. B 79), computed from learning coefficients whose status
// (exact, upper bound, not a bound) is carried through to the choice. The
// construction below is reconstructed from memory, without the paper at hand.
//
// # The setting
//
// Models M_1, …, M_k are partially ordered by inclusion: M_j ⪯ M_i when
// M_j ⊆ M_i. Each has a prior probability P(M_i), a dimension d_i and, on
// data Y_n of sample size n, a maximised log-likelihood ℓ_i = log p(Y_n | π̂_i).
// For every pair j ⪯ i (including j = i), (λ_ij, θ_ij) is the learning
// coefficient and its multiplicity of M_i at a generic true distribution in
// M_j. When the truth lies in M_j, the log marginal likelihood of M_i is
//
//	log L(M_i) = ℓ_i − λ_ij·log n + (θ_ij − 1)·log log n + O_p(1)
//
// (Watanabe 2009, Algebraic Geometry and Statistical Learning Theory, the
// free-energy asymptotics of chapter 6, with the maximised log-likelihood in
// place of the log-likelihood at the truth, as Drton & Plummer 2017 use it;
// from memory). Had j been known, the approximation
//
//	L'_ij = exp(ℓ_i − λ_ij·log n + (θ_ij − 1)·log log n)
//
// could stand for L(M_i). For a regular model λ_ij = d_i/2 and θ_ij = 1 for
// every j, and log L'_ij is the BIC of Schwarz (1978, Estimating the
// dimension of a model, Ann. Statist. 6).
//
// # The recursion
//
// The truth is not known, but the data say how probable each submodel is.
// The sBIC averages L'_ij over the submodels j ⪯ i, weighting each by its
// approximate posterior probability computed with the same approximation
// (Drton & Plummer 2017; from memory):
//
//	L'(M_i) = Σ_{j⪯i} L'_ij·P(M_j)·L'(M_j) / Σ_{j⪯i} P(M_j)·L'(M_j).      (1)
//
// The sums include j = i, so (1) is a fixed-point equation for x = L'(M_i)
// given L'(M_j) for the strictly smaller models j ≺ i. Multiplying out and
// dividing by P(M_i) leaves a quadratic:
//
//	x² − β_i·x − γ_i = 0,
//	β_i = L'_ii − Σ_{j≺i} (P(M_j)/P(M_i))·L'(M_j),
//	γ_i = Σ_{j≺i} (P(M_j)/P(M_i))·L'_ij·L'(M_j).
//
// For a minimal model (no j ≺ i) γ_i = 0 and the positive root is
// L'(M_i) = L'_ii. Otherwise γ_i > 0, the product of the two roots is −γ_i < 0,
// and L'(M_i) is the one positive root, (β_i + √(β_i² + 4γ_i))/2. Taking the
// models in an order that puts every model after its submodels (a
// topological order of ⪯) gives every L'(M_i) in turn, and
//
//	sBIC(M_i) = log L'(M_i).
//
// A three-model chain M_1 ⪯ M_2 ⪯ M_3 with uniform priors, worked by hand
// (the test TestChainByHand builds inputs with exactly these L'_ij): with
// L'_11 = 1, the minimal model gives L'(M_1) = 1. With L'_22 = 3 and
// L'_21 = 8, M_2 solves x² − (3 − 1)·x − 8·1 = 0, so L'(M_2) = 4 (the other
// root is −2); indeed (8·1 + 3·4)/(1 + 4) = 4 as (1) requires. With
// L'_33 = 2, L'_31 = 6, L'_32 = 1, M_3 solves x² − (2 − 1 − 4)·x − (6·1 + 1·4)
// = x² + 3x − 10 = 0, so L'(M_3) = 2; indeed (6·1 + 1·4 + 2·2)/(1 + 4 + 2) = 2.
//
// When every pair is regular, L'_ij = L'_ii for every j ⪯ i, the quadratic
// factors as (x − L'_ii)·(x + Σ_{j≺i} (P(M_j)/P(M_i))·L'(M_j)) = 0, and
// sBIC(M_i) = log L'_ii = ℓ_i − (d_i/2)·log n is the BIC exactly (Drton &
// Plummer 2017 note this reduction; from memory). In general the sBIC
// differs from the BIC by the learning coefficients and the multiplicities
// (the log log n terms); the O_p(1) remainders of the asymptotics are
// dropped in both.
//
// # Evaluation in floating point
//
// With n = 10^9 and log-likelihoods of magnitude 10^7, L'_ij is far outside
// the range of float64, so everything is computed with logarithms. First
// every ℓ_i is shifted by the common scale ℓ* = max_i ℓ_i; (1) is homogeneous
// of degree one in the L', so the shift multiplies every L'(M_i) by the same
// factor and is added back at the end. Then, for each model, log β_i's
// magnitude and sign and log γ_i come from log-sum-exp sums (each term
// scaled by the largest), and the positive root is taken in the form that
// never subtracts:
//
//	β_i ≥ 0:  x = (β_i + √(β_i² + 4γ_i))/2
//	β_i < 0:  x = 2γ_i / (|β_i| + √(β_i² + 4γ_i))
//
// with √(β_i² + 4γ_i) itself a log-sum-exp. The only subtraction is the one
// that forms β_i from its two given parts, and the root moves by at most as
// much as β_i does (the derivative of the root in β_i lies in [0, 1]), so it
// loses no more than the inputs' own rounding. All scores are float64
// evaluations, not exact values; two scores closer than an estimate of their
// rounding error (see Result) are reported as tied.
//
// # Choice and weights
//
// Each criterion chooses the model with the largest P(M_i)·exp(score) (the
// largest score when the priors are uniform), and reports the normalised
// weights P(M_i)·exp(score_i) / Σ_k P(M_k)·exp(score_k), which approximate
// the posterior probabilities of the models.
//
// # Pairs that are not exact
//
// Each pair carries an rlct.Status. sBIC(M_i) rests on every pair (k, l) with
// k ⪯ i: on its own L'_il directly and on the pairs of its submodels through
// L'(M_k). From an upper bound (λ', θ') ≥ (λ, θ) in the order of rlct.Less,
// L'_kl is, for all large n, smaller than the true pair's (but not at every
// finite n; see rlct.PenaltyNote). The root of the quadratic increases with
// L'_kk and with γ_k, so sBIC(M_k) itself is then too low asymptotically;
// the models above k depend on L'(M_k) in both β and γ, in no fixed
// direction, and so does the choice. So instead of a claim, Choose reports
// for every pair that is not Exact which scores rest on it and what the
// scores and the choice become when the pair is replaced by the regular value
// (d_k/2, θ = 1) and by a given estimate (Pair.Estimate), one pair at a time
// and all of them at once.
//
// # Tables
//
// ReadTable reads the candidates, the order, the pairs and the data from a
// small text table or its JSON form (see Table); a pair may be given by its
// value or by a function K whose learning coefficient lctkit bounds with
// rlct.Bound.
package sbic
