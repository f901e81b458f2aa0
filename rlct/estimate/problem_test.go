package estimate

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// problemOf parses a spec, failing the test on errors.
func problemOf(t *testing.T, s rlct.Spec) *rlct.Problem {
	t.Helper()
	p, err := s.Problem()
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestProblemEvaluator compares the translated, compiled K with K written
// out by hand in the offsets u from the point.
func TestProblemEvaluator(t *testing.T) {
	tests := []struct {
		name string
		spec rlct.Spec
		want func(u []float64) float64
		sos  bool
	}{
		{"origin", rlct.Spec{K: "x^2*y^2 + x^4"}, func(u []float64) float64 {
			return u[0]*u[0]*u[1]*u[1] + math.Pow(u[0], 4)
		}, false},
		{"shifted", rlct.Spec{K: "(x-1)^2*y^2 + (y-x+1)^4", At: []string{"x=1"}}, func(u []float64) float64 {
			return u[0]*u[0]*u[1]*u[1] + math.Pow(u[1]-u[0], 4)
		}, false},
		{"sum of squares shifted", rlct.Spec{SOS: []string{"s*g1 - 1; s*g2"}, At: []string{"s=1,g1=1"}}, func(u []float64) float64 {
			a := (1+u[0])*(1+u[1]) - 1
			b := (1 + u[0]) * u[2]
			return a*a + b*b
		}, true},
		{"rational point", rlct.Spec{K: "(3*x - 1)^2 + y^2", At: []string{"x=1/3"}}, func(u []float64) float64 {
			return 9*u[0]*u[0] + u[1]*u[1]
		}, false},
	}
	points := [][]float64{{0.3, -0.7, 0.2}, {1, 1, -1}, {-0.25, 0.5, 0.125}, {1e-5, -2e-6, 3e-7}}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ev, err := NewProblemEvaluator(problemOf(t, tc.spec))
			if err != nil {
				t.Fatal(err)
			}
			if ev.SumOfSquares != tc.sos {
				t.Errorf("SumOfSquares = %v, want %v", ev.SumOfSquares, tc.sos)
			}
			for _, x := range points {
				u := x[:ev.NumVars()]
				got, want := ev.Eval(u), tc.want(u)
				if math.Abs(got-want) > 1e-14*math.Max(1, math.Abs(want)) {
					t.Errorf("K(%v) = %.17g, want %.17g", u, got, want)
				}
			}
		})
	}
}

// TestProblemEvaluatorExactTranslation checks that the translation is exact:
// (x − 1/3)²·y² at x = 1/3 is the polynomial x²y² itself, term for term.
func TestProblemEvaluatorExactTranslation(t *testing.T) {
	ev, err := NewProblemEvaluator(problemOf(t, rlct.Spec{K: "(x - 1/3)^2*y^2", At: []string{"x=1/3"}}))
	if err != nil {
		t.Fatal(err)
	}
	if got := ev.Polys[0].String(); got != "x^2*y^2" {
		t.Errorf("translated K = %s, want x^2*y^2", got)
	}
}

func TestProblemEvaluatorErrors(t *testing.T) {
	p := problemOf(t, rlct.Spec{K: "x^2*(1-cos(y))", Order: 6})
	p.Points = [][]*big.Rat{{big.NewRat(1, 1), new(big.Rat)}}
	if _, err := NewProblemEvaluator(p); !errors.Is(err, rlct.ErrShiftSeries) {
		t.Errorf("shifted series: err = %v, want rlct.ErrShiftSeries", err)
	}
	p = problemOf(t, rlct.Spec{K: "x^2+y^2"})
	p.Points = [][]*big.Rat{{new(big.Rat)}}
	if _, err := NewProblemEvaluator(p); !errors.Is(err, rlct.ErrDimension) {
		t.Errorf("short point: err = %v, want rlct.ErrDimension", err)
	}
	p.Points = [][]*big.Rat{{new(big.Rat), new(big.Rat)}, {new(big.Rat), new(big.Rat)}}
	if _, err := NewProblemEvaluator(p); !errors.Is(err, ErrSeveralPoints) {
		t.Errorf("two points: err = %v, want ErrSeveralPoints", err)
	}
	if _, err := Prior(p); !errors.Is(err, ErrSeveralPoints) {
		t.Errorf("Prior, two points: err = %v, want ErrSeveralPoints", err)
	}
	if _, err := NewProblemEvaluator(&rlct.Problem{}); !errors.Is(err, rlct.ErrNoFunction) {
		t.Errorf("empty problem: err = %v, want rlct.ErrNoFunction", err)
	}
}

