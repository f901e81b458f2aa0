// Command newtondist reads an exponent set in the text format of the
// polyhedron benchmark instances ("d N" then N lines of d exponents; '#'
// starts a comment) and prints the Newton distance t along τ = (1,…,1), the
// face hit (dimension, codimension, compactness, number of vertices) and
// the sizes of the reduction. With -facets it instead enumerates all facets
// and prints t = max over facets of b/(a·τ). It is the lctkit side of
// bench/compare.sh, and also writes the peers' inputs and reads their
// outputs; the flags name what is written or read, whatever the file format:
//
//	newtondist [-facets] FILE             distance and face (or facets) of FILE
//	newtondist -write-minimal FILE        the Pareto-minimal points, in the same text format
//	newtondist -write-generators FILE     the generators of the polyhedron (Pareto-minimal
//	                                      points and the d unit rays), a V-representation
//	                                      in the input format of lrs and cdd
//	newtondist -write-lp FILE             the ray-shooting LP over all points in CPLEX LP format
//	newtondist -read-inequalities HFILE   exact max over the inequalities c + a·x >= 0 of an
//	                                      H-representation (as lrs and cdd write it) of −c/(a·τ)
package main

import (
	"bufio"
	"bytes"
	"context"
	"flag"
	"fmt"
	"math"
	"math/big"
	"os"
	"strings"
	"time"

	"github.com/lctkit/lctkit/polyhedron"
)

func main() {
	facets := flag.Bool("facets", false, "enumerate facets and take the maximum of b/(a·τ)")
	generators := flag.Bool("write-generators", false, "write the Pareto-minimal points and the unit rays (a V-representation) in the lrs/cdd input format")
	lp := flag.Bool("write-lp", false, "write the ray-shooting LP in CPLEX LP format")
	minimal := flag.Bool("write-minimal", false, "write the Pareto-minimal points in the instance format")
	inequalities := flag.Bool("read-inequalities", false, "read an H-representation (inequalities, as lrs and cdd write them) and print the exact distance")
	flag.Parse()
	modes := 0
	for _, on := range []bool{*facets, *generators, *lp, *minimal, *inequalities} {
		if on {
			modes++
		}
	}
	if flag.NArg() != 1 || modes > 1 {
		fmt.Fprintln(os.Stderr, "usage: newtondist [-facets|-write-minimal|-write-generators|-write-lp|-read-inequalities] FILE")
		os.Exit(2)
	}
	if *inequalities {
		if err := maxOverInequalities(flag.Arg(0)); err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
		return
	}
	d, pts, err := read(flag.Arg(0))
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	start := time.Now()
	n, err := polyhedron.New(d, pts)
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	built := time.Since(start)
	ctx := context.Background()
	if *generators {
		writeGenerators(d, must(n.Minimal(ctx)))
		return
	}
	if *minimal {
		w := bufio.NewWriter(os.Stdout)
		minimal := must(n.Minimal(ctx))
		fmt.Fprintf(w, "# Pareto-minimal points of %s\n%d %d\n", flag.Arg(0), d, len(minimal))
		for _, p := range minimal {
			for i, x := range p {
				if i > 0 {
					w.WriteByte(' ')
				}
				fmt.Fprint(w, x)
			}
			w.WriteByte('\n')
		}
		w.Flush()
		return
	}
	if *lp {
		writeLP(d, pts)
		return
	}
	tau := make([]*big.Rat, d)
	for i := range tau {
		tau[i] = big.NewRat(1, 1)
	}
	if *facets {
		fs, err := n.Facets(ctx)
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
		t := new(big.Rat)
		for _, f := range fs {
			s := new(big.Int)
			for _, a := range f.Normal {
				s.Add(s, a)
			}
			q := new(big.Rat).SetFrac(f.RHS, s)
			if q.Cmp(t) > 0 {
				t = q
			}
		}
		fmt.Printf("t=%s facets=%d minimal=%d vertices=%d build=%v total=%v\n", t.RatString(), len(fs),
			len(must(n.Minimal(ctx))), len(must(n.Vertices(ctx))), built.Round(time.Millisecond), time.Since(start).Round(time.Millisecond))
		return
	}
	h, err := n.Distance(ctx, tau)
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	// The distance needs neither the minimal points nor the vertices; they
	// are counted after the clock stops.
	total := time.Since(start)
	fmt.Printf("t=%s dim=%d codim=%d compact=%v facevertices=%d points=%d minimal=%d vertices=%d build=%v total=%v\n",
		h.T.RatString(), h.Face.Dim, h.Face.Codim(d), h.Face.Compact(), len(h.Face.Vertices), len(n.Points()),
		len(must(n.Minimal(ctx))), len(must(n.Vertices(ctx))), built.Round(time.Millisecond), total.Round(time.Millisecond))
}

// must returns v, or exits with err.
func must[T any](v T, err error) T {
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	return v
}

