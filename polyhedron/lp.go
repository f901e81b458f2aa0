package polyhedron

import (
	"fmt"
	"math/big"
)

// LP is a linear program with rational data in standard (equality) form:
//
//	minimise   C·x
//	subject to A x = B,  x >= 0,
//
// where A has m rows and n columns, B has length m and C has length n. Its
// dual is: maximise B·y subject to yA <= C (y free).
//
// Solve uses the two-phase primal simplex method on a dense tableau in exact
// rational arithmetic (math/big), as in V. Chvátal, Linear Programming
// (Freeman, 1983), chapters 2–3 (two phases with artificial variables) and
// the smallest-subscript rule of R. G. Bland (1977), "New finite pivoting rules
// for the simplex method", Math. Oper. Res. 2(2):103–107. The entering column
// is chosen by Dantzig's largest-coefficient rule after a pivot that improved
// the objective, and by Bland's rule after a degenerate pivot, so that every
// run of degenerate pivots is a run of Bland pivots and the method terminates.
// No floating point is used anywhere.
type LP struct {
	A [][]*big.Rat // constraint matrix, m×n
	B []*big.Rat   // right-hand side, length m
	C []*big.Rat   // objective, length n
}

// LPStatus is the outcome of solving an LP.
type LPStatus int

// Outcomes of LP.Solve.
const (
	Optimal    LPStatus = iota // an optimal basic solution was found
	Infeasible                 // A x = B, x >= 0 has no solution
	Unbounded                  // the objective is unbounded below
)

// String returns the lower-case name of the status.
func (s LPStatus) String() string {
	switch s {
	case Optimal:
		return "optimal"
	case Infeasible:
		return "infeasible"
	case Unbounded:
		return "unbounded"
	}
	return fmt.Sprintf("LPStatus(%d)", int(s))
}

// LPSolution is the result of LP.Solve. X, Y, Value and Basis are set only
// when Status is Optimal; then C·X == B·Y == Value exactly, X is feasible and
// Y is dual feasible (yA <= C).
type LPSolution struct {
	Status LPStatus
	X      []*big.Rat // primal optimum, length n
	Y      []*big.Rat // dual optimum, length m
	Value  *big.Rat   // optimal objective value
	Basis  []int      // basic column per row; -1 for a row found redundant
	Pivots int        // simplex pivots performed (both phases)
}

// Solve solves the LP exactly. It panics if the dimensions of A, B and C do
// not agree (a caller mistake); it never fails on valid data.
func (lp *LP) Solve() *LPSolution {
	m := len(lp.B)
	if len(lp.A) != m {
		panic(fmt.Sprintf("polyhedron: LP has %d rows in A but %d entries in B", len(lp.A), m))
	}
	n := len(lp.C)
	for i, row := range lp.A {
		if len(row) != n {
			panic(fmt.Sprintf("polyhedron: LP row %d has %d entries, want %d", i, len(row), n))
		}
	}
	t := newTableau(lp.B)
	for j := 0; j < n; j++ {
		col := make([]*big.Rat, m)
		for i := range col {
			col[i] = lp.A[i][j]
		}
		t.addColumn(col, lp.C[j])
	}
	st := t.solve()
	sol := &LPSolution{Status: st, Pivots: t.pivots}
	if st != Optimal {
		return sol
	}
	sol.X = make([]*big.Rat, n)
	for j := range sol.X {
		sol.X[j] = new(big.Rat)
	}
	sol.Basis = make([]int, m)
	for i, b := range t.basis {
		if b >= m {
			sol.X[b-m].Set(t.rhs[i])
			sol.Basis[i] = b - m
		} else {
			sol.Basis[i] = -1
		}
	}
	sol.Y = t.duals()
	sol.Value = new(big.Rat).Set(t.z)
	return sol
}

// tableau is a dense simplex tableau in exact arithmetic for the system
// A x = b, x >= 0. Columns 0..m-1 are the artificial variables of phase 1 (the
// tableau keeps them, so their columns hold the basis inverse); structural
// columns follow and may be added at any time (column generation). Row i was
// multiplied by sign[i] so that the initial right-hand side is >= 0.
type tableau struct {
	m      int
	rows   [][]*big.Rat // m rows over all columns
	rhs    []*big.Rat
	sign   []int
	cost   []*big.Rat // phase-2 cost per column (0 for artificials)
	red    []*big.Rat // reduced costs for the current phase
	z      *big.Rat   // current objective value
	basis  []int
	phase  int
	pivots int
	tmp    big.Rat
}

func newTableau(b []*big.Rat) *tableau {
	m := len(b)
	t := &tableau{m: m, rows: make([][]*big.Rat, m), rhs: make([]*big.Rat, m), sign: make([]int, m),
		basis: make([]int, m), z: new(big.Rat), phase: 1}
	for i := 0; i < m; i++ {
		t.sign[i] = 1
		t.rhs[i] = new(big.Rat).Set(b[i])
		if b[i].Sign() < 0 {
			t.sign[i] = -1
			t.rhs[i].Neg(t.rhs[i])
		}
		t.rows[i] = make([]*big.Rat, m)
		for k := 0; k < m; k++ {
			t.rows[i][k] = new(big.Rat)
		}
		t.rows[i][i].SetInt64(1)
		t.basis[i] = i
		t.z.Add(t.z, t.rhs[i])
	}
	for k := 0; k < m; k++ {
		t.cost = append(t.cost, new(big.Rat))
		t.red = append(t.red, new(big.Rat)) // artificial columns are basic: reduced cost 0
	}
	return t
}

