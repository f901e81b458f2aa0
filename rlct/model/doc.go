// Package model builds the function K of a statistical model from a short
// description of the model, exactly, so that package rlct can bound its
// learning coefficient: regression with Gaussian noise (K is the expected
// squared difference of the mean functions), discrete models (category
// probabilities, optionally given a discrete input) and mixtures of Poisson
// or binomial laws. K always comes out as a weighted sum of squares
// Σ c_i·g_i² with rational weights c_i > 0 (rlct.Problem.GeneratorWeights),
// which certifies more than the expanded polynomial.
//
// # An example
//
// A reduced-rank regression with three inputs, two outputs and one hidden
// unit, at the truth zero:
//
//	model rank one, three sensors        # a name, the rest of the line
//	kind regression
//	param B[2,1], A[1,3]                 # matrix parameters
//	input x[3] ~ normal                  # independent standard normal inputs
//	noise 1/2                            # the noise variance σ²
//	mean B*A*x                           # f(x; w), here a vector of 2 outputs
//
// Build turns it into K = ‖BA − B*A*‖²/(2σ²) = Σ_{n,i} (B_n_1·A_1_i)² (the
// weights 1/(2σ²) are 1 here), and Model.Bound certifies λ = 1 = min(M, N)/2
// with θ = 1, the value of Aoyagi and Watanabe's formula for this shape
// (see package sbic).
//
// # The format
//
// A description is a list of statements, one per line. A '#' starts a
// comment that runs to the end of the line. Inside parentheses, brackets
// and braces a statement continues over several lines (a matrix can be
// written one row per line). The grammar, in EBNF:
//
//	Description   = { [ Statement ] newline } [ Statement ] .
//	Statement     = "model" text
//	              | "kind" ( "regression" | "discrete" | "mixture" )
//	              | "param" Decl { "," Decl } [ "prior" Number ]
//	              | "truth" [ Binding { "," Binding } ]
//	              | "order" integer
//	              | "input" Decl "~" Law
//	              | "noise" Number
//	              | "mean" Expr
//	              | "category" identifier "=" Expr
//	              | "component" Family "weight" Expr .
//	Decl          = identifier [ "[" integer [ "," integer ] "]" ] .
//	Binding       = identifier "=" ( Number | "[" Row { ";" Row } "]" ) .
//	Row           = Number { "," Number } .
//	Number        = [ "+" | "-" ] number [ "/" number ] .
//	Law           = "normal" [ "(" Number "," Number ")" ]
//	              | "uniform" "(" Number "," Number ")"
//	              | "design" "{" Entry { "," Entry } "}"
//	              | "moments" "{" Entry { "," Entry } "}" .
//	Entry         = Point ":" Number .
//	Point         = Number | "(" Number { "," Number } ")" .
//	Family        = "poisson" "(" Expr ")" | "bernoulli" "(" Expr ")"
//	              | "binomial" "(" integer "," Expr ")" .
//
//	Expr          = Term { ( "+" | "-" ) Term } .
//	Term          = Unary { ( "*" | "/" ) Unary } .
//	Unary         = ( "+" | "-" ) Unary | Power .
//	Power         = Postfix [ ( "^" | "**" ) Unary ] .
//	Postfix       = Primary { "'" | "[" integer [ "," integer ] "]" } .
//	Primary       = number | identifier | function "(" Expr ")"
//	              | "sum" "(" Expr ")" | "(" Expr ")" .
//
// number, identifier and function are those of the expression language of
// package monomial (numbers are exact: 0.25 is 1/4, 1e-3 is 1/1000; the
// functions are exp, log, sin, cos, tanh, sinh, cosh, atan, sqrt).
// Keywords are recognised by their place, so a parameter may be called
// "order"; the names of functions and "sum" are reserved.
//
// # Statements
//
//   - model NAME names the model; the name is the rest of the line.
//   - kind says what K is built from: regression, discrete or mixture
//     (required, once).
//   - param declares parameters: a scalar a, a vector v[n] (n entries, a
//     column), a matrix B[r,c]. "prior h" (h > −1, default 0) gives every
//     entry a prior ∝ |w|^h near the truth, times a smooth positive density;
//     at a truth where an entry is not 0 the factor is smooth and counts
//     nothing there. The entries are the variables of K, named a, v_3,
//     B_2_1 (1-based), in the order of the declarations, a matrix row by
//     row.
//   - truth gives a true parameter: a number for a scalar (or for every
//     entry of a vector or matrix), a list [1, 2, 3] or [1; 2; 3] for a
//     vector, rows [1, 0; 0, 1] for a matrix. Parameters a truth does not
//     name are 0; without a truth statement the truth is 0. Several truth
//     statements give several points of one true distribution (Build
//     checks that they give the same one), and the learning coefficient is
//     the least of the local ones; a model that needs a series (below) is
//     expanded at one truth only.
//   - order D expands the model as a power series to total degree D in the
//     parameters (the offsets from the truth), with a certified remainder;
//     it is needed when an expression is not a polynomial.
//
// Regression (y = f(x; w) + ε, ε ~ N(0, σ²·I)):
//
//   - input x ~ LAW or input x[n] ~ LAW declares an input: normal (standard)
//     or normal(μ, v) and uniform(a, b) give independent coordinates;
//     design { point: weight, … } a finite design of rational points with
//     positive weights summing to 1 (points of a vector input are written
//     (x1, x2, …)); moments { exponent: value, … } a table of joint moments
//     E[x^exponent] (exponent an integer, or (k1, k2, …) for a vector), of
//     which every moment the model needs must be given. Several inputs are
//     independent.
//   - noise σ² gives the known noise variance, a positive rational.
//   - mean EXPR gives f(x; w); a vector or matrix expression gives several
//     outputs, and several mean statements add outputs.
//
// Discrete:
//
//   - category NAME = EXPR gives the probability of a category (a vector
//     expression gives several, NAME[1], NAME[2], …). The probabilities
//     must sum to 1 identically in the parameters (checked exactly), and be
//     positive at the truth.
//   - input c ~ design { … } (optional) makes them conditional on a
//     discrete input: the expressions may use c, and K averages over the
//     design.
//
// Mixture:
//
//   - component FAMILY weight EXPR adds a component: poisson(MEAN),
//     bernoulli(P) or binomial(N, P), all of one family. The weights must
//     sum to 1 identically.
//
// # Expressions
//
// Expressions extend those of package monomial with values that are
// vectors and matrices: a declared name stands for its whole shape, B[2,1]
// and v[3] select entries (1-based; one index also selects from a row), E'
// transposes, and sum(E) adds the entries. + and − need equal shapes; *
// multiplies matrices (inner sizes must agree) or scales by a scalar; /
// divides by a scalar; ^ takes a scalar base and a constant scalar
// exponent; functions apply entry by entry. A 1×1 value is a scalar, so
// a'*tanh(B*x) with a[H], B[H,M] and x[M] is the scalar Σ_h a_h·tanh((Bx)_h).
//
// # What Build computes
//
// Regression: K(w) = E_x‖f(x; w) − f(x; w*)‖²/(2σ²), exactly, as a weighted
// sum of squares; see buildRegression for the derivation (design points
// give one square per point and output, other inputs are integrated out
// through an exact LDLᵀ factorization of their moment matrix).
//
// Discrete and binomial mixtures: the Kullback–Leibler divergence is
// replaced by the comparable Σ (p_k(w) − q_k)²/(2·q_k) with q = p(w*) > 0,
// which has the same learning coefficient and multiplicity (Watanabe 2009,
// Algebraic Geometry and Statistical Learning Theory; the argument is in
// buildDiscrete). A truth with some q_k = 0 is an error that says why.
//
// Poisson mixtures at a truth that is a single Poisson law: χ²/2 =
// Σ_k (Σ_i a_i·(μ_i − μ*)^k)²/(2·k!·μ*^k), cut at the order with the rest in
// the remainder; see buildMixture, including what of it is from memory.
//
// When every expression is a polynomial, K is a polynomial in the
// parameters themselves and the truths are the points of rlct.Problem
// (rlct.Problem.Points). Otherwise it is a series expanded at the truth, in the
// offsets w − w* under the parameters' names (Model.Offsets), and its
// remainder (monomials that every omitted term is a multiple of) is passed
// to rlct.Problem.Remainder, so that rlct can decide the status honestly.
//
// # Errors
//
// Every error in a description, from Parse or from Build, is an *Error with
// the line and column of the place it comes from (an ErrorList when Parse
// finds several), and matches rlct.ErrInput. Errors of the expression
// language inside an expression (a function whose Taylor series at the
// truth is not rational, an expansion beyond the limits) point at the
// operator or function of the description they come from. A parameter
// that K does not depend on is an error, not a silent answer.
package model
