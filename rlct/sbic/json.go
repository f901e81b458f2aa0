package sbic

import (
	"bytes"
	"encoding/json"
	"math"

	"github.com/lctkit/lctkit/rlct"
)

// method names what the JSON form of a Result computes, in its "method"
// field.
const method = "singular BIC (Drton & Plummer 2017) beside the BIC (Schwarz 1978); float64 evaluations, in nats"

// The JSON form of a Result names models and pairs where the Result holds
// indices, and so has a shape of its own: resultJSON and the types below,
// written by Result.MarshalJSON. Scores and weights are float64
// evaluations; λ values are exact strings ("3/2").

// resultJSON is the JSON shape of a Result.
type resultJSON struct {
	Method string      `json:"method"`
	N      float64     `json:"n"`
	Models []modelJSON `json:"models"`
	// ChosenBIC and ChosenSBIC are the choices of the two criteria.
	ChosenBIC  choiceJSON `json:"chosen_bic"`
	ChosenSBIC choiceJSON `json:"chosen_sbic"`
	// Tolerance is Result.Tolerance.
	Tolerance float64 `json:"tie_tolerance"`
	// Pairs lists every pair as given or computed.
	Pairs []pairJSON `json:"pairs"`
	// Sensitivity, AllRegular and AllEstimates are those of the Result.
	Sensitivity  []sensitivityJSON `json:"sensitivity,omitempty"`
	AllRegular   *scenarioJSON     `json:"all_regular,omitempty"`
	AllEstimates *scenarioJSON     `json:"all_estimates,omitempty"`
}

// modelJSON is one model's scores.
type modelJSON struct {
	Name string `json:"name"`
	Dim  int    `json:"dim"`
	// Prior is the normalised prior probability.
	Prior      float64 `json:"prior"`
	LogLik     float64 `json:"loglik"`
	BIC        float64 `json:"bic"`
	SBIC       float64 `json:"sbic"`
	WeightBIC  float64 `json:"weight_bic"`
	WeightSBIC float64 `json:"weight_sbic"`
	// Status is the weakest status of the pairs the sBIC rests on (not a
	// status of the score, which is a float64 evaluation).
	Status rlct.Status `json:"pairs_status"`
	// RestsOn lists the pairs that are not exact which the sBIC rests on.
	RestsOn []PairRef `json:"rests_on,omitempty"`
}

// PairRef names a pair: the learning coefficient of Model at a truth in
// Truth.
type PairRef struct {
	Model string `json:"model"`
	Truth string `json:"truth"`
}

// choiceJSON is a Choice with names.
type choiceJSON struct {
	Model string   `json:"model"`
	Tied  []string `json:"tied,omitempty"`
}

// valueJSON is a Value with λ as an exact string.
type valueJSON struct {
	Lambda string `json:"lambda"`
	Theta  int    `json:"theta"`
}

// pairJSON is one pair.
type pairJSON struct {
	PairRef
	Lambda string      `json:"lambda"`
	Theta  int         `json:"theta"`
	Status rlct.Status `json:"status"`
	// Note says, for a pair that is not exact, what a penalty from it is
	// not (rlct.PenaltyNote).
	Note     string     `json:"note,omitempty"`
	Estimate *valueJSON `json:"estimate,omitempty"`
	Source   string     `json:"source,omitempty"`
}

// sensitivityJSON is a PairSensitivity with names.
type sensitivityJSON struct {
	Pair     PairRef       `json:"pair"`
	Status   rlct.Status   `json:"status"`
	Affects  []string      `json:"affects"`
	Regular  scenarioJSON  `json:"regular"`
	Estimate *scenarioJSON `json:"estimate,omitempty"`
}

// scenarioJSON is a Scenario with names.
type scenarioJSON struct {
	Replaced []replacementJSON  `json:"replaced"`
	Models   []scenarioLineJSON `json:"models"`
	Chosen   choiceJSON         `json:"chosen_sbic"`
	Changed  bool               `json:"choice_changed"`
}

