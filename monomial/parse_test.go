package monomial

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"
)

var validCases = []struct {
	src   string
	vars  []string // Config.Vars
	order int
	want  string   // String() of the result
	vs    []string // expected variable list
}{
	{"3*x^2*y - z/2 + 4", nil, 0, "3*x^2*y - 1/2*z + 4", []string{"x", "y", "z"}},
	{"(x+y)^2", nil, 0, "x^2 + 2*x*y + y^2", []string{"x", "y"}},
	{"(x+y)**2", nil, 0, "x^2 + 2*x*y + y^2", []string{"x", "y"}},
	{"-x^2", nil, 0, "-x^2", []string{"x"}},
	{"(-x)^2", nil, 0, "x^2", []string{"x"}},
	{"x^2^3", nil, 0, "x^8", []string{"x"}},   // right-associative
	{"x**2**3", nil, 0, "x^8", []string{"x"}}, // right-associative
	{"2^-2", nil, 0, "1/4", nil},
	{"2*-3", nil, 0, "-6", nil},
	{"--x", nil, 0, "x", []string{"x"}},
	{"+x", nil, 0, "x", []string{"x"}},
	{"x - y - z", nil, 0, "x - y - z", []string{"x", "y", "z"}}, // left-associative
	{"x/2/3", nil, 0, "1/6*x", []string{"x"}},
	{"1/2*x", nil, 0, "1/2*x", []string{"x"}},
	{"0.25", nil, 0, "1/4", nil},
	{".5 + 1.", nil, 0, "3/2", nil},
	{"1e-3", nil, 0, "1/1000", nil},
	{"2.5e2", nil, 0, "250", nil},
	{"2.5E+2", nil, 0, "250", nil},
	{"123456789012345678901234567890*x", nil, 0, "123456789012345678901234567890*x", []string{"x"}},
	{"4^(1/2)", nil, 0, "2", nil},
	{"(-8)^(1/3)", nil, 0, "-2", nil},
	{"(27/8)^(-2/3)", nil, 0, "4/9", nil},
	{"x^0", nil, 0, "1", []string{"x"}},
	{"0^0", nil, 0, "1", nil},
	{"(x)^(4/2)", nil, 0, "x^2", []string{"x"}},
	// Variables come in the order of their first appearance.
	{"w10 + w2 + w1 + b_3 + x", nil, 0, "w10 + w2 + w1 + b_3 + x", []string{"w10", "w2", "w1", "b_3", "x"}},
	{"y^2 + x^4", nil, 0, "x^4 + y^2", []string{"y", "x"}},
	{"b*a + exp(c) - exp(c)", nil, 2, "b*a", []string{"b", "a", "c"}},
	{"z*y*x", []string{"x"}, 0, "x*z*y", []string{"x", "z", "y"}},
	{"a + b", []string{"b", "c"}, 0, "b + a", []string{"b", "c", "a"}},
	{"x # a comment\n + y", nil, 0, "x + y", []string{"x", "y"}},
	{"x\n+\ny", nil, 0, "x + y", []string{"x", "y"}},
	{"(1+x)^(1/2)", nil, 3, "1/16*x^3 - 1/8*x^2 + 1/2*x + 1", []string{"x"}},
	{"sqrt(4+x)", nil, 3, "1/512*x^3 - 1/64*x^2 + 1/4*x + 2", []string{"x"}},
	{"1/(1-x)", nil, 4, "x^4 + x^3 + x^2 + x + 1", []string{"x"}},
	{"x/(2-x)", nil, 3, "1/8*x^3 + 1/4*x^2 + 1/2*x", []string{"x"}},
	{"exp(x)*y", nil, 3, "1/2*x^2*y + x*y + y", []string{"x", "y"}},
	{"log(1+x+y)", nil, 2, "-1/2*x^2 - x*y - 1/2*y^2 + x + y", []string{"x", "y"}},
	{"exp(0)+x", nil, 2, "x + 1", []string{"x"}},
}

func TestParseValid(t *testing.T) {
	for _, tc := range validCases {
		e, err := Parse(tc.src, Config{Vars: tc.vars, Order: tc.order})
		if err != nil {
			t.Errorf("Parse(%q): %v", tc.src, err)
			continue
		}
		if got := e.Poly.String(); got != tc.want {
			t.Errorf("Parse(%q) = %q, want %q", tc.src, got, tc.want)
		}
		if got := e.Poly.Vars(); !slices.Equal(got, tc.vs) && !(len(got) == 0 && len(tc.vs) == 0) {
			t.Errorf("Parse(%q) vars = %v, want %v", tc.src, got, tc.vs)
		}
	}
}

