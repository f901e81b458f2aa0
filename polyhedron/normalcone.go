package polyhedron

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"slices"
)

// NormalConeMin minimises c·y over the normalised normal cone of the face
// f: over the y in R^d with y >= 0, y·τ = 1, y·v >= y·x for every vertex v
// of P and every point x of f, and y_i = 0 for every ray i of f; these are
// the linear functionals, scaled to y·τ = 1, whose minimum over P is
// attained on all of f. It returns the exact optimum and an optimal y. τ
// must be d positive rationals (else an error wrapping ErrDirection); c must
// have d non-nil entries (else ErrDimension). It returns an error wrapping
// ErrFace when f is not a face of P or is P itself (whose normal cone is
// {0}), and one wrapping ctx.Err() when ctx (which may be nil) is done; ctx
// is checked between LPs.
//
// Method: with x_f the centroid of f's k vertices (a point of the relative
// interior of their convex hull), the cone is {y >= 0 : y_i = 0 for i in
// f.Rays, y·(k·v − Σ_{w in f} w) >= 0 for every vertex v}: the constraints
// of f's own vertices sum to zero, so they hold with equality and y is
// constant on f. The LP is solved through its dual,
//
//	maximise z  subject to  z·τ + Σ_v λ_v (k·v − Σ_{w in f} w) + s = c,  λ, s >= 0,
//
// restricted to the coordinates not in f.Rays, by column generation (the
// constraint generation of the primal): each round prices every vertex and
// adds the most violated columns, until none is violated. It runs first in
// float64; its optimal basis is then checked exactly: the basis is solved in
// integers (fraction-free, solveInt64) for the dual point (z, λ, s) >= 0 and
// for y, y is checked to be feasible for every vertex with exact integer
// pricing, and c·y must equal z, which proves optimality (weak LP duality).
// Should any of this fail, the same column generation runs on the exact
// simplex tableau (see LP), starting from the float basis' columns, and its
// optimal duals are y. Cost: one float LP with d − |f.Rays| rows and O(V·d)
// work per pricing round for N input points (any point that is no vertex
// only costs time), plus a few exact integer solves of
// that size; a few exact LPs in the rare fallback.
func (n *Newton) NormalConeMin(ctx context.Context, f *Face, tau, c []*big.Rat) (*big.Rat, []*big.Rat, error) {
	d := n.d
	if len(tau) != d {
		return nil, nil, fmt.Errorf("%w: got %d entries, want %d", ErrDirection, len(tau), d)
	}
	for i, x := range tau {
		if x == nil || x.Sign() <= 0 {
			return nil, nil, fmt.Errorf("%w: entry %d is %v", ErrDirection, i, x)
		}
	}
	if len(c) != d {
		return nil, nil, fmt.Errorf("%w: objective has %d entries, want %d", ErrDimension, len(c), d)
	}
	for i, x := range c {
		if x == nil {
			return nil, nil, fmt.Errorf("%w: objective entry %d is nil", ErrDimension, i)
		}
	}
	if _, _, err := n.checkFace(ctx, f); err != nil {
		return nil, nil, err
	}
	var cols []int // coordinates not in f.Rays: the rows of the dual
	for i := 0; i < d; i++ {
		if !slices.Contains(f.Rays, i) {
			cols = append(cols, i)
		}
	}
	m := len(cols)
	if m == 0 {
		return nil, nil, fmt.Errorf("%w: the face is P itself, whose normal cone is {0}", ErrFace)
	}
	k := int64(len(f.Vertices))
	sum := make([]*big.Int, d) // Σ_{w in f} w
	for i := range sum {
		sum[i] = new(big.Int)
		for _, j := range f.Vertices {
			sum[i].Add(sum[i], big.NewInt(int64(n.points[j][i])))
		}
	}
	// The float64 run of the column generation proposes an optimal basis;
	// when the exact check fails, its vertex columns start the exact loop,
	// which then usually needs a single round.
	nf := &ncFloat{verts: n.points, own: f.Vertices, cols: cols, k: k, sum: sum, tau: tau, c: c}
	basis, floatOK := nf.solve()
	if floatOK {
		if val, y, ok := nf.verify(basis, d); ok {
			return val, y, nil
		}
	}
	if err := contextErr(ctx); err != nil {
		return nil, nil, err
	}
	rhs := make([]*big.Rat, m)
	for r, i := range cols {
		rhs[r] = c[i]
	}
	t := newTableau(rhs)
	zero := new(big.Rat)
	col := make([]*big.Rat, m)
	for r := 0; r < m; r++ { // slacks s
		for q := range col {
			col[q] = zero
		}
		col[r] = ratOne
		t.addColumn(col, zero)
	}
	for r, i := range cols {
		col[r] = tau[i]
	}
	t.addColumn(col, big.NewRat(-1, 1)) // z⁺
	for r, i := range cols {
		col[r] = new(big.Rat).Neg(tau[i])
	}
	t.addColumn(col, ratOne) // z⁻
	added := make([]bool, len(n.points))
	addVertex := func(j int) {
		added[j] = true
		for r, i := range cols {
			g := new(big.Int).Mul(big.NewInt(k), big.NewInt(int64(n.points[j][i])))
			col[r] = new(big.Rat).SetInt(g.Sub(g, sum[i]))
		}
		t.addColumn(col, zero)
	}
	for _, j := range f.Vertices {
		addVertex(j)
	}
	if floatOK {
		for _, b := range basis {
			if b >= 0 && !added[b] {
				addVertex(b)
			}
		}
	}
	var pr pricer
	y := make([]*big.Rat, d)
	for {
		if err := contextErr(ctx); err != nil {
			return nil, nil, err
		}
		if st := t.solve(); st != Optimal {
			// The primal is infeasible only if the normal cone is {0},
			// which checkFace rules out for a face other than P.
			return nil, nil, fmt.Errorf("%w: normal cone LP %v", ErrFace, st)
		}
		pi := t.duals()
		for i := range y {
			y[i] = new(big.Rat)
		}
		for r, i := range cols {
			y[i].Neg(pi[r])
		}
		// y·v >= y·S/k for every vertex v.
		b := new(big.Rat)
		for i := range y {
			b.Add(b, new(big.Rat).Mul(y[i], new(big.Rat).SetInt(sum[i])))
		}
		b.Quo(b, big.NewRat(k, 1))
		viol := pr.price(n.points, y, b, 2*m)
		if len(viol) == 0 {
			break
		}
		for _, j := range viol {
			if added[j] { // its reduced cost is >= 0 at an optimum
				panic("polyhedron: internal error: normal cone LP prices an added column")
			}
			addVertex(j)
		}
	}
	val := new(big.Rat)
	for i := range y {
		val.Add(val, new(big.Rat).Mul(c[i], y[i]))
	}
	return val, y, nil
}

