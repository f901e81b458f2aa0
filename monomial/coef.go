package monomial

import (
	"math"
	"math/big"
	"math/bits"
)

// coef is an exact rational coefficient. Small values are held in machine
// words (num/den with den > 0, gcd(|num|, den) = 1 and num != MinInt64 so
// that negation cannot overflow); every operation detects overflow and falls
// back to a *big.Rat, and big results that fit again are brought back to the
// small form. When big != nil the value is big and num/den are unused.
//
// A big.Rat held by a coef is never modified after the coef is made, so
// coefs (and the polynomials holding them) can share it freely.
type coef struct {
	num, den int64
	big      *big.Rat
}

// forceBig makes every coefficient take the big.Rat path. It exists only so
// that tests and benchmarks can compare the word-sized fast path with the
// plain big.Rat path; it must not be changed while other goroutines work.
var forceBig = false

var (
	coefZero = coef{num: 0, den: 1}
	coefOne  = coef{num: 1, den: 1}
)

func smallInt(n int64) coef {
	if forceBig || n == math.MinInt64 {
		return coef{big: new(big.Rat).SetInt64(n)}
	}
	return coef{num: n, den: 1}
}

// coefFromRat returns the coefficient equal to r (r is not retained).
func coefFromRat(r *big.Rat) coef {
	return normBig(new(big.Rat).Set(r))
}

// normBig wraps r (which the caller gives up) and returns the small form
// when it fits.
func normBig(r *big.Rat) coef {
	if !forceBig {
		n, d := r.Num(), r.Denom()
		if n.IsInt64() && d.IsInt64() {
			nn := n.Int64()
			if nn != math.MinInt64 {
				return coef{num: nn, den: d.Int64()}
			}
		}
	}
	return coef{big: r}
}

func (c coef) isZero() bool {
	if c.big != nil {
		return c.big.Sign() == 0
	}
	return c.num == 0
}

func (c coef) sign() int {
	if c.big != nil {
		return c.big.Sign()
	}
	switch {
	case c.num > 0:
		return 1
	case c.num < 0:
		return -1
	}
	return 0
}

func (c coef) isOne() bool {
	if c.big != nil {
		return c.big.Num().IsInt64() && c.big.Num().Int64() == 1 && c.big.IsInt()
	}
	return c.num == 1 && c.den == 1
}

// rat returns a new big.Rat equal to c.
func (c coef) rat() *big.Rat {
	if c.big != nil {
		return new(big.Rat).Set(c.big)
	}
	return big.NewRat(c.num, c.den)
}

// ratView returns a big.Rat equal to c that the caller must not modify.
func (c coef) ratView() *big.Rat {
	if c.big != nil {
		return c.big
	}
	return big.NewRat(c.num, c.den)
}

func (c coef) float64() float64 {
	if c.big != nil {
		f, _ := c.big.Float64()
		return f
	}
	if c.den == 1 {
		return float64(c.num)
	}
	f, _ := big.NewRat(c.num, c.den).Float64()
	return f
}

func (c coef) equal(d coef) bool {
	if c.big == nil && d.big == nil {
		return c.num == d.num && c.den == d.den
	}
	return c.ratView().Cmp(d.ratView()) == 0
}

func (c coef) neg() coef {
	if c.big != nil {
		return normBig(new(big.Rat).Neg(c.big))
	}
	return coef{num: -c.num, den: c.den}
}

// add64 returns a+b and whether it did not overflow (MinInt64 counts as
// overflow, keeping the small form closed under negation).
func add64(a, b int64) (int64, bool) {
	s := a + b
	if (a >= 0) == (b >= 0) && (s >= 0) != (a >= 0) {
		return 0, false
	}
	return s, s != math.MinInt64
}

// mul64 returns a*b and whether it did not overflow.
func mul64(a, b int64) (int64, bool) {
	neg := (a < 0) != (b < 0)
	ua, ub := abs64(a), abs64(b)
	hi, lo := bits.Mul64(ua, ub)
	if hi != 0 || lo > math.MaxInt64 {
		return 0, false
	}
	if neg {
		return -int64(lo), true
	}
	return int64(lo), true
}

func abs64(a int64) uint64 {
	if a < 0 {
		return uint64(-a)
	}
	return uint64(a)
}

func gcd64(a, b uint64) uint64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func (c coef) add(d coef) coef {
	if c.big == nil && d.big == nil {
		if c.den == 1 && d.den == 1 {
			if s, ok := add64(c.num, d.num); ok {
				return coef{num: s, den: 1}
			}
		} else if r, ok := addSmall(c, d); ok {
			return r
		}
	}
	return normBig(new(big.Rat).Add(c.ratView(), d.ratView()))
}

