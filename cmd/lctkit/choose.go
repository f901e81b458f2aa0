package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/model"
	"github.com/lctkit/lctkit/rlct/sbic"
)

// chooseCmd scores candidate models by the singular BIC.
type chooseCmd struct {
	Table string `arg:"" help:"The candidates: a table in the text form or JSON, as described under the usage; - reads it from standard input."`
	N     string `help:"The sample size, in place of the table's n line." placeholder:"N"`
	jsonFlag
	SVG      string `name:"svg" help:"Also draw the sBIC and the BIC of every candidate to this SVG file." placeholder:"FILE"`
	MaxFaces int    `name:"max-faces" help:"Most compact faces the certificate examines for a pair given by K (default 20000)." placeholder:"N"`
	MaxTerms int    `name:"max-terms" help:"Most terms an expansion of a pair's K may have (default 2000000)." placeholder:"N"`
}

// Help is shown under the command's usage.
func (c *chooseCmd) Help() string {
	return `Scores candidate models by the singular BIC of Drton & Plummer (2017) beside
the plain BIC, chooses a model under each and prints normalised weights. The
sBIC needs, for every pair of models T ⪯ M (T a submodel of M, M itself
included), the learning coefficient λ and multiplicity θ of M at a truth in T.
Each pair carries its status: a score that rests on a pair that is only an
upper bound, or not a bound, is marked, and the output says how the choice
changes when that pair is replaced by the regular value d/2 (θ = 1) or by the
pair's estimate. Scores are float64 evaluations in nats.

The table, one statement a line ('#' starts a comment):

  n 500                                      the sample size
  model NAME dim D loglik L [prior W]        a candidate (prior weight default 1)
  order A <= B <= C                          A ⊆ B ⊆ C (closed under transitivity)
  pair M T lambda 3/2 [theta 2] status S     the pair given, with its status:
                                             exact, upper-bound or uncertified
  pair M T regular status S                  λ = dim(M)/2, θ = 1
  pair M T k "EXPR" | sos "g1; g2"           lctkit bounds K (optional prior,
                                             at, order, vars as for bound)
  … estimate λ θ    another value for the sensitivity report
  … source "text"   where the value comes from

A file starting with '{' is read as JSON with the same content; the package
documentation of rlct/sbic (type Table) has the grammar and the JSON form.

Example:
  lctkit choose candidates.txt --svg scores.svg`
}

// Validate checks the flags before Run.
func (c *chooseCmd) Validate() error {
	if c.MaxFaces < 0 {
		return errors.New("--max-faces must not be negative")
	}
	if c.MaxTerms < 0 {
		return errors.New("--max-terms must not be negative")
	}
	return nil
}

// Run reads the table, scores it and prints the answer.
func (c *chooseCmd) Run(e *env) error {
	var n float64
	if c.N != "" {
		x, err := strconv.ParseFloat(strings.TrimSpace(c.N), 64)
		if err != nil || !(x > math.E) || math.IsInf(x, 0) {
			return badFlag("--n", fmt.Errorf("sample size %q must be a finite number greater than e ≈ 2.718", c.N))
		}
		n = x
	}
	data, err := c.read(e)
	if err != nil {
		return c.fail(e, err)
	}
	tab, err := sbic.ReadTable(data)
	if err != nil {
		return c.fail(e, err)
	}
	if n == 0 {
		n = tab.N
	}
	if n == 0 {
		return c.fail(e, errors.New("no sample size: give a line 'n N' in the table (\"n\" in JSON) or --n"))
	}
	for i := range tab.Pairs {
		if s := tab.Pairs[i].Spec; s != nil {
			s.Limits = monomial.Limits{MaxTerms: c.MaxTerms}
		}
	}
	if err := c.buildDescriptions(tab); err != nil {
		return c.fail(e, err)
	}
	cands, logLik, computed, err := tab.Candidates(context.Background(), &rlct.Options{MaxFaces: c.MaxFaces})
	if err != nil {
		return c.fail(e, err)
	}
	res, err := cands.Choose(n, logLik)
	if err != nil {
		return c.fail(e, err)
	}
	if c.SVG != "" {
		if err := os.WriteFile(c.SVG, []byte(choosePlot(res)), 0o644); err != nil {
			return c.fail(e, err)
		}
	}
	return e.print(&chooseAnswer{res: res, computed: computed}, c.JSON)
}

