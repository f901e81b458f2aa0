// Command newtondist reads an exponent set in the text format of the
// polyhedron benchmark instances ("d N" then N lines of d exponents; '#'
// starts a comment) and prints the Newton distance t along τ = (1,…,1), the
// face hit (dimension, codimension, compactness, number of vertices) and
// the sizes of the reduction. With -facets it instead enumerates all facets
// and prints t = max over facets of b/(a·τ). It is the lctkit side of
// bench/compare.sh.
//
//	go run ./bench/newtondist [-facets] FILE
package main

import (
	"bufio"
	"flag"
	"fmt"
	"math/big"
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/lctkit/lctkit/polyhedron"
)

func main() {
	facets := flag.Bool("facets", false, "enumerate facets and take the maximum of b/(a·τ)")
	flag.Parse()
	if flag.NArg() != 1 {
		fmt.Fprintln(os.Stderr, "usage: newtondist [-facets] FILE")
		os.Exit(2)
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
	tau := make([]*big.Rat, d)
	for i := range tau {
		tau[i] = big.NewRat(1, 1)
	}
	if *facets {
		fs, err := n.Facets()
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
			len(n.Minimal()), len(n.Vertices()), built.Round(time.Millisecond), time.Since(start).Round(time.Millisecond))
		return
	}
	h, err := n.Distance(tau)
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	fmt.Printf("t=%s dim=%d codim=%d compact=%v facevertices=%d minimal=%d vertices=%d build=%v total=%v\n",
		h.T.RatString(), h.Face.Dim, h.Face.Codim(d), h.Face.Compact(), len(h.Face.Vertices),
		len(n.Minimal()), len(n.Vertices()), built.Round(time.Millisecond), time.Since(start).Round(time.Millisecond))
}

func read(path string) (int, [][]int, error) {
	f, err := os.Open(path)
	if err != nil {
		return 0, nil, err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	d, want, line := -1, 0, 0
	var pts [][]int
	for sc.Scan() {
		line++
		s := strings.TrimSpace(sc.Text())
		if s == "" || s[0] == '#' {
			continue
		}
		fields := strings.Fields(s)
		vals := make([]int, len(fields))
		for i, x := range fields {
			if vals[i], err = strconv.Atoi(x); err != nil {
				return 0, nil, fmt.Errorf("%s:%d: %v", path, line, err)
			}
		}
		if d < 0 {
			if len(vals) != 2 {
				return 0, nil, fmt.Errorf("%s:%d: want header \"d N\"", path, line)
			}
			d, want = vals[0], vals[1]
			continue
		}
		pts = append(pts, vals)
	}
	if err := sc.Err(); err != nil {
		return 0, nil, err
	}
	if len(pts) != want {
		return 0, nil, fmt.Errorf("%s: header announces %d points, file has %d", path, want, len(pts))
	}
	return d, pts, nil
}
