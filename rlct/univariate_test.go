package rlct

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// up builds a upoly from integer coefficients, constant term first.
func up(cs ...int64) upoly {
	p := make(upoly, len(cs))
	for i, c := range cs {
		p[i] = big.NewRat(c, 1)
	}
	return p.trim()
}

// fromRoots returns Π (s − r) over the given rational roots.
func fromRoots(roots ...*big.Rat) upoly {
	p := upoly{big.NewRat(1, 1)}
	for _, r := range roots {
		p = mul(p, upoly{new(big.Rat).Neg(r), big.NewRat(1, 1)})
	}
	return p
}

func equalUpoly(a, b upoly) bool {
	a, b = a.trim(), b.trim()
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Cmp(b[i]) != 0 {
			return false
		}
	}
	return true
}

var realRootTests = []struct {
	name  string
	p     upoly
	roots int      // distinct real roots
	exact []string // exact rational roots expected among the intervals
}{
	// common practice: s² − 2 has the two roots ±√2.
	{"s^2-2", up(-2, 0, 1), 2, nil},
	// common practice: s² + 1 has no real root.
	{"s^2+1", up(1, 0, 1), 0, nil},
	// (s−1)², the edge polynomial of (y − x²)²: one double root at 1.
	{"(s-1)^2", up(1, -2, 1), 1, []string{"1"}},
	// (s−1)(s−2)(s−3) = s³ − 6s² + 11s − 6.
	{"(s-1)(s-2)(s-3)", up(-6, 11, -6, 1), 3, []string{"1", "2", "3"}},
	// Chebyshev T_5 = 16s⁵ − 20s³ + 5s has five roots cos((2k−1)π/10) in
	// (−1, 1) (Abramowitz & Stegun 1964, Table 22.3 and 22.16.4; from memory).
	{"T5", up(0, 5, 0, -20, 0, 16), 5, []string{"0"}},
	// s⁴ + s² + 1 = (s² + s + 1)(s² − s + 1): no real roots.
	{"s^4+s^2+1", up(1, 0, 1, 0, 1), 0, nil},
	// constants have no roots.
	{"7", up(7), 0, nil},
}

func TestCountRealRoots(t *testing.T) {
	for _, tt := range realRootTests {
		if got := countRealRoots(tt.p); got != tt.roots {
			t.Errorf("%s: countRealRoots = %d, want %d", tt.name, got, tt.roots)
		}
	}
}

func TestIsolateRoots(t *testing.T) {
	width := big.NewRat(1, 1<<20)
	for _, tt := range realRootTests {
		ivs := isolateRoots(tt.p, width)
		if len(ivs) != tt.roots {
			t.Errorf("%s: %d intervals, want %d", tt.name, len(ivs), tt.roots)
			continue
		}
		exact := map[string]bool{}
		for i, iv := range ivs {
			if iv.exact() {
				exact[iv.Lo.RatString()] = true
				if tt.p.signAt(iv.Lo) != 0 {
					t.Errorf("%s: exact root %s is not a root", tt.name, iv.Lo.RatString())
				}
				continue
			}
			if new(big.Rat).Sub(iv.Hi, iv.Lo).Cmp(width) > 0 {
				t.Errorf("%s: interval %d too wide", tt.name, i)
			}
			if i > 0 && ivs[i-1].Hi.Cmp(iv.Lo) > 0 {
				t.Errorf("%s: intervals out of order", tt.name)
			}
		}
		for _, want := range tt.exact {
			if !exact[want] {
				t.Errorf("%s: root %s not found exactly; got %v", tt.name, want, ivs)
			}
		}
	}
}

// The roots of T_5 agree with the closed form cos((2k−1)π/10), k = 1..5
// (Abramowitz & Stegun 1964, 22.16.4; from memory).
func TestIsolateChebyshevRoots(t *testing.T) {
	ivs := isolateRoots(up(0, 5, 0, -20, 0, 16), big.NewRat(1, 1<<40))
	var want []float64
	for k := 5; k >= 1; k-- {
		want = append(want, math.Cos(float64(2*k-1)*math.Pi/10))
	}
	for i, iv := range ivs {
		lo, _ := iv.Lo.Float64()
		hi, _ := iv.Hi.Float64()
		if want[i] < lo-1e-12 || want[i] > hi+1e-12 {
			t.Errorf("root %d: cos formula gives %v outside [%v, %v]", i, want[i], lo, hi)
		}
	}
}

