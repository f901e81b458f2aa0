package main

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// svgElement is one element of a parsed SVG: its name, attributes, and all
// the character data inside it (including that of child elements).
type svgElement struct {
	name  string
	attrs map[string]string
	text  string
}

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

func decodeSVG(data []byte) ([]*svgElement, error) {
	dec := xml.NewDecoder(bytes.NewReader(data))
	var all, open []*svgElement
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			el := &svgElement{name: tok.Name.Local, attrs: map[string]string{}}
			for _, a := range tok.Attr {
				el.attrs[a.Name.Local] = a.Value
			}
			all = append(all, el)
			open = append(open, el)
		case xml.EndElement:
			open = open[:len(open)-1]
		case xml.CharData:
			for _, el := range open {
				el.text += string(tok)
			}
		}
	}
	if len(all) == 0 || all[0].name != "svg" {
		return nil, fmt.Errorf("no svg root element")
	}
	return all, nil
}

// checkFinite checks that every coordinate in the picture is a finite
// number.
func checkFinite(els []*svgElement) error {
	finite := func(v string) bool {
		f, err := strconv.ParseFloat(v, 64)
		return err == nil && !math.IsNaN(f) && !math.IsInf(f, 0)
	}
	for _, el := range els {
		for _, name := range []string{"x", "y", "x1", "y1", "x2", "y2", "cx", "cy", "r", "width", "height"} {
			if v, ok := el.attrs[name]; ok && !strings.HasSuffix(v, "%") && !finite(v) {
				return fmt.Errorf("<%s %s=%q>", el.name, name, v)
			}
		}
		for _, p := range strings.Fields(el.attrs["points"]) {
			x, y, _ := strings.Cut(p, ",")
			if !finite(x) || !finite(y) {
				return fmt.Errorf("<%s points=%q>", el.name, el.attrs["points"])
			}
		}
	}
	return nil
}

// byClass returns the elements with the class.
func byClass(els []*svgElement, class string) []*svgElement {
	var out []*svgElement
	for _, el := range els {
		if el.attrs["class"] == class {
			out = append(out, el)
		}
	}
	return out
}

func texts(els []*svgElement) []string {
	out := make([]string, len(els))
	for i, el := range els {
		out[i] = el.text
	}
	return out
}

func attrFloat(t *testing.T, el *svgElement, name string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(el.attrs[name], 64)
	if err != nil {
		t.Fatalf("<%s> attribute %s=%q: %v", el.name, name, el.attrs[name], err)
	}
	return v
}

// polygonCentre is the mean of a polygon's points (the hit diamond's centre).
func polygonCentre(t *testing.T, el *svgElement) point {
	t.Helper()
	var c point
	pts := strings.Fields(el.attrs["points"])
	for _, p := range pts {
		x, y, _ := strings.Cut(p, ",")
		fx, err1 := strconv.ParseFloat(x, 64)
		fy, err2 := strconv.ParseFloat(y, 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("bad point %q", p)
		}
		c.x += fx / float64(len(pts))
		c.y += fy / float64(len(pts))
	}
	return c
}

