package picture_test

import (
	"bytes"
	"context"
	"errors"
	"fmt"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/picture"
)

// Draw the Newton polygon of x⁴ + y⁶: describe the polyhedron with the
// library, then draw the description.
func ExampleSVG() {
	p, err := (&rlct.Spec{K: "x^4 + y^6"}).Problem()
	if err != nil {
		fmt.Println(err)
		return
	}
	ds, err := rlct.Describe(context.Background(), p, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	svg, err := picture.SVG(ds[0], "K = x^4 + y^6") // the origin, the only point

	if err != nil {
		fmt.Println(err)
		return
	}
	// The document starts with the svg element and its title; the
	// caption states the value and its status.
	lines := bytes.Split(svg, []byte("\n"))
	fmt.Println(string(lines[1]))
	fmt.Println(bytes.Contains(svg, []byte("λ = 5/12\u2003\u2003θ = 1\u2003\u2003exact")))
	// Output:
	// <title>Newton polyhedron of K = x^4 + y^6</title>
	// true
}

// A polyhedron in four variables cannot be drawn; the error says so.
func ExampleSVG_dimension() {
	p, _ := (&rlct.Spec{K: "a^2 + b^2 + c^2 + d^2"}).Problem()
	ds, _ := rlct.Describe(context.Background(), p, nil)
	_, err := picture.SVG(ds[0], "K")
	fmt.Println(errors.Is(err, picture.ErrDimension))
	fmt.Println(err)
	// Output:
	// true
	// picture: a picture needs 2 or 3 variables; K has 4 (a, b, c, d)
}
