package polyhedron

import (
	"math"
	"slices"
)

// This file holds a float64 version of the ray-shooting LP. Its results are
// never returned as exact: they only choose the columns (and candidate
// certificates) that the exact code then verifies.

const floatTol = 1e-9

// ftableau is the float64 twin of tableau (same layout and rules).
type ftableau struct {
	m      int
	rows   [][]float64
	rhs    []float64
	sign   []float64
	cost   []float64
	red    []float64
	z      float64
	basis  []int
	phase  int
	pivots int
}

func newFTableau(b []float64) *ftableau {
	m := len(b)
	t := &ftableau{m: m, rows: make([][]float64, m), rhs: make([]float64, m), sign: make([]float64, m),
		basis: make([]int, m), phase: 1, cost: make([]float64, m), red: make([]float64, m)}
	for i := 0; i < m; i++ {
		t.sign[i] = 1
		t.rhs[i] = b[i]
		if b[i] < 0 {
			t.sign[i] = -1
			t.rhs[i] = -b[i]
		}
		t.rows[i] = make([]float64, m, 8*m) // room for the usual column count
		t.rows[i][i] = 1
		t.basis[i] = i
		t.z += t.rhs[i]
	}
	return t
}

func (t *ftableau) phaseCost(j int) float64 {
	if t.phase == 1 {
		if j < t.m {
			return 1
		}
		return 0
	}
	return t.cost[j]
}

func (t *ftableau) addColumn(a []float64, c float64) int {
	for i := 0; i < t.m; i++ {
		v := 0.0
		for k := 0; k < t.m; k++ {
			v += t.rows[i][k] * t.sign[k] * a[k]
		}
		t.rows[i] = append(t.rows[i], v)
	}
	j := len(t.cost)
	t.cost = append(t.cost, c)
	t.red = append(t.red, t.reducedCost(j))
	return j
}

func (t *ftableau) reducedCost(j int) float64 {
	r := t.phaseCost(j)
	for i := 0; i < t.m; i++ {
		r -= t.phaseCost(t.basis[i]) * t.rows[i][j]
	}
	return r
}

func (t *ftableau) pivot(r, q int) {
	t.pivots++
	row := t.rows[r]
	p := row[q]
	for j := range row {
		row[j] /= p
	}
	t.rhs[r] /= p
	for i := 0; i < t.m; i++ {
		if i == r {
			continue
		}
		f := t.rows[i][q]
		if f == 0 {
			continue
		}
		ri := t.rows[i]
		for j, x := range row {
			if x != 0 {
				ri[j] -= f * x
			}
		}
		ri[q] = 0
		t.rhs[i] -= f * t.rhs[r]
		if t.rhs[i] < 0 && t.rhs[i] > -floatTol {
			t.rhs[i] = 0
		}
	}
	if f := t.red[q]; f != 0 {
		for j, x := range row {
			if x != 0 {
				t.red[j] -= f * x
			}
		}
		t.red[q] = 0
		t.z += f * t.rhs[r]
	}
	t.basis[r] = q
}

// iterate returns false when it gives up (iteration cap or unboundedness).
func (t *ftableau) iterate() bool {
	first := 0
	if t.phase == 2 {
		first = t.m
	}
	bland := false
	for it := 0; it < 50*(len(t.cost)+t.m)+1000; it++ {
		q := -1
		for j := first; j < len(t.red); j++ {
			if t.red[j] >= -floatTol {
				continue
			}
			if q < 0 {
				q = j
				if bland {
					break
				}
			} else if t.red[j] < t.red[q] {
				q = j
			}
		}
		if q < 0 {
			return true
		}
		r := -1
		best := math.Inf(1)
		for i := 0; i < t.m; i++ {
			x := t.rows[i][q]
			if x <= floatTol {
				continue
			}
			ratio := t.rhs[i] / x
			if ratio < best-floatTol || (ratio <= best+floatTol && r >= 0 && t.basis[i] < t.basis[r]) {
				best = ratio
				r = i
			}
		}
		if r < 0 {
			return false
		}
		bland = t.rhs[r] <= floatTol
		t.pivot(r, q)
	}
	return false
}

func (t *ftableau) solve() bool {
	if t.phase == 1 {
		if !t.iterate() {
			return false
		}
		if t.z > 1e-7 {
			return false
		}
		for i := 0; i < t.m; i++ {
			if t.basis[i] >= t.m {
				continue
			}
			bestJ, bestV := -1, 1e-7
			for j := t.m; j < len(t.cost); j++ {
				if v := math.Abs(t.rows[i][j]); v > bestV {
					bestJ, bestV = j, v
				}
			}
			if bestJ >= 0 {
				t.pivot(i, bestJ)
			}
		}
		t.phase = 2
		for j := range t.red {
			t.red[j] = t.reducedCost(j)
		}
		t.z = 0
		for i := 0; i < t.m; i++ {
			t.z += t.cost[t.basis[i]] * t.rhs[i]
		}
	}
	return t.iterate()
}

