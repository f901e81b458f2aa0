package main

import (
	"encoding/json"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	shot "github.com/lctkit/lctkit/internal/screenshot"
)

// handTable is the two-model case worked by hand (the same as
// TestSensitivityByHand in rlct/sbic): at n = 100, small (d = 0, ℓ = 0) and
// big (d = 4, ℓ = 2·log 100 − log 2, so L'_big,big = 1/2), with the pair
// (big, small) an upper bound λ = 1/2: L'_big,small = 100^1.5/2 = 500 and
// x² + x/2 − 500 = 0 gives L'(big) = (−1 + √8001)/4 ≈ 22.11, so sBIC
// chooses big while the BIC, log 1/2 < 0, chooses small. Replaced by the
// regular value λ = 2 the pair gives L'(big) = 1/2 and the choice changes;
// replaced by the estimate λ = 1, L'(big) = (−1 + √801)/4 and it does not.
var handTable = fmt.Sprintf(`# worked by hand
n 100
model small dim 0 loglik 0
model big   dim 4 loglik %.17g
order small <= big
pair small small lambda 0 status exact
pair big big regular status exact
pair big small lambda 1/2 status upper-bound estimate 1 1 source "a bound"
`, 2*math.Log(100)-math.Log(2))

func writeTemp(t *testing.T, name, content string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(path, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func TestChooseByHand(t *testing.T) {
	path := writeTemp(t, "hand.txt", handTable)
	out, errOut, code := runCLI(t, "", "choose", path)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	sbicBig := math.Log((-1 + math.Sqrt(8001)) / 4)
	bicBig := math.Log(0.5)
	for _, want := range []string{
		fmt.Sprintf("%.4f", sbicBig),
		fmt.Sprintf("%.4f", bicBig),
		"chosen by BIC:  small",
		"chosen by sBIC: big",
		"a bound",
		"the sBIC of big rests on it",
		"replaced by the regular value λ = 2, θ = 1: sBIC big " + fmt.Sprintf("%.4f", bicBig) + "; sBIC chooses small instead: THE CHOICE CHANGES",
		"replaced by the estimate λ = 1, θ = 1: sBIC big " + fmt.Sprintf("%.4f", math.Log((-1+math.Sqrt(801))/4)) + "; sBIC still chooses big",
		"upper bound",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("text lacks %q:\n%s", want, out)
		}
	}
	js, _, code := runCLI(t, "", "choose", path, "--json")
	if code != exitOK {
		t.Fatalf("--json: exit %d", code)
	}
	var rep struct {
		N      float64 `json:"n"`
		Models []struct {
			Name    string  `json:"name"`
			SBIC    float64 `json:"sbic"`
			BIC     float64 `json:"bic"`
			Weight  float64 `json:"weight_sbic"`
			Status  string  `json:"pairs_status"`
			RestsOn []struct {
				Model, Truth string
			} `json:"rests_on"`
		} `json:"models"`
		ChosenBIC  struct{ Model string } `json:"chosen_bic"`
		ChosenSBIC struct{ Model string } `json:"chosen_sbic"`
		Pairs      []struct {
			Lambda string `json:"lambda"`
			Status string `json:"status"`
			Note   string `json:"note"`
		} `json:"pairs"`
		Sensitivity []struct {
			Affects []string `json:"affects"`
			Regular struct {
				Changed bool                   `json:"choice_changed"`
				Chosen  struct{ Model string } `json:"chosen_sbic"`
			} `json:"regular"`
			Estimate *struct {
				Changed bool `json:"choice_changed"`
			} `json:"estimate"`
		} `json:"sensitivity"`
	}
	if err := json.Unmarshal([]byte(js), &rep); err != nil {
		t.Fatal(err)
	}
	if rep.N != 100 || len(rep.Models) != 2 || math.Abs(rep.Models[1].SBIC-sbicBig) > 1e-12 || math.Abs(rep.Models[1].BIC-bicBig) > 1e-12 {
		t.Errorf("models %+v", rep.Models)
	}
	// Weights: 1 and (−1 + √8001)/4, normalised.
	if w := 1 / (1 + (-1+math.Sqrt(8001))/4); math.Abs(rep.Models[0].Weight-w) > 1e-12 {
		t.Errorf("weight of small %g, want %g", rep.Models[0].Weight, w)
	}
	if rep.ChosenBIC.Model != "small" || rep.ChosenSBIC.Model != "big" {
		t.Errorf("chosen %v, %v", rep.ChosenBIC, rep.ChosenSBIC)
	}
	if rep.Models[1].Status != "upper-bound" || len(rep.Models[1].RestsOn) != 1 || rep.Models[1].RestsOn[0].Truth != "small" || rep.Models[0].Status != "exact" {
		t.Errorf("statuses %+v", rep.Models)
	}
	if rep.Pairs[2].Lambda != "1/2" || rep.Pairs[2].Status != "upper-bound" || rep.Pairs[2].Note == "" || rep.Pairs[0].Note != "" {
		t.Errorf("pairs %+v", rep.Pairs)
	}
	if len(rep.Sensitivity) != 1 || !rep.Sensitivity[0].Regular.Changed || rep.Sensitivity[0].Regular.Chosen.Model != "small" ||
		rep.Sensitivity[0].Estimate == nil || rep.Sensitivity[0].Estimate.Changed || strings.Join(rep.Sensitivity[0].Affects, ",") != "big" {
		t.Errorf("sensitivity %+v", rep.Sensitivity)
	}
}

// The same table in JSON, from standard input, gives the same text.
func TestChooseJSONFormStdin(t *testing.T) {
	js := fmt.Sprintf(`{"n": 100,
	"models": [{"name": "small", "dim": 0, "loglik": 0}, {"name": "big", "dim": 4, "loglik": %.17g}],
	"order": [["small", "big"]],
	"pairs": [{"model": "small", "truth": "small", "lambda": 0, "status": "exact"},
	          {"model": "big", "truth": "big", "regular": true, "status": "exact"},
	          {"model": "big", "truth": "small", "lambda": "1/2", "status": "upper-bound", "estimate": {"lambda": 1, "theta": 1}, "source": "a bound"}]}`,
		2*math.Log(100)-math.Log(2))
	fromJSON, errOut, code := runCLI(t, js, "choose", "-")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	fromText, _, _ := runCLI(t, "", "choose", writeTemp(t, "hand.txt", handTable))
	if fromJSON != fromText {
		t.Errorf("JSON form:\n%s\ntext form:\n%s", fromJSON, fromText)
	}
}

// TestChooseExample runs the command of examples/sensor-rank and compares
// it with the golden files there. The golden files are a regression
// record; the numbers are checked here independently: the BIC is
// ℓ − (d/2)·log n (Schwarz 1978), and every sBIC satisfies the fixed-point
// equation (1) of the package documentation of rlct/sbic, L'(M_i) =
// Σ_{j⪯i} L'_ij·L'(M_j) / Σ_{j⪯i} L'(M_j) for uniform priors (Drton & Plummer
// 2017, from memory), evaluated here directly from the printed pairs.
func TestChooseExample(t *testing.T) {
	dir := "../../examples/sensor-rank"
	table := filepath.Join(dir, "candidates.txt")
	svg := filepath.Join(t.TempDir(), "scores.svg")
	out, errOut, code := runCLI(t, "", "choose", table, "--svg", svg)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	checkGolden(t, filepath.Join(dir, "expected.txt"), out)
	pic, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	checkGolden(t, filepath.Join(dir, "scores.svg"), string(pic))
	checkXML(t, string(pic))

	js, _, _ := runCLI(t, "", "choose", table, "--json")
	var rep struct {
		N      float64 `json:"n"`
		Models []struct {
			Name   string  `json:"name"`
			Dim    int     `json:"dim"`
			LogLik float64 `json:"loglik"`
			BIC    float64 `json:"bic"`
			SBIC   float64 `json:"sbic"`
		} `json:"models"`
		Pairs []struct {
			Model, Truth, Lambda string
			Theta                int
		} `json:"pairs"`
	}
	if err := json.Unmarshal([]byte(js), &rep); err != nil {
		t.Fatal(err)
	}
	index := map[string]int{}
	for i, m := range rep.Models {
		index[m.Name] = i
		if bic := m.LogLik - float64(m.Dim)/2*math.Log(rep.N); math.Abs(bic-m.BIC) > 1e-9 {
			t.Errorf("%s: BIC %.10g, want %.10g", m.Name, m.BIC, bic)
		}
	}
	// log L'_ij, shifted by the first model's log-likelihood.
	shift := rep.Models[0].LogLik
	logL := map[[2]int]float64{}
	for _, p := range rep.Pairs {
		var num, den float64 = 0, 1
		if _, err := fmt.Sscanf(p.Lambda, "%g/%g", &num, &den); err != nil {
			fmt.Sscanf(p.Lambda, "%g", &num)
		}
		i, j := index[p.Model], index[p.Truth]
		logL[[2]int{i, j}] = rep.Models[i].LogLik - shift - num/den*math.Log(rep.N) + float64(p.Theta-1)*math.Log(math.Log(rep.N))
	}
	// The example is a chain rank0 ⪯ rank1 ⪯ rank2 ⪯ rank3.
	for i := range rep.Models {
		x := math.Exp(rep.Models[i].SBIC - shift)
		num, den := 0.0, 0.0
		for j := 0; j <= i; j++ {
			lj := math.Exp(rep.Models[j].SBIC - shift)
			num += math.Exp(logL[[2]int{i, j}]) * lj
			den += lj
		}
		if math.Abs(num/den-x) > 1e-9*x {
			t.Errorf("%s: L' = %.12g but the right side of (1) is %.12g", rep.Models[i].Name, x, num/den)
		}
	}
}

// checkXML fails unless s is well-formed XML.
func checkXML(t *testing.T, s string) {
	t.Helper()
	dec := xml.NewDecoder(strings.NewReader(s))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Fatalf("the SVG is not well-formed: %v", err)
		}
	}
}

