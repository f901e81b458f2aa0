package polyhedron

import (
	"context"
	"math/big"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/polyhedron/internal/instances"
)

// loadInstance reads testdata/polyhedron/NAME.txt, or generates an
// instance that is not stored (see instances.StoredMaxN).
func loadInstance(b testing.TB, name string) instances.Instance {
	b.Helper()
	f, err := os.Open(filepath.Join("..", "testdata", "polyhedron", name+".txt"))
	if err == nil {
		defer f.Close()
		in, err := instances.Read(f)
		if err != nil {
			b.Fatal(err)
		}
		return in
	}
	for _, s := range instances.DegreeSizes {
		if in := instances.Degree(s[0], s[1]); in.Name == name {
			return in
		}
	}
	for _, s := range instances.RandomSizes {
		in := instances.Random(s[0], s[1], instances.Seed)
		if in.Name == name {
			return in
		}
	}
	b.Fatalf("no instance %s", name)
	return instances.Instance{}
}

func ones(d int) []*big.Rat {
	out := make([]*big.Rat, d)
	for i := range out {
		out[i] = big.NewRat(1, 1)
	}
	return out
}

var distanceInstances = []string{
	"lowrank_2_2_2", "lowrank_3_3_3", "lowrank_4_4_3", "lowrank_5_5_4",
	"random_d6_n10000", "random_d10_n10000", "random_d20_n10000", "random_d20_n100000",
	"dense_d6_n10000", "dense_d10_n10000", "degree_d8_D5", "degree_d10_D10",
}

// BenchmarkNewDistance measures the whole pipeline on an instance: New
// (Pareto filter and vertices) followed by Distance along (1,…,1) with its
// face.
func BenchmarkNewDistance(b *testing.B) {
	for _, name := range distanceInstances {
		in := loadInstance(b, name)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			var h *Hit
			var n *Newton
			for b.Loop() {
				var err error
				n, err = New(in.D, in.Points)
				if err != nil {
					b.Fatal(err)
				}
				if h, err = n.Distance(context.Background(), ones(in.D)); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(mustVertices(b, n))), "vertices")
			b.ReportMetric(float64(h.pivots), "pivots/op")
			b.ReportMetric(float64(h.Face.Codim(in.D)), "codim")
		})
	}
}

// BenchmarkDistance measures Distance alone on a built polyhedron.
func BenchmarkDistance(b *testing.B) {
	for _, name := range distanceInstances {
		in := loadInstance(b, name)
		n, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			var h *Hit
			for b.Loop() {
				if h, err = n.Distance(context.Background(), ones(in.D)); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(h.pivots), "pivots/op")
		})
	}
}

// BenchmarkFacets measures the facet enumeration (on a fresh polyhedron per
// iteration, since facets are cached).
func BenchmarkFacets(b *testing.B) {
	names := []string{"lowrank_2_2_2", "lowrank_3_3_2", "lowrank_3_3_3", "lowrank_4_4_3",
		"random_d3_n10000", "random_d6_n1000", "random_d6_n10000", "dense_d6_n1000", "dense_d6_n10000",
		"degree_d3_D20", "degree_d5_D8", "degree_d8_D5", "random_d10_n100"}
	if !testing.Short() {
		names = append(names, "dense_d10_n100")
	}
	for _, name := range names {
		in := loadInstance(b, name)
		base, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(strings.TrimSuffix(name, ".txt"), func(b *testing.B) {
			b.ReportAllocs()
			var fs []Facet
			for b.Loop() {
				n := &Newton{d: base.d, minimal: base.minimal, vertices: base.vertices, limits: base.limits}
				if fs, err = n.Facets(context.Background()); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(fs)), "facets/op")
			b.ReportMetric(float64(len(base.vertices)), "vertices")
		})
	}
}

// BenchmarkCompactFaces measures the compact face lattice (facets included).
func BenchmarkCompactFaces(b *testing.B) {
	for _, name := range []string{"lowrank_2_2_2", "lowrank_3_3_2", "random_d6_n1000", "dense_d6_n1000"} {
		in := loadInstance(b, name)
		base, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			var lat *Lattice
			for b.Loop() {
				n := &Newton{d: base.d, minimal: base.minimal, vertices: base.vertices, limits: base.limits}
				if lat, err = n.CompactFaces(context.Background()); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(lat.Faces)), "faces/op")
		})
	}
}

// BenchmarkCovers measures Covers on every vertex of an instance (one op =
// the covers of all vertices, given with their normals from FaceAt), and
// reports the number of (vertex, edge) incidences found.
func BenchmarkCovers(b *testing.B) {
	for _, name := range []string{"lowrank_2_2_2", "lowrank_3_3_2", "lowrank_3_3_3", "lowrank_4_4_3", "random_d6_n1000", "dense_d6_n1000", "random_d10_n1000"} {
		in := loadInstance(b, name)
		n, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		var vf []*Face
		for _, v := range mustVertices(b, n) {
			x := make([]*big.Rat, in.D)
			for i := range x {
				x[i] = big.NewRat(int64(v[i]), 1)
			}
			f, err := n.FaceAt(context.Background(), x)
			if err != nil {
				b.Fatal(err)
			}
			vf = append(vf, f)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			covers := 0
			for b.Loop() {
				covers = 0
				for _, f := range vf {
					cs, err := n.Covers(context.Background(), f)
					if err != nil {
						b.Fatal(err)
					}
					covers += len(cs)
				}
			}
			b.ReportMetric(float64(len(mustVertices(b, n))), "vertices")
			b.ReportMetric(float64(covers), "edges")
		})
	}
}

