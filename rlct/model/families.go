package model

import (
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/rlct"
	"gonum.org/v1/gonum/mat"
)

// ErrFamily is wrapped by the errors of the constructors below for
// arguments that describe no model (a size below 1, a true rank above the
// hidden size, a design whose weights do not sum to 1, …). It matches
// rlct.ErrInput (see errors.Is).
var ErrFamily error = &familyErr{"model: bad arguments"}

// familyErr is the type of ErrFamily.
type familyErr struct{ msg string }

func (e *familyErr) Error() string        { return e.msg }
func (e *familyErr) Is(target error) bool { return target == rlct.ErrInput }

// familyError returns an error wrapping ErrFamily.
func familyError(format string, args ...any) error {
	return fmt.Errorf("%w: %s", ErrFamily, fmt.Sprintf(format, args...))
}

// ReducedRank describes reduced-rank regression y = B·A·x + ε with M inputs
// x ~ N(0, I_M), N outputs, H hidden units (B is N×H, A is H×M) and noise
// variance σ² = 1/2, at a truth of rank r: B* = [I_r 0; 0 0] and A* =
// [I_r 0; 0 0], so that the true map B*·A* has ones on the first r places
// of the diagonal. Then K(w) = ‖BA − B*A*‖² (Frobenius norm), and Aoyagi and
// Watanabe (2005, "Stochastic complexities of reduced rank regression in
// Bayesian estimation", Neural Networks 18) give its learning coefficient
// in closed form (package sbic has the formula, from memory). It returns an
// error wrapping ErrFamily unless M, N, H ≥ 1 and 0 ≤ r ≤ min(H, M, N).
func ReducedRank(m, n, h, r int) (*Description, error) {
	if m < 1 || n < 1 || h < 1 || r < 0 || r > min(h, m, n) || max(m, n, h) > maxShape {
		return nil, familyError("reduced rank regression needs M, N, H from 1 to %d and 0 ≤ r ≤ min(H, M, N), got M = %d, N = %d, H = %d, r = %d", maxShape, m, n, h, r)
	}
	truth := mat.NewDense(n, m, nil)
	for i := range r {
		truth.Set(i, i, 1)
	}
	return ReducedRankAt(h, truth)
}

// ReducedRankAt describes reduced-rank regression y = B·A·x + ε as
// ReducedRank does (x ~ N(0, I_M), σ² = 1/2, H hidden units), with the true
// map given as an N×M matrix C* whose rank must be at most H. Its entries
// are read exactly (every finite float64 is a rational), its rank r is found
// by exact Gaussian elimination, and C* = B*·A* is written with B* = [C*_P 0]
// (the r pivot columns of C*, then zeros) and A* = [R; 0] (the r non-zero rows
// of the reduced row echelon form of C*, then zeros). It returns an error
// wrapping ErrFamily for an entry that is not finite, a rank above H, or
// sizes out of range.
func ReducedRankAt(h int, truth mat.Matrix) (*Description, error) {
	n, m := truth.Dims()
	if m < 1 || n < 1 || h < 1 || max(m, n, h) > maxShape {
		return nil, familyError("reduced rank regression needs M, N, H from 1 to %d, got M = %d, N = %d, H = %d", maxShape, m, n, h)
	}
	c, err := exactMatrix(truth)
	if err != nil {
		return nil, err
	}
	bt, at, r := rankFactor(c, h)
	if r > h {
		return nil, familyError("the true map has rank %d, above H = %d", r, h)
	}
	var s strings.Builder
	fmt.Fprintf(&s, "model reduced rank regression, M = %d inputs, N = %d outputs, H = %d, true rank %d\n", m, n, h, r)
	s.WriteString("kind regression\n")
	fmt.Fprintf(&s, "param B[%d,%d], A[%d,%d]\n", n, h, h, m)
	fmt.Fprintf(&s, "input x[%d] ~ normal\nnoise 1/2\nmean B*A*x\n", m)
	if r > 0 {
		fmt.Fprintf(&s, "truth B = %s, A = %s\n", matrixText(bt), matrixText(at))
	}
	return parseFamily(s.String())
}

