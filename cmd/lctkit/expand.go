package main

import (
	"fmt"
	"io"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// expandCmd prints the canonical expansion of an expression.
type expandCmd struct {
	Expr  string `arg:"" help:"The expression, or - to read it from standard input."`
	Order int    `help:"Truncate power series at this total degree (needed for exp, log, sin, … and division by non-constants)." placeholder:"D"`
	At    string `help:"Expand around this point: the result is a polynomial in the offsets w − w* (named like the variables), each function expanded around its argument's value there." placeholder:"x=1/2,y=0"`
	Vars  string `help:"Variables that come first, in this order (the others follow in the order they first appear)." placeholder:"x,y,z"`
	jsonFlag
}

// Help is shown under the command's usage.
func (c *expandCmd) Help() string {
	return "Example:\n  lctkit expand '(x + y)^3 - x*y' --at x=1\n  lctkit expand 'exp(x*y) - 1' --order 4"
}

// expandAnswer is what expand prints: the polynomial as text, and in JSON
// with its variables, size and truncation.
type expandAnswer struct {
	Polynomial string   `json:"polynomial"`
	Variables  []string `json:"variables"`
	Terms      int      `json:"terms"`
	Degree     int      `json:"degree"`
	Order      int      `json:"order,omitempty"`
	Truncated  bool     `json:"truncated"`
	// Remainder lists monomials such that every omitted term is a
	// multiple of one of them (empty when nothing was omitted).
	Remainder []string `json:"remainder,omitempty"`
}

// Run expands the expression.
func (c *expandCmd) Run(e *env) error {
	src, err := readExpr(c.Expr, e)
	if err != nil {
		return err
	}
	vars, err := rlct.SplitNames(c.Vars)
	if err != nil {
		return badFlag("--vars", err)
	}
	var names []string
	var point []*big.Rat
	if c.At != "" {
		names, point, err = monomial.ParseBindings(c.At)
		if err != nil {
			printError(e.stderr, "--at", c.At, err)
			return exitError{exitUsage, err}
		}
	}
	for _, n := range names {
		if !slices.Contains(vars, n) {
			vars = append(vars, n)
		}
	}
	cfg := monomial.Config{Vars: vars, Order: c.Order}
	if point != nil {
		// Each function is expanded around its argument's value at the
		// point, so series work there too.
		cfg.At = make(map[string]*big.Rat, len(names))
		for j, n := range names {
			cfg.At[n] = point[j]
		}
	}
	ex, err := monomial.Parse(src, cfg)
	if err != nil {
		printError(e.stderr, "", src, err)
		return exitError{exitFailed, err}
	}
	p := ex.Poly
	a := &expandAnswer{Polynomial: p.String(), Variables: p.Vars(), Terms: p.Len(), Degree: p.Degree(), Order: ex.Order, Truncated: ex.Truncated}
	for _, r := range ex.Remainder {
		a.Remainder = append(a.Remainder, monomial.Monomial(p.Vars(), r, big.NewRat(1, 1)).String())
	}
	return e.print(a, c.JSON)
}

func (a *expandAnswer) writeText(w io.Writer) {
	fmt.Fprintln(w, a.Polynomial)
	if len(a.Remainder) > 0 {
		fmt.Fprintf(w, "  + terms that are multiples of %s (truncated at degree %d)\n", strings.Join(a.Remainder, ", "), a.Order)
	}
}
