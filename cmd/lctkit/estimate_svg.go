package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/internal/svg"
)

// Layout of the estimate plot, in pixels: 600 px wide, the plot under the
// title, the legend and the caption below it.
const (
	curveWidth  = 600
	curveLeft   = 80.0
	curveRight  = 574.0
	curveTop    = 74.0
	curveBottom = 384.0
)

// Styles of the estimate plot (Okabe–Ito colours, and each element also
// differs by marker or line style).
const (
	pointStyle    = `fill="` + svg.ColorBlue + `" stroke="#FFFFFF" stroke-width="1"`
	errorBarStyle = `stroke="` + svg.ColorBlue + `" stroke-width="1.6"`
	fitStyle      = `stroke="` + svg.ColorVermillion + `" stroke-width="2.2" stroke-linejoin="round"`
	limitStyle    = `stroke="` + svg.ColorVermillion + `" stroke-width="1.5" stroke-dasharray="2 4"`
	limitBand     = `fill="` + svg.ColorOrange + `" fill-opacity="0.22"`
	boundStyle    = `stroke="` + svg.ColorBlack + `" stroke-width="2" stroke-dasharray="9 5"`
)

// estimatePlot draws n·E_n[K] against n (log scale) with error bars, the
// fitted curve, the fitted limit λ̂ ± se as a band and the Newton bound as a
// dashed horizontal line labelled with its status.
func estimatePlot(r *estimateResult) string {
	e := r.est
	var boundValue float64
	hasBound := r.bound != nil
	if hasBound {
		boundValue, _ = r.bound.Lambda.Float64()
	}

	// Ranges: x is log10 n over the grid; y holds the points with their
	// error bars, the fit on the grid, the band and the bound.
	xlo, xhi := math.Inf(1), math.Inf(-1)
	ylo, yhi := math.Inf(1), math.Inf(-1)
	widen := func(v float64) {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			ylo, yhi = math.Min(ylo, v), math.Max(yhi, v)
		}
	}
	for _, p := range e.Points {
		x := math.Log10(p.N)
		xlo, xhi = math.Min(xlo, x), math.Max(xhi, x)
		widen(p.Y - p.SE)
		widen(p.Y + p.SE)
		widen(e.Curve(p.N))
	}
	widen(e.Lambda - e.LambdaSE)
	widen(e.Lambda + e.LambdaSE)
	if hasBound {
		widen(boundValue)
	}
	if math.IsInf(xlo, 0) { // no points: cannot happen for a finished estimate
		xlo, xhi = 0, 1
	}
	if math.IsInf(ylo, 0) {
		ylo, yhi = 0, 1
	}
	if yhi-ylo < 1e-9 {
		ylo, yhi = ylo-0.5, yhi+0.5
	}
	pad := 0.08 * (yhi - ylo)
	ylo, yhi = ylo-pad, yhi+pad
	xpad := 0.04 * (xhi - xlo)
	xlo, xhi = xlo-xpad, xhi+xpad

	px := func(logn float64) float64 { return curveLeft + (logn-xlo)/(xhi-xlo)*(curveRight-curveLeft) }
	py := func(y float64) float64 { return curveBottom - (y-ylo)/(yhi-ylo)*(curveBottom-curveTop) }
	clampY := func(y float64) float64 { return math.Max(curveTop-2, math.Min(curveBottom+2, y)) }

	var s svg.Doc
	// The caption first, to know the height of the page.
	caption := estimateCaption(r, hasBound)
	legendTop := curveBottom + 64
	legend := []legendItem{
		{"estimate-points", "n·E<tspan dy=\"0.3em\" font-size=\"75%\">n</tspan><tspan dy=\"-0.3em\">[K] ± se (nested sampling)</tspan>"},
		{"estimate-fit", svg.Esc("fit λ̂ − (θ̂−1)/(log n + b)")},
		{"estimate-limit", svg.Esc("fitted limit λ̂ ± se")},
	}
	if hasBound {
		legend = append(legend, legendItem{"estimate-bound", svg.Esc("Newton bound λ = " + r.bound.Lambda.RatString() + " (" + boundStatus(r.bound) + ")")})
	}
	rows := (len(legend) + 1) / 2
	captionTop := legendTop + float64(rows)*legendRow + 20
	height := captionTop + float64(len(caption))*captionLine + 10

	s.Printf(`<svg xmlns="http://www.w3.org/2000/svg" width="%d" height="%s" viewBox="0 0 %d %s" font-family="%s">`+"\n",
		curveWidth, svg.Num(height), curveWidth, svg.Num(height), svg.FontFamily)
	s.Printf("<title>%s</title>\n", svg.Esc("Numerical estimate of λ for "+svg.Shorten(r.title, 200)))
	s.Printf(`<defs><clipPath id="plot-area"><rect x="%s" y="%s" width="%s" height="%s"/></clipPath></defs>`+"\n",
		svg.Num(curveLeft), svg.Num(curveTop), svg.Num(curveRight-curveLeft), svg.Num(curveBottom-curveTop))
	s.Printf(`<rect width="100%%" height="100%%" fill="#FFFFFF"/>` + "\n")
	s.Text(point{X: curveWidth / 2, Y: 28}, `class="title" text-anchor="middle" font-size="17" font-weight="bold"`,
		svg.Shorten("Estimate of λ for "+r.title, 56))
	s.Text(point{X: curveWidth / 2, Y: 50}, `class="subtitle" text-anchor="middle" font-size="13" fill="`+svg.ColorMuted+`"`,
		fmt.Sprintf("numerical estimate, not a proof · %d live points × %d runs · seed %d", e.Live, e.Runs, r.seed))

	// Grid and axes.
	s.Printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", svg.ColorGrid)
	ystep := tickStep(yhi-ylo, 8)
	var yticks []float64
	for v := math.Ceil(ylo/ystep) * ystep; v <= yhi+1e-12; v += ystep {
		yticks = append(yticks, v)
		s.Line(point{X: curveLeft, Y: py(v)}, point{X: curveRight, Y: py(v)}, "")
	}
	var xticks []int
	for k := int(math.Ceil(xlo)); float64(k) <= xhi; k++ {
		xticks = append(xticks, k)
		s.Line(point{X: px(float64(k)), Y: curveTop}, point{X: px(float64(k)), Y: curveBottom}, "")
	}
	s.Printf("</g>\n")
	s.Printf(`<rect class="frame" x="%s" y="%s" width="%s" height="%s" fill="none" stroke="%s" stroke-width="1.2"/>`+"\n",
		svg.Num(curveLeft), svg.Num(curveTop), svg.Num(curveRight-curveLeft), svg.Num(curveBottom-curveTop), svg.ColorBlack)
	s.Printf(`<g class="ticks" font-size="13">` + "\n")
	yDec := max(0, -int(math.Floor(math.Log10(ystep)+1e-9)))
	for _, v := range yticks {
		label := strconv.FormatFloat(v, 'f', yDec, 64)
		if strings.Trim(label, "-0.") == "" {
			label = strconv.FormatFloat(0, 'f', yDec, 64)
		}
		s.Text(point{X: curveLeft - 8, Y: py(v) + 4.5}, `class="y-tick" text-anchor="end"`, label)
	}
	for _, k := range xticks {
		s.Text(point{X: px(float64(k)), Y: curveBottom + 20}, `class="x-tick" text-anchor="middle"`, "10"+signedSuperscript(k))
	}
	s.Printf("</g>\n")
	s.Text(point{X: (curveLeft + curveRight) / 2, Y: curveBottom + 44}, `class="x-axis-label" text-anchor="middle" font-size="14"`,
		"n (log scale, in the units of K)")
	s.Markup(point{X: 22, Y: (curveTop + curveBottom) / 2},
		fmt.Sprintf(`class="y-axis-label" text-anchor="middle" font-size="14" transform="rotate(-90 22 %s)"`, svg.Num((curveTop+curveBottom)/2)),
		`n·E<tspan dy="0.3em" font-size="75%">n</tspan><tspan dy="-0.3em">[K]</tspan>`)

	// The fitted limit band and line, the fitted curve, the bound, the points.
	s.Printf(`<g clip-path="url(#plot-area)">` + "\n")
	if e.LambdaSE > 0 && !math.IsInf(e.LambdaSE, 0) {
		top, bot := clampY(py(e.Lambda+e.LambdaSE)), clampY(py(e.Lambda-e.LambdaSE))
		s.Printf(`<rect class="limit-band" x="%s" y="%s" width="%s" height="%s" %s/>`+"\n",
			svg.Num(curveLeft), svg.Num(top), svg.Num(curveRight-curveLeft), svg.Num(math.Max(bot-top, 1)), limitBand)
	}
	s.Line(point{X: curveLeft, Y: clampY(py(e.Lambda))}, point{X: curveRight, Y: clampY(py(e.Lambda))}, `class="limit" `+limitStyle)
	var fit []point
	const steps = 120
	lo, hi := math.Log10(e.Points[0].N), math.Log10(e.Points[len(e.Points)-1].N)
	for i := 0; i <= steps; i++ {
		x := lo + (hi-lo)*float64(i)/steps
		y := e.Curve(math.Pow(10, x))
		if math.IsNaN(y) || math.IsInf(y, 0) {
			continue
		}
		fit = append(fit, point{X: px(x), Y: clampY(py(y))})
	}
	s.Polyline(fit, `class="fit" `+fitStyle)
	if hasBound {
		s.Line(point{X: curveLeft, Y: py(boundValue)}, point{X: curveRight, Y: py(boundValue)}, `class="bound" `+boundStyle)
	}
	for _, p := range e.Points {
		x := px(math.Log10(p.N))
		a, b := py(p.Y-p.SE), py(p.Y+p.SE)
		s.Printf(`<g class="error-bar">`)
		s.Line(point{X: x, Y: a}, point{X: x, Y: b}, errorBarStyle)
		s.Line(point{X: x - 4, Y: a}, point{X: x + 4, Y: a}, errorBarStyle)
		s.Line(point{X: x - 4, Y: b}, point{X: x + 4, Y: b}, errorBarStyle)
		s.Printf("</g>\n")
	}
	for _, p := range e.Points {
		s.Circle(point{X: px(math.Log10(p.N)), Y: py(p.Y)}, 3.8, `class="point" `+pointStyle)
	}
	s.Printf("</g>\n")
	if hasBound {
		label := "Newton bound λ = " + r.bound.Lambda.RatString() + ", " + boundStatus(r.bound)
		// Above the line, or below it when the line is near the top.
		y := py(boundValue) - 7
		if y < curveTop+16 {
			y = py(boundValue) + 18
		}
		s.Text(point{X: curveRight - 8, Y: y}, `class="bound-label" text-anchor="end" font-size="13" `+svg.Halo, label)
	}

	// Legend and caption.
	s.Printf(`<g class="legend" font-size="13">` + "\n")
	for i, it := range legend {
		x := 24.0 + float64(i%2)*276
		ly := legendTop + float64(i/2)*legendRow
		estimateSwatch(&s, it.kind, point{X: x, Y: ly - 4.5})
		s.Markup(point{X: x + 42, Y: ly}, `class="legend-label"`, it.label)
	}
	s.Printf("</g>\n")
	s.Printf(`<g class="caption">` + "\n")
	for i, c := range caption {
		s.Markup(point{X: 24, Y: captionTop + float64(i)*captionLine}, c.attrs, c.markup)
	}
	s.Printf("</g>\n</svg>\n")
	return s.String()
}

