// Package monomial provides exact sparse multivariate polynomials with
// rational coefficients, an expression parser, and truncated power series.
package monomial
