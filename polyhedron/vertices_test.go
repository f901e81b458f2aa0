package polyhedron

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/lctkit/lctkit/polyhedron/internal/instances"
)

// isVertexByLP decides whether p is a vertex of conv(pts) + orthant by the
// definition, with the general exact LP (phase 1 of Σ λ_j q_j + s = p,
// Σ λ_j = 1, λ, s >= 0 over the other points q_j): p is a vertex iff this
// is infeasible.
func isVertexByLP(p []int, pts [][]int) bool {
	d := len(p)
	var others [][]int
	for _, q := range pts {
		if !slices.Equal(q, p) {
			others = append(others, q)
		}
	}
	if len(others) == 0 {
		return true
	}
	n := len(others) + d
	lp := &LP{A: make([][]*big.Rat, d+1), B: make([]*big.Rat, d+1), C: make([]*big.Rat, n)}
	for j := range lp.C {
		lp.C[j] = new(big.Rat)
	}
	for i := 0; i <= d; i++ {
		lp.A[i] = make([]*big.Rat, n)
		for j, q := range others {
			if i < d {
				lp.A[i][j] = big.NewRat(int64(q[i]), 1)
			} else {
				lp.A[i][j] = big.NewRat(1, 1)
			}
		}
		for k := 0; k < d; k++ {
			lp.A[i][len(others)+k] = new(big.Rat)
			if k == i {
				lp.A[i][len(others)+k].SetInt64(1)
			}
		}
		if i < d {
			lp.B[i] = big.NewRat(int64(p[i]), 1)
		} else {
			lp.B[i] = big.NewRat(1, 1)
		}
	}
	return lp.Solve().Status == Infeasible
}

func checkVerticesByLP(t *testing.T, name string, d int, points [][]int) {
	t.Helper()
	n, err := New(d, points)
	if err != nil {
		t.Fatal(err)
	}
	var want [][]int
	for _, p := range mustMinimal(t, n) {
		if isVertexByLP(p, mustMinimal(t, n)) {
			want = append(want, p)
		}
	}
	if !slices.EqualFunc(mustVertices(t, n), want, slices.Equal) {
		t.Errorf("%s: vertices %v, the LP by definition gives %v", name, mustVertices(t, n), want)
	}
}

// TestVerticesByDefinition compares New's vertices with the definition
// (an exact LP per minimal point over all other minimal points) on random
// dense instances with small exponents (many points on common faces, so
// the float LPs meet t = 0 often) and on the stored instances with few
// minimal points.
func TestVerticesByDefinition(t *testing.T) {
	rng := rand.New(rand.NewPCG(71, 72))
	count := 300
	if testing.Short() {
		count = 60
	}
	for k := 0; k < count; k++ {
		d := 2 + rng.IntN(7)
		pts := randomPoints(rng, d, 3+rng.IntN(40), 1+rng.IntN(4))
		checkVerticesByLP(t, fmt.Sprintf("random %d (d=%d)", k, d), d, pts)
	}
	names := []string{"lowrank_2_2_2", "lowrank_3_3_2", "lowrank_3_3_3", "random_d6_n1000", "random_d10_n100"}
	if !testing.Short() { // about 4 s together
		names = append(names, "degree_d3_D20", "dense_d6_n1000", "dense_d10_n100", "lowrank_4_4_3")
	}
	for _, name := range names {
		in := loadInstance(t, name)
		checkVerticesByLP(t, name, in.D, in.Points)
	}
}

// TestVerticesDegree: the points of total degree exactly D span the simplex
// with vertices D·e_i, and every such point lies in it, so the vertices of
// P are exactly the D·e_i (hand-worked: p = Σ (p_i/D)·D·e_i).
func TestVerticesDegree(t *testing.T) {
	tests := []struct{ d, deg int }{{1, 5}, {2, 1}, {2, 7}, {3, 20}, {5, 8}, {8, 5}, {10, 10}}
	for _, tc := range tests {
		in := instances.Degree(tc.d, tc.deg)
		if testing.Short() && len(in.Points) > 10000 {
			continue
		}
		t.Run(in.Name, func(t *testing.T) {
			n, err := New(in.D, in.Points)
			if err != nil {
				t.Fatal(err)
			}
			if len(mustMinimal(t, n)) != len(in.Points) {
				t.Errorf("%d minimal points, want all %d", len(mustMinimal(t, n)), len(in.Points))
			}
			var want [][]int
			for i := tc.d - 1; i >= 0; i-- { // lexicographic order
				v := make([]int, tc.d)
				v[i] = tc.deg
				want = append(want, v)
			}
			if !slices.EqualFunc(mustVertices(t, n), want, slices.Equal) {
				t.Errorf("vertices %v, want %v", mustVertices(t, n), want)
			}
		})
	}
}

func TestSolveInt64(t *testing.T) {
	tests := []struct {
		name string
		cols [][]int64
		rhs  []int64
		want []*big.Rat // nil: inconsistent
	}{
		{"identity", [][]int64{{1, 0}, {0, 1}}, []int64{3, -4}, []*big.Rat{big.NewRat(3, 1), big.NewRat(-4, 1)}},
		// 2x + y = 3, x + 3y = 4: x = 1, y = 1.
		{"2x2", [][]int64{{2, 1}, {1, 3}}, []int64{3, 4}, []*big.Rat{big.NewRat(1, 1), big.NewRat(1, 1)}},
		// 2x = 1, 4x = 2: x = 1/2.
		{"overdetermined", [][]int64{{2, 4}}, []int64{1, 2}, []*big.Rat{big.NewRat(1, 2)}},
		{"inconsistent", [][]int64{{2, 4}}, []int64{1, 3}, nil},
		// x·(1,1) + y·(2,2) + z·(0,1) = (2,3): y is dependent (set to 0), x = 2, z = 1.
		{"dependent column", [][]int64{{1, 1}, {2, 2}, {0, 1}}, []int64{2, 3}, []*big.Rat{big.NewRat(2, 1), new(big.Rat), big.NewRat(1, 1)}},
		// needs a row swap: 0x + y = 1, x + y = 3.
		{"swap", [][]int64{{0, 1}, {1, 1}}, []int64{1, 3}, []*big.Rat{big.NewRat(2, 1), big.NewRat(1, 1)}},
		// 3x + 5y = 1, 7x + 2y = 1: det −29, x = 3/29, y = 4/29.
		{"fractions", [][]int64{{3, 7}, {5, 2}}, []int64{1, 1}, []*big.Rat{big.NewRat(3, 29), big.NewRat(4, 29)}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			num, den, st := solveInt64(tc.cols, tc.rhs)
			if tc.want == nil {
				if st != inconsistent {
					t.Errorf("status %v, want inconsistent", st)
				}
				return
			}
			if st != solved {
				t.Fatalf("status %v", st)
			}
			for j, w := range tc.want {
				if got := big.NewRat(num[j], den); got.Cmp(w) != 0 {
					t.Errorf("x_%d = %v, want %v", j, got, w)
				}
			}
		})
	}
	if _, _, st := solveInt64([][]int64{{1 << 62, 3}, {3, 1 << 62}}, []int64{1, 1}); st != overflowed {
		t.Errorf("huge entries: status %v, want overflowed", st)
	}
}

func TestVertexFilterContext(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	in := instances.Degree(6, 6)
	n, err := New(in.D, in.Points)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := n.Vertices(ctx); !errors.Is(err, context.Canceled) {
		t.Errorf("err = %v, want context.Canceled", err)
	}
}
