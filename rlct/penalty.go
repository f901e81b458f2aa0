package rlct

import (
	"math"
	"math/big"
)

// Penalties holds the asymptotic penalty at one or more sample sizes.
// The numbers are float64 evaluations of exact formulas, not exact values.
type Penalties struct {
	// Lambda and Theta are the pair the penalty comes from (λ exact; in
	// JSON a string in lowest terms).
	Lambda *big.Rat `json:"lambda"`
	Theta  int      `json:"theta"`
	// Status is the status of the (λ, θ) pair.
	Status Status `json:"status"`
	// Note says, for a pair that is not Exact, what the penalty is not.
	Note string `json:"note,omitempty"`
	// N holds the sample sizes.
	N []float64 `json:"n"`
	// Singular is λ·log n − (θ−1)·log log n at each n.
	Singular []float64 `json:"singular"`
	// Regular is (d/2)·log n at each n, present when d is known.
	Regular []float64 `json:"regular,omitempty"`
	// Dim is the d used for Regular (0 when absent).
	Dim int `json:"dim,omitempty"`
}

// Penalty returns λ·log n − (θ−1)·log log n, the leading terms of the free
// energy −log Z_n − n·S_n beyond the empirical entropy (Watanabe 2009,
// Algebraic Geometry and Statistical Learning Theory, the free-energy
// asymptotics of chapter 6; the chapter from memory), evaluated in float64.
// n must exceed e so that log log n is defined.
func Penalty(lambda *big.Rat, theta int, n float64) float64 {
	l, _ := lambda.Float64()
	return l*math.Log(n) - float64(theta-1)*math.Log(math.Log(n))
}

// RegularPenalty returns (d/2)·log n, the BIC penalty of a regular model
// with d parameters (Schwarz 1978, Estimating the dimension of a model).
func RegularPenalty(d int, n float64) float64 {
	return float64(d) / 2 * math.Log(n)
}

// NewPenalties evaluates both penalties at each n for a pair of the
// given status; d ≤ 0 leaves the regular one out. A pair that is not Exact
// gets a Note (see PenaltyNote).
func NewPenalties(lambda *big.Rat, theta int, status Status, d int, ns []float64) *Penalties {
	pr := &Penalties{Lambda: new(big.Rat).Set(lambda), Theta: theta, Status: status, Note: PenaltyNote(status), N: ns, Dim: max(d, 0)}
	for _, n := range ns {
		pr.Singular = append(pr.Singular, Penalty(lambda, theta, n))
		if d > 0 {
			pr.Regular = append(pr.Regular, RegularPenalty(d, n))
		}
	}
	return pr
}

// PenaltyNote says what a penalty computed from a pair of the given status
// is not; it is empty for Exact.
//
// From an upper bound (λ', θ') the penalty λ'·log n − (θ'−1)·log log n
// exceeds the true one for all large n (the true λ is smaller, or equal with
// a θ at least θ'), but not at every finite n: with a larger θ' it can be
// smaller than the true penalty at realistic sample sizes (λ' = 1, θ' = 3
// against a true (9/10, 1) at n = 1000 gives 3.05 against 6.22).
func PenaltyNote(status Status) string {
	switch status {
	case Exact:
		return ""
	case UpperBound:
		return "from an upper bound, not the learning coefficient: asymptotically at least the true penalty, but it can be smaller at a finite n when θ differs"
	case Uncertified:
		return "from an uncertified value that is not a bound: not known to be above or below the true penalty"
	}
	return "from a pair of unknown status"
}
