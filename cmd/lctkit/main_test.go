package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
)

// runCLI runs the command line in-process and returns stdout, stderr and
// the exit code.
func runCLI(t *testing.T, stdin string, args ...string) (string, string, int) {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(args, &env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errOut})
	return out.String(), errOut.String(), code
}

func TestBoundBundledExample(t *testing.T) {
	out, _, code := runCLI(t, "", "bound")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	if !strings.Contains(out, "bundled example") || !strings.Contains(out, "λ = 3/4") || !strings.Contains(out, "(exact)") {
		t.Errorf("output does not state the bundled example and its answer:\n%s", out)
	}
}

func TestBoundJSON(t *testing.T) {
	// x^4 + y^6: λ = 5/12, θ = 1, exact (Howald 2001, Trans. AMS 353,
	// halved for squares).
	out, _, code := runCLI(t, "", "bound", "x^4+y^6", "--json")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	var rep map[string]any
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{"lambda", "theta", "status", "distance", "variables", "prior", "principal_face", "certificate", "summary"} {
		if _, ok := rep[key]; !ok {
			t.Errorf("JSON lacks %q: %s", key, out)
		}
	}
	if rep["lambda"] != "5/12" || rep["theta"] != float64(1) || rep["status"] != "exact" {
		t.Errorf("got %v %v %v", rep["lambda"], rep["theta"], rep["status"])
	}
	if _, ok := rep["nondegeneracy"]; ok {
		t.Errorf("the per-face list is printed without --all-faces: %s", out)
	}
	out, _, code = runCLI(t, "", "bound", "x^4+y^6", "--json", "--all-faces")
	if code != exitOK || !strings.Contains(out, `"nondegeneracy"`) {
		t.Errorf("--all-faces: exit %d, no per-face list: %s", code, out)
	}
}

