package rlct

import (
	"context"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// Truncation is the check that the terms a truncated series left out
// cannot change the answer.
type Truncation struct {
	// Order is the degree at which the series was cut.
	Order int `json:"order"`
	// Principal is true when the omitted terms cannot change t_τ, θ or the
	// principal face, so the value is that of the full K and its status
	// is at least UpperBound; false means the value is Uncertified.
	Principal bool `json:"principal"`
	// Faces is true when, in addition, the omitted terms cannot change any
	// compact face or face polynomial, so the face verdicts carry over to
	// the full K.
	Faces bool `json:"faces"`
	// BoundOrder is the smallest order at which the Principal condition
	// holds for the terms known now, or -1 when no order can (a supporting
	// hyperplane at the principal face gives some variable no weight).
	BoundOrder int `json:"bound_order"`
	// NeededOrder is the smallest order at which both conditions hold for
	// the terms known now, or -1 when no order can. Terms that appear only
	// at a higher order can change it, so it is a first order to try.
	NeededOrder int `json:"needed_order"`
	// Remainder is true when the check used the monomials of
	// Problem.Remainder, which every omitted term is a multiple of, and not
	// only their total degree.
	Remainder bool `json:"remainder,omitempty"`
}

// checkTruncation certifies that the terms a series truncated at total
// degree D left out cannot change the answer, and records reasons when it
// cannot. It works in the coordinates of the polyhedron that was built
// (P(K), or P(I) in sum-of-squares form, where the generators were cut).
//
// The true function differs from the computed one by a series R all of
// whose terms have total degree at least D+1 (monomial.Expansion), that is
// exponents in Q = {x ≥ 0 : Σ x_i ≥ D+1} = conv{(D+1)·e_i} + R^d_{≥0}. For a
// weight y ≥ 0, min over Q of y·x is (D+1)·min_i y_i.
//
//   - Principal face. The optimal supporting hyperplanes at t_τ·τ are the
//     y ≥ 0 with y·τ = 1 and y·v ≥ t_τ for every vertex v: the normal cone
//     of the principal face. It suffices that one of them puts Q strictly
//     above it: with m = max_y min_i y_i over that cone (one exact LP,
//     polyhedron.NormalConeMaxMin), (D+1)·m > t_τ. Then a y of the relative
//     interior near the optimum, which exposes the principal face exactly,
//     has (D+1)·min_i y_i > t_τ too, every point of Q lies strictly above
//     it, and adding or cancelling terms there changes neither t_τ nor the
//     principal face nor θ. (The older rule asked this of every y, m =
//     min_i min_y y_i, which fails whenever some optimal y gives a variable
//     no weight: x²(1 − cos y) at the vertex (2,2) is certified by the
//     present rule at D ≥ 4 and by the older at no order.)
//   - All compact faces. If moreover every (D+1)·e_i lies in P and on no
//     compact face, then Q lies in P and strictly above every compact face
//     (a compact face has a strictly positive normal a, and a·x ≥ (D+1)·min_i
//     a_i > b on Q), so P, its compact faces and the face polynomials are
//     those of the full K. With c_i the least exponent of a pure power
//     w_i^{c_i} in the support, (D+1)·e_i lies in P exactly when c_i ≤ D+1
//     and on no compact face exactly when c_i < D+1 (c_i·e_i is a vertex,
//     and every point beyond it on the axis lies above all compact faces);
//     without a pure power in w_i no order can rule out new faces.
//
// With Problem.Remainder the omitted terms are known to be multiples of
// the remainder monomials, a subset of Q, and the same two conditions are
// checked for those monomials alone (see remainderCheck); the answer is
// the better of the two checks, and BoundOrder and NeededOrder still come
// from the total degree.
//
// A remainder may also have monomials of total degree ≤ the order, each
// strictly dominating an exponent e of the polynomials (a series cut by
// the polyhedron, monomial.Config.Floor; checkExtras enforces this). The
// total-degree check stays sound: an omitted term is then of degree > D
// (the argument above) or a multiple e + s of such a monomial, s ≥ 0,
// s ≠ 0, and e lies in P; for the principal condition y·(e + s) = y·e +
// y·s > t_τ for the y with min_i y_i > 0 that the check uses, and for the
// faces condition a·(e + s) > a·e ≥ b for every compact face with
// (strictly positive) normal a and level b. So such a term lies in P
// strictly above the principal face's hyperplane and off every compact
// face, and changes neither P nor t_τ, θ or a face polynomial.
func (an *analysis) checkTruncation(ctx context.Context, order int, rem []monomial.Exponent, hit *polyhedron.Hit) (*Truncation, error) {
	res := an.res
	d := len(an.vars)
	tr := &Truncation{Order: order, BoundOrder: -1, NeededOrder: -1}
	newton := res.newton

	// Principal condition: the largest least weight m = max_y min_i y_i
	// over the normalised normal cone of the principal face, one exact LP.
	units := make([][]int, d)
	for i := range units {
		units[i] = make([]int, d)
		units[i][i] = 1
	}
	m, y, err := newton.NormalConeMaxMin(ctx, hit.Face, res.Weights, units)
	if err != nil {
		return nil, err
	}
	at := 0 // a variable the best y gives no weight (when m = 0)
	for i := range y {
		if y[i].Sign() == 0 {
			at = i
			break
		}
	}
	principalOK := m.Sign() > 0
	if principalOK {
		// (D+1)·m > t  ⟺  D ≥ floor(t/m).
		q := new(big.Rat).Quo(hit.T, m)
		tr.BoundOrder = int(new(big.Int).Quo(q.Num(), q.Denom()).Int64())
	}

	// Faces condition: a pure power in every variable.
	purest := make([]int, d)
	for i := range purest {
		purest[i] = -1
	}
	for _, q := range an.polys {
		for v := range q.All() {
			if j, ok := purePower(v); ok && (purest[j] < 0 || v[j] < purest[j]) {
				purest[j] = v[j]
			}
		}
	}
	facesOK := true
	needFaces := 0
	missing := ""
	for i, c := range purest {
		if c < 0 {
			facesOK = false
			if missing == "" {
				missing = an.vars[i]
			}
			continue
		}
		needFaces = max(needFaces, c)
	}
	tr.Principal = principalOK && order >= tr.BoundOrder
	tr.Faces = tr.Principal && facesOK && order >= needFaces
	if principalOK && facesOK {
		tr.NeededOrder = max(tr.BoundOrder, needFaces)
	}

	notBound := "the value is not a bound: omitted terms could raise the Newton value or change θ, so it may lie below the true learning coefficient"
	if rem != nil {
		remPrincipal, remFaces, first, err := an.remainderCheck(ctx, rem, hit)
		if err != nil {
			return nil, err
		}
		tr.Remainder = true
		tr.Principal = tr.Principal || remPrincipal
		tr.Faces = tr.Principal && (tr.Faces || remFaces)
		mono := ""
		if first != nil {
			mono = monomial.Monomial(an.vars, first, big.NewRat(1, 1)).String()
		}
		switch {
		case !tr.Principal:
			res.Reasons = append(res.Reasons, fmt.Sprintf(
				"K is a series truncated at degree %d whose omitted terms are multiples of %s, which could reach the principal face, so %s", order, mono, notBound))
		case !tr.Faces:
			res.Reasons = append(res.Reasons, fmt.Sprintf(
				"K is a series truncated at degree %d: the value is a certified upper bound for the full K, but its omitted terms are multiples of %s, which could change a compact face whose nondegeneracy is then unknown", order, mono))
		}
		return tr, nil
	}
	switch {
	case !principalOK:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d and no truncation order can certify it by the total degree alone: no supporting hyperplane at the principal face gives weight to every variable (the best one gives none to %s), so omitted terms of high degree in one variable can reach the principal face, and %s", order, an.vars[at], notBound))
	case !tr.Principal:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d, too low to certify the value (order %d would, judging by the terms known now), and %s", order, tr.BoundOrder, notBound))
	case !tr.Faces && !facesOK:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d: the value is a certified upper bound for the full K, but omitted terms could add compact faces whose nondegeneracy is unknown, and no truncation order can rule that out (K has no pure power of %s)", order, missing))
	case !tr.Faces:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d: the value is a certified upper bound for the full K, but omitted terms could add compact faces whose nondegeneracy is unknown (order %d would rule that out)", order, tr.NeededOrder))
	}
	return tr, nil
}

// purePower reports whether v = c·e_j for some j and c > 0, and returns j.
func purePower(v []int) (int, bool) {
	j := -1
	for i, x := range v {
		if x == 0 {
			continue
		}
		if j >= 0 {
			return -1, false
		}
		j = i
	}
	return j, j >= 0
}
