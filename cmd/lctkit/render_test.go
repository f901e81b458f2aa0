package main

import (
	"image"
	"testing"

	shot "github.com/lctkit/lctkit/internal/screenshot"
)

// screenshot renders the page or picture at path with a headless Chromium
// in a window of the given size and returns the image. It skips the test in
// -short mode and when Chromium is not installed.
func screenshot(t *testing.T, path string, width, height int) image.Image {
	t.Helper()
	return shot.Take(t, path, width, height)
}
