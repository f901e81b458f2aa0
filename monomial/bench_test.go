package monomial

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"
)

// paths runs f twice: with the word-sized coefficient fast path and with
// every coefficient forced to big.Rat (inputs converted by prepare).
func paths(b *testing.B, f func(b *testing.B, big bool)) {
	b.Run("path=fast", func(b *testing.B) { f(b, false) })
	b.Run("path=big", func(b *testing.B) {
		forceBig = true
		defer func() { forceBig = false }()
		f(b, true)
	})
}

func prepare(p *Poly, useBig bool) *Poly {
	if useBig {
		return toBig(p)
	}
	return p
}

func varNames(prefix string, n int) []string {
	v := make([]string, n)
	for i := range v {
		v[i] = fmt.Sprintf("%s%d", prefix, i+1)
	}
	return v
}

// BenchmarkPowSum expands (x1+…+xk)^n; k=10, n=6 gives 5005 terms.
func BenchmarkPowSum(b *testing.B) {
	for _, size := range []struct{ k, n int }{{10, 6}, {6, 10}} {
		b.Run(fmt.Sprintf("k=%d/n=%d", size.k, size.n), func(b *testing.B) {
			paths(b, func(b *testing.B, useBig bool) {
				vars := varNames("x", size.k)
				sum := Zero(vars)
				for i := range vars {
					sum = sum.Add(Variable(vars, i))
				}
				sum = prepare(sum, useBig)
				var p *Poly
				b.ReportAllocs()
				for b.Loop() {
					p, _ = sum.Pow(size.n, Limits{})
				}
				b.ReportMetric(float64(p.Len()), "terms")
			})
		})
	}
}

// squareSum builds Σ_ij (Σ_k b_ik a_kj)^2, the divergence of a reduced-rank
// regression with n×n matrices B and A (2n² variables).
func squareSum(n int, useBig bool) (vars []string, build func() *Poly) {
	for i := range n {
		for k := range n {
			vars = append(vars, fmt.Sprintf("b%d%d", i+1, k+1))
		}
	}
	for k := range n {
		for j := range n {
			vars = append(vars, fmt.Sprintf("a%d%d", k+1, j+1))
		}
	}
	v := func(i int) *Poly { return prepare(Variable(vars, i), useBig) }
	return vars, func() *Poly {
		total := Zero(vars)
		for i := range n {
			for j := range n {
				entry := Zero(vars)
				for k := range n {
					entry = entry.Add(v(i*n + k).Mul(v(n*n + k*n + j)))
				}
				total = total.Add(entry.Mul(entry))
			}
		}
		return total
	}
}

// BenchmarkSquareSum: Σ_ij (Σ_k b_ik a_kj)^2 for n×n matrices.
func BenchmarkSquareSum(b *testing.B) {
	for _, n := range []int{3, 4} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			paths(b, func(b *testing.B, useBig bool) {
				_, build := squareSum(n, useBig)
				var p *Poly
				b.ReportAllocs()
				for b.Loop() {
					p = build()
				}
				b.ReportMetric(float64(p.Len()), "terms")
			})
		})
	}
}

// BenchmarkTanhSeries: tanh of a 3-variable argument to total degree d.
func BenchmarkTanhSeries(b *testing.B) {
	for _, src := range []string{"tanh(x+y+z)", "tanh(x*y+z)"} {
		for _, d := range []int{8, 12} {
			b.Run(fmt.Sprintf("%s/d=%d", src, d), func(b *testing.B) {
				var e *Expansion
				b.ReportAllocs()
				for b.Loop() {
					var err error
					if e, err = Parse(src, Config{Order: d}); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(e.Poly.Len()), "terms")
			})
		}
	}
}

// randomSparse returns a polynomial with exactly n distinct terms in the
// given variables, small integer coefficients.
func randomSparse(r *rand.Rand, vars []string, n, maxExp int) *Poly {
	p := Zero(vars)
	for p.Len() < n {
		e := make(Exponent, len(vars))
		for i := range e {
			e[i] = r.IntN(maxExp + 1)
		}
		p = p.Add(Monomial(vars, e, big.NewRat(r.Int64N(19)-9|1, 1)))
	}
	return p
}

// BenchmarkMul: the product of two n-term polynomials in 6 variables.
func BenchmarkMul(b *testing.B) {
	for _, n := range []int{100, 1000} {
		b.Run(fmt.Sprintf("terms=%d", n), func(b *testing.B) {
			paths(b, func(b *testing.B, useBig bool) {
				r := rand.New(rand.NewPCG(1, uint64(n)))
				vars := varNames("x", 6)
				p := prepare(randomSparse(r, vars, n, 5), useBig)
				q := prepare(randomSparse(r, vars, n, 5), useBig)
				var s *Poly
				b.ReportAllocs()
				for b.Loop() {
					s = p.Mul(q)
				}
				b.ReportMetric(float64(s.Len()), "terms")
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n*n), "ns/pair")
			})
		})
	}
}