// TestProblemForms checks that a malformed problem gives the same error as
// rlct.Bound gives for it.
func TestProblemForms(t *testing.T) {
	k := problemOf(t, rlct.Spec{K: "x^2+y^2"}).K
	g := problemOf(t, rlct.Spec{SOS: []string{"x; y"}}).Generators
	other := problemOf(t, rlct.Spec{SOS: []string{"x; z"}, Vars: []string{"x", "z"}}).Generators
	noVars := monomial.Zero(nil)
	tests := []struct {
		name string
		p    *rlct.Problem
		want error
	}{
		{"both forms", &rlct.Problem{K: k, Generators: g}, rlct.ErrTwoForms},
		{"neither", &rlct.Problem{}, rlct.ErrNoFunction},
		{"no variables", &rlct.Problem{K: noVars}, rlct.ErrNoVariables},
		{"generators on other variables", &rlct.Problem{Generators: append(g[:1:1], other[1])}, rlct.ErrVariables},
		{"nil generator", &rlct.Problem{Generators: append(g[:1:1], nil)}, rlct.ErrVariables},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := NewProblemEvaluator(tc.p)
			_, boundErr := rlct.Bound(context.Background(), tc.p, nil)
			if !errors.Is(err, tc.want) || !errors.Is(boundErr, tc.want) {
				t.Errorf("err = %v, rlct.Bound: %v; want %v from both", err, boundErr, tc.want)
			}
			if _, err := Prior(tc.p); !errors.Is(err, tc.want) {
				t.Errorf("Prior: err = %v, want %v", err, tc.want)
			}
		})
	}
	// A nil coordinate of the point is 0.
	p := problemOf(t, rlct.Spec{K: "(x-1)^2 + y^2", At: []string{"x=1"}})
	p.Points[0][1] = nil
	ev, err := NewProblemEvaluator(p)
	if err != nil {
		t.Fatal(err)
	}
	if got := ev.Eval([]float64{0.5, 0.25}); got != 0.3125 { // 0.5² + 0.25²
		t.Errorf("K(0.5, 0.25) = %g, want 0.3125", got)
	}
}

// TestRoundOff checks the rounding estimate against the formula of its
// documentation worked out by hand.
func TestRoundOff(t *testing.T) {
	const u = 0x1p-53
	tests := []struct {
		name         string
		spec         rlct.Spec
		lower, upper []float64
		want         float64
	}{
		// Positive coefficients, even exponents: no cancellation.
		{"cancellation free", rlct.Spec{K: "x^2*y^2 + 3*x^4"}, []float64{-1, -1}, []float64{1, 1}, 0},
		// x² − 2xy + y²: S = 1 + 2 + 1, D = 2, T = 3.
		{"(x-y)^2", rlct.Spec{K: "(x-y)^2"}, []float64{-1, -1}, []float64{1, 1}, (2 + 2 + math.Sqrt(3)) * u * 4},
		// On [−2, 1]×[−1, 3]: m = (2, 3), S = 4 + 2·6 + 9 = 25.
		{"(x-y)^2 on a wider box", rlct.Spec{K: "(x-y)^2"}, []float64{-2, -1}, []float64{1, 3}, (2 + 2 + math.Sqrt(3)) * u * 25},
		// g = x − y: S = 2, D = 1, T = 2, and the estimate is δ².
		{"sum of squares", rlct.Spec{SOS: []string{"x - y"}}, []float64{-1, -1}, []float64{1, 1},
			math.Pow((1+2+math.Sqrt(2))*u*2, 2)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ev, err := NewProblemEvaluator(problemOf(t, tc.spec))
			if err != nil {
				t.Fatal(err)
			}
			got := ev.RoundOff(tc.lower, tc.upper)
			if math.Abs(got-tc.want) > 1e-12*tc.want {
				t.Errorf("RoundOff = %g, want %g", got, tc.want)
			}
		})
	}
}

func TestPrior(t *testing.T) {
	tests := []struct {
		name string
		spec rlct.Spec
		want []float64
	}{
		{"none", rlct.Spec{K: "x^2+y^2"}, []float64{0, 0}},
		{"origin", rlct.Spec{K: "x^2+y^2", Prior: "x=1,y=1/2"}, []float64{1, 0.5}},
		// At x = 1 the factor |x|^1 is smooth and positive: uniform, as τ_x = 1 in Bound.
		{"shifted", rlct.Spec{K: "(x-1)^2+y^2", Prior: "x=1,y=1/2", At: []string{"x=1"}}, []float64{0, 0.5}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := problemOf(t, tc.spec)
			got, err := Prior(p)
			if err != nil {
				t.Fatal(err)
			}
			for i := range tc.want {
				if got[i] != tc.want[i] {
					t.Fatalf("prior = %v, want %v", got, tc.want)
				}
			}
			// The same weights as Bound: τ_i = h_i + 1.
			r, err := rlct.Bound(context.Background(), p, nil)
			if err != nil {
				t.Fatal(err)
			}
			for i, w := range r.Weights {
				if f, _ := w.Float64(); f != got[i]+1 {
					t.Errorf("τ_%d = %s, but the estimate uses h = %g", i, w.RatString(), got[i])
				}
			}
		})
	}
	p := problemOf(t, rlct.Spec{K: "x^2+y^2"})
	p.Prior = []*big.Rat{big.NewRat(-1, 1), new(big.Rat)}
	if _, err := Prior(p); !errors.Is(err, rlct.ErrPrior) {
		t.Errorf("h = −1: err = %v, want rlct.ErrPrior", err)
	}
}

