// Command gen writes the benchmark instances of the polyhedron package (see
// package instances for the families and the file format) into a directory,
// by default testdata/polyhedron. Instances with more than
// instances.StoredMaxN points are skipped unless -all is given (benchmarks
// generate them from the same seed). Run from the module root:
//
//	go run ./polyhedron/internal/gen [-dir testdata/polyhedron] [-all]
package main

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"

	"github.com/lctkit/lctkit/polyhedron/internal/instances"
)

func main() {
	dir := flag.String("dir", "testdata/polyhedron", "output directory")
	all := flag.Bool("all", false, "also write the instances with more than instances.StoredMaxN points")
	flag.Parse()
	if err := os.MkdirAll(*dir, 0o755); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	for _, in := range instances.All() {
		if len(in.Points) > instances.StoredMaxN && !*all {
			continue
		}
		f, err := os.Create(filepath.Join(*dir, in.Name+".txt"))
		if err == nil {
			err = instances.Write(f, in)
			if cerr := f.Close(); err == nil {
				err = cerr
			}
		}
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
	}
}
