package main

import (
	"fmt"
	"io"
	"math"
	"math/big"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/internal/svg"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/estimate"
)

// estimateResult is everything the estimate command prints, as text, JSON
// or a plot.
type estimateResult struct {
	title        string // "K = …" as the user wrote it
	note         string // says that the bundled example is estimated (text only)
	vars         []string
	point        []*big.Rat // w*, zeros at the origin
	lower, upper []float64
	prior        []float64 // as sampled, in the translated coordinates
	est          *estimate.Result
	seed         uint64
	bound        *rlct.Result // nil when it could not be computed
	boundErr     error
	verdict      *estimate.Comparison // nil without a bound
	truncated    bool
	order        int
	priorNotes   []string // prior exponents that do not count at the point (rlct.Local.Notes)
}

// estimateCaution is the warning printed with every estimate.
const estimateCaution = "The error bars are statistical only. The asymptotic regime may need very large n " +
	"when the singularity is bad, and the error bars do not cover that bias."

// boundStatus names the status of the bound in words.
func boundStatus(r *rlct.Result) string {
	return statusWord(r.Status)
}

// verdictText is the plain verdict: the library's wording, or why there is
// none.
func (r *estimateResult) verdictText() string {
	if r.verdict == nil {
		return "no Newton bound to compare with"
	}
	return r.verdict.Text
}

// maxZeroNotes is the number of other zeros described in the notes; the
// JSON lists them all.
const maxZeroNotes = 5

// notes lists remarks that qualify the estimate and the verdict: prior
// exponents that do not count at the point, a truncated series, θ̂ below 1,
// other zeros of K in the box.
func (r *estimateResult) notes() []string {
	out := append([]string(nil), r.priorNotes...)
	if r.truncated {
		n := fmt.Sprintf("K is a power series cut at degree %d; the estimate is for the truncated polynomial on the box, a proxy for the full function", r.order)
		if r.bound != nil && r.bound.Status == rlct.Exact {
			n += " (the bound certifies that the omitted terms change neither λ nor θ)"
		} else {
			n += " (the omitted terms are not certified harmless, so the estimate need not apply to the full function)"
		}
		out = append(out, n)
	}
	if n := r.thetaNote(); n != "" {
		out = append(out, n)
	}
	for i, z := range r.est.OtherZeros {
		if i == maxZeroNotes {
			out = append(out, fmt.Sprintf("K is near 0 in %d more places away from the point (see --json)", len(r.est.OtherZeros)-maxZeroNotes))
			break
		}
		out = append(out, r.zeroNote(z))
	}
	return out
}

// thetaNote says what θ̂ < 1 means, or is empty when θ̂ ≥ 1.
func (r *estimateResult) thetaNote() string {
	e := r.est
	if !(e.Theta < 1) {
		return ""
	}
	n := fmt.Sprintf("θ̂ = %s is below 1, which a multiplicity cannot be (θ ≥ 1)", plusMinus(e.Theta, e.ThetaSE))
	if e.Theta+3*e.ThetaSE >= 1 {
		return n + "; it is within 3 standard errors of 1, so read it as θ = 1"
	}
	return n + ", by more than 3 standard errors: the fit is biased and θ̂ means nothing here " +
		"(check that the points follow the fit; raise --start or shrink --box)"
}

// zeroNote describes another zero of K met by the sampler, in the
// coordinates of K.
func (r *estimateResult) zeroNote(z estimate.Zero) string {
	n := fmt.Sprintf("K is near 0 also away from the point, at %s (%.0f%% of the final live points, K ≤ %.2g there): "+
		"the estimate is for all the zeros of K in the box, the smallest λ among them, not for the point alone; shrink --box to leave it out",
		r.zeroPlace(z), 100*z.Share, z.MaxK)
	if z.Share > 0.5 {
		n += "; most of the final live points are there, so the estimate describes that zero rather than the point"
	}
	return n
}

// zeroPlace writes where a zero lies, in the coordinates of K: a value per
// variable, or the range its points cover where that exceeds 1% of the box.
func (r *estimateResult) zeroPlace(z estimate.Zero) string {
	at, lo, hi := r.shifted(z.At), r.shifted(z.Lower), r.shifted(z.Upper)
	parts := make([]string, len(r.vars))
	for i, v := range r.vars {
		width := r.upper[i] - r.lower[i]
		if z.Upper[i]-z.Lower[i] > 0.01*width {
			parts[i] = fmt.Sprintf("%s ∈ [%s, %s]", v, roundTo(lo[i], width), roundTo(hi[i], width))
		} else {
			parts[i] = fmt.Sprintf("%s ≈ %s", v, roundTo(at[i], width))
		}
	}
	return strings.Join(parts, ", ")
}

