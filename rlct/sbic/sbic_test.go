package sbic

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// rat returns λ as a *big.Rat holding the float64 x exactly.
func rat(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }

// exact returns an exact pair (i, j) with the given float λ.
func exact(i, j int, lambda float64, theta int) Pair {
	return Pair{Model: i, Truth: j, Lambda: rat(lambda), Theta: theta, Status: rlct.Exact}
}

// chain returns the order links of a chain 0 ⪯ 1 ⪯ … ⪯ k−1.
func chain(k int) [][2]int {
	var out [][2]int
	for i := 1; i < k; i++ {
		out = append(out, [2]int{i - 1, i})
	}
	return out
}

// near reports |a − b| ≤ tol.
func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol }

// handChain builds the three-model chain of the package documentation,
// worked by hand: inputs chosen so that, at n = 100 (L = log n) and with the
// log-likelihoods shifted by shift, L'_11 = 1, L'_22 = 3, L'_21 = 8,
// L'_33 = 2, L'_31 = 6, L'_32 = 1 (the last through θ = 2, that is a factor
// log n), all times e^shift. By hand (see the package doc) the recursion gives
// L'(M_1) = 1, L'(M_2) = 4, L'(M_3) = 2, times e^shift.
func handChain(n, shift float64) ([]Model, [][2]int, []Pair, []float64) {
	L := math.Log(n)
	ll := []float64{0, L + math.Log(3), 2*L + math.Log(2)}
	pairs := []Pair{
		exact(0, 0, 0, 1),
		exact(1, 1, 1, 1),                     // ℓ_2 − 1·L = log 3
		exact(1, 0, (ll[1]-math.Log(8))/L, 1), // ℓ_2 − λL = log 8
		exact(2, 2, 2, 1),                     // ℓ_3 − 2L = log 2
		exact(2, 0, (ll[2]-math.Log(6))/L, 1), // ℓ_3 − λL = log 6
		exact(2, 1, (ll[2]+math.Log(L))/L, 2), // ℓ_3 − λL + log L = 0
	}
	for i := range ll {
		ll[i] += shift
	}
	models := []Model{{Name: "M1", Dim: 0}, {Name: "M2", Dim: 2}, {Name: "M3", Dim: 4}}
	return models, chain(3), pairs, ll
}

// TestChainByHand checks the recursion on the three-model chain worked by
// hand in the package documentation, at ordinary and at extreme
// magnitudes: n = 10^9 and log-likelihoods near −10^7. Shifting every
// log-likelihood by the same constant multiplies every L' by e^shift, so
// every score moves by the shift (the fixed-point equation is homogeneous
// of degree one; worked by hand).
func TestChainByHand(t *testing.T) {
	for _, tt := range []struct {
		n, shift float64
	}{
		{100, 0},
		{100, -1e7},
		{1e9, 0},
		{1e9, -1.234567e7},
		{1e9, 3e6},
	} {
		models, order, pairs, ll := handChain(tt.n, tt.shift)
		c, err := New(models, order, pairs)
		if err != nil {
			t.Fatal(err)
		}
		r, err := c.Choose(tt.n, ll)
		if err != nil {
			t.Fatal(err)
		}
		// Rounding: the inputs carry errors of an ulp or so of |shift| and
		// of λ·log n; allow four.
		tol := 4*0x1p-52*math.Abs(tt.shift) + 1e-13*(1+math.Log(tt.n))
		wantSBIC := []float64{0, math.Log(4), math.Log(2)}
		wantBIC := []float64{0, math.Log(3), math.Log(2)} // ℓ_i − (d_i/2)·log n
		for i := range 3 {
			if !near(r.Models[i].SBIC, tt.shift+wantSBIC[i], tol) {
				t.Errorf("n=%g shift=%g: sBIC(M%d) = %.17g, want %.17g (by hand)", tt.n, tt.shift, i+1, r.Models[i].SBIC, tt.shift+wantSBIC[i])
			}
			if !near(r.Models[i].BIC, tt.shift+wantBIC[i], tol) {
				t.Errorf("n=%g shift=%g: BIC(M%d) = %.17g, want %.17g", tt.n, tt.shift, i+1, r.Models[i].BIC, tt.shift+wantBIC[i])
			}
		}
		// Weights: L'(M_i) normalised, 1/7, 4/7, 2/7; BIC weights 1/6, 3/6, 2/6.
		for i, w := range []float64{1.0 / 7, 4.0 / 7, 2.0 / 7} {
			if !near(r.Models[i].WeightSBIC, w, 1e-6) {
				t.Errorf("n=%g shift=%g: sBIC weight of M%d = %g, want %g", tt.n, tt.shift, i+1, r.Models[i].WeightSBIC, w)
			}
		}
		for i, w := range []float64{1.0 / 6, 3.0 / 6, 2.0 / 6} {
			if !near(r.Models[i].WeightBIC, w, 1e-6) {
				t.Errorf("n=%g shift=%g: BIC weight of M%d = %g, want %g", tt.n, tt.shift, i+1, r.Models[i].WeightBIC, w)
			}
		}
		if r.SBIC.Model != 1 || r.BIC.Model != 1 || len(r.SBIC.Tied)+len(r.BIC.Tied) != 0 {
			t.Errorf("n=%g shift=%g: chosen %+v (sBIC) and %+v (BIC), want M2 for both, untied", tt.n, tt.shift, r.SBIC, r.BIC)
		}
		// The plain-number entry point gives the same scores.
		s, err := c.Scores(tt.n, ll)
		if err != nil {
			t.Fatal(err)
		}
		for i := range s {
			if s[i] != r.Models[i].SBIC {
				t.Errorf("Scores and Choose differ for M%d: %v, %v", i+1, s[i], r.Models[i].SBIC)
			}
		}
	}
}