// TestChoosePicture: the picture marks the scores that rest on a bound or
// on a value that is not a bound, draws a score far below the others at the
// edge with its value, and rings the choices.
func TestChoosePicture(t *testing.T) {
	src := `n 1000
model a dim 1 loglik -900
model b dim 2 loglik -500
model c dim 4 loglik -497
order a <= b <= c
pair a a regular status exact
pair b b regular status exact
pair c c regular status exact
pair b a lambda 1/2 status upper-bound
pair c a lambda 1 status exact
pair c b lambda 3/2 status uncertified
`
	svg := filepath.Join(t.TempDir(), "p.svg")
	_, errOut, code := runCLI(t, "", "choose", writeTemp(t, "p.txt", src), "--svg", svg)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	b, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	pic := string(b)
	checkXML(t, pic)
	for _, want := range []string{
		`class="marker-sbic-bound"`,    // b rests on an upper bound
		`class="marker-sbic-notbound"`, // c rests on a value that is not a bound
		`class="marker-sbic-clipped"`,  // a lies about 400 nats below
		`class="clipped-label"`,        // with its value
		`class="choice-sbic"`,          // the rings
		`class="choice-bic"`,
		"NOT A BOUND", "upper bound", // the legend
		"#D55E00", "#0072B2", `stroke-dasharray="7 4"`, // colour and line style
	} {
		if !strings.Contains(pic, want) {
			t.Errorf("picture lacks %s", want)
		}
	}
}

