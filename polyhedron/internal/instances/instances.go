// Package instances generates the deterministic families of exponent sets
// used by the polyhedron benchmarks and the bench/compare.sh script, and
// reads and writes them in a small text format.
//
// # Families
//
//   - LowRank(M, N, H): the support of K(B, A) = Σ_ij ((BA)_ij)² for B an
//     M×H and A an H×N matrix; variables are the entries of B (row-major)
//     then those of A, so d = M·H + H·N. The monomials are
//     b_ik·a_kj·b_il·a_lj for all i, j and k <= l.
//   - Random(d, N, seed): N sparse points in d coordinates: each point has
//     a support of s coordinates, s uniform in {2, 3, 4} (at most d), chosen
//     uniformly, with exponents uniform in 1..12 there; from a PCG generator
//     seeded with seed, d and N. (Supports of size 1 are left out: a single
//     x_i would dominate every point that uses x_i. Dense uniform points are
//     available as Dense.)
//   - Dense(d, N, seed): N points with every coordinate uniform in 0..12,
//     the zero vector excluded.
//   - Degree(d, D): all exponent vectors of total degree D.
//
// # File format
//
// Lines starting with '#' are comments. The first other line is "d N"; each
// of the next N lines holds the d exponents of one point, separated by
// spaces.
package instances

import (
	"bufio"
	"fmt"
	"io"
	"math/rand/v2"
	"strconv"
	"strings"
)

// Instance is a named exponent set.
type Instance struct {
	Name   string
	D      int
	Points [][]int
}

// LowRank returns the support of Σ_ij ((BA)_ij)² for B (M×H) and A (H×N).
func LowRank(m, n, h int) Instance {
	d := m*h + h*n
	b := func(i, k int) int { return i*h + k }
	a := func(k, j int) int { return m*h + k*n + j }
	var pts [][]int
	for i := 0; i < m; i++ {
		for j := 0; j < n; j++ {
			for k := 0; k < h; k++ {
				for l := k; l < h; l++ {
					p := make([]int, d)
					p[b(i, k)]++
					p[a(k, j)]++
					p[b(i, l)]++
					p[a(l, j)]++
					pts = append(pts, p)
				}
			}
		}
	}
	return Instance{Name: fmt.Sprintf("lowrank_%d_%d_%d", m, n, h), D: d, Points: pts}
}

// Random returns N sparse random points in dimension d (see the package
// documentation); the same arguments always give the same points.
func Random(d, n int, seed uint64) Instance {
	rng := rand.New(rand.NewPCG(seed, uint64(d)<<32|uint64(n)))
	pts := make([][]int, n)
	for k := range pts {
		p := make([]int, d)
		s := min(d, 2+rng.IntN(3))
		for _, i := range rng.Perm(d)[:s] {
			p[i] = 1 + rng.IntN(12)
		}
		pts[k] = p
	}
	return Instance{Name: fmt.Sprintf("random_d%d_n%d", d, n), D: d, Points: pts}
}

// Dense returns N dense random points in dimension d (see the package
// documentation); the same arguments always give the same points.
func Dense(d, n int, seed uint64) Instance {
	rng := rand.New(rand.NewPCG(seed, uint64(d)<<32|uint64(n)))
	pts := make([][]int, n)
	for k := range pts {
		p := make([]int, d)
		for zero := true; zero; {
			for i := range p {
				p[i] = rng.IntN(13)
				if p[i] != 0 {
					zero = false
				}
			}
		}
		pts[k] = p
	}
	return Instance{Name: fmt.Sprintf("dense_d%d_n%d", d, n), D: d, Points: pts}
}

// Degree returns all exponent vectors in dimension d of total degree deg.
func Degree(d, deg int) Instance {
	var pts [][]int
	p := make([]int, d)
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == d-1 {
			p[i] = left
			pts = append(pts, append([]int(nil), p...))
			return
		}
		for v := left; v >= 0; v-- {
			p[i] = v
			rec(i+1, left-v)
		}
	}
	rec(0, deg)
	return Instance{Name: fmt.Sprintf("degree_d%d_D%d", d, deg), D: d, Points: pts}
}

// Write writes the instance in the text format.
func Write(w io.Writer, in Instance) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "# %s\n%d %d\n", in.Name, in.D, len(in.Points))
	for _, p := range in.Points {
		for i, x := range p {
			if i > 0 {
				bw.WriteByte(' ')
			}
			bw.WriteString(strconv.Itoa(x))
		}
		bw.WriteByte('\n')
	}
	return bw.Flush()
}

// Read parses the text format; errors name the line.
func Read(r io.Reader) (Instance, error) {
	var in Instance
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	line := 0
	want := -1
	for sc.Scan() {
		line++
		s := strings.TrimSpace(sc.Text())
		if s == "" || strings.HasPrefix(s, "#") {
			if in.Name == "" && strings.HasPrefix(s, "#") {
				in.Name = strings.TrimSpace(s[1:])
			}
			continue
		}
		f := strings.Fields(s)
		vals := make([]int, len(f))
		for i, x := range f {
			v, err := strconv.Atoi(x)
			if err != nil {
				return in, fmt.Errorf("line %d: %v", line, err)
			}
			vals[i] = v
		}
		if want < 0 {
			if len(vals) != 2 {
				return in, fmt.Errorf("line %d: want header \"d N\"", line)
			}
			in.D, want = vals[0], vals[1]
			continue
		}
		if len(vals) != in.D {
			return in, fmt.Errorf("line %d: %d exponents, want %d", line, len(vals), in.D)
		}
		in.Points = append(in.Points, vals)
	}
	if err := sc.Err(); err != nil {
		return in, err
	}
	if want < 0 || len(in.Points) != want {
		return in, fmt.Errorf("header announces %d points, file has %d", want, len(in.Points))
	}
	return in, nil
}

// Seed is the seed used for the committed random instances.
const Seed = 20261201

// RandomSizes lists the (d, N) pairs of the random family; those with
// N <= StoredMaxN are stored under testdata, the others are generated on
// demand.
var RandomSizes = func() [][2]int {
	var out [][2]int
	for _, d := range []int{3, 6, 10, 15, 20} {
		for _, n := range []int{100, 1000, 10000, 100000} {
			out = append(out, [2]int{d, n})
		}
	}
	return out
}()

// StoredMaxN is the largest N of an instance stored as a file (larger
// ones, random or of one degree, are generated on demand).
const StoredMaxN = 10000

// LowRankSizes lists the (M, N, H) triples of the low-rank family.
var LowRankSizes = [][3]int{{2, 2, 2}, {3, 3, 2}, {3, 3, 3}, {4, 4, 3}, {5, 5, 4}}

// DenseSizes lists the (d, N) pairs of the dense random family.
var DenseSizes = [][2]int{{6, 1000}, {6, 10000}, {10, 100}, {10, 10000}}

// DegreeSizes lists the (d, D) pairs of the one-degree family.
// degree_d10_D10 has 92,378 points and is generated on demand.
var DegreeSizes = [][2]int{{3, 20}, {5, 8}, {8, 5}, {10, 10}}

// All returns every instance of the four families (random ones of all
// sizes, including the generated-only ones).
func All() []Instance {
	var out []Instance
	for _, s := range LowRankSizes {
		out = append(out, LowRank(s[0], s[1], s[2]))
	}
	for _, s := range RandomSizes {
		out = append(out, Random(s[0], s[1], Seed))
	}
	for _, s := range DenseSizes {
		out = append(out, Dense(s[0], s[1], Seed))
	}
	for _, s := range DegreeSizes {
		out = append(out, Degree(s[0], s[1]))
	}
	return out
}
