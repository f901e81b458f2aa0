package monomial

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
	"time"
)

var xyz = []string{"x", "y", "z"}

func rat(s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		panic("bad rational " + s)
	}
	return r
}

func rats(ss ...string) []*big.Rat {
	out := make([]*big.Rat, len(ss))
	for i, s := range ss {
		out[i] = rat(s)
	}
	return out
}

// randomPoly returns a seeded random polynomial with up to terms terms,
// exponents up to maxExp, and coefficients that are sometimes huge (to
// exercise the big.Rat fallback).
func randomPoly(r *rand.Rand, vars []string, terms, maxExp int) *Poly {
	var exps []Exponent
	var coefs []*big.Rat
	for range terms {
		e := make(Exponent, len(vars))
		for i := range e {
			if r.IntN(2) == 0 {
				e[i] = r.IntN(maxExp + 1)
			}
		}
		var c *big.Rat
		switch r.IntN(6) {
		case 0:
			c = new(big.Rat).SetFrac(new(big.Int).Lsh(big.NewInt(r.Int64N(100)+1), 70), big.NewInt(r.Int64N(9)+1))
		case 1:
			c = big.NewRat(r.Int64N(math.MaxInt64)-math.MaxInt64/2, r.Int64N(1<<40)+1)
		default:
			c = big.NewRat(r.Int64N(21)-10, r.Int64N(4)+1)
		}
		exps = append(exps, e)
		coefs = append(coefs, c)
	}
	p, err := FromTerms(vars, exps, coefs)
	if err != nil {
		panic(err)
	}
	return p
}

func randomPoint(r *rand.Rand, n int) []*big.Rat {
	x := make([]*big.Rat, n)
	for i := range x {
		x[i] = big.NewRat(r.Int64N(11)-5, r.Int64N(3)+1)
	}
	return x
}

// checkCanonical verifies the invariants promised by the Poly doc comment.
func checkCanonical(t *testing.T, p *Poly) {
	t.Helper()
	for i := range p.Len() {
		e, c := p.Term(i)
		if c.Sign() == 0 {
			t.Fatalf("zero coefficient in %v", p)
		}
		if i > 0 {
			prev, _ := p.Term(i - 1)
			if cmpTerms(prev, e) >= 0 {
				t.Fatalf("terms %v, %v out of order in %v", prev, e, p)
			}
		}
	}
}

