package picture

import (
	"fmt"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
)

// Page layout, in pixels. The picture is 600 px wide; the plot is a square
// under the title, with the legend and the caption below it.
const (
	pageWidth   = 600
	plotLeft    = 72
	plotTop     = 78
	plotSize    = 470
	legendRow   = 22
	captionLine = 21
)

// legendItem is one entry of the legend: a swatch drawn by kind and a label
// given as markup.
type legendItem struct {
	kind  string
	label string
}

// page lays out the page around the 2-D or 3-D plot.
func (sc *scene) page(title string) []byte {
	d := sc.d
	var body svg.Doc
	var legend []legendItem
	var bottom float64 // the lowest point of the plot and its labels
	if sc.n == 2 {
		legend, bottom = sc.plot2D(&body)
	} else {
		legend, bottom = sc.plot3D(&body)
	}

	var s svg.Doc
	y := bottom + 32
	legendTop := y
	rows := (len(legend) + 1) / 2
	y += float64(rows*legendRow) + 16
	captionTop := y
	caption := captionLines(d, sc.stretched)
	height := captionTop + float64(len(caption)*captionLine) + 12

	s.Printf(`<svg xmlns="http://www.w3.org/2000/svg" width="%d" height="%s" viewBox="0 0 %d %s" font-family="%s">`+"\n",
		pageWidth, svg.Num(height), pageWidth, svg.Num(height), svg.FontFamily)
	s.Printf("<title>%s</title>\n", svg.Esc("Newton polyhedron of "+svg.Shorten(title, 200)))
	s.Printf(`<defs>` + "\n")
	for _, m := range []struct{ id, color string }{{"arrow-blue", svg.ColorBlue}, {"arrow-black", svg.ColorBlack}, {"arrow-vermillion", svg.ColorVermillion}} {
		s.Printf(`<marker id="%s" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="10" markerHeight="10" orient="auto" markerUnits="userSpaceOnUse"><path d="M0,0 L10,5 L0,10 z" fill="%s"/></marker>`+"\n", m.id, m.color)
	}
	s.Printf(`<linearGradient id="fade-up" x1="0" y1="1" x2="0" y2="0"><stop offset="0" stop-color="#FFFFFF" stop-opacity="0"/><stop offset="1" stop-color="#FFFFFF" stop-opacity="0.9"/></linearGradient>` + "\n")
	s.Printf(`<linearGradient id="fade-right" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#FFFFFF" stop-opacity="0"/><stop offset="1" stop-color="#FFFFFF" stop-opacity="0.9"/></linearGradient>` + "\n")
	s.Printf(`<pattern id="hatch" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="7" stroke="%s" stroke-width="2.5"/></pattern>`+"\n", svg.ColorVermillion)
	s.Printf("</defs>\n")
	s.Printf(`<rect width="100%%" height="100%%" fill="#FFFFFF"/>` + "\n")

	s.Text(point{X: pageWidth / 2, Y: 30}, `class="title" text-anchor="middle" font-size="18" font-weight="bold"`, svg.Shorten(title, 48))
	s.Text(point{X: pageWidth / 2, Y: 53}, `class="subtitle" text-anchor="middle" font-size="14" fill="`+svg.ColorMuted+`"`, svg.Shorten(subtitle(d), 72))
	s.WriteString(body.String())

	s.Printf(`<g class="legend" font-size="13">` + "\n")
	for i, it := range legend {
		x := 20.0 + float64(i%2)*290
		ly := legendTop + float64(i/2)*legendRow
		legendSwatch(&s, it.kind, point{X: x, Y: ly - 4.5})
		s.Markup(point{X: x + 42, Y: ly}, `class="legend-label"`, it.label)
	}
	s.Printf("</g>\n")

	s.Printf(`<g class="caption">` + "\n")
	for i, c := range caption {
		s.Markup(point{X: 24, Y: captionTop + float64(i*captionLine)}, c.attrs, c.markup)
	}
	s.Printf("</g>\n</svg>\n")
	return []byte(s.String())
}