// estimateCaption states the estimate, the bound, the verdict and the
// caution.
func estimateCaption(r *estimateResult, hasBound bool) []captionText {
	e := r.est
	lines := []captionText{{
		`class="caption-result" font-size="16" font-weight="bold"`,
		svg.Esc(fmt.Sprintf("λ̂ = %s\u2003θ̂ = %s\u2003(estimate)", plusMinus(e.Lambda, e.LambdaSE), plusMinus(e.Theta, e.ThetaSE))),
	}}
	plain := `class="caption-text" font-size="14"`
	muted := `class="caption-caution" font-size="13" fill="` + svg.ColorMuted + `"`
	if hasBound {
		lines = append(lines, captionText{plain, svg.Esc(fmt.Sprintf("Newton bound: λ = %s, θ = %d (%s)",
			r.bound.Lambda.RatString(), r.bound.Theta, boundStatus(r.bound)))})
	} else {
		for _, l := range svg.Wrap("Newton bound not available: "+r.boundErr.Error(), 72) {
			lines = append(lines, captionText{plain, svg.Esc(l)})
		}
	}
	where := "the origin"
	if r.point != nil && !allZero(r.point) {
		where = pointString(r.vars, r.point)
	}
	for _, l := range svg.Wrap(fmt.Sprintf("Box, as offsets from %s: %s.", where, compactBox(r.vars, r.lower, r.upper)), 80) {
		lines = append(lines, captionText{plain, svg.Esc(l)})
	}
	for _, l := range svg.Wrap("Verdict: "+r.verdictText()+".", 60) {
		lines = append(lines, captionText{`class="caption-verdict" font-size="14" font-weight="bold"`, svg.Esc(l)})
	}
	for _, n := range r.notes() {
		for _, l := range svg.Wrap("Note: "+n+".", 76) {
			lines = append(lines, captionText{plain, svg.Esc(l)})
		}
	}
	for _, l := range svg.Wrap(fmt.Sprintf("Error bars: jackknife over %d runs. %s", e.Runs, estimateCaution), 80) {
		lines = append(lines, captionText{muted, svg.Esc(l)})
	}
	return lines
}

