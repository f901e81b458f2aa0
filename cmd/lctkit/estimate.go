package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"math/big"
	"os"
	"strings"
	"time"

	"github.com/alecthomas/kong"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// estimateCmd estimates λ and θ numerically and compares them with the
// Newton bound.
type estimateCmd struct {
	Expr string `arg:"" optional:"" help:"K(w), an expression vanishing at the point; - reads it from standard input. Without it the bundled example is estimated."`
	// The flags of bound, except that --at takes one point.
	Prior    string    `help:"Prior exponents near the point: x=1,y=1/2 means a prior proportional to |x|^1·|y|^(1/2); unnamed variables have 0 (uniform)." placeholder:"x=1,y=1/2"`
	At       pointFlag `help:"The point w* (default the origin); unnamed coordinates are 0. One point only: estimate each point by itself." placeholder:"x=0,y=1/3"`
	SOS      string    `help:"Give K as a sum of squares instead of EXPR: generators separated by ';' stand for K = g1^2 + g2^2 + …; - reads them from standard input." placeholder:"g1; g2"`
	Order    orderFlag `help:"Truncate power series (exp, log, sin, … and division by non-constants) at this total degree D, or auto: raise the order until the omitted terms are certified." default:"auto" placeholder:"D|auto"`
	Vars     string    `help:"Variables that come first, in this order; names K does not use still count as dimensions." placeholder:"x,y,z"`
	MaxFaces int       `name:"max-faces" help:"Most compact faces the certificate of the Newton bound examines before it stops with an upper bound (default 20000)." placeholder:"N"`
	MaxTerms int       `name:"max-terms" help:"Most terms an expansion may have (default 2000000)." placeholder:"N"`
	NoReduce bool      `name:"no-reduce" help:"Compare with the Newton value of K itself, without splitting off regular directions."`

	Box     boxFlag `help:"The box sampled, as offsets from the point: R (meaning -R:R) or A:B for every variable, or per variable x=0:1,y=0.5; unnamed variables get -1:1." placeholder:"x=0:1,y=-1:1"`
	Live    int     `help:"Live points per run (default 200; at least 10)." placeholder:"N"`
	Runs    int     `help:"Independent runs, merged for the estimate and left out one at a time for the error bars (default 16; at least 2)." placeholder:"R"`
	Seed    uint64  `help:"Master seed (default 1); the same seed gives the same numbers." default:"1" placeholder:"S"`
	Decades float64 `help:"Decades of n in the fitted grid (default 6, at most 10)." placeholder:"D"`
	Start   float64 `help:"Low end of the grid: n·(median of K) = 10^START (default 2, up to 6). Raise it when the low end is not yet asymptotic." placeholder:"START"`
	Workers int     `help:"Goroutines (default: all cores). The numbers do not depend on it." placeholder:"N"`
	jsonFlag
	SVG string `name:"svg" help:"Also draw n·E_n[K] against n with error bars, the fitted curve and the Newton bound to this SVG file." placeholder:"FILE"`
}

// Help is shown under the command's usage.
func (c *estimateCmd) Help() string {
	return `Estimates λ and θ numerically by nested sampling and sets them beside the
Newton bound. The curve y(n) = n·E_n[K], where E_n is the mean under the
density proportional to exp(−n·K)·prior on the box, tends to λ as n grows, as
λ − (θ−1)/log n; it is computed over several decades of n and fitted.

This is a numerical ESTIMATE, not a proof. The error bars are statistical
(jackknife over the independent runs). The asymptotic regime may need very
large n when the singularity is bad, and the error bars do not cover that
bias: check that the points follow the fitted curve (--svg), and raise --start
or shrink --box when they do not. Use it to see whether a degenerate bound is
probably strict, not to certify a value.

The box is in offsets from the point (--at, one point). The estimate is for the
whole box: if K vanishes elsewhere in it too, it is the smallest λ over those
zeros, so keep the box small enough to hold no worse zero than the point.
Zeros that the sampler meets away from the point, apart from the zero set
through it, are reported with their place. θ̂ below 1, which a multiplicity
cannot be, is flagged. When the Newton value is certified exact, an estimate
far from it is reported as a bias of the estimate, never as doubt about the
value. The prior of --prior is used for
coordinates where the point is 0; elsewhere it is smooth and positive near the
point and is sampled as uniform, as in the bound. A K given with --sos is
evaluated as the sum of the squared generators. A series cut at --order is
estimated as the truncated polynomial, a proxy for the full function. If the
bound finds K negative near the point, or K does not vanish there, nothing is
estimated; if the bound merely cannot be computed (a work limit), the
estimate is printed without it.

Examples:
  lctkit estimate 'x^2*y^2'                          # consistent with λ = 1/2
  lctkit estimate '(x-y)^2' --svg curve.svg          # the bound 1 is strict
  lctkit estimate 'x^4 + y^6' --box x=0:1,y=0.5 --runs 32 --seed 7
  lctkit estimate 'x^2*(x-1)^2' --box=-0.5:1.5       # reports the zero at x = 1
  lctkit estimate --sos 's*g1 - 1; s*g2' --at s=1,g1=1 --box=-0.5:0.5 --json`
}