// read returns the table's bytes, from the file or standard input.
func (c *chooseCmd) read(e *env) ([]byte, error) {
	if c.Table == "-" {
		s, err := readExpr("-", e)
		return []byte(s), err
	}
	st, err := os.Stat(c.Table)
	if err != nil {
		return nil, err
	}
	if st.Size() > maxInput {
		return nil, fmt.Errorf("%s is larger than %d MiB", c.Table, maxInput>>20)
	}
	return os.ReadFile(c.Table)
}

// buildDescriptions reads and builds the model descriptions that pairs
// name (files relative to the table's directory; the working directory
// for a table read from standard input) into their problems.
func (c *chooseCmd) buildDescriptions(tab *sbic.Table) error {
	base := "."
	if c.Table != "-" {
		base = filepath.Dir(c.Table)
	}
	for i := range tab.Pairs {
		tp := &tab.Pairs[i]
		if tp.Description == "" {
			continue
		}
		path := tp.Description
		if !filepath.IsAbs(path) {
			path = filepath.Join(base, path)
		}
		label := fmt.Sprintf("%s: pair %q at %q: description", tp.Where, tp.Model, tp.Truth)
		text, err := os.ReadFile(path)
		if err != nil {
			return fmt.Errorf("%s: %w", label, err)
		}
		d, err := model.Parse(string(text))
		if err != nil {
			return fmt.Errorf("%s: %s:%w", label, path, err)
		}
		m, err := model.Build(context.Background(), d, &model.Options{Limits: monomial.Limits{MaxTerms: c.MaxTerms}})
		if err != nil {
			return fmt.Errorf("%s: %s:%w", label, path, err)
		}
		tp.Problem = m.Problem
	}
	return nil
}

// fail prints err (with a caret under an expression's error) and returns
// the exit error.
func (c *chooseCmd) fail(e *env, err error) error {
	fmt.Fprintln(e.stderr, "lctkit:", err)
	if hint := settingHint(err, flagHints); hint != "" {
		fmt.Fprintf(e.stderr, "  (%s)\n", strings.Replace(hint, "give --order D", "add order D to the pair", 1))
	}
	var se *rlct.SpecError
	var pe *monomial.Error
	if errors.As(err, &se) && errors.As(se.Err, &pe) && pe.Line >= 1 {
		lines := strings.Split(se.Src, "\n")
		if pe.Line <= len(lines) && utf8.RuneCountInString(lines[pe.Line-1]) <= 200 {
			prefix := "  " + se.Field + ": "
			fmt.Fprintf(e.stderr, "%s%s\n%s%s^\n", prefix, lines[pe.Line-1],
				strings.Repeat(" ", utf8.RuneCountInString(prefix)), strings.Repeat(" ", max(pe.Col, 1)-1))
		}
	}
	return exitError{exitFailed, err}
}

// chooseAnswer is what choose prints: the scores and choices and, for the
// pairs lctkit bounded, what each bound claims and why.
type chooseAnswer struct {
	res      *sbic.Result
	computed []sbic.Computed
}

func (a *chooseAnswer) writeText(w io.Writer) { writeChoose(w, a.res, a.computed) }

// MarshalJSON writes the JSON form of the sbic result followed by
// "bounds": the summary and reasons of each pair lctkit bounded.
func (a *chooseAnswer) MarshalJSON() ([]byte, error) {
	type bound struct {
		sbic.PairRef
		Summary string   `json:"summary"`
		Reasons []string `json:"reasons,omitempty"`
	}
	var extra struct {
		Bounds []bound `json:"bounds,omitempty"`
	}
	for _, cp := range a.computed {
		extra.Bounds = append(extra.Bounds, bound{a.res.Candidates().Ref(cp.Pair), cp.Result.Summary, cp.Result.Reasons})
	}
	return mergeJSON(a.res, extra)
}

// scoreStatus names what a score rests on.
func scoreStatus(s rlct.Status) string {
	switch s {
	case rlct.Exact:
		return "exact pairs"
	case rlct.UpperBound:
		return "a bound"
	}
	return "NOT A BOUND"
}

