package main

import (
	"encoding/json"
	"strings"
	"testing"
)

// Variables keep the order in which they first appear in K, whatever the
// order of --prior and --at; --vars comes first.
func TestVariableOrder(t *testing.T) {
	tests := []struct {
		args []string
		vars []string
	}{
		{[]string{"bound", "y^2 + x^4"}, []string{"y", "x"}},
		{[]string{"bound", "y^2 + x^4", "--prior", "x=1"}, []string{"y", "x"}},
		{[]string{"bound", "y^2 + x^4", "--at", "x=0,y=0"}, []string{"y", "x"}},
		{[]string{"bound", "--sos", "s*g1 - 1; s*g2", "--at", "g1=1,s=1", "--no-reduce"}, []string{"s", "g1", "g2"}},
		{[]string{"bound", "--sos", "s*g1; s*g2", "--prior", "g2=1"}, []string{"s", "g1", "g2"}},
		{[]string{"bound", "y^2 + x^4", "--prior", "y=1", "--vars", "x"}, []string{"x", "y"}},
		{[]string{"faces", "y^2 + x^4", "--prior", "x=1"}, []string{"y", "x"}},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", append(tt.args, "--json")...)
		var rep struct {
			Variables []string `json:"variables"`
		}
		if code != exitOK || json.Unmarshal([]byte(out), &rep) != nil {
			t.Errorf("%v: exit %d: %s%s", tt.args, code, out, errOut)
			continue
		}
		if strings.Join(rep.Variables, ",") != strings.Join(tt.vars, ",") {
			t.Errorf("%v: variables %v, want %v", tt.args, rep.Variables, tt.vars)
		}
		out, _, _ = runCLI(t, "", tt.args...)
		if want := "(" + strings.Join(tt.vars, ", ") + ")"; !strings.Contains(out, want) {
			t.Errorf("%v: text lacks %q:\n%s", tt.args, want, out)
		}
	}
}

// A name in --prior or --at that K does not use is a usage error with a
// caret under it and a hint at --vars, not a silent extra dimension.
func TestUnknownVariableName(t *testing.T) {
	tests := []struct {
		args  []string
		lines []string
	}{
		{[]string{"bound", "x^2", "--prior", "x=1, z=1"}, []string{
			"lctkit: 1:6: z is not a variable of K (variables: x)",
			"--vars names it",
			"  --prior: x=1, z=1",
			"                ^",
		}},
		{[]string{"faces", "x^2 + y^2", "--at", "w=1"}, []string{"w is not a variable of K (variables: x, y)", "  --at: w=1"}},
	}
	for _, tt := range tests {
		_, errOut, code := runCLI(t, "", tt.args...)
		if code != exitUsage {
			t.Errorf("%v: exit %d, want %d: %s", tt.args, code, exitUsage, errOut)
		}
		for _, l := range tt.lines {
			if !strings.Contains(errOut, l) {
				t.Errorf("%v: stderr lacks %q:\n%s", tt.args, l, errOut)
			}
		}
	}
	// Named in --vars, it is a dimension, and its prior counts: x² with
	// |z|^1 in (z, x) has λ = 1/2 (z does not enter K, so the integral over
	// z is a constant factor; common practice).
	out, errOut, code := runCLI(t, "", "bound", "x^2", "--prior", "z=1", "--vars", "z", "--json")
	if code != exitOK || !strings.Contains(out, `"lambda":"1/2"`) || !strings.Contains(out, `"variables":["z","x"]`) {
		t.Errorf("--vars z: exit %d: %s%s", code, out, errOut)
	}
}

// A prior exponent on a coordinate that the point moves away from 0 does not
// count (the factor is smooth and positive there), and every output says
// so. (x−1)² + y² at (1, 0) with |x|·|y|: λ = 1/2 + (1+1)/2 = 3/2 (the y
// term with its prior, the x term regular; common practice).
func TestPriorNoteAtShiftedPoint(t *testing.T) {
	const note = "the prior exponent 1 of x does not count at this point: x = 1 there, not 0"
	args := []string{"(x-1)^2 + y^2", "--prior", "x=1,y=1", "--at", "x=1"}
	out, errOut, code := runCLI(t, "", append([]string{"bound"}, args...)...)
	if code != exitOK || !strings.Contains(out, "λ = 3/2") || !strings.Contains(out, "note: "+note) {
		t.Errorf("bound: exit %d:\n%s%s", code, out, errOut)
	}
	out, errOut, code = runCLI(t, "", append([]string{"faces"}, args...)...)
	if code != exitOK || !strings.Contains(out, "note: "+note) {
		t.Errorf("faces: exit %d:\n%s%s", code, out, errOut)
	}
	for _, cmd := range []string{"bound", "faces"} {
		out, errOut, code = runCLI(t, "", append([]string{cmd, "--json"}, args...)...)
		var rep struct {
			Lambda string   `json:"lambda"`
			Notes  []string `json:"notes"`
		}
		if code != exitOK || json.Unmarshal([]byte(out), &rep) != nil || rep.Lambda != "3/2" ||
			len(rep.Notes) != 1 || !strings.HasPrefix(rep.Notes[0], note) {
			t.Errorf("%s --json: exit %d, notes %q: %s%s", cmd, code, rep.Notes, out, errOut)
		}
	}
	out, _, code = runCLI(t, `{"k": "(x-1)^2 + y^2", "prior": "x=1,y=1", "at": "x=1"}`+"\n", "batch")
	if code != exitOK || !strings.Contains(out, `"notes":["`+note) {
		t.Errorf("batch: exit %d: %s", code, out)
	}
	// At the origin the exponent counts, and nothing is noted.
	out, _, _ = runCLI(t, "", "bound", "x^2 + y^2", "--prior", "x=1,y=1", "--json")
	if strings.Contains(out, `"notes"`) || !strings.Contains(out, `"lambda":"2"`) {
		t.Errorf("at the origin: %s", out)
	}
}