// BenchmarkVertices measures New followed by Vertices (the Pareto filter
// and the vertex filter) and reports the vertex filter's LPs per op (float LPs over known vertices plus
// points decided by the exact fallback), the exact fallbacks alone, and the
// exact pricing passes over all minimal points.
func BenchmarkVertices(b *testing.B) {
	for _, name := range []string{"degree_d8_D5", "degree_d10_D10", "dense_d6_n10000", "dense_d10_n10000",
		"random_d10_n10000", "random_d20_n100000", "lowrank_5_5_4"} {
		in := loadInstance(b, name)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			var n *Newton
			var st vertexCounts
			for b.Loop() {
				var err error
				if n, st, err = newWithStats(in.D, in.Points); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(mustVertices(b, n))), "vertices")
			b.ReportMetric(float64(len(mustMinimal(b, n))), "minimal")
			b.ReportMetric(float64(st.floatLPs+st.exactLPs), "LPs/op")
			b.ReportMetric(float64(st.exactLPs), "exactLPs/op")
			b.ReportMetric(float64(st.pricings), "pricings/op")
		})
	}
}

// newWithStats is New followed by the vertex computation, with the vertex
// filter's work counters.
func newWithStats(d int, points [][]int) (*Newton, vertexCounts, error) {
	var st vertexStats
	n, err := New(d, points)
	if err == nil {
		err = n.ensureVerticesStats(context.Background(), &st)
	}
	return n, vertexCounts{floatLPs: st.floatLPs.Load(), exactLPs: st.exactLPs.Load(), pricings: st.pricings.Load()}, err
}

// vertexCounts is a copy of vertexStats.
type vertexCounts struct{ floatLPs, exactLPs, pricings int64 }

// BenchmarkNormalConeMin measures NormalConeMin with c = e_i for every
// coordinate i (the caller's use) on the faces holding the centroids of up
// to 20 vertex pairs (one op = all of them), τ = (1,…,1).
func BenchmarkNormalConeMin(b *testing.B) {
	for _, name := range []string{"lowrank_3_3_3", "lowrank_5_5_4", "random_d10_n1000", "dense_d10_n10000"} {
		in := loadInstance(b, name)
		n, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		var faces []*Face
		vi := vertexIndexList(b, n)
		nv := len(vi)
		for k := 0; k < 20 && k+1 < nv; k++ {
			x := n.centroid([]int{vi[k], vi[(7*k+3)%nv]})
			if f, err := n.FaceAt(context.Background(), x); err == nil && len(f.Rays) < in.D {
				faces = append(faces, f)
			}
		}
		tau := ones(in.D)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			calls := 0
			for b.Loop() {
				calls = 0
				for _, f := range faces {
					for i := 0; i < in.D; i++ {
						c := make([]*big.Rat, in.D)
						for q := range c {
							c[q] = new(big.Rat)
						}
						c[i].SetInt64(1)
						if _, _, err := n.NormalConeMin(context.Background(), f, tau, c); err != nil {
							b.Fatal(err)
						}
						calls++
					}
				}
			}
			b.ReportMetric(float64(calls), "calls/op")
		})
	}
}

// BenchmarkCompactFaceAt measures CompactFaceAt at the centroids of up to
// 20 vertex pairs plus each of those centroids moved off P's compact faces
// by a unit step (caught by the dominance prefilter); one op = all points.
func BenchmarkCompactFaceAt(b *testing.B) {
	for _, name := range []string{"lowrank_3_3_3", "lowrank_5_5_4", "random_d10_n1000", "degree_d10_D10"} {
		in := loadInstance(b, name)
		n, err := New(in.D, in.Points)
		if err != nil {
			b.Fatal(err)
		}
		var xs [][]*big.Rat
		vi := vertexIndexList(b, n)
		nv := len(vi)
		for k := 0; k < 20 && k+1 < nv; k++ {
			x := n.centroid([]int{vi[k], vi[(7*k+3)%nv]})
			xs = append(xs, x)
			y := slices.Clone(x)
			y[k%in.D] = new(big.Rat).Add(y[k%in.D], big.NewRat(1, 1))
			xs = append(xs, y)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			compact := 0
			for b.Loop() {
				compact = 0
				for _, x := range xs {
					f, err := n.CompactFaceAt(context.Background(), x)
					if err != nil {
						b.Fatal(err)
					}
					if f != nil {
						compact++
					}
				}
			}
			b.ReportMetric(float64(len(xs)), "points/op")
			b.ReportMetric(float64(compact), "compact/op")
		})
	}
}
