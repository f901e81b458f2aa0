package rlct

import "math/big"

// The JSON forms of this package follow one rule: a domain type is its own
// JSON form, with json tags on its fields; exact numbers are strings in
// lowest terms ("3/4", "12"), which *big.Rat gives by itself. Only a type
// whose fields need another encoding has a MarshalJSON method, built on an
// unexported struct of the same shape below: the *big.Int fields of Face
// and Facet. They write without escaping <, > and &, as the command line's
// encoder does, so that "x + y >= 2" reads as it is.

// faceJSON is the JSON shape of a Face.
type faceJSON struct {
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

// MarshalJSON writes f with its normal and right-hand side as strings.
func (f Face) MarshalJSON() ([]byte, error) {
	return marshalNoEscape(faceJSON{
		Dim: f.Dim, Codim: f.Codim, Compact: f.Compact, Principal: f.Principal,
		Vertices: f.Vertices, Rays: f.Rays, Normal: intStrings(f.Normal), RHS: intString(f.RHS),
		Polynomial: f.Polynomial, Terms: f.Terms,
		Verdict: f.Verdict, Rule: f.Rule, Witness: f.Witness, Reason: f.Reason,
	})
}

// facetJSON is the JSON shape of a Facet.
type facetJSON struct {
	Normal     []string `json:"normal"`
	RHS        string   `json:"rhs"`
	Inequality string   `json:"inequality"`
	Vertices   [][]int  `json:"vertices"`
	Rays       []string `json:"rays,omitempty"`
}

// MarshalJSON writes f with its normal and right-hand side as strings.
func (f Facet) MarshalJSON() ([]byte, error) {
	return marshalNoEscape(facetJSON{Normal: intStrings(f.Normal), RHS: intString(f.RHS),
		Inequality: f.Inequality, Vertices: f.Vertices, Rays: f.Rays})
}

func intString(x *big.Int) string {
	if x == nil {
		return ""
	}
	return x.String()
}

func intStrings(xs []*big.Int) []string {
	if xs == nil {
		return nil
	}
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = intString(x)
	}
	return out
}