// TestPriorsByHand checks a two-model chain with prior weights 1 and 3
// (P = 1/4, 3/4), worked by hand: L'_11 = 1, L'_22 = 1, L'_21 = 8 give
// x² − (1 − (1/3)·1)·x − (1/3)·8·1 = 0, so L'(M_2) = 2; check with (1):
// (8·¼·1 + 1·¾·2)/(¼·1 + ¾·2) = 3.5/1.75 = 2. Weights ∝ ¼·1 and ¾·2, that is
// 1/7 and 6/7.
func TestPriorsByHand(t *testing.T) {
	n := 1000.0
	L := math.Log(n)
	ll := []float64{-5, -5 + 3*L}
	models := []Model{{Name: "small", Dim: 1, Prior: 1}, {Name: "big", Dim: 6, Prior: 3}}
	// Every L' below carries the factor e^−5: ℓ_1 − 0·L = −5,
	// ℓ_2 − 3L = −5, ℓ_2 − λ_21·L = −5 + log 8.
	pairs := []Pair{
		exact(0, 0, 0, 1),
		exact(1, 1, 3, 1),
		exact(1, 0, (3*L-math.Log(8))/L, 1),
	}
	c, err := New(models, [][2]int{{0, 1}}, pairs)
	if err != nil {
		t.Fatal(err)
	}
	r, err := c.Choose(n, ll)
	if err != nil {
		t.Fatal(err)
	}
	if want := -5 + math.Log(2); !near(r.Models[1].SBIC, want, 1e-12) {
		t.Errorf("sBIC(big) = %.17g, want −5 + log 2 = %.17g", r.Models[1].SBIC, want)
	}
	if !near(r.Models[0].SBIC, -5, 1e-12) {
		t.Errorf("sBIC(small) = %.17g, want −5", r.Models[0].SBIC)
	}
	if !near(r.Models[0].WeightSBIC, 1.0/7, 1e-12) || !near(r.Models[1].WeightSBIC, 6.0/7, 1e-12) {
		t.Errorf("weights %g, %g; want 1/7, 6/7", r.Models[0].WeightSBIC, r.Models[1].WeightSBIC)
	}
	if r.SBIC.Model != 1 {
		t.Errorf("chosen %d, want big", r.SBIC.Model)
	}
}

