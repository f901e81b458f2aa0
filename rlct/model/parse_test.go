package model

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct"
)

// descriptions are valid descriptions; each must parse, print in canonical
// form, and parse back to the same canonical form.
var descriptions = []string{
	// valid
	"kind regression\nparam a\nnoise 1\nmean a",
	"model rank one, three sensors   # comment\nkind regression\nparam B[2,1], A[1,3]\ninput x[3] ~ normal\nnoise 1/2\nmean B*A*x\n",
	"kind regression\nparam a[2], B[2,3] prior 1/2\ninput x[3] ~ design { (0, 1, 2): 1/2, (1, 0, -1/3): 0.5 }\nnoise 2\nmean a'*tanh(B*x)\norder 6",
	"kind regression\nparam a, b prior 1\ninput x ~ uniform(-1, 2)\ninput z ~ normal(1, 1/4)\nnoise 1e-2\nmean a*x^2 + b*z - -a\nmean sum([a])",
	"kind regression\nparam w[3]\ninput x ~ moments { 1: 0, 2: 1, 3: 0, 4: 3 }\nnoise 1\nmean w[1]*x + w[2]*x**2 + w[3]",
	"kind regression\nparam M[2,2]\ninput x[2] ~ moments { (1, 0): 0, (0, 1): 0, (2, 0): 1, (1, 1): 1/2, (0, 2): 1 }\nnoise 1\nmean (M*x)'*(M*x)\ntruth M = [1, 0;\n  0, 1]\ntruth M = [-1, 0; 0, -1]",
	"kind discrete\nparam a, b\ncategory heads = 1/2 + a*b\ncategory tails = 1/2 - a*b\ntruth a = 1/3",
	"kind discrete\nparam p[2]\ninput c ~ design { 0: 1/4, 1: 3/4 }\ncategory y = [1/3 + p[1]*c; 1/3 + p[2]; 1/3 - p[1]*c - p[2]]",
	"kind mixture\nparam a, m1, m2\ncomponent poisson(m1) weight a\ncomponent poisson(m2) weight 1 - a\ntruth a = 1/2, m1 = 2, m2 = 2\norder 4",
	"kind mixture\nparam a, p\ncomponent binomial(1, p) weight a\ncomponent bernoulli(p) weight 1 - a",
	"kind regression\nparam a\nnoise 1\nmean -a^2^3 + (-a)^2 + 2^-1*a - a/(1 + a) + exp(a) - 1\norder 3",
	"kind regression\nparam order, B[2,2]\nnoise 1\nmean (B')[1,2]*order + B[2,1] + [order, 1; 2, B[1,1]][2,2]",
	"kind regression\nparam a\ntruth\nnoise 1\nmean a",
}