// roundTo writes x to a thousandth of width, without trailing zeros.
func roundTo(x, width float64) string {
	dec := max(0, int(-math.Floor(math.Log10(width/1000))))
	t := strconv.FormatFloat(x, 'f', dec, 64)
	if strings.Contains(t, ".") {
		t = strings.TrimRight(strings.TrimRight(t, "0"), ".")
	}
	if t == "-0" {
		t = "0"
	}
	return t
}

// shifted returns offsets from the point in the coordinates of K.
func (r *estimateResult) shifted(offsets []float64) []float64 {
	out := make([]float64, len(offsets))
	for i, x := range offsets {
		out[i] = x
		if r.point != nil {
			f, _ := r.point[i].Float64()
			out[i] += f
		}
	}
	return out
}

// writeText prints the plain-text answer.
func (r *estimateResult) writeText(w io.Writer) {
	if r.note != "" {
		fmt.Fprintln(w, r.note)
	}
	e := r.est
	fmt.Fprintln(w, "Numerical ESTIMATE by nested sampling, not a proof.")
	for _, l := range svg.Wrap(estimateCaution, 78) {
		fmt.Fprintln(w, "  "+l)
	}
	fmt.Fprintln(w)
	where := "at the origin"
	if r.point != nil && !allZero(r.point) {
		where = "at " + pointString(r.vars, r.point)
	}
	fmt.Fprintf(w, "%s %s\n", r.title, where)
	fmt.Fprintf(w, "box (offsets from the point): %s\n", boxString(r.vars, r.lower, r.upper))
	fmt.Fprintf(w, "prior: %s\n", priorString(r.vars, r.prior))
	fmt.Fprintf(w, "sampling: %d live points × %d runs, seed %d, %d evaluations of K\n\n", e.Live, e.Runs, r.seed, e.Evaluations)

	dec := tableDecimals(e.Points)
	fmt.Fprintf(w, "%12s  %10s  %*s  %10s\n", "n", "n·E_n[K]", dec+6, "± se", "fit")
	for _, pt := range e.Points {
		fmt.Fprintf(w, "%12.4g  %10.*f  %*s  %10.*f\n", pt.N, dec, pt.Y, dec+6, "± "+strconv.FormatFloat(pt.SE, 'f', dec, 64), dec, e.Curve(pt.N))
	}
	fmt.Fprintf(w, "(n in the units of K; fit = λ̂ − (θ̂−1)/(log n + b) with b = %.3f)\n\n", e.Offset)

	fmt.Fprintf(w, "estimate:      λ̂ = %s   θ̂ = %s\n", plusMinus(e.Lambda, e.LambdaSE), plusMinus(e.Theta, e.ThetaSE))
	if r.bound != nil {
		value := r.bound.Lambda.RatString()
		if !r.bound.Lambda.IsInt() {
			l, _ := r.bound.Lambda.Float64()
			value += fmt.Sprintf(" (%.4g)", l)
		}
		fmt.Fprintf(w, "Newton bound:  λ = %s   θ = %d   (%s)\n", value, r.bound.Theta, boundStatus(r.bound))
	} else {
		fmt.Fprintf(w, "Newton bound:  not available: %v\n", r.boundErr)
	}
	fmt.Fprintf(w, "verdict: %s\n", r.verdictText())
	for _, n := range r.notes() {
		for i, l := range svg.Wrap("note: "+n, 78) {
			if i > 0 {
				l = "  " + l
			}
			fmt.Fprintln(w, l)
		}
	}
}

// tableDecimals gives the decimals for the table: enough for two
// significant digits of the smallest standard error, between 2 and 6.
func tableDecimals(pts []estimate.CurvePoint) int {
	small := math.Inf(1)
	for _, p := range pts {
		if p.SE > 0 && p.SE < small {
			small = p.SE
		}
	}
	if math.IsInf(small, 1) {
		return 4
	}
	return min(max(1-int(math.Floor(math.Log10(small))), 2), 6)
}

// plusMinus writes x ± se with se to two significant digits and x to the
// same decimal place.
func plusMinus(x, se float64) string {
	if !(se > 0) || math.IsInf(se, 0) {
		return fmt.Sprintf("%.4f ± %g", x, se)
	}
	dec := min(max(1-int(math.Floor(math.Log10(se))), 0), 8)
	return fmt.Sprintf("%.*f ± %.*f", dec, x, dec, se)
}

func boxString(vars []string, lower, upper []float64) string {
	parts := make([]string, len(vars))
	for i, v := range vars {
		parts[i] = fmt.Sprintf("%s ∈ [%g, %g]", v, lower[i], upper[i])
	}
	return strings.Join(parts, ", ")
}

func priorString(vars []string, prior []float64) string {
	var parts []string
	for i, h := range prior {
		if h != 0 {
			parts = append(parts, fmt.Sprintf("|%s|^%g", vars[i], h))
		}
	}
	if parts == nil {
		return "uniform"
	}
	return "proportional to " + strings.Join(parts, "·")
}