// drawCases are hand-worked pictures; each is also a golden file.
var drawCases = []struct {
	name      string
	args      []string
	vertices  []string // vertex labels
	result    []string // in the bold caption line
	caption   []string // elsewhere in the caption
	classes   []string // classes that must appear
	axisNames []string
}{
	{
		// P = conv{(4,0),(0,6)} + R²₊; the ray (t,t) meets 3x + 2y = 12 at
		// t = 12/5, λ = 5/12, θ = 1, exact (Howald 2001, Trans. AMS 353,
		// halved for squares).
		name:     "x4y6",
		args:     []string{"x^4 + y^6"},
		vertices: []string{"y⁶", "x⁴"},
		result:   []string{"λ = 5/12", "θ = 1", "exact"},
		caption:  []string{"(12/5, 12/5)", "= 12/5", "nondegenerate"},
		classes:  []string{"region", "boundary", "unbounded-edge", "principal", "ray", "hit", "hit-label", "grid"},
		axisNames: []string{
			"exponent of x", "exponent of y",
		},
	},
	{
		// (y − x²)² = y² − 2x²y + x⁴: the edge from (0,2) to (4,0) on
		// x + 2y = 4 holds (2,1), and its face polynomial (y − x²)² vanishes
		// on the torus, so 3/4 = 1/t with t·3 = 4 is only an upper bound
		// (by hand); the true λ is 1/2 (y − x² is a coordinate, common
		// practice).
		name:     "degenerate",
		args:     []string{"(y - x^2)^2"},
		vertices: []string{"y²", "x⁴"},
		result:   []string{"λ = 3/4", "θ = 1", "upper bound"},
		caption:  []string{"(4/3, 4/3)", "Upper bound only", "degenerate"},
		classes:  []string{"region", "principal", "degenerate", "ray", "hit", "support"},
		axisNames: []string{
			"exponent of x", "exponent of y",
		},
	},
	{
		// x²y² + z²: λ(x²y²) = 1/2 with θ = 2, plus 1/2 for z² in a
		// separate variable: λ = 1, θ = 2 (common practice: λ adds and θ
		// adds minus one over separate variables). The ray meets the edge
		// (0,0,2)–(2,2,0) at its midpoint (1,1,1) (by hand).
		name:      "space",
		args:      []string{"x^2*y^2 + z^2"},
		vertices:  []string{"z²", "x²y²"},
		result:    []string{"λ = 1", "θ = 2", "exact"},
		caption:   []string{"(1, 1, 1)"},
		classes:   []string{"unbounded-face", "edge", "unbounded-edge", "principal", "ray", "hit", "axis"},
		axisNames: []string{"x", "y", "z"},
	},
	{
		// x² + y² + z² at a uniform prior: the triangle x + y + z = 2 is
		// met at (2/3, 2/3, 2/3), λ = 3/2 (regular model, d/2; common
		// practice).
		name:      "sphere",
		args:      []string{"x^2 + y^2 + z^2"},
		vertices:  []string{"z²", "y²", "x²"},
		result:    []string{"λ = 3/2", "θ = 1", "exact"},
		caption:   []string{"(2/3, 2/3, 2/3)"},
		classes:   []string{"compact-face", "unbounded-face", "principal", "ray", "hit"},
		axisNames: []string{"x", "y", "z"},
	},
	{
		// The bundled example (g·v1)² + (g·v2)² + (v1·v2)²: the triangle
		// (2,2,0), (2,0,2), (0,2,2) lies on g + v1 + v2 = 4, met at t = 4/3,
		// so λ = 3/4 with θ = 1 (by hand). Its picture is the one to show
		// first.
		name:      "bundled",
		args:      nil,
		vertices:  []string{"v1²·v2²", "g²·v2²", "g²·v1²"},
		result:    []string{"λ = 3/4", "θ = 1", "exact"},
		caption:   []string{"(4/3, 4/3, 4/3)"},
		classes:   []string{"compact-face", "unbounded-face", "principal", "ray", "hit"},
		axisNames: []string{"g", "v1", "v2"},
	},
}

func TestDrawPictures(t *testing.T) {
	for _, tc := range drawCases {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"draw", "-o", "-"}, tc.args...)
			out, errOut, code := runCLI(t, "", args...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			checkGolden(t, filepath.Join("testdata", "draw_"+tc.name+".svg"), out)
			els := parseSVG(t, []byte(out))
			if err := checkFinite(els); err != nil {
				t.Error(err)
			}
			checkPicture(t, els, tc.vertices, tc.result, tc.caption, tc.classes, tc.axisNames)
		})
	}
}

