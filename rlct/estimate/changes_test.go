package estimate

import (
	"context"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// TestChangesAgreeWithEstimate: values that rlct certifies only through a
// change of coordinates (the reduction, its exact elimination, the repair)
// agree with the numerical estimate within its error bars (Result.Compare,
// 3 standard errors). The Newton values of K itself are larger on every
// case but the last (1, 3/4, 5/4, 5/4; for the last the same pair, only an
// upper bound), so the check would catch a change that claimed the wrong
// value. Run time about 2 s.
// Hand values: (x−y)² and (y−x²)² are u² after u = x − y or u = y − x²
// (λ = 1/2); (x−y)² + z⁴ is u² + z⁴ (λ = 1/2 + 1/4); x + y + x·y is
// solved exactly for x = −y/(1+y), so (x + y + x·y)² + z⁴ has
// λ = 1/2 + 1/4; y²(x−y)² + x⁶ is repaired by x → x + y to y²x² + (x+y)⁶,
// λ = 1/2, θ = 2. The box is [−1/2, 1/2]^d, where each zero set has the
// same λ away from the origin as at it. Slow: skipped with -short.
func TestChangesAgreeWithEstimate(t *testing.T) {
	if testing.Short() {
		t.Skip("slow")
	}
	for _, tc := range []struct {
		name   string
		spec   rlct.Spec
		lambda string
	}{
		{"(x-y)^2", rlct.Spec{K: "(x-y)^2"}, "1/2"},
		{"(y-x^2)^2", rlct.Spec{K: "(y - x^2)^2"}, "1/2"},
		{"(x-y)^2+z^4", rlct.Spec{K: "(x-y)^2 + z^4"}, "3/4"},
		{"sos x+y+x*y; z^2", rlct.Spec{SOS: []string{"x + y + x*y", "z^2"}}, "3/4"},
		{"y^2*(x-y)^2+x^6", rlct.Spec{K: "y^2*(x-y)^2 + x^6"}, "1/2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := tc.spec.Problem()
			if err != nil {
				t.Fatal(err)
			}
			b, err := rlct.Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatal(err)
			}
			if b.Status != rlct.Exact || b.Lambda.RatString() != tc.lambda || len(b.Changes) == 0 {
				t.Fatalf("bound λ = %s (%s), changes %q; want exact %s through a change", b.Lambda.RatString(), b.Status, b.Changes, tc.lambda)
			}
			d := len(p.Vars())
			lo, hi := make([]float64, d), make([]float64, d)
			for i := range lo {
				lo[i], hi[i] = -0.5, 0.5
			}
			e, err := Problem(context.Background(), p, Options{Lower: lo, Upper: hi, Live: 200, Runs: 16, Seed: 3, Start: 3})
			if err != nil {
				t.Fatal(err)
			}
			f, _ := b.Lambda.Float64()
			c := e.Compare(f, b.Status)
			t.Logf("λ̂ = %.3f ± %.3f, certified %s: %s", e.Lambda, e.LambdaSE, tc.lambda, c.Text)
			if !c.Consistent {
				t.Errorf("λ̂ = %.3f ± %.3f vs the certified %s: %s", e.Lambda, e.LambdaSE, tc.lambda, c.Text)
			}
		})
	}
}
