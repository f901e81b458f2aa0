package picture

import (
	"strconv"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/internal/svg/svgtest"
)

// Helpers that read the pictures as XML.

// The reading of SVG documents is shared with the command's tests.
type svgElement = svgtest.Element

var (
	decodeSVG   = svgtest.Decode
	checkFinite = svgtest.CheckFinite
	byClass     = svgtest.ByClass
	texts       = svgtest.Texts
	attrFloat   = svgtest.AttrFloat
)

// polygonPoints reads the points of a polygon or polyline.
func polygonPoints(t *testing.T, el *svgElement) []point {
	t.Helper()
	var pts []point
	for _, p := range strings.Fields(el.Attrs["points"]) {
		x, y, _ := strings.Cut(p, ",")
		fx, err1 := strconv.ParseFloat(x, 64)
		fy, err2 := strconv.ParseFloat(y, 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("bad point %q in <%s>", p, el.Name)
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