func TestSquareFree(t *testing.T) {
	// (s−1)²·(s+2)³·(s²+1): Yun's factors by multiplicity are s²+1, s−1, s+2.
	p := mul(mul(fromRoots(big.NewRat(1, 1), big.NewRat(1, 1)),
		fromRoots(big.NewRat(-2, 1), big.NewRat(-2, 1), big.NewRat(-2, 1))), up(1, 0, 1))
	f := squareFree(p)
	want := []upoly{up(1, 0, 1), up(-1, 1), up(2, 1)}
	if len(f) != len(want) {
		t.Fatalf("squareFree gave %d factors, want %d", len(f), len(want))
	}
	for i := range want {
		if !equalUpoly(f[i], want[i]) {
			t.Errorf("factor %d: got %v, want %v", i+1, f[i], want[i])
		}
	}
	// The odd-multiplicity part is (s²+1)(s+2): one sign change, at −2.
	odd := oddMultiplicityPart(p)
	if !equalUpoly(odd.monic(), mul(up(1, 0, 1), up(2, 1))) {
		t.Errorf("oddMultiplicityPart = %v", odd)
	}
	if n := countRealRoots(odd); n != 1 {
		t.Errorf("odd part has %d real roots, want 1", n)
	}
}

// Random polynomials built from known roots: Π (s − r_i)^{m_i}·(s² + c) with
// c > 0. The number of distinct real roots is known by construction.
func TestRootsOfConstructedPolynomials(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := range 200 {
		distinct := map[string]bool{}
		p := upoly{big.NewRat(int64(rng.IntN(5)+1), 1)}
		for range rng.IntN(4) {
			r := big.NewRat(int64(rng.IntN(21)-10), int64(rng.IntN(4)+1))
			distinct[r.RatString()] = true
			for range rng.IntN(3) + 1 {
				p = mul(p, upoly{new(big.Rat).Neg(r), big.NewRat(1, 1)})
			}
		}
		if rng.IntN(2) == 0 {
			p = mul(p, up(int64(rng.IntN(9)+1), 0, 1))
		}
		if got := countRealRoots(p); got != len(distinct) {
			t.Fatalf("trial %d: p = %v: countRealRoots = %d, want %d", trial, p, got, len(distinct))
		}
		ivs := isolateRoots(p, big.NewRat(1, 1<<10))
		if len(ivs) != len(distinct) {
			t.Fatalf("trial %d: %d intervals, want %d", trial, len(ivs), len(distinct))
		}
		for _, iv := range ivs {
			found := false
			for s := range distinct {
				r, _ := new(big.Rat).SetString(s)
				if (iv.exact() && iv.Lo.Cmp(r) == 0) || (iv.Lo.Cmp(r) < 0 && r.Cmp(iv.Hi) <= 0) {
					found = true
				}
			}
			if !found {
				t.Fatalf("trial %d: interval [%s, %s] holds none of the roots %v", trial, iv.Lo.RatString(), iv.Hi.RatString(), distinct)
			}
		}
	}
}

func TestGCD(t *testing.T) {
	a := fromRoots(big.NewRat(1, 1), big.NewRat(2, 1), big.NewRat(-1, 3))
	b := fromRoots(big.NewRat(2, 1), big.NewRat(-1, 3), big.NewRat(5, 1))
	if g := gcd(a, b); !equalUpoly(g, fromRoots(big.NewRat(2, 1), big.NewRat(-1, 3))) {
		t.Errorf("gcd = %v", g)
	}
	if g := gcd(nil, up(2, 4)); !equalUpoly(g, upoly{big.NewRat(1, 2), big.NewRat(1, 1)}) {
		t.Errorf("gcd(0, 2+4s) = %v", g)
	}
}