// TestRegularIsBIC: with every pair regular (λ_ij = d_i/2, θ = 1) the sBIC
// is the BIC (the quadratic factors as (x − L'_ii)(x + …); Drton & Plummer
// 2017, from memory, and the package documentation), on a chain, a diamond
// and models that are not ordered, at ordinary and extreme magnitudes.
func TestRegularIsBIC(t *testing.T) {
	tests := []struct {
		name   string
		dims   []int
		order  [][2]int
		ll     []float64
		n      float64
		priors []float64
	}{
		{"chain", []int{0, 3, 5, 9}, chain(4), []float64{-120, -100.5, -97.25, -96}, 50, nil},
		{"chain, first ahead", []int{0, 3, 5, 9}, chain(4), []float64{-10, -100.5, -97.25, -96}, 50, nil},
		{"diamond", []int{1, 2, 2, 3}, [][2]int{{0, 1}, {0, 2}, {1, 3}, {2, 3}}, []float64{-40, -33, -35, -31}, 300, []float64{1, 2, 3, 4}},
		{"unordered", []int{2, 4, 1}, nil, []float64{-7, -6, -8}, 10, nil},
		{"extreme", []int{0, 7, 12, 15}, chain(4), []float64{-1.0000003e7, -1e7, -9.9999e6, -9.99989e6}, 1e9, nil},
		{"extreme, far apart", []int{0, 7, 12, 15}, chain(4), []float64{-3e7, -2e7, -1e7, -1e7 + 0.5}, 1e9, []float64{5, 1, 1, 1}},
		{"long chain", []int{0, 1, 2, 3, 4, 5, 6, 7, 8, 9}, chain(10), []float64{-500, -450, -420, -410, -405, -404, -403.5, -403.4, -403.3, -403.2}, 1e4, nil},
	}
	for _, tt := range tests {
		var models []Model
		var pairs []Pair
		for i, d := range tt.dims {
			m := Model{Name: string(rune('A' + i)), Dim: d}
			if tt.priors != nil {
				m.Prior = tt.priors[i]
			}
			models = append(models, m)
		}
		// Every pair j ⪯ i, from the closure of the order worked out with
		// a plain reachability loop here.
		le := reach(len(tt.dims), tt.order)
		for i := range tt.dims {
			for j := range tt.dims {
				if le[j][i] {
					pairs = append(pairs, Pair{Model: i, Truth: j, Lambda: big.NewRat(int64(tt.dims[i]), 2), Theta: 1, Status: rlct.Exact})
				}
			}
		}
		c, err := New(models, tt.order, pairs)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		r, err := c.Choose(tt.n, tt.ll)
		if err != nil {
			t.Fatal(err)
		}
		for i, m := range r.Models {
			bic := tt.ll[i] - float64(tt.dims[i])/2*math.Log(tt.n) // Schwarz 1978
			tol := 8 * float64(len(tt.dims)) * 0x1p-52 * (math.Abs(bic) + math.Abs(tt.ll[i]) + 1)
			if !near(m.SBIC, bic, tol) || !near(m.BIC, bic, tol) {
				t.Errorf("%s: %s: sBIC %.17g, BIC %.17g, want both %.17g", tt.name, m.Name, m.SBIC, m.BIC, bic)
			}
			if !near(m.WeightSBIC, m.WeightBIC, 1e-9) {
				t.Errorf("%s: %s: weights %g and %g differ", tt.name, m.Name, m.WeightSBIC, m.WeightBIC)
			}
		}
		if r.SBIC.Model != r.BIC.Model {
			t.Errorf("%s: choices differ: %d and %d", tt.name, r.SBIC.Model, r.BIC.Model)
		}
	}
}

// reach returns the reflexive-transitive closure of the links, by
// repeated relaxation (independent of New's algorithm).
func reach(k int, order [][2]int) [][]bool {
	le := make([][]bool, k)
	for i := range le {
		le[i] = make([]bool, k)
		le[i][i] = true
	}
	for changed := true; changed; {
		changed = false
		for _, o := range order {
			for m := range k {
				if le[o[1]][m] && !le[o[0]][m] {
					le[o[0]][m] = true
					changed = true
				}
			}
		}
	}
	return le
}

// TestSingleModel: one model, one pair: L'(M) = L'_11, so
// sBIC = ℓ − λ·log n + (θ − 1)·log log n (by hand), and it is chosen.
func TestSingleModel(t *testing.T) {
	c, err := New([]Model{{Name: "only", Dim: 4}}, nil, []Pair{{Lambda: big.NewRat(1, 2), Theta: 2, Status: rlct.UpperBound}})
	if err != nil {
		t.Fatal(err)
	}
	r, err := c.Choose(100, []float64{-10})
	if err != nil {
		t.Fatal(err)
	}
	want := -10 - 0.5*math.Log(100) + math.Log(math.Log(100))
	if !near(r.Models[0].SBIC, want, 1e-12) || r.SBIC.Model != 0 || r.Models[0].WeightSBIC != 1 {
		t.Errorf("got %+v, want sBIC %.17g, chosen, weight 1", r.Models[0], want)
	}
	if !near(r.Models[0].BIC, -10-2*math.Log(100), 1e-12) {
		t.Errorf("BIC %.17g", r.Models[0].BIC)
	}
	// The one pair is a bound: the score rests on it, and replacing it by
	// the regular value (λ = 2, θ = 1) gives the BIC and the same choice.
	if r.Models[0].Status != rlct.UpperBound || len(r.Sensitivity) != 1 {
		t.Fatalf("status %v, sensitivity %+v", r.Models[0].Status, r.Sensitivity)
	}
	s := r.Sensitivity[0]
	if !near(s.Regular.SBIC[0], r.Models[0].BIC, 1e-12) || s.Regular.Changed || s.Estimate != nil {
		t.Errorf("regular scenario %+v", s)
	}
}

