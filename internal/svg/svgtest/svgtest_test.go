package svgtest

import (
	"slices"
	"testing"
)

func TestDecode(t *testing.T) {
	doc := `<svg width="10" height="10"><g class="a"><text class="a" x="1" y="2">x<tspan>²</tspan></text></g><circle cx="NaN" cy="1" r="2"/></svg>`
	els, err := Decode([]byte(doc))
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, el := range els {
		names = append(names, el.Name)
	}
	if !slices.Equal(names, []string{"svg", "g", "text", "tspan", "circle"}) {
		t.Errorf("elements %v", names)
	}
	if got := Texts(ByClass(els, "a")); !slices.Equal(got, []string{"x²", "x²"}) {
		t.Errorf("texts %q", got)
	}
	if AttrFloat(t, els[2], "y") != 2 {
		t.Errorf("y = %v", AttrFloat(t, els[2], "y"))
	}
	if err := CheckFinite(els); err == nil {
		t.Error("cx = NaN passed CheckFinite")
	}
	if _, err := Decode([]byte(`<html></html>`)); err == nil {
		t.Error("an html root passed")
	}
	if _, err := Decode([]byte(`<svg><g></svg>`)); err == nil {
		t.Error("a malformed document passed")
	}
}
