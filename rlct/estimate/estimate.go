// The options, the result and its comparison with a Newton value, and Run.

package estimate

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/rlct"
)

// Evaluator evaluates K at a float64 point (for numerical estimates only).
// Implementations must be safe for concurrent use by several goroutines.
// (*monomial.Compiled) satisfies it.
type Evaluator interface {
	Eval(x []float64) float64
	NumVars() int
}

// Options configures Run. The zero value of every field
// except Lower and Upper selects a documented default.
type Options struct {
	// Lower and Upper give the box W, per variable, in the translated
	// coordinates in which the point under study is the origin. Usually
	// Lower[i] < 0 < Upper[i], but a box with the origin on its boundary (or
	// away from it) is allowed. The estimate is always for the whole box:
	// if K vanishes elsewhere in it too, it is the smallest λ over those
	// zeros (with the largest θ among those that attain it).
	Lower, Upper []float64

	// Prior holds the exponents h_i of the prior φ(w) = ∏|w_i|^(h_i); each
	// must be > −1. Nil means the uniform prior (all h_i = 0).
	Prior []float64

	// Live is the number of live points per run (default 200, minimum 10).
	Live int

	// Runs is the number of independent runs (default 16, minimum 2). The
	// runs are merged for the estimate and left out one at a time for the
	// jackknife standard errors, so more runs give steadier error bars (the
	// standard errors have Runs−1 degrees of freedom). The statistical
	// error of λ̂ falls like 1/sqrt(Live·Runs).
	Runs int

	// Workers is the number of goroutines the runs are spread over (default
	// runtime.GOMAXPROCS(0)). The result does not depend on it.
	Workers int

	// Seed is the master seed: run r draws from a xoshiro256++ stream
	// (gonum/mathext/prng) seeded with the r-th output of a SplitMix64
	// generator seeded with Seed, so equal seeds give identical results.
	Seed uint64

	// Start and Decades place the grid of n on which y(n) is computed and
	// fitted: it runs from n·Scale = 10^Start to 10^(Start+Decades), where
	// Scale is the median of K under the prior; see Run.
	// Start defaults to 2 (otherwise it must lie in (0, 6]); Decades to 6
	// (and must lie in [1, 10]). A larger Start lessens the bias from terms
	// of K beyond its leading ones, at the price of larger error bars for θ.
	Start, Decades float64

	// Steps is the number of slice-sampling moves made to draw each new
	// live point (default 2·d+2 for d variables).
	Steps int

	// RoundOff is the absolute rounding error of the evaluator near the
	// zero set of K (default 0). Values −RoundOff ≤ K < 0 are read as 0
	// instead of being reported as errors, and a grid that needs K resolved
	// below 100·RoundOff is refused. A polynomial evaluated in expanded
	// form, such as x² − 2xy + y², has a rounding error of roughly 1e−16
	// times the sum of the absolute values of its terms.
	RoundOff float64

	// Progress, if not nil, is called with the work done so far out of a
	// fixed total (runs × 1000, in thousandths of a run, judged by how far
	// the run has pushed K down towards its target). It is called from the
	// worker goroutines, but never concurrently, and last with done == total.
	Progress func(done, total int)
}

// CurvePoint is one point of the curve y(n) = n·E_n[K] with its jackknife
// standard error.
type CurvePoint struct {
	N, Y, SE float64
}

// Result is the outcome of Run: numerical estimates of the learning
// coefficient λ and its multiplicity θ, with standard errors, and the data
// behind them. All numbers are statistical estimates, not exact values.
type Result struct {
	// Lambda and Theta are the fitted λ and θ, with jackknife standard
	// errors over the independent runs. Theta can come out below 1, which
	// a multiplicity cannot be (θ ≥ 1): such a value says only that the
	// fit is biased (within its error bar of 1, read it as θ = 1).
	Lambda, LambdaSE float64
	Theta, ThetaSE   float64

	// Offset is the fitted b of the model y(n) = λ − (θ−1)/(log n + b),
	// with n in the units of K (log is the natural logarithm).
	Offset float64

	// Points is the curve y(n) on the fitted grid, in increasing n.
	Points []CurvePoint

	// Scale is the median of K under the prior (over the initial live
	// points of all runs); the grid of n is laid out in units of 1/Scale.
	Scale float64

	// Top is the largest K among the initial live points: an estimate of
	// the largest K on the box, which sets the offset b (see Run).
	Top float64

	// Depth is the mean, over runs, of −log X at the end of the run, where
	// X is the prior mass of the region {K < ε} that the run had reached.
	Depth float64

	// Live and Runs are the sample sizes used.
	Live, Runs int

	// Evaluations is the total number of evaluations of K.
	Evaluations int64

	// OtherZeros lists the places away from the origin where the runs
	// ended with K near 0 and that are not linked to the origin (see Zero),
	// the largest share first. They count in the estimate as much as the
	// origin does: it is for all the zeros of K in the box.
	OtherZeros []Zero
}

