package main

import (
	"testing"

	"github.com/lctkit/lctkit/internal/svg/svgtest"
)

// Helpers that read the SVG pictures the command writes.

// The reading of SVG documents is shared with rlct/picture's tests.
type svgElement = svgtest.Element

var (
	decodeSVG   = svgtest.Decode
	checkFinite = svgtest.CheckFinite
	byClass     = svgtest.ByClass
	texts       = svgtest.Texts
	attrFloat   = svgtest.AttrFloat
)

// parseSVG reads the picture as XML, failing the test if it is not
// well-formed.
func parseSVG(t *testing.T, data []byte) []*svgElement {
	t.Helper()
	els, err := decodeSVG(data)
	if err != nil {
		t.Fatalf("the SVG is not well-formed XML: %v", err)
	}
	return els
}