// TestTies: two unordered models with the same data tie exactly under both
// criteria; the one of least dimension is chosen, then the first given.
// A tie survives the common scale of n = 10^9 and ℓ ≈ −10^7.
func TestTies(t *testing.T) {
	for _, tt := range []struct {
		dims     []int
		ll       []float64
		n        float64
		want     int
		wantTied []int
	}{
		{[]int{3, 3}, []float64{-50, -50}, 100, 0, []int{1}},
		{[]int{4, 3}, []float64{-50 + 0.5*math.Log(100), -50}, 100, 1, []int{0}}, // BIC equal: −50 − 1.5 log n
		{[]int{15, 15, 7}, []float64{-1e7 - 0.1, -1e7 - 0.1, -1e7 - 4*math.Log(1e9) - 0.1}, 1e9, 2, []int{0, 1}},
	} {
		var models []Model
		var pairs []Pair
		for i, d := range tt.dims {
			models = append(models, Model{Name: string(rune('a' + i)), Dim: d})
			pairs = append(pairs, Pair{Model: i, Truth: i, Lambda: big.NewRat(int64(d), 2), Theta: 1, Status: rlct.Exact})
		}
		c, err := New(models, nil, pairs)
		if err != nil {
			t.Fatal(err)
		}
		r, err := c.Choose(tt.n, tt.ll)
		if err != nil {
			t.Fatal(err)
		}
		for _, ch := range []Choice{r.BIC, r.SBIC} {
			if ch.Model != tt.want || !equalInts(ch.Tied, tt.wantTied) {
				t.Errorf("dims %v ll %v: choice %+v, want %d tied with %v", tt.dims, tt.ll, ch, tt.want, tt.wantTied)
			}
		}
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestBadInput: every malformed candidate set is an input error whose
// message names the problem, and nothing panics.
func TestBadInput(t *testing.T) {
	two := []Model{{Name: "small", Dim: 1}, {Name: "big", Dim: 3}}
	good := []Pair{exact(0, 0, 0.5, 1), exact(1, 1, 1.5, 1), exact(1, 0, 1, 1)}
	with := func(i int, p Pair) []Pair {
		out := append([]Pair(nil), good...)
		out[i] = p
		return out
	}
	tests := []struct {
		name     string
		models   []Model
		order    [][2]int
		pairs    []Pair
		sentinel error
		want     []string
	}{
		{"no models", nil, nil, nil, ErrInput, []string{"no models"}},
		{"cycle of two", two, [][2]int{{0, 1}, {1, 0}}, good, ErrCycle, []string{`"small" ⪯ "big" ⪯ "small"`}},
		{"cycle of three", []Model{{Name: "a"}, {Name: "b"}, {Name: "c"}}, [][2]int{{0, 1}, {1, 2}, {2, 0}}, nil, ErrCycle, []string{`"a" ⪯ "b" ⪯ "c" ⪯ "a"`}},
		{"missing pair", two, [][2]int{{0, 1}}, good[:2], ErrMissingPair, []string{`no pair for model "big" at a truth in "small"`}},
		{"missing diagonal", two, [][2]int{{0, 1}}, good[1:], ErrMissingPair, []string{`no pair for model "small" at a truth in "small"`}},
		{"missing through transitivity", []Model{{Name: "a"}, {Name: "b"}, {Name: "c"}}, [][2]int{{0, 1}, {1, 2}},
			[]Pair{exact(0, 0, 0, 1), exact(1, 1, 0, 1), exact(2, 2, 0, 1), exact(1, 0, 0, 1), exact(2, 1, 0, 1)}, ErrMissingPair, []string{`"c" at a truth in "a"`}},
		{"pair not in order", two, nil, good, ErrInput, []string{`"small" ⪯ "big" is not in the order`}},
		{"pair twice", two, [][2]int{{0, 1}}, append(good, exact(1, 0, 1, 1)), ErrInput, []string{`"big" at "small" is given twice`}},
		{"negative lambda", two, [][2]int{{0, 1}}, with(2, exact(1, 0, -1, 1)), ErrInput, []string{`"big" at "small"`, "negative"}},
		{"theta zero", two, [][2]int{{0, 1}}, with(2, exact(1, 0, 1, 0)), ErrInput, []string{"θ = 0"}},
		{"no lambda", two, [][2]int{{0, 1}}, with(2, Pair{Model: 1, Truth: 0, Theta: 1, Status: rlct.Exact}), ErrInput, []string{"λ is not given"}},
		{"bad status", two, [][2]int{{0, 1}}, with(2, Pair{Model: 1, Truth: 0, Lambda: big.NewRat(1, 1), Theta: 1, Status: "certain"}), ErrInput, []string{`unknown status "certain"`}},
		{"bad estimate", two, [][2]int{{0, 1}}, with(2, Pair{Model: 1, Truth: 0, Lambda: big.NewRat(1, 1), Theta: 1, Status: rlct.UpperBound, Estimate: &Value{big.NewRat(1, 2), 0}}), ErrInput, []string{"estimate", "θ = 0"}},
		{"index out of range", two, [][2]int{{0, 2}}, good, ErrInput, []string{"out of range"}},
		{"pair index out of range", two, [][2]int{{0, 1}}, append(good, exact(5, 0, 1, 1)), ErrInput, []string{"out of range"}},
		{"same name", []Model{{Name: "m"}, {Name: "m"}}, nil, nil, ErrInput, []string{`both named "m"`}},
		{"no name", []Model{{Name: " "}}, nil, nil, ErrInput, []string{"model 1 has no name"}},
		{"negative dim", []Model{{Name: "m", Dim: -1}}, nil, nil, ErrInput, []string{"dimension -1"}},
		{"negative prior", []Model{{Name: "m", Prior: -1}}, nil, nil, ErrInput, []string{"prior weight"}},
		{"NaN prior", []Model{{Name: "m", Prior: math.NaN()}}, nil, nil, ErrInput, []string{"prior weight"}},
	}
	for _, tt := range tests {
		_, err := New(tt.models, tt.order, tt.pairs)
		if err == nil {
			t.Errorf("%s: no error", tt.name)
			continue
		}
		if !errors.Is(err, tt.sentinel) || !errors.Is(err, ErrInput) || !errors.Is(err, rlct.ErrInput) {
			t.Errorf("%s: %v does not match %v, ErrInput and rlct.ErrInput", tt.name, err, tt.sentinel)
		}
		for _, w := range tt.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q does not say %q", tt.name, err, w)
			}
		}
	}
}

