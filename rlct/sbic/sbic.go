package sbic

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"slices"
	"strings"

	"github.com/lctkit/lctkit/rlct"
)

// Model is one candidate model.
type Model struct {
	// Name identifies the model in errors and reports; names must be
	// distinct and not empty.
	Name string
	// Dim is the dimension d of the model: its BIC penalty is
	// (d/2)·log n, and d/2 is the regular value of its learning
	// coefficients.
	Dim int
	// Prior is the prior weight of the model relative to the others; the
	// weights are normalised. 0 means 1.
	Prior float64
}

// Pair is the learning coefficient of one model at a truth in another.
type Pair struct {
	// Model and Truth are indices into the models: (Lambda, Theta) is the
	// learning coefficient of Models[Model] at a generic true distribution
	// in Models[Truth], which must satisfy Truth ⪯ Model.
	Model, Truth int
	// Lambda (λ ≥ 0) and Theta (θ ≥ 1) are the pair.
	Lambda *big.Rat
	Theta  int
	// Status says what the pair claims: rlct.Exact, rlct.UpperBound or
	// rlct.Uncertified (see rlct.Status).
	Status rlct.Status
	// Estimate, when not nil, is another value for the pair (a published
	// formula, a numerical estimate) that the sensitivity report puts in
	// its place; it is used only when the pair is not Exact.
	Estimate *Value
	// Source says where the pair comes from, for reports (optional).
	Source string
}

// Value is a learning coefficient λ with its multiplicity θ.
type Value struct {
	Lambda *big.Rat
	Theta  int
}

// String writes the value as "λ = 3/2, θ = 1".
func (v Value) String() string {
	return fmt.Sprintf("λ = %s, θ = %d", v.Lambda.RatString(), v.Theta)
}

// ErrInput is the parent of the errors of this package that say the input
// is malformed: errors.Is(err, ErrInput) holds for each of the errors below
// and for every error that wraps one. It also matches rlct.ErrInput, so a
// caller can ask once whether any error of lctkit is bad input.
var ErrInput error = &inputError{"sbic: bad input"}

// Errors of New, Scores and Choose, each wrapped with the names involved.
// Each matches ErrInput and rlct.ErrInput.
var (
	// ErrCycle: the order relation has a cycle, so it is not a partial
	// order of distinct models.
	ErrCycle error = &inputError{"sbic: the order has a cycle"}
	// ErrMissingPair: a pair j ⪯ i needed by the recursion was not given.
	ErrMissingPair error = &inputError{"sbic: a pair is missing"}
)

// inputError is an input error; it matches ErrInput and rlct.ErrInput.
type inputError struct{ msg string }

func (e *inputError) Error() string { return e.msg }

// Is reports that every input error matches ErrInput and rlct.ErrInput.
func (e *inputError) Is(target error) bool { return target == ErrInput || target == rlct.ErrInput }

// inputf returns an error that wraps ErrInput with a message.
func inputf(format string, args ...any) error {
	return &wrapped{fmt.Sprintf(format, args...), ErrInput}
}

// wrapped is an error with its own message that wraps a sentinel.
type wrapped struct {
	msg string
	err error
}

func (e *wrapped) Error() string { return e.msg }
func (e *wrapped) Unwrap() error { return e.err }

// Candidates is a validated set of candidate models: their partial order
// (closed under transitivity), the pairs and a topological order. It is
// built by New and is read-only afterwards, so one Candidates can be scored
// on many data sets, from several goroutines at once.
type Candidates struct {
	models []Model
	pairs  []Pair
	// topo lists the models so that each comes after its submodels (and,
	// among models not ordered, in input order).
	topo []int
	// le[j][i] reports M_j ⪯ M_i (reflexive, transitive).
	le [][]bool
	// below[i] lists the strict submodels j ≺ i in topological order.
	below [][]int
	// pairAt[i][j] is the index of the pair (i, j) in pairs, or -1.
	pairAt [][]int
	// lambda[i][j], theta[i][j] are the pair (i, j) as numbers.
	lambda [][]float64
	theta  [][]int
	// logPrior[i] is log P(M_i), normalised.
	logPrior []float64
	// maxLambda is the largest λ_ij or d_i/2, for the rounding estimate.
	maxLambda float64
}