// DeepLinear describes a deep linear network y = W_L·…·W_1·x + ε with
// x ~ N(0, I_M) and σ² = 1/2: widths = [M, H_1, …, H_(L−1), N] gives W_l of
// size widths[l]×widths[l−1]. The true map is the N×M matrix truth (nil for
// zero), factored exactly as in ReducedRankAt through the layers (its rank
// must be at most every hidden width): W_1* = [A*; 0], the hidden layers
// [I_r 0; 0 0], W_L* = [B* 0]. K(w) = ‖W_L⋯W_1 − W*‖². Learning coefficients
// of such networks: Aoyagi (2024, "Consideration on the learning efficiency
// of multiple-layered neural networks with linear units", Neural Networks;
// from memory). It returns an error wrapping ErrFamily for fewer than two
// layers, a width out of range, or a true rank above a hidden width.
func DeepLinear(widths []int, truth mat.Matrix) (*Description, error) {
	if len(widths) < 3 {
		return nil, familyError("a deep linear network needs at least two layers (three widths), got %d widths", len(widths))
	}
	for _, w := range widths {
		if w < 1 || w > maxShape {
			return nil, familyError("widths must be from 1 to %d, got %v", maxShape, widths)
		}
	}
	m, n := widths[0], widths[len(widths)-1]
	hidden := widths[1 : len(widths)-1]
	var bt, at [][]*big.Rat
	r := 0
	if truth != nil {
		tn, tm := truth.Dims()
		if tn != n || tm != m {
			return nil, familyError("the true map is %d×%d, and the widths ask for %d×%d", tn, tm, n, m)
		}
		c, err := exactMatrix(truth)
		if err != nil {
			return nil, err
		}
		bt, at, r = rankFactor(c, -1)
	}
	for _, hw := range hidden {
		if r > hw {
			return nil, familyError("the true map has rank %d, above the hidden width %d", r, hw)
		}
	}
	L := len(widths) - 1
	var s strings.Builder
	fmt.Fprintf(&s, "model deep linear network, widths %s, true rank %d\n", strings.Trim(fmt.Sprint(widths), "[]"), r)
	s.WriteString("kind regression\n")
	var names []string
	for l := 1; l <= L; l++ {
		names = append(names, fmt.Sprintf("W%d[%d,%d]", l, widths[l], widths[l-1]))
	}
	fmt.Fprintf(&s, "param %s\n", strings.Join(names, ", "))
	fmt.Fprintf(&s, "input x[%d] ~ normal\nnoise 1/2\nmean ", m)
	for l := L; l >= 1; l-- {
		fmt.Fprintf(&s, "W%d*", l)
	}
	s.WriteString("x\n")
	if r > 0 {
		var binds []string
		for l := 1; l <= L; l++ {
			rows, cols := widths[l], widths[l-1]
			w := zeroMatrix(rows, cols)
			switch l {
			case 1:
				for i := range r {
					copy(w[i], at[i])
				}
			case L:
				for i := range rows {
					copy(w[i][:r], bt[i][:r])
				}
			default:
				for i := range r {
					w[i][i].SetInt64(1)
				}
			}
			binds = append(binds, fmt.Sprintf("W%d = %s", l, matrixText(w)))
		}
		fmt.Fprintf(&s, "truth %s\n", strings.Join(binds, ", "))
	}
	return parseFamily(s.String())
}

// Design is a finite design: rational points, each with a positive weight,
// the weights summing to 1.
type Design struct {
	Points  [][]*big.Rat
	Weights []*big.Rat
}

// text writes the design as a law: design { p: w, … }.
func (dsg Design) text() (string, error) {
	if len(dsg.Points) == 0 || len(dsg.Points) != len(dsg.Weights) {
		return "", familyError("a design needs as many weights as points, and at least one point")
	}
	var parts []string
	sum := new(big.Rat)
	for k, p := range dsg.Points {
		if len(p) != len(dsg.Points[0]) || len(p) == 0 || len(p) > maxShape {
			return "", familyError("the points of a design must have one length, from 1 to %d", maxShape)
		}
		for _, q := range dsg.Points[:k] {
			if ratsEqual(p, q) {
				return "", familyError("the design lists a point twice")
			}
		}
		if w := dsg.Weights[k]; w == nil || w.Sign() <= 0 {
			return "", familyError("a design weight must be positive")
		}
		sum.Add(sum, dsg.Weights[k])
		parts = append(parts, "("+ratJoin(p, ", ")+"): "+dsg.Weights[k].RatString())
	}
	if sum.Cmp(big.NewRat(1, 1)) != 0 {
		return "", familyError("the design weights sum to %s, not 1", sum.RatString())
	}
	return "design { " + strings.Join(parts, ", ") + " }", nil
}

