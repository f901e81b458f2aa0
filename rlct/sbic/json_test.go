package sbic

import (
	"bytes"
	"encoding/json"
	"math/big"
	"slices"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// keysOf returns the keys of the JSON object data in order.
func keysOf(t *testing.T, data []byte) []string {
	t.Helper()
	dec := json.NewDecoder(bytes.NewReader(data))
	if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
		t.Fatalf("not an object: %s", data)
	}
	var keys []string
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			t.Fatal(err)
		}
		var skip json.RawMessage
		if err := dec.Decode(&skip); err != nil {
			t.Fatal(err)
		}
		keys = append(keys, tok.(string))
	}
	return keys
}

// TestResultJSON checks the field names of the JSON form of a Result, which
// lctkit choose --json prints and scripts read. The names are written out
// here, not taken from the code.
func TestResultJSON(t *testing.T) {
	models := []Model{{Name: "none", Dim: 0}, {Name: "one", Dim: 3}}
	pairs := []Pair{
		{Model: 0, Truth: 0, Lambda: big.NewRat(0, 1), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 1, Lambda: big.NewRat(3, 2), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 0, Lambda: big.NewRat(1, 2), Theta: 2, Status: rlct.UpperBound,
			Estimate: &Value{Lambda: big.NewRat(1, 3), Theta: 1}, Source: "a bound <by hand>"},
	}
	c, err := New(models, [][2]int{{0, 1}}, pairs)
	if err != nil {
		t.Fatal(err)
	}
	r, err := c.Choose(100, []float64{-150, -140})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false) // as lctkit writes it
	if err := enc.Encode(r); err != nil {
		t.Fatal(err)
	}
	data := buf.Bytes()
	var got struct {
		Models      []json.RawMessage `json:"models"`
		Pairs       []json.RawMessage `json:"pairs"`
		Sensitivity []json.RawMessage `json:"sensitivity"`
	}
	if err := json.Unmarshal(data, &got); err != nil || len(got.Models) != 2 || len(got.Pairs) != 3 || len(got.Sensitivity) != 1 {
		t.Fatalf("%v: %s", err, data)
	}
	for _, tc := range []struct {
		what string
		data []byte
		want []string
	}{
		{"result", data, []string{"method", "n", "models", "chosen_bic", "chosen_sbic", "tie_tolerance", "pairs", "sensitivity", "all_regular", "all_estimates"}},
		{"model", got.Models[1], []string{"name", "dim", "prior", "loglik", "bic", "sbic", "weight_bic", "weight_sbic", "pairs_status", "rests_on"}},
		{"pair", got.Pairs[2], []string{"model", "truth", "lambda", "theta", "status", "note", "estimate", "source"}},
		{"sensitivity", got.Sensitivity[0], []string{"pair", "status", "affects", "regular", "estimate"}},
	} {
		if keys := keysOf(t, tc.data); !slices.Equal(keys, tc.want) {
			t.Errorf("%s keys %q, want %q", tc.what, keys, tc.want)
		}
	}
	// Exact values are strings; text is not HTML-escaped.
	if !bytes.Contains(got.Pairs[2], []byte(`"lambda":"1/2"`)) || !bytes.Contains(got.Pairs[2], []byte(`"source":"a bound <by hand>"`)) {
		t.Errorf("pair %s", got.Pairs[2])
	}
}
