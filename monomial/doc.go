// Package monomial provides exact sparse multivariate polynomials with
// rational coefficients, a parser for polynomial expressions, and truncated
// multivariate Taylor series of analytic expressions.
//
// It is the bottom layer of lctkit: a Kullback–Leibler divergence K(w) is
// read from text into a [Poly], whose support gives the Newton polyhedron
// and whose face polynomials ([Poly.Filter]) decide nondegeneracy.
//
// # Polynomials
//
// A [Poly] holds terms c·x^e with exact rational coefficients c over a fixed
// ordered list of named variables. It is canonical after every operation
// (no zero coefficients, one term per exponent, terms in graded
// lexicographic order, descending) and immutable. Coefficients that fit in
// machine words are kept as int64 numerator and denominator with overflow
// detection, falling back to [math/big.Rat] for each coefficient that does
// not fit. [Poly.Mul] packs exponent vectors into 64-bit keys and
// accumulates products in a hash table before sorting once.
//
// [Poly.Compile] gives a float64 evaluator for numerical estimates; nothing
// exact depends on it.
//
// # Expressions
//
// [Parse] reads an expression such as
//
//	(w1*w2 + w3^2)^2 + 1/2*(a - b)**2   # comments run to the end of the line
//
// The grammar, in EBNF (white space, including newlines for Parse, may
// appear between tokens):
//
//	Expression = Term { ( "+" | "-" ) Term } .
//	Term       = Unary { ( "*" | "/" ) Unary } .
//	Unary      = ( "+" | "-" ) Unary | Power .
//	Power      = Primary [ ( "^" | "**" ) Unary ] .
//	Primary    = number | identifier | function "(" Expression ")" | "(" Expression ")" .
//	function   = "exp" | "log" | "sin" | "cos" | "tanh" | "sinh" | "cosh" | "atan" | "sqrt" .
//	identifier = letter { letter | digit } .   // not a function name
//	letter     = "a" … "z" | "A" … "Z" | "_" .
//	digit      = "0" … "9" .
//	number     = ( digits [ "." { digit } ] | "." digits ) [ ( "e" | "E" ) [ "+" | "-" ] digits ] .
//	digits     = digit { digit } .
//
// A '#' starts a comment that runs to the end of the line.
// So powers are right-associative and bind tighter than unary minus:
// -x^2 = -(x^2), x^2^3 = x^(2^3), 2^-1 = 1/2. Products need an explicit
// "*" (2x is an error). Numbers are read exactly: 0.25 = 1/4, 1e-3 = 1/1000,
// 2.5e2 = 250; the decimal exponent of a number is limited to ±10000.
// The exponent of a power must be a constant expression. [ParseList] reads
// several expressions separated by ";" or newlines.
//
// Large inputs are usually long sums of monomials such as
// 2*x1^4*x3^10 - 3/4*(a*b^2)^2 + …. Such terms (products of numbers,
// variables and parenthesized products, with literal non-negative integer
// powers and divisions by numbers) are read straight into exponent vectors
// and coefficients and merged once at the end of the sum, in time and
// memory roughly proportional to the text; every other term is expanded
// by the general rules, with the same results, errors and [Limits].
//
// # Polynomial mode and series mode
//
// With [Config].Order = 0 the expression must be a polynomial: exponents
// are non-negative integers (or anything with a constant base whose value
// is rational, like 4^(1/2)), divisions are by non-zero constants, and
// functions are errors asking for an order.
//
// With Order = D > 0 the expression may also involve series, and the
// result is exact up to total degree D. Precisely: the value of the
// expression minus [Expansion].Poly is a power series all of whose terms
// have total degree > D and are multiples of a monomial of
// [Expansion].Remainder (see Remainders below), and [Expansion].Truncated
// is true exactly when the remainder is not empty. The parser keeps, for
// every subexpression, whether its polynomial is exact:
//
//   - Exact values are never truncated (but see the last point). Numbers, variables, and sums,
//     products and non-negative integer powers of exact values are expanded
//     completely, as in polynomial mode and under the same [Limits]: with
//     D = 8, x^2 + y^10 gives both terms and is not truncated, and
//     (x+y)^12 with D = 3 gives all 13 terms.
//   - A value that involves a series (a function, a division by a
//     non-constant, a negative or fractional power of a non-constant) is
//     computed in the ring of power series truncated at total degree D:
//     its terms of degree > D are dropped, and it is inexact.
//   - A product, quotient, power or function with an inexact operand is
//     inexact and truncated at D: with an exact factor its terms above D
//     would be incomplete (x^10*cos(z) with D = 4 is 0, truncated).
//   - A sum, difference or sign change keeps every term of its operands:
//     the sum of the omitted parts is still of degree > D (tanh(x)^2 + y^10 with D = 4 is
//     x^2 - 2/3*x^4 + y^10, truncated). So when Truncated is true, Poly may
//     have terms above D that differ from the Taylor coefficients of the
//     value (only the terms of degree <= D are guaranteed).
//   - In series mode an exact product or power whose full expansion would
//     exceed the Limits (too many terms, too much work, too large
//     coefficients, exponents of 2^62 or more) is computed truncated at D
//     instead and becomes inexact, rather than failing as in polynomial
//     mode.
//
// Functions are composed with their argument by one general mechanism: the
// univariate Taylor coefficients of the function at the value c of the
// argument at the expansion point (the constant term of the argument's
// polynomial) are composed with the argument minus c by Horner's scheme
// with truncation. The Taylor coefficients are rational only for suitable
// values c, so
//
//   - exp, sin, cos, sinh, cosh, tanh and atan need an argument vanishing
//     at the point (exp(1+x) at 0 is refused: exp(1) is irrational; for
//     atan and log only the constant term would be irrational, and the
//     message gives the rewrite atan(a) = atan(c) + atan((a - c)/(1 + c*a))
//     or log(a) = log(c) + log(a/c));
//   - log needs an argument equal to 1 at the point, as in log(1+u);
//   - sqrt(c+u) and (c+u)^(p/q) need c^(p/q) rational (c = 1, or 4 for
//     sqrt), and negative integer powers and divisions need c != 0; they use
//     the binomial series of (1+u/c)^(p/q).
//
// A refusal is an [*Error] at the function (or the operator) that names the
// function, the value of its argument at the point and how to rewrite the
// model. When the argument (or the base, or the divisor) vanishes at the
// point, so that there is no Taylor series there at all, Error.Setting is
// "At" (unless it is an exact constant): another expansion point may lift
// the error.
//
// # Expansion at a point
//
// [Config].At gives an expansion point: every variable x with a value a is
// read as a + x before anything is evaluated, so the result is the Taylor
// expansion at the point, written in the offsets from it under the same
// variable names. For a polynomial this is [Poly.Translate] at the point
// (and exact); tanh(x - 1) at x = 1 is tanh(x) at 0. Sums of monomials in
// variables with a non-zero value are read by the general rules instead of
// the fast path (a + x is not a monomial), so long such sums are slower to
// read than at 0.
//
// # Remainders
//
// Every value carries, next to its polynomial P, a remainder: a finite set
// R of exponents such that every term of V - P is a multiple of x^r for
// some r in R, where V is the value (its Taylor series at the point, a
// formal power series). This section gives the rules and proves them.
//
// Notation. For a finite set R of exponents, I(R) is the set of formal
// power series all of whose terms are multiples of some x^r, r in R
// (I(∅) = {0}); supp P is the set of exponents of P; R + T = {r + t};
// Min(R) is the set of elements of R that are not multiples of another
// element; |e| is the total degree; T_D(P) is P without its terms of degree
// > D. Checking one coefficient at a time (a finite sum) gives:
//
//	(a) I(R) is closed under sums, also infinite ones in which each exponent
//	    receives finitely many contributions, and under multiplication by
//	    any power series.
//	(b) I(R)·I(T) ⊆ I(R + T).
//	(c) I(R) + I(T) = I(R ∪ T).
//	(d) If every element of R is a multiple of an element of T, then
//	    I(R) ⊆ I(T). In particular I(Min(R)) = I(R).
//
// The parser keeps, for every subexpression v, its polynomial P_v and a
// minimal set R_v with V_v - P_v in I(R_v), and every element of R_v has
// degree > D (so the terms of P_v of degree <= D are Taylor coefficients).
// Let S_v = Min(supp P_v ∪ R_v); then V_v = P_v + (V_v - P_v) lies in
// I(S_v). The rules, each with its proof:
//
//  1. Exact values (numbers, variables, and what is computed from exact
//     values without truncation): R = ∅.
//  2. Sums, differences, sign changes, products with and divisions by a
//     non-zero exact constant compute P without truncation, so
//     V - P = (V1 - P1) ± (V2 - P2) lies in I(R1 ∪ R2) by (c), and a
//     constant factor leaves I(R) as it is: R = Min(R1 ∪ R2).
//  3. Products truncated at D (an inexact factor, or an exact product beyond
//     the Limits): P = T_D(P1·P2) and
//     V1·V2 - P = (V1 - P1)·V2 + P1·(V2 - P2) + (P1·P2 - T_D(P1·P2)).
//     The first part lies in I(R1 + S2) and the second in I(S1 + R2) by
//     (b); the third has its terms at exponents e1 + e2 (e1 in supp P1, e2
//     in supp P2) of degree > D, and each of those is a multiple of e2 + e1'
//     with e1' a minimal exponent of P1 of degree >= D + 1 - |e2|; call the
//     set of these Drop. So R = Min((R1 + S2) ∪ (S1 + R2) ∪ Drop) by (c),
//     (d).
//  4. Compositions f(a), where f(c + t) = Σ a_j t^j with rational a_j: the
//     functions, the binomial series (c + t)^r = c^r Σ C(r, j) (t/c)^j of
//     sqrt, rational and negative powers and of 1/a, and t^n for an integer
//     power of a value that vanishes at the point. Here c is the constant
//     term of P_a, which is the value of a at the point because no element
//     of R_a has degree 0. Write u = V_a - c and U = P_a - c (divided by c
//     for the binomial series, which changes no support), m the least
//     degree in U, k = ⌊D/m⌋, A = {j >= 1 : a_j != 0}, j1 = min A, and j0
//     the least element of A above k (none when f is a polynomial of degree
//     <= k). Horner's scheme with truncation computes P = T_D(Σ_{j<=k} a_j
//     U^j), and
//     f(V_a) - P = Σ_{j∈A} a_j (u^j - U^j) + [Σ_{j∈A} a_j U^j - P],
//     where both sums converge formally (u and U have no constant term).
//     First part: u^j - U^j = (u - U)·Σ_{i<j} u^i U^(j-1-i) lies in
//     I(R_a + S^(j-1)) by (b), where S = Min(supp U ∪ R_a) (so u, U lie in
//     I(S)) and S^(i) = Min of the i-fold sums of S (S^(0) = {0}); for j >=
//     j1 every (j-1)-fold sum is a multiple of a (j1-1)-fold one, so the
//     whole part lies in I(R_a + S^(j1-1)), which is I(R_a) when j1 = 1
//     (exp, log, sin, sinh, tanh, atan, binomial series) and I(R_a + S) for
//     cos and cosh. Second part: let G = supp U, PS_j the set of j-fold
//     sums of G (which contains supp U^j), L_0 = {0}, H_0 = ∅, and
//     L_j = the elements of L_(j-1) + G of degree <= D,
//     H_j = Min(the elements of L_(j-1) + G of degree > D ∪ (H_(j-1) + G)).
//     By induction every element of PS_j of degree <= D is in L_j and
//     every one of degree > D is a multiple of an element of H_j (write it
//     m + g with m in PS_(j-1): if |m| <= D it lies in L_(j-1) + G, else it
//     is a multiple of an element of H_(j-1) + G). The terms of Σ_{j∈A} a_j
//     U^j of degree <= D come from j <= k only (U^j has degree >= j·m > D
//     otherwise), and P is exactly those, so the bracket is the part of
//     degree > D of Σ_{j∈A, j<=k} a_j U^j plus Σ_{j∈A, j>k} a_j U^j. For
//     j >= j0 every element of PS_j is a multiple of one of PS_j0 (PS_j =
//     PS_j0 + PS_(j-j0)), all of degree > D. So the bracket lies in
//     I(⋃_{j∈A, j<=k} H_j ∪ H_j0), and
//     R = Min((R_a + S^(j1-1)) ∪ ⋃_{j∈A, j<=k} H_j ∪ H_j0).
//     Whether a_j = 0 is read off the exact coefficients; j0 is found among
//     k+1 and k+2 (every coefficient of exp and log(1+t) is non-zero, every
//     odd one of sin, sinh, tanh and atan and every even one of cos and
//     cosh; C(r, j) = 0 only for a natural number r < j), and k+1 is used
//     if neither is non-zero, which is sound by the remark below.
//     Coarsenings. Each part may be replaced by a set whose ideal is
//     larger, by (d), and the parser does so where it saves work: it
//     removes from H_j the multiples of generators already found (the
//     induction goes through with those generators added to H_j); it uses
//     H_i for some k < i <= j0 in place of H_j0 (for j >= i > k, PS_j is
//     made of multiples of elements of PS_i) and S^(i) for some i <= j1 - 1
//     in place of S^(j1-1). Beyond k+1 all of PS_j has degree > D, so
//     H_j0 is computed as Min(H_(k+1) + Min PS_(j0-k-1)), the last factor
//     by binary powering of sets (Min(A + B) of Min PS_a and Min PS_b is
//     Min PS_(a+b)); when a set would exceed 4096 elements or a small work
//     budget (only for large integer powers) the powering stops at a
//     smaller count, which is one of the coarsenings above. So the
//     remainder of (x+y+z)^5000 at order 3, a power that the Limits keep
//     from being expanded, is the set of all monomials of one degree
//     between 4 and 5000.
//  5. Integer powers: v^0 = 1 exactly; powers of exact values within the
//     Limits are exact (rule 1); a power of an inexact value, or of an
//     exact one beyond the Limits, is rule 4 with t^n when it vanishes at
//     the point (A = {n}) and with the binomial series otherwise.
//  6. Divisions by a non-constant: v/w = v·w^(-1), rule 4 for w^(-1) and
//     then rule 3.
//
// Every element that rules 1–6 introduce has degree > D: those of Drop and
// of H_j by definition, and those of R + S are multiples of elements of R
// (rule 7 below adds elements that strictly dominate a floor point
// instead).
//
// # Truncation by a floor
//
// Config.Floor gives points F (only their minimal elements matter) and
// lets series mode drop, besides the terms of degree > D, every term whose
// exponent e strictly dominates a point g of F (e >= g entrywise, e != g):
// such terms are often all that grows with D, and a caller that knows they
// cannot matter (for the Newton polyhedron, a point above a point of the
// support lies in the polyhedron and on no compact face) keeps high orders
// cheap. The rule, with its proof:
//
//  7. Floor. After every step that truncates at D (rules 3, 4, 5 and 6:
//     the truncated products, the compositions, inside Horner's scheme at
//     each h_j and on its argument, and the powers of inexact values), the
//     parser removes from the computed polynomial the terms whose exponent e
//     strictly dominates some g in F, and adds to the remainder, for each
//     of them, the exponent g + u_i, where u_i is the unit vector of the
//     first variable i with e_i > g_i; so e is a multiple of g + u_i, and
//     R = Min(R ∪ {those g + u_i}) by (c), (d). A removed term lies in
//     I({g + u_i}), and the value minus the polynomial changes by exactly
//     the removed terms. Inside Horner's scheme, write h_j = h'_j + δ_j
//     with h'_j the computed step and δ_j in I(G) (G the generators
//     recorded so far); then u·h_(j+1) = u'·h'_(j+1) + (a part in I(G)) by
//     (a), truncating by degree keeps a subset of the terms (I(G) is
//     defined term by term), and removing terms adds their generators: so
//     by induction the computed polynomial differs from the one of rule 4
//     by an element of I(G), and R is the set of rule 4 with G added.
//     Removed terms are never put back: the later rules only ever see the
//     remainder, and every operation maps multiples of a generator to sums
//     of multiples of generators (rules 2–6 with (a)–(d)), so a removed
//     term's contribution to any later value stays covered.
//
// Exact values are never cut (an expression without series is unchanged),
// and an inexact value only loses terms that its remainder then covers.
// The new generators need not have degree > D, but each strictly dominates
// a point of F, and so does every multiple of one. So the statement of
// Expansion becomes: every term of the value minus Poly is a multiple of a
// remainder monomial, and every remainder monomial has degree > D or
// strictly dominates a point of F; a term of Poly of degree <= D that
// strictly dominates no point of F is a Taylor coefficient. Whether the
// points of F belong to the final support is for the caller to know: the
// parser does not check it.
//
// The rules look at supports and not at coefficients, so a remainder can
// be larger than the least possible one when coefficients cancel, but they
// keep the monomial factors of a value: to order 4, tanh(b) = b - b^3/3 has
// remainder {b^5}, a·tanh(b) has {a·b^5} and tanh(b)^2 = b^2 - 2/3·b^4 has
// {b^6} (to order 3 these are {b^5}, {a·b^3} and {b^4}: the truncation of
// the product drops the true terms -a·b^3/3 and -2/3·b^4). Likewise
// x^2·(1 - cos(y)) to order 4 is x^2·y^2/2 with remainder {x^2·y^4}, not
// {x^2·y^5}: the truncated product lacks the true term -x^2·y^4/24. The
// bookkeeping works on exponents only, with a work budget of its own of
// Limits.MaxWork units and the MaxTerms limit on intermediate sets; an
// error there is reported like the other limit errors.
//
// # Limits
//
// [Limits] bound the work: powers estimate their number of terms and
// coefficient size before expanding, so (x+y+z)^100000 fails at once.
// Deep nesting is refused beyond 1000 levels. Errors in the text are
// [*Error] values with line and column; no input makes the parser panic.
package monomial
