package main

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"unicode/utf8"

	"github.com/lctkit/lctkit/rlct"
)

// frameExtent returns how far the frame reaches along an axis whose
// vertices and hit point reach m: m rounded up plus a quarter (at least one
// lattice step), so the unbounded part shows.
func frameExtent(m float64) float64 {
	m = math.Max(math.Ceil(m-1e-9), 1)
	return m + math.Max(1, math.Ceil(m/4))
}

// draw2D draws the Newton polygon of K in two variables into the plot square
// and returns the legend.
// It also returns the lowest page coordinate used and whether the axes have
// different scales.
func draw2D(s *svgDoc, d *rlct.Description) ([]legendItem, float64, bool) {
	hit := []float64{float(d.Hit[0]), float(d.Hit[1])}
	mx, my := hit[0], hit[1]
	for _, v := range d.Vertices {
		mx = math.Max(mx, float64(v.Exponent[0]))
		my = math.Max(my, float64(v.Exponent[1]))
	}
	X, Y := frameExtent(mx), frameExtent(my)
	stretched := !sameScale(X, Y)
	if !stretched {
		// One scale for both axes keeps the lattice square and the
		// direction of τ true.
		X, Y = math.Max(X, Y), math.Max(X, Y)
	}
	const left, top, size = plotLeft, plotTop, plotSize
	bottom, right := float64(top+size), float64(left+size)
	at := func(x, y float64) point {
		return point{left + x/X*size, bottom - y/Y*size}
	}

	// Lattice grid and tick labels.
	s.printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", colorGrid)
	for _, ax := range []struct {
		extent float64
		line   func(float64) (point, point)
	}{
		{X, func(i float64) (point, point) { return at(i, 0), at(i, Y) }},
		{Y, func(j float64) (point, point) { return at(0, j), at(X, j) }},
	} {
		step := 1
		if size/ax.extent < 8 {
			step = niceStep(ax.extent, 60)
		}
		for i := step; float64(i) <= ax.extent; i += step {
			a, b := ax.line(float64(i))
			s.line(a, b, "")
		}
	}
	s.printf("</g>\n")
	s.printf(`<g class="ticks" font-size="13" fill="%s">`+"\n", colorMuted)
	for i, st := 0, niceStep(X, 10); float64(i) <= X; i += st {
		p := at(float64(i), 0)
		s.text(point{p.x, bottom + 19}, `text-anchor="middle"`, fmt.Sprint(i))
	}
	for j, st := 0, niceStep(Y, 10); float64(j) <= Y; j += st {
		p := at(0, float64(j))
		s.text(point{left - 8, p.y + 4.5}, `text-anchor="end"`, fmt.Sprint(j))
	}
	s.printf("</g>\n")

	// The region, cut off at the frame, and its boundary.
	chain := make([]point, len(d.Vertices))
	for i, v := range d.Vertices { // lexicographic order: x up, y down
		chain[i] = at(float64(v.Exponent[0]), float64(v.Exponent[1]))
	}
	first, last := d.Vertices[0].Exponent, d.Vertices[len(d.Vertices)-1].Exponent
	upEnd := at(float64(first[0]), Y)
	rightEnd := at(X, float64(last[1]))
	region := append([]point{upEnd}, chain...)
	region = append(region, rightEnd, at(X, Y))
	s.polygon(region, `class="region" fill="`+colorSkyBlue+`" fill-opacity="0.35" stroke="none"`)
	// Fade the region out toward the far sides of the frame, where it
	// continues.
	s.printf(`<rect class="fade" x="%d" y="%d" width="%d" height="28" fill="url(#fade-up)"/>`+"\n", left, top, size)
	s.printf(`<rect class="fade" x="%s" y="%d" width="28" height="%d" fill="url(#fade-right)"/>`+"\n", num(right-28), top, size)
	s.printf(`<rect class="frame" x="%d" y="%d" width="%d" height="%d" fill="none" stroke="#999999" stroke-width="1"/>`+"\n", left, top, size, size)
	s.line(at(0, 0), point{right, bottom}, `class="axis" stroke="`+colorBlack+`" stroke-width="1.5"`)
	s.line(at(0, 0), point{left, float64(top)}, `class="axis" stroke="`+colorBlack+`" stroke-width="1.5"`)

	// The principal face goes under the boundary line, as a wide band.
	pf := d.Principal
	switch {
	case pf.Dim == 0:
	case pf.Compact:
		s.line(at2(at, pf.Vertices[0]), at2(at, pf.Vertices[1]), `class="principal" `+principalStroke)
	default:
		// Stop short of the frame so that the arrow shows.
		v := at2(at, pf.Vertices[0])
		end := point{v.x, float64(top) + 14}
		if pf.Rays[0] == d.Vars[0] {
			end = point{right - 14, v.y}
		}
		s.line(v, end, `class="principal" `+principalStroke)
	}
	s.line(chain[0], upEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	s.line(chain[len(chain)-1], rightEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	if len(chain) > 1 {
		s.polyline(chain, `class="boundary" `+boundaryStroke)
	}
	flagged := flaggedFaces(s, d, func(f rlct.FaceReport) []point {
		return []point{at2(at, f.Vertices[0]), at2(at, f.Vertices[1])}
	})

	// Other exponents, the ray and the hit point, then the vertices on top.
	support := 0
	s.printf(`<g class="support">` + "\n")
	for _, e := range d.Support {
		if isVertex(d, e) || float64(e[0]) > X || float64(e[1]) > Y {
			continue
		}
		s.circle(at2(at, e), 3.5, supportStyle)
		support++
	}
	s.printf("</g>\n")
	h := at(hit[0], hit[1])
	s.line(at(0, 0), h, `class="ray" `+rayStroke)
	if pf.Dim == 0 {
		s.circle(at2(at, pf.Vertices[0]), 12, `class="principal" `+principalRing)
	}
	for _, v := range d.Vertices {
		s.circle(at2(at, v.Exponent), 4.5, `class="vertex" `+vertexStyle)
	}
	s.diamond(h, 8, `class="hit" `+hitStyle)
	labels := &labeller{}
	// Keep clear of the tick labels.
	labels.reserve([4]float64{0, top, left - 2, bottom + 30})
	labels.reserve([4]float64{left, bottom + 2, pageWidth, bottom + 30})
	hitLabel(s, h, labels)
	labelVertices(s, d, labels, func(v rlct.VertexReport) []labelSpot {
		p := at2(at, v.Exponent)
		upperRight := labelSpot{point{p.x + 9, p.y - 9}, "start"}
		left := labelSpot{point{p.x - 17, p.y + 5}, "end"}
		below := labelSpot{point{p.x, p.y + 24}, "middle"}
		lowerLeft := labelSpot{point{p.x - 9, p.y + 18}, "end"}
		if v.Exponent[0] == 0 || v.Exponent[1] == 0 {
			// On an axis the edges leave along the axis and away from
			// it, so the upper right is free (inside P(K)).
			return []labelSpot{upperRight, left, below}
		}
		// Below the boundary, outside P(K); beside the ray when it passes
		// close by.
		if distToSegment(p, at(0, 0), h) < 30 {
			if math.Abs(h.x-at(0, 0).x) > math.Abs(h.y-at(0, 0).y) {
				return []labelSpot{below, left, upperRight} // a flat ray
			}
			return []labelSpot{left, below, upperRight} // a steep ray
		}
		return []labelSpot{lowerLeft, left, below, upperRight}
	})

	// Axis titles.
	s.text(point{left + size/2, bottom + 42}, `class="axis-label" text-anchor="middle" font-size="15"`, "exponent of "+axisName(d, 0))
	s.text(point{left - 44, top + size/2}, fmt.Sprintf(`class="axis-label" text-anchor="middle" font-size="15" transform="rotate(-90 %s %s)"`, num(left-44), num(top+size/2)), "exponent of "+axisName(d, 1))

	legend := []legendItem{
		{"region", "Newton polyhedron P(K)"},
		{"continues", "P(K) continues beyond the frame"},
		{"vertex", vertexLegend(labels)},
	}
	if support > 0 {
		legend = append(legend, legendItem{"support", esc(supportLabel(d))})
	}
	legend = append(legend, principalLegend(d))
	legend = append(legend, flagged...)
	legend = append(legend,
		legendItem{"ray", "ray from the origin along τ"},
		legendItem{"hit", sub("t", "τ", "·τ, where the ray meets P(K)")},
	)
	return legend, bottom + 42, stretched
}

// sameScale reports whether axes reaching these extents are drawn to one
// scale: unless the longest is more than three times the shortest, which
// would squeeze the others into a sliver.
func sameScale(extents ...float64) bool {
	return slices.Max(extents) <= 3*slices.Min(extents)
}

// distToSegment is the distance from p to the segment ab.
func distToSegment(p, a, b point) float64 {
	dx, dy := b.x-a.x, b.y-a.y
	t := 0.0
	if l := dx*dx + dy*dy; l > 0 {
		t = math.Max(0, math.Min(1, ((p.x-a.x)*dx+(p.y-a.y)*dy)/l))
	}
	return p.dist(point{a.x + t*dx, a.y + t*dy})
}

// at2 places an integer exponent.
func at2(at func(x, y float64) point, e []int) point {
	return at(float64(e[0]), float64(e[1]))
}

// flaggedFaces marks the compact faces that are degenerate (dotted) or
// undetermined (dashed), given as polygons or segments by where, and returns their legend entries.
func flaggedFaces(s *svgDoc, d *rlct.Description, where func(rlct.FaceReport) []point) []legendItem {
	seen := map[rlct.FaceVerdict]bool{}
	for _, f := range d.Faces {
		if f.Verdict != rlct.Degenerate && f.Verdict != rlct.Undetermined {
			continue
		}
		pts := where(f)
		if len(pts) < 2 {
			continue
		}
		style := `class="` + string(f.Verdict) + `" ` + degenerateStroke
		if f.Verdict == rlct.Undetermined {
			style = `class="` + string(f.Verdict) + `" ` + undeterminedStroke
		}
		if len(pts) == 2 {
			s.line(pts[0], pts[1], style)
		} else {
			s.polygon(pts, `fill="none" `+style)
		}
		seen[f.Verdict] = true
	}
	var out []legendItem
	if seen[rlct.Degenerate] {
		out = append(out, legendItem{"degenerate", "degenerate face: not certified"})
	}
	if seen[rlct.Undetermined] {
		out = append(out, legendItem{"undetermined", "undetermined face: not certified"})
	}
	return out
}

// principalLegend describes how the principal face is drawn.
func principalLegend(d *rlct.Description) legendItem {
	label := esc(fmt.Sprintf("principal face, codim. θ = %d", d.Theta))
	switch {
	case d.Principal.Dim == 0:
		return legendItem{"principal-vertex", label}
	case d.Principal.Dim == 1:
		return legendItem{"principal", label}
	}
	return legendItem{"principal-face", label}
}

// hitLabel writes t_τ·τ beside the hit point, to the upper right unless that
// runs past the page, and reserves its place.
func hitLabel(s *svgDoc, h point, labels *labeller) {
	const width = 40
	pos, anchor := point{h.x + 12, h.y - 12}, "start"
	if h.x+12+width >= pageWidth-4 {
		pos, anchor = point{h.x - 12, h.y - 12}, "end"
	}
	labels.reserve(textBox(pos, anchor, "tτ·τ", 16))
	s.markup(pos, `class="hit-label" font-size="16" text-anchor="`+anchor+`" `+halo, sub("t", "τ", "·τ"))
}

// labeller keeps labels from overlapping, judging their extents from an
// estimate of the text width.
type labeller struct {
	boxes   [][4]float64 // x0, y0, x1, y1
	skipped int
}

// textBox estimates the extent of a label of the font size at p.
func textBox(p point, anchor, text string, size float64) [4]float64 {
	w := float64(utf8.RuneCountInString(text)) * size * 0.62
	x0 := p.x
	switch anchor {
	case "end":
		x0 -= w
	case "middle":
		x0 -= w / 2
	}
	return [4]float64{x0, p.y - 0.8*size, x0 + w, p.y + 0.25*size}
}

func (l *labeller) reserve(b [4]float64) { l.boxes = append(l.boxes, b) }

// fits reports whether b overlaps no label placed so far.
func (l *labeller) fits(b [4]float64) bool {
	for _, o := range l.boxes {
		if b[0] < o[2] && o[0] < b[2] && b[1] < o[3] && o[1] < b[3] {
			return false
		}
	}
	return true
}

// labelSpot is a place for a label: the text position and its anchor.
type labelSpot struct {
	pos    point
	anchor string
}

// labelVertices writes the monomial of each vertex at the first of the
// spots from place that overlaps no label placed so far, those of the
// principal face first; a label with no free spot is left out.
func labelVertices(s *svgDoc, d *rlct.Description, labels *labeller, place func(rlct.VertexReport) []labelSpot) {
	principal := func(v rlct.VertexReport) bool {
		return slices.ContainsFunc(d.Principal.Vertices, func(w []int) bool { return slices.Equal(v.Exponent, w) })
	}
	for _, first := range []bool{true, false} {
		for _, v := range d.Vertices {
			if principal(v) != first {
				continue
			}
			text := monomialLabel(d.Vars, v.Exponent)
			placed := false
			for _, spot := range place(v) {
				b := textBox(spot.pos, spot.anchor, text, 16)
				if !labels.fits(b) {
					continue
				}
				labels.reserve(b)
				s.text(spot.pos, `class="vertex-label" font-size="16" text-anchor="`+spot.anchor+`" `+halo, text)
				placed = true
				break
			}
			if !placed {
				labels.skipped++
			}
		}
	}
}

// vertexLegend explains the vertex marks, and says when labels were left
// out for room.
func vertexLegend(labels *labeller) string {
	if labels.skipped > 0 {
		return "vertex; some labels left out"
	}
	return "vertex (label: its monomial)"
}

// axisName is the variable of axis i, shifted when the point is not 0.
func axisName(d *rlct.Description, i int) string {
	if d.Point[i].Sign() == 0 {
		return d.Vars[i]
	}
	return "(" + d.Vars[i] + " − " + d.Point[i].RatString() + ")"
}

func supportLabel(d *rlct.Description) string {
	if d.Form == "sum-of-squares" {
		return "2 × another generator exponent"
	}
	return "other exponent of K"
}

func isVertex(d *rlct.Description, e []int) bool {
	return slices.ContainsFunc(d.Vertices, func(v rlct.VertexReport) bool { return slices.Equal(v.Exponent, e) })
}

// faceKey identifies a face by its vertices and rays.
func faceKey(vertices [][]int, rays []string) string {
	var b strings.Builder
	for _, v := range vertices {
		fmt.Fprint(&b, v)
	}
	b.WriteString("|" + strings.Join(rays, ","))
	return b.String()
}
