package polyhedron

import (
	"math/big"
	"slices"
)

// shot is the exact solution of the ray-shooting LP
//
//	minimise t  subject to  Σ_j λ_j v_j + s − t·τ = x0,  Σ_j λ_j = 1,  λ, s >= 0,  t free,
//
// over points v_j, i.e. t = min{t : x0 + t·τ ∈ conv(points) + R^d_{>=0}}.
// Its dual is: maximise b − a·x0 subject to a·v_j >= b for all j, a >= 0,
// a·τ = 1; at the optimum t = b − a·x0.
type shot struct {
	t       *big.Rat
	weights map[int]*big.Rat // point index -> λ_j > 0
	slack   []*big.Rat       // s
	a       []*big.Rat       // optimal dual normal, a >= 0, a·τ = 1
	b       *big.Rat         // b = min_j a·v_j
	tight   []int            // indices j with a·v_j == b, ascending
	pivots  int
	rounds  int
}

// shoot solves the ray-shooting LP by column generation: the restricted
// master problem over a few points is solved by the exact simplex tableau, its
// exact dual (a, b) is scaled to integers and every point is priced with
// exact integer arithmetic; the most violated points (a·v < b) enter, and the
// loop ends when no point is violated, which proves optimality over all
// points (LP duality). pts must be nonempty.
func shoot(pts [][]int, x0, tau []*big.Rat) *shot {
	d := len(x0)
	m := d + 1
	rhs := make([]*big.Rat, m)
	for i := 0; i < d; i++ {
		rhs[i] = x0[i]
	}
	rhs[d] = big.NewRat(1, 1)
	t := newTableau(rhs)
	zero := new(big.Rat)
	col := make([]*big.Rat, m)
	for i := 0; i < d; i++ { // slack columns: tableau columns m+i
		for k := range col {
			col[k] = zero
		}
		col[i] = ratOne
		t.addColumn(col, zero)
	}
	neg := make([]*big.Rat, m)
	pos := make([]*big.Rat, m)
	for i := 0; i < d; i++ {
		neg[i] = new(big.Rat).Neg(tau[i])
		pos[i] = tau[i]
	}
	neg[d], pos[d] = zero, zero
	tPlus := t.addColumn(neg, ratOne)             // t⁺
	tMinus := t.addColumn(pos, big.NewRat(-1, 1)) // t⁻
	firstPoint := tMinus + 1                      // tableau column of point colPoint[0]
	var colPoint []int                            // tableau column firstPoint+k holds pts[colPoint[k]]
	addPoint := func(j int) {
		for i := 0; i < d; i++ {
			col[i] = new(big.Rat).SetInt64(int64(pts[j][i]))
		}
		col[d] = ratOne
		t.addColumn(col, zero)
		colPoint = append(colPoint, j)
	}

	// Initial columns: the basic points of a float64 solution of the same LP
	// (a heuristic only; the answer is certified exactly below), or else the
	// points that alone need the smallest t.
	xf := make([]float64, d)
	tf := make([]float64, d)
	for i := 0; i < d; i++ {
		xf[i], _ = x0[i].Float64()
		tf[i], _ = tau[i].Float64()
	}
	var initial []int
	if fs, ok := shootFloat(pts, xf, tf); ok {
		for j := range fs.weights {
			initial = append(initial, j)
		}
		slices.Sort(initial)
	}
	if len(initial) == 0 {
		initial = initialPoints(pts, xf, tf, m)
	}
	for _, j := range initial {
		addPoint(j)
	}

	res := &shot{}
	var pr pricer
	for {
		res.rounds++
		if st := t.solve(); st != Optimal {
			panic("polyhedron: internal error: ray-shooting LP not optimal: " + st.String())
		}
		y := t.duals()
		a := make([]*big.Rat, d)
		for i := range a {
			a[i] = new(big.Rat).Neg(y[i])
		}
		b := y[d]
		viol := pr.price(pts, a, b, 2*m)
		if len(viol) == 0 {
			res.a, res.b = a, b
			res.tight = pr.tight
			break
		}
		for _, j := range viol {
			addPoint(j)
		}
	}
	res.pivots = t.pivots
	res.t = new(big.Rat)
	res.slack = make([]*big.Rat, d)
	for i := range res.slack {
		res.slack[i] = new(big.Rat)
	}
	res.weights = map[int]*big.Rat{}
	for r, c := range t.basis {
		v := t.rhs[r]
		switch {
		case c == tPlus:
			res.t.Add(res.t, v)
		case c == tMinus:
			res.t.Sub(res.t, v)
		case c >= m && c < m+d:
			res.slack[c-m].Set(v)
		case c >= firstPoint && v.Sign() != 0:
			res.weights[colPoint[c-firstPoint]] = new(big.Rat).Set(v)
		}
	}
	return res
}

