package main

import (
	"encoding/json"
	"strings"
	"testing"
)

func TestMergeJSON(t *testing.T) {
	type obj map[string]int
	tests := []struct {
		a, b any
		want string
		err  bool
	}{
		{struct {
			A int `json:"a"`
		}{1}, obj{"b": 2}, `{"a":1,"b":2}`, false},
		{obj{"a": 1}, struct{}{}, `{"a":1}`, false},
		{struct{}{}, obj{"b": 2}, `{"b":2}`, false},
		{struct{}{}, struct{}{}, `{}`, false},
		{[]int{1}, obj{"b": 2}, "", true},
		{obj{"a": 1}, "text", "", true},
	}
	for _, tt := range tests {
		got, err := mergeJSON(tt.a, tt.b)
		if (err != nil) != tt.err || string(got) != tt.want {
			t.Errorf("mergeJSON(%v, %v) = %s, %v; want %s, error %v", tt.a, tt.b, got, err, tt.want, tt.err)
		}
	}
}

// Every command that takes --json prints exactly one JSON object on standard
// output: its answer, or {"error": …} when it fails, whatever the failure.
func TestJSONOneObject(t *testing.T) {
	tests := []struct {
		args []string
		ok   bool
	}{
		{[]string{"bound", "x^4 + y^6"}, true},
		{[]string{"bound", "x^2 + 1"}, false},
		{[]string{"bound", "x^2", "--n", "ten"}, false},
		{[]string{"bound", "x^2", "--prior", "z=1"}, false},
		{[]string{"faces", "x^4 + y^6"}, true},
		{[]string{"faces", "x^4 + y^6", "--at", "x=0", "--at", "y=0"}, true},
		{[]string{"faces", "(x"}, false},
		{[]string{"penalty", "--lambda", "3/4", "--n", "1000"}, true},
		{[]string{"penalty", "--lambda", "abc", "--n", "1000"}, false},
		{[]string{"expand", "(x + y)^2"}, true},
		{[]string{"expand", "(x + y"}, false},
		{[]string{"estimate", "x^2", "--runs", "2", "--live", "10"}, true},
		{[]string{"estimate", "x^2", "--box", "z=1"}, false},
		{[]string{"choose", "../../examples/sensor-rank/candidates.txt"}, true},
		{[]string{"choose", "no-such-file.txt"}, false},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", append(tt.args, "--json")...)
		if (code == exitOK) != tt.ok {
			t.Errorf("%v: exit %d: %s", tt.args, code, errOut)
		}
		if strings.Count(out, "\n") != 1 || !strings.HasSuffix(out, "\n") {
			t.Errorf("%v: stdout is not one line: %q", tt.args, out)
			continue
		}
		var obj map[string]json.RawMessage
		if err := json.Unmarshal([]byte(out), &obj); err != nil {
			t.Errorf("%v: %v in %s", tt.args, err, out)
			continue
		}
		_, hasError := obj["error"]
		if hasError == tt.ok || !tt.ok && len(obj) != 1 {
			t.Errorf("%v: exit %d with %s", tt.args, code, out)
		}
	}
}
