package picture

import (
	"encoding/xml"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// The Okabe–Ito palette (Okabe and Ito 2008, "Color Universal Design"),
// distinguishable by readers with the common colour-vision deficiencies.
// The figures never rely on colour alone: every element also differs by line
// style, marker shape or a text label.
const (
	colorBlack      = "#000000"
	colorSkyBlue    = "#56B4E9"
	colorGreen      = "#009E73"
	colorYellow     = "#F0E442"
	colorBlue       = "#0072B2"
	colorVermillion = "#D55E00"
	colorPurple     = "#CC79A7"
	colorGrid       = "#DDDDDD"
	colorMuted      = "#555555"
)

// fontFamily lists fonts with Greek letters and superscript digits.
const fontFamily = "DejaVu Sans, Verdana, Arial, sans-serif"

// point is a position on the page in pixels, y pointing down.
type point struct{ x, y float64 }

// svgDoc accumulates an SVG document written with the standard library.
type svgDoc struct {
	b strings.Builder
}

// num formats a coordinate with one decimal, without "-0.0".
func num(v float64) string {
	s := strconv.FormatFloat(math.Round(v*10)/10, 'f', 1, 64)
	if s == "-0.0" {
		return "0.0"
	}
	return strings.TrimSuffix(s, ".0")
}

// esc escapes text for XML character data and attribute values.
func esc(s string) string {
	var b strings.Builder
	_ = xml.EscapeText(&b, []byte(s))
	return b.String()
}

func (s *svgDoc) printf(format string, args ...any) {
	fmt.Fprintf(&s.b, format, args...)
}

func (s *svgDoc) line(a, b point, attrs string) {
	s.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" %s/>`+"\n", num(a.x), num(a.y), num(b.x), num(b.y), attrs)
}

func pointList(pts []point) string {
	parts := make([]string, len(pts))
	for i, p := range pts {
		parts[i] = num(p.x) + "," + num(p.y)
	}
	return strings.Join(parts, " ")
}

func (s *svgDoc) polyline(pts []point, attrs string) {
	s.printf(`<polyline points="%s" fill="none" %s/>`+"\n", pointList(pts), attrs)
}

func (s *svgDoc) polygon(pts []point, attrs string) {
	s.printf(`<polygon points="%s" %s/>`+"\n", pointList(pts), attrs)
}

func (s *svgDoc) circle(c point, r float64, attrs string) {
	s.printf(`<circle cx="%s" cy="%s" r="%s" %s/>`+"\n", num(c.x), num(c.y), num(r), attrs)
}

// diamond draws the marker of the hit point t_τ·τ.
func (s *svgDoc) diamond(c point, r float64, attrs string) {
	s.polygon([]point{{c.x, c.y - r}, {c.x + r, c.y}, {c.x, c.y + r}, {c.x - r, c.y}}, attrs)
}

// text writes plain text (escaped here).
func (s *svgDoc) text(p point, attrs, content string) {
	s.markup(p, attrs, esc(content))
}

// markup writes text whose content is already escaped and may hold tspans.
func (s *svgDoc) markup(p point, attrs, content string) {
	s.printf(`<text x="%s" y="%s" %s>%s</text>`+"\n", num(p.x), num(p.y), attrs, content)
}

// halo is the text style that keeps labels legible over lines and fills.
const halo = `stroke="#FFFFFF" stroke-width="4" stroke-linejoin="round" paint-order="stroke"`

// sub writes base with a subscript, followed by rest, as markup:
// sub("t", "τ", " = 2") is t_τ = 2. The subscript is set with dy rather than
// baseline-shift, which some viewers ignore.
func sub(base, subscript, rest string) string {
	m := esc(base) + `<tspan dy="0.3em" font-size="75%">` + esc(subscript) + `</tspan>`
	if rest != "" {
		m += `<tspan dy="-0.3em">` + esc(rest) + `</tspan>`
	}
	return m
}

var superscriptDigits = []rune("⁰¹²³⁴⁵⁶⁷⁸⁹")

// superscript writes a non-negative integer in superscript digits.
func superscript(n int) string {
	var b strings.Builder
	for _, r := range strconv.Itoa(n) {
		b.WriteRune(superscriptDigits[r-'0'])
	}
	return b.String()
}

// monomialLabel writes w^e as it is set in print, such as x⁴y⁶, with a
// middle dot between factors when some variable name is longer than one
// letter (v1²·v2).
func monomialLabel(vars []string, e []int) string {
	sep := ""
	for _, v := range vars {
		if utf8.RuneCountInString(v) > 1 {
			sep = "·"
		}
	}
	var parts []string
	for i, x := range e {
		switch x {
		case 0:
		case 1:
			parts = append(parts, vars[i])
		default:
			parts = append(parts, vars[i]+superscript(x))
		}
	}
	if len(parts) == 0 {
		return "1"
	}
	return strings.Join(parts, sep)
}

// niceStep returns the smallest of 1, 2, 5, 10, 20, 50, … that splits
// [0, span] into at most n steps.
func niceStep(span float64, n int) int {
	for step := 1; ; step *= 10 {
		for _, m := range []int{1, 2, 5} {
			if span/float64(step*m) <= float64(n) {
				return step * m
			}
		}
	}
}

// shorten cuts s to at most n runes, ending in "…" when cut, after
// collapsing white space.
func shorten(s string, n int) string {
	s = strings.Join(strings.Fields(s), " ")
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	r := []rune(s)
	return strings.TrimSpace(string(r[:n-1])) + "…"
}

// wrap breaks plain text into lines of at most n runes at spaces.
func wrap(s string, n int) []string {
	var lines []string
	cur := ""
	for _, w := range strings.Fields(s) {
		switch {
		case cur == "":
			cur = w
		case utf8.RuneCountInString(cur)+1+utf8.RuneCountInString(w) <= n:
			cur += " " + w
		default:
			lines = append(lines, cur)
			cur = w
		}
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

func (p point) dist(q point) float64 { return math.Hypot(p.x-q.x, p.y-q.y) }