// Zero is a group of final live points, away from the origin, where K is
// near 0: another zero of K in the box that the sampler met. Coordinates are
// those of the box (offsets from the point under study).
//
// The final live points of all runs lie where K is smallest. They are linked
// into groups along the edges of their Euclidean minimum spanning tree, in
// coordinates where the box is the unit cube, with the origin (or the point
// of the box nearest to it) as one more node. An edge links its ends when K,
// evaluated at 7 evenly spaced points of the straight segment, stays at or
// below 1/n at the low end of the grid of n (10^−Start times Scale): over the
// whole grid the posterior sees two groups with a higher K between them as
// separate. A group without the origin is a Zero. A zero set that runs
// through the origin, such as the line x = y for K = (x−y)², is no Zero even
// where it reaches far from the origin, although it counts in the estimate
// too. Two zeros with K below that level all along the segment between them
// count as one; a curved zero set that the final points sample too sparsely
// could be split into several groups. At most 4096 final points are grouped
// (an evenly spaced subset in run order beyond that).
type Zero struct {
	// At is the point of the group with the smallest K.
	At []float64
	// Lower and Upper bound the points of the group in each coordinate.
	Lower, Upper []float64
	// MaxK is the largest K among the points of the group.
	MaxK float64
	// Share is the fraction of the final live points in the group.
	Share float64
}

// Curve returns the fitted curve λ − (θ−1)/(log n + b) at n.
func (r *Result) Curve(n float64) float64 {
	return r.Lambda - (r.Theta-1)/(math.Log(n)+r.Offset)
}

// Comparison sets an estimate beside a Newton value of λ; see
// Result.Compare.
type Comparison struct {
	// Lambda is the Newton value compared with, and Status its status.
	Lambda float64
	Status rlct.Status
	// Sigmas is (Lambda − λ̂)/se: how many standard errors the estimate
	// lies below the value (negative when it lies above).
	Sigmas float64
	// Consistent reports whether the estimate agrees with the value being
	// the learning coefficient, as far as the status allows: for an exact
	// value, within 3 standard errors of it; for an upper bound, not more
	// than 3 standard errors below it; otherwise within 3 standard errors.
	Consistent bool
	// Text says the same in words.
	Text string
}

// Compare sets the estimate beside the Newton value lambda of λ with the
// given status, as rlct.Bound returns them, and says what the difference
// means. Three standard errors is the threshold (common practice); it does
// not account for the systematic errors listed under Run.
//
//   - rlct.Exact: the value is certified, so an estimate more than 3 standard
//     errors away from it is biased (not yet asymptotic, or another zero of
//     K in the box counts too); it never calls the value into doubt.
//   - rlct.UpperBound: an estimate more than 3 standard errors below the
//     bound suggests that the bound is strict; one more than 3 standard
//     errors above it is still consistent, but the curve y(n) is probably
//     not yet asymptotic.
//   - any other status (rlct.Uncertified): the value bounds nothing, and the
//     text says only where the estimate lies.
func (r *Result) Compare(lambda float64, status rlct.Status) Comparison {
	c := Comparison{Lambda: lambda, Status: status}
	switch {
	case r.LambdaSE > 0:
		c.Sigmas = (lambda - r.Lambda) / r.LambdaSE
	case lambda > r.Lambda:
		c.Sigmas = math.Inf(1)
	case lambda < r.Lambda:
		c.Sigmas = math.Inf(-1)
	}
	below, above := c.Sigmas > 3, c.Sigmas < -3
	switch status {
	case rlct.Exact:
		c.Consistent = !below && !above
		switch {
		case below:
			c.Text = fmt.Sprintf("below the exact value by %.1f standard errors: the value is certified, "+
				"so the estimate is biased low here (not yet asymptotic, or another zero in the box)", c.Sigmas)
		case above:
			c.Text = fmt.Sprintf("above the exact value by %.1f standard errors: the value is certified, "+
				"so the estimate is biased high here (probably not yet asymptotic)", -c.Sigmas)
		default:
			c.Text = "consistent with the exact value"
		}
	case rlct.UpperBound:
		c.Consistent = !below
		switch {
		case below:
			c.Text = fmt.Sprintf("below the bound by %.1f standard errors: the bound is probably strict here", c.Sigmas)
		case above:
			c.Text = fmt.Sprintf("consistent with the bound, but above it by %.1f standard errors: "+
				"the estimate is probably not yet asymptotic", -c.Sigmas)
		default:
			c.Text = "consistent with the bound"
		}
	default:
		c.Consistent = !below && !above
		const notBound = "the Newton value is not certified, so it bounds nothing"
		switch {
		case below:
			c.Text = fmt.Sprintf("below the Newton value by %.1f standard errors; %s", c.Sigmas, notBound)
		case above:
			c.Text = fmt.Sprintf("above the Newton value by %.1f standard errors; %s", -c.Sigmas, notBound)
		default:
			c.Text = "close to the Newton value; " + notBound
		}
	}
	return c
}