// parseErrors are invalid descriptions with the position and a part of
// the message of the (first) error.
var parseErrors = []struct {
	src, pos, msg string
}{
	// invalid
	{"", "1:1", "no kind statement"},
	{"kind regression\nparam a\nmean a", "1:1", "needs its noise variance"},
	{"kind regression\nparam a\nnoise 1", "1:1", "needs its mean function"},
	{"kind regression\nnoise 1\nmean 1", "1:1", "has no parameters"},
	{"kind nonsense", "1:6", `unknown kind "nonsense"`},
	{"kind regression\nkind discrete", "2:1", "the kind is given twice"},
	{"frobnicate", "1:1", `unknown statement "frobnicate"`},
	{"kind regression\nparam a,\nnoise 1\nmean a", "2:9", "expected a name, found end of line"},
	{"kind regression\nparam exp\nnoise 1\nmean 1", "2:7", "exp is a function"},
	{"kind regression\nparam a[0]\nnoise 1\nmean 1", "2:9", "a size must be an integer from 1"},
	{"kind regression\nparam a prior -1\nnoise 1\nmean a", "2:15", "greater than -1"},
	{"kind regression\nparam a, a\nnoise 1\nmean a", "2:10", "a is declared twice"},
	{"kind regression\nparam v[2], v_1\nnoise 1\nmean v_1", "2:13", "same variable name v_1"},
	{"kind regression\nparam a\nnoise 0\nmean a", "3:7", "must be positive"},
	{"kind regression\nparam a\nnoise 1\nnoise 2\nmean a", "4:1", "given twice"},
	{"kind regression\nparam a\nnoise 1\nmean a +", "4:9", "expected an operand, found end of input"},
	{"kind regression\nparam a\nnoise 1\nmean a b", "4:8", `expected end of line, found "b"`},
	{"kind regression\nparam a\nnoise 1\nmean q", "4:6", "unknown name q"},
	{"kind regression\nparam a\nnoise 1\nmean tanh", "4:10", "expected '(' after tanh"},
	{"kind regression\nparam B[2,2]\ninput x[3] ~ normal\nnoise 1\nmean B*x", "5:7", "inner sizes 2 and 3 differ"},
	{"kind regression\nparam v[2], w[3]\nnoise 1\nmean v + w", "4:8", "cannot add values of shapes 2×1 and 3×1"},
	{"kind regression\nparam v[2]\nnoise 1\nmean v^2", "4:7", "^ applies to scalars"},
	{"kind regression\nparam v[2]\nnoise 1\nmean v[3]", "4:7", "index out of range: the value is a vector of length 2"},
	{"kind regression\nparam B[2,2]\nnoise 1\nmean B[1]", "4:7", "one index selects an entry of a vector"},
	{"kind regression\nparam a\nnoise 1\nmean a\ntruth b = 1", "5:7", "unknown parameter b"},
	{"kind regression\nparam a\ninput x ~ normal\nnoise 1\nmean a*x\ntruth x = 1", "6:7", "x is an input, not a parameter"},
	{"kind regression\nparam B[2,2]\nnoise 1\nmean B[1,1]\ntruth B = [1, 2, 3]", "5:7", "declared a 2×2 matrix, and its true value is a row of length 3"},
	{"kind regression\nparam B[2,2]\nnoise 1\nmean B[1,1]\ntruth B = [1, 2; 3]", "5:7", "rows of B have different lengths"},
	{"kind regression\nparam a\nnoise 1\nmean a\ntruth a = 1, a = 2", "5:14", "a is set twice"},
	{"kind regression\nparam a\ninput x ~ design { 1: 1/2, 2: 1/3 }\nnoise 1\nmean a*x", "3:11", "sum to 5/6, not 1"},
	{"kind regression\nparam a\ninput x ~ design { 1: 1/2, 1: 1/2 }\nnoise 1\nmean a*x", "3:28", "listed twice"},
	{"kind regression\nparam a\ninput x ~ design { 1: 0, 2: 1 }\nnoise 1\nmean a*x", "3:23", "design weight must be positive"},
	{"kind regression\nparam a\ninput x[2] ~ design { 1: 1 }\nnoise 1\nmean a*x[1]", "3:23", "expected 2 coordinates, found 1"},
	{"kind regression\nparam a\ninput x ~ uniform(1, 1)\nnoise 1\nmean a*x", "3:22", "needs a < b"},
	{"kind regression\nparam a\ninput x ~ normal(0, -1)\nnoise 1\nmean a*x", "3:21", "variance of a normal law must be positive"},
	{"kind regression\nparam a\ninput x ~ moments { 1/2: 1 }\nnoise 1\nmean a*x", "3:21", "integers from 0 to 1000"},
	{"kind regression\nparam a\ninput x ~ moments { 0: 2 }\nnoise 1\nmean a*x", "3:21", "E[1] of x is 1, not 2"},
	{"kind regression\nparam a\ninput x ~ poisson\nnoise 1\nmean a*x", "3:11", `unknown law "poisson"`},
	{"kind regression\nparam a\ninput x[2,2] ~ normal\nnoise 1\nmean a", "3:10", "an input is a scalar or a vector"},
	{"kind regression\nparam a\nnoise 1\nmean a\norder 0", "5:7", "the order must be an integer from 1"},
	{"kind regression\nparam a\nnoise 1\nmean a\ncategory h = a", "5:10", "category is for discrete models"},
	{"kind discrete\nparam a\ninput c ~ normal\ncategory h = a\ncategory t = 1 - a", "3:11", "takes finitely many values"},
	{"kind discrete\nparam a\ncategory h = a\ncategory h = 1 - a", "4:10", "category h is declared twice"},
	{"kind discrete\nparam B[2,2]\ncategory h = B", "3:10", "a scalar or a vector of them"},
	{"kind mixture\nparam a, m\ncomponent poisson(m) weight a\ncomponent binomial(2, m) weight 1 - a", "4:11", "must come from one family"},
	{"kind mixture\nparam a, m\ncomponent gamma(m) weight a", "3:11", `unknown family "gamma"`},
	{"kind mixture\nparam a, m\ncomponent poisson(m) a", "3:22", `expected "weight"`},
	{"kind mixture\nparam a\ninput x ~ normal\ncomponent poisson(a) weight 1", "3:7", "a mixture has no inputs"},
	{"kind regression\nparam a\nnoise 1\nmean [a, 1; 2]", "4:14", "this row has 1 entries, and the first has 2"},
	{"kind regression\nparam v[2]\nnoise 1\nmean [v, 1]", "4:7", "the entries of a matrix written out are scalars"},
	{"kind regression\nparam a\nnoise 1\nmean a @ 2", "4:8", "unexpected character '@'"},
	{"kind regression\nparam a\nnoise 1\nmean (a", "4:8", "expected ')', found end of input"},
	{"model\nkind regression", "1:1", "expected a name after model"},
	{"kind regression\nparam a\nnoise 1\nmean a\ntruth a = 1/0", "5:13", "division by zero"},
	{"kind regression\nparam a\nnoise 1\nmean a^1e99999", "4:8", "exponent"},
}

