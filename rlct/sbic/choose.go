package sbic

import (
	"cmp"
	"math"
	"slices"

	"github.com/lctkit/lctkit/rlct"
)

// Result is the outcome of Choose. All scores and weights are float64
// evaluations of the formulas in the package documentation, in nats.
type Result struct {
	// N is the sample size.
	N float64
	// Models holds one entry per model, in the order given to New.
	Models []Score
	// BIC and SBIC are the choices of the two criteria.
	BIC, SBIC Choice
	// Tolerance is the estimate of the rounding error of a score below
	// which two scores count as tied.
	Tolerance float64
	// Sensitivity has one entry per pair that is not Exact, in the order
	// of the pairs.
	Sensitivity []PairSensitivity
	// AllRegular replaces every pair that is not Exact by its model's
	// regular value at once; nil when every pair is Exact.
	AllRegular *Scenario
	// AllEstimates replaces every pair that is not Exact and has an
	// Estimate by it at once; nil when there is none.
	AllEstimates *Scenario

	c *Candidates
}

// Score is one model's line of a Result.
type Score struct {
	// Name, Dim and LogLik are the model's, as given.
	Name   string
	Dim    int
	LogLik float64
	// BIC is ℓ − (d/2)·log n; SBIC is log L'(M) from the recursion.
	BIC, SBIC float64
	// WeightBIC and WeightSBIC are the normalised weights
	// P(M)·exp(score) / Σ P(M_k)·exp(score_k) of the two criteria.
	WeightBIC, WeightSBIC float64
	// Status is the weakest status of the pairs SBIC rests on: Exact when
	// all are exact, else UpperBound when none is Uncertified, else
	// Uncertified. The BIC rests on no pair.
	Status rlct.Status
	// RestsOn lists the pairs that are not Exact which SBIC rests on
	// (indices into the pairs given to New): the pairs (k, l) with k ⪯ this
	// model.
	RestsOn []int
}

// Choice is the model a criterion chooses.
type Choice struct {
	// Model is the index of the chosen model: the one with the largest
	// weight; among models tied with it (within Result.Tolerance), the one
	// of least dimension, then the one given first.
	Model int
	// Tied lists the other models whose weight ties with the chosen one's
	// (their log weights differ by no more than Result.Tolerance); empty
	// when the choice is clear.
	Tied []int
}

// PairSensitivity says what rests on one pair that is not Exact.
type PairSensitivity struct {
	// Pair is the index of the pair.
	Pair int
	// Affects lists the models whose sBIC rests on the pair: every i with
	// pair.Model ⪯ i.
	Affects []int
	// Regular replaces the pair by its model's regular value (d/2, θ = 1).
	Regular Scenario
	// Estimate replaces it by Pair.Estimate; nil when there is none.
	Estimate *Scenario
}

// Scenario is the sBIC recomputed with some pairs replaced.
type Scenario struct {
	// Replaced lists the pairs replaced (indices), with the values put in
	// their place.
	Replaced []int
	Values   []Value
	// SBIC and Weights are the recomputed scores and normalised weights,
	// one per model.
	SBIC, Weights []float64
	// Choice is the model the recomputed sBIC chooses.
	Choice Choice
	// Changed reports that the choice differs from Result.SBIC.Model.
	Changed bool
}

// Choose scores every model by the BIC and the sBIC at sample size n > e
// with maximised log-likelihoods logLik (one per model, natural
// logarithms), chooses a model under each, normalises the weights, and for
// every pair that is not Exact says which scores rest on it and how the
// choice changes when it is replaced by the regular value or by its
// estimate. It returns an input error for n ≤ e, a log-likelihood that is
// not finite, or a count of log-likelihoods that does not match the models.
func (c *Candidates) Choose(n float64, logLik []float64) (*Result, error) {
	if err := c.checkData(n, logLik); err != nil {
		return nil, err
	}
	k := len(c.models)
	r := &Result{N: n, Models: make([]Score, k), Tolerance: c.roundingTolerance(n, logLik), c: c}
	bic := c.bic(n, logLik)
	sb := c.scores(n, logLik, nil)
	wb := c.weights(bic)
	ws := c.weights(sb)
	for i, m := range c.models {
		s := Score{Name: m.Name, Dim: m.Dim, LogLik: logLik[i], BIC: bic[i], SBIC: sb[i], WeightBIC: wb[i], WeightSBIC: ws[i], Status: rlct.Exact}
		for n, p := range c.pairs {
			if p.Status == rlct.Exact || !c.le[p.Model][i] {
				continue
			}
			s.RestsOn = append(s.RestsOn, n)
			if p.Status == rlct.Uncertified || s.Status == rlct.Exact {
				s.Status = p.Status
			}
		}
		r.Models[i] = s
	}
	r.BIC = c.choose(bic, r.Tolerance)
	r.SBIC = c.choose(sb, r.Tolerance)

	scenario := func(pairs []int, values []Value) *Scenario {
		alt := override{}
		for n, pi := range pairs {
			p := c.pairs[pi]
			alt[[2]int{p.Model, p.Truth}] = values[n]
		}
		s := c.scores(n, logLik, alt)
		ch := c.choose(s, r.Tolerance)
		return &Scenario{Replaced: pairs, Values: values, SBIC: s, Weights: c.weights(s), Choice: ch, Changed: ch.Model != r.SBIC.Model}
	}
	var all, withEstimate []int
	var regular, estimates []Value
	for pi, p := range c.pairs {
		if p.Status == rlct.Exact {
			continue
		}
		ps := PairSensitivity{Pair: pi}
		for i := range k {
			if c.le[p.Model][i] {
				ps.Affects = append(ps.Affects, i)
			}
		}
		reg := c.Regular(p.Model)
		ps.Regular = *scenario([]int{pi}, []Value{reg})
		all, regular = append(all, pi), append(regular, reg)
		if p.Estimate != nil {
			ps.Estimate = scenario([]int{pi}, []Value{*p.Estimate})
			withEstimate, estimates = append(withEstimate, pi), append(estimates, *p.Estimate)
		}
		r.Sensitivity = append(r.Sensitivity, ps)
	}
	if len(all) > 0 {
		r.AllRegular = scenario(all, regular)
	}
	if len(withEstimate) > 0 {
		r.AllEstimates = scenario(withEstimate, estimates)
	}
	return r, nil
}

// weights returns P(M_i)·exp(s_i), normalised, computed in logs.
func (c *Candidates) weights(s []float64) []float64 {
	lw := make([]float64, len(s))
	for i := range s {
		lw[i] = s[i] + c.logPrior[i]
	}
	z := logSumExp(lw)
	for i := range lw {
		lw[i] = math.Exp(lw[i] - z)
	}
	return lw
}

// choose picks the model of largest log weight, with ties broken as
// Choice documents.
func (c *Candidates) choose(s []float64, tol float64) Choice {
	best := math.Inf(-1)
	for i := range s {
		best = math.Max(best, s[i]+c.logPrior[i])
	}
	var tied []int
	for i := range s {
		if best-(s[i]+c.logPrior[i]) <= tol {
			tied = append(tied, i)
		}
	}
	slices.SortStableFunc(tied, func(a, b int) int { return cmp.Compare(c.models[a].Dim, c.models[b].Dim) })
	return Choice{Model: tied[0], Tied: tied[1:]}
}
