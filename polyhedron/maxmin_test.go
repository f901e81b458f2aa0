package polyhedron

import (
	"context"
	"errors"
	"math/big"
	"testing"
)

func TestNormalConeMaxMin(t *testing.T) {
	ctx := context.Background()
	one := []*big.Rat{big.NewRat(1, 1), big.NewRat(1, 1)}
	tests := []struct {
		name   string
		points [][]int // the support
		tau    []*big.Rat
		pts    [][]int
		want   *big.Rat
	}{
		// ab: the principal face is the vertex (1,1), whose normal cone
		// (y·τ = 1) is the whole segment y1 + y2 = 1, y >= 0. Hand-worked:
		// max of y1 + 5·y2 is 5 at y = (0,1); max of min(y1 + 5y2, 5y1 + y2)
		// is 3 at y = (1/2,1/2); the origin gives 0.
		{"vertex, one point", [][]int{{1, 1}}, one, [][]int{{1, 5}}, big.NewRat(5, 1)},
		{"vertex, two points", [][]int{{1, 1}}, one, [][]int{{1, 5}, {5, 1}}, big.NewRat(3, 1)},
		{"vertex, origin", [][]int{{1, 1}}, one, [][]int{{0, 0}}, new(big.Rat)},
		// x² + y²: the principal face is the edge, whose normal cone is
		// the single y = (1/2,1/2): min(3/2, 3/2) = 3/2.
		{"edge", [][]int{{2, 0}, {0, 2}}, one, [][]int{{3, 0}, {0, 3}}, big.NewRat(3, 2)},
		// x²: the ray shot along (1,1) hits (2,2) on the face (2,0) + e_2,
		// whose normal cone is y = (1,0) alone: y·(0,5) = 0, y·(4,1) = 4.
		{"face with a ray", [][]int{{2, 0}}, one, [][]int{{0, 5}, {4, 1}}, new(big.Rat)},
		{"face with a ray, other point", [][]int{{2, 0}}, one, [][]int{{4, 1}}, big.NewRat(4, 1)},
		// x⁴ + y² along τ = (1,2): the edge x/4 + y/2 = 1 meets (t, 2t)
		// at t = 4/5 (hand-worked); its normal cone is y = (1/4, 1/2)
		// scaled to y·τ = 1, that is (1/5, 2/5), and min over (5,0), (0,3)
		// is min(1, 6/5) = 1.
		{"weighted edge", [][]int{{4, 0}, {0, 2}}, []*big.Rat{big.NewRat(1, 1), big.NewRat(2, 1)}, [][]int{{5, 0}, {0, 3}}, big.NewRat(1, 1)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			n, err := New(2, tc.points)
			if err != nil {
				t.Fatal(err)
			}
			h, err := n.Distance(ctx, tc.tau)
			if err != nil {
				t.Fatal(err)
			}
			got, y, err := n.NormalConeMaxMin(ctx, h.Face, tc.tau, tc.pts)
			if err != nil {
				t.Fatal(err)
			}
			if got.Cmp(tc.want) != 0 {
				t.Errorf("value %v, want %v (y = %v)", got, tc.want, y)
			}
			// y must lie in the normalised cone and attain the value.
			yt := new(big.Rat)
			for i := range y {
				yt.Add(yt, new(big.Rat).Mul(y[i], tc.tau[i]))
			}
			if yt.Cmp(ratOne) != 0 {
				t.Errorf("y·τ = %v", yt)
			}
			minimum := (*big.Rat)(nil)
			for _, p := range tc.pts {
				v := new(big.Rat)
				for i := range y {
					v.Add(v, new(big.Rat).Mul(y[i], big.NewRat(int64(p[i]), 1)))
				}
				if minimum == nil || v.Cmp(minimum) < 0 {
					minimum = v
				}
			}
			if minimum.Cmp(got) != 0 {
				t.Errorf("min over pts of y·p = %v, value %v", minimum, got)
			}
			// Along τ the face value is t: y·(t·τ) = t for every y of the cone.
			yx := new(big.Rat)
			for i := range y {
				yx.Add(yx, new(big.Rat).Mul(y[i], h.Point[i]))
			}
			if yx.Cmp(h.T) != 0 {
				t.Errorf("y·(t·τ) = %v, t = %v: y is not in the cone", yx, h.T)
			}
		})
	}
	n, _ := New(2, [][]int{{1, 1}})
	h, _ := n.Distance(ctx, one)
	if _, _, err := n.NormalConeMaxMin(ctx, h.Face, one, nil); !errors.Is(err, ErrDimension) {
		t.Errorf("no points: err = %v, want ErrDimension", err)
	}
	if _, _, err := n.NormalConeMaxMin(ctx, h.Face, one, [][]int{{1}}); !errors.Is(err, ErrDimension) {
		t.Errorf("short point: err = %v, want ErrDimension", err)
	}
	if _, _, err := n.NormalConeMaxMin(ctx, &Face{Vertices: []int{0}, Rays: []int{0, 1}, Dim: 2}, one, [][]int{{1, 1}}); !errors.Is(err, ErrFace) {
		t.Errorf("P itself: err = %v, want ErrFace", err)
	}
}