// The three statuses, as the text and JSON outputs name them, on the cases
// of the issue that asked for them. True values: x² + y¹⁰ is 1/2 + 1/10 = 3/5
// (sum of squared monomials in separate variables, worked by hand); the
// truncations of z² + x²·sin(y)² at degree 3 and of (x − tanh(x))² + y² at
// degree 4 drop x²y² and x⁶/9, so their computed value 1/2 lies below the true
// 1 and 2/3 (worked by hand from sin y = y − …, x − tanh x = x³/3 − …).
func TestStatusWords(t *testing.T) {
	tests := []struct {
		args   []string
		status string
		text   []string
	}{
		{[]string{"x^2 + y^10", "--order", "8"}, "exact", []string{"λ = 3/5", "(exact)"}},
		{[]string{"(x-y)^2", "--no-reduce"}, "upper-bound", []string{"(upper bound)", "θ is ordered together with λ"}},
		// Through the reduction u = x − y, by completing the square: A = 1,
		// B = −2y, C = y², 4AC − B² = 0 (hand: λ = 1/2, y free).
		{[]string{"(x-y)^2"}, "exact", []string{"(exact)", "reduction: completed the square in x", "4·A·C − B² = 0", "free directions (contribute 0): y", "without the reduction: λ = 1, θ = 1 (upper bound)"}},
		// x² − 2xy + y² + z⁴: A = 1, B = −2y, C = y² + z⁴, 4AC − B² = 4z⁴,
		// whose content 4 is divided out (hand: λ = 1/2 + 1/4 = 3/4).
		{[]string{"x^2 - 2*x*y + y^2 + z^4"}, "exact", []string{"λ = 3/4", "(exact)", "(4·A·C − B²)/(4) = z^4"}},
		{[]string{"z^2 + x^2*sin(y)^2", "--order", "3"}, "uncertified", []string{"(NOT A BOUND)", "not a bound", "may lie below"}},
		{[]string{"(x - tanh(x))^2 + y^2", "--order", "4"}, "uncertified", []string{"(NOT A BOUND)", "may lie below"}},
		// sin(x)^8 cut at degree 6 leaves only its remainder x^8, which
		// lies on the line x + 2y = 8 of the principal edge, not above it;
		// the normal (1/3, 2/3) gives (D+1)/3 > 8/3 from D = 8 (by hand).
		{[]string{"y^4 + x^4*y^2 + sin(x)^8", "--order", "6"}, "uncertified", []string{"(NOT A BOUND)", "degree 8 or more would certify"}},
		{[]string{"x^2 + sin(y)^8", "--order", "6"}, "uncertified", []string{"(NOT A BOUND)", "a higher order may"}},
	}
	for _, tt := range tests {
		out, _, code := runCLI(t, "", append([]string{"bound"}, tt.args...)...)
		if code != exitOK {
			t.Fatalf("%v: exit %d", tt.args, code)
		}
		for _, want := range tt.text {
			if !strings.Contains(out, want) {
				t.Errorf("%v: text lacks %q:\n%s", tt.args, want, out)
			}
		}
		if tt.status != "exact" && strings.Contains(out, "(exact)") {
			t.Errorf("%v: text says exact:\n%s", tt.args, out)
		}
		if tt.status == "uncertified" && strings.Contains(out, "(upper bound)") {
			t.Errorf("%v: text calls a value that is not a bound an upper bound:\n%s", tt.args, out)
		}
		js, _, _ := runCLI(t, "", append([]string{"bound", "--json", "--n", "1000"}, tt.args...)...)
		var rep struct {
			Status  string `json:"status"`
			Summary string `json:"summary"`
			Penalty struct {
				Status string `json:"status"`
				Note   string `json:"note"`
			} `json:"penalty"`
		}
		if err := json.Unmarshal([]byte(js), &rep); err != nil {
			t.Fatal(err)
		}
		if rep.Status != tt.status || rep.Penalty.Status != tt.status || (tt.status != "exact") != (rep.Penalty.Note != "") {
			t.Errorf("%v: JSON status %q, penalty %+v; want %q", tt.args, rep.Status, rep.Penalty, tt.status)
		}
		if tt.status == "uncertified" && !strings.HasPrefix(rep.Summary, "not a bound") {
			t.Errorf("%v: summary %q", tt.args, rep.Summary)
		}
	}
}

// A penalty from a pair that is not exact is marked on every line.
func TestPenaltyMarksBoundPairs(t *testing.T) {
	out, _, _ := runCLI(t, "", "bound", "(x-y)^2", "--no-reduce", "--n", "1000,10000")
	if strings.Count(out, "[upper bound pair]") != 2 || !strings.Contains(out, "note: from an upper bound") {
		t.Errorf("penalties not marked:\n%s", out)
	}
	out, _, _ = runCLI(t, "", "penalty", "--lambda", "1/2", "--n", "1000", "--status", "uncertified")
	if !strings.Contains(out, "not a bound") {
		t.Errorf("penalty --status uncertified not marked:\n%s", out)
	}
}

func TestBoundUpperBoundSaysWhy(t *testing.T) {
	out, _, code := runCLI(t, "", "bound", "(x-y)^2", "--no-reduce")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	if !strings.Contains(out, "upper bound") || !strings.Contains(out, "degenerate") {
		t.Errorf("output does not say upper bound and why:\n%s", out)
	}
}

func TestBoundReadsStdin(t *testing.T) {
	out, _, code := runCLI(t, "x^2 +\n y^4\n", "bound", "-", "--json")
	if code != exitOK || !strings.Contains(out, `"lambda":"3/4"`) {
		t.Errorf("exit %d, output %s", code, out)
	}
}

