package sbic

import (
	"context"
	"errors"
	"math"
	"math/big"
	"strings"
	"testing"
	"time"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// docTable is the text example of the Table documentation.
const docTable = `# three nested models
n 500
model small  dim 1  loglik -731.2
model middle dim 3  loglik -720.9
model large  dim 6  loglik -719.5  prior 0.5
order small <= middle <= large
pair small  small  regular status exact
pair middle middle regular status exact
pair large  large  regular status exact
pair middle small  sos "a*b; a*c"
pair large  small  lambda 3/2 theta 2 status upper-bound estimate 1 1
pair large  middle lambda 5/2 status exact source "worked by hand"
`

// docTableJSON is the same table in the JSON form.
const docTableJSON = `{"n": 500,
 "models": [{"name": "small", "dim": 1, "loglik": -731.2},
            {"name": "middle", "dim": 3, "loglik": -720.9},
            {"name": "large", "dim": 6, "loglik": -719.5, "prior": 0.5}],
 "order": [["small", "middle", "large"]],
 "pairs": [{"model": "small", "truth": "small", "regular": true, "status": "exact"},
           {"model": "middle", "truth": "middle", "regular": true, "status": "exact"},
           {"model": "large", "truth": "large", "regular": true, "status": "exact"},
           {"model": "middle", "truth": "small", "sos": ["a*b", "a*c"]},
           {"model": "large", "truth": "small", "lambda": "3/2", "theta": 2, "status": "upper-bound", "estimate": {"lambda": 1, "theta": 1}},
           {"model": "large", "truth": "middle", "lambda": 2.5, "status": "exact", "source": "worked by hand"}]}`

// TestReadTable reads the documented example in both forms and checks
// every field, and the pair lctkit computes: K = a²b² + a²c² = a²(b² + c²)
// has λ = min(1/2, 2/2) = 1/2, θ = 1, exact (normal crossings, Watanabe
// 2009, ch. 2; worked by hand).
func TestReadTable(t *testing.T) {
	for _, src := range []string{docTable, docTableJSON} {
		tab, err := ReadTable([]byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if tab.N != 500 || len(tab.Models) != 3 || len(tab.Order) != 2 || len(tab.Pairs) != 6 {
			t.Fatalf("read %+v", tab)
		}
		if m := tab.Models[2]; m.Name != "large" || m.Dim != 6 || m.LogLik != -719.5 || m.Prior != 0.5 {
			t.Errorf("model %+v", m)
		}
		if o := tab.Order[1]; o.Smaller != "middle" || o.Larger != "large" {
			t.Errorf("order %+v", tab.Order)
		}
		c, ll, computed, err := tab.Candidates(context.Background(), nil)
		if err != nil {
			t.Fatal(err)
		}
		if ll[0] != -731.2 || ll[1] != -720.9 || ll[2] != -719.5 {
			t.Errorf("log-likelihoods %v", ll)
		}
		if len(computed) != 1 || computed[0].Pair != 3 {
			t.Fatalf("computed %+v", computed)
		}
		ps := c.Pairs()
		want := []struct {
			lambda string
			theta  int
			status rlct.Status
		}{
			{"1/2", 1, rlct.Exact}, {"3/2", 1, rlct.Exact}, {"3", 1, rlct.Exact},
			{"1/2", 1, rlct.Exact}, // computed
			{"3/2", 2, rlct.UpperBound}, {"5/2", 1, rlct.Exact},
		}
		for i, w := range want {
			if ps[i].Lambda.RatString() != w.lambda || ps[i].Theta != w.theta || ps[i].Status != w.status {
				t.Errorf("pair %d: (%s, %d, %s), want (%s, %d, %s)", i, ps[i].Lambda.RatString(), ps[i].Theta, ps[i].Status, w.lambda, w.theta, w.status)
			}
		}
		if e := ps[4].Estimate; e == nil || e.Lambda.Cmp(big.NewRat(1, 1)) != 0 || e.Theta != 1 {
			t.Errorf("estimate %+v", e)
		}
		if ps[5].Source != "worked by hand" || !strings.Contains(ps[3].Source, "computed by lctkit") {
			t.Errorf("sources %q, %q", ps[5].Source, ps[3].Source)
		}
		if c.Model(2).Prior != 0.5 || c.Model(0).Prior != 0 {
			t.Errorf("priors %v %v", c.Model(0).Prior, c.Model(2).Prior)
		}
		if _, err := c.Choose(tab.N, ll); err != nil {
			t.Fatal(err)
		}
	}
}

// TestReadTableErrors: malformed tables are input errors that say where
// and what.
func TestReadTableErrors(t *testing.T) {
	base := "n 10\nmodel a dim 1 loglik -3\nmodel b dim 2 loglik -2\norder a <= b\n"
	pairs := "pair a a regular status exact\npair b b regular status exact\n"
	tests := []struct {
		name, src string
		want      []string
	}{
		{"unknown statement", "models a dim 1", []string{"line 1, column 1", `unknown statement "models"`}},
		{"no model", "n 10\n# nothing\n", []string{"declares no model"}},
		{"bad n", "n ten\nmodel a dim 1 loglik 0", []string{"line 1, column 3", `"ten" is not a finite number`}},
		{"n twice", "n 10\nn 20\nmodel a dim 1 loglik 0", []string{"line 2", "given twice"}},
		{"missing loglik", "model a dim 1", []string{`model "a": loglik is missing`}},
		{"bad dim", "model a dim -1 loglik 0", []string{"dim -1 is negative"}},
		{"bad prior", "model a dim 1 loglik 0 prior 0", []string{"prior weight 0 must be positive"}},
		{"bad name", "model a/b dim 1 loglik 0", []string{`"a/b" is not a model name`}},
		{"unknown model field", "model a dim 1 loglik 0 weight 2", []string{`unknown field "weight"`}},
		{"field twice", "model a dim 1 dim 2 loglik 0", []string{"dim is given twice"}},
		{"order without <=", "model a dim 1 loglik 0\norder a < b", []string{"line 2, column 9", `expected <= between model names, found "<"`}},
		{"order of one", "model a dim 1 loglik 0\norder a", []string{"at least two models"}},
		{"open string", base + `pair b a k "x^2`, []string{"line 5, column 12", "not closed"}},
		{"pair without value", base + "pair b a status exact", []string{`pair "b" at "a"`, "give the value"}},
		{"pair without status", base + "pair b a lambda 1/2", []string{"line 5", "status is missing"}},
		{"pair two ways", base + `pair b a lambda 1/2 status exact k "x^2"`, []string{"only one of"}},
		{"status with k", base + `pair b a k "x^2" status exact`, []string{"come from lctkit"}},
		{"prior without k", base + `pair b a lambda 1 status exact prior "x=1"`, []string{"go with k or sos"}},
		{"bad status", base + "pair b a lambda 1 status sure", []string{`unknown status "sure"`}},
		{"bad lambda", base + "pair b a lambda one status exact", []string{`"one" is not an exact number`}},
		{"negative lambda", base + "pair b a lambda -1 status exact", []string{"λ = -1 is negative"}},
		{"bad estimate", base + "pair b a lambda 1 status upper-bound estimate 1/2", []string{"expected the estimate's θ"}},
		{"regular with theta", base + "pair b a regular theta 2 status exact", []string{"regular means θ = 1"}},
		{"unquoted k", base + "pair b a k x^2", []string{`expected the expression K in double quotes, found "x^2"`}},
		{"trailing token", base + pairs + "pair b a lambda 1 status exact source \"x\" \"y\"", []string{"line 7, column 43", "found a quoted string"}},
		{"json unknown field", `{"models": [{"name": "a", "dim": 1, "loglik": 0, "weight": 2}]}`, []string{`unknown field "weight"`}},
		{"json duplicate key", `{"models": [{"name": "a", "dim": 1, "dim": 2, "loglik": 0}]}`, []string{`models[0]: key "dim" appears twice`}},
		{"json wrong type", `{"models": [{"name": "a", "dim": "one", "loglik": 0}]}`, []string{"models.dim", "want int"}},
		{"json no models", `{"n": 3}`, []string{`"models" is missing`}},
		{"json missing dim", `{"models": [{"name": "a", "loglik": 0}]}`, []string{`models[0] ("a"): dim is missing`}},
		{"json trailing", `{"models": [{"name": "a", "dim": 1, "loglik": 0}]} {}`, []string{"more data"}},
		{"json chain of one", `{"models": [{"name": "a", "dim": 1, "loglik": 0}], "order": [["a"]]}`, []string{"order[0]"}},
		{"json pair without names", `{"models": [{"name": "a", "dim": 1, "loglik": 0}], "pairs": [{"lambda": 1}]}`, []string{`pairs[0]: "model" and "truth" are required`}},
		{"json bad lambda", `{"models": [{"name": "a", "dim": 1, "loglik": 0}], "pairs": [{"model": "a", "truth": "a", "lambda": true, "status": "exact"}]}`, []string{"pairs[0]", "lambda: want an exact number"}},
		{"json regular false", `{"models": [{"name": "a", "dim": 1, "loglik": 0}], "pairs": [{"model": "a", "truth": "a", "regular": false, "status": "exact"}]}`, []string{"regular: write true"}},
		{"json estimate half", `{"models": [{"name": "a", "dim": 1, "loglik": 0}], "pairs": [{"model": "a", "truth": "a", "lambda": 1, "status": "exact", "estimate": {"lambda": 1}}]}`, []string{`estimate: give both`}},
		{"not utf-8", "model \xff dim 1 loglik 0", []string{"not valid UTF-8"}},
	}
	for _, tt := range tests {
		_, err := ReadTable([]byte(tt.src))
		if err == nil {
			t.Errorf("%s: no error", tt.name)
			continue
		}
		if !errors.Is(err, ErrInput) || !errors.Is(err, rlct.ErrInput) {
			t.Errorf("%s: %v is not an input error", tt.name, err)
		}
		for _, w := range tt.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q does not say %q", tt.name, err, w)
			}
		}
	}
}