// weightText writes a weight with four decimals, or in scientific notation
// when it is below 10^-4.
func weightText(w float64) string {
	if w != 0 && w < 1e-4 {
		return strconv.FormatFloat(w, 'e', 1, 64)
	}
	return strconv.FormatFloat(w, 'f', 4, 64)
}

// choiceText names a choice and its ties.
func choiceText(r *sbic.Result, ch sbic.Choice) string {
	s := r.Models[ch.Model].Name
	if len(ch.Tied) > 0 {
		var names []string
		for _, i := range ch.Tied {
			names = append(names, r.Models[i].Name)
		}
		s += fmt.Sprintf(" (tied within rounding with %s; the tie goes to the least dimension, then the first given)", strings.Join(names, ", "))
	}
	return s
}

// writeChoose prints the plain-text answer.
func writeChoose(w io.Writer, r *sbic.Result, computed []sbic.Computed) {
	c := r.Candidates()
	fmt.Fprintf(w, "singular BIC (Drton & Plummer 2017) beside the BIC, n = %g, %d candidate models\n", r.N, len(r.Models))
	fmt.Fprintln(w, "scores approximate log marginal likelihoods; float64 evaluations, in nats")
	var rel []string
	for _, i := range c.Topological() {
		for _, j := range c.Topological() {
			if j != i && c.Below(j, i) {
				rel = append(rel, r.Models[j].Name+" ⪯ "+r.Models[i].Name)
			}
		}
	}
	if len(rel) > 0 {
		fmt.Fprintf(w, "order (with transitivity): %s\n", strings.Join(rel, ", "))
	} else {
		fmt.Fprintln(w, "order: no model contains another")
	}
	fmt.Fprintln(w)

	width := len("model")
	for _, m := range r.Models {
		width = max(width, utf8.RuneCountInString(m.Name))
	}
	fmt.Fprintf(w, "  %-*s  %4s  %15s  %15s  %15s  %10s  %11s  %s\n", width, "model", "dim", "log-lik", "BIC", "sBIC", "weight BIC", "weight sBIC", "sBIC rests on")
	for _, i := range c.Topological() {
		m := r.Models[i]
		mark := ""
		switch {
		case i == r.BIC.Model && i == r.SBIC.Model:
			mark = "   ← chosen by both"
		case i == r.SBIC.Model:
			mark = "   ← chosen by sBIC"
		case i == r.BIC.Model:
			mark = "   ← chosen by BIC"
		}
		fmt.Fprintf(w, "  %-*s  %4d  %15.4f  %15.4f  %15.4f  %10s  %11s  %s%s\n", width, m.Name, m.Dim, m.LogLik, m.BIC, m.SBIC,
			weightText(m.WeightBIC), weightText(m.WeightSBIC), scoreStatus(m.Status), mark)
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "chosen by BIC:  %s\n", choiceText(r, r.BIC))
	fmt.Fprintf(w, "chosen by sBIC: %s\n", choiceText(r, r.SBIC))

	fmt.Fprintln(w)
	fmt.Fprintln(w, "pairs (λ, θ of MODEL at a truth in TRUTH):")
	pairs := c.Pairs()
	names := make([]string, len(pairs))
	pw, lw := 0, 0
	for i, p := range pairs {
		names[i] = r.Models[p.Model].Name + " at " + r.Models[p.Truth].Name
		pw = max(pw, utf8.RuneCountInString(names[i]))
		lw = max(lw, len(p.Lambda.RatString()))
	}
	headline := map[int]*rlct.Result{}
	for _, cp := range computed {
		headline[cp.Pair] = cp.Result
	}
	for i, p := range pairs {
		extra := p.Source
		if p.Estimate != nil {
			if extra != "" {
				extra += "; "
			}
			extra += "estimate " + p.Estimate.String()
		}
		fmt.Fprintf(w, "  %-*s  λ = %-*s  θ = %d  %-12s %s\n", pw, names[i], lw, p.Lambda.RatString(), p.Theta, statusWord(p.Status), extra)
		if res, ok := headline[i]; ok && res.Status == rlct.Uncertified {
			fmt.Fprintf(w, "  %-*s  lctkit: %s\n", pw, "", res.Summary)
		}
	}
	fmt.Fprintln(w, "  (exact: certified by lctkit for a pair computed from K; as the table declares it for a pair given by value)")

	if len(r.Sensitivity) == 0 {
		fmt.Fprintln(w)
		fmt.Fprintln(w, "every pair is exact: no score rests on a bound")
		return
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, "pairs that are not exact, and what rests on them:")
	scenario := func(label string, s *sbic.Scenario, affects []int) {
		var parts []string
		for _, i := range affects {
			parts = append(parts, fmt.Sprintf("%s %.4f", r.Models[i].Name, s.SBIC[i]))
		}
		verdict := "sBIC still chooses " + r.Models[s.Choice.Model].Name
		if s.Changed {
			verdict = "sBIC chooses " + r.Models[s.Choice.Model].Name + " instead: THE CHOICE CHANGES"
		}
		if len(parts) > 0 {
			fmt.Fprintf(w, "    %s: sBIC %s; %s\n", label, strings.Join(parts, ", "), verdict)
		} else {
			fmt.Fprintf(w, "    %s: %s\n", label, verdict)
		}
	}
	for _, ps := range r.Sensitivity {
		p := pairs[ps.Pair]
		fmt.Fprintf(w, "  %s (%s, λ = %s, θ = %d):\n", names[ps.Pair], statusWord(p.Status), p.Lambda.RatString(), p.Theta)
		if note := rlct.PenaltyNote(p.Status); note != "" {
			for _, l := range svg.Wrap(note, 100) {
				fmt.Fprintf(w, "    %s\n", l)
			}
		}
		var aff []string
		for _, i := range ps.Affects {
			aff = append(aff, r.Models[i].Name)
		}
		fmt.Fprintf(w, "    the sBIC of %s rests on it\n", strings.Join(aff, ", "))
		reg := c.Regular(p.Model)
		scenario("replaced by the regular value "+reg.String(), &ps.Regular, ps.Affects)
		if ps.Estimate != nil {
			scenario("replaced by the estimate "+p.Estimate.String(), ps.Estimate, ps.Affects)
		}
	}
	if len(r.Sensitivity) > 1 {
		scenarioAll := func(label string, s *sbic.Scenario) {
			verdict := "sBIC still chooses " + r.Models[s.Choice.Model].Name
			if s.Changed {
				verdict = "sBIC chooses " + r.Models[s.Choice.Model].Name + " instead: THE CHOICE CHANGES"
			}
			fmt.Fprintf(w, "  %s: %s\n", label, verdict)
		}
		scenarioAll("all of them replaced by regular values at once", r.AllRegular)
		if r.AllEstimates != nil {
			scenarioAll(fmt.Sprintf("the %d with an estimate replaced by it at once", len(r.AllEstimates.Replaced)), r.AllEstimates)
		}
	}
}