// ncFloat is the float64 column generation of NormalConeMin and the exact
// check of its basis.
type ncFloat struct {
	verts  [][]int
	own    []int // f's vertices
	cols   []int // coordinates not in f.Rays (the rows)
	k      int64
	sum    []*big.Int // Σ_{w in f} w
	tau, c []*big.Rat
}

// Basis entries of ncFloat: a vertex index (>= 0) or one of these.
const (
	ncZPlus  = -1
	ncZMinus = -2
	ncSlack0 = -3 // slack of row r is ncSlack0 − r
)

// solve runs the float column generation and returns the optimal basis (one
// entry per row), or false if the float computation fails or an artificial
// column stays basic.
func (nf *ncFloat) solve() ([]int, bool) {
	m := len(nf.cols)
	rhs := make([]float64, m)
	for r, i := range nf.cols {
		rhs[r], _ = nf.c[i].Float64()
	}
	ft := newFTableau(rhs)
	col := make([]float64, m)
	for r := 0; r < m; r++ {
		clear(col)
		col[r] = 1
		ft.addColumn(col, 0)
	}
	for r, i := range nf.cols {
		col[r], _ = nf.tau[i].Float64()
	}
	ft.addColumn(col, -1)
	for r := range col {
		col[r] = -col[r]
	}
	ft.addColumn(col, 1)
	first := 2*m + 2 // tableau column of colVertex[0]
	var colVertex []int
	in := make([]bool, len(nf.verts))
	sf := make([]float64, len(nf.sum))
	for i := range nf.sum {
		sf[i], _ = new(big.Float).SetInt(nf.sum[i]).Float64()
	}
	kf := float64(nf.k)
	gcol := func(j int) []float64 {
		for r, i := range nf.cols {
			col[r] = kf*float64(nf.verts[j][i]) - sf[i]
		}
		return col
	}
	add := func(j int) {
		ft.addColumn(gcol(j), 0)
		colVertex = append(colVertex, j)
		in[j] = true
	}
	for _, j := range nf.own {
		add(j)
	}
	y := make([]float64, m)
	type cand struct {
		j int
		v float64
	}
	var worst []cand
	for round := 0; round < 200; round++ {
		if !ft.solve() {
			return nil, false
		}
		pi := ft.duals()
		scale := 1.0
		for r := range y {
			y[r] = -pi[r]
			scale = max(scale, math.Abs(y[r]))
		}
		if math.IsNaN(scale) || math.IsInf(scale, 0) {
			return nil, false
		}
		worst = worst[:0]
		for j := range nf.verts {
			if in[j] {
				continue
			}
			v, norm := 0.0, 0.0
			for r, x := range gcol(j) {
				v += y[r] * x
				norm += math.Abs(x)
			}
			if v < -1e-9*scale*max(norm, 1) {
				worst = append(worst, cand{j, v})
			}
		}
		if len(worst) == 0 {
			basis := make([]int, m)
			for r, b := range ft.basis {
				switch {
				case b < m:
					return nil, false // artificial
				case b < 2*m:
					basis[r] = ncSlack0 - (b - m)
				case b == 2*m:
					basis[r] = ncZPlus
				case b == 2*m+1:
					basis[r] = ncZMinus
				default:
					basis[r] = colVertex[b-first]
				}
			}
			return basis, true
		}
		slices.SortFunc(worst, func(a, b cand) int {
			switch {
			case a.v < b.v:
				return -1
			case a.v > b.v:
				return 1
			}
			return a.j - b.j
		})
		for _, w := range worst[:min(len(worst), 2*m)] {
			add(w.j)
		}
	}
	return nil, false
}

