package polyhedron

import (
	"math"
	"math/big"
	"math/bits"
)

// rankInt returns the rank over Q of the integer matrix rows (each of
// length cols). It runs fraction-free (Bareiss) elimination in int64 and
// restarts in big.Int arithmetic if an intermediate value might overflow.
func rankInt(rows [][]int64, cols int) int {
	if r, ok := rankInt64(rows, cols); ok {
		return r
	}
	return rankBig(rows, cols)
}

func rankInt64(rows [][]int64, cols int) (int, bool) {
	m := make([][]int64, len(rows))
	for i, r := range rows {
		m[i] = append([]int64(nil), r...)
	}
	rank := 0
	prev := int64(1)
	for c := 0; c < cols && rank < len(m); c++ {
		p := -1
		for i := rank; i < len(m); i++ {
			if m[i][c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		m[rank], m[p] = m[p], m[rank]
		piv := m[rank][c]
		for i := rank + 1; i < len(m); i++ {
			f := m[i][c]
			for j := c; j < cols; j++ {
				x, ok1 := mul64(m[i][j], piv)
				y, ok2 := mul64(m[rank][j], f)
				if !ok1 || !ok2 {
					return 0, false
				}
				diff := x - y
				if (y < 0 && diff < x) || (y > 0 && diff > x) {
					return 0, false
				}
				m[i][j] = diff / prev // exact (Bareiss)
			}
		}
		prev = piv
		rank++
	}
	return rank, true
}

func mul64(a, b int64) (int64, bool) {
	if a == 0 || b == 0 {
		return 0, true
	}
	if a == math.MinInt64 || b == math.MinInt64 {
		return 0, false
	}
	hi, lo := bits.Mul64(uint64(abs64(a)), uint64(abs64(b)))
	if hi != 0 || lo > math.MaxInt64 {
		return 0, false
	}
	r := int64(lo)
	if (a < 0) != (b < 0) {
		r = -r
	}
	return r, true
}

func rankBig(rows [][]int64, cols int) int {
	m := make([][]*big.Int, len(rows))
	for i, r := range rows {
		m[i] = make([]*big.Int, cols)
		for j := range r {
			m[i][j] = big.NewInt(r[j])
		}
	}
	rank := 0
	prev := big.NewInt(1)
	var x, y big.Int
	for c := 0; c < cols && rank < len(m); c++ {
		p := -1
		for i := rank; i < len(m); i++ {
			if m[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		m[rank], m[p] = m[p], m[rank]
		piv := m[rank][c]
		for i := rank + 1; i < len(m); i++ {
			f := new(big.Int).Set(m[i][c])
			for j := c; j < cols; j++ {
				x.Mul(m[i][j], piv)
				y.Mul(m[rank][j], f)
				m[i][j].Sub(&x, &y)
				m[i][j].Quo(m[i][j], prev)
			}
		}
		prev = new(big.Int).Set(piv)
		rank++
	}
	return rank
}

// solveStatus is the outcome of solveInt64.
type solveStatus int

const (
	solved       solveStatus = iota
	inconsistent             // the system has no solution
	overflowed               // int64 did not suffice (or an exactness check failed)
)

// solveInt64 solves Σ_j x_j cols[j] = rhs exactly (each column of length
// len(rhs)), with the unknowns of columns that are linearly dependent on
// earlier ones set to 0. The solution is returned scaled to integers: x_j =
// num[j]/den with den != 0 the determinant of the pivot submatrix, so the
// sign of x_j is sign(num[j])·sign(den). Method: fraction-free (Bareiss)
// forward elimination, H. Bareiss, "Sylvester's identity and multistep
// integer-preserving Gaussian elimination", Math. Comp. 22 (1968), 565–578,
// then integer back substitution (by Cramer's rule den·x_j is an integer, so
// the divisions are exact); every product and sum is overflow-checked and
// every division checked for a zero remainder, and any failure gives
// overflowed (the caller then uses rationals). Cost: O(m·n·min(m, n)) int64
// operations for m rows and n columns.
func solveInt64(cols [][]int64, rhs []int64) ([]int64, int64, solveStatus) {
	m, nc := len(rhs), len(cols)
	w := nc + 1
	a := make([]int64, m*w)
	for i := 0; i < m; i++ {
		for c, col := range cols {
			a[i*w+c] = col[i]
		}
		a[i*w+nc] = rhs[i]
	}
	prev := int64(1)
	var pivCols []int
	r := 0
	for c := 0; c < nc && r < m; c++ {
		p := -1
		for i := r; i < m; i++ {
			if a[i*w+c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		if p != r {
			for j := 0; j < w; j++ {
				a[r*w+j], a[p*w+j] = a[p*w+j], a[r*w+j]
			}
		}
		piv := a[r*w+c]
		for i := r + 1; i < m; i++ {
			f := a[i*w+c]
			for j := c + 1; j < w; j++ {
				x, ok1 := mul64(a[i*w+j], piv)
				z, ok2 := mul64(a[r*w+j], f)
				if !ok1 || !ok2 {
					return nil, 0, overflowed
				}
				diff := x - z
				if (z < 0 && diff < x) || (z > 0 && diff > x) || diff%prev != 0 {
					return nil, 0, overflowed
				}
				a[i*w+j] = diff / prev
			}
			a[i*w+c] = 0
		}
		prev = piv
		pivCols = append(pivCols, c)
		r++
	}
	for i := r; i < m; i++ {
		if a[i*w+nc] != 0 {
			return nil, 0, inconsistent
		}
	}
	num := make([]int64, nc)
	den := prev
	for i := r - 1; i >= 0; i-- {
		v, ok := mul64(den, a[i*w+nc])
		if !ok {
			return nil, 0, overflowed
		}
		for q := i + 1; q < r; q++ {
			term, ok := mul64(a[i*w+pivCols[q]], num[pivCols[q]])
			if !ok {
				return nil, 0, overflowed
			}
			nv := v - term
			if (term > 0 && nv > v) || (term < 0 && nv < v) {
				return nil, 0, overflowed
			}
			v = nv
		}
		d := a[i*w+pivCols[i]]
		if v%d != 0 {
			return nil, 0, overflowed
		}
		num[pivCols[i]] = v / d
	}
	return num, den, solved
}
