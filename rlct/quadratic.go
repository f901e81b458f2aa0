package rlct

import (
	"fmt"
	"math/big"
	"slices"

	"github.com/lctkit/lctkit/monomial"
)

// quadForm is F = w^base·Q(z) with z_i = w^{u_i} and Q(z) = zᵀ·M·z for a
// symmetric rational matrix M.
type quadForm struct {
	base []int
	u    [][]int
	m    [][]*big.Rat
}

// asQuadratic writes F as a quadratic form in monomials when it is one:
// base is the least exponent of each variable, the u_i are the halves of
// e − base over the terms e with e − base even, and every term must be
// base + u_i + u_j for some i ≤ j (a diagonal term with i = j). ok is false
// otherwise, including when a term matches two pairs.
func asQuadratic(F *monomial.Poly) (quadForm, bool) {
	sup := F.Support()
	d := len(sup[0])
	base := slices.Clone([]int(sup[0]))
	for _, e := range sup[1:] {
		for i := range d {
			base[i] = min(base[i], e[i])
		}
	}
	var us [][]int
	for _, e := range sup {
		u := make([]int, d)
		even := true
		for i := range d {
			x := e[i] - base[i]
			if x%2 != 0 {
				even = false
				break
			}
			u[i] = x / 2
		}
		if even {
			us = append(us, u)
		}
	}
	n := len(us)
	if n == 0 || n > 64 {
		return quadForm{}, false
	}
	pair := map[string][2]int{}
	for i := range n {
		for j := i; j < n; j++ {
			e := make([]int, d)
			for k := range d {
				e[k] = base[k] + us[i][k] + us[j][k]
			}
			key := intsKey(e)
			if _, dup := pair[key]; dup {
				return quadForm{}, false
			}
			pair[key] = [2]int{i, j}
		}
	}
	m := make([][]*big.Rat, n)
	for i := range m {
		m[i] = make([]*big.Rat, n)
		for j := range m[i] {
			m[i][j] = new(big.Rat)
		}
	}
	half := big.NewRat(1, 2)
	for e, c := range F.All() {
		ij, ok := pair[intsKey([]int(e))]
		if !ok {
			return quadForm{}, false
		}
		i, j := ij[0], ij[1]
		if i == j {
			m[i][i].Set(c)
			continue
		}
		h := new(big.Rat).Mul(c, half)
		m[i][j].Set(h)
		m[j][i].Set(h)
	}
	return quadForm{base: base, u: us, m: m}, true
}

// ldl runs an exact symmetric elimination (LDLᵀ with diagonal pivoting)
// on a copy of M. It returns posDef when every pivot is positive in the
// natural order (Sylvester's criterion: all leading principal minors,
// the products of the pivots, are positive; common practice), and psd when
// M is positive semidefinite: the elimination with the largest remaining
// positive diagonal pivot ends with a zero matrix and no negative diagonal
// entry was met (a PSD matrix with a zero diagonal entry has a zero row).
func ldl(m [][]*big.Rat) (posDef, psd bool) {
	n := len(m)
	a := make([][]*big.Rat, n)
	for i := range m {
		a[i] = make([]*big.Rat, n)
		for j := range m[i] {
			a[i][j] = new(big.Rat).Set(m[i][j])
		}
	}
	posDef = true
	alive := make([]bool, n)
	for i := range alive {
		alive[i] = true
	}
	for step := range n {
		// Natural order first, for Sylvester's criterion.
		p := -1
		if posDef && a[step][step].Sign() > 0 {
			p = step
		} else {
			posDef = false
			for i := range n {
				if alive[i] && a[i][i].Sign() > 0 && (p < 0 || a[i][i].Cmp(a[p][p]) > 0) {
					p = i
				}
			}
		}
		if p < 0 {
			// No positive pivot left: PSD exactly when what is left is zero.
			for i := range n {
				for j := range n {
					if alive[i] && alive[j] && a[i][j].Sign() != 0 {
						return false, false
					}
				}
			}
			return false, true
		}
		alive[p] = false
		for i := range n {
			if !alive[i] || a[i][p].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(a[i][p], a[p][p])
			for j := range n {
				if alive[j] {
					a[i][j].Sub(a[i][j], new(big.Rat).Mul(f, a[p][j]))
				}
			}
		}
	}
	return posDef, true
}

