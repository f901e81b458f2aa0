package picture

import (
	"strings"
	"unicode/utf8"

	"github.com/lctkit/lctkit/internal/svg"
)

// point is a position on the page in pixels, y pointing down (see
// internal/svg, which writes the document).
type point = svg.Point

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
			parts = append(parts, vars[i]+svg.Superscript(x))
		}
	}
	if len(parts) == 0 {
		return "1"
	}
	return strings.Join(parts, sep)
}