func TestParse(t *testing.T) {
	for _, src := range descriptions {
		d, err := Parse(src)
		if err != nil {
			t.Errorf("%q: %v", src, err)
			continue
		}
		once := d.String()
		d2, err := Parse(once)
		if err != nil {
			t.Errorf("%q printed as %q, which does not parse: %v", src, once, err)
			continue
		}
		if twice := d2.String(); twice != once {
			t.Errorf("%q: printed %q, then %q", src, once, twice)
		}
		if d.Source() != src {
			t.Errorf("Source() = %q, want the text read", d.Source())
		}
	}
}

func TestParseErrors(t *testing.T) {
	for _, tt := range parseErrors {
		_, err := Parse(tt.src)
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("%q: got %v, want an *Error", tt.src, err)
			continue
		}
		if got := fmt.Sprintf("%d:%d", e.Line, e.Col); got != tt.pos || !strings.Contains(e.Msg, tt.msg) {
			t.Errorf("%q: got %v, want %s: …%s…", tt.src, err, tt.pos, tt.msg)
		}
		if !errors.Is(err, rlct.ErrInput) {
			t.Errorf("%q: %v does not match rlct.ErrInput", tt.src, err)
		}
	}
}

// TestParseErrorList checks that every failing statement is reported.
func TestParseErrorList(t *testing.T) {
	src := "kind regression\nparam a,\nnoise x\nmean a +\n"
	_, err := Parse(src)
	var list ErrorList
	if !errors.As(err, &list) || len(list) != 3 {
		t.Fatalf("got %v, want 3 errors", err)
	}
	for i, pos := range []string{"2:9", "3:7", "4:9"} {
		if got := fmt.Sprintf("%d:%d", list[i].Line, list[i].Col); got != pos {
			t.Errorf("error %d at %s, want %s: %v", i+1, got, pos, list[i])
		}
	}
	if want := "(and 2 more errors)"; !strings.HasSuffix(err.Error(), want) {
		t.Errorf("%q lacks %q", err.Error(), want)
	}
	if !errors.Is(err, rlct.ErrInput) {
		t.Errorf("an ErrorList does not match rlct.ErrInput")
	}
}

// TestPositionColumns checks that columns count runes, not bytes.
func TestPositionColumns(t *testing.T) {
	_, err := Parse("model σ² ≈ 1\nkind regression\nparam a\nnoise 1\nmean a # é\nmean q")
	var e *Error
	if !errors.As(err, &e) || e.Line != 6 || e.Col != 6 {
		t.Fatalf("got %v, want 6:6", err)
	}
	if line, col := position("é = q", len("é = ")); line != 1 || col != 5 {
		t.Errorf("position counts bytes: %d:%d, want 1:5", line, col)
	}
}