// TestTableCandidatesErrors: errors found when the table is resolved name
// the place and the models, a cycle names its models, a missing pair names
// the pair, and an expression error keeps its position.
func TestTableCandidatesErrors(t *testing.T) {
	base := "n 10\nmodel a dim 1 loglik -3\nmodel b dim 2 loglik -2\n"
	tests := []struct {
		name, src string
		sentinel  error
		want      []string
	}{
		{"unknown in order", base + "order a <= c", ErrInput, []string{"line 4", `model "c" is not a declared model`}},
		{"unknown in pair", base + "pair c a lambda 1 status exact", ErrInput, []string{"line 4", `pair: model "c"`}},
		{"declared twice", base + "model a dim 3 loglik 0", ErrInput, []string{"line 4", `model "a" is declared again (first at line 2)`}},
		{"cycle", base + "order a <= b <= a\npair a a regular status exact\npair b b regular status exact", ErrCycle, []string{`"a" ⪯ "b" ⪯ "a"`}},
		{"missing pair", base + "order a <= b\npair a a regular status exact\npair b b regular status exact", ErrMissingPair, []string{`no pair for model "b" at a truth in "a"`}},
		{"pair not ordered", base + "pair a a regular status exact\npair b b regular status exact\npair b a lambda 1 status exact", ErrInput, []string{`"a" ⪯ "b" is not in the order`}},
		{"bad expression", base + "order a <= b\npair a a regular status exact\npair b b regular status exact\npair b a k \"x^2 +\"", ErrInput, []string{"line 7", `pair "b" at "a"`, "k: 1:"}},
		{"K not vanishing", base + "order a <= b\npair a a regular status exact\npair b b regular status exact\npair b a k \"1 + x^2\"", ErrInput, []string{"line 7", "does not vanish"}},
	}
	for _, tt := range tests {
		tab, err := ReadTable([]byte(tt.src))
		if err != nil {
			t.Errorf("%s: read: %v", tt.name, err)
			continue
		}
		_, _, _, err = tab.Candidates(context.Background(), nil)
		if err == nil {
			t.Errorf("%s: no error", tt.name)
			continue
		}
		if !errors.Is(err, tt.sentinel) || !errors.Is(err, rlct.ErrInput) {
			t.Errorf("%s: %v does not match %v and rlct.ErrInput", tt.name, err, tt.sentinel)
		}
		for _, w := range tt.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q does not say %q", tt.name, err, w)
			}
		}
	}
	// The position inside the expression survives for a caret.
	tab, _ := ReadTable([]byte(base + "order a <= b\npair b a k \"x^2 + * y\""))
	_, _, _, err := tab.Candidates(context.Background(), nil)
	var se *rlct.SpecError
	if !errors.As(err, &se) || se.Src != "x^2 + * y" {
		t.Errorf("error %v does not carry the expression's SpecError", err)
	}
}