// TestChooseErrors: bad input exits 1 (2 for a bad flag value) with a
// message that names the problem; with --json it also prints an error
// object.
func TestChooseErrors(t *testing.T) {
	base := "n 10\nmodel a dim 1 loglik -3\nmodel b dim 2 loglik -2\n"
	pairs := "pair a a regular status exact\npair b b regular status exact\n"
	tests := []struct {
		name  string
		table string
		args  []string
		code  int
		want  []string
	}{
		{"cycle", base + "order a <= b\norder b <= a\n" + pairs + "pair b a lambda 1 status exact", nil, exitFailed, []string{`the order has a cycle: "a" ⪯ "b" ⪯ "a"`}},
		{"missing pair", base + "order a <= b\n" + pairs, nil, exitFailed, []string{`no pair for model "b" at a truth in "a"`}},
		{"no sample size", "model a dim 1 loglik 0\npair a a regular status exact", nil, exitFailed, []string{"no sample size"}},
		{"bad --n", base + pairs, []string{"--n", "2"}, exitUsage, []string{"--n", "greater than e"}},
		{"syntax", base + "pair a a lambda", nil, exitFailed, []string{"line 4", "expected the value of lambda, found the end of the line"}},
		{"expression", base + "order a <= b\n" + pairs + `pair b a k "x^2 + * y"`, nil, exitFailed, []string{"line 7", `pair "b" at "a"`, "  k: x^2 + * y", "        ^"}},
		{"series needs order", base + "order a <= b\n" + pairs + `pair b a k "x^2 + sin(y)^2" order 0`, nil, exitFailed, []string{"add order D to the pair"}},
	}
	for _, tt := range tests {
		path := writeTemp(t, "t.txt", tt.table)
		_, errOut, code := runCLI(t, "", append([]string{"choose", path}, tt.args...)...)
		if code != tt.code {
			t.Errorf("%s: exit %d, want %d (%s)", tt.name, code, tt.code, errOut)
		}
		for _, w := range tt.want {
			if !strings.Contains(errOut, w) {
				t.Errorf("%s: stderr lacks %q:\n%s", tt.name, w, errOut)
			}
		}
		if tt.code == exitFailed {
			out, _, _ := runCLI(t, "", append([]string{"choose", path, "--json"}, tt.args...)...)
			var obj map[string]any
			if err := json.Unmarshal([]byte(out), &obj); err != nil || obj["error"] == nil {
				t.Errorf("%s: --json printed %q", tt.name, out)
			}
		}
	}
	_, errOut, code := runCLI(t, "", "choose", filepath.Join(t.TempDir(), "absent.txt"))
	if code != exitFailed || !strings.Contains(errOut, "absent.txt") {
		t.Errorf("missing file: exit %d, %s", code, errOut)
	}
}