var invalidCases = []struct {
	src   string
	order int
	err   string // exact Error() text
}{
	{"", 0, "1:1: expected expression, found end of input"},
	{"   ", 0, "1:4: expected expression, found end of input"},
	{"(x+", 0, "1:4: expected operand, found end of input"},
	{"(x+y", 0, "1:5: expected ')', found end of input"},
	{"(x+y+)", 0, "1:6: expected operand, found ')'"},
	{"x)", 0, "1:2: expected operator or end of expression, found ')'"},
	{"x y", 0, "1:3: expected operator, found 'y' (write products with '*')"},
	{"(x)(y)", 0, "1:4: expected operator, found '(' (write products with '*')"},
	{"2x", 0, "1:1: malformed number 2x (write products with '*')"},
	{"1.2.3", 0, "1:1: malformed number 1.2.3 (write products with '*')"},
	{"2e", 0, "1:1: malformed number 2e: exponent has no digits"},
	{".", 0, "1:1: malformed number: '.' must be followed or preceded by digits"},
	{"x $ y", 0, "1:3: unexpected character '$'"},
	{"x + \xff", 0, "1:5: invalid UTF-8 encoding"},
	{"x;y", 0, "1:2: expected end of input, found ';' (only one expression is read here)"},
	{"x*", 0, "1:3: expected operand, found end of input"},
	{"x^", 0, "1:3: expected operand, found end of input"},
	{"*x", 0, "1:1: expected operand, found '*'"},
	{"x = 1", 0, "1:3: expected operator or end of expression, found '='"},
	{"x^y", 0, "1:2: the exponent y is not a constant"},
	{"x^(1+y)", 0, "1:2: the exponent (1+y) is not a constant"},
	{"x/0", 0, "1:2: division by zero"},
	{"x/(1-1)", 0, "1:2: division by zero"},
	{"0^-1", 0, "1:2: division by zero: 0^-1"},
	{"2^(1/2)", 0, "1:2: 2^(1/2) is not rational"},
	{"(-4)^(1/2)", 0, "1:5: (-4)^(1/2) is not rational"},
	{"x^-1", 0, "1:2: x^-1 (a negative power) is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order {Order}"},
	{"x^(1/2)", 0, "1:2: x^(1/2) (a fractional power) is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order {Order}"},
	{"x/(1+x)", 0, "1:2: division by (1+x), which is not constant, is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order {Order}"},
	{"1 + exp(x)", 0, "1:5: exp(x) is not a polynomial; it can only be expanded as a truncated power series, which needs a truncation order {Order}"},
	{"f(x)", 0, "1:1: unknown function f"},
	{"exp", 0, "1:4: expected '(' after function name exp, found end of input"},
	{"exp + 1", 0, "1:5: expected '(' after function name exp, found '+'"},
	{"sin(x", 3, "1:6: expected ')', found end of input"},
	{"exp(1+x)", 3, "1:1: exp(1+x): the argument equals 1 at 0, so the Taylor coefficients would be irrational (multiples of exp(1)); factor the constant out: exp(1 + u) = exp(1)·exp(u), so write the model with exp(u)"},
	{"sin(x-1/2)", 3, "1:1: sin(x-1/2): the argument equals -1/2 at 0, so the Taylor coefficients would be irrational: sin(-1/2 + u) = sin(-1/2)·cos(u) + cos(-1/2)·sin(u), and no rewrite has rational ones; write the model with an argument that vanishes there (shift the variable or move the constant into a parameter)"},
	{"log(2+x)", 3, "1:1: log(2+x): the argument equals 2 at 0, so the Taylor series starts with the irrational constant log(2); since log(a) = log(2) + log(a/2), write the model with log(1/2*(2+x)), whose argument is 1 there"},
	{"log(x)", 3, "1:1: log(x): the argument vanishes at 0, where log has no Taylor series {At}"},
	{"log(-1+x)", 3, "1:1: log(-1+x): the argument equals -1 at 0, where log is not real"},
	{"sqrt(x)", 3, "1:1: sqrt(x): the argument vanishes at 0, where sqrt has no Taylor series {At}"},
	{"sqrt(2+x)", 3, "1:1: sqrt(2+x): the argument equals 2 at 0, which is not the square of a rational, so the Taylor coefficients would be irrational (multiples of sqrt(2)); scale the argument so that its value there is a rational square such as 1 or 4 (sqrt(c*v) = sqrt(c)*sqrt(v) moves a factor out)"},
	{"sqrt(-1+x)", 3, "1:1: sqrt(-1+x): the argument equals -1 at 0, where sqrt is not real"},
	{"(2+x)^(1/3)", 3, "1:6: (2+x)^(1/3): the base equals 2 at 0, which has no rational 3-th root, so the Taylor coefficients would be irrational; scale the base so that its value there is, for example, 1"},
	{"(-1+x)^(1/2)", 3, "1:7: (-1+x)^(1/2): the base equals -1 at 0, so the power is not real"},
	{"x^(1/2)", 3, "1:2: x^(1/2): the base vanishes at 0, so this power has no Taylor series there {At}"},
	{"(x+y)^-2", 3, "1:6: (x+y)^-2: the base vanishes at 0, so this power has no Taylor series there {At}"},
	{"1/x", 3, "1:2: division by x, which vanishes at 0: the quotient has no Taylor series there {At}"},
	{"log(0*x)", 3, "1:1: log(0*x): the argument vanishes at 0, where log has no Taylor series"},
	{"1/(exp(x)-1)", 3, "1:2: division by (exp(x)-1), which vanishes at 0: the quotient has no Taylor series there {At}"},
	{"1/(x^5)", 3, "1:2: division by (x^5), which vanishes at 0: the quotient has no Taylor series there {At}"},
	{"(x+y+z)^100000", 0, "1:8: exponent 100000 exceeds the limit 10000 {MaxExponent}"},
	{"(x+y+z)^5000", 0, "1:8: (x+y+z)^5000 would have up to 1.25e+07 terms, more than the limit 2000000 {MaxTerms}"},
	{"(1+x)^(1/100001)", 3, "1:6: exponent 1/100001 exceeds the limit 10000 {MaxExponent}"},
	{"1e1000000000", 0, "1:1: number 1e1000000000 is too large: its decimal exponent exceeds 10000"},
	{"1e10001", 0, "1:1: number 1e10001 is too large: its decimal exponent exceeds 10000"},
	{"(1e300)^10000", 0, "1:8: (1e300)^10000 would have about 9.97e+06 bits, more than the limit 1000000 {MaxBits}"},
	// Positions count lines and runes.
	{"x +\n  # é\n  y +", 0, "3:6: expected operand, found end of input"},
	{"é", 0, "1:1: unexpected character 'é'"},
	{"x + é", 0, "1:5: unexpected character 'é'"},
	{"(x+\n y ++ ", 0, "2:7: expected operand, found end of input"},
}