// estimateSwatch draws the sample of a legend entry of the estimate plot,
// 34 px wide, centred vertically at c.Y.
func estimateSwatch(s *svg.Doc, kind string, c point) {
	a, b := point{X: c.X, Y: c.Y}, point{X: c.X + 34, Y: c.Y}
	switch kind {
	case "estimate-points":
		m := point{X: c.X + 17, Y: c.Y}
		s.Line(point{X: m.X, Y: m.Y - 8}, point{X: m.X, Y: m.Y + 8}, errorBarStyle)
		s.Line(point{X: m.X - 4, Y: m.Y - 8}, point{X: m.X + 4, Y: m.Y - 8}, errorBarStyle)
		s.Line(point{X: m.X - 4, Y: m.Y + 8}, point{X: m.X + 4, Y: m.Y + 8}, errorBarStyle)
		s.Circle(m, 3.8, pointStyle)
	case "estimate-fit":
		s.Line(a, b, fitStyle)
	case "estimate-limit":
		s.Printf(`<rect x="%s" y="%s" width="34" height="12" %s/>`+"\n", svg.Num(c.X), svg.Num(c.Y-6), limitBand)
		s.Line(a, b, limitStyle)
	case "estimate-bound":
		s.Line(a, b, boundStyle)
	}
}