// TestBadData: the sample size and log-likelihoods are checked.
func TestBadData(t *testing.T) {
	c, err := New([]Model{{Name: "m", Dim: 1}}, nil, []Pair{exact(0, 0, 0.5, 1)})
	if err != nil {
		t.Fatal(err)
	}
	for _, tt := range []struct {
		n    float64
		ll   []float64
		want string
	}{
		{2.7, []float64{0}, "greater than e"},
		{math.NaN(), []float64{0}, "greater than e"},
		{math.Inf(1), []float64{0}, "finite"},
		{10, []float64{math.Inf(-1)}, `"m": log-likelihood -Inf is not finite`},
		{10, []float64{math.NaN()}, "not finite"},
		{10, []float64{1, 2}, "2 log-likelihoods for 1 models"},
	} {
		_, err1 := c.Scores(tt.n, tt.ll)
		_, err2 := c.Choose(tt.n, tt.ll)
		_, err3 := c.BIC(tt.n, tt.ll)
		for _, err := range []error{err1, err2, err3} {
			if err == nil || !errors.Is(err, ErrInput) || !strings.Contains(err.Error(), tt.want) {
				t.Errorf("n=%g ll=%v: error %v, want one saying %q", tt.n, tt.ll, err, tt.want)
			}
		}
	}
}