// replacementJSON is one pair replaced in a scenario, with the value put in
// its place.
type replacementJSON struct {
	Pair PairRef `json:"pair"`
	valueJSON
}

// scenarioLineJSON is one model's recomputed score.
type scenarioLineJSON struct {
	Name   string  `json:"name"`
	SBIC   float64 `json:"sbic"`
	Weight float64 `json:"weight_sbic"`
}

// Ref returns the names of pair number i (an index into the pairs given to
// New). It panics if i is out of range.
func (c *Candidates) Ref(i int) PairRef {
	p := c.pairs[i]
	return PairRef{Model: c.models[p.Model].Name, Truth: c.models[p.Truth].Name}
}

// MarshalJSON writes r with models and pairs named, as the choose command
// of lctkit prints it with --json.
func (r *Result) MarshalJSON() ([]byte, error) {
	c := r.c
	rep := &resultJSON{Method: method, N: r.N, Tolerance: r.Tolerance,
		ChosenBIC: r.choiceJSON(r.BIC), ChosenSBIC: r.choiceJSON(r.SBIC)}
	for i, s := range r.Models {
		m := modelJSON{Name: s.Name, Dim: s.Dim, Prior: math.Exp(c.logPrior[i]), LogLik: s.LogLik, BIC: s.BIC, SBIC: s.SBIC,
			WeightBIC: s.WeightBIC, WeightSBIC: s.WeightSBIC, Status: s.Status}
		for _, p := range s.RestsOn {
			m.RestsOn = append(m.RestsOn, c.Ref(p))
		}
		rep.Models = append(rep.Models, m)
	}
	for i, p := range c.pairs {
		pr := pairJSON{PairRef: c.Ref(i), Lambda: p.Lambda.RatString(), Theta: p.Theta, Status: p.Status,
			Note: rlct.PenaltyNote(p.Status), Source: p.Source}
		if p.Estimate != nil {
			pr.Estimate = &valueJSON{p.Estimate.Lambda.RatString(), p.Estimate.Theta}
		}
		rep.Pairs = append(rep.Pairs, pr)
	}
	for _, ps := range r.Sensitivity {
		sr := sensitivityJSON{Pair: c.Ref(ps.Pair), Status: c.pairs[ps.Pair].Status, Regular: *r.scenarioJSON(&ps.Regular)}
		for _, i := range ps.Affects {
			sr.Affects = append(sr.Affects, c.models[i].Name)
		}
		sr.Estimate = r.scenarioJSON(ps.Estimate)
		rep.Sensitivity = append(rep.Sensitivity, sr)
	}
	rep.AllRegular = r.scenarioJSON(r.AllRegular)
	rep.AllEstimates = r.scenarioJSON(r.AllEstimates)
	return marshalNoEscape(rep)
}

func (r *Result) choiceJSON(ch Choice) choiceJSON {
	out := choiceJSON{Model: r.c.models[ch.Model].Name}
	for _, i := range ch.Tied {
		out.Tied = append(out.Tied, r.c.models[i].Name)
	}
	return out
}

func (r *Result) scenarioJSON(s *Scenario) *scenarioJSON {
	if s == nil {
		return nil
	}
	out := &scenarioJSON{Chosen: r.choiceJSON(s.Choice), Changed: s.Changed}
	for n, pi := range s.Replaced {
		out.Replaced = append(out.Replaced, replacementJSON{r.c.Ref(pi), valueJSON{s.Values[n].Lambda.RatString(), s.Values[n].Theta}})
	}
	for i, m := range r.c.models {
		out.Models = append(out.Models, scenarioLineJSON{Name: m.Name, SBIC: s.SBIC[i], Weight: s.Weights[i]})
	}
	return out
}

// Candidates returns the candidates r was computed for.
func (r *Result) Candidates() *Candidates { return r.c }

// marshalNoEscape is json.Marshal without the HTML escaping of <, > and &,
// which an encoder of the whole output could not undo.
func marshalNoEscape(v any) ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimRight(b.Bytes(), "\n"), nil
}