func TestErrorsShowCaret(t *testing.T) {
	tests := []struct {
		args  []string
		code  int
		lines []string
	}{
		{[]string{"bound", "x^2 + (y*"}, exitFailed, []string{"1:10:", "  K: x^2 + (y*", "              ^"}},
		{[]string{"bound", "x^2", "--prior", "x=1,,y=2"}, exitUsage, []string{"--prior"}},
		{[]string{"bound", "x^2+1"}, exitFailed, []string{"does not vanish"}},
		{[]string{"bound", "x^2", "--nonsense"}, exitUsage, []string{"unknown flag"}},
		{[]string{"frobnicate"}, exitUsage, []string{"unexpected argument"}},
		{[]string{"expand", "(x+y"}, exitFailed, []string{"1:5:"}},
	}
	for _, tt := range tests {
		_, errOut, code := runCLI(t, "", tt.args...)
		if code != tt.code {
			t.Errorf("%v: exit %d, want %d; stderr:\n%s", tt.args, code, tt.code, errOut)
		}
		for _, l := range tt.lines {
			if !strings.Contains(errOut, l) {
				t.Errorf("%v: stderr lacks %q:\n%s", tt.args, l, errOut)
			}
		}
	}
}

func TestExpand(t *testing.T) {
	tests := []struct {
		args []string
		want string
	}{
		// (1+u)^3 + ... at x = 1: the binomial theorem (common practice).
		{[]string{"expand", "x^3", "--at", "x=1"}, "x^3 + 3*x^2 + 3*x + 1\n"},
		// A series at a point: 1/(1 + x) at x = 1 is 1/(2 + u) = 1/2 − u/4 +
		// u²/8 − … (geometric series, by hand), cut at degree 2.
		{[]string{"expand", "1/(1+x)", "--order", "2", "--at", "x=1"}, "1/8*x^2 - 1/4*x + 1/2\n  + terms that are multiples of x^3 (truncated at degree 2)\n"},
		{[]string{"expand", "0.25*x + 1e-3"}, "1/4*x + 1/1000\n"},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", tt.args...)
		if code != exitOK || out != tt.want {
			t.Errorf("%v: exit %d, got %q, want %q (stderr %s)", tt.args, code, out, tt.want, errOut)
		}
	}
}

