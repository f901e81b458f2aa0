package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// quick keeps the in-process estimates fast: 50 live points × 8 runs over 6
// decades take well under a second.
var quick = []string{"--live", "50", "--runs", "8", "--seed", "3"}

// estimateJSONOf runs the command with --json and decodes the object.
func estimateJSONOf(t *testing.T, args ...string) map[string]any {
	t.Helper()
	out, errOut, code := runCLI(t, "", append(append([]string{"estimate"}, args...), "--json")...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var rep map[string]any
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("%v in %s", err, out)
	}
	return rep
}

// TestEstimateAgainstKnownValues runs the estimator on K with a published
// learning coefficient and checks the estimate and the verdict. The
// tolerances are 4 reported standard errors plus the fit bias documented
// under estimate.Run (λ 0.006 and θ 0.1 for (x−y)²; for x²y² the
// offset b is exact, and 0.01 and 0.1 are allowed for the terms the model
// neglects).
func TestEstimateAgainstKnownValues(t *testing.T) {
	tests := []struct {
		name               string
		args               []string
		lambda, theta      float64 // the learning coefficient and multiplicity
		biasL, biasT       float64
		bound, boundStatus string
		verdict            string
	}{
		// x²y²: λ = 1/2, θ = 2 (monomial thresholds; Arnold, Gusein-Zade &
		// Varchenko 1988, Singularities of Differentiable Maps Vol. II); the
		// Newton value is exact.
		{"x^2*y^2", []string{"x^2*y^2"}, 0.5, 2, 0.01, 0.1, "1/2", "exact", "consistent with the exact value"},
		// (x−y)²: Newton bound 1, but λ = 1/2, θ = 1 after u = x − y
		// (coordinate invariance of λ; Watanabe 2009, Algebraic Geometry and
		// Statistical Learning Theory).
		{"(x-y)^2", []string{"(x-y)^2", "--no-reduce"}, 0.5, 1, 0.006, 0.1, "1", "upper-bound", "the bound is probably strict here"},
		// The same at the point x = 1, written in x: the translation is exact.
		{"shifted", []string{"(x-1)^2 - 2*(x-1)*y + y^2", "--at", "x=1", "--no-reduce"}, 0.5, 1, 0.006, 0.1, "1", "upper-bound", "the bound is probably strict here"},
		// Sum of squares (s·g1 − 1)² + (s·g2)² at s = g1 = 1: the zero set is
		// the smooth curve s·g1 = 1, g2 = 0 of codimension 2, so λ = 2/2 = 1,
		// θ = 1 (regular case, common practice), while the Newton value is
		// 3/2.
		{"sum of squares", []string{"--sos", "s*g1 - 1; s*g2", "--at", "s=1,g1=1", "--box=-0.5:0.5", "--no-reduce"}, 1, 1, 0.01, 0.1, "3/2", "upper-bound", "the bound is probably strict here"},
		// The same two through the reduction, which finds the true values
		// exactly; the estimate must agree with them.
		{"(x-y)^2 reduced", []string{"(x-y)^2"}, 0.5, 1, 0.006, 0.1, "1/2", "exact", "consistent with the exact value"},
		{"sum of squares reduced", []string{"--sos", "s*g1 - 1; s*g2", "--at", "s=1,g1=1", "--box=-0.5:0.5"}, 1, 1, 0.01, 0.1, "1", "exact", "consistent with the exact value"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rep := estimateJSONOf(t, append(tc.args, quick...)...)
			l, ls := rep["lambda_hat"].(float64), rep["lambda_se"].(float64)
			th, ts := rep["theta_hat"].(float64), rep["theta_se"].(float64)
			t.Logf("λ̂ = %.4f ± %.4f, θ̂ = %.3f ± %.3f", l, ls, th, ts)
			if !(ls > 0) || !(ts > 0) {
				t.Fatalf("standard errors %v, %v", ls, ts)
			}
			if tol := 4*ls + tc.biasL; math.Abs(l-tc.lambda) > tol {
				t.Errorf("λ̂ = %.4f ± %.4f, want %g within %.4f", l, ls, tc.lambda, tol)
			}
			if tol := 4*ts + tc.biasT; math.Abs(th-tc.theta) > tol {
				t.Errorf("θ̂ = %.3f ± %.3f, want %g within %.3f", th, ts, tc.theta, tol)
			}
			bound := rep["bound"].(map[string]any)
			if bound["lambda"] != tc.bound || bound["status"] != tc.boundStatus {
				t.Errorf("bound %v (%v), want %s (%s)", bound["lambda"], bound["status"], tc.bound, tc.boundStatus)
			}
			if v := rep["verdict"].(string); !strings.Contains(v, tc.verdict) {
				t.Errorf("verdict %q, want %q", v, tc.verdict)
			}
		})
	}
}

