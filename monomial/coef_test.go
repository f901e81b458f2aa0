package monomial

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// interesting returns int64 values near the overflow boundaries and small
// ones, to drive the word-sized fast path into and out of its fallback.
func interestingInt64s() []int64 {
	return []int64{0, 1, -1, 2, -2, 3, 7, -12, 1 << 31, -(1 << 31), 1<<32 + 1,
		math.MaxInt32, math.MaxInt64, -math.MaxInt64, math.MaxInt64 - 1, 1 << 62, -(1 << 62),
		3037000499, 3037000500, -3037000500, 6, 10}
}

func randomCoef(r *rand.Rand) (coef, *big.Rat) {
	vals := interestingInt64s()
	pick := func() int64 {
		if r.IntN(3) == 0 {
			return vals[r.IntN(len(vals))]
		}
		return r.Int64N(2001) - 1000
	}
	n, d := pick(), pick()
	if d == 0 {
		d = 1
	}
	ref := big.NewRat(n, d)
	return coefFromRat(ref), ref
}

// TestCoefArithmetic checks the word-sized arithmetic with overflow
// detection against math/big on values near the int64 limits (brute force
// vs fast path, common practice).
func TestCoefArithmetic(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for range 20000 {
		a, ra := randomCoef(r)
		b, rb := randomCoef(r)
		c, rc := randomCoef(r)
		check := func(name string, got coef, want *big.Rat) {
			t.Helper()
			if got.ratView().Cmp(want) != 0 {
				t.Fatalf("%s(%v, %v) = %v, want %v", name, ra, rb, got.ratView(), want)
			}
			if got.big == nil && (got.den <= 0 || gcd64(abs64(got.num), uint64(got.den)) != 1 && got.num != 0 || got.num == math.MinInt64) {
				t.Fatalf("%s: small result %d/%d not in lowest terms", name, got.num, got.den)
			}
			if got.big != nil && got.big.Num().IsInt64() && got.big.Denom().IsInt64() && got.big.Num().Int64() != math.MinInt64 {
				t.Fatalf("%s: result %v fits in words but was left big", name, got.big)
			}
		}
		check("add", a.add(b), new(big.Rat).Add(ra, rb))
		check("sub", a.sub(b), new(big.Rat).Sub(ra, rb))
		check("mul", a.mul(b), new(big.Rat).Mul(ra, rb))
		check("addMul", c.addMul(a, b), new(big.Rat).Add(rc, new(big.Rat).Mul(ra, rb)))
		check("neg", a.neg(), new(big.Rat).Neg(ra))
		if ra.Sign() != 0 {
			check("inv", a.inv(), new(big.Rat).Inv(ra))
		}
		if !a.equal(coefFromRat(ra)) || a.equal(b) != (ra.Cmp(rb) == 0) {
			t.Fatalf("equal(%v, %v) wrong", ra, rb)
		}
	}
}

func TestCoefPowInt(t *testing.T) {
	for _, tc := range []struct {
		c    *big.Rat
		n    int
		want string
	}{
		{big.NewRat(2, 3), 0, "1"},
		{big.NewRat(2, 3), 5, "32/243"},
		{big.NewRat(-2, 1), 63, "-9223372036854775808"}, // -2^63 does not fit the small form
		{big.NewRat(-1, 2), 3, "-1/8"},
		{big.NewRat(10, 1), 30, "1000000000000000000000000000000"},
	} {
		got := coefFromRat(tc.c).powInt(tc.n).ratView().RatString()
		if got != tc.want {
			t.Errorf("(%v)^%d = %s, want %s", tc.c, tc.n, got, tc.want)
		}
	}
}
