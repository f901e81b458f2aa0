package model

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"math/rand/v2"
	"testing"

	"github.com/lctkit/lctkit/rlct"
	"gonum.org/v1/gonum/mat"
)

// TestRankFactor checks the exact rank factorization C = B·A on random
// integer matrices C = X·Y of rank at most r: the product must give C back
// exactly and the rank must not exceed r (seeded, common practice).
func TestRankFactor(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := range 200 {
		n, m, r := 1+rng.IntN(5), 1+rng.IntN(5), rng.IntN(4)
		c := zeroMatrix(n, m)
		for range r {
			x := make([]int64, n)
			y := make([]int64, m)
			for i := range x {
				x[i] = rng.Int64N(7) - 3
			}
			for j := range y {
				y[j] = rng.Int64N(7) - 3
			}
			for i := range n {
				for j := range m {
					c[i][j].Add(c[i][j], big.NewRat(x[i]*y[j], 1))
				}
			}
		}
		b, a, rank := rankFactor(c, -1)
		if rank > r {
			t.Fatalf("trial %d: rank %d above %d", trial, rank, r)
		}
		for i := range n {
			for j := range m {
				s := new(big.Rat)
				for k := range rank {
					s.Add(s, new(big.Rat).Mul(b[i][k], a[k][j]))
				}
				if s.Cmp(c[i][j]) != 0 {
					t.Fatalf("trial %d: (BA)[%d][%d] = %s, C has %s", trial, i, j, s.RatString(), c[i][j].RatString())
				}
			}
		}
	}
}

// TestDeepLinear checks a deep linear network with a rank-one truth:
// K = ‖W3·W2·W1 − C*‖²/(2σ²) with σ² = 1/2, written out by hand, and the
// truth the constructor writes makes K vanish there.
func TestDeepLinear(t *testing.T) {
	truth := mat.NewDense(2, 2, []float64{1, 2, 2, 4})
	d, err := DeepLinear([]int{2, 2, 2, 2}, truth)
	if err != nil {
		t.Fatal(err)
	}
	m, err := Build(context.Background(), d, nil)
	if err != nil {
		t.Fatal(err)
	}
	var terms []string
	c := [][]int{{1, 2}, {2, 4}}
	for i := 1; i <= 2; i++ {
		for j := 1; j <= 2; j++ {
			s := ""
			for k := 1; k <= 2; k++ {
				for l := 1; l <= 2; l++ {
					s += fmt.Sprintf(" + W3_%d_%d*W2_%d_%d*W1_%d_%d", i, k, k, l, l, j)
				}
			}
			terms = append(terms, fmt.Sprintf("(%s - %d)^2", s, c[i-1][j-1]))
		}
	}
	src := ""
	for k, s := range terms {
		if k > 0 {
			src += " + "
		}
		src += s
	}
	if got, want := expanded(m), poly(t, m.Vars(), src); !got.Equal(want) {
		t.Errorf("K = %s\nwant %s", got, want)
	}
	for _, g := range m.Problem.Generators {
		if v := g.Eval(m.Problem.Points[0]); v.Sign() != 0 {
			t.Errorf("generator %s is %s at the truth", g, v.RatString())
		}
	}
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if !isBound(r.Status) {
		t.Errorf("status %s", r.Status)
	}
}

// TestConstructors builds every family, checks that its description prints
// and reads back to the same K, and bounds it.
func TestConstructors(t *testing.T) {
	design := Design{
		Points:  [][]*big.Rat{{big.NewRat(-1, 1)}, {big.NewRat(1, 2)}, {big.NewRat(2, 1)}},
		Weights: []*big.Rat{big.NewRat(1, 4), big.NewRat(1, 4), big.NewRat(1, 2)},
	}
	var ds []*Description
	add := func(d *Description, err error) {
		t.Helper()
		if err != nil {
			t.Fatal(err)
		}
		ds = append(ds, d)
	}
	add(ReducedRank(3, 2, 1, 0))
	add(ReducedRank(3, 3, 2, 1))
	add(DeepLinear([]int{2, 3, 2}, nil))
	add(TanhRegression(1, design, 4))
	add(TanhRegression(2, design, 4))
	add(PoissonMixture(big.NewRat(3, 1), big.NewRat(1, 2), 3))
	add(BinomialMixture(1, big.NewRat(1, 2), big.NewRat(1, 3)))
	add(BinomialMixture(4, big.NewRat(1, 3), big.NewRat(0, 1)))
	add(LatentClass(2, 3, big.NewRat(1, 2)))
	for _, d := range ds {
		t.Run(d.Name(), func(t *testing.T) {
			m, err := Build(context.Background(), d, nil)
			if err != nil {
				t.Fatal(err)
			}
			again := mustBuild(t, d.String())
			if got, want := expanded(again), expanded(m); !got.Equal(want) {
				t.Errorf("the printed description builds another K")
			}
			r, err := m.Bound(context.Background(), &rlct.Options{MaxFaces: 2000})
			if err != nil {
				t.Fatal(err)
			}
			if !isBound(r.Status) {
				t.Errorf("status %s: %q", r.Status, r.Reasons)
			}
		})
	}
}

func TestConstructorErrors(t *testing.T) {
	bad := Design{Points: [][]*big.Rat{{big.NewRat(1, 1)}}, Weights: []*big.Rat{big.NewRat(1, 2)}}
	_, e1 := ReducedRank(3, 2, 1, 2)
	_, e2 := ReducedRankAt(1, mat.NewDense(2, 2, []float64{1, 0, 0, 1}))
	_, e3 := DeepLinear([]int{2, 1, 2}, mat.NewDense(2, 2, []float64{1, 0, 0, 1}))
	_, e4 := TanhRegression(1, bad, 4)
	_, e5 := PoissonMixture(big.NewRat(0, 1), big.NewRat(1, 2), 3)
	_, e6 := BinomialMixture(2, big.NewRat(1, 1), big.NewRat(1, 2))
	_, e7 := LatentClass(1, 2, big.NewRat(1, 2))
	_, e8 := DeepLinear([]int{2, 2}, nil)
	for i, err := range []error{e1, e2, e3, e4, e5, e6, e7, e8} {
		if !errors.Is(err, ErrFamily) || !errors.Is(err, rlct.ErrInput) {
			t.Errorf("case %d: got %v, want ErrFamily (an input error)", i+1, err)
		}
	}
}