// TestPositiveRoot checks the root in both branches and at β = 0 against
// the quadratic formula worked by hand: x² − 2x − 8 = 0 has x = 4;
// x² + 3x − 10 = 0 has x = 2; x² − 9 = 0 has x = 3; x² − 5x − 0 = 0 has
// x = 5 (γ = 0); and far outside float64 range, x² − βx − γ with
// β = −e^800 (a = 0 is negligible) and γ = e^1000 has x ≈ γ/|β| = e^200.
func TestPositiveRoot(t *testing.T) {
	for _, tt := range []struct {
		a, b, g, want float64
	}{
		{math.Log(3), math.Log(1), math.Log(8), math.Log(4)},
		{math.Log(2), math.Log(5), math.Log(10), math.Log(2)},
		{math.Log(7), math.Log(7), math.Log(9), math.Log(3)},
		{math.Log(5), math.Inf(-1), math.Inf(-1), math.Log(5)},
		{0, 800, 1000, 200},
		{800, 0, 1000, 800}, // β ≈ e^800 ≫ √γ = e^500: x ≈ β
	} {
		if got := positiveRoot(tt.a, tt.b, tt.g); !near(got, tt.want, 1e-12*(1+math.Abs(tt.want))) {
			t.Errorf("positiveRoot(%g, %g, %g) = %.17g, want %.17g", tt.a, tt.b, tt.g, got, tt.want)
		}
	}
}

// TestSensitivityByHand: a two-model chain where the choice rests on a
// bound. At n = 100 (L = log 100), ℓ_small = 0 and ℓ_big = 2L − log 2 with
// d_big = 4: L'_small,small = 1 and L'_big,big = e^(ℓ − 2L) = 1/2. The pair
// (big, small) is an upper bound λ = 1/2, so L'_big,small = e^(ℓ − L/2) =
// 100^1.5/2 = 500, and x² − (1/2 − 1)·x − 500 = 0 gives
// L'(big) = (−1 + √8001)/4 ≈ 22.11 > 1: sBIC chooses big. Replaced by the
// regular value (λ = 2, θ = 1), L'_big,small = 1/2 = L'_big,big and
// L'(big) = 1/2 < 1: the choice changes to small (and sBIC = BIC there).
// Replaced by the estimate λ = 1, L'_big,small = 50, x² + x/2 − 50 = 0,
// L'(big) = (−1 + √801)/4 ≈ 6.83: the choice stays. All worked by hand.
func TestSensitivityByHand(t *testing.T) {
	n := 100.0
	L := math.Log(n)
	models := []Model{{Name: "small", Dim: 0}, {Name: "big", Dim: 4}}
	pairs := []Pair{
		{Model: 0, Truth: 0, Lambda: big.NewRat(0, 1), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 1, Lambda: big.NewRat(2, 1), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 0, Lambda: big.NewRat(1, 2), Theta: 1, Status: rlct.UpperBound, Estimate: &Value{big.NewRat(1, 1), 1}},
	}
	c, err := New(models, [][2]int{{0, 1}}, pairs)
	if err != nil {
		t.Fatal(err)
	}
	r, err := c.Choose(n, []float64{0, 2*L - math.Log(2)})
	if err != nil {
		t.Fatal(err)
	}
	if want := math.Log((-1 + math.Sqrt(8001)) / 4); !near(r.Models[1].SBIC, want, 1e-12) || r.SBIC.Model != 1 {
		t.Errorf("sBIC(big) = %.17g, chosen %d; want %.17g, big", r.Models[1].SBIC, r.SBIC.Model, want)
	}
	if r.BIC.Model != 0 {
		t.Errorf("BIC chooses %d, want small (BIC(big) = log 1/2 < 0)", r.BIC.Model)
	}
	if r.Models[0].Status != rlct.Exact || len(r.Models[0].RestsOn) != 0 || r.Models[1].Status != rlct.UpperBound || !equalInts(r.Models[1].RestsOn, []int{2}) {
		t.Errorf("statuses: %+v", r.Models)
	}
	if len(r.Sensitivity) != 1 {
		t.Fatalf("sensitivity %+v", r.Sensitivity)
	}
	s := r.Sensitivity[0]
	if s.Pair != 2 || !equalInts(s.Affects, []int{1}) {
		t.Errorf("pair %d affects %v, want pair 2 affecting big", s.Pair, s.Affects)
	}
	if !near(s.Regular.SBIC[1], math.Log(0.5), 1e-12) || s.Regular.Choice.Model != 0 || !s.Regular.Changed {
		t.Errorf("regular: %+v, want sBIC(big) = log 1/2, choice small, changed", s.Regular)
	}
	if s.Regular.SBIC[0] != r.Models[0].SBIC {
		t.Errorf("regular scenario moved the score of small, which does not rest on the pair")
	}
	if s.Estimate == nil || !near(s.Estimate.SBIC[1], math.Log((-1+math.Sqrt(801))/4), 1e-12) || s.Estimate.Changed {
		t.Errorf("estimate: %+v", s.Estimate)
	}
	if r.AllRegular == nil || r.AllRegular.SBIC[1] != s.Regular.SBIC[1] || r.AllEstimates == nil || r.AllEstimates.SBIC[1] != s.Estimate.SBIC[1] {
		t.Errorf("all-at-once scenarios differ from the single one: %+v %+v", r.AllRegular, r.AllEstimates)
	}
}