func checkPicture(t *testing.T, els []*svgElement, vertices, result, caption, classes, axisNames []string) {
	t.Helper()
	labels := texts(byClass(els, "vertex-label"))
	if len(labels) != len(vertices) || len(byClass(els, "vertex")) != len(vertices) {
		t.Errorf("vertex labels %q (%d dots), want %q", labels, len(byClass(els, "vertex")), vertices)
	}
	for _, v := range vertices {
		if !strings.Contains(strings.Join(labels, "|")+"|", v+"|") {
			t.Errorf("no vertex labelled %q among %q", v, labels)
		}
	}
	res := byClass(els, "caption-result")
	if len(res) != 1 {
		t.Fatalf("%d result lines", len(res))
	}
	for _, want := range result {
		if !strings.Contains(res[0].text, want) {
			t.Errorf("caption %q lacks %q", res[0].text, want)
		}
	}
	all := strings.Join(texts(byClass(els, "caption-text")), " ")
	for _, want := range caption {
		if !strings.Contains(all, want) {
			t.Errorf("caption %q lacks %q", all, want)
		}
	}
	for _, c := range classes {
		if len(byClass(els, c)) == 0 {
			t.Errorf("no element of class %q", c)
		}
	}
	got := texts(byClass(els, "axis-label"))
	if strings.Join(got, "|") != strings.Join(axisNames, "|") {
		t.Errorf("axis labels %q, want %q", got, axisNames)
	}

	// The ray runs from the origin of the axes to the hit point, which
	// lies on the principal face when that is drawn as a segment.
	rays, hits := byClass(els, "ray"), byClass(els, "hit")
	if len(rays) != 1 || len(hits) != 1 {
		t.Fatalf("%d rays and %d hit points", len(rays), len(hits))
	}
	h := polygonCentre(t, hits[0])
	ray := rays[0]
	if end := (point{attrFloat(t, ray, "x2"), attrFloat(t, ray, "y2")}); end.dist(h) > 0.2 {
		t.Errorf("the ray ends at %v, the hit point is at %v", end, h)
	}
	start := point{attrFloat(t, ray, "x1"), attrFloat(t, ray, "y1")}
	axes := byClass(els, "axis")
	if len(axes) < 2 {
		t.Fatalf("%d axes", len(axes))
	}
	if o := (point{attrFloat(t, axes[0], "x1"), attrFloat(t, axes[0], "y1")}); o.dist(start) > 0.2 {
		t.Errorf("the ray starts at %v, the axes at %v", start, o)
	}
	for _, pf := range byClass(els, "principal") {
		if pf.name != "line" {
			continue
		}
		a := point{attrFloat(t, pf, "x1"), attrFloat(t, pf, "y1")}
		b := point{attrFloat(t, pf, "x2"), attrFloat(t, pf, "y2")}
		if d := distToSegment(h, a, b); d > 0.5 {
			t.Errorf("the hit point %v is %.2f px off the principal face %v–%v", h, d, a, b)
		}
	}
}

