package sbic

import (
	"context"
	"fmt"
	"math/big"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// TestReducedRankTable checks ReducedRank on the shape of Drton & Plummer's
// Table 1 (N = 5 outputs, M = 3 inputs; the table's values come from Aoyagi
// & Watanabe 2005; the shape is recalled from memory and the table was not
// at hand). Each expected value was worked by hand from the formula in the
// ReducedRank documentation (Aoyagi & Watanabe 2005, Neural Networks 18,
// main theorem, from memory):
//
//	(H, r) = (2, 0): 5 ≤ 5, 3 ≤ 7, 2 ≤ 8, sum 10 even: (2·2·8 − 4 − 4)/8 = 3
//	(3, 0): 5 ≤ 6, 3 ≤ 8, 3 ≤ 8, sum 11 odd: (2·3·8 − 4 − 9 + 1)/8 = 9/2, θ = 2
//	(3, 1): 6 ≤ 6, 4 ≤ 8, 4 ≤ 8, sum 12 even: (2·4·8 − 4 − 16)/8 = 11/2
//	(1, 0): M+H = 4 < N+r = 5: (3 − 0 + 0)/2 = 3/2 = min(M, N)/2
//	(2, 1): 5 < 6: (6 − 2 + 5)/2 = 9/2;  (3, 2): 6 < 7: (9 − 6 + 10)/2 = 13/2
//	(H, H): H(M+N−H)/2 = 0, 7/2, 6, 15/2 (the regular value: the rank-H
//	matrices form a manifold of dimension H(M+N−H), common practice)
func TestReducedRankTable(t *testing.T) {
	const m, n = 3, 5
	want := map[[2]int]string{
		{0, 0}: "0 1",
		{1, 0}: "3/2 1", {1, 1}: "7/2 1",
		{2, 0}: "3 1", {2, 1}: "9/2 1", {2, 2}: "6 1",
		{3, 0}: "9/2 2", {3, 1}: "11/2 1", {3, 2}: "13/2 1", {3, 3}: "15/2 1",
	}
	for hr, w := range want {
		v, err := ReducedRank(m, n, hr[0], hr[1])
		if err != nil {
			t.Fatal(err)
		}
		if got := fmt.Sprintf("%s %d", v.Lambda.RatString(), v.Theta); got != w {
			t.Errorf("λ(M=3, N=5, H=%d, r=%d) = %s, want %s (by hand)", hr[0], hr[1], got, w)
		}
	}
	// Other shapes, by hand: H = 1, r = 0 is min(M, N)/2 with θ = 2 exactly
	// when M = N (K = (Σ b_i²)(Σ a_j²), normal crossings of two definite
	// forms; Watanabe 2009, ch. 2); M+N < H+r is MN/2.
	for _, tt := range []struct {
		m, n, h, r int
		want       string
	}{
		{2, 2, 1, 0, "1 2"}, {4, 2, 1, 0, "1 1"}, {1, 3, 1, 0, "1/2 1"}, {3, 3, 1, 0, "3/2 2"},
		{1, 1, 3, 0, "1/2 1"}, {2, 2, 2, 0, "3/2 1"},
	} {
		v, err := ReducedRank(tt.m, tt.n, tt.h, tt.r)
		if err != nil {
			t.Fatal(err)
		}
		if got := fmt.Sprintf("%s %d", v.Lambda.RatString(), v.Theta); got != tt.want {
			t.Errorf("λ(M=%d, N=%d, H=%d, r=%d) = %s, want %s", tt.m, tt.n, tt.h, tt.r, got, tt.want)
		}
	}
	for _, bad := range [][4]int{{0, 1, 1, 0}, {1, 0, 1, 0}, {2, 2, 1, 2}, {2, 2, -1, 0}, {2, 2, 1, -1}} {
		if _, err := ReducedRank(bad[0], bad[1], bad[2], bad[3]); err == nil || !strings.Contains(err.Error(), "0 ≤ r ≤ H") {
			t.Errorf("ReducedRank%v: error %v", bad, err)
		}
	}
}

// lowRankSOS returns the entries of B·A (B N×H, A H×M) as generators: K =
// ‖BA‖² in sum-of-squares form, the divergence of reduced rank regression
// at the rank-0 truth up to a positive definite input covariance, which
// changes neither λ nor θ (common practice).
func lowRankSOS(m, n, h int) []string {
	var out []string
	for i := 1; i <= n; i++ {
		for j := 1; j <= m; j++ {
			var terms []string
			for k := 1; k <= h; k++ {
				terms = append(terms, fmt.Sprintf("b%d_%d*a%d_%d", i, k, k, j))
			}
			out = append(out, strings.Join(terms, " + "))
		}
	}
	return out
}

// TestReducedRankAgainstLctkit cross-checks the formula with lctkit's own
// certified answers at the rank-0 truth for M = 3, N = 5: H = 1 is exact
// and equal to min(M, N)/2 = 3/2 (the formula and a hand derivation agree,
// see TestReducedRankTable); for H = 2, 3 lctkit certifies only an upper
// bound, which must lie at or above the formula's pair in the order of
// rlct.Less.
func TestReducedRankAgainstLctkit(t *testing.T) {
	for h := 1; h <= 3; h++ {
		spec := rlct.Spec{SOS: lowRankSOS(3, 5, h)}
		p, err := spec.Problem()
		if err != nil {
			t.Fatal(err)
		}
		res, err := rlct.Bound(context.Background(), p, nil)
		if err != nil {
			t.Fatal(err)
		}
		v, _ := ReducedRank(3, 5, h, 0)
		formula := &rlct.Result{Lambda: v.Lambda, Theta: v.Theta}
		switch {
		case res.Status == rlct.Exact:
			if res.Lambda.Cmp(v.Lambda) != 0 || res.Theta != v.Theta {
				t.Errorf("H=%d: lctkit exact (%s, %d), formula (%s, %d)", h, res.Lambda.RatString(), res.Theta, v.Lambda.RatString(), v.Theta)
			}
		case res.Status == rlct.UpperBound:
			if rlct.Less(res, formula) {
				t.Errorf("H=%d: lctkit's bound (%s, %d) lies below the formula (%s, %d)", h, res.Lambda.RatString(), res.Theta, v.Lambda.RatString(), v.Theta)
			}
		default:
			t.Errorf("H=%d: status %s", h, res.Status)
		}
		if h == 1 && (res.Status != rlct.Exact || res.Lambda.Cmp(big.NewRat(3, 2)) != 0) {
			t.Errorf("H=1: lctkit gives (%s, %s), want exact 3/2 = min(M, N)/2", res.Lambda.RatString(), res.Status)
		}
	}
}
