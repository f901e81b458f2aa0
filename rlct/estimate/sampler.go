// Nested-sampling runs for Run: the random streams, the prior transform,
// the constrained slice sampler and one run.

package estimate

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/mathext/prng"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"
)

// stream is the random stream of one run: a xoshiro256++ generator from
// gonum/mathext/prng, read through gonum/stat/distuv for uniform reals and
// through math/rand/v2 for integers.
type stream struct {
	src *prng.Xoshiro256plusplus
	*rand.Rand
}

func newStream(seed uint64) *stream {
	src := prng.NewXoshiro256plusplus(seed)
	return &stream{src: src, Rand: rand.New(src)}
}

// uniform returns a draw from the uniform distribution on [lo, hi).
func (s *stream) uniform(lo, hi float64) float64 {
	return distuv.Uniform{Min: lo, Max: hi, Src: s.src}.Rand()
}

// priorBox maps the box with prior ∏|w_i|^(h_i) to coordinates v in which the
// prior is uniform: v_i = G_i(w_i)/T_i with G(w) = sign(w)·|w|^(h+1)/(h+1) and
// T_i = G_i(Upper_i) − G_i(Lower_i), so each v_i ranges over an interval of
// length 1 and v_i = 0 exactly when w_i = 0 (keeping full relative precision
// near the origin, where the interesting mass is).
type priorBox struct {
	lo, hi []float64 // range of v_i
	scale  []float64 // T_i·(h_i+1)
	power  []float64 // 1/(h_i+1)
	plain  []bool    // h_i == 0: w = v·T
}

func newPriorBox(lower, upper, prior []float64) (priorBox, error) {
	d := len(lower)
	p := priorBox{lo: make([]float64, d), hi: make([]float64, d), scale: make([]float64, d),
		power: make([]float64, d), plain: make([]bool, d)}
	for i := range d {
		h := 0.0
		if prior != nil {
			h = prior[i]
		}
		g := func(w float64) float64 {
			return math.Copysign(math.Pow(math.Abs(w), h+1)/(h+1), w)
		}
		ga, gb := g(lower[i]), g(upper[i])
		t := gb - ga
		if !(t > 0) || math.IsInf(t, 0) {
			return priorBox{}, fmt.Errorf("estimate: prior mass of variable %d over [%g, %g] with h = %g is not a positive finite number",
				i, lower[i], upper[i], h)
		}
		p.lo[i], p.hi[i] = ga/t, gb/t
		p.scale[i] = t * (h + 1)
		p.power[i] = 1 / (h + 1)
		p.plain[i] = h == 0
	}
	return p, nil
}

// toW maps v to the box coordinates w.
func (p *priorBox) toW(w, v []float64) {
	for i, x := range v {
		if p.plain[i] {
			w[i] = x * p.scale[i]
		} else {
			w[i] = math.Copysign(math.Pow(math.Abs(x)*p.scale[i], p.power[i]), x)
		}
	}
}

// inside reports whether v lies in the box.
func (p *priorBox) inside(v []float64) bool {
	for i, x := range v {
		if !(x >= p.lo[i] && x <= p.hi[i]) {
			return false
		}
	}
	return true
}

// draw fills v with a point from the prior.
func (p *priorBox) draw(rng *stream, v []float64) {
	for i := range v {
		v[i] = min(rng.uniform(p.lo[i], p.hi[i]), p.hi[i]) // min: rounding
	}
}

// kReader evaluates K at points given in v coordinates, checks the values and
// counts the evaluations. One per goroutine.
type kReader struct {
	k        Evaluator
	box      *priorBox
	roundOff float64
	w        []float64
	evals    int64
}

func newKReader(c *config) *kReader {
	return &kReader{k: c.k, box: &c.box, roundOff: c.roundOff, w: make([]float64, c.d)}
}

func (r *kReader) eval(v []float64) (float64, error) {
	r.box.toW(r.w, v)
	return r.evalW(r.w)
}

// evalW evaluates K at a point w given in box coordinates.
func (r *kReader) evalW(w []float64) (float64, error) {
	r.evals++
	k := r.k.Eval(w)
	if k >= 0 && !math.IsInf(k, 1) {
		return k, nil
	}
	if k < 0 && k >= -r.roundOff {
		return 0, nil
	}
	return 0, &KValueError{Point: slices.Clone(w), Value: k}
}