// TestChooseExtremeAndTies: n = 10^9 (through --n) with log-likelihoods of
// magnitude 10^7 gives finite scores; two identical unordered models tie,
// and the output says so; a single model is chosen by both.
func TestChooseExtremeAndTies(t *testing.T) {
	src := `n 50
model p dim 3 loglik -12345678.5
model q dim 3 loglik -12345678.5
model r dim 5 loglik -12345690
order p <= r
order q <= r
pair p p regular status exact
pair q q regular status exact
pair r r regular status exact
pair r p lambda 2 status exact
pair r q lambda 2 status exact
`
	out, errOut, code := runCLI(t, "", "choose", writeTemp(t, "x.txt", src), "--n", "1e9")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if strings.Contains(out, "NaN") || strings.Contains(out, "Inf") || !strings.Contains(out, "n = 1e+09") {
		t.Errorf("output:\n%s", out)
	}
	// BIC of p and q: −12345678.5 − 1.5·log 10^9, worked by hand.
	if want := fmt.Sprintf("%.4f", -12345678.5-1.5*math.Log(1e9)); !strings.Contains(out, want) {
		t.Errorf("output lacks the BIC %s:\n%s", want, out)
	}
	if !strings.Contains(out, "chosen by BIC:  p (tied within rounding with q") || !strings.Contains(out, "chosen by sBIC: p (tied within rounding with q") {
		t.Errorf("the tie is not reported:\n%s", out)
	}
	out, _, code = runCLI(t, "", "choose", writeTemp(t, "one.txt", "n 10\nmodel only dim 2 loglik -4\npair only only regular status exact\n"))
	if code != exitOK || !strings.Contains(out, "chosen by BIC:  only") || !strings.Contains(out, "chosen by sBIC: only") || !strings.Contains(out, "no model contains another") {
		t.Errorf("single model: exit %d\n%s", code, out)
	}
}

