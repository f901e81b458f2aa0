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
