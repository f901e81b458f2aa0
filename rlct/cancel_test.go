package rlct

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"testing"
	"time"
)

// lowRankGenerators returns the entries of B·A for B (n×h) and A (h×m):
// the generators of K = ‖BA‖², the reduced rank regression divergence at
// a true map of rank 0.
func lowRankGenerators(m, n, h int) []string {
	var out []string
	for i := 1; i <= n; i++ {
		for j := 1; j <= m; j++ {
			var terms []string
			for k := 1; k <= h; k++ {
				terms = append(terms, fmt.Sprintf("b%d_%d*a%d_%d", i, k, k, j))
			}
			out = append(out, strings.Join(terms, "+"))
		}
	}
	return out
}

func mustProblem(t *testing.T, s Spec) *Problem {
	t.Helper()
	p, _, err := s.Problem()
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func TestOptionsContextLive(t *testing.T) {
	// A live context changes nothing. Expected values: x^4 + y^6 has
	// λ = 5/12, θ = 1, exact (Howald 2001, Multiplier ideals of monomial
	// ideals, Trans. AMS 353: lct(x^2, y^3) = 5/6, halved for squares);
	// ‖BA‖² with B 3×1, A 1×2 has λ = min(M, N)/2 = 1, θ = 1 (Aoyagi &
	// Watanabe 2005, Neural Networks 18, main theorem with H = 1, r = 0;
	// formula from memory).
	tests := []struct {
		spec   Spec
		lambda string
		theta  int
	}{
		{Spec{K: "x^4+y^6"}, "5/12", 1},
		{Spec{SOS: lowRankGenerators(2, 3, 1)}, "1", 1},
	}
	for _, tt := range tests {
		r, err := Bound(mustProblem(t, tt.spec), &Options{Context: context.Background()})
		if err != nil {
			t.Fatal(err)
		}
		if r.Lambda.RatString() != tt.lambda || r.Theta != tt.theta || r.Status != Exact {
			t.Errorf("%+v: λ = %s, θ = %d, %s; want %s, %d, exact", tt.spec, r.Lambda.RatString(), r.Theta, r.Status, tt.lambda, tt.theta)
		}
	}
}

func TestOptionsContextStops(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Bound(mustProblem(t, Spec{K: "x^4+y^6"}), &Options{Context: ctx}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled context: error %v, want context.Canceled", err)
	}
	if _, err := BoundAt(mustProblem(t, Spec{K: "x^2"}), nil, &Options{Context: ctx}); !errors.Is(err, context.Canceled) {
		t.Errorf("BoundAt, cancelled context: error %v, want context.Canceled", err)
	}

	// ‖BA‖² with B, A of shape 4×2, 2×4 has a large face lattice and takes
	// over ten seconds to finish on a development machine; a deadline of
	// 20ms must stop it with an error, not a partial answer.
	p := mustProblem(t, Spec{SOS: lowRankGenerators(4, 4, 2)})
	ctx, cancel = context.WithTimeout(context.Background(), 20*time.Millisecond)
	defer cancel()
	r, err := Bound(p, &Options{Context: ctx})
	if !errors.Is(err, context.DeadlineExceeded) || r != nil {
		t.Errorf("deadline: result %v, error %v; want no result and context.DeadlineExceeded", r, err)
	}
}
