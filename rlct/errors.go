package rlct

import "errors"

// ErrInput is the parent of every error that says the problem, as given,
// has no learning coefficient to bound or is malformed: errors.Is(err,
// ErrInput) holds for each of the errors below and for every error that
// wraps one of them. Errors that are not input errors are a cancelled
// context, a reached work limit (polyhedron.ErrTooLarge) and I/O.
var ErrInput = errors.New("rlct: bad input")

// inputError is an error of the input; it matches ErrInput.
type inputError struct{ msg string }

func (e *inputError) Error() string        { return e.msg }
func (e *inputError) Is(target error) bool { return target == ErrInput }

// Errors for input that has no learning coefficient to bound. Each matches
// ErrInput (see errors.Is).
var (
	ErrZero        error = &inputError{"rlct: K is identically zero"}
	ErrNotVanish   error = &inputError{"rlct: K does not vanish at the point"}
	ErrNegative    error = &inputError{"rlct: K takes negative values near the point"}
	ErrPrior       error = &inputError{"rlct: prior exponent must be greater than -1"}
	ErrNoFunction  error = &inputError{"rlct: no function given (set K or Generators)"}
	ErrTwoForms    error = &inputError{"rlct: give K or Generators, not both"}
	ErrVariables   error = &inputError{"rlct: generators must share one variable list"}
	ErrDimension   error = &inputError{"rlct: length does not match the number of variables"}
	ErrNoVariables error = &inputError{"rlct: K has no variables"}
	ErrShiftSeries error = &inputError{"rlct: K is a power series truncated around the origin; its truncation cannot be moved to another point (expand it at the point: give that point alone, or write K in variables shifted to it)"}
)