func TestParseInvalid(t *testing.T) {
	for _, tc := range invalidCases {
		e, err := Parse(tc.src, Config{Order: tc.order})
		if err == nil {
			t.Errorf("Parse(%q) = %v, want error %q", tc.src, e.Poly, tc.err)
			continue
		}
		var pe *Error
		if !errors.As(err, &pe) {
			t.Errorf("Parse(%q): error %v is not an *Error", tc.src, err)
		}
		want, setting := splitSetting(tc.err)
		if err.Error() != want {
			t.Errorf("Parse(%q):\n got  %s\n want %s", tc.src, err, want)
		}
		if pe != nil && pe.Setting != setting {
			t.Errorf("Parse(%q): Setting %q, want %q", tc.src, pe.Setting, setting)
		}
		if pe != nil && (pe.Offset < 0 || pe.Offset > len(tc.src)) {
			t.Errorf("Parse(%q): offset %d out of range", tc.src, pe.Offset)
		}
	}
}

func TestParseConfigErrors(t *testing.T) {
	for _, cfg := range []Config{
		{Vars: []string{"x", "x"}},
		{Vars: []string{"1x"}},
		{Vars: []string{"exp"}},
		{Order: -1},
		{Order: 1001},
		{Order: 11, Limits: Limits{MaxOrder: 10}},
	} {
		if _, err := Parse("x", cfg); err == nil {
			t.Errorf("Parse with %+v succeeded", cfg)
		}
	}
}

