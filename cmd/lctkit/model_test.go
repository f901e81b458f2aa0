package main

import (
	"context"
	"encoding/json"
	"os"
	"reflect"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct/model"
)

// oneUnit is a tanh regression with one unit on a design: exact (1/2, 2),
// derived in rlct/model's TestTanhOneUnit.
const oneUnit = `model one unit
kind regression
param a, b
input x ~ design { -1: 1/4, 1/2: 1/4, 2: 1/2 }
noise 1
mean a*tanh(b*x)
order 4
`

// coin is a discrete model: K = 9/4·a²b², exact (1/2, 2) (normal crossings).
const coin = "model coin\nkind discrete\nparam a, b\ncategory h = 1/3 + a*b\ncategory t = 2/3 - a*b\n"

func TestModelCommand(t *testing.T) {
	cases := []struct {
		name   string
		stdin  string
		args   []string
		code   int
		stdout []string // substrings
		stderr []string
	}{
		{"a series on a design", oneUnit, []string{"model", "-"}, exitOK,
			[]string{"model: one unit (regression)", "1/4*(-8/3*a*b^3 + 2*a*b)^2   [output 1 at x = 2]", "every omitted term is a multiple of a*b^5", "λ = 1/2   θ = 2   (exact)"}, nil},
		{"bound --model", oneUnit, []string{"bound", "--model", "-"}, exitOK,
			[]string{"model: one unit (regression)", "λ = 1/2   θ = 2   (exact)"}, nil},
		{"a penalty", coin, []string{"model", "-", "--n", "1000"}, exitOK,
			[]string{"K = Σ c·g² over 2 generators in (a, b):", "λ = 1/2   θ = 2   (exact)", "penalty"}, nil},
		{"an order from the flag", strings.Replace(oneUnit, "order 4\n", "", 1), []string{"model", "-", "--order", "3"}, exitOK,
			[]string{"λ = 1/2   θ = 2   (exact)"}, nil},
		{"a truth away from 0", "kind regression\nparam a, b\ninput x ~ design { 1: 1 }\nnoise 1\nmean a*tanh(b*x)\ntruth a = 2\norder 3\n", []string{"model", "-"}, exitOK,
			[]string{"a series in the offsets w − w* from the truth a=2,b=0"}, nil},
		{"an unknown name", "kind regression\nparam a\nnoise 1\nmean q\n", []string{"model", "-"}, exitFailed,
			nil, []string{"lctkit: <stdin>:4:6: unknown name q", "  mean q\n       ^"}},
		{"several syntax errors", "kind regression\nparam a,\nnoise x\n", []string{"model", "-"}, exitFailed,
			nil, []string{"<stdin>:2:9: expected a name", "<stdin>:3:7: expected a number"}},
		{"an order is needed", strings.Replace(oneUnit, "order 4\n", "", 1), []string{"model", "-"}, exitFailed,
			nil, []string{"<stdin>:6:8:", "(add an order statement (order D) to the description, or give --order D)"}},
		{"a parameter that does not enter", "kind regression\nparam a, c\ninput x ~ normal\nnoise 1\nmean a*x\n", []string{"model", "-"}, exitFailed,
			nil, []string{"<stdin>:2:10: the parameter c does not enter the model"}},
		{"an error in JSON", "kind regression\nparam a\nnoise 1\nmean q\n", []string{"model", "-", "--json"}, exitFailed,
			[]string{`{"error":"4:6: unknown name q (declare it with param or input)"}`}, nil},
		{"a missing file", "", []string{"model", "no-such-file.txt"}, exitFailed, nil, []string{"no-such-file.txt"}},
		{"--model with --prior", oneUnit, []string{"bound", "--model", "-", "--prior", "a=1"}, exitUsage,
			nil, []string{"--model takes the prior, the truth and K from the description"}},
		{"a negative order", oneUnit, []string{"model", "-", "--order", "-1"}, exitUsage, nil, []string{"--order must not be negative"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			out, errOut, code := runCLI(t, c.stdin, c.args...)
			if code != c.code {
				t.Fatalf("exit %d, want %d\nstdout:\n%s\nstderr:\n%s", code, c.code, out, errOut)
			}
			for _, s := range c.stdout {
				if !strings.Contains(out, s) {
					t.Errorf("stdout lacks %q:\n%s", s, out)
				}
			}
			for _, s := range c.stderr {
				if !strings.Contains(errOut, s) {
					t.Errorf("stderr lacks %q:\n%s", s, errOut)
				}
			}
		})
	}
}

// TestModelRoundTrip checks that a description gives the same report
// through the CLI (model and bound --model, --json) as through the library
// (Parse, Build, Bound and the two reports side by side).
func TestModelRoundTrip(t *testing.T) {
	srcs := []string{oneUnit, coin,
		"kind regression\nparam B[2,1], A[1,2]\ninput x[2] ~ normal\nnoise 1/2\nmean B*A*x\ntruth B = [1; 0], A = [1, 0]\n",
		"kind mixture\nparam a, s, d\ncomponent poisson(3 + s + (1 - a)*d) weight a\ncomponent poisson(3 + s - a*d) weight 1 - a\ntruth a = 1/2\norder 4\n",
	}
	for _, src := range srcs {
		d, err := model.Parse(src)
		if err != nil {
			t.Fatal(err)
		}
		m, err := model.Build(context.Background(), d, nil)
		if err != nil {
			t.Fatal(err)
		}
		r, err := m.Bound(context.Background(), nil)
		if err != nil {
			t.Fatal(err)
		}
		lib, err := encodeJSON(&modelAnswer{model: m, bound: &boundAnswer{Result: r}})
		if err != nil {
			t.Fatal(err)
		}
		var want map[string]any
		if err := json.Unmarshal(lib, &want); err != nil {
			t.Fatal(err)
		}
		for _, args := range [][]string{{"model", "-", "--json"}, {"bound", "--model", "-", "--json"}} {
			out, errOut, code := runCLI(t, src, args...)
			if code != exitOK {
				t.Fatalf("%v: exit %d: %s", args, code, errOut)
			}
			var got map[string]any
			if err := json.Unmarshal([]byte(out), &got); err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(got, want) {
				t.Errorf("%v on %q:\nCLI     %s\nlibrary %s", args, d.Name(), out, lib)
			}
			if got["model"] != d.Name() && d.Name() != "" {
				t.Errorf("the JSON names the model %v, want %q", got["model"], d.Name())
			}
		}
	}
}