// kernel returns a basis of the null space of M over Q (exact Gauss–Jordan).
func kernel(m [][]*big.Rat) [][]*big.Rat {
	n := len(m)
	a := make([][]*big.Rat, n)
	for i := range m {
		a[i] = make([]*big.Rat, n)
		for j := range m[i] {
			a[i][j] = new(big.Rat).Set(m[i][j])
		}
	}
	var pivCols []int
	row := 0
	for col := 0; col < n && row < n; col++ {
		p := -1
		for r := row; r < n; r++ {
			if a[r][col].Sign() != 0 {
				p = r
				break
			}
		}
		if p < 0 {
			continue
		}
		a[row], a[p] = a[p], a[row]
		inv := new(big.Rat).Inv(a[row][col])
		for j := range n {
			a[row][j].Mul(a[row][j], inv)
		}
		for r := range n {
			if r == row || a[r][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(a[r][col])
			for j := range n {
				a[r][j].Sub(a[r][j], new(big.Rat).Mul(f, a[row][j]))
			}
		}
		pivCols = append(pivCols, col)
		row++
	}
	isPiv := make([]bool, n)
	for _, c := range pivCols {
		isPiv[c] = true
	}
	var basis [][]*big.Rat
	for free := range n {
		if isPiv[free] {
			continue
		}
		v := make([]*big.Rat, n)
		for i := range v {
			v[i] = new(big.Rat)
		}
		v[free].SetInt64(1)
		for r, c := range pivCols {
			v[c].Neg(a[r][free])
		}
		basis = append(basis, v)
	}
	return basis
}

// nonzeroKernelVector returns a vector of the span of basis with every
// coordinate non-zero, when one exists. Each coordinate of Σ_k x^k·b_k is a
// polynomial in x of degree < len(basis); if it is not identically zero it
// has fewer than len(basis) roots, so among n·len(basis) + 1 integers x
// one makes every such coordinate non-zero. A coordinate that vanishes on
// every basis vector vanishes on the whole span: then there is none.
func nonzeroKernelVector(basis [][]*big.Rat, n int) ([]*big.Rat, bool) {
	if len(basis) == 0 {
		return nil, false
	}
	for i := range n {
		allZero := true
		for _, b := range basis {
			if b[i].Sign() != 0 {
				allZero = false
				break
			}
		}
		if allZero {
			return nil, false
		}
	}
	for x := int64(1); x <= int64(n*len(basis)+1); x++ {
		v := make([]*big.Rat, n)
		for i := range v {
			v[i] = new(big.Rat)
		}
		pw := big.NewRat(1, 1)
		for _, b := range basis {
			for i := range n {
				v[i].Add(v[i], new(big.Rat).Mul(pw, b[i]))
			}
			pw = new(big.Rat).Mul(pw, big.NewRat(x, 1))
		}
		ok := true
		for _, c := range v {
			if c.Sign() == 0 {
				ok = false
				break
			}
		}
		if ok {
			return v, true
		}
	}
	return nil, false
}

// decideQuadratic decides a quadratic form in monomials exactly:
//
//   - M positive definite: Q(z) > 0 for every z ≠ 0, and z_i = w^{u_i} ≠ 0
//     on the torus, so F = w^base·Q has no torus zero (needs no premise);
//   - otherwise, when the u_i are distinct unit vectors (z_i is one of the
//     variables, so z ranges over the whole torus (R∖{0})^n) and M is
//     positive semidefinite (checked exactly), Q(z) = 0 exactly when
//     M·z = 0, so F vanishes on the torus exactly when ker M holds a vector
//     with no zero coordinate; a rational one is the witness;
//   - otherwise it declines.
func decideQuadratic(F *monomial.Poly) (torusDecision, string, bool) {
	if F == nil || F.IsZero() {
		return torusDecision{}, "", false
	}
	qf, ok := asQuadratic(F)
	if !ok {
		return torusDecision{}, "", false
	}
	posDef, psd := ldl(qf.m)
	if posDef {
		return torusDecision{}, fmt.Sprintf("a positive definite quadratic form in %d monomials", len(qf.u)), true
	}
	d := len(qf.base)
	idx := make([]int, len(qf.u)) // the variable z_i is, or −1
	for i, u := range qf.u {
		idx[i] = -1
		for k := range d {
			if u[k] == 1 && idx[i] < 0 {
				idx[i] = k
			} else if u[k] != 0 {
				return torusDecision{}, "", false
			}
		}
		if idx[i] < 0 {
			return torusDecision{}, "", false
		}
	}
	if !psd {
		return torusDecision{}, "", false
	}
	n := len(qf.u)
	v, found := nonzeroKernelVector(kernel(qf.m), n)
	if !found {
		return torusDecision{}, fmt.Sprintf("a positive semidefinite quadratic form in %d variables whose kernel has no point with all coordinates non-zero", n), true
	}
	pt := &torusPoint{exact: make([]*big.Rat, d), approx: make([]float64, d), note: "a kernel vector of the quadratic form"}
	for k := range d {
		pt.exact[k] = big.NewRat(1, 1)
		pt.approx[k] = 1
	}
	for i, k := range idx {
		pt.exact[k] = v[i]
		pt.approx[k] = ratFloat(v[i])
	}
	return torusDecision{zero: true, point: pt}, fmt.Sprintf("a positive semidefinite quadratic form in %d variables", n), true
}
