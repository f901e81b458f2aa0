package rlct

import (
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// Spec is a problem written as text, the way the command line, batch
// records and model tables give it. Spec.Problem turns it into a Problem.
type Spec struct {
	// K is the function as an expression. Set K or SOS.
	K string
	// SOS lists generators g_1, …, g_r, for K = Σ g_i².
	SOS []string
	// Prior is "x=1,y=1/2": the prior is proportional to |x|^1·|y|^(1/2) near
	// the point; unnamed variables have exponent 0. Every name must be a
	// variable.
	Prior string
	// At lists points, each "x=0,y=1/3"; unnamed coordinates are 0. No
	// point means the origin. Every name must be a variable.
	At []string
	// Order truncates power series at this total degree (0: polynomials only).
	Order int
	// Vars names variables that come first, in order; they count as
	// dimensions even when K does not use them.
	Vars []string
	// Limits guards the expansion.
	Limits monomial.Limits
}

// SpecError is an error in one field of a Spec. When Err is a
// *monomial.Error its position refers to Src.
type SpecError struct {
	Field string // "k", "sos", "prior", "at"
	Src   string // the text the position refers to
	Err   error
}

func (e *SpecError) Error() string { return e.Field + ": " + e.Err.Error() }

// Unwrap returns the underlying error.
func (e *SpecError) Unwrap() error { return e.Err }

// Is reports that a SpecError is an input error (see ErrInput).
func (e *SpecError) Is(target error) bool { return target == ErrInput }

// Problem parses the spec and returns the problem ready for Bound, with
// its points (none for the origin).
//
// The variables are Vars followed by those of K (or of the generators) in
// the order of their first appearance; Prior and At only give values to
// them. A name in Prior or At that is not one of the variables is an error
// (a *monomial.Error with Setting "Vars" at the name, inside a *SpecError):
// a variable K does not use counts as a dimension only when Vars names it.
// Errors in an expression are *SpecError values wrapping the parser's
// positioned error.
func (s *Spec) Problem() (*Problem, error) { return s.problem(nil) }

// problem is Problem with a floor for the expansion (monomial.Config.Floor,
// in the variables of the problem; nil for none). The floor is used for the
// expansion that the problem keeps: the one at the origin when At is empty,
// the one at the single point of At (expandAt) when that is not the
// origin; with several points, or one at the origin given in At, it is not
// used.
func (s *Spec) problem(floor [][]int) (*Problem, error) {
	if (s.K == "") == (len(s.SOS) == 0) {
		if s.K == "" {
			return nil, ErrNoFunction
		}
		return nil, ErrTwoForms
	}
	cfg := monomial.Config{Vars: s.Vars, Order: s.Order, Limits: s.Limits}
	if len(s.At) == 0 {
		cfg.Floor = floor
	}
	p := &Problem{Order: s.Order}
	var vars []string
	if s.K != "" {
		ex, err := monomial.Parse(s.K, cfg)
		if err != nil {
			return nil, &SpecError{"k", s.K, err}
		}
		p.K, p.Truncated, p.Remainder = ex.Poly, ex.Truncated, ex.Remainder
		vars = ex.Poly.Vars()
	} else {
		src := strings.Join(s.SOS, ";\n")
		exs, err := monomial.ParseList(src, cfg)
		if err != nil {
			return nil, &SpecError{"sos", src, err}
		}
		for _, ex := range exs {
			p.Generators = append(p.Generators, ex.Poly)
			p.Truncated = p.Truncated || ex.Truncated
			p.Remainder = append(p.Remainder, ex.Remainder...)
		}
		if len(exs) > 0 {
			vars = exs[0].Poly.Vars()
		}
	}
	if len(vars) == 0 {
		return nil, ErrNoVariables
	}
	if strings.TrimSpace(s.Prior) != "" {
		prior, err := bind(s.Prior, vars)
		if err != nil {
			return nil, &SpecError{"prior", s.Prior, err}
		}
		p.Prior = prior
	}
	for _, a := range s.At {
		w, err := bind(a, vars)
		if err != nil {
			return nil, &SpecError{"at", a, err}
		}
		p.Points = append(p.Points, w)
	}
	if p.Truncated && len(p.Points) == 1 && !isOrigin(p.Points[0]) {
		if err := s.expandAt(p, vars, floor); err != nil {
			return nil, err
		}
	}
	return p, nil
}

// expandAt replaces the series of p, truncated around the origin, by its
// expansion around p's single point (monomial.Config.At): each function
// is expanded around its argument's value there, the variables keep their
// order, and the problem is marked Centered. The parser refuses a point
// where a coefficient would be irrational (exp(1/4), log(3)) or where a
// function has no Taylor series, naming the function and the value.
func (s *Spec) expandAt(p *Problem, vars []string, floor [][]int) error {
	at := make(map[string]*big.Rat, len(vars))
	for i, v := range vars {
		at[v] = p.Points[0][i]
	}
	cfg := monomial.Config{Vars: vars, Order: s.Order, Limits: s.Limits, At: at, Floor: floor}
	p.Centered, p.Truncated = true, false
	if s.K != "" {
		ex, err := monomial.Parse(s.K, cfg)
		if err != nil {
			return &SpecError{"k", s.K, err}
		}
		p.K, p.Truncated, p.Remainder = ex.Poly, ex.Truncated, ex.Remainder
		return nil
	}
	src := strings.Join(s.SOS, ";\n")
	exs, err := monomial.ParseList(src, cfg)
	if err != nil {
		return &SpecError{"sos", src, err}
	}
	p.Generators, p.Remainder = p.Generators[:0], nil
	for _, ex := range exs {
		p.Generators = append(p.Generators, ex.Poly)
		p.Truncated = p.Truncated || ex.Truncated
		p.Remainder = append(p.Remainder, ex.Remainder...)
	}
	return nil
}

// bind reads bindings "x=1,y=1/2" as a vector over vars, 0 where a variable
// is not named.
func bind(src string, vars []string) ([]*big.Rat, error) {
	names, values, err := monomial.ParseBindings(src)
	if err != nil {
		return nil, err
	}
	out := make([]*big.Rat, len(vars))
	for i := range out {
		out[i] = new(big.Rat)
	}
	for j, n := range names {
		i := slices.Index(vars, n)
		if i < 0 {
			e := bindingError(src, n)
			e.Msg = fmt.Sprintf("%s is not a variable of K (variables: %s)", n, strings.Join(vars, ", "))
			e.Setting = "Vars"
			return nil, e
		}
		out[i] = values[j]
	}
	return out, nil
}

// bindingError returns an error positioned at the binding of name in src,
// which ParseBindings has accepted: the first occurrence of name as a whole
// identifier followed by '=' (a value is a number, so it holds no
// identifier, and names are not repeated).
func bindingError(src, name string) *monomial.Error {
	off := 0
	for from := 0; from < len(src); {
		i := strings.Index(src[from:], name)
		if i < 0 {
			break
		}
		i += from
		end := i + len(name)
		before := i == 0 || !identByte(src[i-1])
		after := strings.HasPrefix(strings.TrimLeft(src[end:], " \t\r\n"), "=")
		if before && after && (end == len(src) || !identByte(src[end])) {
			off = i
			break
		}
		from = i + 1
	}
	line, col := 1, 1
	for _, r := range src[:off] {
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
	}
	return &monomial.Error{Offset: off, Line: line, Col: col}
}

// identByte reports whether c can be part of an ASCII identifier.
func identByte(c byte) bool {
	return c == '_' || c >= '0' && c <= '9' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z'
}

// SplitNames reads a variable list written "x,y,z" (white space around the
// names is ignored); an empty or blank string gives nil.
func SplitNames(s string) ([]string, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	var out []string
	for _, f := range strings.Split(s, ",") {
		f = strings.TrimSpace(f)
		if f == "" {
			return nil, fmt.Errorf("empty variable name in %q", s)
		}
		out = append(out, f)
	}
	return out, nil
}