// TestChooseComputesPairs: a pair given by K is bounded by lctkit with the
// options of bound, and a series that is not certified is marked NOT A
// BOUND. K = s²(g1² + g2²) has λ = 1/2, θ = 1, exact (normal crossings,
// Watanabe 2009, ch. 2); the truncation of z² + x²·sin(y)² at degree 3
// drops x²y², so its value 1/2 is not a bound (as in TestStatusWords).
func TestChooseComputesPairs(t *testing.T) {
	src := `n 200
model a dim 1 loglik -100
model b dim 3 loglik -95
order a <= b
pair a a regular status exact
pair b b regular status exact
pair b a sos "s*g1; s*g2"
`
	out, errOut, code := runCLI(t, "", "choose", writeTemp(t, "c.txt", src))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "b at a  λ = 1/2  θ = 1  exact        computed by lctkit from K") {
		t.Errorf("computed pair:\n%s", out)
	}
	src = strings.Replace(src, `sos "s*g1; s*g2"`, `k "z^2 + x^2*sin(y)^2" order 3`, 1)
	out, errOut, code = runCLI(t, "", "choose", writeTemp(t, "c.txt", src))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"NOT A BOUND", "lctkit: not a bound", "the sBIC of b rests on it"} {
		if !strings.Contains(out, want) {
			t.Errorf("uncertified pair: output lacks %q:\n%s", want, out)
		}
	}
	js, _, _ := runCLI(t, "", "choose", writeTemp(t, "c.txt", src), "--json")
	if !strings.Contains(js, `"bounds":[{"model":"b","truth":"a","summary":"not a bound`) {
		t.Errorf("JSON lacks lctkit's summary: %s", js)
	}
}

// TestChooseReadme runs the table shown in the README's section on choose
// and checks that the output lines quoted there are what the command
// prints, so that the README stays true.
func TestChooseReadme(t *testing.T) {
	raw, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(raw)
	start := strings.Index(text, "### Choosing a model: `choose`")
	if start < 0 {
		t.Fatal("the README has no section on choose")
	}
	blocks := strings.Split(text[start:], "\n\n")
	var table, quoted []string
	for _, b := range blocks {
		if strings.HasPrefix(b, "    n ") && table == nil {
			table = strings.Split(b, "\n")
		}
		if strings.HasPrefix(b, "    $ lctkit choose") {
			quoted = strings.Split(b, "\n")[1:]
		}
	}
	if table == nil || quoted == nil {
		t.Fatal("the README's section on choose has no table or no output")
	}
	var src strings.Builder
	for _, l := range table {
		src.WriteString(strings.TrimPrefix(l, "    ") + "\n")
	}
	out, errOut, code := runCLI(t, "", "choose", writeTemp(t, "readme.txt", src.String()))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, l := range quoted {
		l = strings.TrimPrefix(l, "    ")
		if strings.TrimSpace(l) == "…" {
			continue
		}
		if !strings.Contains(out, l+"\n") {
			t.Errorf("the README quotes %q, which the command does not print:\n%s", l, out)
		}
	}
}

