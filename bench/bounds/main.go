// Command bounds writes the inputs of bench/certificate.sh: a function K
// of one of the benchmark families, as an expression for `lctkit bound`,
// and the support of K in the instance format of bench/newtondist ("d N"
// then N lines of exponents), from which newtondist -write-lp writes the same
// ray-shooting LP for glpsol. The families (deterministic for a seed):
//
//	squares  -terms N -vars d       N distinct squared monomials, exponents in {0, 2, …, 12}
//	degree   -vars d -deg D         Σ x^(2e) over all e of total degree D
//	lowrank  -m M -n N -h H         ‖BA‖² expanded, B M×H, A H×N (entries b_ik, a_kj)
//
// Usage: bounds -family F [flags] -k K.txt -points P.txt
package main

import (
	"bufio"
	"flag"
	"fmt"
	"math/rand/v2"
	"os"
	"strings"
)

func main() {
	family := flag.String("family", "squares", "squares, degree or lowrank")
	terms := flag.Int("terms", 10000, "squares: number of terms")
	vars := flag.Int("vars", 10, "squares, degree: number of variables")
	deg := flag.Int("deg", 10, "degree: total degree D")
	m := flag.Int("m", 3, "lowrank: rows of B")
	n := flag.Int("n", 3, "lowrank: columns of A")
	h := flag.Int("h", 3, "lowrank: inner dimension")
	seed := flag.Uint64("seed", 1, "squares: random seed")
	kOut := flag.String("k", "", "file for the expression")
	pOut := flag.String("points", "", "file for the support")
	flag.Parse()
	if *kOut == "" || *pOut == "" {
		fmt.Fprintln(os.Stderr, "usage: bounds -family F [flags] -k K.txt -points P.txt")
		os.Exit(2)
	}
	var names []string
	var exps [][]int
	var k string
	switch *family {
	case "squares":
		names, exps = squares(*terms, *vars, *seed)
		k = monomials(names, exps)
	case "degree":
		names, exps = degree(*vars, *deg)
		k = monomials(names, exps)
	case "lowrank":
		names, exps, k = lowrank(*m, *n, *h)
	default:
		fmt.Fprintf(os.Stderr, "unknown family %q\n", *family)
		os.Exit(2)
	}
	if err := os.WriteFile(*kOut, []byte(k+"\n"), 0o644); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	if err := writePoints(*pOut, len(names), exps); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}

func varNames(d int) []string {
	out := make([]string, d)
	for i := range out {
		out[i] = fmt.Sprintf("x%d", i+1)
	}
	return out
}

func squares(n, d int, seed uint64) ([]string, [][]int) {
	rng := rand.New(rand.NewPCG(seed, uint64(n)))
	seen := map[string]bool{}
	var exps [][]int
	for len(exps) < n {
		e := make([]int, d)
		zero := true
		for i := range e {
			e[i] = 2 * rng.IntN(7)
			zero = zero && e[i] == 0
		}
		key := fmt.Sprint(e)
		if zero || seen[key] {
			continue
		}
		seen[key] = true
		exps = append(exps, e)
	}
	return varNames(d), exps
}

func degree(d, deg int) ([]string, [][]int) {
	var exps [][]int
	e := make([]int, d)
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == d-1 {
			e[i] = left
			x := make([]int, d)
			for k := range e {
				x[k] = 2 * e[k]
			}
			exps = append(exps, x)
			return
		}
		for v := left; v >= 0; v-- {
			e[i] = v
			rec(i+1, left-v)
		}
	}
	rec(0, deg)
	return varNames(d), exps
}

func monomials(names []string, exps [][]int) string {
	var b strings.Builder
	for j, e := range exps {
		if j > 0 {
			b.WriteString(" + ")
		}
		first := true
		for i, x := range e {
			if x == 0 {
				continue
			}
			if !first {
				b.WriteByte('*')
			}
			first = false
			fmt.Fprintf(&b, "%s^%d", names[i], x)
		}
	}
	return b.String()
}

// lowrank returns ‖BA‖² = Σ_ij (Σ_k b_ik·a_kj)² written as squares, with its
// support b_ik·a_kj·b_il·a_lj (k ≤ l) over the variables b then a.
func lowrank(m, n, h int) ([]string, [][]int, string) {
	var names []string
	for i := 1; i <= m; i++ {
		for k := 1; k <= h; k++ {
			names = append(names, fmt.Sprintf("b%d_%d", i, k))
		}
	}
	for k := 1; k <= h; k++ {
		for j := 1; j <= n; j++ {
			names = append(names, fmt.Sprintf("a%d_%d", k, j))
		}
	}
	b := func(i, k int) int { return i*h + k }
	a := func(k, j int) int { return m*h + k*n + j }
	var sq []string
	var exps [][]int
	for i := range m {
		for j := range n {
			var g []string
			for k := range h {
				g = append(g, names[b(i, k)]+"*"+names[a(k, j)])
				for l := k; l < h; l++ {
					e := make([]int, len(names))
					e[b(i, k)]++
					e[a(k, j)]++
					e[b(i, l)]++
					e[a(l, j)]++
					exps = append(exps, e)
				}
			}
			sq = append(sq, "("+strings.Join(g, " + ")+")^2")
		}
	}
	return names, exps, strings.Join(sq, " + ")
}

func writePoints(path string, d int, exps [][]int) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(f)
	fmt.Fprintf(w, "%d %d\n", d, len(exps))
	for _, e := range exps {
		for i, x := range e {
			if i > 0 {
				w.WriteByte(' ')
			}
			fmt.Fprint(w, x)
		}
		w.WriteByte('\n')
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}