// Layout of the choose plot, in pixels.
const (
	choosePlotWidth = 640
	chooseLeft      = 84.0
	chooseRight     = 612.0
	chooseTop       = 74.0
	chooseBottom    = 344.0
)

// Styles of the choose plot: Okabe–Ito colours, and the two criteria also
// differ by line style (solid, dashed) and marker (circle, square); the
// status of a score by the fill of its marker (filled, hollow, hollow with
// a cross).
const (
	sbicLine   = `stroke="` + svg.ColorVermillion + `" stroke-width="2.2"`
	bicLine    = `stroke="` + svg.ColorBlue + `" stroke-width="2" stroke-dasharray="7 4"`
	sbicFilled = `fill="` + svg.ColorVermillion + `" stroke="` + svg.ColorVermillion + `" stroke-width="1.8"`
	sbicHollow = `fill="#FFFFFF" stroke="` + svg.ColorVermillion + `" stroke-width="2"`
	bicMarker  = `fill="` + svg.ColorBlue + `" stroke="#FFFFFF" stroke-width="1"`
	choiceRing = `fill="none" stroke="` + svg.ColorBlack + `" stroke-width="1.5"`
)

// plotDepth returns how far below the best score the plot reaches, given
// each model's lowest score as a deficit below the best: every score,
// unless the lowest model lies far below the rest (more than four times the
// next model's deficit and more than 10 nats); its scores are then drawn at
// the bottom edge with their values.
func plotDepth(deficits []float64) float64 {
	d1, d2 := 0.0, 0.0
	for _, d := range deficits {
		switch {
		case d > d1:
			d1, d2 = d, d1
		case d > d2:
			d2 = d
		}
	}
	limit := math.Max(10, 4*d2)
	if d1 <= limit {
		return math.Max(d1, 1)
	}
	return limit
}

