package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math/big"
	"sort"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/rlct"
)

// bundledExample is what `lctkit bound` evaluates when no expression is
// given. The scenario is invented: a heater gain g and two vent gains v1, v2
// act on a greenhouse only through their products, and the true setting has
// all three products zero.
const bundledExample = "(g*v1)^2 + (g*v2)^2 + (v1*v2)^2"

// problemFlags are the flags shared by the commands that take a problem.
type problemFlags struct {
	Prior string   `help:"Prior exponents near the point: x=1,y=1/2 means a prior proportional to |x|^1·|y|^(1/2); unnamed variables have 0 (uniform)." placeholder:"x=1,y=1/2"`
	At    []string `help:"The point w* (default the origin); unnamed coordinates are 0. Repeat for several points: the minimum is reported with each local answer." placeholder:"x=0,y=1/3" sep:"none"`
	SOS   string   `help:"Give K as a sum of squares instead of EXPR: generators separated by ';' stand for K = g1^2 + g2^2 + …; - reads them from standard input." placeholder:"g1; g2"`
	Order int      `help:"Truncate power series at this total degree; needed for exp, log, sin, … and division by non-constants." placeholder:"D"`
	Vars  string   `help:"Variables that come first, in this order; names K does not use still count as dimensions." placeholder:"x,y,z"`

	MaxFaces int `name:"max-faces" help:"Most compact faces the certificate examines before it stops with an upper bound (default 20000)." placeholder:"N"`
}

// options returns the library options the flags ask for.
func (f *problemFlags) options() *rlct.Options {
	return &rlct.Options{MaxFaces: f.MaxFaces}
}

// spec turns the flags and the expression argument into a library spec. It
// returns the spec and a note to print when the bundled example is used.
func (f *problemFlags) spec(expr string, e *env) (*rlct.Spec, string, error) {
	vars, err := rlct.SplitNames(f.Vars)
	if err != nil {
		return nil, "", badFlag("--vars", err)
	}
	s := &rlct.Spec{Prior: f.Prior, At: f.At, Order: f.Order, Vars: vars}
	note := ""
	switch {
	case expr != "" && f.SOS != "":
		return nil, "", usageError{errors.New("give either EXPR or --sos, not both")}
	case f.SOS != "":
		src, err := readExpr(f.SOS, e)
		if err != nil {
			return nil, "", err
		}
		s.SOS = []string{src}
	case expr != "":
		src, err := readExpr(expr, e)
		if err != nil {
			return nil, "", err
		}
		s.K = src
	default:
		s.K = bundledExample
		note = "no expression given: evaluating the bundled example (an invented greenhouse model with heater gain g and vent gains v1, v2)\n  K = " + bundledExample
	}
	return s, note, nil
}

// solve parses the spec and bounds it, printing positioned errors.
func solve(s *rlct.Spec, opt *rlct.Options, e *env) (*rlct.Result, error) {
	p, points, err := s.Problem()
	if err != nil {
		return nil, showSpecError(e, err)
	}
	r, err := rlct.BoundAt(context.Background(), p, points, opt)
	if err != nil {
		return nil, err
	}
	return r, nil
}

// showSpecError prints a spec error with a caret when it has a position and
// returns the exit error: a usage error for a flag's value (--prior, --at),
// a failure for the expression.
func showSpecError(e *env, err error) error {
	var se *rlct.SpecError
	if errors.As(err, &se) {
		label, code := "--"+se.Field, exitUsage
		switch se.Field {
		case "k":
			label, code = "K", exitFailed
		case "sos":
			code = exitFailed
		}
		printError(e.stderr, label, se.Src, se.Err)
		return exitError{code, se.Err}
	}
	return err
}

// boundCmd bounds the learning coefficient.
type boundCmd struct {
	Expr string `arg:"" optional:"" help:"K(w), an expression vanishing at the point; - reads it from standard input. Without it the bundled example is evaluated."`
	problemFlags
	N        string `help:"Also print the penalty λ·log n − (θ−1)·log log n at these sample sizes (comma separated)." placeholder:"1000,10000"`
	AllFaces bool   `name:"all-faces" help:"Decide and list every compact face of the Newton polyhedron (the full per-face report, which can be very large); the status is the same without it."`
	JSON     bool   `help:"Print one JSON object."`
}

