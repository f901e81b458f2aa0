package sbic

import (
	"math"

	"github.com/lctkit/lctkit/rlct"
)

// Method names what a Report computes, as its "method" field says.
const Method = "singular BIC (Drton & Plummer 2017) beside the BIC (Schwarz 1978); float64 evaluations, in nats"

// Report is the JSON form of a Result. Scores and weights are float64
// evaluations; λ values are exact strings ("3/2").
type Report struct {
	Method string        `json:"method"`
	N      float64       `json:"n"`
	Models []ModelReport `json:"models"`
	// ChosenBIC and ChosenSBIC are the choices of the two criteria.
	ChosenBIC  ChoiceReport `json:"chosen_bic"`
	ChosenSBIC ChoiceReport `json:"chosen_sbic"`
	// Tolerance is Result.Tolerance.
	Tolerance float64 `json:"tie_tolerance"`
	// Pairs lists every pair as given or computed.
	Pairs []PairReport `json:"pairs"`
	// Sensitivity, AllRegular and AllEstimates are those of the Result.
	Sensitivity  []SensitivityReport `json:"sensitivity,omitempty"`
	AllRegular   *ScenarioReport     `json:"all_regular,omitempty"`
	AllEstimates *ScenarioReport     `json:"all_estimates,omitempty"`
}

// ModelReport is one model's scores.
type ModelReport struct {
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

// ChoiceReport is a Choice with names.
type ChoiceReport struct {
	Model string   `json:"model"`
	Tied  []string `json:"tied,omitempty"`
}

// ValueReport is a Value with λ as an exact string.
type ValueReport struct {
	Lambda string `json:"lambda"`
	Theta  int    `json:"theta"`
}

// PairReport is one pair.
type PairReport struct {
	PairRef
	Lambda string      `json:"lambda"`
	Theta  int         `json:"theta"`
	Status rlct.Status `json:"status"`
	// Note says, for a pair that is not exact, what a penalty from it is
	// not (rlct.PenaltyNote).
	Note     string       `json:"note,omitempty"`
	Estimate *ValueReport `json:"estimate,omitempty"`
	Source   string       `json:"source,omitempty"`
}

// SensitivityReport is a PairSensitivity with names.
type SensitivityReport struct {
	Pair     PairRef         `json:"pair"`
	Status   rlct.Status     `json:"status"`
	Affects  []string        `json:"affects"`
	Regular  ScenarioReport  `json:"regular"`
	Estimate *ScenarioReport `json:"estimate,omitempty"`
}

// ScenarioReport is a Scenario with names.
type ScenarioReport struct {
	Replaced []Replacement  `json:"replaced"`
	Models   []ScenarioLine `json:"models"`
	Chosen   ChoiceReport   `json:"chosen_sbic"`
	Changed  bool           `json:"choice_changed"`
}

// Replacement is one pair replaced in a scenario, with the value put in its
// place.
type Replacement struct {
	Pair PairRef `json:"pair"`
	ValueReport
}

// ScenarioLine is one model's recomputed score.
type ScenarioLine struct {
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

// Report returns the JSON form of r.
func (r *Result) Report() *Report {
	c := r.c
	rep := &Report{Method: Method, N: r.N, Tolerance: r.Tolerance,
		ChosenBIC: r.choiceReport(r.BIC), ChosenSBIC: r.choiceReport(r.SBIC)}
	for i, s := range r.Models {
		m := ModelReport{Name: s.Name, Dim: s.Dim, Prior: math.Exp(c.logPrior[i]), LogLik: s.LogLik, BIC: s.BIC, SBIC: s.SBIC,
			WeightBIC: s.WeightBIC, WeightSBIC: s.WeightSBIC, Status: s.Status}
		for _, p := range s.RestsOn {
			m.RestsOn = append(m.RestsOn, c.Ref(p))
		}
		rep.Models = append(rep.Models, m)
	}
	for i, p := range c.pairs {
		pr := PairReport{PairRef: c.Ref(i), Lambda: p.Lambda.RatString(), Theta: p.Theta, Status: p.Status,
			Note: rlct.PenaltyNote(p.Status), Source: p.Source}
		if p.Estimate != nil {
			pr.Estimate = &ValueReport{p.Estimate.Lambda.RatString(), p.Estimate.Theta}
		}
		rep.Pairs = append(rep.Pairs, pr)
	}
	for _, ps := range r.Sensitivity {
		sr := SensitivityReport{Pair: c.Ref(ps.Pair), Status: c.pairs[ps.Pair].Status, Regular: *r.scenarioReport(&ps.Regular)}
		for _, i := range ps.Affects {
			sr.Affects = append(sr.Affects, c.models[i].Name)
		}
		sr.Estimate = r.scenarioReport(ps.Estimate)
		rep.Sensitivity = append(rep.Sensitivity, sr)
	}
	rep.AllRegular = r.scenarioReport(r.AllRegular)
	rep.AllEstimates = r.scenarioReport(r.AllEstimates)
	return rep
}

func (r *Result) choiceReport(ch Choice) ChoiceReport {
	out := ChoiceReport{Model: r.c.models[ch.Model].Name}
	for _, i := range ch.Tied {
		out.Tied = append(out.Tied, r.c.models[i].Name)
	}
	return out
}

func (r *Result) scenarioReport(s *Scenario) *ScenarioReport {
	if s == nil {
		return nil
	}
	out := &ScenarioReport{Chosen: r.choiceReport(s.Choice), Changed: s.Changed}
	for n, pi := range s.Replaced {
		out.Replaced = append(out.Replaced, Replacement{r.c.Ref(pi), ValueReport{s.Values[n].Lambda.RatString(), s.Values[n].Theta}})
	}
	for i, m := range r.c.models {
		out.Models = append(out.Models, ScenarioLine{Name: m.Name, SBIC: s.SBIC[i], Weight: s.Weights[i]})
	}
	return out
}

// Candidates returns the candidates r was computed for.
func (r *Result) Candidates() *Candidates { return r.c }