// TestDrawMore covers the other shapes of principal face and forms of K.
func TestDrawMore(t *testing.T) {
	tests := []struct {
		args     []string
		vertices []string
		result   []string
		classes  []string
	}{
		// x²y² + x⁶ + y⁶: the ray meets the vertex (2,2), θ = 2 (by hand:
		// both edges through (2,2) separate the diagonal).
		{[]string{"x^2*y^2 + x^6 + y^6"}, []string{"y⁶", "x²y²", "x⁶"}, []string{"λ = 1/2", "θ = 2", "exact"}, []string{"principal"}},
		// x² in (x, y): the principal face is the unbounded edge x = 2.
		{[]string{"x^2", "--vars", "x,y"}, []string{"x²"}, []string{"λ = 1/2", "θ = 1"}, []string{"principal"}},
		// Sum of squares (x + y)² + (xy²)²: P(K) = 2·P(⟨x + y, xy²⟩) has
		// vertices (2,0) and (0,2) (by hand).
		{[]string{"--sos", "x + y; x*y^2"}, []string{"y²", "x²"}, []string{"λ = 1", "upper bound"}, []string{"degenerate"}},
		// Prior |x|: τ = (2,1) meets x + y = 2 at (4/3, 2/3), λ = 3/2.
		{[]string{"x^2 + y^2", "--prior", "x=1"}, []string{"y²", "x²"}, []string{"λ = 3/2"}, nil},
		// At (1, 0): the exponents are those of x − 1.
		{[]string{"(x-1)^2 + y^4", "--at", "x=1"}, []string{"y⁴", "x²"}, []string{"λ = 3/4"}, nil},
		// Long variable names take a middle dot.
		{[]string{"a1^2*b^2 + a1^6 + b^6"}, []string{"b⁶", "a1²·b²", "a1⁶"}, []string{"λ = 1/2", "θ = 2"}, nil},
		// x² + y² in (x, y, z): the principal face is the unbounded facet
		// x + y = 2, hatched.
		{[]string{"x^2 + y^2", "--vars", "x,y,z"}, []string{"y²", "x²"}, []string{"λ = 1", "θ = 1"}, []string{"principal"}},
		// (x − y)² + z⁴: a degenerate edge and an undetermined triangle.
		{[]string{"(x - y)^2 + z^4"}, []string{"z⁴", "y²", "x²"}, []string{"upper bound"}, []string{"degenerate", "undetermined"}},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", append([]string{"draw", "-o", "-"}, tt.args...)...)
		if code != exitOK {
			t.Errorf("%v: exit %d: %s", tt.args, code, errOut)
			continue
		}
		els := parseSVG(t, []byte(out))
		labels := texts(byClass(els, "vertex-label"))
		slices.Sort(labels)
		slices.Sort(tt.vertices)
		if strings.Join(labels, "|") != strings.Join(tt.vertices, "|") {
			t.Errorf("%v: vertex labels %q, want %q", tt.args, labels, tt.vertices)
		}
		res := texts(byClass(els, "caption-result"))
		for _, want := range tt.result {
			if len(res) != 1 || !strings.Contains(res[0], want) {
				t.Errorf("%v: caption %q lacks %q", tt.args, res, want)
			}
		}
		for _, c := range tt.classes {
			if len(byClass(els, c)) == 0 {
				t.Errorf("%v: no element of class %q", tt.args, c)
			}
		}
	}
}

func TestDrawWritesFile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "p.svg")
	if _, errOut, code := runCLI(t, "", "draw", "x^2 + y^4", "-o", path); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	parseSVG(t, data)
}

func TestDrawErrors(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "x.svg")
	tests := []struct {
		args []string
		code int
		want []string
	}{
		{[]string{"draw", "a^2 + b^2 + c^2 + d^2", "-o", out}, exitFailed, []string{"2 or 3 variables", "has 4", "lctkit faces"}},
		{[]string{"draw", "x^2", "-o", out}, exitFailed, []string{"2 or 3 variables", "--vars"}},
		{[]string{"draw", "x^2 + y^2", "--at", "x=0", "--at", "x=1", "-o", out}, exitUsage, []string{"one point at a time"}},
		{[]string{"draw", "x^2 + (y", "-o", out}, exitFailed, []string{"1:9:"}},
		{[]string{"draw", "x^2 + y^2", "-o", filepath.Join(dir, "missing", "x.svg")}, exitFailed, []string{"writing the picture"}},
		{[]string{"draw", "x^2 + y^2"}, exitUsage, []string{"-o"}},
	}
	for _, tt := range tests {
		_, errOut, code := runCLI(t, "", tt.args...)
		if code != tt.code {
			t.Errorf("%v: exit %d, want %d; stderr %s", tt.args, code, tt.code, errOut)
		}
		for _, w := range tt.want {
			if !strings.Contains(errOut, w) {
				t.Errorf("%v: stderr lacks %q:\n%s", tt.args, w, errOut)
			}
		}
	}
	if _, err := os.Stat(out); err == nil {
		t.Errorf("a failed draw wrote %s", out)
	}
}