// TestModelAgainstReadyMadeK checks that the generators lctkit model prints
// give the same answer as the model when bounded as a ready-made sum of
// squares (the weights change neither λ nor θ; rlct.Problem.GeneratorWeights).
func TestModelAgainstReadyMadeK(t *testing.T) {
	for _, src := range []string{oneUnit, coin} {
		out, _, code := runCLI(t, src, "model", "-", "--json")
		if code != exitOK {
			t.Fatal(out)
		}
		var rep struct {
			Generators []string `json:"generators"`
			Order      int      `json:"order"`
			Lambda     string   `json:"lambda"`
			Theta      int      `json:"theta"`
			Status     string   `json:"status"`
		}
		if err := json.Unmarshal([]byte(out), &rep); err != nil {
			t.Fatal(err)
		}
		// The ready-made polynomials lose the remainder, so only the value
		// is compared; the status of a cut series may differ.
		args := []string{"bound", "--sos", strings.Join(rep.Generators, "; "), "--json"}
		out2, errOut, code := runCLI(t, "", args...)
		if code != exitOK {
			t.Fatalf("%v: %s", args, errOut)
		}
		var rep2 struct {
			Lambda string `json:"lambda"`
			Theta  int    `json:"theta"`
		}
		if err := json.Unmarshal([]byte(out2), &rep2); err != nil {
			t.Fatal(err)
		}
		if rep2.Lambda != rep.Lambda || rep2.Theta != rep.Theta {
			t.Errorf("model gives (%s, %d), the same generators as --sos (%s, %d)", rep.Lambda, rep.Theta, rep2.Lambda, rep2.Theta)
		}
	}
}

// TestBatchModelRecords runs model descriptions through batch: the answer
// carries the model's name and the library's value, and a bad description
// gives an error record with its position.
func TestBatchModelRecords(t *testing.T) {
	lines := []string{
		`{"id": 1, "model": ` + jsonString(oneUnit) + `}`,
		`{"id": 2, "model": ["model coin", "kind discrete", "param a, b", "category h = 1/3 + a*b", "category t = 2/3 - a*b"]}`,
		`{"id": 3, "model": ["kind regression", "param a", "noise 1", "mean q"]}`,
		`{"id": 4, "model": ` + jsonString(strings.Replace(oneUnit, "order 4\n", "", 1)) + `, "order": 3}`,
		`{"id": 5, "k": "x^4 + y^6"}`,
	}
	out, _, code := runCLI(t, strings.Join(lines, "\n")+"\n", "batch", "--brief", "-")
	if code != exitRecords {
		t.Fatalf("exit %d, want %d (one record fails)\n%s", code, exitRecords, out)
	}
	var recs []map[string]any
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		var r map[string]any
		if err := json.Unmarshal([]byte(l), &r); err != nil {
			t.Fatal(err)
		}
		recs = append(recs, r)
	}
	want := []struct {
		model, lambda, err string
	}{
		{"one unit", "1/2", ""}, {"coin", "1/2", ""}, {"", "", "model: 4:6: unknown name q (declare it with param or input)"}, {"one unit", "1/2", ""}, {"", "5/12", ""},
	}
	for i, w := range want {
		r := recs[i]
		if w.err != "" {
			if r["error"] != w.err {
				t.Errorf("record %d: error %v, want %q", i+1, r["error"], w.err)
			}
			continue
		}
		if (r["model"] != nil || w.model != "") && r["model"] != w.model || r["lambda"] != w.lambda || r["status"] != "exact" {
			t.Errorf("record %d: %v, want model %q, λ %s, exact", i+1, r, w.model, w.lambda)
		}
	}
}

// jsonString encodes s as a JSON string.
func jsonString(s string) string {
	b, _ := json.Marshal(s)
	return string(b)
}

// TestModelReadme runs the description shown in the README's section on
// model and checks that every output line the README quotes is printed, so
// that the README stays true.
func TestModelReadme(t *testing.T) {
	raw, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(raw)
	start := strings.Index(text, "### From a model to K: `model`")
	if start < 0 {
		t.Fatal("the README has no section on model")
	}
	section := text[start:]
	section = section[:strings.Index(section, "\nA description declares")]
	var desc, quoted []string
	inOutput := false
	for _, l := range strings.Split(section, "\n") {
		switch {
		case strings.HasPrefix(l, "    $ lctkit model"):
			inOutput = true
		case !strings.HasPrefix(l, "    "):
			continue
		case inOutput:
			if q := strings.TrimPrefix(l, "    "); strings.TrimSpace(q) != "…" {
				quoted = append(quoted, q)
			}
		default:
			desc = append(desc, strings.TrimPrefix(l, "    "))
		}
	}
	if len(desc) == 0 || len(quoted) == 0 {
		t.Fatal("the README's section on model has no description or no output")
	}
	out, errOut, code := runCLI(t, strings.Join(desc, "\n")+"\n", "model", "-")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, q := range quoted {
		if !strings.Contains(out, q+"\n") {
			t.Errorf("the README quotes %q, which the command does not print:\n%s", q, out)
		}
	}
}
