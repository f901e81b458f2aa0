package rlct

import (
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// torusPoint is a point of the real torus where a polynomial vanishes:
// exact rational coordinates (exact non-nil), or decimal approximations of
// algebraic coordinates with a note that says exactly which algebraic
// numbers they are.
type torusPoint struct {
	exact  []*big.Rat
	approx []float64
	note   string // how the zero was found, and the algebraic numbers
}

// facePoly returns the face polynomial F of K on the face of fc: K's part,
// or in sum-of-squares form Σ part_i².
func facePoly(fc *faceCase) *monomial.Poly {
	if !fc.sos {
		return fc.parts[0]
	}
	var F *monomial.Poly
	for _, q := range fc.parts {
		if q.IsZero() {
			continue
		}
		sq := q.Mul(q)
		if F == nil {
			F = sq
		} else {
			F = F.Add(sq)
		}
	}
	return F
}

// torusDecision is the outcome of deciding whether a polynomial vanishes on
// the torus: zero reports a zero, shown by point.
type torusDecision struct {
	zero  bool
	point *torusPoint
}

// decideTorusCheap decides F with the exact tests that need no premise:
// a single term, even exponents with one sign, a collinear support (a
// univariate polynomial in one monomial, Sturm sequences). ok is false
// when none applies.
func decideTorusCheap(F *monomial.Poly) (torusDecision, bool) {
	if F == nil || F.IsZero() {
		return torusDecision{}, false
	}
	if F.Len() == 1 || evenSameSign(F) {
		return torusDecision{}, true
	}
	l, ok := alongLine(F)
	if !ok {
		return torusDecision{}, false
	}
	if countRealRoots(l.p) == 0 {
		return torusDecision{}, true
	}
	iv := isolateRoots(l.p, big.NewRat(1, 1<<40))[0]
	return torusDecision{zero: true, point: lineZero(F.NumVars(), l.u, iv)}, true
}

// lineZero returns a torus point with w^u = r for the root r in iv, as
// torusWitness does, in torusPoint form.
func lineZero(d int, u []int, iv interval) *torusPoint {
	names := make([]string, d)
	for i := range names {
		names[i] = fmt.Sprintf("w%d", i)
	}
	w := torusWitness(names, u, iv)
	pt := &torusPoint{note: "w^u = " + formatRoot(iv)}
	exact := true
	for i, s := range w.Point {
		_, val, ok := strings.Cut(s, "=")
		if !ok {
			_, val, _ = strings.Cut(s, "≈")
			exact = false
		}
		r, _ := new(big.Rat).SetString(val)
		if r == nil {
			r = big.NewRat(1, 1)
		}
		f, _ := r.Float64()
		pt.approx = append(pt.approx, f)
		if exact {
			pt.exact = append(pt.exact, r)
		}
		_ = i
	}
	if !exact {
		pt.exact = nil
	}
	return pt
}

// witnessOf writes a torus point as a Witness.
func witnessOf(vars []string, pt *torusPoint, root, monomials string) *Witness {
	w := &Witness{Root: root, Monomial: monomials}
	if pt.note != "" {
		if w.Root != "" {
			w.Root += "; "
		}
		w.Root += pt.note
	}
	for i, name := range vars {
		if pt.exact != nil {
			w.Point = append(w.Point, name+"="+pt.exact[i].RatString())
		} else {
			w.Point = append(w.Point, fmt.Sprintf("%s≈%.12g", name, pt.approx[i]))
		}
	}
	return w
}

// pointFromNew maps a zero (y_1, …, y_r) of P, with y_j = 1 for j > r, back
// to w_i = Π_j y_j^{U_ij}: exact when every y_j is rational.
func (c monomialChange) pointFromNew(yExact []*big.Rat, yApprox []float64) *torusPoint {
	d := len(c.u)
	pt := &torusPoint{}
	if yExact != nil {
		pt.exact = make([]*big.Rat, d)
	}
	pt.approx = make([]float64, d)
	for i := range d {
		f := 1.0
		var x *big.Rat
		if yExact != nil {
			x = big.NewRat(1, 1)
		}
		for j := range c.rank {
			e := c.u[i][j]
			f *= math.Pow(yApprox[j], float64(e))
			if x != nil {
				p := ratPow(yExact[j], abs(e))
				if e < 0 {
					p.Inv(p)
				}
				x.Mul(x, p)
			}
		}
		pt.approx[i] = f
		if x != nil {
			pt.exact[i] = x
		}
	}
	return pt
}

// newVarNames writes the monomials y_j = w^{(U⁻¹)_j} of the change's first r
// new variables, named s and t.
func (c monomialChange) describe(vars []string) string {
	inv, ok := inverseUnimodular(c.u)
	if !ok {
		return ""
	}
	names := []string{"s", "t"}
	var parts []string
	for j := range min(c.rank, 2) {
		parts = append(parts, names[j]+" = "+monomialString(vars, inv[j]))
	}
	return strings.Join(parts, ", ")
}

// inverseUnimodular returns U⁻¹ for an integer matrix with det ±1, by exact
// Gauss–Jordan elimination over Q; ok is false when U is singular or the
// inverse is not integral.
func inverseUnimodular(u [][]int) ([][]int, bool) {
	d := len(u)
	a := make([][]*big.Rat, d)
	for i := range d {
		a[i] = make([]*big.Rat, 2*d)
		for j := range d {
			a[i][j] = big.NewRat(int64(u[i][j]), 1)
			a[i][d+j] = new(big.Rat)
		}
		a[i][d+i] = big.NewRat(1, 1)
	}
	for col := range d {
		p := -1
		for r := col; r < d; r++ {
			if a[r][col].Sign() != 0 {
				p = r
				break
			}
		}
		if p < 0 {
			return nil, false
		}
		a[col], a[p] = a[p], a[col]
		inv := new(big.Rat).Inv(a[col][col])
		for j := range 2 * d {
			a[col][j].Mul(a[col][j], inv)
		}
		for r := range d {
			if r == col || a[r][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(a[r][col])
			for j := range 2 * d {
				a[r][j].Sub(a[r][j], new(big.Rat).Mul(f, a[col][j]))
			}
		}
	}
	out := make([][]int, d)
	for i := range d {
		out[i] = make([]int, d)
		for j := range d {
			x := a[i][d+j]
			if !x.IsInt() || !x.Num().IsInt64() {
				return nil, false
			}
			out[i][j] = int(x.Num().Int64())
		}
	}
	return out, true
}
