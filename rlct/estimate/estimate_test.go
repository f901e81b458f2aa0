package estimate

import (
	"context"
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// funcEval adapts a Go function to Evaluator.
type funcEval struct {
	n int
	f func([]float64) float64
}

func (e funcEval) Eval(x []float64) float64 { return e.f(x) }
func (e funcEval) NumVars() int             { return e.n }

// exactCurve returns y(n) = n·E_n[K] computed by quadrature from a volume
// function V(ε) = prior mass of {K < ε} (normalized or not): integrating by
// parts, Z(n) = ∫ V(t/n) e^(−t) dt and n·∫K e^(−nK) dπ = ∫ V(t/n)(t−1)
// e^(−t) dt over t > 0. The substitution t = e^s and the trapezoidal rule over
// s ∈ [−60, 5] converge fast for V(ε) ~ ε^λ·(log terms). This shares no code
// with the nested sampler.
func exactCurve(vol func(eps float64) float64, n float64) float64 {
	const lo, hi, steps = -60.0, 5.0, 20000
	h := (hi - lo) / steps
	var z, zt float64
	for i := 0; i <= steps; i++ {
		s := lo + h*float64(i)
		t := math.Exp(s)
		w := vol(t/n) * math.Exp(-t) * t // dt = t ds
		if i == 0 || i == steps {
			w /= 2
		}
		z += w
		zt += w * (t - 1)
	}
	return zt / z
}

func sq(x float64) float64 { return x * x }

// validationCase is a K with a known learning coefficient and, where it can be
// written down, the exact volume function V(ε) on the box, used to compute the
// limit of the estimator (the fit applied to the exact curve y(n)) and so its
// deterministic model bias.
type validationCase struct {
	name          string
	k             func(x []float64) float64
	lower, upper  []float64
	prior         []float64
	lambda, theta float64                   // published values (source beside each case)
	newton        float64                   // Newton-polyhedron bound on λ
	status        rlct.Status               // its status from rlct.Bound: Exact when the value is λ
	vol           func(eps float64) float64 // exact V(ε) up to a constant factor, for ε below the grid's 1/n_min
}

var validationCases = []validationCase{
	{
		// Regular model: λ = d/2, θ = 1 (Watanabe 2009, Algebraic Geometry and
		// Statistical Learning Theory, Cambridge University Press, the regular
		// case, from memory; Schwarz 1978, "Estimating the dimension of a model", Ann. Statist.
		// 6(2):461–464). V(ε) = πε/4 for ε ≤ 1 (disk inside the square).
		name: "x^2+y^2", k: func(x []float64) float64 { return x[0]*x[0] + x[1]*x[1] },
		lower: []float64{-1, -1}, upper: []float64{1, 1},
		lambda: 1, theta: 1, newton: 1, status: rlct.Exact,
		vol: func(e float64) float64 { return math.Pi / 4 * e },
	},
	{
		// Single monomial x^2y^2: λ = min over variables of 1/(2·1) = 1/2,
		// attained twice, so θ = 2 (Arnold, Gusein-Zade & Varchenko 1988,
		// Singularities of Differentiable Maps Vol. II, chapter on
		// asymptotics of integrals, from memory). V(ε) = s(1 + log(1/s)),
		// s = √ε ≤ 1: P(|xy| < s) for x, y uniform on [0,1].
		name: "x^2*y^2", k: func(x []float64) float64 { return x[0] * x[0] * x[1] * x[1] },
		lower: []float64{-1, -1}, upper: []float64{1, 1},
		lambda: 0.5, theta: 2, newton: 0.5, status: rlct.Exact,
		vol: func(e float64) float64 { s := math.Sqrt(e); return s * (1 - math.Log(s)) },
	},
	{
		// Sum of squares of the monomials x^2, y^3: λ = half the log canonical
		// threshold of the monomial ideal (x^2, y^3), which is 1/t for the
		// Newton distance t = 6/5 (Howald 2001, "Multiplier ideals of monomial
		// ideals", Trans. AMS 353:2665–2671, main theorem): λ = 5/12, θ = 1.
		// V(ε) = c·ε^(1/4+1/6) for ε ≤ 1 (quasi-homogeneous, region inside
		// the box).
		name: "x^4+y^6", k: func(x []float64) float64 { return sq(x[0]*x[0]) + sq(x[1]*x[1]*x[1]) },
		lower: []float64{-1, -1}, upper: []float64{1, 1},
		lambda: 5.0 / 12, theta: 1, newton: 5.0 / 12, status: rlct.Exact,
		vol: func(e float64) float64 { return math.Pow(e, 5.0/12) },
	},
	{
		// Monomial x^2y^2 with prior |x|^1: λ = min((1+1)/2, (0+1)/2) = 1/2,
		// attained once, θ = 1 (Watanabe 2009, the normal-crossing case
		// K = w^(2k), φ = |w^h|: λ = min (h_j+1)/(2k_j), from memory).
		// V(ε) = 2s − s², s = √ε ≤ 1: P(xy < s) with density 2x on [0,1]
		// for x and uniform y.
		name: "x^2*y^2 with prior |x|", k: func(x []float64) float64 { return x[0] * x[0] * x[1] * x[1] },
		lower: []float64{-1, -1}, upper: []float64{1, 1}, prior: []float64{1, 0},
		lambda: 0.5, theta: 1, newton: 0.5, status: rlct.Exact,
		vol: func(e float64) float64 { s := math.Sqrt(e); return 2*s - s*s },
	},
	{
		// Degenerate: (x−y)^2 is u^2 after u = x − y, so λ = 1/2, θ = 1
		// (regular in one variable, as above), while the Newton polyhedron
		// of x^2 − 2xy + y^2 has distance 1, bound 1. V(ε) = s − s²/4,
		// s = √ε ≤ 2: x − y has the triangular density (2 − |z|)/4.
		name: "(x-y)^2", k: func(x []float64) float64 { return sq(x[0] - x[1]) },
		lower: []float64{-1, -1}, upper: []float64{1, 1},
		lambda: 0.5, theta: 1, newton: 1, status: rlct.UpperBound,
		vol: func(e float64) float64 { s := math.Sqrt(e); return s - s*s/4 },
	},
	{
		// Degenerate: (y−x^2)^2 is v^2 after v = y − x^2, λ = 1/2, θ = 1; the
		// Newton polyhedron of y^2 − 2x^2y + x^4 has vertices (4,0), (0,2),
		// distance 4/3, bound 3/4. On [−1,1]^2 the band |y − x^2| < s is cut
		// by the side y = 1 for |x| > r = √(1−s): V(ε) = (2sr + (1+s)(1−r) −
		// (1−r³)/3)/2.
		name: "(y-x^2)^2", k: func(x []float64) float64 { return sq(x[1] - x[0]*x[0]) },
		lower: []float64{-1, -1}, upper: []float64{1, 1},
		lambda: 0.5, theta: 1, newton: 0.75, status: rlct.UpperBound,
		vol: func(e float64) float64 {
			s := math.Sqrt(e)
			r := math.Sqrt(1 - s)
			return (2*s*r + (1+s)*(1-r) - (1-r*r*r)/3) / 2
		},
	},
}

// limitFit returns the fit of the exact curve on the estimate's grid: the
// limit of the estimator for infinitely many live points.
func limitFit(vol func(float64) float64, e *Result) (lambda, theta float64) {
	grid := make([]float64, len(e.Points))
	y := make([]float64, len(e.Points))
	for i, p := range e.Points {
		grid[i] = p.N
		y[i] = exactCurve(vol, p.N)
	}
	lambda, theta, _ = fitCurve(grid, y, e.Top)
	return lambda, theta
}

// checkAgainstLimit checks λ̂ and θ̂ against the true λ and θ within four
// standard errors plus the fit's own bias, which is the distance between
// the true values and the fit applied to the exact curve of vol.
func checkAgainstLimit(t *testing.T, e *Result, vol func(float64) float64, lambda, theta float64) {
	t.Helper()
	limL, limT := limitFit(vol, e)
	t.Logf("λ̂ = %.4f ± %.4f (limit %.4f), θ̂ = %.3f ± %.3f (limit %.3f), %d evaluations",
		e.Lambda, e.LambdaSE, limL, e.Theta, e.ThetaSE, limT, e.Evaluations)
	if tol := 4*e.LambdaSE + math.Abs(limL-lambda); math.Abs(e.Lambda-lambda) > tol {
		t.Errorf("λ̂ = %.4f ± %.4f, want %.4f within %.4f", e.Lambda, e.LambdaSE, lambda, tol)
	}
	if tol := 4*e.ThetaSE + math.Abs(limT-theta); math.Abs(e.Theta-theta) > tol {
		t.Errorf("θ̂ = %.3f ± %.3f, want %.3f within %.3f", e.Theta, e.ThetaSE, theta, tol)
	}
}

// TestValidation checks λ̂ and θ̂ against published values with
// Live = 100, Runs = 16 (1600 live points), Seed = 1. The tolerance is 4
// jackknife standard errors (15 degrees of freedom: a correct estimator
// fails one check with probability about 0.001) plus the deterministic bias
// of the fitted model, |fit of the exact curve − true value|, computed from
// the exact V(ε) by quadrature (it comes from the O(n^−1/2) terms of the box
// boundary and the prior).
func TestValidation(t *testing.T) {
	for _, c := range validationCases {
		t.Run(c.name, func(t *testing.T) {
			e, err := Run(context.Background(), funcEval{2, c.k}, Options{
				Lower: c.lower, Upper: c.upper, Prior: c.prior, Live: 100, Runs: 16, Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			checkAgainstLimit(t, e, c.vol, c.lambda, c.theta)
			// Every zero set here runs through the origin.
			if len(e.OtherZeros) != 0 {
				t.Errorf("other zeros reported: %+v", e.OtherZeros)
			}
			// Standard errors of a sane size: the Fisher information of
			// 1600 live points bounds se(λ̂) below by about 0.005 here.
			if !(e.LambdaSE > 0.002 && e.LambdaSE < 0.05) {
				t.Errorf("se(λ̂) = %g is implausible", e.LambdaSE)
			}
			// A strict bound lies 25 or more standard errors above λ here,
			// so the comparison must find it; an exact value must never be
			// called strict, whatever the estimate (its consistency at 3
			// standard errors is a weaker check than the 4 above).
			v := e.Compare(c.newton, c.status)
			strict := c.newton > c.lambda
			if strict && (v.Consistent || !strings.Contains(v.Text, "probably strict")) {
				t.Errorf("Compare(%g, %s) = %+v; the bound is strict", c.newton, c.status, v)
			}
			if !strict && (strings.Contains(v.Text, "strict") || v.Consistent != (math.Abs(v.Sigmas) <= 3)) {
				t.Errorf("Compare(%g, %s) = %+v; the value is exact", c.newton, c.status, v)
			}
		})
	}
}

// TestValidationSlow: three variables with θ = 3 and a regular model
// in four variables, at larger sample sizes.
func TestValidationSlow(t *testing.T) {
	if testing.Short() {
		t.Skip("slow")
	}
	cases := []struct {
		name          string
		d             int
		k             func(x []float64) float64
		lambda, theta float64
		vol           func(float64) float64
	}{
		// x^2y^2z^2: λ = 1/2 attained three times, θ = 3 (as for x^2y^2
		// above). −log|xyz| is a sum of three Exp(1) variables, so
		// V(ε) = s(1 + L + L²/2), s = √ε, L = log(1/s).
		{"x^2*y^2*z^2", 3, func(x []float64) float64 { return sq(x[0] * x[1] * x[2]) }, 0.5, 3,
			func(e float64) float64 { s := math.Sqrt(e); l := -math.Log(s); return s * (1 + l + l*l/2) }},
		// Regular in four variables: λ = 2, θ = 1 (Watanabe 2009; Schwarz
		// 1978). V(ε) ∝ ε² for ε ≤ 1 (ball inside the cube).
		{"w1^2+...+w4^2", 4, func(x []float64) float64 { return x[0]*x[0] + x[1]*x[1] + x[2]*x[2] + x[3]*x[3] }, 2, 1,
			func(e float64) float64 { return e * e }},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			lo, hi := make([]float64, c.d), make([]float64, c.d)
			for i := range lo {
				lo[i], hi[i] = -1, 1
			}
			e, err := Run(context.Background(), funcEval{c.d, c.k}, Options{
				Lower: lo, Upper: hi, Live: 200, Runs: 16, Seed: 7})
			if err != nil {
				t.Fatal(err)
			}
			checkAgainstLimit(t, e, c.vol, c.lambda, c.theta)
		})
	}
}

// TestCurveX2 checks the volume and weight bookkeeping of the sampler
// on K = x² with the uniform prior on [−1,1], where V(ε) = √ε exactly, so
// Z(n) = ∫_0^1 e^(−nx²) dx = √π·erf(√n)/(2√n) and, integrating x²e^(−nx²) by
// parts, y(n) = n·E_n[K] = 1/2 − e^(−n)/(2Z(n)). The check spans small n,
// where the box matters, to large n; tolerance 4 jackknife standard errors.
func TestCurveX2(t *testing.T) {
	cfg, err := newConfig(funcEval{1, func(x []float64) float64 { return x[0] * x[0] }},
		Options{Lower: []float64{-1}, Upper: []float64{1}, Live: 100, Runs: 16, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	s, err := cfg.sample(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	ns := []float64{0.25, 1, 4, 16, 100, 1e4, 1e6, 1e8}
	y, se, _ := newMerger(s.runs).curveSE(ns, 2)
	for i, n := range ns {
		z := math.Sqrt(math.Pi) * math.Erf(math.Sqrt(n)) / (2 * math.Sqrt(n))
		want := 0.5 - math.Exp(-n)/(2*z)
		if math.Abs(y[i]-want) > 4*se[i] {
			t.Errorf("y(%g) = %.5f ± %.5f, want %.5f", n, y[i], se[i], want)
		}
		if !(se[i] < 0.02) {
			t.Errorf("y(%g): se = %g too large", n, se[i])
		}
	}
}

// syntheticRun returns a run record for K = x² on [−1,1] with the prior mass
// sequence X_j = q^(j+phase), q = N/(N+1), laid out exactly (K_j = X_j², since
// V(ε) = √ε): the removed points, then the N final live points. The first N
// points in removal order are the initial ones (born under +Inf); the point
// at position p ≥ N was born when point p−N was removed.
func syntheticRun(n, dead int, phase float64) *nsRun {
	q := float64(n) / float64(n+1)
	r := &nsRun{}
	for p := range dead + n {
		x := math.Pow(q, float64(p+1)+phase)
		birth := math.Inf(1)
		if p >= n {
			birth = r.points[p-n].k
		}
		r.points = append(r.points, nsPoint{k: x * x, birth: birth})
	}
	return r
}

// TestMergerSynthetic checks the live-point counting of the merge and the
// weights on exactly laid-out runs: one run keeps N live points, two
// interleaved runs 2N, so the prior mass after m removals is (N/(N+1))^m or
// (2N/(2N+1))^m; and y(n) from the weights matches the closed form of
// TestCurveX2. The weights are a Riemann sum in log X with relative
// step 1/(N+1) of integrands that are unimodal in log X, so the relative
// error of Z and of n·∫K e^(−nK) is at most about 2/N, and that of y(n) about
// 4/N (we allow 10/N).
func TestMergerSynthetic(t *testing.T) {
	const n, dead = 2000, 60000
	for _, runs := range [][]*nsRun{
		{syntheticRun(n, dead, 0)},
		{syntheticRun(n, dead, 0), syntheticRun(n, dead, 0.5)},
	} {
		m := newMerger(runs)
		logW := m.weights(-1)
		live := float64(n * len(runs))
		q := live / (live + 1)
		for j := range dead * len(runs) {
			wantLog := float64(j)*math.Log(q) - math.Log(live+1)
			if math.Abs(logW[j]-wantLog) > 1e-9*math.Max(1, math.Abs(wantLog)) {
				t.Fatalf("%d runs: log weight %d = %.12g, want %.12g", len(runs), j, logW[j], wantLog)
			}
		}
		// All the weights add up to the prior mass 1.
		var total float64
		for _, lw := range logW {
			total += math.Exp(lw)
		}
		if math.Abs(total-1) > 1e-9 {
			t.Errorf("%d runs: weights add up to %.12g", len(runs), total)
		}
		ns := []float64{1, 10, 1e3, 1e5, 1e7}
		y := m.curve(ns, -1)
		for i, nn := range ns {
			z := math.Sqrt(math.Pi) * math.Erf(math.Sqrt(nn)) / (2 * math.Sqrt(nn))
			want := 0.5 - math.Exp(-nn)/(2*z)
			if math.Abs(y[i]-want) > 10/float64(n) {
				t.Errorf("%d runs: y(%g) = %.6f, want %.6f", len(runs), nn, y[i], want)
			}
		}
	}
}

// TestFitExactCurve: on the exact curve of x²y² on [−1,1]² (see
// validationCases; Z(n) ∝ n^(−1/2)·(log n − ψ(1/2))) the fit with the true
// top value 1 returns λ = 1/2, θ = 2 and b = −ψ(1/2) = γ + 2 log 2, and on a
// flat curve θ = 1 whatever the top.
func TestFitExactCurve(t *testing.T) {
	grid := make([]float64, 25)
	y := make([]float64, 25)
	for i := range grid {
		grid[i] = math.Pow(10, 2+float64(i)/4)
		// Z(n) = (√π/4)·n^(−1/2)·(log n − ψ(1/2)) from V(ε) = s(1 + log 1/s),
		// so y = 1/2 − 1/(log n − ψ(1/2)).
		y[i] = 0.5 - 1/(math.Log(grid[i])+0.5772156649015329+2*math.Ln2)
	}
	l, th, b := fitCurve(grid, y, 1)
	if math.Abs(l-0.5) > 1e-9 || math.Abs(th-2) > 1e-8 || math.Abs(b-(0.5772156649015329+2*math.Ln2)) > 1e-9 {
		t.Errorf("exact x²y² curve: λ = %.12f θ = %.12f b = %.12f", l, th, b)
	}
	// The quadrature of exactCurve reproduces the same closed form.
	for _, n := range []float64{100, 1e5, 1e9} {
		got := exactCurve(func(e float64) float64 { s := math.Sqrt(e); return s * (1 - math.Log(s)) }, n)
		want := 0.5 - 1/(math.Log(n)+0.5772156649015329+2*math.Ln2)
		if math.Abs(got-want) > 1e-9 {
			t.Errorf("exactCurve(x²y², %g) = %.12f, want %.12f", n, got, want)
		}
	}
	for i := range y {
		y[i] = 0.75
	}
	for _, top := range []float64{1e-3, 1, 1e3} {
		l, th, _ := fitCurve(grid, y, top)
		if math.Abs(l-0.75) > 1e-12 || math.Abs(th-1) > 1e-12 {
			t.Errorf("flat curve, top %g: λ = %g θ = %g", top, l, th)
		}
	}
}

// TestOffsetFor checks b = 1/λ + log(top) − ψ(λ+1) against values of ψ from
// Abramowitz & Stegun 1964, Handbook of Mathematical Functions: 6.3.2
// (ψ(1) = −γ), 6.3.3 (ψ(1/2) = −γ − 2 log 2) and the recurrence 6.3.5
// (ψ(x+1) = ψ(x) + 1/x), and the floor of λ at 0.05. The tolerance 1e−9
// allows for ψ from gonum/mathext, accurate to about 1e−10 at these points
// (observed when written); an error of that size in b moves the fit by less.
func TestOffsetFor(t *testing.T) {
	const gamma = 0.5772156649015329
	for _, c := range []struct{ lambda, top, want float64 }{
		// ψ(3/2) = ψ(1/2) + 2: b = 2 − ψ(3/2) = γ + 2 log 2.
		{0.5, 1, gamma + 2*math.Ln2},
		// ψ(2) = 1 − γ: b = 1 − ψ(2) = γ, and log(top) adds 1 for top = e.
		{1, 1, gamma},
		{1, math.E, gamma + 1},
		// ψ(3) = 3/2 − γ: b = 1/2 − ψ(3) = γ − 1.
		{2, 1, gamma - 1},
		// ψ(4) = 11/6 − γ: b = 1/3 − ψ(4) + log 10.
		{3, 10, 1.0/3 - 11.0/6 + gamma + math.Log(10)},
	} {
		if got := offsetFor(c.lambda, c.top); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("offsetFor(%g, %g) = %.15f, want %.15f", c.lambda, c.top, got, c.want)
		}
	}
	if a, b := offsetFor(0.001, 2), offsetFor(0.05, 2); a != b {
		t.Errorf("λ below 0.05 is not floored: %g against %g", a, b)
	}
}

func quickOptions() Options {
	return Options{Lower: []float64{-1, -1}, Upper: []float64{1, 1}, Live: 20, Runs: 4, Decades: 3, Seed: 11}
}

var quickK = funcEval{2, func(x []float64) float64 { return sq(x[0] * x[1]) }}

// TestDeterministic: the same seed gives the identical result with
// any number of workers; another seed gives another result.
func TestDeterministic(t *testing.T) {
	var first *Result
	for _, w := range []int{1, 2, 3, 8} {
		opt := quickOptions()
		opt.Workers = w
		e, err := Run(context.Background(), quickK, opt)
		if err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first = e
		} else if !reflect.DeepEqual(first, e) {
			t.Errorf("Workers = %d: result differs:\n%+v\n%+v", w, first, e)
		}
	}
	opt := quickOptions()
	opt.Seed++
	e, err := Run(context.Background(), quickK, opt)
	if err != nil {
		t.Fatal(err)
	}
	if e.Lambda == first.Lambda {
		t.Errorf("seeds %d and %d gave the same λ̂ %v", opt.Seed-1, opt.Seed, e.Lambda)
	}
}

func TestErrors(t *testing.T) {
	two := []float64{-1, -1}
	one := []float64{1, 1}
	cases := []struct {
		name string
		k    Evaluator
		opt  Options
		want string
	}{
		{"nil evaluator", nil, Options{Lower: two, Upper: one}, "nil Evaluator"},
		{"no variables", funcEval{0, nil}, Options{}, "0 variables"},
		{"box length", quickK, Options{Lower: []float64{-1}, Upper: one}, "1 lower and 2 upper"},
		{"prior length", quickK, Options{Lower: two, Upper: one, Prior: []float64{0}}, "prior has 1 exponents"},
		{"empty box", quickK, Options{Lower: two, Upper: []float64{1, -1}}, "empty box in variable 1"},
		{"infinite box", quickK, Options{Lower: two, Upper: []float64{1, math.Inf(1)}}, "not finite"},
		{"prior -1", quickK, Options{Lower: two, Upper: one, Prior: []float64{0, -1}}, "variable 1 must be"},
		{"prior NaN", quickK, Options{Lower: two, Upper: one, Prior: []float64{math.NaN(), 0}}, "variable 0 must be"},
		{"live", quickK, Options{Lower: two, Upper: one, Live: -5}, "Live = -5"},
		{"live small", quickK, Options{Lower: two, Upper: one, Live: 3}, "Live = 3"},
		{"runs", quickK, Options{Lower: two, Upper: one, Runs: 1}, "Runs = 1"},
		{"workers", quickK, Options{Lower: two, Upper: one, Workers: -1}, "Workers = -1"},
		{"decades", quickK, Options{Lower: two, Upper: one, Decades: 20}, "Decades = 20"},
		{"start", quickK, Options{Lower: two, Upper: one, Start: -1}, "Start = -1"},
		{"start+decades", quickK, Options{Lower: two, Upper: one, Start: 5, Decades: 9}, "Start + Decades = 14"},
		{"steps", quickK, Options{Lower: two, Upper: one, Steps: -2}, "Steps = -2"},
		{"roundoff", quickK, Options{Lower: two, Upper: one, RoundOff: -1}, "RoundOff = -1"},
		{"roundoff too big", quickK, Options{Lower: two, Upper: one, RoundOff: 1e-8}, "100·RoundOff"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Run(context.Background(), c.k, c.opt)
			if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "estimate: ") {
				t.Errorf("err = %v, want one containing %q", err, c.want)
			}
		})
	}
}