// New validates the candidates and returns them ready to be scored. order
// holds the relations {j, i}, meaning M_j ⪯ M_i (M_j ⊆ M_i); the order is
// closed under reflexivity and transitivity, so a chain needs only its links.
// pairs must hold exactly one pair (i, j) for every j ⪯ i of the closure,
// including every (i, i).
//
// New returns an error wrapping ErrCycle that names the cycle (a ⪯ b ⪯ a),
// ErrMissingPair naming the missing pair, or ErrInput for anything else: no
// models, an empty or repeated name, a negative dimension, a prior weight
// that is negative or not finite, an index out of range, a pair whose truth
// is not below its model, a repeated pair, λ < 0, θ < 1 or an unknown
// status (also in an estimate).
func New(models []Model, order [][2]int, pairs []Pair) (*Candidates, error) {
	k := len(models)
	if k == 0 {
		return nil, inputf("sbic: no models")
	}
	c := &Candidates{models: slices.Clone(models), pairs: slices.Clone(pairs)}
	names := make(map[string]int, k)
	for i, m := range models {
		switch {
		case strings.TrimSpace(m.Name) == "":
			return nil, inputf("sbic: model %d has no name", i+1)
		case m.Dim < 0:
			return nil, inputf("sbic: model %q: dimension %d is negative", m.Name, m.Dim)
		case m.Prior < 0 || math.IsNaN(m.Prior) || math.IsInf(m.Prior, 0):
			return nil, inputf("sbic: model %q: prior weight %g must be positive and finite (0 means 1)", m.Name, m.Prior)
		}
		if j, ok := names[m.Name]; ok {
			return nil, inputf("sbic: models %d and %d are both named %q", j+1, i+1, m.Name)
		}
		names[m.Name] = i
		c.maxLambda = math.Max(c.maxLambda, float64(m.Dim)/2)
	}
	// Normalised log prior weights.
	total := 0.0
	for _, m := range models {
		total += priorWeight(m)
	}
	c.logPrior = make([]float64, k)
	for i, m := range models {
		c.logPrior[i] = math.Log(priorWeight(m)) - math.Log(total)
	}

	// The order: direct links, a cycle check, a topological order, then the
	// transitive closure.
	succ := make([][]int, k)
	for _, o := range order {
		j, i := o[0], o[1]
		if j < 0 || j >= k || i < 0 || i >= k {
			return nil, inputf("sbic: order relation {%d, %d}: index out of range (there are %d models)", j, i, k)
		}
		if j != i && !slices.Contains(succ[j], i) {
			succ[j] = append(succ[j], i)
		}
	}
	if cyc := findCycle(succ); cyc != nil {
		parts := make([]string, len(cyc))
		for n, m := range cyc {
			parts[n] = fmt.Sprintf("%q", models[m].Name)
		}
		return nil, &wrapped{fmt.Sprintf("sbic: the order has a cycle: %s (models ordered both ways would be equal)", strings.Join(parts, " ⪯ ")), ErrCycle}
	}
	c.topo = topoOrder(succ)
	c.le = make([][]bool, k)
	for j := range c.le {
		c.le[j] = make([]bool, k)
		c.le[j][j] = true
	}
	// Walk the topological order backwards: everything above a successor
	// is above j.
	for n := k - 1; n >= 0; n-- {
		j := c.topo[n]
		for _, i := range succ[j] {
			for m := range k {
				if c.le[i][m] {
					c.le[j][m] = true
				}
			}
		}
	}
	c.below = make([][]int, k)
	for _, i := range c.topo {
		for _, j := range c.topo {
			if j != i && c.le[j][i] {
				c.below[i] = append(c.below[i], j)
			}
		}
	}

	// The pairs.
	c.pairAt = make([][]int, k)
	c.lambda = make([][]float64, k)
	c.theta = make([][]int, k)
	for i := range k {
		c.pairAt[i] = make([]int, k)
		for j := range c.pairAt[i] {
			c.pairAt[i][j] = -1
		}
		c.lambda[i] = make([]float64, k)
		c.theta[i] = make([]int, k)
	}
	for n, p := range pairs {
		if p.Model < 0 || p.Model >= k || p.Truth < 0 || p.Truth >= k {
			return nil, inputf("sbic: pair %d: model index %d or truth index %d out of range (there are %d models)", n+1, p.Model, p.Truth, k)
		}
		name := c.PairName(p)
		if !c.le[p.Truth][p.Model] {
			return nil, inputf("sbic: pair %s: %q ⪯ %q is not in the order, so the pair is not used (is the order missing a relation?)",
				name, models[p.Truth].Name, models[p.Model].Name)
		}
		if m := c.pairAt[p.Model][p.Truth]; m >= 0 {
			return nil, inputf("sbic: pair %s is given twice (pairs %d and %d)", name, m+1, n+1)
		}
		if err := checkValue(p.Lambda, p.Theta); err != nil {
			return nil, inputf("sbic: pair %s: %v", name, err)
		}
		switch p.Status {
		case rlct.Exact, rlct.UpperBound, rlct.Uncertified:
		default:
			return nil, inputf("sbic: pair %s: unknown status %q (want %q, %q or %q)", name, p.Status, rlct.Exact, rlct.UpperBound, rlct.Uncertified)
		}
		if p.Estimate != nil {
			if err := checkValue(p.Estimate.Lambda, p.Estimate.Theta); err != nil {
				return nil, inputf("sbic: pair %s: estimate: %v", name, err)
			}
		}
		c.pairAt[p.Model][p.Truth] = n
		c.lambda[p.Model][p.Truth], _ = p.Lambda.Float64()
		c.theta[p.Model][p.Truth] = p.Theta
		c.maxLambda = math.Max(c.maxLambda, c.lambda[p.Model][p.Truth])
		if p.Estimate != nil {
			l, _ := p.Estimate.Lambda.Float64()
			c.maxLambda = math.Max(c.maxLambda, l)
		}
	}
	for _, i := range c.topo {
		for _, j := range append(slices.Clone(c.below[i]), i) {
			if c.pairAt[i][j] < 0 {
				return nil, &wrapped{fmt.Sprintf("sbic: no pair for model %q at a truth in %q (%q ⪯ %q, so the recursion needs its learning coefficient)",
					models[i].Name, models[j].Name, models[j].Name, models[i].Name), ErrMissingPair}
			}
		}
	}
	return c, nil
}