// jsonFloat is a float64 that encodes NaN and ±Inf as null, which JSON
// cannot hold otherwise.
type jsonFloat float64

// MarshalJSON implements json.Marshaler.
func (f jsonFloat) MarshalJSON() ([]byte, error) {
	x := float64(f)
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return []byte("null"), nil
	}
	return strconv.AppendFloat(nil, x, 'g', -1, 64), nil
}

func jsonFloats(xs []float64) []jsonFloat {
	out := make([]jsonFloat, len(xs))
	for i, x := range xs {
		out[i] = jsonFloat(x)
	}
	return out
}

// estimatePointJSON is one row of the table.
type estimatePointJSON struct {
	N   jsonFloat `json:"n"`
	Y   jsonFloat `json:"y"`
	SE  jsonFloat `json:"se"`
	Fit jsonFloat `json:"fit"`
}

// estimateJSON is the --json output. The bound is the object printed by
// `lctkit bound --json`.
type estimateJSON struct {
	Estimate    string              `json:"estimate"`
	LambdaHat   jsonFloat           `json:"lambda_hat"`
	LambdaSE    jsonFloat           `json:"lambda_se"`
	ThetaHat    jsonFloat           `json:"theta_hat"`
	ThetaSE     jsonFloat           `json:"theta_se"`
	Offset      jsonFloat           `json:"offset"`
	Points      []estimatePointJSON `json:"points"`
	Bound       result              `json:"bound"`
	Verdict     string              `json:"verdict"`
	Consistent  *bool               `json:"consistent,omitempty"`
	Sigmas      *jsonFloat          `json:"sigmas,omitempty"`
	Notes       []string            `json:"notes,omitempty"`
	ThetaBelow1 bool                `json:"theta_below_one,omitempty"`
	OtherZeros  []otherZeroJSON     `json:"other_zeros,omitempty"`
	Variables   []string            `json:"variables"`
	BoxLower    []jsonFloat         `json:"box_lower"`
	BoxUpper    []jsonFloat         `json:"box_upper"`
	Prior       []jsonFloat         `json:"prior"`
	Live        int                 `json:"live"`
	Runs        int                 `json:"runs"`
	Seed        uint64              `json:"seed"`
	Evaluations int64               `json:"evaluations"`
}

// otherZeroJSON is another zero of K met by the sampler (estimate.Zero),
// in the coordinates of K, and as offsets from the point.
type otherZeroJSON struct {
	At      []jsonFloat `json:"at"`
	Offsets []jsonFloat `json:"offsets"`
	Lower   []jsonFloat `json:"lower"`
	Upper   []jsonFloat `json:"upper"`
	MaxK    jsonFloat   `json:"k_max"`
	Share   jsonFloat   `json:"share"`
}

// MarshalJSON writes the JSON form.
func (r *estimateResult) MarshalJSON() ([]byte, error) { return encodeJSON(r.jsonForm()) }

// jsonForm returns the JSON form.
func (r *estimateResult) jsonForm() *estimateJSON {
	e := r.est
	out := &estimateJSON{
		Estimate:  "numerical estimate by nested sampling, not a proof; " + estimateCaution,
		LambdaHat: jsonFloat(e.Lambda), LambdaSE: jsonFloat(e.LambdaSE),
		ThetaHat: jsonFloat(e.Theta), ThetaSE: jsonFloat(e.ThetaSE), Offset: jsonFloat(e.Offset),
		Verdict: r.verdictText(), Notes: r.notes(),
		Variables: r.vars, BoxLower: jsonFloats(r.lower), BoxUpper: jsonFloats(r.upper), Prior: jsonFloats(r.prior),
		Live: e.Live, Runs: e.Runs, Seed: r.seed, Evaluations: e.Evaluations,
	}
	for _, p := range e.Points {
		out.Points = append(out.Points, estimatePointJSON{jsonFloat(p.N), jsonFloat(p.Y), jsonFloat(p.SE), jsonFloat(e.Curve(p.N))})
	}
	out.ThetaBelow1 = e.Theta < 1
	for _, z := range e.OtherZeros {
		out.OtherZeros = append(out.OtherZeros, otherZeroJSON{
			At: jsonFloats(r.shifted(z.At)), Offsets: jsonFloats(z.At),
			Lower: jsonFloats(r.shifted(z.Lower)), Upper: jsonFloats(r.shifted(z.Upper)),
			MaxK: jsonFloat(z.MaxK), Share: jsonFloat(z.Share),
		})
	}
	if r.bound != nil {
		out.Bound = result{Result: r.bound}
	} else {
		out.Bound = result{Error: r.boundErr.Error()}
	}
	if r.verdict != nil {
		c, s := r.verdict.Consistent, jsonFloat(r.verdict.Sigmas)
		out.Consistent, out.Sigmas = &c, &s
	}
	return out
}