// KValueError reports a point at which the evaluator returned a value of K
// that is negative (beyond Options.RoundOff), NaN or infinite.
type KValueError struct {
	Point []float64 // the point w, in the translated coordinates
	Value float64   // K(w)
}

func (e *KValueError) Error() string {
	var b strings.Builder
	for i, x := range e.Point {
		if i > 0 {
			b.WriteString(", ")
		}
		fmt.Fprintf(&b, "%g", x)
	}
	what := "negative"
	if math.IsNaN(e.Value) || math.IsInf(e.Value, 0) {
		what = "not finite"
	}
	return fmt.Sprintf("estimate: K(%s) = %g is %s; K must be a nonnegative function", b.String(), e.Value, what)
}

// ErrNoProgress is returned by Run when a run cannot push K
// below its current level: K is constant on a set of positive prior mass.
var ErrNoProgress = errors.New("estimate: K is constant on a set of positive prior mass; nested sampling cannot proceed")

// ErrTooDeep is returned by Run when a run goes deeper into the
// prior mass than any K vanishing at the origin allows, which means K does not
// vanish in the box (or not to second order, or vanishes on a thin set the
// sampler cannot follow).
var ErrTooDeep = errors.New("estimate: the run went deeper than a K vanishing at the origin allows; does K vanish in the box?")

// Defaults and fixed constants of the method.
const (
	defaultLive    = 200
	defaultRuns    = 16
	defaultDecades = 6.0
	maxDecades     = 10.0
	defaultStart   = 2.0
	maxStart       = 6.0
	minLive        = 10

	// pointsPerDecade is the density of the grid of n.
	pointsPerDecade = 4
	// stopDelta: a run may stop once every live point has n_max·K ≤
	// stopDelta, where all of them carry nearly full weight exp(−n_max·K).
	stopDelta = 0.01
	// stopShare: a run may also stop once the live points can hold at most
	// this share of Z(n_max); their share is still added to the sums.
	stopShare = 0.01
)