// choosePlot draws the sBIC and the BIC of every candidate, in nats below
// the best score, with the candidates in the order of the recursion.
func choosePlot(r *sbic.Result) string {
	c := r.Candidates()
	topo := c.Topological()
	best := math.Inf(-1)
	for _, m := range r.Models {
		best = math.Max(best, math.Max(m.BIC, m.SBIC))
	}
	var deficits []float64
	for _, m := range r.Models {
		deficits = append(deficits, best-math.Min(m.BIC, m.SBIC))
	}
	depth := plotDepth(deficits)
	ylo, yhi := -depth*1.06, depth*0.14
	step := (chooseRight - chooseLeft) / float64(len(topo))
	px := func(k int) float64 { return chooseLeft + step*(float64(k)+0.5) }
	py := func(v float64) float64 { return chooseBottom - (v-ylo)/(yhi-ylo)*(chooseBottom-chooseTop) }
	clipped := func(v float64) bool { return v < -depth-1e-9 }
	place := func(v float64) float64 {
		if clipped(v) {
			return chooseBottom - 6
		}
		return py(v)
	}

	hasBound, hasNotBound, hasClipped := false, false, false
	for _, m := range r.Models {
		hasBound = hasBound || m.Status == rlct.UpperBound
		hasNotBound = hasNotBound || m.Status == rlct.Uncertified
		hasClipped = hasClipped || clipped(m.BIC-best) || clipped(m.SBIC-best)
	}
	legend := []legendItem{{"sbic", "sBIC (Drton & Plummer 2017), on exact pairs"}, {"bic", "BIC (Schwarz 1978)"}}
	if hasBound {
		legend = append(legend, legendItem{"sbic-bound", "sBIC resting on an upper bound"})
	}
	if hasNotBound {
		legend = append(legend, legendItem{"sbic-notbound", "sBIC resting on a value that is NOT A BOUND"})
	}
	if hasClipped {
		legend = append(legend, legendItem{"clipped", "below the plotted range (value shown)"})
	}
	legend = append(legend, legendItem{"choice", "the model each criterion chooses"})
	legendTop := chooseBottom + 88
	captionTop := legendTop + float64(len(legend))*legendRow + 14
	caption := svg.Wrap(fmt.Sprintf("n = %g. Scores are float64 evaluations of log marginal-likelihood approximations, drawn in nats below the best score (%.4f). sBIC chooses %s, BIC chooses %s.",
		r.N, best, r.Models[r.SBIC.Model].Name, r.Models[r.BIC.Model].Name), 86)
	if hasBound || hasNotBound {
		caption = append(caption, svg.Wrap("A hollow marker is a score that rests on a pair that is not exact: see the text output for how the choice moves when such a pair is replaced.", 86)...)
	}
	height := captionTop + float64(len(caption))*captionLine + 8

	var s svg.Doc
	s.Printf(`<svg xmlns="http://www.w3.org/2000/svg" width="%d" height="%s" viewBox="0 0 %d %s" font-family="%s">`+"\n",
		choosePlotWidth, svg.Num(height), choosePlotWidth, svg.Num(height), svg.FontFamily)
	s.Printf("<title>%s</title>\n", svg.Esc("sBIC and BIC of the candidate models, n = "+strconv.FormatFloat(r.N, 'g', -1, 64)))
	s.Printf(`<rect width="100%%" height="100%%" fill="#FFFFFF"/>` + "\n")
	s.Text(point{X: choosePlotWidth / 2, Y: 28}, `class="title" text-anchor="middle" font-size="17" font-weight="bold"`, "Singular BIC and BIC of the candidates")
	s.Text(point{X: choosePlotWidth / 2, Y: 50}, `class="subtitle" text-anchor="middle" font-size="13" fill="`+svg.ColorMuted+`"`,
		fmt.Sprintf("n = %g · float64 evaluations · higher is better", r.N))

	// Grid, frame and axes.
	ystep := tickStep(yhi-ylo, 7)
	s.Printf(`<g class="grid" stroke="%s" stroke-width="1">`+"\n", svg.ColorGrid)
	var yticks []float64
	for v := math.Ceil(ylo/ystep) * ystep; v <= yhi+1e-12; v += ystep {
		yticks = append(yticks, v)
		s.Line(point{X: chooseLeft, Y: py(v)}, point{X: chooseRight, Y: py(v)}, "")
	}
	s.Printf("</g>\n")
	s.Printf(`<rect class="frame" x="%s" y="%s" width="%s" height="%s" fill="none" stroke="%s" stroke-width="1.2"/>`+"\n",
		svg.Num(chooseLeft), svg.Num(chooseTop), svg.Num(chooseRight-chooseLeft), svg.Num(chooseBottom-chooseTop), svg.ColorBlack)
	yDec := max(0, -int(math.Floor(math.Log10(ystep)+1e-9)))
	s.Printf(`<g class="ticks" font-size="13">` + "\n")
	for _, v := range yticks {
		label := strconv.FormatFloat(v, 'f', yDec, 64)
		if strings.Trim(label, "-0.") == "" {
			label = strconv.FormatFloat(0, 'f', yDec, 64)
		}
		s.Text(point{X: chooseLeft - 8, Y: py(v) + 4.5}, `class="y-tick" text-anchor="end"`, strings.Replace(label, "-", "−", 1))
	}
	for k, i := range topo {
		m := r.Models[i]
		s.Text(point{X: px(k), Y: chooseBottom + 20}, `class="x-tick" text-anchor="middle"`, svg.Shorten(m.Name, int(step/8)))
		s.Text(point{X: px(k), Y: chooseBottom + 37}, `class="x-tick-dim" text-anchor="middle" font-size="12" fill="`+svg.ColorMuted+`"`, fmt.Sprintf("d = %d", m.Dim))
	}
	s.Printf("</g>\n")
	s.Text(point{X: (chooseLeft + chooseRight) / 2, Y: chooseBottom + 56}, `class="x-axis-label" text-anchor="middle" font-size="14"`,
		"candidate models (each after its submodels)")
	s.Text(point{X: 24, Y: (chooseTop + chooseBottom) / 2},
		fmt.Sprintf(`class="y-axis-label" text-anchor="middle" font-size="14" transform="rotate(-90 24 %s)"`, svg.Num((chooseTop+chooseBottom)/2)),
		"score − best score (nats)")

	// The two series: lines, then markers.
	var bicPts, sbicPts []point
	for k, i := range topo {
		bicPts = append(bicPts, point{X: px(k), Y: place(r.Models[i].BIC - best)})
		sbicPts = append(sbicPts, point{X: px(k), Y: place(r.Models[i].SBIC - best)})
	}
	if len(topo) > 1 {
		s.Polyline(bicPts, `class="bic-line" `+bicLine)
		s.Polyline(sbicPts, `class="sbic-line" `+sbicLine)
	}
	for k, i := range topo {
		m := r.Models[i]
		off := 7.0 // the two markers of a model side by side
		b := point{X: bicPts[k].X + off, Y: bicPts[k].Y}
		sb := point{X: sbicPts[k].X - off, Y: sbicPts[k].Y}
		chooseMarker(&s, "bic", b, clipped(m.BIC-best))
		kind := "sbic"
		switch m.Status {
		case rlct.UpperBound:
			kind = "sbic-bound"
		case rlct.Uncertified:
			kind = "sbic-notbound"
		}
		chooseMarker(&s, kind, sb, clipped(m.SBIC-best))
		if clipped(m.BIC - best) {
			s.Text(point{X: b.X + 8, Y: b.Y - 8}, `class="clipped-label" font-size="11" fill="`+svg.ColorBlue+`" `+svg.Halo, fmt.Sprintf("%.1f", m.BIC-best))
		}
		if clipped(m.SBIC - best) {
			s.Text(point{X: sb.X - 8, Y: sb.Y - 8}, `class="clipped-label" text-anchor="end" font-size="11" fill="`+svg.ColorVermillion+`" `+svg.Halo, fmt.Sprintf("%.1f", m.SBIC-best))
		}
		// The rings, labelled outwards: sBIC to the left, BIC to the right.
		if i == r.SBIC.Model {
			s.Circle(sb, 10, `class="choice-sbic" `+choiceRing)
			s.Text(point{X: sb.X - 13, Y: sb.Y - 8}, `class="choice-label" text-anchor="end" font-size="12" `+svg.Halo, "sBIC")
		}
		if i == r.BIC.Model {
			s.Circle(b, 10, `class="choice-bic" `+choiceRing)
			s.Text(point{X: b.X + 13, Y: b.Y - 8}, `class="choice-label" font-size="12" `+svg.Halo, "BIC")
		}
	}

	// Legend and caption.
	s.Printf(`<g class="legend" font-size="13">` + "\n")
	for n, it := range legend {
		x := 24.0
		ly := legendTop + float64(n)*legendRow
		chooseSwatch(&s, it.kind, point{X: x, Y: ly - 4.5})
		s.Text(point{X: x + 44, Y: ly}, `class="legend-label"`, it.label)
	}
	s.Printf("</g>\n")
	s.Printf(`<g class="caption" font-size="13">` + "\n")
	for n, l := range caption {
		s.Text(point{X: 24, Y: captionTop + float64(n)*captionLine}, `class="caption-text"`, l)
	}
	s.Printf("</g>\n</svg>\n")
	return s.String()
}

