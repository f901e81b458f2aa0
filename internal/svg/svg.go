// Package svg writes SVG documents with the standard library: the page
// primitives, the palette and the text helpers shared by the pictures of
// package rlct/picture and the plots of the lctkit command.
package svg

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
	ColorBlack      = "#000000"
	ColorOrange     = "#E69F00"
	ColorSkyBlue    = "#56B4E9"
	ColorGreen      = "#009E73"
	ColorYellow     = "#F0E442"
	ColorBlue       = "#0072B2"
	ColorVermillion = "#D55E00"
	ColorPurple     = "#CC79A7"
	ColorGrid       = "#DDDDDD"
	ColorMuted      = "#555555"
)

// FontFamily lists fonts with Greek letters and superscript digits.
const FontFamily = "DejaVu Sans, Verdana, Arial, sans-serif"

// Halo is the text style that keeps labels legible over lines and fills.
const Halo = `stroke="#FFFFFF" stroke-width="4" stroke-linejoin="round" paint-order="stroke"`

// Point is a position on the page in pixels, Y pointing down.
type Point struct{ X, Y float64 }

// Dist returns the distance from p to q.
func (p Point) Dist(q Point) float64 { return math.Hypot(p.X-q.X, p.Y-q.Y) }

// Doc accumulates an SVG document. The zero value is ready to use.
type Doc struct {
	b strings.Builder
}

// String returns what has been written.
func (s *Doc) String() string { return s.b.String() }

// WriteString appends raw markup.
func (s *Doc) WriteString(m string) { s.b.WriteString(m) }

// Printf appends formatted raw markup.
func (s *Doc) Printf(format string, args ...any) {
	fmt.Fprintf(&s.b, format, args...)
}

// Line draws a segment from a to b with the given attributes.
func (s *Doc) Line(a, b Point, attrs string) {
	s.Printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" %s/>`+"\n", Num(a.X), Num(a.Y), Num(b.X), Num(b.Y), attrs)
}

// Polyline draws an open path through pts, unfilled.
func (s *Doc) Polyline(pts []Point, attrs string) {
	s.Printf(`<polyline points="%s" fill="none" %s/>`+"\n", PointList(pts), attrs)
}

// Polygon draws a closed polygon through pts.
func (s *Doc) Polygon(pts []Point, attrs string) {
	s.Printf(`<polygon points="%s" %s/>`+"\n", PointList(pts), attrs)
}

// Circle draws a circle of radius r around c.
func (s *Doc) Circle(c Point, r float64, attrs string) {
	s.Printf(`<circle cx="%s" cy="%s" r="%s" %s/>`+"\n", Num(c.X), Num(c.Y), Num(r), attrs)
}

// Diamond draws a square standing on a corner, of half-diagonal r, around c.
func (s *Doc) Diamond(c Point, r float64, attrs string) {
	s.Polygon([]Point{{c.X, c.Y - r}, {c.X + r, c.Y}, {c.X, c.Y + r}, {c.X - r, c.Y}}, attrs)
}

// Text writes plain text (escaped here) at p.
func (s *Doc) Text(p Point, attrs, content string) {
	s.Markup(p, attrs, Esc(content))
}

// Markup writes text whose content is already escaped and may hold tspans.
func (s *Doc) Markup(p Point, attrs, content string) {
	s.Printf(`<text x="%s" y="%s" %s>%s</text>`+"\n", Num(p.X), Num(p.Y), attrs, content)
}

// Num formats a coordinate with one decimal, without "-0.0" or a trailing
// ".0".
func Num(v float64) string {
	s := strconv.FormatFloat(math.Round(v*10)/10, 'f', 1, 64)
	if s == "-0.0" {
		return "0"
	}
	return strings.TrimSuffix(s, ".0")
}

// Esc escapes text for XML character data and attribute values.
func Esc(s string) string {
	var b strings.Builder
	_ = xml.EscapeText(&b, []byte(s))
	return b.String()
}

// PointList writes pts as the value of a points attribute.
func PointList(pts []Point) string {
	parts := make([]string, len(pts))
	for i, p := range pts {
		parts[i] = Num(p.X) + "," + Num(p.Y)
	}
	return strings.Join(parts, " ")
}

// Sub writes base with a subscript, followed by rest, as markup:
// Sub("t", "τ", " = 2") is t_τ = 2. The subscript is set with dy rather than
// baseline-shift, which some viewers ignore.
func Sub(base, subscript, rest string) string {
	m := Esc(base) + `<tspan dy="0.3em" font-size="75%">` + Esc(subscript) + `</tspan>`
	if rest != "" {
		m += `<tspan dy="-0.3em">` + Esc(rest) + `</tspan>`
	}
	return m
}

var superscriptDigits = []rune("⁰¹²³⁴⁵⁶⁷⁸⁹")

// Superscript writes a non-negative integer in superscript digits.
func Superscript(n int) string {
	var b strings.Builder
	for _, r := range strconv.Itoa(n) {
		b.WriteRune(superscriptDigits[r-'0'])
	}
	return b.String()
}

// Shorten cuts s to at most n runes, ending in "…" when cut, after
// collapsing white space.
func Shorten(s string, n int) string {
	s = strings.Join(strings.Fields(s), " ")
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	r := []rune(s)
	return strings.TrimSpace(string(r[:n-1])) + "…"
}

// Wrap breaks plain text into lines of at most n runes at spaces.
func Wrap(s string, n int) []string {
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

// NiceStep returns the smallest of 1, 2, 5, 10, 20, 50, … that splits
// [0, span] into at most n steps.
func NiceStep(span float64, n int) int {
	for step := 1; ; step *= 10 {
		for _, m := range []int{1, 2, 5} {
			if span/float64(step*m) <= float64(n) {
				return step * m
			}
		}
	}
}