// TestResourceGuards: runaway inputs fail with an error instead of hanging
// or overflowing the stack.
func TestResourceGuards(t *testing.T) {
	deep := strings.Repeat("(", 1_000_000) + "x" + strings.Repeat(")", 1_000_000)
	if _, err := Parse(deep, Config{}); err == nil || !strings.Contains(err.Error(), "nested too deeply") {
		t.Errorf("deep parentheses: err = %v", err)
	}
	for _, src := range []string{strings.Repeat("-", 1_000_000) + "x", "x" + strings.Repeat("^x", 100_000), strings.Repeat("exp(", 100_000) + "x"} {
		if _, err := Parse(src, Config{Order: 2}); err == nil {
			t.Errorf("deep input of length %d parsed", len(src))
		}
	}
	// Nesting just inside the limit works.
	ok := strings.Repeat("(", 999) + "x" + strings.Repeat(")", 999)
	if _, err := Parse(ok, Config{}); err != nil {
		t.Errorf("999 parentheses: %v", err)
	}
	// Term limit while multiplying in series mode.
	_, err := Parse("exp(a+b+c+d+e+f+g+h)", Config{Order: 12, Limits: Limits{MaxTerms: 1000}})
	if err == nil || !strings.Contains(err.Error(), "more than 1000 terms, the limit") {
		t.Errorf("series over the term limit: err = %v", err)
	}
	_, err = Parse("(a+b+c+d)*(e+f+g+h)*(i+j+k+l)", Config{Limits: Limits{MaxTerms: 20}})
	if err == nil || !strings.Contains(err.Error(), "more than 20 terms") {
		t.Errorf("product over the term limit: err = %v", err)
	}
}

func TestParseList(t *testing.T) {
	src := "x+1; y\n(z\n+1)\n\n  x +\n y ;; # comment\nw2*w10"
	list, err := ParseList(src, Config{Vars: []string{"y"}})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"x + 1", "y", "z + 1", "y + x", "w2*w10"} // y is first in the variable list
	if len(list) != len(want) {
		t.Fatalf("ParseList gave %d expressions, want %d", len(list), len(want))
	}
	for i, e := range list {
		if e.Poly.String() != want[i] {
			t.Errorf("expression %d = %q, want %q", i, e.Poly, want[i])
		}
		// y from Config.Vars, then the others of the whole text in the
		// order of their first appearance.
		if got := e.Poly.Vars(); !slices.Equal(got, []string{"y", "x", "z", "w2", "w10"}) {
			t.Errorf("expression %d vars = %v", i, got)
		}
	}
	// Errors are collected, with positions relative to the whole text.
	_, err = ParseList("x+; y\n(z;\n\nw^", Config{}) // ';' separates even inside parentheses
	var list2 ErrorList
	if !errors.As(err, &list2) || len(list2) != 3 {
		t.Fatalf("err = %v, want an ErrorList of 3", err)
	}
	if got, want := err.Error(), "1:3: expected operand, found ';' (and 2 more errors)"; got != want {
		t.Errorf("ErrorList = %q, want %q", got, want)
	}
	if got, want := list2[1].Error(), "2:3: expected ')', found ';'"; got != want {
		t.Errorf("second error = %q, want %q", got, want)
	}
	if got, want := list2[2].Error(), "4:3: expected operand, found end of input"; got != want {
		t.Errorf("third error = %q, want %q", got, want)
	}
	var one *Error
	if !errors.As(err, &one) || one.Line != 1 || one.Col != 3 {
		t.Errorf("errors.As(*Error) = %v", one)
	}
	_, err = ParseList("x\ny+", Config{})
	if !errors.As(err, &one) || err.Error() != "2:3: expected operand, found end of input" {
		t.Errorf("single failing item: %v", err)
	}
	if l, err := ParseList("  \n ; \n", Config{}); err != nil || len(l) != 0 {
		t.Errorf("empty list: %v, %v", l, err)
	}
}

func TestParseRat(t *testing.T) {
	for _, tc := range []struct{ s, want, err string }{
		{"1/3", "1/3", ""}, {"-2", "-2", ""}, {"0.25", "1/4", ""}, {"1e-3", "1/1000", ""},
		{" +2.5e2 ", "250", ""}, {"0.5/0.25", "2", ""}, {"-1/2", "-1/2", ""},
		{"", "", "1:1: expected number, found end of input"},
		{"1/0", "", "1:2: division by zero"},
		{"1/", "", "1:3: expected number, found end of input"},
		{"x", "", "1:1: expected number, found 'x'"},
		{"1 2", "", "1:3: expected end of number, found '2'"},
		{"1/-2", "", "1:3: expected number, found '-'"},
		{"1e99999", "", "1:1: number 1e99999 is too large: its decimal exponent exceeds 10000"},
	} {
		r, err := ParseRat(tc.s)
		switch {
		case tc.err != "" && (err == nil || err.Error() != tc.err):
			t.Errorf("ParseRat(%q) = %v, %v; want error %q", tc.s, r, err, tc.err)
		case tc.err == "" && (err != nil || r.Cmp(rat(tc.want)) != 0):
			t.Errorf("ParseRat(%q) = %v, %v; want %s", tc.s, r, err, tc.want)
		}
	}
}