// Run estimates the learning coefficient λ and its
// multiplicity θ of K at the origin, over the box and prior in opt, by nested
// sampling. K is evaluated only through k and must be nonnegative.
//
// # Method
//
// Nested sampling (Skilling 2006, "Nested sampling for general Bayesian
// computation", Bayesian Analysis 1(4):833–860; first presented in Skilling
// 2004, "Nested sampling", AIP Conference Proceedings 735:395–405; from
// memory) keeps Live points drawn from
// the prior restricted to {K < ε}, repeatedly removes the one with the largest
// K and lowers ε to it, and replaces it by a new point drawn from the prior
// restricted to the new {K < ε}. After i removals the prior mass of {K < ε} has
// shrunk by about exp(−i/Live), so one run gives the whole volume function
// V(ε) and hence, by weighting the removed points with exp(−nK), Z(n) and
// E_n[K] for every n at once. New points are drawn by slice sampling (Neal
// 2003, "Slice sampling", Annals of Statistics 31(3):705–767, stepping out and
// shrinkage) started from a random surviving live point, along coordinate
// axes and along differences of two live points, in coordinates where the
// prior is uniform (per coordinate, v = G(w)/G_total with G(w) =
// sign(w)|w|^(h+1)/(h+1), so that v = 0 is w = 0 to full relative precision).
// The runs are independent with seeds derived from Seed; they are merged
// into one run with Runs·Live points (counting, at each removal, the live
// points of all runs at that level of K, as in Higson et al. 2019, "Dynamic
// nested sampling", Statistics and Computing 29:891–913), which gives the
// estimate, and each run is left out in turn for the jackknife standard errors
// of every y(n) and of the fitted λ and θ.
//
// # Grid and depth
//
// The grid has 4 points per decade from n = 10^Start/Scale to
// 10^(Start+Decades)/Scale, where Scale is the median of K under the prior
// (over the initial live points). With the default Start = 2, at the low end
// the typical prior point already has posterior weight e^(−100) relative to
// the zero set. The asymptotic form needs more: the posterior must sit where
// the leading terms of K dominate. If the box is large for K (say a
// high-degree polynomial whose value at the corners is many orders of
// magnitude above its median), the low end of the grid is not asymptotic:
// shrink the box or raise Start, and check that Points follow Curve.
// A run stops when every live point has n_max·K ≤ 0.01, or when the live
// points can hold at most 1% of Z(n_max); the live points left are then
// added as removals with the live count running down to one, the last one
// standing for the rest of the mass.
//
// # Fit
//
// Z(n) has an asymptotic expansion in terms n^(−λ)·(log n)^(k−1), k ≤ θ
// (Watanabe 2009, chapters 4 and 6, from memory), so that up to terms of
// order n^(−δ), δ > 0, from the next poles of the zeta function,
// y(n) = λ − P′(L)/P(L) for L = log n and a polynomial P of degree θ−1. For
// θ = 2 this is exactly λ − 1/(L + b) for some b that depends on the units of
// K and on the geometry; for θ = 1 it is λ. The fit is therefore
//
//	y = λ − (θ−1)/(L + b)
//
// by least squares with equal weights on the grid (a QR factorization of
// the design matrix by gonum/mat). Over a few decades b can
// hardly be told apart from θ: the Fisher information of 1600 live points
// for K = x²y² gives se(θ̂) ≈ 2.5 with b free against 0.3 with b known. So b
// is not fitted but set by offsetFor, which is exact when K is a monomial
// in which every variable attains the minimum rate (such as x²y²), with
// b = 1/λ + log(Top) − ψ(λ+1), iterated to a fixed point with λ̂. Setting
// b = 0 instead, the plain fit of y against 1/log n, is not adequate: for
// x²y² on [−1,1]² (b ≈ 1.96) it returns θ ≈ 1.75 instead of 2 over the
// default grid, and λ low by about 0.01.
//
// # What the error bars do not cover
//
// The standard errors are jackknife errors over the independent runs: they
// cover the statistical error of nested sampling, including the part due to
// imperfect mixing of the slice sampler that varies from run to run, but not
//   - the terms of order n^(−δ) neglected by the model (for example from the
//     box boundary, or a prior exponent that nearly ties for the minimum),
//     which bias mostly θ̂ and, less, λ̂, the more so the lower the grid: for
//     (x−y)² on [−1,1]², where y(n) = 1/2 − 0.14/√n + …, the estimator tends
//     to λ = 0.506, θ = 1.10 instead of 1/2 and 1;
//   - the error of the offset b when K is not a monomial of the kind above
//     (a variable with a larger rate μ lowers b by about 1/(μ−λ)); this
//     matters only when θ > 1, mostly for θ̂;
//   - for θ ≥ 3, the difference between P′/P and (θ−1)/(L + b), of order
//     1/L³ (for x²y²z² on [−1,1]³ the estimator tends to θ = 2.81, not 3);
//   - a bias of the sampler common to all runs (a region {K < ε} whose
//     pieces the slice moves cannot connect);
//   - floating-point rounding of K near its zero set (see RoundOff).
//
// With few runs the standard errors are themselves uncertain (Runs−1
// degrees of freedom).
//
// # Other zeros
//
// The estimate is for the whole box. Where K vanishes away from the origin
// too, the runs end with live points there as well, and Result.OtherZeros
// lists them (see Zero): they can make the estimate a different number from
// the learning coefficient at the origin (a smaller λ, or a larger θ, from
// the other zero), and shrinking the box to leave them out is the remedy.
// A zero whose λ is much larger than at the origin keeps few or no final
// live points and may go unlisted; it does not change the estimate.
//
// # Errors
//
// It returns an error for a box or prior that does not match k.NumVars(), an
// empty box, a prior exponent ≤ −1, bad sizes, a value of K that is negative,
// NaN or infinite (a *KValueError with the point), K that vanishes on half of
// the prior mass or is constant on a set of positive mass (ErrNoProgress), a
// run that goes implausibly deep (ErrTooDeep), and ctx.Err() when ctx is
// cancelled.
func Run(ctx context.Context, k Evaluator, opt Options) (*Result, error) {
	cfg, err := newConfig(k, opt)
	if err != nil {
		return nil, err
	}
	return cfg.estimate(ctx)
}