// addSmall adds two small rationals (Knuth, TAOCP vol. 2, 4.5.1).
func addSmall(c, d coef) (coef, bool) {
	g := int64(gcd64(uint64(c.den), uint64(d.den)))
	if g == 1 {
		x, ok1 := mul64(c.num, d.den)
		y, ok2 := mul64(d.num, c.den)
		den, ok3 := mul64(c.den, d.den)
		if !(ok1 && ok2 && ok3) {
			return coef{}, false
		}
		num, ok := add64(x, y)
		if !ok {
			return coef{}, false
		}
		if num == 0 {
			return coefZero, true
		}
		return coef{num: num, den: den}, true
	}
	x, ok1 := mul64(c.num, d.den/g)
	y, ok2 := mul64(d.num, c.den/g)
	if !(ok1 && ok2) {
		return coef{}, false
	}
	t, ok := add64(x, y)
	if !ok {
		return coef{}, false
	}
	if t == 0 {
		return coefZero, true
	}
	g2 := int64(gcd64(abs64(t), uint64(g)))
	den, ok := mul64(c.den/g, d.den/g2)
	if !ok {
		return coef{}, false
	}
	return coef{num: t / g2, den: den}, true
}

func (c coef) sub(d coef) coef { return c.add(d.neg()) }

func (c coef) mul(d coef) coef {
	if c.big == nil && d.big == nil {
		if c.den == 1 && d.den == 1 {
			if p, ok := mul64(c.num, d.num); ok {
				return coef{num: p, den: 1}
			}
		} else if r, ok := mulSmall(c, d); ok {
			return r
		}
	}
	return normBig(new(big.Rat).Mul(c.ratView(), d.ratView()))
}

func mulSmall(c, d coef) (coef, bool) {
	if c.num == 0 || d.num == 0 {
		return coefZero, true
	}
	g1 := int64(gcd64(abs64(c.num), uint64(d.den)))
	g2 := int64(gcd64(abs64(d.num), uint64(c.den)))
	num, ok1 := mul64(c.num/g1, d.num/g2)
	den, ok2 := mul64(c.den/g2, d.den/g1)
	if !(ok1 && ok2) {
		return coef{}, false
	}
	return coef{num: num, den: den}, true
}

// addMul returns c + a*b.
func (c coef) addMul(a, b coef) coef {
	if c.big == nil && a.big == nil && b.big == nil && c.den == 1 && a.den == 1 && b.den == 1 {
		if p, ok := mul64(a.num, b.num); ok {
			if s, ok := add64(c.num, p); ok {
				return coef{num: s, den: 1}
			}
		}
	}
	return c.add(a.mul(b))
}

// inv returns 1/c; c must not be zero.
func (c coef) inv() coef {
	if c.big != nil {
		return normBig(new(big.Rat).Inv(c.big))
	}
	if c.num < 0 {
		return coef{num: -c.den, den: -c.num}
	}
	return coef{num: c.den, den: c.num}
}

// bitLen is the number of bits of numerator plus denominator: a size measure.
func (c coef) bitLen() int {
	if c.big != nil {
		return c.big.Num().BitLen() + c.big.Denom().BitLen()
	}
	return bits.Len64(abs64(c.num)) + bits.Len64(uint64(c.den))
}

// log2Parts returns log2 of |numerator| (0 for 0) and of the denominator.
func (c coef) log2Parts() (num, den float64) {
	log2 := func(x *big.Int) float64 {
		if x.Sign() == 0 {
			return 0
		}
		if x.IsInt64() {
			return math.Log2(math.Abs(float64(x.Int64())))
		}
		return float64(x.BitLen())
	}
	if c.big != nil {
		return log2(c.big.Num()), log2(c.big.Denom())
	}
	if c.num == 0 {
		return 0, 0
	}
	return math.Log2(float64(abs64(c.num))), math.Log2(float64(c.den))
}

// powInt returns c^n for n >= 0.
func (c coef) powInt(n int) coef {
	r := coefOne
	if forceBig {
		r = coef{big: big.NewRat(1, 1)}
	}
	b := c
	for n > 0 {
		if n&1 == 1 {
			r = r.mul(b)
		}
		n >>= 1
		if n > 0 {
			b = b.mul(b)
		}
	}
	return r
}
