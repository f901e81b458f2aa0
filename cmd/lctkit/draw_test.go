package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// drawCases are the golden pictures. The pictures themselves are checked in
// package rlct/picture, on the same hand-worked cases; here the command line
// is: the expression, the title it makes, the file written.
var drawCases = []struct {
	name   string
	args   []string
	title  string
	result string // the bold caption line
}{
	// P = conv{(4,0),(0,6)} + R²₊: the ray (t,t) meets 3x + 2y = 12 at
	// t = 12/5, so λ = 5/12, θ = 1, exact (Howald 2001, Trans. AMS 353,
	// halved for squares).
	{"x4y6", []string{"x^4 + y^6"}, "K = x^4 + y^6", "λ = 5/12\u2003\u2003θ = 1\u2003\u2003exact"},
	// (y − x²)², drawn in (y, x), the order in which the variables first
	// appear: the edge (2,0)–(0,4) on 2y + x = 4 is degenerate, so 3/4 is
	// only an upper bound (by hand; the true λ is 1/2, common practice).
	{"degenerate", []string{"(y - x^2)^2"}, "K = (y - x^2)^2", "λ = 3/4\u2003\u2003θ = 1\u2003\u2003upper bound"},
	// x²y² + z²: λ = 1/2 + 1/2 = 1, θ = 2 + 1 − 1 = 2 (common practice:
	// over separate variables λ adds and θ adds minus one).
	{"space", []string{"x^2*y^2 + z^2"}, "K = x^2*y^2 + z^2", "λ = 1\u2003\u2003θ = 2\u2003\u2003exact"},
	// x² + y² + z²: λ = 3/2, the regular d/2 (common practice).
	{"sphere", []string{"x^2 + y^2 + z^2"}, "K = x^2 + y^2 + z^2", "λ = 3/2\u2003\u2003θ = 1\u2003\u2003exact"},
	// The bundled example (g·v1)² + (g·v2)² + (v1·v2)²: the triangle
	// (2,2,0), (2,0,2), (0,2,2) on g + v1 + v2 = 4 is met at t = 4/3, so
	// λ = 3/4, θ = 1 (by hand).
	{"bundled", nil, "K = " + bundledExample, "λ = 3/4\u2003\u2003θ = 1\u2003\u2003exact"},
}

func TestDrawPictures(t *testing.T) {
	for _, tc := range drawCases {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"draw", "-o", "-"}, tc.args...)
			out, errOut, code := runCLI(t, "", args...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			checkGolden(t, filepath.Join("testdata", "draw_"+tc.name+".svg"), out)
			els := parseSVG(t, []byte(out))
			if err := checkFinite(els); err != nil {
				t.Error(err)
			}
			if got := texts(byClass(els, "title")); len(got) != 1 || got[0] != tc.title {
				t.Errorf("title %q, want %q", got, tc.title)
			}
			res := texts(byClass(els, "caption-result"))
			if len(res) != 1 || res[0] != tc.result {
				t.Errorf("caption %q, want %q", res, tc.result)
			}
		})
	}
}

// TestDrawTitle checks the title for the sum-of-squares form, which the
// command writes from the generators as given.
func TestDrawTitle(t *testing.T) {
	out, errOut, code := runCLI(t, "", "draw", "-o", "-", "--sos", "x + y; x*y^2")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if got := texts(byClass(parseSVG(t, []byte(out)), "title")); len(got) != 1 || got[0] != "K = (x + y)² + (x*y^2)²" {
		t.Errorf("title %q", got)
	}
}

func TestDrawWritesFile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "p.svg")
	if _, errOut, code := runCLI(t, "", "draw", "x^2 + y^4", "-o", path); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	parseSVG(t, data)
}

func TestDrawErrors(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "x.svg")
	tests := []struct {
		args []string
		code int
		want []string
	}{
		{[]string{"draw", "a^2 + b^2 + c^2 + d^2", "-o", out}, exitFailed, []string{"2 or 3 variables", "has 4", "lctkit faces"}},
		{[]string{"draw", "x^2", "-o", out}, exitFailed, []string{"2 or 3 variables", "--vars"}},
		{[]string{"draw", "x^2 + y^2", "--at", "x=0", "--at", "x=1", "-o", out}, exitUsage, []string{"one point at a time"}},
		{[]string{"draw", "x^2 + (y", "-o", out}, exitFailed, []string{"1:9:"}},
		{[]string{"draw", "x^2 + y^2", "-o", filepath.Join(dir, "missing", "x.svg")}, exitFailed, []string{"writing the picture"}},
		{[]string{"draw", "x^2 + y^2"}, exitUsage, []string{"-o"}},
	}
	for _, tt := range tests {
		_, errOut, code := runCLI(t, "", tt.args...)
		if code != tt.code {
			t.Errorf("%v: exit %d, want %d; stderr %s", tt.args, code, tt.code, errOut)
		}
		for _, w := range tt.want {
			if !strings.Contains(errOut, w) {
				t.Errorf("%v: stderr lacks %q:\n%s", tt.args, w, errOut)
			}
		}
	}
	if _, err := os.Stat(out); err == nil {
		t.Errorf("a failed draw wrote %s", out)
	}
}

// TestDrawAfterChanges: draw --after-changes draws K after the repair
// (two variables) and refuses a core in one variable with a pointer to
// faces.
func TestDrawAfterChanges(t *testing.T) {
	out, errOut, code := runCLI(t, "", "draw", "y^2*(x-y)^2 + x^6", "--after-changes", "-o", "-")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "K after the repair of K") || !strings.Contains(out, "<svg") {
		t.Errorf("no repaired picture:\n%.400s", out)
	}
	_, errOut, code = runCLI(t, "", "draw", "(x-y)^2 + z^4", "--after-changes", "-o", "-")
	if code == exitOK || !strings.Contains(errOut, "faces --after-changes") {
		t.Errorf("exit %d, stderr %q; want an error pointing at faces --after-changes", code, errOut)
	}
}
