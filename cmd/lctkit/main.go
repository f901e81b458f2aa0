// Command lctkit computes Newton-polyhedron bounds on learning coefficients.
package main

import (
	"github.com/alecthomas/kong"
	_ "gonum.org/v1/gonum/optimize/convex/lp"
)

var cli struct{}

func main() {
	ctx := kong.Parse(&cli)
	_ = ctx
}