// Help is shown under the command's usage.
func (c *boundCmd) Help() string {
	return `Prints λ (the learning coefficient) and θ (its multiplicity) from the Newton
polyhedron of K with one of three statuses:

  exact        certified: every compact face that could be degenerate was
               decided nondegenerate (and a truncated series is long enough)
  upper bound  certified only to bound the truth: the true λ is at most this
               λ, and at equal λ the true θ is at least this θ; the reasons
               say why nothing more is claimed
  not a bound  ("uncertified" in JSON) the value of a truncated series whose
               omitted terms could change it: it may lie below the true λ;
               the output says which --order would certify it, or why none can

Only the faces that hold a negative or odd term (in --sos form: two terms of
one generator) can be degenerate, so only those are examined, and the search
stops at the first degenerate face; --all-faces decides and lists every
compact face instead.

Examples:
  lctkit bound 'x^4 + y^6'
  lctkit bound '(x-y)^2'                      # degenerate: an upper bound
  lctkit bound --sos 'a*b; a*c' --prior a=1
  lctkit bound 'x^2*(1-cos(y))' --order 6 --json
  lctkit bound 'x^2*(x-1)^4 + y^2' --at x=0 --at x=1 --n 1000`
}

// Run bounds the problem and prints the answer.
func (c *boundCmd) Run(e *env) error {
	s, note, err := c.spec(c.Expr, e)
	if err != nil {
		return err
	}
	ns, err := parseSizes(c.N)
	if err != nil {
		return badFlag("--n", err)
	}
	if note != "" && !c.JSON {
		fmt.Fprintln(e.stdout, note)
	}
	opt := c.options()
	opt.AllFaces = c.AllFaces
	r, err := solve(s, opt, e)
	if err != nil {
		if c.JSON {
			writeJSONError(e, err)
		}
		return err
	}
	rep := r.Report()
	if ns != nil {
		rep.Penalty = rlct.NewPenaltyReport(r.Lambda, r.Theta, r.Status, len(r.Vars), ns)
	}
	if c.JSON {
		return writeJSON(e.stdout, rep)
	}
	writeBound(e.stdout, r, rep.Penalty)
	return nil
}

// parseSizes reads "1000,10000" as sample sizes, each above e.
func parseSizes(s string) ([]float64, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	var out []float64
	for _, f := range strings.Split(s, ",") {
		n, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil || n <= 3 {
			return nil, fmt.Errorf("sample size %q must be a number greater than 3", strings.TrimSpace(f))
		}
		out = append(out, n)
	}
	return out, nil
}

// writeJSONError prints {"error": …} for a failed command run with --json,
// also when the message was already shown on stderr with a caret.
func writeJSONError(e *env, err error) {
	var ee exitError
	if errors.As(err, &ee) {
		if ee.err == nil {
			return
		}
		err = ee.err
	}
	writeJSON(e.stdout, &rlct.Report{Error: err.Error()})
}

func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false)
	return enc.Encode(v)
}

// statusWord is the status as the text output names it.
func statusWord(s rlct.Status) string {
	switch s {
	case rlct.Exact:
		return "exact"
	case rlct.UpperBound:
		return "upper bound"
	}
	return "NOT A BOUND"
}

// writeBound prints the plain-text answer.
func writeBound(w io.Writer, r *rlct.Result, pen *rlct.PenaltyReport) {
	fmt.Fprintf(w, "λ = %s   θ = %d   (%s)\n", r.Lambda.RatString(), r.Theta, statusWord(r.Status))
	switch r.Status {
	case rlct.UpperBound:
		fmt.Fprintf(w, "  the true λ is at most %s, and if it equals %s the true θ is at least %d (θ is ordered together with λ)\n",
			r.Lambda.RatString(), r.Lambda.RatString(), r.Theta)
	case rlct.Uncertified:
		fmt.Fprintf(w, "  %s\n", r.Headline())
	}
	if len(r.Locals) > 0 {
		fmt.Fprintf(w, "  minimum over %d points; each point:\n", len(r.Locals))
		for i, l := range r.Locals {
			fmt.Fprintf(w, "    %d. at %s: λ = %s, θ = %d (%s)\n", i+1, pointString(l.Vars, l.Point), l.Lambda.RatString(), l.Theta, statusWord(l.Status))
		}
	} else if !allZero(r.Point) {
		fmt.Fprintf(w, "  at the point %s (polynomials below are in the offsets w − w*)\n", pointString(r.Vars, r.Point))
	}
	fmt.Fprintf(w, "  Newton distance t = %s along τ = (%s) in (%s)\n", r.Distance.RatString(), ratList(r.Weights), strings.Join(r.Vars, ", "))
	pf := r.Principal
	kind := "compact"
	if !pf.Compact {
		kind = "non-compact, rays " + strings.Join(pf.Rays, ", ")
	}
	fmt.Fprintf(w, "  principal face: dimension %d, codimension %d (%s), vertices %s\n", pf.Dim, pf.Codim, kind, vertexList(pf.Vertices))
	fmt.Fprintf(w, "  face polynomial: %s\n", pf.Polynomial)
	switch r.Status {
	case rlct.Exact:
		fmt.Fprintf(w, "  certificate: %s\n", certificateSummary(r.Certificate, r.Form))
		if r.Truncation != nil {
			fmt.Fprintf(w, "  truncation at degree %d: the omitted terms cannot change the answer\n", r.Truncation.Order)
		}
	case rlct.UpperBound:
		fmt.Fprintln(w, "  This is an upper bound, not necessarily the learning coefficient, because:")
	default:
		fmt.Fprintln(w, "  This is not a bound: it may lie below the true learning coefficient, because:")
	}
	for _, reason := range r.Reasons {
		fmt.Fprintf(w, "  - %s\n", reason)
	}
	if r.Status != rlct.Exact && r.Certificate != nil {
		fmt.Fprintf(w, "  faces: %s\n", certificateSummary(r.Certificate, r.Form))
	}
	if len(r.Faces) > 0 {
		fmt.Fprintf(w, "  compact faces (%d; * marks the principal face):\n", len(r.Faces))
		for _, f := range r.Faces {
			mark := " "
			if f.Principal {
				mark = "*"
			}
			fmt.Fprintf(w, "   %s %s  %s  %s\n", mark, vertexList(f.Vertices), f.Polynomial, verdictText(f))
		}
	}
	if pen != nil {
		writePenaltyLines(w, pen, "    ")
	}
}