// problem returns the flags as those of bound, with the one point.
func (c *estimateCmd) problem() *problemFlags {
	f := &problemFlags{Prior: c.Prior, SOS: c.SOS, Order: c.Order, Vars: c.Vars, MaxFaces: c.MaxFaces, MaxTerms: c.MaxTerms, NoReduce: c.NoReduce}
	if c.At.set {
		f.At = []string{c.At.value}
	}
	return f
}

// Validate checks the flags' ranges before Run, as for bound.
func (c *estimateCmd) Validate() error {
	return c.problem().Validate()
}

// Run estimates and prints.
func (c *estimateCmd) Run(e *env) error {
	flags := c.problem()
	s, note, err := flags.spec(c.Expr, e)
	if err != nil {
		return err
	}
	p, err := problem(s, flags.options(), e)
	if err != nil {
		return err
	}
	locals, err := p.Locals()
	if err != nil {
		return err
	}
	at := locals[0] // --at takes one point
	vars := at.Vars
	lower, upper, err := parseBox(string(c.Box), vars)
	if err != nil {
		return fmt.Errorf("--box: %w", err)
	}

	// The bound first: it is quick, and it refuses a K that has no learning
	// coefficient at the point.
	bound, berr := rlct.Bound(context.Background(), p, flags.options())
	if berr != nil && boundRefuses(berr) {
		return berr
	}
	prior, err := estimate.Prior(p)
	if err != nil {
		return err
	}

	prog := newProgress(e)
	est, err := estimate.Problem(context.Background(), p, estimate.Options{
		Lower: lower, Upper: upper, Prior: prior,
		Live: c.Live, Runs: c.Runs, Workers: c.Workers, Seed: c.Seed,
		Start: c.Start, Decades: c.Decades, Progress: prog.update,
	})
	prog.finish()
	if err != nil {
		var kv *estimate.KValueError
		if errors.As(err, &kv) {
			return negativeKError(kv, vars, at.Point)
		}
		return err
	}

	res := &estimateResult{
		title: pictureTitle(s), note: note, vars: vars, point: at.Point, lower: lower, upper: upper, prior: prior,
		est: est, seed: c.Seed, bound: bound, boundErr: berr, truncated: p.Truncated, order: p.Order,
		priorNotes: at.Notes,
	}
	if bound != nil {
		l, _ := bound.Lambda.Float64()
		v := est.Compare(l, bound.Status)
		res.verdict = &v
	}
	if c.SVG != "" {
		if err := os.WriteFile(c.SVG, []byte(estimatePlot(res)), 0o644); err != nil {
			return fmt.Errorf("writing the plot: %w", err)
		}
	}
	return e.print(res, c.JSON)
}

// boundRefuses reports whether a failure of the bound means that there is
// nothing to estimate: K is zero, does not vanish at the point, is negative
// near it, or the problem is malformed. Other failures (a work limit of the
// polyhedron) leave the estimate meaningful; it is printed without a bound.
func boundRefuses(err error) bool {
	return errors.Is(err, rlct.ErrInput)
}

// negativeKError names the point where K was found negative, both as offsets
// and in the original coordinates.
func negativeKError(kv *estimate.KValueError, vars []string, point []*big.Rat) error {
	offsets := make([]string, len(vars))
	at := make([]string, len(vars))
	for i, v := range vars {
		offsets[i] = fmt.Sprintf("%s=%.6g", v, kv.Point[i])
		x := kv.Point[i]
		if point != nil {
			f, _ := point[i].Float64()
			x += f
		}
		at[i] = fmt.Sprintf("%s=%.6g", v, x)
	}
	what := "negative"
	if math.IsNaN(kv.Value) || math.IsInf(kv.Value, 0) {
		what = "not a finite number"
	}
	msg := fmt.Sprintf("K is %s at a sampled point: K(%s) = %.6g", what, strings.Join(at, ", "), kv.Value)
	if point != nil && !allZero(point) {
		msg += fmt.Sprintf(" (offsets %s from the point)", strings.Join(offsets, ", "))
	}
	if what == "negative" {
		msg += "; K must be nonnegative on the whole box (shrink --box, or check K)"
	}
	return errors.New(msg)
}

// pointFlag is the value of --at for estimate: one point, which may be
// given once.
type pointFlag struct {
	value string
	set   bool
}

// Decode implements kong.MapperValue. A second --at is an error, since the
// sampler studies one point at a time.
func (p *pointFlag) Decode(ctx *kong.DecodeContext) error {
	var v string
	if err := ctx.Scan.PopValueInto("at", &v); err != nil {
		return err
	}
	if p.set {
		return fmt.Errorf("given twice (%q and %q): estimate samples one point at a time, so estimate each point by itself", p.value, v)
	}
	p.value, p.set = v, true
	return nil
}

// boxFlag is the value of --box. Unlike a plain string flag it accepts a
// value that starts with a minus sign and a digit or point, as in
// --box -1:1, which kong would otherwise take for a short flag.
type boxFlag string

