package picture

import (
	"fmt"
	"math"
	"slices"
	"unicode/utf8"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
)

// flaggedFaces marks the compact faces that are degenerate (dotted) or
// undetermined (dashed), placed on the page by where as a segment or a
// polygon, and returns their legend entries.
func (sc *scene) flaggedFaces(s *svg.Doc, where func(facePicture) []point) []legendItem {
	seen := map[rlct.FaceVerdict]bool{}
	for _, f := range sc.flags {
		pts := where(f.face)
		if len(pts) < 2 {
			continue
		}
		style := `class="` + string(f.verdict) + `" ` + degenerateStroke
		if f.verdict == rlct.Undetermined {
			style = `class="` + string(f.verdict) + `" ` + undeterminedStroke
		}
		if len(pts) == 2 {
			s.Line(pts[0], pts[1], style)
		} else {
			s.Polygon(pts, `fill="none" `+style)
		}
		seen[f.verdict] = true
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
	label := svg.Esc(fmt.Sprintf("principal face, codim. θ = %d", d.Theta))
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
func hitLabel(s *svg.Doc, h point, labels *labeller) {
	const width = 40
	pos, anchor := point{X: h.X + 12, Y: h.Y - 12}, "start"
	if h.X+12+width >= pageWidth-4 {
		pos, anchor = point{X: h.X - 12, Y: h.Y - 12}, "end"
	}
	labels.reserve(textBox(pos, anchor, "tτ·τ", 16))
	s.Markup(pos, `class="hit-label" font-size="16" text-anchor="`+anchor+`" `+svg.Halo, svg.Sub("t", "τ", "·τ"))
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
	x0 := p.X
	switch anchor {
	case "end":
		x0 -= w
	case "middle":
		x0 -= w / 2
	}
	return [4]float64{x0, p.Y - 0.8*size, x0 + w, p.Y + 0.25*size}
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
func labelVertices(s *svg.Doc, d *rlct.Description, labels *labeller, place func(rlct.Vertex) []labelSpot) {
	principal := func(v rlct.Vertex) bool {
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
				s.Text(spot.pos, `class="vertex-label" font-size="16" text-anchor="`+spot.anchor+`" `+svg.Halo, text)
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

func supportLabel(d *rlct.Description) string {
	if d.Form == "sum-of-squares" {
		return "2 × another generator exponent"
	}
	return "other exponent of K"
}

// distToSegment is the distance from p to the segment ab.
func distToSegment(p, a, b point) float64 {
	dx, dy := b.X-a.X, b.Y-a.Y
	t := 0.0
	if l := dx*dx + dy*dy; l > 0 {
		t = math.Max(0, math.Min(1, ((p.X-a.X)*dx+(p.Y-a.Y)*dy)/l))
	}
	return p.Dist(point{X: a.X + t*dx, Y: a.Y + t*dy})
}