func TestTermOrderAndString(t *testing.T) {
	// Graded lexicographic order, descending, as documented on Poly.
	p, err := FromTerms(xyz,
		[]Exponent{{0, 0, 0}, {0, 0, 1}, {2, 1, 0}, {0, 1, 0}, {1, 2, 0}, {1, 0, 0}, {0, 0, 1}},
		rats("4", "-1/4", "3", "1", "-1", "1", "-1/4"))
	if err != nil {
		t.Fatal(err)
	}
	const want = "3*x^2*y - x*y^2 + x + y - 1/2*z + 4"
	if got := p.String(); got != want {
		t.Errorf("String = %q, want %q", got, want)
	}
	wantSupport := []Exponent{{2, 1, 0}, {1, 2, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {0, 0, 0}}
	if got := p.Support(); !slices.EqualFunc(got, wantSupport, func(a, b Exponent) bool { return slices.Equal(a, b) }) {
		t.Errorf("Support = %v, want %v", got, wantSupport)
	}
	if got := p.Coefficient(Exponent{0, 0, 1}); got.Cmp(rat("-1/2")) != 0 {
		t.Errorf("Coefficient(z) = %v, want -1/2", got)
	}
	if got := p.Coefficient(Exponent{5, 0, 0}); got.Sign() != 0 {
		t.Errorf("Coefficient(x^5) = %v, want 0", got)
	}
	if p.Degree() != 3 || p.MinDegree() != 0 || Zero(xyz).Degree() != -1 {
		t.Errorf("Degree = %d, MinDegree = %d", p.Degree(), p.MinDegree())
	}
	if got := Zero(xyz).String(); got != "0" {
		t.Errorf("zero prints as %q", got)
	}
	if got := Constant(xyz, rat("-7/3")).String(); got != "-7/3" {
		t.Errorf("constant prints as %q", got)
	}
	n := 0
	for e, c := range p.All() {
		e2, c2 := p.Term(n)
		if !slices.Equal(e, e2) || c.Cmp(c2) != 0 {
			t.Errorf("All term %d = %v %v, Term = %v %v", n, e, c, e2, c2)
		}
		n++
	}
	if n != p.Len() {
		t.Errorf("All yielded %d terms, want %d", n, p.Len())
	}
}

func TestImmutability(t *testing.T) {
	vars := []string{"a", "b"}
	p := Monomial(vars, Exponent{1, 2}, rat("3"))
	vars[0] = "changed"
	e, c := p.Term(0)
	e[0] = 99
	c.SetInt64(99)
	p.Vars()[1] = "changed"
	if got := p.String(); got != "3*a*b^2" {
		t.Errorf("poly changed through returned values: %s", got)
	}
	q := p.Add(Constant(p.Vars(), rat("1")))
	_ = q.Mul(q).Neg().Scale(rat("2"))
	if got := p.String(); got != "3*a*b^2" {
		t.Errorf("operand changed by operations: %s", got)
	}
}

func TestFromTermsErrors(t *testing.T) {
	for _, tc := range []struct {
		name  string
		exps  []Exponent
		coefs []*big.Rat
		want  string
	}{
		{"lengths", []Exponent{{1, 0, 0}}, nil, "1 exponents but 0 coefficients"},
		{"short exponent", []Exponent{{1, 0}}, rats("1"), "exponent 0 has 2 entries, want 3"},
		{"negative", []Exponent{{1, -1, 0}}, rats("1"), "negative entry"},
		{"nil coefficient", []Exponent{{1, 0, 0}}, []*big.Rat{nil}, "coefficient 0 is nil"},
	} {
		_, err := FromTerms(xyz, tc.exps, tc.coefs)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: err = %v, want it to contain %q", tc.name, err, tc.want)
		}
	}
	// Duplicates are summed, and cancelling terms vanish.
	p, err := FromTerms(xyz, []Exponent{{1, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 1, 0}}, rats("1/2", "1/3", "1", "-1"))
	if err != nil || p.String() != "5/6*x" {
		t.Errorf("FromTerms with duplicates = %v, %v; want 5/6*x", p, err)
	}
}