// TestEstimateText checks the plain output: the header says it is an
// estimate, the table has one row per point of the JSON, and the verdict is
// the library's.
func TestEstimateText(t *testing.T) {
	args := append([]string{"estimate", "(x-y)^2", "--no-reduce"}, quick...)
	out, _, code := runCLI(t, "", args...)
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{
		"Numerical ESTIMATE by nested sampling, not a proof.",
		"do not cover that bias",
		"K = (x-y)^2 at the origin",
		"x ∈ [-1, 1], y ∈ [-1, 1]",
		"50 live points × 8 runs, seed 3",
		"Newton bound:  λ = 1   θ = 1   (upper bound)",
		"verdict: below the bound by",
		"the bound is probably strict here",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	rep := estimateJSONOf(t, append([]string{"(x-y)^2", "--no-reduce"}, quick...)...)
	points := rep["points"].([]any)
	rows := 0
	for _, line := range strings.Split(out, "\n") {
		// A row starts with the value of n.
		f := strings.Fields(line)
		if _, err := strconv.ParseFloat(strings.TrimSpace(line[:min(len(line), 12)]), 64); err == nil && len(f) == 5 && f[2] == "±" {
			rows++
		}
	}
	if rows != len(points) {
		t.Errorf("%d table rows, %d points in the JSON", rows, len(points))
	}
	// The verdict is the library's wording for the same numbers.
	e := &estimate.Result{Lambda: rep["lambda_hat"].(float64), LambdaSE: rep["lambda_se"].(float64)}
	if want := "verdict: " + e.Compare(1, rlct.UpperBound).Text; !strings.Contains(out, want) {
		t.Errorf("output lacks %q", want)
	}
}

// TestEstimateJSONFields checks the fields of --json.
func TestEstimateJSONFields(t *testing.T) {
	rep := estimateJSONOf(t, append([]string{"x^2*y^2"}, quick...)...)
	for _, key := range []string{"estimate", "lambda_hat", "lambda_se", "theta_hat", "theta_se", "points", "bound",
		"verdict", "consistent", "sigmas", "live", "runs", "seed", "evaluations", "variables", "box_lower", "box_upper", "prior"} {
		if _, ok := rep[key]; !ok {
			t.Errorf("JSON lacks %q", key)
		}
	}
	if rep["live"] != 50.0 || rep["runs"] != 8.0 || rep["seed"] != 3.0 || !(rep["evaluations"].(float64) > 0) {
		t.Errorf("live %v, runs %v, seed %v, evaluations %v", rep["live"], rep["runs"], rep["seed"], rep["evaluations"])
	}
	if !strings.Contains(rep["estimate"].(string), "not a proof") {
		t.Errorf("estimate = %q", rep["estimate"])
	}
	points := rep["points"].([]any)
	// 6 decades at 4 points per decade (estimate.Options.Decades).
	if len(points) != 25 {
		t.Errorf("%d points, want 25", len(points))
	}
	prev := 0.0
	for _, p := range points {
		m := p.(map[string]any)
		for _, k := range []string{"n", "y", "se", "fit"} {
			if _, ok := m[k].(float64); !ok {
				t.Fatalf("point %v lacks %s", m, k)
			}
		}
		if n := m["n"].(float64); !(n > prev) {
			t.Errorf("n = %v does not increase", n)
		} else {
			prev = n
		}
	}
	// The bound is the object of `lctkit bound --json`.
	out, _, _ := runCLI(t, "", "bound", "x^2*y^2", "--json")
	var bound map[string]any
	if err := json.Unmarshal([]byte(out), &bound); err != nil {
		t.Fatal(err)
	}
	got, _ := json.Marshal(rep["bound"])
	want, _ := json.Marshal(bound)
	if !bytes.Equal(got, want) {
		t.Errorf("bound %s, want %s", got, want)
	}
}

// TestEstimateDeterministic checks that a seed fixes the output, whatever
// the number of workers, and that another seed changes it.
func TestEstimateDeterministic(t *testing.T) {
	base := []string{"estimate", "x^2*y^2+x^4*y^2", "--live", "20", "--runs", "4", "--decades", "3"}
	run := func(extra ...string) string {
		out, errOut, code := runCLI(t, "", append(slices.Clone(base), extra...)...)
		if code != exitOK {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		return out
	}
	a, b, c := run("--seed", "5", "--workers", "1"), run("--seed", "5", "--workers", "3"), run("--seed", "6")
	if a != b {
		t.Errorf("the same seed gave different output with 1 and 3 workers:\n%s\n%s", a, b)
	}
	if a == c {
		t.Error("seeds 5 and 6 gave the same output")
	}
}

// TestEstimateSVG checks the plot structurally: well-formed SVG with the
// points, error bars, the fitted curve, the dashed bound with its status,
// axis labels and legend, at positions that follow the numbers.
func TestEstimateSVG(t *testing.T) {
	file := filepath.Join(t.TempDir(), "curve.svg")
	rep := estimateJSONOf(t, append([]string{"(x-y)^2", "--no-reduce", "--svg", file}, quick...)...)
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	els := parseSVG(t, data)
	if err := checkFinite(els); err != nil {
		t.Fatalf("non-finite coordinate: %v", err)
	}
	if w := attrFloat(t, els[0], "width"); w != curveWidth {
		t.Errorf("width %g", w)
	}
	points := rep["points"].([]any)
	circles := byClass(els, "point")
	if len(circles) != len(points) || len(byClass(els, "error-bar")) != len(points) {
		t.Fatalf("%d point markers and %d error bars for %d points", len(circles), len(byClass(els, "error-bar")), len(points))
	}
	// Markers sit where the numbers say: cx increases with log n at a
	// constant rate, and cy is one decreasing affine function of y.
	var xs, ys, cx, cy []float64
	for i, p := range points {
		m := p.(map[string]any)
		xs = append(xs, math.Log10(m["n"].(float64)))
		ys = append(ys, m["y"].(float64))
		cx = append(cx, attrFloat(t, circles[i], "cx"))
		cy = append(cy, attrFloat(t, circles[i], "cy"))
	}
	checkAffine(t, "cx against log n", xs, cx, 1)
	checkAffine(t, "cy against y", ys, cy, -1)
	for _, class := range []string{"fit", "bound", "limit", "limit-band", "frame", "x-axis-label", "y-axis-label", "title", "legend"} {
		if len(byClass(els, class)) == 0 {
			t.Errorf("no element of class %q", class)
		}
	}
	if b := byClass(els, "bound"); len(b) == 1 && b[0].Attrs["stroke-dasharray"] == "" {
		t.Error("the bound line is not dashed")
	}
	label := byClass(els, "bound-label")
	if len(label) != 1 || !strings.Contains(label[0].Text, "λ = 1") || !strings.Contains(label[0].Text, "upper bound") {
		t.Errorf("bound label %q", texts(label))
	}
	if fit := byClass(els, "fit"); len(fit) == 1 && len(strings.Fields(fit[0].Attrs["points"])) < 50 {
		t.Errorf("the fitted curve has only %d points", len(strings.Fields(fit[0].Attrs["points"])))
	}
	all := strings.Join(texts(els[:1]), "")
	for _, want := range []string{"not a proof", "λ̂ =", "θ̂ =", "probably strict", "Newton bound", "10⁴"} {
		if !strings.Contains(all, want) {
			t.Errorf("the plot lacks the text %q", want)
		}
	}
}

// checkAffine checks that v = a + b·u for some b of the given sign.
func checkAffine(t *testing.T, what string, u, v []float64, sign float64) {
	t.Helper()
	n := len(u)
	b := (v[n-1] - v[0]) / (u[n-1] - u[0])
	if b*sign <= 0 {
		t.Errorf("%s: slope %g has the wrong sign", what, b)
		return
	}
	for i := range u {
		// Coordinates are written with one decimal.
		if want := v[0] + b*(u[i]-u[0]); math.Abs(v[i]-want) > 0.2 {
			t.Errorf("%s: point %d at %g, want %g", what, i, v[i], want)
		}
	}
}

// TestEstimatePlotWithoutBound draws the plot and text of an estimate whose
// bound could not be computed.
func TestEstimatePlotWithoutBound(t *testing.T) {
	e := &estimate.Result{Lambda: 0.75, LambdaSE: 0.01, Theta: 1.1, ThetaSE: 0.1, Offset: 2, Live: 20, Runs: 4}
	for i := range 9 {
		n := math.Pow(10, 2+float64(i)/2)
		e.Points = append(e.Points, estimate.CurvePoint{N: n, Y: e.Curve(n) + 0.01*float64(i%2), SE: 0.01})
	}
	r := &estimateResult{title: "K = a*b + c^2", vars: []string{"a", "b", "c"}, lower: []float64{-1, -1, -1},
		upper: []float64{1, 1, 1}, prior: []float64{0, 0, 0}, est: e, seed: 1, boundErr: errors.New("polyhedron: work limit exceeded")}
	els := parseSVG(t, []byte(estimatePlot(r)))
	if err := checkFinite(els); err != nil {
		t.Fatal(err)
	}
	if len(byClass(els, "bound")) != 0 || len(byClass(els, "point")) != 9 {
		t.Errorf("%d bound lines, %d points", len(byClass(els, "bound")), len(byClass(els, "point")))
	}
	if s := strings.Join(texts(els[:1]), ""); !strings.Contains(s, "not available: polyhedron: work limit exceeded") {
		t.Errorf("the plot does not say the bound is missing")
	}
	var b bytes.Buffer
	r.writeText(&b)
	if !strings.Contains(b.String(), "Newton bound:  not available") || !strings.Contains(b.String(), "verdict: no Newton bound") {
		t.Errorf("text output:\n%s", b.String())
	}
	out, err := json.Marshal(r.jsonForm())
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(out), `"bound":{"error":"polyhedron: work limit exceeded"}`) || strings.Contains(string(out), `"consistent"`) {
		t.Errorf("JSON %s", out)
	}
}

// TestEstimateNotes checks the note on a truncated series.
func TestEstimateNotes(t *testing.T) {
	out, errOut, code := runCLI(t, "", append([]string{"estimate", "x^2*(1-cos(y))", "--order", "6"}, quick...)...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "power series cut at degree 6") || !strings.Contains(out, "proxy") {
		t.Errorf("no note on the truncated series:\n%s", out)
	}
}

// TestEstimateThetaBelowOne checks the flag on θ̂ < 1, which a multiplicity
// cannot be: the note in the text and the field in the JSON, with the two
// readings (within 3 standard errors of 1, or further).
func TestEstimateThetaBelowOne(t *testing.T) {
	tests := []struct {
		theta, se float64
		want      string // "" for no note
	}{
		{1.2, 0.1, ""},
		{1, 0.1, ""},
		{0.84, 0.45, "θ̂ = 0.84 ± 0.45 is below 1, which a multiplicity cannot be (θ ≥ 1); it is within 3 standard errors of 1, so read it as θ = 1"},
		{0.7, 0.1, "θ̂ = 0.70 ± 0.10 is below 1, which a multiplicity cannot be (θ ≥ 1); it is within 3 standard errors of 1"},
		{0.3, 0.1, "θ̂ = 0.30 ± 0.10 is below 1, which a multiplicity cannot be (θ ≥ 1), by more than 3 standard errors: the fit is biased and θ̂ means nothing here"},
	}
	for _, tc := range tests {
		r := &estimateResult{title: "K = x^2", vars: []string{"x"}, lower: []float64{-1}, upper: []float64{1}, prior: []float64{0},
			est: &estimate.Result{Lambda: 0.5, LambdaSE: 0.01, Theta: tc.theta, ThetaSE: tc.se, Live: 10, Runs: 2}, boundErr: errors.New("none")}
		var b bytes.Buffer
		r.writeText(&b)
		text := strings.Join(strings.Fields(b.String()), " ") // undo the wrapping
		data, err := json.Marshal(r.jsonForm())
		if err != nil {
			t.Fatal(err)
		}
		var rep map[string]any
		if err := json.Unmarshal(data, &rep); err != nil {
			t.Fatal(err)
		}
		flag, _ := rep["theta_below_one"].(bool)
		if tc.want == "" {
			if strings.Contains(text, "below 1") || flag {
				t.Errorf("θ̂ = %g: flagged\n%s\n%s", tc.theta, text, data)
			}
			continue
		}
		if !strings.Contains(text, "note: "+tc.want) || !flag || !strings.Contains(fmt.Sprint(rep["notes"]), tc.want) {
			t.Errorf("θ̂ = %g ± %g: want the note %q and theta_below_one in\n%s\n%s", tc.theta, tc.se, tc.want, text, data)
		}
	}
	// A real run whose θ̂ comes out below 1 (x²(x−1)² has θ = 1; seed 3
	// gives θ̂ < 1 with the quick sizes): text and JSON flag it alike.
	args := append([]string{"estimate", "x^2*(x-1)^2", "--box=-0.5:1.5"}, quick...)
	out, _, code := runCLI(t, "", args...)
	rep := estimateJSONOf(t, args[1:]...)
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	th := rep["theta_hat"].(float64)
	if !(th < 1) {
		t.Fatalf("θ̂ = %g; this check needs a run with θ̂ < 1 (choose another seed)", th)
	}
	if rep["theta_below_one"] != true || !strings.Contains(out, "which a multiplicity cannot be") {
		t.Errorf("θ̂ = %g is not flagged:\n%s", th, out)
	}
}

// TestEstimateExactVerdict checks that the verdict against a Newton value
// certified exact never calls it strict: an estimate far below it is called
// biased. x²(x−1)⁴ at 0 has the exact Newton value λ = 1/2 (one variable:
// the only compact face is the vertex x², Varchenko 1976), but on the box
// [−1/2, 3/2] the zero at x = 1, where λ = 1/4 (u⁴ for u = x − 1), dominates,
// so the estimate lies far below 1/2.
func TestEstimateExactVerdict(t *testing.T) {
	args := append([]string{"estimate", "--sos", "x*(x-1)^2", "--box=-0.5:1.5"}, quick...)
	out, errOut, code := runCLI(t, "", args...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	text := strings.Join(strings.Fields(out), " ")
	for _, want := range []string{
		"Newton bound: λ = 1/2 (0.5) θ = 1 (exact)",
		"verdict: below the exact value by",
		"the value is certified, so the estimate is biased low here",
		"K is near 0 also away from the point, at x ≈ 1",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "strict") {
		t.Errorf("an exact value is called strict:\n%s", out)
	}
	rep := estimateJSONOf(t, args[1:]...)
	if rep["consistent"] != false || !strings.Contains(rep["verdict"].(string), "biased low") {
		t.Errorf("JSON verdict %v, consistent %v", rep["verdict"], rep["consistent"])
	}
	// The same wording for every exact value, whatever the estimate.
	bound, err := rlct.Bound(context.Background(), mustProblem(t, "x^2"), nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, lambda := range []float64{0.1, 0.45, 0.5, 0.55, 0.9} {
		e := &estimate.Result{Lambda: lambda, LambdaSE: 0.01}
		v := e.Compare(0.5, bound.Status)
		r := &estimateResult{est: e, bound: bound, verdict: &v}
		all := r.verdictText() + strings.Join(r.notes(), " ")
		if strings.Contains(all, "strict") || (v.Consistent != (lambda == 0.5)) {
			t.Errorf("λ̂ = %g against the exact 1/2: %q (consistent %v)", lambda, all, v.Consistent)
		}
	}
}

// TestEstimateOtherZero checks the report of another zero of K in the box:
// K = x²(x−1)² vanishes at 0 and at 1 (both λ = 1/2), and the box
// [−1/2, 3/2] holds both; also at the point x = 1 with the box [−3/2, 1/2],
// where the other zero is x = 0, an offset of −1. Zero sets through the
// point, like the line x = y of (x−y)², are not other zeros.
func TestEstimateOtherZero(t *testing.T) {
	tests := []struct {
		name    string
		args    []string
		at, off float64 // the other zero in x and as an offset; NaN: none
	}{
		{"origin", []string{"x^2*(x-1)^2", "--box=-0.5:1.5"}, 1, 1},
		{"at x = 1", []string{"x^2*(x-1)^2", "--at", "x=1", "--box=-1.5:0.5"}, 0, -1},
		{"with a second variable", []string{"x^2*(x-1)^2 + y^2", "--box", "x=-0.5:1.5,y=1"}, 1, 1},
		{"line through the point", []string{"(x-y)^2"}, math.NaN(), math.NaN()},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			args := append(append([]string{"estimate"}, tc.args...), quick...)
			out, errOut, code := runCLI(t, "", args...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			rep := estimateJSONOf(t, args[1:]...)
			zeros, _ := rep["other_zeros"].([]any)
			if math.IsNaN(tc.at) {
				if len(zeros) != 0 || strings.Contains(out, "away from the point") {
					t.Errorf("other zeros reported: %v\n%s", zeros, out)
				}
				return
			}
			if len(zeros) != 1 {
				t.Fatalf("other zeros %v, want one", zeros)
			}
			z := zeros[0].(map[string]any)
			at := z["at"].([]any)[0].(float64)
			off := z["offsets"].([]any)[0].(float64)
			// The final points hold K far below its median, within 1e−3 of
			// the zero (observed: 1e−6).
			if math.Abs(at-tc.at) > 1e-3 || math.Abs(off-tc.off) > 1e-3 {
				t.Errorf("other zero at x = %g (offset %g), want %g (%g)", at, off, tc.at, tc.off)
			}
			if s := z["share"].(float64); !(s > 0 && s < 1) {
				t.Errorf("share %g", s)
			}
			text := strings.Join(strings.Fields(out), " ")
			if want := fmt.Sprintf("K is near 0 also away from the point, at x ≈ %g", tc.at); !strings.Contains(text, want) {
				t.Errorf("output lacks %q:\n%s", want, out)
			}
			if !strings.Contains(text, "shrink --box to leave it out") || !strings.Contains(fmt.Sprint(rep["notes"]), "away from the point") {
				t.Errorf("the note on the other zero is missing:\n%s", out)
			}
		})
	}
}

// TestEstimateHelp checks that the help of estimate offers one --at point,
// while that of bound (which takes several) says they may be repeated, and
// that a second --at is refused as a usage error.
func TestEstimateHelp(t *testing.T) {
	atLine := func(cmd string) string {
		out, _, code := runCLI(t, "", cmd, "--help")
		if code != exitOK {
			t.Fatalf("%s --help: exit %d", cmd, code)
		}
		// The flag's line and its continuation lines.
		lines := strings.Split(out, "\n")
		for i, l := range lines {
			if strings.HasPrefix(strings.TrimSpace(l), "--at=") {
				j := i + 1
				for j < len(lines) && strings.HasPrefix(lines[j], "                 ") {
					j++
				}
				return strings.Join(strings.Fields(strings.Join(lines[i:j], " ")), " ")
			}
		}
		t.Fatalf("%s --help has no --at:\n%s", cmd, out)
		return ""
	}
	est, bound := atLine("estimate"), atLine("bound")
	if strings.Contains(est, "Repeat") || strings.Contains(est, "several points") || !strings.Contains(est, "One point only") {
		t.Errorf("estimate --help: %q", est)
	}
	if !strings.Contains(bound, "Repeat for several points") {
		t.Errorf("bound --help: %q", bound)
	}
	_, errOut, code := runCLI(t, "", "estimate", "x^2", "--at", "x=0", "--at", "x=1")
	if code != exitUsage || !strings.Contains(errOut, `given twice ("x=0" and "x=1")`) {
		t.Errorf("two --at: exit %d, %q", code, errOut)
	}
	// One --at is read as the point.
	out, errOut, code := runCLI(t, "", "estimate", "(x-1)^2", "--at", "x=1", "--live", "10", "--runs", "2")
	if code != exitOK || !strings.Contains(out, "K = (x-1)^2 at x=1") {
		t.Errorf("one --at: exit %d, %s%s", code, out, errOut)
	}
}

func mustProblem(t *testing.T, src string) *rlct.Problem {
	t.Helper()
	p, err := (&rlct.Spec{K: src}).Problem()
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestEstimateErrors checks that bad input gives a clear message and exit 1,
// and usage errors exit 2.
func TestEstimateErrors(t *testing.T) {
	tests := []struct {
		args []string
		code int
		want string
	}{
		{[]string{"x^2+y^2", "--box", "x=1:a"}, exitFailed, `--box: x: "a" is not a number`},
		{[]string{"x^2+y^2", "--box", "1:0"}, exitFailed, `"1:0" is empty`},
		{[]string{"x^2+y^2", "--box", "x=0.5:1"}, exitFailed, "does not contain the point"},
		{[]string{"x^2+y^2", "--box", "z=1"}, exitFailed, `"z" is not a variable of K (variables: x, y)`},
		{[]string{"x^2+y^2", "--box", "x=1,x=2"}, exitFailed, "x is given twice"},
		{[]string{"x^2+y^2", "--box", "1,2"}, exitFailed, "only one range may be given without a variable name"},
		{[]string{"x^2+y^2", "--box", "0"}, exitFailed, "must be positive"},
		// K < 0 for x > 1/2: found by the sampler, reported with the point.
		{[]string{"x^2*(1-2*x)+y^2"}, exitFailed, "K is negative at a sampled point: K(x="},
		{[]string{"x^2+y^2+1"}, exitFailed, "K does not vanish at the point"},
		{[]string{"x^3+y^2"}, exitFailed, "K takes negative values near the point"},
		{[]string{"x^2+y^2", "--at", "x=0", "--at", "x=1"}, exitUsage, "one point at a time"},
		// The flag checks of bound apply to estimate too.
		{[]string{"x^2+y^2", "--order", "-1"}, exitUsage, "--order must not be negative"},
		{[]string{"x^2+y^2", "--max-terms", "-1"}, exitUsage, "--max-terms must not be negative"},
		{[]string{"x^2+y^2", "--live", "5"}, exitFailed, "need at least 10 live points"},
		{[]string{"x^2+y^2", "--box"}, exitUsage, "expected box value"},
		{[]string{"x^2+y^2", "--live", "many"}, exitUsage, "--live"},
		{[]string{"x^2 + (y*"}, exitFailed, "1:10:"},
	}
	for _, tc := range tests {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			args := append(append([]string{"estimate"}, tc.args...), "--runs", "2", "--live", "10")
			if slices.Contains(tc.args, "--live") {
				args = append([]string{"estimate"}, tc.args...)
			}
			_, errOut, code := runCLI(t, "", args...)
			if code != tc.code || !strings.Contains(errOut, tc.want) {
				t.Errorf("exit %d, stderr %q; want exit %d and %q", code, errOut, tc.code, tc.want)
			}
		})
	}
}

// TestEstimateUnusedPrior checks that a prior exponent at a coordinate where
// the point is not 0 is reported as not counting, as the bound sets τ = 1
// there, in the text and in the JSON notes.
func TestEstimateUnusedPrior(t *testing.T) {
	args := []string{"estimate", "(x-1)^2*y^2", "--at", "x=1", "--prior", "x=1,y=1", "--runs", "2", "--live", "10"}
	out, errOut, code := runCLI(t, "", args...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	const note = "the prior exponent 1 of x does not count at this point: x = 1 there"
	if !strings.Contains(out, "prior: proportional to |y|^1\n") || !strings.Contains(strings.Join(strings.Fields(out), " "), note) {
		t.Errorf("output:\n%s", out)
	}
	out, errOut, code = runCLI(t, "", append(args, "--json")...)
	var rep struct {
		Notes []string `json:"notes"`
		Bound struct {
			Notes []string `json:"notes"`
		} `json:"bound"`
	}
	if code != exitOK || json.Unmarshal([]byte(out), &rep) != nil {
		t.Fatalf("--json: exit %d: %s%s", code, out, errOut)
	}
	if len(rep.Notes) == 0 || !strings.HasPrefix(rep.Notes[0], note) || len(rep.Bound.Notes) != 1 || !strings.HasPrefix(rep.Bound.Notes[0], note) {
		t.Errorf("--json notes %q, bound notes %q; want both to start with %q", rep.Notes, rep.Bound.Notes, note)
	}
}

// TestEstimateJSONError checks that --json prints an error object too.
func TestEstimateJSONError(t *testing.T) {
	out, _, code := runCLI(t, "", "estimate", "x^2+y^2", "--box", "z=1", "--json")
	var rep map[string]any
	if code != exitFailed || json.Unmarshal([]byte(out), &rep) != nil || !strings.Contains(fmt.Sprint(rep["error"]), "not a variable") {
		t.Errorf("exit %d, output %q", code, out)
	}
}

// TestEstimateNegativeAtShiftedPoint checks that a K negative in the box
// around a point other than the origin is reported in both coordinates.
func TestEstimateNegativeAtShiftedPoint(t *testing.T) {
	_, errOut, code := runCLI(t, "", "estimate", "(x-1)^2*(3-2*x)+y^2", "--at", "x=1", "--runs", "2", "--live", "10")
	if code != exitFailed || !strings.Contains(errOut, "offsets x=") {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	// The point printed is 1 + the offset, and K is negative there.
	var x, u float64
	if _, err := fmt.Sscanf(errOut[strings.Index(errOut, "K(x="):], "K(x=%g", &x); err != nil {
		t.Fatal(err)
	}
	if _, err := fmt.Sscanf(errOut[strings.Index(errOut, "offsets x="):], "offsets x=%g", &u); err != nil {
		t.Fatal(err)
	}
	if math.Abs(x-(1+u)) > 1e-5 || x <= 1.5 {
		t.Errorf("point x = %g, offset %g: K = (x−1)²(3−2x) + y² is negative only for x > 3/2", x, u)
	}
}

func TestParseBox(t *testing.T) {
	vars := []string{"x", "y", "z"}
	tests := []struct {
		spec         string
		lower, upper []float64
	}{
		{"", []float64{-1, -1, -1}, []float64{1, 1, 1}},
		{"-1:1", []float64{-1, -1, -1}, []float64{1, 1, 1}},
		{"0.5", []float64{-0.5, -0.5, -0.5}, []float64{0.5, 0.5, 0.5}},
		{"x=0:1", []float64{0, -1, -1}, []float64{1, 1, 1}},
		{"x=0:1, y = 1/4 ,2", []float64{0, -0.25, -2}, []float64{1, 0.25, 2}},
		{"z=-3:0,-1/2:1e-1", []float64{-0.5, -0.5, -3}, []float64{0.1, 0.1, 0}},
	}
	for _, tc := range tests {
		lo, hi, err := parseBox(tc.spec, vars)
		if err != nil {
			t.Errorf("%q: %v", tc.spec, err)
			continue
		}
		if !slices.Equal(lo, tc.lower) || !slices.Equal(hi, tc.upper) {
			t.Errorf("%q: %v %v, want %v %v", tc.spec, lo, hi, tc.lower, tc.upper)
		}
	}
	for _, bad := range []string{"x", "x=", ":", "1:", "a:1", "x=1:2", "w=1", "1:1", "-1", "x=0:1,x=0:1", "1,1", ",", "1e400", "x=1:0"} {
		if _, _, err := parseBox(bad, vars); err == nil {
			t.Errorf("%q: no error", bad)
		}
	}
}

// FuzzParseBox checks that any --box value gives an error or a box that
// contains the point.
func FuzzParseBox(f *testing.F) {
	for _, s := range []string{"", "-1:1", "x=0:1,y=-1:1", "0.5", "x=1/2", "y=-1e-3:2,3", "x=:", "==,"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		lo, hi, err := parseBox(s, []string{"x", "y"})
		if err != nil {
			return
		}
		for i := range lo {
			if !(lo[i] <= 0 && 0 <= hi[i] && lo[i] < hi[i]) || math.IsInf(lo[i], 0) || math.IsInf(hi[i], 0) {
				t.Errorf("%q: range %d is [%g, %g]", s, i, lo[i], hi[i])
			}
		}
	})
}

// TestProgress checks the progress line with a fake clock: nothing in the
// first second, then a line per new percentage, cleared at the end; nothing
// at all when stderr is not a terminal.
func TestProgress(t *testing.T) {
	var b bytes.Buffer
	now := time.Unix(0, 0)
	p := newProgress(&env{stderr: &b, stderrTerminal: true})
	p.start, p.now = now, func() time.Time { return now }
	p.update(100, 1000)
	if b.Len() != 0 {
		t.Fatalf("printed within the first second: %q", b.String())
	}
	now = now.Add(1500 * time.Millisecond)
	p.update(370, 1000)
	p.update(371, 1000) // the same percentage
	p.update(500, 1000)
	p.finish()
	want := "\rlctkit estimate:  37% after 2 s\rlctkit estimate:  50% after 2 s\r\033[K"
	if b.String() != want {
		t.Errorf("got %q, want %q", b.String(), want)
	}
	var quiet bytes.Buffer
	q := newProgress(&env{stderr: &quiet})
	q.update(1, 2)
	q.finish()
	if quiet.Len() != 0 {
		t.Errorf("printed to a non-terminal: %q", quiet.String())
	}
}

// TestEstimateProgressOnTerminal runs an estimate with a terminal stderr and
// checks that the output is the same as without one.
func TestEstimateProgressOnTerminal(t *testing.T) {
	args := []string{"estimate", "x^2+y^2", "--live", "20", "--runs", "2"}
	var out, errOut bytes.Buffer
	if code := run(args, &env{stdout: &out, stderr: &errOut, stderrTerminal: true}); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut.String())
	}
	plain, _, _ := runCLI(t, "", args...)
	if out.String() != plain {
		t.Error("the output depends on whether stderr is a terminal")
	}
}

