// Package screenshot renders SVG pictures and HTML pages with a headless
// Chromium for the tests that check how lctkit's pictures look. It is a
// test helper: it takes a testing.TB and skips the test when it cannot
// render.
package screenshot

import (
	"context"
	"fmt"
	"image"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
	"time"
)

// Take renders the page or picture at path (an absolute file name) with a
// headless Chromium in a window of the given size and returns the image. It
// skips the test in -short mode and when Chromium is not installed
// (apt-get install chromium), and fails it when Chromium fails.
func Take(t testing.TB, path string, width, height int) image.Image {
	t.Helper()
	if testing.Short() {
		t.Skip("rendering with Chromium is slow; skipped in -short mode")
	}
	browser := ""
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			browser = p
			break
		}
	}
	if browser == "" {
		t.Skip("Chromium is not installed (apt-get install chromium); not rendering")
	}
	dir := t.TempDir()
	shot := filepath.Join(dir, "shot.png")
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser, "--headless", "--no-sandbox", "--disable-gpu",
		"--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run",
		"--hide-scrollbars", "--allow-file-access-from-files", "--user-data-dir="+filepath.Join(dir, "profile"),
		"--screenshot="+shot, fmt.Sprintf("--window-size=%d,%d", width, height), "file://"+path)
	if msg, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("%s: %v\n%s", browser, err, msg)
	}
	f, err := os.Open(shot)
	if err != nil {
		t.Fatalf("no screenshot: %v", err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	return img
}
