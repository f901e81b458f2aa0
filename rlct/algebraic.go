package rlct

import (
	"errors"
	"fmt"
	"math/big"
)

// Exact arithmetic with one real algebraic number α.
//
// α is held as a square-free polynomial m over Q with an isolating interval
// (lo, hi] that contains exactly one real root of m, or as a rational
// (lo = hi = α). Elements of Q(α) are polynomials in α of degree below deg m.
// m need not be irreducible: a zero test of q(α) splits m by gcd(m, q) and
// keeps the factor that still has α as a root in the interval (the "dynamic
// evaluation" idea, common practice in computer algebra), so after every
// test m has α as a root, q(α) = 0 exactly when m divides q, and an element
// that is not zero is invertible modulo m.
//
// The sign of a non-zero q(α) is read at a rational point of an interval
// around α that holds no root of q (narrowed by bisection with Sturm counts
// of m; Sturm's theorem as in Basu, Pollack & Roy 2006, Algorithms in Real
// Algebraic Geometry, Theorem 2.50, from memory).

// errAlgebraic reports that an exact computation in Q(α) gave up (too many
// bisection steps); callers treat it as "does not apply".
var errAlgebraic = errors.New("rlct: algebraic arithmetic gave up")

// maxBisections bounds the narrowing of an isolating interval.
const maxBisections = 4000

// realAlg is one real algebraic number α, a root of m in (lo, hi] (or the
// rational lo = hi).
type realAlg struct {
	m      upoly
	lo, hi *big.Rat
	seq    []upoly // the Sturm sequence of m, or nil when m changed
}

// mRootsIn returns the number of roots of m in (lo, hi], as rootsIn does,
// with the Sturm sequence of m computed once per m.
func (a *realAlg) mRootsIn(lo, hi *big.Rat) int {
	if a.seq == nil || a.seq[0].deg() != a.m.deg() || !sameUpoly(a.seq[0], a.m) {
		a.seq = sturm(a.m)
	}
	return changesAt(a.seq, lo) - changesAt(a.seq, hi)
}

func sameUpoly(p, q upoly) bool {
	p, q = p.trim(), q.trim()
	if len(p) != len(q) {
		return false
	}
	for k := range p {
		if p[k].Cmp(q[k]) != 0 {
			return false
		}
	}
	return true
}

// newRealAlg returns α from a root of p isolated in iv (p non-constant).
func newRealAlg(p upoly, iv interval) *realAlg {
	if iv.exact() {
		r := new(big.Rat).Set(iv.Lo)
		return &realAlg{m: upoly{new(big.Rat).Neg(r), big.NewRat(1, 1)}, lo: r, hi: new(big.Rat).Set(r)}
	}
	g := gcd(p, p.derivative())
	sf, _ := p.divMod(g)
	a := &realAlg{m: sf.monic(), lo: new(big.Rat).Set(iv.Lo), hi: new(big.Rat).Set(iv.Hi)}
	// isolateRoots may return (lo, hi] with hi a neighbouring root already
	// recorded (an interval that is open at hi): narrow it until it holds
	// exactly one root, the one inside.
	for range maxBisections {
		if _, ok := a.rational(); ok || a.m.signAt(a.lo) != 0 {
			break
		}
		// lo is a neighbouring root (allowed by isolateRoots): move it in.
		mid := new(big.Rat).Add(a.lo, a.hi)
		mid.Quo(mid, big.NewRat(2, 1))
		if a.m.signAt(mid) == 0 && a.m.signAt(a.hi) != 0 && rootsIn(a.m, mid, a.hi) == 0 {
			a.lo, a.hi = mid, new(big.Rat).Set(mid)
			a.m = upoly{new(big.Rat).Neg(mid), big.NewRat(1, 1)}
			break
		}
		if rootsIn(a.m, mid, a.hi) >= 1 {
			a.lo = mid
		} else {
			a.hi = mid
		}
	}
	for range maxBisections {
		if _, ok := a.rational(); ok || a.m.signAt(a.hi) != 0 {
			break
		}
		mid := new(big.Rat).Add(a.lo, a.hi)
		mid.Quo(mid, big.NewRat(2, 1))
		if a.m.signAt(mid) == 0 {
			a.lo, a.hi = mid, new(big.Rat).Set(mid)
			a.m = upoly{new(big.Rat).Neg(mid), big.NewRat(1, 1)}
			break
		}
		if rootsIn(a.m, a.lo, mid) == 1 {
			a.hi = mid
		} else {
			a.lo = mid
		}
	}
	return a
}