// TestChooseRenders renders the example's picture with a headless Chromium
// and checks that it shows both series: vermillion (sBIC) and blue (BIC)
// pixels, and dark text and axes. It skips when Chromium is not installed,
// and in -short mode.
func TestChooseRenders(t *testing.T) {
	path, err := filepath.Abs("../../examples/sensor-rank/scores.svg")
	if err != nil {
		t.Fatal(err)
	}
	img := shot.Take(t, path, choosePlotWidth, 620)
	b := img.Bounds()
	var vermillion, blue, dark, total int
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			r, g, bl = r>>8, g>>8, bl>>8
			total++
			switch {
			case r > 180 && g > 60 && g < 130 && bl < 60: // #D55E00
				vermillion++
			case bl > 140 && r < 60 && g > 80 && g < 150: // #0072B2
				blue++
			case r < 80 && g < 80 && bl < 80:
				dark++
			}
		}
	}
	for _, c := range []struct {
		name  string
		count int
		min   float64
	}{{"vermillion (sBIC)", vermillion, 0.002}, {"blue (BIC)", blue, 0.001}, {"dark (text, axes)", dark, 0.003}} {
		if frac := float64(c.count) / float64(total); frac < c.min {
			t.Errorf("only %.2f%% of the screenshot is %s", 100*frac, c.name)
		}
	}
	t.Logf("%.2f%% vermillion, %.2f%% blue, %.2f%% dark", 100*float64(vermillion)/float64(total), 100*float64(blue)/float64(total), 100*float64(dark)/float64(total))
}

// A pair given by a model description: a one-hidden-unit reduced-rank
// regression (3 inputs, 2 outputs, standard normal inputs) at the zero
// truth. K = ‖b·a‖²/(2σ²) up to the constant, and for H = 1 at the zero
// matrix λ = min(M, N)/2 = 1 (Aoyagi & Watanabe 2005, from memory; the
// same value as lctkit's certified rank-0 answers), θ = 1 for M ≠ N.
func TestChooseDescriptionPair(t *testing.T) {
	dir := t.TempDir()
	desc := `model one unit
kind regression
param b[2,1]
param a[1,3]
input x[3] ~ normal
noise 1
mean b*a*x
`
	if err := os.WriteFile(filepath.Join(dir, "unit.txt"), []byte(desc), 0o644); err != nil {
		t.Fatal(err)
	}
	table := `n 100
model zero dim 0 loglik -150
model unit dim 4 loglik -140
order zero <= unit
pair zero zero lambda 0 status exact
pair unit unit regular status exact
pair unit zero description "unit.txt"
`
	path := filepath.Join(dir, "table.txt")
	if err := os.WriteFile(path, []byte(table), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "", "choose", path)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "unit at zero  λ = 1  θ = 1  exact") || !strings.Contains(out, "model description unit.txt") {
		t.Errorf("description pair:\n%s", out)
	}
	// A missing file and a description with an error are reported with
	// the pair's line.
	bad := strings.Replace(table, `"unit.txt"`, `"nowhere.txt"`, 1)
	os.WriteFile(path, []byte(bad), 0o644)
	if _, errOut, code := runCLI(t, "", "choose", path); code == exitOK || !strings.Contains(errOut, "line 7") {
		t.Errorf("missing description: exit %d, %s", code, errOut)
	}
	os.WriteFile(filepath.Join(dir, "unit.txt"), []byte(strings.Replace(desc, "mean b*a*x", "mean b*a*", 1)), 0o644)
	os.WriteFile(path, []byte(table), 0o644)
	if _, errOut, code := runCLI(t, "", "choose", path); code == exitOK || !strings.Contains(errOut, "unit.txt:7:") {
		t.Errorf("bad description: exit %d, %s", code, errOut)
	}
	// A description with status or theta is refused by the table reader.
	os.WriteFile(path, []byte(strings.Replace(table, `description "unit.txt"`, `description "unit.txt" status exact`, 1)), 0o644)
	if _, errOut, code := runCLI(t, "", "choose", path); code == exitOK || !strings.Contains(errOut, "give none of status") {
		t.Errorf("description with status: exit %d, %s", code, errOut)
	}
}
