// Orchestration of Run: the runs over the workers, the merge of runs, the
// curve y(n), the jackknife and the fit.

package estimate

import (
	"cmp"
	"context"
	"errors"
	"math"
	"slices"
	"sync"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/mathext/prng"
	"gonum.org/v1/gonum/stat"
)

// sampleSet is the raw outcome of the runs.
type sampleSet struct {
	runs       []*nsRun
	scale, top float64 // median and largest K over the initial live points
	grid       []float64
	evals      int64 // evaluations of K outside the runs
}

// estimate runs everything for a validated configuration.
func (c *config) estimate(ctx context.Context) (*Result, error) {
	s, err := c.sample(ctx)
	if err != nil {
		return nil, err
	}
	est := &Result{Scale: s.scale, Top: s.top, Live: c.live, Runs: c.runs, Evaluations: s.evals}
	for _, r := range s.runs {
		est.Evaluations += r.evals
		est.Depth += r.depth / float64(c.runs)
	}
	m := newMerger(s.runs)
	full, se, ys := m.curveSE(s.grid, c.workers)
	est.Lambda, est.Theta, est.Offset = fitCurve(s.grid, full, s.top)
	// Jackknife over runs (common practice; Efron 1982, The Jackknife, the
	// Bootstrap and Other Resampling Plans, SIAM, chapter 3; from memory).
	lams, ths := make([]float64, c.runs), make([]float64, c.runs)
	for r := range c.runs {
		lams[r], ths[r], _ = fitCurve(s.grid, ys[r], s.top)
	}
	est.LambdaSE = jackknifeSE(lams)
	est.ThetaSE = jackknifeSE(ths)
	est.Points = make([]CurvePoint, len(s.grid))
	for g, n := range s.grid {
		est.Points[g] = CurvePoint{N: n, Y: full[g], SE: se[g]}
	}
	// K between two groups of final points above 1/n at the low end of the
	// grid separates them over the whole grid (see Zero).
	barrier := s.scale * math.Pow(10, -c.start)
	reader := newKReader(c)
	est.OtherZeros, err = c.otherZeros(s.runs, reader, barrier)
	est.Evaluations += reader.evals
	if err != nil {
		return nil, err
	}
	return est, nil
}

// curveSE returns y(n) on the grid for the merged run of all runs, its
// jackknife standard errors, and the leave-one-run-out curves, computed on
// up to workers goroutines.
func (m *merger) curveSE(grid []float64, workers int) (y, se []float64, loo [][]float64) {
	loo = make([][]float64, m.runs+1)
	var wg sync.WaitGroup
	next := make(chan int)
	for range max(1, min(workers, m.runs+1)) {
		wg.Go(func() {
			for r := range next {
				loo[r] = m.curve(grid, r-1) // r = 0: all runs
			}
		})
	}
	for r := range m.runs + 1 {
		next <- r
	}
	close(next)
	wg.Wait()
	y, loo = loo[0], loo[1:]
	se = make([]float64, len(grid))
	col := make([]float64, m.runs)
	for g := range grid {
		for r := range m.runs {
			col[r] = loo[r][g]
		}
		se[g] = jackknifeSE(col)
	}
	return y, se, loo
}

// sample draws the initial live points, sets the grid and performs the runs.
func (c *config) sample(ctx context.Context) (*sampleSet, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	n, d := c.live, c.d
	// Initial live points of every run, drawn here in run order so that the
	// prior median of K (the unit of n) does not depend on the workers.
	// Run r draws from the stream seeded with the r-th output of a
	// SplitMix64 generator seeded with Seed.
	seeds := prng.NewSplitMix64(c.seed)
	rngs := make([]*stream, c.runs)
	initial := make([][]float64, c.runs)
	kinit := make([][]float64, c.runs)
	reader := newKReader(c)
	var all []float64
	for r := range c.runs {
		rngs[r] = newStream(seeds.Uint64())
		initial[r] = make([]float64, n*d)
		kinit[r] = make([]float64, n)
		for i := range n {
			v := initial[r][i*d : (i+1)*d]
			c.box.draw(rngs[r], v)
			k, err := reader.eval(v)
			if err != nil {
				return nil, err
			}
			kinit[r][i] = k
		}
		all = append(all, kinit[r]...)
	}
	slices.Sort(all)
	scale, top := stat.Quantile(0.5, stat.Empirical, all, nil), all[len(all)-1]
	if !(scale > 0) {
		return nil, ErrNoProgress
	}
	grid := c.grid(scale)
	nMax := grid[len(grid)-1]
	set := runSettings{nMax: nMax, target: stopDelta / nMax, scale: scale}
	if c.roundOff > 0 && set.target < 100*c.roundOff {
		return nil, errors.New("estimate: the grid of n needs K resolved below 100·RoundOff; use fewer Decades")
	}
	// K ≥ 0 is C² with K(0) = 0, so K ≤ C|w|² near 0 and the prior mass of
	// {K < ε} is at least c·ε^λmax with λmax = Σ(h_i+1)/2; allow three
	// times that depth, plus room for logarithmic factors.
	lambdaMax := 0.0
	for i := range d {
		lambdaMax += 1 / (2 * c.box.power[i])
	}
	set.maxDepth = 3*lambdaMax*math.Log(scale/set.target) + 50

	runs, err := c.runAll(ctx, rngs, initial, kinit, set)
	if err != nil {
		return nil, err
	}
	return &sampleSet{runs: runs, scale: scale, top: top, grid: grid, evals: reader.evals}, nil
}