// tickStep returns the smallest of …, 0.1, 0.2, 0.5, 1, 2, 5, … that splits
// span into at most n steps.
func tickStep(span float64, n int) float64 {
	step := math.Pow(10, math.Floor(math.Log10(span/float64(n))))
	for {
		for _, m := range []float64{1, 2, 5} {
			if span/(step*m) <= float64(n) {
				return step * m
			}
		}
		step *= 10
	}
}

// signedSuperscript writes an integer in superscript digits, with a
// superscript minus for negative values.
func signedSuperscript(k int) string {
	if k < 0 {
		return "⁻" + svg.Superscript(-k)
	}
	return svg.Superscript(k)
}

// compactBox writes the box without spaces inside a range, so that wrapped
// lines break only between variables.
func compactBox(vars []string, lower, upper []float64) string {
	same := true
	for i := range vars {
		same = same && lower[i] == lower[0] && upper[i] == upper[0]
	}
	if same && len(vars) > 1 {
		return fmt.Sprintf("[%g, %g] in every variable", lower[0], upper[0])
	}
	parts := make([]string, len(vars))
	for i, v := range vars {
		parts[i] = fmt.Sprintf("%s∈[%g,%g]", v, lower[i], upper[i])
	}
	return strings.Join(parts, ", ")
}