// TestRestsOn: in a chain a ⪯ b ⪯ c, a pair of b rests under the scores of b
// and c (c's recursion uses L'(b)), a pair of c only under c; the weakest
// status wins.
func TestRestsOn(t *testing.T) {
	models := []Model{{Name: "a", Dim: 1}, {Name: "b", Dim: 2}, {Name: "c", Dim: 3}}
	pairs := []Pair{
		exact(0, 0, 0.5, 1), exact(1, 1, 1, 1), exact(2, 2, 1.5, 1), exact(2, 0, 1, 1),
		{Model: 1, Truth: 0, Lambda: big.NewRat(3, 4), Theta: 1, Status: rlct.Uncertified},
		{Model: 2, Truth: 1, Lambda: big.NewRat(5, 4), Theta: 1, Status: rlct.UpperBound},
	}
	c, err := New(models, chain(3), pairs)
	if err != nil {
		t.Fatal(err)
	}
	r, err := c.Choose(50, []float64{-20, -18, -17})
	if err != nil {
		t.Fatal(err)
	}
	want := []struct {
		status  rlct.Status
		restsOn []int
	}{{rlct.Exact, nil}, {rlct.Uncertified, []int{4}}, {rlct.Uncertified, []int{4, 5}}}
	for i, w := range want {
		if r.Models[i].Status != w.status || !equalInts(r.Models[i].RestsOn, w.restsOn) {
			t.Errorf("%s: status %s rests on %v; want %s, %v", models[i].Name, r.Models[i].Status, r.Models[i].RestsOn, w.status, w.restsOn)
		}
	}
	if len(r.Sensitivity) != 2 || !equalInts(r.Sensitivity[0].Affects, []int{1, 2}) || !equalInts(r.Sensitivity[1].Affects, []int{2}) {
		t.Errorf("sensitivity %+v", r.Sensitivity)
	}
	// Replacing b's pair moves b and c but never a.
	reg := r.Sensitivity[0].Regular
	if reg.SBIC[0] != r.Models[0].SBIC || reg.SBIC[1] == r.Models[1].SBIC || reg.SBIC[2] == r.Models[2].SBIC {
		t.Errorf("regular scenario for (b, a): %v against %v", reg.SBIC, []float64{r.Models[0].SBIC, r.Models[1].SBIC, r.Models[2].SBIC})
	}
	if r.AllEstimates != nil {
		t.Errorf("no estimates were given, but AllEstimates = %+v", r.AllEstimates)
	}
}

// BenchmarkScores scores a chain of ten models, as a research loop over
// data sets would.
func BenchmarkScores(b *testing.B) {
	k := 10
	var models []Model
	var pairs []Pair
	for i := range k {
		models = append(models, Model{Name: string(rune('a' + i)), Dim: 2 * i})
		for j := 0; j <= i; j++ {
			pairs = append(pairs, Pair{Model: i, Truth: j, Lambda: big.NewRat(int64(i+j), 2), Theta: 1 + (i+j)%2, Status: rlct.Exact})
		}
	}
	c, err := New(models, chain(k), pairs)
	if err != nil {
		b.Fatal(err)
	}
	ll := make([]float64, k)
	for i := range ll {
		ll[i] = -1e4 + 3*float64(i)
	}
	for b.Loop() {
		if _, err := c.Scores(1e4, ll); err != nil {
			b.Fatal(err)
		}
	}
}