// addColumn appends a structural column with original coefficients a and
// phase-2 cost c, expressed in the current basis. It returns the column index.
func (t *tableau) addColumn(a []*big.Rat, c *big.Rat) int {
	m := t.m
	// Column in the current basis: B^{-1} (sign·a) = Σ_k sign_k a_k · (artificial column k).
	var prod big.Rat
	for i := 0; i < m; i++ {
		v := new(big.Rat)
		for k := 0; k < m; k++ {
			if a[k].Sign() == 0 || t.rows[i][k].Sign() == 0 {
				continue
			}
			prod.Mul(t.rows[i][k], a[k])
			if t.sign[k] < 0 {
				v.Sub(v, &prod)
			} else {
				v.Add(v, &prod)
			}
		}
		t.rows[i] = append(t.rows[i], v)
	}
	j := len(t.cost)
	t.cost = append(t.cost, new(big.Rat).Set(c))
	t.red = append(t.red, t.reducedCost(j))
	return j
}

// reducedCost computes the reduced cost of column j for the current phase
// from the tableau: c_j − Σ_i c_{basis[i]} T[i][j].
func (t *tableau) reducedCost(j int) *big.Rat {
	r := new(big.Rat).Set(t.phaseCost(j))
	var prod big.Rat
	for i := 0; i < t.m; i++ {
		cb := t.phaseCost(t.basis[i])
		if cb.Sign() == 0 || t.rows[i][j].Sign() == 0 {
			continue
		}
		prod.Mul(cb, t.rows[i][j])
		r.Sub(r, &prod)
	}
	return r
}

var ratOne = big.NewRat(1, 1)
var ratZero = new(big.Rat)

func (t *tableau) phaseCost(j int) *big.Rat {
	if t.phase == 1 {
		if j < t.m {
			return ratOne
		}
		return ratZero
	}
	return t.cost[j]
}

// setPhase2 recomputes reduced costs and the objective for the phase-2 costs.
func (t *tableau) setPhase2() {
	t.phase = 2
	for j := range t.red {
		t.red[j] = t.reducedCost(j)
	}
	t.z.SetInt64(0)
	var prod big.Rat
	for i := 0; i < t.m; i++ {
		prod.Mul(t.cost[t.basis[i]], t.rhs[i])
		t.z.Add(t.z, &prod)
	}
}

// pivot makes column q basic in row r.
func (t *tableau) pivot(r, q int) {
	t.pivots++
	row := t.rows[r]
	p := new(big.Rat).Set(row[q])
	var nz []int
	for j := range row {
		if row[j].Sign() != 0 {
			row[j].Quo(row[j], p)
			nz = append(nz, j)
		}
	}
	t.rhs[r].Quo(t.rhs[r], p)
	tmp := &t.tmp
	for i := 0; i < t.m; i++ {
		if i == r || t.rows[i][q].Sign() == 0 {
			continue
		}
		f := new(big.Rat).Set(t.rows[i][q])
		ri := t.rows[i]
		for _, j := range nz {
			tmp.Mul(f, row[j])
			ri[j].Sub(ri[j], tmp)
		}
		tmp.Mul(f, t.rhs[r])
		t.rhs[i].Sub(t.rhs[i], tmp)
	}
	if f := new(big.Rat).Set(t.red[q]); f.Sign() != 0 {
		for _, j := range nz {
			tmp.Mul(f, row[j])
			t.red[j].Sub(t.red[j], tmp)
		}
		tmp.Mul(f, t.rhs[r])
		t.z.Add(t.z, tmp)
	}
	t.basis[r] = q
}

// iterate runs simplex pivots for the current phase until optimal or
// unbounded. In phase 2 artificial columns may not enter.
func (t *tableau) iterate() LPStatus {
	bland := false
	first := 0
	if t.phase == 2 {
		first = t.m
	}
	var a, b big.Rat
	for {
		q := -1
		for j := first; j < len(t.red); j++ {
			if t.red[j].Sign() >= 0 {
				continue
			}
			if q < 0 {
				q = j
				if bland {
					break
				}
			} else if t.red[j].Cmp(t.red[q]) < 0 {
				q = j
			}
		}
		if q < 0 {
			return Optimal
		}
		r := -1
		for i := 0; i < t.m; i++ {
			if t.rows[i][q].Sign() <= 0 {
				continue
			}
			if r < 0 {
				r = i
				continue
			}
			// compare rhs_i/T_iq with rhs_r/T_rq
			a.Mul(t.rhs[i], t.rows[r][q])
			b.Mul(t.rhs[r], t.rows[i][q])
			if c := a.Cmp(&b); c < 0 || (c == 0 && t.basis[i] < t.basis[r]) {
				r = i
			}
		}
		if r < 0 {
			return Unbounded
		}
		bland = t.rhs[r].Sign() == 0
		t.pivot(r, q)
	}
}

// solve runs both phases from the artificial basis (phase 1 is skipped when
// it is already done, e.g. after columns were added to a solved tableau).
func (t *tableau) solve() LPStatus {
	if t.phase == 1 {
		t.iterate()
		if t.z.Sign() != 0 {
			return Infeasible
		}
		// Drive artificial variables out of the basis where possible.
		for i := 0; i < t.m; i++ {
			if t.basis[i] >= t.m {
				continue
			}
			for j := t.m; j < len(t.cost); j++ {
				if t.rows[i][j].Sign() != 0 {
					t.pivot(i, j)
					break
				}
			}
		}
		t.setPhase2()
	}
	return t.iterate()
}

// duals returns y = c_B B^{-1} for the original (unsigned) rows.
func (t *tableau) duals() []*big.Rat {
	y := make([]*big.Rat, t.m)
	for k := 0; k < t.m; k++ {
		// reduced cost of artificial k (cost 0) is −y'_k.
		y[k] = new(big.Rat).Neg(t.red[k])
		if t.sign[k] < 0 {
			y[k].Neg(y[k])
		}
	}
	return y
}