// verify checks a proposed basis exactly (see NormalConeMin) and returns the
// optimum and y (length d, zero on f's rays), or false when the check fails
// or int64 does not suffice.
func (nf *ncFloat) verify(basis []int, d int) (*big.Rat, []*big.Rat, bool) {
	m := len(nf.cols)
	// Integer data: τ' = Lτ·τ and c' = Lc·c on the rows.
	tauR := make([]*big.Rat, m)
	cR := make([]*big.Rat, m)
	for r, i := range nf.cols {
		tauR[r], cR[r] = nf.tau[i], nf.c[i]
	}
	tauI, lt, ok1 := ratsToInt64(tauR)
	cI, lc, ok2 := ratsToInt64(cR)
	if !ok1 || !ok2 {
		return nil, nil, false
	}
	// Basis columns.
	bcols := make([][]int64, m)
	for q, b := range basis {
		v := make([]int64, m)
		switch {
		case b == ncZPlus:
			copy(v, tauI)
		case b == ncZMinus:
			for r := range v {
				v[r] = -tauI[r]
			}
		case b <= ncSlack0:
			v[ncSlack0-b] = 1
		default:
			for r, i := range nf.cols {
				x, ok := mul64(nf.k, int64(nf.verts[b][i]))
				if !ok || !nf.sum[i].IsInt64() {
					return nil, nil, false
				}
				s := nf.sum[i].Int64()
				if (s > 0 && x-s > x) || (s < 0 && x-s < x) {
					return nil, nil, false
				}
				v[r] = x - s
			}
		}
		bcols[q] = v
	}
	// Basic slacks s_r are eliminated: their rows are dropped from the
	// system for the other basic columns (then s_r = c'_r − Σ B[r][q] x_q),
	// and they force π_r = 0 in Bᵀπ = cost'.
	slackRow := make([]bool, m)
	var nonSlack []int // positions q in the basis that are not slacks
	for q, b := range basis {
		if b <= ncSlack0 {
			slackRow[ncSlack0-b] = true
		} else {
			nonSlack = append(nonSlack, q)
		}
	}
	var rows []int // rows without a basic slack
	for r := 0; r < m; r++ {
		if !slackRow[r] {
			rows = append(rows, r)
		}
	}
	if len(rows) != len(nonSlack) {
		return nil, nil, false
	}
	red := make([][]int64, len(nonSlack)) // reduced columns (rows restricted)
	for a, q := range nonSlack {
		red[a] = make([]int64, len(rows))
		for t, r := range rows {
			red[a][t] = bcols[q][r]
		}
	}
	// Dual point: B x = c', x >= 0; z = (x_{z+} − x_{z−})·Lτ/Lc.
	cRed := make([]int64, len(rows))
	for t, r := range rows {
		cRed[t] = cI[r]
	}
	xn, xd, st := solveInt64(red, cRed)
	if st != solved {
		return nil, nil, false
	}
	zNum := new(big.Int)
	for a, q := range nonSlack {
		if (xn[a] < 0) != (xd < 0) && xn[a] != 0 {
			return nil, nil, false
		}
		switch basis[q] {
		case ncZPlus:
			zNum.Add(zNum, big.NewInt(xn[a]))
		case ncZMinus:
			zNum.Sub(zNum, big.NewInt(xn[a]))
		}
	}
	// Slack values, scaled by xd: c'_r·xd − Σ B[r][q]·xn_q must have the
	// sign of xd (or be 0).
	var acc, term big.Int
	bxd := big.NewInt(xd)
	for r := 0; r < m; r++ {
		if !slackRow[r] {
			continue
		}
		acc.Mul(big.NewInt(cI[r]), bxd)
		for a, q := range nonSlack {
			if bcols[q][r] != 0 && xn[a] != 0 {
				acc.Sub(&acc, term.Mul(big.NewInt(bcols[q][r]), big.NewInt(xn[a])))
			}
		}
		if acc.Sign() != 0 && acc.Sign() != bxd.Sign() {
			return nil, nil, false
		}
	}
	z := new(big.Rat).SetFrac(zNum.Mul(zNum, big.NewInt(lt)), new(big.Int).Mul(bxd, big.NewInt(lc)))
	// y from Bᵀπ = cost', y = −π: π_r = 0 on slack rows; the other
	// unknowns satisfy red[a]·π = cost'_a for each non-slack column a.
	tcols := make([][]int64, len(rows))
	for t := range rows {
		tcols[t] = make([]int64, len(nonSlack))
		for a := range nonSlack {
			tcols[t][a] = red[a][t]
		}
	}
	cost := make([]int64, len(nonSlack))
	for a, q := range nonSlack {
		switch basis[q] {
		case ncZPlus:
			cost[a] = -lt
		case ncZMinus:
			cost[a] = lt
		}
	}
	pr, pd, st := solveInt64(tcols, cost)
	if st != solved {
		return nil, nil, false
	}
	// y_r = −π_r = yn_r/yd with yd > 0.
	yn := make([]int64, m)
	yd := pd
	for t, r := range rows {
		yn[r] = -pr[t]
	}
	if yd < 0 {
		yd = -yd
		for r := range yn {
			yn[r] = -yn[r]
		}
	}
	// Feasibility: y >= 0, y·τ = 1 (yn·τ' = yd·Lτ), y·g_v >= 0 for all v.
	for _, x := range yn {
		if x < 0 {
			return nil, nil, false
		}
	}
	if yt, ok := dot64(yn, tauI); !ok {
		return nil, nil, false
	} else if pr, ok := mul64(yd, lt); !ok || yt != pr {
		return nil, nil, false
	}
	full := make([]*big.Int, d)
	for i := range full {
		full[i] = new(big.Int)
	}
	for r, i := range nf.cols {
		full[i].SetInt64(yn[r])
	}
	dt := newDotter(full)
	ys := new(big.Int) // y·S, scaled by yd
	var t big.Int
	for i := range full {
		ys.Add(ys, t.Mul(full[i], nf.sum[i]))
	}
	var kv big.Int
	kb := big.NewInt(nf.k)
	for _, v := range nf.verts {
		if kv.Mul(kb, dt.dot(v)).Cmp(ys) < 0 {
			return nil, nil, false
		}
	}
	y := make([]*big.Rat, d)
	val := new(big.Rat)
	den := big.NewInt(yd)
	for i := range y {
		y[i] = new(big.Rat).SetFrac(full[i], den)
		val.Add(val, new(big.Rat).Mul(nf.c[i], y[i]))
	}
	if val.Cmp(z) != 0 {
		return nil, nil, false
	}
	return val, y, true
}

// ratsToInt64 returns L·r for the least common multiple L of the
// denominators, as int64 values, and L; false if they do not fit.
func ratsToInt64(rs []*big.Rat) ([]int64, int64, bool) {
	l := big.NewInt(1)
	var g big.Int
	for _, r := range rs {
		g.GCD(nil, nil, l, r.Denom())
		l.Mul(l, new(big.Int).Quo(r.Denom(), &g))
	}
	if !l.IsInt64() {
		return nil, 0, false
	}
	out := make([]int64, len(rs))
	var v big.Int
	for i, r := range rs {
		v.Mul(r.Num(), v.Quo(l, r.Denom()))
		if !v.IsInt64() {
			return nil, 0, false
		}
		out[i] = v.Int64()
	}
	return out, l.Int64(), true
}