// jackknifeSE returns the jackknife standard error from the leave-one-out
// values x over r = len(x) groups: sqrt((r−1)/r · Σ(x_i − mean)²), which is
// sqrt((r−1)·v) for the population variance v of x.
func jackknifeSE(x []float64) float64 {
	return math.Sqrt(float64(len(x)-1) * stat.PopVariance(x, nil))
}

// grid returns the values of n, pointsPerDecade per decade from
// 10^c.start/scale over c.decades decades.
func (c *config) grid(scale float64) []float64 {
	m := int(math.Round(c.decades * pointsPerDecade))
	g := make([]float64, m+1)
	for i := range g {
		t := c.start + c.decades*float64(i)/float64(m)
		g[i] = math.Pow(10, t) / scale
	}
	return g
}

// runAll performs the runs on c.workers goroutines. Run r uses rngs[r] only,
// so the records do not depend on the number of workers.
func (c *config) runAll(ctx context.Context, rngs []*stream, initial, kinit [][]float64,
	set runSettings) ([]*nsRun, error) {
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	runs := make([]*nsRun, c.runs)
	errs := make([]error, c.runs)
	const perRun = 1000
	total := perRun * c.runs
	var mu sync.Mutex
	done := make([]int, c.runs)
	sum, last := 0, -1
	report := func(r int, f float64) {
		if c.progress == nil {
			return
		}
		v := int(math.Min(math.Max(f, 0), 1) * perRun)
		mu.Lock()
		defer mu.Unlock()
		if v > done[r] {
			sum += v - done[r]
			done[r] = v
		}
		if sum != last {
			last = sum
			c.progress(sum, total)
		}
	}
	report(0, 0)
	jobs := make(chan int)
	var wg sync.WaitGroup
	for range min(c.workers, c.runs) {
		wg.Go(func() {
			for r := range jobs {
				runs[r], errs[r] = c.run(ctx, rngs[r], initial[r], kinit[r], set,
					func(f float64) { report(r, f) })
				if errs[r] != nil {
					cancel()
				}
			}
		})
	}
	for r := range c.runs {
		jobs <- r
	}
	close(jobs)
	wg.Wait()
	// Prefer a real error to the cancellations it caused.
	var first error
	for _, err := range errs {
		if err == nil {
			continue
		}
		if !errors.Is(err, context.Canceled) || ctx.Err() == nil {
			return nil, err
		}
		if first == nil {
			first = err
		}
	}
	if first != nil {
		return nil, first
	}
	return runs, nil
}

// merger holds the points of all runs in one order of decreasing K, to merge
// any subset of the runs.
type merger struct {
	k, birth []float64 // in decreasing K (ties: by run, then order in the run)
	run      []int
	births   []float64 // all births, decreasing
	birthRun []int
	runs     int
}

func newMerger(runs []*nsRun) *merger {
	type tagged struct {
		p      nsPoint
		run, i int
	}
	var all []tagged
	for r, x := range runs {
		for i, p := range x.points {
			all = append(all, tagged{p, r, i})
		}
	}
	slices.SortFunc(all, func(a, b tagged) int {
		if c := cmp.Compare(b.p.k, a.p.k); c != 0 {
			return c
		}
		if c := cmp.Compare(a.run, b.run); c != 0 {
			return c
		}
		return cmp.Compare(a.i, b.i)
	})
	m := &merger{k: make([]float64, len(all)), birth: make([]float64, len(all)), run: make([]int, len(all)),
		runs: len(runs)}
	for j, t := range all {
		m.k[j], m.birth[j], m.run[j] = t.p.k, t.p.birth, t.run
	}
	slices.SortStableFunc(all, func(a, b tagged) int { return cmp.Compare(b.p.birth, a.p.birth) })
	m.births = make([]float64, len(all))
	m.birthRun = make([]int, len(all))
	for j, t := range all {
		m.births[j], m.birthRun[j] = t.p.birth, t.run
	}
	return m
}