// TestAlgebraicIdentities checks ring axioms and the consistency of the
// operations with exact evaluation on seeded random polynomials (common
// practice).
func TestAlgebraicIdentities(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	vars := []string{"a", "b", "c", "d"}
	for iter := range 60 {
		p := randomPoly(r, vars, r.IntN(8), 3)
		q := randomPoly(r, vars, r.IntN(8), 3)
		s := randomPoly(r, vars, r.IntN(5), 2)
		for _, x := range []*Poly{p, q, s, p.Mul(q), p.Add(q), p.Sub(q)} {
			checkCanonical(t, x)
		}
		eq := func(name string, a, b *Poly) {
			t.Helper()
			if !a.Equal(b) {
				t.Fatalf("iteration %d: %s fails:\n%v\n%v", iter, name, a, b)
			}
		}
		eq("p+q = q+p", p.Add(q), q.Add(p))
		eq("pq = qp", p.Mul(q), q.Mul(p))
		eq("(p+q)+s = p+(q+s)", p.Add(q).Add(s), p.Add(q.Add(s)))
		eq("(pq)s = p(qs)", p.Mul(q).Mul(s), p.Mul(q.Mul(s)))
		eq("p(q+s) = pq+ps", p.Mul(q.Add(s)), p.Mul(q).Add(p.Mul(s)))
		eq("(p+q)-q = p", p.Add(q).Sub(q), p)
		eq("p-p = 0", p.Sub(p), Zero(vars))
		eq("-(-p) = p", p.Neg().Neg(), p)
		eq("p + (-p) = 0", p.Add(p.Neg()), Zero(vars))
		eq("2p = p+p", p.Scale(rat("2")), p.Add(p))
		eq("0p = 0", p.Scale(rat("0")), Zero(vars))
		p3, err := p.Pow(3, Limits{})
		if err != nil {
			t.Fatal(err)
		}
		eq("p^3 = ppp", p3, p.Mul(p).Mul(p))

		x := randomPoint(r, len(vars))
		evalEq := func(name string, got, want *big.Rat) {
			t.Helper()
			if got.Cmp(want) != 0 {
				t.Fatalf("iteration %d: %s: %v != %v", iter, name, got, want)
			}
		}
		evalEq("Eval(pq) = Eval(p)Eval(q)", p.Mul(q).Eval(x), new(big.Rat).Mul(p.Eval(x), q.Eval(x)))
		evalEq("Eval(p+q)", p.Add(q).Eval(x), new(big.Rat).Add(p.Eval(x), q.Eval(x)))

		// Substitute consistency with Eval: p(x with x_i := s(x)) = (p∘s)(x).
		i := r.IntN(len(vars))
		y := slices.Clone(x)
		y[i] = s.Eval(x)
		evalEq("Substitute", p.Substitute(i, s).Eval(x), p.Eval(y))

		// Translate: p(a+u) at u = x - a equals p(x); translating back restores p.
		a := randomPoint(r, len(vars))
		pa := p.Translate(a)
		xa := make([]*big.Rat, len(x))
		minusA := make([]*big.Rat, len(a))
		for k := range x {
			xa[k] = new(big.Rat).Sub(x[k], a[k])
			minusA[k] = new(big.Rat).Neg(a[k])
		}
		evalEq("Translate", pa.Eval(xa), p.Eval(x))
		eq("Translate back", pa.Translate(minusA), p)
	}
}

// TestForcedBigPath checks that the word-sized fast path and the plain
// big.Rat path give the same products and powers (two independent ways).
func TestForcedBigPath(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	vars := []string{"a", "b", "c"}
	for range 30 {
		p := randomPoly(r, vars, 6, 3)
		q := randomPoly(r, vars, 6, 3)
		fast := p.Mul(q).Add(p).Mul(p)
		forceBig = true
		pb, qb := toBig(p), toBig(q)
		slow := pb.Mul(qb).Add(pb).Mul(pb)
		forceBig = false
		if fast.String() != slow.String() {
			t.Fatalf("fast %v != big %v", fast, slow)
		}
	}
}

func toBig(p *Poly) *Poly {
	r := &Poly{vars: p.vars, exps: p.exps, coefs: make([]coef, len(p.coefs))}
	for i, c := range p.coefs {
		r.coefs[i] = coef{big: c.rat()}
	}
	return r
}

// TestWideExponents forces the generic (unpacked) multiplication path and
// compares it with the packed path on the same product shifted down.
func TestWideExponents(t *testing.T) {
	vars := []string{"a", "b", "c", "d", "e"}
	big := 1 << 40 // 5 variables × 41 bits do not fit in one 64-bit key
	p, _ := FromTerms(vars, []Exponent{{big, big, big, big, big}, {1, 0, 0, 0, 0}, {0, 0, 0, 0, 1}}, rats("2", "1", "-1"))
	q, _ := FromTerms(vars, []Exponent{{big, 0, 0, 0, big}, {0, 1, 0, 0, 0}}, rats("3", "1/2"))
	got := p.Mul(q)
	// Expected by hand: (2m + a - e)(3n + b/2) with m = (abcde)^big, n = (ae)^big.
	want, _ := FromTerms(vars,
		[]Exponent{{2 * big, big, big, big, 2 * big}, {big, big + 1, big, big, big}, {big + 1, 0, 0, 0, big}, {big, 0, 0, 0, big + 1}, {1, 1, 0, 0, 0}, {0, 1, 0, 0, 1}},
		rats("6", "1", "3", "-3", "1/2", "-1/2"))
	if !got.Equal(want) {
		t.Errorf("wide product = %v, want %v", got, want)
	}
}

