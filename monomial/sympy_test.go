package monomial

import (
	"encoding/json"
	"math/big"
	"os/exec"
	"strings"
	"testing"
)

// sympyScript reads a JSON list of jobs {src, vars, at, n} and writes, for
// each, the Taylor polynomial of src around the point at (variable ->
// rational string; absent means 0) to total degree n in the offsets, as a
// list of [exponents, "p/q"] pairs. It substitutes x -> x0 + t·x for every
// variable and expands in the single variable t, which gives the
// homogeneous parts by total degree (common practice).
const sympyScript = `
import json, sys
import sympy as sp
jobs = json.load(sys.stdin)
out = []
t = sp.Symbol('t')
for job in jobs:
    vs = [sp.Symbol(name) for name in job['vars']]
    loc = {v.name: v for v in vs}
    loc.update({'exp': sp.exp, 'log': sp.log, 'sin': sp.sin, 'cos': sp.cos, 'tanh': sp.tanh,
                'sinh': sp.sinh, 'cosh': sp.cosh, 'atan': sp.atan, 'sqrt': sp.sqrt})
    e = sp.sympify(job['src'].replace('^', '**'), locals=loc, rational=True)
    sub = {v: sp.Rational((job['at'] or {}).get(v.name, '0')) + t*v for v in vs}
    e = e.subs(sub, simultaneous=True)
    s = sp.series(e, t, 0, job['n'] + 1).removeO()
    p = sp.Poly(sp.expand(s.subs(t, 1)), *vs)
    terms = []
    for mon, c in p.terms():
        c = sp.nsimplify(c)
        if not c.is_Rational:
            raise SystemExit('irrational coefficient %s in %s' % (c, job['src']))
        terms.append([list(mon), str(c)])
    out.append(terms)
json.dump(out, sys.stdout)
`

type sympyJob struct {
	Src  string            `json:"src"`
	Vars []string          `json:"vars"`
	At   map[string]string `json:"at"`
	N    int               `json:"n"`
}

// sympyTaylor runs sympyScript on the jobs, or skips the test when python3
// or sympy is absent.
func sympyTaylor(t *testing.T, jobs []sympyJob) []*Poly {
	t.Helper()
	if _, err := exec.LookPath("python3"); err != nil {
		t.Skip("python3 not found")
	}
	if err := exec.Command("python3", "-c", "import sympy").Run(); err != nil {
		t.Skip("sympy not available")
	}
	in, err := json.Marshal(jobs)
	if err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command("python3", "-c", sympyScript)
	cmd.Stdin = strings.NewReader(string(in))
	var stderr strings.Builder
	cmd.Stderr = &stderr
	outb, err := cmd.Output()
	if err != nil {
		t.Fatalf("sympy: %v\n%s", err, stderr.String())
	}
	var out [][]struct {
		Exp  []int
		Coef string
	}
	var raw [][][2]json.RawMessage
	if err := json.Unmarshal(outb, &raw); err != nil {
		t.Fatalf("sympy output: %v", err)
	}
	for _, terms := range raw {
		var list []struct {
			Exp  []int
			Coef string
		}
		for _, pair := range terms {
			var term struct {
				Exp  []int
				Coef string
			}
			if err := json.Unmarshal(pair[0], &term.Exp); err != nil {
				t.Fatal(err)
			}
			if err := json.Unmarshal(pair[1], &term.Coef); err != nil {
				t.Fatal(err)
			}
			list = append(list, term)
		}
		out = append(out, list)
	}
	polys := make([]*Poly, len(out))
	for i, terms := range out {
		var exps []Exponent
		var coefs []*big.Rat
		for _, term := range terms {
			c, ok := new(big.Rat).SetString(term.Coef)
			if !ok {
				t.Fatalf("sympy coefficient %q", term.Coef)
			}
			exps = append(exps, term.Exp)
			coefs = append(coefs, c)
		}
		p, err := FromTerms(jobs[i].Vars, exps, coefs)
		if err != nil {
			t.Fatal(err)
		}
		polys[i] = p
	}
	return polys
}

