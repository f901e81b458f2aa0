package picture

import (
	"fmt"
	"math"
	"slices"

	"github.com/lctkit/lctkit/rlct"
)

// plot2D draws the Newton polygon of K in two variables into the plot
// square and returns the legend and the lowest page coordinate it used.
func (sc *scene) plot2D(s *svgDoc) ([]legendItem, float64) {
	d := sc.d
	X, Y := float64(sc.box[0]), float64(sc.box[1])
	const left, top, size = plotLeft, plotTop, plotSize
	bottom, right := float64(top+size), float64(left+size)
	at := func(x, y float64) point {
		return point{left + x/X*size, bottom - y/Y*size}
	}
	atInt := func(p []int64) point { return at(float64(p[0]), float64(p[1])) }

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

	// The boundary: the compact edges joined into a chain from the vertex
	// on the vertical unbounded edge to the one on the horizontal, and the
	// two unbounded edges, each stopped at the frame.
	chain := make([]point, len(sc.chain))
	for i, v := range sc.chain {
		chain[i] = atInt(v)
	}
	var up, rightward side
	for _, sh := range sc.shapes {
		if r := sh.sides[0]; r.kind == sideRay {
			if r.b[1] != r.a[1] {
				up = r
			} else {
				rightward = r
			}
		}
	}
	upEnd, rightEnd := atInt(up.b), atInt(rightward.b)

	// The region, cut off at the frame.
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
	pf := sc.pf
	switch {
	case pf.dim == 0:
	case len(pf.rays) == 0:
		s.line(atInt(pf.verts[0]), atInt(pf.verts[1]), `class="principal" `+principalStroke)
	default:
		// Stop short of the frame so that the arrow shows.
		v := atInt(pf.verts[0])
		end := point{v.x, float64(top) + 14}
		if pf.rays[0] == 0 {
			end = point{right - 14, v.y}
		}
		s.line(v, end, `class="principal" `+principalStroke)
	}
	s.line(atInt(up.a), upEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	s.line(atInt(rightward.a), rightEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	if len(chain) > 1 {
		s.polyline(chain, `class="boundary" `+boundaryStroke)
	}
	flagged := sc.flaggedFaces(s, func(f facePicture) []point {
		pts := make([]point, len(f.verts))
		for i, v := range f.verts {
			pts[i] = atInt(v)
		}
		return pts
	})

	// Other exponents, the ray and the hit point, then the vertices on top.
	support := 0
	s.printf(`<g class="support">` + "\n")
	for _, e := range d.Support {
		if isVertex(d, e) || float64(e[0]) > X || float64(e[1]) > Y {
			continue
		}
		s.circle(at(float64(e[0]), float64(e[1])), 3.5, supportStyle)
		support++
	}
	s.printf("</g>\n")
	h := at(float(d.Hit[0]), float(d.Hit[1]))
	s.line(at(0, 0), h, `class="ray" `+rayStroke)
	if pf.dim == 0 {
		s.circle(atInt(pf.verts[0]), 12, `class="principal" `+principalRing)
	}
	for _, v := range sc.verts {
		s.circle(atInt(v), 4.5, `class="vertex" `+vertexStyle)
	}
	s.diamond(h, 8, `class="hit" `+hitStyle)
	labels := &labeller{}
	// Keep clear of the tick labels.
	labels.reserve([4]float64{0, top, left - 2, bottom + 30})
	labels.reserve([4]float64{left, bottom + 2, pageWidth, bottom + 30})
	hitLabel(s, h, labels)
	labelVertices(s, d, labels, func(v rlct.Vertex) []labelSpot {
		p := at(float64(v.Exponent[0]), float64(v.Exponent[1]))
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
	return legend, bottom + 42
}

func isVertex(d *rlct.Description, e []int) bool {
	return slices.ContainsFunc(d.Vertices, func(v rlct.Vertex) bool { return slices.Equal(v.Exponent, e) })
}
