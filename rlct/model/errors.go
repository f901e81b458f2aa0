package model

import (
	"errors"
	"fmt"
	"strconv"
	"unicode/utf8"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// Error is an error in a description, with its position. Offset is the byte
// offset in the description's text; Line and Col are 1-based, and Col counts
// runes. It matches rlct.ErrInput (see errors.Is).
type Error struct {
	Offset, Line, Col int
	Msg               string
	// Setting names what would let the description through, when something
	// would, as monomial.Error.Setting does for an expression: "Order" when
	// an expression needs a truncation order (an order statement), "At"
	// when a function has no Taylor series at the truth, or the field of
	// monomial.Limits that was exceeded. It is empty otherwise.
	Setting string
}

// Error returns "line:col: message".
func (e *Error) Error() string { return fmt.Sprintf("%d:%d: %s", e.Line, e.Col, e.Msg) }

// Is reports that an Error is an input error (rlct.ErrInput).
func (e *Error) Is(target error) bool { return target == rlct.ErrInput }

// ErrorList is a list of errors in one description, in source order, as
// Parse returns them when several statements fail.
type ErrorList []*Error

// Error returns the first error followed by "(and N more errors)" when there
// are more.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Unwrap returns the errors of the list, so that errors.As finds an *Error
// and errors.Is finds rlct.ErrInput.
func (l ErrorList) Unwrap() []error {
	errs := make([]error, len(l))
	for i, e := range l {
		errs[i] = e
	}
	return errs
}

// errorAt returns an *Error at byte offset off of src.
func errorAt(src string, off int, format string, args ...any) *Error {
	line, col := position(src, off)
	return &Error{Offset: off, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
}

// position returns the 1-based line and rune column of byte offset off.
func position(src string, off int) (line, col int) {
	off = min(max(off, 0), len(src))
	line, start := 1, 0
	for i := 0; i < off; i++ {
		if src[i] == '\n' {
			line++
			start = i + 1
		}
	}
	return line, utf8.RuneCountInString(src[start:off]) + 1
}

// fromMonomial turns an error of the expression parser on generated text
// into an *Error at the place of the description it comes from (see
// sourceMap); errors that are not *monomial.Error are returned as they
// are.
func fromMonomial(src string, m *sourceMap, err error, context string) error {
	var pe *monomial.Error
	if !errors.As(err, &pe) {
		return err
	}
	e := errorAt(src, m.source(pe.Offset), "%s%s", context, pe.Msg)
	e.Setting = pe.Setting
	return e
}

// itoa writes an int.
func itoa(n int) string { return strconv.Itoa(n) }
