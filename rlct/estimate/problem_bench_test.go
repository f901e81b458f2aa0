package estimate

import (
	"fmt"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// BenchmarkProblemEvaluator measures one evaluation of K = g² for
// g = (x + y + z + w − 1)^m at the point (1/4, 1/4, 1/4, 1/4), given expanded
// (K with C(2m+4, 4) terms) and in sum-of-squares form (g with C(m+4, 4)
// terms), after the exact translation to the point.
func BenchmarkProblemEvaluator(b *testing.B) {
	for _, m := range []int{2, 4, 8} {
		g := fmt.Sprintf("(x + y + z + w - 1)^%d", m)
		at := []string{"x=1/4,y=1/4,z=1/4,w=1/4"}
		for _, form := range []struct {
			name string
			spec rlct.Spec
		}{
			{"expanded", rlct.Spec{K: "(" + g + ")^2", At: at}},
			{"sum-of-squares", rlct.Spec{SOS: []string{g}, At: at}},
		} {
			p, err := form.spec.Problem()
			if err != nil {
				b.Fatal(err)
			}
			ev, err := NewProblemEvaluator(p)
			if err != nil {
				b.Fatal(err)
			}
			terms := 0
			for _, q := range ev.Polys {
				terms += q.Len()
			}
			b.Run(fmt.Sprintf("degree=%d/%s", 2*m, form.name), func(b *testing.B) {
				b.ReportAllocs()
				x := []float64{0.1, -0.2, 0.05, 0.3}
				for b.Loop() {
					ev.Eval(x)
				}
				b.ReportMetric(float64(terms), "terms")
			})
		}
	}
}
