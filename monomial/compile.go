package monomial

import "fmt"

// maxTablePower bounds the powers x_v^1 … x_v^k kept in the per-call power
// table of Compiled.Eval; higher powers are computed by repeated squaring.
const maxTablePower = 64

// Compiled is a float64 evaluator of a polynomial, for numerical estimation
// (never for exact answers). It keeps flat arrays and no maps, is immutable,
// and is safe for concurrent use.
type Compiled struct {
	nvars   int
	coefs   []float64 // coefficient of each term, rounded to float64
	start   []int32   // factors of term t are factors[start[t]:start[t+1]]
	factors []factor
	offset  []int // power table offset of each variable
	tabled  []int // powers of each variable kept in the table
	size    int   // power table size
}

// factor is x_v^e in a term: table[idx] when idx >= 0, else computed.
type factor struct {
	idx int32
	v   int32
	e   int
}

// Compile returns a float64 evaluator of p. Coefficients are rounded to
// the nearest float64 (so huge ones become ±Inf).
func (p *Poly) Compile() *Compiled {
	n := len(p.vars)
	c := &Compiled{nvars: n, coefs: make([]float64, len(p.coefs)), start: make([]int32, 0, len(p.coefs)+1)}
	c.tabled = maxExponents(p)
	c.offset = make([]int, n)
	for v := range n {
		c.tabled[v] = min(c.tabled[v], maxTablePower)
		c.offset[v] = c.size
		c.size += c.tabled[v]
	}
	for t, k := range p.coefs {
		c.coefs[t] = k.float64()
		c.start = append(c.start, int32(len(c.factors)))
		for v, e := range p.exp(t) {
			switch {
			case e == 0:
			case e <= maxTablePower:
				c.factors = append(c.factors, factor{idx: int32(c.offset[v] + e - 1), v: int32(v), e: e})
			default:
				c.factors = append(c.factors, factor{idx: -1, v: int32(v), e: e})
			}
		}
	}
	c.start = append(c.start, int32(len(c.factors)))
	return c
}

// NumVars returns the number of variables (the length Eval expects).
func (c *Compiled) NumVars() int { return c.nvars }

// Eval returns p(x) in float64 arithmetic. It panics if len(x) != NumVars.
func (c *Compiled) Eval(x []float64) float64 {
	if len(x) != c.nvars {
		panic(fmt.Sprintf("monomial: Compiled.Eval: %d values for %d variables", len(x), c.nvars))
	}
	var stack [128]float64
	var table []float64
	if c.size <= len(stack) {
		table = stack[:c.size]
	} else {
		table = make([]float64, c.size)
	}
	for v, m := range c.tabled {
		if m == 0 {
			continue
		}
		row := table[c.offset[v] : c.offset[v]+m]
		row[0] = x[v]
		for k := 1; k < m; k++ {
			row[k] = row[k-1] * x[v]
		}
	}
	sum := 0.0
	for t, a := range c.coefs {
		for _, f := range c.factors[c.start[t]:c.start[t+1]] {
			if f.idx >= 0 {
				a *= table[f.idx]
			} else {
				a *= powi(x[f.v], f.e)
			}
		}
		sum += a
	}
	return sum
}

// powi returns x^e for e >= 0 by repeated squaring.
func powi(x float64, e int) float64 {
	r := 1.0
	for e > 0 {
		if e&1 == 1 {
			r *= x
		}
		e >>= 1
		if e > 0 {
			x *= x
		}
	}
	return r
}
