package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"math/big"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/alecthomas/kong"
	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// bundledExample is what `lctkit bound` evaluates when no expression is
// given. The scenario is invented: a heater gain g and two vent gains v1, v2
// act on a greenhouse only through their products, and the true setting has
// all three products zero.
const bundledExample = "(g*v1)^2 + (g*v2)^2 + (v1*v2)^2"

// problemFlags are the flags shared by the commands that take a problem.
type problemFlags struct {
	Prior string    `help:"Prior exponents near the point: x=1,y=1/2 means a prior proportional to |x|^1·|y|^(1/2); unnamed variables have 0 (uniform). Each name must be a variable of K or of --vars." placeholder:"x=1,y=1/2"`
	At    []string  `help:"The point w* (default the origin); unnamed coordinates are 0, and each name must be a variable of K or of --vars. Repeat for several points: the minimum is reported with each local answer." placeholder:"x=0,y=1/3" sep:"none"`
	SOS   string    `help:"Give K as a sum of squares instead of EXPR: generators separated by ';' stand for K = g1^2 + g2^2 + …; - reads them from standard input." placeholder:"g1; g2"`
	Order orderFlag `help:"Truncate power series (exp, log, sin, … and division by non-constants) at this total degree D, or auto: raise the order until the omitted terms are certified not to change the answer, and say which order was used." default:"auto" placeholder:"D|auto"`
	Vars  string    `help:"Variables that come first, in this order; names K does not use still count as dimensions." placeholder:"x,y,z"`

	MaxFaces int `name:"max-faces" help:"Most compact faces the certificate examines before it stops with an upper bound (default 20000)." placeholder:"N"`
	MaxTerms int `name:"max-terms" help:"Most terms an expansion may have (default 2000000)." placeholder:"N"`

	NoReduce bool `name:"no-reduce" help:"Do not change coordinates at all (no splitting off of regular directions, no repair of degenerate edges): give the Newton value of K itself."`
	NoRepair bool `name:"no-repair" help:"Do not repair degenerate edges by changes of coordinates x_j -> x_j + c*w^m (the splitting off of regular directions still runs unless --no-reduce is given)."`
}

// Validate checks the flags' ranges before Run.
func (f *problemFlags) Validate() error {
	switch {
	case f.MaxFaces < 0:
		return fmt.Errorf("--max-faces must not be negative")
	case f.MaxTerms < 0:
		return fmt.Errorf("--max-terms must not be negative")
	}
	return nil
}

// options returns the library options the flags ask for.
func (f *problemFlags) options() *rlct.Options {
	return &rlct.Options{MaxFaces: f.MaxFaces, NoReduction: f.NoReduce, NoRepair: f.NoReduce || f.NoRepair}
}

