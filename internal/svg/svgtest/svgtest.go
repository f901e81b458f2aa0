// Package svgtest reads SVG documents back for tests: the elements with
// their attributes and text, and checks that every coordinate is finite.
// It is used by the tests of rlct/picture and cmd/lctkit.
package svgtest

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

// Element is one element of a parsed SVG: its name, attributes, and all
// the character data inside it (including that of child elements).
type Element struct {
	Name  string
	Attrs map[string]string
	Text  string
}

// Decode reads an SVG document as XML and returns its elements in document
// order, the root first; it is an error when the document is not
// well-formed or its root is not an svg element.
func Decode(data []byte) ([]*Element, error) {
	dec := xml.NewDecoder(bytes.NewReader(data))
	var all, open []*Element
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
			el := &Element{Name: tok.Name.Local, Attrs: map[string]string{}}
			for _, a := range tok.Attr {
				el.Attrs[a.Name.Local] = a.Value
			}
			all = append(all, el)
			open = append(open, el)
		case xml.EndElement:
			open = open[:len(open)-1]
		case xml.CharData:
			for _, el := range open {
				el.Text += string(tok)
			}
		}
	}
	if len(all) == 0 || all[0].Name != "svg" {
		return nil, fmt.Errorf("no svg root element")
	}
	return all, nil
}

// CheckFinite checks that every coordinate in the picture is a finite
// number.
func CheckFinite(els []*Element) error {
	finite := func(v string) bool {
		f, err := strconv.ParseFloat(v, 64)
		return err == nil && !math.IsNaN(f) && !math.IsInf(f, 0)
	}
	for _, el := range els {
		for _, name := range []string{"x", "y", "x1", "y1", "x2", "y2", "cx", "cy", "r", "width", "height"} {
			if v, ok := el.Attrs[name]; ok && !strings.HasSuffix(v, "%") && !finite(v) {
				return fmt.Errorf("<%s %s=%q>", el.Name, name, v)
			}
		}
		for _, p := range strings.Fields(el.Attrs["points"]) {
			x, y, _ := strings.Cut(p, ",")
			if !finite(x) || !finite(y) {
				return fmt.Errorf("<%s points=%q>", el.Name, el.Attrs["points"])
			}
		}
	}
	return nil
}

// ByClass returns the elements with the class.
func ByClass(els []*Element, class string) []*Element {
	var out []*Element
	for _, el := range els {
		if el.Attrs["class"] == class {
			out = append(out, el)
		}
	}
	return out
}

// Texts returns the text of each element.
func Texts(els []*Element) []string {
	out := make([]string, len(els))
	for i, el := range els {
		out[i] = el.Text
	}
	return out
}

// AttrFloat reads a numeric attribute, failing the test when it is not a
// number.
func AttrFloat(t testing.TB, el *Element, name string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(el.Attrs[name], 64)
	if err != nil {
		t.Fatalf("<%s> attribute %s=%q: %v", el.Name, name, el.Attrs[name], err)
	}
	return v
}