// weights returns the log prior-mass weights of the merged run of all runs
// except skip (skip < 0: all runs), in the order of m.k, with −Inf for the
// points of the skipped run. At the removal of the point with K = k, the live points
// are those (of the included runs) born under a constraint above k and not
// yet removed (Higson et al. 2019, section 2); the prior mass shrinks by the
// expected factor n/(n+1) for n live points (Skilling 2006, section 5), and
// the last point carries all the remaining mass.
func (m *merger) weights(skip int) []float64 {
	logW := make([]float64, len(m.k))
	logX := 0.0
	removed, born, pb := 0, 0, 0
	lastJ := -1
	for j, k := range m.k {
		if m.run[j] == skip {
			logW[j] = math.Inf(-1)
			continue
		}
		for pb < len(m.births) && m.births[pb] > k {
			if m.birthRun[pb] != skip {
				born++
			}
			pb++
		}
		live := float64(born - removed)
		removed++
		if live < 1 { // cannot happen for consistent records; keep the sums finite
			live = 1
		}
		logW[j] = logX - math.Log(live+1)
		logX += math.Log(live / (live + 1))
		lastJ = j
	}
	if lastJ >= 0 {
		// The last point stands for all the mass below the previous one.
		logW[lastJ] = floats.LogSumExp([]float64{logW[lastJ], logX})
	}
	return logW
}

// curve returns y(n) = n·E_n[K] on the grid for the merged run without run
// skip (skip < 0: all runs): n times the mean of K under the weights
// W_j·exp(−n·K_j), scaled by the largest of them.
func (m *merger) curve(grid []float64, skip int) []float64 {
	logW := m.weights(skip)
	y := make([]float64, len(grid))
	w := make([]float64, len(m.k))
	for g, n := range grid {
		top := math.Inf(-1)
		for j, k := range m.k {
			top = math.Max(top, logW[j]-n*k)
		}
		for j, k := range m.k {
			a := logW[j] - n*k - top
			if a < -40 { // below 1e−17 of the largest term
				w[j] = 0
				continue
			}
			w[j] = math.Exp(a)
		}
		y[g] = n * stat.Mean(m.k, w)
	}
	return y
}

// fitCurve fits y = λ − (θ−1)/(log n + b) to the curve by least squares with
// equal weights. The offset b is not free (over a few decades it cannot be
// told apart from θ) but tied to λ and θ by offsetFor; the fit iterates to
// a fixed point. It returns λ, θ and b.
func fitCurve(grid, y []float64, top float64) (lambda, theta, offset float64) {
	// A fixed point exists and the iteration contracts when b changes
	// little with λ; stop after a bounded number of steps in any case.
	u := make([]float64, len(grid))
	lambda, theta = 1, 1
	for range 100 {
		offset = offsetFor(lambda, top)
		for i, n := range grid {
			u[i] = 1 / (math.Log(n) + offset)
		}
		l, th := lineFit(u, y)
		done := math.Abs(l-lambda) < 1e-12 && math.Abs(th-theta) < 1e-12
		lambda, theta = l, th
		if done {
			break
		}
	}
	return lambda, theta, offsetFor(lambda, top)
}

// offsetFor returns the offset b in y(n) = λ − (θ−1)/(log n + b) for a
// monomial K = ∏w_i^(2k_i) on a box, with prior ∏|w_i|^(h_i), whose largest
// value on the box is top, when the rates (h_i+1)/(2k_i) of all variables tie
// at λ (so θ = d). There −log K is, under the prior, a sum of θ independent
// exponential variables with rate λ, so for ℓ = log(top/ε) the volume is the
// Gamma(θ, λ) tail V(ε) = e^(−λℓ)·Σ_{j<θ}(λℓ)^j/j!, whose logarithmic
// derivative is λ − (θ−1)/(ℓ + 1/λ) + O(1/ℓ³); the Laplace transform moves
// the offset by −ψ(λ+1) (ψ the digamma function, from gonum/mathext), so
// b = 1/λ + log(top) − ψ(λ+1). For K = x²y² on [−1,1]² this gives
// b = 2 − ψ(3/2) ≈ 1.9635, the exact value. A variable with a larger rate μ
// would lower the offset by about 1/(μ−λ); for K other than such monomials
// the value is a default, not a fact. When θ = 1 the offset does not matter;
// the same formula is used for every θ so that the fit depends smoothly on
// the data. λ is floored at 0.05 to keep b bounded while iterating.
func offsetFor(lambda, top float64) float64 {
	lambda = math.Max(lambda, 0.05)
	return 1/lambda + math.Log(top) - mathext.Digamma(lambda+1)
}

// lineFit returns λ and θ of the least-squares fit of y_i = λ − (θ−1)·u_i,
// solved by a QR factorization of the design matrix with the columns 1 and
// −u. When the columns are (nearly) dependent, that is u is (nearly)
// constant, it returns the mean of y and θ = 1.
func lineFit(u, y []float64) (lambda, theta float64) {
	a := mat.NewDense(len(u), 2, nil)
	for i, x := range u {
		a.Set(i, 0, 1)
		a.Set(i, 1, -x)
	}
	var qr mat.QR
	qr.Factorize(a)
	var x mat.VecDense
	if err := qr.SolveVecTo(&x, false, mat.NewVecDense(len(y), y)); err != nil {
		return stat.Mean(y, nil), 1
	}
	return x.AtVec(0), 1 + x.AtVec(1)
}