// TestRemainderSympy compares expansions and remainders with Taylor
// polynomials computed independently by sympy to a total degree n above
// the order: the terms of degree <= Order agree, every term of the
// difference up to degree n lies in the ideal of the remainder (soundness),
// and, for the examples of the issue, every generator of degree <= n is
// a term of the difference (tightness).
func TestRemainderSympy(t *testing.T) {
	if testing.Short() {
		t.Skip("sympy takes seconds")
	}
	type tc struct {
		src   string
		vars  []string
		at    map[string]string
		order int
		n     int
		tight bool
	}
	cases := []tc{
		{"tanh(b)", []string{"b"}, nil, 4, 9, true},
		{"a*tanh(b)", []string{"a", "b"}, nil, 4, 9, true},
		{"tanh(b)^2", []string{"b"}, nil, 4, 9, true},
		{"x^2*(1 - cos(y))", []string{"x", "y"}, nil, 4, 9, true},
		{"tanh(x*y + z)", []string{"x", "y", "z"}, nil, 3, 7, true},
		{"exp(sin(x) + y^2)", []string{"x", "y"}, nil, 3, 7, false},
		{"log(1 + x*y + z^2)/(1 + x)", []string{"x", "y", "z"}, nil, 4, 7, false},
		{"atan(x*tanh(y))*sqrt(4 + x)", []string{"x", "y"}, nil, 4, 8, false},
		{"(1 + x*y)^(-1/3) - cosh(x + y^3)", []string{"x", "y"}, nil, 3, 8, false},
		{"sinh(x)*cos(y) + y^9", []string{"x", "y"}, nil, 4, 10, false},
		// Around a point.
		{"exp(x - 1/2)*log(y)", []string{"x", "y"}, map[string]string{"x": "1/2", "y": "1"}, 3, 7, false},
		{"sqrt(x)*tanh(y - 2)", []string{"x", "y"}, map[string]string{"x": "4", "y": "2"}, 3, 7, false},
		{"(x + 5)^(1/2) + 1/(x*y)", []string{"x", "y"}, map[string]string{"x": "4", "y": "-1/3"}, 3, 6, false},
		{"atan(x*y - 2)", []string{"x", "y"}, map[string]string{"x": "2", "y": "1"}, 4, 8, false},
	}
	var jobs []sympyJob
	for _, c := range cases {
		jobs = append(jobs, sympyJob{c.src, c.vars, c.at, c.n})
	}
	truths := sympyTaylor(t, jobs)
	for i, c := range cases {
		var at map[string]*big.Rat
		if c.at != nil {
			at = map[string]*big.Rat{}
			for k, v := range c.at {
				at[k] = rat(v)
			}
		}
		e, err := Parse(c.src, Config{Vars: c.vars, Order: c.order, At: at})
		if err != nil {
			t.Errorf("%q: %v", c.src, err)
			continue
		}
		checkRemainderShape(t, c.src, e)
		truth := truths[i]
		if !e.Poly.Truncate(c.order).Equal(truth.Truncate(c.order)) {
			t.Errorf("%q order %d at %v: %v, sympy %v", c.src, c.order, c.at, e.Poly.Truncate(c.order), truth.Truncate(c.order))
		}
		diff := truth.Sub(e.Poly.Truncate(c.n))
		for ex := range diff.All() {
			if !inIdeal(ex, e.Remainder) {
				t.Errorf("%q order %d at %v: the term x^%v of the value minus Poly is outside the remainder %s", c.src, c.order, c.at, ex, remString(c.vars, e.Remainder))
			}
		}
		if c.tight {
			for _, g := range e.Remainder {
				if g.Degree() <= c.n && diff.Coefficient(g).Sign() == 0 {
					t.Errorf("%q order %d: generator %s is not a term of the value minus Poly", c.src, c.order, monomialString(c.vars, g))
				}
			}
		}
	}
}
