package model

import (
	"bytes"
	"encoding/json"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// modelJSON is the JSON form of a Model: what K is, exactly, beside the
// bound (an rlct.Result), whose field names it does not reuse. Exact
// numbers are strings in lowest terms.
type modelJSON struct {
	Model            string   `json:"model,omitempty"`
	Kind             Kind     `json:"kind"`
	What             string   `json:"k_is"`
	K                string   `json:"k"`
	Generators       []string `json:"generators"`
	GeneratorWeights []string `json:"generator_weights"`
	GeneratorLabels  []string `json:"generator_labels"`
	Offsets          bool     `json:"offsets,omitempty"`
	Truth            []string `json:"truth"`
	Order            int      `json:"order,omitempty"`
	Remainder        []string `json:"remainder,omitempty"`
}

// MarshalJSON writes m as one object: "model" (the name), "kind", "k_is"
// (What), "k" (K written out), "generators", "generator_weights" and
// "generator_labels", "offsets" when K is in offsets from the truth,
// "truth" (the first truth, one value per variable), and for a truncated
// series "order" and "remainder" (the remainder monomials). None of these
// names is used by rlct.Result, so the two can share one object.
func (m *Model) MarshalJSON() ([]byte, error) {
	p := m.Problem
	r := &modelJSON{Model: m.Name, Kind: m.Kind, What: m.What, K: m.String(), Offsets: m.Offsets, GeneratorLabels: m.Labels}
	for i, g := range p.Generators {
		r.Generators = append(r.Generators, g.String())
		r.GeneratorWeights = append(r.GeneratorWeights, p.GeneratorWeights[i].RatString())
	}
	for _, v := range m.Truth {
		r.Truth = append(r.Truth, v.RatString())
	}
	if p.Truncated {
		r.Order = p.Order
		r.Remainder = m.RemainderStrings()
	}
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(r); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(b.Bytes(), []byte("\n")), nil
}

// RemainderStrings writes the remainder monomials of a truncated series,
// such as "a*b^5"; nil when K is exact.
func (m *Model) RemainderStrings() []string {
	var out []string
	vars := m.Vars()
	for _, r := range m.Problem.Remainder {
		out = append(out, monomial.Monomial(vars, r, big.NewRat(1, 1)).String())
	}
	return out
}

// TruthString writes the first truth as name=value pairs, such as
// "a=1/2,m1=2,m2=2".
func (m *Model) TruthString() string {
	vars := m.Vars()
	parts := make([]string, len(vars))
	for i, v := range vars {
		parts[i] = v + "=" + m.Truth[i].RatString()
	}
	return strings.Join(parts, ",")
}