// nsPoint is a removed point of a run: its K and the level of the constraint
// {K < birth} under which it was drawn (+Inf for the initial points).
type nsPoint struct {
	k, birth float64
}

// nsRun is the record of one run: the removed points in order of removal
// (decreasing K), ending with the final live points in decreasing K.
type nsRun struct {
	points []nsPoint
	depth  float64 // −log X when the run stopped
	evals  int64
	final  []float64 // the final live points in box coordinates w, row-major
	finalK []float64 // K at the final live points
}

// runSettings are the per-estimate quantities a run needs.
type runSettings struct {
	nMax     float64 // largest n of the grid
	target   float64 // ε at which every live point has nMax·K ≤ stopDelta
	scale    float64 // median K under the prior, for progress
	maxDepth float64 // give up (ErrTooDeep) beyond this −log X
}

// slicer draws new points for one run.
type slicer struct {
	rng    *stream
	reader *kReader
	d      int
	live   []float64 // live points, row-major Live × d
	n      int       // number of live points
	width  []float64 // per-coordinate step width for axis moves
	column []float64 // scratch for one coordinate of the live points
	cur    []float64
	trial  []float64
	dir    []float64
}

// maxStepOut is Neal's (2003) limit m on the number of steps in stepping out;
// maxShrink bounds the shrinkage loop, which can only fail to end through
// floating-point rounding in an extremely thin slice.
const (
	maxStepOut = 8
	maxShrink  = 200
)

// updateWidths sets the axis step widths to twice the spread (population
// standard deviation) of the live points in each coordinate.
func (s *slicer) updateWidths() {
	live := mat.NewDense(s.n, s.d, s.live)
	for i := range s.d {
		mat.Col(s.column, i, live)
		s.width[i] = 2*stat.PopStdDev(s.column, nil) + 1e-300
	}
}

// in reports whether v lies in {K < eps} within the box, and K there.
func (s *slicer) in(v []float64, eps float64) (bool, float64, error) {
	if !s.reader.box.inside(v) {
		return false, 0, nil
	}
	k, err := s.reader.eval(v)
	if err != nil {
		return false, 0, err
	}
	return k < eps, k, nil
}

// move makes one slice-sampling update of s.cur (with K value kcur) inside
// {K < eps} along s.dir with initial interval width w, by stepping out and
// shrinkage (Neal 2003, section 4, figures 3 and 5). It returns the new K.
func (s *slicer) move(kcur, eps, w float64) (float64, error) {
	at := func(t float64) []float64 {
		for i := range s.d {
			s.trial[i] = s.cur[i] + t*s.dir[i]
		}
		return s.trial
	}
	left := s.rng.uniform(-w, 0)
	right := left + w
	j := s.rng.IntN(maxStepOut)
	kk := maxStepOut - 1 - j
	for ; j > 0; j-- {
		ok, _, err := s.in(at(left), eps)
		if err != nil {
			return 0, err
		}
		if !ok {
			break
		}
		left -= w
	}
	for ; kk > 0; kk-- {
		ok, _, err := s.in(at(right), eps)
		if err != nil {
			return 0, err
		}
		if !ok {
			break
		}
		right += w
	}
	for range maxShrink {
		t := s.rng.uniform(left, right)
		ok, k, err := s.in(at(t), eps)
		if err != nil {
			return 0, err
		}
		if ok {
			copy(s.cur, s.trial)
			return k, nil
		}
		if t < 0 {
			left = t
		} else {
			right = t
		}
	}
	return kcur, nil
}

// replace overwrites live point dead with a new point drawn from the prior
// restricted to {K < eps}, starting from live point start, and returns its K.
func (s *slicer) replace(dead, start int, kstart, eps float64, steps int) (float64, error) {
	copy(s.cur, s.live[start*s.d:(start+1)*s.d])
	k := kstart
	var err error
	for range steps {
		clear(s.dir)
		var w float64
		if s.rng.IntN(2) == 0 {
			i := s.rng.IntN(s.d)
			s.dir[i] = 1
			w = s.width[i]
		} else {
			// Difference of two other live points (neither the start nor
			// the removed one), so that the direction does not depend on
			// the current state of the chain.
			a, b := s.otherPair(dead, start)
			for i := range s.d {
				s.dir[i] = s.live[a*s.d+i] - s.live[b*s.d+i]
			}
			w = 1
		}
		if k, err = s.move(k, eps, w); err != nil {
			return 0, err
		}
	}
	copy(s.live[dead*s.d:(dead+1)*s.d], s.cur)
	return k, nil
}