// TestMultinomial checks the number of terms of (x1+…+xk)^n, C(n+k-1, k-1)
// (common practice), and its coefficients by the multinomial theorem
// n!/(e1!…ek!) (common practice), computed here from factorials.
func TestMultinomial(t *testing.T) {
	for _, tc := range []struct{ k, n, terms int }{
		{10, 6, 5005}, {3, 4, 15}, {4, 3, 20}, {2, 10, 11}, {1, 7, 1},
	} {
		vars := make([]string, tc.k)
		for i := range vars {
			vars[i] = fmt.Sprintf("x%d", i+1)
		}
		sum := Zero(vars)
		for i := range vars {
			sum = sum.Add(Variable(vars, i))
		}
		p, err := sum.Pow(tc.n, Limits{})
		if err != nil {
			t.Fatal(err)
		}
		if p.Len() != tc.terms {
			t.Errorf("(x1+…+x%d)^%d has %d terms, want %d", tc.k, tc.n, p.Len(), tc.terms)
		}
		checkCanonical(t, p)
		fact := func(m int) *big.Int { return new(big.Int).MulRange(1, int64(max(m, 1))) }
		for e, c := range p.All() {
			want := fact(tc.n)
			for _, k := range e {
				want.Quo(want, fact(k))
			}
			if c.Cmp(new(big.Rat).SetInt(want)) != 0 {
				t.Fatalf("coefficient of %v = %v, want %v", e, c, want)
			}
		}
	}
}

func TestPowLimits(t *testing.T) {
	s := Variable(xyz, 0).Add(Variable(xyz, 1)).Add(Variable(xyz, 2))
	for _, tc := range []struct {
		p     *Poly
		n     int
		lim   Limits
		limit string
	}{
		{s, 100000, Limits{}, "MaxExponent"},
		{s, 5000, Limits{}, "MaxTerms"},           // C(5002, 2) = 12,507,501 terms
		{s, 10, Limits{MaxTerms: 65}, "MaxTerms"}, // C(12, 2) = 66
		{Constant(xyz, rat("1e300")), 10000, Limits{}, "MaxBits"},
	} {
		start := time.Now()
		_, err := tc.p.Pow(tc.n, tc.lim)
		var le *LimitError
		if !errors.As(err, &le) || le.Limit != tc.limit {
			t.Errorf("Pow(%d) with %+v: err = %v, want a %s LimitError", tc.n, tc.lim, err, tc.limit)
		}
		if d := time.Since(start); d > 5*time.Second {
			t.Logf("refusal took %v (it should be immediate)", d) // reported, not asserted
		}
	}
	if p, err := s.Pow(10, Limits{MaxTerms: 66}); err != nil || p.Len() != 66 {
		t.Errorf("Pow at exactly the term limit: %v, err %v", p, err)
	}
	if _, err := s.Pow(-1, Limits{}); err == nil {
		t.Error("Pow(-1) succeeded")
	}
	if p, _ := Zero(xyz).Pow(0, Limits{}); p.String() != "1" {
		t.Errorf("0^0 = %v, want 1", p)
	}
}

