package polyhedron_test

import (
	"context"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/polyhedron"
)

// The Newton polyhedron of x⁴ + y⁶ and its distance along the diagonal.
func ExampleNewton_Distance() {
	n, err := polyhedron.New(2, [][]int{{4, 0}, {0, 6}})
	if err != nil {
		panic(err)
	}
	h, err := n.Distance(context.Background(), []*big.Rat{big.NewRat(1, 1), big.NewRat(1, 1)})
	if err != nil {
		panic(err)
	}
	fmt.Println("t =", h.T.RatString())
	fmt.Println("point =", h.Point[0].RatString(), h.Point[1].RatString())
	fmt.Println("face vertices =", h.Face.Vertices, "dim =", h.Face.Dim, "codim =", h.Face.Codim(2))
	fmt.Println("face normal =", h.Face.Normal, ">=", h.Face.RHS)
	// Output:
	// t = 12/5
	// point = 12/5 12/5
	// face vertices = [0 1] dim = 1 codim = 1
	// face normal = [3 2] >= 12
}

// Facets of the Newton polyhedron of x² + xy + y²: the point (1,1) is not a
// vertex, and the coordinate half-planes are facets too.
func ExampleNewton_Facets() {
	ctx := context.Background()
	n, _ := polyhedron.New(2, [][]int{{2, 0}, {1, 1}, {0, 2}})
	fmt.Println("points:", n.Points()) // face and facet vertices index these
	vs, _ := n.Vertices(ctx)
	fmt.Println("vertices:", vs)
	fs, _ := n.Facets(ctx)
	for _, f := range fs {
		fmt.Println(f.Normal, ">=", f.RHS, "vertices", f.Vertices, "rays", f.Rays)
	}
	// Output:
	// points: [[0 2] [1 1] [2 0]]
	// vertices: [[0 2] [2 0]]
	// [0 1] >= 0 vertices [2] rays [0]
	// [1 0] >= 0 vertices [0] rays [1]
	// [1 1] >= 2 vertices [0 2] rays []
}

// The compact faces of a triangle-like polyhedron in three dimensions.
func ExampleNewton_CompactFaces() {
	n, _ := polyhedron.New(3, [][]int{{2, 0, 0}, {0, 2, 0}, {0, 0, 2}})
	lat, _ := n.CompactFaces(context.Background())
	for i, f := range lat.Faces {
		fmt.Println("dim", f.Dim, "vertices", f.Vertices, "contains", lat.Sub[i])
	}
	// Output:
	// dim 0 vertices [0] contains []
	// dim 0 vertices [1] contains []
	// dim 0 vertices [2] contains []
	// dim 1 vertices [0 1] contains [0 1]
	// dim 1 vertices [0 2] contains [0 2]
	// dim 1 vertices [1 2] contains [1 2]
	// dim 2 vertices [0 1 2] contains [3 4 5]
}

// The first example of Chvátal's Linear Programming (1983), chapter 2, in
// standard form: maximise 5x1 + 4x2 + 3x3 becomes minimise its negative, with
// slack variables x4, x5, x6.
func ExampleLP() {
	r := func(x int64) *big.Rat { return big.NewRat(x, 1) }
	lp := &polyhedron.LP{
		A: [][]*big.Rat{
			{r(2), r(3), r(1), r(1), r(0), r(0)},
			{r(4), r(1), r(2), r(0), r(1), r(0)},
			{r(3), r(4), r(2), r(0), r(0), r(1)},
		},
		B: []*big.Rat{r(5), r(11), r(8)},
		C: []*big.Rat{r(-5), r(-4), r(-3), r(0), r(0), r(0)},
	}
	sol := lp.Solve()
	fmt.Println(sol.Status, sol.Value.RatString())
	fmt.Println("x =", sol.X[0].RatString(), sol.X[1].RatString(), sol.X[2].RatString())
	// Output:
	// optimal -13
	// x = 2 0 1
}
