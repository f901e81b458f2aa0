package sbic

import (
	"math/big"
)

// ReducedRank returns the learning coefficient λ and multiplicity θ of
// reduced rank regression y = B·A·x + noise with M inputs, N outputs and
// rank H (B is N×H, A is H×M, under a prior positive at the truth) at a true
// map of rank r ≤ H, by the main theorem of Aoyagi and Watanabe (2005,
// "Stochastic complexities of reduced rank regression in Bayesian
// estimation", Neural Networks 18; the formula is recalled from memory, not
// checked against the paper):
//
//	N+r ≤ M+H, M+r ≤ N+H and H+r ≤ M+N:
//	    M+N+H+r even: λ = (2(H+r)(M+N) − (M−N)² − (H+r)²)/8, θ = 1
//	    M+N+H+r odd:  λ = (2(H+r)(M+N) − (M−N)² − (H+r)² + 1)/8, θ = 2
//	otherwise, M+H < N+r: λ = (HM − Hr + Nr)/2, θ = 1
//	otherwise, N+H < M+r: λ = (HN − Hr + Mr)/2, θ = 1
//	otherwise (M+N < H+r): λ = MN/2, θ = 1
//
// At r = H it gives H(M+N−H)/2, half the dimension of the set of N×M
// matrices of rank at most H (the model is regular there), and at H = 0 it
// gives 0. These are values from a published formula, not certified by
// lctkit; for r = 0 lctkit bounds the same learning coefficient from
// K = ‖BA‖² (exact for H = 1). It returns an input error unless
// 0 ≤ r ≤ H and M, N ≥ 1.
func ReducedRank(m, n, h, r int) (Value, error) {
	if m < 1 || n < 1 || h < 0 || r < 0 || r > h {
		return Value{}, inputf("sbic: reduced rank regression needs M, N ≥ 1 and 0 ≤ r ≤ H, got M = %d, N = %d, H = %d, r = %d", m, n, h, r)
	}
	var num, den int64
	theta := 1
	switch {
	case n+r <= m+h && m+r <= n+h && h+r <= m+n:
		hr, mn, d := int64(h+r), int64(m+n), int64(m-n)
		num, den = 2*hr*mn-d*d-hr*hr, 8
		if (m+n+h+r)%2 != 0 {
			num++
			theta = 2
		}
	case m+h < n+r:
		num, den = int64(h*m-h*r+n*r), 2
	case n+h < m+r:
		num, den = int64(h*n-h*r+m*r), 2
	default:
		num, den = int64(m*n), 2
	}
	return Value{Lambda: big.NewRat(num, den), Theta: theta}, nil
}