// chooseMarker draws the marker of a score: a square for the BIC, a circle
// for the sBIC (filled when it rests on exact pairs only, hollow on a bound,
// hollow with a cross on a value that is not a bound), a downward triangle
// when the score lies below the plotted range.
func chooseMarker(s *svg.Doc, kind string, c point, clipped bool) {
	style := bicMarker
	if kind != "bic" {
		style = sbicFilled
		if kind != "sbic" {
			style = sbicHollow
		}
	}
	switch {
	case clipped:
		s.Printf(`<polygon points="%s" class="marker-%s-clipped" %s/>`+"\n", svg.PointList([]point{{X: c.X - 6, Y: c.Y - 5}, {X: c.X + 6, Y: c.Y - 5}, {X: c.X, Y: c.Y + 5}}), kind, style)
	case kind == "bic":
		s.Printf(`<rect class="marker-bic" x="%s" y="%s" width="9" height="9" %s/>`+"\n", svg.Num(c.X-4.5), svg.Num(c.Y-4.5), style)
	default:
		s.Circle(c, 5, `class="marker-`+kind+`" `+style)
	}
	if kind == "sbic-notbound" && !clipped {
		s.Line(point{X: c.X - 3, Y: c.Y - 3}, point{X: c.X + 3, Y: c.Y + 3}, `stroke="`+svg.ColorVermillion+`" stroke-width="1.6"`)
		s.Line(point{X: c.X - 3, Y: c.Y + 3}, point{X: c.X + 3, Y: c.Y - 3}, `stroke="`+svg.ColorVermillion+`" stroke-width="1.6"`)
	}
}

// chooseSwatch draws the sample of a legend entry, 36 px wide, centred
// vertically at c.Y.
func chooseSwatch(s *svg.Doc, kind string, c point) {
	a, b, m := point{X: c.X, Y: c.Y}, point{X: c.X + 36, Y: c.Y}, point{X: c.X + 18, Y: c.Y}
	switch kind {
	case "sbic", "sbic-bound", "sbic-notbound":
		s.Line(a, b, sbicLine)
		chooseMarker(s, kind, m, false)
	case "bic":
		s.Line(a, b, bicLine)
		chooseMarker(s, kind, m, false)
	case "clipped":
		chooseMarker(s, "sbic", m, true)
	case "choice":
		s.Circle(m, 5, sbicFilled)
		s.Circle(m, 10, choiceRing)
	}
}