// spec turns the flags and the expression argument into a library spec. It
// returns the spec and a note to print when the bundled example is used.
func (f *problemFlags) spec(expr string, e *env) (*rlct.Spec, string, error) {
	vars, err := rlct.SplitNames(f.Vars)
	if err != nil {
		return nil, "", badFlag("--vars", err)
	}
	s := &rlct.Spec{Prior: f.Prior, At: f.At, Order: int(f.Order), Vars: vars, Limits: monomial.Limits{MaxTerms: f.MaxTerms}}
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

// solve parses the spec and bounds it (choosing the order of its series
// with --order auto), printing positioned errors.
func solve(s *rlct.Spec, opt *rlct.Options, e *env) (*rlct.Result, error) {
	_, res, err := s.Bound(context.Background(), opt)
	if err != nil {
		var se *rlct.SpecError
		if errors.As(err, &se) {
			return nil, showSpecError(e, err)
		}
		return nil, err
	}
	return res, nil
}

// problem parses the spec into the problem to analyse, printing positioned
// errors. With --order auto it first bounds the spec to choose the order
// (see rlct.Spec.Bound).
func problem(s *rlct.Spec, opt *rlct.Options, e *env) (*rlct.Problem, error) {
	var p *rlct.Problem
	var err error
	if s.Order == rlct.OrderAuto {
		p, _, err = s.Bound(context.Background(), opt)
		if err == nil && p.Truncated {
			// The chosen order, expanded in full: Spec.Bound may have cut
			// the series by the polyhedron (same polyhedron, fewer points
			// inside it), which the pictures and the estimate should not
			// see. If the full expansion exceeds a limit, the cut one is
			// kept.
			at := *s
			at.Order = p.Order
			if full, ferr := at.Problem(); ferr == nil {
				p = full
			}
		}
	} else {
		p, err = s.Problem()
	}
	if err != nil {
		var se *rlct.SpecError
		if errors.As(err, &se) {
			return nil, showSpecError(e, err)
		}
		return nil, err
	}
	return p, nil
}

// orderFlag is --order: a total degree D >= 0, or "auto" (rlct.OrderAuto).
type orderFlag int

// Decode implements kong.MapperValue.
func (o *orderFlag) Decode(ctx *kong.DecodeContext) error {
	var v string
	if err := ctx.Scan.PopValueInto("order", &v); err != nil {
		return err
	}
	if strings.TrimSpace(v) == "auto" {
		*o = orderFlag(rlct.OrderAuto)
		return nil
	}
	n, err := strconv.Atoi(strings.TrimSpace(v))
	switch {
	case err != nil:
		return fmt.Errorf("--order must be a total degree (an integer D >= 0) or auto, not %q", v)
	case n < 0:
		return fmt.Errorf("--order must not be negative")
	case n > monomial.DefaultMaxOrder:
		return fmt.Errorf("--order %d is above the largest order lctkit expands, %d", n, monomial.DefaultMaxOrder)
	}
	*o = orderFlag(n)
	return nil
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
	jsonFlag
	Model string `help:"Build K from the model description in FILE (- for standard input) and bound it, as lctkit model does." placeholder:"FILE"`
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
               the output says which --order would certify it, or that a
               higher one may

A series is expanded at an order chosen until its omitted terms are certified
(--order auto, the default), or at --order D. Before the polyhedron is read,
the regular directions at the point are split off and degenerate edges are
repaired by exact changes of coordinates, which the output lists (--no-reduce
and --no-repair give the Newton value of K as written). Only the faces that
hold a negative or odd term (in --sos form: two terms of one generator) can be
degenerate, so only those are examined, and the search stops at the first
degenerate face; --all-faces decides and lists every compact face instead.

Examples:
  lctkit bound 'x^4 + y^6'
  lctkit bound '(x-y)^2'                      # exact 1/2 after u = x - y
  lctkit bound '(x-y)^2' --no-reduce          # K as written: degenerate, an upper bound
  lctkit bound --sos 'a*b; a*c' --prior a=1
  lctkit bound 'x^2*(1-cos(y))' --json        # a series: the order is chosen
  lctkit bound 'x^2*(x-1)^4 + y^2' --at x=0 --at x=1 --n 1000`
}

// Run bounds the problem and prints the answer.
func (c *boundCmd) Run(e *env) error {
	if c.Model != "" {
		if c.Expr != "" || c.SOS != "" || c.Prior != "" || len(c.At) > 0 || c.Vars != "" {
			return usageError{errors.New("--model takes the prior, the truth and K from the description: give no EXPR, --sos, --prior, --at or --vars with it")}
		}
		return runModel(e, c.Model, modelFlags{Order: max(int(c.Order), 0), MaxFaces: c.MaxFaces, MaxTerms: c.MaxTerms, N: c.N, AllFaces: c.AllFaces, jsonFlag: c.jsonFlag})
	}
	s, note, err := c.spec(c.Expr, e)
	if err != nil {
		return err
	}
	ns, err := parseSizes(c.N)
	if err != nil {
		return badFlag("--n", err)
	}
	opt := c.options()
	opt.AllFaces = c.AllFaces
	r, err := solve(s, opt, e)
	if err != nil {
		return err
	}
	a := &boundAnswer{Result: r, note: note}
	if ns != nil {
		a.Penalty = rlct.NewPenalties(r.Lambda, r.Theta, r.Status, len(r.Vars), ns)
	}
	return e.print(a, c.JSON)
}

// boundAnswer is what bound prints: the result and, with --n, the
// penalties.
type boundAnswer struct {
	*rlct.Result
	Penalty *rlct.Penalties `json:"penalty,omitempty"`
	note    string          // says that the bundled example is evaluated (text only)
}

func (a *boundAnswer) writeText(w io.Writer) {
	if a.note != "" {
		fmt.Fprintln(w, a.note)
	}
	writeBound(w, a.Result, a.Penalty)
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

// writeBound prints the plain-text answer. With several points it prints
// the minimum, then each point's answer under its own label.
func writeBound(w io.Writer, r *rlct.Result, pen *rlct.Penalties) {
	word := statusWord(r.Status)
	if r.LambdaCertified {
		word = "λ certified, θ an upper bound"
	}
	fmt.Fprintf(w, "λ = %s   θ = %d   (%s)\n", r.Lambda.RatString(), r.Theta, word)
	writeStatusLine(w, r, "  ")
	if len(r.Locals) == 0 {
		if !allZero(r.Point) {
			fmt.Fprintf(w, "  at the point %s (polynomials below are in the offsets w − w*)\n", pointString(r.Vars, r.Point))
		}
		writeDetails(w, r, "  ")
	} else {
		fmt.Fprintf(w, "  the minimum over %d points (the true learning coefficient is the least of the local ones):\n", len(r.Locals))
		for i, l := range r.Locals {
			mark := ""
			if l.Lambda.Cmp(r.Lambda) == 0 && l.Theta == r.Theta {
				mark = "   ← the minimum"
			}
			fmt.Fprintf(w, "  point %d at %s: λ = %s, θ = %d (%s)%s\n", i+1, pointString(l.Vars, l.Point), l.Lambda.RatString(), l.Theta, statusWord(l.Status), mark)
		}
		for i, l := range r.Locals {
			fmt.Fprintf(w, "  point %d at %s (polynomials in the offsets w − w*):\n", i+1, pointString(l.Vars, l.Point))
			writeStatusLine(w, l, "    ")
			writeDetails(w, l, "    ")
		}
		if r.Status != rlct.Exact {
			fmt.Fprintln(w, "  The minimum is not exact, because:")
			for _, reason := range r.Reasons {
				fmt.Fprintf(w, "  - %s\n", reason)
			}
		}
	}
	if pen != nil {
		writePenaltyLines(w, pen, "    ")
	}
}

// writeStatusLine says, under the headline, what a status that is not
// exact claims.
func writeStatusLine(w io.Writer, r *rlct.Result, indent string) {
	switch r.Status {
	case rlct.UpperBound:
		if r.LambdaCertified {
			fmt.Fprintf(w, "%sthe true λ is %s (certified); θ is not certified: the true θ is at least %d\n", indent, r.Lambda.RatString(), r.Theta)
			return
		}
		fmt.Fprintf(w, "%sthe true λ is at most %s, and if it equals %s the true θ is at least %d (θ is ordered together with λ)\n",
			indent, r.Lambda.RatString(), r.Lambda.RatString(), r.Theta)
	case rlct.Uncertified:
		fmt.Fprintf(w, "%s%s\n", indent, r.Summary)
	}
}

// writeDetails prints the polyhedron, the certificate and the reasons of
// one point's answer.
func writeDetails(w io.Writer, r *rlct.Result, indent string) {
	if red := r.Reduction; red != nil {
		writeReduction(w, r, indent)
		return
	}
	if r.Repair != nil {
		writeRepair(w, r, indent)
	}
	fmt.Fprintf(w, "%sNewton distance t = %s along τ = (%s) in (%s)\n", indent, r.Distance.RatString(), ratList(r.Weights), strings.Join(r.Vars, ", "))
	pf := r.Principal
	kind := "compact"
	if !pf.Compact {
		kind = "non-compact, rays " + strings.Join(pf.Rays, ", ")
	}
	fmt.Fprintf(w, "%sprincipal face: dimension %d, codimension %d (%s), vertices %s\n", indent, pf.Dim, pf.Codim, kind, shortVertexList(pf.Vertices))
	fmt.Fprintf(w, "%sface polynomial: %s\n", indent, shortPolynomial(pf.Polynomial, pf.Terms))
	switch r.Status {
	case rlct.Exact:
		fmt.Fprintf(w, "%scertificate: %s\n", indent, certificateSummary(r.Certificate, r.Form))
		if r.Truncation != nil {
			fmt.Fprintf(w, "%struncation at degree %d: the omitted terms cannot change the answer\n", indent, r.Truncation.Order)
		}
	case rlct.UpperBound:
		if r.LambdaCertified {
			fmt.Fprintf(w, "%sλ is certified; θ is only an upper bound in the order of λ and θ, because:\n", indent)
		} else {
			fmt.Fprintf(w, "%sThis is an upper bound, not necessarily the learning coefficient, because:\n", indent)
		}
	default:
		fmt.Fprintf(w, "%sThis is not a bound: it may lie below the true learning coefficient, because:\n", indent)
	}
	for _, reason := range r.Reasons {
		fmt.Fprintf(w, "%s- %s\n", indent, reason)
	}
	for _, n := range r.Notes {
		fmt.Fprintf(w, "%snote: %s\n", indent, n)
	}
	if r.Status != rlct.Exact && r.Certificate != nil {
		fmt.Fprintf(w, "%sfaces: %s\n", indent, certificateSummary(r.Certificate, r.Form))
	}
	if len(r.Faces) > 0 {
		fmt.Fprintf(w, "%scompact faces (%d; * marks the principal face):\n", indent, len(r.Faces))
		for _, f := range r.Faces {
			mark := " "
			if f.Principal {
				mark = "*"
			}
			fmt.Fprintf(w, "%s %s %s  %s  %s\n", indent, mark, shortVertexList(f.Vertices), shortPolynomial(f.Polynomial, f.Terms), verdictText(f))
		}
	}
}

// Text output keeps lines readable: at most maxTextVertices vertices and
// about maxTextPolynomial characters of a polynomial are shown, with a
// count of the rest (the JSON output has everything).
const (
	maxTextVertices   = 12
	maxTextPolynomial = 300
)

// shortVertexList writes vs, abbreviated after maxTextVertices vertices.
func shortVertexList(vs [][]int) string {
	if len(vs) <= maxTextVertices {
		return vertexList(vs)
	}
	return fmt.Sprintf("%s … (%d vertices in all)", vertexList(vs[:maxTextVertices]), len(vs))
}

// shortPolynomial cuts a long polynomial at a term boundary (" + " or
// " - ") near maxTextPolynomial characters and says how many terms it has.
func shortPolynomial(p string, terms int) string {
	if len(p) <= maxTextPolynomial {
		return p
	}
	cut := maxTextPolynomial
	for cut > 0 && !(p[cut] == ' ' && cut+1 < len(p) && (p[cut+1] == '+' || p[cut+1] == '-')) {
		cut--
	}
	if cut == 0 {
		cut = maxTextPolynomial
		for cut < len(p) && !utf8.RuneStart(p[cut]) {
			cut++
		}
	}
	if terms > 0 {
		return fmt.Sprintf("%s … (%d terms in all)", p[:cut], terms)
	}
	return p[:cut] + " …"
}

// writePenaltyLines prints the penalties, each marked when the pair is not
// exact, with a note that says what such a penalty is not.
func writePenaltyLines(w io.Writer, pen *rlct.Penalties, indent string) {
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

// maxCoreText is the longest list of core generators printed as text.
const maxCoreText = 2000

// writeReduction prints an answer found through a reduction: the change of
// coordinates, the core's details, and the value without the reduction.
func writeReduction(w io.Writer, r *rlct.Result, indent string) {
	red := r.Reduction
	how := "solved ∂K/∂" + strings.Join(red.Solved, " = ∂K/∂") + " = 0 (the quadratic part has rank " + strconv.Itoa(red.Rank) + ")"
	if len(red.Completions) > 0 {
		how = "completed the square in " + strings.Join(red.Solved, ", ") + " (the quadratic part has rank " + strconv.Itoa(red.Rank) + ")"
	}
	if red.Kind == "generators" {
		gs := make([]string, len(red.Generators))
		for i, g := range red.Generators {
			gs[i] = strconv.Itoa(g)
		}
		how = "solved generators " + strings.Join(gs, ", ") + " for " + strings.Join(red.Solved, ", ")
	}
	fmt.Fprintf(w, "%sreduction: %s; they contribute %d/2 to λ: %s\n", indent, how, red.Rank, strings.Join(red.Solution, "; "))
	if len(red.Eliminations) > 0 {
		fmt.Fprintf(w, "%ssolved exactly, one at a time, each in the coordinates left by the ones before; the other generators were multiplied by the power of the denominator (a unit at the point) that clears it\n", indent)
		if core := strings.Join(red.K, "; "); len(red.K) == 0 {
			fmt.Fprintf(w, "%score generators: none (every generator was solved)\n", indent)
		} else if len(core) <= maxCoreText {
			fmt.Fprintf(w, "%score generators: %s\n", indent, core)
		} else {
			fmt.Fprintf(w, "%score generators: %d polynomials (listed by --json)\n", indent, len(red.K))
		}
	}
	if len(red.Completions) > 0 {
		fmt.Fprintf(w, "%scompleted the square exactly, one coordinate at a time, each in the coordinates left by the ones before: K = A·x² + B·x + C with A a unit at the point becomes the core 4·A·C − B², divided by the units at the point that divide it exactly (the A's so far, a positive constant)\n", indent)
		for _, st := range red.Completions {
			if len(st.A)+len(st.B)+len(st.Divisor)+len(st.Core) <= maxCoreText {
				if st.Divisor != "" {
					fmt.Fprintf(w, "%s  %s: A = %s, B = %s, (4·A·C − B²)/(%s) = %s\n", indent, st.Variable, st.A, st.B, st.Divisor, st.Core)
					continue
				}
				fmt.Fprintf(w, "%s  %s: A = %s, B = %s, 4·A·C − B² = %s\n", indent, st.Variable, st.A, st.B, st.Core)
			} else {
				fmt.Fprintf(w, "%s  %s: (listed by --json)\n", indent, st.Variable)
			}
		}
	}
	if len(red.Free) > 0 {
		fmt.Fprintf(w, "%sfree directions (contribute 0): %s\n", indent, strings.Join(red.Free, ", "))
	}
	if len(red.Kept) > 0 {
		fmt.Fprintf(w, "%snot moved (prior exponent at the point): %s\n", indent, strings.Join(red.Kept, ", "))
	}
	if c := red.Core; c != nil {
		fmt.Fprintf(w, "%score in (%s): λ = %s, θ = %d (%s)\n", indent, strings.Join(c.Vars, ", "), c.Lambda.RatString(), c.Theta, statusWord(c.Status))
		writeDetails(w, c, indent+"  ")
	} else {
		fmt.Fprintf(w, "%score: 0 (λ = 0, θ = 1)\n", indent)
	}
	u := red.Unreduced
	fmt.Fprintf(w, "%swithout the reduction: λ = %s, θ = %d (%s)\n", indent, u.Lambda.RatString(), u.Theta, statusWord(u.Status))
	for _, n := range r.Notes {
		fmt.Fprintf(w, "%snote: %s\n", indent, n)
	}
}

// writeRepair prints the changes of coordinates behind a repaired answer,
// K after them and the values before and after; the polyhedron of K
// itself follows.
func writeRepair(w io.Writer, r *rlct.Result, indent string) {
	rep := r.Repair
	for _, c := range r.Changes {
		fmt.Fprintf(w, "%schange: %s\n", indent, c)
	}
	if len(rep.Steps) > 0 {
		fmt.Fprintf(w, "%sK after the changes: %s\n", indent, strings.Join(rep.K, "; "))
	}
	f, u := rep.Final, rep.Unrepaired
	fmt.Fprintf(w, "%safter the changes: λ = %s, θ = %d (%s); K itself: λ = %s, θ = %d (%s), whose polyhedron follows\n",
		indent, f.Lambda.RatString(), f.Theta, statusWord(f.Status), u.Lambda.RatString(), u.Theta, statusWord(u.Status))
}
