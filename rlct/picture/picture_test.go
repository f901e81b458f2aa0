package picture

import (
	"fmt"
	"slices"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// draw describes the problem and draws it, failing the test on an error or
// on a picture that is not well-formed XML with finite coordinates.
func draw(t testing.TB, spec rlct.Spec) []*svgElement {
	t.Helper()
	svg, err := SVG(describe(t, spec), "K = "+spec.K)
	if err != nil {
		t.Fatalf("%+v: %v", spec, err)
	}
	els, err := decodeSVG(svg)
	if err != nil {
		t.Fatalf("%+v: the SVG is not well-formed XML: %v", spec, err)
	}
	if err := checkFinite(els); err != nil {
		t.Fatalf("%+v: %v", spec, err)
	}
	return els
}

// pictureCases are hand-worked pictures (the command's golden files show
// the first five).
var pictureCases = []struct {
	name      string
	spec      rlct.Spec
	vertices  []string // vertex labels
	result    []string // in the bold caption line
	caption   []string // elsewhere in the caption
	classes   []string // classes that must appear
	axisNames []string
	// principal is the shape of the principal face: "vertex", "edge"
	// (a segment between two vertices), "ray" (from a vertex to the
	// frame), or a polygon "polygon:N:M" with N corners, M of them
	// vertices of P(K).
	principal string
}{
	{
		// P = conv{(4,0),(0,6)} + R²₊; the ray (t,t) meets 3x + 2y = 12 at
		// t = 12/5, λ = 5/12, θ = 1, exact (Howald 2001, Trans. AMS 353,
		// halved for squares).
		name:      "x4y6",
		spec:      rlct.Spec{K: "x^4 + y^6"},
		vertices:  []string{"y⁶", "x⁴"},
		result:    []string{"λ = 5/12", "θ = 1", "exact"},
		caption:   []string{"(12/5, 12/5)", "= 12/5", "nondegenerate"},
		classes:   []string{"region", "boundary", "unbounded-edge", "principal", "ray", "hit", "hit-label", "grid"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "edge",
	},
	{
		// (y − x²)² = y² − 2x²y + x⁴: the edge from (0,2) to (4,0) on
		// x + 2y = 4 holds (2,1), and its face polynomial (y − x²)² vanishes
		// on the torus, so 3/4 = 1/t with t·3 = 4 is only an upper bound
		// (by hand); the true λ is 1/2 (y − x² is a coordinate, common
		// practice).
		name:      "degenerate",
		spec:      rlct.Spec{K: "(y - x^2)^2", Vars: []string{"x", "y"}},
		vertices:  []string{"y²", "x⁴"},
		result:    []string{"λ = 3/4", "θ = 1", "upper bound"},
		caption:   []string{"(4/3, 4/3)", "Upper bound only", "degenerate"},
		classes:   []string{"region", "principal", "degenerate", "ray", "hit", "support"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "edge",
	},
	{
		// x²y² + z²: λ(x²y²) = 1/2 with θ = 2, plus 1/2 for z² in a
		// separate variable: λ = 1, θ = 2 (common practice: λ adds and θ
		// adds minus one over separate variables). The ray meets the edge
		// (0,0,2)–(2,2,0) at its midpoint (1,1,1) (by hand).
		name:      "space",
		spec:      rlct.Spec{K: "x^2*y^2 + z^2"},
		vertices:  []string{"z²", "x²y²"},
		result:    []string{"λ = 1", "θ = 2", "exact"},
		caption:   []string{"(1, 1, 1)"},
		classes:   []string{"unbounded-face", "edge", "unbounded-edge", "cut", "principal", "ray", "hit", "axis"},
		axisNames: []string{"x", "y", "z"},
		principal: "edge",
	},
	{
		// x² + y² + z² at a uniform prior: the triangle x + y + z = 2 is
		// met at (2/3, 2/3, 2/3), λ = 3/2 (regular model, d/2; common
		// practice).
		name:      "sphere",
		spec:      rlct.Spec{K: "x^2 + y^2 + z^2"},
		vertices:  []string{"z²", "y²", "x²"},
		result:    []string{"λ = 3/2", "θ = 1", "exact"},
		caption:   []string{"(2/3, 2/3, 2/3)"},
		classes:   []string{"compact-face", "unbounded-face", "principal", "ray", "hit"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:3:3",
	},
	{
		// The bundled example of the command, (g·v1)² + (g·v2)² +
		// (v1·v2)²: the triangle (2,2,0), (2,0,2), (0,2,2) lies on
		// g + v1 + v2 = 4, met at t = 4/3, so λ = 3/4 with θ = 1 (by hand).
		name:      "bundled",
		spec:      rlct.Spec{K: "(g*v1)^2 + (g*v2)^2 + (v1*v2)^2"},
		vertices:  []string{"v1²·v2²", "g²·v2²", "g²·v1²"},
		result:    []string{"λ = 3/4", "θ = 1", "exact"},
		caption:   []string{"(4/3, 4/3, 4/3)"},
		classes:   []string{"compact-face", "unbounded-face", "principal", "ray", "hit"},
		axisNames: []string{"g", "v1", "v2"},
		principal: "polygon:3:3",
	},
	{
		// The hexagon x + y + z = 6 of the permutations of (0,2,4), met at
		// its centre (2,2,2): λ = 1/2, θ = 1, exact (even exponents,
		// positive coefficients; by hand).
		name:      "hexagon",
		spec:      rlct.Spec{K: "y^2*z^4 + y^4*z^2 + x^2*z^4 + x^4*z^2 + x^2*y^4 + x^4*y^2", Vars: []string{"x", "y", "z"}},
		vertices:  []string{"y²z⁴", "y⁴z²", "x²z⁴", "x²y⁴", "x⁴z²", "x⁴y²"},
		result:    []string{"λ = 1/2", "θ = 1", "exact"},
		caption:   []string{"(2, 2, 2)"},
		classes:   []string{"compact-face", "unbounded-face", "principal"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:6:6",
	},
	{
		// x²y² + x⁶ + y⁶: the ray meets the vertex (2,2), θ = 2 (by hand:
		// both edges through (2,2) cross the diagonal there).
		name:      "vertex",
		spec:      rlct.Spec{K: "x^2*y^2 + x^6 + y^6"},
		vertices:  []string{"y⁶", "x²y²", "x⁶"},
		result:    []string{"λ = 1/2", "θ = 2", "exact"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "vertex",
	},
	{
		// x² in (x, y): the principal face is the unbounded edge x = 2,
		// met at (2, 2): λ = 1/2, θ = 1 (common practice).
		name:      "unbounded edge",
		spec:      rlct.Spec{K: "x^2", Vars: []string{"x", "y"}},
		vertices:  []string{"x²"},
		result:    []string{"λ = 1/2", "θ = 1"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "ray",
	},
	{
		// x² + y² in (x, y, z): the principal face is the unbounded facet
		// x + y = 2, met at (1,1,1): λ = 1, θ = 1 (common practice); it is
		// the strip of four corners above the edge (2,0,0)–(0,2,0).
		name:      "unbounded facet",
		spec:      rlct.Spec{K: "x^2 + y^2", Vars: []string{"x", "y", "z"}},
		vertices:  []string{"y²", "x²"},
		result:    []string{"λ = 1", "θ = 1"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:4:2",
	},
	{
		// x⁴ + y² in (x, y, z): the edge (4,0,0)–(0,2,0) spans the facets
		// x + 2y = 4 (unbounded along z) and z = 0; t_τ·τ = (4/3, 4/3, 4/3)
		// lies on neither the edge nor z = 0 but inside the strip, so the
		// principal face is the facet, θ = 1 and λ = 3/4 (by hand).
		name:      "strip",
		spec:      rlct.Spec{K: "x^4 + y^2", Vars: []string{"x", "y", "z"}},
		vertices:  []string{"y²", "x⁴"},
		result:    []string{"λ = 3/4", "θ = 1"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:4:2",
	},
	{
		// x²z² + y² in (x, y, z): the ray meets the edge (2,0,2)–(0,2,0)
		// at (1,1,1), λ = 1; only the edge and not a facet holds it, θ = 2
		// (common practice: x²z² has λ = 1/2, θ = 2, and y² adds 1/2).
		name:      "edge in space",
		spec:      rlct.Spec{K: "x^2*z^2 + y^2", Vars: []string{"x", "y", "z"}},
		vertices:  []string{"y²", "x²z²"},
		result:    []string{"λ = 1", "θ = 2"},
		axisNames: []string{"x", "y", "z"},
		principal: "edge",
	},
	{
		// Sum of squares (x + y)² + (xy²)²: P(K) = 2·P(⟨x + y, xy²⟩) has
		// vertices (2,0) and (0,2) (by hand); the face polynomial (x + y)²
		// vanishes at x = −y.
		name:      "sum of squares",
		spec:      rlct.Spec{SOS: []string{"x + y", "x*y^2"}},
		vertices:  []string{"y²", "x²"},
		result:    []string{"λ = 1", "upper bound"},
		classes:   []string{"degenerate"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "edge",
	},
	{
		// Prior |x|: τ = (2,1) meets x + y = 2 at (4/3, 2/3), λ = 3/2.
		name:      "prior",
		spec:      rlct.Spec{K: "x^2 + y^2", Prior: "x=1"},
		vertices:  []string{"y²", "x²"},
		result:    []string{"λ = 3/2"},
		caption:   []string{"τ = (2, 1)", "(4/3, 2/3)"},
		axisNames: []string{"exponent of x", "exponent of y"},
		principal: "edge",
	},
	{
		// At (1, 0): the exponents are those of x − 1; (x−1)² + y⁴ has
		// λ = 1/2 + 1/4 = 3/4.
		name:      "shifted",
		spec:      rlct.Spec{K: "(x-1)^2 + y^4", At: []string{"x=1"}},
		vertices:  []string{"y⁴", "x²"},
		result:    []string{"λ = 3/4"},
		axisNames: []string{"exponent of (x − 1)", "exponent of y"},
		principal: "edge",
	},
	{
		// Long variable names take a middle dot.
		name:      "long names",
		spec:      rlct.Spec{K: "a1^2*b^2 + a1^6 + b^6"},
		vertices:  []string{"b⁶", "a1²·b²", "a1⁶"},
		result:    []string{"λ = 1/2", "θ = 2"},
		axisNames: []string{"exponent of a1", "exponent of b"},
		principal: "vertex",
	},
	{
		// (x − y)² + z⁴: a degenerate edge on the principal triangle
		// (2x + 2y + z = 4 is met at t = 4/5); the triangle itself is
		// nondegenerate (split into parts in disjoint variables).
		name:      "flagged",
		spec:      rlct.Spec{K: "(x - y)^2 + z^4"},
		vertices:  []string{"z⁴", "y²", "x²"},
		result:    []string{"λ = 5/4", "θ = 1", "upper bound"},
		classes:   []string{"degenerate"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:3:3",
	},
	{
		// x²⁶ + y²⁶ + z²⁶ − x¹³y⁷z⁶: an undetermined principal triangle
		// (x + y + z = 26 is met at t = 26/3).
		name:      "undetermined",
		spec:      rlct.Spec{K: "x^26 + y^26 + z^26 - x^13*y^7*z^6"},
		vertices:  []string{"z²⁶", "y²⁶", "x²⁶"},
		result:    []string{"λ = 3/26", "θ = 1", "upper bound"},
		classes:   []string{"undetermined"},
		axisNames: []string{"x", "y", "z"},
		principal: "polygon:3:3",
	},
}

func TestPictures(t *testing.T) {
	for _, tc := range pictureCases {
		t.Run(tc.name, func(t *testing.T) {
			els := draw(t, tc.spec)
			checkPicture(t, els, tc.vertices, tc.result, tc.caption, tc.classes, tc.axisNames)
			checkPrincipal(t, els, tc.principal)
			checkFlagged(t, els)
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
		if !slices.Contains(labels, v) {
			t.Errorf("no vertex labelled %q among %q", v, labels)
		}
	}
	res := byClass(els, "caption-result")
	if len(res) != 1 {
		t.Fatalf("%d result lines", len(res))
	}
	for _, want := range result {
		if !strings.Contains(res[0].Text, want) {
			t.Errorf("caption %q lacks %q", res[0].Text, want)
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

	// The ray runs from the origin of the axes to the hit point.
	rays, hits := byClass(els, "ray"), byClass(els, "hit")
	if len(rays) != 1 || len(hits) != 1 {
		t.Fatalf("%d rays and %d hit points", len(rays), len(hits))
	}
	h := polygonCentre(t, hits[0])
	start, end := lineEnds(t, rays[0])
	if end.Dist(h) > 0.2 {
		t.Errorf("the ray ends at %v, the hit point is at %v", end, h)
	}
	axes := byClass(els, "axis")
	if len(axes) < 2 {
		t.Fatalf("%d axes", len(axes))
	}
	if o, _ := lineEnds(t, axes[0]); o.Dist(start) > 0.2 {
		t.Errorf("the ray starts at %v, the axes at %v", start, o)
	}
}

// vertexDots returns the centres of the vertex marks.
func vertexDots(t *testing.T, els []*svgElement) []point {
	t.Helper()
	var out []point
	for _, el := range byClass(els, "vertex") {
		out = append(out, circleCentre(t, el))
	}
	return out
}

// atDot reports whether p is the centre of a vertex mark (within the
// rounding of the coordinates to a tenth of a pixel).
func atDot(p point, dots []point) bool {
	return slices.ContainsFunc(dots, func(q point) bool { return p.Dist(q) < 0.15 })
}

// checkPrincipal checks that the principal face is highlighted with the
// shape the case states, on vertices of P(K), through the hit point.
func checkPrincipal(t *testing.T, els []*svgElement, shape string) {
	t.Helper()
	dots := vertexDots(t, els)
	h := polygonCentre(t, byClass(els, "hit")[0])
	pf := byClass(els, "principal")
	if len(pf) != 1 {
		t.Fatalf("%d principal elements", len(pf))
	}
	el := pf[0]
	switch {
	case shape == "vertex":
		c := circleCentre(t, el)
		if el.Name != "circle" || !atDot(c, dots) || c.Dist(h) > 0.15 {
			t.Errorf("the principal vertex is <%s> at %v; vertices %v, hit point %v", el.Name, c, dots, h)
		}
	case shape == "edge":
		a, b := lineEnds(t, el)
		if el.Name != "line" || !atDot(a, dots) || !atDot(b, dots) {
			t.Errorf("the principal edge is <%s> %v–%v; vertices %v", el.Name, a, b, dots)
		}
		if d := distToSegment(h, a, b); d > 0.5 {
			t.Errorf("the hit point %v is %.2f px off the principal edge %v–%v", h, d, a, b)
		}
	case shape == "ray":
		a, b := lineEnds(t, el)
		if el.Name != "line" || !atDot(a, dots) || atDot(b, dots) {
			t.Errorf("the principal ray is <%s> %v–%v; vertices %v", el.Name, a, b, dots)
		}
		if d := distToSegment(h, a, b); d > 0.5 {
			t.Errorf("the hit point %v is %.2f px off the principal ray %v–%v", h, d, a, b)
		}
	default:
		var corners, onVertices int
		if _, err := fmt.Sscanf(shape, "polygon:%d:%d", &corners, &onVertices); err != nil {
			t.Fatalf("bad shape %q", shape)
		}
		pts := polygonPoints(t, el)
		n := 0
		for _, p := range pts {
			if atDot(p, dots) {
				n++
			}
		}
		if el.Name != "polygon" || len(pts) != corners || n != onVertices {
			t.Errorf("the principal face is <%s> with %d corners, %d on vertices; want %d and %d", el.Name, len(pts), n, corners, onVertices)
		}
		if !insideConvex(h, pts) {
			t.Errorf("the hit point %v is outside the principal face %v", h, pts)
		}
	}
}

// insideConvex reports whether p lies inside the convex polygon (either
// orientation), with a margin for rounding.
func insideConvex(p point, poly []point) bool {
	sign := 0.0
	for i, a := range poly {
		b := poly[(i+1)%len(poly)]
		c := (b.X-a.X)*(p.Y-a.Y) - (b.Y-a.Y)*(p.X-a.X)
		if sign == 0 {
			sign = c
		} else if c*sign < -1 {
			return false
		}
	}
	return true
}

// checkFlagged checks that the marks of degenerate and undetermined faces
// run between vertices of P(K).
func checkFlagged(t *testing.T, els []*svgElement) {
	t.Helper()
	dots := vertexDots(t, els)
	for _, class := range []string{"degenerate", "undetermined"} {
		for _, el := range byClass(els, class) {
			var pts []point
			if el.Name == "line" {
				a, b := lineEnds(t, el)
				pts = []point{a, b}
			} else {
				pts = polygonPoints(t, el)
			}
			for _, p := range pts {
				if !atDot(p, dots) {
					t.Errorf("the %s face <%s> has a corner %v off the vertices %v", class, el.Name, p, dots)
				}
			}
		}
	}
}

// TestFlaggedMarks checks the marks of degenerate and undetermined faces
// and their legend entries on hand-worked cases (see TestFlaggedFaces for
// the faces themselves).
func TestFlaggedMarks(t *testing.T) {
	tests := []struct {
		spec         rlct.Spec
		degenerate   []string // element names of the marks
		undetermined []string
	}{
		{rlct.Spec{K: "(y - x^2)^2"}, []string{"line"}, nil},
		{rlct.Spec{K: "(x - y)^2 + z^4"}, []string{"line"}, nil},
		{rlct.Spec{K: "x^26 + y^26 + z^26 - x^13*y^7*z^6"}, nil, []string{"polygon"}},
		{rlct.Spec{K: "x^4 + y^6"}, nil, nil},
	}
	for _, tt := range tests {
		els := draw(t, tt.spec)
		legend := strings.Join(texts(byClass(els, "legend-label")), "|")
		for _, c := range []struct {
			class string
			want  []string
			dash  string
		}{{"degenerate", tt.degenerate, "0.1 9"}, {"undetermined", tt.undetermined, "10 5"}} {
			var got []string
			for _, el := range byClass(els, c.class) {
				got = append(got, el.Name)
				if el.Attrs["stroke-dasharray"] != c.dash {
					t.Errorf("K = %s: a %s mark is dashed %q, want %q", tt.spec.K, c.class, el.Attrs["stroke-dasharray"], c.dash)
				}
			}
			if !slices.Equal(got, c.want) {
				t.Errorf("K = %s: %s marks %q, want %q", tt.spec.K, c.class, got, c.want)
			}
			if has := strings.Contains(legend, c.class+" face"); has != (len(c.want) > 0) {
				t.Errorf("K = %s: legend %q, want a %s entry: %v", tt.spec.K, legend, c.class, len(c.want) > 0)
			}
		}
	}
}

// TestStretchedAxes checks that axes of very different lengths are drawn
// to different scales, and that the caption says so.
func TestStretchedAxes(t *testing.T) {
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
		caption := strings.Join(texts(byClass(draw(t, rlct.Spec{K: tt.expr}), "caption-text")), " ")
		if got := strings.Contains(caption, "different scales"); got != tt.stretched {
			t.Errorf("%s: caption %q, want stretched %v", tt.expr, caption, tt.stretched)
		}
	}
}

// TestCrowdedLabels checks that labels that would overlap are left out,
// the principal face's first, and that the legend says so.
func TestCrowdedLabels(t *testing.T) {
	var terms []string
	for k := range 13 {
		terms = append(terms, fmt.Sprintf("x^%d*y^%d", 2*k, 2*(12-k)*(12-k)))
	}
	els := draw(t, rlct.Spec{K: strings.Join(terms, " + ")})
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

// TestTitleEscaped checks that a title with markup characters stays text.
func TestTitleEscaped(t *testing.T) {
	svg, err := SVG(describe(t, rlct.Spec{K: "x^2 + y^2"}), `K = <a&b> "q"`)
	if err != nil {
		t.Fatal(err)
	}
	els, err := decodeSVG(svg)
	if err != nil {
		t.Fatal(err)
	}
	if got := texts(byClass(els, "title")); len(got) != 1 || got[0] != `K = <a&b> "q"` {
		t.Errorf("title %q", got)
	}
}

// FuzzSVG draws the Newton polyhedron of arbitrary small expressions in 2 or
// 3 variables and checks that the picture is well-formed XML with finite
// coordinates, and that every facet is drawn on exactly its own vertices.
// It exercises the construction and the projection on shapes nobody drew by
// hand.
func FuzzSVG(f *testing.F) {
	for _, tc := range pictureCases {
		if tc.spec.K != "" && tc.spec.Vars == nil && tc.spec.At == nil {
			f.Add(tc.spec.K)
		}
	}
	f.Add("x^6 + x^2*y^2*z^2 + y^6 + z^6 + x^3*y^3")
	f.Add("(x - y)^2 + x^2*z^4")
	f.Add("x^2*y^4 + y^2*z^2 + x^8")
	f.Fuzz(func(t *testing.T, expr string) {
		if len(expr) > 80 {
			return
		}
		// Small limits keep the parser from expanding large powers, such
		// as (1+A)^7^4 = (1+A)^2401, which take seconds and are refused
		// below anyway.
		spec := &rlct.Spec{K: expr, Limits: monomial.Limits{MaxExponent: 48, MaxTerms: 5000}}
		p, err := spec.Problem()
		if err != nil || p.K.NumVars() < 2 || p.K.NumVars() > 3 || p.K.Degree() > 24 {
			return
		}
		ds, err := rlct.Describe(t.Context(), p, nil)
		if err != nil {
			return
		}
		d := ds[0]
		svg, err := SVG(d, "K = "+expr)
		if err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
		els, err := decodeSVG(svg)
		if err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
		if err := checkFinite(els); err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
		sc, err := newScene(d)
		if err != nil {
			t.Fatalf("%q: %v", expr, err)
		}
		for i, f := range sc.facets {
			var vs [][]int64
			for _, c := range sc.shapes[i].corners {
				if slices.ContainsFunc(f.verts, func(v []int64) bool { return slices.Equal(v, c) }) {
					vs = append(vs, c)
				}
			}
			extra := map[int]int{0: 0, 1: 2, 2: 3}[len(f.rays)]
			if sc.n == 2 {
				extra = len(f.rays)
			}
			if !sameSet(vs, f.verts) || len(sc.shapes[i].corners) != len(f.verts)+extra {
				t.Fatalf("%q: facet %s with vertices %s drawn as %s", expr, f.label, pointsString(f.verts), pointsString(sc.shapes[i].corners))
			}
		}
	})
}
