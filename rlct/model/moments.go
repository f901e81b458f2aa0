package model

import (
	"fmt"
	"math/big"
	"strings"
)

// moments computes exact moments E[x^α] of the inputs that are integrated
// out: independent inputs, each with independent normal or uniform
// coordinates or a joint moment table.
type moments struct {
	src    string
	inputs []*input // in the order of their coordinates in α
	cache  map[string]*big.Rat
	// one[k] caches the moments of one normal or uniform coordinate of
	// inputs[k], by degree.
	one [][]*big.Rat
}

func newMoments(src string, inputs []*input) *moments {
	return &moments{src: src, inputs: inputs, cache: map[string]*big.Rat{}, one: make([][]*big.Rat, len(inputs))}
}

// of returns E[x^α]: the product over the inputs of the moment of their
// part of α (the inputs are independent).
func (m *moments) of(alpha []int) (*big.Rat, error) {
	key := fmt.Sprint(alpha)
	if v, ok := m.cache[key]; ok {
		return v, nil
	}
	v := big.NewRat(1, 1)
	k := 0
	for i, in := range m.inputs {
		part := alpha[k : k+in.shape.rows]
		k += in.shape.rows
		switch in.law.kind {
		case lawNormal, lawUniform:
			for _, e := range part {
				v.Mul(v, m.single(i, e))
			}
		case lawMoments:
			x, err := m.table(in, part)
			if err != nil {
				return nil, err
			}
			v.Mul(v, x)
		}
	}
	m.cache[key] = v
	return v, nil
}

// single returns E[x^e] for one coordinate of a normal or uniform input.
//
// Normal N(μ, v): E[x^e] = μ·E[x^(e−1)] + (e−1)·v·E[x^(e−2)] (integration by
// parts, Stein's identity E[(x−μ)g(x)] = v·E[g'(x)] with g = x^(e−1);
// common practice), so the standard normal gives E[x^(2k)] = (2k−1)!!.
// Uniform on (a, b): E[x^e] = (b^(e+1) − a^(e+1))/((e+1)(b − a)).
func (m *moments) single(i, e int) *big.Rat {
	in := m.inputs[i]
	cache := m.one[i]
	if len(cache) == 0 {
		cache = []*big.Rat{big.NewRat(1, 1)}
	}
	for n := len(cache); n <= e; n++ {
		v := new(big.Rat)
		switch in.law.kind {
		case lawNormal:
			v.Mul(in.law.a, cache[n-1])
			if n >= 2 {
				t := new(big.Rat).Mul(in.law.b, cache[n-2])
				t.Mul(t, big.NewRat(int64(n-1), 1))
				v.Add(v, t)
			}
		case lawUniform:
			a, b := in.law.a, in.law.b
			hi := new(big.Rat).Set(pow(b, n+1))
			hi.Sub(hi, pow(a, n+1))
			den := new(big.Rat).Sub(b, a)
			den.Mul(den, big.NewRat(int64(n+1), 1))
			v.Quo(hi, den)
		}
		cache = append(cache, v)
	}
	m.one[i] = cache
	return cache[e]
}

// pow returns x^n for n ≥ 0.
func pow(x *big.Rat, n int) *big.Rat {
	num := new(big.Int).Exp(x.Num(), big.NewInt(int64(n)), nil)
	den := new(big.Int).Exp(x.Denom(), big.NewInt(int64(n)), nil)
	return new(big.Rat).SetFrac(num, den)
}

// table returns E[x^e] from the input's moment table: 1 for e = 0, the
// table's value otherwise, and an error at the table when it lacks the
// moment.
func (m *moments) table(in *input, e []int) (*big.Rat, error) {
	zero := true
	for _, x := range e {
		if x != 0 {
			zero = false
		}
	}
	if zero {
		return big.NewRat(1, 1), nil
	}
	for k, pt := range in.law.points {
		match := true
		for i, x := range pt {
			if x.Num().Int64() != int64(e[i]) {
				match = false
				break
			}
		}
		if match {
			return in.law.weights[k], nil
		}
	}
	return nil, errorAt(m.src, in.law.pos, "the moment E[%s] is needed and the table does not give it", momentName(in, e))
}

// momentName writes x^e for an input, as x^4 or x_1^2*x_2.
func momentName(in *input, e []int) string {
	var parts []string
	for i, x := range e {
		if x == 0 {
			continue
		}
		name := in.entryName(i, 0)
		if x > 1 {
			name += fmt.Sprintf("^%d", x)
		}
		parts = append(parts, name)
	}
	return strings.Join(parts, "*")
}

// ldl factors a symmetric positive semidefinite rational matrix exactly as
// M = L·D·Lᵀ with L unit lower triangular and D = diag(d) ≥ 0, so that
// cᵀ·M·c = Σ_k d_k·((Lᵀc)_k)² (Golub & Van Loan, Matrix Computations,
// the LDLᵀ factorization; common practice). A zero pivot d_k is allowed
// when the rest of its column of the Schur complement is zero too (as it
// must be for a semidefinite matrix), and column k of L is then e_k. It
// returns ok = false when M is not positive semidefinite: a negative
// pivot, or a zero pivot with a non-zero entry below it.
func ldl(m [][]*big.Rat) (l [][]*big.Rat, d []*big.Rat, ok bool) {
	n := len(m)
	l = make([][]*big.Rat, n)
	for i := range l {
		l[i] = make([]*big.Rat, n)
		for j := range l[i] {
			l[i][j] = new(big.Rat)
		}
		l[i][i].SetInt64(1)
	}
	d = make([]*big.Rat, n)
	t := new(big.Rat)
	for k := range n {
		d[k] = new(big.Rat).Set(m[k][k])
		for j := range k {
			t.Mul(l[k][j], l[k][j])
			t.Mul(t, d[j])
			d[k].Sub(d[k], t)
		}
		if d[k].Sign() < 0 {
			return nil, nil, false
		}
		for i := k + 1; i < n; i++ {
			s := new(big.Rat).Set(m[i][k])
			for j := range k {
				t.Mul(l[i][j], l[k][j])
				t.Mul(t, d[j])
				s.Sub(s, t)
			}
			if d[k].Sign() == 0 {
				if s.Sign() != 0 {
					return nil, nil, false
				}
				continue
			}
			l[i][k].Quo(s, d[k])
		}
	}
	return l, d, true
}
