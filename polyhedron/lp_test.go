package polyhedron

import (
	"math/big"
	"testing"
)

func ratMatrix(rows [][]int64) [][]*big.Rat {
	out := make([][]*big.Rat, len(rows))
	for i, r := range rows {
		out[i] = rats(r...)
	}
	return out
}

func fracs(xs ...[2]int64) []*big.Rat {
	out := make([]*big.Rat, len(xs))
	for i, x := range xs {
		out[i] = big.NewRat(x[0], x[1])
	}
	return out
}

// checkOptimal verifies an optimal LP solution with its own arithmetic:
// A x = b, x >= 0 (primal feasible), yA <= c (dual feasible) and
// c·x == b·y == Value (equal objectives prove optimality by weak duality).
func checkOptimal(t *testing.T, lp *LP, sol *LPSolution) {
	t.Helper()
	if sol.Status != Optimal {
		t.Fatalf("status %v, want optimal", sol.Status)
	}
	cx := new(big.Rat)
	for j, x := range sol.X {
		if x.Sign() < 0 {
			t.Errorf("x[%d] = %v < 0", j, x)
		}
		cx.Add(cx, new(big.Rat).Mul(lp.C[j], x))
	}
	for i, row := range lp.A {
		s := new(big.Rat)
		for j, a := range row {
			s.Add(s, new(big.Rat).Mul(a, sol.X[j]))
		}
		if s.Cmp(lp.B[i]) != 0 {
			t.Errorf("row %d: A x = %v, b = %v", i, s, lp.B[i])
		}
	}
	by := new(big.Rat)
	for i, y := range sol.Y {
		by.Add(by, new(big.Rat).Mul(lp.B[i], y))
	}
	for j := range lp.C {
		s := new(big.Rat)
		for i := range lp.A {
			s.Add(s, new(big.Rat).Mul(sol.Y[i], lp.A[i][j]))
		}
		if s.Cmp(lp.C[j]) > 0 {
			t.Errorf("column %d: yA = %v > c = %v", j, s, lp.C[j])
		}
	}
	if cx.Cmp(by) != 0 || cx.Cmp(sol.Value) != 0 {
		t.Errorf("c·x = %v, b·y = %v, Value = %v", cx, by, sol.Value)
	}
}

func TestLP(t *testing.T) {
	tests := []struct {
		name  string
		lp    *LP
		want  LPStatus
		value *big.Rat
	}{
		{
			// V. Chvátal, Linear Programming (1983), chapter 2, first example
			// (from memory): maximise 5x1 + 4x2 + 3x3 subject to 2x1 + 3x2 + x3 <= 5,
			// 4x1 + x2 + 2x3 <= 11, 3x1 + 4x2 + 2x3 <= 8. By hand: x = (2, 0, 1)
			// gives 13 and the dual y = (1, 0, 1) is feasible with value 5 + 8 = 13,
			// so 13 is the maximum; minimising the negative gives −13.
			name: "Chvatal chapter 2",
			lp: &LP{
				A: ratMatrix([][]int64{{2, 3, 1, 1, 0, 0}, {4, 1, 2, 0, 1, 0}, {3, 4, 2, 0, 0, 1}}),
				B: rats(5, 11, 8),
				C: rats(-5, -4, -3, 0, 0, 0),
			},
			want: Optimal, value: big.NewRat(-13, 1),
		},
		{
			// E. M. L. Beale (1955), "Cycling in the dual simplex algorithm",
			// the classic example on which Dantzig's rule cycles (from memory),
			// with slacks x1, x2, x3: minimise −3/4 x4 + 20 x5 − 1/2 x6 + 6 x7
			// subject to x1 + 1/4 x4 − 8 x5 − x6 + 9 x7 = 0,
			// x2 + 1/2 x4 − 12 x5 − 1/2 x6 + 3 x7 = 0, x3 + x6 = 1. By hand,
			// x4 = x6 = 1, x1 = 3/4 (others 0) is feasible with value −5/4;
			// that it is optimal is proved by the dual certificate that
			// checkOptimal verifies independently.
			name: "Beale cycling example",
			lp: &LP{
				A: [][]*big.Rat{
					fracs([2]int64{1, 1}, [2]int64{0, 1}, [2]int64{0, 1}, [2]int64{1, 4}, [2]int64{-8, 1}, [2]int64{-1, 1}, [2]int64{9, 1}),
					fracs([2]int64{0, 1}, [2]int64{1, 1}, [2]int64{0, 1}, [2]int64{1, 2}, [2]int64{-12, 1}, [2]int64{-1, 2}, [2]int64{3, 1}),
					fracs([2]int64{0, 1}, [2]int64{0, 1}, [2]int64{1, 1}, [2]int64{0, 1}, [2]int64{0, 1}, [2]int64{1, 1}, [2]int64{0, 1}),
				},
				B: rats(0, 0, 1),
				C: fracs([2]int64{0, 1}, [2]int64{0, 1}, [2]int64{0, 1}, [2]int64{-3, 4}, [2]int64{20, 1}, [2]int64{-1, 2}, [2]int64{6, 1}),
			},
			want: Optimal, value: big.NewRat(-5, 4),
		},
		{
			// x1 + x2 = −1 has no nonnegative solution.
			name: "infeasible",
			lp:   &LP{A: ratMatrix([][]int64{{1, 1}}), B: rats(-1), C: rats(1, 1)},
			want: Infeasible,
		},
		{
			// minimise −x1 subject to x1 − x2 = 0: x1 = x2 = s for any s >= 0.
			name: "unbounded",
			lp:   &LP{A: ratMatrix([][]int64{{1, -1}}), B: rats(0), C: rats(-1, 0)},
			want: Unbounded,
		},
		{
			// Two copies of the same row (redundant) and a negative right-hand
			// side: −x1 − x2 = −2 twice, minimise x1 + 2x2 → x = (2, 0), value 2.
			name: "redundant rows",
			lp:   &LP{A: ratMatrix([][]int64{{-1, -1}, {-1, -1}}), B: rats(-2, -2), C: rats(1, 2)},
			want: Optimal, value: big.NewRat(2, 1),
		},
		{
			// No rows: minimise x1 over x1 >= 0.
			name: "no constraints",
			lp:   &LP{A: [][]*big.Rat{}, B: []*big.Rat{}, C: rats(1)},
			want: Optimal, value: new(big.Rat),
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			sol := tc.lp.Solve()
			if sol.Status != tc.want {
				t.Fatalf("status %v, want %v", sol.Status, tc.want)
			}
			if tc.want == Optimal {
				checkOptimal(t, tc.lp, sol)
				if sol.Value.Cmp(tc.value) != 0 {
					t.Errorf("value %v, want %v", sol.Value, tc.value)
				}
			}
		})
	}
}
