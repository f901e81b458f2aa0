package polyhedron_test

import (
	"context"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/polyhedron"
)

// Walking up the compact faces of the Newton polyhedron of x² + y² + z²
// from a vertex, without enumerating facets.
func ExampleNewton_Covers() {
	n, _ := polyhedron.New(3, [][]int{{2, 0, 0}, {0, 2, 0}, {0, 0, 2}})
	ctx := context.Background()
	fmt.Println("points:", n.Points())
	f := &polyhedron.Face{Vertices: []int{2}} // the vertex (2,0,0); a normal is not needed
	for f != nil {
		covers, err := n.Covers(ctx, f)
		if err != nil {
			panic(err)
		}
		for _, c := range covers {
			fmt.Println("dim", c.Dim, "vertices", c.Vertices, "normal", c.Normal, ">=", c.RHS)
		}
		f = nil
		if len(covers) > 0 {
			f = covers[0]
		}
	}
	// Output:
	// points: [[0 0 2] [0 2 0] [2 0 0]]
	// dim 1 vertices [0 2] normal [2 3 2] >= 4
	// dim 1 vertices [1 2] normal [2 2 3] >= 4
	// dim 2 vertices [0 1 2] normal [1 1 1] >= 2
}

// The face holding a point of P in its relative interior, when it is
// compact. The point (3,3) dominates the vertex (2,2), so it lies on no
// compact face. Face vertices index Points(): (0,6), (2,2), (3,3), (4,0).
func ExampleNewton_CompactFaceAt() {
	n, _ := polyhedron.New(2, [][]int{{4, 0}, {2, 2}, {0, 6}, {3, 3}})
	ctx := context.Background()
	for _, x := range [][]*big.Rat{
		{big.NewRat(3, 1), big.NewRat(1, 1)},
		{big.NewRat(3, 1), big.NewRat(3, 1)},
		{big.NewRat(5, 1), big.NewRat(0, 1)},
	} {
		f, err := n.CompactFaceAt(ctx, x)
		if err != nil {
			panic(err)
		}
		if f == nil {
			fmt.Println(x, "no compact face")
			continue
		}
		fmt.Println(x, "vertices", f.Vertices, "dim", f.Dim, "normal", f.Normal, ">=", f.RHS)
	}
	// Output:
	// [3/1 1/1] vertices [1 3] dim 1 normal [1 1] >= 4
	// [3/1 3/1] no compact face
	// [5/1 0/1] no compact face
}

// The smallest first coordinate of a normal of the vertex (2,2) of the
// Newton polyhedron of x⁴ + x²y² + y⁶, normalised to y·(1,1) = 1: its normal
// cone is spanned by the edge normals (2,1) and (1,1).
func ExampleNewton_NormalConeMin() {
	n, _ := polyhedron.New(2, [][]int{{4, 0}, {2, 2}, {0, 6}})
	one := big.NewRat(1, 1)
	tau := []*big.Rat{one, one}
	f := &polyhedron.Face{Vertices: []int{1}}
	for i := 0; i < 2; i++ {
		c := []*big.Rat{new(big.Rat), new(big.Rat)}
		c[i].SetInt64(1)
		val, y, err := n.NormalConeMin(context.Background(), f, tau, c)
		if err != nil {
			panic(err)
		}
		fmt.Println("min y_", i+1, "=", val.RatString(), "at", y[0].RatString(), y[1].RatString())
	}
	// Output:
	// min y_ 1 = 1/2 at 1/2 1/2
	// min y_ 2 = 1/3 at 2/3 1/3
}

// Which points lie on a face, and checking that a hand-made normal exposes it.
func ExampleFace_Side() {
	n, _ := polyhedron.New(2, [][]int{{4, 0}, {2, 2}, {0, 6}})
	edge := &polyhedron.Face{Vertices: []int{1, 2}, Dim: 1, Normal: []*big.Int{big.NewInt(1), big.NewInt(1)}, RHS: big.NewInt(4)}
	ok, err := n.Exposes(context.Background(), edge)
	fmt.Println("exposes:", ok, err)
	for _, x := range [][]int{{3, 1}, {2, 3}, {1, 1}} {
		fmt.Println(x, edge.Side(x), edge.Contains(x))
	}
	// Output:
	// exposes: true <nil>
	// [3 1] 0 true
	// [2 3] 1 false
	// [1 1] -1 false
}

// The facets through a vertex.
func ExampleNewton_FacetsContaining() {
	n, _ := polyhedron.New(2, [][]int{{2, 0}, {1, 1}, {0, 2}})
	fs, _ := n.Facets(context.Background())
	idx, err := n.FacetsContaining(context.Background(), &polyhedron.Face{Vertices: []int{0}})
	if err != nil {
		panic(err)
	}
	for _, k := range idx {
		fmt.Println(fs[k].Normal, ">=", fs[k].RHS)
	}
	// Output:
	// [1 0] >= 0
	// [1 1] >= 2
}