func TestEmbedFilterTruncate(t *testing.T) {
	p, _ := FromTerms(xyz, []Exponent{{2, 0, 0}, {0, 1, 1}, {0, 0, 1}, {0, 0, 0}}, rats("1", "2", "3", "4"))
	q, err := p.Embed([]string{"z", "w", "x", "y"})
	if err != nil {
		t.Fatal(err)
	}
	// In the order z, w, x, y the term z*y precedes x^2 (z comes first).
	if got, want := q.String(), "2*z*y + x^2 + 3*z + 4"; got != want {
		t.Errorf("Embed = %q, want %q", got, want)
	}
	checkCanonical(t, q)
	if _, err := q.Embed(xyz); err == nil || !strings.Contains(err.Error(), `"w"`) {
		t.Errorf("Embed without q's variable w: err = %v", err)
	}
	if _, err := p.Embed([]string{"x", "y"}); err == nil || !strings.Contains(err.Error(), `"z"`) {
		t.Errorf("Embed missing z: err = %v", err)
	}
	if _, err := p.Embed([]string{"x", "y", "z", "x"}); err == nil {
		t.Error("Embed into a list with a duplicate succeeded")
	}
	if got, want := p.Truncate(1).String(), "3*z + 4"; got != want {
		t.Errorf("Truncate(1) = %q, want %q", got, want)
	}
	if got := p.Truncate(-1); !got.IsZero() {
		t.Errorf("Truncate(-1) = %v", got)
	}
	onFace := p.Filter(func(e Exponent) bool { return e[0]+e[1]+e[2] == 2 })
	if got, want := onFace.String(), "x^2 + 2*y*z"; got != want {
		t.Errorf("Filter = %q, want %q", got, want)
	}
	w := p.WeightedDegree(rats("1/2", "1", "2"))
	if w.Cmp(rat("3")) != 0 { // max(1, 3, 2, 0)
		t.Errorf("WeightedDegree = %v, want 3", w)
	}
	if Zero(xyz).WeightedDegree(rats("1", "1", "1")) != nil {
		t.Error("WeightedDegree of zero is not nil")
	}
}

// TestEmbedRoundTrip: Embed into a bigger list and back is the identity.
func TestEmbedRoundTrip(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for range 20 {
		p := randomPoly(r, xyz, 6, 3)
		q, err := p.Embed([]string{"y", "extra", "z", "x"})
		if err != nil {
			t.Fatal(err)
		}
		checkCanonical(t, q)
		x := randomPoint(r, 3)
		if got := q.Eval([]*big.Rat{x[1], rat("5"), x[2], x[0]}); got.Cmp(p.Eval(x)) != 0 {
			t.Fatalf("Embed changed the value: %v vs %v", got, p.Eval(x))
		}
		back, err := q.Filter(func(Exponent) bool { return true }).Embed([]string{"x", "y", "z", "extra"})
		if err != nil {
			t.Fatal(err)
		}
		three := Zero(xyz)
		for e, c := range back.All() {
			three = three.Add(Monomial(xyz, e[:3], c))
		}
		if !three.Equal(p) {
			t.Fatalf("round trip %v -> %v", p, three)
		}
	}
}

// TestCompiled compares the float64 evaluator with exact evaluation.
func TestCompiled(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	vars := []string{"a", "b", "c", "d", "e"}
	for range 30 {
		p := randomPoly(r, vars, 20, 6)
		c := p.Compile()
		if c.NumVars() != 5 {
			t.Fatalf("NumVars = %d", c.NumVars())
		}
		x := randomPoint(r, 5)
		xf := make([]float64, 5)
		for i := range x {
			xf[i], _ = x[i].Float64()
		}
		want, _ := p.Eval(x).Float64()
		// Scale of the terms, for a relative tolerance.
		scale := 0.0
		for i := range p.Len() {
			e, k := p.Term(i)
			kf, _ := k.Float64()
			m := math.Abs(kf)
			for v, n := range e {
				m *= math.Pow(math.Abs(xf[v]), float64(n))
			}
			scale += m
		}
		if got := c.Eval(xf); math.Abs(got-want) > 1e-12*scale+1e-300 {
			t.Fatalf("Compiled.Eval = %v, exact %v (scale %v)", got, want, scale)
		}
	}
	// High powers (beyond the power table) and a table larger than the
	// stack buffer still work.
	p, _ := FromTerms([]string{"x", "y", "z"}, []Exponent{{300, 0, 0}, {0, 64, 64}, {0, 63, 1 << 40}}, rats("2", "1", "1"))
	// z^(2^40) at 0.99 underflows to 0 in float64, so the last term is 0.
	want := 2*math.Pow(1.001, 300) + math.Pow(1.01, 64)*math.Pow(0.99, 64)
	if got := p.Compile().Eval([]float64{1.001, 1.01, 0.99}); math.Abs(got-want) > 1e-12 {
		t.Errorf("compiled = %v, want %v", got, want)
	}
}

