package picture

import (
	"fmt"
	"math"
	"slices"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
)

// plot2D draws the Newton polygon of K in two variables into the plot
// square and returns the legend and the lowest page coordinate it used.
func (sc *scene) plot2D(s *svg.Doc) ([]legendItem, float64) {
	d := sc.d
	X, Y := float64(sc.box[0]), float64(sc.box[1])
	const left, top, size = plotLeft, plotTop, plotSize
	bottom, right := float64(top+size), float64(left+size)
	at := func(x, y float64) point {
		return point{X: left + x/X*size, Y: bottom - y/Y*size}
	}
	atInt := func(p []int64) point { return at(float64(p[0]), float64(p[1])) }

	// Lattice grid and tick labels.
	s.Printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", svg.ColorGrid)
	for _, ax := range []struct {
		extent float64
		line   func(float64) (point, point)
	}{
		{X, func(i float64) (point, point) { return at(i, 0), at(i, Y) }},
		{Y, func(j float64) (point, point) { return at(0, j), at(X, j) }},
	} {
		step := 1
		if size/ax.extent < 8 {
			step = svg.NiceStep(ax.extent, 60)
		}
		for i := step; float64(i) <= ax.extent; i += step {
			a, b := ax.line(float64(i))
			s.Line(a, b, "")
		}
	}
	s.Printf("</g>\n")
	s.Printf(`<g class="ticks" font-size="13" fill="%s">`+"\n", svg.ColorMuted)
	for i, st := 0, svg.NiceStep(X, 10); float64(i) <= X; i += st {
		p := at(float64(i), 0)
		s.Text(point{X: p.X, Y: bottom + 19}, `text-anchor="middle"`, fmt.Sprint(i))
	}
	for j, st := 0, svg.NiceStep(Y, 10); float64(j) <= Y; j += st {
		p := at(0, float64(j))
		s.Text(point{X: left - 8, Y: p.Y + 4.5}, `text-anchor="end"`, fmt.Sprint(j))
	}
	s.Printf("</g>\n")

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
	s.Polygon(region, `class="region" fill="`+svg.ColorSkyBlue+`" fill-opacity="0.35" stroke="none"`)
	// Fade the region out toward the far sides of the frame, where it
	// continues.
	s.Printf(`<rect class="fade" x="%d" y="%d" width="%d" height="28" fill="url(#fade-up)"/>`+"\n", left, top, size)
	s.Printf(`<rect class="fade" x="%s" y="%d" width="28" height="%d" fill="url(#fade-right)"/>`+"\n", svg.Num(right-28), top, size)
	s.Printf(`<rect class="frame" x="%d" y="%d" width="%d" height="%d" fill="none" stroke="#999999" stroke-width="1"/>`+"\n", left, top, size, size)
	s.Line(at(0, 0), point{X: right, Y: bottom}, `class="axis" stroke="`+svg.ColorBlack+`" stroke-width="1.5"`)
	s.Line(at(0, 0), point{X: left, Y: float64(top)}, `class="axis" stroke="`+svg.ColorBlack+`" stroke-width="1.5"`)

	// The principal face goes under the boundary line, as a wide band.
	pf := sc.pf
	switch {
	case pf.dim == 0:
	case len(pf.rays) == 0:
		s.Line(atInt(pf.verts[0]), atInt(pf.verts[1]), `class="principal" `+principalStroke)
	default:
		// Stop short of the frame so that the arrow shows.
		v := atInt(pf.verts[0])
		end := point{X: v.X, Y: float64(top) + 14}
		if pf.rays[0] == 0 {
			end = point{X: right - 14, Y: v.Y}
		}
		s.Line(v, end, `class="principal" `+principalStroke)
	}
	s.Line(atInt(up.a), upEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	s.Line(atInt(rightward.a), rightEnd, `class="unbounded-edge" `+boundaryStroke+` marker-end="url(#arrow-blue)"`)
	if len(chain) > 1 {
		s.Polyline(chain, `class="boundary" `+boundaryStroke)
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
	s.Printf(`<g class="support">` + "\n")
	for _, e := range d.Support {
		if isVertex(d, e) || float64(e[0]) > X || float64(e[1]) > Y {
			continue
		}
		s.Circle(at(float64(e[0]), float64(e[1])), 3.5, supportStyle)
		support++
	}
	s.Printf("</g>\n")
	h := at(float(d.Hit[0]), float(d.Hit[1]))
	s.Line(at(0, 0), h, `class="ray" `+rayStroke)
	if pf.dim == 0 {
		s.Circle(atInt(pf.verts[0]), 12, `class="principal" `+principalRing)
	}
	for _, v := range sc.verts {
		s.Circle(atInt(v), 4.5, `class="vertex" `+vertexStyle)
	}
	s.Diamond(h, 8, `class="hit" `+hitStyle)
	labels := &labeller{}
	// Keep clear of the tick labels.
	labels.reserve([4]float64{0, top, left - 2, bottom + 30})
	labels.reserve([4]float64{left, bottom + 2, pageWidth, bottom + 30})
	hitLabel(s, h, labels)
	labelVertices(s, d, labels, func(v rlct.Vertex) []labelSpot {
		p := at(float64(v.Exponent[0]), float64(v.Exponent[1]))
		upperRight := labelSpot{point{X: p.X + 9, Y: p.Y - 9}, "start"}
		left := labelSpot{point{X: p.X - 17, Y: p.Y + 5}, "end"}
		below := labelSpot{point{X: p.X, Y: p.Y + 24}, "middle"}
		lowerLeft := labelSpot{point{X: p.X - 9, Y: p.Y + 18}, "end"}
		if v.Exponent[0] == 0 || v.Exponent[1] == 0 {
			// On an axis the edges leave along the axis and away from
			// it, so the upper right is free (inside P(K)).
			return []labelSpot{upperRight, left, below}
		}
		// Below the boundary, outside P(K); beside the ray when it passes
		// close by.
		if distToSegment(p, at(0, 0), h) < 30 {
			if math.Abs(h.X-at(0, 0).X) > math.Abs(h.Y-at(0, 0).Y) {
				return []labelSpot{below, left, upperRight} // a flat ray
			}
			return []labelSpot{left, below, upperRight} // a steep ray
		}
		return []labelSpot{lowerLeft, left, below, upperRight}
	})

	// Axis titles.
	s.Text(point{X: left + size/2, Y: bottom + 42}, `class="axis-label" text-anchor="middle" font-size="15"`, "exponent of "+axisName(d, 0))
	s.Text(point{X: left - 44, Y: top + size/2}, fmt.Sprintf(`class="axis-label" text-anchor="middle" font-size="15" transform="rotate(-90 %s %s)"`, svg.Num(left-44), svg.Num(top+size/2)), "exponent of "+axisName(d, 1))

	legend := []legendItem{
		{"region", "Newton polyhedron P(K)"},
		{"continues", "P(K) continues beyond the frame"},
		{"vertex", vertexLegend(labels)},
	}
	if support > 0 {
		legend = append(legend, legendItem{"support", svg.Esc(supportLabel(d))})
	}
	legend = append(legend, principalLegend(d))
	legend = append(legend, flagged...)
	legend = append(legend,
		legendItem{"ray", "ray from the origin along τ"},
		legendItem{"hit", svg.Sub("t", "τ", "·τ, where the ray meets P(K)")},
	)
	return legend, bottom + 42
}

func isVertex(d *rlct.Description, e []int) bool {
	return slices.ContainsFunc(d.Vertices, func(v rlct.Vertex) bool { return slices.Equal(v.Exponent, e) })
}
