package rlct

import (
	"math"
	"math/big"
)

// Report is the JSON form of a Result, shared by every command that prints
// one. Exact numbers are strings in lowest terms ("3/4", "2"), so no value
// passes through a float. Error is set, and nothing else, when the problem
// could not be answered.
type Report struct {
	Lambda        string            `json:"lambda,omitempty"`
	Theta         int               `json:"theta,omitempty"`
	Status        Status            `json:"status,omitempty"`
	Summary       string            `json:"summary,omitempty"`
	Distance      string            `json:"distance,omitempty"`
	Variables     []string          `json:"variables,omitempty"`
	Prior         []string          `json:"prior,omitempty"`
	Weights       []string          `json:"weights,omitempty"`
	Point         []string          `json:"point,omitempty"`
	Form          string            `json:"form,omitempty"`
	Reasons       []string          `json:"reasons,omitempty"`
	Notes         []string          `json:"notes,omitempty"`
	PrincipalFace *FaceJSON         `json:"principal_face,omitempty"`
	Certificate   *CertificateJSON  `json:"certificate,omitempty"`
	Nondegeneracy []FaceJSON        `json:"nondegeneracy,omitempty"`
	Truncation    *TruncationReport `json:"truncation,omitempty"`
	Penalty       *PenaltyReport    `json:"penalty,omitempty"`
	Locals        []*Report         `json:"locals,omitempty"`
	Error         string            `json:"error,omitempty"`
}

// FaceJSON is the JSON form of a FaceReport.
type FaceJSON struct {
	Dim        int         `json:"dim"`
	Codim      int         `json:"codim"`
	Compact    bool        `json:"compact"`
	Principal  bool        `json:"principal,omitempty"`
	Vertices   [][]int     `json:"vertices"`
	Rays       []string    `json:"rays,omitempty"`
	Normal     []string    `json:"normal"`
	RHS        string      `json:"rhs"`
	Polynomial string      `json:"polynomial"`
	Terms      int         `json:"terms"`
	Verdict    FaceVerdict `json:"verdict,omitempty"`
	Rule       string      `json:"rule,omitempty"`
	Witness    *Witness    `json:"witness,omitempty"`
	Reason     string      `json:"reason,omitempty"`
}

// Report returns the JSON form of r.
func (r *Result) Report() *Report {
	out := &Report{
		Lambda:    r.Lambda.RatString(),
		Theta:     r.Theta,
		Status:    r.Status,
		Summary:   r.Headline(),
		Distance:  r.Distance.RatString(),
		Variables: r.Vars,
		Prior:     ratStrings(r.Prior),
		Weights:   ratStrings(r.Weights),
		Point:     ratStrings(r.Point),
		Form:      r.Form,
		Reasons:   r.Reasons,
		Notes:     r.Notes,
	}
	pf := r.Principal.json()
	out.PrincipalFace = &pf
	if c := r.Certificate; c != nil {
		cj := &CertificateJSON{Unsafe: c.Unsafe, Examined: c.Examined, ByRule: c.ByRule,
			Degenerate: c.Degenerate, Undetermined: c.Undetermined, Complete: c.Complete, Stop: c.Stop}
		for _, f := range c.Deciding {
			cj.Deciding = append(cj.Deciding, f.json())
		}
		out.Certificate = cj
	}
	for _, f := range r.Faces {
		out.Nondegeneracy = append(out.Nondegeneracy, f.json())
	}
	out.Truncation = r.Truncation
	for _, l := range r.Locals {
		out.Locals = append(out.Locals, l.Report())
	}
	return out
}

func (f FaceReport) json() FaceJSON {
	out := FaceJSON{
		Dim: f.Dim, Codim: f.Codim, Compact: f.Compact, Principal: f.Principal,
		Vertices: f.Vertices, Rays: f.Rays, RHS: f.RHS.String(), Polynomial: f.Polynomial, Terms: f.Terms,
		Verdict: f.Verdict, Rule: f.Rule, Witness: f.Witness, Reason: f.Reason,
	}
	for _, a := range f.Normal {
		out.Normal = append(out.Normal, a.String())
	}
	return out
}

// CertificateJSON is the JSON form of a Certificate.
type CertificateJSON struct {
	Unsafe       int            `json:"unsafe_points"`
	Examined     int            `json:"faces_examined"`
	ByRule       map[string]int `json:"by_rule,omitempty"`
	Degenerate   int            `json:"degenerate"`
	Undetermined int            `json:"undetermined"`
	Complete     bool           `json:"complete"`
	Stop         string         `json:"stopped,omitempty"`
	Deciding     []FaceJSON     `json:"deciding_faces,omitempty"`
}

func ratStrings(xs []*big.Rat) []string {
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = x.RatString()
	}
	return out
}

// PenaltyReport holds the asymptotic penalty at one or more sample sizes.
// The numbers are float64 evaluations of exact formulas, not exact values.
type PenaltyReport struct {
	// Lambda and Theta are the pair the penalty comes from (λ exact, as a
	// string in lowest terms).
	Lambda string `json:"lambda"`
	Theta  int    `json:"theta"`
	// Status is the status of the (λ, θ) pair.
	Status Status `json:"status"`
	// Note says, for a pair that is not Exact, what the penalty is not.
	Note string    `json:"note,omitempty"`
	N    []float64 `json:"n"`
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
// asymptotics of chapter 6; the chapter from memory), evaluated in float64. n must exceed e so that log log n is defined.
func Penalty(lambda *big.Rat, theta int, n float64) float64 {
	l, _ := lambda.Float64()
	return l*math.Log(n) - float64(theta-1)*math.Log(math.Log(n))
}

// RegularPenalty returns (d/2)·log n, the BIC penalty of a regular model
// with d parameters (Schwarz 1978, Estimating the dimension of a model).
func RegularPenalty(d int, n float64) float64 {
	return float64(d) / 2 * math.Log(n)
}

// NewPenaltyReport evaluates both penalties at each n for a pair of the
// given status; d ≤ 0 leaves the regular one out. A pair that is not Exact
// gets a Note (see PenaltyNote).
func NewPenaltyReport(lambda *big.Rat, theta int, status Status, d int, ns []float64) *PenaltyReport {
	pr := &PenaltyReport{Lambda: lambda.RatString(), Theta: theta, Status: status, Note: PenaltyNote(status), N: ns, Dim: max(d, 0)}
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