// rational reports whether α is known to be rational, and its value.
func (a *realAlg) rational() (*big.Rat, bool) {
	if a.lo.Cmp(a.hi) == 0 {
		return a.lo, true
	}
	return nil, false
}

// rootsIn returns the number of distinct roots of q in (lo, hi] (q(lo) ≠ 0
// required; the caller checks).
func rootsIn(q upoly, lo, hi *big.Rat) int {
	if q.deg() < 1 {
		return 0
	}
	seq := sturm(q)
	return changesAt(seq, lo) - changesAt(seq, hi)
}

// bisect halves the isolating interval of α once.
func (a *realAlg) bisect() {
	if _, ok := a.rational(); ok {
		return
	}
	mid := new(big.Rat).Add(a.lo, a.hi)
	mid.Quo(mid, big.NewRat(2, 1))
	if a.m.signAt(mid) == 0 {
		a.lo, a.hi = mid, new(big.Rat).Set(mid)
		a.m = upoly{new(big.Rat).Neg(mid), big.NewRat(1, 1)}
		return
	}
	if a.mRootsIn(a.lo, mid) == 1 {
		a.hi = mid
	} else {
		a.lo = mid
	}
}

// reduce returns q mod m.
func (a *realAlg) reduce(q upoly) upoly {
	_, r := q.trim().divMod(a.m)
	return r
}

// isZero reports whether q(α) = 0, shrinking m as explained above.
func (a *realAlg) isZero(q upoly) bool {
	q = a.reduce(q)
	if len(q) == 0 {
		return true
	}
	if r, ok := a.rational(); ok {
		return q.eval(r).Sign() == 0
	}
	g := gcd(a.m, q)
	if g.deg() < 1 {
		return false
	}
	rest, _ := a.m.divMod(g)
	// α is a root of exactly one of g and rest (m is square-free); lo is
	// not a root of m, so the Sturm count of g on (lo, hi] is exact.
	if rootsIn(g, a.lo, a.hi) == 1 {
		a.m = g
		return true
	}
	a.m = rest.monic()
	return false
}

// sign returns the sign of q(α).
func (a *realAlg) sign(q upoly) (int, error) {
	if a.isZero(q) {
		return 0, nil
	}
	q = a.reduce(q)
	if r, ok := a.rational(); ok {
		return q.eval(r).Sign(), nil
	}
	for range maxBisections {
		if r, ok := a.rational(); ok {
			return q.eval(r).Sign(), nil
		}
		if q.signAt(a.lo) != 0 && q.signAt(a.hi) != 0 && rootsIn(q, a.lo, a.hi) == 0 {
			return q.signAt(a.hi), nil
		}
		a.bisect()
	}
	return 0, errAlgebraic
}

// inverse returns 1/q(α) as an element of Q(α); q(α) must be non-zero.
func (a *realAlg) inverse(q upoly) (upoly, error) {
	if a.isZero(q) {
		return nil, errors.New("rlct: division by zero in Q(α)")
	}
	q = a.reduce(q)
	// Extended Euclid: s·q ≡ gcd (mod m); gcd is a constant after isZero.
	r0, r1 := a.m, q
	s0, s1 := upoly(nil), upoly{big.NewRat(1, 1)}
	for r1.deg() > 0 {
		quo, rem := r0.divMod(r1)
		r0, r1 = r1, rem
		s0, s1 = s1, sub(s0, mul(quo, s1))
	}
	if len(r1) == 0 {
		return nil, errors.New("rlct: internal error: element not invertible in Q(α)")
	}
	inv := new(big.Rat).Inv(r1[0])
	return a.reduce(scale(s1, inv)), nil
}

