package rlct

import (
	"bytes"
	"encoding/json"
	"io"
	"math/big"
	"slices"
	"strings"
	"testing"
)

// The JSON field names that users script against, in the order they are
// written: the README's table of `bound --json` (and the field lists of
// Certificate, Face, Witness and Truncation documented there). They are
// written out here, not taken from the code, so that renaming a field in the
// code fails this test.
var (
	resultKeys      = []string{"lambda", "theta", "status", "summary", "distance", "variables", "prior", "weights", "point", "form", "reasons", "notes", "principal_face", "certificate", "nondegeneracy", "truncation", "reduction", "repair", "lambda_certified", "changes", "locals"}
	faceKeys        = []string{"dim", "codim", "compact", "principal", "vertices", "rays", "normal", "rhs", "polynomial", "terms", "verdict", "rule", "witness", "reason"}
	certificateKeys = []string{"unsafe_points", "faces_examined", "by_rule", "degenerate", "undetermined", "complete", "stopped", "deciding_faces"}
	truncationKeys  = []string{"order", "principal", "faces", "bound_order", "needed_order", "remainder"}
	witnessKeys     = []string{"root", "monomial", "point"}
	penaltyKeys     = []string{"lambda", "theta", "status", "note", "n", "singular", "regular", "dim"}
)

// objectKeys returns the keys of the JSON object data in order, and the raw
// value of each.
func objectKeys(t *testing.T, data []byte) ([]string, map[string]json.RawMessage) {
	t.Helper()
	dec := json.NewDecoder(bytes.NewReader(data))
	if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
		t.Fatalf("not an object: %s", data)
	}
	var keys []string
	values := map[string]json.RawMessage{}
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			t.Fatal(err)
		}
		var v json.RawMessage
		if err := dec.Decode(&v); err != nil {
			t.Fatal(err)
		}
		keys = append(keys, tok.(string))
		values[tok.(string)] = v
	}
	if _, err := dec.Token(); err != nil {
		t.Fatal(err)
	}
	if _, err := dec.Token(); err != io.EOF {
		t.Fatalf("data after the object: %s", data)
	}
	return keys, values
}

// checkKeys checks that the keys of object data come from want, in its order,
// and include every key of must.
func checkKeys(t *testing.T, what string, data []byte, want, must []string) map[string]json.RawMessage {
	t.Helper()
	keys, values := objectKeys(t, data)
	at := 0
	for _, k := range keys {
		i := slices.Index(want[at:], k)
		if i < 0 {
			t.Errorf("%s: key %q is not a documented key after %q (keys %q)", what, k, want[:at], keys)
			continue
		}
		at += i + 1
	}
	for _, k := range must {
		if !slices.Contains(keys, k) {
			t.Errorf("%s: no key %q in %s", what, k, data)
		}
	}
	return values
}

// TestJSONFieldNames encodes results that use every field and checks the
// names and their order at each level.
func TestJSONFieldNames(t *testing.T) {
	tests := []struct {
		name string
		spec Spec
		opt  *Options
		must []string
	}{
		// A degenerate edge: reasons and a deciding face with a witness.
		{"degenerate", Spec{K: "(y - x^2)^2"}, &Options{NoReduction: true, NoRepair: true}, []string{"lambda", "theta", "status", "summary", "distance", "variables", "prior", "weights", "point", "form", "reasons", "principal_face", "certificate"}},
		// Every compact face listed.
		{"all faces", Spec{K: "(y - x^2)^2"}, &Options{AllFaces: true}, []string{"nondegeneracy"}},
		// A reduction.
		{"reduction", Spec{K: "(x - y)^2 + z^4"}, nil, []string{"reduction"}},
		// A repair of a degenerate edge, and λ certified by Varchenko's
		// criterion.
		{"repair", Spec{K: "x^2*y^2 - 2*x*y^3 + y^4 + x^6"}, nil, []string{"repair", "changes"}},
		{"varchenko", Spec{K: "(x^2 - y^3)^2"}, nil, []string{"repair", "lambda_certified", "changes"}},
		// A truncated series.
		{"truncated", Spec{K: "x^2 + sin(y)^8", Order: 6}, nil, []string{"truncation", "reasons"}},
		// Several points, and a prior exponent that does not count.
		{"points", Spec{K: "x^2*(x-1)^4 + y^2", Prior: "x=1", At: []string{"x=0", "x=1"}}, nil, []string{"locals", "notes"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := solveWith(t, &tt.spec, tt.opt)
			data, err := json.Marshal(r)
			if err != nil {
				t.Fatal(err)
			}
			top := checkKeys(t, "result", data, resultKeys, tt.must)
			var str string
			if json.Unmarshal(top["lambda"], &str) != nil || str != r.Lambda.RatString() {
				t.Errorf("lambda %s, want the string %q", top["lambda"], r.Lambda.RatString())
			}
			if f := top["principal_face"]; f != nil {
				fv := checkKeys(t, "principal face", f, faceKeys, []string{"dim", "codim", "compact", "principal", "vertices", "normal", "rhs", "polynomial", "terms"})
				var normal []string
				if json.Unmarshal(fv["normal"], &normal) != nil || len(normal) != len(r.Vars) {
					t.Errorf("normal %s is not a list of strings", fv["normal"])
				}
			}
			if c := top["certificate"]; c != nil {
				cv := checkKeys(t, "certificate", c, certificateKeys, []string{"unsafe_points", "faces_examined", "degenerate", "undetermined", "complete"})
				var deciding []json.RawMessage
				if d := cv["deciding_faces"]; d != nil && json.Unmarshal(d, &deciding) == nil {
					for _, f := range deciding {
						fv := checkKeys(t, "deciding face", f, faceKeys, []string{"verdict", "rule"})
						if w := fv["witness"]; w != nil {
							checkKeys(t, "witness", w, witnessKeys, witnessKeys)
						}
					}
				}
			}
			if tr := top["truncation"]; tr != nil {
				checkKeys(t, "truncation", tr, truncationKeys, truncationKeys)
			}
			var locals []json.RawMessage
			if l := top["locals"]; l != nil && json.Unmarshal(l, &locals) == nil {
				for _, l := range locals {
					checkKeys(t, "local", l, resultKeys, []string{"lambda", "point"})
				}
			}
		})
	}
	pen := NewPenalties(big.NewRat(3, 4), 2, UpperBound, 3, []float64{1000})
	data, err := json.Marshal(pen)
	if err != nil {
		t.Fatal(err)
	}
	checkKeys(t, "penalties", data, penaltyKeys, penaltyKeys)
	if !strings.Contains(string(data), `"lambda":"3/4"`) {
		t.Errorf("penalties %s: λ is not the exact string", data)
	}
}
