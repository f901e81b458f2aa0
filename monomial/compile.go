package monomial

import "fmt"

// Compiled is a float64 evaluator of a polynomial, for numerical estimation
// (never for exact answers). It keeps flat arrays and no maps, is immutable,
// and is safe for concurrent use.
type Compiled struct {
	nvars   int
	coefs   []float64 // coefficient of each term, rounded to float64
	start   []int32   // factors of term t are factors[start[t]:start[t+1]]
	factors []int32   // index into the power table: offset[v] + k - 1 for x_v^k
	offset  []int     // power table offset of each variable
	maxExp  []int     // largest exponent of each variable
	size    int       // power table size, Σ maxExp
}

// Compile returns a float64 evaluator of p. Coefficients are rounded to
// the nearest float64.
func (p *Poly) Compile() *Compiled {
	n := len(p.vars)
	c := &Compiled{nvars: n, coefs: make([]float64, len(p.coefs)), start: make([]int32, 0, len(p.coefs)+1)}
	c.maxExp = maxExponents(p)
	c.offset = make([]int, n)
	for v := range n {
		c.offset[v] = c.size
		c.size += c.maxExp[v]
	}
	for t, k := range p.coefs {
		c.coefs[t] = k.float64()
		c.start = append(c.start, int32(len(c.factors)))
		for v, e := range p.exp(t) {
			if e > 0 {
				c.factors = append(c.factors, int32(c.offset[v]+e-1))
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
	for v, m := range c.maxExp {
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
			a *= table[f]
		}
		sum += a
	}
	return sum
}