// approx returns a float64 approximation of α after narrowing its interval
// below width.
func (a *realAlg) approx(width *big.Rat) float64 {
	for range maxBisections {
		if new(big.Rat).Sub(a.hi, a.lo).Cmp(width) <= 0 {
			break
		}
		a.bisect()
	}
	mid := new(big.Rat).Add(a.lo, a.hi)
	mid.Quo(mid, big.NewRat(2, 1))
	f, _ := mid.Float64()
	return f
}

// String writes α as "r" or "root of m in (lo, hi]".
func (a *realAlg) String() string {
	if r, ok := a.rational(); ok {
		return r.RatString()
	}
	return fmt.Sprintf("the root of %s in (%s, %s]", upolyString(a.m, "s"), a.lo.RatString(), a.hi.RatString())
}

func scale(p upoly, c *big.Rat) upoly {
	out := make(upoly, len(p))
	for k, x := range p {
		out[k] = new(big.Rat).Mul(x, c)
	}
	return out.trim()
}

func add(p, q upoly) upoly { return sub(p, neg(q)) }

// upolyString writes p in the variable v, highest degree first.
func upolyString(p upoly, v string) string {
	p = p.trim()
	if len(p) == 0 {
		return "0"
	}
	s := ""
	for k := len(p) - 1; k >= 0; k-- {
		c := p[k]
		if c.Sign() == 0 {
			continue
		}
		abs := new(big.Rat).Abs(c)
		switch {
		case s == "" && c.Sign() < 0:
			s = "-"
		case s != "" && c.Sign() < 0:
			s += " - "
		case s != "":
			s += " + "
		}
		mono := ""
		switch k {
		case 0:
		case 1:
			mono = v
		default:
			mono = fmt.Sprintf("%s^%d", v, k)
		}
		switch {
		case mono == "":
			s += abs.RatString()
		case abs.Cmp(big.NewRat(1, 1)) == 0:
			s += mono
		default:
			s += abs.RatString() + "*" + mono
		}
	}
	return s
}

// apoly is a polynomial in t over Q(α): apoly[k] is the coefficient of t^k.
type apoly []upoly

// algRootCount returns the number of distinct real roots of P(t) over Q(α),
// with P(0) ≠ 0 required of the caller, by a Sturm sequence computed in
// Q(α) whose signs at ±∞ are signs of leading coefficients.
func (a *realAlg) realRootCount(P apoly) (int, error) {
	P, err := a.trimA(P)
	if err != nil {
		return 0, err
	}
	if len(P) <= 1 {
		return 0, nil
	}
	seq := []apoly{P, derivA(P)}
	for {
		r, err := a.remA(seq[len(seq)-2], seq[len(seq)-1])
		if err != nil {
			return 0, err
		}
		if len(r) == 0 {
			break
		}
		for k := range r {
			r[k] = neg(r[k])
		}
		seq = append(seq, r)
	}
	var plus, minus []int
	for _, q := range seq {
		s, err := a.sign(q[len(q)-1])
		if err != nil {
			return 0, err
		}
		plus = append(plus, s)
		if (len(q)-1)%2 == 1 {
			s = -s
		}
		minus = append(minus, s)
	}
	return signChanges(minus) - signChanges(plus), nil
}

// trimA drops leading coefficients that vanish at α.
func (a *realAlg) trimA(P apoly) (apoly, error) {
	n := len(P)
	for n > 0 && a.isZero(P[n-1]) {
		n--
	}
	out := make(apoly, n)
	for k := range n {
		out[k] = a.reduce(P[k])
	}
	return out, nil
}

func derivA(P apoly) apoly {
	if len(P) <= 1 {
		return nil
	}
	out := make(apoly, len(P)-1)
	for k := 1; k < len(P); k++ {
		out[k-1] = scale(P[k], new(big.Rat).SetInt64(int64(k)))
	}
	return out
}