// TestFixedPointHolds: on random partial orders, priors, pairs and data,
// every score satisfies the fixed-point equation (1) of the package
// documentation, L'(M_i)·Σ_{j⪯i} P_j·L'(M_j) = Σ_{j⪯i} P_j·L'_ij·L'(M_j),
// evaluated directly in float64 after a shift (the inputs are kept in a
// range where that cannot overflow).
func TestFixedPointHolds(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 2017))
	for trial := range 300 {
		k := 1 + rng.IntN(6)
		var models []Model
		for i := range k {
			models = append(models, Model{Name: fmt.Sprint("m", i), Dim: rng.IntN(10), Prior: float64(rng.IntN(3))})
		}
		// Links only from lower to higher index: acyclic.
		var order [][2]int
		for i := range k {
			for j := range i {
				if rng.IntN(3) == 0 {
					order = append(order, [2]int{j, i})
				}
			}
		}
		le := reach(k, order)
		var pairs []Pair
		for i := range k {
			for j := range k {
				if le[j][i] {
					pairs = append(pairs, Pair{Model: i, Truth: j, Lambda: big.NewRat(int64(rng.IntN(12)), 4), Theta: 1 + rng.IntN(3), Status: rlct.Exact})
				}
			}
		}
		c, err := New(models, order, pairs)
		if err != nil {
			t.Fatal(err)
		}
		n := math.Exp(1.5 + 8*rng.Float64())
		ll := make([]float64, k)
		for i := range ll {
			ll[i] = -200 + 60*rng.Float64()
		}
		s, err := c.Scores(n, ll)
		if err != nil {
			t.Fatal(err)
		}
		prior := func(i int) float64 {
			if models[i].Prior == 0 {
				return 1
			}
			return models[i].Prior
		}
		const shift = 200
		for i := range k {
			x := math.Exp(s[i] + shift)
			lhs, rhs := 0.0, 0.0
			for _, p := range pairs {
				if p.Model != i {
					continue
				}
				j := p.Truth
				lam, _ := p.Lambda.Float64()
				lij := math.Exp(ll[i] + shift - lam*math.Log(n) + float64(p.Theta-1)*math.Log(math.Log(n)))
				lj := math.Exp(s[j] + shift)
				lhs += prior(j) * lj
				rhs += prior(j) * lij * lj
			}
			lhs *= x
			if !(x > 0) || math.Abs(lhs-rhs) > 1e-10*math.Max(lhs, rhs) {
				t.Fatalf("trial %d, model %d: L' = %g, (1) gives %g against %g", trial, i, x, lhs, rhs)
			}
		}
	}
}

// TestExtremeInputsStayFinite: far outside any realistic range (λ up to
// 10^6, |ℓ| up to 10^12, n up to 10^300) every score, weight and scenario
// is finite and the weights sum to 1.
func TestExtremeInputsStayFinite(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	for trial := range 200 {
		k := 1 + rng.IntN(5)
		var models []Model
		for i := range k {
			models = append(models, Model{Name: fmt.Sprint("m", i), Dim: rng.IntN(1000)})
		}
		order := chain(k)
		var pairs []Pair
		for i := range k {
			for j := 0; j <= i; j++ {
				lam := big.NewRat(rng.Int64N(1_000_000), 1+rng.Int64N(3))
				pairs = append(pairs, Pair{Model: i, Truth: j, Lambda: lam, Theta: 1 + rng.IntN(50), Status: []rlct.Status{rlct.Exact, rlct.UpperBound, rlct.Uncertified}[rng.IntN(3)],
					Estimate: &Value{big.NewRat(rng.Int64N(1000), 1), 1}})
			}
		}
		c, err := New(models, order, pairs)
		if err != nil {
			t.Fatal(err)
		}
		n := math.Pow(10, 0.5+299*rng.Float64())
		ll := make([]float64, k)
		for i := range ll {
			ll[i] = (rng.Float64() - 0.5) * math.Pow(10, 12*rng.Float64())
		}
		r, err := c.Choose(n, ll)
		if err != nil {
			t.Fatal(err)
		}
		finite := func(xs ...float64) bool {
			for _, x := range xs {
				if math.IsNaN(x) || math.IsInf(x, 0) {
					return false
				}
			}
			return true
		}
		sum := 0.0
		for _, m := range r.Models {
			if !finite(m.SBIC, m.BIC, m.WeightBIC, m.WeightSBIC) {
				t.Fatalf("trial %d: %+v", trial, m)
			}
			sum += m.WeightSBIC
		}
		if math.Abs(sum-1) > 1e-9 {
			t.Fatalf("trial %d: sBIC weights sum to %g", trial, sum)
		}
		for _, ps := range r.Sensitivity {
			if !finite(ps.Regular.SBIC...) || (ps.Estimate != nil && !finite(ps.Estimate.SBIC...)) {
				t.Fatalf("trial %d: scenario %+v", trial, ps)
			}
		}
	}
}
