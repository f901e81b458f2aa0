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
	if hint := settingHint(err, flagHints); hint != "" {
		fmt.Fprintf(w, "  (%s)\n", hint)
	}
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

// Hints that name what the user can change for an error that a setting
// would lift (monomial.Error.Setting): on the command line a flag, in a
// batch record a field.
var (
	flagHints = map[string]string{
		"Order":    "give --order D to expand it as a power series truncated at total degree D, or --order auto to let lctkit choose D",
		"MaxTerms": "raise --max-terms to allow larger expansions",
		"At":       "each function is expanded around its argument's value at the point, the origin unless --at moves it; rewrite it as the message says",
		"Vars":     "a variable that K does not use counts as a dimension only when --vars names it",
	}
	recordHints = map[string]string{
		"Order":    `set "order" in the record to expand it as a power series truncated at that total degree, or to "auto" to let lctkit choose it`,
		"MaxTerms": "raise batch's --max-terms to allow larger expansions",
		"At":       `each function is expanded around its argument's value at the point, the origin unless "at" moves it; rewrite it as the message says`,
		"Vars":     `a variable that K does not use counts as a dimension only when "vars" names it`,
	}
)

// settingHint returns the hint for err from hints, a note that a built-in
// limit was reached, or "" when no setting is involved.
func settingHint(err error, hints map[string]string) string {
	var pe *monomial.Error
	if !errors.As(err, &pe) || pe.Setting == "" {
		return ""
	}
	if h, ok := hints[pe.Setting]; ok {
		return h
	}
	return "this is a built-in limit of lctkit"
}