// remA returns the remainder of P by Q in Q(α)[t] (Q with a non-zero
// leading coefficient at α, as trimA leaves it).
func (a *realAlg) remA(P, Q apoly) (apoly, error) {
	Q, err := a.trimA(Q)
	if err != nil {
		return nil, err
	}
	R, err := a.trimA(P)
	if err != nil {
		return nil, err
	}
	if len(Q) == 0 {
		return nil, errors.New("rlct: internal error: division by zero polynomial")
	}
	inv, err := a.inverse(Q[len(Q)-1])
	if err != nil {
		return nil, err
	}
	for len(R) >= len(Q) {
		c := a.reduce(mul(R[len(R)-1], inv))
		shift := len(R) - len(Q)
		for k := range Q {
			R[shift+k] = a.reduce(sub(R[shift+k], mul(c, Q[k])))
		}
		R[len(R)-1] = nil
		if R, err = a.trimA(R); err != nil {
			return nil, err
		}
	}
	return R, nil
}

// evalA returns P(x) ∈ Q(α) at a rational x.
func (a *realAlg) evalA(P apoly, x *big.Rat) upoly {
	var v upoly
	for k := len(P) - 1; k >= 0; k-- {
		v = add(scale(v, x), P[k])
	}
	return a.reduce(v)
}

// isolateRealRootA returns an interval (lo, hi] of width at most width
// that holds a real root of P over Q(α), with P(0) ≠ 0 and at least one
// real root (the caller checked with realRootCount).
func (a *realAlg) isolateRealRootA(P apoly, width *big.Rat) (interval, error) {
	P, _ = a.trimA(P)
	// Count roots in (lo, hi] with the Sturm sequence of P over Q(α).
	seq := []apoly{P, derivA(P)}
	for len(seq[len(seq)-1]) > 0 {
		r, err := a.remA(seq[len(seq)-2], seq[len(seq)-1])
		if err != nil {
			return interval{}, err
		}
		if len(r) == 0 {
			break
		}
		for k := range r {
			r[k] = neg(r[k])
		}
		seq = append(seq, r)
	}
	changes := func(x *big.Rat) (int, error) {
		signs := make([]int, len(seq))
		for i, q := range seq {
			s, err := a.sign(a.evalA(q, x))
			if err != nil {
				return 0, err
			}
			signs[i] = s
		}
		return signChanges(signs), nil
	}
	// A bound on the roots: Cauchy's bound with |coefficients| bounded
	// through rational enclosures is awkward in Q(α); instead double B
	// until (−B, B] holds a root.
	B := big.NewRat(1, 1)
	lo, hi := new(big.Rat).Neg(B), B
	for range 200 {
		s, err := a.sign(a.evalA(P, lo))
		if err != nil {
			return interval{}, err
		}
		if s != 0 {
			cl, err1 := changes(lo)
			ch, err2 := changes(hi)
			if err1 != nil || err2 != nil {
				return interval{}, errAlgebraic
			}
			if cl-ch > 0 {
				break
			}
		}
		B = new(big.Rat).Mul(B, big.NewRat(2, 1))
		lo, hi = new(big.Rat).Neg(B), B
	}
	for range maxBisections {
		if new(big.Rat).Sub(hi, lo).Cmp(width) <= 0 {
			return interval{lo, hi}, nil
		}
		mid := new(big.Rat).Add(lo, hi)
		mid.Quo(mid, big.NewRat(2, 1))
		s, err := a.sign(a.evalA(P, mid))
		if err != nil {
			return interval{}, err
		}
		if s == 0 {
			return interval{mid, new(big.Rat).Set(mid)}, nil
		}
		cl, err1 := changes(lo)
		cm, err2 := changes(mid)
		if err1 != nil || err2 != nil {
			return interval{}, errAlgebraic
		}
		if cl-cm > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	return interval{}, errAlgebraic
}
