package main

import (
	"bytes"
	"encoding/json"
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
	for _, key := range []string{"lambda", "theta", "status", "distance", "variables", "prior", "principal_face", "nondegeneracy"} {
		if _, ok := rep[key]; !ok {
			t.Errorf("JSON lacks %q: %s", key, out)
		}
	}
	if rep["lambda"] != "5/12" || rep["theta"] != float64(1) || rep["status"] != "exact" {
		t.Errorf("got %v %v %v", rep["lambda"], rep["theta"], rep["status"])
	}
}

func TestBoundUpperBoundSaysWhy(t *testing.T) {
	out, _, code := runCLI(t, "", "bound", "(x-y)^2")
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
		{[]string{"bound", "x^2", "--prior", "x=1,,y=2"}, exitFailed, []string{"--prior"}},
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
		Singular []float64 `json:"singular"`
		Regular  []float64 `json:"regular"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
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
