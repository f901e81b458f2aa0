package model

import (
	"context"
	"math/big"
	"testing"
)

// BenchmarkBuild builds K from descriptions of several families and sizes
// (parse and build, not the bound), reporting generators/op. The target for
// reduced-rank regression with M = N = 6 and H = 4 is under one second.
//
//	go test ./rlct/model -run '^$' -bench Build
func BenchmarkBuild(b *testing.B) {
	design := Design{
		Points:  [][]*big.Rat{{big.NewRat(-1, 1)}, {big.NewRat(1, 2)}, {big.NewRat(2, 1)}},
		Weights: []*big.Rat{big.NewRat(1, 4), big.NewRat(1, 4), big.NewRat(1, 2)},
	}
	type family struct {
		name string
		make func() (*Description, error)
	}
	families := []family{
		{"reduced-rank/M=6,N=6,H=4", func() (*Description, error) { return ReducedRank(6, 6, 4, 0) }},
		{"reduced-rank/M=6,N=6,H=4,r=2", func() (*Description, error) { return ReducedRank(6, 6, 4, 2) }},
		{"deep-linear/widths=4,4,4,4", func() (*Description, error) { return DeepLinear([]int{4, 4, 4, 4}, nil) }},
		{"tanh/H=3,order=10", func() (*Description, error) { return TanhRegression(3, design, 10) }},
		{"poisson/order=8", func() (*Description, error) { return PoissonMixture(big.NewRat(3, 1), big.NewRat(1, 2), 8) }},
		{"latent-class/H=2,J=5", func() (*Description, error) { return LatentClass(2, 5, big.NewRat(1, 3)) }},
	}
	for _, f := range families {
		b.Run(f.name, func(b *testing.B) {
			d, err := f.make()
			if err != nil {
				b.Fatal(err)
			}
			src := d.String()
			b.ReportAllocs()
			gens := 0
			for b.Loop() {
				d, err := Parse(src)
				if err != nil {
					b.Fatal(err)
				}
				m, err := Build(context.Background(), d, nil)
				if err != nil {
					b.Fatal(err)
				}
				gens = len(m.Problem.Generators)
			}
			b.ReportMetric(float64(gens), "generators/op")
		})
	}
}

// BenchmarkBuildAndBound builds and bounds reduced-rank regression with
// M = N = 6 and H = 4, the whole path from a description to the answer.
func BenchmarkBuildAndBound(b *testing.B) {
	d, err := ReducedRank(6, 6, 4, 0)
	if err != nil {
		b.Fatal(err)
	}
	src := d.String()
	for b.Loop() {
		d, err := Parse(src)
		if err != nil {
			b.Fatal(err)
		}
		m, err := Build(context.Background(), d, nil)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := m.Bound(context.Background(), nil); err != nil {
			b.Fatal(err)
		}
	}
}