// shoot solves the ray-shooting LP from x0 along tau over the vertices
// when they are known (fewer columns to price) and over all points
// otherwise; either way the indices in the result refer to Points().
func (n *Newton) shoot(x0, tau []*big.Rat) *shot {
	if !n.vertsDone.Load() {
		return shoot(n.points, x0, tau)
	}
	s := shoot(n.vertices, x0, tau)
	w := make(map[int]*big.Rat, len(s.weights))
	for k, v := range s.weights {
		w[n.vertexIdx[k]] = v
	}
	s.weights = w
	for i, k := range s.tight {
		s.tight[i] = n.vertexIdx[k]
	}
	return s
}

// pricer evaluates a·v − b over all points exactly.
type pricer struct {
	tight []int
}

// price returns up to limit indices of points with a·v < b (most violated
// first); when there are none it records the points with a·v == b in
// p.tight.
func (p *pricer) price(pts [][]int, a []*big.Rat, b *big.Rat, limit int) []int {
	ai, bi := scaleToInts(a, b)
	p.tight = p.tight[:0]
	type viol struct {
		j int
		v *big.Int
	}
	var vs []viol
	small := make([]int64, len(ai))
	fits := bi.IsInt64()
	for i, x := range ai {
		if !x.IsInt64() {
			fits = false
			break
		}
		small[i] = x.Int64()
	}
	var bs int64
	if fits {
		bs = bi.Int64()
	}
	var acc, prod big.Int
	for j, v := range pts {
		var c int
		var val *big.Int
		done := false
		if fits {
			if s, ok := checkedDot(small, v); ok {
				if s < bs {
					c = -1
					// difference may overflow only if values are huge; use big for the key.
					val = new(big.Int).Sub(big.NewInt(s), bi)
				} else if s == bs {
					c = 0
				} else {
					c = 1
				}
				done = true
			}
		}
		if !done {
			acc.SetInt64(0)
			for i, x := range v {
				if x != 0 {
					prod.Mul(ai[i], prod.SetInt64(int64(x)))
					acc.Add(&acc, &prod)
				}
			}
			c = acc.Cmp(bi)
			if c < 0 {
				val = new(big.Int).Sub(&acc, bi)
			}
		}
		switch c {
		case -1:
			vs = append(vs, viol{j, val})
		case 0:
			p.tight = append(p.tight, j)
		}
	}
	if len(vs) == 0 {
		return nil
	}
	slices.SortFunc(vs, func(x, y viol) int {
		if c := x.v.Cmp(y.v); c != 0 {
			return c
		}
		return x.j - y.j
	})
	out := make([]int, 0, min(limit, len(vs)))
	for _, v := range vs[:min(limit, len(vs))] {
		out = append(out, v.j)
	}
	return out
}

// scaleToInts multiplies (a, b) by the least common multiple of their
// denominators and returns the resulting integers.
func scaleToInts(a []*big.Rat, b *big.Rat) ([]*big.Int, *big.Int) {
	l := big.NewInt(1)
	var g big.Int
	upd := func(r *big.Rat) {
		den := r.Denom()
		g.GCD(nil, nil, l, den)
		l.Mul(l, new(big.Int).Quo(den, &g))
	}
	for _, x := range a {
		upd(x)
	}
	upd(b)
	ai := make([]*big.Int, len(a))
	for i, x := range a {
		ai[i] = new(big.Int).Mul(x.Num(), new(big.Int).Quo(l, x.Denom()))
	}
	bi := new(big.Int).Mul(b.Num(), new(big.Int).Quo(l, b.Denom()))
	return ai, bi
}
