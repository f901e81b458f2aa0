package rlct

import (
	"context"
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// benchSquares returns a sum of n distinct squared monomials in d variables
// with exponents in {0, 2, …, 12}, from a fixed seed.
func benchSquares(n, d int, seed uint64) string {
	rng := rand.New(rand.NewPCG(seed, uint64(n)))
	seen := map[string]bool{}
	var terms []string
	for len(terms) < n {
		var f []string
		for i := range d {
			if e := 2 * rng.IntN(7); e > 0 {
				f = append(f, fmt.Sprintf("x%d^%d", i+1, e))
			}
		}
		t := strings.Join(f, "*")
		if t == "" || seen[t] {
			continue
		}
		seen[t] = true
		terms = append(terms, t)
	}
	return strings.Join(terms, " + ")
}

// benchDegree returns the sum of x^(2e) over all e of total degree D in d
// variables: every exponent is Pareto-minimal, only the d pure powers are
// vertices.
func benchDegree(d, deg int) string {
	var terms []string
	e := make([]int, d)
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == d-1 {
			e[i] = left
			var f []string
			for k, x := range e {
				if x > 0 {
					f = append(f, fmt.Sprintf("x%d^%d", k+1, 2*x))
				}
			}
			terms = append(terms, strings.Join(f, "*"))
			return
		}
		for x := left; x >= 0; x-- {
			e[i] = x
			rec(i+1, left-x)
		}
	}
	rec(0, deg)
	return strings.Join(terms, " + ")
}

// benchTanh returns the generators Σ_k a_k·tanh(x_p·b_k) at the inputs
// x_p = 1, 2, 3 of a network with h hidden units.
func benchTanh(h int) []string {
	var out []string
	for x := 1; x <= 3; x++ {
		var terms []string
		for k := 1; k <= h; k++ {
			terms = append(terms, fmt.Sprintf("a%d*tanh(%d*b%d)", k, x, k))
		}
		out = append(out, strings.Join(terms, " + "))
	}
	return out
}

// BenchmarkBound times Bound on a parsed problem (parsing has its own
// benchmarks in monomial) for the families the certificate must handle at
// research scale, and reports the faces examined and the unsafe points.
func BenchmarkBound(b *testing.B) {
	squared := func(gens []string) string {
		var sq []string
		for _, g := range gens {
			sq = append(sq, "("+g+")^2")
		}
		return strings.Join(sq, " + ")
	}
	cases := []struct {
		name string
		spec Spec
	}{
		{"squares/vars=10/terms=100", Spec{K: benchSquares(100, 10, 1)}},
		{"squares/vars=10/terms=10000", Spec{K: benchSquares(10000, 10, 2)}},
		{"squares/vars=20/terms=100000", Spec{K: benchSquares(100000, 20, 3)}},
		{"degree/vars=10/D=10", Spec{K: benchDegree(10, 10)}},
		{"lowrank-expanded/3x3/H=3", Spec{K: squared(lowRankGenerators(3, 3, 3))}},
		{"lowrank-expanded/5x5/H=2", Spec{K: squared(lowRankGenerators(5, 5, 2))}},
		{"lowrank-expanded/4x4/H=3", Spec{K: squared(lowRankGenerators(4, 4, 3))}},
		{"lowrank-sos/5x5/H=2", Spec{SOS: lowRankGenerators(5, 5, 2)}},
		{"tanh-sos/H=16/order=9", Spec{SOS: benchTanh(16), Order: 9}},
		{"pairs-sos/vars=8", Spec{SOS: pairSquares(8)}},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			c.spec.Limits = monomial.Limits{MaxTerms: 10_000_000}
			p, err := c.spec.Problem()
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			var r *Result
			for b.Loop() {
				r, err = Bound(context.Background(), p, nil)
				if err != nil {
					b.Fatal(err)
				}
			}
			if r.Certificate != nil {
				b.ReportMetric(float64(r.Certificate.Examined), "faces/op")
				b.ReportMetric(float64(r.Certificate.Unsafe), "unsafe/op")
			}
		})
	}
}
