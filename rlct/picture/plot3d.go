package picture

import (
	"fmt"
	"math"
	"math/big"
	"slices"
	"sort"
	"strconv"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
)

// vec3 is a point of the exponent space in floating point, for drawing.
type vec3 [3]float64

func (a vec3) add(b vec3) vec3      { return vec3{a[0] + b[0], a[1] + b[1], a[2] + b[2]} }
func (a vec3) scale(k float64) vec3 { return vec3{k * a[0], k * a[1], k * a[2]} }
func (a vec3) dot(b vec3) float64   { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
func (a vec3) norm() float64        { return math.Sqrt(a.dot(a)) }

// floatInt converts an exact integer to a drawing coordinate.
func floatInt(x *big.Int) float64 {
	f, _ := new(big.Float).SetInt(x).Float64()
	return f
}

// toVec3 converts an integer point (below 2^53, so exactly) for drawing.
func toVec3(p []int64) vec3 { return vec3{float64(p[0]), float64(p[1]), float64(p[2])} }

// The fixed oblique projection: the first axis recedes to the lower left,
// the second runs to the right and the third up. A point p goes to
// (p₂ − 0.42·p₁, p₃ − 0.30·p₁) on the page (y up). The weighted ray of a
// uniform prior, along (1,1,1), then shows at about 45° and full length,
// which an isometric view (looking down that very diagonal) would hide.
const obliqueX, obliqueY = 0.42, 0.30

// viewDepth grows toward the viewer, who looks along −(1, 0.42, 0.30): the
// direction the projection collapses, after each axis is stretched.
func viewDepth(p, stretch vec3) float64 {
	return p[0]*stretch[0] + obliqueX*p[1]*stretch[1] + obliqueY*p[2]*stretch[2]
}

// lightDirection sets the tone of a face from its normal: faces whose
// normals point along it are drawn darkest. It is chosen so that the
// coordinate planes and the common compact faces get different tones.
var lightDirection = vec3{0.2, 0.6, 1}.scale(1 / math.Sqrt(0.04+0.36+1))

// num2 formats an opacity with two decimals.
func num2(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

// plot3D draws the Newton polyhedron of K in three variables, cut off by the
// frame, in the fixed oblique projection, and returns the legend and the
// lowest page coordinate it used.
func (sc *scene) plot3D(s *svg.Doc) ([]legendItem, float64) {
	d := sc.d
	box := toVec3(sc.box)
	hit := vec3{float(d.Hit[0]), float(d.Hit[1]), float(d.Hit[2])}

	// Fit the box and the axis arrows into the plot square.
	// Each axis is stretched to the longest when their lengths differ too
	// much; the map is linear, so faces stay flat and incidences hold.
	stretch := vec3{1, 1, 1}
	if sc.stretched {
		longest := slices.Max(box[:])
		for j := range 3 {
			stretch[j] = longest / box[j]
		}
	}
	flat := func(p vec3) (float64, float64) {
		p = vec3{p[0] * stretch[0], p[1] * stretch[1], p[2] * stretch[2]}
		return p[1] - obliqueX*p[0], p[2] - obliqueY*p[0]
	}
	umin, umax, vmin, vmax := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for c := range 8 {
		var p vec3
		for j := range 3 {
			if c>>j&1 == 1 {
				p[j] = box[j] * 1.12
			}
		}
		u, v := flat(p)
		umin, umax = math.Min(umin, u), math.Max(umax, u)
		vmin, vmax = math.Min(vmin, v), math.Max(vmax, v)
	}
	k := math.Min(plotSize/(umax-umin), plotSize/(vmax-vmin))
	padU := (plotSize - (umax-umin)*k) / 2
	at := func(p vec3) point {
		u, v := flat(p)
		return point{X: plotLeft + padU + (u-umin)*k, Y: plotTop + 14 + (vmax-v)*k}
	}
	atInt := func(p []int64) point { return at(toVec3(p)) }

	// The lattice on the three coordinate planes, which lie behind
	// everything else.
	s.Printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", svg.ColorGrid)
	for j := range 3 {
		// Grid lines at least 9 px apart.
		step := 1
		if unit := at(vec3{}).Dist(at(axis(j, 1))); unit < 9 {
			step = svg.NiceStep(box[j], max(1, int(unit*box[j]/9)))
		}
		for i := step; float64(i) <= box[j]; i += step {
			for _, o := range []int{(j + 1) % 3, (j + 2) % 3} {
				a := axis(j, float64(i))
				s.Line(at(a), at(a.add(axis(o, box[o]))), "")
			}
		}
	}
	s.Printf("</g>\n")

	// Axes with ticks; the ray behind the faces, which are translucent.
	s.Printf(`<g class="ticks" font-size="13" fill="%s">`+"\n", svg.ColorMuted)
	tickOffset := []struct {
		dx, dy float64
		anchor string
	}{{8, 12, "start"}, {0, 19, "middle"}, {-9, 4.5, "end"}}
	for j := range 3 {
		st := svg.NiceStep(box[j], 6)
		for i := st; float64(i) <= box[j]; i += st {
			p := at(axis(j, float64(i)))
			o := tickOffset[j]
			s.Text(point{X: p.X + o.dx, Y: p.Y + o.dy}, `text-anchor="`+o.anchor+`"`, fmt.Sprint(i))
		}
	}
	s.Printf("</g>\n")
	for j := range 3 {
		end := at(axis(j, box[j]*1.1))
		s.Line(at(vec3{}), end, `class="axis" stroke="`+svg.ColorBlack+`" stroke-width="1.5" marker-end="url(#arrow-black)"`)
		lp := at(axis(j, box[j]*1.16))
		s.Text(point{X: lp.X, Y: lp.Y + 5}, `class="axis-label" text-anchor="middle" font-size="16" font-style="italic" `+svg.Halo, axisName(d, j))
	}
	s.Line(at(vec3{}), at(hit), `class="ray" `+rayStroke)

	// The facets of P(K) cut off at the frame, far ones first.
	type facetDepth struct {
		facet int
		depth float64
	}
	order := make([]facetDepth, len(sc.shapes))
	for i, sh := range sc.shapes {
		var c vec3
		for _, p := range sh.corners {
			c = c.add(toVec3(p))
		}
		order[i] = facetDepth{i, viewDepth(c.scale(1/float64(len(sh.corners))), stretch)}
	}
	sort.SliceStable(order, func(a, b int) bool { return order[a].depth < order[b].depth })
	compactFaces := 0
	for _, o := range order {
		f, sh := sc.facets[o.facet], sc.shapes[o.facet]
		pts := make([]point, len(sh.corners))
		for i, p := range sh.corners {
			pts[i] = atInt(p)
		}
		// Flat shading by the direction of the face, so that faces meeting
		// at an edge differ in tone.
		a := vec3{floatInt(f.normal[0]), floatInt(f.normal[1]), floatInt(f.normal[2])}
		tone := a.dot(lightDirection) / a.norm()
		if f.compact() {
			compactFaces++
			s.Polygon(pts, `class="compact-face" fill="`+svg.ColorGreen+`" fill-opacity="`+num2(0.25+0.4*tone*tone)+`" stroke="none"`)
		} else {
			s.Polygon(pts, `class="unbounded-face" fill="`+svg.ColorSkyBlue+`" fill-opacity="`+num2(0.08+0.45*tone*tone)+`" stroke="none"`)
		}
		if sc.pf.facet == o.facet {
			s.Polygon(pts, `class="principal" fill="url(#hatch)" fill-opacity="0.8" stroke="`+svg.ColorVermillion+`" stroke-width="3"`)
		}
	}

	// The sides of the facets: where two facets meet, with an arrow where
	// P(K) goes on beyond the frame, and, thin and dotted, where the frame
	// cuts a facet. Each edge of P(K) lies on two facets and is drawn once.
	seen := map[string]bool{}
	var edges, cuts []side
	for _, o := range order {
		for _, e := range sc.shapes[o.facet].sides {
			if e.kind == sideCut {
				cuts = append(cuts, e)
				continue
			}
			key := pointString(e.a) + pointString(e.b)
			if e.kind == sideBounded && slices.Compare(e.a, e.b) > 0 {
				key = pointString(e.b) + pointString(e.a)
			}
			if seen[key] {
				continue
			}
			seen[key] = true
			edges = append(edges, e)
		}
	}
	for _, e := range cuts {
		s.Line(atInt(e.a), atInt(e.b), `class="cut" stroke="`+svg.ColorBlue+`" stroke-width="1" stroke-opacity="0.6" stroke-dasharray="2 4"`)
	}
	for _, e := range edges {
		attrs := `class="edge" ` + boundaryStroke
		if e.kind == sideRay {
			attrs = `class="unbounded-edge" ` + boundaryStroke + ` marker-end="url(#arrow-blue)"`
		}
		s.Line(atInt(e.a), atInt(e.b), attrs)
	}

	// The principal face if it is an edge or a vertex, the flagged faces,
	// the vertices and the hit point.
	pf := sc.pf
	switch {
	case pf.dim == 1 && len(pf.rays) == 0:
		s.Line(atInt(pf.verts[0]), atInt(pf.verts[1]), `class="principal" `+principalStroke)
	case pf.dim == 1:
		v := pf.verts[0]
		s.Line(atInt(v), atInt(moved(v, pf.rays[0], sc.box[pf.rays[0]])), `class="principal" `+principalStroke)
	}
	flagged := sc.flaggedFaces(s, func(f facePicture) []point {
		corners := f.verts
		if f.dim == 2 {
			corners = f.corners
		}
		pts := make([]point, len(corners))
		for i, p := range corners {
			pts[i] = atInt(p)
		}
		return pts
	})
	if pf.dim == 0 {
		s.Circle(atInt(pf.verts[0]), 12, `class="principal" `+principalRing)
	}
	var centroid point
	for _, v := range sc.verts {
		p := atInt(v)
		centroid.X += p.X / float64(len(sc.verts))
		centroid.Y += p.Y / float64(len(sc.verts))
		s.Circle(p, 4.5, `class="vertex" `+vertexStyle)
	}
	h := at(hit)
	s.Diamond(h, 8, `class="hit" `+hitStyle)
	labels := &labeller{}
	hitLabel(s, h, labels)
	labelVertices(s, d, labels, func(v rlct.Vertex) []labelSpot {
		// Away from the middle of the vertices, else around the vertex.
		p := at(vec3{float64(v.Exponent[0]), float64(v.Exponent[1]), float64(v.Exponent[2])})
		dx, dy := p.X-centroid.X, p.Y-centroid.Y
		if n := math.Hypot(dx, dy); n > 1 {
			dx, dy = dx/n, dy/n
		} else {
			dx, dy = -0.7, 0.7
		}
		anchor := "start"
		if dx < -0.3 {
			anchor = "end"
		} else if dx < 0.3 {
			anchor = "middle"
		}
		return []labelSpot{
			{point{X: p.X + 14*dx, Y: p.Y + 14*dy + 5 + 4*dy}, anchor},
			{point{X: p.X - 10, Y: p.Y - 8}, "end"},
			{point{X: p.X + 10, Y: p.Y - 8}, "start"},
			{point{X: p.X - 10, Y: p.Y + 18}, "end"},
			{point{X: p.X + 10, Y: p.Y + 18}, "start"},
		}
	})

	legend := []legendItem{}
	if compactFaces > 0 {
		legend = append(legend, legendItem{"compact-face", "compact face of P(K)"})
	}
	legend = append(legend,
		legendItem{"unbounded-face", "unbounded face (cut at the frame)"},
		legendItem{"continues", "unbounded edge (continues)"},
		legendItem{"vertex", vertexLegend(labels)},
		principalLegend(d),
	)
	legend = append(legend, flagged...)
	legend = append(legend,
		legendItem{"ray", "ray from the origin along τ"},
		legendItem{"hit", svg.Sub("t", "τ", "·τ, where the ray meets P(K)")},
	)
	return legend, plotTop + 14 + (vmax-vmin)*k + 10
}

// axis returns t·e_j.
func axis(j int, t float64) vec3 {
	var v vec3
	v[j] = t
	return v
}