func TestPenalty(t *testing.T) {
	out, _, code := runCLI(t, "", "penalty", "--lambda", "3/4", "--theta", "2", "--n", "1000", "--d", "3", "--json")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	var rep struct {
		Lambda   string    `json:"lambda"`
		Theta    int       `json:"theta"`
		N        []float64 `json:"n"`
		Status   string    `json:"status"`
		Singular []float64 `json:"singular"`
		Regular  []float64 `json:"regular"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if rep.Lambda != "3/4" || rep.Theta != 2 || len(rep.N) != 1 || rep.N[0] != 1000 || rep.Status != "exact" {
		t.Errorf("the JSON does not restate its input: %s", out)
	}
	// λ log n − (θ−1) log log n at n = 1000 with λ = 3/4, θ = 2, and the BIC
	// penalty (3/2) log n (Watanabe 2009; Schwarz 1978): by hand,
	// 0.75·6.907755 − log 6.907755 = 5.180817 − 1.932645 = 3.248172, and
	// 1.5·6.907755 = 10.361633.
	if math.Abs(rep.Singular[0]-3.248172) > 1e-5 || math.Abs(rep.Regular[0]-10.361633) > 1e-5 {
		t.Errorf("got %v, %v", rep.Singular, rep.Regular)
	}
	for _, bad := range [][]string{
		{"penalty", "--lambda", "-1", "--n", "100"},
		{"penalty", "--lambda", "1/2", "--n", "2"},
		{"penalty", "--lambda", "x", "--n", "100"},
	} {
		if _, _, code := runCLI(t, "", bad...); code == exitOK {
			t.Errorf("%v: accepted", bad)
		}
	}
}

// With --json every failure is also an object {"error": …} on stdout,
// positioned parse errors included.
func TestJSONErrorObjects(t *testing.T) {
	for _, args := range [][]string{
		{"bound", "x^2 + (y*", "--json"},
		{"bound", "x^2+1", "--json"},
		{"faces", "x^2 + (y*", "--json"},
		{"estimate", "x^2 + (y*", "--json"},
	} {
		out, _, code := runCLI(t, "", args...)
		var rep map[string]any
		if err := json.Unmarshal([]byte(out), &rep); err != nil || code != exitFailed {
			t.Errorf("%v: exit %d, stdout %q", args, code, out)
			continue
		}
		if msg, _ := rep["error"].(string); msg == "" {
			t.Errorf("%v: no error field in %s", args, out)
		}
	}
}

// The exit codes of the README: 0 success, 1 an input that cannot be
// answered, 2 a usage error, including a bad flag value.
func TestExitCodes(t *testing.T) {
	tests := []struct {
		args []string
		code int
		want string // part of stderr
	}{
		{[]string{"penalty", "--lambda", "1", "--n", "2"}, exitUsage, "--n"},
		{[]string{"penalty", "--lambda", "abc", "--n", "1000"}, exitUsage, "--lambda"},
		{[]string{"penalty", "--lambda", "-1", "--n", "1000"}, exitUsage, "λ must be positive, got -1"},
		{[]string{"penalty", "--lambda", "1", "--theta", "-2", "--n", "1000"}, exitUsage, "--theta"},
		{[]string{"bound", "x^2", "--prior", "x"}, exitUsage, "--prior"},
		{[]string{"bound", "x^2", "--at", "x=="}, exitUsage, "--at"},
		{[]string{"bound", "x^2", "--vars", "x,,y"}, exitUsage, "--vars"},
		{[]string{"bound", "x^2", "--n", "ten"}, exitUsage, "--n"},
		{[]string{"bound", "x^2", "--sos", "x"}, exitUsage, "not both"},
		{[]string{"expand", "x", "--at", "x"}, exitUsage, "--at"},
		{[]string{"bound", "x^2", "--prior", "z=1"}, exitUsage, "z is not a variable of K"},
		{[]string{"bound", "exp(x) - 1 - x", "--order", "4", "--at", "x=1"}, exitFailed, "would be irrational"},
		{[]string{"bound", "exp(x) - 1 - x", "--order", "4", "--at", "x=0", "--at", "x=1"}, exitFailed, "cannot be moved to another point"},
		{[]string{"bound", "exp(x) - 1 - x", "--order", "4", "--at", "x=0", "--at", "x=1"}, exitFailed, "point 2: "},
		{[]string{"bound", "x^2 + 1"}, exitFailed, "does not vanish"},
		{[]string{"bound", "x^2 +"}, exitFailed, "1:6:"},
		{[]string{"bound", "x^4 + y^6"}, exitOK, ""},
	}
	for _, tt := range tests {
		_, errOut, code := runCLI(t, "", tt.args...)
		if code != tt.code || !strings.Contains(errOut, tt.want) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", tt.args, code, errOut, tt.code, tt.want)
		}
	}
}

// An expression may start with a minus sign, as an argument or as a flag's
// value, and flags may follow it. x² + y⁴ is 1/2 + 1/4 = 3/4 (sum of
// monomials in separate variables, worked by hand).
func TestLeadingMinus(t *testing.T) {
	tests := [][]string{
		{"bound", "-(-x^2) + y^4", "--json"},
		{"bound", "--json", "-(-x^2) + y^4"},
		{"bound", "-(-x^2 - y^4)", "--prior", "x=0", "--json"},
		{"bound", "--sos", "-x; y^2", "--json"},
		{"bound", "--sos=-x; y^2", "--json"},
	}
	for _, args := range tests {
		out, errOut, code := runCLI(t, "", args...)
		if code != exitOK || !strings.Contains(out, `"lambda":"3/4"`) {
			t.Errorf("%v: exit %d, stdout %s, stderr %s", args, code, out, errOut)
		}
	}
	// A flag that needs a value and is followed by another flag still
	// reports the missing value.
	_, errOut, code := runCLI(t, "", "bound", "x^2", "--prior", "--json")
	if code != exitUsage || !strings.Contains(errOut, "--prior") {
		t.Errorf("--prior without a value: exit %d, stderr %s", code, errOut)
	}
}

// With several points, each point's details come under its own label, and
// the minimum is marked. x²(x−1)⁴ + y² is x² + y² + … at x = 0 (λ = 1) and
// u⁴ + y² + … at x = 1 (λ = 1/4 + 1/2 = 3/4); worked by hand.
func TestBoundSeveralPointsLabelled(t *testing.T) {
	out, _, code := runCLI(t, "", "bound", "x^2*(x-1)^4 + y^2", "--at", "x=0", "--at", "x=1")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{
		"λ = 3/4   θ = 1   (exact)",
		"point 2 at x=1,y=0: λ = 3/4, θ = 1 (exact)   ← the minimum",
		"  point 1 at x=0,y=0 (polynomials in the offsets w − w*):\n    Newton distance t = 1",
		"  point 2 at x=1,y=0 (polynomials in the offsets w − w*):\n    Newton distance t = 4/3",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// Long face polynomials and vertex lists are abbreviated in text, with the
// full count; the JSON keeps all of them (up to its own limit).
func TestTextAbbreviates(t *testing.T) {
	// All 496 monomials x^2a·y^2b·z^2c with a + b + c = 30: the principal
	// face is the whole triangle, with every term on it.
	var terms []string
	for a := 0; a <= 30; a++ {
		for b := 0; a+b <= 30; b++ {
			terms = append(terms, fmt.Sprintf("x^%d*y^%d*z^%d", 2*a, 2*b, 2*(30-a-b)))
		}
	}
	k := strings.Join(terms, " + ")
	out, _, code := runCLI(t, "", "bound", k)
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, line := range strings.Split(out, "\n") {
		if len(line) > 600 {
			t.Errorf("a line of %d bytes: %.120s…", len(line), line)
		}
	}
	if !strings.Contains(out, "(496 terms in all)") {
		t.Errorf("the face polynomial is not abbreviated with its count:\n%s", out)
	}
	js, _, _ := runCLI(t, "", "bound", k, "--json")
	if !strings.Contains(js, `"terms":496`) {
		t.Errorf("JSON lacks the term count: %.300s", js)
	}
	vs := make([][]int, 20)
	for i := range vs {
		vs[i] = []int{i, 20 - i}
	}
	if got := shortVertexList(vs); !strings.HasSuffix(got, "(19,1) (20,0)") && !strings.Contains(got, "… (20 vertices in all)") {
		t.Errorf("shortVertexList = %q", got)
	}
}

// Messages name the flag or record field to change, never a library
// identifier.
func TestMessagesNameFlags(t *testing.T) {
	_, errOut, _ := runCLI(t, "", "bound", "sin(x)^2 + y^2", "--order", "0")
	if !strings.Contains(errOut, "--order") {
		t.Errorf("no hint at --order: %s", errOut)
	}
	_, errOut, _ = runCLI(t, "", "bound", "(x+y+z)^300", "--max-terms", "100")
	if !strings.Contains(errOut, "--max-terms") {
		t.Errorf("no hint at --max-terms: %s", errOut)
	}
	out, _, _ := runCLI(t, `{"k": "sin(x)^2", "order": 0}`+"\n", "batch")
	if !strings.Contains(out, `set \"order\" in the record`) {
		t.Errorf("no hint at the record's order field: %s", out)
	}
	for _, args := range [][]string{
		{"bound", "sin(x)^2 + y^2"}, {"bound", "x;y"}, {"bound", "x^2", "--order", "5000"},
		{"bound", "(x+y+z)^300", "--max-terms", "100"}, {"bound", "x^(2^40)*(x+y)^2"},
	} {
		_, errOut, _ := runCLI(t, "", args...)
		for _, id := range []string{"Config.", "Limits.", "ParseList", "Options."} {
			if strings.Contains(errOut, id) {
				t.Errorf("%v: the message names %s: %s", args, id, errOut)
			}
		}
	}
}