// read parses the instance file without per-line allocations (the files
// hold up to 10^5 lines).
func read(path string) (int, [][]int, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return 0, nil, err
	}
	d, want, line := -1, 0, 0
	var pts [][]int
	var flat []int
	var vals []int
	for len(data) > 0 {
		line++
		end := bytes.IndexByte(data, '\n')
		var ln []byte
		if end < 0 {
			ln, data = data, nil
		} else {
			ln, data = data[:end], data[end+1:]
		}
		ln = bytes.TrimSpace(ln)
		if len(ln) == 0 || ln[0] == '#' {
			continue
		}
		vals = vals[:0]
		for i := 0; i < len(ln); {
			for i < len(ln) && (ln[i] == ' ' || ln[i] == '\t') {
				i++
			}
			if i == len(ln) {
				break
			}
			v, start := 0, i
			for i < len(ln) && ln[i] >= '0' && ln[i] <= '9' {
				if v > (math.MaxInt-9)/10 {
					return 0, nil, fmt.Errorf("%s:%d: number too large", path, line)
				}
				v = 10*v + int(ln[i]-'0')
				i++
			}
			if i == start || (i < len(ln) && ln[i] != ' ' && ln[i] != '\t') {
				return 0, nil, fmt.Errorf("%s:%d: want nonnegative integers", path, line)
			}
			vals = append(vals, v)
		}
		if d < 0 {
			if len(vals) != 2 {
				return 0, nil, fmt.Errorf("%s:%d: want header \"d N\"", path, line)
			}
			d, want = vals[0], vals[1]
			flat = make([]int, 0, d*want)
			continue
		}
		if len(vals) != d {
			return 0, nil, fmt.Errorf("%s:%d: %d exponents, want %d", path, line, len(vals), d)
		}
		if len(flat)+d > cap(flat) {
			flat = make([]int, 0, 1024*d)
		}
		flat = append(flat, vals...)
		pts = append(pts, flat[len(flat)-d:len(flat):len(flat)])
	}
	if d < 0 || len(pts) != want {
		return 0, nil, fmt.Errorf("%s: header announces %d points, file has %d", path, want, len(pts))
	}
	return d, pts, nil
}

// writeGenerators writes the points and the d unit rays as a
// V-representation in the input format of lrs and cdd.
func writeGenerators(d int, pts [][]int) {
	w := bufio.NewWriter(os.Stdout)
	defer w.Flush()
	fmt.Fprintf(w, "newton\nV-representation\nbegin\n%d %d integer\n", len(pts)+d, d+1)
	for _, p := range pts {
		w.WriteString("1")
		for _, x := range p {
			fmt.Fprintf(w, " %d", x)
		}
		w.WriteString("\n")
	}
	for i := 0; i < d; i++ {
		w.WriteString("0")
		for k := 0; k < d; k++ {
			if k == i {
				w.WriteString(" 1")
			} else {
				w.WriteString(" 0")
			}
		}
		w.WriteString("\n")
	}
	w.WriteString("end\n")
}

// writeLP writes: minimise t subject to Σ_j v_ji l_j − t <= 0 (each i),
// Σ_j l_j = 1, all variables >= 0; one term per line.
func writeLP(d int, pts [][]int) {
	w := bufio.NewWriter(os.Stdout)
	defer w.Flush()
	w.WriteString("Minimize\n obj: t\nSubject To\n")
	for i := 0; i < d; i++ {
		fmt.Fprintf(w, " c%d:", i)
		for j, p := range pts {
			if p[i] != 0 {
				fmt.Fprintf(w, "\n + %d l%d", p[i], j)
			}
		}
		w.WriteString("\n - t <= 0\n")
	}
	w.WriteString(" conv:")
	for j := range pts {
		fmt.Fprintf(w, "\n + l%d", j)
	}
	w.WriteString("\n = 1\nEnd\n")
}

// maxOverInequalities prints the exact max over the rows c + a·x >= 0
// (a != 0) of an H-representation of −c/(a·(1,…,1)).
func maxOverInequalities(path string) error {
	b, err := os.ReadFile(path)
	if err != nil {
		return err
	}
	in, header := false, false
	var best *big.Rat
	rows := 0
	for _, line := range strings.Split(string(b), "\n") {
		line = strings.TrimSpace(line)
		switch {
		case line == "begin":
			in, header = true, true
			continue
		case line == "end":
			in = false
			continue
		case !in || line == "" || strings.HasPrefix(line, "*"):
			continue
		case header:
			header = false
			continue
		}
		f := strings.Fields(line)
		c, ok := new(big.Rat).SetString(f[0])
		if !ok {
			return fmt.Errorf("%s: bad entry %q", path, f[0])
		}
		s := new(big.Rat)
		for _, x := range f[1:] {
			r, ok := new(big.Rat).SetString(x)
			if !ok {
				return fmt.Errorf("%s: bad entry %q", path, x)
			}
			s.Add(s, r)
		}
		if s.Sign() == 0 {
			continue
		}
		rows++
		q := new(big.Rat).Quo(new(big.Rat).Neg(c), s)
		if best == nil || q.Cmp(best) > 0 {
			best = q
		}
	}
	if best == nil {
		return fmt.Errorf("%s: no inequalities", path)
	}
	fmt.Printf("t=%s facets=%d\n", best.RatString(), rows)
	return nil
}