// TestEstimateRenders draws a plot, renders it with a headless Chromium and
// checks that the screenshot shows the blue points, the vermillion fit and
// dark text. It skips when Chromium is absent, and in -short mode.
func TestEstimateRenders(t *testing.T) {
	if testing.Short() {
		t.Skip("rendering with Chromium is slow; skipped in -short mode")
	}
	dir := t.TempDir()
	file := filepath.Join(dir, "curve.svg")
	if _, errOut, code := runCLI(t, "", append([]string{"estimate", "x^2*y^2", "--svg", file}, quick...)...); code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	height := attrFloat(t, parseSVG(t, data)[0], "height")
	img := screenshot(t, file, curveWidth, int(math.Ceil(height)))
	near := func(r, g, b uint32, hex string) bool {
		want, _ := strconv.ParseUint(hex[1:], 16, 32)
		d := func(a uint32, b uint64) float64 { return math.Abs(float64(a) - float64(b)) }
		return d(r, want>>16) < 40 && d(g, want>>8&0xff) < 40 && d(b, want&0xff) < 40
	}
	var blue, vermillion, dark int
	bounds := img.Bounds()
	for y := bounds.Min.Y; y < bounds.Max.Y; y++ {
		for x := bounds.Min.X; x < bounds.Max.X; x++ {
			r, g, b, _ := img.At(x, y).RGBA()
			r, g, b = r>>8, g>>8, b>>8
			switch {
			case near(r, g, b, svg.ColorBlue):
				blue++
			case near(r, g, b, svg.ColorVermillion):
				vermillion++
			case r < 80 && g < 80 && b < 80:
				dark++
			}
		}
	}
	t.Logf("%dx%d: %d blue, %d vermillion, %d dark pixels", bounds.Dx(), bounds.Dy(), blue, vermillion, dark)
	// 25 markers of radius 3.8 with error bars, a 2.2 px curve across the
	// plot, and the text: generous lower limits.
	if blue < 400 || vermillion < 300 || dark < 3000 {
		t.Errorf("the screenshot does not show the plot: %d blue, %d vermillion, %d dark pixels", blue, vermillion, dark)
	}
}

// TestEstimateDocsPictures checks the example plots committed under
// docs/estimate (written by the commands in the README there): well-formed,
// finite, 600 px wide, with the parts of the plot.
func TestEstimateDocsPictures(t *testing.T) {
	files, err := filepath.Glob("../../docs/estimate/*.svg")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) == 0 {
		t.Fatal("no example plots in docs/estimate")
	}
	for _, file := range files {
		data, err := os.ReadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		els := parseSVG(t, data)
		if err := checkFinite(els); err != nil {
			t.Errorf("%s: non-finite coordinate %v", file, err)
		}
		if w := attrFloat(t, els[0], "width"); w != curveWidth {
			t.Errorf("%s: width %g", file, w)
		}
		for _, class := range []string{"point", "error-bar", "fit", "bound", "bound-label", "legend", "x-axis-label", "y-axis-label"} {
			if len(byClass(els, class)) == 0 {
				t.Errorf("%s: no element of class %q", file, class)
			}
		}
	}
}