// priorWeight is the model's prior weight, 1 when it is 0.
func priorWeight(m Model) float64 {
	if m.Prior == 0 {
		return 1
	}
	return m.Prior
}

// checkValue checks λ ≥ 0 and θ ≥ 1.
func checkValue(lambda *big.Rat, theta int) error {
	switch {
	case lambda == nil:
		return errors.New("λ is not given")
	case lambda.Sign() < 0:
		return fmt.Errorf("λ = %s is negative", lambda.RatString())
	case theta < 1:
		return fmt.Errorf("θ = %d must be at least 1", theta)
	}
	if f, _ := lambda.Float64(); math.IsInf(f, 0) {
		return fmt.Errorf("λ = %s is too large", lambda.RatString())
	}
	return nil
}

// findCycle returns the models of a cycle of the directed graph succ, the
// first repeated at the end, or nil when there is none. The search is
// iterative, so a long chain cannot overflow the stack.
func findCycle(succ [][]int) []int {
	const (
		white = iota
		grey
		black
	)
	colour := make([]int, len(succ))
	parent := make([]int, len(succ))
	next := make([]int, len(succ)) // next successor to visit
	for start := range succ {
		if colour[start] != white {
			continue
		}
		colour[start] = grey
		parent[start] = -1
		stack := []int{start}
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			if next[v] == len(succ[v]) {
				colour[v] = black
				stack = stack[:len(stack)-1]
				continue
			}
			w := succ[v][next[v]]
			next[v]++
			switch colour[w] {
			case white:
				colour[w] = grey
				parent[w] = v
				stack = append(stack, w)
			case grey:
				// v → w closes a cycle w → … → v → w.
				cyc := []int{v}
				for u := v; u != w; {
					u = parent[u]
					cyc = append(cyc, u)
				}
				slices.Reverse(cyc)
				return append(cyc, w)
			}
		}
	}
	return nil
}

// topoOrder returns the models of the acyclic graph succ so that each
// comes after every model with a path to it; among the models free to come
// next, the one given first comes first.
func topoOrder(succ [][]int) []int {
	k := len(succ)
	indeg := make([]int, k)
	for _, s := range succ {
		for _, i := range s {
			indeg[i]++
		}
	}
	done := make([]bool, k)
	out := make([]int, 0, k)
	for len(out) < k {
		for m := range k {
			if !done[m] && indeg[m] == 0 {
				done[m] = true
				out = append(out, m)
				for _, i := range succ[m] {
					indeg[i]--
				}
				break
			}
		}
	}
	return out
}

// Len returns the number of models.
func (c *Candidates) Len() int { return len(c.models) }

// Model returns model i. It panics if i is out of range.
func (c *Candidates) Model(i int) Model { return c.models[i] }

// Pairs returns a copy of the pairs, in the order given to New.
func (c *Candidates) Pairs() []Pair { return slices.Clone(c.pairs) }

// Below reports whether M_j ⪯ M_i in the order (reflexive and transitive).
// It panics if i or j is out of range.
func (c *Candidates) Below(j, i int) bool { return c.le[j][i] }

// Topological returns the models in the order the recursion takes them:
// each after its submodels.
func (c *Candidates) Topological() []int { return slices.Clone(c.topo) }

// PairName writes a pair as "B at A": the learning coefficient of model B
// at a truth in model A. It panics if the pair's indices are out of range.
func (c *Candidates) PairName(p Pair) string {
	return fmt.Sprintf("%q at %q", c.models[p.Model].Name, c.models[p.Truth].Name)
}

// Regular returns the regular value of the learning coefficients of model
// i: λ = d_i/2, θ = 1. It panics if i is out of range.
func (c *Candidates) Regular(i int) Value {
	return Value{big.NewRat(int64(c.models[i].Dim), 2), 1}
}