func TestParseBindings(t *testing.T) {
	names, values, err := ParseBindings("x=1, y = -1/2,\tz=1e-3,w10=0.5")
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(names, []string{"x", "y", "z", "w10"}) {
		t.Errorf("names = %v", names)
	}
	for i, w := range []string{"1", "-1/2", "1/1000", "1/2"} {
		if values[i].Cmp(rat(w)) != 0 {
			t.Errorf("value %d = %v, want %s", i, values[i], w)
		}
	}
	if n, v, err := ParseBindings(" "); err != nil || len(n) != 0 || len(v) != 0 {
		t.Errorf("empty bindings: %v %v %v", n, v, err)
	}
	for _, tc := range []struct{ s, err string }{
		{"x=1, x=2", "1:6: duplicate name x (first at column 1)"},
		{"x=1,", "1:5: expected name, found end of input"},
		{"x", "1:2: expected '=' after x, found end of input"},
		{"x=", "1:3: expected number, found end of input"},
		{"x=a", "1:3: expected number, found 'a'"},
		{"1=2", "1:1: expected name, found '1'"},
		{"exp=2", "1:1: exp is a function name, not a variable"},
		{"x=1 y=2", "1:5: expected ',' or end of input, found 'y'"},
		{"x=1/0", "1:4: division by zero"},
		{"x=1,y=2é", "1:8: unexpected character 'é'"},
	} {
		_, _, err := ParseBindings(tc.s)
		if err == nil || err.Error() != tc.err {
			t.Errorf("ParseBindings(%q) err = %v, want %q", tc.s, err, tc.err)
		}
	}
}

// TestStringRoundTrip: Parse(p.String()) == p for random polynomials
// (common practice).
func TestStringRoundTrip(t *testing.T) {
	huge, _ := FromTerms([]string{"x", "y"}, []Exponent{{123456, 0}, {1 << 40, 7}, {0, 0}},
		rats("-100000000000000000000000000000/7", "1/3", "-1"))
	for _, p := range []*Poly{huge, Zero(nil), Zero([]string{"unused"}), Constant(nil, rat("-5/2"))} {
		e, err := Parse(p.String(), Config{Vars: p.Vars()})
		if err != nil || !e.Poly.Equal(p) {
			t.Errorf("round trip of %q: %v, %v", p, e, err)
		}
	}
	r := rand.New(rand.NewPCG(11, 12))
	vars := []string{"w10", "a", "b_3", "x2"} // deliberately not in natural order
	for range 200 {
		p := randomPoly(r, vars, r.IntN(10), 4)
		e, err := Parse(p.String(), Config{Vars: p.Vars()})
		if err != nil {
			t.Fatalf("Parse(%q): %v", p, err)
		}
		if !e.Poly.Equal(p) || e.Truncated {
			t.Fatalf("round trip of %q gave %q", p, e.Poly)
		}
	}
}

func TestIsIdentifier(t *testing.T) {
	for s, want := range map[string]bool{"x": true, "w12": true, "b_3": true, "_": true, "X_y9": true,
		"": false, "1x": false, "x-y": false, "exp": false, "é": false, "x y": false} {
		if IsIdentifier(s) != want {
			t.Errorf("IsIdentifier(%q) = %v", s, !want)
		}
	}
}

func TestManyVariables(t *testing.T) {
	var b strings.Builder
	for i := range 1000 {
		if i > 0 {
			b.WriteString(" + ")
		}
		b.WriteString("v" + strconv.Itoa(i))
	}
	e, err := Parse(b.String(), Config{})
	if err != nil {
		t.Fatal(err)
	}
	if e.Poly.Len() != 1000 || e.Poly.NumVars() != 1000 {
		t.Errorf("sum of 1000 variables: %d terms, %d variables", e.Poly.Len(), e.Poly.NumVars())
	}
	_, err = Parse(b.String()+" + extra", Config{})
	if err == nil || err.Error() != "1:"+strconv.Itoa(b.Len()+4)+": more than 1000 variables, the limit" {
		t.Errorf("1001 variables: err = %v", err)
	}
}

