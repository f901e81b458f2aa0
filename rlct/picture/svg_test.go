package picture

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"
)

// Helpers that read the pictures as XML.

// svgElement is one element of a parsed SVG: its name, attributes, and all
// the character data inside it (including that of child elements).
type svgElement struct {
	name  string
	attrs map[string]string
	text  string
}

func decodeSVG(data []byte) ([]*svgElement, error) {
	dec := xml.NewDecoder(bytes.NewReader(data))
	var all, open []*svgElement
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			el := &svgElement{name: tok.Name.Local, attrs: map[string]string{}}
			for _, a := range tok.Attr {
				el.attrs[a.Name.Local] = a.Value
			}
			all = append(all, el)
			open = append(open, el)
		case xml.EndElement:
			open = open[:len(open)-1]
		case xml.CharData:
			for _, el := range open {
				el.text += string(tok)
			}
		}
	}
	if len(all) == 0 || all[0].name != "svg" {
		return nil, fmt.Errorf("no svg root element")
	}
	return all, nil
}

// checkFinite checks that every coordinate in the picture is a finite
// number.
func checkFinite(els []*svgElement) error {
	finite := func(v string) bool {
		f, err := strconv.ParseFloat(v, 64)
		return err == nil && !math.IsNaN(f) && !math.IsInf(f, 0)
	}
	for _, el := range els {
		for _, name := range []string{"x", "y", "x1", "y1", "x2", "y2", "cx", "cy", "r", "width", "height"} {
			if v, ok := el.attrs[name]; ok && !strings.HasSuffix(v, "%") && !finite(v) {
				return fmt.Errorf("<%s %s=%q>", el.name, name, v)
			}
		}
		for _, p := range strings.Fields(el.attrs["points"]) {
			x, y, _ := strings.Cut(p, ",")
			if !finite(x) || !finite(y) {
				return fmt.Errorf("<%s points=%q>", el.name, el.attrs["points"])
			}
		}
	}
	return nil
}

// byClass returns the elements with the class.
func byClass(els []*svgElement, class string) []*svgElement {
	var out []*svgElement
	for _, el := range els {
		if el.attrs["class"] == class {
			out = append(out, el)
		}
	}
	return out
}

func texts(els []*svgElement) []string {
	out := make([]string, len(els))
	for i, el := range els {
		out[i] = el.text
	}
	return out
}

func attrFloat(t *testing.T, el *svgElement, name string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(el.attrs[name], 64)
	if err != nil {
		t.Fatalf("<%s> attribute %s=%q: %v", el.name, name, el.attrs[name], err)
	}
	return v
}

// polygonPoints reads the points of a polygon or polyline.
func polygonPoints(t *testing.T, el *svgElement) []point {
	t.Helper()
	var pts []point
	for _, p := range strings.Fields(el.attrs["points"]) {
		x, y, _ := strings.Cut(p, ",")
		fx, err1 := strconv.ParseFloat(x, 64)
		fy, err2 := strconv.ParseFloat(y, 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("bad point %q in <%s>", p, el.name)
		}
		pts = append(pts, point{X: fx, Y: fy})
	}
	return pts
}

// polygonCentre is the mean of a polygon's points (the hit diamond's centre).
func polygonCentre(t *testing.T, el *svgElement) point {
	t.Helper()
	var c point
	pts := polygonPoints(t, el)
	for _, p := range pts {
		c.X += p.X / float64(len(pts))
		c.Y += p.Y / float64(len(pts))
	}
	return c
}

// circleCentre is the centre of a circle.
func circleCentre(t *testing.T, el *svgElement) point {
	t.Helper()
	return point{X: attrFloat(t, el, "cx"), Y: attrFloat(t, el, "cy")}
}

// lineEnds are the end points of a line.
func lineEnds(t *testing.T, el *svgElement) (point, point) {
	t.Helper()
	return point{X: attrFloat(t, el, "x1"), Y: attrFloat(t, el, "y1")}, point{X: attrFloat(t, el, "x2"), Y: attrFloat(t, el, "y2")}
}
