package main

import (
	"fmt"
	"math"
	"math/big"
	"slices"
	"sort"
	"strconv"

	"github.com/lctkit/lctkit/rlct"
)

// vec3 is a point of the exponent space, in floating point for drawing.
type vec3 [3]float64

func (a vec3) add(b vec3) vec3      { return vec3{a[0] + b[0], a[1] + b[1], a[2] + b[2]} }
func (a vec3) sub(b vec3) vec3      { return vec3{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }
func (a vec3) scale(k float64) vec3 { return vec3{k * a[0], k * a[1], k * a[2]} }
func (a vec3) dot(b vec3) float64   { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
func (a vec3) cross(b vec3) vec3 {
	return vec3{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}
func (a vec3) norm() float64 { return math.Sqrt(a.dot(a)) }

// floatInt converts an exact integer to a drawing coordinate.
func floatInt(x *big.Int) float64 {
	f, _ := new(big.Float).SetInt(x).Float64()
	return f
}

func intVec3(e []int) vec3 { return vec3{float64(e[0]), float64(e[1]), float64(e[2])} }

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

// halfSpace is h·x ≥ k.
type halfSpace struct {
	h vec3
	k float64
}

// clipPolygon keeps the part of the convex polygon in the half-space
// (Sutherland and Hodgman 1974, "Reentrant polygon clipping", for one plane).
func clipPolygon(poly []vec3, hs halfSpace) []vec3 {
	const eps = 1e-9
	var out []vec3
	for i, p := range poly {
		q := poly[(i+1)%len(poly)]
		fp, fq := hs.h.dot(p)-hs.k, hs.h.dot(q)-hs.k
		if fp >= -eps {
			out = append(out, p)
		}
		if (fp < -eps && fq > eps) || (fp > eps && fq < -eps) {
			t := fp / (fp - fq)
			out = append(out, p.add(q.sub(p).scale(t)))
		}
	}
	return dedupe(out)
}

// dedupe drops consecutive points that coincide.
func dedupe(poly []vec3) []vec3 {
	var out []vec3
	for _, p := range poly {
		if len(out) == 0 || p.sub(out[len(out)-1]).norm() > 1e-7 {
			out = append(out, p)
		}
	}
	for len(out) > 1 && out[0].sub(out[len(out)-1]).norm() <= 1e-7 {
		out = out[:len(out)-1]
	}
	return out
}

// facetPolygon returns facet i of P(K) cut off by the box [0, box], as a
// convex polygon in order: a large square in the facet's plane clipped by
// the box and by every other facet inequality.
func facetPolygon(facets []rlct.FacetReport, i int, box vec3) []vec3 {
	a := vec3{floatInt(facets[i].Normal[0]), floatInt(facets[i].Normal[1]), floatInt(facets[i].Normal[2])}
	b := floatInt(facets[i].RHS)
	n := a.scale(1 / a.norm())
	// A vector off the normal: the axis where the normal is smallest.
	k := 0
	for j := range 3 {
		if math.Abs(n[j]) < math.Abs(n[k]) {
			k = j
		}
	}
	var e vec3
	e[k] = 1
	u := e.sub(n.scale(e.dot(n)))
	u = u.scale(1 / u.norm())
	w := n.cross(u)
	center := box.scale(0.5)
	center = center.sub(n.scale(n.dot(center) - b/a.norm()))
	r := 2 * box.norm()
	poly := []vec3{
		center.add(u.scale(r)).add(w.scale(r)),
		center.sub(u.scale(r)).add(w.scale(r)),
		center.sub(u.scale(r)).sub(w.scale(r)),
		center.add(u.scale(r)).sub(w.scale(r)),
	}
	for j := range 3 {
		var lo, hi vec3
		lo[j], hi[j] = 1, -1
		poly = clipPolygon(poly, halfSpace{lo, 0})
		poly = clipPolygon(poly, halfSpace{hi, -box[j]})
	}
	for j, f := range facets {
		if j == i || len(poly) < 3 {
			continue
		}
		h := vec3{floatInt(f.Normal[0]), floatInt(f.Normal[1]), floatInt(f.Normal[2])}
		poly = clipPolygon(poly, halfSpace{h, floatInt(f.RHS)})
	}
	if len(poly) < 3 {
		return nil
	}
	return poly
}

// onFrame reports whether p lies on a far side x_j = box_j of the box.
func onFrame(p, box vec3) (int, bool) {
	for j := range 3 {
		if math.Abs(p[j]-box[j]) < 1e-7*(1+box[j]) {
			return j, true
		}
	}
	return -1, false
}

// draw3D draws the Newton polyhedron of K in three variables, cut off by a
// box, in the fixed oblique projection, and returns the legend.
// It also returns the lowest page coordinate used and whether the axes have
// different scales.
func draw3D(s *svgDoc, d *rlct.Description) ([]legendItem, float64, bool) {
	hit := vec3{float(d.Hit[0]), float(d.Hit[1]), float(d.Hit[2])}
	var box vec3
	for j := range 3 {
		m := hit[j]
		for _, v := range d.Vertices {
			m = math.Max(m, float64(v.Exponent[j]))
		}
		box[j] = frameExtent(m)
	}

	// Fit the box and the axis arrows into the plot square.
	// Each axis is stretched to the longest when their lengths differ too
	// much; the map is linear, so faces stay flat and incidences hold.
	stretch := vec3{1, 1, 1}
	stretched := !sameScale(box[:]...)
	if stretched {
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
		return point{plotLeft + padU + (u-umin)*k, plotTop + 14 + (vmax-v)*k}
	}

	// The lattice on the three coordinate planes, which lie behind
	// everything else.
	s.printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", colorGrid)
	for j := range 3 {
		// Grid lines at least 9 px apart.
		step := 1
		if unit := at(vec3{}).dist(at(axis(j, 1))); unit < 9 {
			step = niceStep(box[j], max(1, int(unit*box[j]/9)))
		}
		for i := step; float64(i) <= box[j]; i += step {
			for _, o := range []int{(j + 1) % 3, (j + 2) % 3} {
				a := axis(j, float64(i))
				s.line(at(a), at(a.add(axis(o, box[o]))), "")
			}
		}
	}
	s.printf("</g>\n")

	// Axes with ticks; the ray behind the faces, which are translucent.
	s.printf(`<g class="ticks" font-size="13" fill="%s">`+"\n", colorMuted)
	tickOffset := []struct {
		dx, dy float64
		anchor string
	}{{8, 12, "start"}, {0, 19, "middle"}, {-9, 4.5, "end"}}
	for j := range 3 {
		st := niceStep(box[j], 6)
		for i := st; float64(i) <= box[j]; i += st {
			p := at(axis(j, float64(i)))
			o := tickOffset[j]
			s.text(point{p.x + o.dx, p.y + o.dy}, `text-anchor="`+o.anchor+`"`, fmt.Sprint(i))
		}
	}
	s.printf("</g>\n")
	for j := range 3 {
		end := at(axis(j, box[j]*1.1))
		s.line(at(vec3{}), end, `class="axis" stroke="`+colorBlack+`" stroke-width="1.5" marker-end="url(#arrow-black)"`)
		lp := at(axis(j, box[j]*1.16))
		s.text(point{lp.x, lp.y + 5}, `class="axis-label" text-anchor="middle" font-size="16" font-style="italic" `+halo, axisName(d, j))
	}
	s.line(at(vec3{}), at(hit), `class="ray" `+rayStroke)

	// The faces of P(K) cut off by the box, far ones first.
	type facePoly struct {
		facet   int
		poly    []vec3
		compact bool
		depth   float64
	}
	var polys []facePoly
	byKey := map[string][]vec3{}
	for i, f := range d.Facets {
		poly := facetPolygon(d.Facets, i, box)
		if poly == nil {
			continue
		}
		var c vec3
		for _, p := range poly {
			c = c.add(p)
		}
		polys = append(polys, facePoly{i, poly, len(f.Rays) == 0, viewDepth(c.scale(1/float64(len(poly))), stretch)})
		byKey[faceKey(f.Vertices, f.Rays)] = poly
	}
	sort.SliceStable(polys, func(a, b int) bool { return polys[a].depth < polys[b].depth })
	pf := d.Principal
	principalPoly := byKey[faceKey(pf.Vertices, pf.Rays)]
	compactFaces := 0
	for _, fp := range polys {
		pts := make([]point, len(fp.poly))
		for i, p := range fp.poly {
			pts[i] = at(p)
		}
		// Flat shading by the direction of the face, so that faces meeting
		// at an edge differ in tone.
		f := d.Facets[fp.facet]
		a := vec3{floatInt(f.Normal[0]), floatInt(f.Normal[1]), floatInt(f.Normal[2])}
		tone := a.dot(lightDirection) / a.norm()
		if fp.compact {
			compactFaces++
			s.polygon(pts, `class="compact-face" fill="`+colorGreen+`" fill-opacity="`+num2(0.25+0.4*tone*tone)+`" stroke="none"`)
		} else {
			s.polygon(pts, `class="unbounded-face" fill="`+colorSkyBlue+`" fill-opacity="`+num2(0.08+0.45*tone*tone)+`" stroke="none"`)
		}
		if pf.Dim == 2 && slices.Equal(fp.poly, principalPoly) {
			s.polygon(pts, `class="principal" fill="url(#hatch)" fill-opacity="0.8" stroke="`+colorVermillion+`" stroke-width="3"`)
		}
	}

	// Edges: where two faces meet (arrows where they leave the box), and,
	// thin and dotted, where the box cuts a face.
	type edge struct{ a, b vec3 }
	seen := map[string]bool{}
	var real, cut []edge
	for _, fp := range polys {
		for i, p := range fp.poly {
			q := fp.poly[(i+1)%len(fp.poly)]
			jp, okp := onFrame(p, box)
			jq, okq := onFrame(q, box)
			if okp && okq && jp == jq {
				cut = append(cut, edge{p, q})
				continue
			}
			if okp { // the end on the frame goes last, for the arrow
				p, q = q, p
			}
			key := fmt.Sprintf("%.6f", [2]vec3{p, q})
			if seen[key] {
				continue
			}
			seen[key] = true
			real = append(real, edge{p, q})
		}
	}
	for _, e := range cut {
		s.line(at(e.a), at(e.b), `class="cut" stroke="`+colorBlue+`" stroke-width="1" stroke-opacity="0.6" stroke-dasharray="2 4"`)
	}
	for _, e := range real {
		attrs := `class="edge" ` + boundaryStroke
		if _, ok := onFrame(e.b, box); ok {
			attrs = `class="unbounded-edge" ` + boundaryStroke + ` marker-end="url(#arrow-blue)"`
		}
		s.line(at(e.a), at(e.b), attrs)
	}

	// The principal face if it is an edge or a vertex, the flagged faces,
	// the vertices and the hit point.
	switch {
	case pf.Dim == 1 && pf.Compact:
		s.line(at(intVec3(pf.Vertices[0])), at(intVec3(pf.Vertices[1])), `class="principal" `+principalStroke)
	case pf.Dim == 1:
		v := intVec3(pf.Vertices[0])
		j := slices.Index(d.Vars, pf.Rays[0])
		end := v
		end[j] = box[j]
		s.line(at(v), at(end), `class="principal" `+principalStroke)
	}
	flagged := flaggedFaces(s, d, func(f rlct.FaceReport) []point {
		if f.Dim == 1 {
			return []point{at(intVec3(f.Vertices[0])), at(intVec3(f.Vertices[1]))}
		}
		var pts []point
		for _, p := range byKey[faceKey(f.Vertices, f.Rays)] {
			pts = append(pts, at(p))
		}
		return pts
	})
	if pf.Dim == 0 {
		s.circle(at(intVec3(pf.Vertices[0])), 12, `class="principal" `+principalRing)
	}
	var centroid point
	for _, v := range d.Vertices {
		p := at(intVec3(v.Exponent))
		centroid.x += p.x / float64(len(d.Vertices))
		centroid.y += p.y / float64(len(d.Vertices))
		s.circle(p, 4.5, `class="vertex" `+vertexStyle)
	}
	h := at(hit)
	s.diamond(h, 8, `class="hit" `+hitStyle)
	labels := &labeller{}
	hitLabel(s, h, labels)
	labelVertices(s, d, labels, func(v rlct.VertexReport) []labelSpot {
		// Away from the middle of the vertices, else around the vertex.
		p := at(intVec3(v.Exponent))
		dx, dy := p.x-centroid.x, p.y-centroid.y
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
			{point{p.x + 14*dx, p.y + 14*dy + 5 + 4*dy}, anchor},
			{point{p.x - 10, p.y - 8}, "end"},
			{point{p.x + 10, p.y - 8}, "start"},
			{point{p.x - 10, p.y + 18}, "end"},
			{point{p.x + 10, p.y + 18}, "start"},
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
		legendItem{"hit", sub("t", "τ", "·τ, where the ray meets P(K)")},
	)
	return legend, plotTop + 14 + (vmax-vmin)*k + 10, stretched
}

// axis returns t·e_j.
func axis(j int, t float64) vec3 {
	var v vec3
	v[j] = t
	return v
}

func (p point) dist(q point) float64 { return math.Hypot(p.x-q.x, p.y-q.y) }