// writePenaltyLines prints the penalties, each marked when the pair is not
// exact, with a note that says what such a penalty is not.
func writePenaltyLines(w io.Writer, pen *rlct.PenaltyReport, indent string) {
	fmt.Fprintf(w, "%spenalty (asymptotic, in nats):\n", indent[2:])
	mark := ""
	if pen.Status != rlct.Exact {
		mark = "   [" + statusWord(pen.Status) + " pair]"
		fmt.Fprintf(w, "%snote: %s\n", indent, pen.Note)
	}
	for i, n := range pen.N {
		if pen.Regular != nil {
			fmt.Fprintf(w, "%sn = %-10g λ·log n − (θ−1)·log log n = %.4f   regular (d/2)·log n = %.4f%s\n", indent, n, pen.Singular[i], pen.Regular[i], mark)
		} else {
			fmt.Fprintf(w, "%sn = %-10g λ·log n − (θ−1)·log log n = %.4f%s\n", indent, n, pen.Singular[i], mark)
		}
	}
}

// certificateSummary says how the faces were decided.
func certificateSummary(c *rlct.Certificate, form string) string {
	if c == nil {
		return "no face was decided"
	}
	unsafe := "a negative or odd term"
	if form == "sum-of-squares" {
		unsafe = "two terms of one generator"
	}
	if c.Unsafe == 0 {
		if form == "sum-of-squares" {
			return "no generator has two terms on a compact face, so on every compact face some generator is a single term and the face is nondegenerate"
		}
		return "every term has a positive coefficient and even exponents, so every compact face polynomial is positive on the torus (nondegenerate)"
	}
	var rules []string
	for rule := range c.ByRule {
		rules = append(rules, rule)
	}
	sort.Strings(rules)
	parts := make([]string, len(rules))
	for i, rule := range rules {
		parts[i] = fmt.Sprintf("%d by %s", c.ByRule[rule], rule)
	}
	s := fmt.Sprintf("%s examined (%s); %d degenerate, %d undetermined", plural(c.Examined, "compact face", "compact faces"), strings.Join(parts, ", "), c.Degenerate, c.Undetermined)
	switch c.Stop {
	case rlct.StopSettled:
		s += "; the search stopped at the first degenerate face"
	case rlct.StopBudget:
		s += "; the search stopped at its budget (--max-faces, or the time allowed)"
	default:
		if c.Degenerate == 0 && c.Undetermined == 0 {
			s = fmt.Sprintf("every compact face that holds %s was decided nondegenerate: %s; all other compact faces are nondegenerate by their terms alone", unsafe, s)
		}
	}
	return s
}

func pointString(vars []string, x []*big.Rat) string {
	parts := make([]string, len(vars))
	for i, v := range vars {
		parts[i] = v + "=" + x[i].RatString()
	}
	return strings.Join(parts, ",")
}

func ratList(xs []*big.Rat) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = x.RatString()
	}
	return strings.Join(parts, ", ")
}

func vertexList(vs [][]int) string {
	parts := make([]string, len(vs))
	for i, v := range vs {
		s := make([]string, len(v))
		for k, x := range v {
			s[k] = strconv.Itoa(x)
		}
		parts[i] = "(" + strings.Join(s, ",") + ")"
	}
	return strings.Join(parts, " ")
}

func allZero(xs []*big.Rat) bool {
	for _, x := range xs {
		if x.Sign() != 0 {
			return false
		}
	}
	return true
}