// TestProblemShifted checks that a problem at a point and the same
// K written at the origin give identical estimates: the translation is exact,
// so the compiled polynomials, and with the same seed every sample, agree.
func TestProblemShifted(t *testing.T) {
	opt := Options{Lower: []float64{-1, -1}, Upper: []float64{1, 1}, Live: 20, Runs: 4, Seed: 9, Decades: 3}
	a, err := Problem(context.Background(), problemOf(t, rlct.Spec{K: "(x-2)^2*y^2", At: []string{"x=2"}, Prior: "x=3"}), opt)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Problem(context.Background(), problemOf(t, rlct.Spec{K: "x^2*y^2"}), opt)
	if err != nil {
		t.Fatal(err)
	}
	if a.Lambda != b.Lambda || a.Theta != b.Theta || a.Evaluations != b.Evaluations {
		t.Errorf("shifted: λ̂ = %v, θ̂ = %v, %d evaluations; at the origin: %v, %v, %d",
			a.Lambda, a.Theta, a.Evaluations, b.Lambda, b.Theta, b.Evaluations)
	}
}

// TestProblemNegative checks that a K negative somewhere in the box
// is reported with the point, as offsets from the point.
func TestProblemNegative(t *testing.T) {
	// K = (x−1)²·(1 − 2(x−1)) + y² at x = 1: u²(1 − 2u) + y² < 0 needs u > 1/2.
	p := problemOf(t, rlct.Spec{K: "(x-1)^2*(1 - 2*(x-1)) + y^2", At: []string{"x=1"}})
	_, err := Problem(context.Background(), p, Options{
		Lower: []float64{-1, -1}, Upper: []float64{1, 1}, Live: 20, Runs: 2, Seed: 1})
	var kv *KValueError
	if !errors.As(err, &kv) {
		t.Fatalf("err = %v, want a *KValueError", err)
	}
	u, y := kv.Point[0], kv.Point[1]
	if want := u*u*(1-2*u) + y*y; !(kv.Value < 0) || math.Abs(kv.Value-want) > 1e-12 || u <= 0.5 {
		t.Errorf("K(%v) = %g reported; the offsets give %g", kv.Point, kv.Value, want)
	}
}

// TestRoundOffCoversError compares K = g² evaluated expanded with the same K
// evaluated from g (sum-of-squares form, where K is accurate near the zero
// set to about 2|g|·δ(g)) at random points near the zero set of
// g = (x + y + z + w − 1)^m shifted to (1/4, 1/4, 1/4, 1/4): the difference
// must stay below the RoundOff estimate of the expanded form. (Observed when
// written: between 1/10 and 1/500 of it, so the estimate is conservative.)
func TestRoundOffCoversError(t *testing.T) {
	at := []string{"x=1/4,y=1/4,z=1/4,w=1/4"}
	lower, upper := []float64{-1, -1, -1, -1}, []float64{1, 1, 1, 1}
	for _, m := range []int{1, 2, 4, 8} {
		g := fmt.Sprintf("(x + y + z + w - 1)^%d", m)
		expanded, err := NewProblemEvaluator(problemOf(t, rlct.Spec{K: "(" + g + ")^2", At: at}))
		if err != nil {
			t.Fatal(err)
		}
		squares, err := NewProblemEvaluator(problemOf(t, rlct.Spec{SOS: []string{g}, At: at}))
		if err != nil {
			t.Fatal(err)
		}
		bound := expanded.RoundOff(lower, upper)
		rng := rand.New(rand.NewPCG(1, uint64(m)))
		worst := 0.0
		x := make([]float64, 4)
		for range 20000 {
			for i := range 3 {
				x[i] = rng.Float64()*2 - 1
			}
			x[3] = -x[0] - x[1] - x[2] + 1e-3*(rng.Float64()-0.5) // near u_x + u_y + u_z + u_w = 0
			if math.Abs(x[3]) > 1 {
				continue
			}
			worst = math.Max(worst, math.Abs(expanded.Eval(x)-squares.Eval(x)))
		}
		if !(worst <= bound) {
			t.Errorf("m = %d: rounding error %g exceeds the RoundOff estimate %g", m, worst, bound)
		}
	}
}