// TestBadK: negative and NaN values of K are reported with the point,
// small negative values are accepted within RoundOff, a K that is constant
// on a set of positive mass and a K that does not vanish to second order
// stop the run with the sentinel errors.
func TestBadK(t *testing.T) {
	opt := quickOptions()
	neg := funcEval{2, func(x []float64) float64 { return x[0]*x[0] - 0.25 }}
	_, err := Run(context.Background(), neg, opt)
	var kerr *KValueError
	if !errors.As(err, &kerr) || len(kerr.Point) != 2 || !(kerr.Value < 0) ||
		math.Abs(kerr.Value-(kerr.Point[0]*kerr.Point[0]-0.25)) > 1e-15 || !strings.Contains(err.Error(), "negative") {
		t.Errorf("negative K: err = %v", err)
	}
	nan := funcEval{2, func(x []float64) float64 {
		if x[0] > 0.5 {
			return math.NaN()
		}
		return x[0] * x[0]
	}}
	_, err = Run(context.Background(), nan, opt)
	if !errors.As(err, &kerr) || !(kerr.Point[0] > 0.5) || !strings.Contains(err.Error(), "not finite") {
		t.Errorf("NaN K: err = %v", err)
	}
	// Expanded (x − y)² evaluates slightly below zero near x = y.
	expanded := funcEval{2, func(x []float64) float64 { return x[0]*x[0] - 2*x[0]*x[1] + x[1]*x[1] }}
	opt.RoundOff = 1e-15
	if _, err := Run(context.Background(), expanded, opt); err != nil {
		t.Errorf("expanded (x−y)² with RoundOff: %v", err)
	}
	opt.RoundOff = 0
	flat := funcEval{2, func(x []float64) float64 { return math.Max(0, x[0]) }}
	if _, err := Run(context.Background(), flat, opt); !errors.Is(err, ErrNoProgress) {
		t.Errorf("K = 0 on half the box: err = %v", err)
	}
	plateau := funcEval{2, func(x []float64) float64 { return 1 + math.Max(0, x[0]) }}
	if _, err := Run(context.Background(), plateau, opt); !errors.Is(err, ErrNoProgress) {
		t.Errorf("K = 1 on half the box: err = %v", err)
	}
	// |x|^(1/50) has λ = 50, far beyond what a C² function vanishing at 0
	// can have in two variables (λ ≤ 1).
	steep := funcEval{2, func(x []float64) float64 { return math.Pow(math.Abs(x[0]), 0.02) }}
	if _, err := Run(context.Background(), steep, opt); !errors.Is(err, ErrTooDeep) {
		t.Errorf("K = |x|^(1/50): err = %v", err)
	}
}