// TanhRegression describes regression with one hidden layer of H tanh
// units, f(x) = Σ_h a_h·tanh(Σ_m b_(h,m)·x_m) (a'*tanh(B*x)), on a finite
// design of inputs in M dimensions, noise σ² = 1/2, at the truth 0 (f = 0),
// expanded to the given order. Three-layer networks of this kind are the
// running example of singular learning theory (Watanabe 2001, "Algebraic
// analysis for nonidentifiable learning machines", Neural Computation 13;
// Watanabe 2009, Algebraic Geometry and Statistical Learning Theory; from
// memory). It returns an error wrapping ErrFamily for H < 1, an order below
// 1, or a design that is not one.
func TanhRegression(h int, design Design, order int) (*Description, error) {
	if h < 1 || h > maxShape || order < 1 {
		return nil, familyError("tanh regression needs H from 1 to %d and an order ≥ 1, got H = %d, order %d", maxShape, h, order)
	}
	law, err := design.text()
	if err != nil {
		return nil, err
	}
	m := len(design.Points[0])
	var s strings.Builder
	fmt.Fprintf(&s, "model tanh regression, %d hidden units, %d inputs on a design of %d points\n", h, m, len(design.Points))
	s.WriteString("kind regression\n")
	fmt.Fprintf(&s, "param a[%d], B[%d,%d]\n", h, h, m)
	fmt.Fprintf(&s, "input x[%d] ~ %s\n", m, law)
	fmt.Fprintf(&s, "noise 1/2\nmean a'*tanh(B*x)\norder %d\n", order)
	return parseFamily(s.String())
}

// PoissonMixture describes the two-component Poisson mixture
// a·Poisson(m1) + (1 − a)·Poisson(m2) at the truth a = weight,
// m1 = m2 = mean (a single Poisson law), expanded to the given order (see
// buildMixture: K is χ²/2 as a sum of squares of the moment differences).
// Mixtures of this kind are standard examples of singular models (Watanabe
// 2009; from memory). It returns an error wrapping ErrFamily for a mean
// that is not positive, a weight outside [0, 1] or an order below 1.
func PoissonMixture(mean, weight *big.Rat, order int) (*Description, error) {
	if mean.Sign() <= 0 || weight.Sign() < 0 || weight.Cmp(big.NewRat(1, 1)) > 0 || order < 1 {
		return nil, familyError("a Poisson mixture needs a positive mean, a weight in [0, 1] and an order ≥ 1")
	}
	src := fmt.Sprintf(`model two-component Poisson mixture at a single Poisson law
kind mixture
param a, m1, m2
component poisson(m1) weight a
component poisson(m2) weight 1 - a
truth a = %s, m1 = %s, m2 = %s
order %d
`, weight.RatString(), mean.RatString(), mean.RatString(), order)
	return parseFamily(src)
}

// BinomialMixture describes the two-component mixture
// a·Binomial(n, p1) + (1 − a)·Binomial(n, p2) (Bernoulli for n = 1) at the
// truth a = weight, p1 = p2 = prob. It is a discrete model with n + 1
// counts (see buildDiscrete). It returns an error wrapping ErrFamily
// unless 0 < prob < 1, 0 ≤ weight ≤ 1 and 1 ≤ n ≤ 1000.
func BinomialMixture(n int, prob, weight *big.Rat) (*Description, error) {
	one := big.NewRat(1, 1)
	if n < 1 || n > maxTrials || prob.Sign() <= 0 || prob.Cmp(one) >= 0 || weight.Sign() < 0 || weight.Cmp(one) > 0 {
		return nil, familyError("a binomial mixture needs 1 ≤ n ≤ %d, 0 < p < 1 and a weight in [0, 1]", maxTrials)
	}
	src := fmt.Sprintf(`model two-component binomial mixture, %d trials, at a single binomial law
kind mixture
param a, p1, p2
component binomial(%d, p1) weight a
component binomial(%d, p2) weight 1 - a
truth a = %s, p1 = %s, p2 = %s
`, n, n, n, weight.RatString(), prob.RatString(), prob.RatString())
	return parseFamily(src)
}

