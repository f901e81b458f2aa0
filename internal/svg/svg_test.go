package svg

import (
	"slices"
	"testing"
)

func TestTextHelpers(t *testing.T) {
	nums := []struct {
		v    float64
		want string
	}{{0, "0"}, {-0.04, "0"}, {1.25, "1.3"}, {2.0, "2"}, {-3.15, "-3.2"}, {10.96, "11"}}
	for _, tc := range nums {
		if got := Num(tc.v); got != tc.want {
			t.Errorf("Num(%v) = %q, want %q", tc.v, got, tc.want)
		}
	}
	if got := Esc(`a<b & "c"`); got != "a&lt;b &amp; &#34;c&#34;" {
		t.Errorf("Esc = %q", got)
	}
	if got := Superscript(120); got != "¹²⁰" {
		t.Errorf("Superscript(120) = %q", got)
	}
	if got := Shorten("  one   two three  ", 9); got != "one two…" {
		t.Errorf("Shorten = %q", got)
	}
	if got := Wrap("the quick brown fox", 9); !slices.Equal(got, []string{"the quick", "brown fox"}) {
		t.Errorf("Wrap = %q", got)
	}
	// 1, 2, 5, 10, … : the smallest step giving at most n steps over span.
	for _, tc := range []struct {
		span float64
		n    int
		want int
	}{{10, 10, 1}, {10, 4, 5}, {35, 5, 10}, {120, 5, 50}} {
		if got := NiceStep(tc.span, tc.n); got != tc.want {
			t.Errorf("NiceStep(%v, %d) = %d, want %d", tc.span, tc.n, got, tc.want)
		}
	}
}

func TestDoc(t *testing.T) {
	var d Doc
	d.Line(Point{X: 0, Y: 1}, Point{X: 2.25, Y: 3}, `stroke="red"`)
	d.Diamond(Point{X: 5, Y: 5}, 1, `fill="none"`)
	d.Text(Point{X: 1, Y: 2}, `class="t"`, "x<y")
	want := `<line x1="0" y1="1" x2="2.3" y2="3" stroke="red"/>` + "\n" +
		`<polygon points="5,4 6,5 5,6 4,5" fill="none"/>` + "\n" +
		`<text x="1" y="2" class="t">x&lt;y</text>` + "\n"
	if got := d.String(); got != want {
		t.Errorf("document:\n%s\nwant\n%s", got, want)
	}
	if got := (Point{X: 0, Y: 0}).Dist(Point{X: 3, Y: 4}); got != 5 {
		t.Errorf("Dist = %v", got)
	}
}