// TestDrawRenders renders two golden pictures side by side with one run of
// a headless Chromium and checks that each half of the screenshot shows the
// shaded polyhedron and dark text and lines. It skips when Chromium is not
// installed, and in -short mode.
func TestDrawRenders(t *testing.T) {
	names := []string{"x4y6", "space"}
	dir := t.TempDir()
	page := `<!DOCTYPE html><html><body style="margin:0;display:flex;align-items:flex-start">`
	height := 0.0
	for _, name := range names {
		src, err := filepath.Abs(filepath.Join("testdata", "draw_"+name+".svg"))
		if err != nil {
			t.Fatal(err)
		}
		data, err := os.ReadFile(src)
		if err != nil {
			t.Fatal(err)
		}
		root := parseSVG(t, data)[0]
		if w := attrFloat(t, root, "width"); w != pageWidth {
			t.Fatalf("%s is %g px wide", name, w)
		}
		height = math.Max(height, attrFloat(t, root, "height"))
		page += fmt.Sprintf(`<img src="file://%s" width="%d" style="display:block">`, src, pageWidth)
	}
	page += `</body></html>`
	html := filepath.Join(dir, "page.html")
	if err := os.WriteFile(html, []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}
	img := screenshot(t, html, len(names)*pageWidth, int(math.Ceil(height)))
	b := img.Bounds()
	if b.Dx() < len(names)*pageWidth || b.Dy() < 600 {
		t.Fatalf("screenshot is %dx%d", b.Dx(), b.Dy())
	}
	for i, name := range names {
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
			t.Errorf("%s: only %.1f%% of the screenshot is the polyhedron's blue", name, 100*frac)
		}
		if frac := float64(dark) / float64(total); frac < 0.003 {
			t.Errorf("%s: only %.2f%% of the screenshot is dark (text, axes)", name, 100*frac)
		}
		t.Logf("%s: %.1f%% blue, %.2f%% dark", name, 100*float64(blue)/float64(total), 100*float64(dark)/float64(total))
	}
}

// FuzzDraw draws the Newton polyhedron of arbitrary small expressions in 2 or
// 3 variables and checks that the picture is well-formed XML with finite
// coordinates. It exercises the clipping and projection on shapes nobody
// drew by hand.
func FuzzDraw(f *testing.F) {
	for _, tc := range drawCases {
		if len(tc.args) > 0 {
			f.Add(tc.args[0])
		}
	}
	f.Add("x^6 + x^2*y^2*z^2 + y^6 + z^6 + x^3*y^3")
	f.Add("(x - y)^2 + x^2*z^4")
	f.Add("x^2*y^4 + y^2*z^2 + x^8")
	f.Fuzz(func(t *testing.T, expr string) {
		if len(expr) > 80 {
			return
		}
		p, _, err := (&rlct.Spec{K: expr}).Problem()
		if err != nil || p.K.NumVars() < 2 || p.K.NumVars() > 3 || p.K.Degree() > 24 {
			return
		}
		d, err := rlct.Describe(context.Background(), p, nil)
		if err != nil {
			return
		}
		svg := drawPicture(d, "K = "+expr)
		els, err := decodeSVG([]byte(svg))
		if err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
		if err := checkFinite(els); err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
	})
}