// TestWorkLimit: computations whose estimated work exceeds Limits.MaxWork
// are refused before they start.
func TestWorkLimit(t *testing.T) {
	for _, tc := range []struct {
		src   string
		order int
		lim   Limits
		want  string
	}{
		{"(1+x)^10000", 0, Limits{}, "units of work, more than the limit {MaxWork}"},
		{"exp(x+y+z)", 1000, Limits{MaxTerms: 1 << 30}, "exp(x+y+z) needs more work than the limit 500000000 allows {MaxWork}"},
		{"(a+b+c)*(d+e+f)", 0, Limits{MaxWork: 5}, "1:8: (a+b+c)*(d+e+f) needs more work than the limit 5 allows {MaxWork}"},
		{"tanh(x*y+z)", 12, Limits{MaxWork: 100}, "needs more work than the limit 100 allows {MaxWork}"},
	} {
		start := time.Now()
		_, err := Parse(tc.src, Config{Order: tc.order, Limits: tc.lim})
		want, setting := splitSetting(tc.want)
		var pe *Error
		if err == nil || !strings.Contains(err.Error(), want) || !errors.As(err, &pe) || pe.Setting != setting {
			t.Errorf("Parse(%q): err = %v, want it to contain %q and name the setting %s", tc.src, err, want, setting)
		}
		if d := time.Since(start); d > 5*time.Second {
			t.Logf("Parse(%q) took %v before refusing", tc.src, d) // reported, not asserted
		}
	}
	var le *LimitError
	one := Constant([]string{"x"}, big.NewRat(1, 1))
	if _, err := one.Add(Variable([]string{"x"}, 0)).Pow(10000, Limits{}); !errors.As(err, &le) || le.Limit != "MaxWork" {
		t.Errorf("(1+x)^10000: err = %v, want a MaxWork LimitError", err)
	}
	// Within the budget the same expansions succeed.
	if _, err := Parse("tanh(x*y+z)", Config{Order: 12}); err != nil {
		t.Error(err)
	}
	if _, err := Parse("(1+x)^200", Config{}); err != nil {
		t.Error(err)
	}
}

// TestHugeExponents: exponents that would overflow are errors, not panics.
func TestHugeExponents(t *testing.T) {
	a := "((x^10000)^10000)^10000" // x^(10^12)
	b := "(" + a + ")^10000"       // x^(10^16)
	for _, src := range []string{
		"(" + b + ")^500",                         // 5·10^18 >= 2^62 ≈ 4.6·10^18
		"(" + b + ")^400 * (" + b + ")^400",       // 8·10^18
		"(" + b + ")^400 * (1 + (" + b + ")^400)", // same, with the generic path
	} {
		_, err := Parse(src, Config{})
		if err == nil || !strings.Contains(err.Error(), "exponents of 2^62 or more are not supported") {
			t.Errorf("Parse(%q): err = %v", src, err)
		}
	}
	// In series mode a power whose exponents would reach 2^62 is far above
	// the order: it is truncated to zero and the result is marked
	// truncated. (x*y)^(2^62-1) stays below 2^62, so being exact it is kept.
	if e, err := Parse("(x^3)^4611686018427387904 + (x*y)^4611686018427387903 + 1", Config{Order: 5}); err != nil || e.Poly.String() != "x^4611686018427387903*y^4611686018427387903 + 1" || !e.Truncated {
		t.Errorf("huge powers in series mode: %v, %v", e, err)
	}
	e, err := Parse(a+"*y", Config{})
	if err != nil || e.Poly.String() != "x^1000000000000*y" {
		t.Fatalf("x^(10^12)*y = %v, %v", e, err)
	}
	if got := e.Poly.Eval([]*big.Rat{big.NewRat(-1, 1), big.NewRat(3, 1)}); got.Cmp(big.NewRat(3, 1)) != 0 {
		t.Errorf("(-1)^(10^12)*3 = %v", got)
	}
	if got := e.Poly.Compile().Eval([]float64{-1, 3}); got != 3 {
		t.Errorf("compiled (-1)^(10^12)*3 = %v", got)
	}
}

// splitSetting splits an expected message "msg {Setting}" of the tables
// into the message and the expected Error.Setting ("" when absent).
func splitSetting(s string) (msg, setting string) {
	if i := strings.LastIndex(s, " {"); i >= 0 && strings.HasSuffix(s, "}") {
		return s[:i], s[i+2 : len(s)-1]
	}
	return s, ""
}
