package main

import (
	"fmt"

	"github.com/lctkit/lctkit/internal/svg"
)

// This file holds what the plots the command draws itself (the estimate
// plot, the choice plot) share; the SVG document is written by
// internal/svg, and the pictures of Newton polyhedra by package
// rlct/picture.

// point is a position on the page in pixels, y pointing down.
type point = svg.Point

const (
	legendRow   = 22
	captionLine = 21
)

// legendItem is one entry of a legend: a swatch drawn by kind and a label
// given as markup.
type legendItem struct {
	kind  string
	label string
}

// captionText is one caption line.
type captionText struct {
	attrs, markup string
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}
