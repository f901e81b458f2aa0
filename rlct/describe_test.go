package rlct

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

func describeSpec(t *testing.T, s *Spec) *Description {
	t.Helper()
	p, err := s.Problem()
	if err != nil {
		t.Fatalf("%+v: %v", s, err)
	}
	ds, err := Describe(context.Background(), p, nil)
	if err != nil {
		t.Fatalf("%+v: %v", s, err)
	}
	if len(ds) != 1 {
		t.Fatalf("%+v: %d descriptions, want 1", s, len(ds))
	}
	return ds[0]
}

// TestDescribeByHand compares the vertices, facets and hit point with
// polyhedra worked out by hand.
func TestDescribeByHand(t *testing.T) {
	tests := []struct {
		name     string
		spec     Spec
		vertices []string // "exponent monomial coefficient [generators]"
		facets   []string // inequality | rays
		hit      string
	}{
		{
			// P = conv{(4,0),(0,6)} + R²₊: the edge lies on 3x + 2y = 12,
			// and the two unbounded edges on x = 0 and y = 0 (by hand). The
			// ray (t,t) meets 3x + 2y = 12 at t = 12/5, λ = 5/12 (Howald
			// 2001, Trans. AMS 353, halved for squares).
			name:     "x^4+y^6",
			spec:     Spec{K: "x^4 + y^6"},
			vertices: []string{"[0 6] y^6 1", "[4 0] x^4 1"},
			facets:   []string{"3*x + 2*y >= 12 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "12/5 12/5",
		},
		{
			// Coefficients are carried: 3x^2 + 5y^2 − xy has vertices with
			// coefficients 3 and 5; (1,1) lies on the edge x + y = 2.
			name:     "coefficients",
			spec:     Spec{K: "3*x^2 - x*y + 5*y^2"},
			vertices: []string{"[0 2] y^2 5", "[2 0] x^2 3"},
			facets:   []string{"x + y >= 2 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "1 1",
		},
		{
			// Sum-of-squares form: K = (x + y)² + (x·y)², P(⟨x+y, xy⟩) has
			// vertices (1,0), (0,1), so P(K) has (2,0), (0,2) with the
			// coefficient of x² in K equal to 1² + 0² (by hand).
			name:     "sos",
			spec:     Spec{SOS: []string{"x + y; x*y"}},
			vertices: []string{"[0 2] y^2 1 [1 0]", "[2 0] x^2 1 [1 0]"},
			facets:   []string{"x + y >= 2 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "1 1",
		},
		{
			// (2x − 2y)² + (3x)²: vertex (2,0) carries 2² + 3² = 13.
			name:     "sos-coefficients",
			spec:     Spec{SOS: []string{"2*x - 2*y; 3*x"}},
			vertices: []string{"[0 2] y^2 4 [-2 0]", "[2 0] x^2 13 [2 3]"},
			facets:   []string{"x + y >= 2 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "1 1",
		},
		{
			// x²y² + z²: P = conv{(2,2,0),(0,0,2)} + R³₊ has the facets
			// x, y, z ≥ 0 and x + z ≥ 2, y + z ≥ 2 through the edge (by
			// hand); (1,1,1) is the midpoint of the edge, so θ = 2.
			name:     "x^2*y^2+z^2",
			spec:     Spec{K: "x^2*y^2 + z^2"},
			vertices: []string{"[0 0 2] z^2 1", "[2 2 0] x^2*y^2 1"},
			facets:   []string{"x + z >= 2 | y", "y + z >= 2 | x", "x >= 0 | y,z", "y >= 0 | x,z", "z >= 0 | x,y"},
			hit:      "1 1 1",
		},
		{
			// Prior exponent h_x = 1 gives τ = (2, 1); the ray (2t, t) meets
			// x + y = 2 at t = 2/3 (by hand).
			name:     "prior",
			spec:     Spec{K: "x^2 + y^2", Prior: "x=1"},
			vertices: []string{"[0 2] y^2 1", "[2 0] x^2 1"},
			facets:   []string{"x + y >= 2 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "4/3 2/3",
		},
		{
			// At w* = (1, 0), K = (x − 1)² + y² is u² + y² in u = x − 1.
			name:     "point",
			spec:     Spec{K: "(x-1)^2 + y^2", At: []string{"x=1"}},
			vertices: []string{"[0 2] y^2 1", "[2 0] x^2 1"},
			facets:   []string{"x + y >= 2 |", "x >= 0 | y", "y >= 0 | x"},
			hit:      "1 1",
		},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := describeSpec(t, &tt.spec)
			var verts []string
			for _, v := range d.Vertices {
				s := fmt.Sprintf("%v %s %s", v.Exponent, v.Monomial, v.Coefficient.RatString())
				if v.Generators != nil {
					s += " " + fmt.Sprint(ratStrings(v.Generators))
				}
				verts = append(verts, strings.ReplaceAll(s, "\"", ""))
			}
			if !slices.Equal(verts, tt.vertices) {
				t.Errorf("vertices %q, want %q", verts, tt.vertices)
			}
			var facets []string
			for _, f := range d.Facets {
				facets = append(facets, f.Inequality+" | "+strings.Join(f.Rays, ","))
			}
			want := slices.Clone(tt.facets)
			for i := range want {
				want[i] = strings.TrimSpace(want[i])
			}
			for i := range facets {
				facets[i] = strings.TrimSpace(facets[i])
			}
			sort.Strings(facets)
			sort.Strings(want)
			if !slices.Equal(facets, want) {
				t.Errorf("facets %q, want %q", facets, want)
			}
			if got := strings.Join(ratStrings(d.Hit), " "); got != tt.hit {
				t.Errorf("hit point %s, want %s", got, tt.hit)
			}
			checkFacets(t, d)
		})
	}
}

// checkFacets checks each facet against the vertices and the support: a·x ≥
// b everywhere, with equality exactly on the listed vertices, and a_i = 0
// exactly for the listed rays.
func checkFacets(t *testing.T, d *Description) {
	t.Helper()
	dot := func(a []*big.Int, x []int) *big.Int {
		s := new(big.Int)
		for i, c := range a {
			s.Add(s, new(big.Int).Mul(c, big.NewInt(int64(x[i]))))
		}
		return s
	}
	for _, f := range d.Facets {
		on := 0
		for _, v := range d.Vertices {
			c := dot(f.Normal, v.Exponent).Cmp(f.RHS)
			if c < 0 {
				t.Errorf("%s: vertex %v violates it", f.Inequality, v.Exponent)
			}
			listed := slices.ContainsFunc(f.Vertices, func(w []int) bool { return slices.Equal(w, v.Exponent) })
			if (c == 0) != listed {
				t.Errorf("%s: vertex %v on the facet %v, listed %v", f.Inequality, v.Exponent, c == 0, listed)
			}
			if c == 0 {
				on++
			}
		}
		if on == 0 {
			t.Errorf("%s: no vertex on the facet", f.Inequality)
		}
		for _, e := range d.Support {
			if dot(f.Normal, e).Cmp(f.RHS) < 0 {
				t.Errorf("%s: exponent %v violates it", f.Inequality, e)
			}
		}
		for i, a := range f.Normal {
			if (a.Sign() == 0) != slices.Contains(f.Rays, d.Vars[i]) {
				t.Errorf("%s: normal %v against rays %v", f.Inequality, f.Normal, f.Rays)
			}
		}
	}
}

// TestDescribeSOSAgainstExpansion cross-checks the sum-of-squares form with
// the polynomial form of the expanded K = Σ g_i²: the same vertices with the
// same coefficients and the same facets, so P(K) = 2·P(⟨g⟩) is respected.
func TestDescribeSOSAgainstExpansion(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 7))
	vars := []string{"x", "y", "z"}
	for trial := range 40 {
		d := 2 + trial%2
		var gens []*monomial.Poly
		k := monomial.Zero(vars[:d])
		for range 1 + rng.IntN(3) {
			g := monomial.Zero(vars[:d])
			for range 1 + rng.IntN(4) {
				e := make(monomial.Exponent, d)
				for i := range e {
					e[i] = rng.IntN(4)
				}
				if slices.Max(e) == 0 {
					e[0] = 1 // keep g(0) = 0
				}
				c := big.NewRat(int64(rng.IntN(7)-3), int64(1+rng.IntN(3)))
				g = g.Add(monomial.Monomial(vars[:d], e, c))
			}
			if g.IsZero() {
				continue
			}
			gens = append(gens, g)
			k = k.Add(g.Mul(g))
		}
		if len(gens) == 0 {
			continue
		}
		sosAll, err := Describe(context.Background(), &Problem{Generators: gens}, nil)
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		polyAll, err := Describe(context.Background(), &Problem{K: k}, nil)
		if err != nil {
			t.Fatalf("trial %d: K = %s: %v", trial, k, err)
		}
		if len(sosAll) != 1 || len(polyAll) != 1 {
			t.Fatalf("trial %d: %d and %d descriptions at the origin, want 1", trial, len(sosAll), len(polyAll))
		}
		sos, poly := sosAll[0], polyAll[0]
		if len(sos.Vertices) != len(poly.Vertices) {
			t.Fatalf("trial %d: %d vertices in sum-of-squares form, %d expanded", trial, len(sos.Vertices), len(poly.Vertices))
		}
		for i, v := range sos.Vertices {
			w := poly.Vertices[i]
			if !slices.Equal(v.Exponent, w.Exponent) || v.Coefficient.Cmp(w.Coefficient) != 0 || v.Monomial != w.Monomial {
				t.Errorf("trial %d: vertex %v %s %s, expanded %v %s %s", trial,
					v.Exponent, v.Monomial, v.Coefficient.RatString(), w.Exponent, w.Monomial, w.Coefficient.RatString())
			}
		}
		if len(sos.Facets) != len(poly.Facets) {
			t.Fatalf("trial %d: %d facets in sum-of-squares form, %d expanded", trial, len(sos.Facets), len(poly.Facets))
		}
		for i, f := range sos.Facets {
			if f.Inequality != poly.Facets[i].Inequality {
				t.Errorf("trial %d: facet %s, expanded %s", trial, f.Inequality, poly.Facets[i].Inequality)
			}
		}
		if sos.Distance.Cmp(poly.Distance) != 0 {
			t.Errorf("trial %d: t = %s in sum-of-squares form, %s expanded", trial, sos.Distance.RatString(), poly.Distance.RatString())
		}
		checkFacets(t, sos)
	}
}

// The JSON form of a Description: the Result's fields with the vertices,
// facets and hit point beside them, exact numbers as strings.
func TestDescribeJSON(t *testing.T) {
	d := describeSpec(t, &Spec{SOS: []string{"x; y^2"}})
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false) // as the command line writes it
	if err := enc.Encode(d); err != nil {
		t.Fatal(err)
	}
	data := buf.Bytes()
	var rep struct {
		Lambda   string `json:"lambda"`
		Vertices []struct {
			Exponent    []int    `json:"exponent"`
			Monomial    string   `json:"monomial"`
			Coefficient string   `json:"coefficient"`
			Generators  []string `json:"generators"`
		} `json:"vertices"`
		Facets []struct {
			Normal     []string `json:"normal"`
			RHS        string   `json:"rhs"`
			Inequality string   `json:"inequality"`
			Vertices   [][]int  `json:"vertices"`
			Rays       []string `json:"rays"`
		} `json:"facets"`
		Hit []string `json:"hit_point"`
	}
	if err := json.Unmarshal(data, &rep); err != nil {
		t.Fatalf("%v in %s", err, data)
	}
	if rep.Lambda != "3/4" || len(rep.Vertices) != 2 || len(rep.Facets) != 3 {
		t.Fatalf("JSON %s", data)
	}
	// P(K) for K = x² + y⁴: vertices (2,0) and (0,4), edge 2x + y ≥ 4 (by
	// hand); λ = 1/2 + 1/4 (common practice: λ of a sum of monomials in
	// separate variables adds).
	if got := rep.Vertices[0]; !slices.Equal(got.Exponent, []int{0, 4}) || got.Monomial != "y^4" || got.Coefficient != "1" || !slices.Equal(got.Generators, []string{"0", "1"}) {
		t.Errorf("first vertex %+v", got)
	}
	if got := rep.Facets[0]; got.Inequality != "y >= 0" || got.RHS != "0" || !slices.Equal(got.Normal, []string{"0", "1"}) || !slices.Equal(got.Rays, []string{"x"}) {
		t.Errorf("first facet %+v", got)
	}
	if got := rep.Facets[2]; got.Inequality != "2*x + y >= 4" || got.RHS != "4" || len(got.Rays) != 0 {
		t.Errorf("last facet %+v", got)
	}
	if !slices.Equal(rep.Hit, []string{"4/3", "4/3"}) {
		t.Errorf("hit %v", rep.Hit)
	}
	// Without HTML escaping '>' reads as it is; the support is not written.
	if !strings.Contains(string(data), `"inequality":"2*x + y >= 4"`) || strings.Contains(string(data), "support") {
		t.Errorf("JSON %s", data)
	}
}