// TestTableExtreme: a table at n = 10^9 with log-likelihoods of magnitude
// 10^7 reads and scores without overflow, and the text and JSON forms give
// the same numbers.
func TestTableExtreme(t *testing.T) {
	text := `n 1e9
model m0 dim 0 loglik -12345678.25
model m1 dim 7 loglik -12345601.5
order m0 <= m1
pair m0 m0 lambda 0 status exact
pair m1 m1 regular status exact
pair m1 m0 lambda 3/2 status exact`
	js := `{"n": 1e9, "models": [{"name": "m0", "dim": 0, "loglik": -12345678.25}, {"name": "m1", "dim": 7, "loglik": -12345601.5}],
	"order": [["m0", "m1"]], "pairs": [{"model": "m0", "truth": "m0", "lambda": 0, "status": "exact"},
	{"model": "m1", "truth": "m1", "regular": true, "status": "exact"}, {"model": "m1", "truth": "m0", "lambda": "3/2", "status": "exact"}]}`
	var got [][]float64
	for _, src := range []string{text, js} {
		tab, err := ReadTable([]byte(src))
		if err != nil {
			t.Fatal(err)
		}
		c, ll, _, err := tab.Candidates(context.Background(), nil)
		if err != nil {
			t.Fatal(err)
		}
		s, err := c.Scores(tab.N, ll)
		if err != nil {
			t.Fatal(err)
		}
		for _, x := range s {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				t.Fatalf("score %v", s)
			}
		}
		got = append(got, s)
	}
	if got[0][0] != got[1][0] || got[0][1] != got[1][1] {
		t.Errorf("text %v and JSON %v differ", got[0], got[1])
	}
	// m0 is minimal: sBIC = ℓ_0 exactly (λ = 0).
	if got[0][0] != -12345678.25 {
		t.Errorf("sBIC(m0) = %.17g, want ℓ_0 = -12345678.25", got[0][0])
	}
}