func TestCancel(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Run(ctx, quickK, quickOptions()); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled before: err = %v", err)
	}
	ctx, cancel = context.WithCancel(context.Background())
	defer cancel()
	opt := quickOptions()
	opt.Progress = func(done, total int) {
		if done > 0 {
			cancel()
		}
	}
	if _, err := Run(ctx, quickK, opt); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled during: err = %v", err)
	}
}

func TestProgress(t *testing.T) {
	opt := quickOptions()
	opt.Workers = 2
	var calls, last, tot int
	opt.Progress = func(done, total int) {
		if done < last || total != 1000*opt.Runs || done > total {
			t.Errorf("progress %d/%d after %d", done, total, last)
		}
		calls++
		last, tot = done, total
	}
	if _, err := Run(context.Background(), quickK, opt); err != nil {
		t.Fatal(err)
	}
	if calls < 3 || last != tot {
		t.Errorf("%d progress calls, last %d/%d", calls, last, tot)
	}
}

// TestCompare checks the comparison by status: the sign and size of Sigmas
// worked out by hand, the threshold of 3 standard errors, and words that
// never call a certified exact value strict.
func TestCompare(t *testing.T) {
	cases := []struct {
		lambda, se, value float64
		status            rlct.Status
		consistent        bool
		sigmas            float64
		text              string
	}{
		{0.5, 0.01, 1, rlct.UpperBound, false, 50, "below the bound by 50.0 standard errors: the bound is probably strict here"},
		{0.5, 0.01, 0.529, rlct.UpperBound, true, 2.9, "consistent with the bound"},
		{0.5, 0.01, 0.5, rlct.UpperBound, true, 0, "consistent with the bound"},
		{0.5, 0.01, 0.45, rlct.UpperBound, true, -5, "consistent with the bound, but above it by 5.0 standard errors"},
		{0.5, 0.01, 0.531, rlct.UpperBound, false, 3.1, "below the bound by 3.1 standard errors"},
		{0.5, 0.01, 0.529, rlct.Exact, true, 2.9, "consistent with the exact value"},
		{0.5, 0.01, 0.471, rlct.Exact, true, -2.9, "consistent with the exact value"},
		{0.5, 0.01, 0.55, rlct.Exact, false, 5, "below the exact value by 5.0 standard errors: the value is certified, so the estimate is biased low"},
		{0.5, 0.01, 0.45, rlct.Exact, false, -5, "above the exact value by 5.0 standard errors: the value is certified, so the estimate is biased high"},
		{0.5, 0.01, 0.55, rlct.Uncertified, false, 5, "below the Newton value by 5.0 standard errors; the Newton value is not certified"},
		{0.5, 0.01, 0.45, rlct.Uncertified, false, -5, "above the Newton value by 5.0 standard errors; the Newton value is not certified"},
		{0.5, 0.01, 0.5, rlct.Uncertified, true, 0, "close to the Newton value; the Newton value is not certified"},
		{0.5, 0, 1, rlct.UpperBound, false, math.Inf(1), "below the bound by +Inf standard errors"},
	}
	for _, c := range cases {
		e := &Result{Lambda: c.lambda, LambdaSE: c.se}
		v := e.Compare(c.value, c.status)
		if v.Consistent != c.consistent || !(math.Abs(v.Sigmas-c.sigmas) <= 1e-9 || v.Sigmas == c.sigmas) ||
			!strings.HasPrefix(v.Text, c.text) || v.Lambda != c.value || v.Status != c.status {
			t.Errorf("λ̂ = %g ± %g vs %g (%s): %+v", c.lambda, c.se, c.value, c.status, v)
		}
		if c.status == rlct.Exact && strings.Contains(v.Text, "strict") {
			t.Errorf("λ̂ = %g vs the exact %g: %q calls an exact value strict", c.lambda, c.value, v.Text)
		}
	}
}