// ratStrings writes exact values in lowest terms.
func ratStrings(xs []*big.Rat) []string {
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = x.RatString()
	}
	return out
}

func ExampleDescribe() {
	p, err := (&Spec{K: "x^4 + 2*y^6 + x^2*y^2"}).Problem()
	if err != nil {
		panic(err)
	}
	ds, err := Describe(context.Background(), p, nil)
	if err != nil {
		panic(err)
	}
	d := ds[0] // one description per point; here the origin alone
	for _, v := range d.Vertices {
		fmt.Println("vertex", v.Monomial, "coefficient", v.Coefficient.RatString())
	}
	for _, f := range d.Facets {
		fmt.Println("facet", f.Inequality)
	}
	fmt.Println("λ =", d.Lambda.RatString(), "θ =", d.Theta, d.Status)
	// Output:
	// vertex y^6 coefficient 2
	// vertex x^2*y^2 coefficient 1
	// vertex x^4 coefficient 1
	// facet y >= 0
	// facet x >= 0
	// facet x + y >= 4
	// facet 2*x + y >= 6
	// λ = 1/2 θ = 2 exact
}

func TestFormatInequality(t *testing.T) {
	vars := []string{"x", "y", "z"}
	tests := []struct {
		a    []int64
		b    int64
		want string
	}{
		{[]int64{3, 2, 0}, 12, "3*x + 2*y >= 12"},
		{[]int64{0, 0, 1}, 0, "z >= 0"},
		{[]int64{1, 1, 1}, 3, "x + y + z >= 3"},
		{[]int64{0, 0, 0}, 0, "0 >= 0"},
	}
	for _, tt := range tests {
		a := make([]*big.Int, len(tt.a))
		for i, x := range tt.a {
			a[i] = big.NewInt(x)
		}
		if got := FormatInequality(vars, a, big.NewInt(tt.b)); got != tt.want {
			t.Errorf("%v >= %d: got %q, want %q", tt.a, tt.b, got, tt.want)
		}
	}
}