// FuzzReadTable: no table makes the reader or the resolution panic, and
// an error is always an input error (or a cancelled bound, which cannot
// happen here).
func FuzzReadTable(f *testing.F) {
	f.Add(docTable)
	f.Add(docTableJSON)
	f.Add("n 1e9\nmodel a dim 0 loglik -1e7\npair a a lambda 0 status exact")
	f.Add(`{"models": [{"name": "a", "dim": 1, "loglik": 0}], "pairs": [{"model": "a", "truth": "a", "k": "x^2"}]}`)
	f.Add("model a dim 1 loglik 0\norder a <= a\npair a a k \"x^2\" at \"x=0\" at \"x=1\"")
	f.Fuzz(func(t *testing.T, src string) {
		tab, err := ReadTable([]byte(src))
		if err != nil {
			if !errors.Is(err, ErrInput) {
				t.Fatalf("not an input error: %v", err)
			}
			return
		}
		// Keep the bounds quick: small expansions, few faces, little time.
		for _, p := range tab.Pairs {
			if p.Spec != nil {
				if len(p.Spec.K)+len(strings.Join(p.Spec.SOS, "")) > 200 || p.Spec.Order > 12 {
					return
				}
				p.Spec.Limits = monomial.Limits{MaxTerms: 2000}
			}
		}
		ctx, cancel := context.WithTimeout(context.Background(), time.Second)
		defer cancel()
		c, ll, _, err := tab.Candidates(ctx, &rlct.Options{MaxFaces: 200})
		if err != nil {
			return
		}
		n := tab.N
		if n == 0 {
			n = 100
		}
		_, _ = c.Choose(n, ll)
	})
}

// A pair named by a model description is bounded from the Problem the
// caller builds; without one it is an error that says so.
func TestTableDescriptionPair(t *testing.T) {
	src := `{"n": 50, "models": [{"name": "a", "dim": 0, "loglik": -10}, {"name": "b", "dim": 2, "loglik": -8}],
	"order": [["a", "b"]],
	"pairs": [{"model": "a", "truth": "a", "lambda": "0", "status": "exact"},
	          {"model": "b", "truth": "b", "regular": true, "status": "exact"},
	          {"model": "b", "truth": "a", "description": "b.txt"}]}`
	tab, err := ReadTable([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if tab.Pairs[2].Description != "b.txt" {
		t.Fatalf("description %q", tab.Pairs[2].Description)
	}
	if _, _, _, err := tab.Candidates(context.Background(), nil); err == nil || !strings.Contains(err.Error(), "was not built") {
		t.Errorf("unbuilt description: %v", err)
	}
	// K = (x·y)² as the caller's problem: λ = 1/2, θ = 2 (normal crossings,
	// common practice).
	ex, err := monomial.Parse("x*y", monomial.Config{})
	if err != nil {
		t.Fatal(err)
	}
	tab.Pairs[2].Problem = &rlct.Problem{Generators: []*monomial.Poly{ex.Poly}}
	c, _, computed, err := tab.Candidates(context.Background(), nil)
	if err != nil {
		t.Fatal(err)
	}
	p := c.Pairs()[2]
	if p.Lambda.Cmp(big.NewRat(1, 2)) != 0 || p.Theta != 2 || p.Status != rlct.Exact || len(computed) != 1 || !strings.Contains(p.Source, "b.txt") {
		t.Errorf("pair %+v, computed %d", p, len(computed))
	}
}