// BenchmarkCompiledEval: float64 evaluation of an n-term polynomial in 10
// variables.
func BenchmarkCompiledEval(b *testing.B) {
	for _, n := range []int{100, 1000} {
		b.Run(fmt.Sprintf("terms=%d", n), func(b *testing.B) {
			r := rand.New(rand.NewPCG(2, uint64(n)))
			p := randomSparse(r, varNames("w", 10), n, 4)
			c := p.Compile()
			x := make([]float64, 10)
			for i := range x {
				x[i] = r.Float64()
			}
			sum := 0.0
			b.ReportAllocs()
			for b.Loop() {
				sum += c.Eval(x)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/term")
		})
	}
}

// parseInput is one input of BenchmarkParse.
type parseInput struct {
	name  string
	src   string
	terms int // summands in the text
}

// parseInputs returns the inputs of BenchmarkParse: (a) 10^4 squared
// monomials in 10 variables, (b) 10^5 in 20 variables, (c) all 92,378
// monomials x_i^(2 e_i) of degree 10 in 10 variables, (d) 10^4 squared
// products in parentheses and 10^4 monomials with coefficients, (e) a
// 40,000-term sum of squared monomials in 12 variables, and a small typical
// divergence.
func parseInputs() []parseInput {
	even, n := genEvenDegree(10, 10)
	return []parseInput{
		{"a=squares/terms=1e4/vars=10", genSquares(1, 10_000, 10, 3), 10_000},
		{"b=squares/terms=1e5/vars=20", genSquares(2, 100_000, 20, 3), 100_000},
		{"c=even-degree-10/terms=92378/vars=10", even, n},
		{"d=squared-products/terms=1e4/vars=10", genSquaredProducts(3, 10_000, 10), 10_000},
		{"d=coefficients/terms=1e4/vars=10", genCoefficients(4, 10_000, 10), 10_000},
		{"e=squares/terms=4e4/vars=12", genSquares(5, 40_000, 12, 2), 40_000},
		{"divergence/terms=3", "(a1*b1 + a2*b2 + a3*b3)^2 + (a1*b1^2 + a2*b2^2 + a3*b3^2)^2 + (a1*b1^3 + a2*b2^3 + a3*b3^3)^2", 3},
	}
}

// BenchmarkParse: parsing and expanding sums of many monomials, and a
// typical small divergence. It reports the time per summand of the text.
func BenchmarkParse(b *testing.B) {
	for _, in := range parseInputs() {
		b.Run(in.name, func(b *testing.B) {
			b.SetBytes(int64(len(in.src)))
			b.ReportAllocs()
			var e *Expansion
			for b.Loop() {
				var err error
				if e, err = Parse(in.src, Config{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(in.terms), "ns/term")
			b.ReportMetric(float64(e.Poly.Len()), "result-terms")
		})
	}
}

// tanhNetwork returns Σ_{p=1..3} (Σ_{k=1..3} a_k·tanh(x_p·b_k))², the
// divergence of a one-hidden-layer tanh network with three units at three
// inputs; with numbers the inputs x_p are the numbers 1/2, 1, 3/2 instead
// of variables.
func tanhNetwork(numbers bool) string {
	var outer []string
	for p := 1; p <= 3; p++ {
		x := fmt.Sprintf("x%d", p)
		if numbers {
			x = []string{"1/2", "1", "3/2"}[p-1]
		}
		var inner []string
		for k := 1; k <= 3; k++ {
			inner = append(inner, fmt.Sprintf("a%d*tanh(%s*b%d)", k, x, k))
		}
		outer = append(outer, "("+strings.Join(inner, " + ")+")^2")
	}
	return strings.Join(outer, " + ")
}

// BenchmarkTanhNetwork expands the tanh network of tanhNetwork at orders
// 8, 10 and 12, with its remainder. It reports the terms of the
// expansion and the generators of the remainder.
func BenchmarkTanhNetwork(b *testing.B) {
	for _, numbers := range []bool{false, true} {
		src := tanhNetwork(numbers)
		for _, d := range []int{8, 10, 12} {
			b.Run(fmt.Sprintf("inputs=%s/order=%d", map[bool]string{false: "vars", true: "numbers"}[numbers], d), func(b *testing.B) {
				var e *Expansion
				b.ReportAllocs()
				for b.Loop() {
					var err error
					if e, err = Parse(src, Config{Order: d}); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(e.Poly.Len()), "terms")
				b.ReportMetric(float64(len(e.Remainder)), "generators")
			})
		}
	}
}