// subtitle says where the polyhedron lives.
func subtitle(d *rlct.Description) string {
	names := make([]string, len(d.Vars))
	for i := range d.Vars {
		names[i] = strings.Trim(axisName(d, i), "()")
	}
	parts := []string{"Newton polyhedron P(K), exponents of " + strings.Join(names, ", ")}
	if allZero(d.Point) {
		parts[0] += " at the origin"
	}
	var prior []string
	for i, h := range d.Prior {
		if h.Sign() != 0 {
			prior = append(prior, d.Vars[i]+"="+h.RatString())
		}
	}
	if prior != nil {
		parts = append(parts, "prior "+strings.Join(prior, ","))
	}
	if d.Form == "sum-of-squares" {
		parts = append(parts, "P(K) = 2·P(g)")
	}
	return strings.Join(parts, "; ")
}

// legendSwatch draws the sample for a legend entry centred vertically at c.Y,
// starting at c.X and 34 px wide.
func legendSwatch(s *svg.Doc, kind string, c point) {
	a, b := point{X: c.X, Y: c.Y}, point{X: c.X + 34, Y: c.Y}
	switch kind {
	case "region":
		s.Printf(`<rect x="%s" y="%s" width="34" height="14" fill="%s" fill-opacity="0.35" stroke="%s" stroke-width="2"/>`+"\n",
			svg.Num(c.X), svg.Num(c.Y-7), svg.ColorSkyBlue, svg.ColorBlue)
	case "unbounded-face":
		s.Printf(`<rect x="%s" y="%s" width="34" height="14" fill="%s" fill-opacity="0.18" stroke="%s" stroke-width="1" stroke-dasharray="2 3"/>`+"\n",
			svg.Num(c.X), svg.Num(c.Y-7), svg.ColorSkyBlue, svg.ColorBlue)
	case "compact-face":
		s.Printf(`<rect x="%s" y="%s" width="34" height="14" fill="%s" fill-opacity="0.5" stroke="%s" stroke-width="2"/>`+"\n",
			svg.Num(c.X), svg.Num(c.Y-7), svg.ColorGreen, svg.ColorBlue)
	case "continues":
		s.Line(a, b, `stroke="`+svg.ColorBlue+`" stroke-width="2.5" marker-end="url(#arrow-blue)"`)
	case "principal":
		s.Line(a, b, principalStroke)
	case "principal-face":
		s.Printf(`<rect x="%s" y="%s" width="34" height="14" fill="url(#hatch)" stroke="%s" stroke-width="2"/>`+"\n",
			svg.Num(c.X), svg.Num(c.Y-7), svg.ColorVermillion)
	case "principal-vertex":
		s.Circle(point{X: c.X + 17, Y: c.Y}, 10, principalRing)
		s.Circle(point{X: c.X + 17, Y: c.Y}, 4.5, vertexStyle)
	case "degenerate":
		s.Line(a, b, degenerateStroke)
	case "undetermined":
		s.Line(a, b, undeterminedStroke)
	case "ray":
		s.Line(a, b, rayStroke)
	case "hit":
		s.Diamond(point{X: c.X + 17, Y: c.Y}, 8, hitStyle)
	case "vertex":
		s.Circle(point{X: c.X + 17, Y: c.Y}, 4.5, vertexStyle)
	case "support":
		s.Circle(point{X: c.X + 17, Y: c.Y}, 3.5, supportStyle)
	}
}

// Styles shared by the 2-D and 3-D drawings.
const (
	boundaryStroke     = `stroke="` + svg.ColorBlue + `" stroke-width="2.5" stroke-linejoin="round"`
	principalStroke    = `stroke="` + svg.ColorVermillion + `" stroke-width="8" stroke-linecap="round" stroke-opacity="0.9"`
	principalRing      = `fill="none" stroke="` + svg.ColorVermillion + `" stroke-width="4"`
	degenerateStroke   = `stroke="` + svg.ColorPurple + `" stroke-width="5" stroke-linecap="round" stroke-dasharray="0.1 9"`
	undeterminedStroke = `stroke="` + svg.ColorPurple + `" stroke-width="4" stroke-dasharray="10 5"`
	rayStroke          = `stroke="` + svg.ColorBlack + `" stroke-width="2" stroke-dasharray="8 5"`
	hitStyle           = `fill="` + svg.ColorYellow + `" stroke="` + svg.ColorBlack + `" stroke-width="2"`
	vertexStyle        = `fill="` + svg.ColorBlack + `"`
	supportStyle       = `fill="#FFFFFF" stroke="` + svg.ColorMuted + `" stroke-width="1.5"`
)

