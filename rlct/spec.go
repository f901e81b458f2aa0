package rlct

import (
	"fmt"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// Spec is a problem written as text, the way the command line and batch
// records give it. Problem turns it into a Problem.
type Spec struct {
	// K is the function as an expression. Set K or SOS.
	K string
	// SOS lists generators g_1, …, g_r, for K = Σ g_i².
	SOS []string
	// Prior is "x=1,y=1/2": the prior is proportional to |x|^1·|y|^(1/2) near
	// the point; unnamed variables have exponent 0.
	Prior string
	// At lists points, each "x=0,y=1/3"; unnamed coordinates are 0. No
	// point means the origin.
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

// Problem parses the spec. It returns the problem and the points (nil for
// the origin alone); pass both to BoundAt.
func (s *Spec) Problem() (*Problem, [][]*big.Rat, error) {
	if (s.K == "") == (len(s.SOS) == 0) {
		if s.K == "" {
			return nil, nil, ErrNoFunction
		}
		return nil, nil, ErrTwoForms
	}
	vars := append([]string(nil), s.Vars...)
	var priorNames []string
	var priorValues []*big.Rat
	if strings.TrimSpace(s.Prior) != "" {
		var err error
		priorNames, priorValues, err = monomial.ParseBindings(s.Prior)
		if err != nil {
			return nil, nil, &SpecError{"prior", s.Prior, err}
		}
		vars = appendNew(vars, priorNames...)
	}
	type binding struct {
		names  []string
		values []*big.Rat
	}
	var at []binding
	for _, a := range s.At {
		names, values, err := monomial.ParseBindings(a)
		if err != nil {
			return nil, nil, &SpecError{"at", a, err}
		}
		vars = appendNew(vars, names...)
		at = append(at, binding{names, values})
	}
	cfg := monomial.Config{Vars: vars, Order: s.Order, Limits: s.Limits}
	p := &Problem{Order: s.Order}
	var all []string
	if s.K != "" {
		ex, err := monomial.Parse(s.K, cfg)
		if err != nil {
			return nil, nil, &SpecError{"k", s.K, err}
		}
		p.K, p.Truncated = ex.Poly, ex.Truncated
		all = ex.Poly.Vars()
	} else {
		src := strings.Join(s.SOS, ";\n")
		exs, err := monomial.ParseList(src, cfg)
		if err != nil {
			return nil, nil, &SpecError{"sos", src, err}
		}
		for _, ex := range exs {
			p.Generators = append(p.Generators, ex.Poly)
			p.Truncated = p.Truncated || ex.Truncated
		}
		if len(exs) > 0 {
			all = exs[0].Poly.Vars()
		}
	}
	if len(all) == 0 {
		return nil, nil, ErrNoVariables
	}
	index := make(map[string]int, len(all))
	for i, v := range all {
		index[v] = i
	}
	if priorNames != nil {
		p.Prior = make([]*big.Rat, len(all))
		for i := range p.Prior {
			p.Prior[i] = new(big.Rat)
		}
		for j, n := range priorNames {
			p.Prior[index[n]] = priorValues[j]
		}
	}
	var points [][]*big.Rat
	for _, b := range at {
		w := make([]*big.Rat, len(all))
		for i := range w {
			w[i] = new(big.Rat)
		}
		for j, n := range b.names {
			w[index[n]] = b.values[j]
		}
		points = append(points, w)
	}
	if p.Truncated && len(points) > 0 {
		for _, w := range points {
			if !isOrigin(w) {
				return nil, nil, &SpecError{"at", strings.Join(s.At, "; "), fmt.Errorf(
					"K is a power series truncated around the origin, and its truncation cannot be moved to another point; write it in variables shifted to the point instead")}
			}
		}
	}
	return p, points, nil
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

// appendNew appends the names not already in list.
func appendNew(list []string, names ...string) []string {
	for _, n := range names {
		if !slices.Contains(list, n) {
			list = append(list, n)
		}
	}
	return list
}