// Decode implements kong.MapperValue.
func (b *boxFlag) Decode(ctx *kong.DecodeContext) error {
	t := ctx.Scan.Peek()
	if v, ok := t.Value.(string); ok && t.Type == kong.UntypedToken && len(v) > 1 && v[0] == '-' &&
		(v[1] == '.' || v[1] >= '0' && v[1] <= '9') {
		ctx.Scan.Pop()
		*b = boxFlag(v)
		return nil
	}
	var v string
	if err := ctx.Scan.PopValueInto("box", &v); err != nil {
		return err
	}
	*b = boxFlag(v)
	return nil
}

// defaultBox is the half-width of the box for variables --box does not name.
const defaultBox = 1

// parseBox reads the --box flag for the variables vars: "R" or "A:B" for
// every variable, or a comma-separated list of "name=R" / "name=A:B", of
// which one entry may be unnamed (the range of the variables not named).
// R stands for -R:R. Unnamed variables get -1:1. The point (offset 0) must
// lie in every range; it may lie on its boundary.
func parseBox(spec string, vars []string) (lower, upper []float64, err error) {
	d := len(vars)
	lower, upper = make([]float64, d), make([]float64, d)
	for i := range d {
		lower[i], upper[i] = -defaultBox, defaultBox
	}
	if strings.TrimSpace(spec) == "" {
		return lower, upper, nil
	}
	index := make(map[string]int, d)
	for i, v := range vars {
		index[v] = i
	}
	set := make([]bool, d)
	var rest *[2]float64
	for _, item := range strings.Split(spec, ",") {
		item = strings.TrimSpace(item)
		name, rng, named := strings.Cut(item, "=")
		if !named {
			rng, name = item, ""
		}
		name = strings.TrimSpace(name)
		a, b, err := parseRange(rng)
		if err != nil {
			if named {
				return nil, nil, fmt.Errorf("%s: %w", name, err)
			}
			return nil, nil, err
		}
		if !named {
			if rest != nil {
				return nil, nil, fmt.Errorf("%q: only one range may be given without a variable name", item)
			}
			rest = &[2]float64{a, b}
			continue
		}
		i, ok := index[name]
		if !ok {
			return nil, nil, fmt.Errorf("%q is not a variable of K (variables: %s)", name, strings.Join(vars, ", "))
		}
		if set[i] {
			return nil, nil, fmt.Errorf("%s is given twice", name)
		}
		set[i] = true
		lower[i], upper[i] = a, b
	}
	if rest != nil {
		for i := range d {
			if !set[i] {
				lower[i], upper[i] = rest[0], rest[1]
			}
		}
	}
	return lower, upper, nil
}

// parseRange reads "A:B" or "R" (for -R:R) and checks A ≤ 0 ≤ B, A < B.
func parseRange(s string) (a, b float64, err error) {
	s = strings.TrimSpace(s)
	num := func(t string) (float64, error) {
		r, err := monomial.ParseRat(t)
		if err != nil {
			return 0, fmt.Errorf("%q is not a number", strings.TrimSpace(t))
		}
		f, _ := r.Float64()
		if math.IsInf(f, 0) {
			return 0, fmt.Errorf("%q is too large", strings.TrimSpace(t))
		}
		return f, nil
	}
	if lo, hi, ok := strings.Cut(s, ":"); ok {
		if a, err = num(lo); err != nil {
			return 0, 0, err
		}
		if b, err = num(hi); err != nil {
			return 0, 0, err
		}
		if !(a < b) {
			return 0, 0, fmt.Errorf("%q is empty: the lower end must be below the upper end", s)
		}
	} else {
		r, err := num(s)
		if err != nil {
			return 0, 0, fmt.Errorf("%w; want A:B or a half-width R", err)
		}
		if !(r > 0) {
			return 0, 0, fmt.Errorf("half-width %q must be positive", s)
		}
		a, b = -r, r
	}
	if a > 0 || b < 0 {
		return 0, 0, fmt.Errorf("%q does not contain the point (offset 0); the box is given as offsets from the point", s)
	}
	return a, b, nil
}

// progress prints a progress line on a terminal for runs longer than a
// second. Its update method is called by estimate.Run, never concurrently.
type progress struct {
	w     io.Writer
	start time.Time
	now   func() time.Time
	last  int  // last percentage printed
	shown bool // a line is on the terminal
}

// newProgress returns a progress printer writing to e.stderr when it is a
// terminal, and one that prints nothing otherwise.
func newProgress(e *env) *progress {
	if !e.stderrTerminal {
		return &progress{}
	}
	return &progress{w: e.stderr, start: time.Now(), now: time.Now, last: -1}
}

func (p *progress) update(done, total int) {
	if p.w == nil || total <= 0 {
		return
	}
	elapsed := p.now().Sub(p.start)
	if elapsed < time.Second {
		return
	}
	pct := 100 * done / total
	if pct == p.last {
		return
	}
	p.last = pct
	p.shown = true
	fmt.Fprintf(p.w, "\rlctkit estimate: %3d%% after %.0f s", pct, elapsed.Seconds())
}

// finish clears the progress line.
func (p *progress) finish() {
	if p.shown {
		fmt.Fprint(p.w, "\r\033[K")
		p.shown = false
	}
}
