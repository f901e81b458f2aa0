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
	p, err := s.Problem()
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func TestContextLive(t *testing.T) {
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
		r, err := Bound(context.Background(), mustProblem(t, tt.spec), nil)
		if err != nil {
			t.Fatal(err)
		}
		if r.Lambda.RatString() != tt.lambda || r.Theta != tt.theta || r.Status != Exact {
			t.Errorf("%+v: λ = %s, θ = %d, %s; want %s, %d, exact", tt.spec, r.Lambda.RatString(), r.Theta, r.Status, tt.lambda, tt.theta)
		}
	}
}

func TestContextCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Bound(ctx, mustProblem(t, Spec{K: "x^4+y^6"}), nil); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled context: error %v, want context.Canceled", err)
	}
	if _, err := Bound(ctx, mustProblem(t, Spec{K: "x^2", At: []string{"x=0", "x=0"}}), nil); !errors.Is(err, context.Canceled) {
		t.Errorf("two points, cancelled context: error %v, want context.Canceled", err)
	}
}

// pairSquares returns the generators x_i² + x_j² for all i < j ≤ n. Each has
// two terms, so every compact face of P(I) (the simplex of the 2·e_i) holds
// the midpoint of a generator's terms and must be examined, and each is
// nondegenerate (a generator with even exponents and positive coefficients
// has no torus zero): a search that cannot stop early.
func pairSquares(n int) []string {
	var out []string
	for i := 1; i <= n; i++ {
		for j := i + 1; j <= n; j++ {
			out = append(out, fmt.Sprintf("x%d^2 + x%d^2", i, j))
		}
	}
	return out
}

func TestBudgetReached(t *testing.T) {
	// Without a budget the pairs of 4 variables certify exactly: the
	// generators have no common torus zero, and λ = n/4 = 1 for the simplex
	// with vertices 4·e_i in P(K) (distance 1 along (1,…,1)), θ = 1 (worked
	// by hand).
	p := mustProblem(t, Spec{SOS: pairSquares(4)})
	r, err := Bound(context.Background(), p, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Status != Exact || r.Lambda.RatString() != "1" || r.Theta != 1 {
		t.Fatalf("no budget: %s, λ = %s, θ = %d; want exact 1, 1 (%v)", r.Status, r.Lambda.RatString(), r.Theta, r.Reasons)
	}
	// 2^4 − 1 = 15 compact faces, all but the 4 vertices hold a midpoint.
	if r.Certificate.Examined < 11 {
		t.Errorf("examined %d faces, want at least the 11 of dimension ≥ 1", r.Certificate.Examined)
	}
	r, err = Bound(context.Background(), p, &Options{MaxFaces: 2})
	if err != nil {
		t.Fatal(err)
	}
	if r.Status != UpperBound || r.Certificate.Stop != StopBudget || r.Certificate.Examined != 2 {
		t.Fatalf("budget 2: %s, stop %q, examined %d; want upper-bound, budget, 2", r.Status, r.Certificate.Stop, r.Certificate.Examined)
	}
	if r.Lambda.RatString() != "1" || !strings.Contains(strings.Join(r.Reasons, "\n"), "budget reached") {
		t.Errorf("budget 2: λ = %s, reasons %q", r.Lambda.RatString(), r.Reasons)
	}
}

func TestDeadlineEndsSearch(t *testing.T) {
	// 12 variables: 4,095 compact faces to examine, seconds of work. A
	// deadline inside the search ends it like a spent budget: the value with
	// status upper-bound and the reason, returned soon after the deadline.
	p := mustProblem(t, Spec{SOS: pairSquares(12)})
	const deadline = 200 * time.Millisecond
	ctx, cancel := context.WithTimeout(context.Background(), deadline)
	defer cancel()
	start := time.Now()
	r, err := Bound(ctx, p, nil)
	elapsed := time.Since(start)
	if err != nil {
		// The deadline passed before the search began (a very slow
		// machine): then an error is the documented outcome.
		if !errors.Is(err, context.DeadlineExceeded) {
			t.Fatalf("error %v, want a result or context.DeadlineExceeded", err)
		}
		return
	}
	if r.Status != UpperBound || r.Certificate.Stop != StopBudget {
		t.Errorf("status %s, stop %q; want upper-bound, budget", r.Status, r.Certificate.Stop)
	}
	// λ = n/4 = 3: P(I) is the simplex Σ x_i ≥ 2 spanned by the 2·e_i, so
	// t = 2/n along (1,…,1) and P(K) = 2·P(I) gives t = 4/n (worked by hand).
	if r.Lambda.RatString() != "3" {
		t.Errorf("λ = %s, want 3", r.Lambda.RatString())
	}
	// Not a speed target: a generous bound that only a search ignoring
	// its deadline would miss.
	if elapsed > deadline+10*time.Second {
		t.Errorf("returned after %v, long after the deadline %v", elapsed, deadline)
	}
}

// Every error about the input matches ErrInput, and nothing else does.
func TestErrInputParent(t *testing.T) {
	for _, s := range []Spec{
		{K: "0*x"}, {K: "x^2+1"}, {K: "x^2-y^2"}, {K: "x^2", Prior: "x=-1"}, {},
		{K: "x^2 +"}, {K: "x^2", Prior: "x"}, {K: "exp(x)-1", Order: 4, At: []string{"x=1"}},
	} {
		p, err := s.Problem()
		if err == nil {
			_, err = Bound(context.Background(), p, nil)
		}
		if err == nil || !errors.Is(err, ErrInput) {
			t.Errorf("%+v: error %v does not match ErrInput", s, err)
		}
	}
	if _, err := DecodeRecord([]byte(`{"k": 1}`)); !errors.Is(err, ErrInput) {
		t.Errorf("record error %v does not match ErrInput", err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Bound(ctx, mustProblem(t, Spec{K: "x^2"}), nil); err == nil || errors.Is(err, ErrInput) {
		t.Errorf("a cancelled context gives %v, which must not be an input error", err)
	}
}