// captionText is one caption line.
type captionText struct {
	attrs, markup string
}

// captionLines states λ, θ, the status and where they come from, and warns
// when the axes are drawn to different scales.
func captionLines(d *rlct.Description, stretched bool) []captionText {
	lines := []captionText{{
		`class="caption-result" font-size="18" font-weight="bold"`,
		svg.Esc(fmt.Sprintf("λ = %s\u2003\u2003θ = %d\u2003\u2003%s", d.Lambda.RatString(), d.Theta, statusWord(d.Status))),
	}}
	plain := `class="caption-text" font-size="14"`
	lines = append(lines,
		captionText{plain, svg.Esc("The ray along τ = ("+ratList(d.Weights)+") meets P(K) at ") + svg.Sub("t", "τ", "·τ = ("+ratList(d.Hit)+"),")},
		captionText{plain, svg.Esc("so ") + svg.Sub("t", "τ", " = "+d.Distance.RatString()+" and λ = 1/") + svg.Sub("t", "τ", " = "+d.Lambda.RatString()+"; θ is the codimension of the principal face.")},
	)
	var why string
	switch d.Status {
	case rlct.Exact:
		why = "Exact: every compact face is nondegenerate (face polynomial without zeros in the real torus)."
	case rlct.UpperBound:
		why = "Upper bound only (the true λ is at most this; at equal λ the true θ is at least this): " + upperBoundWhy(d) + "; see lctkit faces for the details."
	default:
		why = "Not a bound: this value of a truncated series may lie below the true λ; " + upperBoundWhy(d) + "; see lctkit bound for the order that would certify it."
	}
	if stretched {
		why += " The axes are drawn to different scales."
	}
	for _, l := range svg.Wrap(why, 74) {
		lines = append(lines, captionText{plain, svg.Esc(l)})
	}
	return lines
}

// statusWord names the status as the caption states it.
func statusWord(s rlct.Status) string {
	switch s {
	case rlct.Exact:
		return "exact"
	case rlct.UpperBound:
		return "upper bound"
	}
	return "NOT A BOUND"
}

// upperBoundWhy summarises the reasons for an upper bound in a few words.
func upperBoundWhy(d *rlct.Description) string {
	var degenerate, undetermined int
	for _, f := range d.Faces {
		switch f.Verdict {
		case rlct.Degenerate:
			degenerate++
		case rlct.Undetermined:
			undetermined++
		}
	}
	var parts []string
	if degenerate > 0 {
		parts = append(parts, plural(degenerate, "compact face is", "compact faces are")+" degenerate (dotted)")
	}
	if undetermined > 0 {
		parts = append(parts, plural(undetermined, "compact face is", "compact faces are")+" undetermined (dashed)")
	}
	if d.Truncation != nil && !d.Truncation.Faces {
		parts = append(parts, "the truncated series is not certified long enough")
	}
	if d.Certificate != nil && d.Certificate.Stop == rlct.StopBudget {
		parts = append(parts, "the face budget was reached")
	}
	if len(parts) == 0 && len(d.Reasons) > 0 {
		parts = append(parts, svg.Shorten(d.Reasons[0], 120))
	}
	return strings.Join(parts, "; ")
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// axisName is the variable of axis i, shifted when the point is not 0.
func axisName(d *rlct.Description, i int) string {
	if d.Point[i].Sign() == 0 {
		return d.Vars[i]
	}
	return "(" + d.Vars[i] + " − " + d.Point[i].RatString() + ")"
}

func allZero(xs []*big.Rat) bool {
	for _, x := range xs {
		if x.Sign() != 0 {
			return false
		}
	}
	return true
}

// float converts an exact rational to a drawing coordinate.
func float(r *big.Rat) float64 {
	f, _ := r.Float64()
	return f
}