// TestFacetPolygons cross-checks the clipping that cuts the facets off at
// the frame with the exact facets from the library, on random polynomials in
// three variables: a compact facet comes out as the polygon of exactly its
// own vertices, and every corner of every polygon satisfies all the facet
// inequalities, lies in the box, and lies on its own facet.
func TestFacetPolygons(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 13))
	vars := []string{"x", "y", "z"}
	for range 60 {
		k := monomial.Zero(vars)
		for range 2 + rng.IntN(6) {
			e := monomial.Exponent{2 * rng.IntN(4), 2 * rng.IntN(4), 2 * rng.IntN(4)}
			if e[0]+e[1]+e[2] == 0 {
				e[rng.IntN(3)] = 2
			}
			k = k.Add(monomial.Monomial(vars, e, big.NewRat(int64(1+rng.IntN(3)), 1)))
		}
		d, err := rlct.Describe(context.Background(), &rlct.Problem{K: k}, nil)
		if err != nil {
			t.Fatalf("K = %s: %v", k, err)
		}
		var box vec3
		for j := range 3 {
			for _, v := range d.Vertices {
				box[j] = math.Max(box[j], float64(v.Exponent[j]))
			}
			box[j] = frameExtent(box[j])
		}
		for i, f := range d.Facets {
			poly := facetPolygon(d.Facets, i, box)
			if len(poly) < 3 {
				t.Errorf("K = %s: facet %s has no polygon", k, f.Inequality)
				continue
			}
			for _, p := range poly {
				for j, g := range d.Facets {
					a := vec3{floatInt(g.Normal[0]), floatInt(g.Normal[1]), floatInt(g.Normal[2])}
					slack := a.dot(p) - floatInt(g.RHS)
					if slack < -1e-6 || (j == i && math.Abs(slack) > 1e-6) {
						t.Errorf("K = %s: corner %v of %s against %s: slack %g", k, p, f.Inequality, g.Inequality, slack)
					}
				}
				for j := range 3 {
					if p[j] < -1e-6 || p[j] > box[j]+1e-6 {
						t.Errorf("K = %s: corner %v of %s outside the box %v", k, p, f.Inequality, box)
					}
				}
			}
			if len(f.Rays) > 0 {
				continue
			}
			if len(poly) != len(f.Vertices) {
				t.Errorf("K = %s: compact facet %s has %d vertices, polygon %v", k, f.Inequality, len(f.Vertices), poly)
				continue
			}
			for _, v := range f.Vertices {
				if !slices.ContainsFunc(poly, func(p vec3) bool { return p.sub(intVec3(v)).norm() < 1e-6 }) {
					t.Errorf("K = %s: compact facet %s: vertex %v not a corner of %v", k, f.Inequality, v, poly)
				}
			}
		}
	}
}

// TestDrawStretchedAxes checks that axes of very different lengths are drawn
// to different scales, and that the caption says so.
func TestDrawStretchedAxes(t *testing.T) {
	tests := []struct {
		expr      string
		stretched bool
	}{
		{"x^4 + y^6", false},
		{"x^20 + y^4", true},
		{"x^2 + y^2 + z^2", false},
		{"x^30 + y^2 + z^2", true},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", "draw", "-o", "-", tt.expr)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", tt.expr, code, errOut)
		}
		caption := strings.Join(texts(byClass(parseSVG(t, []byte(out)), "caption-text")), " ")
		if got := strings.Contains(caption, "different scales"); got != tt.stretched {
			t.Errorf("%s: caption %q, want stretched %v", tt.expr, caption, tt.stretched)
		}
	}
}

// TestDrawCrowdedLabels checks that labels that would overlap are left out,
// the principal face's first, and that the legend says so.
func TestDrawCrowdedLabels(t *testing.T) {
	var terms []string
	for k := range 13 {
		terms = append(terms, fmt.Sprintf("x^%d*y^%d", 2*k, 2*(12-k)*(12-k)))
	}
	out, errOut, code := runCLI(t, "", "draw", "-o", "-", strings.Join(terms, " + "))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	els := parseSVG(t, []byte(out))
	labels := texts(byClass(els, "vertex-label"))
	if n := len(byClass(els, "vertex")); n != 13 || len(labels) >= n || len(labels) < 8 {
		t.Errorf("%d vertices, %d labels: %q", n, len(labels), labels)
	}
	// The ray (t, t) meets the vertex (18, 18): x¹⁸y¹⁸ is labelled first.
	if len(labels) == 0 || labels[0] != "x¹⁸y¹⁸" {
		t.Errorf("labels %q do not start with the principal vertex", labels)
	}
	if !strings.Contains(strings.Join(texts(byClass(els, "legend-label")), "|"), "some labels left out") {
		t.Errorf("the legend does not say that labels were left out")
	}
}