// otherPair returns two distinct live indices different from x and y.
func (s *slicer) otherPair(x, y int) (int, int) {
	pick := func(not1, not2 int) int {
		for {
			i := s.rng.IntN(s.n)
			if i != not1 && i != not2 {
				return i
			}
		}
	}
	a := pick(x, y)
	for {
		b := pick(x, y)
		if b != a {
			return a, b
		}
	}
}

// run performs one nested-sampling run from the given initial live points
// (row-major, with their K values); report receives the fraction of the run
// done.
func (c *config) run(ctx context.Context, rng *stream, initial, kinit []float64,
	set runSettings, report func(float64)) (*nsRun, error) {
	n, d := c.live, c.d
	s := &slicer{rng: rng, reader: newKReader(c), d: d, live: slices.Clone(initial), n: n,
		width: make([]float64, d), column: make([]float64, n), cur: make([]float64, d), trial: make([]float64, d), dir: make([]float64, d)}
	kl := slices.Clone(kinit)
	birth := make([]float64, n)
	for i := range birth {
		birth[i] = math.Inf(1)
	}
	out := &nsRun{points: make([]nsPoint, 0, 8*n)}
	shrink := math.Log(float64(n) / float64(n+1)) // E[log-free] shrinkage: log E[t], t ~ Beta(n, 1)
	logX := 0.0
	logZ := math.Inf(-1) // log Z(nMax) accumulated from the removed points
	progressLog := math.Log(set.scale / set.target)
	widthEvery := max(1, n/4)
	for iter := 0; ; iter++ {
		if iter%32 == 0 {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
		}
		if iter%widthEvery == 0 {
			s.updateWidths()
		}
		worst, best := 0, 0
		for i := 1; i < n; i++ {
			if kl[i] > kl[worst] {
				worst = i
			}
			if kl[i] < kl[best] {
				best = i
			}
		}
		eps := kl[worst]
		if iter%64 == 0 && report != nil && eps > 0 {
			report(math.Log(set.scale/eps) / progressLog)
		}
		if eps == 0 {
			// Every live point on the zero set: it has positive prior mass.
			return nil, ErrNoProgress
		}
		// Stop when every live point carries almost full weight at nMax,
		// or when the live points can hold at most stopShare of Z(nMax).
		if eps <= set.target || logX-set.nMax*kl[best] <= math.Log(stopShare)+logZ {
			break
		}
		if -logX > set.maxDepth {
			return nil, ErrTooDeep
		}
		if kl[best] == eps {
			return nil, ErrNoProgress
		}
		out.points = append(out.points, nsPoint{k: eps, birth: birth[worst]})
		logZ = floats.LogSumExp([]float64{logZ, logX - math.Log(float64(n+1)) - set.nMax*eps})
		logX += shrink
		// Start from a random surviving live point strictly inside.
		start := rng.IntN(n - 1)
		if start >= worst {
			start++
		}
		for kl[start] >= eps {
			start = rng.IntN(n)
		}
		k, err := s.replace(worst, start, kl[start], eps, c.steps)
		if err != nil {
			return nil, err
		}
		kl[worst] = k
		birth[worst] = eps
	}
	// The final live points, in decreasing K.
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		switch {
		case kl[a] > kl[b]:
			return -1
		case kl[a] < kl[b]:
			return 1
		}
		return 0
	})
	out.final, out.finalK = make([]float64, n*d), make([]float64, n)
	for j, i := range idx {
		out.points = append(out.points, nsPoint{k: kl[i], birth: birth[i]})
		c.box.toW(out.final[j*d:(j+1)*d], s.live[i*d:(i+1)*d])
		out.finalK[j] = kl[i]
	}
	out.depth = -logX
	out.evals = s.reader.evals
	if report != nil {
		report(1)
	}
	return out, nil
}
