package picture

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"testing"

	"github.com/lctkit/lctkit/internal/screenshot"
	"github.com/lctkit/lctkit/rlct"
)

// TestRenders renders a 2-D and a 3-D picture side by side with one run of
// a headless Chromium and checks that each half of the screenshot shows the
// shaded polyhedron and dark text and lines. It skips when Chromium is not
// installed, and in -short mode.
func TestRenders(t *testing.T) {
	specs := []rlct.Spec{{K: "x^4 + y^6"}, {K: "x^2*y^2 + z^2"}}
	dir := t.TempDir()
	page := `<!DOCTYPE html><html><body style="margin:0;display:flex;align-items:flex-start">`
	height := 0.0
	for i, spec := range specs {
		svg, err := SVG(describe(t, spec), "K = "+spec.K)
		if err != nil {
			t.Fatal(err)
		}
		src := filepath.Join(dir, fmt.Sprintf("p%d.svg", i))
		if err := os.WriteFile(src, svg, 0o644); err != nil {
			t.Fatal(err)
		}
		els, err := decodeSVG(svg)
		if err != nil {
			t.Fatal(err)
		}
		if w := attrFloat(t, els[0], "width"); w != pageWidth {
			t.Fatalf("%s is %g px wide", spec.K, w)
		}
		height = math.Max(height, attrFloat(t, els[0], "height"))
		page += fmt.Sprintf(`<img src="file://%s" width="%d" style="display:block">`, src, pageWidth)
	}
	page += `</body></html>`
	html := filepath.Join(dir, "page.html")
	if err := os.WriteFile(html, []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}
	img := screenshot.Take(t, html, len(specs)*pageWidth, int(math.Ceil(height)))
	b := img.Bounds()
	if b.Dx() < len(specs)*pageWidth || b.Dy() < 600 {
		t.Fatalf("screenshot is %dx%d", b.Dx(), b.Dy())
	}
	for i, spec := range specs {
		var blue, dark, total int
		for y := b.Min.Y; y < b.Max.Y; y++ {
			for x := b.Min.X + i*pageWidth; x < b.Min.X+(i+1)*pageWidth; x++ {
				r, g, bl, _ := img.At(x, y).RGBA()
				r, g, bl = r>>8, g>>8, bl>>8
				total++
				// The sky-blue fills over white: blue well above red.
				if bl > 200 && bl > r+25 && g > r {
					blue++
				}
				if r < 80 && g < 80 && bl < 80 {
					dark++
				}
			}
		}
		if frac := float64(blue) / float64(total); frac < 0.05 {
			t.Errorf("%s: only %.1f%% of the screenshot is the polyhedron's blue", spec.K, 100*frac)
		}
		if frac := float64(dark) / float64(total); frac < 0.003 {
			t.Errorf("%s: only %.2f%% of the screenshot is dark (text, axes)", spec.K, 100*frac)
		}
		t.Logf("%s: %.1f%% blue, %.2f%% dark", spec.K, 100*float64(blue)/float64(total), 100*float64(dark)/float64(total))
	}
}