// config is the validated form of Options.
type config struct {
	k            Evaluator
	d            int
	lower, upper []float64 // the box in w coordinates
	box          priorBox
	live         int
	runs         int
	workers      int
	seed         uint64
	decades      float64
	start        float64
	steps        int
	roundOff     float64
	progress     func(done, total int)
}

func newConfig(k Evaluator, opt Options) (*config, error) {
	if k == nil {
		return nil, errors.New("estimate: nil Evaluator")
	}
	d := k.NumVars()
	if d <= 0 {
		return nil, fmt.Errorf("estimate: K has %d variables; need at least one", d)
	}
	if len(opt.Lower) != d || len(opt.Upper) != d {
		return nil, fmt.Errorf("estimate: box has %d lower and %d upper bounds for K with %d variables",
			len(opt.Lower), len(opt.Upper), d)
	}
	if opt.Prior != nil && len(opt.Prior) != d {
		return nil, fmt.Errorf("estimate: prior has %d exponents for K with %d variables", len(opt.Prior), d)
	}
	c := &config{k: k, d: d, live: opt.Live, runs: opt.Runs, workers: opt.Workers,
		seed: opt.Seed, decades: opt.Decades, start: opt.Start, steps: opt.Steps, roundOff: opt.RoundOff, progress: opt.Progress}
	for i := range d {
		a, b := opt.Lower[i], opt.Upper[i]
		if math.IsNaN(a) || math.IsNaN(b) || math.IsInf(a, 0) || math.IsInf(b, 0) {
			return nil, fmt.Errorf("estimate: box bounds of variable %d are not finite: [%g, %g]", i, a, b)
		}
		if !(a < b) {
			return nil, fmt.Errorf("estimate: empty box in variable %d: [%g, %g]", i, a, b)
		}
		h := 0.0
		if opt.Prior != nil {
			h = opt.Prior[i]
		}
		if math.IsNaN(h) || math.IsInf(h, 0) || h <= -1 {
			return nil, fmt.Errorf("estimate: prior exponent h = %g of variable %d must be a finite number > −1", h, i)
		}
	}
	box, err := newPriorBox(opt.Lower, opt.Upper, opt.Prior)
	if err != nil {
		return nil, err
	}
	c.box = box
	c.lower, c.upper = slices.Clone(opt.Lower), slices.Clone(opt.Upper)
	switch {
	case c.live == 0:
		c.live = defaultLive
	case c.live < minLive:
		return nil, fmt.Errorf("estimate: Live = %d; need at least %d live points", c.live, minLive)
	}
	switch {
	case c.runs == 0:
		c.runs = defaultRuns
	case c.runs < 2:
		return nil, fmt.Errorf("estimate: Runs = %d; need at least 2 runs for error bars", c.runs)
	}
	switch {
	case c.workers == 0:
		c.workers = runtime.GOMAXPROCS(0)
	case c.workers < 0:
		return nil, fmt.Errorf("estimate: Workers = %d is negative", c.workers)
	}
	switch {
	case c.decades == 0:
		c.decades = defaultDecades
	case !(c.decades >= 1 && c.decades <= maxDecades):
		return nil, fmt.Errorf("estimate: Decades = %g; must be between 1 and %g", c.decades, maxDecades)
	}
	switch {
	case c.start == 0:
		c.start = defaultStart
	case !(c.start > 0 && c.start <= maxStart):
		return nil, fmt.Errorf("estimate: Start = %g; must be between 0 and %g", c.start, maxStart)
	}
	if c.start+c.decades > 12 {
		return nil, fmt.Errorf("estimate: Start + Decades = %g; at most 12 decades above Scale can be resolved in float64", c.start+c.decades)
	}
	switch {
	case c.steps == 0:
		c.steps = 2*d + 2
	case c.steps < 0:
		return nil, fmt.Errorf("estimate: Steps = %d is negative", c.steps)
	}
	if math.IsNaN(c.roundOff) || math.IsInf(c.roundOff, 0) || c.roundOff < 0 {
		return nil, fmt.Errorf("estimate: RoundOff = %g must be a finite number ≥ 0", c.roundOff)
	}
	return c, nil
}
