package main

import (
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/lctkit/lctkit/monomial"
)

// printError writes err to w. When err carries a position in src (a
// monomial.Error), the offending line is shown with a caret under the
// column.
func printError(w io.Writer, label, src string, err error) {
	fmt.Fprintf(w, "lctkit: %s\n", err)
	var pe *monomial.Error
	if !errors.As(err, &pe) || src == "" || pe.Line < 1 {
		return
	}
	lines := strings.Split(src, "\n")
	if pe.Line > len(lines) {
		return
	}
	line := lines[pe.Line-1]
	if utf8.RuneCountInString(line) > 200 {
		return // a caret under a megabyte line helps nobody
	}
	prefix := "  "
	if label != "" {
		prefix = "  " + label + ": "
	}
	fmt.Fprintf(w, "%s%s\n", prefix, line)
	col := max(pe.Col, 1)
	fmt.Fprintf(w, "%s%s^\n", strings.Repeat(" ", utf8.RuneCountInString(prefix)), strings.Repeat(" ", col-1))
}

// usageError is an error in the value of a flag; the command exits with
// exitUsage, as for an unknown flag.
type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }
func (e usageError) Unwrap() error { return e.err }

// badFlag reports a bad value of the named flag ("--n").
func badFlag(flag string, err error) error {
	return usageError{fmt.Errorf("%s: %w", flag, err)}
}
