package main

import (
	"encoding/xml"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

var update = flag.Bool("update", false, "rewrite candidates.txt, study.txt and study.svg in examples/sensor-rank")

// TestFitByHand checks the rank-H log-likelihoods on data small enough to
// fit by hand. With x = (1, 0)ᵀ and y = ((3, 4), (1, 2)): the least-squares
// fit is ŷ = ((3, 4), (0, 0)), leaving RSS = 1 + 4 = 5; ŷ has the one
// singular value 5, so RSS_0 = 5 + 25 = 30 = ‖y‖² and RSS_1 = 5; the
// log-likelihood is −(nN/2)·log 2π − RSS/2 with nN = 4.
func TestFitByHand(t *testing.T) {
	x := mat.NewDense(2, 1, []float64{1, 0})
	y := mat.NewDense(2, 2, []float64{3, 4, 1, 2})
	ll, err := fit(x, y)
	if err != nil {
		t.Fatal(err)
	}
	base := -2 * math.Log(2*math.Pi)
	want := []float64{base - 15, base - 2.5}
	if len(ll) != 2 {
		t.Fatalf("got %d ranks, want 2", len(ll))
	}
	for h := range want {
		if math.Abs(ll[h]-want[h]) > 1e-12 {
			t.Errorf("rank %d: log-likelihood %.15g, want %.15g", h, ll[h], want[h])
		}
	}
}

// TestTrueMap: the invented map has the singular values it is said to
// have (1 and 0.25 at rank 2, 1 at rank 1), since it is built from
// orthonormal directions (checked by hand: the columns of u and v are unit
// vectors, orthogonal in pairs).
func TestTrueMap(t *testing.T) {
	for rank, want := range map[int][]float64{1: {1, 0, 0}, 2: {1, 0.25, 0}} {
		var svd mat.SVD
		svd.Factorize(trueMap(rank), mat.SVDNone)
		got := svd.Values(nil)
		for k := range want {
			if math.Abs(got[k]-want[k]) > 1e-12 {
				t.Errorf("rank %d: singular values %v, want %v", rank, got, want)
			}
		}
	}
}

// TestStudyGolden runs the study with its defaults and compares the three
// files with those committed in examples/sensor-rank (golden files: a
// regression record; rerun with -update after a deliberate change and read
// the diff).
func TestStudyGolden(t *testing.T) {
	files, err := run(config{seed: 1, draws: 200, sizes: []int{60, 300}, truths: []int{2, 1}})
	if err != nil {
		t.Fatal(err)
	}
	for name, got := range files {
		path := filepath.Join("..", name)
		if *update {
			if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
				t.Fatal(err)
			}
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if got != string(want) {
			t.Errorf("%s differs from the study's output (rerun with -update after a deliberate change, and read the diff)", path)
		}
	}
	// The picture is well-formed XML.
	dec := xml.NewDecoder(strings.NewReader(files["study.svg"]))
	for {
		if _, err := dec.Token(); err == io.EOF {
			break
		} else if err != nil {
			t.Fatalf("study.svg is not well-formed: %v", err)
		}
	}
	// The same seed gives the same files.
	again, err := run(config{seed: 1, draws: 200, sizes: []int{60, 300}, truths: []int{2, 1}})
	if err != nil {
		t.Fatal(err)
	}
	for name := range files {
		if files[name] != again[name] {
			t.Errorf("%s is not deterministic", name)
		}
	}
}