func (t *ftableau) duals() []float64 {
	y := make([]float64, t.m)
	for k := range y {
		y[k] = -t.red[k] * t.sign[k]
	}
	return y
}

// fshot is the float64 solution of the ray-shooting LP.
type fshot struct {
	t       float64
	a       []float64
	b       float64
	weights map[int]float64 // point index -> λ (basic points)
	cols    []int           // all point columns used by the final master
	slacks  []int           // coordinates whose slack column is basic
	tBasic  bool            // t⁺ or t⁻ is basic
}

// shootFloat solves the ray-shooting LP in float64 by column generation.
// It returns ok = false if the float computation failed to converge.
func shootFloat(pts [][]int, x0, tau []float64) (fs fshot, ok bool) {
	d := len(x0)
	m := d + 1
	rhs := append(slices.Clone(x0), 1)
	t := newFTableau(rhs)
	col := make([]float64, m)
	for i := 0; i < d; i++ {
		clear(col)
		col[i] = 1
		t.addColumn(col, 0)
	}
	for i := 0; i < d; i++ {
		col[i] = -tau[i]
	}
	col[d] = 0
	tPlus := t.addColumn(col, 1)
	for i := 0; i < d; i++ {
		col[i] = tau[i]
	}
	tMinus := t.addColumn(col, -1)
	first := tMinus + 1
	var colPoint []int
	inMaster := make([]bool, len(pts))
	addPoint := func(j int) {
		for i := 0; i < d; i++ {
			col[i] = float64(pts[j][i])
		}
		col[d] = 1
		t.addColumn(col, 0)
		colPoint = append(colPoint, j)
		inMaster[j] = true
	}
	for _, j := range initialPoints(pts, x0, tau, m) {
		addPoint(j)
	}
	type cand struct {
		j int
		v float64
	}
	var cands []cand
	for round := 0; round < 10000; round++ {
		if !t.solve() {
			return fs, false
		}
		y := t.duals()
		a := make([]float64, d)
		scale := 0.0
		for i := range a {
			a[i] = -y[i]
			scale = max(scale, math.Abs(a[i]))
		}
		b := y[d]
		scale = max(scale, math.Abs(b), 1)
		// the (up to) 2m most violated points, by bounded insertion
		limit := 2 * m
		cands = cands[:0]
		for j, p := range pts {
			if inMaster[j] {
				continue
			}
			s := -b
			for i, x := range p {
				if x != 0 {
					s += a[i] * float64(x)
				}
			}
			if s >= -1e-9*scale || (len(cands) == limit && s >= cands[limit-1].v) {
				continue
			}
			k := len(cands)
			if k < limit {
				cands = append(cands, cand{})
			} else {
				k = limit - 1
			}
			for k > 0 && cands[k-1].v > s {
				cands[k] = cands[k-1]
				k--
			}
			cands[k] = cand{j, s}
		}
		if len(cands) == 0 {
			fs.a, fs.b = a, b
			break
		}
		for _, c := range cands {
			addPoint(c.j)
		}
	}
	if fs.a == nil {
		return fs, false
	}
	fs.weights = map[int]float64{}
	for r, c := range t.basis {
		switch {
		case c == tPlus:
			fs.t += t.rhs[r]
			fs.tBasic = true
		case c == tMinus:
			fs.t -= t.rhs[r]
			fs.tBasic = true
		case c >= m && c < m+d:
			fs.slacks = append(fs.slacks, c-m)
		case c >= first:
			fs.weights[colPoint[c-first]] = t.rhs[r]
		}
	}
	fs.cols = colPoint
	return fs, true
}

// initialPoints picks the k points that alone need the smallest t (the
// initial columns of the column generation), by bounded insertion.
func initialPoints(pts [][]int, x0, tau []float64, k int) []int {
	type cand struct {
		j int
		v float64
	}
	k = min(k, len(pts))
	best := make([]cand, 0, k)
	for j, p := range pts {
		need := math.Inf(-1)
		for i := range x0 {
			need = max(need, (float64(p[i])-x0[i])/tau[i])
		}
		if len(best) == k && need >= best[k-1].v {
			continue
		}
		pos := len(best)
		if pos < k {
			best = append(best, cand{})
		} else {
			pos = k - 1
		}
		for pos > 0 && best[pos-1].v > need {
			best[pos] = best[pos-1]
			pos--
		}
		best[pos] = cand{j, need}
	}
	out := make([]int, len(best))
	for i, c := range best {
		out[i] = c.j
	}
	return out
}