func TestOperandMismatchPanics(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("adding polys in different variables did not panic")
		}
	}()
	Variable([]string{"x"}, 0).Add(Variable([]string{"y"}, 0))
}

// TestMulPaths compares the packed-key multiplication (hash table and radix
// sort) with the generic accumulator path and with degree truncation done
// afterwards (two independent ways, common practice).
func TestMulPaths(t *testing.T) {
	r := rand.New(rand.NewPCG(13, 14))
	vars := []string{"a", "b", "c", "d", "e", "f"}
	for iter := range 20 {
		p := randomPoly(r, vars, 30+r.IntN(100), 4)
		q := randomPoly(r, vars, 30+r.IntN(100), 4)
		fast, err := mul(p, q, -1, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkCanonical(t, fast)
		slow, err := mulGeneric(p, q, termDegrees(p), termDegrees(q), -1, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !fast.Equal(slow) {
			t.Fatalf("iteration %d: packed and generic products differ", iter)
		}
		d := r.IntN(12)
		trunc, err := mul(p, q, d, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !trunc.Equal(fast.Truncate(d)) {
			t.Fatalf("iteration %d: truncated product differs from Truncate(%d)", iter, d)
		}
		if _, err := mul(p, q, -1, &guard{maxTerms: fast.Len() - 1, work: math.Inf(1)}); err == nil && fast.Len() > 0 {
			t.Fatalf("iteration %d: term limit %d not enforced", iter, fast.Len()-1)
		}
	}
}

// Powers of two-term polynomials use the binomial theorem; they must equal
// the product of n copies (computed here by repeated Mul), truncated or not.
func TestBinomialPowAgreesWithProducts(t *testing.T) {
	vars := []string{"x", "y", "z"}
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := range 200 {
		e := Exponent{rng.IntN(3), rng.IntN(3), rng.IntN(3)}
		f := Exponent{rng.IntN(3), rng.IntN(3), rng.IntN(3)}
		if slices.Equal(e, f) {
			f[0]++
		}
		a := big.NewRat(int64(rng.IntN(7)-3), int64(1+rng.IntN(3)))
		b := big.NewRat(int64(rng.IntN(7)-3), int64(1+rng.IntN(3)))
		if a.Sign() == 0 || b.Sign() == 0 {
			continue
		}
		p := Monomial(vars, e, a).Add(Monomial(vars, f, b))
		n := rng.IntN(9)
		want := Constant(vars, big.NewRat(1, 1))
		for range n {
			want = want.Mul(p)
		}
		got, err := p.Pow(n, Limits{})
		if err != nil {
			t.Fatal(err)
		}
		if got.String() != want.String() {
			t.Fatalf("trial %d: (%s)^%d = %s, want %s", trial, p, n, got, want)
		}
		d := rng.IntN(8)
		tr, err := p.pow(n, d, nil)
		if err != nil {
			t.Fatal(err)
		}
		if tr.String() != want.Truncate(d).String() {
			t.Fatalf("trial %d: (%s)^%d to degree %d = %s, want %s", trial, p, n, d, tr, want.Truncate(d))
		}
	}
}