// LatentClass describes a naive-Bayes latent class model: a hidden class
// h ∈ {1, …, H} with weights π_1, …, π_(H−1) and π_H = 1 − Σ π, and J
// binary observations independent given the class, with P(y_j = 1 | h) =
// t_(h,j):
//
//	p(y) = Σ_h π_h Π_j t_(h,j)^(y_j)·(1 − t_(h,j))^(1 − y_j),
//
// a discrete model with 2^J categories. The truth has equal weights 1/H and
// t_(h,j) = prob for every class, so that the observations are independent
// (every class is the same). Latent class models go back to Lazarsfeld and
// Goodman (Goodman 1974, "Exploratory latent structure analysis using both
// identifiable and unidentifiable models", Biometrika 61); their learning
// coefficients were studied by Rusakov and Geiger (2005, "Asymptotic model
// selection for naive Bayesian networks", JMLR 6; from memory). It
// returns an error wrapping ErrFamily unless H ≥ 2, 1 ≤ J ≤ 10 and
// 0 < prob < 1.
func LatentClass(h, j int, prob *big.Rat) (*Description, error) {
	one := big.NewRat(1, 1)
	if h < 2 || h > maxShape || j < 1 || j > 10 || prob.Sign() <= 0 || prob.Cmp(one) >= 0 {
		return nil, familyError("a latent class model needs H ≥ 2 classes, 1 ≤ J ≤ 10 observations and 0 < p < 1")
	}
	var s strings.Builder
	fmt.Fprintf(&s, "model latent class model, %d classes, %d binary observations\n", h, j)
	s.WriteString("kind discrete\n")
	fmt.Fprintf(&s, "param pi[%d], t[%d,%d]\n", h-1, h, j)
	weight := func(c int) string {
		if c < h {
			return fmt.Sprintf("pi[%d]", c)
		}
		return "(1 - sum(pi))"
	}
	for y := range 1 << j {
		var terms []string
		for c := 1; c <= h; c++ {
			f := []string{weight(c)}
			for k := 1; k <= j; k++ {
				if y>>(j-k)&1 == 1 {
					f = append(f, fmt.Sprintf("t[%d,%d]", c, k))
				} else {
					f = append(f, fmt.Sprintf("(1 - t[%d,%d])", c, k))
				}
			}
			terms = append(terms, strings.Join(f, "*"))
		}
		fmt.Fprintf(&s, "category y%0*b = %s\n", j, y, strings.Join(terms, " + "))
	}
	fmt.Fprintf(&s, "truth pi = %s, t = %s\n", new(big.Rat).SetFrac64(1, int64(h)).RatString(), prob.RatString())
	return parseFamily(s.String())
}

// parseFamily reads a description a constructor wrote; an error here is a
// bug of the constructor.
func parseFamily(src string) (*Description, error) {
	d, err := Parse(src)
	if err != nil {
		return nil, fmt.Errorf("model: internal error in a constructor: %w", err)
	}
	return d, nil
}

// exactMatrix reads a gonum matrix exactly.
func exactMatrix(a mat.Matrix) ([][]*big.Rat, error) {
	r, c := a.Dims()
	out := make([][]*big.Rat, r)
	for i := range r {
		out[i] = make([]*big.Rat, c)
		for j := range c {
			v := a.At(i, j)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, familyError("entry (%d, %d) of the true map is %v", i+1, j+1, v)
			}
			out[i][j] = new(big.Rat).SetFloat64(v)
		}
	}
	return out, nil
}

// rankFactor writes C (N×M) as B·A with B = the pivot columns of C and A
// the non-zero rows of its reduced row echelon form, found by exact
// Gauss–Jordan elimination; with h ≥ r it pads B to N×h and A to h×M with
// zeros (h < 0: no padding). It returns B, A and the rank r.
func rankFactor(c [][]*big.Rat, h int) (b, a [][]*big.Rat, r int) {
	n, m := len(c), len(c[0])
	e := make([][]*big.Rat, n)
	for i := range c {
		e[i] = make([]*big.Rat, m)
		for j := range c[i] {
			e[i][j] = new(big.Rat).Set(c[i][j])
		}
	}
	var pivots []int
	t := new(big.Rat)
	for col := 0; col < m && r < n; col++ {
		p := -1
		for i := r; i < n; i++ {
			if e[i][col].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		e[r], e[p] = e[p], e[r]
		inv := new(big.Rat).Inv(e[r][col])
		for j := range m {
			e[r][j].Mul(e[r][j], inv)
		}
		for i := range n {
			if i == r || e[i][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(e[i][col])
			for j := range m {
				e[i][j].Sub(e[i][j], t.Mul(f, e[r][j]))
			}
		}
		pivots = append(pivots, col)
		r++
	}
	width := max(h, r)
	b = zeroMatrix(n, width)
	for i := range n {
		for k, col := range pivots {
			b[i][k].Set(c[i][col])
		}
	}
	a = zeroMatrix(width, m)
	for k := range r {
		for j := range m {
			a[k][j].Set(e[k][j])
		}
	}
	return b, a, r
}

// zeroMatrix returns an r×c matrix of zeros.
func zeroMatrix(r, c int) [][]*big.Rat {
	out := make([][]*big.Rat, r)
	for i := range out {
		out[i] = make([]*big.Rat, c)
		for j := range out[i] {
			out[i][j] = new(big.Rat)
		}
	}
	return out
}

// matrixText writes a matrix as a truth value: [1, 0; 0, 1].
func matrixText(a [][]*big.Rat) string {
	rows := make([]string, len(a))
	for i, row := range a {
		rows[i] = ratJoin(row, ", ")
	}
	return "[" + strings.Join(rows, "; ") + "]"
}
