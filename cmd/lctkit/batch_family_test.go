package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/big"
	"math/rand/v2"
	"strings"

	"github.com/lctkit/lctkit/rlct"
)

// lowRankScale multiplies the term b_ik·a_kj of (BA)_ij by
// rows[i]·inner[k]·cols[j]: a change of coordinates b_ik → rows[i]·inner[k]·b_ik,
// a_kj → cols[j]·a_kj that leaves λ and θ unchanged.
type lowRankScale struct{ rows, inner, cols []int }

// lowRankGenerators returns the N·M entries of B·A, for B (N×H, entries
// b<i>_<k>) and A (H×M, entries a<k>_<j>), as generator expressions: the
// sum-of-squares form of K = ‖BA‖², the divergence of reduced rank
// regression at a true map of rank 0. scale may be nil.
func lowRankGenerators(m, n, h int, scale *lowRankScale) []string {
	var out []string
	for i := 1; i <= n; i++ {
		for j := 1; j <= m; j++ {
			var b strings.Builder
			for k := 1; k <= h; k++ {
				c := 1
				if scale != nil {
					c = scale.rows[i-1] * scale.inner[k-1] * scale.cols[j-1]
				}
				switch {
				case k > 1 && c < 0:
					b.WriteString(" - ")
					c = -c
				case k > 1:
					b.WriteString(" + ")
				case c < 0:
					b.WriteString("-")
					c = -c
				}
				if c != 1 {
					fmt.Fprintf(&b, "%d*", c)
				}
				fmt.Fprintf(&b, "b%d_%d*a%d_%d", i, k, k, j)
			}
			out = append(out, b.String())
		}
	}
	return out
}

// lowRankShape is the id of a record of the family: the numbers of soil
// measurements M, crops N and latent factors H of the invented scenario in
// examples/lowrank.
type lowRankShape struct {
	N       int `json:"n"`
	Soil    int `json:"soil"`
	Crops   int `json:"crops"`
	Factors int `json:"factors"`
}

// randomLowRank returns record number id of the family: B·A of a shape
// drawn from the given ones, with unit scalings drawn from ±1, ±2, ±3.
func randomLowRank(rng *rand.Rand, id int, shapes [][3]int) rlct.Record {
	s := shapes[rng.IntN(len(shapes))]
	m, n, h := s[0], s[1], s[2]
	units := []int{-3, -2, -1, 1, 2, 3}
	draw := func(k int) []int {
		out := make([]int, k)
		for i := range out {
			out[i] = units[rng.IntN(len(units))]
		}
		return out
	}
	scale := &lowRankScale{rows: draw(n), inner: draw(h), cols: draw(m)}
	raw, _ := json.Marshal(lowRankShape{N: id, Soil: m, Crops: n, Factors: h})
	return rlct.Record{ID: raw, Spec: rlct.Spec{SOS: lowRankGenerators(m, n, h, scale)}}
}

// reducedRankLambda returns the learning coefficient λ and multiplicity θ
// of reduced rank regression with M inputs, N outputs, H hidden units and
// a true map of rank r, uniform prior positive at the truth, from the main
// theorem of M. Aoyagi and S. Watanabe 2005, Stochastic complexities of
// reduced rank regression in Bayesian estimation, Neural Networks 18,
// 924–933 (formula from memory; for H = 1, r = 0 it gives min(M, N)/2 with
// θ = 2 exactly when M = N, which the tests also derive by hand):
//
//	N+r ≤ M+H, M+r ≤ N+H, H+r ≤ M+N:
//	    M+N+H+r even: λ = (2(H+r)(M+N) − (M−N)² − (H+r)²)/8, θ = 1
//	    M+N+H+r odd:  λ = (2(H+r)(M+N) − (M−N)² − (H+r)² + 1)/8, θ = 2
//	M+H < N+r: λ = (HM − Hr + Nr)/2, θ = 1
//	N+H < M+r: λ = (HN − Hr + Mr)/2, θ = 1
//	M+N < H+r: λ = MN/2, θ = 1
func reducedRankLambda(m, n, h, r int) (*big.Rat, int) {
	switch {
	case n+r <= m+h && m+r <= n+h && h+r <= m+n:
		num := 2*(h+r)*(m+n) - (m-n)*(m-n) - (h+r)*(h+r)
		if (m+n+h+r)%2 == 0 {
			return big.NewRat(int64(num), 8), 1
		}
		return big.NewRat(int64(num+1), 8), 2
	case m+h < n+r:
		return big.NewRat(int64(h*m-h*r+n*r), 2), 1
	case n+h < m+r:
		return big.NewRat(int64(h*n-h*r+m*r), 2), 1
	default:
		return big.NewRat(int64(m*n), 2), 1
	}
}

// sweepShapes are quick shapes (M, N, H) for the tests that compare runs.
var sweepShapes = [][3]int{{1, 1, 1}, {2, 1, 1}, {2, 3, 1}, {3, 3, 1}, {2, 2, 2}, {3, 1, 2}}

// exampleShapes are the shapes (M, N, H) of examples/lowrank and of the
// batch benchmark: every H = 1 shape up to 4×4, and the H = 2 and H = 3
// shapes that take at most tens of milliseconds.
var exampleShapes = [][3]int{
	{1, 1, 1}, {1, 2, 1}, {1, 3, 1}, {1, 4, 1}, {2, 1, 1}, {2, 2, 1}, {2, 3, 1}, {2, 4, 1},
	{3, 1, 1}, {3, 2, 1}, {3, 3, 1}, {3, 4, 1}, {4, 1, 1}, {4, 2, 1}, {4, 3, 1}, {4, 4, 1},
	{1, 1, 2}, {1, 2, 2}, {2, 1, 2}, {1, 3, 2}, {3, 1, 2}, {1, 4, 2}, {4, 1, 2}, {2, 2, 2}, {2, 3, 2}, {3, 2, 2},
	{1, 1, 3}, {1, 2, 3}, {2, 1, 3},
}

// lowRankInput returns count records of the family as JSON lines, drawn
// with a fixed seed.
func lowRankInput(count int, seed uint64) []byte {
	rng := rand.New(rand.NewPCG(seed, 2005))
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	for i := 1; i <= count; i++ {
		_ = enc.Encode(randomLowRank(rng, i, exampleShapes))
	}
	return b.Bytes()
}
