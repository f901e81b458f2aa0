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
// have total degree > D, and [Expansion].Truncated is true exactly when
// that difference may be non-zero. The parser keeps, for every
// subexpression, whether its polynomial is exact:
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
// univariate Taylor coefficients of the function (exact rationals) are
// composed with the argument minus its constant term by Horner's scheme
// with truncation. The Taylor coefficients are rational only for suitable
// constant terms, so
//
//   - exp, sin, cos, sinh, cosh, tanh and atan need an argument vanishing
//     at 0 (exp(1+x) is refused: exp(1) is irrational);
//   - log needs constant term exactly 1, as in log(1+u);
//   - sqrt(c+u) and (c+u)^(p/q) need c^(p/q) rational (c = 1, or 4 for
//     sqrt), and negative integer powers and divisions need c != 0; they use
//     the binomial series of (1+u/c)^(p/q).
//
// # Limits
//
// [Limits] bound the work: powers estimate their number of terms and
// coefficient size before expanding, so (x+y+z)^100000 fails at once.
// Deep nesting is refused beyond 1000 levels. Errors in the text are
// [*Error] values with line and column; no input makes the parser panic.
package monomial
